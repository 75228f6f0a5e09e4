/* Tests of the draw module's SVG writer: valid markup, escaping, numbers. */
#include <string.h>

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
    assert_non_null(strstr(doc, "text-anchor=\"middle\""));
    assert_string_equal(doc + n - 7, "</svg>\n");
    /* finishing twice closes once */
    size_t n2;
    corax_svg_finish(s, &n2);
    assert_int_equal(n, n2);
    corax_svg_free(s);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_svg_document),
    };
    return cmocka_run_group_tests_name("draw", tests, NULL, NULL);
}
