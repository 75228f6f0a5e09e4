/* job: the check job, the QA of a drill program: its surveys, its core logs
 * (read row by row into a compact log, a few dozen bytes a reading, which
 * the checks and the report go over hole by hole) and its runs, every
 * finding placed at its hole and depth, in a table and an HTML report. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "corax/corax.h"
#include "corax/report.h"
#include "io/fields.h"
#include "job/job_int.h"

/* ---- the core logs, read row by row into a compact log ---- */

typedef struct logs {
    corax_qa_log *log;
    corax_tally *unknown_kind, *unknown_confidence; /* codes with no word */
    size_t other; /* rows of other shards */
} logs;

static void logs_free(logs *l)
{
    corax_qa_log_free(l->log);
    corax_tally_free(l->unknown_kind);
    corax_tally_free(l->unknown_confidence);
}

enum { L_HOLE, L_DEPTH, L_FROM, L_TO, L_ALPHA, L_BETA, L_GAMMA, L_LALPHA, L_LBETA, L_KIND, L_CONF,
       NL };
static const char *const log_names[NL] = {"hole",  "depth", "from", "to", "alpha", "beta",
                                          "gamma", "line_alpha", "line_beta", "kind",
                                          "confidence"};

/* One log being read. */
typedef struct log_file {
    corax_job *job;
    const corax_check_job_options *o;
    size_t index;      /* among the logs */
    corax_reader *reader;
    long col[NL];
    size_t width;      /* the header's fields */
    char decimal;
    corax_stage progress;
} log_file;

/* One row to a reading, added to the log; the phrase of the first value
 * that cannot be read is its problem. */
static corax_status read_row(const log_file *lf, const corax_program *prog, const corax_row *row,
                             logs *l)
{
    const corax_check_job_options *o = lf->o;
    const long *col = lf->col;
    corax_qa_reading r;
    size_t hl, kl, cl;
    r.hole = corax_field_text(row, col[L_HOLE], &hl);
    if (o->qa.shards > 1 && corax_shard_of(r.hole, hl, o->qa.shards) != o->qa.shard) {
        l->other++;
        return CORAX_OK;
    }
    r.path = corax_program_find(prog, r.hole, hl);
    r.file = o->logs[lf->index]; /* the caller's: findings and tallies outlive the reader */
    r.line = row->line;
    const char *kind = corax_field_text(row, col[L_KIND], &kl);
    const char *conf = corax_field_text(row, col[L_CONF], &cl);
    r.kind = job_code_word(o->kind_codes, kind, kl, l->unknown_kind, r.file, lf->index, r.line);
    r.confidence = job_code_word(o->confidence_codes, conf, cl, l->unknown_confidence, r.file,
                                 lf->index, r.line);
    r.problem = NULL;
    r.reading = corax_reading_empty();
    char why[200], problem[200];
    if (corax_field_ragged(row, lf->width, why, sizeof why))
        r.problem = strcpy(problem, why);
    if (corax_field_depth(row, col + L_DEPTH, lf->decimal, o->log.unit, (int)o->place,
                          &r.reading.depth, why, sizeof why) != CORAX_NUMBER_OK &&
        !r.problem)
        r.problem = strcpy(problem, why);
    double *slot[] = {&r.reading.alpha, &r.reading.beta, &r.reading.gamma,
                      &r.reading.line_alpha, &r.reading.line_beta};
    for (int k = L_ALPHA; k <= L_LBETA; k++) {
        double v;
        corax_number_status st = corax_field_number(row, col[k], lf->decimal, log_names[k], &v,
                                                    why, sizeof why);
        if (st == CORAX_NUMBER_OK)
            *slot[k - L_ALPHA] = corax_rad(v);
        else if (st != CORAX_NUMBER_EMPTY && col[k] >= 0 && !r.problem)
            r.problem = strcpy(problem, why);
    }
    return corax_qa_log_add(l->log, &r);
}

