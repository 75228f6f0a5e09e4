/* The hole's inner layout, shared by the survey and uncertainty modules. */
#ifndef CORAX_HOLE_INT_H
#define CORAX_HOLE_INT_H

#include "corax/survey.h"
#include "survey/mincurve.h"

/* A point of the desurveyed path: the collar (when it leads) or a station. */
typedef struct corax_hole_node {
    double depth;
    double azimuth, plunge; /* the direction as surveyed (corrected), radians */
    double azimuth_error, dip_error; /* the station's own one-sigma errors, or NaN */
    corax_vec3 t;  /* unit tangent down the hole */
    corax_vec3 r;  /* position */
    corax_mc_course course; /* the course ending here; its dogleg b is NaN if none */
    int straight;  /* the course ending here runs straight from the collar */
} corax_hole_node;

struct corax_hole {
    char *name;
    corax_collar collar;
    corax_station *given; /* stations sorted by depth, azimuths corrected */
    size_t n_given;
    corax_hole_node *node;
    size_t n;       /* nodes */
    size_t offset;  /* 1 when the collar leads the path as node 0 */
    int has_path;   /* there is a station or a collar direction */
    double length;  /* the collar's, else the deepest station's */
    int has_length; /* the collar gave the length */
};

/* A copy of a hole to resurvey again and again (allocates once); NULL when
 * out of memory. Free it with corax_hole_free(). */
corax_hole *corax_hole_copy(const corax_hole *base);

/* Number of path nodes (the collar, when it leads, then the stations). */
size_t corax_hole_node_count(const corax_hole *hole);

/* A node's own survey errors (radians; NaN when the run's apply). */
void corax_hole_node_errors(const corax_hole *hole, size_t i, double *azimuth_error,
                            double *dip_error);

/* Desurvey `work`, a copy of `base`, again with every node's direction turned
 * by d_azimuth[i] and d_plunge[i] (radians; node_count entries each). A
 * plunge turned past the vertical swings the hole over, as it should. A collar
 * node that only borrows the first station's direction turns with it.
 * CORAX_ESURVEY when two nodes end up opposite (the work hole is then unusable
 * for this draw). */
corax_status corax_hole_resurvey(corax_hole *work, const corax_hole *base,
                                 const double *d_azimuth, const double *d_plunge);

#endif
