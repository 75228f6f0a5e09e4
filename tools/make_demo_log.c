/* Makes the demo core log of the invented Quillon Creek program from an
 * invented structural model, through corax's own inverse: the alpha, beta and
 * gamma each true structure would show in the hole at its depth, with reading
 * noise, orientation runs of about 3 m, unoriented broken ground (half of it
 * with betas measured from a line drawn anywhere on the run, confidence
 * "unoriented"), a few deliberate slips for the QA checks to find, and the
 * alpha-only readings of two marker planes where the holes cross them.
 *
 *   build/tools/make_demo_log surveys/collars.csv surveys/surveys.csv \
 *       examples/core_log.csv examples/runs.csv examples/markers.csv
 *
 * It prints the invented truth the demo's results are checked against: the
 * turn that orients each run without a mark, and the marker planes.
 *
 * The holes are desurveyed with the demo's own azimuth corrections (the
 * project file's: the World Magnetic Model, UTM zone 8N, the local grid).
 *
 * The slips (what a careful QA pass should report):
 *   QC007 96-105 m   orientation line marked on the wrong side (beta + 180)
 *   QC011 120-129 m  beta read the wrong way round (360 - beta)
 *   QC012 all        every beta turned 40 degrees (a wrong convention for the hole)
 *   QC004 below 88.4 m   the first reading typed twice
 *   QC001 below 47 m     alpha 95 (out of range); QC005 below 61.3 m beta 365;
 *   QC002 below 75 m     alpha "n/a"
 */
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/corax.h"
#include "corax/core.h"

typedef struct kind_model {
    const char *name;
    double dip, dip_direction, spread; /* degrees: the set's mean plane and scatter */
} kind_model;

/* The invented geology: bedding folded about a gently plunging axis, a steep
 * foliation, two vein sets, faults and joints. */
static const kind_model model[] = {
    {"bedding", 55, 290, 9}, {"foliation", 75, 305, 6}, {"vein", 80, 20, 8},
    {"vein", 35, 250, 8},    {"fault", 65, 160, 10},    {"joint", 85, 70, 12},
};

static corax_vec3 scatter(gsl_rng *rng, corax_vec3 mean, double spread_deg)
{
    /* a small random tilt of the normal (a Gaussian on each side) */
    corax_vec3 a = fabs(mean.z) < 0.9 ? (corax_vec3){0, 0, 1} : (corax_vec3){1, 0, 0};
    corax_vec3 u = {mean.y * a.z - mean.z * a.y, mean.z * a.x - mean.x * a.z,
                    mean.x * a.y - mean.y * a.x};
    double nu = sqrt(u.x * u.x + u.y * u.y + u.z * u.z);
    u = (corax_vec3){u.x / nu, u.y / nu, u.z / nu};
    corax_vec3 v = {mean.y * u.z - mean.z * u.y, mean.z * u.x - mean.x * u.z,
                    mean.x * u.y - mean.y * u.x};
    double s = corax_rad(spread_deg);
    double p = gsl_ran_gaussian(rng, s), q = gsl_ran_gaussian(rng, s);
    corax_vec3 n = {mean.x + p * u.x + q * v.x, mean.y + p * u.y + q * v.y,
                    mean.z + p * u.z + q * v.z};
    double nn = sqrt(n.x * n.x + n.y * n.y + n.z * n.z);
    return (corax_vec3){n.x / nn, n.y / nn, n.z / nn};
}

static int pick_kind(gsl_rng *rng, double depth)
{
    /* lithology by depth: bedded sediments above 150 m, schist below */
    double u = gsl_rng_uniform(rng);
    if (depth < 150)
        return u < 0.45 ? 0 : u < 0.6 ? 2 : u < 0.7 ? 3 : u < 0.8 ? 4 : 5;
    return u < 0.45 ? 1 : u < 0.6 ? 2 : u < 0.72 ? 3 : u < 0.8 ? 4 : 5;
}

static const char *confidence_of(double u) { return u < 0.7 ? "good" : u < 0.92 ? "fair" : "poor"; }

/* A run's confidence word: broken ground without a line ("none"), a line
 * drawn anywhere ("unoriented"), or the run's own. */
