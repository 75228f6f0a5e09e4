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
} qa_hole;

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
    corax_findings *out;
} qa_data;

/* The angle between two axes (lines without sense), in [0, pi/2]. */
double qa_axial_angle(corax_vec3 a, corax_vec3 b);

/* The upward normal of a reading converted again with its measured beta
 * replaced by beta_of(beta): the plane it would give under another reading of
 * the log. 0 when it gives none. */
int qa_reconvert(const qa_data *d, const qa_item *it, double beta, corax_vec3 *normal);

/* Add v v^T to the nine sums t (or take it away with sign -1). */
void qa_tensor_add(double t[9], corax_vec3 v, double sign);

/* The principal axis of the tensor sums; 0 when it cannot be found. */
int qa_principal(const double t[9], corax_vec3 *axis, double *strength);

/* The run checks, and the program checks (qa/runs.c, qa/program.c). */
corax_status qa_check_runs(qa_data *d);
corax_status qa_check_program(qa_data *d);

#endif
