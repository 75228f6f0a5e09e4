/* draw: the cross-section picture. Hole paths and structures already in
 * section coordinates are laid out to scale (one scale both ways) and drawn
 * as SVG with axes, a scale bar, the section's end azimuths, a legend and
 * a footer. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "common/grow.h"
#include "corax/geometry.h"
#include "corax/section_drawing.h"
#include "draw/sample.h"

/* Our own palette for feature kinds, in the order kinds are given colours,
 * then grey for any further kinds. Chosen so that every pair of colours
 * stays at least 19 CAM02-UCS units apart under normal vision and under the
 * simulated full deuteranopia, protanopia and tritanopia of Machado,
 * Oliveira & Fernandes (2009), "A physiologically-based model for
 * simulation of color vision deficiency", and at least 18 from the dark
 * grey of the hole paths. */
static const char *const palette[] = {"#346882", "#eb9c1a", "#9c34eb",
                                      "#b85555", "#829ceb", "#6b3d12"};
enum { NCOLOURS = sizeof palette / sizeof palette[0] };
static const char other_colour[] = "#a0a0a0";
static const char trace_colour[] = "#3b3b3b";

typedef struct hole {
    char *name;
    corax_section_sample *s;
    size_t n;
} hole;

typedef struct mark {
    corax_section_point at;
    int oriented;
    double along, up; /* unit direction of the tick, down the apparent dip */
    int kind;
    char *label;
} mark;

typedef struct kind {
    int code;
    char *name;
    size_t count;
    int oriented; /* some of its structures have an orientation */
} kind;

struct corax_section_drawing {
    corax_section section;
    double step;
    double ratio; /* 1:ratio at 96 pixels to the inch; 0: fit the page */
    hole *hole;
    size_t nhole;
    mark *mark;
    size_t nmark, mark_cap;
    kind *kind;
    size_t nkind;
    int unoriented; /* some structure has no orientation */
};

corax_section_drawing *corax_section_drawing_new(const corax_section *s, double step)
{
    corax_section_drawing *d = calloc(1, sizeof *d);
    if (d) {
        d->section = *s;
        d->step = step > 0.0 ? step : 1.0;
    }
    return d;
}

void corax_section_drawing_free(corax_section_drawing *d)
{
    if (!d)
        return;
    for (size_t i = 0; i < d->nhole; i++) {
        free(d->hole[i].name);
        free(d->hole[i].s);
    }
    for (size_t i = 0; i < d->nmark; i++)
        free(d->mark[i].label);
    for (size_t i = 0; i < d->nkind; i++)
        free(d->kind[i].name);
    free(d->hole);
    free(d->mark);
    free(d->kind);
    free(d);
}

corax_status corax_section_drawing_hole(corax_section_drawing *d, const char *name,
                                        const corax_section_sample *t, size_t n)
{
    hole *h = realloc(d->hole, (d->nhole + 1) * sizeof *h);
    if (!h)
        return CORAX_ENOMEM;
    d->hole = h;
    h = &d->hole[d->nhole];
    h->name = strdup(name);
    h->s = malloc((n ? n : 1) * sizeof *h->s);
    if (!h->name || !h->s) {
        free(h->name);
        free(h->s);
        return CORAX_ENOMEM;
    }
    memcpy(h->s, t, n * sizeof *t);
    h->n = n;
    d->nhole++;
    return CORAX_OK;
}

/* The legend entry of a kind, added in code order. */
static kind *find_kind(corax_section_drawing *d, int code, const char *name)
{
    size_t i = 0;
    while (i < d->nkind && d->kind[i].code < code)
        i++;
    if (i < d->nkind && d->kind[i].code == code)
        return &d->kind[i];
    kind *k = realloc(d->kind, (d->nkind + 1) * sizeof *k);
    if (!k)
        return NULL;
    d->kind = k;
    char *copy = strdup(name ? name : "");
    if (!copy)
        return NULL;
    memmove(&d->kind[i + 1], &d->kind[i], (d->nkind - i) * sizeof *k);
    d->kind[i] = (kind){code, copy, 0, 0};
    d->nkind++;
    return &d->kind[i];
}

