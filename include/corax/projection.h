/* corax: projecting directions onto a stereonet, the lower hemisphere of a
 * unit sphere flattened into a disc of radius 1 (the primitive), x east and
 * y north (pure math). */
#ifndef CORAX_PROJECTION_H
#define CORAX_PROJECTION_H

#include "corax/geometry.h"
#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Which projection. theta is the angle of a direction from straight down. */
typedef enum corax_projection {
    CORAX_EQUAL_AREA = 0, /* Lambert azimuthal equal-area: r = sqrt(2) sin(theta/2) */
    CORAX_EQUAL_ANGLE     /* stereographic: r = tan(theta/2) */
} corax_projection;

/* "equal-area" or "equal-angle". */
const char *corax_projection_name(corax_projection projection);

/* Where an axial direction (non-zero, either sense; its lower end is used)
 * falls on the net: x = r sin(trend), y = r cos(trend), r <= 1. A vertical
 * direction falls at the centre, a horizontal one on the primitive. */
void corax_project(corax_projection projection, corax_vec3 v, double *x, double *y);

/* The unit direction that falls at (x, y), the inverse of corax_project()
 * inside the primitive (lower hemisphere, z <= 0). Beyond the primitive the
 * same formula goes on into the upper hemisphere: up to straight up at
 * r = sqrt(2) for equal-area, for any r with equal-angle. CORAX_EVALUE for a
 * point beyond r = sqrt(2) with equal-area, or a non-finite one. */
corax_status corax_unproject(corax_projection projection, double x, double y, corax_vec3 *v);

#ifdef __cplusplus
}
#endif
#endif
