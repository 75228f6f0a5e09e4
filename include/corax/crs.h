/* corax: where collars are on the Earth. A projected coordinate reference
 * system (through PROJ) gives latitude, longitude and the grid convergence at
 * an easting and northing; a local mine grid is a 2-D similarity (shift,
 * rotation, scale) of such a system.
 *
 * Sign conventions (radians inside, degrees at the edges):
 * - grid convergence: the angle from true north to grid north, positive when
 *   grid north lies east of (clockwise from) true north; a grid azimuth is the
 *   true azimuth minus the convergence;
 * - local grid rotation: the angle from the CRS's grid north to the local
 *   grid's north, positive clockwise; a local azimuth is the CRS grid azimuth
 *   minus the rotation. */
#ifndef CORAX_CRS_H
#define CORAX_CRS_H

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct corax_crs corax_crs;

/* A projected CRS from a definition PROJ understands, such as "EPSG:32608".
 * CORAX_ENOTFOUND when PROJ does not know it; CORAX_EVALUE when it is not a
 * projected CRS with axes in metres (a geographic CRS in degrees, a state
 * plane in feet), the message saying which; CORAX_ENOMEM. The caller owns
 * *out (corax_crs_free). One object serves one thread at a time. */
corax_status corax_crs_new(const char *definition, corax_crs **out, corax_error *err);

/* Free a CRS; NULL is allowed. */
void corax_crs_free(corax_crs *crs);

/* The CRS as given ("EPSG:32608") and its name ("WGS 84 / UTM zone 8N"). */
const char *corax_crs_definition(const corax_crs *crs);
const char *corax_crs_name(const corax_crs *crs);

/* The geodetic latitude and longitude (radians, on the CRS's own datum) and
 * the grid convergence (radians, sign above; the meridian convergence of
 * PROJ's factors) at an easting and northing (metres). Any output pointer may
 * be NULL. CORAX_EVALUE when the point is outside what the projection can
 * map, or not finite. */
corax_status corax_crs_locate(const corax_crs *crs, double easting, double northing,
                              double *latitude, double *longitude, double *convergence,
                              corax_error *err);

/* A local mine grid: a point at local (x, y) lies in the CRS at
 *   E = east + scale (x cos r + y sin r),  N = north + scale (-x sin r + y cos r),
 * r the rotation (radians, clockwise from CRS grid north to local north). */
typedef struct corax_local_grid {
    double east, north; /* the CRS coordinates of the local origin (0, 0), metres */
    double rotation;    /* radians */
    double scale;       /* CRS metres per local unit, > 0 */
} corax_local_grid;

/* The local grid through two points known in both: local (x1, y1) is CRS
 * (e1, n1), local (x2, y2) is (e2, n2). The rotation is the difference of the
 * bearings of the line between them; the scale, the ratio of its lengths.
 * CORAX_EVALUE when a value is not finite or the two points coincide on either
 * grid (within a millimetre). */
corax_status corax_local_grid_from_points(double x1, double y1, double e1, double n1,
                                          double x2, double y2, double e2, double n2,
                                          corax_local_grid *out, corax_error *err);

/* The local grid from its origin, rotation (radians) and scale. CORAX_EVALUE
 * for a value not finite or a scale not above 0. */
corax_status corax_local_grid_make(double east, double north, double rotation, double scale,
                                   corax_local_grid *out, corax_error *err);

/* Read either form: "x1,y1,E1,N1,x2,y2,E2,N2" (two points) or
 * "origin=E,N,rotation=DEG,scale=S" (rotation in degrees; scale may be left
 * out, 1). CORAX_EVALUE, with the message saying what is wrong. */
corax_status corax_local_grid_parse(const char *text, corax_local_grid *out, corax_error *err);

/* Local (x, y) to CRS (east, north), and back. */
void corax_local_grid_to_crs(const corax_local_grid *grid, double x, double y, double *east,
                             double *north);
void corax_local_grid_from_crs(const corax_local_grid *grid, double east, double north,
                               double *x, double *y);

#ifdef __cplusplus
}
#endif
#endif
