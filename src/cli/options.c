/* cli: options. The shared ones, the project file whose keys stand for long
 * options, and the parse that applies the project first and the command line
 * over it. */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "corax/project.h"

static const char *const dip_names[] = {"negative-down", "positive-down", "from-vertical"};

const char *cli_dip_convention_name(corax_dip_convention c)
{
    return (unsigned)c < 3 ? dip_names[c] : "unknown";
}

void cli_common_init(cli_common *c, const char *command)
{
    memset(c, 0, sizeof *c);
    c->command = command;
    c->output = "-";
    c->load = corax_load_options_default();
}

void cli_common_free(cli_common *c)
{
    corax_column_map_free(c->columns);
    c->columns = NULL;
    for (size_t i = 0; i < c->nowned; i++)
        free(c->owned[i]);
    free(c->owned);
    c->owned = NULL;
    c->nowned = 0;
}

/* Keep a string alive as long as the options. */
static const char *own_string(cli_common *c, char *s)
{
    char **p = s ? realloc(c->owned, (c->nowned + 1) * sizeof *p) : NULL;
    if (!p) {
        free(s);
        return NULL;
    }
    c->owned = p;
    c->owned[c->nowned++] = s;
    return s;
}

int cli_value_number(const char *arg, double lo, double hi, double *value, char *why,
                     size_t whylen)
{
    double v;
    if (corax_parse_number(arg, strlen(arg), '.', &v) != CORAX_NUMBER_OK) {
        snprintf(why, whylen, "'%s' is not a number", arg);
        return -1;
    }
    if (v < lo || v > hi) {
        snprintf(why, whylen, "%s is outside [%g, %g]", arg, lo, hi);
        return -1;
    }
    *value = v;
    return 0;
}

int cli_value_choice(const char *arg, const char *const *names, int count, int *value,
                     char *why, size_t whylen)
{
    for (int i = 0; i < count; i++)
        if (strcmp(arg, names[i]) == 0) {
            *value = i;
            return 0;
        }
    size_t used = (size_t)snprintf(why, whylen, "'%s' is not %s", arg, count > 2 ? "one of " : "");
    for (int i = 0; i < count && used < whylen; i++)
        used += (size_t)snprintf(why + used, whylen - used, "%s%s",
                                 i == 0 ? "" : i + 1 < count ? ", " : " or ", names[i]);
    return -1;
}

/* A shared option: 1 applied, 0 not a shared option, -1 with why filled. */
static int common_option(cli_common *c, int opt, const char *arg, char *why, size_t wl)
{
    static const char *const delimiters[] = {",", ";", "comma", "semicolon"};
    static const char *const marks[] = {"point", "comma"};
    corax_error err;
    int k;
    switch (opt) {
    case OPT_COLLARS: c->collars = arg; return 1;
    case OPT_SURVEYS: c->surveys = arg; return 1;
    case OPT_ABOUT: c->about = arg; return 1;
    case OPT_PROJECT: return 1; /* read before everything else */
    case 'o': c->output = arg; return 1;
    case 'q': c->quiet = 1; return 1;
    case OPT_COLUMNS:
        corax_error_clear(&err);
        if (corax_column_map_add(&c->columns, arg, &err) != CORAX_OK) {
            snprintf(why, wl, "%s", err.message);
            return -1;
        }
        c->load.columns = c->columns;
        return 1;
    case OPT_DIP_CONVENTION:
        if (cli_value_choice(arg, dip_names, 3, &k, why, wl))
            return -1;
        c->load.dip_convention = (corax_dip_convention)k;
        return 1;
    case OPT_DECLINATION:
        return cli_value_number(arg, -180, 180, &c->load.declination, why, wl) ? -1 : 1;
    case OPT_CONVERGENCE:
        return cli_value_number(arg, -180, 180, &c->load.convergence, why, wl) ? -1 : 1;
    case OPT_DELIMITER:
        if (cli_value_choice(arg, delimiters, 4, &k, why, wl))
            return -1;
        c->load.format.delimiter = k % 2 ? ';' : ',';
        return 1;
    case OPT_DECIMAL_COMMA: c->load.format.decimal = ','; return 1;
    case OPT_DECIMAL_MARK:
        if (cli_value_choice(arg, marks, 2, &k, why, wl))
            return -1;
        c->load.format.decimal = k ? ',' : '.';
        return 1;
    }
    return 0;
}

/* ---- project files ---- */

/* Each project key stands for a long option; path values are taken relative
 * to the project file's folder. A key whose option a command lacks is known
 * but does not concern that command. */
