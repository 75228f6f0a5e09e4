/* The command line: shared pieces of the commands (internal to src/cli). */
#ifndef CORAX_CLI_H
#define CORAX_CLI_H

#include <getopt.h>
#include <stdio.h>

#include "corax/corax.h"

/* Exit statuses. */
enum { EXIT_OK = 0, EXIT_DATA = 1, EXIT_USAGE = 2 };

/* The record of what a run assumed, written next to its output. */
typedef corax_record cli_about;

/* The tables a run may read; each may have settings of its own (a project
 * file's [collars], [surveys], [structures], [runs] and [converted]). */
typedef enum cli_table_id {
    CLI_COLLARS = CORAX_ROLE_COLLARS,
    CLI_SURVEYS = CORAX_ROLE_SURVEYS,
    CLI_STRUCTURES = CORAX_ROLE_STRUCTURES, /* core logs */
    CLI_RUNS = CORAX_ROLE_RUNS,             /* orientation runs */
    CLI_CONVERTED = CORAX_ROLE_CONVERTED,   /* corax's converted tables, read back */
    CLI_DEPTHS = CORAX_ROLE_DEPTHS, /* any other table of holes and depths (trace --at): no
                                       section of its own, the defaults only */
    CLI_NTABLES = CORAX_ROLE_COUNT
} cli_table_id;

/* Where a reading's depth sits in a from/to interval. */
typedef corax_reading_place cli_interval;
enum { CLI_INTERVAL_MID = CORAX_PLACE_MID };

enum { CLI_UNSET = -1 };

/* The settings of one table, or the defaults of all of them: CLI_UNSET where
 * nothing was said. */
typedef struct cli_table {
    int delimiter, decimal;     /* 0 to find it from the table, or the character */
    int units;                  /* 0 metres, 1 feet */
    int dip;                    /* a corax_dip_convention (collars, surveys) */
    int interval_depth;         /* a corax_reading_place (structures) */
    corax_column_map *columns;  /* its own header names, or NULL */
    corax_column_map *merged;   /* the defaults' names under its own (cli_common_finish) */
} cli_table;

/* A file a run reads or writes, and the option that named it. */
typedef struct cli_path {
    const char *option, *path;
} cli_path;

typedef struct cli_paths {
    cli_path *item;
    size_t n;
} cli_paths;

/* The azimuth corrections asked for (cli/corrections.c). */
typedef struct cli_corrections {
    int declination_model;      /* --declination model */
    int convergence_projection; /* --convergence projection */
    const char *model_name;     /* --magnetic-model NAME|FILE, or NULL (WMM) */
    const char *grid_text;      /* --local-grid as given, or NULL */
    const char *date_text;      /* --survey-date as given, or NULL */
    int north;                  /* --survey-reference: a corax_north */
    corax_crs *crs;             /* --crs, opened when given */
    const char *crs_text;       /* --crs as given (for GDAL), or NULL */
    corax_local_grid grid;
    corax_magnetic_model *model;
    corax_corrector corrector;  /* what the loader is given */
    corax_corrections record;   /* every station's corrections, once loaded */
    int keep_record;            /* the command reads the record (check, trace): only
                                   then does the loader fill it */
} cli_corrections;

/* Options shared by the commands that read a drill program. */
typedef struct cli_common {
    const char *command; /* for messages */
    const char *collars, *surveys;
    const char *output;  /* "-" for standard output */
    const char *about;   /* side file; NULL: OUTPUT.about when output is a file */
    const char *project; /* the project file read, or NULL */
    int in_project;      /* options are coming from the project file */
    cli_table all;       /* defaults for every input table ([tables], [columns], options) */
    int format_from_options; /* --delimiter or --decimal-mark on the command line:
                                they also hold for converted tables */
    cli_table table[CLI_NTABLES];
    corax_table_format output_format; /* the tables corax writes */
    corax_load_options load; /* made from the tables' settings by cli_common_finish */
    corax_station_ref *reject;
    size_t nreject;
    corax_job job;           /* what the library's jobs report through: its
                                messages printed as they come, its progress
                                shown, the tables read so far */
    corax_outputs *outputs;  /* the run's files, made public together */
    cli_paths *inputs, *outputs_named; /* for the same-file check */
    const char *about_path;  /* where the record goes, or NULL */
    cli_corrections corr;
    int quiet;
    char **owned;        /* strings made while reading options (project paths) */
    size_t nowned;
} cli_common;

