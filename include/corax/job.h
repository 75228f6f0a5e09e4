/* corax: whole-table jobs and what they share.
 *
 * A job (convert, check, section, export, solve, plan, trace: job_*.h) takes
 * an opened drill program, its options, the paths of its input tables and
 * output files, and a corax_job: the context every job reports through. It
 * returns a status and fills a summary of its own. A job never prints: what
 * the command line shows on standard error comes back as messages (errors,
 * warnings, notes), the progress of a long step through a callback, the
 * tables read and the record of what the job assumed as data. Its output
 * files are held in the caller's corax_outputs set (when given), so that the
 * caller makes them public together, or drops them all.
 *
 * A job returns CORAX_OK, CORAX_EARG when it was asked for something it
 * cannot do as asked (its message says what; `usage` is set on it when the
 * fault is in how the options go together), or another status when its data
 * or files fail it (its messages say why). */
#ifndef CORAX_JOB_H
#define CORAX_JOB_H

#include <stddef.h>

#include "corax/codes.h"
#include "corax/finding.h"
#include "corax/load.h"
#include "corax/output.h"
#include "corax/qa.h"
#include "corax/shard.h"
#include "corax/table.h"
#include "corax/uncertainty.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- messages ---- */

/* What a job has to say: the command line prints an error as `corax:
 * FILE:LINE: text`, a warning as `corax: FILE:LINE: warning: text`, a note
 * as `corax: note: FILE: text` (the place left out when there is none), and
 * a finding told as a message (check not empty) as its place and its text,
 * with "warning: " before a warning's. Quiet runs leave out notes and
 * warnings. */
typedef struct corax_message {
    corax_severity severity; /* CORAX_ERROR, CORAX_WARNING or CORAX_NOTE */
    char check[32];          /* the check of a finding told as a message, else "" */
    char *file;              /* NULL when not tied to a file */
    long line;               /* 1-based, 0 when not tied to a line */
    char *text;
    int usage;               /* the job was asked for something it cannot do as
                                asked: the fault is in its options */
} corax_message;

/* ---- progress ---- */

typedef enum corax_stage_state {
    CORAX_STAGE_BEGIN, /* a long step begins: what, unit and total are set */
    CORAX_STAGE_STEP,  /* done has moved on */
    CORAX_STAGE_END,   /* the step is over */
    CORAX_STAGE_PHASE  /* a step of the job begins; what says which in a few words */
} corax_stage_state;

/* A long step of a job (a table read, the draws of the uncertainty). Several
 * may be under way at once (every converted table of an export is opened
 * before any is read), each its own corax_stage. */
typedef struct corax_stage {
    corax_stage_state state;
    const char *what;  /* a file's name, "uncertainty"; for a phase, its words */
    const char *unit;  /* "bytes", "readings" */
    double total;      /* 0 when not known */
    double done;
    void *display;     /* the progress callback's own: NULL at CORAX_STAGE_BEGIN,
                          kept as it leaves it until CORAX_STAGE_END */
} corax_stage;

/* ---- the tables read ---- */

/* The part a table plays, for the record of what was read. */
typedef enum corax_table_role {
    CORAX_ROLE_COLLARS,
    CORAX_ROLE_SURVEYS,
    CORAX_ROLE_STRUCTURES, /* core logs, readings */
    CORAX_ROLE_RUNS,       /* orientation runs */
    CORAX_ROLE_CONVERTED,  /* corax's converted tables, read back */
    CORAX_ROLE_DEPTHS,     /* any other table of holes and depths */
    CORAX_ROLE_COUNT
} corax_table_role;

/* "collars", "surveys", "structures", "runs", "converted", "depths". */
const char *corax_table_role_name(corax_table_role role);

/* A table a job read: its path, its part, what reading it found, and the
 * unit of its lengths (metres per unit). */
typedef struct corax_table_read {
    char *path;
    corax_table_role role;
    corax_table_info info;
    double unit;
} corax_table_read;

/* ---- the record of a run ---- */

/* What a run assumed, as INI text: [section] headings and key = value
 * lines, in the order written. Every function takes NULL for a record and
 * then does nothing. */
typedef struct corax_record corax_record;

/* An empty record; NULL when out of memory. */
corax_record *corax_record_new(void);
void corax_record_free(corax_record *record);

/* A line of its own (a comment, say), "\n" added. */
void corax_record_line(corax_record *record, const char *text);
void corax_record_section(corax_record *record, const char *name);
void corax_record_set(corax_record *record, const char *key, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 3, 4)))
#endif
    ;

