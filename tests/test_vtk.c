/* Tests of the legacy VTK writer: the layout of the format (VTK User's
 * Guide, "VTK File Formats", Kitware: header, POINTS, cell blocks with their
 * size field, POINT_DATA/CELL_DATA, SCALARS with a lookup table, FIELD
 * arrays; binary big-endian), announced sizes enforced, whole or no file. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "corax/vtk.h"
#include "support/check.h"

/* A triangle and a line: two cells, three points, data on both. */
static void write_small(corax_vtk *v)
{
    corax_vtk_points(v, 3);
    corax_vtk_point(v, (corax_vec3){0, 0, 0});
    corax_vtk_point(v, (corax_vec3){1.5, 0, -2});
    corax_vtk_point(v, (corax_vec3){0, 1, 0.25});
    corax_vtk_cells(v, "LINES", 1, 2);
    corax_vtk_cell(v, 2);
    corax_vtk_index(v, 0);
    corax_vtk_index(v, 1);
    corax_vtk_cells(v, "POLYGONS", 1, 3);
    corax_vtk_cell(v, 3);
    corax_vtk_index(v, 0);
    corax_vtk_index(v, 1);
    corax_vtk_index(v, 2);
    corax_vtk_point_data(v, 3);
    corax_vtk_scalars(v, "depth", CORAX_VTK_DOUBLE);
    corax_vtk_double(v, 0);
    corax_vtk_double(v, 2.5);
    corax_vtk_double(v, -1);
    corax_vtk_cell_data(v, 2);
    corax_vtk_scalars(v, "kind", CORAX_VTK_INT);
    corax_vtk_int(v, -1);
    corax_vtk_int(v, 4);
    corax_vtk_field(v, "attributes", 1);
    corax_vtk_array(v, "dip", 1, CORAX_VTK_DOUBLE);
    corax_vtk_double(v, -1);
    corax_vtk_double(v, 60);
}

static void test_ascii_layout(void **state)
{
    (void)state;
    const char *path = test_tmp_path("small.vtk");
    corax_vtk *v;
    assert_int_equal(corax_vtk_open(NULL, path, CORAX_VTK_ASCII, "two\ncells", &v, NULL), CORAX_OK);
    corax_vtk_decimals(v, 3);
    write_small(v);
    assert_int_equal(corax_vtk_commit(v, NULL), CORAX_OK);
    char *buf = test_read_file(path, NULL);
    assert_string_equal(buf, "# vtk DataFile Version 3.0\n"
                             "two cells\n"
                             "ASCII\n"
                             "DATASET POLYDATA\n"
                             "POINTS 3 double\n"
                             "0.000 0.000 0.000\n"
                             "1.500 0.000 -2.000\n"
                             "0.000 1.000 0.250\n"
                             "LINES 1 3\n"
                             "2 0 1\n"
                             "POLYGONS 1 4\n"
                             "3 0 1 2\n"
                             "POINT_DATA 3\n"
                             "SCALARS depth double 1\n"
                             "LOOKUP_TABLE default\n"
                             "0.000 2.500 -1.000\n"
                             "CELL_DATA 2\n"
                             "SCALARS kind int 1\n"
                             "LOOKUP_TABLE default\n"
                             "-1 4\n"
                             "FIELD attributes 1\n"
                             "dip 1 2 double\n"
                             "-1.000 60.000\n");
    free(buf);
    remove(path);
}

static uint64_t be(const unsigned char *p, int n)
{
    uint64_t u = 0;
    for (int i = 0; i < n; i++)
        u = (u << 8) | p[i];
    return u;
}

/* Where text first occurs in n bytes (which may hold NULs), or NULL. */
static const unsigned char *find_bytes(const char *buf, size_t n, const char *text)
{
    size_t k = strlen(text);
    for (size_t i = 0; i + k <= n; i++)
        if (memcmp(buf + i, text, k) == 0)
            return (const unsigned char *)buf + i;
    return NULL;
}

static double be_double(const unsigned char *p)
{
    uint64_t u = be(p, 8);
    double d;
    memcpy(&d, &u, sizeof d);
    return d;
}

