/* draw: the QA report's model of a drill program. Every hole named by the
 * program, the findings or the readings, in the order the findings are
 * sorted in; each with its findings, its readings by depth and its path
 * sampled for the plan and the section. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "common/order.h"
#include "draw/report_int.h"

/* The colours are the palette's brick, orange and sky: they differ in
 * lightness as well as hue, and each severity has its own shape too. */
const report_look corax_report_look[REPORT_SEVERITIES] = {
    [CORAX_NOTE] = {"#6fc0ea", CORAX_SHAPE_CIRCLE, "\xe2\x97\x8f", "#eaf5fb"},
    [CORAX_WARNING] = {"#e07b00", CORAX_SHAPE_TRIANGLE, "\xe2\x96\xb2", "#fdf1e1"},
    [CORAX_ERROR] = {"#a3271e", CORAX_SHAPE_SQUARE, "\xe2\x96\xa0", "#f7e4e2"},
};

const char corax_report_ink[] = "#3a3a3a";

static const double same_depth = 0.005; /* metres: a finding at a depth names readings this near */

static int name_order(const void *pa, const void *pb)
{
    const char *a = *(const char *const *)pa, *b = *(const char *const *)pb;
    int c = corax_hole_name_cmp(a, b);
    return c ? c : strcmp(a, b);
}

static int text_order(const void *pa, const void *pb)
{
    return strcmp(*(const char *const *)pa, *(const char *const *)pb);
}

/* Sort the names and keep each once; returns how many are left. */
static size_t sort_unique(const char **names, size_t n, int (*order)(const void *, const void *))
{
    if (n == 0)
        return 0;
    qsort(names, n, sizeof *names, order);
    size_t k = 1;
    for (size_t i = 1; i < n; i++)
        if (strcmp(names[i], names[k - 1]) != 0)
            names[k++] = names[i];
    return k;
}

static long find_name(const char *const *names, size_t n, const char *name,
                      int (*order)(const void *, const void *))
{
    const char *const *hit = bsearch(&name, names, n, sizeof *names, order);
    return hit ? (long)(hit - names) : -1;
}

static long hole_index(const report_model *m, const char *name)
{
    for (size_t lo = 0, hi = m->nhole; lo < hi;) { /* the holes are in name_order */
        size_t mid = (lo + hi) / 2;
        const char *probe = m->hole[mid].name;
        int c = name_order(&name, &probe);
        if (c == 0)
            return (long)mid;
        if (c < 0)
            hi = mid;
        else
            lo = mid + 1;
    }
    return -1;
}

static int usable(const corax_qa_reading *r) { return !r->problem && r->hole && *r->hole; }

/* The names of every hole: the program's, then those of findings and readings. */
static corax_status collect_holes(report_model *m)
{
    const corax_report_input *in = m->in;
    size_t nprogram = in->program ? corax_program_size(in->program) : 0;
    const char **names = malloc((nprogram + m->nfinding + in->nreadings + 1) * sizeof *names);
    if (!names)
        return CORAX_ENOMEM;
    size_t n = 0;
    for (size_t i = 0; i < nprogram; i++)
        names[n++] = corax_hole_name(corax_program_hole(in->program, i));
    for (size_t i = 0; i < m->nfinding; i++)
        if (m->finding[i].hole[0])
            names[n++] = m->finding[i].hole;
    for (size_t i = 0; i < in->nreadings; i++)
        if (usable(&in->readings[i]))
            names[n++] = in->readings[i].hole;
    n = sort_unique(names, n, name_order);
    m->hole = calloc(n ? n : 1, sizeof *m->hole);
    if (!m->hole) {
        free(names);
        return CORAX_ENOMEM;
    }
    m->nhole = n;
    for (size_t i = 0; i < n; i++) {
        report_hole *h = &m->hole[i];
        h->name = names[i];
        h->path = in->program ? corax_program_find(in->program, names[i], strlen(names[i])) : NULL;
    }
    free(names);
    return CORAX_OK;
}

typedef struct keyed_depth {
    double depth;
    size_t index;
} keyed_depth;

