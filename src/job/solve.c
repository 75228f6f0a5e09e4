/* job: the solve job, planes from alpha-only readings of one feature in
 * several holes: each set's candidates ranked, with their misfit and, by
 * Monte Carlo, their cones; every reading's place and residual on request. */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/corax.h"
#include "io/fields.h"
#include "job/job_int.h"

/* One solve: its job, options, inputs and output. */
typedef struct solve_opts {
    corax_job *job;
    const corax_solve_job_options *p;
    const char *const *inputs;
    size_t ninputs;
    const char *output;
} solve_opts;

typedef struct reading_row {
    const corax_table *table;
    size_t row;
    long set;                /* its set, -1 for none */
    corax_solve_reading r;
    corax_result place;      /* where the reading is (corax_convert_locate) */
    const char *status;      /* "used", or why it is left out */
    char *why;               /* the phrase for a row left out, else NULL */
} reading_row;

typedef struct solve_set {
    char *name;
    size_t left_out;         /* its rows that could not be used */
    size_t assumed;          /* used rows on a path assumed (collar-only, ...) */
    corax_solve_result result;
    corax_cone *cones;       /* its readings' cones, for the net */
} solve_set;

typedef struct solve_data {
    corax_table **tables;
    size_t ntables;
    reading_row *rows;
    size_t nrows;
    solve_set *sets;
    size_t nsets;
} solve_data;

enum { C_HOLE, C_DEPTH, C_ALPHA, C_SET, C_ALPHA_ERROR, C_DEPTH_ERROR, NC };
static const char *const col_names[NC] = {"hole", "depth", "alpha", "set", "alpha_error",
                                          "depth_error"};

/* ---- the readings ---- */

static void data_free(solve_data *d)
{
    for (size_t i = 0; i < d->ntables; i++)
        corax_table_free(d->tables[i]);
    for (size_t i = 0; i < d->nrows; i++)
        free(d->rows[i].why);
    for (size_t i = 0; i < d->nsets; i++) {
        free(d->sets[i].cones);
        free(d->sets[i].name);
    }
    free(d->tables);
    free(d->rows);
    free(d->sets);
}

/* The set named by text (len bytes), added when new; -1 when out of memory. */
static long set_of(solve_data *d, const char *text, size_t len)
{
    for (size_t k = 0; k < d->nsets; k++)
        if (strlen(d->sets[k].name) == len && memcmp(d->sets[k].name, text, len) == 0)
            return (long)k;
    solve_set *s = realloc(d->sets, (d->nsets + 1) * sizeof *s);
    if (!s)
        return -1;
    d->sets = s;
    memset(&s[d->nsets], 0, sizeof *s);
    if (!(s[d->nsets].name = strndup(text, len)))
        return -1;
    return (long)d->nsets++;
}

/* Leave a row out with a status word and a phrase. */
static void leave_out(reading_row *rr, const char *status, const char *why)
{
    rr->status = status;
    rr->why = strdup(why);
}

/* A reading's own error column, or the run's: 0 with why filled when the
 * column holds something unusable. */
static int own_error(const corax_row *row, long col, char decimal, const char *name, double unit,
                     double *value, char *why, size_t wl)
{
    double v;
    corax_number_status st = corax_field_number(row, col, decimal, name, &v, why, wl);
    if (st == CORAX_NUMBER_EMPTY || col < 0)
        return 1;
    if (st != CORAX_NUMBER_OK || !corax_field_nonnegative(v, name, why, wl))
        return 0;
    *value = v * unit;
    return 1;
}

