/* The hole's frame at a point (internal): corax_core_frame_of() inline, for
 * the Monte Carlo's hot loop. */
#ifndef CORAX_FRAME_H
#define CORAX_FRAME_H

#include <math.h>

#include "corax/core.h"
#include "geometry/vec.h"

static inline corax_status core_frame_of(corax_vec3 t, corax_core_frame *f)
{
    double h = sqrt(t.x * t.x + t.y * t.y); /* |u - (u.t) t| for a unit t */
    f->t = t;
    if (h < 1e-9)
        return CORAX_EVALUE;
    /* r = -(u - (u.t) t) / h, written out: one division */
    double k = 1.0 / h;
    f->r = vec3(t.z * t.x * k, t.z * t.y * k, -(1.0 - t.z * t.z) * k);
    f->s = vec_cross(t, f->r);
    return CORAX_OK;
}

#endif
