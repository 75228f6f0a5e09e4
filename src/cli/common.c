/* cli: options shared by the commands, messages, and the side file that
 * records what a run assumed. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "cli/cli.h"

const char cli_common_help[] =
    "Drill program:\n"
    "  --collars FILE        collar table: hole, x, y, z; optional azimuth, dip, length\n"
    "  --surveys FILE        survey table: hole, depth, azimuth, dip\n"
    "  --columns MAP         header names for corax's columns, e.g.\n"
    "                        hole=HOLE_NO,depth=DEPTH_M (names match without case)\n"
    "  --dip-convention C    negative-down (default: -60 is a downward hole),\n"
    "                        positive-down, or from-vertical (0 = straight down)\n"
    "  --declination DEG     magnetic declination, east positive; added to survey\n"
    "                        azimuths (magnetic to true). Default 0\n"
    "  --convergence DEG     grid convergence or local grid rotation, positive when\n"
    "                        grid north is east of true north; subtracted from\n"
    "                        survey azimuths (true to grid). Default 0\n"
    "  --delimiter ,|;       field separator of the input tables (default ,)\n"
    "  --decimal-comma       numbers use a decimal comma (needs --delimiter ';')\n"
    "  --decimal-mark M      point (default) or comma; same as --decimal-comma\n"
    "  -p, --project FILE    read inputs, columns and conventions from a project file\n"
    "                        (INI); options on the command line override it\n"
    "Output:\n"
    "  -o, --output FILE     output file (default: standard output)\n"
    "  --about FILE          record of the run's assumptions (default: OUTPUT.about\n"
    "                        when -o names a file)\n"
    "  -q, --quiet           no progress or warnings on standard error\n"
    "  -h, --help            this help\n";

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
    cli_error(err->file, err->line, "%s", err->message[0] ? err->message : corax_strerror(st));
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

corax_program *cli_load_program(cli_common *c)
{
    corax_program *prog = NULL;
    corax_findings problems = {0};
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_program_load(c->collars, c->surveys, &c->load, &prog, &problems, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        corax_findings_clear(&problems);
        return NULL;
    }
    size_t errors = corax_findings_count(&problems, CORAX_ERROR), shown = 0;
    for (size_t i = 0; i < problems.count; i++) {
        const corax_finding *f = &problems.item[i];
        if (f->severity < CORAX_ERROR && (c->quiet || errors))
            continue;
        if (shown++ == 50) {
            cli_error(NULL, 0, "... and more problems; fix these first");
            break;
        }
        cli_finding(f);
    }
    corax_findings_clear(&problems);
    if (errors) {
        cli_error(NULL, 0, "%zu problem%s in the collar and survey tables; nothing written",
                  errors, errors == 1 ? "" : "s");
        corax_program_free(prog);
        return NULL;
    }
    return prog;
}

int cli_begin(cli_common *c, int parsed, int want_program, corax_program **prog, int *status)
{
    *prog = NULL;
    *status = parsed < 0 ? EXIT_OK : parsed;
    if (parsed == 0 && (!want_program || (*prog = cli_load_program(c)) != NULL))
        return 1;
    if (parsed == 0)
        *status = EXIT_DATA;
    cli_common_free(c);
    return 0;
}

/* ---- the side file ---- */

struct cli_about {
    char *text;
    size_t len, cap;
};

static void about_add(cli_about *a, const char *s)
{
    size_t n = strlen(s);
    if (!a)
        return;
    if (a->len + n + 1 > a->cap) {
        size_t cap = a->cap ? a->cap : 1024;
        while (cap < a->len + n + 1)
            cap *= 2;
        char *t = realloc(a->text, cap);
        if (!t)
            return;
        a->text = t;
        a->cap = cap;
    }
    memcpy(a->text + a->len, s, n + 1);
    a->len += n;
}

void cli_about_section(cli_about *a, const char *section)
{
    about_add(a, "\n[");
    about_add(a, section);
    about_add(a, "]\n");
}

void cli_about_set(cli_about *a, const char *key, const char *fmt, ...)
{
    char value[1024];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(value, sizeof value, fmt, ap);
    va_end(ap);
    about_add(a, key);
    about_add(a, " = ");
    about_add(a, value);
    about_add(a, "\n");
}

cli_about *cli_about_new(const char *command, const cli_common *c)
{
    cli_about *a = calloc(1, sizeof *a);
    about_add(a, "; What this corax run assumed. Keep it with the output it describes.\n");
    cli_about_section(a, "run");
    cli_about_set(a, "command", "%s", command);
    cli_about_set(a, "corax_version", "%s", CORAX_VERSION);
    char when[64];
    time_t now = time(NULL);
    struct tm tm;
    strftime(when, sizeof when, "%Y-%m-%dT%H:%M:%SZ", gmtime_r(&now, &tm));
    cli_about_set(a, "time", "%s", when);
    cli_about_set(a, "output", "%s", strcmp(c->output, "-") ? c->output : "standard output");
    cli_about_section(a, "inputs");
    if (c->collars)
        cli_about_set(a, "collars", "%s", c->collars);
    if (c->surveys)
        cli_about_set(a, "surveys", "%s", c->surveys);
    cli_about_set(a, "delimiter", "%s", c->load.format.delimiter == ';' ? "semicolon" : "comma");
    cli_about_set(a, "decimal_mark", "%s", c->load.format.decimal == ',' ? "comma" : "point");
    cli_about_section(a, "survey");
    cli_about_set(a, "dip_convention", "%s", cli_dip_convention_name(c->load.dip_convention));
    if (!c->collars && !c->surveys) /* a command that reads no surveys: no desurvey either */
        return a;
    cli_about_set(a, "declination", "%g", c->load.declination);
    cli_about_set(a, "convergence", "%g", c->load.convergence);
    cli_about_set(a, "azimuth_correction", "%g (added to every survey azimuth; collar "
                  "azimuths are taken as given)", c->load.declination - c->load.convergence);
    cli_about_set(a, "desurvey", "minimum curvature; straight from the collar above the first "
                  "station; straight on along the last tangent below the last station");
    return a;
}

int cli_about_commit(cli_about *a, const cli_common *c)
{
    if (!a)
        return -1;
    int rc = 0;
    char *path = NULL;
    if (c->about) {
        path = strdup(c->about);
    } else if (strcmp(c->output, "-") != 0) {
        size_t n = strlen(c->output) + 8;
        if ((path = malloc(n)))
            snprintf(path, n, "%s.about", c->output);
    }
    if (path) {
        corax_writer *w;
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_writer_open(path, &w, &err);
        if (st == CORAX_OK) {
            corax_writer_text(w, a->text, a->len);
            st = corax_writer_commit(w, &err);
        }
        if (st != CORAX_OK) {
            cli_error_record(&err, st);
            rc = -1;
        }
    }
    free(path);
    free(a->text);
    free(a);
    return rc;
}

corax_table *cli_table_keep(const cli_common *c, const char *path, corax_table ***tables, size_t *n)
{
    corax_table *t;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_table_load(path, c->load.format, &t, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return NULL;
    }
    corax_table **tt = realloc(*tables, (*n + 1) * sizeof *tt);
    if (!tt) {
        corax_table_free(t);
        cli_error(NULL, 0, "out of memory");
        return NULL;
    }
    *tables = tt;
    tt[(*n)++] = t;
    return t;
}
