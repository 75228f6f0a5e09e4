/* Tests of the correction module and of the loader's per-station corrections:
 * the sign convention (declination - convergence - rotation), what each north
 * gets, the model and the CRS at a collar, dates from the survey, the collar
 * or a default, and bad input. Outside values: docs/check-values.md. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "corax/correction.h"
#include "corax/load.h"
#include "support/check.h"

/* The sign convention, worked by hand (derived; the README's example): a
 * declination of 17.2 degrees east, grid north 1.3 degrees east of true north
 * and local north 25 degrees west of grid north (rotation -25) add 17.2 - 1.3
 * + 25 = 40.9 degrees to a magnetic azimuth: 100 read by the compass is 140.9
 * on the local grid. A north-seeking gyro's azimuth gets -1.3 + 25 = 23.7; an
 * azimuth read on the grid nothing. */
static void test_sign_convention_by_hand(void **state)
{
    (void)state;
    corax_corrector c = corax_corrector_default();
    c.declination = corax_rad(17.2);
    c.convergence = corax_rad(1.3);
    corax_local_grid g;
    assert_int_equal(corax_local_grid_make(0, 0, corax_rad(-25.0), 1.0, &g, NULL), CORAX_OK);
    c.local_grid = &g;
    corax_site site;
    assert_int_equal(corax_corrector_site(&c, (corax_vec3){100, 200, 300}, NAN, NAN, &site, NULL),
                     CORAX_OK);
    static const struct {
        corax_north north;
        double total, declination, convergence, rotation;
    } want[] = {{CORAX_NORTH_MAGNETIC, 40.9, 17.2, 1.3, -25.0},
                {CORAX_NORTH_TRUE, 23.7, 0.0, 1.3, -25.0},
                {CORAX_NORTH_GRID, 0.0, 0.0, 0.0, 0.0}};
    for (size_t i = 0; i < 3; i++) {
        corax_correction k;
        assert_int_equal(corax_corrector_station(&c, &site, NAN, want[i].north, &k, NULL),
                         CORAX_OK);
        assert_close(corax_deg(k.total), want[i].total, 0, 1e-12, "total, by hand");
        assert_close(corax_deg(k.declination), want[i].declination, 0, 1e-12, "declination");
        assert_close(corax_deg(k.convergence), want[i].convergence, 0, 1e-12, "convergence");
        assert_close(corax_deg(k.rotation), want[i].rotation, 0, 1e-12, "rotation");
        assert_true(isnan(k.field.total)); /* no model, no field */
    }
    corax_correction k;
    corax_corrector_station(&c, &site, NAN, CORAX_NORTH_MAGNETIC, &k, NULL);
    assert_close(corax_deg(corax_wrap_azimuth(corax_rad(100.0) + k.total)), 140.9, 0, 1e-9,
                 "a compass azimuth of 100 on the local grid, by hand");
}

/* The words for each north, without regard to case. */
static void test_north_words(void **state)
{
    (void)state;
    corax_north n;
    assert_int_equal(corax_north_parse("True", 4, &n), 0);
    assert_int_equal(n, CORAX_NORTH_TRUE);
    assert_int_equal(corax_north_parse("grid", 4, &n), 0);
    assert_int_equal(n, CORAX_NORTH_GRID);
    assert_int_equal(corax_north_parse("gyro", 4, &n), -1);
    assert_int_equal(corax_north_parse("magneticx", 8, &n), 0); /* len bytes only */
    assert_string_equal(corax_north_name(CORAX_NORTH_MAGNETIC), "magnetic");
}

/* With a model and a CRS, the declination is the model's at the collar's
 * latitude, longitude and elevation on the station's date, the convergence
 * PROJ's at the collar (through the local grid), the rotation the grid's. */