/* Read one row: its set, its values and its place down the hole. */
static corax_status read_row(const solve_opts *o, const corax_program *prog, solve_data *d,
                             const corax_table *t, size_t i, const long *col,
                             const char **field)
{
    reading_row *rr = &d->rows[d->nrows++];
    memset(rr, 0, sizeof *rr);
    rr->table = t;
    rr->row = i;
    rr->status = "used";
    rr->set = -1;
    corax_row row;
    corax_table_row(t, i, field, &row);
    char why[200];
    corax_table_info info;
    corax_table_read_info(t, &info);
    char decimal = info.format.decimal;
    double unit = o->p->readings.unit;
    size_t sl, hl;
    const char *set = corax_field_text(&row, col[C_SET], &sl);
    while (sl && (*set == ' ' || *set == '\t')) {
        set++;
        sl--;
    }
    while (sl && (set[sl - 1] == ' ' || set[sl - 1] == '\t'))
        sl--;
    if (sl && (rr->set = set_of(d, set, sl)) < 0)
        return CORAX_EFORMAT;
    const char *name = corax_field_text(&row, col[C_HOLE], &hl);
    double depth = NAN, alpha = NAN;
    rr->r.alpha_error = o->p->errors.alpha;
    rr->r.depth_error = o->p->errors.depth;
    if (corax_field_ragged(&row, corax_table_columns(t), why, sizeof why) ||
        corax_field_number(&row, col[C_DEPTH], decimal, "depth", &depth, why, sizeof why) ||
        !corax_field_nonnegative(depth, "depth", why, sizeof why) ||
        corax_field_number(&row, col[C_ALPHA], decimal, "alpha", &alpha, why, sizeof why) ||
        !corax_field_in_range(alpha, 0, 90, "alpha", why, sizeof why) ||
        !own_error(&row, col[C_ALPHA_ERROR], decimal, "alpha_error", CORAX_DEG, &rr->r.alpha_error,
                   why, sizeof why) ||
        !own_error(&row, col[C_DEPTH_ERROR], decimal, "depth_error", unit, &rr->r.depth_error,
                   why, sizeof why) ||
        !corax_field_plausible(depth *= unit, CORAX_MAX_DEPTH, "depth", why, sizeof why)) {
        corax_convert_locate(corax_program_find(prog, name, hl), depth, NULL, &rr->place);
        leave_out(rr, "invalid", why);
    } else {
        rr->r = (corax_solve_reading){corax_program_find(prog, name, hl), depth, corax_rad(alpha),
                                      rr->r.alpha_error, rr->r.depth_error};
        corax_convert_locate(rr->r.hole, depth, NULL, &rr->place);
        if (!rr->place.located)
            leave_out(rr, corax_condition_status(rr->place.conditions),
                      rr->r.hole ? "the hole has no survey and no collar direction"
                                 : "the hole is not in the collar table");
        else if (rr->set < 0)
            leave_out(rr, "no-set", "no set named (which feature is it?)");
    }
    if (rr->set >= 0 && rr->why)
        d->sets[rr->set].left_out++;
    else if (rr->set >= 0 && rr->place.conditions)
        d->sets[rr->set].assumed++;
    if (rr->why)
        job_error(o->job, corax_table_path(t), corax_table_line(t, i), "%s; left out", rr->why);
    return CORAX_OK;
}

/* Same header names, in the same order (without regard to case). */
static int same_header(const corax_table *a, const corax_table *b)
{
    if (corax_table_columns(a) != corax_table_columns(b))
        return 0;
    for (size_t c = 0; c < corax_table_columns(a); c++)
        if (strcasecmp(corax_table_header_name(a, c), corax_table_header_name(b, c)) != 0)
            return 0;
    return 1;
}

