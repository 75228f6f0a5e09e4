/* corax: vector files for GIS, CAD and modelling packages, written through
 * GDAL/OGR (GeoPackage, GeoJSON, DXF, shapefiles and every other OGR vector
 * driver that can create files). corax never writes these formats itself:
 * this module only lays out layers and features and hands them to OGR.
 *
 * A file holds named layers of 3-D points or 3-D line strings, each feature
 * with typed attributes. CAD drivers (DXF) have one layer of entities with a
 * fixed schema: there every feature goes into that layer with its logical
 * layer's name as the entity's layer (so a CAD package shows "structures",
 * "traces", ... as its layers) and the attributes are left out.
 *
 * The file appears under its real name only when committed whole: OGR
 * writes into a private folder beside it, and the commit moves what it
 * wrote into place. GDAL's messages never reach the terminal: they come
 * back in the error record. */
#ifndef CORAX_GIS_H
#define CORAX_GIS_H

#include <stddef.h>

#include "corax/geometry.h"
#include "corax/output.h"
#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_gis corax_gis;

typedef enum corax_gis_type {
    CORAX_GIS_TEXT = 0,
    CORAX_GIS_REAL,    /* a double; NaN is written as null */
    CORAX_GIS_INTEGER  /* 64-bit */
} corax_gis_type;

typedef struct corax_gis_field {
    const char *name;
    corax_gis_type type;
} corax_gis_field;

typedef enum corax_gis_shape {
    CORAX_GIS_POINTS = 0, /* PointZ */
    CORAX_GIS_LINES       /* LineStringZ, or LineStringZM with measures */
} corax_gis_shape;

/* GDAL is loaded at the first call of a function below that needs it (its
 * libraries are not loaded with corax's). */

/* The OGR driver for a format name: gpkg, geojson, dxf and shp stand for
 * GPKG, GeoJSON, DXF and "ESRI Shapefile"; any other name is taken as an
 * OGR driver's own short name (any case). NULL when this machine's GDAL
 * has no such driver, or it cannot create vector files, or GDAL cannot be
 * loaded. */
const char *corax_gis_driver(const char *format);

/* Whether a format name is one of corax's short names (gpkg, geojson, dxf,
 * shp). */
int corax_gis_known_format(const char *format);

/* The short names of every OGR driver on this machine that creates vector
 * files, separated by ", ", into buf (cut to fit); "none" and why, when
 * GDAL cannot be loaded. */
void corax_gis_drivers(char *buf, size_t len);

/* NULL when GDAL is there to write GIS files; else why not (it cannot be
 * loaded, or lacks a function corax calls). */
const char *corax_gis_unavailable(void);

/* GDAL's release name, such as "3.6.2" ("none (not loaded)" without it):
 * GDAL's own text, good until GDAL is asked for its version again. */
const char *corax_gis_gdal_version(void);

/* Create a file (or, for drivers that write folders, a folder) at path with
 * the driver of `format`, with the coordinate reference system crs attached
 * to every layer (anything GDAL takes as a user definition, such as
 * "EPSG:28355"; NULL for none). Errors: CORAX_ENOTFOUND when there is no
 * such driver (err says whether the name is unknown or the driver absent),
 * CORAX_EARG for a CRS GDAL does not know or a geographic one (corax's
 * coordinates are metres), CORAX_EIO when the file cannot be made. GDAL
 * writes into a private folder beside path (corax_outputs_folder()); with a
 * set (may be NULL), corax_gis_commit() leaves it to the set to publish with
 * the run's other files. */
corax_status corax_gis_open(corax_outputs *set, const char *path, const char *format,
                            const char *crs, corax_gis **out, corax_error *err);

/* 1 when the driver keeps measures (M) on line vertices. */
int corax_gis_measured(const corax_gis *g);

/* 1 for a CAD driver (one layer of entities, no attributes). */
int corax_gis_cad(const corax_gis *g);

/* The driver's name as OGR spells it. */
const char *corax_gis_driver_name(const corax_gis *g);

/* Make a layer named `name` with n fields; *layer gets its number for
 * corax_gis_feature(). measured asks for measures on lines (only when
 * corax_gis_measured()). CORAX_EARG when a layer of that name (any case)
 * is already in the file, or the driver holds no further layer (one layer
 * per file: err says so); CORAX_EIO when OGR refuses it. */
corax_status corax_gis_layer(corax_gis *g, const char *name, corax_gis_shape shape,
                             int measured, const corax_gis_field *fields, size_t n,
                             int *layer, corax_error *err);

/* Begin a feature of a layer: every field null and no geometry, until set. */
corax_status corax_gis_feature(corax_gis *g, int layer);

/* Set field i of the current feature. NaN reals are null. */
void corax_gis_real(corax_gis *g, size_t field, double value);
void corax_gis_integer(corax_gis *g, size_t field, long long value);
void corax_gis_text(corax_gis *g, size_t field, const char *text, size_t length);

/* The geometry of the current feature: a point, or a line string through n
 * points with measures m (NULL: none). A line with the same first and last
 * point is closed (a ring in CAD). */
void corax_gis_point(corax_gis *g, corax_vec3 p);
void corax_gis_line(corax_gis *g, const corax_vec3 *p, const double *m, size_t n);

/* Write the current feature (in CAD, one without geometry is left out: it
 * has nothing to draw). CORAX_EIO (err gives OGR's message). */
corax_status corax_gis_write(corax_gis *g, corax_error *err);

/* Close the file and move it into place under its real name. CORAX_EIO when
 * OGR or the move fails (nothing is left under the real name then; a folder
 * already there and not empty is not replaced). Frees g. */
corax_status corax_gis_commit(corax_gis *g, corax_error *err);

/* Abandon the file, removing what was written. Frees g; NULL allowed. */
void corax_gis_discard(corax_gis *g);

#ifdef __cplusplus
}
#endif
#endif
