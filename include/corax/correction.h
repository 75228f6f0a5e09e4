/* corax: the azimuth corrections of survey stations, per station.
 *
 * A survey azimuth is read from magnetic north (a compass or magnetometer),
 * true north (a north-seeking gyro) or grid north (a tool aligned on the
 * grid). The collars' coordinates, and so every result, are on a grid: a
 * projected CRS, or a local mine grid defined on one. The correction added to
 * a survey azimuth to bring it onto that grid is
 *
 *     magnetic:  declination - convergence - rotation
 *     true:                  - convergence - rotation
 *     grid:      0
 *
 * with declination east of true north positive (from a magnetic model at the
 * station's date and place, or a constant), convergence the angle from true
 * north to the CRS's grid north (positive when grid north lies east of true
 * north; from the projection at the collar, or a constant), and rotation the
 * angle from the CRS's grid north to the local grid's north (positive
 * clockwise; 0 without a local grid). Angles in radians. */
#ifndef CORAX_CORRECTION_H
#define CORAX_CORRECTION_H

#include <stddef.h>

#include "corax/crs.h"
#include "corax/geometry.h"
#include "corax/magnetic.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The north a survey azimuth is read from. */
typedef enum corax_north {
    CORAX_NORTH_MAGNETIC = 0, /* a compass or magnetometer (the default) */
    CORAX_NORTH_TRUE,         /* a north-seeking gyro */
    CORAX_NORTH_GRID          /* the grid of the collar coordinates */
} corax_north;

/* "magnetic", "true", "grid". */
const char *corax_north_name(corax_north north);

/* One of those words (without regard to case; len bytes, need not be
 * NUL-terminated): 0 with *out set, or -1. */
int corax_north_parse(const char *text, size_t len, corax_north *out);

/* Where the corrections come from. Borrowed pointers must outlive its use. */
typedef struct corax_corrector {
    double declination;                 /* radians east; when model is NULL */
    const corax_magnetic_model *model;  /* declination from the model, or NULL */
    double convergence;                 /* radians; when convergence_from_crs is 0 */
    int convergence_from_crs;           /* convergence from crs at each collar */
    const corax_crs *crs;               /* the CRS of the collar coordinates (or of
                                           the local grid's CRS side), or NULL */
    const corax_local_grid *local_grid; /* the collars are on this local grid, or NULL */
    double date;                        /* decimal year of stations without a date
                                           of their own, NaN when none */
    corax_north north;                  /* the north of stations without one of
                                           their own */
} corax_corrector;

/* No correction at all: declination and convergence 0, no model, no CRS, no
 * local grid, no date, magnetic north. */
corax_corrector corax_corrector_default(void);

/* A hole's place, found once from its collar. */
typedef struct corax_site {
    double latitude, longitude; /* radians; NaN when unknown (not needed without a model) */
    double height;              /* metres above the ellipsoid: the collar's elevation */
    double convergence;         /* radians, the grid convergence there */
    double rotation;            /* radians, the local grid's rotation (0 without one) */
    double east, north;         /* the collar in the CRS, metres (NaN without a CRS) */
} corax_site;

/* The site of a collar at `position` (its coordinates, on the local grid when
 * there is one). latitude and longitude (radians) given directly (a collar
 * table's own columns) are used as they are; pass NaN to have them from the
 * CRS. CORAX_EVALUE when a model needs a place that cannot be had (no CRS and
 * no latitude and longitude; a point the CRS cannot map), or convergence is to
 * come from a CRS that is not there. */
corax_status corax_corrector_site(const corax_corrector *c, corax_vec3 position,
                                  double latitude, double longitude, corax_site *out,
                                  corax_error *err);

/* What was added to one station's azimuth, and why. */
typedef struct corax_correction {
    double date;        /* decimal year used (NaN when none was needed or given) */
    corax_north north;  /* the north the station was read from */
    double declination; /* radians, applied (0 unless magnetic) */
    double convergence; /* radians, applied (0 for grid) */
    double rotation;    /* radians, applied (0 for grid) */
    double total;       /* radians added to the azimuth: declination - convergence
                           - rotation */
    corax_magnetic_field field; /* the model's field at the station (all NaN and
                                   model NULL without a model, or when not magnetic) */
} corax_correction;

/* The correction of a station read from `north` on `date` (a decimal year;
 * NaN: the corrector's date) at a site. CORAX_EVALUE when a model is to give
 * the declination and there is no date, or the date is outside the model's
 * validity (the message says so and names the model's dates). */
corax_status corax_corrector_station(const corax_corrector *c, const corax_site *site,
                                     double date, corax_north north, corax_correction *out,
                                     corax_error *err);

/* Every station's correction as the loader applied it, with the survey's
 * measured field when the survey table gives it, for the record (trace) and
 * the QA (check). Zero-initialise; free with corax_corrections_clear(). */
typedef struct corax_station_record {
    char *hole;            /* owned */
    double depth;          /* metres */
    long line;             /* the survey table's line */
    double azimuth;        /* radians, as surveyed (before the correction) */
    corax_site site;
    corax_correction correction;
    double total_field;    /* measured, nT; NaN when not given */
    double field_dip;      /* measured, radians, positive down; NaN when not given */
} corax_station_record;

typedef struct corax_corrections {
    corax_station_record *item;
    size_t count, capacity;
    int sorted;            /* set by corax_corrections_sort() */
} corax_corrections;

/* Append a record (the hole name is copied). CORAX_ENOMEM. */
corax_status corax_corrections_add(corax_corrections *list, const char *hole,
                                   const corax_station_record *record);

/* Sort by hole name, then line, for corax_corrections_find(). */
void corax_corrections_sort(corax_corrections *list);

/* The record of a hole's station at a survey line (after sorting), or NULL. */
const corax_station_record *corax_corrections_find(const corax_corrections *list,
                                                   const char *hole, long line);

/* Free the records and empty the list. */
void corax_corrections_clear(corax_corrections *list);

#ifdef __cplusplus
}
#endif
#endif
