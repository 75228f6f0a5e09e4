/* corax: the Earth's main magnetic field from a spherical-harmonic model.
 *
 * The World Magnetic Model (WMM; NOAA NCEI and the British Geological Survey,
 * for the US National Geospatial-Intelligence Agency and the UK Defence
 * Geographic Centre; public domain) is built in: WMM2015 and its revision
 * WMM2015v2, WMM2020 and WMM2025, together covering 2015.0 to 2030.0. Other
 * models (an IGRF release for earlier dates, say) are read from coefficient
 * files in the COF layout. A model is evaluated to its full degree with its
 * secular variation, at a geodetic place on the WGS84 ellipsoid, and refuses a
 * date outside its validity rather than extrapolating.
 *
 * Dates are decimal years: 2025.5 is the middle of 2025 (see
 * corax_decimal_year()). Angles are radians; field strengths nanotesla. */
#ifndef CORAX_MAGNETIC_H
#define CORAX_MAGNETIC_H

#include <stddef.h>

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The highest degree corax evaluates (IGRF goes to 13, WMM to 12). */
#define CORAX_MAGNETIC_MAX_DEGREE 13

typedef struct corax_magnetic_model corax_magnetic_model;

/* The field at one place and date, in the geodetic frame of the place. */
typedef struct corax_magnetic_field {
    double north, east, down; /* X, Y, Z components, nT */
    double horizontal;        /* H, nT */
    double total;             /* F, nT */
    double declination;       /* D, radians, east of true north positive */
    double inclination;       /* I, radians, the field's dip: positive downward */
    const char *model;        /* the name of the model (or the part of a series)
                                 used; borrowed from the model */
} corax_magnetic_field;

/* The decimal year of a Gregorian date: year + (day of year - 1) / days in
 * the year, the WMM's own reckoning. NaN when the date does not exist (month
 * 13, 30 February). */
double corax_decimal_year(int year, int month, int day);

/* The date (at the day's start) holding a decimal year. */
void corax_year_date(double year, int *y, int *month, int *day);

/* That date as ISO 8601 text, "2026-07-14", in buf (at least 11 bytes; more
 * for years beyond four digits). */
void corax_date_text(double year, char *buf, size_t len);

/* Read an ISO 8601 calendar date, YYYY-MM-DD, optionally followed by a time
 * (THH:MM[:SS][Z], or a space and the same), which is ignored: the field moves
 * by well under a hundredth of a degree in a day. len bytes of text (need not
 * be NUL-terminated). The decimal year of the day's start, or NaN when the
 * text is not such a date. */
double corax_date_parse(const char *text, size_t len);

/* The names of the built-in models, in date order, NULL-ended: "WMM" (the
 * series: WMM2015v2 for 2015-2019, WMM2020 for 2020-2024, WMM2025 for
 * 2025-2029), "WMM2015", "WMM2015v2", "WMM2020", "WMM2025". */
extern const char *const corax_magnetic_builtin_names[];

/* 1 when name is a built-in model's name (case-insensitive), else 0. */
int corax_magnetic_is_builtin(const char *name);

/* A built-in model by name (case-insensitive). CORAX_ENOTFOUND for an unknown
 * name (the message lists the known ones), CORAX_ENOMEM. The caller owns *out
 * (corax_magnetic_model_free). */
corax_status corax_magnetic_builtin(const char *name, corax_magnetic_model **out,
                                    corax_error *err);

/* Read a coefficient file in the COF layout. Two forms are understood:
 * - the WMM's: a header line "EPOCH NAME DATE", then lines "n m g h gdot hdot"
 *   (nT and nT a year, Schmidt semi-normalised), ended by a line of 9s or the
 *   end of the file; valid from EPOCH for five years;
 * - the multi-model form of the IGRF releases: for each model a header line
 *   "NAME EPOCH NMAX NMAX_SV NMAX_ACC YEAR_MIN YEAR_MAX ALT_MIN ALT_MAX ..."
 *   (beginning with blanks) and its lines "n m g h [gdot hdot] ..."; between
 *   two epochs the coefficients are interpolated in time, after the last epoch
 *   carried on by its secular variation up to its YEAR_MAX.
 * Errors: CORAX_EIO (cannot open), CORAX_EFORMAT with err->line at the fault
 * (a line that is neither, a degree above CORAX_MAGNETIC_MAX_DEGREE, no
 * coefficients), CORAX_ENOMEM. The caller owns *out. */
corax_status corax_magnetic_read(const char *path, corax_magnetic_model **out, corax_error *err);

/* The same from lines of text in memory (n lines, each without its line
 * end); source names them in messages. */
corax_status corax_magnetic_parse(const char *const *lines, size_t n, const char *source,
                                  corax_magnetic_model **out, corax_error *err);

/* Free a model; NULL is allowed. */
void corax_magnetic_model_free(corax_magnetic_model *model);

/* The model's name: the built-in name, or the name in the file's header
 * (several names joined for a multi-model file). */
const char *corax_magnetic_model_name(const corax_magnetic_model *model);

/* The dates the model is valid for: from *from up to but not including *to
 * (decimal years). */
void corax_magnetic_model_validity(const corax_magnetic_model *model, double *from, double *to);

/* The same as text: "2025-01-01 to 2029-12-31" (the last day included). */
void corax_magnetic_validity_text(const corax_magnetic_model *model, char *buf, size_t len);

/* The field at a date (decimal year), a geodetic latitude and longitude
 * (radians, WGS84) and a height above the ellipsoid (metres).
 * CORAX_EVALUE when the date is outside the model's validity (the message
 * names the model and its dates), or the place is not finite or its latitude
 * beyond +-90 degrees. */
corax_status corax_magnetic_field_at(const corax_magnetic_model *model, double year,
                                     double latitude, double longitude, double height,
                                     corax_magnetic_field *out, corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
