/* cli: `corax solve`, planes from alpha-only readings of one feature in
 * several holes: the set's candidates ranked, with their misfit and, by
 * Monte Carlo, their cones; every reading's place and residual on request. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "cli/cli.h"
#include "io/fields.h"

static const char solve_help[] =
    "usage: corax solve --collars FILE --surveys FILE [options] [-o FILE] READINGS...\n"
    "\n"
    "Solve planes from alpha alone. READINGS are tables (CSV, or - for standard\n"
    "input) with hole, depth, alpha and set columns (optional alpha_error,\n"
    "depth_error); the readings of one set are taken to be parallel planes (a\n"
    "marker bed, a vein set). Each reading puts the plane's normal on a cone\n"
    "about its hole (90 - alpha from the core axis); the plane is where the\n"
    "cones of two or more holes meet.\n"
    "\n"
    "Output, one row per set and candidate, best first: set, candidate, dip,\n"
    "dip_direction, holes, readings, misfit (RMS angle of the readings' cones\n"
    "from the plane's normal), cone95 (half-angle holding 95% of the Monte\n"
    "Carlo solutions), status, note.\n"
    "\n"
    "  --parallel-limit DEG      holes whose axes all lie within this of one another\n"
    "                            are too near parallel to solve (default 15)\n"
    "  --residuals FILE          every reading, in order: its columns, hole_azimuth,\n"
    "                            hole_plunge, residual (from candidate 1), status, note\n"
    "  --svg FILE                a stereonet: every reading's small circle and the\n"
    "                            solved poles with their cones\n"
    "  --draw-sets LIST          only these sets on the stereonet (comma-separated)\n"
    "  --title TEXT              the stereonet's title\n"
    "Uncertainty (Monte Carlo; 1-sigma errors in degrees, depth in metres):\n"
    "  --draws N                 draws per set (default 1000; 0: no cone95)\n"
    "  --seed S                  the generator's seed (default 1)\n"
    "  --alpha-error DEG         alpha reading (default 2); candidates whose fit is\n"
    "                            as good within this error are all given\n"
    "  --depth-error M           depth of a reading (default 0.05)\n"
    "  --azimuth-error DEG, --dip-error DEG   survey, each station (1, 0.5)\n"
    "  --azimuth-error-per-hole DEG, --dip-error-per-hole DEG   shared by a hole\n"
    "                            (0.5, 0.25)\n"
    "\n"
    "Status: solved; ambiguous (several planes fit as well: each is a row);\n"
    "parallel-holes; one-hole; one-reading; no-readings (the note says why).\n"
    "A reading that cannot be used is named on standard error and left out.\n"
    "\n";

enum { OPT_PARALLEL_LIMIT = OPT_COMMAND_BASE, OPT_RESIDUALS, OPT_SVG, OPT_DRAW_SETS, OPT_TITLE };

typedef struct solve_opts {
    cli_common c;
    corax_error_model errors;
    size_t draws;
    uint64_t seed;
    corax_solve_options solve;
    const char *residuals, *svg, *title, *draw_sets;
    cli_files inputs;
} solve_opts;

/* One row of a readings table, read. */
typedef struct reading_row {
    const corax_table *table;
    size_t row;
    long set;                /* its set, -1 for none */
    corax_solve_reading r;
    corax_result place;      /* where the reading is (corax_convert_locate) */
    const char *status;      /* "used", or why it is left out */
    char *why;               /* the phrase for a row left out, else NULL */
} reading_row;

typedef struct solve_set {
    char *name;
    size_t left_out;         /* its rows that could not be used */
    size_t assumed;          /* used rows on a path assumed (collar-only, ...) */
    corax_solve_result result;
    corax_cone *cones;       /* its readings' cones, for the net */
} solve_set;

typedef struct solve_data {
    corax_table **tables;
    size_t ntables;
    reading_row *rows;
    size_t nrows;
    solve_set *sets;
    size_t nsets;
} solve_data;

enum { C_HOLE, C_DEPTH, C_ALPHA, C_SET, C_ALPHA_ERROR, C_DEPTH_ERROR, NC };
static const char *const col_names[NC] = {"hole", "depth", "alpha", "set", "alpha_error",
                                          "depth_error"};

