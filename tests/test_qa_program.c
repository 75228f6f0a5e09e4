/* Tests of the QA of a drill program as a whole, and of the limits of the
 * survey, run and hole checks: each test plants one fault (or puts a value
 * just either side of a threshold) in an invented program built here, and
 * each would fail on the faulty code it guards against (a wrap forgotten, a
 * sign flipped, a comparison off by its equal case). The conventions of
 * oriented core (beta + 180 for a top-of-hole line or the up-hole end, 360
 * - beta for the other sense) are the project's geometry contract, common
 * practice; these and the other outside values are in docs/check-values.md
 * ("QA of a drill program"). */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/core.h"
#include "corax/qa.h"
#include "corax/stats.h"
#include "support/check.h"

enum { MAX_READINGS = 8000 };

typedef struct world {
    corax_program *prog;
    corax_qa_reading *r;
    size_t n;
    corax_findings found;
    uint64_t seed;
    char names[64][16];
    size_t nnames;
} world;

static world *world_new(void)
{
    world *w = calloc(1, sizeof *w);
    assert_non_null(w);
    w->prog = corax_program_new();
    w->r = calloc(MAX_READINGS, sizeof *w->r);
    assert_true(w->prog && w->r);
    w->seed = 2027;
    return w;
}

static void world_free(world *w)
{
    corax_findings_clear(&w->found);
    corax_program_free(w->prog);
    free(w->r);
    free(w);
}

static const char *keep_name(world *w, const char *name)
{
    snprintf(w->names[w->nnames], sizeof w->names[0], "%s", name);
    return w->names[w->nnames++];
}

/* A hole from its stations' depths, azimuths and dips (degrees, dip negative
 * down), the collar set up as given (no direction when collar_dip is NaN),
 * with `correction` degrees added to the station azimuths. */
static corax_hole *make_hole(const char *name, const double *depth, const double *azimuth,
                             const double *dip, size_t n, double collar_azimuth,
                             double collar_dip, double correction)
{
    corax_collar c = {.position = {1000, 2000, 300}, .azimuth = corax_rad(collar_azimuth),
                      .plunge = corax_rad(-collar_dip), .has_direction = !isnan(collar_dip),
                      .length = NAN};
    corax_station st[64];
    for (size_t i = 0; i < n; i++)
        st[i] = corax_station_make(depth[i], corax_rad(azimuth[i]), corax_rad(-dip[i]),
                                   (long)i + 2);
    corax_hole *h = NULL;
    corax_error err;
    assert_int_equal(corax_hole_new(name, &c, st, n, corax_rad(correction), &h, &err), CORAX_OK);
    return h;
}

/* A straight hole, a station every 30 m down to `length`, set up at the
 * collar (when `collar`) as it runs. */
static corax_hole *straight_hole(const char *name, double azimuth, double dip, double length,
                                 double correction, int collar)
{
    double depth[64], az[64], dp[64];
    size_t n = 0;
    for (double d = 0; d <= length && n < 64; d += 30, n++) {
        depth[n] = d;
        az[n] = azimuth;
        dp[n] = dip;
    }
    return make_hole(name, depth, az, dp, n, azimuth, collar ? dip : (double)NAN, correction);
}

/* The same, added to the program. */
static const corax_hole *straight(world *w, const char *name, double azimuth, double dip,
                                  double length, double correction, int collar)
{
    corax_hole *h = straight_hole(keep_name(w, name), azimuth, dip, length, correction, collar);
    assert_int_equal(corax_program_add(w->prog, h), CORAX_OK);
    return h;
}

/* A reading of a plane with the given normal, as logged in `truth` (the hole
 * as it really runs) at a depth, its beta then read `how` (bits: 2 for 360 -
 * beta, then 1 for beta + 180), put down against the hole of the program of
 * that name. */
