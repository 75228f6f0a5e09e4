/* Tests of the stereonet drawing: the palette stays legible to colour-blind
 * readers, and a page holds what a net must show. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/stereonet.h"
#include "draw/palette.h"
#include "support/check.h"

/* sRGB to linear light (IEC 61966-2-1, published standard). */
static double linear(int c)
{
    double v = c / 255.0;
    return v <= 0.04045 ? v / 12.92 : pow((v + 0.055) / 1.055, 2.4);
}

static double lab_f(double t)
{
    return t > 216.0 / 24389.0 ? cbrt(t) : (24389.0 / 27.0 * t + 16.0) / 116.0;
}

/* CIE 1976 L*a*b* of linear RGB (D65 white; published standard). */
static void to_lab(const double rgb[3], double lab[3])
{
    double x = 0.4124 * rgb[0] + 0.3576 * rgb[1] + 0.1805 * rgb[2];
    double y = 0.2126 * rgb[0] + 0.7152 * rgb[1] + 0.0722 * rgb[2];
    double z = 0.0193 * rgb[0] + 0.1192 * rgb[1] + 0.9505 * rgb[2];
    double fx = lab_f(x / 0.95047), fy = lab_f(y), fz = lab_f(z / 1.08883);
    lab[0] = 116 * fy - 16;
    lab[1] = 500 * (fx - fy);
    lab[2] = 200 * (fy - fz);
}

/* Dichromat simulation in linear RGB: Vienot, Brettel & Mollon (1999),
 * "Digital video colourmaps for checking the legibility of displays by
 * dichromats" (matrices from memory). */
static const double normal[3][3] = {{1, 0, 0}, {0, 1, 0}, {0, 0, 1}};
static const double protan[3][3] = {
    {0.11238, 0.88762, 0}, {0.11238, 0.88762, 0}, {0.00401, -0.00401, 1}};
static const double deutan[3][3] = {
    {0.29275, 0.70725, 0}, {0.29275, 0.70725, 0}, {-0.02234, 0.02234, 1}};

static void seen(const char *hex, const double m[3][3], double lab[3])
{
    unsigned r, g, b;
    assert_int_equal(sscanf(hex, "#%2x%2x%2x", &r, &g, &b), 3);
    double lin[3] = {linear((int)r), linear((int)g), linear((int)b)}, out[3];
    for (int i = 0; i < 3; i++)
        out[i] = fmin(1, fmax(0, m[i][0] * lin[0] + m[i][1] * lin[1] + m[i][2] * lin[2]));
    to_lab(out, lab);
}

/* Every pair of set colours differs by at least 20 CIE76 units for normal
 * vision and under simulated protanopia and deuteranopia (common practice:
 * about 10 is a clear difference for small marks). */
static void test_palette_legible_to_dichromats(void **state)
{
    (void)state;
    const double (*views[3])[3] = {normal, protan, deutan};
    for (int v = 0; v < 3; v++)
        for (int i = 0; i < CORAX_PALETTE_SIZE; i++)
            for (int j = i + 1; j < CORAX_PALETTE_SIZE; j++) {
                double a[3], b[3];
                seen(corax_palette[i], views[v], a);
                seen(corax_palette[j], views[v], b);
                double de = sqrt((a[0] - b[0]) * (a[0] - b[0]) + (a[1] - b[1]) * (a[1] - b[1]) +
                                 (a[2] - b[2]) * (a[2] - b[2]));
                if (de < 20)
                    fail_msg("colours %s and %s differ by %.1f for view %d (Vienot et al. 1999)",
                             corax_palette[i], corax_palette[j], de, v);
            }
    /* density bands get darker step by step (lightness alone carries them) */
    for (int k = 1; k < CORAX_BANDS; k++) {
        double a[3], b[3];
        seen(corax_band_fill[k - 1], normal, a);
        seen(corax_band_fill[k], normal, b);
        assert_true(b[0] < a[0] - 4);
    }
    /* colour and shape together tell the first 64 sets apart */
    for (size_t i = 0; i < 64; i++)
        for (size_t j = i + 1; j < 64; j++)
            assert_false(corax_palette_colour_of(i) == corax_palette_colour_of(j) &&
                         corax_palette_shape_of(i) == corax_palette_shape_of(j));
}

static size_t count(const char *doc, const char *what)
{
    size_t n = 0;
    for (const char *p = doc; (p = strstr(p, what)); p++)
        n++;
    return n;
}

static corax_vec3 pole_of(double dip_deg, double dd_deg)
{
    return corax_plane_normal((corax_plane){corax_rad(dip_deg), corax_rad(dd_deg)});
}