static int solve_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    solve_opts *o = ctx;
    int k = cli_uncertainty_option(&o->errors, &o->draws, &o->seed, 0, opt, arg, why, wl);
    if (k)
        return k < 0 ? -1 : 0;
    double v;
    switch (opt) {
    case OPT_PARALLEL_LIMIT:
        if (cli_value_number(arg, 0, 90, &v, why, wl))
            return -1;
        o->solve.parallel_limit = corax_rad(v);
        return 0;
    case OPT_RESIDUALS: o->residuals = arg; return 0;
    case OPT_SVG: o->svg = arg; return 0;
    case OPT_DRAW_SETS: o->draw_sets = arg; return 0;
    case OPT_TITLE: o->title = arg; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, solve_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        CLI_UNCERTAINTY_OPTIONS,
        {"parallel-limit", required_argument, NULL, OPT_PARALLEL_LIMIT},
        {"residuals", required_argument, NULL, OPT_RESIDUALS},
        {"svg", required_argument, NULL, OPT_SVG},
        {"draw-sets", required_argument, NULL, OPT_DRAW_SETS},
        {"title", required_argument, NULL, OPT_TITLE},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, solve_help, 1, solve_option, o);
    if (rc != 0)
        return rc;
    if (cli_files_from_args(&o->inputs, &o->c, argc, argv))
        return EXIT_DATA;
    if (o->inputs.n == 0)
        return cli_usage("solve", "no READINGS table (hole, depth, alpha, set; or - for "
                                  "standard input)");
    if (cli_files_stdin_once(&o->inputs, "solve"))
        return EXIT_USAGE;
    for (size_t i = 0; i < o->inputs.n; i++)
        cli_input(&o->c, "a readings table", o->inputs.path[i]);
    cli_output(&o->c, "--residuals", o->residuals);
    cli_output(&o->c, "--svg", o->svg);
    return cli_common_finish(&o->c, 1);
}

/* ---- the readings ---- */

static void data_free(solve_data *d)
{
    for (size_t i = 0; i < d->ntables; i++)
        corax_table_free(d->tables[i]);
    for (size_t i = 0; i < d->nrows; i++)
        free(d->rows[i].why);
    for (size_t i = 0; i < d->nsets; i++) {
        free(d->sets[i].cones);
        free(d->sets[i].name);
    }
    free(d->tables);
    free(d->rows);
    free(d->sets);
}

/* The set named by text (len bytes), added when new; -1 when out of memory. */
static long set_of(solve_data *d, const char *text, size_t len)
{
    for (size_t k = 0; k < d->nsets; k++)
        if (strlen(d->sets[k].name) == len && memcmp(d->sets[k].name, text, len) == 0)
            return (long)k;
    solve_set *s = realloc(d->sets, (d->nsets + 1) * sizeof *s);
    if (!s)
        return -1;
    d->sets = s;
    memset(&s[d->nsets], 0, sizeof *s);
    if (!(s[d->nsets].name = strndup(text, len)))
        return -1;
    return (long)d->nsets++;
}

/* Leave a row out with a status word and a phrase. */
static void leave_out(reading_row *rr, const char *status, const char *why)
{
    rr->status = status;
    rr->why = strdup(why);
}

/* A reading's own error column, or the run's: 0 with why filled when the
 * column holds something unusable. */
static int own_error(const corax_row *row, long col, char decimal, const char *name, double unit,
                     double *value, char *why, size_t wl)
{
    double v;
    corax_number_status st = corax_field_number(row, col, decimal, name, &v, why, wl);
    if (st == CORAX_NUMBER_EMPTY || col < 0)
        return 1;
    if (st != CORAX_NUMBER_OK || !corax_field_nonnegative(v, name, why, wl))
        return 0;
    *value = v * unit;
    return 1;
}

