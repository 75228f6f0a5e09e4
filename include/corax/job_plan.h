/* corax: the plan job, drill planning. What each planned hole would see of
 * the structure sets (hole, set, expected_alpha, alpha_sd, expected_beta,
 * terzaghi_factor, status, note), where it would pierce the target planes,
 * and a sweep of directions scored by how well they sample every set at
 * once, as a table and a picture; with the program view: how all the
 * planned holes together sample each set. */
#ifndef CORAX_JOB_PLAN_H
#define CORAX_JOB_PLAN_H

#include <stddef.h>

#include "corax/job.h"
#include "corax/plan.h"
#include "corax/plan_load.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_plan_job_options {
    corax_convert_options convert;    /* the core conventions and thresholds */
    corax_plan_load_options tables;   /* how the plan's tables are read; their dip
                                         convention is also the written dips' */
    const char *holes, *sets;         /* planned holes; sets to sample */
    const char *targets;              /* target planes, or NULL */
    const char *pierce;               /* the pierce points' table, or NULL */
    corax_plan_direction *directions; /* the sweep's directions (corax_plan_directions),
                                         scored and put best first in place; NULL: no
                                         sweep */
    size_t ndirections;
    corax_plan_range azimuth, plunge; /* the sweep's ranges (for the picture) */
    const char *sweep;                /* the sweep as asked, for the record */
    const char *best;                 /* the swept directions' table, or NULL */
    const char *svg;                  /* the sweep's picture, or NULL */
    const char *title;                /* its title; NULL: the default */
} corax_plan_job_options;

/* The convert defaults, the plan tables' defaults, no targets, no sweep. */
corax_plan_job_options corax_plan_job_options_default(void);

/* How the planned holes together sample one set. */
typedef struct corax_plan_job_set {
    char *name;
    corax_plan_program_set program;
    char *best_hole;   /* the name of program.best_hole */
    double best_alpha; /* radians: that hole's expected alpha */
} corax_plan_job_set;

typedef struct corax_plan_job_summary {
    char **hole;             /* the planned holes' names */
    size_t nholes;
    corax_plan_job_set *set; /* the program view, one per set */
    size_t nsets;
    char *worst_set;         /* the best direction's worst sampled set (with a
                                sweep), or NULL */
} corax_plan_job_summary;

void corax_plan_job_summary_clear(corax_plan_job_summary *summary);

/* Plan: read the tables (their faults are messages, and nothing is written
 * when there are any), desurvey, sample and pierce every planned hole, sweep
 * the directions, and write the tables (the sampling to output) and the
 * picture, held in job->outputs. The job's record gets [plan] (and
 * [sweep]). */
corax_status corax_plan_job_run(corax_job *job, const corax_plan_job_options *options,
                                const char *output, corax_plan_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
