/* cli: the pieces of `corax export` (cmd_export.c: options, CSV and VTK;
 * export_gis.c: files through GDAL/OGR; export_tables.c: interval tables,
 * findings and contacts). Internal to src/cli. */
#ifndef CORAX_CLI_EXPORT_INT_H
#define CORAX_CLI_EXPORT_INT_H

#include "cli/cli.h"
#include "io/carry.h"

typedef enum { FORMAT_NONE, FORMAT_CSV, FORMAT_VTK, FORMAT_GIS } export_format;

/* An interval table and the layer it becomes. */
typedef struct export_table {
    const char *layer, *path;
} export_table;

enum { EXPORT_MAX_TABLES = 16 };

typedef struct export_opts {
    cli_common c;
    export_format format;
    const char *format_name;     /* as given */
    corax_export_options vtk;
    int binary_given, shape_given, radius_given, arrows_given;
    const char *findings;        /* --findings: corax check's table */
    export_table intervals[EXPORT_MAX_TABLES];
    int nintervals;
    const char *contacts;        /* --contacts: an interval table of units */
    const char *contact_column;  /* --contact-column */
    const char *contact_kinds;   /* --contact-kinds, comma-separated */
    const char *youngest_first;  /* --youngest-first, comma-separated */
    double contact_window;       /* --contact-window, metres */
    const char *layers;          /* --layers, comma-separated; NULL: all */
    char **inputs;               /* converted tables */
    int ninputs;
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

/* Whether --layers asks for a layer (always, without --layers). */
int export_wants(const export_opts *o, const char *layer);

/* What goes over the converted tables: first every table's header (so that
 * columns carried through are known before any row), then every usable
 * structure (located; oriented by a plane or a line) of every table. Either
 * callback returns 0 to go on, -1 to stop (its message printed). */
typedef struct export_visit {
    int (*header)(void *ctx, int table, const corax_row *header,
                  const corax_structure_columns *c, const corax_export_columns *x);
    int (*begin)(void *ctx);     /* after every header, before any row (may be NULL) */
    int (*row)(void *ctx, int table, const corax_row *row, const corax_structure *s,
               const corax_export_extra *x);
    size_t left_out;             /* rows without a position or orientation */
} export_visit;

/* Go over the converted tables. EXIT_OK, or EXIT_DATA with the messages
 * printed (faulty rows are all reported, and fail the run). */
int export_each_structure(const export_opts *o, export_visit *v, void *ctx);

/* The GIS export (export_gis.c). */
int export_gis(const export_opts *o, const corax_program *prog, cli_about *about);

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
int export_intervals_vtk(const export_opts *o, const corax_program *prog, cli_about *a);
int export_findings(const export_opts *o, const corax_program *prog, export_sink *sink);
int export_contacts(const export_opts *o, const corax_program *prog, export_sink *sink,
                    cli_about *about);

#endif
