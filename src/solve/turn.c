/* solve: orientation by reference. A run of core whose betas run from an
 * arbitrary line is turned about the core axis by the angle that best fits
 * its readings to the orientation a feature is known to have. */
#include <math.h>
#include <string.h>

#include "corax/solve.h"
#include "geometry/vec.h"

enum { GRID = 720 }; /* turns tried, half a degree apart */

/* The normal of reading r turned by w (canonical beta + w):
 * n = sin(a) t - cos(a) (cos(b) r + sin(b) s), as the core module has it. */
static corax_vec3 turned_normal(const corax_turn_reading *r, double w)
{
    const corax_core_frame *f = &r->frame;
    double b = r->beta + w;
    corax_vec3 e = vec_comb(f->r, cos(b), f->s, sin(b));
    return vec_comb(f->t, sin(r->alpha), e, -cos(r->alpha));
}

static double line_angle(corax_vec3 a, corax_vec3 b)
{
    return atan2(vec_norm(vec_cross(a, b)), fabs(vec_dot(a, b)));
}

/* The RMS angle between the turned readings and their references. */
static double rms(const corax_turn_reading *r, size_t n, double w)
{
    double f = 0.0;
    for (size_t i = 0; i < n; i++) {
        double a = line_angle(turned_normal(&r[i], w), r[i].reference);
        f += a * a;
    }
    return sqrt(f / (double)n);
}

/* The circular distance between two turns, in [0, pi]. */
static double apart(double a, double b)
{
    double d = fmod(fabs(a - b), 2.0 * CORAX_PI);
    return d > CORAX_PI ? 2.0 * CORAX_PI - d : d;
}

/* Golden-section search for the least RMS within [lo, hi]. */
static double golden(const corax_turn_reading *r, size_t n, double lo, double hi)
{
    const double g = 0.5 * (sqrt(5.0) - 1.0);
    double a = lo, b = hi, c = b - g * (b - a), d = a + g * (b - a);
    double fc = rms(r, n, c), fd = rms(r, n, d);
    while (b - a > 1e-10) {
        if (fc < fd) {
            b = d;
            d = c;
            fd = fc;
            c = b - g * (b - a);
            fc = rms(r, n, c);
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + g * (b - a);
            fd = rms(r, n, d);
        }
    }
    return 0.5 * (a + b);
}

corax_status corax_turn_fit(const corax_turn_reading *r, size_t n, double spread, double tie,
                            corax_turn *out)
{
    memset(out, 0, sizeof *out);
    out->status = CORAX_TURN_NONE;
    out->turn = out->misfit = out->other_turn = out->other_misfit = out->sigma = NAN;
    out->n = n;
    for (size_t i = 0; i < n; i++)
        if (!(r[i].alpha >= 0.0 && r[i].alpha <= 0.5 * CORAX_PI))
            return CORAX_EARG;
    if (n == 0)
        return CORAX_OK;
    double step = 2.0 * CORAX_PI / GRID, f[GRID];
    size_t best = 0;
    for (size_t k = 0; k < GRID; k++) {
        f[k] = rms(r, n, (double)k * step);
        if (f[k] < f[best])
            best = k;
    }
    double w = corax_wrap_azimuth(golden(r, n, ((double)best - 1.0) * step,
                                         ((double)best + 1.0) * step));
    out->turn = w;
    out->misfit = rms(r, n, w);
    /* a fit is no fit when the misfit hardly rises 30 degrees either side (the
     * reference lies nearly along the core axis), or when another minimum well
     * away fits as well, the references' scatter allowed for (a reference in
     * the plane of the core axis fits two turns half a turn apart) */
    double away = corax_rad(30.0), t = fmax(tie, 1e-6);
    double left = rms(r, n, w - away), right = rms(r, n, w + away);
    int flat = fmin(left, right) <= out->misfit + t;
    if (flat) {
        out->other_turn = corax_wrap_azimuth(left < right ? w - away : w + away);
        out->other_misfit = fmin(left, right);
    }
    for (size_t k = 0; k < GRID && !flat; k++) {
        double wk = (double)k * step;
        int minimum = f[k] <= f[(k + GRID - 1) % GRID] && f[k] <= f[(k + 1) % GRID];
        if (minimum && apart(wk, w) >= away && !(f[k] >= out->other_misfit)) {
            out->other_misfit = f[k];
            out->other_turn = wk;
        }
    }
    double within = fmax(t, 2.0 * spread / sqrt((double)n));
    out->status = flat || out->other_misfit <= out->misfit + within ? CORAX_TURN_AMBIGUOUS
                                                                    : CORAX_TURN_FITTED;
    double sin_delta = 0.0;
    for (size_t i = 0; i < n; i++)
        sin_delta += sin(line_angle(r[i].reference, r[i].frame.t));
    sin_delta /= (double)n;
    double var = 0.5 * (spread * spread + out->misfit * out->misfit / (double)n);
    out->sigma = sin_delta > 1e-9 ? fmin(CORAX_PI, sqrt(var) / sin_delta) : CORAX_PI;
    return CORAX_OK;
}
