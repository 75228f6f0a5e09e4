/* draw: the score picture of a sweep of hole directions. Each direction is a
 * cell of the lower-hemisphere net, as wide as the sweep's steps, shaded by
 * its score; over the cells the sets' mean planes (the directions that never
 * cross them), their spreads and poles, the planned holes and the best
 * direction; beside the net a panel that says what each mark means. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "corax/plan_drawing.h"
#include "corax/stats.h"
#include "draw/net.h"
#include "draw/palette.h"

/* Page geometry, pixels: the net's radius, the side panel's width, the space
 * above the net and to its left. */
enum { RADIUS = 230, SIDE = 400, TOP = 120, MARGIN = 60 };

typedef struct page {
    const corax_plan_picture *p;
    corax_disc disc;
    corax_panel panel;
    size_t best;     /* the best direction's index */
    size_t up_holes; /* directions left off the net */
} page;

static const double QUARTER = 0.5 * CORAX_PI;

static size_t band_of(double score)
{
    double b = floor(score * CORAX_BANDS);
    return b < 0.0 ? 0 : b >= CORAX_BANDS ? CORAX_BANDS - 1 : (size_t)b;
}

static void put(const page *g, double azimuth, double plunge, int move)
{
    double x, y;
    corax_disc_place(&g->disc, corax_direction(azimuth, plunge), &x, &y);
    if (move)
        corax_svg_path_move(g->disc.svg, x, y);
    else
        corax_svg_path_line(g->disc.svg, x, y);
}

/* The cell of a direction: azimuth +- half a step, plunge +- half a step
 * (within the hemisphere); a vertical direction's cell is the cap about the
 * centre. */
static void draw_cell(const page *g, const corax_plan_direction *d)
{
    const corax_plan_picture *p = g->p;
    char cls[40];
    snprintf(cls, sizeof cls, "cell s%zu", band_of(d->score));
    double low = fmax(0.0, d->plunge - 0.5 * p->plunge_step);
    double high = fmin(QUARTER, d->plunge + 0.5 * p->plunge_step);
    if (d->plunge >= QUARTER - 1e-12) {
        double x, y;
        corax_disc_place(&g->disc, corax_direction(0.0, low), &x, &y);
        corax_svg_circle(g->disc.svg, g->disc.cx, g->disc.cy, hypot(x - g->disc.cx, y - g->disc.cy),
                         cls);
        return;
    }
    double width = fmin(2.0 * CORAX_PI, p->azimuth_step), a0 = d->azimuth - 0.5 * width;
    int k = (int)ceil(width / corax_rad(2.0)); /* arcs as chords of 2 degrees at most */
    corax_svg_path_begin(g->disc.svg, cls);
    for (int i = 0; i <= k; i++)
        put(g, a0 + width * i / k, low, i == 0);
    for (int i = k; i >= 0; i--)
        put(g, a0 + width * i / k, high, 0);
    corax_svg_path_end(g->disc.svg, 1);
}

static void draw_sets(const page *g)
{
    const corax_plan_model *m = g->p->model;
    for (size_t i = 0; i < corax_plan_model_sets(m); i++) {
        const corax_plan_set *s = corax_plan_model_set(m, i);
        size_t c = corax_palette_colour_of(i);
        corax_vec3 n = corax_plane_normal(s->plane);
        char cls[32];
        snprintf(cls, sizeof cls, "setplane k%zu", c);
        corax_disc_great_circle(&g->disc, n, cls);
        if (isfinite(s->kappa)) { /* the cone holding 95% of the poles */
            double cone = acos(fmax(-1.0, corax_fisher_cosine(s->kappa, 0.05)));
            snprintf(cls, sizeof cls, "cone k%zu", c);
            if (cone < QUARTER)
                corax_disc_small_circle(&g->disc, n, cone, cls);
        }
        double x, y;
        corax_disc_place(&g->disc, n, &x, &y);
        snprintf(cls, sizeof cls, "pt f%zu", c);
        corax_palette_symbol(g->disc.svg, corax_palette_shape_of(i), x, y, 14, cls);
    }
}

static void draw_holes(const page *g)
{
    corax_svg *svg = g->disc.svg;
    for (size_t h = 0; h < g->p->nholes; h++) {
        const corax_plan_hole *hole = &g->p->holes[h];
        if (hole->plunge < 0.0)
            continue;
        double x, y;
        corax_disc_place(&g->disc, corax_direction(hole->azimuth, hole->plunge), &x, &y);
        corax_svg_line(svg, x - 6, y, x + 6, y, "holehalo");
        corax_svg_line(svg, x, y - 6, x, y + 6, "holehalo");
        corax_svg_line(svg, x - 6, y, x + 6, y, "hole");
        corax_svg_line(svg, x, y - 6, x, y + 6, "hole");
        corax_svg_text(svg, x + 8, y - 6, "holename", "start", hole->name);
    }
}

