/* cli: `corax plan`, drill planning. What each planned hole would see of the
 * structure sets, where it would pierce the target planes, and a sweep of
 * hole directions scored by how well they sample every set at once. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "corax/plan_drawing.h"
#include "corax/plan_load.h"

static const char plan_help[] =
    "usage: corax plan --holes PLANNED.csv --sets SETS.csv [--targets TARGETS.csv]\n"
    "                  -o SAMPLING.csv [--pierce PIERCE.csv]\n"
    "                  [--sweep azimuth=0:360:5,dip=-45:-90:5 --best BEST.csv --svg SCORE.svg]\n"
    "\n"
    "What planned holes would see of the structures they are drilled to sample,\n"
    "and the best direction to drill them.\n"
    "\n"
    "  --holes FILE          planned holes: hole, x, y, z, azimuth, dip, length;\n"
    "                        optional lift and drift, degrees per 30 m (lift turns\n"
    "                        the hole upward, drift clockwise seen from above; a\n"
    "                        curved plan gets a station every 30 m, desurveyed by\n"
    "                        minimum curvature)\n"
    "  --sets FILE           sets to sample: set, dip, dip_direction; optional kappa\n"
    "                        (Fisher) or cone95 (degrees: the cone about the mean pole\n"
    "                        holding 95% of the poles), and weight (default 1)\n"
    "  --targets FILE        target planes: target, x, y, z, dip, dip_direction\n"
    "  -o FILE               one row per hole and set: hole, set, expected_alpha,\n"
    "                        alpha_sd, expected_beta, terzaghi_factor, status, note\n"
    "  --pierce FILE         one row per hole and target: hole, target, depth, x, y, z,\n"
    "                        alpha, status, note (missed: the closest approach)\n"
    "  --sweep SPEC          directions to try: azimuth=FROM:TO:STEP,dip=FROM:TO:STEP\n"
    "                        (degrees; azimuths clockwise from FROM to TO, dips under\n"
    "                        --dip-convention), every planned hole turned to each\n"
    "  --best FILE           the swept directions, best first: azimuth, dip, score,\n"
    "                        worst_set, worst_alpha\n"
    "  --svg FILE            the score over the directions on a lower-hemisphere net\n"
    "  --title TEXT          the picture's title\n"
    "\n"
    "Along a hole, every metre is counted: expected_alpha and alpha_sd are the mean\n"
    "and spread of the alphas the hole would log (each plane of the set's spread\n"
    "counted as often as the hole crosses it), expected_beta the mean plane's, and\n"
    "terzaghi_factor the planes crossed relative to a hole of the same length square\n"
    "to the set (Terzaghi 1965). score = share of target planes reached x weighted\n"
    "geometric mean of the sets' factors over the program.\n"
    "Status: ok; near-parallel (expected alpha below --near-parallel); parallel (the\n"
    "hole never crosses the set: beta undefined); no-reference-line (near-vertical\n"
    "hole: no beta); missed (a target plane not reached).\n"
    "\n";

enum {
    OPT_HOLES = OPT_COMMAND_BASE,
    OPT_SETS,
    OPT_TARGETS,
    OPT_PIERCE,
    OPT_SWEEP,
    OPT_BEST,
    OPT_SVG,
    OPT_TITLE,
};

typedef struct plan_opts {
    cli_common c;
    corax_plan_job_options j;
    double range[2][3]; /* azimuth and dip: from, to, step, degrees */
} plan_opts;

/* The dip convention of the planned holes and the swept dips, and how the
 * plan's tables are written: from the shared options. */
static corax_dip_convention plan_dips(const cli_common *c)
{
    return cli_table_dip(c, CLI_COLLARS); /* planned holes are collars to be */
}

static corax_plan_load_options plan_tables(const cli_common *c)
{
    corax_table_settings ts = cli_table_settings(c, CLI_DEPTHS);
    corax_plan_load_options lo = {ts.format, ts.columns, plan_dips(c)};
    return lo;
}