/* Binary: the same keywords, values big-endian, a line break after each
 * block of values. */
static void test_binary_layout(void **state)
{
    (void)state;
    const char *path = test_tmp_path("small-bin.vtk");
    corax_vtk *v;
    assert_int_equal(corax_vtk_open(NULL, path, CORAX_VTK_BINARY, "bin", &v, NULL), CORAX_OK);
    write_small(v);
    assert_int_equal(corax_vtk_commit(v, NULL), CORAX_OK);
    size_t n;
    char *buf = test_read_file(path, &n);
    const char *head = "# vtk DataFile Version 3.0\nbin\nBINARY\nDATASET POLYDATA\nPOINTS 3 double\n";
    assert_memory_equal(buf, head, strlen(head));
    const unsigned char *p = (const unsigned char *)buf + strlen(head);
    assert_close(be_double(p + 8 * 3), 1.5, 0, 0, "x of point 1, big-endian double");
    assert_close(be_double(p + 8 * 5), -2, 0, 0, "z of point 1, big-endian double");
    assert_close(be_double(p + 8 * 8), 0.25, 0, 0, "z of point 2, big-endian double");
    p += 9 * 8;
    assert_int_equal(*p, '\n');
    const char *lines = "\nLINES 1 3\n";
    assert_memory_equal(p, lines, strlen(lines));
    p += strlen(lines);
    assert_int_equal(be(p, 4), 2);
    assert_int_equal(be(p + 8, 4), 1);
    const char *label = "SCALARS kind int 1\nLOOKUP_TABLE default\n";
    const unsigned char *kind = find_bytes(buf, n, label);
    assert_non_null(kind);
    kind += strlen(label);
    assert_int_equal((int32_t)(uint32_t)be(kind, 4), -1);
    assert_int_equal(be(kind + 4, 4), 4);
    assert_int_equal(buf[n - 1], '\n');
    free(buf);
    remove(path);
}

/* A block short of what it announced, or given too much, or a value ASCII
 * cannot hold: refused at commit, and no file is left. */
static void test_misuse_is_refused(void **state)
{
    (void)state;
    for (int k = 0; k < 5; k++) {
        const char *path = test_tmp_path("bad.vtk");
        corax_vtk *v;
        corax_error err;
        corax_error_clear(&err);
        assert_int_equal(corax_vtk_open(NULL, path, CORAX_VTK_ASCII, "bad", &v, NULL), CORAX_OK);
        corax_vtk_points(v, 2);
        corax_vtk_point(v, (corax_vec3){0, 0, 0});
        if (k == 0) { /* one point short */
        } else if (k == 1) { /* one value too many */
            corax_vtk_point(v, (corax_vec3){0, 0, 0});
            corax_vtk_double(v, 1);
        } else if (k == 2) { /* NaN */
            corax_vtk_point(v, (corax_vec3){NAN, 0, 0});
        } else if (k == 3) { /* an index beyond the points */
            corax_vtk_point(v, (corax_vec3){0, 0, 0});
            corax_vtk_cells(v, "LINES", 1, 2);
            corax_vtk_cell(v, 2);
            corax_vtk_index(v, 0);
            corax_vtk_index(v, 2);
        } else { /* a cell short of its indices */
            corax_vtk_point(v, (corax_vec3){0, 0, 0});
            corax_vtk_cells(v, "LINES", 1, 2);
            corax_vtk_cell(v, 3);
            corax_vtk_index(v, 0);
            corax_vtk_index(v, 1);
        }
        assert_int_equal(corax_vtk_commit(v, &err), CORAX_EARG);
        assert_true(strlen(err.message) > 0);
        assert_int_equal(access(path, F_OK), -1);
    }
    corax_vtk_discard(NULL);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_ascii_layout),
        cmocka_unit_test(test_binary_layout),
        cmocka_unit_test(test_misuse_is_refused),
    };
    return cmocka_run_group_tests_name("vtk", tests, NULL, NULL);
}
