/* job: runs of core without an orientation mark, oriented by reference
 * (convert --orient-by). The rows whose betas run from an arbitrary line are
 * grouped into their runs; each run's readings of a reference kind are set
 * against that kind's known plane, or the mean of the hole's oriented
 * readings of that kind nearby; the library fits the run's turn about the
 * core axis, and the run's rows are converted again with it. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "corax/stats.h"
#include "job/convert_int.h"

/* A turn fits as well as the best when its misfit is within this. */
#define TURN_TIE_DEG 3.0

/* An oriented reading, placed: for the nearby references. */
typedef struct placed {
    const corax_hole *hole;
    double depth;
    size_t row;
} placed;

static int by_place(const void *pa, const void *pb)
{
    const placed *a = pa, *b = pb;
    if (a->hole != b->hole)
        return a->hole < b->hole ? -1 : 1;
    return (a->depth > b->depth) - (a->depth < b->depth);
}

/* The rows with an arbitrary line, grouped into their runs: a run of the runs
 * table, or else consecutive rows of one hole. */
static corax_status group_runs(const convert_run *r, convert_eval *ev, size_t n,
                               convert_group **out, size_t *nout)
{
    const corax_runs *runs = r->s->runs;
    long *of_run = malloc(((runs ? runs->n : 0) + 1) * sizeof *of_run);
    convert_group *g = NULL;
    size_t ng = 0, cap = 0;
    if (!of_run)
        return CORAX_ENOMEM;
    for (size_t k = 0; runs && k < runs->n; k++)
        of_run[k] = -1;
    long open = -1; /* the group of the row before, for rows outside the runs table */
    for (size_t i = 0; i < n; i++) {
        convert_eval *e = &ev[i];
        if (!e->rd.arbitrary_line || !e->res.located) {
            open = -1;
            continue;
        }
        long k = e->run >= 0 ? of_run[e->run] : -1;
        if (e->run < 0 && open >= 0 && g[open].last + 1 == i && g[open].hole == e->hole)
            k = open;
        if (k < 0) {
            convert_group *grown = corax_grow(g, ng, &cap, sizeof *g, 16);
            if (!grown) {
                free(g);
                free(of_run);
                return CORAX_ENOMEM;
            }
            g = grown;
            memset(&g[ng], 0, sizeof *g);
            g[ng].hole = e->hole;
            g[ng].run = e->run;
            g[ng].first = i;
            g[ng].from = e->run >= 0 ? runs->run[e->run].from : e->rd.depth;
            g[ng].to = e->run >= 0 ? runs->run[e->run].to : e->rd.depth;
            if (e->run >= 0)
                of_run[e->run] = (long)ng;
            k = (long)ng++;
        }
        e->group = k;
        g[k].last = i;
        if (e->run < 0) {
            g[k].from = fmin(g[k].from, e->rd.depth);
            g[k].to = fmax(g[k].to, e->rd.depth);
        }
        open = e->run < 0 ? k : -1;
    }
    free(of_run);
    *out = g;
    *nout = ng;
    return CORAX_OK;
}

/* The reference for a kind (len bytes), or NULL. */
static const convert_reference *reference_of(const convert_setup *s, const char *kind, size_t len)
{
    for (size_t k = 0; k < s->nrefs; k++)
        if (strlen(s->refs[k].kind) == len && strncasecmp(s->refs[k].kind, kind, len) == 0)
            return &s->refs[k];
    return NULL;
}

/* What one reference says for one run. */
typedef struct ref_state {
    int done, ok;
    corax_vec3 normal;
    double spread; /* radians: RMS angle of the nearby readings from their mean */
    size_t count;  /* nearby readings */
} ref_state;

/* The mean of the hole's oriented readings of the kind within reach of the
 * run, with their spread; ok when there are enough of them. */
