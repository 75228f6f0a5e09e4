/* job: the stereonet job, nets and orientation statistics of converted
 * structures, grouped and filtered by their columns. The tables are read row
 * by row, and a reading keeps only what the net and the statistics take of
 * it: its unit vector (and weight), or its small circle, and its group; a few
 * dozen bytes, whatever else its row holds. */
#include <ctype.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "corax/job_stereonet.h"
#include "corax/stats.h"
#include "io/fields.h"
#include "job/job_int.h"

/* One stereonet: its job, options and output. */
typedef struct stereo_opts {
    corax_job *job;
    const corax_stereonet_job_options *p;
    const char *output;
} stereo_opts;

/* The kinds of reading: planes by their poles, lines, and planes known by
 * alpha alone as small circles. */
enum { POLES, LINES, CIRCLES, KINDS };

/* Every group's readings of one kind, in one array: in the order read, then,
 * once every table is read, group by group (each group's in the order read),
 * so that a group's readings are a slice and the groups on one net lie one
 * after another. */
typedef struct kept {
    void *item;      /* `size` bytes each: a corax_vec3, or a corax_net_circle */
    double *weight;  /* each pole's Terzaghi weight, or NULL (unweighted) */
    uint16_t *group; /* each reading's group by its number (freed once in order) */
    size_t size, n, cap;
    int weighted;
} kept;

typedef struct group {
    char *name;
    size_t id;                          /* its number as met, before the sort */
    size_t start[KINDS], count[KINDS];  /* its slice of each kind */
    size_t skipped;
    corax_axial_summary pole_summary, line_summary;
} group;

/* More groups than this make a page no one can read: refuse them. */
enum { MAX_GROUPS = 500 };
_Static_assert(MAX_GROUPS <= UINT16_MAX, "a group's number is kept in 16 bits");

/* Faults in rows of the table being read, said only once it has been read to
 * its end: a table that cannot be read is refused with that alone, its rows
 * unsaid. */
typedef struct held {
    long line[JOB_SHOWN];
    char why[JOB_SHOWN][200];
    size_t n;    /* held */
    size_t more; /* beyond the JOB_SHOWN that are said, counted */
} held;

typedef struct groups {
    group *item;
    size_t count, cap, last;
    int full;      /* a row would have made group MAX_GROUPS + 1 */
    size_t skipped;        /* rows with no angles (not faults) */
    corax_job *job;
    kept kind[KINDS];
    job_problems problems; /* faulty rows */
    held held;             /* of the table being read */
} groups;

/* One converted table being read: the row at hand. */
typedef struct source {
    const char *path;
    corax_reader *reader;
    char decimal;  /* as read */
    size_t width;  /* fields of the header */
    corax_row row;
} source;

/* Columns of one input table (-1 when absent). */
typedef struct columns {
    long dip, dip_direction, trend, plunge, hole_azimuth, hole_plunge, alpha, group;
    long *where;
    size_t missing_where; /* the --where rule whose column the table lacks */
    int hole_dip;         /* the table has hole_dip (of an older corax) */
} columns;

static group *find_group(groups *gs, const char *name, size_t len)
{
    if (gs->last < gs->count && strlen(gs->item[gs->last].name) == len &&
        memcmp(gs->item[gs->last].name, name, len) == 0)
        return &gs->item[gs->last];
    for (size_t i = 0; i < gs->count; i++)
        if (strlen(gs->item[i].name) == len && memcmp(gs->item[i].name, name, len) == 0) {
            gs->last = i;
            return &gs->item[i];
        }
    if (gs->count == MAX_GROUPS) {
        gs->full = 1;
        return NULL;
    }
    group *grown = corax_grow(gs->item, gs->count, &gs->cap, sizeof *grown, 16);
    if (!grown)
        return NULL;
    gs->item = grown;
    group *g = &gs->item[gs->count];
    memset(g, 0, sizeof *g);
    if (!(g->name = strndup(name, len)))
        return NULL;
    g->id = gs->count;
    gs->last = gs->count++;
    return g;
}

/* Keep a reading of a kind (its item, its weight when weighted) for group g.
 * 0 when out of memory. */
