/* corax: result codes and error context shared by the whole library. */
#ifndef CORAX_STATUS_H
#define CORAX_STATUS_H

#ifdef __cplusplus
extern "C" {
#endif

/* Every fallible library function returns one of these. */
typedef enum corax_status {
    CORAX_OK = 0,    /* success */
    CORAX_END,       /* no more rows: the normal end of a table */
    CORAX_ENOMEM,    /* out of memory */
    CORAX_EIO,       /* a file could not be opened, read or written */
    CORAX_EFORMAT,   /* a table is malformed: missing column, bad header, broken quoting */
    CORAX_EVALUE,    /* a value is not a number, not finite, or out of its range */
    CORAX_ESURVEY,   /* a survey cannot be desurveyed: repeated depth, 180-degree dogleg */
    CORAX_EARG,      /* a caller passed an invalid argument */
    CORAX_ENOTFOUND, /* a named item (hole, column, key) does not exist */
    CORAX_EREPEAT    /* something that must be unique appears twice (a survey depth) */
} corax_status;

/* A short lower-case description of a status, never NULL. */
const char *corax_strerror(corax_status status);

/* Context for an error, filled by the function that failed so that the command
 * line can print `corax: FILE:LINE: message`. file is a copy of the path
 * (cut to fit), "" when none, so the record outlives whatever it names; line
 * is 1-based, 0 when unknown. */
typedef struct corax_error {
    char file[256];
    long line;
    char message[320];
} corax_error;

/* Set the file of an error record (NULL or "" for none); err may be NULL. */
void corax_error_file(corax_error *err, const char *file);

/* Clear an error record (file NULL, line 0, empty message). */
void corax_error_clear(corax_error *err);

/* printf-style fill of an error record; returns status for tail calls.
 * err may be NULL, in which case only status is returned. */
corax_status corax_error_set(corax_error *err, corax_status status, const char *file,
                             long line, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 5, 6)))
#endif
    ;

#ifdef __cplusplus
}
#endif
#endif
