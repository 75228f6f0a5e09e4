/* corax: the trace job, the desurveyed holes. Positions and directions at
 * the depths of a table (one output row per input row, in order, its
 * columns first: x, y, z, azimuth, dip, status, note), or down every hole at
 * a step with the collar, every station and the end (hole, depth, x, y, z,
 * azimuth, dip, dogleg_severity, point, status); and, when asked, a
 * companion table of each station's azimuth corrections. */
#ifndef CORAX_JOB_TRACE_H
#define CORAX_JOB_TRACE_H

#include "corax/correction.h"
#include "corax/job.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_trace_job_options {
    const char *at;                 /* a table with hole and depth columns, or NULL */
    corax_table_settings depths;    /* how it is read */
    double step;                    /* metres between points down each hole; 0: the
                                       collar, the stations and the end only */
    corax_dip_convention dip;       /* of the dips written */
    corax_table_format output;      /* the trace's format */
    const char *corrections;        /* the corrections' table, or NULL */
    const corax_corrections *record; /* each station's corrections, as loaded */
} corax_trace_job_options;

/* No --at, no step, negative-down dips, comma and point. */
corax_trace_job_options corax_trace_job_options_default(void);

/* Trace the program into output, held in job->outputs (the corrections'
 * table written on its own, whole or not at all). The job's record gets
 * [trace]. An error message and a status when the table of depths cannot be
 * read, or a hole would need too many points at the step. */
corax_status corax_trace_job_run(corax_job *job, const corax_program *program,
                                 const corax_trace_job_options *options, const char *output);

#ifdef __cplusplus
}
#endif
#endif
