/* draw: what the report shows of each hole. A strip with depth down the page
 * (survey stations, the readings' alpha and beta by feature kind, and the
 * findings as marks and bars at their depths), and a stereonet of the
 * readings with those in flagged stretches picked out. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/stereonet.h"
#include "draw/markup.h"
#include "draw/report_int.h"

/* The strip's lanes, left to right: x and width in pixels. */
enum { AXIS_X = 58, SURVEY_X = 64, ALPHA_X = 190, ALPHA_W = 150, BETA_X = 356, BETA_W = 180,
       FIND_X = 552, FIND_W = 126, STRIP_W = 700, PLOT_TOP = 50 };
static const double glyph = 7.0; /* a reading's symbol, pixels across */

typedef struct strip {
    corax_svg *svg;
    const report_model *m;
    const report_hole *h;
    const report_readings *rr; /* its readings */
    double depth;  /* the depth at the foot of the plot, metres */
    double ppm;    /* pixels per metre down the page */
    double bottom; /* the plot's foot, pixels */
} strip;

/* Depth on the page; a depth outside the plot (a negative one, say) sits at
 * its nearer edge. */
static double y_of(const strip *s, double depth)
{
    return PLOT_TOP + fmin(fmax(depth, 0.0), s->depth) * s->ppm;
}

/* ---- symbols many at a time: one path per kind and lane ---- */

/* A path of many copies of one symbol, opened with the first. */
typedef struct glyphs {
    corax_svg *svg;
    char shape[256]; /* one symbol's outline, relative to its centre */
    const char *cls; /* its classes, with the colour's */
    size_t colour;
    int open;
} glyphs;

/* Append a path step: a letter, then numbers (0 to 2 of them), each short. */
static size_t step(char *buf, size_t used, size_t cap, const char *letter, int count, double a,
                   double b)
{
    char n[48];
    used += (size_t)snprintf(buf + used, cap - used, "%s", letter);
    for (int k = 0; k < count && used < cap - 1; k++) {
        corax_format_short(n, k ? b : a, 1);
        used += (size_t)snprintf(buf + used, cap - used, "%s%s", k ? "," : "", n);
    }
    return used < cap ? used : cap - 1;
}

/* The outline of a shape as relative path steps from its centre: a circle
 * as two arcs, a polygon corner to corner. */
static void glyphs_start(glyphs *g, corax_svg *svg, corax_shape shape, const char *cls,
                         size_t colour)
{
    double xy[2 * CORAX_SHAPE_CORNERS];
    size_t n = corax_palette_corners(shape, glyph, xy), cap = sizeof g->shape, used;
    *g = (glyphs){.svg = svg, .cls = cls, .colour = colour};
    if (shape == CORAX_SHAPE_CIRCLE) {
        double r = hypot(xy[0], xy[1]);
        used = step(g->shape, 0, cap, "m", 2, -r, 0.0);
        used = step(g->shape, used, cap, "a", 2, r, r);
        used = step(g->shape, used, cap, " 0 1 0 ", 2, 2 * r, 0.0);
        used = step(g->shape, used, cap, "a", 2, r, r);
        step(g->shape, used, cap, " 0 1 0 ", 2, -2 * r, 0.0);
        return;
    }
    used = step(g->shape, 0, cap, "m", 2, xy[0], xy[1]);
    for (size_t k = 1; k < n; k++)
        used = step(g->shape, used, cap, "l", 2, xy[2 * k] - xy[2 * k - 2],
                    xy[2 * k + 1] - xy[2 * k - 1]);
    step(g->shape, used, cap, "z", 0, 0.0, 0.0);
}

static void glyph_add(glyphs *g, double x, double y)
{
    if (!g->open)
        corax_svg_raw(g->svg, "<path class=\"%s c%zu\" d=\"", g->cls, g->colour);
    g->open = 1;
    corax_svg_raw(g->svg, "M%.1f,%.1f%s", x, y, g->shape);
}

static void glyphs_end(glyphs *g)
{
    if (g->open)
        corax_svg_raw(g->svg, "\"/>\n");
}

/* ---- the frame ---- */

