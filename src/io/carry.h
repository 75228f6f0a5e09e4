/* Columns carried through from input tables to an output table (internal
 * to io and the commands). */
#ifndef CORAX_CARRY_H
#define CORAX_CARRY_H

#include <stddef.h>

#include "corax/output.h"
#include "corax/table.h"

/* Every input column goes through to the output except those the command
 * replaces with its own: columns named like its output columns, and the
 * columns it reads to make them. Several tables may feed one output: the
 * carried columns are then the union of theirs, in order of first
 * appearance, names matched without regard to case; a table without one of
 * them leaves it empty. Add every header before writing any row. */
typedef struct corax_carry corax_carry;

/* A carry leaving out input columns named drop[0..ndrop) (the command's own
 * output names); NULL when out of memory. */
corax_carry *corax_carry_new(const char *const *drop, size_t ndrop);
void corax_carry_free(corax_carry *c);

/* Add a table's header. consumed[0..nconsumed) are indices of columns the
 * command reads to make its own (entries of -1 are ignored). Returns the
 * table's number (0, 1, ...) for corax_carry_row(), or -1 when out of memory. */
long corax_carry_add(corax_carry *c, const corax_row *header, const long *consumed,
                     size_t nconsumed);

/* Number of carried columns. */
size_t corax_carry_count(const corax_carry *c);

/* Write the carried column names as CSV fields (no end of row). */
void corax_carry_header(const corax_carry *c, corax_writer *w);

/* Write a row's carried fields, from table number `table` (no end of row). */
void corax_carry_row(const corax_carry *c, long table, const corax_row *row, corax_writer *w);

/* The name of carried column i (i < corax_carry_count()). */
const char *corax_carry_name(const corax_carry *c, size_t i);

/* The text of carried column i in a row of table number `table` ("" when
 * that table lacks the column); *length gets its length. */
const char *corax_carry_value(const corax_carry *c, long table, const corax_row *row, size_t i,
                              size_t *length);

#endif
