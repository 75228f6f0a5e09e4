/* cli: `corax solve`, planes from alpha-only readings of one feature in
 * several holes: the set's candidates ranked, with their misfit and, by
 * Monte Carlo, their cones; every reading's place and residual on request. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "cli/cli.h"

static const char solve_help[] =
    "usage: corax solve --collars FILE --surveys FILE [options] [-o FILE] READINGS...\n"
    "\n"
    "Solve planes from alpha alone. READINGS are tables (CSV, or - for standard\n"
    "input) with hole, depth, alpha and set columns (optional alpha_error,\n"
    "depth_error); the readings of one set are taken to be parallel planes (a\n"
    "marker bed, a vein set). Each reading puts the plane's normal on a cone\n"
    "about its hole (90 - alpha from the core axis); the plane is where the\n"
    "cones of two or more holes meet.\n"
    "\n"
    "Output, one row per set and candidate, best first: set, candidate, dip,\n"
    "dip_direction, holes, readings, misfit (RMS angle of the readings' cones\n"
    "from the plane's normal), cone95 (half-angle holding 95% of the Monte\n"
    "Carlo solutions), status, note.\n"
    "\n"
    "  --parallel-limit DEG      holes whose axes all lie within this of one another\n"
    "                            are too near parallel to solve (default 15)\n"
    "  --residuals FILE          every reading, in order: its columns, hole_azimuth,\n"
    "                            hole_plunge, residual (from candidate 1), status, note\n"
    "  --svg FILE                a stereonet: every reading's small circle and the\n"
    "                            solved poles with their cones\n"
    "  --draw-sets LIST          only these sets on the stereonet (comma-separated)\n"
    "  --title TEXT              the stereonet's title\n"
    "Uncertainty (Monte Carlo; 1-sigma errors in degrees, depth in metres):\n"
    "  --draws N                 draws per set (default 1000; 0: no cone95)\n"
    "  --seed S                  the generator's seed (default 1)\n"
    "  --alpha-error DEG         alpha reading (default 2); candidates whose fit is\n"
    "                            as good within this error are all given\n"
    "  --depth-error M           depth of a reading (default 0.05)\n"
    "  --azimuth-error DEG, --dip-error DEG   survey, each station (1, 0.5)\n"
    "  --azimuth-error-per-hole DEG, --dip-error-per-hole DEG   shared by a hole\n"
    "                            (0.5, 0.25)\n"
    "\n"
    "Status: solved; ambiguous (several planes fit as well: each is a row);\n"
    "parallel-holes; one-hole; one-reading; no-readings (the note says why).\n"
    "A reading that cannot be used is named on standard error and left out.\n"
    "\n";

enum { OPT_PARALLEL_LIMIT = OPT_COMMAND_BASE, OPT_RESIDUALS, OPT_SVG, OPT_DRAW_SETS, OPT_TITLE };

typedef struct solve_opts {
    cli_common c;
    corax_solve_job_options j;
    cli_files inputs;
} solve_opts;

static int solve_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    solve_opts *o = ctx;
    int k = cli_uncertainty_option(&o->j.errors, &o->j.draws, &o->j.seed, 0, opt, arg, why, wl);
    if (k)
        return k < 0 ? -1 : 0;
    double v;
    switch (opt) {
    case OPT_PARALLEL_LIMIT:
        if (cli_value_number(arg, 0, 90, &v, why, wl))
            return -1;
        o->j.solve.parallel_limit = corax_rad(v);
        return 0;
    case OPT_RESIDUALS: o->j.residuals = arg; return 0;
    case OPT_SVG: o->j.svg = arg; return 0;
    case OPT_DRAW_SETS: o->j.draw_sets = arg; return 0;
    case OPT_TITLE: o->j.title = arg; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, solve_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        CLI_UNCERTAINTY_OPTIONS,
        {"parallel-limit", required_argument, NULL, OPT_PARALLEL_LIMIT},
        {"residuals", required_argument, NULL, OPT_RESIDUALS},
        {"svg", required_argument, NULL, OPT_SVG},
        {"draw-sets", required_argument, NULL, OPT_DRAW_SETS},
        {"title", required_argument, NULL, OPT_TITLE},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, solve_help, 1, solve_option, o);
    if (rc != 0)
        return rc;
    if (cli_files_from_args(&o->inputs, &o->c, argc, argv))
        return EXIT_DATA;
    if (o->inputs.n == 0)
        return cli_usage("solve", "no READINGS table (hole, depth, alpha, set; or - for "
                                  "standard input)");
    if (cli_files_stdin_once(&o->inputs, "solve"))
        return EXIT_USAGE;
    for (size_t i = 0; i < o->inputs.n; i++)
        cli_input(&o->c, "a readings table", o->inputs.path[i]);
    cli_output(&o->c, "--residuals", o->j.residuals);
    cli_output(&o->c, "--svg", o->j.svg);
    return cli_common_finish(&o->c, 1);
}

/* The sets by status, on standard error: "corax: 2 sets: 1 solved, 1
 * ambiguous; 1 of 9 readings left out". */
static void summary(const corax_solve_job_summary *sum)
{
    fprintf(stderr, "corax: %zu set%s%s", sum->sets, sum->sets == 1 ? "" : "s",
            sum->sets ? ":" : "");
    int first = 1;
    for (int s = 0; s <= CORAX_SOLVE_NO_READINGS; s++)
        if (sum->count[s]) {
            fprintf(stderr, "%s %zu %s", first ? "" : ",", sum->count[s],
                    corax_solve_status_name((corax_solve_status)s));
            first = 0;
        }
    if (sum->left_out)
        fprintf(stderr, "; %zu of %zu readings left out", sum->left_out, sum->readings);
    fputc('\n', stderr);
}

int cmd_solve(int argc, char **argv)
{
    solve_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "solve");
    o.j = corax_solve_job_options_default();
    int rc;
    corax_program *prog;
    if (!cli_begin(&o.c, parse(argc, argv, &o), 1, &prog, &rc)) {
        cli_files_free(&o.inputs);
        return rc;
    }
    o.j.readings = cli_table_settings(&o.c, CLI_STRUCTURES);
    corax_solve_job_summary sum;
    corax_record *record = corax_record_new();
    o.c.job.record = record;
    rc = cli_status(corax_solve_job_run(&o.c.job, prog, &o.j, o.inputs.path, o.inputs.n,
                                        o.c.output, &sum));
    o.c.job.record = NULL;
    if (rc == EXIT_OK && cli_about_job("solve", &o.c, record) != 0)
        rc = EXIT_DATA;
    if (rc == EXIT_OK && !o.c.quiet)
        summary(&sum);
    corax_record_free(record);
    corax_program_free(prog);
    cli_files_free(&o.inputs);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc;
}
