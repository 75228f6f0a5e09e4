/* Helpers shared by the benchmarks: a monotonic clock and a fixed-seed
 * uniform generator (splitmix64), so runs are repeatable. */
#ifndef CORAX_BENCH_H
#define CORAX_BENCH_H

#include <stdint.h>
#include <time.h>

static inline double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

static inline double uniform(uint64_t *s)
{
    uint64_t z = (*s += 0x9E3779B97F4A7C15u);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9u;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBu;
    return (double)((z ^ (z >> 31)) >> 11) * 0x1.0p-53;
}

#endif
