/* io: the tables of a drill plan (planned holes, sets, target planes). Row
 * faults become findings and the rest of the table is still read. */
#include <math.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "common/grow.h"
#include "corax/plan_load.h"
#include "io/fields.h"

corax_plan_load_options corax_plan_load_options_default(void)
{
    corax_plan_load_options o = {corax_table_format_default(), NULL, CORAX_DIP_NEGATIVE_DOWN};
    return o;
}

/* One row being read: its fields, columns and format, and why it failed. */
typedef struct row_in {
    const corax_row *row;
    const long *col;
    const corax_plan_load_options *o;
    char why[200];
} row_in;

/* Column k as a number in [lo, hi]. An optional column (fallback not NaN)
 * that is absent or empty gives the fallback. 1 ok, 0 with why filled. */
static int number(row_in *r, size_t k, const char *name, double lo, double hi, double fallback,
                  double *v)
{
    if (r->col[k] < 0 && !isnan(fallback)) {
        *v = fallback;
        return 1;
    }
    corax_number_status st =
        corax_field_number(r->row, r->col[k], r->o->format.decimal, name, v, r->why, sizeof r->why);
    if (st == CORAX_NUMBER_EMPTY && !isnan(fallback)) {
        *v = fallback;
        return 1;
    }
    return st == CORAX_NUMBER_OK && corax_field_in_range(*v, lo, hi, name, r->why, sizeof r->why);
}

/* x, y, z from columns k, k + 1, k + 2. */
static int point(row_in *r, size_t k, corax_vec3 *p)
{
    return number(r, k, "x", -HUGE_VAL, HUGE_VAL, NAN, &p->x) &&
           number(r, k + 1, "y", -HUGE_VAL, HUGE_VAL, NAN, &p->y) &&
           number(r, k + 2, "z", -HUGE_VAL, HUGE_VAL, NAN, &p->z);
}

/* A plane from dip and dip direction in columns k and k + 1. */
static int plane(row_in *r, size_t k, corax_plane *p)
{
    double dip, dd;
    if (!number(r, k, "dip", 0, 90, NAN, &dip) ||
        !number(r, k + 1, "dip_direction", 0, 360, NAN, &dd))
        return 0;
    *p = (corax_plane){corax_rad(dip), corax_rad(corax_wrap_degrees(dd, 9))};
    return 1;
}

static const char *const hole_columns[] = {"hole", "x", "y", "z", "azimuth", "dip",
                                           "length", "lift", "drift"};

static int hole_row(row_in *r, void *item)
{
    corax_plan_hole *h = item;
    double az, dip, lift, drift;
    if (!point(r, 1, &h->collar) || !number(r, 4, "azimuth", 0, 360, NAN, &az) ||
        !number(r, 5, "dip", -HUGE_VAL, HUGE_VAL, NAN, &dip))
        return 0;
    if (corax_dip_to_plunge(dip, r->o->dip_convention, &h->plunge) != CORAX_OK) {
        snprintf(r->why, sizeof r->why, "dip %g is outside the range of the dip convention "
                 "(see --dip-convention)", dip);
        return 0;
    }
    if (!number(r, 6, "length", 0, CORAX_PLAN_MAX_LENGTH, NAN, &h->length) ||
        !number(r, 7, "lift", -30, 30, 0.0, &lift) || !number(r, 8, "drift", -30, 30, 0.0, &drift))
        return 0;
    if (!(h->length > 0.0)) {
        snprintf(r->why, sizeof r->why, "length %g is not above 0", h->length);
        return 0;
    }
    h->azimuth = corax_rad(az);
    h->lift = corax_rad(lift);
    h->drift = corax_rad(drift);
    return 1;
}

static const char *const set_columns[] = {"set", "dip", "dip_direction", "kappa", "cone95",
                                          "weight"};

static int set_row(row_in *r, void *item)
{
    corax_plan_set *s = item;
    double cone;
    if (!plane(r, 1, &s->plane) || !number(r, 3, "kappa", 1e-6, 1e12, INFINITY, &s->kappa) ||
        !number(r, 4, "cone95", 1e-6, 90, INFINITY, &cone) ||
        !number(r, 5, "weight", 1e-9, 1e9, 1.0, &s->weight))
        return 0;
    if (isfinite(cone) && isfinite(s->kappa)) {
        snprintf(r->why, sizeof r->why, "give kappa or cone95 for a set's spread, not both");
        return 0;
    }
    if (isfinite(cone))
        s->kappa = corax_plan_kappa_of_cone(corax_rad(cone), 0.95);
    if (isnan(s->kappa)) {
        snprintf(r->why, sizeof r->why, "cone95 %g holds 95%% of no Fisher spread", cone);
        return 0;
    }
    return 1;
}

static const char *const target_columns[] = {"target", "x", "y", "z", "dip", "dip_direction"};

static int target_row(row_in *r, void *item)
{
    corax_plan_target *t = item;
    return point(r, 1, &t->point) && plane(r, 4, &t->plane);
}

/* How one table is laid out. */
typedef struct table_kind {
    const char *check;          /* the findings' check */
    const char *what;           /* "planned hole", for messages */
    const char *const *columns; /* the name column first */
    size_t ncolumns, required;
    size_t size;                /* bytes per item */
    size_t name_at, line_at;    /* offsets of its `const char *name` and `long line` */
    int (*parse)(row_in *r, void *item);
} table_kind;

