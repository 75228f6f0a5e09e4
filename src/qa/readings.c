/* qa: the core log's readings: converted, grouped by hole, placed in their
 * orientation runs, and checked one by one; then the run and program checks. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_statistics_double.h>

#include "corax/stats.h"
#include "geometry/vec.h"
#include "qa/qa_int.h"

/* ---- grouping ---- */

typedef struct keyed {
    const char *name;
    size_t index;
    size_t rank; /* the hole's order of first appearance */
    double depth;
} keyed;

static int by_name(const void *a, const void *b)
{
    const keyed *x = a, *y = b;
    int c = strcmp(x->name, y->name);
    return c ? c : (x->index > y->index) - (x->index < y->index);
}

static int by_rank_depth(const void *a, const void *b)
{
    const keyed *x = a, *y = b;
    if (x->rank != y->rank)
        return x->rank < y->rank ? -1 : 1;
    int nx = isnan(x->depth), ny = isnan(y->depth);
    if (nx != ny)
        return nx ? 1 : -1;
    if (!nx && x->depth != y->depth)
        return x->depth < y->depth ? -1 : 1;
    return (x->index > y->index) - (x->index < y->index);
}

/* Convert every reading and group them by hole, holes in order of first
 * appearance, readings by depth. */
static corax_status group(qa_data *d, const corax_qa_reading *r, size_t n)
{
    keyed *k = malloc((n ? n : 1) * sizeof *k);
    d->items = malloc((n ? n : 1) * sizeof *d->items);
    d->holes = malloc((n ? n : 1) * sizeof *d->holes);
    if (!k || !d->items || !d->holes) {
        free(k);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; i < n; i++)
        k[i] = (keyed){r[i].hole, i, 0, r[i].reading.depth};
    qsort(k, n, sizeof *k, by_name);
    for (size_t i = 0; i < n; i++) /* the first index of each name is its rank */
        k[i].rank = (i > 0 && strcmp(k[i].name, k[i - 1].name) == 0) ? k[i - 1].rank : k[i].index;
    qsort(k, n, sizeof *k, by_rank_depth);
    d->nitems = n;
    d->nholes = 0;
    for (size_t i = 0; i < n; i++) {
        qa_item *it = &d->items[i];
        it->r = &r[k[i].index];
        it->run = QA_NONE;
        size_t hint = 0;
        corax_convert_reading(it->r->path, &it->r->reading, d->convert, &hint, &it->res);
        if (i == 0 || k[i].rank != k[i - 1].rank)
            d->holes[d->nholes++] = (qa_hole){it->r->hole, it->r->path, i, 0, 0};
        d->holes[d->nholes - 1].n++;
    }
    free(k);
    return CORAX_OK;
}

/* ---- runs ---- */

static int run_cmp(const void *a, const void *b)
{
    const corax_qa_run *x = a, *y = b;
    int c = strcmp(x->hole, y->hole);
    if (c)
        return c;
    return (x->from > y->from) - (x->from < y->from);
}

static corax_status add_run(qa_data *d, size_t *cap, corax_qa_run run)
{
    if (d->nruns == *cap) {
        size_t c = *cap ? 2 * *cap : 64;
        corax_qa_run *p = realloc(d->runs, c * sizeof *p);
        if (!p)
            return CORAX_ENOMEM;
        d->runs = p;
        *cap = c;
    }
    d->runs[d->nruns++] = run;
    return CORAX_OK;
}

/* The runs of one hole from the table (sorted by hole and depth), each
 * reading placed in its own. */
static corax_status hole_given_runs(qa_data *d, qa_hole *hole, const corax_qa_run *sorted,
                                    size_t n, size_t *cap)
{
    size_t lo = 0, hi = n; /* the hole's runs: the first with its name */
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (strcmp(sorted[mid].hole, hole->name) < 0)
            lo = mid + 1;
        else
            hi = mid;
    }
    size_t first = d->nruns;
    for (size_t k = lo; k < n && strcmp(sorted[k].hole, hole->name) == 0; k++)
        if (add_run(d, cap, sorted[k]) != CORAX_OK)
            return CORAX_ENOMEM;
    hole->given_runs = d->nruns > first;
    size_t k = first;
    for (size_t i = hole->first; i < hole->first + hole->n; i++) {
        double depth = d->items[i].r->reading.depth;
        while (k < d->nruns && d->runs[k].to < depth)
            k++;
        if (k < d->nruns && d->runs[k].from <= depth)
            d->items[i].run = k;
    }
    return CORAX_OK;
}

/* Runs of one hole inferred from the depths, for the tallies of what is in
 * them: a run begins at a reading and takes in the readings less than a
 * barrel below it. */
static corax_status hole_inferred_runs(qa_data *d, const qa_hole *hole, size_t *cap)
{
    size_t first = d->nruns;
    for (size_t i = hole->first; i < hole->first + hole->n; i++) {
        qa_item *it = &d->items[i];
        double depth = it->r->reading.depth;
        if (isnan(depth))
            continue;
        if (d->nruns == first || depth >= d->runs[d->nruns - 1].to) {
            corax_qa_run run = {hole->name, depth, depth + d->barrel, "", it->r->file, 0};
            if (add_run(d, cap, run) != CORAX_OK)
                return CORAX_ENOMEM;
        }
        it->run = d->nruns - 1;
    }
    return CORAX_OK;
}