/* getopt_long codes of the shared options (beyond single letters). */
enum {
    OPT_COLLARS = 1000,
    OPT_SURVEYS,
    OPT_COLUMNS,
    OPT_DIP_CONVENTION,
    OPT_DECLINATION,
    OPT_CONVERGENCE,
    OPT_DELIMITER,
    OPT_DECIMAL_COMMA,
    OPT_DECIMAL_MARK,
    OPT_ABOUT,
    OPT_PROJECT,
    OPT_UNITS,
    OPT_COLLARS_UNITS,
    OPT_SURVEYS_UNITS,
    OPT_STRUCTURES_UNITS,
    OPT_COLLARS_DIP,
    OPT_SURVEYS_DIP,
    OPT_COLLARS_COLUMNS,
    OPT_SURVEYS_COLUMNS,
    OPT_STRUCTURES_COLUMNS,
    OPT_COLLAR_STATION,
    OPT_REJECT_STATION,
    OPT_OUTPUT_DELIMITER,
    OPT_OUTPUT_DECIMAL,
    OPT_CRS,
    OPT_LOCAL_GRID,
    OPT_SURVEY_DATE,
    OPT_MAGNETIC_MODEL,
    OPT_SURVEY_REFERENCE,
    /* the core conventions, for the commands that read core logs */
    OPT_REFERENCE = 1050,
    OPT_BETA_END,
    OPT_BETA_SENSE,
    OPT_GAMMA_ZERO,
    OPT_GAMMA_SENSE,
    OPT_NEAR_PARALLEL,
    OPT_NEAR_PERPENDICULAR,
    OPT_VERTICAL_LIMIT,
    /* reading core logs */
    OPT_INTERVAL_DEPTH,
    OPT_KIND_CODES,
    OPT_CONFIDENCE_CODES,
    /* the uncertainty, for the commands that draw */
    OPT_DRAWS = 1070,
    OPT_SEED,
    OPT_ALPHA_ERROR,
    OPT_BETA_ERROR,
    OPT_LINE_ERROR,
    OPT_DEPTH_ERROR,
    OPT_AZIMUTH_ERROR,
    OPT_DIP_ERROR,
    OPT_AZIMUTH_ERROR_HOLE,
    OPT_DIP_ERROR_HOLE,
    OPT_GRAVITY_ERROR,
    OPT_COMMAND_BASE = 1100 /* commands number their own options from here */
};

/* Long options for the core conventions. */
#define CLI_CONVENTION_OPTIONS                                                   \
    {"reference-line", required_argument, NULL, OPT_REFERENCE},                  \
        {"beta-end", required_argument, NULL, OPT_BETA_END},                     \
        {"beta-sense", required_argument, NULL, OPT_BETA_SENSE},                 \
        {"gamma-zero", required_argument, NULL, OPT_GAMMA_ZERO},                 \
        {"gamma-sense", required_argument, NULL, OPT_GAMMA_SENSE},               \
        {"near-parallel", required_argument, NULL, OPT_NEAR_PARALLEL},           \
        {"near-perpendicular", required_argument, NULL, OPT_NEAR_PERPENDICULAR}, \
        {"vertical-limit", required_argument, NULL, OPT_VERTICAL_LIMIT},           \
        {"interval-depth", required_argument, NULL, OPT_INTERVAL_DEPTH},           \
        {"kind-codes", required_argument, NULL, OPT_KIND_CODES},                   \
        {"confidence-codes", required_argument, NULL, OPT_CONFIDENCE_CODES}

/* Help text for them. */
extern const char cli_convention_help[];

/* How a command reads core logs: where an interval's reading sits, and the
 * log's code words. */
typedef struct cli_log_options {
    corax_codes *kind_codes, *confidence_codes; /* NULL: values are the words */
} cli_log_options;

/* Apply a log option (--interval-depth goes to the structures table's
 * settings): 1 applied, 0 not one, -1 with why filled. */
int cli_log_option(cli_common *c, cli_log_options *l, int opt, const char *arg, char *why,
                   size_t whylen);
void cli_log_options_free(cli_log_options *l);

/* Apply a convention option: 1 applied, 0 not one, -1 with why filled. */
int cli_convention_option(corax_convert_options *cv, int opt, const char *arg, char *why,
                          size_t whylen);

/* Long options for the uncertainty of a reading's place and alpha, and of the
 * surveys (the core line's own: --beta-error, --line-error, --gravity-error). */
