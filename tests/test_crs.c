/* Tests of the crs module: latitude, longitude and grid convergence through
 * PROJ against the Transverse Mercator check values and a published worked
 * example, local mine grids from two points and from an origin, and bad
 * input. Outside values are listed, with their sources, in
 * docs/check-values.md. */
#include <math.h>
#include <proj.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/crs.h"
#include "corax/geometry.h"
#include "support/check.h"

static corax_crs *open_crs(const char *definition)
{
    corax_crs *c = NULL;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_crs_new(definition, &c, &err);
    if (st != CORAX_OK)
        fail_msg("%s: %s", definition, err.message);
    return c;
}

/* Easting and northing of a latitude and longitude (degrees) by PROJ's own
 * forward transformation, an independent path from corax_crs_locate(). */
static void forward(const char *definition, double lat, double lon, double *e, double *n)
{
    PJ_CONTEXT *ctx = proj_context_create();
    proj_log_level(ctx, PJ_LOG_NONE);
    PJ *t = proj_create_crs_to_crs(ctx, "EPSG:4326", definition, NULL);
    PJ *v = proj_normalize_for_visualization(ctx, t);
    PJ_COORD r = proj_trans(v, PJ_FWD, proj_coord(lon, lat, 0, 0));
    *e = r.xy.x;
    *n = r.xy.y;
    proj_destroy(v);
    proj_destroy(t);
    proj_context_destroy(ctx);
}

/* Grid convergence, Transverse Mercator on WGS84 (derived from the ellipsoidal
 * series; Karney's closed form agrees to 2e-8 deg; docs/check-values.md):
 * lat 40.5, lon -73.5, CM -75 -> 0.974302; lat 60, lon 3, CM 0 -> 2.598673;
 * lat -33.9, lon 151.2, CM 153 -> 1.004172 (positive: grid north east of true
 * north). */
static void test_transverse_mercator_convergence(void **state)
{
    (void)state;
    static const struct {
        const char *crs;
        double lat, lon, convergence;
    } v[] = {
        {"EPSG:32618", 40.5, -73.5, 0.974302}, /* UTM zone 18N, CM -75 */
        {"+proj=tmerc +lon_0=0 +k=0.9996 +x_0=500000 +datum=WGS84 +units=m +type=crs", 60.0,
         3.0, 2.598673},
        {"EPSG:32756", -33.9, 151.2, 1.004172}, /* UTM zone 56S, CM 153 */
    };
    for (size_t i = 0; i < sizeof v / sizeof v[0]; i++) {
        corax_crs *c = open_crs(v[i].crs);
        double e, n, lat, lon, conv;
        forward(v[i].crs, v[i].lat, v[i].lon, &e, &n);
        assert_int_equal(corax_crs_locate(c, e, n, &lat, &lon, &conv, NULL), CORAX_OK);
        assert_close(corax_deg(lat), v[i].lat, 0, 1e-9, "latitude back through PROJ");
        assert_close(corax_deg(lon), v[i].lon, 0, 1e-9, "longitude back through PROJ");
        assert_close(corax_deg(conv), v[i].convergence, 0, 1e-6,
                     "TM convergence, ellipsoidal series (docs/check-values.md)");
        corax_crs_free(c);
    }
}

/* The convergence is the angle from true north to grid north: a short step
 * north along the meridian, projected by PROJ's forward transformation, runs
 * at grid azimuth -convergence. An independent check of the factors' sign. */
static void test_convergence_is_the_meridian_on_the_grid(void **state)
{
    (void)state;
    static const struct {
        const char *crs;
        double lat, lon;
    } v[] = {{"EPSG:32608", 62.8, -133.1}, {"EPSG:32608", 61.2, -137.9},
             {"EPSG:32755", -21.4, 148.2}, {"EPSG:2193", -41.3, 174.8}};
    for (size_t i = 0; i < sizeof v / sizeof v[0]; i++) {
        corax_crs *c = open_crs(v[i].crs);
        double e1, n1, e2, n2, conv;
        forward(v[i].crs, v[i].lat, v[i].lon, &e1, &n1);
        forward(v[i].crs, v[i].lat + 1e-5, v[i].lon, &e2, &n2);
        corax_error err;
        if (corax_crs_locate(c, e1, n1, NULL, NULL, &conv, &err) != CORAX_OK)
            fail_msg("%s: %s", v[i].crs, err.message);
        assert_close(atan2(e2 - e1, n2 - n1), -conv, 0, 1e-6,
                     "true north on the grid, by PROJ's forward transformation");
        corax_crs_free(c);
    }
}

