/* stats: the orientation tensor of axial readings, its principal axes and
 * eigenvalues (GSL), Woodcock's (1977) shape and strength, and the summary of
 * a set of axial readings. */
#include <gsl/gsl_eigen.h>
#include <gsl/gsl_matrix.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

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

/* Add wi v v^T to the sums t. */
static void tensor_add(double t[9], corax_vec3 v, double wi)
{
    double c[3] = {v.x, v.y, v.z};
    for (int r = 0; r < 3; r++)
        for (int k = 0; k < 3; k++)
            t[3 * r + k] += wi * c[r] * c[k];
}

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
    for (size_t i = 0; i < n; i++)
        tensor_add(t, v[i], corax_stats_weight(w, i, scale) / (double)n);
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

/* ---- the summary, in passes ---- */

void corax_axial_stream_begin(corax_axial_stream *s, int weighted)
{
    memset(s, 0, sizeof *s);
    s->weighted = weighted;
    s->sum = vec3(0, 0, 0);
    corax_axial_summary *out = &s->out;
    for (int k = 0; k < 3; k++) {
        out->tensor.eigenvalue[k] = NAN;
        out->tensor.axis[k] = vec3(0, 0, 0);
    }
    out->tensor.shape = out->tensor.strength = NAN;
    corax_fisher_mean(NULL, NULL, 0, &out->fisher);
}

/* The pass's weight of a reading, rescaled. */
static double rescaled(const corax_axial_stream *s, double w)
{
    return s->weighted ? w * s->scale : 1.0;
}

void corax_axial_stream_weigh(corax_axial_stream *s, double w)
{
    s->n++;
    if (!s->weighted)
        return;
    if (!(w >= 0.0) || !isfinite(w)) /* as corax_stats_weight_scale() */
        s->status = CORAX_EARG;
    s->weight_sum += w;
}

/* The end of the first pass, at the first step after it: the weights' sum
 * and their scale. 0 when there is nothing more to do. */
static int weighed(corax_axial_stream *s)
{
    if (s->status != CORAX_OK || s->n == 0)
        return 0;
    if (s->scale > 0.0)
        return 1;
    if (!s->weighted)
        s->weight_sum = (double)s->n;
    else if (!(s->weight_sum > 0.0)) {
        s->status = CORAX_EARG;
        return 0;
    }
    s->scale = (double)s->n / s->weight_sum;
    return 1;
}

void corax_axial_stream_tensor(corax_axial_stream *s, corax_vec3 v, double w)
{
    if (weighed(s))
        tensor_add(s->sums, v, rescaled(s, w) / (double)s->n);
}

void corax_axial_stream_axes(corax_axial_stream *s)
{
    if (weighed(s))
        s->status = corax_tensor_from_sums(s->sums, &s->out.tensor);
}

void corax_axial_stream_mean(corax_axial_stream *s, corax_vec3 v, double w)
{
    if (!weighed(s))
        return;
    corax_vec3 turned = vec_dot(v, s->out.tensor.axis[0]) < 0.0 ? vec_neg(v) : v;
    s->sum = vec_add(s->sum, vec_scale(turned, rescaled(s, w)));
}

corax_status corax_axial_stream_end(corax_axial_stream *s, corax_axial_summary *out)
{
    s->out.n = s->n;
    if (weighed(s)) {
        s->out.weight_sum = s->weight_sum;
        s->out.fisher.n = s->n;
        corax_fisher_finish(s->sum, &s->out.fisher);
        if (s->out.fisher.mean.z > 0.0)
            s->out.fisher.mean = vec_neg(s->out.fisher.mean);
    }
    *out = s->out;
    return s->status;
}

corax_status corax_axial_summary_compute(const corax_vec3 *v, const double *w, size_t n,
                                         corax_axial_summary *out)
{
    corax_axial_stream s;
    corax_axial_stream_begin(&s, w != NULL);
    for (size_t i = 0; i < n; i++)
        corax_axial_stream_weigh(&s, w ? w[i] : 1.0);
    for (size_t i = 0; i < n; i++)
        corax_axial_stream_tensor(&s, v[i], w ? w[i] : 1.0);
    corax_axial_stream_axes(&s);
    for (size_t i = 0; i < n; i++)
        corax_axial_stream_mean(&s, v[i], w ? w[i] : 1.0);
    return corax_axial_stream_end(&s, out);
}
