/* plan: how a planned hole samples a set of planes. Terzaghi's (1965) count
 * of the planes a line crosses, over the set's Fisher (1953) spread and along
 * the hole, and the alphas the hole would log. */
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "common/format.h"
#include "corax/core.h"
#include "corax/stats.h"
#include "geometry/vec.h"
#include "plan/plan_int.h"

/* Quadrature over a Fisher spread: NU strata of equal probability in the
 * angle from the mean (through Wood's inverse, graded toward the tail), NPHI
 * azimuths about it over half a turn (|n.t| is even in the azimuth). */
enum { NU = 64, NPHI = 32 };

static int has_spread(const corax_plan_set *s) { return isfinite(s->kappa); }

/* What a hole along t sees of planes of unit normal n, per metre: it
 * crosses 1 / (Terzaghi's weight) = |n.t| of them for each one a hole along
 * n crosses, each at alpha = asin |n.t|. */
static plan_cross cross_of(corax_vec3 n, corax_vec3 t)
{
    double c = 1.0 / corax_terzaghi_weight(n, t, 0.0);
    double alpha = atan2(c, vec_norm(vec_cross(n, t)));
    plan_cross x = {c, c * alpha, c * alpha * alpha};
    return x;
}

/* Tabulate a set's crossings over c = |m.t| in [0, 1], in a frame where the
 * mean pole m is z and t = (sqrt(1 - c^2), 0, c): a plane whose pole lies at
 * theta from m and phi about it has n = (sin theta cos phi, sin theta sin
 * phi, cos theta). */
static void tabulate(double kappa, plan_cross *table)
{
    double w[NU], s[NU], q[NU], cphi[NPHI], sphi[NPHI];
    for (int j = 0; j < NPHI; j++) {
        cphi[j] = cos(CORAX_PI * (j + 0.5) / NPHI);
        sphi[j] = sin(CORAX_PI * (j + 0.5) / NPHI);
    }
    for (int i = 0; i < NU; i++) {
        /* u = v^2 with v at the middle of equal strata: strata thin toward
         * the far tail, where Wood's inverse turns steeply */
        double v = (i + 0.5) / NU, u = v * v;
        w[i] = fmax(-1.0, fmin(1.0, corax_fisher_cosine(kappa, u)));
        s[i] = sqrt(fmax(0.0, 1.0 - w[i] * w[i]));
        q[i] = 2.0 * v / NU / NPHI; /* du = 2 v dv */
    }
    for (int k = 0; k < PLAN_TABLE; k++) {
        double c = (double)k / (PLAN_TABLE - 1);
        corax_vec3 t = vec3(sqrt(fmax(0.0, 1.0 - c * c)), 0.0, c);
        plan_cross sum = {0, 0, 0};
        for (int i = 0; i < NU; i++)
            for (int j = 0; j < NPHI; j++) {
                plan_cross one = cross_of(vec3(s[i] * cphi[j], s[i] * sphi[j], w[i]), t);
                sum.f += q[i] * one.f;
                sum.a += q[i] * one.a;
                sum.a2 += q[i] * one.a2;
            }
        table[k] = sum;
    }
}

corax_status corax_plan_model_new(const corax_plan_set *sets, size_t nsets,
                                  const corax_convert_options *options, corax_plan_model **out)
{
    *out = NULL;
    if (nsets == 0)
        return CORAX_EARG;
    for (size_t i = 0; i < nsets; i++) {
        const corax_plan_set *s = &sets[i];
        if (!(s->kappa > 0.0) && !isnan(s->kappa))
            return CORAX_EARG;
        if (!(s->weight > 0.0) || !isfinite(s->weight) || !isfinite(s->plane.dip) ||
            !isfinite(s->plane.dip_direction))
            return CORAX_EARG;
    }
    corax_plan_model *m = calloc(1, sizeof *m);
    if (!m)
        return CORAX_ENOMEM;
    m->n = nsets;
    m->options = *options;
    m->set = malloc(nsets * sizeof *m->set);
    m->normal = malloc(nsets * sizeof *m->normal);
    m->reference = malloc(nsets * sizeof *m->reference);
    m->table = malloc(nsets * PLAN_TABLE * sizeof *m->table);
    if (!m->set || !m->normal || !m->reference || !m->table) {
        corax_plan_model_free(m);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; i < nsets; i++) {
        m->set[i] = sets[i];
        if (isnan(m->set[i].kappa))
            m->set[i].kappa = INFINITY;
        m->normal[i] = corax_plane_normal(sets[i].plane);
        m->reference[i] = 1.0;
        if (has_spread(&m->set[i])) {
            tabulate(m->set[i].kappa, m->table + i * PLAN_TABLE);
            m->reference[i] = m->table[i * PLAN_TABLE + PLAN_TABLE - 1].f;
        }
    }
    *out = m;
    return CORAX_OK;
}

