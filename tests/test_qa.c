/* Tests of the qa module on an invented drill program with planted faults:
 * every planted fault must be found at its hole and depth, and the clean
 * holes must raise no warnings or errors. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "corax/core.h"
#include "corax/load.h"
#include "corax/qa.h"
#include "support/check.h"

/* The invented geology: bedding 50/260, foliation 75/330 (dip/dip direction). */
static const double BEDDING[2] = {50, 260}, FOLIATION[2] = {75, 330};

typedef struct hole_plan {
    const char *name;
    double azimuth, dip, length;
} hole_plan;

static const hole_plan plan[] = {
    {"H01", 120, -60, 300}, {"H02", 120, -60, 300}, {"H03", 125, -58, 300},
    {"H04", 115, -62, 300}, /* the clean holes */
    {"H05", 120, -60, 300}, /* magnetic spike at 150 m, gap 180-270 m, collar set up 20 degrees off in azimuth */
    {"H06", 120, -60, 250}, /* first station at 40 m, a station past the end (270 m) */
    {"H07", 120, -80, 300}, /* too steep for a gravity mark */
    {"H08", 120, -60, 300}, /* orientation slips (see the readings) */
    {"H09", 120, -60, 300}, /* every beta turned by 35 degrees */
    {"H10", 120, -60, 300}, /* scattered: spun core */
    {"H11", 120, -60, 300}, /* survey depth 120 typed twice */
    {"H12", 120, -60, 300}, /* dogleg of 6 degrees over 120-150 m; two rows swapped */
};
enum { NHOLES = sizeof plan / sizeof plan[0], CLEAN = 4 };

static void write_tables(const char *cpath, const char *spath)
{
    FILE *c = fopen(cpath, "w"), *s = fopen(spath, "w");
    assert_non_null(c);
    assert_non_null(s);
    fprintf(c, "hole,x,y,z,azimuth,dip,length\n");
    fprintf(s, "hole,depth,azimuth,dip\n");
    for (int h = 0; h < NHOLES; h++) {
        const hole_plan *p = &plan[h];
        double collar_az = p->azimuth + (strcmp(p->name, "H05") == 0 ? 20 : 0);
        fprintf(c, "%s,%d,%d,500,%.1f,%.1f,%.0f\n", p->name, 1000 + 60 * h, 2000 + 15 * h,
                collar_az, p->dip, p->length);
        for (double step = 0; step <= p->length; step += 30) {
            /* H12's rows at 210 and 240 m come in the wrong order */
            double d = strcmp(p->name, "H12") ? step : step == 210 ? 240 : step == 240 ? 210 : step;
            double depth = d, az = p->azimuth + 0.01 * d, dip = p->dip + 0.005 * d;
            if (strcmp(p->name, "H06") == 0 && d == 0)
                depth = 40;
            if (strcmp(p->name, "H06") == 0 && d == 30)
                continue; /* the first station is the one at 40 m */
            if (strcmp(p->name, "H05") == 0 && (d == 210 || d == 240))
                continue; /* the gap */
            if (strcmp(p->name, "H05") == 0 && d == 150)
                az += 12; /* magnetic spike */
            if (strcmp(p->name, "H12") == 0 && d >= 150)
                dip += 6; /* a sharp bend */
            fprintf(s, "%s,%.1f,%.2f,%.2f\n", p->name, depth, az, dip);
            if (strcmp(p->name, "H11") == 0 && d == 120)
                fprintf(s, "%s,%.1f,%.2f,%.2f\n", p->name, depth, az + 0.5, dip);
        }
        if (strcmp(p->name, "H06") == 0)
            fprintf(s, "%s,270,%.2f,%.2f\n", p->name, p->azimuth + 2.7, p->dip + 1.35);
    }
    fclose(c);
    fclose(s);
}

typedef struct world {
    corax_program *prog;
    corax_findings found;
    corax_qa_reading *r;
    size_t n;
} world;

