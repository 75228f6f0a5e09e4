/* job: the trace job, the desurveyed holes: positions and directions at the
 * depths asked for, or down every hole at a step. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/job_trace.h"
#include "io/fields.h"
#include "job/job_int.h"

/* One trace: its job and options. */
typedef struct trace_run {
    corax_job *job;
    const corax_trace_job_options *p;
    char decimal; /* the table of depths' decimal mark, as read */
    double unit;  /* metres per unit of its depths */
} trace_run;

static void write_point(corax_writer *w, const corax_hole_point *pt,
                        corax_dip_convention conv)
{
    double az, plunge;
    corax_direction_angles(pt->tangent, &az, &plunge);
    corax_writer_number(w, pt->position.x, 3);
    corax_writer_number(w, pt->position.y, 3);
    corax_writer_number(w, pt->position.z, 3);
    corax_writer_azimuth(w, corax_deg(az), 3);
    corax_writer_number(w, corax_plunge_to_dip(plunge, conv), 3);
}

static void write_blank_point(corax_writer *w)
{
    for (int i = 0; i < 5; i++)
        corax_writer_field(w, "", 0);
}

static void write_text(corax_writer *w, const char *s) { corax_writer_field(w, s, strlen(s)); }

/* One --at row: its own fields, then the answer. */
static void trace_row(const trace_run *o, const corax_program *prog, const corax_row *row,
                      const long *col, size_t width, corax_writer *w)
{
    char note[240] = "";
    for (size_t i = 0; i < width; i++)
        corax_writer_field(w, i < row->count ? row->field[i] : "", i < row->count ? row->length[i] : 0);
    if (row->count > width) { /* keep the surplus fields: nothing is lost */
        size_t used = (size_t)snprintf(note, sizeof note, "extra fields: ");
        for (size_t i = width; i < row->count && used < sizeof note; i++)
            used += (size_t)snprintf(note + used, sizeof note - used, "%s%s",
                                     i > width ? "," : "", row->field[i]);
    }
    size_t hl;
    const char *hole_name = corax_field_text(row, col[0], &hl);
    const corax_hole *hole = corax_program_find(prog, hole_name, hl);
    double depth;
    char why[200];
    corax_number_status ds = corax_field_number(row, col[1], o->decimal, "depth", &depth, why,
                                                sizeof why);
    depth *= o->unit;
    const char *status;
    corax_hole_point pt;
    if (!hole) {
        status = "unknown-hole";
        write_blank_point(w);
    } else if (ds != CORAX_NUMBER_OK || depth < 0.0) {
        status = "bad-depth";
        if (ds == CORAX_NUMBER_OK)
            snprintf(why, sizeof why, "depth %g is negative", depth);
        snprintf(note + strlen(note), sizeof note - strlen(note), "%s%s", note[0] ? "; " : "", why);
        write_blank_point(w);
    } else if (corax_hole_at(hole, depth, NULL, &pt) == CORAX_ENOTFOUND) {
        status = "no-survey";
        write_blank_point(w);
    } else {
        status = corax_where_name(pt.where);
        write_point(w, &pt, o->p->dip);
    }
    write_text(w, status);
    write_text(w, note);
    corax_writer_end_row(w);
}