corax_status corax_section_drawing_structure(corax_section_drawing *d, corax_section_point at,
                                             const corax_section_dip *dip, int code,
                                             const char *kind_name, const char *label)
{
    mark *grown = corax_grow(d->mark, d->nmark, &d->mark_cap, sizeof *grown, 64);
    if (!grown)
        return CORAX_ENOMEM;
    d->mark = grown;
    kind *k = find_kind(d, code, kind_name);
    if (!k)
        return CORAX_ENOMEM;
    mark m = {at, dip != NULL, dip ? dip->along : 1.0, dip ? dip->up : 0.0, code, NULL};
    if (label && !(m.label = strdup(label)))
        return CORAX_ENOMEM;
    k->count++;
    k->oriented |= m.oriented;
    d->unoriented |= !m.oriented;
    d->mark[d->nmark++] = m;
    return CORAX_OK;
}

size_t corax_section_drawing_count(const corax_section_drawing *d) { return d->nmark; }

void corax_section_drawing_scale(corax_section_drawing *d, double ratio)
{
    d->ratio = ratio > 0.0 ? ratio : 0.0;
}

/* ---- layout ---- */

enum { MARGIN_LEFT = 86, MARGIN_TOP = 78, MARGIN_RIGHT = 230, MARGIN_BOTTOM = 128 };
static const double max_plot_w = 1000.0, max_plot_h = 620.0;
static const double tick_half = 11.0; /* half the length of a structure's tick, px */
static const double inch = 0.0254;    /* metres; an SVG pixel is 1/96 inch */

typedef struct layout {
    double a0, a1, e0, e1; /* shown distances along and elevations, metres */
    double mpp;            /* metres per pixel, both ways */
    double left, top, w, h;
} layout;

static double px(const layout *l, double along) { return l->left + (along - l->a0) / l->mpp; }
static double py(const layout *l, double elev) { return l->top + (l->e1 - elev) / l->mpp; }

/* The smallest of 1, 2, 2.5, 5 times a power of ten that is >= x > 0. */
static double nice_at_least(double x)
{
    static const double m[] = {1.0, 2.0, 2.5, 5.0, 10.0};
    double p = pow(10.0, floor(log10(x)));
    for (int i = 0; i < 5; i++)
        if (m[i] * p >= x * (1 - 1e-12))
            return m[i] * p;
    return 10.0 * p;
}

static void grow(double *lo, double *hi, double v)
{
    if (v < *lo)
        *lo = v;
    if (v > *hi)
        *hi = v;
}

static layout lay_out(const corax_section_drawing *d)
{
    const corax_section *s = &d->section;
    double a0 = HUGE_VAL, a1 = -HUGE_VAL, e0 = HUGE_VAL, e1 = -HUGE_VAL;
    for (size_t i = 0; i < d->nhole; i++)
        for (size_t k = 0; k < d->hole[i].n; k++) {
            const corax_section_point *p = &d->hole[i].s[k].at;
            if (!corax_section_in_range(s, p->along))
                continue;
            grow(&a0, &a1, p->along);
            grow(&e0, &e1, p->elevation);
        }
    for (size_t i = 0; i < d->nmark; i++) {
        grow(&a0, &a1, d->mark[i].at.along);
        grow(&e0, &e1, d->mark[i].at.elevation);
    }
    if (a0 > a1) { /* nothing to show: a frame around the origin */
        a0 = -50.0;
        a1 = 50.0;
        e0 = 0.0;
        e1 = 100.0;
    }
    double pad = fmax(0.05 * fmax(a1 - a0, e1 - e0), 5.0);
    layout l;
    l.a0 = isfinite(s->from) ? s->from : a0 - pad;
    l.a1 = isfinite(s->to) ? s->to : a1 + pad;
    l.e0 = e0 - pad;
    l.e1 = e1 + pad;
    l.mpp = d->ratio > 0.0 ? d->ratio * inch / 96.0
                           : fmax((l.a1 - l.a0) / max_plot_w, (l.e1 - l.e0) / max_plot_h);
    l.left = MARGIN_LEFT;
    l.top = MARGIN_TOP;
    l.w = (l.a1 - l.a0) / l.mpp;
    l.h = (l.e1 - l.e0) / l.mpp;
    return l;
}

