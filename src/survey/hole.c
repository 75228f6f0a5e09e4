/* survey: the hole model. Desurveys a hole by minimum curvature and answers
 * position and direction at any depth. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/survey.h"
#include "geometry/vec.h"
#include "survey/hole_int.h"
#include "survey/mincurve.h"

static int station_cmp(const void *a, const void *b)
{
    const corax_station *x = a, *y = b;
    if (x->depth != y->depth)
        return x->depth < y->depth ? -1 : 1;
    return x->line < y->line ? -1 : x->line > y->line; /* keep a stable order */
}

/* The course from node i to node i + 1 as corax_hole_at() reads it. */
static void set_span(corax_hole *h, size_t i)
{
    const corax_hole_node *a = &h->node[i], *z = &h->node[i + 1];
    corax_hole_span *s = (corax_hole_span *)&hole_spans(h)[i];
    s->r1 = a->r;
    s->t1 = a->t;
    s->t2 = z->t;
    s->course = z->course;
    s->straight = z->straight;
}

/* Fill node positions from node tangents: the desurvey proper. */
static corax_status desurvey_nodes(corax_hole *h, corax_error *err)
{
    h->node[0].r = h->collar.position;
    h->node[0].course.b = NAN;
    for (size_t i = 1; i < h->n; i++) {
        corax_hole_node *a = &h->node[i - 1], *z = &h->node[i];
        double length = z->depth - a->depth;
        if (z->straight) {
            z->course = (corax_mc_course){length, NAN, 0.0, 1.0, 0.0};
            z->r = vec_add(a->r, vec_scale(a->t, length));
            set_span(h, i - 1);
            continue;
        }
        z->course = corax_mc_course_of(a->t, z->t, length);
        if (z->course.b > CORAX_PI - 1e-9) {
            const corax_station *sa = &h->given[i - 1 - h->offset];
            const corax_station *sz = &h->given[i - h->offset];
            return corax_error_set(err, CORAX_ESURVEY, NULL, sz->line,
                                   "hole %s: the stations at depths %g (line %ld) and %g "
                                   "(line %ld) point in opposite directions (a 180-degree "
                                   "dogleg has no arc)",
                                   h->name, sa->depth, sa->line, sz->depth, sz->line);
        }
        z->r = corax_mc_end(a->r, a->t, z->t, &z->course);
        set_span(h, i - 1);
    }
    return CORAX_OK;
}

/* A hole's block with room for `room` nodes: the header zeroed. */
static corax_hole *hole_alloc(size_t room)
{
    size_t spans = ((room > 1 ? room - 1 : 1) * sizeof(corax_hole_span) + 63) / 64 * 64;
    corax_hole *h = aligned_alloc(64, CORAX_HOLE_HEAD + corax_hole_depth_bytes(room) + spans);
    if (!h)
        return NULL;
    memset(h, 0, sizeof *h);
    h->room = room;
    return h;
}

static corax_status check_station(const char *name, const corax_station *s, corax_error *err)
{
    if (!isfinite(s->depth) || s->depth < 0.0)
        return corax_error_set(err, CORAX_EVALUE, NULL, s->line,
                               "hole %s: survey depth %g is negative or not finite", name,
                               s->depth);
    if (!isfinite(s->azimuth) || !isfinite(s->plunge))
        return corax_error_set(err, CORAX_EVALUE, NULL, s->line,
                               "hole %s: survey at depth %g has no finite direction", name,
                               s->depth);
    return CORAX_OK;
}

/* Sort and check the stations, then lay out the path nodes. */
static corax_status build_nodes(corax_hole *h, corax_error *err)
{
    size_t n = h->n_given;
    qsort(h->given, n, sizeof *h->given, station_cmp);
    for (size_t i = 0; i < n; i++) {
        corax_status st = check_station(h->name, &h->given[i], err);
        if (st != CORAX_OK)
            return st;
        if (i > 0 && h->given[i].depth == h->given[i - 1].depth)
            return corax_error_set(err, CORAX_EREPEAT, NULL, h->given[i].line,
                                   "hole %s: survey depth %g appears twice (lines %ld and %ld)",
                                   h->name, h->given[i].depth, h->given[i - 1].line,
                                   h->given[i].line);
    }
    h->offset = (n == 0 || h->given[0].depth > 0.0) ? 1 : 0;
    h->n = n + h->offset;
    h->node = calloc(h->n ? h->n : 1, sizeof *h->node);
    if (!h->node)
        return CORAX_ENOMEM;
    if (h->offset) { /* the collar leads the path, straight to the first station */
        const corax_collar *c = &h->collar;
        h->node[0].depth = 0.0;
        h->node[0].azimuth = c->has_direction ? c->azimuth : h->given[0].azimuth;
        h->node[0].plunge = c->has_direction ? c->plunge : h->given[0].plunge;
        h->node[0].t = corax_direction(h->node[0].azimuth, h->node[0].plunge);
        h->node[0].azimuth_error = h->node[0].dip_error = NAN;
    }
    for (size_t i = 0; i < n; i++) {
        corax_hole_node *z = &h->node[i + h->offset];
        z->depth = h->given[i].depth;
        z->azimuth = h->given[i].azimuth;
        z->plunge = h->given[i].plunge;
        z->azimuth_error = h->given[i].has_errors ? h->given[i].azimuth_error : (double)NAN;
        z->dip_error = h->given[i].has_errors ? h->given[i].dip_error : (double)NAN;
        z->t = corax_direction(z->azimuth, z->plunge);
        z->straight = (i == 0 && h->offset);
    }
    double *depth = (double *)hole_depths(h); /* the block is h's own */
    for (size_t i = 0; i < h->n; i++)
        depth[i] = h->node[i].depth;
    return desurvey_nodes(h, err);
}

