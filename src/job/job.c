/* job: the context of the whole-table jobs. What a job has to say becomes a
 * message (handed to the caller's callback, or kept), its long steps stages
 * for a progress display, and the tables it reads a list for the record. */
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "common/format.h"
#include "common/grow.h"
#include "job/job_int.h"

void corax_job_init(corax_job *job) { memset(job, 0, sizeof *job); }

static void message_free(corax_message *m)
{
    free(m->file);
    free(m->text);
}

void corax_job_clear(corax_job *job)
{
    for (size_t i = 0; i < job->nmessages; i++)
        message_free(&job->message[i]);
    free(job->message);
    for (size_t i = 0; i < job->nread; i++)
        free(job->read[i].path);
    free(job->read);
    job->message = NULL;
    job->read = NULL;
    job->nmessages = job->message_cap = job->nread = job->read_cap = job->errors = 0;
}

/* ---- messages ---- */

static void say(corax_job *job, corax_severity severity, const char *check, const char *file,
                long line, int usage, const char *fmt, va_list ap)
{
    char small[512], *heap = NULL;
    size_t len;
    const char *text = corax_vformat(small, sizeof small, &heap, &len, fmt, ap);
    corax_message m = {severity, "", NULL, line, NULL, usage};
    if (check)
        snprintf(m.check, sizeof m.check, "%s", check);
    if (severity == CORAX_ERROR)
        job->errors++;
    if (job->on_message) { /* borrowed for the call */
        m.file = (char *)file;
        m.text = (char *)(text ? text : "out of memory");
        job->on_message(job->user, &m);
        free(heap);
        return;
    }
    m.file = file ? strdup(file) : NULL;
    m.text = heap ? heap : strdup(text ? text : "out of memory");
    corax_message *grown = corax_grow(job->message, job->nmessages, &job->message_cap,
                                      sizeof *grown, 16);
    if (!grown || !m.text || (file && !m.file)) { /* nowhere to keep it */
        message_free(&m);
        return;
    }
    job->message = grown;
    job->message[job->nmessages++] = m;
}

void job_error(corax_job *job, const char *file, long line, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    say(job, CORAX_ERROR, NULL, file, line, 0, fmt, ap);
    va_end(ap);
}

void job_warning(corax_job *job, const char *file, long line, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    say(job, CORAX_WARNING, NULL, file, line, 0, fmt, ap);
    va_end(ap);
}

void job_note(corax_job *job, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    say(job, CORAX_NOTE, NULL, NULL, 0, 0, fmt, ap);
    va_end(ap);
}

void job_usage(corax_job *job, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    say(job, CORAX_ERROR, NULL, NULL, 0, 1, fmt, ap);
    va_end(ap);
}

/* A message of its own words. */
static void say_text(corax_job *job, corax_severity severity, const char *check,
                     const char *file, long line, const char *fmt, ...) JOB_PRINTF(6, 7);

static void say_text(corax_job *job, corax_severity severity, const char *check,
                     const char *file, long line, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    say(job, severity, check, file, line, 0, fmt, ap);
    va_end(ap);
}

void job_error_record(corax_job *job, const corax_error *err, corax_status st)
{
    say_text(job, CORAX_ERROR, NULL, err->file[0] ? err->file : NULL, err->line,
             "%s", err->message[0] ? err->message : corax_strerror(st));
}

void job_finding(corax_job *job, const corax_finding *f)
{
    say_text(job, f->severity, f->check[0] ? f->check : "finding", f->file, f->line, "%s",
             f->message);
}

void job_problem(corax_job *job, job_problems *p, const char *file, long line, const char *fmt,
                 ...)
{
    if (p->n++ >= JOB_SHOWN)
        return;
    char text[600];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(text, sizeof text, fmt, ap);
    va_end(ap);
    job_error(job, file, line, "%s", text);
}

corax_status job_problems_end(corax_job *job, const job_problems *p, const char *what)
{
    if (!p->n)
        return CORAX_OK;
    if (p->n > JOB_SHOWN)
        job_error(job, NULL, 0, "... and %zu more not shown; fix these first", p->n - JOB_SHOWN);
    job_error(job, NULL, 0, "%zu problem%s in %s; nothing written", p->n, p->n == 1 ? "" : "s",
              what);
    return CORAX_EVALUE;
}

