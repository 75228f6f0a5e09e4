/* corax: reading CSV tables row by row, naming their columns, and parsing
 * their numbers. Built on libcsv; streams, so memory does not grow with the
 * number of rows. */
#ifndef CORAX_TABLE_H
#define CORAX_TABLE_H

#include <stddef.h>
#include <stdio.h>

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The outcome of parsing one number. */
typedef enum corax_number_status {
    CORAX_NUMBER_OK = 0,
    CORAX_NUMBER_EMPTY,      /* the field is empty (or blanks only) */
    CORAX_NUMBER_NOT_NUMBER, /* text that is not a number */
    CORAX_NUMBER_NOT_FINITE  /* NaN, infinity or out of the double range */
} corax_number_status;

/* How a table is written. A reader given 0 for either finds it from the
 * first rows (see corax_reader_open()). */
typedef struct corax_table_format {
    char delimiter; /* ',', ';' or '\t'; 0: find it */
    char decimal;   /* '.' or ',' (not with ',' as delimiter); 0: find it;
                       CORAX_DECIMAL_EITHER: numbers may use either mark */
} corax_table_format;

/* A decimal mark for tables that hold both: corax's own columns beside a
 * log's columns carried as they came. A number then has at most one mark,
 * a point or a comma. */
#define CORAX_DECIMAL_EITHER '*'


/* The default format: both found from the table. */
corax_table_format corax_table_format_default(void);

/* One foot in metres (exactly, by the international yard and pound
 * agreement of 1959). */
#define CORAX_FOOT 0.3048

/* Column names given by the user for logical names (see below). */
typedef struct corax_column_map corax_column_map;

/* How one input table is read: its format, its header names and the unit of
 * its lengths. */
typedef struct corax_table_settings {
    corax_table_format format;       /* 0 fields: found from the table */
    const corax_column_map *columns; /* the user's header names; may be NULL */
    double unit; /* metres per unit of the table's depths and lengths (and, for
                    collars, coordinates): 1 for metres, CORAX_FOOT for feet */
} corax_table_settings;

/* Found format, no column names, metres. */
corax_table_settings corax_table_settings_default(void);

/* What reading a table found and skipped. */
typedef struct corax_table_info {
    corax_table_format format; /* as read: given, or found */
    int delimiter_detected;    /* the delimiter was found, not given */
    int decimal_detected;      /* the decimal mark was found, not given */
    size_t comments;           /* lines starting with '#' (after blanks) */
    size_t blank_rows;         /* rows whose fields are all empty or blank */
} corax_table_info;

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
 * skipped; LF, CRLF and CR line ends are accepted. Empty lines, comment lines
 * (the first character that is not a blank is '#', outside a quoted field)
 * and blank rows (every field empty or blank) are skipped and counted (see
 * corax_reader_info()). Blanks around a field are not part of it.
 *
 * A format field left 0 is found from the first block of the file, only
 * where the answer is unambiguous: the delimiter is the only one of comma,
 * semicolon and tab in the header line; with a delimiter other than a comma,
 * the decimal mark is a comma when numbers in the first rows use decimal
 * commas and none use decimal points. CORAX_EFORMAT (err names the file and
 * line, and asks for the setting) when the header holds more than one
 * candidate delimiter or the numbers use both marks; CORAX_EIO when the file
 * cannot be opened (err names it). */
corax_status corax_reader_open(const char *path, corax_table_format format,
                               corax_reader **out, corax_error *err);

/* corax_reader_open() on a stream already open, read from where it stands
 * and left open; name stands for it in messages. */
corax_status corax_reader_open_stream(FILE *stream, const char *name, corax_table_format format,
                                      corax_reader **out, corax_error *err);

/* The next row: CORAX_OK, CORAX_END at the end of the table, CORAX_EIO on a
 * read error, CORAX_EFORMAT on an unterminated quote, CORAX_ENOMEM. */
corax_status corax_reader_next(corax_reader *reader, corax_row *row, corax_error *err);

/* The path the reader was opened with. */
const char *corax_reader_path(const corax_reader *reader);

/* The format as read and what has been skipped so far. */
void corax_reader_info(const corax_reader *reader, corax_table_info *info);

/* Bytes of the input read so far (for progress). */
size_t corax_reader_offset(const corax_reader *reader);

/* Close; NULL is allowed. */
void corax_reader_close(corax_reader *reader);

/* Column names given by the user for logical names, from a specification
 * such as "hole=HOLE_NO,depth=DEPTH_M" (corax_column_map, declared above). */

/* Parse a mapping. CORAX_EARG (with a message) for a malformed entry or a
 * logical name corax does not know. Several specifications may be added to
 * the same map; later ones win. *map may be NULL at first. */
corax_status corax_column_map_add(corax_column_map **map, const char *spec, corax_error *err);
void corax_column_map_free(corax_column_map *map);

/* Add every mapping of `from` to *map (created when NULL), over its own. */
corax_status corax_column_map_merge(corax_column_map **map, const corax_column_map *from);