static void name_item(const table_kind *k, void *item, char *name, long line)
{
    memcpy((char *)item + k->name_at, &name, sizeof name);
    memcpy((char *)item + k->line_at, &line, sizeof line);
}

static const char *item_name(const table_kind *k, const void *items, size_t i)
{
    const char *name;
    memcpy(&name, (const char *)items + i * k->size + k->name_at, sizeof name);
    return name;
}

static long item_line(const table_kind *k, const void *items, size_t i)
{
    long line;
    memcpy(&line, (const char *)items + i * k->size + k->line_at, sizeof line);
    return line;
}

/* Report every name that appears again. */
static corax_status repeated_names(const table_kind *k, const char *path, const void *items,
                                   size_t n, corax_findings *problems)
{
    corax_status st = CORAX_OK;
    for (size_t i = 1; i < n && st == CORAX_OK; i++)
        for (size_t j = 0; j < i; j++)
            if (strcmp(item_name(k, items, i), item_name(k, items, j)) == 0) {
                st = corax_findings_add(problems, CORAX_ERROR, k->check, path,
                                        item_line(k, items, i), NULL, NAN,
                                        "%s %s appears twice (lines %ld and %ld)", k->what,
                                        item_name(k, items, i), item_line(k, items, j),
                                        item_line(k, items, i));
                break;
            }
    return st;
}

static corax_status read_table(const table_kind *k, const char *path,
                               const corax_plan_load_options *o, void **items, size_t *count,
                               corax_findings *problems, corax_error *err)
{
    long col[16];
    size_t width, cap = *count;
    corax_reader *rd;
    corax_status st = corax_reader_open(path, o->format, &rd, err);
    if (st != CORAX_OK)
        return st;
    st = corax_table_header(rd, k->columns, k->ncolumns, k->required, o->columns, col, &width,
                            NULL, err);
    corax_row row;
    while (st == CORAX_OK && (st = corax_reader_next(rd, &row, err)) == CORAX_OK) {
        row_in r = {&row, col, o, ""};
        size_t nl;
        const char *name = corax_field_text(&row, col[0], &nl);
        char *item = corax_grow(*items, *count, &cap, k->size, 16);
        if (!item) {
            st = CORAX_ENOMEM;
            break;
        }
        *items = item;
        item += *count * k->size;
        memset(item, 0, k->size);
        int ok = !corax_field_ragged(&row, width, r.why, sizeof r.why);
        if (ok && nl == 0) {
            snprintf(r.why, sizeof r.why, "the %s name is empty", k->what);
            ok = 0;
        }
        if (ok && k->parse(&r, item)) {
            char *own = strndup(name, nl);
            if (!own) {
                st = CORAX_ENOMEM;
                break;
            }
            name_item(k, item, own, row.line);
            (*count)++;
            continue;
        }
        st = corax_findings_add(problems, CORAX_ERROR, k->check, path, row.line, NULL, NAN,
                                "%s", r.why);
    }
    corax_reader_close(rd);
    if (st == CORAX_END)
        st = repeated_names(k, path, *items, *count, problems);
    return st;
}

corax_status corax_plan_holes_load(const char *path, const corax_plan_load_options *o,
                                   corax_plan_inputs *in, corax_findings *problems,
                                   corax_error *err)
{
    static const table_kind k = {"plan-hole-row", "planned hole", hole_columns, 9, 7,
                                 sizeof(corax_plan_hole), offsetof(corax_plan_hole, name),
                                 offsetof(corax_plan_hole, line), hole_row};
    void *items = in->holes;
    corax_status st = read_table(&k, path, o, &items, &in->nholes, problems, err);
    in->holes = items;
    return st;
}

corax_status corax_plan_sets_load(const char *path, const corax_plan_load_options *o,
                                  corax_plan_inputs *in, corax_findings *problems,
                                  corax_error *err)
{
    static const table_kind k = {"plan-set-row", "set", set_columns, 6, 3,
                                 sizeof(corax_plan_set), offsetof(corax_plan_set, name),
                                 offsetof(corax_plan_set, line), set_row};
    void *items = in->sets;
    corax_status st = read_table(&k, path, o, &items, &in->nsets, problems, err);
    in->sets = items;
    return st;
}

corax_status corax_plan_targets_load(const char *path, const corax_plan_load_options *o,
                                     corax_plan_inputs *in, corax_findings *problems,
                                     corax_error *err)
{
    static const table_kind k = {"plan-target-row", "target", target_columns, 6, 6,
                                 sizeof(corax_plan_target), offsetof(corax_plan_target, name),
                                 offsetof(corax_plan_target, line), target_row};
    void *items = in->targets;
    corax_status st = read_table(&k, path, o, &items, &in->ntargets, problems, err);
    in->targets = items;
    return st;
}

void corax_plan_inputs_free(corax_plan_inputs *in)
{
    for (size_t i = 0; i < in->nholes; i++)
        free((char *)in->holes[i].name);
    for (size_t i = 0; i < in->nsets; i++)
        free((char *)in->sets[i].name);
    for (size_t i = 0; i < in->ntargets; i++)
        free((char *)in->targets[i].name);
    free(in->holes);
    free(in->sets);
    free(in->targets);
    memset(in, 0, sizeof *in);
}
