/* qa: the program as a whole. A hole whose fabric scatters far more than a
 * typical hole's, and a hole whose readings fit the rest of the program best
 * turned about the hole (a convention or reference line of its own), mirrored
 * (beta read the other way round) or turned about the vertical (a missed
 * declination or grid correction). */
#include <gsl/gsl_statistics_double.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "geometry/vec.h"
#include "qa/qa_int.h"

enum { MAX_KINDS = 32 };

/* The program's consistent fabrics: kinds whose poles, over all holes, share
 * an axis strongly enough. Per kind, the tensor sums of each hole, and how
 * each hole's readings of it scatter. */
typedef struct fabric {
    const char *kind;
    double all[9];
    double *hole;   /* 9 sums per hole */
    double *spread; /* per hole: the median angle of its readings from their own
                       axis; NaN with fewer than min_fabric of them */
    size_t n;
} fabric;

typedef struct program {
    fabric f[MAX_KINDS];
    size_t nf;
    double *work; /* scratch for medians: one per reading of the largest hole */
} program;

static int kind_index(const program *p, const char *kind)
{
    for (size_t k = 0; k < p->nf; k++)
        if (strcasecmp(p->f[k].kind, kind) == 0)
            return (int)k;
    return -1;
}

static size_t readings_of(const fabric *f, size_t h)
{
    const double *t = f->hole + 9 * h;
    return (size_t)llround(t[0] + t[4] + t[8]); /* each unit vector adds 1 to the trace */
}

/* A new kind, its sums and spreads for every hole. */
static int add_kind(const qa_data *d, program *p, const char *kind)
{
    if (p->nf == MAX_KINDS)
        return -1;
    fabric *f = &p->f[p->nf];
    size_t holes = d->nholes ? d->nholes : 1;
    f->kind = kind;
    f->hole = calloc(9 * holes, sizeof(double));
    f->spread = malloc(holes * sizeof(double));
    if (!f->hole || !f->spread) {
        free(f->hole);
        free(f->spread);
        f->hole = f->spread = NULL;
        return -2;
    }
    for (size_t h = 0; h < holes; h++)
        f->spread[h] = NAN;
    return (int)p->nf++;
}

/* The median angle of the loaded hole h's readings of a kind from their own
 * axis. */
static double hole_spread(const qa_data *d, program *p, size_t h, const fabric *f)
{
    corax_vec3 axis;
    if (!qa_principal(f->hole + 9 * h, &axis, NULL))
        return NAN;
    size_t n = 0;
    for (size_t i = 0; i < d->nitems; i++) {
        const qa_item *it = &d->items[i];
        if (it->res.has_plane && strcasecmp(it->r->kind, f->kind) == 0)
            p->work[n++] = qa_axial_angle(it->res.normal, axis);
    }
    return n ? gsl_stats_select(p->work, 1, n, n / 2) : (double)NAN;
}

/* Every kind's tensor sums, over the program and per hole, and the spread of
 * each hole with enough readings of it, hole by hole. */
static corax_status gather(qa_data *d, program *p)
{
    for (size_t h = 0; h < d->nholes; h++) {
        corax_status st = qa_load(d, h);
        if (st != CORAX_OK)
            return st;
        for (size_t i = 0; i < d->nitems; i++) {
            const qa_item *it = &d->items[i];
            if (!it->res.has_plane || !it->r->kind[0])
                continue;
            int k = kind_index(p, it->r->kind);
            if (k < 0 && (k = add_kind(d, p, it->r->kind)) == -2)
                return CORAX_ENOMEM;
            if (k < 0)
                continue;
            qa_tensor_add(p->f[k].all, it->res.normal, 1.0);
            qa_tensor_add(p->f[k].hole + 9 * h, it->res.normal, 1.0);
            p->f[k].n++;
        }
        for (size_t k = 0; k < p->nf; k++)
            if (readings_of(&p->f[k], h) >= d->o->min_fabric)
                p->f[k].spread[h] = hole_spread(d, p, h, &p->f[k]);
    }
    return CORAX_OK;
}

