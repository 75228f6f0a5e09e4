/* uncertainty: Monte Carlo over the survey and core-reading errors of one
 * hole at a time (one generator per thread, seeded per hole). */
#include <gsl/gsl_statistics_double.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/stats.h"
#include "corax/uncertainty.h"
#include "geometry/vec.h"
#include "core/frame.h"
#include "survey/hole_int.h"
#include "uncertainty/gauss.h"
#include "uncertainty/mc_int.h"

/* Readings simulated together (so many that the stored draws stay under
 * DRAWN_MAX vectors; a hole's readings are one block when they fit): they
 * share each draw's resurvey. */
enum { DRAWN_MAX = 1 << 22 };

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
    e.gravity = corax_rad(1.0);
    return e;
}

double corax_gravity_line_error(double gravity, double off_vertical)
{
    return atan2(sin(gravity), sin(fabs(off_vertical)));
}

/* Running sums of one reading's draws. */
typedef struct accum {
    double dip, dip2;    /* planes: dip less the nominal dip, and its square */
    double ddx, ddy;     /* planes: unit dip-direction vectors */
    corax_vec3 shift;    /* position minus the nominal position */
    double shift2;       /* its squared length */
    size_t n;
} accum;

/* What a reading's draws need, worked out once: its values with the
 * conventions applied, its sigmas, and the side its poles are turned to. */
typedef struct prepared {
    double depth, depth_sigma;
    double alpha, alpha_sigma;
    double beta, beta_sigma;  /* canonical beta; NaN: none (draw it anywhere) */
    double sin_alpha, cos_alpha, sin_beta, cos_beta; /* of the values as read */
    int plane;
    corax_vec3 reference;     /* the nominal normal or line */
    double dip;               /* the nominal dip */
    double sin_dip, cos_dip;  /* of the nominal dip */
    corax_vec3 position;      /* the nominal position */
} prepared;

struct corax_mc {
    corax_taus rng[1];
    corax_ziggurat zig;
    double *d_azimuth, *d_plunge; /* per draw, per node */
    size_t azimuth_cap, plunge_cap;
    corax_vec3 *drawn;            /* per block reading, per draw: its pole or line (a
                                     reading's draws side by side; the block's
                                     readings are few enough that the lines a draw
                                     writes to stay in cache) */
    size_t drawn_cap;
    corax_vec3 *one;              /* one reading's draws, gathered */
    size_t one_cap;
    double *dots;                 /* one reading's draws against their mean */
    size_t dots_cap;
    accum *acc;                   /* per block reading */
    prepared *prep;
    size_t block_cap;
    struct drawing *now;          /* per block reading: this draw's */
    size_t now_cap;
};

corax_mc *corax_mc_new(void)
{
    corax_mc *mc = calloc(1, sizeof *mc);
    if (mc)
        corax_ziggurat_init(&mc->zig);
    return mc;
}

