/* export: from/to intervals down holes, desurveyed, checked for order and
 * overlap, and read for oriented contacts between units. */
#include <math.h>
#include <stdlib.h>

#include "corax/interval.h"

static const double touch = 1e-9; /* metres: depths closer than this touch */

/* ---- desurvey ---- */

corax_status corax_interval_desurvey(const corax_hole *hole, double from, double to,
                                     size_t *hint, corax_interval_points *out)
{
    if (!isfinite(from) || !isfinite(to) || from < 0.0 || from > to)
        return CORAX_EVALUE;
    corax_status st = corax_hole_at(hole, from, hint, &out->from);
    if (st == CORAX_OK)
        st = corax_hole_at(hole, 0.5 * (from + to), hint, &out->mid);
    if (st == CORAX_OK)
        st = corax_hole_at(hole, to, hint, &out->to);
    if (st != CORAX_OK)
        return st;
    corax_where w = out->from.where;
    if (out->mid.where > w)
        w = out->mid.where;
    if (out->to.where > w)
        w = out->to.where;
    out->where = w;
    return CORAX_OK;
}

/* ---- order and overlap ---- */

const char *corax_interval_fault_name(corax_interval_fault f)
{
    switch (f) {
    case CORAX_INTERVAL_OK: return "ok";
    case CORAX_INTERVAL_REVERSED: return "reversed";
    case CORAX_INTERVAL_OVERLAP: return "overlaps";
    }
    return "unknown";
}

static int by_hole_depth(const void *a, const void *b)
{
    const corax_interval *x = a, *y = b;
    if (x->hole != y->hole)
        return x->hole < y->hole ? -1 : 1;
    if (x->from != y->from)
        return x->from < y->from ? -1 : 1;
    return (x->line > y->line) - (x->line < y->line);
}

corax_status corax_intervals_check(corax_interval *v, size_t n, const char *file,
                                   const char *(*name)(long hole, void *ctx), void *ctx,
                                   corax_findings *out)
{
    if (n > 1)
        qsort(v, n, sizeof *v, by_hole_depth);
    const corax_interval *deepest = NULL; /* of the hole so far, reaching furthest down */
    for (size_t i = 0; i < n; i++) {
        corax_interval *c = &v[i];
        c->fault = CORAX_INTERVAL_OK;
        c->other_line = 0;
        const char *hole = name ? name(c->hole, ctx) : NULL;
        if (i == 0 || c->hole != v[i - 1].hole)
            deepest = NULL;
        corax_status st = CORAX_OK;
        if (c->from > c->to) {
            c->fault = CORAX_INTERVAL_REVERSED;
            st = corax_findings_add_range(out, CORAX_WARNING, "intervals", file, c->line, hole,
                                          c->to, c->from,
                                          "from %.3f is below to %.3f: the interval is "
                                          "reversed", c->from, c->to);
        } else {
            if (deepest && c->from < deepest->to - touch) {
                c->fault = CORAX_INTERVAL_OVERLAP;
                c->other_line = deepest->line;
                st = corax_findings_add_range(
                    out, CORAX_WARNING, "intervals", file, c->line, hole, c->from, c->to,
                    "%.3f-%.3f overlaps %.3f-%.3f on line %ld", c->from, c->to, deepest->from,
                    deepest->to, deepest->line);
            }
            if (!deepest || c->to > deepest->to)
                deepest = c;
        }
        if (st != CORAX_OK)
            return st;
    }
    return CORAX_OK;
}

/* ---- contacts ---- */

const char *corax_contact_status_name(corax_contact_status s)
{
    switch (s) {
    case CORAX_CONTACT_ORIENTED: return "oriented";
    case CORAX_CONTACT_NONE_NEAR: return "none-near";
    case CORAX_CONTACT_NO_PATH: return "no-survey";
    }
    return "unknown";
}

