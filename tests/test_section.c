/* Tests of the section module: projection onto a vertical section, the slab,
 * planes in the section and hole paths projected into it. The apparent dip
 * against Jukes (1859) and the derived grid is in test_geometry.c, which
 * checks corax_section_plane() beside corax_apparent_dip(). */
#include <math.h>
#include <stdlib.h>

#include "corax/section.h"
#include "support/check.h"

static corax_hole *straight_hole(corax_vec3 collar_at, double azimuth_deg, double plunge_deg,
                                 double length)
{
    corax_collar c = {collar_at, corax_rad(azimuth_deg), corax_rad(plunge_deg), 1, length};
    corax_hole *h = NULL;
    assert_int_equal(corax_hole_new("S", &c, NULL, 0, 0.0, &h, NULL), CORAX_OK);
    return h;
}

/* Common practice: distance along a section is measured toward its azimuth;
 * we put positive offsets on the right looking along it (azimuth + 90). */
static void test_projection_axes(void **state)
{
    (void)state;
    corax_section s = corax_section_make(1000, 2000, corax_rad(90), 20);
    corax_section_point p = corax_section_project(&s, (corax_vec3){1010, 2003, 450});
    assert_close(p.along, 10, 0, 1e-12, "east of the origin is along an east-facing section");
    assert_close(p.offset, -3, 0, 1e-12, "north is on the left looking east");
    assert_close(p.elevation, 450, 0, 0, "elevation is z");
    s = corax_section_make(0, 0, 0, 20);
    p = corax_section_project(&s, (corax_vec3){4, -7, 0});
    assert_close(p.along, -7, 0, 1e-12, "south is behind a north-facing section");
    assert_close(p.offset, 4, 0, 1e-12, "east is on the right looking north");
    assert_true(corax_section_in_slab(&s, &(corax_section_point){0, 10, 0}));
    assert_false(corax_section_in_slab(&s, &(corax_section_point){0, -10.001, 0}));
    assert_true(corax_section_in_range(&s, -1e300));
    s.from = -5;
    s.to = 5;
    assert_false(corax_section_in_range(&s, -7));
    assert_true(corax_section_in_range(&s, 5));
}

/* Properties: the projection is a rotation about the origin (horizontal
 * distance kept), and turning the section by 180 degrees negates both. */
static void test_projection_is_a_rotation(void **state)
{
    (void)state;
    uint64_t seed = 5;
    for (int i = 0; i < 10000; i++) {
        double az = 2 * CORAX_PI * test_uniform(&seed);
        corax_section s = corax_section_make(500, -300, az, 10);
        corax_section b = corax_section_make(500, -300, az + CORAX_PI, 10);
        corax_vec3 p = {2000 * test_uniform(&seed) - 500, 2000 * test_uniform(&seed) - 1300,
                        100 * test_uniform(&seed)};
        corax_section_point q = corax_section_project(&s, p), r = corax_section_project(&b, p);
        assert_close(hypot(q.along, q.offset), hypot(p.x - 500, p.y + 300), 1e-13, 1e-12,
                     "horizontal distance kept");
        assert_close(r.along, -q.along, 0, 1e-9, "reversed section: along negated");
        assert_close(r.offset, -q.offset, 0, 1e-9, "reversed section: offset negated");
    }
}

/* Common practice: a section along a plane's dip direction shows its true
 * dip, one along its strike shows no dip; the trace then runs flat. */
static void test_true_dip_and_strike_sections(void **state)
{
    (void)state;
    corax_plane p = {corax_rad(60), corax_rad(130)};
    corax_section along_dip = corax_section_make(0, 0, corax_rad(130), 10);
    corax_section_dip d = corax_section_plane(&along_dip, p);
    assert_close(corax_deg(d.apparent), 60, 0, 1e-9, "true dip along the dip direction (common practice)");
    assert_int_equal(d.toward, 1);
    assert_close(corax_deg(d.toward_azimuth), 130, 0, 1e-9, "dips toward the azimuth end");
    assert_close(d.up / d.along, -tan(corax_rad(60)), 0, 1e-9, "trace slope is the true dip");
    corax_section against = corax_section_make(0, 0, corax_rad(310), 10);
    d = corax_section_plane(&against, p);
    assert_close(corax_deg(d.apparent), 60, 0, 1e-9, "true dip looking the other way");
    assert_int_equal(d.toward, -1);
    assert_close(corax_deg(d.toward_azimuth), 130, 0, 1e-9, "dips toward the far end");
    assert_true(d.along < 0 && d.up < 0);
    corax_section strike = corax_section_make(0, 0, corax_rad(40), 10);
    d = corax_section_plane(&strike, p);
    assert_close(d.apparent, 0, 0, 1e-12, "no dip along strike (common practice)");
    assert_int_equal(d.toward, 0);
    assert_true(isnan(d.toward_azimuth));
    assert_close(d.along, 1, 0, 0, "flat trace");
    assert_close(d.up, 0, 0, 0, "flat trace");
}

/* Common practice: a straight hole drilled along the section's azimuth lies
 * in the section plane and shows its true plunge there. */
static void test_straight_hole_shows_true_plunge(void **state)
{
    (void)state;
    static const double plunges[] = {30, 55, 60, 75, 89, -20};
    for (int i = 0; i < 6; i++) {
        corax_hole *h = straight_hole((corax_vec3){10250, 50120, 512.4}, 135, plunges[i], 300);
        corax_section s = corax_section_make(10250, 50120, corax_rad(135), 20);
        corax_section_sample *t;
        size_t n;
        assert_int_equal(corax_section_trace(&s, h, 5, &t, &n), CORAX_OK);
        assert_int_equal(n, 61);
        for (size_t k = 1; k < n; k++) {
            double shown = atan2(t[0].at.elevation - t[k].at.elevation, t[k].at.along - t[0].at.along);
            assert_close(corax_deg(shown), plunges[i], 0, 1e-9,
                         "projected trace shows the true plunge (common practice)");
            assert_close(t[k].at.offset, 0, 0, 1e-9, "the hole lies in the section plane");
            assert_true(t[k].in_slab);
        }
        assert_true(corax_section_trace_reaches(&s, t, n));
        free(t);
        corax_hole_free(h);
    }
}

