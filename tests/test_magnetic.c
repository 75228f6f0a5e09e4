/* Tests of the magnetic module: the World Magnetic Model against its official
 * test values, dates, coefficient files in both COF layouts, and bad input.
 * Every outside value is listed, with its source, in docs/check-values.md. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/geometry.h"
#include "corax/magnetic.h"
#include "support/check.h"

/* One test point: decimal year, height above the WGS84 ellipsoid (km),
 * latitude and longitude (degrees), then X, Y, Z, H, F (nT), I and D (deg). */
typedef struct test_value {
    double year, height, lat, lon, x, y, z, h, f, incl, decl;
} test_value;

/* WMM2015 technical report (Chulliat et al. 2015, "The US/UK World Magnetic
 * Model for 2015-2020"), test values; as carried by the npm package
 * geomagnetism 0.2.0 (test/values.csv). Published: docs/check-values.md. */
static const test_value wmm2015[] = {
    {2015.0, 0, 80, 0, 6627.1, -445.9, 54432.3, 6642.1, 54836.0, 83.04, -3.85},
    {2015.0, 0, 0, 120, 39518.2, 392.9, -11252.4, 39520.2, 41090.9, -15.89, 0.57},
    {2015.0, 0, -80, 240, 5797.3, 15761.1, -52919.1, 16793.5, 55519.8, -72.39, 69.81},
    {2015.0, 100, 80, 0, 6314.3, -471.6, 52269.8, 6331.9, 52652.0, 83.09, -4.27},
    {2015.0, 100, 0, 120, 37535.6, 364.4, -10773.4, 37537.3, 39052.7, -16.01, 0.56},
    {2015.0, 100, -80, 240, 5613.1, 14791.5, -50378.6, 15820.7, 52804.4, -72.57, 69.22},
    {2017.5, 0, 80, 0, 6599.4, -317.1, 54459.2, 6607.0, 54858.5, 83.08, -2.75},
    {2017.5, 0, 0, 120, 39571.4, 222.5, -11030.1, 39572.0, 41080.5, -15.57, 0.32},
    {2017.5, 0, -80, 240, 5873.8, 15781.4, -52687.9, 16839.1, 55313.4, -72.28, 69.58},
    {2017.5, 100, 80, 0, 6290.5, -348.5, 52292.7, 6300.1, 52670.9, 83.13, -3.17},
    {2017.5, 100, 0, 120, 37585.5, 209.5, -10564.2, 37586.1, 39042.5, -15.70, 0.32},
    {2017.5, 100, -80, 240, 5683.5, 14808.8, -50163.0, 15862.0, 52611.1, -72.45, 69.00},
};

/* WMM2020 test values (NOAA NCEI, WMM2020 test-value file released with the
 * model), dates 2020.0 and 2022.5; as carried by the npm package geomagnetism
 * 0.2.0 (test/values.csv). Published: docs/check-values.md. */
