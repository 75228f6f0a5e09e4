/* corax: the library over plain arrays, for programs in other languages (the
 * Python module in python/ calls it through ctypes) and for C programs that
 * hold their readings in arrays.
 *
 * Nothing here asks a caller to mirror a struct but corax_error: options
 * are the project file's words (corax_setup), a loaded program is an opaque
 * handle (corax_arrays), and depths, readings and results are rows of
 * doubles in the column order below, whose names corax_arrays_column()
 * gives. Angles are
 * degrees and lengths metres at this edge, as on the command line; an absent
 * value is NaN. Every input row gives an output row, in order. */
#ifndef CORAX_ARRAYS_H
#define CORAX_ARRAYS_H

#include <stddef.h>

#include "corax/load.h"
#include "corax/status.h"
#include "corax/survey.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- options, by the project file's words ---- */

typedef struct corax_setup corax_setup;

/* Every option at the command line's default. NULL when out of memory. */
corax_setup *corax_setup_new(void);

/* Free a setup; NULL is allowed. */
void corax_setup_free(corax_setup *setup);

/* Set one option by its project-file key, with its value written as in a
 * project file (numbers with a decimal point; angles in degrees):
 *   tables:  delimiter (comma, semicolon, tab, auto), decimal_mark (point,
 *            comma, auto), units (metres, feet), dip_convention
 *            (negative-down, positive-down, from-vertical), columns
 *            (NAME=HEADER,...); each also for one table, with collars_ or
 *            surveys_ before it (structures_units: the readings' depths)
 *   survey:  collar_station (yes, no), reject (HOLE@DEPTH,...), declination
 *            (degrees, or model), convergence (degrees, or projection), crs,
 *            local_grid, survey_date (YYYY-MM-DD), magnetic_model (a built-in
 *            name or a COF file), reference (magnetic, true, grid)
 *   core:    reference_line (bottom, top), beta_end and gamma_zero
 *            (down-hole, up-hole), beta_sense and gamma_sense (clockwise,
 *            anticlockwise), near_parallel, near_perpendicular, vertical_limit
 *   uncertainty: draws, seed, alpha_error, beta_error, line_error,
 *            gravity_error, depth_error (metres), azimuth_error, dip_error,
 *            azimuth_error_per_hole, dip_error_per_hole
 * A later value of a key replaces the earlier (reject and columns add to it).
 * CORAX_ENOTFOUND for a key corax does not know, CORAX_EVALUE for a value it
 * cannot take; err->message names the key and says why. */
corax_status corax_setup_set(corax_setup *setup, const char *key, const char *value,
                             corax_error *err);

/* ---- a program loaded from its tables ---- */

typedef struct corax_arrays corax_arrays;

/* Load the drill program of a collar and a survey table under the setup's
 * options (corax_program_load; a magnetic model and a CRS opened as the
 * setup asks). File-level faults and options that cannot work together
 * (convergence from a projection without a CRS) return their status with err
 * filled. Row faults do not: they are the program's findings (see
 * corax_arrays_finding()), and a careful caller refuses a program with a
 * finding of severity CORAX_ERROR, as the command line does. The caller owns
 * *out. */
corax_status corax_arrays_load(const corax_setup *setup, const char *collars,
                               const char *surveys, corax_arrays **out, corax_error *err);

/* Free a loaded program; NULL is allowed. */
void corax_arrays_free(corax_arrays *arrays);

/* The program itself, for the rest of the API (owned by the handle). */
const corax_program *corax_arrays_program(const corax_arrays *arrays);

/* The load's findings: how many, and finding i (-1 past the last, else its
 * corax_severity) with its file ("" when none), line (0 when none), hole (""
 * when none) and message; each output pointer may be NULL, and the strings
 * live as long as the handle. */
size_t corax_arrays_finding_count(const corax_arrays *arrays);
int corax_arrays_finding(const corax_arrays *arrays, size_t i, const char **file, long *line,
                         const char **hole, const char **message);

/* ---- the arrays' columns ---- */

/* A point down a hole (corax_arrays_desurvey). */
enum {
    CORAX_POINT_X, CORAX_POINT_Y, CORAX_POINT_Z, /* metres */
    CORAX_POINT_AZIMUTH,                         /* degrees, [0, 360) */
    CORAX_POINT_DIP,     /* degrees, in the surveys' dip convention */
    CORAX_POINT_PLUNGE,  /* degrees, positive down */
    CORAX_POINT_COLUMNS
};

/* Where a depth falls: corax_where's values, then three of its own. */
enum {
    CORAX_PLACE_NO_SURVEY = CORAX_WHERE_BEYOND_END + 1, /* no stations, no collar direction */
    CORAX_PLACE_UNKNOWN_HOLE,                           /* not in the collars */
    CORAX_PLACE_BAD_DEPTH,                              /* negative or not a number */
    CORAX_PLACE_COUNT
};

/* The word of a place: "ok", "extrapolated", "collar-only", "beyond-end",
 * "no-survey", "unknown-hole", "bad-depth" (as `corax trace --at` writes). */
const char *corax_arrays_place_name(int place);

