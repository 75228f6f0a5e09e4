/* cli: reading converted tables (structure rows) for the commands that draw
 * or export them, with every faulty row reported at its line. */
#include <string.h>

#include "cli/cli.h"
#include "io/fields.h"


int cli_converted_open(const cli_common *c, const char *path, cli_converted *t)
{
    long col[CORAX_STRUCTURE_COLUMNS];
    corax_error err;
    memset(t, 0, sizeof *t);
    t->path = path;
    t->c = c;
    corax_table_settings ts = cli_table_settings(c, CLI_CONVERTED);
    t->unit = ts.unit;
    corax_error_clear(&err);
    corax_status st = corax_reader_open(path, ts.format, &t->reader, &err);
    if (st == CORAX_OK)
        st = corax_table_header(t->reader, corax_structure_column_names, CORAX_STRUCTURE_COLUMNS,
                                CORAX_STRUCTURE_REQUIRED, ts.columns, col, &t->width, &t->header,
                                &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        corax_reader_close(t->reader);
        t->reader = NULL;
        return EXIT_DATA;
    }
    corax_structure_columns_set(&t->columns, col);
    corax_table_info info;
    corax_reader_info(t->reader, &info);
    t->decimal = info.format.decimal;
    cli_progress_start(&t->progress, c, path, "bytes", cli_file_size(path));
    return EXIT_OK;
}

int cli_converted_next(cli_converted *t, corax_row *row, corax_structure *s)
{
    corax_error err;
    char why[240];
    corax_error_clear(&err);
    for (;;) {
        corax_status st = corax_reader_next(t->reader, row, &err);
        if (st == CORAX_END)
            return 0;
        if (++t->rows % 65536 == 0)
            cli_progress_set(&t->progress, (double)corax_reader_offset(t->reader));
        if (st != CORAX_OK) {
            cli_problem(&t->problems, err.file[0] ? err.file : NULL, err.line, "%s",
                        err.message[0] ? err.message : corax_strerror(st));
            return 0;
        }
        const char *ragged = corax_field_ragged(row, t->width, why, sizeof why);
        if (!ragged &&
            corax_structure_read(row, &t->columns, t->decimal, s, why, sizeof why) == CORAX_OK) {
            s->depth *= t->unit;
            s->position.x *= t->unit;
            s->position.y *= t->unit;
            s->position.z *= t->unit;
            return 1;
        }
        cli_problem(&t->problems, t->path, row->line, "%s", why);
    }
}

int cli_converted_close(cli_converted *t)
{
    if (t->reader) {
        corax_table_info info;
        corax_reader_info(t->reader, &info);
        cli_table_done(t->c, CLI_CONVERTED, t->path, &info);
        cli_progress_end(&t->progress);
    }
    corax_reader_close(t->reader);
    t->reader = NULL;
    char what[600];
    snprintf(what, sizeof what, "the converted table %s", t->path);
    return cli_problems_end(&t->problems, what);
}
