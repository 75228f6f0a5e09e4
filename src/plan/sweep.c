/* plan: how a whole planned program samples each set, and a sweep of hole
 * directions scored by how well the program would sample every set at once
 * and still reach its targets. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "plan/plan_int.h"

void corax_plan_program(const corax_plan_model *m, const corax_plan_sampling *sampling,
                        const double *lengths, size_t nholes, corax_plan_program_set *out)
{
    for (size_t i = 0; i < m->n; i++) {
        corax_plan_program_set *p = &out[i];
        double metres = 0.0, crossed = 0.0, alpha = 0.0, best = -1.0;
        memset(p, 0, sizeof *p);
        for (size_t h = 0; h < nholes; h++) {
            const corax_plan_sampling *s = &sampling[h * m->n + i];
            /* a hole crosses factor * length planes for every metre-long plane
             * spacing along the pole: sum them, and their alphas */
            metres += lengths[h];
            crossed += lengths[h] * s->factor;
            alpha += lengths[h] * s->factor * s->alpha;
            p->holes_ok += s->status != CORAX_PLAN_PARALLEL &&
                           s->status != CORAX_PLAN_NEAR_PARALLEL;
            if (s->factor > best) {
                best = s->factor;
                p->best_hole = h;
            }
        }
        p->factor = metres > 0.0 ? crossed / metres : 0.0;
        p->alpha = crossed > 0.0 ? alpha / crossed : 0.0;
        p->badly_sampled = nholes > 0 && p->holes_ok == 0;
    }
}

/* The count of values of a range, from its span. */
static size_t range_count(double span, double step)
{
    return (size_t)floor(span / step + 1e-9) + 1;
}

static corax_status check_range(const char *what, corax_plan_range r, double limit,
                                corax_error *err)
{
    if (!isfinite(r.from) || !isfinite(r.to) || !isfinite(r.step) || !(r.step > 0.0))
        return corax_error_set(err, CORAX_EARG, NULL, 0,
                               "the %s range %g:%g:%g holds no direction: it needs two ends "
                               "and a step above 0 (degrees)",
                               what, corax_deg(r.from), corax_deg(r.to), corax_deg(r.step));
    if (fabs(r.from) > limit + 1e-12 || fabs(r.to) > limit + 1e-12)
        return corax_error_set(err, CORAX_EARG, NULL, 0,
                               "the %s range %g:%g:%g goes beyond %g degrees", what,
                               corax_deg(r.from), corax_deg(r.to), corax_deg(r.step),
                               corax_deg(limit));
    return CORAX_OK;
}

corax_status corax_plan_directions(corax_plan_range az, corax_plan_range pl,
                                   corax_plan_direction **out, size_t *n, corax_error *err)
{
    const double turn = 2.0 * CORAX_PI, quarter = 0.5 * CORAX_PI;
    *out = NULL;
    *n = 0;
    corax_status st = check_range("azimuth", az, turn, err);
    if (st == CORAX_OK)
        st = check_range("plunge", pl, quarter, err);
    if (st != CORAX_OK)
        return st;
    double span = az.to - az.from;
    if (span < -1e-12)
        span += turn; /* clockwise through north */
    int whole = span >= turn - 1e-9;
    size_t naz = range_count(fmax(0.0, span), az.step);
    if (whole && az.from + (double)(naz - 1) * az.step >= az.from + turn - 1e-9)
        naz--; /* the whole circle: the end is the start again */
    size_t npl = range_count(fabs(pl.to - pl.from), pl.step);
    if ((double)naz * (double)npl > CORAX_PLAN_MAX_DIRECTIONS)
        return corax_error_set(err, CORAX_EARG, NULL, 0,
                               "the sweep holds %zu directions; %d is the most: take a "
                               "larger step",
                               naz * npl, CORAX_PLAN_MAX_DIRECTIONS);
    corax_plan_direction *d = malloc(naz * npl * sizeof *d);
    if (!d)
        return CORAX_ENOMEM;
    double sign = pl.to < pl.from ? -1.0 : 1.0;
    size_t k = 0;
    for (size_t i = 0; i < naz; i++)
        for (size_t j = 0; j < npl; j++) {
            double p = pl.from + sign * (double)j * pl.step;
            if (i > 0 && fabs(p) >= quarter - 1e-12)
                continue; /* a vertical hole has one direction, whatever its azimuth */
            memset(&d[k], 0, sizeof d[k]);
            d[k].azimuth = corax_wrap_azimuth(az.from + (double)i * az.step);
            d[k++].plunge = fmax(-quarter, fmin(quarter, p));
        }
    *out = d;
    *n = k;
    return CORAX_OK;
}

