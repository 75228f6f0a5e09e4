/* corax: oriented core angles. Planes from alpha and beta, lines from gamma or
 * from their own two angles, and the inverse: the angles a known plane or line
 * would show in a given hole. All under explicit, switchable conventions.
 *
 * Angles are radians. The hole direction t is the unit vector down the hole
 * (the drilling direction). The reference line is the bottom-of-hole line
 *     r = -normalize(u - (u.t) t),  u = (0, 0, 1)
 * and s = t x r is 90 degrees clockwise from it looking down the hole. */
#ifndef CORAX_CORE_H
#define CORAX_CORE_H

#include "corax/geometry.h"
#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* How a log's angles were measured. Zero-initialised, this is the default:
 * bottom-of-hole line; beta clockwise looking down the hole, to the down-hole
 * end of the ellipse's long axis; gamma from that down-hole end, clockwise
 * seen from the up-hole side of the plane. */
typedef struct corax_core_conventions {
    int top_reference;       /* the orientation line marks the top of the hole */
    int beta_to_uphole_end;  /* beta measured to the up-hole end of the ellipse */
    int beta_anticlockwise;  /* beta anticlockwise looking down the hole */
    int gamma_from_uphole;   /* gamma measured from the up-hole end of the long axis */
    int gamma_anticlockwise; /* gamma anticlockwise seen from the up-hole side */
} corax_core_conventions;

/* The canonical beta (bottom line, clockwise, down-hole end) of a beta
 * measured under conventions c, and back. Results in [0, 2 pi). */
double corax_core_beta_canonical(double beta, const corax_core_conventions *c);
double corax_core_beta_measured(double beta, const corax_core_conventions *c);

/* The canonical line_beta (bottom line, clockwise) of a line measured on its
 * own under conventions c (only the reference line and the sense apply: it
 * runs to the line's down-hole end), and back. Results in [0, 2 pi). */
double corax_core_line_beta_canonical(double line_beta, const corax_core_conventions *c);
double corax_core_line_beta_measured(double line_beta, const corax_core_conventions *c);

/* The canonical gamma (from the down-hole end, clockwise from up-hole) of a
 * gamma measured under c, and back. Results in [0, 2 pi). */
double corax_core_gamma_canonical(double gamma, const corax_core_conventions *c);
double corax_core_gamma_measured(double gamma, const corax_core_conventions *c);

/* The hole's frame at a point: t down the hole, r the bottom-of-hole line,
 * s = t x r. */
typedef struct corax_core_frame {
    corax_vec3 t, r, s;
} corax_core_frame;

/* The frame of a unit tangent. CORAX_EVALUE when the hole is vertical to
 * within 1e-9 rad (no bottom line exists); the frame is then unusable. */
corax_status corax_core_frame_of(corax_vec3 tangent, corax_core_frame *frame);

/* Angle between the hole and the vertical (radians, [0, pi/2]). */
double corax_core_off_vertical(corax_vec3 tangent);

/* The unit normal of the plane with angles alpha in [0, pi/2] and beta
 * (measured under c), pointing down the hole (n.t >= 0). For alpha = pi/2
 * the normal is t whatever beta. */
corax_vec3 corax_core_plane_normal(const corax_core_frame *f, double alpha, double beta,
                                   const corax_core_conventions *c);

/* The direction of the line lying on the plane (alpha, beta) at angle gamma
 * (measured under c) from its long axis. */
corax_vec3 corax_core_line_on_plane(const corax_core_frame *f, double alpha, double beta,
                                    double gamma, const corax_core_conventions *c);

/* The direction of a line measured on its own: angle line_alpha in [0, pi/2]
 * between the line and the core axis, and angle line_beta around the core
 * from the reference line (under c's reference line and sense) to the line's
 * down-hole end. */
corax_vec3 corax_core_line(const corax_core_frame *f, double line_alpha, double line_beta,
                           const corax_core_conventions *c);

/* Inverse: the alpha and beta (under c) that the plane with normal n (either
 * sense) shows in this hole. Beta is NaN when alpha is pi/2 (the ellipse is a
 * circle). */
void corax_core_plane_angles(const corax_core_frame *f, corax_vec3 normal,
                             const corax_core_conventions *c, double *alpha, double *beta);

/* Inverse: the gamma (under c) of a line on the plane with normal n, for the
 * line's end that points down (lower hemisphere; either end when horizontal).
 * The line is first projected onto the plane. NaN when the plane's long axis
 * is undefined (alpha = pi/2) or the line is the plane's normal. */
double corax_core_gamma_of(const corax_core_frame *f, corax_vec3 normal, corax_vec3 line,
                           const corax_core_conventions *c);

/* Inverse: the angles (under c) of a line measured on its own. The line is
 * axial: its down-hole end is used. line_beta is NaN when the line runs along
 * the core axis. */
void corax_core_line_angles(const corax_core_frame *f, corax_vec3 line,
                            const corax_core_conventions *c, double *line_alpha,
                            double *line_beta);

#ifdef __cplusplus
}
#endif
#endif
