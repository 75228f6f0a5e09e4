/* corax: the hole model. Desurvey by minimum curvature, azimuth corrections,
 * and position and direction at any depth down a hole.
 *
 * Depth is measured depth along the hole from the collar, in metres. All
 * angles are radians; plunge is positive downward (a surface hole drilled at
 * "dip -60" has plunge +60 degrees; an up-hole has negative plunge). */
#ifndef CORAX_SURVEY_H
#define CORAX_SURVEY_H

#include <stddef.h>

#include "corax/geometry.h"
#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* How a table states the dip of a hole. */
typedef enum corax_dip_convention {
    CORAX_DIP_NEGATIVE_DOWN = 0, /* -90..90, negative for a downward hole (default) */
    CORAX_DIP_POSITIVE_DOWN,     /* -90..90, positive for a downward hole */
    CORAX_DIP_FROM_VERTICAL      /* inclination 0..180 from straight down */
} corax_dip_convention;

/* Plunge (radians, positive down) of a dip given in degrees under a convention.
 * CORAX_EVALUE when the dip is outside the convention's range or not finite. */
corax_status corax_dip_to_plunge(double dip_degrees, corax_dip_convention convention,
                                 double *plunge);

/* The dip in degrees, under a convention, of a plunge in radians. */
double corax_plunge_to_dip(double plunge, corax_dip_convention convention);

/* A convention's name as the options spell it: "negative-down",
 * "positive-down", "from-vertical" ("unknown" for no convention). */
const char *corax_dip_convention_name(corax_dip_convention convention);

/* The collar: where the hole starts and, optionally, which way it was set up. */
typedef struct corax_collar {
    corax_vec3 position;   /* x east, y north, z up, metres */
    double azimuth;        /* radians, in the output frame (never corrected) */
    double plunge;         /* radians, positive down */
    int has_direction;     /* azimuth and plunge are known */
    double length;         /* hole length in metres; 0 or NaN when unknown */
} corax_collar;

/* One survey station, as read. */
typedef struct corax_station {
    double depth;   /* metres, >= 0 */
    double azimuth; /* radians, as surveyed; the hole adds its azimuth correction */
    double plunge;  /* radians, positive down */
    long line;      /* source line for messages, 0 when none */
    int has_errors; /* this station's own one-sigma errors below replace the run's */
    double azimuth_error, dip_error; /* radians, when has_errors */
} corax_station;

/* A station without errors of its own (has_errors 0). */
corax_station corax_station_make(double depth, double azimuth, double plunge, long line);

/* Where a queried depth falls, in increasing order of doubt. */
typedef enum corax_where {
    CORAX_WHERE_SURVEYED = 0,  /* between the collar and the last station */
    CORAX_WHERE_EXTRAPOLATED,  /* below the last station: straight on along its tangent */
    CORAX_WHERE_COLLAR_ONLY,   /* no stations: straight along the collar's direction */
    CORAX_WHERE_BEYOND_END     /* deeper than the length the collar records */
} corax_where;

/* A short name for each place: "ok", "extrapolated", "collar-only",
 * "beyond-end". */
const char *corax_where_name(corax_where where);

/* Position and direction of a hole at one depth. */
typedef struct corax_hole_point {
    corax_vec3 position; /* metres */
    corax_vec3 tangent;  /* unit vector down the hole (the drilling direction) */
    corax_where where;
} corax_hole_point;

typedef struct corax_hole corax_hole;

/* Desurvey a hole by minimum curvature.
 *
 * stations: any order, copied and sorted by depth; n may be 0 when the collar
 * has a direction. azimuth_correction (radians) is added to every station
 * azimuth: declination (magnetic to true) minus grid convergence (true to grid).
 * Above the first station the hole runs straight from the collar along the
 * collar's direction when it has one, else along the first station's.
 *
 * Errors: CORAX_EREPEAT for a repeated depth, CORAX_ESURVEY for a 180-degree
 * dogleg (err->line is the later station's line, the message names both), CORAX_EVALUE for a
 * negative or non-finite depth or angle, CORAX_ENOMEM. err may be NULL.
 * A hole with neither a station nor a collar direction is allowed: it has a
 * collar but no path, and corax_hole_at() answers CORAX_ENOTFOUND for it.
 * The caller owns *out and frees it with corax_hole_free(). */
corax_status corax_hole_new(const char *name, const corax_collar *collar,
                            const corax_station *stations, size_t n,
                            double azimuth_correction, corax_hole **out, corax_error *err);

