/* cli: `corax plan`, drill planning. What each planned hole would see of the
 * structure sets, where it would pierce the target planes, and a sweep of
 * hole directions scored by how well they sample every set at once. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "corax/plan_drawing.h"
#include "corax/plan_load.h"

static const char plan_help[] =
    "usage: corax plan --holes PLANNED.csv --sets SETS.csv [--targets TARGETS.csv]\n"
    "                  -o SAMPLING.csv [--pierce PIERCE.csv]\n"
    "                  [--sweep azimuth=0:360:5,dip=-45:-90:5 --best BEST.csv --svg SCORE.svg]\n"
    "\n"
    "What planned holes would see of the structures they are drilled to sample,\n"
    "and the best direction to drill them.\n"
    "\n"
    "  --holes FILE          planned holes: hole, x, y, z, azimuth, dip, length;\n"
    "                        optional lift and drift, degrees per 30 m (lift turns\n"
    "                        the hole upward, drift clockwise seen from above; a\n"
    "                        curved plan gets a station every 30 m, desurveyed by\n"
    "                        minimum curvature)\n"
    "  --sets FILE           sets to sample: set, dip, dip_direction; optional kappa\n"
    "                        (Fisher) or cone95 (degrees: the cone about the mean pole\n"
    "                        holding 95% of the poles), and weight (default 1)\n"
    "  --targets FILE        target planes: target, x, y, z, dip, dip_direction\n"
    "  -o FILE               one row per hole and set: hole, set, expected_alpha,\n"
    "                        alpha_sd, expected_beta, terzaghi_factor, status, note\n"
    "  --pierce FILE         one row per hole and target: hole, target, depth, x, y, z,\n"
    "                        alpha, status, note (missed: the closest approach)\n"
    "  --sweep SPEC          directions to try: azimuth=FROM:TO:STEP,dip=FROM:TO:STEP\n"
    "                        (degrees; azimuths clockwise from FROM to TO, dips under\n"
    "                        --dip-convention), every planned hole turned to each\n"
    "  --best FILE           the swept directions, best first: azimuth, dip, score,\n"
    "                        worst_set, worst_alpha\n"
    "  --svg FILE            the score over the directions on a lower-hemisphere net\n"
    "  --title TEXT          the picture's title\n"
    "\n"
    "Along a hole, every metre is counted: expected_alpha and alpha_sd are the mean\n"
    "and spread of the alphas the hole would log (each plane of the set's spread\n"
    "counted as often as the hole crosses it), expected_beta the mean plane's, and\n"
    "terzaghi_factor the planes crossed relative to a hole of the same length square\n"
    "to the set (Terzaghi 1965). score = share of target planes reached x weighted\n"
    "geometric mean of the sets' factors over the program.\n"
    "Status: ok; near-parallel (expected alpha below --near-parallel); parallel (the\n"
    "hole never crosses the set: beta undefined); no-reference-line (near-vertical\n"
    "hole: no beta); missed (a target plane not reached).\n"
    "\n";

enum {
    OPT_HOLES = OPT_COMMAND_BASE,
    OPT_SETS,
    OPT_TARGETS,
    OPT_PIERCE,
    OPT_SWEEP,
    OPT_BEST,
    OPT_SVG,
    OPT_TITLE,
};

typedef struct plan_opts {
    cli_common c;
    corax_convert_options cv;
    const char *holes, *sets, *targets, *pierce, *sweep, *best, *svg, *title;
    double range[2][3]; /* azimuth and dip: from, to, step, degrees */
    corax_plan_direction *directions;
    size_t ndirections;
    corax_plan_range azimuth, plunge; /* the sweep in radians, plunges */
} plan_opts;

/* The dip convention of the planned holes and the swept dips, and how the
 * plan's tables are written: from the shared options. */
static corax_dip_convention plan_dips(const cli_common *c)
{
    return cli_table_dip(c, CLI_COLLARS); /* planned holes are collars to be */
}

