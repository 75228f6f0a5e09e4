/* qa: the program-wide convention test. A convention applied wrongly to a
 * whole program (a log taken against a top-of-hole line converted as if the
 * line marked the bottom, beta measured anticlockwise converted as
 * clockwise) turns or mirrors every reading about its own hole. Each hole
 * stays consistent in itself, so nothing looks odd hole by hole; but holes
 * drilled in different directions are turned about different axes, and
 * their readings of one fabric stop agreeing. So every oriented reading is
 * converted under each reading of the conventions (as stated, beta + 180,
 * 360 - beta, and both), and the fabrics' clustering across the holes is
 * measured under each.
 *
 * The measure is Fisher's (1953) concentration kappa = (n - 1) / (n - R) of
 * the poles of each fabric (axial: each pole turned to the side of the
 * orientation tensor's first axis), every pole weighted against the
 * sampling bias of its hole by Terzaghi's (1965) 1 / cos(delta), capped at
 * 15 degrees, with the weights rescaled to sum to n; the fabrics together
 * by the pooled estimate of a common kappa, (N - k) / (N - sum R_i), of
 * Fisher, Lewis & Embleton (1987), Statistical Analysis of Spherical Data,
 * for k samples. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include <gsl/gsl_statistics_double.h>

#include "corax/stats.h"
#include "geometry/vec.h"
#include "qa/qa_int.h"

enum { MAX_KINDS = 32, SHOWN = 3 };

/* Another reading of the conventions fits "clearly better" when the pooled
 * kappa under it is at least this many times the stated one's; the stated
 * reading is clearly right when it beats every other by as much. */
static const double clearly = 2.0;

/* Holes whose readings gain this much (median angle to their fabric's axis)
 * under the better reading are named as the ones that decided it. */
static const double deciding_gain = 0.1745; /* 10 degrees */

typedef struct kind_stat {
    const char *name;
    size_t n;                 /* its readings */
    size_t holes;             /* holes with min_run or more of them */
    int fabric;               /* consistent under some reading */
    double kappa[QA_READINGS], resultant[QA_READINGS], strength[QA_READINGS];
    corax_vec3 axis[QA_READINGS];
    corax_axial_stream stream[QA_READINGS]; /* while they are measured */
} kind_stat;

/* The test goes over the program hole by hole, once to find the kinds and
 * weigh their readings, then twice to measure their clustering under every
 * reading of the conventions at once (the tensor, then the mean about its
 * axis), so that nothing is kept per reading. */
typedef struct test {
    qa_data *d;
    kind_stat kind[MAX_KINDS];
    size_t nkind;
    size_t n;          /* readings with a kind */
    const char *file;  /* the first one's */
    double pooled[QA_READINGS];
    double *work;      /* one per reading of the largest hole */
    /* per hole, for the words */
    const char **names;
    struct gain *gain;
    corax_vec3 *dir;
} test;

typedef struct gain {
    size_t hole;
    double by;
} gain;

static int usable(const qa_item *it)
{
    return it->res.has_plane && it->r->kind[0] && it->r->path && isfinite(it->r->reading.beta);
}

/* The kind of an item among those found, or -1 (not usable, or not found). */
static int kind_found(const test *t, const qa_item *it)
{
    if (!usable(it))
        return -1;
    for (size_t k = 0; k < t->nkind; k++)
        if (strcasecmp(t->kind[k].name, it->r->kind) == 0)
            return (int)k;
    return -1;
}

/* The same, the kind added when it is new and there is room. */
static int kind_of(test *t, const qa_item *it)
{
    int k = kind_found(t, it);
    if (k >= 0 || !usable(it) || t->nkind == MAX_KINDS)
        return k;
    kind_stat *ks = &t->kind[t->nkind];
    ks->name = it->r->kind;
    for (int how = 0; how < QA_READINGS; how++)
        corax_axial_stream_begin(&ks->stream[how], 1);
    return (int)t->nkind++;
}

/* Terzaghi's weight of a reading against the sampling bias of its hole. */
static double weight_of(const qa_item *it)
{
    const double cap_angle = corax_rad(15.0); /* Terzaghi's weight at most 1 / sin 15 */
    return corax_terzaghi_weight(it->res.normal, it->res.point.tangent, cap_angle);
}

/* The oriented readings with a kind: the kinds in the order they appear,
 * each weighed, and the holes with enough of each. */
