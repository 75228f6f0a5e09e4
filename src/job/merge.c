/* job: the merge job. The shards of a convert run put together in the order
 * of the core logs' rows: each log row's hole names its shard
 * (corax_shard_of()), and the shard's next row is copied as it stands, so
 * the merged table is the single run's byte for byte. Rows are copied as
 * raw records (a quoted field may hold a line break), never parsed and
 * written again. */
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/job_merge.h"
#include "io/fields.h"
#include "job/job_int.h"

typedef struct shard_file {
    const char *path;
    FILE *f;
    char *rec;       /* the record just read */
    size_t len, cap;
    long line;       /* the line its record begins on */
    long next_line;  /* the line after it */
    size_t rows;
} shard_file;

/* What the shards' header says of their rows. */
typedef struct shard_layout {
    char delim;   /* the delimiter */
    long hole;    /* the hole's column, or -1 */
    size_t width; /* the number of fields of every row */
} shard_layout;

/* A record's bounds, as the table reader's (reader.c): a shard that passes
 * them reads back whole in every command. */
enum { MAX_LINE = 1 << 20, MAX_RECORD = 1 << 24 };

/* Append a byte to the record; 0 when out of memory. */
static int record_put(shard_file *s, char c)
{
    if (s->len + 2 > s->cap) {
        size_t cap = s->cap ? s->cap * 2 : 4096;
        char *r = realloc(s->rec, cap);
        if (!r)
            return 0;
        s->rec = r;
        s->cap = cap;
    }
    s->rec[s->len++] = c;
    return 1;
}

/* Read a shard's next record (lines until its quotes pair up): 1, 0 at the
 * end, -1 on a read error, a record cut by the end, a NUL byte or a record
 * beyond the reader's bounds (said). */
static int read_record(corax_job *job, shard_file *s)
{
    s->len = 0;
    s->line = s->next_line;
    int quotes = 0;
    size_t line_len = 0;
    for (;;) {
        int c = getc_unlocked(s->f);
        if (c == EOF) {
            if (ferror(s->f)) {
                job_error(job, s->path, s->next_line, "cannot be read: %s", strerror(errno));
                return -1;
            }
            if (quotes) {
                job_error(job, s->path, s->line, "a quoted field is not closed before the end");
                return -1;
            }
            break;
        }
        if (c == '\0') {
            job_error(job, s->path, s->next_line,
                      "the file holds NUL bytes: it is not a converted table");
            return -1;
        }
        if (++line_len > MAX_LINE || s->len + 1 > MAX_RECORD) {
            job_error(job, s->path, s->next_line, "%s",
                      line_len > MAX_LINE ? "the line is longer than 1 MiB: is this a table?"
                                          : "the row is longer than 16 MiB (a quote never "
                                            "closed?)");
            return -1;
        }
        if (!record_put(s, (char)c)) {
            job_error(job, s->path, s->line, "out of memory");
            return -1;
        }
        quotes ^= c == '"';
        if (c == '\n') {
            s->next_line++;
            line_len = 0;
            if (!quotes)
                break;
        }
    }
    if (s->len == 0)
        return 0;
    if (s->rec[s->len - 1] != '\n') /* the last line, without its end */
        s->next_line++;
    s->rec[s->len] = '\0';
    return 1;
}

/* The record without its line end. */
static size_t record_length(const char *rec, size_t len)
{
    while (len && (rec[len - 1] == '\n' || rec[len - 1] == '\r'))
        len--;
    return len;
}

/* Walk the fields of a record: the index-th field's text into out (at most
 * cap bytes, quotes undone); its length, or (size_t)-1 when the record has
 * fewer fields or the field is longer. */
static size_t field_at(const char *rec, size_t len, char delim, size_t index, char *out,
                       size_t cap)
{
    len = record_length(rec, len);
    size_t field = 0, i = 0;
    while (i <= len) {
        size_t n = 0;
        int quoted = i < len && rec[i] == '"';
        if (quoted) {
            for (i++; i < len; i++) {
                if (rec[i] == '"') {
                    if (i + 1 < len && rec[i + 1] == '"')
                        i++;
                    else {
                        i++;
                        break;
                    }
                }
                if (field == index && n < cap)
                    out[n] = rec[i];
                n++;
            }
        }
        for (; i < len && rec[i] != delim; i++) {
            if (field == index && n < cap)
                out[n] = rec[i];
            n++;
        }
        if (field == index)
            return n <= cap ? n : (size_t)-1;
        field++;
        i++; /* past the delimiter */
    }
    return (size_t)-1;
}