static corax_plan_load_options plan_tables(const cli_common *c)
{
    corax_table_settings ts = cli_table_settings(c, CLI_DEPTHS);
    corax_plan_load_options lo = {ts.format, ts.columns, plan_dips(c)};
    return lo;
}

/* "azimuth=A:B:S,dip=A:B:S" into o->range. */
static int sweep_spec(plan_opts *o, const char *arg, char *why, size_t wl)
{
    static const char *const keys[] = {"azimuth", "dip"};
    int seen = 0;
    for (const char *p = arg; *p;) {
        size_t n = strcspn(p, ","), k;
        const char *eq = memchr(p, '=', n);
        for (k = 0; k < 2; k++)
            if (eq && (size_t)(eq - p) == strlen(keys[k]) && !memcmp(p, keys[k], strlen(keys[k])))
                break;
        double *v = k < 2 ? o->range[k] : NULL;
        const char *f = eq ? eq + 1 : p, *end = p + n;
        for (int i = 0; v && i < 3; i++) {
            const char *stop = i < 2 ? memchr(f, ':', (size_t)(end - f)) : end;
            if (!stop || corax_parse_number(f, (size_t)(stop - f), '.', &v[i]) != CORAX_NUMBER_OK)
                v = NULL;
            else
                f = stop + 1;
        }
        if (!v || (seen & (1 << k))) {
            snprintf(why, wl, "'%.*s' is not azimuth=FROM:TO:STEP or dip=FROM:TO:STEP (each "
                     "once, in degrees)", (int)n, p);
            return -1;
        }
        seen |= 1 << k;
        p = end + (*end == ',');
    }
    if (seen != 3) {
        snprintf(why, wl, "'%s' needs both azimuth=FROM:TO:STEP and dip=FROM:TO:STEP", arg);
        return -1;
    }
    o->sweep = arg;
    return 0;
}

static int plan_option(void *ctx, int opt, const char *arg, char *why, size_t wl)
{
    plan_opts *o = ctx;
    int k = cli_convention_option(&o->cv, opt, arg, why, wl);
    if (k)
        return k < 0 ? -1 : 0;
    switch (opt) {
    case OPT_HOLES: o->holes = arg; return 0;
    case OPT_SETS: o->sets = arg; return 0;
    case OPT_TARGETS: o->targets = arg; return 0;
    case OPT_PIERCE: o->pierce = arg; return 0;
    case OPT_SWEEP: return sweep_spec(o, arg, why, wl);
    case OPT_BEST: o->best = arg; return 0;
    case OPT_SVG: o->svg = arg; return 0;
    case OPT_TITLE: o->title = arg; return 0;
    }
    snprintf(why, wl, "not an option of this command");
    return -1;
}

/* The sweep's directions, from the ranges and the dip convention. */
static int expand_sweep(plan_opts *o)
{
    corax_dip_convention conv = plan_dips(&o->c);
    double *az = o->range[0], *dip = o->range[1], from, to;
    for (int i = 0; i < 2; i++)
        if (corax_dip_to_plunge(dip[i], conv, i ? &to : &from) != CORAX_OK)
            return cli_usage("plan", "--sweep: dip %g is outside the range of %s", dip[i],
                             corax_dip_convention_name(conv));
    o->azimuth = (corax_plan_range){corax_rad(az[0]), corax_rad(az[1]), corax_rad(az[2])};
    o->plunge = (corax_plan_range){from, to, corax_rad(dip[2])};
    corax_error err;
    corax_error_clear(&err);
    if (corax_plan_directions(o->azimuth, o->plunge, &o->directions, &o->ndirections, &err) !=
        CORAX_OK)
        return cli_usage("plan", "--sweep: %s", err.message);
    return 0;
}

