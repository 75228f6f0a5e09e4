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

/* The output files of one run, made public together: a failed or stopped run
 * changes none of them. */
typedef struct corax_outputs corax_outputs;

/* An empty set; NULL when out of memory. */
corax_outputs *corax_outputs_new(void);

/* Rename every file the set holds into place. CORAX_EIO (err names the
 * file) when a rename fails: the files not yet renamed are removed, and
 * those renamed before are put back as they were (each file replaced is
 * kept under a second name, a hard link, until all are in place; on a file
 * system without hard links a replaced file cannot come back; a private
 * folder's side files stay). */
corax_status corax_outputs_publish(corax_outputs *set, corax_error *err);

/* Files held, waiting to be published. */
size_t corax_outputs_pending(const corax_outputs *set);

/* Remove every file the set holds, unpublished. */
void corax_outputs_discard(corax_outputs *set);

/* Discard and free; NULL allowed. */
void corax_outputs_free(corax_outputs *set);

/* Remove every temporary file of the set's writers, open or held. Safe in a
 * signal handler: it only calls unlink(). */
void corax_outputs_remove_temporaries(const corax_outputs *set);

/* Open an output: "-" is standard output. A device, a pipe, a socket, or a
 * file under /dev or /proc (/dev/stdout) is written straight, and its write
 * errors (a full disk) are reported by corax_writer_commit(). Any other file
 * is written under a temporary name in its own folder (through a symlink, in
 * the folder of the file it names) and appears under its real name only
 * when whole, with the mode the file had. With a set (may be NULL), the
 * commit holds the file for corax_outputs_publish(); without, it renames
 * it at once. CORAX_EIO, with a message naming the path, for an empty path,
 * a folder, or a file that cannot be created. */
corax_status corax_writer_open_in(corax_outputs *set, const char *path, corax_writer **out,
                                  corax_error *err);

/* Whether two paths name the same file: the same device and inode when both
 * exist (but for character devices, which take many writers), the same
 * resolved folder and name when neither does. "-" is never the same. */
int corax_path_same(const char *a, const char *b);

/* Whether an output at path is a file corax writes whole and renames into
 * place (a new or regular file), rather than a stream it writes straight (a
 * device, a pipe, standard output). */
int corax_path_replaceable(const char *path);

/* A private folder beside path ("DIR/.NAME.XXXXXX") for a library that
 * writes a file (and side files) by itself, such as GDAL: *folder gets its
 * name (free() it). With a set, the set holds the folder: publishing moves
 * what it holds into place (the file named NAME to path, side files beside
 * it), discarding or a signal removes it. Without one, the caller places it
 * with corax_outputs_place_folder(). CORAX_EIO when it cannot be made. */
corax_status corax_outputs_folder(corax_outputs *set, const char *path, char **folder,
                                  corax_error *err);

/* Remove a private folder, and from its set (may be NULL): its work is
 * abandoned. */
void corax_outputs_drop_folder(corax_outputs *set, const char *folder);

/* Move a private folder's files into place and remove it. CORAX_EIO (err
 * names path) when a file cannot be moved. */
corax_status corax_outputs_place_folder(const char *folder, const char *path,
                                        corax_error *err);

/* corax_writer_open_in() without a set. */
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
 * the delimiter, a quote, a tab, a line end or surrounding blanks, or opens
 * its row with '#' (which would make the line a comment). */
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

/* Flush and finish: for a file, sync, close and rename it into place (or
 * hold it in the writer's set). CORAX_EIO if any write failed, naming the
 * path (nothing is left under the real name then). Frees w. */
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