static int depth_order(const void *pa, const void *pb)
{
    const keyed_depth *a = pa, *b = pb;
    int na = isnan(a->depth), nb = isnan(b->depth);
    if (na != nb)
        return na - nb; /* no depth last */
    if (!na && a->depth != b->depth)
        return a->depth < b->depth ? -1 : 1;
    return (a->index > b->index) - (a->index < b->index);
}

/* Each hole's findings and readings as index lists in one store; the
 * readings by depth. */
static corax_status assign(report_model *m)
{
    const corax_report_input *in = m->in;
    long *owner = malloc((m->nfinding + in->nreadings + 1) * sizeof *owner);
    m->store = malloc((m->nfinding + in->nreadings + 1) * sizeof *m->store);
    keyed_depth *keys = malloc((in->nreadings + 1) * sizeof *keys);
    if (!owner || !m->store || !keys) {
        free(owner);
        free(keys);
        return CORAX_ENOMEM;
    }
    long *reading_owner = owner + m->nfinding;
    for (size_t i = 0; i < m->nfinding; i++) {
        const corax_finding *f = &m->finding[i];
        m->count[f->severity]++;
        owner[i] = f->hole[0] ? hole_index(m, f->hole) : -1;
        if (owner[i] < 0)
            m->nwide++;
        else
            m->hole[owner[i]].nfinding++;
    }
    for (size_t i = 0; i < in->nreadings; i++) {
        reading_owner[i] = usable(&in->readings[i]) ? hole_index(m, in->readings[i].hole) : -1;
        if (reading_owner[i] < 0)
            m->unreadable++;
        else
            m->hole[reading_owner[i]].nreading++;
    }
    size_t *next = m->store; /* hand out the store, then fill each list in order */
    m->wide = next;
    next += m->nwide;
    for (size_t h = 0; h < m->nhole; h++) {
        m->hole[h].finding = next;
        next += m->hole[h].nfinding;
        m->hole[h].reading = next;
        next += m->hole[h].nreading;
        m->hole[h].nfinding = m->hole[h].nreading = 0;
    }
    m->nwide = 0;
    for (size_t i = 0; i < m->nfinding; i++) {
        if (owner[i] < 0) {
            m->wide[m->nwide++] = i;
            continue;
        }
        report_hole *h = &m->hole[owner[i]];
        h->finding[h->nfinding++] = i;
        h->count[m->finding[i].severity]++;
        h->nwhole += isnan(m->finding[i].depth);
    }
    for (size_t i = 0; i < in->nreadings; i++)
        if (reading_owner[i] >= 0) {
            report_hole *h = &m->hole[reading_owner[i]];
            h->reading[h->nreading++] = i;
        }
    for (size_t h = 0; h < m->nhole; h++) {
        report_hole *hole = &m->hole[h];
        for (size_t k = 0; k < hole->nreading; k++)
            keys[k] = (keyed_depth){in->readings[hole->reading[k]].reading.depth,
                                    hole->reading[k]};
        qsort(keys, hole->nreading, sizeof *keys, depth_order);
        for (size_t k = 0; k < hole->nreading; k++)
            hole->reading[k] = keys[k].index;
    }
    free(owner);
    free(keys);
    return CORAX_OK;
}

int corax_report_finding_holds(const corax_finding *f, double depth)
{
    if (!isfinite(f->depth) || !isfinite(depth))
        return 0;
    double lo = f->depth, hi = isfinite(f->depth_to) ? f->depth_to : f->depth;
    if (lo > hi) {
        double t = lo;
        lo = hi;
        hi = t;
    }
    return depth >= lo - same_depth && depth <= hi + same_depth;
}

/* The feature kinds, each reading's kind, and whether it lies in a stretch
 * that a warning or an error of its hole names. */