static void log_plane(world *w, const char *hole, const corax_hole *truth, double depth,
                      corax_vec3 normal, const char *kind, int how)
{
    corax_hole_point pt;
    corax_core_frame f;
    corax_core_conventions c = {0, 0, 0, 0, 0};
    assert_int_equal(corax_hole_at(truth, depth, NULL, &pt), CORAX_OK);
    assert_int_equal(corax_core_frame_of(pt.tangent, &f), CORAX_OK);
    double alpha, beta;
    corax_core_plane_angles(&f, normal, &c, &alpha, &beta);
    if (how & 2)
        beta = 2 * CORAX_PI - beta;
    if (how & 1)
        beta += CORAX_PI;
    assert_true(w->n < MAX_READINGS);
    corax_qa_reading *r = &w->r[w->n];
    r->hole = hole;
    r->path = corax_program_find(w->prog, hole, strlen(hole));
    r->reading = corax_reading_empty();
    r->reading.depth = depth;
    r->reading.alpha = alpha;
    r->reading.beta = corax_wrap_azimuth(beta);
    r->kind = kind;
    r->confidence = "";
    r->file = "log.csv";
    r->line = (long)w->n + 2;
    r->problem = NULL;
    w->n++;
}

/* The invented geology: bedding 40/125 and foliation 75/250 (dip/dip
 * direction), each drawn about its mean with Fisher's kappa. */
static corax_vec3 draw(world *w, int foliation, double kappa)
{
    corax_plane p = foliation ? (corax_plane){corax_rad(75), corax_rad(250)}
                              : (corax_plane){corax_rad(40), corax_rad(125)};
    return corax_fisher_draw(corax_plane_normal(p), kappa, test_uniform(&w->seed),
                             test_uniform(&w->seed));
}

/* Both fabrics logged down a hole every `step` metres, alternately; beta read
 * `how` throughout. */
static void log_hole(world *w, const char *name, const corax_hole *truth, double step,
                     double length, double kappa, int how)
{
    int k = 0;
    for (double d = 5; d < length - 2; d += step, k++)
        log_plane(w, name, truth, d, draw(w, k % 2, kappa), k % 2 ? "foliation" : "bedding", how);
}

/* Holes all round the compass, plunging 45 to 65 degrees. */
static const double fan[8][2] = {{15, -50}, {60, -62}, {110, -47}, {150, -58},
                                 {200, -65}, {245, -45}, {290, -55}, {335, -60}};

/* The fan of holes, every one logged `how` (each hole's readings taken from
 * the hole itself). */
static void fan_program(world *w, double step, int how, int parallel)
{
    for (int i = 0; i < 8; i++) {
        char name[16];
        snprintf(name, sizeof name, "F%d", i + 1);
        double az = parallel ? 130 + 2 * i : fan[i][0], dip = parallel ? -60 + 0.5 * i : fan[i][1];
        const corax_hole *h = straight(w, name, az, dip, 240, 0, 1);
        log_hole(w, w->names[w->nnames - 1], h, step, 240, 60, how);
    }
}

static void run(world *w, const corax_convert_options *co, const corax_qa_options *o)
{
    assert_int_equal(corax_qa_surveys(w->prog, "surveys.csv", o, &w->found), CORAX_OK);
    if (w->n) {
        corax_qa_log *log = test_qa_log(w->r, w->n);
        assert_int_equal(corax_qa_readings(w->prog, log, NULL, 0, co, o, &w->found), CORAX_OK);
        corax_qa_log_free(log);
    }
}

static void run_default(world *w)
{
    corax_convert_options co = corax_convert_options_default();
    corax_qa_options o = corax_qa_options_default();
    run(w, &co, &o);
}

/* The finding of a check (hole NULL: program-wide) with `words` in it. */
static const corax_finding *find(const world *w, const char *hole, const char *check,
                                 const char *words)
{
    for (size_t i = 0; i < w->found.count; i++) {
        const corax_finding *f = &w->found.item[i];
        if (strcmp(f->hole, hole ? hole : "") == 0 && strcmp(f->check, check) == 0 &&
            (!words || strstr(f->message, words)))
            return f;
    }
    return NULL;
}

static void show(const world *w)
{
    for (size_t i = 0; i < w->found.count; i++)
        print_message("  %s %s %s %g-%g: %s\n", w->found.item[i].hole,
                      corax_severity_name(w->found.item[i].severity), w->found.item[i].check,
                      w->found.item[i].depth, w->found.item[i].depth_to,
                      w->found.item[i].message);
}

