/* job: the export job: the modelling CSV of structures, legacy VTK, and the
 * run that chooses between them, the GIS formats (export_gis.c) and the
 * interval tables and contacts (export_tables.c). */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/corax.h"
#include "export/export_int.h"
#include "job/export_int.h"

/* ---- CSV ---- */

typedef struct csv_run {
    corax_job *job;
    corax_writer *w;
    corax_carry *carry;
    int lines;       /* some table has lineations: lx, ly, lz */
    size_t written;
} csv_run;

static int csv_header(void *ctx, int table, const corax_row *header,
                      const corax_structure_columns *c, const corax_export_columns *x)
{
    csv_run *r = ctx;
    (void)table;
    long consumed[] = {c->x, c->y, c->z, c->dip, c->dip_direction, c->polarity};
    if (corax_carry_add(r->carry, header, consumed, 6) < 0) {
        job_error(r->job, NULL, 0, "out of memory");
        return -1;
    }
    r->lines |= corax_export_has_lines(x);
    return 0;
}

/* The header, once every table's is known. */
static int csv_begin(void *ctx)
{
    csv_run *r = ctx;
    for (int i = 0; i < CORAX_EXPORT_CSV_COLUMNS; i++)
        corax_writer_field(r->w, corax_export_csv_columns[i],
                           strlen(corax_export_csv_columns[i]));
    for (int i = 0; r->lines && i < 3; i++)
        corax_writer_field(r->w, corax_export_line_columns[i], 2);
    corax_carry_header(r->carry, r->w);
    corax_writer_end_row(r->w);
    return 0;
}

static int csv_row(void *ctx, int table, const corax_row *row, const corax_structure *s,
                   const corax_export_extra *x)
{
    csv_run *r = ctx;
    corax_export_csv_fields(r->w, s);
    if (r->lines)
        corax_export_csv_line(r->w, x);
    corax_carry_row(r->carry, table, row, r->w);
    corax_writer_end_row(r->w);
    r->written++;
    return 0;
}

static int export_csv(const export_opts *o, corax_writer *w, size_t *written, size_t *left_out)
{
    static const char *const drop[] = {"x", "y", "z", "dip", "dip_direction", "nx", "ny", "nz",
                                       "polarity", "lx", "ly", "lz"};
    csv_run r = {o->job, w, corax_carry_new(drop, 12), 0, 0};
    if (!r.carry) {
        job_error(o->job, NULL, 0, "out of memory");
        return JOB_FAILED;
    }
    export_visit v = {csv_header, csv_begin, csv_row, 0};
    int rc = export_each_structure(o, &v, &r);
    *written = r.written;
    *left_out = v.left_out;
    corax_carry_free(r.carry);
    return rc;
}

/* ---- VTK ---- */

/* The structures for VTK, kept in a spool: the file gives each block's
 * size before its values, so they are gone over once per block. */
typedef struct located {
    corax_job *job;
    corax_spool *spool;
    const corax_program *prog;
    corax_kinds *kinds;
    size_t no_plane; /* lines without a plane: VTK draws planes */
} located;

static int vtk_row(void *ctx, int table, const corax_row *row, const corax_structure *s,
                   const corax_export_extra *x)
{
    located *v = ctx;
    (void)table;
    (void)row;
    if (!s->oriented) {
        v->no_plane++;
        return 0;
    }
    corax_export_structure e = {
        s->position, s->plane, s->depth, corax_kinds_code(v->kinds, s->kind, s->kind_len),
        s->polarity, v->prog ? corax_program_index(v->prog, s->hole, s->hole_len) : -1, 1,
        x->has_line, {(float)x->line.x, (float)x->line.y, (float)x->line.z}, {0}};
    for (int i = 0; i < CORAX_EXPORT_SPREAD; i++)
        e.spread[i] = (float)x->spread[i];
    if (e.kind < 0) {
        job_error(v->job, NULL, 0, "out of memory");
        return -1;
    }
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_spool_add(v->spool, &e, &err);
    if (st != CORAX_OK) {
        job_error_record(v->job, &err, st);
        return -1;
    }
    return 0;
}

