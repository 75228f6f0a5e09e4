/* Tests of the export module: what the VTK file holds (traces on the arc,
 * discs in their planes) and the modelling CSV fields. The files are read
 * back by VTK's own reader in tests/cli/test_export_vtk.sh. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/export.h"
#include "export/export_int.h"
#include "io/spool.h"
#include "support/check.h"

/* The numbers after a keyword line such as "POINTS 3 double". */
static double *numbers_after(const char *text, const char *keyword, size_t count)
{
    const char *p = strstr(text, keyword);
    assert_non_null(p);
    p = strchr(p + strlen(keyword), '\n') + 1;
    double *v = malloc((count ? count : 1) * sizeof *v);
    for (size_t i = 0; i < count; i++) {
        char *end;
        v[i] = strtod(p, &end);
        assert_true(end != p);
        p = end;
    }
    return v;
}

static corax_program *one_hole(void)
{
    corax_program *prog = corax_program_new();
    corax_collar c = {{1000, 2000, 300}, corax_rad(90), corax_rad(60), 1, 100};
    corax_station st[2] = {{0, corax_rad(90), corax_rad(60), 0, 0, 0, 0}, {50, corax_rad(95), corax_rad(58), 0, 0, 0, 0}};
    corax_hole *h;
    assert_int_equal(corax_hole_new("H1", &c, st, 2, 0, &h, NULL), CORAX_OK);
    assert_int_equal(corax_program_add(prog, h), CORAX_OK);
    corax_collar none = {{0, 0, 0}, 0, 0, 0, NAN};
    assert_int_equal(corax_hole_new("H2", &none, NULL, 0, 0, &h, NULL), CORAX_OK);
    assert_int_equal(corax_program_add(prog, h), CORAX_OK);
    return prog;
}

/* derived: disc corners lie in the structure's plane at the disc radius;
 * trace points are the hole's positions on the arc at the sampled depths. */
static void test_vtk_discs_and_traces(void **state)
{
    (void)state;
    corax_program *prog = one_hole();
    corax_export_structure s[2] = {
        {{1010, 2001, 280}, {corax_rad(60), corax_rad(225)}, 23.5, 4, -1, 0, 1, 0, {0, 0, 0}, {NAN, NAN, NAN, NAN, NAN}},
        {{1030, 1999, 250}, {corax_rad(10), corax_rad(10)}, NAN, 100, 0, -1, 1, 0, {0, 0, 0}, {NAN, NAN, NAN, NAN, NAN}}};
    corax_export_options o = corax_export_options_default();
    o.step = 10;
    o.disc_radius = 2.5;
    o.disc_sides = 12;
    const char *path = test_tmp_path("discs.vtk");
    corax_export_counts n;
    assert_int_equal(corax_export_vtk(NULL, path, prog, s, 2, &o, &n, NULL), CORAX_OK);
    /* H1: 0, 10, ..., 100 (stations at 0 and 50 among them); H2 has no path */
    assert_int_equal(n.traces, 1);
    assert_int_equal(n.trace_points, 11);
    assert_int_equal(n.points, 11 + 24);
    assert_int_equal(n.cells, 3);
    char *text = test_read_file(path, NULL);
    assert_non_null(strstr(text, "LINES 1 12\n11 0 1 2 3 4 5 6 7 8 9 10\n"));
    assert_non_null(strstr(text, "POLYGONS 2 26\n12 11 12 13"));
    double *p = numbers_after(text, "POINTS 35 double", 3 * 35);
    const corax_hole *h = corax_program_hole(prog, 0);
    for (int k = 0; k < 11; k++) {
        corax_hole_point pt;
        corax_hole_at(h, 10.0 * k, NULL, &pt);
        assert_close(p[3 * k], pt.position.x, 0, 1e-6, "trace x on the arc");
        assert_close(p[3 * k + 2], pt.position.z, 0, 1e-6, "trace z on the arc");
    }
    for (int d = 0; d < 2; d++) {
        corax_vec3 nrm = corax_plane_normal(s[d].plane);
        for (int k = 0; k < 12; k++) {
            const double *q = &p[3 * (11 + 12 * d + k)];
            double dx = q[0] - s[d].position.x, dy = q[1] - s[d].position.y,
                   dz = q[2] - s[d].position.z;
            assert_close(sqrt(dx * dx + dy * dy + dz * dz), 2.5, 0, 1e-5, "corner at the radius");
            assert_close(dx * nrm.x + dy * nrm.y + dz * nrm.z, 0, 0, 1e-5, "corner in the plane");
        }
    }
    free(p);
    /* cell data in cell order: the trace line, then the two discs */
    double *kind = numbers_after(text, "SCALARS kind int 1\nLOOKUP_TABLE default", 3);
    assert_close(kind[0], -1, 0, 0, "a trace has kind -1");
    assert_close(kind[1], 4, 0, 0, "vein code");
    assert_close(kind[2], 100, 0, 0, "first other kind");
    double *dip = numbers_after(text, "dip 1 3 double", 3);
    assert_close(dip[0], -1, 0, 0, "a trace is not a plane");
    assert_close(dip[1], 60, 0, 1e-6, "dip in degrees");
    double *dd = numbers_after(text, "dip_direction 1 3 double", 3);
    assert_close(dd[1], 225, 0, 1e-6, "dip direction in degrees");
    double *polarity = numbers_after(text, "polarity 1 3 int", 3);
    assert_close(polarity[0], 0, 0, 0, "a trace has no polarity");
    assert_close(polarity[1], -1, 0, 0, "overturned");
    free(polarity);
    double *hole = numbers_after(text, "hole 1 3 int", 3);
    assert_close(hole[0], 1, 0, 0, "trace of the first hole");
    assert_close(hole[1], 1, 0, 0, "structure in the first hole");
    assert_close(hole[2], 0, 0, 0, "structure of no known hole");
    double *depth = numbers_after(text, "SCALARS depth double 1\nLOOKUP_TABLE default", 35);
    assert_close(depth[10], 100, 0, 1e-9, "trace end depth");
    assert_close(depth[11], 23.5, 0, 1e-9, "a disc corner carries its structure's depth");
    assert_close(depth[34], -1, 0, 0, "unknown depth");
    free(kind);
    free(dip);
    free(dd);
    free(hole);
    free(depth);
    free(text);
    remove(path);
    corax_program_free(prog);
}