#define CLI_UNCERTAINTY_OPTIONS                                                   \
    {"draws", required_argument, NULL, OPT_DRAWS},                                \
        {"seed", required_argument, NULL, OPT_SEED},                              \
        {"alpha-error", required_argument, NULL, OPT_ALPHA_ERROR},                \
        {"depth-error", required_argument, NULL, OPT_DEPTH_ERROR},                \
        {"azimuth-error", required_argument, NULL, OPT_AZIMUTH_ERROR},            \
        {"dip-error", required_argument, NULL, OPT_DIP_ERROR},                    \
        {"azimuth-error-per-hole", required_argument, NULL, OPT_AZIMUTH_ERROR_HOLE}, \
        {"dip-error-per-hole", required_argument, NULL, OPT_DIP_ERROR_HOLE}

/* Apply an uncertainty option: 1 applied, 0 not one, -1 with why filled.
 * --draws takes whole numbers from min_draws. */
int cli_uncertainty_option(corax_error_model *e, size_t *draws, uint64_t *seed, double min_draws,
                           int opt, const char *arg, char *why, size_t whylen);

/* Long options for the shared set; commands put them first in their table. */
#define CLI_COMMON_OPTIONS                                                   \
    {"collars", required_argument, NULL, OPT_COLLARS},                       \
        {"surveys", required_argument, NULL, OPT_SURVEYS},                   \
        {"columns", required_argument, NULL, OPT_COLUMNS},                   \
        {"dip-convention", required_argument, NULL, OPT_DIP_CONVENTION},     \
        {"declination", required_argument, NULL, OPT_DECLINATION},           \
        {"convergence", required_argument, NULL, OPT_CONVERGENCE},           \
        {"delimiter", required_argument, NULL, OPT_DELIMITER},               \
        {"decimal-comma", no_argument, NULL, OPT_DECIMAL_COMMA},             \
        {"decimal-mark", required_argument, NULL, OPT_DECIMAL_MARK},         \
        {"about", required_argument, NULL, OPT_ABOUT},                       \
        {"project", required_argument, NULL, OPT_PROJECT},                   \
        {"units", required_argument, NULL, OPT_UNITS},                       \
        {"collars-units", required_argument, NULL, OPT_COLLARS_UNITS},       \
        {"surveys-units", required_argument, NULL, OPT_SURVEYS_UNITS},       \
        {"structures-units", required_argument, NULL, OPT_STRUCTURES_UNITS}, \
        {"collars-dip-convention", required_argument, NULL, OPT_COLLARS_DIP}, \
        {"surveys-dip-convention", required_argument, NULL, OPT_SURVEYS_DIP}, \
        {"collars-columns", required_argument, NULL, OPT_COLLARS_COLUMNS},   \
        {"surveys-columns", required_argument, NULL, OPT_SURVEYS_COLUMNS},   \
        {"structures-columns", required_argument, NULL, OPT_STRUCTURES_COLUMNS}, \
        {"collar-station", no_argument, NULL, OPT_COLLAR_STATION},           \
        {"reject-station", required_argument, NULL, OPT_REJECT_STATION},     \
        {"output-delimiter", required_argument, NULL, OPT_OUTPUT_DELIMITER}, \
        {"output-decimal-mark", required_argument, NULL, OPT_OUTPUT_DECIMAL}, \
        {"crs", required_argument, NULL, OPT_CRS},                           \
        {"local-grid", required_argument, NULL, OPT_LOCAL_GRID},             \
        {"survey-date", required_argument, NULL, OPT_SURVEY_DATE},           \
        {"magnetic-model", required_argument, NULL, OPT_MAGNETIC_MODEL},     \
        {"survey-reference", required_argument, NULL, OPT_SURVEY_REFERENCE}, \
        {"output", required_argument, NULL, 'o'},                            \
        {"quiet", no_argument, NULL, 'q'}, {"help", no_argument, NULL, 'h'}

/* Help text for the shared options. */
extern const char cli_common_help[];

void cli_common_init(cli_common *c, const char *command);
void cli_common_free(cli_common *c);

/* A command's own option handler: apply option opt with its argument (NULL
 * for a flag). 0 when applied; -1 with a phrase in why (such as "'abc' is
 * not a number") when the value cannot be used. */
typedef int (*cli_option_fn)(void *ctx, int opt, const char *arg, char *why, size_t whylen);

/* Parse a command's options. First the project file (-p/--project), whose
 * keys map onto the long options in longopts, then the command line, which
 * overrides it. Shared options go into c, the rest through own(ctx, ...).
 * For -h the help text is printed, then the shared help when shared_help.
 * Returns 0 to go on, -1 after help, EXIT_USAGE on a usage error and
 * EXIT_DATA on a fault in the project file (messages printed). Positional
 * arguments are left at argv[optind..]. */
