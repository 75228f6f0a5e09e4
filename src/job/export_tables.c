/* job: tables placed down holes for the export: from/to interval tables
 * desurveyed (CSV, or a GIS layer of lines), corax check's findings (a GIS
 * layer of points) and contacts between units (CSV or a GIS layer). Each
 * table is read twice, streaming: once to learn its columns' types and
 * check its intervals, once to write. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "corax/corax.h"
#include "io/fields.h"
#include "job/export_int.h"

enum { MAX_SHOWN = 50 };
#define NONE ((double)NAN) /* a value not known */

/* ---- a table read through once ---- */

enum { T_HOLE, T_FROM, T_TO, T_DEPTH, T_UNIT, NT };

typedef struct scan {
    const char *path;
    long col[NT];             /* -1 when absent */
    size_t width;
    char **name;              /* the header's names */
    unsigned char *numeric;   /* per column: every value given is a number */
    unsigned char *kept;      /* per column: carried to the output */
    corax_interval *iv;       /* interval tables: every interval read */
    size_t n, cap;
    char decimal;             /* the table's decimal mark, as read */
    double unit;              /* metres per unit of its depths */
} scan;

static void scan_free(scan *s)
{
    for (size_t i = 0; s->name && i < s->width; i++)
        free(s->name[i]);
    free(s->name);
    free(s->numeric);
    free(s->kept);
    free(s->iv);
}

/* Open a table and find its columns: names[0..nrequired) must be there. */
static int open_table(const export_opts *o, const char *path, const char *const *names,
                      size_t nrequired, corax_reader **r, scan *s, corax_row *header)
{
    corax_error err;
    corax_error_clear(&err);
    long col[NT];
    corax_table_settings ts = o->p->depths;
    corax_status st = corax_reader_open(path, ts.format, r, &err);
    if (st == CORAX_OK)
        st = corax_table_header(*r, names, NT, nrequired, ts.columns, col, &s->width, header,
                                &err);
    if (st == CORAX_OK) {
        corax_table_info info;
        corax_reader_info(*r, &info);
        s->decimal = info.format.decimal;
        s->unit = ts.unit;
    }
    if (st != CORAX_OK) {
        job_error_record(o->job, &err, st);
        corax_reader_close(*r);
        *r = NULL;
        return JOB_FAILED;
    }
    memcpy(s->col, col, sizeof col);
    return JOB_OK;
}

static int is_ours(const char *name, const char *const *ours, size_t nours)
{
    for (size_t i = 0; i < nours; i++)
        if (strcasecmp(name, ours[i]) == 0)
            return 1;
    return 0;
}

static int remember_header(scan *s, const corax_row *h, const char *const *ours, size_t nours)
{
    s->name = calloc(s->width ? s->width : 1, sizeof *s->name);
    s->numeric = malloc(s->width ? s->width : 1);
    s->kept = malloc(s->width ? s->width : 1);
    if (!s->name || !s->numeric || !s->kept)
        return -1;
    for (size_t i = 0; i < s->width; i++) {
        if (!(s->name[i] = strdup(h->field[i])))
            return -1;
        s->numeric[i] = 1;
        /* corax's own columns replace input columns of the same name */
        s->kept[i] = !is_ours(h->field[i], ours, nours);
    }
    return 0;
}

static double number_or_nan(const scan *s, const corax_row *row, long col,
                            corax_number_status *st)
{
    double v = NONE;
    size_t n;
    const char *t = corax_field_text(row, col, &n);
    *st = col < 0 ? CORAX_NUMBER_EMPTY : corax_parse_number(t, n, s->decimal, &v);
    return *st == CORAX_NUMBER_OK ? v : NONE;
}

/* A depth in metres (the table's unit applied). */
static double depth_or_nan(const scan *s, const corax_row *row, long col,
                           corax_number_status *st)
{
    return number_or_nan(s, row, col, st) * s->unit;
}

static const char *hole_label(long hole, void *ctx)
{
    const corax_program *prog = ctx;
    return hole >= 0 && prog ? corax_hole_name(corax_program_hole(prog, (size_t)hole)) : NULL;
}

