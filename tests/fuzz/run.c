/* The fuzzing harnesses' shared pieces: a private folder for the files of a
 * run, commands run in-process as main would run them, and the checks every
 * run must pass whatever it was given. */
#define _XOPEN_SOURCE 700 /* realpath */
#include <dirent.h>
#include <errno.h>
#include <fcntl.h>
#include <gsl/gsl_errno.h>
#include <limits.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>
#ifdef CORAX_FUZZ
#include <sanitizer/common_interface_defs.h>
#endif

#include "corax/table.h"
#include "fuzz.h"
#include "io/fuzz.h"

void fuzz_fail(const char *fmt, ...)
{
    char text[2048];
    va_list ap;
    va_start(ap, fmt);
    int n = snprintf(text, sizeof text, "corax fuzz: ");
    vsnprintf(text + n, sizeof text - (size_t)n, fmt, ap);
    va_end(ap);
    fprintf(stderr, "%s\n", text);
#ifdef CORAX_FUZZ
    /* libFuzzer's -close_fd_mask closes standard error: say it where the
     * sanitizers report */
    __sanitizer_report_error_summary(text);
#endif
    abort();
}

size_t fuzz_split(const uint8_t *data, size_t size, fuzz_part *part, size_t max)
{
    size_t n = 0;
    for (size_t i = 0; i < max; i++)
        part[i] = (fuzz_part){data + size, 0};
    while (n < max) {
        const uint8_t *sep = n + 1 < max ? memchr(data, FUZZ_SEPARATOR, size) : NULL;
        size_t len = sep ? (size_t)(sep - data) : size;
        part[n++] = (fuzz_part){data, len};
        if (!sep)
            break;
        data += len + 1;
        size -= len + 1;
    }
    return n;
}

/* ---- the private folder ---- */

static char *dir;

static void remove_tree(const char *path)
{
    struct stat st;
    if (lstat(path, &st) != 0)
        return;
    if (S_ISDIR(st.st_mode)) {
        fuzz_empty(path);
        rmdir(path);
    } else {
        unlink(path);
    }
}

void fuzz_empty(const char *folder)
{
    DIR *d = opendir(folder);
    if (!d)
        return;
    struct dirent *e;
    while ((e = readdir(d)) != NULL) {
        if (strcmp(e->d_name, ".") == 0 || strcmp(e->d_name, "..") == 0)
            continue;
        char child[PATH_MAX];
        snprintf(child, sizeof child, "%s/%s", folder, e->d_name);
        remove_tree(child);
    }
    closedir(d);
}

static void remove_dir(void)
{
    if (dir)
        remove_tree(dir);
}

const char *fuzz_dir(void)
{
    if (dir)
        return dir;
    const char *tmp = getenv("TMPDIR");
    char templ[PATH_MAX];
    snprintf(templ, sizeof templ, "%s/corax-fuzz.XXXXXX", tmp && *tmp ? tmp : "/tmp");
    if (!mkdtemp(templ))
        fuzz_fail("cannot make a folder in %s: %s", tmp ? tmp : "/tmp", strerror(errno));
    char resolved[PATH_MAX];
    if (!realpath(templ, resolved) || !(dir = strdup(resolved)))
        fuzz_fail("cannot resolve %s", templ);
    atexit(remove_dir);
    return dir;
}

const char *fuzz_path(int slot, const char *name)
{
    static char path[8][PATH_MAX];
    snprintf(path[slot & 7], sizeof path[0], "%s/%s", fuzz_dir(), name);
    return path[slot & 7];
}

void fuzz_write(const char *path, const void *data, size_t size)
{
    FILE *f = fopen(path, "wb");
    if (!f || (size && fwrite(data, 1, size, f) != size) || fclose(f) != 0)
        fuzz_fail("cannot write %s", path);
}

int fuzz_holds(const char *path, const void *data, size_t size)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return 0;
    int same = 1;
    char buf[4096];
    size_t at = 0, k;
    while (same && (k = fread(buf, 1, sizeof buf, f)) > 0) {
        same = at + k <= size && memcmp(buf, (const char *)data + at, k) == 0;
        at += k;
    }
    fclose(f);
    return same && at == size;
}

