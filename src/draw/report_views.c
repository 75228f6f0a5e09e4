/* draw: the report's plan and section of the whole program. Both are the
 * same drawing seen two ways: every hole's path, its collar and name, and
 * the findings at their places down the holes (a stretch as a band along
 * the path), to one scale across and up. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "draw/markup.h"
#include "draw/report_int.h"

/* Page geometry, pixels. */
enum { LEFT = 84, TOP = 34, RIGHT = 26, BOTTOM = 80 };
static const double max_w = 1180.0, max_h = 800.0;

/* How world points fall on the page: a plan (x east, y north) or a vertical
 * section along an azimuth through an origin (distance along, elevation). */
typedef struct view {
    int plan;
    double azimuth;          /* section: radians, the right-hand end */
    corax_vec3 origin;       /* section: distances are measured from here */
    double h0, h1, v0, v1;   /* the world window, across and up, metres */
    double mpp;              /* metres per pixel, both ways */
    double left, top, w, h;  /* the plot on the page */
} view;

static void world(const view *v, corax_vec3 p, double *across, double *up)
{
    if (v->plan) {
        *across = p.x;
        *up = p.y;
    } else {
        *across = (p.x - v->origin.x) * sin(v->azimuth) + (p.y - v->origin.y) * cos(v->azimuth);
        *up = p.z;
    }
}

static void on_page(const view *v, corax_vec3 p, double *x, double *y)
{
    double a, b;
    world(v, p, &a, &b);
    *x = v->left + (a - v->h0) / v->mpp;
    *y = v->top + (v->v1 - b) / v->mpp;
}

double corax_report_nice(double x)
{
    static const double m[] = {1.0, 2.0, 2.5, 5.0};
    double p = pow(10.0, floor(log10(x)));
    for (int i = 0; i < 4; i++)
        if (m[i] * p >= x * (1 - 1e-12))
            return m[i] * p;
    return 10.0 * p;
}

double corax_report_text_width(const char *text, double px)
{
    size_t chars = 0;
    for (const unsigned char *p = (const unsigned char *)text; *p; p++)
        chars += (*p & 0xc0) != 0x80; /* count characters, not UTF-8 bytes */
    return 0.6 * px * (double)chars;
}

void corax_report_symbol(corax_svg *svg, corax_severity s, double x, double y, double size)
{
    static const char *const cls[REPORT_SEVERITIES] = {"sym sev-n", "sym sev-w", "sym sev-e"};
    corax_palette_symbol(svg, corax_report_look[s].shape, x, y, size, cls[s]);
}

/* ---- the window ---- */

typedef struct extent {
    double a0, a1, b0, b1;
} extent;

static void take(const view *v, extent *e, corax_vec3 p)
{
    double a, b;
    world(v, p, &a, &b);
    e->a0 = fmin(e->a0, a);
    e->a1 = fmax(e->a1, a);
    e->b0 = fmin(e->b0, b);
    e->b1 = fmax(e->b1, b);
}

/* Everything drawn: the paths, and the places of the findings, which may lie
 * past a hole's recorded end. */
static void lay_out(const report_model *m, view *v)
{
    extent e = {HUGE_VAL, -HUGE_VAL, HUGE_VAL, -HUGE_VAL};
    corax_vec3 at;
    for (size_t i = 0; i < m->nhole; i++) {
        const report_hole *h = &m->hole[i];
        for (size_t k = 0; k < h->ntrace; k++)
            take(v, &e, h->trace[k].at);
        for (size_t k = 0; k < h->nfinding && h->traced; k++) {
            const corax_finding *f = &m->finding[h->finding[k]];
            if (corax_report_hole_at(h, f->depth, &at))
                take(v, &e, at);
            if (isfinite(f->depth_to) && corax_report_hole_at(h, f->depth_to, &at))
                take(v, &e, at);
        }
    }
    if (e.a0 > e.a1) { /* nothing to show: a frame about the origin */
        e = (extent){-50.0, 50.0, -50.0, 50.0};
    }
    double pad = fmax(0.06 * fmax(e.a1 - e.a0, e.b1 - e.b0), 10.0);
    v->h0 = e.a0 - pad;
    v->h1 = e.a1 + pad;
    v->v0 = e.b0 - pad;
    v->v1 = e.b1 + pad * (v->plan ? 1.0 : 1.6); /* room for the names above the collars */
    v->mpp = fmax((v->h1 - v->h0) / max_w, (v->v1 - v->v0) / max_h);
    v->left = LEFT;
    v->top = TOP;
    v->w = (v->h1 - v->h0) / v->mpp;
    v->h = (v->v1 - v->v0) / v->mpp;
}

