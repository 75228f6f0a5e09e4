/* cli: `corax stereonet`, nets and orientation statistics of converted
 * structures, grouped and filtered by their columns. */
#include <ctype.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "cli/cli.h"
#include "common/grow.h"
#include "corax/stereonet.h"

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

typedef struct group {
    char *name;
    corax_vec3 *poles, *lines;
    double *weight;
    size_t npoles, nlines, pole_cap, line_cap;
    corax_net_circle *circles; /* readings by alpha alone */
    size_t ncircles, circle_cap;
    size_t skipped;
    corax_axial_summary pole_summary, line_summary;
} group;

/* More groups than this make a page no one can read: refuse them. */
enum { MAX_GROUPS = 500 };

typedef struct groups {
    group *item;
    size_t count, cap, last;
    int full;      /* a row would have made group MAX_GROUPS + 1 */
    size_t skipped;        /* rows with no angles (not faults) */
    cli_problems problems; /* faulty rows */
} groups;

/* Columns of one input table (-1 when absent). */
typedef struct columns {
    long dip, dip_direction, trend, plunge, hole_azimuth, hole_plunge, alpha, group;
    long *where;
} columns;

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

/* ---- reading the tables ---- */

static group *find_group(groups *gs, const char *name, size_t len)
{
    if (gs->last < gs->count && strlen(gs->item[gs->last].name) == len &&
        memcmp(gs->item[gs->last].name, name, len) == 0)
        return &gs->item[gs->last];
    for (size_t i = 0; i < gs->count; i++)
        if (strlen(gs->item[i].name) == len && memcmp(gs->item[i].name, name, len) == 0) {
            gs->last = i;
            return &gs->item[i];
        }
    if (gs->count == MAX_GROUPS) {
        gs->full = 1;
        return NULL;
    }
    group *grown = corax_grow(gs->item, gs->count, &gs->cap, sizeof *grown, 16);
    if (!grown)
        return NULL;
    gs->item = grown;
    group *g = &gs->item[gs->count];
    memset(g, 0, sizeof *g);
    if (!(g->name = strndup(name, len)))
        return NULL;
    gs->last = gs->count++;
    return g;
}

/* Append v (and weight w) to a growing array of vectors. */
static int push(corax_vec3 **v, double **weights, size_t *n, size_t *cap, corax_vec3 x, double w)
{
    if (*n == *cap) {
        size_t c = *cap ? 2 * *cap : 64;
        corax_vec3 *p = realloc(*v, c * sizeof *p);
        if (!p)
            return 0;
        *v = p;
        if (weights) {
            double *q = realloc(*weights, c * sizeof *q);
            if (!q)
                return 0;
            *weights = q;
        }
        *cap = c;
    }
    (*v)[*n] = x;
    if (weights)
        (*weights)[*n] = w;
    (*n)++;
    return 1;
}

/* Trim blanks from a cell. */
static const char *trimmed(const char *s, size_t *len)
{
    size_t n = *len;
    while (n && isspace((unsigned char)*s))
        s++, n--;
    while (n && isspace((unsigned char)s[n - 1]))
        n--;
    *len = n;
    return s;
}

static int keep_row(const stereo_opts *o, const corax_table *t, size_t row, const columns *col)
{
    for (size_t i = 0; i < o->nwhere; i++) {
        int any = 0, match = 0;
        for (size_t k = 0; k < o->nwhere; k++) {
            if (strcasecmp(o->where[k].column, o->where[i].column) != 0)
                continue;
            size_t len;
            const char *cell = trimmed(corax_table_cell(t, row, col->where[k], &len), &len);
            any = 1;
            match |= strlen(o->where[k].value) == len &&
                     strncasecmp(cell, o->where[k].value, len) == 0;
        }
        if (any && !match)
            return 0;
    }
    return 1;
}

/* The outcome of reading a pair of angles. */
enum { PAIR_NONE, PAIR_OK, PAIR_BAD };

/* An angle column: its index, name and range. */
typedef struct angle_spec {
    long col;
    const char *name;
    double lo, hi;
} angle_spec;

/* Read two angle columns: both empty (or absent) is PAIR_NONE; both numbers
 * within range PAIR_OK; anything else PAIR_BAD with the reason in why. */
