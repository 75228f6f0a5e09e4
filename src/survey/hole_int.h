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

/* One course of the path as corax_hole_at() needs it: the start (position
 * and tangent), the end's tangent and the arc. */
typedef struct corax_hole_span {
    corax_vec3 r1, t1, t2;
    corax_mc_course course; /* its dogleg b is NaN when the course is straight */
    int straight;           /* straight from the collar along t1 */
} corax_hole_span;

/* A hole is one cache-aligned block: this header, then the nodes' depths
 * (room of them), then the spans between nodes. A random depth in a random
 * hole (a log of many holes as it arrives) then costs the header and the
 * depths, fetched together at addresses known from the hole alone, and one
 * span: not a walk over scattered nodes. */
struct corax_hole {
    /* what corax_hole_at() reads, first */
    size_t n;       /* nodes */
    int has_path;   /* there is a station or a collar direction */
    int has_length; /* the collar gave the length */
    double length;  /* the collar's, else the deepest station's */
    size_t n_given;
    size_t room;    /* nodes the block has room for */
    corax_hole_node *node;
    char *name;
    corax_collar collar;
    corax_station *given; /* stations sorted by depth, azimuths corrected */
    size_t offset;  /* 1 when the collar leads the path as node 0 */
};

/* The header's bytes in the block, in whole cache lines. */
#define CORAX_HOLE_HEAD ((sizeof(struct corax_hole) + 63) / 64 * 64)

/* The bytes of the depths of n nodes, in whole cache lines. */
static inline size_t corax_hole_depth_bytes(size_t n) { return (n * sizeof(double) + 63) / 64 * 64; }

/* The nodes' depths, contiguous. */
static inline const double *hole_depths(const corax_hole *h)
{
    return (const double *)(const void *)((const char *)h + CORAX_HOLE_HEAD);
}

/* span[i]: the course from node i to node i + 1. */
static inline const corax_hole_span *hole_spans(const corax_hole *h)
{
    return (const corax_hole_span *)(const void *)((const char *)h + CORAX_HOLE_HEAD +
                                                   corax_hole_depth_bytes(h->room));
}

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
    const double *depth = hole_depths(h);
    size_t lo = 0, hi = h->n - 1; /* invariant: depth[lo] <= d < depth[hi] */
    if (hint && *hint + 1 < h->n) {
        size_t k = *hint;
        if (depth[k] <= d && d < depth[k + 1])
            return k;
        if (k + 2 < h->n && depth[k + 1] <= d && d < depth[k + 2])
            return *hint = k + 1;
    }
    while (hi - lo > 1) {
        size_t mid = lo + (hi - lo) / 2;
        if (depth[mid] <= d)
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
    const double *depths = hole_depths(h);
    double end = depths[h->n - 1];
    if (depth >= end) { /* straight on below the last station */
        const corax_hole_node *last = &h->node[h->n - 1];
        pt->tangent = last->t;
        pt->position = vec_add(last->r, vec_scale(last->t, depth - end));
        pt->where = h->n_given == 0 ? CORAX_WHERE_COLLAR_ONLY
                    : depth > end   ? CORAX_WHERE_EXTRAPOLATED
                                    : CORAX_WHERE_SURVEYED;
    } else {
        size_t i = find_course(h, depth, hint);
        const corax_hole_span *s = &hole_spans(h)[i];
        double along = depth - depths[i];
        if (s->straight) {
            pt->tangent = s->t1;
            pt->position = vec_add(s->r1, vec_scale(s->t1, along));
        } else {
            corax_mc_along(s->r1, s->t1, s->t2, &s->course, along / s->course.length,
                           &pt->position, &pt->tangent);
        }
        pt->where = CORAX_WHERE_SURVEYED;
    }
    if (h->has_length && depth > h->length) /* an unknown length has no end to pass */
        pt->where = CORAX_WHERE_BEYOND_END;
    return CORAX_OK;
}

#endif