static const test_value wmm2020[] = {
    {2020.0, 28, 89, -121, -575.7, -1396.0, 56082.3, 1510.0, 56102.7, 88.46, -112.41},
    {2020.0, 48, 80, -96, 1518.0, -1160.5, 55671.9, 1910.8, 55704.7, 88.03, -37.40},
    {2020.0, 54, 82, 87, 1555.6, 1941.4, 56520.5, 2487.8, 56575.2, 87.48, 51.30},
    {2020.0, 65, 43, 93, 24375.3, 303.2, 49691.4, 24377.2, 55348.7, 63.87, 0.71},
    {2020.0, 51, -33, 109, 21556.3, -2183.2, -52676.0, 21666.6, 56957.9, -67.64, -5.78},
    {2020.0, 39, -59, -8, 14369.9, -4063.3, -24679.0, 14933.4, 28845.4, -58.82, -15.79},
    {2020.0, 3, -50, -103, 19684.4, 10512.2, -31883.6, 22315.5, 38917.2, -55.01, 28.10},
    {2020.0, 94, -29, -110, 23467.8, 6650.9, -19320.7, 24392.0, 31116.9, -38.38, 15.82},
    {2020.0, 66, 14, 143, 34916.8, 70.2, 8114.9, 34916.9, 35847.5, 13.08, 0.12},
    {2020.0, 18, 0, 21, 29311.2, 536.0, -14589.0, 29316.1, 32745.6, -26.46, 1.05},
    {2022.5, 8, 62, 53, 12336.1, 4236.6, 54498.1, 13043.3, 56037.2, 76.54, 18.95},
    {2022.5, 77, -68, -7, 16604.7, -4741.2, -29908.6, 17268.3, 34535.8, -60.00, -15.94},
    {2022.5, 98, -5, 159, 33613.6, 4601.1, -14426.9, 33927.0, 36867.1, -23.04, 7.79},
    {2022.5, 34, -29, -107, 23739.9, 6662.3, -19023.5, 24657.0, 31142.6, -37.65, 15.68},
    {2022.5, 60, 27, 65, 32938.8, 1025.8, 30561.3, 32954.8, 44944.6, 42.84, 1.78},
    {2022.5, 73, -72, 95, -2661.0, -13095.2, -55423.4, 13362.8, 57011.5, -76.44, -101.49},
    {2022.5, 96, -46, -85, 19136.4, 6358.2, -21915.4, 20165.1, 29781.1, -47.38, 18.38},
    {2022.5, 0, -13, -59, 21797.3, -6520.6, -5425.9, 22751.7, 23389.8, -13.41, -16.65},
    {2022.5, 16, 66, -178, 13804.5, 463.2, 54055.4, 13812.2, 55792.1, 75.67, 1.92},
    {2022.5, 72, -87, 38, 7132.3, -15063.2, -48550.5, 16666.4, 51331.5, -71.05, -64.66},
};

/* WMM2025 test values (NOAA NCEI, WMM2025 test-value file released with the
 * model), dates 2025.0 and 2027.5; as carried by the npm package geomagnetism
 * 0.2.0 (test/values.csv). Published: docs/check-values.md. */
static const test_value wmm2025[] = {
    {2025.0, 28, 89, -121, -255.4, -1482.5, 56194.3, 1504.3, 56214.4, 88.47, -99.77},
    {2025.0, 48, 80, -96, 1876.0, -1079.3, 55623.0, 2164.3, 55665.1, 87.77, -29.91},
    {2025.0, 54, 82, 87, 1324.3, 1883.4, 56740.8, 2302.4, 56787.5, 87.68, 54.89},
    {2025.0, 65, 43, 93, 24299.9, 210.5, 50037.9, 24300.8, 55626.6, 64.10, 0.50},
    {2025.0, 51, -33, 109, 21737.8, -2090.3, -52710.0, 21838.0, 57054.8, -67.50, -5.49},
    {2025.0, 39, -59, -8, 14358.1, -4049.1, -24389.1, 14918.1, 28589.8, -58.55, -15.75},
    {2025.0, 3, -50, -103, 19526.5, 10363.0, -31437.6, 22106.0, 38431.7, -54.89, 27.96},
    {2025.0, 94, -29, -110, 23275.5, 6559.0, -19063.6, 24182.0, 30792.7, -38.25, 15.74},
    {2025.0, 66, 14, 143, 35003.4, -116.6, 7966.3, 35003.6, 35898.7, 12.82, -0.19},
    {2025.0, 18, 0, 21, 29274.8, 659.8, -14316.7, 29282.2, 32594.8, -26.06, 1.29},
    {2027.5, 8, 62, 53, 12260.4, 4315.5, 54849.8, 12997.8, 56368.8, 76.67, 19.39},
    {2027.5, 77, -68, -7, 16578.1, -4813.7, -29680.4, 17262.8, 34335.6, -59.82, -16.19},
    {2027.5, 98, -5, 159, 33545.0, 4589.7, -14525.8, 33857.5, 36841.9, -23.22, 7.79},
    {2027.5, 34, -29, -107, 23540.4, 6592.4, -18723.1, 24446.1, 30792.3, -37.45, 15.64},
    {2027.5, 60, 27, 65, 33062.2, 1068.6, 30667.4, 33079.4, 45108.1, 42.83, 1.85},
    {2027.5, 73, -72, 95, -2912.4, -12984.1, -55399.2, 13306.7, 56974.9, -76.49, -102.64},
    {2027.5, 96, -46, -85, 18947.7, 6129.6, -21631.4, 19914.5, 29402.5, -47.37, 17.93},
    {2027.5, 0, -13, -59, 21365.8, -6732.6, -6112.3, 22401.5, 23220.4, -15.26, -17.49},
    {2027.5, 16, 66, -178, 13821.3, 89.2, 54092.6, 13821.6, 55830.6, 75.67, 0.37},
    {2027.5, 72, -87, 38, 6926.1, -15153.9, -48295.6, 16661.7, 51088.9, -70.97, -65.44},
};

