/* survey: minimum curvature between stations (the published method; vector form
 * as in the project's geometry contract). */
#include <math.h>

#include "geometry/vec.h"
#include "survey/mincurve.h"

double corax_mc_dogleg(corax_vec3 t1, corax_vec3 t2)
{
    return 2.0 * fast_atan2(vec_norm(vec_sub(t2, t1)), vec_norm(vec_add(t2, t1)));
}

double corax_mc_ratio_factor(double b)
{
    if (b < 0.02) /* (2/b) tan(b/2) loses digits here; its series does not */
        return corax_mc_ratio_factor_series(b);
    return 2.0 / b * tan(0.5 * b);
}

corax_mc_course corax_mc_course_of(corax_vec3 t1, corax_vec3 t2, double length)
{
    corax_mc_course c;
    c.length = length;
    c.b = corax_mc_dogleg(t1, t2);
    small_sincos(c.b, &c.sin_b, &c.cos_b); /* a dogleg is small, most often */
    c.inv_sin_b = c.b > 1e-6 ? 1.0 / c.sin_b : 0.0;
    return c;
}
