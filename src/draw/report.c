/* draw: the QA report, one self-contained HTML page: the caution, the
 * findings about the program as a whole, a summary of the findings by
 * severity, hole and check, a plan and a section of the program with the
 * findings marked, and every hole with its findings, its strip and its
 * stereonet; the caution again at the foot. Inline CSS and SVG only: no
 * script, nothing fetched; the one link out of the page is to the findings
 * table, for what a large program's page leaves out. Every text from the
 * data is escaped. Written through corax_writer: whole or not at
 * all. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/output.h"
#include "draw/markup.h"
#include "draw/report_int.h"

typedef struct page {
    corax_writer *w;
    const report_model *m;
    const corax_report_input *in;
    const char *href; /* the findings table, relative to the page; NULL: not linked */
} page;

static void out(page *p, const char *html) { corax_writer_text(p->w, html, strlen(html)); }

static void sink(void *w, const char *text, size_t n) { corax_writer_text(w, text, n); }

/* Text from the data, escaped. */
static void text(page *p, const char *t) { corax_markup_escape(t ? t : "", sink, p->w); }

/* "the findings table (NAME)", a link when the page can reach it. */
static void findings_link(page *p)
{
    const char *t = p->in->findings_table;
    if (p->href) {
        out(p, "<a href=\"");
        text(p, p->href);
        out(p, "\">the findings table (");
        text(p, t);
        out(p, ")</a>");
    } else if (t && strcmp(t, "-") != 0) {
        out(p, "the findings table (");
        text(p, t);
        out(p, ")");
    } else {
        out(p, "the findings table");
    }
}

/* How the page reaches the findings table: by its name when it sits in the
 * page's folder, by its path when absolute; else not at all. */
static const char *table_href(const char *table, const char *page_path)
{
    if (!table || strcmp(table, "-") == 0)
        return NULL;
    const char *ts = strrchr(table, '/'), *ps = strrchr(page_path, '/');
    size_t td = ts ? (size_t)(ts - table) : 0, pd = ps ? (size_t)(ps - page_path) : 0;
    if (td == pd && strncmp(table, page_path, td) == 0)
        return ts ? ts + 1 : table;
    return table[0] == '/' ? table : NULL;
}

static const char *const severity_class[REPORT_SEVERITIES] = {"sev-n", "sev-w", "sev-e"};
static const char *const severity_plural[REPORT_SEVERITIES] = {"notes", "warnings", "errors"};

static const char caution[] =
    "This report lists what automatic checks found in the data; where it finds nothing, "
    "that does not make the data right. Its results must be reviewed by a competent person "
    "before they feed any decision, such as ground support, pit slopes or drilling near old "
    "workings. Local codes and licensed practice prevail over anything said here.";

/* ---- the style sheet ---- */

