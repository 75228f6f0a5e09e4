/* io: the logical columns corax reads, their usual header names, and the
 * user's mapping of other names onto them. */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/table.h"

/* Each logical column with the header names accepted for it without a
 * mapping (the logical name first) and what it holds. Matching ignores case,
 * and a space, an underscore, a hyphen and a full stop count as the same
 * mark, so "Hole ID", "hole_id" and "HOLE-ID" are one name. Spellings are
 * the trade's common ones; a name that could mean another convention (an
 * "inclination" that may run from vertical) is never taken for granted. */
enum { NALIAS = 10 };
static const struct {
    const char *name[NALIAS];
    const char *meaning;
} known[] = {
    {{"hole", "hole_id", "holeid", "hole_name", "hole_no", "hole_number", "drillhole",
      "drill_hole", "drillhole_id", NULL}, "the hole's name"},
    {{"x", "east", "easting", "x_coord", "collar_x", "collar_east", NULL}, "east coordinate"},
    {{"y", "north", "northing", "y_coord", "collar_y", "collar_north", NULL},
     "north coordinate"},
    {{"z", "elevation", "elev", "rl", "collar_rl", "collar_z", "collar_elevation",
      "reduced_level", NULL}, "elevation (up positive)"},
    {{"azimuth", "azi", "az", "azim", "bearing", NULL}, "azimuth, degrees from north"},
    {{"dip", NULL}, "dip of the hole, in the table's dip convention"},
    {{"length", "hole_length", "total_depth", "eoh", "max_depth", "final_depth", "td", NULL},
     "the hole's length"},
    {{"depth", "md", "measured_depth", "depth_m", "at_depth", NULL},
     "depth along the hole from the collar"},
    {{"alpha", "alpha_angle", NULL}, "alpha: angle of a plane to the core axis"},
    {{"beta", "beta_angle", NULL}, "beta: angle around the core from the orientation line"},
    {{"gamma", "gamma_angle", NULL}, "gamma: angle of a line within its plane"},
    {{"line_alpha", NULL}, "a line's angle to the core axis"},
    {{"line_beta", NULL}, "a line's angle around the core from the orientation line"},
    {{"kind", "feature", "type", "structure", "structure_type", "feature_type", NULL},
     "the kind of feature (bedding, vein, ...) or its code"},
    {{"confidence", "orientation_confidence", "orientation_quality", NULL},
     "the orientation's confidence (good, fair, poor) or its code"},
    {{"from", "depth_from", "from_m", "from_depth", NULL}, "start of an interval (depth)"},
    {{"to", "depth_to", "to_m", "to_depth", NULL}, "end of an interval (depth)"},
    {{"alpha_error", NULL}, "1-sigma error of alpha, degrees"},
    {{"beta_error", NULL}, "1-sigma error of beta, degrees"},
    {{"line_error", NULL}, "1-sigma error of the orientation line, degrees"},
    {{"depth_error", NULL}, "1-sigma error of the depth"},
    {{"azimuth_error", NULL}, "1-sigma error of a survey azimuth, degrees"},
    {{"dip_error", NULL}, "1-sigma error of a survey dip, degrees"},
    {{"dip_direction", NULL}, "a plane's dip direction, degrees"},
    {{"trend", NULL}, "a line's trend, degrees"},
    {{"plunge", NULL}, "a line's plunge, degrees down"},
    {{"status", NULL}, "corax's status of a row"},
    {{"polarity", "younging", NULL}, "younging: upright, overturned or unknown"},
    {{"use", NULL}, "a survey station to use (yes) or reject (no)"},
    {{"set", NULL}, "a set of structures (corax plan) or a marker read in several holes (corax solve)"},
    {{"target", NULL}, "a planned program's target plane (corax plan)"},
    {{"lift", NULL}, "a planned hole's expected lift, degrees per 30 m (corax plan)"},
    {{"drift", NULL}, "a planned hole's expected drift, degrees per 30 m (corax plan)"},
    {{"kappa", NULL}, "a set's Fisher concentration (corax plan)"},
    {{"cone95", NULL}, "a set's cone of 95% confidence, degrees (corax plan)"},
    {{"weight", NULL}, "a set's weight in the plan's score (corax plan)"},
};

