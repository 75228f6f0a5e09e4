/* io: a drill program from its collar and survey tables. Row faults become
 * findings and the rest of the program still loads. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/load.h"
#include "io/fields.h"
#include "io/stations.h"

corax_load_options corax_load_options_default(void)
{
    corax_load_options o;
    memset(&o, 0, sizeof o);
    o.format = corax_table_format_default();
    o.columns = NULL;
    o.dip_convention = CORAX_DIP_NEGATIVE_DOWN;
    return o;
}

typedef struct collar_rec {
    char *hole;
    corax_collar collar;
    long line;
    corax_collar_place place; /* date and place, for the azimuth corrections */
} collar_rec;

typedef struct survey_rec {
    char *hole;
    corax_station station;
    corax_station_extra extra; /* date, reference and measured field */
} survey_rec;

typedef struct records {
    collar_rec *collar;
    size_t ncollar, capcollar;
    survey_rec *survey;
    size_t nsurvey, capsurvey;
} records;

static void records_free(records *r)
{
    for (size_t i = 0; i < r->ncollar; i++)
        free(r->collar[i].hole);
    for (size_t i = 0; i < r->nsurvey; i++)
        free(r->survey[i].hole);
    free(r->collar);
    free(r->survey);
}

/* A new slot at the end of an array of `size`-byte items, or NULL. arrayp
 * points to the array's pointer (any object pointer type; copied as bytes). */
static void *append(void *arrayp, size_t *count, size_t *cap, size_t size)
{
    char *base;
    memcpy(&base, arrayp, sizeof base);
    if (*count == *cap) {
        size_t c = *cap ? 2 * *cap : 256;
        char *q = realloc(base, c * size);
        if (!q)
            return NULL;
        base = q;
        memcpy(arrayp, &base, sizeof base);
        *cap = c;
    }
    return base + (*count)++ * size;
}

/* The dip range of a convention, for messages. */
static void dip_range(corax_dip_convention c, double *lo, double *hi)
{
    *lo = c == CORAX_DIP_FROM_VERTICAL ? 0.0 : -90.0;
    *hi = c == CORAX_DIP_FROM_VERTICAL ? 180.0 : 90.0;
}

/* Azimuth and dip from two columns; 1 ok, 0 both empty, -1 fault (why says). */
static int read_direction(const corax_row *row, long caz, long cdip,
                          const corax_load_options *o, double *az, double *plunge, char *why,
                          size_t wl)
{
    double a, d, lo, hi;
    corax_number_status sa = corax_field_number(row, caz, o->format.decimal, "azimuth", &a, why, wl);
    if (sa != CORAX_NUMBER_OK && sa != CORAX_NUMBER_EMPTY)
        return -1;
    char why2[160];
    corax_number_status sd = corax_field_number(row, cdip, o->format.decimal, "dip", &d, why2, sizeof why2);
    if (sd != CORAX_NUMBER_OK && sd != CORAX_NUMBER_EMPTY) {
        snprintf(why, wl, "%s", why2);
        return -1;
    }
    if (sa == CORAX_NUMBER_EMPTY && sd == CORAX_NUMBER_EMPTY)
        return 0;
    if (sa == CORAX_NUMBER_EMPTY || sd == CORAX_NUMBER_EMPTY) {
        snprintf(why, wl, "%s", sa == CORAX_NUMBER_EMPTY ? why : why2);
        return -1;
    }
    if (!corax_field_in_range(a, 0.0, 360.0, "azimuth", why, wl))
        return -1;
    dip_range(o->dip_convention, &lo, &hi);
    if (!corax_field_in_range(d, lo, hi, "dip", why, wl))
        return -1;
    corax_dip_to_plunge(d, o->dip_convention, plunge);
    *az = corax_rad(a);
    return 1;
}

/* A station's own one-sigma errors (degrees in the table), when its row gives
 * them: both or neither. 1 ok, 0 with why filled. */
static int read_station_errors(const corax_row *row, const long *col, char decimal,
                               corax_station *s, char *why, size_t wl)
{
    static const char *const names[] = {"azimuth_error", "dip_error"};
    double v[2];
    int given = 0;
    for (int i = 0; i < 2; i++) {
        if (col[i] < 0)
            continue;
        corax_number_status st = corax_field_number(row, col[i], decimal, names[i], &v[i], why, wl);
        if (st == CORAX_NUMBER_EMPTY)
            continue;
        if (st != CORAX_NUMBER_OK || !corax_field_in_range(v[i], 0.0, 45.0, names[i], why, wl))
            return 0;
        given |= 1 << i;
    }
    if (given == 0)
        return 1;
    if (given != 3) {
        snprintf(why, wl, "give both azimuth_error and dip_error for a station, or neither");
        return 0;
    }
    s->has_errors = 1;
    s->azimuth_error = corax_rad(v[0]);
    s->dip_error = corax_rad(v[1]);
    return 1;
}

