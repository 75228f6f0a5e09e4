/* Tests of structure rows read from converted tables, feature kind codes,
 * and columns carried through to an output. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/output.h"
#include "corax/structure.h"
#include "io/carry.h"
#include "support/check.h"

/* A row from fields given as strings. */
typedef struct test_row {
    const char *f[16];
    size_t len[16];
    corax_row row;
} test_row;

static const corax_row *make_row(test_row *t, size_t n, const char *const *fields, long line)
{
    for (size_t i = 0; i < n; i++) {
        t->f[i] = fields[i];
        t->len[i] = strlen(fields[i]);
    }
    t->row = (corax_row){n, t->f, t->len, line};
    return &t->row;
}

/* The shape of a converted table: the log's columns, then the results. */
static const char *const header[] = {"hole", "depth", "kind",     "x",      "y",
                                     "z",    "dip",   "dip_direction", "status", "younging"};

static void columns(corax_structure_columns *c)
{
    test_row t;
    const corax_row *h = make_row(&t, 10, header, 1);
    long col[CORAX_STRUCTURE_COLUMNS];
    for (int i = 0; i < CORAX_STRUCTURE_COLUMNS; i++)
        col[i] = corax_column_find(h, corax_structure_column_names[i], NULL);
    corax_structure_columns_set(c, col);
    assert_int_equal(c->x, 3);
    assert_int_equal(c->dip_direction, 7);
    assert_int_equal(c->polarity, 9); /* "younging" is the usual other name */
}

static void test_rows_read(void **state)
{
    (void)state;
    corax_structure_columns c;
    columns(&c);
    test_row t;
    corax_structure s;
    char why[200];
    const char *ok[] = {"QC1", "12.5", " Vein ", "100", "200", "300", "60", "225", "ok", "overturned"};
    assert_int_equal(corax_structure_read(make_row(&t, 10, ok, 2), &c, '.', &s, why, sizeof why),
                     CORAX_OK);
    assert_true(s.located && s.oriented);
    assert_close(s.position.z, 300, 0, 0, "z read");
    assert_close(corax_deg(s.plane.dip), 60, 0, 1e-12, "dip read in degrees");
    assert_close(corax_deg(s.plane.dip_direction), 225, 0, 1e-12, "dip direction read");
    assert_close(s.depth, 12.5, 0, 0, "depth read");
    assert_int_equal(s.polarity, -1);
    assert_int_equal(s.hole_len, 3);
    /* the conversion could not orient it: located, not oriented, no error */
    const char *unoriented[] = {"QC1", "13", "fault", "100", "200", "300", "", "", "unoriented", ""};
    assert_int_equal(corax_structure_read(make_row(&t, 10, unoriented, 3), &c, '.', &s, why,
                                          sizeof why), CORAX_OK);
    assert_true(s.located && !s.oriented);
    assert_int_equal(s.polarity, 0);
    const char *unknown_hole[] = {"QX", "13", "fault", "", "", "", "", "", "unknown-hole", "1"};
    assert_int_equal(corax_structure_read(make_row(&t, 10, unknown_hole, 4), &c, '.', &s, why,
                                          sizeof why), CORAX_OK);
    assert_true(!s.located && !s.oriented);
    assert_int_equal(s.polarity, 1);
    /* a dip without its direction (convert's dip-only row, a hole near
     * vertical): located, not oriented, no error */
    const char *dip_only[] = {"QC6", "40", "bedding", "100", "200", "300", "30", "", "dip-only", ""};
    assert_int_equal(corax_structure_read(make_row(&t, 10, dip_only, 5), &c, '.', &s, why,
                                          sizeof why), CORAX_OK);
    assert_true(s.located && !s.oriented);
    /* present but unusable values are errors that say why */
    static const struct {
        const char *field;
        int col;
        const char *phrase;
    } bad[] = {
        {"abc", 6, "dip 'abc' is not a number"},
        {"95", 6, "dip 95 is outside [0, 90]"},
        {"-1", 7, "dip_direction -1 is outside [0, 360]"},
        {"", 4, "x, y, z: some given and some empty"},
        {"", 6, "dip and dip_direction: some given and some empty"},
        {"sideways", 9, "polarity 'sideways' is not one of"},
        {"x", 1, "depth 'x' is not a number"},
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        const char *f[10];
        memcpy(f, ok, sizeof f);
        f[bad[i].col] = bad[i].field;
        assert_int_equal(corax_structure_read(make_row(&t, 10, f, 5), &c, '.', &s, why, sizeof why),
                         CORAX_EVALUE);
        if (strncmp(why, bad[i].phrase, strlen(bad[i].phrase)) != 0)
            fail_msg("why: '%s', expected '%s'", why, bad[i].phrase);
    }
}

