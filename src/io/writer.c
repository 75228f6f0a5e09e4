/* io: buffered output with CSV quoting, fast fixed-point numbers, and files
 * that appear under their real name only when whole. */
#include <errno.h>
#include <fcntl.h>
#include <math.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "common/format.h"
#include "corax/geometry.h"
#include "corax/output.h"
#include "io/fuzz.h"
#include "io/outputs.h"

/* The buffer of a file writer; the bytes written between two starts of the
 * disk's work on them (corax_target_writeback()). */
enum { OUT_BUFFER = 1 << 18, WRITEBACK = 1 << 23 };

struct corax_writer {
    int fd;         /* -1 for a memory writer */
    int memory;     /* output stays in buf, which grows */
    size_t cap;
    corax_outputs *set; /* holds the file when committed, or NULL */
    corax_target target; /* where a file or stream goes */
    char *buf;
    size_t used;
    int failed;     /* errno of the first failed write, 0 if none */
    int row_start;  /* no field written yet on this row */
    long long written, synced; /* bytes written to the file; of them, handed to the disk */
    char delimiter, decimal; /* ',' and '.' unless set */
};

static corax_writer *writer_new(size_t cap)
{
    corax_writer *w = calloc(1, sizeof *w);
    if (!w)
        return NULL;
    w->fd = w->target.fd = -1;
    w->cap = cap;
    w->row_start = 1;
    w->delimiter = ',';
    w->decimal = '.';
    if (!(w->buf = malloc(cap))) {
        free(w);
        return NULL;
    }
    return w;
}

corax_status corax_writer_open_in(corax_outputs *set, const char *path, corax_writer **out,
                                  corax_error *err)
{
    *out = NULL;
    corax_writer *w = writer_new(OUT_BUFFER);
    if (!w)
        return CORAX_ENOMEM;
    if (strcmp(path, "-") == 0) {
        w->fd = STDOUT_FILENO;
        *out = w;
        return CORAX_OK;
    }
    corax_status st = corax_target_open(set, path, &w->target, err);
    if (st != CORAX_OK) {
        free(w->buf);
        free(w);
        return st;
    }
    w->set = set;
    w->fd = w->target.fd;
    *out = w;
    return CORAX_OK;
}

corax_status corax_writer_open(const char *path, corax_writer **out, corax_error *err)
{
    return corax_writer_open_in(NULL, path, out, err);
}

static void write_all(corax_writer *w, const char *p, size_t n)
{
    while (n && !w->failed) {
        ssize_t k = CORAX_FAILS() ? -1 : write(w->fd, p, n);
        if (k < 0) {
            if (errno != EINTR)
                w->failed = errno;
        } else {
            p += k;
            n -= (size_t)k;
            w->written += k;
        }
    }
    if (w->written - w->synced >= WRITEBACK) {
        corax_target_writeback(&w->target, w->synced, w->written - w->synced);
        w->synced = w->written;
    }
}

static void flush(corax_writer *w)
{
    write_all(w, w->buf, w->used);
    w->used = 0;
}

/* Room for n more bytes in buf: a memory writer grows, a file writer
 * flushes. 0 when there is no room (n too big for a file writer's buffer, or
 * out of memory). */
static int grow_room(corax_writer *w, size_t n);

static inline int make_room(corax_writer *w, size_t n)
{
    return w->used + n <= w->cap || grow_room(w, n);
}

static int grow_room(corax_writer *w, size_t n)
{
    if (!w->memory) {
        flush(w);
        return n <= w->cap;
    }
    size_t cap = w->cap;
    while (cap < w->used + n)
        cap *= 2;
    char *b = realloc(w->buf, cap);
    if (!b) {
        w->failed = ENOMEM;
        return 0;
    }
    w->buf = b;
    w->cap = cap;
    return 1;
}

void corax_writer_text(corax_writer *w, const char *text, size_t n)
{
    if (!w->memory && n >= (1 << 14)) { /* a big piece goes straight out, uncopied */
        flush(w);
        write_all(w, text, n);
        return;
    }
    if (!make_room(w, n)) {
        if (!w->memory) /* too big to buffer: straight through */
            write_all(w, text, n);
        return;
    }
    if (n <= 16) { /* most fields: a short copy beats a call */
        for (size_t i = 0; i < n; i++)
            w->buf[w->used + i] = text[i];
    } else {
        memcpy(w->buf + w->used, text, n);
    }
    w->used += n;
}

corax_status corax_writer_memory(corax_writer **out)
{
    corax_writer *w = writer_new(1 << 16);
    if (!w)
        return CORAX_ENOMEM;
    w->memory = 1;
    *out = w;
    return CORAX_OK;
}

const char *corax_writer_contents(const corax_writer *w, size_t *length)
{
    *length = w->used;
    return w->buf;
}

void corax_writer_reset(corax_writer *w)
{
    w->used = 0;
    w->row_start = 1;
}

void corax_writer_printf(corax_writer *w, const char *fmt, ...)
{
    char small[512], *big;
    size_t n;
    va_list ap;
    va_start(ap, fmt);
    const char *text = corax_vformat(small, sizeof small, &big, &n, fmt, ap);
    va_end(ap);
    if (text)
        corax_writer_text(w, text, n);
    else
        w->failed = ENOMEM;
    free(big);
}

void corax_writer_format(corax_writer *w, corax_table_format format)
{
    w->delimiter = format.delimiter ? format.delimiter : ',';
    w->decimal = format.decimal == ',' && w->delimiter != ',' ? ',' : '.';
}

