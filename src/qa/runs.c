/* qa: orientation runs. Unoriented readings inside oriented runs, low alpha,
 * low confidence, and runs whose fabric disagrees with their neighbours, with
 * the slip that would explain it: a line marked on the wrong side (beta + 180)
 * or beta read the wrong way round (360 - beta). */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "geometry/vec.h"
#include "qa/qa_int.h"

static int word_in(const char *word, const char *const *list)
{
    for (; list && *list; list++)
        if (strcasecmp(word, *list) == 0)
            return 1;
    return 0;
}

/* A run table's word for "no orientation line". */
static int unoriented_word(const char *w)
{
    static const char *const none[] = {"none", "unoriented", "no", NULL};
    return word_in(w, none);
}

/* The runs of one hole, each with what is in it. */
typedef struct run_tally {
    size_t readings, with_beta, without_beta, low_alpha, low_confidence;
    const char *confidence_word;
} run_tally;

/* Notes about neighbouring runs join into one stretch. */
typedef struct stretch {
    int open;
    double from, to;
    size_t count, total; /* readings it is about, readings in it */
    const char *file, *word;
    long line;
} stretch;

enum { STRETCH_LOW_ALPHA, STRETCH_MARKED, STRETCH_LOGGED, NSTRETCHES };

static corax_status flush(qa_data *d, stretch *s, int which, const char *hole)
{
    if (!s->open)
        return CORAX_OK;
    s->open = 0;
    const corax_qa_options *o = d->o;
    switch (which) {
    case STRETCH_LOW_ALPHA:
        return corax_findings_add_range(
            d->out, CORAX_NOTE, "low-alpha", s->file, s->line, hole, s->from, s->to,
            "%zu of the %zu readings between %.1f and %.1f m have alpha below %.0f: their planes "
            "swing with any error in beta, and the hole under-samples them",
            s->count, s->total, s->from, s->to, corax_deg(o->low_alpha));
    case STRETCH_MARKED:
        return corax_findings_add_range(d->out, CORAX_NOTE, "low-confidence", s->file, s->line,
                                        hole, s->from, s->to,
                                        "the core from %.1f to %.1f m is in runs marked '%s': "
                                        "its %zu readings rest on an orientation line of low "
                                        "confidence",
                                        s->from, s->to, s->word, s->total);
    default:
        return corax_findings_add_range(
            d->out, CORAX_NOTE, "low-confidence", s->file, s->line, hole, s->from, s->to,
            "%zu of the %zu readings between %.1f and %.1f m are logged with confidence '%s'",
            s->count, s->total, s->from, s->to, s->word);
    }
}

/* Add a run to a stretch (when `yes`), or close the stretch. */
static corax_status extend(qa_data *d, stretch *s, int which, const char *hole, int yes,
                           const corax_qa_run *run, size_t count, size_t total, const char *word)
{
    const double touching = 1.0; /* metres between runs that still join */
    if (s->open && (!yes || run->from > s->to + touching)) {
        corax_status st = flush(d, s, which, hole);
        if (st != CORAX_OK)
            return st;
    }
    if (!yes)
        return CORAX_OK;
    if (!s->open)
        *s = (stretch){1, run->from, run->to, 0, 0, run->file, word, run->line};
    s->to = run->to;
    s->count += count;
    s->total += total;
    return CORAX_OK;
}