static corax_magnetic_model *builtin(const char *name)
{
    corax_magnetic_model *m = NULL;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_magnetic_builtin(name, &m, &err), CORAX_OK);
    return m;
}

/* Declination and inclination to 0.01 degree, every component to 1 nT. */
static void check_values(const char *model, const test_value *v, size_t n)
{
    corax_magnetic_model *m = builtin(model);
    for (size_t i = 0; i < n; i++) {
        corax_magnetic_field f;
        corax_error err;
        char what[160];
        assert_int_equal(corax_magnetic_field_at(m, v[i].year, corax_rad(v[i].lat),
                                                 corax_rad(v[i].lon), v[i].height * 1000.0, &f,
                                                 &err),
                         CORAX_OK);
        snprintf(what, sizeof what, "%s official test value %.1f %gkm %g %g (docs/check-values.md)",
                 model, v[i].year, v[i].height, v[i].lat, v[i].lon);
        assert_close(corax_deg(f.declination), v[i].decl, 0, 0.01, what);
        assert_close(corax_deg(f.inclination), v[i].incl, 0, 0.01, what);
        assert_close(f.north, v[i].x, 0, 1.0, what);
        assert_close(f.east, v[i].y, 0, 1.0, what);
        assert_close(f.down, v[i].z, 0, 1.0, what);
        assert_close(f.horizontal, v[i].h, 0, 1.0, what);
        assert_close(f.total, v[i].f, 0, 1.0, what);
    }
    corax_magnetic_model_free(m);
}

static void test_wmm2015_official_values(void **state)
{
    (void)state;
    check_values("WMM2015", wmm2015, sizeof wmm2015 / sizeof wmm2015[0]);
}

static void test_wmm2020_official_values(void **state)
{
    (void)state;
    check_values("WMM2020", wmm2020, sizeof wmm2020 / sizeof wmm2020[0]);
}

static void test_wmm2025_official_values(void **state)
{
    (void)state;
    check_values("WMM2025", wmm2025, sizeof wmm2025 / sizeof wmm2025[0]);
    /* the series picks WMM2025 for these dates */
    check_values("WMM", wmm2025, sizeof wmm2025 / sizeof wmm2025[0]);
}

/* WMM2025 technical report test values (NOAA/NGA, published; declination only,
 * docs/check-values.md): date, height km, lat, lon -> declination. */