static corax_status trace_at(trace_run *o, const corax_program *prog, corax_writer *w)
{
    static const char *const names[] = {"hole", "depth"};
    static const char *const out[] = {"x", "y", "z", "azimuth", "dip", "status", "note"};
    const corax_table_settings ts = o->p->depths;
    long col[2];
    size_t width;
    corax_row row;
    corax_reader *r;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_reader_open(o->p->at, ts.format, &r, &err);
    if (st == CORAX_OK)
        st = corax_table_header(r, names, 2, 2, ts.columns, col, &width, &row, &err);
    if (st == CORAX_OK) {
        corax_table_info info;
        corax_reader_info(r, &info);
        o->decimal = info.format.decimal;
        o->unit = ts.unit;
        for (size_t i = 0; i < row.count; i++) {
            char name[512];
            size_t len = corax_carried_name(row.field[i], out, 7, name, sizeof name);
            corax_writer_field(w, name, len);
        }
        for (size_t i = 0; i < 7; i++)
            write_text(w, out[i]);
        corax_writer_end_row(w);
        while ((st = corax_reader_next(r, &row, &err)) == CORAX_OK)
            trace_row(o, prog, &row, col, width, w);
    }
    if (r) {
        corax_table_info info;
        corax_reader_info(r, &info);
        job_table_read(o->job, CORAX_ROLE_DEPTHS, o->p->at, ts.unit, &info);
    }
    corax_reader_close(r);
    if (st != CORAX_END) {
        job_error_record(o->job, &err, st);
        return job_failed(st);
    }
    return CORAX_OK;
}

/* The words for corax_depth_kind, in its order. */
static const char *const point_name[] = {"step", "collar", "end", "station"};

/* Points down one hole: collar, steps, stations and end, in depth order. */
static int trace_hole(const trace_run *o, const corax_hole *h, corax_writer *w)
{
    corax_hole_depth *p;
    size_t n;
    corax_status st = corax_hole_depths(h, o->p->step, &p, &n);
    if (st == CORAX_EARG) {
        job_error(o->job, NULL, 0, "hole %s is %.10g m long: a point every %g m makes more "
                  "than %d points; take a longer step", corax_hole_name(h),
                  corax_hole_length(h), o->p->step, CORAX_MAX_HOLE_POINTS);
        return -1;
    }
    if (st != CORAX_OK) {
        job_error(o->job, NULL, 0, "out of memory");
        return -1;
    }
    const char *name = corax_hole_name(h);
    size_t hint = 0;
    for (size_t k = 0; k < n; k++) {
        double dls = NAN;
        if (p[k].kind == CORAX_DEPTH_STATION)
            corax_hole_station(h, p[k].station, NULL, NULL, &dls);
        corax_hole_point pt;
        corax_writer_field(w, name, strlen(name));
        corax_writer_number(w, p[k].depth, 3);
        const char *status;
        if (corax_hole_at(h, p[k].depth, &hint, &pt) == CORAX_ENOTFOUND) {
            if (p[k].depth == 0.0) { /* the collar is all we know */
                corax_writer_number(w, pt.position.x, 3);
                corax_writer_number(w, pt.position.y, 3);
                corax_writer_number(w, pt.position.z, 3);
                corax_writer_field(w, "", 0);
                corax_writer_field(w, "", 0);
            } else {
                write_blank_point(w);
            }
            status = "no-survey";
        } else {
            write_point(w, &pt, o->p->dip);
            status = corax_where_name(pt.where);
        }
        corax_writer_number(w, corax_deg(dls), 3);
        write_text(w, point_name[p[k].kind]);
        write_text(w, status);
        corax_writer_end_row(w);
    }
    free(p);
    return 0;
}

static corax_status trace_all(trace_run *o, const corax_program *prog, corax_writer *w)
{
    static const char *const header[] = {"hole",    "depth",           "x",     "y",
                                         "z",       "azimuth",         "dip",   "dogleg_severity",
                                         "point",   "status"};
    for (size_t i = 0; i < sizeof header / sizeof *header; i++)
        write_text(w, header[i]);
    corax_writer_end_row(w);
    for (size_t i = 0; i < corax_program_size(prog); i++)
        if (trace_hole(o, corax_program_hole(prog, i), w) != 0)
            return CORAX_EVALUE;
    return CORAX_OK;
}

/* A decimal year as its date, or an empty field. */
static void write_date(corax_writer *w, double year)
{
    char text[16] = "";
    if (!isnan(year))
        corax_date_text(year, text, sizeof text);
    write_text(w, text);
}

