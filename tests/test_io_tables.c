/* Tests of tables as they arrive (io): the delimiter and decimal mark found
 * where unambiguous, comment lines and blank rows, blanks around fields,
 * numbers with either mark, the spreadsheet output form, code words and their
 * tally, carried names, interval depths, and loading a program in feet, with
 * the collar set-up as a station and stations rejected. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "corax/codes.h"
#include "corax/load.h"
#include "corax/output.h"
#include "corax/table.h"
#include "io/fields.h"
#include "support/check.h"

/* Open a table written from text; the reader's status, its info in *info
 * and, when it opened, every row joined as "line:a|b/..." in out. */
static corax_status read_text(const char *text, corax_table_format fmt, corax_table_info *info,
                              char *out, size_t n, corax_error *err)
{
    const char *path = test_tmp_path("arrive.csv");
    test_write_file(path, text);
    corax_reader *r;
    corax_status st = corax_reader_open(path, fmt, &r, err);
    out[0] = '\0';
    if (st != CORAX_OK) {
        unlink(path);
        return st;
    }
    corax_row row;
    size_t used = 0;
    while ((st = corax_reader_next(r, &row, err)) == CORAX_OK) {
        used += (size_t)snprintf(out + used, n - used, "%ld:", row.line);
        for (size_t i = 0; i < row.count; i++)
            used += (size_t)snprintf(out + used, n - used, "%s%s", i ? "|" : "", row.field[i]);
        used += (size_t)snprintf(out + used, n - used, "/");
    }
    corax_reader_info(r, info);
    corax_reader_close(r);
    unlink(path);
    return st;
}

static void test_delimiter_found_from_the_header(void **state)
{
    (void)state;
    static const struct {
        const char *text;
        char delimiter;
        const char *rows;
    } cases[] = {
        {"hole,depth\nA,1.5\n", ',', "1:hole|depth/2:A|1.5/"},
        {"hole;depth\nA;1,5\n", ';', "1:hole;depth/2:A|1,5/"},
        {"hole\tdepth\nA\t1.5\n", '\t', "1:hole|depth/2:A|1.5/"},
        {"hole\nA\n", ',', "1:hole/2:A/"},                           /* one column */
        {"\"a,b\";depth\nA;2\n", ';', "1:a,b|depth/2:A|2/"},          /* quoted commas */
    };
    for (size_t i = 0; i < sizeof cases / sizeof *cases; i++) {
        corax_table_info info;
        char got[256];
        assert_int_equal(read_text(cases[i].text, corax_table_format_default(), &info, got,
                                   sizeof got, NULL),
                         CORAX_END);
        assert_int_equal(info.format.delimiter, cases[i].delimiter);
        assert_true(info.delimiter_detected);
        if (cases[i].delimiter != ';') /* the header row is a row like any other */
            assert_string_equal(got, cases[i].rows);
    }
    /* more than one candidate in the header: ask, naming file and line */
    corax_table_info info;
    corax_error err;
    char got[256];
    assert_int_equal(read_text("# exported\nhole;depth, m\nA;2\n", corax_table_format_default(),
                               &info, got, sizeof got, &err),
                     CORAX_EFORMAT);
    assert_int_equal(err.line, 2);
    assert_non_null(strstr(err.message, "say which separates the fields"));
    /* a given delimiter is not second-guessed */
    corax_table_format semi = {';', 0};
    assert_int_equal(read_text("hole;depth, m\nA;2\n", semi, &info, got, sizeof got, NULL),
                     CORAX_END);
    assert_string_equal(got, "1:hole|depth, m/2:A|2/");
    assert_false(info.delimiter_detected);
}

