/* qa: what the checks share: the holes a shard checks, angles between
 * axes, a measured beta read another way, readings converted again, names
 * listed in a message, and the orientation tensor's principal axis. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/stats.h"
#include "geometry/vec.h"
#include "qa/qa_int.h"

int qa_in_shard(const corax_qa_options *o, const char *name)
{
    return o->shards <= 1 || corax_shard_of(name, strlen(name), o->shards) == o->shard;
}

double qa_axial_angle(corax_vec3 a, corax_vec3 b)
{
    return fast_atan2(vec_norm(vec_cross(a, b)), fabs(vec_dot(a, b)));
}

double qa_beta_read(double beta, int how)
{
    if (how & QA_MIRRORED)
        beta = 2.0 * CORAX_PI - beta;
    if (how & QA_PLUS_180)
        beta += CORAX_PI;
    return beta;
}

int qa_reconvert(const qa_data *d, const qa_item *it, double beta, corax_vec3 *normal)
{
    corax_reading rd = it->r->reading;
    rd.beta = corax_wrap_azimuth(beta);
    corax_result res;
    corax_convert_reading(it->r->path, &rd, d->convert, NULL, &res);
    if (!res.has_plane)
        return 0;
    *normal = res.normal;
    return 1;
}

int qa_normal_turned(const qa_data *d, const qa_item *it, int how, double turn,
                     corax_vec3 *normal)
{
    if (how == QA_AS_STATED && turn == 0.0) {
        *normal = it->res.normal;
        return it->res.has_plane;
    }
    double beta = qa_beta_read(qa_beta_read(it->r->reading.beta, d->reading), how);
    return qa_reconvert(d, it, beta + turn, normal);
}

int qa_normal_as(const qa_data *d, const qa_item *it, int how, corax_vec3 *normal)
{
    return qa_normal_turned(d, it, how, 0.0, normal);
}

void qa_name_list(char *buf, size_t size, const char *const *names, size_t n, size_t shown)
{
    size_t used = 0;
    buf[0] = '\0';
    size_t listed = n > shown ? shown : n;
    for (size_t i = 0; i < listed && used < size; i++) {
        const char *sep = i == 0 ? "" : (i + 1 == listed && listed == n) ? " and " : ", ";
        used += (size_t)snprintf(buf + used, size - used, "%s%s", sep, names[i]);
    }
    if (listed < n && used < size)
        snprintf(buf + used, size - used, " and %zu more", n - listed);
}

void qa_tensor_add(double t[9], corax_vec3 v, double sign)
{
    double c[3] = {v.x, v.y, v.z};
    for (int r = 0; r < 3; r++)
        for (int k = 0; k < 3; k++)
            t[3 * r + k] += sign * c[r] * c[k];
}

int qa_principal(const double t[9], corax_vec3 *axis, double *strength)
{
    corax_tensor ten;
    if (t[0] + t[4] + t[8] <= 0.0 || corax_tensor_from_sums(t, &ten) != CORAX_OK)
        return 0;
    *axis = ten.axis[0];
    if (strength)
        *strength = ten.eigenvalue[0];
    return 1;
}
