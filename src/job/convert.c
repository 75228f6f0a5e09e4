/* job: the convert job. Without draws or references the core logs stream
 * through in batches: while one thread reads the next batch, every thread
 * converts the current one in chunks, and the chunks are written in row
 * order, so the output is the same whatever the number of threads. With
 * them, every log is held in memory (convert_memory.c). */
#include <math.h>
#include <omp.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "job/convert_int.h"

/* Rows are read a batch at a time and converted in chunks on every thread. */
enum { BATCH_ROWS = 16384, BATCH_CHUNKS = 32 };

/* A log of many holes moves to another hole on every row, and the look-up
 * waits on memory: the hole of the row HOLE_AHEAD rows on is fetched toward
 * the cache, and once it is near (COURSE_AHEAD rows on) the course that holds
 * that row's depth. HOLE_AHEAD is a power of two. */
enum { HOLE_AHEAD = 8, COURSE_AHEAD = 4 };

static void convert_row(const convert_run *r, convert_lane *ln, const corax_row *row)
{
    convert_eval ev;
    convert_evaluate(r, ln, row, &ev);
    corax_spread spread;
    const corax_spread *sp = NULL;
    if (r->draws) { /* drawn in the first reading */
        convert_uncertainty(r, ln, row, &ev);
        if (ev.simulate)
            sp = convert_draws_spread(r->draws, ln->next_draw++, &spread);
    }
    convert_write(r, ln, row, &ev, sp);
}

static void free_names(char **names, size_t n)
{
    for (size_t i = 0; i < n; i++)
        free(names[i]);
    free(names);
}

/* Write a batch's chunks to the output, in row order, and empty them. */
static void write_chunks(const convert_run *r, corax_writer **chunk)
{
    for (size_t c = 0; c < BATCH_CHUNKS; c++) {
        size_t len;
        const char *text = corax_writer_contents(chunk[c], &len);
        corax_writer_text(r->w, text, len);
        corax_writer_reset(chunk[c]);
    }
}

/* Convert batch `cur` on every thread into `chunk`, in chunks taken in turn,
 * while one thread first writes the previous batch's chunks (`done`) and reads
 * the following batch into `next` (when rd is not NULL). Chunks are written in
 * row order, so the output does not depend on the number of threads. */
static corax_status convert_batch(convert_run *r, const corax_table *cur, convert_lane *lanes,
                                  int nlanes, corax_writer **chunk, corax_writer **done,
                                  corax_reader *rd, corax_table *next, corax_status *read_status,
                                  corax_error *read_err)
{
    size_t n = corax_table_rows(cur), widest = corax_table_widest(cur);
    for (int k = 0; k < nlanes; k++) {
        const char **field = realloc(lanes[k].field, (widest ? widest : 1) * sizeof *field);
        if (!field)
            return CORAX_ENOMEM;
        lanes[k].field = field;
    }
    size_t taken = 0, base = r->seen; /* the batch's first row in the shard */
    r->seen += n;
#pragma omp parallel num_threads(nlanes)
    {
#pragma omp single nowait
        {
            write_chunks(r, done);
            if (rd)
                *read_status = convert_fill_batch(r, rd, next, BATCH_ROWS, read_err);
        }
        convert_lane *ln = &lanes[omp_get_thread_num()];
        for (;;) {
            size_t c;
#pragma omp atomic capture
            c = taken++;
            if (c >= BATCH_CHUNKS)
                break;
            ln->w = chunk[c];
            if (r->draws)
                ln->next_draw = convert_draws_rank(r->draws, base + n * c / BATCH_CHUNKS);
            size_t start = n * c / BATCH_CHUNKS, end = n * (c + 1) / BATCH_CHUNKS;
            const corax_hole *ahead[HOLE_AHEAD]; /* the holes of the rows to come */
            for (size_t i = start; i < start + HOLE_AHEAD && i < end; i++)
                ahead[i % HOLE_AHEAD] = convert_prefetch(r, cur, i);
            for (size_t i = start; i < end; i++) {
                ln->known = ahead[i % HOLE_AHEAD]; /* no second look-up */
                ln->has_known = 1;
                if (i + COURSE_AHEAD < end)
                    convert_prefetch_course(r, ln, cur, i + COURSE_AHEAD,
                                            ahead[(i + COURSE_AHEAD) % HOLE_AHEAD]);
                if (i + HOLE_AHEAD < end)
                    ahead[i % HOLE_AHEAD] = convert_prefetch(r, cur, i + HOLE_AHEAD);
                corax_row row;
                corax_table_row(cur, i, ln->field, &row);
                convert_row(r, ln, &row);
            }
        }
    }
    return CORAX_OK;
}

