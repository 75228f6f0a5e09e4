/* io: project files, read through inih with our own line count so that every
 * message can name its line. */
#include <errno.h>
#include <ini.h>
#include <stdio.h>
#include <string.h>
#include <sys/stat.h>

#include "corax/project.h"

typedef struct ini_state {
    FILE *fp;
    const char *path;
    long line;
    corax_ini_handler handler;
    void *user;
    corax_error *err;
    int stopped;
} ini_state;

/* inih reads line by line through this, so we know the line it is on; it also
 * lets us see section headings, which inih does not report on their own. */
static char *read_line(char *str, int num, void *stream)
{
    ini_state *s = stream;
    char *got = fgets(str, num, s->fp);
    if (!got)
        return NULL;
    s->line++;
    if (!strchr(got, '\n') && !feof(s->fp) && !s->stopped) { /* inih would split it */
        corax_error_set(s->err, CORAX_EFORMAT, s->path, s->line,
                        "the line is longer than %d characters", num - 2);
        s->stopped = 1;
    }
    const char *p = str;
    if (s->line == 1 && strncmp(p, "\xEF\xBB\xBF", 3) == 0)
        p += 3;
    const char *text = p;
    while (*p == ' ' || *p == '\t')
        p++;
    if (p > text && *p && *p != '\n' && *p != '\r' && *p != ';' && *p != '#' && !s->stopped) {
        /* inih would glue it onto the previous value: say so instead */
        corax_error_set(s->err, CORAX_EFORMAT, s->path, s->line,
                        "an indented line would continue the value above it; start each "
                        "key = value, and each [section], at the beginning of its line");
        s->stopped = 1;
    }
    if (*p == '[' && !s->stopped) {
        const char *end = strchr(p, ']');
        if (end) {
            char name[200];
            snprintf(name, sizeof name, "%.*s", (int)(end - p - 1), p + 1);
            if (s->handler(s->user, name, NULL, NULL, s->line, s->err) != 0)
                s->stopped = 1;
        }
    }
    return got;
}

static int on_key(void *user, const char *section, const char *name, const char *value)
{
    ini_state *s = user;
    if (s->stopped)
        return 0;
    if (s->handler(s->user, section, name, value, s->line, s->err) != 0) {
        s->stopped = 1;
        return 0;
    }
    return 1;
}

corax_status corax_ini_read(const char *path, corax_ini_handler handler, void *user,
                            corax_error *err)
{
    ini_state s = {NULL, path, 0, handler, user, err, 0};
    struct stat st;
    if (stat(path, &st) == 0 && S_ISDIR(st.st_mode))
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot open: it is a folder, not a "
                               "project file");
    s.fp = fopen(path, "r");
    if (!s.fp)
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot open: %s", strerror(errno));
    int rc = ini_parse_stream(read_line, &s, on_key, &s);
    fclose(s.fp);
    if (s.stopped) {
        if (err)
            corax_error_file(err, path);
        return CORAX_EFORMAT;
    }
    if (rc > 0)
        return corax_error_set(err, CORAX_EFORMAT, path, rc,
                               "not a [section] heading, a key = value line or a comment");
    if (rc < 0)
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot read the project file");
    return CORAX_OK;
}