static int parse(int argc, char **argv, plan_opts *o)
{
    static const struct option longopts[] = {
        CLI_COMMON_OPTIONS,
        CLI_CONVENTION_OPTIONS,
        {"holes", required_argument, NULL, OPT_HOLES},
        {"sets", required_argument, NULL, OPT_SETS},
        {"targets", required_argument, NULL, OPT_TARGETS},
        {"pierce", required_argument, NULL, OPT_PIERCE},
        {"sweep", required_argument, NULL, OPT_SWEEP},
        {"best", required_argument, NULL, OPT_BEST},
        {"svg", required_argument, NULL, OPT_SVG},
        {"title", required_argument, NULL, OPT_TITLE},
        {NULL, 0, NULL, 0},
    };
    int rc = cli_parse(argc, argv, &o->c, longopts, plan_help, 1, plan_option, o);
    if (rc == -1)
        fputs(cli_convention_help, stdout);
    if (rc != 0)
        return rc;
    if (optind < argc)
        return cli_usage("plan", "'%s': plan reads its tables from --holes, --sets and "
                                 "--targets", argv[optind]);
    if (!o->holes || !o->sets)
        return cli_usage("plan", "--holes and --sets are both needed");
    if (!o->c.project && (o->c.collars || o->c.surveys || o->c.load.declination != 0.0 ||
                          o->c.load.convergence != 0.0))
        return cli_usage("plan", "--collars, --surveys, --declination and --convergence do "
                                 "not apply: planned holes are given in the grid, as planned");
    if (o->pierce && !o->targets)
        return cli_usage("plan", "--pierce needs --targets");
    if (o->targets && !o->pierce && !o->sweep)
        return cli_usage("plan", "--targets is used by --pierce and --sweep: give either");
    if (o->sweep && !o->best && !o->svg)
        return cli_usage("plan", "--sweep needs --best or --svg (or both) to write to");
    if ((o->best || o->svg) && !o->sweep)
        return cli_usage("plan", "--best and --svg show a --sweep: give one");
    const char *outputs[] = {o->c.output, o->pierce, o->best, o->svg};
    int to_stdout = 0;
    for (int i = 0; i < 4; i++)
        to_stdout += outputs[i] && strcmp(outputs[i], "-") == 0;
    if (to_stdout > 1)
        return cli_usage("plan", "only one output can go to standard output");
    if (o->sweep && (rc = expand_sweep(o)) != 0)
        return rc;
    cli_input(&o->c, "--holes", o->holes);
    cli_input(&o->c, "--sets", o->sets);
    cli_input(&o->c, "--targets", o->targets);
    cli_output(&o->c, "--pierce", o->pierce);
    cli_output(&o->c, "--best", o->best);
    cli_output(&o->c, "--svg", o->svg);
    return cli_common_finish(&o->c, 0);
}

/* ---- the run ---- */

typedef struct plan_run {
    const plan_opts *o;
    corax_plan_inputs in;
    corax_plan_model *model;
    corax_hole **paths;
    corax_plan_sampling *sampling; /* holes x sets */
    corax_plan_pierce *pierces;    /* holes x targets */
    corax_plan_program_set *program;
    double *lengths;
} plan_run;

/* Read the three tables; EXIT_DATA with the faults printed. */
static int load(plan_run *r)
{
    const plan_opts *o = r->o;
    corax_findings problems = {0};
    corax_error err;
    corax_error_clear(&err);
    corax_plan_load_options lo = plan_tables(&o->c);
    corax_status st = corax_plan_holes_load(o->holes, &lo, &r->in, &problems, &err);
    if (st == CORAX_OK)
        st = corax_plan_sets_load(o->sets, &lo, &r->in, &problems, &err);
    if (st == CORAX_OK && o->targets)
        st = corax_plan_targets_load(o->targets, &lo, &r->in, &problems, &err);
    if (st != CORAX_OK) {
        cli_error_record(&err, st);
        corax_findings_clear(&problems);
        return EXIT_DATA;
    }
    for (size_t i = 0; i < problems.count; i++)
        cli_finding(&problems.item[i]);
    size_t errors = problems.count;
    corax_findings_clear(&problems);
    if (errors) {
        cli_error(NULL, 0, "%zu problem%s in the plan's tables; nothing written", errors,
                  errors == 1 ? "" : "s");
        return EXIT_DATA;
    }
    if (!r->in.nholes || !r->in.nsets) {
        cli_error(r->in.nholes ? o->sets : o->holes, 0, "the table has no %s",
                  r->in.nholes ? "set" : "planned hole");
        return EXIT_DATA;
    }
    return EXIT_OK;
}

