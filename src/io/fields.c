/* io: reading typed values out of table rows, with the words to explain a
 * value that cannot be used. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "io/fields.h"

corax_number_status corax_field_number(const corax_row *row, long col, char decimal,
                                       const char *name, double *value, char *why,
                                       size_t whylen)
{
    if (col < 0 || (size_t)col >= row->count) {
        snprintf(why, whylen, "%s is missing (the row is short)", name);
        return CORAX_NUMBER_EMPTY;
    }
    corax_number_status st =
        corax_parse_number(row->field[col], row->length[col], decimal, value);
    switch (st) {
    case CORAX_NUMBER_OK:
        break;
    case CORAX_NUMBER_EMPTY:
        snprintf(why, whylen, "%s is empty", name);
        break;
    case CORAX_NUMBER_NOT_NUMBER:
        snprintf(why, whylen, "%s '%.40s' is not a number", name, row->field[col]);
        break;
    case CORAX_NUMBER_NOT_FINITE:
        snprintf(why, whylen, "%s '%.40s' is not a finite number", name, row->field[col]);
        break;
    }
    return st;
}

int corax_field_in_range(double value, double lo, double hi, const char *name, char *why,
                         size_t whylen)
{
    if (value >= lo && value <= hi)
        return 1;
    snprintf(why, whylen, "%s %.10g is outside [%g, %g]", name, value, lo, hi);
    return 0;
}

int corax_field_nonnegative(double value, const char *name, char *why, size_t whylen)
{
    if (value >= 0.0)
        return 1;
    snprintf(why, whylen, "%s %.10g is negative", name, value);
    return 0;
}

corax_number_status corax_field_depth(const corax_row *row, const long col[3], char decimal,
                                      double unit, int where, double *depth, char *why,
                                      size_t whylen)
{
    corax_number_status st;
    if (col[0] >= 0 || col[1] < 0 || col[2] < 0) {
        st = corax_field_number(row, col[0], decimal, "depth", depth, why, whylen);
    } else {
        double from = NAN, to = NAN;
        st = corax_field_number(row, col[1], decimal, "from", &from, why, whylen);
        if (st == CORAX_NUMBER_OK)
            st = corax_field_number(row, col[2], decimal, "to", &to, why, whylen);
        if (st == CORAX_NUMBER_OK && to < from) {
            snprintf(why, whylen, "the interval ends (to %g) before it starts (from %g)", to,
                     from);
            st = CORAX_NUMBER_NOT_NUMBER;
        }
        *depth = where == 1 ? from : where == 2 ? to : 0.5 * (from + to);
    }
    if (st == CORAX_NUMBER_OK) {
        *depth *= unit;
        if (!corax_field_plausible(*depth, CORAX_MAX_DEPTH, "depth", why, whylen))
            st = CORAX_NUMBER_NOT_FINITE;
    }
    if (st != CORAX_NUMBER_OK)
        *depth = NAN;
    return st;
}

int corax_field_plausible(double value, double limit, const char *name, char *why,
                          size_t whylen)
{
    if (fabs(value) <= limit)
        return 1;
    snprintf(why, whylen, "%s %.10g m is not plausible (beyond %g m): a slip in the table?",
             name, value, limit);
    return 0;
}

const char *corax_field_text(const corax_row *row, long col, size_t *length)
{
    if (col < 0 || (size_t)col >= row->count) {
        *length = 0;
        return "";
    }
    *length = row->length[col];
    return row->field[col];
}

corax_status corax_column_missing(const char *path, const corax_row *header,
                                  const char *logical, const corax_column_map *map,
                                  corax_error *err)
{
    char list[160] = "";
    size_t used = 0;
    for (size_t k = 0; k < header->count && used + 2 < sizeof list; k++)
        used += (size_t)snprintf(list + used, sizeof list - used, "%s%s", k ? ", " : "",
                                 header->field[k]);
    const char *mapped = corax_column_mapped(map, logical);
    if (mapped)
        return corax_error_set(err, CORAX_EFORMAT, path, header->line,
                               "no '%s' column in the header, which the column names give "
                               "for %s (it has: %s)",
                               mapped, logical, list);
    /* a header read as one field: the table's delimiter is another */
    static const struct {
        char c;
        const char *hint;
    } other[] = {
        {';', "; the header looks semicolon-separated: say delimiter = semicolon or "
              "--delimiter ';'"},
        {'\t', "; the header looks tab-separated: say delimiter = tab or --delimiter tab"},
        {',', "; the header looks comma-separated: say delimiter = comma or --delimiter ','"},
    };
    const char *hint = "; a column name setting can map another name (corax help columns)";
    for (size_t k = 0; header->count == 1 && k < sizeof other / sizeof other[0]; k++)
        if (strchr(header->field[0], other[k].c)) {
            hint = other[k].hint;
            break;
        }
    return corax_error_set(err, CORAX_EFORMAT, path, header->line,
                           "no '%s' column in the header (it has: %s)%s", logical, list, hint);
}

corax_status corax_table_header(corax_reader *reader, const char *const *names, size_t n,
                                size_t required, const corax_column_map *map, long *col,
                                size_t *width, corax_row *header_out, corax_error *err)
{
    const char *path = corax_reader_path(reader);
    corax_row header;
    corax_status st = corax_reader_next(reader, &header, err);
    if (st == CORAX_END)
        return corax_error_set(err, CORAX_EFORMAT, path, 1, "the file is empty (no header row)");
    if (st != CORAX_OK)
        return st;
    st = corax_header_check(&header, err);
    if (st != CORAX_OK) {
        corax_error_file(err, path);
        return st;
    }
    for (size_t i = 0; i < n; i++) {
        col[i] = corax_column_find(&header, names[i], map);
        if (col[i] == CORAX_COLUMN_MAPPED_MISSING || (col[i] < 0 && i < required))
            return corax_column_missing(path, &header, names[i], map, err);
    }
    *width = header.count;
    if (header_out)
        *header_out = header;
    return CORAX_OK;
}

static int clashes(const char *name, size_t len, const char *const *names, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (corax_column_name_match(name, len, names[i], strlen(names[i])))
            return 1;
    return 0;
}

size_t corax_carried_name(const char *name, const char *const *names, size_t n, char *out,
                          size_t outlen)
{
    size_t len = (size_t)snprintf(out, outlen, "%s", name);
    while (len + 4 < outlen && clashes(out, len, names, n)) {
        memmove(out + 4, out, len + 1);
        memcpy(out, "log_", 4);
        len += 4;
    }
    return len < outlen ? len : outlen - 1;
}

const char *corax_field_ragged(const corax_row *row, size_t width, char *why, size_t whylen)
{
    if (row->count == width)
        return NULL;
    snprintf(why, whylen, "the row has %zu fields but the header has %zu", row->count, width);
    return why;
}
