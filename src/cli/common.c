/* cli: the drill program loaded for a command, and a job's status as an
 * exit status. */
#include <stdlib.h>

#include "cli/cli.h"
#include "job/job_int.h"

int cli_load_program_findings(cli_common *c, corax_program **prog, corax_findings *found)
{
    return corax_job_program_findings(&c->job, c->collars, c->surveys, &c->load, prog, found) ==
                   CORAX_OK
               ? EXIT_OK
               : EXIT_DATA;
}

corax_program *cli_load_program(cli_common *c)
{
    corax_program *prog = NULL;
    corax_job_program_load(&c->job, c->collars, c->surveys, &c->load, &prog);
    return prog;
}

int cli_begin(cli_common *c, int parsed, int want_program, corax_program **prog, int *status)
{
    *prog = NULL;
    *status = parsed < 0 ? EXIT_OK : parsed;
    if (parsed == 0 && (!want_program || (*prog = cli_load_program(c)) != NULL))
        return 1;
    if (parsed == 0)
        *status = EXIT_DATA;
    cli_common_free(c);
    return 0;
}

int cli_status(corax_status st)
{
    return st == CORAX_OK ? EXIT_OK : st == CORAX_EARG ? EXIT_USAGE : EXIT_DATA;
}
