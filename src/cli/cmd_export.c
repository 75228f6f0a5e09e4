/* cli: `corax export`, located, oriented structures, hole traces, intervals
 * and contacts for 3-D modelling, GIS and CAD: the options, the modelling
 * CSV and legacy VTK (GIS formats: export_gis.c; interval tables and
 * contacts: export_tables.c). */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "cli/export_int.h"
#include "common/grow.h"

static const char export_help[] =
    "usage: corax export --format FORMAT [--collars FILE --surveys FILE] [CONVERTED.csv...]\n"
    "                    -o FILE\n"
    "\n"
    "Located, oriented structures, hole traces, desurveyed intervals and oriented\n"
    "contacts for 3-D modelling, GIS and CAD.\n"
    "\n"
    "  --format csv          one table: structures (x, y, z, dip, dip_direction, nx,\n"
    "                        ny, nz, polarity, lx, ly, lz when there are lineations,\n"
    "                        then the tables' other columns); or --intervals; or\n"
    "                        --contacts\n"
    "  --format vtk          legacy VTK: traces, structures as discs or points, cell\n"
    "                        data kind, dip, dip_direction, polarity, hole, lineation\n"
    "                        (vector), trend, plunge, the Monte Carlo columns (-1: none);\n"
    "                        or, with --intervals, the intervals as lines\n"
    "  --format gpkg|geojson|dxf|shp|DRIVER\n"
    "                        through GDAL: layers structures (3-D points, every\n"
    "                        attribute), traces (3-D lines, depth as measure), collars,\n"
    "                        findings, intervals, contacts; DXF also discs and\n"
    "                        lineations; shp writes a folder\n"
    "                        (--crs, a shared option, attaches the coordinates'\n"
    "                        reference system, e.g. EPSG:32754)\n"
    "  --layers LIST         only these GIS layers (GeoJSON holds one a file)\n"
    "  --findings FILE       corax check's findings as a layer of points\n"
    "  --intervals [LAYER=]FILE  a from/to table (hole, from, to, ...) desurveyed at\n"
    "                        from, middle and to, with the hole's azimuth and dip at\n"
    "                        the middle; may repeat for GIS\n"
    "  --contacts FILE       a from/to table of units: a contact where the unit changes\n"
    "  --contact-column NAME the unit's column (default unit)\n"
    "  --contact-kinds LIST  kinds whose planes orient contacts (default contact)\n"
    "  --contact-window M    structures this near orient a contact (default 2): the\n"
    "                        Fisher mean of their poles, with count and kappa\n"
    "  --youngest-first LIST units youngest first: polarity and younging_x/y/z\n"
    "  --binary, --ascii     VTK in binary (big-endian) or text; default: text up to\n"
    "                        100000 structures, binary above\n"
    "  --shape discs|points  VTK structures as discs (default) or points with normals\n"
    "  --radius METRES       disc radius, VTK and DXF (default 5)\n"
    "  --arrows METRES       lineations also as lines this long, down-plunge (VTK:\n"
    "                        default none; DXF: default the radius)\n"
    "  --step METRES         sample hole traces every METRES, plus stations (default 5)\n"
    "  --no-traces           no hole traces\n"
    "\n"
    "Polarity: 1 upright (younging along the upward normal), -1 overturned, from a\n"
    "polarity or younging column; empty when not known. Rows without a position or\n"
    "orientation are left out and counted. VTK kind codes: 0 none, 1 bedding,\n"
    "2 foliation, 3 cleavage, 4 vein, 5 fault, 6 shear, 7 joint, 8 fracture, 9 contact,\n"
    "10 lineation, 100 and up others (listed in the .about file). See man corax.\n"
    "\n";

enum {
    OPT_FORMAT = OPT_COMMAND_BASE,
    OPT_BINARY,
    OPT_ASCII,
    OPT_SHAPE,
    OPT_RADIUS,
    OPT_STEP,
    OPT_NO_TRACES,
    OPT_ARROWS,
    OPT_LAYERS,
    OPT_FINDINGS,
    OPT_INTERVALS,
    OPT_CONTACTS,
    OPT_CONTACT_COLUMN,
    OPT_CONTACT_KINDS,
    OPT_CONTACT_WINDOW,
    OPT_YOUNGEST_FIRST
};