void corax_job_tally_warn(corax_job *job, const char *what, const char *problem,
                          const corax_tally *tally, const char *consequence)
{
    size_t count;
    const char *file, *value;
    long line;
    for (size_t i = 0; (value = corax_tally_at(tally, i, &count, &file, &line)); i++)
        job_warning(job, NULL, 0, "%s '%s' (%zu row%s, first %s:%ld) %s: %s", what, value,
                    count, count == 1 ? "" : "s", file, line, problem, consequence);
}

corax_status job_failed(corax_status st) { return st == CORAX_EARG ? CORAX_EVALUE : st; }

corax_status job_status(int outcome)
{
    return outcome == JOB_OK ? CORAX_OK : outcome == JOB_USAGE ? CORAX_EARG : CORAX_EFORMAT;
}

/* ---- outputs ---- */

corax_writer *job_output(corax_job *job, const char *path, corax_status *status)
{
    corax_writer *w;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open_in(job->outputs, path, &w, &err);
    if (status)
        *status = job_failed(st);
    if (st == CORAX_OK)
        return w;
    job_error_record(job, &err, st);
    return NULL;
}

corax_status job_commit(corax_job *job, corax_writer *w)
{
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_commit(w, &err);
    if (st != CORAX_OK)
        job_error_record(job, &err, st);
    return job_failed(st);
}

/* ---- progress ---- */

void job_stage_begin(corax_job *job, corax_stage *s, const char *what, const char *unit,
                     double total)
{
    *s = (corax_stage){CORAX_STAGE_BEGIN, what, unit, total, 0.0, NULL};
    if (job->on_stage)
        job->on_stage(job->user, s);
}

void job_stage_step(corax_job *job, corax_stage *s, double done)
{
    s->state = CORAX_STAGE_STEP;
    s->done = done;
    if (job->on_stage)
        job->on_stage(job->user, s);
}

void job_stage_end(corax_job *job, corax_stage *s)
{
    s->state = CORAX_STAGE_END;
    if (job->on_stage)
        job->on_stage(job->user, s);
}

void job_phase(corax_job *job, const char *fmt, ...)
{
    if (!job->on_stage)
        return;
    char text[400];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(text, sizeof text, fmt, ap);
    va_end(ap);
    corax_stage s = {CORAX_STAGE_PHASE, text, "", 0.0, 0.0, NULL};
    job->on_stage(job->user, &s);
}

double job_file_size(const char *path)
{
    struct stat st;
    if (strcmp(path, "-") == 0 || stat(path, &st) != 0 || !S_ISREG(st.st_mode))
        return 0.0;
    return (double)st.st_size;
}

/* ---- tables ---- */

static const char *const role_names[CORAX_ROLE_COUNT] = {"collars",   "surveys",   "structures",
                                                         "runs",      "converted", "depths"};

const char *corax_table_role_name(corax_table_role role)
{
    return (unsigned)role < CORAX_ROLE_COUNT ? role_names[role] : "table";
}

void job_table_read(corax_job *job, corax_table_role role, const char *path, double unit,
                    const corax_table_info *info)
{
    for (size_t i = 0; i < job->nread; i++) /* read again (an export's second pass) */
        if (job->read[i].role == role && strcmp(job->read[i].path, path) == 0)
            return;
    corax_table_read *r = corax_grow(job->read, job->nread, &job->read_cap, sizeof *r, 8);
    char *copy = r ? strdup(path) : NULL;
    if (r)
        job->read = r;
    if (copy)
        job->read[job->nread++] = (corax_table_read){copy, role, *info, unit};
    if (!info->comments && !info->blank_rows)
        return;
    char what[200] = "";
    if (info->comments)
        snprintf(what, sizeof what, "%zu comment line%s", info->comments,
                 info->comments == 1 ? "" : "s");
    if (info->blank_rows)
        snprintf(what + strlen(what), sizeof what - strlen(what), "%s%zu blank row%s",
                 info->comments ? " and " : "", info->blank_rows,
                 info->blank_rows == 1 ? "" : "s");
    say_text(job, CORAX_NOTE, NULL, path, 0, "%s skipped", what);
}

/* A corax_progress_fn for a stage. */
typedef struct stage_ctx {
    corax_job *job;
    corax_stage *stage;
} stage_ctx;

static void on_progress(void *user, double done)
{
    stage_ctx *c = user;
    job_stage_step(c->job, c->stage, done);
}

