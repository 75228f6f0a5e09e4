/* Tests of the sweep's score picture: it holds a cell for every downward
 * direction, shaded by its band, the sets and the best direction marked, the
 * program's line and the caution. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/plan_drawing.h"
#include "support/check.h"

static size_t count(const char *text, const char *what)
{
    size_t n = 0;
    for (const char *p = text; (p = strstr(p, what)); p += strlen(what))
        n++;
    return n;
}

typedef struct fixture {
    corax_plan_model *model;
    corax_plan_direction *dirs;
    size_t n;
    corax_plan_hole holes[2];
    corax_plan_program_set program[2];
} fixture;

static void setup(fixture *f, double az_step, double pl_from)
{
    corax_plan_set sets[2] = {{"bedding", {corax_rad(55), corax_rad(298)}, 25, 1, 2},
                              {"foliation", {corax_rad(75), corax_rad(306)}, INFINITY, 2, 3}};
    corax_convert_options o = corax_convert_options_default();
    assert_int_equal(corax_plan_model_new(sets, 2, &o, &f->model), CORAX_OK);
    corax_plan_range az = {0, 2 * CORAX_PI, corax_rad(az_step)};
    corax_plan_range pl = {corax_rad(pl_from), corax_rad(90), corax_rad(10)};
    corax_error err;
    assert_int_equal(corax_plan_directions(az, pl, &f->dirs, &f->n, &err), CORAX_OK);
    f->holes[0] = (corax_plan_hole){"QP01", {0, 0, 0}, corax_rad(135), corax_rad(60), 300, 0, 0, 2};
    f->holes[1] = (corax_plan_hole){"QP02", {50, 0, 0}, corax_rad(120), corax_rad(-20), 100, 0, 0, 3};
    assert_int_equal(corax_plan_sweep(f->model, f->holes, 2, NULL, 0, f->dirs, f->n, &err),
                     CORAX_OK);
    memset(f->program, 0, sizeof f->program);
    f->program[1].badly_sampled = 1;
}

static void teardown(fixture *f)
{
    free(f->dirs);
    corax_plan_model_free(f->model);
}

static void test_picture_holds_the_sweep(void **state)
{
    (void)state;
    fixture f;
    setup(&f, 10, -20); /* plunges -20 .. 90: two rows of up-holes left off the net */
    corax_plan_picture p = {f.model, f.dirs, f.n, corax_rad(10), corax_rad(10), f.holes, 2,
                            f.program, 0, CORAX_DIP_NEGATIVE_DOWN, "Test plan"};
    corax_svg *svg;
    assert_int_equal(corax_plan_picture_draw(&p, &svg), CORAX_OK);
    const char *text = corax_svg_finish(svg, NULL);
    size_t down = 0;
    for (size_t k = 0; k < f.n; k++)
        down += f.dirs[k].plunge >= 0;
    assert_int_equal(f.n - down, 2 * 36);
    /* every downward direction a cell; plus one swatch per band in the key */
    assert_int_equal(count(text, "class=\"cell s"), down + 8);
    assert_non_null(strstr(text, "Test plan"));
    assert_int_equal(count(text, "class=\"best\""), 1);
    assert_int_equal(count(text, "class=\"setplane"), 2);
    assert_int_equal(count(text, "class=\"cone"), 1); /* only bedding has a spread */
    assert_non_null(strstr(text, ">QP01<"));
    assert_null(strstr(text, ">QP02<")); /* an up-hole: listed, not on the net */
    assert_non_null(strstr(text, "QP02: azimuth 120.0°, dip 20.0° (up: not on the net)"));
    assert_non_null(strstr(text, "72 up-hole directions in the table only"));
    assert_non_null(strstr(text, "Every planned hole is near-parallel to:"));
    assert_non_null(strstr(text, ">foliation<"));
    assert_non_null(strstr(text, "check it against site conditions"));
    /* the best direction's line names the sweep's best */
    char best[96];
    snprintf(best, sizeof best, "azimuth %05.1f°, dip %.1f°: score %.3f",
             corax_wrap_degrees(corax_deg(f.dirs[0].azimuth), 1), -corax_deg(f.dirs[0].plunge),
             f.dirs[0].score);
    assert_non_null(strstr(text, best));
    corax_svg_free(svg);
    teardown(&f);
}

static void test_picture_bad_arguments(void **state)
{
    (void)state;
    fixture f;
    setup(&f, 30, 0);
    corax_plan_picture p = {f.model, f.dirs, f.n, 0, corax_rad(10), f.holes, 2, NULL, 0,
                            CORAX_DIP_NEGATIVE_DOWN, NULL};
    corax_svg *svg = NULL;
    assert_int_equal(corax_plan_picture_draw(&p, &svg), CORAX_EARG);
    assert_null(svg);
    p.azimuth_step = corax_rad(30);
    p.ndirections = 0;
    assert_int_equal(corax_plan_picture_draw(&p, &svg), CORAX_EARG);
    p.ndirections = f.n;
    assert_int_equal(corax_plan_picture_draw(&p, &svg), CORAX_OK);
    assert_non_null(strstr(corax_svg_finish(svg, NULL), "Drill direction score"));
    corax_svg_free(svg);
    teardown(&f);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_picture_holds_the_sweep),
        cmocka_unit_test(test_picture_bad_arguments),
    };
    return cmocka_run_group_tests_name("draw_plan", tests, NULL, NULL);
}