static int keep(groups *gs, int kind, group *g, const void *item, double weight)
{
    kept *k = &gs->kind[kind];
    if (k->n == k->cap) {
        size_t cap = k->cap ? 2 * k->cap : 64;
        void *p = realloc(k->item, cap * k->size);
        if (p)
            k->item = p;
        uint16_t *id = p ? realloc(k->group, cap * sizeof *id) : NULL;
        if (id)
            k->group = id;
        double *w = id && k->weighted ? realloc(k->weight, cap * sizeof *w) : NULL;
        if (w)
            k->weight = w;
        if (!id || (k->weighted && !w))
            return 0;
        k->cap = cap;
    }
    memcpy((char *)k->item + k->n * k->size, item, k->size);
    k->group[k->n] = (uint16_t)g->id;
    if (k->weighted)
        k->weight[k->n] = weight;
    k->n++;
    g->count[kind]++;
    return 1;
}

/* Trim blanks from a cell. */
static const char *trimmed(const char *s, size_t *len)
{
    size_t n = *len;
    while (n && isspace((unsigned char)*s))
        s++, n--;
    while (n && isspace((unsigned char)s[n - 1]))
        n--;
    *len = n;
    return s;
}

/* A cell of the row at hand ("" for column -1 or past its end). */
static const char *cell(const source *s, long column, size_t *len)
{
    return corax_field_text(&s->row, column, len);
}

/* A cell as a number (NaN and a status other than CORAX_NUMBER_OK when it is
 * not one). */
static corax_number_status number(const source *s, long column, double *value)
{
    size_t len;
    const char *text = cell(s, column, &len);
    *value = NAN;
    return corax_parse_number(text, len, s->decimal, value);
}

static int keep_row(const stereo_opts *o, const source *s, const columns *col)
{
    for (size_t i = 0; i < o->p->nwhere; i++) {
        int any = 0, match = 0;
        for (size_t k = 0; k < o->p->nwhere; k++) {
            if (strcasecmp(o->p->where[k].column, o->p->where[i].column) != 0)
                continue;
            size_t len;
            const char *text = trimmed(cell(s, col->where[k], &len), &len);
            any = 1;
            match |= strlen(o->p->where[k].value) == len &&
                     strncasecmp(text, o->p->where[k].value, len) == 0;
        }
        if (any && !match)
            return 0;
    }
    return 1;
}

/* The outcome of reading a pair of angles. */
enum { PAIR_NONE, PAIR_OK, PAIR_BAD };

/* An angle column: its index, name and range. */
typedef struct angle_spec {
    long col;
    const char *name;
    double lo, hi;
} angle_spec;

/* Read two angle columns: both empty (or absent) is PAIR_NONE; both numbers
 * within range PAIR_OK; anything else PAIR_BAD with the reason in why. */
static int read_pair(const source *s, const angle_spec spec[2], double value[2], char *why,
                     size_t whylen)
{
    size_t len[2];
    const char *text[2];
    for (int k = 0; k < 2; k++)
        text[k] = trimmed(cell(s, spec[k].col, &len[k]), &len[k]);
    if (len[0] == 0 && len[1] == 0)
        return PAIR_NONE;
    for (int k = 0; k < 2; k++) {
        corax_number_status ns = number(s, spec[k].col, &value[k]);
        if (ns == CORAX_NUMBER_EMPTY)
            snprintf(why, whylen, "%s is empty", spec[k].name);
        else if (ns != CORAX_NUMBER_OK)
            snprintf(why, whylen, "%s '%.*s' is not a number", spec[k].name, (int)len[k], text[k]);
        else if (value[k] < spec[k].lo || value[k] > spec[k].hi)
            snprintf(why, whylen, "%s %g is outside [%g, %g]", spec[k].name, value[k], spec[k].lo,
                     spec[k].hi);
        else
            continue;
        return PAIR_BAD;
    }
    return PAIR_OK;
}

/* A faulty row: a problem (the table is refused, as every command does),
 * held until its table has been read. */
static void row_fault(groups *gs, const source *s, const char *why)
{
    held *h = &gs->held;
    if (gs->problems.n + h->n >= JOB_SHOWN) {
        h->more++;
        return;
    }
    h->line[h->n] = s->row.line;
    snprintf(h->why[h->n++], sizeof h->why[0], "%s", why);
}

/* Say the faults held (keep: else forget them, the table refused). */
static void held_end(groups *gs, const char *path, int keep_them)
{
    held *h = &gs->held;
    for (size_t i = 0; keep_them && i < h->n; i++)
        job_problem(gs->job, &gs->problems, path, h->line[i], "%s", h->why[i]);
    if (keep_them)
        gs->problems.n += h->more;
    h->n = h->more = 0;
}