/* The first pass: column types and, for interval tables, the check. */
static int scan_table(const export_opts *o, const corax_program *prog, const char *path,
                      const char *const *names, size_t nrequired, const char *const *ours,
                      size_t nours, scan *s)
{
    corax_reader *r;
    corax_row row;
    memset(s, 0, sizeof *s);
    s->path = path;
    int rc = open_table(o, path, names, nrequired, &r, s, &row);
    if (rc != JOB_OK)
        return rc;
    if (remember_header(s, &row, ours, nours) != 0) {
        corax_reader_close(r);
        job_error(o->job, NULL, 0, "out of memory");
        return JOB_FAILED;
    }
    corax_error err;
    corax_error_clear(&err);
    corax_status st;
    while ((st = corax_reader_next(r, &row, &err)) == CORAX_OK) {
        for (size_t i = 0; i < s->width && i < row.count; i++) {
            corax_number_status ns;
            number_or_nan(s, &row, (long)i, &ns);
            if (ns != CORAX_NUMBER_OK && ns != CORAX_NUMBER_EMPTY)
                s->numeric[i] = 0;
        }
        if (s->col[T_FROM] < 0)
            continue;
        corax_number_status a, b;
        double from = depth_or_nan(s, &row, s->col[T_FROM], &a);
        double to = depth_or_nan(s, &row, s->col[T_TO], &b);
        size_t hl;
        const char *hole = corax_field_text(&row, s->col[T_HOLE], &hl);
        long h = prog ? corax_program_index(prog, hole, hl) : -1;
        if (a != CORAX_NUMBER_OK || b != CORAX_NUMBER_OK || h < 0)
            continue; /* a status of its own in the second pass */
        corax_interval *p = corax_grow(s->iv, s->n, &s->cap, sizeof *p, 1024);
        if (!p) {
            st = CORAX_ENOMEM;
            break;
        }
        s->iv = p;
        s->iv[s->n++] = (corax_interval){h, from, to, row.line, CORAX_INTERVAL_OK, 0};
    }
    corax_reader_close(r);
    if (st != CORAX_END) {
        job_error_record(o->job, &err, st);
        return JOB_FAILED;
    }
    if (!s->iv)
        return JOB_OK;
    corax_findings found = {0};
    if (corax_intervals_check(s->iv, s->n, path, hole_label, (void *)prog, &found) != CORAX_OK) {
        corax_findings_clear(&found);
        job_error(o->job, NULL, 0, "out of memory");
        return JOB_FAILED;
    }
    for (size_t i = 0; i < found.count; i++)
        if (i < MAX_SHOWN)
            job_finding(o->job, &found.item[i]);
        else if (i == MAX_SHOWN)
            job_warning(o->job, path, 0, "... and %zu more interval problems", found.count - i);
    corax_findings_clear(&found);
    return JOB_OK;
}

static int by_line(const void *a, const void *b)
{
    const corax_interval *x = a, *y = b;
    return (x->line > y->line) - (x->line < y->line);
}

/* The checked interval of a line, or NULL (s->iv sorted by line). */
static const corax_interval *interval_at(const scan *s, long line)
{
    corax_interval key = {0, 0, 0, line, CORAX_INTERVAL_OK, 0};
    return s->n ? bsearch(&key, s->iv, s->n, sizeof key, by_line) : NULL;
}

/* ---- writing a row's own columns ---- */

/* The GIS fields: the kept input columns typed as scanned, then ours. */
static corax_status make_layer(export_sink *k, const scan *s, corax_gis_shape shape,
                               const corax_gis_field *ours, size_t nours, int *layer,
                               corax_error *err)
{
    corax_gis_field *f = malloc((s->width + nours + 1) * sizeof *f);
    if (!f)
        return CORAX_ENOMEM;
    size_t n = 0;
    for (size_t i = 0; i < s->width; i++)
        if (s->kept[i])
            f[n++] = (corax_gis_field){s->name[i], s->numeric[i] ? CORAX_GIS_REAL
                                                                 : CORAX_GIS_TEXT};
    if (nours)
        memcpy(f + n, ours, nours * sizeof *ours);
    corax_status st = corax_gis_layer(k->g, k->layer, shape, 0, f, n + nours, layer, err);
    free(f);
    return st;
}

/* The kept input fields of a row; returns how many (the next field's number). */
static size_t put_input(export_sink *k, const scan *s,
                        const corax_row *row)
{
    size_t f = 0;
    for (size_t i = 0; i < s->width; i++) {
        if (!s->kept[i])
            continue;
        size_t n;
        const char *t = corax_field_text(row, (long)i, &n);
        if (k->w) {
            corax_writer_field(k->w, t, n);
        } else if (s->numeric[i]) {
            corax_number_status ns;
            corax_gis_real(k->g, f, number_or_nan(s, row, (long)i, &ns));
        } else if (n) {
            corax_gis_text(k->g, f, t, n);
        }
        f++;
    }
    return f;
}

static void put_number(export_sink *k, size_t *f, double v, int decimals)
{
    if (k->w)
        corax_writer_number(k->w, v, decimals);
    else
        corax_gis_real(k->g, *f, v);
    (*f)++;
}

static void put_text(export_sink *k, size_t *f, const char *t)
{
    if (k->w)
        corax_writer_field(k->w, t, strlen(t));
    else if (*t)
        corax_gis_text(k->g, *f, t, strlen(t));
    (*f)++;
}

static void put_integer(export_sink *k, size_t *f, long long v, int known)
{
    if (k->w && known)
        corax_writer_integer(k->w, v);
    else if (k->w)
        corax_writer_field(k->w, "", 0);
    else if (known)
        corax_gis_integer(k->g, *f, v);
    (*f)++;
}

static void csv_header(export_sink *k, const scan *s, const corax_gis_field *ours, size_t n)
{
    for (size_t i = 0; i < s->width; i++)
        if (s->kept[i])
            corax_writer_field(k->w, s->name[i], strlen(s->name[i]));
    for (size_t i = 0; i < n; i++)
        corax_writer_field(k->w, ours[i].name, strlen(ours[i].name));
    corax_writer_end_row(k->w);
}

/* Begin a row: a CSV row needs nothing, a GIS feature is begun. */
static corax_status begin_row(export_sink *k, int layer)
{
    return k->w ? CORAX_OK : corax_gis_feature(k->g, layer);
}

static corax_status end_row(export_sink *k, corax_error *err)
{
    k->written++;
    if (k->w) {
        corax_writer_end_row(k->w);
        return CORAX_OK;
    }
    return corax_gis_write(k->g, err);
}