/* The rest of a log whose header will not do: a fault in its rows is said
 * first, as when logs were read whole. CORAX_OK when there is none (the
 * log then counts as read). */
static corax_status read_through(log_file *lf, const char *path)
{
    corax_row row;
    corax_error err;
    corax_error_clear(&err);
    corax_status st;
    while ((st = corax_reader_next(lf->reader, &row, &err)) == CORAX_OK)
        ;
    if (st != CORAX_END) {
        job_error_record(lf->job, &err, st);
        return job_failed(st);
    }
    corax_table_info info;
    corax_reader_info(lf->reader, &info);
    job_table_read(lf->job, CORAX_ROLE_STRUCTURES, path, lf->o->log.unit, &info);
    return CORAX_OK;
}

/* Open a log and find its columns; an error message and the status when it
 * cannot be read or lacks one. */
static corax_status open_log(log_file *lf, const char *path)
{
    const corax_check_job_options *o = lf->o;
    corax_error err;
    corax_error_clear(&err);
    corax_row header;
    corax_status st = corax_reader_open(path, o->log.format, &lf->reader, &err);
    if (st == CORAX_OK && (st = corax_reader_next(lf->reader, &header, &err)) == CORAX_END)
        st = corax_error_set(&err, CORAX_EFORMAT, path, 1, "the file is empty (no header row)");
    if (st == CORAX_OK && (st = corax_header_check(&header, &err)) != CORAX_OK)
        corax_error_file(&err, path);
    if (st != CORAX_OK) {
        job_error_record(lf->job, &err, st);
        return job_failed(st);
    }
    corax_table_info info;
    corax_reader_info(lf->reader, &info);
    lf->decimal = info.format.decimal;
    lf->width = header.count;
    const char *mapped = NULL;
    for (size_t k = 0; k < NL; k++) {
        lf->col[k] = corax_column_find(&header, log_names[k], o->log.columns);
        if (lf->col[k] == CORAX_COLUMN_MAPPED_MISSING && !mapped)
            mapped = log_names[k];
    }
    const long *col = lf->col;
    const char *missing = col[L_HOLE] < 0 ? "hole"
                          : col[L_DEPTH] < 0 && (col[L_FROM] < 0 || col[L_TO] < 0)
                              ? "depth (or from and to)"
                          : col[L_ALPHA] < 0 && col[L_LALPHA] < 0 ? "alpha"
                                                                  : NULL;
    if (!mapped && !missing)
        return CORAX_OK;
    if ((st = read_through(lf, path)) != CORAX_OK)
        return st;
    if (mapped)
        job_error(lf->job, path, 1, "no '%s' column in the header, which the column names give "
                  "for %s", corax_column_mapped(o->log.columns, mapped), mapped);
    else
        job_error(lf->job, path, 1, "no '%s' column in the header", missing);
    return CORAX_EFORMAT;
}

/* Read one log, row by row, into the compact log. */
static corax_status read_log(corax_job *job, const corax_check_job_options *o, size_t f,
                             const corax_program *prog, logs *l)
{
    const char *path = o->logs[f];
    log_file lf = {job, o, f, NULL, {0}, 0, 0, {0}};
    corax_status st = open_log(&lf, path);
    if (st != CORAX_OK) {
        corax_reader_close(lf.reader);
        return st;
    }
    job_stage_begin(job, &lf.progress, path, "bytes", job_file_size(path));
    corax_row row;
    corax_error err;
    corax_error_clear(&err);
    size_t rows = 0;
    while (st == CORAX_OK && (st = corax_reader_next(lf.reader, &row, &err)) == CORAX_OK) {
        if (++rows % 65536 == 0)
            job_stage_step(job, &lf.progress, (double)corax_reader_offset(lf.reader));
        st = read_row(&lf, prog, &row, l);
    }
    job_stage_end(job, &lf.progress);
    if (st == CORAX_END) {
        corax_table_info info;
        corax_reader_info(lf.reader, &info);
        job_table_read(job, CORAX_ROLE_STRUCTURES, path, o->log.unit, &info);
        st = CORAX_OK;
    } else if (st == CORAX_ENOMEM && !err.message[0])
        job_error(job, NULL, 0, "out of memory");
    else
        job_error_record(job, &err, st);
    corax_reader_close(lf.reader);
    return job_failed(st);
}

