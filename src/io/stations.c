/* io: the dates, places, references and measured fields of collars and
 * survey stations, and the per-station azimuth corrections they lead to. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "corax/geometry.h"
#include "io/fields.h"
#include "io/stations.h"

/* A date column: 1 read or empty (NaN), 0 fault when strict (else NaN). */
static int read_date(const corax_row *row, long col, int strict, double *date, char *why,
                     size_t wl)
{
    size_t n;
    const char *s = corax_field_text(row, col, &n);
    *date = n ? corax_date_parse(s, n) : (double)NAN;
    if (n == 0 || isfinite(*date) || !strict)
        return 1;
    snprintf(why, wl, "date '%.*s' is not an ISO 8601 date (YYYY-MM-DD)", (int)(n > 40 ? 40 : n), s);
    return 0;
}

/* An optional number in [lo, hi], in its units times `scale`: 1 read or empty
 * (NaN), 0 fault when strict (else NaN). */
static int read_optional(const corax_row *row, long col, char decimal, const char *name,
                         double lo, double hi, double scale, int strict, double *v, char *why,
                         size_t wl)
{
    *v = NAN;
    if (col < 0)
        return 1;
    double x;
    corax_number_status st = corax_field_number(row, col, decimal, name, &x, why, wl);
    if (st == CORAX_NUMBER_EMPTY)
        return 1;
    if (st == CORAX_NUMBER_OK && corax_field_in_range(x, lo, hi, name, why, wl)) {
        *v = x * scale;
        return 1;
    }
    return !strict;
}

int corax_read_collar_place(const corax_row *row, const long *col, char decimal, int strict,
                            corax_collar_place *p, char *why, size_t wl)
{
    if (!read_date(row, col[0], strict, &p->date, why, wl) ||
        !read_optional(row, col[1], decimal, "latitude", -90, 90, CORAX_DEG, strict,
                       &p->latitude, why, wl) ||
        !read_optional(row, col[2], decimal, "longitude", -180, 360, CORAX_DEG, strict,
                       &p->longitude, why, wl))
        return 0;
    if (isnan(p->latitude) != isnan(p->longitude)) {
        if (strict) {
            snprintf(why, wl, "give both latitude and longitude for a collar, or neither");
            return 0;
        }
        p->latitude = p->longitude = NAN;
    }
    return 1;
}

int corax_read_station_extra(const corax_row *row, const long *col, char decimal, int strict,
                             corax_station_extra *e, char *why, size_t wl)
{
    size_t n;
    const char *s = corax_field_text(row, col[1], &n);
    corax_north north;
    e->north = -1;
    if (n && corax_north_parse(s, n, &north) != 0) {
        snprintf(why, wl, "reference '%.*s' is not magnetic, true or grid",
                 (int)(n > 40 ? 40 : n), s);
        return 0;
    }
    if (n)
        e->north = (int)north;
    return read_date(row, col[0], strict, &e->date, why, wl) &&
           read_optional(row, col[2], decimal, "total_field", 0, 1e5, 1.0, 1, &e->total_field,
                         why, wl) &&
           read_optional(row, col[3], decimal, "field_dip", -90, 90, CORAX_DEG, 1, &e->field_dip,
                         why, wl);
}

corax_status corax_correct_stations(const corax_corrector *c, const char *hole,
                                    const corax_collar *collar, const corax_collar_place *place,
                                    const char *cpath, long cline, corax_station *st,
                                    corax_station_extra *extra, size_t *n, const char *spath,
                                    corax_corrections *record, corax_findings *problems, int *ok)
{
    corax_error e;
    corax_error_clear(&e);
    corax_site site;
    if (*n == 0) { /* nothing to correct: a collar alone needs no place */
        *ok = 1;
        return CORAX_OK;
    }
    *ok = corax_corrector_site(c, collar->position, place->latitude, place->longitude, &site,
                               &e) == CORAX_OK;
    if (!*ok) {
        *n = 0;
        return corax_findings_add(problems, CORAX_ERROR, "collar-place", cpath, cline, hole, NAN,
                                  "hole %s: %s", hole, e.message);
    }
    size_t kept = 0;
    for (size_t j = 0; j < *n; j++) {
        corax_station_record r;
        memset(&r, 0, sizeof r);
        double date = isfinite(extra[j].date) ? extra[j].date : place->date;
        corax_north north = extra[j].north >= 0 ? (corax_north)extra[j].north : c->north;
        if (corax_corrector_station(c, &site, date, north, &r.correction, &e) != CORAX_OK) {
            corax_status s = corax_findings_add(problems, CORAX_ERROR, "survey-correction", spath,
                                                st[j].line, hole, st[j].depth,
                                                "%s; the station is left out", e.message);
            if (s != CORAX_OK)
                return s;
            continue;
        }
        r.depth = st[j].depth;
        r.line = st[j].line;
        r.azimuth = st[j].azimuth;
        r.site = site;
        r.total_field = extra[j].total_field;
        r.field_dip = extra[j].field_dip;
        if (record && corax_corrections_add(record, hole, &r) != CORAX_OK)
            return CORAX_ENOMEM;
        st[kept] = st[j];
        st[kept].azimuth = corax_wrap_azimuth(st[j].azimuth + r.correction.total);
        extra[kept++] = extra[j];
    }
    *n = kept;
    return CORAX_OK;
}