/* Desurvey, sample and pierce every planned hole. */
static int evaluate(plan_run *r)
{
    size_t nh = r->in.nholes, ns = r->in.nsets, nt = r->in.ntargets;
    corax_error err;
    corax_error_clear(&err);
    r->paths = calloc(nh, sizeof *r->paths);
    r->sampling = malloc(nh * ns * sizeof *r->sampling);
    r->pierces = malloc((nt ? nh * nt : 1) * sizeof *r->pierces);
    r->program = malloc(ns * sizeof *r->program);
    r->lengths = malloc(nh * sizeof *r->lengths);
    corax_status st = r->paths && r->sampling && r->pierces && r->program && r->lengths
                          ? corax_plan_model_new(r->in.sets, ns, &r->o->cv, &r->model)
                          : CORAX_ENOMEM;
    for (size_t h = 0; h < nh && st == CORAX_OK; h++) {
        st = corax_plan_path(&r->in.holes[h], &r->paths[h], &err);
        if (st == CORAX_OK)
            st = corax_plan_sample(r->model, r->paths[h], &r->sampling[h * ns]);
        for (size_t t = 0; t < nt && st == CORAX_OK; t++)
            st = corax_plan_pierce_target(r->paths[h], &r->in.targets[t], &r->o->cv,
                                          &r->pierces[h * nt + t]);
        r->lengths[h] = r->in.holes[h].length;
    }
    if (st != CORAX_OK) {
        if (err.message[0])
            cli_error(r->o->holes, err.line, "%s", err.message);
        else
            cli_error(NULL, 0, "%s", corax_strerror(st));
        return EXIT_DATA;
    }
    corax_plan_program(r->model, r->sampling, r->lengths, nh, r->program);
    return EXIT_OK;
}

static void text_field(corax_writer *w, const char *s) { corax_writer_field(w, s, strlen(s)); }

static void header(corax_writer *w, const char *const *names, size_t n)
{
    for (size_t i = 0; i < n; i++)
        text_field(w, names[i]);
    corax_writer_end_row(w);
}

static void write_sampling(const plan_run *r, corax_writer *w)
{
    static const char *const names[] = {"hole",     "set",          "expected_alpha",
                                        "alpha_sd", "expected_beta", "terzaghi_factor",
                                        "status",   "note"};
    header(w, names, 8);
    size_t ns = r->in.nsets;
    for (size_t h = 0; h < r->in.nholes; h++)
        for (size_t i = 0; i < ns; i++) {
            const corax_plan_sampling *s = &r->sampling[h * ns + i];
            char note[600];
            corax_plan_sampling_note(s, r->in.holes[h].length, &r->o->cv, note, sizeof note);
            text_field(w, r->in.holes[h].name);
            text_field(w, r->in.sets[i].name);
            corax_writer_number(w, corax_deg(s->alpha), 2);
            corax_writer_number(w, corax_deg(s->alpha_sd), 2);
            corax_writer_azimuth(w, corax_deg(s->beta), 2);
            corax_writer_number(w, s->factor, 3);
            text_field(w, corax_plan_status_name(s->status));
            text_field(w, note);
            corax_writer_end_row(w);
        }
}

static void write_pierces(const plan_run *r, corax_writer *w)
{
    static const char *const names[] = {"hole", "target", "depth", "x",   "y",
                                        "z",    "alpha",  "status", "note"};
    header(w, names, 9);
    size_t nt = r->in.ntargets;
    for (size_t h = 0; h < r->in.nholes; h++)
        for (size_t t = 0; t < nt; t++) {
            const corax_plan_pierce *p = &r->pierces[h * nt + t];
            char note[400];
            corax_plan_pierce_note(p, r->in.holes[h].length, note, sizeof note);
            text_field(w, r->in.holes[h].name);
            text_field(w, r->in.targets[t].name);
            corax_writer_number(w, p->depth, 3);
            corax_writer_number(w, p->point.x, 3);
            corax_writer_number(w, p->point.y, 3);
            corax_writer_number(w, p->point.z, 3);
            corax_writer_number(w, corax_deg(p->alpha), 2);
            text_field(w, corax_plan_status_name(p->status));
            text_field(w, note);
            corax_writer_end_row(w);
        }
}