/* Read one row: its set, its values and its place down the hole. */
static int read_row(const solve_opts *o, const corax_program *prog, solve_data *d,
                    const corax_table *t, size_t i, const long *col, const char **field)
{
    reading_row *rr = &d->rows[d->nrows++];
    memset(rr, 0, sizeof *rr);
    rr->table = t;
    rr->row = i;
    rr->status = "used";
    rr->set = -1;
    corax_row row;
    corax_table_row(t, i, field, &row);
    char why[200];
    corax_table_info info;
    corax_table_read_info(t, &info);
    char decimal = info.format.decimal;
    double unit = cli_table_settings(&o->c, CLI_STRUCTURES).unit;
    size_t sl, hl;
    const char *set = corax_field_text(&row, col[C_SET], &sl);
    while (sl && (*set == ' ' || *set == '\t')) {
        set++;
        sl--;
    }
    while (sl && (set[sl - 1] == ' ' || set[sl - 1] == '\t'))
        sl--;
    if (sl && (rr->set = set_of(d, set, sl)) < 0)
        return EXIT_DATA;
    const char *name = corax_field_text(&row, col[C_HOLE], &hl);
    double depth = NAN, alpha = NAN;
    rr->r.alpha_error = o->errors.alpha;
    rr->r.depth_error = o->errors.depth;
    if (corax_field_ragged(&row, corax_table_columns(t), why, sizeof why) ||
        corax_field_number(&row, col[C_DEPTH], decimal, "depth", &depth, why, sizeof why) ||
        !corax_field_nonnegative(depth, "depth", why, sizeof why) ||
        corax_field_number(&row, col[C_ALPHA], decimal, "alpha", &alpha, why, sizeof why) ||
        !corax_field_in_range(alpha, 0, 90, "alpha", why, sizeof why) ||
        !own_error(&row, col[C_ALPHA_ERROR], decimal, "alpha_error", CORAX_DEG, &rr->r.alpha_error,
                   why, sizeof why) ||
        !own_error(&row, col[C_DEPTH_ERROR], decimal, "depth_error", unit, &rr->r.depth_error,
                   why, sizeof why) ||
        !corax_field_plausible(depth *= unit, CORAX_MAX_DEPTH, "depth", why, sizeof why)) {
        corax_convert_locate(corax_program_find(prog, name, hl), depth, NULL, &rr->place);
        leave_out(rr, "invalid", why);
    } else {
        rr->r = (corax_solve_reading){corax_program_find(prog, name, hl), depth, corax_rad(alpha),
                                      rr->r.alpha_error, rr->r.depth_error};
        corax_convert_locate(rr->r.hole, depth, NULL, &rr->place);
        if (!rr->place.located)
            leave_out(rr, corax_condition_status(rr->place.conditions),
                      rr->r.hole ? "the hole has no survey and no collar direction"
                                 : "the hole is not in the collar table");
        else if (rr->set < 0)
            leave_out(rr, "no-set", "no set named (which feature is it?)");
    }
    if (rr->set >= 0 && rr->why)
        d->sets[rr->set].left_out++;
    else if (rr->set >= 0 && rr->place.conditions)
        d->sets[rr->set].assumed++;
    if (rr->why)
        cli_error(corax_table_path(t), corax_table_line(t, i), "%s; left out", rr->why);
    return EXIT_OK;
}

/* Same header names, in the same order (without regard to case). */
static int same_header(const corax_table *a, const corax_table *b)
{
    if (corax_table_columns(a) != corax_table_columns(b))
        return 0;
    for (size_t c = 0; c < corax_table_columns(a); c++)
        if (strcasecmp(corax_table_header_name(a, c), corax_table_header_name(b, c)) != 0)
            return 0;
    return 1;
}

