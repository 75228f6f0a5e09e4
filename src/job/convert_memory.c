/* job: the convert job with every log in memory (draws, references).
 * Orients the runs without a mark by reference, simulates the holes in
 * parallel (each from its own seeded stream), writes the rows in their
 * order, and the optional cloud of every draw hole by hole. */
#include <omp.h>
#include <stdlib.h>
#include <string.h>

#include "job/convert_int.h"

/* Every log, in one table; end[f] is the number of rows up to the end of
 * log f, and decimal[f] its decimal mark. */
static corax_status load_logs(convert_run *r, const char *const *files, size_t nfiles,
                              corax_table **out, size_t *end, char *decimal)
{
    corax_table *all = NULL;
    for (size_t f = 0; f < nfiles; f++) {
        corax_reader *rd;
        corax_row row;
        corax_error err;
        corax_error_clear(&err);
        corax_status st = convert_open_log(r, files[f], &rd, &row, &err);
        corax_table_info info;
        if (st == CORAX_OK) {
            corax_reader_info(rd, &info);
            decimal[f] = info.format.decimal;
            if (!all && !(all = corax_table_new(files[0], decimal[f], &row)))
                st = CORAX_ENOMEM;
        }
        while (st == CORAX_OK && (st = corax_reader_next(rd, &row, &err)) == CORAX_OK)
            if (convert_row_in_shard(r, &row))
                st = corax_table_append(all, &row);
            else
                r->other++;
        if (rd) {
            corax_reader_info(rd, &info);
            job_table_read(r->job, CORAX_ROLE_STRUCTURES, files[f], r->s->log.unit, &info);
        }
        corax_reader_close(rd);
        if (st != CORAX_END) {
            job_error_record(r->job, &err, st);
            corax_table_free(all);
            return job_failed(st);
        }
        end[f] = corax_table_rows(all);
    }
    *out = all;
    return CORAX_OK;
}

typedef struct member {
    const corax_hole *hole;
    size_t row;
    size_t first; /* the first row of its hole: holes go in order of appearance */
} member;

static int by_hole(const void *a, const void *b)
{
    const member *x = a, *y = b;
    if (x->hole != y->hole)
        return x->hole < y->hole ? -1 : 1;
    return (x->row > y->row) - (x->row < y->row);
}

static int by_first(const void *a, const void *b)
{
    const member *x = a, *y = b;
    if (x->first != y->first)
        return x->first < y->first ? -1 : 1;
    return (x->row > y->row) - (x->row < y->row);
}

/* The rows to simulate, grouped by hole, holes in order of first appearance;
 * *groups gets each group's first index (ngroups + 1 entries). */
static member *group_rows(const convert_eval *ev, size_t n, size_t *count, size_t **groups,
                          size_t *ngroups)
{
    size_t m = 0;
    member *g = malloc((n ? n : 1) * sizeof *g);
    if (!g)
        return NULL;
    for (size_t i = 0; i < n; i++)
        if (ev[i].simulate)
            g[m++] = (member){ev[i].hole, i, 0};
    qsort(g, m, sizeof *g, by_hole);
    for (size_t i = 0; i < m; i++)
        g[i].first = (i > 0 && g[i].hole == g[i - 1].hole) ? g[i - 1].first : g[i].row;
    qsort(g, m, sizeof *g, by_first);
    size_t *start = malloc((m + 1) * sizeof *start);
    if (!start) {
        free(g);
        return NULL;
    }
    size_t k = 0;
    for (size_t i = 0; i < m; i++)
        if (i == 0 || g[i].hole != g[i - 1].hole)
            start[k++] = i;
    start[k] = m;
    *count = m;
    *groups = start;
    *ngroups = k;
    return g;
}

/* Simulate every group; spread[k] for member k. The cloud (may be NULL) gets
 * the holes in group order. */
static corax_status simulate(const convert_run *r, const member *g, const size_t *groups,
                             size_t ngroups, const convert_eval *ev, corax_spread *spread,
                             corax_writer *cloud, int nlanes)
{
    const convert_setup *s = r->s;
    size_t count = groups[ngroups];
    corax_mc_reading *mr = malloc((count ? count : 1) * sizeof *mr);
    corax_mc **mc = calloc((size_t)nlanes, sizeof *mc);
    corax_writer **cw = calloc((size_t)nlanes, sizeof *cw);
    int failed = !mr || !mc || !cw;
    for (int k = 0; !failed && k < nlanes; k++)
        failed = !(mc[k] = corax_mc_new()) ||
                 (cloud && corax_writer_memory(&cw[k]) != CORAX_OK);
    for (int k = 0; !failed && cloud && k < nlanes; k++)
        corax_writer_format(cw[k], s->output);
    for (size_t k = 0; !failed && k < count; k++) {
        const convert_eval *e = &ev[g[k].row];
        mr[k] = (corax_mc_reading){e->rd, e->errors, e->res};
    }
    corax_stage progress;
    job_stage_begin(r->job, &progress, "uncertainty", "readings", (double)count);
    size_t done = 0;
    if (!failed) {
#pragma omp parallel for ordered schedule(dynamic, 1) num_threads(nlanes)
        for (size_t h = 0; h < ngroups; h++) {
            int t = omp_get_thread_num();
            size_t a = groups[h], n = groups[h + 1] - a;
            const corax_hole *hole = g[a].hole;
            convert_cloud ctx = {cw[t], corax_hole_name(hole), mr + a};
            if (cloud)
                corax_writer_reset(cw[t]);
            corax_status st = corax_mc_hole(mc[t], hole, mr + a, n, &s->convert, &s->errors,
                                            s->draws, s->seed, spread + a,
                                            cloud ? convert_cloud_draw : NULL, &ctx);
            if (st != CORAX_OK) {
#pragma omp atomic write
                failed = 1;
            }
#pragma omp ordered
            {
                if (cloud) {
                    size_t len;
                    const char *text = corax_writer_contents(cw[t], &len);
                    corax_writer_text(cloud, text, len);
                }
                done += n;
                job_stage_step(r->job, &progress, (double)done);
            }
        }
    }
    job_stage_end(r->job, &progress);
    for (int k = 0; mc && k < nlanes; k++)
        corax_mc_free(mc[k]);
    for (int k = 0; cw && k < nlanes; k++)
        corax_writer_discard(cw[k]);
    free(mc);
    free(cw);
    free(mr);
    if (failed)
        job_error(r->job, NULL, 0, "out of memory while drawing");
    return failed ? CORAX_ENOMEM : CORAX_OK;
}

