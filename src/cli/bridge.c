/* cli: stand-ins for what has moved into the library, while the commands
 * that still use them move too. */
#include "cli/cli.h"
#include "job/job_int.h"

void cli_table_done(const cli_common *c, cli_table_id id, const char *path,
                    const corax_table_info *info)
{
    cli_common *w = (cli_common *)c;
    job_table_read(&w->job, (corax_table_role)id, path, cli_table_settings(c, id).unit, info);
}

void cli_tally_warn(const cli_common *c, const char *what, const char *problem,
                    const corax_tally *t, const char *consequence)
{
    corax_job_tally_warn(&((cli_common *)c)->job, what, problem, t, consequence);
}

int cli_table_columns(const cli_common *c, const corax_table *t, const corax_table_settings *ts,
                      const char *const *names, size_t n, long *col)
{
    return job_table_columns(&((cli_common *)c)->job, t, ts, names, n, col) == CORAX_OK ? 0 : -1;
}

const char *cli_code_word(const corax_codes *codes, const char *text, size_t len,
                          corax_tally *unknown, const char *file, size_t file_index, long line)
{
    return job_code_word(codes, text, len, unknown, file, file_index, line);
}

int cli_runs_load(const cli_common *c, const char *path, const corax_codes *codes,
                  corax_tally *unknown, size_t file_index, corax_runs *runs,
                  corax_findings *found)
{
    corax_table_settings ts = cli_table_settings(c, CLI_RUNS);
    return corax_runs_load(&((cli_common *)c)->job, path, &ts, codes, unknown, file_index, runs,
                           found) == CORAX_OK
               ? EXIT_OK
               : EXIT_DATA;
}
