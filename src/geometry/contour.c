/* geometry: isolines of a gridded field by marching squares. Each cell gives
 * at most two segments between crossings on its edges; segments that share
 * an edge are chained into polylines. */
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "corax/contour.h"

enum { NONE = -1 };

/* Cell edges by side: bottom, right, top, left. */
enum { BOTTOM, RIGHT, TOP, LEFT };

/* Segments of each marching-squares case (corner bits: 1 bottom-left,
 * 2 bottom-right, 4 top-right, 8 top-left set when at or above the level),
 * as pairs of sides; -1 ends. Saddles 5 and 10 list the split for a centre
 * below the level; the other split is chosen in cell_segments(). */
static const signed char cases[16][4] = {
    {-1, -1, -1, -1}, {LEFT, BOTTOM, -1, -1}, {BOTTOM, RIGHT, -1, -1}, {LEFT, RIGHT, -1, -1},
    {RIGHT, TOP, -1, -1}, {LEFT, BOTTOM, RIGHT, TOP}, {BOTTOM, TOP, -1, -1}, {LEFT, TOP, -1, -1},
    {TOP, LEFT, -1, -1}, {BOTTOM, TOP, -1, -1}, {BOTTOM, RIGHT, TOP, LEFT}, {RIGHT, TOP, -1, -1},
    {LEFT, RIGHT, -1, -1}, {BOTTOM, RIGHT, -1, -1}, {LEFT, BOTTOM, -1, -1}, {-1, -1, -1, -1},
};

typedef struct tracer {
    const corax_grid *g;
    double level;
    int64_t (*seg)[2];  /* the two edge ids of each segment */
    size_t nseg, seg_cap;
    int64_t (*on_edge)[2]; /* the (at most two) segments on each edge */
    unsigned char *used;
} tracer;

static double node(const corax_grid *g, size_t i, size_t j) { return g->value[j * g->nx + i]; }

/* Edge ids: the horizontal edge from node (i, j) to (i+1, j) is 2 (j nx + i),
 * the vertical one from (i, j) to (i, j+1) is 2 (j nx + i) + 1. */
static int64_t edge_id(const corax_grid *g, size_t i, size_t j, int side)
{
    switch (side) {
    case BOTTOM: return 2 * (int64_t)(j * g->nx + i);
    case TOP: return 2 * (int64_t)((j + 1) * g->nx + i);
    case LEFT: return 2 * (int64_t)(j * g->nx + i) + 1;
    default: return 2 * (int64_t)(j * g->nx + i + 1) + 1;
    }
}

/* Where the level crosses an edge. */
static void edge_point(const tracer *t, int64_t id, double *x, double *y)
{
    const corax_grid *g = t->g;
    size_t k = (size_t)(id / 2), i = k % g->nx, j = k / g->nx;
    size_t i2 = id % 2 ? i : i + 1, j2 = id % 2 ? j + 1 : j;
    double a = node(g, i, j), b = node(g, i2, j2);
    double f = (t->level - a) / (b - a);
    *x = g->x0 + ((double)i + f * (double)(i2 - i)) * g->dx;
    *y = g->y0 + ((double)j + f * (double)(j2 - j)) * g->dy;
}

static int add_segment(tracer *t, int64_t e0, int64_t e1)
{
    if (t->nseg == t->seg_cap) {
        size_t cap = t->seg_cap ? 2 * t->seg_cap : 1024;
        void *p = realloc(t->seg, cap * sizeof *t->seg);
        if (!p)
            return 0;
        t->seg = p;
        t->seg_cap = cap;
    }
    int64_t s = (int64_t)t->nseg++;
    t->seg[s][0] = e0;
    t->seg[s][1] = e1;
    for (int k = 0; k < 2; k++) {
        int64_t *slot = t->on_edge[k ? e1 : e0];
        slot[slot[0] == NONE ? 0 : 1] = s;
    }
    return 1;
}

static int cell_segments(tracer *t, size_t i, size_t j)
{
    const corax_grid *g = t->g;
    double c[4] = {node(g, i, j), node(g, i + 1, j), node(g, i + 1, j + 1), node(g, i, j + 1)};
    int index = 0;
    for (int k = 0; k < 4; k++) {
        if (isnan(c[k]))
            return 1;
        index |= (c[k] >= t->level) << k;
    }
    const signed char *s = cases[index];
    static const signed char centre_above[2][4] = {{BOTTOM, RIGHT, TOP, LEFT},
                                                   {LEFT, BOTTOM, RIGHT, TOP}};
    if ((index == 5 || index == 10) && 0.25 * (c[0] + c[1] + c[2] + c[3]) >= t->level)
        s = centre_above[index == 10];
    for (int k = 0; k < 4 && s[k] >= 0; k += 2)
        if (!add_segment(t, edge_id(g, i, j, s[k]), edge_id(g, i, j, s[k + 1])))
            return 0;
    return 1;
}