/* J. P. Snyder (1987), Map Projections: A Working Manual, USGS Professional
 * Paper 1395, the ellipsoidal Transverse Mercator example (from memory, and
 * PROJ agrees): Clarke 1866, lat 40.5 N, lon 73.5 W, CM 75 W, k0 0.9996 gives
 * x 127106.5 m, y 4484124.4 m; as NAD27 / UTM zone 18N (false easting
 * 500000) that is E 627106.5, N 4484124.4. */
static void test_snyder_worked_example(void **state)
{
    (void)state;
    corax_crs *c = open_crs("EPSG:26718");
    assert_string_equal(corax_crs_name(c), "NAD27 / UTM zone 18N");
    assert_string_equal(corax_crs_definition(c), "EPSG:26718");
    double lat, lon;
    assert_int_equal(corax_crs_locate(c, 627106.5, 4484124.4, &lat, &lon, NULL, NULL), CORAX_OK);
    assert_close(corax_deg(lat), 40.5, 0, 1e-6, "Snyder 1987 TM example (docs/check-values.md)");
    assert_close(corax_deg(lon), -73.5, 0, 1e-6, "Snyder 1987 TM example (docs/check-values.md)");
    corax_crs_free(c);
}

/* Bad input: a CRS PROJ does not know, one in degrees, one in feet, and a
 * point the projection cannot map: each a clear error. A compound CRS with
 * heights gives its projected part. */
static void test_bad_crs(void **state)
{
    (void)state;
    static const struct {
        const char *crs;
        corax_status st;
        const char *says;
    } bad[] = {{"EPSG:99999", CORAX_ENOTFOUND, "PROJ does not know"},
               {"not a crs", CORAX_ENOTFOUND, "PROJ does not know"},
               {"EPSG:4326", CORAX_EVALUE, "not a projected"},
               {"EPSG:2263", CORAX_EVALUE, "foot"}};
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        corax_crs *c = NULL;
        corax_error err;
        corax_error_clear(&err);
        assert_int_equal(corax_crs_new(bad[i].crs, &c, &err), bad[i].st);
        assert_null(c);
        assert_non_null(strstr(err.message, bad[i].says));
    }
    corax_crs *c = open_crs("EPSG:32608+5773");
    assert_string_equal(corax_crs_name(c), "WGS 84 / UTM zone 8N");
    corax_error err;
    corax_error_clear(&err);
    double lat;
    assert_int_equal(corax_crs_locate(c, 1e12, 1e12, &lat, NULL, NULL, &err), CORAX_EVALUE);
    assert_non_null(strstr(err.message, "outside"));
    assert_int_equal(corax_crs_locate(c, NAN, 7e6, &lat, NULL, NULL, &err), CORAX_EVALUE);
    corax_crs_free(c);
    corax_crs_free(NULL);
}

/* A local grid from two points, checked by hand: local (1000, 2000) is CRS
 * (500000, 7000000); local (1000, 3000), 1000 m up the local north, is CRS
 * (500000 + 1000 sin 30, 7000000 + 1000 cos 30). So local north is 30 degrees
 * clockwise of grid north, the scale is 1, a local azimuth of 0 is grid
 * azimuth 30, and the local origin lies at 500000 - 1000 cos 30 - 2000 sin 30,
 * 7000000 + 1000 sin 30 - 2000 cos 30 (derived). */
static void test_local_grid_from_two_points(void **state)
{
    (void)state;
    double s = sin(30 * CORAX_DEG), c = cos(30 * CORAX_DEG);
    corax_local_grid g;
    assert_int_equal(corax_local_grid_from_points(1000, 2000, 500000, 7000000, 1000, 3000,
                                                  500000 + 1000 * s, 7000000 + 1000 * c, &g, NULL),
                     CORAX_OK);
    assert_close(corax_deg(g.rotation), 30.0, 0, 1e-9, "rotation by hand");
    assert_close(g.scale, 1.0, 0, 1e-12, "scale by hand");
    assert_close(g.east, 500000 - 1000 * c - 2000 * s, 0, 1e-6, "origin easting by hand");
    assert_close(g.north, 7000000 + 1000 * s - 2000 * c, 0, 1e-6, "origin northing by hand");
    double e, n;
    corax_local_grid_to_crs(&g, 1000 + 10, 2000, &e, &n); /* 10 m local east: grid azimuth 120 */
    assert_close(corax_deg(atan2(e - 500000, n - 7000000)), 120.0, 0, 1e-9, "local east on the grid");
    /* the text form gives the same grid; and a grid of half scale (local feet-like units) */
    corax_local_grid t;
    char text[200];
    snprintf(text, sizeof text, "1000,2000,500000,7000000,1000,3000,%.6f,%.6f", 500000 + 1000 * s,
             7000000 + 1000 * c);
    assert_int_equal(corax_local_grid_parse(text, &t, NULL), CORAX_OK);
    assert_close(t.rotation, g.rotation, 0, 1e-9, "text form");
    assert_int_equal(corax_local_grid_parse("0,0,0,0,0,10,0,5", &t, NULL), CORAX_OK);
    assert_close(t.scale, 0.5, 0, 1e-12, "scale from the lengths");
    assert_close(t.rotation, 0.0, 0, 1e-12, "no rotation");
}

