/* cli: `corax check`, the QA of a drill program: every survey and orientation
 * finding placed at its hole and depth, in a table and an HTML report. */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "cli/cli.h"
#include "io/fields.h"

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

/* ---- the core logs, held in memory for the checks ---- */

typedef struct logs {
    corax_table **table;
    size_t ntables;
    corax_qa_reading *reading;
    size_t n, cap;
    char **phrase; /* the problems' words, owned */
    size_t nphrase;
    corax_tally *unknown_kind, *unknown_confidence; /* codes with no word */
} logs;

static void logs_free(logs *l)
{
    for (size_t i = 0; i < l->ntables; i++)
        corax_table_free(l->table[i]);
    for (size_t i = 0; i < l->nphrase; i++)
        free(l->phrase[i]);
    free(l->table);
    free(l->reading);
    free(l->phrase);
    corax_tally_free(l->unknown_kind);
    corax_tally_free(l->unknown_confidence);
}

static const char *keep_phrase(logs *l, const char *text)
{
    char **p = realloc(l->phrase, (l->nphrase + 1) * sizeof *p);
    char *copy = p ? strdup(text) : NULL;
    if (p)
        l->phrase = p;
    if (!copy)
        return "out of memory";
    l->phrase[l->nphrase++] = copy;
    return copy;
}

enum { L_HOLE, L_DEPTH, L_FROM, L_TO, L_ALPHA, L_BETA, L_GAMMA, L_LALPHA, L_LBETA, L_KIND, L_CONF,
       NL };
static const char *const log_names[NL] = {"hole",  "depth", "from", "to", "alpha", "beta",
                                          "gamma", "line_alpha", "line_beta", "kind",
                                          "confidence"};

/* How the logs are read: their settings and code words. */
typedef struct log_setup {
    corax_table_settings table;
    int where; /* a cli_interval */
    const cli_log_options *codes;
} log_setup;

/* A kind or confidence value as its word; an unknown code is tallied and
 * kept as written. */
/* One row to a reading; a phrase for the first value that cannot be read. */
static void read_row(const corax_table *t, size_t findex, size_t row, const long *col,
                     const log_setup *ls, const corax_program *prog, const char **field,
                     logs *l, corax_qa_reading *r)
{
    corax_row cells;
    corax_table_row(t, row, field, &cells);
    r->hole = corax_table_cell(t, row, col[L_HOLE], NULL);
    r->path = corax_program_find(prog, r->hole, strlen(r->hole));
    r->file = corax_table_path(t);
    r->line = corax_table_line(t, row);
    size_t kl, cl;
    const char *kind = corax_table_cell(t, row, col[L_KIND], &kl);
    const char *conf = corax_table_cell(t, row, col[L_CONF], &cl);
    r->kind = cli_code_word(ls->codes->kind_codes, kind, kl, l->unknown_kind, r->file, findex, r->line);
    r->confidence = cli_code_word(ls->codes->confidence_codes, conf, cl, l->unknown_confidence,
                            r->file, findex, r->line);
    r->problem = NULL;
    r->reading = corax_reading_empty();
    char why[200];
    corax_table_info info;
    corax_table_read_info(t, &info);
    const char *ragged = corax_field_ragged(&cells, corax_table_columns(t), why, sizeof why);
    if (ragged)
        r->problem = keep_phrase(l, why);
    if (corax_field_depth(&cells, col + L_DEPTH, info.format.decimal, ls->table.unit, ls->where,
                          &r->reading.depth, why, sizeof why) != CORAX_NUMBER_OK &&
        !r->problem)
        r->problem = keep_phrase(l, why);
    double *slot[] = {&r->reading.alpha, &r->reading.beta, &r->reading.gamma,
                      &r->reading.line_alpha, &r->reading.line_beta};
    for (int k = L_ALPHA; k <= L_LBETA; k++) {
        double v;
        corax_number_status st = corax_field_number(&cells, col[k], info.format.decimal,
                                                    log_names[k], &v, why, sizeof why);
        if (st == CORAX_NUMBER_OK)
            *slot[k - L_ALPHA] = corax_rad(v);
        else if (st != CORAX_NUMBER_EMPTY && col[k] >= 0 && !r->problem)
            r->problem = keep_phrase(l, why);
    }
}