static int read_pair(const corax_table *t, size_t row, const angle_spec spec[2], double value[2],
                     char *why, size_t whylen)
{
    size_t len[2];
    const char *text[2];
    for (int k = 0; k < 2; k++)
        text[k] = trimmed(corax_table_cell(t, row, spec[k].col, &len[k]), &len[k]);
    if (len[0] == 0 && len[1] == 0)
        return PAIR_NONE;
    for (int k = 0; k < 2; k++) {
        corax_number_status ns = corax_table_number(t, row, spec[k].col, &value[k]);
        if (ns == CORAX_NUMBER_EMPTY)
            snprintf(why, whylen, "%s is empty", spec[k].name);
        else if (ns != CORAX_NUMBER_OK)
            snprintf(why, whylen, "%s '%.*s' is not a number", spec[k].name, (int)len[k], text[k]);
        else if (value[k] < spec[k].lo || value[k] > spec[k].hi)
            snprintf(why, whylen, "%s %g is outside [%g, %g]", spec[k].name, value[k], spec[k].lo,
                     spec[k].hi);
        else
            continue;
        return PAIR_BAD;
    }
    return PAIR_OK;
}

/* A faulty row: a problem (the table is refused, as every command does). */
static void row_fault(groups *gs, const corax_table *t, size_t row, const char *why)
{
    cli_problem(&gs->problems, corax_table_path(t), corax_table_line(t, row), "%s", why);
}

static int out_of_memory(void)
{
    cli_error(NULL, 0, "out of memory");
    return EXIT_DATA;
}

/* The hole's direction at a row (hole_azimuth, hole_plunge): PAIR_OK with
 * *dir filled, PAIR_NONE, or PAIR_BAD with why. */
static int hole_direction(const corax_table *t, size_t row,
                          const columns *col, corax_vec3 *dir, char *why, size_t whylen)
{
    const angle_spec spec[2] = {{col->hole_azimuth, "hole_azimuth", 0, 360},
                                {col->hole_plunge, "hole_plunge", -90, 90}};
    double v[2];
    int r = read_pair(t, row, spec, v, why, whylen);
    if (r == PAIR_OK)
        *dir = corax_direction(corax_rad(v[0]), corax_rad(v[1]));
    return r;
}

/* The Terzaghi weight of a plane, from the hole's direction on the row. */
static int plane_weight(const stereo_opts *o, const corax_table *t, size_t row, const columns *col,
                        corax_vec3 normal, double *w, char *why, size_t whylen)
{
    corax_vec3 hole;
    int r = hole_direction(t, row, col, &hole, why, whylen);
    if (r == PAIR_NONE)
        snprintf(why, whylen, "no hole direction for the Terzaghi weight");
    if (r != PAIR_OK)
        return 0;
    *w = corax_terzaghi_weight(normal, hole, corax_rad(o->min_angle));
    return 1;
}

/* A row with alpha and the hole's direction but no plane, as the small
 * circle its pole lies on: 1 drawn, 0 not such a row, -1 out of memory. */
static int small_circle_of(const stereo_opts *o, group *g, const corax_table *t, size_t row,
                           const columns *col)
{
    double alpha;
    corax_vec3 hole;
    char why[200];
    if (!o->small_circles || corax_table_number(t, row, col->alpha, &alpha) != CORAX_NUMBER_OK ||
        !(alpha >= 0 && alpha <= 90) || hole_direction(t, row, col, &hole, why, sizeof why) !=
                                            PAIR_OK)
        return 0;
    corax_net_circle *grown = corax_grow(g->circles, g->ncircles, &g->circle_cap,
                                         sizeof *grown, 64);
    if (!grown)
        return -1;
    g->circles = grown;
    g->circles[g->ncircles++] = (corax_net_circle){hole, corax_rad(90.0 - alpha)};
    return 1;
}

/* One row: its plane and its line into its group. 0, or EXIT_DATA (message
 * printed) when out of memory or groups. */