static corax_status load(const solve_opts *o, const corax_program *prog, solve_data *d)
{
    for (size_t f = 0; f < o->ninputs; f++) {
        corax_table *t = job_table_keep(o->job, CORAX_ROLE_STRUCTURES, o->inputs[f],
                                        &o->p->readings, &d->tables, &d->ntables);
        if (!t)
            return CORAX_EFORMAT;
        long col[NC];
        if (job_table_columns(o->job, t, &o->p->readings, col_names, NC, col) != CORAX_OK)
            return CORAX_EFORMAT;
        for (int k = 0; k <= C_SET; k++)
            if (col[k] < 0) {
                job_error(o->job, o->inputs[f], 1, "no '%s' column in the header", col_names[k]);
                return CORAX_EFORMAT;
            }
        if (f > 0 && !same_header(t, d->tables[0])) {
            job_error(o->job, o->inputs[f], 1, "the header differs from the first table's; solve "
                      "them separately or give them the same columns");
            return CORAX_EFORMAT;
        }
        size_t rows = corax_table_rows(t);
        reading_row *p = realloc(d->rows, (d->nrows + rows + 1) * sizeof *p);
        const char **field = malloc((corax_table_widest(t) + 1) * sizeof *field);
        if (!p || !field) {
            free(field);
            if (p)
                d->rows = p;
            return CORAX_EFORMAT;
        }
        d->rows = p;
        corax_status rc = CORAX_OK;
        for (size_t r = 0; r < rows && rc == CORAX_OK; r++)
            rc = read_row(o, prog, d, t, r, col, field);
        free(field);
        if (rc != CORAX_OK)
            return rc;
    }
    return CORAX_OK;
}

/* ---- solving ---- */

static corax_status solve_sets(const solve_opts *o, solve_data *d)
{
    corax_solve_reading *r = malloc((d->nrows + 1) * sizeof *r);
    if (!r)
        return CORAX_EFORMAT;
    corax_status st = CORAX_OK;
    for (size_t k = 0; k < d->nsets && st == CORAX_OK; k++) {
        solve_set *s = &d->sets[k];
        size_t n = 0;
        for (size_t i = 0; i < d->nrows; i++)
            if (d->rows[i].set == (long)k && !d->rows[i].why)
                r[n++] = d->rows[i].r;
        if (!(s->cones = malloc((n + 1) * sizeof *s->cones)))
            st = CORAX_ENOMEM;
        if (st == CORAX_OK)
            st = corax_solve_place(r, n, s->cones, NULL);
        corax_solve_options so = o->p->solve;
        so.alpha_error = o->p->errors.alpha;
        if (st == CORAX_OK)
            st = corax_solve_cones(s->cones, n, &so, &s->result);
        if (st == CORAX_OK && o->p->draws && s->result.ncandidates)
            st = corax_solve_draws(r, n, &o->p->errors, o->p->draws,
                                   corax_mc_hole_seed(o->p->seed, s->name, 0), &s->result);
    }
    free(r);
    if (st != CORAX_OK) {
        job_error(o->job, NULL, 0, "cannot solve: %s", corax_strerror(st));
        return CORAX_EFORMAT;
    }
    return CORAX_OK;
}

/* ---- output ---- */

/* Append a phrase to a note, "; " between phrases. */
static void note_add(char *buf, size_t size, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));

static void note_add(char *buf, size_t size, const char *fmt, ...)
{
    size_t used = strlen(buf);
    if (used + 3 >= size)
        return;
    if (used)
        used += (size_t)snprintf(buf + used, size - used, "; ");
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(buf + used, size - used, fmt, ap);
    va_end(ap);
}