/* Free a hole; NULL is allowed. */
void corax_hole_free(corax_hole *hole);

/* A hint, no more: start fetching what corax_hole_at() reads of the hole
 * (its header and the nodes' depths) into the processor's cache, for a look-up
 * a little later. hole may be NULL. */
void corax_hole_prefetch(const corax_hole *hole);

/* A hint, no more: start fetching the course that holds `depth` (metres),
 * once corax_hole_prefetch() has brought the hole near. hole may be NULL and
 * depth anything. */
void corax_hole_prefetch_course(const corax_hole *hole, double depth);

/* Position and tangent at a depth (metres). Interpolates on the arc between
 * stations. CORAX_EVALUE for a negative or non-finite depth.
 * hint (may be NULL) caches the last course used: pass the same size_t, set
 * to 0 at first, for a run of queries down one hole.
 * CORAX_ENOTFOUND when the hole has no path (no station, no collar direction):
 * the point then holds the collar position and a zero tangent. */
corax_status corax_hole_at(const corax_hole *hole, double depth, size_t *hint,
                           corax_hole_point *point);

const char *corax_hole_name(const corax_hole *hole);
const corax_collar *corax_hole_collar(const corax_hole *hole);

/* The recorded length, or the deepest station when the collar gives none. */
double corax_hole_length(const corax_hole *hole);

/* Number of stations as given (not counting the collar). */
size_t corax_hole_station_count(const corax_hole *hole);

/* Station i (sorted by depth) after the azimuth correction, with its desurveyed
 * position and the dogleg severity of the course that ends at it, in radians
 * per 30 m (NaN for the first station when the hole above it is straight).
 * CORAX_EARG when i is out of range. Any output pointer may be NULL. */
corax_status corax_hole_station(const corax_hole *hole, size_t i, corax_station *station,
                                corax_vec3 *position, double *dogleg_severity);

/* Why a depth down a hole is worth a point of its own. */
typedef enum corax_depth_kind {
    CORAX_DEPTH_STEP = 0, /* a whole multiple of the sampling step */
    CORAX_DEPTH_COLLAR,   /* depth 0 */
    CORAX_DEPTH_END,      /* the hole's length */
    CORAX_DEPTH_STATION   /* a survey station */
} corax_depth_kind;

typedef struct corax_hole_depth {
    double depth;          /* metres */
    corax_depth_kind kind;
    size_t station;        /* the station's index when kind is CORAX_DEPTH_STATION */
} corax_hole_depth;

/* The depths at which to sample a hole for plotting, modelling or export: the
 * collar, every whole multiple of `step` metres short of the end (none when
 * step is 0), every station and the end of the hole (corax_hole_length(), when
 * above 0), in increasing order. A depth is listed once; when two coincide
 * (within 1e-9 m) the higher kind is kept: station, then end, collar, step.
 * Sampling every few metres plus the stations lets a caller draw the path
 * through corax_hole_at() on the arc, never on chords between stations.
 *
 * *out is allocated (release it with free()) and *n gets its length.
 * CORAX_EARG for a negative or non-finite step, or a step that would give
 * more than CORAX_MAX_HOLE_POINTS points; CORAX_ENOMEM. */
enum { CORAX_MAX_HOLE_POINTS = 1000000 }; /* a million points down one hole is
                                             a mistaken step, not a plot */
corax_status corax_hole_depths(const corax_hole *hole, double step, corax_hole_depth **out,
                               size_t *n);

/* A drill program: holes looked up by name. */
typedef struct corax_program corax_program;

corax_program *corax_program_new(void);
void corax_program_free(corax_program *program);

/* Add a hole; the program takes ownership, also on failure. CORAX_EARG when a
 * hole of the same name is already there. */
corax_status corax_program_add(corax_program *program, corax_hole *hole);

/* The hole of that name (len bytes, need not be NUL-terminated), or NULL. */
const corax_hole *corax_program_find(const corax_program *program, const char *name,
                                     size_t len);

/* The position of the hole of that name in the program (as for
 * corax_program_hole()), or -1. */
long corax_program_index(const corax_program *program, const char *name, size_t len);

size_t corax_program_size(const corax_program *program);

/* Holes in the order they were added. */
const corax_hole *corax_program_hole(const corax_program *program, size_t i);

#ifdef __cplusplus
}
#endif
#endif
