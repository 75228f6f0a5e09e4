/* draw: stereonets as SVG. A net is a disc on the page: density bands and
 * contours first, then great circles, points, means and cones, then the
 * primitive, ticks and north mark on top; a side panel holds the legend,
 * counts, statistics and notes. */
#include <ctype.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/contour.h"
#include "corax/stereonet.h"
#include "draw/net.h"
#include "draw/palette.h"
#include "draw/sample.h"
#include "geometry/vec.h"

enum { MAX_LEVELS = CORAX_BANDS };

/* Marks drawn on one net: at most SET_POINTS poles and as many lines of a
 * set, SET_CURVES great or small circles, and all sets together within the
 * page's budget, shared in proportion. Beyond, a set is drawn as a sample
 * (the density, means and statistics always take every reading). */
enum { SET_POINTS = 2000, NET_POINTS = 10000, SET_CURVES = 300, NET_CURVES = 2000 };

/* Draw one mark in every `every`: a sample of `count` marks of a kind that
 * has `total` on the net. */
static size_t draw_every(size_t count, size_t total, size_t set_limit, size_t net_limit)
{
    size_t limit = set_limit;
    if (total > net_limit) {
        size_t share = (size_t)((double)net_limit * (double)count / (double)total);
        limit = share < limit ? share : limit;
    }
    return corax_sample_every(count, limit);
}

typedef struct net {
    corax_svg *svg;
    const corax_net_style *style;
    double cx, cy, r;    /* centre and radius of the primitive, pixels */
    double px, py;       /* side panel: left edge and the next text line */
    int id;              /* unique on the page, for the clip path */
} net;

corax_net_style corax_net_style_default(void)
{
    corax_net_style s = {CORAX_EQUAL_AREA, CORAX_NET_POLES, 1, CORAX_DENSITY_KAMB, 2.0, 121, 0,
                         corax_rad(15.0), NULL, NULL};
    return s;
}

static corax_disc disc_of(const net *n)
{
    corax_disc d = {n->svg, n->style->projection, n->cx, n->cy, n->r};
    return d;
}

static void place(const net *n, corax_vec3 v, double *sx, double *sy)
{
    corax_disc d = disc_of(n);
    corax_disc_place(&d, v, sx, sy);
}

static void great_circle(const net *n, corax_vec3 normal, const char *cls)
{
    corax_disc d = disc_of(n);
    corax_disc_great_circle(&d, normal, cls);
}

static void small_circle(const net *n, corax_vec3 axis, double angle, const char *cls)
{
    corax_disc d = disc_of(n);
    corax_disc_small_circle(&d, axis, angle, cls);
}

/* ---- density ---- */

/* Where a point of the equal-area density grid falls on this net: the same
 * place on an equal-area net; on an equal-angle one, the same direction, and
 * beyond the primitive (only ever clipped away) a radius that goes on
 * smoothly from it. */
static void grid_to_net(const net *n, double x, double y, double *sx, double *sy)
{
    double r = hypot(x, y);
    if (n->style->projection == CORAX_EQUAL_ANGLE && r > 0.0) {
        double theta = 2.0 * asin(fmin(1.0, r / sqrt(2.0)));
        double r2 = theta <= 0.5 * CORAX_PI ? tan(0.5 * theta) : 1.0 + (theta - 0.5 * CORAX_PI);
        x *= r2 / r;
        y *= r2 / r;
    }
    corax_disc d = disc_of(n);
    corax_disc_screen(&d, x, y, sx, sy);
}

static void band_path(const net *n, const corax_isolines *lines, size_t band)
{
    char cls[32];
    snprintf(cls, sizeof cls, "band b%zu", band < CORAX_BANDS ? band : CORAX_BANDS - 1);
    corax_svg_path_begin(n->svg, cls);
    for (size_t i = 0; i < lines->count; i++)
        for (size_t k = lines->start[i]; k < lines->start[i + 1]; k++) {
            double x, y;
            grid_to_net(n, lines->xy[2 * k], lines->xy[2 * k + 1], &x, &y);
            if (k == lines->start[i])
                corax_svg_path_move(n->svg, x, y);
            else
                corax_svg_path_line(n->svg, x, y);
        }
    corax_svg_path_end(n->svg, 1);
}

