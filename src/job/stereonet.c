/* job: the stereonet job, nets and orientation statistics of converted
 * structures, grouped and filtered by their columns. */
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "corax/job_stereonet.h"
#include "corax/stats.h"
#include "job/job_int.h"

/* One stereonet: its job, options and output. */
typedef struct stereo_opts {
    corax_job *job;
    const corax_stereonet_job_options *p;
    const char *output;
} stereo_opts;

typedef struct group {
    char *name;
    corax_vec3 *poles, *lines;
    double *weight;
    size_t npoles, nlines, pole_cap, line_cap;
    corax_net_circle *circles; /* readings by alpha alone */
    size_t ncircles, circle_cap;
    size_t skipped;
    corax_axial_summary pole_summary, line_summary;
} group;

/* More groups than this make a page no one can read: refuse them. */
enum { MAX_GROUPS = 500 };

typedef struct groups {
    group *item;
    size_t count, cap, last;
    int full;      /* a row would have made group MAX_GROUPS + 1 */
    size_t skipped;        /* rows with no angles (not faults) */
    corax_job *job;
    job_problems problems; /* faulty rows */
} groups;

/* Columns of one input table (-1 when absent). */
typedef struct columns {
    long dip, dip_direction, trend, plunge, hole_azimuth, hole_plunge, alpha, group;
    long *where;
} columns;

static group *find_group(groups *gs, const char *name, size_t len)
{
    if (gs->last < gs->count && strlen(gs->item[gs->last].name) == len &&
        memcmp(gs->item[gs->last].name, name, len) == 0)
        return &gs->item[gs->last];
    for (size_t i = 0; i < gs->count; i++)
        if (strlen(gs->item[i].name) == len && memcmp(gs->item[i].name, name, len) == 0) {
            gs->last = i;
            return &gs->item[i];
        }
    if (gs->count == MAX_GROUPS) {
        gs->full = 1;
        return NULL;
    }
    group *grown = corax_grow(gs->item, gs->count, &gs->cap, sizeof *grown, 16);
    if (!grown)
        return NULL;
    gs->item = grown;
    group *g = &gs->item[gs->count];
    memset(g, 0, sizeof *g);
    if (!(g->name = strndup(name, len)))
        return NULL;
    gs->last = gs->count++;
    return g;
}

/* Append v (and weight w) to a growing array of vectors. */
static int push(corax_vec3 **v, double **weights, size_t *n, size_t *cap, corax_vec3 x, double w)
{
    if (*n == *cap) {
        size_t c = *cap ? 2 * *cap : 64;
        corax_vec3 *p = realloc(*v, c * sizeof *p);
        if (!p)
            return 0;
        *v = p;
        if (weights) {
            double *q = realloc(*weights, c * sizeof *q);
            if (!q)
                return 0;
            *weights = q;
        }
        *cap = c;
    }
    (*v)[*n] = x;
    if (weights)
        (*weights)[*n] = w;
    (*n)++;
    return 1;
}

/* Trim blanks from a cell. */
static const char *trimmed(const char *s, size_t *len)
{
    size_t n = *len;
    while (n && isspace((unsigned char)*s))
        s++, n--;
    while (n && isspace((unsigned char)s[n - 1]))
        n--;
    *len = n;
    return s;
}

static int keep_row(const stereo_opts *o, const corax_table *t, size_t row, const columns *col)
{
    for (size_t i = 0; i < o->p->nwhere; i++) {
        int any = 0, match = 0;
        for (size_t k = 0; k < o->p->nwhere; k++) {
            if (strcasecmp(o->p->where[k].column, o->p->where[i].column) != 0)
                continue;
            size_t len;
            const char *cell = trimmed(corax_table_cell(t, row, col->where[k], &len), &len);
            any = 1;
            match |= strlen(o->p->where[k].value) == len &&
                     strncasecmp(cell, o->p->where[k].value, len) == 0;
        }
        if (any && !match)
            return 0;
    }
    return 1;
}

/* The outcome of reading a pair of angles. */
enum { PAIR_NONE, PAIR_OK, PAIR_BAD };

/* An angle column: its index, name and range. */
typedef struct angle_spec {
    long col;
    const char *name;
    double lo, hi;
} angle_spec;

/* Read two angle columns: both empty (or absent) is PAIR_NONE; both numbers
 * within range PAIR_OK; anything else PAIR_BAD with the reason in why. */