/* --intervals [LAYER=]FILE: the layer is the file's name without folder
 * and extension unless given. */
static int add_intervals(export_opts *o, const char *arg, char *why, size_t wl)
{
    if (o->nintervals == EXPORT_MAX_TABLES) {
        snprintf(why, wl, "at most %d interval tables", EXPORT_MAX_TABLES);
        return -1;
    }
    export_table *t = &o->intervals[o->nintervals];
    const char *eq = strchr(arg, '=');
    char *layer;
    if (eq && eq > arg) {
        layer = strndup(arg, (size_t)(eq - arg));
        t->path = eq + 1;
    } else {
        const char *base = strrchr(arg, '/');
        base = base ? base + 1 : arg;
        const char *dot = strrchr(base, '.');
        layer = strndup(base, dot && dot > base ? (size_t)(dot - base) : strlen(base));
        t->path = arg;
    }
    if (!layer || !*layer) {
        free(layer);
        snprintf(why, wl, "'%s' names no layer", arg);
        return -1;
    }
    for (int i = 0; i < o->nintervals; i++)
        if (strcasecmp(o->intervals[i].layer, layer) == 0) {
            snprintf(why, wl, "layer '%s' is given twice (%s and %s): name one of them with "
                     "LAYER=FILE", layer, o->intervals[i].path, t->path);
            free(layer);
            return -1;
        }
    t->layer = layer;
    o->nintervals++;
    return 0;
}

