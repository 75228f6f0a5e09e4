/* job: the export to GIS, CAD and modelling formats through GDAL/OGR:
 * one file of layers (structures, traces, collars, findings, intervals,
 * contacts; in CAD also discs and lineations), written whole or not at all. */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "job/export_int.h"

/* ---- which layers ---- */

enum { MAX_LAYERS = 8 + CORAX_EXPORT_TABLES };

typedef struct plan {
    const char *name[MAX_LAYERS];
    int n;
} plan;

static void plan_add(plan *p, const export_opts *o, const char *name, int available)
{
    if (available && export_wants(o, name) && p->n < MAX_LAYERS)
        p->name[p->n++] = name;
}

static int planned(const plan *p, const char *name)
{
    for (int i = 0; i < p->n; i++)
        if (strcmp(p->name[i], name) == 0)
            return 1;
    return 0;
}

/* Every layer this export can write, in order; 0, or JOB_USAGE (the
 * message given) for a layer name given twice or layers naming none of
 * them. */
static int make_plan(const export_opts *o, const corax_program *prog, int cad, plan *p)
{
    const char *all[MAX_LAYERS];
    int nall = 0, structures = o->ninputs > 0, holes = prog != NULL;
    p->n = 0;
#define OFFER(name, available)                  \
    do {                                        \
        if (available)                          \
            all[nall++] = name;                 \
        plan_add(p, o, name, available);        \
    } while (0)
    OFFER(LAYER_STRUCTURES, structures);
    OFFER(LAYER_DISCS, structures && cad);
    OFFER(LAYER_LINEATIONS, structures && cad);
    OFFER(LAYER_TRACES, holes && o->p->vtk.traces);
    OFFER(LAYER_COLLARS, holes);
    OFFER(LAYER_FINDINGS, o->p->findings != NULL);
    for (int i = 0; i < o->p->nintervals; i++)
        OFFER(o->p->intervals[i].layer, 1);
    OFFER(LAYER_CONTACTS, o->p->contacts != NULL);
#undef OFFER
    for (int i = 0; i < nall; i++)
        for (int j = 0; j < i; j++)
            if (strcasecmp(all[i], all[j]) == 0) {
                job_usage(o->job, "two layers named '%s': name the interval table's layer "
                          "otherwise with --intervals LAYER=FILE", all[i]);
                return JOB_USAGE;
            }
    if (p->n == 0) {
        char list[600] = "";
        size_t used = 0;
        for (int i = 0; i < nall && used < sizeof list; i++)
            used += (size_t)snprintf(list + used, sizeof list - used, "%s%s", i ? ", " : "",
                                     all[i]);
        job_usage(o->job, "--layers names none of this export's layers (%s)",
                  nall ? list : "none");
        return JOB_USAGE;
    }
    return 0;
}

/* ---- structures ---- */

typedef struct gis_structures {
    const export_opts *o;
    corax_gis *g;
    corax_carry *carry;
    int spread;                  /* every table has the Monte Carlo columns */
    int layer, discs, lineations; /* layer numbers; -1 when not written */
    size_t nfields;              /* corax's own fields, before the carried ones */
    size_t written;
    corax_vec3 ring[361];
    corax_error err;
    corax_status st;
} gis_structures;

static int gis_header(void *ctx, int table, const corax_row *header,
                      const corax_structure_columns *c, const corax_export_columns *x)
{
    gis_structures *r = ctx;
    long consumed[] = {c->x,     c->y,     c->z,        c->dip,      c->dip_direction,
                       c->hole,  c->depth, c->kind,     c->polarity, c->nx,
                       c->ny,    c->nz,    x->trend,    x->plunge,   x->status,
                       x->spread[0], x->spread[1], x->spread[2], x->spread[3], x->spread[4]};
    if (corax_carry_add(r->carry, header, consumed, sizeof consumed / sizeof consumed[0]) < 0) {
        job_error(r->o->job, NULL, 0, "out of memory");
        return -1;
    }
    r->spread = (table == 0 || r->spread) && corax_export_has_spread(x);
    return 0;
}

