/* Tests of the core module: alpha/beta/gamma to planes and lines and back,
 * against outside values, an independent construction, and round trips. */
#include <math.h>
#include <string.h>

#include "corax/convert.h"
#include "corax/core.h"
#include "support/check.h"

static const corax_core_conventions DEFAULTS = {0, 0, 0, 0, 0};

/* The frame of a hole given as azimuth and dip (negative down), degrees. */
static corax_core_frame hole_frame(double az, double dip)
{
    corax_core_frame f;
    assert_int_equal(corax_core_frame_of(corax_direction(corax_rad(az), corax_rad(-dip)), &f),
                     CORAX_OK);
    return f;
}

static corax_plane plane_of(double az, double dip, double alpha, double beta,
                            const corax_core_conventions *c)
{
    corax_core_frame f = hole_frame(az, dip);
    return corax_plane_from_normal(
        corax_core_plane_normal(&f, corax_rad(alpha), corax_rad(beta), c), NULL);
}

/* derived (the project's check values: our own reference, bottom-of-hole line,
 * beta clockwise looking down the hole to the down-hole end of the ellipse;
 * hole dip negative down). Printed to 0.01 degree. */
static void test_derived_alpha_beta_table(void **state)
{
    (void)state;
    static const double table[][6] = {
        {0, -60, 30, 180, 30.00, 0.00},  {0, -60, 30, 90, 64.34, 253.90},
        {90, -45, 45, 270, 60.00, 215.26}, {200, -70, 55, 120, 29.79, 108.77},
        {45, 20, 60, 300, 57.92, 14.27},   {135, -30, 15, 45, 62.48, 185.37},
    };
    for (int i = 0; i < 6; i++) {
        corax_plane p = plane_of(table[i][0], table[i][1], table[i][2], table[i][3], &DEFAULTS);
        assert_close(corax_deg(p.dip), table[i][4], 0, 0.005, "derived table: dip");
        assert_close(corax_wrap_degrees(corax_deg(p.dip_direction), 2), table[i][5], 0, 0.005,
                     "derived table: dip direction");
    }
}

/* The physical sanity picture of the geometry contract, in words: a hole
 * plunging 60 toward north. Looking down the hole the bottom line is at six
 * o'clock; 90 degrees clockwise from it is nine o'clock, the WEST side. With
 * alpha 30 and beta 90 the ellipse reaches furthest down the hole on the west
 * side, so the plane dips to the south-west: dip 64.34, dip direction 253.90. */
static void test_physical_sanity_picture(void **state)
{
    (void)state;
    corax_core_frame f = hole_frame(0, -60);
    assert_true(f.r.z < 0);        /* the bottom line is on the lower side of the core */
    assert_true(f.s.x < -0.99);    /* 90 degrees clockwise from it, looking down: west */
    corax_vec3 n = corax_core_plane_normal(&f, corax_rad(30), corax_rad(90), &DEFAULTS);
    /* the ellipse's down-hole end lies on the west side */
    double sa = sin(corax_rad(30)), ca = cos(corax_rad(30)); /* n = sin(a) t - cos(a) e */
    corax_vec3 e = {(sa * f.t.x - n.x) / ca, (sa * f.t.y - n.y) / ca, (sa * f.t.z - n.z) / ca};
    assert_true(e.x < -0.99);
    corax_plane p = corax_plane_from_normal(n, NULL);
    double dd = corax_deg(p.dip_direction);
    assert_true(dd > 180 && dd < 270); /* south-west */
    assert_close(corax_deg(p.dip), 64.34, 0, 0.005, "sanity picture: dip");
    assert_close(dd, 253.90, 0, 0.005, "sanity picture: dip direction");
}

/* J. A. Hudson & J. P. Harrison (1997), Engineering Rock Mechanics, Appendix
 * 6: hole trend/plunge 305/65, plane dip direction/dip 145/73. derived:
 * alpha 40.15. */
