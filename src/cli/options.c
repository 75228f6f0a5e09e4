/* cli: options. The shared ones, the project file whose keys stand for long
 * options, and the parse that applies the project first and the command line
 * over it. */
#include <stdio.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "cli/cli.h"
#include "corax/project.h"

const char cli_common_help[] =
    "Drill program:\n"
    "  --collars FILE        collar table: hole, x, y, z; optional azimuth, dip, length,\n"
    "                        date, latitude, longitude\n"
    "  --surveys FILE        survey table: hole, depth, azimuth, dip; optional date,\n"
    "                        reference (magnetic, true, grid), total_field, field_dip\n"
    "  --columns MAP         header names for corax's columns, e.g.\n"
    "                        hole=HOLE_NO,depth=DEPTH_M (names match without case)\n"
    "  --dip-convention C    negative-down (default: -60 is a downward hole),\n"
    "                        positive-down, or from-vertical (0 = straight down)\n"
    "  --declination DEG|model  magnetic declination, east positive; added to\n"
    "                        magnetic survey azimuths (magnetic to true). Default 0.\n"
    "                        model: from the World Magnetic Model at each station's\n"
    "                        date and its collar's place (needs --crs, or latitude\n"
    "                        and longitude columns in the collars)\n"
    "  --convergence DEG|projection  grid convergence, positive when grid north is\n"
    "                        east of true north; subtracted from survey azimuths\n"
    "                        (true to grid). Default 0. projection: from --crs at\n"
    "                        each collar\n"
    "  --crs EPSG:NNNN       the CRS of the collar coordinates (of the CRS side of\n"
    "                        a local grid), any projected CRS PROJ knows\n"
    "  --local-grid x1,y1,E1,N1,x2,y2,E2,N2 | origin=E,N,rotation=DEG,scale=S\n"
    "                        the collars are on a local mine grid: two points known\n"
    "                        on both grids, or its origin in the CRS, its rotation\n"
    "                        (local north clockwise of grid north) and scale; its\n"
    "                        rotation is subtracted from survey azimuths\n"
    "  --survey-date DATE    the date (YYYY-MM-DD) of stations without one: the\n"
    "                        surveys' date column comes first, then the collars'\n"
    "  --magnetic-model M    WMM (default: WMM2015v2, WMM2020, WMM2025 by date),\n"
    "                        WMM2015, WMM2015v2, WMM2020, WMM2025, or a COF file\n"
    "  --survey-reference magnetic|true|grid  the north of survey azimuths without a\n"
    "                        reference column of their own (default magnetic)\n"
    "  --delimiter D         field separator of the input tables: comma, semicolon,\n"
    "                        tab or auto (default: found from each table)\n"
    "  --decimal-mark M      point, comma or auto (default: found from each table)\n"
    "  --decimal-comma       the same as --decimal-mark comma\n"
    "  --units U             metres (default) or feet, for every input table; also\n"
    "                        --collars-units, --surveys-units, --structures-units\n"
    "  --collars-dip-convention C, --surveys-dip-convention C   one table's\n"
    "  --collars-columns MAP, --surveys-columns MAP, --structures-columns MAP\n"
    "                        one table's header names\n"
    "  --collar-station      the collar's set-up is a station at 0 m when the surveys\n"
    "                        start deeper (the hole curves from it)\n"
    "  --reject-station HOLE@DEPTH,...  leave these survey stations out\n"
    "  -p, --project FILE    read inputs, columns and conventions from a project file\n"
    "                        (INI); options on the command line override it\n"
    "Output:\n"
    "  -o, --output FILE     output file (default: standard output)\n"
    "  --about FILE          record of the run's assumptions (default: OUTPUT.about\n"
    "                        when -o names a file)\n"
    "  --output-delimiter D, --output-decimal-mark M   the tables written: comma\n"
    "                        and point (default), or semicolon and comma\n"
    "  -q, --quiet           no notes, warnings or progress on standard error\n"
    "  -h, --help            this help\n";

static void table_unset(cli_table *t)
{
    memset(t, 0, sizeof *t);
    t->delimiter = t->decimal = t->units = t->dip = t->interval_depth = CLI_UNSET;
}

