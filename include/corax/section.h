/* corax: vertical cross-sections. A section is a line on the map through an
 * origin at an azimuth, and a slab of ground either side of it; points and
 * hole paths are projected onto its vertical plane, planes show their
 * apparent dip in it.
 *
 * Distance along the section grows toward the section's azimuth from the
 * origin (negative behind it). Offset is the signed horizontal distance from
 * the section plane, POSITIVE ON THE RIGHT when looking along the azimuth
 * (toward azimuth + 90 degrees). Elevation is z. All in metres; angles in
 * radians. */
#ifndef CORAX_SECTION_H
#define CORAX_SECTION_H

#include <stddef.h>

#include "corax/geometry.h"
#include "corax/status.h"
#include "corax/survey.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_section {
    double x, y;       /* the origin, a point on the section line, metres */
    double azimuth;    /* radians in [0, 2 pi): distance along grows this way */
    double half_width; /* metres, > 0: the slab reaches this far either side */
    double from, to;   /* the stretch of the line kept, as distances along;
                        * -HUGE_VAL and HUGE_VAL when open */
} corax_section;

/* A section through (x, y) at an azimuth (radians, wrapped), with a slab
 * `width` metres wide in all (half on each side), open at both ends. */
corax_section corax_section_make(double x, double y, double azimuth, double width);

/* Where a point falls relative to a section. */
typedef struct corax_section_point {
    double along;     /* distance along the section from the origin */
    double offset;    /* from the section plane, positive on the right */
    double elevation; /* z */
} corax_section_point;

corax_section_point corax_section_project(const corax_section *s, corax_vec3 p);

/* 1 when |offset| <= half width (the faces of the slab count as inside). */
int corax_section_in_slab(const corax_section *s, const corax_section_point *p);

/* 1 when from <= along <= to. */
int corax_section_in_range(const corax_section *s, double along);

/* A plane as the section shows it. */
typedef struct corax_section_dip {
    double apparent; /* radians in [0, pi/2]: tan(apparent) = tan(dip) |cos(s - dip direction)| */
    int toward;      /* +1: dips toward the azimuth end; -1: toward the other end;
                      * 0: shows no dip (the section runs along its strike) */
    double toward_azimuth; /* radians: the azimuth of that end; NaN when toward is 0 */
    double along, up;      /* unit direction of the plane's trace in the section
                            * (distance along, elevation), pointing down the
                            * apparent dip; (1, 0) when it shows no dip */
} corax_section_dip;

/* The apparent dip of a plane in the section (corax_apparent_dip()), with
 * the end it dips toward and the direction of its trace. */
corax_section_dip corax_section_plane(const corax_section *s, corax_plane plane);

/* One point of a hole's path projected into a section. */
typedef struct corax_section_sample {
    double depth;           /* metres down the hole */
    corax_section_point at; /* where it falls */
    int in_slab;            /* |offset| <= half width */
} corax_section_sample;

/* A hole's path projected into a section: the depths of corax_hole_depths()
 * (collar, every `step` metres, stations, end), each placed on the arc by
 * corax_hole_at(), plus the depths where the path crosses a face of the slab,
 * found by bisection on the arc to better than a millimetre (so a caller can
 * switch between inside and outside exactly there). A crossing sample lies on
 * the face and counts as inside.
 *
 * *out is allocated (release it with free()), *n gets its length.
 * CORAX_ENOTFOUND when the hole has no path (no station, no collar
 * direction); CORAX_EARG for a step that is negative or not finite;
 * CORAX_ENOMEM. */
corax_status corax_section_trace(const corax_section *s, const corax_hole *hole, double step,
                                 corax_section_sample **out, size_t *n);

/* 1 when some part of a projected path lies in the slab and within the
 * section's from..to stretch. */
int corax_section_trace_reaches(const corax_section *s, const corax_section_sample *t,
                                size_t n);

#ifdef __cplusplus
}
#endif
#endif
