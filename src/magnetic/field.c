/* magnetic: the main field of a spherical-harmonic model at a place and date.
 *
 * The method is the WMM technical reports' (Chulliat et al. 2020, "The US/UK
 * World Magnetic Model for 2020-2025", section 1.2): geodetic to geocentric
 * coordinates on the WGS84 ellipsoid, Schmidt semi-normalised associated
 * Legendre functions by recursion, the gradient of the potential summed in
 * the geocentric frame and turned back into the geodetic one. */
#include <math.h>
#include <stdio.h>

#include "corax/geometry.h"
#include "magnetic/model_int.h"

#define WGS84_A 6378.137                 /* semi-major axis, km */
#define WGS84_F (1.0 / 298.257223563)    /* flattening */
#define REFERENCE_RADIUS 6371.2          /* the models' reference radius, km */

/* The part of the model holding a date, or NULL. */
static const mag_part *part_at(const corax_magnetic_model *m, double year)
{
    for (size_t i = 0; i < m->n; i++)
        if (year >= m->part[i].from && year < m->part[i].to)
            return &m->part[i];
    return NULL;
}

void corax_magnetic_model_validity(const corax_magnetic_model *m, double *from, double *to)
{
    *from = m->n ? m->part[0].from : (double)NAN;
    *to = m->n ? m->part[m->n - 1].to : (double)NAN;
}

const char *corax_magnetic_model_name(const corax_magnetic_model *m) { return m->name; }

/* Schmidt semi-normalised P(n, m)(sin lat) and their derivatives with respect
 * to latitude, for x = sin, z = cos of the geocentric latitude. The Gauss-
 * normalised recursion first, then the factors that turn it into Schmidt's. */
static void legendre(int nmax, double x, double z, double *p, double *dp)
{
    p[0] = 1.0;
    dp[0] = 0.0;
    for (int n = 1; n <= nmax; n++)
        for (int m = 0; m <= n; m++) {
            size_t i = mag_index(n, m);
            if (n == m) {
                size_t a = mag_index(n - 1, m - 1);
                p[i] = z * p[a];
                dp[i] = z * dp[a] + x * p[a];
            } else if (n == 1 || m > n - 2) {
                size_t a = mag_index(n - 1, m);
                p[i] = x * p[a];
                dp[i] = x * dp[a] - z * p[a];
            } else {
                size_t a = mag_index(n - 1, m), b = mag_index(n - 2, m);
                double k = (double)((n - 1) * (n - 1) - m * m) / (double)((2 * n - 1) * (2 * n - 3));
                p[i] = x * p[a] - k * p[b];
                dp[i] = x * dp[a] - z * p[a] - k * dp[b];
            }
        }
    double s[MAG_NCOEF];
    s[0] = 1.0;
    for (int n = 1; n <= nmax; n++) {
        s[mag_index(n, 0)] = s[mag_index(n - 1, 0)] * (double)(2 * n - 1) / (double)n;
        for (int m = 1; m <= n; m++)
            s[mag_index(n, m)] = s[mag_index(n, m - 1)] *
                                 sqrt((double)((n - m + 1) * (m == 1 ? 2 : 1)) / (double)(n + m));
    }
    for (size_t i = 0; i <= mag_index(nmax, nmax); i++) {
        p[i] *= s[i];
        dp[i] *= -s[i]; /* with respect to latitude, not colatitude */
    }
}

/* The east component at a pole, where the sum's 1/cos(latitude) is 0/0: only
 * order 1 survives, through P(n, 1)/cos, which has a recursion of its own. */
static double east_at_pole(int nmax, double x, const double *g, const double *h,
                           const double *rr, double slam, double clam)
{
    double ps[CORAX_MAGNETIC_MAX_DEGREE + 1], q1 = 1.0, by = 0.0;
    ps[0] = 1.0;
    for (int n = 1; n <= nmax; n++) {
        double q2 = q1 * (double)(2 * n - 1) / (double)n;
        double q3 = q2 * sqrt((double)(2 * n) / (double)(n + 1));
        q1 = q2;
        if (n == 1) {
            ps[n] = ps[n - 1];
        } else {
            double k = (double)((n - 1) * (n - 1) - 1) / (double)((2 * n - 1) * (2 * n - 3));
            ps[n] = x * ps[n - 1] - k * ps[n - 2];
        }
        size_t i = mag_index(n, 1);
        by += rr[n] * (g[i] * slam - h[i] * clam) * ps[n] * q3;
    }
    return by;
}

