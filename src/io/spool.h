/* Records kept in order and read back in order, as often as needed, in
 * bounded memory (internal to the library): while they fit one buffer they
 * stay in it; beyond, they go to an unnamed temporary file (made and
 * unlinked at once, so that nothing is left behind however the run ends).
 * For a writer that must go over its items once per block of its output,
 * such as legacy VTK, which gives each block's size before its values. */
#ifndef CORAX_IO_SPOOL_H
#define CORAX_IO_SPOOL_H

#include <stddef.h>

#include "corax/status.h"

typedef struct corax_spool corax_spool;

/* A spool of records of `size` bytes (1 to 64 KiB), `what` (for messages,
 * e.g. "the structures of the VTK file"; NULL: "records"; kept, not
 * copied). Its file, if it needs one, goes in the folder of `beside` when
 * that names a file corax writes whole (an output: the disk that takes the
 * output can take its records), else, or when that folder refuses it, in
 * TMPDIR (or /tmp). NULL when out of memory or for a size out of range. */
corax_spool *corax_spool_new(size_t size, const char *beside, const char *what);

/* Free it and close its file; NULL allowed. */
void corax_spool_free(corax_spool *s);

/* Add a record (a copy is kept), before the first corax_spool_rewind():
 * CORAX_OK; CORAX_EIO (err says why) when the file cannot be made or
 * written; CORAX_EARG once reading has begun. */
corax_status corax_spool_add(corax_spool *s, const void *record, corax_error *err);

/* Records added. */
size_t corax_spool_count(const corax_spool *s);

/* Go back to the first record; the first call ends the adding. */
void corax_spool_rewind(corax_spool *s);

/* The next record (valid until the next call), or NULL at the end or when
 * reading failed (corax_spool_status() says). */
const void *corax_spool_next(corax_spool *s);

/* CORAX_OK, or the first failure of adding or reading, with err filled. */
corax_status corax_spool_status(const corax_spool *s, corax_error *err);

/* The folder for temporary files: TMPDIR, or /tmp. */
const char *corax_temp_folder(void);

/* A temporary file open for reading and writing, already unlinked (gone
 * when closed, however the run ends), in `folder`; -1 with errno set when
 * it cannot be made. */
int corax_temp_file(const char *folder);

#endif
