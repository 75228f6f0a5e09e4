/* job: what the export's parts share: lists of words, the layers asked for,
 * and the converted tables gone over header first, then row by row. */
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "job/converted.h"
#include "job/export_int.h"

int export_list_next(const char **p, const char **item, size_t *len)
{
    if (!*p || !**p)
        return 0;
    const char *end = strchr(*p, ',');
    *item = *p;
    *len = end ? (size_t)(end - *p) : strlen(*p);
    *p += *len + (end != NULL);
    return 1;
}

int corax_export_job_wants(const corax_export_job_options *o, const char *layer)
{
    if (!o->layers)
        return 1;
    size_t n = strlen(layer), len;
    const char *item, *p = o->layers;
    while (export_list_next(&p, &item, &len))
        if (len == n && strncasecmp(item, layer, n) == 0)
            return 1;
    return 0;
}


int export_wants(const export_opts *o, const char *layer)
{
    return corax_export_job_wants(o->p, layer);
}

int export_each_structure(const export_opts *o, export_visit *v, void *ctx)
{
    int n = o->ninputs, rc = JOB_OK, opened = 0;
    job_converted *t = calloc(n ? (size_t)n : 1, sizeof *t);
    corax_export_columns *x = calloc(n ? (size_t)n : 1, sizeof *x);
    if (!t || !x) {
        job_error(o->job, NULL, 0, "out of memory");
        rc = JOB_FAILED;
    }
    /* every header first: the output's columns are the union of theirs */
    for (int k = 0; rc == JOB_OK && k < n; k++) {
        if (job_converted_open(o->job, &o->p->converted, o->inputs[k], &t[k]) != CORAX_OK) {
            rc = JOB_FAILED;
            break;
        }
        opened = k + 1;
        corax_export_columns_find(&t[k].header, o->p->converted.columns, &x[k]);
        if (v->header && v->header(ctx, k, &t[k].header, &t[k].columns, &x[k]) != 0)
            rc = JOB_FAILED;
    }
    if (rc == JOB_OK && v->begin && v->begin(ctx) != 0)
        rc = JOB_FAILED;
    for (int k = 0; rc == JOB_OK && k < n; k++) {
        corax_row row;
        corax_structure s;
        corax_export_extra e;
        char why[240];
        while (job_converted_next(&t[k], &row, &s)) {
            if (corax_export_extra_read(&row, &x[k], t[k].decimal, &e, why, sizeof why) !=
                CORAX_OK) {
                job_problem(t[k].job, &t[k].problems, t[k].path, row.line, "%s", why);
                continue;
            }
            if (!corax_export_usable(&s, &e)) {
                v->left_out++;
                continue;
            }
            if (v->row(ctx, k, &row, &s, &e) != 0) {
                rc = JOB_FAILED;
                break;
            }
        }
    }
    for (int k = 0; k < opened; k++)
        if (job_converted_close(&t[k]) != CORAX_OK)
            rc = JOB_FAILED;
    free(t);
    free(x);
    return rc;
}