/* ---- axes, scale, north ---- */

static void metres(char *buf, double v)
{
    corax_format_short(buf, fabs(v) < 1e-9 ? 0.0 : v, 1);
}

static void axes(corax_svg *svg, const view *v, const char *across, const char *up)
{
    char t[48];
    double step = corax_report_nice(90.0 * v->mpp), right = v->left + v->w,
           bottom = v->top + v->h;
    corax_svg_group(svg, "axes", NULL);
    for (double b = ceil(v->v0 / step) * step; b <= v->v1; b += step) {
        double y = v->top + (v->v1 - b) / v->mpp;
        corax_svg_line(svg, v->left, y, right, y, "gridline");
        metres(t, b);
        corax_svg_text(svg, v->left - 7, y + 4, "axis-num", "end", t);
    }
    for (double a = ceil(v->h0 / step) * step; a <= v->h1; a += step) {
        double x = v->left + (a - v->h0) / v->mpp;
        corax_svg_line(svg, x, v->top, x, bottom, "gridline");
        metres(t, a);
        corax_svg_text(svg, x, bottom + 16, "axis-num", "middle", t);
    }
    corax_svg_rect(svg, v->left, v->top, v->w, v->h, "plot-edge");
    corax_svg_raw(svg, "<text class=\"axis-name\" text-anchor=\"middle\" "
                       "transform=\"translate(%.2f %.2f) rotate(-90)\">",
                  v->left - 62, v->top + v->h / 2);
    corax_svg_escaped(svg, up);
    corax_svg_raw(svg, "</text>\n");
    corax_svg_text(svg, v->left + v->w / 2, bottom + 34, "axis-name", "middle", across);
    corax_svg_end_group(svg);
}

/* A bar of a round length near a sixth of the plot, in its lower left corner. */
static void scale_bar(corax_svg *svg, const view *v)
{
    double len = corax_report_nice(fmin(v->w, 600.0) / 6.0 * v->mpp), w = len / v->mpp;
    double x = v->left + 14, y = v->top + v->h - 30;
    char t[64], n[40];
    corax_svg_rect(svg, x - 8, y - 8, w + 70, 34, "backing");
    for (int i = 0; i < 4; i++)
        corax_svg_rect(svg, x + i * w / 4, y, w / 4, 5, i % 2 ? "bar-light" : "bar-dark");
    corax_format_short(n, len, 1);
    snprintf(t, sizeof t, "%s m", n);
    corax_svg_text(svg, x, y + 18, "axis-num", "middle", "0");
    corax_svg_text(svg, x + w, y + 18, "axis-num", "middle", t);
}

static void north_arrow(corax_svg *svg, const view *v)
{
    double x = v->left + v->w - 30, y = v->top + 18;
    double head[8] = {x, y, x + 9, y + 30, x, y + 24, x - 9, y + 30};
    corax_svg_rect(svg, x - 16, y - 8, 32, 58, "backing");
    corax_svg_poly(svg, head, 4, 1, "arrow");
    corax_svg_text(svg, x, y + 46, "arrow-n", "middle", "N");
}

/* The section's azimuth over each end, and which section it is between. */
static void section_ends(corax_svg *svg, const view *v)
{
    char t[160];
    double a = corax_wrap_degrees(corax_deg(v->azimuth), 0);
    snprintf(t, sizeof t, "vertical section %03.0f\xc2\xb0\xe2\x80\x93%03.0f\xc2\xb0 through "
             "the program's centre, looking toward %03.0f\xc2\xb0",
             corax_wrap_degrees(a + 180.0, 0), a, corax_wrap_degrees(a - 90.0, 0));
    corax_svg_text(svg, v->left + v->w / 2, v->top - 10, "axis-name", "middle", t);
    snprintf(t, sizeof t, "%03.0f\xc2\xb0", corax_wrap_degrees(corax_deg(v->azimuth) + 180.0, 0));
    corax_svg_text(svg, v->left, v->top - 10, "end-azimuth", "start", t);
    snprintf(t, sizeof t, "%03.0f\xc2\xb0", corax_wrap_degrees(corax_deg(v->azimuth), 0));
    corax_svg_text(svg, v->left + v->w, v->top - 10, "end-azimuth", "end", t);
}