static int read_row(const stereo_opts *o, groups *gs, const corax_table *t, size_t row,
                    const columns *col)
{
    size_t len = 3;
    const char *name = "all";
    if (col->group >= 0) {
        name = trimmed(corax_table_cell(t, row, col->group, &len), &len);
        if (len == 0)
            name = "(blank)", len = 7;
    }
    group *g = find_group(gs, name, len);
    if (!g && gs->full)
        cli_error(corax_table_path(t), corax_table_line(t, row), "more than %d groups by %s: "
                  "filter with --where or group by another column", MAX_GROUPS, o->group_by);
    else if (!g)
        cli_error(NULL, 0, "out of memory");
    if (!g)
        return EXIT_DATA;
    const angle_spec plane[2] = {{col->dip, "dip", 0, 90}, {col->dip_direction, "dip_direction", 0, 360}};
    const angle_spec line[2] = {{col->trend, "trend", 0, 360}, {col->plunge, "plunge", 0, 90}};
    char why[200];
    double v[2], w = 1.0;
    int used = 0;
    if (corax_table_width(t, row) != corax_table_columns(t)) {
        snprintf(why, sizeof why, "the row has %zu fields but the header has %zu",
                 corax_table_width(t, row), corax_table_columns(t));
        row_fault(gs, t, row, why);
        return 0;
    }
    int r = read_pair(t, row, plane, v, why, sizeof why);
    size_t dd_len;
    trimmed(corax_table_cell(t, row, col->dip_direction, &dd_len), &dd_len);
    if (r == PAIR_BAD && dd_len == 0 && corax_table_number(t, row, col->dip, &v[0]) ==
                                             CORAX_NUMBER_OK && v[0] >= 0 && v[0] <= 90)
        r = PAIR_NONE; /* a dip alone (convert's dip-only rows): no plane, nothing wrong */
    if (r == PAIR_OK) {
        corax_vec3 n = corax_plane_normal((corax_plane){corax_rad(v[0]), corax_rad(v[1])});
        if (o->style.weighted && !plane_weight(o, t, row, col, n, &w, why, sizeof why))
            r = PAIR_BAD;
        else if (!push(&g->poles, &g->weight, &g->npoles, &g->pole_cap, n, w))
            return out_of_memory();
        else
            used = 1;
    }
    int bad = r == PAIR_BAD;
    if (bad)
        row_fault(gs, t, row, why);
    r = read_pair(t, row, line, v, why, sizeof why);
    if (r == PAIR_OK) {
        if (!push(&g->lines, NULL, &g->nlines, &g->line_cap,
                  corax_direction(corax_rad(v[0]), corax_rad(v[1])), 1.0))
            return out_of_memory();
        used = 1;
    } else if (r == PAIR_BAD) {
        row_fault(gs, t, row, why);
        bad = 1;
    }
    if (!used && !bad && (used = small_circle_of(o, g, t, row, col)) < 0)
        return out_of_memory();
    if (!used) {
        g->skipped++;
        gs->skipped++;
    }
    return 0;
}

/* Find the columns of one table; usage errors for unknown --group-by and
 * --where names, data errors for a table without angles. */
static int find_columns(const stereo_opts *o, const corax_table *t, columns *col)
{
    const char *path = corax_table_path(t);
    col->dip = corax_table_find(t, "dip");
    col->dip_direction = corax_table_find(t, "dip_direction");
    col->trend = corax_table_find(t, "trend");
    col->plunge = corax_table_find(t, "plunge");
    col->hole_azimuth = corax_table_find(t, "hole_azimuth");
    col->hole_plunge = corax_table_find(t, "hole_plunge");
    col->alpha = corax_table_find(t, "alpha");
    col->group = o->group_by ? corax_table_find(t, o->group_by) : -1;
    if (o->group_by && col->group < 0)
        return cli_usage("stereonet", "--group-by: %s has no column '%s'", path, o->group_by);
    for (size_t i = 0; i < o->nwhere; i++)
        if ((col->where[i] = corax_table_find(t, o->where[i].column)) < 0)
            return cli_usage("stereonet", "--where: %s has no column '%s'", path,
                             o->where[i].column);
    int planes = col->dip >= 0 && col->dip_direction >= 0;
    int lines = col->trend >= 0 && col->plunge >= 0;
    if (!planes && !lines) {
        cli_error(path, 1, "no dip and dip_direction columns, nor trend and plunge (is this "
                           "corax convert output?)");
        return EXIT_DATA;
    }
    if (!planes)
        col->dip = col->dip_direction = -1;
    if (!lines)
        col->trend = col->plunge = -1;
    if (o->style.weighted && planes && (col->hole_azimuth < 0 || col->hole_plunge < 0)) {
        cli_error(path, 1, "--terzaghi needs the hole_azimuth and hole_plunge columns%s",
                  corax_table_find(t, "hole_dip") >= 0
                      ? " (this table gives hole_dip, whose dip convention it does not state: "
                        "convert it again with this corax)"
                      : "");
        return EXIT_DATA;
    }
    return 0;
}