static const char *run_word(int unoriented_run, int arbitrary, const char *conf)
{
    return !unoriented_run ? conf : arbitrary ? "unoriented" : "none";
}

/* An invented marker plane: where it lies, and which holes read it. */
typedef struct marker {
    const char *name;
    double dip, dip_direction;   /* degrees */
    corax_vec3 point;            /* a point on it */
    double thickness;            /* metres between its two contacts; 0: one plane */
    size_t max_holes;            /* read in at most this many holes (0: all) */
} marker;

/* The Quillon tuff, a marker bed whose two contacts were logged by alpha
 * alone (the contacts break the core), and a late vein recognised in two
 * holes only. */
static const marker markers[] = {
    {"Quillon tuff", 48, 275, {10500, 50400, 330}, 1.6, 0},
    {"V3 vein", 65, 20, {10500, 50400, 400}, 0, 2},
};

/* The depth where a hole crosses the plane of unit normal n through p, or -1. */
static double crossing(const corax_hole *hole, corax_vec3 n, corax_vec3 p)
{
    double length = corax_hole_length(hole), prev = NAN, prev_d = 0;
    for (double d = 0; d <= length; d += 1.0) {
        corax_hole_point pt;
        if (corax_hole_at(hole, d, NULL, &pt) != CORAX_OK)
            return -1;
        corax_vec3 r = pt.position;
        double f = n.x * (r.x - p.x) + n.y * (r.y - p.y) + n.z * (r.z - p.z);
        if (!isnan(prev) && (f > 0) != (prev > 0)) {
            double lo = prev_d, hi = d, flo = prev;
            for (int i = 0; i < 60; i++) { /* bisection on the arc */
                double mid = 0.5 * (lo + hi);
                corax_hole_at(hole, mid, NULL, &pt);
                r = pt.position;
                double fm = n.x * (r.x - p.x) + n.y * (r.y - p.y) + n.z * (r.z - p.z);
                if ((fm > 0) == (flo > 0)) {
                    lo = mid;
                    flo = fm;
                } else {
                    hi = mid;
                }
            }
            return 0.5 * (lo + hi);
        }
        prev = f;
        prev_d = d;
    }
    return -1;
}

/* The alpha-only readings of the markers where the holes cross them. */
static void write_markers(FILE *f, const corax_program *prog, gsl_rng *rng)
{
    fprintf(f, "hole,depth,alpha,set,comment\n");
    for (size_t m = 0; m < sizeof markers / sizeof markers[0]; m++) {
        const marker *mk = &markers[m];
        corax_vec3 n = corax_plane_normal((corax_plane){corax_rad(mk->dip),
                                                        corax_rad(mk->dip_direction)});
        size_t used = 0;
        printf("  marker %s: %g/%03g (dip/dip direction)\n", mk->name, mk->dip,
               mk->dip_direction);
        for (size_t h = 0; h < corax_program_size(prog); h++) {
            const corax_hole *hole = corax_program_hole(prog, h);
            double d = crossing(hole, n, mk->point);
            if (d < 0 || (mk->max_holes && used == mk->max_holes))
                continue;
            used++;
            for (int contact = 0; contact < (mk->thickness > 0 ? 2 : 1); contact++) {
                corax_hole_point pt;
                corax_hole_at(hole, d, NULL, &pt);
                double c = fabs(n.x * pt.tangent.x + n.y * pt.tangent.y + n.z * pt.tangent.z);
                double alpha = corax_deg(asin(fmin(1.0, c))) + gsl_ran_gaussian(rng, 2);
                alpha = fabs(alpha) > 90 ? 180 - fabs(alpha) : fabs(alpha);
                fprintf(f, "%s,%.2f,%.0f,%s,%s\n", corax_hole_name(hole), d, alpha, mk->name,
                        mk->thickness > 0 ? (contact ? "base" : "top") : "");
                d += mk->thickness / (c > 0.05 ? c : 0.05); /* the other contact, down the hole */
            }
        }
    }
}

