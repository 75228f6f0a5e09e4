/* qa: the survey checks of a drill program: an azimuth offset between the
 * collars and their surveys that most holes share, then hole by hole. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_statistics_double.h>
#include <stdio.h>

#include "corax/qa.h"
#include "geometry/vec.h"
#include "qa/qa_int.h"

corax_qa_options corax_qa_options_default(void)
{
    static const char *const low[] = {"poor", "low", NULL};
    corax_qa_options o;
    memset(&o, 0, sizeof o);
    o.gap = 60.0;
    o.dogleg = corax_rad(3.0);
    o.magnetic_azimuth = corax_rad(5.0);
    o.magnetic_dip = corax_rad(1.0);
    o.first_station = 15.0;
    o.collar_mismatch = corax_rad(5.0);
    o.steep = corax_rad(70.0);
    o.low_alpha = corax_rad(10.0);
    o.run_length = 3.0;
    o.min_run = 3;
    o.run_window = 30.0;
    o.run_misfit = corax_rad(25.0);
    o.min_fabric = 10;
    o.fabric_strength = 0.8;
    o.spread_ratio = 2.0;
    o.hole_turn = corax_rad(15.0);
    o.turn_gain = 0.4;
    o.low_confidence = low;
    o.azimuth_correction = 0.0;
    o.total_field = 300.0;
    o.field_dip = corax_rad(0.45);
    return o;
}

/* The signed change from azimuth a to b, in (-pi, pi]. */
static double turn(double a, double b)
{
    double d = fmod(b - a, 2.0 * CORAX_PI);
    if (d > CORAX_PI)
        d -= 2.0 * CORAX_PI;
    if (d <= -CORAX_PI)
        d += 2.0 * CORAX_PI;
    return d;
}

typedef struct hole_ctx {
    const corax_hole *h;
    const char *name;
    const corax_qa_options *o;
    corax_findings *out;
    const char *file; /* the survey table, for the lines findings name */
    size_t n;
    double offset;    /* the azimuth offset most holes share (first station minus
                         collar), taken out before a hole's own is judged; 0 when none */
} hole_ctx;

static corax_station station(const corax_hole *h, size_t i)
{
    corax_station s;
    corax_hole_station(h, i, &s, NULL, NULL);
    return s;
}

/* Survey rows out of depth order in the file. A row or two that goes back
 * looks like a mistyped depth, worth a note each; a table in no particular
 * order is fine (the stations are sorted) and is only counted, in *shuffled. */
static corax_status check_order(const hole_ctx *c, size_t *shuffled)
{
    size_t *order = malloc((c->n ? c->n : 1) * sizeof *order); /* stations in file order */
    if (!order)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < c->n; i++)
        order[i] = i;
    for (size_t i = 1; i < c->n; i++) /* insertion sort by line: a hole has few stations */
        for (size_t j = i; j > 0 && station(c->h, order[j]).line < station(c->h, order[j - 1]).line; j--) {
            size_t t = order[j];
            order[j] = order[j - 1];
            order[j - 1] = t;
        }
    size_t back = 0;
    for (size_t i = 1; i < c->n; i++)
        back += station(c->h, order[i]).depth < station(c->h, order[i - 1]).depth;
    corax_status st = CORAX_OK;
    if (back > 2 || (back && c->n < 4))
        ++*shuffled;
    else
        for (size_t i = 1; i < c->n && st == CORAX_OK; i++) {
            corax_station a = station(c->h, order[i - 1]), b = station(c->h, order[i]);
            if (b.depth < a.depth && a.line > 0 && b.line > 0)
                st = corax_findings_add(c->out, CORAX_NOTE, "survey-order", c->file, b.line,
                                        c->name, b.depth,
                                        "depth %g (line %ld) follows depth %g (line %ld) in the "
                                        "survey table: a mistyped depth?",
                                        b.depth, b.line, a.depth, a.line);
        }
    free(order);
    return st;
}

