/* qa: a program's core logs held compactly (qa.h, log_int.h). A reading is
 * a 48-byte record: its names as numbers, its angles as whole millionths of
 * a degree, which gives back exactly the double a table's decimal gave (a
 * decimal with up to six places, n / 10^6, is the double nearest it), and
 * whatever a record cannot hold exactly whole in an extra beside it. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "common/grow.h"
#include "qa/log_int.h"

#define ABSENT INT32_MIN

corax_qa_log *corax_qa_log_new(void)
{
    corax_qa_log *log = calloc(1, sizeof *log);
    if (!log)
        return NULL;
    log->holes = corax_strset_new();
    log->kinds = corax_strset_new();
    log->confidences = corax_strset_new();
    log->problems = corax_strset_new();
    log->sorted = 1;
    if (!log->holes || !log->kinds || !log->confidences || !log->problems) {
        corax_qa_log_free(log);
        return NULL;
    }
    return log;
}

void corax_qa_log_free(corax_qa_log *log)
{
    if (!log)
        return;
    free(log->rec);
    free(log->extra);
    corax_strset_free(log->holes);
    corax_strset_free(log->kinds);
    corax_strset_free(log->confidences);
    corax_strset_free(log->problems);
    free(log->hole);
    free(log->file);
    free(log);
}

/* An angle (radians) as whole millionths of a degree, when that gives it
 * back exactly. */
static int angle_fits(double rad, int32_t *out)
{
    if (isnan(rad)) {
        *out = ABSENT;
        return 1;
    }
    double micro = corax_deg(rad) * 1e6;
    if (!(fabs(micro) < 2e9))
        return 0;
    long long k = llround(micro);
    *out = (int32_t)k;
    return corax_rad((double)k / 1e6) == rad;
}

static double angle_of(int32_t k) { return k == ABSENT ? (double)NAN : corax_rad((double)k / 1e6); }

static long name_number(corax_strset *set, const char *name)
{
    name = name ? name : "";
    return corax_strset_add(set, name, strlen(name));
}

static long file_number(corax_qa_log *log, const char *file)
{
    for (size_t i = log->nfile; i-- > 0;) /* a log has few files: the last is the likeliest */
        if (log->file[i] == file)
            return (long)i;
    const char **grown = corax_grow(log->file, log->nfile, &log->file_cap, sizeof *grown, 8);
    if (!grown)
        return -1;
    log->file = grown;
    log->file[log->nfile] = file;
    return (long)log->nfile++;
}

/* The hole's number, its path kept the first time. */
static long hole_number(corax_qa_log *log, const corax_qa_reading *r)
{
    long h = name_number(log->holes, r->hole);
    if (h < 0 || (size_t)h < corax_strset_count(log->holes) - 1)
        return h;
    qa_log_hole *grown = corax_grow(log->hole, (size_t)h, &log->hole_cap, sizeof *grown, 64);
    if (!grown)
        return -1;
    log->hole = grown;
    log->hole[h] = (qa_log_hole){r->path, 0, 0};
    return h;
}

/* Keep the reading's values whole beside its record. */
static corax_status add_extra(corax_qa_log *log, const corax_qa_reading *r, qa_rec *rec,
                              const long number[3])
{
    long problem = 0;
    if (r->problem && (problem = corax_strset_add(log->problems, r->problem,
                                                  strlen(r->problem))) < 0)
        return CORAX_ENOMEM;
    qa_extra *grown = corax_grow(log->extra, log->nextra, &log->extra_cap, sizeof *grown, 64);
    if (!grown || log->nextra >= UINT32_MAX - 1)
        return CORAX_ENOMEM;
    log->extra = grown;
    const corax_reading *rd = &r->reading;
    log->extra[log->nextra] =
        (qa_extra){{rd->alpha, rd->beta, rd->gamma, rd->line_alpha, rd->line_beta},
                   r->line,
                   (uint32_t)number[0],
                   (uint32_t)number[1],
                   (uint32_t)number[2],
                   r->problem ? (uint32_t)problem + 1 : 0};
    rec->extra = (uint32_t)++log->nextra;
    rec->flags |= r->problem ? QA_REC_PROBLEM : 0;
    return CORAX_OK;
}

corax_status corax_qa_log_add(corax_qa_log *log, const corax_qa_reading *r)
{
    if (log->n >= UINT32_MAX - 1)
        return CORAX_ENOMEM;
    long hole = hole_number(log, r);
    long number[3] = {name_number(log->kinds, r->kind), name_number(log->confidences,
                                                                    r->confidence),
                      file_number(log, r->file)};
    qa_rec *grown = corax_grow(log->rec, log->n, &log->cap, sizeof *grown, 1024);
    if (hole < 0 || number[0] < 0 || number[1] < 0 || number[2] < 0 || !grown)
        return CORAX_ENOMEM;
    log->rec = grown;
    const corax_reading *rd = &r->reading;
    qa_rec rec = {rd->depth, {0}, (uint32_t)hole, (uint32_t)r->line, 0, (uint16_t)number[0],
                  (uint16_t)number[1], (uint16_t)number[2],
                  rd->arbitrary_line ? QA_REC_ARBITRARY : 0};
    const double angle[QA_ANGLES] = {rd->alpha, rd->beta, rd->gamma, rd->line_alpha,
                                     rd->line_beta};
    int whole = !r->problem && r->line >= 0 && (unsigned long)r->line <= UINT32_MAX;
    for (int k = 0; k < 3; k++)
        whole = whole && number[k] < UINT16_MAX;
    for (int k = 0; k < QA_ANGLES; k++)
        whole = whole && angle_fits(angle[k], &rec.angle[k]);
    if (!whole) {
        corax_status st = add_extra(log, r, &rec, number);
        if (st != CORAX_OK)
            return st;
    }
    log->rec[log->n++] = rec;
    log->sorted = 0;
    return CORAX_OK;
}

