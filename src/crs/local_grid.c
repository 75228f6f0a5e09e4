/* crs: local mine grids, 2-D similarities of a projected CRS. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/crs.h"
#include "corax/geometry.h"

static int all_finite(const double *v, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (!isfinite(v[i]))
            return 0;
    return 1;
}

corax_status corax_local_grid_make(double east, double north, double rotation, double scale,
                                   corax_local_grid *out, corax_error *err)
{
    double v[4] = {east, north, rotation, scale};
    if (!all_finite(v, 4) || !(scale > 0.0))
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "a local grid needs a finite origin and rotation and a scale "
                               "above 0 (scale %g)", scale);
    out->east = east;
    out->north = north;
    out->rotation = rotation;
    out->scale = scale;
    return CORAX_OK;
}

corax_status corax_local_grid_from_points(double x1, double y1, double e1, double n1,
                                          double x2, double y2, double e2, double n2,
                                          corax_local_grid *out, corax_error *err)
{
    double v[8] = {x1, y1, e1, n1, x2, y2, e2, n2};
    if (!all_finite(v, 8))
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "the local grid's points are not all finite numbers");
    double dx = x2 - x1, dy = y2 - y1, de = e2 - e1, dn = n2 - n1;
    double local = hypot(dx, dy), crs = hypot(de, dn);
    if (local < 1e-3 || crs < 1e-3)
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "the local grid's two points coincide on the %s grid (%g, %g "
                               "and %g, %g): they cannot give a rotation",
                               local < 1e-3 ? "local" : "CRS", local < 1e-3 ? x1 : e1,
                               local < 1e-3 ? y1 : n1, local < 1e-3 ? x2 : e2,
                               local < 1e-3 ? y2 : n2);
    /* the line's bearing on the CRS grid less its bearing on the local grid */
    double r = atan2(de, dn) - atan2(dx, dy);
    r = atan2(sin(r), cos(r)); /* into (-pi, pi] */
    double s = crs / local;
    corax_local_grid g = {0.0, 0.0, r, s};
    double e0, n0;
    corax_local_grid_to_crs(&g, x1, y1, &e0, &n0);
    return corax_local_grid_make(e1 - e0, n1 - n0, r, s, out, err);
}

void corax_local_grid_to_crs(const corax_local_grid *g, double x, double y, double *east,
                             double *north)
{
    double c = cos(g->rotation), s = sin(g->rotation);
    *east = g->east + g->scale * (x * c + y * s);
    *north = g->north + g->scale * (-x * s + y * c);
}

void corax_local_grid_from_crs(const corax_local_grid *g, double east, double north, double *x,
                               double *y)
{
    double c = cos(g->rotation), s = sin(g->rotation);
    double de = (east - g->east) / g->scale, dn = (north - g->north) / g->scale;
    *x = de * c - dn * s;
    *y = de * s + dn * c;
}

/* Numbers separated by commas: how many were read into v (at most max), or
 * -1 when a piece is not a number. */
static int numbers(const char *text, double *v, int max)
{
    int n = 0;
    const char *p = text;
    for (;;) {
        char *end;
        double x = strtod(p, &end);
        while (*end == ' ')
            end++;
        if (end == p || (*end != ',' && *end != '\0') || n == max)
            return -1;
        v[n++] = x;
        if (*end == '\0')
            return n;
        p = end + 1;
    }
}

/* "origin=E,N,rotation=DEG[,scale=S]". */
static corax_status parse_origin(const char *text, corax_local_grid *out, corax_error *err)
{
    double e, n, deg, scale = 1.0;
    int used = 0, k;
    if (sscanf(text, "origin=%lf,%lf,rotation=%lf%n", &e, &n, &deg, &used) != 3)
        used = 0;
    const char *rest = used ? text + used : "";
    if (used && *rest == ',' && sscanf(rest, ",scale=%lf%n", &scale, &k) == 1)
        rest += k;
    if (!used || *rest != '\0')
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "'%s' is not origin=E,N,rotation=DEG[,scale=S]", text);
    return corax_local_grid_make(e, n, corax_rad(deg), scale, out, err);
}

corax_status corax_local_grid_parse(const char *text, corax_local_grid *out, corax_error *err)
{
    if (strncmp(text, "origin=", 7) == 0)
        return parse_origin(text, out, err);
    double v[8];
    if (numbers(text, v, 8) != 8)
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "'%s' is neither x1,y1,E1,N1,x2,y2,E2,N2 (two points known on "
                               "both grids) nor origin=E,N,rotation=DEG,scale=S", text);
    return corax_local_grid_from_points(v[0], v[1], v[2], v[3], v[4], v[5], v[6], v[7], out, err);
}
