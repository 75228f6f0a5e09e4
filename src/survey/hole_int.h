/* The hole's inner layout, shared by the survey and uncertainty modules. */
#ifndef CORAX_HOLE_INT_H
#define CORAX_HOLE_INT_H

#include "corax/survey.h"

/* A point of the desurveyed path: the collar (when it leads) or a station. */
typedef struct corax_hole_node {
    double depth;
    corax_vec3 t;  /* unit tangent down the hole */
    corax_vec3 r;  /* position */
    double b;      /* dogleg of the course ending here, radians; NaN if none */
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

#endif