static int program_fabric(const qa_data *d, const fabric *f)
{
    corax_vec3 axis;
    double strength;
    return f->n >= d->o->min_fabric && qa_principal(f->all, &axis, &strength) &&
           strength >= d->o->fabric_strength;
}

/* ---- spread ---- */

static corax_status check_spread(qa_data *d, program *p)
{
    double *typical = malloc((d->nholes ? d->nholes : 1) * sizeof *typical);
    corax_status st = typical ? CORAX_OK : CORAX_ENOMEM;
    for (size_t k = 0; k < p->nf && st == CORAX_OK; k++) {
        const fabric *f = &p->f[k];
        if (!program_fabric(d, f))
            continue;
        size_t m = 0;
        for (size_t h = 0; h < d->nholes; h++)
            if (!isnan(f->spread[h]))
                typical[m++] = f->spread[h];
        if (m < 3) /* too few holes to say what is typical */
            continue;
        double mid = gsl_stats_select(typical, 1, m, m / 2);
        for (size_t h = 0; h < d->nholes && st == CORAX_OK; h++)
            if (f->spread[h] > d->o->spread_ratio * mid)
                st = corax_findings_add(
                    d->out, CORAX_WARNING, "hole-spread", qa_hole_file(d, h), 0,
                    d->holes[h].name, NAN,
                    "the %s of this hole scatters %.0f degrees about its mean (median), against "
                    "%.0f in a typical hole of the program: spun core, a misfitted orientation "
                    "line, or careless reading?",
                    f->kind, corax_deg(f->spread[h]), corax_deg(mid));
    }
    free(typical);
    return st;
}

/* ---- turned holes ---- */

enum { TURN_BETA, TURN_MIRROR, TURN_VERTICAL, NTURNS };

/* A reading of hole h under a trial turn; 0 when it gives no plane. */
static int turned(const qa_data *d, const qa_item *it, int mode, double angle, corax_vec3 *n)
{
    double beta = qa_beta_read(it->r->reading.beta, d->reading);
    switch (mode) {
    case TURN_BETA: return angle == 0.0 ? qa_normal_as(d, it, QA_AS_STATED, n)
                                        : qa_reconvert(d, it, beta + angle, n);
    case TURN_MIRROR: return qa_reconvert(d, it, 2.0 * CORAX_PI - beta + angle, n);
    default: {
        double c = cos(angle), s = sin(angle), x = it->res.normal.x, y = it->res.normal.y;
        /* azimuths grow clockwise: turning by +angle about the vertical */
        *n = vec3(x * c + y * s, -x * s + y * c, it->res.normal.z);
        return 1;
    }
    }
}

/* The median misfit of the loaded hole's fabric readings to the rest of the
 * program under a trial turn. */
static double misfit(const qa_data *d, program *p, const corax_vec3 *reference, int mode,
                     double angle)
{
    size_t n = 0;
    for (size_t i = 0; i < d->nitems; i++) {
        const qa_item *it = &d->items[i];
        int k = it->res.has_plane ? kind_index(p, it->r->kind) : -1;
        corax_vec3 v;
        if (k < 0 || isnan(reference[k].x) || !turned(d, it, mode, angle, &v))
            continue;
        p->work[n++] = qa_axial_angle(v, reference[k]);
    }
    return n ? gsl_stats_select(p->work, 1, n, n / 2) : (double)NAN;
}

