/* export: located structures and hole traces for 3-D modelling packages,
 * as modelling CSV columns and as legacy VTK polydata streamed block by
 * block (see export.h for the file's layout). */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/export.h"
#include "export/export_int.h"
#include "io/fields.h"
#include "io/spool.h"

const char *const corax_export_csv_columns[9] = {
    "x", "y", "z", "dip", "dip_direction", "nx", "ny", "nz", "polarity"};

void corax_export_csv_fields(corax_writer *w, const corax_structure *s)
{
    corax_vec3 n = corax_plane_normal(s->plane);
    corax_writer_number(w, s->position.x, 3);
    corax_writer_number(w, s->position.y, 3);
    corax_writer_number(w, s->position.z, 3);
    if (s->oriented) {
        corax_writer_number(w, corax_deg(s->plane.dip), 2);
        corax_writer_azimuth(w, corax_deg(s->plane.dip_direction), 2);
        corax_writer_number(w, n.x, 6);
        corax_writer_number(w, n.y, 6);
        corax_writer_number(w, n.z, 6);
    } else { /* a line alone: no plane */
        for (int i = 0; i < 5; i++)
            corax_writer_field(w, "", 0);
    }
    if (s->polarity)
        corax_writer_integer(w, s->polarity);
    else
        corax_writer_field(w, "", 0);
}

const char *const corax_export_line_columns[3] = {"lx", "ly", "lz"};

void corax_export_csv_line(corax_writer *w, const corax_export_extra *x)
{
    if (!x->has_line) {
        for (int i = 0; i < 3; i++)
            corax_writer_field(w, "", 0);
        return;
    }
    corax_writer_number(w, x->line.x, 6);
    corax_writer_number(w, x->line.y, 6);
    corax_writer_number(w, x->line.z, 6);
}

int corax_export_usable(const corax_structure *s, const corax_export_extra *x)
{
    return s->located && (s->oriented || x->has_line);
}

/* ---- lineation, spread and status ---- */

const char *const corax_export_spread_names[CORAX_EXPORT_SPREAD] = {
    "dip_sd", "dip_direction_sd", "cone95", "kappa", "position_sd"};

void corax_export_columns_find(const corax_row *header, const corax_column_map *map,
                               corax_export_columns *c)
{
    c->trend = corax_column_find(header, "trend", map);
    c->plunge = corax_column_find(header, "plunge", map);
    for (int i = 0; i < CORAX_EXPORT_SPREAD; i++)
        c->spread[i] = corax_column_find(header, corax_export_spread_names[i], map);
    c->status = corax_column_find(header, "status", map);
}

int corax_export_has_lines(const corax_export_columns *c)
{
    return c->trend >= 0 && c->plunge >= 0;
}

int corax_export_has_spread(const corax_export_columns *c)
{
    for (int i = 0; i < CORAX_EXPORT_SPREAD; i++)
        if (c->spread[i] < 0)
            return 0;
    return 1;
}

/* An optional number: 1 given, 0 empty, -1 unusable (why says). */
static int optional_number(const corax_row *row, long col, char decimal, const char *name,
                           double *v, char *why, size_t wl)
{
    *v = NAN;
    if (col < 0)
        return 0;
    corax_number_status st = corax_field_number(row, col, decimal, name, v, why, wl);
    if (st == CORAX_NUMBER_EMPTY) {
        *v = NAN;
        return 0;
    }
    return st == CORAX_NUMBER_OK ? 1 : -1;
}