static const corax_finding *expect(const world *w, const char *hole, const char *check,
                                   const char *words)
{
    const corax_finding *f = find(w, hole, check, words);
    if (!f) {
        show(w);
        fail_msg("expected %s %s (%s)", hole ? hole : "(program)", check, words ? words : "");
    }
    return f;
}

static void expect_none(const world *w, const char *hole, const char *check)
{
    const corax_finding *f = find(w, hole, check, NULL);
    if (f) {
        show(w);
        fail_msg("unexpected %s %s: %s", hole ? hole : "(program)", check, f->message);
    }
}

static size_t warnings(const world *w)
{
    return corax_findings_count(&w->found, CORAX_WARNING);
}

/* ---- the survey checks at their limits ---- */

/* A hole crossing north, 358 to 002, turns 4 degrees: not magnetic (the
 * turn is taken the short way round); 357 to 003 turns 6, which is. */
static void test_magnetic_check_wraps_north(void **state)
{
    (void)state;
    world *w = world_new();
    const double depth[] = {0, 30, 60, 90}, dip[] = {-60, -60, -60, -60};
    const double quiet[] = {356, 358, 2, 4}, loud[] = {354, 357, 3, 5};
    assert_int_equal(corax_program_add(w->prog, make_hole("N1", depth, quiet, dip, 4, 356, NAN, 0)),
                     CORAX_OK);
    assert_int_equal(corax_program_add(w->prog, make_hole("N2", depth, loud, dip, 4, 354, NAN, 0)),
                     CORAX_OK);
    run_default(w);
    expect_none(w, "N1", "survey-magnetic");
    const corax_finding *f = expect(w, "N2", "survey-magnetic", "turns 6.0 degrees");
    assert_close(f->depth, 30, 0, 1e-9, "the turn from 30 to 60 m");
    world_free(w);
}

/* The collar against its first station: 359 against 001 is 2 degrees of
 * azimuth, across north, and no mismatch; 355/-60 against 355/-68 differs in
 * dip alone by 8 degrees, and is one. */
static void test_collar_check_across_north_and_in_dip(void **state)
{
    (void)state;
    world *w = world_new();
    const double depth[] = {0, 30}, north[] = {1, 1}, dip[] = {-60, -60}, steeper[] = {-68, -68};
    const double same[] = {355, 355};
    assert_int_equal(corax_program_add(w->prog, make_hole("C1", depth, north, dip, 2, 359, -60, 0)),
                     CORAX_OK);
    assert_int_equal(
        corax_program_add(w->prog, make_hole("C2", depth, same, steeper, 2, 355, -60, 0)),
        CORAX_OK);
    run_default(w);
    expect_none(w, "C1", "collar-vs-survey");
    expect(w, "C2", "collar-vs-survey", "8.0 degrees apart");
    world_free(w);
}

/* An up-hole plunging 80 degrees (dip +80) is as steep for a gravity mark
 * as a down-hole one; 70 is the limit (common practice, the geometry
 * guide). */
static void test_steep_up_hole(void **state)
{
    (void)state;
    world *w = world_new();
    straight(w, "U1", 40, 80, 60, 0, 1);
    straight(w, "U2", 40, 69, 60, 0, 1);
    run_default(w);
    expect(w, "U1", "steep-hole", "plunges 80.0 to 80.0 degrees");
    expect_none(w, "U2", "steep-hole");
    world_free(w);
}

/* Values just either side of the gap (60 m; equal is within) and dogleg (3
 * degrees per 30 m, common practice: 5.9 and 6.1 degrees over 60 m)
 * thresholds. */
