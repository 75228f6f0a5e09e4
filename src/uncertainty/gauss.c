/* uncertainty: the ziggurat tables and their rare slow path (Marsaglia and
 * Tsang 2000, for the standard normal density with 128 layers). */
#include "uncertainty/gauss.h"

/* The right edge of the base layer and the area of each layer, as published. */
static const double R = 3.442619855899, V = 9.91256303526217e-3;
static const double M = 2147483648.0; /* 2^31 */

void corax_ziggurat_init(corax_ziggurat *z)
{
    double d = R, t = d, q = V / exp(-0.5 * d * d);
    z->k[0] = (uint32_t)((d / q) * M);
    z->k[1] = 0;
    z->w[0] = q / M;
    z->w[127] = d / M;
    z->f[0] = 1.0;
    z->f[127] = exp(-0.5 * d * d);
    for (int i = 126; i >= 1; i--) {
        d = sqrt(-2.0 * log(V / d + exp(-0.5 * d * d)));
        z->k[i + 1] = (uint32_t)((d / t) * M);
        t = d;
        z->f[i] = exp(-0.5 * d * d);
        z->w[i] = d / M;
    }
}

void corax_taus_set(corax_taus *t, unsigned long seed)
{
    /* each part from the last by the LCG 69069, kept above its bits that
     * the recurrence drops; then six numbers thrown away, as GSL does */
    uint32_t s = seed ? (uint32_t)seed : 1u;
    t->s1 = 69069u * s;
    t->s1 += t->s1 < 2u ? 2u : 0u;
    t->s2 = 69069u * t->s1;
    t->s2 += t->s2 < 8u ? 8u : 0u;
    t->s3 = 69069u * t->s2;
    t->s3 += t->s3 < 16u ? 16u : 0u;
    for (int i = 0; i < 6; i++)
        corax_taus_get(t);
}

/* A uniform number in (0, 1), as gsl_rng_uniform_pos(). */
static double open_uniform(corax_taus *rng)
{
    double x;
    do
        x = corax_taus_uniform(rng);
    while (x == 0.0);
    return x;
}

double corax_ziggurat_tail(const corax_ziggurat *z, corax_taus *rng, int32_t hz, uint32_t iz)
{
    for (;;) {
        double x = hz * z->w[iz];
        if (iz == 0) { /* the base layer's tail beyond R, by Marsaglia's (1964) method */
            double y;
            do {
                x = -log(open_uniform(rng)) / R;
                y = -log(open_uniform(rng));
            } while (y + y < x * x);
            return hz > 0 ? R + x : -R - x;
        }
        if (z->f[iz] + open_uniform(rng) * (z->f[iz - 1] - z->f[iz]) < exp(-0.5 * x * x))
            return x;
        hz = (int32_t)corax_taus_get(rng);
        iz = (uint32_t)hz & 127u;
        uint32_t mag = hz < 0 ? (uint32_t)(-(int64_t)hz) : (uint32_t)hz;
        if (mag < z->k[iz])
            return hz * z->w[iz];
    }
}