static int export_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    static const char *const shapes[] = {"discs", "points"};
    export_opts *o = ctx;
    int k;
    const char *table = opt == OPT_INTERVALS && strchr(arg, '=') ? strchr(arg, '=') + 1 : arg;
    if ((opt == OPT_INTERVALS || opt == OPT_CONTACTS || opt == OPT_FINDINGS) &&
        strcmp(table, "-") == 0) {
        snprintf(why, wl, "this table is read twice: give a file, not standard input");
        return -1;
    }
    switch (opt) {
    case OPT_FORMAT:
        o->format_name = arg;
        o->format = strcmp(arg, "csv") == 0 ? FORMAT_CSV
                    : strcmp(arg, "vtk") == 0 ? FORMAT_VTK
                                              : FORMAT_GIS;
        return 0;
    case OPT_BINARY:
    case OPT_ASCII:
        o->binary_given = 1;
        o->vtk.encoding = opt == OPT_BINARY ? CORAX_VTK_BINARY : CORAX_VTK_ASCII;
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
    case OPT_ARROWS:
        o->arrows_given = 1;
        return cli_value_number(arg, 1e-3, 1e5, &o->vtk.arrow, why, wl);
    case OPT_LAYERS: o->layers = arg; return 0;
    case OPT_FINDINGS: o->findings = arg; return 0;
    case OPT_INTERVALS: return add_intervals(o, arg, why, wl);
    case OPT_CONTACTS: o->contacts = arg; return 0;
    case OPT_CONTACT_COLUMN: o->contact_column = arg; return 0;
    case OPT_CONTACT_KINDS: o->contact_kinds = arg; return 0;
    case OPT_CONTACT_WINDOW: return cli_value_number(arg, 0, 1e4, &o->contact_window, why, wl);
    case OPT_YOUNGEST_FIRST: o->youngest_first = arg; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

int export_list_next(const char **p, const char **item, size_t *len)
{
    if (!*p || !**p)
        return 0;
    const char *end = strchr(*p, ',');
    *item = *p;
    *len = end ? (size_t)(end - *p) : strlen(*p);
    *p += *len + (end != NULL);
    return 1;
}

int export_wants(const export_opts *o, const char *layer)
{
    if (!o->layers)
        return 1;
    size_t n = strlen(layer), len;
    const char *item, *p = o->layers;
    while (export_list_next(&p, &item, &len))
        if (len == n && strncasecmp(item, layer, n) == 0)
            return 1;
    return 0;
}

/* The checks of a csv export: one table of one kind. */
static int parse_csv(export_opts *o)
{
    if (o->binary_given || o->shape_given || o->radius_given || o->arrows_given ||
        !o->vtk.traces)
        return cli_usage("export", "--binary, --ascii, --shape, --radius, --arrows and --no-traces are "
                                   "for --format vtk and the GIS formats");
    if (o->findings || o->layers)
        return cli_usage("export", "--findings and --layers are for the GIS formats (gpkg, "
                                   "geojson, dxf, shp, ...)");
    if (o->nintervals > 1 || (o->nintervals && o->contacts))
        return cli_usage("export", "a CSV holds one table: give one of --intervals and "
                                   "--contacts (or neither, for structures)");
    if (o->nintervals && o->ninputs)
        return cli_usage("export", "--intervals with --format csv writes the intervals "
                                   "alone: leave out the converted tables");
    if (o->ninputs == 0 && !o->nintervals && !o->contacts)
        return cli_usage("export", "--format csv exports structures: give at least one "
                                   "converted table (hole traces: corax trace --step)");
    return cli_common_finish(&o->c, o->nintervals || o->contacts);
}

static int parse_vtk(export_opts *o)
{
    if (o->findings || o->layers || o->contacts)
        return cli_usage("export", "--findings, --layers and --contacts are for csv and the "
                                   "GIS formats (gpkg, geojson, dxf, shp, ...)");
    if (o->nintervals > 1 || (o->nintervals && o->ninputs))
        return cli_usage("export", "--intervals with --format vtk writes one interval table "
                                   "alone: leave out the converted tables");
    if (o->nintervals)
        return cli_common_finish(&o->c, 1);
    if (o->radius_given && o->vtk.shape == CORAX_EXPORT_POINTS)
        return cli_usage("export", "--radius is for --shape discs");
    if (!o->vtk.traces && o->ninputs == 0)
        return cli_usage("export", "--no-traces and no converted table: nothing to export");
    return cli_common_finish(&o->c, o->vtk.traces);
}

/* A format that is neither ours nor a GDAL vector driver here: say which
 * there are. */
static int unknown_format(const export_opts *o)
{
    char list[4096];
    corax_gis_drivers(list, sizeof list);
    if (corax_gis_known_format(o->format_name))
        return cli_usage("export", "this machine's GDAL has no driver that writes %s; its "
                                   "vector drivers: %s", o->format_name, list);
    return cli_usage("export", "--format: '%s' is not csv, vtk, gpkg, geojson, dxf, shp nor "
                               "a vector driver of this machine's GDAL: %s",
                     o->format_name, list);
}

static int parse_gis(export_opts *o)
{
    if (!corax_gis_driver(o->format_name))
        return unknown_format(o);
    if (o->binary_given || o->shape_given)
        return cli_usage("export", "--binary, --ascii and --shape are for --format vtk");
    if (strcmp(o->c.output, "-") == 0)
        return cli_usage("export", "--format %s writes a file: give -o FILE", o->format_name);
    int need = o->vtk.traces && (!o->layers || export_wants(o, LAYER_TRACES) ||
                                 export_wants(o, LAYER_COLLARS));
    if (o->findings || o->nintervals || o->contacts)
        need = 1;
    if (!need && o->ninputs == 0)
        return cli_usage("export", "nothing to export: give converted tables, or --collars "
                                   "and --surveys for traces");
    return cli_common_finish(&o->c, need);
}

static int parse(int argc, char **argv, export_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        {"format", required_argument, NULL, OPT_FORMAT},
        {"binary", no_argument, NULL, OPT_BINARY},
        {"ascii", no_argument, NULL, OPT_ASCII},
        {"shape", required_argument, NULL, OPT_SHAPE},
        {"radius", required_argument, NULL, OPT_RADIUS},
        {"step", required_argument, NULL, OPT_STEP},
        {"no-traces", no_argument, NULL, OPT_NO_TRACES},
        {"arrows", required_argument, NULL, OPT_ARROWS},
        {"layers", required_argument, NULL, OPT_LAYERS},
        {"findings", required_argument, NULL, OPT_FINDINGS},
        {"intervals", required_argument, NULL, OPT_INTERVALS},
        {"contacts", required_argument, NULL, OPT_CONTACTS},
        {"contact-column", required_argument, NULL, OPT_CONTACT_COLUMN},
        {"contact-kinds", required_argument, NULL, OPT_CONTACT_KINDS},
        {"contact-window", required_argument, NULL, OPT_CONTACT_WINDOW},
        {"youngest-first", required_argument, NULL, OPT_YOUNGEST_FIRST},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, export_help, 1, export_option, o);
    if (rc != 0)
        return rc;
    o->inputs = argv + optind;
    o->ninputs = argc - optind;
    for (int i = 0; i < o->ninputs; i++)
        cli_input(&o->c, "a converted table", o->inputs[i]);
    for (int i = 0; i < o->nintervals; i++)
        cli_input(&o->c, "--intervals", o->intervals[i].path);
    cli_input(&o->c, "--contacts", o->contacts);
    cli_input(&o->c, "--findings", o->findings);
    if (o->format == FORMAT_NONE)
        return cli_usage("export", "--format is needed: csv, vtk, gpkg, geojson, dxf, shp or "
                                   "a GDAL vector driver");
    if (!o->contacts && (o->contact_column || o->contact_kinds || o->youngest_first))
        return cli_usage("export", "--contact-column, --contact-kinds and --youngest-first "
                                   "are for --contacts");
    if (o->format == FORMAT_CSV)
        return parse_csv(o);
    if (o->format == FORMAT_VTK)
        return parse_vtk(o);
    return parse_gis(o);
}