/* ---- running commands ---- */

static int null_fd = -1, full_fd = -1;

void fuzz_setup(void)
{
    if (null_fd >= 0)
        return;
    gsl_set_error_handler_off(); /* as main does */
    null_fd = open("/dev/null", O_RDWR | O_CLOEXEC);
    full_fd = open("/dev/full", O_WRONLY | O_CLOEXEC);
    if (null_fd < 0 || full_fd < 0)
        fuzz_fail("cannot open /dev/null and /dev/full");
    dup2(null_fd, STDIN_FILENO); /* a table named "-" reads nothing, never waits */
    dup2(null_fd, STDOUT_FILENO);
#ifdef CORAX_FUZZ
    corax_fuzz_sandbox(fuzz_dir());
#endif
}

int fuzz_command(int (*run)(int, char **), int argc, char **argv, int full_stdout)
{
    fuzz_setup();
    fflush(stdout);
    if (full_stdout)
        dup2(full_fd, STDOUT_FILENO);
    int rc = run(argc, argv);
    if (fflush(stdout) != 0 && rc == 0) /* as main does */
        rc = 1;
    clearerr(stdout);
    if (full_stdout)
        dup2(null_fd, STDOUT_FILENO);
    return rc;
}

/* ---- command harnesses ---- */

/* Where the main output goes (byte 1 of the input, low three bits). */
enum sink {
    SINK_NEW,      /* a new file */
    SINK_EXISTING, /* over a file of mode 0600 */
    SINK_MISSING,  /* in a folder that does not exist */
    SINK_SYMLINK,  /* through a symlink to a file */
    SINK_NOSPACE,  /* a new file; an output operation fails with ENOSPC */
    SINK_EIO,      /* over a file of mode 0600; one fails with EIO */
    SINK_DEVICE,   /* a symlink to /dev/full */
    SINK_STDOUT    /* "-", with standard output on /dev/full */
};

static const char old_text[] = "old\n";

/* The path of output `name` ("o.csv": the main output). */
static const char *output_path(const char *name, enum sink sink, char *buf, size_t len)
{
    if (name[0] == 'o' && sink == SINK_STDOUT)
        return "-";
    const char *sub = name[0] == 'o' && sink == SINK_MISSING ? "none/" : "";
    snprintf(buf, len, "%s/out/%s%s", fuzz_dir(), sub, name);
    return buf;
}

/* Put in place what the sink needs before the run. */
static void prepare_sink(enum sink sink, const char *path)
{
    char real[PATH_MAX];
    snprintf(real, sizeof real, "%s/out/real", fuzz_dir());
    switch (sink) {
    case SINK_EXISTING:
    case SINK_EIO:
        fuzz_write(path, old_text, sizeof old_text - 1);
        chmod(path, 0600);
        break;
    case SINK_SYMLINK:
        fuzz_write(real, old_text, sizeof old_text - 1);
        chmod(real, 0640);
        if (symlink(real, path) != 0)
            fuzz_fail("cannot make a symlink %s", path);
        break;
    case SINK_DEVICE:
        if (symlink("/dev/full", path) != 0)
            fuzz_fail("cannot make a symlink %s", path);
        break;
    default:
        break;
    }
}

static int mode_is(const char *path, mode_t mode)
{
    struct stat st;
    return stat(path, &st) == 0 && (st.st_mode & 07777) == mode;
}

static int is_symlink_to(const char *path, const char *target)
{
    char buf[PATH_MAX];
    ssize_t n = readlink(path, buf, sizeof buf - 1);
    if (n < 0)
        return 0;
    buf[n] = '\0';
    return strcmp(buf, target) == 0;
}

/* Whether a name is one the harness put in the folder before the run. */
static int planted(const fuzz_cmd *cmd, const char *name)
{
    if (strcmp(name, "out") == 0)
        return 1;
    for (int i = 0; i < FUZZ_FILES; i++)
        if (cmd->file[i] && strcmp(cmd->file[i], name) == 0)
            return 1;
    return 0;
}

