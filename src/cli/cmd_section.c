/* cli: `corax section`, a vertical cross-section through a drill program:
 * the structures of a converted table that lie in the slab, with their
 * apparent dips, as CSV, and the section drawn to scale as SVG. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "io/carry.h"

static const char section_help[] =
    "usage: corax section --origin X,Y --azimuth DEG --width METRES [--from M --to M]\n"
    "                     --collars FILE --surveys FILE CONVERTED.csv -o SECTION.csv\n"
    "                     [--svg SECTION.svg]\n"
    "\n"
    "A vertical cross-section along a line through X,Y toward DEG. Every structure of\n"
    "the converted table that lies within the slab (METRES wide, half on each side\n"
    "of the line) goes to SECTION.csv, its own columns first, then:\n"
    "  distance_along        metres from the origin toward the azimuth (negative behind)\n"
    "  offset                metres from the section plane, positive on the right\n"
    "                        looking toward the azimuth\n"
    "  elevation             z, metres\n"
    "  apparent_dip          degrees: tan(apparent) = tan(dip) |cos(azimuth - dip direction)|\n"
    "  apparent_dip_toward   azimuth of the end of the section it dips toward (empty\n"
    "                        when it shows no dip, or has no orientation)\n"
    "Input columns of those names are replaced. Structures without a position are left\n"
    "out (counted on standard error); those without an orientation are kept, with an\n"
    "empty apparent dip.\n"
    "\n"
    "  --origin X,Y          a point on the section line (grid metres)\n"
    "  --azimuth DEG         the direction the section looks (0..360)\n"
    "  --width METRES        width of the slab, > 0\n"
    "  --from M, --to M      keep only this stretch of the line (distances along)\n"
    "  --svg FILE            the section drawn to scale: holes (solid in the slab,\n"
    "                        dashed outside) with depth ticks, structures as ticks at\n"
    "                        their apparent dips coloured by kind\n"
    "  --scale N             draw at 1:N (pixels of 1/96 inch, as SVG prints), rather\n"
    "                        than fitting the section to the page\n"
    "  --kinds LIST          only these feature kinds, e.g. bedding,fault (names match\n"
    "                        without case; the table and the drawing both)\n"
    "  --step METRES         sample hole paths every METRES, plus stations (default 5)\n"
    "Holes that never reach the slab are left out and listed on standard error.\n"
    "\n";

typedef struct section_opts {
    cli_common c;
    double x, y, azimuth, width, from, to, step, scale;
    int has_origin, has_azimuth, has_width, has_from, has_to;
    const char *svg;
    const char *kinds; /* --kinds, as given */
    const char *input;
} section_opts;

enum {
    OPT_ORIGIN = OPT_COMMAND_BASE,
    OPT_AZIMUTH,
    OPT_WIDTH,
    OPT_FROM,
    OPT_TO,
    OPT_SVG,
    OPT_STEP,
    OPT_KINDS,
    OPT_SCALE
};

/* Our own columns, in order. */
static const char *const added[] = {"distance_along", "offset", "elevation", "apparent_dip",
                                    "apparent_dip_toward"};
enum { NADDED = sizeof added / sizeof added[0] };

static int parse_origin(section_opts *o, const char *arg, char *why, size_t wl)
{
    const char *comma = strchr(arg, ',');
    if (comma && corax_parse_number(arg, (size_t)(comma - arg), '.', &o->x) == CORAX_NUMBER_OK &&
        corax_parse_number(comma + 1, strlen(comma + 1), '.', &o->y) == CORAX_NUMBER_OK) {
        o->has_origin = 1;
        return 0;
    }
    snprintf(why, wl, "'%s' is not X,Y (two numbers, e.g. 10400,50300)", arg);
    return -1;
}

