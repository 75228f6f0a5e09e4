/* cli: `corax check`, the QA of a drill program: every survey and orientation
 * finding placed at its hole and depth, in a table and an HTML report. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"

static const char check_help[] =
    "usage: corax check --collars FILE --surveys FILE [--structures FILE]... [--runs FILE]\n"
    "                   -o FINDINGS.csv [--report REPORT.html]\n"
    "\n"
    "Check a drill program's surveys and orientation data for the errors that plague\n"
    "drill programs, and place every finding at its hole and depth. FINDINGS.csv has\n"
    "one row per finding: hole, depth, depth_to (for a stretch), severity (error,\n"
    "warning, note), check, message, file, line; sorted by hole and depth. Bad data\n"
    "becomes findings and the rest is still checked: the exit status is 0 whatever\n"
    "is found, 1 only when a file cannot be read or lacks a required column.\n"
    "\n"
    "  --structures FILE     a core log (hole, depth or from and to, alpha, beta,\n"
    "                        gamma, kind, confidence, ...); may repeat; also as\n"
    "                        positional FILEs, which replace the project file's\n"
    "  --runs FILE           orientation runs: hole, from, to, optional confidence;\n"
    "                        without it, runs are inferred from the readings' depths\n"
    "  --report FILE         the findings as one self-contained HTML page\n"
    "  --title TEXT          the report's title (default: the project file's name)\n"
    "  --shard K/N           only the holes in shard K of N (by their names, as convert\n"
    "                        --shard), each hole's own checks: the findings of the N\n"
    "                        shards together hold each finding about a hole once; the\n"
    "                        program-wide checks (azimuth offset, conventions, holes\n"
    "                        against the rest) need every hole and are left out;\n"
    "                        not with --report\n"
    "Thresholds (defaults in brackets; degrees and metres):\n"
    "  --gap M               stations further apart [60]\n"
    "  --dogleg DEG          dogleg severity per 30 m [3]\n"
    "  --magnetic-azimuth DEG, --magnetic-dip DEG\n"
    "                        an azimuth change at least this with a dip change at\n"
    "                        most that suggests magnetic interference [5, 1]\n"
    "  --first-station M     a first station deeper than this [15]\n"
    "  --collar-mismatch DEG collar and first station further apart [5]\n"
    "  --steep DEG           plunge beyond which a gravity mark is unreliable [70]\n"
    "  --low-alpha DEG       alpha below this [10]\n"
    "  --run-length M        an orientation run's length when no runs table gives\n"
    "                        them (a barrel) [3]\n"
    "  --run-misfit DEG      a run this far from its neighbours disagrees [25]\n"
    "  --hole-turn DEG       a hole fitting the program best turned further [15]\n"
    "  --low-confidence LIST confidence words taken as low [poor,low]\n"
    "  --total-field NT, --field-dip DEG\n"
    "                        a station whose measured total field or dip of the field\n"
    "                        (the surveys' total_field and field_dip columns) departs\n"
    "                        further from the magnetic model's (--declination model)\n"
    "                        [300, 0.45: common practice for field acceptance]\n"
    "  --unoriented-word WORD  the confidence of runs without an orientation mark,\n"
    "                        whose betas run from an arbitrary line [unoriented]\n"
    "\n";

enum {
    OPT_STRUCTURES = OPT_COMMAND_BASE,
    OPT_RUNS,
    OPT_REPORT,
    OPT_TITLE,
    OPT_GAP,
    OPT_DOGLEG,
    OPT_MAG_AZ,
    OPT_MAG_DIP,
    OPT_FIRST,
    OPT_COLLAR,
    OPT_STEEP,
    OPT_LOW_ALPHA,
    OPT_RUN_LENGTH,
    OPT_RUN_MISFIT,
    OPT_HOLE_TURN,
    OPT_LOW_CONFIDENCE,
    OPT_TOTAL_FIELD,
    OPT_FIELD_DIP,
    OPT_UNORIENTED_WORD,
    OPT_SHARD,
};

typedef struct check_opts {
    cli_common c;
    cli_log_options log;
    corax_convert_options convert;
    corax_qa_options qa;
    cli_files logs;
    const char *runs, *report, *title;
    const char *unoriented_word; /* the confidence of runs without a mark */
    char *low_words;           /* the --low-confidence list, split in place */
    const char *low_list[17];
} check_opts;

