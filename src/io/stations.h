/* The columns of collars and surveys that the azimuth corrections use, and
 * the corrections of one hole's stations (internal to io/load.c). */
#ifndef CORAX_IO_STATIONS_H
#define CORAX_IO_STATIONS_H

#include "corax/correction.h"
#include "corax/finding.h"
#include "corax/survey.h"
#include "corax/table.h"

/* The collar table's optional columns, after its own: date, latitude,
 * longitude (degrees). */
#define CORAX_COLLAR_PLACE_COLUMNS "date", "latitude", "longitude"
enum { CORAX_COLLAR_PLACE_NCOL = 3 };

typedef struct corax_collar_place {
    double date;                 /* decimal year, NaN when none */
    double latitude, longitude;  /* radians, NaN when none */
} corax_collar_place;

/* The survey table's optional columns, after its own: date, reference
 * (magnetic, true or grid), total_field (nT), field_dip (degrees). */
#define CORAX_STATION_EXTRA_COLUMNS "date", "reference", "total_field", "field_dip"
enum { CORAX_STATION_EXTRA_NCOL = 4 };

typedef struct corax_station_extra {
    double date;                 /* decimal year, NaN when none */
    int north;                   /* a corax_north, or -1 when the row gives none */
    double total_field;          /* nT, NaN when none */
    double field_dip;            /* radians, NaN when none */
} corax_station_extra;

/* Read them from a row (col: the columns' indexes, -1 when absent). A date or
 * place that cannot be read is a fault only when the model needs it (`strict`),
 * else left unknown. 1 ok; 0 with why filled. */
int corax_read_collar_place(const corax_row *row, const long *col, char decimal, int strict,
                            corax_collar_place *out, char *why, size_t whylen);
int corax_read_station_extra(const corax_row *row, const long *col, char decimal, int strict,
                             corax_station_extra *out, char *why, size_t whylen);

/* Correct the azimuths of a hole's n stations (in place) as the corrector
 * says, appending each station's record to `record` (may be NULL). A collar
 * whose place cannot be had becomes a finding at cline of cpath and *n is set
 * to 0 with *ok 0; a station whose correction cannot be had becomes a finding
 * at its line of spath and is left out (st, extra and *n shrink). */
corax_status corax_correct_stations(const corax_corrector *c, const char *hole,
                                    const corax_collar *collar, const corax_collar_place *place,
                                    const char *cpath, long cline, corax_station *st,
                                    corax_station_extra *extra, size_t *n, const char *spath,
                                    corax_corrections *record, corax_findings *problems,
                                    int *ok);

#endif