static corax_status run_notes(qa_data *d, size_t k, const run_tally *t, const char *hole,
                              stretch *s)
{
    const corax_qa_run *run = &d->runs[k];
    const corax_qa_options *o = d->o;
    int given = run->line > 0;
    int oriented = given ? !unoriented_word(run->confidence) : t->with_beta > 0;
    corax_status st = CORAX_OK;
    if (oriented && t->without_beta)
        st = corax_findings_add_range(d->out, CORAX_WARNING, "unoriented-in-run", run->file,
                                      run->line, hole, run->from, run->to,
                                      "%zu of the %zu readings between %.1f and %.1f m have no "
                                      "beta, inside an oriented run",
                                      t->without_beta, t->readings, run->from, run->to);
    /* one low alpha is the reading's own status in convert; runs full of them
     * are a stretch whose orientations rest on little */
    if (st == CORAX_OK)
        st = extend(d, &s[STRETCH_LOW_ALPHA], STRETCH_LOW_ALPHA, hole,
                    t->low_alpha >= 2 && 2 * t->low_alpha >= t->readings, run, t->low_alpha,
                    t->readings, NULL);
    if (st == CORAX_OK)
        st = extend(d, &s[STRETCH_MARKED], STRETCH_MARKED, hole,
                    given && word_in(run->confidence, o->low_confidence), run, t->readings,
                    t->readings, run->confidence);
    if (st == CORAX_OK)
        st = extend(d, &s[STRETCH_LOGGED], STRETCH_LOGGED, hole, !given && t->low_confidence,
                    run, t->low_confidence, t->readings, t->confidence_word);
    return st;
}

static corax_status tally_runs(qa_data *d, const qa_hole *hole)
{
    const corax_qa_options *o = d->o;
    stretch s[NSTRETCHES];
    memset(s, 0, sizeof s);
    size_t i = hole->first, end = hole->first + hole->n;
    corax_status st = CORAX_OK;
    while (i < end && st == CORAX_OK) {
        size_t k = d->items[i].run;
        run_tally t = {0, 0, 0, 0, 0, NULL};
        size_t j = i;
        for (; j < end && d->items[j].run == k; j++) {
            const qa_item *it = &d->items[j];
            const corax_reading *rd = &it->r->reading;
            if (it->r->problem || (it->res.conditions & CORAX_COND_INVALID))
                continue;
            t.readings++;
            if (!isnan(rd->alpha) || !isnan(rd->line_alpha)) {
                if (isnan(rd->alpha) ? isnan(rd->line_beta) : isnan(rd->beta))
                    t.without_beta++;
                else
                    t.with_beta++;
            }
            if (!isnan(rd->alpha) && rd->alpha < o->low_alpha)
                t.low_alpha++;
            if (word_in(it->r->confidence, o->low_confidence)) {
                t.low_confidence++;
                t.confidence_word = it->r->confidence;
            }
        }
        if (k != QA_NONE && t.readings)
            st = run_notes(d, k, &t, hole->name, s);
        i = j;
    }
    for (int w = 0; w < NSTRETCHES && st == CORAX_OK; w++)
        st = flush(d, &s[w], w, hole->name);
    return st;
}

/* ---- runs against their neighbours ---- */

static int same_kind(const qa_item *it, const char *kind)
{
    return it->res.has_plane && strcasecmp(it->r->kind, kind) == 0;
}

/* The principal axis of a run's readings of a kind, each turned by fix
 * (0: as read, 1: beta + 180, 2: 360 - beta). 0 when there are too few. */
static int run_axis(const qa_data *d, size_t from, size_t to, const char *kind, int fix,
                    corax_vec3 *axis)
{
    double t[9] = {0};
    size_t n = 0;
    for (size_t i = from; i < to; i++) {
        const qa_item *it = &d->items[i];
        if (!same_kind(it, kind))
            continue;
        corax_vec3 v = it->res.normal;
        double beta = it->r->reading.beta;
        if (fix && !qa_reconvert(d, it, fix == 1 ? beta + CORAX_PI : 2.0 * CORAX_PI - beta, &v))
            continue;
        qa_tensor_add(t, v, 1.0);
        n++;
    }
    return n >= d->o->min_run && qa_principal(t, axis, NULL);
}

/* The fabric's axis in the runs around one (within run_window of its middle,
 * the run itself left out). */
static int neighbour_axis(const qa_data *d, const qa_hole *hole, size_t from, size_t to,
                          const char *kind, corax_vec3 *axis)
{
    const corax_qa_run *run = &d->runs[d->items[from].run];
    double mid = 0.5 * (run->from + run->to);
    double t[9] = {0};
    size_t n = 0;
    for (size_t i = hole->first; i < hole->first + hole->n; i++) {
        const qa_item *it = &d->items[i];
        if ((i >= from && i < to) || !same_kind(it, kind) ||
            fabs(it->r->reading.depth - mid) > d->o->run_window)
            continue;
        qa_tensor_add(t, it->res.normal, 1.0);
        n++;
    }
    return n >= d->o->min_run && qa_principal(t, axis, NULL);
}