static int out_of_memory(corax_job *job)
{
    job_error(job, NULL, 0, "out of memory");
    return JOB_FAILED;
}

/* The hole's direction at a row (hole_azimuth, hole_plunge): PAIR_OK with
 * *dir filled, PAIR_NONE, or PAIR_BAD with why. */
static int hole_direction(const source *s, const columns *col, corax_vec3 *dir, char *why,
                          size_t whylen)
{
    const angle_spec spec[2] = {{col->hole_azimuth, "hole_azimuth", 0, 360},
                                {col->hole_plunge, "hole_plunge", -90, 90}};
    double v[2];
    int r = read_pair(s, spec, v, why, whylen);
    if (r == PAIR_OK)
        *dir = corax_direction(corax_rad(v[0]), corax_rad(v[1]));
    return r;
}

/* The Terzaghi weight of a plane, from the hole's direction on the row. */
static int plane_weight(const stereo_opts *o, const source *s, const columns *col,
                        corax_vec3 normal, double *w, char *why, size_t whylen)
{
    corax_vec3 hole;
    int r = hole_direction(s, col, &hole, why, whylen);
    if (r == PAIR_NONE)
        snprintf(why, whylen, "no hole direction for the Terzaghi weight");
    if (r != PAIR_OK)
        return 0;
    *w = corax_terzaghi_weight(normal, hole, corax_rad(o->p->min_angle));
    return 1;
}

/* A row with alpha and the hole's direction but no plane, as the small
 * circle its pole lies on: 1 kept, 0 not such a row, -1 out of memory. */
static int small_circle_of(const stereo_opts *o, groups *gs, group *g, const source *s,
                           const columns *col)
{
    double alpha;
    corax_vec3 hole;
    char why[200];
    if (!o->p->small_circles || number(s, col->alpha, &alpha) != CORAX_NUMBER_OK ||
        !(alpha >= 0 && alpha <= 90) || hole_direction(s, col, &hole, why, sizeof why) != PAIR_OK)
        return 0;
    corax_net_circle c = {hole, corax_rad(90.0 - alpha)};
    return keep(gs, CIRCLES, g, &c, 0.0) ? 1 : -1;
}

/* One row: its plane and its line into its group. 0, or JOB_FAILED: out of
 * memory (said), or, with gs->full, a group too many (not said). */
static int read_row(const stereo_opts *o, groups *gs, const source *s, const columns *col)
{
    size_t len = 3;
    const char *name = "all";
    if (col->group >= 0) {
        name = trimmed(cell(s, col->group, &len), &len);
        if (len == 0)
            name = "(blank)", len = 7;
    }
    group *g = find_group(gs, name, len);
    if (!g)
        return gs->full ? JOB_FAILED : out_of_memory(gs->job);
    const angle_spec plane[2] = {{col->dip, "dip", 0, 90}, {col->dip_direction, "dip_direction", 0, 360}};
    const angle_spec line[2] = {{col->trend, "trend", 0, 360}, {col->plunge, "plunge", 0, 90}};
    char why[200];
    double v[2], w = 1.0;
    int used = 0;
    if (s->row.count != s->width) {
        snprintf(why, sizeof why, "the row has %zu fields but the header has %zu", s->row.count,
                 s->width);
        row_fault(gs, s, why);
        return 0;
    }
    int r = read_pair(s, plane, v, why, sizeof why);
    size_t dd_len;
    trimmed(cell(s, col->dip_direction, &dd_len), &dd_len);
    if (r == PAIR_BAD && dd_len == 0 && number(s, col->dip, &v[0]) == CORAX_NUMBER_OK &&
        v[0] >= 0 && v[0] <= 90)
        r = PAIR_NONE; /* a dip alone (convert's dip-only rows): no plane, nothing wrong */
    if (r == PAIR_OK) {
        corax_vec3 n = corax_plane_normal((corax_plane){corax_rad(v[0]), corax_rad(v[1])});
        if (o->p->style.weighted && !plane_weight(o, s, col, n, &w, why, sizeof why))
            r = PAIR_BAD;
        else if (!keep(gs, POLES, g, &n, w))
            return out_of_memory(gs->job);
        else
            used = 1;
    }
    int bad = r == PAIR_BAD;
    if (bad)
        row_fault(gs, s, why);
    r = read_pair(s, line, v, why, sizeof why);
    if (r == PAIR_OK) {
        corax_vec3 l = corax_direction(corax_rad(v[0]), corax_rad(v[1]));
        if (!keep(gs, LINES, g, &l, 1.0))
            return out_of_memory(gs->job);
        used = 1;
    } else if (r == PAIR_BAD) {
        row_fault(gs, s, why);
        bad = 1;
    }
    if (!used && !bad && (used = small_circle_of(o, gs, g, s, col)) < 0)
        return out_of_memory(gs->job);
    if (!used) {
        g->skipped++;
        gs->skipped++;
    }
    return 0;
}

