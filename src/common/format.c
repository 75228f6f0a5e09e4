/* common: numbers with fixed decimals, printf-style text of any length, and
 * notes built phrase by phrase. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "common/format.h"

/* "00" .. "99": two digits at a time halves the divisions */
static const char digit_pairs[201] =
    "00010203040506070809101112131415161718192021222324252627282930313233343536373839"
    "40414243444546474849505152535455565758596061626364656667686970717273747576777879"
    "8081828384858687888990919293949596979899";

/* The integer nearest a * s (a >= 0, s a power of ten up to 1e9, so exact;
 * their double product p below 2^52), rounded as printf rounds the exact
 * value: half to even on a true tie. p + 0.5 is exact below 2^52, so its
 * whole part is p rounded half up; p = fl(a s) differs from a s by less than
 * its distance from any half-way point it is not on, so only p on a half-way
 * point needs the product's rounding error e (fma gives it exactly): its
 * sign says which way the exact value lies, and e = 0 is a true tie. */
static uint64_t round_scaled(double a, double s, double p)
{
    int64_t q = (int64_t)(p + 0.5); /* signed: the quicker conversions */
    if ((double)q - p != 0.5) /* the usual case: no branch taken at random */
        return (uint64_t)q;
    double e = fma(a, s, -p);
    return (uint64_t)(e > 0.0 ? q : e < 0.0 ? q - 1 : q - (q & 1));
}

/* The last two digits of *q into p[-2], p[-1], taken off *q (a division by
 * a constant: a multiplication). */
static inline char *take_pair(char *p, uint64_t *q)
{
    uint64_t t = *q / 100;
    const char *d = digit_pairs + 2 * (*q - 100 * t);
    p[-1] = d[1];
    p[-2] = d[0];
    *q = t;
    return p - 2;
}

static inline char *take_one(char *p, uint64_t *q)
{
    uint64_t t = *q / 10;
    p[-1] = (char)('0' + (*q - 10 * t));
    *q = t;
    return p - 1;
}

size_t corax_format_fixed(char *buf, double v, int decimals)
{
    static const double scale[] = {1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9};
    if ((unsigned)decimals > 9)
        decimals = decimals < 0 ? 0 : 9;
    double a = fabs(v), scaled = a * scale[decimals];
    if (!(scaled < 0x1p52)) { /* the rare cases, NaN among them */
        if (isnan(v))
            return 0;
        if (!(scaled < 9.0e15)) /* beyond exact integers: all digits, exponent form */
            return (size_t)snprintf(buf, 40, "%.17g", v);
        return (size_t)snprintf(buf, 40, "%.*f", decimals, v); /* printf's own rounding */
    }
    uint64_t q = round_scaled(a, scale[decimals], scaled);
    int negative = v < 0.0 && q != 0; /* never "-0.00" */
    /* at most 16 digits, a point and a sign: written backwards into the
     * first 24 bytes of tmp, then copied whole (a copy of fixed size is a
     * few moves, where a copy of the digits alone would call memcpy); the
     * decimals by a switch, so that every division is by a constant */
    char tmp[48];
    char *end = tmp + 24, *p = end;
    switch (decimals) {
    case 9: p = take_one(p, &q); /* fall through */
    case 8: p = take_pair(p, &q); /* fall through */
    case 6: p = take_pair(p, &q); /* fall through */
    case 4: p = take_pair(p, &q); /* fall through */
    case 2: p = take_pair(p, &q); break;
    case 7: p = take_pair(p, &q); /* fall through */
    case 5: p = take_pair(p, &q); /* fall through */
    case 3: p = take_pair(p, &q); /* fall through */
    case 1: p = take_one(p, &q); break;
    default: break;
    }
    if (decimals)
        *--p = '.';
    while (q >= 100)
        p = take_pair(p, &q);
    if (q >= 10) {
        p -= 2;
        p[1] = digit_pairs[2 * q + 1];
        p[0] = digit_pairs[2 * q];
    } else {
        *--p = (char)('0' + q);
    }
    if (negative)
        *--p = '-';
    memcpy(buf, p, 24);
    return (size_t)(end - p);
}

const char *corax_vformat(char *small, size_t size, char **heap, size_t *len, const char *fmt,
                          va_list ap)
{
    va_list again;
    va_copy(again, ap);
    *heap = NULL;
    int n = vsnprintf(small, size, fmt, ap);
    if (n < 0 || (size_t)n < size) {
        va_end(again);
        *len = n < 0 ? 0 : (size_t)n;
        return n < 0 ? NULL : small;
    }
    *heap = malloc((size_t)n + 1);
    if (*heap)
        vsnprintf(*heap, (size_t)n + 1, fmt, again);
    va_end(again);
    *len = (size_t)n;
    return *heap;
}

void corax_note_add(char *buf, size_t size, size_t *used, const char *fmt, ...)
{
    if (*used + 1 >= size)
        return;
    if (*used) {
        int n = snprintf(buf + *used, size - *used, "; ");
        *used += (size_t)n;
        if (*used + 1 >= size) {
            *used = size - 1;
            return;
        }
    }
    va_list ap;
    va_start(ap, fmt);
    int n = vsnprintf(buf + *used, size - *used, fmt, ap);
    va_end(ap);
    if (n > 0)
        *used += (size_t)n;
    if (*used >= size)
        *used = size - 1;
}

size_t corax_format_g3(char *buf, double v)
{
    if (v == rint(v) && fabs(v) < 1000.0 && !(v == 0.0 && signbit(v)))
        return corax_format_fixed(buf, v, 0); /* a whole number of 3 digits at most */
    return (size_t)snprintf(buf, 32, "%.3g", v);
}

void corax_note_pieces(char *buf, size_t size, size_t *used, const char *const *piece, size_t n)
{
    if (*used + 1 >= size)
        return;
    if (*used) { /* "; " before, cut short as corax_note_add() cuts it */
        size_t room = size - 1 - *used, k = room < 2 ? room : 2;
        memcpy(buf + *used, "; ", k);
        *used += k;
        buf[*used] = '\0';
        if (*used + 1 >= size)
            return;
    }
    for (size_t i = 0; i < n && *used + 1 < size; i++) {
        size_t len = strlen(piece[i]), room = size - 1 - *used;
        len = len < room ? len : room;
        memcpy(buf + *used, piece[i], len);
        *used += len;
    }
    buf[*used] = '\0';
}