static const struct {
    const char *section, *key, *option;
    int path;
} project_keys[] = {
    {"inputs", "collars", "collars", 1},
    {"inputs", "surveys", "surveys", 1},
    {"inputs", "structures", "structures", 1},
    {"output", "file", "output", 1},
    {"output", "about", "about", 1},
    {"tables", "delimiter", "delimiter", 0},
    {"tables", "decimal_mark", "decimal-mark", 0},
    {"survey", "dip_convention", "dip-convention", 0},
    {"survey", "declination", "declination", 0},
    {"survey", "convergence", "convergence", 0},
    {"core", "reference_line", "reference-line", 0},
    {"core", "beta_end", "beta-end", 0},
    {"core", "beta_sense", "beta-sense", 0},
    {"core", "gamma_zero", "gamma-zero", 0},
    {"core", "gamma_sense", "gamma-sense", 0},
    {"core", "near_parallel", "near-parallel", 0},
    {"core", "near_perpendicular", "near-perpendicular", 0},
    {"core", "vertical_limit", "vertical-limit", 0},
    {"section", "azimuth", "section-azimuth", 0},
    {"uncertainty", "draws", "draws", 0},
    {"uncertainty", "seed", "seed", 0},
    {"uncertainty", "alpha_error", "alpha-error", 0},
    {"uncertainty", "beta_error", "beta-error", 0},
    {"uncertainty", "line_error", "line-error", 0},
    {"uncertainty", "azimuth_error", "azimuth-error", 0},
    {"uncertainty", "dip_error", "dip-error", 0},
    {"uncertainty", "depth_error", "depth-error", 0},
    {"uncertainty", "azimuth_error_per_hole", "azimuth-error-per-hole", 0},
    {"uncertainty", "dip_error_per_hole", "dip-error-per-hole", 0},
    {"uncertainty", "confidence_errors", "confidence-errors", 0},
    {"uncertainty", "cloud", "cloud", 1},
    {"check", "runs", "runs", 1},
    {"orient", "by", "orient-by", 0},
    {"orient", "unoriented_word", "unoriented-word", 0},
    {"orient", "nearby_within", "nearby-within", 0},
    {"uncertainty", "gravity_error", "gravity-error", 0},
    {"check", "report", "report", 1},
    {"check", "title", "title", 0},
    {"check", "gap", "gap", 0},
    {"check", "dogleg", "dogleg", 0},
    {"check", "magnetic_azimuth", "magnetic-azimuth", 0},
    {"check", "magnetic_dip", "magnetic-dip", 0},
    {"check", "first_station", "first-station", 0},
    {"check", "collar_mismatch", "collar-mismatch", 0},
    {"check", "steep", "steep", 0},
    {"check", "low_alpha", "low-alpha", 0},
    {"check", "run_length", "run-length", 0},
    {"check", "run_misfit", "run-misfit", 0},
    {"check", "hole_turn", "hole-turn", 0},
    {"check", "low_confidence", "low-confidence", 0},
};
enum { NKEYS = sizeof project_keys / sizeof project_keys[0] };

/* dir (ending in '/', or "") joined to a relative path, with each "../"
 * taking back a folder of dir where it can: "examples/" + "../surveys/x.csv"
 * is "surveys/x.csv". */
static char *join_path(const char *dir, const char *path)
{
    size_t keep = strlen(dir);
    while (strncmp(path, "../", 3) == 0 && keep > 0) {
        size_t k = keep - 1; /* dir[k] is '/': find the folder before it */
        while (k > 0 && dir[k - 1] != '/')
            k--;
        if (strncmp(dir + k, "../", 3) == 0 || strncmp(dir + k, "./", 2) == 0)
            break; /* cannot take back ".." or "." */
        keep = k;
        path += 3;
    }
    size_t n = keep + strlen(path) + 1;
    char *out = malloc(n);
    if (out)
        snprintf(out, n, "%.*s%s", (int)keep, dir, path);
    return out;
}

typedef struct project_ctx {
    cli_common *c;
    const struct option *longopts;
    cli_option_fn own;
    void *own_ctx;
    const char *dir; /* the project file's folder, with a trailing '/', or "" */
} project_ctx;

static int known_section(const char *section)
{
    if (strcmp(section, "columns") == 0)
        return 1;
    for (int i = 0; i < NKEYS; i++)
        if (strcmp(project_keys[i].section, section) == 0)
            return 1;
    return 0;
}

static const struct option *find_long(const struct option *o, const char *name)
{
    for (; o->name; o++)
        if (strcmp(o->name, name) == 0)
            return o;
    return NULL;
}