/* A reading (corax_arrays_convert, corax_arrays_spread). */
enum {
    CORAX_READING_DEPTH,      /* in the units of structures_units (units), >= 0 */
    CORAX_READING_ALPHA, CORAX_READING_BETA, CORAX_READING_GAMMA,
    CORAX_READING_LINE_ALPHA, CORAX_READING_LINE_BETA,
    CORAX_READING_TURN,       /* degrees added to the canonical beta of an arbitrary
                                 line (see corax_reading), NaN for none */
    CORAX_READING_ARBITRARY,  /* non-zero: beta and line_beta run from a line drawn
                                 anywhere on the piece, not an orientation mark */
    CORAX_READING_COLUMNS
};

/* A converted reading, as `corax convert` writes it. */
enum {
    CORAX_RESULT_X, CORAX_RESULT_Y, CORAX_RESULT_Z,   /* metres */
    CORAX_RESULT_HOLE_AZIMUTH, CORAX_RESULT_HOLE_PLUNGE,
    CORAX_RESULT_DIP, CORAX_RESULT_DIP_DIRECTION, CORAX_RESULT_STRIKE,
    CORAX_RESULT_POLE_TREND, CORAX_RESULT_POLE_PLUNGE,
    CORAX_RESULT_NX, CORAX_RESULT_NY, CORAX_RESULT_NZ, /* the upward unit normal */
    CORAX_RESULT_TREND, CORAX_RESULT_PLUNGE,          /* the line */
    CORAX_RESULT_COLUMNS
};

/* A reading's own errors (corax_arrays_spread): one sigma, degrees (depth
 * in the readings' units); NaN for the setup's. */
enum {
    CORAX_ERRORS_ALPHA, CORAX_ERRORS_BETA, CORAX_ERRORS_LINE, CORAX_ERRORS_DEPTH,
    CORAX_ERRORS_COLUMNS
};

/* The spread of a reading over the draws (see corax_spread). */
enum {
    CORAX_SPREAD_DIP_SD, CORAX_SPREAD_DIP_DIRECTION_SD, CORAX_SPREAD_CONE95, /* degrees */
    CORAX_SPREAD_KAPPA,
    CORAX_SPREAD_POSITION_SD, /* metres */
    CORAX_SPREAD_DRAWS,       /* the draws that gave an answer */
    CORAX_SPREAD_COLUMNS
};

/* Which array's columns. */
typedef enum corax_arrays_kind {
    CORAX_ARRAYS_POINT, CORAX_ARRAYS_READING, CORAX_ARRAYS_RESULT, CORAX_ARRAYS_ERRORS,
    CORAX_ARRAYS_SPREAD
} corax_arrays_kind;

/* The name of column i of an array ("x", "depth", "dip_direction", ...; the
 * command line's column names), NULL past the last. */
const char *corax_arrays_column(corax_arrays_kind kind, size_t i);

/* ---- the jobs ---- */

/* Desurvey n depths: hole[i] (a name) at depth[i] (the units of `units`).
 * out gets n rows of CORAX_POINT_COLUMNS (NaN where nothing is known),
 * place[i] where the depth falls (CORAX_WHERE_..., CORAX_PLACE_...). */
void corax_arrays_desurvey(const corax_arrays *arrays, const corax_setup *setup, size_t n,
                           const char *const *hole, const double *depth, double *out,
                           int *place);

/* Convert n readings: hole[i] and the row of CORAX_READING_COLUMNS at
 * readings + i * CORAX_READING_COLUMNS, under the setup's core conventions.
 * out gets n rows of CORAX_RESULT_COLUMNS (NaN where the command line leaves
 * a blank), conditions[i] the conditions met (corax_condition_status() gives
 * the status word). Never fails. */
void corax_arrays_convert(const corax_arrays *arrays, const corax_setup *setup, size_t n,
                          const char *const *hole, const double *readings, double *out,
                          unsigned *conditions);

/* The note on one reading's conditions, as the command line's `note` column
 * (corax_result_note()): its length; buf gets "" when there is nothing to
 * say. */
size_t corax_arrays_note(const corax_arrays *arrays, const corax_setup *setup,
                         const char *hole, const double *reading, char *buf, size_t size);

/* The Monte Carlo of n readings (as convert --draws): every reading that
 * converts to a plane, a line or a dip is drawn the setup's `draws` times,
 * the holes each from its own stream (seed and hole name), a hole's readings
 * in their order; errors (may be NULL) holds n rows of CORAX_ERRORS_COLUMNS
 * over the setup's. A gravity-marked line takes the gravity error; an
 * arbitrary line (turned) takes only its line error. out gets n rows of
 * CORAX_SPREAD_COLUMNS, NaN for a reading not drawn (and, for a dip alone,
 * for its direction's columns). The result depends on which readings of a
 * hole are drawn together: give all of a hole's readings at once to have
 * the command line's answer. CORAX_EARG without draws (the key draws),
 * CORAX_EVALUE for a negative error, CORAX_ENOMEM. */
corax_status corax_arrays_spread(const corax_arrays *arrays, const corax_setup *setup, size_t n,
                                 const char *const *hole, const double *readings,
                                 const double *errors, double *out, corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
