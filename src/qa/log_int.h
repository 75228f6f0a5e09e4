/* Internal to the library: the compact core log's layout (qa/log.c), which
 * the checks (src/qa) and the report's model (src/draw) go over hole by
 * hole without unpacking every reading. */
#ifndef CORAX_QA_LOG_INT_H
#define CORAX_QA_LOG_INT_H

#include <stddef.h>
#include <stdint.h>

#include "common/strset.h"
#include "corax/qa.h"

enum { QA_ANGLES = 5 }; /* alpha, beta, gamma, line_alpha, line_beta */

/* The record of a reading: 48 bytes. */
typedef struct qa_rec {
    double depth;                      /* metres, NaN when absent */
    int32_t angle[QA_ANGLES];          /* whole millionths of a degree; INT32_MIN:
                                          absent (unused with an extra) */
    uint32_t hole;                     /* the log's hole number */
    uint32_t line;                     /* unused with an extra */
    uint32_t extra;                    /* 0, or 1 + its place among the extras */
    uint16_t kind, confidence, file;   /* numbers into the log's tables (unused
                                          with an extra) */
    uint8_t flags;                     /* QA_REC_* */
} qa_rec;

enum { QA_REC_ARBITRARY = 1, QA_REC_PROBLEM = 2 };

/* What a record cannot hold exactly: every value but the depth and hole. */
typedef struct qa_extra {
    double angle[QA_ANGLES]; /* radians, NaN when absent */
    long line;
    uint32_t kind, confidence, file;
    uint32_t problem;        /* 1 + its place among the problems, or 0 */
} qa_extra;

/* A hole's readings: rec[first .. first + n) once sorted. */
typedef struct qa_log_hole {
    const corax_hole *path;
    size_t first, n;
} qa_log_hole;

struct corax_qa_log {
    qa_rec *rec;
    size_t n, cap;
    qa_extra *extra;
    size_t nextra, extra_cap;
    corax_strset *holes, *kinds, *confidences, *problems;
    qa_log_hole *hole;       /* by hole number (order of first appearance) */
    size_t hole_cap;
    const char **file;       /* borrowed */
    size_t nfile, file_cap;
    int sorted;
};

/* The kind number of record r. */
static inline uint32_t qa_rec_kind(const corax_qa_log *log, const qa_rec *r)
{
    return r->extra ? log->extra[r->extra - 1].kind : r->kind;
}

/* The hole of number h: its name. */
static inline const char *qa_log_hole_name(const corax_qa_log *log, size_t h)
{
    return corax_strset_at(log->holes, h, NULL);
}

#endif
