/* io: CSV tables read row by row through libcsv, with exact line numbers.
 *
 * libcsv pushes fields through callbacks and knows nothing of lines. We feed
 * it one physical line at a time, so every call completes at most one row and
 * the line count is exact, including for quoted fields spanning lines.
 *
 * Tables arrive as people export them: the delimiter and the decimal mark are
 * found from the first block when they are not given (only where the answer
 * is unambiguous), lines starting with '#' are comments, rows of empty fields
 * are blank rows, and blanks around a field are not part of it. */
#include <csv.h>
#include <errno.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/table.h"
#include "io/fuzz.h"

enum {
    READ_BLOCK = 1 << 20,
    MAX_LINE = 1 << 20,  /* bytes in one line: no table of readings comes near */
    MAX_ROW = 1 << 24,   /* bytes in one row, its quoted line breaks included */
    MAX_FIELDS = 10000,  /* fields in one row */
};

struct corax_reader {
    FILE *fp;
    int own_fp;
    const char *path;
    struct csv_parser parser;
    int parser_ready;

    char *block; /* read buffer */
    size_t block_size, have, pos;
    int eof, first_block, prev_cr;
    long line;     /* line number of the next byte fed */
    long row_line; /* line where the row under construction starts, 0 if none */

    /* the row under construction, then the row handed out */
    char *text;
    size_t text_len, text_cap;
    size_t *offset, *length;
    const char **field;
    size_t count, cap;
    int row_done, failed;
    int in_comment; /* a comment line continues into the next block */
    size_t consumed;  /* bytes of the blocks before this one */
    size_t line_len;  /* bytes of the current line in earlier blocks */
    const char *too_big; /* a limit passed, named; NULL if none */

    corax_table_info info; /* the format as read, and what was skipped */
};

corax_table_format corax_table_format_default(void)
{
    corax_table_format f = {0, 0};
    return f;
}

corax_table_settings corax_table_settings_default(void)
{
    corax_table_settings s = {corax_table_format_default(), NULL, 1.0};
    return s;
}

static int grow_fields(corax_reader *r)
{
    size_t cap = r->cap ? 2 * r->cap : 32;
    size_t *o = realloc(r->offset, cap * sizeof *o);
    if (!o)
        return 0;
    r->offset = o;
    size_t *l = realloc(r->length, cap * sizeof *l);
    if (!l)
        return 0;
    r->length = l;
    const char **f = realloc(r->field, cap * sizeof *f);
    if (!f)
        return 0;
    r->field = f;
    r->cap = cap;
    return 1;
}

/* libcsv's own test for blanks (space and tab) is inline; we use the same
 * set to spot lines holding nothing but blanks. */
static int blank_or_space(unsigned char c) { return c == ' ' || c == '\t'; }

/* Room for one more field and `len` more bytes of text; 0 (with r->failed
 * set) past a limit or out of memory. */
static int room_for(corax_reader *r, size_t len)
{
    if (r->count == MAX_FIELDS || r->text_len + len > MAX_ROW) {
        r->too_big = r->count == MAX_FIELDS ? "the row has more than 10000 fields"
                                            : "the row is longer than 16 MiB (a quote never "
                                              "closed?)";
        r->failed = 1;
        return 0;
    }
    if (r->count == r->cap && !grow_fields(r)) {
        r->failed = 1;
        return 0;
    }
    if (r->text_len + len + 1 > r->text_cap) {
        size_t cap = r->text_cap ? r->text_cap : 256;
        while (cap < r->text_len + len + 1)
            cap *= 2;
        char *t = realloc(r->text, cap);
        if (!t) {
            r->failed = 1;
            return 0;
        }
        r->text = t;
        r->text_cap = cap;
    }
    return 1;
}

static void on_field(void *data, size_t len, void *user)
{
    corax_reader *r = user;
    if (r->failed)
        return;
    /* blanks around a value are not part of it, quoted or not */
    while (len && blank_or_space(*(unsigned char *)data)) {
        data = (char *)data + 1;
        len--;
    }
    while (len && blank_or_space(((unsigned char *)data)[len - 1]))
        len--;
    if (!room_for(r, len))
        return;
    if (len)
        memcpy(r->text + r->text_len, data, len);
    r->offset[r->count] = r->text_len;
    r->length[r->count] = len;
    r->count++;
    r->text_len += len;
    r->text[r->text_len++] = '\0';
}