/* Remove from the folder whatever a run of cmd does not start with. */
static void clear(const fuzz_cmd *cmd)
{
    DIR *d = opendir(fuzz_dir());
    struct dirent *e;
    while (d && (e = readdir(d)) != NULL)
        if (strcmp(e->d_name, ".") && strcmp(e->d_name, "..") && !planted(cmd, e->d_name))
            remove_tree(fuzz_path(6, e->d_name));
    if (d)
        closedir(d);
    fuzz_empty(fuzz_path(6, "out"));
}

/* Every entry of a folder: no temporary ('.' first) may be left, and after
 * a failed run nothing new may be there. Entries the run made are removed
 * (their count returned). */
static int check_folder(const char *folder, const fuzz_cmd *cmd, enum sink sink, int failed,
                        const char *main_output)
{
    DIR *d = opendir(folder);
    if (!d)
        fuzz_fail("cannot read %s", folder);
    int made = 0, in_out = strcmp(folder, fuzz_dir()) != 0;
    struct dirent *e;
    while ((e = readdir(d)) != NULL) {
        const char *name = e->d_name;
        if (strcmp(name, ".") == 0 || strcmp(name, "..") == 0)
            continue;
        char path[PATH_MAX];
        snprintf(path, sizeof path, "%s/%s", folder, name);
        if (name[0] == '.')
            fuzz_fail("%s: a temporary file or folder is left behind", path);
        int before = in_out ? (strcmp(path, main_output) == 0 && sink != SINK_NEW &&
                               sink != SINK_NOSPACE) ||
                                  (strcmp(name, "real") == 0 && sink == SINK_SYMLINK)
                            : planted(cmd, name);
        if (before)
            continue;
        if (failed)
            fuzz_fail("%s: made public by a run that failed", path);
        made++;
    }
    closedir(d);
    return made;
}

/* No descriptor of the process may still be open on a file of the run. */
static void check_descriptors(void)
{
    DIR *d = opendir("/proc/self/fd");
    if (!d)
        return;
    size_t n = strlen(fuzz_dir());
    struct dirent *e;
    while ((e = readdir(d)) != NULL) {
        char link[PATH_MAX], target[PATH_MAX];
        snprintf(link, sizeof link, "/proc/self/fd/%s", e->d_name);
        ssize_t k = readlink(link, target, sizeof target - 1);
        if (k < 0)
            continue;
        target[k] = '\0';
        if (strncmp(target, fuzz_dir(), n) == 0 && target[n] == '/')
            fuzz_fail("descriptor %s is still open on %s", e->d_name, target);
    }
    closedir(d);
}

/* The data rows of a table as corax reads it (the header not counted), or
 * -1 when it cannot be read whole. */
static long data_rows(const char *path)
{
    corax_reader *r;
    if (corax_reader_open(path, corax_table_format_default(), &r, NULL) != CORAX_OK)
        return -1;
    corax_row row;
    corax_status st;
    long n = -1;
    while ((st = corax_reader_next(r, &row, NULL)) == CORAX_OK)
        n++;
    corax_reader_close(r);
    return st == CORAX_END ? n : -1;
}

/* Every row of the table a line names comes out once for each time it is
 * named (convert, trace --at). */
static void check_rows(const fuzz_cmd *cmd, int variant, const char *main_output)
{
    const char *name = cmd->rows[variant];
    char braced[64];
    snprintf(braced, sizeof braced, "{%s}", name);
    long times = 0;
    for (const char *p = cmd->variant[variant]; (p = strstr(p, braced)) != NULL; p++)
        times++;
    long in = -1;
    for (int i = 0; i < FUZZ_FILES && cmd->file[i]; i++)
        if (strcmp(cmd->file[i], name) == 0)
            in = data_rows(fuzz_path(i, name));
    long out = data_rows(main_output);
    if (in >= 0 && out != in * times)
        fuzz_fail("%ld rows of %s (named %ld times) gave %ld rows", in, name, times, out);
}

/* ---- pictures and pages: well-formed whatever text they show ---- */