/* Whether a logical column name is one corax knows (hole, depth, x, ...). */
int corax_column_known(const char *logical);

/* The i-th logical column corax knows (0, 1, ...; NULL past the last), with
 * the other header names it takes for it without a mapping (a NULL-ended
 * list) and a few words on what it holds. Either out pointer may be NULL. */
const char *corax_column_at(size_t i, const char *const **aliases, const char **meaning);

/* Whether two header names are the same name: without regard to case, and
 * with a space, an underscore, a hyphen and a full stop taken as one mark. */
int corax_column_name_match(const char *a, size_t alen, const char *b, size_t blen);

/* The header name a map gives for a logical column, or NULL. */
const char *corax_column_mapped(const corax_column_map *map, const char *logical);

/* corax_column_find() for a column the map names but the header lacks: a
 * mapping never falls back to the usual names. */
enum { CORAX_COLUMN_MAPPED_MISSING = -2 };

/* The index of the header column that holds a logical column: the mapped name
 * when the map has one (CORAX_COLUMN_MAPPED_MISSING when the header lacks it),
 * else the logical name or one of its usual aliases (see corax_column_at()),
 * matched as corax_column_name_match() does. -1 when absent. */
long corax_column_find(const corax_row *header, const char *logical,
                       const corax_column_map *map);

/* Check a header for repeated names (case-insensitive). CORAX_EFORMAT with a
 * message naming the name and both columns. */
corax_status corax_header_check(const corax_row *header, corax_error *err);

/* A whole table held in memory (for commands that read converted output
 * more than once, group it or sort it). Rows keep their order and line. */
typedef struct corax_table corax_table;

/* Read a whole CSV table. CORAX_EFORMAT for an empty file (no header), a
 * repeated header name or broken quoting; CORAX_EIO when it cannot be read.
 * Ragged rows are kept as they are (see corax_table_width()). */
corax_status corax_table_load(const char *path, corax_table_format format, corax_table **out,
                              corax_error *err);
void corax_table_free(corax_table *table);

/* Told how far a long job has come: done (bytes read, say). */
typedef void (*corax_progress_fn)(void *user, double done);

/* corax_table_load(), telling progress (may be NULL) the bytes read now and
 * then. */
corax_status corax_table_load_progress(const char *path, corax_table_format format,
                                       corax_progress_fn progress, void *user,
                                       corax_table **out, corax_error *err);

/* An empty table with the given header (copied), for rows added one by one
 * with corax_table_append(); NULL when out of memory. */
corax_table *corax_table_new(const char *path, char decimal, const corax_row *header);

/* Append a copy of a row. */
corax_status corax_table_append(corax_table *table, const corax_row *row);

/* Drop every row but the header, keeping the memory for reuse. */
void corax_table_truncate(corax_table *table);

/* Row `row` as a corax_row view (valid until the table changes). field must
 * have room for corax_table_widest() pointers. */
void corax_table_row(const corax_table *table, size_t row, const char **field, corax_row *out);

/* The most fields in any row, the header included. */
size_t corax_table_widest(const corax_table *table);

const char *corax_table_path(const corax_table *table);

/* The format the table was read with and what was skipped (for a table made
 * with corax_table_new(), its decimal mark and nothing skipped). */
void corax_table_read_info(const corax_table *table, corax_table_info *info);
size_t corax_table_rows(const corax_table *table);
size_t corax_table_columns(const corax_table *table);
const char *corax_table_header_name(const corax_table *table, size_t column);

/* The index of a column by header name, without regard to case, or -1. */
long corax_table_find(const corax_table *table, const char *name);

/* The column holding a logical column, as corax_column_find() finds it in the
 * header (mapped name, logical name or an alias): -1 when absent,
 * CORAX_COLUMN_MAPPED_MISSING when the map names a header the table lacks. */
long corax_table_column(const corax_table *table, const char *logical,
                        const corax_column_map *map);

/* Number of fields in a row (may differ from the header's count). */
size_t corax_table_width(const corax_table *table, size_t row);

/* Line where a row starts in its file. */
long corax_table_line(const corax_table *table, size_t row);

/* A cell's text ("" past the end of a short row, or for column -1); *length
 * (may be NULL) gets its length. */
const char *corax_table_cell(const corax_table *table, size_t row, long column, size_t *length);

/* A cell as a number (see corax_parse_number); NaN and a status other than
 * CORAX_NUMBER_OK when it is not one. */
corax_number_status corax_table_number(const corax_table *table, size_t row, long column,
                                       double *value);


/* Parse a decimal number (optional sign, digits, decimal mark, exponent),
 * allowing surrounding blanks. decimal is '.' or ',', or CORAX_DECIMAL_EITHER
 * (or 0) to take either mark. */
corax_number_status corax_parse_number(const char *text, size_t length, char decimal,
                                       double *value);

#ifdef __cplusplus
}
#endif
#endif
