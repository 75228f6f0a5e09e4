/* Gaussian numbers for the Monte Carlo, by the ziggurat method of Marsaglia
 * and Tsang (2000), "The Ziggurat Method for Generating Random Variables",
 * Journal of Statistical Software 5(8), drawing its 32-bit integers from the
 * taus2 generator. GSL's own gsl_ran_gaussian_ziggurat asks the generator for
 * a bounded integer (a division) and goes through two function pointers per
 * number; at three numbers a draw that was a quarter of a draw's cost. */
#ifndef CORAX_GAUSS_H
#define CORAX_GAUSS_H

#include <math.h>
#include <stdint.h>

/* The maximally equidistributed combined Tausworthe generator of L'Ecuyer
 * (1996), "Maximally equidistributed combined Tausworthe generators",
 * Mathematics of Computation 65(213), seeded as GSL seeds its taus2: the
 * same numbers as gsl_rng_taus2 (tested against it), inline, where GSL's
 * goes through a function pointer for each of a draw's numbers. */
typedef struct corax_taus {
    uint32_t s1, s2, s3;
} corax_taus;

/* Seed as gsl_rng_set() seeds taus2 (a seed of 0 is taken as 1). */
void corax_taus_set(corax_taus *t, unsigned long seed);

/* The next 32 random bits, as gsl_rng_get(). */
static inline uint32_t corax_taus_get(corax_taus *t)
{
    t->s1 = ((t->s1 & 4294967294u) << 12) ^ (((t->s1 << 13) ^ t->s1) >> 19);
    t->s2 = ((t->s2 & 4294967288u) << 4) ^ (((t->s2 << 2) ^ t->s2) >> 25);
    t->s3 = ((t->s3 & 4294967280u) << 17) ^ (((t->s3 << 3) ^ t->s3) >> 11);
    return t->s1 ^ t->s2 ^ t->s3;
}

/* A uniform number in [0, 1), as gsl_rng_uniform(). */
static inline double corax_taus_uniform(corax_taus *t)
{
    return corax_taus_get(t) / 4294967296.0;
}

/* The ziggurat's 128 layers. */
typedef struct corax_ziggurat {
    uint32_t k[128];
    double w[128], f[128];
} corax_ziggurat;

/* Build the tables (once per workspace). */
void corax_ziggurat_init(corax_ziggurat *z);

/* A standard normal number when the fast test fails (the base or the edges). */
double corax_ziggurat_tail(const corax_ziggurat *z, corax_taus *rng, int32_t hz, uint32_t iz);

/* A normal number with mean 0 and standard deviation sigma. */
static inline double corax_gauss(const corax_ziggurat *z, corax_taus *rng, double sigma)
{
    int32_t hz = (int32_t)corax_taus_get(rng);
    uint32_t iz = (uint32_t)hz & 127u;
    uint32_t mag = hz < 0 ? (uint32_t)(-(int64_t)hz) : (uint32_t)hz;
    double x = mag < z->k[iz] ? hz * z->w[iz] : corax_ziggurat_tail(z, rng, hz, iz);
    return sigma * x;
}

#endif
