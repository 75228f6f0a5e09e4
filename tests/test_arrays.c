/* Tests of the arrays module: options by word, a program loaded through them,
 * and arrays desurveyed, converted and drawn as the library's own calls
 * answer one at a time; outside checks from docs/check-values.md. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/arrays.h"
#include "corax/convert.h"
#include "corax/uncertainty.h"
#include "support/check.h"

static void set_ok(corax_setup *s, const char *key, const char *value)
{
    corax_error err;
    if (corax_setup_set(s, key, value, &err) != CORAX_OK)
        fail_msg("%s = %s: %s", key, value, err.message);
}

/* A straight collar-only hole for each row of the derived alpha/beta table of
 * docs/check-values.md ("Alpha/beta to dip and dip direction"), and a
 * vertical one. */
static corax_arrays *straight_holes(corax_setup *s)
{
    const char *cpath = test_tmp_path("arrays_collars.csv");
    const char *spath = test_tmp_path("arrays_surveys.csv");
    test_write_file(cpath, "hole,x,y,z,azimuth,dip\n"
                           "A,0,0,0,0,-60\nB,100,0,0,90,-45\nC,200,0,0,200,-70\n"
                           "D,300,0,0,45,20\nE,400,0,0,135,-30\nV,500,0,0,0,-90\n");
    test_write_file(spath, "hole,depth,azimuth,dip\n");
    corax_arrays *a;
    corax_error err;
    if (corax_arrays_load(s, cpath, spath, &a, &err) != CORAX_OK)
        fail_msg("load: %s", err.message);
    return a;
}

static void reading_row(double *row, double depth, double alpha, double beta)
{
    for (int k = 0; k < CORAX_READING_COLUMNS; k++)
        row[k] = NAN;
    row[CORAX_READING_DEPTH] = depth;
    row[CORAX_READING_ALPHA] = alpha;
    row[CORAX_READING_BETA] = beta;
    row[CORAX_READING_ARBITRARY] = 0;
}

/* Unknown keys and bad values are refused with a message naming the key. */
static void test_setup_refuses(void **state)
{
    (void)state;
    corax_setup *s = corax_setup_new();
    assert_non_null(s);
    corax_error err;
    assert_int_equal(corax_setup_set(s, "beta_direction", "clockwise", &err), CORAX_ENOTFOUND);
    assert_string_equal(err.message, "'beta_direction' is not an option corax knows");
    assert_int_equal(corax_setup_set(s, "beta_sense", "left", &err), CORAX_EVALUE);
    assert_string_equal(err.message, "beta_sense: 'left' is not clockwise or anticlockwise");
    assert_int_equal(corax_setup_set(s, "draws", "2.5", &err), CORAX_EVALUE);
    assert_string_equal(err.message, "draws: '2.5' is not a whole number");
    assert_int_equal(corax_setup_set(s, "alpha_error", "50", &err), CORAX_EVALUE);
    assert_string_equal(err.message, "alpha_error: 50 is outside [0, 45]");
    assert_int_equal(corax_setup_set(s, "units", "yards", &err), CORAX_EVALUE);
    assert_string_equal(err.message, "units: 'yards' is not metres or feet");
    assert_int_equal(corax_setup_set(s, "declination", "east", &err), CORAX_EVALUE);
    assert_string_equal(err.message, "declination: 'east' is neither a number nor model");
    assert_int_equal(corax_setup_set(s, "structures_columns", "hole=H", &err), CORAX_ENOTFOUND);
    assert_int_equal(corax_setup_set(s, "reject", "QC001", &err), CORAX_EVALUE);
    assert_string_equal(err.message, "reject: 'QC001' is not HOLE@DEPTH");
    assert_int_equal(corax_setup_set(s, "local_grid", "1,2,3", &err), CORAX_EVALUE);
    assert_non_null(strstr(err.message, "local_grid: "));
    assert_int_equal(corax_setup_set(NULL, "draws", "10", &err), CORAX_EARG);
    corax_setup_free(s);
    corax_setup_free(NULL);
}

/* Convergence from the projection needs a CRS: the load says so. */
static void test_load_refuses_projection_without_crs(void **state)
{
    (void)state;
    corax_setup *s = corax_setup_new();
    set_ok(s, "convergence", "projection");
    corax_arrays *a = NULL;
    corax_error err;
    assert_int_equal(corax_arrays_load(s, "no_collars.csv", "no_surveys.csv", &a, &err),
                     CORAX_EARG);
    assert_null(a);
    assert_non_null(strstr(err.message, "needs crs"));
    set_ok(s, "convergence", "0");
    assert_int_equal(corax_arrays_load(s, "no_collars.csv", "no_surveys.csv", &a, &err),
                     CORAX_EIO);
    corax_setup_free(s);
}

