/* io: where output files go. A regular file is written under a temporary name
 * in its own folder and renamed over its target only when whole, keeping the
 * target's mode and writing through a symlink to the file it names; a
 * device, a pipe or standard output is written straight, and its write
 * errors (a full disk) are reported. The files of one run can be held and
 * made public together, and their temporaries removed when the run is
 * stopped by a signal. */
#define _XOPEN_SOURCE 700 /* realpath */
#include <errno.h>
#include <fcntl.h>
#include <limits.h>
#include <signal.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <dirent.h>
#include <sys/stat.h>
#include <unistd.h>

#include "io/fuzz.h"
#include "io/outputs.h"

enum { MAX_FILES = 64 }; /* files of one run: a few in practice */

typedef struct held {
    char *path, *final, *tmp;
    int folder; /* tmp is a private folder whose files go beside final */
    /* while publishing: the file final names (a symlink's target), a second
     * name (a hard link) for what stood there, or NULL, and whether something
     * stood there */
    char *target, *old;
    int existed;
} held;

struct corax_outputs {
    /* every temporary alive, for the signal handler: it reads only these
     * pointers and the count, and calls only unlink */
    char *temp[MAX_FILES];
    volatile sig_atomic_t ntemp;
    held pending[MAX_FILES]; /* closed, waiting to be published */
    size_t npending;
};

corax_outputs *corax_outputs_new(void) { return calloc(1, sizeof(corax_outputs)); }

static void forget_temp(corax_outputs *set, const char *tmp)
{
    if (!set || !tmp)
        return;
    for (sig_atomic_t i = 0; i < set->ntemp; i++)
        if (set->temp[i] == tmp) {
            set->temp[i] = set->temp[set->ntemp - 1];
            set->ntemp--;
            return;
        }
}

static void free_held(held *h)
{
    free(h->path);
    free(h->final);
    free(h->tmp);
    free(h->target);
    free(h->old);
}

static int is_folder(const char *path)
{
    struct stat st;
    return stat(path, &st) == 0 && S_ISDIR(st.st_mode);
}

/* Remove a file, or a folder with what it holds (only ever a private folder
 * of corax's own making). */
static void remove_tree(const char *path)
{
    struct stat st;
    if (lstat(path, &st) != 0)
        return;
    if (!S_ISDIR(st.st_mode)) {
        unlink(path);
        return;
    }
    DIR *d = opendir(path);
    struct dirent *e;
    while (d && (e = readdir(d)) != NULL) {
        if (strcmp(e->d_name, ".") == 0 || strcmp(e->d_name, "..") == 0)
            continue;
        char child[PATH_MAX];
        if ((size_t)snprintf(child, sizeof child, "%s/%s", path, e->d_name) < sizeof child)
            remove_tree(child);
    }
    if (d)
        closedir(d);
    rmdir(path);
}

/* The last name of a path. */
static const char *last_name(const char *path)
{
    const char *slash = strrchr(path, '/');
    return slash ? slash + 1 : path;
}

/* Move everything in a private folder into place: the file named `name`
 * (the target's last name, as the library that wrote it was given it) to
 * final, with the given mode (-1: as it was written); any side files beside
 * final. */
static int move_folder(const char *folder, const char *name, const char *final, long mode)
{
    size_t dirlen = (size_t)(last_name(final) - final);
    DIR *d = opendir(folder);
    if (!d)
        return errno;
    int failed = 0;
    struct dirent *e;
    while (!failed && (e = readdir(d)) != NULL) {
        if (strcmp(e->d_name, ".") == 0 || strcmp(e->d_name, "..") == 0)
            continue;
        char src[PATH_MAX], dst[PATH_MAX];
        int own = strcmp(e->d_name, name) == 0;
        if ((size_t)snprintf(src, sizeof src, "%s/%s", folder, e->d_name) >= sizeof src ||
            (size_t)snprintf(dst, sizeof dst, "%.*s%s", (int)dirlen, final,
                             own ? final + dirlen : e->d_name) >= sizeof dst)
            failed = ENAMETOOLONG;
        else if (own && mode >= 0 && (CORAX_FAILS() || chmod(src, (mode_t)mode) != 0))
            failed = errno; /* the target's mode stays */
        else if (CORAX_FAILS() || rename(src, dst) != 0)
            failed = errno;
    }
    closedir(d);
    return failed;
}