static int read_pair(const corax_table *t, size_t row, const angle_spec spec[2], double value[2],
                     char *why, size_t whylen)
{
    size_t len[2];
    const char *text[2];
    for (int k = 0; k < 2; k++)
        text[k] = trimmed(corax_table_cell(t, row, spec[k].col, &len[k]), &len[k]);
    if (len[0] == 0 && len[1] == 0)
        return PAIR_NONE;
    for (int k = 0; k < 2; k++) {
        corax_number_status ns = corax_table_number(t, row, spec[k].col, &value[k]);
        if (ns == CORAX_NUMBER_EMPTY)
            snprintf(why, whylen, "%s is empty", spec[k].name);
        else if (ns != CORAX_NUMBER_OK)
            snprintf(why, whylen, "%s '%.*s' is not a number", spec[k].name, (int)len[k], text[k]);
        else if (value[k] < spec[k].lo || value[k] > spec[k].hi)
            snprintf(why, whylen, "%s %g is outside [%g, %g]", spec[k].name, value[k], spec[k].lo,
                     spec[k].hi);
        else
            continue;
        return PAIR_BAD;
    }
    return PAIR_OK;
}

/* A faulty row: a problem (the table is refused, as every command does). */
static void row_fault(groups *gs, const corax_table *t, size_t row, const char *why)
{
    job_problem(gs->job, &gs->problems, corax_table_path(t), corax_table_line(t, row), "%s",
                why);
}

static int out_of_memory(corax_job *job)
{
    job_error(job, NULL, 0, "out of memory");
    return JOB_FAILED;
}

/* The hole's direction at a row (hole_azimuth, hole_plunge): PAIR_OK with
 * *dir filled, PAIR_NONE, or PAIR_BAD with why. */
static int hole_direction(const corax_table *t, size_t row,
                          const columns *col, corax_vec3 *dir, char *why, size_t whylen)
{
    const angle_spec spec[2] = {{col->hole_azimuth, "hole_azimuth", 0, 360},
                                {col->hole_plunge, "hole_plunge", -90, 90}};
    double v[2];
    int r = read_pair(t, row, spec, v, why, whylen);
    if (r == PAIR_OK)
        *dir = corax_direction(corax_rad(v[0]), corax_rad(v[1]));
    return r;
}

/* The Terzaghi weight of a plane, from the hole's direction on the row. */
static int plane_weight(const stereo_opts *o, const corax_table *t, size_t row, const columns *col,
                        corax_vec3 normal, double *w, char *why, size_t whylen)
{
    corax_vec3 hole;
    int r = hole_direction(t, row, col, &hole, why, whylen);
    if (r == PAIR_NONE)
        snprintf(why, whylen, "no hole direction for the Terzaghi weight");
    if (r != PAIR_OK)
        return 0;
    *w = corax_terzaghi_weight(normal, hole, corax_rad(o->p->min_angle));
    return 1;
}

/* A row with alpha and the hole's direction but no plane, as the small
 * circle its pole lies on: 1 drawn, 0 not such a row, -1 out of memory. */
static int small_circle_of(const stereo_opts *o, group *g, const corax_table *t, size_t row,
                           const columns *col)
{
    double alpha;
    corax_vec3 hole;
    char why[200];
    if (!o->p->small_circles || corax_table_number(t, row, col->alpha, &alpha) != CORAX_NUMBER_OK ||
        !(alpha >= 0 && alpha <= 90) || hole_direction(t, row, col, &hole, why, sizeof why) !=
                                            PAIR_OK)
        return 0;
    corax_net_circle *grown = corax_grow(g->circles, g->ncircles, &g->circle_cap,
                                         sizeof *grown, 64);
    if (!grown)
        return -1;
    g->circles = grown;
    g->circles[g->ncircles++] = (corax_net_circle){hole, corax_rad(90.0 - alpha)};
    return 1;
}

/* One row: its plane and its line into its group. 0, or JOB_FAILED (message
 * printed) when out of memory or groups. */
