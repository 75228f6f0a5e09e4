/* qa: orientation runs. Unoriented readings inside oriented runs, low alpha,
 * low confidence, and runs whose fabric disagrees with their neighbours, with
 * the slip that would explain it: a line marked on the wrong side (beta + 180)
 * or beta read the wrong way round (360 - beta). */
#include <gsl/gsl_statistics_double.h>
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

/* A slip (beta + 180, a mirrored beta) marks every reading of its run, so
 * that two readings can name it: in sparse logging a barrel holds no more. */
enum { MAX_FABRICS = 32, NEED_SLIP = 2 };

/* What one hole's runs are judged by: which readings belong to a fabric (a
 * kind consistent down the hole), and how densely the hole is logged. */
typedef struct judge_ctx {
    qa_data *d;
    const qa_hole *hole;
    const char *fabric[MAX_FABRICS];
    size_t nfabric;
    int *kind;           /* per reading of the hole: its fabric, or -1 */
    unsigned char *use;  /* per reading: judged in the run at hand */
    unsigned char *off;  /* per reading: found off its neighbours, and so left out
                            of their references (inferred runs only) */
    double *work;        /* one per reading of the hole */
    size_t *member;      /* the readings of an inferred stretch */
    double window;       /* neighbours this near a run's middle make its reference */
    double gap;          /* readings further apart are not one inferred run */
} judge_ctx;

/* The run at hand: its readings [from, to) and each fabric's reference. */
typedef struct run_at {
    size_t from, to;
    corax_vec3 ref[MAX_FABRICS];
    size_t count[MAX_FABRICS]; /* readings judged, per fabric */
} run_at;

/* How well a reading fits its reference: as read, with beta + 180, and
 * mirrored (360 - beta). */
typedef struct fit {
    double m[3];
} fit;

/* A run's verdict. A slip leaves its mark on every fabric at once, so that
 * it can be named from a reading or two; a run that sits off for no reason
 * a slip explains must show it in min_run readings of one fabric. */
typedef struct verdict {
    size_t n;        /* readings judged */
    double misfit;   /* as read: the run's angle from its neighbours */
    double fixed;    /* the same under the slip, or the turn */
    int slip;        /* QA_PLUS_180 or QA_MIRRORED when that slip explains the run, else 0 */
    double turn;     /* no slip: the turn of beta that fits best (NaN: none sought) */
    double mirrored; /* no slip: how close a mirrored beta brings the run, when it
                        does but a turn does as well (else NaN) */
    unsigned kinds;  /* the fabrics judged, as bits */
} verdict;

static const int slips[3] = {QA_AS_STATED, QA_PLUS_180, QA_MIRRORED};

static int same_kind(const qa_item *it, const char *kind)
{
    return it->res.has_plane && strcasecmp(it->r->kind, kind) == 0;
}

/* Is this kind a consistent fabric down the hole? Twice min_run readings are
 * enough to say: a sparsely logged hole may hold no more of a kind. */
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
    return n >= 2 * d->o->min_run && qa_principal(t, &axis, &strength) &&
           strength >= d->o->fabric_strength;
}

/* The axis of a fabric in the readings near `centre`, those in [from, to)
 * left out: within c->window, or further when that holds fewer than
 * 2 min_run of them (sparse logging, a fabric seldom logged). 0 when the
 * whole hole holds fewer than min_run. */
static int reference(const judge_ctx *c, int kind, double centre, size_t from, size_t to,
                     corax_vec3 *axis)
{
    const qa_hole *hole = c->hole;
    size_t want = 2 * c->d->o->min_run;
    if (!isfinite(centre))
        return 0;
    for (double reach = fmax(c->window, 1.0);; reach *= 2.0) {
        double t[9] = {0};
        size_t n = 0, beyond = 0;
        for (size_t i = hole->first; i < hole->first + hole->n; i++) {
            const qa_item *it = &c->d->items[i];
            if ((i >= from && i < to) || c->kind[i - hole->first] != kind ||
                c->off[i - hole->first])
                continue;
            if (!(fabs(it->r->reading.depth - centre) <= reach)) {
                beyond++;
                continue;
            }
            qa_tensor_add(t, it->res.normal, 1.0);
            n++;
        }
        if (n >= want || beyond == 0 || reach > 1e6) /* depths are finite: reach takes all */
            return n >= c->d->o->min_run && qa_principal(t, axis, NULL);
    }
}

