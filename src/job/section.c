/* job: the section job, a vertical cross-section through a drill program:
 * the structures of a converted table that lie in the slab, with their
 * apparent dips, as a table, and the section drawn to scale as SVG. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/corax.h"
#include "io/carry.h"
#include "job/converted.h"

/* Our own columns, in order. */
static const char *const added[] = {"distance_along", "offset", "elevation", "apparent_dip",
                                    "apparent_dip_toward"};
enum { NADDED = sizeof added / sizeof added[0] };

/* One structure in the slab: its row to the table, its mark to the drawing. */
typedef struct slab_run {
    corax_job *job;
    const corax_section_job_options *o;
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
        job_error(r->job, NULL, 0, "out of memory");
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
        job_error(r->job, NULL, 0, "out of memory");
        return -1;
    }
    return 0;
}

/* Read the converted table into the slab's table and drawing. */
static corax_status read_structures(slab_run *r, const char *input)
{
    job_converted t;
    corax_status rc = job_converted_open(r->job, &r->o->converted, input, &t);
    if (rc != CORAX_OK)
        return rc;
    if (corax_carry_add(r->carry, &t.header, NULL, 0) < 0) {
        job_converted_close(&t);
        job_error(r->job, NULL, 0, "out of memory");
        return CORAX_ENOMEM;
    }
    corax_carry_header(r->carry, r->w);
    for (int i = 0; i < NADDED; i++)
        corax_writer_field(r->w, added[i], strlen(added[i]));
    corax_writer_end_row(r->w);
    corax_row row;
    corax_structure s;
    while (job_converted_next(&t, &row, &s))
        if (keep(r, &row, &s) < 0) {
            job_converted_close(&t);
            return CORAX_ENOMEM;
        }
    return job_converted_close(&t);
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
static void note_holes(corax_job *job, const char *const *names, size_t n, const char *why)
{
    char list[1024];
    if (!n)
        return;
    name_list(list, sizeof list, names, n);
    job_note(job, "%zu hole%s %s, left out: %s", n, n == 1 ? "" : "s", why, list);
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
    note_holes(r->job, missing, nmiss, "never reaching the slab");
    note_holes(r->job, pathless, npathless, "without a path (no survey, no collar direction)");
    free(missing);
    return 0;
}

static corax_svg *draw(const slab_run *r, const char *input, size_t holes)
{
    const corax_section_job_options *o = r->o;
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
             CORAX_VERSION, strcmp(input, "-") ? input : "standard input",
             corax_wrap_degrees(o->azimuth, 0));
    return corax_section_drawing_render(r->drawing, title, footer);
}

static void record(corax_record *a, const corax_section_job_options *o, const slab_run *r,
                   const char *input, size_t holes)
{
    corax_record_section(a, "section");
    corax_record_set(a, "converted", "%s", input);
    corax_record_set(a, "origin", "%.10g,%.10g", o->x, o->y);
    corax_record_set(a, "azimuth", "%g (distance along grows this way)", o->azimuth);
    corax_record_set(a, "width", "%g (the slab reaches %g either side of the line)", o->width,
                     o->width / 2);
    if (o->has_from)
        corax_record_set(a, "from", "%g", o->from);
    if (o->has_to)
        corax_record_set(a, "to", "%g", o->to);
    corax_record_set(a, "offset_sign", "positive on the right looking toward the azimuth");
    corax_record_set(a, "apparent_dip", "tan(apparent) = tan(dip) |cos(azimuth - dip direction)|");
    corax_record_set(a, "trace_step", "%g", o->step);
    if (o->svg)
        corax_record_set(a, "drawing", "%s", o->svg);
    if (o->kinds)
        corax_record_set(a, "kinds", "%s (only these)", o->kinds);
    if (o->scale > 0.0)
        corax_record_set(a, "scale", "1:%g at 96 pixels to the inch", o->scale);
    corax_record_section(a, "results");
    corax_record_set(a, "structures_in_slab", "%zu", r->kept);
    corax_record_set(a, "structures_outside", "%zu", r->outside);
    if (o->kinds)
        corax_record_set(a, "structures_of_other_kinds", "%zu", r->other_kinds);
    corax_record_set(a, "structures_without_position", "%zu", r->unlocated);
    corax_record_set(a, "holes_drawn", "%zu", holes);
}

/* Commit the table, then save the drawing made before it. */
static corax_status finish(slab_run *r, corax_svg *svg)
{
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_commit(r->w, &err);
    r->w = NULL;
    if (st == CORAX_OK && svg)
        st = corax_svg_save(svg, r->job->outputs, r->o->svg, &err);
    if (st != CORAX_OK) {
        job_error_record(r->job, &err, st);
        return job_failed(st);
    }
    return CORAX_OK;
}

corax_section_job_options corax_section_job_options_default(void)
{
    corax_section_job_options o;
    memset(&o, 0, sizeof o);
    o.step = 5.0;
    o.converted = corax_table_settings_default();
    o.converted.format.decimal = CORAX_DECIMAL_EITHER;
    return o;
}

corax_status corax_section_job_run(corax_job *job, const corax_program *prog,
                                   const corax_section_job_options *o, const char *input,
                                   const char *output, corax_section_job_summary *sum)
{
    slab_run r = {job, o, corax_section_make(o->x, o->y, corax_rad(o->azimuth), o->width),
                  NULL, NULL, NULL, NULL, NULL, 0, 0, 0, 0, 0};
    memset(sum, 0, sizeof *sum);
    if (o->has_from)
        r.section.from = o->from;
    if (o->has_to)
        r.section.to = o->to;
    corax_status st;
    if (!(r.w = job_output(job, output, &st)))
        return st;
    corax_status rc = CORAX_ENOMEM;
    size_t holes = 0;
    corax_svg *svg = NULL;
    r.carry = corax_carry_new(added, NADDED);
    r.kinds = corax_kinds_new();
    r.drawing = o->svg ? corax_section_drawing_new(&r.section, o->step) : NULL;
    if (r.drawing)
        corax_section_drawing_scale(r.drawing, o->scale);
    if (!r.carry || !r.kinds || (o->svg && !r.drawing) ||
        (o->kinds && only_kinds(&r, o->kinds) != 0)) {
        job_error(job, NULL, 0, "out of memory");
        goto done;
    }
    if ((rc = read_structures(&r, input)) != CORAX_OK)
        goto done;
    rc = CORAX_ENOMEM;
    if (add_holes(&r, prog, &holes) != 0 || (o->svg && !(svg = draw(&r, input, holes)))) {
        job_error(job, NULL, 0, "out of memory");
        goto done;
    }
    if (r.unlocated)
        job_note(job, "%zu row%s without a position (x, y, z empty) left out", r.unlocated,
                 r.unlocated == 1 ? "" : "s");
    if (r.kept == 0)
        job_note(job, "the slab holds no structures: the table has only its header%s",
                 o->svg ? ", the drawing only holes" : "");
    if ((rc = finish(&r, svg)) == CORAX_OK) {
        record(job->record, o, &r, input, holes);
        *sum = (corax_section_job_summary){r.kept, r.outside, r.other_kinds, r.unlocated, holes};
    }
done:
    corax_writer_discard(r.w);
    corax_svg_free(svg);
    corax_section_drawing_free(r.drawing);
    corax_kinds_free(r.kinds);
    corax_carry_free(r.carry);
    free(r.only);
    return rc;
}
