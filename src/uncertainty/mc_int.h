/* Pieces of the Monte Carlo shared with other modules' simulations
 * (internal). */
#ifndef CORAX_MC_INT_H
#define CORAX_MC_INT_H

#include "corax/uncertainty.h"
#include "uncertainty/gauss.h"

/* One draw's survey errors for every node of a hole: a systematic error per
 * hole (azimuth, dip) shared by all nodes, plus each node's own, from the
 * station's errors or else the model's. d_azimuth and d_plunge get
 * corax_hole_node_count() entries each. */
void mc_survey_errors(const corax_ziggurat *z, corax_taus *rng, const corax_hole *hole,
                      const corax_error_model *e, double *d_azimuth, double *d_plunge);

/* The spread of k drawn unit vectors (all on one side): their Fisher mean,
 * kappa (Fisher 1953) and the half-angle about the mean holding 95% of them
 * (the ceil(0.95 k)-th closest). dots is room for k numbers. 0 when there is
 * no mean (k == 0 or a zero resultant). */
int mc_cone95(const corax_vec3 *v, size_t k, double *dots, corax_vec3 *mean, double *kappa,
              double *cone95);

#endif
