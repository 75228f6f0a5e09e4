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
    "  --collars FILE        collar table: hole, x, y, z; optional azimuth, dip, length,\n"
    "                        date, latitude, longitude\n"
    "  --surveys FILE        survey table: hole, depth, azimuth, dip; optional date,\n"
    "                        reference (magnetic, true, grid), total_field, field_dip\n"
    "  --columns MAP         header names for corax's columns, e.g.\n"
    "                        hole=HOLE_NO,depth=DEPTH_M (names match without case)\n"
    "  --dip-convention C    negative-down (default: -60 is a downward hole),\n"
    "                        positive-down, or from-vertical (0 = straight down)\n"
    "  --declination DEG|model  magnetic declination, east positive; added to\n"
    "                        magnetic survey azimuths (magnetic to true). Default 0.\n"
    "                        model: from the World Magnetic Model at each station's\n"
    "                        date and its collar's place (needs --crs, or latitude\n"
    "                        and longitude columns in the collars)\n"
    "  --convergence DEG|projection  grid convergence, positive when grid north is\n"
    "                        east of true north; subtracted from survey azimuths\n"
    "                        (true to grid). Default 0. projection: from --crs at\n"
    "                        each collar\n"
    "  --crs EPSG:NNNN       the CRS of the collar coordinates (of the CRS side of\n"
    "                        a local grid), any projected CRS PROJ knows\n"
    "  --local-grid x1,y1,E1,N1,x2,y2,E2,N2 | origin=E,N,rotation=DEG,scale=S\n"
    "                        the collars are on a local mine grid: two points known\n"
    "                        on both grids, or its origin in the CRS, its rotation\n"
    "                        (local north clockwise of grid north) and scale; its\n"
    "                        rotation is subtracted from survey azimuths\n"
    "  --survey-date DATE    the date (YYYY-MM-DD) of stations without one: the\n"
    "                        surveys' date column comes first, then the collars'\n"
    "  --magnetic-model M    WMM (default: WMM2015v2, WMM2020, WMM2025 by date),\n"
    "                        WMM2015, WMM2015v2, WMM2020, WMM2025, or a COF file\n"
    "  --survey-reference magnetic|true|grid  the north of survey azimuths without a\n"
    "                        reference column of their own (default magnetic)\n"
    "  --delimiter D         field separator of the input tables: comma, semicolon,\n"
    "                        tab or auto (default: found from each table)\n"
    "  --decimal-mark M      point, comma or auto (default: found from each table)\n"
    "  --decimal-comma       the same as --decimal-mark comma\n"
    "  --units U             metres (default) or feet, for every input table; also\n"
    "                        --collars-units, --surveys-units, --structures-units\n"
    "  --collars-dip-convention C, --surveys-dip-convention C   one table's\n"
    "  --collars-columns MAP, --surveys-columns MAP, --structures-columns MAP\n"
    "                        one table's header names\n"
    "  --collar-station      the collar's set-up is a station at 0 m when the surveys\n"
    "                        start deeper (the hole curves from it)\n"
    "  --reject-station HOLE@DEPTH,...  leave these survey stations out\n"
    "  -p, --project FILE    read inputs, columns and conventions from a project file\n"
    "                        (INI); options on the command line override it\n"
    "Output:\n"
    "  -o, --output FILE     output file (default: standard output)\n"
    "  --about FILE          record of the run's assumptions (default: OUTPUT.about\n"
    "                        when -o names a file)\n"
    "  --output-delimiter D, --output-decimal-mark M   the tables written: comma\n"
    "                        and point (default), or semicolon and comma\n"
    "  -q, --quiet           no notes, warnings or progress on standard error\n"
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
    cli_error(err->file[0] ? err->file : NULL, err->line, "%s",
              err->message[0] ? err->message : corax_strerror(st));
}

void cli_finding(const corax_finding *f)
{
    cli_error(f->file, f->line, "%s%s", f->severity == CORAX_WARNING ? "warning: " : "",
              f->message);
}

void cli_problem(cli_problems *p, const char *file, long line, const char *fmt, ...)
{
    if (p->n++ >= CLI_SHOWN)
        return;
    char text[600];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(text, sizeof text, fmt, ap);
    va_end(ap);
    cli_error(file, line, "%s", text);
}