static void fit_of(const qa_data *d, const qa_item *it, corax_vec3 ref, fit *f)
{
    for (int k = 0; k < 3; k++) {
        corax_vec3 v;
        f->m[k] = qa_normal_turned(d, it, slips[k], 0.0, &v) ? qa_axial_angle(v, ref)
                                                               : (double)INFINITY;
    }
}

/* A reading that fits both as read and under a slip cannot tell them apart
 * (a plane nearly square to the core barely moves when beta does). */
static int telling(const fit *f, double limit)
{
    return !(f->m[0] <= limit && fmin(f->m[1], f->m[2]) <= limit);
}

/* Which readings of [from, to) are judged, against which references. */
static void run_setup(const judge_ctx *c, size_t from, size_t to, double centre, run_at *r)
{
    int known[MAX_FABRICS]; /* -1 not yet sought, 0 none, 1 found */
    r->from = from;
    r->to = to;
    for (size_t k = 0; k < c->nfabric; k++) {
        known[k] = -1;
        r->count[k] = 0;
    }
    for (size_t i = from; i < to; i++) {
        int kind = c->kind[i - c->hole->first];
        c->use[i - c->hole->first] = 0;
        if (kind < 0)
            continue;
        if (known[kind] < 0)
            known[kind] = reference(c, kind, centre, from, to, &r->ref[kind]);
        fit f;
        if (!known[kind])
            continue;
        fit_of(c->d, &c->d->items[i], r->ref[kind], &f);
        if (isfinite(f.m[1]) && isfinite(f.m[2]) && telling(&f, c->d->o->run_misfit)) {
            c->use[i - c->hole->first] = 1;
            r->count[kind]++;
        }
    }
}

/* The angle of the run from its neighbours with every beta read `how` and
 * turned by `turn`: per fabric (those in `kinds`), the angle between the
 * axis of its readings and its reference, averaged by readings. */
static double run_angle(const judge_ctx *c, const run_at *r, unsigned kinds, int how, double turn)
{
    double sums[MAX_FABRICS][9], angle = 0.0;
    size_t n = 0;
    memset(sums, 0, sizeof sums);
    for (size_t i = r->from; i < r->to; i++) {
        int kind = c->kind[i - c->hole->first];
        corax_vec3 v;
        if (c->use[i - c->hole->first] && (kinds & (1u << kind)) &&
            qa_normal_turned(c->d, &c->d->items[i], how, turn, &v))
            qa_tensor_add(sums[kind], v, 1.0);
    }
    for (size_t k = 0; k < c->nfabric; k++) {
        corax_vec3 axis;
        if (!r->count[k] || !(kinds & (1u << k)))
            continue;
        angle += (double)r->count[k] *
                 (qa_principal(sums[k], &axis, NULL) ? qa_axial_angle(axis, r->ref[k]) : 0.5 * CORAX_PI);
        n += r->count[k];
    }
    return n ? angle / (double)n : 0.0;
}

/* The turn of beta (as read), within `span` either way, that brings the
 * run closest to its neighbours: every 5 degrees, then finer about the
 * best. */
static double best_turn(const judge_ctx *c, const run_at *r, unsigned kinds, double span,
                        double *at)
{
    double best = INFINITY, step = corax_rad(5.0);
    *at = 0.0;
    for (double a = -span; a < span + 1e-9; a += step) {
        double m = run_angle(c, r, kinds, QA_AS_STATED, a);
        if (m < best) {
            best = m;
            *at = a;
        }
    }
    for (double fine = step / 2; fine > corax_rad(0.2); fine /= 2)
        for (int s = -1; s <= 1; s += 2) {
            double m = run_angle(c, r, kinds, QA_AS_STATED, *at + s * fine);
            if (m < best) {
                best = m;
                *at += s * fine;
            }
        }
    return best;
}

/* Whether a change that brings a run from `misfit` to `fixed` explains it:
 * well within run_misfit of the neighbours, and 2.5 times closer than as
 * read (a run barely off is explained only by a close fit). */
static int explains(double fixed, double misfit, double limit)
{
    return fixed <= 0.8 * limit && 2.5 * fixed < misfit;
}

/* Judge the run against its neighbours: whether it disagrees, and why.
 * need_slip readings are enough when beta + 180 or a mirrored beta brings
 * it back; a mirror is only named when no misplaced line (beta turned by
 * up to 45 degrees) does as well: readings alike in beta mirror as if
 * turned. Otherwise min_run readings of one fabric must sit off, and the
 * turn of beta that fits them best is told. */
