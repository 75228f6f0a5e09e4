/* cli: `corax section`, a vertical cross-section through a drill program:
 * the structures of a converted table that lie in the slab, with their
 * apparent dips, as CSV, and the section drawn to scale as SVG. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"

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
    corax_section_job_options j;
    int has_origin, has_azimuth, has_width;
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

static int parse_origin(section_opts *o, const char *arg, char *why, size_t wl)
{
    const char *comma = strchr(arg, ',');
    if (comma &&
        corax_parse_number(arg, (size_t)(comma - arg), '.', &o->j.x) == CORAX_NUMBER_OK &&
        corax_parse_number(comma + 1, strlen(comma + 1), '.', &o->j.y) == CORAX_NUMBER_OK) {
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
        return cli_value_number(arg, 0, 360, &o->j.azimuth, why, wl);
    case OPT_WIDTH:
        o->has_width = 1;
        if (cli_value_number(arg, -HUGE_VAL, HUGE_VAL, &o->j.width, why, wl))
            return -1;
        if (o->j.width > 0.0)
            return 0;
        snprintf(why, wl, "the slab must be wider than 0 m (got %s)", arg);
        return -1;
    case OPT_FROM:
        o->j.has_from = 1;
        return cli_value_number(arg, -1e9, 1e9, &o->j.from, why, wl);
    case OPT_TO:
        o->j.has_to = 1;
        return cli_value_number(arg, -1e9, 1e9, &o->j.to, why, wl);
    case OPT_SVG: o->j.svg = arg; return 0;
    case OPT_SCALE: return cli_value_number(arg, 1, 1e7, &o->j.scale, why, wl);
    case OPT_KINDS:
        o->j.kinds = arg;
        if (strspn(arg, ", \t") != strlen(arg))
            return 0;
        snprintf(why, wl, "no kind named in '%s'", arg);
        return -1;
    case OPT_STEP: return cli_value_number(arg, 1e-3, 1e5, &o->j.step, why, wl);
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
    if (o->j.has_from && o->j.has_to && !(o->j.from < o->j.to))
        return cli_usage("section", "--from must be less than --to");
    if (o->j.svg && strcmp(o->j.svg, "-") == 0 && strcmp(o->c.output, "-") == 0)
        return cli_usage("section", "the table and the drawing cannot both go to standard output");
    cli_input(&o->c, "the converted table", o->input);
    cli_output(&o->c, "--svg", o->j.svg);
    return cli_common_finish(&o->c, 1);
}

int cmd_section(int argc, char **argv)
{
    section_opts o;
    memset(&o, 0, sizeof o);
    o.j = corax_section_job_options_default();
    cli_common_init(&o.c, "section");
    int rc;
    corax_program *prog;
    if (!cli_begin(&o.c, parse(argc, argv, &o), 1, &prog, &rc))
        return rc;
    o.j.converted = cli_table_settings(&o.c, CLI_CONVERTED);
    corax_section_job_summary sum;
    corax_record *record = corax_record_new();
    o.c.job.record = record;
    rc = cli_status(corax_section_job_run(&o.c.job, prog, &o.j, o.input, o.c.output, &sum));
    o.c.job.record = NULL;
    if (rc == EXIT_OK && cli_about_job("section", &o.c, record) != 0)
        rc = EXIT_DATA;
    corax_record_free(record);
    corax_program_free(prog);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc;
}
