/* Write a sample QA report of an invented drill program (the Ember Flats
 * prospect: invented holes, surveys, core readings and findings), to look
 * at the page, to test that it renders, and to time it on a large program.
 * The readings are made through corax's own inverse from invented families
 * of planes, with a few planted slips that the invented findings name.
 *
 * usage: report_sample OUT.html [HOLES [READINGS [SEED]]]
 *        (defaults: 9 holes, 1500 readings, seed 7); prints what it wrote
 *        and how long it took on standard error. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <time.h>

#include "corax/corax.h"
#include "corax/convert.h"
#include "corax/core.h"
#include "corax/report.h"

typedef struct family {
    const char *kind;
    double dip, dip_direction, spread; /* degrees */
} family;

static const family families[] = {
    {"bedding", 48, 115, 8}, {"foliation", 72, 300, 6}, {"vein", 80, 25, 9},
    {"fault", 62, 205, 11},  {"joint", 86, 70, 14},     {"contact", 40, 130, 12},
};
enum { NFAMILIES = sizeof families / sizeof families[0] };

static double uniform(uint64_t *state)
{
    uint64_t z = (*state += 0x9E3779B97F4A7C15u);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9u;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBu;
    return (double)((z ^ (z >> 31)) >> 11) * 0x1.0p-53;
}

static double gauss(uint64_t *state)
{
    double u = fmax(uniform(state), 1e-300), v = uniform(state);
    return sqrt(-2.0 * log(u)) * cos(2.0 * CORAX_PI * v);
}

/* The normal of a family's plane, tilted at random by about its spread. */
static corax_vec3 scattered_normal(const family *f, uint64_t *state)
{
    double dip = f->dip + f->spread * gauss(state);
    double dd = f->dip_direction + f->spread * gauss(state) / fmax(sin(corax_rad(f->dip)), 0.3);
    corax_plane p = {corax_rad(fmin(fmax(dip, 0.0), 90.0)), corax_rad(dd)};
    return corax_plane_normal(p);
}

typedef struct sample {
    corax_program *program;
    corax_qa_reading *readings;
    size_t nreadings;
    char (*names)[32];
    corax_findings findings;
} sample;

/* A hole of the invented program: a grid of collars, stations every 30 m
 * that wander a little; hole 3 has a magnetic station, hole 5 no survey (its
 * collar direction only), hole 7 neither survey nor direction. */
static corax_status make_hole(sample *s, size_t i, uint64_t *state)
{
    snprintf(s->names[i], sizeof s->names[i], "EF%03u", (unsigned)(i + 1) % 1000u);
    corax_collar c = {{7400.0 + 140.0 * (double)(i % 6) + 30.0 * gauss(state),
                       21800.0 + 160.0 * (double)(i / 6) + 30.0 * gauss(state),
                       305.0 + 6.0 * gauss(state)},
                      corax_rad(i % 2 ? 120.0 : 300.0) + 0.2 * gauss(state),
                      corax_rad(55.0 + 20.0 * uniform(state)), i != 6, 150.0 + 250.0 * uniform(state)};
    corax_station st[20];
    size_t n = 0;
    double az = c.azimuth, pl = c.plunge;
    for (double d = 18.0; d < c.length && n < 20 && i != 4 && i != 6; d += 30.0) {
        az += corax_rad(0.8 + 0.6 * gauss(state));
        pl -= corax_rad(0.5 + 0.4 * gauss(state));
        double shown = i == 2 && n == 4 ? az + corax_rad(9.0) : az;
        st[n] = corax_station_make(d, corax_wrap_azimuth(shown), pl, (long)(2 + n));
        n++;
    }
    corax_hole *h;
    corax_error err;
    corax_status r = corax_hole_new(s->names[i], &c, st, n, 0.0, &h, &err);
    return r == CORAX_OK ? corax_program_add(s->program, h) : r;
}

/* A reading of a random family at a random depth down a hole (NULL: one
 * not in the collars), as a core logger would have measured it; some
 * without beta (broken core). */