static void test_gap_and_dogleg_thresholds(void **state)
{
    (void)state;
    world *w = world_new();
    const double at60[] = {0, 60}, at60_5[] = {0, 60.5}, az[] = {90, 90}, dip[] = {-60, -60};
    const double under[] = {-60, -65.9}, over[] = {-60, -66.1}, depth60[] = {0, 60};
    assert_int_equal(corax_program_add(w->prog, make_hole("G1", at60, az, dip, 2, 90, NAN, 0)),
                     CORAX_OK);
    assert_int_equal(corax_program_add(w->prog, make_hole("G2", at60_5, az, dip, 2, 90, NAN, 0)),
                     CORAX_OK);
    assert_int_equal(corax_program_add(w->prog, make_hole("D1", depth60, az, under, 2, 90, NAN, 0)),
                     CORAX_OK);
    assert_int_equal(corax_program_add(w->prog, make_hole("D2", depth60, az, over, 2, 90, NAN, 0)),
                     CORAX_OK);
    run_default(w);
    expect_none(w, "G1", "survey-gap");
    expect(w, "G2", "survey-gap", "60.5 m apart (more than 60)");
    expect_none(w, "D1", "dogleg");
    const corax_finding *f = expect(w, "D2", "dogleg", "(limit 3.0)");
    double severity;
    assert_int_equal(sscanf(f->message, "dogleg severity %lf", &severity), 1);
    assert_close(severity, 3.05, 0, 0.051, "6.1 degrees over 60 m");
    world_free(w);
}

/* ---- an azimuth offset the holes share ---- */

/* Surveys whose first stations sit `shift` (and 0.1 or 0.2 more) from the
 * collars in seven holes of eight, the eighth set up 40 degrees off. */
static void offset_program(world *w, double shift)
{
    for (int i = 0; i < 8; i++) {
        char name[16];
        snprintf(name, sizeof name, "S%d", i + 1);
        double az = fan[i][0], off = i == 7 ? 40 : shift + 0.1 * (i % 3);
        const double depth[] = {0, 30, 60}, a[] = {az + off, az + off, az + off},
                     dip[] = {fan[i][1], fan[i][1], fan[i][1]};
        corax_hole *h = make_hole(keep_name(w, name), depth, a, dip, 3, az, fan[i][1], 0);
        assert_int_equal(corax_program_add(w->prog, h), CORAX_OK);
    }
}

/* The offset, its spread and its likely cause, which depends on the
 * correction the surveys got (a magnetic azimuth plus an east declination is
 * the true azimuth: common practice). The offsets are shift + 0, 0.1, 0.2,
 * 0, 0.1, 0.2, 0: mean shift + 0.086, spread 0.09. */
static void test_shared_azimuth_offset(void **state)
{
    (void)state;
    static const struct {
        double shift, applied;
        const char *sits, *cause;
    } cases[] = {
        {-7.0, 0.0, "sit 6.9 +- 0.1 degrees west", "not applied? (6.9 degrees east would bring"},
        {6.0, 6.0, "sit 6.1 +- 0.1 degrees east", "the correction of +6.0 applied to surveys "
                                                   "that already read true or grid north"},
        {12.0, 6.0, "sit 12.1 +- 0.1 degrees east", "the correction of +6.0 applied with the "
                                                     "wrong sign?"},
        {-3.0, 5.0, "sit 2.9 +- 0.1 degrees west", "a correction of +7.9 rather than the +5.0 "
                                                    "applied"},
    };
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        world *w = world_new();
        offset_program(w, cases[k].shift);
        corax_convert_options co = corax_convert_options_default();
        corax_qa_options o = corax_qa_options_default();
        o.azimuth_correction = corax_rad(cases[k].applied);
        run(w, &co, &o);
        const corax_finding *f = expect(w, NULL, "azimuth-offset", cases[k].cause);
        assert_non_null(strstr(f->message, cases[k].sits));
        assert_non_null(strstr(f->message, "of the collar set-ups in 7 of 8 holes (all but S8)"));
        assert_int_equal(f->severity, CORAX_WARNING);
        /* the hole set up badly is still told, the shared offset taken out;
         * the others are not */
        expect(w, "S8", "collar-vs-survey", "once the offset most holes share");
        for (int i = 0; i < 7; i++)
            expect_none(w, w->names[i], "collar-vs-survey");
        world_free(w);
    }
}