static void test_wmm2025_report_declinations(void **state)
{
    (void)state;
    static const double v[][5] = {{2025.0, 0, 80, 0, 1.28},      {2025.0, 0, 0, 120, -0.16},
                                  {2025.0, 0, -80, 240, 68.78},  {2025.0, 100, 80, 0, 0.85},
                                  {2027.5, 0, 80, 0, 2.59},      {2027.5, 0, -80, 240, 68.49},
                                  {2027.5, 100, -80, 240, 67.93}};
    corax_magnetic_model *m = builtin("WMM");
    for (size_t i = 0; i < sizeof v / sizeof v[0]; i++) {
        corax_magnetic_field f;
        assert_int_equal(corax_magnetic_field_at(m, v[i][0], corax_rad(v[i][2]),
                                                 corax_rad(v[i][3]), v[i][1] * 1000.0, &f, NULL),
                         CORAX_OK);
        assert_close(corax_deg(f.declination), v[i][4], 0, 0.01,
                     "WMM2025 report test value (docs/check-values.md)");
        assert_string_equal(f.model, "WMM2025");
    }
    corax_magnetic_model_free(m);
}

/* The series hands over from one model to the next at its epoch; WMM2015v2
 * (the 2018 revision) stands for 2015-2019, and differs from WMM2015. */
static void test_series_parts_and_validity(void **state)
{
    (void)state;
    corax_magnetic_model *m = builtin("wmm"); /* names without regard to case */
    double from, to;
    corax_magnetic_model_validity(m, &from, &to);
    assert_close(from, 2015.0, 0, 0, "the series starts with WMM2015v2's epoch");
    assert_close(to, 2030.0, 0, 0, "and ends with WMM2025's five years");
    static const struct { double year; const char *part; } at[] = {
        {2015.0, "WMM2015v2"}, {2019.999, "WMM2015v2"}, {2020.0, "WMM2020"},
        {2024.999, "WMM2020"}, {2025.0, "WMM2025"},     {2029.999, "WMM2025"}};
    for (size_t i = 0; i < sizeof at / sizeof at[0]; i++) {
        corax_magnetic_field f;
        assert_int_equal(corax_magnetic_field_at(m, at[i].year, 0.7, 2.0, 0.0, &f, NULL), CORAX_OK);
        assert_string_equal(f.model, at[i].part);
    }
    corax_magnetic_model *a = builtin("WMM2015"), *b = builtin("WMM2015v2");
    corax_magnetic_field fa, fb;
    corax_magnetic_field_at(a, 2018.5, 0.7, 2.0, 0.0, &fa, NULL);
    corax_magnetic_field_at(b, 2018.5, 0.7, 2.0, 0.0, &fb, NULL);
    assert_true(fabs(fa.total - fb.total) > 1.0); /* the revision changed the model */
    corax_magnetic_model_free(a);
    corax_magnetic_model_free(b);
    corax_magnetic_model_free(m);
}

/* Bad input: a date outside the validity is refused, with the model's dates;
 * so are unknown names and impossible places. */
static void test_date_outside_model_is_refused(void **state)
{
    (void)state;
    corax_magnetic_model *m = builtin("WMM2025");
    corax_magnetic_field f;
    corax_error err;
    corax_error_clear(&err);
    double year = corax_decimal_year(2031, 3, 2);
    assert_int_equal(corax_magnetic_field_at(m, year, 0.5, 0.5, 0.0, &f, &err), CORAX_EVALUE);
    assert_non_null(strstr(err.message, "2031-03-02"));
    assert_non_null(strstr(err.message, "WMM2025 (2025-01-01 to 2029-12-31)"));
    assert_int_equal(corax_magnetic_field_at(m, 2024.99, 0.5, 0.5, 0.0, &f, &err), CORAX_EVALUE);
    assert_int_equal(corax_magnetic_field_at(m, 2030.0, 0.5, 0.5, 0.0, &f, &err), CORAX_EVALUE);
    assert_int_equal(corax_magnetic_field_at(m, NAN, 0.5, 0.5, 0.0, &f, &err), CORAX_EVALUE);
    assert_int_equal(corax_magnetic_field_at(m, 2026.0, 1.6, 0.5, 0.0, &f, &err), CORAX_EVALUE);
    assert_int_equal(corax_magnetic_field_at(m, 2026.0, 0.5, NAN, 0.0, &f, &err), CORAX_EVALUE);
    corax_magnetic_model_free(m);
    corax_magnetic_model *none = NULL;
    assert_int_equal(corax_magnetic_builtin("IGRF14", &none, &err), CORAX_ENOTFOUND);
    assert_null(none);
    assert_non_null(strstr(err.message, "WMM2025"));
    assert_true(corax_magnetic_is_builtin("wmm2020"));
    assert_false(corax_magnetic_is_builtin("examples/igrf.cof"));
}

