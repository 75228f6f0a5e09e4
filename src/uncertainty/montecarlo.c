/* uncertainty: Monte Carlo over the survey and core-reading errors of one
 * hole at a time (one generator per thread, seeded per hole). */
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_statistics_double.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/stats.h"
#include "corax/uncertainty.h"
#include "geometry/vec.h"
#include "survey/hole_int.h"

/* Readings simulated together (at most BLOCK, and so many that the stored
 * draws stay under DRAWN_MAX vectors): they share each draw's resurvey. */
enum { BLOCK = 128, DRAWN_MAX = 1 << 22 };

corax_error_model corax_error_model_default(void)
{
    corax_error_model e;
    e.alpha = corax_rad(2.0);
    e.beta = corax_rad(5.0);
    e.line = corax_rad(5.0);
    e.depth = 0.05;
    e.azimuth = corax_rad(1.0);
    e.dip = corax_rad(0.5);
    e.azimuth_hole = corax_rad(0.5);
    e.dip_hole = corax_rad(0.25);
    return e;
}

/* Running sums of one reading's draws. */
typedef struct accum {
    double dip, dip2;    /* planes: dip less the nominal dip, and its square */
    double ddx, ddy;     /* planes: unit dip-direction vectors */
    corax_vec3 shift;    /* position minus the nominal position */
    double shift2;       /* its squared length */
    size_t n;
} accum;

struct corax_mc {
    gsl_rng *rng;
    double *d_azimuth, *d_plunge; /* per draw, per node */
    size_t azimuth_cap, plunge_cap;
    corax_vec3 *drawn;            /* per block reading, per draw: its pole or line */
    size_t drawn_cap;
    double *dots;                 /* one reading's draws against their mean */
    size_t dots_cap;
    accum acc[BLOCK];
};

corax_mc *corax_mc_new(void)
{
    corax_mc *mc = calloc(1, sizeof *mc);
    if (mc && !(mc->rng = gsl_rng_alloc(gsl_rng_taus2))) {
        free(mc);
        return NULL;
    }
    return mc;
}

void corax_mc_free(corax_mc *mc)
{
    if (!mc)
        return;
    gsl_rng_free(mc->rng);
    free(mc->d_azimuth);
    free(mc->d_plunge);
    free(mc->drawn);
    free(mc->dots);
    free(mc);
}

static uint64_t splitmix64(uint64_t z)
{
    z += 0x9E3779B97F4A7C15u;
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9u;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBu;
    return z ^ (z >> 31);
}

uint64_t corax_mc_hole_seed(uint64_t seed, const char *hole, size_t stream)
{
    uint64_t h = 1469598103934665603u; /* FNV-1a of the name */
    for (const char *p = hole; *p; p++)
        h = (h ^ (unsigned char)*p) * 1099511628211u;
    return splitmix64(splitmix64(seed) ^ h ^ splitmix64(stream + 1));
}

/* Room for `count` items of `size` bytes at *p (capacity *cap items). */
static int reserve(void *pp, size_t *cap, size_t count, size_t size)
{
    if (count <= *cap)
        return 1;
    void *old;
    memcpy(&old, pp, sizeof old);
    void *q = realloc(old, count * size);
    if (!q)
        return 0;
    memcpy(pp, &q, sizeof q);
    *cap = count;
    return 1;
}

/* Every draw's survey errors for every node: random per node, plus one
 * systematic error per draw shared by all nodes. */
static void draw_survey(corax_mc *mc, const corax_hole *hole, size_t draws,
                        const corax_error_model *e)
{
    size_t nodes = corax_hole_node_count(hole);
    for (size_t d = 0; d < draws; d++) {
        double sys_az = gsl_ran_gaussian_ziggurat(mc->rng, e->azimuth_hole);
        double sys_dip = gsl_ran_gaussian_ziggurat(mc->rng, e->dip_hole);
        for (size_t i = 0; i < nodes; i++) {
            double sa, sd; /* a station's own errors, from its survey row */
            corax_hole_node_errors(hole, i, &sa, &sd);
            sa = isnan(sa) ? e->azimuth : sa;
            sd = isnan(sd) ? e->dip : sd;
            mc->d_azimuth[d * nodes + i] = sys_az + gsl_ran_gaussian_ziggurat(mc->rng, sa);
            mc->d_plunge[d * nodes + i] = sys_dip + gsl_ran_gaussian_ziggurat(mc->rng, sd);
        }
    }
}

