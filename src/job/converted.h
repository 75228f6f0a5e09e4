/* Converted tables read back, a structure a row (internal to src/job). */
#ifndef CORAX_JOB_CONVERTED_H
#define CORAX_JOB_CONVERTED_H

#include "corax/structure.h"
#include "job/job_int.h"

typedef struct job_converted {
    const char *path;
    corax_job *job;    /* for the messages, the progress and the tables read */
    char decimal;      /* as read */
    double unit;       /* metres per unit of its lengths */
    corax_reader *reader;
    corax_stage progress;
    size_t rows;       /* read so far */
    corax_structure_columns columns;
    size_t width;      /* fields in its header */
    corax_row header;  /* valid until the first row is read */
    job_problems problems; /* faulty rows met so far */
} job_converted;

/* Open a converted table (read as ts says) and find its columns; an error
 * message and a status when it cannot be. */
corax_status job_converted_open(corax_job *job, const corax_table_settings *ts,
                                const char *path, job_converted *t);

/* The next structure: 1 with *row and *s filled, 0 at the end. Faulty rows
 * (ragged, unusable values) are error messages, counted and skipped, so that
 * a job reports all of them. */
int job_converted_next(job_converted *t, corax_row *row, corax_structure *s);

/* Close, noting the table as read; CORAX_EVALUE (with a summary said) when
 * there were problems. */
corax_status job_converted_close(job_converted *t);

#endif