static void write_best(const plan_run *r, corax_writer *w)
{
    static const char *const names[] = {"azimuth", "dip", "score", "worst_set", "worst_alpha"};
    header(w, names, 5);
    for (size_t k = 0; k < r->o->ndirections; k++) {
        const corax_plan_direction *d = &r->o->directions[k];
        corax_writer_azimuth(w, corax_deg(d->azimuth), 2);
        corax_writer_number(w, corax_plunge_to_dip(d->plunge, plan_dips(&r->o->c)), 2);
        corax_writer_number(w, d->score, 4);
        text_field(w, r->in.sets[d->worst_set].name);
        corax_writer_number(w, corax_deg(d->worst_alpha), 2);
        corax_writer_end_row(w);
    }
}

/* Write one table whole or not at all; 0, or -1 with the message printed. */
static int write_table(const plan_run *r, const char *path,
                       void (*fill)(const plan_run *, corax_writer *))
{
    corax_writer *w;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open_in(r->o->c.outputs, path, &w, &err);
    if (st == CORAX_OK) {
        fill(r, w);
        st = corax_writer_commit(w, &err);
    }
    if (st != CORAX_OK)
        cli_error_record(&err, st);
    return st == CORAX_OK ? 0 : -1;
}

static int write_picture(const plan_run *r)
{
    const plan_opts *o = r->o;
    corax_plan_picture pic = {r->model,     o->directions,   o->ndirections,
                              o->azimuth.step, o->plunge.step, r->in.holes,
                              r->in.nholes, r->program,      r->in.ntargets,
                              plan_dips(&o->c), o->title};
    corax_svg *svg;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_plan_picture_draw(&pic, &svg);
    if (st == CORAX_OK) {
        st = corax_svg_save(svg, o->c.outputs, o->svg, &err);
        corax_svg_free(svg);
    }
    if (st != CORAX_OK)
        cli_error_record(&err, st);
    return st == CORAX_OK ? 0 : -1;
}

/* The program view, on standard error: how the planned holes together sample
 * each set, and which sets they all sample badly. */
static void report_program(const plan_run *r)
{
    const cli_common *c = &r->o->c;
    size_t nh = r->in.nholes;
    int sw = 3, hw = 9; /* "set", "best hole" */
    for (size_t i = 0; i < r->in.nsets; i++)
        sw = (int)fmax(sw, (double)strlen(r->in.sets[i].name));
    for (size_t h = 0; h < nh; h++)
        hw = (int)fmax(hw, (double)strlen(r->in.holes[h].name));
    if (nh == 1)
        cli_note(c, "how the planned hole samples each set:");
    else
        cli_note(c, "how the %zu planned holes sample each set:", nh);
    if (!c->quiet)
        fprintf(stderr, "  %-*s  %-10s  %-*s  %6s  %5s\n", sw, "set", "holes ok", hw,
                "best hole", "factor", "alpha");
    for (size_t i = 0; i < r->in.nsets && !c->quiet; i++) {
        const corax_plan_program_set *p = &r->program[i];
        char ok[32];
        snprintf(ok, sizeof ok, "%zu of %zu", p->holes_ok, nh);
        fprintf(stderr, "  %-*s  %-10s  %-*s  %6.3f  %5.1f%s\n", sw, r->in.sets[i].name, ok, hw,
                r->in.holes[p->best_hole].name, p->factor, corax_deg(p->alpha),
                p->badly_sampled ? "  badly sampled" : "");
    }
    for (size_t i = 0; i < r->in.nsets && !c->quiet; i++)
        if (r->program[i].badly_sampled)
            cli_error(NULL, 0, "warning: every planned hole is near-parallel to set %s: the "
                               "program samples it badly (best %s, expected alpha %.1f)",
                     r->in.sets[i].name, r->in.holes[r->program[i].best_hole].name,
                     corax_deg(r->sampling[r->program[i].best_hole * r->in.nsets + i].alpha));
    if (r->o->ndirections) {
        const corax_plan_direction *d = &r->o->directions[0];
        cli_note(c, "best direction of the sweep: azimuth %.1f, dip %.1f, score %.3f (worst "
                    "sampled %s, expected alpha %.1f)",
                 corax_wrap_degrees(corax_deg(d->azimuth), 1),
                 corax_plunge_to_dip(d->plunge, plan_dips(c)), d->score,
                 r->in.sets[d->worst_set].name, corax_deg(d->worst_alpha));
    }
}

