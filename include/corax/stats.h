/* corax: orientation statistics. Fisher (1953) mean, kappa and 95% cone; the
 * orientation tensor with its principal axes and Woodcock's (1977) shape and
 * strength; Terzaghi (1965) weights against borehole sampling bias; and
 * Kamb (1959) density on the lower hemisphere, counted or smoothed (pure
 * math: no I/O).
 *
 * Vectors are unit vectors in the world frame (x east, y north, z up); angles
 * are radians. Weights, where taken, are non-negative and may be NULL for
 * all ones. Weighted statistics rescale the weights to sum to the number of
 * readings n: weights move the emphasis between readings but never add
 * readings, so n stays the sample size in every significance formula. */
#ifndef CORAX_STATS_H
#define CORAX_STATS_H

#include <stddef.h>

#include "corax/geometry.h"
#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Fewer readings than this get no kappa or 95% cone: with one reading there
 * is no spread, and with two the cone formula hardly ever has a solution. */
#define CORAX_FISHER_MIN_READINGS 3

/* Fisher (1953) statistics of directions (vectors with a sense). */
typedef struct corax_fisher {
    corax_vec3 mean;  /* unit mean direction; zero when the resultant vanishes */
    size_t n;         /* readings */
    double resultant; /* R, the length of the (rescaled) weighted resultant */
    double kappa;     /* (n - 1) / (n - R); infinite when every reading agrees;
                         NaN below CORAX_FISHER_MIN_READINGS */
    double alpha95;   /* radians: acos(1 - (n - R)/R (20^(1/(n-1)) - 1)), the
                         argument kept at or above -1 (a cone of pi covers all);
                         NaN below CORAX_FISHER_MIN_READINGS */
} corax_fisher;

/* The Fisher statistics of n unit vectors v with weights w (NULL: equal).
 * CORAX_EARG when a weight is negative or not finite, or all are zero. n may
 * be 0 (mean zero, everything else NaN). */
corax_status corax_fisher_mean(const corax_vec3 *v, const double *w, size_t n,
                               corax_fisher *out);

/* One draw from the Fisher distribution about a unit mean with concentration
 * kappa > 0, from two uniform numbers in [0, 1): the cosine of the angle from
 * the mean by Wood's (1994) exact inverse for three dimensions,
 * w = 1 + ln(u1 + (1 - u1) exp(-2 kappa)) / kappa, and the azimuth about the
 * mean 2 pi u2. For simulations and tests. */
double corax_fisher_cosine(double kappa, double u1);
corax_vec3 corax_fisher_draw(corax_vec3 mean, double kappa, double u1, double u2);

/* The orientation tensor T = sum w v v^T / sum w of axial readings (poles or
 * lines without sense) and what it says. */
typedef struct corax_tensor {
    double eigenvalue[3]; /* S1 >= S2 >= S3 >= 0, summing to 1 */
    corax_vec3 axis[3];   /* the principal axes, unit, each in the lower
                             hemisphere (z <= 0) */
    double shape;         /* Woodcock K = ln(S1/S2) / ln(S2/S3): above 1
                             clusters, below 1 girdles; NaN when undefined */
    double strength;      /* Woodcock C = ln(S1/S3); NaN when S3 is 0 */
} corax_tensor;

/* The tensor and its eigen-decomposition (GSL's symmetric eigensolver).
 * CORAX_EARG for bad weights or n == 0; CORAX_ENOMEM. */
corax_status corax_tensor_compute(const corax_vec3 *v, const double *w, size_t n,
                                  corax_tensor *out);

/* The same from the tensor's sums t = sum w v v^T (row-major, any overall
 * scale: the eigenvalues come out normalised to sum to 1), for callers that
 * add and take away readings. CORAX_ENOMEM. */
corax_status corax_tensor_from_sums(const double sums[9], corax_tensor *out);

/* Woodcock's (1977) shape K and strength C of eigenvalues S1 >= S2 >= S3;
 * NaN where a logarithm is not finite. */
double corax_woodcock_shape(const double eigenvalue[3]);
double corax_woodcock_strength(const double eigenvalue[3]);

/* Everything said about one set of axial readings. */
typedef struct corax_axial_summary {
    size_t n;             /* readings */
    double weight_sum;    /* the weights as given (n without weights) */
    corax_tensor tensor;  /* valid when n > 0 */
    corax_fisher fisher;  /* of the readings each turned to the side of
                             principal axis 1, so that the mean of axial data
                             takes its sign from the tensor; mean put in the
                             lower hemisphere */
} corax_axial_summary;

/* Summarise n axial unit vectors with weights w (NULL: equal). n may be 0.
 * CORAX_EARG for bad weights; CORAX_ENOMEM. */
corax_status corax_axial_summary_compute(const corax_vec3 *v, const double *w, size_t n,
                                         corax_axial_summary *out);