static int reserve(corax_isolines *o, size_t points, size_t lines)
{
    if (o->points + points > o->point_cap) {
        size_t cap = o->point_cap ? o->point_cap : 1024;
        while (cap < o->points + points)
            cap *= 2;
        double *p = realloc(o->xy, 2 * cap * sizeof *p);
        if (!p)
            return 0;
        o->xy = p;
        o->point_cap = cap;
    }
    if (o->count + lines + 1 > o->line_cap) {
        size_t cap = o->line_cap ? o->line_cap : 64;
        while (cap < o->count + lines + 1)
            cap *= 2;
        size_t *st = realloc(o->start, cap * sizeof *st);
        if (!st)
            return 0;
        o->start = st;
        unsigned char *cl = realloc(o->closed, cap);
        if (!cl)
            return 0;
        o->closed = cl;
        o->line_cap = cap;
    }
    return 1;
}

/* The segment on edge e other than s that is not yet used, or NONE. */
static int64_t next_on_edge(const tracer *t, int64_t e, int64_t s)
{
    for (int k = 0; k < 2; k++) {
        int64_t n = t->on_edge[e][k];
        if (n != NONE && n != s && !t->used[n])
            return n;
    }
    return NONE;
}

/* Walk a chain from segment s, entering through edge e. */
static int walk(tracer *t, int64_t s, int64_t e, corax_isolines *o)
{
    if (!reserve(o, 1, 1))
        return 0;
    o->start[o->count] = o->points;
    edge_point(t, e, &o->xy[2 * o->points], &o->xy[2 * o->points + 1]);
    o->points++;
    int64_t first = e;
    while (s != NONE) {
        t->used[s] = 1;
        e = t->seg[s][0] == e ? t->seg[s][1] : t->seg[s][0];
        int64_t n = next_on_edge(t, e, s);
        if (e == first && n == NONE) {
            o->closed[o->count] = 1; /* back where it started */
            o->count++;
            o->start[o->count] = o->points;
            return 1;
        }
        if (!reserve(o, 1, 0))
            return 0;
        edge_point(t, e, &o->xy[2 * o->points], &o->xy[2 * o->points + 1]);
        o->points++;
        s = n;
    }
    o->closed[o->count] = 0;
    o->count++;
    o->start[o->count] = o->points;
    return 1;
}

static int chain(tracer *t, corax_isolines *o)
{
    /* open lines first, from an end whose edge has no other segment */
    for (size_t s = 0; s < t->nseg; s++)
        for (int k = 0; k < 2 && !t->used[s]; k++) {
            int64_t e = t->seg[s][k];
            if (t->on_edge[e][1] == NONE && !walk(t, (int64_t)s, e, o))
                return 0;
        }
    for (size_t s = 0; s < t->nseg; s++) /* what is left closes on itself */
        if (!t->used[s] && !walk(t, (int64_t)s, t->seg[s][0], o))
            return 0;
    return 1;
}

corax_status corax_isolines_trace(const corax_grid *g, double level, corax_isolines *out)
{
    out->count = out->points = 0;
    if (g->nx < 2 || g->ny < 2 || !g->value)
        return CORAX_EARG;
    corax_status st = CORAX_ENOMEM;
    tracer t = {g, level, NULL, 0, 0, NULL, NULL};
    size_t edges = 2 * g->nx * g->ny;
    t.on_edge = malloc(edges * sizeof *t.on_edge);
    if (!t.on_edge || !reserve(out, 0, 0))
        goto done;
    memset(t.on_edge, 0xff, edges * sizeof *t.on_edge); /* every slot NONE (-1) */
    for (size_t j = 0; j + 1 < g->ny; j++)
        for (size_t i = 0; i + 1 < g->nx; i++)
            if (!cell_segments(&t, i, j))
                goto done;
    t.used = calloc(t.nseg ? t.nseg : 1, 1);
    if (!t.used)
        goto done;
    out->start[0] = 0;
    if (chain(&t, out))
        st = CORAX_OK;
done:
    free(t.seg);
    free(t.on_edge);
    free(t.used);
    if (st != CORAX_OK)
        out->count = out->points = 0;
    return st;
}

void corax_isolines_clear(corax_isolines *o)
{
    free(o->xy);
    free(o->start);
    free(o->closed);
    memset(o, 0, sizeof *o);
}