/* A device, a pipe, standard output: no file a library writes whole can be
 * renamed over it. */
static corax_status refuse_stream(const char *path, corax_error *err)
{
    return corax_error_set(err, CORAX_EIO, path, 0,
                           "cannot write: this output is made whole and then put in place, "
                           "which a device, a pipe or standard output cannot take: give a "
                           "file name");
}

corax_status corax_outputs_folder(corax_outputs *set, const char *path, char **folder,
                                  corax_error *err)
{
    *folder = NULL;
    if (CORAX_MAY_WRITE(path) != 0)
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot write: %s", strerror(errno));
    if (!corax_path_replaceable(path) && !is_folder(path))
        return refuse_stream(path, err);
    const char *slash = strrchr(path, '/');
    size_t dirlen = slash ? (size_t)(slash - path + 1) : 0;
    size_t n = strlen(path) + 16;
    char *d = malloc(n);
    if (!d)
        return CORAX_ENOMEM;
    snprintf(d, n, "%.*s.%s.XXXXXX", (int)dirlen, path, path + dirlen);
    if (CORAX_FAILS() || !mkdtemp(d)) {
        int e = errno;
        free(d);
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot write: %s", strerror(e));
    }
    if (set && set->npending < MAX_FILES) {
        held *h = &set->pending[set->npending];
        h->path = strdup(path);
        h->final = strdup(path);
        h->tmp = strdup(d);
        h->folder = 1;
        if (!h->path || !h->final || !h->tmp) {
            free_held(h);
            remove_tree(d);
            free(d);
            return CORAX_ENOMEM;
        }
        set->npending++;
    }
    *folder = d;
    return CORAX_OK;
}

void corax_outputs_drop_folder(corax_outputs *set, const char *folder)
{
    for (size_t i = 0; set && i < set->npending; i++)
        if (set->pending[i].folder && strcmp(set->pending[i].tmp, folder) == 0) {
            free_held(&set->pending[i]);
            set->pending[i] = set->pending[--set->npending];
            break;
        }
    remove_tree(folder);
}

corax_status corax_outputs_place_folder(const char *folder, const char *path, corax_error *err)
{
    /* through a symlink to the file it names, keeping that file's mode */
    struct stat st;
    char resolved[PATH_MAX];
    int exists = stat(path, &st) == 0 && realpath(path, resolved);
    if (exists && !S_ISREG(st.st_mode) && !S_ISDIR(st.st_mode)) {
        remove_tree(folder);
        return refuse_stream(path, err);
    }
    int failed = move_folder(folder, last_name(path), exists ? resolved : path,
                             exists && S_ISREG(st.st_mode) ? (long)(st.st_mode & 07777) : -1);
    remove_tree(folder);
    if (failed)
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot put it in place: %s",
                               failed == ENOTEMPTY || failed == EEXIST
                                   ? "a folder of that name is there and not empty"
                                   : strerror(failed));
    return CORAX_OK;
}

void corax_outputs_discard(corax_outputs *set)
{
    if (!set)
        return;
    for (size_t i = 0; i < set->npending; i++) {
        forget_temp(set, set->pending[i].tmp);
        remove_tree(set->pending[i].tmp);
        free_held(&set->pending[i]);
    }
    set->npending = 0;
}

void corax_outputs_free(corax_outputs *set)
{
    corax_outputs_discard(set);
    free(set);
}

void corax_outputs_remove_temporaries(const corax_outputs *set)
{
    if (!set)
        return;
    for (sig_atomic_t i = 0; i < set->ntemp; i++)
        if (set->temp[i])
            unlink(set->temp[i]);
    /* a private folder: best effort (reading a folder is not strictly safe in a
     * signal handler, but the process is ending) */
    for (size_t i = 0; i < set->npending; i++)
        if (set->pending[i].folder)
            remove_tree(set->pending[i].tmp);
}

static char *temp_name(const char *final, unsigned tries, const void *salt);