static char *row_hole(const corax_row *row, long col)
{
    size_t n;
    const char *s = corax_field_text(row, col, &n);
    return n ? strndup(s, n) : NULL;
}

static corax_status read_collars(const char *path, const corax_load_options *o, records *rec,
                                 corax_findings *problems, corax_error *err)
{
    static const char *const names[] = {"hole", "x", "y", "z", "azimuth", "dip", "length",
                                        CORAX_COLLAR_PLACE_COLUMNS};
    enum { NCOL = 7 + CORAX_COLLAR_PLACE_NCOL };
    long col[NCOL];
    int strict = o->corrector && o->corrector->model; /* dates and places are needed */
    size_t width;
    corax_reader *r;
    corax_status st = corax_reader_open(path, o->format, &r, err);
    if (st != CORAX_OK)
        return st;
    st = corax_table_header(r, names, NCOL, 4, o->columns, col, &width, NULL, err);
    corax_row row;
    while (st == CORAX_OK && (st = corax_reader_next(r, &row, err)) == CORAX_OK) {
        char why[200];
        size_t hl;
        const char *hole = corax_field_text(&row, col[0], &hl);
        corax_collar c = {{0, 0, 0}, 0, 0, 0, NAN};
        corax_collar_place place;
        double *xyz[3] = {&c.position.x, &c.position.y, &c.position.z};
        int bad = corax_field_ragged(&row, width, why, sizeof why) != NULL;
        if (!bad && hl == 0) {
            snprintf(why, sizeof why, "the hole name is empty");
            bad = 1;
        }
        for (int k = 0; k < 3 && !bad; k++)
            bad = corax_field_number(&row, col[1 + k], o->format.decimal, names[1 + k], xyz[k],
                                     why, sizeof why) != CORAX_NUMBER_OK;
        if (!bad && col[4] >= 0 && col[5] >= 0) {
            int d = read_direction(&row, col[4], col[5], o, &c.azimuth, &c.plunge, why, sizeof why);
            bad = d < 0;
            c.has_direction = d > 0;
        }
        if (!bad && col[6] >= 0) {
            corax_number_status ls = corax_field_number(&row, col[6], o->format.decimal,
                                                        "length", &c.length, why, sizeof why);
            bad = ls == CORAX_NUMBER_NOT_NUMBER || ls == CORAX_NUMBER_NOT_FINITE ||
                  (ls == CORAX_NUMBER_OK &&
                   !corax_field_nonnegative(c.length, "length", why, sizeof why));
            if (ls == CORAX_NUMBER_EMPTY)
                c.length = NAN;
        }
        if (!bad)
            bad = !corax_read_collar_place(&row, col + 7, o->format.decimal, strict, &place, why,
                                           sizeof why);
        if (bad) {
            st = corax_findings_add(problems, CORAX_ERROR, "collar-row", path, row.line,
                                    hl ? hole : NULL, NAN, "%s", why);
            continue;
        }
        collar_rec *cr = append(&rec->collar, &rec->ncollar, &rec->capcollar, sizeof *cr);
        if (!cr || !(cr->hole = row_hole(&row, col[0]))) {
            rec->ncollar -= cr != NULL;
            st = CORAX_ENOMEM;
            break;
        }
        cr->collar = c;
        cr->line = row.line;
        cr->place = place;
    }
    corax_reader_close(r);
    return st == CORAX_END ? CORAX_OK : st;
}

