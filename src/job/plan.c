/* job: the plan job, drill planning. What each planned hole would see of the
 * structure sets, where it would pierce the target planes, and a sweep of
 * hole directions scored by how well they sample every set at once. */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "corax/job_plan.h"
#include "corax/plan_drawing.h"
#include "corax/svg.h"
#include "job/job_int.h"

typedef struct plan_run {
    corax_job *job;
    const corax_plan_job_options *o;
    corax_plan_inputs in;
    corax_plan_model *model;
    corax_hole **paths;
    corax_plan_sampling *sampling; /* holes x sets */
    corax_plan_pierce *pierces;    /* holes x targets */
    corax_plan_program_set *program;
    double *lengths;
} plan_run;

/* Read the three tables; CORAX_EFORMAT with the faults said. */
static corax_status load(plan_run *r)
{
    const corax_plan_job_options *o = r->o;
    corax_findings problems = {0};
    corax_error err;
    corax_error_clear(&err);
    corax_plan_load_options lo = o->tables;
    corax_status st = corax_plan_holes_load(o->holes, &lo, &r->in, &problems, &err);
    if (st == CORAX_OK)
        st = corax_plan_sets_load(o->sets, &lo, &r->in, &problems, &err);
    if (st == CORAX_OK && o->targets)
        st = corax_plan_targets_load(o->targets, &lo, &r->in, &problems, &err);
    if (st != CORAX_OK) {
        job_error_record(r->job, &err, st);
        corax_findings_clear(&problems);
        return job_failed(st);
    }
    for (size_t i = 0; i < problems.count; i++)
        job_finding(r->job, &problems.item[i]);
    size_t errors = problems.count;
    corax_findings_clear(&problems);
    if (errors) {
        job_error(r->job, NULL, 0, "%zu problem%s in the plan's tables; nothing written",
                  errors, errors == 1 ? "" : "s");
        return CORAX_EFORMAT;
    }
    if (!r->in.nholes || !r->in.nsets) {
        job_error(r->job, r->in.nholes ? o->sets : o->holes, 0, "the table has no %s",
                  r->in.nholes ? "set" : "planned hole");
        return CORAX_EFORMAT;
    }
    return CORAX_OK;
}

/* Desurvey, sample and pierce every planned hole. */
static corax_status evaluate(plan_run *r)
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
                          ? corax_plan_model_new(r->in.sets, ns, &r->o->convert, &r->model)
                          : CORAX_ENOMEM;
    for (size_t h = 0; h < nh && st == CORAX_OK; h++) {
        st = corax_plan_path(&r->in.holes[h], &r->paths[h], &err);
        if (st == CORAX_OK)
            st = corax_plan_sample(r->model, r->paths[h], &r->sampling[h * ns]);
        for (size_t t = 0; t < nt && st == CORAX_OK; t++)
            st = corax_plan_pierce_target(r->paths[h], &r->in.targets[t], &r->o->convert,
                                          &r->pierces[h * nt + t]);
        r->lengths[h] = r->in.holes[h].length;
    }
    if (st != CORAX_OK) {
        if (err.message[0])
            job_error(r->job, r->o->holes, err.line, "%s", err.message);
        else
            job_error(r->job, NULL, 0, "%s", corax_strerror(st));
        return CORAX_EFORMAT;
    }
    corax_plan_program(r->model, r->sampling, r->lengths, nh, r->program);
    return CORAX_OK;
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
            corax_plan_sampling_note(s, r->in.holes[h].length, &r->o->convert, note, sizeof note);
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
        corax_writer_number(w, corax_plunge_to_dip(d->plunge, r->o->tables.dip_convention), 2);
        corax_writer_number(w, d->score, 4);
        text_field(w, r->in.sets[d->worst_set].name);
        corax_writer_number(w, corax_deg(d->worst_alpha), 2);
        corax_writer_end_row(w);
    }
}

/* Write one table whole or not at all; 0, or -1 with the message given. */
static int write_table(const plan_run *r, const char *path,
                       void (*fill)(const plan_run *, corax_writer *))
{
    corax_writer *w = job_output(r->job, path, NULL);
    if (!w)
        return -1;
    fill(r, w);
    return job_commit(r->job, w) == CORAX_OK ? 0 : -1;
}