static int judge(const judge_ctx *c, size_t from, size_t to, double centre, size_t need_slip,
                 verdict *v)
{
    const corax_qa_options *o = c->d->o;
    const double margin = corax_rad(5.0); /* a mirror must beat a misplaced line by this */
    const double misplaced = corax_rad(45.0); /* how far a line may be misplaced */
    double limit = o->run_misfit;
    run_at r;
    run_setup(c, from, to, centre, &r);
    unsigned all = 0, big = 0;
    size_t n = 0, n_big = 0;
    for (size_t k = 0; k < c->nfabric; k++) {
        all |= r.count[k] ? 1u << k : 0u;
        big |= r.count[k] >= o->min_run ? 1u << k : 0u;
        n += r.count[k];
        n_big += r.count[k] >= o->min_run ? r.count[k] : 0;
    }
    *v = (verdict){n, 0, 0, 0, NAN, NAN, all};
    if (n == 0)
        return 0;
    v->misfit = run_angle(c, &r, all, QA_AS_STATED, 0.0);
    double fix[3] = {v->misfit, run_angle(c, &r, all, QA_PLUS_180, 0.0),
                     run_angle(c, &r, all, QA_MIRRORED, 0.0)};
    int best = fix[1] <= fix[2] ? 1 : 2;
    int explained = explains(fix[best], v->misfit, limit);
    if (v->misfit > limit && n >= need_slip && explained) {
        double turn;
        if (slips[best] == QA_PLUS_180 ||
            fix[best] + margin < best_turn(c, &r, all, misplaced, &turn)) {
            v->slip = slips[best];
            v->fixed = fix[best];
            return 1;
        }
    }
    if (n_big < o->min_run)
        return 0;
    v->misfit = run_angle(c, &r, big, QA_AS_STATED, 0.0);
    if (v->misfit <= limit)
        return 0;
    v->n = n_big;
    v->kinds = big;
    v->fixed = best_turn(c, &r, big, CORAX_PI, &v->turn);
    if (explained && slips[best] == QA_MIRRORED && big == all)
        v->mirrored = fix[best];
    return 1;
}

/* A finding for a run (several when `runs`, or one inferred). */
static corax_status report(const judge_ctx *c, size_t from, const verdict *v, double lo,
                           double hi, int inferred, int runs)
{
    const char *names[MAX_FABRICS];
    size_t nn = 0;
    for (size_t k = 0; k < c->nfabric; k++)
        if (v->kinds & (1u << k))
            names[nn++] = c->fabric[k];
    char kinds[160], why[240];
    qa_name_list(kinds, sizeof kinds, names, nn, 3);
    if (v->slip)
        snprintf(why, sizeof why, "%s brings them within %.0f degrees: %s",
                 v->slip == QA_PLUS_180 ? "adding 180 to beta" : "mirroring beta (360 - beta)",
                 corax_deg(v->fixed),
                 v->slip == QA_PLUS_180 ? "the orientation line marked on the wrong side of "
                                          "the core?"
                                        : "beta read the wrong way round?");
    else if (explains(v->fixed, v->misfit, c->d->o->run_misfit) && isfinite(v->mirrored))
        snprintf(why, sizeof why, "turning every beta by %.0f degrees brings them within %.0f, "
                                  "and mirroring beta (360 - beta) within %.0f: the orientation "
                                  "line misplaced, or beta read the wrong way round?",
                 corax_wrap_degrees(corax_deg(v->turn), 0), corax_deg(v->fixed),
                 corax_deg(v->mirrored));
    else if (explains(v->fixed, v->misfit, c->d->o->run_misfit))
        snprintf(why, sizeof why, "turning every beta by %.0f degrees brings them within %.0f: "
                                  "the orientation line misplaced in this stretch?",
                 corax_wrap_degrees(corax_deg(v->turn), 0), corax_deg(v->fixed));
    else
        snprintf(why, sizeof why, "no simple slip explains it");
    const qa_item *first = &c->d->items[from];
    if (inferred)
        return corax_findings_add_range(
            c->d->out, CORAX_WARNING, "run-disagrees", first->r->file, first->r->line,
            c->hole->name, lo, hi,
            "%zu readings in a row from %.1f to %.1f m (%s) sit %.0f degrees from their "
            "neighbours'; %s",
            v->n, lo, hi, kinds, corax_deg(v->misfit), why);
    return corax_findings_add_range(
        c->d->out, CORAX_WARNING, "run-disagrees", first->r->file, first->r->line, c->hole->name,
        lo, hi,
        "the readings of the run%s from %.1f to %.1f m (%s) sit %.0f degrees from the "
        "neighbouring runs' (%zu readings); %s",
        runs ? "s" : "", lo, hi, kinds, corax_deg(v->misfit), v->n, why);
}