/* ---- drawing ---- */

static void style(corax_svg *svg)
{
    char css[2048];
    int n = snprintf(css, sizeof css,
                     ".page { fill: #fff; }\n"
                     "text { font-family: sans-serif; fill: #222; }\n"
                     ".title { font-size: 17px; font-weight: 600; }\n"
                     ".subtitle { font-size: 12px; fill: #444; }\n"
                     ".end { font-size: 15px; font-weight: 600; }\n"
                     ".axis { stroke: #222; stroke-width: 1; fill: none; }\n"
                     ".grid { stroke: #e2e2e2; stroke-width: 1; }\n"
                     ".label { font-size: 11px; }\n"
                     ".axis-title { font-size: 12px; fill: #444; }\n"
                     ".frame { fill: none; stroke: #222; stroke-width: 1; }\n"
                     ".line { stroke: #888; stroke-width: 1; stroke-dasharray: 2 3; }\n"
                     ".in { stroke: %s; stroke-width: 1.8; fill: none; }\n"
                     ".out { stroke: %s; stroke-width: 1.2; fill: none; stroke-dasharray: 6 4; }\n"
                     ".depth { stroke: %s; stroke-width: 1; }\n"
                     ".depth-label { font-size: 9px; fill: #555; }\n"
                     ".hole-name { font-size: 11px; font-weight: 600; }\n"
                     ".tick { stroke-width: 2.6; stroke-linecap: round; fill: none; }\n"
                     ".open { fill: #fff; stroke-width: 1.6; }\n"
                     ".bar-dark { fill: #222; } .bar-light { fill: #fff; stroke: #222; }\n"
                     ".note { font-size: 15px; font-style: italic; fill: #666; }\n"
                     ".footer { font-size: 10.5px; fill: #555; }\n"
                     ".legend-head { font-size: 12px; font-weight: 600; }\n"
                     ".legend { font-size: 11.5px; }\n",
                     trace_colour, trace_colour, trace_colour);
    for (int i = 0; i <= NCOLOURS && n > 0 && (size_t)n < sizeof css; i++)
        n += snprintf(css + n, sizeof css - (size_t)n, ".c%d { stroke: %s; }\n", i,
                      i < NCOLOURS ? palette[i] : other_colour);
    corax_svg_style(svg, css);
}

/* The classes of a mark of the i-th kind of the legend: its shape (tick or
 * open) and its colour. */
static void mark_class(char *buf, size_t cap, const char *shape, size_t i)
{
    snprintf(buf, cap, "%s c%d", shape, i < NCOLOURS ? (int)i : NCOLOURS);
}

static size_t kind_index(const corax_section_drawing *d, int code)
{
    for (size_t i = 0; i < d->nkind; i++)
        if (d->kind[i].code == code)
            return i;
    return 0;
}

static void format_metres(char *buf, size_t cap, double v)
{
    snprintf(buf, cap, "%.10g", fabs(v) < 1e-9 ? 0.0 : v); /* whole numbers, never 1e+06 */
}

static void axes(corax_svg *svg, const layout *l)
{
    char t[64];
    double target = 70.0 * l->mpp; /* a label every 70 px or more */
    double de = nice_at_least(target), da = nice_at_least(target);
    double right = l->left + l->w, bottom = l->top + l->h;
    corax_svg_group(svg, "axes", NULL);
    for (double e = ceil(l->e0 / de) * de; e <= l->e1 + 1e-9; e += de) {
        double y = py(l, e);
        corax_svg_line(svg, l->left, y, right, y, "grid");
        corax_svg_line(svg, l->left - 5, y, l->left, y, "axis");
        format_metres(t, sizeof t, e);
        corax_svg_text(svg, l->left - 8, y + 4, "label", "end", t);
    }
    for (double a = ceil(l->a0 / da) * da; a <= l->a1 + 1e-9; a += da) {
        double x = px(l, a);
        corax_svg_line(svg, x, bottom, x, bottom + 5, "axis");
        format_metres(t, sizeof t, a);
        corax_svg_text(svg, x, bottom + 18, "label", "middle", t);
    }
    corax_svg_rect(svg, l->left, l->top, l->w, l->h, "frame");
    corax_svg_raw(svg, "<text class=\"axis-title\" text-anchor=\"middle\" "
                       "transform=\"translate(%.2f %.2f) rotate(-90)\">Elevation (m)</text>\n",
                  l->left - 56, l->top + l->h / 2);
    corax_svg_text(svg, l->left + l->w / 2, bottom + 36, "axis-title", "middle",
                   "Distance along the section from its origin (m)");
    corax_svg_end_group(svg);
}

