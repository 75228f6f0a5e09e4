/* cli: `corax export`, located, oriented structures and hole traces for
 * 3-D modelling packages: a CSV of modelling columns, or legacy VTK. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "common/grow.h"
#include "io/carry.h"

static const char export_help[] =
    "usage: corax export --format csv|vtk --collars FILE --surveys FILE [CONVERTED.csv...]\n"
    "                    -o FILE\n"
    "\n"
    "Located, oriented structures from converted tables, and hole traces, for 3-D\n"
    "modelling.\n"
    "\n"
    "  --format csv          one row per structure with a position and an orientation:\n"
    "                        x, y, z, dip, dip_direction, nx, ny, nz (the upward unit\n"
    "                        normal), polarity, then the tables' other columns carried\n"
    "                        through (union by name when several tables differ).\n"
    "                        Positions come from the tables: --collars and --surveys\n"
    "                        are not needed.\n"
    "  --format vtk          legacy VTK polydata: hole traces as polylines with depth as\n"
    "                        point data, structures as discs or points, with kind, dip,\n"
    "                        dip_direction and hole as cell data (-1: not a plane, or\n"
    "                        not known). Without converted tables: hole traces only.\n"
    "  --binary              VTK in binary (big-endian) rather than ASCII\n"
    "  --shape discs|points  structures as discs in their planes (default) or as points\n"
    "                        with their normals\n"
    "  --radius METRES       radius of the discs (default 5)\n"
    "  --step METRES         sample hole traces every METRES, plus stations (default 5)\n"
    "  --no-traces           structures only (then --collars and --surveys are optional)\n"
    "\n"
    "Polarity: 1 (upright: younging along the upward normal) or -1 (overturned) when\n"
    "a table has a polarity or younging column saying 1, +1, upright, -1 or overturned;\n"
    "empty otherwise (0, unknown or empty). Structures without a position or orientation\n"
    "are left out and counted on standard error. Kind codes: 0 none, 1 bedding,\n"
    "2 foliation, 3 cleavage, 4 vein, 5 fault, 6 shear, 7 joint, 8 fracture, 9 contact,\n"
    "10 lineation, 100 and up other kinds in order of appearance (listed in the .about\n"
    "file).\n"
    "\n";

typedef enum { FORMAT_NONE, FORMAT_CSV, FORMAT_VTK } export_format;

typedef struct export_opts {
    cli_common c;
    export_format format;
    corax_export_options vtk;
    int binary_given, shape_given, radius_given;
    char **inputs;
    int ninputs;
} export_opts;

enum { OPT_FORMAT = OPT_COMMAND_BASE, OPT_BINARY, OPT_SHAPE, OPT_RADIUS, OPT_STEP, OPT_NO_TRACES };

static int export_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    static const char *const formats[] = {"csv", "vtk"};
    static const char *const shapes[] = {"discs", "points"};
    export_opts *o = ctx;
    int k;
    switch (opt) {
    case OPT_FORMAT:
        if (cli_value_choice(arg, formats, 2, &k, why, wl))
            return -1;
        o->format = k == 0 ? FORMAT_CSV : FORMAT_VTK;
        return 0;
    case OPT_BINARY:
        o->binary_given = 1;
        o->vtk.encoding = CORAX_VTK_BINARY;
        return 0;
    case OPT_SHAPE:
        o->shape_given = 1;
        if (cli_value_choice(arg, shapes, 2, &k, why, wl))
            return -1;
        o->vtk.shape = k == 0 ? CORAX_EXPORT_DISCS : CORAX_EXPORT_POINTS;
        return 0;
    case OPT_RADIUS:
        o->radius_given = 1;
        return cli_value_number(arg, 1e-3, 1e5, &o->vtk.disc_radius, why, wl);
    case OPT_STEP: return cli_value_number(arg, 1e-3, 1e5, &o->vtk.step, why, wl);
    case OPT_NO_TRACES: o->vtk.traces = 0; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, export_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        {"format", required_argument, NULL, OPT_FORMAT},
        {"binary", no_argument, NULL, OPT_BINARY},
        {"shape", required_argument, NULL, OPT_SHAPE},
        {"radius", required_argument, NULL, OPT_RADIUS},
        {"step", required_argument, NULL, OPT_STEP},
        {"no-traces", no_argument, NULL, OPT_NO_TRACES},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, export_help, 1, export_option, o);
    if (rc != 0)
        return rc;
    o->inputs = argv + optind;
    o->ninputs = argc - optind;
    for (int i = 0; i < o->ninputs; i++)
        cli_input(&o->c, "a converted table", o->inputs[i]);
    if (o->format == FORMAT_NONE)
        return cli_usage("export", "--format csv or --format vtk is needed");
    if (o->format == FORMAT_CSV) {
        if (o->binary_given || o->shape_given || o->radius_given || !o->vtk.traces)
            return cli_usage("export", "--binary, --shape, --radius and --no-traces are for "
                                       "--format vtk");
        if (o->ninputs == 0)
            return cli_usage("export", "--format csv exports structures: give at least one "
                                       "converted table (hole traces: corax trace --step)");
        return cli_common_finish(&o->c, 0);
    }
    if (o->radius_given && o->vtk.shape == CORAX_EXPORT_POINTS)
        return cli_usage("export", "--radius is for --shape discs");
    if (!o->vtk.traces && o->ninputs == 0)
        return cli_usage("export", "--no-traces and no converted table: nothing to export");
    return cli_common_finish(&o->c, o->vtk.traces);
}

/* ---- CSV ---- */