/* Apply option `name` with arg, as a project key would. 0 ok, -1 why filled. */
static int apply(project_ctx *p, const char *name, const char *arg, char *why, size_t wl)
{
    const struct option *o = find_long(p->longopts, name);
    if (!o)
        return 0; /* not this command's concern */
    if (o->has_arg == no_argument)
        arg = NULL;
    int k = common_option(p->c, o->val, arg, why, wl);
    if (k < 0)
        return -1;
    if (k == 0 && p->own(p->own_ctx, o->val, arg, why, wl) != 0)
        return -1;
    return 0;
}

static int on_project_key(void *user, const char *section, const char *key, const char *value,
                          long line, corax_error *err)
{
    project_ctx *p = user;
    char why[400];
    if (!key) {
        if (known_section(section))
            return 0;
        corax_error_set(err, CORAX_EFORMAT, NULL, line, "unknown section [%s]", section);
        return 1;
    }
    if (strcmp(section, "columns") == 0) { /* logical name = header name */
        char spec[400];
        snprintf(spec, sizeof spec, "%s=%s", key, value);
        if (apply(p, "columns", spec, why, sizeof why) == 0)
            return 0;
        corax_error_set(err, CORAX_EFORMAT, NULL, line, "[columns] %s: %s", key, why);
        return 1;
    }
    for (int i = 0; i < NKEYS; i++) {
        if (strcmp(project_keys[i].section, section) || strcmp(project_keys[i].key, key))
            continue;
        /* options may keep the text they are given: every value outlives the read */
        int relative = project_keys[i].path && value[0] != '/' && strcmp(value, "-") != 0;
        const char *arg = own_string(p->c, join_path(relative ? p->dir : "", value));
        if (!arg) {
            corax_error_set(err, CORAX_ENOMEM, NULL, line, "out of memory");
            return 1;
        }
        if (apply(p, project_keys[i].option, arg, why, sizeof why) == 0)
            return 0;
        corax_error_set(err, CORAX_EFORMAT, NULL, line, "%s: %s", key, why);
        return 1;
    }
    corax_error_set(err, CORAX_EFORMAT, NULL, line, "unknown key '%s' in [%s]", key, section);
    return 1;
}

/* The -p/--project value in argv, or NULL; the last one wins. */
static const char *find_project(int argc, char **argv)
{
    const char *found = NULL;
    for (int i = 1; i < argc; i++) {
        if (strcmp(argv[i], "--") == 0)
            break;
        if ((strcmp(argv[i], "-p") == 0 || strcmp(argv[i], "--project") == 0) && i + 1 < argc)
            found = argv[++i];
        else if (strncmp(argv[i], "--project=", 10) == 0)
            found = argv[i] + 10;
        else if (strncmp(argv[i], "-p", 2) == 0 && argv[i][2])
            found = argv[i] + 2;
    }
    return found;
}

static int read_project(cli_common *c, const char *path, const struct option *longopts,
                        cli_option_fn own, void *ctx)
{
    const char *slash = strrchr(path, '/');
    char *dir = malloc(slash ? (size_t)(slash - path) + 2 : 1);
    if (!dir)
        return EXIT_DATA;
    snprintf(dir, slash ? (size_t)(slash - path) + 2 : 1, "%s", path);
    project_ctx p = {c, longopts, own, ctx, dir};
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_ini_read(path, on_project_key, &p, &err);
    free(dir);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    c->project = path;
    return 0;
}

int cli_parse(int argc, char **argv, cli_common *c, const struct option *longopts,
              const char *help, int shared_help, cli_option_fn own, void *ctx)
{
    char why[400];
    const char *project = find_project(argc, argv);
    for (int i = 1; i < argc; i++) /* help first, whatever else is wrong */
        if (strcmp(argv[i], "-h") == 0 || strcmp(argv[i], "--help") == 0) {
            fputs(help, stdout);
            if (shared_help)
                fputs(cli_common_help, stdout);
            return -1;
        }
    if (project) {
        int rc = read_project(c, project, longopts, own, ctx);
        if (rc)
            return rc;
    }
    int opt, li = -1;
    optind = 1;
    opterr = 0; /* our own messages, in our own words */
    while ((opt = getopt_long(argc, argv, ":o:p:qh", longopts, &li)) != -1) {
        if (opt == '?')
            return cli_usage(c->command, "unknown option '%s'", argv[optind - 1]);
        if (opt == ':')
            return cli_usage(c->command, "option '%s' needs a value", argv[optind - 1]);
        if (opt == 'p')
            continue;
        char name[64];
        if (li >= 0)
            snprintf(name, sizeof name, "--%s", longopts[li].name);
        else
            snprintf(name, sizeof name, "-%c", opt);
        li = -1;
        int k = common_option(c, opt, optarg, why, sizeof why);
        if (k == 0)
            k = own(ctx, opt, optarg, why, sizeof why) == 0 ? 1 : -1;
        if (k < 0)
            return cli_usage(c->command, "%s: %s", name, why);
    }
    return 0;
}

