/* Internal to src/draw: a net on the page (the lower hemisphere as a disc)
 * and the curves and frame drawn on it, shared by the stereonet and the
 * plan's score picture. */
#ifndef CORAX_NET_H
#define CORAX_NET_H

#include <stdarg.h>

#include "corax/projection.h"
#include "corax/svg.h"

typedef struct corax_disc {
    corax_svg *svg;
    corax_projection projection;
    double cx, cy, r; /* centre and radius of the primitive, pixels */
} corax_disc;

/* The page point of net coordinates (x east, y north, radius 1). */
void corax_disc_screen(const corax_disc *d, double x, double y, double *sx, double *sy);

/* The page point of an axial direction (its lower end). */
void corax_disc_place(const corax_disc *d, corax_vec3 v, double *sx, double *sy);

/* A curve through the unit vectors p[0..m) (back to p[0] when closed), as it
 * falls on the lower hemisphere: a part above the horizontal is drawn by its
 * opposite ends, so the curve breaks where it crosses the primitive and goes
 * on from the opposite side. */
void corax_disc_curve(const corax_disc *d, const corax_vec3 *p, size_t m, int closed,
                      const char *cls);

/* The great circle of the plane of unit normal `normal`. */
void corax_disc_great_circle(const corax_disc *d, corax_vec3 normal, const char *cls);

/* The small circle of half-angle `angle` (radians) about the unit axis. */
void corax_disc_small_circle(const corax_disc *d, corax_vec3 axis, double angle,
                             const char *cls);

/* The primitive, a tick every 10 degrees, the centre cross and north. */
void corax_disc_frame(const corax_disc *d);

/* The page's style sheet: text (classes title, subtitle, heading, label,
 * small, note), the frame (paper, primitive, tick, north), marks (pt), the
 * palette's set colours (fill f0.., stroke k0..) and density bands (b0..),
 * then the rules in `extra` (CSS, at most about 2 kB). */
void corax_disc_style(corax_svg *svg, const char *extra);

/* A column of text lines beside a net, 17 pixels apart; svg NULL measures
 * the column without drawing it. */
typedef struct corax_panel {
    corax_svg *svg;
    double x, y; /* the left edge, and the baseline of the next line */
} corax_panel;

/* One line, printf-style, `indent` pixels in; lines longer than 255 bytes
 * are cut. */
void corax_panel_vline(corax_panel *p, const char *cls, double indent, const char *fmt,
                       va_list ap);
void corax_panel_line(corax_panel *p, const char *cls, double indent, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 4, 5)))
#endif
    ;

#endif
