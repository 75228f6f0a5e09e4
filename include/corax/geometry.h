/* corax: vectors, angles, directions, planes and projections (pure math).
 *
 * World frame: right-handed, x = east, y = north, z = up, metres.
 * Inside the library every angle is in radians; degrees appear only at the
 * edges (tables, command line). Azimuth, trend and dip direction run clockwise
 * from north in [0, 2 pi). */
#ifndef CORAX_GEOMETRY_H
#define CORAX_GEOMETRY_H

#ifdef __cplusplus
extern "C" {
#endif

/* A point or a vector in the world frame. */
typedef struct corax_vec3 {
    double x, y, z;
} corax_vec3;

#define CORAX_PI 3.14159265358979323846
#define CORAX_DEG (CORAX_PI / 180.0) /* one degree in radians */

/* Degrees to radians and back. */
double corax_rad(double degrees);
double corax_deg(double radians);

/* An azimuth in radians wrapped into [0, 2 pi). */
double corax_wrap_azimuth(double radians);

/* An azimuth in degrees wrapped into [0, 360), for output. The value is first
 * rounded to `decimals` places so that 359.999 printed to 2 places reads 0.00,
 * never 360.00. decimals in [0, 9]. */
double corax_wrap_degrees(double degrees, int decimals);

/* The unit vector of azimuth az and plunge p (radians, plunge positive
 * downward): (sin az cos p, cos az cos p, -sin p). */
corax_vec3 corax_direction(double azimuth, double plunge);

/* Azimuth in [0, 2 pi) and plunge in [-pi/2, pi/2] (positive downward) of a
 * non-zero vector. A vertical vector gets azimuth 0. */
void corax_direction_angles(corax_vec3 v, double *azimuth, double *plunge);

/* Trend and plunge of an axial line (no sense), reported in the lower
 * hemisphere: plunge in [0, pi/2]. A horizontal line keeps trend in [0, 2 pi). */
void corax_line_trend_plunge(corax_vec3 v, double *trend, double *plunge);

/* A plane given by a normal (either sense, non-zero). Dip in [0, pi/2], dip
 * direction in [0, 2 pi); a horizontal plane gets dip direction 0. */
typedef struct corax_plane {
    double dip;
    double dip_direction;
} corax_plane;

/* The plane whose normal is n; *up (may be NULL) gets the upward unit normal. */
corax_plane corax_plane_from_normal(corax_vec3 n, corax_vec3 *up);

/* The upward unit normal of a plane. */
corax_vec3 corax_plane_normal(corax_plane plane);

/* Two unit vectors spanning a plane: along its strike (azimuth dip direction
 * - 90, the right-hand rule: the plane dips to the right of it; horizontal)
 * and straight down its dip (azimuth dip direction, plunge dip). Either
 * pointer may be NULL. */
void corax_plane_axes(corax_plane plane, corax_vec3 *strike, corax_vec3 *down_dip);

/* Apparent dip of a plane in a vertical section of azimuth s (radians), in
 * [0, pi/2], with tan(apparent) = tan(dip) |cos(s - dip direction)|. *toward
 * (may be NULL) gets +1 when the plane dips toward the section's azimuth end,
 * -1 toward the opposite end, 0 when it shows no dip in the section. */
double corax_apparent_dip(corax_plane plane, double section_azimuth, int *toward);

#ifdef __cplusplus
}
#endif
#endif
