/* Tests of drill planning: the angles a planned hole would show, Terzaghi's
 * sampled fraction, pierce points against an independent line-plane
 * intersection and against the minimum-curvature path, the best direction of
 * a sweep, and the bad inputs a plan can hold. Every outside value is in
 * docs/check-values.md ("Drill planning" and "Sampling bias"). */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/plan.h"
#include "corax/plan_load.h"
#include "corax/stats.h"
#include "support/check.h"

static corax_convert_options defaults(void) { return corax_convert_options_default(); }

/* The unit vector down a hole of azimuth and dip (negative down), degrees,
 * written out here rather than taken from the library. */
static corax_vec3 hole_dir(double az, double dip)
{
    double a = az * CORAX_PI / 180, p = -dip * CORAX_PI / 180;
    return (corax_vec3){sin(a) * cos(p), cos(a) * cos(p), -sin(p)};
}

/* The upward unit normal of a plane of dip and dip direction, degrees. */
static corax_vec3 plane_normal(double dip, double dd)
{
    double d = dip * CORAX_PI / 180, a = dd * CORAX_PI / 180;
    return (corax_vec3){sin(d) * sin(a), sin(d) * cos(a), cos(d)};
}

static double dot(corax_vec3 a, corax_vec3 b) { return a.x * b.x + a.y * b.y + a.z * b.z; }

static double angle_deg(corax_vec3 a, corax_vec3 b)
{
    double c = fabs(dot(a, b)) / sqrt(dot(a, a) * dot(b, b)); /* axial */
    return acos(fmin(1.0, c)) * 180 / CORAX_PI;
}

static corax_plan_hole straight(const char *name, double az, double dip, double length)
{
    corax_plan_hole h = {name, {1000, 2000, 300}, corax_rad(az), corax_rad(-dip), length, 0, 0, 1};
    return h;
}

static corax_plan_set set_of(const char *name, double dip, double dd, double kappa, double weight)
{
    corax_plan_set s = {name, {corax_rad(dip), corax_rad(dd)}, kappa, weight, 1};
    return s;
}

static corax_hole *path_of(const corax_plan_hole *plan)
{
    corax_hole *h = NULL;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_plan_path(plan, &h, &err), CORAX_OK);
    return h;
}

static corax_plan_model *model_of(const corax_plan_set *sets, size_t n)
{
    corax_plan_model *m = NULL;
    corax_convert_options o = defaults();
    assert_int_equal(corax_plan_model_new(sets, n, &o, &m), CORAX_OK);
    return m;
}

/* Common practice (the inverse of the alpha construction; docs/check-values.md,
 * "Drill planning"): a plane of unit normal n shows alpha = asin |n.t| in a
 * hole along t. A table of cases, through corax_plan_angles and through the
 * sampling of a straight planned hole (a set without spread). */
static void test_expected_alpha_is_asin_n_dot_t(void **state)
{
    (void)state;
    static const double cases[][4] = {
        /* hole azimuth, hole dip, plane dip, plane dip direction */
        {0, -60, 30, 0},   {0, -60, 64.34, 253.90}, {90, -45, 60, 215.26}, {305, -65, 73, 145},
        {136, -55, 39, 201}, {200, -70, 29.79, 108.77}, {45, 20, 57.92, 14.27},
        {135, -30, 62.48, 185.37}, {10, -89, 5, 300},  {270, -5, 88, 90},
    };
    corax_convert_options o = defaults();
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        const double *c = cases[k];
        corax_vec3 t = hole_dir(c[0], c[1]), n = plane_normal(c[2], c[3]);
        double want = asin(fabs(dot(n, t)));
        double alpha, beta;
        corax_plan_angles(t, n, &o, &alpha, &beta);
        assert_close(alpha, want, 0, 1e-12, "alpha = asin |n.t| (common practice)");
        corax_plan_set s = set_of("s", c[2], c[3], NAN, 1);
        corax_plan_model *m = model_of(&s, 1);
        corax_plan_hole plan = straight("H", c[0], c[1], 250);
        corax_hole *h = path_of(&plan);
        corax_plan_sampling out;
        assert_int_equal(corax_plan_sample(m, h, &out), CORAX_OK);
        assert_close(out.alpha, want, 0, 1e-12, "expected alpha on a straight plan = asin |n.t|");
        assert_close(out.alpha_sd, 0, 0, 1e-12, "no spread, straight hole: no alpha sd");
        assert_close(out.factor, fabs(dot(n, t)), 0, 1e-12, "Terzaghi factor = |n.t|");
        corax_hole_free(h);
        corax_plan_model_free(m);
    }
}

/* Hudson & Harrison (1997), Engineering Rock Mechanics, Appendix 6: hole
 * 305/65, plane 145/73: alpha 40.15 (derived; docs/check-values.md). The
 * geometry contract's picture: hole 000/-60 shows a plane 64.34/253.90 at
 * alpha 30, beta 90 (derived, docs/check-values.md). */