static corax_status convert_one_file(convert_run *r, convert_lane *lanes, int nlanes,
                                     corax_writer **chunk, corax_writer **done, const char *path,
                                     size_t index)
{
    corax_reader *rd;
    corax_error err;
    corax_error_clear(&err);
    corax_row row;
    corax_status st = convert_open_log(r, path, &rd, &row, &err);
    corax_table *cur = NULL, *next = NULL;
    corax_stage progress;
    job_stage_begin(r->job, &progress, path, "bytes", job_file_size(path));
    if (st == CORAX_OK) {
        for (int k = 0; k < nlanes; k++)
            convert_lane_file(&lanes[k], path, index, rd);
        cur = corax_table_new(path, lanes[0].decimal, &row);
        next = cur ? corax_table_new(path, lanes[0].decimal, &row) : NULL;
        st = next ? convert_fill_batch(r, rd, cur, BATCH_ROWS, &err) : CORAX_ENOMEM;
    }
    while ((st == CORAX_OK || st == CORAX_END) && corax_table_rows(cur) > 0) {
        corax_status read_st = CORAX_END;
        corax_error read_err;
        corax_error_clear(&read_err);
        corax_status bs = convert_batch(r, cur, lanes, nlanes, chunk, done,
                                        st == CORAX_OK ? rd : NULL, next, &read_st, &read_err);
        corax_writer **written = chunk; /* this batch's chunks go out with the next one */
        chunk = done;
        done = written;
        if (bs != CORAX_OK) {
            st = bs;
            break;
        }
        if (st == CORAX_END)
            break;
        st = read_st;
        err = read_err;
        corax_table *t = cur; /* the batch just read is converted next */
        cur = next;
        next = t;
        job_stage_step(r->job, &progress, (double)corax_reader_offset(rd));
    }
    job_stage_end(r->job, &progress);
    write_chunks(r, done); /* the last batch */
    corax_table_free(cur);
    corax_table_free(next);
    if (rd) {
        corax_table_info info;
        corax_reader_info(rd, &info);
        job_table_read(r->job, CORAX_ROLE_STRUCTURES, path, r->s->log.unit, &info);
    }
    corax_reader_close(rd);
    if (st != CORAX_END) {
        job_error_record(r->job, &err, st);
        return job_failed(st == CORAX_OK ? CORAX_EFORMAT : st);
    }
    return CORAX_OK;
}

/* Every lane's counts into the summary; the lanes' tallies merged into it. */
static corax_status sum_lanes(convert_lane *lanes, int nlanes, corax_convert_job_summary *sum)
{
    for (int k = 0; k < nlanes; k++) {
        sum->rows += lanes[k].rows;
        for (unsigned c = 0; c <= CORAX_COND_COUNT; c++)
            sum->count[c] += lanes[k].count[c];
    }
    for (int k = 1; k < nlanes; k++)
        if (corax_tally_merge(lanes[0].unknown_kind, lanes[k].unknown_kind) != CORAX_OK ||
            corax_tally_merge(lanes[0].unknown_confidence, lanes[k].unknown_confidence) !=
                CORAX_OK ||
            corax_tally_merge(lanes[0].no_line_error, lanes[k].no_line_error) != CORAX_OK)
            return CORAX_ENOMEM;
    sum->unknown_kind = lanes[0].unknown_kind; /* the summary's now */
    sum->unknown_confidence = lanes[0].unknown_confidence;
    sum->no_line_error = lanes[0].no_line_error;
    lanes[0].unknown_kind = lanes[0].unknown_confidence = lanes[0].no_line_error = NULL;
    return CORAX_OK;
}

