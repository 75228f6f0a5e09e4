/* printf-style text of any length (internal to the library). */
#ifndef CORAX_FORMAT_H
#define CORAX_FORMAT_H

#include <stdarg.h>
#include <stddef.h>

/* Format into small (size bytes) when the text fits, else into memory from
 * malloc, returned in *heap for the caller to free (NULL when small was
 * enough). Returns the text, its length in *len; NULL on a format error or
 * when out of memory. */
const char *corax_vformat(char *small, size_t size, char **heap, size_t *len, const char *fmt,
                          va_list ap);

/* Append a printf-style phrase to the note in buf (size bytes, *used of them
 * taken), with "; " before it when the note is not empty. Never overflows:
 * a phrase that does not fit is cut short. */
void corax_note_add(char *buf, size_t size, size_t *used, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 4, 5)))
#endif
    ;

#endif