/* A net of one set: primitive, 36 ticks (every 10 degrees), north mark,
 * density bands clipped to the primitive, the count, mean, cone and axes. */
static void test_page_of_one_set(void **state)
{
    (void)state;
    enum { N = 60 };
    corax_vec3 poles[N];
    uint64_t seed = 4;
    for (int i = 0; i < N; i++)
        poles[i] = corax_fisher_draw(pole_of(40, 120), 30, test_uniform(&seed), test_uniform(&seed));
    corax_axial_summary s;
    assert_int_equal(corax_axial_summary_compute(poles, NULL, N, &s), CORAX_OK);
    corax_net_set set = {.name = "bedding & <co>", .poles = poles, .npoles = N,
                         .pole_summary = &s, .skipped = 2};
    corax_net_style style = corax_net_style_default();
    style.title = "Test net";
    corax_svg *svg;
    assert_int_equal(corax_stereonet_page(&set, 1, &style, 0, &svg), CORAX_OK);
    size_t len;
    const char *doc = corax_svg_finish(svg, &len);
    assert_non_null(doc);
    assert_int_equal(count(doc, "class=\"tick\""), 36 + 2); /* and the centre cross */
    assert_int_equal(count(doc, "class=\"primitive\""), 1);
    assert_int_equal(count(doc, "class=\"north\""), 1);
    assert_non_null(strstr(doc, ">N</text>"));
    assert_non_null(strstr(doc, "bedding &amp; &lt;co&gt;")); /* escaped */
    assert_non_null(strstr(doc, ">60 poles, 0 lines</text>"));
    assert_non_null(strstr(doc, "2 rows skipped"));
    assert_non_null(strstr(doc, "clip-path=\"url(#corax-net-0)\""));
    assert_true(count(doc, "class=\"band b") >= 2 + 2); /* at least two levels, and legend */
    assert_int_equal(count(doc, "class=\"meanplane k0\""), 1);
    assert_int_equal(count(doc, "class=\"cone k0\""), 1);
    assert_int_equal(count(doc, "class=\"axisbox\""), 3);
    assert_int_equal(count(doc, "class=\"pt f0\""), N + 2); /* poles, legend, mean dot */
    assert_non_null(strstr(doc, ">ring: mean; closed curve: 95% cone</text>"));
    assert_non_null(strstr(doc, ">boxed 1, 2, 3: principal axes</text>"));
    corax_svg_free(svg);
    /* without a summary, no mean, cone or axes is drawn, and the key says none */
    set.pole_summary = NULL;
    assert_int_equal(corax_stereonet_page(&set, 1, &style, 0, &svg), CORAX_OK);
    doc = corax_svg_finish(svg, NULL);
    assert_int_equal(count(doc, "class=\"meanring"), 0);
    assert_null(strstr(doc, "ring: mean"));
    assert_null(strstr(doc, "the mean plane"));
    assert_null(strstr(doc, "principal axes"));
    assert_non_null(strstr(doc, ">filled: poles of planes</text>"));
    corax_svg_free(svg);
}

/* Sets on one net each get their own colour class; one net per set gives as
 * many nets, each with its own clip path; an empty set says so. */
