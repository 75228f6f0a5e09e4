/* stats: density of axial readings on the hemisphere, by Kamb (1959)
 * counting in a cap or by the exponential smoothing of the modified Kamb
 * method (Vollmer 1995), on a grid over the equal-area net. */
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "corax/projection.h"
#include "corax/stats.h"
#include "geometry/vec.h"
#include "stats/stats_int.h"

const char *corax_density_method_name(corax_density_method method)
{
    return method == CORAX_DENSITY_SMOOTH ? "smooth" : "kamb";
}

corax_status corax_density_init(corax_density *d, corax_density_method method, size_t n)
{
    if (n == 0)
        return CORAX_EARG;
    double nn = (double)n;
    d->method = method;
    d->n = n;
    if (method == CORAX_DENSITY_SMOOTH) {
        d->k = 2.0 * (1.0 + nn / 9.0);
        double m1 = -expm1(-d->k) / d->k, m2 = -expm1(-2.0 * d->k) / (2.0 * d->k);
        d->area = d->cos_cap = NAN;
        d->expected = nn * m1;
        d->sigma = sqrt(nn * (m2 - m1 * m1));
    } else {
        d->area = 9.0 / (nn + 9.0);
        d->cos_cap = 1.0 - d->area;
        d->k = NAN;
        d->expected = nn * d->area;
        d->sigma = sqrt(nn * d->area * (1.0 - d->area));
    }
    return CORAX_OK;
}

/* The count about u with weights already rescaled (w may be NULL). */
static double count_at(const corax_density *d, corax_vec3 u, const corax_vec3 *v,
                       const double *w, double scale)
{
    double sum = 0.0;
    if (d->method == CORAX_DENSITY_SMOOTH) {
        for (size_t i = 0; i < d->n; i++) {
            /* a reading whose term is below e^-40 adds nothing a double can keep
             * beside the expected count n/k: skip its exp */
            double e = d->k * (fabs(vec_dot(u, v[i])) - 1.0);
            if (e > -40.0)
                sum += corax_stats_weight(w, i, scale) * exp(e);
        }
    } else {
        for (size_t i = 0; i < d->n; i++)
            if (fabs(vec_dot(u, v[i])) >= d->cos_cap)
                sum += corax_stats_weight(w, i, scale);
    }
    return sum;
}

double corax_density_at(const corax_density *d, corax_vec3 u, const corax_vec3 *v,
                        const double *w)
{
    double scale;
    if (corax_stats_weight_scale(w, d->n, &scale, NULL) != CORAX_OK)
        return NAN;
    return count_at(d, u, v, w, scale);
}

/* ---- the grid: poles binned, each node counting only its neighbours ----
 *
 * Every term a node can receive comes from readings within an angle theta of
 * it, axially: the Kamb cap (|u.v| >= 1 - A), or for the smooth kernel the
 * readings whose term is above e^-40 (|u.v| > 1 - 40/k), the ones count_at()
 * keeps. theta shrinks as n grows (A = 9/(n + 9), k = 2 (1 + n/9)), so
 * each node needs a few readings, not all n. The readings are binned by where
 * their lower ends fall on the equal-area net (r <= 1), in square cells about
 * theta wide: on the lower hemisphere that projection moves no two points
 * further apart than the angle between them (its scales are cos(t/2) / sqrt 2
 * along a radius and 1 / (sqrt 2 cos(t/2)) across, t <= 90 degrees from
 * straight down, neither above 1, and the hemisphere holds the arc between
 * its points), so the readings within theta of a lower direction w fall in
 * the square of half-side theta about w's point. An axial count about a node
 * u is the count about w = u or -u, whichever points down, plus, near the
 * horizon, the readings near -w: those lie within theta of w's mirror image
 * through the vertical axis, (-w.x, -w.y, w.z), which points down too and
 * is no further from any lower reading than -w is. The squares are searched
 * cell by cell (merged when they meet, so no reading is seen twice), and each
 * reading found goes through the same test and term as count_at(): the grid
 * holds the same terms, summed in another order. */

/* theta's margin: far beyond the rounding of a dot product or a projection. */
#define BIN_MARGIN 1e-6

typedef struct bins {
    size_t m;        /* cells a side over [-1, 1]^2 */
    double cell;     /* a cell's side */
    double reach;    /* theta plus the margin: the search's half-side */
    int everywhere;  /* theta reaches every reading: one box, the whole net */
    uint32_t *start; /* cell c's readings are order[start[c] .. start[c + 1]) */
    uint32_t *order; /* reading indices, cell by cell */
} bins;

/* The point of a lower-hemisphere unit direction w on the equal-area net:
 * r = sqrt(2) sin(t/2) = |(w.x, w.y)| / sqrt(1 - w.z), stable for w.z <= 0. */
static void net_point(corax_vec3 w, double *x, double *y)
{
    double f = 1.0 / sqrt(1.0 - w.z);
    *x = w.x * f;
    *y = w.y * f;
}

/* The cell of a coordinate, clamped to the net (a reading that is not a
 * number goes to the first cell, where its test fails as it always did). */
static size_t cell_index(const bins *b, double x)
{
    double c = floor((x + 1.0) / b->cell);
    return !(c > 0.0) ? 0 : c >= (double)b->m ? b->m - 1 : (size_t)c;
}

static size_t cell_of(const bins *b, corax_vec3 v)
{
    if (v.z > 0.0)
        v = vec_neg(v);
    double x, y;
    net_point(v, &x, &y);
    return cell_index(b, y) * b->m + cell_index(b, x);
}

/* The angle about a node beyond which no reading adds to its count. */
static double kernel_reach(const corax_density *d)
{
    double c = d->method == CORAX_DENSITY_SMOOTH ? 1.0 - 40.0 / d->k : d->cos_cap;
    return c > 0.0 ? acos(c) : 0.5 * CORAX_PI;
}

