/* Internal to src/qa: the converted readings the orientation and program
 * checks share, with their runs. */
#ifndef CORAX_QA_INT_H
#define CORAX_QA_INT_H

#include <stddef.h>

#include "corax/qa.h"

/* One reading of the log, converted. */
typedef struct qa_item {
    const corax_qa_reading *r;
    corax_result res;
    size_t run;  /* index into the hole's runs, or QA_NONE */
} qa_item;

#define QA_NONE ((size_t)-1)

/* The readings of one hole, sorted by depth: the log's [first, first + n)
 * (qa_data.holes), or, for the hole loaded (qa_load), items[first ..
 * first + n) with first 0. */
typedef struct qa_hole {
    const char *name;
    const corax_hole *path;
    size_t first, n;
    int given_runs; /* the runs table has runs of this hole */
} qa_hole;

/* Ways of reading a measured beta other than as stated, as bits: beta + 180
 * (a top-of-hole line, or beta to the up-hole end), 360 - beta (the other
 * sense), and both. */
enum { QA_AS_STATED = 0, QA_PLUS_180 = 1, QA_MIRRORED = 2, QA_READINGS = 4 };

/* A measured beta read another way. */
double qa_beta_read(double beta, int how);

/* Everything the checks share. The program's holes are gone over one at a
 * time: qa_load() converts a hole's readings and places them in its runs,
 * so that the memory taken grows with the largest hole, not the program. */
typedef struct qa_data {
    const corax_qa_options *o;
    const corax_convert_options *convert;
    const corax_qa_log *log;
    qa_hole *holes;      /* the log's, in order of first appearance */
    size_t nholes;
    corax_qa_run *given; /* the runs table, by hole and depth */
    size_t ngiven;
    double barrel;       /* metres: an orientation run's usual length */
    int reading;         /* how the program's betas are read (QA_*): QA_AS_STATED
                            unless the convention test found another fits */
    corax_findings *out;
    /* the hole loaded */
    size_t loaded;           /* its number, or QA_NONE */
    qa_hole hole;            /* it, with first 0 */
    corax_qa_reading *reading_of; /* its readings unpacked */
    qa_item *items;          /* and converted, by depth */
    size_t nitems;
    corax_qa_run *runs;      /* its runs, by depth */
    size_t nruns, runs_cap;
} qa_data;

/* Set up d (its options, log and findings given) for the log's holes and
 * the runs table; qa_close() frees what it holds, either way. CORAX_ENOMEM. */
corax_status qa_open(qa_data *d, const corax_qa_run *runs, size_t nruns);
void qa_close(qa_data *d);

/* Load hole h (0 .. nholes - 1): its readings converted with their betas read
 * as d->reading says, in d->items[0 .. n), each placed in its run (d->runs:
 * the table's, else inferred from its depths); d->hole is the hole with
 * first 0. CORAX_ENOMEM. */
corax_status qa_load(qa_data *d, size_t h);

/* The file of hole h's first reading. */
const char *qa_hole_file(const qa_data *d, size_t h);

/* Whether a hole (NUL-ended name) is one the options check: all without
 * shards, else those of their shard. */
int qa_in_shard(const corax_qa_options *o, const char *name);

/* The angle between two axes (lines without sense), in [0, pi/2]. */
double qa_axial_angle(corax_vec3 a, corax_vec3 b);

/* The upward normal of a reading converted again with its measured beta
 * replaced by `beta`: the plane it would give under another reading of the
 * log. 0 when it gives none. */
int qa_reconvert(const qa_data *d, const qa_item *it, double beta, corax_vec3 *normal);

/* The upward normal of a reading with its beta read `how` (QA_*) on top of
 * the program's reading; 0 when it gives no plane. */
int qa_normal_as(const qa_data *d, const qa_item *it, int how, corax_vec3 *normal);

/* The same with beta then turned by `turn` (radians). */
int qa_normal_turned(const qa_data *d, const qa_item *it, int how, double turn,
                     corax_vec3 *normal);

/* Add v v^T to the nine sums t (or take it away with sign -1). */
void qa_tensor_add(double t[9], corax_vec3 v, double sign);

/* The principal axis of the tensor sums; 0 when it cannot be found. */
int qa_principal(const double t[9], corax_vec3 *axis, double *strength);

/* "a", "a and b", "a, b and c" of up to `n` names into buf; "and N more"
 * past `shown`. */
void qa_name_list(char *buf, size_t size, const char *const *names, size_t n, size_t shown);

/* The run checks of the hole loaded, the program-wide convention test, and
 * the program checks (qa/runs.c, qa/conventions.c, qa/program.c). */
corax_status qa_check_runs(qa_data *d);
corax_status qa_check_conventions(qa_data *d);
corax_status qa_check_program(qa_data *d);

#endif
