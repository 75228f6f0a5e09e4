/* Shared by the benchmarks: a monotonic clock, a fixed-seed uniform
 * generator (splitmix64), so runs are repeatable, and the end of a scratch
 * folder. */
#ifndef CORAX_BENCH_H
#define CORAX_BENCH_H

#include <math.h>
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

/* A uniform number in [0, 1) fixed by a key alone (for row i of a table). */
static inline double uniform_of(uint64_t key)
{
    uint64_t s = key * 0x2545F4914F6CDD1Du;
    return uniform(&s);
}

/* Write an invented drill program into dir: collars.csv, surveys.csv (holes
 * of `stations` stations `spacing` metres apart, curving a little) and
 * log.csv, `readings` core readings (hole, depth, alpha, beta, kind,
 * confidence) shared evenly by the holes, in random hole order: the rows of
 * all holes shuffled together, as a log of many holes arrives. 0 on success. */
static inline int bench_write_program(const char *dir, int holes, int stations, int spacing,
                                      long readings, uint64_t seed)
{
    char path[512];
    snprintf(path, sizeof path, "%s/collars.csv", dir);
    FILE *c = fopen(path, "w");
    snprintf(path, sizeof path, "%s/surveys.csv", dir);
    FILE *s = fopen(path, "w");
    snprintf(path, sizeof path, "%s/log.csv", dir);
    FILE *l = fopen(path, "w");
    uint32_t *order = malloc((size_t)readings * sizeof *order);
    if (!c || !s || !l || !order)
        return 1;
    fprintf(c, "hole,x,y,z,azimuth,dip,length\n");
    fprintf(s, "hole,depth,azimuth,dip\n");
    fprintf(l, "hole,depth,alpha,beta,kind,confidence\n");
    double length = (double)stations * spacing;
    for (int h = 0; h < holes; h++) {
        double az = 360 * uniform(&seed), dip = -50 - 30 * uniform(&seed);
        fprintf(c, "B%04d,%.2f,%.2f,%.2f,%.1f,%.1f,%.0f\n", h, 1e4 * uniform(&seed),
                1e4 * uniform(&seed), 400 + 100 * uniform(&seed), az, dip, length);
        for (int k = 0; k <= stations; k++) {
            fprintf(s, "B%04d,%d,%.2f,%.2f\n", h, k * spacing, fmod(az + 360, 360), dip);
            az += uniform(&seed) - 0.4;
            dip += 0.5 * uniform(&seed);
        }
    }
    for (long i = 0; i < readings; i++)
        order[i] = (uint32_t)i;
    for (long i = readings - 1; i > 0; i--) { /* Fisher-Yates */
        long j = (long)(uniform(&seed) * (double)(i + 1));
        uint32_t t = order[i];
        order[i] = order[j];
        order[j] = t;
    }
    static const char *const kinds[] = {"bedding", "foliation", "vein", "joint", "fault"};
    long per_hole = (readings + holes - 1) / holes;
    for (long i = 0; i < readings; i++) {
        long r = order[i], h = r / per_hole, k = r % per_hole;
        fprintf(l, "B%04ld,%.2f,%.1f,%.1f,%s,%s\n", h, length * ((double)k + 0.5) / (double)per_hole,
                5 + 85 * uniform_of(2 * (uint64_t)r), 359.9 * uniform_of(2 * (uint64_t)r + 1),
                kinds[k % 5], k % 7 ? "good" : "fair");
    }
    free(order);
    int bad = ferror(c) || ferror(s) || ferror(l);
    bad |= fclose(c) != 0;
    bad |= fclose(s) != 0;
    bad |= fclose(l) != 0;
    return bad;
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