static void lane_titles(const strip *s)
{
    corax_svg *svg = s->svg;
    corax_svg_text(svg, SURVEY_X, 16, "lane-title", "start", "Survey stations");
    corax_svg_text(svg, SURVEY_X, 32, "lane-note", "start", "azimuth / plunge (\xc2\xb0)");
    corax_svg_text(svg, ALPHA_X, 16, "lane-title", "start", "Alpha (\xc2\xb0)");
    corax_svg_text(svg, BETA_X, 16, "lane-title", "start", "Beta (\xc2\xb0)");
    corax_svg_text(svg, FIND_X, 16, "lane-title", "start", "Findings");
    char t[16];
    for (int a = 0; a <= 90; a += 30) {
        double x = ALPHA_X + ALPHA_W * a / 90.0;
        corax_svg_line(svg, x, PLOT_TOP, x, s->bottom, "lane-grid");
        snprintf(t, sizeof t, "%d", a);
        corax_svg_text(svg, x, PLOT_TOP - 6, "axis-num", "middle", t);
    }
    for (int b = 0; b <= 360; b += 90) {
        double x = BETA_X + BETA_W * b / 360.0;
        corax_svg_line(svg, x, PLOT_TOP, x, s->bottom, "lane-grid");
        snprintf(t, sizeof t, "%d", b);
        corax_svg_text(svg, x, PLOT_TOP - 6, "axis-num", "middle", t);
    }
    corax_svg_rect(svg, ALPHA_X, PLOT_TOP, ALPHA_W, s->bottom - PLOT_TOP, "lane-edge");
    corax_svg_rect(svg, BETA_X, PLOT_TOP, BETA_W, s->bottom - PLOT_TOP, "lane-edge");
    corax_svg_rect(svg, FIND_X, PLOT_TOP, FIND_W, s->bottom - PLOT_TOP, "lane-edge");
}

/* Depth ticks a round number of metres apart, at least 40 pixels. */
static void depth_axis(const strip *s)
{
    corax_svg *svg = s->svg;
    double step = corax_report_nice(40.0 / s->ppm);
    char t[48];
    for (double d = 0.0; d <= s->depth + 1e-9; d += step) {
        double y = y_of(s, d);
        corax_svg_line(svg, AXIS_X, y, FIND_X + FIND_W, y, "depth-grid");
        corax_format_short(t, d, 1);
        corax_svg_text(svg, AXIS_X - 4, y + 4, "axis-num", "end", t);
    }
    corax_svg_raw(svg, "<text class=\"axis-name\" text-anchor=\"middle\" "
                       "transform=\"translate(14 %.2f) rotate(-90)\">Depth down the hole (m)"
                       "</text>\n",
                  0.5 * (PLOT_TOP + s->bottom));
}

/* ---- survey ---- */

static void survey(const strip *s)
{
    corax_svg *svg = s->svg;
    const report_hole *h = s->h;
    double x = SURVEY_X + 10;
    if (!h->path) {
        corax_svg_text(svg, SURVEY_X, PLOT_TOP + 16, "lane-note", "start", "not in the collars");
        return;
    }
    size_t n = corax_hole_station_count(h->path);
    double last = 0.0;
    corax_station st;
    if (n && corax_hole_station(h->path, n - 1, &st, NULL, NULL) == CORAX_OK)
        last = st.depth;
    if (!h->traced) {
        corax_svg_text(svg, SURVEY_X, PLOT_TOP + 16, "lane-note", "start", "no path:");
        corax_svg_text(svg, SURVEY_X, PLOT_TOP + 30, "lane-note", "start", "no stations and");
        corax_svg_text(svg, SURVEY_X, PLOT_TOP + 44, "lane-note", "start", "no collar direction");
        return;
    }
    double end = fmax(h->length, last);
    if (last > 0.0)
        corax_svg_line(svg, x, y_of(s, 0.0), x, y_of(s, last), "path");
    if (end > last)
        corax_svg_line(svg, x, y_of(s, last), x, y_of(s, end), "path projected");
    corax_svg_line(svg, x - 6, y_of(s, end), x + 6, y_of(s, end), "path");
    double label_at = -1e9;
    char t[64];
    for (size_t i = 0; i < n; i++) {
        if (corax_hole_station(h->path, i, &st, NULL, NULL) != CORAX_OK)
            continue;
        double y = y_of(s, st.depth);
        double tri[6] = {x + 1, y, x + 8, y - 4, x + 8, y + 4};
        corax_svg_poly(svg, tri, 3, 1, "station");
        if (y - label_at < 12.0)
            continue; /* too close to the last label */
        snprintf(t, sizeof t, "%.1f / %.1f", corax_wrap_degrees(corax_deg(st.azimuth), 1),
                 corax_deg(st.plunge));
        corax_svg_text(svg, x + 12, y + 4, "station-label", "start", t);
        label_at = y;
    }
    if (n == 0)
        corax_svg_text(svg, x + 12, PLOT_TOP + 16, "lane-note", "start", "collar direction only");
}