/* Three holes of eight whose surveys sit 20 degrees west of their collars,
 * the rest none: a correction missing in their surveys alone. */
static void test_group_azimuth_offset(void **state)
{
    (void)state;
    world *w = world_new();
    for (int i = 0; i < 8; i++) {
        char name[16];
        snprintf(name, sizeof name, "S%d", i + 1);
        double az = fan[i][0], off = i % 3 == 1 ? -20 : 0.1 * (i % 2);
        const double depth[] = {0, 30}, a[] = {az + off, az + off}, dip[] = {fan[i][1], fan[i][1]};
        assert_int_equal(corax_program_add(w->prog, make_hole(keep_name(w, name), depth, a, dip,
                                                               2, az, fan[i][1], 0)),
                         CORAX_OK);
    }
    run_default(w);
    expect(w, NULL, "azimuth-offset", "the survey azimuths of 3 holes (S2, S5 and S8) sit 20.0");
    world_free(w);
}

/* A clean program shares no offset. */
static void test_no_offset_no_finding(void **state)
{
    (void)state;
    world *w = world_new();
    offset_program(w, 0.0);
    run_default(w);
    expect_none(w, NULL, "azimuth-offset");
    world_free(w);
}

/* ---- the program-wide convention test ---- */

/* Eight holes in as many directions, logged against a top-of-hole line, or
 * anticlockwise, or both, and converted as stated (the defaults): the test
 * names the reading that fits, with the kappas. */
static void test_conventions_found(void **state)
{
    (void)state;
    static const struct {
        int how;
        const char *words;
    } cases[] = {
        {1, "as if the orientation line marked the top of the hole (or beta ran to the up-hole "
            "end of the ellipse): read that way"},
        {2, "as if beta was measured anticlockwise looking down the hole: read that way"},
        {3, "marked the top of the hole (or beta ran to the up-hole end of the ellipse), and "
            "beta was measured anticlockwise"},
    };
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        world *w = world_new();
        fan_program(w, 3.0, cases[k].how, 0);
        run_default(w);
        const corax_finding *f = expect(w, NULL, "program-conventions", cases[k].words);
        assert_int_equal(f->severity, CORAX_WARNING);
        /* the kappas: read that way well clustered, as stated scattered */
        double better, worse;
        const char *p = strstr(f->message, "with kappa ");
        assert_non_null(p);
        assert_int_equal(sscanf(p, "with kappa %lf", &better), 1);
        p = strstr(f->message, "against ");
        assert_non_null(p);
        assert_int_equal(sscanf(p, "against %lf", &worse), 1);
        assert_true(better > 20 && worse < 10);
        assert_non_null(strstr(f->message, "decided most by F"));
        /* read that way, the holes agree: no hole is turned against the rest */
        for (size_t i = 0; i < w->found.count; i++)
            if (strcmp(w->found.item[i].check, "hole-turned") == 0)
                fail_msg("a hole turned once the program is read the right way: %s",
                         w->found.item[i].message);
        world_free(w);
    }
}

/* Stated conventions of their own (a top-of-hole line) for a log taken
 * against the bottom line: the finding names the bottom. */
static void test_conventions_relative_to_stated(void **state)
{
    (void)state;
    world *w = world_new();
    fan_program(w, 3.0, 0, 0);
    corax_convert_options co = corax_convert_options_default();
    co.conventions.top_reference = 1;
    corax_qa_options o = corax_qa_options_default();
    run(w, &co, &o);
    expect(w, NULL, "program-conventions", "as if the orientation line marked the bottom");
    world_free(w);
}

/* Logged as stated: nothing to say. */
static void test_conventions_clean(void **state)
{
    (void)state;
    world *w = world_new();
    fan_program(w, 3.0, 0, 0);
    run_default(w);
    if (warnings(w)) {
        show(w);
        fail_msg("a clean program raised %zu warnings", warnings(w));
    }
    expect_none(w, NULL, "program-conventions");
    world_free(w);
}