static int section_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    section_opts *o = ctx;
    switch (opt) {
    case OPT_ORIGIN: return parse_origin(o, arg, why, wl);
    case OPT_AZIMUTH:
        o->has_azimuth = 1;
        return cli_value_number(arg, 0, 360, &o->azimuth, why, wl);
    case OPT_WIDTH:
        o->has_width = 1;
        if (cli_value_number(arg, -HUGE_VAL, HUGE_VAL, &o->width, why, wl))
            return -1;
        if (o->width > 0.0)
            return 0;
        snprintf(why, wl, "the slab must be wider than 0 m (got %s)", arg);
        return -1;
    case OPT_FROM:
        o->has_from = 1;
        return cli_value_number(arg, -1e9, 1e9, &o->from, why, wl);
    case OPT_TO:
        o->has_to = 1;
        return cli_value_number(arg, -1e9, 1e9, &o->to, why, wl);
    case OPT_SVG: o->svg = arg; return 0;
    case OPT_SCALE: return cli_value_number(arg, 1, 1e7, &o->scale, why, wl);
    case OPT_KINDS:
        o->kinds = arg;
        if (strspn(arg, ", \t") != strlen(arg))
            return 0;
        snprintf(why, wl, "no kind named in '%s'", arg);
        return -1;
    case OPT_STEP: return cli_value_number(arg, 1e-3, 1e5, &o->step, why, wl);
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

static int parse(int argc, char **argv, section_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        {"origin", required_argument, NULL, OPT_ORIGIN},
        {"azimuth", required_argument, NULL, OPT_AZIMUTH},
        {"width", required_argument, NULL, OPT_WIDTH},
        {"from", required_argument, NULL, OPT_FROM},
        {"to", required_argument, NULL, OPT_TO},
        {"svg", required_argument, NULL, OPT_SVG},
        {"step", required_argument, NULL, OPT_STEP},
        {"kinds", required_argument, NULL, OPT_KINDS},
        {"scale", required_argument, NULL, OPT_SCALE},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, section_help, 1, section_option, o);
    if (rc != 0)
        return rc;
    if (!o->has_origin || !o->has_azimuth || !o->has_width)
        return cli_usage("section", "--origin, --azimuth and --width are all needed");
    if (optind >= argc)
        return cli_usage("section", "no converted table given");
    if (optind + 1 < argc)
        return cli_usage("section", "one converted table only ('%s' is one too many)",
                         argv[optind + 1]);
    o->input = argv[optind];
    if (o->has_from && o->has_to && !(o->from < o->to))
        return cli_usage("section", "--from must be less than --to");
    if (o->svg && strcmp(o->svg, "-") == 0 && strcmp(o->c.output, "-") == 0)
        return cli_usage("section", "the table and the drawing cannot both go to standard output");
    cli_input(&o->c, "the converted table", o->input);
    cli_output(&o->c, "--svg", o->svg);
    return cli_common_finish(&o->c, 1);
}

/* One structure in the slab: its row to the table, its mark to the drawing. */
typedef struct slab_run {
    const section_opts *o;
    corax_section section;
    corax_writer *w;
    corax_carry *carry;
    corax_section_drawing *drawing;
    corax_kinds *kinds;
    int *only; /* with --kinds: the codes kept */
    size_t nonly;
    size_t kept, unlocated, outside, other_kinds;
} slab_run;

/* Register the kinds of --kinds and keep their codes: 0, or -1 when out of
 * memory. */
static int only_kinds(slab_run *r, const char *list)
{
    r->only = malloc((strlen(list) / 2 + 1) * sizeof *r->only); /* a kind and a comma each */
    if (!r->only)
        return -1;
    for (const char *p = list; *p;) {
        size_t n = strcspn(p, ",");
        int code = corax_kinds_code(r->kinds, p, n);
        if (code < 0)
            return -1;
        if (strspn(p, " \t") < n) /* blank entries name nothing */
            r->only[r->nonly++] = code;
        p += n + (p[n] == ',');
    }
    return 0;
}

static int wanted(const slab_run *r, int code)
{
    for (size_t i = 0; i < r->nonly; i++)
        if (r->only[i] == code)
            return 1;
    return r->only == NULL;
}