static int failed(gis_structures *r)
{
    if (r->st == CORAX_OK)
        return 0;
    job_error_record(r->o->job, &r->err, r->st);
    return -1;
}

static int gis_begin(void *ctx)
{
    gis_structures *r = ctx;
    size_t ncarry = corax_carry_count(r->carry);
    corax_gis_field *f = malloc((CORAX_EXPORT_GIS_STRUCTURE_FIELDS + ncarry) * sizeof *f);
    if (!f) {
        job_error(r->o->job, NULL, 0, "out of memory");
        return -1;
    }
    r->nfields = corax_export_gis_structure_fields(r->spread, f);
    for (size_t i = 0; i < ncarry; i++)
        f[r->nfields + i] = (corax_gis_field){corax_carry_name(r->carry, i), CORAX_GIS_TEXT};
    r->st = corax_gis_layer(r->g, LAYER_STRUCTURES, CORAX_GIS_POINTS, 0, f, r->nfields + ncarry,
                            &r->layer, &r->err);
    free(f);
    if (r->st == CORAX_OK && export_wants(r->o, LAYER_DISCS) && corax_gis_cad(r->g))
        r->st = corax_gis_layer(r->g, LAYER_DISCS, CORAX_GIS_LINES, 0, NULL, 0, &r->discs,
                                &r->err);
    if (r->st == CORAX_OK && export_wants(r->o, LAYER_LINEATIONS) && corax_gis_cad(r->g))
        r->st = corax_gis_layer(r->g, LAYER_LINEATIONS, CORAX_GIS_LINES, 0, NULL, 0,
                                &r->lineations, &r->err);
    return failed(r);
}

/* The CAD drawing of a structure: its disc and its lineation. */
static void draw_cad(gis_structures *r, const corax_structure *s, const corax_export_extra *x)
{
    const corax_export_options *v = &r->o->p->vtk;
    if (r->st == CORAX_OK && r->discs >= 0 && s->oriented &&
        (r->st = corax_gis_feature(r->g, r->discs)) == CORAX_OK) {
        corax_export_disc(s->plane, s->position, v->disc_radius, v->disc_sides, r->ring);
        r->ring[v->disc_sides] = r->ring[0];
        corax_gis_line(r->g, r->ring, NULL, (size_t)v->disc_sides + 1);
        r->st = corax_gis_write(r->g, &r->err);
    }
    if (r->st == CORAX_OK && r->lineations >= 0 && x->has_line &&
        (r->st = corax_gis_feature(r->g, r->lineations)) == CORAX_OK) {
        double len = r->o->p->arrows_given ? v->arrow : v->disc_radius;
        corax_vec3 p[2] = {s->position,
                           {s->position.x + len * x->line.x, s->position.y + len * x->line.y,
                            s->position.z + len * x->line.z}};
        corax_gis_line(r->g, p, NULL, 2);
        r->st = corax_gis_write(r->g, &r->err);
    }
}

static int gis_row(void *ctx, int table, const corax_row *row, const corax_structure *s,
                   const corax_export_extra *x)
{
    gis_structures *r = ctx;
    if ((r->st = corax_gis_feature(r->g, r->layer)) != CORAX_OK)
        return failed(r);
    corax_export_gis_structure(r->g, s, x, r->spread);
    for (size_t i = 0; i < corax_carry_count(r->carry); i++) {
        size_t n;
        const char *v = corax_carry_value(r->carry, table, row, i, &n);
        if (n)
            corax_gis_text(r->g, r->nfields + i, v, n);
    }
    if ((r->st = corax_gis_write(r->g, &r->err)) == CORAX_OK)
        r->written++;
    draw_cad(r, s, x);
    return failed(r);
}

static int gis_structures_layer(const export_opts *o, corax_gis *g, corax_record *a)
{
    static const char *const drop[] = {"strike", "lx", "ly", "lz"};
    gis_structures r;
    memset(&r, 0, sizeof r);
    r.o = o;
    r.g = g;
    r.layer = r.discs = r.lineations = -1;
    corax_error_clear(&r.err);
    if (!(r.carry = corax_carry_new(drop, 4))) {
        job_error(o->job, NULL, 0, "out of memory");
        return JOB_FAILED;
    }
    export_visit v = {gis_header, gis_begin, gis_row, 0};
    int rc = export_each_structure(o, &v, &r);
    corax_carry_free(r.carry);
    if (v.left_out)
        job_note(o->job, "%zu row%s without a position or orientation left out", v.left_out,
                 v.left_out == 1 ? "" : "s");
    corax_record_set(a, LAYER_STRUCTURES, "%zu (%zu rows without a position or orientation left "
                     "out)", r.written, v.left_out);
    return rc;
}