/* Orient a contact by the readings near it; buf has room for them all. */
static corax_status orient(corax_contact *c, const corax_contact_reading *r, size_t nr,
                           double window, corax_vec3 *buf)
{
    size_t k = 0;
    for (size_t i = 0; i < nr; i++)
        if (fabs(r[i].depth - c->depth) <= window)
            buf[k++] = r[i].normal;
    c->count = k;
    c->kappa = NAN;
    if (k == 0)
        return CORAX_OK;
    corax_axial_summary sum;
    corax_status st = corax_axial_summary_compute(buf, NULL, k, &sum);
    if (st != CORAX_OK)
        return st;
    c->plane = corax_plane_from_normal(sum.fisher.mean, &c->normal);
    c->kappa = sum.fisher.kappa;
    return CORAX_OK;
}

static int ranked(int unit, const int *rank, size_t nrank)
{
    return rank && unit >= 0 && (size_t)unit < nrank && rank[unit] >= 0;
}

/* Polarity from the units' age order and the hole's direction. */
static void set_polarity(corax_contact *c, const int *rank, size_t nrank)
{
    c->polarity = 0;
    c->younging = (corax_vec3){0.0, 0.0, 0.0};
    if (!c->count || c->status == CORAX_CONTACT_NO_PATH || !ranked(c->above, rank, nrank) ||
        !ranked(c->below, rank, nrank) || rank[c->above] == rank[c->below])
        return;
    corax_vec3 t = c->point.tangent, n = c->normal;
    double along = t.x * n.x + t.y * n.y + t.z * n.z; /* down-hole along the upward normal */
    if (along == 0.0)
        return;
    int younger_above = rank[c->above] < rank[c->below];
    /* younging runs up-hole when the younger unit is above */
    double toward_young = younger_above ? -along : along;
    c->polarity = toward_young > 0.0 ? 1 : -1;
    c->younging = (corax_vec3){c->polarity * n.x, c->polarity * n.y, c->polarity * n.z};
}

corax_status corax_contacts_find(const corax_hole *hole, const corax_unit_interval *iv,
                                 size_t n, const corax_contact_reading *r, size_t nr,
                                 double window, const int *rank, size_t nrank,
                                 corax_contact **out, size_t *nout)
{
    *out = NULL;
    *nout = 0;
    if (!(window >= 0.0))
        return CORAX_EARG;
    corax_contact *c = malloc((n ? n : 1) * sizeof *c);
    corax_vec3 *buf = malloc((nr ? nr : 1) * sizeof *buf);
    if (!c || !buf) {
        free(c);
        free(buf);
        return CORAX_ENOMEM;
    }
    const corax_unit_interval *prev = NULL;
    size_t k = 0, hint = 0;
    corax_status st = CORAX_OK;
    for (size_t i = 0; st == CORAX_OK && i < n; i++) {
        const corax_unit_interval *cur = &iv[i];
        if (cur->unit < 0 || !(cur->from <= cur->to))
            continue;
        if (prev && cur->from < prev->to - touch)
            continue; /* overlapping: reported by the check, no contact */
        if (prev && cur->unit != prev->unit) {
            corax_contact *ct = &c[k++];
            ct->gap = cur->from - prev->to > touch ? cur->from - prev->to : 0.0;
            ct->depth = prev->to + 0.5 * ct->gap;
            ct->above = prev->unit;
            ct->below = cur->unit;
            ct->line_above = prev->line;
            ct->line_below = cur->line;
            ct->normal = (corax_vec3){0.0, 0.0, 0.0};
            ct->plane = (corax_plane){NAN, NAN};
            st = orient(ct, r, nr, window, buf);
            ct->status = ct->count ? CORAX_CONTACT_ORIENTED : CORAX_CONTACT_NONE_NEAR;
            if (corax_hole_at(hole, ct->depth, &hint, &ct->point) != CORAX_OK)
                ct->status = CORAX_CONTACT_NO_PATH;
            set_polarity(ct, rank, nrank);
        }
        prev = cur;
    }
    free(buf);
    if (st != CORAX_OK) {
        free(c);
        return st;
    }
    *out = c;
    *nout = k;
    return CORAX_OK;
}
