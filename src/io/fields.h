/* Typed values out of table rows (internal to io and the commands). */
#ifndef CORAX_FIELDS_H
#define CORAX_FIELDS_H

#include <stddef.h>

#include "corax/table.h"

/* Parse column col of a row as a number. On anything but CORAX_NUMBER_OK,
 * why gets a phrase such as "dip 'abc' is not a number" (name is the column's
 * logical name). A column past the end of a short row counts as empty. */
corax_number_status corax_field_number(const corax_row *row, long col, char decimal,
                                       const char *name, double *value, char *why,
                                       size_t whylen);

/* 1 when lo <= value <= hi; else 0 and why says "name v is outside [lo, hi]". */
int corax_field_in_range(double value, double lo, double hi, const char *name, char *why,
                         size_t whylen);

/* 1 when value >= 0; else 0 and why says "name v is negative". */
int corax_field_nonnegative(double value, const char *name, char *why, size_t whylen);

/* Plausible sizes, in metres: a depth or a length up to CORAX_MAX_DEPTH (ten
 * times the deepest hole ever drilled), a coordinate within
 * CORAX_MAX_COORDINATE of its origin (any map grid's metres or feet). A
 * value beyond is a slip (1e308 pasted into a cell), not a place. */
#define CORAX_MAX_DEPTH 1e5
#define CORAX_MAX_COORDINATE 1e8

/* 1 when |value| <= limit; else 0 and why says "name V (metres) is not
 * plausible: beyond LIMIT". */
int corax_field_plausible(double value, double limit, const char *name, char *why,
                          size_t whylen);

/* The text of column col ("" when col < 0 or past the end of the row). */
const char *corax_field_text(const corax_row *row, long col, size_t *length);

/* Read a table's header row and find the logical columns names[0..n) in it;
 * the first `required` of them must be there. col[i] gets each index (-1 when
 * absent) and *width the number of header fields. CORAX_EFORMAT (err names
 * file and line) for an empty file, a repeated header name, a missing
 * required column, or any of them mapped to a header the table lacks. header (may be NULL) gets the header row itself, valid
 * until the next read. */
corax_status corax_table_header(corax_reader *reader, const char *const *names, size_t n,
                                size_t required, const corax_column_map *map, long *col,
                                size_t *width, corax_row *header, corax_error *err);

/* The error for a logical column a header lacks: the mapped name the map
 * gives for it, or the usual names; the message lists the header. Returns
 * CORAX_EFORMAT. */
corax_status corax_column_missing(const char *path, const corax_row *header,
                                  const char *logical, const corax_column_map *map,
                                  corax_error *err);

/* A reading's depth in metres: column col[0] (depth) when the table has it,
 * else the interval col[1] (from) to col[2] (to) at its middle (where 0),
 * its start (1) or its end (2); times unit (metres per the table's unit).
 * On anything but CORAX_NUMBER_OK, why says what is wrong (an empty depth is
 * CORAX_NUMBER_EMPTY; an interval whose end precedes its start is
 * CORAX_NUMBER_NOT_NUMBER). */
corax_number_status corax_field_depth(const corax_row *row, const long col[3], char decimal,
                                      double unit, int where, double *depth, char *why,
                                      size_t whylen);

/* The name under which an input column is carried into an output that also
 * has columns of its own (names[0..n)): the input's name, or "log_" before it
 * (again while it still clashes) when corax writes that name itself, so that
 * no name appears twice. Returns the length written to out (cut to outlen). */
size_t corax_carried_name(const char *name, const char *const *names, size_t n, char *out,
                          size_t outlen);

/* The phrase for a row whose width differs from the header's, or NULL. */
const char *corax_field_ragged(const corax_row *row, size_t width, char *why, size_t whylen);

#endif