static int export_csv(const export_opts *o, corax_writer *w, size_t *written, size_t *left_out)
{
    int n = o->ninputs, rc = EXIT_OK;
    cli_converted *t = calloc((size_t)n, sizeof *t);
    corax_carry *carry = corax_carry_new(corax_export_csv_columns, CORAX_EXPORT_CSV_COLUMNS);
    int opened = 0;
    if (!t || !carry) {
        cli_error(NULL, 0, "out of memory");
        rc = EXIT_DATA;
    }
    /* every header first: the output's columns are the union of theirs */
    for (int k = 0; rc == EXIT_OK && k < n; k++) {
        if ((rc = cli_converted_open(&o->c, o->inputs[k], &t[k])) != EXIT_OK)
            break;
        opened = k + 1;
        const corax_structure_columns *c = &t[k].columns;
        long consumed[] = {c->x, c->y, c->z, c->dip, c->dip_direction, c->polarity};
        if (corax_carry_add(carry, &t[k].header, consumed, 6) < 0) {
            cli_error(NULL, 0, "out of memory");
            rc = EXIT_DATA;
        }
    }
    if (rc == EXIT_OK) {
        for (int i = 0; i < CORAX_EXPORT_CSV_COLUMNS; i++)
            corax_writer_field(w, corax_export_csv_columns[i], strlen(corax_export_csv_columns[i]));
        corax_carry_header(carry, w);
        corax_writer_end_row(w);
    }
    for (int k = 0; rc == EXIT_OK && k < n; k++) {
        corax_row row;
        corax_structure s;
        while (cli_converted_next(&t[k], &row, &s)) {
            if (!s.located || !s.oriented) {
                (*left_out)++;
                continue;
            }
            corax_export_csv_fields(w, &s);
            corax_carry_row(carry, k, &row, w);
            corax_writer_end_row(w);
            (*written)++;
        }
    }
    for (int k = 0; k < opened; k++)
        if (cli_converted_close(&t[k]) != EXIT_OK)
            rc = EXIT_DATA;
    corax_carry_free(carry);
    free(t);
    return rc;
}

/* ---- VTK ---- */

typedef struct located {
    corax_export_structure *item;
    size_t n, cap;
} located;

static int push(located *v, const corax_export_structure *s)
{
    corax_export_structure *p = corax_grow(v->item, v->n, &v->cap, sizeof *p, 1024);
    if (!p)
        return 0;
    v->item = p;
    v->item[v->n++] = *s;
    return 1;
}

/* The structures of every table, compactly, for the VTK blocks that go
 * over them several times. */
static int read_all(const export_opts *o, const corax_program *prog, corax_kinds *kinds,
                    located *v, size_t *left_out)
{
    int rc = EXIT_OK;
    for (int k = 0; k < o->ninputs; k++) {
        cli_converted t;
        if (cli_converted_open(&o->c, o->inputs[k], &t) != EXIT_OK) {
            rc = EXIT_DATA;
            continue; /* report the faults of the other tables too */
        }
        corax_row row;
        corax_structure s;
        while (cli_converted_next(&t, &row, &s)) {
            if (!s.located || !s.oriented) {
                (*left_out)++;
                continue;
            }
            corax_export_structure e = {s.position, s.plane, s.depth,
                                        corax_kinds_code(kinds, s.kind, s.kind_len), s.polarity,
                                        prog ? corax_program_index(prog, s.hole, s.hole_len) : -1};
            if (e.kind < 0 || !push(v, &e)) {
                cli_error(NULL, 0, "out of memory");
                cli_converted_close(&t);
                return EXIT_DATA;
            }
        }
        if (cli_converted_close(&t) != EXIT_OK)
            rc = EXIT_DATA;
    }
    return rc;
}

/* ---- the run ---- */