static void test_groups_and_empty_sets(void **state)
{
    (void)state;
    corax_vec3 a[3] = {pole_of(10, 0), pole_of(12, 5), pole_of(11, 355)};
    corax_vec3 l[1] = {corax_direction(corax_rad(200), corax_rad(30))};
    corax_axial_summary sa, sl, none;
    corax_axial_summary_compute(a, NULL, 3, &sa);
    corax_axial_summary_compute(l, NULL, 1, &sl);
    corax_axial_summary_compute(NULL, NULL, 0, &none);
    corax_net_set sets[3] = {
        {.name = "first", .poles = a, .npoles = 3, .pole_summary = &sa},
        {.name = "second", .lines = l, .nlines = 1, .pole_summary = &none, .line_summary = &sl},
        {.name = "third", .pole_summary = &none, .line_summary = &none, .skipped = 4}};
    corax_net_style style = corax_net_style_default();
    corax_svg *svg;
    assert_int_equal(corax_stereonet_page(sets, 3, &style, 0, &svg), CORAX_OK);
    const char *doc = corax_svg_finish(svg, NULL);
    assert_non_null(strstr(doc, "class=\"hollow k1\"")); /* the line of set 2 */
    assert_int_equal(count(doc, "class=\"primitive\""), 1);
    assert_int_equal(count(doc, "class=\"axisbox\""), 0); /* axes only on a net of one set */
    corax_svg_free(svg);
    assert_int_equal(corax_stereonet_page(sets, 3, &style, 1, &svg), CORAX_OK);
    doc = corax_svg_finish(svg, NULL);
    assert_int_equal(count(doc, "class=\"primitive\""), 3);
    assert_int_equal(count(doc, "<clipPath"), 1); /* only the set of three is contoured */
    assert_non_null(strstr(doc, "<clipPath id=\"corax-net-0\">"));
    assert_int_equal(count(doc, ">no readings</text>"), 1);
    assert_non_null(strstr(doc, "too few for kappa and cone"));
    corax_svg_free(svg);
    /* several pages in one document keep their ids apart */
    style.id_prefix = "hole-7_net";
    assert_int_equal(corax_stereonet_page(sets, 3, &style, 1, &svg), CORAX_OK);
    doc = corax_svg_finish(svg, NULL);
    assert_non_null(strstr(doc, "<clipPath id=\"hole-7_net-0\">"));
    assert_non_null(strstr(doc, "clip-path=\"url(#hole-7_net-0)\""));
    assert_null(strstr(doc, "corax-net"));
    corax_svg_free(svg);
    style.id_prefix = "a\"><script>";
    assert_int_equal(corax_stereonet_page(sets, 3, &style, 1, &svg), CORAX_EARG);
    assert_null(svg);
    style.id_prefix = "7net";
    assert_int_equal(corax_stereonet_page(sets, 3, &style, 1, &svg), CORAX_EARG);
    style.id_prefix = NULL;
    corax_net_set empty = {.name = "nothing"};
    assert_int_equal(corax_stereonet_page(&empty, 1, &style, 0, &svg), CORAX_OK);
    assert_non_null(strstr(corax_svg_finish(svg, NULL), ">no readings</text>"));
    corax_svg_free(svg);
    assert_int_equal(corax_stereonet_page(&empty, 0, &style, 0, &svg), CORAX_EARG);
    style.contour_step = 0;
    assert_int_equal(corax_stereonet_page(&empty, 1, &style, 0, &svg), CORAX_EARG);
}

/* The centre and radius of the primitive on a page. */
static void primitive_of(const char *doc, double *cx, double *cy, double *r)
{
    const char *prim = strstr(doc, "class=\"primitive\"");
    assert_non_null(prim);
    while (*prim != '<')
        prim--;
    assert_int_equal(sscanf(prim, "<circle cx=\"%lf\" cy=\"%lf\" r=\"%lf\"", cx, cy, r), 3);
}

/* The distances from (cx, cy) of the points of the path whose d="..."
 * starts at d: the nearest and farthest; returns the number of points. */
static int path_reach(const char *d, double cx, double cy, double *lo, double *hi)
{
    double x, y;
    int n, points = 0;
    *lo = 1e9;
    *hi = 0;
    while (sscanf(d, "%*[ML]%lf,%lf%n", &x, &y, &n) == 2) {
        *lo = fmin(*lo, hypot(x - cx, y - cy));
        *hi = fmax(*hi, hypot(x - cx, y - cy));
        d += n;
        while (*d == ' ')
            d++;
        points++;
    }
    return points;
}

/* Great circles stay inside the primitive: a horizontal plane's circle is
 * the primitive itself, a vertical plane's a diameter. */
static void test_great_circles_inside_primitive(void **state)
{
    (void)state;
    corax_vec3 p[2] = {pole_of(0, 0), pole_of(90, 90)};
    corax_net_set set = {.name = "two", .poles = p, .npoles = 2};
    corax_net_style style = corax_net_style_default();
    style.planes = CORAX_NET_GREAT_CIRCLES;
    style.contours = 0;
    corax_svg *svg;
    assert_int_equal(corax_stereonet_page(&set, 1, &style, 0, &svg), CORAX_OK);
    const char *doc = corax_svg_finish(svg, NULL);
    double cx, cy, r;
    primitive_of(doc, &cx, &cy, &r);
    size_t circles = 0;
    for (const char *g = doc; (g = strstr(g, "class=\"gc k0\" d=\"")); g++, circles++) {
        double lo, hi;
        path_reach(strchr(g, 'd') + 3, cx, cy, &lo, &hi);
        assert_true(hi <= r + 0.01);
        if (circles == 0)
            assert_close(lo, r, 0, 0.01, "a horizontal plane's great circle is the primitive");
        else
            assert_close(lo, 0, 0, 0.01, "a vertical plane's great circle passes the centre");
    }
    assert_int_equal(circles, 2);
    corax_svg_free(svg);
}

