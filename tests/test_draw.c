/* Tests of the draw module's SVG writer: valid markup, escaping, numbers. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/section_drawing.h"
#include "corax/svg.h"
#include "support/check.h"

static void test_svg_document(void **state)
{
    (void)state;
    corax_svg *s = corax_svg_new(200, 100.5);
    assert_non_null(s);
    corax_svg_style(s, ".a { stroke: #123; }");
    corax_svg_group(s, "g1", "translate(10,20)");
    corax_svg_line(s, 0, 0, 12.5, 3.004, "a");
    corax_svg_circle(s, 1, 2, 0.333, NULL);
    double xy[] = {0, 0, 1, 1, 2, 0};
    corax_svg_poly(s, xy, 3, 1, "p");
    corax_svg_path_begin(s, "q");
    corax_svg_path_move(s, 0, 0);
    corax_svg_path_line(s, -1.25, 2);
    corax_svg_path_end(s, 1);
    corax_svg_text(s, 5, 6, "t", "middle", "Hole <A&B> \"x\"");
    corax_svg_text(s, 5, 20, NULL, NULL, "a\x01" "b \xd1" "C \xc3\xa9 \xe2\x80\x94 \xed\xa0");
    corax_svg_end_group(s);
    size_t n;
    const char *doc = corax_svg_finish(s, &n);
    assert_non_null(doc);
    assert_int_equal(strlen(doc), n);
    assert_non_null(strstr(doc, "width=\"200\" height=\"100.5\" viewBox=\"0 0 200 100.5\""));
    assert_non_null(strstr(doc, "<line x1=\"0\" y1=\"0\" x2=\"12.5\" y2=\"3\" class=\"a\"/>"));
    assert_non_null(strstr(doc, "r=\"0.33\""));
    assert_non_null(strstr(doc, "<polygon points=\"0,0 1,1 2,0\" class=\"p\"/>"));
    assert_non_null(strstr(doc, "d=\"M0,0 L-1.25,2 Z\""));
    assert_non_null(strstr(doc, ">Hole &lt;A&amp;B&gt; &quot;x&quot;</text>"));
    /* a control character and a Latin-1 byte cannot stand in XML; UTF-8 stays */
    assert_non_null(strstr(doc, ">a&#xFFFD;b &#xFFFD;C \xc3\xa9 \xe2\x80\x94 &#xFFFD;&#xFFFD;</text>"));
    assert_non_null(strstr(doc, "text-anchor=\"middle\""));
    assert_string_equal(doc + n - 7, "</svg>\n");
    /* finishing twice closes once */
    size_t n2;
    corax_svg_finish(s, &n2);
    assert_int_equal(n, n2);
    corax_svg_free(s);
}

/* The line drawn for the first structure: its end points in pixels. */
static void first_tick(const char *doc, double *x1, double *y1, double *x2, double *y2)
{
    const char *g = strstr(doc, "<g class=\"structures\">");
    assert_non_null(g);
    const char *line = strstr(g, "<line ");
    assert_non_null(line);
    assert_int_equal(sscanf(line, "<line x1=\"%lf\" y1=\"%lf\" x2=\"%lf\" y2=\"%lf\"", x1, y1,
                            x2, y2), 4);
}

/* J. B. Jukes (1859), The South Staffordshire Coalfield, appendix: beds
 * dipping north at 35 degrees seen in a NE-SW section show 26 deg 15 min
 * (the formula: 26.34). The tick drawn for them has that slope on the page,
 * because the drawing keeps one scale across and down, and falls toward the
 * NE (right-hand) end. */