/* Points with normals: vertices first in cell order, the upward normal. */
static void test_vtk_points_with_normals(void **state)
{
    (void)state;
    corax_program *prog = one_hole();
    corax_export_structure s = {{1010, 2001, 280}, {corax_rad(30), corax_rad(90)}, 5, 1, 1, 0, 1, 0, {0, 0, 0}, {NAN, NAN, NAN, NAN, NAN}};
    corax_export_options o = corax_export_options_default();
    o.shape = CORAX_EXPORT_POINTS;
    o.step = 50;
    const char *path = test_tmp_path("points.vtk");
    assert_int_equal(corax_export_vtk(NULL, path, prog, &s, 1, &o, NULL, NULL), CORAX_OK);
    char *text = test_read_file(path, NULL);
    assert_non_null(strstr(text, "VERTICES 1 2\n1 3\nLINES 1 4\n3 0 1 2\n"));
    double *nrm = numbers_after(text, "NORMALS normal double", 12);
    assert_close(nrm[0], 0, 0, 0, "traces have no normal");
    /* common practice: the upward normal of a plane dipping 30 to the east
     * points east and up: (sin 30, 0, cos 30) */
    assert_close(nrm[9], 0.5, 0, 1e-6, "normal east");
    assert_close(nrm[10], 0, 0, 1e-6, "normal north");
    assert_close(nrm[11], cos(corax_rad(30)), 0, 1e-6, "normal up");
    double *kind = numbers_after(text, "SCALARS kind int 1\nLOOKUP_TABLE default", 2);
    assert_close(kind[0], 1, 0, 0, "vertex first in cell order");
    assert_close(kind[1], -1, 0, 0, "then the trace");
    free(nrm);
    free(kind);
    free(text);
    remove(path);
    /* structures only, no program */
    o.traces = 0;
    assert_int_equal(corax_export_vtk(NULL, path, prog, &s, 1, &o, NULL, NULL), CORAX_OK);
    text = test_read_file(path, NULL);
    assert_non_null(strstr(text, "POINTS 1 double\n"));
    assert_null(strstr(text, "LINES"));
    free(text);
    remove(path);
    o.disc_sides = 2;
    o.shape = CORAX_EXPORT_DISCS;
    assert_int_equal(corax_export_vtk(NULL, path, prog, &s, 1, &o, NULL, NULL), CORAX_EARG);
    corax_program_free(prog);
}

