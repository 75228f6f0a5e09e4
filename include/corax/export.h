/* corax: located, oriented structures and hole traces for 3-D modelling:
 * a CSV of modelling columns, and legacy VTK polydata.
 *
 * The VTK file holds, in one polydata:
 *   points     every hole trace's sample points (hole by hole, in program
 *              order), then the structures' points (a disc's corners, or
 *              one point each);
 *   VERTICES   one per structure when structures are points;
 *   LINES      one polyline per hole, through its samples on the arc;
 *   POLYGONS   one disc per structure when structures are discs, lying in
 *              the structure's plane, centred on it;
 *   POINT_DATA depth (SCALARS, metres down the hole; a structure's points
 *              carry its depth, -1 when not known); with points, also
 *              normal (NORMALS: the upward unit normal; 0 0 0 on traces);
 *   CELL_DATA  kind (SCALARS int: the feature kind code of structure.h, -1
 *              for a hole trace), and a FIELD "attributes" of dip and
 *              dip_direction (degrees; -1 for a hole trace, which is not a
 *              plane), polarity (int: 1 upright, -1 overturned, 0 not known
 *              or a trace) and hole (the hole's number, 1 for the first
 *              hole of the collar table; 0 when not known).
 * -1 marks "not a value" because legacy VTK cannot write NaN in ASCII. */
#ifndef CORAX_EXPORT_H
#define CORAX_EXPORT_H

#include <stddef.h>

#include "corax/gis.h"
#include "corax/output.h"
#include "corax/structure.h"
#include "corax/survey.h"
#include "corax/vtk.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- what a converted table says beyond the plane ---- */

/* The Monte Carlo columns of a converted table (convert --draws), in order:
 * dip_sd, dip_direction_sd (degrees), cone95 (degrees), kappa, position_sd
 * (metres). */
enum { CORAX_EXPORT_SPREAD = 5 };
extern const char *const corax_export_spread_names[CORAX_EXPORT_SPREAD];

/* Where a converted table keeps its lineation (trend, plunge), the Monte
 * Carlo columns and the status (-1 when absent). */
typedef struct corax_export_columns {
    long trend, plunge, spread[CORAX_EXPORT_SPREAD], status;
} corax_export_columns;

/* Find them in a header (names as corax convert writes them, or as mapped). */
void corax_export_columns_find(const corax_row *header, const corax_column_map *map,
                               corax_export_columns *c);

/* 1 when the table has the lineation columns, 1 when it has every Monte
 * Carlo column. */
int corax_export_has_lines(const corax_export_columns *c);
int corax_export_has_spread(const corax_export_columns *c);

/* A row's lineation, spread and status. */
typedef struct corax_export_extra {
    int has_line;               /* trend and plunge given */
    double trend, plunge;       /* radians, plunge positive down */
    corax_vec3 line;            /* unit vector along trend, pointing down-plunge */
    double spread[CORAX_EXPORT_SPREAD]; /* NaN when not given */
    const char *status;         /* borrowed from the row; "" when none */
    size_t status_len;
} corax_export_extra;

/* Read them. CORAX_EVALUE with a phrase in why for a value given but
 * unusable: not a number, a plunge outside [-90, 90] or a trend outside
 * [0, 360], a trend without a plunge, a negative spread. */
corax_status corax_export_extra_read(const corax_row *row, const corax_export_columns *c,
                                     char decimal, corax_export_extra *x, char *why,
                                     size_t whylen);

/* ---- CSV for modelling ---- */

/* The modelling columns, in order: x, y, z, dip, dip_direction, nx, ny, nz,
 * polarity. */
extern const char *const corax_export_csv_columns[9];
enum { CORAX_EXPORT_CSV_COLUMNS = 9 };

/* Write those fields for a located structure: coordinates to the
 * millimetre, dip and dip direction (degrees) to 0.01, the upward unit
 * normal to 1e-6 (all five empty for a line without a plane), and polarity
 * 1 (upright), -1 (overturned) or empty. */
void corax_export_csv_fields(corax_writer *w, const corax_structure *s);

/* With lineations: lx, ly, lz, the unit vector of the line (down-plunge). */
extern const char *const corax_export_line_columns[3];

/* Write lx, ly, lz to 1e-6 (empty without a line). */
void corax_export_csv_line(corax_writer *w, const corax_export_extra *x);

/* A structure oriented by a plane, by a line, or both, with a position, is
 * one for modelling. */
int corax_export_usable(const corax_structure *s, const corax_export_extra *x);

/* The corners of a disc of a plane: `sides` points on the circle of that
 * radius about centre, in the plane, starting along strike and turning
 * down dip. out has room for sides points. */
