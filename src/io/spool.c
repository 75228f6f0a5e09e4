/* io: records spooled through a buffer and, when many, an unnamed
 * temporary file, to be read back in order as often as needed. */
#include <errno.h>
#include <fcntl.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "corax/output.h"
#include "io/fuzz.h"
#include "io/spool.h"

enum { SPOOL_BUFFER = 1 << 20, SPOOL_MAX_RECORD = 1 << 16 };

struct corax_spool {
    size_t size;      /* bytes a record */
    size_t count;     /* records added */
    char *buf;
    size_t cap;       /* records the buffer holds */
    size_t used;      /* records in buf: added and not yet written out, or read in */
    size_t next;      /* reading: the next record of buf to give */
    size_t read;      /* reading: records read from the file so far */
    int fd;           /* the file; -1 while every record is in buf */
    int reading;
    char *beside;     /* the output whose folder takes the file, or NULL */
    const char *what; /* what the records are, for messages */
    char where[256];  /* the folder of the file (or of the last try) */
    corax_status st;  /* the first failure, and what it was */
    corax_error err;
};

const char *corax_temp_folder(void)
{
    const char *tmp = getenv("TMPDIR");
    return tmp && *tmp ? tmp : "/tmp";
}

int corax_temp_file(const char *folder)
{
    size_t n = strlen(folder) + 32;
    char *path = malloc(n);
    if (!path) {
        errno = ENOMEM;
        return -1;
    }
    snprintf(path, n, "%s/.corax-spool-XXXXXX", folder);
    int fd = CORAX_MAY_WRITE(path) != 0 || CORAX_FAILS() ? -1 : mkstemp(path);
    if (fd >= 0) {
        unlink(path); /* gone when closed, however the run ends */
        fcntl(fd, F_SETFD, FD_CLOEXEC);
    }
    free(path);
    return fd;
}

corax_spool *corax_spool_new(size_t size, const char *beside, const char *what)
{
    if (size == 0 || size > SPOOL_MAX_RECORD)
        return NULL;
    corax_spool *s = calloc(1, sizeof *s);
    if (!s)
        return NULL;
    s->size = size;
    s->cap = SPOOL_BUFFER / size ? SPOOL_BUFFER / size : 1;
    s->fd = -1;
    s->what = what ? what : "records";
    s->buf = malloc(s->cap * size);
    if (beside && corax_path_replaceable(beside) && !(s->beside = strdup(beside))) {
        free(s->buf);
        s->buf = NULL;
    }
    if (!s->buf) {
        free(s);
        return NULL;
    }
    corax_error_clear(&s->err);
    return s;
}

void corax_spool_free(corax_spool *s)
{
    if (!s)
        return;
    if (s->fd >= 0)
        close(s->fd);
    free(s->buf);
    free(s->beside);
    free(s);
}

/* Keep the first failure: what could not be done to the file, and why. */
static void fail(corax_spool *s, const char *verb, int e)
{
    if (s->st != CORAX_OK)
        return;
    s->st = CORAX_EIO;
    corax_error_set(&s->err, CORAX_EIO, NULL, 0, "cannot %s a temporary file in %s for %s: %s",
                    verb, s->where, s->what, strerror(e));
}

/* Try to make the file in a folder. */
static void make_in(corax_spool *s, const char *folder)
{
    snprintf(s->where, sizeof s->where, "%s", folder);
    s->fd = corax_temp_file(folder);
}

/* The file, made in the output's folder, or else in the temporary folder. */
static int make_file(corax_spool *s)
{
    char *slash = s->beside ? strrchr(s->beside, '/') : NULL;
    if (s->beside && !slash) {
        make_in(s, ".");
    } else if (slash == s->beside && slash) {
        make_in(s, "/");
    } else if (slash) {
        *slash = '\0'; /* the folder alone, for a moment */
        make_in(s, s->beside);
        *slash = '/';
    }
    if (s->fd < 0)
        make_in(s, corax_temp_folder());
    if (s->fd < 0)
        fail(s, "make", errno);
    return s->fd >= 0;
}

/* Write the buffer's records to the end of the file. */
static void write_out(corax_spool *s)
{
    const char *p = s->buf;
    size_t n = s->used * s->size;
    while (n && s->st == CORAX_OK) {
        ssize_t k = CORAX_FAILS() ? -1 : write(s->fd, p, n);
        if (k < 0 && errno != EINTR)
            fail(s, "write", errno);
        else if (k == 0)
            fail(s, "write", EIO); /* nothing taken: as good as refused */
        else if (k > 0) {
            p += k;
            n -= (size_t)k;
        }
    }
    s->used = 0;
}

corax_status corax_spool_add(corax_spool *s, const void *record, corax_error *err)
{
    if (s->reading)
        return corax_error_set(err, CORAX_EARG, NULL, 0, "spool: a record added after reading");
    if (s->used == s->cap && s->st == CORAX_OK && (s->fd >= 0 || make_file(s)))
        write_out(s);
    if (s->st != CORAX_OK)
        return corax_spool_status(s, err);
    memcpy(s->buf + s->used * s->size, record, s->size);
    s->used++;
    s->count++;
    return CORAX_OK;
}

size_t corax_spool_count(const corax_spool *s) { return s->count; }

void corax_spool_rewind(corax_spool *s)
{
    if (!s->reading && s->fd >= 0)
        write_out(s);
    s->reading = 1;
    s->next = 0;
    if (s->fd >= 0) { /* the buffer now holds what was read last */
        s->used = 0;
        s->read = 0;
    }
}

/* Read the next buffer's worth of records from the file. */
static void read_in(corax_spool *s)
{
    size_t n = s->count - s->read < s->cap ? s->count - s->read : s->cap;
    size_t want = n * s->size, got = 0;
    off_t at = (off_t)(s->read * s->size);
    while (got < want && s->st == CORAX_OK) {
        ssize_t k = pread(s->fd, s->buf + got, want - got, at + (off_t)got);
        if (k < 0 && errno != EINTR)
            fail(s, "read back", errno);
        else if (k == 0)
            fail(s, "read back", EIO); /* shorter than written */
        else if (k > 0)
            got += (size_t)k;
    }
    s->used = s->st == CORAX_OK ? n : 0;
    s->read += s->used;
    s->next = 0;
}

const void *corax_spool_next(corax_spool *s)
{
    if (!s->reading || s->st != CORAX_OK)
        return NULL;
    if (s->next == s->used && s->fd >= 0 && s->read < s->count)
        read_in(s);
    if (s->next == s->used)
        return NULL;
    return s->buf + s->size * s->next++;
}

corax_status corax_spool_status(const corax_spool *s, corax_error *err)
{
    if (s->st != CORAX_OK && err)
        *err = s->err;
    return s->st;
}