static void on_row(int terminator, void *user)
{
    (void)terminator;
    corax_reader *r = user;
    r->row_done = 1;
}

static corax_status refill(corax_reader *r, corax_error *err);

/* The line starting at s (n bytes to the end of the block), without its line
 * end: its length, and in *next where the following line starts. */
static size_t line_at(const char *s, size_t n, size_t *next)
{
    size_t i = 0;
    while (i < n && s[i] != '\n' && s[i] != '\r')
        i++;
    size_t j = i;
    if (j < n && s[j] == '\r')
        j++;
    if (j < n && s[j] == '\n' && (j == i || s[i] == '\r'))
        j++;
    else if (j == i && j < n)
        j++;
    *next = j;
    return i;
}

/* A line that is no row: empty, blanks only, or a comment ('#' first). */
static int skippable_line(const char *s, size_t n)
{
    size_t i = 0;
    while (i < n && blank_or_space((unsigned char)s[i]))
        i++;
    return i == n || s[i] == '#';
}

/* A field that is a plain decimal number; its decimal mark ('.' or ','), 0
 * for a whole number, -1 for anything else. */
static int number_mark(const char *s, size_t n)
{
    while (n && blank_or_space((unsigned char)*s)) {
        s++;
        n--;
    }
    while (n && blank_or_space((unsigned char)s[n - 1]))
        n--;
    if (n >= 2 && s[0] == '"' && s[n - 1] == '"') { /* a quoted number counts too */
        s++;
        n -= 2;
    }
    size_t i = n && (*s == '+' || *s == '-');
    size_t d0 = i;
    while (i < n && s[i] >= '0' && s[i] <= '9')
        i++;
    if (i == d0)
        return -1;
    if (i == n)
        return 0;
    int mark = s[i];
    if (mark != '.' && mark != ',')
        return -1;
    size_t d1 = ++i;
    while (i < n && s[i] >= '0' && s[i] <= '9')
        i++;
    return i == n && i > d1 ? mark : -1;
}

enum { DETECT_ROWS = 2000 }; /* data rows looked at for the decimal mark */

/* The end of the field starting at f: the next delimiter outside quotes, or
 * the end of the line. */
static const char *field_end(const char *f, const char *end, char delim)
{
    int quoted = 0;
    for (; f < end; f++) {
        if (*f == '"')
            quoted = !quoted;
        else if (*f == delim && !quoted)
            return f;
    }
    return end;
}

/* Find what the caller left to be found: the delimiter from the header line
 * (the only one of comma, semicolon and tab it holds), then, when fields are
 * not separated by commas, the decimal mark from the numbers of the first
 * rows (points or commas, never both). Looks only at the first block. */
static corax_status detect_format(corax_reader *r, corax_table_format want, corax_error *err)
{
    corax_status st = refill(r, err);
    if (st != CORAX_OK)
        return st;
    const char *s = r->block + r->pos;
    size_t n = r->have - r->pos, at = 0, next;
    long line = 1, header_line = 0;
    char delim = want.delimiter, decimal = want.decimal;
    long first_mark[2] = {0, 0}; /* first line with a decimal point, a decimal comma */
    size_t rows = 0;
    while (at < n && rows < DETECT_ROWS) {
        size_t len = line_at(s + at, n - at, &next);
        const char *l = s + at;
        if (next == n - at && !r->eof && at > 0)
            break; /* a line cut by the block's end */
        if (!skippable_line(l, len)) {
            if (!header_line) {
                header_line = line;
                if (!delim) {
                    int seen[3] = {0, 0, 0}, quoted = 0;
                    for (size_t i = 0; i < len; i++) {
                        quoted ^= l[i] == '"';
                        if (!quoted)
                            seen[0] |= l[i] == ',', seen[1] |= l[i] == ';', seen[2] |= l[i] == '\t';
                    }
                    if (seen[0] + seen[1] + seen[2] > 1)
                        return corax_error_set(
                            err, CORAX_EFORMAT, r->path, line,
                            "the header holds more than one of comma, semicolon and tab: say "
                            "which separates the fields (delimiter = comma, semicolon or tab "
                            "in the table's section of the project file, or --delimiter)");
                    delim = seen[1] ? ';' : seen[2] ? '\t' : ',';
                    r->info.delimiter_detected = 1;
                }
                if (decimal || delim == ',')
                    break;
            } else {
                rows++;
                for (const char *f = l, *end = l + len; f <= end;) {
                    const char *fe = field_end(f, end, delim);
                    int m = number_mark(f, (size_t)(fe - f));
                    if (m > 0 && !first_mark[m == ','])
                        first_mark[m == ','] = line;
                    f = fe + 1;
                }
            }
        }
        at += next;
        line += next > len; /* a line end was passed */
    }
    if (!delim)
        delim = ',';
    if (!decimal) {
        if (delim != ',' && first_mark[0] && first_mark[1])
            return corax_error_set(
                err, CORAX_EFORMAT, r->path, first_mark[0] < first_mark[1] ? first_mark[1] : first_mark[0],
                "numbers with decimal points (line %ld) and decimal commas (line %ld) both "
                "appear: say which marks decimals (decimal_mark = point or comma in the "
                "table's section of the project file, or --decimal-mark)",
                first_mark[0], first_mark[1]);
        decimal = delim != ',' && first_mark[1] ? ',' : '.';
        r->info.decimal_detected = 1;
    }
    if (delim == ',' && decimal == ',')
        return corax_error_set(err, CORAX_EFORMAT, r->path, header_line,
                               "the fields are separated by commas, so commas cannot also mark "
                               "decimals: give the delimiter (semicolon or tab)");
    r->info.format.delimiter = delim;
    r->info.format.decimal = decimal;
    return CORAX_OK;
}

