/* cli: `corax stereonet`, nets and orientation statistics of converted
 * structures, grouped and filtered by their columns. */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "cli/cli.h"

static const char stereonet_help[] =
    "usage: corax stereonet [options] CONVERTED.csv... [-o NET.svg] [--stats STATS.csv]\n"
    "\n"
    "Draw a stereonet (lower hemisphere, SVG) of converted structures and compute\n"
    "their orientation statistics. A plane is a row with numbers in dip and\n"
    "dip_direction, a line a row with numbers in trend and plunge.\n"
    "\n"
    "  --projection P        equal-area (default) or equal-angle\n"
    "  --planes HOW          poles (default), great-circles or both\n"
    "  --contours METHOD     kamb (Kamb 1959 counting, default), smooth (modified\n"
    "                        Kamb, exponential smoothing, Vollmer 1995) or none\n"
    "  --contour-step SIGMA  contour interval in standard deviations (default 2)\n"
    "  --terzaghi            weight planes by Terzaghi (1965) against the bias of\n"
    "                        sampling along the hole (needs hole_azimuth, hole_plunge)\n"
    "  --small-circles       draw a reading with alpha but no plane (unoriented, or\n"
    "                        beta from an arbitrary line) as the small circle its\n"
    "                        pole lies on, 90 - alpha from the hole (needs alpha,\n"
    "                        hole_azimuth, hole_plunge; drawn only: such rows enter no\n"
    "                        statistics); --where picks the sets\n"
    "  --terzaghi-min-angle DEG\n"
    "                        planes closer than DEG to parallel with the hole weigh\n"
    "                        as at DEG (default 15)\n"
    "  --group-by COLUMN     one set per value of COLUMN (e.g. kind or hole)\n"
    "  --where COLUMN=VALUE  keep only rows whose COLUMN is VALUE (without regard to\n"
    "                        case); repeat for more: values of one column are\n"
    "                        alternatives, different columns must all match\n"
    "  --net-per-group       one net per group, side by side (default: every group\n"
    "                        on one net, with a legend)\n"
    "  --title TEXT          the page title\n"
    "  --stats FILE          statistics, one row per group and kind of data\n"
    "\n"
    "Rows without angles (unoriented readings) are skipped and counted; a row with\n"
    "a faulty value is an error, and nothing is written. The statistics: Fisher\n"
    "mean, kappa and alpha95 (empty for fewer than 3 readings), the orientation\n"
    "tensor's eigenvalues and principal axes, Woodcock's K and C.\n"
    "\n";

enum {
    OPT_PROJECTION = OPT_COMMAND_BASE,
    OPT_PLANES,
    OPT_CONTOURS,
    OPT_CONTOUR_STEP,
    OPT_TERZAGHI,
    OPT_MIN_ANGLE,
    OPT_GROUP_BY,
    OPT_WHERE,
    OPT_NET_PER_GROUP,
    OPT_TITLE,
    OPT_STATS,
    OPT_SMALL_CIRCLES,
};

typedef struct where_rule {
    char *column, *value; /* one allocation: column, NUL, value */
} where_rule;

typedef struct stereo_opts {
    cli_common c;
    corax_net_style style;
    const char *stats, *group_by, *title;
    where_rule *where;
    size_t nwhere;
    double min_angle; /* degrees */
    int net_per_group;
    int small_circles;
} stereo_opts;

/* ---- options ---- */

static int add_where(stereo_opts *o, const char *arg, char *why, size_t wl)
{
    const char *eq = strchr(arg, '=');
    if (!eq || eq == arg) {
        snprintf(why, wl, "'%s' is not COLUMN=VALUE", arg);
        return -1;
    }
    where_rule *w = realloc(o->where, (o->nwhere + 1) * sizeof *w);
    char *copy = strdup(arg);
    if (w)
        o->where = w;
    if (!w || !copy) {
        free(copy);
        snprintf(why, wl, "out of memory");
        return -1;
    }
    copy[eq - arg] = '\0';
    o->where[o->nwhere].column = copy;
    o->where[o->nwhere].value = copy + (eq - arg) + 1;
    o->nwhere++;
    return 0;
}