/* Point the lane at the log that row i came from. */
static void lane_at_row(convert_lane *ln, const char *const *files, const size_t *end,
                        const char *decimal, size_t i)
{
    size_t f = 0;
    while (end[f] <= i)
        f++;
    ln->file = files[f];
    ln->file_index = f;
    ln->decimal = decimal[f];
}

corax_status convert_in_memory(convert_run *r, convert_lane *lanes, int nlanes,
                               const char *const *files, size_t nfiles)
{
    corax_table *all = NULL;
    size_t *end = calloc(nfiles + 1, sizeof *end);
    char *decimal = calloc(nfiles + 1, 1);
    corax_status rc =
        end && decimal ? load_logs(r, files, nfiles, &all, end, decimal) : CORAX_ENOMEM;
    if (rc != CORAX_OK) {
        free(end);
        free(decimal);
        return rc;
    }
    size_t n = corax_table_rows(all), count = 0, ngroups = 0, *groups = NULL, nruns = 0;
    convert_eval *ev = calloc(n ? n : 1, sizeof *ev);
    const char **field = malloc((corax_table_widest(all) + 1) * sizeof *field);
    convert_group *runs = NULL;
    member *g = NULL;
    corax_spread *spread = NULL;
    corax_writer *cloud = NULL;
    corax_error err;
    corax_error_clear(&err);
    rc = ev && field ? CORAX_OK : CORAX_ENOMEM;
    for (size_t i = 0; rc == CORAX_OK && i < n; i++) {
        corax_row row;
        corax_table_row(all, i, field, &row);
        lane_at_row(&lanes[0], files, end, decimal, i);
        convert_evaluate(r, &lanes[0], &row, &ev[i]);
    }
    if (rc == CORAX_OK && r->s->nrefs) {
        rc = convert_orient(r, all, ev, n, &runs, &nruns);
        r->groups = runs;
    }
    for (size_t i = 0; rc == CORAX_OK && i < n && r->s->draws; i++) { /* after the turns */
        corax_row row;
        corax_table_row(all, i, field, &row);
        lane_at_row(&lanes[0], files, end, decimal, i);
        convert_uncertainty(r, &lanes[0], &row, &ev[i]);
    }
    if (rc == CORAX_OK && r->s->draws) {
        g = group_rows(ev, n, &count, &groups, &ngroups);
        spread = g ? calloc(count ? count : 1, sizeof *spread) : NULL;
        if (!spread)
            rc = CORAX_ENOMEM;
    }
    if (rc == CORAX_OK && r->s->cloud && !(cloud = convert_cloud_open(r, &rc)))
        rc = job_failed(rc);
    if (rc == CORAX_OK && r->s->draws)
        rc = simulate(r, g, groups, ngroups, ev, spread, cloud, nlanes);
    /* back to row order, and out */
    const corax_spread **by_row = rc == CORAX_OK ? calloc(n ? n : 1, sizeof *by_row) : NULL;
    if (rc == CORAX_OK && !by_row)
        rc = CORAX_ENOMEM;
    for (size_t k = 0; rc == CORAX_OK && k < count; k++)
        by_row[g[k].row] = &spread[k];
    lanes[0].w = r->w;
    for (size_t i = 0; rc == CORAX_OK && i < n; i++) {
        corax_row row;
        corax_table_row(all, i, field, &row);
        lane_at_row(&lanes[0], files, end, decimal, i);
        convert_write(r, &lanes[0], &row, &ev[i], by_row[i]);
    }
    if (cloud) {
        corax_status st = rc == CORAX_OK ? corax_writer_commit(cloud, &err) : CORAX_OK;
        if (rc != CORAX_OK)
            corax_writer_discard(cloud);
        if (st != CORAX_OK) {
            job_error_record(r->job, &err, st);
            rc = job_failed(st);
        }
    }
    r->groups = NULL;
    free(runs);
    free(by_row);
    free(spread);
    free(groups);
    free(g);
    free(field);
    free(ev);
    free(end);
    free(decimal);
    corax_table_free(all);
    return rc;
}
