/* corax: isolines (contour lines) of a field sampled on a regular grid, by
 * marching squares, joined into polylines (pure math). */
#ifndef CORAX_CONTOUR_H
#define CORAX_CONTOUR_H

#include <stddef.h>

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* A field sampled on a regular grid. value[j * nx + i] is the value at
 * (x0 + i dx, y0 + j dy); NaN marks a node without a value (cells touching
 * it get no isoline). */
typedef struct corax_grid {
    size_t nx, ny;       /* nodes along x and y, each at least 2 */
    double x0, y0;       /* the node (0, 0) */
    double dx, dy;       /* spacing, non-zero */
    const double *value; /* nx * ny values, borrowed */
} corax_grid;

/* Polylines: line i runs through points start[i] .. start[i + 1] - 1 of xy
 * (x and y interleaved). A closed line does not repeat its first point.
 * Zero-initialise; reuse across levels; free with corax_isolines_clear(). */
typedef struct corax_isolines {
    double *xy;
    size_t *start;          /* count + 1 entries */
    unsigned char *closed;  /* count entries: 1 when line i closes on itself */
    size_t count, points;
    size_t point_cap, line_cap;
} corax_isolines;

/* The isolines where the field crosses `level`, replacing what *out held.
 * A node at or above the level counts as above; a crossing is placed on the
 * cell edge by linear interpolation; a saddle cell is resolved by the mean of
 * its four corners. A line that meets a grid border or a NaN cell is left
 * open. CORAX_EARG for a grid smaller than 2 x 2 or without values,
 * CORAX_ENOMEM. */
corax_status corax_isolines_trace(const corax_grid *grid, double level, corax_isolines *out);

/* Release the memory of a set of lines and empty it. */
void corax_isolines_clear(corax_isolines *lines);

#ifdef __cplusplus
}
#endif
#endif