/* The derived table of docs/check-values.md ("Alpha/beta to dip and dip
 * direction"), through the arrays; the vertical hole gives the dip alone,
 * 90 - alpha (common practice, same section). */
static void test_convert_matches_derived_table(void **state)
{
    (void)state;
    corax_setup *s = corax_setup_new();
    corax_arrays *a = straight_holes(s);
    assert_int_equal(corax_arrays_finding_count(a), 0);
    const char *holes[] = {"A", "A", "B", "C", "D", "E", "V", "NOPE"};
    const double in[][3] = {{10, 30, 180}, {20, 30, 90}, {10, 45, 270}, {10, 55, 120},
                            {10, 60, 300}, {10, 15, 45}, {10, 60, 40}, {10, 30, 30}};
    const double want[][2] = {{30.00, 0.00}, {64.34, 253.90}, {60.00, 215.26},
                              {29.79, 108.77}, {57.92, 14.27}, {62.48, 185.37}};
    enum { N = 8 };
    double readings[N * CORAX_READING_COLUMNS], out[N * CORAX_RESULT_COLUMNS];
    unsigned cond[N];
    for (int i = 0; i < N; i++)
        reading_row(readings + i * CORAX_READING_COLUMNS, in[i][0], in[i][1], in[i][2]);
    corax_arrays_convert(a, s, N, holes, readings, out, cond);
    for (int i = 0; i < 6; i++) {
        const double *r = out + i * CORAX_RESULT_COLUMNS;
        assert_close(r[CORAX_RESULT_DIP], want[i][0], 0, 0.005, "docs/check-values.md dip");
        assert_close(azimuth_gap(r[CORAX_RESULT_DIP_DIRECTION], want[i][1]), 0, 0, 0.005,
                     "docs/check-values.md dip direction");
        assert_true(r[CORAX_RESULT_DIP_DIRECTION] >= 0 && r[CORAX_RESULT_DIP_DIRECTION] < 360);
        assert_close(r[CORAX_RESULT_POLE_PLUNGE], 90 - r[CORAX_RESULT_DIP], 0, 1e-12,
                     "the pole plunges 90 - dip (common practice)");
        assert_string_equal(corax_condition_status(cond[i]), "collar-only");
    }
    const double *v = out + 6 * CORAX_RESULT_COLUMNS;
    assert_string_equal(corax_condition_status(cond[6]), "dip-only");
    assert_close(v[CORAX_RESULT_DIP], 30, 0, 1e-9, "vertical hole: dip 90 - alpha (common practice)");
    assert_true(isnan(v[CORAX_RESULT_DIP_DIRECTION]) && isnan(v[CORAX_RESULT_NX]));
    const double *u = out + 7 * CORAX_RESULT_COLUMNS;
    assert_string_equal(corax_condition_status(cond[7]), "unknown-hole");
    for (int k = 0; k < CORAX_RESULT_COLUMNS; k++)
        assert_true(isnan(u[k]));
    char note[300];
    assert_true(corax_arrays_note(a, s, "A", readings, note, sizeof note) > 0);
    assert_non_null(strstr(note, "collar"));
    readings[CORAX_READING_DEPTH] = NAN; /* absent, as an empty field of a log */
    corax_arrays_note(a, s, "A", readings, note, sizeof note);
    assert_string_equal(note, "depth is empty");
    corax_arrays_free(a);
    corax_setup_free(s);
}

/* The core conventions by word change the answer as the library's own
 * options do: beta anticlockwise is beta mirrored (360 - beta). */
static void test_conventions_by_word(void **state)
{
    (void)state;
    corax_setup *s = corax_setup_new();
    corax_arrays *a = straight_holes(s);
    const char *holes[] = {"C", "C"};
    double readings[2 * CORAX_READING_COLUMNS], out[2 * CORAX_RESULT_COLUMNS];
    reading_row(readings, 10, 55, 120);
    reading_row(readings + CORAX_READING_COLUMNS, 10, 55, 240);
    corax_arrays_convert(a, s, 1, holes, readings, out, NULL);
    set_ok(s, "beta_sense", "anticlockwise");
    corax_arrays_convert(a, s, 1, holes + 1, readings + CORAX_READING_COLUMNS,
                         out + CORAX_RESULT_COLUMNS, NULL);
    for (int k = CORAX_RESULT_DIP; k <= CORAX_RESULT_NZ; k++)
        assert_close(out[CORAX_RESULT_COLUMNS + k], out[k], 1e-12, 1e-9, "mirrored beta");
    corax_arrays_free(a);
    corax_setup_free(s);
}

/* Lapeyrouse's minimum curvature example (docs/check-values.md): feet,
 * inclination from vertical, through the words units and dip_convention. */