static int sink_status(corax_job *job, corax_status st, const corax_error *err)
{
    if (st == CORAX_OK)
        return JOB_OK;
    if (st == CORAX_ENOMEM)
        job_error(job, NULL, 0, "out of memory");
    else
        job_error_record(job, err, st);
    return JOB_FAILED;
}

/* ---- intervals ---- */

enum {
    I_FROM_X, I_FROM_Y, I_FROM_Z, I_MID_X, I_MID_Y, I_MID_Z, I_TO_X, I_TO_Y, I_TO_Z,
    I_MID_AZIMUTH, I_MID_DIP, I_STATUS, I_NOTE, NI
};
static const corax_gis_field interval_fields[NI] = {
    {"from_x", CORAX_GIS_REAL}, {"from_y", CORAX_GIS_REAL}, {"from_z", CORAX_GIS_REAL},
    {"mid_x", CORAX_GIS_REAL},  {"mid_y", CORAX_GIS_REAL},  {"mid_z", CORAX_GIS_REAL},
    {"to_x", CORAX_GIS_REAL},   {"to_y", CORAX_GIS_REAL},   {"to_z", CORAX_GIS_REAL},
    {"mid_azimuth", CORAX_GIS_REAL}, {"mid_plunge", CORAX_GIS_REAL},
    {"status", CORAX_GIS_TEXT}, {"note", CORAX_GIS_TEXT}};

static const char *const interval_names[NT] = {"hole", "from", "to", "depth", "unit"};

/* Status and points of one interval row; 1 when it has points. */
static int place_interval(const corax_program *prog, const scan *s,
                          const corax_row *row, corax_interval_points *pts, const char **status,
                          char *note, size_t nl)
{
    size_t hl;
    const char *name = corax_field_text(row, s->col[T_HOLE], &hl);
    const corax_hole *hole = prog ? corax_program_find(prog, name, hl) : NULL;
    corax_number_status a, b;
    double from = depth_or_nan(s, row, s->col[T_FROM], &a);
    double to = depth_or_nan(s, row, s->col[T_TO], &b);
    const corax_interval *iv = interval_at(s, row->line);
    note[0] = '\0';
    if (!hole) {
        *status = "unknown-hole";
        return 0;
    }
    if (a != CORAX_NUMBER_OK || b != CORAX_NUMBER_OK || from < 0.0) {
        *status = "bad-depth";
        snprintf(note, nl, "from and to must be numbers, from at least 0");
        return 0;
    }
    if (iv && iv->fault == CORAX_INTERVAL_REVERSED) {
        *status = corax_interval_fault_name(iv->fault);
        snprintf(note, nl, "from %g is below to %g", from, to);
        return 0;
    }
    size_t hint = 0;
    if (corax_interval_desurvey(hole, from, to, &hint, pts) != CORAX_OK) {
        *status = "no-survey";
        return 0;
    }
    *status = corax_where_name(pts->where);
    if (iv && iv->fault == CORAX_INTERVAL_OVERLAP) {
        *status = corax_interval_fault_name(iv->fault);
        snprintf(note, nl, "overlaps the interval on line %ld", iv->other_line);
    }
    return 1;
}

static void put_point(export_sink *k, size_t *f, corax_vec3 p, int known)
{
    put_number(k, f, known ? p.x : NONE, 3);
    put_number(k, f, known ? p.y : NONE, 3);
    put_number(k, f, known ? p.z : NONE, 3);
}

static corax_status interval_row(const corax_program *prog,
                                 const scan *s, export_sink *k, int layer,
                                 const corax_row *row, corax_error *err)
{
    corax_interval_points pts;
    const char *status;
    char note[160];
    int placed = place_interval(prog, s, row, &pts, &status, note, sizeof note);
    corax_status st = begin_row(k, layer);
    if (st != CORAX_OK)
        return st;
    size_t f = put_input(k, s, row);
    put_point(k, &f, pts.from.position, placed);
    put_point(k, &f, pts.mid.position, placed);
    put_point(k, &f, pts.to.position, placed);
    double az = NONE, plunge = NONE;
    if (placed)
        corax_direction_angles(pts.mid.tangent, &az, &plunge);
    if (k->w && placed) {
        corax_writer_azimuth(k->w, corax_deg(az), 3);
        f++;
    } else {
        put_number(k, &f, corax_deg(az), 3);
    }
    put_number(k, &f, placed ? corax_deg(plunge) : NONE, 3);
    put_text(k, &f, status);
    put_text(k, &f, note);
    if (!k->w && placed) {
        corax_vec3 line[3] = {pts.from.position, pts.mid.position, pts.to.position};
        corax_gis_line(k->g, line, NULL, 3);
    }
    return end_row(k, err);
}

int export_intervals(const export_opts *o, const corax_program *prog, const export_table *t,
                     export_sink *k)
{
    const char *ours[NI];
    for (int i = 0; i < NI; i++)
        ours[i] = interval_fields[i].name;
    scan s;
    int rc = scan_table(o, prog, t->path, interval_names, 3, ours, NI, &s);
    if (rc != JOB_OK) {
        scan_free(&s);
        return rc;
    }
    if (s.n > 1)
        qsort(s.iv, s.n, sizeof *s.iv, by_line);
    corax_error err;
    corax_error_clear(&err);
    corax_reader *r = NULL;
    corax_row row;
    int layer = -1;
    rc = open_table(o, t->path, interval_names, 3, &r, &s, &row);
    corax_status st = CORAX_OK;
    if (rc == JOB_OK && k->w)
        csv_header(k, &s, interval_fields, NI);
    else if (rc == JOB_OK)
        st = make_layer(k, &s, CORAX_GIS_LINES, interval_fields, NI, &layer, &err);
    while (rc == JOB_OK && st == CORAX_OK && (st = corax_reader_next(r, &row, &err)) == CORAX_OK)
        st = interval_row(prog, &s, k, layer, &row, &err);
    if (rc == JOB_OK && st != CORAX_END)
        rc = sink_status(o->job, st, &err);
    corax_reader_close(r);
    scan_free(&s);
    return rc;
}