corax_status corax_export_extra_read(const corax_row *row, const corax_export_columns *c,
                                     char decimal, corax_export_extra *x, char *why, size_t wl)
{
    memset(x, 0, sizeof *x);
    x->status = corax_field_text(row, c->status, &x->status_len);
    double trend, plunge;
    int t = optional_number(row, c->trend, decimal, "trend", &trend, why, wl);
    int p = t < 0 ? -1 : optional_number(row, c->plunge, decimal, "plunge", &plunge, why, wl);
    if (t < 0 || p < 0)
        return CORAX_EVALUE;
    if (t != p) {
        snprintf(why, wl, "trend and plunge: one given and one empty");
        return CORAX_EVALUE;
    }
    if (t && (!corax_field_in_range(trend, 0, 360, "trend", why, wl) ||
              !corax_field_in_range(plunge, -90, 90, "plunge", why, wl)))
        return CORAX_EVALUE;
    if (t) {
        x->has_line = 1;
        x->trend = corax_wrap_azimuth(corax_rad(trend));
        x->plunge = corax_rad(plunge);
        x->line = corax_direction(x->trend, x->plunge);
    }
    for (int i = 0; i < CORAX_EXPORT_SPREAD; i++) {
        int k = optional_number(row, c->spread[i], decimal, corax_export_spread_names[i],
                                &x->spread[i], why, wl);
        if (k < 0 || (k && !corax_field_nonnegative(x->spread[i], corax_export_spread_names[i],
                                                    why, wl)))
            return CORAX_EVALUE;
    }
    return CORAX_OK;
}

corax_export_options corax_export_options_default(void)
{
    corax_export_options o = {CORAX_VTK_AUTO, 1, 5.0, CORAX_EXPORT_DISCS, 5.0, 24, NULL, 0.0};
    return o;
}

/* The hole traces: which holes, and how many samples each. */
typedef struct traces {
    const corax_program *program;
    double step;
    size_t *count; /* samples of each hole; 0 when it is left out */
    size_t holes, points;
} traces;

/* The samples of a hole that has a path, or n = 0. */
static corax_status hole_samples(const traces *t, size_t i, corax_hole_depth **d, size_t *n)
{
    const corax_hole *h = corax_program_hole(t->program, i);
    corax_hole_point pt;
    *d = NULL;
    *n = 0;
    if (corax_hole_at(h, 0.0, NULL, &pt) == CORAX_ENOTFOUND)
        return CORAX_OK; /* no path: nothing to draw */
    return corax_hole_depths(h, t->step, d, n);
}

static corax_status count_traces(traces *t)
{
    size_t nh = t->program ? corax_program_size(t->program) : 0;
    t->count = calloc(nh ? nh : 1, sizeof *t->count);
    if (!t->count)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < nh; i++) {
        corax_hole_depth *d;
        size_t n;
        corax_status st = hole_samples(t, i, &d, &n);
        free(d);
        if (st != CORAX_OK)
            return st;
        if (n >= 2) { /* a line needs two points */
            t->count[i] = n;
            t->holes++;
            t->points += n;
        }
    }
    return CORAX_OK;
}

/* Call back for every trace sample, hole by hole: position, tangent, depth. */
typedef void (*sample_fn)(corax_vtk *v, const corax_hole_point *pt, double depth);

static corax_status each_sample(const traces *t, corax_vtk *v, sample_fn fn)
{
    size_t nh = t->program ? corax_program_size(t->program) : 0;
    for (size_t i = 0; i < nh; i++) {
        if (!t->count[i])
            continue;
        corax_hole_depth *d;
        size_t n, hint = 0;
        corax_status st = hole_samples(t, i, &d, &n);
        if (st != CORAX_OK)
            return st;
        const corax_hole *h = corax_program_hole(t->program, i);
        for (size_t k = 0; k < n; k++) {
            corax_hole_point pt;
            corax_hole_at(h, d[k].depth, &hint, &pt);
            fn(v, &pt, d[k].depth);
        }
        free(d);
    }
    return CORAX_OK;
}

static void put_position(corax_vtk *v, const corax_hole_point *pt, double depth)
{
    (void)depth;
    corax_vtk_point(v, pt->position);
}

static void put_depth(corax_vtk *v, const corax_hole_point *pt, double depth)
{
    (void)pt;
    corax_vtk_double(v, depth);
}

static void put_no_normal(corax_vtk *v, const corax_hole_point *pt, double depth)
{
    (void)pt;
    (void)depth;
    corax_vtk_vector(v, (corax_vec3){0.0, 0.0, 0.0});
}

