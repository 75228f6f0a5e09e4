/* Tests of the geometry module: angles, directions, planes, apparent dip. */
#include <math.h>

#include "corax/geometry.h"
#include "geometry/vec.h"
#include "corax/section.h"
#include "support/check.h"

static void test_wrapping(void **state)
{
    (void)state;
    assert_close(corax_wrap_degrees(-10, 2), 350, 0, 0, "-10 wraps to 350");
    assert_close(corax_wrap_degrees(720.5, 2), 0.5, 0, 1e-12, "720.5 wraps to 0.5");
    /* printed to 2 places, 359.996 rounds to 360.00: it must read 0.00 */
    assert_close(corax_wrap_degrees(359.996, 2), 0, 0, 0, "360 after rounding reads 0");
    assert_close(corax_wrap_degrees(359.994, 2), 359.99, 0, 1e-9, "359.99 stays");
    assert_close(corax_wrap_azimuth(-1e-18), 0, 0, 0, "tiny negative azimuth wraps to 0");
    double w = corax_wrap_azimuth(-0.5);
    assert_true(w >= 0 && w < 2 * CORAX_PI);
}

/* Common practice: azimuth clockwise from north, plunge positive down; a
 * hole at azimuth 090 plunging 30 points east and down. */
static void test_direction_round_trip(void **state)
{
    (void)state;
    corax_vec3 v = corax_direction(corax_rad(90), corax_rad(30));
    assert_close(v.x, cos(corax_rad(30)), 0, 1e-15, "east component");
    assert_close(v.y, 0, 0, 1e-15, "north component");
    assert_close(v.z, -0.5, 0, 1e-15, "down is negative z");
    uint64_t seed = 1;
    for (int i = 0; i < 10000; i++) {
        double az = 2 * CORAX_PI * test_uniform(&seed);
        double pl = CORAX_PI * (test_uniform(&seed) - 0.5) * 0.999;
        double a2, p2;
        corax_direction_angles(corax_direction(az, pl), &a2, &p2);
        assert_close(azimuth_gap(corax_deg(a2), corax_deg(az)), 0, 0, 1e-9, "azimuth round trip");
        assert_close(p2, pl, 0, 1e-12, "plunge round trip");
    }
}

static void test_lines_are_reported_downward(void **state)
{
    (void)state;
    double t, p;
    corax_line_trend_plunge(corax_direction(corax_rad(30), corax_rad(-40)), &t, &p);
    assert_close(corax_deg(t), 210, 0, 1e-9, "an upward line reads from its lower end");
    assert_close(corax_deg(p), 40, 0, 1e-9, "plunge of the lower end");
}

/* Common practice: a plane's pole plunges 90 minus its dip, and trends
 * opposite the dip direction; dip direction = normal's horizontal azimuth. */
static void test_plane_from_normal(void **state)
{
    (void)state;
    uint64_t seed = 9;
    for (int i = 0; i < 10000; i++) {
        corax_plane p = {corax_rad(90 * test_uniform(&seed)), 2 * CORAX_PI * test_uniform(&seed)};
        corax_vec3 n = corax_plane_normal(p), up;
        if (i % 2)
            n = (corax_vec3){-n.x, -n.y, -n.z}; /* either sense of normal */
        corax_plane q = corax_plane_from_normal(n, &up);
        assert_close(q.dip, p.dip, 0, 1e-12, "dip from normal");
        if (p.dip > 1e-6)
            assert_close(azimuth_gap(corax_deg(q.dip_direction), corax_deg(p.dip_direction)), 0,
                         0, 1e-7, "dip direction from normal");
        assert_true(up.z >= 0);
        double pole_trend, pole_plunge;
        corax_line_trend_plunge(up, &pole_trend, &pole_plunge);
        assert_close(corax_deg(pole_plunge), 90 - corax_deg(q.dip), 0, 1e-9,
                     "pole plunge is 90 minus dip (common practice)");
    }
    corax_plane flat = corax_plane_from_normal((corax_vec3){0, 0, -2}, NULL);
    assert_close(flat.dip, 0, 0, 0, "horizontal plane");
    assert_close(flat.dip_direction, 0, 0, 0, "horizontal plane has dip direction 0");
}