/* What one net will show, worked out before anything is drawn so that the
 * page can be sized to its longest side panel. */
typedef struct plan {
    const corax_net_set *sets;
    size_t nsets, index0; /* index0: the palette index of sets[0] */
    const char *title;
    double *grid;         /* density in multiples of sigma; NULL: no contours */
    double step;          /* contour interval, sigma */
    size_t levels;        /* contour levels reached */
    size_t count;         /* readings contoured */
    int of_lines;         /* contoured lines, not poles */
    size_t points, curves; /* marks of each kind on the net, before sampling */
} plan;

/* One in how many of a set's poles, lines, great circles (of its poles) and
 * small circles the net draws. */
typedef struct every {
    size_t poles, lines, great, small;
} every;

static every set_every(const plan *p, const corax_net_style *s, const corax_net_set *set)
{
    every e = {1, 1, 1, 1};
    if (s->planes & CORAX_NET_POLES)
        e.poles = draw_every(set->npoles, p->points, SET_POINTS, NET_POINTS);
    e.lines = draw_every(set->nlines, p->points, SET_POINTS, NET_POINTS);
    if (s->planes & CORAX_NET_GREAT_CIRCLES)
        e.great = draw_every(set->npoles, p->curves, SET_CURVES, NET_CURVES);
    e.small = draw_every(set->ncircles, p->curves, SET_CURVES, NET_CURVES);
    return e;
}

/* The readings a net contours: in the sets' own arrays, or in copies of
 * them (own_v and own_w, freed after). */
typedef struct gathered {
    const corax_vec3 *v;
    const double *w; /* NULL: unweighted */
    corax_vec3 *own_v;
    double *own_w;
} gathered;

static corax_status gather(const corax_net_set *sets, size_t nsets, gathered *g, size_t *count,
                           int *of_lines);

/* The density of the net's readings on the grid, in multiples of sigma, and
 * the contour levels it reaches. */
static corax_status plan_density(plan *p, const corax_net_style *s)
{
    gathered g = {0};
    corax_status st = gather(p->sets, p->nsets, &g, &p->count, &p->of_lines);
    if (st != CORAX_OK || !s->contours || p->count < CORAX_FISHER_MIN_READINGS)
        goto done;
    corax_density d;
    size_t cells = s->grid * s->grid;
    if ((st = corax_density_init(&d, s->density, p->count)) != CORAX_OK)
        goto done;
    if (!(p->grid = malloc(cells * sizeof *p->grid))) {
        st = CORAX_ENOMEM;
        goto done;
    }
    if ((st = corax_density_grid(&d, g.v, g.w, s->grid, p->grid)) != CORAX_OK)
        goto done;
    double top = 0.0;
    for (size_t k = 0; k < cells; k++) {
        p->grid[k] /= d.sigma;
        top = fmax(top, p->grid[k]);
    }
    p->step = s->contour_step;
    p->levels = (size_t)floor(top / p->step);
    if (p->levels > MAX_LEVELS) { /* keep the net legible: widen the interval */
        p->step *= ceil((double)p->levels / MAX_LEVELS);
        p->levels = (size_t)floor(top / p->step);
    }
done:
    free(g.own_v);
    free(g.own_w);
    return st;
}

/* Shade and contour the planned density, clipped to the primitive. */
static corax_status draw_density(const net *n, const plan *p)
{
    const corax_net_style *s = n->style;
    double edge = sqrt(2.0), h = 2.0 * edge / (double)(s->grid - 1);
    corax_grid g = {s->grid, s->grid, -edge, -edge, h, h, p->grid};
    corax_isolines lines = {0};
    corax_status st = CORAX_OK;
    const char *prefix = s->id_prefix ? s->id_prefix : "corax-net";
    corax_svg_raw(n->svg, "<clipPath id=\"%s-%d\"><circle cx=\"%.2f\" cy=\"%.2f\" "
                  "r=\"%.2f\"/></clipPath>\n<g clip-path=\"url(#%s-%d)\">\n", prefix, n->id,
                  n->cx, n->cy, n->r, prefix, n->id);
    for (size_t k = 1; k <= p->levels && st == CORAX_OK; k++) {
        st = corax_isolines_trace(&g, (double)k * p->step, &lines);
        if (st == CORAX_OK && lines.count)
            band_path(n, &lines, k - 1);
    }
    corax_svg_end_group(n->svg);
    corax_isolines_clear(&lines);
    return st;
}