static corax_status check_courses(const hole_ctx *c)
{
    const corax_qa_options *o = c->o;
    corax_status st = CORAX_OK;
    for (size_t i = 1; i < c->n && st == CORAX_OK; i++) {
        corax_station a = station(c->h, i - 1), b = station(c->h, i);
        double dls, gap = b.depth - a.depth;
        corax_hole_station(c->h, i, NULL, NULL, &dls);
        if (gap > o->gap)
            st = corax_findings_add_range(
                c->out, CORAX_WARNING, "survey-gap", c->file, b.line, c->name, a.depth, b.depth,
                "stations at %.1f and %.1f m are %.4g m apart (more than %.4g): the path between "
                "them is an arc guessed from its ends",
                a.depth, b.depth, gap, o->gap);
        if (st == CORAX_OK && dls > o->dogleg)
            st = corax_findings_add_range(
                c->out, CORAX_WARNING, "dogleg", c->file, b.line, c->name, a.depth, b.depth,
                "dogleg severity %.1f degrees per 30 m between %.1f and %.1f m (limit %.1f)",
                corax_deg(dls), a.depth, b.depth, corax_deg(o->dogleg));
    }
    return st;
}

/* An azimuth that swings with the dip steady: what a magnetic tool near
 * magnetic rock reads. A station that swings out and back is named alone. */
static corax_status check_magnetic(const hole_ctx *c)
{
    const corax_qa_options *o = c->o;
    const double vertical = corax_rad(80.0); /* azimuth means little steeper than this */
    for (size_t i = 1; i < c->n; i++) {
        corax_station a = station(c->h, i - 1), b = station(c->h, i);
        if (fabs(a.plunge) > vertical || fabs(b.plunge) > vertical)
            continue;
        double daz = turn(a.azimuth, b.azimuth), ddip = fabs(b.plunge - a.plunge);
        if (fabs(daz) < o->magnetic_azimuth || ddip > o->magnetic_dip)
            continue;
        if (i + 1 < c->n) { /* out and back: the middle station alone */
            corax_station z = station(c->h, i + 1);
            double back = turn(b.azimuth, z.azimuth);
            if (fabs(back) >= o->magnetic_azimuth && back * daz < 0.0 &&
                fabs(z.plunge - b.plunge) <= o->magnetic_dip) {
                corax_status st = corax_findings_add(
                    c->out, CORAX_WARNING, "survey-magnetic", c->file, b.line, c->name, b.depth,
                    "the station at %.1f m turns %.1f degrees in azimuth and the next turns %.1f "
                    "back, with the dip steady: a reading disturbed by magnetic rock?",
                    b.depth, corax_deg(daz), corax_deg(back));
                if (st != CORAX_OK)
                    return st;
                i++; /* the way back is the same event */
                continue;
            }
        }
        corax_status st = corax_findings_add_range(
            c->out, CORAX_WARNING, "survey-magnetic", c->file, b.line, c->name, a.depth, b.depth,
            "the azimuth turns %.1f degrees between %.1f and %.1f m while the dip changes %.1f: "
            "magnetic interference?",
            corax_deg(daz), a.depth, b.depth, corax_deg(ddip));
        if (st != CORAX_OK)
            return st;
    }
    return CORAX_OK;
}