corax_status job_table_progress(corax_job *job, const char *path, corax_table_format format,
                                corax_table **out, corax_error *err)
{
    corax_stage stage;
    job_stage_begin(job, &stage, path, "bytes", job_file_size(path));
    stage_ctx ctx = {job, &stage};
    corax_status st = corax_table_load_progress(path, format, on_progress, &ctx, out, err);
    job_stage_end(job, &stage);
    return st;
}

corax_status job_table_load(corax_job *job, corax_table_role role, const char *path,
                            const corax_table_settings *settings, corax_table **out)
{
    corax_error err;
    corax_error_clear(&err);
    corax_status st = job_table_progress(job, path, settings->format, out, &err);
    if (st != CORAX_OK) {
        job_error_record(job, &err, st);
        return st;
    }
    corax_table_info info;
    corax_table_read_info(*out, &info);
    job_table_read(job, role, path, settings->unit, &info);
    return CORAX_OK;
}

corax_table *job_table_keep(corax_job *job, corax_table_role role, const char *path,
                            const corax_table_settings *settings, corax_table ***tables,
                            size_t *n)
{
    corax_table *t;
    if (job_table_load(job, role, path, settings, &t) != CORAX_OK)
        return NULL;
    corax_table **tt = realloc(*tables, (*n + 1) * sizeof *tt);
    if (!tt) {
        corax_table_free(t);
        job_error(job, NULL, 0, "out of memory");
        return NULL;
    }
    *tables = tt;
    tt[(*n)++] = t;
    return t;
}

corax_status job_table_columns(corax_job *job, const corax_table *t,
                               const corax_table_settings *settings, const char *const *names,
                               size_t n, long *col)
{
    for (size_t k = 0; k < n; k++) {
        col[k] = corax_table_column(t, names[k], settings->columns);
        if (col[k] == CORAX_COLUMN_MAPPED_MISSING) {
            job_error(job, corax_table_path(t), 1, "no '%s' column in the header, which the "
                      "column names give for %s", corax_column_mapped(settings->columns, names[k]),
                      names[k]);
            return CORAX_EFORMAT;
        }
    }
    return CORAX_OK;
}

const char *job_code_word(const corax_codes *codes, const char *text, size_t len,
                          corax_tally *unknown, const char *file, size_t file_index, long line)
{
    size_t wl;
    if (!codes || !len)
        return text;
    const char *w = corax_codes_word(codes, text, len, &wl);
    if (w)
        return w;
    if (unknown)
        corax_tally_add(unknown, text, len, file, file_index, line);
    return text;
}

/* ---- the drill program ---- */

corax_status corax_job_program_findings(corax_job *job, const char *collars,
                                        const char *surveys, const corax_load_options *options,
                                        corax_program **out, corax_findings *found)
{
    corax_load_info info;
    corax_error err;
    corax_error_clear(&err);
    *out = NULL;
    corax_status st = corax_program_load(collars, surveys, options, out, found, &info, &err);
    if (st != CORAX_OK) {
        job_error_record(job, &err, st);
        return job_failed(st);
    }
    job_table_read(job, CORAX_ROLE_COLLARS, collars, options->collars.unit, &info.collars);
    job_table_read(job, CORAX_ROLE_SURVEYS, surveys, options->surveys.unit, &info.surveys);
    return CORAX_OK;
}

corax_status corax_job_program_load(corax_job *job, const char *collars, const char *surveys,
                                    const corax_load_options *options, corax_program **out)
{
    corax_findings problems = {0};
    corax_status st = corax_job_program_findings(job, collars, surveys, options, out, &problems);
    if (st != CORAX_OK) {
        corax_findings_clear(&problems);
        return st;
    }
    size_t errors = corax_findings_count(&problems, CORAX_ERROR);
    job_problems shown = {0};
    for (size_t i = 0; i < problems.count; i++) {
        const corax_finding *f = &problems.item[i];
        if (f->severity == CORAX_ERROR)
            job_problem(job, &shown, f->file, f->line, "%s", f->message);
        else if (!errors)
            job_finding(job, f);
    }
    corax_findings_clear(&problems);
    st = job_problems_end(job, &shown, "the collar and survey tables");
    if (st != CORAX_OK) {
        corax_program_free(*out);
        *out = NULL;
    }
    return st;
}
