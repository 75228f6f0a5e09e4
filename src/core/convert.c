/* core: one core reading at a depth down a hole to a located orientation,
 * with the conditions that limit how far it can be trusted. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include "common/format.h"
#include "corax/convert.h"

static const char *const status_word[CORAX_COND_COUNT] = {
    "invalid",    "unknown-hole", "no-survey",    "no-reference-line", "unoriented",
    "dip-only",   "oriented-by-reference",        "beyond-end",        "collar-only",
    "extrapolated", "near-parallel", "near-perpendicular",
};

corax_convert_options corax_convert_options_default(void)
{
    corax_convert_options o;
    memset(&o, 0, sizeof o);
    o.near_parallel = corax_rad(10.0);
    o.near_perpendicular = corax_rad(80.0);
    o.vertical_limit = corax_rad(5.0);
    return o;
}

corax_reading corax_reading_empty(void)
{
    corax_reading r = {0.0, NAN, NAN, NAN, NAN, NAN, 0, NAN};
    return r;
}

const char *corax_condition_name(unsigned index)
{
    return index < CORAX_COND_COUNT ? status_word[index] : "converted";
}

const char *corax_condition_status(unsigned conditions)
{
    for (unsigned i = 0; i < CORAX_COND_COUNT; i++)
        if (conditions & (1u << i))
            return status_word[i];
    return "converted";
}

static int given(double v) { return !isnan(v); }

/* The first reason a reading's values cannot be used (a printf format with
 * at most one %g) and the value it names, in degrees or metres; NULL when the
 * values can be used. */
static const char *check_values(const corax_reading *rd, double *value)
{
    const struct {
        double v;
        double max;       /* 90 (closed) or 360 (half-open) */
        const char *why;
    } angle[] = {
        {rd->alpha, 90, "alpha %g is outside [0, 90]"},
        {rd->beta, 360, "beta %g is outside [0, 360)"},
        {rd->gamma, 360, "gamma %g is outside [0, 360)"},
        {rd->line_alpha, 90, "line_alpha %g is outside [0, 90]"},
        {rd->line_beta, 360, "line_beta %g is outside [0, 360)"},
    };
    *value = NAN;
    if (isnan(rd->depth))
        return "depth is empty"; /* absent, as a table's empty field */
    if (!(rd->depth >= 0.0)) {
        *value = rd->depth;
        return "depth %g is negative";
    }
    for (int i = 0; i < 5; i++) {
        if (!given(angle[i].v))
            continue;
        double deg = corax_deg(angle[i].v);
        if (!(deg >= 0.0 && (angle[i].max == 90 ? deg <= 90.0 : deg < 360.0))) {
            *value = deg;
            return angle[i].why;
        }
    }
    if (given(rd->beta) && !given(rd->alpha))
        return "beta is given without alpha";
    if (given(rd->gamma) && !given(rd->alpha))
        return "gamma is given without a plane (no alpha)";
    if (given(rd->line_beta) && !given(rd->line_alpha))
        return "line_beta is given without line_alpha";
    if (given(rd->gamma) && given(rd->line_alpha))
        return "a line is given twice (gamma and line_alpha)";
    if (!given(rd->alpha) && !given(rd->line_alpha))
        return "there is no alpha (nor line_alpha)";
    return NULL;
}

static unsigned where_condition(corax_where w)
{
    switch (w) {
    case CORAX_WHERE_SURVEYED: return 0;
    case CORAX_WHERE_EXTRAPOLATED: return CORAX_COND_EXTRAPOLATED;
    case CORAX_WHERE_COLLAR_ONLY: return CORAX_COND_COLLAR_ONLY;
    case CORAX_WHERE_BEYOND_END: return CORAX_COND_BEYOND_END;
    }
    return 0;
}

static void set_line(corax_result *out, corax_vec3 l)
{
    out->has_line = 1;
    if (l.z > 0.0)
        l = (corax_vec3){-l.x, -l.y, -l.z};
    out->line = l;
    corax_line_trend_plunge(l, &out->trend, &out->plunge);
}

void corax_convert_locate(const corax_hole *hole, double depth, size_t *hint, corax_result *out)
{
    memset(out, 0, sizeof *out);
    if (!hole) {
        out->conditions |= CORAX_COND_UNKNOWN_HOLE;
        return;
    }
    if (!(depth >= 0.0))
        return;
    if (corax_hole_at(hole, depth, hint, &out->point) == CORAX_ENOTFOUND) {
        out->conditions |= CORAX_COND_NO_SURVEY;
        return;
    }
    out->located = 1;
    out->conditions |= where_condition(out->point.where);
}