static void test_hudson_harrison_1997_inverse(void **state)
{
    (void)state;
    corax_core_frame f = hole_frame(305, -65);
    corax_plane p = {corax_rad(73), corax_rad(145)};
    double alpha, beta;
    corax_core_plane_angles(&f, corax_plane_normal(p), &DEFAULTS, &alpha, &beta);
    assert_close(corax_deg(alpha), 40.15, 0, 0.005, "Hudson & Harrison (1997) App. 6 alpha");
    corax_plane back = plane_of(305, -65, corax_deg(alpha), corax_deg(beta), &DEFAULTS);
    assert_close(corax_deg(back.dip), 73, 0, 1e-9, "and back: dip");
    assert_close(corax_deg(back.dip_direction), 145, 0, 1e-9, "and back: dip direction");
}

/* Common practice: a plane perpendicular to the core has alpha 90, its pole is
 * the core axis, so a hole plunging 60 meets it dipping 30 the opposite way;
 * and a pole plunges 90 minus the plane's dip. */
static void test_alpha_90_is_perpendicular_to_the_hole(void **state)
{
    (void)state;
    for (double beta = 0; beta < 360; beta += 37) {
        corax_plane p = plane_of(40, -60, 90, beta, &DEFAULTS);
        assert_close(corax_deg(p.dip), 30, 0, 1e-9, "alpha 90 in a hole plunging 60: dip 30");
        assert_close(corax_deg(p.dip_direction), 220, 0, 1e-9, "dipping opposite the hole");
        corax_vec3 up = corax_plane_normal(p);
        double trend, plunge;
        corax_line_trend_plunge(up, &trend, &plunge);
        assert_close(corax_deg(plunge), 90 - corax_deg(p.dip), 0, 1e-9,
                     "pole plunge is 90 minus dip (common practice)");
        assert_close(corax_deg(trend), 40, 0, 1e-9, "the pole is the hole axis");
    }
}

/* An independent construction: intersect the plane with a cylinder of radius
 * 1 around the core axis; search numerically for the ellipse's point
 * furthest down the hole, and for the lowest point of the core's rim (the
 * bottom line). alpha follows from the ellipse's length along the core, beta
 * from the angle between the two, right-handed about the hole (clockwise
 * looking down it). No code is shared with the closed form but the hole's
 * direction vector. */
static void independent_alpha_beta(corax_vec3 t, corax_vec3 n, double *alpha, double *beta)
{
    /* any two unit vectors across the core */
    corax_vec3 a = fabs(t.x) < 0.9 ? (corax_vec3){1, 0, 0} : (corax_vec3){0, 1, 0};
    double k = a.x * t.x + a.y * t.y + a.z * t.z;
    a = (corax_vec3){a.x - k * t.x, a.y - k * t.y, a.z - k * t.z};
    double na = sqrt(a.x * a.x + a.y * a.y + a.z * a.z);
    a = (corax_vec3){a.x / na, a.y / na, a.z / na};
    corax_vec3 b = {t.y * a.z - t.z * a.y, t.z * a.x - t.x * a.z, t.x * a.y - t.y * a.x};
    double nt = n.x * t.x + n.y * t.y + n.z * t.z;
    double na_ = n.x * a.x + n.y * a.y + n.z * a.z, nb = n.x * b.x + n.y * b.y + n.z * b.z;
    /* rim point p(phi) = cos(phi) a + sin(phi) b; the plane through the core's
     * centre meets the cylinder at height h(phi) = -(n.p)/(n.t) along t */
#define H(phi) (-(na_ * cos(phi) + nb * sin(phi)) / nt)
#define Z(phi) (cos(phi) * a.z + sin(phi) * b.z)
    double best = 0, hmax = -1e300, hmin = 1e300, zmin = 1e300, bottom = 0;
    for (int i = 0; i < 3600; i++) {
        double phi = 2 * CORAX_PI * i / 3600;
        if (H(phi) > hmax) hmax = H(phi), best = phi;
        if (H(phi) < hmin) hmin = H(phi);
        if (Z(phi) < zmin) zmin = Z(phi), bottom = phi;
    }
    /* refine both maxima by golden-section search */
    for (int which = 0; which < 2; which++) {
        double lo = (which ? bottom : best) - 0.01, hi = lo + 0.02, g = (sqrt(5) - 1) / 2;
        for (int it = 0; it < 200; it++) {
            double m1 = hi - g * (hi - lo), m2 = lo + g * (hi - lo);
            double f1 = which ? -Z(m1) : H(m1), f2 = which ? -Z(m2) : H(m2);
            if (f1 > f2) hi = m2; else lo = m1;
        }
        if (which) bottom = 0.5 * (lo + hi); else best = 0.5 * (lo + hi);
    }
    hmax = H(best);
    hmin = H(best + CORAX_PI);
#undef H
#undef Z
    *alpha = atan2(2.0, hmax - hmin); /* the long axis spans the diameter across the core */
    /* beta: from the bottom line to the ellipse's down-hole end, right-handed about t */
    *beta = corax_wrap_azimuth(best - bottom);
}