/* Append another record's text. */
void corax_record_append(corax_record *record, const corax_record *from);

/* The text so far ("" for NULL); *length (may be NULL) gets its length. */
const char *corax_record_text(const corax_record *record, size_t *length);

/* The core conventions and thresholds; the code words of a log. */
void corax_record_conventions(corax_record *record, const corax_convert_options *options);
void corax_record_codes(corax_record *record, const corax_codes *kind_codes,
                        const corax_codes *confidence_codes);

/* The errors of a Monte Carlo, its draws and seed (the core line's errors
 * when core_line). */
void corax_record_uncertainty(corax_record *record, const corax_error_model *errors,
                              size_t draws, uint64_t seed, int core_line);

/* ---- the context ---- */

typedef struct corax_job {
    /* Set by the caller; corax_job_init() leaves them empty. */
    corax_outputs *outputs;   /* holds the job's output files until the caller
                                 publishes them; NULL: each goes into place
                                 when it is done */
    void (*on_message)(void *user, const corax_message *message); /* each message
                                 as it comes; NULL: they are kept in `message` */
    void (*on_stage)(void *user, corax_stage *stage); /* progress; may be NULL */
    void *user;               /* for the callbacks */
    corax_record *record;     /* gets the job's part of the record; may be NULL */
    /* Filled by the jobs run with it (corax_job_clear() frees them). */
    corax_message *message;   /* the messages, when there is no on_message */
    size_t nmessages, message_cap;
    size_t errors;            /* error messages given, kept or not */
    corax_table_read *read;   /* every table read, once each */
    size_t nread, read_cap;
} corax_job;

void corax_job_init(corax_job *job);

/* Free the messages and the tables read (the caller's pieces are left). */
void corax_job_clear(corax_job *job);

/* ---- pieces for jobs and their callers ---- */

/* Load a drill program (see corax_program_load()), noting the two tables as
 * read: its errors (the first 50) are error messages and the program is
 * refused (CORAX_EFORMAT, *out NULL) when there are any; else its warnings
 * and notes are messages and *out the program. */
corax_status corax_job_program_load(corax_job *job, const char *collars, const char *surveys,
                                    const corax_load_options *options, corax_program **out);

/* The same keeping every finding in *found, messages for none (for the QA,
 * whose findings they are). A table that cannot be read is an error
 * message, and its status is returned. */
corax_status corax_job_program_findings(corax_job *job, const char *collars,
                                        const char *surveys, const corax_load_options *options,
                                        corax_program **out, corax_findings *found);

/* Say every value of a tally as one warning each: "WHAT 'VALUE' (N rows,
 * first FILE:LINE) PROBLEM: CONSEQUENCE". */
void corax_job_tally_warn(corax_job *job, const char *what, const char *problem,
                          const corax_tally *tally, const char *consequence);

/* Where a reading of a from/to log sits in its interval. */
typedef enum corax_reading_place {
    CORAX_PLACE_MID,
    CORAX_PLACE_FROM,
    CORAX_PLACE_TO
} corax_reading_place;

/* Orientation runs from a runs table (hole, from, to, optional confidence),
 * sorted by hole and depth. */
typedef struct corax_runs {
    corax_table *table;
    corax_qa_run *run;
    size_t n;
} corax_runs;

/* Read a runs table (noted as read): its confidence words through the codes
 * (may be NULL), an unknown code counted in `unknown` (may be NULL) with the
 * table as file number file_index; its rows that cannot be used become
 * findings in *found (and are left out). An error message and its status
 * when the table cannot be read or lacks a column. */
corax_status corax_runs_load(corax_job *job, const char *path,
                             const corax_table_settings *settings, const corax_codes *codes,
                             corax_tally *unknown, size_t file_index, corax_runs *runs,
                             corax_findings *found);
void corax_runs_free(corax_runs *runs);

/* The run of a hole (name of len bytes) holding a depth (from <= depth <
 * to), or -1. */
long corax_runs_find(const corax_runs *runs, const char *hole, size_t len, double depth);

/* Whether a confidence word (len bytes) says the core has no orientation
 * mark: it is `word`, without regard to case or surrounding blanks. */
int corax_unoriented_confidence(const char *text, size_t len, const char *word);

/* Work split by hole across machines: corax_shard_of() (shard.h). */

#ifdef __cplusplus
}
#endif
#endif