static void test_expected_angles_published(void **state)
{
    (void)state;
    corax_convert_options o = defaults();
    double alpha, beta;
    corax_plan_angles(hole_dir(305, -65), plane_normal(73, 145), &o, &alpha, &beta);
    assert_close(corax_deg(alpha), 40.15, 0, 0.005, "Hudson & Harrison (1997) App. 6 alpha");
    corax_plan_set s = set_of("s", 64.34, 253.90, NAN, 1);
    corax_plan_model *m = model_of(&s, 1);
    corax_plan_hole plan = straight("H", 0, -60, 100);
    corax_hole *h = path_of(&plan);
    corax_plan_sampling out;
    assert_int_equal(corax_plan_sample(m, h, &out), CORAX_OK);
    assert_close(corax_deg(out.alpha), 30, 0, 0.005, "expected alpha (geometry contract)");
    assert_close(corax_deg(out.beta), 90, 0, 0.01, "expected beta (geometry contract)");
    assert_int_equal(out.status, CORAX_PLAN_OK);
    corax_hole_free(h);
    corax_plan_model_free(m);
}

/* Harrison & Hudson (2000), Engineering Rock Mechanics Part 2, Q7.10: hole
 * 136/55; fractures 201/39, 213/50, 215/63, 230/52, 247/42, 253/28 (dip
 * direction/dip): published |cos delta| 0.484, 0.428, 0.274, 0.536, 0.746,
 * 0.846 and Terzaghi (1965) weights 2.066, 2.338, 3.645, 1.866, 1.340, 1.183
 * (docs/check-values.md, "Sampling bias"). The factor is |cos delta| = 1 /
 * weight: the planes a hole crosses relative to a hole square to them. */
static void test_terzaghi_factor_harrison_hudson_q7_10(void **state)
{
    (void)state;
    static const double planes[6][2] = {{201, 39}, {213, 50}, {215, 63},
                                        {230, 52}, {247, 42}, {253, 28}};
    static const double cosd[6] = {0.484, 0.428, 0.274, 0.536, 0.746, 0.846};
    static const double weight[6] = {2.066, 2.338, 3.645, 1.866, 1.340, 1.183};
    corax_plan_set sets[6];
    for (int i = 0; i < 6; i++)
        sets[i] = set_of("f", planes[i][1], planes[i][0], NAN, 1);
    corax_plan_model *m = model_of(sets, 6);
    corax_plan_hole plan = straight("Q7.10", 136, -55, 30);
    corax_hole *h = path_of(&plan);
    corax_plan_sampling out[6];
    assert_int_equal(corax_plan_sample(m, h, out), CORAX_OK);
    for (int i = 0; i < 6; i++) {
        assert_close(out[i].factor, cosd[i], 0, 5e-4, "factor = |cos delta| (Harrison & Hudson Q7.10)");
        assert_close(1 / out[i].factor, weight[i], 0, 2e-3,
                     "1 / factor = Terzaghi weight (Harrison & Hudson Q7.10)");
        assert_close(out[i].factor, 1 / corax_terzaghi_weight(corax_plane_normal(sets[i].plane),
                                                              hole_dir(136, -55), 0.0),
                     1e-12, 0, "the same count as the stereonet's Terzaghi weights");
    }
    corax_hole_free(h);
    corax_plan_model_free(m);
}

/* A set with a Fisher spread. Along the mean pole the hole crosses, per metre,
 * E|cos theta| = coth kappa - 1/kappa of the planes (derived from Fisher's
 * 1953 density: docs/check-values.md, "Drill planning"), which is the factor's
 * reference, so the factor there is 1; away from the pole the factor, the
 * crossing-weighted mean alpha and its spread agree with a Monte Carlo of
 * Fisher draws (Wood 1994) counted the same way. (Unweighted, the mean alpha
 * of these draws is 0.6 to 4.4 degrees lower: the check tells them apart.) */
static void test_spread_against_monte_carlo(void **state)
{
    (void)state;
    const double kappa = 20;
    corax_plan_set s = set_of("s", 50, 120, kappa, 1);
    corax_plan_model *m = model_of(&s, 1);
    corax_vec3 pole = corax_plane_normal(s.plane);
    double pt, pp;
    corax_line_trend_plunge(pole, &pt, &pp);
    corax_plan_hole along = straight("P", corax_deg(pt), -corax_deg(pp), 100);
    corax_hole *h = path_of(&along);
    corax_plan_sampling out;
    assert_int_equal(corax_plan_sample(m, h, &out), CORAX_OK);
    assert_close(out.factor, 1, 0, 1e-9, "along the mean pole the factor is 1");
    corax_hole_free(h);
    /* away from the pole, against draws */
    static const double holes[][2] = {{0, -60}, {300, -30}, {200, -80}, {90, -10}};
    uint64_t seed = 15;
    enum { DRAWS = 200000 };
    double along_pole = 0;
    corax_vec3 t0 = hole_dir(corax_deg(pt), -corax_deg(pp));
    for (int k = 0; k < DRAWS; k++) {
        double u1 = test_uniform(&seed), u2 = test_uniform(&seed);
        along_pole += fabs(dot(corax_fisher_draw(pole, kappa, u1, u2), t0)) / DRAWS;
    }
    assert_close(along_pole, 1 / tanh(kappa) - 1 / kappa, 0, 2e-3,
                 "E|cos theta| = coth k - 1/k (Fisher 1953 density, derived)");
    for (size_t j = 0; j < sizeof holes / sizeof holes[0]; j++) {
        corax_vec3 t = hole_dir(holes[j][0], holes[j][1]);
        double f = 0, a = 0, a2 = 0;
        for (int k = 0; k < DRAWS; k++) {
            double u1 = test_uniform(&seed), u2 = test_uniform(&seed);
            double c = fabs(dot(corax_fisher_draw(pole, kappa, u1, u2), t));
            double alpha = asin(fmin(1, c));
            f += c;
            a += c * alpha;
            a2 += c * alpha * alpha;
        }
        double mean = a / f, sd = sqrt(a2 / f - mean * mean);
        corax_plan_hole plan = straight("H", holes[j][0], holes[j][1], 100);
        h = path_of(&plan);
        assert_int_equal(corax_plan_sample(m, h, &out), CORAX_OK);
        assert_close(out.factor, f / DRAWS / (1 / tanh(kappa) - 1 / kappa), 0, 5e-3,
                     "factor against Fisher draws (Wood 1994)");
        assert_close(corax_deg(out.alpha), corax_deg(mean), 0, 0.15,
                     "crossing-weighted alpha against Fisher draws");
        assert_close(corax_deg(out.alpha_sd), corax_deg(sd), 0, 0.15,
                     "crossing-weighted alpha sd against Fisher draws");
        corax_hole_free(h);
    }
    corax_plan_model_free(m);
}