/* ---- the run ---- */

static void about_export(corax_record *a, const export_opts *o, const corax_program *prog,
                         const corax_kinds *kinds)
{
    for (int i = 0; i < o->ninputs; i++)
        corax_record_set(a, "converted", "%s", o->inputs[i]);
    corax_record_set(a, "polarity", "1 upright, -1 overturned, from a polarity or younging column "
                     "(1, +1, upright, -1, overturned); empty when not known");
    if (o->p->format == CORAX_EXPORT_JOB_CSV) {
        corax_record_set(a, "normal", "nx, ny, nz: the upward unit normal (x east, y north, z up)");
        corax_record_set(a, "line", "lx, ly, lz: the lineation's unit vector, down-plunge");
        return;
    }
    const corax_export_options *v = &o->p->vtk;
    corax_record_set(a, "encoding", "%s",
                     v->encoding == CORAX_VTK_BINARY  ? "binary (big-endian)"
                     : v->encoding == CORAX_VTK_ASCII ? "ascii"
                                                      : "ascii up to 100000 structures, binary "
                                                        "(big-endian) above");
    corax_record_set(a, "shape", "%s", v->shape == CORAX_EXPORT_DISCS ? "discs" : "points");
    if (v->shape == CORAX_EXPORT_DISCS)
        corax_record_set(a, "disc_radius", "%g (%d corners)", v->disc_radius, v->disc_sides);
    corax_record_set(a, "traces", "%s", v->traces ? "yes" : "no");
    corax_record_set(a, "trace_step", "%g (plus every station)", v->step);
    if (v->arrow > 0.0)
        corax_record_set(a, "arrows", "%g m from each structure along its lineation, down-plunge",
                         v->arrow);
    corax_record_set(a, "not_a_value", "-1 (legacy VTK cannot write NaN): dip and dip_direction of "
                     "hole traces, depth when not known, kind of hole traces");
    corax_record_section(a, "kinds");
    for (size_t i = 0; i < corax_kinds_count(kinds); i++) {
        const char *name;
        int code = corax_kinds_at(kinds, i, &name);
        char key[16];
        snprintf(key, sizeof key, "%d", code);
        corax_record_set(a, key, "%s", name);
    }
    if (!prog)
        return;
    corax_record_section(a, "holes");
    for (size_t i = 0; i < corax_program_size(prog); i++) {
        char key[24];
        snprintf(key, sizeof key, "%zu", i + 1);
        corax_record_set(a, key, "%s", corax_hole_name(corax_program_hole(prog, i)));
    }
}

static int export_vtk(const export_opts *o, const corax_program *prog, corax_kinds *kinds,
                      size_t *written, size_t *left_out)
{
    corax_spool *spool = corax_spool_new(sizeof(corax_export_structure), o->output,
                                         "the structures of the VTK file");
    located v = {o->job, spool, prog, kinds, 0};
    if (!v.spool) {
        job_error(o->job, NULL, 0, "out of memory");
        return JOB_FAILED;
    }
    export_visit visit = {NULL, NULL, vtk_row, 0};
    int rc = export_each_structure(o, &visit, &v);
    *left_out = visit.left_out + v.no_plane;
    if (rc == JOB_OK) {
        char title[200];
        snprintf(title, sizeof title, "corax %s export: hole traces and structures; metres, x "
                 "east, y north, z up", CORAX_VERSION);
        corax_export_options opt = o->p->vtk;
        opt.title = title;
        corax_export_counts counts;
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_export_vtk_spooled(o->job->outputs, o->output, prog, v.spool,
                                                   &opt, &counts, &err);
        if (st != CORAX_OK) {
            job_error_record(o->job, &err, st);
            rc = JOB_FAILED;
        } else {
            *written = counts.structures;
            if (o->p->vtk.traces && counts.traces == 0)
                job_note(o->job, "no hole has a path to trace");
        }
    }
    corax_spool_free(v.spool);
    return rc;
}

