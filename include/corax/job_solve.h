/* corax: the solve job. Planes from alpha alone: tables of readings (hole,
 * depth, alpha, set; optional alpha_error, depth_error) whose readings of
 * one set are parallel planes give each set's candidates, best first (set,
 * candidate, dip, dip_direction, holes, readings, misfit, cone95, status,
 * note); every reading with its place and residual on request, and a
 * stereonet of the readings' small circles and the solved poles. */
#ifndef CORAX_JOB_SOLVE_H
#define CORAX_JOB_SOLVE_H

#include <stddef.h>
#include <stdint.h>

#include "corax/job.h"
#include "corax/solve.h"
#include "corax/uncertainty.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_solve_job_options {
    corax_solve_options solve;
    corax_error_model errors;     /* alpha and depth for the readings, the
                                     survey's for the draws */
    size_t draws;                 /* per set; 0: no cone95 */
    uint64_t seed;
    corax_table_settings readings; /* how the readings tables are read */
    const char *residuals;        /* every reading's place and residual, or NULL */
    const char *svg;              /* the stereonet, or NULL */
    const char *draw_sets;        /* only these sets on it (comma-separated), or NULL */
    const char *title;            /* its title; NULL: "Planes from alpha alone" */
} corax_solve_job_options;

/* The solve defaults, the default errors, 1000 draws, seed 1. */
corax_solve_job_options corax_solve_job_options_default(void);

typedef struct corax_solve_job_summary {
    size_t sets;
    size_t count[CORAX_SOLVE_NO_READINGS + 1]; /* sets by status */
    size_t readings;                           /* rows read */
    size_t left_out;                           /* rows that could not be used */
} corax_solve_job_summary;

/* Solve the sets of the readings tables inputs[0..ninputs) ("-" once for
 * standard input; all with the first's header) into output, held in
 * job->outputs. A row that cannot be used is an error message ("...; left
 * out") and the rest is solved. The job's record gets [solve] and, with
 * draws, [uncertainty]. An error message and a status when a table cannot
 * be read or lacks a required column. */
corax_status corax_solve_job_run(corax_job *job, const corax_program *program,
                                 const corax_solve_job_options *options,
                                 const char *const *inputs, size_t ninputs, const char *output,
                                 corax_solve_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