/* ---- holes ---- */

/* Douglas-Peucker (1973): mark in keep[] the points of xy[lo..hi] that the
 * line needs to stay within `tol` pixels of every point (the ends are kept
 * by the caller). */
static void simplify(const double *xy, unsigned char *keep, size_t lo, size_t hi, double tol)
{
    while (hi > lo + 1) {
        double ax = xy[2 * lo], ay = xy[2 * lo + 1], dx = xy[2 * hi] - ax, dy = xy[2 * hi + 1] - ay;
        double len = hypot(dx, dy), far = -1.0;
        size_t at = lo;
        for (size_t k = lo + 1; k < hi; k++) {
            double px = xy[2 * k] - ax, py = xy[2 * k + 1] - ay;
            double d = len > 0.0 ? fabs(px * dy - py * dx) / len : hypot(px, py);
            if (d > far) {
                far = d;
                at = k;
            }
        }
        if (far <= tol)
            return;
        keep[at] = 1;
        simplify(xy, keep, lo, at, tol); /* the shorter side would bound the depth; */
        lo = at;                         /* paths hold a few hundred points */
    }
}

/* The polyline through xy[0..n), simplified to within a quarter of a pixel
 * (a point that bends it by less adds nothing to the picture), in pieces of
 * up to 256 points that meet end to end; keep[] is n bytes of scratch. */
static void simple_line(corax_svg *svg, const double *xy, unsigned char *keep, size_t n,
                        const char *cls)
{
    enum { PIECE = 256 };
    double piece[2 * PIECE];
    memset(keep, 0, n);
    keep[0] = keep[n - 1] = 1;
    simplify(xy, keep, 0, n - 1, 0.25);
    size_t m = 0;
    for (size_t q = 0; q < n; q++) {
        if (!keep[q])
            continue;
        piece[2 * m] = xy[2 * q];
        piece[2 * m + 1] = xy[2 * q + 1];
        if (++m == PIECE) { /* a full piece: the next starts where it ends */
            corax_svg_poly(svg, piece, m, 0, cls);
            piece[0] = piece[2 * m - 2];
            piece[1] = piece[2 * m - 1];
            m = 1;
        }
    }
    if (m > 1)
        corax_svg_poly(svg, piece, m, 0, cls);
}

/* A hole's path in runs, solid where surveyed and dashed where projected,
 * so that a program of many holes draws each in a few points. CORAX_ENOMEM. */
static corax_status hole_path(corax_svg *svg, const view *v, const report_hole *h)
{
    double *xy = malloc(2 * (h->ntrace + 1) * sizeof *xy);
    unsigned char *keep = malloc(h->ntrace + 1);
    if (!xy || !keep) {
        free(xy);
        free(keep);
        return CORAX_ENOMEM;
    }
    for (size_t q = 0; q < h->ntrace; q++)
        on_page(v, h->trace[q].at, &xy[2 * q], &xy[2 * q + 1]);
    for (size_t i = 0; i + 1 < h->ntrace;) {
        int surveyed = h->trace[i + 1].surveyed;
        size_t j = i + 1; /* the run of segments that are surveyed, or not */
        while (j + 1 < h->ntrace && h->trace[j + 1].surveyed == surveyed)
            j++;
        simple_line(svg, xy + 2 * i, keep, j - i + 1, surveyed ? "path" : "path projected");
        i = j;
    }
    free(xy);
    free(keep);
    return CORAX_OK;
}

/* Hole names beside their collars, each where it overlaps no other name
 * and, where it can, crosses no hole's path, collar or finding mark. */
typedef struct box {
    double x0, y0, x1, y1;
} box;

static int overlaps(const box *a, const box *b)
{
    return a->x0 < b->x1 && b->x0 < a->x1 && a->y0 < b->y1 && b->y0 < a->y1;
}

static int clear_of(const box *b, const box *placed, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (overlaps(b, &placed[i]))
            return 0;
    return 1;
}

/* Whether the segment from (x1, y1) to (x2, y2) meets the box (Liang and
 * Barsky's clipping: the part of the segment inside each edge's half-plane). */
