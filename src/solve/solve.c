/* solve: orientation where the core has none. Planes from alpha-only
 * readings in several holes: each reading puts the plane's normal on a cone
 * about its hole; the plane is where the cones meet (least squares on the
 * angles, from every pairwise meeting place and a coarse search). */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/solve.h"
#include "corax/stats.h"
#include "geometry/vec.h"
#include "solve/solve_int.h"
#include "survey/hole_int.h"

static const char *const status_names[] = {"solved",   "ambiguous",   "parallel-holes",
                                           "one-hole", "one-reading", "no-readings"};

const char *corax_solve_status_name(corax_solve_status status)
{
    return (unsigned)status < sizeof status_names / sizeof status_names[0] ? status_names[status]
                                                                          : "unknown";
}

corax_solve_options corax_solve_options_default(void)
{
    corax_solve_options o = {corax_rad(15.0), corax_rad(2.0)};
    return o;
}

/* The angle between the lines of a and b, in [0, pi/2]. */
static double line_angle(corax_vec3 a, corax_vec3 b)
{
    return fast_atan2(vec_norm(vec_cross(a, b)), fabs(vec_dot(a, b)));
}

double corax_cone_residual(const corax_cone *cone, corax_vec3 normal)
{
    return line_angle(normal, cone->axis) - (0.5 * CORAX_PI - cone->alpha);
}

static double cost(const corax_cone *c, size_t n, corax_vec3 x)
{
    double f = 0.0;
    for (size_t i = 0; i < n; i++) {
        double r = corax_cone_residual(&c[i], x);
        f += r * r;
    }
    return f;
}

/* Two unit vectors completing a right-handed frame with the unit vector m. */
static void tangent_basis(corax_vec3 m, corax_vec3 *a, corax_vec3 *b)
{
    corax_vec3 helper = fabs(m.z) < 0.9 ? vec3(0, 0, 1) : vec3(1, 0, 0);
    *a = vec_unit(vec_cross(helper, m));
    *b = vec_cross(m, *a);
}

corax_vec3 solve_upward(corax_vec3 v)
{
    return v.z < 0.0 ? vec_neg(v) : v;
}

void corax_solve_refine(const corax_cone *c, size_t n, corax_vec3 start, corax_vec3 *normal,
                        double *misfit)
{
    corax_vec3 x = vec_unit(start);
    double f = cost(c, n, x), lambda = 1e-3;
    for (int it = 0; it < 200 && n > 0; it++) {
        corax_vec3 u, w;
        tangent_basis(x, &u, &w);
        /* the residuals' gradients are unit vectors in the tangent plane:
         * moving the normal toward the axis by d shortens its angle by d */
        double a11 = 0, a12 = 0, a22 = 0, g1 = 0, g2 = 0;
        for (size_t i = 0; i < n; i++) {
            double dot = vec_dot(x, c[i].axis);
            corax_vec3 toward = vec_sub(c[i].axis, vec_scale(x, dot));
            double s = vec_norm(toward);
            if (s < 1e-12)
                continue; /* on the axis: the angle has no gradient there */
            corax_vec3 g = vec_scale(toward, (dot < 0.0 ? 1.0 : -1.0) / s);
            double j1 = vec_dot(g, u), j2 = vec_dot(g, w), r = corax_cone_residual(&c[i], x);
            a11 += j1 * j1;
            a12 += j1 * j2;
            a22 += j2 * j2;
            g1 += j1 * r;
            g2 += j2 * r;
        }
        double scale = 0.5 * (a11 + a22) + 1e-300, step = 0.0;
        int accepted = 0;
        for (int tries = 0; tries < 40 && !accepted; tries++) {
            double m11 = a11 + lambda * scale, m22 = a22 + lambda * scale;
            double det = m11 * m22 - a12 * a12;
            if (!(det > 0.0)) {
                lambda *= 4.0;
                continue;
            }
            double d1 = -(m22 * g1 - a12 * g2) / det, d2 = -(m11 * g2 - a12 * g1) / det;
            corax_vec3 y = vec_unit(vec_add(x, vec_comb(u, d1, w, d2)));
            double fy = cost(c, n, y);
            if (fy <= f) {
                x = y;
                f = fy;
                step = hypot(d1, d2);
                lambda = fmax(lambda / 3.0, 1e-12);
                accepted = 1;
            } else {
                lambda *= 4.0;
            }
        }
        if (!accepted || step < 1e-13)
            break;
    }
    *normal = solve_upward(x);
    if (misfit)
        *misfit = n ? sqrt(f / (double)n) : (double)NAN;
}

/* ---- holes and their mean cones ---- */

typedef struct hole_cone {
    size_t hole;
    corax_vec3 axis; /* the sum of its readings' axes, turned to agree */
    double gamma;    /* the sum of their angles between normal and axis */
    size_t n;
} hole_cone;

