/* corax: orientation where the core has none.
 *
 * 1. Alpha-only solutions. A plane read by alpha alone in a hole has its
 *    normal at 90 - alpha from the core axis: on a cone (a small circle on the
 *    net) about the hole's direction at the reading. Parallel planes (one
 *    "set": a marker bed, a vein set) read in several non-parallel holes fix
 *    the normal where their cones meet. Two holes give up to four meeting
 *    places (usually two); three or more holes give a least-squares solution
 *    (Harrison and Hudson 2000, Engineering Rock Mechanics part 2, section 7,
 *    for the construction on the net).
 * 2. Orientation by reference. A run of core whose betas were measured from an
 *    arbitrary line (no orientation mark) is turned about the core axis by the
 *    angle that best fits its readings of a feature to a known orientation of
 *    that feature.
 *
 * Angles are radians, vectors unit vectors in the world frame (x east, y
 * north, z up). Pure math: nothing here prints or reads files. */
#ifndef CORAX_SOLVE_H
#define CORAX_SOLVE_H

#include <stddef.h>
#include <stdint.h>

#include "corax/core.h"
#include "corax/status.h"
#include "corax/survey.h"
#include "corax/uncertainty.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- alpha-only solutions ---- */

/* One alpha-only reading as a cone: the hole's direction at the reading and
 * its alpha. Readings with the same `hole` number are in one hole. */
typedef struct corax_cone {
    corax_vec3 axis; /* unit, down the hole (either sense will do) */
    double alpha;    /* [0, pi/2] */
    size_t hole;     /* any number naming the hole */
} corax_cone;

/* What was found for a set, in order of precedence. */
typedef enum corax_solve_status {
    CORAX_SOLVE_SOLVED = 0,  /* "solved": one plane fits best */
    CORAX_SOLVE_AMBIGUOUS,   /* "ambiguous": several planes fit as well as the best
                                (see alpha_error); every one is listed, best first */
    CORAX_SOLVE_PARALLEL,    /* "parallel-holes": the holes' axes are all within
                                parallel_limit of one another */
    CORAX_SOLVE_ONE_HOLE,    /* "one-hole": every reading is in one hole */
    CORAX_SOLVE_ONE_READING, /* "one-reading": a single reading */
    CORAX_SOLVE_NO_READINGS  /* "no-readings": nothing usable */
} corax_solve_status;

/* The status word of each status. */
const char *corax_solve_status_name(corax_solve_status status);

typedef struct corax_solve_options {
    double parallel_limit; /* holes whose axes are all this close (axially) are too
                              near parallel to solve (default 15 deg) */
    double alpha_error;    /* one-sigma error of alpha (default 2 deg). A plane fits
                              as well as the best when n (misfit^2 - best^2) is
                              within 5.99 alpha_error^2, the 95% point of
                              chi-square with two degrees of freedom: the planes
                              a 95% confidence region of the least-squares fit
                              holds (derived; at least 1e-6 is used) */
} corax_solve_options;

corax_solve_options corax_solve_options_default(void);

/* Most candidates a set can have: two holes give at most four. */
enum { CORAX_SOLVE_MAX = 8 };

/* One plane that fits the set. */
typedef struct corax_solution {
    corax_vec3 normal;  /* upward unit normal */
    corax_plane plane;
    double misfit;      /* RMS over the readings of (the angle between the normal
                           and the core axis) - (90 - alpha) */
    double cone95;      /* half-angle holding 95% of the Monte Carlo solutions
                           about their mean; NaN until corax_solve_draws() */
    size_t draws;       /* Monte Carlo draws that gave a solution */
} corax_solution;

typedef struct corax_solve_result {
    corax_solve_status status;
    size_t readings;     /* readings used */
    size_t holes;        /* different holes among them */
    double hole_spread;  /* the largest angle between two holes' mean axes
                            (axial, [0, pi/2]); 0 for one hole */
    double flatness;     /* the largest angle of a hole's mean axis from the
                            plane that fits the axes best ([0, pi/2]): near 0
                            the axes lie in one plane and its mirror image fits
                            as well; NaN below three holes */
    size_t ncandidates;
    corax_solution candidate[CORAX_SOLVE_MAX]; /* best first */
} corax_solve_result;

/* Solve one set from n cones. Never fails on the data: what it could not do
 * is the status. CORAX_ENOMEM, or CORAX_EARG for an alpha outside [0, pi/2]
 * or a zero axis. */
corax_status corax_solve_cones(const corax_cone *cones, size_t n,
                               const corax_solve_options *options, corax_solve_result *out);