void corax_qa_log_get(const corax_qa_log *log, size_t i, corax_qa_reading *out)
{
    const qa_rec *rec = &log->rec[i];
    corax_reading *rd = &out->reading;
    *rd = corax_reading_empty();
    rd->depth = rec->depth;
    rd->arbitrary_line = (rec->flags & QA_REC_ARBITRARY) != 0;
    double *angle[QA_ANGLES] = {&rd->alpha, &rd->beta, &rd->gamma, &rd->line_alpha,
                                &rd->line_beta};
    uint32_t kind = rec->kind, confidence = rec->confidence, file = rec->file;
    out->line = rec->line;
    out->problem = NULL;
    if (rec->extra) {
        const qa_extra *x = &log->extra[rec->extra - 1];
        for (int k = 0; k < QA_ANGLES; k++)
            *angle[k] = x->angle[k];
        out->line = x->line;
        kind = x->kind;
        confidence = x->confidence;
        file = x->file;
        if (x->problem)
            out->problem = corax_strset_at(log->problems, x->problem - 1, NULL);
    } else {
        for (int k = 0; k < QA_ANGLES; k++)
            *angle[k] = angle_of(rec->angle[k]);
    }
    out->hole = qa_log_hole_name(log, rec->hole);
    out->path = log->hole[rec->hole].path;
    out->kind = corax_strset_at(log->kinds, kind, NULL);
    out->confidence = corax_strset_at(log->confidences, confidence, NULL);
    out->file = log->file[file];
}

void corax_qa_log_set_arbitrary(corax_qa_log *log, size_t i, int arbitrary)
{
    log->rec[i].flags = (uint8_t)((log->rec[i].flags & ~QA_REC_ARBITRARY) |
                                  (arbitrary ? QA_REC_ARBITRARY : 0));
}

size_t corax_qa_log_size(const corax_qa_log *log) { return log ? log->n : 0; }

int corax_qa_log_sorted(const corax_qa_log *log) { return !log || log->sorted; }

/* ---- sorting ---- */

/* Put r[src[j]] at r[j] for every j, following each cycle of the
 * permutation with one record in hand (src is spent). */
static void permute(qa_rec *r, uint32_t *src, size_t n)
{
    for (size_t j = 0; j < n; j++) {
        if (src[j] == j)
            continue;
        qa_rec held = r[j];
        size_t k = j;
        for (;;) {
            size_t s = src[k];
            src[k] = (uint32_t)k;
            if (s == j) {
                r[k] = held;
                break;
            }
            r[k] = r[s];
            k = s;
        }
    }
}

typedef struct keyed {
    double depth;
    uint32_t at; /* its place among the hole's readings, in the order added */
} keyed;

static int by_depth(const void *a, const void *b)
{
    const keyed *x = a, *y = b;
    int nx = isnan(x->depth), ny = isnan(y->depth);
    if (nx != ny)
        return nx ? 1 : -1;
    if (!nx && x->depth != y->depth)
        return x->depth < y->depth ? -1 : 1;
    return (x->at > y->at) - (x->at < y->at);
}

corax_status corax_qa_log_sort(corax_qa_log *log)
{
    if (log->sorted)
        return CORAX_OK;
    size_t nholes = corax_strset_count(log->holes), most = 0;
    uint32_t *src = malloc((log->n ? log->n : 1) * sizeof *src);
    if (!src)
        return CORAX_ENOMEM;
    for (size_t h = 0; h < nholes; h++)
        log->hole[h].n = 0;
    for (size_t i = 0; i < log->n; i++)
        log->hole[log->rec[i].hole].n++;
    for (size_t h = 0, at = 0; h < nholes; h++) { /* by hole, in the order added */
        log->hole[h].first = at;
        at += log->hole[h].n;
        most = log->hole[h].n > most ? log->hole[h].n : most;
        log->hole[h].n = 0;
    }
    for (size_t i = 0; i < log->n; i++) {
        qa_log_hole *h = &log->hole[log->rec[i].hole];
        src[h->first + h->n++] = (uint32_t)i;
    }
    permute(log->rec, src, log->n);
    keyed *key = malloc((most ? most : 1) * sizeof *key);
    if (!key) {
        free(src);
        return CORAX_ENOMEM;
    }
    for (size_t h = 0; h < nholes; h++) { /* each hole by depth */
        qa_rec *r = log->rec + log->hole[h].first;
        size_t n = log->hole[h].n;
        for (size_t j = 0; j < n; j++)
            key[j] = (keyed){r[j].depth, (uint32_t)j};
        qsort(key, n, sizeof *key, by_depth);
        for (size_t j = 0; j < n; j++)
            src[j] = key[j].at;
        permute(r, src, n);
    }
    free(key);
    free(src);
    log->sorted = 1;
    return CORAX_OK;
}
