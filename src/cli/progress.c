/* cli: progress on standard error for long runs, with an estimate of the time
 * left; only when standard error is a terminal and the run is not quiet, so
 * logs and pipes never see it. */
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

#include "cli/cli.h"

static double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

void cli_progress_start(cli_progress *p, const cli_common *c, const char *what,
                        const char *unit, double total)
{
    p->on = !c->quiet && isatty(STDERR_FILENO);
    p->what = what;
    p->unit = unit;
    p->total = total;
    p->start = p->last = now();
    p->shown = 0;
    /* a short run shows nothing; CORAX_PROGRESS_AFTER (seconds) moves the
     * threshold, for the tests */
    const char *after = getenv("CORAX_PROGRESS_AFTER");
    p->after = after ? atof(after) : 1.0;
}

void cli_progress_set(cli_progress *p, double done)
{
    if (!p->on)
        return;
    double t = now();
    if (t - p->last < 0.25 && done < p->total) /* four times a second at most */
        return;
    if (t - p->start < p->after)
        return;
    p->last = t;
    p->shown = 1;
    if (p->total > 0 && done > 0 && done <= p->total) {
        double left = (t - p->start) * (p->total - done) / done;
        fprintf(stderr, "\rcorax: %s: %3.0f%% of %.0f %s, about %.0f s left   ", p->what,
                100.0 * done / p->total, p->total, p->unit, left);
    } else {
        fprintf(stderr, "\rcorax: %s: %.0f %s   ", p->what, done, p->unit);
    }
    fflush(stderr);
}

void cli_progress_end(cli_progress *p)
{
    if (p->on && p->shown)
        fprintf(stderr, "\rcorax: %s: done in %.0f s%40s\n", p->what, now() - p->start, "");
    p->on = 0;
}

void cli_phase(const cli_common *c, const char *fmt, ...)
{
    if (c->quiet || !isatty(STDERR_FILENO))
        return;
    va_list ap;
    fprintf(stderr, "corax: %s: ", c->command);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
}

void cli_on_stage(void *user, corax_stage *s)
{
    const cli_common *c = user;
    cli_progress *p = s->display;
    switch (s->state) {
    case CORAX_STAGE_BEGIN:
        if ((p = malloc(sizeof *p)) != NULL)
            cli_progress_start(p, c, s->what, s->unit, s->total);
        s->display = p;
        break;
    case CORAX_STAGE_STEP:
        if (p)
            cli_progress_set(p, s->done);
        break;
    case CORAX_STAGE_END:
        if (p)
            cli_progress_end(p);
        free(p);
        s->display = NULL;
        break;
    case CORAX_STAGE_PHASE:
        cli_phase(c, "%s", s->what);
        break;
    }
}
