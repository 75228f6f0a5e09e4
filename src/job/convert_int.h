/* The row engine of the convert job (internal to src/job): convert_rows.c
 * reads, converts and writes a row; convert_orient.c turns the runs without
 * a mark; convert_memory.c holds every log for the draws and the turns;
 * convert.c streams the logs in batches and is the job. */
#ifndef CORAX_JOB_CONVERT_INT_H
#define CORAX_JOB_CONVERT_INT_H

#include "corax/job_convert.h"
#include "corax/solve.h"
#include "job/job_int.h"

typedef corax_convert_job_options convert_setup;
typedef corax_convert_reference convert_reference;

/* Logical columns of a core log (depth, from and to in this order). */
enum {
    COL_HOLE, COL_DEPTH, COL_FROM, COL_TO, COL_ALPHA, COL_BETA, COL_GAMMA, COL_LALPHA,
    COL_LBETA, COL_ALPHA_ERROR, COL_BETA_ERROR, COL_LINE_ERROR, COL_DEPTH_ERROR,
    COL_CONFIDENCE, COL_KIND, NCOLS
};

/* The log's columns corax writes again in its own words, when a reader of the
 * converted table would not find them as they are (other header names, other
 * units, an interval for a depth, code words). */
enum { OWN_HOLE, OWN_DEPTH, OWN_KIND, OWN_CONFIDENCE, NOWN };

typedef struct convert_group convert_group;
typedef struct convert_draws convert_draws;

/* What every row of a run shares; read-only while rows are converted. */
typedef struct convert_run {
    corax_job *job;
    const corax_program *prog;
    const convert_setup *s;
    corax_writer *w; /* the output */
    int has_lines;
    int own[NOWN];   /* which of the log's columns corax writes again */
    size_t width;
    long col[NCOLS];
    char **first;    /* the first log's header names: later logs must match */
    size_t nfirst;
    const convert_group *groups; /* the runs oriented by reference, or NULL */
    size_t other;    /* rows left to the other shards */
    FILE *stdin_copy; /* standard input kept for a second reading, or NULL */
    const convert_draws *draws; /* every reading's spread, drawn before the rows
                                   are written (convert_draws.c), or NULL */
    size_t seen;     /* rows of the shard read so far, over every log */
} convert_run;

/* Start fetching the hole of a batch's row toward the cache; the hole, or
 * NULL. */
const corax_hole *convert_prefetch(const convert_run *r, const corax_table *batch, size_t row);

/* Whether a row's hole is in the run's shard (always, without shards). */
int convert_row_in_shard(const convert_run *r, const corax_row *row);

/* One thread's state: where its rows go and what it has seen. */
typedef struct convert_lane {
    corax_writer *w; /* the chunk being written */
    const char *file; /* the log being read, its place in the list, its decimal mark */
    size_t file_index;
    char decimal;
    /* values with no meaning: kind and confidence codes without a word, and
     * confidence words without a line error */
    corax_tally *unknown_kind, *unknown_confidence, *no_line_error;
    /* the hole of the previous row, to skip the look-up down a log */
    char last_name[128];
    size_t last_len;
    const corax_hole *last_hole;
    size_t hint;
    const corax_hole *known; /* the next row's hole, when has_known */
    int has_known;
    size_t count[CORAX_COND_COUNT + 1]; /* rows by status; the last is "converted" */
    size_t rows;
    const char **field; /* room for a row's field pointers */
    size_t next_draw;   /* the next simulated row's place in r->draws */
} convert_lane;

/* Then, a few rows later, the course of the hole that holds the row's depth. */
void convert_prefetch_course(const convert_run *r, const convert_lane *ln,
                             const corax_table *batch, size_t row, const corax_hole *hole);

/* One row, evaluated. */
typedef struct convert_eval {
    corax_reading rd;
    const corax_hole *hole;
    corax_result res;
    int usable;            /* the row's fields could be read */
    char why[200];         /* why not, else "" */
    int simulate;          /* uncertainty is wanted and can be drawn */
    corax_error_model errors; /* the row's reading errors */
    char mc_why[200];      /* why the row gets no uncertainty, else "" */
    long run;              /* its run in the runs table, or -1 */
    long group;            /* its run without a mark (convert_orient()), or -1 */
    double turn_sigma;     /* the error of its run's turn, radians (NaN: none) */
} convert_eval;