static corax_status check_ends(const hole_ctx *c)
{
    const corax_qa_options *o = c->o;
    const corax_collar *col = corax_hole_collar(c->h);
    corax_station first = station(c->h, 0), last = station(c->h, c->n - 1);
    corax_status st = CORAX_OK;
    if (first.depth > o->first_station)
        st = corax_findings_add_range(c->out, CORAX_NOTE, "survey-first-deep", c->file, first.line,
                                      c->name, 0.0, first.depth,
                                      "the first station is %.1f m below the collar: the hole "
                                      "above it is taken as straight",
                                      first.depth);
    if (st == CORAX_OK && col->has_direction) {
        corax_vec3 a = corax_direction(col->azimuth, col->plunge);
        corax_vec3 b = corax_direction(first.azimuth - c->offset, first.plunge);
        double apart = vec_angle(a, b);
        char shared[80] = "";
        if (c->offset != 0.0)
            snprintf(shared, sizeof shared, " once the offset most holes share (%.1f %s) is "
                                            "taken out",
                     fabs(corax_deg(c->offset)), c->offset < 0.0 ? "west" : "east");
        if (apart > o->collar_mismatch)
            st = corax_findings_add(
                c->out, CORAX_WARNING, "collar-vs-survey", c->file, first.line, c->name, 0.0,
                "the collar is set up at azimuth %.1f plunging %.1f, but the first station (%.1f m) "
                "reads azimuth %.1f plunging %.1f, %.1f degrees apart%s: which is right?",
                corax_deg(col->azimuth), corax_deg(col->plunge), first.depth,
                corax_deg(corax_wrap_azimuth(first.azimuth)), corax_deg(first.plunge),
                corax_deg(apart), shared);
    }
    if (st == CORAX_OK && isfinite(col->length) && col->length > 0.0 && last.depth > col->length)
        st = corax_findings_add(c->out, CORAX_WARNING, "survey-past-end", c->file, last.line, c->name,
                                last.depth,
                                "a station at %.1f m lies past the hole's length of %.1f m: is the "
                                "length or the depth wrong?",
                                last.depth, col->length);
    return st;
}

/* Stretches of hole steeper than a gravity-marked orientation line can be
 * trusted (up-holes too). */
static corax_status check_steep(const hole_ctx *c)
{
    const corax_qa_options *o = c->o;
    size_t i = 0;
    while (i < c->n) {
        corax_station s = station(c->h, i);
        if (fabs(s.plunge) <= o->steep) {
            i++;
            continue;
        }
        size_t j = i;
        double lo = fabs(s.plunge), hi = lo;
        while (j + 1 < c->n && fabs(station(c->h, j + 1).plunge) > o->steep) {
            double p = fabs(station(c->h, ++j).plunge);
            lo = fmin(lo, p);
            hi = fmax(hi, p);
        }
        double from = i == 0 ? 0.0 : s.depth;
        double to = j + 1 == c->n ? corax_hole_length(c->h) : station(c->h, j).depth;
        corax_status st = corax_findings_add_range(
            c->out, CORAX_WARNING, "steep-hole", c->file, s.line, c->name, from, to,
            "the hole plunges %.1f to %.1f degrees from %.1f to %.1f m, steeper than %.0f: a "
            "gravity-marked orientation line is unreliable there",
            corax_deg(lo), corax_deg(hi), from, to, corax_deg(o->steep));
        if (st != CORAX_OK)
            return st;
        i = j + 1;
    }
    return CORAX_OK;
}

/* ---- an offset shared by the program ---- */

/* Collar and first station within this of the shared offset share it. */
static const double share_tolerance = 0.0349; /* 2 degrees */

/* The azimuth a hole's first station reads past its collar's (signed, in
 * (-pi, pi]); 0 when the hole has no such pair or is too steep for an
 * azimuth to mean much. */
static int hole_offset(const corax_hole *h, double *offset)
{
    const double vertical = corax_rad(80.0);
    const corax_collar *col = corax_hole_collar(h);
    corax_station first;
    if (!col->has_direction || corax_hole_station_count(h) == 0 ||
        corax_hole_station(h, 0, &first, NULL, NULL) != CORAX_OK ||
        fabs(col->plunge) > vertical || fabs(first.plunge) > vertical)
        return 0;
    *offset = turn(col->azimuth, first.azimuth);
    return 1;
}

/* What a shared offset of `mean` says, given the correction the surveys got. */
static void offset_cause(char *buf, size_t size, double mean, double applied)
{
    const double near = corax_rad(1.0);
    double needed = corax_deg(applied - mean);
    if (fabs(applied) < corax_rad(0.05))
        snprintf(buf, size, "a declination or grid correction not applied? (%.1f degrees %s "
                            "would bring them back)",
                 fabs(needed), needed >= 0.0 ? "east" : "west");
    else if (fabs(mean - applied) <= near)
        snprintf(buf, size, "the correction of %+.1f applied to surveys that already read true "
                            "or grid north (applied twice)?",
                 corax_deg(applied));
    else if (fabs(mean - 2.0 * applied) <= near)
        snprintf(buf, size, "the correction of %+.1f applied with the wrong sign?",
                 corax_deg(applied));
    else
        snprintf(buf, size, "a correction of %+.1f rather than the %+.1f applied would bring "
                            "them back: a declination or grid correction wrong?",
                 needed, corax_deg(applied));
}