corax_status corax_hole_new(const char *name, const corax_collar *collar,
                            const corax_station *stations, size_t n,
                            double azimuth_correction, corax_hole **out, corax_error *err)
{
    *out = NULL;
    if (!name || !collar || (n && !stations))
        return corax_error_set(err, CORAX_EARG, NULL, 0, "hole: missing argument");
    corax_hole *h = hole_alloc(n + 1); /* the stations, and the collar when it leads */
    if (!h)
        return CORAX_ENOMEM;
    corax_status st = CORAX_ENOMEM;
    h->name = strdup(name);
    h->given = malloc((n ? n : 1) * sizeof *h->given);
    if (!h->name || !h->given)
        goto fail;
    h->collar = *collar;
    h->n_given = n;
    for (size_t i = 0; i < n; i++) {
        h->given[i] = stations[i];
        h->given[i].azimuth = corax_wrap_azimuth(stations[i].azimuth + azimuth_correction);
    }
    h->has_path = n > 0 || collar->has_direction;
    if (h->has_path) {
        st = build_nodes(h, err);
        if (st != CORAX_OK)
            goto fail;
    }
    double last = h->n ? h->node[h->n - 1].depth : 0.0;
    h->has_length = isfinite(collar->length) && collar->length > 0.0;
    h->length = h->has_length ? collar->length : last;
    *out = h;
    return CORAX_OK;
fail:
    corax_hole_free(h);
    return st;
}

corax_hole *corax_hole_copy(const corax_hole *base)
{
    corax_hole *h = hole_alloc(base->room);
    if (!h)
        return NULL;
    size_t spans = base->n > 1 ? base->n - 1 : 0;
    memcpy(h, base, sizeof *h);
    memcpy((void *)hole_depths(h), hole_depths(base), base->n * sizeof(double));
    memcpy((void *)hole_spans(h), hole_spans(base), spans * sizeof(corax_hole_span));
    h->name = strdup(base->name);
    h->given = malloc((base->n_given ? base->n_given : 1) * sizeof *h->given);
    h->node = malloc((base->n ? base->n : 1) * sizeof *h->node);
    if (!h->name || !h->given || !h->node) {
        corax_hole_free(h);
        return NULL;
    }
    memcpy(h->given, base->given, base->n_given * sizeof *h->given);
    memcpy(h->node, base->node, base->n * sizeof *h->node);
    return h;
}

size_t corax_hole_node_count(const corax_hole *h) { return h->n; }

void corax_hole_node_errors(const corax_hole *h, size_t i, double *azimuth_error, double *dip_error)
{
    *azimuth_error = i < h->n ? h->node[i].azimuth_error : (double)NAN;
    *dip_error = i < h->n ? h->node[i].dip_error : (double)NAN;
}

corax_status corax_hole_resurvey(corax_hole *work, const corax_hole *base,
                                 const double *d_azimuth, const double *d_plunge)
{
    for (size_t i = 0; i < base->n; i++) {
        /* a collar node without its own direction borrows the first station's */
        size_t k = (i == 0 && base->offset && !base->collar.has_direction && base->n > 1) ? 1 : i;
        const corax_hole_node *b = &base->node[i];
        work->node[i].t = corax_direction(b->azimuth + d_azimuth[k], b->plunge + d_plunge[k]);
    }
    return desurvey_nodes(work, NULL);
}

void corax_hole_free(corax_hole *h)
{
    if (!h)
        return;
    free(h->name);
    free(h->given);
    free(h->node);
    free(h);
}

void corax_hole_prefetch(const corax_hole *h)
{
    if (!h)
        return;
    /* the header and the first depths, without reading the hole (which
     * would wait for it) */
    const char *b = (const char *)h;
    for (size_t k = 0; k < CORAX_HOLE_HEAD + 256; k += 64)
        __builtin_prefetch(b + k);
}

void corax_hole_prefetch_course(const corax_hole *h, double depth)
{
    if (!h || !h->has_path || !(depth >= 0.0) || h->n < 2 || depth >= hole_depths(h)[h->n - 1])
        return;
    const char *b = (const char *)&hole_spans(h)[find_course(h, depth, NULL)];
    __builtin_prefetch(b);
    __builtin_prefetch(b + sizeof(corax_hole_span) - 1);
}

corax_status corax_hole_at(const corax_hole *h, double depth, size_t *hint,
                           corax_hole_point *pt)
{
    return hole_at(h, depth, hint, pt);
}

const char *corax_hole_name(const corax_hole *h) { return h->name; }
const corax_collar *corax_hole_collar(const corax_hole *h) { return &h->collar; }
double corax_hole_length(const corax_hole *h) { return h->length; }
size_t corax_hole_station_count(const corax_hole *h) { return h->n_given; }

corax_status corax_hole_station(const corax_hole *h, size_t i, corax_station *station,
                                corax_vec3 *position, double *dogleg_severity)
{
    if (i >= h->n_given)
        return CORAX_EARG;
    const corax_hole_node *z = &h->node[i + h->offset];
    if (station)
        *station = h->given[i];
    if (position)
        *position = z->r;
    if (dogleg_severity) {
        double length = (i + h->offset > 0) ? z->depth - z[-1].depth : 0.0;
        *dogleg_severity =
            (isnan(z->course.b) || length <= 0.0) ? (double)NAN : z->course.b * 30.0 / length;
    }
    return CORAX_OK;
}
