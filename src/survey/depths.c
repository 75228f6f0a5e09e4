/* survey: the depths worth a point down a hole (collar, steps, stations, end),
 * shared by every command that traces a hole. */
#include <math.h>
#include <stdlib.h>

#include "corax/survey.h"

static int depth_cmp(const void *a, const void *b)
{
    const corax_hole_depth *x = a, *y = b;
    if (x->depth != y->depth)
        return x->depth < y->depth ? -1 : 1;
    return (int)y->kind - (int)x->kind; /* the higher kind first, so it is the one kept */
}

corax_status corax_hole_depths(const corax_hole *h, double step, corax_hole_depth **out,
                               size_t *n)
{
    *out = NULL;
    *n = 0;
    if (!(step >= 0.0) || !isfinite(step))
        return CORAX_EARG;
    size_t ns = corax_hole_station_count(h);
    double length = corax_hole_length(h);
    double nsteps = step > 0.0 ? floor(length / step) + 1.0 : 0.0;
    if (nsteps > CORAX_MAX_HOLE_POINTS)
        return CORAX_EARG;
    size_t cap = (size_t)nsteps + ns + 2, k = 0;
    corax_hole_depth *p = malloc(cap * sizeof *p);
    if (!p)
        return CORAX_ENOMEM;
    p[k++] = (corax_hole_depth){0.0, CORAX_DEPTH_COLLAR, 0};
    for (size_t i = 1; i < (size_t)nsteps; i++) {
        double d = (double)i * step;
        if (d < length) /* the end is listed as itself */
            p[k++] = (corax_hole_depth){d, CORAX_DEPTH_STEP, 0};
    }
    for (size_t i = 0; i < ns; i++) {
        corax_station s;
        corax_hole_station(h, i, &s, NULL, NULL);
        p[k++] = (corax_hole_depth){s.depth, CORAX_DEPTH_STATION, i};
    }
    if (length > 0.0)
        p[k++] = (corax_hole_depth){length, CORAX_DEPTH_END, 0};
    qsort(p, k, sizeof *p, depth_cmp);
    size_t kept = 0;
    for (size_t i = 0; i < k; i++)
        if (kept == 0 || p[i].depth - p[kept - 1].depth >= 1e-9)
            p[kept++] = p[i];
    *out = p;
    *n = kept;
    return CORAX_OK;
}