static corax_status gather(test *t)
{
    qa_data *d = t->d;
    size_t most = 1;
    for (size_t h = 0; h < d->nholes; h++)
        most = d->holes[h].n > most ? d->holes[h].n : most;
    t->work = malloc(most * sizeof *t->work);
    t->names = malloc(d->nholes * sizeof *t->names);
    t->gain = malloc(d->nholes * sizeof *t->gain);
    t->dir = malloc(d->nholes * sizeof *t->dir);
    if (!t->work || !t->names || !t->gain || !t->dir)
        return CORAX_ENOMEM;
    for (size_t h = 0; h < d->nholes; h++) {
        corax_status st = qa_load(d, h);
        if (st != CORAX_OK)
            return st;
        size_t mine[MAX_KINDS] = {0};
        for (size_t i = 0; i < d->nitems; i++) {
            const qa_item *it = &d->items[i];
            int k = kind_of(t, it);
            if (k < 0)
                continue;
            if (!t->file)
                t->file = it->r->file;
            double w = weight_of(it);
            for (int how = 0; how < QA_READINGS; how++)
                corax_axial_stream_weigh(&t->kind[k].stream[how], w);
            t->kind[k].n++;
            t->n++;
            mine[k]++;
        }
        for (size_t k = 0; k < t->nkind; k++)
            t->kind[k].holes += mine[k] >= d->o->min_run;
    }
    return CORAX_OK;
}

/* A reading's normal with beta read `how`. */
static corax_vec3 normal_as(const qa_data *d, const qa_item *it, int how)
{
    corax_vec3 v;
    if (!qa_normal_as(d, it, how, &v))
        v = it->res.normal; /* cannot happen: beta never decides whether a plane exists */
    return v;
}

/* One pass over the program for every kind's clustering under every
 * reading: the tensor (pass 0), then the mean (pass 1). */
static corax_status measure_pass(test *t, int pass)
{
    qa_data *d = t->d;
    for (size_t h = 0; h < d->nholes; h++) {
        corax_status st = qa_load(d, h);
        if (st != CORAX_OK)
            return st;
        for (size_t i = 0; i < d->nitems; i++) {
            const qa_item *it = &d->items[i];
            int k = kind_found(t, it);
            if (k < 0)
                continue;
            double w = weight_of(it);
            for (int how = 0; how < QA_READINGS; how++) {
                corax_axial_stream *s = &t->kind[k].stream[how];
                if (pass == 0)
                    corax_axial_stream_tensor(s, normal_as(d, it, how), w);
                else
                    corax_axial_stream_mean(s, normal_as(d, it, how), w);
            }
        }
    }
    return CORAX_OK;
}

/* Every kind's clustering with beta read each way. */
static corax_status measure(test *t)
{
    corax_status st = measure_pass(t, 0);
    for (size_t k = 0; k < t->nkind && st == CORAX_OK; k++)
        for (int how = 0; how < QA_READINGS; how++)
            corax_axial_stream_axes(&t->kind[k].stream[how]);
    if (st == CORAX_OK)
        st = measure_pass(t, 1);
    for (size_t k = 0; k < t->nkind && st == CORAX_OK; k++)
        for (int how = 0; how < QA_READINGS && st == CORAX_OK; how++) {
            kind_stat *ks = &t->kind[k];
            corax_axial_summary s;
            st = corax_axial_stream_end(&ks->stream[how], &s);
            ks->kappa[how] = s.fisher.kappa;
            ks->resultant[how] = s.fisher.resultant;
            ks->strength[how] = s.tensor.eigenvalue[0];
            ks->axis[how] = s.tensor.axis[0];
        }
    return st;
}

/* The fabrics: kinds with enough readings in two holes or more that are
 * consistent (tensor strength) under some reading of the conventions. */
static size_t choose_fabrics(test *t)
{
    const corax_qa_options *o = t->d->o;
    size_t n = 0;
    for (size_t k = 0; k < t->nkind; k++) {
        kind_stat *ks = &t->kind[k];
        double best = 0.0;
        for (int how = 0; how < QA_READINGS; how++)
            best = fmax(best, ks->strength[how]);
        ks->fabric = ks->n >= o->min_fabric && ks->holes >= 2 && best >= o->fabric_strength;
        n += ks->fabric;
    }
    for (int how = 0; how < QA_READINGS; how++) {
        double big_n = 0.0, r = 0.0;
        for (size_t k = 0; k < t->nkind; k++)
            if (t->kind[k].fabric) {
                big_n += (double)t->kind[k].n;
                r += t->kind[k].resultant[how];
            }
        t->pooled[how] = big_n - r > 0.0 ? (big_n - (double)n) / (big_n - r) : (double)INFINITY;
    }
    return n;
}

/* ---- the words ---- */

