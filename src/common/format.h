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

#endif
