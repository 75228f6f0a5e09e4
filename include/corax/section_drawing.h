/* corax: the picture of a cross-section. Collects hole paths and structures
 * already projected into a section (section.h), then draws them to scale
 * as SVG: equal horizontal and vertical scale, a scale bar, an elevation
 * axis in metres, the azimuth at each end of the section, hole paths with
 * depth ticks (solid inside the slab, dashed outside it), structures as
 * short ticks at their apparent dips coloured by feature kind, a legend,
 * and a footer with the usual caution. */
#ifndef CORAX_SECTION_DRAWING_H
#define CORAX_SECTION_DRAWING_H

#include <stddef.h>

#include "corax/section.h"
#include "corax/svg.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_section_drawing corax_section_drawing;

/* A drawing of a section whose hole paths were sampled every `step` metres
 * (depth ticks fall on those samples); NULL when out of memory. */
corax_section_drawing *corax_section_drawing_new(const corax_section *section, double step);
void corax_section_drawing_free(corax_section_drawing *d);

/* Add a hole's projected path (copied), as made by corax_section_trace(). */
corax_status corax_section_drawing_hole(corax_section_drawing *d, const char *name,
                                        const corax_section_sample *t, size_t n);

/* Add a structure at a point of the section. dip is how its plane shows in
 * the section (NULL when it has no orientation: drawn as an open circle).
 * kind is its feature kind code (structure.h) and kind_name the name for the
 * legend; label (may be NULL) becomes its tooltip. Strings are copied. */
corax_status corax_section_drawing_structure(corax_section_drawing *d, corax_section_point at,
                                             const corax_section_dip *dip, int kind,
                                             const char *kind_name, const char *label);

/* Draw at a scale of 1:ratio, taking the SVG pixel as 1/96 inch (its size in
 * CSS and in print), rather than fitting the section to about 1000 by 620
 * pixels. ratio 0 goes back to fitting. A picture at 1:1000 shows 100 m of
 * section in about 378 pixels. */
void corax_section_drawing_scale(corax_section_drawing *d, double ratio);

/* Number of structures added. */
size_t corax_section_drawing_count(const corax_section_drawing *d);

/* Lay the section out and draw it. title heads the picture; footer (may be
 * NULL) is a line added above the caution. The caller frees the result
 * with corax_svg_free(); NULL when out of memory. */
corax_svg *corax_section_drawing_render(const corax_section_drawing *d, const char *title,
                                        const char *footer);

#ifdef __cplusplus
}
#endif
#endif
