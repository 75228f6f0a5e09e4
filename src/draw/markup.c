/* draw: escaping text for XML and HTML, and short numbers. */
#include <string.h>

#include "corax/output.h"
#include "draw/markup.h"

static const char replacement[] = "&#xFFFD;";

/* The length of the well-formed UTF-8 sequence at p (RFC 3629: no overlong
 * forms, no surrogates, nothing above U+10FFFF), or 0. */
static size_t utf8_length(const unsigned char *p)
{
    unsigned char c = p[0];
    size_t n;
    unsigned char lo = 0x80, hi = 0xbf; /* the second byte's range */
    if (c >= 0xc2 && c <= 0xdf)
        n = 2;
    else if (c >= 0xe0 && c <= 0xef) {
        n = 3;
        lo = c == 0xe0 ? 0xa0 : 0x80;
        hi = c == 0xed ? 0x9f : 0xbf;
    } else if (c >= 0xf0 && c <= 0xf4) {
        n = 4;
        lo = c == 0xf0 ? 0x90 : 0x80;
        hi = c == 0xf4 ? 0x8f : 0xbf;
    } else
        return 0;
    if (p[1] < lo || p[1] > hi)
        return 0;
    for (size_t k = 2; k < n; k++)
        if (p[k] < 0x80 || p[k] > 0xbf)
            return 0;
    return n;
}

/* The reference that stands for byte c, or NULL when c goes as it is. */
static const char *entity(unsigned char c)
{
    switch (c) {
    case '&': return "&amp;";
    case '<': return "&lt;";
    case '>': return "&gt;";
    case '"': return "&quot;";
    case '\'': return "&#39;";
    case '\t': case '\n': case '\r': return NULL;
    default: return c < 0x20 || c == 0x7f ? replacement : NULL;
    }
}

void corax_markup_escape(const char *text, corax_markup_sink *sink, void *ctx)
{
    const unsigned char *p = (const unsigned char *)text, *run = p;
    while (*p) {
        const char *swap = NULL;
        size_t step = 1;
        if (*p >= 0x80) {
            step = utf8_length(p);
            if (step == 0) {
                swap = replacement;
                step = 1;
            }
        } else
            swap = entity(*p);
        if (swap) {
            sink(ctx, (const char *)run, (size_t)(p - run));
            sink(ctx, swap, strlen(swap));
            run = p + step;
        }
        p += step;
    }
    sink(ctx, (const char *)run, (size_t)(p - run));
}

size_t corax_format_short(char *buf, double value, int decimals)
{
    size_t n = corax_format_fixed(buf, value, decimals);
    if (n && memchr(buf, '.', n)) {
        while (buf[n - 1] == '0')
            n--;
        if (buf[n - 1] == '.')
            n--;
        buf[n] = '\0';
    }
    return n;
}
