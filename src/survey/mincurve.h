/* Minimum curvature between two survey stations (internal). */
#ifndef CORAX_MINCURVE_H
#define CORAX_MINCURVE_H

#include "corax/geometry.h"
#include "geometry/vec.h"

/* Dogleg angle (radians, [0, pi]) between unit tangents t1 and t2:
 * 2 atan2(|t2 - t1|, |t2 + t1|), stable for tiny and large doglegs. */
double corax_mc_dogleg(corax_vec3 t1, corax_vec3 t2);

/* Ratio factor RF(b) = (2/b) tan(b/2), by its series for small b. */
static inline double corax_mc_ratio_factor_series(double b)
{
    double b2 = b * b;
    return 1.0 + b2 * (1.0 / 12 + b2 * (1.0 / 120 + b2 * (17.0 / 20160)));
}
double corax_mc_ratio_factor(double b);

/* RF(b) from b's sine and cosine, (2/b) sin b / (1 + cos b) (= (2/b)
 * tan(b/2)), by its series for small b: one division, no tangent. */
static inline double corax_mc_ratio_factor_sc(double b, double sin_b, double cos_b)
{
    return b < 0.02 ? corax_mc_ratio_factor_series(b) : 2.0 * sin_b / (b * (1.0 + cos_b));
}

/* A course between two stations: its length and dogleg, with the dogleg's
 * sine and cosine kept for interpolation. */
typedef struct corax_mc_course {
    double length, b, sin_b, cos_b;
    double inv_sin_b; /* 1 / sin b, 0 when b is too small to divide by */
} corax_mc_course;

/* The course of length L between tangents t1 and t2. */
corax_mc_course corax_mc_course_of(corax_vec3 t1, corax_vec3 t2, double length);

/* Position and tangent at fraction f in [0, 1] of a course from (r1, t1) to
 * tangent t2, on the arc. f = 1 gives the end. Inline: the Monte Carlo asks
 * it for every reading of every draw. */
static inline void corax_mc_along(corax_vec3 r1, corax_vec3 t1, corax_vec3 t2, const corax_mc_course *c,
                    double f, corax_vec3 *r, corax_vec3 *t)
{
    corax_vec3 tf = t1;
    double fb = f * c->b, rf = 1.0;
    if (c->b > 0.0) {
        /* one sine and cosine of f b serve the arc and its ratio factor:
         * sin((1 - f) b) = sin b cos(fb) - cos b sin(fb) (the weights are then
         * normalised, so no division by sin b), and for fb not small
         * RF(fb) = (2 / fb) tan(fb / 2) = (2 / fb) sin(fb) / (1 + cos(fb)) */
        double sfb, cfb;
        small_sincos(fb, &sfb, &cfb);
        double w1 = c->sin_b * cfb - c->cos_b * sfb;
        if (f == 1.0)
            tf = t2;
        else if (c->inv_sin_b > 0.0) /* the slerp as it stands */
            tf = vec_comb(t1, w1 * c->inv_sin_b, t2, sfb * c->inv_sin_b);
        else /* a dogleg too small to divide by: the same weights, normalised */
            tf = vec_unit(vec_comb(t1, w1, t2, sfb));
        rf = corax_mc_ratio_factor_sc(fb, sfb, cfb);
    }
    double k = 0.5 * f * c->length * rf;
    *r = vec_add(r1, vec_scale(vec_add(t1, tf), k));
    *t = tf;
}

/* The end of a course (corax_mc_along() at f = 1), from the sine and cosine
 * the course keeps: a resurvey asks it of every node of every draw. */
static inline corax_vec3 corax_mc_end(corax_vec3 r1, corax_vec3 t1, corax_vec3 t2,
                                      const corax_mc_course *c)
{
    double rf = c->b > 0.0 ? corax_mc_ratio_factor_sc(c->b, c->sin_b, c->cos_b) : 1.0;
    return vec_add(r1, vec_scale(vec_add(t1, t2), 0.5 * c->length * rf));
}


#endif