static corax_status read_surveys(const char *path, const corax_load_options *o, records *rec,
                                 corax_findings *problems, corax_error *err)
{
    static const char *const names[] = {"hole", "depth", "azimuth", "dip", "azimuth_error",
                                        "dip_error", CORAX_STATION_EXTRA_COLUMNS};
    enum { NCOL = 6 + CORAX_STATION_EXTRA_NCOL };
    long col[NCOL];
    int strict = o->corrector && o->corrector->model; /* dates are needed */
    size_t width;
    corax_reader *r;
    corax_status st = corax_reader_open(path, o->format, &r, err);
    if (st != CORAX_OK)
        return st;
    st = corax_table_header(r, names, NCOL, 4, o->columns, col, &width, NULL, err);
    corax_row row;
    while (st == CORAX_OK && (st = corax_reader_next(r, &row, err)) == CORAX_OK) {
        char why[200];
        size_t hl;
        const char *hole = corax_field_text(&row, col[0], &hl);
        corax_station s = {NAN, 0, 0, row.line, 0, NAN, NAN};
        corax_station_extra extra;
        int bad = corax_field_ragged(&row, width, why, sizeof why) != NULL;
        if (!bad && hl == 0) {
            snprintf(why, sizeof why, "the hole name is empty");
            bad = 1;
        }
        if (!bad)
            bad = corax_field_number(&row, col[1], o->format.decimal, "depth", &s.depth, why,
                                     sizeof why) != CORAX_NUMBER_OK ||
                  !corax_field_nonnegative(s.depth, "depth", why, sizeof why);
        if (!bad) {
            int d = read_direction(&row, col[2], col[3], o, &s.azimuth, &s.plunge, why, sizeof why);
            if (d == 0)
                snprintf(why, sizeof why, "the survey has no azimuth and no dip");
            bad = d <= 0;
        }
        if (!bad)
            bad = !read_station_errors(&row, col + 4, o->format.decimal, &s, why, sizeof why);
        if (!bad)
            bad = !corax_read_station_extra(&row, col + 6, o->format.decimal, strict, &extra, why,
                                            sizeof why);
        if (bad) {
            st = corax_findings_add(problems, CORAX_ERROR, "survey-row", path, row.line,
                                    hl ? hole : NULL, s.depth,
                                    "%s", why);
            continue;
        }
        survey_rec *sr = append(&rec->survey, &rec->nsurvey, &rec->capsurvey, sizeof *sr);
        if (!sr || !(sr->hole = row_hole(&row, col[0]))) {
            rec->nsurvey -= sr != NULL;
            st = CORAX_ENOMEM;
            break;
        }
        sr->station = s;
        sr->extra = extra;
    }
    corax_reader_close(r);
    return st == CORAX_END ? CORAX_OK : st;
}

static int survey_cmp(const void *a, const void *b)
{
    const survey_rec *x = a, *y = b;
    int c = strcmp(x->hole, y->hole);
    if (c)
        return c;
    return x->station.line < y->station.line ? -1 : x->station.line > y->station.line;
}

/* The first survey record of a hole in the sorted records, or n. */
static size_t first_survey(const records *rec, const char *hole)
{
    size_t lo = 0, hi = rec->nsurvey;
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (strcmp(rec->survey[mid].hole, hole) < 0)
            lo = mid + 1;
        else
            hi = mid;
    }
    return lo;
}

/* Desurvey one hole and add it; a fault becomes a finding. With repair, the
 * offending later station goes and the hole is desurveyed again. */
static corax_status build_hole(const collar_rec *c, corax_station *st, size_t n, double correction,
                               int repair, const char *spath, corax_program *prog,
                               corax_findings *problems)
{
    for (;;) {
        corax_hole *h;
        corax_error e;
        corax_error_clear(&e);
        corax_status s = corax_hole_new(c->hole, &c->collar, st, n, correction, &h, &e);
        if (s == CORAX_OK)
            return corax_program_add(prog, h);
        if (s == CORAX_ENOMEM)
            return s;
        const char *check = s == CORAX_EREPEAT ? "survey-repeated-depth"
                            : s == CORAX_ESURVEY ? "survey-reversal"
                                                 : "survey-row";
        size_t bad = 0; /* the station the message points at */
        while (bad < n && st[bad].line != e.line)
            bad++;
        double depth = bad < n ? st[bad].depth : (double)NAN;
        int keep = repair && bad < n && (s == CORAX_EREPEAT || s == CORAX_ESURVEY);
        s = corax_findings_add(problems, CORAX_ERROR, check, spath, e.line, c->hole, depth,
                               "%s%s", e.message,
                               keep ? "; that station is left out" : "");
        if (s != CORAX_OK || !keep)
            return s;
        memmove(st + bad, st + bad + 1, (n - bad - 1) * sizeof *st);
        n--;
    }
}

/* Desurvey each collar's hole from its stations, each station's azimuth
 * corrected, and add it to the program. */