/* ---- the run ---- */

static int layer_status(corax_job *job, corax_status st, const corax_error *err)
{
    if (st == CORAX_OK)
        return JOB_OK;
    job_error_record(job, err, st);
    return JOB_FAILED;
}

static int program_layers(const export_opts *o, const corax_program *prog, corax_gis *g,
                          const plan *p, corax_record *a)
{
    corax_error err;
    corax_error_clear(&err);
    size_t n;
    corax_status st = CORAX_OK;
    if (planned(p, LAYER_TRACES)) {
        st = corax_export_gis_traces(g, prog, o->p->vtk.step, LAYER_TRACES, &n, &err);
        corax_record_set(a, LAYER_TRACES, "%zu (every %g m plus stations; depth %s)", n,
                         o->p->vtk.step, corax_gis_measured(g) ? "as the measure (M) of each vertex"
                                                         : "from and to as fields");
    }
    if (st == CORAX_OK && planned(p, LAYER_COLLARS)) {
        st = corax_export_gis_collars(g, prog, o->p->collar_dip, LAYER_COLLARS, &n,
                                      &err);
        corax_record_set(a, LAYER_COLLARS, "%zu", n);
    }
    return layer_status(o->job, st, &err);
}

static int table_layers(const export_opts *o, const corax_program *prog, corax_gis *g,
                        const plan *p, corax_record *a)
{
    int rc = JOB_OK;
    if (planned(p, LAYER_FINDINGS)) {
        export_sink sink = {NULL, g, LAYER_FINDINGS, 0};
        rc = export_findings(o, prog, &sink);
        corax_record_set(a, LAYER_FINDINGS, "%zu (from %s)", sink.written, o->p->findings);
    }
    for (int i = 0; rc == JOB_OK && i < o->p->nintervals; i++) {
        if (!planned(p, o->p->intervals[i].layer))
            continue;
        export_sink sink = {NULL, g, o->p->intervals[i].layer, 0};
        rc = export_intervals(o, prog, &o->p->intervals[i], &sink);
        corax_record_set(a, o->p->intervals[i].layer, "%zu intervals (from %s)", sink.written,
                         o->p->intervals[i].path);
    }
    if (rc == JOB_OK && planned(p, LAYER_CONTACTS)) {
        export_sink sink = {NULL, g, LAYER_CONTACTS, 0};
        rc = export_contacts(o, prog, &sink, a);
        corax_record_set(a, LAYER_CONTACTS, "%zu (from %s)", sink.written, o->p->contacts);
    }
    return rc;
}

int export_gis(const export_opts *o, const corax_program *prog, corax_record *a)
{
    corax_gis *g;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_gis_open(o->job->outputs, o->output, o->p->format_name,
                                      o->p->crs, &g, &err);
    if (st != CORAX_OK) {
        job_error_record(o->job, &err, st);
        return st == CORAX_EIO ? JOB_FAILED : JOB_USAGE;
    }
    plan p;
    int rc = make_plan(o, prog, corax_gis_cad(g), &p);
    corax_record_set(a, "driver", "%s (GDAL %s)", corax_gis_driver_name(g),
                     corax_gis_gdal_version());
    corax_record_section(a, "layers");
    if (rc == JOB_OK && planned(&p, LAYER_STRUCTURES))
        rc = gis_structures_layer(o, g, a);
    if (rc == JOB_OK)
        rc = program_layers(o, prog, g, &p, a);
    if (rc == JOB_OK)
        rc = table_layers(o, prog, g, &p, a);
    if (rc != JOB_OK) {
        corax_gis_discard(g);
        return rc;
    }
    return layer_status(o->job, corax_gis_commit(g, &err), &err);
}