static int read_row(const stereo_opts *o, groups *gs, const corax_table *t, size_t row,
                    const columns *col)
{
    size_t len = 3;
    const char *name = "all";
    if (col->group >= 0) {
        name = trimmed(corax_table_cell(t, row, col->group, &len), &len);
        if (len == 0)
            name = "(blank)", len = 7;
    }
    group *g = find_group(gs, name, len);
    if (!g && gs->full)
        job_error(gs->job, corax_table_path(t), corax_table_line(t, row),
                  "more than %d groups by %s: "
                  "filter with --where or group by another column", MAX_GROUPS, o->p->group_by);
    else if (!g)
        job_error(gs->job, NULL, 0, "out of memory");
    if (!g)
        return JOB_FAILED;
    const angle_spec plane[2] = {{col->dip, "dip", 0, 90}, {col->dip_direction, "dip_direction", 0, 360}};
    const angle_spec line[2] = {{col->trend, "trend", 0, 360}, {col->plunge, "plunge", 0, 90}};
    char why[200];
    double v[2], w = 1.0;
    int used = 0;
    if (corax_table_width(t, row) != corax_table_columns(t)) {
        snprintf(why, sizeof why, "the row has %zu fields but the header has %zu",
                 corax_table_width(t, row), corax_table_columns(t));
        row_fault(gs, t, row, why);
        return 0;
    }
    int r = read_pair(t, row, plane, v, why, sizeof why);
    size_t dd_len;
    trimmed(corax_table_cell(t, row, col->dip_direction, &dd_len), &dd_len);
    if (r == PAIR_BAD && dd_len == 0 && corax_table_number(t, row, col->dip, &v[0]) ==
                                             CORAX_NUMBER_OK && v[0] >= 0 && v[0] <= 90)
        r = PAIR_NONE; /* a dip alone (convert's dip-only rows): no plane, nothing wrong */
    if (r == PAIR_OK) {
        corax_vec3 n = corax_plane_normal((corax_plane){corax_rad(v[0]), corax_rad(v[1])});
        if (o->p->style.weighted && !plane_weight(o, t, row, col, n, &w, why, sizeof why))
            r = PAIR_BAD;
        else if (!push(&g->poles, &g->weight, &g->npoles, &g->pole_cap, n, w))
            return out_of_memory(gs->job);
        else
            used = 1;
    }
    int bad = r == PAIR_BAD;
    if (bad)
        row_fault(gs, t, row, why);
    r = read_pair(t, row, line, v, why, sizeof why);
    if (r == PAIR_OK) {
        if (!push(&g->lines, NULL, &g->nlines, &g->line_cap,
                  corax_direction(corax_rad(v[0]), corax_rad(v[1])), 1.0))
            return out_of_memory(gs->job);
        used = 1;
    } else if (r == PAIR_BAD) {
        row_fault(gs, t, row, why);
        bad = 1;
    }
    if (!used && !bad && (used = small_circle_of(o, g, t, row, col)) < 0)
        return out_of_memory(gs->job);
    if (!used) {
        g->skipped++;
        gs->skipped++;
    }
    return 0;
}

/* Find the columns of one table; usage errors for unknown --group-by and
 * --where names, data errors for a table without angles. */
static int find_columns(const stereo_opts *o, const corax_table *t, columns *col)
{
    const char *path = corax_table_path(t);
    col->dip = corax_table_find(t, "dip");
    col->dip_direction = corax_table_find(t, "dip_direction");
    col->trend = corax_table_find(t, "trend");
    col->plunge = corax_table_find(t, "plunge");
    col->hole_azimuth = corax_table_find(t, "hole_azimuth");
    col->hole_plunge = corax_table_find(t, "hole_plunge");
    col->alpha = corax_table_find(t, "alpha");
    col->group = o->p->group_by ? corax_table_find(t, o->p->group_by) : -1;
    if (o->p->group_by && col->group < 0) {
        job_usage(o->job, "--group-by: %s has no column '%s'", path, o->p->group_by);
        return JOB_USAGE;
    }
    for (size_t i = 0; i < o->p->nwhere; i++)
        if ((col->where[i] = corax_table_find(t, o->p->where[i].column)) < 0) {
            job_usage(o->job, "--where: %s has no column '%s'", path, o->p->where[i].column);
            return JOB_USAGE;
        }
    int planes = col->dip >= 0 && col->dip_direction >= 0;
    int lines = col->trend >= 0 && col->plunge >= 0;
    if (!planes && !lines) {
        job_error(o->job, path, 1,
                  "no dip and dip_direction columns, nor trend and plunge (is this "
                  "corax convert output?)");
        return JOB_FAILED;
    }
    if (!planes)
        col->dip = col->dip_direction = -1;
    if (!lines)
        col->trend = col->plunge = -1;
    if (o->p->style.weighted && planes && (col->hole_azimuth < 0 || col->hole_plunge < 0)) {
        job_error(o->job, path, 1, "--terzaghi needs the hole_azimuth and hole_plunge columns%s",
                  corax_table_find(t, "hole_dip") >= 0
                      ? " (this table gives hole_dip, whose dip convention it does not state: "
                  "convert it again with this corax)"
                      : "");
        return JOB_FAILED;
    }
    return 0;
}