/* What keeps a table from the job: nothing, or a fault of its columns, or of
 * its rows. */
enum { FAULT_NONE, FAULT_GROUP_BY, FAULT_WHERE, FAULT_NO_ANGLES, FAULT_NO_HOLE, FAULT_GROUPS };

/* A header column by its name, without regard to case, or -1. */
static long header_find(const corax_row *header, const char *name)
{
    for (size_t i = 0; i < header->count; i++)
        if (strcasecmp(header->field[i], name) == 0)
            return (long)i;
    return -1;
}

/* Find the columns of one table in its header: FAULT_NONE, or the fault
 * that keeps it from the job (said by say_fault()). */
static int find_columns(const stereo_opts *o, const corax_row *header, columns *col)
{
    col->dip = header_find(header, "dip");
    col->dip_direction = header_find(header, "dip_direction");
    col->trend = header_find(header, "trend");
    col->plunge = header_find(header, "plunge");
    col->hole_azimuth = header_find(header, "hole_azimuth");
    col->hole_plunge = header_find(header, "hole_plunge");
    col->alpha = header_find(header, "alpha");
    col->group = o->p->group_by ? header_find(header, o->p->group_by) : -1;
    col->hole_dip = header_find(header, "hole_dip") >= 0;
    if (o->p->group_by && col->group < 0)
        return FAULT_GROUP_BY;
    for (size_t i = 0; i < o->p->nwhere; i++)
        if ((col->where[i] = header_find(header, o->p->where[i].column)) < 0) {
            col->missing_where = i;
            return FAULT_WHERE;
        }
    int planes = col->dip >= 0 && col->dip_direction >= 0;
    int lines = col->trend >= 0 && col->plunge >= 0;
    if (!planes && !lines)
        return FAULT_NO_ANGLES;
    if (!planes)
        col->dip = col->dip_direction = -1;
    if (!lines)
        col->trend = col->plunge = -1;
    if (o->p->style.weighted && planes && (col->hole_azimuth < 0 || col->hole_plunge < 0))
        return FAULT_NO_HOLE;
    return FAULT_NONE;
}

/* Say a fault of a table (its row `line` for FAULT_GROUPS): usage errors
 * for unknown --group-by and --where names, data errors for the rest. */
static int say_fault(const stereo_opts *o, const char *path, const columns *col, int fault,
                     long line)
{
    switch (fault) {
    case FAULT_GROUP_BY:
        job_usage(o->job, "--group-by: %s has no column '%s'", path, o->p->group_by);
        return JOB_USAGE;
    case FAULT_WHERE:
        job_usage(o->job, "--where: %s has no column '%s'", path,
                  o->p->where[col->missing_where].column);
        return JOB_USAGE;
    case FAULT_NO_ANGLES:
        job_error(o->job, path, 1,
                  "no dip and dip_direction columns, nor trend and plunge (is this "
                  "corax convert output?)");
        break;
    case FAULT_NO_HOLE:
        job_error(o->job, path, 1, "--terzaghi needs the hole_azimuth and hole_plunge columns%s",
                  col->hole_dip
                      ? " (this table gives hole_dip, whose dip convention it does not state: "
                  "convert it again with this corax)"
                      : "");
        break;
    default:
        job_error(o->job, path, line,
                  "more than %d groups by %s: "
                  "filter with --where or group by another column", MAX_GROUPS, o->p->group_by);
    }
    return JOB_FAILED;
}

/* open_table()'s outcome for an empty file: a warning, and nothing to read. */
enum { TABLE_EMPTY = -1 };

/* Open a table and read its header: 0 with s ready for the rows, TABLE_EMPTY,
 * or JOB_FAILED, the error said. */