/* "azimuth=A:B:S,dip=A:B:S" into o->range. */
static int sweep_spec(plan_opts *o, const char *arg, char *why, size_t wl)
{
    static const char *const keys[] = {"azimuth", "dip"};
    int seen = 0;
    for (const char *p = arg; *p;) {
        size_t n = strcspn(p, ","), k;
        const char *eq = memchr(p, '=', n);
        for (k = 0; k < 2; k++)
            if (eq && (size_t)(eq - p) == strlen(keys[k]) && !memcmp(p, keys[k], strlen(keys[k])))
                break;
        double *v = k < 2 ? o->range[k] : NULL;
        const char *f = eq ? eq + 1 : p, *end = p + n;
        for (int i = 0; v && i < 3; i++) {
            const char *stop = i < 2 ? memchr(f, ':', (size_t)(end - f)) : end;
            if (!stop || corax_parse_number(f, (size_t)(stop - f), '.', &v[i]) != CORAX_NUMBER_OK)
                v = NULL;
            else
                f = stop + 1;
        }
        if (!v || (seen & (1 << k))) {
            snprintf(why, wl, "'%.*s' is not azimuth=FROM:TO:STEP or dip=FROM:TO:STEP (each "
                     "once, in degrees)", (int)n, p);
            return -1;
        }
        seen |= 1 << k;
        p = end + (*end == ',');
    }
    if (seen != 3) {
        snprintf(why, wl, "'%s' needs both azimuth=FROM:TO:STEP and dip=FROM:TO:STEP", arg);
        return -1;
    }
    o->j.sweep = arg;
    return 0;
}

static int plan_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    plan_opts *o = ctx;
    int k = cli_convention_option(&o->j.convert, opt, arg, why, wl);
    if (k)
        return k < 0 ? -1 : 0;
    switch (opt) {
    case OPT_HOLES: o->j.holes = arg; return 0;
    case OPT_SETS: o->j.sets = arg; return 0;
    case OPT_TARGETS: o->j.targets = arg; return 0;
    case OPT_PIERCE: o->j.pierce = arg; return 0;
    case OPT_SWEEP: return sweep_spec(o, arg, why, wl);
    case OPT_BEST: o->j.best = arg; return 0;
    case OPT_SVG: o->j.svg = arg; return 0;
    case OPT_TITLE: o->j.title = arg; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

/* The sweep's directions, from the ranges and the dip convention. */
static int expand_sweep(plan_opts *o)
{
    corax_dip_convention conv = plan_dips(&o->c);
    double *az = o->range[0], *dip = o->range[1], from, to;
    for (int i = 0; i < 2; i++)
        if (corax_dip_to_plunge(dip[i], conv, i ? &to : &from) != CORAX_OK)
            return cli_usage("plan", "--sweep: dip %g is outside the range of %s", dip[i],
                             corax_dip_convention_name(conv));
    o->j.azimuth = (corax_plan_range){corax_rad(az[0]), corax_rad(az[1]), corax_rad(az[2])};
    o->j.plunge = (corax_plan_range){from, to, corax_rad(dip[2])};
    corax_error err;
    corax_error_clear(&err);
    if (corax_plan_directions(o->j.azimuth, o->j.plunge, &o->j.directions, &o->j.ndirections,
                              &err) != CORAX_OK)
        return cli_usage("plan", "--sweep: %s", err.message);
    return 0;
}

static int parse(int argc, char **argv, plan_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        CLI_CONVENTION_OPTIONS,
        {"holes", required_argument, NULL, OPT_HOLES},
        {"sets", required_argument, NULL, OPT_SETS},
        {"targets", required_argument, NULL, OPT_TARGETS},
        {"pierce", required_argument, NULL, OPT_PIERCE},
        {"sweep", required_argument, NULL, OPT_SWEEP},
        {"best", required_argument, NULL, OPT_BEST},
        {"svg", required_argument, NULL, OPT_SVG},
        {"title", required_argument, NULL, OPT_TITLE},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, plan_help, 1, plan_option, o);
    if (rc == -1)
        fputs(cli_convention_help, stdout);
    if (rc != 0)
        return rc;
    if (optind < argc)
        return cli_usage("plan", "'%s': plan reads its tables from --holes, --sets and "
                                 "--targets", argv[optind]);
    if (!o->j.holes || !o->j.sets)
        return cli_usage("plan", "--holes and --sets are both needed");
    if (!o->c.project && (o->c.collars || o->c.surveys || o->c.load.declination != 0.0 ||
                          o->c.load.convergence != 0.0))
        return cli_usage("plan", "--collars, --surveys, --declination and --convergence do "
                                 "not apply: planned holes are given in the grid, as planned");
    if (o->j.pierce && !o->j.targets)
        return cli_usage("plan", "--pierce needs --targets");
    if (o->j.targets && !o->j.pierce && !o->j.sweep)
        return cli_usage("plan", "--targets is used by --pierce and --sweep: give either");
    if (o->j.sweep && !o->j.best && !o->j.svg)
        return cli_usage("plan", "--sweep needs --best or --svg (or both) to write to");
    if ((o->j.best || o->j.svg) && !o->j.sweep)
        return cli_usage("plan", "--best and --svg show a --sweep: give one");
    const char *outputs[] = {o->c.output, o->j.pierce, o->j.best, o->j.svg};
    int to_stdout = 0;
    for (int i = 0; i < 4; i++)
        to_stdout += outputs[i] && strcmp(outputs[i], "-") == 0;
    if (to_stdout > 1)
        return cli_usage("plan", "only one output can go to standard output");
    if (o->j.sweep && (rc = expand_sweep(o)) != 0)
        return rc;
    cli_input(&o->c, "--holes", o->j.holes);
    cli_input(&o->c, "--sets", o->j.sets);
    cli_input(&o->c, "--targets", o->j.targets);
    cli_output(&o->c, "--pierce", o->j.pierce);
    cli_output(&o->c, "--best", o->j.best);
    cli_output(&o->c, "--svg", o->j.svg);
    return cli_common_finish(&o->c, 0);
}