/* Read a row into ev (the plain conversion; its uncertainty comes with
 * convert_uncertainty()). */
void convert_evaluate(const convert_run *r, convert_lane *ln, const corax_row *row,
                      convert_eval *ev);

/* The row's uncertainty: whether it can be drawn, and its reading errors. */
void convert_uncertainty(const convert_run *r, convert_lane *ln, const corax_row *row,
                         convert_eval *ev);

/* A run of readings whose betas run from an arbitrary line, and how it was
 * oriented (or why not). */
struct convert_group {
    const corax_hole *hole;
    long run;             /* in the runs table, or -1 (consecutive rows of a hole) */
    size_t first, last;   /* its rows lie between these */
    double from, to;      /* metres: the run's stretch */
    corax_turn turn;
    int fitted;
    char note[400];
};

/* Orient every run without a mark by the references of the setup: fit each
 * run's turn (corax_turn_fit) and convert its rows again. rows holds the logs;
 * *groups (free() it) gets the runs. A status (messages given). */
corax_status convert_orient(const convert_run *r, const corax_table *rows, convert_eval *ev,
                            size_t n, convert_group **groups, size_t *ngroups);

/* Write a row: its fields, the conversion, the spread (sp NULL: none), the
 * status and the note; and count it. */
void convert_write(const convert_run *r, convert_lane *ln, const corax_row *row,
                   const convert_eval *ev, const corax_spread *sp);

/* Open a core log, read and check its header (the first log writes the
 * output's header; later ones must match it). On CORAX_OK *reader stands
 * after the header and *header holds it until the next read. */
corax_status convert_open_log(convert_run *r, const char *path, corax_reader **reader,
                              corax_row *header, corax_error *err);

/* The log a lane reads from now on: its name, place and format. */
void convert_lane_file(convert_lane *ln, const char *path, size_t index,
                       const corax_reader *reader);

/* Fill a batch with up to `most` rows of the shard, counting the others in
 * r->other: the reader's status (CORAX_OK when more may follow, CORAX_END at
 * the end, or an error). */
corax_status convert_fill_batch(convert_run *r, corax_reader *rd, corax_table *batch, size_t most,
                                corax_error *err);

/* The uncertainty drawn in a first reading of the logs, for the rows to be
 * written in a second (no references): each simulated reading kept in a
 * compact record (about 50 bytes), holes drawn in parallel, each spread
 * written over its reading. A status (messages given). */
corax_status convert_draws_run(convert_run *r, const char *const *files, size_t nfiles,
                               int nlanes, convert_draws **out);
void convert_draws_free(convert_draws *d);

/* Standard input copied whole to an unnamed temporary file (in TMPDIR), to
 * be read twice; NULL with the error said. */
FILE *convert_stdin_copy(corax_job *job);

/* The place in d of the first simulated row at or after row `row` of the
 * shard (rows counted over every log). */
size_t convert_draws_rank(const convert_draws *d, size_t row);

/* The spread of simulated row j into *sp: sp, or NULL past the end. */
const corax_spread *convert_draws_spread(const convert_draws *d, size_t j, corax_spread *sp);

/* Whether the second reading met the first's rows: rows of the shard seen. */
int convert_draws_match(const convert_draws *d, size_t rows);

/* n lanes with their tallies, or NULL when out of memory; and their end. */
convert_lane *convert_lanes_new(int n);
void convert_lanes_free(convert_lane *lanes, int n);

/* The cloud of draws (--cloud): opened with its header (NULL, said, with *st
 * its status), and a row for each draw of a hole's readings
 * (corax_mc_draw_fn, user a convert_cloud). */
typedef struct convert_cloud {
    corax_writer *w;
    const char *hole;
    const corax_mc_reading *readings;
} convert_cloud;
corax_writer *convert_cloud_open(const convert_run *r, corax_status *st);
void convert_cloud_draw(void *user, size_t i, size_t draw, const corax_vec3 *p,
                        const corax_plane *plane);

/* Every log in memory: runs oriented by reference (--orient-by), then the
 * uncertainty (holes simulated in parallel, when there are draws), rows
 * written in order. A status (messages given). */
corax_status convert_in_memory(convert_run *r, convert_lane *lanes, int nlanes,
                               const char *const *files, size_t nfiles);

#endif