void corax_mc_free(corax_mc *mc)
{
    if (!mc)
        return;
    free(mc->d_azimuth);
    free(mc->d_plunge);
    free(mc->drawn);
    free(mc->one);
    free(mc->acc);
    free(mc->prep);
    free(mc->now);
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

void mc_survey_errors(const corax_ziggurat *z, corax_taus *rng, const corax_hole *hole,
                      const corax_error_model *e, double *d_azimuth, double *d_plunge)
{
    size_t nodes = corax_hole_node_count(hole);
    double sys_az = corax_gauss(z, rng, e->azimuth_hole);
    double sys_dip = corax_gauss(z, rng, e->dip_hole);
    for (size_t i = 0; i < nodes; i++) {
        double sa, sd; /* a station's own errors, from its survey row */
        corax_hole_node_errors(hole, i, &sa, &sd);
        sa = isnan(sa) ? e->azimuth : sa;
        sd = isnan(sd) ? e->dip : sd;
        d_azimuth[i] = sys_az + corax_gauss(z, rng, sa);
        d_plunge[i] = sys_dip + corax_gauss(z, rng, sd);
    }
}

/* Every draw's survey errors for every node. */
static void draw_survey(corax_mc *mc, const corax_hole *hole, size_t draws,
                        const corax_error_model *e)
{
    size_t nodes = corax_hole_node_count(hole);
    for (size_t d = 0; d < draws; d++)
        mc_survey_errors(&mc->zig, mc->rng, hole, e, mc->d_azimuth + d * nodes,
                         mc->d_plunge + d * nodes);
}

static void prepare(const corax_mc_reading *m, const corax_convert_options *o, prepared *p)
{
    const corax_error_model *e = &m->errors;
    const corax_reading *r = &m->reading;
    const corax_core_conventions *c = &o->conventions;
    int dip_only = (m->nominal.conditions & CORAX_COND_DIP_ONLY) != 0;
    p->plane = m->nominal.has_plane || dip_only;
    p->depth = r->depth;
    p->depth_sigma = e->depth;
    p->alpha = p->plane ? r->alpha : r->line_alpha;
    p->alpha_sigma = e->alpha;
    double b = p->plane ? r->beta : r->line_beta;
    /* a line's own beta runs to its down-hole end: only the reference line and
     * the sense apply; a plane's also to the end of the ellipse. A dip alone
     * (a hole near vertical) has its beta drawn anywhere. */
    if (isnan(b) || dip_only)
        p->beta = NAN;
    else
        p->beta = corax_wrap_azimuth((p->plane ? corax_core_beta_canonical(b, c)
                                               : corax_core_line_beta_canonical(b, c)) +
                                     (isnan(r->turn) ? 0.0 : r->turn));
    /* a gravity-marked line errs more as the hole steepens; a line turned to
     * fit a reference has no mark, its error is the fit's (in e->line) */
    double g = isnan(r->turn) && !dip_only && m->nominal.located
                   ? corax_gravity_line_error(e->gravity,
                                              corax_core_off_vertical(m->nominal.point.tangent))
                   : 0.0;
    p->beta_sigma = sqrt(e->beta * e->beta + e->line * e->line + g * g);
    p->sin_alpha = sin(p->alpha);
    p->cos_alpha = cos(p->alpha);
    p->sin_beta = isnan(p->beta) ? 0.0 : sin(p->beta);
    p->cos_beta = isnan(p->beta) ? 1.0 : cos(p->beta);
    p->reference = dip_only ? vec3(0.0, 0.0, 1.0) : p->plane ? m->nominal.normal : m->nominal.line;
    p->dip = m->nominal.plane.dip;
    p->sin_dip = sin(p->dip);
    p->cos_dip = cos(p->dip);
    p->position = m->nominal.point.position;
}

/* One draw of one reading, in two steps: its errors (drawn in the reading's
 * order, so the stream of numbers is the same however the steps are laid
 * out), then its place and direction in the resurveyed hole. A draw's
 * readings go through each step in turn: each step's work on one reading is
 * short and independent of the next reading's, so the processor overlaps
 * them, where one reading's whole chain (the errors, the arc to its depth,
 * the frame, the direction, the statistics) would wait on itself. */
struct drawing {
    double depth;
    double sa, ca, sb, cb; /* sine and cosine of alpha and beta, turned by their errors */
    corax_vec3 pos, dir;
    int ok;                /* the draw has an answer */
};

/* The errors of one draw of one reading. The errors are symmetric, so they
 * are added to the canonical beta. */
static void draw_errors(corax_mc *mc, const prepared *p, struct drawing *w)
{
    w->depth = p->depth + corax_gauss(&mc->zig, mc->rng, p->depth_sigma);
    double da = corax_gauss(&mc->zig, mc->rng, p->alpha_sigma);
    double db = corax_gauss(&mc->zig, mc->rng, p->beta_sigma);
    /* without a beta (alpha 90, or a line along the core) an error in alpha
     * tilts the plane or line toward no side in particular */
    if (isnan(p->beta))
        db += 2.0 * CORAX_PI * corax_taus_uniform(mc->rng);
    /* the angles as read turned by their errors: sin(a + d) from sin a, cos a
     * and the small sine and cosine of d */
    double sd, cd;
    small_sincos(da, &sd, &cd);
    w->sa = p->sin_alpha * cd + p->cos_alpha * sd;
    w->ca = p->cos_alpha * cd - p->sin_alpha * sd;
    small_sincos(db, &sd, &cd);
    w->sb = p->sin_beta * cd + p->cos_beta * sd;
    w->cb = p->cos_beta * cd - p->sin_beta * sd;
}

/* The place and direction of one draw of one reading in the resurveyed hole;
 * w->ok 0 when it has no answer. */
static void draw_place(const corax_hole *work, const prepared *p, size_t *hint,
                       struct drawing *w)
{
    corax_hole_point pt;
    corax_core_frame f;
    w->ok = 0;
    if (hole_at(work, w->depth < 0.0 ? 0.0 : w->depth, hint, &pt) != CORAX_OK)
        return;
    if (core_frame_of(pt.tangent, &f) != CORAX_OK) { /* vertical: no bottom line */
        if (!isnan(p->beta))
            return;
        f.r = vec3(1.0, 0.0, 0.0); /* a beta drawn anywhere needs only some frame */
        f.s = vec_cross(f.t, f.r);
    }
    w->pos = pt.position;
    /* e = cos(b) r + sin(b) s; a plane's normal sin(a) t - cos(a) e, a line
     * cos(a) t + sin(a) e. The raw formula is good for alpha past 0 or 90:
     * the same plane as the folded alpha with beta turned half way round. */
    corax_vec3 e = vec_comb(f.r, w->cb, f.s, w->sb);
    w->dir = p->plane ? vec_comb(f.t, w->sa, e, -w->ca) : vec_comb(f.t, w->ca, e, w->sa);
    w->ok = 1;
}

static void add_draw(accum *ac, const prepared *p, corax_vec3 pos, corax_vec3 dir,
                     corax_vec3 *store)
{
    if (vec_dot(dir, p->reference) < 0.0) /* poles and lines have no sense: the nominal's side */
        dir = vec_neg(dir);
    *store = dir;
    corax_vec3 s = vec_sub(pos, p->position);
    ac->shift = vec_add(ac->shift, s);
    ac->shift2 += vec_dot(s, s);
    if (p->plane) {
        corax_vec3 up = dir.z < 0.0 ? vec_neg(dir) : dir;
        double h = sqrt(up.x * up.x + up.y * up.y);
        /* the dip less the nominal dip, from their difference's sine and
         * cosine: a few degrees, most often */
        double dip = small_atan2(h * p->cos_dip - up.z * p->sin_dip,
                                 up.z * p->cos_dip + h * p->sin_dip);
        ac->dip += dip;
        ac->dip2 += dip * dip;
        if (h > 0.0) {
            double inv = 1.0 / h;
            ac->ddx += up.x * inv;
            ac->ddy += up.y * inv;
        }
    }
    ac->n++;
}

static void finish(corax_mc *mc, const accum *ac, const corax_mc_reading *m,
                   const corax_vec3 *drawn, size_t draws, corax_spread *out)
{
    memset(out, 0, sizeof *out);
    out->has_orientation = 1;
    out->is_plane = m->nominal.has_plane || (m->nominal.conditions & CORAX_COND_DIP_ONLY);
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
    /* the draws that gave an answer: all of them, most often; else gathered */
    const corax_vec3 *answered = drawn;
    size_t k = ac->n;
    if (k < draws) {
        k = 0;
        for (size_t d = 0; d < draws; d++) {
            corax_vec3 v = drawn[d];
            if (v.x != 0.0 || v.y != 0.0 || v.z != 0.0)
                mc->one[k++] = v;
        }
        answered = mc->one;
    }
    corax_vec3 mean;
    if (!mc_cone95(answered, k, mc->dots, &mean, &out->kappa, &out->cone95))
        out->cone95 = out->kappa = NAN;
}

int mc_cone95(const corax_vec3 *v, size_t k, double *dots, corax_vec3 *mean, double *kappa,
              double *cone95)
{
    corax_fisher f; /* Fisher (1953): the mean, and kappa = (n - 1) / (n - R) */
    if (k == 0 || corax_fisher_mean(v, NULL, k, &f) != CORAX_OK || vec_norm(f.mean) == 0.0)
        return 0;
    *mean = f.mean;
    *kappa = f.kappa;
    for (size_t d = 0; d < k; d++)
        dots[d] = vec_dot(v[d], f.mean);
    /* the cone holding 95% of the draws: the ceil(0.95 n)-th closest */
    size_t q = (size_t)ceil(0.95 * (double)k);
    double c = gsl_stats_select(dots, 1, k, k - (q ? q : 1)); /* the q-th largest */
    *cone95 = acos(fmax(-1.0, fmin(1.0, c)));
    return 1;
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
    block = block < 1 ? 1 : block > n ? n : block;
    size_t acc_cap = mc->block_cap, prep_cap = mc->block_cap;
    if (!reserve(&mc->acc, &acc_cap, block, sizeof *mc->acc) ||
        !reserve(&mc->prep, &prep_cap, block, sizeof *mc->prep) ||
        !reserve(&mc->now, &mc->now_cap, block, sizeof *mc->now))
        return CORAX_ENOMEM;
    mc->block_cap = acc_cap < prep_cap ? acc_cap : prep_cap;
    if (!reserve(&mc->d_azimuth, &mc->azimuth_cap, nodes * draws, sizeof(double)) ||
        !reserve(&mc->d_plunge, &mc->plunge_cap, nodes * draws, sizeof(double)) ||
        !reserve(&mc->drawn, &mc->drawn_cap, block * draws, sizeof *mc->drawn) ||
        !reserve(&mc->dots, &mc->dots_cap, draws, sizeof *mc->dots) ||
        !reserve(&mc->one, &mc->one_cap, draws, sizeof *mc->one))
        return CORAX_ENOMEM;
    corax_hole *work = corax_hole_copy(hole);
    if (!work)
        return CORAX_ENOMEM;
    const char *name = corax_hole_name(hole);
    corax_taus_set(mc->rng, (unsigned long)corax_mc_hole_seed(seed, name, 0));
    draw_survey(mc, hole, draws, survey);
    corax_taus_set(mc->rng, (unsigned long)corax_mc_hole_seed(seed, name, 1));
    for (size_t first = 0; first < n; first += block) {
        size_t count = n - first < block ? n - first : block;
        for (size_t j = 0; j < count; j++)
            prepare(&readings[first + j], o, &mc->prep[j]);
        memset(mc->acc, 0, count * sizeof *mc->acc);
        for (size_t d = 0; d < draws; d++) {
            corax_vec3 *col = mc->drawn + d; /* this draw's answers, every draws-th; zero: none */
            if (corax_hole_resurvey(work, hole, mc->d_azimuth + d * nodes,
                                    mc->d_plunge + d * nodes) != CORAX_OK) {
                for (size_t j = 0; j < count; j++) /* two stations turned opposite */
                    col[j * draws] = vec3(0.0, 0.0, 0.0);
                continue;
            }
            struct drawing *now = mc->now;
            for (size_t j = 0; j < count; j++)
                draw_errors(mc, &mc->prep[j], &now[j]);
            size_t hint = 0;
            for (size_t j = 0; j < count; j++)
                draw_place(work, &mc->prep[j], &hint, &now[j]);
            for (size_t j = 0; j < count; j++) {
                const prepared *p = &mc->prep[j];
                if (!now[j].ok) {
                    col[j * draws] = vec3(0.0, 0.0, 0.0);
                    continue;
                }
                add_draw(&mc->acc[j], p, now[j].pos, now[j].dir, &col[j * draws]);
                if (on_draw) {
                    corax_plane plane;
                    if (p->plane)
                        plane = corax_plane_from_normal(now[j].dir, NULL);
                    on_draw(user, first + j, d, &now[j].pos, p->plane ? &plane : NULL);
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
