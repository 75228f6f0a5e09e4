/* corax: legacy VTK polydata files ("# vtk DataFile Version 3.0"), ASCII or
 * binary, written as a stream: the caller announces each block (points,
 * cells, data arrays) with its size, then gives exactly that many values.
 * Nothing is held in memory beyond an output buffer, so an export of any
 * size streams. The file appears under its real name only when committed
 * whole (corax_writer).
 *
 * Order of a polydata file: POINTS; then cell blocks VERTICES, LINES,
 * POLYGONS (each optional, in that order: cell data follows it);
 * then POINT_DATA and CELL_DATA, each with SCALARS, NORMALS and FIELD
 * arrays. Binary values are big-endian (the format's rule): 64-bit IEEE
 * doubles and 32-bit integers. ASCII doubles are written with a fixed
 * number of decimals (default 6). Legacy VTK has no way to write NaN in
 * ASCII, so non-finite values are refused. */
#ifndef CORAX_VTK_H
#define CORAX_VTK_H

#include <stddef.h>

#include "corax/geometry.h"
#include "corax/output.h"
#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ASCII text or binary; AUTO lets the writer choose (corax_export_vtk() by
 * the export's size; corax_vtk_open(), which knows no size, takes ASCII). */
typedef enum corax_vtk_encoding {
    CORAX_VTK_ASCII = 0,
    CORAX_VTK_BINARY,
    CORAX_VTK_AUTO
} corax_vtk_encoding;
typedef enum corax_vtk_type { CORAX_VTK_DOUBLE = 0, CORAX_VTK_INT } corax_vtk_type;

typedef struct corax_vtk corax_vtk;

/* Open a file ("-" for standard output) and write the header; the title is
 * one line (line breaks become blanks, cut at 255 bytes). CORAX_VTK_AUTO
 * writes ASCII. */
corax_status corax_vtk_open(corax_outputs *set, const char *path, corax_vtk_encoding encoding,
                            const char *title,
                            corax_vtk **out, corax_error *err);

/* Decimals for ASCII doubles, 0..9 (default 6). */
void corax_vtk_decimals(corax_vtk *v, int decimals);

/* POINTS: then n calls of corax_vtk_point(). At most 2^31 - 1 points. */
void corax_vtk_points(corax_vtk *v, size_t n);
void corax_vtk_point(corax_vtk *v, corax_vec3 p);

/* A cell block, keyword "VERTICES", "LINES" or "POLYGONS", of ncells cells
 * holding nindices point indices in all; then, per cell, corax_vtk_cell()
 * with its number of points and that many corax_vtk_index() calls. */
void corax_vtk_cells(corax_vtk *v, const char *keyword, size_t ncells, size_t nindices);
void corax_vtk_cell(corax_vtk *v, size_t npoints);
void corax_vtk_index(corax_vtk *v, size_t index);

/* POINT_DATA / CELL_DATA for n points or cells; the arrays that follow have
 * n tuples each. */
void corax_vtk_point_data(corax_vtk *v, size_t n);
void corax_vtk_cell_data(corax_vtk *v, size_t n);

/* One-component SCALARS (with the default lookup table), 3-component
 * double NORMALS, or a FIELD of narrays arrays each begun with
 * corax_vtk_array(). Names may not hold blanks (they become '_'). */
void corax_vtk_scalars(corax_vtk *v, const char *name, corax_vtk_type type);
void corax_vtk_normals(corax_vtk *v, const char *name);
void corax_vtk_field(corax_vtk *v, const char *name, size_t narrays);
void corax_vtk_array(corax_vtk *v, const char *name, int components, corax_vtk_type type);

/* Values of the current block, in order. */
void corax_vtk_double(corax_vtk *v, double x);
void corax_vtk_int(corax_vtk *v, long x);
void corax_vtk_vector(corax_vtk *v, corax_vec3 x);

/* Finish: CORAX_EARG (err says what) when a block did not get the values it
 * announced or a value could not be written as it must be (a non-finite
 * number, an index or integer beyond 32 bits), and nothing is left under
 * the real name; CORAX_EIO when writing failed. Frees v. */
corax_status corax_vtk_commit(corax_vtk *v, corax_error *err);

/* Abandon the file. Frees v; NULL allowed. */
void corax_vtk_discard(corax_vtk *v);

#ifdef __cplusplus
}
#endif
#endif