static corax_status classify(report_model *m)
{
    const corax_report_input *in = m->in;
    size_t n = in->nreadings;
    m->kind = malloc((n + 1) * sizeof *m->kind);
    m->kind_of = calloc(n + 1, sizeof *m->kind_of);
    m->flagged = calloc(n + 1, 1);
    if (!m->kind || !m->kind_of || !m->flagged)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < n; i++)
        if (usable(&in->readings[i]))
            m->kind[m->nkind++] = in->readings[i].kind ? in->readings[i].kind : "";
    m->nkind = sort_unique(m->kind, m->nkind, text_order);
    for (size_t i = 0; i < n; i++)
        if (usable(&in->readings[i])) {
            const char *k = in->readings[i].kind ? in->readings[i].kind : "";
            m->kind_of[i] = (size_t)find_name(m->kind, m->nkind, k, text_order);
        }
    for (size_t h = 0; h < m->nhole; h++) {
        const report_hole *hole = &m->hole[h];
        for (size_t k = 0; k < hole->nreading; k++) {
            size_t r = hole->reading[k];
            for (size_t j = 0; j < hole->nfinding && !m->flagged[r]; j++) {
                const corax_finding *f = &m->finding[hole->finding[j]];
                m->flagged[r] = f->severity >= CORAX_WARNING &&
                                corax_report_finding_holds(f, in->readings[r].reading.depth);
            }
        }
    }
    return CORAX_OK;
}

static double deeper(double a, double b) { return isfinite(b) && b > a ? b : a; }

/* The hole's path every few metres (at most about 400 points), and the
 * depth its strip must show. */
static corax_status trace(report_model *m, report_hole *h)
{
    for (size_t k = 0; k < h->nreading; k++)
        h->depth_shown = deeper(h->depth_shown, m->in->readings[h->reading[k]].reading.depth);
    for (size_t k = 0; k < h->nfinding; k++) {
        const corax_finding *f = &m->finding[h->finding[k]];
        h->depth_shown = deeper(deeper(h->depth_shown, f->depth), f->depth_to);
    }
    if (!h->path)
        return CORAX_OK;
    corax_hole_point pt;
    h->traced = corax_hole_at(h->path, 0.0, NULL, &pt) == CORAX_OK;
    h->length = deeper(0.0, corax_hole_length(h->path));
    h->depth_shown = deeper(h->depth_shown, h->length);
    corax_hole_depth *depths = NULL;
    size_t n = 1;
    if (h->traced) {
        corax_status st = corax_hole_depths(h->path, fmax(5.0, h->length / 400.0), &depths, &n);
        if (st != CORAX_OK)
            return st;
    }
    h->trace = malloc(n * sizeof *h->trace);
    if (!h->trace) {
        free(depths);
        return CORAX_ENOMEM;
    }
    size_t hint = 0;
    for (size_t k = 0; k < n; k++) {
        double d = depths ? depths[k].depth : 0.0;
        corax_hole_at(h->path, d, &hint, &pt); /* a hole without a path gives its collar */
        h->trace[k] = (report_point){d, pt.position, pt.where == CORAX_WHERE_SURVEYED};
        if (depths && depths[k].kind == CORAX_DEPTH_STATION)
            h->depth_shown = deeper(h->depth_shown, d);
    }
    h->ntrace = n;
    free(depths);
    return CORAX_OK;
}

int corax_report_hole_at(const report_hole *h, double depth, corax_vec3 *at)
{
    if (!h->path)
        return 0;
    corax_hole_point pt;
    corax_hole_at(h->path, isfinite(depth) && depth > 0.0 ? depth : 0.0, NULL, &pt);
    *at = pt.position;
    return 1;
}

/* A hole's rank for the figures: errors, then warnings, notes, readings. */
typedef struct rank {
    size_t count[REPORT_SEVERITIES], readings, index;
} rank;

static int rank_order(const void *pa, const void *pb)
{
    const rank *a = pa, *b = pb;
    int worse = corax_report_worse(a->count, b->count);
    if (worse)
        return worse;
    if (a->readings != b->readings)
        return a->readings > b->readings ? -1 : 1;
    return a->index < b->index ? -1 : 1;
}

/* The findings a hole's table shows: up to `rows`, its errors and warnings
 * before its notes, in the order given. */