static int load(const solve_opts *o, const corax_program *prog, solve_data *d)
{
    for (size_t f = 0; f < o->inputs.n; f++) {
        corax_table *t =
            cli_table_keep((cli_common *)&o->c, CLI_STRUCTURES, o->inputs.path[f], &d->tables, &d->ntables);
        if (!t)
            return EXIT_DATA;
        long col[NC];
        corax_table_settings ts = cli_table_settings(&o->c, CLI_STRUCTURES);
        if (cli_table_columns(&o->c, t, &ts, col_names, NC, col))
            return EXIT_DATA;
        for (int k = 0; k <= C_SET; k++)
            if (col[k] < 0) {
                cli_error(o->inputs.path[f], 1, "no '%s' column in the header", col_names[k]);
                return EXIT_DATA;
            }
        if (f > 0 && !same_header(t, d->tables[0])) {
            cli_error(o->inputs.path[f], 1, "the header differs from the first table's; solve "
                      "them separately or give them the same columns");
            return EXIT_DATA;
        }
        size_t rows = corax_table_rows(t);
        reading_row *p = realloc(d->rows, (d->nrows + rows + 1) * sizeof *p);
        const char **field = malloc((corax_table_widest(t) + 1) * sizeof *field);
        if (!p || !field) {
            free(field);
            if (p)
                d->rows = p;
            return EXIT_DATA;
        }
        d->rows = p;
        int rc = EXIT_OK;
        for (size_t r = 0; r < rows && rc == EXIT_OK; r++)
            rc = read_row(o, prog, d, t, r, col, field);
        free(field);
        if (rc != EXIT_OK)
            return rc;
    }
    return EXIT_OK;
}

/* ---- solving ---- */

static int solve_sets(const solve_opts *o, solve_data *d)
{
    corax_solve_reading *r = malloc((d->nrows + 1) * sizeof *r);
    if (!r)
        return EXIT_DATA;
    corax_status st = CORAX_OK;
    for (size_t k = 0; k < d->nsets && st == CORAX_OK; k++) {
        solve_set *s = &d->sets[k];
        size_t n = 0;
        for (size_t i = 0; i < d->nrows; i++)
            if (d->rows[i].set == (long)k && !d->rows[i].why)
                r[n++] = d->rows[i].r;
        if (!(s->cones = malloc((n + 1) * sizeof *s->cones)))
            st = CORAX_ENOMEM;
        if (st == CORAX_OK)
            st = corax_solve_place(r, n, s->cones, NULL);
        corax_solve_options so = o->solve;
        so.alpha_error = o->errors.alpha;
        if (st == CORAX_OK)
            st = corax_solve_cones(s->cones, n, &so, &s->result);
        if (st == CORAX_OK && o->draws && s->result.ncandidates)
            st = corax_solve_draws(r, n, &o->errors, o->draws,
                                   corax_mc_hole_seed(o->seed, s->name, 0), &s->result);
    }
    free(r);
    if (st != CORAX_OK) {
        cli_error(NULL, 0, "cannot solve: %s", corax_strerror(st));
        return EXIT_DATA;
    }
    return EXIT_OK;
}

/* ---- output ---- */

/* Append a phrase to a note, "; " between phrases. */
static void note_add(char *buf, size_t size, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));

static void note_add(char *buf, size_t size, const char *fmt, ...)
{
    size_t used = strlen(buf);
    if (used + 3 >= size)
        return;
    if (used)
        used += (size_t)snprintf(buf + used, size - used, "; ");
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(buf + used, size - used, fmt, ap);
    va_end(ap);
}

