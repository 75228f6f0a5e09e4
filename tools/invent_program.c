/* Invents a drill program to test the program-wide QA of `corax check` on:
 * holes drilled in many directions through two fabrics (bedding and a
 * foliation, each scattered as a Fisher distribution), logged sparsely (a
 * reading every 5 to 6 m by default), with realistic reading errors, and
 * reproducible from a seed. Variants plant one program-wide mistake each:
 *
 *   clean          nothing wrong
 *   top-line       the log taken against a top-of-hole line (converted as
 *                  if the line marked the bottom)
 *   anticlockwise  beta measured anticlockwise looking down the hole
 *   magnetic       surveys left magnetic (declination 7.0 east not applied);
 *                  the collars set up to true north
 *   some-magnetic  three holes' surveys left magnetic, declination 20 east
 *                  (another tool on those holes)
 *   slips          two slips in sparse logging: two readings in a row
 *                  logged against a line on the wrong side (beta + 180) in
 *                  the third hole, three read the wrong way round (360 -
 *                  beta) in the sixth (or the next hole with readings that
 *                  show a slip)
 *
 *   build/tools/invent_program [--variant NAME] [--seed N] [--spacing M]
 *       [--holes N] [--parallel] COLLARS SURVEYS LOG
 *
 * --parallel drills every hole nearly the same way (a program that cannot
 * tell its conventions). On stderr: what was made, the fabrics' Fisher kappa
 * as logged (their true scatter), and a line per planted slip:
 *   slip HOLE FROM TO beta+180|360-beta
 * Every angle written is rounded to a whole degree, as loggers write them. */
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/corax.h"

typedef struct fabric {
    const char *kind;
    double dip, dip_direction, kappa; /* degrees; the kappa of the drawn poles */
} fabric;

static const fabric fabrics[2] = {{"bedding", 40, 125, 52}, {"foliation", 75, 250, 52}};

enum { MAX_HOLES = 40, MAX_READINGS = 4000 };

static const double declination = 7.0;       /* the magnetic variant's, degrees east */
static const double other_declination = 20.0; /* the some-magnetic variant's */

typedef struct plan {
    const char *variant;
    unsigned long seed;
    double spacing;
    int holes, parallel;
    const char *collars, *surveys, *log;
} plan;

typedef struct hole_plan {
    char name[16];
    double x, y, azimuth, dip, length, drift, lift, set_azimuth, set_dip;
    int magnetic; /* surveys written magnetic (declination not applied) */
} hole_plan;

static int usage(void)
{
    fprintf(stderr, "usage: invent_program [--variant clean|top-line|anticlockwise|magnetic|"
                    "some-magnetic|slips] [--seed N] [--spacing M] [--holes N] [--parallel] "
                    "COLLARS SURVEYS LOG\n");
    return 2;
}

static int parse(int argc, char **argv, plan *p)
{
    *p = (plan){"clean", 1, 5.5, 10, 0, NULL, NULL, NULL};
    int files = 0;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (strcmp(a, "--parallel") == 0)
            p->parallel = 1;
        else if (i + 1 < argc && strcmp(a, "--variant") == 0)
            p->variant = argv[++i];
        else if (i + 1 < argc && strcmp(a, "--seed") == 0)
            p->seed = strtoul(argv[++i], NULL, 10);
        else if (i + 1 < argc && strcmp(a, "--spacing") == 0)
            p->spacing = atof(argv[++i]);
        else if (i + 1 < argc && strcmp(a, "--holes") == 0)
            p->holes = atoi(argv[++i]);
        else if (a[0] == '-')
            return 0;
        else if (files == 0)
            p->collars = a, files++;
        else if (files == 1)
            p->surveys = a, files++;
        else if (files == 2)
            p->log = a, files++;
        else
            return 0;
    }
    static const char *const known[] = {"clean", "top-line", "anticlockwise", "magnetic",
                                        "some-magnetic", "slips"};
    int ok = 0;
    for (size_t k = 0; k < sizeof known / sizeof known[0]; k++)
        ok |= strcmp(p->variant, known[k]) == 0;
    return ok && files == 3 && p->spacing > 0.1 && p->holes >= 3 && p->holes <= MAX_HOLES;
}