static int write_picture(const plan_run *r)
{
    const corax_plan_job_options *o = r->o;
    corax_plan_picture pic = {r->model,     o->directions,   o->ndirections,
                              o->azimuth.step, o->plunge.step, r->in.holes,
                              r->in.nholes, r->program,      r->in.ntargets,
                              o->tables.dip_convention, o->title};
    corax_svg *svg;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_plan_picture_draw(&pic, &svg);
    if (st == CORAX_OK) {
        st = corax_svg_save(svg, r->job->outputs, o->svg, &err);
        corax_svg_free(svg);
    }
    if (st != CORAX_OK)
        job_error_record(r->job, &err, st);
    return st == CORAX_OK ? 0 : -1;
}

static void record(corax_record *a, const corax_plan_job_options *o)
{
    corax_record_section(a, "plan");
    corax_record_set(a, "holes", "%s", o->holes);
    corax_record_set(a, "sets", "%s", o->sets);
    if (o->targets)
        corax_record_set(a, "targets", "%s", o->targets);
    corax_record_set(a, "curved_plans", "a station every %g m turned by the lift and drift, "
                     "desurveyed by minimum curvature", CORAX_PLAN_STATION_STEP);
    corax_record_set(a, "sampling", "along the whole hole, every metre; each plane of a set's "
                     "Fisher spread counted as often as the hole crosses it (Terzaghi 1965)");
    corax_record_conventions(a, &o->convert);
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
}

/* The program view for the summary: names copied, so that it outlives the
 * tables. */
static corax_status summarise(const plan_run *r, corax_plan_job_summary *sum)
{
    size_t ns = r->in.nsets, nh = r->in.nholes;
    if (!(sum->hole = calloc(nh ? nh : 1, sizeof *sum->hole)))
        return CORAX_ENOMEM;
    sum->nholes = nh;
    for (size_t h = 0; h < nh; h++)
        if (!(sum->hole[h] = strdup(r->in.holes[h].name)))
            return CORAX_ENOMEM;
    if (!(sum->set = calloc(ns ? ns : 1, sizeof *sum->set)))
        return CORAX_ENOMEM;
    sum->nsets = ns;
    for (size_t i = 0; i < ns; i++) {
        corax_plan_job_set *v = &sum->set[i];
        v->program = r->program[i];
        v->best_alpha = r->sampling[r->program[i].best_hole * ns + i].alpha;
        if (!(v->name = strdup(r->in.sets[i].name)) ||
            !(v->best_hole = strdup(r->in.holes[r->program[i].best_hole].name)))
            return CORAX_ENOMEM;
    }
    if (r->o->ndirections &&
        !(sum->worst_set = strdup(r->in.sets[r->o->directions[0].worst_set].name)))
        return CORAX_ENOMEM;
    return CORAX_OK;
}

void corax_plan_job_summary_clear(corax_plan_job_summary *sum)
{
    for (size_t i = 0; sum->set && i < sum->nsets; i++) {
        free(sum->set[i].name);
        free(sum->set[i].best_hole);
    }
    for (size_t h = 0; sum->hole && h < sum->nholes; h++)
        free(sum->hole[h]);
    free(sum->hole);
    free(sum->set);
    free(sum->worst_set);
    memset(sum, 0, sizeof *sum);
}

corax_plan_job_options corax_plan_job_options_default(void)
{
    corax_plan_job_options o;
    memset(&o, 0, sizeof o);
    o.convert = corax_convert_options_default();
    o.tables = corax_plan_load_options_default();
    return o;
}

corax_status corax_plan_job_run(corax_job *job, const corax_plan_job_options *o,
                                const char *output, corax_plan_job_summary *sum)
{
    plan_run r;
    memset(&r, 0, sizeof r);
    memset(sum, 0, sizeof *sum);
    r.job = job;
    r.o = o;
    corax_status rc = load(&r);
    if (rc == CORAX_OK)
        rc = evaluate(&r);
    if (rc == CORAX_OK && o->directions) {
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_plan_sweep(r.model, r.in.holes, r.in.nholes, r.in.targets,
                                           r.in.ntargets, o->directions, o->ndirections, &err);
        if (st != CORAX_OK) {
            job_error(job, st == CORAX_EVALUE ? o->sets : o->holes, err.line, "%s",
                      err.message[0] ? err.message : corax_strerror(st));
            rc = job_failed(st);
        }
    }
    if (rc == CORAX_OK &&
        (write_table(&r, output, write_sampling) ||
         (o->pierce && write_table(&r, o->pierce, write_pierces)) ||
         (o->best && write_table(&r, o->best, write_best)) || (o->svg && write_picture(&r))))
        rc = CORAX_EIO;
    if (rc == CORAX_OK) {
        record(job->record, o);
        if ((rc = summarise(&r, sum)) != CORAX_OK)
            job_error(job, NULL, 0, "out of memory");
    }
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
