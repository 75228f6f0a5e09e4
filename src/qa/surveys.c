/* qa: the survey checks of a drill program, hole by hole. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/qa.h"
#include "geometry/vec.h"

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
                "stations at %.1f and %.1f m are %.0f m apart (more than %.0f): the path between "
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
        corax_vec3 b = corax_direction(first.azimuth, first.plunge);
        double apart = vec_angle(a, b);
        if (apart > o->collar_mismatch)
            st = corax_findings_add(
                c->out, CORAX_WARNING, "collar-vs-survey", c->file, first.line, c->name, 0.0,
                "the collar is set up at azimuth %.1f plunging %.1f, but the first station (%.1f m) "
                "reads azimuth %.1f plunging %.1f, %.1f degrees apart: which is right?",
                corax_deg(col->azimuth), corax_deg(col->plunge), first.depth,
                corax_deg(first.azimuth), corax_deg(first.plunge), corax_deg(apart));
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

corax_status corax_qa_surveys(const corax_program *prog, const char *surveys_file,
                              const corax_qa_options *o, corax_findings *out)
{
    size_t shuffled = 0;
    for (size_t k = 0; k < corax_program_size(prog); k++) {
        hole_ctx c;
        c.h = corax_program_hole(prog, k);
        c.name = corax_hole_name(c.h);
        c.o = o;
        c.out = out;
        c.file = surveys_file;
        c.n = corax_hole_station_count(c.h);
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
    if (shuffled)
        return corax_findings_add(out, CORAX_NOTE, "survey-order", surveys_file, 0, NULL, NAN,
                                  "the survey rows of %zu hole%s are in no particular depth "
                                  "order; that is fine (corax sorts them), but a mistyped depth "
                                  "would not stand out",
                                  shuffled, shuffled == 1 ? "" : "s");
    return CORAX_OK;
}
