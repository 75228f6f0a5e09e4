/* corax: the picture of a sweep of hole directions (SVG). A lower-hemisphere
 * net of hole directions, each direction swept a cell shaded by its score;
 * the sets' poles, mean planes and spreads, the planned holes' directions
 * and the best direction marked; a side panel that explains them. */
#ifndef CORAX_PLAN_DRAWING_H
#define CORAX_PLAN_DRAWING_H

#include <stddef.h>

#include "corax/plan.h"
#include "corax/svg.h"

#ifdef __cplusplus
extern "C" {
#endif

/* What the picture shows; everything is borrowed. */
typedef struct corax_plan_picture {
    const corax_plan_model *model;          /* the sets */
    const corax_plan_direction *directions; /* scored, in any order */
    size_t ndirections;
    double azimuth_step, plunge_step;       /* radians: the sweep's steps, the size
                                               of each direction's cell */
    const corax_plan_hole *holes;           /* marked at their collar directions */
    size_t nholes;
    const corax_plan_program_set *program;  /* one per set, for the line on badly
                                               sampled sets; may be NULL */
    size_t ntargets;                        /* target planes the score counted */
    corax_dip_convention dip_convention;    /* how dips are written */
    const char *title;                      /* NULL: "Drill direction score" */
} corax_plan_picture;

/* Draw the picture. Up-hole directions (plunge below 0) are left off the net
 * (the panel says how many). The caller owns *out (corax_svg_free).
 * CORAX_EARG when there is no direction or the steps are not above 0;
 * CORAX_ENOMEM. */
corax_status corax_plan_picture_draw(const corax_plan_picture *picture, corax_svg **out);

#ifdef __cplusplus
}
#endif
#endif
