/* Benchmark: every command end to end on an invented program of 1,000,000
 * core readings in 2,000 holes, the log in random hole order (a multi-hole log
 * as it arrives, the realistic case: every row moves to another hole).
 * CORAX_BENCH_READINGS sets another size (e.g. 4000000), CORAX_BENCH_ONLY
 * the commands (those whose label holds it, e.g. "stereonet"; plain convert
 * always runs, for the later commands read its table). Needs CORAX, the
 * command, in the environment.
 *
 * For each command it prints rows per second and the peak resident memory of
 * the command's process, and beside them its floors, measured in the same run:
 *   time floor:   reading every input table with the library's reader (each
 *                 row split into fields, no number parsed) plus writing as
 *                 many bytes as the command wrote, through the library's
 *                 writer, on one thread: what any command that reads those
 *                 tables and writes that output must spend;
 *   memory floor: a process that loads the program (collars and surveys,
 *                 every hole desurveyed) and nothing else, or a bare process
 *                 for a command that takes no program.
 * The best of up to three runs counts (the machine is shared). */
#define _DEFAULT_SOURCE /* wait4: one child's own peak memory */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include "bench.h"
#include "corax/corax.h"

enum { HOLES = 2000, STATIONS = 20, SPACING = 25, MAX_FILES = 4 };

typedef struct command {
    const char *label;
    const char *threads;       /* OMP_NUM_THREADS, or NULL for the machine's */
    const char *args[24];      /* after "corax"; NULL-terminated */
    const char *inputs[MAX_FILES];  /* tables the command reads */
    const char *outputs[MAX_FILES]; /* files it writes */
    int needs_program;
} command;

static char dir[] = "/tmp/corax-bench-commands-XXXXXX";

static const char *path(const char *name)
{
    static char buf[64][600];
    static int next;
    char *p = buf[next++ % 64];
    snprintf(p, sizeof buf[0], "%s/%s", dir, name);
    return p;
}

static double file_mb(const char *p)
{
    struct stat sb;
    return stat(p, &sb) == 0 ? (double)sb.st_size / 1e6 : 0.0;
}

/* Run the command once: its wall time, its processor time (every thread)
 * and its peak resident memory (KiB). */
static int run(const command *c, const char *corax, double *seconds, double *cpu, long *rss)
{
    const char *argv[32] = {corax};
    size_t n = 1;
    for (size_t i = 0; c->args[i]; i++)
        argv[n++] = c->args[i];
    argv[n] = NULL;
    double t0 = now();
    pid_t pid = fork();
    if (pid == 0) {
        if (c->threads)
            setenv("OMP_NUM_THREADS", c->threads, 1);
        execv(corax, (char *const *)argv);
        _exit(127);
    }
    int status;
    struct rusage ru;
    if (pid < 0 || wait4(pid, &status, 0, &ru) < 0 || !WIFEXITED(status) ||
        WEXITSTATUS(status) != 0) {
        fprintf(stderr, "bench_commands: %s failed\n", c->label);
        return 1;
    }
    *seconds = now() - t0;
    *cpu = (double)ru.ru_utime.tv_sec + 1e-6 * (double)ru.ru_utime.tv_usec +
           (double)ru.ru_stime.tv_sec + 1e-6 * (double)ru.ru_stime.tv_usec;
    *rss = ru.ru_maxrss;
    return 0;
}

/* Seconds to read a table with the library's reader; its rows in *rows. */
static double read_floor(const char *p, long *rows)
{
    corax_reader *rd;
    corax_error err;
    corax_row row;
    double t0 = now();
    if (corax_reader_open(p, corax_table_format_default(), &rd, &err) != CORAX_OK)
        return NAN;
    *rows = -1; /* the header is a row */
    while (corax_reader_next(rd, &row, &err) == CORAX_OK)
        ++*rows;
    corax_reader_close(rd);
    return now() - t0;
}

/* Seconds to write `mb` megabytes through the library's writer. */
static double write_floor(double mb)
{
    static char line[100];
    memset(line, 'x', sizeof line - 1);
    line[sizeof line - 1] = '\n';
    corax_writer *w;
    corax_error err;
    double t0 = now();
    if (corax_writer_open(path("floor.out"), &w, &err) != CORAX_OK)
        return NAN;
    for (double done = 0; done < mb * 1e6; done += sizeof line)
        corax_writer_text(w, line, sizeof line);
    if (corax_writer_commit(w, &err) != CORAX_OK)
        return NAN;
    double t = now() - t0;
    unlink(path("floor.out"));
    return t;
}

/* Peak resident memory (KiB) of a process that loads the program, or of a
 * bare one. */
static long memory_floor(int with_program)
{
    pid_t pid = fork();
    if (pid == 0) {
        corax_program *prog = NULL;
        corax_findings f = {0};
        corax_error err;
        if (with_program && corax_program_load(path("collars.csv"), path("surveys.csv"), NULL,
                                               &prog, &f, NULL, &err) != CORAX_OK)
            _exit(1);
        corax_program_free(prog);
        _exit(0);
    }
    int status;
    struct rusage ru;
    if (pid < 0 || wait4(pid, &status, 0, &ru) < 0 || !WIFEXITED(status) ||
        WEXITSTATUS(status) != 0)
        return -1;
    return ru.ru_maxrss;
}