/* ---- the converted tables ---- */

int export_each_structure(const export_opts *o, export_visit *v, void *ctx)
{
    int n = o->ninputs, rc = EXIT_OK, opened = 0;
    cli_converted *t = calloc(n ? (size_t)n : 1, sizeof *t);
    corax_export_columns *x = calloc(n ? (size_t)n : 1, sizeof *x);
    if (!t || !x) {
        cli_error(NULL, 0, "out of memory");
        rc = EXIT_DATA;
    }
    /* every header first: the output's columns are the union of theirs */
    for (int k = 0; rc == EXIT_OK && k < n; k++) {
        if ((rc = cli_converted_open(&o->c, o->inputs[k], &t[k])) != EXIT_OK)
            break;
        opened = k + 1;
        corax_export_columns_find(&t[k].header, cli_table_settings(&o->c, CLI_CONVERTED).columns,
                                  &x[k]);
        if (v->header && v->header(ctx, k, &t[k].header, &t[k].columns, &x[k]) != 0)
            rc = EXIT_DATA;
    }
    if (rc == EXIT_OK && v->begin && v->begin(ctx) != 0)
        rc = EXIT_DATA;
    for (int k = 0; rc == EXIT_OK && k < n; k++) {
        corax_row row;
        corax_structure s;
        corax_export_extra e;
        char why[240];
        while (cli_converted_next(&t[k], &row, &s)) {
            if (corax_export_extra_read(&row, &x[k], t[k].decimal, &e, why, sizeof why) !=
                CORAX_OK) {
                cli_problem(&t[k].problems, t[k].path, row.line, "%s", why);
                continue;
            }
            if (!corax_export_usable(&s, &e)) {
                v->left_out++;
                continue;
            }
            if (v->row(ctx, k, &row, &s, &e) != 0) {
                rc = EXIT_DATA;
                break;
            }
        }
    }
    for (int k = 0; k < opened; k++)
        if (cli_converted_close(&t[k]) != EXIT_OK)
            rc = EXIT_DATA;
    free(t);
    free(x);
    return rc;
}

/* ---- CSV ---- */

typedef struct csv_run {
    corax_writer *w;
    corax_carry *carry;
    int lines;       /* some table has lineations: lx, ly, lz */
    size_t written;
} csv_run;

static int csv_header(void *ctx, int table, const corax_row *header,
                      const corax_structure_columns *c, const corax_export_columns *x)
{
    csv_run *r = ctx;
    (void)table;
    long consumed[] = {c->x, c->y, c->z, c->dip, c->dip_direction, c->polarity};
    if (corax_carry_add(r->carry, header, consumed, 6) < 0) {
        cli_error(NULL, 0, "out of memory");
        return -1;
    }
    r->lines |= corax_export_has_lines(x);
    return 0;
}