static int open_table(const stereo_opts *o, const char *path, source *s)
{
    corax_error err;
    corax_error_clear(&err);
    s->path = path;
    corax_status st = corax_reader_open(path, o->p->format, &s->reader, &err);
    if (st == CORAX_OK && (st = corax_reader_next(s->reader, &s->row, &err)) == CORAX_END) {
        if (strcmp(path, "-") != 0) {
            job_warning(o->job, path, 0, "the file is empty");
            return TABLE_EMPTY;
        }
        st = corax_error_set(&err, CORAX_EFORMAT, path, 1, "the file is empty (no header row)");
    }
    if (st == CORAX_OK && (st = corax_header_check(&s->row, &err)) != CORAX_OK)
        corax_error_file(&err, path);
    if (st != CORAX_OK) {
        job_error_record(o->job, &err, st);
        return JOB_FAILED;
    }
    corax_table_info info;
    corax_reader_info(s->reader, &info);
    s->decimal = info.format.decimal;
    s->width = s->row.count;
    return 0;
}

/* Read one table's rows into the groups. A fault of its columns or of a row
 * that stops the job is said after the table has been read to its end, and
 * the rows' faults before it, so that a table that cannot be read is refused
 * with that alone, as when tables were read whole. */
static int read_rows(const stereo_opts *o, groups *gs, source *s, columns *col, int fault)
{
    corax_stage stage;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = CORAX_OK;
    long line = 0;
    size_t rows = 0;
    int rc = 0;
    job_stage_begin(o->job, &stage, s->path, "bytes", job_file_size(s->path));
    while (rc == 0 && (st = corax_reader_next(s->reader, &s->row, &err)) == CORAX_OK) {
        if (++rows % 65536 == 0)
            job_stage_step(o->job, &stage, (double)corax_reader_offset(s->reader));
        if (fault || !keep_row(o, s, col))
            continue;
        if ((rc = read_row(o, gs, s, col)) != 0 && gs->full) {
            fault = FAULT_GROUPS;
            line = s->row.line;
            rc = 0;
        }
    }
    job_stage_end(o->job, &stage);
    if (rc == 0 && st != CORAX_END) {
        held_end(gs, s->path, 0);
        job_error_record(o->job, &err, st);
        return JOB_FAILED;
    }
    held_end(gs, s->path, rc == 0);
    return rc == 0 && fault ? say_fault(o, s->path, col, fault, line) : rc;
}

static int read_table(const stereo_opts *o, const char *path, groups *gs)
{
    source s = {0};
    long where[o->p->nwhere + 1];
    columns col = {.where = where};
    int rc = open_table(o, path, &s);
    if (rc == 0)
        rc = read_rows(o, gs, &s, &col, find_columns(o, &s.row, &col));
    corax_reader_close(s.reader);
    return rc == TABLE_EMPTY ? 0 : rc;
}

static void groups_free(groups *gs)
{
    for (size_t i = 0; i < gs->count; i++)
        free(gs->item[i].name);
    free(gs->item);
    for (int k = 0; k < KINDS; k++) {
        free(gs->kind[k].item);
        free(gs->kind[k].weight);
        free(gs->kind[k].group);
    }
}

static int group_cmp(const void *a, const void *b)
{
    return strcmp(((const group *)a)->name, ((const group *)b)->name);
}

/* Move a kind's readings, in place, each to its group's slice in the order
 * read: next[id] is where the next reading of group number id goes (moved
 * on). 0 when out of memory. */
static int put_in_order(kept *k, size_t *next)
{
    size_t *to = malloc((k->n ? k->n : 1) * sizeof *to);
    if (!to)
        return 0;
    for (size_t i = 0; i < k->n; i++)
        to[i] = next[k->group[i]]++;
    unsigned char swap[sizeof(corax_net_circle)];
    for (size_t i = 0; i < k->n; i++)
        while (to[i] != i) { /* reading i to its place j, j's to i: one placed a turn */
            size_t j = to[i];
            char *a = (char *)k->item + i * k->size, *b = (char *)k->item + j * k->size;
            memcpy(swap, a, k->size);
            memcpy(a, b, k->size);
            memcpy(b, swap, k->size);
            if (k->weighted) {
                double w = k->weight[i];
                k->weight[i] = k->weight[j];
                k->weight[j] = w;
            }
            to[i] = to[j];
            to[j] = j;
        }
    free(to);
    return 1;
}