/* ---- the side panel ---- */

static void panel_text(net *n, const char *cls, double indent, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));

static void panel_text(net *n, const char *cls, double indent, const char *fmt, ...)
{
    corax_panel p = {n->svg, n->px, n->py};
    va_list ap;
    va_start(ap, fmt);
    corax_panel_vline(&p, cls, indent, fmt, ap);
    va_end(ap);
    n->py = p.y;
}

static double azimuth_deg(double radians) { return corax_wrap_degrees(corax_deg(radians), 1); }

static void set_classes(size_t set, char *fill, char *stroke, size_t len)
{
    size_t c = corax_palette_colour_of(set);
    snprintf(fill, len, "pt f%zu", c);
    snprintf(stroke, len, "k%zu", c);
}

static void describe_summary(net *n, const corax_axial_summary *s, int planes)
{
    if (s->n == 0)
        return;
    double trend, plunge;
    corax_line_trend_plunge(s->fisher.mean, &trend, &plunge);
    if (planes) {
        corax_plane p = corax_plane_from_normal(s->fisher.mean, NULL);
        panel_text(n, "small", 18, "mean plane: dip %.1f° toward %05.1f°", corax_deg(p.dip),
                   azimuth_deg(p.dip_direction));
    } else {
        panel_text(n, "small", 18, "mean line: plunge %.1f° toward %05.1f°", corax_deg(plunge),
                   azimuth_deg(trend));
    }
    if (s->n < CORAX_FISHER_MIN_READINGS)
        panel_text(n, "note", 18, "too few for kappa and cone (%d needed)",
                   CORAX_FISHER_MIN_READINGS);
    else if (isinf(s->fisher.kappa))
        panel_text(n, "small", 18, "readings identical: no spread");
    else
        panel_text(n, "small", 18, "kappa %.1f, 95%% cone %.1f°", s->fisher.kappa,
                   corax_deg(s->fisher.alpha95));
}

static void describe_axes(net *n, const corax_axial_summary *s)
{
    if (s->n < 2)
        return;
    for (int k = 0; k < 3; k++) {
        double trend, plunge;
        corax_line_trend_plunge(s->tensor.axis[k], &trend, &plunge);
        panel_text(n, "small", 18, "axis %d: %05.1f°/%.1f°, eigenvalue %.3f", k + 1,
                   azimuth_deg(trend), corax_deg(plunge), s->tensor.eigenvalue[k]);
    }
    if (!isnan(s->tensor.shape) && !isnan(s->tensor.strength))
        panel_text(n, "small", 18, "Woodcock K %.2f, C %.2f", s->tensor.shape, s->tensor.strength);
}

/* "2000 of 120000 poles drawn (a sample)": what a sampled set shows of
 * itself. */
static void sample_note(net *n, const plan *p, const corax_net_set *set)
{
    every e = set_every(p, n->style, set);
    const size_t count[] = {set->npoles, set->nlines, set->npoles, set->ncircles};
    const size_t step[] = {e.poles, e.lines, e.great, e.small};
    static const char *const what[] = {"poles", "lines", "great circles", "small circles"};
    for (int k = 0; k < 4; k++)
        if (step[k] > 1)
            panel_text(n, "note", 18, "%zu of %zu %s drawn (a sample)",
                       corax_sample_count(count[k], step[k]), count[k], what[k]);
}

