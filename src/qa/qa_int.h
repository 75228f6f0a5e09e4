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
    size_t run;  /* index into the runs, or QA_NONE */
} qa_item;

#define QA_NONE ((size_t)-1)

/* The readings of one hole, sorted by depth: items[first .. first + n). */
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

/* Everything the checks share. */
typedef struct qa_data {
    const corax_qa_options *o;
    const corax_convert_options *convert;
    qa_item *items;      /* grouped by hole (in order of first appearance), by depth */
    size_t nitems;
    qa_hole *holes;
    size_t nholes;
    corax_qa_run *runs;  /* by hole as in holes[], then by depth */
    size_t nruns;
    double barrel;       /* metres: an orientation run's usual length */
    int reading;         /* how the program's betas are read (QA_*): QA_AS_STATED
                            unless the convention test found another fits */
    corax_findings *out;
} qa_data;

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

/* The run checks, the program-wide convention test, and the program checks
 * (qa/runs.c, qa/conventions.c, qa/program.c). */
corax_status qa_check_runs(qa_data *d);
corax_status qa_check_conventions(qa_data *d);
corax_status qa_check_program(qa_data *d);

#endif
