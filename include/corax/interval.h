/* corax: from/to intervals down holes (lithology, alteration, assays):
 * desurveyed at their top, middle and bottom, checked for order and overlap,
 * and read for contacts, the depths where a unit gives way to another, each
 * oriented by the structures measured near it (pure math: no I/O). */
#ifndef CORAX_INTERVAL_H
#define CORAX_INTERVAL_H

#include <stddef.h>

#include "corax/finding.h"
#include "corax/stats.h"
#include "corax/survey.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- desurvey ---- */

/* An interval desurveyed: the points at from, at the middle depth and at
 * to (the middle's tangent is the hole's direction there). */
typedef struct corax_interval_points {
    corax_hole_point from, mid, to;
    corax_where where; /* the most doubtful of the three */
} corax_interval_points;

/* Desurvey the interval [from, to] of a hole: the same points as
 * corax_hole_at() at from, (from + to) / 2 and to. hint as for
 * corax_hole_at(). CORAX_EVALUE for a negative or non-finite depth or
 * from > to; CORAX_ENOTFOUND for a hole without a path. */
corax_status corax_interval_desurvey(const corax_hole *hole, double from, double to,
                                     size_t *hint, corax_interval_points *out);

/* ---- order and overlap ---- */

/* What is wrong with an interval. */
typedef enum corax_interval_fault {
    CORAX_INTERVAL_OK = 0,
    CORAX_INTERVAL_REVERSED, /* from > to */
    CORAX_INTERVAL_OVERLAP   /* shares depths with another interval of its hole */
} corax_interval_fault;

/* One interval as a table gives it: its hole (any number that tells holes
 * apart, such as the program index), depths and source line; the check
 * fills in its fault and, for an overlap, the other interval's line. */
typedef struct corax_interval {
    long hole;
    double from, to;
    long line;
    corax_interval_fault fault;
    long other_line;
} corax_interval;

/* "ok", "reversed", "overlaps". */
const char *corax_interval_fault_name(corax_interval_fault fault);

/* Check n intervals of a table (any order; v is sorted in place by hole,
 * then from, then line). Every reversed interval and every pair that
 * overlaps by more than 1e-9 m becomes a warning in out (check "intervals",
 * placed at file and line, naming the other line for an overlap) with the
 * hole name given by name(hole, ctx) (may be NULL), and its fault set (an
 * overlap on the later of the two by depth). CORAX_ENOMEM. */
corax_status corax_intervals_check(corax_interval *v, size_t n, const char *file,
                                   const char *(*name)(long hole, void *ctx), void *ctx,
                                   corax_findings *out);

/* ---- contacts ---- */

/* An interval of one hole with its unit (a number for each distinct unit,
 * -1 for none logged). */
typedef struct corax_unit_interval {
    double from, to;
    int unit;
    long line;
} corax_unit_interval;

/* A structure measured down the same hole that may orient a contact. */
typedef struct corax_contact_reading {
    double depth;     /* metres */
    corax_vec3 normal; /* a unit normal of its plane (either sense) */
} corax_contact_reading;

typedef enum corax_contact_status {
    CORAX_CONTACT_ORIENTED = 0,   /* structures lie within the window */
    CORAX_CONTACT_NONE_NEAR,      /* none within the window: a point without orientation */
    CORAX_CONTACT_NO_PATH         /* the hole has no path: no position either */
} corax_contact_status;

/* "oriented", "none-near", "no-survey". */
const char *corax_contact_status_name(corax_contact_status status);

typedef struct corax_contact {
    double depth;            /* metres: the upper interval's to, or the middle
                                of an unlogged gap between the two */
    double gap;              /* metres of core unlogged between them (0 when they touch) */
    int above, below;        /* the units up-hole and down-hole of it */
    long line_above, line_below; /* their lines */
    corax_hole_point point;  /* where it is */
    corax_contact_status status;
    size_t count;            /* structures averaged */
    double kappa;            /* Fisher's kappa of them; NaN below three */
    corax_plane plane;       /* their mean plane, when oriented */
    corax_vec3 normal;       /* its upward unit normal */
    int polarity;            /* 1 upright (younging along the upward normal),
                                -1 overturned, 0 not known */
    corax_vec3 younging;     /* unit normal toward the younger unit; zero when
                                not known */
} corax_contact;

/* The contacts of one hole: wherever the unit changes between two
 * consecutive intervals (by depth; intervals without a unit, or overlapping
 * the one before, are passed over). Each is oriented by the mean of the
 * readings within `window` metres of its depth (the Fisher mean of their
 * normals, axially, as corax_axial_summary_compute gives it). rank (may be
 * NULL) gives each unit's age order (0 the youngest; -1 or beyond nrank:
 * not known); when both units are ranked, the younger one's side gives the
 * polarity. intervals must be sorted by from; readings in any order.
 * *out is allocated (free()), *nout its length. CORAX_EARG for a negative
 * window, CORAX_ENOMEM. */
corax_status corax_contacts_find(const corax_hole *hole, const corax_unit_interval *intervals,
                                 size_t n, const corax_contact_reading *readings,
                                 size_t nreadings, double window, const int *rank,
                                 size_t nrank, corax_contact **out, size_t *nout);

#ifdef __cplusplus
}
#endif
#endif