static void test_decimal_mark_found_from_the_numbers(void **state)
{
    (void)state;
    corax_table_info info;
    corax_error err;
    char got[256];
    corax_table_format found = corax_table_format_default();
    assert_int_equal(read_text("hole;x;y\nA;10250,5;-3\nB;7;8,25\n", found, &info, got,
                               sizeof got, NULL),
                     CORAX_END);
    assert_int_equal(info.format.decimal, ',');
    assert_true(info.decimal_detected);
    assert_int_equal(read_text("hole;x\nA;10250.5\n", found, &info, got, sizeof got, NULL),
                     CORAX_END);
    assert_int_equal(info.format.decimal, '.');
    assert_int_equal(read_text("hole;x\nA;10250\n", found, &info, got, sizeof got, NULL),
                     CORAX_END); /* whole numbers: either would do */
    assert_int_equal(info.format.decimal, '.');
    assert_int_equal(read_text("hole,x\nA,\"1,5\"\n", found, &info, got, sizeof got, NULL),
                     CORAX_END); /* comma-separated: never a decimal comma */
    assert_int_equal(info.format.decimal, '.');
    /* both marks: ask, naming the lines of each */
    assert_int_equal(read_text("hole;x\nA;1,5\nB;2\nC;2.5\n", found, &info, got, sizeof got,
                               &err),
                     CORAX_EFORMAT);
    assert_int_equal(err.line, 4);
    assert_non_null(strstr(err.message, "decimal points (line 4) and decimal commas (line 2)"));
    /* a decimal comma asked for where commas separate the fields */
    corax_table_format comma_decimal = {0, ','};
    assert_int_equal(read_text("hole,x\nA,1\n", comma_decimal, &info, got, sizeof got, &err),
                     CORAX_EFORMAT);
    assert_non_null(strstr(err.message, "commas cannot also mark decimals"));
}

static void test_comments_blank_rows_and_blanks(void **state)
{
    (void)state;
    corax_table_info info;
    char got[512];
    const char *text = "\xEF\xBB\xBF# exported by the logging sheet\r\n"
                       "hole,depth,note\r\n"
                       "  # an indented comment\r\n"
                       " QX01 ,  12.5 ,\" keep,this \"\r\n"
                       ",,\r\n"
                       "   \r\n"
                       "\r\n"
                       "QX02,13,\"two\n# not a comment\"\r\n"
                       " , \"\" ,\r\n"
                       "QX03,14,last\r\n";
    assert_int_equal(read_text(text, corax_table_format_default(), &info, got, sizeof got, NULL),
                     CORAX_END);
    assert_string_equal(got, "2:hole|depth|note/4:QX01|12.5|keep,this/"
                             "8:QX02|13|two\n# not a comment/11:QX03|14|last/");
    assert_int_equal(info.comments, 2);
    assert_int_equal(info.blank_rows, 3); /* ",,", blanks only, " , \"\" ," */
}

static void test_numbers_with_either_mark(void **state)
{
    (void)state;
    double v;
    assert_int_equal(corax_parse_number("4,870", 5, CORAX_DECIMAL_EITHER, &v), CORAX_NUMBER_OK);
    assert_close(v, 4.87, 0, 0, "a decimal comma carried from a log");
    assert_int_equal(corax_parse_number("4.870", 5, CORAX_DECIMAL_EITHER, &v), CORAX_NUMBER_OK);
    assert_close(v, 4.87, 0, 0, "corax's own decimal point");
    assert_int_equal(corax_parse_number("1,234.5", 7, CORAX_DECIMAL_EITHER, &v),
                     CORAX_NUMBER_NOT_NUMBER);
    assert_int_equal(corax_parse_number("1,5e3", 5, CORAX_DECIMAL_EITHER, &v), CORAX_NUMBER_OK);
    assert_close(v, 1500, 0, 0, "either mark with an exponent");
}

static void test_spreadsheet_output_form(void **state)
{
    (void)state;
    corax_writer *w;
    assert_int_equal(corax_writer_memory(&w), CORAX_OK);
    corax_writer_format(w, (corax_table_format){';', ','});
    corax_writer_field(w, "a;b", 3);
    corax_writer_field(w, "1,5", 3); /* a comma is no separator here: no quotes */
    corax_writer_number(w, -12.345, 2);
    corax_writer_azimuth(w, 359.999, 2);
    corax_writer_end_row(w);
    size_t n;
    const char *text = corax_writer_contents(w, &n);
    static const char want[] = "\"a;b\";1,5;-12,35;0,00\n";
    assert_int_equal(n, sizeof want - 1);
    assert_memory_equal(text, want, n);
    corax_writer_discard(w);
    /* and it reads back: semicolons and decimal commas are found */
    corax_table_info info;
    char got[128];
    assert_int_equal(read_text("x;y\n\"a;b\";-12,35\n", corax_table_format_default(), &info, got,
                               sizeof got, NULL),
                     CORAX_END);
    assert_string_equal(got, "1:x|y/2:a;b|-12,35/");
    assert_int_equal(info.format.decimal, ',');
}

