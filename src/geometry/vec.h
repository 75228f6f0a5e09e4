/* Inline vector arithmetic for the math modules (internal). */
#ifndef CORAX_VEC_H
#define CORAX_VEC_H

#include <math.h>

#include "corax/geometry.h"

static inline corax_vec3 vec3(double x, double y, double z)
{
    corax_vec3 v = {x, y, z};
    return v;
}
static inline corax_vec3 vec_add(corax_vec3 a, corax_vec3 b) { return vec3(a.x + b.x, a.y + b.y, a.z + b.z); }
static inline corax_vec3 vec_sub(corax_vec3 a, corax_vec3 b) { return vec3(a.x - b.x, a.y - b.y, a.z - b.z); }
static inline corax_vec3 vec_scale(corax_vec3 a, double s) { return vec3(a.x * s, a.y * s, a.z * s); }
static inline double vec_dot(corax_vec3 a, corax_vec3 b) { return a.x * b.x + a.y * b.y + a.z * b.z; }
static inline double vec_norm(corax_vec3 a) { return sqrt(vec_dot(a, a)); }
static inline corax_vec3 vec_neg(corax_vec3 a) { return vec3(-a.x, -a.y, -a.z); }

static inline corax_vec3 vec_cross(corax_vec3 a, corax_vec3 b)
{
    return vec3(a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x);
}

/* a * s + b * t */
static inline corax_vec3 vec_comb(corax_vec3 a, double s, corax_vec3 b, double t)
{
    return vec3(a.x * s + b.x * t, a.y * s + b.y * t, a.z * s + b.z * t);
}

/* The unit vector along a; a zero vector stays zero. */
static inline corax_vec3 vec_unit(corax_vec3 a)
{
    double n = vec_norm(a);
    return n > 0.0 ? vec_scale(a, 1.0 / n) : a;
}

/* atan2(y, x) through the one-argument arctangent, which this C library
 * computes three times faster; same quadrants and range (-pi, pi], good to a
 * few units in the last place. Used on hot paths. */
static inline double fast_atan2(double y, double x)
{
    const double half_pi = 1.57079632679489661923, pi = 3.14159265358979323846;
    double ay = fabs(y), ax = fabs(x), a;
    if (ax >= ay)
        a = ax > 0.0 ? atan(ay / ax) : 0.0;
    else
        a = half_pi - atan(ax / ay);
    if (x < 0.0)
        a = pi - a;
    return y < 0.0 ? -a : a;
}

/* atan2(y, x) for the angles of a perturbation: when |y| < x / 8 (under 7
 * degrees) the arctangent's series to the q^15 term, exact to 2e-17 and
 * several times quicker than the C library, which takes the rest. */
static inline double small_atan2(double y, double x)
{
    if (x > 0.0 && fabs(y) < 0.125 * x) {
        double q = y / x, q2 = q * q;
        return q * (1.0 + q2 * (-1.0 / 3 + q2 * (1.0 / 5 + q2 * (-1.0 / 7 + q2 * (1.0 / 9 +
                    q2 * (-1.0 / 11 + q2 * (1.0 / 13 + q2 * (-1.0 / 15))))))));
    }
    return fast_atan2(y, x);
}

/* Sine and cosine of x. Small angles (|x| < 0.25, the usual size of a
 * perturbation or of the turn along one survey course) go by their Taylor
 * series to the x^10 term, good to 1e-13 and several times quicker than the C
 * library; larger ones go to it. */
static inline void small_sincos(double x, double *s, double *c)
{
    if (fabs(x) < 0.25) { /* Horner's rule on 1/n! (multiplications, not divisions) */
        const double s3 = -1.0 / 6, s5 = 1.0 / 120, s7 = -1.0 / 5040, s9 = 1.0 / 362880;
        const double c2 = -0.5, c4 = 1.0 / 24, c6 = -1.0 / 720, c8 = 1.0 / 40320,
                     c10 = -1.0 / 3628800;
        double x2 = x * x;
        *s = x + x * x2 * (s3 + x2 * (s5 + x2 * (s7 + x2 * s9)));
        *c = 1.0 + x2 * (c2 + x2 * (c4 + x2 * (c6 + x2 * (c8 + x2 * c10))));
    } else {
        *s = sin(x);
        *c = cos(x);
    }
}

/* The angle between two vectors in [0, pi], stable for tiny and near-pi angles. */
static inline double vec_angle(corax_vec3 a, corax_vec3 b)
{
    return fast_atan2(vec_norm(vec_cross(a, b)), vec_dot(a, b));
}

#endif