/* What a set's row (candidate k, or the set when it has none) says. */
static void set_note(const solve_opts *o, const solve_set *s, size_t k, char *note, size_t size)
{
    const corax_solve_result *r = &s->result;
    double limit = corax_deg(o->p->solve.parallel_limit);
    note[0] = '\0';
    switch (r->status) {
    case CORAX_SOLVE_NO_READINGS:
        note_add(note, size, "no reading of this set can be used");
        break;
    case CORAX_SOLVE_ONE_READING:
        note_add(note, size, "a single reading puts the plane's normal on a cone about its "
                 "hole (%.1f degrees from the axis); readings in two holes at different angles "
                 "fix it", corax_deg(0.5 * CORAX_PI - s->cones[0].alpha));
        break;
    case CORAX_SOLVE_ONE_HOLE:
        note_add(note, size, "every reading is in one hole: the normal lies somewhere on a cone "
                 "about it; a reading in a second hole at another angle fixes it");
        break;
    case CORAX_SOLVE_PARALLEL:
        note_add(note, size, "the holes' axes are at most %.1f degrees apart (limit %g): their "
                 "cones barely cross; read the set in a hole at another angle",
                 corax_deg(r->hole_spread), limit);
        break;
    case CORAX_SOLVE_AMBIGUOUS:
        if (r->holes == 2)
            note_add(note, size, "two holes: the cones meet in %zu places that fit as well; "
                     "a third hole, or what is known of the set, tells them apart",
                     r->ncandidates);
        else if (r->flatness < corax_rad(10))
            note_add(note, size, "the holes' axes lie within %.1f degrees of one plane: the "
                     "plane mirrored through it fits as well; a hole out of that plane tells "
                     "them apart", corax_deg(r->flatness));
        else
            note_add(note, size, "%zu planes fit as well, within the alpha error; more readings "
                     "or holes tell them apart", r->ncandidates);
        if (k > 0 && r->candidate[k].misfit - r->candidate[0].misfit >= corax_rad(0.005))
            note_add(note, size, "misfit %.2f against %.2f for candidate 1",
                     corax_deg(r->candidate[k].misfit), corax_deg(r->candidate[0].misfit));
        break;
    case CORAX_SOLVE_SOLVED:
        break;
    }
    if (r->ncandidates && r->candidate[k].misfit > 3.0 * o->p->errors.alpha &&
        o->p->errors.alpha > 0)
        note_add(note, size, "the misfit is over three times the alpha error: are these "
                 "readings one set of parallel planes, and their alphas right?");
    if (s->assumed)
        note_add(note, size, "%zu reading%s on a hole path assumed (collar-only, "
                 "extrapolated or beyond the end)", s->assumed, s->assumed == 1 ? "" : "s");
    if (s->left_out)
        note_add(note, size, "%zu reading%s left out (see the messages)", s->left_out,
                 s->left_out == 1 ? "" : "s");
}

static void text(corax_writer *w, const char *s) { corax_writer_field(w, s, strlen(s)); }

static corax_status write_sets(const solve_opts *o, const solve_data *d)
{
    corax_writer *w = job_output(o->job, o->output, NULL);
    if (!w)
        return CORAX_EFORMAT;
    static const char head[] =
        "set,candidate,dip,dip_direction,holes,readings,misfit,cone95,status,note\n";
    corax_writer_text(w, head, sizeof head - 1);
    for (size_t k = 0; k < d->nsets; k++) {
        const solve_set *s = &d->sets[k];
        const corax_solve_result *r = &s->result;
        size_t rows = r->ncandidates ? r->ncandidates : 1;
        for (size_t c = 0; c < rows; c++) {
            char note[900];
            set_note(o, s, c, note, sizeof note);
            text(w, s->name);
            if (r->ncandidates) {
                const corax_solution *x = &r->candidate[c];
                corax_writer_integer(w, (long long)c + 1);
                corax_writer_number(w, corax_deg(x->plane.dip), 2);
                corax_writer_azimuth(w, corax_deg(x->plane.dip_direction), 2);
            } else {
                for (int i = 0; i < 3; i++)
                    text(w, "");
            }
            corax_writer_integer(w, (long long)r->holes);
            corax_writer_integer(w, (long long)r->readings);
            if (r->ncandidates) {
                corax_writer_number(w, corax_deg(r->candidate[c].misfit), 2);
                corax_writer_number(w, corax_deg(r->candidate[c].cone95), 2);
            } else {
                text(w, "");
                text(w, "");
            }
            text(w, corax_solve_status_name(r->status));
            text(w, note);
            corax_writer_end_row(w);
        }
    }
    return job_commit(o->job, w);
}