static double noise(uint64_t *seed, double size) { return size * (2 * test_uniform(seed) - 1); }

/* The alpha and beta (degrees, default conventions) a plane shows at a depth. */
static int read_plane(const corax_hole *h, double depth, const double plane[2], double *alpha,
                      double *beta)
{
    corax_hole_point pt;
    corax_core_frame f;
    corax_core_conventions c = {0, 0, 0, 0, 0};
    if (corax_hole_at(h, depth, NULL, &pt) != CORAX_OK || corax_core_frame_of(pt.tangent, &f) != CORAX_OK)
        return 0;
    corax_plane p = {corax_rad(plane[0]), corax_rad(plane[1])};
    corax_core_plane_angles(&f, corax_plane_normal(p), &c, alpha, beta);
    *alpha = corax_deg(*alpha);
    *beta = corax_deg(*beta);
    return 1;
}

static void add(world *w, const char *hole, const corax_hole *path, double depth, double alpha,
                double beta, const char *kind, const char *confidence, const char *problem)
{
    corax_qa_reading *r = &w->r[w->n];
    r->hole = hole;
    r->path = path;
    r->reading = corax_reading_empty();
    r->reading.depth = depth;
    r->reading.alpha = isnan(alpha) ? alpha : corax_rad(alpha);
    r->reading.beta = isnan(beta) ? beta : corax_rad(fmod(beta + 720.0, 360.0));
    r->kind = kind;
    r->confidence = confidence;
    r->file = "log.csv";
    r->line = (long)w->n + 2;
    r->problem = problem;
    w->n++;
}

static void make_readings(world *w)
{
    w->r = calloc(20000, sizeof *w->r);
    assert_non_null(w->r);
    uint64_t seed = 99;
    for (int h = 0; h < NHOLES; h++) {
        const char *name = plan[h].name;
        const corax_hole *path = corax_program_find(w->prog, name, strlen(name));
        assert_non_null(path);
        for (double d = 10; d < plan[h].length - 5; d += 0.5) {
            int bedding = ((int)(d * 2)) % 3 != 0;
            double a, b;
            if (!read_plane(path, d, bedding ? BEDDING : FOLIATION, &a, &b))
                continue;
            a += noise(&seed, 1.5);
            b += noise(&seed, 3.0);
            const char *conf = "good", *problem = NULL;
            if (strcmp(name, "H08") == 0) {
                if (d >= 151 && d < 154)
                    b += 180; /* the line marked on the wrong side */
                if (d >= 91 && d < 94)
                    b = 360 - b; /* beta read the wrong way round */
                if (d >= 121 && d < 124)
                    conf = "poor";
                if (d == 60 || d == 61)
                    b = NAN; /* unoriented readings inside an oriented run */
                if (d == 30)
                    a = 97; /* out of range */
                if (d == 33) {
                    a = NAN;
                    problem = "alpha 'x7' is not a number";
                }
            }
            if (strcmp(name, "H09") == 0)
                b += 35; /* a convention of its own */
            if (strcmp(name, "H10") == 0)
                b += noise(&seed, 70); /* spun core */
            add(w, name, path, d, a, b, bedding ? "bedding" : "foliation", conf, problem);
            if (strcmp(name, "H08") == 0 && d == 45) /* typed twice */
                w->r[w->n] = w->r[w->n - 1], w->r[w->n].line++, w->n++;
        }
    }
    add(w, "H99", NULL, 20, 40, 100, "bedding", "good", NULL); /* not in the collars */
}

