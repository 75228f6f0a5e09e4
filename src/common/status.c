/* common: result codes, error records and findings shared by every module. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

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
    }
    return "unknown status";
}

void corax_error_clear(corax_error *err)
{
    if (!err)
        return;
    err->file = NULL;
    err->line = 0;
    err->message[0] = '\0';
}

corax_status corax_error_set(corax_error *err, corax_status status, const char *file,
                             long line, const char *fmt, ...)
{
    if (!err)
        return status;
    err->file = file;
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

corax_status corax_findings_add(corax_findings *list, corax_severity severity,
                                const char *check, const char *file, long line,
                                const char *hole, double depth, const char *fmt, ...)
{
    if (list->count == list->capacity) {
        size_t cap = list->capacity ? 2 * list->capacity : 16;
        corax_finding *p = realloc(list->item, cap * sizeof *p);
        if (!p)
            return CORAX_ENOMEM;
        list->item = p;
        list->capacity = cap;
    }
    corax_finding *f = &list->item[list->count++];
    f->severity = severity;
    snprintf(f->check, sizeof f->check, "%s", check ? check : "");
    f->file = file;
    f->line = line;
    snprintf(f->hole, sizeof f->hole, "%s", hole ? hole : "");
    f->depth = depth;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(f->message, sizeof f->message, fmt, ap);
    va_end(ap);
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
