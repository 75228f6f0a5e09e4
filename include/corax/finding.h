/* corax: findings, the problems found in a drill program's data, each placed
 * at a file line and at a hole and depth. Loaders report the rows they cannot
 * use as findings; the QA checks report theirs the same way. */
#ifndef CORAX_FINDING_H
#define CORAX_FINDING_H

#include <stddef.h>

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum corax_severity {
    CORAX_NOTE = 0, /* worth knowing */
    CORAX_WARNING,  /* probably wrong, results kept */
    CORAX_ERROR     /* wrong: the row or hole could not be used as it stands */
} corax_severity;

/* "note", "warning", "error". */
const char *corax_severity_name(corax_severity severity);

typedef struct corax_finding {
    corax_severity severity;
    char check[32];    /* short name of the check that found it */
    const char *file;  /* borrowed path, NULL when not tied to a file */
    long line;         /* 1-based, 0 when not tied to a line */
    char hole[64];     /* empty when not tied to a hole */
    double depth;      /* metres, NaN when not tied to a depth */
    double depth_to;   /* the end of an interval from `depth`, else NaN */
    char message[512];
} corax_finding;

/* A growing list of findings. Zero-initialise, then free with
 * corax_findings_clear(). */
typedef struct corax_findings {
    corax_finding *item;
    size_t count, capacity;
} corax_findings;

/* Append a finding with a printf-style message; hole may be NULL. */
corax_status corax_findings_add(corax_findings *list, corax_severity severity,
                                const char *check, const char *file, long line,
                                const char *hole, double depth, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 8, 9)))
#endif
    ;

/* The same for an interval of a hole, from `depth` to `depth_to`. */
corax_status corax_findings_add_range(corax_findings *list, corax_severity severity,
                                      const char *check, const char *file, long line,
                                      const char *hole, double depth, double depth_to,
                                      const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 9, 10)))
#endif
    ;

/* Sort by hole (findings without a hole first), then depth (program-wide
 * findings of a hole first), keeping the order of equals. */
corax_status corax_findings_sort(corax_findings *list);

/* Number of findings of at least the given severity. */
size_t corax_findings_count(const corax_findings *list, corax_severity at_least);

/* Release the list's memory and empty it. */
void corax_findings_clear(corax_findings *list);

#ifdef __cplusplus
}
#endif
#endif
