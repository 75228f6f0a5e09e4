/* arrays: the library over plain arrays (see corax/arrays.h): a program
 * loaded by the setup's words, and whole arrays of depths and readings
 * desurveyed, converted and drawn through their errors. */
#include <math.h>
#include <omp.h>
#include <stdlib.h>
#include <string.h>

#include "arrays/setup.h"
#include "corax/magnetic.h"

struct corax_arrays {
    corax_program *program;
    corax_findings findings;
    char *paths[2];                 /* the findings' files */
    corax_magnetic_model *model;
    corax_dip_convention survey_dip; /* of the dips desurveyed */
};

/* ---- loading ---- */

/* The corrector the setup asks for, with the model it needs opened in *model. */
static corax_status corrector(const corax_setup *s, corax_corrector *r,
                              corax_magnetic_model **model, corax_error *err)
{
    *model = NULL;
    if (s->convergence_projection && !s->crs)
        return corax_error_set(err, CORAX_EARG, NULL, 0, "convergence from the projection "
                               "needs crs (the CRS of the collar coordinates)");
    if (s->model_name && !s->declination_model)
        return corax_error_set(err, CORAX_EARG, NULL, 0,
                               "magnetic_model goes with declination = model");
    if (s->declination_model) {
        const char *name = s->model_name ? s->model_name : "WMM";
        corax_status st = corax_magnetic_is_builtin(name) ? corax_magnetic_builtin(name, model, err)
                                                          : corax_magnetic_read(name, model, err);
        if (st != CORAX_OK)
            return st;
    }
    *r = corax_corrector_default();
    r->declination = corax_rad(s->declination);
    r->model = *model;
    r->convergence = corax_rad(s->convergence);
    r->convergence_from_crs = s->convergence_projection;
    r->crs = s->crs;
    r->local_grid = s->has_grid ? &s->grid : NULL;
    r->date = s->date;
    r->north = s->north;
    return CORAX_OK;
}

corax_status corax_arrays_load(const corax_setup *s, const char *collars, const char *surveys,
                               corax_arrays **out, corax_error *err)
{
    corax_error_clear(err);
    *out = NULL;
    if (!s || !collars || !surveys)
        return corax_error_set(err, CORAX_EARG, NULL, 0, "no setup, collars or surveys");
    corax_arrays *a = calloc(1, sizeof *a);
    if (!a || !(a->paths[0] = strdup(collars)) || !(a->paths[1] = strdup(surveys))) {
        corax_arrays_free(a);
        return corax_error_set(err, CORAX_ENOMEM, NULL, 0, "out of memory");
    }
    corax_load_options o = corax_load_options_default();
    corax_column_map *merged[2] = {NULL, NULL};
    o.collars = corax_setup_table(s, SETUP_COLLARS, &merged[0]);
    o.surveys = corax_setup_table(s, SETUP_SURVEYS, &merged[1]);
    o.collar_dip = corax_setup_dip(s, SETUP_COLLARS);
    o.survey_dip = a->survey_dip = corax_setup_dip(s, SETUP_SURVEYS);
    o.declination = s->declination;
    o.convergence = s->convergence;
    o.collar_station = s->collar_station;
    o.reject = s->reject;
    o.nreject = s->nreject;
    corax_corrector r;
    corax_status st = corrector(s, &r, &a->model, err);
    o.corrector = &r;
    if (st == CORAX_OK)
        st = corax_program_load(a->paths[0], a->paths[1], &o, &a->program, &a->findings, NULL,
                                err);
    corax_column_map_free(merged[0]);
    corax_column_map_free(merged[1]);
    if (st != CORAX_OK) {
        corax_arrays_free(a);
        return st;
    }
    *out = a;
    return CORAX_OK;
}

void corax_arrays_free(corax_arrays *a)
{
    if (!a)
        return;
    corax_program_free(a->program);
    corax_findings_clear(&a->findings);
    free(a->paths[0]);
    free(a->paths[1]);
    corax_magnetic_model_free(a->model);
    free(a);
}

const corax_program *corax_arrays_program(const corax_arrays *a)
{
    return a->program;
}

size_t corax_arrays_finding_count(const corax_arrays *a)
{
    return a->findings.count;
}