/* The end of the run holding item i: the first item of another run. */
static size_t run_end(const qa_data *d, size_t i, size_t end)
{
    size_t j = i;
    while (j < end && d->items[j].run == d->items[i].run)
        j++;
    return j;
}

static double middle(const corax_qa_run *a, const corax_qa_run *b)
{
    return 0.5 * (a->from + b->to);
}

/* The runs of the table, one by one. A run that a slip explains takes in
 * the runs after it that sit off too, while the slip still explains them
 * all: a line marked on the wrong side often stays wrong for several runs,
 * and those would otherwise spoil each other's references. */
static corax_status judge_given(const judge_ctx *c)
{
    const qa_data *d = c->d;
    const qa_hole *hole = c->hole;
    const double touching = 1.0; /* metres between runs that still join */
    size_t end = hole->first + hole->n, open = QA_NONE, open_to = 0;
    verdict held;
    corax_status st = CORAX_OK;
    for (size_t i = hole->first, j; i < end && st == CORAX_OK; i = j) {
        j = run_end(d, i, end);
        if (d->items[i].run == QA_NONE)
            continue;
        const corax_qa_run *run = &d->runs[d->items[i].run];
        verdict v, joined;
        int bad = judge(c, i, j, middle(run, run), NEED_SLIP, &v);
        if (open != QA_NONE) {
            const corax_qa_run *first = &d->runs[d->items[open].run];
            const corax_qa_run *last = &d->runs[d->items[open_to - 1].run];
            if (v.n && v.misfit > d->o->run_misfit && run->from <= last->to + touching &&
                judge(c, open, j, middle(first, run), NEED_SLIP, &joined) &&
                joined.slip == held.slip) {
                held = joined;
                open_to = j;
                continue;
            }
            st = report(c, open, &held, first->from, last->to, 0, first != last);
            open = QA_NONE;
        }
        if (bad && v.slip) {
            open = i;
            open_to = j;
            held = v;
        } else if (bad && st == CORAX_OK)
            st = report(c, i, &v, run->from, run->to, 0, 0);
    }
    if (open != QA_NONE && st == CORAX_OK)
        st = report(c, open, &held, d->runs[d->items[open].run].from,
                    d->runs[d->items[open_to - 1].run].to, 0, open_to > run_end(d, open, end));
    return st;
}

/* Mark in c->off the readings that sit off their neighbours, as read, each
 * against the others of its fabric nearby (less those already marked). */
static void mark_off(const judge_ctx *c)
{
    const qa_hole *hole = c->hole;
    unsigned char *now = c->use; /* this pass's marks, until all are known */
    for (size_t i = hole->first; i < hole->first + hole->n; i++) {
        int kind = c->kind[i - hole->first];
        corax_vec3 ref;
        fit f;
        now[i - hole->first] = 0;
        if (kind < 0 || !reference(c, kind, c->d->items[i].r->reading.depth, i, i + 1, &ref))
            continue;
        fit_of(c->d, &c->d->items[i], ref, &f);
        now[i - hole->first] = f.m[0] > c->d->o->run_misfit;
    }
    memcpy(c->off, now, hole->n);
}

static double depth_of(const judge_ctx *c, size_t i) { return c->d->items[i].r->reading.depth; }

/* A stretch of readings in a row that sit off (m[0..count), items of the
 * hole): the longest part of it that one slip explains (a noisy good
 * reading may sit off beside a slip), else the whole when min_run of one
 * fabric sit off for a reason no slip gives. */
static corax_status judge_stretch(const judge_ctx *c, const size_t *m, size_t count)
{
    verdict v, best;
    size_t from = 0, to = 0;
    int found = 0;
    for (size_t len = count; len >= NEED_SLIP && !found; len--)
        for (size_t a = 0; a + len <= count; a++) {
            double lo = depth_of(c, m[a]), hi = depth_of(c, m[a + len - 1]);
            if (judge(c, m[a], m[a + len - 1] + 1, 0.5 * (lo + hi), NEED_SLIP, &v) && v.slip &&
                (!found || v.fixed < best.fixed)) {
                best = v;
                from = a;
                to = a + len - 1;
                found = 1;
            }
        }
    if (found)
        return report(c, m[from], &best, depth_of(c, m[from]), depth_of(c, m[to]), 1, 1);
    double lo = depth_of(c, m[0]), hi = depth_of(c, m[count - 1]);
    if (count >= c->d->o->min_run && judge(c, m[0], m[count - 1] + 1, 0.5 * (lo + hi), NEED_SLIP, &v))
        return report(c, m[0], &v, lo, hi, 1, 1);
    return CORAX_OK;
}