/* Each hole's mean axis and mean cone angle; *count gets the holes. */
static hole_cone *mean_cones(const corax_cone *c, size_t n, size_t *count)
{
    hole_cone *h = malloc((n ? n : 1) * sizeof *h);
    size_t m = 0;
    for (size_t i = 0; h && i < n; i++) {
        size_t k = 0;
        while (k < m && h[k].hole != c[i].hole)
            k++;
        if (k == m)
            h[m++] = (hole_cone){c[i].hole, vec3(0, 0, 0), 0.0, 0};
        corax_vec3 a = vec_unit(c[i].axis);
        h[k].axis = vec_add(h[k].axis, vec_dot(a, h[k].axis) < 0.0 ? vec_neg(a) : a);
        h[k].gamma += 0.5 * CORAX_PI - c[i].alpha;
        h[k].n++;
    }
    for (size_t k = 0; k < m; k++) {
        h[k].axis = vec_unit(h[k].axis);
        h[k].gamma /= (double)h[k].n;
    }
    *count = m;
    return h;
}

/* Where the cones of half-angles ga about a and gb about b meet (0 or 2
 * directions); when they miss, the direction in their plane nearest both. */
static size_t meet(corax_vec3 a, double ga, corax_vec3 b, double gb, corax_vec3 *out)
{
    double c = vec_dot(a, b), d = 1.0 - c * c;
    if (d < 1e-12)
        return 0;
    double ca = cos(ga), cb = cos(gb);
    double x = (ca - c * cb) / d, y = (cb - c * ca) / d;
    corax_vec3 m = vec_comb(a, x, b, y);
    double mm = vec_dot(m, m);
    if (mm > 1.0) {
        out[0] = vec_unit(m);
        return 1;
    }
    corax_vec3 w = vec_unit(vec_cross(a, b));
    double z = sqrt(1.0 - mm);
    out[0] = vec_comb(m, 1.0, w, z);
    out[1] = vec_comb(m, 1.0, w, -z);
    return 2;
}

/* A lattice of about `count` directions over the upper hemisphere (a
 * Fibonacci spiral: even spacing without poles of its own). */
static corax_vec3 lattice(size_t i, size_t count)
{
    double golden = CORAX_PI * (3.0 - sqrt(5.0));
    double z = 1.0 - ((double)i + 0.5) / (double)count;
    double r = sqrt(fmax(0.0, 1.0 - z * z)), t = golden * (double)i;
    return vec3(r * cos(t), r * sin(t), z);
}

enum { LATTICE = 400, LATTICE_STARTS = 6, MAX_STARTS = 4096 };

/* Keep a polished solution unless one within 0.1 degree is there already
 * (then keep the better). */
static void keep(corax_solution *found, size_t *nfound, size_t cap, corax_vec3 x, double misfit)
{
    for (size_t k = 0; k < *nfound; k++)
        if (line_angle(found[k].normal, x) < corax_rad(0.1)) {
            if (misfit < found[k].misfit) {
                found[k].normal = x;
                found[k].misfit = misfit;
            }
            return;
        }
    if (*nfound < cap)
        found[(*nfound)++] = (corax_solution){x, {0, 0}, misfit, NAN, 0};
}

static int by_misfit(const void *pa, const void *pb)
{
    const corax_solution *a = pa, *b = pb;
    if (fabs(a->misfit - b->misfit) > 1e-9)
        return a->misfit < b->misfit ? -1 : 1;
    double da = atan2(a->normal.x, a->normal.y), db = atan2(b->normal.x, b->normal.y);
    return (da > db) - (da < db);
}

/* Every distinct least-squares solution from the starting places. */
static corax_status search(const corax_cone *c, size_t n, const hole_cone *h, size_t nh,
                           corax_solution **out, size_t *nout)
{
    size_t cap = 2 * LATTICE_STARTS + 4 * nh * nh + 8;
    if (cap > MAX_STARTS)
        cap = MAX_STARTS;
    corax_solution *found = malloc(cap * sizeof *found);
    if (!found)
        return CORAX_ENOMEM;
    size_t nfound = 0, tried = 0;
    for (size_t i = 0; i < nh; i++) /* where each pair of holes' cones meet */
        for (size_t j = i + 1; j < nh && tried < MAX_STARTS; j++)
            for (int side = 0; side < 2; side++) {
                corax_vec3 start[2];
                corax_vec3 b = side ? vec_neg(h[j].axis) : h[j].axis;
                size_t m = meet(h[i].axis, h[i].gamma, b, h[j].gamma, start);
                for (size_t k = 0; k < m; k++, tried++) {
                    corax_vec3 x;
                    double f;
                    corax_solve_refine(c, n, start[k], &x, &f);
                    keep(found, &nfound, cap, x, f);
                }
            }
    /* and the best few of a coarse search, for cones that nowhere meet */
    corax_vec3 best[LATTICE_STARTS];
    double best_cost[LATTICE_STARTS];
    size_t nbest = 0;
    for (size_t i = 0; i < LATTICE; i++) {
        corax_vec3 v = lattice(i, LATTICE);
        double f = cost(c, n, v);
        size_t k = nbest < LATTICE_STARTS ? nbest++ : LATTICE_STARTS;
        if (k == LATTICE_STARTS && f >= best_cost[LATTICE_STARTS - 1])
            continue;
        if (k == LATTICE_STARTS)
            k = LATTICE_STARTS - 1;
        while (k > 0 && best_cost[k - 1] > f) {
            best[k] = best[k - 1];
            best_cost[k] = best_cost[k - 1];
            k--;
        }
        best[k] = v;
        best_cost[k] = f;
    }
    for (size_t k = 0; k < nbest; k++) {
        corax_vec3 x;
        double f;
        corax_solve_refine(c, n, best[k], &x, &f);
        keep(found, &nfound, cap, x, f);
    }
    qsort(found, nfound, sizeof *found, by_misfit);
    *out = found;
    *nout = nfound;
    return CORAX_OK;
}