static int segment_meets(double x1, double y1, double x2, double y2, const box *b)
{
    double dx = x2 - x1, dy = y2 - y1, t0 = 0.0, t1 = 1.0;
    const double p[4] = {-dx, dx, -dy, dy};
    const double q[4] = {x1 - b->x0, b->x1 - x1, y1 - b->y0, b->y1 - y1};
    for (int k = 0; k < 4; k++) {
        if (p[k] == 0.0) {
            if (q[k] < 0.0)
                return 0; /* parallel to the edge, outside it */
            continue;
        }
        double t = q[k] / p[k];
        if (p[k] < 0.0 && t > t0)
            t0 = t;
        else if (p[k] > 0.0 && t < t1)
            t1 = t;
        if (t0 > t1)
            return 0;
    }
    return 1;
}

/* What a name should not cover: the holes' paths on the page (polylines,
 * one after another: path[k] starts at point start[k]) and the marks
 * (collars and findings, as boxes). */
typedef struct obstacles {
    double *xy;
    size_t *start, npaths, npoints;
    box *extent; /* each path's bounding box */
    box *mark;
    size_t nmarks;
} obstacles;

static size_t hits(const obstacles *o, const box *b)
{
    size_t n = 0;
    for (size_t k = 0; k < o->npaths; k++) {
        if (!overlaps(b, &o->extent[k])) /* most paths are nowhere near */
            continue;
        size_t end = k + 1 < o->npaths ? o->start[k + 1] : o->npoints;
        for (size_t i = o->start[k]; i + 1 < end; i++) {
            const double *a = &o->xy[2 * i];
            if (segment_meets(a[0], a[1], a[2], a[3], b)) {
                n++;
                break; /* a path counts once */
            }
        }
    }
    for (size_t i = 0; i < o->nmarks; i++)
        n += overlaps(b, &o->mark[i]);
    return n;
}

/* Right, left, above or below the collar, else stacked higher above it: of
 * the places clear of every name placed so far, the first that covers
 * nothing, else the one that covers least. */
static void hole_name(corax_svg *svg, double x, double y, const char *name, box *placed,
                      size_t *nplaced, const obstacles *o)
{
    static const double spot[][2] = {{8, 4}, {-11, 4}, {0, -9}, {0, 17},
                                     {8, -9}, {8, 17}, {-11, -9}, {-11, 17}};
    enum { SPOTS = sizeof spot / sizeof spot[0], STACKED = 8 };
    /* the names are bold: wider than the width of plain text says */
    double w = 1.1 * corax_report_text_width(name, 11.5), hgt = 12;
    box best = {0, 0, 0, 0};
    double best_base = y;
    size_t best_hits = (size_t)-1;
    for (int k = 0; k < SPOTS + STACKED && best_hits > 0; k++) {
        double dx = k < SPOTS ? spot[k][0] : 0.0;
        double base = y + (k < SPOTS ? spot[k][1] : -9.0 - 13.0 * (k - SPOTS + 1));
        double x0 = dx > 0 ? x + dx : dx < 0 ? x + dx - w : x - w / 2;
        box b = {x0, base - hgt + 2, x0 + w, base + 2};
        int last = k == SPOTS + STACKED - 1;
        if (!clear_of(&b, placed, *nplaced) && !(last && best_hits == (size_t)-1))
            continue;
        box room = {b.x0 - 2, b.y0 - 1, b.x1 + 2, b.y1 + 1}; /* and a little air */
        size_t n = hits(o, &room);
        if (n < best_hits) {
            best = b;
            best_base = base;
            best_hits = n;
        }
    }
    placed[(*nplaced)++] = best;
    corax_svg_text(svg, best.x0, best_base, "hole-name", "start", name);
}

/* The collars (drawn under the findings' marks). */
static void collars(corax_svg *svg, const report_model *m, const view *v)
{
    corax_svg_group(svg, "collars", NULL);
    for (size_t i = 0; i < m->nhole; i++) {
        const report_hole *h = &m->hole[i];
        if (!h->ntrace || !h->listed) /* the page's budget: see REPORT_LISTED_HOLES */
            continue;
        double x, y;
        on_page(v, h->trace[0].at, &x, &y);
        corax_svg_circle(svg, x, y, 3.6, h->traced ? "collar" : "collar untraced");
    }
    corax_svg_end_group(svg);
}

