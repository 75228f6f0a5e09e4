/* Tests of the isoline tracer (marching squares): fields whose isolines are
 * known exactly or nearly, saddles, gaps and borders. */
#include <math.h>
#include <stdlib.h>

#include "corax/contour.h"
#include "corax/geometry.h"
#include "support/check.h"

typedef double (*field_fn)(double x, double y);

/* A grid of n x n nodes over [-1, 1]^2 holding f. */
static corax_grid sample(field_fn f, size_t n, double *values)
{
    corax_grid g = {n, n, -1, -1, 2.0 / (double)(n - 1), 2.0 / (double)(n - 1), values};
    for (size_t j = 0; j < n; j++)
        for (size_t i = 0; i < n; i++)
            values[j * n + i] = f(g.x0 + (double)i * g.dx, g.y0 + (double)j * g.dy);
    return g;
}

static double plane_field(double x, double y) { return 2 * x + y; }
static double bowl_field(double x, double y) { return x * x + y * y; }
static double two_hills(double x, double y)
{
    return exp(-20 * ((x - 0.5) * (x - 0.5) + y * y)) + exp(-20 * ((x + 0.5) * (x + 0.5) + y * y));
}

/* Derived: linear interpolation is exact for a linear field, so every point
 * of the isoline 2x + y = 0.3 lies on that line, and the line crosses the
 * square from border to border as one open polyline. */
static void test_linear_field_is_exact(void **state)
{
    (void)state;
    double v[41 * 41];
    corax_grid g = sample(plane_field, 41, v);
    corax_isolines lines = {0};
    assert_int_equal(corax_isolines_trace(&g, 0.3, &lines), CORAX_OK);
    assert_int_equal(lines.count, 1);
    assert_false(lines.closed[0]);
    assert_true(lines.points > 20);
    for (size_t k = 0; k < lines.points; k++)
        assert_close(2 * lines.xy[2 * k] + lines.xy[2 * k + 1], 0.3, 0, 1e-12,
                     "point on the line 2x + y = 0.3 (derived)");
    /* the ends are on the border of the square */
    double x0 = lines.xy[0], y0 = lines.xy[1];
    assert_true(fabs(fabs(x0) - 1) < 1e-12 || fabs(fabs(y0) - 1) < 1e-12);
    corax_isolines_clear(&lines);
}

/* Derived: the isoline x^2 + y^2 = 0.36 is the circle of radius 0.6, closed,
 * its points within the interpolation error O(h^2) of the circle, its area
 * (shoelace) close to pi 0.36. */
static void test_bowl_gives_closed_circle(void **state)
{
    (void)state;
    double *v = malloc(101 * 101 * sizeof *v);
    assert_non_null(v);
    corax_grid g = sample(bowl_field, 101, v);
    corax_isolines lines = {0};
    assert_int_equal(corax_isolines_trace(&g, 0.36, &lines), CORAX_OK);
    assert_int_equal(lines.count, 1);
    assert_true(lines.closed[0]);
    double area = 0;
    for (size_t k = 0; k < lines.points; k++) {
        size_t k2 = (k + 1) % lines.points;
        assert_close(hypot(lines.xy[2 * k], lines.xy[2 * k + 1]), 0.6, 0, 1e-3,
                     "point on the circle of radius 0.6 (derived)");
        area += lines.xy[2 * k] * lines.xy[2 * k2 + 1] - lines.xy[2 * k2] * lines.xy[2 * k + 1];
    }
    assert_close(fabs(area) / 2, CORAX_PI * 0.36, 2e-3, 0, "area inside the circle (derived)");
    /* a level nowhere reached gives nothing, and the same set is reused */
    assert_int_equal(corax_isolines_trace(&g, 5, &lines), CORAX_OK);
    assert_int_equal(lines.count, 0);
    corax_isolines_clear(&lines);
    free(v);
}

/* Two hills: a level below the saddle (0.01) encloses both in one line, a high level each in its
 * own; between them a saddle. Every line stays closed either way. */
static void test_saddle_and_separate_hills(void **state)
{
    (void)state;
    double *v = malloc(81 * 81 * sizeof *v);
    assert_non_null(v);
    corax_grid g = sample(two_hills, 81, v);
    corax_isolines lines = {0};
    assert_int_equal(corax_isolines_trace(&g, 0.5, &lines), CORAX_OK);
    assert_int_equal(lines.count, 2);
    assert_true(lines.closed[0] && lines.closed[1]);
    assert_int_equal(corax_isolines_trace(&g, 0.01, &lines), CORAX_OK);
    assert_int_equal(lines.count, 1);
    assert_true(lines.closed[0]);
    /* the saddle value itself (at the origin, about 2 e^-5): one line or two,
     * never a broken one */
    assert_int_equal(corax_isolines_trace(&g, 2 * exp(-5.0), &lines), CORAX_OK);
    for (size_t i = 0; i < lines.count; i++)
        assert_true(lines.closed[i]);
    corax_isolines_clear(&lines);
    free(v);
}

/* Nodes without a value cut the lines: the circle through a NaN column
 * comes out open, ending beside the gap. */
static void test_nan_nodes_cut_lines(void **state)
{
    (void)state;
    double *v = malloc(51 * 51 * sizeof *v);
    assert_non_null(v);
    corax_grid g = sample(bowl_field, 51, v);
    for (size_t j = 0; j < 51; j++)
        v[j * 51 + 25] = NAN; /* the column x = 0 */
    corax_isolines lines = {0};
    assert_int_equal(corax_isolines_trace(&g, 0.25, &lines), CORAX_OK);
    assert_int_equal(lines.count, 2);
    for (size_t i = 0; i < lines.count; i++) {
        assert_false(lines.closed[i]);
        for (size_t k = lines.start[i]; k < lines.start[i + 1]; k++)
            assert_true(fabs(lines.xy[2 * k]) >= g.dx - 1e-12);
    }
    corax_grid tiny = {1, 5, 0, 0, 1, 1, v};
    assert_int_equal(corax_isolines_trace(&tiny, 0, &lines), CORAX_EARG);
    corax_isolines_clear(&lines);
    free(v);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_linear_field_is_exact),
        cmocka_unit_test(test_bowl_gives_closed_circle),
        cmocka_unit_test(test_saddle_and_separate_hills),
        cmocka_unit_test(test_nan_nodes_cut_lines),
    };
    return cmocka_run_group_tests_name("geometry_contour", tests, NULL, NULL);
}