static int nearby_mean(const convert_run *r, const corax_table *rows, const convert_eval *ev,
                       const placed *idx, size_t nidx, const convert_group *g,
                       const convert_reference *ref, ref_state *st)
{
    double reach = r->s->nearby_within;
    placed key = {g->hole, g->from - reach, 0};
    size_t lo = 0, hi = nidx;
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (by_place(&idx[mid], &key) < 0)
            lo = mid + 1;
        else
            hi = mid;
    }
    corax_vec3 *v = NULL;
    size_t nv = 0, cap = 0;
    for (size_t k = lo; k < nidx && idx[k].hole == g->hole && idx[k].depth <= g->to + reach; k++) {
        size_t len;
        const char *kind = corax_table_cell(rows, idx[k].row, r->col[COL_KIND], &len);
        if (strlen(ref->kind) != len || strncasecmp(ref->kind, kind, len) != 0)
            continue;
        corax_vec3 *grown = corax_grow(v, nv, &cap, sizeof *v, 32);
        if (!grown) {
            free(v);
            return 0;
        }
        v = grown;
        v[nv++] = ev[idx[k].row].res.normal;
    }
    st->count = nv;
    corax_axial_summary sum;
    st->ok = nv >= CORAX_FISHER_MIN_READINGS &&
             corax_axial_summary_compute(v, NULL, nv, &sum) == CORAX_OK;
    if (st->ok) {
        st->normal = sum.fisher.mean;
        double s2 = 0.0;
        for (size_t k = 0; k < nv; k++) {
            double c = fabs(v[k].x * sum.fisher.mean.x + v[k].y * sum.fisher.mean.y +
                            v[k].z * sum.fisher.mean.z);
            double a = acos(fmin(1.0, c));
            s2 += a * a;
        }
        st->spread = sqrt(s2 / (double)nv);
    }
    free(v);
    return 1;
}

