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

/* What the loader assumes about the tables. */
typedef struct corax_load_options {
    corax_table_format format;
    const corax_column_map *columns; /* may be NULL */
    corax_dip_convention dip_convention;
    double declination; /* degrees, magnetic to true: added to survey azimuths */
    double convergence; /* degrees, true to grid: subtracted from survey azimuths */
    int repair;         /* leave out a repeated or reversing station and keep the
                           hole (each still a finding), instead of the hole */
    const corax_corrector *corrector; /* may be NULL: declination - convergence above
                           for every station. Else the azimuth corrections per
                           station (see correction.h), which replace them */
    corax_corrections *corrections;   /* may be NULL: each station's correction is
                           appended, and the list sorted for corax_corrections_find() */
} corax_load_options;

/* Defaults: comma-separated, dip negative down, no azimuth correction. */
corax_load_options corax_load_options_default(void);

/* Read a collar table (hole, x, y, z; optional azimuth, dip, length, date,
 * latitude, longitude) and a survey table (hole, depth, azimuth, dip;
 * optional azimuth_error, dip_error, date, reference, total_field, field_dip)
 * and desurvey every hole, each station's azimuth corrected as the corrector
 * says (its date: its own, else its collar's, else the corrector's; its north:
 * its reference, else the corrector's). Dates are ISO 8601; a date or place
 * that cannot be read is a fault only when a magnetic model needs it.
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
 * had is a finding too (collar-place, survey-correction). The caller owns
 * *out. */
corax_status corax_program_load(const char *collars_path, const char *surveys_path,
                                const corax_load_options *options, corax_program **out,
                                corax_findings *problems, corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