/* Common practice: strike is 90 degrees anticlockwise of the dip direction
 * (right-hand rule) and horizontal; the dip line plunges at the dip toward
 * the dip direction; both lie in the plane. */
static void test_plane_axes(void **state)
{
    (void)state;
    uint64_t seed = 17;
    for (int i = 0; i < 10000; i++) {
        corax_plane p = {corax_rad(90 * test_uniform(&seed)), 2 * CORAX_PI * test_uniform(&seed)};
        corax_vec3 s, d, n = corax_plane_normal(p);
        corax_plane_axes(p, &s, &d);
        double az, pl;
        corax_direction_angles(s, &az, &pl);
        assert_close(azimuth_gap(corax_deg(az), corax_deg(p.dip_direction) - 90), 0, 0, 1e-9,
                     "strike is dip direction - 90 (right-hand rule, common practice)");
        assert_close(pl, 0, 0, 1e-12, "strike is horizontal");
        corax_direction_angles(d, &az, &pl);
        assert_close(pl, p.dip, 0, 1e-12, "dip line plunges at the dip");
        if (p.dip > 1e-6)
            assert_close(azimuth_gap(corax_deg(az), corax_deg(p.dip_direction)), 0, 0, 1e-9,
                         "dip line trends down the dip direction");
        assert_close(s.x * n.x + s.y * n.y + s.z * n.z, 0, 0, 1e-12, "strike in the plane");
        assert_close(d.x * n.x + d.y * n.y + d.z * n.z, 0, 0, 1e-12, "dip line in the plane");
        assert_close(s.x * d.x + s.y * d.y + s.z * d.z, 0, 0, 1e-12, "strike across the dip");
    }
}

/* J. B. Jukes (1859), The South Staffordshire Coalfield, appendix: beds
 * dipping north at 35 degrees, section NE-SW (45 degrees from the dip
 * direction): his table reads 26 deg 15 min; the formula gives 26.34. */
static void test_apparent_dip_jukes_1859(void **state)
{
    (void)state;
    corax_plane p = {corax_rad(35), 0};
    int toward;
    double a = corax_deg(corax_apparent_dip(p, corax_rad(45), &toward));
    assert_close(a, corax_deg(atan(tan(corax_rad(35)) * cos(corax_rad(45)))), 0, 1e-9,
                 "apparent dip formula");
    assert_close(a, 26.0 + 15.0 / 60.0, 0, 0.1, "Jukes (1859) table, 26 deg 15 min");
    assert_int_equal(toward, 1);
    corax_apparent_dip(p, corax_rad(225), &toward);
    assert_int_equal(toward, -1);
    /* the same section through the section module: the tick drawn for the
     * beds has Jukes' slope and falls toward the north-east end */
    corax_section s = corax_section_make(0, 0, corax_rad(45), 10);
    corax_section_dip d = corax_section_plane(&s, p);
    assert_close(corax_deg(d.apparent), a, 0, 1e-9, "section apparent dip, formula (Jukes 1859)");
    assert_close(corax_deg(atan2(-d.up, d.along)), 26.0 + 15.0 / 60.0, 0, 0.1,
                 "section trace slope, Jukes (1859) table");
    assert_close(corax_deg(d.toward_azimuth), 45, 0, 1e-9, "dips toward the NE end");
}

/* derived grid (docs/check-values.md): true dip, angle between section and dip
 * direction -> apparent dip. */