/* Wood (1994), the exact inverse for three dimensions: kappa 10, U 0.5 gives
 * w = 0.9306853, 21.458 degrees from the mean (derived; docs/check-values.md).
 * So the cone of 21.458 degrees holds half of a Fisher spread of kappa 10. */
static void test_kappa_of_cone_wood(void **state)
{
    (void)state;
    assert_close(corax_plan_kappa_of_cone(acos(0.9306853), 0.5), 10, 1e-5, 0,
                 "the kappa whose half lies within 21.458 degrees (Wood 1994)");
    assert_close(corax_plan_kappa_of_cone(acos(0.9861371), 0.5), 50, 1e-5, 0,
                 "kappa 50 (Wood 1994)");
    for (double k = 0.5; k < 5000; k *= 3.7) { /* round trip through the cone of 95% */
        double cone = acos(corax_fisher_cosine(k, 0.05));
        assert_close(corax_plan_kappa_of_cone(cone, 0.95), k, 1e-8, 0, "cone95 round trip");
    }
    assert_true(isnan(corax_plan_kappa_of_cone(corax_rad(170), 0.95))); /* no such spread */
}

/* The statuses of corax_plan_angles, at the thresholds the conversion uses. */
static void test_angles_statuses(void **state)
{
    (void)state;
    corax_convert_options o = defaults();
    double alpha, beta;
    /* a plane containing the hole (derived: the plane 60/000 contains 000/-60) */
    assert_int_equal(corax_plan_angles(hole_dir(0, -60), plane_normal(60, 0), &o, &alpha, &beta),
                     CORAX_PLAN_PARALLEL);
    assert_close(alpha, 0, 0, 1e-12, "a plane along the hole: alpha 0");
    assert_true(isnan(beta)); /* beta undefined, not 0 */
    assert_int_equal(corax_plan_angles(hole_dir(0, -60), plane_normal(80, 90), &o, &alpha, &beta),
                     CORAX_PLAN_NEAR_PARALLEL);
    assert_false(isnan(beta));
    assert_int_equal(corax_plan_angles(hole_dir(0, -90), plane_normal(40, 100), &o, &alpha, &beta),
                     CORAX_PLAN_NO_REFERENCE);
    assert_close(corax_deg(alpha), 50, 0, 1e-9, "a vertical hole: alpha is 90 - dip");
    assert_true(isnan(beta));
    assert_int_equal(corax_plan_angles(hole_dir(0, -60), plane_normal(30, 180), &o, &alpha, &beta),
                     CORAX_PLAN_NEAR_PERPENDICULAR);
    assert_true(isnan(beta)); /* alpha 90: a circle */
    assert_int_equal(corax_plan_angles(hole_dir(0, -60), plane_normal(30, 0), &o, &alpha, &beta),
                     CORAX_PLAN_OK);
    assert_string_equal(corax_plan_status_name(CORAX_PLAN_PARALLEL), "parallel");
    assert_string_equal(corax_plan_status_name(CORAX_PLAN_MISSED), "missed");
}

/* A straight hole against an independent line-plane intersection:
 * d = n.(p - c) / (n.t), the point c + d t (common practice; docs/check-values.md),
 * to 1 mm (held to a micrometre). */
