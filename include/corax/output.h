/* corax: writing tables and other output files, whole or not at all. */
#ifndef CORAX_OUTPUT_H
#define CORAX_OUTPUT_H

#include <stddef.h>

#include "corax/status.h"
#include "corax/table.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_writer corax_writer;

/* Open an output ("-" for standard output). A file is written under a
 * temporary name in the same folder and renamed over `path` only by
 * corax_writer_commit(), so a failed run never leaves half a file. */
corax_status corax_writer_open(const char *path, corax_writer **out, corax_error *err);

/* A writer that keeps its output in memory (for building pieces of a table
 * in parallel); read it with corax_writer_contents(), free it with
 * corax_writer_discard(). */
corax_status corax_writer_memory(corax_writer **out);

/* What a memory writer holds so far (valid until the next write). */
const char *corax_writer_contents(const corax_writer *w, size_t *length);

/* Empty a memory writer for reuse. */
void corax_writer_reset(corax_writer *w);

/* The CSV format of the fields written from now on: the delimiter (',' by
 * default, ';' or '\t') and the decimal mark of numbers ('.' by default;
 * ',' only with another delimiter than a comma). Fields holding the
 * delimiter are quoted. */
void corax_writer_format(corax_writer *w, corax_table_format format);

/* Raw bytes, as they are. */
void corax_writer_text(corax_writer *w, const char *text, size_t length);

/* printf-style raw text (for small pieces, not hot loops). */
void corax_writer_printf(corax_writer *w, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;

/* A CSV field: separated from the previous one, quoted when it holds a comma,
 * the delimiter, a quote, a tab, a line end or surrounding blanks. */
void corax_writer_field(corax_writer *w, const char *text, size_t length);

/* A number field with a fixed number of decimals (0..9); NaN gives an empty
 * field. Negative zero prints as zero. A value too large for its decimals to
 * be exact (|v| 10^decimals >= 9e15) prints with all 17 digits instead. */
void corax_writer_number(corax_writer *w, double value, int decimals);

/* An azimuth field in degrees, wrapped into [0, 360) after rounding. */
void corax_writer_azimuth(corax_writer *w, double degrees, int decimals);

/* An integer field. */
void corax_writer_integer(corax_writer *w, long long value);

/* End the current CSV row. */
void corax_writer_end_row(corax_writer *w);

/* Flush and finish: for a file, close and rename it into place. CORAX_EIO if
 * any write failed (nothing is left under the real name then). Frees w. */
corax_status corax_writer_commit(corax_writer *w, corax_error *err);

/* Abandon the output, removing the temporary file. Frees w; NULL allowed. */
void corax_writer_discard(corax_writer *w);

/* Format a number with fixed decimals into buf (at least 40 bytes), as
 * corax_writer_number() does; returns its length (0 for NaN). */
size_t corax_format_fixed(char *buf, double value, int decimals);

#ifdef __cplusplus
}
#endif
#endif
