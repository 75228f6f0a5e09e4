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

/* A regular polygon of k corners (a star when `star`), the first at angle a0
 * (radians clockwise from up), inscribed in radius r. */
static void polygon(corax_svg *svg, double x, double y, double r, int k, double a0, int star,
                    const char *cls)
{
    double xy[20];
    int n = star ? 2 * k : k;
    for (int i = 0; i < n; i++) {
        double a = a0 + 2.0 * CORAX_PI * i / n, rr = star && i % 2 ? 0.45 * r : r;
        xy[2 * i] = x + rr * sin(a);
        xy[2 * i + 1] = y - rr * cos(a);
    }
    corax_svg_poly(svg, xy, (size_t)n, 1, cls);
}

void corax_palette_symbol(corax_svg *svg, corax_shape shape, double x, double y, double size,
                          const char *cls)
{
    double r = 0.5 * size;
    switch (shape) {
    case CORAX_SHAPE_CIRCLE: corax_svg_circle(svg, x, y, 0.85 * r, cls); break;
    case CORAX_SHAPE_SQUARE: corax_svg_rect(svg, x - 0.75 * r, y - 0.75 * r, 1.5 * r, 1.5 * r, cls); break;
    case CORAX_SHAPE_TRIANGLE: polygon(svg, x, y + 0.15 * r, 1.1 * r, 3, 0.0, 0, cls); break;
    case CORAX_SHAPE_DIAMOND: polygon(svg, x, y, r, 4, 0.0, 0, cls); break;
    case CORAX_SHAPE_DOWN_TRIANGLE: polygon(svg, x, y - 0.15 * r, 1.1 * r, 3, CORAX_PI, 0, cls); break;
    case CORAX_SHAPE_HEXAGON: polygon(svg, x, y, 0.95 * r, 6, 0.0, 0, cls); break;
    case CORAX_SHAPE_STAR: polygon(svg, x, y, 1.15 * r, 5, 0.0, 1, cls); break;
    case CORAX_SHAPE_PENTAGON: polygon(svg, x, y, 0.95 * r, 5, 0.0, 0, cls); break;
    }
}