/* Decimal years as the WMM reckons them: year + (day of year - 1) / days. */
static void test_dates(void **state)
{
    (void)state;
    assert_close(corax_decimal_year(2025, 1, 1), 2025.0, 0, 0, "1 January");
    assert_close(corax_decimal_year(2025, 7, 2), 2025.0 + 182.0 / 365.0, 0, 1e-12, "2 July");
    assert_close(corax_decimal_year(2024, 12, 31), 2024.0 + 365.0 / 366.0, 0, 1e-12, "leap year");
    assert_true(isnan(corax_decimal_year(2025, 2, 29)));
    assert_true(isnan(corax_decimal_year(2024, 13, 1)));
    assert_false(isnan(corax_decimal_year(2000, 2, 29))); /* 2000 was a leap year */
    assert_true(isnan(corax_decimal_year(1900, 2, 29)));  /* 1900 was not */
    static const char *const good[] = {"2026-04-05", " 2026-04-05 ", "2026-04-05T13:20:00Z",
                                       "2026-04-05 13:20"};
    for (size_t i = 0; i < 4; i++)
        assert_close(corax_date_parse(good[i], strlen(good[i])), corax_decimal_year(2026, 4, 5),
                     0, 0, good[i]);
    static const char *const bad[] = {"", "2026-4-5", "05/04/2026", "2026-04-31", "2026-04-05x",
                                      "2026.25", "2026-04-05Tnoon"};
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++)
        assert_true(isnan(corax_date_parse(bad[i], strlen(bad[i]))));
    char text[16];
    corax_date_text(corax_decimal_year(2026, 7, 14), text, sizeof text);
    assert_string_equal(text, "2026-07-14");
    /* every day of a leap and a common year goes to its decimal year and back */
    for (int y = 2023; y <= 2024; y++)
        for (int mo = 1; mo <= 12; mo++)
            for (int d = 1; d <= 31; d++) {
                double t = corax_decimal_year(y, mo, d);
                if (isnan(t))
                    continue;
                int y2, m2, d2;
                corax_year_date(t, &y2, &m2, &d2);
                assert_int_equal(y2 * 10000 + m2 * 100 + d2, y * 10000 + mo * 100 + d);
            }
}

/* The WMM's COF layout read from a file gives what the built-in copy gives. */
static void test_cof_file_matches_builtin(void **state)
{
    (void)state;
    corax_magnetic_model *file = NULL, *b = builtin("WMM2020");
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_magnetic_read("data/magnetic/WMM2020.COF", &file,
                                         &err),
                     CORAX_OK);
    assert_string_equal(corax_magnetic_model_name(file), "WMM-2020");
    corax_magnetic_field f1, f2;
    assert_int_equal(corax_magnetic_field_at(file, 2023.3, -0.4, 2.1, 350.0, &f1, NULL), CORAX_OK);
    assert_int_equal(corax_magnetic_field_at(b, 2023.3, -0.4, 2.1, 350.0, &f2, NULL), CORAX_OK);
    assert_close(f1.total, f2.total, 0, 0, "file and built-in copy");
    assert_close(f1.declination, f2.declination, 0, 0, "file and built-in copy");
    corax_magnetic_model_free(file);
    corax_magnetic_model_free(b);
}

/* An axial dipole alone, derived by hand: at the equator, where geodetic and
 * geocentric latitude agree and r = a + h, X = -g10 (6371.2 / r)^3, Y = Z = 0;
 * at the north pole, r = b + h and Z = -2 g10 (6371.2 / r)^3, X = Y = 0. */