static int measure(const command *c, const char *corax, long readings)
{
    double best = 1e300, best_cpu = 1e300, spent = 0;
    long rss = 0;
    for (int k = 0; k < 3 && (k == 0 || spent < 20.0); k++) {
        double t, cpu;
        long r;
        if (run(c, corax, &t, &cpu, &r))
            return 1;
        best = fmin(best, t);
        best_cpu = fmin(best_cpu, cpu);
        rss = r > rss ? r : rss;
        spent += t;
    }
    double floor_t = 1e300, out_mb = 0;
    for (int i = 0; i < MAX_FILES && c->outputs[i]; i++)
        out_mb += file_mb(c->outputs[i]);
    for (int k = 0; k < 3; k++) { /* the best of three, as the command's */
        double t = write_floor(out_mb);
        for (int i = 0; i < MAX_FILES && c->inputs[i]; i++) {
            long rows;
            t += read_floor(c->inputs[i], &rows);
        }
        floor_t = fmin(floor_t, t);
    }
    long floor_rss = memory_floor(c->needs_program);
    printf("  %-34s %7.2f s %6.2f M rows/s (floor %5.2f s, %5.2f M rows/s: %4.1fx); "
           "%.2f s of processor time\n", c->label, best, readings / best / 1e6, floor_t,
           readings / floor_t / 1e6, best / floor_t, best_cpu);
    printf("  %-34s %7.0f MiB peak      (floor %5.0f MiB %s); %.1f MB written\n", "",
           rss / 1024.0, floor_rss / 1024.0, c->needs_program ? "the program" : "a bare process",
           out_mb);
    return 0;
}

int main(void)
{
    const char *corax = getenv("CORAX");
    if (!corax) {
        fprintf(stderr, "bench_commands: set CORAX to the corax command\n");
        return 1;
    }
    const char *size = getenv("CORAX_BENCH_READINGS");
    long readings = size ? atol(size) : 1000000;
    if (readings < HOLES || !mkdtemp(dir)) {
        fprintf(stderr, "bench_commands: bad CORAX_BENCH_READINGS or no scratch folder\n");
        return 1;
    }
    if (bench_write_program(dir, HOLES, STATIONS, SPACING, readings, 5)) {
        perror("bench_commands");
        return 1;
    }
    const char *col = path("collars.csv"), *sur = path("surveys.csv"), *log = path("log.csv");
    const char *conv = path("converted.csv"), *draws = path("draws.csv");
    printf("every command on %ld readings in %d holes, the log in random hole order "
           "(%.0f MB)\n", readings, HOLES, file_mb(log));
    const command commands[] = {
        {"convert, 1 thread", "1",
         {"convert", "-q", "--collars", col, "--surveys", sur, "-o", conv, log},
         {col, sur, log}, {conv}, 1},
        {"convert, 2 threads", "2",
         {"convert", "-q", "--collars", col, "--surveys", sur, "-o", conv, log},
         {col, sur, log}, {conv}, 1},
        {"check (CSV only)", NULL,
         {"check", "-q", "--collars", col, "--surveys", sur, "-o", path("findings.csv"), log},
         {col, sur, log}, {path("findings.csv")}, 1},
        {"check with the HTML report", NULL,
         {"check", "-q", "--collars", col, "--surveys", sur, "-o", path("findings.csv"),
          "--report", path("report.html"), log},
         {col, sur, log}, {path("findings.csv"), path("report.html")}, 1},
        {"stereonet, Kamb contours", NULL,
         {"stereonet", "-q", "-o", path("net.svg"), "--stats", path("stats.csv"), conv},
         {conv}, {path("net.svg"), path("stats.csv")}, 0},
        {"stereonet, smooth contours", NULL,
         {"stereonet", "-q", "--contours", "smooth", "-o", path("net.svg"), conv},
         {conv}, {path("net.svg")}, 0},
        {"export VTK (default encoding)", NULL,
         {"export", "-q", "--format", "vtk", "--collars", col, "--surveys", sur, "-o",
          path("out.vtk"), conv},
         {col, sur, conv}, {path("out.vtk")}, 1},
        {"convert --draws 100", NULL,
         {"convert", "-q", "--draws", "100", "--collars", col, "--surveys", sur, "-o", draws,
          log},
         {col, sur, log}, {draws}, 1},
    };
    const char *only = getenv("CORAX_BENCH_ONLY");
    for (size_t i = 0; i < sizeof commands / sizeof commands[0]; i++)
        if ((!only || strstr(commands[i].label, only) || strstr(only, commands[i].label) ||
             strncmp(commands[i].label, "convert, ", 9) == 0) &&
            measure(&commands[i], corax, readings))
            return 1;
    printf("  sizes: report %.1f MB, net %.1f MB, VTK %.1f MB\n", file_mb(path("report.html")),
           file_mb(path("net.svg")), file_mb(path("out.vtk")));
    return bench_scratch_done(dir);
}