static size_t corners(const corax_export_options *o)
{
    return o->shape == CORAX_EXPORT_DISCS ? (size_t)o->disc_sides : 1;
}

/* A disc's corners about the origin, along a (strike) and b (down dip):
 * radius cos t and radius sin t of each corner's angle t. */
typedef struct disc_ring {
    double ca[360], sb[360];
    int sides;
} disc_ring;

static void ring_make(disc_ring *r, double radius, int sides)
{
    r->sides = sides;
    for (int j = 0; j < sides; j++) {
        double t = 2.0 * CORAX_PI * (double)j / (double)sides;
        r->ca[j] = radius * cos(t);
        r->sb[j] = radius * sin(t);
    }
}

static void ring_place(const disc_ring *r, corax_plane plane, corax_vec3 centre, corax_vec3 *out)
{
    corax_vec3 a, b; /* along strike and down dip: the disc's own axes */
    corax_plane_axes(plane, &a, &b);
    for (int j = 0; j < r->sides; j++) {
        double ca = r->ca[j], sb = r->sb[j];
        out[j] = (corax_vec3){centre.x + ca * a.x + sb * b.x, centre.y + ca * a.y + sb * b.y,
                              centre.z + ca * a.z + sb * b.z};
    }
}

void corax_export_disc(corax_plane plane, corax_vec3 centre, double radius, int sides,
                       corax_vec3 *out)
{
    disc_ring r;
    ring_make(&r, radius, sides);
    ring_place(&r, plane, centre, out);
}

/* The structures, gone over once per block of the file: an array, or a
 * spool of them (memory does not grow with their number). */
typedef struct structure_set {
    const corax_export_structure *array; /* or NULL, with spool */
    corax_spool *spool;
    size_t n, i;
    size_t lines;  /* structures with a lineation */
    int spread;    /* some structure has a Monte Carlo column */
} structure_set;

static const corax_export_structure *next(structure_set *s)
{
    if (s->spool)
        return corax_spool_next(s->spool);
    return s->i < s->n ? &s->array[s->i++] : NULL;
}

/* The first structure, to go over them again. */
static const corax_export_structure *first(structure_set *s)
{
    s->i = 0;
    if (s->spool)
        corax_spool_rewind(s->spool);
    return next(s);
}

#define EACH(p, s) for (const corax_export_structure *p = first(s); p; p = next(s))

/* What the header of a block needs to know before its values. */
static void survey(structure_set *s)
{
    s->lines = 0;
    s->spread = 0;
    EACH(p, s) {
        s->lines += p->has_line != 0;
        for (int k = 0; k < CORAX_EXPORT_SPREAD; k++)
            s->spread |= isfinite(p->spread[k]);
    }
}

static void structure_points(corax_vtk *v, structure_set *s, const corax_export_options *o)
{
    size_t k = corners(o);
    disc_ring ring;
    corax_vec3 disc[360];
    if (k > 1)
        ring_make(&ring, o->disc_radius, (int)k);
    EACH(p, s) {
        if (k == 1) {
            corax_vtk_point(v, p->position);
            continue;
        }
        ring_place(&ring, p->plane, p->position, disc);
        for (size_t j = 0; j < k; j++)
            corax_vtk_point(v, disc[j]);
    }
}

/* The structures' cells: a vertex or a disc each, their points numbered
 * after the traces' points. */
static void structure_cells(corax_vtk *v, size_t n, size_t first_point,
                            const corax_export_options *o)
{
    size_t k = corners(o);
    corax_vtk_cells(v, k == 1 ? "VERTICES" : "POLYGONS", n, n * k);
    for (size_t i = 0; i < n; i++) {
        corax_vtk_cell(v, k);
        for (size_t j = 0; j < k; j++)
            corax_vtk_index(v, first_point + i * k + j);
    }
}

/* Structures drawn with an arrow along their lineation. */
static size_t arrow_count(const structure_set *s, const corax_export_options *o)
{
    return o->arrow > 0.0 ? s->lines : 0;
}

