/* corax: converting one core reading at a depth down a hole into a located,
 * true orientation, with the conditions that limit how far it can be trusted. */
#ifndef CORAX_CONVERT_H
#define CORAX_CONVERT_H

#include <stddef.h>

#include "corax/core.h"
#include "corax/survey.h"

#ifdef __cplusplus
extern "C" {
#endif

/* What a conversion assumes. */
typedef struct corax_convert_options {
    corax_core_conventions conventions;
    double near_parallel;      /* radians: alpha below this is flagged (default 10 deg) */
    double near_perpendicular; /* radians: alpha above this is flagged (default 80 deg) */
    double vertical_limit;     /* radians: a hole this close to vertical has no usable
                                  bottom-of-hole line (default 5 deg) */
} corax_convert_options;

/* The defaults above, with the default conventions. */
corax_convert_options corax_convert_options_default(void);

/* One reading from a core log. Angles in radians, NaN when absent. */
typedef struct corax_reading {
    double depth;                 /* metres down the hole */
    double alpha, beta, gamma;    /* a plane, and optionally a line on it */
    double line_alpha, line_beta; /* a line measured on its own */
    int arbitrary_line;           /* beta and line_beta run from a line drawn anywhere
                                     on the piece (a run without an orientation mark):
                                     unoriented unless turned */
    double turn;                  /* radians, NaN when none: the turn about the core
                                     axis that orients an arbitrary line (added to
                                     the canonical beta; see corax_turn_fit()) */
} corax_reading;

/* A reading with every angle absent (NaN) at depth 0, its line not
 * arbitrary and no turn. */
corax_reading corax_reading_empty(void);

/* Conditions met by a conversion, as bits; the status of a row is the most
 * serious one present (lowest bit first), "converted" when none. */
enum {
    CORAX_COND_INVALID = 1u << 0,            /* "invalid": a value cannot be used */
    CORAX_COND_UNKNOWN_HOLE = 1u << 1,       /* "unknown-hole": not in the collars */
    CORAX_COND_NO_SURVEY = 1u << 2,          /* "no-survey": no stations, no collar direction */
    CORAX_COND_NO_REFERENCE = 1u << 3,       /* "no-reference-line": a line in a hole
                                                near vertical */
    CORAX_COND_UNORIENTED = 1u << 4,         /* "unoriented": alpha without beta, or beta
                                                from an arbitrary line not turned */
    CORAX_COND_DIP_ONLY = 1u << 5,           /* "dip-only": a plane in a hole near vertical:
                                                alpha gives the dip, nothing its direction */
    CORAX_COND_BY_REFERENCE = 1u << 6,       /* "oriented-by-reference": an arbitrary line
                                                turned to fit a reference */
    CORAX_COND_BEYOND_END = 1u << 7,         /* "beyond-end": deeper than the hole */
    CORAX_COND_COLLAR_ONLY = 1u << 8,        /* "collar-only": no downhole survey */
    CORAX_COND_EXTRAPOLATED = 1u << 9,       /* "extrapolated": below the last station */
    CORAX_COND_NEAR_PARALLEL = 1u << 10,     /* "near-parallel": low alpha */
    CORAX_COND_NEAR_PERPENDICULAR = 1u << 11, /* "near-perpendicular": high alpha */
    CORAX_COND_COUNT = 12
};

/* The status word of a set of conditions. */
const char *corax_condition_status(unsigned conditions);

/* The status word of one condition bit index (0 .. CORAX_COND_COUNT-1). */
const char *corax_condition_name(unsigned index);

/* What a conversion found. */
typedef struct corax_result {
    unsigned conditions;
    int located;             /* point holds a position and a hole direction */
    corax_hole_point point;
    int has_plane;
    corax_vec3 normal;       /* upward unit normal */
    corax_plane plane;       /* with CORAX_COND_DIP_ONLY (has_plane 0): plane.dip alone,
                                90 - alpha */
    int has_line;
    corax_vec3 line;         /* unit, lower hemisphere */
    double trend, plunge;
    const char *invalid;     /* when the reading's values cannot be used: a static
                                printf format with at most one %g, else NULL */
    double invalid_value;    /* the value it names (degrees or metres) */
} corax_result;

/* Convert a reading. hole NULL means the hole is unknown. hint caches the
 * hole's course for runs of readings down one hole (see corax_hole_at). Never
 * fails: what it could not do is in out->conditions. */
void corax_convert_reading(const corax_hole *hole, const corax_reading *reading,
                           const corax_convert_options *options, size_t *hint,
                           corax_result *out);

/* Only place a depth on a hole: out gets the position and direction and the
 * conditions of the place (unknown-hole, no-survey, beyond-end, collar-only,
 * extrapolated), nothing else. A negative or NaN depth leaves it unlocated. */
void corax_convert_locate(const corax_hole *hole, double depth, size_t *hint,
                          corax_result *out);

/* A plain-words note on a result's conditions, for the `note` column:
 * "alpha 6.5 is below 10: ..." and so on, joined by "; ". Returns its
 * length; buf gets "" when there is nothing to say. */
size_t corax_result_note(const corax_result *result, const corax_reading *reading,
                         const corax_hole *hole, const corax_convert_options *options,
                         char *buf, size_t size);

#ifdef __cplusplus
}
#endif
#endif