/* The holes whose offsets lie within share_tolerance of the median of the
 * offsets not yet taken (taken[k] 0), marked with `mark`; their mean and
 * spread. Returns how many. */
typedef struct offsets {
    double *value;     /* per hole with an offset */
    const char **name;
    int *taken;        /* 0 free, else the group's mark */
    double *scratch;
    size_t n;
} offsets;

static size_t group(offsets *g, int mark, double *mean, double *sd)
{
    size_t n = 0;
    for (size_t k = 0; k < g->n; k++)
        if (!g->taken[k])
            g->scratch[n++] = g->value[k];
    if (n == 0)
        return 0;
    double mid = gsl_stats_select(g->scratch, 1, n, n / 2);
    size_t m = 0;
    for (size_t k = 0; k < g->n; k++)
        if (!g->taken[k] && fabs(g->value[k] - mid) <= share_tolerance) {
            g->taken[k] = mark;
            g->scratch[m++] = g->value[k];
        }
    *mean = gsl_stats_mean(g->scratch, 1, m);
    *sd = m > 1 ? gsl_stats_sd_m(g->scratch, 1, m, *mean) : 0.0;
    return m;
}

/* The names of the holes in a group (`in`) or out of it, "A, B and C". */
static void group_names(const offsets *g, int mark, int in, char *buf, size_t size)
{
    const char **names = malloc((g->n + 1) * sizeof *names);
    size_t n = 0;
    for (size_t k = 0; names && k < g->n; k++)
        if ((g->taken[k] == mark) == in)
            names[n++] = g->name[k];
    if (names)
        qa_name_list(buf, size, names, n, 3);
    else
        snprintf(buf, size, "some");
    free(names);
}

/* A constant azimuth offset between the collars' set-ups and the first
 * stations that most holes share: a declination or grid correction not
 * applied, applied twice, or applied with the wrong sign. Then a group of
 * two holes or more whose offsets agree with each other but not with the
 * rest: a correction missing (or doubled) in their surveys alone. *shared
 * gets the first (0 when there is none), for the holes' own comparisons. */
static corax_status check_shared_offset(const corax_program *prog, const char *file,
                                        const corax_qa_options *o, corax_findings *out,
                                        double *shared)
{
    const double matters = corax_rad(2.0); /* smaller offsets are set-up noise */
    size_t n = corax_program_size(prog) + 1;
    offsets g = {malloc(n * sizeof(double)), malloc(n * sizeof(char *)), calloc(n, sizeof(int)),
                 malloc(n * sizeof(double)), 0};
    *shared = 0.0;
    corax_status st = g.value && g.name && g.taken && g.scratch ? CORAX_OK : CORAX_ENOMEM;
    for (size_t k = 0; st == CORAX_OK && k + 1 < n; k++) {
        const corax_hole *h = corax_program_hole(prog, k);
        if (hole_offset(h, &g.value[g.n]))
            g.name[g.n++] = corax_hole_name(h);
    }
    double mean = 0.0, sd = 0.0, gmean, gsd;
    size_t most = st == CORAX_OK && g.n >= 3 ? group(&g, 1, &mean, &sd) : 0;
    char cause[240], list[120], others[160] = "";
    if (most >= 3 && 3 * most >= 2 * g.n && fabs(mean) >= matters &&
        fabs(mean) >= 3.0 * sd / sqrt((double)most)) {
        offset_cause(cause, sizeof cause, mean, o->azimuth_correction);
        if (most < g.n) {
            group_names(&g, 1, 0, list, sizeof list);
            snprintf(others, sizeof others, " (all but %s)", list);
        }
        *shared = mean;
        if (o->shards <= 1) /* a finding about no hole: the whole program's */
            st = corax_findings_add(out, CORAX_WARNING, "azimuth-offset", file, 0, NULL, NAN,
                                    "survey azimuths sit %.1f +- %.1f degrees %s of the collar "
                                    "set-ups in %zu of %zu holes%s, comparing each collar with "
                                    "its first station: %s",
                                    fabs(corax_deg(mean)), corax_deg(sd),
                                    mean < 0.0 ? "west" : "east", most, g.n, others, cause);
    }
    size_t few = most >= 3 && st == CORAX_OK ? group(&g, 2, &gmean, &gsd) : 0;
    if (few >= 2 && fabs(gmean - mean) >= matters && fabs(gmean - mean) >= 3.0 * gsd &&
        o->shards <= 1) {
        group_names(&g, 2, 1, list, sizeof list);
        char rest[48] = "none";
        if (fabs(corax_deg(mean)) >= 0.05)
            snprintf(rest, sizeof rest, "%.1f %s", fabs(corax_deg(mean)),
                     mean < 0.0 ? "west" : "east");
        st = corax_findings_add(out, CORAX_WARNING, "azimuth-offset", file, 0, NULL, NAN,
                                "the survey azimuths of %zu holes (%s) sit %.1f +- %.1f degrees "
                                "%s of their collar set-ups, against %s in %zu other holes: a "
                                "declination or grid correction missing, doubled or of the wrong "
                                "sign in their surveys alone (another tool?)",
                                few, list, fabs(corax_deg(gmean)), corax_deg(gsd),
                                gmean < 0.0 ? "west" : "east", rest, most);
    }
    free(g.value);
    free(g.name);
    free(g.taken);
    free(g.scratch);
    return st;
}