/* Holes nearly parallel cannot tell: the test says so, and names them. */
static void test_conventions_cannot_tell(void **state)
{
    (void)state;
    world *w = world_new();
    fan_program(w, 3.0, 1, 1);
    run_default(w);
    const corax_finding *f =
        expect(w, NULL, "program-conventions", "cannot tell whether its conventions are right");
    assert_int_equal(f->severity, CORAX_NOTE);
    assert_non_null(strstr(f->message, "its 8 holes with fabric readings (F1, F2, F3, F4 and 4 "
                                       "more) run within"));
    world_free(w);
}

/* ---- holes against the rest ---- */

/* The fan of eight holes, dense and clean, but for holes logged from a path
 * of their own: `shift` degrees added to the survey azimuths of holes
 * `first` and `second` (-1: none), or their beta read `how`. */
static void fan_with(world *w, int first, int second, double shift, int how)
{
    for (int i = 0; i < 8; i++) {
        char name[16];
        snprintf(name, sizeof name, "T%d", i + 1);
        int odd = i == first || i == second;
        straight(w, name, fan[i][0], fan[i][1], 240, odd ? shift : 0, 0);
        corax_hole *truth = straight_hole(name, fan[i][0], fan[i][1], 240, 0, 0);
        log_hole(w, w->names[w->nnames - 1], truth, 3.0, 240, 60, odd ? how : 0);
        corax_hole_free(truth);
    }
}

/* A hole whose surveys read 25 degrees east of true (every structure of it
 * turned 25 degrees clockwise) fits the rest best turned 25 anticlockwise,
 * seen from above. */
static void test_turn_about_the_vertical_has_its_sense(void **state)
{
    (void)state;
    world *w = world_new();
    fan_with(w, 5, -1, 25, 0);
    run_default(w);
    const corax_finding *f = expect(w, "T6", "hole-turned", "degrees anticlockwise about the "
                                                            "vertical (seen from above)");
    double angle;
    assert_int_equal(sscanf(strstr(f->message, "best turned ") + 12, "%lf", &angle), 1);
    assert_close(angle, 25, 0, 3, "the 25 degrees added to the surveys, undone");
    for (int i = 0; i < 8; i++)
        if (i != 5)
            expect_none(w, w->names[i], "hole-turned");
    expect_none(w, NULL, "holes-turned-alike");
    world_free(w);
}

/* Two holes turned alike about the vertical are one correction missed in
 * both. */
static void test_holes_turned_alike(void **state)
{
    (void)state;
    world *w = world_new();
    fan_with(w, 1, 5, 25, 0);
    run_default(w);
    expect(w, "T2", "hole-turned", "anticlockwise about the vertical");
    expect(w, "T6", "hole-turned", "anticlockwise about the vertical");
    const corax_finding *f = expect(w, NULL, "holes-turned-alike", "2 holes (T2 and T6)");
    assert_non_null(strstr(f->message, "degrees anticlockwise about the vertical"));
    world_free(w);
}

/* A hole logged with beta the other way round, no turn besides: the
 * message reads "360 - beta", never a turn of 360 degrees. */
static void test_mirrored_hole_wording(void **state)
{
    (void)state;
    world *w = world_new();
    fan_with(w, 3, -1, 0, 2);
    run_default(w);
    const corax_finding *f = expect(w, "T4", "hole-turned", "with beta mirrored (read as ");
    double at;
    assert_int_equal(sscanf(strstr(f->message, "read as ") + 8, "%lf", &at), 1);
    assert_true(at > 0 && at <= 360);
    assert_close(fmod(at + 180, 360), 180, 0, 6, "no turn besides the mirror: 360 - beta");
    assert_null(strstr(f->message, "360 degrees"));
    assert_null(strstr(f->message, "turned by"));
    expect_none(w, NULL, "program-conventions");
    world_free(w);
}

/* A correct hole that logs one fabric only, folded 20 degrees from the
 * rest of the program: a turn of the hole could always bring one fabric
 * onto the rest, so no turn is claimed. */
