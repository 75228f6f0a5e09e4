/* cli: the side file that records what a run assumed: the run, the tables
 * it read, the survey's settings, then what the command's job recorded. */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "cli/cli.h"

static const char *delimiter_word(char d)
{
    return d == ';' ? "semicolon" : d == '\t' ? "tab" : "comma";
}

/* One input table: where it came from and how it was read. */
static void about_table(cli_about *a, const corax_table_read *r)
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
    corax_record_set(a, corax_table_role_name(r->role),
                     "%s (delimiter %s%s; decimal mark %s%s; %s%s)", r->path,
                     delimiter_word(f->format.delimiter), f->delimiter_detected ? ", found" : "",
                     decimal, f->decimal_detected ? ", found" : "",
                     r->unit == 1.0 ? "metres" : "feet", skipped);
}

cli_about *cli_about_new(const char *command, const cli_common *c)
{
    cli_about *a = corax_record_new();
    corax_record_line(a, "; What this corax run assumed. Keep it with the output it describes.");
    corax_record_section(a, "run");
    corax_record_set(a, "command", "%s", command);
    corax_record_set(a, "corax_version", "%s", CORAX_VERSION);
    char when[64];
    time_t now = time(NULL);
    struct tm tm;
    strftime(when, sizeof when, "%Y-%m-%dT%H:%M:%SZ", gmtime_r(&now, &tm));
    corax_record_set(a, "time", "%s", when);
    corax_record_set(a, "output", "%s", strcmp(c->output, "-") ? c->output : "standard output");
    corax_record_set(a, "output_format", "delimiter %s; decimal mark %s; lengths in metres",
                     delimiter_word(c->output_format.delimiter),
                     c->output_format.decimal == ',' ? "comma" : "point");
    corax_record_section(a, "inputs");
    for (size_t i = 0; i < c->job.nread; i++)
        about_table(a, &c->job.read[i]);
    if (!c->collars && !c->surveys) /* a command that reads no surveys: no desurvey either */
        return a;
    corax_record_section(a, "survey");
    corax_record_set(a, "collars_dip_convention", "%s",
                     corax_dip_convention_name(c->load.collar_dip));
    corax_record_set(a, "surveys_dip_convention", "%s",
                     corax_dip_convention_name(c->load.survey_dip));
    cli_corrections_about(a, c);
    corax_record_set(a, "desurvey", "minimum curvature; %s above the first "
                     "station; straight on along the last tangent below the last station",
                     c->load.collar_station ? "curving from the collar's set-up (a station at 0 m)"
                                            : "straight from the collar");
    for (size_t i = 0; i < c->nreject; i++)
        corax_record_set(a, "rejected_station", "%s at %g", c->reject[i].hole,
                         c->reject[i].depth);
    return a;
}

void cli_about_discard(cli_about *a) { corax_record_free(a); }

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
            size_t len;
            const char *text = corax_record_text(a, &len);
            corax_writer_text(w, text, len);
            st = corax_writer_commit(w, &err);
        }
        if (st != CORAX_OK) {
            cli_error_record(&err, st);
            rc = -1;
        }
    }
    corax_record_free(a);
    return rc;
}

int cli_about_job(const char *command, const cli_common *c, const corax_record *job)
{
    cli_about *a = cli_about_new(command, c);
    corax_record_append(a, job);
    return cli_about_commit(a, c);
}
