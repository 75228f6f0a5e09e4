/* job: reading converted tables (structure rows) for the jobs that draw or
 * export them, with every faulty row reported at its line. */
#include <stdio.h>
#include <string.h>

#include "io/fields.h"
#include "job/converted.h"

corax_status job_converted_open(corax_job *job, const corax_table_settings *ts, const char *path,
                                job_converted *t)
{
    long col[CORAX_STRUCTURE_COLUMNS];
    corax_error err;
    memset(t, 0, sizeof *t);
    t->path = path;
    t->job = job;
    t->unit = ts->unit;
    corax_error_clear(&err);
    corax_status st = corax_reader_open(path, ts->format, &t->reader, &err);
    if (st == CORAX_OK)
        st = corax_table_header(t->reader, corax_structure_column_names, CORAX_STRUCTURE_COLUMNS,
                                CORAX_STRUCTURE_REQUIRED, ts->columns, col, &t->width, &t->header,
                                &err);
    if (st != CORAX_OK) {
        job_error_record(job, &err, st);
        corax_reader_close(t->reader);
        t->reader = NULL;
        return job_failed(st);
    }
    corax_structure_columns_set(&t->columns, col);
    corax_table_info info;
    corax_reader_info(t->reader, &info);
    t->decimal = info.format.decimal;
    job_stage_begin(job, &t->progress, path, "bytes", job_file_size(path));
    return CORAX_OK;
}

int job_converted_next(job_converted *t, corax_row *row, corax_structure *s)
{
    corax_error err;
    char why[240];
    corax_error_clear(&err);
    for (;;) {
        corax_status st = corax_reader_next(t->reader, row, &err);
        if (st == CORAX_END)
            return 0;
        if (++t->rows % 65536 == 0)
            job_stage_step(t->job, &t->progress, (double)corax_reader_offset(t->reader));
        if (st != CORAX_OK) {
            job_problem(t->job, &t->problems, err.file[0] ? err.file : NULL, err.line, "%s",
                        err.message[0] ? err.message : corax_strerror(st));
            return 0;
        }
        const char *ragged = corax_field_ragged(row, t->width, why, sizeof why);
        if (!ragged &&
            corax_structure_read(row, &t->columns, t->decimal, s, why, sizeof why) == CORAX_OK) {
            s->depth *= t->unit;
            s->position.x *= t->unit;
            s->position.y *= t->unit;
            s->position.z *= t->unit;
            return 1;
        }
        job_problem(t->job, &t->problems, t->path, row->line, "%s", why);
    }
}

corax_status job_converted_close(job_converted *t)
{
    if (t->reader) {
        corax_table_info info;
        corax_reader_info(t->reader, &info);
        job_table_read(t->job, CORAX_ROLE_CONVERTED, t->path, t->unit, &info);
        job_stage_end(t->job, &t->progress);
    }
    corax_reader_close(t->reader);
    t->reader = NULL;
    char what[600];
    snprintf(what, sizeof what, "the converted table %s", t->path);
    return job_problems_end(t->job, &t->problems, what);
}
