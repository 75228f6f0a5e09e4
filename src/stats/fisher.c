/* stats: Fisher (1953) mean direction, concentration and 95% cone, and draws
 * from the Fisher distribution (Wood 1994). */
#include <math.h>

#include "corax/stats.h"
#include "geometry/vec.h"
#include "stats/stats_int.h"

corax_status corax_fisher_mean(const corax_vec3 *v, const double *w, size_t n,
                               corax_fisher *out)
{
    out->n = n;
    out->mean = vec3(0, 0, 0);
    out->resultant = out->kappa = out->alpha95 = NAN;
    if (n == 0)
        return CORAX_OK;
    double scale;
    corax_status st = corax_stats_weight_scale(w, n, &scale, NULL);
    if (st != CORAX_OK)
        return st;
    corax_vec3 sum = vec3(0, 0, 0);
    for (size_t i = 0; i < n; i++)
        sum = vec_add(sum, vec_scale(v[i], corax_stats_weight(w, i, scale)));
    corax_fisher_finish(sum, out);
    return CORAX_OK;
}

void corax_fisher_finish(corax_vec3 sum, corax_fisher *out)
{
    double r = vec_norm(sum), nn = (double)out->n;
    out->resultant = r;
    out->mean = vec_unit(sum);
    if (out->n < CORAX_FISHER_MIN_READINGS)
        return;
    if (r >= nn) { /* every reading the same: no spread at all */
        out->kappa = INFINITY;
        out->alpha95 = 0.0;
        return;
    }
    out->kappa = (nn - 1.0) / (nn - r);
    if (r <= 0.0) {
        out->alpha95 = CORAX_PI;
        return;
    }
    /* a very loose sample drives the argument below -1: the cone covers all */
    double c = 1.0 - (nn - r) / r * (pow(20.0, 1.0 / (nn - 1.0)) - 1.0);
    out->alpha95 = acos(fmax(c, -1.0));
}

double corax_fisher_cosine(double kappa, double u1)
{
    return 1.0 + log(u1 + (1.0 - u1) * exp(-2.0 * kappa)) / kappa;
}

corax_vec3 corax_fisher_draw(corax_vec3 mean, double kappa, double u1, double u2)
{
    double c = fmin(1.0, fmax(-1.0, corax_fisher_cosine(kappa, u1)));
    double s = sqrt(fmax(0.0, 1.0 - c * c)), phi = 2.0 * CORAX_PI * u2;
    /* two unit vectors perpendicular to the mean */
    corax_vec3 helper = fabs(mean.z) < 0.9 ? vec3(0, 0, 1) : vec3(1, 0, 0);
    corax_vec3 a = vec_unit(vec_cross(mean, helper)), b = vec_cross(mean, a);
    return vec_add(vec_scale(mean, c), vec_comb(a, s * cos(phi), b, s * sin(phi)));
}