/* ---- findings ---- */

int export_findings(const export_opts *o, const corax_program *prog, export_sink *k)
{
    const char *const *names = interval_names;
    scan s;
    int rc = scan_table(o, prog, o->p->findings, names, 1, NULL, 0, &s);
    corax_reader *r = NULL;
    corax_row row;
    int layer = -1;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = CORAX_OK;
    if (rc == JOB_OK)
        rc = open_table(o, o->p->findings, names, 1, &r, &s, &row);
    if (rc == JOB_OK)
        st = make_layer(k, &s, CORAX_GIS_POINTS, NULL, 0, &layer, &err);
    while (rc == JOB_OK && st == CORAX_OK &&
           (st = corax_reader_next(r, &row, &err)) == CORAX_OK) {
        size_t hl;
        const char *name = corax_field_text(&row, s.col[T_HOLE], &hl);
        const corax_hole *hole = prog ? corax_program_find(prog, name, hl) : NULL;
        corax_number_status ds;
        double depth = depth_or_nan(&s, &row, s.col[T_DEPTH], &ds);
        if ((st = begin_row(k, layer)) != CORAX_OK)
            break;
        put_input(k, &s, &row);
        corax_hole_point pt;
        if (hole && ds == CORAX_NUMBER_OK && depth >= 0.0 &&
            corax_hole_at(hole, depth, NULL, &pt) == CORAX_OK)
            corax_gis_point(k->g, pt.position);
        else if (hole && ds == CORAX_NUMBER_EMPTY) /* about the whole hole: at its collar */
            corax_gis_point(k->g, corax_hole_collar(hole)->position);
        st = end_row(k, &err);
    }
    if (rc == JOB_OK && st != CORAX_END)
        rc = sink_status(o->job, st, &err);
    corax_reader_close(r);
    scan_free(&s);
    return rc;
}

/* ---- contacts ---- */

/* Units by name, and their age order from --youngest-first. */
typedef struct units {
    char **name;
    size_t n, cap;
} units;

static int unit_id(units *u, const char *text, size_t len)
{
    while (len && (*text == ' ' || *text == '\t')) {
        text++;
        len--;
    }
    while (len && (text[len - 1] == ' ' || text[len - 1] == '\t'))
        len--;
    if (!len)
        return -1;
    for (size_t i = 0; i < u->n; i++)
        if (strlen(u->name[i]) == len && strncasecmp(u->name[i], text, len) == 0)
            return (int)i;
    char **p = corax_grow(u->name, u->n, &u->cap, sizeof *p, 16);
    if (!p)
        return -2;
    u->name = p;
    if (!(u->name[u->n] = strndup(text, len)))
        return -2;
    return (int)u->n++;
}

typedef struct hole_interval {
    long hole;
    corax_unit_interval iv;
} hole_interval;

typedef struct hole_reading {
    long hole;
    corax_contact_reading r;
} hole_reading;

typedef struct contact_data {
    const export_opts *o;
    const corax_program *prog;
    units u;
    hole_interval *iv;
    size_t niv, ivcap;
    hole_reading *rd;
    size_t nrd, rdcap;
    corax_kinds *kinds;
    int *wanted;   /* kind codes that orient contacts */
    size_t nwanted;
    size_t unknown_holes;
} contact_data;

static int by_hole_from(const void *a, const void *b)
{
    const hole_interval *x = a, *y = b;
    if (x->hole != y->hole)
        return x->hole < y->hole ? -1 : 1;
    if (x->iv.from != y->iv.from)
        return x->iv.from < y->iv.from ? -1 : 1;
    return (x->iv.line > y->iv.line) - (x->iv.line < y->iv.line);
}

static int by_hole(const void *a, const void *b)
{
    const hole_reading *x = a, *y = b;
    return (x->hole > y->hole) - (x->hole < y->hole);
}