/* Runs inferred from the readings themselves, whatever the logging's
 * density: readings in a row that sit off their neighbours, with none that
 * fits as read between them and no more than c->gap between one and the
 * next, make a stretch, judged by judge_stretch(). A reading that cannot
 * tell the slips apart neither breaks nor joins it. The neighbours are
 * judged twice: the second time without the readings the first found off,
 * so that a slip does not spoil the reference of the good readings around
 * it. */
static corax_status judge_inferred(const judge_ctx *c)
{
    const qa_data *d = c->d;
    const qa_hole *hole = c->hole;
    double limit = d->o->run_misfit;
    size_t count = 0, end = hole->first + hole->n;
    memset(c->off, 0, hole->n);
    mark_off(c);
    corax_status st = CORAX_OK;
    for (size_t i = hole->first; i <= end && st == CORAX_OK; i++) {
        int kind = i < end ? c->kind[i - hole->first] : -1;
        double depth = i < end ? depth_of(c, i) : (double)NAN;
        fit f = {{0, 0, 0}};
        corax_vec3 ref;
        int known = kind >= 0 && reference(c, kind, depth, i, i + 1, &ref);
        if (known)
            fit_of(d, &d->items[i], ref, &f);
        else if (i < end)
            continue;
        int off = known && f.m[0] > limit, fits = known && !off && telling(&f, limit);
        if (count && (i == end || fits ||
                      (off && depth - depth_of(c, c->member[count - 1]) > c->gap))) {
            if (count >= NEED_SLIP)
                st = judge_stretch(c, c->member, count);
            count = 0;
        }
        if (off)
            c->member[count++] = i;
    }
    memset(c->off, 0, hole->n);
    return st;
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

/* How densely the hole is logged: the median depth between neighbouring
 * readings (the barrel when it cannot be told). */
static double spacing_of(const qa_data *d, const qa_hole *hole, double *work)
{
    size_t n = 0;
    for (size_t i = hole->first + 1; i < hole->first + hole->n; i++) {
        double gap = d->items[i].r->reading.depth - d->items[i - 1].r->reading.depth;
        if (gap > 0.0) /* NaN depths sort last and give no gap */
            work[n++] = gap;
    }
    return n ? gsl_stats_select(work, 1, n, n / 2) : d->barrel;
}

/* Set up the judging of one hole's runs; 0 when it has no fabric. */
static int judge_setup(judge_ctx *c, qa_data *d, const qa_hole *hole)
{
    const corax_qa_options *o = d->o;
    const char *kinds[64];
    size_t nk = hole_kinds(d, hole, kinds, 64);
    c->d = d;
    c->hole = hole;
    c->nfabric = 0;
    for (size_t k = 0; k < nk && c->nfabric < MAX_FABRICS; k++)
        if (is_fabric(d, hole, kinds[k]))
            c->fabric[c->nfabric++] = kinds[k];
    if (!c->nfabric)
        return 0;
    for (size_t i = 0; i < hole->n; i++) {
        const qa_item *it = &d->items[hole->first + i];
        c->kind[i] = -1;
        for (size_t k = 0; k < c->nfabric && isfinite(it->r->reading.depth); k++)
            if (same_kind(it, c->fabric[k]))
                c->kind[i] = (int)k;
    }
    /* a run is a barrel of core or two; in sparse logging its neighbours
     * reach further, and only a gap of several readings ends it */
    double spacing = spacing_of(d, hole, c->work);
    c->gap = fmax(2.0 * d->barrel, 3.0 * spacing);
    c->window = fmax(o->run_window, 5.0 * spacing);
    return 1;
}

corax_status qa_check_runs(qa_data *d)
{
    const qa_hole *hole = &d->hole;
    size_t most = hole->n ? hole->n : 1;
    judge_ctx c;
    c.kind = malloc(most * sizeof *c.kind);
    c.work = malloc(most * sizeof *c.work);
    c.use = malloc(most);
    c.off = calloc(most, 1);
    c.member = malloc(most * sizeof *c.member);
    corax_status st = c.kind && c.work && c.use && c.off && c.member ? CORAX_OK : CORAX_ENOMEM;
    if (st == CORAX_OK)
        st = tally_runs(d, hole);
    if (st == CORAX_OK && judge_setup(&c, d, hole))
        st = hole->given_runs ? judge_given(&c) : judge_inferred(&c);
    free(c.kind);
    free(c.work);
    free(c.use);
    free(c.off);
    free(c.member);
    return st;
}