static inline void separator(corax_writer *w)
{
    if (!w->row_start && make_room(w, 1))
        w->buf[w->used++] = w->delimiter;
    w->row_start = 0;
}

/* Whether a field's ends need quotes: a blank at either end, or a '#'
 * opening a row (first), which would make the line a comment to a reader
 * (corax's own among them). */
static inline int ends_need_quotes(const char *s, size_t n, int first)
{
    return n && (s[0] == ' ' || s[0] == '\t' || s[n - 1] == ' ' || s[n - 1] == '\t' ||
                 (first && s[0] == '#'));
}

/* Whether a byte inside a field needs quotes. */
static inline int special_byte(unsigned char c, unsigned char delimiter)
{
    /* every special byte but ';' is below '-': one comparison clears most text */
    return (c < '-' && (c == '"' || c == '\n' || c == '\r' || c == '\t')) || c == delimiter;
}

static int needs_quotes(const char *s, size_t n, char delimiter, int first)
{
    if (ends_need_quotes(s, n, first))
        return 1;
    for (size_t i = 0; i < n; i++)
        if (special_byte((unsigned char)s[i], (unsigned char)delimiter))
            return 1;
    return 0;
}

/* A number just formatted at the end of the buffer gets the decimal comma. */
static void mark_decimal(corax_writer *w, size_t n)
{
    if (w->decimal == '.')
        return;
    char *p = memchr(w->buf + w->used, '.', n);
    if (p)
        *p = w->decimal;
}

void corax_writer_field(corax_writer *w, const char *s, size_t n)
{
    int first = w->row_start;
    if (n <= 32 && make_room(w, n + 1) && !ends_need_quotes(s, n, first)) {
        /* the usual field: short, copied with its separator at once and
         * checked for the bytes that need quotes as it is copied (the rare
         * field that has one is written again, quoted) */
        char *o = w->buf + w->used + !first;
        unsigned char delimiter = (unsigned char)w->delimiter;
        int special = 0;
        for (size_t i = 0; i < n; i++) {
            unsigned char c = (unsigned char)s[i];
            o[i] = (char)c;
            special |= special_byte(c, delimiter);
        }
        if (!special) {
            if (!first)
                o[-1] = w->delimiter;
            w->row_start = 0;
            w->used = (size_t)(o + n - w->buf);
            return;
        }
    }
    separator(w);
    if (!needs_quotes(s, n, w->delimiter, first)) {
        corax_writer_text(w, s, n);
        return;
    }
    corax_writer_text(w, "\"", 1);
    for (const char *q; (q = memchr(s, '"', n)) != NULL;) {
        size_t k = (size_t)(q - s) + 1;
        corax_writer_text(w, s, k);
        corax_writer_text(w, "\"", 1); /* a quote inside is doubled */
        s += k;
        n -= k;
    }
    corax_writer_text(w, s, n);
    corax_writer_text(w, "\"", 1);
}

/* Room for a separator and a number (which corax_format_fixed() writes in
 * at most 48 bytes), the separator written: where the number goes, or NULL. */
static inline char *number_room(corax_writer *w)
{
    if (!make_room(w, 49))
        return NULL;
    if (!w->row_start)
        w->buf[w->used++] = w->delimiter;
    w->row_start = 0;
    return w->buf + w->used;
}

void corax_writer_number(corax_writer *w, double v, int decimals)
{
    char *o = number_room(w);
    if (o) {
        size_t n = corax_format_fixed(o, v, decimals);
        mark_decimal(w, n);
        w->used += n;
    }
}

void corax_writer_azimuth(corax_writer *w, double degrees, int decimals)
{
    if (!(degrees >= 0.0 && degrees < 360.0) && !isnan(degrees))
        degrees = corax_wrap_degrees(degrees, decimals);
    char *o = number_room(w);
    if (!o)
        return;
    size_t n = corax_format_fixed(o, degrees, decimals);
    if (n >= 3 && o[0] == '3' && o[1] == '6' && o[2] == '0') /* 359.999 rounded up */
        n = corax_format_fixed(o, 0.0, decimals);
    mark_decimal(w, n);
    w->used += n;
}

void corax_writer_integer(corax_writer *w, long long value)
{
    char tmp[32];
    int n = snprintf(tmp, sizeof tmp, "%lld", value);
    separator(w);
    corax_writer_text(w, tmp, (size_t)n);
}

void corax_writer_end_row(corax_writer *w)
{
    corax_writer_text(w, "\n", 1);
    w->row_start = 1;
}

corax_status corax_writer_commit(corax_writer *w, corax_error *err)
{
    corax_status st = CORAX_OK;
    if (!w->memory) {
        flush(w);
        if (w->fd == STDOUT_FILENO && w->failed) /* standard output: nothing to remove */
            st = corax_error_set(err, CORAX_EIO, "standard output", 0, "cannot write: %s",
                                 strerror(w->failed));
        else if (w->fd != STDOUT_FILENO)
            st = corax_target_close(w->set, &w->target, w->failed, err);
    }
    free(w->buf);
    free(w);
    return st;
}

void corax_writer_discard(corax_writer *w)
{
    if (!w)
        return;
    if (!w->memory && w->fd != STDOUT_FILENO)
        corax_target_discard(w->set, &w->target);
    free(w->buf);
    free(w);
}