static void test_desurvey_published_example(void **state)
{
    (void)state;
    const char *cpath = test_tmp_path("arrays_mc_collars.csv");
    const char *spath = test_tmp_path("arrays_mc_surveys.csv");
    test_write_file(cpath, "hole,x,y,z\nW,0,0,0\n");
    test_write_file(spath, "hole,depth,azimuth,dip\nW,3500,20,15\nW,3600,45,25\n");
    corax_setup *s = corax_setup_new();
    set_ok(s, "units", "feet");
    set_ok(s, "dip_convention", "from-vertical");
    corax_arrays *a;
    corax_error err;
    assert_int_equal(corax_arrays_load(s, cpath, spath, &a, &err), CORAX_OK);
    const char *holes[] = {"W", "W", "W", "W", "X"};
    const double depth[] = {3500, 3600, 3700, -1, 10};
    double out[5 * CORAX_POINT_COLUMNS];
    int place[5];
    corax_arrays_desurvey(a, s, 5, holes, depth, out, place);
    const double *p = out, *q = out + CORAX_POINT_COLUMNS;
    assert_close((q[CORAX_POINT_Y] - p[CORAX_POINT_Y]) / 0.3048, 27.22, 0, 0.006, "dN, published");
    assert_close((q[CORAX_POINT_X] - p[CORAX_POINT_X]) / 0.3048, 19.45, 0, 0.006, "dE, published");
    assert_close((p[CORAX_POINT_Z] - q[CORAX_POINT_Z]) / 0.3048, 94.01, 0, 0.006, "dTVD, published");
    assert_close(q[CORAX_POINT_DIP], 25, 0, 1e-9, "the station's inclination, from vertical");
    assert_close(q[CORAX_POINT_PLUNGE], 65, 0, 1e-9, "plunge = 90 - inclination");
    assert_string_equal(corax_arrays_place_name(place[0]), "ok");
    assert_string_equal(corax_arrays_place_name(place[2]), "extrapolated");
    assert_string_equal(corax_arrays_place_name(place[3]), "bad-depth");
    assert_string_equal(corax_arrays_place_name(place[4]), "unknown-hole");
    assert_true(isnan(out[3 * CORAX_POINT_COLUMNS]) && isnan(out[4 * CORAX_POINT_COLUMNS]));
    corax_arrays_free(a);
    corax_setup_free(s);
}

/* Row faults are findings, not failures. */
static void test_findings(void **state)
{
    (void)state;
    const char *cpath = test_tmp_path("arrays_bad_collars.csv");
    const char *spath = test_tmp_path("arrays_bad_surveys.csv");
    test_write_file(cpath, "hole,x,y,z,azimuth,dip\nA,0,0,0,0,-60\nB,zz,0,0,0,-60\n");
    test_write_file(spath, "hole,depth,azimuth,dip\nA,10,0,-60\nC,5,0,-60\n");
    corax_setup *s = corax_setup_new();
    corax_arrays *a;
    corax_error err;
    assert_int_equal(corax_arrays_load(s, cpath, spath, &a, &err), CORAX_OK);
    assert_true(corax_arrays_finding_count(a) >= 2);
    const char *file, *hole, *message;
    long line;
    int errors = 0, warnings = 0;
    for (size_t i = 0; i < corax_arrays_finding_count(a); i++) {
        int sev = corax_arrays_finding(a, i, &file, &line, &hole, &message);
        assert_true(line > 0 && message[0]);
        errors += sev == CORAX_ERROR && strcmp(file, cpath) == 0 && line == 3;
        warnings += sev == CORAX_WARNING && strcmp(file, spath) == 0 && strcmp(hole, "C") == 0;
    }
    assert_int_equal(errors, 1);
    assert_int_equal(warnings, 1);
    assert_int_equal(corax_arrays_finding(a, 99, NULL, NULL, NULL, NULL), -1);
    assert_int_equal(corax_program_size(corax_arrays_program(a)), 1);
    corax_arrays_free(a);
    corax_setup_free(s);
}

/* The Monte Carlo of the arrays is corax_mc_hole's, hole by hole, and the
 * readings' own errors take the place of the setup's. */