/* The plane comes from the unit normal when the row gives it: dip and dip
 * direction rounded to hundredths lose up to 0.005 degrees. derived: the
 * normal of 49.35/289.39 written to 5 decimals, as the conversion does. */
static void test_plane_from_the_normal(void **state)
{
    (void)state;
    static const char *const h[] = {"x", "y", "z", "dip", "dip_direction", "nx", "ny", "nz"};
    test_row t;
    const corax_row *hr = make_row(&t, 8, h, 1);
    long col[CORAX_STRUCTURE_COLUMNS];
    for (int i = 0; i < CORAX_STRUCTURE_COLUMNS; i++)
        col[i] = corax_column_find(hr, corax_structure_column_names[i], NULL);
    corax_structure_columns c;
    corax_structure_columns_set(&c, col);
    corax_plane exact = {corax_rad(49.3512), corax_rad(289.3871)};
    corax_vec3 n = corax_plane_normal(exact);
    char nx[32], ny[32], nz[32], why[200];
    snprintf(nx, sizeof nx, "%.5f", n.x);
    snprintf(ny, sizeof ny, "%.5f", n.y);
    snprintf(nz, sizeof nz, "%.5f", n.z);
    const char *row[] = {"1", "2", "3", "49.35", "289.39", nx, ny, nz};
    corax_structure s;
    assert_int_equal(corax_structure_read(make_row(&t, 8, row, 2), &c, '.', &s, why, sizeof why),
                     CORAX_OK);
    assert_close(corax_deg(s.plane.dip), 49.3512, 0, 5e-4, "dip from the 5-decimal normal");
    assert_close(corax_deg(s.plane.dip_direction), 289.3871, 0, 5e-4,
                 "dip direction from the 5-decimal normal");
    static const struct {
        const char *f[3];
        const char *phrase;
    } bad[] = {
        {{"0.1", "0.1", "0.1"}, "nx, ny, nz is not a unit vector"},
        {{"", "0.1", "0.1"}, "nx, ny, nz: some given and some empty"},
        {{"0", "0", "1"}, "nx, ny, nz lie 49.35 degrees from"},
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        const char *r2[] = {"1", "2", "3", "49.35", "289.39", bad[i].f[0], bad[i].f[1], bad[i].f[2]};
        assert_int_equal(corax_structure_read(make_row(&t, 8, r2, 3), &c, '.', &s, why, sizeof why),
                         CORAX_EVALUE);
        if (strncmp(why, bad[i].phrase, strlen(bad[i].phrase)) != 0)
            fail_msg("why: '%s', expected '%s'", why, bad[i].phrase);
    }
    const char *none[] = {"1", "2", "3", "49.35", "289.39", "", "", ""};
    assert_int_equal(corax_structure_read(make_row(&t, 8, none, 4), &c, '.', &s, why, sizeof why),
                     CORAX_OK);
    assert_close(corax_deg(s.plane.dip), 49.35, 0, 1e-12, "no normal: dip as given");
}