void corax_convert_job_warn(corax_job *job, const corax_convert_job_options *o,
                            const corax_convert_job_summary *sum)
{
    corax_job_tally_warn(job, "kind code", "has no mapping", sum->unknown_kind,
                         "these rows keep it as their kind");
    corax_job_tally_warn(job, "confidence code", "has no mapping", sum->unknown_confidence,
                         o->draws ? "these rows get no uncertainty"
                                  : "these rows keep it as their confidence");
    corax_job_tally_warn(job, "confidence", "has no line error (--confidence-errors)",
                         sum->no_line_error, "these rows get no uncertainty");
}

void corax_convert_job_summary_clear(corax_convert_job_summary *sum)
{
    corax_tally_free(sum->unknown_kind);
    corax_tally_free(sum->unknown_confidence);
    corax_tally_free(sum->no_line_error);
    memset(sum, 0, sizeof *sum);
}

corax_convert_job_options corax_convert_job_options_default(void)
{
    static const corax_convert_confidence levels[] = {{"good", 3}, {"fair", 8}, {"poor", 20}};
    corax_convert_job_options o;
    memset(&o, 0, sizeof o);
    o.convert = corax_convert_options_default();
    o.log = corax_table_settings_default();
    o.place = CORAX_PLACE_MID;
    o.output = (corax_table_format){',', '.'};
    o.seed = 1;
    o.errors = corax_error_model_default();
    for (size_t i = 0; i < sizeof levels / sizeof levels[0]; i++) {
        o.confidence[i] = levels[i];
        o.confidence[i].sigma = corax_rad(levels[i].sigma);
    }
    o.nconfidence = sizeof levels / sizeof levels[0];
    o.unoriented_word = "unoriented";
    o.nearby_within = 30.0;
    return o;
}

/* What the job assumed, in its record. */
static void record(corax_record *a, const corax_convert_job_options *o, const char *const *logs,
                   size_t nlogs)
{
    corax_record_section(a, "convert");
    for (size_t i = 0; i < nlogs; i++)
        corax_record_set(a, "structures", "%s", logs[i]);
    corax_record_conventions(a, &o->convert);
    corax_record_codes(a, o->kind_codes, o->confidence_codes);
    if (o->has_section)
        corax_record_set(a, "section_azimuth", "%g", corax_deg(o->section_azimuth));
    if (o->runs && o->runs->table)
        corax_record_set(a, "runs", "%s", corax_table_path(o->runs->table));
    corax_record_set(a, "unoriented_word", "%s", o->unoriented_word);
    for (size_t i = 0; i < o->nrefs; i++) {
        const corax_convert_reference *ref = &o->refs[i];
        if (ref->nearby)
            corax_record_set(a, "orient_by", "%s=nearby (the mean of the hole's oriented "
                             "readings within %g m of the run)", ref->kind, o->nearby_within);
        else
            corax_record_set(a, "orient_by", "%s=%g/%g", ref->kind, corax_deg(ref->plane.dip),
                             corax_deg(ref->plane.dip_direction));
    }
    if (o->shards > 1)
        corax_record_set(a, "shard", "%u/%u (holes by corax_shard_of)", o->shard, o->shards);
    if (!o->draws)
        return;
    corax_record_uncertainty(a, &o->errors, o->draws, o->seed, 1);
    char map[600] = "";
    size_t used = 0;
    for (size_t i = 0; i < o->nconfidence && used < sizeof map; i++)
        used += (size_t)snprintf(map + used, sizeof map - used, "%s%s=%g", i ? "," : "",
                                 o->confidence[i].name, corax_deg(o->confidence[i].sigma));
    corax_record_set(a, "confidence_errors", "%s", map);
    if (o->cloud)
        corax_record_set(a, "cloud", "%s", o->cloud);
}

