/* plan: where a planned hole pierces a target plane, found on the hole's own
 * minimum-curvature arc, or how close it comes when it misses. */
#include <math.h>
#include <stdlib.h>

#include "common/format.h"
#include "corax/plan.h"
#include "geometry/vec.h"

/* A target plane and the hole being tried against it. */
typedef struct trial {
    const corax_hole *hole;
    corax_vec3 normal, point;
    size_t hint;
} trial;

/* The signed distance of the hole at depth d from the plane (positive on the
 * normal's side), with the hole's point there. */
static double height(trial *tr, double d, corax_hole_point *pt)
{
    corax_hole_at(tr->hole, d, &tr->hint, pt);
    return vec_dot(tr->normal, vec_sub(pt->position, tr->point));
}

/* The crossing between depths a and b, whose heights ha and hb differ in sign
 * (or one of which is 0), by bisection to 1e-9 m. */
static double bisect(trial *tr, double a, double ha, double b)
{
    corax_hole_point pt;
    for (int i = 0; i < 200 && b - a > 1e-9; i++) {
        double mid = 0.5 * (a + b), hm = height(tr, mid, &pt);
        if (hm == 0.0)
            return mid;
        if ((hm < 0.0) == (ha < 0.0)) {
            a = mid;
            ha = hm;
        } else {
            b = mid;
        }
    }
    return ha == 0.0 ? a : 0.5 * (a + b);
}

/* The depth in [a, b] nearest the plane, by golden-section search of |h|
 * (which has no root there: it is smooth). */
static double nearest(trial *tr, double a, double b)
{
    const double g = 0.5 * (sqrt(5.0) - 1.0);
    corax_hole_point pt;
    double x1 = b - g * (b - a), x2 = a + g * (b - a);
    double f1 = fabs(height(tr, x1, &pt)), f2 = fabs(height(tr, x2, &pt));
    for (int i = 0; i < 200 && b - a > 1e-9; i++) {
        if (f1 <= f2) {
            b = x2;
            x2 = x1;
            f2 = f1;
            x1 = b - g * (b - a);
            f1 = fabs(height(tr, x1, &pt));
        } else {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + g * (b - a);
            f2 = fabs(height(tr, x2, &pt));
        }
    }
    return 0.5 * (a + b);
}

/* Where the hole, drilled on straight past its end, would reach the plane. */
static double drilled_on(trial *tr, double length)
{
    corax_hole_point pt;
    double h = height(tr, length, &pt), rate = vec_dot(tr->normal, pt.tangent);
    if (rate == 0.0 || -h / rate <= 0.0)
        return NAN; /* parallel, or heading away */
    return length - h / rate;
}

/* Fill the answer at depth d. */
static void answer_at(trial *tr, double d, corax_plan_pierce *out)
{
    corax_hole_point pt;
    out->distance = fabs(height(tr, d, &pt));
    out->depth = d;
    out->point = pt.position;
}

corax_status corax_plan_pierce_target(const corax_hole *hole, const corax_plan_target *target,
                                      const corax_convert_options *o, corax_plan_pierce *out)
{
    double length = corax_hole_length(hole);
    corax_hole_point pt;
    if (!(length > 0.0) || !isfinite(target->plane.dip) || !isfinite(target->plane.dip_direction) ||
        corax_hole_at(hole, 0.0, NULL, &pt) != CORAX_OK)
        return CORAX_EARG;
    trial tr = {hole, corax_plane_normal(target->plane), target->point, 0};
    corax_hole_depth *depths;
    size_t n;
    corax_status st = corax_hole_depths(hole, 1.0, &depths, &n);
    if (st != CORAX_OK)
        return st;
    out->reached = 0;
    out->alpha = out->again = out->drilled_on = NAN;
    double prev = height(&tr, 0.0, &pt), best = fabs(prev);
    size_t best_k = 0;
    for (size_t k = 0; k < n; k++) {
        double d = depths[k].depth, h = height(&tr, d, &pt);
        if (fabs(h) < best) {
            best = fabs(h);
            best_k = k;
        }
        int crosses = h == 0.0 || (k > 0 && (h < 0.0) != (prev < 0.0) && prev != 0.0);
        if (crosses && !out->reached) {
            out->reached = 1;
            answer_at(&tr, h == 0.0 ? d : bisect(&tr, depths[k - 1].depth, prev, d), out);
            out->distance = 0.0;
        } else if (crosses && isnan(out->again) && d > out->depth + 1e-6) {
            out->again = h == 0.0 ? d : bisect(&tr, depths[k - 1].depth, prev, d);
        }
        prev = h;
    }
    if (out->reached) {
        double beta;
        corax_hole_at(hole, out->depth, NULL, &pt);
        out->status = corax_plan_angles(pt.tangent, tr.normal, o, &out->alpha, &beta);
        if (out->status != CORAX_PLAN_PARALLEL && out->status != CORAX_PLAN_NEAR_PARALLEL)
            out->status = CORAX_PLAN_OK; /* beta's troubles are not the target's */
        if (out->status == CORAX_PLAN_PARALLEL)
            out->again = NAN; /* it lies in the plane: every depth is a crossing */
    } else {
        double a = best_k > 0 ? depths[best_k - 1].depth : 0.0;
        double b = best_k + 1 < n ? depths[best_k + 1].depth : length;
        answer_at(&tr, nearest(&tr, a, b), out);
        out->drilled_on = drilled_on(&tr, length);
        out->status = CORAX_PLAN_MISSED;
    }
    free(depths);
    return CORAX_OK;
}

size_t corax_plan_pierce_note(const corax_plan_pierce *p, double length, char *buf, size_t size)
{
    size_t used = 0;
    if (!size)
        return 0;
    buf[0] = '\0';
    if (p->status == CORAX_PLAN_PARALLEL)
        corax_note_add(buf, size, &used, "the hole runs in the plane");
    else if (p->status == CORAX_PLAN_NEAR_PARALLEL)
        corax_note_add(buf, size, &used,
                       "the hole meets the plane at a glancing angle: a small error in "
                       "the hole's or the plane's orientation moves the pierce point far");
    if (!isnan(p->again))
        corax_note_add(buf, size, &used, "crosses it again at %.2f m", p->again);
    if (!p->reached) {
        corax_note_add(buf, size, &used, "closest approach %.2f m from the plane, at %.2f m%s",
                       p->distance, p->depth,
                       fabs(p->depth - length) < 1e-6 ? " (the end of the hole)"
                       : p->depth < 1e-6              ? " (the collar)"
                                                      : "");
        if (isnan(p->drilled_on))
            corax_note_add(buf, size, &used, "drilled on straight it would not reach the plane");
        else
            corax_note_add(buf, size, &used, "drilled on straight it would reach the plane at "
                                             "%.2f m", p->drilled_on);
    }
    return used;
}
