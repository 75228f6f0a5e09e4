/* solve: the uncertainty of alpha-only solutions by Monte Carlo, with the
 * survey errors and the generator of the uncertainty module: every hole of
 * the set resurveyed in each draw, every reading moved by its depth and alpha
 * errors, every candidate polished again from where it was found. */
#include <math.h>
#include <stdlib.h>

#include "corax/solve.h"
#include "geometry/vec.h"
#include "solve/solve_int.h"
#include "survey/hole_int.h"
#include "uncertainty/gauss.h"
#include "uncertainty/mc_int.h"

typedef struct sim {
    corax_taus rng[1];
    corax_ziggurat zig;
    const corax_hole **hole; /* the set's holes, in order of first reading */
    corax_hole **work;       /* their copies, resurveyed draw by draw */
    size_t nholes;
    size_t *hole_of;         /* each reading's hole */
    double *d_azimuth, *d_plunge;
    corax_cone *cones;       /* one draw's cones */
    corax_vec3 *drawn;       /* per candidate, per draw */
    double *dots;
} sim;

static void sim_free(sim *s)
{
    for (size_t k = 0; s->work && k < s->nholes; k++)
        corax_hole_free(s->work[k]);
    free(s->work);
    free(s->hole);
    free(s->hole_of);
    free(s->d_azimuth);
    free(s->d_plunge);
    free(s->cones);
    free(s->drawn);
    free(s->dots);
}

static corax_status sim_init(sim *s, const corax_solve_reading *r, size_t n, size_t draws,
                             size_t ncand)
{
    s->hole = malloc(n * sizeof *s->hole);
    s->hole_of = malloc(n * sizeof *s->hole_of);
    s->cones = malloc(n * sizeof *s->cones);
    s->drawn = malloc(draws * ncand * sizeof *s->drawn);
    s->dots = malloc(draws * sizeof *s->dots);
    if (!s->hole || !s->hole_of || !s->cones || !s->drawn || !s->dots)
        return CORAX_ENOMEM;
    corax_ziggurat_init(&s->zig);
    size_t nodes = 1;
    for (size_t i = 0; i < n; i++)
        s->hole_of[i] = solve_hole_number(s->hole, &s->nholes, r[i].hole);
    if (!(s->work = calloc(s->nholes, sizeof *s->work)))
        return CORAX_ENOMEM;
    for (size_t k = 0; k < s->nholes; k++) {
        if (!(s->work[k] = corax_hole_copy(s->hole[k])))
            return CORAX_ENOMEM;
        size_t m = corax_hole_node_count(s->hole[k]);
        nodes = m > nodes ? m : nodes;
    }
    s->d_azimuth = malloc(nodes * sizeof *s->d_azimuth);
    s->d_plunge = malloc(nodes * sizeof *s->d_plunge);
    return s->d_azimuth && s->d_plunge ? CORAX_OK : CORAX_ENOMEM;
}

/* One draw's cones: 0 when a hole cannot be resurveyed or a reading placed. */
static int draw_cones(sim *s, const corax_solve_reading *r, size_t n,
                      const corax_error_model *survey)
{
    int ok = 1;
    for (size_t k = 0; k < s->nholes; k++) { /* the same numbers drawn whatever fails */
        mc_survey_errors(&s->zig, s->rng, s->hole[k], survey, s->d_azimuth, s->d_plunge);
        if (corax_hole_resurvey(s->work[k], s->hole[k], s->d_azimuth, s->d_plunge) != CORAX_OK)
            ok = 0;
    }
    for (size_t i = 0; i < n; i++) {
        double depth = r[i].depth + corax_gauss(&s->zig, s->rng, r[i].depth_error);
        double alpha = fabs(r[i].alpha + corax_gauss(&s->zig, s->rng, r[i].alpha_error));
        if (alpha > 0.5 * CORAX_PI) /* past 90 the same cone comes back */
            alpha = CORAX_PI - alpha;
        corax_hole_point pt;
        if (!ok || hole_at(s->work[s->hole_of[i]], depth < 0.0 ? 0.0 : depth, NULL, &pt) != CORAX_OK) {
            ok = 0;
            continue;
        }
        s->cones[i] = (corax_cone){pt.tangent, fmax(0.0, alpha), s->hole_of[i]};
    }
    return ok;
}

corax_status corax_solve_draws(const corax_solve_reading *r, size_t n,
                               const corax_error_model *survey, size_t draws, uint64_t seed,
                               corax_solve_result *result)
{
    size_t nc = result->ncandidates;
    for (size_t k = 0; k < nc; k++) {
        result->candidate[k].cone95 = NAN;
        result->candidate[k].draws = 0;
    }
    if (draws == 0)
        return CORAX_EARG;
    if (nc == 0 || n == 0)
        return CORAX_OK;
    sim s = {0};
    corax_status st = sim_init(&s, r, n, draws, nc);
    if (st != CORAX_OK) {
        sim_free(&s);
        return st;
    }
    corax_taus_set(s.rng, (unsigned long)seed);
    for (size_t d = 0; d < draws; d++) {
        if (!draw_cones(&s, r, n, survey))
            continue;
        for (size_t k = 0; k < nc; k++) {
            corax_solution *c = &result->candidate[k];
            corax_vec3 x;
            corax_solve_refine(s.cones, n, c->normal, &x, NULL);
            if (vec_dot(x, c->normal) < 0.0) /* poles have no sense: the solution's side */
                x = vec_neg(x);
            s.drawn[k * draws + c->draws++] = x;
        }
    }
    for (size_t k = 0; k < nc; k++) {
        corax_solution *c = &result->candidate[k];
        corax_vec3 mean;
        double kappa;
        if (!mc_cone95(s.drawn + k * draws, c->draws, s.dots, &mean, &kappa, &c->cone95))
            c->cone95 = NAN;
    }
    sim_free(&s);
    return CORAX_OK;
}