/* The section's azimuth over each end, and the section line's trace at the
 * origin when it shows. */
static void ends(corax_svg *svg, const layout *l, const corax_section *s)
{
    char t[64];
    snprintf(t, sizeof t, "%03.0f\xc2\xb0", corax_wrap_degrees(corax_deg(s->azimuth) + 180.0, 0));
    corax_svg_text(svg, l->left, l->top - 10, "end", "start", t);
    snprintf(t, sizeof t, "%03.0f\xc2\xb0", corax_wrap_degrees(corax_deg(s->azimuth), 0));
    corax_svg_text(svg, l->left + l->w, l->top - 10, "end", "end", t);
    if (0.0 >= l->a0 && 0.0 <= l->a1)
        corax_svg_line(svg, px(l, 0.0), l->top, px(l, 0.0), l->top + l->h, "line");
}

/* A scale bar of about a fifth of the plot, in four blocks. */
static void scale_bar(corax_svg *svg, const layout *l, double ratio)
{
    double len = nice_at_least(fmin(l->w, 400.0) / 5.0 * l->mpp);
    double w = len / l->mpp, x = l->left, y = l->top + l->h + 56;
    char t[64];
    corax_svg_group(svg, "scale-bar", NULL);
    for (int i = 0; i < 4; i++)
        corax_svg_rect(svg, x + i * w / 4, y, w / 4, 6, i % 2 ? "bar-light" : "bar-dark");
    corax_svg_text(svg, x, y + 19, "label", "middle", "0");
    format_metres(t, sizeof t, len / 2);
    corax_svg_text(svg, x + w / 2, y + 19, "label", "middle", t);
    snprintf(t, sizeof t, "%g m", len);
    corax_svg_text(svg, x + w, y + 19, "label", "middle", t);
    if (ratio > 0.0)
        snprintf(t, sizeof t, "scale 1:%.0f at 96 pixels to the inch; no vertical exaggeration",
                 ratio);
    else
        snprintf(t, sizeof t, "same scale across and down: no vertical exaggeration");
    corax_svg_text(svg, x + w + 22, y + 7, "label", "start", t);
    corax_svg_end_group(svg);
}

/* Depth ticks fall on samples: an interval of at least 45 px of hole that is
 * a round number and a whole number of sampling steps. */
static double depth_interval(const corax_section_drawing *d, const layout *l)
{
    double want = 45.0 * l->mpp, v = nice_at_least(want);
    for (int i = 0; i < 40; i++, v = nice_at_least(v * 1.0001)) {
        double k = v / d->step;
        if (fabs(k - round(k)) < 1e-6 * k)
            return v;
    }
    return ceil(want / d->step) * d->step;
}

static void hole_path(corax_svg *svg, const layout *l, const hole *h)
{
    for (size_t i = 0; i + 1 < h->n;) {
        int in = h->s[i].in_slab && h->s[i + 1].in_slab;
        size_t j = i + 1; /* the run of segments of the same kind */
        while (j + 1 < h->n && (h->s[j].in_slab && h->s[j + 1].in_slab) == in)
            j++;
        corax_svg_path_begin(svg, in ? "in" : "out");
        for (size_t k = i; k <= j; k++) {
            double x = px(l, h->s[k].at.along), y = py(l, h->s[k].at.elevation);
            if (k == i)
                corax_svg_path_move(svg, x, y);
            else
                corax_svg_path_line(svg, x, y);
        }
        corax_svg_path_end(svg, 0);
        i = j;
    }
}