static int stereonet_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    static const char *const projections[] = {"equal-area", "equal-angle"};
    static const char *const planes[] = {"poles", "great-circles", "both"};
    static const char *const contours[] = {"kamb", "smooth", "none"};
    stereo_opts *o = ctx;
    int k = 0;
    switch (opt) {
    case OPT_PROJECTION:
        if (cli_value_choice(arg, projections, 2, &k, why, wl))
            return -1;
        o->style.projection = (corax_projection)k;
        return 0;
    case OPT_PLANES:
        if (cli_value_choice(arg, planes, 3, &k, why, wl))
            return -1;
        o->style.planes = (unsigned)k + 1; /* 1 poles, 2 great circles, 3 both */
        return 0;
    case OPT_CONTOURS:
        if (cli_value_choice(arg, contours, 3, &k, why, wl))
            return -1;
        o->style.contours = k < 2;
        o->style.density = k == 1 ? CORAX_DENSITY_SMOOTH : CORAX_DENSITY_KAMB;
        return 0;
    case OPT_CONTOUR_STEP: return cli_value_number(arg, 0.1, 100, &o->style.contour_step, why, wl);
    case OPT_TERZAGHI: o->style.weighted = 1; return 0;
    case OPT_MIN_ANGLE: return cli_value_number(arg, 0.5, 60, &o->min_angle, why, wl);
    case OPT_GROUP_BY: o->group_by = arg; return 0;
    case OPT_WHERE: return add_where(o, arg, why, wl);
    case OPT_NET_PER_GROUP: o->net_per_group = 1; return 0;
    case OPT_TITLE: o->title = arg; return 0;
    case OPT_STATS: o->stats = arg; return 0;
    case OPT_SMALL_CIRCLES: o->small_circles = 1; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, stereo_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        {"projection", required_argument, NULL, OPT_PROJECTION},
        {"planes", required_argument, NULL, OPT_PLANES},
        {"contours", required_argument, NULL, OPT_CONTOURS},
        {"contour-step", required_argument, NULL, OPT_CONTOUR_STEP},
        {"terzaghi", no_argument, NULL, OPT_TERZAGHI},
        {"terzaghi-min-angle", required_argument, NULL, OPT_MIN_ANGLE},
        {"group-by", required_argument, NULL, OPT_GROUP_BY},
        {"where", required_argument, NULL, OPT_WHERE},
        {"net-per-group", no_argument, NULL, OPT_NET_PER_GROUP},
        {"title", required_argument, NULL, OPT_TITLE},
        {"stats", required_argument, NULL, OPT_STATS},
        {"small-circles", no_argument, NULL, OPT_SMALL_CIRCLES},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, stereonet_help, 1, stereonet_option, o);
    if (rc != 0)
        return rc;
    if (optind >= argc)
        return cli_usage("stereonet", "no input: name one or more converted tables");
    if (!o->c.project && /* a shared project file may name them for other commands */
        (o->c.collars || o->c.surveys || o->c.all.columns || cli_corrections_asked(&o->c)))
        return cli_usage("stereonet", "--collars, --surveys, --columns and the survey "
                                      "corrections (--declination, --convergence, --crs, ...) "
                                      "do not apply: stereonet reads converted tables, whose "
                                      "columns carry corax's names");
    if (o->stats && strcmp(o->stats, "-") == 0 && strcmp(o->c.output, "-") == 0)
        return cli_usage("stereonet", "the net and --stats cannot both go to standard output");
    o->style.min_angle = corax_rad(o->min_angle);
    for (int i = optind; i < argc; i++)
        cli_input(&o->c, "a converted table", argv[i]);
    cli_output(&o->c, "--stats", o->stats);
    return cli_common_finish(&o->c, 0);
}

static int run(stereo_opts *o, int nfiles, char **files)
{
    corax_stereonet_where *where = calloc(o->nwhere + 1, sizeof *where);
    if (!where) {
        cli_error(NULL, 0, "out of memory");
        return EXIT_DATA;
    }
    for (size_t i = 0; i < o->nwhere; i++)
        where[i] = (corax_stereonet_where){o->where[i].column, o->where[i].value};
    corax_stereonet_job_options j = corax_stereonet_job_options_default();
    j.style = o->style;
    j.min_angle = o->min_angle;
    j.net_per_group = o->net_per_group;
    j.small_circles = o->small_circles;
    j.group_by = o->group_by;
    j.where = where;
    j.nwhere = o->nwhere;
    j.title = o->title;
    j.stats = o->stats;
    j.format = cli_table_settings(&o->c, CLI_CONVERTED).format;
    corax_stereonet_job_summary sum;
    corax_record *record = corax_record_new();
    o->c.job.record = record;
    int rc = cli_status(corax_stereonet_job_run(&o->c.job, &j, (const char *const *)files,
                                                (size_t)nfiles, o->c.output, &sum));
    o->c.job.record = NULL;
    if (rc == EXIT_OK && cli_about_job("stereonet", &o->c, record) != 0)
        rc = EXIT_DATA;
    corax_record_free(record);
    free(where);
    return rc;
}

int cmd_stereonet(int argc, char **argv)
{
    stereo_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "stereonet");
    o.style = corax_net_style_default();
    o.min_angle = 15.0;
    int rc = parse(argc, argv, &o);
    if (rc == 0)
        rc = run(&o, argc - optind, argv + optind);
    else if (rc < 0)
        rc = EXIT_OK;
    for (size_t i = 0; i < o.nwhere; i++)
        free(o.where[i].column);
    free(o.where);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc;
}