static const char css_page[] =
    "*{box-sizing:border-box}\n"
    "body{margin:0;background:#e9ecef;color:#1f2328;"
    "font:15px/1.5 system-ui,'Segoe UI','DejaVu Sans',Arial,sans-serif}\n"
    ".sheet{max-width:1400px;margin:0 auto;background:#fff;padding:28px 36px 40px}\n"
    "a{color:#12467f}\n"
    ".kicker{margin:0;font-size:12px;font-weight:600;letter-spacing:.09em;"
    "text-transform:uppercase;color:#12467f}\n"
    "h1{font-size:30px;margin:2px 0 14px;line-height:1.2}\n"
    "h2{font-size:22px;margin:40px 0 12px;padding-bottom:4px;border-bottom:2px solid #12467f}\n"
    "h3{font-size:17px;margin:22px 0 8px}\n"
    "dl.facts{display:grid;grid-template-columns:max-content 1fr;gap:2px 18px;margin:0;"
    "font-size:14px}\n"
    "dl.facts dt{color:#59636e}dl.facts dd{margin:0}\n"
    "ul.inputs{margin:0;padding:0;list-style:none}\n"
    "code{font-family:ui-monospace,'DejaVu Sans Mono',Menlo,monospace;font-size:13px;"
    "overflow-wrap:anywhere}\n"
    ".caution{margin:20px 0;padding:12px 18px;border:2px solid #a3271e;"
    "border-left-width:12px;background:#fdf4f3}\n"
    ".caution h2{margin:0 0 4px;padding:0;border:0;font-size:17px;color:#a3271e}\n"
    ".caution p{margin:0;max-width:90ch}\n"
    "nav.contents{font-size:14px;margin:8px 0 0}\n"
    "nav.contents a{margin-right:14px}\n"
    ".tiles{display:flex;flex-wrap:wrap;gap:16px;margin:8px 0 14px}\n"
    ".tile{flex:0 1 210px;border:1px solid #d5d9de;border-top:6px solid;padding:8px 16px}\n"
    ".tile .n{display:block;font-size:34px;font-weight:700;line-height:1.15}\n"
    ".tile.sev-e{border-top-color:#a3271e}.tile.sev-w{border-top-color:#e07b00}"
    ".tile.sev-n{border-top-color:#6fc0ea}\n"
    ".g{-webkit-text-stroke:.6px #1a1a1a;paint-order:stroke fill}\n"
    ".g.sev-e{color:#a3271e}.g.sev-w{color:#e07b00}.g.sev-n{color:#6fc0ea}\n"
    "table{border-collapse:collapse;font-size:14px;margin:6px 0 14px}\n"
    ".side-by-side{display:flex;flex-wrap:wrap;gap:8px 56px;align-items:flex-start}\n"
    "th,td{padding:4px 10px;border-bottom:1px solid #d5d9de;text-align:left;"
    "vertical-align:top}\n"
    "th{background:#f3f5f7;font-weight:600}\n"
    ".num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}\n"
    "td.none{color:#b3bac2}\n"
    "td.hit{font-weight:700}\n"
    "tr.wide td{font-style:italic}\n"
    "table.findings{width:100%}\n"
    "table.findings td.msg{max-width:70ch}\n"
    "tr.sev-e td{background:#f7e4e2}tr.sev-w td{background:#fdf1e1}"
    "tr.sev-n td{background:#eaf5fb}\n"
    ".depth{white-space:nowrap;font-variant-numeric:tabular-nums}\n"
    "figure{margin:10px 0 22px}\n"
    "figure svg{display:block;max-width:100%;height:auto}\n"
    "figcaption{font-size:13.5px;color:#3d444d;max-width:95ch;margin-top:6px}\n"
    "article.hole{border-top:1px solid #d5d9de;margin-top:30px;padding-top:4px}\n"
    "article.hole h3{font-size:20px;margin:14px 0 2px}\n"
    ".about{margin:0 0 8px;color:#3d444d;font-size:14px}\n"
    ".more{margin:4px 0 10px;color:#3d444d;font-size:13px;font-style:italic}\n"
    ".budget{margin:0 0 12px;padding:8px 12px;background:#f3f5f7;border-left:4px solid #8a939c;"
    "font-size:14px}\n"
    ".verdict{margin:4px 0 8px;font-weight:600}\n"
    ".clean{color:#2f6f4b}\n"
    ".hole-figs{display:flex;flex-wrap:wrap;gap:26px;align-items:flex-start}\n"
    ".hole-figs .strip{flex:0 1 780px}\n"
    ".hole-figs .net{flex:1 1 440px;max-width:640px}\n"
    ".hole-figs .net svg{width:100%}\n"
    ".back{font-size:13px;margin:0}\n"
    "#program-wide.alert{border:2px solid #e07b00;border-left-width:12px;padding:4px 18px 8px;"
    "margin-top:24px}\n"
    "#program-wide.alert h2{margin-top:8px}\n"
    "footer{margin-top:40px}\n"
    "@media print{body{background:#fff}.sheet{padding:0}}\n";

/* The pictures' classes, under .fig so that they reach only our drawings.
 * (A stereonet's own style sheet, inline in the page, applies page-wide: its
 * classes are never used here, and these rules outrank its plain `text`.) */
static const char css_fig[] =
    ".fig text{font-family:system-ui,'Segoe UI','DejaVu Sans',Arial,sans-serif;fill:#1f2328}\n"
    ".fig .gridline,.fig .lane-grid{stroke:#e3e6ea;stroke-width:1}\n"
    ".fig .depth-grid{stroke:#eceef1;stroke-width:1}\n"
    ".fig .plot-edge,.fig .lane-edge{fill:none;stroke:#8a939c;stroke-width:1}\n"
    ".fig .axis-num{font-size:11px;fill:#59636e}\n"
    ".fig .axis-name{font-size:12.5px;fill:#3d444d}\n"
    ".fig .path{fill:none;stroke:#3a3a3a;stroke-width:1.8;stroke-linejoin:round}\n"
    ".fig .projected{stroke-dasharray:5 4;stroke-width:1.3}\n"
    ".fig .collar{fill:#fff;stroke:#3a3a3a;stroke-width:1.6}\n"
    ".fig .untraced{stroke-dasharray:2 1.6}\n"
    ".fig .hole-name{font-size:11.5px;font-weight:600;paint-order:stroke;stroke:#fff;"
    "stroke-width:3px;stroke-linejoin:round}\n"
    ".fig .sym,.fig .bar{stroke:#1a1a1a;stroke-width:.8}\n"
    ".fig .stretch{fill:none;stroke-width:8;stroke-linecap:round;stroke-opacity:.55}\n"
    ".fig .tint{stroke:none}\n"
    ".fig .backing{fill:#fff;fill-opacity:.85}\n"
    ".fig .bar-dark{fill:#1f2328}.fig .bar-light{fill:#fff;stroke:#1f2328;stroke-width:.8}\n"
    ".fig .arrow{fill:#1f2328}.fig .arrow-n{font-size:13px;font-weight:700}\n"
    ".fig .end-azimuth{font-size:14px;font-weight:600}\n"
    ".fig .key{font-size:12px}\n"
    ".fig .lane-title{font-size:12.5px;font-weight:600}\n"
    ".fig .lane-note{font-size:11px;font-style:italic;fill:#59636e}\n"
    ".fig .station{fill:#3a3a3a}.fig .station-label{font-size:10px;fill:#3d444d}\n"
    ".fig .reading{stroke:#1a1a1a;stroke-width:.4}\n"
    ".fig .reading.open{fill:#fff;stroke-width:1.3}\n";