static void tooltip(char *buf, size_t cap, const corax_structure *s, const corax_section_dip *d)
{
    int n = snprintf(buf, cap, "%.*s%s", (int)s->hole_len, s->hole, s->hole_len ? " " : "");
    if (n < 0 || (size_t)n >= cap)
        return;
    if (!isnan(s->depth))
        n += snprintf(buf + n, cap - (size_t)n, "%.2f m ", s->depth);
    if ((size_t)n >= cap)
        return;
    n += snprintf(buf + n, cap - (size_t)n, "%.*s", (int)s->kind_len, s->kind);
    if ((size_t)n >= cap || !d)
        return;
    snprintf(buf + n, cap - (size_t)n, ": dip %.0f toward %03.0f, apparent %.0f",
             corax_deg(s->plane.dip), corax_wrap_degrees(corax_deg(s->plane.dip_direction), 0),
             corax_deg(d->apparent));
}

static int keep(slab_run *r, const corax_row *row, const corax_structure *s)
{
    if (!s->located) {
        r->unlocated++;
        return 0;
    }
    corax_section_point p = corax_section_project(&r->section, s->position);
    if (!corax_section_in_slab(&r->section, &p) || !corax_section_in_range(&r->section, p.along)) {
        r->outside++;
        return 0;
    }
    int code = corax_kinds_code(r->kinds, s->kind, s->kind_len);
    if (code < 0) {
        cli_error(NULL, 0, "out of memory");
        return -1;
    }
    if (!wanted(r, code)) {
        r->other_kinds++;
        return 0;
    }
    corax_section_dip d = {0};
    if (s->oriented)
        d = corax_section_plane(&r->section, s->plane);
    corax_carry_row(r->carry, 0, row, r->w);
    corax_writer_number(r->w, p.along, 3);
    corax_writer_number(r->w, p.offset, 3);
    corax_writer_number(r->w, p.elevation, 3);
    corax_writer_number(r->w, s->oriented ? corax_deg(d.apparent) : (double)NAN, 2);
    corax_writer_azimuth(r->w, corax_deg(d.toward && s->oriented ? d.toward_azimuth : (double)NAN), 2);
    corax_writer_end_row(r->w);
    r->kept++;
    if (!r->drawing)
        return 0;
    char label[200];
    tooltip(label, sizeof label, s, s->oriented ? &d : NULL);
    if (corax_section_drawing_structure(r->drawing, p, s->oriented ? &d : NULL, code,
                                        corax_kinds_name(r->kinds, code), label) != CORAX_OK) {
        cli_error(NULL, 0, "out of memory");
        return -1;
    }
    return 0;
}

/* Read the converted table into the slab's table and drawing. */
static int read_structures(slab_run *r)
{
    cli_converted t;
    int rc = cli_converted_open(&r->o->c, r->o->input, &t);
    if (rc != EXIT_OK)
        return rc;
    if (corax_carry_add(r->carry, &t.header, NULL, 0) < 0) {
        cli_converted_close(&t);
        cli_error(NULL, 0, "out of memory");
        return EXIT_DATA;
    }
    corax_carry_header(r->carry, r->w);
    for (int i = 0; i < NADDED; i++)
        corax_writer_field(r->w, added[i], strlen(added[i]));
    corax_writer_end_row(r->w);
    corax_row row;
    corax_structure s;
    while (cli_converted_next(&t, &row, &s))
        if (keep(r, &row, &s) < 0) {
            cli_converted_close(&t);
            return EXIT_DATA;
        }
    return cli_converted_close(&t);
}

/* Names of holes in a list for a message: "A, B, C and 4 more". */
static void name_list(char *buf, size_t cap, const char *const *names, size_t n)
{
    size_t used = 0, shown = 0;
    buf[0] = '\0';
    for (; shown < n && used + strlen(names[shown]) + 16 < cap && shown < 30; shown++)
        used += (size_t)snprintf(buf + used, cap - used, "%s%s", shown ? ", " : "", names[shown]);
    if (shown < n)
        snprintf(buf + used, cap - used, " and %zu more", n - shown);
}