static void draw_best(const page *g)
{
    const corax_plan_direction *d = &g->p->directions[g->best];
    if (d->plunge < 0.0)
        return;
    double x, y;
    corax_disc_place(&g->disc, corax_direction(d->azimuth, d->plunge), &x, &y);
    corax_svg_circle(g->disc.svg, x, y, 10, "besthalo");
    corax_svg_circle(g->disc.svg, x, y, 10, "best");
}

/* ---- the side panel ---- */

static double dip_of(const page *g, double plunge)
{
    return corax_plunge_to_dip(plunge, g->p->dip_convention);
}

static void score_key(page *g)
{
    corax_panel *pn = &g->panel;
    corax_panel_line(pn, "label", 0, "Score of a hole direction");
    for (size_t b = CORAX_BANDS; b-- > 0;) {
        char cls[40];
        snprintf(cls, sizeof cls, "cell s%zu keybox", b);
        if (pn->svg)
            corax_svg_rect(pn->svg, pn->x, pn->y - 11, 22, 12, cls);
        corax_panel_line(pn, "small", 30, "%.3f to %.3f", (double)b / CORAX_BANDS,
                         (double)(b + 1) / CORAX_BANDS);
    }
    corax_panel_line(pn, "small", 0, "unshaded: outside the sweep");
    pn->y += 6;
}

static void set_entries(page *g)
{
    corax_panel *pn = &g->panel;
    const corax_plan_model *m = g->p->model;
    corax_panel_line(pn, "label", 0, "Sets (pole and mean plane)");
    for (size_t i = 0; i < corax_plan_model_sets(m); i++) {
        const corax_plan_set *s = corax_plan_model_set(m, i);
        char cls[40], spread[48] = "no spread";
        snprintf(cls, sizeof cls, "pt f%zu", corax_palette_colour_of(i));
        if (pn->svg)
            corax_palette_symbol(pn->svg, corax_palette_shape_of(i), pn->x + 6, pn->y - 4, 11,
                                 cls);
        if (isfinite(s->kappa))
            snprintf(spread, sizeof spread, "kappa %.3g", s->kappa);
        corax_panel_line(pn, "small", 18, "%s: dip %.1f° toward %05.1f°", s->name,
                         corax_deg(s->plane.dip), corax_wrap_degrees(corax_deg(s->plane.dip_direction), 1));
        corax_panel_line(pn, "small", 18, "%s, weight %g", spread, s->weight);
    }
    pn->y += 6;
}

static void best_entry(page *g)
{
    corax_panel *pn = &g->panel;
    const corax_plan_direction *d = &g->p->directions[g->best];
    const corax_plan_set *worst = corax_plan_model_set(g->p->model, d->worst_set);
    corax_panel_line(pn, "label", 0, "Best direction (ring)");
    corax_panel_line(pn, "small", 0, "azimuth %05.1f°, dip %.1f°: score %.3f",
                     corax_wrap_degrees(corax_deg(d->azimuth), 1), dip_of(g, d->plunge), d->score);
    corax_panel_line(pn, "small", 0, "worst sampled: %s, expected alpha %.1f°", worst->name,
                     corax_deg(d->worst_alpha));
    if (g->p->ntargets)
        corax_panel_line(pn, "small", 0, "reaches %.0f%% of the target planes", 100.0 * d->reach);
    pn->y += 6;
}

static void hole_entries(page *g)
{
    corax_panel *pn = &g->panel;
    if (!g->p->nholes)
        return;
    corax_panel_line(pn, "label", 0, "Planned holes (crosses)");
    for (size_t h = 0; h < g->p->nholes; h++) {
        const corax_plan_hole *hole = &g->p->holes[h];
        corax_panel_line(pn, "small", 0, "%s: azimuth %05.1f°, dip %.1f°%s", hole->name,
                         corax_wrap_degrees(corax_deg(hole->azimuth), 1), dip_of(g, hole->plunge),
                         hole->plunge < 0.0 ? " (up: not on the net)" : "");
    }
    pn->y += 6;
}

/* The program view's line: which sets every planned hole samples badly. */
static void program_line(page *g)
{
    corax_panel *pn = &g->panel;
    const corax_plan_model *m = g->p->model;
    if (!g->p->program)
        return;
    char names[200] = "";
    size_t used = 0, bad = 0;
    for (size_t i = 0; i < corax_plan_model_sets(m) && used < sizeof names; i++)
        if (g->p->program[i].badly_sampled)
            used += (size_t)snprintf(names + used, sizeof names - used, "%s%s", bad++ ? ", " : "",
                                     corax_plan_model_set(m, i)->name);
    if (bad) {
        corax_panel_line(pn, "note", 0, "Every planned hole is near-parallel to:");
        corax_panel_line(pn, "note", 0, "%s", names);
    } else {
        corax_panel_line(pn, "small", 0, "Every set is crossed well by a planned hole.");
    }
    pn->y += 6;
}

