/* The command line: shared pieces of the commands (internal to src/cli). */
#ifndef CORAX_CLI_H
#define CORAX_CLI_H

#include <getopt.h>
#include <stdio.h>

#include "corax/corax.h"

/* Exit statuses. */
enum { EXIT_OK = 0, EXIT_DATA = 1, EXIT_USAGE = 2 };

typedef struct cli_about cli_about;

/* Options shared by the commands that read a drill program. */
typedef struct cli_common {
    const char *command; /* for messages */
    const char *collars, *surveys;
    const char *output;  /* "-" for standard output */
    const char *about;   /* side file; NULL: OUTPUT.about when output is a file */
    const char *project; /* the project file read, or NULL */
    corax_column_map *columns;
    corax_load_options load;
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
    /* the core conventions, for the commands that read core logs */
    OPT_REFERENCE = 1050,
    OPT_BETA_END,
    OPT_BETA_SENSE,
    OPT_GAMMA_ZERO,
    OPT_GAMMA_SENSE,
    OPT_NEAR_PARALLEL,
    OPT_NEAR_PERPENDICULAR,
    OPT_VERTICAL_LIMIT,
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
        {"vertical-limit", required_argument, NULL, OPT_VERTICAL_LIMIT}

/* Help text for them. */
extern const char cli_convention_help[];

/* Apply a convention option: 1 applied, 0 not one, -1 with why filled. */
int cli_convention_option(corax_convert_options *cv, int opt, const char *arg, char *why,
                          size_t whylen);

/* Record the conventions and thresholds in a .about file. */
void cli_about_conventions(cli_about *a, const corax_convert_options *cv);

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

/* Record the errors in a .about file (the core line's when core_line). */
void cli_about_uncertainty(cli_about *a, const corax_error_model *e, size_t draws, uint64_t seed,
                           int core_line);

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
} cli_files;

/* Add a file: 0, or -1 with why filled. */
int cli_files_add(cli_files *f, const char *path, char *why, size_t whylen);

/* Positional arguments argv[optind..], when there are any, replace the list
 * (a project file's files give way to the command line's). 0 or -1. */
int cli_files_from_args(cli_files *f, int argc, char **argv);

/* EXIT_USAGE (message printed) when standard input (-) is named twice, else 0. */
int cli_files_stdin_once(const cli_files *f, const char *command);

void cli_files_free(cli_files *f);

/* Load a whole table and keep it in *tables (*n of them); NULL with the
 * message printed when it cannot be read. */
corax_table *cli_table_keep(const cli_common *c, const char *path, corax_table ***tables,
                            size_t *n);

/* Check the options after parsing (decimal comma needs ';', ...). 0 ok. */
int cli_common_finish(cli_common *c, int need_program);

/* Value helpers for option handlers: 0 ok, -1 with why filled. */
int cli_value_number(const char *arg, double lo, double hi, double *value, char *why,
                     size_t whylen);
int cli_value_choice(const char *arg, const char *const *names, int count, int *value,
                     char *why, size_t whylen);

/* Load the drill program, printing findings; NULL (message printed) when it
 * cannot be used. */
corax_program *cli_load_program(cli_common *c);

/* What a command does after cli_parse(): given what parsing returned, 1 to go
 * on, with the drill program loaded into *prog when want_program (else NULL);
 * 0 to stop, with *status the exit status (0 after --help, the usage error,
 * or a data error when the program cannot be loaded) and c freed. */
int cli_begin(cli_common *c, int parsed, int want_program, corax_program **prog, int *status);

/* Messages on stderr: `corax: FILE:LINE: message` or `corax: message`. */
void cli_error(const char *file, long line, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));
void cli_error_record(const corax_error *err, corax_status st);
void cli_finding(const corax_finding *f);

/* A note on stderr, `corax: note: message`, unless --quiet. */
void cli_note(const cli_common *c, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

/* A usage error: prints the message and a pointer to --help; returns EXIT_USAGE. */
int cli_usage(const char *command, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

/* The name of a dip convention as the options spell it. */
const char *cli_dip_convention_name(corax_dip_convention c);

/* The record of what a run assumed, written next to its output. */
cli_about *cli_about_new(const char *command, const cli_common *c);
void cli_about_section(cli_about *a, const char *section);
void cli_about_set(cli_about *a, const char *key, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));
/* Write it (when there is somewhere to write) and free it; 0 ok. */
int cli_about_commit(cli_about *a, const cli_common *c);

/* A converted table (one structure a row) being read. */
typedef struct cli_converted {
    const char *path;
    corax_reader *reader;
    corax_structure_columns columns;
    size_t width;      /* fields in its header */
    corax_row header;  /* valid until the first row is read */
    size_t problems;   /* faulty rows met so far */
} cli_converted;

/* Open a converted table and find its columns; 0, or EXIT_DATA with the
 * message printed. */
int cli_converted_open(const cli_common *c, const char *path, cli_converted *t);

/* The next structure: 1 with *row and *s filled, 0 at the end. Faulty rows
 * (ragged, unusable values) are printed as `corax: FILE:LINE: why`, counted
 * and skipped, so that a run reports all of them. */
int cli_converted_next(const cli_common *c, cli_converted *t, corax_row *row,
                       corax_structure *s);

/* Close; EXIT_DATA (with a summary printed) when there were problems. */
int cli_converted_close(cli_converted *t);

/* Orientation runs from a runs table (hole, from, to, optional confidence),
 * sorted by hole and depth. */
typedef struct cli_runs {
    corax_table *table;
    corax_qa_run *run;
    size_t n;
} cli_runs;

/* Read a runs table; its rows that cannot be used become findings (and are
 * left out). 0, or EXIT_DATA with the message printed. */
int cli_runs_load(const cli_common *c, const char *path, cli_runs *runs, corax_findings *found);
void cli_runs_free(cli_runs *runs);

/* The run of a hole (name of len bytes) holding a depth (from <= depth < to),
 * or -1. */
long cli_runs_find(const cli_runs *runs, const char *hole, size_t len, double depth);

/* Whether a confidence word (len bytes, as the log or runs table gives it)
 * says the core has no orientation mark: it is `word` (without regard to case
 * or surrounding blanks). The one place that reads such words. */
int cli_unoriented_confidence(const char *text, size_t len, const char *word);

/* Commands. */
int cmd_export(int argc, char **argv);
int cmd_section(int argc, char **argv);
int cmd_trace(int argc, char **argv);
int cmd_convert(int argc, char **argv);
int cmd_check(int argc, char **argv);
int cmd_stereonet(int argc, char **argv);
int cmd_solve(int argc, char **argv);

#endif
