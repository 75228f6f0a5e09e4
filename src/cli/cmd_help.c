/* cli: `corax help [TOPIC]`: the commands, one command's options, the column
 * names corax takes without a mapping, or the project file's keys. */
#include <stdio.h>
#include <string.h>

#include "cli/cli.h"

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
