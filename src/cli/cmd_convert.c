/* cli: `corax convert`, core readings to located, true orientations for a
 * whole drill program; or one reading at the core shed. */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "cli/cli.h"

static const char convert_help[] =
    "usage: corax convert --collars FILE --surveys FILE [options] [-o FILE] STRUCTURES...\n"
    "       corax convert --hole-azimuth A --hole-dip D --alpha A --beta B [--gamma G]\n"
    "       corax convert --hole-azimuth A --hole-dip D --plane DIP/DIPDIR | --line TREND/PLUNGE\n"
    "\n"
    "Convert core readings into true orientations at real coordinates.\n"
    "\n"
    "STRUCTURES are core logs (CSV, or - for standard input) with hole and depth,\n"
    "and alpha with beta (planes), gamma (a line on the plane), or line_alpha with\n"
    "line_beta (a line measured on its own). Every other column is carried through.\n"
    "One output row per input row, in order: the input's columns, then x, y, z,\n"
    "hole_azimuth, hole_plunge, dip, dip_direction, strike, pole_trend, pole_plunge,\n"
    "nx, ny, nz (the upward unit normal), trend, plunge (when the log has lines),\n"
    "apparent_dip, apparent_dip_toward (with --section-azimuth), status, note.\n"
    "\n"
    "Extras:\n"
    "  --section-azimuth DEG     add each plane's apparent dip in a vertical section\n"
    "                            of this azimuth, and the azimuth it dips toward\n"
    "  --structures FILE         a core log (as a positional argument; may repeat)\n"
    "Uncertainty (Monte Carlo; 1-sigma errors in degrees, depth in metres):\n"
    "  --draws N                 draw every reading N times; adds dip_sd,\n"
    "                            dip_direction_sd, cone95, kappa, position_sd\n"
    "  --seed S                  the generator's seed (default 1)\n"
    "  --alpha-error DEG         alpha reading (default 2)\n"
    "  --beta-error DEG          beta reading (default 5)\n"
    "  --line-error DEG          the orientation line itself (default 5)\n"
    "  --gravity-error DEG       the marking tool's sense of down (default 1): the\n"
    "                            line's error grows as atan(sin DEG / sin h), h the\n"
    "                            hole's angle from vertical\n"
    "  --depth-error M           depth of a reading (default 0.05)\n"
    "  --azimuth-error DEG       survey azimuth, each station (default 1)\n"
    "  --dip-error DEG           survey dip, each station (default 0.5)\n"
    "  --azimuth-error-per-hole DEG  survey azimuth, shared by a hole (default 0.5)\n"
    "  --dip-error-per-hole DEG  survey dip, shared by a hole (default 0.25)\n"
    "  --confidence-errors MAP   line error for each value of the log's confidence\n"
    "                            column (default good=3,fair=8,poor=20)\n"
    "  --cloud FILE              every draw: hole, depth, draw, dip, dip_direction, x, y, z\n"
    "  A log's own alpha_error, beta_error, line_error, depth_error columns override\n"
    "  the errors row by row.\n"
    "Runs without an orientation mark (betas from an arbitrary line):\n"
    "  --runs FILE               orientation runs: hole, from, to, confidence\n"
    "  --unoriented-word WORD    the confidence of such runs, in the runs table or\n"
    "                            the log (default unoriented); without --orient-by\n"
    "                            their readings are unoriented\n"
    "  --orient-by KIND=DIP/DIPDIR   turn each such run about the core axis to fit\n"
    "                            its readings of KIND to this plane (may repeat)\n"
    "  --orient-by KIND=nearby   ... to the mean of the hole's oriented KIND readings\n"
    "                            near the run\n"
    "  --nearby-within M         how far from the run nearby readings count (30)\n"
    "One reading (prints a labelled answer):\n"
    "  --hole-azimuth DEG --hole-dip DEG   the hole at the reading\n"
    "  --alpha DEG --beta DEG [--gamma DEG]\n"
    "  --plane DIP/DIPDIR        the alpha and beta this plane would show in the hole\n"
    "  --line TREND/PLUNGE       the line_alpha and line_beta this line would show\n"
    "\n"
    "Status: converted; extrapolated; near-parallel; near-perpendicular; collar-only;\n"
    "beyond-end, oriented-by-reference (these carry an orientation); dip-only (a\n"
    "plane in a hole within the vertical limit: its dip, 90 - alpha, and no dip\n"
    "direction); unoriented (no beta, or beta from an arbitrary line); no-reference-line;\n"
    "no-survey; unknown-hole; invalid (the note says why).\n"
    "\n";

