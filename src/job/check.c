/* job: the check job, the QA of a drill program: its surveys, its core logs
 * (held in memory for the checks) and its runs, every finding placed at its
 * hole and depth, in a table and an HTML report. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "corax/corax.h"
#include "corax/report.h"
#include "io/fields.h"
#include "job/job_int.h"

/* ---- the core logs, held in memory for the checks ---- */

typedef struct logs {
    corax_table **table;
    size_t ntables;
    corax_qa_reading *reading;
    size_t n, cap;
    char **phrase; /* the problems' words, owned */
    size_t nphrase;
    corax_tally *unknown_kind, *unknown_confidence; /* codes with no word */
} logs;

static void logs_free(logs *l)
{
    for (size_t i = 0; i < l->ntables; i++)
        corax_table_free(l->table[i]);
    for (size_t i = 0; i < l->nphrase; i++)
        free(l->phrase[i]);
    free(l->table);
    free(l->reading);
    free(l->phrase);
    corax_tally_free(l->unknown_kind);
    corax_tally_free(l->unknown_confidence);
}

static const char *keep_phrase(logs *l, const char *text)
{
    char **p = realloc(l->phrase, (l->nphrase + 1) * sizeof *p);
    char *copy = p ? strdup(text) : NULL;
    if (p)
        l->phrase = p;
    if (!copy)
        return "out of memory";
    l->phrase[l->nphrase++] = copy;
    return copy;
}

enum { L_HOLE, L_DEPTH, L_FROM, L_TO, L_ALPHA, L_BETA, L_GAMMA, L_LALPHA, L_LBETA, L_KIND, L_CONF,
       NL };
static const char *const log_names[NL] = {"hole",  "depth", "from", "to", "alpha", "beta",
                                          "gamma", "line_alpha", "line_beta", "kind",
                                          "confidence"};

/* One row to a reading; a phrase for the first value that cannot be read. */
static void read_row(const corax_table *t, size_t findex, size_t row, const long *col,
                     const corax_check_job_options *o, const corax_program *prog,
                     const char **field, logs *l, corax_qa_reading *r)
{
    corax_row cells;
    corax_table_row(t, row, field, &cells);
    r->hole = corax_table_cell(t, row, col[L_HOLE], NULL);
    r->path = corax_program_find(prog, r->hole, strlen(r->hole));
    r->file = o->logs[findex]; /* the caller's: findings and tallies outlive the table */
    r->line = corax_table_line(t, row);
    size_t kl, cl;
    const char *kind = corax_table_cell(t, row, col[L_KIND], &kl);
    const char *conf = corax_table_cell(t, row, col[L_CONF], &cl);
    r->kind = job_code_word(o->kind_codes, kind, kl, l->unknown_kind, r->file, findex, r->line);
    r->confidence = job_code_word(o->confidence_codes, conf, cl, l->unknown_confidence, r->file,
                                  findex, r->line);
    r->problem = NULL;
    r->reading = corax_reading_empty();
    char why[200];
    corax_table_info info;
    corax_table_read_info(t, &info);
    const char *ragged = corax_field_ragged(&cells, corax_table_columns(t), why, sizeof why);
    if (ragged)
        r->problem = keep_phrase(l, why);
    if (corax_field_depth(&cells, col + L_DEPTH, info.format.decimal, o->log.unit,
                          (int)o->place, &r->reading.depth, why, sizeof why) != CORAX_NUMBER_OK &&
        !r->problem)
        r->problem = keep_phrase(l, why);
    double *slot[] = {&r->reading.alpha, &r->reading.beta, &r->reading.gamma,
                      &r->reading.line_alpha, &r->reading.line_beta};
    for (int k = L_ALPHA; k <= L_LBETA; k++) {
        double v;
        corax_number_status st = corax_field_number(&cells, col[k], info.format.decimal,
                                                    log_names[k], &v, why, sizeof why);
        if (st == CORAX_NUMBER_OK)
            *slot[k - L_ALPHA] = corax_rad(v);
        else if (st != CORAX_NUMBER_EMPTY && col[k] >= 0 && !r->problem)
            r->problem = keep_phrase(l, why);
    }
}