/* An alpha-only reading in a vertical hole: its pole lies 90 - alpha from
 * the vertical, on the small circle of plunge alpha, which the equal-area
 * net draws at radius sqrt(2) sin((90 - alpha) / 2) (docs/check-values.md,
 * projections): alpha 30 at 0.7071 of the primitive. A solved pole is drawn
 * with its label and its cone. */
static void test_small_circles_and_picks(void **state)
{
    (void)state;
    corax_net_circle c = {{0, 0, -1}, corax_rad(60)};
    corax_net_pick pk[2] = {{pole_of(40, 30), corax_rad(5), "1"}, {pole_of(60, 200), NAN, "2"}};
    corax_net_set set = {.name = "marker", .circles = &c, .ncircles = 1, .picks = pk, .npicks = 2};
    corax_net_style style = corax_net_style_default();
    style.contours = 0;
    corax_svg *svg;
    assert_int_equal(corax_stereonet_page(&set, 1, &style, 0, &svg), CORAX_OK);
    const char *doc = corax_svg_finish(svg, NULL);
    double cx, cy, r, lo, hi;
    primitive_of(doc, &cx, &cy, &r);
    const char *g = strstr(doc, "class=\"sc k0\" d=\"");
    assert_non_null(g);
    assert_true(path_reach(strchr(g, 'd') + 3, cx, cy, &lo, &hi) > 30);
    assert_close(lo / r, sqrt(2.0) * sin(corax_rad(30)), 0, 2e-4,
                 "equal-area radius of the small circle of plunge 30");
    assert_close(hi / r, sqrt(2.0) * sin(corax_rad(30)), 0, 2e-4,
                 "equal-area radius of the small circle of plunge 30");
    assert_int_equal(count(doc, "class=\"pickcone k0\""), 1); /* the second has no cone */
    assert_int_equal(count(doc, " class=\"pick f0\""), 2);
    assert_non_null(strstr(doc, ">1: dip 40.0° toward 030.0°, cone 5.0°</text>"));
    assert_non_null(strstr(doc, ">2: dip 60.0° toward 200.0°</text>"));
    assert_non_null(strstr(doc, ">1 reading by alpha alone</text>"));
    assert_null(strstr(doc, ">no readings</text>"));
    corax_svg_free(svg);
}

/* A big set is drawn as a sample, and the net says so: at most 2,000 poles
 * of a set and 300 great circles, the count drawn of the count read in its
 * legend, while the density and the summary take every reading. The sample
 * does not beat with a period of the table: poles that alternate between two
 * clusters (a sample of every 25th would hold one) come out about half and
 * half. */
static void test_big_sets_drawn_as_a_sample(void **state)
{
    (void)state;
    enum { N = 50000 };
    corax_vec3 *poles = malloc(N * sizeof *poles);
    assert_non_null(poles);
    uint64_t seed = 6;
    for (int i = 0; i < N; i++)
        poles[i] = corax_fisher_draw(i % 2 ? pole_of(50, 180) : pole_of(50, 0), 40,
                                     test_uniform(&seed), test_uniform(&seed));
    corax_axial_summary s;
    assert_int_equal(corax_axial_summary_compute(poles, NULL, N, &s), CORAX_OK);
    corax_net_set set = {.name = "many", .poles = poles, .npoles = N, .pole_summary = &s};
    corax_net_style style = corax_net_style_default();
    corax_svg *svg;
    assert_int_equal(corax_stereonet_page(&set, 1, &style, 0, &svg), CORAX_OK);
    size_t len;
    const char *doc = corax_svg_finish(svg, &len);
    size_t drawn = count(doc, "class=\"pt f0\"") - 2; /* the legend's mark, the mean's dot */
    assert_true(drawn >= 1900 && drawn <= 2000);
    char note[80];
    snprintf(note, sizeof note, ">%zu of %d poles drawn (a sample)</text>", drawn, N);
    assert_non_null(strstr(doc, note));
    assert_non_null(strstr(doc, ">50000 poles, 0 lines</text>"));
    assert_non_null(strstr(doc, "uniform data: 3 σ; n 50000"));
    double cx, cy, r, x, y;
    primitive_of(doc, &cx, &cy, &r);
    size_t north = 0, south = 0;
    for (const char *c = doc; (c = strstr(c, "<circle cx=\"")); c++)
        if (sscanf(c, "<circle cx=\"%lf\" cy=\"%lf\" r=\"3.4\" class=\"pt f0\"", &x, &y) == 2 &&
            hypot(x - cx, y - cy) < r) {
            north += y < cy;
            south += y > cy;
        }
    assert_true(north + south >= drawn - 1);
    assert_close((double)north / (double)(north + south), 0.5, 0, 0.06,
                 "the sample holds both clusters of an alternating table");
    assert_true(len < 1000000);
    corax_svg_free(svg);

    style.planes = CORAX_NET_GREAT_CIRCLES;
    style.contours = 0;
    assert_int_equal(corax_stereonet_page(&set, 1, &style, 0, &svg), CORAX_OK);
    doc = corax_svg_finish(svg, NULL);
    drawn = count(doc, "class=\"gc k0\"");
    assert_true(drawn >= 280 && drawn <= 300);
    snprintf(note, sizeof note, ">%zu of %d great circles drawn (a sample)</text>", drawn, N);
    assert_non_null(strstr(doc, note));
    corax_svg_free(svg);

    set.npoles = 1500; /* below the limit: every pole */
    style = corax_net_style_default();
    assert_int_equal(corax_stereonet_page(&set, 1, &style, 0, &svg), CORAX_OK);
    doc = corax_svg_finish(svg, NULL);
    assert_int_equal(count(doc, "class=\"pt f0\""), 1500 + 2);
    assert_null(strstr(doc, "(a sample)"));
    corax_svg_free(svg);
    free(poles);
}

