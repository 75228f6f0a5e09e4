/* stats: density of axial readings on the hemisphere, by Kamb (1959)
 * counting in a cap or by the exponential smoothing of the modified Kamb
 * method (Vollmer 1995), on a grid over the equal-area net. */
#include <math.h>
#include <stdlib.h>

#include "corax/projection.h"
#include "corax/stats.h"
#include "geometry/vec.h"
#include "stats/stats_int.h"

const char *corax_density_method_name(corax_density_method method)
{
    return method == CORAX_DENSITY_SMOOTH ? "smooth" : "kamb";
}

corax_status corax_density_init(corax_density *d, corax_density_method method, size_t n)
{
    if (n == 0)
        return CORAX_EARG;
    double nn = (double)n;
    d->method = method;
    d->n = n;
    if (method == CORAX_DENSITY_SMOOTH) {
        d->k = 2.0 * (1.0 + nn / 9.0);
        double m1 = -expm1(-d->k) / d->k, m2 = -expm1(-2.0 * d->k) / (2.0 * d->k);
        d->area = d->cos_cap = NAN;
        d->expected = nn * m1;
        d->sigma = sqrt(nn * (m2 - m1 * m1));
    } else {
        d->area = 9.0 / (nn + 9.0);
        d->cos_cap = 1.0 - d->area;
        d->k = NAN;
        d->expected = nn * d->area;
        d->sigma = sqrt(nn * d->area * (1.0 - d->area));
    }
    return CORAX_OK;
}

/* The count about u with weights already rescaled (w may be NULL). */
static double count_at(const corax_density *d, corax_vec3 u, const corax_vec3 *v,
                       const double *w, double scale)
{
    double sum = 0.0;
    if (d->method == CORAX_DENSITY_SMOOTH) {
        for (size_t i = 0; i < d->n; i++) {
            /* a reading whose term is below e^-40 adds nothing a double can keep
             * beside the expected count n/k: skip its exp */
            double e = d->k * (fabs(vec_dot(u, v[i])) - 1.0);
            if (e > -40.0)
                sum += corax_stats_weight(w, i, scale) * exp(e);
        }
    } else {
        for (size_t i = 0; i < d->n; i++)
            if (fabs(vec_dot(u, v[i])) >= d->cos_cap)
                sum += corax_stats_weight(w, i, scale);
    }
    return sum;
}

double corax_density_at(const corax_density *d, corax_vec3 u, const corax_vec3 *v,
                        const double *w)
{
    double scale;
    if (corax_stats_weight_scale(w, d->n, &scale, NULL) != CORAX_OK)
        return NAN;
    return count_at(d, u, v, w, scale);
}

corax_status corax_density_grid(const corax_density *d, const corax_vec3 *v, const double *w,
                                size_t size, double *values)
{
    if (size < 3)
        return CORAX_EARG;
    double scale;
    corax_status st = corax_stats_weight_scale(w, d->n, &scale, NULL);
    if (st != CORAX_OK)
        return st;
    const double edge = sqrt(2.0), h = 2.0 * edge / (double)(size - 1);
    const double up = count_at(d, vec3(0, 0, 1), v, w, scale);
    long rows = (long)size;
#pragma omp parallel for schedule(dynamic)
    for (long j = 0; j < rows; j++) {
        for (size_t i = 0; i < size; i++) {
            corax_vec3 u;
            double x = -edge + (double)i * h, y = -edge + (double)j * h;
            double *out = &values[(size_t)j * size + i];
            if (corax_unproject(CORAX_EQUAL_AREA, x, y, &u) != CORAX_OK)
                *out = up; /* beyond the whole sphere: the count straight up */
            else
                *out = count_at(d, u, v, w, scale);
        }
    }
    return CORAX_OK;
}