/* ---- readings ---- */

static size_t every_kth(size_t n, size_t cap) { return n > cap ? (n + cap - 1) / cap : 1; }

/* Where a reading goes: in the alpha lane (filled when it has a beta, else
 * open), or in the beta lane. */
enum lane { ALPHA_FILLED, ALPHA_OPEN, BETA };

/* The readings of one kind in one lane, as one path. */
static void lane_of_kind(const strip *s, size_t k, enum lane lane, size_t step_by,
                         size_t *drawn)
{
    const report_readings *rr = s->rr;
    glyphs g;
    glyphs_start(&g, s->svg, corax_palette_shape_of(k), lane == ALPHA_OPEN ? "reading open"
                                                                          : "reading",
                 corax_palette_colour_of(k));
    for (size_t j = 0; j < rr->n; j += step_by) {
        const corax_reading *r = &rr->reading[j];
        if (rr->kind[j] != k || !isfinite(r->depth) || !isfinite(r->alpha) ||
            (lane == ALPHA_OPEN) == isfinite(r->beta))
            continue;
        double y = y_of(s, r->depth);
        if (lane == BETA) {
            glyph_add(&g, BETA_X + BETA_W * corax_wrap_degrees(corax_deg(r->beta), 3) / 360.0, y);
            continue;
        }
        glyph_add(&g, ALPHA_X + ALPHA_W * fmin(fmax(corax_deg(r->alpha), 0.0), 90.0) / 90.0, y);
        ++*drawn;
    }
    glyphs_end(&g);
}

/* The readings, kind by kind. */
static void readings(const strip *s, report_strip_counts *c)
{
    const report_readings *rr = s->rr;
    c->step = every_kth(rr->n, REPORT_STRIP_CAP);
    for (size_t j = 0; j < rr->n; j++) {
        const corax_reading *r = &rr->reading[j];
        c->blank += !isfinite(r->depth) || !isfinite(r->alpha);
    }
    for (size_t k = 0; k < s->m->nkind; k++)
        for (int lane = ALPHA_FILLED; lane <= BETA; lane++)
            lane_of_kind(s, k, (enum lane)lane, c->step, &c->drawn);
}

/* ---- findings ---- */

/* Pale bands across the readings where a warning or an error names a
 * stretch: the readings the stereonet picks out. */
static void tints(const strip *s)
{
    const report_hole *h = s->h;
    for (size_t k = 0; k < h->nfinding; k++) {
        const corax_finding *f = &s->m->finding[h->finding[k]];
        if (f->severity < CORAX_WARNING || !isfinite(f->depth))
            continue;
        double lo = f->depth, hi = isfinite(f->depth_to) ? f->depth_to : f->depth;
        double y0 = y_of(s, fmin(lo, hi)), y1 = y_of(s, fmax(lo, hi));
        if (y1 - y0 < 3.0) {
            y0 -= 1.5;
            y1 += 1.5;
        }
        const char *cls = f->severity == CORAX_ERROR ? "tint sev-e" : "tint sev-w";
        corax_svg_rect(s->svg, ALPHA_X, y0, BETA_X + BETA_W - ALPHA_X, y1 - y0, cls);
    }
}

enum { COLUMN = 14, COLUMNS = FIND_W / COLUMN };

/* Each finding in the first column where it overlaps nothing, bars for
 * stretches and symbols for depths; those about the whole hole in a row at
 * the top. */
