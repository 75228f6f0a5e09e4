/* cli: the files of a run. Its inputs and outputs are noted as the options
 * are read, and checked before anything is read or written: no output may be
 * an input or another output. The outputs are held and made public together
 * when the run ends well, and removed when it fails or is stopped by a
 * signal. */
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"

/* The run whose temporaries a signal removes (one run per process). */
static corax_outputs *volatile signalled;

static void on_signal(int sig)
{
    corax_outputs_remove_temporaries(signalled);
    signal(sig, SIG_DFL);
    raise(sig);
}

void cli_signals(void)
{
    signal(SIGINT, on_signal);
    signal(SIGTERM, on_signal);
    signal(SIGHUP, on_signal);
}

void cli_files_watch(corax_outputs *set) { signalled = set; }

static void note(cli_paths *ps, const char *option, const char *path)
{
    if (!ps || !path || strcmp(path, "-") == 0)
        return;
    cli_path *p = realloc(ps->item, (ps->n + 1) * sizeof *p);
    if (!p)
        return;
    ps->item = p;
    ps->item[ps->n++] = (cli_path){option, path};
}

void cli_input(cli_common *c, const char *option, const char *path)
{
    note(c->inputs, option, path);
}

void cli_output(cli_common *c, const char *option, const char *path)
{
    note(c->outputs_named, option, path);
}

int cli_files_check(cli_common *c)
{
    const cli_paths *in = c->inputs, *out = c->outputs_named;
    if (!in || !out)
        return cli_usage(c->command, "out of memory");
    for (size_t i = 0; i < out->n; i++) {
        const cli_path *o = &out->item[i];
        for (size_t k = 0; k < in->n; k++)
            if (corax_path_same(o->path, in->item[k].path))
                return cli_usage(c->command,
                                 "%s %s is also read by this run (%s): corax never writes "
                                 "over its own inputs",
                                 o->option, o->path, in->item[k].option);
        for (size_t k = 0; k < i; k++)
            if (corax_path_same(o->path, out->item[k].path))
                return cli_usage(c->command, "%s and %s both name %s: each output needs a "
                                             "file of its own",
                                 out->item[k].option, o->option, o->path);
    }
    return 0;
}

int cli_run_end(cli_common *c, int rc)
{
    if (rc != EXIT_OK) {
        corax_outputs_discard(c->outputs);
        return rc;
    }
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_outputs_publish(c->outputs, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    return rc;
}