/* Polish a plane's normal against the cones by least squares, starting from
 * `start` (a local fit: Levenberg-Marquardt on the sphere). *normal gets the
 * upward unit normal, *misfit (may be NULL) the RMS misfit. */
void corax_solve_refine(const corax_cone *cones, size_t n, corax_vec3 start,
                        corax_vec3 *normal, double *misfit);

/* The angle (signed: positive when the normal lies outside the cone) between a
 * cone and a plane's normal: angle(normal, axis) - (90 - alpha), the axis
 * taken either way. */
double corax_cone_residual(const corax_cone *cone, corax_vec3 normal);

/* An alpha-only reading down a surveyed hole, for the uncertainty. */
typedef struct corax_solve_reading {
    const corax_hole *hole; /* with a path */
    double depth;           /* metres, >= 0 */
    double alpha;           /* [0, pi/2] */
    double alpha_error;     /* one-sigma, radians */
    double depth_error;     /* one-sigma, metres */
} corax_solve_reading;

/* The cones of the readings in their holes as surveyed (hole numbers by hole
 * identity). CORAX_EVALUE when a reading cannot be placed (no path, a bad
 * depth); *bad (may be NULL) gets its index. */
corax_status corax_solve_place(const corax_solve_reading *readings, size_t n, corax_cone *cones,
                               size_t *bad);

/* The uncertainty of every candidate of `result` (the solution of these
 * readings' cones) by Monte Carlo: each draw resurveys every hole of the set
 * with the survey errors (azimuth, dip per station and per hole, as in
 * corax_mc_hole()), moves each reading by its depth and alpha errors, and
 * polishes each candidate from where it was found. Fills each candidate's
 * cone95 and draws. seed: the set's own (see corax_mc_hole_seed()).
 * CORAX_ENOMEM, CORAX_EARG for draws == 0. */
corax_status corax_solve_draws(const corax_solve_reading *readings, size_t n,
                               const corax_error_model *survey, size_t draws, uint64_t seed,
                               corax_solve_result *result);

/* ---- orientation by reference ---- */

/* One reading of a run whose betas are measured from an arbitrary line. */
typedef struct corax_turn_reading {
    corax_core_frame frame; /* the hole's frame at the reading */
    double alpha;           /* [0, pi/2] */
    double beta;            /* canonical (see corax_core_beta_canonical()), from
                               the arbitrary line */
    corax_vec3 reference;   /* the normal this reading should have (either sense) */
} corax_turn_reading;

typedef enum corax_turn_status {
    CORAX_TURN_FITTED = 0, /* one turn fits best */
    CORAX_TURN_AMBIGUOUS,  /* turns 30 degrees apart, or two minima, fit as well:
                              the reference lies nearly along the core axis, or
                              nearly in a plane holding it */
    CORAX_TURN_NONE        /* no reading to fit */
} corax_turn_status;

typedef struct corax_turn {
    corax_turn_status status;
    double turn;         /* [0, 2 pi): add to the canonical beta of every reading of
                            the run (a turn clockwise looking down the hole) */
    double misfit;       /* RMS angle between the turned readings' normals and
                            their references */
    double other_turn;   /* the turn that fits as well (or the best other minimum
                            at least 30 degrees away; NaN when none)... */
    double other_misfit; /* ...and its misfit */
    double sigma;        /* one-sigma error of the turn (see corax_turn_fit()) */
    size_t n;            /* readings fitted */
} corax_turn;

/* The turn about the core axis that best fits the n readings to their
 * references (least squares on the angles, over every turn: a grid of half a
 * degree, then golden-section search). `spread`: the references' own
 * one-sigma angular spread. The fit is ambiguous when the misfit 30 degrees
 * either side is within `tie` of the best (the reference lies nearly along
 * the core axis), or when another least-squares minimum at least 30 degrees
 * away is within max(tie, 2 spread / sqrt(n)) of it (the references' scatter
 * blurs an RMS misfit of n readings by about spread / sqrt(n)). The turn's
 * error is
 *     sigma = sqrt((spread^2 + misfit^2 / n) / 2) / sin(delta)
 * with delta the mean angle between the references and the core axes: an
 * error e across the plane of the axis and a normal moves the normal's place
 * about the axis by e / sin(delta), and half of an isotropic angular variance
 * lies across that plane (derived). CORAX_EARG for a bad alpha. */
corax_status corax_turn_fit(const corax_turn_reading *readings, size_t n, double spread,
                            double tie, corax_turn *out);

#ifdef __cplusplus
}
#endif
#endif
