/* corax: a small SVG writer for stereonets, sections and report pictures.
 * Builds the document in memory (so a report can embed it) and writes it
 * whole through corax_writer. Coordinates are user units (pixels). */
#ifndef CORAX_SVG_H
#define CORAX_SVG_H

#include <stddef.h>

#include "corax/output.h"
#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_svg corax_svg;

/* A document of the given size; NULL when out of memory. */
corax_svg *corax_svg_new(double width, double height);
void corax_svg_free(corax_svg *svg);

/* A <style> block (CSS text, copied as is). */
void corax_svg_style(corax_svg *svg, const char *css);

/* Raw markup, printf-style; the caller escapes any text in it. */
void corax_svg_raw(corax_svg *svg, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;

/* <g class="cls" [transform]> ... </g>; cls and transform may be NULL. */
void corax_svg_group(corax_svg *svg, const char *cls, const char *transform);
void corax_svg_end_group(corax_svg *svg);

/* Shapes; cls (a CSS class) may be NULL. */
void corax_svg_line(corax_svg *svg, double x1, double y1, double x2, double y2,
                    const char *cls);
void corax_svg_circle(corax_svg *svg, double cx, double cy, double r, const char *cls);
void corax_svg_rect(corax_svg *svg, double x, double y, double w, double h, const char *cls);

/* An open polyline through n points xy[2i], xy[2i+1]; closed as a polygon
 * when `closed`. */
void corax_svg_poly(corax_svg *svg, const double *xy, size_t n, int closed, const char *cls);

/* Path pieces: begin, then move/line, then end (optionally closing). */
void corax_svg_path_begin(corax_svg *svg, const char *cls);
void corax_svg_path_move(corax_svg *svg, double x, double y);
void corax_svg_path_line(corax_svg *svg, double x, double y);
void corax_svg_path_end(corax_svg *svg, int close);

/* Text at (x, y); anchor is "start", "middle" or "end" (NULL: start). The
 * text is escaped for XML. */
void corax_svg_text(corax_svg *svg, double x, double y, const char *cls, const char *anchor,
                    const char *text);

/* A <title> child for the element just opened by corax_svg_group (tooltips). */
void corax_svg_title(corax_svg *svg, const char *text);

/* Append text escaped for XML (&, <, >, ", ') to the document; control
 * characters and bytes that are not UTF-8 become U+FFFD. */
void corax_svg_escaped(corax_svg *svg, const char *text);

/* The finished document (closing tag added once); NULL after a failed
 * allocation. Stays owned by svg. */
const char *corax_svg_finish(corax_svg *svg, size_t *length);

/* Finish and write to path ("-" for standard output), whole or not at all. */
corax_status corax_svg_save(corax_svg *svg, corax_outputs *set, const char *path,
                            corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