static void test_model_and_projection_at_a_collar(void **state)
{
    (void)state;
    corax_magnetic_model *m = NULL;
    corax_crs *crs = NULL;
    assert_int_equal(corax_magnetic_builtin("WMM", &m, NULL), CORAX_OK);
    assert_int_equal(corax_crs_new("EPSG:32608", &crs, NULL), CORAX_OK);
    corax_local_grid g;
    assert_int_equal(corax_local_grid_parse("origin=582000,6890000,rotation=-12.5,scale=0.9996",
                                            &g, NULL),
                     CORAX_OK);
    corax_corrector c = corax_corrector_default();
    c.model = m;
    c.crs = crs;
    c.convergence_from_crs = 1;
    c.local_grid = &g;
    c.date = corax_decimal_year(2026, 7, 1);
    corax_vec3 collar = {10400, 50300, 510};
    corax_site site;
    assert_int_equal(corax_corrector_site(&c, collar, NAN, NAN, &site, NULL), CORAX_OK);
    double e, n, lat, lon, conv;
    corax_local_grid_to_crs(&g, collar.x, collar.y, &e, &n);
    assert_int_equal(corax_crs_locate(crs, e, n, &lat, &lon, &conv, NULL), CORAX_OK);
    assert_close(site.east, e, 0, 0, "the collar on the CRS grid");
    assert_close(site.latitude, lat, 0, 0, "the collar's latitude");
    assert_close(site.convergence, conv, 0, 0, "PROJ's convergence there");
    assert_true(conv > 0.0 && corax_deg(conv) < 3.0); /* east of zone 8's central meridian */
    corax_correction k;
    assert_int_equal(corax_corrector_station(&c, &site, NAN, CORAX_NORTH_MAGNETIC, &k, NULL),
                     CORAX_OK);
    corax_magnetic_field f;
    assert_int_equal(corax_magnetic_field_at(m, c.date, lat, lon, 510.0, &f, NULL), CORAX_OK);
    assert_close(k.declination, f.declination, 0, 0, "the model's declination there");
    assert_close(k.total, f.declination - conv - corax_rad(-12.5), 0, 1e-12, "the total");
    assert_string_equal(k.field.model, "WMM2025");
    /* latitude and longitude given directly are used as they are */
    assert_int_equal(corax_corrector_site(&c, collar, 0.5, -2.0, &site, NULL), CORAX_OK);
    assert_close(site.latitude, 0.5, 0, 0, "a collar's own latitude");
    assert_close(site.convergence, conv, 0, 0, "the convergence still from the CRS");
    /* a station's own date wins over the default; the field drifts with it */
    corax_correction later;
    assert_int_equal(corax_corrector_station(&c, &site, 2028.0, CORAX_NORTH_MAGNETIC, &later,
                                             NULL),
                     CORAX_OK);
    assert_close(later.date, 2028.0, 0, 0, "the station's date");
    assert_true(fabs(later.declination - k.declination) > 1e-4);
    corax_crs_free(crs);
    corax_magnetic_model_free(m);
}

/* Bad input: a model without a date, a date outside the model, a model
 * without any place, a convergence from a CRS that is not there. */
static void test_bad_setups(void **state)
{
    (void)state;
    corax_magnetic_model *m = NULL;
    assert_int_equal(corax_magnetic_builtin("WMM2025", &m, NULL), CORAX_OK);
    corax_corrector c = corax_corrector_default();
    c.model = m;
    corax_site site;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_corrector_site(&c, (corax_vec3){0, 0, 0}, NAN, NAN, &site, &err),
                     CORAX_EVALUE);
    assert_non_null(strstr(err.message, "needs the collar's place"));
    assert_int_equal(corax_corrector_site(&c, (corax_vec3){0, 0, 0}, 1.0, 2.0, &site, &err),
                     CORAX_OK);
    corax_correction k;
    assert_int_equal(corax_corrector_station(&c, &site, NAN, CORAX_NORTH_MAGNETIC, &k, &err),
                     CORAX_EVALUE);
    assert_non_null(strstr(err.message, "no survey date"));
    assert_int_equal(corax_corrector_station(&c, &site, 2031.5, CORAX_NORTH_MAGNETIC, &k, &err),
                     CORAX_EVALUE);
    assert_non_null(strstr(err.message, "outside the validity"));
    /* a gyro's station needs neither date nor model */
    assert_int_equal(corax_corrector_station(&c, &site, NAN, CORAX_NORTH_TRUE, &k, &err), CORAX_OK);
    c.model = NULL;
    c.convergence_from_crs = 1;
    assert_int_equal(corax_corrector_site(&c, (corax_vec3){0, 0, 0}, NAN, NAN, &site, &err),
                     CORAX_EVALUE);
    assert_non_null(strstr(err.message, "none is given"));
    corax_magnetic_model_free(m);
}