int corax_arrays_finding(const corax_arrays *a, size_t i, const char **file, long *line,
                         const char **hole, const char **message)
{
    if (i >= a->findings.count)
        return -1;
    const corax_finding *f = &a->findings.item[i];
    if (file)
        *file = f->file ? f->file : "";
    if (line)
        *line = f->line;
    if (hole)
        *hole = f->hole;
    if (message)
        *message = f->message;
    return (int)f->severity;
}

/* ---- columns ---- */

static const char *const point_names[] = {"x", "y", "z", "azimuth", "dip", "plunge", NULL};
static const char *const reading_names[] = {"depth",      "alpha",     "beta", "gamma",
                                            "line_alpha", "line_beta", "turn", "arbitrary_line",
                                            NULL};
static const char *const result_names[] = {
    "x",          "y",           "z",  "hole_azimuth", "hole_plunge", "dip",   "dip_direction",
    "strike",     "pole_trend",  "pole_plunge", "nx",  "ny",          "nz",    "trend",
    "plunge",     NULL};
static const char *const error_names[] = {"alpha_error", "beta_error", "line_error",
                                          "depth_error", NULL};
static const char *const spread_names[] = {"dip_sd", "dip_direction_sd", "cone95", "kappa",
                                           "position_sd", "draws", NULL};

const char *corax_arrays_column(corax_arrays_kind kind, size_t i)
{
    static const char *const *const names[] = {point_names, reading_names, result_names,
                                               error_names, spread_names};
    static const size_t counts[] = {CORAX_POINT_COLUMNS, CORAX_READING_COLUMNS,
                                    CORAX_RESULT_COLUMNS, CORAX_ERRORS_COLUMNS,
                                    CORAX_SPREAD_COLUMNS};
    if ((unsigned)kind > CORAX_ARRAYS_SPREAD || i >= counts[kind])
        return NULL;
    return names[kind][i];
}

const char *corax_arrays_place_name(int place)
{
    static const char *const extra[] = {"no-survey", "unknown-hole", "bad-depth"};
    if (place >= 0 && place <= CORAX_WHERE_BEYOND_END)
        return corax_where_name((corax_where)place);
    if (place > CORAX_WHERE_BEYOND_END && place < CORAX_PLACE_COUNT)
        return extra[place - CORAX_PLACE_NO_SURVEY];
    return "unknown";
}

/* ---- desurvey ---- */

static void fill_nan(double *row, size_t n)
{
    for (size_t i = 0; i < n; i++)
        row[i] = NAN;
}

/* Rows are shared among the threads in chunks, each with its own cache of the
 * last hole and its course. */
enum { CHUNK = 1024 };

typedef struct lane {
    const char *name;
    const corax_hole *hole;
    size_t hint;
} lane;

static const corax_hole *find(const corax_program *p, lane *ln, const char *name)
{
    if (!name)
        return NULL;
    if (ln->name && strcmp(ln->name, name) == 0)
        return ln->hole;
    ln->name = name;
    ln->hole = corax_program_find(p, name, strlen(name));
    ln->hint = 0;
    return ln->hole;
}

static int place_one(const corax_arrays *a, lane *ln, const char *name, double depth,
                     double *row)
{
    const corax_hole *h = find(a->program, ln, name);
    corax_hole_point pt;
    fill_nan(row, CORAX_POINT_COLUMNS);
    if (!h)
        return CORAX_PLACE_UNKNOWN_HOLE;
    if (!(depth >= 0.0) || !isfinite(depth))
        return CORAX_PLACE_BAD_DEPTH;
    if (corax_hole_at(h, depth, &ln->hint, &pt) != CORAX_OK)
        return CORAX_PLACE_NO_SURVEY;
    double az, plunge;
    corax_direction_angles(pt.tangent, &az, &plunge);
    row[CORAX_POINT_X] = pt.position.x;
    row[CORAX_POINT_Y] = pt.position.y;
    row[CORAX_POINT_Z] = pt.position.z;
    row[CORAX_POINT_AZIMUTH] = corax_deg(corax_wrap_azimuth(az));
    row[CORAX_POINT_DIP] = corax_plunge_to_dip(plunge, a->survey_dip);
    row[CORAX_POINT_PLUNGE] = corax_deg(plunge);
    return (int)pt.where;
}

