/* Tests of intervals down holes: the desurvey at from, middle and to equals
 * the hole model's own answer at those depths; the check names reversed and
 * overlapping intervals by line; contacts are found where units change and
 * recover orientations planted by drawing from a Fisher distribution (Wood
 * 1994, through corax_fisher_draw), with the polarity the age order gives. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/interval.h"
#include "support/check.h"

/* A curved hole: the desurvey must follow the arc, not chords. */
static corax_hole *curved_hole(void)
{
    corax_collar c = {{1000, 2000, 300}, corax_rad(90), corax_rad(60), 1, 300};
    corax_station st[3] = {corax_station_make(0, corax_rad(90), corax_rad(60), 2),
                           corax_station_make(100, corax_rad(100), corax_rad(55), 3),
                           corax_station_make(200, corax_rad(115), corax_rad(50), 4)};
    corax_hole *h;
    assert_int_equal(corax_hole_new("H1", &c, st, 3, 0, &h, NULL), CORAX_OK);
    return h;
}

static void test_desurvey_equals_hole_at(void **state)
{
    (void)state;
    corax_hole *h = curved_hole();
    const double iv[][2] = {{0, 12.5}, {12.5, 99.9}, {150, 150}, {180, 260}, {290, 340}};
    size_t hint = 0;
    for (size_t i = 0; i < sizeof iv / sizeof iv[0]; i++) {
        corax_interval_points p;
        assert_int_equal(corax_interval_desurvey(h, iv[i][0], iv[i][1], &hint, &p), CORAX_OK);
        const double depth[3] = {iv[i][0], 0.5 * (iv[i][0] + iv[i][1]), iv[i][1]};
        const corax_hole_point *got[3] = {&p.from, &p.mid, &p.to};
        corax_where worst = CORAX_WHERE_SURVEYED;
        for (int k = 0; k < 3; k++) {
            corax_hole_point want;
            assert_int_equal(corax_hole_at(h, depth[k], NULL, &want), CORAX_OK);
            /* the same depth gives the same point to 1e-9 m, whatever the hint */
            assert_close(got[k]->position.x, want.position.x, 0, 1e-9, "got[k]->position.x");
            assert_close(got[k]->position.y, want.position.y, 0, 1e-9, "got[k]->position.y");
            assert_close(got[k]->position.z, want.position.z, 0, 1e-9, "got[k]->position.z");
            assert_close(got[k]->tangent.x, want.tangent.x, 0, 1e-12, "got[k]->tangent.x");
            assert_close(got[k]->tangent.z, want.tangent.z, 0, 1e-12, "got[k]->tangent.z");
            if (want.where > worst)
                worst = want.where;
        }
        assert_int_equal(p.where, worst);
    }
    /* beyond the recorded length: the worst place is reported */
    corax_interval_points p;
    assert_int_equal(corax_interval_desurvey(h, 290, 340, NULL, &p), CORAX_OK);
    assert_int_equal(p.where, CORAX_WHERE_BEYOND_END);
    assert_int_equal(corax_interval_desurvey(h, 30, 20, NULL, &p), CORAX_EVALUE);
    assert_int_equal(corax_interval_desurvey(h, -1, 20, NULL, &p), CORAX_EVALUE);
    assert_int_equal(corax_interval_desurvey(h, NAN, 20, NULL, &p), CORAX_EVALUE);
    corax_hole_free(h);
}

static const char *name_of(long hole, void *ctx)
{
    (void)ctx;
    return hole == 0 ? "A1" : "B2";
}