/* Before a held file is made public: where it goes, and a second name (a
 * hard link, in the same folder) for the file it will replace, so that the
 * run can put that file back. Without one (a file system without hard
 * links), a failure later in the run cannot be undone for this file. */
static void keep_old(corax_outputs *set, held *h)
{
    struct stat st;
    char resolved[PATH_MAX];
    h->existed = stat(h->final, &st) == 0;
    h->target = strdup(h->existed && realpath(h->final, resolved) ? resolved : h->final);
    if (!h->target || !h->existed || !S_ISREG(st.st_mode) || set->ntemp == MAX_FILES)
        return;
    for (unsigned tries = 0; tries < 100 && !h->old; tries++) {
        if (!(h->old = temp_name(h->target, tries, h)))
            return;
        if (link(h->target, h->old) != 0) {
            int e = errno;
            free(h->old);
            h->old = NULL;
            if (e != EEXIST)
                return;
        }
    }
    if (h->old)
        set->temp[set->ntemp++] = h->old; /* a signal removes it */
}

/* Undo a file made public: what stood there comes back, or a file that was
 * new goes. */
static void put_back(const held *h)
{
    if (h->old)
        rename(h->old, h->target);
    else if (!h->existed && h->target)
        remove_tree(h->target);
}

corax_status corax_outputs_publish(corax_outputs *set, corax_error *err)
{
    for (size_t i = 0; i < set->npending; i++)
        keep_old(set, &set->pending[i]);
    corax_status st = CORAX_OK;
    size_t i = 0;
    for (; i < set->npending; i++) {
        held *h = &set->pending[i];
        if (h->folder) {
            st = corax_outputs_place_folder(h->tmp, h->final, err);
            if (st != CORAX_OK)
                break;
        } else if (CORAX_FAILS() || rename(h->tmp, h->final) != 0) {
            st = corax_error_set(err, CORAX_EIO, h->path, 0, "cannot write: %s",
                                 strerror(errno));
            break;
        }
    }
    /* all or nothing: a failure puts back every file made public before it */
    for (size_t k = i; st != CORAX_OK && k-- > 0;)
        put_back(&set->pending[k]);
    for (size_t k = 0; k < set->npending; k++) {
        held *h = &set->pending[k];
        if (h->old) {
            unlink(h->old); /* gone already when put back */
            forget_temp(set, h->old);
        }
        if (k < i && st == CORAX_OK) {
            forget_temp(set, h->tmp);
            free_held(h);
        }
    }
    if (st == CORAX_OK)
        set->npending = 0;
    corax_outputs_discard(set); /* the rest, unpublished */
    return st;
}

size_t corax_outputs_pending(const corax_outputs *set) { return set ? set->npending : 0; }

/* ---- one target ---- */

/* A file under /dev or /proc (a device, or a process's descriptor such as
 * /dev/stdout) is never replaced, only written. */
static int system_file(const char *resolved)
{
    return strncmp(resolved, "/dev/", 5) == 0 || strncmp(resolved, "/proc/", 6) == 0;
}

/* The descriptor a path names (/dev/stdout, /dev/stderr, /dev/fd/N,
 * /proc/self/fd/N), or -1. Opening such a path anew would start at its
 * beginning, or replace the file behind it; the descriptor is written as it
 * stands. */
static int descriptor_named(const char *path)
{
    if (strcmp(path, "/dev/stdout") == 0)
        return STDOUT_FILENO;
    if (strcmp(path, "/dev/stderr") == 0)
        return STDERR_FILENO;
    const char *digits = strncmp(path, "/dev/fd/", 8) == 0          ? path + 8
                         : strncmp(path, "/proc/self/fd/", 14) == 0 ? path + 14
                                                                     : NULL;
    if (!digits || !*digits)
        return -1;
    char *end;
    long n = strtol(digits, &end, 10);
    return *end || n < 0 || n > INT_MAX ? -1 : (int)n;
}

static char *temp_name(const char *final, unsigned tries, const void *salt)
{
    const char *slash = strrchr(final, '/');
    size_t dirlen = slash ? (size_t)(slash - final + 1) : 0;
    size_t n = strlen(final) + 80;
    char *t = malloc(n);
    if (t)
        snprintf(t, n, "%.*s.%s.%ld.%lx.%u.part", (int)dirlen, final, final + dirlen,
                 (long)getpid(), (unsigned long)(uintptr_t)salt, tries);
    return t;
}