static int write_about(const plan_run *r)
{
    const plan_opts *o = r->o;
    cli_about *a = cli_about_new("plan", &o->c);
    corax_record_section(a, "plan");
    corax_record_set(a, "holes", "%s", o->holes);
    corax_record_set(a, "sets", "%s", o->sets);
    if (o->targets)
        corax_record_set(a, "targets", "%s", o->targets);
    corax_record_set(a, "curved_plans", "a station every %g m turned by the lift and drift, "
                  "desurveyed by minimum curvature", CORAX_PLAN_STATION_STEP);
    corax_record_set(a, "sampling", "along the whole hole, every metre; each plane of a set's "
                  "Fisher spread counted as often as the hole crosses it (Terzaghi 1965)");
    corax_record_conventions(a, &o->cv);
    if (o->pierce)
        corax_record_set(a, "pierce", "%s", o->pierce);
    if (o->sweep) {
        corax_record_section(a, "sweep");
        corax_record_set(a, "directions", "%s (%zu directions)", o->sweep, o->ndirections);
        corax_record_set(a, "score", "share of (hole, target) pairs reached x the weighted "
                      "geometric mean of the sets' Terzaghi factors over the program");
        if (o->best)
            corax_record_set(a, "best", "%s", o->best);
        if (o->svg)
            corax_record_set(a, "picture", "%s", o->svg);
    }
    return cli_about_commit(a, &o->c);
}

static int run(plan_opts *o)
{
    plan_run r;
    memset(&r, 0, sizeof r);
    r.o = o;
    int rc = load(&r);
    if (rc == EXIT_OK)
        rc = evaluate(&r);
    if (rc == EXIT_OK && o->sweep) {
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_plan_sweep(r.model, r.in.holes, r.in.nholes, r.in.targets,
                                           r.in.ntargets, o->directions, o->ndirections, &err);
        if (st != CORAX_OK) {
            cli_error(st == CORAX_EVALUE ? o->sets : o->holes, err.line, "%s",
                      err.message[0] ? err.message : corax_strerror(st));
            rc = EXIT_DATA;
        }
    }
    if (rc == EXIT_OK &&
        (write_table(&r, o->c.output, write_sampling) ||
         (o->pierce && write_table(&r, o->pierce, write_pierces)) ||
         (o->best && write_table(&r, o->best, write_best)) || (o->svg && write_picture(&r)) ||
         write_about(&r)))
        rc = EXIT_DATA;
    if (rc == EXIT_OK)
        report_program(&r);
    for (size_t h = 0; r.paths && h < r.in.nholes; h++)
        corax_hole_free(r.paths[h]);
    free(r.paths);
    free(r.sampling);
    free(r.pierces);
    free(r.program);
    free(r.lengths);
    corax_plan_model_free(r.model);
    corax_plan_inputs_free(&r.in);
    return rc;
}

int cmd_plan(int argc, char **argv)
{
    plan_opts o;
    memset(&o, 0, sizeof o);
    cli_common_init(&o.c, "plan");
    o.cv = corax_convert_options_default();
    int rc = parse(argc, argv, &o);
    if (rc == 0)
        rc = run(&o);
    free(o.directions);
    rc = cli_run_end(&o.c, rc);
    cli_common_free(&o.c);
    return rc < 0 ? EXIT_OK : rc;
}
