/* Benchmark: a large VTK export, streamed. A synthetic program of 2,000
 * holes with a million located structures, exported as discs (ASCII and
 * binary) and as points; then the same holes projected into a section.
 * Reports rates, file sizes and peak memory: the memory must stay near the
 * structures' own size however large the file grows. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <sys/resource.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

#include "bench.h"
#include "corax/corax.h"

enum { HOLES = 2000, STATIONS = 20, SPACING = 30, STRUCTURES = 1000000 };

static corax_program *program(uint64_t *seed)
{
    corax_program *prog = corax_program_new();
    corax_station st[STATIONS];
    for (int h = 0; h < HOLES; h++) {
        char name[16];
        snprintf(name, sizeof name, "BH%05d", h);
        double az = 2 * CORAX_PI * uniform(seed), pl = corax_rad(45 + 40 * uniform(seed));
        corax_collar c = {{1e4 * uniform(seed), 1e4 * uniform(seed), 500}, az, pl, 1,
                          STATIONS * SPACING};
        for (int k = 0; k < STATIONS; k++) {
            st[k] = corax_station_make((double)k * SPACING, az, pl, 0);
            az += corax_rad(2 * (uniform(seed) - 0.4));
            pl = fmax(corax_rad(5), pl - corax_rad(uniform(seed)));
        }
        corax_hole *hole;
        if (corax_hole_new(name, &c, st, STATIONS, 0, &hole, NULL) != CORAX_OK ||
            corax_program_add(prog, hole) != CORAX_OK) {
            fprintf(stderr, "bench: cannot build the program\n");
            exit(1);
        }
    }
    return prog;
}

static double megabytes(const char *path)
{
    struct stat sb;
    return stat(path, &sb) == 0 ? (double)sb.st_size / 1048576.0 : 0.0;
}

static void export(const char *label, const char *path, const corax_program *prog,
                   const corax_export_structure *s, const corax_export_options *o)
{
    corax_export_counts n;
    corax_error err;
    double t0 = now();
    if (corax_export_vtk(NULL, path, prog, s, STRUCTURES, o, &n, &err) != CORAX_OK) {
        fprintf(stderr, "bench: export failed: %s\n", err.message);
        exit(1);
    }
    double t = now() - t0, mb = megabytes(path);
    printf("  %-22s %.2f s, %.2f million structures/s, %.0f MiB at %.0f MiB/s, %.0f bytes a "
           "structure with its share of the traces (%zu points)\n",
           label, t, STRUCTURES / t / 1e6, mb, mb / t, mb * 1048576.0 / STRUCTURES, n.points);
    unlink(path);
}

int main(void)
{
    uint64_t seed = 3;
    corax_program *prog = program(&seed);
    corax_export_structure *s = malloc(STRUCTURES * sizeof *s);
    if (!s)
        return 1;
    for (size_t i = 0; i < STRUCTURES; i++) {
        long h = (long)(uniform(&seed) * HOLES);
        double depth = uniform(&seed) * STATIONS * SPACING;
        corax_hole_point pt;
        corax_hole_at(corax_program_hole(prog, (size_t)h), depth, NULL, &pt);
        s[i] = (corax_export_structure){pt.position,
                                        {corax_rad(90 * uniform(&seed)), 2 * CORAX_PI * uniform(&seed)},
                                        depth, (int)(uniform(&seed) * 10) + 1, 0, h, 1, 0,
                                        {0, 0, 0}, {NAN, NAN, NAN, NAN, NAN}};
    }
    char path[64];
    snprintf(path, sizeof path, "/tmp/corax-bench-%ld.vtk", (long)getpid());
    corax_export_options o = corax_export_options_default();
    printf("synthetic program: %d holes of %d m, %d structures\n", HOLES, STATIONS * SPACING,
           STRUCTURES);
    printf("  (by default an export of over %d structures is binary)\n", CORAX_EXPORT_ASCII_MAX);
    o.encoding = CORAX_VTK_ASCII;
    export("discs, ASCII:", path, prog, s, &o);
    o.encoding = CORAX_VTK_BINARY;
    export("discs, binary:", path, prog, s, &o);
    o.shape = CORAX_EXPORT_POINTS;
    export("points, binary:", path, prog, s, &o);
    o.encoding = CORAX_VTK_ASCII;
    export("points, ASCII:", path, prog, s, &o);

    /* every hole projected into a section, with its slab crossings */
    corax_section sec = corax_section_make(5000, 5000, corax_rad(135), 100);
    size_t samples = 0;
    double t0 = now();
    for (size_t h = 0; h < HOLES; h++) {
        corax_section_sample *t;
        size_t n;
        if (corax_section_trace(&sec, corax_program_hole(prog, h), 5, &t, &n) == CORAX_OK)
            samples += n;
        free(t);
    }
    double t = now() - t0;
    printf("  section traces:        %.3f s for %d holes, %.1f million samples/s\n", t, HOLES,
           (double)samples / t / 1e6);

    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    printf("  peak memory (resident): %.1f MiB (the structures alone: %.1f MiB)\n",
           (double)ru.ru_maxrss / 1024.0, (double)(STRUCTURES * sizeof *s) / 1048576.0);
    free(s);
    corax_program_free(prog);
    return 0;
}