/* Where a finding's mark goes on the page. */
static void finding_at(const view *v, const report_hole *h, const corax_finding *f, double *x,
                       double *y)
{
    double at_depth = f->depth;
    if (h->traced && isfinite(f->depth) && isfinite(f->depth_to))
        at_depth = 0.5 * (f->depth + f->depth_to);
    corax_vec3 at;
    corax_report_hole_at(h, h->traced ? at_depth : 0.0, &at);
    on_page(v, at, x, y);
}

static box around(double x, double y, double r)
{
    return (box){x - r, y - r, x + r, y + r};
}

/* The paths, collars and marks a name should keep off; CORAX_ENOMEM. */
static corax_status gather_obstacles(const report_model *m, const view *v, obstacles *o)
{
    memset(o, 0, sizeof *o);
    size_t points = 0, marks = 0;
    for (size_t i = 0; i < m->nhole; i++) {
        const report_hole *h = &m->hole[i];
        points += h->drawn ? h->ntrace : 0;
        marks += (h->ntrace && h->listed) + (h->path ? h->nshown : 0);
    }
    o->xy = malloc((points ? points : 1) * 2 * sizeof *o->xy);
    o->start = malloc((m->nhole ? m->nhole : 1) * sizeof *o->start);
    o->extent = malloc((m->nhole ? m->nhole : 1) * sizeof *o->extent);
    o->mark = malloc((marks ? marks : 1) * sizeof *o->mark);
    if (!o->xy || !o->start || !o->extent || !o->mark)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < m->nhole; i++) {
        const report_hole *h = &m->hole[i];
        if (h->drawn && h->ntrace) {
            box *e = &o->extent[o->npaths];
            o->start[o->npaths++] = o->npoints;
            *e = (box){INFINITY, INFINITY, -INFINITY, -INFINITY};
            for (size_t q = 0; q < h->ntrace; q++, o->npoints++) {
                double *xy = &o->xy[2 * o->npoints];
                on_page(v, h->trace[q].at, &xy[0], &xy[1]);
                *e = (box){fmin(e->x0, xy[0]), fmin(e->y0, xy[1]), fmax(e->x1, xy[0]),
                           fmax(e->y1, xy[1])};
            }
        }
        double x, y;
        if (h->ntrace && h->listed) {
            on_page(v, h->trace[0].at, &x, &y);
            o->mark[o->nmarks++] = around(x, y, 4.0);
        }
        for (size_t k = 0; k < h->nshown && h->path; k++) {
            finding_at(v, h, &m->finding[h->shown[k]], &x, &y);
            o->mark[o->nmarks++] = around(x, y, 6.0);
        }
    }
    return CORAX_OK;
}

static void obstacles_free(obstacles *o)
{
    free(o->xy);
    free(o->start);
    free(o->extent);
    free(o->mark);
}

/* The names of the holes whose figures the page draws, over everything
 * else; CORAX_ENOMEM. */
static corax_status names(corax_svg *svg, const report_model *m, const view *v)
{
    obstacles o;
    box *placed = malloc((m->nhole + 1) * sizeof *placed);
    size_t nplaced = 0;
    corax_status st = placed ? gather_obstacles(m, v, &o) : CORAX_ENOMEM;
    if (st == CORAX_OK) {
        corax_svg_group(svg, "names", NULL);
        for (size_t i = 0; i < m->nhole; i++) {
            const report_hole *h = &m->hole[i];
            if (!h->ntrace || !h->listed || !h->figures)
                continue;
            double x, y;
            on_page(v, h->trace[0].at, &x, &y);
            hole_name(svg, x, y, h->name, placed, &nplaced, &o);
        }
        corax_svg_end_group(svg);
    }
    if (placed)
        obstacles_free(&o);
    free(placed);
    return st;
}

/* ---- findings ---- */

size_t corax_report_depths(char *buf, const corax_finding *f)
{
    if (isnan(f->depth))
        return (size_t)sprintf(buf, "whole hole");
    size_t n = corax_format_short(buf, f->depth, 2);
    if (isfinite(f->depth_to)) {
        memcpy(buf + n, "\xe2\x80\x93", 3); /* an en dash */
        n += 3;
        n += corax_format_short(buf + n, f->depth_to, 2);
    }
    return n;
}