int cli_problems_end(const cli_problems *p, const char *what)
{
    if (!p->n)
        return EXIT_OK;
    if (p->n > CLI_SHOWN)
        cli_error(NULL, 0, "... and %zu more not shown; fix these first", p->n - CLI_SHOWN);
    cli_error(NULL, 0, "%zu problem%s in %s; nothing written", p->n, p->n == 1 ? "" : "s", what);
    return EXIT_DATA;
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

int cli_load_program_findings(cli_common *c, corax_program **prog, corax_findings *found)
{
    corax_load_info info;
    corax_error err;
    corax_error_clear(&err);
    corax_status st =
        corax_program_load(c->collars, c->surveys, &c->load, prog, found, &info, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    cli_table_done(c, CLI_COLLARS, c->collars, &info.collars);
    cli_table_done(c, CLI_SURVEYS, c->surveys, &info.surveys);
    return EXIT_OK;
}

corax_program *cli_load_program(cli_common *c)
{
    corax_program *prog = NULL;
    corax_findings problems = {0};
    if (cli_load_program_findings(c, &prog, &problems) != EXIT_OK) {
        corax_findings_clear(&problems);
        return NULL;
    }
    size_t errors = corax_findings_count(&problems, CORAX_ERROR);
    cli_problems shown = {0};
    for (size_t i = 0; i < problems.count; i++) {
        const corax_finding *f = &problems.item[i];
        if (f->severity == CORAX_ERROR)
            cli_problem(&shown, f->file, f->line, "%s", f->message);
        else if (!c->quiet && !errors)
            cli_finding(f);
    }
    corax_findings_clear(&problems);
    if (cli_problems_end(&shown, "the collar and survey tables") != EXIT_OK) {
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

static const char *delimiter_word(char d)
{
    return d == ';' ? "semicolon" : d == '\t' ? "tab" : "comma";
}

/* One input table: where it came from and how it was read. */
static void about_table(cli_about *a, const cli_common *c, const cli_table_read *r)
{
    const corax_table_info *f = &r->info;
    char skipped[120] = "";
    if (f->comments || f->blank_rows)
        snprintf(skipped, sizeof skipped, "; skipped %zu comment line%s and %zu blank row%s",
                 f->comments, f->comments == 1 ? "" : "s", f->blank_rows,
                 f->blank_rows == 1 ? "" : "s");
    const char *decimal = f->format.decimal == ','   ? "comma"
                          : f->format.decimal == '.' ? "point"
                                                     : "point or comma";
    cli_about_set(a, cli_table_name(r->id), "%s (delimiter %s%s; decimal mark %s%s; %s%s)",
                  r->path, delimiter_word(f->format.delimiter),
                  f->delimiter_detected ? ", found" : "", decimal,
                  f->decimal_detected ? ", found" : "",
                  cli_table_settings(c, r->id).unit == 1.0 ? "metres" : "feet", skipped);
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
    cli_about_set(a, "output_format", "delimiter %s; decimal mark %s; lengths in metres",
                  delimiter_word(c->output_format.delimiter),
                  c->output_format.decimal == ',' ? "comma" : "point");
    cli_about_section(a, "inputs");
    for (size_t i = 0; c->reads && i < c->reads->n; i++)
        about_table(a, c, &c->reads->item[i]);
    if (!c->collars && !c->surveys) /* a command that reads no surveys: no desurvey either */
        return a;
    cli_about_section(a, "survey");
    cli_about_set(a, "collars_dip_convention", "%s", cli_dip_convention_name(c->load.collar_dip));
    cli_about_set(a, "surveys_dip_convention", "%s", cli_dip_convention_name(c->load.survey_dip));
    cli_corrections_about(a, c);
    cli_about_set(a, "desurvey", "minimum curvature; %s above the first "
                  "station; straight on along the last tangent below the last station",
                  c->load.collar_station ? "curving from the collar's set-up (a station at 0 m)"
                                         : "straight from the collar");
    for (size_t i = 0; i < c->nreject; i++)
        cli_about_set(a, "rejected_station", "%s at %g", c->reject[i].hole, c->reject[i].depth);
    return a;
}

void cli_about_discard(cli_about *a)
{
    if (a)
        free(a->text);
    free(a);
}

int cli_about_commit(cli_about *a, const cli_common *c)
{
    if (!a)
        return -1;
    int rc = 0;
    if (c->about_path) {
        corax_writer *w;
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_writer_open_in(c->outputs, c->about_path, &w, &err);
        if (st == CORAX_OK) {
            corax_writer_text(w, a->text, a->len);
            st = corax_writer_commit(w, &err);
        }
        if (st != CORAX_OK) {
            cli_error_record(&err, st);
            rc = -1;
        }
    }
    free(a->text);
    free(a);
    return rc;
}

corax_table *cli_table_keep(const cli_common *c, cli_table_id id, const char *path,
                            corax_table ***tables, size_t *n)
{
    corax_table *t;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = cli_table_load(c, path, cli_table_settings(c, id).format, &t, &err);
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
    corax_table_info info;
    corax_table_read_info(t, &info);
    cli_table_done(c, id, path, &info);
    return t;
}
