/* cli: `corax export`, located, oriented structures, hole traces, intervals
 * and contacts for 3-D modelling, GIS and CAD: the options over the
 * library's export job (job_export.h). */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>

#include "cli/cli.h"

typedef struct export_opts {
    cli_common c;
    corax_export_job_options j;
    int binary_given, shape_given, radius_given;
    char **inputs; /* converted tables */
    int ninputs;
} export_opts;

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
    if (o->j.nintervals == CORAX_EXPORT_TABLES) {
        snprintf(why, wl, "at most %d interval tables", CORAX_EXPORT_TABLES);
        return -1;
    }
    corax_export_table *t = &o->j.intervals[o->j.nintervals];
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
    for (int i = 0; i < o->j.nintervals; i++)
        if (strcasecmp(o->j.intervals[i].layer, layer) == 0) {
            snprintf(why, wl, "layer '%s' is given twice (%s and %s): name one of them with "
                     "LAYER=FILE", layer, o->j.intervals[i].path, t->path);
            free(layer);
            return -1;
        }
    t->layer = layer;
    o->j.nintervals++;
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
        o->j.format_name = arg;
        o->j.format = strcmp(arg, "csv") == 0   ? CORAX_EXPORT_JOB_CSV
                      : strcmp(arg, "vtk") == 0 ? CORAX_EXPORT_JOB_VTK
                                                : CORAX_EXPORT_JOB_GIS;
        return 0;
    case OPT_BINARY:
    case OPT_ASCII:
        o->binary_given = 1;
        o->j.vtk.encoding = opt == OPT_BINARY ? CORAX_VTK_BINARY : CORAX_VTK_ASCII;
        return 0;
    case OPT_SHAPE:
        o->shape_given = 1;
        if (cli_value_choice(arg, shapes, 2, &k, why, wl))
            return -1;
        o->j.vtk.shape = k == 0 ? CORAX_EXPORT_DISCS : CORAX_EXPORT_POINTS;
        return 0;
    case OPT_RADIUS:
        o->radius_given = 1;
        return cli_value_number(arg, 1e-3, 1e5, &o->j.vtk.disc_radius, why, wl);
    case OPT_STEP: return cli_value_number(arg, 1e-3, 1e5, &o->j.vtk.step, why, wl);
    case OPT_NO_TRACES: o->j.vtk.traces = 0; return 0;
    case OPT_ARROWS:
        o->j.arrows_given = 1;
        return cli_value_number(arg, 1e-3, 1e5, &o->j.vtk.arrow, why, wl);
    case OPT_LAYERS: o->j.layers = arg; return 0;
    case OPT_FINDINGS: o->j.findings = arg; return 0;
    case OPT_INTERVALS: return add_intervals(o, arg, why, wl);
    case OPT_CONTACTS: o->j.contacts = arg; return 0;
    case OPT_CONTACT_COLUMN: o->j.contact_column = arg; return 0;
    case OPT_CONTACT_KINDS: o->j.contact_kinds = arg; return 0;
    case OPT_CONTACT_WINDOW: return cli_value_number(arg, 0, 1e4, &o->j.contact_window, why, wl);
    case OPT_YOUNGEST_FIRST: o->j.youngest_first = arg; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

/* The checks of a csv export: one table of one kind. */
static int parse_csv(export_opts *o)
{
    if (o->binary_given || o->shape_given || o->radius_given || o->j.arrows_given ||
        !o->j.vtk.traces)
        return cli_usage("export", "--binary, --ascii, --shape, --radius, --arrows and "
                                   "--no-traces are "
                                   "for --format vtk and the GIS formats");
    if (o->j.findings || o->j.layers)
        return cli_usage("export", "--findings and --layers are for the GIS formats (gpkg, "
                                   "geojson, dxf, shp, ...)");
    if (o->j.nintervals > 1 || (o->j.nintervals && o->j.contacts))
        return cli_usage("export", "a CSV holds one table: give one of --intervals and "
                                   "--contacts (or neither, for structures)");
    if (o->j.nintervals && o->ninputs)
        return cli_usage("export", "--intervals with --format csv writes the intervals "
                                   "alone: leave out the converted tables");
    if (o->ninputs == 0 && !o->j.nintervals && !o->j.contacts)
        return cli_usage("export", "--format csv exports structures: give at least one "
                                   "converted table (hole traces: corax trace --step)");
    return cli_common_finish(&o->c, o->j.nintervals || o->j.contacts);
}

static int parse_vtk(export_opts *o)
{
    if (o->j.findings || o->j.layers || o->j.contacts)
        return cli_usage("export", "--findings, --layers and --contacts are for csv and the "
                                   "GIS formats (gpkg, geojson, dxf, shp, ...)");
    if (o->j.nintervals > 1 || (o->j.nintervals && o->ninputs))
        return cli_usage("export", "--intervals with --format vtk writes one interval table "
                                   "alone: leave out the converted tables");
    if (o->j.nintervals)
        return cli_common_finish(&o->c, 1);
    if (o->radius_given && o->j.vtk.shape == CORAX_EXPORT_POINTS)
        return cli_usage("export", "--radius is for --shape discs");
    if (!o->j.vtk.traces && o->ninputs == 0)
        return cli_usage("export", "--no-traces and no converted table: nothing to export");
    return cli_common_finish(&o->c, o->j.vtk.traces);
}