void corax_report_finding_title(corax_svg *svg, const corax_finding *f, int with_hole)
{
    char where[REPORT_DEPTHS];
    corax_report_depths(where, f);
    corax_svg_raw(svg, "<title>");
    if (with_hole) {
        corax_svg_escaped(svg, f->hole);
        corax_svg_raw(svg, ", ");
    }
    corax_svg_raw(svg, "%s%s, %s (", where, isnan(f->depth) ? "" : " m",
                  corax_severity_name(f->severity));
    corax_svg_escaped(svg, f->check);
    corax_svg_raw(svg, "): ");
    corax_svg_escaped(svg, f->message);
    corax_svg_raw(svg, "</title>\n");
}

/* The stretch from depth a to b down the hole, as a band along its path:
 * a point every 2 m or so, at most 201. */
static void stretch(corax_svg *svg, const view *v, const report_hole *h, double a, double b,
                    corax_severity s)
{
    static const char *const cls[REPORT_SEVERITIES] = {"stretch sev-n", "stretch sev-w",
                                                       "stretch sev-e"};
    enum { MOST = 200 };
    double lo = fmin(a, b), hi = fmax(a, b), xy[2 * (MOST + 1)];
    unsigned char keep[MOST + 1];
    int steps = (int)fmin(MOST, ceil((hi - lo) / 2.0) + 1);
    for (int k = 0; k <= steps; k++) {
        corax_vec3 at;
        corax_report_hole_at(h, lo + (hi - lo) * k / steps, &at);
        on_page(v, at, &xy[2 * k], &xy[2 * k + 1]);
    }
    simple_line(svg, xy, keep, (size_t)steps + 1, cls[s]);
}

/* Notes first, errors last, so that the worst stays on top. */
static void findings(corax_svg *svg, const report_model *m, const view *v)
{
    corax_svg_group(svg, "findings", NULL);
    for (int s = CORAX_NOTE; s <= CORAX_ERROR; s++)
        for (size_t i = 0; i < m->nhole; i++) {
            const report_hole *h = &m->hole[i];
            for (size_t k = 0; k < h->nshown && h->path; k++) { /* those in the tables */
                const corax_finding *f = &m->finding[h->shown[k]];
                if ((int)f->severity != s)
                    continue;
                corax_svg_group(svg, NULL, NULL);
                corax_report_finding_title(svg, f, 1);
                if (h->traced && isfinite(f->depth) && isfinite(f->depth_to))
                    stretch(svg, v, h, f->depth, f->depth_to, f->severity);
                double x, y;
                finding_at(v, h, f, &x, &y);
                corax_report_symbol(svg, f->severity, x, y, 11);
                corax_svg_end_group(svg);
            }
        }
    corax_svg_end_group(svg);
}

/* ---- the key ---- */

corax_status corax_report_key_scratch(report_key *k, double left, double right)
{
    *k = (report_key){corax_svg_new(1, 1), left, right, left, 0.0};
    return k->svg ? CORAX_OK : CORAX_ENOMEM;
}

double corax_report_key_item(report_key *k, double symbol, const char *words)
{
    double w = symbol + corax_report_text_width(words, 12);
    if (k->x + w > k->right && k->x > k->left) {
        k->x = k->left;
        k->y += 20;
    }
    double x = k->x;
    corax_svg_text(k->svg, x + symbol, k->y + 4, "key", "start", words);
    k->x += w + 20;
    return x;
}

void corax_report_key_severities(report_key *k)
{
    static const char *const words[REPORT_SEVERITIES] = {"note", "warning", "error"};
    for (int s = CORAX_ERROR; s >= CORAX_NOTE; s--) {
        double x = corax_report_key_item(k, 15, words[s]);
        corax_report_symbol(k->svg, (corax_severity)s, x + 5, k->y, 10);
    }
}

static void view_key(report_key *k)
{
    corax_report_key_severities(k);
    double x = corax_report_key_item(k, 32, "a finding's stretch");
    corax_svg_line(k->svg, x + 2, k->y, x + 24, k->y, "stretch sev-w");
    x = corax_report_key_item(k, 32, "surveyed path");
    corax_svg_line(k->svg, x, k->y, x + 26, k->y, "path");
    x = corax_report_key_item(k, 32, "projected past the survey");
    corax_svg_line(k->svg, x, k->y, x + 26, k->y, "path projected");
    x = corax_report_key_item(k, 15, "collar");
    corax_svg_circle(k->svg, x + 5, k->y, 3.6, "collar");
    x = corax_report_key_item(k, 15, "collar of a hole without a path");
    corax_svg_circle(k->svg, x + 5, k->y, 3.6, "collar untraced");
}

