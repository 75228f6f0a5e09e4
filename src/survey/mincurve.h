/* Minimum curvature between two survey stations (internal). */
#ifndef CORAX_MINCURVE_H
#define CORAX_MINCURVE_H

#include "corax/geometry.h"

/* Dogleg angle (radians, [0, pi]) between unit tangents t1 and t2:
 * 2 atan2(|t2 - t1|, |t2 + t1|), stable for tiny and large doglegs. */
double corax_mc_dogleg(corax_vec3 t1, corax_vec3 t2);

/* Ratio factor RF(b) = (2/b) tan(b/2), by its series for small b. */
double corax_mc_ratio_factor(double b);

/* Position and tangent at fraction f in [0, 1] of a course of length L from
 * (r1, t1) to tangent t2 with dogleg b, on the arc. f = 1 gives the end. */
void corax_mc_along(corax_vec3 r1, corax_vec3 t1, corax_vec3 t2, double length,
                    double b, double f, corax_vec3 *r, corax_vec3 *t);

#endif
