/* Benchmark: desurvey a synthetic program of 10,000 holes from CSV, then
 * answer interpolated depth queries; reports rates and peak memory. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <time.h>
#include <unistd.h>

#include "bench.h"
#include "corax/corax.h"

enum { HOLES = 10000, STATIONS = 30, SPACING = 30, QUERIES = 20000000 };

static void write_tables(const char *cpath, const char *spath)
{
    FILE *c = fopen(cpath, "w"), *s = fopen(spath, "w");
    if (!c || !s) {
        perror("bench tables");
        exit(1);
    }
    uint64_t seed = 1;
    fprintf(c, "hole,x,y,z,azimuth,dip,length\n");
    fprintf(s, "hole,depth,azimuth,dip\n");
    for (int h = 0; h < HOLES; h++) {
        double az = 360 * uniform(&seed), dip = -45 - 40 * uniform(&seed);
        fprintf(c, "BH%05d,%.2f,%.2f,%.2f,%.1f,%.1f,%d\n", h, 1e4 * uniform(&seed),
                1e4 * uniform(&seed), 500 + 50 * uniform(&seed), az, dip, STATIONS * SPACING);
        for (int k = 0; k < STATIONS; k++) {
            fprintf(s, "BH%05d,%d,%.2f,%.2f\n", h, k * SPACING, fmod(az + 360, 360), dip);
            az += 2 * (uniform(&seed) - 0.4);
            dip = fmin(-5, dip + uniform(&seed));
        }
    }
    fclose(c);
    fclose(s);
}

int main(void)
{
    char cpath[64], spath[64];
    snprintf(cpath, sizeof cpath, "/tmp/corax-bench-%ld-c.csv", (long)getpid());
    snprintf(spath, sizeof spath, "/tmp/corax-bench-%ld-s.csv", (long)getpid());
    write_tables(cpath, spath);

    double t0 = now();
    corax_program *prog;
    corax_findings problems = {0};
    corax_error err;
    if (corax_program_load(cpath, spath, NULL, &prog, &problems, NULL, &err) != CORAX_OK ||
        problems.count) {
        fprintf(stderr, "bench: load failed: %s\n", err.message);
        return 1;
    }
    double t_load = now() - t0;
    unlink(cpath);
    unlink(spath);

    /* down each hole in depth order (the usual pattern: a core log), with the hint */
    uint64_t seed = 2;
    double sink = 0;
    size_t per_hole = QUERIES / HOLES;
    t0 = now();
    for (size_t h = 0; h < HOLES; h++) {
        const corax_hole *hole = corax_program_hole(prog, h);
        size_t hint = 0;
        for (size_t q = 0; q < per_hole; q++) {
            corax_hole_point p;
            corax_hole_at(hole, (double)q * (STATIONS * SPACING) / (double)per_hole, &hint, &p);
            sink += p.position.z;
        }
    }
    double t_seq = now() - t0;

    /* random holes and depths, no hint: the worst case */
    t0 = now();
    for (size_t q = 0; q < QUERIES; q++) {
        const corax_hole *hole = corax_program_hole(prog, (size_t)(uniform(&seed) * HOLES));
        corax_hole_point p;
        corax_hole_at(hole, uniform(&seed) * STATIONS * SPACING, NULL, &p);
        sink += p.position.z;
    }
    double t_rand = now() - t0;

    /* name look-ups, as a converter does for every row */
    char name[16];
    t0 = now();
    for (size_t q = 0; q < QUERIES / 4; q++) {
        snprintf(name, sizeof name, "BH%05d", (int)(uniform(&seed) * HOLES));
        sink += corax_program_find(prog, name, 7) != NULL;
    }
    double t_find = now() - t0;

    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    printf("synthetic program: %d holes, %d stations each (%d stations)\n", HOLES, STATIONS,
           HOLES * STATIONS);
    printf("  load and desurvey from CSV: %.3f s\n", t_load);
    printf("  depth queries down each hole: %.1f million per second\n", QUERIES / t_seq / 1e6);
    printf("  depth queries at random:      %.1f million per second\n", QUERIES / t_rand / 1e6);
    printf("  hole look-ups by name:        %.1f million per second (with formatting)\n",
           QUERIES / 4 / t_find / 1e6);
    printf("  peak memory (resident): %.1f MiB\n", (double)ru.ru_maxrss / 1024.0);
    if (sink == 42.0)
        printf(" ");
    corax_program_free(prog);
    return 0;
}