static int load_logs(check_opts *o, const corax_program *prog, logs *l)
{
    log_setup ls = {cli_table_settings(&o->c, CLI_STRUCTURES), (int)cli_interval_depth(&o->c),
                    &o->log};
    const char **field = NULL;
    l->unknown_kind = corax_tally_new();
    l->unknown_confidence = corax_tally_new();
    int rc = l->unknown_kind && l->unknown_confidence ? EXIT_OK : EXIT_DATA;
    for (size_t f = 0; f < o->logs.n && rc == EXIT_OK; f++) {
        corax_table *t =
            cli_table_keep(&o->c, CLI_STRUCTURES, o->logs.path[f], &l->table, &l->ntables);
        if (!t) {
            rc = EXIT_DATA;
            break;
        }
        long col[NL];
        if (cli_table_columns(t, &ls.table, log_names, NL, col)) {
            rc = EXIT_DATA;
            break;
        }
        const char *missing = col[L_HOLE] < 0 ? "hole"
                              : col[L_DEPTH] < 0 && (col[L_FROM] < 0 || col[L_TO] < 0)
                                  ? "depth (or from and to)"
                                  : NULL;
        if (!missing && col[L_ALPHA] < 0 && col[L_LALPHA] < 0)
            missing = "alpha";
        if (missing) {
            cli_error(o->logs.path[f], 1, "no '%s' column in the header", missing);
            rc = EXIT_DATA;
            break;
        }
        size_t rows = corax_table_rows(t);
        const char **fp = realloc(field, (corax_table_widest(t) + 1) * sizeof *fp);
        if (fp)
            field = fp;
        if (l->n + rows > l->cap) {
            size_t cap = l->cap ? l->cap : 1024;
            while (cap < l->n + rows)
                cap *= 2;
            corax_qa_reading *p = realloc(l->reading, cap * sizeof *p);
            if (p) {
                l->reading = p;
                l->cap = cap;
            }
        }
        if (!fp || l->n + rows > l->cap) {
            rc = EXIT_DATA;
            break;
        }
        for (size_t r = 0; r < rows; r++)
            read_row(t, f, r, col, &ls, prog, field, l, &l->reading[l->n++]);
    }
    free(field);
    return rc;
}

/* Readings whose betas run from an arbitrary line (their confidence, or
 * without one their run's, is the unoriented word) orient nothing: the
 * checks of fabric leave them out. */
static void mark_arbitrary_lines(const check_opts *o, const cli_runs *runs, logs *l)
{
    for (size_t i = 0; i < l->n; i++) {
        corax_qa_reading *r = &l->reading[i];
        const char *word = r->confidence;
        long k = word[0] ? -1 : cli_runs_find(runs, r->hole, strlen(r->hole), r->reading.depth);
        if (k >= 0)
            word = runs->run[k].confidence;
        r->reading.arbitrary_line = cli_unoriented_confidence(word, strlen(word), o->unoriented_word);
    }
}

/* ---- output ---- */