static void make_reading(sample *s, const corax_hole *h, const char *name, uint64_t *state)
{
    corax_qa_reading *q = &s->readings[s->nreadings++];
    const family *f = &families[(size_t)(uniform(state) * NFAMILIES) % NFAMILIES];
    double length = h ? corax_hole_length(h) : 120.0;
    *q = (corax_qa_reading){.hole = name, .path = h, .reading = corax_reading_empty(),
                            .kind = f->kind, .confidence = "", .file = "core_log.csv",
                            .line = (long)s->nreadings + 1, .problem = NULL};
    q->reading.depth = round((3.0 + (fmax(length, 20.0) - 3.0) * uniform(state)) * 100.0) / 100.0;
    corax_hole_point pt;
    corax_core_frame fr;
    corax_core_conventions conv = {0};
    if (!h || corax_hole_at(h, q->reading.depth, NULL, &pt) != CORAX_OK ||
        corax_core_frame_of(pt.tangent, &fr) != CORAX_OK) {
        q->reading.alpha = corax_rad(10.0 + 70.0 * uniform(state)); /* no path: as read */
        q->reading.beta = corax_rad(360.0 * uniform(state));
        return;
    }
    corax_core_plane_angles(&fr, scattered_normal(f, state), &conv, &q->reading.alpha,
                            &q->reading.beta);
    if (uniform(state) < 0.06)
        q->reading.beta = NAN;
}

static corax_status planted(sample *s, size_t nholes)
{
    corax_findings *F = &s->findings;
    corax_status st = CORAX_OK;
    /* the slip planted in the second hole: marks on the wrong side */
    for (size_t k = 0; k < s->nreadings; k++) {
        corax_qa_reading *q = &s->readings[k];
        if (strcmp(q->hole, s->names[1]) == 0 && q->reading.depth >= 60 && q->reading.depth <= 78 &&
            isfinite(q->reading.beta))
            q->reading.beta = fmod(q->reading.beta + CORAX_PI, 2.0 * CORAX_PI);
    }
#define ADD(x) do { if (st == CORAX_OK) st = (x); } while (0)
    ADD(corax_findings_add_range(F, CORAX_WARNING, "run-misfit", "core_log.csv", 0, s->names[1],
                                 60.0, 78.0, "readings from 60 to 78 m sit about 180\xc2\xb0 from "
                                 "their neighbours in beta: the orientation line may have been "
                                 "marked on the wrong side"));
    ADD(corax_findings_add(F, CORAX_WARNING, "magnetic", "surveys.csv", 7, s->names[2], 138.0,
                           "azimuth turns 9.6\xc2\xb0 at 138 m with the dip steady, and turns "
                           "back at the next station: magnetic ground?"));
    ADD(corax_findings_add(F, CORAX_NOTE, "first-station", "surveys.csv", 2, s->names[3], 18.0,
                           "first station at 18 m: the hole above it is taken as straight "
                           "along the collar's direction"));
    ADD(corax_findings_add(F, CORAX_WARNING, "no-survey", "collars.csv", 6, s->names[4], NAN,
                           "no downhole survey: the hole is taken as straight along its collar's "
                           "direction"));
    ADD(corax_findings_add(F, CORAX_ERROR, "no-path", "collars.csv", 8, s->names[6], NAN,
                           "no survey and no collar direction: the readings of this hole cannot "
                           "be oriented"));
    ADD(corax_findings_add(F, CORAX_ERROR, "alpha-range", "core_log.csv", 212, s->names[0], 94.3,
                           "alpha 95 is outside 0 to 90\xc2\xb0"));
    ADD(corax_findings_add_range(F, CORAX_NOTE, "low-confidence", "runs.csv", 14, s->names[0],
                                 150.0, 162.5, "run marked \"poor\" by the logger"));
    ADD(corax_findings_add(F, CORAX_NOTE, "low-alpha", "core_log.csv", 57, s->names[7], 41.2,
                           "alpha 6\xc2\xb0: the plane is close to the core axis and its beta is "
                           "hard to read"));
    ADD(corax_findings_add(F, CORAX_WARNING, "unknown-hole", "core_log.csv", 1402, "EF099", NAN,
                           "the core log names hole EF099, which is not in the collars"));
    ADD(corax_findings_add(F, CORAX_NOTE, "fabric-spread", NULL, 0, NULL, NAN,
                           "bedding scatters 2.3 times more in %s than across the program",
                           s->names[5]));
    /* a large program gets findings in proportion */
    uint64_t state = 99;
    for (size_t i = 8; i < nholes && st == CORAX_OK; i++) {
        double d = 30.0 + 200.0 * uniform(&state);
        ADD(corax_findings_add(F, i % 3 ? CORAX_NOTE : CORAX_WARNING, "dogleg", "surveys.csv",
                               (long)(10 * i), s->names[i], d,
                               "dogleg of %.1f\xc2\xb0 per 30 m ending at %.0f m", 3.0 + 4.0 *
                               uniform(&state), d));
        if (i % 4 == 0)
            ADD(corax_findings_add_range(F, CORAX_WARNING, "beta-reversed", "core_log.csv",
                                         (long)(100 * i), s->names[i], d, d + 9.0,
                                         "betas in this run fit their neighbours better read "
                                         "the other way round (360\xc2\xb0 - beta)"));
    }
#undef ADD
    return st == CORAX_OK ? corax_findings_sort(F) : st;
}