/* Sort the groups by name and put every kind's readings in their order,
 * each group's slice found. 0 when out of memory. */
static int order_groups(groups *gs)
{
    qsort(gs->item, gs->count, sizeof *gs->item, group_cmp);
    size_t next[MAX_GROUPS];
    for (int k = 0; k < KINDS; k++) {
        size_t at = 0;
        for (size_t i = 0; i < gs->count; i++) {
            group *g = &gs->item[i];
            g->start[k] = next[g->id] = at;
            at += g->count[k];
        }
        kept *kp = &gs->kind[k];
        if (gs->count > 1 && !put_in_order(kp, next))
            return 0;
        free(kp->group);
        kp->group = NULL;
    }
    return 1;
}

/* A group's slice of a kind's readings, and of their weights (NULL when
 * unweighted). */
static const void *slice(const groups *gs, const group *g, int kind)
{
    const kept *k = &gs->kind[kind];
    return k->item ? (const char *)k->item + g->start[kind] * k->size : NULL;
}

static const double *slice_weight(const groups *gs, const group *g, int kind)
{
    const kept *k = &gs->kind[kind];
    return k->weighted && k->weight ? k->weight + g->start[kind] : NULL;
}

/* ---- statistics ---- */

static int summarise(const stereo_opts *o, groups *gs)
{
    if (gs->count == 0 && !find_group(gs, "all", 3))
        return out_of_memory(o->job);
    if (!order_groups(gs))
        return out_of_memory(o->job);
    for (size_t i = 0; i < gs->count; i++) {
        group *g = &gs->item[i];
        if (corax_axial_summary_compute(slice(gs, g, POLES), slice_weight(gs, g, POLES),
                                        g->count[POLES], &g->pole_summary) != CORAX_OK ||
            corax_axial_summary_compute(slice(gs, g, LINES), NULL, g->count[LINES],
                                        &g->line_summary) != CORAX_OK) {
            job_error(o->job, NULL, 0, "group %s: the statistics failed (out of memory?)", g->name);
            return JOB_FAILED;
        }
    }
    return 0;
}

static const char stats_header[] =
    "group,data,n,n_weighted,rows_skipped,mean_dip,mean_dip_direction,mean_trend,mean_plunge,"
    "kappa,alpha95,eigenvalue1,eigenvalue2,eigenvalue3,axis1_trend,axis1_plunge,axis2_trend,"
    "axis2_plunge,axis3_trend,axis3_plunge,shape_k,strength_c,note\n";

static void write_angle_pair(corax_writer *w, double azimuth, double angle)
{
    corax_writer_number(w, corax_deg(angle), 2);
    corax_writer_azimuth(w, corax_deg(azimuth), 2);
}

static void write_stats_row(corax_writer *w, const group *g, const corax_axial_summary *s,
                            int planes)
{
    const corax_fisher *f = &s->fisher;
    corax_writer_field(w, g->name, strlen(g->name));
    corax_writer_field(w, planes ? "planes" : "lines", planes ? 6 : 5);
    corax_writer_integer(w, (long long)s->n);
    corax_writer_number(w, s->weight_sum, 3);
    corax_writer_integer(w, (long long)g->skipped);
    double trend = NAN, plunge = NAN;
    corax_plane p = {NAN, NAN};
    if (s->n) {
        corax_line_trend_plunge(f->mean, &trend, &plunge);
        if (planes)
            p = corax_plane_from_normal(f->mean, NULL);
    }
    write_angle_pair(w, p.dip_direction, p.dip); /* mean_dip, mean_dip_direction */
    if (planes) /* a plane's mean is its dip and dip direction: no trend and plunge */
        trend = plunge = NAN;
    corax_writer_azimuth(w, corax_deg(trend), 2);
    corax_writer_number(w, corax_deg(plunge), 2);
    corax_writer_number(w, isinf(f->kappa) ? (double)NAN : f->kappa, 2);
    corax_writer_number(w, corax_deg(f->alpha95), 2);
    for (int k = 0; k < 3; k++)
        corax_writer_number(w, s->tensor.eigenvalue[k], 4);
    for (int k = 0; k < 3; k++) {
        double at = NAN, ap = NAN;
        if (s->n >= 2 || (s->n == 1 && k == 0)) /* one reading: only axis 1 means anything */
            corax_line_trend_plunge(s->tensor.axis[k], &at, &ap);
        corax_writer_azimuth(w, corax_deg(at), 2);
        corax_writer_number(w, corax_deg(ap), 2);
    }
    corax_writer_number(w, s->tensor.shape, 3);
    corax_writer_number(w, s->tensor.strength, 3);
    const char *note = "";
    if (s->n == 0)
        note = "no readings";
    else if (s->n < CORAX_FISHER_MIN_READINGS)
        note = "too few readings for kappa and alpha95 (3 needed)";
    else if (isinf(f->kappa))
        note = "readings identical: kappa unbounded";
    corax_writer_field(w, note, strlen(note));
    corax_writer_end_row(w);
}