/* The holes: azimuths all round the compass (or all alike), plunging 45 to
 * 65 degrees (none steep enough to doubt its orientation line), curving
 * gently. */
static void lay_out(const plan *p, gsl_rng *rng, hole_plan *h)
{
    for (int i = 0; i < p->holes; i++) {
        hole_plan *k = &h[i];
        snprintf(k->name, sizeof k->name, "IP%02d", i + 1);
        k->x = 20000 + 80.0 * (i % 4) + gsl_rng_uniform(rng) * 20;
        k->y = 70000 + 90.0 * (i / 4) + gsl_rng_uniform(rng) * 20;
        k->azimuth = p->parallel ? 130 + gsl_ran_gaussian(rng, 3)
                                 : fmod(360.0 * i / p->holes + 15 + gsl_ran_gaussian(rng, 8) + 360, 360);
        k->dip = p->parallel ? -(60 + gsl_ran_gaussian(rng, 2)) : -(45 + 20 * gsl_rng_uniform(rng));
        k->length = 240 + 90 * gsl_rng_uniform(rng);
        k->drift = 0.03 * (2 * gsl_rng_uniform(rng) - 1); /* degrees per metre */
        k->lift = 0.02 * gsl_rng_uniform(rng);
        /* the set-up, measured at the collar: close to where the hole starts */
        k->set_azimuth = fmod(round(10 * (k->azimuth + gsl_ran_gaussian(rng, 0.4))) / 10 + 360, 360);
        k->set_dip = round(10 * (k->dip + gsl_ran_gaussian(rng, 0.3))) / 10;
        k->magnetic = strcmp(p->variant, "magnetic") == 0 ||
                      (strcmp(p->variant, "some-magnetic") == 0 && i % 3 == 1 && i < 9);
    }
}

static int write_surveys(const plan *p, const hole_plan *h)
{
    FILE *c = fopen(p->collars, "w"), *s = fopen(p->surveys, "w");
    if (!c || !s) {
        perror("invent_program");
        if (c)
            fclose(c);
        if (s)
            fclose(s);
        return 1;
    }
    fprintf(c, "hole,x,y,z,azimuth,dip,length\n");
    fprintf(s, "hole,depth,azimuth,dip\n");
    for (int i = 0; i < p->holes; i++) {
        const hole_plan *k = &h[i];
        fprintf(c, "%s,%.2f,%.2f,%.2f,%.1f,%.1f,%.1f\n", k->name, k->x, k->y, 400.0,
                k->set_azimuth, k->set_dip, k->length);
        double off = !k->magnetic ? 0.0
                     : strcmp(p->variant, "magnetic") == 0 ? declination
                                                           : other_declination;
        for (double d = 0; d <= k->length; d += 30) {
            double az = k->azimuth + k->drift * d - off; /* magnetic = true - declination */
            fprintf(s, "%s,%.1f,%.2f,%.2f\n", k->name, d, fmod(az + 720, 360), k->dip + k->lift * d);
        }
    }
    fclose(c);
    return fclose(s) != 0;
}

