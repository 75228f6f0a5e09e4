/* export: located structures and hole traces for 3-D modelling packages,
 * as modelling CSV columns and as legacy VTK polydata streamed block by
 * block (see export.h for the file's layout). */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/export.h"

const char *const corax_export_csv_columns[9] = {
    "x", "y", "z", "dip", "dip_direction", "nx", "ny", "nz", "polarity"};

void corax_export_csv_fields(corax_writer *w, const corax_structure *s)
{
    corax_vec3 n = corax_plane_normal(s->plane);
    corax_writer_number(w, s->position.x, 3);
    corax_writer_number(w, s->position.y, 3);
    corax_writer_number(w, s->position.z, 3);
    corax_writer_number(w, corax_deg(s->plane.dip), 2);
    corax_writer_azimuth(w, corax_deg(s->plane.dip_direction), 2);
    corax_writer_number(w, n.x, 6);
    corax_writer_number(w, n.y, 6);
    corax_writer_number(w, n.z, 6);
    if (s->polarity)
        corax_writer_integer(w, s->polarity);
    else
        corax_writer_field(w, "", 0);
}

corax_export_options corax_export_options_default(void)
{
    corax_export_options o = {CORAX_VTK_ASCII, 1, 5.0, CORAX_EXPORT_DISCS, 5.0, 24, NULL};
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

static void structure_points(corax_vtk *v, const corax_export_structure *s, size_t n,
                             const corax_export_options *o)
{
    size_t k = corners(o);
    double circle[2 * 360]; /* the corners on a circle of the disc's radius */
    for (size_t j = 0; k > 1 && j < k; j++) {
        double t = 2.0 * CORAX_PI * (double)j / (double)k;
        circle[2 * j] = o->disc_radius * cos(t);
        circle[2 * j + 1] = o->disc_radius * sin(t);
    }
    for (size_t i = 0; i < n; i++) {
        if (k == 1) {
            corax_vtk_point(v, s[i].position);
            continue;
        }
        corax_vec3 a, b; /* along strike and down dip: the disc's own axes */
        corax_plane_axes(s[i].plane, &a, &b);
        for (size_t j = 0; j < k; j++) {
            double ca = circle[2 * j], sb = circle[2 * j + 1];
            corax_vec3 p = {s[i].position.x + ca * a.x + sb * b.x,
                            s[i].position.y + ca * a.y + sb * b.y,
                            s[i].position.z + ca * a.z + sb * b.z};
            corax_vtk_point(v, p);
        }
    }
}

/* The structures' cells: a vertex or a disc each, their points numbered
 * after the traces' points. */
static void structure_cells(corax_vtk *v, size_t n, size_t first, const corax_export_options *o)
{
    size_t k = corners(o);
    corax_vtk_cells(v, k == 1 ? "VERTICES" : "POLYGONS", n, n * k);
    for (size_t i = 0; i < n; i++) {
        corax_vtk_cell(v, k);
        for (size_t j = 0; j < k; j++)
            corax_vtk_index(v, first + i * k + j);
    }
}

static void trace_cells(corax_vtk *v, const traces *t)
{
    size_t nh = t->program ? corax_program_size(t->program) : 0, next = 0;
    corax_vtk_cells(v, "LINES", t->holes, t->points);
    for (size_t i = 0; i < nh; i++) {
        if (!t->count[i])
            continue;
        corax_vtk_cell(v, t->count[i]);
        for (size_t k = 0; k < t->count[i]; k++)
            corax_vtk_index(v, next++);
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

/* Cell data in cell order: vertices, lines, polygons. A trace cell's value
 * is fn(NULL), except for the hole array, where it is the trace's hole. */
static void cell_values(corax_vtk *v, const traces *t, const corax_export_structure *s,
                        size_t n, const corax_export_options *o, cell_value_fn fn)
{
    int points = o->shape == CORAX_EXPORT_POINTS;
    size_t nh = t->program ? corax_program_size(t->program) : 0;
    for (size_t i = 0; points && i < n; i++)
        corax_vtk_double(v, fn(&s[i]));
    for (size_t i = 0; i < nh; i++)
        if (t->count[i])
            corax_vtk_double(v, fn == value_hole ? (double)i + 1.0 : fn(NULL));
    for (size_t i = 0; !points && i < n; i++)
        corax_vtk_double(v, fn(&s[i]));
}

static corax_status write_vtk(corax_vtk *v, const traces *t, const corax_export_structure *s,
                              size_t n, const corax_export_options *o)
{
    size_t k = corners(o), npoints = t->points + n * k;
    corax_vtk_points(v, npoints);
    corax_status st = each_sample(t, v, put_position);
    if (st != CORAX_OK)
        return st;
    structure_points(v, s, n, o);
    if (n && o->shape == CORAX_EXPORT_POINTS)
        structure_cells(v, n, t->points, o);
    if (t->holes)
        trace_cells(v, t);
    if (n && o->shape == CORAX_EXPORT_DISCS)
        structure_cells(v, n, t->points, o);

    corax_vtk_point_data(v, npoints);
    corax_vtk_scalars(v, "depth", CORAX_VTK_DOUBLE);
    if ((st = each_sample(t, v, put_depth)) != CORAX_OK)
        return st;
    for (size_t i = 0; i < n; i++)
        for (size_t j = 0; j < k; j++)
            corax_vtk_double(v, isnan(s[i].depth) ? -1.0 : s[i].depth);
    if (o->shape == CORAX_EXPORT_POINTS) {
        corax_vtk_normals(v, "normal");
        if ((st = each_sample(t, v, put_no_normal)) != CORAX_OK)
            return st;
        for (size_t i = 0; i < n; i++)
            corax_vtk_vector(v, corax_plane_normal(s[i].plane));
    }

    corax_vtk_cell_data(v, t->holes + n);
    corax_vtk_scalars(v, "kind", CORAX_VTK_INT);
    cell_values(v, t, s, n, o, value_kind);
    corax_vtk_field(v, "attributes", 4);
    corax_vtk_array(v, "dip", 1, CORAX_VTK_DOUBLE);
    cell_values(v, t, s, n, o, value_dip);
    corax_vtk_array(v, "dip_direction", 1, CORAX_VTK_DOUBLE);
    cell_values(v, t, s, n, o, value_dip_direction);
    corax_vtk_array(v, "polarity", 1, CORAX_VTK_INT);
    cell_values(v, t, s, n, o, value_polarity);
    corax_vtk_array(v, "hole", 1, CORAX_VTK_INT);
    cell_values(v, t, s, n, o, value_hole);
    return CORAX_OK;
}

corax_status corax_export_vtk(corax_outputs *set, const char *path, const corax_program *program,
                              const corax_export_structure *s, size_t n,
                              const corax_export_options *o, corax_export_counts *counts,
                              corax_error *err)
{
    if (!(o->step > 0.0) || !(o->disc_radius > 0.0) || o->disc_sides < 3 || o->disc_sides > 360)
        return corax_error_set(err, CORAX_EARG, path, 0,
                               "export: step and disc radius must be positive, a disc needs "
                               "3 to 360 corners");
    traces t = {o->traces ? program : NULL, o->step, NULL, 0, 0};
    corax_status st = count_traces(&t);
    corax_vtk *v = NULL;
    if (st == CORAX_OK)
        st = corax_vtk_open(set, path, o->encoding, o->title ? o->title : "corax export", &v, err);
    if (st == CORAX_OK) {
        corax_vtk_decimals(v, 6);
        st = write_vtk(v, &t, s, n, o);
        if (st == CORAX_OK) {
            st = corax_vtk_commit(v, err);
        } else {
            corax_vtk_discard(v);
        }
    }
    if (st == CORAX_OK && counts) {
        counts->traces = t.holes;
        counts->trace_points = t.points;
        counts->structures = n;
        counts->points = t.points + n * corners(o);
        counts->cells = t.holes + n;
    }
    free(t.count);
    return st;
}