static void test_code_words(void **state)
{
    (void)state;
    corax_codes *c = NULL;
    corax_error err;
    assert_int_equal(corax_codes_add(&c, "G=good, M = fair,P=poor", &err), CORAX_OK);
    assert_int_equal(corax_codes_add(&c, "g=GOOD", &err), CORAX_OK); /* a later entry wins */
    assert_int_equal(corax_codes_count(c), 3);
    size_t wl;
    const char *w = corax_codes_word(c, " g ", 3, &wl);
    assert_non_null(w);
    assert_int_equal(wl, 4);
    assert_memory_equal(w, "GOOD", 4);
    w = corax_codes_word(c, "Fair", 4, &wl); /* a word stands for itself */
    assert_non_null(w);
    assert_memory_equal(w, "Fair", wl);
    assert_null(corax_codes_word(c, "X", 1, &wl));
    assert_null(corax_codes_word(c, "", 0, &wl));
    const char *word;
    assert_string_equal(corax_codes_at(c, 1, &word), "M");
    assert_string_equal(word, "fair");
    assert_null(corax_codes_at(c, 3, &word));
    assert_int_equal(corax_codes_add(&c, "G", &err), CORAX_EARG);
    assert_int_equal(corax_codes_add(&c, "=good", &err), CORAX_EARG);
    assert_int_equal(corax_codes_add(&c, "G=", &err), CORAX_EARG);
    corax_codes_free(c);
}

static void test_tally_of_unknown_values(void **state)
{
    (void)state;
    corax_tally *a = corax_tally_new(), *b = corax_tally_new();
    assert_int_equal(corax_tally_add(a, "X", 1, "log.csv", 0, 9), CORAX_OK);
    assert_int_equal(corax_tally_add(a, "x ", 2, "log.csv", 0, 4), CORAX_OK); /* same value */
    assert_int_equal(corax_tally_add(b, "Q", 1, "log.csv", 0, 2), CORAX_OK);
    assert_int_equal(corax_tally_add(b, "X", 1, "other.csv", 1, 1), CORAX_OK);
    assert_int_equal(corax_tally_merge(a, b), CORAX_OK);
    assert_int_equal(corax_tally_count(a), 2);
    size_t count;
    const char *file;
    long line;
    assert_string_equal(corax_tally_at(a, 0, &count, &file, &line), "Q"); /* first seen */
    assert_int_equal(count, 1);
    assert_string_equal(corax_tally_at(a, 1, &count, &file, &line), "X");
    assert_int_equal(count, 3);
    assert_string_equal(file, "log.csv"); /* the earliest file and line */
    assert_int_equal(line, 4);
    assert_null(corax_tally_at(a, 2, &count, &file, &line));
    corax_tally_free(a);
    corax_tally_free(b);
}

static void test_carried_names_never_clash(void **state)
{
    (void)state;
    static const char *const own[] = {"x", "depth", "log_x"};
    char out[64];
    assert_int_equal(corax_carried_name("alpha", own, 3, out, sizeof out), 5);
    assert_string_equal(out, "alpha");
    corax_carried_name("Depth", own, 3, out, sizeof out);
    assert_string_equal(out, "log_Depth");
    corax_carried_name("X", own, 3, out, sizeof out); /* log_X clashes with log_x too */
    assert_string_equal(out, "log_log_X");
}

static void test_interval_depths(void **state)
{
    (void)state;
    const char *f[] = {"", "10.5", "11.5"};
    size_t len[] = {0, 4, 4};
    corax_row row = {3, f, len, 7};
    const long col[3] = {-1, 1, 2};
    char why[120];
    double d;
    assert_int_equal(corax_field_depth(&row, col, '.', 1.0, 0, &d, why, sizeof why),
                     CORAX_NUMBER_OK);
    assert_close(d, 11.0, 0, 0, "the middle of the interval");
    assert_int_equal(corax_field_depth(&row, col, '.', CORAX_FOOT, 1, &d, why, sizeof why),
                     CORAX_NUMBER_OK);
    assert_close(d, 10.5 * 0.3048, 1e-15, 0, "its start, in feet (0.3048 m exactly)");
    assert_int_equal(corax_field_depth(&row, col, '.', 1.0, 2, &d, why, sizeof why),
                     CORAX_NUMBER_OK);
    assert_close(d, 11.5, 0, 0, "its end");
    const long with_depth[3] = {1, 1, 2};
    assert_int_equal(corax_field_depth(&row, with_depth, '.', 1.0, 0, &d, why, sizeof why),
                     CORAX_NUMBER_OK);
    assert_close(d, 10.5, 0, 0, "a depth column wins over the interval");
    const char *rev[] = {"", "12", "11"};
    row.field = rev;
    len[1] = len[2] = 2;
    assert_int_equal(corax_field_depth(&row, col, '.', 1.0, 0, &d, why, sizeof why),
                     CORAX_NUMBER_NOT_NUMBER);
    assert_non_null(strstr(why, "ends (to 11) before it starts (from 12)"));
    assert_true(isnan(d));
}