static double seconds(void)
{
    struct timespec t;
    clock_gettime(CLOCK_MONOTONIC, &t);
    return (double)t.tv_sec + 1e-9 * (double)t.tv_nsec;
}

int main(int argc, char **argv)
{
    if (argc < 2 || argc > 5) {
        fprintf(stderr, "usage: report_sample OUT.html [HOLES [READINGS [SEED]]]\n");
        return 2;
    }
    size_t nholes = argc > 2 ? strtoul(argv[2], NULL, 10) : 9;
    size_t nreadings = argc > 3 ? strtoul(argv[3], NULL, 10) : 1500;
    uint64_t state = argc > 4 ? strtoull(argv[4], NULL, 10) : 7;
    if (nholes < 8 || nholes > 999) {
        fprintf(stderr, "report_sample: between 8 and 999 holes\n");
        return 2;
    }
    sample s = {corax_program_new(), calloc(nreadings + 40, sizeof *s.readings), 0,
                calloc(nholes, sizeof *s.names), {0}};
    if (!s.program || !s.readings || !s.names)
        return 1;
    corax_status st = CORAX_OK;
    for (size_t i = 0; i < nholes && st == CORAX_OK; i++)
        st = make_hole(&s, i, &state);
    for (size_t k = 0; k < nreadings && st == CORAX_OK; k++) {
        size_t i = (size_t)(uniform(&state) * (double)nholes) % nholes;
        make_reading(&s, corax_program_hole(s.program, i), s.names[i], &state);
    }
    for (size_t k = 0; k < 30 && st == CORAX_OK; k++) /* rows for a hole with no collar */
        make_reading(&s, NULL, "EF099", &state);
    if (st == CORAX_OK)
        st = planted(&s, nholes);
    corax_qa_log *log = corax_qa_log_new(); /* the readings as the report takes them */
    if (!log)
        st = CORAX_ENOMEM;
    for (size_t k = 0; k < s.nreadings && st == CORAX_OK; k++)
        st = corax_qa_log_add(log, &s.readings[k]);
    if (st == CORAX_OK)
        st = corax_qa_log_sort(log);
    const char *inputs[] = {"ember_flats/collars.csv", "ember_flats/surveys.csv",
                            "ember_flats/core_log.csv", "ember_flats/runs.csv"};
    corax_convert_options conv = corax_convert_options_default();
    corax_report_input in = {.title = "Ember Flats (an invented prospect)", .inputs = inputs,
                             .ninputs = 4, .version = CORAX_VERSION,
                             .when = "2026-06-01 09:30 (invented)", .program = s.program,
                             .findings = &s.findings, .log = log, .convert = &conv};
    corax_error err = {0};
    double t0 = seconds();
    if (st == CORAX_OK)
        st = corax_report_write(&in, NULL, argv[1], &err);
    double t1 = seconds();
    int rc = 0;
    if (st != CORAX_OK) {
        fprintf(stderr, "report_sample: %s: %s\n", err.message[0] ? err.message : "",
                corax_strerror(st));
        rc = 1;
    } else {
        struct stat sb;
        long long size = stat(argv[1], &sb) == 0 ? (long long)sb.st_size : -1;
        fprintf(stderr, "report_sample: %s: %zu holes, %zu readings, %zu findings; "
                        "%lld bytes in %.2f s\n",
                argv[1], nholes, s.nreadings, s.findings.count, size, t1 - t0);
    }
    corax_findings_clear(&s.findings);
    corax_program_free(s.program);
    corax_qa_log_free(log);
    free(s.readings);
    free(s.names);
    return rc;
}