int cli_parse(int argc, char **argv, cli_common *c, const struct option *longopts,
              const char *help, int shared_help, cli_option_fn own, void *ctx);

/* A list of input files (core logs). */
typedef struct cli_files {
    const char **path; /* borrowed strings */
    size_t n;
    int from_options;  /* the list came from the command line */
} cli_files;

/* Add a file: 0, or -1 with why filled. The first file the command line adds
 * replaces those of the project file. */
int cli_files_add(cli_files *f, const cli_common *c, const char *path, char *why,
                  size_t whylen);

/* Positional arguments argv[optind..], when there are any, join the command
 * line's files and replace the project file's. 0 or -1. */
int cli_files_from_args(cli_files *f, const cli_common *c, int argc, char **argv);

/* EXIT_USAGE (message printed) when standard input (-) is named twice, else 0. */
int cli_files_stdin_once(const cli_files *f, const char *command);

void cli_files_free(cli_files *f);

/* Check the options after parsing (decimal comma needs ';', ...). 0 ok. */
int cli_common_finish(cli_common *c, int need_program);

/* Value helpers for option handlers: 0 ok, -1 with why filled. */
int cli_value_number(const char *arg, double lo, double hi, double *value, char *why,
                     size_t whylen);
int cli_value_choice(const char *arg, const char *const *names, int count, int *value,
                     char *why, size_t whylen);
/* "K/N": shard K of N (1 <= K <= N <= 1,000,000). */
int cli_value_shard(const char *arg, unsigned *shard, unsigned *shards, char *why, size_t whylen);

/* ---- the tables' settings ---- */

/* The name of a table as the project file's section spells it. */
const char *cli_table_name(cli_table_id id);

/* How to read a table: its own settings over the defaults (converted tables
 * take only their own, and the command line's format: corax writes them). */
corax_table_settings cli_table_settings(const cli_common *c, cli_table_id id);

/* A table's dip convention (collars and surveys). */
corax_dip_convention cli_table_dip(const cli_common *c, cli_table_id id);

/* Where a core log's interval puts its reading. */
cli_interval cli_interval_depth(const cli_common *c);

/* Apply a key of a table's section in the project file ([collars] units =
 * feet, [collars] hole = Hole ID, ...): 0 applied, 1 a path (the caller
 * applies it as an option), -1 with why filled. */
int cli_table_key(cli_common *c, cli_table_id id, const char *key, const char *value,
                  char *why, size_t whylen);

/* The table id of a project section's name, or -1. */
int cli_table_section(const char *section);

/* Table settings by name, for options and project keys alike: 0 with
 * *value set, -1 with why filled. Delimiter: comma, semicolon, tab, auto
 * (',' and ';' too); decimal: point, comma, auto; units: metres, feet (0, 1);
 * dip: a convention's name. auto gives 0. */
int cli_value_delimiter(const char *arg, int *value, char *why, size_t whylen);
int cli_value_decimal(const char *arg, int *value, char *why, size_t whylen);
int cli_value_units(const char *arg, int *value, char *why, size_t whylen);
int cli_value_dip(const char *arg, int *value, char *why, size_t whylen);

/* The corrections' options (--declination, --convergence, --crs,
 * --local-grid, --survey-date, --magnetic-model, --survey-reference): 1
 * applied, 0 not one of them, -1 with why filled. */
int cli_corrections_option(cli_common *c, int opt, const char *arg, char *why, size_t whylen);

/* 1 when any of them asks for more than the default (no correction). */
int cli_corrections_asked(const cli_common *c);

/* After parsing, for a command that loads a drill program: check that they
 * go together, read the magnetic model, and hand the corrector to the loader.
 * 0, or the exit status with the message printed. */
int cli_corrections_prepare(cli_common *c);

/* Record them in a .about file: the model and its dates, the CRS, the local
 * grid, and the sign convention. */
void cli_corrections_about(cli_about *a, const cli_common *c);

void cli_corrections_free(cli_corrections *k);

/* Load the drill program, printing findings; NULL (message printed) when it
 * cannot be used. */
corax_program *cli_load_program(cli_common *c);

/* The same into *prog, keeping every finding in *found (for check): an
 * exit status, the message printed when it is not EXIT_OK. */
int cli_load_program_findings(cli_common *c, corax_program **prog, corax_findings *found);

