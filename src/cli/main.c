/* cli: the corax command. Dispatches to one function per command; knows argv,
 * stderr and exit codes so the library does not have to. `corax help`: the
 * commands, one command's options, the column names corax takes without a
 * mapping, or the project file's keys. */
#include <gsl/gsl_errno.h>
#include <stdio.h>
#include <string.h>

#include "cli/cli.h"

typedef struct command {
    const char *name;
    int (*run)(int argc, char **argv);
    const char *summary;
} command;

static const command commands[] = {
    {"trace", cmd_trace, "desurvey holes: position and direction down each hole"},
    {"convert", cmd_convert, "core readings to true orientations at real coordinates"},
    {"check", cmd_check, "QA of a drill program: survey and orientation findings, with a report"},
    {"solve", cmd_solve, "planes from alpha-only readings of one feature in several holes"},
    {"stereonet", cmd_stereonet, "stereonets and orientation statistics of converted structures"},
    {"section", cmd_section, "a cross-section: structures in a slab with apparent dips, drawn"},
    {"export", cmd_export, "structures and hole traces for 3-D modelling (CSV, VTK)"},
    {"merge", cmd_merge, "the shards of convert --shard K/N put together as one run's output"},
    {"plan", cmd_plan, "drill planning: what planned holes would see, the best direction"},
    {"help", cmd_help, "help on a command, the column names, or the project file"},
};

enum { NCOMMANDS = sizeof commands / sizeof commands[0] };

void cli_main_help(FILE *f)
{
    fputs("usage: corax COMMAND [options] [FILE...]\n"
          "\n"
          "corax turns oriented drill core readings and hole surveys into located,\n"
          "true orientations, for a whole drill program.\n"
          "\n"
          "Commands:\n",
          f);
    for (int i = 0; i < NCOMMANDS; i++)
        fprintf(f, "  %-10s %s\n", commands[i].name, commands[i].summary);
    fputs("\n'corax COMMAND --help' (or 'corax help COMMAND') shows a command's options;\n"
          "'corax help columns' the column names corax takes; 'corax help project' the\n"
          "project file's sections and keys; 'corax --version' the version.\n",
          f);
}

int cli_command_help(const char *name)
{
    for (int i = 0; i < NCOMMANDS; i++)
        if (strcmp(name, commands[i].name) == 0) {
            char *argv[] = {(char *)commands[i].name, (char *)"--help", NULL};
            return commands[i].run(2, argv);
        }
    return cli_usage(NULL, "no help on '%s': name a command, columns or project", name);
}

/* Every logical column, its meaning, and the header names taken for it. */
static void help_columns(FILE *f)
{
    fputs("Columns corax reads, and the header names it takes for each without a\n"
          "mapping. Names match without regard to case, and a space, an underscore, a\n"
          "hyphen and a full stop count as the same mark (\"Hole ID\" is hole_id). Any\n"
          "other header name can be given: --columns NAME=HEADER (all tables),\n"
          "--collars-columns, --surveys-columns, --structures-columns, or NAME = HEADER\n"
          "in a table's section of the project file ([collars], [surveys], ...).\n"
          "A name given there must be in the table: it never falls back to these.\n"
          "\n",
          f);
    const char *const *alias, *meaning, *name;
    for (size_t i = 0; (name = corax_column_at(i, &alias, &meaning)) != NULL; i++) {
        fprintf(f, "  %-16s %s\n", name, meaning);
        if (alias[0]) {
            fputs("  ", f);
            fprintf(f, "%-16s also:", "");
            for (size_t k = 0; alias[k]; k++)
                fprintf(f, " %s", alias[k]);
            fputc('\n', f);
        }
    }
}

int cmd_help(int argc, char **argv)
{
    if (argc < 2) {
        cli_main_help(stdout);
        return EXIT_OK;
    }
    const char *topic = argv[1];
    if (strcmp(topic, "columns") == 0) {
        help_columns(stdout);
        return EXIT_OK;
    }
    if (strcmp(topic, "project") == 0) {
        cli_project_help(stdout);
        return EXIT_OK;
    }
    return cli_command_help(topic);
}

int main(int argc, char **argv)
{
    gsl_set_error_handler_off(); /* the library reports GSL failures as statuses */
    cli_signals();               /* a stopped run leaves no temporary files */
    if (argc < 2) {
        cli_main_help(stderr);
        return EXIT_USAGE;
    }
    if (strcmp(argv[1], "--help") == 0 || strcmp(argv[1], "-h") == 0) {
        cli_main_help(stdout);
        return fflush(stdout) == 0 ? EXIT_OK : EXIT_DATA;
    }
    if (strcmp(argv[1], "--version") == 0) {
        printf("corax %s\n", CORAX_VERSION);
        return fflush(stdout) == 0 ? EXIT_OK : EXIT_DATA;
    }
    for (int i = 0; i < NCOMMANDS; i++)
        if (strcmp(argv[1], commands[i].name) == 0) {
            int rc = commands[i].run(argc - 1, argv + 1);
            if (fflush(stdout) != 0 && rc == EXIT_OK) {
                cli_error(NULL, 0, "cannot write to standard output");
                rc = EXIT_DATA;
            }
            return rc;
        }
    return cli_usage(NULL, "'%s' is not a corax command", argv[1]);
}