static int low_confidence(check_opts *o, const char *arg, char *why, size_t wl)
{
    free(o->low_words);
    if (!(o->low_words = strdup(arg))) {
        snprintf(why, wl, "out of memory");
        return -1;
    }
    size_t n = 0;
    for (char *p = strtok(o->low_words, ","); p && n < 16; p = strtok(NULL, ","))
        o->low_list[n++] = p;
    o->low_list[n] = NULL;
    o->qa.low_confidence = o->low_list;
    return 0;
}

static int check_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    check_opts *o = ctx;
    int k = cli_convention_option(&o->convert, opt, arg, why, wl);
    if (!k)
        k = cli_log_option(&o->c, &o->log, opt, arg, why, wl);
    if (k)
        return k < 0 ? -1 : 0;
    corax_qa_options *q = &o->qa;
    static const struct {
        int opt;
        double lo, hi;
        int degrees;
    } limits[] = {{OPT_GAP, 1, 1e4, 0},        {OPT_DOGLEG, 0.01, 90, 1},
                  {OPT_MAG_AZ, 0.1, 90, 1},    {OPT_MAG_DIP, 0, 45, 1},
                  {OPT_FIRST, 0, 1e4, 0},      {OPT_COLLAR, 0.1, 90, 1},
                  {OPT_STEEP, 1, 90, 1},       {OPT_LOW_ALPHA, 0, 90, 1},
                  {OPT_RUN_LENGTH, 0.1, 1e3, 0}, {OPT_RUN_MISFIT, 1, 90, 1},
                  {OPT_HOLE_TURN, 1, 180, 1},    {OPT_TOTAL_FIELD, 1, 1e5, 0},
                  {OPT_FIELD_DIP, 0.01, 90, 1}};
    double *slot[] = {&q->gap,  &q->dogleg,    &q->magnetic_azimuth, &q->magnetic_dip,
                      &q->first_station, &q->collar_mismatch, &q->steep, &q->low_alpha,
                      &q->run_length, &q->run_misfit, &q->hole_turn, &q->total_field,
                      &q->field_dip};
    for (size_t i = 0; i < sizeof limits / sizeof limits[0]; i++)
        if (limits[i].opt == opt) {
            double v;
            if (cli_value_number(arg, limits[i].lo, limits[i].hi, &v, why, wl))
                return -1;
            *slot[i] = limits[i].degrees ? corax_rad(v) : v;
            return 0;
        }
    switch (opt) {
    case OPT_STRUCTURES:
        return cli_files_add(&o->logs, &o->c, arg, why, wl);
    case OPT_RUNS: o->runs = arg; return 0;
    case OPT_REPORT: o->report = arg; return 0;
    case OPT_TITLE: o->title = arg; return 0;
    case OPT_LOW_CONFIDENCE: return low_confidence(o, arg, why, wl);
    case OPT_UNORIENTED_WORD: o->unoriented_word = arg; return 0;
    case OPT_SHARD: return cli_value_shard(arg, &o->qa.shard, &o->qa.shards, why, wl);
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, check_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        CLI_CONVENTION_OPTIONS,
        {"structures", required_argument, NULL, OPT_STRUCTURES},
        {"runs", required_argument, NULL, OPT_RUNS},
        {"report", required_argument, NULL, OPT_REPORT},
        {"title", required_argument, NULL, OPT_TITLE},
        {"gap", required_argument, NULL, OPT_GAP},
        {"dogleg", required_argument, NULL, OPT_DOGLEG},
        {"magnetic-azimuth", required_argument, NULL, OPT_MAG_AZ},
        {"magnetic-dip", required_argument, NULL, OPT_MAG_DIP},
        {"first-station", required_argument, NULL, OPT_FIRST},
        {"collar-mismatch", required_argument, NULL, OPT_COLLAR},
        {"steep", required_argument, NULL, OPT_STEEP},
        {"low-alpha", required_argument, NULL, OPT_LOW_ALPHA},
        {"run-length", required_argument, NULL, OPT_RUN_LENGTH},
        {"run-misfit", required_argument, NULL, OPT_RUN_MISFIT},
        {"hole-turn", required_argument, NULL, OPT_HOLE_TURN},
        {"low-confidence", required_argument, NULL, OPT_LOW_CONFIDENCE},
        {"total-field", required_argument, NULL, OPT_TOTAL_FIELD},
        {"field-dip", required_argument, NULL, OPT_FIELD_DIP},
        {"unoriented-word", required_argument, NULL, OPT_UNORIENTED_WORD},
        {"shard", required_argument, NULL, OPT_SHARD},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, check_help, 1, check_option, o);
    if (rc == -1)
        fputs(cli_convention_help, stdout);
    if (rc != 0)
        return rc;
    if (cli_files_from_args(&o->logs, &o->c, argc, argv)) /* they replace the project's */
        return EXIT_DATA;
    for (size_t i = 0; i < o->logs.n; i++)
        cli_input(&o->c, "a core log", o->logs.path[i]);
    cli_input(&o->c, "--runs", o->runs);
    cli_output(&o->c, "--report", o->report);
    return cli_common_finish(&o->c, 1);
}