/* Everything one direction needs while it is scored. */
typedef struct sweep_work {
    const corax_plan_model *m;
    const corax_plan_hole *holes;
    size_t nholes;
    const corax_plan_target *targets;
    size_t ntargets;
    corax_plan_sampling *sampling;  /* nholes x sets */
    double *lengths;
    corax_plan_program_set *program; /* one per set */
} sweep_work;

/* Turn every hole to the direction, sample the sets and try the targets. */
static corax_status score_direction(sweep_work *w, corax_plan_direction *dir, corax_error *err)
{
    const corax_plan_model *m = w->m;
    size_t reached = 0;
    for (size_t h = 0; h < w->nholes; h++) {
        corax_plan_hole turned = w->holes[h];
        turned.azimuth = dir->azimuth;
        turned.plunge = dir->plunge;
        corax_hole *path;
        corax_status st = corax_plan_path(&turned, &path, err);
        if (st == CORAX_OK)
            st = corax_plan_sample(m, path, &w->sampling[h * m->n]);
        for (size_t t = 0; t < w->ntargets && st == CORAX_OK; t++) {
            corax_plan_pierce p;
            st = corax_plan_pierce_target(path, &w->targets[t], &m->options, &p);
            reached += st == CORAX_OK && p.reached;
        }
        corax_hole_free(path);
        if (st != CORAX_OK)
            return st;
        w->lengths[h] = w->holes[h].length;
    }
    corax_plan_program(m, w->sampling, w->lengths, w->nholes, w->program);
    double weights = 0.0, log_mean = 0.0;
    for (size_t i = 0; i < m->n; i++)
        weights += m->set[i].weight;
    dir->worst_set = 0;
    for (size_t i = 0; i < m->n; i++) {
        log_mean += m->set[i].weight / weights * log(w->program[i].factor);
        if (w->program[i].factor < w->program[dir->worst_set].factor)
            dir->worst_set = i;
    }
    size_t pairs = w->nholes * w->ntargets;
    dir->reach = pairs ? (double)reached / (double)pairs : 1.0;
    dir->score = dir->reach * exp(log_mean); /* exp(-inf) = 0: a set never crossed */
    dir->worst_alpha = w->program[dir->worst_set].alpha;
    return CORAX_OK;
}

typedef struct ranked {
    double score;
    size_t index;
} ranked;

static int by_score(const void *a, const void *b)
{
    const ranked *x = a, *y = b;
    if (x->score != y->score)
        return x->score > y->score ? -1 : 1;
    return x->index < y->index ? -1 : x->index > y->index;
}

/* Sort the directions best first, equals in their order. */
static corax_status rank(corax_plan_direction *d, size_t n)
{
    ranked *r = malloc((n ? n : 1) * sizeof *r);
    corax_plan_direction *copy = malloc((n ? n : 1) * sizeof *copy);
    if (!r || !copy) {
        free(r);
        free(copy);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; i < n; i++)
        r[i] = (ranked){d[i].score, i};
    qsort(r, n, sizeof *r, by_score);
    memcpy(copy, d, n * sizeof *d);
    for (size_t i = 0; i < n; i++)
        d[i] = copy[r[i].index];
    free(r);
    free(copy);
    return CORAX_OK;
}

corax_status corax_plan_sweep(const corax_plan_model *m, const corax_plan_hole *holes,
                              size_t nholes, const corax_plan_target *targets, size_t ntargets,
                              corax_plan_direction *dirs, size_t n, corax_error *err)
{
    if (nholes == 0)
        return corax_error_set(err, CORAX_EARG, NULL, 0, "the sweep needs a planned hole");
    sweep_work w = {m, holes, nholes, targets, ntargets, NULL, NULL, NULL};
    w.sampling = malloc(nholes * m->n * sizeof *w.sampling);
    w.lengths = malloc(nholes * sizeof *w.lengths);
    w.program = malloc(m->n * sizeof *w.program);
    double *most = calloc(m->n, sizeof *most); /* each set's best factor anywhere */
    corax_status st = w.sampling && w.lengths && w.program && most ? CORAX_OK : CORAX_ENOMEM;
    for (size_t k = 0; k < n && st == CORAX_OK; k++) {
        st = score_direction(&w, &dirs[k], err);
        for (size_t i = 0; i < m->n && st == CORAX_OK; i++)
            most[i] = fmax(most[i], w.program[i].factor);
    }
    for (size_t i = 0; i < m->n && st == CORAX_OK && n > 0; i++)
        if (most[i] < sin(CORAX_PLAN_PARALLEL_LIMIT))
            st = corax_error_set(err, CORAX_EVALUE, NULL, m->set[i].line,
                                 "set %s lies parallel to every direction of the sweep: no "
                                 "direction crosses its planes, so every score is 0; widen "
                                 "the sweep",
                                 m->set[i].name);
    if (st == CORAX_OK)
        st = rank(dirs, n);
    free(w.sampling);
    free(w.lengths);
    free(w.program);
    free(most);
    return st;
}