static int setup(void **state)
{
    world *w = calloc(1, sizeof *w);
    const char *cpath = test_tmp_path("qa_collars.csv"), *spath = test_tmp_path("qa_surveys.csv");
    write_tables(cpath, spath);
    corax_load_options lo = corax_load_options_default();
    lo.repair = 1;
    corax_error err;
    if (corax_program_load(cpath, spath, &lo, &w->prog, &w->found, NULL, &err) != CORAX_OK) {
        fprintf(stderr, "load: %s\n", err.message);
        return -1;
    }
    unlink(cpath);
    unlink(spath);
    make_readings(w);
    corax_qa_options o = corax_qa_options_default();
    corax_convert_options co = corax_convert_options_default();
    corax_qa_log *log = test_qa_log(w->r, w->n);
    corax_status st = corax_qa_surveys(w->prog, "surveys.csv", &o, &w->found);
    if (st == CORAX_OK)
        st = corax_qa_readings(w->prog, log, NULL, 0, &co, &o, &w->found);
    corax_qa_log_free(log);
    if (st != CORAX_OK || corax_findings_sort(&w->found) != CORAX_OK)
        return -1;
    *state = w;
    return 0;
}

static int teardown(void **state)
{
    world *w = *state;
    corax_findings_clear(&w->found);
    corax_program_free(w->prog);
    free(w->r);
    free(w);
    return 0;
}

/* The finding of a check at a hole whose depth (or stretch) takes in `depth`
 * (NaN: a finding with no depth), with `words` in its message. */
static const corax_finding *find(const world *w, const char *hole, const char *check,
                                 double depth, const char *words)
{
    for (size_t i = 0; i < w->found.count; i++) {
        const corax_finding *f = &w->found.item[i];
        if (strcmp(f->hole, hole) || strcmp(f->check, check))
            continue;
        if (words && !strstr(f->message, words))
            continue;
        if (isnan(depth) ? !isnan(f->depth)
                         : !(fabs(f->depth - depth) < 0.01 ||
                             (!isnan(f->depth_to) && f->depth - 0.01 <= depth && depth <= f->depth_to + 0.01)))
            continue;
        return f;
    }
    return NULL;
}

static void expect(const world *w, const char *hole, const char *check, double depth,
                   const char *words, corax_severity severity)
{
    const corax_finding *f = find(w, hole, check, depth, words);
    if (!f) {
        for (size_t i = 0; i < w->found.count; i++)
            if (strcmp(w->found.item[i].hole, hole) == 0)
                print_message("  %s %s %g-%g %s\n", w->found.item[i].hole, w->found.item[i].check,
                              w->found.item[i].depth, w->found.item[i].depth_to,
                              w->found.item[i].message);
        fail_msg("planted fault not found: %s %s at %g m (%s)", hole, check, depth,
                 words ? words : "");
    }
    assert_int_equal(f->severity, severity);
}

static void test_planted_survey_faults_are_found(void **state)
{
    world *w = *state;
    expect(w, "H05", "survey-magnetic", 150, "turns", CORAX_WARNING);
    expect(w, "H05", "survey-gap", 220, "90 m apart", CORAX_WARNING);
    expect(w, "H05", "collar-vs-survey", 0, "degrees apart", CORAX_WARNING);
    expect(w, "H06", "survey-first-deep", 20, "40.0 m below the collar", CORAX_NOTE);
    expect(w, "H06", "survey-past-end", 270, "past the hole's length of 250.0", CORAX_WARNING);
    expect(w, "H07", "steep-hole", 100, "steeper than 70", CORAX_WARNING);
    expect(w, "H11", "survey-repeated-depth", 120, "appears twice", CORAX_ERROR);
    expect(w, "H12", "dogleg", 140, "dogleg severity", CORAX_WARNING);
    expect(w, "H12", "survey-order", 210, "follows depth 240", CORAX_NOTE);
}