static void test_one_folded_fabric_is_no_turn(void **state)
{
    (void)state;
    world *w = world_new();
    fan_with(w, -1, -1, 0, 0);
    const corax_hole *h = straight(w, "K1", 150, -58, 240, 0, 0);
    corax_plane folded = {corax_rad(40), corax_rad(145)};
    for (double d = 5; d < 238; d += 3)
        log_plane(w, "K1", h, d,
                  corax_fisher_draw(corax_plane_normal(folded), 60, test_uniform(&w->seed),
                                    test_uniform(&w->seed)),
                  "bedding", 0);
    run_default(w);
    expect_none(w, "K1", "hole-turned");
    world_free(w);
}

/* A hole scattering just over twice the typical spread is told, one just
 * under is not: every hole's bedding on a cone about one pole, the median
 * angle from its axis exactly the cone's. */
static void test_spread_threshold(void **state)
{
    (void)state;
    world *w = world_new();
    const double cone[5] = {5, 5, 5, 9.8, 10.2};
    corax_vec3 p = corax_plane_normal((corax_plane){corax_rad(40), corax_rad(125)});
    corax_vec3 a = {p.y, -p.x, 0}; /* horizontal, square to the pole */
    double na = sqrt(a.x * a.x + a.y * a.y);
    a = (corax_vec3){a.x / na, a.y / na, 0};
    corax_vec3 b = {p.y * a.z - p.z * a.y, p.z * a.x - p.x * a.z, p.x * a.y - p.y * a.x};
    for (int i = 0; i < 5; i++) {
        char name[16];
        snprintf(name, sizeof name, "W%d", i + 1);
        const corax_hole *h = straight(w, name, fan[i][0], fan[i][1], 150, 0, 0);
        double s = corax_rad(cone[i]);
        for (int j = 0; j < 12; j++) {
            double phi = j * CORAX_PI / 6;
            corax_vec3 n = {cos(s) * p.x + sin(s) * (cos(phi) * a.x + sin(phi) * b.x),
                            cos(s) * p.y + sin(s) * (cos(phi) * a.y + sin(phi) * b.y),
                            cos(s) * p.z + sin(s) * (cos(phi) * a.z + sin(phi) * b.z)};
            log_plane(w, w->names[w->nnames - 1], h, 10 + 10 * j, n, "bedding", 0);
        }
    }
    run_default(w);
    expect_none(w, "W4", "hole-spread");
    const corax_finding *f = expect(w, "W5", "hole-spread", "scatters 10 degrees");
    assert_non_null(strstr(f->message, "against 5 in a typical hole"));
    world_free(w);
}

/* ---- runs inferred in sparse logging ---- */

/* A sparsely logged hole (a reading every 5 m, bedding and foliation in
 * turn) with beta read `how` at the depths given, and readings of no kind
 * (which no run check weighs) at the fill depths. */
static void sparse_hole(world *w, const char *name, const double *slip, size_t nslip, int how,
                        const double *fill, size_t nfill, const double *extra, size_t nextra)
{
    const corax_hole *h = straight(w, name, fan[0][0], fan[0][1], 240, 0, 0);
    const char *hole = w->names[w->nnames - 1];
    double depth[80];
    size_t n = 0;
    for (double d = 5; d < 236; d += 5) {
        int skip = 0;
        for (size_t k = 0; k < nfill; k++)
            skip |= fabs(d - fill[k]) < 1e-9;
        if (!skip)
            depth[n++] = d;
    }
    for (size_t k = 0; k < nextra; k++)
        depth[n++] = extra[k];
    for (size_t j = 0; j < n; j++) {
        int slipped = 0;
        for (size_t k = 0; k < nslip; k++)
            slipped |= fabs(depth[j] - slip[k]) < 1e-9;
        int fol = (int)llround(depth[j] / 5) % 2;
        log_plane(w, hole, h, depth[j], draw(w, fol, 200), fol ? "foliation" : "bedding",
                  slipped ? how : 0);
    }
    corax_vec3 any = {0, 0, 1};
    for (size_t k = 0; k < nfill; k++)
        log_plane(w, hole, h, fill[k], any, "", 0);
}