static void test_pierce_straight_against_line_plane(void **state)
{
    (void)state;
    corax_convert_options o = defaults();
    static const double cases[][6] = {
        /* hole az, dip; target dip, dd; target point offset east, down */
        {135, -60, 80, 20, 40, 150}, {0, -90, 10, 200, 5, 240}, {250, -35, 65, 300, -80, 60},
        {45, -70, 30, 45, 20, 100},  {310, 25, 50, 300, 0, -20},
    };
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        const double *c = cases[k];
        corax_plan_hole plan = straight("H", c[0], c[1], 500);
        corax_hole *h = path_of(&plan);
        corax_plan_target tg = {"T", {plan.collar.x + c[4], plan.collar.y, plan.collar.z - c[5]},
                                {corax_rad(c[2]), corax_rad(c[3])}, 1};
        corax_vec3 t = hole_dir(c[0], c[1]), n = plane_normal(c[2], c[3]);
        corax_vec3 pc = {tg.point.x - plan.collar.x, tg.point.y - plan.collar.y,
                         tg.point.z - plan.collar.z};
        double d = dot(n, pc) / dot(n, t);
        corax_plan_pierce p;
        assert_int_equal(corax_plan_pierce_target(h, &tg, &o, &p), CORAX_OK);
        assert_true(d > 0 && d < 500);
        assert_true(p.reached);
        assert_close(p.depth, d, 0, 1e-6, "pierce depth = n.(p - c)/(n.t) (line-plane)");
        assert_close(p.point.x, plan.collar.x + d * t.x, 0, 1e-6, "pierce x (line-plane)");
        assert_close(p.point.y, plan.collar.y + d * t.y, 0, 1e-6, "pierce y (line-plane)");
        assert_close(p.point.z, plan.collar.z + d * t.z, 0, 1e-6, "pierce z (line-plane)");
        assert_close(p.alpha, asin(fabs(dot(n, t))), 0, 1e-9, "alpha at the pierce");
        assert_true(isnan(p.again)); /* a straight line crosses a plane once */
        corax_hole_free(h);
    }
}

/* A curved plan: stations every 30 m turned by the lift and drift, the path
 * the project's minimum curvature makes of them (built here from the
 * stations, not by corax_plan_path), and the pierce point found on that path
 * by a root search of the test's own (the secant method) to 1 mm. */
static void test_pierce_curved_against_minimum_curvature(void **state)
{
    (void)state;
    corax_convert_options o = defaults();
    corax_plan_hole plan = straight("C", 135, -75, 400);
    plan.lift = corax_rad(2.0);  /* degrees per 30 m: the hole flattens */
    plan.drift = corax_rad(1.5); /* and turns clockwise */
    corax_hole *h = path_of(&plan);
    corax_station st[15];
    size_t n = 0;
    for (double d = 0; d < 400 - 1e-9; d += 30, n++)
        st[n] = corax_station_make(d, corax_rad(135 + 1.5 * d / 30), corax_rad(75 - 2.0 * d / 30), 0);
    st[n++] = corax_station_make(400, corax_rad(135 + 1.5 * 400 / 30),
                                 corax_rad(75 - 2.0 * 400 / 30), 0);
    corax_collar collar = {plan.collar, plan.azimuth, plan.plunge, 1, 400};
    corax_hole *ref = NULL;
    assert_int_equal(corax_hole_new("ref", &collar, st, n, 0, &ref, NULL), CORAX_OK);
    for (double d = 0; d <= 400; d += 17.3) { /* the same path */
        corax_hole_point a, b;
        corax_hole_at(h, d, NULL, &a);
        corax_hole_at(ref, d, NULL, &b);
        assert_close(a.position.x, b.position.x, 0, 1e-9, "curved plan x on minimum curvature");
        assert_close(a.position.y, b.position.y, 0, 1e-9, "curved plan y on minimum curvature");
        assert_close(a.position.z, b.position.z, 0, 1e-9, "curved plan z on minimum curvature");
    }
    corax_hole_point end;
    corax_hole_at(ref, 400, NULL, &end);
    double az, pl;
    corax_direction_angles(end.tangent, &az, &pl);
    assert_close(corax_deg(pl), 75 - 2.0 * 400 / 30, 0, 1e-9, "the end's plunge: 400 m of lift");
    static const double targets[][5] = {{70, 30, 40, 0, 250}, {20, 200, 0, 60, 180},
                                        {70, 300, 40, 0, 250}};
    for (size_t k = 0; k < 3; k++) {
        const double *c = targets[k];
        corax_plan_target tg = {"T", {plan.collar.x + c[2], plan.collar.y + c[3],
                                      plan.collar.z - c[4]},
                                {corax_rad(c[0]), corax_rad(c[1])}, 1};
        corax_vec3 nrm = plane_normal(c[0], c[1]);
        /* the secant method on the reference path */
        double x0 = 0, x1 = 400, g0, g1;
        for (int i = 0; i < 100; i++) {
            corax_hole_point a, b;
            corax_hole_at(ref, x0, NULL, &a);
            corax_hole_at(ref, x1, NULL, &b);
            g0 = nrm.x * (a.position.x - tg.point.x) + nrm.y * (a.position.y - tg.point.y) +
                 nrm.z * (a.position.z - tg.point.z);
            g1 = nrm.x * (b.position.x - tg.point.x) + nrm.y * (b.position.y - tg.point.y) +
                 nrm.z * (b.position.z - tg.point.z);
            if (fabs(g1) < 1e-10 || g1 == g0)
                break;
            double x2 = x1 - g1 * (x1 - x0) / (g1 - g0);
            x0 = x1;
            x1 = fmin(400, fmax(0, x2));
        }
        corax_hole_point want;
        corax_hole_at(ref, x1, NULL, &want);
        corax_plan_pierce p;
        assert_int_equal(corax_plan_pierce_target(h, &tg, &o, &p), CORAX_OK);
        assert_true(p.reached);
        assert_close(p.depth, x1, 0, 1e-3, "pierce depth on the minimum-curvature path");
        assert_close(p.point.x, want.position.x, 0, 1e-3, "pierce x on the curved path");
        assert_close(p.point.y, want.position.y, 0, 1e-3, "pierce y on the curved path");
        assert_close(p.point.z, want.position.z, 0, 1e-3, "pierce z on the curved path");
    }
    corax_hole_free(ref);
    corax_hole_free(h);
}