static void legend_entry(net *n, const plan *pl, const corax_net_set *set, size_t index,
                         int one_set)
{
    char fill[16], stroke[16];
    set_classes(index, fill, stroke, sizeof fill);
    if (n->svg)
        corax_palette_symbol(n->svg, corax_palette_shape_of(index), n->px + 6, n->py - 4, 10,
                             fill);
    n->px += 18;
    panel_text(n, "label", 0, "%s", set->name);
    n->px -= 18;
    if (set->npoles || set->nlines || !set->ncircles)
        panel_text(n, "small", 18, "%zu pole%s, %zu line%s", set->npoles,
                   set->npoles == 1 ? "" : "s", set->nlines, set->nlines == 1 ? "" : "s");
    if (set->ncircles)
        panel_text(n, "small", 18, "%zu reading%s by alpha alone", set->ncircles,
                   set->ncircles == 1 ? "" : "s");
    sample_note(n, pl, set);
    for (size_t k = 0; k < set->npicks; k++) {
        const corax_net_pick *pk = &set->picks[k];
        corax_plane p = corax_plane_from_normal(pk->pole, NULL);
        if (isnan(pk->cone))
            panel_text(n, "small", 18, "%s: dip %.1f° toward %05.1f°", pk->label,
                       corax_deg(p.dip), azimuth_deg(p.dip_direction));
        else
            panel_text(n, "small", 18, "%s: dip %.1f° toward %05.1f°, cone %.1f°", pk->label,
                       corax_deg(p.dip), azimuth_deg(p.dip_direction), corax_deg(pk->cone));
    }
    if (n->style->weighted && set->pole_summary && set->npoles)
        panel_text(n, "small", 18, "weighted count %.1f (Terzaghi)", set->pole_summary->weight_sum);
    if (set->skipped)
        panel_text(n, "note", 18, "%zu row%s skipped (no usable angles)", set->skipped,
                   set->skipped == 1 ? "" : "s");
    if (set->pole_summary && set->npoles) {
        describe_summary(n, set->pole_summary, 1);
        if (one_set)
            describe_axes(n, set->pole_summary);
    }
    if (set->line_summary && set->nlines)
        describe_summary(n, set->line_summary, 0);
    n->py += 6;
}

static void density_legend(net *n, double step, size_t levels, size_t count, int of_lines)
{
    const corax_net_style *s = n->style;
    panel_text(n, "label", 0, "Density of %s", of_lines ? "lines" : "poles");
    panel_text(n, "small", 0, "%s, interval %g σ", s->density == CORAX_DENSITY_SMOOTH
                                                       ? "smoothed Kamb (Vollmer 1995)"
                                                       : "Kamb (1959) counting",
               step);
    panel_text(n, "small", 0, "uniform data: 3 σ; n %zu", count);
    if (levels == 0)
        panel_text(n, "note", 0, "nowhere above %g σ", step);
    for (size_t k = 0; k < levels; k++) {
        char cls[32];
        snprintf(cls, sizeof cls, "band b%zu", k < CORAX_BANDS ? k : CORAX_BANDS - 1);
        if (n->svg)
            corax_svg_rect(n->svg, n->px, n->py - 11, 22, 12, cls);
        n->px += 30;
        panel_text(n, "small", 0, "%g σ and above", (double)(k + 1) * step);
        n->px -= 30;
    }
    n->py += 6;
}

/* The key names only the marks that are drawn: means, cones and axes come
 * with the sets' summaries. */
static void symbol_key(net *n, const plan *p, int has_lines)
{
    int means = 0, plane_means = 0, poles = 0, circles = 0, picks = 0;
    for (size_t i = 0; i < p->nsets; i++) {
        const corax_net_set *set = &p->sets[i];
        plane_means |= set->pole_summary && set->npoles;
        means |= (set->pole_summary && set->npoles) || (set->line_summary && set->nlines);
        poles |= set->npoles > 0;
        circles |= set->ncircles > 0;
        picks |= set->npicks > 0;
    }
    panel_text(n, "label", 0, "Key");
    if (poles || has_lines)
        panel_text(n, "small", 0, "%s%s%s", poles ? "filled: poles of planes" : "",
                   poles && has_lines ? "; " : "", has_lines ? "hollow: lines" : "");
    static const char *const circle_key[] = {"thin curve: a reading's small circle (its pole",
                                             "lies on it: 90 - alpha from the core axis)"};
    static const char *const pick_key[] = {"numbered mark: a solved pole; dashed curve:",
                                           "its 95% cone"};
    for (int k = 0; circles && k < 2; k++)
        panel_text(n, "small", 0, "%s", circle_key[k]);
    for (int k = 0; picks && k < 2; k++)
        panel_text(n, "small", 0, "%s", pick_key[k]);
    if (means)
        panel_text(n, "small", 0, "ring: mean; closed curve: 95%% cone");
    if (plane_means)
        panel_text(n, "small", 0, "dashed: the mean plane");
    if (p->nsets == 1 && p->sets[0].pole_summary && p->sets[0].npoles >= 2)
        panel_text(n, "small", 0, "boxed 1, 2, 3: principal axes");
}