/* The field of coefficients g, h (nT, degree nmax) at geodetic latitude lat,
 * longitude lon (radians) and height (km). */
static void synthesize(int nmax, const double *g, const double *h, double lat, double lon,
                       double height, corax_magnetic_field *f)
{
    const double e2 = WGS84_F * (2.0 - WGS84_F);
    double sl = sin(lat), cl = cos(lat);
    double rc = WGS84_A / sqrt(1.0 - e2 * sl * sl);
    double xp = (rc + height) * cl, zp = (rc * (1.0 - e2) + height) * sl;
    double r = sqrt(xp * xp + zp * zp);
    double latc = asin(zp / r); /* geocentric latitude */
    double x = sin(latc), z = cos(latc);
    double p[MAG_NCOEF], dp[MAG_NCOEF];
    legendre(nmax, x, z, p, dp);
    double rr[CORAX_MAGNETIC_MAX_DEGREE + 1], cm[CORAX_MAGNETIC_MAX_DEGREE + 1],
        sm[CORAX_MAGNETIC_MAX_DEGREE + 1];
    for (int n = 0; n <= nmax; n++) {
        rr[n] = pow(REFERENCE_RADIUS / r, n + 2);
        cm[n] = cos(n * lon);
        sm[n] = sin(n * lon);
    }
    double bx = 0.0, by = 0.0, bz = 0.0; /* geocentric north, east, down */
    for (int n = 1; n <= nmax; n++)
        for (int m = 0; m <= n; m++) {
            size_t i = mag_index(n, m);
            double c = g[i] * cm[m] + h[i] * sm[m];
            bz -= rr[n] * c * (n + 1) * p[i];
            by += rr[n] * (g[i] * sm[m] - h[i] * cm[m]) * m * p[i];
            bx -= rr[n] * c * dp[i];
        }
    by = fabs(z) > 1e-10 ? by / z : east_at_pole(nmax, x, g, h, rr, sm[1], cm[1]);
    double psi = latc - lat; /* turn from the geocentric frame to the geodetic */
    f->north = bx * cos(psi) - bz * sin(psi);
    f->east = by;
    f->down = bx * sin(psi) + bz * cos(psi);
    f->horizontal = hypot(f->north, f->east);
    f->total = hypot(f->horizontal, f->down);
    f->declination = atan2(f->east, f->north);
    f->inclination = atan2(f->down, f->horizontal);
}

void corax_magnetic_validity_text(const corax_magnetic_model *m, char *buf, size_t len)
{
    double from, to;
    char a[16], b[16];
    corax_magnetic_model_validity(m, &from, &to);
    corax_date_text(from, a, sizeof a);
    corax_date_text(to - 1e-6, b, sizeof b); /* the last day before `to` */
    snprintf(buf, len, "%s to %s", a, b);
}

corax_status corax_magnetic_field_at(const corax_magnetic_model *m, double year, double lat,
                                     double lon, double height, corax_magnetic_field *out,
                                     corax_error *err)
{
    if (!isfinite(lat) || !isfinite(lon) || !isfinite(height) || fabs(lat) > CORAX_PI / 2 + 1e-12)
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "no magnetic field at latitude %g, longitude %g, height %g m",
                               corax_deg(lat), corax_deg(lon), height);
    if (!isfinite(year))
        return corax_error_set(err, CORAX_EVALUE, NULL, 0, "no date for the magnetic model");
    const mag_part *part = part_at(m, year);
    if (!part) {
        char date[16], valid[64];
        corax_date_text(year, date, sizeof date);
        corax_magnetic_validity_text(m, valid, sizeof valid);
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "the date %s is outside the validity of the magnetic model %s "
                               "(%s)", date, m->name, valid);
    }
    double g[MAG_NCOEF], h[MAG_NCOEF], dt = year - part->epoch;
    for (size_t i = 0; i <= mag_index(part->nmax, part->nmax); i++) {
        g[i] = part->g[i] + dt * part->gdot[i];
        h[i] = part->h[i] + dt * part->hdot[i];
    }
    synthesize(part->nmax, g, h, lat, lon, height / 1000.0, out);
    out->model = part->name;
    return CORAX_OK;
}
