/* draw: colours and symbols for sets of data on a picture. */
#include <math.h>

#include "corax/geometry.h"
#include "draw/palette.h"

const char *const corax_palette[CORAX_PALETTE_SIZE] = {
    "#12467f", "#e07b00", "#6fc0ea", "#a3271e", "#f2e05a", "#3a3a3a", "#c4649f", "#2f8f5b",
};

const char *const corax_band_fill[CORAX_BANDS] = {
    "#f1eee8", "#e3ddd2", "#d3cabb", "#c1b6a2", "#ada08a", "#978970", "#807259", "#695c45",
};

size_t corax_palette_colour_of(size_t set) { return set % CORAX_PALETTE_SIZE; }

corax_shape corax_palette_shape_of(size_t set)
{
    return (corax_shape)((set + set / CORAX_PALETTE_SIZE) % CORAX_SHAPES);
}

/* The corners of a regular polygon of k corners (a star of k points when
 * `star`), the first at angle a0 (radians clockwise from up), inscribed in
 * radius r about (0, dy); returns how many. */
static size_t regular(double *xy, double dy, double r, int k, double a0, int star)
{
    int n = star ? 2 * k : k;
    for (int i = 0; i < n; i++) {
        double a = a0 + 2.0 * CORAX_PI * i / n, rr = star && i % 2 ? 0.45 * r : r;
        xy[2 * i] = rr * sin(a);
        xy[2 * i + 1] = dy - rr * cos(a);
    }
    return (size_t)n;
}

size_t corax_palette_corners(corax_shape shape, double size, double *xy)
{
    double r = 0.5 * size;
    switch (shape) {
    case CORAX_SHAPE_CIRCLE: return regular(xy, 0.0, 0.85 * r, CORAX_SHAPE_CORNERS, 0.0, 0);
    case CORAX_SHAPE_SQUARE: return regular(xy, 0.0, 0.75 * sqrt(2.0) * r, 4, 0.25 * CORAX_PI, 0);
    case CORAX_SHAPE_TRIANGLE: return regular(xy, 0.15 * r, 1.1 * r, 3, 0.0, 0);
    case CORAX_SHAPE_DIAMOND: return regular(xy, 0.0, r, 4, 0.0, 0);
    case CORAX_SHAPE_DOWN_TRIANGLE: return regular(xy, -0.15 * r, 1.1 * r, 3, CORAX_PI, 0);
    case CORAX_SHAPE_HEXAGON: return regular(xy, 0.0, 0.95 * r, 6, 0.0, 0);
    case CORAX_SHAPE_STAR: return regular(xy, 0.0, 1.15 * r, 5, 0.0, 1);
    case CORAX_SHAPE_PENTAGON: return regular(xy, 0.0, 0.95 * r, 5, 0.0, 0);
    }
    return 0;
}

void corax_palette_symbol(corax_svg *svg, corax_shape shape, double x, double y, double size,
                          const char *cls)
{
    double r = 0.5 * size, xy[2 * CORAX_SHAPE_CORNERS];
    if (shape == CORAX_SHAPE_CIRCLE) {
        corax_svg_circle(svg, x, y, 0.85 * r, cls);
        return;
    }
    if (shape == CORAX_SHAPE_SQUARE) {
        corax_svg_rect(svg, x - 0.75 * r, y - 0.75 * r, 1.5 * r, 1.5 * r, cls);
        return;
    }
    size_t n = corax_palette_corners(shape, size, xy);
    for (size_t i = 0; i < n; i++) {
        xy[2 * i] += x;
        xy[2 * i + 1] += y;
    }
    corax_svg_poly(svg, xy, n, 1, cls);
}
