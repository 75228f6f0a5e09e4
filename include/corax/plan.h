/* corax: drill planning. What a planned hole would see of the structure sets
 * it is meant to sample (the expected alpha and beta, and Terzaghi's sampled
 * fraction), where it would pierce target planes or how close it would come,
 * and a sweep of hole directions scored by how well they sample every set at
 * once (pure math: no I/O).
 *
 * Angles are radians; plunge is positive downward, as in survey.h. Depths are
 * metres along the hole from the collar. Plans are the inverse of conversion:
 * the planes are known, and the question is what the core would show. */
#ifndef CORAX_PLAN_H
#define CORAX_PLAN_H

#include <stddef.h>

#include "corax/convert.h"
#include "corax/geometry.h"
#include "corax/status.h"
#include "corax/survey.h"

#ifdef __cplusplus
extern "C" {
#endif

/* A plane whose alpha is below this (radians, about 0.006 degrees) runs along
 * the hole: its ellipse on NQ core (47.6 mm) would be over 400 m long, so no
 * core run shows its ends and beta is undefined. */
#define CORAX_PLAN_PARALLEL_LIMIT 1e-4

/* The most directions a sweep may hold (a degree apart, the lower
 * hemisphere holds about 33,000), and the longest planned hole, metres. */
#define CORAX_PLAN_MAX_DIRECTIONS 100000
#define CORAX_PLAN_MAX_LENGTH 20000.0

/* Metres between the planned stations of a curved plan: the unit of its lift
 * and drift. */
#define CORAX_PLAN_STATION_STEP 30.0

/* What a planned hole would make of a set or a target, most serious last. */
typedef enum corax_plan_status {
    CORAX_PLAN_OK = 0,             /* "ok" */
    CORAX_PLAN_NEAR_PERPENDICULAR, /* "near-perpendicular": alpha above the threshold,
                                      beta barely defined (a single reading only) */
    CORAX_PLAN_NO_REFERENCE,       /* "no-reference-line": the hole is near vertical,
                                      no beta can be measured */
    CORAX_PLAN_NEAR_PARALLEL,      /* "near-parallel": alpha below the threshold */
    CORAX_PLAN_PARALLEL,           /* "parallel": the planes run along the hole; it
                                      never crosses them and beta is undefined */
    CORAX_PLAN_MISSED              /* "missed": a target plane the hole never reaches */
} corax_plan_status;

/* The status word, as above. */
const char *corax_plan_status_name(corax_plan_status status);

/* The angles a plane of unit normal `normal` (either sense) would show in a
 * hole running along the unit vector t: alpha in [0, pi/2], and beta
 * measured under o's conventions, NaN when it is undefined (the plane runs
 * along the hole: alpha below CORAX_PLAN_PARALLEL_LIMIT), when it is any angle at
 * all (alpha pi/2) or when the hole is within o->vertical_limit of vertical
 * (no bottom-of-hole line). Returns the most serious status that applies:
 * parallel, near-parallel (alpha below o->near_parallel), no-reference-line,
 * near-perpendicular (alpha above o->near_perpendicular), or ok. */
corax_plan_status corax_plan_angles(corax_vec3 t, corax_vec3 normal,
                                    const corax_convert_options *o, double *alpha,
                                    double *beta);

/* A planned hole. lift and drift are the turn expected per 30 m
 * (CORAX_PLAN_STATION_STEP): lift turns the hole upward (its plunge falls:
 * a downward hole flattens), drift turns it clockwise seen from above (its
 * azimuth grows); negative values turn it the other way. */
typedef struct corax_plan_hole {
    const char *name;   /* borrowed */
    corax_vec3 collar;  /* x east, y north, z up, metres */
    double azimuth;     /* radians */
    double plunge;      /* radians, positive down */
    double length;      /* metres, in (0, CORAX_PLAN_MAX_LENGTH] */
    double lift, drift; /* radians per 30 m; 0 for a straight hole */
    long line;          /* source line, 0 when none */
} corax_plan_hole;

/* The path of a planned hole. A straight plan runs along its collar
 * direction; a curved one has a planned station every 30 m and at its end,
 * each turned from the one before by the lift and drift (pro rata for a
 * shorter last course), and is desurveyed by minimum curvature like any
 * surveyed hole. The collar records the length. CORAX_EVALUE for a length
 * outside (0, CORAX_PLAN_MAX_LENGTH] or a value that is not finite; CORAX_ESURVEY when a
 * course would turn by 180 degrees; CORAX_ENOMEM. The caller frees *out with
 * corax_hole_free(). */
corax_status corax_plan_path(const corax_plan_hole *plan, corax_hole **out, corax_error *err);

/* A set of planes to sample: its mean plane and spread. */
typedef struct corax_plan_set {
    const char *name; /* borrowed */
    corax_plane plane;
    double kappa;     /* Fisher (1953) concentration of the poles, > 0; infinite
                         (or NaN) for a set without spread */
    double weight;    /* its importance in the score, > 0 (1 when all count alike) */
    long line;
} corax_plan_set;

/* The kappa of a Fisher distribution whose cone of half-angle `cone`
 * (radians, in (0, pi)) about the mean holds the fraction p in (0, 1) of its
 * directions: the root of (1 - exp(kappa (cos cone - 1))) / (1 - exp(-2
 * kappa)) = p (from Fisher's density). NaN when there is none (the cone holds
 * less than p even for a uniform spread). */
double corax_plan_kappa_of_cone(double cone, double p);

/* A target plane: a vein to intersect, a contact. Unbounded. */
typedef struct corax_plan_target {
    const char *name; /* borrowed */
    corax_vec3 point; /* a point on the plane */
    corax_plane plane;
    long line;
} corax_plan_target;

/* The sets, each with its spread worked out once, and the conventions the
 * answers are given under. */
typedef struct corax_plan_model corax_plan_model;

/* Copy the sets (not their names) and tabulate their spread. CORAX_EARG for
 * nsets 0, a kappa not above 0, a weight not above 0 or a bad plane;
 * CORAX_ENOMEM. */
corax_status corax_plan_model_new(const corax_plan_set *sets, size_t nsets,
                                  const corax_convert_options *options,
                                  corax_plan_model **out);
void corax_plan_model_free(corax_plan_model *model);

size_t corax_plan_model_sets(const corax_plan_model *model);
const corax_plan_set *corax_plan_model_set(const corax_plan_model *model, size_t i);

/* How a hole samples one set, along the whole hole.
 *
 * A hole crosses planes of unit normal n at |n.t| planes per metre for every
 * plane per metre of a hole along n (Terzaghi 1965). Each plane of the set's
 * spread (Fisher 1953 about the mean, by quadrature) and each metre of the
 * hole are counted that way: `factor` is the planes crossed over the hole
 * relative to a hole of the same length along the mean pole, and alpha and
 * alpha_sd are the mean and standard deviation of the alphas the hole would
 * log, each plane weighted by how often it is crossed. For a straight hole and
 * a set without spread, factor = |n.t| and alpha = asin |n.t|. */
typedef struct corax_plan_sampling {
    double factor;    /* the Terzaghi factor, [0, 1] */
    double alpha;     /* radians */
    double alpha_sd;  /* radians */
    double beta;      /* the mean plane's beta (under the conventions), the
                         circular mean along the hole weighted by crossings;
                         NaN when undefined anywhere the hole crosses it */
    corax_plan_status status; /* parallel, near-parallel (alpha below the
                                 threshold), no-reference-line or ok */
    int no_reference; /* nowhere on the hole is there a bottom-of-hole line */
    double low_from, low_to; /* where the mean plane's alpha is below the
                                near-parallel threshold, NaN when nowhere */
} corax_plan_sampling;

/* How `hole` (a planned path, or any hole with a path) samples every set of
 * the model: out gets corax_plan_model_sets() entries. The hole is sampled at
 * the middle of every metre of its length (once when it is straight).
 * CORAX_EARG when the hole has no path or no length. */
corax_status corax_plan_sample(const corax_plan_model *model, const corax_hole *hole,
                               corax_plan_sampling *out);

/* A note on a sampling for the `note` column, in plain words; returns its
 * length, buf gets "" when there is nothing to say. length is the hole's. */
size_t corax_plan_sampling_note(const corax_plan_sampling *s, double length,
                                const corax_convert_options *options, char *buf,
                                size_t size);

/* Where a hole meets a target plane, or how close it comes. */
typedef struct corax_plan_pierce {
    int reached;        /* the hole crosses the plane within its length */
    double depth;       /* the first crossing, or the closest approach */
    corax_vec3 point;   /* the hole there */
    double alpha;       /* the plane's alpha at the crossing; NaN when missed */
    double distance;    /* 0 when reached, else the closest approach's distance
                           from the plane, metres */
    double again;       /* the next crossing's depth, NaN when none */
    double drilled_on;  /* missed: the depth at which the hole, drilled on
                           straight past its end, would reach the plane; NaN
                           when it heads away or runs parallel */
    corax_plan_status status; /* ok, near-parallel, parallel (the hole lies in
                                 the plane) or missed */
} corax_plan_pierce;

/* Pierce a target with a hole. Crossings are found on samples every metre
 * (and at every station) and refined on the arc by bisection to 1e-9 m; the
 * closest approach by golden-section search. CORAX_EARG when the hole has no
 * path or no length, or the plane is bad. */
corax_status corax_plan_pierce_target(const corax_hole *hole, const corax_plan_target *target,
                                      const corax_convert_options *options,
                                      corax_plan_pierce *out);

/* A note on a pierce, as corax_plan_sampling_note. */
size_t corax_plan_pierce_note(const corax_plan_pierce *p, double length, char *buf,
                              size_t size);

/* How a whole planned program samples one set. */
typedef struct corax_plan_program_set {
    double factor;     /* planes crossed by all the holes relative to holes of the
                          same total length along the mean pole */
    double alpha;      /* crossing-weighted mean alpha over all the holes */
    size_t holes_ok;   /* holes whose expected alpha reaches the near-parallel
                          threshold */
    size_t best_hole;  /* the hole with the largest factor (the first of equals) */
    int badly_sampled; /* every hole is near-parallel (or parallel) to the set */
} corax_plan_program_set;

/* The program view of nholes holes: sampling is row-major, nholes rows of
 * corax_plan_model_sets() entries; lengths the holes' lengths. out gets one
 * entry per set. */
void corax_plan_program(const corax_plan_model *model, const corax_plan_sampling *sampling,
                        const double *lengths, size_t nholes, corax_plan_program_set *out);

/* A range of angles swept: from `from` toward `to` by `step` (radians,
 * step > 0). Azimuths run clockwise from `from` to `to`, through north when
 * `to` is smaller; plunges either way. */
typedef struct corax_plan_range {
    double from, to, step;
} corax_plan_range;

/* One direction of a sweep and its score. */
typedef struct corax_plan_direction {
    double azimuth, plunge; /* radians */
    double score;           /* [0, 1]: reach times the weighted geometric mean of
                               the sets' factors (see corax_plan_sweep) */
    double reach;           /* the share of (hole, target) pairs reached, 1
                               without targets */
    size_t worst_set;       /* the set with the smallest factor (the first of
                               equals) */
    double worst_alpha;     /* its expected alpha over the program, radians */
} corax_plan_direction;

/* Expand the ranges into directions, azimuth slowest. An azimuth range
 * covering the whole circle does not repeat its start; a vertical direction
 * comes once, with the range's first azimuth. *out is allocated (free()).
 * CORAX_EARG, with a message naming the range, for a step that is not above
 * 0 or a value that is not finite (the range is empty), or for more than
 * CORAX_PLAN_MAX_DIRECTIONS directions. */
corax_status corax_plan_directions(corax_plan_range azimuth, corax_plan_range plunge,
                                   corax_plan_direction **out, size_t *n, corax_error *err);

/* Score each direction: every planned hole turned to it from its own collar
 * (its length, lift and drift kept) and sampled as corax_plan_sample does.
 *
 *   score = reach * prod over sets of factor_i ^ (weight_i / sum of weights)
 *
 * factor_i is the program's factor for set i (corax_plan_program): the
 * weighted geometric mean is 1 only for a hole square to every set, 0 for a
 * hole parallel to any set, and a set of weight 2 counts as two sets of
 * weight 1. reach is the share of (hole, target) pairs whose plane the hole
 * crosses within its length (1 without targets), so a direction that misses
 * targets loses that share of its score. Then the directions are sorted,
 * best first (equal scores keep their order).
 *
 * CORAX_EVALUE, with a message naming the set, when a set lies parallel to
 * every direction (its factor is below sin CORAX_PLAN_PARALLEL_LIMIT everywhere:
 * no direction samples it and every score is 0); CORAX_ESURVEY when a
 * turned plan cannot be desurveyed; CORAX_ENOMEM. */
corax_status corax_plan_sweep(const corax_plan_model *model, const corax_plan_hole *holes,
                              size_t nholes, const corax_plan_target *targets,
                              size_t ntargets, corax_plan_direction *directions, size_t n,
                              corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