/* Whether a table that would not load is simply empty (no header row). */
static int is_empty_file(const char *path, corax_table_format format)
{
    corax_reader *r;
    corax_row row;
    if (strcmp(path, "-") == 0 || corax_reader_open(path, format, &r, NULL) != CORAX_OK)
        return 0;
    int empty = corax_reader_next(r, &row, NULL) == CORAX_END;
    corax_reader_close(r);
    return empty;
}

static int read_table(const stereo_opts *o, const char *path, groups *gs)
{
    corax_table *t;
    corax_error err;
    corax_error_clear(&err);
    corax_table_format format = o->p->format;
    corax_status st = job_table_progress(o->job, path, format, &t, &err);
    if (st == CORAX_EFORMAT && is_empty_file(path, format)) {
        job_warning(o->job, path, 0, "the file is empty");
        return 0;
    }
    if (st != CORAX_OK) {
        job_error_record(o->job, &err, st);
        return JOB_FAILED;
    }
    long where[o->p->nwhere + 1];
    columns col = {.where = where};
    int rc = find_columns(o, t, &col);
    for (size_t row = 0; rc == 0 && row < corax_table_rows(t); row++)
        if (keep_row(o, t, row, &col))
            rc = read_row(o, gs, t, row, &col);
    corax_table_free(t);
    return rc;
}

static void groups_free(groups *gs)
{
    for (size_t i = 0; i < gs->count; i++) {
        free(gs->item[i].name);
        free(gs->item[i].poles);
        free(gs->item[i].weight);
        free(gs->item[i].lines);
        free(gs->item[i].circles);
    }
    free(gs->item);
}

static int group_cmp(const void *a, const void *b)
{
    return strcmp(((const group *)a)->name, ((const group *)b)->name);
}

/* ---- statistics ---- */

static int summarise(const stereo_opts *o, groups *gs)
{
    if (gs->count == 0 && !find_group(gs, "all", 3))
        return out_of_memory(o->job);
    qsort(gs->item, gs->count, sizeof *gs->item, group_cmp);
    for (size_t i = 0; i < gs->count; i++) {
        group *g = &gs->item[i];
        if (corax_axial_summary_compute(g->poles, o->p->style.weighted ? g->weight : NULL,
                                        g->npoles,
                                        &g->pole_summary) != CORAX_OK ||
            corax_axial_summary_compute(g->lines, NULL, g->nlines, &g->line_summary) != CORAX_OK) {
            job_error(o->job, NULL, 0, "group %s: the statistics failed (out of memory?)", g->name);
            return JOB_FAILED;
        }
    }
    return 0;
}

static const char stats_header[] =
    "group,data,n,n_weighted,rows_skipped,mean_dip,mean_dip_direction,mean_trend,mean_plunge,"
    "kappa,alpha95,eigenvalue1,eigenvalue2,eigenvalue3,axis1_trend,axis1_plunge,axis2_trend,"
    "axis2_plunge,axis3_trend,axis3_plunge,shape_k,strength_c,note\n";

static void write_angle_pair(corax_writer *w, double azimuth, double angle)
{
    corax_writer_number(w, corax_deg(angle), 2);
    corax_writer_azimuth(w, corax_deg(azimuth), 2);
}