static corax_writer *stats_table(const stereo_opts *o, const groups *gs)
{
    corax_writer *w = job_output(o->job, o->p->stats, NULL);
    if (!w)
        return NULL;
    corax_writer_text(w, stats_header, sizeof stats_header - 1);
    for (size_t i = 0; i < gs->count; i++) {
        const group *g = &gs->item[i];
        /* a group with nothing still gets its row, n 0 */
        if (g->count[POLES] || !g->count[LINES])
            write_stats_row(w, g, &g->pole_summary, 1);
        if (g->count[LINES])
            write_stats_row(w, g, &g->line_summary, 0);
    }
    return w;
}

/* ---- the net ---- */

static corax_svg *draw(const stereo_opts *o, const groups *gs, char *title)
{
    corax_net_set *sets = calloc(gs->count, sizeof *sets);
    if (!sets)
        return NULL;
    for (size_t i = 0; i < gs->count; i++) {
        const group *g = &gs->item[i];
        sets[i] = (corax_net_set){.name = g->name, .poles = slice(gs, g, POLES),
                                  .pole_weight = slice_weight(gs, g, POLES),
                                  .npoles = g->count[POLES], .lines = slice(gs, g, LINES),
                                  .nlines = g->count[LINES], .pole_summary = &g->pole_summary,
                                  .line_summary = &g->line_summary, .skipped = g->skipped,
                                  .circles = slice(gs, g, CIRCLES),
                                  .ncircles = g->count[CIRCLES]};
    }
    corax_net_style style = o->p->style;
    style.title = title;
    style.min_angle = corax_rad(o->p->min_angle);
    corax_svg *svg = NULL;
    corax_status st = corax_stereonet_page(sets, gs->count, &style, o->p->net_per_group, &svg);
    free(sets);
    if (st != CORAX_OK)
        job_error(o->job, NULL, 0, "cannot draw the net: %s", corax_strerror(st));
    return svg;
}

static void default_title(const stereo_opts *o, int nfiles, const char *const *files,
                          char *title, size_t len)
{
    if (o->p->title) {
        snprintf(title, len, "%s", o->p->title);
        return;
    }
    const char *base = strrchr(files[0], '/');
    base = base ? base + 1 : files[0];
    size_t used = (size_t)snprintf(title, len, "Stereonet of %s", base);
    if (nfiles > 1 && used < len)
        used += (size_t)snprintf(title + used, len - used, " and %d more", nfiles - 1);
    if (o->p->group_by && used < len)
        snprintf(title + used, len - used, ", by %s", o->p->group_by);
}

