/* Shared by the benchmarks: a monotonic clock, a fixed-seed uniform
 * generator (splitmix64), so runs are repeatable, and the end of a scratch
 * folder. */
#ifndef CORAX_BENCH_H
#define CORAX_BENCH_H

#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <time.h>

static inline double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* A uniform number in [0, 1). */
static inline double uniform(uint64_t *s)
{
    uint64_t z = (*s += 0x9E3779B97F4A7C15u);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9u;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBu;
    return (double)((z ^ (z >> 31)) >> 11) * 0x1.0p-53;
}

/* Remove a benchmark's scratch folder, or keep it and say where when
 * CORAX_BENCH_KEEP is set; 0 on success. */
static inline int bench_scratch_done(const char *dir)
{
    if (getenv("CORAX_BENCH_KEEP")) {
        printf("  files kept in %s\n", dir);
        return 0;
    }
    char cmd[700];
    snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
    return system(cmd) == 0 ? 0 : 1;
}

#endif