static int write_findings(const check_opts *o, const corax_findings *f)
{
    corax_writer *w;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open_in(o->c.outputs, o->c.output, &w, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    static const char head[] = "hole,depth,depth_to,severity,check,message,file,line\n";
    corax_writer_text(w, head, sizeof head - 1);
    for (size_t i = 0; i < f->count; i++) {
        const corax_finding *x = &f->item[i];
        const char *sev = corax_severity_name(x->severity);
        corax_writer_field(w, x->hole, strlen(x->hole));
        corax_writer_number(w, x->depth, 2);
        corax_writer_number(w, x->depth_to, 2);
        corax_writer_field(w, sev, strlen(sev));
        corax_writer_field(w, x->check, strlen(x->check));
        corax_writer_field(w, x->message, strlen(x->message));
        corax_writer_field(w, x->file ? x->file : "", x->file ? strlen(x->file) : 0);
        if (x->line > 0)
            corax_writer_integer(w, x->line);
        else
            corax_writer_field(w, "", 0);
        corax_writer_end_row(w);
    }
    st = corax_writer_commit(w, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    return EXIT_OK;
}

static int write_report(const check_opts *o, const corax_program *prog,
                        const corax_findings *found, const logs *l)
{
    const char *inputs[64];
    size_t ninputs = 0;
    inputs[ninputs++] = o->c.collars;
    inputs[ninputs++] = o->c.surveys;
    for (size_t i = 0; i < o->logs.n && ninputs < 63; i++)
        inputs[ninputs++] = o->logs.path[i];
    if (o->runs)
        inputs[ninputs++] = o->runs;
    char when[64];
    time_t now = time(NULL);
    struct tm tm;
    strftime(when, sizeof when, "%Y-%m-%d %H:%M UTC", gmtime_r(&now, &tm));
    const char *title = o->title;
    if (!title && o->c.project) { /* the project file's name, without folder or ending */
        const char *slash = strrchr(o->c.project, '/');
        title = slash ? slash + 1 : o->c.project;
    }
    char name[200];
    snprintf(name, sizeof name, "%s", title ? title : "Drill program");
    char *dot = strrchr(name, '.');
    if (dot && !o->title)
        *dot = '\0';
    corax_report_input in = {name, inputs, ninputs, CORAX_VERSION, when, prog,
                             found, l->reading, l->n, &o->convert, o->c.output};
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_report_write(&in, o->c.outputs, o->report, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    return EXIT_OK;
}

static int write_about(const check_opts *o)
{
    const corax_qa_options *q = &o->qa;
    cli_about *a = cli_about_new("check", &o->c);
    cli_about_section(a, "check");
    for (size_t i = 0; i < o->logs.n; i++)
        cli_about_set(a, "structures", "%s", o->logs.path[i]);
    cli_about_set(a, "runs", "%s", o->runs ? o->runs : "inferred from the readings' depths");
    if (o->report)
        cli_about_set(a, "report", "%s", o->report);
    cli_about_set(a, "gap", "%g", q->gap);
    cli_about_set(a, "dogleg", "%g", corax_deg(q->dogleg));
    cli_about_set(a, "magnetic_azimuth", "%g", corax_deg(q->magnetic_azimuth));
    cli_about_set(a, "magnetic_dip", "%g", corax_deg(q->magnetic_dip));
    cli_about_set(a, "first_station", "%g", q->first_station);
    cli_about_set(a, "collar_mismatch", "%g", corax_deg(q->collar_mismatch));
    cli_about_set(a, "steep", "%g", corax_deg(q->steep));
    cli_about_set(a, "low_alpha", "%g", corax_deg(q->low_alpha));
    cli_about_set(a, "run_length", "%g", q->run_length);
    cli_about_set(a, "run_misfit", "%g", corax_deg(q->run_misfit));
    cli_about_set(a, "hole_turn", "%g", corax_deg(q->hole_turn));
    cli_about_set(a, "total_field", "%g (nT, measured against the magnetic model)",
                  q->total_field);
    cli_about_set(a, "field_dip", "%g (degrees, measured against the magnetic model)",
                  corax_deg(q->field_dip));
    cli_about_conventions(a, &o->convert);
    cli_about_codes(a, &o->log);
    return cli_about_commit(a, &o->c);
}

int cmd_check(int argc, char **argv)
{
    check_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "check");
    o.convert = corax_convert_options_default();
    o.qa = corax_qa_options_default();
    o.c.load.repair = 1; /* a faulty station becomes a finding, not the end of its hole */
    o.unoriented_word = "unoriented";
    logs l;
    memset(&l, 0, sizeof l);
    corax_findings found = {0};
    corax_program *prog = NULL;
    cli_runs runs = {0};
    int rc = parse(argc, argv, &o);
    if (rc != 0)
        goto done;
    o.qa.azimuth_correction = corax_rad(o.c.load.declination - o.c.load.convergence);
    rc = cli_load_program_findings(&o.c, &prog, &found);
    if (rc == EXIT_OK)
        rc = load_logs(&o, prog, &l);
    if (rc == EXIT_OK && o.runs)
        rc = cli_runs_load(&o.c, o.runs, o.log.confidence_codes, l.unknown_confidence,
                           o.logs.n, &runs, &found);
    if (rc != EXIT_OK)
        goto done;
    mark_arbitrary_lines(&o, &runs, &l);
    cli_tally_warn(&o.c, "kind code", "has no mapping", l.unknown_kind,
                   "these rows keep it as their kind");
    cli_tally_warn(&o.c, "confidence code", "has no mapping", l.unknown_confidence,
                   "these rows keep it as their confidence");
    cli_phase(&o.c, "checking %zu holes and %zu readings", corax_program_size(prog), l.n);
    corax_status st = corax_qa_surveys(prog, o.c.surveys, &o.qa, &found);
    if (st == CORAX_OK)
        st = corax_qa_field(&o.c.corr.record, o.c.surveys, &o.qa, &found);
    if (st == CORAX_OK && l.n)
        st = corax_qa_readings(prog, l.reading, l.n, runs.run, runs.n, &o.convert, &o.qa, &found);
    if (st == CORAX_OK)
        st = corax_findings_sort(&found);
    if (st != CORAX_OK) {
        cli_error(NULL, 0, "%s", corax_strerror(st));
        rc = EXIT_DATA;
        goto done;
    }
    rc = write_findings(&o, &found);
    if (rc == EXIT_OK && o.report) {
        cli_phase(&o.c, "writing the report");
        rc = write_report(&o, prog, &found, &l);
    }
    if (rc == EXIT_OK && write_about(&o) != 0)
        rc = EXIT_DATA;
    if (rc == EXIT_OK && !o.c.quiet) {
        size_t e = corax_findings_count(&found, CORAX_ERROR);
        size_t w = corax_findings_count(&found, CORAX_WARNING) - e;
        size_t n = found.count - e - w;
        fprintf(stderr, "corax: %zu finding%s: %zu error%s, %zu warning%s, %zu note%s\n",
                found.count, found.count == 1 ? "" : "s", e, e == 1 ? "" : "s", w,
                w == 1 ? "" : "s", n, n == 1 ? "" : "s");
    }
done:
    corax_findings_clear(&found);
    corax_program_free(prog);
    cli_runs_free(&runs);
    logs_free(&l);
    cli_files_free(&o.logs);
    cli_log_options_free(&o.log);
    free(o.low_words);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc < 0 ? EXIT_OK : rc;
}
