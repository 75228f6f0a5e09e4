/* Minimum curvature between two survey stations (internal). */
#ifndef CORAX_MINCURVE_H
#define CORAX_MINCURVE_H

#include "corax/geometry.h"

/* Dogleg angle (radians, [0, pi]) between unit tangents t1 and t2:
 * 2 atan2(|t2 - t1|, |t2 + t1|), stable for tiny and large doglegs. */
double corax_mc_dogleg(corax_vec3 t1, corax_vec3 t2);

/* Ratio factor RF(b) = (2/b) tan(b/2), by its series for small b. */
double corax_mc_ratio_factor(double b);

/* A course between two stations: its length and dogleg, with the dogleg's
 * sine and cosine kept for interpolation. */
typedef struct corax_mc_course {
    double length, b, sin_b, cos_b;
} corax_mc_course;

/* The course of length L between tangents t1 and t2. */
corax_mc_course corax_mc_course_of(corax_vec3 t1, corax_vec3 t2, double length);

/* Position and tangent at fraction f in [0, 1] of a course from (r1, t1) to
 * tangent t2, on the arc. f = 1 gives the end. */
void corax_mc_along(corax_vec3 r1, corax_vec3 t1, corax_vec3 t2, const corax_mc_course *c,
                    double f, corax_vec3 *r, corax_vec3 *t);

#endif
