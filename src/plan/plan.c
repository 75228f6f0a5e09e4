/* plan: drill planning. The angles a known plane would show in a planned
 * hole, and the path of a planned hole that curves as holes do. */
#include <math.h>
#include <stdlib.h>

#include "corax/core.h"
#include "corax/plan.h"
#include "geometry/vec.h"

const char *corax_plan_status_name(corax_plan_status status)
{
    switch (status) {
    case CORAX_PLAN_OK: return "ok";
    case CORAX_PLAN_NEAR_PERPENDICULAR: return "near-perpendicular";
    case CORAX_PLAN_NO_REFERENCE: return "no-reference-line";
    case CORAX_PLAN_NEAR_PARALLEL: return "near-parallel";
    case CORAX_PLAN_PARALLEL: return "parallel";
    case CORAX_PLAN_MISSED: return "missed";
    }
    return "unknown";
}

corax_plan_status corax_plan_angles(corax_vec3 t, corax_vec3 normal,
                                    const corax_convert_options *o, double *alpha,
                                    double *beta)
{
    corax_vec3 n = vec_unit(normal);
    /* alpha = asin |n.t|, in its atan2 form: exact near 0 and near 90 */
    *alpha = atan2(fabs(vec_dot(n, t)), vec_norm(vec_cross(n, t)));
    *beta = NAN;
    corax_core_frame f;
    int framed = corax_core_off_vertical(t) >= o->vertical_limit &&
                 corax_core_frame_of(t, &f) == CORAX_OK;
    if (*alpha < CORAX_PLAN_PARALLEL_LIMIT)
        return CORAX_PLAN_PARALLEL; /* the ellipse has no ends: beta stays undefined */
    if (framed) {
        double a;
        corax_core_plane_angles(&f, n, &o->conventions, &a, beta);
    }
    if (*alpha < o->near_parallel)
        return CORAX_PLAN_NEAR_PARALLEL;
    if (!framed)
        return CORAX_PLAN_NO_REFERENCE;
    if (*alpha > o->near_perpendicular)
        return CORAX_PLAN_NEAR_PERPENDICULAR;
    return CORAX_PLAN_OK;
}

double corax_plan_kappa_of_cone(double cone, double p)
{
    double c = cos(cone);
    if (!(cone > 0.0 && cone < CORAX_PI && p > 0.0 && p < 1.0) || 0.5 * (1.0 - c) >= p)
        return NAN; /* a uniform spread already puts p inside the cone */
    /* the share inside the cone grows with kappa: bisect on log kappa */
    double lo = log(1e-9), hi = log(1e9);
    for (int i = 0; i < 200 && hi - lo > 1e-13; i++) {
        double mid = 0.5 * (lo + hi), k = exp(mid);
        double inside = -expm1(k * (c - 1.0)) / -expm1(-2.0 * k);
        if (inside < p)
            lo = mid;
        else
            hi = mid;
    }
    return exp(0.5 * (lo + hi));
}

corax_status corax_plan_path(const corax_plan_hole *plan, corax_hole **out, corax_error *err)
{
    *out = NULL;
    double length = plan->length;
    if (!(length > 0.0 && length <= CORAX_PLAN_MAX_LENGTH) || !isfinite(plan->azimuth) ||
        !isfinite(plan->plunge) || !isfinite(plan->lift) || !isfinite(plan->drift))
        return corax_error_set(err, CORAX_EVALUE, NULL, plan->line,
                               "planned hole %s: its direction, lift and drift must be "
                               "finite and its length in (0, %g] m",
                               plan->name, CORAX_PLAN_MAX_LENGTH);
    corax_collar collar = {plan->collar, plan->azimuth, plan->plunge, 1, length};
    if (plan->lift == 0.0 && plan->drift == 0.0) /* straight along the collar */
        return corax_hole_new(plan->name, &collar, NULL, 0, 0.0, out, err);
    double step = CORAX_PLAN_STATION_STEP;
    size_t n = (size_t)ceil(length / step - 1e-9) + 1; /* the collar, every 30 m, the end */
    corax_station *s = malloc(n * sizeof *s);
    if (!s)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < n; i++) {
        double depth = i + 1 < n ? (double)i * step : length, turns = depth / step;
        s[i] = corax_station_make(depth, plan->azimuth + turns * plan->drift,
                                  plan->plunge - turns * plan->lift, plan->line);
    }
    corax_status st = corax_hole_new(plan->name, &collar, s, n, 0.0, out, err);
    free(s);
    return st;
}