/* A note listing holes left out, and why. */
static void note_holes(const cli_common *c, const char *const *names, size_t n, const char *why)
{
    char list[1024];
    if (!n)
        return;
    name_list(list, sizeof list, names, n);
    cli_note(c, "%zu hole%s %s, left out: %s", n, n == 1 ? "" : "s", why, list);
}

/* Project every hole; the ones that reach the slab go to the drawing. */
static int add_holes(slab_run *r, const corax_program *prog, size_t *drawn)
{
    size_t nh = corax_program_size(prog), nmiss = 0, npathless = 0;
    const char **missing = malloc(2 * (nh ? nh : 1) * sizeof *missing);
    if (!missing)
        return -1;
    const char **pathless = missing + nh;
    *drawn = 0;
    for (size_t i = 0; i < nh; i++) {
        const corax_hole *h = corax_program_hole(prog, i);
        corax_section_sample *t = NULL;
        size_t n = 0;
        corax_status st = corax_section_trace(&r->section, h, r->o->step, &t, &n);
        if (st == CORAX_ENOMEM) {
            free(missing);
            return -1;
        }
        if (st == CORAX_OK && corax_section_trace_reaches(&r->section, t, n)) {
            if (r->drawing &&
                corax_section_drawing_hole(r->drawing, corax_hole_name(h), t, n) != CORAX_OK) {
                free(t);
                free(missing);
                return -1;
            }
            (*drawn)++;
        } else if (st == CORAX_ENOTFOUND) {
            pathless[npathless++] = corax_hole_name(h);
        } else {
            missing[nmiss++] = corax_hole_name(h);
        }
        free(t);
    }
    note_holes(&r->o->c, missing, nmiss, "never reaching the slab");
    note_holes(&r->o->c, pathless, npathless, "without a path (no survey, no collar direction)");
    free(missing);
    return 0;
}

static corax_svg *draw(const slab_run *r, size_t holes)
{
    const section_opts *o = r->o;
    char title[512], footer[512];
    int n = snprintf(title, sizeof title,
                     "Cross-section toward %03.0f\xc2\xb0 through %.10g, %.10g\n"
                     "Slab %g m wide (%g m each side of the line)",
                     corax_wrap_degrees(o->azimuth, 0), o->x, o->y, o->width, o->width / 2);
    if (n > 0 && (size_t)n < sizeof title && o->has_from)
        n += snprintf(title + n, sizeof title - (size_t)n, ", from %g m", o->from);
    if (n > 0 && (size_t)n < sizeof title && o->has_to)
        n += snprintf(title + n, sizeof title - (size_t)n, ", to %g m", o->to);
    if (n > 0 && (size_t)n < sizeof title && (o->has_from || o->has_to))
        n += snprintf(title + n, sizeof title - (size_t)n, " along");
    if (n > 0 && (size_t)n < sizeof title)
        snprintf(title + n, sizeof title - (size_t)n, "; %zu structure%s, %zu hole%s", r->kept,
                 r->kept == 1 ? "" : "s", holes, holes == 1 ? "" : "s");
    snprintf(footer, sizeof footer,
             "corax %s. Structures from %s; holes desurveyed by minimum curvature. Apparent dips "
             "in a vertical section; offsets positive to the right looking toward %03.0f\xc2\xb0.",
             CORAX_VERSION, strcmp(o->input, "-") ? o->input : "standard input",
             corax_wrap_degrees(o->azimuth, 0));
    return corax_section_drawing_render(r->drawing, title, footer);
}