/* The report's title: --title, else the project file's name without its
 * folder and ending, else "Drill program". */
static void report_title(const check_opts *o, char *name, size_t size)
{
    const char *title = o->title;
    if (!title && o->c.project) {
        const char *slash = strrchr(o->c.project, '/');
        title = slash ? slash + 1 : o->c.project;
    }
    snprintf(name, size, "%s", title ? title : "Drill program");
    char *dot = strrchr(name, '.');
    if (dot && !o->title)
        *dot = '\0';
}

static int check(check_opts *o)
{
    corax_findings found = {0};
    corax_program *prog = NULL;
    o->qa.azimuth_correction = corax_rad(o->c.load.declination - o->c.load.convergence);
    int rc = cli_load_program_findings(&o->c, &prog, &found);
    char title[200];
    report_title(o, title, sizeof title);
    corax_check_job_options j = corax_check_job_options_default();
    j.collars = o->c.collars;
    j.surveys = o->c.surveys;
    j.corrections = &o->c.corr.record;
    j.convert = o->convert;
    j.qa = o->qa;
    j.logs = o->logs.path;
    j.nlogs = o->logs.n;
    j.log = cli_table_settings(&o->c, CLI_STRUCTURES);
    j.place = cli_interval_depth(&o->c);
    j.kind_codes = o->log.kind_codes;
    j.confidence_codes = o->log.confidence_codes;
    j.runs = o->runs;
    j.runs_table = cli_table_settings(&o->c, CLI_RUNS);
    j.unoriented_word = o->unoriented_word;
    j.report = o->report;
    j.title = title;
    corax_check_job_summary sum;
    memset(&sum, 0, sizeof sum);
    corax_record *record = corax_record_new();
    o->c.job.record = record;
    if (rc == EXIT_OK)
        rc = cli_status(corax_check_job_run(&o->c.job, prog, &j, &found, o->c.output, &sum));
    o->c.job.record = NULL;
    if (rc == EXIT_OK && cli_about_job("check", &o->c, record) != 0)
        rc = EXIT_DATA;
    if (rc == EXIT_OK && !o->c.quiet) {
        size_t n = found.count;
        fprintf(stderr, "corax: %zu finding%s: %zu error%s, %zu warning%s, %zu note%s", n,
                n == 1 ? "" : "s", sum.errors, sum.errors == 1 ? "" : "s", sum.warnings,
                sum.warnings == 1 ? "" : "s", sum.notes, sum.notes == 1 ? "" : "s");
        if (sum.other_shards)
            fprintf(stderr, "; %zu reading%s of other shards left out", sum.other_shards,
                    sum.other_shards == 1 ? "" : "s");
        fputc('\n', stderr);
    }
    corax_record_free(record);
    corax_check_job_summary_clear(&sum);
    corax_findings_clear(&found);
    corax_program_free(prog);
    return rc;
}

int cmd_check(int argc, char **argv)
{
    check_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "check");
    o.c.corr.keep_record = 1; /* the field checks compare each station's corrections */
    o.convert = corax_convert_options_default();
    o.qa = corax_qa_options_default();
    o.c.load.repair = 1; /* a faulty station becomes a finding, not the end of its hole */
    o.unoriented_word = "unoriented";
    int rc = parse(argc, argv, &o);
    if (rc == 0)
        rc = check(&o);
    cli_files_free(&o.logs);
    cli_log_options_free(&o.log);
    free(o.low_words);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc < 0 ? EXIT_OK : rc;
}