static void about_export(cli_about *a, const export_opts *o, const corax_program *prog,
                         const corax_kinds *kinds)
{
    cli_about_section(a, "export");
    cli_about_set(a, "format", "%s", o->format == FORMAT_CSV ? "csv" : "vtk");
    for (int i = 0; i < o->ninputs; i++)
        cli_about_set(a, "converted", "%s", o->inputs[i]);
    cli_about_set(a, "polarity", "1 upright, -1 overturned, from a polarity or younging column "
                                 "(1, +1, upright, -1, overturned); empty when not known");
    if (o->format == FORMAT_CSV) {
        cli_about_set(a, "normal", "nx, ny, nz: the upward unit normal (x east, y north, z up)");
        return;
    }
    const corax_export_options *v = &o->vtk;
    cli_about_set(a, "encoding", "%s", v->encoding == CORAX_VTK_BINARY ? "binary (big-endian)"
                                                                      : "ascii");
    cli_about_set(a, "shape", "%s", v->shape == CORAX_EXPORT_DISCS ? "discs" : "points");
    if (v->shape == CORAX_EXPORT_DISCS)
        cli_about_set(a, "disc_radius", "%g (%d corners)", v->disc_radius, v->disc_sides);
    cli_about_set(a, "traces", "%s", v->traces ? "yes" : "no");
    cli_about_set(a, "trace_step", "%g (plus every station)", v->step);
    cli_about_set(a, "not_a_value", "-1 (legacy VTK cannot write NaN): dip and dip_direction of "
                                    "hole traces, depth when not known, kind of hole traces");
    cli_about_section(a, "kinds");
    for (size_t i = 0; i < corax_kinds_count(kinds); i++) {
        const char *name;
        int code = corax_kinds_at(kinds, i, &name);
        char key[16];
        snprintf(key, sizeof key, "%d", code);
        cli_about_set(a, key, "%s", name);
    }
    if (!prog)
        return;
    cli_about_section(a, "holes");
    for (size_t i = 0; i < corax_program_size(prog); i++) {
        char key[24];
        snprintf(key, sizeof key, "%zu", i + 1);
        cli_about_set(a, key, "%s", corax_hole_name(corax_program_hole(prog, i)));
    }
}

static int export_vtk(const export_opts *o, const corax_program *prog, corax_kinds *kinds,
                      size_t *written, size_t *left_out)
{
    located v = {NULL, 0, 0};
    int rc = read_all(o, prog, kinds, &v, left_out);
    if (rc == EXIT_OK) {
        char title[200];
        snprintf(title, sizeof title, "corax %s export: hole traces and structures; metres, x "
                 "east, y north, z up", CORAX_VERSION);
        corax_export_options opt = o->vtk;
        opt.title = title;
        corax_export_counts counts;
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_export_vtk(o->c.outputs, o->c.output, prog, v.item, v.n, &opt, &counts, &err);
        if (st != CORAX_OK) {
            cli_error_record(&err, st);
            rc = EXIT_DATA;
        } else {
            *written = counts.structures;
            if (o->vtk.traces && counts.traces == 0)
                cli_note(&o->c, "no hole has a path to trace");
        }
    }
    free(v.item);
    return rc;
}

static int run(const export_opts *o, const corax_program *prog)
{
    size_t written = 0, left_out = 0;
    int rc;
    corax_kinds *kinds = corax_kinds_new();
    if (!kinds) {
        cli_error(NULL, 0, "out of memory");
        return EXIT_DATA;
    }
    if (o->format == FORMAT_CSV) {
        corax_writer *w;
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_writer_open_in(o->c.outputs, o->c.output, &w, &err);
        if (st != CORAX_OK) {
            cli_error_record(&err, st);
            rc = EXIT_DATA;
        } else if ((rc = export_csv(o, w, &written, &left_out)) == EXIT_OK) {
            if ((st = corax_writer_commit(w, &err)) != CORAX_OK) {
                cli_error_record(&err, st);
                rc = EXIT_DATA;
            }
        } else {
            corax_writer_discard(w);
        }
    } else {
        rc = export_vtk(o, prog, kinds, &written, &left_out);
    }
    if (rc == EXIT_OK) {
        if (left_out)
            cli_note(&o->c, "%zu row%s without a position or orientation left out", left_out,
                     left_out == 1 ? "" : "s");
        if (o->ninputs && written == 0)
            cli_note(&o->c, "no located, oriented structures to export");
        cli_about *a = cli_about_new("export", &o->c);
        about_export(a, o, prog, kinds);
        cli_about_section(a, "results");
        cli_about_set(a, "structures", "%zu", written);
        cli_about_set(a, "left_out", "%zu (no position or no orientation)", left_out);
        if (cli_about_commit(a, &o->c) != 0)
            rc = EXIT_DATA;
    }
    corax_kinds_free(kinds);
    return rc;
}

int cmd_export(int argc, char **argv)
{
    export_opts o;
    memset(&o, 0, sizeof o);
    o.vtk = corax_export_options_default();
    cli_common_init(&o.c, "export");
    int rc = parse(argc, argv, &o);
    corax_program *prog;
    /* csv takes positions from the tables; vtk wants the program for traces
     * and hole numbers when it is given */
    int want = o.format == FORMAT_VTK && o.c.collars && o.c.surveys;
    if (!cli_begin(&o.c, rc, want, &prog, &rc))
        return rc;
    rc = run(&o, prog);
    corax_program_free(prog);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc;
}