static corax_status build_program(const char *cpath, const char *spath,
                                  const corax_load_options *o, records *rec,
                                  corax_program *prog, corax_findings *problems)
{
    corax_corrector constant = corax_corrector_default();
    constant.declination = corax_rad(o->declination);
    constant.convergence = corax_rad(o->convergence);
    const corax_corrector *corr = o->corrector ? o->corrector : &constant;
    corax_station *buf = NULL;
    corax_station_extra *extra = NULL;
    size_t cap = 0;
    corax_status st = CORAX_OK;
    for (size_t i = 0; i < rec->ncollar && st != CORAX_ENOMEM; i++) {
        const collar_rec *c = &rec->collar[i];
        if (corax_program_find(prog, c->hole, strlen(c->hole))) {
            st = corax_findings_add(problems, CORAX_ERROR, "collar-repeated", cpath, c->line,
                                    c->hole, NAN, "hole %s has a second collar row; it is ignored",
                                    c->hole);
            continue;
        }
        size_t k = first_survey(rec, c->hole), n = 0;
        while (k + n < rec->nsurvey && strcmp(rec->survey[k + n].hole, c->hole) == 0)
            n++;
        if (n > cap) {
            corax_station *p = realloc(buf, n * sizeof *p);
            corax_station_extra *q = p ? realloc(extra, n * sizeof *q) : NULL;
            buf = p ? p : buf;
            extra = q ? q : extra;
            if (!q) {
                st = CORAX_ENOMEM;
                break;
            }
            cap = n;
        }
        for (size_t j = 0; j < n; j++) {
            buf[j] = rec->survey[k + j].station;
            extra[j] = rec->survey[k + j].extra;
        }
        int placed;
        st = corax_correct_stations(corr, c->hole, &c->collar, &c->place, cpath, c->line, buf,
                                    extra, &n, spath, o->corrections, problems, &placed);
        if (st == CORAX_OK && placed)
            st = build_hole(c, buf, n, 0.0, o->repair, spath, prog, problems);
    }
    free(buf);
    free(extra);
    if (o->corrections)
        corax_corrections_sort(o->corrections);
    return st;
}

/* Surveys of holes that have no collar: one warning per hole. */
static corax_status orphan_surveys(const char *spath, const records *rec,
                                   const corax_program *prog, corax_findings *problems)
{
    for (size_t i = 0; i < rec->nsurvey; i++) {
        const survey_rec *s = &rec->survey[i];
        if (i > 0 && strcmp(s->hole, rec->survey[i - 1].hole) == 0)
            continue;
        if (corax_program_find(prog, s->hole, strlen(s->hole)))
            continue;
        int collared = 0;
        for (size_t j = 0; j < rec->ncollar && !collared; j++)
            collared = strcmp(rec->collar[j].hole, s->hole) == 0;
        if (collared)
            continue; /* its collar is there; the survey fault is already a finding */
        corax_status st = corax_findings_add(problems, CORAX_WARNING, "no-collar", spath,
                                             s->station.line, s->hole, NAN,
                                             "hole %s has surveys but no collar; it is left out",
                                             s->hole);
        if (st != CORAX_OK)
            return st;
    }
    return CORAX_OK;
}

corax_status corax_program_load(const char *collars_path, const char *surveys_path,
                                const corax_load_options *options, corax_program **out,
                                corax_findings *problems, corax_error *err)
{
    corax_load_options defaults = corax_load_options_default();
    const corax_load_options *o = options ? options : &defaults;
    records rec;
    memset(&rec, 0, sizeof rec);
    *out = NULL;
    corax_program *prog = corax_program_new();
    if (!prog)
        return CORAX_ENOMEM;
    corax_status st = read_collars(collars_path, o, &rec, problems, err);
    if (st == CORAX_OK)
        st = read_surveys(surveys_path, o, &rec, problems, err);
    if (st == CORAX_OK) {
        if (rec.nsurvey) /* an empty table has no array at all: qsort wants one */
            qsort(rec.survey, rec.nsurvey, sizeof *rec.survey, survey_cmp);
        st = build_program(collars_path, surveys_path, o, &rec, prog, problems);
    }
    if (st == CORAX_OK)
        st = orphan_surveys(surveys_path, &rec, prog, problems);
    records_free(&rec);
    if (st != CORAX_OK) {
        corax_program_free(prog);
        return st;
    }
    *out = prog;
    return CORAX_OK;
}