/* Every reading in order, with its place and its residual from candidate 1. */
static corax_status write_residuals(const solve_opts *o, const solve_data *d)
{
    corax_writer *w = job_output(o->job, o->p->residuals, NULL);
    if (!w)
        return CORAX_EFORMAT;
    for (size_t c = 0; d->ntables && c < corax_table_columns(d->tables[0]); c++)
        text(w, corax_table_header_name(d->tables[0], c));
    static const char *const more[] = {"hole_azimuth", "hole_plunge", "residual", "status", "note"};
    for (int c = 0; c < 5; c++)
        text(w, more[c]);
    corax_writer_end_row(w);
    for (size_t i = 0; i < d->nrows; i++) {
        const reading_row *rr = &d->rows[i];
        size_t width = corax_table_columns(rr->table);
        for (size_t c = 0; c < width; c++)
            text(w, c < corax_table_width(rr->table, rr->row)
                        ? corax_table_cell(rr->table, rr->row, (long)c, NULL)
                        : "");
        if (rr->place.located) {
            double az, plunge;
            corax_direction_angles(rr->place.point.tangent, &az, &plunge);
            corax_writer_azimuth(w, corax_deg(az), 2);
            corax_writer_number(w, corax_deg(plunge), 2);
        } else {
            text(w, "");
            text(w, "");
        }
        const corax_solve_result *r = rr->set >= 0 ? &d->sets[rr->set].result : NULL;
        if (!rr->why && r && r->ncandidates) {
            corax_cone cone = {rr->place.point.tangent, rr->r.alpha, 0};
            corax_writer_number(w, corax_deg(corax_cone_residual(&cone, r->candidate[0].normal)),
                                2);
        } else {
            text(w, "");
        }
        text(w, rr->status);
        char note[600];
        size_t used = (size_t)snprintf(note, sizeof note, "%s", rr->why ? rr->why : "");
        size_t have = corax_table_width(rr->table, rr->row);
        for (size_t c = width; c < have && used < sizeof note; c++) /* nothing lost */
            used += (size_t)snprintf(note + used, sizeof note - used, "%s%s",
                                     c == width ? "; extra fields: " : ",",
                                     corax_table_cell(rr->table, rr->row, (long)c, NULL));
        text(w, note);
        corax_writer_end_row(w);
    }
    return job_commit(o->job, w);
}

/* Whether a set is to be drawn: every set, or those in --draw-sets. */
static int drawn(const solve_opts *o, const char *name)
{
    if (!o->p->draw_sets)
        return 1;
    size_t len = strlen(name);
    for (const char *p = o->p->draw_sets; *p;) {
        const char *end = strchr(p, ',');
        size_t n = end ? (size_t)(end - p) : strlen(p);
        if (n == len && strncasecmp(p, name, n) == 0)
            return 1;
        p += n + (end != NULL);
    }
    return 0;
}

/* The stereonet: one net per set, its readings' small circles and its solved
 * poles with their cones. */
