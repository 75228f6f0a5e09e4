/* qa: the core log's readings, hole by hole, checked one by one; then the
 * run and program checks. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "qa/qa_int.h"

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

/* The readings of the hole loaded, one by one. */
static corax_status check_readings(qa_data *d, const corax_program *prog)
{
    const qa_hole *hole = &d->hole;
    const qa_item *first = &d->items[0];
    corax_status st = CORAX_OK;
    if (!corax_program_find(prog, hole->name, strlen(hole->name)))
        st = corax_findings_add(d->out, CORAX_ERROR, "reading-hole", first->r->file,
                                first->r->line, hole->name, NAN,
                                "hole %s is in the core log (%zu readings) but not in the "
                                "collar table: none of its readings can be placed",
                                hole->name, hole->n);
    for (size_t i = 0; i < hole->n && st == CORAX_OK; i++) {
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
        if (st == CORAX_OK && i > 0 && !r->problem &&
            same_reading(&r->reading, &d->items[i - 1].r->reading))
            st = corax_findings_add(d->out, CORAX_WARNING, "reading-repeated", r->file,
                                    r->line, r->hole, r->reading.depth,
                                    "this reading repeats the one on line %ld (the same "
                                    "depth and angles): typed twice?",
                                    d->items[i - 1].r->line);
    }
    return st;
}

corax_status corax_qa_readings(const corax_program *prog, const corax_qa_log *log,
                               const corax_qa_run *runs, size_t nruns,
                               const corax_convert_options *convert, const corax_qa_options *o,
                               corax_findings *out)
{
    if (!corax_qa_log_sorted(log) || (nruns && !runs))
        return CORAX_EARG;
    qa_data d;
    memset(&d, 0, sizeof d);
    d.o = o;
    d.convert = convert;
    d.log = log;
    d.out = out;
    corax_status st = qa_open(&d, runs, nruns);
    for (size_t h = 0; h < d.nholes && st == CORAX_OK; h++) {
        if (!qa_in_shard(o, d.holes[h].name))
            continue;
        st = qa_load(&d, h);
        if (st == CORAX_OK)
            st = check_readings(&d, prog);
        if (st == CORAX_OK)
            st = qa_check_runs(&d);
    }
    int whole = o->shards <= 1; /* the checks that compare holes need them all */
    if (st == CORAX_OK && d.nholes && whole)
        st = qa_check_conventions(&d);
    if (st == CORAX_OK && d.nholes && whole)
        st = qa_check_program(&d);
    qa_close(&d);
    return st;
}