static corax_status load_logs(corax_job *job, const corax_check_job_options *o,
                              const corax_program *prog, logs *l)
{
    l->log = corax_qa_log_new();
    l->unknown_kind = corax_tally_new();
    l->unknown_confidence = corax_tally_new();
    corax_status rc = l->log && l->unknown_kind && l->unknown_confidence ? CORAX_OK : CORAX_ENOMEM;
    if (rc != CORAX_OK)
        job_error(job, NULL, 0, "out of memory");
    for (size_t f = 0; f < o->nlogs && rc == CORAX_OK; f++)
        rc = read_log(job, o, f, prog, l);
    return rc;
}

/* Readings whose betas run from an arbitrary line (their confidence, or
 * without one their run's, is the unoriented word) orient nothing: the
 * checks of fabric leave them out. */
static void mark_arbitrary_lines(const corax_check_job_options *o, const corax_runs *runs,
                                 logs *l)
{
    for (size_t i = 0; i < corax_qa_log_size(l->log); i++) {
        corax_qa_reading r;
        corax_qa_log_get(l->log, i, &r);
        const char *word = r.confidence;
        long k = word[0] ? -1 : corax_runs_find(runs, r.hole, strlen(r.hole), r.reading.depth);
        if (k >= 0)
            word = runs->run[k].confidence;
        corax_qa_log_set_arbitrary(
            l->log, i, corax_unoriented_confidence(word, strlen(word), o->unoriented_word));
    }
}

/* ---- output ---- */

static corax_status write_findings(corax_job *job, const char *output, const corax_findings *f)
{
    corax_status st;
    corax_writer *w = job_output(job, output, &st);
    if (!w)
        return st;
    static const char head[] = "hole,depth,depth_to,severity,check,message,file,line\n";
    corax_writer_text(w, head, sizeof head - 1);
    for (size_t i = 0; i < f->count; i++) {
        const corax_finding *x = &f->item[i];
        const char *sev = corax_severity_name(x->severity);
        corax_writer_field(w, x->hole, strlen(x->hole));
        corax_writer_number(w, x->depth, 2);
        corax_writer_number(w, x->depth_to, 2);
        corax_writer_field(w, sev, strlen(sev));
        corax_writer_field(w, x->check, strlen(x->check));
        corax_writer_field(w, x->message, strlen(x->message));
        corax_writer_field(w, x->file ? x->file : "", x->file ? strlen(x->file) : 0);
        if (x->line > 0)
            corax_writer_integer(w, x->line);
        else
            corax_writer_field(w, "", 0);
        corax_writer_end_row(w);
    }
    return job_commit(job, w);
}

static corax_status write_report(corax_job *job, const corax_check_job_options *o,
                                 const corax_program *prog, const corax_findings *found,
                                 const logs *l, const char *output)
{
    const char *inputs[64];
    size_t ninputs = 0;
    inputs[ninputs++] = o->collars;
    inputs[ninputs++] = o->surveys;
    for (size_t i = 0; i < o->nlogs && ninputs < 63; i++)
        inputs[ninputs++] = o->logs[i];
    if (o->runs)
        inputs[ninputs++] = o->runs;
    char when[64];
    if (o->when) {
        snprintf(when, sizeof when, "%s", o->when);
    } else {
        time_t now = time(NULL);
        struct tm tm;
        strftime(when, sizeof when, "%Y-%m-%d %H:%M UTC", gmtime_r(&now, &tm));
    }
    corax_report_input in = {o->title ? o->title : "Drill program", inputs, ninputs,
                             CORAX_VERSION, when, prog, found, l->log, &o->convert, output};
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_report_write(&in, job->outputs, o->report, &err);
    if (st != CORAX_OK) {
        job_error_record(job, &err, st);
        return job_failed(st);
    }
    return CORAX_OK;
}