static void test_section_tick_at_the_apparent_dip(void **state)
{
    (void)state;
    corax_section s = corax_section_make(0, 0, corax_rad(45), 20);
    corax_section_drawing *d = corax_section_drawing_new(&s, 5);
    assert_non_null(d);
    corax_section_sample t[3] = {{0, {-100, 0, 500}, 1}, {100, {0, 0, 400}, 1},
                                 {200, {100, 0, 300}, 1}};
    assert_int_equal(corax_section_drawing_hole(d, "H<1>", t, 3), CORAX_OK);
    corax_section_dip dip = corax_section_plane(&s, (corax_plane){corax_rad(35), 0});
    corax_section_point at = {10, 2, 420};
    assert_int_equal(corax_section_drawing_structure(d, at, &dip, 1, "bedding", "H1 12 m"),
                     CORAX_OK);
    assert_int_equal(corax_section_drawing_structure(d, at, NULL, 4, "vein", NULL), CORAX_OK);
    assert_int_equal(corax_section_drawing_count(d), 2);
    corax_svg *svg = corax_section_drawing_render(d, "Title\nsubtitle", "footer & more");
    assert_non_null(svg);
    const char *doc = corax_svg_finish(svg, NULL);
    double x1, y1, x2, y2;
    first_tick(doc, &x1, &y1, &x2, &y2);
    double slope = corax_deg(atan2(fabs(y2 - y1), fabs(x2 - x1)));
    assert_close(slope, 26.0 + 15.0 / 60.0, 0, 0.1, "tick slope on the page, Jukes (1859)");
    assert_true((x2 - x1) * (y2 - y1) > 0); /* down to the right: toward the NE end */
    assert_non_null(strstr(doc, ">225\xc2\xb0</text>"));
    assert_non_null(strstr(doc, ">045\xc2\xb0</text>"));
    assert_non_null(strstr(doc, ">H&lt;1&gt;</text>"));
    assert_non_null(strstr(doc, ">bedding (1)</text>"));
    assert_non_null(strstr(doc, ">vein (1)</text>"));
    assert_non_null(strstr(doc, ">no orientation</text>"));
    assert_non_null(strstr(doc, ">footer &amp; more</text>"));
    assert_null(strstr(doc, "No structures"));
    corax_svg_free(svg);
    corax_section_drawing_free(d);
}

/* An empty slab is drawn with a note; nothing at all still makes a frame. */
static void test_section_without_structures(void **state)
{
    (void)state;
    corax_section s = corax_section_make(0, 0, 0, 20);
    corax_section_drawing *d = corax_section_drawing_new(&s, 5);
    corax_svg *svg = corax_section_drawing_render(d, "Empty", NULL);
    const char *doc = corax_svg_finish(svg, NULL);
    assert_non_null(strstr(doc, "No structures lie in this slab"));
    assert_non_null(strstr(doc, "competent person"));
    corax_svg_free(svg);
    corax_section_drawing_free(d);
    corax_section_drawing_free(NULL);
}

static size_t count(const char *doc, const char *what)
{
    size_t n = 0;
    for (const char *p = doc; (p = strstr(p, what)); p++)
        n++;
    return n;
}

/* A slab of 100,000 structures is drawn as a sample of at most 20,000
 * ticks, the legend saying how many of how many, and the file stays a few
 * megabytes; the legend's counts are of them all. A crowd of holes at one
 * place names a few of them, never stacking names above the page. */
static void test_section_big_slab_sampled(void **state)
{
    (void)state;
    enum { N = 100000, HOLES = 40 };
    corax_section s = corax_section_make(0, 0, corax_rad(90), 50);
    corax_section_drawing *d = corax_section_drawing_new(&s, 5);
    assert_non_null(d);
    for (int h = 0; h < HOLES; h++) {
        char name[16];
        snprintf(name, sizeof name, "C%02d", h);
        corax_section_sample t[2] = {{0, {h * 0.5, 0, 500}, 1}, {300, {h * 0.5, 0, 200}, 1}};
        assert_int_equal(corax_section_drawing_hole(d, name, t, 2), CORAX_OK);
    }
    corax_section_dip dip = corax_section_plane(&s, (corax_plane){corax_rad(40), 0});
    for (int i = 0; i < N; i++) {
        corax_section_point at = {(i % 200) * 0.1, 0, 480 - (i % 997) * 0.25};
        assert_int_equal(corax_section_drawing_structure(d, at, &dip, 1 + i % 2,
                                                         i % 2 ? "vein" : "bedding", "a reading"),
                         CORAX_OK);
    }
    corax_svg *svg = corax_section_drawing_render(d, "Big", NULL);
    size_t len;
    const char *doc = corax_svg_finish(svg, &len);
    size_t ticks = count(doc, "class=\"tick c");
    size_t drawn = ticks - 2; /* the legend's two */
    assert_true(drawn > 19000 && drawn <= 20000);
    char want[80];
    snprintf(want, sizeof want, ">%zu of %d drawn (a sample)</text>", drawn, N);
    assert_non_null(strstr(doc, want));
    assert_non_null(strstr(doc, ">bedding (50000)</text>"));
    assert_true(len < 5000000);
    /* names stack at most a few rows above the holes; none above the top */
    size_t names = count(doc, "class=\"hole-name\"");
    assert_true(names >= 1 && names <= 5);
    corax_svg_free(svg);
    corax_section_drawing_free(d);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_svg_document),
        cmocka_unit_test(test_section_tick_at_the_apparent_dip),
        cmocka_unit_test(test_section_without_structures),
        cmocka_unit_test(test_section_big_slab_sampled),
    };
    return cmocka_run_group_tests_name("draw", tests, NULL, NULL);
}
