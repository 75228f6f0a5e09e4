/* corax: the stereonet job. Converted tables read row by row (a few dozen
 * bytes kept a reading), filtered and grouped by their columns, their planes
 * (rows with dip and dip_direction) and lines (trend and plunge) drawn on a
 * stereonet page, and each group's orientation statistics (Fisher mean,
 * kappa and alpha95, the orientation tensor, Woodcock's K and C) as a
 * table. */
#ifndef CORAX_JOB_STEREONET_H
#define CORAX_JOB_STEREONET_H

#include <stddef.h>

#include "corax/job.h"
#include "corax/stereonet.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Keep only rows whose column is this value (without regard to case). Rules
 * of one column are alternatives; rules of different columns must all
 * match. */
typedef struct corax_stereonet_where {
    const char *column, *value;
} corax_stereonet_where;

typedef struct corax_stereonet_job_options {
    corax_net_style style;   /* projection, planes, contours, weighting (Terzaghi);
                                its title and min_angle are set by the job */
    double min_angle;        /* degrees: Terzaghi weights capped as at this angle */
    int net_per_group;       /* one net per group (else all on one, with a legend) */
    int small_circles;       /* a reading with alpha but no plane drawn as the small
                                circle its pole lies on */
    const char *group_by;    /* one group per value of this column, or NULL */
    const corax_stereonet_where *where;
    size_t nwhere;
    const char *title;       /* NULL: "Stereonet of FILE[ and N more][, by COLUMN]" */
    const char *stats;       /* the statistics' table, or NULL */
    corax_table_format format; /* how the converted tables are read */
} corax_stereonet_job_options;

/* The net defaults; Terzaghi's cap at 15 degrees; tables found as they are
 * (either decimal mark). */
corax_stereonet_job_options corax_stereonet_job_options_default(void);

typedef struct corax_stereonet_job_summary {
    size_t groups;
    size_t skipped; /* rows without usable angles (not faults) */
} corax_stereonet_job_summary;

/* Draw the converted tables inputs[0..ninputs) (at least one) into output
 * (SVG), and the statistics, held in job->outputs. An empty file is a
 * warning and an empty net. CORAX_EARG, with the message, for a --group-by
 * or --where column a table lacks; an error message and another status for
 * a table without angles, faulty rows (all said, nothing written) or a file
 * that cannot be read or written. The job's record gets [stereonet]. */
corax_status corax_stereonet_job_run(corax_job *job, const corax_stereonet_job_options *options,
                                     const char *const *inputs, size_t ninputs,
                                     const char *output, corax_stereonet_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