void cli_common_init(cli_common *c, const char *command)
{
    memset(c, 0, sizeof *c);
    c->command = command;
    c->output = "-";
    c->load = corax_load_options_default();
    c->output_format = (corax_table_format){',', '.'};
    table_unset(&c->all);
    for (int i = 0; i < CLI_NTABLES; i++)
        table_unset(&c->table[i]);
    c->outputs = corax_outputs_new(); /* NULL: refused by cli_common_finish */
    corax_job_init(&c->job);
    c->job.outputs = c->outputs;
    c->job.on_message = cli_on_message;
    c->job.on_stage = cli_on_stage;
    c->job.user = c;
    c->inputs = calloc(1, sizeof *c->inputs);
    c->outputs_named = calloc(1, sizeof *c->outputs_named);
    cli_files_watch(c->outputs);
    c->corr.corrector = corax_corrector_default();
}

void cli_common_free(cli_common *c)
{
    corax_column_map_free(c->all.columns);
    c->all.columns = NULL;
    for (int i = 0; i < CLI_NTABLES; i++) {
        corax_column_map_free(c->table[i].columns);
        corax_column_map_free(c->table[i].merged);
        c->table[i].columns = c->table[i].merged = NULL;
    }
    cli_corrections_free(&c->corr);
    for (size_t i = 0; i < c->nowned; i++)
        free(c->owned[i]);
    free(c->owned);
    c->owned = NULL;
    c->nowned = 0;
    free(c->reject);
    c->reject = NULL;
    c->nreject = 0;
    corax_job_clear(&c->job);
    cli_files_watch(NULL);
    corax_outputs_free(c->outputs); /* anything not published is removed */
    c->outputs = c->job.outputs = NULL;
    for (cli_paths **ps = (cli_paths *[]){c->inputs, c->outputs_named, NULL}; *ps; ps++) {
        free((*ps)->item);
        free(*ps);
    }
    c->inputs = c->outputs_named = NULL;
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

/* "QC003@120,QC004@36.5": stations to leave out. 0, or -1 with why filled. */
static int reject_stations(cli_common *c, const char *arg, char *why, size_t wl)
{
    corax_error err;
    corax_error_clear(&err);
    size_t before = c->nreject, n = c->nreject;
    corax_status st = corax_station_refs_parse(arg, &c->reject, &n, &err);
    for (size_t i = before; i < n; i++) { /* the names are the run's to free */
        char *hole = (char *)(uintptr_t)c->reject[i].hole;
        if (c->nreject == i && own_string(c, hole)) { /* own_string frees it if not */
            c->nreject++;
        } else {
            if (c->nreject == i) {
                st = CORAX_ENOMEM;
                snprintf(err.message, sizeof err.message, "out of memory");
            } else {
                free(hole);
            }
        }
    }
    if (st != CORAX_OK)
        snprintf(why, wl, "%s", err.message);
    return st == CORAX_OK ? 0 : -1;
}

/* An output table's delimiter or decimal mark (never found: corax decides). */
static int output_format(cli_common *c, int opt, const char *arg, char *why, size_t wl)
{
    int v;
    if (opt == OPT_OUTPUT_DELIMITER ? cli_value_delimiter(arg, &v, why, wl)
                                    : cli_value_decimal(arg, &v, why, wl))
        return -1;
    if (v == 0) {
        snprintf(why, wl, "an output's format is given, not found: say which");
        return -1;
    }
    if (opt == OPT_OUTPUT_DELIMITER)
        c->output_format.delimiter = (char)v;
    else
        c->output_format.decimal = (char)v;
    return 0;
}

/* A shared option: 1 applied, 0 not a shared option, -1 with why filled. */
static int common_option(cli_common *c, int opt, const char *arg, char *why, size_t wl)
{
    corax_error err;
    int *units = opt == OPT_UNITS              ? &c->all.units
                 : opt == OPT_COLLARS_UNITS    ? &c->table[CLI_COLLARS].units
                 : opt == OPT_SURVEYS_UNITS    ? &c->table[CLI_SURVEYS].units
                 : opt == OPT_STRUCTURES_UNITS ? &c->table[CLI_STRUCTURES].units
                                               : NULL;
    int *dip = opt == OPT_DIP_CONVENTION ? &c->all.dip
               : opt == OPT_COLLARS_DIP  ? &c->table[CLI_COLLARS].dip
               : opt == OPT_SURVEYS_DIP  ? &c->table[CLI_SURVEYS].dip
                                         : NULL;
    corax_column_map **map = opt == OPT_COLUMNS              ? &c->all.columns
                             : opt == OPT_COLLARS_COLUMNS    ? &c->table[CLI_COLLARS].columns
                             : opt == OPT_SURVEYS_COLUMNS    ? &c->table[CLI_SURVEYS].columns
                             : opt == OPT_STRUCTURES_COLUMNS ? &c->table[CLI_STRUCTURES].columns
                                                             : NULL;
    if (map) {
        corax_error_clear(&err);
        if (corax_column_map_add(map, arg, &err) != CORAX_OK) {
            snprintf(why, wl, "%s", err.message);
            return -1;
        }
        return 1;
    }
    if (units)
        return cli_value_units(arg, units, why, wl) ? -1 : 1;
    if (dip)
        return cli_value_dip(arg, dip, why, wl) ? -1 : 1;
    if (opt == OPT_DELIMITER || opt == OPT_DECIMAL_MARK || opt == OPT_DECIMAL_COMMA)
        c->format_from_options |= !c->in_project;
    switch (opt) {
    case OPT_COLLARS: c->collars = arg; return 1;
    case OPT_SURVEYS: c->surveys = arg; return 1;
    case OPT_ABOUT: c->about = arg; return 1;
    case OPT_PROJECT: return 1; /* read before everything else */
    case 'o': c->output = arg; return 1;
    case 'q': c->quiet = 1; return 1;
    case OPT_DELIMITER: return cli_value_delimiter(arg, &c->all.delimiter, why, wl) ? -1 : 1;
    case OPT_DECIMAL_COMMA: c->all.decimal = ','; return 1;
    case OPT_DECIMAL_MARK: return cli_value_decimal(arg, &c->all.decimal, why, wl) ? -1 : 1;
    case OPT_COLLAR_STATION: c->load.collar_station = 1; return 1;
    case OPT_REJECT_STATION: return reject_stations(c, arg, why, wl) ? -1 : 1;
    case OPT_OUTPUT_DELIMITER:
    case OPT_OUTPUT_DECIMAL: return output_format(c, opt, arg, why, wl) ? -1 : 1;
    }
    return cli_corrections_option(c, opt, arg, why, wl);
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
    {"output", "delimiter", "output-delimiter", 0},
    {"output", "decimal_mark", "output-decimal-mark", 0},
    {"tables", "delimiter", "delimiter", 0},
    {"tables", "decimal_mark", "decimal-mark", 0},
    {"tables", "units", "units", 0},
    {"survey", "dip_convention", "dip-convention", 0},
    {"survey", "collar_station", "collar-station", 0},
    {"survey", "reject", "reject-station", 0},
    {"survey", "declination", "declination", 0},
    {"survey", "convergence", "convergence", 0},
    {"survey", "crs", "crs", 0},
    {"survey", "local_grid", "local-grid", 0},
    {"survey", "survey_date", "survey-date", 0},
    {"survey", "magnetic_model", "magnetic-model", 2}, /* a file, unless a built-in name */
    {"survey", "reference", "survey-reference", 0},
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
    {"check", "total_field", "total-field", 0},
    {"check", "field_dip", "field-dip", 0},
};
enum { NKEYS = sizeof project_keys / sizeof project_keys[0] };

void cli_project_help(FILE *f)
{
    fputs("A project file (INI: [section] headings, key = value lines, ';' or '#'\n"
          "comments) stands for options: each key below is the long option beside it,\n"
          "and options on the command line override it. Paths are relative to the\n"
          "project file's folder. A key whose option a command lacks does not concern\n"
          "that command.\n",
          f);
    const char *section = "";
    for (int i = 0; i < NKEYS; i++) {
        if (strcmp(section, project_keys[i].section) != 0)
            fprintf(f, "\n[%s]\n", section = project_keys[i].section);
        fprintf(f, "  %-24s --%s\n", project_keys[i].key, project_keys[i].option);
    }
    fputs("\n[columns]                  NAME = HEADER for every table (corax help columns)\n"
          "[kind_codes]               CODE = WORD, the log's codes for feature kinds\n"
          "[confidence_codes]         CODE = WORD, the log's codes for confidence\n"
          "\n[collars] [surveys] [structures] [runs] [converted]: one table each\n"
          "  path                     the table (not for converted tables: name them)\n"
          "  delimiter                comma, semicolon, tab or auto (found: the default)\n"
          "  decimal_mark             point, comma or auto (found: the default)\n"
          "  units                    metres or feet: depths, lengths (and, for collars,\n"
          "                           coordinates)\n"
          "  dip_convention           collars and surveys: negative-down, positive-down\n"
          "                           or from-vertical\n"
          "  interval_depth           structures: mid, from or to, where a reading of a\n"
          "                           from/to log sits\n"
          "  NAME = HEADER            the table's header name for a column corax reads\n"
          "A table's own settings win over [tables] and [columns], which are the\n"
          "defaults for collars, surveys, structures and runs. Converted tables are read\n"
          "as corax writes them (the format found, either decimal mark) unless\n"
          "[converted] or the command line says otherwise.\n",
          f);
}

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

/* A key met in the project file, for the check that none is given twice. */
typedef struct seen_key {
    char *section, *key;
    long line;
} seen_key;

typedef struct project_ctx {
    cli_common *c;
    const struct option *longopts;
    cli_option_fn own;
    void *own_ctx;
    const char *dir; /* the project file's folder, with a trailing '/', or "" */
    seen_key *seen;
    size_t nseen;
} project_ctx;

/* 0 the first time a key is met; its earlier line when it is met again; -1
 * when out of memory. Project files hold tens of keys: a list will do. */
static long seen_before(project_ctx *p, const char *section, const char *key, long line)
{
    for (size_t i = 0; i < p->nseen; i++)
        if (strcmp(p->seen[i].section, section) == 0 && strcasecmp(p->seen[i].key, key) == 0)
            return p->seen[i].line;
    seen_key *k = realloc(p->seen, (p->nseen + 1) * sizeof *k);
    if (!k)
        return -1;
    p->seen = k;
    k[p->nseen] = (seen_key){strdup(section), strdup(key), line};
    if (!k[p->nseen].section || !k[p->nseen].key) {
        free(k[p->nseen].section);
        free(k[p->nseen].key);
        return -1;
    }
    p->nseen++;
    return 0;
}

/* Sections whose keys are entries of a list option: code = word. */
static const struct {
    const char *section, *option;
} list_sections[] = {{"kind_codes", "kind-codes"}, {"confidence_codes", "confidence-codes"},
                     {"columns", "columns"}};
enum { NLISTS = sizeof list_sections / sizeof list_sections[0] };

/* The options a table section's path stands for. */
static const char *const path_options[CLI_NTABLES] = {"collars", "surveys", "structures", "runs",
                                                      NULL, NULL};

static int known_section(const char *section)
{
    if (cli_table_section(section) >= 0)
        return 1;
    for (int i = 0; i < NLISTS; i++)
        if (strcmp(list_sections[i].section, section) == 0)
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

/* A project value for an option without one: 1 yes, 0 no, -1 neither. */
static int yes_or_no(const char *value)
{
    static const char *const words[] = {"no", "yes", "false", "true", "off", "on", "0", "1"};
    for (int i = 0; i < 8; i++)
        if (strcasecmp(value, words[i]) == 0)
            return i % 2;
    return -1;
}

/* Apply option `name` with arg, as a project key would. 0 ok, -1 why filled. */
static int apply(project_ctx *p, const char *name, const char *arg, char *why, size_t wl)
{
    const struct option *o = find_long(p->longopts, name);
    if (!o)
        return 0; /* not this command's concern */
    if (o->has_arg == no_argument) {
        int yes = yes_or_no(arg);
        if (yes < 0) {
            snprintf(why, wl, "'%s' is not yes or no", arg);
            return -1;
        }
        if (!yes)
            return 0;
        arg = NULL;
    }
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
    long earlier = seen_before(p, section, key, line);
    if (earlier) {
        if (earlier < 0)
            corax_error_set(err, CORAX_ENOMEM, NULL, line, "out of memory");
        else
            corax_error_set(err, CORAX_EFORMAT, NULL, line,
                            "'%s' in [%s] is given twice (lines %ld and %ld): say it once",
                            key, section, earlier, line);
        return 1;
    }
    for (int i = 0; i < NLISTS; i++) { /* name = value, an entry of a list option */
        if (strcmp(section, list_sections[i].section))
            continue;
        char spec[600];
        snprintf(spec, sizeof spec, "%s=%s", key, value);
        if (apply(p, list_sections[i].option, spec, why, sizeof why) == 0)
            return 0;
        corax_error_set(err, CORAX_EFORMAT, NULL, line, "[%s] %s: %s", section, key, why);
        return 1;
    }
    int table = cli_table_section(section);
    if (table >= 0) {
        int k = cli_table_key(p->c, (cli_table_id)table, key, value, why, sizeof why);
        if (k == 1) { /* the table's path: the option that names it */
            const char *arg = own_string(p->c, join_path(value[0] != '/' ? p->dir : "", value));
            k = arg ? apply(p, path_options[table], arg, why, sizeof why) : -1;
            if (!arg)
                snprintf(why, sizeof why, "out of memory");
        }
        if (k == 0)
            return 0;
        corax_error_set(err, CORAX_EFORMAT, NULL, line, "[%s] %s: %s", section, key, why);
        return 1;
    }
    for (int i = 0; i < NKEYS; i++) {
        if (strcmp(project_keys[i].section, section) || strcmp(project_keys[i].key, key))
            continue;
        /* options may keep the text they are given: every value outlives the read */
        int relative = project_keys[i].path && value[0] != '/' && strcmp(value, "-") != 0 &&
                       !(project_keys[i].path == 2 && corax_magnetic_is_builtin(value));
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
    project_ctx p = {c, longopts, own, ctx, dir, NULL, 0};
    corax_error err;
    corax_error_clear(&err);
    c->in_project = 1;
    corax_status st = corax_ini_read(path, on_project_key, &p, &err);
    c->in_project = 0;
    free(dir);
    for (size_t i = 0; i < p.nseen; i++) {
        free(p.seen[i].section);
        free(p.seen[i].key);
    }
    free(p.seen);
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

int cli_files_add(cli_files *f, const cli_common *c, const char *path, char *why, size_t wl)
{
    if (!c->in_project && !f->from_options) { /* the command line's replace the project's */
        f->from_options = 1;
        f->n = 0;
    }
    const char **p = realloc(f->path, (f->n + 1) * sizeof *p);
    if (!p) {
        snprintf(why, wl, "out of memory");
        return -1;
    }
    f->path = p;
    f->path[f->n++] = path;
    return 0;
}

int cli_files_from_args(cli_files *f, const cli_common *c, int argc, char **argv)
{
    char why[64];
    for (int i = optind; i < argc; i++)
        if (cli_files_add(f, c, argv[i], why, sizeof why))
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

/* Where the record of the run goes: --about, or OUTPUT.about beside an output
 * file that corax writes whole (not beside a device, a pipe or standard
 * output); NULL for none. */
static const char *about_path(cli_common *c)
{
    if (c->about)
        return c->about;
    if (!corax_path_replaceable(c->output))
        return NULL;
    size_t n = strlen(c->output) + 7;
    char *p = malloc(n);
    if (p)
        snprintf(p, n, "%s.about", c->output);
    return own_string(c, p);
}

/* Each input table's header names: the defaults' under its own. */
static int merge_columns(cli_common *c)
{
    corax_error err;
    corax_error_clear(&err);
    for (int i = 0; i < CLI_NTABLES; i++) {
        cli_table *t = &c->table[i];
        if (i == CLI_CONVERTED || !t->columns)
            continue;
        if ((c->all.columns && corax_column_map_merge(&t->merged, c->all.columns) != CORAX_OK) ||
            corax_column_map_merge(&t->merged, t->columns) != CORAX_OK)
            return -1;
    }
    return 0;
}

int cli_common_finish(cli_common *c, int need_program)
{
    for (int i = -1; i < CLI_NTABLES; i++) {
        const cli_table *t = i < 0 ? &c->all : &c->table[i];
        int delim = t->delimiter != CLI_UNSET ? t->delimiter : c->all.delimiter;
        if (t->decimal == ',' && delim == ',')
            return cli_usage(c->command, "a decimal comma needs another delimiter than a comma "
                                         "(a comma cannot both separate fields and mark "
                                         "decimals)%s%s",
                             i < 0 ? "" : ": in ", i < 0 ? "" : cli_table_name((cli_table_id)i));
    }
    if (c->output_format.decimal == ',' && c->output_format.delimiter == ',')
        return cli_usage(c->command, "an output with decimal commas needs another delimiter "
                                     "than a comma (output delimiter)");
    if (merge_columns(c))
        return cli_usage(c->command, "out of memory");
    c->load.collars = cli_table_settings(c, CLI_COLLARS);
    c->load.surveys = cli_table_settings(c, CLI_SURVEYS);
    c->load.collar_dip = cli_table_dip(c, CLI_COLLARS);
    c->load.survey_dip = cli_table_dip(c, CLI_SURVEYS);
    c->load.reject = c->reject;
    c->load.nreject = c->nreject;
    if (need_program && (!c->collars || !c->surveys))
        return cli_usage(c->command, "--collars and --surveys are both needed");
    if (!c->outputs)
        return cli_usage(c->command, "out of memory");
    cli_input(c, "--collars", c->collars);
    cli_input(c, "--surveys", c->surveys);
    cli_input(c, "--project", c->project);
    cli_output(c, "-o", c->output);
    c->about_path = about_path(c);
    cli_output(c, "--about", c->about_path);
    int rc = cli_files_check(c);
    if (rc == 0 && c->collars && c->surveys)
        rc = cli_corrections_prepare(c);
    return rc;
}