/* The true program: the surveys as written, corrected where they are magnetic. */
static corax_program *true_program(const plan *p, const hole_plan *h)
{
    corax_load_options lo = corax_load_options_default();
    corax_program *prog = NULL;
    corax_findings f = {0};
    corax_error err;
    if (corax_program_load(p->collars, p->surveys, &lo, &prog, &f, NULL, &err) != CORAX_OK) {
        fprintf(stderr, "invent_program: %s\n", err.message);
        return NULL;
    }
    corax_findings_clear(&f);
    /* rebuild the magnetic holes with their declination */
    corax_program *fixed = corax_program_size(prog) == (size_t)p->holes ? corax_program_new() : NULL;
    for (size_t i = 0; fixed && i < corax_program_size(prog); i++) {
        const corax_hole *src = corax_program_hole(prog, i);
        size_t n = corax_hole_station_count(src);
        corax_station st[64];
        for (size_t k = 0; k < n && k < 64; k++)
            corax_hole_station(src, k, &st[k], NULL, NULL);
        double off = !h[i].magnetic ? 0.0
                     : strcmp(p->variant, "magnetic") == 0 ? declination
                                                           : other_declination;
        corax_hole *hole;
        if (corax_hole_new(corax_hole_name(src), corax_hole_collar(src), st, n < 64 ? n : 64,
                           corax_rad(off), &hole, &err) != CORAX_OK ||
            corax_program_add(fixed, hole) != CORAX_OK) {
            corax_program_free(fixed);
            fixed = NULL;
        }
    }
    corax_program_free(prog);
    return fixed;
}

typedef struct slip {
    int hole, how, count; /* how: 1 beta + 180, 2 360 - beta */
    double from, to;
} slip;

typedef struct reading {
    double depth, alpha, beta;
    int kind;
} reading;

/* Whether a reading shows a slip: a plane nearly along the core or square to
 * it barely moves when beta does, nor does a beta near 0 or 180 mirrored. */
static int shows(const reading *r, int how)
{
    return r->alpha >= 15 && r->alpha <= 75 && (how == 1 || fabs(sin(corax_rad(r->beta))) >= 0.5);
}

/* Plant a slip on `count` readings in a row that show it, the first of
 * them past 35% of the hole; 0 when the hole has no such place. */
static int plant(reading *r, size_t n, double length, slip *sl)
{
    for (size_t j = 0; j + (size_t)sl->count <= n; j++) {
        int all = r[j].depth >= 0.35 * length;
        for (int k = 0; k < sl->count && all; k++)
            all = shows(&r[j + (size_t)k], sl->how);
        if (!all)
            continue;
        for (int k = 0; k < sl->count; k++) {
            reading *x = &r[j + (size_t)k];
            x->beta = sl->how == 1 ? fmod(x->beta + 180, 360) : fmod(360 - x->beta, 360);
        }
        sl->from = r[j].depth;
        sl->to = r[j + (size_t)sl->count - 1].depth;
        return 1;
    }
    return 0;
}

/* One hole's readings as logged, and each fabric's normals as they convert
 * (slips aside) into seen[]. */
static size_t log_hole(const plan *p, const hole_plan *h, const corax_hole *hole, gsl_rng *rng,
                       const corax_core_conventions *as_logged, reading *out,
                       corax_vec3 seen[2][MAX_READINGS], size_t nseen[2])
{
    corax_convert_options co = corax_convert_options_default();
    co.conventions = *as_logged;
    double line_error = 0.0, barrel_end = 0.0;
    size_t n = 0;
    for (double d = 3 + 5 * gsl_rng_uniform(rng); d < h->length - 2 && n < MAX_READINGS;
         d += p->spacing * (0.91 + 0.18 * gsl_rng_uniform(rng))) {
        if (d >= barrel_end) { /* a new barrel: the line marked again */
            line_error = gsl_ran_gaussian(rng, 2.0);
            barrel_end = 3.0 * (floor(d / 3.0) + 1);
        }
        int k = gsl_rng_uniform(rng) < 0.5 ? 0 : 1;
        corax_plane mean = {corax_rad(fabrics[k].dip), corax_rad(fabrics[k].dip_direction)};
        corax_vec3 normal = corax_fisher_draw(corax_plane_normal(mean), fabrics[k].kappa,
                                              gsl_rng_uniform(rng), gsl_rng_uniform(rng));
        corax_hole_point pt;
        corax_core_frame f;
        double alpha, beta;
        if (corax_hole_at(hole, d, NULL, &pt) != CORAX_OK ||
            corax_core_frame_of(pt.tangent, &f) != CORAX_OK)
            continue;
        corax_core_plane_angles(&f, normal, as_logged, &alpha, &beta);
        alpha = fabs(corax_deg(alpha) + gsl_ran_gaussian(rng, 1.0));
        alpha = round(alpha > 90 ? 180 - alpha : alpha);
        beta = round(fmod(corax_deg(beta) + gsl_ran_gaussian(rng, 2.0) + line_error + 720, 360));
        out[n] = (reading){d, alpha, beta >= 360 ? beta - 360 : beta, k};
        corax_reading rd = corax_reading_empty();
        rd.depth = d;
        rd.alpha = corax_rad(out[n].alpha);
        rd.beta = corax_rad(out[n].beta);
        corax_result res;
        corax_convert_reading(hole, &rd, &co, NULL, &res);
        if (res.has_plane && nseen[k] < MAX_READINGS)
            seen[k][nseen[k]++] = res.normal;
        n++;
    }
    return n;
}