/* The best turn of one kind: a coarse sweep, then finer steps about the best. */
static double best_turn(const qa_data *d, program *p, const corax_vec3 *reference, int mode,
                        double *angle)
{
    double span = mode == TURN_VERTICAL ? 0.5 * CORAX_PI : CORAX_PI;
    double best = INFINITY, at = 0.0, step = corax_rad(5.0);
    for (double a = -span; a < span + 1e-9; a += step) {
        double m = misfit(d, p, reference, mode, a);
        if (m < best) {
            best = m;
            at = a;
        }
    }
    for (double fine = step / 2; fine > corax_rad(0.2); fine /= 2)
        for (int s = -1; s <= 1; s += 2) {
            double m = misfit(d, p, reference, mode, at + s * fine);
            if (m < best) {
                best = m;
                at += s * fine;
            }
        }
    *angle = at;
    return best;
}

/* How a turn reads: "with every beta turned by 325 degrees", "with beta
 * mirrored (read as 47 - beta)", "turned 12 degrees anticlockwise about the
 * vertical". The angle is rounded before it is wrapped, so that a turn of
 * -0.2 degrees never reads as 360. */
static void turn_words(char *buf, size_t size, int mode, double angle)
{
    double deg = corax_deg(angle);
    switch (mode) {
    case TURN_BETA:
        snprintf(buf, size, "with every beta turned by %.0f degrees: a reference line or "
                            "convention of its own?",
                 corax_wrap_degrees(deg, 0));
        return;
    case TURN_MIRROR: {
        double at = corax_wrap_degrees(deg, 0);
        snprintf(buf, size, "with beta mirrored (read as %.0f - beta): beta read the other way "
                            "round in this hole?",
                 at == 0.0 ? 360.0 : at);
        return;
    }
    default:
        snprintf(buf, size, "turned %.0f degrees %s about the vertical (seen from above): a "
                            "declination or grid correction missed or doubled for this hole?",
                 fabs(deg), deg >= 0.0 ? "clockwise" : "anticlockwise");
    }
}

/* A hole's best turn about the vertical, kept to see whether several holes
 * turn alike. */
typedef struct vertical_turn {
    size_t hole;
    double angle;
} vertical_turn;

/* The references of hole h: each program fabric's axis in the other holes.
 * Returns how many of the hole's readings have one, and in *kinds how many
 * fabrics have min_run of its readings or more. */
static size_t references(const qa_data *d, const program *p, size_t h, corax_vec3 *reference,
                         size_t *kinds)
{
    size_t usable = 0;
    *kinds = 0;
    for (size_t k = 0; k < p->nf; k++) {
        const fabric *f = &p->f[k];
        double rest[9];
        for (int i = 0; i < 9; i++)
            rest[i] = f->all[i] - f->hole[9 * h + i];
        reference[k] = vec3(NAN, NAN, NAN);
        size_t mine = readings_of(f, h);
        if (program_fabric(d, f) && f->n - mine >= d->o->min_fabric &&
            qa_principal(rest, &reference[k], NULL)) {
            usable += mine;
            *kinds += mine >= d->o->min_run;
        }
    }
    return usable;
}

/* One hole against the rest: which turn, if any, fits it clearly better.
 * A turn is only told from a fabric that differs in the hole when two
 * fabrics or more agree on it: one fabric can always be brought onto the
 * rest by some turn. *best -1 when none. */
static corax_status hole_turn(qa_data *d, program *p, size_t h, int *best, double *angle,
                              double *got, double *base)
{
    corax_vec3 reference[MAX_KINDS];
    size_t kinds;
    *best = -1;
    if (references(d, p, h, reference, &kinds) < d->o->min_fabric || kinds < 2)
        return CORAX_OK;
    corax_status st = qa_load(d, h);
    if (st != CORAX_OK)
        return st;
    *base = misfit(d, p, reference, TURN_BETA, 0.0);
    for (int mode = 0; mode < NTURNS; mode++) {
        got[mode] = best_turn(d, p, reference, mode, &angle[mode]);
        int far = mode == TURN_MIRROR || fabs(angle[mode]) > d->o->hole_turn;
        if (far && got[mode] < (1.0 - d->o->turn_gain) * *base &&
            (*best < 0 || got[mode] < got[*best]))
            *best = mode;
    }
    return CORAX_OK;
}