static corax_status write_net(const solve_opts *o, const solve_data *d)
{
    static const char *const labels[CORAX_SOLVE_MAX] = {"1", "2", "3", "4", "5", "6", "7", "8"};
    corax_net_set *sets = calloc(d->nsets + 1, sizeof *sets);
    corax_net_circle *circles = calloc(d->nrows + 1, sizeof *circles);
    corax_net_pick *picks = calloc(d->nsets * CORAX_SOLVE_MAX + 1, sizeof *picks);
    size_t nsets = 0, nc = 0, np = 0;
    corax_status rc = sets && circles && picks ? CORAX_OK : CORAX_EFORMAT;
    for (size_t k = 0; rc == CORAX_OK && k < d->nsets; k++) {
        const solve_set *s = &d->sets[k];
        if (!drawn(o, s->name))
            continue;
        corax_net_set *ns = &sets[nsets++];
        ns->name = s->name;
        ns->circles = circles + nc;
        ns->picks = picks + np;
        for (size_t i = 0; i < s->result.readings; i++)
            circles[nc++] = (corax_net_circle){s->cones[i].axis, 0.5 * CORAX_PI - s->cones[i].alpha};
        ns->ncircles = s->result.readings;
        for (size_t c = 0; c < s->result.ncandidates; c++)
            picks[np++] = (corax_net_pick){s->result.candidate[c].normal,
                                           s->result.candidate[c].cone95, labels[c]};
        ns->npicks = s->result.ncandidates;
        ns->skipped = s->left_out;
    }
    corax_net_style style = corax_net_style_default();
    style.contours = 0;
    style.title = o->p->title ? o->p->title : "Planes from alpha alone";
    corax_svg *svg = NULL;
    corax_status st = CORAX_OK;
    if (rc == CORAX_OK && nsets == 0) {
        job_error(o->job, NULL, 0, "--draw-sets names no set of the readings: no stereonet drawn");
        rc = CORAX_EFORMAT;
    }
    if (rc == CORAX_OK && (st = corax_stereonet_page(sets, nsets, &style, 1, &svg)) != CORAX_OK) {
        job_error(o->job, NULL, 0, "cannot draw the net: %s", corax_strerror(st));
        rc = CORAX_EFORMAT;
    }
    corax_error err;
    corax_error_clear(&err);
    if (rc == CORAX_OK &&
        (st = corax_svg_save(svg, o->job->outputs, o->p->svg, &err)) != CORAX_OK) {
        job_error_record(o->job, &err, st);
        rc = job_failed(st);
    }
    corax_svg_free(svg);
    free(sets);
    free(circles);
    free(picks);
    return rc;
}

static void record(corax_record *a, const solve_opts *o)
{
    corax_record_section(a, "solve");
    for (size_t i = 0; i < o->ninputs; i++)
        corax_record_set(a, "readings", "%s", o->inputs[i]);
    corax_record_set(a, "parallel_limit", "%g", corax_deg(o->p->solve.parallel_limit));
    corax_record_set(a, "ties", "planes whose sum of squared misfits exceeds the best's by "
                     "less than 5.99 alpha_error^2 (chi-square, two degrees of freedom, 95%%)");
    if (o->p->residuals)
        corax_record_set(a, "residuals", "%s", o->p->residuals);
    if (o->p->svg)
        corax_record_set(a, "svg", "%s", o->p->svg);
    if (o->p->draws)
        corax_record_uncertainty(a, &o->p->errors, o->p->draws, o->p->seed, 0);
}

static void summarise(const solve_data *d, corax_solve_job_summary *sum)
{
    sum->sets = d->nsets;
    for (size_t k = 0; k < d->nsets; k++)
        sum->count[d->sets[k].result.status]++;
    sum->readings = d->nrows;
    for (size_t i = 0; i < d->nrows; i++)
        sum->left_out += d->rows[i].why != NULL;
}

corax_solve_job_options corax_solve_job_options_default(void)
{
    corax_solve_job_options o;
    memset(&o, 0, sizeof o);
    o.solve = corax_solve_options_default();
    o.errors = corax_error_model_default();
    o.draws = 1000;
    o.seed = 1;
    o.readings = corax_table_settings_default();
    return o;
}

corax_status corax_solve_job_run(corax_job *job, const corax_program *prog,
                                 const corax_solve_job_options *options,
                                 const char *const *inputs, size_t ninputs, const char *output,
                                 corax_solve_job_summary *sum)
{
    solve_opts o = {job, options, inputs, ninputs, output};
    solve_data d;
    memset(&d, 0, sizeof d);
    memset(sum, 0, sizeof *sum);
    corax_status rc = load(&o, prog, &d);
    if (rc == CORAX_OK)
        rc = solve_sets(&o, &d);
    if (rc == CORAX_OK)
        rc = write_sets(&o, &d);
    if (rc == CORAX_OK && options->residuals)
        rc = write_residuals(&o, &d);
    if (rc == CORAX_OK && options->svg)
        rc = write_net(&o, &d);
    if (rc == CORAX_OK) {
        record(job->record, &o);
        summarise(&d, sum);
    }
    data_free(&d);
    return rc;
}