/* The usual length of the table's runs (their median), else `fallback`. */
static double barrel_of(corax_qa_run *runs, size_t n, double fallback)
{
    double *len = malloc((n ? n : 1) * sizeof *len);
    if (!len || n == 0) {
        free(len);
        return fallback;
    }
    for (size_t i = 0; i < n; i++)
        len[i] = runs[i].to - runs[i].from;
    double b = gsl_stats_select(len, 1, n, n / 2);
    free(len);
    return b > 0.0 ? b : fallback;
}

/* Every hole's runs: the table's where it has them, else inferred. */
static corax_status place_runs(qa_data *d, const corax_qa_run *runs, size_t n)
{
    corax_qa_run *sorted = malloc((n ? n : 1) * sizeof *sorted);
    if (!sorted)
        return CORAX_ENOMEM;
    if (n)
        memcpy(sorted, runs, n * sizeof *sorted);
    qsort(sorted, n, sizeof *sorted, run_cmp);
    d->barrel = barrel_of(sorted, n, d->o->run_length);
    size_t cap = 0;
    corax_status st = CORAX_OK;
    for (size_t h = 0; h < d->nholes && st == CORAX_OK; h++) {
        st = hole_given_runs(d, &d->holes[h], sorted, n, &cap);
        if (st == CORAX_OK && !d->holes[h].given_runs)
            st = hole_inferred_runs(d, &d->holes[h], &cap);
    }
    free(sorted);
    return st;
}

/* ---- one reading at a time ---- */

static int same_reading(const corax_reading *a, const corax_reading *b)
{
    const double x[] = {a->depth, a->alpha, a->beta, a->gamma, a->line_alpha, a->line_beta};
    const double y[] = {b->depth, b->alpha, b->beta, b->gamma, b->line_alpha, b->line_beta};
    for (int i = 0; i < 6; i++)
        if (!(x[i] == y[i] || (isnan(x[i]) && isnan(y[i]))))
            return 0;
    return 1;
}

static corax_status check_readings(qa_data *d, const corax_program *prog)
{
    corax_status st = CORAX_OK;
    for (size_t h = 0; h < d->nholes && st == CORAX_OK; h++) {
        const qa_hole *hole = &d->holes[h];
        const qa_item *first = &d->items[hole->first];
        if (!corax_program_find(prog, hole->name, strlen(hole->name)))
            st = corax_findings_add(d->out, CORAX_ERROR, "reading-hole", first->r->file,
                                    first->r->line, hole->name, NAN,
                                    "hole %s is in the core log (%zu readings) but not in the "
                                    "collar table: none of its readings can be placed",
                                    hole->name, hole->n);
        for (size_t i = hole->first; i < hole->first + hole->n && st == CORAX_OK; i++) {
            const qa_item *it = &d->items[i];
            const corax_qa_reading *r = it->r;
            char note[400];
            if (r->problem)
                st = corax_findings_add(d->out, CORAX_ERROR, "reading-value", r->file, r->line,
                                        r->hole, r->reading.depth, "%s", r->problem);
            else if (it->res.conditions & CORAX_COND_INVALID) {
                corax_result only = it->res;
                only.conditions = CORAX_COND_INVALID;
                corax_result_note(&only, &r->reading, r->path, d->convert, note, sizeof note);
                st = corax_findings_add(d->out, CORAX_ERROR, "reading-value", r->file, r->line,
                                        r->hole, r->reading.depth, "%s", note);
            }
            if (st == CORAX_OK && i > hole->first && !r->problem &&
                same_reading(&r->reading, &d->items[i - 1].r->reading))
                st = corax_findings_add(d->out, CORAX_WARNING, "reading-repeated", r->file,
                                        r->line, r->hole, r->reading.depth,
                                        "this reading repeats the one on line %ld (the same "
                                        "depth and angles): typed twice?",
                                        d->items[i - 1].r->line);
        }
    }
    return st;
}

corax_status corax_qa_readings(const corax_program *prog, const corax_qa_reading *r, size_t n,
                               const corax_qa_run *runs, size_t nruns,
                               const corax_convert_options *convert, const corax_qa_options *o,
                               corax_findings *out)
{
    qa_data d;
    memset(&d, 0, sizeof d);
    d.o = o;
    d.convert = convert;
    d.out = out;
    corax_status st = group(&d, r, n);
    if (st == CORAX_OK)
        st = place_runs(&d, runs, nruns);
    if (st == CORAX_OK)
        st = check_readings(&d, prog);
    if (st == CORAX_OK)
        st = qa_check_runs(&d);
    if (st == CORAX_OK)
        st = qa_check_conventions(&d);
    if (st == CORAX_OK)
        st = qa_check_program(&d);
    free(d.items);
    free(d.holes);
    free(d.runs);
    return st;
}