/* ---- the net ---- */

static void draw_mean(const net *n, const corax_axial_summary *s, size_t index, int planes)
{
    if (s->n == 0)
        return;
    char fill[16], stroke[16], cls[32];
    set_classes(index, fill, stroke, sizeof fill);
    if (planes) {
        snprintf(cls, sizeof cls, "meanplane %s", stroke);
        great_circle(n, s->fisher.mean, cls);
    }
    if (s->n >= CORAX_FISHER_MIN_READINGS && s->fisher.alpha95 > 0.0 &&
        s->fisher.alpha95 < 0.5 * CORAX_PI) {
        snprintf(cls, sizeof cls, "cone %s", stroke);
        small_circle(n, s->fisher.mean, s->fisher.alpha95, cls);
    }
    double x, y;
    place(n, s->fisher.mean, &x, &y);
    snprintf(cls, sizeof cls, "meanring %s", stroke);
    corax_svg_circle(n->svg, x, y, 6.5, cls);
    corax_svg_circle(n->svg, x, y, 1.8, fill);
}

static void draw_axes(const net *n, const corax_axial_summary *s)
{
    if (s->n < 2)
        return;
    for (int k = 0; k < 3; k++) {
        double x, y;
        char label[12];
        place(n, s->tensor.axis[k], &x, &y);
        corax_svg_rect(n->svg, x - 6, y - 6, 12, 12, "axisbox");
        snprintf(label, sizeof label, "%d", k + 1);
        corax_svg_text(n->svg, x, y + 4, "axislabel", "middle", label);
    }
}

/* The solved poles of a set: each cone dashed, the pole a large mark of the
 * set's shape with its label beside it. */
static void draw_picks(const net *n, const corax_net_set *set, size_t index)
{
    char fill[16], stroke[16], cls[32];
    set_classes(index, fill, stroke, sizeof fill);
    for (size_t i = 0; i < set->npicks; i++) {
        const corax_net_pick *pk = &set->picks[i];
        if (pk->cone > 0.0 && pk->cone < 0.5 * CORAX_PI) {
            snprintf(cls, sizeof cls, "pickcone %s", stroke);
            small_circle(n, pk->pole, pk->cone, cls);
        }
        double x, y;
        place(n, pk->pole.z > 0.0 ? vec_neg(pk->pole) : pk->pole, &x, &y);
        snprintf(cls, sizeof cls, "pick f%zu", corax_palette_colour_of(index));
        corax_palette_symbol(n->svg, corax_palette_shape_of(index), x, y, 15, cls);
        if (pk->label)
            corax_svg_text(n->svg, x + 11, y - 9, "picklabel", "start", pk->label);
    }
}

static void draw_set(const net *n, const plan *p, const corax_net_set *set, size_t index)
{
    char fill[16], stroke[16], cls[32];
    set_classes(index, fill, stroke, sizeof fill);
    corax_shape shape = corax_palette_shape_of(index);
    every e = set_every(p, n->style, set);
    if (n->style->planes & CORAX_NET_GREAT_CIRCLES) {
        snprintf(cls, sizeof cls, "gc %s", stroke);
        for (size_t i = 0; i < set->npoles; i++)
            if (corax_sample_drawn(i, e.great))
                great_circle(n, set->poles[i], cls);
    }
    snprintf(cls, sizeof cls, "sc %s", stroke);
    for (size_t i = 0; i < set->ncircles; i++)
        if (corax_sample_drawn(i, e.small))
            small_circle(n, set->circles[i].axis, set->circles[i].angle, cls);
    double x, y;
    if (n->style->planes & CORAX_NET_POLES)
        for (size_t i = 0; i < set->npoles; i++) {
            if (!corax_sample_drawn(i, e.poles))
                continue;
            place(n, set->poles[i], &x, &y);
            corax_palette_symbol(n->svg, shape, x, y, 8, fill);
        }
    snprintf(cls, sizeof cls, "hollow %s", stroke);
    for (size_t i = 0; i < set->nlines; i++) {
        if (!corax_sample_drawn(i, e.lines))
            continue;
        place(n, set->lines[i], &x, &y);
        corax_palette_symbol(n->svg, shape, x, y, 8, cls);
    }
}