static void write_stats_row(corax_writer *w, const group *g, const corax_axial_summary *s,
                            int planes)
{
    const corax_fisher *f = &s->fisher;
    corax_writer_field(w, g->name, strlen(g->name));
    corax_writer_field(w, planes ? "planes" : "lines", planes ? 6 : 5);
    corax_writer_integer(w, (long long)s->n);
    corax_writer_number(w, s->weight_sum, 3);
    corax_writer_integer(w, (long long)g->skipped);
    double trend = NAN, plunge = NAN;
    corax_plane p = {NAN, NAN};
    if (s->n) {
        corax_line_trend_plunge(f->mean, &trend, &plunge);
        if (planes)
            p = corax_plane_from_normal(f->mean, NULL);
    }
    write_angle_pair(w, p.dip_direction, p.dip); /* mean_dip, mean_dip_direction */
    if (planes) /* a plane's mean is its dip and dip direction: no trend and plunge */
        trend = plunge = NAN;
    corax_writer_azimuth(w, corax_deg(trend), 2);
    corax_writer_number(w, corax_deg(plunge), 2);
    corax_writer_number(w, isinf(f->kappa) ? (double)NAN : f->kappa, 2);
    corax_writer_number(w, corax_deg(f->alpha95), 2);
    for (int k = 0; k < 3; k++)
        corax_writer_number(w, s->tensor.eigenvalue[k], 4);
    for (int k = 0; k < 3; k++) {
        double at = NAN, ap = NAN;
        if (s->n >= 2 || (s->n == 1 && k == 0)) /* one reading: only axis 1 means anything */
            corax_line_trend_plunge(s->tensor.axis[k], &at, &ap);
        corax_writer_azimuth(w, corax_deg(at), 2);
        corax_writer_number(w, corax_deg(ap), 2);
    }
    corax_writer_number(w, s->tensor.shape, 3);
    corax_writer_number(w, s->tensor.strength, 3);
    const char *note = "";
    if (s->n == 0)
        note = "no readings";
    else if (s->n < CORAX_FISHER_MIN_READINGS)
        note = "too few readings for kappa and alpha95 (3 needed)";
    else if (isinf(f->kappa))
        note = "readings identical: kappa unbounded";
    corax_writer_field(w, note, strlen(note));
    corax_writer_end_row(w);
}

static corax_writer *stats_table(const stereo_opts *o, const groups *gs)
{
    corax_writer *w = job_output(o->job, o->p->stats, NULL);
    if (!w)
        return NULL;
    corax_writer_text(w, stats_header, sizeof stats_header - 1);
    for (size_t i = 0; i < gs->count; i++) {
        const group *g = &gs->item[i];
        if (g->npoles || !g->nlines) /* a group with nothing still gets its row, n 0 */
            write_stats_row(w, g, &g->pole_summary, 1);
        if (g->nlines)
            write_stats_row(w, g, &g->line_summary, 0);
    }
    return w;
}

/* ---- the net ---- */

static corax_svg *draw(const stereo_opts *o, const groups *gs, char *title)
{
    corax_net_set *sets = calloc(gs->count, sizeof *sets);
    if (!sets)
        return NULL;
    for (size_t i = 0; i < gs->count; i++) {
        const group *g = &gs->item[i];
        sets[i] = (corax_net_set){.name = g->name, .poles = g->poles,
                                  .pole_weight = o->p->style.weighted ? g->weight : NULL,
                                  .npoles = g->npoles, .lines = g->lines, .nlines = g->nlines,
                                  .pole_summary = &g->pole_summary,
                                  .line_summary = &g->line_summary, .skipped = g->skipped,
                                  .circles = g->circles, .ncircles = g->ncircles};
    }
    corax_net_style style = o->p->style;
    style.title = title;
    style.min_angle = corax_rad(o->p->min_angle);
    corax_svg *svg = NULL;
    corax_status st = corax_stereonet_page(sets, gs->count, &style, o->p->net_per_group, &svg);
    free(sets);
    if (st != CORAX_OK)
        job_error(o->job, NULL, 0, "cannot draw the net: %s", corax_strerror(st));
    return svg;
}

static void default_title(const stereo_opts *o, int nfiles, const char *const *files,
                          char *title, size_t len)
{
    if (o->p->title) {
        snprintf(title, len, "%s", o->p->title);
        return;
    }
    const char *base = strrchr(files[0], '/');
    base = base ? base + 1 : files[0];
    size_t used = (size_t)snprintf(title, len, "Stereonet of %s", base);
    if (nfiles > 1 && used < len)
        used += (size_t)snprintf(title + used, len - used, " and %d more", nfiles - 1);
    if (o->p->group_by && used < len)
        snprintf(title + used, len - used, ", by %s", o->p->group_by);
}