/* One draw of one reading in the resurveyed hole; 0 when it has no answer. */
static int draw_one(corax_mc *mc, const corax_hole *work, const corax_mc_reading *m,
                    const corax_convert_options *o, size_t *hint, corax_vec3 *pos,
                    corax_vec3 *dir)
{
    const corax_error_model *e = &m->errors;
    const corax_reading *r = &m->reading;
    double depth = r->depth + gsl_ran_gaussian_ziggurat(mc->rng, e->depth);
    double beta_sigma = sqrt(e->beta * e->beta + e->line * e->line);
    int plane = m->nominal.has_plane;
    double a = (plane ? r->alpha : r->line_alpha) + gsl_ran_gaussian_ziggurat(mc->rng, e->alpha);
    double b0 = plane ? r->beta : r->line_beta;
    double b = gsl_ran_gaussian_ziggurat(mc->rng, beta_sigma);
    /* without a beta (alpha 90, or a line along the core) an error in alpha
     * tilts the plane or line toward no side in particular */
    b += isnan(b0) ? 2.0 * CORAX_PI * gsl_rng_uniform(mc->rng) : b0;
    corax_hole_point pt;
    if (corax_hole_at(work, depth < 0.0 ? 0.0 : depth, hint, &pt) != CORAX_OK)
        return 0;
    *pos = pt.position;
    corax_core_frame f;
    if (corax_core_frame_of(pt.tangent, &f) != CORAX_OK)
        return 0;
    /* the raw formula is good for alpha past 0 or 90: it is the same plane as
     * the folded alpha with beta turned half way round */
    *dir = plane ? corax_core_plane_normal(&f, a, b, &o->conventions)
                 : corax_core_line(&f, a, b, &o->conventions);
    return 1;
}

static void add_draw(accum *ac, const corax_mc_reading *m, corax_vec3 pos, corax_vec3 dir,
                     corax_vec3 *store)
{
    corax_vec3 ref = m->nominal.has_plane ? m->nominal.normal : m->nominal.line;
    if (vec_dot(dir, ref) < 0.0) /* poles and lines have no sense: the nominal's side */
        dir = vec_neg(dir);
    *store = dir;
    corax_vec3 s = vec_sub(pos, m->nominal.point.position);
    ac->shift = vec_add(ac->shift, s);
    ac->shift2 += vec_dot(s, s);
    if (m->nominal.has_plane) {
        corax_vec3 up = dir.z < 0.0 ? vec_neg(dir) : dir;
        double h = sqrt(up.x * up.x + up.y * up.y);
        double dip = fast_atan2(h, up.z) - m->nominal.plane.dip; /* small numbers: no cancellation */
        ac->dip += dip;
        ac->dip2 += dip * dip;
        if (h > 0.0) {
            ac->ddx += up.x / h;
            ac->ddy += up.y / h;
        }
    }
    ac->n++;
}