/* What a command does after cli_parse(): given what parsing returned, 1 to go
 * on, with the drill program loaded into *prog when want_program (else NULL);
 * 0 to stop, with *status the exit status (0 after --help, the usage error,
 * or a data error when the program cannot be loaded) and c freed. */
int cli_begin(cli_common *c, int parsed, int want_program, corax_program **prog, int *status);

/* The exit status of a job's status: 0 for CORAX_OK, EXIT_USAGE for what it
 * could not do as asked (CORAX_EARG), else EXIT_DATA. */
int cli_status(corax_status st);

/* Messages on stderr: `corax: FILE:LINE: message` or `corax: message`. */
void cli_error(const char *file, long line, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));
void cli_error_record(const corax_error *err, corax_status st);
void cli_finding(const corax_finding *f);

/* A library job's message, as corax_message says (notes and warnings left
 * out when quiet); cli_on_message is the job's callback (user: the
 * cli_common). */
void cli_message(const cli_common *c, const corax_message *m);
void cli_on_message(void *user, const corax_message *m);

/* A note on stderr, `corax: note: message`, unless --quiet. */
void cli_note(const cli_common *c, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

/* A usage error: prints the message and a pointer to --help; returns EXIT_USAGE. */
int cli_usage(const char *command, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

/* The record of what a run assumed: the run, the tables read so far and the
 * survey's settings; the command's own sections follow. */
cli_about *cli_about_new(const char *command, const cli_common *c);
/* Write it (when there is somewhere to write) and free it; 0 ok. */
int cli_about_commit(cli_about *a, const cli_common *c);
/* Free it unwritten (a failed run); NULL allowed. */
void cli_about_discard(cli_about *a);
/* A new record with a job's record after it, committed. */
int cli_about_job(const char *command, const cli_common *c, const corax_record *job);

/* Progress of a long run on standard error, with the time left: shown only
 * when standard error is a terminal and the run is not quiet, not before a
 * second has passed, and at most four times a second. */
typedef struct cli_progress {
    int on, shown;
    const char *what, *unit; /* "uncertainty", "readings" */
    double total;            /* 0: unknown (no percentage, no estimate) */
    double start, last;
    double after;            /* seconds before anything shows */
} cli_progress;

void cli_progress_start(cli_progress *p, const cli_common *c, const char *what,
                        const char *unit, double total);
void cli_progress_set(cli_progress *p, double done);
void cli_progress_end(cli_progress *p);

/* A step of a long run, "corax: COMMAND: ...", on a terminal only (as
 * progress). */
void cli_phase(const cli_common *c, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

/* The progress callback of a job (user: the cli_common): each stage shown
 * as cli_progress shows it, a phase as cli_phase. */
void cli_on_stage(void *user, corax_stage *stage);

/* ---- the run's files ---- */

/* Note an input or output of the run, with the option that names it (for
 * messages); NULL and "-" are ignored. cli_common_finish() notes the shared
 * ones (--collars, --surveys, the project file, -o and the record). */
void cli_input(cli_common *c, const char *option, const char *path);
void cli_output(cli_common *c, const char *option, const char *path);

/* No output may be an input or another output (same device and inode, or the
 * same resolved name): 0, or EXIT_USAGE with the message printed. */
int cli_files_check(cli_common *c);

/* The end of a run: with rc EXIT_OK, every held output is made public (an
 * exit status, the message printed when that fails); otherwise all are
 * removed and rc returned. */
int cli_run_end(cli_common *c, int rc);

/* Remove the temporaries of this set when a signal stops the process. */
void cli_signals(void);
void cli_files_watch(corax_outputs *set);

/* The general help, one command's help (EXIT_USAGE for no such command),
 * and the project file's sections and keys. */
void cli_main_help(FILE *f);
int cli_command_help(const char *name);
void cli_project_help(FILE *f);

/* One reading at the core shed (cli/convert_one.c): a labelled answer on
 * standard output. Angles in degrees; NaN for what was not given. */
int convert_one_reading(const cli_common *c, const corax_convert_options *o, double hole_azimuth,
                        double hole_dip, double alpha, double beta, double gamma,
                        const double plane[2], const double line[2]);

/* Commands. */
int cmd_export(int argc, char **argv);
int cmd_section(int argc, char **argv);
int cmd_trace(int argc, char **argv);
int cmd_convert(int argc, char **argv);
int cmd_check(int argc, char **argv);
int cmd_stereonet(int argc, char **argv);
int cmd_help(int argc, char **argv);
int cmd_plan(int argc, char **argv);
int cmd_merge(int argc, char **argv);
int cmd_solve(int argc, char **argv);

#endif