static int write_about(const section_opts *o, const slab_run *r, size_t holes)
{
    cli_about *a = cli_about_new("section", &o->c);
    cli_about_section(a, "section");
    cli_about_set(a, "converted", "%s", o->input);
    cli_about_set(a, "origin", "%.10g,%.10g", o->x, o->y);
    cli_about_set(a, "azimuth", "%g (distance along grows this way)", o->azimuth);
    cli_about_set(a, "width", "%g (the slab reaches %g either side of the line)", o->width,
                  o->width / 2);
    if (o->has_from)
        cli_about_set(a, "from", "%g", o->from);
    if (o->has_to)
        cli_about_set(a, "to", "%g", o->to);
    cli_about_set(a, "offset_sign", "positive on the right looking toward the azimuth");
    cli_about_set(a, "apparent_dip", "tan(apparent) = tan(dip) |cos(azimuth - dip direction)|");
    cli_about_set(a, "trace_step", "%g", o->step);
    if (o->svg)
        cli_about_set(a, "drawing", "%s", o->svg);
    if (o->kinds)
        cli_about_set(a, "kinds", "%s (only these)", o->kinds);
    if (o->scale > 0.0)
        cli_about_set(a, "scale", "1:%g at 96 pixels to the inch", o->scale);
    cli_about_section(a, "results");
    cli_about_set(a, "structures_in_slab", "%zu", r->kept);
    cli_about_set(a, "structures_outside", "%zu", r->outside);
    if (o->kinds)
        cli_about_set(a, "structures_of_other_kinds", "%zu", r->other_kinds);
    cli_about_set(a, "structures_without_position", "%zu", r->unlocated);
    cli_about_set(a, "holes_drawn", "%zu", holes);
    return cli_about_commit(a, &o->c) ? EXIT_DATA : EXIT_OK;
}

/* Commit the table, then save the drawing made before it. */
static int finish(slab_run *r, corax_svg *svg)
{
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_commit(r->w, &err);
    r->w = NULL;
    if (st == CORAX_OK && svg)
        st = corax_svg_save(svg, r->o->c.outputs, r->o->svg, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    return EXIT_OK;
}

static int run(const section_opts *o, const corax_program *prog)
{
    slab_run r = {o, corax_section_make(o->x, o->y, corax_rad(o->azimuth), o->width),
                  NULL, NULL, NULL, NULL, NULL, 0, 0, 0, 0, 0};
    if (o->has_from)
        r.section.from = o->from;
    if (o->has_to)
        r.section.to = o->to;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open_in(o->c.outputs, o->c.output, &r.w, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        return EXIT_DATA;
    }
    int rc = EXIT_DATA;
    size_t holes = 0;
    corax_svg *svg = NULL;
    r.carry = corax_carry_new(added, NADDED);
    r.kinds = corax_kinds_new();
    r.drawing = o->svg ? corax_section_drawing_new(&r.section, o->step) : NULL;
    if (r.drawing)
        corax_section_drawing_scale(r.drawing, o->scale);
    if (!r.carry || !r.kinds || (o->svg && !r.drawing) ||
        (o->kinds && only_kinds(&r, o->kinds) != 0)) {
        cli_error(NULL, 0, "out of memory");
        goto done;
    }
    if ((rc = read_structures(&r)) != EXIT_OK)
        goto done;
    rc = EXIT_DATA;
    if (add_holes(&r, prog, &holes) != 0 || (o->svg && !(svg = draw(&r, holes)))) {
        cli_error(NULL, 0, "out of memory");
        goto done;
    }
    if (r.unlocated)
        cli_note(&o->c, "%zu row%s without a position (x, y, z empty) left out", r.unlocated,
                 r.unlocated == 1 ? "" : "s");
    if (r.kept == 0)
        cli_note(&o->c, "the slab holds no structures: the table has only its header%s",
                 o->svg ? ", the drawing only holes" : "");
    if ((rc = finish(&r, svg)) == EXIT_OK)
        rc = write_about(o, &r, holes);
done:
    corax_writer_discard(r.w);
    corax_svg_free(svg);
    corax_section_drawing_free(r.drawing);
    corax_kinds_free(r.kinds);
    corax_carry_free(r.carry);
    free(r.only);
    return rc;
}

int cmd_section(int argc, char **argv)
{
    section_opts o;
    memset(&o, 0, sizeof o);
    o.step = 5.0;
    cli_common_init(&o.c, "section");
    int rc;
    corax_program *prog;
    if (!cli_begin(&o.c, parse(argc, argv, &o), 1, &prog, &rc))
        return rc;
    rc = run(&o, prog);
    corax_program_free(prog);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc;
}
