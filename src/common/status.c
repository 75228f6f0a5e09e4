/* common: result codes, error records and findings shared by every module. */
#include <ctype.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "common/order.h"
#include "common/grow.h"
#include "corax/finding.h"
#include "corax/status.h"

const char *corax_strerror(corax_status status)
{
    switch (status) {
    case CORAX_OK: return "success";
    case CORAX_END: return "end of table";
    case CORAX_ENOMEM: return "out of memory";
    case CORAX_EIO: return "input or output error";
    case CORAX_EFORMAT: return "malformed table";
    case CORAX_EVALUE: return "bad value";
    case CORAX_ESURVEY: return "survey cannot be desurveyed";
    case CORAX_EARG: return "invalid argument";
    case CORAX_ENOTFOUND: return "not found";
    case CORAX_EREPEAT: return "repeated";
    }
    return "unknown status";
}

void corax_error_clear(corax_error *err)
{
    if (!err)
        return;
    err->file[0] = '\0';
    err->line = 0;
    err->message[0] = '\0';
}

void corax_error_file(corax_error *err, const char *file)
{
    if (err)
        snprintf(err->file, sizeof err->file, "%s", file ? file : "");
}

corax_status corax_error_set(corax_error *err, corax_status status, const char *file,
                             long line, const char *fmt, ...)
{
    if (!err)
        return status;
    corax_error_file(err, file);
    err->line = line;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(err->message, sizeof err->message, fmt, ap);
    va_end(ap);
    return status;
}

const char *corax_severity_name(corax_severity severity)
{
    switch (severity) {
    case CORAX_NOTE: return "note";
    case CORAX_WARNING: return "warning";
    case CORAX_ERROR: return "error";
    }
    return "unknown";
}

static corax_status findings_vadd(corax_findings *list, corax_severity severity,
                                   const char *check, const char *file, long line,
                                   const char *hole, double depth, double depth_to,
                                   const char *fmt, va_list ap)
{
    corax_finding *grown = corax_grow(list->item, list->count, &list->capacity, sizeof *grown, 16);
    if (!grown)
        return CORAX_ENOMEM;
    list->item = grown;
    corax_finding *f = &list->item[list->count++];
    f->severity = severity;
    snprintf(f->check, sizeof f->check, "%s", check ? check : "");
    f->file = file;
    f->line = line;
    snprintf(f->hole, sizeof f->hole, "%s", hole ? hole : "");
    f->depth = depth;
    f->depth_to = depth_to;
    vsnprintf(f->message, sizeof f->message, fmt, ap);
    return CORAX_OK;
}

corax_status corax_findings_add(corax_findings *list, corax_severity severity,
                                const char *check, const char *file, long line,
                                const char *hole, double depth, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    corax_status st = findings_vadd(list, severity, check, file, line, hole, depth, NAN, fmt, ap);
    va_end(ap);
    return st;
}

corax_status corax_findings_add_range(corax_findings *list, corax_severity severity,
                                      const char *check, const char *file, long line,
                                      const char *hole, double depth, double depth_to,
                                      const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    corax_status st =
        findings_vadd(list, severity, check, file, line, hole, depth, depth_to, fmt, ap);
    va_end(ap);
    return st;
}

int corax_hole_name_cmp(const char *a, const char *b)
{
    while (*a && *b) {
        if (isdigit((unsigned char)*a) && isdigit((unsigned char)*b)) {
            while (*a == '0')
                a++;
            while (*b == '0')
                b++;
            size_t la = 0, lb = 0;
            while (isdigit((unsigned char)a[la]))
                la++;
            while (isdigit((unsigned char)b[lb]))
                lb++;
            if (la != lb)
                return la < lb ? -1 : 1;
            int c = strncmp(a, b, la);
            if (c)
                return c;
            a += la;
            b += lb;
        } else {
            if (*a != *b)
                return (unsigned char)*a < (unsigned char)*b ? -1 : 1;
            a++;
            b++;
        }
    }
    return (unsigned char)*a - (unsigned char)*b;
}

typedef struct keyed {
    const corax_finding *f;
    size_t order;
} keyed;

static int finding_cmp(const void *pa, const void *pb)
{
    const keyed *ka = pa, *kb = pb;
    const corax_finding *a = ka->f, *b = kb->f;
    int c = corax_hole_name_cmp(a->hole, b->hole);
    if (c)
        return c;
    int na = isnan(a->depth), nb = isnan(b->depth);
    if (na != nb)
        return na ? -1 : 1;
    if (!na && a->depth != b->depth)
        return a->depth < b->depth ? -1 : 1;
    return (ka->order > kb->order) - (ka->order < kb->order);
}

corax_status corax_findings_sort(corax_findings *list)
{
    if (list->count < 2)
        return CORAX_OK;
    keyed *k = malloc(list->count * sizeof *k);
    corax_finding *sorted = malloc(list->count * sizeof *sorted);
    if (!k || !sorted) {
        free(k);
        free(sorted);
        return CORAX_ENOMEM;
    }
    for (size_t i = 0; i < list->count; i++)
        k[i] = (keyed){&list->item[i], i};
    qsort(k, list->count, sizeof *k, finding_cmp);
    for (size_t i = 0; i < list->count; i++)
        sorted[i] = *k[i].f;
    memcpy(list->item, sorted, list->count * sizeof *sorted);
    free(sorted);
    free(k);
    return CORAX_OK;
}

size_t corax_findings_count(const corax_findings *list, corax_severity at_least)
{
    size_t n = 0;
    for (size_t i = 0; i < list->count; i++)
        n += list->item[i].severity >= at_least;
    return n;
}

void corax_findings_clear(corax_findings *list)
{
    free(list->item);
    list->item = NULL;
    list->count = list->capacity = 0;
}
