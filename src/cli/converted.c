/* cli: reading converted tables (structure rows) for the commands that draw
 * or export them, with every faulty row reported at its line. */
#include <string.h>

#include "cli/cli.h"
#include "io/fields.h"

enum { MAX_SHOWN = 50 }; /* problems printed before the rest are only counted */

int cli_converted_open(const cli_common *c, const char *path, cli_converted *t)
{
    long col[CORAX_STRUCTURE_COLUMNS];
    corax_error err;
    memset(t, 0, sizeof *t);
    t->path = path;
    corax_error_clear(&err);
    corax_status st = corax_reader_open(path, c->load.format, &t->reader, &err);
    if (st == CORAX_OK)
        st = corax_table_header(t->reader, corax_structure_column_names, CORAX_STRUCTURE_COLUMNS,
                                CORAX_STRUCTURE_REQUIRED, c->columns, col, &t->width, &t->header,
                                &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        corax_reader_close(t->reader);
        t->reader = NULL;
        return EXIT_DATA;
    }
    corax_structure_columns_set(&t->columns, col);
    return EXIT_OK;
}

int cli_converted_next(const cli_common *c, cli_converted *t, corax_row *row,
                       corax_structure *s)
{
    corax_error err;
    char why[240];
    corax_error_clear(&err);
    for (;;) {
        corax_status st = corax_reader_next(t->reader, row, &err);
        if (st == CORAX_END)
            return 0;
        if (st != CORAX_OK) {
            cli_error_record(&err, st);
            t->problems++;
            return 0;
        }
        const char *ragged = corax_field_ragged(row, t->width, why, sizeof why);
        if (!ragged && corax_structure_read(row, &t->columns, c->load.format.decimal, s, why,
                                            sizeof why) == CORAX_OK)
            return 1;
        if (t->problems++ < MAX_SHOWN)
            cli_error(t->path, row->line, "%s", why);
        else if (t->problems == MAX_SHOWN + 1)
            cli_error(t->path, 0, "... and more problems; fix these first");
    }
}

int cli_converted_close(cli_converted *t)
{
    corax_reader_close(t->reader);
    t->reader = NULL;
    if (!t->problems)
        return EXIT_OK;
    cli_error(t->path, 0, "%zu problem%s in the converted table; nothing written", t->problems,
              t->problems == 1 ? "" : "s");
    return EXIT_DATA;
}