void corax_convert_reading(const corax_hole *hole, const corax_reading *rd,
                           const corax_convert_options *o, size_t *hint, corax_result *out)
{
    corax_convert_locate(hole, rd->depth, hint, out);
    out->invalid = check_values(rd, &out->invalid_value);
    if (out->invalid)
        out->conditions |= CORAX_COND_INVALID;
    if (out->invalid || !out->located)
        return;
    corax_vec3 t = out->point.tangent;
    int plane = given(rd->alpha);
    int circle = plane && rd->alpha == 0.5 * CORAX_PI; /* beta carries nothing */
    if (plane && rd->alpha < o->near_parallel)
        out->conditions |= CORAX_COND_NEAR_PARALLEL;
    if (plane && rd->alpha > o->near_perpendicular)
        out->conditions |= CORAX_COND_NEAR_PERPENDICULAR;
    if (circle) { /* the plane is the core's cross-section, with or without beta */
        out->has_plane = 1;
        out->plane = corax_plane_from_normal(t, &out->normal);
    }
    corax_core_frame f;
    int no_line = corax_core_off_vertical(t) < o->vertical_limit ||
                  corax_core_frame_of(t, &f) != CORAX_OK;
    if (plane && !circle && no_line) { /* the core axis near vertical: 90 - alpha */
        out->conditions |= CORAX_COND_DIP_ONLY;
        out->plane.dip = 0.5 * CORAX_PI - rd->alpha;
        out->plane.dip_direction = NAN;
        return;
    }
    int oriented = plane ? given(rd->beta) : (given(rd->line_beta) || rd->line_alpha == 0.0);
    if (oriented && rd->arbitrary_line && !given(rd->turn))
        oriented = circle && !given(rd->gamma); /* a circle needs no line at all */
    if (!oriented) {
        if (!circle || given(rd->gamma))
            out->conditions |= CORAX_COND_UNORIENTED;
        return;
    }
    if (no_line) {
        if (!circle || given(rd->gamma)) /* a circle needs no bottom line; its line does */
            out->conditions |= CORAX_COND_NO_REFERENCE;
        return;
    }
    const corax_core_conventions *c = &o->conventions;
    double beta = rd->beta, line_beta = given(rd->line_beta) ? rd->line_beta : 0.0;
    if (rd->arbitrary_line && given(rd->turn)) { /* the line turned onto the reference */
        out->conditions |= CORAX_COND_BY_REFERENCE;
        if (given(beta))
            beta = corax_core_beta_measured(corax_core_beta_canonical(beta, c) + rd->turn, c);
        line_beta = corax_core_line_beta_measured(
            corax_core_line_beta_canonical(line_beta, c) + rd->turn, c);
    }
    if (plane && !circle) {
        corax_vec3 n = corax_core_plane_normal(&f, rd->alpha, beta, c);
        out->has_plane = 1;
        out->plane = corax_plane_from_normal(n, &out->normal);
    }
    if (plane && given(rd->gamma))
        set_line(out, corax_core_line_on_plane(&f, rd->alpha, beta, rd->gamma, c));
    else if (!plane)
        set_line(out, corax_core_line(&f, rd->line_alpha, line_beta, c));
}

size_t corax_result_note(const corax_result *r, const corax_reading *rd, const corax_hole *hole,
                         const corax_convert_options *o, char *buf, size_t size)
{
    size_t used = 0;
    unsigned c = r->conditions;
    double alpha = corax_deg(rd->alpha);
    if (!size)
        return 0;
    buf[0] = '\0';
    if ((c & CORAX_COND_INVALID) && r->invalid)
        corax_note_add(buf, size, &used, r->invalid, r->invalid_value);
    if (c & CORAX_COND_UNKNOWN_HOLE)
        corax_note_add(buf, size, &used, "the hole is not in the collar table");
    if (c & CORAX_COND_NO_SURVEY)
        corax_note_add(buf, size, &used, "the hole has no survey and no collar direction");
    if (c & CORAX_COND_NO_REFERENCE)
        corax_note_add(buf, size, &used,
            "the hole is within %.3g degrees of vertical: no bottom-of-hole line to measure "
            "beta from",
            corax_deg(o->vertical_limit));
    if ((c & CORAX_COND_UNORIENTED) && rd->arbitrary_line)
        corax_note_add(buf, size, &used, "beta runs from an arbitrary line (a run without an orientation "
            "mark): alpha alone does not orient it");
    else if (c & CORAX_COND_UNORIENTED)
        corax_note_add(buf, size, &used, "no beta: alpha alone does not orient it");
    if ((c & CORAX_COND_DIP_ONLY) && r->located)
        corax_note_add(buf, size, &used,
            "the hole is %.1f degrees from vertical, within the vertical limit of %.3g: "
            "alpha gives the dip (90 - alpha, good to those %.1f degrees) but nothing gives "
            "its direction%s",
            corax_deg(corax_core_off_vertical(r->point.tangent)), corax_deg(o->vertical_limit),
            corax_deg(corax_core_off_vertical(r->point.tangent)),
            given(rd->gamma) ? "; the line on it cannot be oriented" : "");
    if (c & CORAX_COND_BY_REFERENCE)
        corax_note_add(buf, size, &used, "beta from an arbitrary line, turned %.1f degrees to fit a reference",
            corax_deg(corax_wrap_azimuth(rd->turn)));
    if ((c & CORAX_COND_BEYOND_END) && hole)
        corax_note_add(buf, size, &used, "depth %.2f is beyond the hole's length %.2f", rd->depth,
            corax_hole_length(hole));
    if (c & CORAX_COND_COLLAR_ONLY)
        corax_note_add(buf, size, &used,
                       "no downhole survey: the collar's azimuth and dip are used");
    if (c & CORAX_COND_EXTRAPOLATED)
        corax_note_add(buf, size, &used,
                       "below the last survey station: the hole is taken as straight");
    /* the commonest notes, built without printf: a large log gives one to a
     * row in five */
    char a[48], lim[48];
    if (c & (CORAX_COND_NEAR_PARALLEL | CORAX_COND_NEAR_PERPENDICULAR))
        a[corax_format_fixed(a, alpha, 1)] = '\0';
    if (c & CORAX_COND_NEAR_PARALLEL) {
        lim[corax_format_g3(lim, corax_deg(o->near_parallel))] = '\0';
        const char *const piece[] = {"alpha ", a, " is below ", lim,
                                     ": an error in beta swings this plane almost fully, and "
                                     "the hole under-samples such planes"};
        corax_note_pieces(buf, size, &used, piece, 5);
    }
    if (c & CORAX_COND_NEAR_PERPENDICULAR) {
        lim[corax_format_g3(lim, corax_deg(o->near_perpendicular))] = '\0';
        const char *const piece[] = {"alpha ", a, " is above ", lim, ": beta is barely defined"};
        corax_note_pieces(buf, size, &used, piece, 5);
    }
    return used;
}