static int has_arrow(const corax_export_structure *s, const corax_export_options *o)
{
    return o->arrow > 0.0 && s->has_line;
}

static corax_vec3 line_of(const corax_export_structure *s)
{
    if (!s->has_line)
        return (corax_vec3){0.0, 0.0, 0.0};
    return (corax_vec3){s->line[0], s->line[1], s->line[2]};
}

static void arrow_points(corax_vtk *v, structure_set *s, const corax_export_options *o)
{
    if (!arrow_count(s, o))
        return;
    EACH(q, s) {
        if (!has_arrow(q, o))
            continue;
        corax_vec3 l = line_of(q), p = q->position;
        corax_vtk_point(v, p);
        corax_vtk_point(v, (corax_vec3){p.x + o->arrow * l.x, p.y + o->arrow * l.y,
                                        p.z + o->arrow * l.z});
    }
}

/* The LINES block: the traces, then the arrows (their points numbered
 * from `first_arrow`). */
static void line_cells(corax_vtk *v, const traces *t, size_t narrows, size_t first_arrow)
{
    size_t nh = t->program ? corax_program_size(t->program) : 0, next_point = 0;
    corax_vtk_cells(v, "LINES", t->holes + narrows, t->points + 2 * narrows);
    for (size_t i = 0; i < nh; i++) {
        if (!t->count[i])
            continue;
        corax_vtk_cell(v, t->count[i]);
        for (size_t k = 0; k < t->count[i]; k++)
            corax_vtk_index(v, next_point++);
    }
    for (size_t i = 0; i < narrows; i++) {
        corax_vtk_cell(v, 2);
        corax_vtk_index(v, first_arrow + 2 * i);
        corax_vtk_index(v, first_arrow + 2 * i + 1);
    }
}

/* What a structure cell and a trace cell carry in one cell-data array. */
typedef double (*cell_value_fn)(const corax_export_structure *s);

static double value_kind(const corax_export_structure *s) { return s ? s->kind : -1.0; }
static double value_dip(const corax_export_structure *s)
{
    return s ? corax_deg(s->plane.dip) : -1.0;
}
static double value_dip_direction(const corax_export_structure *s)
{
    return s ? corax_wrap_degrees(corax_deg(s->plane.dip_direction), 6) : -1.0;
}

static double value_polarity(const corax_export_structure *s) { return s ? s->polarity : 0.0; }
static double value_hole(const corax_export_structure *s) { return (double)s->hole + 1.0; }

static double value_trend(const corax_export_structure *s)
{
    if (!s || !s->has_line)
        return -1.0;
    double t, p;
    corax_line_trend_plunge(line_of(s), &t, &p);
    return corax_wrap_degrees(corax_deg(t), 6);
}

static double value_plunge(const corax_export_structure *s)
{
    if (!s || !s->has_line)
        return -1.0;
    double t, p;
    corax_line_trend_plunge(line_of(s), &t, &p);
    return corax_deg(p);
}

static double spread_value(const corax_export_structure *s, int i)
{
    return s && isfinite(s->spread[i]) ? (double)s->spread[i] : -1.0;
}
static double value_dip_sd(const corax_export_structure *s) { return spread_value(s, 0); }
static double value_dd_sd(const corax_export_structure *s) { return spread_value(s, 1); }
static double value_cone95(const corax_export_structure *s) { return spread_value(s, 2); }
static double value_kappa(const corax_export_structure *s) { return spread_value(s, 3); }
static double value_position_sd(const corax_export_structure *s) { return spread_value(s, 4); }

/* One structure's value of a cell-data array (fn NULL: its lineation). */
static void cell_value(corax_vtk *v, const corax_export_structure *s, cell_value_fn fn)
{
    if (fn)
        corax_vtk_double(v, fn(s));
    else
        corax_vtk_vector(v, line_of(s));
}

/* Cell data in cell order: vertices, lines (traces, then arrows), polygons.
 * A trace cell's value is fn(NULL), except for the hole array, where it is
 * the trace's hole; an arrow carries its structure's values. With fn NULL,
 * the lineation vector instead (zero for a trace and a structure without). */