/* The largest angle of the holes' axes from the plane that fits them best. */
static double flatness_of(const hole_cone *h, size_t nh)
{
    corax_vec3 *axes = malloc(nh * sizeof *axes);
    corax_tensor t;
    for (size_t k = 0; axes && k < nh; k++)
        axes[k] = h[k].axis;
    corax_status st = axes ? corax_tensor_compute(axes, NULL, nh, &t) : CORAX_ENOMEM;
    free(axes);
    if (st != CORAX_OK)
        return NAN;
    double worst = 0.0;
    for (size_t k = 0; k < nh; k++)
        worst = fmax(worst, 0.5 * CORAX_PI - line_angle(h[k].axis, t.axis[2]));
    return worst;
}

corax_status corax_solve_cones(const corax_cone *c, size_t n, const corax_solve_options *o,
                               corax_solve_result *out)
{
    memset(out, 0, sizeof *out);
    out->flatness = NAN;
    for (size_t i = 0; i < n; i++)
        if (!(c[i].alpha >= 0.0 && c[i].alpha <= 0.5 * CORAX_PI) || !(vec_norm(c[i].axis) > 0.0))
            return CORAX_EARG;
    out->readings = n;
    hole_cone *h = mean_cones(c, n, &out->holes);
    if (!h)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < out->holes; i++)
        for (size_t j = i + 1; j < out->holes; j++)
            out->hole_spread = fmax(out->hole_spread, line_angle(h[i].axis, h[j].axis));
    if (out->holes >= 3)
        out->flatness = flatness_of(h, out->holes);
    corax_status st = CORAX_OK;
    if (n == 0)
        out->status = CORAX_SOLVE_NO_READINGS;
    else if (n == 1)
        out->status = CORAX_SOLVE_ONE_READING;
    else if (out->holes == 1)
        out->status = CORAX_SOLVE_ONE_HOLE;
    else if (out->hole_spread < o->parallel_limit)
        out->status = CORAX_SOLVE_PARALLEL;
    else {
        corax_solution *found;
        size_t nfound;
        st = search(c, n, h, out->holes, &found, &nfound);
        /* chi-square with two degrees of freedom, 95%: 5.991 */
        double sigma = fmax(o->alpha_error, 1e-6), within = 5.991 * sigma * sigma / (double)n;
        for (size_t k = 0; st == CORAX_OK && k < nfound && out->ncandidates < CORAX_SOLVE_MAX; k++)
            if (found[k].misfit * found[k].misfit <= found[0].misfit * found[0].misfit + within) {
                corax_solution *s = &out->candidate[out->ncandidates++];
                *s = found[k];
                s->plane = corax_plane_from_normal(s->normal, &s->normal);
            }
        if (st == CORAX_OK)
            free(found);
        out->status = out->ncandidates > 1 ? CORAX_SOLVE_AMBIGUOUS : CORAX_SOLVE_SOLVED;
    }
    free(h);
    return st;
}

/* ---- readings down surveyed holes ---- */

size_t solve_hole_number(const corax_hole **seen, size_t *nseen, const corax_hole *hole)
{
    for (size_t k = 0; k < *nseen; k++)
        if (seen[k] == hole)
            return k;
    seen[*nseen] = hole;
    return (*nseen)++;
}

corax_status corax_solve_place(const corax_solve_reading *r, size_t n, corax_cone *cones,
                               size_t *bad)
{
    const corax_hole **seen = malloc((n ? n : 1) * sizeof *seen);
    if (!seen)
        return CORAX_ENOMEM;
    size_t nseen = 0;
    corax_status st = CORAX_OK;
    for (size_t i = 0; i < n && st == CORAX_OK; i++) {
        corax_hole_point pt;
        if (!r[i].hole || hole_at(r[i].hole, r[i].depth, NULL, &pt) != CORAX_OK) {
            if (bad)
                *bad = i;
            st = CORAX_EVALUE;
            break;
        }
        cones[i] = (corax_cone){pt.tangent, r[i].alpha, solve_hole_number(seen, &nseen, r[i].hole)};
    }
    free(seen);
    return st;
}