/* What reading beta `how` means, given the stated conventions. */
static void describe(char *buf, size_t size, const corax_core_conventions *c, int how)
{
    char line[160] = "", sense[80] = "";
    if (how & QA_PLUS_180)
        snprintf(line, sizeof line, "the orientation line marked the %s of the hole (or beta ran "
                                    "to the %s end of the ellipse)",
                 c->top_reference ? "bottom" : "top", c->beta_to_uphole_end ? "down-hole" : "up-hole");
    if (how & QA_MIRRORED)
        snprintf(sense, sizeof sense, "beta was measured %s looking down the hole",
                 c->beta_anticlockwise ? "clockwise" : "anticlockwise");
    snprintf(buf, size, "%s%s%s", line, line[0] && sense[0] ? ", and " : "", sense);
}

static void kappa_text(char *buf, size_t size, double kappa)
{
    snprintf(buf, size, isfinite(kappa) && kappa < 9.95 ? "%.1f" : "%.0f", kappa);
}

/* The fabrics, most readings first. */
static size_t fabric_order(const test *t, size_t *order)
{
    size_t n = 0;
    for (size_t k = 0; k < t->nkind; k++)
        if (t->kind[k].fabric) {
            size_t j = n++;
            for (; j > 0 && t->kind[order[j - 1]].n < t->kind[k].n; j--)
                order[j] = order[j - 1];
            order[j] = k;
        }
    return n;
}

/* The names of the first SHOWN fabrics and their kappas under `how`: "52
 * and 47"; *more gets how many are left out. */
static void fabric_lists(const test *t, int how, char *names, size_t nsize, char *kappas,
                         size_t ksize, size_t *more)
{
    size_t order[MAX_KINDS];
    const char *name[SHOWN], *vp[SHOWN];
    char value[SHOWN][16];
    size_t n = fabric_order(t, order), shown = n < SHOWN ? n : SHOWN;
    for (size_t i = 0; i < shown; i++) {
        name[i] = t->kind[order[i]].name;
        kappa_text(value[i], sizeof value[i], t->kind[order[i]].kappa[how]);
        vp[i] = value[i];
    }
    if (names)
        qa_name_list(names, nsize, name, shown, SHOWN);
    qa_name_list(kappas, ksize, vp, shown, SHOWN);
    if (more)
        *more = n - shown;
}

/* The median angle of a hole's fabric readings to their kind's axis under
 * `how`; NaN when it has none (or it cannot be loaded). */
static double hole_misfit(test *t, size_t h, int how)
{
    qa_data *d = t->d;
    size_t m = 0;
    if (qa_load(d, h) != CORAX_OK)
        return NAN;
    for (size_t k = 0; k < t->nkind; k++) {
        const kind_stat *ks = &t->kind[k];
        if (!ks->fabric)
            continue;
        for (size_t i = 0; i < d->nitems; i++) {
            corax_vec3 v;
            if (kind_found(t, &d->items[i]) == (int)k && qa_normal_as(d, &d->items[i], how, &v))
                t->work[m++] = qa_axial_angle(v, ks->axis[how]);
        }
    }
    return m ? gsl_stats_select(t->work, 1, m, m / 2) : (double)NAN;
}

static int by_gain(const void *a, const void *b)
{
    const gain *x = a, *y = b;
    return (x->by < y->by) - (x->by > y->by);
}

/* The holes whose readings move furthest toward the rest under `how`. */
static void deciding_holes(test *t, int how, char *buf, size_t size)
{
    qa_data *d = t->d;
    size_t n = 0;
    for (size_t h = 0; h < d->nholes; h++) {
        double before = hole_misfit(t, h, QA_AS_STATED), after = hole_misfit(t, h, how);
        if (before - after >= deciding_gain)
            t->gain[n++] = (gain){h, before - after};
    }
    qsort(t->gain, n, sizeof *t->gain, by_gain);
    for (size_t i = 0; i < n; i++)
        t->names[i] = d->holes[t->gain[i].hole].name;
    qa_name_list(buf, size, t->names, n, SHOWN);
}

/* The holes with fabric readings, and the widest angle between two of
 * their mean directions. */