static void bins_free(bins *b)
{
    free(b->start);
    free(b->order);
}

static corax_status bins_build(bins *b, const corax_density *d, const corax_vec3 *v)
{
    memset(b, 0, sizeof *b);
    double theta = kernel_reach(d);
    b->reach = theta + BIN_MARGIN;
    b->everywhere = theta >= 0.5 * CORAX_PI;
    /* cells about theta wide, but never many more than readings */
    double side = fmax(2.0 / b->reach, 1.0);
    double most = fmin(2048.0, ceil(2.0 * sqrt((double)d->n)));
    b->m = (size_t)fmax(1.0, fmin(floor(side), most));
    b->cell = 2.0 / (double)b->m;
    size_t cells = b->m * b->m;
    b->start = calloc(cells + 1, sizeof *b->start);
    b->order = malloc(d->n * sizeof *b->order);
    if (!b->start || !b->order) {
        bins_free(b);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; i < d->n; i++)
        b->start[cell_of(b, v[i]) + 1]++;
    for (size_t c = 0; c < cells; c++)
        b->start[c + 1] += b->start[c];
    uint32_t *fill = malloc(cells * sizeof *fill);
    if (!fill) {
        bins_free(b);
        return CORAX_ENOMEM;
    }
    memcpy(fill, b->start, cells * sizeof *fill);
    for (size_t i = 0; i < d->n; i++)
        b->order[fill[cell_of(b, v[i])]++] = (uint32_t)i;
    free(fill);
    return CORAX_OK;
}

/* A range of cells, [x0, x1] by [y0, y1]. */
typedef struct box {
    size_t x0, x1, y0, y1;
} box;

static box box_about(const bins *b, corax_vec3 w)
{
    double x, y;
    net_point(w, &x, &y);
    return (box){cell_index(b, x - b->reach), cell_index(b, x + b->reach),
                 cell_index(b, y - b->reach), cell_index(b, y + b->reach)};
}

static int boxes_meet(box a, box c)
{
    return a.x0 <= c.x1 && c.x0 <= a.x1 && a.y0 <= c.y1 && c.y0 <= a.y1;
}

/* The terms of the readings in the cells of box k about u. */
static double box_sum(const corax_density *d, const bins *b, box k, corax_vec3 u,
                      const corax_vec3 *v, const double *w, double scale)
{
    double sum = 0.0;
    for (size_t y = k.y0; y <= k.y1; y++) {
        uint32_t from = b->start[y * b->m + k.x0], to = b->start[y * b->m + k.x1 + 1];
        if (d->method == CORAX_DENSITY_SMOOTH) {
            for (uint32_t j = from; j < to; j++) {
                size_t i = b->order[j];
                double e = d->k * (fabs(vec_dot(u, v[i])) - 1.0);
                if (e > -40.0)
                    sum += corax_stats_weight(w, i, scale) * exp(e);
            }
        } else {
            for (uint32_t j = from; j < to; j++) {
                size_t i = b->order[j];
                if (fabs(vec_dot(u, v[i])) >= d->cos_cap)
                    sum += corax_stats_weight(w, i, scale);
            }
        }
    }
    return sum;
}

/* count_at(), from the binned readings. */
static double binned_count(const corax_density *d, const bins *b, corax_vec3 u,
                           const corax_vec3 *v, const double *w, double scale)
{
    box all = {0, b->m - 1, 0, b->m - 1};
    if (b->everywhere)
        return box_sum(d, b, all, u, v, w, scale);
    corax_vec3 down = u.z > 0.0 ? vec_neg(u) : u;
    box near = box_about(b, down);
    if (-down.z >= sin(b->reach)) /* the other end's cap stays above the horizon */
        return box_sum(d, b, near, u, v, w, scale);
    box mirror = box_about(b, vec3(-down.x, -down.y, down.z));
    if (boxes_meet(near, mirror)) {
        box both = {near.x0 < mirror.x0 ? near.x0 : mirror.x0,
                    near.x1 > mirror.x1 ? near.x1 : mirror.x1,
                    near.y0 < mirror.y0 ? near.y0 : mirror.y0,
                    near.y1 > mirror.y1 ? near.y1 : mirror.y1};
        return box_sum(d, b, both, u, v, w, scale);
    }
    return box_sum(d, b, near, u, v, w, scale) + box_sum(d, b, mirror, u, v, w, scale);
}

corax_status corax_density_grid(const corax_density *d, const corax_vec3 *v, const double *w,
                                size_t size, double *values)
{
    if (size < 3 || d->n > UINT32_MAX)
        return CORAX_EARG;
    double scale;
    corax_status st = corax_stats_weight_scale(w, d->n, &scale, NULL);
    if (st != CORAX_OK)
        return st;
    bins b;
    if ((st = bins_build(&b, d, v)) != CORAX_OK)
        return st;
    const double edge = sqrt(2.0), h = 2.0 * edge / (double)(size - 1);
    const double up = binned_count(d, &b, vec3(0, 0, 1), v, w, scale);
    long rows = (long)size;
#pragma omp parallel for schedule(dynamic)
    for (long j = 0; j < rows; j++) {
        for (size_t i = 0; i < size; i++) {
            corax_vec3 u;
            double x = -edge + (double)i * h, y = -edge + (double)j * h;
            double *out = &values[(size_t)j * size + i];
            if (corax_unproject(CORAX_EQUAL_AREA, x, y, &u) != CORAX_OK)
                *out = up; /* beyond the whole sphere: the count straight up */
            else
                *out = binned_count(d, &b, u, v, w, scale);
        }
    }
    bins_free(&b);
    return CORAX_OK;
}