static void finish(corax_mc *mc, const accum *ac, const corax_mc_reading *m,
                   corax_vec3 *drawn, size_t draws, corax_spread *out)
{
    memset(out, 0, sizeof *out);
    out->has_orientation = 1;
    out->is_plane = m->nominal.has_plane;
    out->draws = ac->n;
    double n = (double)ac->n;
    if (ac->n < 2) {
        out->dip_sd = out->dip_direction_sd = out->cone95 = out->kappa = out->position_sd = NAN;
        return;
    }
    corax_vec3 mean_shift = vec_scale(ac->shift, 1.0 / n);
    out->position_sd = sqrt(fmax(0.0, ac->shift2 / n - vec_dot(mean_shift, mean_shift)));
    if (out->is_plane) {
        out->dip_sd = sqrt(fmax(0.0, (ac->dip2 - ac->dip * ac->dip / n) / (n - 1.0)));
        double rbar = hypot(ac->ddx, ac->ddy) / n;
        out->dip_direction_sd = sqrt(-2.0 * log(fmax(rbar, 1e-300)));
    } else {
        out->dip_sd = out->dip_direction_sd = NAN;
    }
    size_t k = 0; /* the draws that gave an answer, to the front */
    for (size_t d = 0; d < draws; d++)
        if (drawn[d].x != 0.0 || drawn[d].y != 0.0 || drawn[d].z != 0.0)
            drawn[k++] = drawn[d];
    corax_fisher f; /* Fisher (1953): the mean, and kappa = (n - 1) / (n - R) */
    if (corax_fisher_mean(drawn, NULL, k, &f) != CORAX_OK) {
        out->cone95 = out->kappa = NAN;
        return;
    }
    out->kappa = f.kappa;
    for (size_t d = 0; d < k; d++)
        mc->dots[d] = vec_dot(drawn[d], f.mean);
    /* the cone holding 95% of the draws: the ceil(0.95 n)-th closest */
    size_t q = (size_t)ceil(0.95 * (double)k);
    double c = gsl_stats_select(mc->dots, 1, k, k - (q ? q : 1)); /* the q-th largest */
    out->cone95 = acos(fmax(-1.0, fmin(1.0, c)));
}

corax_status corax_mc_hole(corax_mc *mc, const corax_hole *hole, const corax_mc_reading *readings,
                           size_t n, const corax_convert_options *o,
                           const corax_error_model *survey, size_t draws, uint64_t seed,
                           corax_spread *out, corax_mc_draw_fn on_draw, void *user)
{
    if (draws == 0)
        return CORAX_EARG;
    size_t nodes = corax_hole_node_count(hole);
    size_t block = DRAWN_MAX / draws;
    block = block < 1 ? 1 : block > BLOCK ? BLOCK : block;
    if (!reserve(&mc->d_azimuth, &mc->azimuth_cap, nodes * draws, sizeof(double)) ||
        !reserve(&mc->d_plunge, &mc->plunge_cap, nodes * draws, sizeof(double)) ||
        !reserve(&mc->drawn, &mc->drawn_cap, block * draws, sizeof *mc->drawn) ||
        !reserve(&mc->dots, &mc->dots_cap, draws, sizeof *mc->dots))
        return CORAX_ENOMEM;
    corax_hole *work = corax_hole_copy(hole);
    if (!work)
        return CORAX_ENOMEM;
    const char *name = corax_hole_name(hole);
    gsl_rng_set(mc->rng, (unsigned long)corax_mc_hole_seed(seed, name, 0));
    draw_survey(mc, hole, draws, survey);
    gsl_rng_set(mc->rng, (unsigned long)corax_mc_hole_seed(seed, name, 1));
    for (size_t first = 0; first < n; first += block) {
        size_t count = n - first < block ? n - first : block;
        memset(mc->acc, 0, sizeof mc->acc);
        memset(mc->drawn, 0, count * draws * sizeof *mc->drawn);
        for (size_t d = 0; d < draws; d++) {
            if (corax_hole_resurvey(work, hole, mc->d_azimuth + d * nodes,
                                    mc->d_plunge + d * nodes) != CORAX_OK)
                continue; /* two stations turned opposite: no hole this draw */
            size_t hint = 0;
            for (size_t j = 0; j < count; j++) {
                const corax_mc_reading *m = &readings[first + j];
                corax_vec3 pos, dir;
                if (!draw_one(mc, work, m, o, &hint, &pos, &dir))
                    continue;
                add_draw(&mc->acc[j], m, pos, dir, &mc->drawn[j * draws + d]);
                if (on_draw) {
                    corax_plane p;
                    if (m->nominal.has_plane)
                        p = corax_plane_from_normal(dir, NULL);
                    on_draw(user, first + j, d, &pos, m->nominal.has_plane ? &p : NULL);
                }
            }
        }
        for (size_t j = 0; j < count; j++)
            finish(mc, &mc->acc[j], &readings[first + j], mc->drawn + j * draws, draws,
                   &out[first + j]);
    }
    corax_hole_free(work);
    return CORAX_OK;
}
