/* Benchmark: Monte Carlo draws per second on all threads, beside the cost
 * floor of a draw (its Gaussian draws and trigonometry alone), measured in the
 * same run; then `corax convert --draws 1000` end to end on a program of
 * 100,000 structures (needs CORAX, the command, in the environment). */
#include <gsl/gsl_rng.h>
#include <math.h>
#include <omp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include "bench.h"
#include "corax/corax.h"
#include "corax/uncertainty.h"
#include "geometry/vec.h"
#include "uncertainty/gauss.h"

enum { HOLES = 500, PER_HOLE = 200, STATIONS = 20, DRAWS = 1000 };

/* A synthetic hole and its readings, converted plainly. */
static corax_hole *make_hole(int h, uint64_t *seed, corax_mc_reading *m,
                             const corax_convert_options *o)
{
    char name[16];
    snprintf(name, sizeof name, "B%04d", h);
    double az = 2 * CORAX_PI * uniform(seed), pl = corax_rad(50 + 30 * uniform(seed));
    corax_station st[STATIONS];
    for (int k = 0; k < STATIONS; k++) {
        st[k] = (corax_station){k * 25.0, az, pl, 0, 0, 0, 0};
        az += corax_rad(uniform(seed) - 0.4);
        pl -= corax_rad(0.5 * uniform(seed));
    }
    corax_collar c = {{0, 0, 0}, 0, 0, 0, NAN};
    corax_hole *hole;
    if (corax_hole_new(name, &c, st, STATIONS, 0, &hole, NULL) != CORAX_OK)
        exit(1);
    for (int i = 0; i < PER_HOLE; i++) {
        m[i].reading = corax_reading_empty();
        m[i].reading.depth = 470.0 * (i + 0.5) / PER_HOLE;
        m[i].reading.alpha = corax_rad(15 + 70 * uniform(seed));
        m[i].reading.beta = 2 * CORAX_PI * uniform(seed) * 0.999;
        m[i].errors = corax_error_model_default();
        size_t hint = 0;
        corax_convert_reading(hole, &m[i].reading, o, &hint, &m[i].nominal);
    }
    return hole;
}

/* The floor: per draw, its Gaussian numbers (depth, alpha, beta), made the
 * same way, and its trigonometry, the same functions on angles of the same
 * size: the sine and cosine of the alpha and beta errors and of the arc to
 * its depth (small angles), and an arctangent for the dip. */
static double floor_rate(long draws)
{
    double sink = 0, t0 = now();
#pragma omp parallel reduction(+ : sink)
    {
        gsl_rng *rng = gsl_rng_alloc(gsl_rng_taus2);
        gsl_rng_set(rng, (unsigned long)omp_get_thread_num() + 1);
        corax_ziggurat z;
        corax_ziggurat_init(&z);
#pragma omp for
        for (long i = 0; i < draws; i++) {
            double d = corax_gauss(&z, rng, 0.05);
            double a = corax_gauss(&z, rng, 0.035), b = corax_gauss(&z, rng, 0.12);
            double sa, ca, sb, cb, sf, cf;
            small_sincos(a, &sa, &ca);
            small_sincos(b, &sb, &cb);
            small_sincos(0.01 + d, &sf, &cf);
            sink += atan(sa * cb * sf / (ca * sb + cf + 3.0));
        }
        gsl_rng_free(rng);
    }
    double t = now() - t0;
    if (sink == 42.0)
        printf(" ");
    return (double)draws / t;
}