int cli_files_add(cli_files *f, const char *path, char *why, size_t wl)
{
    const char **p = realloc(f->path, (f->n + 1) * sizeof *p);
    if (!p) {
        snprintf(why, wl, "out of memory");
        return -1;
    }
    f->path = p;
    f->path[f->n++] = path;
    return 0;
}

int cli_files_from_args(cli_files *f, int argc, char **argv)
{
    char why[64];
    if (optind >= argc)
        return 0;
    f->n = 0;
    for (int i = optind; i < argc; i++)
        if (cli_files_add(f, argv[i], why, sizeof why))
            return -1;
    return 0;
}

int cli_files_stdin_once(const cli_files *f, const char *command)
{
    size_t stdin_count = 0;
    for (size_t i = 0; i < f->n; i++)
        stdin_count += strcmp(f->path[i], "-") == 0;
    return stdin_count > 1 ? cli_usage(command, "standard input (-) can be read only once") : 0;
}

void cli_files_free(cli_files *f)
{
    free(f->path);
    f->path = NULL;
    f->n = 0;
}

int cli_common_finish(cli_common *c, int need_program)
{
    if (c->load.format.decimal == ',' && c->load.format.delimiter != ';')
        return cli_usage(c->command, "--decimal-comma needs --delimiter ';' (a comma cannot "
                                     "both separate fields and mark decimals)");
    if (need_program && (!c->collars || !c->surveys))
        return cli_usage(c->command, "--collars and --surveys are both needed");
    return 0;
}

/* ---- core conventions ---- */

const char cli_convention_help[] =
    "Conventions (defaults first):\n"
    "  --reference-line bottom|top       the orientation line marks the bottom or top\n"
    "                                    of the hole\n"
    "  --beta-end down-hole|up-hole      beta runs to this end of the ellipse's long axis\n"
    "  --beta-sense clockwise|anticlockwise   looking down the hole\n"
    "  --gamma-zero down-hole|up-hole    gamma runs from this end of the long axis\n"
    "  --gamma-sense clockwise|anticlockwise  seen from the up-hole side of the plane\n"
    "  --near-parallel DEG       flag alpha below this (default 10)\n"
    "  --near-perpendicular DEG  flag alpha above this (default 80)\n"
    "  --vertical-limit DEG      a hole within this of vertical has no usable\n"
    "                            bottom-of-hole line (default 5)\n";

int cli_convention_option(corax_convert_options *o, int opt, const char *arg, char *why,
                          size_t wl)
{
    static const char *const ref[] = {"bottom", "top"};
    static const char *const ends[] = {"down-hole", "up-hole"};
    static const char *const senses[] = {"clockwise", "anticlockwise"};
    corax_core_conventions *cv = &o->conventions;
    int *choice = opt == OPT_REFERENCE    ? &cv->top_reference
                  : opt == OPT_BETA_END   ? &cv->beta_to_uphole_end
                  : opt == OPT_BETA_SENSE ? &cv->beta_anticlockwise
                  : opt == OPT_GAMMA_ZERO ? &cv->gamma_from_uphole
                  : opt == OPT_GAMMA_SENSE ? &cv->gamma_anticlockwise
                                           : NULL;
    if (choice) {
        const char *const *names = opt == OPT_REFERENCE ? ref
                                   : (opt == OPT_BETA_END || opt == OPT_GAMMA_ZERO) ? ends
                                                                                    : senses;
        return cli_value_choice(arg, names, 2, choice, why, wl) ? -1 : 1;
    }
    double *angle = opt == OPT_NEAR_PARALLEL        ? &o->near_parallel
                    : opt == OPT_NEAR_PERPENDICULAR ? &o->near_perpendicular
                    : opt == OPT_VERTICAL_LIMIT     ? &o->vertical_limit
                                                    : NULL;
    if (!angle)
        return 0;
    double v;
    if (cli_value_number(arg, 0, 90, &v, why, wl))
        return -1;
    *angle = corax_rad(v);
    return 1;
}
