/* core: alpha, beta and gamma to planes and lines, and back (the stereonet
 * construction in vector form, as in the project's geometry contract). */
#include <math.h>

#include "corax/core.h"
#include "core/frame.h"
#include "geometry/vec.h"

static const double PI = CORAX_PI;

double corax_core_beta_canonical(double beta, const corax_core_conventions *c)
{
    double b = c->beta_anticlockwise ? -beta : beta;
    b += PI * (double)((c->top_reference != 0) + (c->beta_to_uphole_end != 0));
    return corax_wrap_azimuth(b);
}

double corax_core_beta_measured(double beta, const corax_core_conventions *c)
{
    double b = beta - PI * (double)((c->top_reference != 0) + (c->beta_to_uphole_end != 0));
    return corax_wrap_azimuth(c->beta_anticlockwise ? -b : b);
}

double corax_core_gamma_canonical(double gamma, const corax_core_conventions *c)
{
    double g = c->gamma_anticlockwise ? -gamma : gamma;
    return corax_wrap_azimuth(c->gamma_from_uphole ? g + PI : g);
}

double corax_core_gamma_measured(double gamma, const corax_core_conventions *c)
{
    double g = c->gamma_from_uphole ? gamma - PI : gamma;
    return corax_wrap_azimuth(c->gamma_anticlockwise ? -g : g);
}

/* Angle around the core of a line's own beta: like a plane's beta, but always
 * to the line's down-hole end. */
double corax_core_line_beta_canonical(double beta, const corax_core_conventions *c)
{
    double b = c->beta_anticlockwise ? -beta : beta;
    return corax_wrap_azimuth(c->top_reference ? b + PI : b);
}

double corax_core_line_beta_measured(double beta, const corax_core_conventions *c)
{
    double b = c->top_reference ? beta - PI : beta;
    return corax_wrap_azimuth(c->beta_anticlockwise ? -b : b);
}

corax_status corax_core_frame_of(corax_vec3 t, corax_core_frame *f)
{
    return core_frame_of(t, f);
}

double corax_core_off_vertical(corax_vec3 t)
{
    return fast_atan2(sqrt(t.x * t.x + t.y * t.y), fabs(t.z));
}

/* The direction around the core at canonical angle b from the bottom line. */
static corax_vec3 around(const corax_core_frame *f, double b)
{
    return vec_comb(f->r, cos(b), f->s, sin(b));
}

corax_vec3 corax_core_plane_normal(const corax_core_frame *f, double alpha, double beta,
                                   const corax_core_conventions *c)
{
    corax_vec3 e = around(f, corax_core_beta_canonical(beta, c));
    return vec_comb(f->t, sin(alpha), e, -cos(alpha));
}

corax_vec3 corax_core_line_on_plane(const corax_core_frame *f, double alpha, double beta,
                                    double gamma, const corax_core_conventions *c)
{
    corax_vec3 e = around(f, corax_core_beta_canonical(beta, c));
    corax_vec3 d = vec_comb(f->t, cos(alpha), e, sin(alpha)); /* long axis, down-hole end */
    corax_vec3 side = vec_cross(f->t, e);                      /* = n x d */
    double g = corax_core_gamma_canonical(gamma, c);
    return vec_comb(d, cos(g), side, sin(g));
}

corax_vec3 corax_core_line(const corax_core_frame *f, double line_alpha, double line_beta,
                           const corax_core_conventions *c)
{
    corax_vec3 e = around(f, corax_core_line_beta_canonical(line_beta, c));
    return vec_comb(f->t, cos(line_alpha), e, sin(line_alpha));
}

/* Split v into its part along t (returned) and the unit direction of the rest
 * (*across; zero when v runs along t), with that part's length in *len. */
static double split(const corax_core_frame *f, corax_vec3 v, corax_vec3 *across, double *len)
{
    double along = vec_dot(v, f->t);
    corax_vec3 p = vec_comb(v, 1.0, f->t, -along);
    *len = vec_norm(p);
    *across = *len > 0.0 ? vec_scale(p, 1.0 / *len) : vec3(0, 0, 0);
    return along;
}

static double angle_around(const corax_core_frame *f, corax_vec3 e)
{
    return corax_wrap_azimuth(fast_atan2(vec_dot(e, f->s), vec_dot(e, f->r)));
}

void corax_core_plane_angles(const corax_core_frame *f, corax_vec3 n,
                             const corax_core_conventions *c, double *alpha, double *beta)
{
    n = vec_unit(n);
    corax_vec3 across;
    double len, along = split(f, n, &across, &len);
    if (along < 0.0) { /* the normal that points down the hole */
        along = -along;
        across = vec_neg(across);
    }
    *alpha = atan2(along, len);
    /* n = sin(alpha) t - cos(alpha) e, so e is opposite n's part across the core */
    *beta = len > 1e-15 ? corax_core_beta_measured(angle_around(f, vec_neg(across)), c) : (double)NAN;
}

double corax_core_gamma_of(const corax_core_frame *f, corax_vec3 n, corax_vec3 line,
                           const corax_core_conventions *c)
{
    corax_vec3 across;
    double len, along = split(f, vec_unit(n), &across, &len);
    if (len <= 1e-15)
        return NAN;
    if (along < 0.0) {
        along = -along;
        across = vec_neg(across);
    }
    n = vec_comb(f->t, along, across, len); /* unit, pointing down the hole */
    corax_vec3 e = vec_neg(across);
    double alpha = atan2(along, len);
    corax_vec3 d = vec_comb(f->t, cos(alpha), e, sin(alpha));
    corax_vec3 side = vec_cross(f->t, e);
    corax_vec3 l = vec_comb(line, 1.0, n, -vec_dot(line, n)); /* onto the plane */
    if (vec_norm(l) <= 1e-15 * vec_norm(line))
        return NAN;
    if (l.z > 0.0) /* an axial line: its downward end */
        l = vec_neg(l);
    return corax_core_gamma_measured(atan2(vec_dot(l, side), vec_dot(l, d)), c);
}

void corax_core_line_angles(const corax_core_frame *f, corax_vec3 line,
                            const corax_core_conventions *c, double *line_alpha,
                            double *line_beta)
{
    corax_vec3 across;
    double len, along = split(f, vec_unit(line), &across, &len);
    if (along < 0.0) { /* an axial line: its down-hole end */
        along = -along;
        across = vec_neg(across);
    }
    *line_alpha = atan2(len, along);
    *line_beta = len > 1e-15 ? corax_core_line_beta_measured(angle_around(f, across), c) : (double)NAN;
}