static void test_axial_dipole(void **state)
{
    (void)state;
    static const char *const lines[] = {"    2020.0            DIPOLE     01/01/2020",
                                        "  1  0  -30000.0       0.0        0.0        0.0"};
    corax_magnetic_model *m = NULL;
    assert_int_equal(corax_magnetic_parse(lines, 2, "dipole", &m, NULL), CORAX_OK);
    corax_magnetic_field f;
    assert_int_equal(corax_magnetic_field_at(m, 2021.0, 0.0, 1.0, 1000.0, &f, NULL), CORAX_OK);
    assert_close(f.north, 30000.0 * pow(6371.2 / 6379.137, 3), 1e-12, 0, "dipole X at the equator");
    assert_close(f.east, 0.0, 0, 1e-9, "dipole Y at the equator");
    assert_close(f.down, 0.0, 0, 1e-9, "dipole Z at the equator");
    double b = 6378.137 * (1.0 - 1.0 / 298.257223563);
    assert_int_equal(corax_magnetic_field_at(m, 2021.0, CORAX_PI / 2, 0.3, 0.0, &f, NULL), CORAX_OK);
    assert_close(f.down, 60000.0 * pow(6371.2 / b, 3), 1e-12, 0, "dipole Z at the pole");
    assert_close(f.horizontal, 0.0, 0, 1e-6, "no horizontal field at the dipole's pole");
    corax_magnetic_model_free(m);
}

/* At a pole the east component's 1/cos(latitude) is 0/0 and a recursion of
 * its own takes over: it must meet the general sum just off the pole. */
static void test_pole_meets_its_neighbourhood(void **state)
{
    (void)state;
    corax_magnetic_model *m = builtin("WMM2025");
    for (int s = -1; s <= 1; s += 2) {
        corax_magnetic_field at, near;
        assert_int_equal(corax_magnetic_field_at(m, 2026.0, s * CORAX_PI / 2, 0.4, 0.0, &at, NULL),
                         CORAX_OK);
        assert_int_equal(corax_magnetic_field_at(m, 2026.0, s * (CORAX_PI / 2 - 1e-8), 0.4, 0.0,
                                                 &near, NULL),
                         CORAX_OK);
        assert_close(at.east, near.east, 0, 0.01, "east component at and beside the pole");
        assert_close(at.north, near.north, 0, 0.01, "north component at and beside the pole");
        assert_close(at.total, near.total, 0, 0.01, "total at and beside the pole");
    }
    corax_magnetic_model_free(m);
}

/* The multi-model layout of the IGRF releases: between two epochs the
 * coefficients, and so the field (linear in them), are interpolated; after the
 * last epoch its secular variation carries on until its end year. */