static void finding_marks(const strip *s)
{
    static const char *const bar[REPORT_SEVERITIES] = {"bar sev-n", "bar sev-w", "bar sev-e"};
    corax_svg *svg = s->svg;
    const report_hole *h = s->h;
    double free_below[COLUMNS];
    for (int c = 0; c < COLUMNS; c++)
        free_below[c] = -1e9;
    size_t whole = 0;
    if (h->nwhole)
        corax_svg_text(svg, FIND_X, 34, "lane-note", "start", "whole hole:");
    for (size_t k = 0; k < h->nfinding; k++) {
        const corax_finding *f = &s->m->finding[h->finding[k]];
        corax_svg_group(svg, NULL, NULL);
        corax_report_finding_title(svg, f, 0);
        if (isnan(f->depth)) {
            double x = FIND_X + 76 + COLUMN * (double)whole;
            if (x > FIND_X + FIND_W) /* more than fit: on top of the last */
                x = FIND_X + FIND_W;
            whole++;
            corax_report_symbol(svg, f->severity, x, 30, 10);
            corax_svg_end_group(svg);
            continue;
        }
        double hi = isfinite(f->depth_to) ? f->depth_to : f->depth;
        double y0 = y_of(s, fmin(f->depth, hi)), y1 = y_of(s, fmax(f->depth, hi));
        int c = 0;
        while (c < COLUMNS - 1 && free_below[c] > y0 - 6)
            c++;
        free_below[c] = fmax(free_below[c], y1 + 6);
        double x = FIND_X + 4 + COLUMN * c + COLUMN / 2.0;
        if (isfinite(f->depth_to))
            corax_svg_rect(svg, x - 3, y0, 6, fmax(y1 - y0, 2.0), bar[f->severity]);
        corax_report_symbol(svg, f->severity, x, y0, 10);
        corax_svg_end_group(svg);
    }
}

/* ---- the key ---- */

static void strip_key(const strip *s, report_key *k)
{
    const report_model *m = s->m;
    char t[128], cls[32];
    for (size_t i = 0; i < m->nkind; i++) { /* the kinds of this hole, with their counts */
        size_t count = 0;
        for (size_t j = 0; j < s->rr->n; j++)
            count += s->rr->kind[j] == i;
        if (!count)
            continue;
        snprintf(t, sizeof t, "%s (%zu)", *m->kind[i] ? m->kind[i] : "no kind given", count);
        snprintf(cls, sizeof cls, "reading c%zu", corax_palette_colour_of(i));
        double x = corax_report_key_item(k, 14, t);
        corax_palette_symbol(k->svg, corax_palette_shape_of(i), x + 5, k->y, 9, cls);
    }
    double x = corax_report_key_item(k, 14, "hollow: alpha without beta");
    corax_palette_symbol(k->svg, CORAX_SHAPE_CIRCLE, x + 5, k->y, 9, "reading open c5");
    corax_report_key_severities(k);
    x = corax_report_key_item(k, 28, "a stretch with a warning or error");
    corax_svg_rect(k->svg, x, k->y - 6, 22, 12, "tint sev-w");
}

corax_status corax_report_strip(const report_model *m, const report_hole *h,
                                const report_readings *rr, report_strip_counts *counts,
                                corax_svg **out)
{
    *out = NULL;
    memset(counts, 0, sizeof *counts);
    strip s = {NULL, m, h, rr, 0, 0, 0};
    s.depth = fmax(h->depth_shown, 10.0) * 1.02;
    double plot_h = fmin(fmax(h->depth_shown * 2.2, 320.0), 1000.0);
    s.ppm = plot_h / s.depth;
    s.bottom = PLOT_TOP + plot_h;
    report_key key;
    if (corax_report_key_scratch(&key, 20, STRIP_W - 10) != CORAX_OK)
        return CORAX_ENOMEM;
    strip_key(&s, &key);
    corax_svg_free(key.svg);
    double height = s.bottom + 44 + key.y + 16;
    if (!(s.svg = corax_svg_new(STRIP_W, height)))
        return CORAX_ENOMEM;
    tints(&s);
    depth_axis(&s);
    lane_titles(&s);
    survey(&s);
    readings(&s, counts);
    finding_marks(&s);
    key = (report_key){s.svg, 20, STRIP_W - 10, 20, s.bottom + 38};
    strip_key(&s, &key);
    if (!corax_svg_finish(s.svg, NULL)) {
        corax_svg_free(s.svg);
        return CORAX_ENOMEM;
    }
    *out = s.svg;
    return CORAX_OK;
}