/* ---- the pictures ---- */

static corax_status draw(const report_model *m, view *v, corax_svg **out)
{
    lay_out(m, v);
    double width = fmax(v->left + v->w + RIGHT, 900.0);
    report_key key;
    if (corax_report_key_scratch(&key, v->left, width - RIGHT) != CORAX_OK)
        return CORAX_ENOMEM;
    view_key(&key);
    corax_svg_free(key.svg);
    double height = v->top + v->h + BOTTOM + key.y;
    corax_svg *svg = corax_svg_new(width, height);
    if (!svg)
        return CORAX_ENOMEM;
    char across[96];
    if (v->plan) {
        axes(svg, v, "Easting (m)", "Northing (m)");
    } else {
        snprintf(across, sizeof across, "Distance toward %03.0f\xc2\xb0 from the program's centre (m)",
                 corax_wrap_degrees(corax_deg(v->azimuth), 0));
        axes(svg, v, across, "Elevation (m)");
        section_ends(svg, v);
    }
    corax_svg_group(svg, "holes", NULL);
    corax_status st = CORAX_OK;
    for (size_t i = 0; i < m->nhole && st == CORAX_OK; i++)
        if (m->hole[i].drawn)
            st = hole_path(svg, v, &m->hole[i]);
    corax_svg_end_group(svg);
    collars(svg, m, v);
    findings(svg, m, v);
    if (st == CORAX_OK)
        st = names(svg, m, v);
    scale_bar(svg, v);
    if (v->plan)
        north_arrow(svg, v);
    key = (report_key){svg, v->left, width - RIGHT, v->left, v->top + v->h + 64};
    view_key(&key);
    if (st != CORAX_OK || !corax_svg_finish(svg, NULL)) {
        corax_svg_free(svg);
        return CORAX_ENOMEM;
    }
    *out = svg;
    return CORAX_OK;
}

corax_status corax_report_plan(const report_model *m, corax_svg **out)
{
    view v = {0};
    v.plan = 1;
    *out = NULL;
    return draw(m, &v, out);
}

/* The section runs along the program's longest horizontal spread: the
 * principal axis of every point of every path, through their centre;
 * east-west when they spread alike every way. Whole degrees in [0, 180). */
static void section_line(const report_model *m, double *azimuth, corax_vec3 *centre)
{
    double n = 0, sx = 0, sy = 0, sz = 0;
    for (size_t i = 0; i < m->nhole; i++)
        for (size_t k = 0; k < m->hole[i].ntrace; k++) {
            corax_vec3 p = m->hole[i].trace[k].at;
            n++;
            sx += p.x;
            sy += p.y;
            sz += p.z;
        }
    *centre = n > 0 ? (corax_vec3){sx / n, sy / n, sz / n} : (corax_vec3){0, 0, 0};
    double xx = 0, yy = 0, xy = 0;
    for (size_t i = 0; i < m->nhole; i++)
        for (size_t k = 0; k < m->hole[i].ntrace; k++) {
            double dx = m->hole[i].trace[k].at.x - centre->x, dy = m->hole[i].trace[k].at.y - centre->y;
            xx += dx * dx;
            yy += dy * dy;
            xy += dx * dy;
        }
    /* the major axis makes angle t with east; its azimuth is 90 degrees - t */
    double t = 0.5 * atan2(2.0 * xy, xx - yy);
    double deg = fmod(round(90.0 - corax_deg(t)) + 360.0, 180.0);
    if (hypot(xx - yy, 2.0 * xy) <= 1e-6 * n + 1e-9 * (xx + yy)) /* alike to a millimetre */
        deg = 90.0;
    *azimuth = corax_rad(deg);
}

corax_status corax_report_section(const report_model *m, double *azimuth, corax_svg **out)
{
    view v = {0};
    section_line(m, &v.azimuth, &v.origin);
    *azimuth = v.azimuth;
    *out = NULL;
    return draw(m, &v, out);
}