/* Append to a run's note. */
static void say(convert_group *g, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

static void say(convert_group *g, const char *fmt, ...)
{
    size_t used = strlen(g->note);
    if (used + 1 >= sizeof g->note)
        return;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(g->note + used, sizeof g->note - used, fmt, ap);
    va_end(ap);
}

/* The references a run was set against, for its note. */
static void describe_refs(const convert_setup *s, const ref_state *st, convert_group *g,
                          double reach)
{
    int first = 1;
    for (size_t k = 0; k < s->nrefs; k++) {
        if (!st[k].done || !st[k].ok)
            continue;
        const convert_reference *ref = &s->refs[k];
        corax_plane p = ref->nearby ? corax_plane_from_normal(st[k].normal, NULL) : ref->plane;
        say(g, "%s%s %.1f/%05.1f", first ? "" : " and ", ref->kind, corax_deg(p.dip),
            corax_wrap_degrees(corax_deg(p.dip_direction), 1));
        if (ref->nearby)
            say(g, " (the mean of %zu oriented readings within %g m, spread %.1f)", st[k].count,
                reach, corax_deg(st[k].spread));
        first = 0;
    }
}

/* Fit one run's turn; 1 when it was fitted. */
static int fit_run(const convert_run *r, const corax_table *rows, convert_eval *ev,
                   const placed *idx, size_t nidx, convert_group *g, long k,
                   corax_turn_reading *tr)
{
    const convert_setup *s = r->s;
    ref_state st[8];
    memset(st, 0, sizeof st);
    size_t nt = 0;
    double spread2 = 0.0;
    for (size_t i = g->first; i <= g->last; i++) {
        convert_eval *e = &ev[i];
        size_t len;
        const char *kind = corax_table_cell(rows, i, r->col[COL_KIND], &len);
        const convert_reference *ref = reference_of(s, kind, len);
        corax_core_frame f;
        if (e->group != k || !e->usable || !ref || isnan(e->rd.alpha) || isnan(e->rd.beta) ||
            corax_core_frame_of(e->res.point.tangent, &f) != CORAX_OK)
            continue;
        ref_state *rs = &st[ref - s->refs];
        if (!rs->done) {
            rs->done = 1;
            if (!ref->nearby) {
                rs->ok = 1;
                rs->normal = corax_plane_normal(ref->plane);
            } else if (!nearby_mean(r, rows, ev, idx, nidx, g, ref, rs)) {
                return -1;
            }
        }
        if (!rs->ok)
            continue;
        tr[nt++] = (corax_turn_reading){f, e->rd.alpha,
                                        corax_core_beta_canonical(e->rd.beta, &s->convert.conventions),
                                        rs->normal};
        spread2 += rs->spread * rs->spread;
    }
    say(g, "run %.2f-%.2f m", g->from, g->to);
    int short_nearby = 0;
    for (size_t j = 0; j < s->nrefs; j++)
        short_nearby |= st[j].done && !st[j].ok;
    if (nt == 0) {
        if (short_nearby) {
            for (size_t j = 0; j < s->nrefs; j++)
                if (st[j].done && !st[j].ok)
                    say(g, ": only %zu oriented %s reading%s within %g m, too few (%d) for a "
                        "reference", st[j].count, s->refs[j].kind, st[j].count == 1 ? "" : "s",
                        s->nearby_within, CORAX_FISHER_MIN_READINGS);
            say(g, "; left unoriented");
        } else {
            say(g, ": no reading of ");
            for (size_t j = 0; j < s->nrefs; j++)
                say(g, "%s%s", j ? " or " : "", s->refs[j].kind);
            say(g, " in the run to orient it by; left unoriented");
        }
        return 0;
    }
    if (corax_turn_fit(tr, nt, sqrt(spread2 / (double)nt), corax_rad(TURN_TIE_DEG), &g->turn) !=
        CORAX_OK)
        return 0;
    if (g->turn.status == CORAX_TURN_AMBIGUOUS) {
        say(g, ": turns of %.0f and %.0f degrees fit as well (misfits %.1f and %.1f) against ",
            corax_deg(g->turn.turn), corax_deg(g->turn.other_turn), corax_deg(g->turn.misfit),
            corax_deg(g->turn.other_misfit));
        describe_refs(s, st, g, s->nearby_within);
        say(g, ": the reference lies nearly across the core, or nearly along it, here; left "
               "unoriented");
        return 0;
    }
    say(g, " oriented by ");
    describe_refs(s, st, g, s->nearby_within);
    say(g, ": %zu reference reading%s, misfit %.1f, turn error %.1f degrees", nt,
        nt == 1 ? "" : "s", corax_deg(g->turn.misfit), corax_deg(g->turn.sigma));
    return 1;
}

corax_status convert_orient(const convert_run *r, const corax_table *rows, convert_eval *ev,
                            size_t n, convert_group **groups, size_t *ngroups)
{
    convert_group *g = NULL;
    size_t ng = 0, nidx = 0;
    if (r->col[COL_KIND] < 0) {
        job_error(r->job, corax_table_path(rows), 1,
                  "--orient-by needs a 'kind' column in the core log");
        return CORAX_EFORMAT;
    }
    placed *idx = malloc((n ? n : 1) * sizeof *idx);
    corax_turn_reading *tr = malloc((n ? n : 1) * sizeof *tr);
    corax_status rc = idx && tr ? group_runs(r, ev, n, &g, &ng) : CORAX_ENOMEM;
    for (size_t i = 0; rc == CORAX_OK && i < n; i++)
        if (ev[i].res.has_plane && !ev[i].rd.arbitrary_line && ev[i].hole)
            idx[nidx++] = (placed){ev[i].hole, ev[i].rd.depth, i};
    if (rc == CORAX_OK)
        qsort(idx, nidx, sizeof *idx, by_place);
    for (size_t k = 0; rc == CORAX_OK && k < ng; k++) {
        int fitted = fit_run(r, rows, ev, idx, nidx, &g[k], (long)k, tr);
        if (fitted < 0) {
            rc = CORAX_ENOMEM;
            break;
        }
        g[k].fitted = fitted;
        for (size_t i = g[k].first; fitted && i <= g[k].last; i++) {
            convert_eval *e = &ev[i];
            if (e->group != (long)k || !e->usable)
                continue;
            size_t hint = 0;
            e->rd.turn = g[k].turn.turn;
            corax_convert_reading(e->hole, &e->rd, &r->s->convert, &hint, &e->res);
            e->turn_sigma = g[k].turn.sigma; /* its uncertainty follows, once all are turned */
        }
    }
    free(idx);
    free(tr);
    if (rc != CORAX_OK) {
        free(g);
        job_error(r->job, NULL, 0, "out of memory while orienting runs");
        return rc;
    }
    *groups = g;
    *ngroups = ng;
    return CORAX_OK;
}
