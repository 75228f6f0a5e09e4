/* draw: a net on the page: directions placed on the lower hemisphere, great
 * and small circles that break at the primitive, the frame, and the style
 * every net's page shares. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>

#include "draw/net.h"
#include "draw/palette.h"
#include "geometry/vec.h"

void corax_disc_screen(const corax_disc *d, double x, double y, double *sx, double *sy)
{
    *sx = d->cx + d->r * x;
    *sy = d->cy - d->r * y;
}

void corax_disc_place(const corax_disc *d, corax_vec3 v, double *sx, double *sy)
{
    double x, y;
    corax_project(d->projection, v, &x, &y);
    corax_disc_screen(d, x, y, sx, sy);
}

static void curve_to(const corax_disc *d, corax_vec3 v, int move)
{
    double x, y;
    corax_disc_place(d, v, &x, &y);
    if (move)
        corax_svg_path_move(d->svg, x, y);
    else
        corax_svg_path_line(d->svg, x, y);
}

void corax_disc_curve(const corax_disc *d, const corax_vec3 *p, size_t m, int closed,
                      const char *cls)
{
    double side = p[0].z > 0.0 ? -1.0 : 1.0;
    corax_svg_path_begin(d->svg, cls);
    curve_to(d, vec_scale(p[0], side), 1);
    for (size_t k = 1; k < (closed ? m + 1 : m); k++) {
        corax_vec3 a = p[k - 1], b = p[k % m];
        double bside = b.z > 0.0 ? -1.0 : 1.0;
        if (bside != side) {
            corax_vec3 c = vec_comb(a, 1.0, vec_sub(b, a), a.z / (a.z - b.z));
            c.z = 0.0;
            c = vec_unit(c);
            curve_to(d, vec_scale(c, side), 0);
            side = bside;
            curve_to(d, vec_scale(c, side), 1);
        }
        curve_to(d, vec_scale(b, side), 0);
    }
    corax_svg_path_end(d->svg, 0);
}

/* Two unit vectors making a right-handed frame with the unit vector m. */
static void frame_about(corax_vec3 m, corax_vec3 *a, corax_vec3 *b)
{
    corax_vec3 helper = fabs(m.z) < 0.9 ? vec3(0, 0, 1) : vec3(1, 0, 0);
    *a = vec_unit(vec_cross(helper, m));
    *b = vec_cross(m, *a);
}

void corax_disc_great_circle(const corax_disc *d, corax_vec3 normal, const char *cls)
{
    corax_vec3 p[37], a, b;
    frame_about(normal, &a, &b);
    for (int k = 0; k < 37; k++) {
        double t = CORAX_PI * k / 36.0;
        p[k] = vec_comb(a, cos(t), b, sin(t));
    }
    corax_disc_curve(d, p, 37, 0, cls); /* half the circle: the other half is its antipode */
}

void corax_disc_small_circle(const corax_disc *d, corax_vec3 m, double angle, const char *cls)
{
    corax_vec3 p[90], a, b;
    frame_about(m, &a, &b);
    for (int k = 0; k < 90; k++) {
        double t = 2.0 * CORAX_PI * k / 90.0;
        p[k] = vec_comb(m, cos(angle), vec_comb(a, cos(t), b, sin(t)), sin(angle));
    }
    corax_disc_curve(d, p, 90, 1, cls);
}

void corax_disc_frame(const corax_disc *d)
{
    corax_svg *svg = d->svg;
    corax_svg_group(svg, "frame", NULL);
    corax_svg_circle(svg, d->cx, d->cy, d->r, "primitive");
    for (int deg = 0; deg < 360; deg += 10) {
        double a = corax_rad(deg), len = deg % 90 ? 6.0 : 11.0, sa = sin(a), ca = cos(a);
        corax_svg_line(svg, d->cx + d->r * sa, d->cy - d->r * ca, d->cx + (d->r + len) * sa,
                       d->cy - (d->r + len) * ca, "tick");
    }
    corax_svg_line(svg, d->cx - 5, d->cy, d->cx + 5, d->cy, "tick");
    corax_svg_line(svg, d->cx, d->cy - 5, d->cx, d->cy + 5, "tick");
    double north[6] = {d->cx, d->cy - d->r - 30, d->cx - 6, d->cy - d->r - 14, d->cx + 6,
                       d->cy - d->r - 14};
    corax_svg_poly(svg, north, 3, 1, "north");
    corax_svg_text(svg, d->cx + 10, d->cy - d->r - 16, "label", "start", "N");
    corax_svg_end_group(svg);
}

void corax_disc_style(corax_svg *svg, const char *extra)
{
    char css[4096];
    size_t used = (size_t)snprintf(css, sizeof css,
        "text { font-family: 'DejaVu Sans', Verdana, sans-serif; fill: #1a1a1a; }\n"
        ".title { font-size: 20px; font-weight: bold; }\n"
        ".subtitle { font-size: 13px; fill: #444; }\n"
        ".heading { font-size: 16px; font-weight: bold; }\n"
        ".label { font-size: 13px; font-weight: bold; }\n"
        ".small { font-size: 12px; }\n"
        ".note { font-size: 12px; font-style: italic; fill: #7a3b00; }\n"
        ".paper { fill: #ffffff; stroke: none; }\n"
        ".primitive { fill: none; stroke: #1a1a1a; stroke-width: 1.6; }\n"
        ".tick { stroke: #1a1a1a; stroke-width: 1; }\n"
        ".north { fill: #1a1a1a; }\n"
        ".pt { stroke: #1a1a1a; stroke-width: 0.6; }\n"
        "%s", extra);
    for (size_t i = 0; i < CORAX_PALETTE_SIZE && used < sizeof css; i++)
        used += (size_t)snprintf(css + used, sizeof css - used, ".f%zu { fill: %s; }\n"
                                 ".k%zu { stroke: %s; }\n", i, corax_palette[i], i, corax_palette[i]);
    for (size_t i = 0; i < CORAX_BANDS && used < sizeof css; i++)
        used += (size_t)snprintf(css + used, sizeof css - used, ".b%zu { fill: %s; }\n", i,
                                 corax_band_fill[i]);
    corax_svg_style(svg, css);
}

void corax_panel_vline(corax_panel *p, const char *cls, double indent, const char *fmt,
                       va_list ap)
{
    char text[256];
    vsnprintf(text, sizeof text, fmt, ap);
    if (p->svg)
        corax_svg_text(p->svg, p->x + indent, p->y, cls, "start", text);
    p->y += 17.0;
}

void corax_panel_line(corax_panel *p, const char *cls, double indent, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    corax_panel_vline(p, cls, indent, fmt, ap);
    va_end(ap);
}