enum {
    OPT_SECTION = OPT_COMMAND_BASE,
    OPT_STRUCTURES,
    OPT_HOLE_AZIMUTH,
    OPT_HOLE_DIP,
    OPT_ALPHA,
    OPT_BETA,
    OPT_GAMMA,
    OPT_PLANE,
    OPT_LINE,
    OPT_CONFIDENCE_ERRORS,
    OPT_CLOUD,
    OPT_RUNS,
    OPT_ORIENT_BY,
    OPT_UNORIENTED_WORD,
    OPT_NEARBY_WITHIN,
    OPT_SHARD,
};

typedef struct convert_opts {
    cli_common c;
    cli_log_options log;
    corax_convert_job_options setup;
    cli_files logs;
    const char *runs_file;
    corax_runs runs;
    /* one reading */
    double hole_azimuth, hole_dip, alpha, beta, gamma;
    double plane[2], line[2];
    int single;
} convert_opts;

/* "A/B" as two numbers. */
static int pair(const char *arg, double *a, double *b, char *why, size_t wl)
{
    const char *slash = strchr(arg, '/');
    if (!slash || corax_parse_number(arg, (size_t)(slash - arg), '.', a) != CORAX_NUMBER_OK ||
        corax_parse_number(slash + 1, strlen(slash + 1), '.', b) != CORAX_NUMBER_OK) {
        snprintf(why, wl, "'%s' is not two numbers as A/B", arg);
        return -1;
    }
    return 0;
}

/* "good=3,fair=8,poor=20" into the confidence table. */
static int confidence_map(corax_convert_job_options *s, const char *arg, char *why, size_t wl)
{
    s->nconfidence = 0;
    for (const char *p = arg; *p;) {
        const char *end = strchr(p, ',');
        if (!end)
            end = p + strlen(p);
        const char *eq = memchr(p, '=', (size_t)(end - p));
        double v;
        if (!eq || eq == p || (size_t)(eq - p) >= sizeof s->confidence[0].name ||
            corax_parse_number(eq + 1, (size_t)(end - eq - 1), '.', &v) != CORAX_NUMBER_OK ||
            v < 0 || v > 180 || s->nconfidence == sizeof s->confidence / sizeof s->confidence[0]) {
            snprintf(why, wl, "'%.*s' is not LEVEL=DEGREES (a level, a 1-sigma in [0, 180])",
                     (int)(end - p), p);
            return -1;
        }
        corax_convert_confidence *c = &s->confidence[s->nconfidence++];
        snprintf(c->name, sizeof c->name, "%.*s", (int)(eq - p), p);
        c->sigma = corax_rad(v);
        p = *end ? end + 1 : end;
    }
    return 0;
}

/* "KIND=DIP/DIPDIR" or "KIND=nearby" into the references. */
static int orient_by(corax_convert_job_options *s, const char *arg, char *why, size_t wl)
{
    const char *eq = strchr(arg, '=');
    if (!eq || eq == arg || (size_t)(eq - arg) >= sizeof s->refs[0].kind) {
        snprintf(why, wl, "'%s' is not KIND=DIP/DIPDIR or KIND=nearby", arg);
        return -1;
    }
    if (s->nrefs == sizeof s->refs / sizeof s->refs[0]) {
        snprintf(why, wl, "at most %zu references", sizeof s->refs / sizeof s->refs[0]);
        return -1;
    }
    corax_convert_reference *ref = &s->refs[s->nrefs];
    memset(ref, 0, sizeof *ref);
    snprintf(ref->kind, sizeof ref->kind, "%.*s", (int)(eq - arg), arg);
    for (size_t k = 0; k < s->nrefs; k++)
        if (strcasecmp(s->refs[k].kind, ref->kind) == 0) {
            snprintf(why, wl, "%s has a reference already", ref->kind);
            return -1;
        }
    if (strcasecmp(eq + 1, "nearby") == 0) {
        ref->nearby = 1;
    } else {
        double dip, dd;
        if (pair(eq + 1, &dip, &dd, why, wl))
            return -1;
        if (!(dip >= 0 && dip <= 90 && dd >= 0 && dd <= 360)) {
            snprintf(why, wl, "'%s': dip must be in [0, 90] and dip direction in [0, 360]", arg);
            return -1;
        }
        ref->plane = (corax_plane){corax_rad(dip), corax_wrap_azimuth(corax_rad(dd))};
    }
    s->nrefs++;
    return 0;
}

static int uncertainty_option(convert_opts *o, int opt, const char *arg, char *why, size_t wl)
{
    switch (opt) {
    case OPT_CONFIDENCE_ERRORS: return confidence_map(&o->setup, arg, why, wl);
    case OPT_CLOUD: o->setup.cloud = arg; return 0;
    case OPT_RUNS: o->runs_file = arg; return 0;
    case OPT_ORIENT_BY: return orient_by(&o->setup, arg, why, wl);
    case OPT_UNORIENTED_WORD: o->setup.unoriented_word = arg; return 0;
    case OPT_NEARBY_WITHIN:
        return cli_value_number(arg, 0, 1e5, &o->setup.nearby_within, why, wl);
    }
    int k = cli_uncertainty_option(&o->setup.errors, &o->setup.draws, &o->setup.seed, 2, opt, arg,
                                   why, wl);
    if (k == 0)
        snprintf(why, wl, "not an option of this command");
    return k < 0 || k == 0 ? -1 : 0;
}

