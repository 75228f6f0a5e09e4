/* draw: the QA report's model of a drill program. Every hole named by the
 * program, the findings or the readings, in the order the findings are
 * sorted in; each with its findings, the log's readings of it and its path
 * sampled for the plan and the section. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "common/order.h"
#include "draw/report_int.h"
#include "qa/log_int.h"

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

/* Whether a reading of the log can be placed: it could be read and names a
 * hole. */
static int usable(const corax_qa_log *log, const qa_rec *r)
{
    return !(r->flags & QA_REC_PROBLEM) && qa_log_hole_name(log, r->hole)[0];
}

/* The readings of each of the log's holes that can be placed. */
static size_t *usable_counts(const corax_qa_log *log)
{
    size_t n = log ? corax_strset_count(log->holes) : 0;
    size_t *count = calloc(n + 1, sizeof *count);
    for (size_t i = 0; count && log && i < log->n; i++)
        count[log->rec[i].hole] += usable(log, &log->rec[i]);
    return count;
}

/* The names of every hole: the program's, then those of findings and readings. */
static corax_status collect_holes(report_model *m, const size_t *usable_in)
{
    const corax_report_input *in = m->in;
    const corax_qa_log *log = in->log;
    size_t nprogram = in->program ? corax_program_size(in->program) : 0;
    size_t nlog = log ? corax_strset_count(log->holes) : 0;
    const char **names = malloc((nprogram + m->nfinding + nlog + 1) * sizeof *names);
    if (!names)
        return CORAX_ENOMEM;
    size_t n = 0;
    for (size_t i = 0; i < nprogram; i++)
        names[n++] = corax_hole_name(corax_program_hole(in->program, i));
    for (size_t i = 0; i < m->nfinding; i++)
        if (m->finding[i].hole[0])
            names[n++] = m->finding[i].hole;
    for (size_t h = 0; h < nlog; h++)
        if (usable_in[h])
            names[n++] = qa_log_hole_name(log, h);
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
        long k = log ? corax_strset_find(log->holes, names[i], strlen(names[i])) : -1;
        h->log_hole = k >= 0 && usable_in[k] ? (size_t)k : REPORT_NONE;
        h->nreading = k >= 0 ? usable_in[k] : 0;
        m->unreadable -= h->nreading;
    }
    free(names);
    return CORAX_OK;
}

/* Each hole's findings as index lists in one store. */
static corax_status assign(report_model *m)
{
    long *owner = malloc((m->nfinding + 1) * sizeof *owner);
    m->store = malloc((m->nfinding + 1) * sizeof *m->store);
    if (!owner || !m->store) {
        free(owner);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; i < m->nfinding; i++) {
        const corax_finding *f = &m->finding[i];
        m->count[f->severity]++;
        owner[i] = f->hole[0] ? hole_index(m, f->hole) : -1;
        if (owner[i] < 0)
            m->nwide++;
        else
            m->hole[owner[i]].nfinding++;
    }
    size_t *next = m->store; /* hand out the store, then fill each list in order */
    m->wide = next;
    next += m->nwide;
    for (size_t h = 0; h < m->nhole; h++) {
        m->hole[h].finding = next;
        next += m->hole[h].nfinding;
        m->hole[h].nfinding = 0;
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
    free(owner);
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

/* The feature kinds of the readings that can be placed, sorted, and where
 * each of the log's kinds falls among them. */
static corax_status classify(report_model *m)
{
    const corax_qa_log *log = m->in->log;
    size_t nkinds = log ? corax_strset_count(log->kinds) : 0;
    unsigned char *used = calloc(nkinds + 1, 1);
    m->kind = malloc((nkinds + 1) * sizeof *m->kind);
    m->kind_of = calloc(nkinds + 1, sizeof *m->kind_of);
    if (!used || !m->kind || !m->kind_of) {
        free(used);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; log && i < log->n; i++)
        if (usable(log, &log->rec[i]))
            used[qa_rec_kind(log, &log->rec[i])] = 1;
    for (size_t k = 0; k < nkinds; k++)
        if (used[k])
            m->kind[m->nkind++] = corax_strset_at(log->kinds, k, NULL);
    m->nkind = sort_unique(m->kind, m->nkind, text_order);
    for (size_t k = 0; k < nkinds; k++)
        if (used[k])
            m->kind_of[k] = (size_t)find_name(m->kind, m->nkind,
                                              corax_strset_at(log->kinds, k, NULL), text_order);
    free(used);
    return CORAX_OK;
}

/* Whether a depth lies in a stretch that a warning or an error of the hole
 * names. */
static int flagged_at(const report_model *m, const report_hole *h, double depth)
{
    for (size_t j = 0; j < h->nfinding; j++) {
        const corax_finding *f = &m->finding[h->finding[j]];
        if (f->severity >= CORAX_WARNING && corax_report_finding_holds(f, depth))
            return 1;
    }
    return 0;
}

corax_status corax_report_readings(const report_model *m, const report_hole *h,
                                   report_readings *out)
{
    const corax_qa_log *log = m->in->log;
    size_t n = h->log_hole == REPORT_NONE ? 0 : h->nreading;
    out->n = 0;
    out->reading = malloc((n + 1) * sizeof *out->reading);
    out->kind = malloc((n + 1) * sizeof *out->kind);
    out->flagged = malloc(n + 1);
    if (!out->reading || !out->kind || !out->flagged)
        return CORAX_ENOMEM;
    if (!n)
        return CORAX_OK;
    const qa_log_hole *lh = &log->hole[h->log_hole];
    for (size_t i = lh->first; i < lh->first + lh->n; i++) {
        const qa_rec *r = &log->rec[i];
        if (!usable(log, r))
            continue;
        corax_qa_reading q;
        corax_qa_log_get(log, i, &q);
        out->reading[out->n] = q.reading;
        out->kind[out->n] = m->kind_of[qa_rec_kind(log, r)];
        out->flagged[out->n] = (unsigned char)flagged_at(m, h, q.reading.depth);
        out->n++;
    }
    return CORAX_OK;
}

void corax_report_readings_free(report_readings *rr)
{
    free(rr->reading);
    free(rr->kind);
    free(rr->flagged);
    memset(rr, 0, sizeof *rr);
}

static double deeper(double a, double b) { return isfinite(b) && b > a ? b : a; }

/* The hole's path every few metres (at most about 400 points), and the
 * depth its strip must show. */
static corax_status trace(report_model *m, report_hole *h)
{
    const corax_qa_log *log = m->in->log;
    const qa_log_hole *lh = h->log_hole == REPORT_NONE ? NULL : &log->hole[h->log_hole];
    for (size_t i = lh ? lh->first : 0; lh && i < lh->first + lh->n; i++)
        if (usable(log, &log->rec[i]))
            h->depth_shown = deeper(h->depth_shown, log->rec[i].depth);
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
    m->nreadings = m->unreadable = corax_qa_log_size(in->log);
    size_t *usable_in = usable_counts(in->log);
    corax_status st = usable_in ? collect_holes(m, usable_in) : CORAX_ENOMEM;
    free(usable_in);
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
    memset(m, 0, sizeof *m);
}
