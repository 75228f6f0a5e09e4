/* Internal to src/draw: corax's own colours and symbols for sets of data,
 * chosen to stay apart for readers with red-green colour blindness. Each set
 * gets a colour and a shape, so colour is never the only cue. */
#ifndef CORAX_PALETTE_H
#define CORAX_PALETTE_H

#include <stddef.h>

#include "corax/svg.h"

enum { CORAX_PALETTE_SIZE = 8, CORAX_SHAPES = 8 };

/* The colours as #rrggbb: deep blue, orange, sky, brick, yellow, charcoal,
 * pink, green; lightness runs from 24 to 88 (CIE L*) so that they differ
 * in lightness as well as hue. */
extern const char *const corax_palette[CORAX_PALETTE_SIZE];

/* Shapes: circle, square, triangle, diamond, downward triangle, hexagon,
 * star, pentagon. */
typedef enum corax_shape {
    CORAX_SHAPE_CIRCLE = 0,
    CORAX_SHAPE_SQUARE,
    CORAX_SHAPE_TRIANGLE,
    CORAX_SHAPE_DIAMOND,
    CORAX_SHAPE_DOWN_TRIANGLE,
    CORAX_SHAPE_HEXAGON,
    CORAX_SHAPE_STAR,
    CORAX_SHAPE_PENTAGON
} corax_shape;

/* The colour index and shape of set i: distinct pairs for the first 64. */
size_t corax_palette_colour_of(size_t set);
corax_shape corax_palette_shape_of(size_t set);

/* The outline of a shape centred on the origin, about `size` pixels across,
 * as corners xy[2i], xy[2i + 1] (y down the page; room for
 * 2 CORAX_SHAPE_CORNERS numbers), a circle as a polygon of
 * CORAX_SHAPE_CORNERS corners; returns how many. For drawing many symbols
 * as one compact path. */
enum { CORAX_SHAPE_CORNERS = 12 };
size_t corax_palette_corners(corax_shape shape, double size, double *xy);

/* Draw a shape centred at (x, y), about `size` pixels across. */
void corax_palette_symbol(corax_svg *svg, corax_shape shape, double x, double y, double size,
                          const char *cls);

/* The light-to-dark fills of density bands (warm greys, lightness only), and
 * how many there are; bands beyond the last take the last. */
extern const char *const corax_band_fill[];
enum { CORAX_BANDS = 8 };

#endif