/* Write a program's tables, load it, and return it (findings in *found). */
static corax_program *load(const char *collars, const char *surveys,
                           const corax_load_options *o, corax_findings *found)
{
    const char *cpath = test_tmp_path("arr_collars.csv"), *spath = test_tmp_path("arr_surveys.csv");
    test_write_file(cpath, collars);
    test_write_file(spath, surveys);
    corax_program *prog = NULL;
    corax_error err;
    corax_status st = corax_program_load(cpath, spath, o, &prog, found, NULL, &err);
    unlink(cpath);
    unlink(spath);
    if (st != CORAX_OK)
        fail_msg("load: %s", err.message);
    return prog;
}

static void test_feet_give_the_same_positions(void **state)
{
    (void)state;
    /* the same survey in metres and in feet: 100 ft is 30.48 m exactly */
    corax_findings found = {0};
    corax_load_options m = corax_load_options_default();
    corax_program *pm = load("hole,x,y,z\nA,1000,2000,300\n",
                             "hole,depth,azimuth,dip\nA,0,90,-60\nA,30.48,92,-58\n"
                             "A,60.96,95,-55\nA,91.44,99,-51\n",
                             &m, &found);
    corax_load_options f = corax_load_options_default();
    f.surveys.unit = CORAX_FOOT;
    f.survey_dip = CORAX_DIP_FROM_VERTICAL;
    corax_program *pf = load("hole,x,y,z\nA,1000,2000,300\n",
                             "hole,depth,azimuth,dip\nA,0,90,30\nA,100,92,32\nA,200,95,35\n"
                             "A,300,99,39\n",
                             &f, &found);
    assert_int_equal(found.count, 0);
    const corax_hole *a = corax_program_find(pm, "A", 1), *b = corax_program_find(pf, "A", 1);
    for (double d = 0; d <= 120; d += 7.5) {
        corax_hole_point p, q;
        assert_int_equal(corax_hole_at(a, d, NULL, &p), CORAX_OK);
        assert_int_equal(corax_hole_at(b, d, NULL, &q), CORAX_OK);
        double scale = fmax(1.0, fabs(p.position.x) + fabs(p.position.y) + fabs(p.position.z));
        assert_close(q.position.x, p.position.x, 0, 1e-9 * scale, "east, feet against metres");
        assert_close(q.position.y, p.position.y, 0, 1e-9 * scale, "north, feet against metres");
        assert_close(q.position.z, p.position.z, 0, 1e-9 * scale, "elevation, feet against metres");
    }
    /* collars in feet: coordinates and length are feet too */
    corax_load_options cf = corax_load_options_default();
    cf.collars.unit = CORAX_FOOT;
    corax_program *pc = load("hole,x,y,z,azimuth,dip,length\nB,1000,2000,300,0,-90,500\n",
                             "hole,depth,azimuth,dip\n", &cf, &found);
    corax_hole_point p;
    assert_int_equal(corax_hole_at(corax_program_find(pc, "B", 1), 152.4, NULL, &p), CORAX_OK);
    assert_close(p.position.x, 304.8, 1e-12, 0, "1000 ft east");
    assert_close(p.position.z, 300 * 0.3048 - 152.4, 1e-12, 1e-12, "500 ft down a vertical hole");
    assert_int_equal(p.where, CORAX_WHERE_COLLAR_ONLY);
    corax_program_free(pm);
    corax_program_free(pf);
    corax_program_free(pc);
    corax_findings_clear(&found);
}

