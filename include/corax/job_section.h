/* corax: the section job. A vertical cross-section along a line: every
 * structure of a converted table that lies within the slab goes to a table,
 * its own columns first, then distance_along, offset, elevation,
 * apparent_dip and apparent_dip_toward (input columns of those names
 * replaced); and, when asked, the section drawn to scale as SVG, with the
 * holes that reach the slab. */
#ifndef CORAX_JOB_SECTION_H
#define CORAX_JOB_SECTION_H

#include <stddef.h>

#include "corax/job.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_section_job_options {
    double x, y;          /* a point on the section line (grid metres) */
    double azimuth;       /* degrees: the direction the section looks, as given
                             (the drawing and the record show it so) */
    double width;         /* metres: the slab, half on each side of the line */
    int has_from, has_to; /* keep only this stretch of the line */
    double from, to;      /* metres along */
    double step;          /* metres: hole paths sampled this often, plus stations */
    double scale;         /* draw at 1:scale (96 pixels an inch); 0: fit the page */
    const char *svg;      /* the drawing, or NULL */
    const char *kinds;    /* only these feature kinds (comma-separated), or NULL */
    corax_table_settings converted; /* how the converted table is read */
} corax_section_job_options;

/* No origin or slab yet (give them); every 5 m; fitted to the page; converted
 * tables read as corax writes them. */
corax_section_job_options corax_section_job_options_default(void);

typedef struct corax_section_job_summary {
    size_t kept;        /* structures in the slab, written */
    size_t outside;     /* outside the slab or the stretch */
    size_t other_kinds; /* of kinds not asked for */
    size_t unlocated;   /* without a position, left out */
    size_t holes;       /* holes that reach the slab */
} corax_section_job_summary;

/* Cut the section through the converted table at input ("-" for standard
 * input) into output (and the drawing), held in job->outputs. Notes name the
 * holes left out and the rows without a position; the job's record gets
 * [section] and [results]. An error message and a status when the table
 * cannot be read or has faulty rows (all of them said). */
corax_status corax_section_job_run(corax_job *job, const corax_program *program,
                                   const corax_section_job_options *options, const char *input,
                                   const char *output, corax_section_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