/* Whether a table that would not load is simply empty (no header row). */
static int is_empty_file(const char *path, corax_table_format format)
{
    corax_reader *r;
    corax_row row;
    if (strcmp(path, "-") == 0 || corax_reader_open(path, format, &r, NULL) != CORAX_OK)
        return 0;
    int empty = corax_reader_next(r, &row, NULL) == CORAX_END;
    corax_reader_close(r);
    return empty;
}

static int read_table(const stereo_opts *o, const char *path, groups *gs)
{
    corax_table *t;
    corax_error err;
    corax_error_clear(&err);
    corax_table_format format = cli_table_settings(&o->c, CLI_CONVERTED).format;
    corax_status st = cli_table_load(&o->c, path, format, &t, &err);
    if (st == CORAX_EFORMAT && is_empty_file(path, format)) {
        if (!o->c.quiet)
            cli_error(path, 0, "warning: the file is empty");
        return 0;
    }
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    long where[o->nwhere + 1];
    columns col = {.where = where};
    int rc = find_columns(o, t, &col);
    for (size_t row = 0; rc == 0 && row < corax_table_rows(t); row++)
        if (keep_row(o, t, row, &col))
            rc = read_row(o, gs, t, row, &col);
    corax_table_free(t);
    return rc;
}

static void groups_free(groups *gs)
{
    for (size_t i = 0; i < gs->count; i++) {
        free(gs->item[i].name);
        free(gs->item[i].poles);
        free(gs->item[i].weight);
        free(gs->item[i].lines);
        free(gs->item[i].circles);
    }
    free(gs->item);
}

static int group_cmp(const void *a, const void *b)
{
    return strcmp(((const group *)a)->name, ((const group *)b)->name);
}

/* ---- statistics ---- */

static int summarise(const stereo_opts *o, groups *gs)
{
    if (gs->count == 0 && !find_group(gs, "all", 3))
        return out_of_memory();
    qsort(gs->item, gs->count, sizeof *gs->item, group_cmp);
    for (size_t i = 0; i < gs->count; i++) {
        group *g = &gs->item[i];
        if (corax_axial_summary_compute(g->poles, o->style.weighted ? g->weight : NULL, g->npoles,
                                        &g->pole_summary) != CORAX_OK ||
            corax_axial_summary_compute(g->lines, NULL, g->nlines, &g->line_summary) != CORAX_OK) {
            cli_error(NULL, 0, "group %s: the statistics failed (out of memory?)", g->name);
            return EXIT_DATA;
        }
    }
    return 0;
}

static const char stats_header[] =
    "group,data,n,n_weighted,rows_skipped,mean_dip,mean_dip_direction,mean_trend,mean_plunge,"
    "kappa,alpha95,eigenvalue1,eigenvalue2,eigenvalue3,axis1_trend,axis1_plunge,axis2_trend,"
    "axis2_plunge,axis3_trend,axis3_plunge,shape_k,strength_c,note\n";

static void write_angle_pair(corax_writer *w, double azimuth, double angle)
{
    corax_writer_number(w, corax_deg(angle), 2);
    corax_writer_azimuth(w, corax_deg(azimuth), 2);
}