static void test_check_names_lines(void **state)
{
    (void)state;
    /* hole 0: 0-10, 8-20 overlaps (line 3 on line 2), 20-30 touches, 35-32
     * reversed, 40-60 and a short 45-50 inside it; hole 1 overlaps nothing
     * of hole 0 */
    corax_interval v[] = {{0, 0, 10, 2, 0, 0},  {0, 8, 20, 3, 0, 0},  {0, 20, 30, 4, 0, 0},
                          {0, 35, 32, 5, 0, 0}, {0, 40, 60, 6, 0, 0}, {0, 45, 50, 7, 0, 0},
                          {1, 5, 25, 8, 0, 0}};
    corax_findings f = {0};
    assert_int_equal(corax_intervals_check(v, 7, "log.csv", name_of, NULL, &f), CORAX_OK);
    assert_int_equal(f.count, 3);
    long want_line[] = {3, 5, 7}, other[] = {2, 0, 6};
    corax_interval_fault want_fault[] = {CORAX_INTERVAL_OVERLAP, CORAX_INTERVAL_REVERSED,
                                         CORAX_INTERVAL_OVERLAP};
    for (size_t i = 0; i < f.count; i++) {
        assert_int_equal(f.item[i].line, want_line[i]);
        assert_string_equal(f.item[i].hole, "A1");
        assert_int_equal(f.item[i].severity, CORAX_WARNING);
    }
    assert_non_null(strstr(f.item[0].message, "on line 2"));
    assert_non_null(strstr(f.item[1].message, "reversed"));
    assert_non_null(strstr(f.item[2].message, "on line 6"));
    for (size_t i = 0; i < 7; i++) {
        corax_interval_fault fault = CORAX_INTERVAL_OK;
        long o = 0;
        for (int k = 0; k < 3; k++)
            if (v[i].line == want_line[k]) {
                fault = want_fault[k];
                o = other[k];
            }
        assert_int_equal(v[i].fault, fault);
        assert_int_equal(v[i].other_line, o);
    }
    corax_findings_clear(&f);
}

/* A straight hole: azimuth 90, plunge 60 from (0, 0, 0). */
static corax_hole *straight_hole(void)
{
    corax_collar c = {{0, 0, 0}, corax_rad(90), corax_rad(60), 1, 200};
    corax_hole *h;
    assert_int_equal(corax_hole_new("S", &c, NULL, 0, 0, &h, NULL), CORAX_OK);
    return h;
}

/* Readings near a depth drawn from a Fisher distribution about a plane's
 * normal, either sense at random (a plane's normal has no sense). */
static size_t planted(corax_contact_reading *r, double depth, corax_plane plane, double kappa,
                      size_t n, uint64_t seed)
{
    corax_vec3 mean = corax_plane_normal(plane);
    for (size_t i = 0; i < n; i++) {
        double u1 = test_uniform(&seed), u2 = test_uniform(&seed);
        corax_vec3 v = corax_fisher_draw(mean, kappa, u1, u2);
        if (test_uniform(&seed) < 0.5)
            v = (corax_vec3){-v.x, -v.y, -v.z};
        r[i] = (corax_contact_reading){depth - 1.5 + 3.0 * (double)i / (double)n, v};
    }
    return n;
}

static double angle_between_axes(corax_vec3 a, corax_vec3 b)
{
    double d = fabs(a.x * b.x + a.y * b.y + a.z * b.z);
    return acos(d > 1 ? 1 : d);
}