static int convert_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    convert_opts *o = ctx;
    double v;
    int k = cli_convention_option(&o->setup.convert, opt, arg, why, wl);
    if (!k)
        k = cli_log_option(&o->c, &o->log, opt, arg, why, wl);
    if (k)
        return k < 0 ? -1 : 0;
    switch (opt) {
    case OPT_SECTION:
        if (cli_value_number(arg, -360, 360, &v, why, wl))
            return -1;
        o->setup.has_section = 1;
        o->setup.section_azimuth = corax_rad(v);
        return 0;
    case OPT_STRUCTURES:
        return cli_files_add(&o->logs, &o->c, arg, why, wl);
    case OPT_SHARD:
        return cli_value_shard(arg, &o->setup.shard, &o->setup.shards, why, wl);
    case OPT_HOLE_AZIMUTH: o->single = 1; return cli_value_number(arg, 0, 360, &o->hole_azimuth, why, wl);
    case OPT_HOLE_DIP: o->single = 1; return cli_value_number(arg, -90, 180, &o->hole_dip, why, wl);
    case OPT_ALPHA: o->single = 1; return cli_value_number(arg, 0, 90, &o->alpha, why, wl);
    case OPT_BETA: o->single = 1; return cli_value_number(arg, 0, 360, &o->beta, why, wl);
    case OPT_GAMMA: o->single = 1; return cli_value_number(arg, 0, 360, &o->gamma, why, wl);
    case OPT_PLANE:
        o->single = 1;
        if (pair(arg, &o->plane[0], &o->plane[1], why, wl))
            return -1;
        if (!(o->plane[0] >= 0 && o->plane[0] <= 90 && o->plane[1] >= 0 && o->plane[1] <= 360)) {
            snprintf(why, wl, "'%s': dip must be in [0, 90] and dip direction in [0, 360]", arg);
            return -1;
        }
        return 0;
    case OPT_LINE:
        o->single = 1;
        if (pair(arg, &o->line[0], &o->line[1], why, wl))
            return -1;
        if (!(o->line[0] >= 0 && o->line[0] <= 360 && o->line[1] >= -90 && o->line[1] <= 90)) {
            snprintf(why, wl, "'%s': trend must be in [0, 360] and plunge in [-90, 90]", arg);
            return -1;
        }
        return 0;
    }
    return uncertainty_option(o, opt, arg, why, wl);
}

static int parse(int argc, char **argv, convert_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        CLI_CONVENTION_OPTIONS,
        {"section-azimuth", required_argument, NULL, OPT_SECTION},
        {"structures", required_argument, NULL, OPT_STRUCTURES},
        {"hole-azimuth", required_argument, NULL, OPT_HOLE_AZIMUTH},
        {"hole-dip", required_argument, NULL, OPT_HOLE_DIP},
        {"alpha", required_argument, NULL, OPT_ALPHA},
        {"beta", required_argument, NULL, OPT_BETA},
        {"gamma", required_argument, NULL, OPT_GAMMA},
        {"plane", required_argument, NULL, OPT_PLANE},
        {"line", required_argument, NULL, OPT_LINE},
        CLI_UNCERTAINTY_OPTIONS,
        {"beta-error", required_argument, NULL, OPT_BETA_ERROR},
        {"line-error", required_argument, NULL, OPT_LINE_ERROR},
        {"gravity-error", required_argument, NULL, OPT_GRAVITY_ERROR},
        {"confidence-errors", required_argument, NULL, OPT_CONFIDENCE_ERRORS},
        {"cloud", required_argument, NULL, OPT_CLOUD},
        {"runs", required_argument, NULL, OPT_RUNS},
        {"orient-by", required_argument, NULL, OPT_ORIENT_BY},
        {"unoriented-word", required_argument, NULL, OPT_UNORIENTED_WORD},
        {"nearby-within", required_argument, NULL, OPT_NEARBY_WITHIN},
        {"shard", required_argument, NULL, OPT_SHARD},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, convert_help, 1, convert_option, o);
    if (rc == -1) /* after the help: the conventions' */
        fputs(cli_convention_help, stdout);
    if (rc != 0)
        return rc;
    if (cli_files_from_args(&o->logs, &o->c, argc, argv)) /* they replace the project's */
        return EXIT_DATA;
    if (cli_files_stdin_once(&o->logs, "convert"))
        return EXIT_USAGE;
    if (o->single) {
        if (isnan(o->hole_azimuth) || isnan(o->hole_dip))
            return cli_usage("convert", "one reading needs --hole-azimuth and --hole-dip");
        int forward = !isnan(o->alpha), plane = !isnan(o->plane[0]), line = !isnan(o->line[0]);
        if (forward + plane + line != 1)
            return cli_usage("convert", "give one of --alpha (with --beta), --plane or --line");
        if (!forward && (!isnan(o->beta) || !isnan(o->gamma)))
            return cli_usage("convert", "--beta and --gamma go with --alpha");
        if (o->logs.n)
            return cli_usage("convert", "one reading takes no STRUCTURES files");
        if (o->setup.nrefs)
            return cli_usage("convert", "--orient-by goes with core logs, not one reading");
        return cli_common_finish(&o->c, 0);
    }
    if (o->logs.n == 0)
        return cli_usage("convert", "no STRUCTURES file (a core log, or - for standard input)");
    for (size_t i = 0; i < o->logs.n; i++)
        cli_input(&o->c, "a core log", o->logs.path[i]);
    cli_output(&o->c, "--cloud", o->setup.cloud);
    return cli_common_finish(&o->c, 1);
}