static corax_status load_logs(corax_job *job, const corax_check_job_options *o,
                              const corax_program *prog, logs *l)
{
    const char **field = NULL;
    l->unknown_kind = corax_tally_new();
    l->unknown_confidence = corax_tally_new();
    corax_status rc = l->unknown_kind && l->unknown_confidence ? CORAX_OK : CORAX_ENOMEM;
    for (size_t f = 0; f < o->nlogs && rc == CORAX_OK; f++) {
        corax_table *t = job_table_keep(job, CORAX_ROLE_STRUCTURES, o->logs[f], &o->log,
                                        &l->table, &l->ntables);
        if (!t) {
            rc = CORAX_EFORMAT;
            break;
        }
        long col[NL];
        if ((rc = job_table_columns(job, t, &o->log, log_names, NL, col)) != CORAX_OK)
            break;
        const char *missing = col[L_HOLE] < 0 ? "hole"
                              : col[L_DEPTH] < 0 && (col[L_FROM] < 0 || col[L_TO] < 0)
                                  ? "depth (or from and to)"
                                  : NULL;
        if (!missing && col[L_ALPHA] < 0 && col[L_LALPHA] < 0)
            missing = "alpha";
        if (missing) {
            job_error(job, o->logs[f], 1, "no '%s' column in the header", missing);
            rc = CORAX_EFORMAT;
            break;
        }
        size_t rows = corax_table_rows(t);
        const char **fp = realloc(field, (corax_table_widest(t) + 1) * sizeof *fp);
        if (fp)
            field = fp;
        if (l->n + rows > l->cap) {
            size_t cap = l->cap ? l->cap : 1024;
            while (cap < l->n + rows)
                cap *= 2;
            corax_qa_reading *p = realloc(l->reading, cap * sizeof *p);
            if (p) {
                l->reading = p;
                l->cap = cap;
            }
        }
        if (!fp || l->n + rows > l->cap) {
            rc = CORAX_ENOMEM;
            break;
        }
        for (size_t r = 0; r < rows; r++)
            read_row(t, f, r, col, o, prog, field, l, &l->reading[l->n++]);
    }
    free(field);
    return job_failed(rc);
}

/* Readings whose betas run from an arbitrary line (their confidence, or
 * without one their run's, is the unoriented word) orient nothing: the
 * checks of fabric leave them out. */
static void mark_arbitrary_lines(const corax_check_job_options *o, const corax_runs *runs,
                                 logs *l)
{
    for (size_t i = 0; i < l->n; i++) {
        corax_qa_reading *r = &l->reading[i];
        const char *word = r->confidence;
        long k = word[0] ? -1 : corax_runs_find(runs, r->hole, strlen(r->hole), r->reading.depth);
        if (k >= 0)
            word = runs->run[k].confidence;
        r->reading.arbitrary_line =
            corax_unoriented_confidence(word, strlen(word), o->unoriented_word);
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
                             CORAX_VERSION, when, prog, found, l->reading, l->n, &o->convert, output};
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_report_write(&in, job->outputs, o->report, &err);
    if (st != CORAX_OK) {
        job_error_record(job, &err, st);
        return job_failed(st);
    }
    return CORAX_OK;
}

static void record(corax_record *a, const corax_check_job_options *o)
{
    const corax_qa_options *q = &o->qa;
    corax_record_section(a, "check");
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
    job_phase(job, "checking %zu holes and %zu readings", corax_program_size(prog), l->n);
    corax_status st = corax_qa_surveys(prog, o->surveys, &o->qa, found);
    if (st == CORAX_OK)
        st = corax_qa_field(o->corrections ? o->corrections : &none, o->surveys, &o->qa, found);
    if (st == CORAX_OK && l->n)
        st = corax_qa_readings(prog, l->reading, l->n, runs->run, runs->n, &o->convert, &o->qa,
                               found);
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
    corax_status rc = load_logs(job, o, prog, &l);
    if (rc == CORAX_OK && o->runs)
        rc = corax_runs_load(job, o->runs, &o->runs_table, o->confidence_codes,
                             l.unknown_confidence, o->nlogs, &runs, found);
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
        sum->readings = l.n;
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