static void cell_values(corax_vtk *v, const traces *t, structure_set *s,
                        const corax_export_options *o, cell_value_fn fn)
{
    int points = o->shape == CORAX_EXPORT_POINTS;
    size_t nh = t->program ? corax_program_size(t->program) : 0;
    if (points)
        EACH(p, s)
            cell_value(v, p, fn);
    for (size_t i = 0; i < nh; i++)
        if (t->count[i]) {
            if (!fn)
                corax_vtk_vector(v, (corax_vec3){0.0, 0.0, 0.0});
            else
                corax_vtk_double(v, fn == value_hole ? (double)i + 1.0 : fn(NULL));
        }
    if (arrow_count(s, o))
        EACH(p, s)
            if (has_arrow(p, o))
                cell_value(v, p, fn);
    if (!points)
        EACH(p, s)
            cell_value(v, p, fn);
}

static double depth_of(const corax_export_structure *s)
{
    return isnan(s->depth) ? -1.0 : s->depth;
}

/* Point data of the structures' points and then the arrows' points. */
static void structure_depths(corax_vtk *v, structure_set *s, const corax_export_options *o)
{
    size_t k = corners(o);
    EACH(p, s)
        for (size_t j = 0; j < k; j++)
            corax_vtk_double(v, depth_of(p));
    if (arrow_count(s, o))
        EACH(p, s)
            for (int j = 0; has_arrow(p, o) && j < 2; j++)
                corax_vtk_double(v, depth_of(p));
}

static void structure_normals(corax_vtk *v, structure_set *s, const corax_export_options *o)
{
    EACH(p, s)
        corax_vtk_vector(v, corax_plane_normal(p->plane));
    if (arrow_count(s, o))
        EACH(p, s)
            for (int j = 0; has_arrow(p, o) && j < 2; j++)
                corax_vtk_vector(v, corax_plane_normal(p->plane));
}

static void attributes(corax_vtk *v, const traces *t, structure_set *s,
                       const corax_export_options *o)
{
    static const struct {
        const char *name;
        cell_value_fn fn;
        corax_vtk_type type;
    } base[] = {{"dip", value_dip, CORAX_VTK_DOUBLE},
                {"dip_direction", value_dip_direction, CORAX_VTK_DOUBLE},
                {"polarity", value_polarity, CORAX_VTK_INT},
                {"hole", value_hole, CORAX_VTK_INT}},
      lines[] = {{"trend", value_trend, CORAX_VTK_DOUBLE}, {"plunge", value_plunge, CORAX_VTK_DOUBLE}};
    static const cell_value_fn spread[CORAX_EXPORT_SPREAD] = {
        value_dip_sd, value_dd_sd, value_cone95, value_kappa, value_position_sd};
    int with_lines = s->lines > 0;
    corax_vtk_field(v, "attributes", 4 + (with_lines ? 3 : 0) + (s->spread ? 5 : 0));
    for (int i = 0; i < 4; i++) {
        corax_vtk_array(v, base[i].name, 1, base[i].type);
        cell_values(v, t, s, o, base[i].fn);
    }
    if (with_lines) {
        corax_vtk_array(v, "lineation", 3, CORAX_VTK_DOUBLE);
        cell_values(v, t, s, o, NULL);
        for (int i = 0; i < 2; i++) {
            corax_vtk_array(v, lines[i].name, 1, lines[i].type);
            cell_values(v, t, s, o, lines[i].fn);
        }
    }
    for (int i = 0; s->spread && i < CORAX_EXPORT_SPREAD; i++) {
        corax_vtk_array(v, corax_export_spread_names[i], 1, CORAX_VTK_DOUBLE);
        cell_values(v, t, s, o, spread[i]);
    }
}