/* Several holes turned alike about the vertical: one correction missing or
 * doubled in all of their surveys. */
static corax_status turned_alike(qa_data *d, vertical_turn *v, size_t n)
{
    const double alike = corax_rad(5.0);
    if (n < 2)
        return CORAX_OK;
    double *a = malloc(n * sizeof *a);
    const char **names = malloc(n * sizeof *names);
    corax_status st = a && names ? CORAX_OK : CORAX_ENOMEM;
    if (st == CORAX_OK) {
        for (size_t i = 0; i < n; i++)
            a[i] = v[i].angle;
        double mid = gsl_stats_select(a, 1, n, n / 2);
        size_t m = 0;
        for (size_t i = 0; i < n; i++)
            if (fabs(v[i].angle - mid) <= alike) {
                a[m] = v[i].angle;
                names[m++] = d->holes[v[i].hole].name;
            }
        if (m >= 2) {
            char list[200];
            qa_name_list(list, sizeof list, names, m, 6);
            double mean = gsl_stats_mean(a, 1, m), sd = gsl_stats_sd_m(a, 1, m, mean);
            st = corax_findings_add(
                d->out, CORAX_WARNING, "holes-turned-alike", qa_hole_file(d, v[0].hole),
                0, NULL, NAN,
                "%zu holes (%s) fit the rest of the program best turned %.1f +- %.1f degrees %s "
                "about the vertical (seen from above): a declination or grid correction missed, "
                "doubled or of the wrong sign in their surveys alone (another tool or survey "
                "company?)",
                m, list, fabs(corax_deg(mean)), corax_deg(sd),
                mean >= 0.0 ? "clockwise" : "anticlockwise");
        }
    }
    free(a);
    free(names);
    return st;
}

static corax_status check_turns(qa_data *d, program *p)
{
    vertical_turn *vertical = malloc((d->nholes ? d->nholes : 1) * sizeof *vertical);
    if (!vertical)
        return CORAX_ENOMEM;
    size_t nvertical = 0;
    corax_status st = CORAX_OK;
    for (size_t h = 0; h < d->nholes && st == CORAX_OK; h++) {
        double angle[NTURNS], got[NTURNS], base;
        int best;
        if ((st = hole_turn(d, p, h, &best, angle, got, &base)) != CORAX_OK || best < 0)
            continue;
        if (best == TURN_VERTICAL)
            vertical[nvertical++] = (vertical_turn){h, angle[best]};
        char how[240];
        turn_words(how, sizeof how, best, angle[best]);
        st = corax_findings_add(d->out, CORAX_WARNING, "hole-turned",
                                qa_hole_file(d, h), 0, d->holes[h].name, NAN,
                                "the readings of this hole fit the rest of the program%s best %s "
                                "(typical misfit %.0f degrees, %.0f as read)",
                                d->reading ? " (read as the program-wide finding suggests)" : "",
                                how, corax_deg(got[best]), corax_deg(base));
    }
    if (st == CORAX_OK)
        st = turned_alike(d, vertical, nvertical);
    free(vertical);
    return st;
}

corax_status qa_check_program(qa_data *d)
{
    program p;
    memset(&p, 0, sizeof p);
    size_t most = 1;
    for (size_t h = 0; h < d->nholes; h++)
        most = d->holes[h].n > most ? d->holes[h].n : most;
    p.work = malloc(most * sizeof *p.work);
    corax_status st = p.work ? gather(d, &p) : CORAX_ENOMEM;
    if (st == CORAX_OK)
        st = check_spread(d, &p);
    if (st == CORAX_OK)
        st = check_turns(d, &p);
    for (size_t k = 0; k < p.nf; k++) {
        free(p.f[k].hole);
        free(p.f[k].spread);
    }
    free(p.work);
    return st;
}