/* A hole that never reaches its target: the closest approach is reported.
 * Heading toward the plane and stopping short, the closest point is the end,
 * and drilled on it would reach the plane where the straight line does;
 * heading away, the closest point is the collar. */
static void test_pierce_missed_closest_approach(void **state)
{
    (void)state;
    corax_convert_options o = defaults();
    corax_plan_hole plan = straight("S", 0, -60, 100);
    corax_hole *h = path_of(&plan);
    corax_vec3 t = hole_dir(0, -60);
    corax_plan_target below = {"deep", {plan.collar.x, plan.collar.y, plan.collar.z - 200},
                               {0, 0}, 1}; /* horizontal, 200 m down */
    corax_plan_pierce p;
    assert_int_equal(corax_plan_pierce_target(h, &below, &o, &p), CORAX_OK);
    assert_false(p.reached);
    assert_int_equal(p.status, CORAX_PLAN_MISSED);
    assert_close(p.depth, 100, 0, 1e-6, "closest at the end of the hole");
    assert_close(p.distance, 200 + 100 * t.z, 0, 1e-6, "its distance from the plane");
    assert_close(p.drilled_on, 200 / -t.z, 0, 1e-6, "drilled on: where the line reaches it");
    assert_true(isnan(p.alpha));
    char note[300];
    assert_true(corax_plan_pierce_note(&p, 100, note, sizeof note) > 0);
    assert_non_null(strstr(note, "closest approach 113.40 m"));
    corax_plan_target above = {"up", {plan.collar.x, plan.collar.y, plan.collar.z + 50},
                               {0, 0}, 1};
    assert_int_equal(corax_plan_pierce_target(h, &above, &o, &p), CORAX_OK);
    assert_false(p.reached);
    assert_close(p.depth, 0, 0, 1e-6, "heading away: closest at the collar");
    assert_close(p.distance, 50, 0, 1e-6, "50 m above the collar");
    assert_true(isnan(p.drilled_on));
    corax_hole_free(h);
}

/* A curved hole samples a set by the mean of |n.t| along it: against a dense
 * sum of the test's own over the minimum-curvature path. Where the hole runs
 * nearly along the set's planes the note names the stretch: a hole plunging
 * 5 degrees and dropping 3 per 30 m meets flat planes at alpha = its plunge,
 * below 10 for its first 50 m (derived). */
static void test_curved_sampling_along_the_hole(void **state)
{
    (void)state;
    corax_plan_hole plan = straight("C", 90, -5, 300);
    plan.lift = corax_rad(-3); /* dropping: the hole steepens */
    corax_plan_set sets[2] = {set_of("steep", 85, 90, NAN, 1), set_of("flat", 0, 0, NAN, 1)};
    corax_plan_model *m = model_of(sets, 2);
    corax_hole *h = path_of(&plan);
    corax_plan_sampling out[2];
    assert_int_equal(corax_plan_sample(m, h, out), CORAX_OK);
    for (int i = 0; i < 2; i++) {
        corax_vec3 n = corax_plane_normal(sets[i].plane);
        double f = 0, a = 0;
        const int N = 30000;
        for (int k = 0; k < N; k++) {
            corax_hole_point pt;
            corax_hole_at(h, (k + 0.5) * 300.0 / N, NULL, &pt);
            double c = fabs(dot(n, pt.tangent));
            f += c / N;
            a += c * asin(c) / N;
        }
        assert_close(out[i].factor, f, 0, 1e-4, "factor: the mean |n.t| along the curved hole");
        assert_close(out[i].alpha, a / f, 0, 1e-4, "alpha: crossing-weighted along the hole");
        assert_true(out[i].alpha_sd > 0.01); /* alpha changes along the hole */
    }
    assert_int_equal(out[1].status, CORAX_PLAN_OK); /* on the whole, crossed well */
    assert_close(out[1].low_from, 0, 0, 1e-9, "the low stretch starts at the collar");
    assert_close(out[1].low_to, 50, 0, 1, "and ends near 50 m (derived)");
    corax_convert_options o = defaults();
    char note[400];
    corax_plan_sampling_note(&out[1], 300, &o, note, sizeof note);
    assert_string_equal(note, "the mean plane's alpha is below 10 from 0 to 50 m");
    corax_hole_free(h);
    corax_plan_model_free(m);
}

/* Sweep every direction of the lower hemisphere every `step` degrees. */
static corax_plan_direction *sweep_all(const corax_plan_set *sets, size_t n, double step,
                                       size_t *count, corax_plan_model **m)
{
    corax_plan_range az = {0, 2 * CORAX_PI, corax_rad(step)};
    corax_plan_range pl = {0, 0.5 * CORAX_PI, corax_rad(step)};
    corax_plan_direction *d = NULL;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_plan_directions(az, pl, &d, count, &err), CORAX_OK);
    *m = model_of(sets, n);
    corax_plan_hole plan = straight("H", 0, -60, 200);
    assert_int_equal(corax_plan_sweep(*m, &plan, 1, NULL, 0, d, *count, &err), CORAX_OK);
    for (size_t k = 1; k < *count; k++)
        assert_true(d[k - 1].score >= d[k].score); /* best first */
    return d;
}