static void test_contacts_planted(void **state)
{
    (void)state;
    corax_hole *h = straight_hole();
    /* units 0 (0-50), 1 (50-120), 2 (120-160), an unlogged stretch, 3
     * (165-200); an interval without a unit does not make a contact */
    corax_unit_interval iv[] = {{0, 30, 0, 2},    {30, 50, 0, 3},  {50, 90, 1, 4},
                                {90, 120, 1, 5},  {120, 160, 2, 6}, {160, 165, -1, 7},
                                {165, 200, 3, 8}};
    corax_plane p1 = {corax_rad(40), corax_rad(250)}, p2 = {corax_rad(65), corax_rad(20)};
    corax_contact_reading r[64];
    size_t n = planted(r, 50, p1, 200, 20, 7);
    n += planted(r + n, 120, p2, 200, 20, 11);
    r[n++] = (corax_contact_reading){60, {0, 0, 1}}; /* outside every window */
    const int rank[] = {0, 2, 1, -1};               /* 0 youngest, then 2, then 1 */
    corax_contact *c;
    size_t nc;
    assert_int_equal(corax_contacts_find(h, iv, 7, r, n, 2.0, rank, 4, &c, &nc), CORAX_OK);
    assert_int_equal(nc, 3);
    /* 50 m: unit 0 above unit 1 */
    assert_close(c[0].depth, 50, 0, 1e-12, "c[0].depth");
    assert_int_equal(c[0].above, 0);
    assert_int_equal(c[0].below, 1);
    assert_int_equal(c[0].line_below, 4);
    assert_int_equal(c[0].count, 20);
    assert_int_equal(c[0].status, CORAX_CONTACT_ORIENTED);
    /* 20 draws with kappa 200: the mean lies within a few degrees (the 95%
     * cone of Fisher 1953 is about 140/sqrt(kappa n) = 2.2 degrees) */
    assert_true(angle_between_axes(c[0].normal, corax_plane_normal(p1)) < corax_rad(3));
    assert_true(c[0].kappa > 80 && c[0].kappa < 400);
    /* the hole runs down along -normal: unit 0, younger and above, lies
     * along the upward normal: upright */
    assert_int_equal(c[0].polarity, 1);
    assert_close(c[0].younging.z, c[0].normal.z, 0, 1e-15, "c[0].younging.z");
    corax_hole_point at50;
    corax_hole_at(h, 50, NULL, &at50);
    assert_close(c[0].point.position.x, at50.position.x, 0, 1e-12, "c[0].point.position.x");
    /* 120 m: unit 1 above unit 2, and 2 is the younger: younging down-hole */
    assert_int_equal(c[1].count, 20);
    assert_true(angle_between_axes(c[1].normal, corax_plane_normal(p2)) < corax_rad(3));
    assert_int_equal(c[1].polarity, -1);
    assert_close(c[1].younging.x, -c[1].normal.x, 0, 1e-15, "c[1].younging.x");
    /* 2 to 3 across the gap (the interval without a unit passed over):
     * the middle of the unlogged 160-165, nothing near, unit 3 not ranked */
    assert_close(c[2].depth, 162.5, 0, 1e-12, "c[2].depth");
    assert_close(c[2].gap, 5, 0, 1e-12, "c[2].gap");
    assert_int_equal(c[2].status, CORAX_CONTACT_NONE_NEAR);
    assert_int_equal(c[2].count, 0);
    assert_int_equal(c[2].polarity, 0);
    assert_true(isnan(c[2].kappa));
    free(c);
    /* the readings lie every 0.15 m, one at 50 m itself: a window of 0.1 m
     * takes that one alone (no kappa), and without an age order no polarity;
     * a negative window is refused */
    assert_int_equal(corax_contacts_find(h, iv, 7, r, n, 0.1, NULL, 0, &c, &nc), CORAX_OK);
    assert_int_equal(c[0].count, 1);
    assert_int_equal(c[0].status, CORAX_CONTACT_ORIENTED);
    assert_true(isnan(c[0].kappa));
    assert_int_equal(c[0].polarity, 0);
    free(c);
    assert_int_equal(corax_contacts_find(h, iv, 7, r, n, -1.0, NULL, 0, &c, &nc), CORAX_EARG);
    corax_hole_free(h);
}

static void test_contacts_overlap_and_no_path(void **state)
{
    (void)state;
    corax_collar none = {{5, 6, 7}, 0, 0, 0, NAN};
    corax_hole *h;
    assert_int_equal(corax_hole_new("N", &none, NULL, 0, 0, &h, NULL), CORAX_OK);
    /* the second interval overlaps the first: passed over, so the change
     * 0 -> 2 at 20 is the only contact */
    corax_unit_interval iv[] = {{0, 10, 0, 2}, {5, 15, 1, 3}, {10, 20, 0, 4}, {20, 30, 2, 5}};
    corax_contact_reading r = {20.5, {0, 0, 1}};
    corax_contact *c;
    size_t nc;
    assert_int_equal(corax_contacts_find(h, iv, 4, &r, 1, 2.0, NULL, 0, &c, &nc), CORAX_OK);
    assert_int_equal(nc, 1);
    assert_close(c[0].depth, 20, 0, 0, "c[0].depth");
    assert_int_equal(c[0].status, CORAX_CONTACT_NO_PATH);
    assert_int_equal(c[0].count, 1);
    free(c);
    corax_hole_free(h);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_desurvey_equals_hole_at),
        cmocka_unit_test(test_check_names_lines),
        cmocka_unit_test(test_contacts_planted),
        cmocka_unit_test(test_contacts_overlap_and_no_path),
    };
    return cmocka_run_group_tests_name("interval", tests, NULL, NULL);
}