static corax_status write_vtk(corax_vtk *v, const traces *t, structure_set *s,
                              const corax_export_options *o)
{
    size_t n = s->n, k = corners(o), na = arrow_count(s, o);
    size_t npoints = t->points + n * k + 2 * na;
    corax_vtk_points(v, npoints);
    corax_status st = each_sample(t, v, put_position);
    if (st != CORAX_OK)
        return st;
    structure_points(v, s, o);
    arrow_points(v, s, o);
    if (n && o->shape == CORAX_EXPORT_POINTS)
        structure_cells(v, n, t->points, o);
    if (t->holes + na)
        line_cells(v, t, na, t->points + n * k);
    if (n && o->shape == CORAX_EXPORT_DISCS)
        structure_cells(v, n, t->points, o);

    corax_vtk_point_data(v, npoints);
    corax_vtk_scalars(v, "depth", CORAX_VTK_DOUBLE);
    if ((st = each_sample(t, v, put_depth)) != CORAX_OK)
        return st;
    structure_depths(v, s, o);
    if (o->shape == CORAX_EXPORT_POINTS) {
        corax_vtk_normals(v, "normal");
        if ((st = each_sample(t, v, put_no_normal)) != CORAX_OK)
            return st;
        structure_normals(v, s, o);
    }

    corax_vtk_cell_data(v, t->holes + n + na);
    corax_vtk_scalars(v, "kind", CORAX_VTK_INT);
    cell_values(v, t, s, o, value_kind);
    attributes(v, t, s, o);
    return CORAX_OK;
}

corax_vtk_encoding corax_export_encoding(const corax_export_options *o, size_t n)
{
    if (o->encoding != CORAX_VTK_AUTO)
        return o->encoding;
    return n > CORAX_EXPORT_ASCII_MAX ? CORAX_VTK_BINARY : CORAX_VTK_ASCII;
}

static corax_status export_vtk(corax_outputs *set, const char *path, const corax_program *program,
                               structure_set *s, const corax_export_options *o,
                               corax_export_counts *counts, corax_error *err)
{
    if (!(o->step > 0.0) || !(o->disc_radius > 0.0) || o->disc_sides < 3 ||
        o->disc_sides > 360 || !(o->arrow >= 0.0))
        return corax_error_set(err, CORAX_EARG, path, 0,
                               "export: step and disc radius must be positive, a disc needs "
                               "3 to 360 corners, arrows a length of 0 or more");
    traces t = {o->traces ? program : NULL, o->step, NULL, 0, 0};
    corax_status st = count_traces(&t);
    corax_vtk *v = NULL;
    survey(s);
    if (st == CORAX_OK)
        st = corax_vtk_open(set, path, corax_export_encoding(o, s->n),
                            o->title ? o->title : "corax export", &v, err);
    if (st == CORAX_OK) {
        corax_vtk_decimals(v, 6);
        st = write_vtk(v, &t, s, o);
        if (st == CORAX_OK && s->spool)
            st = corax_spool_status(s->spool, err); /* a structure not read back */
        if (st == CORAX_OK) {
            st = corax_vtk_commit(v, err);
        } else {
            corax_vtk_discard(v);
        }
    }
    if (st == CORAX_OK && counts) {
        counts->traces = t.holes;
        counts->trace_points = t.points;
        counts->structures = s->n;
        counts->points = t.points + s->n * corners(o) + 2 * arrow_count(s, o);
        counts->cells = t.holes + s->n + arrow_count(s, o);
    }
    free(t.count);
    return st;
}

corax_status corax_export_vtk(corax_outputs *set, const char *path, const corax_program *program,
                              const corax_export_structure *s, size_t n,
                              const corax_export_options *o, corax_export_counts *counts,
                              corax_error *err)
{
    structure_set all = {s, NULL, n, 0, 0, 0};
    return export_vtk(set, path, program, &all, o, counts, err);
}

corax_status corax_export_vtk_spooled(corax_outputs *set, const char *path,
                                      const corax_program *program, corax_spool *spool,
                                      const corax_export_options *o,
                                      corax_export_counts *counts, corax_error *err)
{
    structure_set all = {NULL, spool, corax_spool_count(spool), 0, 0, 0};
    return export_vtk(set, path, program, &all, o, counts, err);
}