static corax_status fail_open(corax_target *t, const char *path, int e, const char *why,
                              corax_error *err)
{
    free(t->path);
    free(t->final);
    free(t->tmp);
    memset(t, 0, sizeof *t);
    t->fd = -1;
    if (why)
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot write: %s", why);
    return corax_error_set(err, CORAX_EIO, path, 0, "cannot write: %s", strerror(e));
}

corax_status corax_target_open(corax_outputs *set, const char *path, corax_target *t,
                               corax_error *err)
{
    memset(t, 0, sizeof *t);
    t->fd = -1;
    if (!path[0])
        return fail_open(t, path, 0, "the file name is empty", err);
    if (!(t->path = strdup(path)))
        return CORAX_ENOMEM;
    if (CORAX_MAY_WRITE(path) != 0)
        return fail_open(t, path, errno, NULL, err);
    int fd = descriptor_named(path);
    if (fd >= 0) { /* /dev/stdout and the like: the descriptor itself, where it stands */
        t->fd = CORAX_FAILS() ? -1 : dup(fd);
        return t->fd >= 0 ? CORAX_OK : fail_open(t, path, errno, NULL, err);
    }
    struct stat st;
    int exists = stat(path, &st) == 0; /* follows symlinks: the file they name */
    char resolved[PATH_MAX];
    if (exists && !realpath(path, resolved))
        return fail_open(t, path, errno, NULL, err);
    if (exists && S_ISDIR(st.st_mode))
        return fail_open(t, path, 0, "it is a folder", err);
    if (exists && (!S_ISREG(st.st_mode) || system_file(resolved))) {
        /* a device, a pipe, a socket: written straight */
        int flags = O_WRONLY | O_CLOEXEC | O_NOCTTY | (S_ISREG(st.st_mode) ? O_TRUNC : 0);
        t->fd = CORAX_FAILS() ? -1 : open(path, flags);
        return t->fd >= 0 ? CORAX_OK : fail_open(t, path, errno, NULL, err);
    }
    if (set && set->ntemp == MAX_FILES)
        return fail_open(t, path, 0, "too many output files in one run", err);
    if (!(t->final = strdup(exists ? resolved : path)))
        return fail_open(t, path, ENOMEM, NULL, err);
    for (unsigned tries = 0; tries < 100; tries++) {
        free(t->tmp);
        if (!(t->tmp = temp_name(t->final, tries, t)))
            return fail_open(t, path, ENOMEM, NULL, err);
        t->fd = CORAX_FAILS() ? -1
                              : open(t->tmp, O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0666);
        if (t->fd >= 0 || errno != EEXIST)
            break;
    }
    if (t->fd < 0)
        return fail_open(t, path, errno, NULL, err);
    /* the target's mode stays */
    if (exists && (CORAX_FAILS() || fchmod(t->fd, st.st_mode & 07777) != 0)) {
        int e = errno;
        close(t->fd);
        unlink(t->tmp);
        return fail_open(t, path, e, NULL, err);
    }
    if (set)
        set->temp[set->ntemp++] = t->tmp;
    return CORAX_OK;
}

corax_status corax_target_close(corax_outputs *set, corax_target *t, int failed,
                                corax_error *err)
{
    if (t->tmp && !failed && (CORAX_FAILS() || fsync(t->fd) != 0))
        failed = errno;
    if (t->fd >= 0 && t->fd != STDOUT_FILENO && (close(t->fd) != 0 || CORAX_FAILS()) &&
        !failed)
        failed = errno;
    t->fd = -1;
    if (!failed && t->tmp && set) { /* held until the run publishes it */
        if (set->npending == MAX_FILES) {
            failed = EMFILE;
        } else {
            set->pending[set->npending++] =
                (held){.path = t->path, .final = t->final, .tmp = t->tmp};
            memset(t, 0, sizeof *t);
            t->fd = -1;
            return CORAX_OK;
        }
    }
    if (!failed && t->tmp && (CORAX_FAILS() || rename(t->tmp, t->final) != 0))
        failed = errno;
    if (failed && t->tmp)
        unlink(t->tmp);
    forget_temp(set, t->tmp);
    corax_status st = CORAX_OK;
    if (failed) /* the message is made before the path is freed */
        st = corax_error_set(err, CORAX_EIO, t->path ? t->path : "standard output", 0,
                             "cannot write: %s", strerror(failed));
    free(t->path);
    free(t->final);
    free(t->tmp);
    memset(t, 0, sizeof *t);
    t->fd = -1;
    return st;
}