/* The record list: added in any order, found by hole and line once sorted. */
static void test_record_list(void **state)
{
    (void)state;
    corax_corrections list = {0};
    corax_station_record r;
    memset(&r, 0, sizeof r);
    static const char *const holes[] = {"B", "A", "B", "A"};
    static const long lines[] = {7, 9, 3, 2};
    for (int i = 0; i < 4; i++) {
        r.line = lines[i];
        r.depth = i;
        assert_int_equal(corax_corrections_add(&list, holes[i], &r), CORAX_OK);
    }
    assert_null(corax_corrections_find(&list, "A", 9)); /* not sorted yet */
    corax_corrections_sort(&list);
    const corax_station_record *f = corax_corrections_find(&list, "A", 9);
    assert_non_null(f);
    assert_close(f->depth, 1, 0, 0, "found by hole and line");
    assert_null(corax_corrections_find(&list, "A", 7));
    assert_null(corax_corrections_find(&list, "C", 7));
    corax_corrections_clear(&list);
    assert_int_equal(list.count, 0);
}

/* The loader: each station dated by its own date, else its collar's, else the
 * default; a gyro station (reference true) spared the declination; the
 * measured field kept; and per-station corrections applied to the azimuths. */
static void test_loader_per_station(void **state)
{
    (void)state;
    const char *cpath = test_tmp_path("corr_collars.csv");
    const char *spath = test_tmp_path("corr_surveys.csv");
    test_write_file(cpath, "hole,x,y,z,date\n"
                           "A,10000,50000,500,2025-06-01\n"
                           "B,10100,50000,500,\n");
    test_write_file(spath, "hole,depth,azimuth,dip,date,reference,total_field,field_dip\n"
                           "A,0,100,-60,2029-06-01,,56400,77.4\n"
                           "A,50,100,-60,,,,\n"
                           "A,100,100,-60,,true,,\n"
                           "B,0,200,-60,,grid,,\n"
                           "B,50,200,-60,,,,\n");
    corax_magnetic_model *m = NULL;
    corax_crs *crs = NULL;
    assert_int_equal(corax_magnetic_builtin("WMM", &m, NULL), CORAX_OK);
    assert_int_equal(corax_crs_new("EPSG:32608", &crs, NULL), CORAX_OK);
    corax_local_grid g;
    corax_local_grid_parse("origin=572000,6890000,rotation=-12.5", &g, NULL);
    corax_corrector c = corax_corrector_default();
    c.model = m;
    c.crs = crs;
    c.convergence_from_crs = 1;
    c.local_grid = &g;
    c.date = corax_decimal_year(2027, 1, 1);
    corax_corrections rec = {0};
    corax_load_options o = corax_load_options_default();
    o.declination = 50; /* replaced by the corrector */
    o.corrector = &c;
    o.corrections = &rec;
    corax_program *prog;
    corax_findings found = {0};
    assert_int_equal(corax_program_load(cpath, spath, &o, &prog, &found, NULL, NULL), CORAX_OK);
    assert_int_equal(found.count, 0);
    assert_int_equal(rec.count, 5);
    static const struct {
        const char *hole;
        long line;
        double date;
        corax_north north;
    } want[] = {{"A", 2, 2029.0 + 151.0 / 365.0, CORAX_NORTH_MAGNETIC}, /* its own date */
                {"A", 3, 2025.0 + 151.0 / 365.0, CORAX_NORTH_MAGNETIC}, /* its collar's */
                {"A", 4, 2025.0 + 151.0 / 365.0, CORAX_NORTH_TRUE},
                {"B", 5, 2027.0, CORAX_NORTH_GRID},
                {"B", 6, 2027.0, CORAX_NORTH_MAGNETIC}}; /* the default */
    for (size_t i = 0; i < 5; i++) {
        const corax_station_record *r = corax_corrections_find(&rec, want[i].hole, want[i].line);
        assert_non_null(r);
        assert_close(r->correction.date, want[i].date, 0, 1e-12, "the station's date");
        assert_int_equal(r->correction.north, want[i].north);
        const corax_hole *h = corax_program_find(prog, want[i].hole, 1);
        corax_station st;
        corax_hole_station(h, r->line - 2 - (want[i].hole[0] == 'B' ? 3 : 0), &st, NULL, NULL);
        assert_int_equal(st.line, r->line);
        assert_close(cos(st.azimuth - (r->azimuth + r->correction.total)), 1.0, 0, 1e-15,
                     "the station's azimuth corrected by its own total");
    }
    const corax_station_record *a0 = corax_corrections_find(&rec, "A", 2);
    assert_close(a0->total_field, 56400, 0, 0, "the measured total field");
    assert_close(corax_deg(a0->field_dip), 77.4, 0, 1e-12, "the measured dip of the field");
    assert_true(a0->correction.field.total > 50000); /* the model's, at the station */
    assert_true(isnan(corax_corrections_find(&rec, "A", 3)->total_field));
    /* years apart, the declination has moved: the model, not a constant */
    assert_true(fabs(a0->correction.declination -
                     corax_corrections_find(&rec, "A", 3)->correction.declination) > 0.01);
    corax_program_free(prog);
    corax_corrections_clear(&rec);
    corax_crs_free(crs);
    corax_magnetic_model_free(m);
    unlink(cpath);
    unlink(spath);
}