static int name_char(char c)
{
    return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') ||
           c == '-' || c == '_' || c == ':' || c == '.';
}

/* A character reference at p ("&amp;", "&#39;", "&#xFFFD;"): its length, 0
 * when it is not one. */
static size_t reference(const char *p, const char *end)
{
    const char *q = p + 1;
    if (q < end && *q == '#') {
        q++;
        int hex = q < end && *q == 'x';
        q += hex;
        const char *d = q;
        while (q < end && ((*q >= '0' && *q <= '9') ||
                           (hex && ((*q >= 'a' && *q <= 'f') || (*q >= 'A' && *q <= 'F')))))
            q++;
        if (q == d)
            return 0;
    } else {
        const char *d = q;
        while (q < end && name_char(*q))
            q++;
        if (q == d)
            return 0;
    }
    return q < end && *q == ';' ? (size_t)(q + 1 - p) : 0;
}

/* Text between tags, or a quoted value (stop at its quote): no '<', every
 * '&' a reference, no control character but tab and line ends, UTF-8. 0
 * with *at past it, or a complaint. */
static const char *markup_text(const char **at, const char *end, char stop)
{
    const unsigned char *p = (const unsigned char *)*at;
    while ((const char *)p < end && *p != (unsigned char)(stop ? stop : '<')) {
        if (*p == '<')
            return "a raw '<' in a value";
        if (*p == '&') {
            size_t k = reference((const char *)p, end);
            if (!k)
                return "a raw '&'";
            p += k;
            continue;
        }
        if ((*p < 0x20 && *p != '\t' && *p != '\n' && *p != '\r') || *p == 0x7f)
            return "a control character";
        size_t n = *p < 0x80 ? 1 : *p >= 0xc2 && *p <= 0xdf ? 2 : *p >= 0xe0 && *p <= 0xef ? 3
                                   : *p >= 0xf0 && *p <= 0xf4 ? 4 : 0;
        if (!n || (const char *)p + n > end)
            return "a byte that is not UTF-8";
        for (size_t k = 1; k < n; k++)
            if ((p[k] & 0xc0) != 0x80)
                return "a byte that is not UTF-8";
        p += n;
    }
    *at = (const char *)p;
    return NULL;
}

/* Whether an SVG picture or an HTML page (corax writes both as XML) is
 * well-formed: tags closed in order, attributes quoted, text escaped; the
 * contents of style and script taken as they are. A complaint, or NULL. */
static const char *markup_fault(const char *p, const char *end)
{
    enum { DEPTH = 256 };
    char open[DEPTH][32];
    int depth = 0;
    while (p < end) {
        const char *why = markup_text(&p, end, 0);
        if (why)
            return why;
        if (p == end)
            break;
        if (strncmp(p, "<!--", 4) == 0 || strncmp(p, "<!", 2) == 0 || strncmp(p, "<?", 2) == 0) {
            const char *close = strncmp(p, "<!--", 4) == 0 ? strstr(p, "-->") : strchr(p, '>');
            if (!close)
                return "a comment or declaration never closed";
            p = close + 1;
            continue;
        }
        int closing = p[1] == '/';
        const char *name = p + 1 + closing, *q = name;
        while (q < end && name_char(*q))
            q++;
        size_t len = (size_t)(q - name);
        if (!len || len >= sizeof open[0])
            return "a '<' that opens no tag";
        while (!closing && q < end && *q != '>' && *q != '/') { /* attributes */
            while (q < end && (*q == ' ' || *q == '\n' || *q == '\t' || *q == '\r'))
                q++;
            if (q < end && (*q == '>' || *q == '/'))
                break;
            const char *a = q;
            while (q < end && name_char(*q))
                q++;
            if (q == a || q + 1 >= end || q[0] != '=' || q[1] != '"')
                return "an attribute without a quoted value";
            q += 2;
            if ((why = markup_text(&q, end, '"')) != NULL)
                return why;
            if (q == end)
                return "an attribute value never closed";
            q++;
        }
        int empty = q < end && *q == '/';
        q += empty;
        if (q >= end || *q != '>')
            return "a tag never closed";
        p = q + 1;
        if (closing) {
            if (depth == 0 || strlen(open[depth - 1]) != len ||
                strncmp(open[depth - 1], name, len) != 0)
                return "a closing tag that closes nothing open";
            depth--;
        } else if (!empty) {
            if (depth == DEPTH)
                return "elements nested too deep";
            snprintf(open[depth++], sizeof open[0], "%.*s", (int)len, name);
            if (strcmp(open[depth - 1], "style") == 0 || strcmp(open[depth - 1], "script") == 0) {
                char tag[16];
                snprintf(tag, sizeof tag, "</%s>", open[depth - 1]);
                const char *close = strstr(p, tag);
                if (!close)
                    return "a style or script never closed";
                p = close;
            }
        }
    }
    return depth ? "an element never closed" : NULL;
}