static void test_planted_orientation_faults_are_found(void **state)
{
    world *w = *state;
    expect(w, "H08", "run-disagrees", 152, "adding 180 to beta", CORAX_WARNING);
    expect(w, "H08", "run-disagrees", 92, "mirroring beta", CORAX_WARNING);
    expect(w, "H08", "unoriented-in-run", 60, "no beta", CORAX_WARNING);
    expect(w, "H08", "reading-value", 30, "alpha 97 is outside [0, 90]", CORAX_ERROR);
    expect(w, "H08", "reading-value", 33, "'x7' is not a number", CORAX_ERROR);
    expect(w, "H08", "reading-repeated", 45, "typed twice", CORAX_WARNING);
    expect(w, "H08", "low-confidence", 122, "'poor'", CORAX_NOTE);
    expect(w, "H99", "reading-hole", NAN, "not in the collar table", CORAX_ERROR);
}

static void test_planted_program_faults_are_found(void **state)
{
    world *w = *state;
    expect(w, "H09", "hole-turned", NAN, "turned by", CORAX_WARNING);
    expect(w, "H10", "hole-spread", NAN, "scatters", CORAX_WARNING);
}

/* The turn of H09 is read close to the planted one: beta + 35 undone by 325. */
static void test_turn_is_measured(void **state)
{
    world *w = *state;
    const corax_finding *f = find(w, "H09", "hole-turned", NAN, NULL);
    assert_non_null(f);
    double angle;
    assert_int_equal(sscanf(strstr(f->message, "turned by ") + 10, "%lf", &angle), 1);
    assert_close(angle, 325, 0, 3, "the turn undoing beta + 35");
}

static void test_clean_holes_raise_no_warnings(void **state)
{
    world *w = *state;
    for (int h = 0; h < CLEAN; h++)
        for (size_t i = 0; i < w->found.count; i++) {
            const corax_finding *f = &w->found.item[i];
            if (strcmp(f->hole, plan[h].name) == 0 && f->severity >= CORAX_WARNING)
                fail_msg("clean hole %s: %s %s at %g: %s", f->hole,
                         corax_severity_name(f->severity), f->check, f->depth, f->message);
        }
}

/* Sorted by hole, then depth, the hole-wide findings of a hole first. */
static void test_findings_are_sorted(void **state)
{
    world *w = *state;
    for (size_t i = 1; i < w->found.count; i++) {
        const corax_finding *a = &w->found.item[i - 1], *b = &w->found.item[i];
        if (strcmp(a->hole, b->hole) == 0 && !isnan(a->depth) && !isnan(b->depth))
            assert_true(a->depth <= b->depth);
        if (strcmp(a->hole, b->hole) == 0)
            assert_false(!isnan(a->depth) && isnan(b->depth));
    }
}

/* The same checks against a table of runs: a run marked poor gives a note,
 * and the wrong-side run is still found. */
static void test_given_runs(void **state)
{
    world *w = *state;
    corax_qa_run runs[120];
    size_t n = 0;
    for (double d = 10; d < 290 && n < 120; d += 3, n++)
        runs[n] = (corax_qa_run){"H08", d, d + 3, d == 100 ? "poor" : "good", "runs.csv", (long)n + 2};
    corax_findings found = {0};
    corax_qa_options o = corax_qa_options_default();
    corax_convert_options co = corax_convert_options_default();
    corax_qa_log *log = test_qa_log(w->r, w->n);
    assert_int_equal(corax_qa_readings(w->prog, log, runs, n, &co, &o, &found), CORAX_OK);
    corax_qa_log_free(log);
    world v = *w;
    v.found = found;
    expect(&v, "H08", "low-confidence", 101, "in runs marked 'poor'", CORAX_NOTE);
    expect(&v, "H08", "run-disagrees", 152, "adding 180 to beta", CORAX_WARNING);
    corax_findings_clear(&found);
}

/* A station's record with a model field of 56500 nT dipping 77.40 degrees and
 * what the survey measured (NaN when not). */
