/* cli: messages on standard error: `corax: FILE:LINE: message`, warnings,
 * notes, usage errors, and the messages of library jobs. */
#include <stdarg.h>
#include <stdio.h>

#include "cli/cli.h"

void cli_error(const char *file, long line, const char *fmt, ...)
{
    va_list ap;
    fputs("corax: ", stderr);
    if (file && line > 0)
        fprintf(stderr, "%s:%ld: ", file, line);
    else if (file)
        fprintf(stderr, "%s: ", file);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
}

void cli_error_record(const corax_error *err, corax_status st)
{
    cli_error(err->file[0] ? err->file : NULL, err->line, "%s",
              err->message[0] ? err->message : corax_strerror(st));
}

void cli_finding(const corax_finding *f)
{
    cli_error(f->file, f->line, "%s%s", f->severity == CORAX_WARNING ? "warning: " : "",
              f->message);
}

void cli_note(const cli_common *c, const char *fmt, ...)
{
    va_list ap;
    if (c->quiet)
        return;
    fputs("corax: note: ", stderr);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
}

int cli_usage(const char *command, const char *fmt, ...)
{
    va_list ap;
    fputs("corax: ", stderr);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    if (command)
        fprintf(stderr, "\nTry 'corax %s --help'.\n", command);
    else
        fputs("\nTry 'corax --help'.\n", stderr);
    return EXIT_USAGE;
}

void cli_message(const cli_common *c, const corax_message *m)
{
    if (c->quiet && m->severity != CORAX_ERROR)
        return;
    if (m->usage) {
        cli_usage(c->command, "%s", m->text);
    } else if (m->severity == CORAX_NOTE && !m->check[0]) {
        fputs("corax: note: ", stderr);
        if (m->file && m->line > 0)
            fprintf(stderr, "%s:%ld: ", m->file, m->line);
        else if (m->file)
            fprintf(stderr, "%s: ", m->file);
        fprintf(stderr, "%s\n", m->text);
    } else {
        cli_error(m->file, m->line, "%s%s", m->severity == CORAX_WARNING ? "warning: " : "",
                  m->text);
    }
}

void cli_on_message(void *user, const corax_message *m) { cli_message(user, m); }