/* The header, once every table's is known. */
static int csv_begin(void *ctx)
{
    csv_run *r = ctx;
    for (int i = 0; i < CORAX_EXPORT_CSV_COLUMNS; i++)
        corax_writer_field(r->w, corax_export_csv_columns[i],
                           strlen(corax_export_csv_columns[i]));
    for (int i = 0; r->lines && i < 3; i++)
        corax_writer_field(r->w, corax_export_line_columns[i], 2);
    corax_carry_header(r->carry, r->w);
    corax_writer_end_row(r->w);
    return 0;
}

static int csv_row(void *ctx, int table, const corax_row *row, const corax_structure *s,
                   const corax_export_extra *x)
{
    csv_run *r = ctx;
    corax_export_csv_fields(r->w, s);
    if (r->lines)
        corax_export_csv_line(r->w, x);
    corax_carry_row(r->carry, table, row, r->w);
    corax_writer_end_row(r->w);
    r->written++;
    return 0;
}

static int export_csv(const export_opts *o, corax_writer *w, size_t *written, size_t *left_out)
{
    static const char *const drop[] = {"x", "y", "z", "dip", "dip_direction", "nx", "ny", "nz",
                                       "polarity", "lx", "ly", "lz"};
    csv_run r = {w, corax_carry_new(drop, 12), 0, 0};
    if (!r.carry) {
        cli_error(NULL, 0, "out of memory");
        return EXIT_DATA;
    }
    export_visit v = {csv_header, csv_begin, csv_row, 0};
    int rc = export_each_structure(o, &v, &r);
    *written = r.written;
    *left_out = v.left_out;
    corax_carry_free(r.carry);
    return rc;
}

/* ---- VTK ---- */