void corax_plan_model_free(corax_plan_model *m)
{
    if (!m)
        return;
    free(m->set);
    free(m->normal);
    free(m->reference);
    free(m->table);
    free(m);
}

size_t corax_plan_model_sets(const corax_plan_model *m) { return m->n; }

const corax_plan_set *corax_plan_model_set(const corax_plan_model *m, size_t i)
{
    return i < m->n ? &m->set[i] : NULL;
}

plan_cross corax_plan_cross(const corax_plan_model *m, size_t i, corax_vec3 t)
{
    corax_vec3 n = m->normal[i];
    if (!has_spread(&m->set[i]))
        return cross_of(n, t);
    /* between the table's points, linearly: the table is smooth in c */
    double x = fmin(1.0, fabs(vec_dot(n, t))) * (PLAN_TABLE - 1);
    size_t k = (size_t)x;
    if (k >= PLAN_TABLE - 1)
        return m->table[i * PLAN_TABLE + PLAN_TABLE - 1];
    const plan_cross *a = &m->table[i * PLAN_TABLE + k], *b = a + 1;
    double f = x - (double)k;
    plan_cross r = {a->f + f * (b->f - a->f), a->a + f * (b->a - a->a),
                    a->a2 + f * (b->a2 - a->a2)};
    return r;
}

size_t corax_plan_pieces(const corax_hole *hole, double length)
{
    if (corax_hole_station_count(hole) == 0)
        return 1;
    double n = ceil(length); /* a piece a metre (CORAX_PLAN_MAX_LENGTH at most) */
    return n < 1.0 ? 1 : (size_t)fmin(n, CORAX_PLAN_MAX_LENGTH);
}

/* The sums gathered along a hole for one set. */
typedef struct along {
    plan_cross sum;
    double beta_c, beta_s, beta_w; /* the mean plane's beta, weighted by crossings */
    size_t framed;                 /* pieces with a bottom-of-hole line */
    long low_first, low_last;      /* pieces where the mean plane's alpha is low */
} along;

static void gather_piece(const corax_plan_model *m, size_t i, corax_vec3 t, long piece,
                         along *g)
{
    const corax_convert_options *o = &m->options;
    plan_cross x = corax_plan_cross(m, i, t);
    g->sum.f += x.f;
    g->sum.a += x.a;
    g->sum.a2 += x.a2;
    double alpha, beta;
    corax_plan_status st = corax_plan_angles(t, m->normal[i], o, &alpha, &beta);
    if (corax_core_off_vertical(t) >= o->vertical_limit)
        g->framed++;
    if (!isnan(beta)) {
        double c = sin(alpha); /* the mean plane's crossings here */
        g->beta_c += c * cos(beta);
        g->beta_s += c * sin(beta);
        g->beta_w += c;
    }
    if (st == CORAX_PLAN_PARALLEL || st == CORAX_PLAN_NEAR_PARALLEL) {
        if (g->low_first < 0)
            g->low_first = piece;
        g->low_last = piece;
    }
}