/* Round trips: local to CRS and back; and the grid found again from two of
 * its own points (property tests over random grids). */
static void test_local_grid_round_trips(void **state)
{
    (void)state;
    uint64_t seed = 14;
    for (int i = 0; i < 200; i++) {
        corax_local_grid g, h;
        assert_int_equal(corax_local_grid_make(4e5 + 2e5 * test_uniform(&seed),
                                               6e6 + 1e6 * test_uniform(&seed),
                                               (2 * test_uniform(&seed) - 1) * CORAX_PI,
                                               0.2 + 2 * test_uniform(&seed), &g, NULL),
                         CORAX_OK);
        double x = 2e4 * test_uniform(&seed), y = 6e4 * test_uniform(&seed), e, n, x2, y2;
        corax_local_grid_to_crs(&g, x, y, &e, &n);
        corax_local_grid_from_crs(&g, e, n, &x2, &y2);
        assert_close(x2, x, 0, 1e-6, "local to CRS and back");
        assert_close(y2, y, 0, 1e-6, "local to CRS and back");
        double e2, n2;
        corax_local_grid_to_crs(&g, x + 500, y - 300, &e2, &n2);
        assert_int_equal(corax_local_grid_from_points(x, y, e, n, x + 500, y - 300, e2, n2, &h,
                                                      NULL),
                         CORAX_OK);
        assert_close(cos(h.rotation - g.rotation), 1.0, 0, 1e-12, "rotation found again");
        assert_close(h.scale, g.scale, 1e-9, 0, "scale found again");
        assert_close(h.east, g.east, 0, 1e-4, "origin found again");
        assert_close(h.north, g.north, 0, 1e-4, "origin found again");
    }
}

/* The origin form, and bad local grids: coinciding points (on either grid),
 * a scale not above 0, text of neither form. */
static void test_local_grid_origin_form_and_bad_input(void **state)
{
    (void)state;
    corax_local_grid g;
    assert_int_equal(corax_local_grid_parse("origin=512000,6954000,rotation=-12.5,scale=0.9996", &g,
                                            NULL),
                     CORAX_OK);
    assert_close(g.east, 512000, 0, 0, "origin");
    assert_close(corax_deg(g.rotation), -12.5, 0, 1e-12, "rotation in degrees");
    assert_close(g.scale, 0.9996, 0, 0, "scale");
    assert_int_equal(corax_local_grid_parse("origin=1,2,rotation=3", &g, NULL), CORAX_OK);
    assert_close(g.scale, 1.0, 0, 0, "scale 1 when left out");
    static const struct {
        const char *text, *says;
    } bad[] = {
        {"100,200,500000,7000000,100,200,500100,7000100", "coincide on the local grid"},
        {"100,200,500000,7000000,300,400,500000,7000000", "coincide on the CRS grid"},
        {"origin=1,2,rotation=3,scale=0", "scale above 0"},
        {"origin=1,2,rotation=3,scale=-1", "scale above 0"},
        {"origin=1,2", "origin=E,N,rotation=DEG"},
        {"origin=1,2,rotation=x", "origin=E,N,rotation=DEG"},
        {"origin=1,2,rotation=3,scale=1,extra", "origin=E,N,rotation=DEG"},
        {"1,2,3,4,5,6,7", "neither"},
        {"1,2,3,4,5,6,7,8,9", "neither"},
        {"1,2,3,4,5,6,7,x", "neither"},
        {"", "neither"},
        {"1,2,3,inf,5,6,7,8", "finite"},
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        corax_error err;
        corax_error_clear(&err);
        assert_int_equal(corax_local_grid_parse(bad[i].text, &g, &err), CORAX_EVALUE);
        if (!strstr(err.message, bad[i].says))
            fail_msg("'%s': '%s' does not say '%s'", bad[i].text, err.message, bad[i].says);
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_transverse_mercator_convergence),
        cmocka_unit_test(test_convergence_is_the_meridian_on_the_grid),
        cmocka_unit_test(test_snyder_worked_example),
        cmocka_unit_test(test_bad_crs),
        cmocka_unit_test(test_local_grid_from_two_points),
        cmocka_unit_test(test_local_grid_round_trips),
        cmocka_unit_test(test_local_grid_origin_form_and_bad_input),
    };
    return cmocka_run_group_tests_name("crs", tests, NULL, NULL);
}
