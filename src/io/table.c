/* io: a whole CSV table in memory, for commands that group, filter or sort
 * converted output. Cells live in one growing text arena. */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/table.h"

struct corax_table {
    const char *path;
    char decimal;
    corax_table_info info;
    char *text;          /* every cell, NUL-terminated, back to back */
    size_t text_len, text_cap;
    size_t *cell;        /* offset of each cell in text */
    size_t *cell_len;    /* its length */
    size_t ncell, cell_cap;
    size_t *row_first;   /* index in cell[] of each row's first cell; row 0 is the header */
    long *row_line;
    size_t nrow, row_cap; /* including the header */
};

static int push_row(corax_table *t, const corax_row *row)
{
    if (t->nrow + 1 >= t->row_cap) {
        size_t cap = t->row_cap ? 2 * t->row_cap : 256;
        size_t *f = realloc(t->row_first, cap * sizeof *f);
        if (!f)
            return 0;
        t->row_first = f;
        long *l = realloc(t->row_line, cap * sizeof *l);
        if (!l)
            return 0;
        t->row_line = l;
        t->row_cap = cap;
    }
    size_t bytes = 0;
    for (size_t i = 0; i < row->count; i++)
        bytes += row->length[i] + 1;
    if (t->text_len + bytes > t->text_cap) {
        size_t cap = t->text_cap ? t->text_cap : 65536;
        while (cap < t->text_len + bytes)
            cap *= 2;
        char *p = realloc(t->text, cap);
        if (!p)
            return 0;
        t->text = p;
        t->text_cap = cap;
    }
    if (t->ncell + row->count > t->cell_cap) {
        size_t cap = t->cell_cap ? t->cell_cap : 4096;
        while (cap < t->ncell + row->count)
            cap *= 2;
        size_t *c = realloc(t->cell, cap * sizeof *c);
        if (!c)
            return 0;
        t->cell = c;
        c = realloc(t->cell_len, cap * sizeof *c);
        if (!c)
            return 0;
        t->cell_len = c;
        t->cell_cap = cap;
    }
    t->row_first[t->nrow] = t->ncell;
    t->row_line[t->nrow] = row->line;
    t->nrow++;
    t->row_first[t->nrow] = t->ncell + row->count; /* sentinel: end of this row */
    for (size_t i = 0; i < row->count; i++) {
        t->cell_len[t->ncell] = row->length[i];
        t->cell[t->ncell++] = t->text_len;
        memcpy(t->text + t->text_len, row->field[i], row->length[i] + 1);
        t->text_len += row->length[i] + 1;
    }
    return 1;
}

corax_table *corax_table_new(const char *path, char decimal, const corax_row *header)
{
    corax_table *t = calloc(1, sizeof *t);
    if (!t)
        return NULL;
    t->path = path;
    t->decimal = decimal;
    t->info.format.decimal = decimal;
    if (!push_row(t, header)) {
        corax_table_free(t);
        return NULL;
    }
    return t;
}

corax_status corax_table_append(corax_table *t, const corax_row *row)
{
    return push_row(t, row) ? CORAX_OK : CORAX_ENOMEM;
}

void corax_table_truncate(corax_table *t)
{
    size_t header_cells = t->row_first[1];
    t->nrow = 1;
    t->ncell = header_cells;
    t->text_len = header_cells ? t->cell[header_cells - 1] + t->cell_len[header_cells - 1] + 1 : 0;
}

void corax_table_row(const corax_table *t, size_t row, const char **field, corax_row *out)
{
    size_t first = t->row_first[row + 1], n = t->row_first[row + 2] - first;
    for (size_t i = 0; i < n; i++)
        field[i] = t->text + t->cell[first + i];
    out->count = n;
    out->field = field;
    out->length = t->cell_len + first;
    out->line = t->row_line[row + 1];
}

size_t corax_table_widest(const corax_table *t)
{
    size_t w = 0;
    for (size_t r = 0; r < t->nrow; r++)
        if (t->row_first[r + 1] - t->row_first[r] > w)
            w = t->row_first[r + 1] - t->row_first[r];
    return w;
}

