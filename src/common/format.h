/* Numbers with fixed decimals, printf-style text of any length, notes
 * (internal to the library). */
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

/* The number with fixed decimals, as printf's "%.*f" gives it (declared for
 * the library's users in corax/output.h, with the writer). */
size_t corax_format_fixed(char *buf, double value, int decimals);

/* v as printf's "%.3g" gives it, into buf (32 bytes): a whole number below
 * 1000 (thresholds in degrees, most often) without printf. Returns the
 * length. */
size_t corax_format_g3(char *buf, double v);

/* Append the pieces, joined, as one phrase of the note (see
 * corax_note_add()): a note's usual phrases without printf's cost. */
void corax_note_pieces(char *buf, size_t size, size_t *used, const char *const *piece, size_t n);

/* Append a printf-style phrase to the note in buf (size bytes, *used of them
 * taken), with "; " before it when the note is not empty. Never overflows:
 * a phrase that does not fit is cut short. */
void corax_note_add(char *buf, size_t size, size_t *used, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 4, 5)))
#endif
    ;

#endif