/* ---- work split by hole ---- */

static int sharded(const corax_check_job_options *o) { return o->qa.shards > 1; }

/* The findings so far (the program's loading, the runs table's rows) of the
 * holes of the shard; one about no hole goes with the empty name's shard, so
 * that the shards together hold each once. */
static void keep_shard(const corax_check_job_options *o, corax_findings *found)
{
    size_t kept = 0;
    for (size_t i = 0; i < found->count; i++) {
        const corax_finding *f = &found->item[i];
        if (corax_shard_of(f->hole, strlen(f->hole), o->qa.shards) == o->qa.shard)
            found->item[kept++] = *f;
    }
    found->count = kept;
}

static void record(corax_record *a, const corax_check_job_options *o)
{
    const corax_qa_options *q = &o->qa;
    corax_record_section(a, "check");
    if (sharded(o))
        corax_record_set(a, "shard", "%u/%u (holes by corax_shard_of; each hole's own checks, "
                         "the program-wide ones left out)", q->shard, q->shards);
    for (size_t i = 0; i < o->nlogs; i++)
        corax_record_set(a, "structures", "%s", o->logs[i]);
    corax_record_set(a, "runs", "%s", o->runs ? o->runs : "inferred from the readings' depths");
    if (o->report)
        corax_record_set(a, "report", "%s", o->report);
    corax_record_set(a, "gap", "%g", q->gap);
    corax_record_set(a, "dogleg", "%g", corax_deg(q->dogleg));
    corax_record_set(a, "magnetic_azimuth", "%g", corax_deg(q->magnetic_azimuth));
    corax_record_set(a, "magnetic_dip", "%g", corax_deg(q->magnetic_dip));
    corax_record_set(a, "first_station", "%g", q->first_station);
    corax_record_set(a, "collar_mismatch", "%g", corax_deg(q->collar_mismatch));
    corax_record_set(a, "steep", "%g", corax_deg(q->steep));
    corax_record_set(a, "low_alpha", "%g", corax_deg(q->low_alpha));
    corax_record_set(a, "run_length", "%g", q->run_length);
    corax_record_set(a, "run_misfit", "%g", corax_deg(q->run_misfit));
    corax_record_set(a, "hole_turn", "%g", corax_deg(q->hole_turn));
    corax_record_set(a, "total_field", "%g (nT, measured against the magnetic model)",
                     q->total_field);
    corax_record_set(a, "field_dip", "%g (degrees, measured against the magnetic model)",
                     corax_deg(q->field_dip));
    corax_record_conventions(a, &o->convert);
    corax_record_codes(a, o->kind_codes, o->confidence_codes);
}


corax_check_job_options corax_check_job_options_default(void)
{
    corax_check_job_options o;
    memset(&o, 0, sizeof o);
    o.convert = corax_convert_options_default();
    o.qa = corax_qa_options_default();
    o.log = o.runs_table = corax_table_settings_default();
    o.place = CORAX_PLACE_MID;
    o.unoriented_word = "unoriented";
    o.title = "Drill program";
    return o;
}

void corax_check_job_summary_clear(corax_check_job_summary *sum)
{
    corax_tally_free(sum->unknown_kind);
    corax_tally_free(sum->unknown_confidence);
    memset(sum, 0, sizeof *sum);
}

