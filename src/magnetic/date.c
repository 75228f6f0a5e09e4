/* magnetic: calendar dates as decimal years, the magnetic models' time. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "corax/magnetic.h"

static int leap(int y) { return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0; }

static int month_days(int y, int m)
{
    static const int days[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
    return days[m - 1] + (m == 2 && leap(y));
}

double corax_decimal_year(int year, int month, int day)
{
    if (month < 1 || month > 12 || day < 1 || day > month_days(year, month))
        return NAN;
    int doy = day;
    for (int m = 1; m < month; m++)
        doy += month_days(year, m);
    return year + (doy - 1) / (leap(year) ? 366.0 : 365.0);
}

void corax_year_date(double year, int *y, int *month, int *day)
{
    *y = (int)floor(year);
    /* a hair added so that a day's start computed in floating point stays on its day */
    int doy = (int)floor((year - *y) * (leap(*y) ? 366.0 : 365.0) + 1e-6) + 1;
    int m = 1;
    while (m < 12 && doy > month_days(*y, m))
        doy -= month_days(*y, m++);
    *month = m;
    *day = doy;
}

void corax_date_text(double year, char *buf, size_t len)
{
    int y, m, d;
    corax_year_date(year, &y, &m, &d);
    snprintf(buf, len, "%04d-%02d-%02d", y, m, d);
}

/* The number in len digits at s, or -1. */
static int digits(const char *s, size_t len)
{
    int v = 0;
    for (size_t i = 0; i < len; i++) {
        if (s[i] < '0' || s[i] > '9')
            return -1;
        v = 10 * v + (s[i] - '0');
    }
    return v;
}

double corax_date_parse(const char *s, size_t len)
{
    while (len && (*s == ' ' || *s == '\t')) {
        s++;
        len--;
    }
    while (len && (s[len - 1] == ' ' || s[len - 1] == '\t'))
        len--;
    if (len < 10 || s[4] != '-' || s[7] != '-')
        return NAN;
    if (len > 10) { /* a time of day: read past, the date is what counts */
        if (s[10] != 'T' && s[10] != ' ')
            return NAN;
        for (size_t i = 11; i < len; i++)
            if (s[i] == '\0' || !strchr("0123456789:.Z+-", s[i]))
                return NAN;
    }
    int y = digits(s, 4), m = digits(s + 5, 2), d = digits(s + 8, 2);
    if (y < 0 || m < 0 || d < 0)
        return NAN;
    return corax_decimal_year(y, m, d);
}