static int inside_plot(const layout *l, double x, double y)
{
    return x >= l->left && x <= l->left + l->w && y >= l->top && y <= l->top + l->h;
}

static void depth_ticks(corax_svg *svg, const layout *l, const hole *h, double every)
{
    double last_x = -1e9, last_y = -1e9;
    char t[32];
    for (size_t k = 1; k < h->n; k++) {
        double q = h->s[k].depth / every;
        if (fabs(q - round(q)) > 1e-9 * fmax(q, 1.0))
            continue;
        double x = px(l, h->s[k].at.along), y = py(l, h->s[k].at.elevation);
        size_t a = k - 1, b = k + 1 < h->n ? k + 1 : k;
        double dx = px(l, h->s[b].at.along) - px(l, h->s[a].at.along);
        double dy = py(l, h->s[b].at.elevation) - py(l, h->s[a].at.elevation);
        double len = hypot(dx, dy);
        double nx = len > 1e-9 ? -dy / len : 0.0, ny = len > 1e-9 ? dx / len : -1.0;
        if (nx < 0.0 || (nx == 0.0 && ny > 0.0)) { /* labels on the right of the path */
            nx = -nx;
            ny = -ny;
        }
        corax_svg_line(svg, x - 4 * nx, y - 4 * ny, x + 4 * nx, y + 4 * ny, "depth");
        if (hypot(x - last_x, y - last_y) < 28.0 || !inside_plot(l, x, y))
            continue; /* foreshortened: too close to the last label */
        format_metres(t, sizeof t, h->s[k].depth);
        corax_svg_text(svg, x + 7 * nx, y + 7 * ny + 3, "depth-label", "start", t);
        last_x = x;
        last_y = y;
    }
}

/* Where hole names went, so that holes from one collar or close together
 * get their names stacked rather than printed over each other. */
typedef struct placed {
    double *xy;
    size_t n;
} placed;

/* The height of a name above (x, y) clear of those placed, stacked up. */
static double free_spot(const placed *p, double x, double y)
{
    for (int moved = 1; moved;) {
        moved = 0;
        for (size_t i = 0; i < p->n; i++)
            if (fabs(p->xy[2 * i] - x) < 40.0 && fabs(p->xy[2 * i + 1] - y) < 13.0) {
                y = p->xy[2 * i + 1] - 13.0;
                moved = 1;
            }
    }
    return y;
}

/* A name stacks at most this many rows above its hole: in a crowd of holes
 * the rest go unnamed (each hole's path names it as a tooltip), or the
 * names would climb over the title. */
enum { NAME_ROWS = 4 };

static void hole_name(corax_svg *svg, const layout *l, const hole *h, placed *p)
{
    for (size_t k = 0; k < h->n; k++) {
        double x = px(l, h->s[k].at.along), y = py(l, h->s[k].at.elevation);
        if (inside_plot(l, x, y)) {
            double at = free_spot(p, x, y - 7);
            if (at < y - 7 - 13.0 * NAME_ROWS || at < l->top - 13.0)
                return;
            p->xy[2 * p->n] = x;
            p->xy[2 * p->n + 1] = at;
            p->n++;
            corax_svg_text(svg, x, at, "hole-name", "middle", h->name);
            return;
        }
    }
}

static void hole_names(corax_svg *svg, const corax_section_drawing *d, const layout *l)
{
    placed p = {malloc(2 * (d->nhole ? d->nhole : 1) * sizeof(double)), 0};
    if (!p.xy)
        return; /* names are a help, not the content */
    for (size_t i = 0; i < d->nhole; i++)
        hole_name(svg, l, &d->hole[i], &p);
    free(p.xy);
}

static void holes(corax_svg *svg, const corax_section_drawing *d, const layout *l)
{
    double every = depth_interval(d, l);
    corax_svg_group(svg, "holes", NULL);
    for (size_t i = 0; i < d->nhole; i++) {
        corax_svg_group(svg, "hole", NULL);
        corax_svg_title(svg, d->hole[i].name);
        hole_path(svg, l, &d->hole[i]);
        depth_ticks(svg, l, &d->hole[i], every);
        corax_svg_end_group(svg);
    }
    corax_svg_end_group(svg);
}