enum { NKNOWN = sizeof known / sizeof known[0] };

typedef struct pair {
    char *logical, *actual;
} pair;

struct corax_column_map {
    pair *item;
    size_t count;
};

static long known_index(const char *logical, size_t len)
{
    for (long i = 0; i < NKNOWN; i++)
        if (strlen(known[i].name[0]) == len && strncasecmp(known[i].name[0], logical, len) == 0)
            return i;
    return -1;
}

const char *corax_column_at(size_t i, const char *const **aliases, const char **meaning)
{
    if (i >= NKNOWN)
        return NULL;
    if (aliases)
        *aliases = known[i].name + 1;
    if (meaning)
        *meaning = known[i].meaning;
    return known[i].name[0];
}

/* The mark that joins words of a header name, in any of its spellings. */
static int joiner(char c) { return c == ' ' || c == '_' || c == '-' || c == '.'; }

int corax_column_name_match(const char *a, size_t alen, const char *b, size_t blen)
{
    if (alen != blen)
        return 0;
    for (size_t i = 0; i < alen; i++) {
        char x = a[i], y = b[i];
        if (joiner(x) && joiner(y))
            continue;
        if (x >= 'A' && x <= 'Z')
            x = (char)(x - 'A' + 'a');
        if (y >= 'A' && y <= 'Z')
            y = (char)(y - 'A' + 'a');
        if (x != y)
            return 0;
    }
    return 1;
}

int corax_column_known(const char *logical)
{
    return known_index(logical, strlen(logical)) >= 0;
}

void corax_column_map_free(corax_column_map *map)
{
    if (!map)
        return;
    for (size_t i = 0; i < map->count; i++) {
        free(map->item[i].logical);
        free(map->item[i].actual);
    }
    free(map->item);
    free(map);
}

static corax_status map_put(corax_column_map *map, const char *logical, size_t llen,
                            const char *actual, size_t alen)
{
    for (size_t i = 0; i < map->count; i++)
        if (strlen(map->item[i].logical) == llen &&
            strncasecmp(map->item[i].logical, logical, llen) == 0) {
            char *a = strndup(actual, alen);
            if (!a)
                return CORAX_ENOMEM;
            free(map->item[i].actual);
            map->item[i].actual = a;
            return CORAX_OK;
        }
    pair *p = realloc(map->item, (map->count + 1) * sizeof *p);
    if (!p)
        return CORAX_ENOMEM;
    map->item = p;
    p[map->count].logical = strndup(logical, llen);
    p[map->count].actual = strndup(actual, alen);
    if (!p[map->count].logical || !p[map->count].actual) {
        free(p[map->count].logical);
        free(p[map->count].actual);
        return CORAX_ENOMEM;
    }
    map->count++;
    return CORAX_OK;
}

corax_status corax_column_map_merge(corax_column_map **mapp, const corax_column_map *from)
{
    if (!*mapp && !(*mapp = calloc(1, sizeof **mapp)))
        return CORAX_ENOMEM;
    for (size_t i = 0; from && i < from->count; i++) {
        const pair *q = &from->item[i];
        corax_status st = map_put(*mapp, q->logical, strlen(q->logical), q->actual,
                                  strlen(q->actual));
        if (st != CORAX_OK)
            return st;
    }
    return CORAX_OK;
}

static void trim(const char **s, const char **e)
{
    while (*s < *e && (**s == ' ' || **s == '\t'))
        (*s)++;
    while (*e > *s && ((*e)[-1] == ' ' || (*e)[-1] == '\t'))
        (*e)--;
}