static void explanation(page *g)
{
    static const char *const lines[] = {
        "score = share of target planes reached",
        "  x weighted geometric mean of the sets'",
        "  Terzaghi factors (planes crossed per metre",
        "  relative to a hole square to the set):",
        "  1 square to every set, 0 parallel to one.",
        "Dashed: a set's mean plane; holes along it",
        "  never cross the set. Closed curve: the cone",
        "  holding 95% of a set's poles.",
    };
    corax_panel *pn = &g->panel;
    for (size_t i = 0; i < sizeof lines / sizeof lines[0]; i++)
        corax_panel_line(pn, "small", 0, "%s", lines[i]);
    if (g->up_holes)
        corax_panel_line(pn, "note", 0, "%zu up-hole direction%s in the table only", g->up_holes,
                         g->up_holes == 1 ? "" : "s");
    pn->y += 6;
    corax_panel_line(pn, "note", 0, "A plan: check it against site conditions");
    corax_panel_line(pn, "note", 0, "and local practice before drilling.");
}

static void draw_panel(page *g)
{
    score_key(g);
    set_entries(g);
    best_entry(g);
    hole_entries(g);
    program_line(g);
    explanation(g);
}

static void page_style(corax_svg *svg)
{
    char css[2048];
    size_t used = (size_t)snprintf(css, sizeof css,
        ".setplane { fill: none; stroke-width: 2; stroke-dasharray: 7 4; }\n"
        ".cone { fill: none; stroke-width: 1.6; }\n"
        ".hole { stroke: #1a1a1a; stroke-width: 2; }\n"
        ".holehalo { stroke: #ffffff; stroke-width: 5; }\n"
        ".holename { font-size: 12px; font-weight: bold; paint-order: stroke; stroke: #ffffff;"
        " stroke-width: 3px; }\n"
        ".best { fill: none; stroke: #1a1a1a; stroke-width: 3; }\n"
        ".besthalo { fill: none; stroke: #ffffff; stroke-width: 7; }\n");
    for (size_t b = 0; b < CORAX_BANDS && used < sizeof css; b++)
        used += (size_t)snprintf(css + used, sizeof css - used,
                                 ".s%zu { fill: %s; stroke: %s; stroke-width: 0.6; }\n", b,
                                 corax_band_fill[b], corax_band_fill[b]);
    if (used < sizeof css) /* after the bands, so that it wins */
        snprintf(css + used, sizeof css - used, ".keybox { stroke: #8a8070; }\n");
    corax_disc_style(svg, css);
}

corax_status corax_plan_picture_draw(const corax_plan_picture *p, corax_svg **out)
{
    *out = NULL;
    if (!p->ndirections || !p->model || !(p->azimuth_step > 0.0) || !(p->plunge_step > 0.0))
        return CORAX_EARG;
    page g;
    memset(&g, 0, sizeof g);
    g.p = p;
    for (size_t k = 0; k < p->ndirections; k++) {
        g.up_holes += p->directions[k].plunge < 0.0;
        if (p->directions[k].score > p->directions[g.best].score)
            g.best = k;
    }
    double cx = MARGIN + RADIUS, cy = TOP + RADIUS, px = cx + RADIUS + 70;
    g.panel = (corax_panel){NULL, px, TOP - 40}; /* measure the panel first */
    draw_panel(&g);
    double width = px + SIDE, height = fmax(cy + RADIUS + 60, g.panel.y + 30);
    corax_svg *svg = corax_svg_new(width, height);
    if (!svg)
        return CORAX_ENOMEM;
    page_style(svg);
    corax_svg_rect(svg, 0, 0, width, height, "paper");
    corax_svg_text(svg, 20, 30, "title", "start", p->title ? p->title : "Drill direction score");
    corax_svg_text(svg, 20, 50, "subtitle", "start",
                   "hole directions on the lower hemisphere, equal-area: each cell a direction "
                   "of the sweep, shaded by its score");
    g.disc = (corax_disc){svg, CORAX_EQUAL_AREA, cx, cy, RADIUS};
    corax_svg_circle(svg, cx, cy, RADIUS, "paper");
    corax_svg_group(svg, "cells", NULL);
    for (size_t k = 0; k < p->ndirections; k++)
        if (p->directions[k].plunge >= 0.0)
            draw_cell(&g, &p->directions[k]);
    corax_svg_end_group(svg);
    draw_sets(&g);
    draw_holes(&g);
    draw_best(&g);
    corax_disc_frame(&g.disc);
    g.panel = (corax_panel){svg, px, TOP - 40};
    draw_panel(&g);
    if (!corax_svg_finish(svg, NULL)) {
        corax_svg_free(svg);
        return CORAX_ENOMEM;
    }
    *out = svg;
    return CORAX_OK;
}