corax_status corax_convert_job_run(corax_job *job, const corax_program *prog,
                                   const corax_convert_job_options *s, const char *const *files,
                                   size_t nfiles, const char *output,
                                   corax_convert_job_summary *sum)
{
    convert_run r;
    memset(&r, 0, sizeof r);
    memset(sum, 0, sizeof *sum);
    r.job = job;
    r.prog = prog;
    r.s = s;
    int nlanes = s->threads > 0 ? s->threads : omp_get_max_threads();
    convert_lane *lanes = convert_lanes_new(nlanes);
    corax_writer *chunk[2][BATCH_CHUNKS] = {{NULL}};
    corax_status rc = lanes ? CORAX_OK : CORAX_ENOMEM;
    for (int k = 0; k < 2 * BATCH_CHUNKS && rc == CORAX_OK; k++) {
        corax_writer **w = &chunk[k / BATCH_CHUNKS][k % BATCH_CHUNKS];
        if (corax_writer_memory(w) != CORAX_OK)
            rc = CORAX_ENOMEM;
        else
            corax_writer_format(*w, s->output);
    }
    corax_error err;
    corax_error_clear(&err);
    corax_status st =
        rc == CORAX_OK ? corax_writer_open_in(job->outputs, output, &r.w, &err) : CORAX_ENOMEM;
    if (st != CORAX_OK) {
        job_error_record(job, &err, st);
        rc = job_failed(st);
    } else {
        corax_writer_format(r.w, s->output);
    }
    int whole = s->nrefs > 0; /* orienting runs needs every row in memory */
    convert_draws *draws = NULL;
    if (rc == CORAX_OK && whole) {
        rc = convert_in_memory(&r, lanes, nlanes, files, nfiles);
    } else if (rc == CORAX_OK && s->draws) { /* drawn in a first reading, written in a second */
        for (size_t i = 0; i < nfiles && rc == CORAX_OK; i++)
            if (strcmp(files[i], "-") == 0 && !(r.stdin_copy = convert_stdin_copy(job)))
                rc = CORAX_EIO;
        if (rc == CORAX_OK)
            rc = convert_draws_run(&r, files, nfiles, nlanes, &draws);
        r.draws = draws;
        r.other = 0; /* counted again in the second reading */
    }
    for (size_t i = 0; i < nfiles && rc == CORAX_OK && !whole; i++)
        rc = convert_one_file(&r, lanes, nlanes, chunk[0], chunk[1], files[i], i);
    if (rc == CORAX_OK && draws && !convert_draws_match(draws, r.seen)) {
        job_error(job, NULL, 0, "the core logs changed while they were converted (%zu rows "
                  "the second time they were read): convert them again", r.seen);
        rc = CORAX_EFORMAT;
    }
    convert_draws_free(draws);
    if (r.stdin_copy)
        fclose(r.stdin_copy);
    free_names(r.first, r.first ? r.nfirst : 0);
    if (rc != CORAX_OK) {
        corax_writer_discard(r.w);
    } else if ((st = corax_writer_commit(r.w, &err)) != CORAX_OK) {
        job_error_record(job, &err, st);
        rc = job_failed(st);
    }
    if (rc == CORAX_OK)
        rc = sum_lanes(lanes, nlanes, sum);
    sum->other_shards = r.other;
    if (rc == CORAX_OK)
        record(job->record, s, files, nfiles);
    for (int k = 0; k < 2 * BATCH_CHUNKS; k++)
        corax_writer_discard(chunk[k / BATCH_CHUNKS][k % BATCH_CHUNKS]);
    convert_lanes_free(lanes, nlanes);
    return rc;
}