static void style_sheet(page *p)
{
    out(p, "<style>\n");
    out(p, css_page);
    out(p, css_fig);
    for (int s = 0; s < REPORT_SEVERITIES; s++) {
        const char *c = corax_report_look[s].colour, *k = severity_class[s];
        corax_writer_printf(p->w, ".fig .sym.%s,.fig .bar.%s{fill:%s}.fig .stretch.%s{stroke:%s}"
                                  ".fig .tint.%s{fill:%s}\n",
                            k, k, c, k, c, k, corax_report_look[s].tint);
    }
    for (size_t i = 0; i < CORAX_PALETTE_SIZE; i++)
        corax_writer_printf(p->w, ".fig .c%zu{fill:%s}.fig .open.c%zu{stroke:%s}\n", i,
                            corax_palette[i], i, corax_palette[i]);
    out(p, "</style>\n");
}

/* ---- pieces ---- */

static void glyph(page *p, corax_severity s)
{
    corax_writer_printf(p->w, "<span class=\"g %s\" aria-hidden=\"true\">%s</span>",
                        severity_class[s], corax_report_look[s].glyph);
}

static void number(page *p, double v, int decimals)
{
    char buf[48];
    corax_format_short(buf, v, decimals);
    out(p, buf);
}

static void count_cell(page *p, size_t n, corax_severity s)
{
    if (n == 0) {
        out(p, "<td class=\"num none\">0</td>");
        return;
    }
    corax_writer_printf(p->w, "<td class=\"num hit\">");
    glyph(p, s);
    corax_writer_printf(p->w, " %zu</td>", n);
}

static void severity_cells(page *p, const size_t count[REPORT_SEVERITIES])
{
    for (int s = CORAX_ERROR; s >= CORAX_NOTE; s--)
        count_cell(p, count[s], (corax_severity)s);
}

static void severity_heads(page *p)
{
    out(p, "<th class=\"num\">Errors</th><th class=\"num\">Warnings</th>"
           "<th class=\"num\">Notes</th>");
}

/* "2 errors, 1 warning and 3 notes" */
static void tally(page *p, const size_t count[REPORT_SEVERITIES])
{
    static const char *const one[REPORT_SEVERITIES] = {"note", "warning", "error"};
    int parts = 0, total = (count[0] > 0) + (count[1] > 0) + (count[2] > 0);
    for (int s = CORAX_ERROR; s >= CORAX_NOTE; s--) {
        if (!count[s])
            continue;
        out(p, parts == 0 ? "" : parts == total - 1 ? " and " : ", ");
        corax_writer_printf(p->w, "%zu %s", count[s],
                            count[s] == 1 ? one[s] : severity_plural[s]);
        parts++;
    }
}

static void caution_box(page *p, const char *heading)
{
    out(p, "<aside class=\"caution\" role=\"note\"><h2>");
    out(p, heading);
    out(p, "</h2><p>");
    out(p, caution);
    out(p, "</p></aside>\n");
}

/* A picture, inline. CORAX_ENOMEM when it could not be drawn. */
static corax_status picture(page *p, corax_svg *svg)
{
    size_t n;
    const char *doc = svg ? corax_svg_finish(svg, &n) : NULL;
    if (!doc)
        return CORAX_ENOMEM;
    corax_writer_text(p->w, doc, n);
    return CORAX_OK;
}

/* ---- the header ---- */

static void head(page *p)
{
    const corax_report_input *in = p->in;
    const char *title = in->title && *in->title ? in->title : "Drill program";
    out(p, "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n"
           "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>\n"
           "<meta name=\"generator\" content=\"corax\"/>\n<title>");
    text(p, title);
    out(p, ": drill data check</title>\n");
    style_sheet(p);
    out(p, "</head>\n<body>\n<div class=\"sheet\">\n<header>\n"
           "<p class=\"kicker\">Drill data check</p>\n<h1>");
    text(p, title);
    out(p, "</h1>\n<dl class=\"facts\">\n");
    if (in->when && *in->when) {
        out(p, "<dt>Written</dt><dd>");
        text(p, in->when);
        out(p, "</dd>\n");
    }
    out(p, "<dt>By</dt><dd>corax");
    if (in->version && *in->version) {
        out(p, " ");
        text(p, in->version);
    }
    out(p, "</dd>\n<dt>Read</dt><dd>");
    if (in->ninputs == 0)
        out(p, "no files named");
    else {
        out(p, "<ul class=\"inputs\">");
        for (size_t i = 0; i < in->ninputs; i++) {
            out(p, "<li><code>");
            text(p, in->inputs[i]);
            out(p, "</code></li>");
        }
        out(p, "</ul>");
    }
    const report_model *m = p->m;
    size_t collared = in->program ? corax_program_size(in->program) : 0;
    corax_writer_printf(p->w, "</dd>\n<dt>Program</dt><dd>%zu hole%s in the collars, "
                              "%zu reading%s",
                        collared, collared == 1 ? "" : "s", m->nreadings,
                        m->nreadings == 1 ? "" : "s");
    if (m->unreadable)
        corax_writer_printf(p->w, " (%zu that could not be read or name no hole)",
                            m->unreadable);
    out(p, "</dd>\n</dl>\n</header>\n");
    caution_box(p, "Read this first");
    out(p, "<nav class=\"contents\" aria-label=\"Contents\"><a href=\"#program-wide\">Whole "
           "program</a><a href=\"#summary\">Summary</a><a href=\"#plan\">Plan</a>"
           "<a href=\"#section\">Section</a><a href=\"#holes\">Holes</a></nav>\n");
}