static void record(corax_record *a, const stereo_opts *o, int nfiles, const char *const *files,
                   const groups *gs)
{
    corax_record_section(a, "stereonet");
    for (int i = 0; i < nfiles; i++)
        corax_record_set(a, "input", "%s", files[i]);
    corax_record_set(a, "hemisphere", "lower");
    corax_record_set(a, "projection", "%s", corax_projection_name(o->p->style.projection));
    corax_record_set(a, "planes", "%s", o->p->style.planes == 1 ? "poles" : o->p->style.planes == 2
                                                                       ? "great circles"
                                                                       : "poles and great circles");
    if (o->p->style.contours)
        corax_record_set(a, "contours", "%s, interval %g sigma; %s",
                         o->p->style.density == CORAX_DENSITY_SMOOTH
                          ? "modified Kamb, exponential smoothing (Vollmer 1995), k = 2 (1 + n/9)"
                          : "Kamb (1959) counting, cap of area 9/(n + 9) of the hemisphere",
                         o->p->style.contour_step, "a uniform sample reads 3 sigma");
    else
        corax_record_set(a, "contours", "none");
    corax_record_set(a, "group_by", "%s", o->p->group_by ? o->p->group_by : "(one group: all)");
    for (size_t i = 0; i < o->p->nwhere; i++)
        corax_record_set(a, "where", "%s = %s (without regard to case)", o->p->where[i].column,
                         o->p->where[i].value);
    if (o->p->style.weighted)
        corax_record_set(a, "weighting", "Terzaghi (1965), 1/|cos| of the angle between the pole "
                         "and the hole, capped at a minimum angle of %g degrees between hole and "
                         "plane; planes only, lines unweighted; weights rescaled to sum to n for "
                         "the mean, cone, tensor and density; n_weighted is their sum as given",
                         o->p->min_angle);
    else
        corax_record_set(a, "weighting", "none");
    corax_record_set(a, "statistics", "Fisher (1953) mean, kappa and alpha95 of the readings "
                     "turned to the side of principal axis 1 (axial data); none below %d readings; "
                     "orientation tensor eigenvalues normalised to sum to 1; Woodcock (1977) "
                     "K = ln(S1/S2)/ln(S2/S3), C = ln(S1/S3)", CORAX_FISHER_MIN_READINGS);
    if (o->p->stats)
        corax_record_set(a, "stats", "%s", o->p->stats);
    corax_record_set(a, "rows_skipped", "%zu (no usable angles)", gs->skipped);
}

static int run(const stereo_opts *o, int nfiles, const char *const *files,
               corax_stereonet_job_summary *sum)
{
    groups gs = {0};
    gs.job = o->job;
    int rc = 0;
    for (int i = 0; i < nfiles && rc == 0; i++)
        rc = read_table(o, files[i], &gs);
    if (rc == 0 && job_problems_end(o->job, &gs.problems, "the converted tables") != CORAX_OK)
        rc = JOB_FAILED;
    if (rc == 0)
        rc = summarise(o, &gs);
    if (rc == 0 && gs.skipped)
        job_note(o->job, "%zu row%s without angles skipped", gs.skipped,
                 gs.skipped == 1 ? "" : "s");
    char title[256];
    default_title(o, nfiles, files, title, sizeof title);
    corax_writer *stats = NULL;
    corax_svg *svg = NULL;
    if (rc == 0 && o->p->stats && !(stats = stats_table(o, &gs)))
        rc = JOB_FAILED;
    if (rc == 0)
        job_phase(o->job, "drawing");
    if (rc == 0 && !(svg = draw(o, &gs, title)))
        rc = JOB_FAILED;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = CORAX_OK;
    if (rc == 0 && (st = corax_svg_save(svg, o->job->outputs, o->output, &err)) == CORAX_OK &&
        stats) {
        st = corax_writer_commit(stats, &err);
        stats = NULL;
    }
    if (st != CORAX_OK) {
        job_error_record(o->job, &err, st);
        rc = JOB_FAILED;
    }
    corax_writer_discard(stats);
    corax_svg_free(svg);
    if (rc == 0) {
        record(o->job->record, o, nfiles, files, &gs);
        sum->groups = gs.count;
        sum->skipped = gs.skipped;
    }
    groups_free(&gs);
    return rc;
}

corax_stereonet_job_options corax_stereonet_job_options_default(void)
{
    corax_stereonet_job_options o;
    memset(&o, 0, sizeof o);
    o.style = corax_net_style_default();
    o.min_angle = 15.0;
    o.format = (corax_table_format){0, CORAX_DECIMAL_EITHER};
    return o;
}

corax_status corax_stereonet_job_run(corax_job *job, const corax_stereonet_job_options *options,
                                     const char *const *inputs, size_t ninputs,
                                     const char *output, corax_stereonet_job_summary *sum)
{
    stereo_opts o = {job, options, output};
    memset(sum, 0, sizeof *sum);
    if (!ninputs) {
        job_usage(job, "no input: name one or more converted tables");
        return CORAX_EARG;
    }
    return job_status(run(&o, (int)ninputs, inputs, sum));
}
