/* Internal to src/stats: weights shared by the statistics. */
#ifndef CORAX_STATS_INT_H
#define CORAX_STATS_INT_H

#include <stddef.h>

#include "corax/stats.h"
#include "corax/status.h"

/* The factor that rescales the weights w (NULL: all ones) of n readings to
 * sum to n. CORAX_EARG when one is negative or not finite, or all are zero;
 * *sum (may be NULL) gets the weights' own sum. n > 0. */
corax_status corax_stats_weight_scale(const double *w, size_t n, double *scale, double *sum);

/* Weight i, rescaled. */
static inline double corax_stats_weight(const double *w, size_t i, double scale)
{
    return w ? w[i] * scale : 1.0;
}

/* The Fisher statistics of out->n readings (set) from their weighted
 * resultant `sum`: the mean, R, and kappa and the cone from enough
 * readings (the rest NaN as they are). */
void corax_fisher_finish(corax_vec3 sum, corax_fisher *out);

#endif