/* ---- the summary ---- */

static void tiles(page *p)
{
    static const char *const id[REPORT_SEVERITIES] = {"count-note", "count-warning",
                                                      "count-error"};
    out(p, "<div class=\"tiles\">\n");
    for (int s = CORAX_ERROR; s >= CORAX_NOTE; s--) {
        corax_writer_printf(p->w, "<div class=\"tile %s\"><span class=\"n\" id=\"%s\">%zu</span>",
                            severity_class[s], id[s], p->m->count[s]);
        glyph(p, (corax_severity)s);
        corax_writer_printf(p->w, " %s</div>\n", severity_plural[s]);
    }
    out(p, "</div>\n");
}

static void hole_row(page *p, const report_hole *h, size_t index)
{
    corax_writer_printf(p->w, "<tr><td><a href=\"#hole-%zu\">", index + 1);
    text(p, h->name);
    out(p, "</a></td>");
    severity_cells(p, h->count);
    out(p, "<td class=\"num\">");
    if (h->path && h->length > 0.0)
        number(p, h->length, 1);
    else
        out(p, "\xe2\x80\x94");
    corax_writer_printf(p->w, "</td><td class=\"num\">%zu</td><td class=\"num\">%zu</td></tr>\n",
                        h->path ? corax_hole_station_count(h->path) : 0, h->nreading);
}

static void by_hole(page *p)
{
    const report_model *m = p->m;
    size_t wide[REPORT_SEVERITIES] = {0, 0, 0};
    for (size_t i = 0; i < m->nwide; i++)
        wide[m->finding[m->wide[i]].severity]++;
    out(p, "<div>\n<h3>By hole</h3>\n<table class=\"by-hole\">\n<thead><tr><th>Hole</th>");
    severity_heads(p);
    out(p, "<th class=\"num\">Length (m)</th><th class=\"num\">Stations</th>"
           "<th class=\"num\">Readings</th></tr></thead>\n<tbody>\n"
           "<tr class=\"wide\"><td><a href=\"#program-wide\">The program as a whole</a></td>");
    severity_cells(p, wide);
    out(p, "<td></td><td></td><td></td></tr>\n");
    for (size_t i = 0; i < m->nhole; i++)
        if (m->hole[i].listed)
            hole_row(p, &m->hole[i], i);
    if (m->listed_holes < m->nhole) {
        corax_writer_printf(p->w, "<tr class=\"wide\"><td>%zu other holes (in ",
                            m->nhole - m->listed_holes);
        findings_link(p);
        out(p, ")</td>");
        severity_cells(p, m->unlisted);
        out(p, "<td></td><td></td><td></td></tr>\n");
    }
    out(p, "</tbody>\n</table>\n</div>\n");
}

typedef struct check_count {
    const char *check;
    size_t count[REPORT_SEVERITIES];
} check_count;

/* The worst first: by errors, then warnings, then notes, then name. */
static int check_order(const void *pa, const void *pb)
{
    const check_count *a = pa, *b = pb;
    int worse = corax_report_worse(a->count, b->count);
    return worse ? worse : strcmp(a->check, b->check);
}

static corax_status by_check(page *p)
{
    const report_model *m = p->m;
    check_count *c = calloc(m->nfinding + 1, sizeof *c);
    if (!c)
        return CORAX_ENOMEM;
    size_t n = 0;
    for (size_t i = 0; i < m->nfinding; i++) {
        const corax_finding *f = &m->finding[i];
        size_t k = 0;
        while (k < n && strcmp(c[k].check, f->check) != 0)
            k++;
        if (k == n)
            c[n++].check = f->check;
        c[k].count[f->severity]++;
    }
    qsort(c, n, sizeof *c, check_order);
    out(p, "<div>\n<h3>By check</h3>\n");
    if (n == 0)
        out(p, "<p>No check found anything.</p>\n");
    else {
        out(p, "<table class=\"by-check\">\n<thead><tr><th>Check</th>");
        severity_heads(p);
        out(p, "<th class=\"num\">All</th></tr></thead>\n<tbody>\n");
    }
    for (size_t k = 0; k < n; k++) {
        out(p, "<tr><td><code>");
        text(p, *c[k].check ? c[k].check : "(unnamed)");
        out(p, "</code></td>");
        severity_cells(p, c[k].count);
        corax_writer_printf(p->w, "<td class=\"num\">%zu</td></tr>\n",
                            c[k].count[0] + c[k].count[1] + c[k].count[2]);
    }
    out(p, n ? "</tbody>\n</table>\n</div>\n" : "</div>\n");
    free(c);
    return CORAX_OK;
}