/* Is this kind a consistent fabric down the hole? */
static int is_fabric(const qa_data *d, const qa_hole *hole, const char *kind)
{
    double t[9] = {0}, strength;
    size_t n = 0;
    corax_vec3 axis;
    for (size_t i = hole->first; i < hole->first + hole->n; i++)
        if (same_kind(&d->items[i], kind)) {
            qa_tensor_add(t, d->items[i].res.normal, 1.0);
            n++;
        }
    return n >= d->o->min_fabric && qa_principal(t, &axis, &strength) &&
           strength >= d->o->fabric_strength;
}

static corax_status judge_run(qa_data *d, const qa_hole *hole, size_t from, size_t to,
                              const char *kind)
{
    const corax_qa_options *o = d->o;
    corax_vec3 axis, reference;
    if (!run_axis(d, from, to, kind, 0, &axis) || !neighbour_axis(d, hole, from, to, kind, &reference))
        return CORAX_OK;
    double misfit = qa_axial_angle(axis, reference);
    if (misfit <= o->run_misfit)
        return CORAX_OK;
    double fixed[3] = {misfit, INFINITY, INFINITY};
    for (int fix = 1; fix <= 2; fix++) {
        corax_vec3 a;
        if (run_axis(d, from, to, kind, fix, &a))
            fixed[fix] = qa_axial_angle(a, reference);
    }
    int best = fixed[1] <= fixed[2] ? 1 : 2;
    const corax_qa_run *run = &d->runs[d->items[from].run];
    const qa_item *first = &d->items[from];
    char why[200] = "no simple slip explains it";
    if (fixed[best] <= 0.5 * o->run_misfit && fixed[best] < 0.5 * misfit)
        snprintf(why, sizeof why, "%s brings it within %.0f degrees: %s",
                 best == 1 ? "adding 180 to beta" : "mirroring beta (360 - beta)",
                 corax_deg(fixed[best]),
                 best == 1 ? "the orientation line marked on the wrong side of the core?"
                           : "beta read the wrong way round?");
    return corax_findings_add_range(d->out, CORAX_WARNING, "run-disagrees", first->r->file,
                                    first->r->line, hole->name, run->from, run->to,
                                    "the %s of the run from %.1f to %.1f m sits %.0f degrees "
                                    "from the neighbouring runs'; %s",
                                    kind, run->from, run->to, corax_deg(misfit), why);
}

/* The kinds present in a hole, once each (borrowed strings). */
static size_t hole_kinds(const qa_data *d, const qa_hole *hole, const char **kinds, size_t cap)
{
    size_t n = 0;
    for (size_t i = hole->first; i < hole->first + hole->n; i++) {
        const char *k = d->items[i].r->kind;
        if (!k[0] || !d->items[i].res.has_plane)
            continue;
        size_t j = 0;
        while (j < n && strcasecmp(kinds[j], k) != 0)
            j++;
        if (j == n && n < cap)
            kinds[n++] = k;
    }
    return n;
}

corax_status qa_check_runs(qa_data *d)
{
    for (size_t h = 0; h < d->nholes; h++) {
        const qa_hole *hole = &d->holes[h];
        corax_status st = tally_runs(d, hole);
        if (st != CORAX_OK)
            return st;
        const char *kinds[64];
        size_t nk = hole_kinds(d, hole, kinds, 64);
        for (size_t k = 0; k < nk; k++) {
            if (!is_fabric(d, hole, kinds[k]))
                continue;
            size_t i = hole->first, end = hole->first + hole->n;
            while (i < end) {
                size_t j = i;
                while (j < end && d->items[j].run == d->items[i].run)
                    j++;
                if (d->items[i].run != QA_NONE && (st = judge_run(d, hole, i, j, kinds[k])) != CORAX_OK)
                    return st;
                i = j;
            }
        }
    }
    return CORAX_OK;
}
