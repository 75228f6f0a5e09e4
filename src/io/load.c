/* io: a drill program from its collar and survey tables. Row faults become
 * findings and the rest of the program still loads. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/load.h"
#include "io/fields.h"
#include "io/stations.h"

corax_load_options corax_load_options_default(void)
{
    corax_load_options o;
    memset(&o, 0, sizeof o);
    o.collars = o.surveys = corax_table_settings_default();
    o.collar_dip = o.survey_dip = CORAX_DIP_NEGATIVE_DOWN;
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
    int rejected; /* left out on request (the table's `use`, or a reject) */
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

static const char *const dip_words[] = {
    "negative-down (-90 to 90, negative for a downward hole)",
    "positive-down (-90 to 90, positive for a downward hole)",
    "from-vertical (0 to 180, 0 straight down)"};

/* Azimuth and dip from two columns; 1 ok, 0 both empty, -1 fault (why says). */
static int read_direction(const corax_row *row, long caz, long cdip, char decimal,
                          corax_dip_convention conv, double *az, double *plunge, char *why,
                          size_t wl)
{
    double a, d;
    corax_number_status sa = corax_field_number(row, caz, decimal, "azimuth", &a, why, wl);
    if (sa != CORAX_NUMBER_OK && sa != CORAX_NUMBER_EMPTY)
        return -1;
    char why2[160];
    corax_number_status sd = corax_field_number(row, cdip, decimal, "dip", &d, why2, sizeof why2);
    if (sd != CORAX_NUMBER_OK && sd != CORAX_NUMBER_EMPTY) {
        snprintf(why, wl, "%s", why2);
        return -1;
    }
    if (sa == CORAX_NUMBER_EMPTY && sd == CORAX_NUMBER_EMPTY)
        return 0;
    if (sd == CORAX_NUMBER_EMPTY) {
        snprintf(why, wl, "%s", why2);
        return -1;
    }
    if (corax_dip_to_plunge(d, conv, plunge) != CORAX_OK) {
        snprintf(why, wl, "dip %.10g does not fit the table's dip convention, %s: is the "
                 "dip_convention right?", d, dip_words[conv]);
        return -1;
    }
    if (sa == CORAX_NUMBER_EMPTY) { /* no azimuth: only a vertical hole goes without */
        if (fabs(fabs(*plunge) - CORAX_PI / 2) > 1e-9) {
            snprintf(why, wl, "the azimuth is empty, and only a vertical hole (dip %s) goes "
                     "without one", conv == CORAX_DIP_FROM_VERTICAL ? "0 or 180" : "-90 or 90");
            return -1;
        }
        a = 0.0;
    }
    if (!corax_field_in_range(a, 0.0, 360.0, "azimuth", why, wl))
        return -1;
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

/* Open a table and find its columns: the reader stands after the header. */
static corax_status open_table(const char *path, const corax_table_settings *t,
                               const char *const *names, size_t n, size_t required, long *col,
                               size_t *width, corax_reader **r, corax_error *err)
{
    corax_status st = corax_reader_open(path, t->format, r, err);
    if (st != CORAX_OK)
        return st;
    st = corax_table_header(*r, names, n, required, t->columns, col, width, NULL, err);
    if (st != CORAX_OK) {
        corax_reader_close(*r);
        *r = NULL;
    }
    return st;
}

static double unit_of(const corax_table_settings *t) { return t->unit > 0 ? t->unit : 1.0; }

static corax_status read_collars(const char *path, const corax_load_options *o, records *rec,
                                 corax_findings *problems, corax_table_info *info,
                                 corax_error *err)
{
    static const char *const names[] = {"hole", "x", "y", "z", "azimuth", "dip", "length",
                                        CORAX_COLLAR_PLACE_COLUMNS};
    enum { NCOL = 7 + CORAX_COLLAR_PLACE_NCOL };
    long col[NCOL];
    int strict = o->corrector && o->corrector->model; /* dates and places are needed */
    size_t width;
    corax_reader *r;
    corax_status st = open_table(path, &o->collars, names, NCOL, 4, col, &width, &r, err);
    if (st != CORAX_OK)
        return st;
    corax_table_info ti;
    corax_reader_info(r, &ti);
    char decimal = ti.format.decimal;
    double unit = unit_of(&o->collars);
    corax_row row;
    while ((st = corax_reader_next(r, &row, err)) == CORAX_OK) {
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
        for (int k = 0; k < 3 && !bad; k++) {
            bad = corax_field_number(&row, col[1 + k], decimal, names[1 + k], xyz[k], why,
                                     sizeof why) != CORAX_NUMBER_OK;
            *xyz[k] *= unit;
            bad = bad || !corax_field_plausible(*xyz[k], CORAX_MAX_COORDINATE, names[1 + k],
                                                why, sizeof why);
        }
        if (!bad && col[4] >= 0 && col[5] >= 0) {
            int d = read_direction(&row, col[4], col[5], decimal, o->collar_dip, &c.azimuth,
                                   &c.plunge, why, sizeof why);
            bad = d < 0;
            c.has_direction = d > 0;
        }
        if (!bad && col[6] >= 0) {
            corax_number_status ls = corax_field_number(&row, col[6], decimal, "length",
                                                        &c.length, why, sizeof why);
            c.length = ls == CORAX_NUMBER_EMPTY ? (double)NAN : c.length * unit;
            bad = ls == CORAX_NUMBER_NOT_NUMBER || ls == CORAX_NUMBER_NOT_FINITE ||
                  (ls == CORAX_NUMBER_OK &&
                   (!corax_field_nonnegative(c.length, "length", why, sizeof why) ||
                    !corax_field_plausible(c.length, CORAX_MAX_DEPTH, "length", why,
                                           sizeof why)));
        }
        if (!bad)
            bad = !corax_read_collar_place(&row, col + 7, decimal, strict, &place, why,
                                           sizeof why);
        if (bad) {
            st = corax_findings_add(problems, CORAX_ERROR, "collar-row", path, row.line,
                                    hl ? hole : NULL, NAN, "%s", why);
            if (st != CORAX_OK)
                break;
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
    corax_reader_info(r, info);
    corax_reader_close(r);
    return st == CORAX_END ? CORAX_OK : st;
}

/* A survey's `use` column: 1 use, 0 leave out, -1 not a yes or a no. */
static int read_use(const corax_row *row, long col)
{
    static const char *const yes[] = {"", "yes", "y", "true", "1", "use"};
    static const char *const no[] = {"no", "n", "false", "0", "reject"};
    size_t n;
    const char *t = corax_field_text(row, col, &n);
    for (size_t i = 0; i < sizeof yes / sizeof *yes; i++)
        if (strlen(yes[i]) == n && strncasecmp(yes[i], t, n) == 0)
            return 1;
    for (size_t i = 0; i < sizeof no / sizeof *no; i++)
        if (strlen(no[i]) == n && strncasecmp(no[i], t, n) == 0)
            return 0;
    return -1;
}

static corax_status read_surveys(const char *path, const corax_load_options *o, records *rec,
                                 corax_findings *problems, corax_table_info *info,
                                 corax_error *err)
{
    static const char *const names[] = {"hole", "depth", "azimuth", "dip", "azimuth_error",
                                        "dip_error", "use", CORAX_STATION_EXTRA_COLUMNS};
    enum { NCOL = 7 + CORAX_STATION_EXTRA_NCOL };
    long col[NCOL];
    int strict = o->corrector && o->corrector->model; /* dates are needed */
    size_t width;
    corax_reader *r;
    corax_status st = open_table(path, &o->surveys, names, NCOL, 4, col, &width, &r, err);
    if (st != CORAX_OK)
        return st;
    corax_table_info ti;
    corax_reader_info(r, &ti);
    char decimal = ti.format.decimal;
    double unit = unit_of(&o->surveys);
    corax_row row;
    while ((st = corax_reader_next(r, &row, err)) == CORAX_OK) {
        char why[200];
        size_t hl;
        const char *hole = corax_field_text(&row, col[0], &hl);
        corax_station s = {NAN, 0, 0, row.line, 0, NAN, NAN};
        corax_station_extra extra;
        int bad = corax_field_ragged(&row, width, why, sizeof why) != NULL, use = 1;
        if (!bad && hl == 0) {
            snprintf(why, sizeof why, "the hole name is empty");
            bad = 1;
        }
        if (!bad) {
            bad = corax_field_number(&row, col[1], decimal, "depth", &s.depth, why,
                                     sizeof why) != CORAX_NUMBER_OK ||
                  !corax_field_nonnegative(s.depth, "depth", why, sizeof why);
            s.depth *= unit;
            bad = bad || !corax_field_plausible(s.depth, CORAX_MAX_DEPTH, "depth", why,
                                                sizeof why);
        }
        if (!bad) {
            int d = read_direction(&row, col[2], col[3], decimal, o->survey_dip, &s.azimuth,
                                   &s.plunge, why, sizeof why);
            if (d == 0)
                snprintf(why, sizeof why, "the survey has no azimuth and no dip");
            bad = d <= 0;
        }
        if (!bad)
            bad = !read_station_errors(&row, col + 4, decimal, &s, why, sizeof why);
        if (!bad && col[6] >= 0 && (use = read_use(&row, col[6])) < 0) {
            snprintf(why, sizeof why, "use '%.20s' is not yes or no", row.field[col[6]]);
            bad = 1;
        }
        if (!bad)
            bad = !corax_read_station_extra(&row, col + 7, decimal, strict, &extra, why,
                                            sizeof why);
        if (bad) {
            st = corax_findings_add(problems, CORAX_ERROR, "survey-row", path, row.line,
                                    hl ? hole : NULL, s.depth, "%s", why);
            if (st != CORAX_OK)
                break;
            continue;
        }
        survey_rec *sr = append(&rec->survey, &rec->nsurvey, &rec->capsurvey, sizeof *sr);
        if (!sr || !(sr->hole = row_hole(&row, col[0]))) {
            rec->nsurvey -= sr != NULL;
            st = CORAX_ENOMEM;
            break;
        }
        sr->station = s;
        sr->rejected = !use;
        sr->extra = extra;
    }
    corax_reader_info(r, info);
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

/* Mark the stations the options reject; a reject that names no station is an
 * error finding (a misspelt hole or depth must not pass unseen). */
static corax_status mark_rejects(const corax_load_options *o, records *rec,
                                 corax_findings *problems)
{
    double unit = unit_of(&o->surveys);
    for (size_t i = 0; i < o->nreject; i++) {
        const corax_station_ref *ref = &o->reject[i];
        size_t k = first_survey(rec, ref->hole);
        int found = 0;
        for (; k < rec->nsurvey && strcmp(rec->survey[k].hole, ref->hole) == 0; k++)
            if (fabs(rec->survey[k].station.depth - ref->depth * unit) <= 5e-4) {
                rec->survey[k].rejected = 2;
                found = 1;
            }
        if (!found) {
            corax_status st = corax_findings_add(
                problems, CORAX_ERROR, "survey-reject", NULL, 0, ref->hole, ref->depth * unit,
                "the station to reject, %s at %g, is not in the survey table", ref->hole,
                ref->depth);
            if (st != CORAX_OK)
                return st;
        }
    }
    return CORAX_OK;
}

/* Desurvey each collar's hole from its stations, each station's azimuth
 * corrected, and add it to the program. */
static corax_status build_program(const char *cpath, const char *spath,
                                  const corax_load_options *o, records *rec,
                                  corax_program *prog, corax_findings *problems, size_t *rejected)
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
        size_t k = first_survey(rec, c->hole), n = 0, used = 0;
        while (k + n < rec->nsurvey && strcmp(rec->survey[k + n].hole, c->hole) == 0)
            n++;
        if (n + 1 > cap) {
            corax_station *p = realloc(buf, (n + 1) * sizeof *p);
            corax_station_extra *q = p ? realloc(extra, (n + 1) * sizeof *q) : NULL;
            buf = p ? p : buf;
            extra = q ? q : extra;
            if (!q) {
                st = CORAX_ENOMEM;
                break;
            }
            cap = n + 1;
        }
        for (size_t j = 0; j < n && st != CORAX_ENOMEM; j++) {
            const survey_rec *sr = &rec->survey[k + j];
            if (!sr->rejected) { /* rejected stations need no correction, nor a date */
                buf[used] = sr->station;
                extra[used++] = sr->extra;
                continue;
            }
            (*rejected)++;
            st = corax_findings_add(problems, CORAX_NOTE, "survey-rejected", spath,
                                    sr->station.line, c->hole, sr->station.depth,
                                    "the station at %.2f m is left out, as %s says",
                                    sr->station.depth,
                                    sr->rejected == 2 ? "the reject list" : "its use column");
        }
        int placed;
        st = corax_correct_stations(corr, c->hole, &c->collar, &c->place, cpath, c->line, buf,
                                    extra, &used, spath, o->corrections, problems, &placed);
        double first = INFINITY;
        for (size_t j = 0; j < used; j++)
            first = fmin(first, buf[j].depth);
        if (st == CORAX_OK && placed && o->collar_station && used && c->collar.has_direction &&
            first > 0.0) /* the set-up as a station at the collar: its azimuth is in the
                          * grid already, and the stations above are corrected */
            buf[used++] = corax_station_make(0.0, c->collar.azimuth, c->collar.plunge, c->line);
        if (st == CORAX_OK && placed)
            st = build_hole(c, buf, used, 0.0, o->repair, spath, prog, problems);
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
                                corax_findings *problems, corax_load_info *info,
                                corax_error *err)
{
    corax_load_options defaults = corax_load_options_default();
    const corax_load_options *o = options ? options : &defaults;
    corax_load_info scratch;
    if (!info)
        info = &scratch;
    memset(info, 0, sizeof *info);
    records rec;
    memset(&rec, 0, sizeof rec);
    *out = NULL;
    corax_program *prog = corax_program_new();
    if (!prog)
        return CORAX_ENOMEM;
    corax_status st = read_collars(collars_path, o, &rec, problems, &info->collars, err);
    if (st == CORAX_OK)
        st = read_surveys(surveys_path, o, &rec, problems, &info->surveys, err);
    if (st == CORAX_OK) {
        if (rec.nsurvey) /* an empty table has no array at all: qsort wants one */
            qsort(rec.survey, rec.nsurvey, sizeof *rec.survey, survey_cmp);
        st = mark_rejects(o, &rec, problems);
    }
    if (st == CORAX_OK)
        st = build_program(collars_path, surveys_path, o, &rec, prog, problems, &info->rejected);
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

corax_status corax_station_refs_parse(const char *text, corax_station_ref **refs, size_t *n,
                                      corax_error *err)
{
    for (const char *p = text; *p;) {
        const char *end = strchr(p, ',');
        if (!end)
            end = p + strlen(p);
        while (p < end && (*p == ' ' || *p == '\t'))
            p++;
        const char *at = memchr(p, '@', (size_t)(end - p));
        double depth;
        if (!at || at == p ||
            corax_parse_number(at + 1, (size_t)(end - at - 1), '.', &depth) != CORAX_NUMBER_OK ||
            depth < 0)
            return corax_error_set(err, CORAX_EVALUE, NULL, 0, "'%.*s' is not HOLE@DEPTH",
                                   (int)(end - p), p);
        size_t hl = (size_t)(at - p);
        while (hl && (p[hl - 1] == ' ' || p[hl - 1] == '\t'))
            hl--;
        corax_station_ref *r = realloc(*refs, (*n + 1) * sizeof *r);
        if (r)
            *refs = r;
        char *hole = r ? strndup(p, hl) : NULL;
        if (!hole)
            return corax_error_set(err, CORAX_ENOMEM, NULL, 0, "out of memory");
        (*refs)[(*n)++] = (corax_station_ref){hole, depth};
        p = *end ? end + 1 : end;
    }
    return CORAX_OK;
}