void corax_target_discard(corax_outputs *set, corax_target *t)
{
    if (t->fd >= 0 && t->fd != STDOUT_FILENO)
        close(t->fd);
    if (t->tmp)
        unlink(t->tmp);
    forget_temp(set, t->tmp);
    free(t->path);
    free(t->final);
    free(t->tmp);
    memset(t, 0, sizeof *t);
    t->fd = -1;
}

/* A path's folder, resolved, and its last name: "/real/folder/name". */
static char *canonical(const char *path)
{
    char resolved[PATH_MAX];
    if (realpath(path, resolved))
        return strdup(resolved);
    const char *slash = strrchr(path, '/');
    char dir[PATH_MAX];
    snprintf(dir, sizeof dir, "%.*s", slash ? (int)(slash - path) + (slash == path) : 1,
             slash ? path : ".");
    if (!realpath(dir, resolved))
        return NULL;
    const char *base = slash ? slash + 1 : path;
    size_t n = strlen(resolved) + strlen(base) + 2;
    char *out = malloc(n);
    if (out)
        snprintf(out, n, "%s/%s", strcmp(resolved, "/") ? resolved : "", base);
    return out;
}

int corax_path_same(const char *a, const char *b)
{
    if (strcmp(a, "-") == 0 || strcmp(b, "-") == 0)
        return 0;
    struct stat sa, sb;
    int ea = stat(a, &sa) == 0, eb = stat(b, &sb) == 0;
    if (ea && eb) /* a device may take many writers (/dev/null twice is fine) */
        return sa.st_dev == sb.st_dev && sa.st_ino == sb.st_ino && !S_ISCHR(sa.st_mode);
    if (ea != eb)
        return 0;
    char *ca = canonical(a), *cb = canonical(b); /* neither exists yet */
    int same = ca && cb && strcmp(ca, cb) == 0;
    free(ca);
    free(cb);
    return same;
}

int corax_path_replaceable(const char *path)
{
    if (strcmp(path, "-") == 0 || descriptor_named(path) >= 0 || system_file(path))
        return 0;
    struct stat st;
    char resolved[PATH_MAX];
    if (stat(path, &st) != 0)
        return 1; /* a new file */
    return S_ISREG(st.st_mode) && realpath(path, resolved) && !system_file(resolved);
}

#ifdef CORAX_FUZZ
/* ---- the fuzzing build's hooks (io/fuzz.h) ---- */

static long fail_countdown = -1;
static int fail_errnum, fail_made;
static const char *sandbox;

void corax_fuzz_fail_at(long n, int errnum)
{
    fail_countdown = n;
    fail_errnum = errnum;
    fail_made = 0;
}

int corax_fuzz_failed(void) { return fail_made; }

int corax_fuzz_fails(void)
{
    if (fail_countdown < 0 || fail_countdown-- > 0)
        return 0;
    fail_made = 1;
    errno = fail_errnum;
    return 1;
}

void corax_fuzz_sandbox(const char *folder) { sandbox = folder; }

int corax_fuzz_may_write(const char *path)
{
    static const char *const devices[] = {"-", "/dev/null", "/dev/full", "/dev/stdout"};
    if (!sandbox)
        return 0;
    for (size_t i = 0; i < sizeof devices / sizeof *devices; i++)
        if (strcmp(path, devices[i]) == 0)
            return 0;
    size_t n = strlen(sandbox), len = strlen(path);
    if (strncmp(path, sandbox, n) == 0 && path[n] == '/' && !strstr(path + n, "/../") &&
        !(len >= 3 && strcmp(path + len - 3, "/..") == 0))
        return 0;
    errno = EACCES;
    return -1;
}
#endif