static void test_apparent_dip_derived_grid(void **state)
{
    (void)state;
    static const double grid[][3] = {
        {30, 30, 26.57}, {45, 45, 35.26}, {60, 60, 40.89}, {10, 80, 1.75}, {45, 10, 44.56}};
    for (int i = 0; i < 5; i++) {
        corax_plane p = {corax_rad(grid[i][0]), corax_rad(100)};
        double a = corax_deg(corax_apparent_dip(p, corax_rad(100 + grid[i][1]), NULL));
        assert_close(a, grid[i][2], 0, 0.005, "derived apparent dip grid");
        corax_section s = corax_section_make(0, 0, corax_rad(100 + grid[i][1]), 10);
        corax_section_dip d = corax_section_plane(&s, p);
        assert_close(corax_deg(atan2(-d.up, fabs(d.along))), grid[i][2], 0, 0.005,
                     "derived apparent dip grid, section trace slope");
    }
    corax_plane p = {corax_rad(50), corax_rad(100)};
    int toward;
    assert_close(corax_apparent_dip(p, corax_rad(10), &toward), 0, 0, 1e-12,
                 "a section along strike shows no dip");
    assert_int_equal(toward, 0);
    assert_close(corax_deg(corax_apparent_dip(p, corax_rad(100), NULL)), 50, 0, 1e-12,
                 "a section along the dip direction shows the true dip");
    corax_plane v = {corax_rad(90), corax_rad(100)};
    assert_close(corax_deg(corax_apparent_dip(v, corax_rad(130), NULL)), 90, 0, 1e-12,
                 "a vertical plane shows vertical unless cut along strike");
}

/* The fast arctangent agrees with the C library's atan2 (the reference) in
 * every quadrant, on the axes and at the origin. */
static void test_fast_atan2_matches_atan2(void **state)
{
    (void)state;
    uint64_t seed = 17;
    for (int i = 0; i < 200000; i++) {
        double y = (test_uniform(&seed) - 0.5) * pow(10, (int)(test_uniform(&seed) * 8) - 4);
        double x = (test_uniform(&seed) - 0.5) * pow(10, (int)(test_uniform(&seed) * 8) - 4);
        assert_close(fast_atan2(y, x), atan2(y, x), 4e-16, 4e-16, "fast_atan2 against atan2");
    }
    const double axes[][2] = {{0, 1}, {1, 0}, {0, -1}, {-1, 0}, {0, 0}, {1, 1}, {-1, -1}};
    for (int i = 0; i < 7; i++)
        assert_close(fast_atan2(axes[i][0], axes[i][1]), atan2(axes[i][0], axes[i][1]), 0, 4e-16,
                     "fast_atan2 on the axes");
}

/* Property: the trace a section shows for a plane is the line where the
 * plane meets the section plane, i.e. along n x m (n the plane's normal, m
 * the section plane's horizontal normal): an independent derivation of the
 * apparent dip formula and of the end it dips toward. */
static void test_section_trace_is_the_intersection_line(void **state)
{
    (void)state;
    uint64_t seed = 21;
    for (int i = 0; i < 20000; i++) {
        corax_plane p = {corax_rad(89.9 * test_uniform(&seed)), 2 * CORAX_PI * test_uniform(&seed)};
        double az = 2 * CORAX_PI * test_uniform(&seed);
        corax_section s = corax_section_make(0, 0, az, 10);
        corax_section_dip d = corax_section_plane(&s, p);
        corax_vec3 n = corax_plane_normal(p), m = {cos(az), -sin(az), 0};
        corax_vec3 l = {n.y * m.z - n.z * m.y, n.z * m.x - n.x * m.z, n.x * m.y - n.y * m.x};
        double along = l.x * sin(az) + l.y * cos(az), up = l.z;
        double len = hypot(along, up);
        if (len < 1e-6)
            continue; /* the plane is the section plane itself */
        /* parallel (either sense): the 2-D cross product vanishes */
        assert_close((d.along * up - d.up * along) / len, 0, 0, 1e-9,
                     "section trace along the intersection line");
        assert_close(hypot(d.along, d.up), 1, 0, 1e-12, "unit trace direction");
        assert_true(d.up <= 0);
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_wrapping),
        cmocka_unit_test(test_direction_round_trip),
        cmocka_unit_test(test_lines_are_reported_downward),
        cmocka_unit_test(test_plane_from_normal),
        cmocka_unit_test(test_plane_axes),
        cmocka_unit_test(test_apparent_dip_jukes_1859),
        cmocka_unit_test(test_apparent_dip_derived_grid),
        cmocka_unit_test(test_fast_atan2_matches_atan2),
        cmocka_unit_test(test_section_trace_is_the_intersection_line),
    };
    return cmocka_run_group_tests_name("geometry", tests, NULL, NULL);
}