static void write_stats_row(corax_writer *w, const group *g, const corax_axial_summary *s,
                            int planes)
{
    const corax_fisher *f = &s->fisher;
    corax_writer_field(w, g->name, strlen(g->name));
    corax_writer_field(w, planes ? "planes" : "lines", planes ? 6 : 5);
    corax_writer_integer(w, (long long)s->n);
    corax_writer_number(w, s->weight_sum, 3);
    corax_writer_integer(w, (long long)g->skipped);
    double trend = NAN, plunge = NAN;
    corax_plane p = {NAN, NAN};
    if (s->n) {
        corax_line_trend_plunge(f->mean, &trend, &plunge);
        if (planes)
            p = corax_plane_from_normal(f->mean, NULL);
    }
    write_angle_pair(w, p.dip_direction, p.dip); /* mean_dip, mean_dip_direction */
    if (planes) /* a plane's mean is its dip and dip direction: no trend and plunge */
        trend = plunge = NAN;
    corax_writer_azimuth(w, corax_deg(trend), 2);
    corax_writer_number(w, corax_deg(plunge), 2);
    corax_writer_number(w, isinf(f->kappa) ? (double)NAN : f->kappa, 2);
    corax_writer_number(w, corax_deg(f->alpha95), 2);
    for (int k = 0; k < 3; k++)
        corax_writer_number(w, s->tensor.eigenvalue[k], 4);
    for (int k = 0; k < 3; k++) {
        double at = NAN, ap = NAN;
        if (s->n >= 2 || (s->n == 1 && k == 0)) /* one reading: only axis 1 means anything */
            corax_line_trend_plunge(s->tensor.axis[k], &at, &ap);
        corax_writer_azimuth(w, corax_deg(at), 2);
        corax_writer_number(w, corax_deg(ap), 2);
    }
    corax_writer_number(w, s->tensor.shape, 3);
    corax_writer_number(w, s->tensor.strength, 3);
    const char *note = "";
    if (s->n == 0)
        note = "no readings";
    else if (s->n < CORAX_FISHER_MIN_READINGS)
        note = "too few readings for kappa and alpha95 (3 needed)";
    else if (isinf(f->kappa))
        note = "readings identical: kappa unbounded";
    corax_writer_field(w, note, strlen(note));
    corax_writer_end_row(w);
}

static corax_writer *stats_table(const stereo_opts *o, const groups *gs)
{
    corax_writer *w;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open_in(o->c.outputs, o->stats, &w, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return NULL;
    }
    corax_writer_text(w, stats_header, sizeof stats_header - 1);
    for (size_t i = 0; i < gs->count; i++) {
        const group *g = &gs->item[i];
        if (g->npoles || !g->nlines) /* a group with nothing still gets its row, n 0 */
            write_stats_row(w, g, &g->pole_summary, 1);
        if (g->nlines)
            write_stats_row(w, g, &g->line_summary, 0);
    }
    return w;
}

/* ---- the net ---- */

static corax_svg *draw(const stereo_opts *o, const groups *gs, char *title)
{
    corax_net_set *sets = calloc(gs->count, sizeof *sets);
    if (!sets)
        return NULL;
    for (size_t i = 0; i < gs->count; i++) {
        const group *g = &gs->item[i];
        sets[i] = (corax_net_set){.name = g->name, .poles = g->poles,
                                  .pole_weight = o->style.weighted ? g->weight : NULL,
                                  .npoles = g->npoles, .lines = g->lines, .nlines = g->nlines,
                                  .pole_summary = &g->pole_summary,
                                  .line_summary = &g->line_summary, .skipped = g->skipped,
                                  .circles = g->circles, .ncircles = g->ncircles};
    }
    corax_net_style style = o->style;
    style.title = title;
    corax_svg *svg = NULL;
    corax_status st = corax_stereonet_page(sets, gs->count, &style, o->net_per_group, &svg);
    free(sets);
    if (st != CORAX_OK)
        cli_error(NULL, 0, "cannot draw the net: %s", corax_strerror(st));
    return svg;
}

static void default_title(const stereo_opts *o, int nfiles, char **files, char *title, size_t len)
{
    if (o->title) {
        snprintf(title, len, "%s", o->title);
        return;
    }
    const char *base = strrchr(files[0], '/');
    base = base ? base + 1 : files[0];
    size_t used = (size_t)snprintf(title, len, "Stereonet of %s", base);
    if (nfiles > 1 && used < len)
        used += (size_t)snprintf(title + used, len - used, " and %d more", nfiles - 1);
    if (o->group_by && used < len)
        snprintf(title + used, len - used, ", by %s", o->group_by);
}