/* The readings of the sets as they lie, when each set's follow the last's in
 * memory, their weights too (as a caller that keeps every set in one array
 * gives them): 1 with g->v and g->w set, else 0. */
static int adjacent(const corax_net_set *sets, size_t nsets, int of_lines, int weighted,
                    gathered *g)
{
    const corax_vec3 *next = NULL;
    const double *next_w = NULL;
    for (size_t i = 0; i < nsets; i++) {
        size_t m = of_lines ? sets[i].nlines : sets[i].npoles;
        const corax_vec3 *v = of_lines ? sets[i].lines : sets[i].poles;
        const double *w = weighted ? sets[i].pole_weight : NULL;
        if (m == 0) /* an empty set may hold NULL, or anything */
            continue;
        if ((weighted && !w) || (next && (v != next || w != next_w)))
            return 0;
        if (!next) {
            g->v = v;
            g->w = w;
        }
        next = v + m;
        next_w = w ? w + m : NULL;
    }
    return 1;
}

/* Gather the readings to contour: the poles of every set on the net, or
 * their lines when there are no poles; copied only when they do not lie one
 * after another already. */
static corax_status gather(const corax_net_set *sets, size_t nsets, gathered *g, size_t *count,
                           int *of_lines)
{
    size_t poles = 0, lines = 0;
    int weighted = 0;
    for (size_t i = 0; i < nsets; i++) {
        poles += sets[i].npoles;
        lines += sets[i].nlines;
        weighted |= sets[i].pole_weight != NULL;
    }
    *of_lines = poles == 0;
    *count = poles ? poles : lines;
    weighted = weighted && poles;
    if (adjacent(sets, nsets, *of_lines, weighted, g))
        return CORAX_OK;
    g->v = g->own_v = malloc(*count * sizeof *g->own_v);
    g->w = g->own_w = weighted ? malloc(*count * sizeof *g->own_w) : NULL;
    if (!g->own_v || (weighted && !g->own_w))
        return CORAX_ENOMEM;
    size_t k = 0;
    for (size_t i = 0; i < nsets; i++) {
        size_t m = *of_lines ? sets[i].nlines : sets[i].npoles;
        if (m) /* an empty set may hold NULL */
            memcpy(g->own_v + k, *of_lines ? sets[i].lines : sets[i].poles,
                   m * sizeof *g->own_v);
        for (size_t j = 0; g->own_w && j < m; j++)
            g->own_w[k + j] = sets[i].pole_weight ? sets[i].pole_weight[j] : 1.0;
        k += m;
    }
    return CORAX_OK;
}

static size_t readings(const plan *p, int *has_lines)
{
    size_t total = 0;
    *has_lines = 0;
    for (size_t i = 0; i < p->nsets; i++) {
        total += p->sets[i].npoles + p->sets[i].nlines + p->sets[i].ncircles;
        *has_lines |= p->sets[i].nlines > 0;
    }
    return total;
}

/* The side panel: legend, counts, statistics, density levels, key. */
static void draw_panel(net *n, const plan *p)
{
    int has_lines, one_set = p->nsets == 1;
    size_t total = readings(p, &has_lines);
    for (size_t i = 0; i < p->nsets; i++)
        legend_entry(n, p, &p->sets[i], p->index0 + i, one_set);
    if (p->grid)
        density_legend(n, p->step, p->levels, p->count, p->of_lines);
    else if (n->style->contours && total)
        panel_text(n, "note", 0, "no contours: fewer than %d readings", CORAX_FISHER_MIN_READINGS);
    if (total)
        symbol_key(n, p, has_lines);
}

