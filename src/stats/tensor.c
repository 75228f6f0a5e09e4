/* stats: the orientation tensor of axial readings, its principal axes and
 * eigenvalues (GSL), Woodcock's (1977) shape and strength, and the summary of
 * a set of axial readings. */
#include <gsl/gsl_eigen.h>
#include <gsl/gsl_matrix.h>
#include <math.h>
#include <stdlib.h>

#include "corax/stats.h"
#include "geometry/vec.h"
#include "stats/stats_int.h"

static double log_ratio(double a, double b)
{
    double r = log(a / b);
    return isfinite(r) ? r : (double)NAN;
}

double corax_woodcock_shape(const double s[3])
{
    double k = log_ratio(s[0], s[1]) / log_ratio(s[1], s[2]);
    return isfinite(k) ? k : (double)NAN;
}

double corax_woodcock_strength(const double s[3]) { return log_ratio(s[0], s[2]); }

corax_status corax_tensor_compute(const corax_vec3 *v, const double *w, size_t n,
                                  corax_tensor *out)
{
    if (n == 0)
        return CORAX_EARG;
    double scale;
    corax_status st = corax_stats_weight_scale(w, n, &scale, NULL);
    if (st != CORAX_OK)
        return st;
    double t[9] = {0};
    for (size_t i = 0; i < n; i++) {
        double c[3] = {v[i].x, v[i].y, v[i].z}, wi = corax_stats_weight(w, i, scale) / (double)n;
        for (int r = 0; r < 3; r++)
            for (int k = 0; k < 3; k++)
                t[3 * r + k] += wi * c[r] * c[k];
    }
    return corax_tensor_from_sums(t, out);
}

corax_status corax_tensor_from_sums(const double sums[9], corax_tensor *out)
{
    double t[9];
    for (int k = 0; k < 9; k++)
        t[k] = sums[k]; /* GSL's solver works in place */
    gsl_matrix_view m = gsl_matrix_view_array(t, 3, 3);
    gsl_vector *eval = gsl_vector_alloc(3);
    gsl_matrix *evec = gsl_matrix_alloc(3, 3);
    gsl_eigen_symmv_workspace *ws = gsl_eigen_symmv_alloc(3);
    corax_status st = CORAX_ENOMEM;
    if (eval && evec && ws && gsl_eigen_symmv(&m.matrix, eval, evec, ws) == 0 &&
        gsl_eigen_symmv_sort(eval, evec, GSL_EIGEN_SORT_VAL_DESC) == 0) {
        double total = 0.0;
        for (int k = 0; k < 3; k++)
            total += fmax(0.0, gsl_vector_get(eval, (size_t)k));
        for (int k = 0; k < 3; k++) {
            out->eigenvalue[k] = total > 0.0 ? fmax(0.0, gsl_vector_get(eval, (size_t)k)) / total
                                             : (double)NAN;
            corax_vec3 a = vec3(gsl_matrix_get(evec, 0, (size_t)k),
                                gsl_matrix_get(evec, 1, (size_t)k),
                                gsl_matrix_get(evec, 2, (size_t)k));
            out->axis[k] = vec_unit(a.z > 0.0 ? vec_neg(a) : a);
        }
        out->shape = corax_woodcock_shape(out->eigenvalue);
        out->strength = corax_woodcock_strength(out->eigenvalue);
        st = CORAX_OK;
    }
    gsl_eigen_symmv_free(ws);
    gsl_matrix_free(evec);
    gsl_vector_free(eval);
    return st;
}

corax_status corax_axial_summary_compute(const corax_vec3 *v, const double *w, size_t n,
                                         corax_axial_summary *out)
{
    out->n = n;
    out->weight_sum = 0.0;
    for (int k = 0; k < 3; k++) {
        out->tensor.eigenvalue[k] = NAN;
        out->tensor.axis[k] = vec3(0, 0, 0);
    }
    out->tensor.shape = out->tensor.strength = NAN;
    corax_fisher_mean(v, w, 0, &out->fisher);
    if (n == 0)
        return CORAX_OK;
    double scale;
    corax_status st = corax_stats_weight_scale(w, n, &scale, &out->weight_sum);
    if (st == CORAX_OK)
        st = corax_tensor_compute(v, w, n, &out->tensor);
    if (st != CORAX_OK)
        return st;
    /* turn every reading to the side of axis 1, then take the Fisher mean */
    corax_vec3 *turned = malloc(n * sizeof *turned);
    if (!turned)
        return CORAX_ENOMEM;
    corax_vec3 e1 = out->tensor.axis[0];
    for (size_t i = 0; i < n; i++)
        turned[i] = vec_dot(v[i], e1) < 0.0 ? vec_neg(v[i]) : v[i];
    st = corax_fisher_mean(turned, w, n, &out->fisher);
    free(turned);
    if (out->fisher.mean.z > 0.0)
        out->fisher.mean = vec_neg(out->fisher.mean);
    return st;
}