/* derived: a straight hole at azimuth 090, plunge 30, collared 50 m west of
 * a north-facing section, has offset -50 + d cos 30 and crosses the faces of
 * a 20 m slab at d = (50 -+ 10) / cos 30. */
static void test_trace_crosses_the_faces(void **state)
{
    (void)state;
    corax_hole *h = straight_hole((corax_vec3){-50, 0, 0}, 90, 30, 120);
    corax_section s = corax_section_make(0, 0, 0, 20);
    corax_section_sample *t;
    size_t n;
    assert_int_equal(corax_section_trace(&s, h, 7, &t, &n), CORAX_OK);
    double want[2] = {40 / cos(corax_rad(30)), 60 / cos(corax_rad(30))};
    int found = 0;
    for (size_t k = 0; k < n; k++) {
        if (k)
            assert_true(t[k].depth > t[k - 1].depth);
        double off = -50 + t[k].depth * cos(corax_rad(30));
        assert_close(t[k].at.offset, off, 0, 1e-9, "offset of a straight hole (derived)");
        assert_int_equal(t[k].in_slab, fabs(off) <= 10 + 1e-3);
        for (int j = 0; j < 2; j++)
            if (fabs(t[k].depth - want[j]) < 1e-3)
                found |= 1 << j;
    }
    assert_int_equal(found, 3);
    assert_true(corax_section_trace_reaches(&s, t, n));
    /* a stretch of the section that the hole misses */
    s.from = 10;
    s.to = 100;
    assert_false(corax_section_trace_reaches(&s, t, n));
    free(t);
    /* a slab thinner than the step: the path still enters and leaves it */
    s = corax_section_make(0, 0, 0, 2);
    assert_int_equal(corax_section_trace(&s, h, 25, &t, &n), CORAX_OK);
    found = 0;
    for (size_t k = 0; k < n; k++)
        found += t[k].in_slab;
    assert_int_equal(found, 2);
    assert_true(corax_section_trace_reaches(&s, t, n));
    free(t);
    /* a slab the hole never reaches */
    s = corax_section_make(500, 0, 0, 20);
    assert_int_equal(corax_section_trace(&s, h, 5, &t, &n), CORAX_OK);
    assert_false(corax_section_trace_reaches(&s, t, n));
    free(t);
    corax_hole_free(h);
}

/* Property, on curved holes: every crossing sample lies on a face of the slab
 * (checked against corax_hole_at, independently of the bisection), and the
 * samples are in depth order. */
static void test_crossings_lie_on_the_faces(void **state)
{
    (void)state;
    uint64_t seed = 11;
    for (int i = 0; i < 200; i++) {
        corax_collar c = {{0, 0, 0}, 0, 0, 0, 400};
        corax_station st[4];
        double az = 360 * test_uniform(&seed);
        for (int k = 0; k < 4; k++) {
            st[k] = corax_station_make(k * 100.0, corax_rad(az + 20 * k * test_uniform(&seed)),
                                       corax_rad(40 + 30 * test_uniform(&seed)), 0);
        }
        corax_hole *h = NULL;
        assert_int_equal(corax_hole_new("C", &c, st, 4, 0, &h, NULL), CORAX_OK);
        corax_section s = corax_section_make(100 * test_uniform(&seed) - 50, 50,
                                             corax_rad(360 * test_uniform(&seed)),
                                             5 + 40 * test_uniform(&seed));
        corax_section_sample *t;
        size_t n;
        assert_int_equal(corax_section_trace(&s, h, 5, &t, &n), CORAX_OK);
        for (size_t k = 1; k < n; k++) {
            assert_true(t[k].depth > t[k - 1].depth);
            if (t[k].in_slab == t[k - 1].in_slab)
                continue;
            const corax_section_sample *face = t[k].in_slab ? &t[k] : &t[k - 1];
            corax_hole_point pt;
            corax_hole_at(h, face->depth, NULL, &pt);
            corax_section_point q = corax_section_project(&s, pt.position);
            assert_close(fabs(q.offset), s.half_width, 0, 1e-3, "crossing on the slab's face");
        }
        free(t);
        corax_hole_free(h);
    }
}

static void test_hole_without_path(void **state)
{
    (void)state;
    corax_collar c = {{0, 0, 0}, 0, 0, 0, NAN};
    corax_hole *h = NULL;
    assert_int_equal(corax_hole_new("N", &c, NULL, 0, 0, &h, NULL), CORAX_OK);
    corax_section s = corax_section_make(0, 0, 0, 10);
    corax_section_sample *t = (corax_section_sample *)&s;
    size_t n = 7;
    assert_int_equal(corax_section_trace(&s, h, 5, &t, &n), CORAX_ENOTFOUND);
    assert_null(t);
    assert_int_equal(n, 0);
    corax_hole_free(h);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_projection_axes),
        cmocka_unit_test(test_projection_is_a_rotation),
        cmocka_unit_test(test_true_dip_and_strike_sections),
        cmocka_unit_test(test_straight_hole_shows_true_plunge),
        cmocka_unit_test(test_trace_crosses_the_faces),
        cmocka_unit_test(test_crossings_lie_on_the_faces),
        cmocka_unit_test(test_hole_without_path),
    };
    return cmocka_run_group_tests_name("section", tests, NULL, NULL);
}