static corax_status draw_net(net *n, const plan *p)
{
    corax_svg *svg = n->svg;
    int has_lines;
    corax_svg_text(svg, n->cx - n->r - 20, n->cy - n->r - 48, "heading", "start", p->title);
    corax_svg_circle(svg, n->cx, n->cy, n->r, "paper");
    if (p->grid) {
        corax_status st = draw_density(n, p);
        if (st != CORAX_OK)
            return st;
    }
    for (size_t i = 0; i < p->nsets; i++)
        draw_set(n, p, &p->sets[i], p->index0 + i);
    if (p->nsets == 1 && p->sets[0].pole_summary && p->sets[0].npoles)
        draw_axes(n, p->sets[0].pole_summary); /* beneath the means, which matter more */
    for (size_t i = 0; i < p->nsets; i++) {
        const corax_net_set *set = &p->sets[i];
        if (set->pole_summary && set->npoles)
            draw_mean(n, set->pole_summary, p->index0 + i, 1);
        if (set->line_summary && set->nlines)
            draw_mean(n, set->line_summary, p->index0 + i, 0);
    }
    for (size_t i = 0; i < p->nsets; i++)
        draw_picks(n, &p->sets[i], p->index0 + i);
    corax_disc d = disc_of(n);
    corax_disc_frame(&d);
    if (readings(p, &has_lines) == 0)
        corax_svg_text(svg, n->cx, n->cy + 30, "note", "middle", "no readings");
    draw_panel(n, p);
    return CORAX_OK;
}

static void page_style(corax_svg *svg)
{
    corax_disc_style(svg,
        ".band { fill-rule: evenodd; stroke: #5b5140; stroke-width: 0.7; }\n"
        ".hollow { fill: #ffffff; stroke-width: 1.6; }\n"
        ".gc { fill: none; stroke-width: 0.8; stroke-opacity: 0.75; }\n"
        ".meanplane { fill: none; stroke-width: 2.2; stroke-dasharray: 7 4; }\n"
        ".cone { fill: none; stroke-width: 1.8; }\n"
        ".meanring { fill: #ffffff; fill-opacity: 0.6; stroke-width: 2.6; }\n"
        ".axisbox { fill: #ffffff; stroke: #1a1a1a; stroke-width: 1.2; }\n"
        ".axislabel { font-size: 10px; font-weight: bold; }\n"
        ".sc { fill: none; stroke-width: 0.9; stroke-opacity: 0.7; }\n"
        ".pickcone { fill: none; stroke-width: 2; stroke-dasharray: 5 3; }\n"
        ".pick { stroke: #1a1a1a; stroke-width: 1.6; }\n"
        ".picklabel { font-size: 14px; font-weight: bold; paint-order: stroke; stroke: #ffffff; "
        "stroke-width: 3px; }\n");
}

static void page_heading(corax_svg *svg, const corax_net_style *s)
{
    char sub[256], weighting[64] = "";
    if (s->weighted)
        snprintf(weighting, sizeof weighting, ", Terzaghi weighting (minimum angle %g°)",
                 corax_deg(s->min_angle));
    snprintf(sub, sizeof sub, "lower hemisphere, %s%s%s", corax_projection_name(s->projection),
             s->planes == CORAX_NET_GREAT_CIRCLES ? ", planes as great circles"
             : s->planes == (CORAX_NET_POLES | CORAX_NET_GREAT_CIRCLES)
                 ? ", planes as poles and great circles"
                 : ", planes as poles",
             weighting);
    corax_svg_text(svg, 20, 30, "title", "start", s->title ? s->title : "Stereonet");
    corax_svg_text(svg, 20, 50, "subtitle", "start", sub);
}

/* Page geometry, pixels: the side panel's width, the space above a net. */
enum { SIDE = 300, TOP = 130, MARGIN = 50 };

