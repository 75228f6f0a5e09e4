/* Gaussian numbers for the Monte Carlo, by the ziggurat method of Marsaglia
 * and Tsang (2000), "The Ziggurat Method for Generating Random Variables",
 * Journal of Statistical Software 5(8), drawing its 32-bit integers from a GSL
 * generator. GSL's own gsl_ran_gaussian_ziggurat asks the generator for a
 * bounded integer (a division) and goes through two function pointers per
 * number; at three numbers a draw that was a quarter of a draw's cost. */
#ifndef CORAX_GAUSS_H
#define CORAX_GAUSS_H

#include <gsl/gsl_rng.h>
#include <math.h>
#include <stdint.h>

/* The ziggurat's 128 layers. */
typedef struct corax_ziggurat {
    uint32_t k[128];
    double w[128], f[128];
} corax_ziggurat;

/* Build the tables (once per workspace). */
void corax_ziggurat_init(corax_ziggurat *z);

/* A standard normal number when the fast test fails (the base or the edges). */
double corax_ziggurat_tail(const corax_ziggurat *z, gsl_rng *rng, int32_t hz, uint32_t iz);

/* A normal number with mean 0 and standard deviation sigma. The generator
 * must give 32 random bits (taus2 and mt19937 do). */
static inline double corax_gauss(const corax_ziggurat *z, gsl_rng *rng, double sigma)
{
    int32_t hz = (int32_t)(uint32_t)gsl_rng_get(rng);
    uint32_t iz = (uint32_t)hz & 127u;
    uint32_t mag = hz < 0 ? (uint32_t)(-(int64_t)hz) : (uint32_t)hz;
    double x = mag < z->k[iz] ? hz * z->w[iz] : corax_ziggurat_tail(z, rng, hz, iz);
    return sigma * x;
}

#endif