static int write_about(const stereo_opts *o, int nfiles, char **files, const groups *gs)
{
    cli_about *a = cli_about_new("stereonet", &o->c);
    corax_record_section(a, "stereonet");
    for (int i = 0; i < nfiles; i++)
        corax_record_set(a, "input", "%s", files[i]);
    corax_record_set(a, "hemisphere", "lower");
    corax_record_set(a, "projection", "%s", corax_projection_name(o->style.projection));
    corax_record_set(a, "planes", "%s", o->style.planes == 1 ? "poles" : o->style.planes == 2
                                                                       ? "great circles"
                                                                       : "poles and great circles");
    if (o->style.contours)
        corax_record_set(a, "contours", "%s, interval %g sigma; %s",
                      o->style.density == CORAX_DENSITY_SMOOTH
                          ? "modified Kamb, exponential smoothing (Vollmer 1995), k = 2 (1 + n/9)"
                          : "Kamb (1959) counting, cap of area 9/(n + 9) of the hemisphere",
                      o->style.contour_step, "a uniform sample reads 3 sigma");
    else
        corax_record_set(a, "contours", "none");
    corax_record_set(a, "group_by", "%s", o->group_by ? o->group_by : "(one group: all)");
    for (size_t i = 0; i < o->nwhere; i++)
        corax_record_set(a, "where", "%s = %s (without regard to case)", o->where[i].column,
                      o->where[i].value);
    if (o->style.weighted)
        corax_record_set(a, "weighting", "Terzaghi (1965), 1/|cos| of the angle between the pole "
                      "and the hole, capped at a minimum angle of %g degrees between hole and "
                      "plane; planes only, lines unweighted; weights rescaled to sum to n for "
                      "the mean, cone, tensor and density; n_weighted is their sum as given",
                      o->min_angle);
    else
        corax_record_set(a, "weighting", "none");
    corax_record_set(a, "statistics", "Fisher (1953) mean, kappa and alpha95 of the readings "
                  "turned to the side of principal axis 1 (axial data); none below %d readings; "
                  "orientation tensor eigenvalues normalised to sum to 1; Woodcock (1977) "
                  "K = ln(S1/S2)/ln(S2/S3), C = ln(S1/S3)", CORAX_FISHER_MIN_READINGS);
    if (o->stats)
        corax_record_set(a, "stats", "%s", o->stats);
    corax_record_set(a, "rows_skipped", "%zu (no usable angles)", gs->skipped);
    return cli_about_commit(a, &o->c);
}

static int run(stereo_opts *o, int nfiles, char **files)
{
    groups gs = {0};
    int rc = 0;
    for (int i = 0; i < nfiles && rc == 0; i++)
        rc = read_table(o, files[i], &gs);
    if (rc == 0)
        rc = cli_problems_end(&gs.problems, "the converted tables");
    if (rc == 0)
        rc = summarise(o, &gs);
    if (rc == 0 && gs.skipped && !o->c.quiet)
        cli_note(&o->c, "%zu row%s without angles skipped", gs.skipped,
                 gs.skipped == 1 ? "" : "s");
    char title[256];
    default_title(o, nfiles, files, title, sizeof title);
    corax_writer *stats = NULL;
    corax_svg *svg = NULL;
    if (rc == 0 && o->stats && !(stats = stats_table(o, &gs)))
        rc = EXIT_DATA;
    if (rc == 0)
        cli_phase(&o->c, "drawing");
    if (rc == 0 && !(svg = draw(o, &gs, title)))
        rc = EXIT_DATA;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = CORAX_OK;
    if (rc == 0 && (st = corax_svg_save(svg, o->c.outputs, o->c.output, &err)) == CORAX_OK && stats) {
        st = corax_writer_commit(stats, &err);
        stats = NULL;
    }
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        rc = EXIT_DATA;
    }
    corax_writer_discard(stats);
    corax_svg_free(svg);
    if (rc == 0 && write_about(o, nfiles, files, &gs) != 0)
        rc = EXIT_DATA;
    groups_free(&gs);
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
