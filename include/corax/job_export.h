/* corax: the export job. Located, oriented structures (from converted
 * tables), hole traces, desurveyed intervals and oriented contacts for 3-D
 * modelling, GIS and CAD: one CSV table (structures, intervals or contacts),
 * legacy VTK (traces and structures, or the intervals as lines), or a file
 * of layers through GDAL (structures, traces, collars, findings, intervals,
 * contacts; in CAD also discs and lineations). */
#ifndef CORAX_JOB_EXPORT_H
#define CORAX_JOB_EXPORT_H

#include <stddef.h>

#include "corax/export.h"
#include "corax/job.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum corax_export_job_format {
    CORAX_EXPORT_JOB_CSV,
    CORAX_EXPORT_JOB_VTK,
    CORAX_EXPORT_JOB_GIS /* through GDAL: format_name names the driver */
} corax_export_job_format;

/* An interval table and the layer it becomes. */
typedef struct corax_export_table {
    const char *layer, *path;
} corax_export_table;

enum { CORAX_EXPORT_TABLES = 16 };

typedef struct corax_export_job_options {
    corax_export_job_format format;
    const char *format_name;   /* "csv", "vtk", or a GIS format (gpkg, geojson, dxf,
                                  shp, a GDAL driver's name) */
    corax_export_options vtk;  /* discs, traces, steps and arrows (VTK and GIS) */
    int arrows_given;          /* DXF lineations are vtk.arrow long, else the radius */
    const char *findings;      /* corax check's findings as a layer, or NULL */
    corax_export_table intervals[CORAX_EXPORT_TABLES]; /* from/to tables */
    int nintervals;
    const char *contacts;      /* a from/to table of units, or NULL */
    const char *contact_column; /* the unit's column; NULL: "unit" */
    const char *contact_kinds; /* kinds whose planes orient contacts (comma-separated);
                                  NULL: "contact" */
    const char *youngest_first; /* units youngest first (comma-separated), or NULL */
    double contact_window;     /* metres either side */
    const char *layers;        /* only these GIS layers (comma-separated); NULL: all */
    const char *crs;           /* the coordinates' reference system, for GDAL, or NULL */
    corax_dip_convention collar_dip; /* of the collar layer's dips */
    corax_table_settings converted;  /* how converted tables are read */
    corax_table_settings depths;     /* how interval and findings tables are read */
} corax_export_job_options;

/* CSV; the export defaults; contacts within 2 m; dips negative down;
 * tables found as they are (converted ones with either decimal mark). */
corax_export_job_options corax_export_job_options_default(void);

typedef struct corax_export_job_summary {
    size_t structures; /* structures written (CSV and VTK) */
    size_t left_out;   /* rows without a position or orientation */
} corax_export_job_summary;

/* Whether the options' layers ask for a layer by name (always, when no
 * layers are given): without regard to case. */
int corax_export_job_wants(const corax_export_job_options *options, const char *layer);

/* Export the converted tables inputs[0..ninputs) (may be none) and the
 * program (may be NULL when no layer needs it) to output, held in
 * job->outputs. The job's record gets [export] and what the format adds
 * (layers, kinds, holes, codes, results). CORAX_EARG, with the message, for
 * a GIS format this machine's GDAL cannot write or layers that cannot be
 * made as asked; an error message and another status when a table cannot be
 * read or has faulty rows (all of them said). */
corax_status corax_export_job_run(corax_job *job, const corax_program *program,
                                  const corax_export_job_options *options,
                                  const char *const *inputs, size_t ninputs, const char *output,
                                  corax_export_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
