/* corax: the check job, the QA of a drill program. The surveys, the core
 * logs and the runs are checked (qa.h), and every finding placed at its hole
 * and depth goes to a table (hole, depth, depth_to, severity, check,
 * message, file, line; sorted by hole and depth) and, when asked, to an HTML
 * report. Bad data becomes findings and the rest is still checked.
 *
 * The logs are read row by row into a compact log (corax_qa_log, a few
 * dozen bytes a reading), which the checks and the report go over hole by
 * hole. Work split by hole (qa.shard, qa.shards: corax_shard_of()) checks
 * only the holes of one shard, each on its own: the findings of the N
 * shards together hold each of the single run's findings about a hole
 * once, and the program-wide checks are left out. */
#ifndef CORAX_JOB_CHECK_H
#define CORAX_JOB_CHECK_H

#include <stddef.h>

#include "corax/codes.h"
#include "corax/convert.h"
#include "corax/job.h"
#include "corax/qa.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_check_job_options {
    const char *collars, *surveys;     /* the program's tables, for the findings'
                                          lines and the report */
    const corax_corrections *corrections; /* each station's corrections as loaded
                                          (may be NULL: none to test) */
    corax_convert_options convert;
    corax_qa_options qa;
    const char *const *logs;           /* core logs (may be none) */
    size_t nlogs;
    corax_table_settings log;          /* how they are read */
    corax_reading_place place;         /* where an interval puts its reading */
    const corax_codes *kind_codes, *confidence_codes; /* NULL: values are words */
    const char *runs;                  /* a runs table, or NULL: runs inferred */
    corax_table_settings runs_table;   /* how it is read */
    const char *unoriented_word;       /* the confidence of runs without a mark */
    const char *report;                /* the HTML report, or NULL */
    const char *title;                 /* its title */
    const char *when;                  /* its time as text; NULL: now */
} corax_check_job_options;

/* The QA defaults, conventions and table settings; "Drill program"; runs
 * without a mark "unoriented". */
corax_check_job_options corax_check_job_options_default(void);

typedef struct corax_check_job_summary {
    size_t holes, readings;
    size_t other_shards;            /* readings left to the other shards */
    size_t errors, warnings, notes; /* findings by severity */
    /* kind and confidence codes without a word, each with its count and first
     * place (they are warnings too) */
    corax_tally *unknown_kind, *unknown_confidence;
} corax_check_job_summary;

void corax_check_job_summary_clear(corax_check_job_summary *summary);

/* Check a program (loaded with corax_job_program_findings(), its loading's
 * findings in *found) and its logs: every finding is appended to *found,
 * which is sorted, and written to output (the report too, when asked). The
 * job's record gets a [check] section. An error message and a status only
 * when a table cannot be read or lacks a required column, or an output
 * cannot be written; CORAX_EARG (a usage message) for a report asked of a
 * shard. Under shards the findings already in *found (the program's
 * loading) are kept for the holes of the shard (one about no hole goes
 * with the shard of the empty name), and a note says what is left out. */
corax_status corax_check_job_run(corax_job *job, const corax_program *program,
                                 const corax_check_job_options *options, corax_findings *found,
                                 const char *output, corax_check_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
