/* survey: minimum curvature between stations (the published method; vector form
 * as in the project's geometry contract). */
#include <math.h>

#include "geometry/vec.h"
#include "survey/mincurve.h"

double corax_mc_dogleg(corax_vec3 t1, corax_vec3 t2)
{
    return 2.0 * atan2(vec_norm(vec_sub(t2, t1)), vec_norm(vec_add(t2, t1)));
}

double corax_mc_ratio_factor(double b)
{
    if (b < 0.02) { /* (2/b) tan(b/2) loses digits here; its series does not */
        double b2 = b * b;
        return 1.0 + b2 / 12.0 + b2 * b2 / 120.0 + 17.0 * b2 * b2 * b2 / 20160.0;
    }
    return 2.0 / b * tan(0.5 * b);
}

void corax_mc_along(corax_vec3 r1, corax_vec3 t1, corax_vec3 t2, double length,
                    double b, double f, corax_vec3 *r, corax_vec3 *t)
{
    corax_vec3 tf;
    if (b == 0.0) {
        tf = t1;
    } else if (f == 1.0) {
        tf = t2;
    } else {
        double s = sin(b);
        tf = vec_unit(vec_comb(t1, sin((1.0 - f) * b) / s, t2, sin(f * b) / s));
    }
    double k = 0.5 * f * length * corax_mc_ratio_factor(f * b);
    *r = vec_add(r1, vec_scale(vec_add(t1, tf), k));
    *t = tf;
}
