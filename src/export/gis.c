/* export: structures, hole traces and collars as features of GIS layers
 * (gis.h writes them through OGR). */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/export.h"

enum {
    F_HOLE, F_DEPTH, F_KIND, F_DIP, F_DIP_DIRECTION, F_STRIKE, F_NX, F_NY, F_NZ, F_POLARITY,
    F_TREND, F_PLUNGE, F_LX, F_LY, F_LZ, F_SPREAD
};

static const corax_gis_field structure_fields[F_SPREAD] = {
    {"hole", CORAX_GIS_TEXT},       {"depth", CORAX_GIS_REAL},   {"kind", CORAX_GIS_TEXT},
    {"dip", CORAX_GIS_REAL},        {"dip_direction", CORAX_GIS_REAL},
    {"strike", CORAX_GIS_REAL},     {"nx", CORAX_GIS_REAL},      {"ny", CORAX_GIS_REAL},
    {"nz", CORAX_GIS_REAL},         {"polarity", CORAX_GIS_INTEGER},
    {"trend", CORAX_GIS_REAL},      {"plunge", CORAX_GIS_REAL},  {"lx", CORAX_GIS_REAL},
    {"ly", CORAX_GIS_REAL},         {"lz", CORAX_GIS_REAL}};

size_t corax_export_gis_structure_fields(int spread, corax_gis_field *out)
{
    size_t n = F_SPREAD;
    memcpy(out, structure_fields, sizeof structure_fields);
    for (int i = 0; spread && i < CORAX_EXPORT_SPREAD; i++)
        out[n++] = (corax_gis_field){corax_export_spread_names[i], CORAX_GIS_REAL};
    out[n++] = (corax_gis_field){"status", CORAX_GIS_TEXT};
    return n;
}

void corax_export_gis_structure(corax_gis *g, const corax_structure *s,
                                const corax_export_extra *x, int spread)
{
    corax_gis_text(g, F_HOLE, s->hole, s->hole_len);
    corax_gis_real(g, F_DEPTH, s->depth);
    corax_gis_text(g, F_KIND, s->kind, s->kind_len);
    if (s->oriented) {
        corax_vec3 n = corax_plane_normal(s->plane);
        double dd = corax_deg(s->plane.dip_direction);
        corax_gis_real(g, F_DIP, corax_deg(s->plane.dip));
        corax_gis_real(g, F_DIP_DIRECTION, dd);
        corax_gis_real(g, F_STRIKE, dd < 90.0 ? dd + 270.0 : dd - 90.0);
        corax_gis_real(g, F_NX, n.x);
        corax_gis_real(g, F_NY, n.y);
        corax_gis_real(g, F_NZ, n.z);
    }
    if (s->polarity)
        corax_gis_integer(g, F_POLARITY, s->polarity);
    if (x->has_line) {
        corax_gis_real(g, F_TREND, corax_deg(x->trend));
        corax_gis_real(g, F_PLUNGE, corax_deg(x->plunge));
        corax_gis_real(g, F_LX, x->line.x);
        corax_gis_real(g, F_LY, x->line.y);
        corax_gis_real(g, F_LZ, x->line.z);
    }
    size_t f = F_SPREAD;
    for (int i = 0; spread && i < CORAX_EXPORT_SPREAD; i++)
        corax_gis_real(g, f++, x->spread[i]);
    corax_gis_text(g, f, x->status, x->status_len);
    corax_gis_point(g, s->position);
}

/* ---- traces ---- */

static corax_status trace_one(corax_gis *g, int layer, const corax_hole *h, double step,
                              size_t *count, corax_error *err)
{
    corax_hole_point pt;
    if (corax_hole_at(h, 0.0, NULL, &pt) == CORAX_ENOTFOUND)
        return CORAX_OK; /* no path */
    corax_hole_depth *d;
    size_t n, hint = 0;
    corax_status st = corax_hole_depths(h, step, &d, &n);
    if (st != CORAX_OK || n < 2) {
        if (st == CORAX_OK)
            free(d);
        return st;
    }
    corax_vec3 *p = malloc(n * sizeof *p);
    double *m = malloc(n * sizeof *m);
    if (!p || !m)
        st = CORAX_ENOMEM;
    for (size_t k = 0; st == CORAX_OK && k < n; k++) {
        corax_hole_at(h, d[k].depth, &hint, &pt);
        p[k] = pt.position;
        m[k] = d[k].depth;
    }
    if (st == CORAX_OK)
        st = corax_gis_feature(g, layer);
    if (st == CORAX_OK) {
        const char *name = corax_hole_name(h);
        corax_gis_text(g, 0, name, strlen(name));
        corax_gis_real(g, 1, m[0]);
        corax_gis_real(g, 2, m[n - 1]);
        corax_gis_line(g, p, m, n);
        st = corax_gis_write(g, err);
    }
    if (st == CORAX_OK)
        (*count)++;
    free(p);
    free(m);
    free(d);
    return st;
}

corax_status corax_export_gis_traces(corax_gis *g, const corax_program *program, double step,
                                     const char *name, size_t *count, corax_error *err)
{
    static const corax_gis_field fields[] = {
        {"hole", CORAX_GIS_TEXT}, {"depth_from", CORAX_GIS_REAL}, {"depth_to", CORAX_GIS_REAL}};
    int layer;
    *count = 0;
    if (!(step > 0.0))
        return corax_error_set(err, CORAX_EARG, NULL, 0, "trace step must be positive");
    corax_status st = corax_gis_layer(g, name, CORAX_GIS_LINES, 1, fields, 3, &layer, err);
    for (size_t i = 0; st == CORAX_OK && i < corax_program_size(program); i++)
        st = trace_one(g, layer, corax_program_hole(program, i), step, count, err);
    return st;
}

/* ---- collars ---- */

corax_status corax_export_gis_collars(corax_gis *g, const corax_program *program,
                                      corax_dip_convention convention, const char *name,
                                      size_t *count, corax_error *err)
{
    static const corax_gis_field fields[] = {{"hole", CORAX_GIS_TEXT},
                                             {"azimuth", CORAX_GIS_REAL},
                                             {"dip", CORAX_GIS_REAL},
                                             {"length", CORAX_GIS_REAL},
                                             {"stations", CORAX_GIS_INTEGER}};
    int layer;
    *count = 0;
    corax_status st = corax_gis_layer(g, name, CORAX_GIS_POINTS, 0, fields, 5, &layer, err);
    for (size_t i = 0; st == CORAX_OK && i < corax_program_size(program); i++) {
        const corax_hole *h = corax_program_hole(program, i);
        const corax_collar *c = corax_hole_collar(h);
        if ((st = corax_gis_feature(g, layer)) != CORAX_OK)
            break;
        const char *hole = corax_hole_name(h);
        corax_gis_text(g, 0, hole, strlen(hole));
        if (c->has_direction) {
            corax_gis_real(g, 1, corax_deg(c->azimuth));
            corax_gis_real(g, 2, corax_plunge_to_dip(c->plunge, convention));
        }
        if (c->length > 0.0)
            corax_gis_real(g, 3, c->length);
        corax_gis_integer(g, 4, (long long)corax_hole_station_count(h));
        corax_gis_point(g, c->position);
        if ((st = corax_gis_write(g, err)) == CORAX_OK)
            (*count)++;
    }
    return st;
}