static void finish(const corax_plan_model *m, size_t i, const along *g, size_t pieces,
                   double length, corax_plan_sampling *s)
{
    double n = (double)pieces, f = g->sum.f / n;
    s->factor = fmin(1.0, f / m->reference[i]);
    s->alpha = f > 0.0 ? g->sum.a / g->sum.f : 0.0;
    /* E[alpha^2] - E[alpha]^2 loses digits to rounding: below that, no spread */
    double var = f > 0.0 ? g->sum.a2 / g->sum.f - s->alpha * s->alpha : 0.0;
    s->alpha_sd = var > 64.0 * DBL_EPSILON * s->alpha * s->alpha ? sqrt(var) : 0.0;
    s->beta = g->beta_w > 0.0 ? corax_wrap_azimuth(atan2(g->beta_s, g->beta_c)) : (double)NAN;
    s->no_reference = g->framed == 0;
    s->low_from = g->low_first < 0 ? (double)NAN : (double)g->low_first * length / n;
    s->low_to = g->low_first < 0 ? (double)NAN : (double)(g->low_last + 1) * length / n;
    /* near-parallel: the planes crossed are, or the hole keeps within the
     * threshold of the mean plane all along (a spread set is then still
     * crossed, by its stray planes, at a few degrees more) */
    int low_all = g->low_first == 0 && g->low_last == (long)pieces - 1;
    s->status = s->alpha < CORAX_PLAN_PARALLEL_LIMIT                 ? CORAX_PLAN_PARALLEL
                : s->alpha < m->options.near_parallel || low_all ? CORAX_PLAN_NEAR_PARALLEL
                : s->no_reference                                ? CORAX_PLAN_NO_REFERENCE
                                                                 : CORAX_PLAN_OK;
    if (s->status == CORAX_PLAN_PARALLEL)
        s->beta = NAN;
}

corax_status corax_plan_sample(const corax_plan_model *m, const corax_hole *hole,
                               corax_plan_sampling *out)
{
    double length = corax_hole_length(hole);
    if (!(length > 0.0))
        return CORAX_EARG;
    size_t pieces = corax_plan_pieces(hole, length), hint = 0;
    along *g = calloc(m->n, sizeof *g);
    if (!g)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < m->n; i++)
        g[i].low_first = g[i].low_last = -1;
    corax_status st = CORAX_OK;
    for (size_t k = 0; k < pieces && st == CORAX_OK; k++) {
        corax_hole_point pt;
        st = corax_hole_at(hole, ((double)k + 0.5) * length / (double)pieces, &hint, &pt);
        for (size_t i = 0; i < m->n && st == CORAX_OK; i++)
            gather_piece(m, i, pt.tangent, (long)k, &g[i]);
    }
    for (size_t i = 0; i < m->n && st == CORAX_OK; i++)
        finish(m, i, &g[i], pieces, length, &out[i]);
    free(g);
    return st == CORAX_ENOTFOUND ? CORAX_EARG : st;
}

size_t corax_plan_sampling_note(const corax_plan_sampling *s, double length,
                                const corax_convert_options *o, char *buf, size_t size)
{
    size_t used = 0;
    double low = corax_deg(o->near_parallel);
    if (!size)
        return 0;
    buf[0] = '\0';
    if (s->status == CORAX_PLAN_PARALLEL)
        corax_note_add(buf, size, &used,
                       "the hole runs along these planes: it would cross none of them, and "
                       "beta is undefined");
    else if (s->status == CORAX_PLAN_NEAR_PARALLEL && s->alpha < o->near_parallel)
        corax_note_add(buf, size, &used,
                       "expected alpha %.1f is below %.3g: the hole would cross %.0f%% as many "
                       "of these planes as a hole square to them, each poorly oriented",
                       corax_deg(s->alpha), low, 100.0 * s->factor);
    else if (s->status == CORAX_PLAN_NEAR_PARALLEL)
        corax_note_add(buf, size, &used,
                       "the hole keeps within %.3g degrees of the mean plane: it would cross "
                       "%.0f%% as many of these planes as a hole square to them, only the "
                       "stray ones of the spread",
                       low, 100.0 * s->factor);
    if (!isnan(s->low_from) && (s->low_from > 0.0 || s->low_to < length))
        corax_note_add(buf, size, &used, "the mean plane's alpha is below %.3g from %.0f to %.0f m",
                       low, s->low_from, s->low_to);
    if (s->no_reference)
        corax_note_add(buf, size, &used,
                       "the hole is within %.3g degrees of vertical: no bottom-of-hole line, "
                       "so no beta",
                       corax_deg(o->vertical_limit));
    else if (isnan(s->beta) && s->status != CORAX_PLAN_PARALLEL)
        corax_note_add(buf, size, &used, "the mean plane is square to the hole: any beta");
    return used;
}
