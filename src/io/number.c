/* io: parsing decimal numbers from table fields, fast.
 *
 * Most fields in a drill log are short decimals ("123.45"). Up to 19 digits
 * fit an integer exactly, and an integer of at most 2^53 divided or multiplied
 * by an exact power of ten (10^22 at most) is correctly rounded in one IEEE
 * operation; everything else goes to strtod after our own grammar check. */
#include <errno.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "corax/table.h"

static const double pow10_exact[] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                                     1e8,  1e9,  1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
                                     1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};

static int is_blank(char c) { return c == ' ' || c == '\t'; }
static int either(char decimal) { return decimal == 0 || decimal == CORAX_DECIMAL_EITHER; }
static int is_digit(char c) { return c >= '0' && c <= '9'; }

static int matches_word(const char *s, size_t n, const char *word)
{
    size_t w = strlen(word);
    if (n != w)
        return 0;
    for (size_t i = 0; i < n; i++)
        if ((s[i] | 0x20) != word[i])
            return 0;
    return 1;
}

static int not_finite_word(const char *s, size_t n)
{
    if (n && (*s == '+' || *s == '-')) {
        s++;
        n--;
    }
    return matches_word(s, n, "nan") || matches_word(s, n, "inf") ||
           matches_word(s, n, "infinity");
}

static corax_number_status slow_path(const char *s, size_t n, char decimal, double *value)
{
    char small[128];
    char *buf = n < sizeof small ? small : malloc(n + 1);
    if (!buf)
        return CORAX_NUMBER_NOT_NUMBER;
    for (size_t i = 0; i < n; i++) /* the grammar is already checked */
        buf[i] = s[i] == decimal || (either(decimal) && s[i] == ',') ? '.' : s[i];
    buf[n] = '\0';
    errno = 0;
    double v = strtod(buf, NULL);
    int overflow = errno == ERANGE && fabs(v) > 1.0; /* underflow to 0 is fine */
    if (buf != small)
        free(buf);
    if (overflow)
        return CORAX_NUMBER_NOT_FINITE;
    *value = v;
    return CORAX_NUMBER_OK;
}

corax_number_status corax_parse_number(const char *text, size_t length, char decimal,
                                       double *value)
{
    const char *s = text, *end = text + length;
    while (s < end && is_blank(*s))
        s++;
    while (end > s && is_blank(end[-1]))
        end--;
    if (s == end)
        return CORAX_NUMBER_EMPTY;
    const char *start = s;
    int negative = 0;
    if (*s == '+' || *s == '-')
        negative = *s++ == '-';
    uint64_t mantissa = 0;
    int digits = 0, kept = 0, exponent = 0;
    for (; s < end && is_digit(*s); s++, digits++) {
        if (kept < 19) {
            mantissa = mantissa * 10 + (uint64_t)(*s - '0');
            kept += mantissa != 0;
        } else {
            exponent++;
        }
    }
    if (s < end && (*s == decimal || (either(decimal) && (*s == '.' || *s == ',')))) {
        for (s++; s < end && is_digit(*s); s++, digits++) {
            if (kept < 19) {
                mantissa = mantissa * 10 + (uint64_t)(*s - '0');
                kept += mantissa != 0;
                exponent--;
            }
        }
    }
    if (digits == 0)
        return not_finite_word(start, (size_t)(end - start)) ? CORAX_NUMBER_NOT_FINITE
                                                             : CORAX_NUMBER_NOT_NUMBER;
    if (s < end && (*s == 'e' || *s == 'E')) {
        s++;
        int eneg = 0, e = 0, edigits = 0;
        if (s < end && (*s == '+' || *s == '-'))
            eneg = *s++ == '-';
        for (; s < end && is_digit(*s); s++, edigits++)
            if (e < 100000)
                e = e * 10 + (*s - '0');
        if (!edigits)
            return CORAX_NUMBER_NOT_NUMBER;
        exponent += eneg ? -e : e;
    }
    if (s != end)
        return CORAX_NUMBER_NOT_NUMBER;
    double v;
    if (mantissa == 0) {
        v = 0.0;
    } else if (mantissa <= (UINT64_C(1) << 53) && exponent >= -22 && exponent <= 22) {
        v = (double)mantissa;
        v = exponent < 0 ? v / pow10_exact[-exponent] : v * pow10_exact[exponent];
    } else {
        return slow_path(start, (size_t)(end - start), decimal, value);
    }
    *value = negative ? -v : v;
    return CORAX_NUMBER_OK;
}