/* What a set's row (candidate k, or the set when it has none) says. */
static void set_note(const solve_opts *o, const solve_set *s, size_t k, char *note, size_t size)
{
    const corax_solve_result *r = &s->result;
    double limit = corax_deg(o->solve.parallel_limit);
    note[0] = '\0';
    switch (r->status) {
    case CORAX_SOLVE_NO_READINGS:
        note_add(note, size, "no reading of this set can be used");
        break;
    case CORAX_SOLVE_ONE_READING:
        note_add(note, size, "a single reading puts the plane's normal on a cone about its "
                 "hole (%.1f degrees from the axis); readings in two holes at different angles "
                 "fix it", corax_deg(0.5 * CORAX_PI - s->cones[0].alpha));
        break;
    case CORAX_SOLVE_ONE_HOLE:
        note_add(note, size, "every reading is in one hole: the normal lies somewhere on a cone "
                 "about it; a reading in a second hole at another angle fixes it");
        break;
    case CORAX_SOLVE_PARALLEL:
        note_add(note, size, "the holes' axes are at most %.1f degrees apart (limit %g): their "
                 "cones barely cross; read the set in a hole at another angle",
                 corax_deg(r->hole_spread), limit);
        break;
    case CORAX_SOLVE_AMBIGUOUS:
        if (r->holes == 2)
            note_add(note, size, "two holes: the cones meet in %zu places that fit as well; "
                     "a third hole, or what is known of the set, tells them apart",
                     r->ncandidates);
        else if (r->flatness < corax_rad(10))
            note_add(note, size, "the holes' axes lie within %.1f degrees of one plane: the "
                     "plane mirrored through it fits as well; a hole out of that plane tells "
                     "them apart", corax_deg(r->flatness));
        else
            note_add(note, size, "%zu planes fit as well, within the alpha error; more readings "
                     "or holes tell them apart", r->ncandidates);
        if (k > 0 && r->candidate[k].misfit - r->candidate[0].misfit >= corax_rad(0.005))
            note_add(note, size, "misfit %.2f against %.2f for candidate 1",
                     corax_deg(r->candidate[k].misfit), corax_deg(r->candidate[0].misfit));
        break;
    case CORAX_SOLVE_SOLVED:
        break;
    }
    if (r->ncandidates && r->candidate[k].misfit > 3.0 * o->errors.alpha && o->errors.alpha > 0)
        note_add(note, size, "the misfit is over three times the alpha error: are these "
                 "readings one set of parallel planes, and their alphas right?");
    if (s->assumed)
        note_add(note, size, "%zu reading%s on a hole path assumed (collar-only, "
                 "extrapolated or beyond the end)", s->assumed, s->assumed == 1 ? "" : "s");
    if (s->left_out)
        note_add(note, size, "%zu reading%s left out (see the messages)", s->left_out,
                 s->left_out == 1 ? "" : "s");
}

static void text(corax_writer *w, const char *s) { corax_writer_field(w, s, strlen(s)); }

/* An output file (or standard output), or NULL with the message printed. */
static corax_writer *open_output(const solve_opts *o, const char *path)
{
    corax_writer *w;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open_in(o->c.outputs, path, &w, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return NULL;
    }
    return w;
}