void corax_arrays_desurvey(const corax_arrays *a, const corax_setup *s, size_t n,
                           const char *const *hole, const double *depth, double *out,
                           int *place)
{
    corax_column_map *merged;
    double unit = corax_setup_table(s, SETUP_ALL, &merged).unit;
    corax_column_map_free(merged);
    long chunks = (long)((n + CHUNK - 1) / CHUNK);
#pragma omp parallel for schedule(dynamic, 1)
    for (long c = 0; c < chunks; c++) {
        lane ln = {NULL, NULL, 0};
        size_t end = (size_t)(c + 1) * CHUNK < n ? (size_t)(c + 1) * CHUNK : n;
        for (size_t i = (size_t)c * CHUNK; i < end; i++)
            place[i] = place_one(a, &ln, hole[i], depth[i] * unit, out + i * CORAX_POINT_COLUMNS);
    }
}

/* ---- convert ---- */

/* A row of the readings' array as a corax_reading (radians, metres). */
static corax_reading reading_of(const double *row, double unit)
{
    corax_reading r = corax_reading_empty();
    r.depth = row[CORAX_READING_DEPTH] * unit;
    double *angle[] = {&r.alpha, &r.beta, &r.gamma, &r.line_alpha, &r.line_beta, &r.turn};
    for (int k = 0; k < 6; k++)
        *angle[k] = corax_rad(row[CORAX_READING_ALPHA + k]); /* NaN stays NaN */
    r.arbitrary_line = row[CORAX_READING_ARBITRARY] != 0.0 && !isnan(row[CORAX_READING_ARBITRARY]);
    return r;
}

static double readings_unit(const corax_setup *s)
{
    corax_column_map *merged;
    double unit = corax_setup_table(s, SETUP_STRUCTURES, &merged).unit;
    corax_column_map_free(merged);
    return unit;
}

/* The result's row, with the blanks of the command line as NaN. */
static void result_row(const corax_result *res, double *row)
{
    fill_nan(row, CORAX_RESULT_COLUMNS);
    if (res->located) {
        double az, plunge;
        corax_direction_angles(res->point.tangent, &az, &plunge);
        row[CORAX_RESULT_X] = res->point.position.x;
        row[CORAX_RESULT_Y] = res->point.position.y;
        row[CORAX_RESULT_Z] = res->point.position.z;
        row[CORAX_RESULT_HOLE_AZIMUTH] = corax_deg(corax_wrap_azimuth(az));
        row[CORAX_RESULT_HOLE_PLUNGE] = corax_deg(plunge);
    }
    if (res->has_plane) {
        double dd = res->plane.dip_direction;
        row[CORAX_RESULT_DIP] = corax_deg(res->plane.dip);
        row[CORAX_RESULT_DIP_DIRECTION] = corax_deg(corax_wrap_azimuth(dd));
        row[CORAX_RESULT_STRIKE] = corax_deg(corax_wrap_azimuth(dd - CORAX_PI / 2));
        row[CORAX_RESULT_POLE_TREND] = corax_deg(corax_wrap_azimuth(dd + CORAX_PI));
        row[CORAX_RESULT_POLE_PLUNGE] = 90.0 - corax_deg(res->plane.dip);
        row[CORAX_RESULT_NX] = res->normal.x;
        row[CORAX_RESULT_NY] = res->normal.y;
        row[CORAX_RESULT_NZ] = res->normal.z;
    } else if (res->conditions & CORAX_COND_DIP_ONLY) { /* the dip, and so the pole's plunge */
        row[CORAX_RESULT_DIP] = corax_deg(res->plane.dip);
        row[CORAX_RESULT_POLE_PLUNGE] = 90.0 - corax_deg(res->plane.dip);
    }
    if (res->has_line) {
        row[CORAX_RESULT_TREND] = corax_deg(corax_wrap_azimuth(res->trend));
        row[CORAX_RESULT_PLUNGE] = corax_deg(res->plunge);
    }
}

/* Convert rows [from, to) of the readings, through one lane. */
static void convert_rows(const corax_arrays *a, const corax_setup *s, double unit, size_t from,
                         size_t to, const char *const *hole, const double *readings,
                         corax_result *res, double *out, unsigned *conditions)
{
    lane ln = {NULL, NULL, 0};
    for (size_t i = from; i < to; i++) {
        corax_reading rd = reading_of(readings + i * CORAX_READING_COLUMNS, unit);
        const corax_hole *h = find(a->program, &ln, hole[i]);
        corax_result one;
        corax_result *r = res ? &res[i] : &one;
        corax_convert_reading(h, &rd, &s->convert, &ln.hint, r);
        if (out)
            result_row(r, out + i * CORAX_RESULT_COLUMNS);
        if (conditions)
            conditions[i] = r->conditions;
    }
}