/* Every picture and page a run made public is well-formed. */
static void check_markup(const char *folder)
{
    DIR *d = opendir(folder);
    struct dirent *e;
    while (d && (e = readdir(d)) != NULL) {
        const char *dot = strrchr(e->d_name, '.');
        if (!dot || (strcmp(dot, ".svg") != 0 && strcmp(dot, ".html") != 0))
            continue;
        char path[PATH_MAX];
        FILE *f = (size_t)snprintf(path, sizeof path, "%s/%s", folder, e->d_name) < sizeof path
                      ? fopen(path, "rb")
                      : NULL;
        if (!f)
            continue;
        size_t cap = 1 << 16, n = 0, k;
        char *text = malloc(cap + 1);
        while (text && (k = fread(text + n, 1, cap - n, f)) > 0)
            if ((n += k) == cap && !(text = realloc(text, (cap *= 2) + 1)))
                break;
        fclose(f);
        if (!text)
            fuzz_fail("out of memory");
        text[n] = '\0'; /* for strstr: a NUL inside is a control character anyway */
        const char *why = memchr(text, '\0', n) ? "a NUL byte" : markup_fault(text, text + n);
        free(text);
        if (why)
            fuzz_fail("%s is not well-formed: %s", path, why);
    }
    if (d)
        closedir(d);
}

/* The argument line, expanded and split at blanks: argv (NULL-ended,
 * strings of their own, which getopt may reorder). */
static int expand(const fuzz_cmd *cmd, const char *line, enum sink sink, char **argv, int max,
                  const char **main_output)
{
    int argc = 0;
    char buf[PATH_MAX];
    for (const char *p = line; *p && argc < max - 1;) {
        while (*p == ' ')
            p++;
        size_t len = strcspn(p, " ");
        if (!len)
            break;
        char word[256];
        snprintf(word, sizeof word, "%.*s", (int)len, p);
        p += len;
        const char *arg = word;
        size_t wl = strlen(word);
        if (word[0] == '{' && word[wl - 1] == '}') {
            word[wl - 1] = '\0';
            const char *name = word + 1;
            arg = NULL;
            for (int i = 0; i < FUZZ_FILES && !arg; i++)
                if (cmd->file[i] && strcmp(cmd->file[i], name) == 0)
                    arg = fuzz_path(i, name);
            if (!arg) {
                arg = output_path(name, sink, buf, sizeof buf);
                if (name[0] == 'o')
                    *main_output = strdup(arg);
            }
        } else if (strncmp(word, "lith={", 6) == 0) { /* a layer name before a file */
            word[wl - 1] = '\0';
            for (int i = 0; i < FUZZ_FILES; i++)
                if (cmd->file[i] && strcmp(cmd->file[i], word + 6) == 0 &&
                    (size_t)snprintf(buf, sizeof buf, "lith=%s", fuzz_path(i, word + 6)) >=
                        sizeof buf)
                    fuzz_fail("a path too long");
            arg = buf;
        }
        if (!(argv[argc++] = strdup(arg)))
            fuzz_fail("out of memory");
    }
    argv[argc] = NULL;
    return argc;
}