/* Two readings in a row on the wrong side, in sparse logging and with the
 * default options, are one run from the first to the last: 100 and 105 m.
 * Two more 15 m apart (the longest gap a run spans in logging 5 m apart:
 * three readings' worth) are one run too; 15.5 m apart they are not. */
static void test_sparse_runs_and_their_ends(void **state)
{
    (void)state;
    world *w = world_new();
    fan_with(w, -1, -1, 0, 0);
    const double pair[] = {100, 105}, spanned[] = {100, 115}, fill[] = {105, 110};
    const double apart[] = {100, 115.5}, fill2[] = {105, 110, 115}, extra[] = {115.5};
    sparse_hole(w, "R1", pair, 2, 1, NULL, 0, NULL, 0);
    sparse_hole(w, "R2", spanned, 2, 1, fill, 2, NULL, 0);
    sparse_hole(w, "R3", apart, 2, 1, fill2, 3, extra, 1);
    sparse_hole(w, "R4", pair, 2, 2, NULL, 0, NULL, 0);
    run_default(w);
    const corax_finding *f = expect(w, "R1", "run-disagrees", "adding 180 to beta");
    assert_close(f->depth, 100, 0, 1e-9, "the run begins at its first reading");
    assert_close(f->depth_to, 105, 0, 1e-9, "the run ends at its last reading");
    assert_non_null(strstr(f->message, "2 readings in a row from 100.0 to 105.0 m"));
    f = expect(w, "R2", "run-disagrees", "adding 180 to beta");
    assert_close(f->depth_to, 115, 0, 1e-9, "a gap of 15 m is spanned");
    expect_none(w, "R3", "run-disagrees");
    expect(w, "R4", "run-disagrees", "mirroring beta");
    for (int i = 0; i < 8; i++)
        expect_none(w, w->names[i], "run-disagrees");
    world_free(w);
}

/* The runs inferred for the tallies begin at a reading and take in those
 * less than a barrel (3 m) below it: a reading without beta exactly 3 m
 * below one with a beta is a run of its own, 2.99 m below it is in the
 * same oriented run. */
static void test_tally_runs_end_at_a_barrel(void **state)
{
    (void)state;
    world *w = world_new();
    for (int k = 0; k < 2; k++) {
        const corax_hole *h = straight(w, k ? "B2" : "B1", 90, -60, 60, 0, 0);
        const char *name = w->names[w->nnames - 1];
        log_plane(w, name, h, 10, corax_plane_normal((corax_plane){corax_rad(40), 0}), "bedding", 0);
        log_plane(w, name, h, k ? 12.99 : 13, corax_plane_normal((corax_plane){corax_rad(40), 0}),
                  "bedding", 0);
        w->r[w->n - 1].reading.beta = NAN;
    }
    run_default(w);
    expect_none(w, "B1", "unoriented-in-run");
    expect(w, "B2", "unoriented-in-run", "between 10.0 and 13.0 m");
    world_free(w);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_magnetic_check_wraps_north),
        cmocka_unit_test(test_collar_check_across_north_and_in_dip),
        cmocka_unit_test(test_steep_up_hole),
        cmocka_unit_test(test_gap_and_dogleg_thresholds),
        cmocka_unit_test(test_shared_azimuth_offset),
        cmocka_unit_test(test_group_azimuth_offset),
        cmocka_unit_test(test_no_offset_no_finding),
        cmocka_unit_test(test_conventions_found),
        cmocka_unit_test(test_conventions_relative_to_stated),
        cmocka_unit_test(test_conventions_clean),
        cmocka_unit_test(test_conventions_cannot_tell),
        cmocka_unit_test(test_turn_about_the_vertical_has_its_sense),
        cmocka_unit_test(test_holes_turned_alike),
        cmocka_unit_test(test_mirrored_hole_wording),
        cmocka_unit_test(test_one_folded_fabric_is_no_turn),
        cmocka_unit_test(test_spread_threshold),
        cmocka_unit_test(test_sparse_runs_and_their_ends),
        cmocka_unit_test(test_tally_runs_end_at_a_barrel),
    };
    return cmocka_run_group_tests_name("qa_program", tests, NULL, NULL);
}