static void test_independent_construction_agrees(void **state)
{
    (void)state;
    uint64_t seed = 2026;
    int checked = 0;
    for (int i = 0; i < 4000; i++) {
        double az = 360 * test_uniform(&seed);
        double dip = -89 + 178 * test_uniform(&seed); /* up-holes too */
        if (fabs(dip) > 85)
            continue;
        double alpha = 2 + 86 * test_uniform(&seed), beta = 360 * test_uniform(&seed);
        corax_core_frame f = hole_frame(az, dip);
        corax_vec3 n = corax_core_plane_normal(&f, corax_rad(alpha), corax_rad(beta), &DEFAULTS);
        double a2, b2;
        independent_alpha_beta(f.t, n, &a2, &b2);
        assert_close(corax_deg(a2), alpha, 0, 1e-6, "independent construction: alpha");
        assert_close(azimuth_gap(corax_deg(b2), beta), 0, 0, 1e-5,
                     "independent construction: beta");
        checked++;
    }
    assert_true(checked > 3500);
}

/* Round trips: the inverse, then the conversion, gives back the plane. */
static void test_plane_round_trip(void **state)
{
    (void)state;
    uint64_t seed = 77;
    corax_core_conventions conv[] = {{0, 0, 0, 0, 0}, {1, 1, 1, 1, 1}, {1, 0, 1, 0, 0}};
    for (int i = 0; i < 20000; i++) {
        const corax_core_conventions *c = &conv[i % 3];
        double az = 360 * test_uniform(&seed), dip = -89.9 + 179.8 * test_uniform(&seed);
        corax_core_frame f = hole_frame(az, dip);
        corax_plane p = {corax_rad(89.99 * test_uniform(&seed)), corax_rad(360 * test_uniform(&seed))};
        double alpha, beta;
        corax_core_plane_angles(&f, corax_plane_normal(p), c, &alpha, &beta);
        if (isnan(beta))
            continue;
        corax_plane q = corax_plane_from_normal(corax_core_plane_normal(&f, alpha, beta, c), NULL);
        assert_close(corax_deg(q.dip), corax_deg(p.dip), 0, 1e-9, "round trip: dip");
        if (p.dip > 1e-3)
            assert_close(azimuth_gap(corax_deg(q.dip_direction), corax_deg(p.dip_direction)), 0,
                         0, 1e-9 / sin(p.dip), "round trip: dip direction");
    }
}

static double line_gap(corax_vec3 a, corax_vec3 b)
{
    double d = fabs(a.x * b.x + a.y * b.y + a.z * b.z);
    double c = sqrt(fmax(0.0, (a.y * b.z - a.z * b.y) * (a.y * b.z - a.z * b.y) +
                                  (a.z * b.x - a.x * b.z) * (a.z * b.x - a.x * b.z) +
                                  (a.x * b.y - a.y * b.x) * (a.x * b.y - a.y * b.x)));
    return corax_deg(atan2(c, d)); /* angle between axial lines */
}

