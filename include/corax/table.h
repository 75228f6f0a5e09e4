/* corax: reading CSV tables row by row, naming their columns, and parsing
 * their numbers. Built on libcsv; streams, so memory does not grow with the
 * number of rows. */
#ifndef CORAX_TABLE_H
#define CORAX_TABLE_H

#include <stddef.h>

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* How a table is written. */
typedef struct corax_table_format {
    char delimiter; /* ',' (default) or ';' */
    char decimal;   /* '.' (default) or ',' (only with ';' delimiter) */
} corax_table_format;

/* The default format: comma-separated, decimal point. */
corax_table_format corax_table_format_default(void);

/* One row as read. Fields are NUL-terminated; they and the arrays stay valid
 * until the next call on the reader. Quoted fields come unquoted, with their
 * commas, quotes and newlines intact. */
typedef struct corax_row {
    size_t count;          /* number of fields */
    const char *const *field;
    const size_t *length;  /* bytes in each field */
    long line;             /* line where the row starts (1-based) */
} corax_row;

typedef struct corax_reader corax_reader;

/* Open a CSV file ("-" for standard input). A UTF-8 byte-order mark is
 * skipped; LF, CRLF and CR line ends are accepted; blank lines are skipped.
 * CORAX_EIO when the file cannot be opened (err names it). */
corax_status corax_reader_open(const char *path, corax_table_format format,
                               corax_reader **out, corax_error *err);

/* The next row: CORAX_OK, CORAX_END at the end of the table, CORAX_EIO on a
 * read error, CORAX_EFORMAT on an unterminated quote, CORAX_ENOMEM. */
corax_status corax_reader_next(corax_reader *reader, corax_row *row, corax_error *err);

/* The path the reader was opened with. */
const char *corax_reader_path(const corax_reader *reader);

/* Close; NULL is allowed. */
void corax_reader_close(corax_reader *reader);

/* Column names given by the user for logical names, from a specification
 * such as "hole=HOLE_NO,depth=DEPTH_M". */
typedef struct corax_column_map corax_column_map;

/* Parse a mapping. CORAX_EARG (with a message) for a malformed entry or a
 * logical name corax does not know. Several specifications may be added to
 * the same map; later ones win. *map may be NULL at first. */
corax_status corax_column_map_add(corax_column_map **map, const char *spec, corax_error *err);
void corax_column_map_free(corax_column_map *map);

/* Whether a logical column name is one corax knows (hole, depth, x, ...). */
int corax_column_known(const char *logical);

/* The index of the header column that holds a logical column: the mapped name
 * when the map has one and the header holds it, else the logical name or one
 * of its usual aliases, matched without regard to case. -1 when absent. */
long corax_column_find(const corax_row *header, const char *logical,
                       const corax_column_map *map);

/* Check a header for repeated names (case-insensitive). CORAX_EFORMAT with a
 * message naming the name and both columns. */
corax_status corax_header_check(const corax_row *header, corax_error *err);

/* The outcome of parsing one number. */
typedef enum corax_number_status {
    CORAX_NUMBER_OK = 0,
    CORAX_NUMBER_EMPTY,      /* the field is empty (or blanks only) */
    CORAX_NUMBER_NOT_NUMBER, /* text that is not a number */
    CORAX_NUMBER_NOT_FINITE  /* NaN, infinity or out of the double range */
} corax_number_status;

/* Parse a decimal number (optional sign, digits, decimal mark, exponent),
 * allowing surrounding blanks. decimal is '.' or ','. */
corax_number_status corax_parse_number(const char *text, size_t length, char decimal,
                                       double *value);

#ifdef __cplusplus
}
#endif
#endif