/* Structures drawn at most: beyond, a sample (see draw/sample.h), and the
 * legend says how many of how many; 20,000 ticks with their tooltips make
 * about 3 MB. */
enum { SECTION_MARKS = 20000 };

static void marks(corax_svg *svg, const corax_section_drawing *d, const layout *l)
{
    char cls[40];
    size_t every = corax_sample_every(d->nmark, SECTION_MARKS);
    corax_svg_group(svg, "structures", NULL);
    for (size_t i = 0; i < d->nmark; i++) {
        const mark *m = &d->mark[i];
        if (!corax_sample_drawn(i, every))
            continue;
        double x = px(l, m->at.along), y = py(l, m->at.elevation);
        size_t k = kind_index(d, m->kind);
        if (m->label) {
            corax_svg_group(svg, NULL, NULL);
            corax_svg_title(svg, m->label);
        }
        if (m->oriented) {
            /* the section's up is the picture's minus y */
            double dx = tick_half * m->along, dy = -tick_half * m->up;
            mark_class(cls, sizeof cls, "tick", k);
            corax_svg_line(svg, x - dx, y - dy, x + dx, y + dy, cls);
        } else {
            mark_class(cls, sizeof cls, "open", k);
            corax_svg_circle(svg, x, y, 3.6, cls);
        }
        if (m->label)
            corax_svg_end_group(svg);
    }
    corax_svg_end_group(svg);
}

/* The legend's height below its top, pixels: its heads, one line a kind, the
 * no-orientation and sample lines when there, the holes and the ticks. */
static double legend_height(const corax_section_drawing *d)
{
    size_t lines = (d->nkind ? d->nkind : 1) + (d->unoriented != 0) +
                   (corax_sample_every(d->nmark, SECTION_MARKS) > 1);
    return 20.0 + 18.0 * (double)lines + 14 + 20 + 3 * 18 + 8 + 18 + 2 * 15 + 10;
}

static void legend(corax_svg *svg, const corax_section_drawing *d, const layout *l,
                   double every)
{
    double x = l->left + l->w + 28, y = l->top + 4;
    char cls[48], t[160];
    corax_svg_group(svg, "legend", NULL);
    corax_svg_text(svg, x, y, "legend-head", "start", "Feature kinds");
    y += 20;
    if (d->nkind == 0) {
        corax_svg_text(svg, x, y, "legend", "start", "none in the slab");
        y += 18;
    }
    for (size_t i = 0; i < d->nkind; i++, y += 18) {
        mark_class(cls, sizeof cls, "tick", i);
        corax_svg_line(svg, x, y - 1, x + 22, y - 9, cls);
        snprintf(t, sizeof t, "%s (%zu)", d->kind[i].name, d->kind[i].count);
        corax_svg_text(svg, x + 32, y - 1, "legend", "start", t);
    }
    if (d->unoriented) {
        mark_class(cls, sizeof cls, "open", NCOLOURS);
        corax_svg_circle(svg, x + 11, y - 5, 3.6, cls);
        corax_svg_text(svg, x + 32, y - 1, "legend", "start", "no orientation");
        y += 18;
    }
    size_t one_in = corax_sample_every(d->nmark, SECTION_MARKS);
    if (one_in > 1) {
        snprintf(t, sizeof t, "%zu of %zu drawn (a sample)", corax_sample_count(d->nmark, one_in),
                 d->nmark);
        corax_svg_text(svg, x, y, "legend", "start", t);
        y += 18;
    }
    y += 14;
    corax_svg_text(svg, x, y, "legend-head", "start", "Holes");
    y += 20;
    corax_svg_line(svg, x, y - 5, x + 22, y - 5, "in");
    corax_svg_text(svg, x + 32, y - 1, "legend", "start", "in the slab");
    y += 18;
    corax_svg_line(svg, x, y - 5, x + 22, y - 5, "out");
    corax_svg_text(svg, x + 32, y - 1, "legend", "start", "outside the slab");
    y += 18;
    corax_svg_line(svg, x + 11, y - 9, x + 11, y - 1, "depth");
    snprintf(t, sizeof t, "depth every %g m", every);
    corax_svg_text(svg, x + 32, y - 1, "legend", "start", t);
    y += 26;
    corax_svg_text(svg, x, y, "legend-head", "start", "Ticks");
    y += 18;
    corax_svg_text(svg, x, y, "legend", "start", "at the apparent dip in");
    y += 15;
    corax_svg_text(svg, x, y, "legend", "start", "this section, through");
    y += 15;
    corax_svg_text(svg, x, y, "legend", "start", "where the structure lies");
    corax_svg_end_group(svg);
}