static void test_kind_codes(void **state)
{
    (void)state;
    corax_kinds *k = corax_kinds_new();
    assert_int_equal(corax_kinds_code(k, "Fault", 5), 5);
    assert_int_equal(corax_kinds_code(k, " bedding ", 9), 1);
    assert_int_equal(corax_kinds_code(k, "breccia", 7), CORAX_KIND_OTHER);
    assert_int_equal(corax_kinds_code(k, "stylolite", 9), CORAX_KIND_OTHER + 1);
    assert_int_equal(corax_kinds_code(k, "BRECCIA", 7), CORAX_KIND_OTHER);
    assert_int_equal(corax_kinds_code(k, "", 0), CORAX_KIND_NONE);
    assert_int_equal(corax_kinds_code(k, "lineation", 9), 10);
    assert_int_equal(corax_kinds_count(k), 6);
    static const int want_code[] = {0, 1, 5, 10, 100, 101};
    static const char *const want_name[] = {"none", "bedding", "fault", "lineation", "breccia",
                                            "stylolite"};
    for (size_t i = 0; i < 6; i++) {
        const char *name;
        assert_int_equal(corax_kinds_at(k, i, &name), want_code[i]);
        assert_string_equal(name, want_name[i]);
    }
    const char *name;
    assert_int_equal(corax_kinds_at(k, 6, &name), -1);
    assert_string_equal(corax_kinds_name(k, 101), "stylolite");
    assert_string_equal(corax_kinds_name(k, 7), "joint");
    assert_null(corax_kinds_name(k, 102));
    assert_null(corax_kinds_name(k, 50));
    corax_kinds_free(k);
    corax_kinds_free(NULL);
}

/* Two tables into one output: the union of their columns by name, in order
 * of first appearance, less the replaced and consumed ones; a table without
 * a column leaves it empty; unnamed columns are each kept. */
static void test_carry_union(void **state)
{
    (void)state;
    static const char *const drop[] = {"x", "note"};
    corax_carry *c = corax_carry_new(drop, 2);
    test_row t1, t2, r;
    const char *h1[] = {"hole", "X", "east", "sample", ""};
    const char *h2[] = {"Sample", "hole", "note", "geologist", ""};
    long consumed1[] = {2, -1};
    assert_int_equal(corax_carry_add(c, make_row(&t1, 5, h1, 1), consumed1, 2), 0);
    assert_int_equal(corax_carry_add(c, make_row(&t2, 5, h2, 1), NULL, 0), 1);
    assert_int_equal(corax_carry_count(c), 5);
    const char *path = test_tmp_path("carry.csv");
    corax_writer *w;
    assert_int_equal(corax_writer_open(path, &w, NULL), CORAX_OK);
    corax_carry_header(c, w);
    corax_writer_end_row(w);
    const char *a[] = {"Q1", "1", "2", "S1", "u1"};
    corax_carry_row(c, 0, make_row(&r, 5, a, 2), w);
    corax_writer_end_row(w);
    const char *b[] = {"S2", "Q2", "n", "ann", "u2"};
    corax_carry_row(c, 1, make_row(&r, 5, b, 2), w);
    corax_writer_end_row(w);
    const char *shortrow[] = {"S3"};
    corax_carry_row(c, 1, make_row(&r, 1, shortrow, 3), w);
    corax_writer_end_row(w);
    assert_int_equal(corax_writer_commit(w, NULL), CORAX_OK);
    char *text = test_read_file(path, NULL);
    assert_string_equal(text, "hole,sample,,geologist,\n"
                              "Q1,S1,u1,,\n"
                              "Q2,S2,,ann,u2\n"
                              ",S3,,,\n");
    free(text);
    remove(path);
    corax_carry_free(c);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_rows_read),
        cmocka_unit_test(test_plane_from_the_normal),
        cmocka_unit_test(test_kind_codes),
        cmocka_unit_test(test_carry_union),
    };
    return cmocka_run_group_tests_name("structure", tests, NULL, NULL);
}
