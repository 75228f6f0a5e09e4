/* section: hole paths projected into a section, with the depths where they
 * pass through the faces of the slab. */
#include <math.h>
#include <stdlib.h>

#include "common/grow.h"
#include "corax/section.h"

typedef struct tracer {
    const corax_section *s;
    const corax_hole *h;
    size_t hint;
} tracer;

static corax_section_sample sample_at(tracer *t, double depth)
{
    corax_hole_point pt;
    corax_hole_at(t->h, depth, &t->hint, &pt);
    corax_section_sample q;
    q.depth = depth;
    q.at = corax_section_project(t->s, pt.position);
    q.in_slab = corax_section_in_slab(t->s, &q.at);
    return q;
}

/* Narrow [a, b] around the depth where value(depth) changes sign, value
 * being the offset (face = 0) or |offset| - half width (face = 1). Each
 * halving is on the arc, so the crossing is exact to the tolerance. */
static corax_section_sample bisect(tracer *t, corax_section_sample a, corax_section_sample b,
                                   int face)
{
    double hw = face ? t->s->half_width : 0.0;
    double va = (face ? fabs(a.at.offset) : a.at.offset) - hw;
    for (int i = 0; i < 80 && b.depth - a.depth > 1e-4; i++) {
        corax_section_sample m = sample_at(t, 0.5 * (a.depth + b.depth));
        double vm = (face ? fabs(m.at.offset) : m.at.offset) - hw;
        if ((vm > 0.0) == (va > 0.0)) {
            a = m;
            va = vm;
        } else {
            b = m;
        }
    }
    /* report the end on the inside of the face, so it counts as inside */
    corax_section_sample q = face ? (a.in_slab ? a : b) : a;
    q.in_slab = face ? 1 : q.in_slab;
    return q;
}

typedef struct samples {
    corax_section_sample *item;
    size_t n, cap;
} samples;

static int push(samples *v, corax_section_sample q)
{
    corax_section_sample *p = corax_grow(v->item, v->n, &v->cap, sizeof *p, 64);
    if (!p)
        return 0;
    v->item = p;
    v->item[v->n++] = q;
    return 1;
}

/* The face crossings between two neighbouring samples, in depth order. */
static int crossings(tracer *t, corax_section_sample a, corax_section_sample b, samples *v)
{
    if (a.in_slab != b.in_slab)
        return push(v, bisect(t, a, b, 1));
    if (a.in_slab || (a.at.offset > 0.0) == (b.at.offset > 0.0))
        return 1;
    /* both outside, on opposite sides: the path went right through the slab
     * between them, entering at one face and leaving at the other */
    corax_section_sample mid = bisect(t, a, b, 0);
    mid.in_slab = corax_section_in_slab(t->s, &mid.at);
    if (!mid.in_slab) /* a slab thinner than the bisection's tolerance */
        return 1;
    return push(v, bisect(t, a, mid, 1)) && push(v, bisect(t, mid, b, 1));
}

corax_status corax_section_trace(const corax_section *s, const corax_hole *h, double step,
                                 corax_section_sample **out, size_t *n)
{
    *out = NULL;
    *n = 0;
    corax_hole_point probe;
    if (corax_hole_at(h, 0.0, NULL, &probe) == CORAX_ENOTFOUND)
        return CORAX_ENOTFOUND;
    corax_hole_depth *d;
    size_t nd;
    corax_status st = corax_hole_depths(h, step, &d, &nd);
    if (st != CORAX_OK)
        return st;
    tracer t = {s, h, 0};
    samples v = {NULL, 0, 0};
    corax_section_sample prev = sample_at(&t, d[0].depth);
    int ok = push(&v, prev);
    for (size_t i = 1; ok && i < nd; i++) {
        corax_section_sample q = sample_at(&t, d[i].depth);
        ok = crossings(&t, prev, q, &v) && push(&v, q);
        prev = q;
    }
    free(d);
    if (!ok) {
        free(v.item);
        return CORAX_ENOMEM;
    }
    *out = v.item;
    *n = v.n;
    return CORAX_OK;
}

int corax_section_trace_reaches(const corax_section *s, const corax_section_sample *t, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        if (!t[i].in_slab)
            continue;
        /* a piece inside the slab from this sample to the next (or the
         * sample alone) reaches the stretch when their span meets it */
        double lo = t[i].at.along, hi = lo;
        if (i + 1 < n && t[i + 1].in_slab) {
            lo = fmin(lo, t[i + 1].at.along);
            hi = fmax(hi, t[i + 1].at.along);
        }
        if (hi >= s->from && lo <= s->to)
            return 1;
    }
    return 0;
}