/* Bad input in the tables: a date outside the model, no date at all, a date
 * that is not one, a reference that is not a north: each a finding at its
 * line, the station left out. Without the model the dates are not needed, and
 * a date column of other words is no fault. */
static void test_loader_bad_rows(void **state)
{
    (void)state;
    const char *cpath = test_tmp_path("corrbad_collars.csv");
    const char *spath = test_tmp_path("corrbad_surveys.csv");
    test_write_file(cpath, "hole,x,y,z,latitude,longitude\nA,0,0,500,62.6,-133.4\n");
    test_write_file(spath, "hole,depth,azimuth,dip,date,reference\n"
                           "A,0,100,-60,2031-02-01,\n"
                           "A,50,100,-60,,\n"
                           "A,100,100,-60,last spring,\n"
                           "A,150,100,-60,2026-02-01,gyro\n"
                           "A,200,100,-60,2026-02-01,true\n");
    corax_magnetic_model *m = NULL;
    assert_int_equal(corax_magnetic_builtin("WMM", &m, NULL), CORAX_OK);
    corax_corrector c = corax_corrector_default();
    c.model = m;
    corax_load_options o = corax_load_options_default();
    o.corrector = &c;
    o.repair = 1;
    corax_program *prog;
    corax_findings found = {0};
    assert_int_equal(corax_program_load(cpath, spath, &o, &prog, &found, NULL, NULL), CORAX_OK);
    static const struct {
        long line;
        const char *check, *says;
    } want[] = {{4, "survey-row", "'last spring' is not an ISO 8601 date"},
                {5, "survey-row", "reference 'gyro' is not magnetic, true or grid"},
                {2, "survey-correction", "2031-02-01 is outside the validity"},
                {3, "survey-correction", "no survey date"}};
    assert_int_equal(found.count, 4);
    for (size_t i = 0; i < 4; i++) {
        assert_int_equal(found.item[i].line, want[i].line);
        assert_string_equal(found.item[i].check, want[i].check);
        if (!strstr(found.item[i].message, want[i].says))
            fail_msg("'%s' does not say '%s'", found.item[i].message, want[i].says);
    }
    const corax_hole *h = corax_program_find(prog, "A", 1);
    assert_int_equal(corax_hole_station_count(h), 1); /* the true-north station alone */
    corax_program_free(prog);
    corax_findings_clear(&found);
    /* without the model: dates and places are not needed, other words no fault */
    o.corrector = NULL;
    test_write_file(spath, "hole,depth,azimuth,dip,date\nA,0,100,-60,last spring\n");
    assert_int_equal(corax_program_load(cpath, spath, &o, &prog, &found, NULL, NULL), CORAX_OK);
    assert_int_equal(found.count, 0);
    corax_program_free(prog);
    corax_magnetic_model_free(m);
    unlink(cpath);
    unlink(spath);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_sign_convention_by_hand),
        cmocka_unit_test(test_north_words),
        cmocka_unit_test(test_model_and_projection_at_a_collar),
        cmocka_unit_test(test_bad_setups),
        cmocka_unit_test(test_record_list),
        cmocka_unit_test(test_loader_per_station),
        cmocka_unit_test(test_loader_bad_rows),
    };
    return cmocka_run_group_tests_name("correction", tests, NULL, NULL);
}