static void test_line_round_trips(void **state)
{
    (void)state;
    uint64_t seed = 78;
    corax_core_conventions conv[] = {{0, 0, 0, 0, 0}, {0, 1, 0, 1, 1}, {1, 0, 1, 1, 0}};
    for (int i = 0; i < 20000; i++) {
        const corax_core_conventions *c = &conv[i % 3];
        double az = 360 * test_uniform(&seed), dip = -89 + 178 * test_uniform(&seed);
        corax_core_frame f = hole_frame(az, dip);
        /* gamma: a random plane and a random line on it */
        double alpha = corax_rad(1 + 88 * test_uniform(&seed)), beta = corax_rad(360 * test_uniform(&seed));
        double gamma = corax_rad(360 * test_uniform(&seed));
        corax_vec3 n = corax_core_plane_normal(&f, alpha, beta, c);
        corax_vec3 l = corax_core_line_on_plane(&f, alpha, beta, gamma, c);
        assert_close(n.x * l.x + n.y * l.y + n.z * l.z, 0, 0, 1e-12, "a gamma line lies on its plane");
        double g2 = corax_core_gamma_of(&f, n, l, c);
        corax_vec3 l2 = corax_core_line_on_plane(&f, alpha, beta, g2, c);
        assert_close(line_gap(l, l2), 0, 0, 1e-9, "gamma round trip");
        assert_true(l2.z <= 1e-12); /* the inverse picks the downward end */
        /* a line on its own */
        double la = corax_rad(90 * test_uniform(&seed)), lb = corax_rad(360 * test_uniform(&seed));
        corax_vec3 m = corax_core_line(&f, la, lb, c);
        double la2, lb2;
        corax_core_line_angles(&f, m, c, &la2, &lb2);
        assert_close(corax_deg(la2), corax_deg(la), 0, 1e-9, "line alpha round trip");
        if (la > 1e-6)
            assert_close(azimuth_gap(corax_deg(lb2), corax_deg(lb)), 0, 0, 1e-7,
                         "line beta round trip");
    }
}

/* Each convention switch equals its mapping onto the default: top-of-hole
 * line = bottom line with beta + 180; beta to the up-hole end = beta + 180;
 * anticlockwise = -beta; gamma from the up-hole end = gamma + 180;
 * anticlockwise gamma = -gamma. */
static void test_convention_switches_equal_their_mappings(void **state)
{
    (void)state;
    corax_core_frame f = hole_frame(123, -55);
    double alpha = corax_rad(35), beta = corax_rad(70), gamma = corax_rad(40);
    struct {
        corax_core_conventions c;
        double beta, gamma; /* the default-convention equivalents */
        const char *what;
    } cases[] = {
        {{1, 0, 0, 0, 0}, beta + CORAX_PI, gamma, "top-of-hole line = beta + 180"},
        {{0, 1, 0, 0, 0}, beta + CORAX_PI, gamma, "up-hole end = beta + 180"},
        {{0, 0, 1, 0, 0}, 2 * CORAX_PI - beta, gamma, "anticlockwise = -beta"},
        {{1, 1, 0, 0, 0}, beta, gamma, "top line to the up-hole end = beta"},
        {{0, 0, 0, 1, 0}, beta, gamma + CORAX_PI, "gamma from up-hole end = gamma + 180"},
        {{0, 0, 0, 0, 1}, beta, 2 * CORAX_PI - gamma, "anticlockwise gamma = -gamma"},
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        corax_vec3 n1 = corax_core_plane_normal(&f, alpha, beta, &cases[i].c);
        corax_vec3 n0 = corax_core_plane_normal(&f, alpha, cases[i].beta, &DEFAULTS);
        assert_close(line_gap(n1, n0), 0, 0, 1e-12, cases[i].what);
        corax_vec3 l1 = corax_core_line_on_plane(&f, alpha, beta, gamma, &cases[i].c);
        corax_vec3 l0 = corax_core_line_on_plane(&f, alpha, cases[i].beta, cases[i].gamma, &DEFAULTS);
        assert_close(l1.x, l0.x, 0, 1e-12, cases[i].what);
        assert_close(l1.y, l0.y, 0, 1e-12, cases[i].what);
        assert_close(l1.z, l0.z, 0, 1e-12, cases[i].what);
        /* and the switch changes the answer: beta 70 is not beta 250 */
        if (cases[i].beta != beta) {
            corax_vec3 nd = corax_core_plane_normal(&f, alpha, beta, &DEFAULTS);
            assert_true(line_gap(n1, nd) > 1);
        }
    }
}

/* ---- one reading down a hole ---- */

static corax_hole *straight_hole(double az, double dip, double length)
{
    corax_collar c = {{100, 200, 300}, corax_rad(az), corax_rad(-dip), 1, length};
    corax_station s[2] = {{0, corax_rad(az), corax_rad(-dip), 0, 0, 0, 0}, {50, corax_rad(az), corax_rad(-dip), 0, 0, 0, 0}};
    corax_hole *h;
    assert_int_equal(corax_hole_new("H", &c, s, 2, 0, &h, NULL), CORAX_OK);
    return h;
}