void corax_export_disc(corax_plane plane, corax_vec3 centre, double radius, int sides,
                       corax_vec3 *out);

/* ---- GIS layers (gis.h) ---- */

/* The structures layer's own fields, in order: hole, depth, kind, dip,
 * dip_direction, strike (degrees, right-hand rule), nx, ny, nz (the upward
 * unit normal), polarity (1, -1, null when not known), trend, plunge
 * (degrees), lx, ly, lz (the line's unit vector, down-plunge; null without
 * a line), then with spread the Monte Carlo columns, then status. Returns
 * their number (at most CORAX_EXPORT_GIS_STRUCTURE_FIELDS); out has room. */
enum { CORAX_EXPORT_GIS_STRUCTURE_FIELDS = 21 };
size_t corax_export_gis_structure_fields(int spread, corax_gis_field *out);

/* Fill those fields of the current feature, and its point. */
void corax_export_gis_structure(corax_gis *g, const corax_structure *s,
                                const corax_export_extra *x, int spread);

/* A layer of hole traces: one 3-D line string per hole with a path, through
 * its samples every `step` metres plus stations and end (on the arc), with
 * depth as each vertex's measure where the format keeps measures; fields
 * hole, depth_from, depth_to. *count gets the lines written. */
corax_status corax_export_gis_traces(corax_gis *g, const corax_program *program, double step,
                                     const char *name, size_t *count, corax_error *err);

/* A layer of collars: a point each; fields hole, azimuth, dip (degrees, dip
 * in the given convention; null when the collar gives no direction),
 * length (null when not known), stations (how many). */
corax_status corax_export_gis_collars(corax_gis *g, const corax_program *program,
                                      corax_dip_convention convention, const char *name,
                                      size_t *count, corax_error *err);

/* ---- VTK ---- */

/* A structure as the VTK export needs it. */
typedef struct corax_export_structure {
    corax_vec3 position; /* metres */
    corax_plane plane;   /* radians */
    double depth;        /* metres down the hole; NaN when not known */
    int kind;            /* feature kind code (structure.h) */
    int polarity;        /* 1 upright, -1 overturned, 0 not known */
    long hole;           /* index of its hole in the program, -1 when not known */
    int has_plane;       /* plane is given (else a line alone) */
    int has_line;        /* line is given */
    float line[3];       /* the lineation's unit vector, down-plunge */
    float spread[CORAX_EXPORT_SPREAD]; /* Monte Carlo columns; NaN when absent */
} corax_export_structure;

typedef enum corax_export_shape {
    CORAX_EXPORT_DISCS = 0, /* a polygon in the plane */
    CORAX_EXPORT_POINTS     /* a vertex with the plane's normal */
} corax_export_shape;

typedef struct corax_export_options {
    corax_vtk_encoding encoding;
    int traces;             /* write hole traces */
    double step;            /* metres between trace samples (plus stations), > 0 */
    corax_export_shape shape;
    double disc_radius;     /* metres, > 0 */
    int disc_sides;         /* corners of a disc, 3..360 */
    const char *title;      /* the file's title line; NULL: a default */
    double arrow;           /* metres: lineations also as line cells this long
                               from the structure, down-plunge; 0 for none */
} corax_export_options;

/* The encoding chosen (CORAX_VTK_AUTO, the default): ASCII, which people
 * can read and compare, up to CORAX_EXPORT_ASCII_MAX structures; binary
 * above, where text is only larger and slower to write and read. A structure
 * takes, with its share of 2,000 traces sampled every 5 m (make bench): a
 * disc of 24 corners 1,337 bytes in ASCII and 903 in binary (written four
 * times as fast), a point with its normal 128 and 104 bytes. */
enum { CORAX_EXPORT_ASCII_MAX = 100000 };

/* The encoding an export of n structures is written in. */
corax_vtk_encoding corax_export_encoding(const corax_export_options *options, size_t n);

/* Encoding chosen by size (CORAX_VTK_AUTO), traces every 5 m, discs of radius
 * 5 m with 24 corners. */
corax_export_options corax_export_options_default(void);

/* Counts of what an export wrote. */
typedef struct corax_export_counts {
    size_t traces, trace_points, structures, points, cells;
} corax_export_counts;

/* Write the hole traces of a program (may be NULL: no traces) and n
 * structures to a VTK file, streaming: memory does not grow with the
 * output. The file is whole or absent. counts (may be NULL) gets what was
 * written. CORAX_EARG for options out of range, CORAX_EIO, CORAX_ENOMEM. */
corax_status corax_export_vtk(corax_outputs *set, const char *path, const corax_program *program,
                              const corax_export_structure *structures, size_t n,
                              const corax_export_options *options,
                              corax_export_counts *counts, corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
