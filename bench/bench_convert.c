/* Benchmark: `corax convert` end to end, CSV to CSV, on a synthetic program of
 * 1,000,000 structures in 2,000 holes. Reports rows per second and the peak
 * memory of the converting process. Needs CORAX (the command) in the
 * environment. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include "bench.h"

enum { HOLES = 2000, STRUCTURES = 1000000, STATIONS = 20, SPACING = 25 };

static void write_program(const char *dir)
{
    char path[512];
    snprintf(path, sizeof path, "%s/collars.csv", dir);
    FILE *c = fopen(path, "w");
    snprintf(path, sizeof path, "%s/surveys.csv", dir);
    FILE *s = fopen(path, "w");
    snprintf(path, sizeof path, "%s/log.csv", dir);
    FILE *l = fopen(path, "w");
    if (!c || !s || !l) {
        perror("bench_convert");
        exit(1);
    }
    uint64_t seed = 5;
    fprintf(c, "hole,x,y,z,azimuth,dip,length\n");
    fprintf(s, "hole,depth,azimuth,dip\n");
    fprintf(l, "hole,depth,alpha,beta,kind,confidence\n");
    static const char *const kinds[] = {"bedding", "foliation", "vein", "joint", "fault"};
    for (int h = 0; h < HOLES; h++) {
        double az = 360 * uniform(&seed), dip = -50 - 30 * uniform(&seed);
        double length = STATIONS * SPACING;
        fprintf(c, "B%04d,%.2f,%.2f,%.2f,%.1f,%.1f,%.0f\n", h, 1e4 * uniform(&seed),
                1e4 * uniform(&seed), 400 + 100 * uniform(&seed), az, dip, length);
        for (int k = 0; k <= STATIONS; k++) {
            fprintf(s, "B%04d,%d,%.2f,%.2f\n", h, k * SPACING, fmod(az + 360, 360), dip);
            az += uniform(&seed) - 0.4;
            dip += 0.5 * uniform(&seed);
        }
        int n = STRUCTURES / HOLES;
        for (int k = 0; k < n; k++)
            fprintf(l, "B%04d,%.2f,%.1f,%.1f,%s,%s\n", h, length * (k + 0.5) / n,
                    5 + 85 * uniform(&seed), 360 * uniform(&seed) * 0.9999, kinds[k % 5],
                    k % 7 ? "good" : "fair");
    }
    fclose(c);
    fclose(s);
    fclose(l);
}

int main(void)
{
    const char *corax = getenv("CORAX");
    if (!corax) {
        fprintf(stderr, "bench_convert: set CORAX to the corax command\n");
        return 1;
    }
    char dir[] = "/tmp/corax-bench-convert-XXXXXX";
    if (!mkdtemp(dir)) {
        perror("bench_convert");
        return 1;
    }
    write_program(dir);
    char c[600], s[600], l[600], o[600];
    snprintf(c, sizeof c, "%s/collars.csv", dir);
    snprintf(s, sizeof s, "%s/surveys.csv", dir);
    snprintf(l, sizeof l, "%s/log.csv", dir);
    snprintf(o, sizeof o, "%s/out.csv", dir);
    double best = 1e300;
    long rss = 0;
    for (int run = 0; run < 3; run++) {
        double t0 = now();
        pid_t pid = fork();
        if (pid == 0) {
            execl(corax, corax, "convert", "-q", "--collars", c, "--surveys", s, "-o", o, l,
                  (char *)NULL);
            _exit(127);
        }
        int status;
        if (pid < 0 || waitpid(pid, &status, 0) < 0 || !WIFEXITED(status) ||
            WEXITSTATUS(status) != 0) {
            fprintf(stderr, "bench_convert: corax convert failed\n");
            return 1;
        }
        double t = now() - t0;
        if (t < best)
            best = t;
    }
    struct rusage ru; /* the largest of the finished children: all are the same run */
    getrusage(RUSAGE_CHILDREN, &ru);
    rss = ru.ru_maxrss;
    FILE *in = fopen(l, "r"), *out = fopen(o, "r");
    fseek(in, 0, SEEK_END);
    fseek(out, 0, SEEK_END);
    printf("convert, CSV to CSV: %d structures in %d holes (%.0f MB in, %.0f MB out)\n",
           STRUCTURES, HOLES, ftell(in) / 1e6, ftell(out) / 1e6);
    printf("  best of 3: %.3f s, %.2f million rows per second\n", best, STRUCTURES / best / 1e6);
    printf("  peak memory of the converting process: %.1f MiB\n", (double)rss / 1024.0);
    fclose(in);
    fclose(out);
    return bench_scratch_done(dir);
}