/* For one set, the best direction is along its pole (within the sweep's
 * step; common practice: a hole square to the planes samples them best). */
static void test_best_direction_one_set_along_pole(void **state)
{
    (void)state;
    corax_plan_set s = set_of("one", 42, 117, NAN, 1); /* pole 297/48, off the grid */
    size_t n;
    corax_plan_model *m;
    corax_plan_direction *d = sweep_all(&s, 1, 5, &n, &m);
    corax_vec3 best = corax_direction(d[0].azimuth, d[0].plunge);
    assert_true(angle_deg(best, corax_plane_normal(s.plane)) <= 5.0);
    assert_close(d[0].score, cos(corax_rad(angle_deg(best, corax_plane_normal(s.plane)))), 0,
                 1e-12, "one set: the score is |n.t|");
    free(d);
    corax_plan_model_free(m);
}

/* Two perpendicular sets: the best direction lies at 45 degrees to both
 * poles (derived: |n1.t| |n2.t| is largest there, since |n1.t|^2 + |n2.t|^2
 * <= 1; docs/check-values.md, "Drill planning"), within the sweep's step.
 * With weights 1 and 3 it moves to 60 degrees from the first pole (derived:
 * cos^(1/4) sin^(3/4) is largest where tan^2 = 3). */
static void test_best_direction_two_perpendicular_sets(void **state)
{
    (void)state;
    corax_plan_set sets[2] = {set_of("A", 60, 0, NAN, 1), set_of("B", 30, 180, NAN, 1)};
    corax_vec3 na = corax_plane_normal(sets[0].plane), nb = corax_plane_normal(sets[1].plane);
    assert_close(dot(na, nb), 0, 0, 1e-12, "the two sets are perpendicular");
    size_t n;
    corax_plan_model *m;
    corax_plan_direction *d = sweep_all(sets, 2, 5, &n, &m);
    corax_vec3 best = corax_direction(d[0].azimuth, d[0].plunge);
    assert_close(angle_deg(best, na), 45, 0, 5, "45 degrees from the first pole");
    assert_close(angle_deg(best, nb), 45, 0, 5, "45 degrees from the second pole");
    free(d);
    corax_plan_model_free(m);
    sets[1].weight = 3;
    d = sweep_all(sets, 2, 2, &n, &m);
    best = corax_direction(d[0].azimuth, d[0].plunge);
    assert_close(angle_deg(best, na), 60, 0, 2, "weights 1 and 3: 60 degrees from the first");
    assert_close(angle_deg(best, nb), 30, 0, 2, "and 30 from the second");
    free(d);
    corax_plan_model_free(m);
}

/* Target planes count in the score: directions that miss them lose that
 * share. A vertical vein to the east, 100 m away, reached only by holes
 * heading east. */
static void test_sweep_counts_reach(void **state)
{
    (void)state;
    corax_plan_set s = set_of("flat", 0, 0, NAN, 1);
    corax_plan_model *m = model_of(&s, 1);
    corax_plan_hole plan = straight("H", 0, -60, 300);
    corax_plan_target vein = {"vein", {plan.collar.x + 100, plan.collar.y, 0},
                              {corax_rad(90), corax_rad(90)}, 1};
    corax_plan_range az = {0, 2 * CORAX_PI, corax_rad(90)}, pl = {corax_rad(30), corax_rad(30), 1};
    corax_plan_direction *d;
    size_t n;
    corax_error err;
    assert_int_equal(corax_plan_directions(az, pl, &d, &n, &err), CORAX_OK);
    assert_int_equal(n, 4);
    assert_int_equal(corax_plan_sweep(m, &plan, 1, &vein, 1, d, n, &err), CORAX_OK);
    assert_close(corax_deg(d[0].azimuth), 90, 0, 1e-9, "east reaches the vein: best");
    assert_close(d[0].reach, 1, 0, 0, "reached");
    assert_close(d[0].score, sin(corax_rad(30)), 0, 1e-12, "flat set, plunge 30: |n.t|");
    for (size_t k = 1; k < n; k++) {
        assert_close(d[k].reach, 0, 0, 0, "other directions miss the vein");
        assert_close(d[k].score, 0, 0, 0, "and score nothing");
    }
    free(d);
    corax_plan_model_free(m);
}

/* Bad input: a set that lies parallel to every direction of the sweep (the
 * sweep holds only directions toward east and west, the set is a vertical
 * plane striking east), and a sweep range that is empty. */