static int read_units(contact_data *d)
{
    const char *column = d->o->p->contact_column ? d->o->p->contact_column : "unit";
    const char *names[NT] = {"hole", "from", "to", "depth", column};
    scan s;
    const char *none[1] = {NULL};
    int rc = scan_table(d->o, d->prog, d->o->p->contacts, names, 3, none, 0, &s);
    if (rc == JOB_OK && s.col[T_UNIT] < 0) {
        job_error(d->o->job, d->o->p->contacts, 1, "no '%s' column: name the unit's column with "
                  "--contact-column", column);
        rc = JOB_FAILED;
    }
    corax_reader *r = NULL;
    corax_row row;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = CORAX_OK;
    if (rc == JOB_OK)
        rc = open_table(d->o, d->o->p->contacts, names, 3, &r, &s, &row);
    while (rc == JOB_OK && (st = corax_reader_next(r, &row, &err)) == CORAX_OK) {
        size_t hl, ul;
        const char *hole = corax_field_text(&row, s.col[T_HOLE], &hl);
        const char *unit = corax_field_text(&row, s.col[T_UNIT], &ul);
        long h = d->prog ? corax_program_index(d->prog, hole, hl) : -1;
        corax_number_status a, b;
        double from = depth_or_nan(&s, &row, s.col[T_FROM], &a);
        double to = depth_or_nan(&s, &row, s.col[T_TO], &b);
        if (h < 0) {
            d->unknown_holes++;
            continue;
        }
        if (a != CORAX_NUMBER_OK || b != CORAX_NUMBER_OK)
            continue; /* cannot place it: no contact from it */
        int id = unit_id(&d->u, unit, ul);
        hole_interval *p = corax_grow(d->iv, d->niv, &d->ivcap, sizeof *p, 256);
        if (id < -1 || !p) {
            st = CORAX_ENOMEM;
            break;
        }
        d->iv = p;
        d->iv[d->niv++] = (hole_interval){h, {from, to, id, row.line}};
    }
    if (rc == JOB_OK && st != CORAX_END)
        rc = sink_status(d->o->job, st, &err);
    corax_reader_close(r);
    scan_free(&s);
    if (rc == JOB_OK && d->niv > 1)
        qsort(d->iv, d->niv, sizeof *d->iv, by_hole_from);
    return rc;
}

static int wanted_kind(const contact_data *d, int code)
{
    for (size_t i = 0; i < d->nwanted; i++)
        if (d->wanted[i] == code)
            return 1;
    return 0;
}

static int contact_reading(void *ctx, int table, const corax_row *row, const corax_structure *s,
                           const corax_export_extra *x)
{
    contact_data *d = ctx;
    (void)table;
    (void)row;
    (void)x;
    int code = corax_kinds_code(d->kinds, s->kind, s->kind_len);
    long h = d->prog ? corax_program_index(d->prog, s->hole, s->hole_len) : -1;
    if (code < 0) {
        job_error(d->o->job, NULL, 0, "out of memory");
        return -1;
    }
    if (!s->oriented || h < 0 || isnan(s->depth) || !wanted_kind(d, code))
        return 0;
    hole_reading *p = corax_grow(d->rd, d->nrd, &d->rdcap, sizeof *p, 256);
    if (!p) {
        job_error(d->o->job, NULL, 0, "out of memory");
        return -1;
    }
    d->rd = p;
    d->rd[d->nrd++] = (hole_reading){h, {s->depth, corax_plane_normal(s->plane)}};
    return 0;
}

static int contact_kinds(contact_data *d)
{
    const char *p = d->o->p->contact_kinds ? d->o->p->contact_kinds : "contact", *item;
    size_t len;
    while (export_list_next(&p, &item, &len)) {
        int *w = realloc(d->wanted, (d->nwanted + 1) * sizeof *w);
        int code = corax_kinds_code(d->kinds, item, len);
        if (w)
            d->wanted = w;
        if (!w || code < 0) {
            job_error(d->o->job, NULL, 0, "out of memory");
            return JOB_FAILED;
        }
        d->wanted[d->nwanted++] = code;
    }
    return JOB_OK;
}

/* rank[unit] from --youngest-first (-1 when not listed). */
static int *age_ranks(contact_data *d, corax_record *a)
{
    int *rank = malloc((d->u.n ? d->u.n : 1) * sizeof *rank);
    if (!rank)
        return NULL;
    for (size_t i = 0; i < d->u.n; i++)
        rank[i] = -1;
    const char *p = d->o->p->youngest_first, *item;
    size_t len;
    for (int order = 0; export_list_next(&p, &item, &len); order++) {
        int found = 0;
        for (size_t i = 0; i < d->u.n; i++)
            if (strlen(d->u.name[i]) == len && strncasecmp(d->u.name[i], item, len) == 0) {
                rank[i] = order;
                found = 1;
            }
        if (!found)
            job_note(d->o->job, "--youngest-first: no interval has the unit '%.*s'", (int)len,
                     item);
    }
    if (d->o->p->youngest_first)
        corax_record_set(a, "youngest_first", "%s", d->o->p->youngest_first);
    return rank;
}

enum {
    C_HOLE, C_DEPTH, C_ABOVE, C_BELOW, C_X, C_Y, C_Z, C_DIP, C_DIP_DIRECTION, C_STRIKE, C_NX,
    C_NY, C_NZ, C_COUNT, C_KAPPA, C_POLARITY, C_YX, C_YY, C_YZ, C_GAP, C_STATUS, C_LINE, NC
};
static const corax_gis_field contact_fields[NC] = {
    {"hole", CORAX_GIS_TEXT},        {"depth", CORAX_GIS_REAL},
    {"above", CORAX_GIS_TEXT},       {"below", CORAX_GIS_TEXT},
    {"x", CORAX_GIS_REAL},           {"y", CORAX_GIS_REAL},
    {"z", CORAX_GIS_REAL},           {"dip", CORAX_GIS_REAL},
    {"dip_direction", CORAX_GIS_REAL}, {"strike", CORAX_GIS_REAL},
    {"nx", CORAX_GIS_REAL},          {"ny", CORAX_GIS_REAL},
    {"nz", CORAX_GIS_REAL},          {"count", CORAX_GIS_INTEGER},
    {"kappa", CORAX_GIS_REAL},       {"polarity", CORAX_GIS_INTEGER},
    {"younging_x", CORAX_GIS_REAL},  {"younging_y", CORAX_GIS_REAL},
    {"younging_z", CORAX_GIS_REAL},  {"gap", CORAX_GIS_REAL},
    {"status", CORAX_GIS_TEXT},      {"line", CORAX_GIS_INTEGER}};

