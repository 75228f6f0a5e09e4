/* The pieces of the export job (internal to src/job): export_read.c goes
 * over the converted tables; export_tables.c writes interval tables,
 * findings and contacts; export_gis.c files through GDAL/OGR; export.c the
 * modelling CSV, legacy VTK, and the job. */
#ifndef CORAX_JOB_EXPORT_INT_H
#define CORAX_JOB_EXPORT_INT_H

#include "corax/job_export.h"
#include "corax/gis.h"
#include "corax/interval.h"
#include "corax/structure.h"
#include "corax/vtk.h"
#include "io/carry.h"
#include "job/job_int.h"

typedef corax_export_table export_table;

/* One export: its job, options, inputs and output. */
typedef struct export_opts {
    corax_job *job;
    const corax_export_job_options *p;
    const char *const *inputs; /* converted tables */
    int ninputs;
    const char *output;
} export_opts;

/* The layer names of a GIS export. */
#define LAYER_STRUCTURES "structures"
#define LAYER_DISCS "discs"
#define LAYER_LINEATIONS "lineations"
#define LAYER_TRACES "traces"
#define LAYER_COLLARS "collars"
#define LAYER_FINDINGS "findings"
#define LAYER_CONTACTS "contacts"

/* The next item of a comma-separated list at *p: 1 with *item and *len
 * set and *p moved past it, 0 at the end. */
int export_list_next(const char **p, const char **item, size_t *len);

/* Whether the options' layers ask for a layer (always, without them). */
int export_wants(const export_opts *o, const char *layer);

/* What goes over the converted tables: first every table's header (so that
 * columns carried through are known before any row), then every usable
 * structure (located; oriented by a plane or a line) of every table. Either
 * callback returns 0 to go on, -1 to stop (its message given). */
typedef struct export_visit {
    int (*header)(void *ctx, int table, const corax_row *header,
                  const corax_structure_columns *c, const corax_export_columns *x);
    int (*begin)(void *ctx);     /* after every header, before any row (may be NULL) */
    int (*row)(void *ctx, int table, const corax_row *row, const corax_structure *s,
               const corax_export_extra *x);
    size_t left_out;             /* rows without a position or orientation */
} export_visit;

/* Go over the converted tables. JOB_OK, or JOB_FAILED with the
 * messages given (faulty rows are all reported, and fail the run). */
int export_each_structure(const export_opts *o, export_visit *v, void *ctx);

/* The GIS export (export_gis.c). */
int export_gis(const export_opts *o, const corax_program *prog, corax_record *about);

/* Interval tables, findings and contacts (export_tables.c). A sink takes
 * the rows of one table: CSV (w), or a GIS layer (g). */
typedef struct export_sink {
    corax_writer *w;
    corax_gis *g;
    const char *layer;
    size_t written;
} export_sink;

int export_intervals(const export_opts *o, const corax_program *prog, const export_table *t,
                     export_sink *sink);
/* The intervals of the first --intervals table as legacy VTK lines (from,
 * middle, to) with their columns as cell data. */
int export_intervals_vtk(const export_opts *o, const corax_program *prog, corax_record *a);
int export_findings(const export_opts *o, const corax_program *prog, export_sink *sink);
int export_contacts(const export_opts *o, const corax_program *prog, export_sink *sink,
                    corax_record *about);

#endif