static void test_spread_is_the_holes_monte_carlo(void **state)
{
    (void)state;
    corax_setup *s = corax_setup_new();
    corax_arrays *a = straight_holes(s);
    corax_error err;
    const char *holes[] = {"A", "B", "A", "V", "A"};
    const double in[][3] = {{10, 30, 90}, {10, 45, 270}, {20, 40, 100}, {10, 60, 40},
                            {30, NAN, NAN}};
    enum { N = 5 };
    double readings[N * CORAX_READING_COLUMNS], out[N * CORAX_SPREAD_COLUMNS];
    for (int i = 0; i < N; i++)
        reading_row(readings + i * CORAX_READING_COLUMNS, in[i][0], in[i][1], in[i][2]);
    assert_int_equal(corax_arrays_spread(a, s, N, holes, readings, NULL, out, &err), CORAX_EARG);
    set_ok(s, "draws", "300");
    set_ok(s, "seed", "7");
    double own[N * CORAX_ERRORS_COLUMNS];
    for (int i = 0; i < N * CORAX_ERRORS_COLUMNS; i++)
        own[i] = NAN;
    own[2 * CORAX_ERRORS_COLUMNS + CORAX_ERRORS_LINE] = 20; /* the third reading's line */
    assert_int_equal(corax_arrays_spread(a, s, N, holes, readings, own, out, &err), CORAX_OK);
    /* hole A by hand: its two planes, drawn together in their order */
    const corax_program *p = corax_arrays_program(a);
    const corax_hole *h = corax_program_find(p, "A", 1);
    corax_convert_options o = corax_convert_options_default();
    corax_error_model e = corax_error_model_default();
    corax_mc_reading mr[2];
    const int rows[2] = {0, 2};
    for (int j = 0; j < 2; j++) {
        mr[j].reading = corax_reading_empty();
        mr[j].reading.depth = in[rows[j]][0];
        mr[j].reading.alpha = corax_rad(in[rows[j]][1]);
        mr[j].reading.beta = corax_rad(in[rows[j]][2]);
        mr[j].errors = e;
        corax_convert_reading(h, &mr[j].reading, &o, NULL, &mr[j].nominal);
    }
    mr[1].errors.line = corax_rad(20);
    corax_spread sp[2];
    corax_mc *mc = corax_mc_new();
    assert_int_equal(corax_mc_hole(mc, h, mr, 2, &o, &e, 300, 7, sp, NULL, NULL), CORAX_OK);
    corax_mc_free(mc);
    for (int j = 0; j < 2; j++) {
        const double *r = out + rows[j] * CORAX_SPREAD_COLUMNS;
        assert_close(r[CORAX_SPREAD_DIP_SD], corax_deg(sp[j].dip_sd), 1e-12, 0, "dip_sd");
        assert_close(r[CORAX_SPREAD_CONE95], corax_deg(sp[j].cone95), 1e-12, 0, "cone95");
        assert_close(r[CORAX_SPREAD_KAPPA], sp[j].kappa, 1e-12, 0, "kappa");
        assert_close(r[CORAX_SPREAD_POSITION_SD], sp[j].position_sd, 1e-12, 0, "position_sd");
        assert_close(r[CORAX_SPREAD_DRAWS], 300, 0, 0, "draws");
    }
    /* the dip alone has no direction to spread; nothing is drawn without a plane */
    const double *v = out + 3 * CORAX_SPREAD_COLUMNS, *none = out + 4 * CORAX_SPREAD_COLUMNS;
    assert_true(v[CORAX_SPREAD_DIP_SD] > 0 && isnan(v[CORAX_SPREAD_CONE95]));
    for (int k = 0; k < CORAX_SPREAD_COLUMNS; k++)
        assert_true(isnan(none[k]));
    own[CORAX_ERRORS_ALPHA] = -1;
    assert_int_equal(corax_arrays_spread(a, s, N, holes, readings, own, out, &err), CORAX_EVALUE);
    assert_string_equal(err.message, "row 0: alpha_error -1 is not an error");
    corax_arrays_free(a);
    corax_setup_free(s);
}

/* The columns' names are the command line's, and end with NULL. */
static void test_column_names(void **state)
{
    (void)state;
    assert_string_equal(corax_arrays_column(CORAX_ARRAYS_RESULT, CORAX_RESULT_DIP_DIRECTION),
                        "dip_direction");
    assert_string_equal(corax_arrays_column(CORAX_ARRAYS_SPREAD, CORAX_SPREAD_CONE95), "cone95");
    assert_string_equal(corax_arrays_column(CORAX_ARRAYS_READING, CORAX_READING_LINE_BETA),
                        "line_beta");
    assert_null(corax_arrays_column(CORAX_ARRAYS_POINT, CORAX_POINT_COLUMNS));
    assert_null(corax_arrays_column((corax_arrays_kind)9, 0));
    assert_string_equal(corax_arrays_place_name(CORAX_PLACE_NO_SURVEY), "no-survey");
    assert_string_equal(corax_arrays_place_name(-1), "unknown");
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_setup_refuses),
        cmocka_unit_test(test_load_refuses_projection_without_crs),
        cmocka_unit_test(test_convert_matches_derived_table),
        cmocka_unit_test(test_conventions_by_word),
        cmocka_unit_test(test_desurvey_published_example),
        cmocka_unit_test(test_findings),
        cmocka_unit_test(test_spread_is_the_holes_monte_carlo),
        cmocka_unit_test(test_column_names),
    };
    return cmocka_run_group_tests_name("arrays", tests, NULL, NULL);
}