/* The names of the holes not in the collars, comma-separated: the first
 * 50, then how many more (a log of another program's holes must not fill
 * the page). */
static void names_of(page *p)
{
    enum { MOST = 50 };
    size_t k = 0;
    for (size_t i = 0; i < p->m->nhole; i++)
        if (!p->m->hole[i].path && k++ < MOST) {
            out(p, k > 1 ? ", " : "");
            text(p, p->m->hole[i].name);
        }
    if (k > MOST)
        corax_writer_printf(p->w, " and %zu more", k - MOST);
}

/* The names the core log gives that the collars lack: not holes of the
 * program (a typo, most often), counted apart. */
static void log_only_names(page *p, size_t *names, size_t *with)
{
    const report_model *m = p->m;
    *names = *with = 0;
    for (size_t i = 0; i < m->nhole; i++)
        if (!m->hole[i].path && p->in->program) {
            ++*names;
            *with += m->hole[i].nfinding > 0;
        }
}

static corax_status summary(page *p)
{
    const report_model *m = p->m;
    size_t with = 0, strays, strays_with;
    for (size_t i = 0; i < m->nhole; i++)
        with += m->hole[i].nfinding > 0;
    log_only_names(p, &strays, &strays_with);
    size_t holes = m->nhole - strays;
    out(p, "<section id=\"summary\">\n<h2>Summary</h2>\n");
    tiles(p);
    corax_writer_printf(p->w, "<p>%zu finding%s in all: %zu about the program as a whole, the "
                              "rest in %zu of its %zu hole%s",
                        m->nfinding, m->nfinding == 1 ? "" : "s", m->nwide, with - strays_with,
                        holes, holes == 1 ? "" : "s");
    if (strays) {
        corax_writer_printf(p->w, " and under %zu name%s that only the core log gives (",
                            strays, strays == 1 ? "" : "s");
        names_of(p);
        out(p, "), not holes of the program");
    }
    out(p, ".</p>\n");
    if (m->listed_holes < m->nhole || m->figure_holes < m->nhole || m->hidden) {
        out(p, "<p class=\"budget\">To keep this page small enough to open, it ");
        if (m->listed_holes < m->nhole)
            corax_writer_printf(p->w, "lists %zu of the %zu holes, ", m->listed_holes, m->nhole);
        corax_writer_printf(p->w, "draws the strips and stereonets of %zu%s (those with the "
                                  "most errors, then warnings, then notes) and shows %zu of "
                                  "the %zu findings of the holes in their tables, errors and "
                                  "warnings first; every finding is in ",
                            m->figure_holes,
                            m->listed_holes < m->nhole ? "" : " of them",
                            m->nfinding - m->nwide - m->hidden, m->nfinding - m->nwide);
        findings_link(p);
        out(p, ".</p>\n");
    }
    out(p, "<div class=\"side-by-side\">\n");
    by_hole(p);
    corax_status st = by_check(p);
    out(p, "</div>\n</section>\n");
    return st;
}

/* ---- the plan and the section ---- */

/* The holes that no picture can place: not in the collars. */
static void unplaced_holes(page *p)
{
    for (size_t i = 0; i < p->m->nhole; i++)
        if (!p->m->hole[i].path) {
            out(p, " Not drawn, for they are not in the collars: ");
            names_of(p);
            out(p, ".");
            return;
        }
}

static void marks_caption(page *p)
{
    out(p, " Each finding sits where it lies down its hole: a symbol at its depth, or a band "
           "along its stretch with the symbol at the middle; a finding about a whole hole sits "
           "at the collar. Point at a mark to read the finding.");
    const report_model *m = p->m;
    if (m->drawn_holes < m->nhole || m->listed_holes < m->nhole)
        corax_writer_printf(p->w, " To keep the page small, the paths of %zu of the %zu holes "
                                  "are drawn, with the collars of the %zu listed below and "
                                  "the findings their tables show.", m->drawn_holes, m->nhole,
                            m->listed_holes);
    if (p->m->nwide)
        corax_writer_printf(p->w, " The %zu finding%s about the program as a whole %s not drawn.",
                            p->m->nwide, p->m->nwide == 1 ? "" : "s",
                            p->m->nwide == 1 ? "is" : "are");
    unplaced_holes(p);
}