static corax_status reader_open(FILE *stream, const char *path, corax_table_format format,
                                corax_reader **out, corax_error *err)
{
    *out = NULL;
    corax_reader *r = calloc(1, sizeof *r);
    if (!r)
        return CORAX_ENOMEM;
    r->path = path;
    r->line = 1;
    r->first_block = 1;
    if (stream) {
        r->fp = stream;
    } else if (strcmp(path, "-") == 0) {
        r->fp = stdin;
    } else {
        r->fp = fopen(path, "rb");
        r->own_fp = 1;
        if (!r->fp) {
            int e = errno;
            free(r);
            return corax_error_set(err, CORAX_EIO, path, 0, "cannot open: %s", strerror(e));
        }
    }
    r->block_size = CORAX_READ_BLOCK(READ_BLOCK);
    r->block = malloc(r->block_size);
    if (!r->block || csv_init(&r->parser, CSV_STRICT_FINI) != 0) {
        corax_reader_close(r);
        return CORAX_ENOMEM;
    }
    r->parser_ready = 1;
    r->info.format = format;
    if (!format.delimiter || !format.decimal) {
        corax_status st = detect_format(r, format, err);
        if (st != CORAX_OK) {
            corax_reader_close(r);
            return st;
        }
    }
    csv_set_delim(&r->parser, (unsigned char)r->info.format.delimiter);
    *out = r;
    return CORAX_OK;
}

corax_status corax_reader_open(const char *path, corax_table_format format,
                               corax_reader **out, corax_error *err)
{
    return reader_open(NULL, path, format, out, err);
}

corax_status corax_reader_open_stream(FILE *stream, const char *name, corax_table_format format,
                                      corax_reader **out, corax_error *err)
{
    return reader_open(stream, name, format, out, err);
}

/* The line of the block's first NUL byte (from pos), or 0 when it holds
 * none: lines end at LF, CR or CRLF, as feed_line counts them. */
static long nul_line(const corax_reader *r)
{
    const char *s = r->block + r->pos, *nul = memchr(s, '\0', r->have - r->pos);
    if (!nul)
        return 0;
    long line = r->line;
    int cr = r->prev_cr;
    for (const char *p = s; p < nul; p++) {
        line += *p == '\r' || (*p == '\n' && !cr); /* the LF of a CRLF ends no line */
        cr = *p == '\r';
    }
    return line;
}

/* Read the next block; keeps nothing from the previous one (we only ever
 * leave a block after feeding all of it). */
static corax_status refill(corax_reader *r, corax_error *err)
{
    r->consumed += r->have;
    r->have = fread(r->block, 1, r->block_size, r->fp);
    r->pos = 0;
    if (r->have < r->block_size) {
        if (ferror(r->fp))
            return corax_error_set(err, CORAX_EIO, r->path, r->line, "read error: %s",
                                   strerror(errno));
        r->eof = 1;
    }
    if (r->first_block) {
        r->first_block = 0;
        if (r->have >= 3 && memcmp(r->block, "\xEF\xBB\xBF", 3) == 0)
            r->pos = 3; /* UTF-8 byte-order mark */
        if (r->have >= 2 && (memcmp(r->block, "\xFF\xFE", 2) == 0 ||
                             memcmp(r->block, "\xFE\xFF", 2) == 0))
            return corax_error_set(err, CORAX_EFORMAT, r->path, 1,
                                   "the file is UTF-16 text: save it as UTF-8 (for example "
                                   "iconv -f UTF-16 -t UTF-8 FILE > FILE.csv)");
    }
    long nul = nul_line(r); /* in every block: a NUL would cut a field short */
    if (nul)
        return corax_error_set(err, CORAX_EFORMAT, r->path, nul,
                               "the file holds NUL bytes: it is not a text table "
                               "(UTF-16 without its mark, or a binary file?)");
    return CORAX_OK;
}