static void test_csv_fields(void **state)
{
    (void)state;
    const char *path = test_tmp_path("model.csv");
    corax_writer *w;
    assert_int_equal(corax_writer_open(path, &w, NULL), CORAX_OK);
    corax_structure s;
    memset(&s, 0, sizeof s);
    s.located = s.oriented = 1;
    s.position = (corax_vec3){10.1234, 20, -5};
    s.plane = (corax_plane){corax_rad(90), corax_rad(359.999)};
    s.polarity = -1;
    corax_export_csv_fields(w, &s);
    corax_writer_end_row(w);
    s.polarity = 0;
    s.plane = (corax_plane){0, 0};
    corax_export_csv_fields(w, &s);
    corax_writer_end_row(w);
    s.oriented = 0; /* a lineation alone: no plane, and its unit vector */
    corax_export_csv_fields(w, &s);
    corax_export_extra x = {1, corax_rad(90), corax_rad(30), {0, 0, 0}, {0}, "", 0};
    x.line = corax_direction(x.trend, x.plunge);
    corax_export_csv_line(w, &x);
    corax_writer_end_row(w);
    assert_int_equal(corax_writer_commit(w, NULL), CORAX_OK);
    char *text = test_read_file(path, NULL);
    /* a vertical plane dipping (almost) north: normal horizontal, north */
    assert_string_equal(text, "10.123,20.000,-5.000,90.00,0.00,-0.000017,1.000000,0.000000,-1\n"
                              "10.123,20.000,-5.000,0.00,0.00,0.000000,0.000000,1.000000,\n"
                              /* east, 30 below the horizontal: (cos 30, 0, -sin 30) */
                              "10.123,20.000,-5.000,,,,,,,0.866025,0.000000,-0.500000\n");
    free(text);
    remove(path);
}

/* n random structures, some with a lineation, some with Monte Carlo columns. */
static corax_export_structure *random_structures(size_t n, uint64_t seed)
{
    corax_export_structure *s = malloc(n * sizeof *s);
    assert_non_null(s);
    for (size_t i = 0; i < n; i++) {
        double u = test_uniform(&seed);
        corax_vec3 l = corax_direction(2 * CORAX_PI * test_uniform(&seed),
                                       0.5 * CORAX_PI * test_uniform(&seed));
        s[i] = (corax_export_structure){
            {1000 + 40 * test_uniform(&seed), 2000 + 40 * test_uniform(&seed),
             300 - 90 * test_uniform(&seed)},
            {0.5 * CORAX_PI * test_uniform(&seed), 2 * CORAX_PI * test_uniform(&seed)},
            u < 0.1 ? (double)NAN : 100 * u, (int)(i % 11), (int)(i % 3) - 1, (long)(i % 3) - 1, 1,
            i % 4 == 0, {(float)l.x, (float)l.y, (float)l.z}, {NAN, NAN, NAN, NAN, NAN}};
        for (int k = 0; i % 5 == 0 && k < CORAX_EXPORT_SPREAD; k++)
            s[i].spread[k] = (float)(10 * test_uniform(&seed));
    }
    return s;
}

/* The same structures written from an array and from a spool (read back
 * through its file, once per block) make the same file, byte for byte, in
 * every shape and encoding, with and without arrows. */
static void test_vtk_spooled_same_as_array(void **state)
{
    (void)state;
    corax_program *prog = one_hole();
    enum { N = 30000 }; /* more than the spool's buffer holds */
    corax_export_structure *s = random_structures(N, 16);
    const char *a = test_tmp_path("array.vtk"), *b = test_tmp_path("spooled.vtk");
    corax_spool *sp = corax_spool_new(sizeof *s, b, NULL);
    assert_non_null(sp);
    for (size_t i = 0; i < N; i++)
        assert_int_equal(corax_spool_add(sp, &s[i], NULL), CORAX_OK);
    for (int k = 0; k < 8; k++) {
        corax_export_options o = corax_export_options_default();
        o.shape = k & 1 ? CORAX_EXPORT_POINTS : CORAX_EXPORT_DISCS;
        o.encoding = k & 2 ? CORAX_VTK_BINARY : CORAX_VTK_ASCII;
        o.arrow = k & 4 ? 3.0 : 0.0;
        o.disc_sides = 7;
        corax_export_counts ca, cb;
        assert_int_equal(corax_export_vtk(NULL, a, prog, s, N, &o, &ca, NULL), CORAX_OK);
        assert_int_equal(corax_export_vtk_spooled(NULL, b, prog, sp, &o, &cb, NULL), CORAX_OK);
        assert_memory_equal(&ca, &cb, sizeof ca);
        assert_int_equal(ca.cells, 1 + N + (k & 4 ? N / 4 : 0));
        size_t na, nb;
        char *ta = test_read_file(a, &na), *tb = test_read_file(b, &nb);
        assert_int_equal(na, nb);
        assert_memory_equal(ta, tb, na);
        free(ta);
        free(tb);
    }
    remove(a);
    remove(b);
    corax_spool_free(sp);
    free(s);
    corax_program_free(prog);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_vtk_discs_and_traces),
        cmocka_unit_test(test_vtk_points_with_normals),
        cmocka_unit_test(test_csv_fields),
        cmocka_unit_test(test_vtk_spooled_same_as_array),
    };
    return cmocka_run_group_tests_name("export", tests, NULL, NULL);
}
