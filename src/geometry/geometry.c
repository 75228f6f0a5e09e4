/* geometry: angles, directions, planes and apparent dip (pure math). */
#include <math.h>

#include "corax/geometry.h"
#include "geometry/vec.h"

double corax_rad(double degrees) { return degrees * CORAX_DEG; }
double corax_deg(double radians) { return radians / CORAX_DEG; }

double corax_wrap_azimuth(double radians)
{
    if (radians >= 0.0 && radians < 2.0 * CORAX_PI)
        return radians;
    if (radians < 0.0 && radians >= -2.0 * CORAX_PI) { /* atan2's range: one turn back */
        double a = radians + 2.0 * CORAX_PI;
        return a < 2.0 * CORAX_PI ? a : 0.0;
    }
    double a = fmod(radians, 2.0 * CORAX_PI);
    if (a < 0.0)
        a += 2.0 * CORAX_PI;
    if (a >= 2.0 * CORAX_PI) /* fmod of a tiny negative can round up to 2 pi */
        a = 0.0;
    return a;
}

double corax_wrap_degrees(double degrees, int decimals)
{
    static const double scale[] = {1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9};
    if (decimals < 0)
        decimals = 0;
    if (decimals > 9)
        decimals = 9;
    double s = scale[decimals];
    double a = fmod(degrees, 360.0);
    if (a < 0.0)
        a += 360.0;
    a = round(a * s) / s;
    return a >= 360.0 ? a - 360.0 : a;
}

corax_vec3 corax_direction(double azimuth, double plunge)
{
    double cp = cos(plunge);
    return vec3(sin(azimuth) * cp, cos(azimuth) * cp, -sin(plunge));
}

void corax_direction_angles(corax_vec3 v, double *azimuth, double *plunge)
{
    double h = sqrt(v.x * v.x + v.y * v.y);
    *azimuth = h > 0.0 ? corax_wrap_azimuth(fast_atan2(v.x, v.y)) : 0.0;
    *plunge = fast_atan2(-v.z, h);
}

void corax_line_trend_plunge(corax_vec3 v, double *trend, double *plunge)
{
    if (v.z > 0.0) /* an axial line: report its downward end */
        v = vec_neg(v);
    corax_direction_angles(v, trend, plunge);
}

corax_plane corax_plane_from_normal(corax_vec3 n, corax_vec3 *up)
{
    corax_plane p;
    if (n.z < 0.0)
        n = vec_neg(n);
    n = vec_unit(n);
    double h = sqrt(n.x * n.x + n.y * n.y); /* n is a unit vector: no overflow */
    p.dip = fast_atan2(h, n.z);
    p.dip_direction = h > 0.0 ? corax_wrap_azimuth(fast_atan2(n.x, n.y)) : 0.0;
    if (up)
        *up = n;
    return p;
}

corax_vec3 corax_plane_normal(corax_plane plane)
{
    double s = sin(plane.dip);
    return vec3(s * sin(plane.dip_direction), s * cos(plane.dip_direction), cos(plane.dip));
}

void corax_plane_axes(corax_plane plane, corax_vec3 *strike, corax_vec3 *down_dip)
{
    if (strike)
        *strike = vec3(-cos(plane.dip_direction), sin(plane.dip_direction), 0.0);
    if (down_dip)
        *down_dip = corax_direction(plane.dip_direction, plane.dip);
}

double corax_apparent_dip(corax_plane plane, double section_azimuth, int *toward)
{
    double c = cos(section_azimuth - plane.dip_direction);
    /* atan2 keeps a vertical plane (tan dip infinite) exact */
    double a = atan2(sin(plane.dip) * fabs(c), cos(plane.dip));
    if (toward)
        *toward = a < 1e-12 ? 0 : (c > 0.0 ? 1 : -1);
    return a;
}