static void test_sweep_bad_input(void **state)
{
    (void)state;
    corax_plan_set sets[2] = {set_of("flat", 10, 0, NAN, 1), set_of("east-west", 90, 0, NAN, 1)};
    corax_plan_model *m = model_of(sets, 2);
    corax_plan_hole plan = straight("H", 0, -60, 200);
    corax_plan_range az = {corax_rad(90), corax_rad(270), CORAX_PI}, pl = {0, 0.5 * CORAX_PI,
                                                                           corax_rad(5)};
    corax_plan_direction *d;
    size_t n;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_plan_directions(az, pl, &d, &n, &err), CORAX_OK);
    assert_int_equal(n, 2 * 19 - 1); /* east and west, the vertical once */
    assert_int_equal(corax_plan_sweep(m, &plan, 1, NULL, 0, d, n, &err), CORAX_EVALUE);
    assert_non_null(strstr(err.message, "set east-west lies parallel to every direction"));
    free(d);
    corax_plan_model_free(m);
    corax_plan_range empty = {0, 2 * CORAX_PI, 0};
    assert_int_equal(corax_plan_directions(empty, pl, &d, &n, &err), CORAX_EARG);
    assert_non_null(strstr(err.message, "holds no direction"));
    assert_null(d);
    corax_plan_range nan_range = {NAN, 1, 1};
    assert_int_equal(corax_plan_directions(az, nan_range, &d, &n, &err), CORAX_EARG);
    corax_plan_range fine = {0, 2 * CORAX_PI, corax_rad(0.05)}; /* 7200 x 19 */
    assert_int_equal(corax_plan_directions(fine, pl, &d, &n, &err), CORAX_EARG);
    assert_non_null(strstr(err.message, "100000 is the most"));
}

/* Ranges: azimuths clockwise through north, the whole circle without its end
 * twice, plunges either way. */
static void test_directions_ranges(void **state)
{
    (void)state;
    corax_plan_direction *d;
    size_t n;
    corax_error err;
    corax_plan_range az = {corax_rad(330), corax_rad(30), corax_rad(10)};
    corax_plan_range pl = {corax_rad(45), corax_rad(45), corax_rad(5)};
    assert_int_equal(corax_plan_directions(az, pl, &d, &n, &err), CORAX_OK);
    assert_int_equal(n, 7); /* 330 .. 30 through north */
    assert_close(corax_deg(d[3].azimuth), 0, 0, 1e-9, "north in the middle");
    free(d);
    az = (corax_plan_range){0, 2 * CORAX_PI, corax_rad(5)};
    pl = (corax_plan_range){corax_rad(45), corax_rad(90), corax_rad(5)};
    assert_int_equal(corax_plan_directions(az, pl, &d, &n, &err), CORAX_OK);
    assert_int_equal(n, 72 * 9 + 1); /* 0 .. 355, plunges 45 .. 85, and the vertical */
    free(d);
}

/* The program view: a set is badly sampled only when every hole is
 * near-parallel to it; the best hole is the one crossing it most. */
static void test_program_view(void **state)
{
    (void)state;
    corax_plan_set sets[2] = {set_of("steep", 88, 90, NAN, 1), set_of("flat", 10, 200, NAN, 1)};
    corax_plan_model *m = model_of(sets, 2);
    corax_plan_hole plans[2] = {straight("V", 0, -90, 100), straight("E", 270, -5, 300)};
    corax_plan_sampling s[4];
    double lengths[2] = {100, 300};
    for (int h = 0; h < 2; h++) {
        corax_hole *p = path_of(&plans[h]);
        assert_int_equal(corax_plan_sample(m, p, &s[2 * h]), CORAX_OK);
        corax_hole_free(p);
    }
    assert_int_equal(s[0].status, CORAX_PLAN_NEAR_PARALLEL); /* vertical hole, steep set */
    assert_true(s[0].no_reference);
    assert_int_equal(s[2].status, CORAX_PLAN_OK);            /* flat hole east, steep set */
    corax_plan_program_set p[2];
    corax_plan_program(m, s, lengths, 2, p);
    assert_false(p[0].badly_sampled);
    assert_int_equal(p[0].best_hole, 1);
    assert_int_equal(p[0].holes_ok, 1);
    assert_close(p[0].factor, (100 * s[0].factor + 300 * s[2].factor) / 400, 1e-12, 0,
                 "the program's factor is the length-weighted mean");
    /* two holes nearly along the flat set's strike (110/290) */
    corax_plan_hole flat_holes[2] = {straight("A", 110, -2, 100), straight("B", 290, -4, 100)};
    for (int h = 0; h < 2; h++) {
        corax_hole *q = path_of(&flat_holes[h]);
        assert_int_equal(corax_plan_sample(m, q, &s[2 * h]), CORAX_OK);
        corax_hole_free(q);
    }
    corax_plan_program(m, s, lengths, 2, p);
    assert_true(p[1].badly_sampled == (s[1].status >= CORAX_PLAN_NEAR_PARALLEL &&
                                       s[3].status >= CORAX_PLAN_NEAR_PARALLEL));
    assert_true(p[1].badly_sampled); /* both holes lie nearly in the flat set's planes */
    corax_plan_model_free(m);
}

/* A straight plan along a plane: status parallel, beta undefined, and a note
 * that says so. */
static void test_sampling_parallel_set(void **state)
{
    (void)state;
    corax_plan_set s = set_of("along", 60, 0, NAN, 1);
    corax_plan_model *m = model_of(&s, 1);
    corax_plan_hole plan = straight("H", 0, -60, 100);
    corax_hole *h = path_of(&plan);
    corax_plan_sampling out;
    assert_int_equal(corax_plan_sample(m, h, &out), CORAX_OK);
    assert_int_equal(out.status, CORAX_PLAN_PARALLEL);
    assert_close(out.factor, 0, 0, 1e-12, "a hole along the planes crosses none");
    assert_true(isnan(out.beta));
    corax_convert_options o = defaults();
    char note[300];
    corax_plan_sampling_note(&out, 100, &o, note, sizeof note);
    assert_non_null(strstr(note, "beta is undefined"));
    corax_hole_free(h);
    corax_plan_model_free(m);
}