/* The title's first line as the title, the rest as a subtitle. */
static void title_lines(corax_svg *svg, const layout *l, const char *title)
{
    const char *nl = strchr(title, '\n');
    if (!nl) {
        corax_svg_text(svg, l->left, 28, "title", "start", title);
        return;
    }
    char head[256];
    snprintf(head, sizeof head, "%.*s", (int)(nl - title), title);
    corax_svg_text(svg, l->left, 24, "title", "start", head);
    corax_svg_text(svg, l->left, 43, "subtitle", "start", nl + 1);
}

/* The footer and the caution, broken into lines that fit the page (at about
 * 5.8 pixels a character): at most 6 lines of up to 255 bytes. */
enum { FOOTER_LINES = 6 };
typedef char footer_lines[FOOTER_LINES][256];

static int wrap(footer_lines out, int n, const char *text, double width)
{
    size_t fit = (size_t)fmax(width / 5.8, 40.0);
    if (fit > 250)
        fit = 250;
    while (*text && n < FOOTER_LINES) {
        size_t len = strlen(text), cut = len;
        if (len > fit) { /* break at the last blank that fits */
            cut = fit;
            while (cut > fit / 2 && text[cut] != ' ')
                cut--;
        }
        snprintf(out[n++], sizeof out[0], "%.*s", (int)cut, text);
        text += cut;
        while (*text == ' ')
            text++;
    }
    return n;
}

static const char caution[] =
    "Results must be reviewed by a competent person; local codes and licensed practice prevail.";

corax_svg *corax_section_drawing_render(const corax_section_drawing *d, const char *title,
                                        const char *footer)
{
    layout l = lay_out(d);
    double width = fmax(l.left + l.w + MARGIN_RIGHT, 820.0);
    footer_lines lines;
    int nlines = wrap(lines, footer ? wrap(lines, 0, footer, width - l.left - 20) : 0, caution,
                      width - l.left - 20);
    double height = fmax(l.top + l.h + MARGIN_BOTTOM + 15.0 * (nlines - 2),
                         l.top + 4 + legend_height(d));
    corax_svg *svg = corax_svg_new(width, height);
    if (!svg)
        return NULL;
    style(svg);
    corax_svg_rect(svg, 0, 0, width, height, "page"); /* an opaque page */
    corax_svg_raw(svg, "<defs><clipPath id=\"plot-area\"><rect x=\"%.2f\" y=\"%.2f\" "
                       "width=\"%.2f\" height=\"%.2f\"/></clipPath></defs>\n",
                  l.left, l.top, l.w, l.h);
    title_lines(svg, &l, title ? title : "Cross-section");
    axes(svg, &l);
    ends(svg, &l, &d->section);
    corax_svg_raw(svg, "<g clip-path=\"url(#plot-area)\">\n");
    holes(svg, d, &l);
    marks(svg, d, &l);
    corax_svg_end_group(svg);
    hole_names(svg, d, &l);
    if (d->nmark == 0)
        corax_svg_text(svg, l.left + l.w / 2, l.top + l.h / 2, "note", "middle",
                       "No structures lie in this slab");
    legend(svg, d, &l, depth_interval(d, &l));
    scale_bar(svg, &l, d->ratio);
    for (int i = 0; i < nlines; i++)
        corax_svg_text(svg, l.left, height - 15.0 * (nlines - i), "footer", "start", lines[i]);
    return svg;
}
