/* corax: uncertainty carried by Monte Carlo from the surveys and the core
 * readings to every converted orientation and position.
 *
 * Each draw perturbs the hole's survey (a random error per station and a
 * systematic one per hole, shared by all its stations in that draw),
 * desurveys it again, and converts every reading of the hole with its own
 * perturbed depth, alpha and beta (beta takes the reading error and the
 * orientation line's error). Positions and orientations therefore share the
 * survey's errors, correlated as they are in a real hole.
 *
 * Reproducible: each hole's random numbers come from a generator seeded from
 * the run's seed and the hole's name, never from the thread that runs it. */
#ifndef CORAX_UNCERTAINTY_H
#define CORAX_UNCERTAINTY_H

#include <stddef.h>
#include <stdint.h>

#include "corax/convert.h"

#ifdef __cplusplus
extern "C" {
#endif

/* One-sigma errors. Angles in radians, depth in metres; 0 turns a source off. */
typedef struct corax_error_model {
    double alpha;         /* alpha reading */
    double beta;          /* beta reading */
    double line;          /* the orientation line itself (spin, misfit, marking) */
    double depth;         /* depth of the reading */
    double azimuth;       /* survey azimuth, random per station */
    double dip;           /* survey dip, random per station */
    double azimuth_hole;  /* survey azimuth, systematic per hole */
    double dip_hole;      /* survey dip, systematic per hole */
    double gravity;       /* the marking tool's sense of "down": a gravity-marked
                             orientation line takes a further error of
                             atan(sin(gravity) / sin(h)), h the hole's angle from
                             vertical (see corax_gravity_line_error()) */
} corax_error_model;

/* The defaults: alpha 2, beta 5, orientation line 5, depth 0.05 m, survey
 * azimuth 1 and dip 0.5 per station (common practice, from memory), per
 * hole azimuth 0.5 and dip 0.25 (from memory), and gravity 1 (from
 * memory). */
corax_error_model corax_error_model_default(void);

/* The error a gravity-marked orientation line takes from the marking tool's
 * error in sensing "down" (gravity, radians) in a hole at off_vertical
 * (radians) from vertical: the bottom of the hole is where gravity, projected
 * onto the core's cross-section, points; that projection has length sin h
 * (in units of g), so a sideways error of sin(gravity) turns it by
 *     atan(sin(gravity) / sin(h))
 * (derived): about the tool's own error in a flat hole, twice it at 30
 * degrees from vertical, 11.3 times at 5 degrees, and a quarter turn at
 * vertical. */
double corax_gravity_line_error(double gravity, double off_vertical);

/* The spread of one reading's results over the draws. */
typedef struct corax_spread {
    int has_orientation; /* a plane (or, without one, a line) was drawn */
    int is_plane;
    double dip_sd;           /* radians (planes) */
    double dip_direction_sd; /* radians, circular: sqrt(-2 ln Rbar) (planes) */
    double cone95;           /* radians: half-angle about the mean pole (or line)
                                holding 95% of the draws */
    double kappa;            /* Fisher precision (n - 1) / (n - R) of the draws */
    double position_sd;      /* metres: RMS 3-D scatter of the point */
    size_t draws;            /* draws that gave an answer */
} corax_spread;

/* One reading to simulate in a hole: what was read, its own errors (alpha,
 * beta, line, depth; the survey fields are not used here), and its plain
 * conversion, which fixes the hemisphere of the drawn poles. */
typedef struct corax_mc_reading {
    corax_reading reading;
    corax_error_model errors;
    corax_result nominal;
} corax_mc_reading;

/* Called for every draw of every reading (for a cloud of points): the reading's
 * index, the draw, the drawn point and the drawn plane (NULL for a line). */
typedef void (*corax_mc_draw_fn)(void *user, size_t reading, size_t draw,
                                 const corax_vec3 *position, const corax_plane *plane);

/* A workspace for one thread; reused hole after hole. */
typedef struct corax_mc corax_mc;
corax_mc *corax_mc_new(void);
void corax_mc_free(corax_mc *mc);

/* Simulate the n readings of one hole over `draws` draws. survey gives the
 * survey errors (its reading fields are not used). out[i] gets reading i's
 * spread. on_draw may be NULL. CORAX_ENOMEM, CORAX_EARG for draws == 0. */
corax_status corax_mc_hole(corax_mc *mc, const corax_hole *hole, const corax_mc_reading *readings,
                           size_t n, const corax_convert_options *options,
                           const corax_error_model *survey, size_t draws, uint64_t seed,
                           corax_spread *out, corax_mc_draw_fn on_draw, void *user);

/* The seed of a hole's generator, from the run's seed and the hole's name. */
uint64_t corax_mc_hole_seed(uint64_t seed, const char *hole, size_t stream);

#ifdef __cplusplus
}
#endif
#endif
