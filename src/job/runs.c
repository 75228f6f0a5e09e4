/* job: orientation runs, read from a runs table and looked up by hole and
 * depth, and the confidence word that says a run has no orientation mark. */
#include <ctype.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "io/fields.h"
#include "job/job_int.h"

int corax_unoriented_confidence(const char *text, size_t len, const char *word)
{
    while (len && isspace((unsigned char)*text)) {
        text++;
        len--;
    }
    while (len && isspace((unsigned char)text[len - 1]))
        len--;
    return word && len && strlen(word) == len && strncasecmp(text, word, len) == 0;
}

static int by_hole_from(const void *a, const void *b)
{
    const corax_qa_run *x = a, *y = b;
    int c = strcmp(x->hole, y->hole);
    if (c)
        return c;
    return (x->from > y->from) - (x->from < y->from);
}

corax_status corax_runs_load(corax_job *job, const char *path, const corax_table_settings *ts,
                             const corax_codes *codes, corax_tally *unknown, size_t file_index,
                             corax_runs *runs, corax_findings *found)
{
    static const char *const names[] = {"hole", "from", "to", "confidence"};
    memset(runs, 0, sizeof *runs);
    corax_status st = job_table_load(job, CORAX_ROLE_RUNS, path, ts, &runs->table);
    if (st != CORAX_OK)
        return job_failed(st);
    const corax_table *t = runs->table;
    long col[4];
    if ((st = job_table_columns(job, t, ts, names, 4, col)) != CORAX_OK)
        return st;
    if (col[0] < 0 || col[1] < 0 || col[2] < 0) {
        job_error(job, path, 1, "no '%s' column in the header",
                  col[0] < 0 ? "hole" : col[1] < 0 ? "from" : "to");
        return CORAX_EFORMAT;
    }
    size_t rows = corax_table_rows(t);
    if (!(runs->run = malloc((rows ? rows : 1) * sizeof *runs->run)))
        return CORAX_ENOMEM;
    for (size_t r = 0; r < rows; r++) {
        double a, b;
        const char *name = corax_table_cell(t, r, col[0], NULL);
        if (corax_table_number(t, r, col[1], &a) != CORAX_NUMBER_OK ||
            corax_table_number(t, r, col[2], &b) != CORAX_NUMBER_OK || !(a >= 0.0 && b > a) ||
            b * ts->unit > CORAX_MAX_DEPTH || !name[0]) {
            if (corax_findings_add(found, CORAX_ERROR, "run-row", path, corax_table_line(t, r),
                                   name, NAN, "the run row is not a hole with from < to (from "
                                   "'%.20s', to '%.20s'): it is left out",
                                   corax_table_cell(t, r, col[1], NULL),
                                   corax_table_cell(t, r, col[2], NULL)) != CORAX_OK)
                return CORAX_ENOMEM;
            continue;
        }
        size_t cl;
        const char *conf = corax_table_cell(t, r, col[3], &cl);
        const char *word =
            job_code_word(codes, conf, cl, unknown, path, file_index, corax_table_line(t, r));
        runs->run[runs->n++] =
            (corax_qa_run){name, a * ts->unit, b * ts->unit, word, path, corax_table_line(t, r)};
    }
    qsort(runs->run, runs->n, sizeof *runs->run, by_hole_from);
    return CORAX_OK;
}

void corax_runs_free(corax_runs *runs)
{
    corax_table_free(runs->table);
    free(runs->run);
    memset(runs, 0, sizeof *runs);
}

long corax_runs_find(const corax_runs *runs, const char *hole, size_t len, double depth)
{
    size_t lo = 0, hi = runs->n; /* the first run of the hole not ending at or above depth */
    while (lo < hi) {
        size_t mid = lo + (hi - lo) / 2;
        const corax_qa_run *m = &runs->run[mid];
        int c = strncmp(m->hole, hole, len);
        if (c == 0 && m->hole[len])
            c = 1;
        if (c < 0 || (c == 0 && m->to <= depth))
            lo = mid + 1;
        else
            hi = mid;
    }
    if (lo < runs->n) {
        const corax_qa_run *m = &runs->run[lo];
        if (strlen(m->hole) == len && strncmp(m->hole, hole, len) == 0 && m->from <= depth &&
            depth < m->to)
            return (long)lo;
    }
    return -1;
}