/* The program view, on standard error: how the planned holes together sample
 * each set, and which sets they all sample badly. */
static void report_program(const plan_opts *o, const corax_plan_job_summary *sum)
{
    const cli_common *c = &o->c;
    size_t nh = sum->nholes;
    int sw = 3, hw = 9; /* "set", "best hole" */
    for (size_t i = 0; i < sum->nsets; i++)
        sw = (int)fmax(sw, (double)strlen(sum->set[i].name));
    for (size_t h = 0; h < nh; h++)
        hw = (int)fmax(hw, (double)strlen(sum->hole[h]));
    if (nh == 1)
        cli_note(c, "how the planned hole samples each set:");
    else
        cli_note(c, "how the %zu planned holes sample each set:", nh);
    if (!c->quiet)
        fprintf(stderr, "  %-*s  %-10s  %-*s  %6s  %5s\n", sw, "set", "holes ok", hw,
                "best hole", "factor", "alpha");
    for (size_t i = 0; i < sum->nsets && !c->quiet; i++) {
        const corax_plan_program_set *p = &sum->set[i].program;
        char ok[32];
        snprintf(ok, sizeof ok, "%zu of %zu", p->holes_ok, nh);
        fprintf(stderr, "  %-*s  %-10s  %-*s  %6.3f  %5.1f%s\n", sw, sum->set[i].name, ok, hw,
                sum->set[i].best_hole, p->factor, corax_deg(p->alpha),
                p->badly_sampled ? "  badly sampled" : "");
    }
    for (size_t i = 0; i < sum->nsets && !c->quiet; i++)
        if (sum->set[i].program.badly_sampled)
            cli_error(NULL, 0, "warning: every planned hole is near-parallel to set %s: the "
                               "program samples it badly (best %s, expected alpha %.1f)",
                     sum->set[i].name, sum->set[i].best_hole,
                     corax_deg(sum->set[i].best_alpha));
    if (o->j.ndirections) {
        const corax_plan_direction *d = &o->j.directions[0];
        cli_note(c, "best direction of the sweep: azimuth %.1f, dip %.1f, score %.3f (worst "
                    "sampled %s, expected alpha %.1f)",
                 corax_wrap_degrees(corax_deg(d->azimuth), 1),
                 corax_plunge_to_dip(d->plunge, plan_dips(c)), d->score, sum->worst_set,
                 corax_deg(d->worst_alpha));
    }
}

static int run(plan_opts *o)
{
    o->j.tables = plan_tables(&o->c);
    corax_plan_job_summary sum;
    corax_record *record = corax_record_new();
    o->c.job.record = record;
    int rc = cli_status(corax_plan_job_run(&o->c.job, &o->j, o->c.output, &sum));
    o->c.job.record = NULL;
    if (rc == EXIT_OK && cli_about_job("plan", &o->c, record) != 0)
        rc = EXIT_DATA;
    if (rc == EXIT_OK)
        report_program(o, &sum);
    corax_record_free(record);
    corax_plan_job_summary_clear(&sum);
    return rc;
}

int cmd_plan(int argc, char **argv)
{
    plan_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "plan");
    o.j = corax_plan_job_options_default();
    int rc = parse(argc, argv, &o);
    if (rc == 0)
        rc = run(&o);
    free(o.j.directions);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc < 0 ? EXIT_OK : rc;
}