/* The number of fields of a record as convert writes one, or 0 when it is
 * not so written: every field is bare (no quote, carriage return or line
 * break in it) or wholly quoted (quotes inside doubled), and the record
 * does not open with '#' (which a reader takes for a comment). A record that
 * passes reads back as one row of that many fields. */
static size_t field_count(const char *rec, size_t len, char delim)
{
    len = record_length(rec, len);
    if (len && rec[0] == '#')
        return 0;
    size_t n = 1, i = 0;
    for (;;) {
        if (i < len && rec[i] == '"') { /* a quoted field, to its closing quote */
            for (i++;; i++) {
                if (i >= len)
                    return 0;
                if (rec[i] == '"' && !(i + 1 < len && rec[i + 1] == '"'))
                    break;
                if (rec[i] == '"')
                    i++;
            }
            i++;
            if (i < len && rec[i] != delim)
                return 0;
        } else {
            for (; i < len && rec[i] != delim; i++)
                if (rec[i] == '"' || rec[i] == '\r' || rec[i] == '\n')
                    return 0;
        }
        if (i >= len)
            return n;
        n++;
        i++; /* past the delimiter */
    }
}

/* The delimiter of a converted table's header, which ends with "note", its
 * hole column (-1: none) and its width. 0, or -1 when it is not a converted
 * table. */
static int converted_header(const char *rec, size_t len, shard_layout *lay)
{
    static const char delims[] = {',', ';', '\t'};
    len = record_length(rec, len);
    lay->hole = -1;
    for (size_t d = 0; d < sizeof delims; d++)
        if (len > 5 && rec[len - 5] == delims[d] && memcmp(rec + len - 4, "note", 4) == 0) {
            lay->delim = delims[d];
            lay->width = field_count(rec, len, lay->delim);
            for (size_t k = 0; k < lay->width && lay->hole < 0; k++) {
                char name[8];
                if (field_at(rec, len, lay->delim, k, name, sizeof name) == 4 &&
                    memcmp(name, "hole", 4) == 0)
                    lay->hole = (long)k;
            }
            return lay->width ? 0 : -1;
        }
    return -1;
}

static void close_shards(shard_file *s, size_t n)
{
    for (size_t i = 0; s && i < n; i++) {
        if (s[i].f && s[i].f != stdin)
            fclose(s[i].f);
        free(s[i].rec);
    }
    free(s);
}

/* Open every shard and read its header; the first's is the output's, and
 * every other must be the same. */
static corax_status open_shards(corax_job *job, shard_file *s, const char *const *paths,
                                size_t n, shard_layout *lay)
{
    for (size_t i = 0; i < n; i++) {
        s[i].path = paths[i];
        s[i].next_line = 1;
        s[i].f = strcmp(paths[i], "-") == 0 ? stdin : fopen(paths[i], "r");
        if (!s[i].f) {
            job_error(job, paths[i], 0, "cannot be opened: %s", strerror(errno));
            return CORAX_EIO;
        }
        int got = read_record(job, &s[i]);
        if (got < 0)
            return CORAX_EIO;
        if (got == 0) {
            job_error(job, paths[i], 0, "is empty: not a converted table");
            return CORAX_EFORMAT;
        }
        if (i == 0 && converted_header(s[0].rec, s[0].len, lay) != 0) {
            job_error(job, paths[0], 1, "not a converted table (its header does not end with "
                      "a note column)");
            return CORAX_EFORMAT;
        }
        if (i > 0 && (s[i].len != s[0].len || memcmp(s[i].rec, s[0].rec, s[0].len) != 0)) {
            job_error(job, paths[i], 1, "its header differs from %s's: the shards were not "
                      "converted with the same logs and options", paths[0]);
            return CORAX_EFORMAT;
        }
    }
    return CORAX_OK;
}