/* Every row converted, on every thread; res, out and conditions may be NULL. */
static void convert_all(const corax_arrays *a, const corax_setup *s, size_t n,
                        const char *const *hole, const double *readings, corax_result *res,
                        double *out, unsigned *conditions)
{
    double unit = readings_unit(s);
    long chunks = (long)((n + CHUNK - 1) / CHUNK);
#pragma omp parallel for schedule(dynamic, 1)
    for (long c = 0; c < chunks; c++) {
        size_t end = (size_t)(c + 1) * CHUNK < n ? (size_t)(c + 1) * CHUNK : n;
        convert_rows(a, s, unit, (size_t)c * CHUNK, end, hole, readings, res, out, conditions);
    }
}

void corax_arrays_convert(const corax_arrays *a, const corax_setup *s, size_t n,
                          const char *const *hole, const double *readings, double *out,
                          unsigned *conditions)
{
    convert_all(a, s, n, hole, readings, NULL, out, conditions);
}

size_t corax_arrays_note(const corax_arrays *a, const corax_setup *s, const char *hole,
                         const double *reading, char *buf, size_t size)
{
    corax_reading rd = reading_of(reading, readings_unit(s));
    const corax_hole *h = hole ? corax_program_find(a->program, hole, strlen(hole)) : NULL;
    corax_result res;
    corax_convert_reading(h, &rd, &s->convert, NULL, &res);
    return corax_result_note(&res, &rd, h, &s->convert, buf, size);
}

/* ---- the Monte Carlo ---- */

/* A reading to draw: its row, and the row of its hole's first. */
typedef struct member {
    size_t row, first;
    const corax_hole *hole;
} member;

static int by_hole(const void *x, const void *y)
{
    const member *a = x, *b = y;
    if (a->hole != b->hole)
        return a->hole < b->hole ? -1 : 1;
    return (a->row > b->row) - (a->row < b->row);
}

static int by_first(const void *x, const void *y)
{
    const member *a = x, *b = y;
    if (a->first != b->first)
        return a->first < b->first ? -1 : 1;
    return (a->row > b->row) - (a->row < b->row);
}

/* The readings that converted to something to draw, hole by hole (holes in
 * the order they first appear, each hole's readings in their order), as the
 * command line groups them. */
static size_t group(const corax_result *res, const char *const *hole, const corax_program *p,
                    size_t n, member *g)
{
    size_t m = 0;
    for (size_t i = 0; i < n; i++)
        if (res[i].has_plane || res[i].has_line || (res[i].conditions & CORAX_COND_DIP_ONLY))
            g[m++] = (member){i, 0, corax_program_find(p, hole[i], strlen(hole[i]))};
    qsort(g, m, sizeof *g, by_hole);
    for (size_t i = 0; i < m; i++)
        g[i].first = i > 0 && g[i].hole == g[i - 1].hole ? g[i - 1].first : g[i].row;
    qsort(g, m, sizeof *g, by_first);
    return m;
}

/* A reading's errors: the setup's, the row's own over them. */
static corax_status reading_errors(const corax_setup *s, const double *own, double unit,
                                   const corax_reading *rd, corax_error_model *e,
                                   corax_error *err, size_t row)
{
    *e = s->errors;
    if (rd->arbitrary_line)
        e->gravity = 0.0; /* a line drawn anywhere, turned: no gravity mark */
    double *slot[] = {&e->alpha, &e->beta, &e->line, &e->depth};
    for (int k = 0; own && k < CORAX_ERRORS_COLUMNS; k++) {
        if (isnan(own[k]))
            continue;
        if (!(own[k] >= 0.0) || !isfinite(own[k]))
            return corax_error_set(err, CORAX_EVALUE, NULL, 0, "row %zu: %s %g is not an error",
                                   row, error_names[k], own[k]);
        *slot[k] = k == CORAX_ERRORS_DEPTH ? own[k] * unit : corax_rad(own[k]);
    }
    return CORAX_OK;
}

