/* cli: `corax trace`, the desurveyed holes: positions and directions at the
 * depths asked for, or down every hole at a step. */
#include <string.h>

#include "cli/cli.h"

static const char trace_help[] =
    "usage: corax trace --collars FILE --surveys FILE [--at FILE | --step METRES]\n"
    "                   [--corrections FILE] [-o FILE]\n"
    "\n"
    "Desurvey every hole by minimum curvature and report where each hole is and\n"
    "which way it points.\n"
    "\n"
    "  --at FILE             a table with hole and depth columns: one output row per\n"
    "                        input row, in order, its columns first and untouched, then\n"
    "                        x, y, z, azimuth, dip, status, note\n"
    "  --step METRES         points every METRES down each hole, plus the collar, every\n"
    "                        station and the end of the hole, with the dogleg severity\n"
    "                        (degrees per 30 m) at stations\n"
    "                        Without --at or --step: the collar, stations and hole end.\n"
    "  --corrections FILE    a companion table, one row per survey station: its date\n"
    "                        and reference, the declination, convergence and local grid\n"
    "                        rotation applied, the total added to the surveyed azimuth,\n"
    "                        the collar's latitude and longitude, and the magnetic\n"
    "                        model's field beside the field the survey measured\n"
    "\n"
    "Status: ok; extrapolated (below the last station); collar-only (no survey: straight\n"
    "along the collar's azimuth and dip); beyond-end (deeper than the hole's length);\n"
    "no-survey (neither stations nor a collar direction); unknown-hole; bad-depth.\n"
    "\n";

typedef struct trace_opts {
    cli_common c;
    const char *at;
    double step;
    const char *corrections; /* the companion table, or NULL */
} trace_opts;

enum { OPT_AT = OPT_COMMAND_BASE, OPT_STEP, OPT_CORRECTIONS };

static int trace_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    trace_opts *o = ctx;
    switch (opt) {
    case OPT_AT: o->at = arg; return 0;
    case OPT_CORRECTIONS: o->corrections = arg; return 0;
    case OPT_STEP: return cli_value_number(arg, 1e-3, 1e5, &o->step, why, wl);
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, trace_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        {"at", required_argument, NULL, OPT_AT},
        {"step", required_argument, NULL, OPT_STEP},
        {"corrections", required_argument, NULL, OPT_CORRECTIONS},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, trace_help, 1, trace_option, o);
    if (rc != 0)
        return rc;
    if (optind < argc)
        return cli_usage("trace", "unexpected argument '%s'", argv[optind]);
    if (o->at && o->step > 0.0)
        return cli_usage("trace", "--at and --step do not go together");
    if (o->corrections && strcmp(o->corrections, "-") == 0 && strcmp(o->c.output, "-") == 0)
        return cli_usage("trace", "the trace and --corrections cannot both go to standard output");
    cli_input(&o->c, "--at", o->at);
    return cli_common_finish(&o->c, 1);
}

int cmd_trace(int argc, char **argv)
{
    trace_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "trace");
    o.c.corr.keep_record = 1; /* --corrections writes it */
    int rc;
    corax_program *prog;
    if (!cli_begin(&o.c, parse(argc, argv, &o), 1, &prog, &rc))
        return rc;
    corax_trace_job_options j = corax_trace_job_options_default();
    j.at = o.at;
    j.depths = cli_table_settings(&o.c, CLI_DEPTHS);
    j.step = o.step;
    j.dip = cli_table_dip(&o.c, CLI_SURVEYS);
    j.output = o.c.output_format;
    j.corrections = o.corrections;
    j.record = &o.c.corr.record;
    corax_record *record = corax_record_new();
    o.c.job.record = record;
    rc = cli_status(corax_trace_job_run(&o.c.job, prog, &j, o.c.output));
    o.c.job.record = NULL;
    if (rc == EXIT_OK && cli_about_job("trace", &o.c, record) != 0)
        rc = EXIT_DATA;
    corax_record_free(record);
    corax_program_free(prog);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc;
}
