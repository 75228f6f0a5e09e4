/* cli: `corax merge`, the shards of a convert run (convert --shard K/N, run
 * on any machines) put together as the single run would have written them. */
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"

static const char merge_help[] =
    "usage: corax merge [--structures LOG]... [-o FILE] SHARD1 SHARD2 ... SHARDN\n"
    "\n"
    "Put the converted tables of convert --shard 1/N, 2/N, ... N/N together, byte\n"
    "for byte as one convert run of the same logs would have written them. The\n"
    "core logs (--structures, or the project's) are read again for the order of\n"
    "their rows: each row comes from its hole's shard. SHARDs are given in order,\n"
    "1 to N, and must be of these logs read with the same settings (the table\n"
    "options --delimiter, --structures-columns, ...). A shard that runs short or\n"
    "long, or holds another hole, is an error, and nothing is written.\n"
    "\n"
    "  --structures FILE     a core log the shards were converted from (may repeat,\n"
    "                        in the order convert read them)\n"
    "\n";

enum { OPT_STRUCTURES = OPT_COMMAND_BASE };

typedef struct merge_opts {
    cli_common c;
    cli_files logs;
} merge_opts;

static int merge_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    merge_opts *o = ctx;
    if (opt == OPT_STRUCTURES)
        return cli_files_add(&o->logs, &o->c, arg, why, wl);
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, merge_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        {"structures", required_argument, NULL, OPT_STRUCTURES},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, merge_help, 1, merge_option, o);
    if (rc != 0)
        return rc;
    if (o->logs.n == 0)
        return cli_usage("merge", "no core log: name the logs the shards were converted from "
                                  "with --structures (or in the project file)");
    if (optind >= argc)
        return cli_usage("merge", "no shards: name the outputs of convert --shard 1/N .. N/N, "
                                  "in order");
    size_t stdin_count = 0;
    for (size_t i = 0; i < o->logs.n; i++) {
        stdin_count += strcmp(o->logs.path[i], "-") == 0;
        cli_input(&o->c, "a core log", o->logs.path[i]);
    }
    for (int i = optind; i < argc; i++) {
        stdin_count += strcmp(argv[i], "-") == 0;
        cli_input(&o->c, "a shard", argv[i]);
    }
    if (stdin_count > 1)
        return cli_usage("merge", "standard input (-) can be read only once");
    return cli_common_finish(&o->c, 0);
}

int cmd_merge(int argc, char **argv)
{
    merge_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "merge");
    int rc = parse(argc, argv, &o);
    if (rc == 0) {
        corax_table_settings t = cli_table_settings(&o.c, CLI_STRUCTURES);
        corax_merge_job_summary sum = {0, NULL};
        corax_record *record = corax_record_new();
        o.c.job.record = record;
        rc = cli_status(corax_merge_job_run(&o.c.job, &t, o.logs.path, o.logs.n,
                                            (const char *const *)argv + optind,
                                            (size_t)(argc - optind), o.c.output, &sum));
        o.c.job.record = NULL;
        if (rc == EXIT_OK && !o.c.quiet)
            fprintf(stderr, "corax: %zu rows from %d shards\n", sum.rows, argc - optind);
        if (rc == EXIT_OK && cli_about_job("merge", &o.c, record) != 0)
            rc = EXIT_DATA;
        corax_record_free(record);
    }
    cli_files_free(&o.logs);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc < 0 ? EXIT_OK : rc;
}
