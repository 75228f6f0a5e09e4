/* corax: building a drill program from its collar and survey tables. */
#ifndef CORAX_LOAD_H
#define CORAX_LOAD_H

#include "corax/correction.h"
#include "corax/finding.h"
#include "corax/survey.h"
#include "corax/table.h"

#ifdef __cplusplus
extern "C" {
#endif

/* A survey station to leave out, named by hole and depth. */
typedef struct corax_station_ref {
    const char *hole;
    double depth; /* in the unit of the survey table */
} corax_station_ref;

/* Stations to leave out from their text, "QC003@120,QC004@36.5" (blanks
 * around a hole's name are not part of it): each appended to *refs (*n of
 * them, the array grown with realloc), its hole a new string the caller
 * frees. CORAX_EVALUE with the item that is not HOLE@DEPTH in err (which
 * names no file), or CORAX_ENOMEM; the items before it are kept. */
corax_status corax_station_refs_parse(const char *text, corax_station_ref **refs, size_t *n,
                                      corax_error *err);

/* What the loader assumes about the tables. */
typedef struct corax_load_options {
    corax_table_settings collars, surveys;
    corax_dip_convention collar_dip, survey_dip; /* each table's dip convention */
    double declination; /* degrees, magnetic to true: added to survey azimuths */
    double convergence; /* degrees, true to grid: subtracted from survey azimuths */
    int repair;         /* leave out a repeated or reversing station and keep the
                           hole (each still a finding), instead of the hole */
    int collar_station; /* a collar with a direction whose first station lies
                           deeper is a station at depth 0: the hole curves from
                           the set-up to the first station (minimum curvature)
                           instead of running straight */
    const corax_station_ref *reject; /* stations left out (also a survey table's */
    size_t nreject;                  /* `use` column saying no) */
    const corax_corrector *corrector; /* may be NULL: declination - convergence above
                           for every station. Else the azimuth corrections per
                           station (see correction.h), which replace them */
    corax_corrections *corrections;   /* may be NULL: each station's correction is
                           appended, and the list sorted for corax_corrections_find() */
} corax_load_options;

/* Defaults: formats found from the tables, metres, dip negative down, no
 * azimuth correction, no station left out. */
corax_load_options corax_load_options_default(void);

/* What the load found: each table's format and what it skipped, and how many
 * stations were left out on request. */
typedef struct corax_load_info {
    corax_table_info collars, surveys;
    size_t rejected;
} corax_load_info;

/* Read a collar table (hole, x, y, z; optional azimuth, dip, length, date,
 * latitude, longitude) and a survey table (hole, depth, azimuth, dip;
 * optional azimuth_error, dip_error, use, date, reference, total_field,
 * field_dip) and desurvey every hole, each station's azimuth corrected as the
 * corrector says (its date: its own, else its collar's, else the corrector's;
 * its north: its reference, else the corrector's). Dates are ISO 8601; a
 * date or place that cannot be read is a fault only when a magnetic model
 * needs it. Lengths become metres by each table's unit.
 *
 * A dip that does not fit its table's convention (a from-vertical inclination
 * of -60, a negative-down dip of 120) is a row fault naming the convention.
 * Stations left out on request (options->reject, or `use` no) are notes in
 * *problems; a reject naming no station is an error there.
 *
 * File-level faults (cannot open, missing required column, repeated header
 * name, broken quoting) stop the load: the status is returned, err says where.
 * Row-level faults do not stop it: each becomes a finding in *problems
 * (severity error for a row or hole that could not be used, warning for
 * surveys of a hole with no collar), and the rest of the program is loaded.
 * A hole with a fault in its survey (a repeated depth, a 180-degree turn) is
 * left out of the program, its collar alone not standing in for it; with
 * options->repair the offending later station is left out instead, and the
 * hole kept. A collar whose place, or a station whose correction, cannot be
 * had is a finding too (collar-place, survey-correction). info (may be NULL)
 * gets what the load found. The caller owns
 * *out. */
corax_status corax_program_load(const char *collars_path, const char *surveys_path,
                                const corax_load_options *options, corax_program **out,
                                corax_findings *problems, corax_load_info *info,
                                corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