/* Sets that lie one after another in one array (as the stereonet job keeps
 * them) are contoured where they lie, not copied: the page is the same, byte
 * for byte, as of the same sets each in an array of its own, with weights or
 * without, and of lines when no set has poles; an empty set between them
 * (holding NULL) changes nothing. */
static void test_sets_in_one_array(void **state)
{
    (void)state;
    enum { A = 40, B = 25, N = A + B };
    corax_vec3 one[N], *apart_v[2];
    double one_w[N], *apart_w[2];
    uint64_t seed = 8;
    for (int i = 0; i < N; i++) {
        one[i] = corax_fisher_draw(i < A ? pole_of(30, 60) : pole_of(70, 250), 20,
                                   test_uniform(&seed), test_uniform(&seed));
        one_w[i] = 1.0 + 2.0 * test_uniform(&seed);
    }
    const size_t first[2] = {0, A}, size[2] = {A, B};
    for (int k = 0; k < 2; k++) {
        apart_v[k] = malloc(size[k] * sizeof *apart_v[k]);
        apart_w[k] = malloc(size[k] * sizeof *apart_w[k]);
        assert_true(apart_v[k] && apart_w[k]);
        memcpy(apart_v[k], one + first[k], size[k] * sizeof *apart_v[k]);
        memcpy(apart_w[k], one_w + first[k], size[k] * sizeof *apart_w[k]);
    }
    corax_net_style style = corax_net_style_default();
    for (int form = 0; form < 3; form++) { /* poles, weighted poles, lines */
        corax_net_set joined[3] = {{.name = "a"}, {.name = "empty"}, {.name = "b"}};
        corax_net_set apart[3] = {{.name = "a"}, {.name = "empty"}, {.name = "b"}};
        for (int k = 0; k < 2; k++) {
            corax_net_set *j = &joined[2 * k], *a = &apart[2 * k];
            if (form == 2) {
                j->lines = one + first[k], a->lines = apart_v[k];
                j->nlines = a->nlines = size[k];
            } else {
                j->poles = one + first[k], a->poles = apart_v[k];
                j->npoles = a->npoles = size[k];
            }
            if (form == 1)
                j->pole_weight = one_w + first[k], a->pole_weight = apart_w[k];
        }
        corax_svg *svg_joined, *svg_apart;
        assert_int_equal(corax_stereonet_page(joined, 3, &style, 0, &svg_joined), CORAX_OK);
        assert_int_equal(corax_stereonet_page(apart, 3, &style, 0, &svg_apart), CORAX_OK);
        const char *doc = corax_svg_finish(svg_joined, NULL);
        assert_int_equal(count(doc, "<clipPath"), 1); /* contoured */
        assert_string_equal(doc, corax_svg_finish(svg_apart, NULL));
        corax_svg_free(svg_joined);
        corax_svg_free(svg_apart);
    }
    for (int k = 0; k < 2; k++) {
        free(apart_v[k]);
        free(apart_w[k]);
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_palette_legible_to_dichromats),
        cmocka_unit_test(test_page_of_one_set),
        cmocka_unit_test(test_groups_and_empty_sets),
        cmocka_unit_test(test_great_circles_inside_primitive),
        cmocka_unit_test(test_small_circles_and_picks),
        cmocka_unit_test(test_big_sets_drawn_as_a_sample),
        cmocka_unit_test(test_sets_in_one_array),
    };
    return cmocka_run_group_tests_name("draw_stereonet", tests, NULL, NULL);
}