static void test_multi_model_layout(void **state)
{
    (void)state;
    static const char *const lines[] = {
        "   DGRF2000  2000.00  2  0  0 2000.00 2005.00   -1.0  600.0        DGRF2000   0",
        "  1  0  -29619.4      0.0       0.00       0.00                   DGRF2000   1",
        "  1  1   -1728.2   5186.1       0.00       0.00                   DGRF2000   2",
        "  2  0   -2267.7      0.0       0.00       0.00                   DGRF2000   3",
        "   IGRF2005  2005.00  1  1  0 2005.00 2010.00   -1.0  600.0        IGRF2005   0",
        "  1  0  -29556.8      0.0       8.80       0.00                   IGRF2005   1",
        "  1  1   -1671.8   5080.0      10.80     -21.30                   IGRF2005   2",
    };
    corax_magnetic_model *m = NULL;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_magnetic_parse(lines, 7, "igrf", &m, &err), CORAX_OK);
    assert_string_equal(corax_magnetic_model_name(m), "DGRF2000 to IGRF2005");
    double from, to;
    corax_magnetic_model_validity(m, &from, &to);
    assert_close(from, 2000.0, 0, 0, "first epoch");
    assert_close(to, 2010.0, 0, 0, "the last model's end year");
    corax_magnetic_field a, b, mid;
    corax_magnetic_field_at(m, 2000.0, 0.6, -1.2, 0.0, &a, NULL);
    corax_magnetic_field_at(m, 2004.99999999, 0.6, -1.2, 0.0, &b, NULL);
    corax_magnetic_field_at(m, 2002.5, 0.6, -1.2, 0.0, &mid, NULL);
    assert_string_equal(mid.model, "DGRF2000");
    assert_close(mid.north, (a.north + b.north) / 2, 0, 1e-4, "interpolated midway (linear)");
    assert_close(mid.down, (a.down + b.down) / 2, 0, 1e-4, "interpolated midway (linear)");
    corax_magnetic_field c, d;
    corax_magnetic_field_at(m, 2005.0, 0.6, -1.2, 0.0, &c, NULL);
    corax_magnetic_field_at(m, 2007.0, 0.6, -1.2, 0.0, &d, NULL);
    assert_close(b.north, c.north, 0, 1e-3, "no jump at the epoch");
    assert_string_equal(d.model, "IGRF2005");
    assert_true(fabs(d.north - c.north) > 1.0); /* the secular variation acts */
    assert_int_equal(corax_magnetic_field_at(m, 2010.0, 0.6, -1.2, 0.0, &d, &err), CORAX_EVALUE);
    assert_int_equal(corax_magnetic_field_at(m, 1999.9, 0.6, -1.2, 0.0, &d, &err), CORAX_EVALUE);
    corax_magnetic_model_free(m);
}

/* Malformed coefficient files: each fault named with its line. */
static void test_bad_coefficient_files(void **state)
{
    (void)state;
    static const struct {
        const char *text[3];
        size_t n;
        long line;
        const char *says;
    } bad[] = {
        {{"a,b,c", "", ""}, 1, 1, "neither"},
        {{"  1  0  -29000.0 0.0 0.0 0.0", "", ""}, 1, 1, "before the model's header"},
        {{"    2020.0  X  01/01/2020", "  1  2  1.0 0.0 0.0 0.0", ""}, 2, 2, "order above"},
        {{"    2020.0  X  01/01/2020", " 14  0  1.0 0.0 0.0 0.0", ""}, 2, 2, "degree 14"},
        {{"    2020.0  X  01/01/2020", "  1  0  1.0 0.0", ""}, 2, 2, "gdot and hdot"},
        {{"    2020.0  X  01/01/2020", "", ""}, 1, 1, "without coefficients"},
        {{"", "", ""}, 0, 0, "no model"},
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        corax_magnetic_model *m = NULL;
        corax_error err;
        corax_error_clear(&err);
        assert_int_equal(corax_magnetic_parse(bad[i].text, bad[i].n, "x.cof", &m, &err),
                         CORAX_EFORMAT);
        assert_null(m);
        assert_int_equal(err.line, bad[i].line);
        assert_non_null(strstr(err.message, bad[i].says));
    }
    corax_magnetic_model *m = NULL;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_magnetic_read("/nonexistent/x.cof", &m, &err), CORAX_EIO);
    assert_null(m);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_wmm2015_official_values),
        cmocka_unit_test(test_wmm2020_official_values),
        cmocka_unit_test(test_wmm2025_official_values),
        cmocka_unit_test(test_wmm2025_report_declinations),
        cmocka_unit_test(test_series_parts_and_validity),
        cmocka_unit_test(test_date_outside_model_is_refused),
        cmocka_unit_test(test_dates),
        cmocka_unit_test(test_cof_file_matches_builtin),
        cmocka_unit_test(test_axial_dipole),
        cmocka_unit_test(test_pole_meets_its_neighbourhood),
        cmocka_unit_test(test_multi_model_layout),
        cmocka_unit_test(test_bad_coefficient_files),
    };
    return cmocka_run_group_tests_name("magnetic", tests, NULL, NULL);
}