static void record(corax_record *a, const stereo_opts *o, int nfiles, const char *const *files,
                   const groups *gs)
{
    corax_record_section(a, "stereonet");
    for (int i = 0; i < nfiles; i++)
        corax_record_set(a, "input", "%s", files[i]);
    corax_record_set(a, "hemisphere", "lower");
    corax_record_set(a, "projection", "%s", corax_projection_name(o->p->style.projection));
    corax_record_set(a, "planes", "%s", o->p->style.planes == 1 ? "poles" : o->p->style.planes == 2
                                                                       ? "great circles"
                                                                       : "poles and great circles");
    if (o->p->style.contours)
        corax_record_set(a, "contours", "%s, interval %g sigma; %s",
                         o->p->style.density == CORAX_DENSITY_SMOOTH
                          ? "modified Kamb, exponential smoothing (Vollmer 1995), k = 2 (1 + n/9)"
                          : "Kamb (1959) counting, cap of area 9/(n + 9) of the hemisphere",
                         o->p->style.contour_step, "a uniform sample reads 3 sigma");
    else
        corax_record_set(a, "contours", "none");
    corax_record_set(a, "group_by", "%s", o->p->group_by ? o->p->group_by : "(one group: all)");
    for (size_t i = 0; i < o->p->nwhere; i++)
        corax_record_set(a, "where", "%s = %s (without regard to case)", o->p->where[i].column,
                         o->p->where[i].value);
    if (o->p->style.weighted)
        corax_record_set(a, "weighting", "Terzaghi (1965), 1/|cos| of the angle between the pole "
                         "and the hole, capped at a minimum angle of %g degrees between hole and "
                         "plane; planes only, lines unweighted; weights rescaled to sum to n for "
                         "the mean, cone, tensor and density; n_weighted is their sum as given",
                         o->p->min_angle);
    else
        corax_record_set(a, "weighting", "none");
    corax_record_set(a, "statistics", "Fisher (1953) mean, kappa and alpha95 of the readings "
                     "turned to the side of principal axis 1 (axial data); none below %d readings; "
                     "orientation tensor eigenvalues normalised to sum to 1; Woodcock (1977) "
                     "K = ln(S1/S2)/ln(S2/S3), C = ln(S1/S3)", CORAX_FISHER_MIN_READINGS);
    if (o->p->stats)
        corax_record_set(a, "stats", "%s", o->p->stats);
    corax_record_set(a, "rows_skipped", "%zu (no usable angles)", gs->skipped);
}

static int run(const stereo_opts *o, int nfiles, const char *const *files,
               corax_stereonet_job_summary *sum)
{
    groups gs = {0};
    gs.job = o->job;
    gs.kind[POLES] = (kept){.size = sizeof(corax_vec3), .weighted = o->p->style.weighted};
    gs.kind[LINES] = (kept){.size = sizeof(corax_vec3)};
    gs.kind[CIRCLES] = (kept){.size = sizeof(corax_net_circle)};
    int rc = 0;
    for (int i = 0; i < nfiles && rc == 0; i++)
        rc = read_table(o, files[i], &gs);
    if (rc == 0 && job_problems_end(o->job, &gs.problems, "the converted tables") != CORAX_OK)
        rc = JOB_FAILED;
    if (rc == 0)
        rc = summarise(o, &gs);
    if (rc == 0 && gs.skipped)
        job_note(o->job, "%zu row%s without angles skipped", gs.skipped,
                 gs.skipped == 1 ? "" : "s");
    char title[256];
    default_title(o, nfiles, files, title, sizeof title);
    corax_writer *stats = NULL;
    corax_svg *svg = NULL;
    if (rc == 0 && o->p->stats && !(stats = stats_table(o, &gs)))
        rc = JOB_FAILED;
    if (rc == 0)
        job_phase(o->job, "drawing");
    if (rc == 0 && !(svg = draw(o, &gs, title)))
        rc = JOB_FAILED;
    corax_error err;
    corax_error_clear(&err);
    corax_status st = CORAX_OK;
    if (rc == 0 && (st = corax_svg_save(svg, o->job->outputs, o->output, &err)) == CORAX_OK &&
        stats) {
        st = corax_writer_commit(stats, &err);
        stats = NULL;
    }
    if (st != CORAX_OK) {
        job_error_record(o->job, &err, st);
        rc = JOB_FAILED;
    }
    corax_writer_discard(stats);
    corax_svg_free(svg);
    if (rc == 0) {
        record(o->job->record, o, nfiles, files, &gs);
        sum->groups = gs.count;
        sum->skipped = gs.skipped;
    }
    groups_free(&gs);
    return rc;
}

corax_stereonet_job_options corax_stereonet_job_options_default(void)
{
    corax_stereonet_job_options o;
    memset(&o, 0, sizeof o);
    o.style = corax_net_style_default();
    o.min_angle = 15.0;
    o.format = (corax_table_format){0, CORAX_DECIMAL_EITHER};
    return o;
}

corax_status corax_stereonet_job_run(corax_job *job, const corax_stereonet_job_options *options,
                                     const char *const *inputs, size_t ninputs,
                                     const char *output, corax_stereonet_job_summary *sum)
{
    stereo_opts o = {job, options, output};
    memset(sum, 0, sizeof *sum);
    if (!ninputs) {
        job_usage(job, "no input: name one or more converted tables");
        return CORAX_EARG;
    }
    return job_status(run(&o, (int)ninputs, inputs, sum));
}