/* Put an output in place: EXIT_OK, or EXIT_DATA with the message printed. */
static int commit_output(corax_writer *w)
{
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_commit(w, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    return EXIT_OK;
}

static int write_sets(const solve_opts *o, const solve_data *d)
{
    corax_writer *w = open_output(o, o->c.output);
    if (!w)
        return EXIT_DATA;
    static const char head[] =
        "set,candidate,dip,dip_direction,holes,readings,misfit,cone95,status,note\n";
    corax_writer_text(w, head, sizeof head - 1);
    for (size_t k = 0; k < d->nsets; k++) {
        const solve_set *s = &d->sets[k];
        const corax_solve_result *r = &s->result;
        size_t rows = r->ncandidates ? r->ncandidates : 1;
        for (size_t c = 0; c < rows; c++) {
            char note[900];
            set_note(o, s, c, note, sizeof note);
            text(w, s->name);
            if (r->ncandidates) {
                const corax_solution *x = &r->candidate[c];
                corax_writer_integer(w, (long long)c + 1);
                corax_writer_number(w, corax_deg(x->plane.dip), 2);
                corax_writer_azimuth(w, corax_deg(x->plane.dip_direction), 2);
            } else {
                for (int i = 0; i < 3; i++)
                    text(w, "");
            }
            corax_writer_integer(w, (long long)r->holes);
            corax_writer_integer(w, (long long)r->readings);
            if (r->ncandidates) {
                corax_writer_number(w, corax_deg(r->candidate[c].misfit), 2);
                corax_writer_number(w, corax_deg(r->candidate[c].cone95), 2);
            } else {
                text(w, "");
                text(w, "");
            }
            text(w, corax_solve_status_name(r->status));
            text(w, note);
            corax_writer_end_row(w);
        }
    }
    return commit_output(w);
}

/* Every reading in order, with its place and its residual from candidate 1. */
static int write_residuals(const solve_opts *o, const solve_data *d)
{
    corax_writer *w = open_output(o, o->residuals);
    if (!w)
        return EXIT_DATA;
    for (size_t c = 0; d->ntables && c < corax_table_columns(d->tables[0]); c++)
        text(w, corax_table_header_name(d->tables[0], c));
    static const char *const more[] = {"hole_azimuth", "hole_plunge", "residual", "status", "note"};
    for (int c = 0; c < 5; c++)
        text(w, more[c]);
    corax_writer_end_row(w);
    for (size_t i = 0; i < d->nrows; i++) {
        const reading_row *rr = &d->rows[i];
        size_t width = corax_table_columns(rr->table);
        for (size_t c = 0; c < width; c++)
            text(w, c < corax_table_width(rr->table, rr->row)
                        ? corax_table_cell(rr->table, rr->row, (long)c, NULL)
                        : "");
        if (rr->place.located) {
            double az, plunge;
            corax_direction_angles(rr->place.point.tangent, &az, &plunge);
            corax_writer_azimuth(w, corax_deg(az), 2);
            corax_writer_number(w, corax_deg(plunge), 2);
        } else {
            text(w, "");
            text(w, "");
        }
        const corax_solve_result *r = rr->set >= 0 ? &d->sets[rr->set].result : NULL;
        if (!rr->why && r && r->ncandidates) {
            corax_cone cone = {rr->place.point.tangent, rr->r.alpha, 0};
            corax_writer_number(w, corax_deg(corax_cone_residual(&cone, r->candidate[0].normal)),
                                2);
        } else {
            text(w, "");
        }
        text(w, rr->status);
        char note[600];
        size_t used = (size_t)snprintf(note, sizeof note, "%s", rr->why ? rr->why : "");
        size_t have = corax_table_width(rr->table, rr->row);
        for (size_t c = width; c < have && used < sizeof note; c++) /* nothing lost */
            used += (size_t)snprintf(note + used, sizeof note - used, "%s%s",
                                     c == width ? "; extra fields: " : ",",
                                     corax_table_cell(rr->table, rr->row, (long)c, NULL));
        text(w, note);
        corax_writer_end_row(w);
    }
    return commit_output(w);
}

/* Whether a set is to be drawn: every set, or those in --draw-sets. */
static int drawn(const solve_opts *o, const char *name)
{
    if (!o->draw_sets)
        return 1;
    size_t len = strlen(name);
    for (const char *p = o->draw_sets; *p;) {
        const char *end = strchr(p, ',');
        size_t n = end ? (size_t)(end - p) : strlen(p);
        if (n == len && strncasecmp(p, name, n) == 0)
            return 1;
        p += n + (end != NULL);
    }
    return 0;
}

/* The stereonet: one net per set, its readings' small circles and its solved
 * poles with their cones. */
static int write_net(const solve_opts *o, const solve_data *d)
{
    static const char *const labels[CORAX_SOLVE_MAX] = {"1", "2", "3", "4", "5", "6", "7", "8"};
    corax_net_set *sets = calloc(d->nsets + 1, sizeof *sets);
    corax_net_circle *circles = calloc(d->nrows + 1, sizeof *circles);
    corax_net_pick *picks = calloc(d->nsets * CORAX_SOLVE_MAX + 1, sizeof *picks);
    size_t nsets = 0, nc = 0, np = 0;
    int rc = sets && circles && picks ? EXIT_OK : EXIT_DATA;
    for (size_t k = 0; rc == EXIT_OK && k < d->nsets; k++) {
        const solve_set *s = &d->sets[k];
        if (!drawn(o, s->name))
            continue;
        corax_net_set *ns = &sets[nsets++];
        ns->name = s->name;
        ns->circles = circles + nc;
        ns->picks = picks + np;
        for (size_t i = 0; i < s->result.readings; i++)
            circles[nc++] = (corax_net_circle){s->cones[i].axis, 0.5 * CORAX_PI - s->cones[i].alpha};
        ns->ncircles = s->result.readings;
        for (size_t c = 0; c < s->result.ncandidates; c++)
            picks[np++] = (corax_net_pick){s->result.candidate[c].normal,
                                           s->result.candidate[c].cone95, labels[c]};
        ns->npicks = s->result.ncandidates;
        ns->skipped = s->left_out;
    }
    corax_net_style style = corax_net_style_default();
    style.contours = 0;
    style.title = o->title ? o->title : "Planes from alpha alone";
    corax_svg *svg = NULL;
    corax_status st = CORAX_OK;
    if (rc == EXIT_OK && nsets == 0) {
        cli_error(NULL, 0, "--draw-sets names no set of the readings: no stereonet drawn");
        rc = EXIT_DATA;
    }
    if (rc == EXIT_OK && (st = corax_stereonet_page(sets, nsets, &style, 1, &svg)) != CORAX_OK) {
        cli_error(NULL, 0, "cannot draw the net: %s", corax_strerror(st));
        rc = EXIT_DATA;
    }
    corax_error err;
    corax_error_clear(&err);
    if (rc == EXIT_OK && (st = corax_svg_save(svg, o->c.outputs, o->svg, &err)) != CORAX_OK) {
        cli_error_record(&err, st);
        rc = EXIT_DATA;
    }
    corax_svg_free(svg);
    free(sets);
    free(circles);
    free(picks);
    return rc;
}

static int write_about(const solve_opts *o)
{
    cli_about *a = cli_about_new("solve", &o->c);
    corax_record_section(a, "solve");
    for (size_t i = 0; i < o->inputs.n; i++)
        corax_record_set(a, "readings", "%s", o->inputs.path[i]);
    corax_record_set(a, "parallel_limit", "%g", corax_deg(o->solve.parallel_limit));
    corax_record_set(a, "ties", "planes whose sum of squared misfits exceeds the best's by less "
                  "than 5.99 alpha_error^2 (chi-square, two degrees of freedom, 95%%)");
    if (o->residuals)
        corax_record_set(a, "residuals", "%s", o->residuals);
    if (o->svg)
        corax_record_set(a, "svg", "%s", o->svg);
    if (o->draws)
        corax_record_uncertainty(a, &o->errors, o->draws, o->seed, 0);
    return cli_about_commit(a, &o->c);
}

static void summary(const solve_opts *o, const solve_data *d)
{
    size_t count[CORAX_SOLVE_NO_READINGS + 1] = {0}, left = 0;
    for (size_t k = 0; k < d->nsets; k++)
        count[d->sets[k].result.status]++;
    for (size_t i = 0; i < d->nrows; i++)
        left += d->rows[i].why != NULL;
    if (o->c.quiet)
        return;
    fprintf(stderr, "corax: %zu set%s%s", d->nsets, d->nsets == 1 ? "" : "s", d->nsets ? ":" : "");
    int first = 1;
    for (int s = 0; s <= CORAX_SOLVE_NO_READINGS; s++)
        if (count[s]) {
            fprintf(stderr, "%s %zu %s", first ? "" : ",", count[s],
                    corax_solve_status_name((corax_solve_status)s));
            first = 0;
        }
    if (left)
        fprintf(stderr, "; %zu of %zu readings left out", left, d->nrows);
    fputc('\n', stderr);
}

int cmd_solve(int argc, char **argv)
{
    solve_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "solve");
    o.errors = corax_error_model_default();
    o.draws = 1000;
    o.seed = 1;
    o.solve = corax_solve_options_default();
    int rc;
    corax_program *prog;
    solve_data d;
    memset(&d, 0, sizeof d);
    if (!cli_begin(&o.c, parse(argc, argv, &o), 1, &prog, &rc)) {
        cli_files_free(&o.inputs);
        return rc;
    }
    rc = load(&o, prog, &d);
    if (rc == EXIT_OK)
        rc = solve_sets(&o, &d);
    if (rc == EXIT_OK)
        rc = write_sets(&o, &d);
    if (rc == EXIT_OK && o.residuals)
        rc = write_residuals(&o, &d);
    if (rc == EXIT_OK && o.svg)
        rc = write_net(&o, &d);
    if (rc == EXIT_OK && write_about(&o) != 0)
        rc = EXIT_DATA;
    if (rc == EXIT_OK)
        summary(&o, &d);
    data_free(&d);
    corax_program_free(prog);
    cli_files_free(&o.inputs);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc;
}