static corax_status views(page *p)
{
    corax_svg *svg = NULL;
    double azimuth = 0.0;
    corax_status st = corax_report_plan(p->m, &svg);
    out(p, "<section id=\"plan\">\n<h2>Plan</h2>\n<figure class=\"fig\">\n");
    if (st == CORAX_OK)
        st = picture(p, svg);
    corax_svg_free(svg);
    out(p, "<figcaption>Every hole's path seen from above, east to the right and north up, "
           "to the same scale both ways; solid where surveyed, dashed where it runs on past "
           "the last station or along the collar's direction alone.");
    marks_caption(p);
    out(p, "</figcaption>\n</figure>\n</section>\n");
    if (st != CORAX_OK)
        return st;
    st = corax_report_section(p->m, &azimuth, &svg);
    out(p, "<section id=\"section\">\n<h2>Section</h2>\n<figure class=\"fig\">\n");
    if (st == CORAX_OK)
        st = picture(p, svg);
    corax_svg_free(svg);
    double a = corax_wrap_degrees(corax_deg(azimuth), 0);
    corax_writer_printf(p->w, "<figcaption>A vertical section along %03.0f\xc2\xb0\xe2\x80\x93"
                              "%03.0f\xc2\xb0, the way the holes spread furthest, through the "
                              "program's centre, looking toward %03.0f\xc2\xb0: every hole is "
                              "projected onto it square to the section. Elevation up, the "
                              "same scale across and down (no vertical exaggeration).",
                        corax_wrap_degrees(a + 180.0, 0), a, corax_wrap_degrees(a - 90.0, 0));
    marks_caption(p);
    out(p, "</figcaption>\n</figure>\n</section>\n");
    return st;
}

/* ---- tables of findings ---- */

static void depth_cell(page *p, const corax_finding *f)
{
    char where[REPORT_DEPTHS];
    corax_report_depths(where, f);
    out(p, "<td class=\"depth\">");
    out(p, where);
    out(p, "</td>");
}

static void source_cell(page *p, const corax_finding *f)
{
    out(p, "<td><code>");
    if (f->file && *f->file) {
        text(p, f->file);
        if (f->line > 0)
            corax_writer_printf(p->w, ":%ld", f->line);
    } else
        out(p, "\xe2\x80\x94");
    out(p, "</code></td>");
}

static void findings_table(page *p, const size_t *index, size_t n, int depths)
{
    out(p, "<table class=\"findings\">\n<thead><tr>");
    if (depths)
        out(p, "<th>Depth (m)</th>");
    out(p, "<th>Severity</th><th>Check</th><th>Message</th><th>Source</th></tr></thead>\n"
           "<tbody>\n");
    for (size_t k = 0; k < n; k++) {
        const corax_finding *f = &p->m->finding[index[k]];
        corax_writer_printf(p->w, "<tr class=\"%s\">", severity_class[f->severity]);
        if (depths)
            depth_cell(p, f);
        out(p, "<td>");
        glyph(p, f->severity);
        corax_writer_printf(p->w, " %s</td><td><code>", corax_severity_name(f->severity));
        text(p, f->check);
        out(p, "</code></td><td class=\"msg\">");
        text(p, f->message);
        out(p, "</td>");
        source_cell(p, f);
        out(p, "</tr>\n");
    }
    out(p, "</tbody>\n</table>\n");
}

/* The findings about the program as a whole come first: a convention or a
 * correction applied wrongly to every hole turns every structure alike, and
 * nothing looks odd hole by hole. */
static void program_wide(page *p)
{
    size_t serious = 0;
    for (size_t i = 0; i < p->m->nwide; i++)
        serious += p->m->finding[p->m->wide[i]].severity >= CORAX_WARNING;
    corax_writer_printf(p->w, "<section id=\"program-wide\"%s>\n<h2>The program as a whole"
                              "</h2>\n",
                        serious ? " class=\"alert\"" : "");
    out(p, "<p class=\"about\">A convention or a correction applied wrongly to the whole "
           "program turns or mirrors every structure alike, and nothing looks odd hole by "
           "hole. corax converts every oriented reading under each reading of the "
           "core conventions (beta + 180, beta mirrored, both) and measures how tightly each "
           "fabric clusters across the holes (Fisher's kappa, Terzaghi-weighted); it compares "
           "each collar's set-up with its first survey station for an azimuth offset the "
           "holes share; and it looks for holes turned alike about the vertical.</p>\n");
    if (p->m->nwide == 0)
        out(p, "<p class=\"verdict clean\">No findings about the program as a whole.</p>\n");
    else
        findings_table(p, p->m->wide, p->m->nwide, 0);
    out(p, "</section>\n");
}

/* ---- the holes ---- */

static void degrees(page *p, double radians)
{
    number(p, corax_deg(radians), 1);
    out(p, "\xc2\xb0");
}