/* The nets of the page, planned: one per set, or one for all. */
static corax_status plan_page(const corax_net_set *sets, size_t nsets,
                              const corax_net_style *style, int net_per_set, plan *plans,
                              size_t nets)
{
    corax_status st = CORAX_OK;
    for (size_t k = 0; k < nets && st == CORAX_OK; k++) {
        plan *p = &plans[k];
        p->sets = net_per_set ? &sets[k] : sets;
        p->nsets = net_per_set ? 1 : nsets;
        p->index0 = net_per_set ? k : 0;
        p->title = p->nsets == 1 ? p->sets[0].name : "All sets";
        for (size_t i = 0; i < p->nsets; i++) {
            const corax_net_set *set = &p->sets[i];
            p->points += (style->planes & CORAX_NET_POLES ? set->npoles : 0) + set->nlines;
            p->curves += (style->planes & CORAX_NET_GREAT_CIRCLES ? set->npoles : 0) +
                         set->ncircles;
        }
        st = plan_density(p, style);
    }
    return st;
}

/* An id prefix goes into markup unescaped: letters, digits, - and _ only. */
static int id_prefix_ok(const char *p)
{
    if (!p)
        return 1;
    if (!isalpha((unsigned char)*p))
        return 0;
    for (; *p; p++)
        if (!isalnum((unsigned char)*p) && *p != '-' && *p != '_')
            return 0;
    return 1;
}

corax_status corax_stereonet_page(const corax_net_set *sets, size_t nsets,
                                  const corax_net_style *style, int net_per_set,
                                  corax_svg **out)
{
    *out = NULL;
    if (nsets == 0 || !(style->contour_step > 0.0) || style->grid < 3 ||
        !(style->planes & (CORAX_NET_POLES | CORAX_NET_GREAT_CIRCLES)) ||
        !id_prefix_ok(style->id_prefix))
        return CORAX_EARG;
    size_t nets = net_per_set ? nsets : 1;
    size_t cols = nets < 3 ? nets : 3, rows = (nets + cols - 1) / cols;
    double r = nets > 1 ? 160.0 : 220.0, pw = MARGIN + 2 * r + 40 + SIDE;
    plan *plans = calloc(nets, sizeof *plans);
    double *row_top = calloc(rows + 1, sizeof *row_top);
    corax_svg *svg = NULL;
    corax_status st = plans && row_top ? plan_page(sets, nsets, style, net_per_set, plans, nets)
                                       : CORAX_ENOMEM;
    /* each row of nets as tall as its net or its longest panel */
    row_top[0] = 20.0;
    for (size_t k = 0; k < nets && st == CORAX_OK; k++) {
        net measure = {NULL, style, 0, 0, r, 0, 0, 0};
        draw_panel(&measure, &plans[k]);
        double h = TOP - 40 + fmax(2 * r + 100, measure.py + 30);
        row_top[k / cols + 1] = fmax(row_top[k / cols + 1], h);
    }
    for (size_t i = 1; i <= rows; i++)
        row_top[i] += row_top[i - 1];
    if (st == CORAX_OK && !(svg = corax_svg_new(pw * (double)cols, row_top[rows])))
        st = CORAX_ENOMEM;
    if (st == CORAX_OK) {
        page_style(svg);
        corax_svg_rect(svg, 0, 0, pw * (double)cols, row_top[rows], "paper");
        page_heading(svg, style);
    }
    for (size_t k = 0; k < nets && st == CORAX_OK; k++) {
        double ox = pw * (double)(k % cols), oy = row_top[k / cols];
        net n = {svg, style, ox + MARGIN + r, oy + TOP + r - 20, r, ox + MARGIN + 2 * r + 40,
                 oy + TOP - 40, (int)k};
        corax_svg_group(svg, "net", NULL);
        st = draw_net(&n, &plans[k]);
        corax_svg_end_group(svg);
    }
    for (size_t k = 0; plans && k < nets; k++)
        free(plans[k].grid);
    free(plans);
    free(row_top);
    if (st == CORAX_OK && !corax_svg_finish(svg, NULL))
        st = CORAX_ENOMEM;
    if (st != CORAX_OK) {
        corax_svg_free(svg);
        return st;
    }
    *out = svg;
    return CORAX_OK;
}