static corax_status contact_row(const contact_data *d, export_sink *k, int layer,
                                const corax_hole *hole, const corax_contact *c,
                                corax_error *err)
{
    corax_status st = begin_row(k, layer);
    if (st != CORAX_OK)
        return st;
    int placed = c->status != CORAX_CONTACT_NO_PATH, oriented = c->count > 0;
    size_t f = 0;
    put_text(k, &f, corax_hole_name(hole));
    put_number(k, &f, c->depth, 3);
    put_text(k, &f, d->u.name[c->above]);
    put_text(k, &f, d->u.name[c->below]);
    put_point(k, &f, c->point.position, placed);
    double dd = oriented ? corax_deg(c->plane.dip_direction) : NONE;
    put_number(k, &f, oriented ? corax_deg(c->plane.dip) : NONE, 2);
    put_number(k, &f, dd, 2);
    put_number(k, &f, oriented ? corax_wrap_degrees(dd - 90.0, 2) : NONE, 2);
    put_number(k, &f, oriented ? c->normal.x : NONE, 6);
    put_number(k, &f, oriented ? c->normal.y : NONE, 6);
    put_number(k, &f, oriented ? c->normal.z : NONE, 6);
    put_integer(k, &f, (long long)c->count, 1);
    put_number(k, &f, isfinite(c->kappa) ? c->kappa : NONE, 1);
    put_integer(k, &f, c->polarity, c->polarity != 0);
    put_number(k, &f, c->polarity ? c->younging.x : NONE, 6);
    put_number(k, &f, c->polarity ? c->younging.y : NONE, 6);
    put_number(k, &f, c->polarity ? c->younging.z : NONE, 6);
    put_number(k, &f, c->gap, 3);
    put_text(k, &f, corax_contact_status_name(c->status));
    put_integer(k, &f, c->line_below, 1);
    if (!k->w && placed)
        corax_gis_point(k->g, c->point.position);
    return end_row(k, err);
}

/* The contacts of every hole, hole by hole. */
static int write_contacts(contact_data *d, export_sink *k, const int *rank, corax_error *err)
{
    int layer = -1;
    corax_status st = CORAX_OK;
    if (k->w) {
        for (int i = 0; i < NC; i++)
            corax_writer_field(k->w, contact_fields[i].name, strlen(contact_fields[i].name));
        corax_writer_end_row(k->w);
    } else {
        st = corax_gis_layer(k->g, k->layer, CORAX_GIS_POINTS, 0, contact_fields, NC, &layer,
                             err);
    }
    corax_unit_interval *iv = malloc((d->niv ? d->niv : 1) * sizeof *iv);
    corax_contact_reading *rd = malloc((d->nrd ? d->nrd : 1) * sizeof *rd);
    if (!iv || !rd)
        st = CORAX_ENOMEM;
    size_t a = 0, b = 0;
    while (st == CORAX_OK && a < d->niv) {
        long h = d->iv[a].hole;
        size_t n = 0, nr = 0;
        for (; a < d->niv && d->iv[a].hole == h; a++)
            iv[n++] = d->iv[a].iv;
        for (; b < d->nrd && d->rd[b].hole < h; b++)
            ;
        for (; b < d->nrd && d->rd[b].hole == h; b++)
            rd[nr++] = d->rd[b].r;
        const corax_hole *hole = corax_program_hole(d->prog, (size_t)h);
        corax_contact *c;
        size_t nc;
        st = corax_contacts_find(hole, iv, n, rd, nr, d->o->p->contact_window, rank, d->u.n, &c,
                                 &nc);
        for (size_t i = 0; st == CORAX_OK && i < nc; i++)
            st = contact_row(d, k, layer, hole, &c[i], err);
        if (st == CORAX_OK)
            free(c);
    }
    free(iv);
    free(rd);
    return sink_status(d->o->job, st, err);
}

int export_contacts(const export_opts *o, const corax_program *prog, export_sink *k,
                    corax_record *a)
{
    contact_data d;
    memset(&d, 0, sizeof d);
    d.o = o;
    d.prog = prog;
    corax_error err;
    corax_error_clear(&err);
    int *rank = NULL;
    int rc = (d.kinds = corax_kinds_new()) ? contact_kinds(&d) : JOB_FAILED;
    if (rc == JOB_OK)
        rc = read_units(&d);
    export_visit v = {NULL, NULL, contact_reading, 0};
    if (rc == JOB_OK)
        rc = export_each_structure(o, &v, &d);
    if (rc == JOB_OK && d.nrd > 1)
        qsort(d.rd, d.nrd, sizeof *d.rd, by_hole);
    if (rc == JOB_OK && !(rank = age_ranks(&d, a))) {
        job_error(o->job, NULL, 0, "out of memory");
        rc = JOB_FAILED;
    }
    if (rc == JOB_OK && d.unknown_holes)
        job_note(o->job, "%s: %zu interval%s of holes not in the collar table left out",
                 o->p->contacts, d.unknown_holes, d.unknown_holes == 1 ? "" : "s");
    if (rc == JOB_OK) {
        corax_record_set(a, "contact_column", "%s",
                         o->p->contact_column ? o->p->contact_column : "unit");
        corax_record_set(a, "contact_kinds", "%s",
                         o->p->contact_kinds ? o->p->contact_kinds : "contact");
        corax_record_set(a, "contact_window", "%g m either side; the Fisher mean of the poles "
                         "(axial), with count and kappa", o->p->contact_window);
        rc = write_contacts(&d, k, rank, &err);
    }
    free(rank);
    for (size_t i = 0; i < d.u.n; i++)
        free(d.u.name[i]);
    free(d.u.name);
    free(d.iv);
    free(d.rd);
    free(d.wanted);
    corax_kinds_free(d.kinds);
    return rc;
}