static void pick_rows(const report_model *m, report_hole *h, size_t rows)
{
    size_t serious = 0;
    for (size_t k = 0; k < h->nfinding; k++)
        serious += m->finding[h->finding[k]].severity >= CORAX_WARNING;
    size_t want_serious = serious < rows ? serious : rows;
    size_t want_notes = h->nfinding - serious < rows - want_serious ? h->nfinding - serious
                                                                    : rows - want_serious;
    h->nshown = 0;
    for (size_t k = 0; k < h->nfinding; k++) {
        size_t *quota = m->finding[h->finding[k]].severity >= CORAX_WARNING ? &want_serious
                                                                            : &want_notes;
        if (*quota) {
            --*quota;
            h->shown[h->nshown++] = h->finding[k];
        }
    }
}

/* Which holes get figures, and how many findings each table shows. */
static corax_status budget(report_model *m)
{
    rank *order = malloc((m->nhole + 1) * sizeof *order);
    m->shown_store = malloc((m->nfinding + 1) * sizeof *m->shown_store);
    if (!order || !m->shown_store) {
        free(order);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; i < m->nhole; i++) {
        order[i] = (rank){{0, 0, 0}, m->hole[i].nreading, i};
        memcpy(order[i].count, m->hole[i].count, sizeof order[i].count);
    }
    qsort(order, m->nhole, sizeof *order, rank_order);
    m->drawn_holes = m->nhole < REPORT_PATH_HOLES ? m->nhole : REPORT_PATH_HOLES;
    m->listed_holes = m->nhole < REPORT_LISTED_HOLES ? m->nhole : REPORT_LISTED_HOLES;
    for (size_t i = 0; i < m->drawn_holes; i++)
        m->hole[order[i].index].drawn = 1;
    m->figure_holes = m->nhole < REPORT_FIGURE_HOLES ? m->nhole : REPORT_FIGURE_HOLES;
    for (size_t i = 0; i < m->listed_holes; i++) {
        m->hole[order[i].index].listed = 1;
        m->hole[order[i].index].figures = i < m->figure_holes;
    }
    free(order);
    size_t in_listed = 0, with = 0;
    for (size_t i = 0; i < m->nhole; i++)
        if (m->hole[i].listed) {
            in_listed += m->hole[i].nfinding;
            with += m->hole[i].nfinding > 0;
        }
    size_t rows = in_listed <= REPORT_FINDING_ROWS ? in_listed : REPORT_FINDING_ROWS / with;
    rows = rows > REPORT_HOLE_ROWS ? rows : REPORT_HOLE_ROWS;
    size_t used = 0;
    m->hidden = 0;
    for (size_t i = 0; i < m->nhole; i++) {
        report_hole *h = &m->hole[i];
        h->shown = m->shown_store + used;
        pick_rows(m, h, h->listed ? rows : 0);
        used += h->nshown;
        m->hidden += h->nfinding - h->nshown;
        for (int s = 0; s < REPORT_SEVERITIES && !h->listed; s++)
            m->unlisted[s] += h->count[s];
    }
    return CORAX_OK;
}

corax_status corax_report_model_build(report_model *m, const corax_report_input *in)
{
    memset(m, 0, sizeof *m);
    m->in = in;
    m->finding = in->findings ? in->findings->item : NULL;
    m->nfinding = in->findings ? in->findings->count : 0;
    m->convert = in->convert ? *in->convert : corax_convert_options_default();
    corax_status st = collect_holes(m);
    if (st == CORAX_OK)
        st = assign(m);
    if (st == CORAX_OK)
        st = classify(m);
    for (size_t h = 0; h < m->nhole && st == CORAX_OK; h++)
        st = trace(m, &m->hole[h]);
    if (st == CORAX_OK)
        st = budget(m);
    if (st != CORAX_OK)
        corax_report_model_free(m);
    return st;
}

void corax_report_model_free(report_model *m)
{
    for (size_t h = 0; m->hole && h < m->nhole; h++)
        free(m->hole[h].trace);
    free(m->hole);
    free(m->store);
    free(m->shown_store);
    free(m->kind);
    free(m->kind_of);
    free(m->flagged);
    memset(m, 0, sizeof *m);
}