static void spread_row(const corax_spread *sp, int dip_only, double *row)
{
    fill_nan(row, CORAX_SPREAD_COLUMNS);
    row[CORAX_SPREAD_DRAWS] = (double)sp->draws;
    if (!sp->has_orientation || sp->draws < 2)
        return;
    row[CORAX_SPREAD_DIP_SD] = corax_deg(sp->dip_sd);
    row[CORAX_SPREAD_POSITION_SD] = sp->position_sd;
    if (dip_only)
        return;
    row[CORAX_SPREAD_DIP_DIRECTION_SD] = corax_deg(sp->dip_direction_sd);
    row[CORAX_SPREAD_CONE95] = corax_deg(sp->cone95);
    row[CORAX_SPREAD_KAPPA] = isfinite(sp->kappa) ? sp->kappa : (double)NAN;
}

/* Draw every group of g (starts in start[0..ngroups]) on every thread. */
static corax_status draw_groups(const corax_setup *s, const member *g, const size_t *start,
                                size_t ngroups, const corax_mc_reading *mr, corax_spread *spread)
{
    int failed = 0;
#pragma omp parallel
    {
        corax_mc *mc = corax_mc_new();
        if (!mc) {
#pragma omp atomic write
            failed = 1;
        }
#pragma omp for schedule(dynamic, 1)
        for (long h = 0; h < (long)ngroups; h++) {
            size_t a = start[h], k = start[h + 1] - a;
            if (mc && corax_mc_hole(mc, g[a].hole, mr + a, k, &s->convert, &s->errors, s->draws,
                                    s->seed, spread + a, NULL, NULL) != CORAX_OK) {
#pragma omp atomic write
                failed = 1;
            }
        }
        corax_mc_free(mc);
    }
    return failed ? CORAX_ENOMEM : CORAX_OK;
}

corax_status corax_arrays_spread(const corax_arrays *a, const corax_setup *s, size_t n,
                                 const char *const *hole, const double *readings,
                                 const double *errors, double *out, corax_error *err)
{
    corax_error_clear(err);
    if (!s->draws)
        return corax_error_set(err, CORAX_EARG, NULL, 0, "no draws: set draws (2 or more)");
    for (size_t i = 0; i < n; i++)
        fill_nan(out + i * CORAX_SPREAD_COLUMNS, CORAX_SPREAD_COLUMNS);
    double unit = readings_unit(s);
    corax_result *res = malloc((n ? n : 1) * sizeof *res);
    member *g = malloc((n ? n : 1) * sizeof *g);
    corax_mc_reading *mr = malloc((n ? n : 1) * sizeof *mr);
    corax_spread *spread = malloc((n ? n : 1) * sizeof *spread);
    size_t *start = malloc((n + 1) * sizeof *start);
    corax_status st = res && g && mr && spread && start ? CORAX_OK : CORAX_ENOMEM;
    size_t m = 0, ngroups = 0;
    if (st == CORAX_OK) {
        convert_all(a, s, n, hole, readings, res, NULL, NULL);
        m = group(res, hole, a->program, n, g);
    }
    for (size_t k = 0; st == CORAX_OK && k < m; k++) {
        size_t i = g[k].row;
        mr[k].reading = reading_of(readings + i * CORAX_READING_COLUMNS, unit);
        mr[k].nominal = res[i];
        st = reading_errors(s, errors ? errors + i * CORAX_ERRORS_COLUMNS : NULL, unit,
                            &mr[k].reading, &mr[k].errors, err, i);
        if (k == 0 || g[k].hole != g[k - 1].hole)
            start[ngroups++] = k;
    }
    if (st == CORAX_OK) {
        start[ngroups] = m;
        st = draw_groups(s, g, start, ngroups, mr, spread);
        if (st != CORAX_OK)
            corax_error_set(err, st, NULL, 0, "out of memory while drawing");
    }
    for (size_t k = 0; st == CORAX_OK && k < m; k++)
        spread_row(&spread[k], (res[g[k].row].conditions & CORAX_COND_DIP_ONLY) != 0,
                   out + g[k].row * CORAX_SPREAD_COLUMNS);
    if (st == CORAX_ENOMEM && err && !err->message[0])
        corax_error_set(err, st, NULL, 0, "out of memory");
    free(res);
    free(g);
    free(mr);
    free(spread);
    free(start);
    return st;
}