corax_status corax_qa_surveys(const corax_program *prog, const char *surveys_file,
                              const corax_qa_options *o, corax_findings *out)
{
    size_t shuffled = 0;
    double shared;
    corax_status first = check_shared_offset(prog, surveys_file, o, out, &shared);
    if (first != CORAX_OK)
        return first;
    for (size_t k = 0; k < corax_program_size(prog); k++) {
        hole_ctx c;
        c.h = corax_program_hole(prog, k);
        c.name = corax_hole_name(c.h);
        if (!qa_in_shard(o, c.name))
            continue;
        c.o = o;
        c.out = out;
        c.file = surveys_file;
        c.n = corax_hole_station_count(c.h);
        c.offset = shared;
        const corax_collar *col = corax_hole_collar(c.h);
        corax_status st = CORAX_OK;
        if (c.n == 0) {
            st = col->has_direction
                     ? corax_findings_add(out, CORAX_NOTE, "survey-missing", NULL, 0, c.name, NAN,
                                          "no downhole survey: the collar's azimuth and dip stand "
                                          "for the whole hole")
                     : corax_findings_add(out, CORAX_WARNING, "survey-missing", NULL, 0, c.name,
                                          NAN,
                                          "no survey and no collar direction: nothing down this "
                                          "hole can be placed");
            if (st == CORAX_OK && col->has_direction && fabs(col->plunge) > o->steep)
                st = corax_findings_add_range(
                    out, CORAX_WARNING, "steep-hole", NULL, 0, c.name, 0.0,
                    corax_hole_length(c.h),
                    "the hole is set up plunging %.1f degrees, steeper than %.0f: a "
                    "gravity-marked orientation line is unreliable",
                    corax_deg(fabs(col->plunge)), corax_deg(o->steep));
            if (st != CORAX_OK)
                return st;
            continue;
        }
        if ((st = check_order(&c, &shuffled)) != CORAX_OK || (st = check_courses(&c)) != CORAX_OK ||
            (st = check_magnetic(&c)) != CORAX_OK || (st = check_ends(&c)) != CORAX_OK ||
            (st = check_steep(&c)) != CORAX_OK)
            return st;
    }
    if (shuffled && o->shards <= 1) /* a note about no hole: the whole program's */
        return corax_findings_add(out, CORAX_NOTE, "survey-order", surveys_file, 0, NULL, NAN,
                                  "the survey rows of %zu hole%s are in no particular depth "
                                  "order; that is fine (corax sorts them), but a mistyped depth "
                                  "would not stand out",
                                  shuffled, shuffled == 1 ? "" : "s");
    return CORAX_OK;
}