/* Bad arguments to the library. */
static void test_bad_arguments(void **state)
{
    (void)state;
    corax_convert_options o = defaults();
    corax_plan_model *m = NULL;
    corax_plan_set bad = set_of("s", 40, 10, -1, 1);
    assert_int_equal(corax_plan_model_new(&bad, 1, &o, &m), CORAX_EARG);
    bad = set_of("s", 40, 10, NAN, 0);
    assert_int_equal(corax_plan_model_new(&bad, 1, &o, &m), CORAX_EARG);
    assert_int_equal(corax_plan_model_new(&bad, 0, &o, &m), CORAX_EARG);
    assert_null(m);
    corax_plan_hole plan = straight("H", 0, -60, 0);
    corax_hole *h = NULL;
    corax_error err;
    assert_int_equal(corax_plan_path(&plan, &h, &err), CORAX_EVALUE);
    assert_null(h);
    corax_plan_model_free(NULL);
}

/* The tables: good rows read, bad rows each a finding at its line, names
 * that repeat, kappa and cone95 together refused. */
static void test_tables(void **state)
{
    (void)state;
    const char *holes = test_tmp_path("plan_holes.csv");
    const char *sets = test_tmp_path("plan_sets.csv");
    test_write_file(holes, "hole,x,y,z,azimuth,dip,length,lift,drift\n"
                           "P1,10,20,30,135,-60,300,,\n"
                           "P2,10,20,30,135,-60,0,,\n"
                           "P3,10,20,30,135,-95,100,,\n"
                           "P1,1,2,3,0,-90,50,1,1\n"
                           "P4,1,2,3,0,-50,50,45,0\n"
                           "P5,1,2,3,0,-50,50,1.5,-2\n");
    test_write_file(sets, "set,dip,dip_direction,kappa,cone95,weight\n"
                          "a,50,120,,,\n"
                          "b,50,120,20,15,\n"
                          "c,50,120,,20,2\n"
                          "d,50,400,,,\n");
    corax_plan_load_options lo = corax_plan_load_options_default();
    corax_plan_inputs in = {0};
    corax_findings problems = {0};
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_plan_holes_load(holes, &lo, &in, &problems, &err), CORAX_OK);
    assert_int_equal(corax_plan_sets_load(sets, &lo, &in, &problems, &err), CORAX_OK);
    assert_int_equal(in.nholes, 3); /* P1, P1 again, P5 */
    assert_string_equal(in.holes[2].name, "P5");
    assert_close(corax_deg(in.holes[2].drift), -2, 0, 1e-12, "drift read");
    assert_close(corax_deg(in.holes[2].plunge), 50, 0, 1e-12, "dip -50 is plunge 50");
    assert_int_equal(in.nsets, 2);
    assert_true(isinf(in.sets[0].kappa));
    assert_close(in.sets[1].kappa, corax_plan_kappa_of_cone(corax_rad(20), 0.95), 1e-12, 0,
                 "cone95 read as kappa");
    assert_close(in.sets[1].weight, 2, 0, 0, "weight read");
    static const long lines[] = {3, 4, 6, 5, 3, 5}; /* rows in order, then repeats */
    assert_int_equal(problems.count, 6);
    for (size_t i = 0; i < problems.count; i++)
        assert_int_equal(problems.item[i].line, lines[i]);
    assert_non_null(strstr(problems.item[2].message, "lift 45 is outside"));
    assert_non_null(strstr(problems.item[3].message, "P1 appears twice (lines 2 and 5)"));
    assert_non_null(strstr(problems.item[4].message, "not both"));
    corax_findings_clear(&problems);
    corax_plan_inputs_free(&in);
    assert_int_equal(corax_plan_targets_load(sets, &lo, &in, &problems, &err), CORAX_EFORMAT);
    assert_non_null(strstr(err.message, "no 'target' column"));
    remove(holes);
    remove(sets);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_expected_alpha_is_asin_n_dot_t),
        cmocka_unit_test(test_expected_angles_published),
        cmocka_unit_test(test_terzaghi_factor_harrison_hudson_q7_10),
        cmocka_unit_test(test_spread_against_monte_carlo),
        cmocka_unit_test(test_kappa_of_cone_wood),
        cmocka_unit_test(test_angles_statuses),
        cmocka_unit_test(test_pierce_straight_against_line_plane),
        cmocka_unit_test(test_pierce_curved_against_minimum_curvature),
        cmocka_unit_test(test_pierce_missed_closest_approach),
        cmocka_unit_test(test_curved_sampling_along_the_hole),
        cmocka_unit_test(test_best_direction_one_set_along_pole),
        cmocka_unit_test(test_best_direction_two_perpendicular_sets),
        cmocka_unit_test(test_sweep_counts_reach),
        cmocka_unit_test(test_sweep_bad_input),
        cmocka_unit_test(test_directions_ranges),
        cmocka_unit_test(test_program_view),
        cmocka_unit_test(test_sampling_parallel_set),
        cmocka_unit_test(test_bad_arguments),
        cmocka_unit_test(test_tables),
    };
    return cmocka_run_group_tests_name("plan", tests, NULL, NULL);
}