static int write_log(const plan *p, const hole_plan *h, const corax_program *prog, gsl_rng *rng)
{
    FILE *log = fopen(p->log, "w");
    if (!log) {
        perror("invent_program");
        return 1;
    }
    corax_core_conventions as_logged = {0, 0, 0, 0, 0};
    as_logged.top_reference = strcmp(p->variant, "top-line") == 0;
    as_logged.beta_anticlockwise = strcmp(p->variant, "anticlockwise") == 0;
    slip slips[2] = {{2, 1, 2, 0, 0}, {5, 2, 3, 0, 0}};
    int planting = strcmp(p->variant, "slips") == 0;
    static corax_vec3 seen[2][MAX_READINGS];
    static reading r[MAX_READINGS];
    size_t nseen[2] = {0, 0}, rows = 0;
    fprintf(log, "hole,depth,alpha,beta,kind,confidence\n");
    for (int i = 0; i < p->holes; i++) {
        const corax_hole *hole = corax_program_hole(prog, (size_t)i);
        size_t n = log_hole(p, &h[i], hole, rng, &as_logged, r, seen, nseen);
        for (int s = 0; planting && s < 2; s++) /* in the hole named, or the next that can */
            if (slips[s].hole == i && !plant(r, n, h[i].length, &slips[s]))
                slips[s].hole = i + 1;
        for (size_t j = 0; j < n; j++)
            fprintf(log, "%s,%.2f,%.0f,%.0f,%s,good\n", h[i].name, r[j].depth, r[j].alpha,
                    r[j].beta, fabrics[r[j].kind].kind);
        rows += n;
    }
    if (fclose(log) != 0)
        return 1;
    fprintf(stderr, "invent_program: %s program, seed %lu: %d holes, %zu readings", p->variant,
            p->seed, p->holes, rows);
    for (int k = 0; k < 2; k++) {
        corax_axial_summary sum;
        if (corax_axial_summary_compute(seen[k], NULL, nseen[k], &sum) == CORAX_OK)
            fprintf(stderr, "; %s kappa %.0f", fabrics[k].kind, sum.fisher.kappa);
    }
    fprintf(stderr, "\n");
    for (int s = 0; planting && s < 2 && slips[s].hole < p->holes; s++)
        fprintf(stderr, "slip %s %.2f %.2f %s\n", h[slips[s].hole].name, slips[s].from,
                slips[s].to, slips[s].how == 1 ? "beta+180" : "360-beta");
    return 0;
}

int main(int argc, char **argv)
{
    plan p;
    if (!parse(argc, argv, &p))
        return usage();
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, p.seed);
    hole_plan h[MAX_HOLES];
    lay_out(&p, rng, h);
    int rc = write_surveys(&p, h);
    corax_program *prog = rc ? NULL : true_program(&p, h);
    if (!prog)
        rc = 1;
    if (!rc)
        rc = write_log(&p, h, prog, rng);
    corax_program_free(prog);
    gsl_rng_free(rng);
    return rc;
}