/* Split an unquoted line (without its line end) into fields: the line is
 * copied once into the row's text and cut there, each field ended by a NUL
 * over its delimiter (or its first trailing blank); cut_blanks: the line began
 * with blanks in the block before (given to libcsv, which skips them). */
static void split_line(corax_reader *r, const char *s, size_t n, int cut_blanks)
{
    const char delim = (char)r->parser.delim_char;
    size_t i = 0;
    while (i < n && blank_or_space((unsigned char)s[i]) && s[i] != delim)
        i++;
    if (i == n) { /* a blank line: no row */
        r->info.blank_rows += n > 0 || cut_blanks;
        return;
    }
    if (!room_for(r, n))
        return;
    size_t base = r->text_len;
    char *t = r->text + base;
    memcpy(t, s, n);
    t[n] = '\0';
    r->text_len += n + 1;
    for (size_t start = 0;;) {
        size_t end = start;
        while (end < n && t[end] != delim)
            end++;
        size_t fs = start, fe = end;
        while (fs < fe && blank_or_space((unsigned char)t[fs]))
            fs++;
        while (fe > fs && blank_or_space((unsigned char)t[fe - 1]))
            fe--;
        if (r->count == MAX_FIELDS || (r->count == r->cap && !grow_fields(r))) {
            r->too_big = r->count == MAX_FIELDS ? "the row has more than 10000 fields" : NULL;
            r->failed = 1;
            return;
        }
        t[fe] = '\0';
        r->offset[r->count] = base + fs;
        r->length[r->count] = fe - fs;
        r->count++;
        if (end == n)
            break;
        start = end + 1;
    }
    on_row('\n', r);
}

/* Where the line starting at s ends: the first line end in n bytes (n when
 * there is none); *quote set when a '"' comes before it. Every byte read
 * passes here, so eight at a time: a byte equal to c turns up as the lowest
 * set high bit of (y - 0x01..) & ~y, y = x ^ (c repeated); higher bits may
 * be false, the lowest never is. */
static size_t line_end(const char *s, size_t n, int *quote)
{
    size_t i = 0;
    *quote = 0;
#if defined(__GNUC__) && defined(__BYTE_ORDER__) && __BYTE_ORDER__ == __ORDER_LITTLE_ENDIAN__
    const uint64_t ones = 0x0101010101010101u, highs = 0x8080808080808080u;
    for (; i + 8 <= n; i += 8) {
        uint64_t x;
        memcpy(&x, s + i, sizeof x);
        uint64_t lf = x ^ (ones * '\n'), cr = x ^ (ones * '\r'), qu = x ^ (ones * '"');
        uint64_t hit = (((lf - ones) & ~lf) | ((cr - ones) & ~cr) | ((qu - ones) & ~qu)) & highs;
        if (hit) {
            i += (size_t)__builtin_ctzll(hit) / 8;
            break;
        }
    }
#endif
    for (; i < n && s[i] != '\n' && s[i] != '\r'; i++)
        if (s[i] == '"')
            *quote = 1;
    return i;
}