/* A format that is neither ours nor a GDAL vector driver here: say which
 * there are. */
static int unknown_format(const export_opts *o)
{
    char list[4096];
    const char *missing = corax_gis_unavailable();
    if (missing && corax_gis_known_format(o->j.format_name))
        return cli_usage("export", "--format %s is written through GDAL: %s (install GDAL's "
                                   "library, or export csv or vtk)", o->j.format_name, missing);
    corax_gis_drivers(list, sizeof list);
    if (corax_gis_known_format(o->j.format_name))
        return cli_usage("export", "this machine's GDAL has no driver that writes %s; its "
                                   "vector drivers: %s", o->j.format_name, list);
    return cli_usage("export", "--format: '%s' is not csv, vtk, gpkg, geojson, dxf, shp nor "
                               "a vector driver of this machine's GDAL: %s",
                     o->j.format_name, list);
}

/* Standard output, a device or a pipe: a GIS file is made whole, then put
 * in place by a rename, which would replace such a thing (as root, even
 * /dev/null) rather than write to it. A folder is a place (shapefiles). */
static int is_stream(const char *path)
{
    struct stat st;
    return !corax_path_replaceable(path) && !(stat(path, &st) == 0 && S_ISDIR(st.st_mode));
}

static int parse_gis(export_opts *o)
{
    if (!corax_gis_driver(o->j.format_name))
        return unknown_format(o);
    if (o->binary_given || o->shape_given)
        return cli_usage("export", "--binary, --ascii and --shape are for --format vtk");
    if (is_stream(o->c.output))
        return cli_usage("export", "--format %s writes a file: give -o FILE (not standard "
                                   "output, a device or a pipe)", o->j.format_name);
    int need = o->j.vtk.traces && (!o->j.layers || corax_export_job_wants(&o->j, "traces") ||
                                   corax_export_job_wants(&o->j, "collars"));
    if (o->j.findings || o->j.nintervals || o->j.contacts)
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
    for (int i = 0; i < o->j.nintervals; i++)
        cli_input(&o->c, "--intervals", o->j.intervals[i].path);
    cli_input(&o->c, "--contacts", o->j.contacts);
    cli_input(&o->c, "--findings", o->j.findings);
    if (!o->j.format_name)
        return cli_usage("export", "--format is needed: csv, vtk, gpkg, geojson, dxf, shp or "
                                   "a GDAL vector driver");
    if (!o->j.contacts && (o->j.contact_column || o->j.contact_kinds || o->j.youngest_first))
        return cli_usage("export", "--contact-column, --contact-kinds and --youngest-first "
                                   "are for --contacts");
    if (o->j.format == CORAX_EXPORT_JOB_CSV)
        return parse_csv(o);
    if (o->j.format == CORAX_EXPORT_JOB_VTK)
        return parse_vtk(o);
    return parse_gis(o);
}

static int run(export_opts *o, const corax_program *prog)
{
    o->j.crs = o->c.corr.crs_text;
    o->j.collar_dip = cli_table_dip(&o->c, CLI_COLLARS);
    o->j.converted = cli_table_settings(&o->c, CLI_CONVERTED);
    o->j.depths = cli_table_settings(&o->c, CLI_DEPTHS);
    /* the record's inputs are the tables read before the export */
    cli_about *a = cli_about_new("export", &o->c);
    corax_record *record = corax_record_new();
    o->c.job.record = record;
    corax_export_job_summary sum;
    int rc = cli_status(corax_export_job_run(&o->c.job, prog, &o->j,
                                             (const char *const *)o->inputs,
                                             (size_t)o->ninputs, o->c.output, &sum));
    o->c.job.record = NULL;
    if (rc == EXIT_OK && (!a || !record)) {
        cli_error(NULL, 0, "out of memory");
        rc = EXIT_DATA;
    }
    corax_record_append(a, record);
    corax_record_free(record);
    if (rc == EXIT_OK)
        rc = cli_about_commit(a, &o->c) != 0 ? EXIT_DATA : EXIT_OK;
    else
        cli_about_discard(a);
    return rc;
}

int cmd_export(int argc, char **argv)
{
    export_opts o;
    memset(&o, 0, sizeof o);
    o.j = corax_export_job_options_default();
    o.j.format_name = NULL; /* --format is needed */
    cli_common_init(&o.c, "export");
    int rc = parse(argc, argv, &o);
    corax_program *prog;
    /* csv structures take positions from the tables; the rest want the
     * program for traces, hole numbers, intervals and contacts when given */
    int want = o.c.collars && o.c.surveys &&
               (o.j.format != CORAX_EXPORT_JOB_CSV || o.j.nintervals || o.j.contacts);
    if (!cli_begin(&o.c, rc, want, &prog, &rc)) {
        for (int i = 0; i < o.j.nintervals; i++)
            free((char *)o.j.intervals[i].layer);
        return rc;
    }
    rc = run(&o, prog);
    corax_program_free(prog);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    for (int i = 0; i < o.j.nintervals; i++)
        free((char *)o.j.intervals[i].layer);
    return rc;
}