static void hole_about(page *p, const report_hole *h)
{
    out(p, "<p class=\"about\">");
    if (!h->path) {
        corax_writer_printf(p->w, "Not in the collars: no position and no path. %zu reading%s.",
                            h->nreading, h->nreading == 1 ? "" : "s");
        out(p, "</p>\n");
        return;
    }
    const corax_collar *c = corax_hole_collar(h->path);
    out(p, "Collar at ");
    number(p, c->position.x, 2);
    out(p, " E, ");
    number(p, c->position.y, 2);
    out(p, " N, elevation ");
    number(p, c->position.z, 2);
    out(p, " m");
    if (c->has_direction) {
        out(p, ", set up toward ");
        degrees(p, corax_wrap_azimuth(c->azimuth));
        out(p, " at ");
        degrees(p, fabs(c->plunge));
        out(p, c->plunge >= 0.0 ? " below" : " above");
        out(p, " the horizontal");
    }
    out(p, ". ");
    if (h->length > 0.0) {
        number(p, h->length, 2);
        out(p, " m long; ");
    }
    size_t n = corax_hole_station_count(h->path);
    corax_writer_printf(p->w, "%zu survey station%s; %zu reading%s.", n, n == 1 ? "" : "s",
                        h->nreading, h->nreading == 1 ? "" : "s");
    if (!h->traced)
        out(p, " No stations and no collar direction: the hole has no path.");
    out(p, "</p>\n");
}

static void strip_caption(page *p, const report_hole *h, const report_strip_counts *c)
{
    out(p, "<figcaption>Depth down the page. Each reading's alpha and beta, by feature kind "
           "(hollow: alpha without beta). Findings on the right: a symbol at a depth, a bar "
           "down a stretch; pale bands mark the stretches of warnings and errors.");
    if (c->step > 1)
        corax_writer_printf(p->w, " To keep the page small, one reading in every %zu is drawn "
                                  "(%zu of %zu).",
                            c->step, c->drawn, h->nreading);
    if (c->blank)
        corax_writer_printf(p->w, " %zu reading%s without a depth or an alpha %s not drawn.",
                            c->blank, c->blank == 1 ? "" : "s", c->blank == 1 ? "is" : "are");
    out(p, "</figcaption>\n");
}

static void net_caption(page *p, const report_hole *h, const report_net_counts *c)
{
    corax_writer_printf(p->w, "<figcaption>Lower hemisphere, equal area: the %zu reading%s "
                              "that convert to true orientations (poles of planes filled, "
                              "lines hollow)%s. ",
                        c->placed, c->placed == 1 ? "" : "s",
                        c->contoured ? ", shaded by their density" : "");
    if (!c->contoured && c->poles)
        corax_writer_printf(p->w, "No density contours: %zu pole%s %s too few to contour "
                                  "(it takes %d). ",
                            c->poles, c->poles == 1 ? "" : "s", c->poles == 1 ? "is" : "are",
                            REPORT_NET_CONTOURS);
    if (c->flagged)
        corax_writer_printf(p->w, "The %zu in stretches named by a warning or an error are "
                                  "orange squares, the rest blue circles.",
                            c->flagged);
    else
        out(p, "None lies in a stretch named by a warning or an error.");
    if (c->flagged_drawn < c->flagged)
        corax_writer_printf(p->w, " To keep the page small, %zu of them are drawn: an even "
                                  "share of the flagged (%zu of %zu) and of the rest.",
                            c->drawn, c->flagged_drawn, c->flagged);
    else if (c->drawn < c->placed)
        corax_writer_printf(p->w, " To keep the page small, %zu of them are drawn: every "
                                  "flagged one, and an even share of the rest.",
                            c->drawn);
    if (c->no_beta)
        corax_writer_printf(p->w, " %zu reading%s an alpha but no beta, so no plane.",
                            c->no_beta, c->no_beta == 1 ? " has" : "s have");
    if (c->too_steep)
        corax_writer_printf(p->w, " %zu reading%s could not be oriented (a dip at most): the "
                                  "hole is within %.0f degrees of vertical there, too steep for "
                                  "an orientation line to be marked.",
                            c->too_steep, c->too_steep == 1 ? "" : "s",
                            corax_deg(p->m->convert.vertical_limit));
    size_t other = c->unplaced - c->no_beta - c->too_steep;
    if (other)
        corax_writer_printf(p->w, " %zu reading%s could not be placed: %s.", other,
                            other == 1 ? "" : "s",
                            h->traced ? "their values make no plane or line"
                                      : "the hole has no path to orient them by");
    out(p, "</figcaption>\n");
}

static corax_status hole_figures(page *p, const report_hole *h, size_t index)
{
    corax_svg *svg = NULL;
    report_strip_counts drawn;
    report_net_counts counts;
    report_readings rr;
    out(p, "<div class=\"hole-figs\">\n<figure class=\"fig strip\">\n");
    corax_status st = corax_report_readings(p->m, h, &rr);
    if (st != CORAX_OK) {
        corax_report_readings_free(&rr);
        return st;
    }
    st = corax_report_strip(p->m, h, &rr, &drawn, &svg);
    if (st == CORAX_OK)
        st = picture(p, svg);
    corax_svg_free(svg);
    strip_caption(p, h, &drawn);
    out(p, "</figure>\n");
    if (st != CORAX_OK) {
        corax_report_readings_free(&rr);
        return st;
    }
    svg = NULL;
    st = corax_report_net(p->m, h, &rr, index, &counts, &svg);
    corax_report_readings_free(&rr);
    out(p, "<figure class=\"net\">\n");
    if (st == CORAX_OK && svg) {
        st = picture(p, svg);
        net_caption(p, h, &counts);
    } else if (st == CORAX_OK)
        out(p, !h->nreading  ? "<p>No readings, so no stereonet.</p>\n"
               : !h->path    ? "<p>No stereonet: the hole is not in the collars, so its "
                               "readings cannot be oriented.</p>\n"
               : !h->traced  ? "<p>No stereonet: the hole has no path (no stations and no "
                               "collar direction), so its readings cannot be oriented.</p>\n"
                             : "<p>No stereonet: no reading of this hole makes a plane or a "
                               "line.</p>\n");
    corax_svg_free(svg);
    out(p, "</figure>\n</div>\n");
    return st;
}