static int end_to_end(const char *corax)
{
    char dir[] = "/tmp/corax-bench-mc-XXXXXX";
    if (!mkdtemp(dir))
        return 1;
    char c[300], s[300], l[300], out[300];
    snprintf(c, sizeof c, "%s/c.csv", dir);
    snprintf(s, sizeof s, "%s/s.csv", dir);
    snprintf(l, sizeof l, "%s/l.csv", dir);
    snprintf(out, sizeof out, "%s/o.csv", dir);
    FILE *fc = fopen(c, "w"), *fs = fopen(s, "w"), *fl = fopen(l, "w");
    if (!fc || !fs || !fl)
        return 1;
    uint64_t seed = 9;
    fprintf(fc, "hole,x,y,z\n");
    fprintf(fs, "hole,depth,azimuth,dip\n");
    fprintf(fl, "hole,depth,alpha,beta,confidence\n");
    for (int h = 0; h < HOLES; h++) {
        double az = 360 * uniform(&seed), dip = -50 - 30 * uniform(&seed);
        fprintf(fc, "B%04d,%.1f,%.1f,400\n", h, 1e4 * uniform(&seed), 1e4 * uniform(&seed));
        for (int k = 0; k < STATIONS; k++)
            fprintf(fs, "B%04d,%d,%.2f,%.2f\n", h, k * 25, fmod(az + 360 + k * 0.3, 360), dip + 0.3 * k);
        for (int i = 0; i < PER_HOLE; i++)
            fprintf(fl, "B%04d,%.2f,%.0f,%.0f,%s\n", h, 470.0 * (i + 0.5) / PER_HOLE,
                    15 + 70 * uniform(&seed), 359 * uniform(&seed), i % 3 ? "good" : "fair");
    }
    fclose(fc);
    fclose(fs);
    fclose(fl);
    double t0 = now();
    pid_t pid = fork();
    if (pid == 0) {
        execl(corax, corax, "convert", "-q", "--draws", "1000", "--collars", c, "--surveys", s,
              "-o", out, l, (char *)NULL);
        _exit(127);
    }
    int status;
    if (pid < 0 || waitpid(pid, &status, 0) < 0 || !WIFEXITED(status) || WEXITSTATUS(status))
        return 1;
    printf("  corax convert --draws 1000 on %d structures in %d holes: %.2f s end to end\n",
           HOLES * PER_HOLE, HOLES, now() - t0);
    return bench_scratch_done(dir);
}

/* The draws per second of the Monte Carlo over holes [0, nholes). */
static double mc_rate(corax_hole **holes, int nholes, const corax_mc_reading *m, corax_spread *sp,
                      const corax_convert_options *o, const corax_error_model *survey)
{
    double t0 = now();
    int failed = 0;
#pragma omp parallel
    {
        corax_mc *mc = corax_mc_new();
#pragma omp for schedule(dynamic, 1)
        for (int h = 0; h < nholes; h++)
            if (corax_mc_hole(mc, holes[h], m + (size_t)h * PER_HOLE, PER_HOLE, o, survey, DRAWS,
                              1, sp + (size_t)h * PER_HOLE, NULL, NULL) != CORAX_OK)
                failed = 1;
        corax_mc_free(mc);
    }
    double t = now() - t0;
    return failed ? 0.0 : (double)nholes * PER_HOLE * DRAWS / t;
}

int main(void)
{
    corax_convert_options o = corax_convert_options_default();
    corax_error_model survey = corax_error_model_default();
    corax_mc_reading *m = malloc((size_t)HOLES * PER_HOLE * sizeof *m);
    corax_spread *sp = malloc((size_t)HOLES * PER_HOLE * sizeof *sp);
    corax_hole **holes = malloc(HOLES * sizeof *holes);
    if (!m || !sp || !holes)
        return 1;
    uint64_t seed = 3;
    for (int h = 0; h < HOLES; h++)
        holes[h] = make_hole(h, &seed, m + (size_t)h * PER_HOLE, &o);
    /* the draws and the floor measured in turn, five times each, best kept:
     * on a shared machine the best is the one least disturbed */
    enum { ROUNDS = 5, SHARE = HOLES / 5 };
    double best = 0.0, floor = 0.0;
    for (int round = 0; round < ROUNDS; round++) {
        double r = mc_rate(holes, SHARE, m, sp, &o, &survey);
        if (r == 0.0)
            return 1;
        best = r > best ? r : best;
        double f = floor_rate((long)SHARE * PER_HOLE * DRAWS / 2);
        floor = f > floor ? f : floor;
    }
    printf("Monte Carlo on %d threads: %d readings x %d draws, best of %d rounds\n",
           omp_get_max_threads(), SHARE * PER_HOLE, DRAWS, ROUNDS);
    printf("  %.1f million measurement draws per second\n", best / 1e6);
    printf("  floor (its Gaussian draws and trigonometry only): %.1f million per second; "
           "%.2fx of the floor\n", floor / 1e6, floor / best);
    for (int h = 0; h < HOLES; h++)
        corax_hole_free(holes[h]);
    free(holes);
    free(m);
    free(sp);
    const char *corax = getenv("CORAX");
    return corax ? end_to_end(corax) : 0;
}
