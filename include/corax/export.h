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

#include "corax/output.h"
#include "corax/structure.h"
#include "corax/survey.h"
#include "corax/vtk.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- CSV for modelling ---- */

/* The modelling columns, in order: x, y, z, dip, dip_direction, nx, ny, nz,
 * polarity. */
extern const char *const corax_export_csv_columns[9];
enum { CORAX_EXPORT_CSV_COLUMNS = 9 };

/* Write those fields for a located, oriented structure: coordinates to the
 * millimetre, dip and dip direction (degrees) to 0.01, the upward unit
 * normal to 1e-6, and polarity 1 (upright), -1 (overturned) or empty. */
void corax_export_csv_fields(corax_writer *w, const corax_structure *s);

/* ---- VTK ---- */

/* A structure as the VTK export needs it. */
typedef struct corax_export_structure {
    corax_vec3 position; /* metres */
    corax_plane plane;   /* radians */
    double depth;        /* metres down the hole; NaN when not known */
    int kind;            /* feature kind code (structure.h) */
    int polarity;        /* 1 upright, -1 overturned, 0 not known */
    long hole;           /* index of its hole in the program, -1 when not known */
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
} corax_export_options;

/* ASCII, traces every 5 m, discs of radius 5 m with 24 corners. */
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
