/* Internal to src/plan: the model's layout, shared by its files. */
#ifndef CORAX_PLAN_INT_H
#define CORAX_PLAN_INT_H

#include "corax/plan.h"

/* Points in the table of a set's spread, over c = |m.t| in [0, 1]. */
enum { PLAN_TABLE = 513 };

/* What a hole running at c = |m.t| to a set's mean pole m sees of the set,
 * per metre: the planes crossed E|n.t|, and the crossing-weighted sums of
 * alpha and alpha squared, E[|n.t| alpha] and E[|n.t| alpha^2]. */
typedef struct plan_cross {
    double f, a, a2;
} plan_cross;

struct corax_plan_model {
    corax_plan_set *set;
    size_t n;
    corax_vec3 *normal;      /* the mean planes' upward unit normals */
    plan_cross *table;       /* PLAN_TABLE entries per set with spread, else unused */
    double *reference;       /* planes crossed per metre along the mean pole */
    corax_convert_options options;
};

/* What a hole along the unit vector t sees of set i, per metre. */
plan_cross corax_plan_cross(const corax_plan_model *m, size_t i, corax_vec3 t);

/* The depths at which a hole is sampled: the middles of `count` equal
 * pieces of `length` metres. A hole without stations is straight: one piece. */
size_t corax_plan_pieces(const corax_hole *hole, double length);

#endif