static void hole_spread(test *t, char *buf, size_t size, double *widest, size_t *count)
{
    qa_data *d = t->d;
    size_t n = 0;
    for (size_t h = 0; h < d->nholes; h++) {
        corax_vec3 sum = vec3(0, 0, 0);
        for (size_t k = 0; k < t->nkind && qa_load(d, h) == CORAX_OK; k++)
            for (size_t i = 0; t->kind[k].fabric && i < d->nitems; i++)
                if (kind_found(t, &d->items[i]) == (int)k && d->items[i].res.located)
                    sum = vec_add(sum, d->items[i].res.point.tangent);
        if (vec_norm(sum) > 0.0) {
            t->dir[n] = vec_unit(sum);
            t->names[n++] = d->holes[h].name;
        }
    }
    *widest = 0.0;
    for (size_t a = 0; a < n; a++)
        for (size_t b = a + 1; b < n; b++)
            *widest = fmax(*widest, vec_angle(t->dir[a], t->dir[b]));
    *count = n;
    qa_name_list(buf, size, t->names, n, 4);
}

/* ---- the verdict ---- */

static corax_status say_better(test *t, int best)
{
    qa_data *d = t->d;
    char as[200], names[160], better[80], stated[80], holes[160], others[64] = "";
    size_t more;
    describe(as, sizeof as, &d->convert->conventions, best);
    fabric_lists(t, best, names, sizeof names, better, sizeof better, &more);
    fabric_lists(t, QA_AS_STATED, NULL, 0, stated, sizeof stated, NULL);
    if (more)
        snprintf(others, sizeof others, "; %zu more fabric%s alike", more, more == 1 ? "" : "s");
    deciding_holes(t, best, holes, sizeof holes);
    return corax_findings_add(d->out, CORAX_WARNING, "program-conventions", t->file, 0, NULL, NAN,
                              "the log reads as if %s: read that way, %s cluster%s across the "
                              "holes with kappa %s, against %s as stated (Fisher's kappa, "
                              "Terzaghi-weighted%s); decided most by %s",
                              as, names, strchr(names, ' ') ? "" : "s", better, stated, others,
                              holes[0] ? holes : "every hole alike");
}

static corax_status say_cannot_tell(test *t, int rival)
{
    qa_data *d = t->d;
    char as[200], holes[200], rk[16], sk[16];
    double widest;
    size_t count;
    hole_spread(t, holes, sizeof holes, &widest, &count);
    describe(as, sizeof as, &d->convert->conventions, rival);
    kappa_text(rk, sizeof rk, t->pooled[rival]);
    kappa_text(sk, sizeof sk, t->pooled[QA_AS_STATED]);
    if (widest < corax_rad(30.0))
        return corax_findings_add(d->out, CORAX_NOTE, "program-conventions", t->file, 0, NULL, NAN,
                                  "the program cannot tell whether its conventions are right: "
                                  "its %zu holes with fabric readings (%s) run within %.0f "
                                  "degrees of one another, so turning or mirroring every "
                                  "reading about its hole changes little. The fabrics cluster "
                                  "with kappa %s as stated, and %s as if %s",
                                  count, holes, corax_deg(widest), sk, rk, as);
    return corax_findings_add(d->out, CORAX_NOTE, "program-conventions", t->file, 0, NULL, NAN,
                              "the program cannot tell whether its conventions are right, "
                              "although its holes (%s) spread %.0f degrees: the fabrics cluster "
                              "with kappa %s as stated, and %s as if %s. Some holes may have "
                              "been logged one way and some the other: see the holes' findings",
                              holes, corax_deg(widest), sk, rk, as);
}

/* From now on read every beta `how`: the per-hole checks then judge each
 * hole against a program that hangs together (the holes are converted so
 * as they are loaded). */
static void read_program_as(qa_data *d, int how)
{
    d->reading = how;
    d->loaded = QA_NONE;
}

corax_status qa_check_conventions(qa_data *d)
{
    test t;
    memset(&t, 0, sizeof t);
    t.d = d;
    corax_status st = gather(&t);
    if (st == CORAX_OK && t.n)
        st = measure(&t);
    if (st == CORAX_OK && t.n && choose_fabrics(&t)) {
        int best = QA_AS_STATED, rival = QA_AS_STATED;
        for (int how = 1; how < QA_READINGS; how++) {
            if (t.pooled[how] > t.pooled[best])
                best = how;
            if (rival == QA_AS_STATED || t.pooled[how] > t.pooled[rival])
                rival = how;
        }
        if (best != QA_AS_STATED && t.pooled[best] >= clearly * t.pooled[QA_AS_STATED]) {
            st = say_better(&t, best);
            if (st == CORAX_OK)
                read_program_as(d, best);
        } else if (t.pooled[QA_AS_STATED] < clearly * t.pooled[rival])
            st = say_cannot_tell(&t, rival);
    }
    free(t.work);
    free(t.names);
    free(t.gain);
    free(t.dir);
    return st;
}
