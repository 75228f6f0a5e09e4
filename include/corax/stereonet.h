/* corax: stereonets drawn as SVG. Lower hemisphere, equal-area or
 * equal-angle; planes as poles or great circles, lines as points, planes
 * known by alpha alone as small circles, solved poles with their cones; density
 * shaded and contoured in multiples of sigma; each set's mean with its 95%
 * cone and, on a net of one set, the principal axes. */
#ifndef CORAX_STEREONET_H
#define CORAX_STEREONET_H

#include <stddef.h>

#include "corax/projection.h"
#include "corax/stats.h"
#include "corax/status.h"
#include "corax/svg.h"

#ifdef __cplusplus
extern "C" {
#endif

/* A plane known by alpha alone: its pole lies on the small circle of
 * half-angle `angle` (radians; 90 - alpha) about the core axis. */
typedef struct corax_net_circle {
    corax_vec3 axis; /* unit */
    double angle;
} corax_net_circle;

/* A pole found by solving (corax_solve_cones()), with its cone. */
typedef struct corax_net_pick {
    corax_vec3 pole;   /* unit, either sense */
    double cone;       /* half-angle of its 95% cone, radians; NaN: none */
    const char *label; /* short, drawn beside it (e.g. the candidate's rank) */
} corax_net_pick;

/* One set of readings (a group): planes by their unit normals (either
 * sense) with optional weights, and lines (axial unit vectors); planes known
 * by alpha alone as small circles, and solved poles. Borrowed. */
typedef struct corax_net_set {
    const char *name;                        /* legend label */
    const corax_vec3 *poles;
    const double *pole_weight;               /* NULL: unweighted */
    size_t npoles;
    const corax_vec3 *lines;
    size_t nlines;
    const corax_axial_summary *pole_summary; /* NULL: no mean, cone or axes */
    const corax_axial_summary *line_summary;
    size_t skipped;                          /* rows left out, for the note */
    const corax_net_circle *circles;         /* may be NULL */
    size_t ncircles;
    const corax_net_pick *picks;             /* may be NULL */
    size_t npicks;
} corax_net_set;

/* How planes are shown (bits). */
enum { CORAX_NET_POLES = 1, CORAX_NET_GREAT_CIRCLES = 2 };

typedef struct corax_net_style {
    corax_projection projection;
    unsigned planes;                 /* CORAX_NET_POLES and/or CORAX_NET_GREAT_CIRCLES */
    int contours;                    /* shade and contour the density */
    corax_density_method density;
    double contour_step;             /* contour interval in sigma, > 0 */
    size_t grid;                     /* density grid nodes a side (e.g. 121) */
    int weighted;                    /* the weights are Terzaghi's: say so */
    double min_angle;                /* their cap angle (radians), for the caption */
    const char *title;               /* page title; may be NULL */
    const char *id_prefix;           /* starts the page's element ids (letters,
                                        digits, - and _, a letter first), so that
                                        several pages can share one HTML document;
                                        NULL: "corax-net" */
} corax_net_style;

/* The defaults: equal-area, poles, Kamb contours every 2 sigma, grid 121,
 * ids starting "corax-net". */
corax_net_style corax_net_style_default(void);

/* A page with every set on one net (colours, shapes and a legend), or, with
 * `net_per_set`, one net per set in rows. Density is counted over the poles
 * of the sets on a net (over the lines when it has no poles), when there are
 * at least CORAX_FISHER_MIN_READINGS of them. An empty net shows the
 * primitive and a note. The caller owns *out (corax_svg_free).
 * CORAX_EARG for a bad style (an id prefix included) or nsets == 0;
 * CORAX_ENOMEM. */
corax_status corax_stereonet_page(const corax_net_set *sets, size_t nsets,
                                  const corax_net_style *style, int net_per_set,
                                  corax_svg **out);

#ifdef __cplusplus
}
#endif
#endif