/* The rows by status, on standard error: "corax: 12 rows: 10 converted, 2
 * near-parallel". */
static void summary(const corax_convert_job_summary *sum)
{
    fprintf(stderr, "corax: %zu row%s:", sum->rows, sum->rows == 1 ? "" : "s");
    int first = 1;
    if (sum->count[CORAX_COND_COUNT]) {
        fprintf(stderr, " %zu converted", sum->count[CORAX_COND_COUNT]);
        first = 0;
    }
    for (unsigned k = 0; k < CORAX_COND_COUNT; k++)
        if (sum->count[k]) {
            fprintf(stderr, "%s %zu %s", first ? "" : ",", sum->count[k],
                    corax_condition_name(k));
            first = 0;
        }
    if (sum->other_shards)
        fprintf(stderr, "; %zu row%s of other shards left out", sum->other_shards,
                sum->other_shards == 1 ? "" : "s");
    fputc('\n', stderr);
}

static int convert_logs(convert_opts *o)
{
    corax_program *prog = cli_load_program(&o->c);
    if (!prog)
        return EXIT_DATA;
    corax_convert_job_options *s = &o->setup;
    s->log = cli_table_settings(&o->c, CLI_STRUCTURES);
    s->place = cli_interval_depth(&o->c);
    s->kind_codes = o->log.kind_codes;
    s->confidence_codes = o->log.confidence_codes;
    s->output = o->c.output_format;
    int rc = EXIT_OK;
    if (o->runs_file) {
        corax_findings found = {0};
        corax_table_settings ts = cli_table_settings(&o->c, CLI_RUNS);
        corax_status st = corax_runs_load(&o->c.job, o->runs_file, &ts, o->log.confidence_codes,
                                          NULL, 0, &o->runs, &found);
        for (size_t i = 0; i < found.count; i++)
            cli_finding(&found.item[i]);
        corax_findings_clear(&found);
        rc = cli_status(st);
        s->runs = &o->runs;
    }
    corax_convert_job_summary sum;
    memset(&sum, 0, sizeof sum);
    corax_record *record = corax_record_new();
    o->c.job.record = record;
    if (rc == EXIT_OK)
        rc = cli_status(corax_convert_job_run(&o->c.job, prog, s, o->logs.path, o->logs.n,
                                              o->c.output, &sum));
    o->c.job.record = NULL;
    if (rc == EXIT_OK && !o->c.quiet)
        summary(&sum);
    if (rc == EXIT_OK)
        corax_convert_job_warn(&o->c.job, s, &sum);
    if (rc == EXIT_OK && cli_about_job("convert", &o->c, record) != 0)
        rc = EXIT_DATA;
    corax_record_free(record);
    corax_convert_job_summary_clear(&sum);
    corax_program_free(prog);
    return rc;
}

int cmd_convert(int argc, char **argv)
{
    convert_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "convert");
    o.setup = corax_convert_job_options_default();
    o.hole_azimuth = o.hole_dip = o.alpha = o.beta = o.gamma = NAN;
    o.plane[0] = o.line[0] = NAN;
    int rc = parse(argc, argv, &o);
    if (rc == 0)
        rc = o.single ? convert_one_reading(&o.c, &o.setup.convert, o.hole_azimuth, o.hole_dip,
                                            o.alpha, o.beta, o.gamma, o.plane, o.line)
                      : convert_logs(&o);
    corax_runs_free(&o.runs);
    cli_files_free(&o.logs);
    cli_log_options_free(&o.log);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc < 0 ? EXIT_OK : rc;
}