static corax_status hole_part(page *p, const report_hole *h, size_t index)
{
    corax_writer_printf(p->w, "<article class=\"hole\" id=\"hole-%zu\">\n<h3>", index + 1);
    text(p, h->name);
    out(p, "</h3>\n");
    hole_about(p, h);
    if (h->nfinding == 0)
        out(p, "<p class=\"verdict clean\">No findings.</p>\n");
    else {
        out(p, "<p class=\"verdict\">");
        tally(p, h->count);
        out(p, ".</p>\n");
        findings_table(p, h->shown, h->nshown, 1);
        if (h->nshown < h->nfinding) {
            size_t more = h->nfinding - h->nshown;
            corax_writer_printf(p->w, "<p class=\"more\">%zu more finding%s of this hole %s in ",
                                more, more == 1 ? "" : "s", more == 1 ? "is" : "are");
            findings_link(p);
            out(p, ".</p>\n");
        }
    }
    corax_status st = CORAX_OK;
    if (h->figures)
        st = hole_figures(p, h, index + 1);
    else
        out(p, "<p class=\"more\">Its strip and stereonet are left out to keep the page small: "
               "the page draws them for the holes with the most errors, then warnings, then "
               "notes.</p>\n");
    out(p, "<p class=\"back\"><a href=\"#summary\">Back to the summary</a></p>\n</article>\n");
    return st;
}

static corax_status holes(page *p)
{
    corax_status st = CORAX_OK;
    out(p, "<section id=\"holes\">\n<h2>Hole by hole</h2>\n");
    if (p->m->nhole == 0)
        out(p, "<p>The program has no holes.</p>\n");
    for (size_t i = 0; i < p->m->nhole && st == CORAX_OK; i++)
        if (p->m->hole[i].listed)
            st = hole_part(p, &p->m->hole[i], i);
    if (p->m->listed_holes < p->m->nhole) {
        corax_writer_printf(p->w, "<p class=\"more\">%zu other holes are not listed here: their "
                                  "findings are in ", p->m->nhole - p->m->listed_holes);
        findings_link(p);
        out(p, ".</p>\n");
    }
    out(p, "</section>\n");
    return st;
}

static corax_status whole_page(page *p)
{
    head(p);
    out(p, "<main>\n");
    program_wide(p);
    corax_status st = summary(p);
    if (st == CORAX_OK)
        st = views(p);
    if (st == CORAX_OK)
        st = holes(p);
    out(p, "</main>\n<footer>\n");
    caution_box(p, "Before you rely on this report");
    out(p, "</footer>\n</div>\n</body>\n</html>\n");
    return st;
}

static corax_status check_input(const corax_report_input *in, corax_error *err)
{
    const corax_findings *f = in->findings;
    for (size_t i = 0; f && i < f->count; i++)
        if ((unsigned)f->item[i].severity >= REPORT_SEVERITIES)
            return corax_error_set(err, CORAX_EARG, NULL, 0,
                                   "finding %zu has no severity the report knows", i + 1);
    if (!corax_qa_log_sorted(in->log))
        return corax_error_set(err, CORAX_EARG, NULL, 0, "the core log is not sorted");
    if (in->ninputs && !in->inputs)
        return corax_error_set(err, CORAX_EARG, NULL, 0, "inputs counted but not given");
    return CORAX_OK;
}

corax_status corax_report_write(const corax_report_input *input, corax_outputs *set,
                                const char *path, corax_error *err)
{
    if (!input || !path)
        return corax_error_set(err, CORAX_EARG, NULL, 0, "no report input or no path");
    corax_status st = check_input(input, err);
    if (st != CORAX_OK)
        return st;
    report_model m;
    if ((st = corax_report_model_build(&m, input)) != CORAX_OK)
        return corax_error_set(err, st, path, 0, "out of memory preparing the report");
    corax_writer *w;
    if ((st = corax_writer_open_in(set, path, &w, err)) == CORAX_OK) {
        page p = {w, &m, input, table_href(input->findings_table, path)};
        st = whole_page(&p);
        if (st == CORAX_OK)
            st = corax_writer_commit(w, err);
        else {
            corax_writer_discard(w);
            corax_error_set(err, st, path, 0, "out of memory drawing the report");
        }
    }
    corax_report_model_free(&m);
    return st;
}