/* Feed up to and including the next line end. */
static void feed_line(corax_reader *r)
{
    const char *s = r->block + r->pos;
    size_t n = r->have - r->pos, i = 0;
    size_t earlier = 0; /* bytes of the line in blocks before */
    int quote = 0;
    if (r->prev_cr && n && s[0] == '\n') { /* the LF of a CRLF split from its CR */
        r->prev_cr = 0;
        i = 1;
    } else {
        r->prev_cr = 0;
        i = line_end(s, n, &quote);
        int comment = r->in_comment;
        if (!comment && r->parser.pstate == 0 && r->row_line == 0) {
            size_t k = 0; /* at the start of a row: a comment line is no row */
            while (k < i && blank_or_space((unsigned char)s[k]))
                k++;
            comment = k < i && s[k] == '#';
            r->info.comments += comment;
        }
        earlier = r->line_len;
        r->line_len = i < n ? 0 : r->line_len + i; /* a line cut by the block's end */
        if (r->line_len > MAX_LINE) {
            r->too_big = "the line is longer than 1 MiB: is this a table?";
            r->failed = 1;
            return;
        }
        if (comment) { /* skip to the line end, which may lie in the next block */
            r->in_comment = i == n;
            if (i < n) {
                r->prev_cr = s[i] == '\r';
                i++;
                r->line++;
            }
            r->pos += i;
            return;
        }
        if (i < n) {
            r->prev_cr = s[i] == '\r';
            i++;
        }
        if (r->row_line == 0) {
            for (size_t k = 0; k < i; k++)
                if (!blank_or_space((unsigned char)s[k]) && s[k] != '\n' && s[k] != '\r') {
                    r->row_line = r->line;
                    break;
                }
        }
        if (i && (s[i - 1] == '\n' || s[i - 1] == '\r'))
            r->line++;
    }
    /* A whole line with no quote, at the start of a row, needs no state
     * machine: split it here (libcsv's rules: blanks trimmed, blank lines
     * skipped). Most lines of a log are like that, and this is the hot path. */
    if (i && r->parser.pstate == 0 && (s[i - 1] == '\n' || s[i - 1] == '\r') && !quote)
        split_line(r, s, i - 1, earlier > 0);
    else if (i)
        csv_parse(&r->parser, s, i, on_field, on_row, r);
    r->pos += i;
}

static int all_empty(const corax_reader *r)
{
    for (size_t i = 0; i < r->count; i++)
        if (r->length[i])
            return 0;
    return 1;
}

corax_status corax_reader_next(corax_reader *r, corax_row *row, corax_error *err)
{
    r->count = 0;
    r->text_len = 0;
    r->row_done = 0;
    while (!r->row_done) {
        if (r->pos == r->have) {
            if (r->eof) {
                long start = r->row_line;
                /* libcsv only reports an open quote at the end in its strict mode,
                 * which also refuses stray quotes we accept; so look ourselves:
                 * state 2 is "field begun", and the field began with a quote. */
                int open_quote = r->parser.pstate == 2 && r->parser.quoted;
                if (open_quote || csv_fini(&r->parser, on_field, on_row, r) != 0)
                    return corax_error_set(err, CORAX_EFORMAT, r->path, start,
                                           "a quoted field is never closed");
                if (r->row_done && all_empty(r)) {
                    r->info.blank_rows++;
                    r->row_done = 0;
                }
                if (!r->row_done)
                    return CORAX_END;
                break;
            }
            corax_status st = refill(r, err);
            if (st != CORAX_OK)
                return st;
            continue;
        }
        feed_line(r);
        if (r->failed)
            return r->too_big ? corax_error_set(err, CORAX_EFORMAT, r->path,
                                                r->row_line ? r->row_line : r->line, "%s",
                                                r->too_big)
                              : CORAX_ENOMEM;
        if (r->row_done && all_empty(r)) { /* a blank row: skipped, counted */
            r->info.blank_rows++;
            r->count = 0;
            r->text_len = 0;
            r->row_done = 0;
            r->row_line = 0;
        }
    }
    if (r->failed)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < r->count; i++)
        r->field[i] = r->text + r->offset[i];
    row->count = r->count;
    row->field = r->field;
    row->length = r->length;
    row->line = r->row_line;
    r->row_line = 0;
    return CORAX_OK;
}

const char *corax_reader_path(const corax_reader *r) { return r->path; }

void corax_reader_info(const corax_reader *r, corax_table_info *info) { *info = r->info; }

size_t corax_reader_offset(const corax_reader *r) { return r->consumed + r->pos; }

void corax_reader_close(corax_reader *r)
{
    if (!r)
        return;
    if (r->own_fp && r->fp)
        fclose(r->fp);
    if (r->parser_ready)
        csv_free(&r->parser);
    free(r->block);
    free(r->text);
    free(r->offset);
    free(r->length);
    free(r->field);
    free(r);
}

#ifdef CORAX_FUZZ
static size_t fuzz_block;

void corax_fuzz_read_block(size_t bytes) { fuzz_block = bytes && bytes < 16 ? 16 : bytes; }

size_t corax_fuzz_block(size_t usual) { return fuzz_block ? fuzz_block : usual; }
#endif