corax_status corax_table_load(const char *path, corax_table_format format, corax_table **out,
                              corax_error *err)
{
    return corax_table_load_progress(path, format, NULL, NULL, out, err);
}

corax_status corax_table_load_progress(const char *path, corax_table_format format,
                                       corax_progress_fn progress, void *user,
                                       corax_table **out, corax_error *err)
{
    *out = NULL;
    corax_reader *r;
    corax_status st = corax_reader_open(path, format, &r, err);
    if (st != CORAX_OK)
        return st;
    corax_table *t = calloc(1, sizeof *t);
    if (!t) {
        corax_reader_close(r);
        return CORAX_ENOMEM;
    }
    t->path = path;
    corax_reader_info(r, &t->info);
    t->decimal = t->info.format.decimal;
    corax_row row;
    st = corax_reader_next(r, &row, err);
    if (st == CORAX_END)
        st = corax_error_set(err, CORAX_EFORMAT, path, 1, "the file is empty (no header row)");
    if (st == CORAX_OK) {
        st = corax_header_check(&row, err);
        if (err && st != CORAX_OK)
            corax_error_file(err, path);
    }
    while (st == CORAX_OK) {
        if (!push_row(t, &row)) {
            st = CORAX_ENOMEM;
            break;
        }
        if (progress && t->nrow % 65536 == 0)
            progress(user, (double)corax_reader_offset(r));
        st = corax_reader_next(r, &row, err);
    }
    corax_reader_info(r, &t->info);
    corax_reader_close(r);
    if (st != CORAX_END) {
        corax_table_free(t);
        return st;
    }
    *out = t;
    return CORAX_OK;
}

void corax_table_free(corax_table *t)
{
    if (!t)
        return;
    free(t->text);
    free(t->cell);
    free(t->cell_len);
    free(t->row_first);
    free(t->row_line);
    free(t);
}

const char *corax_table_path(const corax_table *t) { return t->path; }

void corax_table_read_info(const corax_table *t, corax_table_info *info) { *info = t->info; }
size_t corax_table_rows(const corax_table *t) { return t->nrow - 1; }
size_t corax_table_columns(const corax_table *t) { return t->row_first[1] - t->row_first[0]; }

const char *corax_table_header_name(const corax_table *t, size_t column)
{
    return column < corax_table_columns(t) ? t->text + t->cell[column] : "";
}

long corax_table_find(const corax_table *t, const char *name)
{
    for (size_t i = 0; i < corax_table_columns(t); i++)
        if (strcasecmp(t->text + t->cell[i], name) == 0)
            return (long)i;
    return -1;
}

size_t corax_table_width(const corax_table *t, size_t row)
{
    return t->row_first[row + 2] - t->row_first[row + 1];
}

long corax_table_line(const corax_table *t, size_t row) { return t->row_line[row + 1]; }

const char *corax_table_cell(const corax_table *t, size_t row, long column, size_t *length)
{
    if (row >= corax_table_rows(t) || column < 0 || (size_t)column >= corax_table_width(t, row)) {
        if (length)
            *length = 0;
        return "";
    }
    size_t k = t->row_first[row + 1] + (size_t)column;
    if (length)
        *length = t->cell_len[k];
    return t->text + t->cell[k];
}

corax_number_status corax_table_number(const corax_table *t, size_t row, long column,
                                       double *value)
{
    size_t n;
    const char *c = corax_table_cell(t, row, column, &n);
    *value = NAN;
    return corax_parse_number(c, n, t->decimal, value);
}

long corax_table_column(const corax_table *t, const char *logical, const corax_column_map *map)
{
    size_t n = corax_table_columns(t);
    const char **field = malloc((n ? n : 1) * sizeof *field);
    if (!field)
        return -1;
    for (size_t i = 0; i < n; i++)
        field[i] = t->text + t->cell[i];
    corax_row header = {n, field, t->cell_len, t->row_line[0]};
    long c = corax_column_find(&header, logical, map);
    free(field);
    return c;
}
