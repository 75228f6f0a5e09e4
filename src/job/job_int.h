/* Internal to src/job: how the jobs report (messages, progress, the tables
 * they read) and the pieces several of them share. */
#ifndef CORAX_JOB_INT_H
#define CORAX_JOB_INT_H

#include <stddef.h>

#include "corax/job.h"

#if defined(__GNUC__)
#define JOB_PRINTF(a, b) __attribute__((format(printf, a, b)))
#else
#define JOB_PRINTF(a, b)
#endif

/* Messages (see corax_message). file may be NULL; line 0 when none. */
void job_error(corax_job *job, const char *file, long line, const char *fmt, ...) JOB_PRINTF(4, 5);
void job_warning(corax_job *job, const char *file, long line, const char *fmt, ...)
    JOB_PRINTF(4, 5);
void job_note(corax_job *job, const char *fmt, ...) JOB_PRINTF(2, 3);

/* A fault in what the job was asked to do (an error with `usage` set). */
void job_usage(corax_job *job, const char *fmt, ...) JOB_PRINTF(2, 3);

/* An error record as an error message: its file and line, its message or
 * else the status's words. */
void job_error_record(corax_job *job, const corax_error *err, corax_status st);

/* A finding told as a message. */
void job_finding(corax_job *job, const corax_finding *f);

/* Faults in a table's rows: the first JOB_SHOWN are error messages, the rest
 * counted. Every job that reads a table refuses it when it has any. */
enum { JOB_SHOWN = 50 };
typedef struct job_problems {
    size_t n;
} job_problems;

void job_problem(corax_job *job, job_problems *p, const char *file, long line, const char *fmt,
                 ...) JOB_PRINTF(5, 6);

/* After the last row: CORAX_OK when there were none; else how many were not
 * shown, and "N problems in WHAT; nothing written", and CORAX_EVALUE. */
corax_status job_problems_end(corax_job *job, const job_problems *p, const char *what);

/* An output held in the job's set (see corax_writer_open_in()): the writer,
 * or NULL with the error said and *st (may be NULL) its status. */
corax_writer *job_output(corax_job *job, const char *path, corax_status *st);

/* Commit an output: CORAX_OK, or the error said and its status. */
corax_status job_commit(corax_job *job, corax_writer *w);

/* Progress of a long step (see corax_stage). */
void job_stage_begin(corax_job *job, corax_stage *s, const char *what, const char *unit,
                     double total);
void job_stage_step(corax_job *job, corax_stage *s, double done);
void job_stage_end(corax_job *job, corax_stage *s);

/* A step of the job begins: "checking 12 holes", "writing the report". */
void job_phase(corax_job *job, const char *fmt, ...) JOB_PRINTF(2, 3);

/* The size of a regular file in bytes, 0 for standard input or others. */
double job_file_size(const char *path);

/* Note a table as read (once per role and path): its comment lines and
 * blank rows are a note. unit: metres per unit of its lengths. */
void job_table_read(corax_job *job, corax_table_role role, const char *path, double unit,
                    const corax_table_info *info);

/* corax_table_load() with its progress shown: no message, not noted. */
corax_status job_table_progress(corax_job *job, const char *path, corax_table_format format,
                                corax_table **out, corax_error *err);

/* Load a whole table with its progress shown, and note it as read; an error
 * message and the status when it cannot be read. */
corax_status job_table_load(corax_job *job, corax_table_role role, const char *path,
                            const corax_table_settings *settings, corax_table **out);

/* job_table_load(), the table kept in *tables (*n of them); NULL, the
 * message given, when it cannot be read or kept. */
corax_table *job_table_keep(corax_job *job, corax_table_role role, const char *path,
                            const corax_table_settings *settings, corax_table ***tables,
                            size_t *n);

/* The columns of logical names in a whole table, by its header names: OK,
 * or CORAX_EFORMAT with "no 'X' column in the header, which the column
 * names give for Y" said for a mapped name the table lacks. */
corax_status job_table_columns(corax_job *job, const corax_table *t,
                               const corax_table_settings *settings, const char *const *names,
                               size_t n, long *col);

/* A kind or confidence value as its word: through the codes when there are
 * any (an unknown code is counted in `unknown`, may be NULL, and kept as
 * written). */
const char *job_code_word(const corax_codes *codes, const char *text, size_t len,
                          corax_tally *unknown, const char *file, size_t file_index, long line);

/* How a step of a job ended where a status would say no more: done, failed
 * (its messages said why), or asked for what cannot be done as asked (a
 * usage message said why); job_status() makes it the job's status. */
enum { JOB_OK = 0, JOB_FAILED = 1, JOB_USAGE = 2 };
corax_status job_status(int outcome);

/* The status a failed step gives its job: its own, but never CORAX_EARG,
 * which a job keeps for what it was asked to do. */
corax_status job_failed(corax_status st);

#endif
