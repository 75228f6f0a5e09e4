/* The hole's inner layout, shared by the survey and uncertainty modules. */
#ifndef CORAX_HOLE_INT_H
#define CORAX_HOLE_INT_H

#include "corax/survey.h"
#include "survey/mincurve.h"

#include <math.h>

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

/* corax_hole_at(), inline for the hot loops of the library (the Monte Carlo
 * asks it for every reading of every draw). */
/* The node that starts the course holding depth d, given d < last node depth. */
static inline size_t find_course(const corax_hole *h, double d, size_t *hint)
{
    size_t lo = 0, hi = h->n - 1; /* invariant: node[lo].depth <= d < node[hi].depth */
    if (hint && *hint + 1 < h->n) {
        size_t k = *hint;
        if (h->node[k].depth <= d && d < h->node[k + 1].depth)
            return k;
        if (k + 2 < h->n && h->node[k + 1].depth <= d && d < h->node[k + 2].depth)
            return *hint = k + 1;
    }
    while (hi - lo > 1) {
        size_t mid = lo + (hi - lo) / 2;
        if (h->node[mid].depth <= d)
            lo = mid;
        else
            hi = mid;
    }
    if (hint)
        *hint = lo;
    return lo;
}

static inline corax_status hole_at(const corax_hole *h, double depth, size_t *hint,
                                   corax_hole_point *pt)
{
    if (!isfinite(depth) || depth < 0.0)
        return CORAX_EVALUE;
    if (!h->has_path) {
        pt->position = h->collar.position;
        pt->tangent = vec3(0.0, 0.0, 0.0);
        pt->where = CORAX_WHERE_COLLAR_ONLY;
        return CORAX_ENOTFOUND;
    }
    const corax_hole_node *last = &h->node[h->n - 1];
    if (depth >= last->depth) { /* straight on below the last station */
        pt->tangent = last->t;
        pt->position = vec_add(last->r, vec_scale(last->t, depth - last->depth));
        pt->where = h->n_given == 0 ? CORAX_WHERE_COLLAR_ONLY
                    : depth > last->depth ? CORAX_WHERE_EXTRAPOLATED
                                          : CORAX_WHERE_SURVEYED;
    } else {
        size_t i = find_course(h, depth, hint);
        const corax_hole_node *a = &h->node[i], *z = &h->node[i + 1];
        if (z->straight) {
            pt->tangent = a->t;
            pt->position = vec_add(a->r, vec_scale(a->t, depth - a->depth));
        } else {
            corax_mc_along(a->r, a->t, z->t, &z->course, (depth - a->depth) / z->course.length,
                           &pt->position, &pt->tangent);
        }
        pt->where = CORAX_WHERE_SURVEYED;
    }
    if (h->has_length && depth > h->length) /* an unknown length has no end to pass */
        pt->where = CORAX_WHERE_BEYOND_END;
    return CORAX_OK;
}

#endif