/* A CSV: structures, intervals or contacts. */
static int export_csv_table(const export_opts *o, const corax_program *prog, corax_record *a,
                            size_t *written, size_t *left_out)
{
    corax_writer *w = job_output(o->job, o->output, NULL);
    if (!w)
        return JOB_FAILED;
    export_sink sink = {w, NULL, NULL, 0};
    int rc = o->p->nintervals ? export_intervals(o, prog, &o->p->intervals[0], &sink)
             : o->p->contacts ? export_contacts(o, prog, &sink, a)
                           : export_csv(o, w, written, left_out);
    if (o->p->nintervals || o->p->contacts) {
        corax_record_section(a, "results");
        corax_record_set(a, o->p->nintervals ? "intervals" : "contacts", "%zu", sink.written);
    }
    if (rc != JOB_OK) {
        corax_writer_discard(w);
        return rc;
    }
    return job_commit(o->job, w) == CORAX_OK ? JOB_OK : JOB_FAILED;
}

static int run(const export_opts *o, const corax_program *prog, corax_record *a,
               corax_export_job_summary *sum)
{
    size_t written = 0, left_out = 0;
    int rc;
    corax_kinds *kinds = corax_kinds_new();
    if (!kinds) {
        job_error(o->job, NULL, 0, "out of memory");
        return JOB_FAILED;
    }
    int structures =
        o->p->format != CORAX_EXPORT_JOB_GIS && !o->p->nintervals && !o->p->contacts;
    int vtk_intervals = o->p->format == CORAX_EXPORT_JOB_VTK && o->p->nintervals;
    corax_record_section(a, "export");
    corax_record_set(a, "format", "%s", o->p->format_name);
    corax_record_set(a, "crs", "%s", o->p->crs ? o->p->crs : "none given");
    if (o->p->format == CORAX_EXPORT_JOB_GIS)
        rc = export_gis(o, prog, a);
    else if (o->p->format == CORAX_EXPORT_JOB_CSV)
        rc = export_csv_table(o, prog, a, &written, &left_out);
    else if (vtk_intervals)
        rc = export_intervals_vtk(o, prog, a);
    else
        rc = export_vtk(o, prog, kinds, &written, &left_out);
    if (rc == JOB_OK && structures) {
        if (left_out)
            job_note(o->job, "%zu row%s without a position or orientation left out", left_out,
                     left_out == 1 ? "" : "s");
        if (o->ninputs && written == 0)
            job_note(o->job, "no located, oriented structures to export");
        about_export(a, o, prog, kinds);
        corax_record_section(a, "results");
        corax_record_set(a, "structures", "%zu", written);
        corax_record_set(a, "left_out", "%zu (no position or no orientation)", left_out);
    }
    sum->structures = written;
    sum->left_out = left_out;
    corax_kinds_free(kinds);
    return rc;
}

corax_export_job_options corax_export_job_options_default(void)
{
    corax_export_job_options o;
    memset(&o, 0, sizeof o);
    o.format = CORAX_EXPORT_JOB_CSV;
    o.format_name = "csv";
    o.vtk = corax_export_options_default();
    o.contact_window = 2.0;
    o.collar_dip = CORAX_DIP_NEGATIVE_DOWN;
    o.converted = o.depths = corax_table_settings_default();
    o.converted.format.decimal = CORAX_DECIMAL_EITHER;
    return o;
}

corax_status corax_export_job_run(corax_job *job, const corax_program *prog,
                                  const corax_export_job_options *options,
                                  const char *const *inputs, size_t ninputs, const char *output,
                                  corax_export_job_summary *sum)
{
    export_opts o = {job, options, inputs, (int)ninputs, output};
    memset(sum, 0, sizeof *sum);
    corax_record *a = job->record ? corax_record_new() : NULL; /* kept when the job is done */
    int rc = run(&o, prog, a, sum);
    if (rc == JOB_OK)
        corax_record_append(job->record, a);
    corax_record_free(a);
    return job_status(rc);
}