/* The same summary of readings too many to hold, met in three passes over
 * them, in the same order each time: their weights, then their tensor, then
 * their mean, each turned to the side of the tensor's first axis.
 * corax_axial_summary_compute() goes over its arrays this way, so the two
 * agree to the last bit. Fill it with corax_axial_stream_begin(); every step
 * after a failure does nothing, and corax_axial_stream_end() says what
 * failed. */
typedef struct corax_axial_stream {
    int weighted;             /* 0: every weight is 1, whatever is given */
    corax_status status;      /* CORAX_EARG for a bad weight, CORAX_ENOMEM */
    size_t n;                 /* readings of the first pass */
    double weight_sum, scale; /* the weights' sum as given; n over it */
    double sums[9];           /* the tensor's */
    corax_vec3 sum;           /* the resultant's */
    corax_axial_summary out;
} corax_axial_stream;

void corax_axial_stream_begin(corax_axial_stream *s, int weighted);

/* The first pass: a reading's weight. */
void corax_axial_stream_weigh(corax_axial_stream *s, double weight);

/* The second pass: a reading and its weight; then the tensor's axes. */
void corax_axial_stream_tensor(corax_axial_stream *s, corax_vec3 v, double weight);
void corax_axial_stream_axes(corax_axial_stream *s);

/* The third pass: a reading and its weight; then the summary into out (n
 * readings, NaN where nothing can be said, as corax_axial_summary_compute()
 * leaves it) and the status: CORAX_EARG for a weight that is negative or not
 * finite, or all zero; CORAX_ENOMEM. */
void corax_axial_stream_mean(corax_axial_stream *s, corax_vec3 v, double weight);
corax_status corax_axial_stream_end(corax_axial_stream *s, corax_axial_summary *out);

/* Terzaghi's (1965) weight for a plane of unit normal `normal` met by a
 * borehole (or scanline) of unit direction `hole`: 1 / |cos delta|, delta the
 * angle between them, i.e. 1 / sin of the angle between hole and plane. Planes
 * within min_angle (radians, in [0, pi/2)) of parallel to the hole get the
 * weight of a plane at min_angle, 1 / sin(min_angle); a min_angle of 0 caps
 * nothing and a plane parallel to the hole then weighs infinity. */
double corax_terzaghi_weight(corax_vec3 normal, corax_vec3 hole, double min_angle);

/* How density is estimated on the hemisphere. */
typedef enum corax_density_method {
    CORAX_DENSITY_KAMB = 0, /* Kamb (1959) counting in a cap */
    CORAX_DENSITY_SMOOTH    /* the exponential smoothing of the modified Kamb
                               method (Vollmer 1995) */
} corax_density_method;

/* "kamb" or "smooth". */
const char *corax_density_method_name(corax_density_method method);

/* The counting kernel for n readings and what a uniform sample would give.
 *
 * Kamb: count the readings within a cap about a direction, axially (|u.v| >=
 * cos theta, a cap at each end), covering the area fraction A = 9 / (n + 9)
 * of the hemisphere, so cos theta = 1 - A. For n uniform axial readings the
 * count is binomial with E = n A and sigma^2 = n A (1 - A); Kamb's A makes
 * E = 3 sigma exactly.
 *
 * Smooth: every reading adds exp(k (|u.v| - 1)) with k = 2 (1 + n / 9). For
 * uniform readings |u.v| is uniform on [0, 1], so one reading adds on average
 * (1 - e^-k) / k with mean square (1 - e^-2k) / (2k); this k makes E = 3 sigma
 * up to terms in e^-k. expected and sigma hold the exact values. */
typedef struct corax_density {
    corax_density_method method;
    size_t n;
    double area;     /* Kamb: A, the cap's fraction of the hemisphere */
    double cos_cap;  /* Kamb: 1 - A */
    double k;        /* smooth: the exponent */
    double expected; /* E, the count a uniform sample gives */
    double sigma;    /* its standard deviation */
} corax_density;

/* Set up the kernel for n readings. CORAX_EARG when n is 0. */
corax_status corax_density_init(corax_density *d, corax_density_method method, size_t n);

/* The (weighted, rescaled) count about the unit direction u of the n readings
 * v (the n given to corax_density_init). */
double corax_density_at(const corax_density *d, corax_vec3 u, const corax_vec3 *v,
                        const double *w);

/* The count on a square grid of size x size nodes over [-sqrt 2, sqrt 2]^2 of
 * the equal-area projection: node (i, j) lies at x = -sqrt 2 + i h,
 * y = -sqrt 2 + j h, h = 2 sqrt 2 / (size - 1). Within the primitive (r <= 1)
 * a node is a lower-hemisphere direction; out to r = sqrt 2 the projection
 * goes on over the upper hemisphere, where an axial count equals that of the
 * opposite direction; beyond, every node holds the count straight up. So the
 * field covers the whole sphere, is continuous, and its isolines close.
 * values gets size * size counts, row-major from the south-west corner.
 * size >= 3. Runs in parallel (OpenMP) over rows. */
corax_status corax_density_grid(const corax_density *d, const corax_vec3 *v, const double *w,
                                size_t size, double *values);

#ifdef __cplusplus
}
#endif
#endif