/* The checks themselves: surveys, the measured field, readings and runs. */
static corax_status run_checks(corax_job *job, const corax_program *prog,
                               const corax_check_job_options *o, const logs *l,
                               const corax_runs *runs, corax_findings *found)
{
    static const corax_corrections none = {0};
    size_t n = corax_qa_log_size(l->log);
    job_phase(job, "checking %zu holes and %zu readings", corax_program_size(prog), n);
    corax_status st = corax_qa_surveys(prog, o->surveys, &o->qa, found);
    if (st == CORAX_OK)
        st = corax_qa_field(o->corrections ? o->corrections : &none, o->surveys, &o->qa, found);
    if (st == CORAX_OK && n)
        st = corax_qa_readings(prog, l->log, runs->run, runs->n, &o->convert, &o->qa, found);
    if (st == CORAX_OK)
        st = corax_findings_sort(found);
    if (st != CORAX_OK)
        job_error(job, NULL, 0, "%s", corax_strerror(st));
    return job_failed(st);
}

corax_status corax_check_job_run(corax_job *job, const corax_program *prog,
                                 const corax_check_job_options *o, corax_findings *found,
                                 const char *output, corax_check_job_summary *sum)
{
    logs l;
    memset(&l, 0, sizeof l);
    memset(sum, 0, sizeof *sum);
    corax_runs runs = {0};
    if (sharded(o) && (o->qa.shard < 1 || o->qa.shard > o->qa.shards)) {
        job_usage(job, "shard %u of %u: a shard is 1 to %u", o->qa.shard, o->qa.shards,
                  o->qa.shards);
        return CORAX_EARG;
    }
    if (sharded(o) && o->report) {
        job_usage(job, "--report cannot go with --shard: the report is of the whole program "
                       "(run check without --shard for it)");
        return CORAX_EARG;
    }
    corax_status rc = load_logs(job, o, prog, &l);
    if (rc == CORAX_OK && o->runs)
        rc = corax_runs_load(job, o->runs, &o->runs_table, o->confidence_codes,
                             l.unknown_confidence, o->nlogs, &runs, found);
    if (rc == CORAX_OK && corax_qa_log_sort(l.log) != CORAX_OK) {
        job_error(job, NULL, 0, "out of memory");
        rc = CORAX_ENOMEM;
    }
    if (rc == CORAX_OK && sharded(o)) {
        keep_shard(o, found);
        job_note(job, "shard %u of %u: each hole's own checks only; the program-wide checks (the "
                      "azimuth offset the holes share, the conventions, holes scattered or "
                      "turned against the rest) need every hole: run check without --shard for "
                      "them", o->qa.shard, o->qa.shards);
    }
    if (rc == CORAX_OK) {
        mark_arbitrary_lines(o, &runs, &l);
        corax_job_tally_warn(job, "kind code", "has no mapping", l.unknown_kind,
                             "these rows keep it as their kind");
        corax_job_tally_warn(job, "confidence code", "has no mapping", l.unknown_confidence,
                             "these rows keep it as their confidence");
        rc = run_checks(job, prog, o, &l, &runs, found);
    }
    if (rc == CORAX_OK)
        rc = write_findings(job, output, found);
    if (rc == CORAX_OK && o->report) {
        job_phase(job, "writing the report");
        rc = write_report(job, o, prog, found, &l, output);
    }
    if (rc == CORAX_OK) {
        record(job->record, o);
        sum->holes = corax_program_size(prog);
        sum->readings = corax_qa_log_size(l.log);
        sum->other_shards = l.other;
        sum->errors = corax_findings_count(found, CORAX_ERROR);
        sum->warnings = corax_findings_count(found, CORAX_WARNING) - sum->errors;
        sum->notes = found->count - sum->errors - sum->warnings;
        sum->unknown_kind = l.unknown_kind; /* the summary's now */
        sum->unknown_confidence = l.unknown_confidence;
        l.unknown_kind = l.unknown_confidence = NULL;
    }
    corax_runs_free(&runs);
    logs_free(&l);
    return rc;
}