/* Copy the rows of one log from their shards. */
static corax_status merge_log(corax_job *job, const corax_table_settings *t, const char *path,
                              shard_file *s, size_t n, const shard_layout *lay, corax_writer *w,
                              corax_merge_job_summary *sum)
{
    static const char *const names[] = {"hole"};
    corax_reader *rd;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_reader_open(path, t->format, &rd, &err);
    long col[1];
    size_t width;
    if (st == CORAX_OK)
        st = corax_table_header(rd, names, 1, 1, t->columns, col, &width, NULL, &err);
    corax_stage progress;
    job_stage_begin(job, &progress, path, "bytes", job_file_size(path));
    corax_row row;
    int said = 0; /* the shards' faults are said as they are found */
    while (st == CORAX_OK && (st = corax_reader_next(rd, &row, &err)) == CORAX_OK) {
        size_t len;
        const char *name = corax_field_text(&row, col[0], &len);
        unsigned k = corax_shard_of(name, len, (unsigned)n);
        shard_file *f = &s[k - 1];
        int got = read_record(job, f);
        said = 1;
        if (got < 0) {
            st = CORAX_EIO;
            break;
        }
        if (got == 0) {
            job_error(job, f->path, f->next_line,
                      "ends after %zu rows, but %s:%ld (hole '%.*s') is in shard %u of %zu: the "
                      "shards are not of these logs, or not given in order 1 to %zu", f->rows,
                      path, row.line, (int)len, name, k, n, n);
            st = CORAX_EFORMAT;
            break;
        }
        size_t fields = field_count(f->rec, f->len, lay->delim);
        if (fields != lay->width) {
            if (fields)
                job_error(job, f->path, f->line, "the row has %zu fields but the header has "
                          "%zu: not as convert wrote it", fields, lay->width);
            else
                job_error(job, f->path, f->line, "the row is not as convert writes one (a quote "
                          "out of place, a bare carriage return, or a '#' first)");
            st = CORAX_EFORMAT;
            break;
        }
        char got_name[256];
        long hole = lay->hole;
        size_t gl = hole >= 0 ? field_at(f->rec, f->len, lay->delim, (size_t)hole, got_name,
                                         sizeof got_name)
                              : len;
        if (hole >= 0 && (gl != len || memcmp(got_name, name, len) != 0)) {
            job_error(job, f->path, f->line,
                      "holds hole '%.*s' where %s:%ld (shard %u of %zu) has hole '%.*s': the "
                      "shards are not of these logs, or not given in order 1 to %zu",
                      gl == (size_t)-1 ? 0 : (int)gl, got_name, path, row.line, k, n, (int)len,
                      name, n);
            st = CORAX_EFORMAT;
            break;
        }
        said = 0;
        corax_writer_text(w, f->rec, f->len);
        f->rows++;
        sum->rows++;
        if (sum->per_shard)
            sum->per_shard[k - 1]++;
        if (!(sum->rows & 0xffff))
            job_stage_step(job, &progress, (double)corax_reader_offset(rd));
    }
    job_stage_end(job, &progress);
    if (rd) {
        corax_table_info info;
        corax_reader_info(rd, &info);
        job_table_read(job, CORAX_ROLE_STRUCTURES, path, t->unit, &info);
    }
    corax_reader_close(rd);
    if (st == CORAX_END)
        return CORAX_OK;
    if (!said)
        job_error_record(job, &err, st);
    return job_failed(st);
}

corax_status corax_merge_job_run(corax_job *job, const corax_table_settings *t,
                                 const char *const *logs, size_t nlogs,
                                 const char *const *shards, size_t nshards, const char *output,
                                 corax_merge_job_summary *sum)
{
    sum->rows = 0;
    if (sum->per_shard)
        memset(sum->per_shard, 0, nshards * sizeof *sum->per_shard);
    if (!nlogs || !nshards) {
        job_usage(job, "merge needs the core logs and at least one shard");
        return CORAX_EARG;
    }
    shard_file *s = calloc(nshards, sizeof *s);
    shard_layout lay = {',', -1, 0};
    corax_status st = s ? open_shards(job, s, shards, nshards, &lay) : CORAX_ENOMEM;
    corax_writer *w = st == CORAX_OK ? job_output(job, output, &st) : NULL;
    if (w)
        corax_writer_text(w, s[0].rec, s[0].len);
    for (size_t i = 0; i < nlogs && st == CORAX_OK; i++)
        st = merge_log(job, t, logs[i], s, nshards, &lay, w, sum);
    for (size_t k = 0; k < nshards && st == CORAX_OK; k++) {
        int got = read_record(job, &s[k]);
        if (got < 0) {
            st = CORAX_EIO;
        } else if (got > 0) {
            job_error(job, s[k].path, s[k].line,
                      "holds more rows than the logs give shard %zu of %zu (%zu): the shards "
                      "are not of these logs, or not given in order 1 to %zu", k + 1, nshards,
                      s[k].rows, nshards);
            st = CORAX_EFORMAT;
        }
    }
    if (st == CORAX_OK)
        st = job_commit(job, w);
    else
        corax_writer_discard(w);
    if (st == CORAX_OK && job->record) {
        corax_record_section(job->record, "merge");
        for (size_t i = 0; i < nlogs; i++)
            corax_record_set(job->record, "structures", "%s", logs[i]);
        for (size_t k = 0; k < nshards; k++)
            corax_record_set(job->record, "shard", "%s (%zu/%zu, %zu rows)", shards[k], k + 1,
                             nshards, s[k].rows);
    }
    close_shards(s, nshards);
    return st;
}