/* ---- the stereonet ---- */

corax_status corax_report_net(const report_model *m, const report_hole *h,
                              const report_readings *rr, size_t index, report_net_counts *counts,
                              corax_svg **out)
{
    *out = NULL;
    memset(counts, 0, sizeof *counts);
    size_t n = rr->n;
    /* poles and lines, each list split: the rest from the front, the
     * flagged from the back */
    corax_vec3 *poles = malloc((n + 1) * sizeof *poles), *lines = malloc((n + 1) * sizeof *lines);
    unsigned char *keep = calloc(n + 1, 1);
    corax_status st = poles && lines && keep ? CORAX_OK : CORAX_ENOMEM;
    corax_result *res = st == CORAX_OK ? malloc((n + 1) * sizeof *res) : NULL;
    if (st == CORAX_OK && !res)
        st = CORAX_ENOMEM;
    size_t hint = 0, rest = 0;
    for (size_t j = 0; j < n && st == CORAX_OK; j++) {
        const corax_reading *r = &rr->reading[j];
        corax_convert_reading(h->path, r, &m->convert, &hint, &res[j]);
        keep[j] = res[j].has_plane || res[j].has_line;
        counts->placed += keep[j];
        counts->unplaced += !keep[j];
        counts->no_beta += !keep[j] && h->traced && isfinite(r->alpha) && !isfinite(r->beta);
        counts->too_steep += !keep[j] &&
                             (res[j].conditions & (CORAX_COND_NO_REFERENCE | CORAX_COND_DIP_ONLY)) &&
                             isfinite(r->beta);
        counts->flagged += keep[j] && rr->flagged[j];
        rest += keep[j] && !rr->flagged[j];
    }
    /* the flagged first, all of them up to the cap; the rest share what is left */
    size_t step_flagged = every_kth(counts->flagged, REPORT_NET_CAP), seen_flagged = 0;
    size_t cap = counts->flagged < REPORT_NET_CAP ? REPORT_NET_CAP - counts->flagged : 0;
    size_t step = every_kth(rest, cap ? cap : 1), seen = 0;
    size_t np[2] = {0, 0}, nl[2] = {0, 0}; /* [0] the rest, [1] flagged */
    for (size_t j = 0; j < n && st == CORAX_OK; j++) {
        if (!keep[j])
            continue;
        int flagged = rr->flagged[j];
        if (flagged ? seen_flagged++ % step_flagged : seen++ % step)
            continue;
        counts->drawn++;
        counts->flagged_drawn += flagged;
        if (res[j].has_plane) {
            size_t at = flagged ? n - 1 - np[1]++ : np[0]++;
            poles[at] = res[j].normal;
        }
        if (res[j].has_line) {
            size_t at = flagged ? n - 1 - nl[1]++ : nl[0]++;
            lines[at] = res[j].line;
        }
    }
    if (st == CORAX_OK && counts->placed) {
        corax_net_set sets[2] = {
            {.name = "elsewhere in the hole", .poles = poles, .npoles = np[0],
             .lines = lines, .nlines = nl[0]},
            {.name = "in a stretch with a warning or error", .poles = poles + n - np[1],
             .npoles = np[1], .lines = lines + n - nl[1], .nlines = nl[1]},
        };
        char title[160], prefix[40];
        snprintf(title, sizeof title, "Readings of %s", h->name);
        snprintf(prefix, sizeof prefix, "hole%zu-net", index);
        corax_net_style style = corax_net_style_default();
        style.grid = 61; /* a small net: a coarser density grid looks as smooth */
        counts->poles = np[0] + np[1];
        counts->contoured = counts->poles >= REPORT_NET_CONTOURS;
        style.contours = counts->contoured;
        style.title = title;
        style.id_prefix = prefix;
        st = corax_stereonet_page(sets, 2, &style, 0, out);
    }
    free(poles);
    free(lines);
    free(keep);
    free(res);
    return st;
}
