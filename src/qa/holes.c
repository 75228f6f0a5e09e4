/* qa: the core log's holes, one at a time: a hole's readings unpacked from
 * the log, converted, and placed in their orientation runs (the runs
 * table's, else runs inferred from the depths). */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_statistics_double.h>

#include "common/grow.h"
#include "qa/log_int.h"
#include "qa/qa_int.h"

/* ---- the holes, one at a time ---- */

/* The log's holes, and room for the largest. */
static corax_status holes_of(qa_data *d)
{
    const corax_qa_log *log = d->log;
    size_t n = log ? corax_strset_count(log->holes) : 0, most = 1;
    d->holes = malloc((n ? n : 1) * sizeof *d->holes);
    if (!d->holes)
        return CORAX_ENOMEM;
    for (size_t h = 0; h < n; h++) {
        const qa_log_hole *lh = &log->hole[h];
        d->holes[h] = (qa_hole){qa_log_hole_name(log, h), lh->path, lh->first, lh->n, 0};
        most = lh->n > most ? lh->n : most;
    }
    d->nholes = n;
    d->loaded = QA_NONE;
    d->reading_of = malloc(most * sizeof *d->reading_of);
    d->items = malloc(most * sizeof *d->items);
    return d->reading_of && d->items ? CORAX_OK : CORAX_ENOMEM;
}

const char *qa_hole_file(const qa_data *d, size_t h)
{
    corax_qa_reading r;
    corax_qa_log_get(d->log, d->holes[h].first, &r);
    return r.file;
}

/* Convert the readings of the hole loaded, their betas read as the program's
 * are (qa_data.reading). */
static void convert_hole(qa_data *d)
{
    size_t hint = 0;
    for (size_t i = 0; i < d->nitems; i++) {
        qa_item *it = &d->items[i];
        corax_convert_reading(it->r->path, &it->r->reading, d->convert, &hint, &it->res);
        if (d->reading == QA_AS_STATED || !it->res.has_plane || !isfinite(it->r->reading.beta))
            continue;
        corax_reading rd = it->r->reading;
        rd.beta = corax_wrap_azimuth(qa_beta_read(rd.beta, d->reading));
        corax_convert_reading(it->r->path, &rd, d->convert, &hint, &it->res);
    }
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

static corax_status add_run(qa_data *d, corax_qa_run run)
{
    corax_qa_run *p = corax_grow(d->runs, d->nruns, &d->runs_cap, sizeof *p, 64);
    if (!p)
        return CORAX_ENOMEM;
    d->runs = p;
    d->runs[d->nruns++] = run;
    return CORAX_OK;
}

/* The runs of the hole loaded from the table, each reading placed in its
 * own. */
static corax_status hole_given_runs(qa_data *d)
{
    qa_hole *hole = &d->hole;
    size_t lo = 0, hi = d->ngiven; /* the hole's runs: the first with its name */
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        if (strcmp(d->given[mid].hole, hole->name) < 0)
            lo = mid + 1;
        else
            hi = mid;
    }
    for (size_t k = lo; k < d->ngiven && strcmp(d->given[k].hole, hole->name) == 0; k++)
        if (add_run(d, d->given[k]) != CORAX_OK)
            return CORAX_ENOMEM;
    hole->given_runs = d->nruns > 0;
    size_t k = 0;
    for (size_t i = 0; i < hole->n; i++) {
        double depth = d->items[i].r->reading.depth;
        while (k < d->nruns && d->runs[k].to < depth)
            k++;
        if (k < d->nruns && d->runs[k].from <= depth)
            d->items[i].run = k;
    }
    return CORAX_OK;
}

/* Runs of the hole loaded inferred from the depths, for the tallies of what
 * is in them: a run begins at a reading and takes in the readings less than
 * a barrel below it. */
static corax_status hole_inferred_runs(qa_data *d)
{
    for (size_t i = 0; i < d->hole.n; i++) {
        qa_item *it = &d->items[i];
        double depth = it->r->reading.depth;
        if (isnan(depth))
            continue;
        if (d->nruns == 0 || depth >= d->runs[d->nruns - 1].to) {
            corax_qa_run run = {d->hole.name, depth, depth + d->barrel, "", it->r->file, 0};
            if (add_run(d, run) != CORAX_OK)
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

/* The runs table, sorted by hole and depth, and the usual run's length. */
static corax_status sort_runs(qa_data *d, const corax_qa_run *runs, size_t n)
{
    d->given = malloc((n ? n : 1) * sizeof *d->given);
    if (!d->given)
        return CORAX_ENOMEM;
    if (n)
        memcpy(d->given, runs, n * sizeof *d->given);
    d->ngiven = n;
    qsort(d->given, n, sizeof *d->given, run_cmp);
    d->barrel = barrel_of(d->given, n, d->o->run_length);
    return CORAX_OK;
}

corax_status qa_open(qa_data *d, const corax_qa_run *runs, size_t nruns)
{
    corax_status st = holes_of(d);
    return st == CORAX_OK ? sort_runs(d, runs, nruns) : st;
}

void qa_close(qa_data *d)
{
    free(d->holes);
    free(d->given);
    free(d->reading_of);
    free(d->items);
    free(d->runs);
}

corax_status qa_load(qa_data *d, size_t h)
{
    if (d->loaded == h)
        return CORAX_OK;
    const qa_hole *hole = &d->holes[h];
    d->loaded = h;
    d->hole = *hole;
    d->hole.first = 0;
    d->nitems = hole->n;
    for (size_t i = 0; i < hole->n; i++) {
        corax_qa_log_get(d->log, hole->first + i, &d->reading_of[i]);
        d->items[i] = (qa_item){&d->reading_of[i], {0}, QA_NONE};
    }
    convert_hole(d);
    d->nruns = 0;
    corax_status st = hole_given_runs(d);
    if (st == CORAX_OK && !d->hole.given_runs)
        st = hole_inferred_runs(d);
    if (st != CORAX_OK)
        d->loaded = QA_NONE;
    return st;
}
