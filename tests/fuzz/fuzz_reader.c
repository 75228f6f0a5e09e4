/* Fuzzing harness: the CSV reader (corax_reader_open/next) in every format,
 * given or found, and the whole-table reader over the same file. Byte 0
 * picks the delimiter (bits 0-1: found, comma, semicolon, tab), the decimal
 * mark (bits 2-3: found, point, comma, either) and, in the fuzzing build,
 * a small read block (bits 4-7) for a second read in the format the first
 * found; the rest is the file.
 *
 * Checked: every row has fields, each as long as it says and ending in a
 * NUL; rows' lines rise; numbers parse to finite values; the whole-table
 * reader gives the same rows; and reading in small blocks gives the same
 * rows, lines, counts and end as reading in the usual ones. */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "corax/table.h"
#include "fuzz.h"
#include "io/fuzz.h"

int LLVMFuzzerInitialize(int *argc, char ***argv)
{
    (void)argc;
    (void)argv;
    return 0;
}

/* What one read saw, in a few numbers. */
typedef struct seen {
    corax_status open, end; /* the open's status, the last next's */
    corax_status outcome;   /* the first that is not CORAX_OK */
    long end_line;          /* the line its error names */
    size_t rows, comments, blank_rows;
    unsigned long long hash;      /* of every row's line, fields and bytes */
    unsigned long long data_hash; /* the same but for the header */
    corax_table_format format;
} seen;

static unsigned long long mix(unsigned long long h, const void *p, size_t n)
{
    const unsigned char *b = p;
    for (size_t i = 0; i < n; i++)
        h = (h ^ b[i]) * 1099511628211ULL; /* FNV-1a */
    return h;
}

static void check_row(const corax_row *row, long previous_line, char decimal)
{
    if (row->count == 0)
        fuzz_fail("line %ld: a row without fields", row->line);
    if (row->line <= previous_line)
        fuzz_fail("line %ld follows line %ld", row->line, previous_line);
    for (size_t i = 0; i < row->count; i++) {
        const char *f = row->field[i];
        if (f[row->length[i]] != '\0' || strlen(f) != row->length[i])
            fuzz_fail("line %ld field %zu: %zu bytes said, %zu before its NUL", row->line, i,
                      row->length[i], strlen(f));
        double v;
        if (corax_parse_number(f, row->length[i], decimal, &v) == CORAX_NUMBER_OK &&
            !isfinite(v))
            fuzz_fail("line %ld field %zu: '%s' parses to a value that is not finite",
                      row->line, i, f);
    }
}

/* A row into a hash. */
static unsigned long long mix_row(unsigned long long h, const corax_row *row)
{
    h = mix(h, &row->line, sizeof row->line);
    h = mix(h, &row->count, sizeof row->count);
    for (size_t i = 0; i < row->count; i++)
        h = mix(h, row->field[i], row->length[i] + 1);
    return h;
}

static seen read_all(const char *path, corax_table_format format)
{
    seen s;
    memset(&s, 0, sizeof s);
    s.hash = s.data_hash = 14695981039346656037ULL;
    corax_error err;
    corax_error_clear(&err);
    corax_reader *r;
    s.open = s.outcome = corax_reader_open(path, format, &r, &err);
    if (s.open != CORAX_OK) {
        s.end_line = err.line;
        return s;
    }
    corax_table_info info;
    corax_reader_info(r, &info);
    s.format = info.format;
    if (!strchr(",;\t", info.format.delimiter) || !info.format.delimiter ||
        !strchr(".,*", info.format.decimal) || !info.format.decimal)
        fuzz_fail("the reader's format is '%c' '%c'", info.format.delimiter,
                  info.format.decimal);
    corax_row row;
    long line = 0;
    while ((s.end = corax_reader_next(r, &row, &err)) == CORAX_OK) {
        check_row(&row, line, info.format.decimal);
        line = row.line;
        if (s.rows++)
            s.data_hash = mix_row(s.data_hash, &row);
        s.hash = mix_row(s.hash, &row);
    }
    s.outcome = s.end;
    if (s.end != CORAX_END)
        s.end_line = err.line;
    corax_reader_info(r, &info);
    s.comments = info.comments;
    s.blank_rows = info.blank_rows;
    corax_reader_close(r);
    return s;
}

/* The whole-table reader holds the rows the streaming one gave. */
static void check_table(const char *path, const seen *s)
{
    corax_table *t;
    corax_error err;
    corax_error_clear(&err);
    if (corax_table_load(path, s->format, &t, &err) != CORAX_OK)
        return; /* a repeated header name, say: refused, as it should be */
    if (s->end != CORAX_END || corax_table_rows(t) + 1 != s->rows)
        fuzz_fail("the whole table holds %zu rows, the stream %zu (ending %d)",
                  corax_table_rows(t) + 1, s->rows, s->end);
    static const char *field[10000];
    if (corax_table_widest(t) > 10000)
        fuzz_fail("a row of %zu fields", corax_table_widest(t));
    unsigned long long h = 14695981039346656037ULL;
    for (size_t i = 0; i < corax_table_rows(t); i++) {
        corax_row row;
        corax_table_row(t, i, field, &row);
        h = mix_row(h, &row);
    }
    if (h != s->data_hash)
        fuzz_fail("the whole table's rows differ from the stream's");
    corax_table_free(t);
}

#ifdef CORAX_FUZZ
/* The same outcome (a fault found at the open in one block may be found
 * further on in smaller ones) and, read to the end, the same rows. */
static int same(const seen *a, const seen *b)
{
    if (a->outcome != b->outcome || a->end_line != b->end_line)
        return 0;
    return a->outcome != CORAX_END ||
           (a->rows == b->rows && a->comments == b->comments &&
            a->blank_rows == b->blank_rows && a->hash == b->hash);
}
#endif

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    static const char delimiters[] = {0, ',', ';', '\t'};
    static const char decimals[] = {0, '.', ',', CORAX_DECIMAL_EITHER};
    static const size_t blocks[] = {0,  16,  17,  19,  23,   31,   32,    47,
                                    64, 100, 128, 255, 256, 1000, 4096, 65536};
    if (size < 1)
        return 0;
    corax_table_format format = {delimiters[data[0] & 3], decimals[(data[0] >> 2) & 3]};
    size_t block = blocks[data[0] >> 4];
    const char *path = fuzz_path(0, "table.csv");
    fuzz_write(path, data + 1, size - 1);

    seen s = read_all(path, format);
    if (s.open == CORAX_OK)
        check_table(path, &s);
#ifdef CORAX_FUZZ
    if (block && s.open == CORAX_OK) { /* in the format the usual read found */
        corax_fuzz_read_block(block);
        seen small = read_all(path, s.format);
        corax_fuzz_read_block(0);
        if (!same(&s, &small))
            fuzz_fail("read in blocks of %zu: %zu rows, end %d at line %ld, %zu comments, %zu "
                      "blank; in the usual blocks: %zu rows, end %d at line %ld, %zu, %zu%s",
                      block, small.rows, small.outcome, small.end_line, small.comments,
                      small.blank_rows, s.rows, s.outcome, s.end_line, s.comments,
                      s.blank_rows, small.hash != s.hash ? "; the rows differ" : "");
    }
#else
    (void)block;
#endif
    return 0;
}