static void test_collar_station_and_rejected_stations(void **state)
{
    (void)state;
    const char *collars = "hole,x,y,z,azimuth,dip\nA,0,0,0,90,-60\n";
    const char *surveys = "hole,depth,azimuth,dip,use\nA,30,100,-50,\nA,60,100,-50,yes\n"
                          "A,90,170,-10,no\nA,120,100,-50,y\n";
    corax_findings found = {0};
    corax_load_options o = corax_load_options_default();
    corax_program *straight = load(collars, surveys, &o, &found);
    /* the use column left one station out, as a note */
    assert_int_equal(found.count, 1);
    assert_int_equal(found.item[0].severity, CORAX_NOTE);
    assert_string_equal(found.item[0].check, "survey-rejected");
    assert_int_equal(found.item[0].line, 4);
    const corax_hole *h = corax_program_find(straight, "A", 1);
    assert_int_equal(corax_hole_station_count(h), 3);
    corax_findings_clear(&found);

    /* above the first station the hole runs straight along the collar's set-up;
     * with the collar as a station, it curves from the set-up to the station
     * (minimum curvature), so at 15 m it has turned part of the way */
    o.collar_station = 1;
    corax_station_ref reject = {"A", 120};
    o.reject = &reject;
    o.nreject = 1;
    corax_program *curved = load(collars, surveys, &o, &found);
    assert_int_equal(found.count, 2); /* the use column's and the list's */
    const corax_hole *c = corax_program_find(curved, "A", 1);
    assert_int_equal(corax_hole_station_count(c), 3); /* 0, 30 and 60 */
    corax_hole_point p, q;
    assert_int_equal(corax_hole_at(h, 15, NULL, &p), CORAX_OK);
    assert_int_equal(corax_hole_at(c, 15, NULL, &q), CORAX_OK);
    double az, plunge;
    corax_direction_angles(p.tangent, &az, &plunge);
    assert_close(corax_deg(az), 90, 0, 1e-9, "straight: the collar's azimuth");
    corax_direction_angles(q.tangent, &az, &plunge);
    assert_true(corax_deg(az) > 90.5 && corax_deg(az) < 99.5); /* on the way to 100 */
    corax_findings_clear(&found);

    /* a reject naming no station is an error, not a silent no-op */
    corax_station_ref wrong = {"A", 45};
    o.reject = &wrong;
    corax_program *third = load(collars, surveys, &o, &found);
    assert_int_equal(corax_findings_count(&found, CORAX_ERROR), 1);
    int named = 0;
    for (size_t i = 0; i < found.count; i++)
        named |= strstr(found.item[i].message, "A at 45, is not in the survey table") != NULL;
    assert_true(named);
    corax_program_free(straight);
    corax_program_free(curved);
    corax_program_free(third);
    corax_findings_clear(&found);
}

static void test_directions_that_contradict_the_convention(void **state)
{
    (void)state;
    corax_findings found = {0};
    corax_load_options o = corax_load_options_default();
    o.survey_dip = CORAX_DIP_FROM_VERTICAL;
    /* a vertical hole needs no azimuth; any other does, and says so */
    corax_program *p = load("hole,x,y,z\nA,0,0,0\nB,0,0,0\nC,0,0,0\n",
                            "hole,depth,azimuth,dip\nA,0,,0\nB,0,,20\nC,0,90,-60\n", &o,
                            &found);
    assert_non_null(corax_program_find(p, "A", 1));
    assert_int_equal(found.count, 2);
    assert_non_null(strstr(found.item[0].message, "the azimuth is empty, and only a vertical"));
    assert_non_null(
        strstr(found.item[1].message, "dip -60 does not fit the table's dip convention, "
                                      "from-vertical"));
    corax_program_free(p);
    corax_findings_clear(&found);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_delimiter_found_from_the_header),
        cmocka_unit_test(test_decimal_mark_found_from_the_numbers),
        cmocka_unit_test(test_comments_blank_rows_and_blanks),
        cmocka_unit_test(test_numbers_with_either_mark),
        cmocka_unit_test(test_spreadsheet_output_form),
        cmocka_unit_test(test_code_words),
        cmocka_unit_test(test_tally_of_unknown_values),
        cmocka_unit_test(test_carried_names_never_clash),
        cmocka_unit_test(test_interval_depths),
        cmocka_unit_test(test_feet_give_the_same_positions),
        cmocka_unit_test(test_collar_station_and_rejected_stations),
        cmocka_unit_test(test_directions_that_contradict_the_convention),
    };
    return cmocka_run_group_tests_name("io tables", tests, NULL, NULL);
}
