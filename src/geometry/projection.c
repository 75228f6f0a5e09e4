/* geometry: equal-area and equal-angle projections of the lower hemisphere
 * onto the stereonet (pure math). */
#include <math.h>

#include "corax/projection.h"
#include "geometry/vec.h"

const char *corax_projection_name(corax_projection projection)
{
    return projection == CORAX_EQUAL_ANGLE ? "equal-angle" : "equal-area";
}

/* Radius on the net of a direction theta radians from straight down. */
static double radius_of(corax_projection projection, double theta)
{
    return projection == CORAX_EQUAL_ANGLE ? tan(0.5 * theta) : sqrt(2.0) * sin(0.5 * theta);
}

void corax_project(corax_projection projection, corax_vec3 v, double *x, double *y)
{
    if (v.z > 0.0) /* axial: the lower end */
        v = vec_neg(v);
    double h = hypot(v.x, v.y);
    if (h == 0.0) {
        *x = *y = 0.0;
        return;
    }
    double r = radius_of(projection, atan2(h, -v.z)); /* atan2: exact near vertical */
    *x = r * v.x / h;
    *y = r * v.y / h;
}

corax_status corax_unproject(corax_projection projection, double x, double y, corax_vec3 *v)
{
    double r = hypot(x, y), theta;
    if (!isfinite(r))
        return CORAX_EVALUE;
    if (projection == CORAX_EQUAL_ANGLE) {
        theta = 2.0 * atan(r);
    } else {
        double s = r / sqrt(2.0);
        if (s > 1.0 + 1e-12)
            return CORAX_EVALUE;
        theta = 2.0 * asin(fmin(s, 1.0));
    }
    if (r == 0.0) {
        *v = vec3(0.0, 0.0, -1.0);
        return CORAX_OK;
    }
    double st = sin(theta);
    *v = vec3(st * x / r, st * y / r, -cos(theta));
    return CORAX_OK;
}
