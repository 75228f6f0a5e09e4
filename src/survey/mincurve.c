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
    if (b < 0.02) { /* (2/b) tan(b/2) loses digits here; its series does not */
        double b2 = b * b;
        return 1.0 + b2 / 12.0 + b2 * b2 / 120.0 + 17.0 * b2 * b2 * b2 / 20160.0;
    }
    return 2.0 / b * tan(0.5 * b);
}

corax_mc_course corax_mc_course_of(corax_vec3 t1, corax_vec3 t2, double length)
{
    corax_mc_course c;
    c.length = length;
    c.b = corax_mc_dogleg(t1, t2);
    c.sin_b = sin(c.b);
    c.cos_b = cos(c.b);
    return c;
}

void corax_mc_along(corax_vec3 r1, corax_vec3 t1, corax_vec3 t2, const corax_mc_course *c,
                    double f, corax_vec3 *r, corax_vec3 *t)
{
    corax_vec3 tf = t1;
    double fb = f * c->b, rf = 1.0;
    if (c->b > 0.0) {
        /* one sine and cosine of f b serve the arc and its ratio factor:
         * sin((1 - f) b) = sin b cos(fb) - cos b sin(fb) (the weights are then
         * normalised, so no division by sin b), and for fb not small
         * RF(fb) = (2 / fb) tan(fb / 2) = (2 / fb) sin(fb) / (1 + cos(fb)) */
        double sfb = sin(fb), cfb = cos(fb);
        tf = f == 1.0 ? t2 : vec_unit(vec_comb(t1, c->sin_b * cfb - c->cos_b * sfb, t2, sfb));
        rf = fb < 0.02 ? corax_mc_ratio_factor(fb) : 2.0 / fb * sfb / (1.0 + cfb);
    }
    double k = 0.5 * f * c->length * rf;
    *r = vec_add(r1, vec_scale(vec_add(t1, tf), k));
    *t = tf;
}