/* ---- intervals as legacy VTK ---- */

/* Legacy VTK announces each block's size and takes arrays one at a time, so
 * the table is read once per block: memory stays flat. Text columns become
 * integer codes (listed in the .about file) when they hold at most
 * MAX_CODES distinct values, and are left out otherwise. */
enum { MAX_CODES = 64 };

typedef struct vtk_intervals {
    const export_opts *o;
    const corax_program *prog;
    scan *s;
    corax_vtk *v;
    long column;              /* the column of the current array */
    char **code[64];          /* per text column (index < 64): its values */
    size_t ncode[64];
    unsigned char coded[64];  /* 1: coded; 0: left out (too many values) */
    size_t placed;
} vtk_intervals;

typedef void (*placed_fn)(vtk_intervals *vi, const corax_row *row,
                          const corax_interval_points *p);

static int each_placed(vtk_intervals *vi, placed_fn fn)
{
    corax_reader *r = NULL;
    corax_row row;
    corax_error err;
    corax_error_clear(&err);
    int rc = open_table(vi->o, vi->s->path, interval_names, 3, &r, vi->s, &row);
    corax_status st = CORAX_OK;
    while (rc == JOB_OK && (st = corax_reader_next(r, &row, &err)) == CORAX_OK) {
        corax_interval_points pts;
        const char *status;
        char note[160];
        if (place_interval(vi->prog, vi->s, &row, &pts, &status, note, sizeof note))
            fn(vi, &row, &pts);
    }
    if (rc == JOB_OK && st != CORAX_END)
        rc = sink_status(vi->o->job, st, &err);
    corax_reader_close(r);
    return rc;
}

static int own_column(const scan *s, size_t i)
{
    return !s->kept[i] || (long)i == s->col[T_HOLE] || (long)i == s->col[T_FROM] ||
           (long)i == s->col[T_TO] || i >= 64;
}

static void count_placed(vtk_intervals *vi, const corax_row *row, const corax_interval_points *p)
{
    (void)p;
    vi->placed++;
    for (size_t i = 0; i < vi->s->width; i++) {
        if (own_column(vi->s, i) || vi->s->numeric[i] || !vi->coded[i])
            continue;
        size_t n;
        const char *t = corax_field_text(row, (long)i, &n);
        int known = n == 0;
        for (size_t k = 0; !known && k < vi->ncode[i]; k++)
            known = strlen(vi->code[i][k]) == n && memcmp(vi->code[i][k], t, n) == 0;
        if (known)
            continue;
        char **grown = vi->ncode[i] < MAX_CODES
                           ? realloc(vi->code[i], (vi->ncode[i] + 1) * sizeof *grown)
                           : NULL;
        if (grown)
            vi->code[i] = grown;
        if (!grown || !(vi->code[i][vi->ncode[i]] = strndup(t, n)))
            vi->coded[i] = 0; /* too many values (or no memory): left out */
        else
            vi->ncode[i]++;
    }
}

static void put_points(vtk_intervals *vi, const corax_row *row, const corax_interval_points *p)
{
    (void)row;
    corax_vtk_point(vi->v, p->from.position);
    corax_vtk_point(vi->v, p->mid.position);
    corax_vtk_point(vi->v, p->to.position);
}

static void put_depths(vtk_intervals *vi, const corax_row *row, const corax_interval_points *p)
{
    (void)p;
    corax_number_status a, b;
    double from = depth_or_nan(vi->s, row, vi->s->col[T_FROM], &a);
    double to = depth_or_nan(vi->s, row, vi->s->col[T_TO], &b);
    corax_vtk_double(vi->v, from);
    corax_vtk_double(vi->v, 0.5 * (from + to));
    corax_vtk_double(vi->v, to);
}

static void put_hole(vtk_intervals *vi, const corax_row *row, const corax_interval_points *p)
{
    (void)p;
    size_t n;
    const char *t = corax_field_text(row, vi->s->col[T_HOLE], &n);
    corax_vtk_int(vi->v, corax_program_index(vi->prog, t, n) + 1);
}

static void put_direction(vtk_intervals *vi, const corax_row *row, const corax_interval_points *p)
{
    (void)row;
    double az, plunge;
    corax_direction_angles(p->mid.tangent, &az, &plunge);
    corax_vtk_double(vi->v, vi->column == 0 ? corax_wrap_degrees(corax_deg(az), 6)
                                            : corax_deg(plunge));
}