static corax_reading reading(double depth, double alpha, double beta)
{
    corax_reading r = corax_reading_empty();
    r.depth = depth;
    r.alpha = isnan(alpha) ? alpha : corax_rad(alpha);
    r.beta = isnan(beta) ? beta : corax_rad(beta);
    return r;
}

static void test_reading_conditions(void **state)
{
    (void)state;
    corax_convert_options o = corax_convert_options_default();
    corax_hole *h = straight_hole(0, -60, 100);
    corax_result r;
    char note[400];
    corax_reading rd = reading(20, 30, 90);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "converted");
    assert_close(corax_deg(r.plane.dip), 64.34, 0, 0.005, "sanity picture through a hole");
    assert_close(r.point.position.z, 300 - 20 * sin(corax_rad(60)), 0, 1e-9, "located on the hole");

    rd = reading(20, 6, 90);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "near-parallel");
    assert_true(r.has_plane);
    corax_result_note(&r, &rd, h, &o, note, sizeof note);
    assert_non_null(strstr(note, "alpha 6.0 is below 10"));

    rd = reading(70, 85, 90);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "extrapolated");
    assert_true(r.conditions & CORAX_COND_NEAR_PERPENDICULAR);

    rd = reading(120, 40, 10);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "beyond-end");
    corax_result_note(&r, &rd, h, &o, note, sizeof note);
    assert_non_null(strstr(note, "depth 120.00 is beyond the hole's length 100.00"));

    rd = reading(20, 40, NAN);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "unoriented");
    assert_false(r.has_plane);
    assert_true(r.located);

    rd = reading(20, 95, 10);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "invalid");
    corax_result_note(&r, &rd, h, &o, note, sizeof note);
    assert_string_equal(note, "alpha 95 is outside [0, 90]");
    assert_true(r.located); /* the position is still known */

    rd = reading(20, 45, 360);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    corax_result_note(&r, &rd, h, &o, note, sizeof note);
    assert_string_equal(note, "beta 360 is outside [0, 360)");

    rd = reading(20, NAN, NAN);
    rd.gamma = corax_rad(30);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    corax_result_note(&r, &rd, h, &o, note, sizeof note);
    assert_string_equal(note, "gamma is given without a plane (no alpha)");

    rd = reading(20, 30, 90);
    corax_convert_reading(NULL, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "unknown-hole");
    assert_false(r.located);
    corax_hole_free(h);

    /* a hole within the vertical limit has no bottom line: alpha gives the dip
     * alone (below), and alpha 90 still gives the plane (the core's
     * cross-section) */
    h = straight_hole(0, -88, 100);
    rd = reading(20, 30, 90);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "dip-only");
    assert_false(r.has_plane);
    assert_close(corax_deg(r.plane.dip), 60, 0, 1e-9, "dip-only: 90 - alpha");
    rd = reading(20, 90, NAN);
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_true(r.has_plane);
    assert_close(corax_deg(r.plane.dip), 2, 0, 1e-9, "alpha 90 in a hole plunging 88: dip 2");
    assert_string_equal(corax_condition_status(r.conditions), "near-perpendicular");
    corax_hole_free(h);
}

/* common practice: in a vertical hole the core axis is vertical, so a plane's
 * dip is the angle between its normal and the axis, 90 - alpha, whatever beta
 * says; its dip direction cannot be known. Alpha 60 gives dip 30, with or
 * without beta; the pole's plunge is 90 - dip (docs/check-values.md). */
