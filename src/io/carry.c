/* io: carrying input columns through to an output table, by name, from one
 * or several tables. */
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "io/carry.h"

typedef struct carry_table {
    long *col;  /* input column of each carried column known when it was added */
    size_t n;
} carry_table;

struct corax_carry {
    const char *const *drop;
    size_t ndrop;
    char **name;
    size_t nname, name_cap;
    carry_table *table;
    size_t ntable;
};

corax_carry *corax_carry_new(const char *const *drop, size_t ndrop)
{
    corax_carry *c = calloc(1, sizeof *c);
    if (c) {
        c->drop = drop;
        c->ndrop = ndrop;
    }
    return c;
}

void corax_carry_free(corax_carry *c)
{
    if (!c)
        return;
    for (size_t i = 0; i < c->nname; i++)
        free(c->name[i]);
    free(c->name);
    for (size_t i = 0; i < c->ntable; i++)
        free(c->table[i].col);
    free(c->table);
    free(c);
}

static int dropped(const corax_carry *c, const corax_row *h, size_t i, const long *consumed,
                   size_t nconsumed)
{
    for (size_t k = 0; k < nconsumed; k++)
        if (consumed[k] == (long)i)
            return 1;
    for (size_t k = 0; k < c->ndrop; k++)
        if (strcasecmp(h->field[i], c->drop[k]) == 0)
            return 1;
    return 0;
}

static long name_index(const corax_carry *c, const char *name)
{
    if (!*name) /* columns without a name match nothing: each is kept apart */
        return -1;
    for (size_t i = 0; i < c->nname; i++)
        if (strcasecmp(c->name[i], name) == 0)
            return (long)i;
    return -1;
}

static int add_name(corax_carry *c, const char *name)
{
    char **p = corax_grow(c->name, c->nname, &c->name_cap, sizeof *p, 16);
    if (!p)
        return 0;
    c->name = p;
    if (!(c->name[c->nname] = strdup(name)))
        return 0;
    c->nname++;
    return 1;
}

/* The next column without a name at or after *from (added by this table). */
static size_t next_unnamed(const corax_carry *c, size_t *from)
{
    while (c->name[*from][0])
        (*from)++;
    return (*from)++;
}

long corax_carry_add(corax_carry *c, const corax_row *h, const long *consumed, size_t nconsumed)
{
    carry_table *t = realloc(c->table, (c->ntable + 1) * sizeof *t);
    if (!t)
        return -1;
    c->table = t;
    t = &c->table[c->ntable];
    t->n = 0;
    t->col = NULL;
    size_t first_new = c->nname;
    for (size_t i = 0; i < h->count; i++)
        if (!dropped(c, h, i, consumed, nconsumed) && name_index(c, h->field[i]) < 0 &&
            !add_name(c, h->field[i]))
            return -1;
    t->col = malloc((c->nname ? c->nname : 1) * sizeof *t->col);
    if (!t->col)
        return -1;
    t->n = c->nname;
    for (size_t k = 0; k < t->n; k++)
        t->col[k] = -1;
    size_t unnamed = first_new;
    for (size_t i = 0; i < h->count; i++) {
        if (dropped(c, h, i, consumed, nconsumed))
            continue;
        long k = h->field[i][0] ? name_index(c, h->field[i]) : (long)next_unnamed(c, &unnamed);
        t->col[k] = (long)i;
    }
    return (long)c->ntable++;
}

size_t corax_carry_count(const corax_carry *c) { return c->nname; }

void corax_carry_header(const corax_carry *c, corax_writer *w)
{
    for (size_t i = 0; i < c->nname; i++)
        corax_writer_field(w, c->name[i], strlen(c->name[i]));
}

const char *corax_carry_name(const corax_carry *c, size_t i) { return c->name[i]; }

const char *corax_carry_value(const corax_carry *c, long table, const corax_row *row, size_t k,
                              size_t *length)
{
    const carry_table *t = &c->table[table];
    long i = k < t->n ? t->col[k] : -1;
    if (i >= 0 && (size_t)i < row->count) {
        *length = row->length[i];
        return row->field[i];
    }
    *length = 0;
    return "";
}

void corax_carry_row(const corax_carry *c, long table, const corax_row *row, corax_writer *w)
{
    for (size_t k = 0; k < c->nname; k++) {
        size_t n;
        const char *v = corax_carry_value(c, table, row, k, &n);
        corax_writer_field(w, v, n);
    }
}