void fuzz_run_command(const fuzz_cmd *cmd, const uint8_t *data, size_t size)
{
    if (size < 2)
        return;
    fuzz_setup();
    int nvariants = 0;
    while (nvariants < FUZZ_VARIANTS && cmd->variant[nvariants])
        nvariants++;
    int variant = data[0] % nvariants;
    const char *line = cmd->variant[variant];
    enum sink sink = (enum sink)(data[1] & 7);
    long fail_at = data[1] >> 3;
    size_t nfiles = 0;
    while (nfiles < FUZZ_FILES && cmd->file[nfiles])
        nfiles++;
    fuzz_part part[FUZZ_FILES];
    fuzz_split(data + 2, size - 2, part, nfiles);
    char out[PATH_MAX];
    snprintf(out, sizeof out, "%s/out", fuzz_dir());
    mkdir(out, 0777);
    clear(cmd);
    for (int i = 0; i < FUZZ_FILES; i++)
        if (cmd->file[i])
            fuzz_write(fuzz_path(i, cmd->file[i]), part[i].data, part[i].size);

    char *argv[64];
    const char *main_output = NULL;
    int argc = expand(cmd, line, sink, argv, 64, &main_output);
    if (!main_output)
        fuzz_fail("variant '%s' has no main output", line);
    prepare_sink(sink, main_output);
#ifdef CORAX_FUZZ
    if (sink == SINK_NOSPACE || sink == SINK_EIO)
        corax_fuzz_fail_at(fail_at, sink == SINK_NOSPACE ? ENOSPC : EIO);
#else
    (void)fail_at;
#endif

    int rc = fuzz_command(cmd->run, argc, argv, sink == SINK_STDOUT);

    int fault = 0;
#ifdef CORAX_FUZZ
    fault = corax_fuzz_failed();
    corax_fuzz_fail_at(-1, 0);
#endif
    for (int i = 0; i < argc; i++)
        free(argv[i]);
    if (rc < 0 || rc > 2)
        fuzz_fail("exit status %d", rc);
    if (fault && rc == 0)
        fuzz_fail("an output operation failed, yet the run reports success");
    if ((sink == SINK_DEVICE || sink == SINK_STDOUT) && rc == 0)
        fuzz_fail("writing to /dev/full reported success");
    if (sink == SINK_MISSING && rc == 0)
        fuzz_fail("writing into a missing folder reported success");
    if ((sink == SINK_DEVICE && !is_symlink_to(main_output, "/dev/full")) ||
        (sink == SINK_SYMLINK && !is_symlink_to(main_output, fuzz_path(7, "out/real"))))
        fuzz_fail("the symlink %s was replaced", main_output);
    int existing = sink == SINK_EXISTING || sink == SINK_EIO;
    if (existing && !mode_is(main_output, 0600))
        fuzz_fail("%s lost its mode 0600", main_output);
    if (sink == SINK_SYMLINK && !mode_is(fuzz_path(7, "out/real"), 0640))
        fuzz_fail("the file behind the symlink lost its mode 0640");
    if (rc != 0 && existing && !fuzz_holds(main_output, old_text, 4))
        fuzz_fail("a failed run changed %s", main_output);
    if (rc != 0 && sink == SINK_SYMLINK && !fuzz_holds(fuzz_path(7, "out/real"), old_text, 4))
        fuzz_fail("a failed run changed the file behind the symlink");
    for (int i = 0; i < FUZZ_FILES; i++)
        if (cmd->file[i] && !fuzz_holds(fuzz_path(i, cmd->file[i]), part[i].data, part[i].size))
            fuzz_fail("input %s was changed", cmd->file[i]);
    if (rc == 0 && !fault && cmd->rows[variant] &&
        (sink == SINK_NEW || sink == SINK_EXISTING || sink == SINK_SYMLINK ||
         sink == SINK_NOSPACE || sink == SINK_EIO))
        check_rows(cmd, variant, main_output);
    if (rc == 0)
        check_markup(out);
    check_folder(out, cmd, sink, rc != 0, main_output);
    check_folder(fuzz_dir(), cmd, sink, rc != 0, main_output);
    check_descriptors();
    free((void *)main_output);

    clear(cmd); /* what the run made: gone before the next */
}