static void test_vertical_hole_gives_the_dip(void **state)
{
    (void)state;
    corax_convert_options o = corax_convert_options_default();
    corax_hole *h = straight_hole(0, -90, 100);
    char note[400];
    const double betas[] = {NAN, 0, 135};
    for (int i = 0; i < 3; i++) {
        corax_reading rd = reading(40, 60, betas[i]);
        corax_result r;
        corax_convert_reading(h, &rd, &o, NULL, &r);
        assert_string_equal(corax_condition_status(r.conditions), "dip-only");
        assert_false(r.has_plane);
        assert_false(r.has_line);
        assert_true(r.located);
        assert_close(corax_deg(r.plane.dip), 30, 0, 1e-12, "vertical hole, alpha 60: dip 30");
        corax_result_note(&r, &rd, h, &o, note, sizeof note);
        assert_non_null(strstr(note, "nothing gives its direction"));
    }
    /* a line measured on its own has nothing to go by */
    corax_reading rd = corax_reading_empty();
    rd.depth = 40;
    rd.line_alpha = corax_rad(30);
    rd.line_beta = corax_rad(10);
    corax_result r;
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "no-reference-line");
    corax_hole_free(h);
}

/* A reading whose beta runs from an arbitrary line is unoriented until it is
 * turned; turned, it is the reading whose beta is the turned one, and the
 * status says how it was oriented. */
static void test_arbitrary_line_and_turn(void **state)
{
    (void)state;
    corax_convert_options o = corax_convert_options_default();
    o.conventions.beta_anticlockwise = 1; /* the turn is canonical: conventions apply first */
    corax_hole *h = straight_hole(120, -55, 200);
    corax_reading rd = reading(50, 40, 100);
    rd.gamma = corax_rad(30);
    rd.arbitrary_line = 1;
    corax_result r, want;
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "unoriented");
    assert_false(r.has_plane);
    char note[400];
    corax_result_note(&r, &rd, h, &o, note, sizeof note);
    assert_non_null(strstr(note, "arbitrary line"));
    rd.turn = corax_rad(25); /* canonical beta 260 + 25 = 285: measured anticlockwise 75 */
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_string_equal(corax_condition_status(r.conditions), "oriented-by-reference");
    corax_reading plain = reading(50, 40, 75);
    plain.gamma = corax_rad(30);
    corax_convert_reading(h, &plain, &o, NULL, &want);
    assert_true(r.has_plane && r.has_line);
    assert_close(r.plane.dip, want.plane.dip, 0, 1e-12, "turned: the plane of the turned beta");
    assert_close(r.plane.dip_direction, want.plane.dip_direction, 0, 1e-12,
                 "turned: the plane of the turned beta");
    assert_close(r.trend, want.trend, 0, 1e-12, "turned: gamma's line turns with its plane");
    corax_hole_free(h);
}

static void test_reading_lines(void **state)
{
    (void)state;
    corax_convert_options o = corax_convert_options_default();
    corax_hole *h = straight_hole(90, -45, 200);
    corax_result r;
    /* gamma 0 is the long axis's down-hole end: the plane's line of greatest
     * slope relative to the core */
    corax_reading rd = reading(30, 45, 270);
    rd.gamma = 0;
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_true(r.has_plane && r.has_line);
    assert_close(r.line.x * r.normal.x + r.line.y * r.normal.y + r.line.z * r.normal.z, 0, 0,
                 1e-12, "the line lies on its plane");
    assert_true(r.plunge >= 0);
    /* a line measured on its own along the core axis is the hole direction */
    rd = corax_reading_empty();
    rd.depth = 30;
    rd.line_alpha = 0;
    corax_convert_reading(h, &rd, &o, NULL, &r);
    assert_true(r.has_line);
    assert_close(corax_deg(r.trend), 90, 0, 1e-9, "line along the core: trend of the hole");
    assert_close(corax_deg(r.plunge), 45, 0, 1e-9, "line along the core: plunge of the hole");
    corax_hole_free(h);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_derived_alpha_beta_table),
        cmocka_unit_test(test_physical_sanity_picture),
        cmocka_unit_test(test_hudson_harrison_1997_inverse),
        cmocka_unit_test(test_alpha_90_is_perpendicular_to_the_hole),
        cmocka_unit_test(test_independent_construction_agrees),
        cmocka_unit_test(test_plane_round_trip),
        cmocka_unit_test(test_line_round_trips),
        cmocka_unit_test(test_convention_switches_equal_their_mappings),
        cmocka_unit_test(test_reading_conditions),
        cmocka_unit_test(test_vertical_hole_gives_the_dip),
        cmocka_unit_test(test_arbitrary_line_and_turn),
        cmocka_unit_test(test_reading_lines),
    };
    return cmocka_run_group_tests_name("core", tests, NULL, NULL);
}