/* One row per station of every hole, in depth order: what its azimuth got. */
static void write_corrections(const trace_run *o, const corax_program *prog, corax_writer *w)
{
    static const char header[] =
        "hole,depth,date,reference,surveyed_azimuth,declination,convergence,rotation,"
        "correction,azimuth,latitude,longitude,model,model_total_field,model_field_dip,"
        "total_field,field_dip\n";
    corax_writer_text(w, header, sizeof header - 1);
    for (size_t i = 0; i < corax_program_size(prog); i++) {
        const corax_hole *h = corax_program_hole(prog, i);
        const char *name = corax_hole_name(h);
        for (size_t k = 0; k < corax_hole_station_count(h); k++) {
            corax_station st;
            corax_hole_station(h, k, &st, NULL, NULL);
            const corax_station_record *r = corax_corrections_find(o->p->record, name, st.line);
            if (!r)
                continue; /* every loaded station has its record */
            const corax_correction *c = &r->correction;
            write_text(w, name);
            corax_writer_number(w, st.depth, 3);
            write_date(w, c->date);
            write_text(w, corax_north_name(c->north));
            corax_writer_azimuth(w, corax_deg(r->azimuth), 3);
            corax_writer_number(w, corax_deg(c->declination), 3);
            corax_writer_number(w, corax_deg(c->convergence), 3);
            corax_writer_number(w, corax_deg(c->rotation), 3);
            corax_writer_number(w, corax_deg(c->total), 3);
            corax_writer_azimuth(w, corax_deg(st.azimuth), 3);
            corax_writer_number(w, corax_deg(r->site.latitude), 6);
            corax_writer_number(w, corax_deg(r->site.longitude), 6);
            write_text(w, c->field.model ? c->field.model : "");
            corax_writer_number(w, c->field.total, 1);
            corax_writer_number(w, corax_deg(c->field.inclination), 2);
            corax_writer_number(w, r->total_field, 1);
            corax_writer_number(w, corax_deg(r->field_dip), 2);
            corax_writer_end_row(w);
        }
    }
}

/* The companion table, whole or not at all. */
static corax_status trace_corrections(const trace_run *o, const corax_program *prog)
{
    corax_writer *w;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_writer_open(o->p->corrections, &w, &err);
    if (st == CORAX_OK) {
        write_corrections(o, prog, w);
        st = corax_writer_commit(w, &err);
    }
    if (st != CORAX_OK) {
        job_error_record(o->job, &err, st);
        return job_failed(st);
    }
    return CORAX_OK;
}

corax_trace_job_options corax_trace_job_options_default(void)
{
    corax_trace_job_options o;
    memset(&o, 0, sizeof o);
    o.depths = corax_table_settings_default();
    o.dip = CORAX_DIP_NEGATIVE_DOWN;
    o.output = (corax_table_format){',', '.'};
    return o;
}

corax_status corax_trace_job_run(corax_job *job, const corax_program *prog,
                                 const corax_trace_job_options *p, const char *output)
{
    static const corax_corrections none = {0};
    corax_trace_job_options own = *p;
    if (!own.record)
        own.record = &none;
    trace_run o = {job, &own, 0, 1.0};
    corax_status st;
    corax_writer *w = job_output(job, output, &st);
    if (!w)
        return st;
    corax_writer_format(w, p->output);
    corax_status rc = p->at ? trace_at(&o, prog, w) : trace_all(&o, prog, w);
    if (rc == CORAX_OK && p->corrections)
        rc = trace_corrections(&o, prog);
    if (rc != CORAX_OK) {
        corax_writer_discard(w);
        return rc;
    }
    if ((st = job_commit(job, w)) != CORAX_OK)
        return st;
    corax_record *a = job->record;
    corax_record_section(a, "trace");
    if (p->at)
        corax_record_set(a, "at", "%s", p->at);
    else
        corax_record_set(a, "step", "%g", p->step);
    corax_record_set(a, "dip", "%s, as the surveys give it", corax_dip_convention_name(p->dip));
    if (p->corrections)
        corax_record_set(a, "corrections", "%s", p->corrections);
    return CORAX_OK;
}