typedef struct located {
    corax_export_structure *item;
    size_t n, cap;
    const corax_program *prog;
    corax_kinds *kinds;
    size_t no_plane; /* lines without a plane: VTK draws planes */
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

static int vtk_row(void *ctx, int table, const corax_row *row, const corax_structure *s,
                   const corax_export_extra *x)
{
    located *v = ctx;
    (void)table;
    (void)row;
    if (!s->oriented) {
        v->no_plane++;
        return 0;
    }
    corax_export_structure e = {
        s->position, s->plane, s->depth, corax_kinds_code(v->kinds, s->kind, s->kind_len),
        s->polarity, v->prog ? corax_program_index(v->prog, s->hole, s->hole_len) : -1, 1,
        x->has_line, {(float)x->line.x, (float)x->line.y, (float)x->line.z}, {0}};
    for (int i = 0; i < CORAX_EXPORT_SPREAD; i++)
        e.spread[i] = (float)x->spread[i];
    if (e.kind < 0 || !push(v, &e)) {
        cli_error(NULL, 0, "out of memory");
        return -1;
    }
    return 0;
}

/* ---- the run ---- */

static void about_export(cli_about *a, const export_opts *o, const corax_program *prog,
                         const corax_kinds *kinds)
{
    for (int i = 0; i < o->ninputs; i++)
        cli_about_set(a, "converted", "%s", o->inputs[i]);
    cli_about_set(a, "polarity", "1 upright, -1 overturned, from a polarity or younging column "
                                 "(1, +1, upright, -1, overturned); empty when not known");
    if (o->format == FORMAT_CSV) {
        cli_about_set(a, "normal", "nx, ny, nz: the upward unit normal (x east, y north, z up)");
        cli_about_set(a, "line", "lx, ly, lz: the lineation's unit vector, down-plunge");
        return;
    }
    const corax_export_options *v = &o->vtk;
    cli_about_set(a, "encoding", "%s", v->encoding == CORAX_VTK_BINARY ? "binary (big-endian)"
                                       : v->encoding == CORAX_VTK_ASCII ? "ascii"
                                       : "ascii up to 100000 structures, binary (big-endian) "
                                         "above");
    cli_about_set(a, "shape", "%s", v->shape == CORAX_EXPORT_DISCS ? "discs" : "points");
    if (v->shape == CORAX_EXPORT_DISCS)
        cli_about_set(a, "disc_radius", "%g (%d corners)", v->disc_radius, v->disc_sides);
    cli_about_set(a, "traces", "%s", v->traces ? "yes" : "no");
    cli_about_set(a, "trace_step", "%g (plus every station)", v->step);
    if (v->arrow > 0.0)
        cli_about_set(a, "arrows", "%g m from each structure along its lineation, down-plunge",
                      v->arrow);
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
    located v = {NULL, 0, 0, prog, kinds, 0};
    export_visit visit = {NULL, NULL, vtk_row, 0};
    int rc = export_each_structure(o, &visit, &v);
    *left_out = visit.left_out + v.no_plane;
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

/* A CSV: structures, intervals or contacts. */
static int export_csv_table(const export_opts *o, const corax_program *prog, cli_about *a,
                            size_t *written, size_t *left_out)
{
    corax_writer *w;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open_in(o->c.outputs, o->c.output, &w, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    export_sink sink = {w, NULL, NULL, 0};
    int rc = o->nintervals ? export_intervals(o, prog, &o->intervals[0], &sink)
             : o->contacts ? export_contacts(o, prog, &sink, a)
                           : export_csv(o, w, written, left_out);
    if (o->nintervals || o->contacts) {
        cli_about_section(a, "results");
        cli_about_set(a, o->nintervals ? "intervals" : "contacts", "%zu", sink.written);
    }
    if (rc != EXIT_OK) {
        corax_writer_discard(w);
        return rc;
    }
    if ((st = corax_writer_commit(w, &err)) != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    return EXIT_OK;
}

static int run(const export_opts *o, const corax_program *prog)
{
    size_t written = 0, left_out = 0;
    int rc;
    corax_kinds *kinds = corax_kinds_new();
    cli_about *a = cli_about_new("export", &o->c);
    if (!kinds || !a) {
        cli_error(NULL, 0, "out of memory");
        corax_kinds_free(kinds);
        cli_about_discard(a);
        return EXIT_DATA;
    }
    int structures = o->format != FORMAT_GIS && !o->nintervals && !o->contacts;
    int vtk_intervals = o->format == FORMAT_VTK && o->nintervals;
    cli_about_section(a, "export");
    cli_about_set(a, "format", "%s", o->format_name);
    cli_about_set(a, "crs", "%s", o->c.corr.crs_text ? o->c.corr.crs_text : "none given");
    if (o->format == FORMAT_GIS)
        rc = export_gis(o, prog, a);
    else if (o->format == FORMAT_CSV)
        rc = export_csv_table(o, prog, a, &written, &left_out);
    else if (vtk_intervals)
        rc = export_intervals_vtk(o, prog, a);
    else
        rc = export_vtk(o, prog, kinds, &written, &left_out);
    if (rc == EXIT_OK && structures) {
        if (left_out)
            cli_note(&o->c, "%zu row%s without a position or orientation left out", left_out,
                     left_out == 1 ? "" : "s");
        if (o->ninputs && written == 0)
            cli_note(&o->c, "no located, oriented structures to export");
        about_export(a, o, prog, kinds);
        cli_about_section(a, "results");
        cli_about_set(a, "structures", "%zu", written);
        cli_about_set(a, "left_out", "%zu (no position or no orientation)", left_out);
    }
    if (rc == EXIT_OK)
        rc = cli_about_commit(a, &o->c) != 0 ? EXIT_DATA : EXIT_OK;
    else
        cli_about_discard(a);
    corax_kinds_free(kinds);
    return rc;
}

int cmd_export(int argc, char **argv)
{
    export_opts o;
    memset(&o, 0, sizeof o);
    o.vtk = corax_export_options_default();
    o.contact_window = 2.0;
    cli_common_init(&o.c, "export");
    int rc = parse(argc, argv, &o);
    corax_program *prog;
    /* csv structures take positions from the tables; the rest want the
     * program for traces, hole numbers, intervals and contacts when given */
    int want = o.c.collars && o.c.surveys &&
               (o.format != FORMAT_CSV || o.nintervals || o.contacts);
    if (!cli_begin(&o.c, rc, want, &prog, &rc)) {
        for (int i = 0; i < o.nintervals; i++)
            free((char *)o.intervals[i].layer);
        return rc;
    }
    rc = run(&o, prog);
    corax_program_free(prog);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    for (int i = 0; i < o.nintervals; i++)
        free((char *)o.intervals[i].layer);
    return rc;
}
