/* Tests of the stereonet projections: the published formulas' table, round
 * trips, and the property each projection is named for. */
#include <math.h>

#include "corax/projection.h"
#include "support/check.h"

static corax_vec3 line(double trend_deg, double plunge_deg)
{
    return corax_direction(corax_rad(trend_deg), corax_rad(plunge_deg));
}

/* Check values (derived from the projection formulas, reference table of
 * docs/check-values.md): equal-area r = sqrt(2) sin(theta/2), equal-angle
 * r = tan(theta/2), theta = 90 - plunge. */
static void test_projection_table_check_values(void **state)
{
    (void)state;
    static const struct {
        double trend, plunge, ea_x, ea_y, eq_x, eq_y;
    } table[] = {
        {0, 90, 0, 0, 0, 0},
        {90, 0, 1, 0, 1, 0},
        {45, 30, 0.5, 0.5, 0.408248, 0.408248},
        {120, 45, 0.468690, -0.270598, 0.358719, -0.207107},
    };
    for (size_t i = 0; i < sizeof table / sizeof table[0]; i++) {
        double x, y;
        corax_project(CORAX_EQUAL_AREA, line(table[i].trend, table[i].plunge), &x, &y);
        assert_close(x, table[i].ea_x, 0, 1e-6, "equal-area x (derived check table)");
        assert_close(y, table[i].ea_y, 0, 1e-6, "equal-area y (derived check table)");
        corax_project(CORAX_EQUAL_ANGLE, line(table[i].trend, table[i].plunge), &x, &y);
        assert_close(x, table[i].eq_x, 0, 1e-6, "equal-angle x (derived check table)");
        assert_close(y, table[i].eq_y, 0, 1e-6, "equal-angle y (derived check table)");
    }
}

/* Axial lines: the upward end of a line plots where its lower end does. */
static void test_upward_end_plots_as_lower_end(void **state)
{
    (void)state;
    double x1, y1, x2, y2;
    corax_project(CORAX_EQUAL_AREA, line(120, 45), &x1, &y1);
    corax_project(CORAX_EQUAL_AREA, line(300, -45), &x2, &y2);
    assert_close(x2, x1, 0, 1e-15, "upward end, x");
    assert_close(y2, y1, 0, 1e-15, "upward end, y");
}

static void test_round_trip(void **state)
{
    (void)state;
    uint64_t seed = 5;
    for (int p = 0; p < 2; p++)
        for (int i = 0; i < 20000; i++) {
            corax_vec3 v = line(360 * test_uniform(&seed), 90 * test_uniform(&seed)), u;
            double x, y;
            corax_project((corax_projection)p, v, &x, &y);
            assert_true(hypot(x, y) <= 1 + 1e-15);
            assert_int_equal(corax_unproject((corax_projection)p, x, y, &u), CORAX_OK);
            assert_close(u.x, v.x, 0, 1e-12, "round trip x");
            assert_close(u.y, v.y, 0, 1e-12, "round trip y");
            assert_close(u.z, v.z, 0, 1e-12, "round trip z");
        }
    corax_vec3 u;
    assert_int_equal(corax_unproject(CORAX_EQUAL_AREA, 0, sqrt(2), &u), CORAX_OK);
    assert_close(u.z, 1, 0, 1e-12, "r = sqrt 2 on the equal-area net is straight up");
    assert_int_equal(corax_unproject(CORAX_EQUAL_AREA, 1.2, 1.2, &u), CORAX_EVALUE);
    assert_int_equal(corax_unproject(CORAX_EQUAL_ANGLE, NAN, 0, &u), CORAX_EVALUE);
}

/* Common practice (Lambert's projection preserves area): uniformly spread
 * directions fall uniformly on the equal-area net, so the disc of radius 1/2
 * holds a quarter of them. */
static void test_equal_area_preserves_area(void **state)
{
    (void)state;
    uint64_t seed = 11;
    int inside = 0, n = 200000;
    for (int i = 0; i < n; i++) {
        /* uniform on the lower hemisphere: z uniform in [-1, 0] (Archimedes) */
        double z = -test_uniform(&seed), phi = 2 * CORAX_PI * test_uniform(&seed);
        double h = sqrt(1 - z * z), x, y;
        corax_project(CORAX_EQUAL_AREA, (corax_vec3){h * sin(phi), h * cos(phi), z}, &x, &y);
        inside += hypot(x, y) <= 0.5;
    }
    assert_close((double)inside / n, 0.25, 0, 0.005, "area fraction within r 1/2 (equal-area)");
}

/* Common practice (the stereographic projection maps circles on the sphere
 * to circles): a small circle of 20 degrees about 200/35 projects onto points
 * equidistant from one centre. */
static void test_equal_angle_keeps_circles(void **state)
{
    (void)state;
    corax_vec3 m = line(200, 35), a = {0, 0, 1};
    corax_vec3 u = {m.y * a.z - m.z * a.y, m.z * a.x - m.x * a.z, m.x * a.y - m.y * a.x};
    double nu = sqrt(u.x * u.x + u.y * u.y + u.z * u.z);
    u = (corax_vec3){u.x / nu, u.y / nu, u.z / nu};
    corax_vec3 b = {m.y * u.z - m.z * u.y, m.z * u.x - m.x * u.z, m.x * u.y - m.y * u.x};
    double px[36], py[36], c = cos(corax_rad(20)), s = sin(corax_rad(20));
    for (int k = 0; k < 36; k++) {
        double t = 2 * CORAX_PI * k / 36;
        corax_vec3 p = {c * m.x + s * (cos(t) * u.x + sin(t) * b.x),
                        c * m.y + s * (cos(t) * u.y + sin(t) * b.y),
                        c * m.z + s * (cos(t) * u.z + sin(t) * b.z)};
        corax_project(CORAX_EQUAL_ANGLE, p, &px[k], &py[k]);
    }
    /* the centre from points 0, 12 and 24 (circumcentre) */
    double ax = px[0], ay = py[0], bx = px[12], by = py[12], cx = px[24], cy = py[24];
    double d = 2 * (ax * (by - cy) + bx * (cy - ay) + cx * (ay - by));
    double ux = ((ax * ax + ay * ay) * (by - cy) + (bx * bx + by * by) * (cy - ay) +
                 (cx * cx + cy * cy) * (ay - by)) / d;
    double uy = ((ax * ax + ay * ay) * (cx - bx) + (bx * bx + by * by) * (ax - cx) +
                 (cx * cx + cy * cy) * (bx - ax)) / d;
    double r = hypot(ax - ux, ay - uy);
    for (int k = 0; k < 36; k++)
        assert_close(hypot(px[k] - ux, py[k] - uy), r, 1e-9, 0,
                     "projected small circle is a circle (equal-angle, common practice)");
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_projection_table_check_values),
        cmocka_unit_test(test_upward_end_plots_as_lower_end),
        cmocka_unit_test(test_round_trip),
        cmocka_unit_test(test_equal_area_preserves_area),
        cmocka_unit_test(test_equal_angle_keeps_circles),
    };
    return cmocka_run_group_tests_name("geometry_projection", tests, NULL, NULL);
}