static void put_column(vtk_intervals *vi, const corax_row *row, const corax_interval_points *p)
{
    (void)p;
    size_t i = (size_t)vi->column, n;
    if (vi->s->numeric[i]) {
        corax_number_status st;
        double v = number_or_nan(vi->s, row, vi->column, &st);
        corax_vtk_double(vi->v, isnan(v) ? -1.0 : v);
        return;
    }
    const char *t = corax_field_text(row, vi->column, &n);
    long code = -1;
    for (size_t k = 0; n && k < vi->ncode[i]; k++)
        if (strlen(vi->code[i][k]) == n && memcmp(vi->code[i][k], t, n) == 0)
            code = (long)k;
    corax_vtk_int(vi->v, code);
}

static int vtk_interval_blocks(vtk_intervals *vi, size_t narrays)
{
    corax_vtk *v = vi->v;
    size_t n = vi->placed;
    int rc;
    corax_vtk_points(v, 3 * n);
    if ((rc = each_placed(vi, put_points)) != JOB_OK)
        return rc;
    corax_vtk_cells(v, "LINES", n, 3 * n);
    for (size_t i = 0; i < n; i++) {
        corax_vtk_cell(v, 3);
        for (size_t k = 0; k < 3; k++)
            corax_vtk_index(v, 3 * i + k);
    }
    corax_vtk_point_data(v, 3 * n);
    corax_vtk_scalars(v, "depth", CORAX_VTK_DOUBLE);
    if ((rc = each_placed(vi, put_depths)) != JOB_OK)
        return rc;
    corax_vtk_cell_data(v, n);
    corax_vtk_scalars(v, "hole", CORAX_VTK_INT);
    if ((rc = each_placed(vi, put_hole)) != JOB_OK)
        return rc;
    corax_vtk_field(v, "attributes", narrays);
    static const char *const direction[] = {"mid_azimuth", "mid_plunge"};
    for (vi->column = 0; vi->column < 2; vi->column++) {
        corax_vtk_array(v, direction[vi->column], 1, CORAX_VTK_DOUBLE);
        if ((rc = each_placed(vi, put_direction)) != JOB_OK)
            return rc;
    }
    for (size_t i = 0; i < vi->s->width; i++) {
        if (own_column(vi->s, i) || (!vi->s->numeric[i] && !vi->coded[i]))
            continue;
        vi->column = (long)i;
        corax_vtk_array(v, vi->s->name[i], 1,
                        vi->s->numeric[i] ? CORAX_VTK_DOUBLE : CORAX_VTK_INT);
        if ((rc = each_placed(vi, put_column)) != JOB_OK)
            return rc;
    }
    return JOB_OK;
}

static void about_codes(const vtk_intervals *vi, corax_record *a)
{
    corax_record_section(a, "codes");
    for (size_t i = 0; i < vi->s->width; i++) {
        if (own_column(vi->s, i) || vi->s->numeric[i])
            continue;
        if (!vi->coded[i]) {
            corax_record_set(a, vi->s->name[i], "left out: more than %d values", MAX_CODES);
            continue;
        }
        for (size_t k = 0; k < vi->ncode[i]; k++) {
            char key[160];
            snprintf(key, sizeof key, "%s.%zu", vi->s->name[i], k);
            corax_record_set(a, key, "%s", vi->code[i][k]);
        }
    }
}

int export_intervals_vtk(const export_opts *o, const corax_program *prog, corax_record *a)
{
    scan s;
    vtk_intervals vi;
    memset(&vi, 0, sizeof vi);
    memset(vi.coded, 1, sizeof vi.coded);
    vi.o = o;
    vi.prog = prog;
    vi.s = &s;
    int rc = scan_table(o, prog, o->p->intervals[0].path, interval_names, 3, NULL, 0, &s);
    if (rc == JOB_OK && s.n > 1)
        qsort(s.iv, s.n, sizeof *s.iv, by_line);
    if (rc == JOB_OK)
        rc = each_placed(&vi, count_placed);
    size_t narrays = 2;
    for (size_t i = 0; rc == JOB_OK && i < s.width; i++)
        narrays += !own_column(&s, i) && (s.numeric[i] || vi.coded[i]);
    corax_error err;
    corax_error_clear(&err);
    corax_status st = CORAX_OK;
    if (rc == JOB_OK) {
        char title[200];
        snprintf(title, sizeof title, "corax %s export: intervals of %s desurveyed; metres, x "
                 "east, y north, z up", CORAX_VERSION, o->p->intervals[0].path);
        st = corax_vtk_open(o->job->outputs, o->output, o->p->vtk.encoding, title, &vi.v, &err);
        rc = st == CORAX_OK ? JOB_OK : sink_status(o->job, st, &err);
    }
    if (rc == JOB_OK) {
        corax_vtk_decimals(vi.v, 6);
        rc = vtk_interval_blocks(&vi, narrays);
        if (rc == JOB_OK)
            rc = sink_status(o->job, corax_vtk_commit(vi.v, &err), &err);
        else
            corax_vtk_discard(vi.v);
    }
    if (rc == JOB_OK) {
        corax_record_section(a, "results");
        corax_record_set(a, "intervals", "%zu drawn (3 points each: from, middle, to)", vi.placed);
        corax_record_set(a, "not_a_value", "-1 (legacy VTK cannot write NaN)");
        about_codes(&vi, a);
    }
    for (size_t i = 0; i < 64; i++) {
        for (size_t k = 0; k < vi.ncode[i]; k++)
            free(vi.code[i][k]);
        free(vi.code[i]);
    }
    scan_free(&s);
    return rc;
}
