/* draw: a small SVG writer. The document grows in memory; numbers are written
 * with two decimals, which is a hundredth of a pixel. */
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/output.h"
#include "common/format.h"
#include "corax/svg.h"
#include "draw/markup.h"

struct corax_svg {
    char *text;
    size_t len, cap;
    int failed, finished;
    int path_started;
};

static void put(corax_svg *s, const char *t, size_t n)
{
    if (s->failed || s->finished)
        return;
    if (s->len + n + 1 > s->cap) {
        size_t cap = s->cap ? s->cap : 4096;
        while (cap < s->len + n + 1)
            cap *= 2;
        char *p = realloc(s->text, cap);
        if (!p) {
            s->failed = 1;
            return;
        }
        s->text = p;
        s->cap = cap;
    }
    memcpy(s->text + s->len, t, n);
    s->len += n;
    s->text[s->len] = '\0';
}

static void puts_(corax_svg *s, const char *t) { put(s, t, strlen(t)); }

static void num(corax_svg *s, double v)
{
    char buf[48];
    size_t n = corax_format_short(buf, v, 2);
    if (n == 0) /* NaN: keep the document valid */
        put(s, "0", 1);
    else
        put(s, buf, n);
}

void corax_svg_raw(corax_svg *s, const char *fmt, ...)
{
    char small[1024], *big;
    size_t n;
    va_list ap;
    va_start(ap, fmt);
    const char *text = corax_vformat(small, sizeof small, &big, &n, fmt, ap);
    va_end(ap);
    if (text)
        put(s, text, n);
    else
        s->failed = 1;
    free(big);
}

static void sink(void *ctx, const char *t, size_t n) { put(ctx, t, n); }

void corax_svg_escaped(corax_svg *s, const char *t) { corax_markup_escape(t, sink, s); }

corax_svg *corax_svg_new(double width, double height)
{
    corax_svg *s = calloc(1, sizeof *s);
    if (!s)
        return NULL;
    puts_(s, "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"");
    num(s, width);
    puts_(s, "\" height=\"");
    num(s, height);
    puts_(s, "\" viewBox=\"0 0 ");
    num(s, width);
    puts_(s, " ");
    num(s, height);
    puts_(s, "\">\n");
    if (s->failed) {
        corax_svg_free(s);
        return NULL;
    }
    return s;
}

void corax_svg_free(corax_svg *s)
{
    if (!s)
        return;
    free(s->text);
    free(s);
}

void corax_svg_style(corax_svg *s, const char *css)
{
    puts_(s, "<style>\n");
    puts_(s, css); /* CSS never holds '<' here; it is ours */
    puts_(s, "\n</style>\n");
}

static void cls_attr(corax_svg *s, const char *cls)
{
    if (cls && *cls) {
        puts_(s, " class=\"");
        corax_svg_escaped(s, cls);
        puts_(s, "\"");
    }
}

void corax_svg_group(corax_svg *s, const char *cls, const char *transform)
{
    puts_(s, "<g");
    cls_attr(s, cls);
    if (transform) {
        puts_(s, " transform=\"");
        corax_svg_escaped(s, transform);
        puts_(s, "\"");
    }
    puts_(s, ">\n");
}

void corax_svg_end_group(corax_svg *s) { puts_(s, "</g>\n"); }

void corax_svg_title(corax_svg *s, const char *text)
{
    puts_(s, "<title>");
    corax_svg_escaped(s, text);
    puts_(s, "</title>\n");
}

void corax_svg_line(corax_svg *s, double x1, double y1, double x2, double y2, const char *cls)
{
    puts_(s, "<line x1=\"");
    num(s, x1);
    puts_(s, "\" y1=\"");
    num(s, y1);
    puts_(s, "\" x2=\"");
    num(s, x2);
    puts_(s, "\" y2=\"");
    num(s, y2);
    puts_(s, "\"");
    cls_attr(s, cls);
    puts_(s, "/>\n");
}

void corax_svg_circle(corax_svg *s, double cx, double cy, double r, const char *cls)
{
    puts_(s, "<circle cx=\"");
    num(s, cx);
    puts_(s, "\" cy=\"");
    num(s, cy);
    puts_(s, "\" r=\"");
    num(s, r);
    puts_(s, "\"");
    cls_attr(s, cls);
    puts_(s, "/>\n");
}

void corax_svg_rect(corax_svg *s, double x, double y, double w, double h, const char *cls)
{
    puts_(s, "<rect x=\"");
    num(s, x);
    puts_(s, "\" y=\"");
    num(s, y);
    puts_(s, "\" width=\"");
    num(s, w);
    puts_(s, "\" height=\"");
    num(s, h);
    puts_(s, "\"");
    cls_attr(s, cls);
    puts_(s, "/>\n");
}

void corax_svg_poly(corax_svg *s, const double *xy, size_t n, int closed, const char *cls)
{
    puts_(s, closed ? "<polygon points=\"" : "<polyline points=\"");
    for (size_t i = 0; i < n; i++) {
        if (i)
            puts_(s, " ");
        num(s, xy[2 * i]);
        puts_(s, ",");
        num(s, xy[2 * i + 1]);
    }
    puts_(s, "\"");
    cls_attr(s, cls);
    puts_(s, "/>\n");
}

void corax_svg_path_begin(corax_svg *s, const char *cls)
{
    puts_(s, "<path");
    cls_attr(s, cls);
    puts_(s, " d=\"");
    s->path_started = 0;
}

void corax_svg_path_move(corax_svg *s, double x, double y)
{
    puts_(s, s->path_started ? " M" : "M");
    s->path_started = 1;
    num(s, x);
    puts_(s, ",");
    num(s, y);
}

void corax_svg_path_line(corax_svg *s, double x, double y)
{
    puts_(s, " L");
    num(s, x);
    puts_(s, ",");
    num(s, y);
}

void corax_svg_path_end(corax_svg *s, int close)
{
    puts_(s, close ? " Z\"/>\n" : "\"/>\n");
}

void corax_svg_text(corax_svg *s, double x, double y, const char *cls, const char *anchor,
                    const char *text)
{
    puts_(s, "<text x=\"");
    num(s, x);
    puts_(s, "\" y=\"");
    num(s, y);
    puts_(s, "\"");
    cls_attr(s, cls);
    if (anchor && strcmp(anchor, "start") != 0) {
        puts_(s, " text-anchor=\"");
        corax_svg_escaped(s, anchor);
        puts_(s, "\"");
    }
    puts_(s, ">");
    corax_svg_escaped(s, text);
    puts_(s, "</text>\n");
}

const char *corax_svg_finish(corax_svg *s, size_t *length)
{
    if (!s->finished) {
        puts_(s, "</svg>\n");
        s->finished = 1;
    }
    if (s->failed)
        return NULL;
    if (length)
        *length = s->len;
    return s->text;
}

corax_status corax_svg_save(corax_svg *s, corax_outputs *set, const char *path,
                            corax_error *err)
{
    size_t n;
    const char *text = corax_svg_finish(s, &n);
    if (!text)
        return corax_error_set(err, CORAX_ENOMEM, path, 0, "out of memory drawing the picture");
    corax_writer *w;
    corax_status st = corax_writer_open_in(set, path, &w, err);
    if (st != CORAX_OK)
        return st;
    corax_writer_text(w, text, n);
    return corax_writer_commit(w, err);
}
