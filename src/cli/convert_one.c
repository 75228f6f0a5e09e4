/* cli: `corax convert` for one reading at the core shed: a labelled answer
 * on standard output, or the alpha and beta a plane or line would show. */
#include <math.h>
#include <stdio.h>

#include "cli/cli.h"

static void print_conventions(const corax_core_conventions *c)
{
    printf("conventions  %s-of-hole line; beta %s looking down the hole, to the %s end;\n"
           "             gamma from the %s end, %s seen from up-hole\n",
           c->top_reference ? "top" : "bottom",
           c->beta_anticlockwise ? "anticlockwise" : "clockwise",
           c->beta_to_uphole_end ? "up-hole" : "down-hole",
           c->gamma_from_uphole ? "up-hole" : "down-hole",
           c->gamma_anticlockwise ? "anticlockwise" : "clockwise");
}

/* The alpha and beta a plane would show, with the status of the answer: a
 * plane along the hole has no beta, and one square to it any beta. */
static void print_inverse(corax_plan_status st, double alpha, double beta,
                          const corax_convert_options *o)
{
    printf("would show   alpha %.2f, beta ", corax_deg(alpha));
    if (st == CORAX_PLAN_PARALLEL)
        printf("undefined (the plane runs along the hole, which never crosses it: the "
               "ellipse has no down-hole end)\n");
    else if (isnan(beta))
        printf("any (the ellipse is a circle)\n");
    else
        printf("%.2f\n", corax_wrap_degrees(corax_deg(beta), 2));
    printf("status       %s\n", corax_plan_status_name(st));
    if (st == CORAX_PLAN_NEAR_PARALLEL)
        printf("note         alpha %.2f is below %.3g: a small error in beta swings the plane "
               "widely, and a hole this way under-samples such planes\n",
               corax_deg(alpha), corax_deg(o->near_parallel));
    else if (st == CORAX_PLAN_NEAR_PERPENDICULAR && !isnan(beta))
        printf("note         alpha %.2f is above %.3g: beta is barely defined\n",
               corax_deg(alpha), corax_deg(o->near_perpendicular));
}

int convert_one_reading(const cli_common *cc, const corax_convert_options *o, double hole_azimuth,
                        double hole_dip, double alpha, double beta, double gamma,
                        const double plane[2], const double line[2])
{
    double plunge;
    corax_dip_convention dipc = cli_table_dip(cc, CLI_SURVEYS);
    if (corax_dip_to_plunge(hole_dip, dipc, &plunge) != CORAX_OK)
        return cli_usage("convert", "--hole-dip %g is outside the range of %s", hole_dip,
                         corax_dip_convention_name(dipc));
    corax_vec3 t = corax_direction(corax_rad(hole_azimuth), plunge);
    printf("hole         azimuth %.2f, dip %.2f (%s)\n", corax_wrap_degrees(hole_azimuth, 2),
           hole_dip, corax_dip_convention_name(dipc));
    print_conventions(&o->conventions);
    corax_core_frame f;
    int framed = corax_core_off_vertical(t) >= o->vertical_limit &&
                 corax_core_frame_of(t, &f) == CORAX_OK;
    if (!isnan(plane[0]) || !isnan(line[0])) { /* the inverse: what the core would show */
        if (!framed) {
            printf("answer       none: the hole is within %g degrees of vertical, so there is no "
                   "bottom-of-hole line to measure beta from\n",
                   corax_deg(o->vertical_limit));
            return EXIT_DATA;
        }
        double a, b;
        if (!isnan(plane[0])) {
            corax_plane p = {corax_rad(plane[0]), corax_rad(plane[1])};
            corax_plan_status st = corax_plan_angles(t, corax_plane_normal(p), o, &a, &b);
            printf("plane        dip %.2f, dip direction %.2f\n", plane[0],
                   corax_wrap_degrees(plane[1], 2));
            print_inverse(st, a, b, o);
        } else {
            corax_vec3 l = corax_direction(corax_rad(line[0]), corax_rad(line[1]));
            corax_core_line_angles(&f, l, &o->conventions, &a, &b);
            printf("line         trend %.2f, plunge %.2f\n", corax_wrap_degrees(line[0], 2), line[1]);
            if (isnan(b))
                printf("would show   line_alpha %.2f, line_beta undefined (the line runs along "
                       "the core axis)\n", corax_deg(a));
            else
                printf("would show   line_alpha %.2f, line_beta %.2f\n", corax_deg(a),
                       corax_wrap_degrees(corax_deg(b), 2));
        }
        return EXIT_OK;
    }
    /* a straight hole through the reading gives the library its hole */
    corax_collar collar = {{0, 0, 0}, corax_rad(hole_azimuth), plunge, 1, NAN};
    corax_hole *h;
    if (corax_hole_new("reading", &collar, NULL, 0, 0, &h, NULL) != CORAX_OK)
        return EXIT_DATA;
    corax_reading rd = corax_reading_empty();
    rd.alpha = corax_rad(alpha);
    rd.beta = isnan(beta) ? beta : corax_rad(beta);
    rd.gamma = isnan(gamma) ? gamma : corax_rad(gamma);
    corax_result res;
    corax_convert_reading(h, &rd, o, NULL, &res);
    res.conditions &= ~(unsigned)CORAX_COND_COLLAR_ONLY; /* the hole is given, not surveyed */
    printf("reading      alpha %.2f, beta %s", alpha, isnan(beta) ? "none" : "");
    if (!isnan(beta))
        printf("%.2f", beta);
    if (!isnan(gamma))
        printf(", gamma %.2f", gamma);
    printf("\n");
    if (res.has_plane) {
        double dd = corax_deg(res.plane.dip_direction), dip = corax_deg(res.plane.dip);
        printf("plane        dip %.2f, dip direction %.2f\n", dip, corax_wrap_degrees(dd, 2));
        printf("strike       %.2f (dip to the right)\n", corax_wrap_degrees(dd - 90, 2));
        printf("pole         trend %.2f, plunge %.2f\n", corax_wrap_degrees(dd + 180, 2), 90 - dip);
    }
    if (res.conditions & CORAX_COND_DIP_ONLY)
        printf("plane        dip %.2f, dip direction unknown\n", corax_deg(res.plane.dip));
    if (res.has_line)
        printf("line         trend %.2f, plunge %.2f\n",
               corax_wrap_degrees(corax_deg(res.trend), 2), corax_deg(res.plunge));
    printf("status       %s\n", corax_condition_status(res.conditions));
    char note[600];
    if (corax_result_note(&res, &rd, h, o, note, sizeof note))
        printf("note         %s\n", note);
    corax_hole_free(h);
    return res.has_plane || res.has_line || (res.conditions & CORAX_COND_DIP_ONLY) ? EXIT_OK
                                                                                   : EXIT_DATA;
}