static corax_station_record field_record(long line, double total, double dip_deg,
                                         const char *model)
{
    corax_station_record r;
    memset(&r, 0, sizeof r);
    r.hole = (char *)"F1";
    r.depth = 10.0 * (double)line;
    r.line = line;
    r.correction.north = CORAX_NORTH_MAGNETIC;
    r.correction.field.total = model ? 56500.0 : (double)NAN;
    r.correction.field.inclination = model ? corax_rad(77.40) : (double)NAN;
    r.correction.field.model = model;
    r.total_field = total;
    r.field_dip = corax_rad(dip_deg);
    return r;
}

/* The measured field against the model's, with the tolerances of common
 * practice for field acceptance in directional surveying (from memory; 300 nT
 * and 0.45 degrees; docs/check-values.md): inside them nothing, beyond them a
 * warning saying which and by how much; measurements without a model a note. */
static void test_field_against_the_model(void **state)
{
    (void)state;
    corax_qa_options o = corax_qa_options_default();
    assert_close(o.total_field, 300.0, 0, 0, "common practice (docs/check-values.md)");
    assert_close(corax_deg(o.field_dip), 0.45, 0, 1e-12, "common practice (docs/check-values.md)");
    corax_station_record r[] = {
        field_record(2, 56790, 77.80, "WMM2025"),  /* inside both */
        field_record(3, 56810, 77.40, "WMM2025"),  /* 310 nT above */
        field_record(4, 56500, 76.90, "WMM2025"),  /* 0.50 degrees below */
        field_record(5, NAN, NAN, "WMM2025"),      /* nothing measured */
        field_record(6, 55000, NAN, "WMM2025"),    /* the total alone, far below */
    };
    corax_corrections list = {r, 5, 5, 0};
    corax_findings f = {0};
    assert_int_equal(corax_qa_field(&list, "s.csv", &o, &f), CORAX_OK);
    assert_int_equal(f.count, 3);
    assert_int_equal(f.item[0].line, 3);
    assert_int_equal(f.item[0].severity, CORAX_WARNING);
    assert_string_equal(f.item[0].check, "survey-field");
    assert_non_null(strstr(f.item[0].message, "310 above WMM2025's 56500"));
    assert_int_equal(f.item[1].line, 4);
    assert_non_null(strstr(f.item[1].message, "0.50 degrees below WMM2025's 77.40"));
    assert_null(strstr(f.item[1].message, "total field"));
    assert_int_equal(f.item[2].line, 6);
    assert_non_null(strstr(f.item[2].message, "1500 below"));
    corax_findings_clear(&f);
    /* tighter tolerances catch the first station too */
    o.total_field = 250.0;
    assert_int_equal(corax_qa_field(&list, "s.csv", &o, &f), CORAX_OK);
    assert_int_equal(f.count, 4);
    corax_findings_clear(&f);
    /* without a model: one note for all, none for a gyro's station */
    corax_station_record bare[] = {field_record(2, 56790, 77.8, NULL),
                                   field_record(3, 56790, 77.8, NULL),
                                   field_record(4, 56790, 77.8, NULL)};
    bare[2].correction.north = CORAX_NORTH_TRUE;
    corax_corrections none = {bare, 3, 3, 0};
    assert_int_equal(corax_qa_field(&none, "s.csv", &o, &f), CORAX_OK);
    assert_int_equal(f.count, 1);
    assert_int_equal(f.item[0].severity, CORAX_NOTE);
    assert_non_null(strstr(f.item[0].message, "2 stations measured the magnetic field"));
    corax_findings_clear(&f);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_planted_survey_faults_are_found),
        cmocka_unit_test(test_planted_orientation_faults_are_found),
        cmocka_unit_test(test_planted_program_faults_are_found),
        cmocka_unit_test(test_turn_is_measured),
        cmocka_unit_test(test_clean_holes_raise_no_warnings),
        cmocka_unit_test(test_findings_are_sorted),
        cmocka_unit_test(test_given_runs),
        cmocka_unit_test(test_field_against_the_model),
    };
    return cmocka_run_group_tests_name("qa", tests, setup, teardown);
}