corax_status corax_column_map_add(corax_column_map **mapp, const char *spec, corax_error *err)
{
    if (!*mapp && !(*mapp = calloc(1, sizeof **mapp)))
        return CORAX_ENOMEM;
    const char *s = spec;
    while (*s) {
        const char *end = strchr(s, ',');
        if (!end)
            end = s + strlen(s);
        const char *eq = memchr(s, '=', (size_t)(end - s));
        if (!eq)
            return corax_error_set(err, CORAX_EARG, NULL, 0,
                                   "column mapping '%.*s' is not NAME=HEADER", (int)(end - s), s);
        const char *ls = s, *le = eq, *as = eq + 1, *ae = end;
        trim(&ls, &le);
        trim(&as, &ae);
        if (known_index(ls, (size_t)(le - ls)) < 0)
            return corax_error_set(err, CORAX_EARG, NULL, 0,
                                   "column mapping: corax has no column called '%.*s'",
                                   (int)(le - ls), ls);
        if (ae == as)
            return corax_error_set(err, CORAX_EARG, NULL, 0,
                                   "column mapping for '%.*s' names no header", (int)(le - ls),
                                   ls);
        corax_status st = map_put(*mapp, ls, (size_t)(le - ls), as, (size_t)(ae - as));
        if (st != CORAX_OK)
            return st;
        s = *end ? end + 1 : end;
    }
    return CORAX_OK;
}

static long header_index(const corax_row *header, const char *name)
{
    size_t n = strlen(name);
    for (size_t i = 0; i < header->count; i++)
        if (corax_column_name_match(header->field[i], header->length[i], name, n))
            return (long)i;
    return -1;
}

const char *corax_column_mapped(const corax_column_map *map, const char *logical)
{
    for (size_t i = 0; map && i < map->count; i++)
        if (strcasecmp(map->item[i].logical, logical) == 0)
            return map->item[i].actual;
    return NULL;
}

long corax_column_find(const corax_row *header, const char *logical,
                       const corax_column_map *map)
{
    const char *mapped = corax_column_mapped(map, logical);
    if (mapped) { /* the user named it: that header or nothing */
        long c = header_index(header, mapped);
        return c >= 0 ? c : CORAX_COLUMN_MAPPED_MISSING;
    }
    long k = known_index(logical, strlen(logical));
    if (k < 0)
        return header_index(header, logical);
    for (int j = 0; j < NALIAS && known[k].name[j]; j++) {
        long i = header_index(header, known[k].name[j]);
        if (i >= 0)
            return i;
    }
    return -1;
}

typedef struct named {
    const char *name;
    size_t index;
} named;

/* Header fields in name order (case ignored), then column order. */
static int name_order(const void *a, const void *b)
{
    const named *x = a, *y = b;
    int c = strcasecmp(x->name, y->name);
    return c ? c : (x->index > y->index) - (x->index < y->index);
}

corax_status corax_header_check(const corax_row *header, corax_error *err)
{
    /* sorted, a repeated name sits next to itself: n log n, for the widest
     * tables too (a quadratic look took 46 s over 100,000 columns) */
    size_t n = header->count;
    named *order = malloc((n ? n : 1) * sizeof *order);
    if (!order)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < n; i++)
        order[i] = (named){header->field[i], i};
    qsort(order, n, sizeof *order, name_order);
    size_t first = n, second = n;
    for (size_t k = 1; k < n; k++) {
        const named *a = &order[k - 1], *b = &order[k];
        if (a->name[0] && strcasecmp(a->name, b->name) == 0 && a->index < first) {
            first = a->index;
            second = b->index;
        }
    }
    free(order);
    if (first == n)
        return CORAX_OK;
    return corax_error_set(err, CORAX_EFORMAT, NULL, header->line,
                           "column name '%s' appears twice in the header (columns %zu and %zu)",
                           header->field[first], first + 1, second + 1);
}