int main(int argc, char **argv)
{
    if (argc != 6) {
        fprintf(stderr, "usage: make_demo_log COLLARS SURVEYS CORE_LOG RUNS MARKERS\n");
        return 2;
    }
    /* the demo's corrections, as examples/quillon_creek.ini gives them */
    corax_load_options lo = corax_load_options_default();
    corax_corrector corr = corax_corrector_default();
    corax_magnetic_model *wmm = NULL;
    corax_crs *crs = NULL;
    corax_local_grid grid;
    corax_program *prog;
    corax_findings problems = {0};
    corax_error err;
    if (corax_magnetic_builtin("WMM", &wmm, &err) != CORAX_OK ||
        corax_crs_new("EPSG:32608", &crs, &err) != CORAX_OK ||
        corax_local_grid_parse("10000,50000,581862.415,6941713.208,"
                               "11000,51000,582621.929,6942905.407", &grid, &err) != CORAX_OK) {
        fprintf(stderr, "make_demo_log: %s\n", err.message);
        return 1;
    }
    corr.model = wmm;
    corr.crs = crs;
    corr.convergence_from_crs = 1;
    corr.local_grid = &grid;
    lo.corrector = &corr;
    if (corax_program_load(argv[1], argv[2], &lo, &prog, &problems, NULL, &err) != CORAX_OK ||
        corax_findings_count(&problems, CORAX_ERROR)) {
        fprintf(stderr, "make_demo_log: cannot load the demo program\n");
        return 1;
    }
    corax_crs_free(crs);
    corax_magnetic_model_free(wmm);
    FILE *log = fopen(argv[3], "w"), *runs = fopen(argv[4], "w"), *marks = fopen(argv[5], "w");
    if (!log || !runs || !marks) {
        perror("make_demo_log");
        return 1;
    }
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937), *aux = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261201);
    gsl_rng_set(aux, 20261202); /* its own stream: the rest of the log stays as it was */
    printf("make_demo_log: the invented truth\n  runs without a mark, and the turn (added to "
           "beta) that orients each:\n");
    corax_core_conventions conv = {0, 0, 0, 0, 0};
    fprintf(log, "hole,depth,alpha,beta,gamma,kind,confidence,logged_by,comment\n");
    fprintf(runs, "hole,from,to,confidence\n");
    static const char *const loggers[] = {"MK", "TJ", "RW"};
    for (size_t h = 0; h < corax_program_size(prog); h++) {
        const corax_hole *hole = corax_program_hole(prog, h);
        const char *name = corax_hole_name(hole);
        const char *logger = loggers[h % 3];
        double length = corax_hole_length(hole);
        double run_from = 6.0, line_error = 0, turn = 0;
        int unoriented_run = 0, arbitrary = 0; /* arbitrary: a line drawn anywhere */
        const char *run_conf = "good";
        size_t hint = 0;
        for (double d = 6.0 + gsl_rng_uniform(rng); d < length - 1; d += 0.2 + gsl_ran_exponential(rng, 0.55)) {
            if (d >= run_from + 3.0 || d == 6.0) { /* a new orientation run */
                if (d > 6.0)
                    fprintf(runs, "%s,%.2f,%.2f,%s\n", name, run_from, run_from + 3.0,
                            run_word(unoriented_run, arbitrary, run_conf));
                while (d >= run_from + 3.0)
                    run_from += 3.0;
                double u = gsl_rng_uniform(rng);
                run_conf = confidence_of(u);
                unoriented_run = gsl_rng_uniform(rng) < 0.06; /* broken ground: no line */
                arbitrary = unoriented_run && gsl_rng_uniform(aux) < 0.5;
                turn = arbitrary ? round(3600 * gsl_rng_uniform(aux)) / 10 : 0;
                if (arbitrary)
                    printf("    %s %.2f-%.2f m: %.1f\n", name, run_from, run_from + 3.0, turn);
                line_error = gsl_ran_gaussian(rng, strcmp(run_conf, "good") == 0 ? 3
                                                   : strcmp(run_conf, "fair") == 0 ? 8 : 20);
            }
            corax_hole_point pt;
            if (corax_hole_at(hole, d, &hint, &pt) != CORAX_OK)
                continue;
            corax_core_frame f;
            int framed = corax_core_frame_of(pt.tangent, &f) == CORAX_OK;
            int k = pick_kind(rng, d);
            corax_plane mean = {corax_rad(model[k].dip), corax_rad(model[k].dip_direction)};
            if (k == 0) /* the bedding folds: its dip direction swings with depth */
                mean.dip_direction += corax_rad(15 * sin(d / 40.0));
            corax_vec3 n = scatter(rng, corax_plane_normal(mean), model[k].spread);
            double alpha, beta;
            if (!framed)
                continue;
            corax_core_plane_angles(&f, n, &conv, &alpha, &beta);
            alpha = corax_deg(alpha) + gsl_ran_gaussian(rng, 2);
            beta = corax_deg(beta) + gsl_ran_gaussian(rng, 4) + line_error;
            if (alpha < 0)
                alpha = -alpha;
            if (alpha > 90)
                alpha = 180 - alpha;
            /* the slips */
            if (strcmp(name, "QC007") == 0 && d >= 96 && d < 105)
                beta += 180;
            if (strcmp(name, "QC011") == 0 && d >= 120 && d < 129)
                beta = 360 - beta;
            if (strcmp(name, "QC012") == 0)
                beta += 40;
            beta = fmod(fmod(beta, 360) + 360, 360);
            char gamma[16] = "", alpha_text[16], beta_text[16];
            const char *kind = model[k].name, *comment = "";
            if (k == 1 && gsl_rng_uniform(rng) < 0.25) { /* a stretching lineation on S1 */
                corax_vec3 l = corax_direction(corax_rad(330), corax_rad(40));
                double g = corax_core_gamma_of(&f, n, l, &conv);
                if (!isnan(g)) {
                    snprintf(gamma, sizeof gamma, "%.0f",
                             fmod(round(corax_deg(g) + gsl_ran_gaussian(rng, 5)) + 720, 360));
                    kind = "foliation+lineation";
                }
            }
            snprintf(alpha_text, sizeof alpha_text, "%.0f", alpha);
            snprintf(beta_text, sizeof beta_text, "%.0f", fmod(round(beta), 360));
            if (arbitrary) { /* measured from the line drawn: the true beta less the turn */
                snprintf(beta_text, sizeof beta_text, "%.0f",
                         fmod(fmod(round(beta - turn), 360) + 360, 360));
                comment = "no orientation mark; beta from a line drawn on the run";
            } else if (unoriented_run) {
                beta_text[0] = gamma[0] = '\0';
                comment = "broken; no orientation line";
            }
            static int slip_alpha, slip_beta, slip_text, slip_twice; /* each once */
            if (!slip_alpha && strcmp(name, "QC001") == 0 && d > 47) {
                slip_alpha = 1;
                snprintf(alpha_text, sizeof alpha_text, "95");
                comment = "check";
            }
            if (!slip_beta && strcmp(name, "QC005") == 0 && d > 61.3 && !unoriented_run) {
                slip_beta = 1;
                snprintf(beta_text, sizeof beta_text, "365");
            }
            if (!slip_text && strcmp(name, "QC002") == 0 && d > 75) {
                slip_text = 1;
                snprintf(alpha_text, sizeof alpha_text, "n/a");
                comment = "core lost";
            }
            const char *word = run_word(unoriented_run, arbitrary, run_conf);
            fprintf(log, "%s,%.2f,%s,%s,%s,%s,%s,%s,%s\n", name, d, alpha_text, beta_text, gamma,
                    kind, word, logger, comment);
            if (!slip_twice && strcmp(name, "QC004") == 0 && d > 88.4) { /* typed twice */
                slip_twice = 1;
                fprintf(log, "%s,%.2f,%s,%s,%s,%s,%s,%s,%s\n", name, d, alpha_text, beta_text,
                        gamma, kind, arbitrary ? word : run_conf, logger, "");
            }
        }
        fprintf(runs, "%s,%.2f,%.2f,%s\n", name, run_from, run_from + 3.0,
                run_word(unoriented_run, arbitrary, run_conf));
    }
    gsl_rng_set(aux, 20261203); /* the markers: a stream of their own */
    write_markers(marks, prog, aux);
    gsl_rng_free(rng);
    gsl_rng_free(aux);
    fclose(marks);
    fclose(log);
    fclose(runs);
    corax_program_free(prog);
    corax_findings_clear(&problems);
    return 0;
}
