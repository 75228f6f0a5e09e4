/* corax: the tables of a drill plan. Planned holes, the structure sets they
 * are to sample and the target planes they are to reach, read from CSV. */
#ifndef CORAX_PLAN_LOAD_H
#define CORAX_PLAN_LOAD_H

#include <stddef.h>

#include "corax/finding.h"
#include "corax/plan.h"
#include "corax/table.h"

#ifdef __cplusplus
extern "C" {
#endif

/* What the tables hold. Zero-initialise, fill with the loaders, release with
 * corax_plan_inputs_free(). The names point into strings the inputs own. */
typedef struct corax_plan_inputs {
    corax_plan_hole *holes;
    size_t nholes;
    corax_plan_set *sets;
    size_t nsets;
    corax_plan_target *targets;
    size_t ntargets;
} corax_plan_inputs;

/* How the plan's tables are written. */
typedef struct corax_plan_load_options {
    corax_table_format format;
    const corax_column_map *columns;   /* the user's header names; may be NULL */
    corax_dip_convention dip_convention; /* of the planned holes' dips */
} corax_plan_load_options;

/* Comma-separated, decimal point, no column names, dip negative down. */
corax_plan_load_options corax_plan_load_options_default(void);

/* Planned holes: hole, x, y, z, azimuth, dip (under options->dip_convention),
 * length; optional lift and drift (degrees per 30 m, in [-30, 30]; empty
 * means 0). */
corax_status corax_plan_holes_load(const char *path, const corax_plan_load_options *options,
                                   corax_plan_inputs *in, corax_findings *problems,
                                   corax_error *err);

/* Sets: set, dip, dip_direction; optional kappa (Fisher, > 0) or cone95 (the
 * half-angle in degrees, in (0, 90], of the cone about the mean pole holding
 * 95% of the set's poles; not both), and weight (> 0; empty means 1). Empty
 * kappa and cone95: a set without spread. */
corax_status corax_plan_sets_load(const char *path, const corax_plan_load_options *options,
                                  corax_plan_inputs *in, corax_findings *problems,
                                  corax_error *err);

/* Target planes: target, x, y, z, dip, dip_direction (a plane through the
 * point). */
corax_status corax_plan_targets_load(const char *path, const corax_plan_load_options *options,
                                     corax_plan_inputs *in, corax_findings *problems,
                                     corax_error *err);

/* As for corax_program_load(): file-level faults (cannot open, a required
 * column missing, a repeated header name, broken quoting) stop the load and
 * are returned with err saying where; a row that cannot be used, or a name
 * that appears twice, becomes an error finding in *problems (checks
 * "plan-hole-row", "plan-set-row", "plan-target-row") and the rest is read. */

void corax_plan_inputs_free(corax_plan_inputs *in);

#ifdef __cplusplus
}
#endif
#endif
