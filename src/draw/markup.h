/* Internal to src/draw: text made safe for XML and HTML, and numbers written
 * short, for the SVG writer and the report page alike. */
#ifndef CORAX_MARKUP_H
#define CORAX_MARKUP_H

#include <stddef.h>

/* Where escaped text goes: called with runs of bytes, in order. */
typedef void corax_markup_sink(void *ctx, const char *text, size_t length);

/* Pass text to sink with &, <, >, " and ' as character references, and what
 * XML and HTML cannot carry (control characters other than tab, line feed
 * and carriage return, and bytes that are not UTF-8) as U+FFFD, so that
 * whatever bytes a table held, the document stays valid. */
void corax_markup_escape(const char *text, corax_markup_sink *sink, void *ctx);

/* A number with at most `decimals` decimals (0..9), trailing zeros dropped
 * (12.50 -> 12.5, 3.00 -> 3), into buf (at least 40 bytes); returns its
 * length, 0 (and "") for NaN. Large values as corax_format_fixed(). */
size_t corax_format_short(char *buf, double value, int decimals);

#endif
