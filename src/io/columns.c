/* io: the logical columns corax reads, their usual header names, and the
 * user's mapping of other names onto them. */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/table.h"

/* Each logical column with the header names accepted for it without a
 * mapping (the logical name first). Matching ignores case. */
static const char *const known[][6] = {
    {"hole", "hole_id", "holeid", "drillhole", NULL},
    {"x", "east", "easting", NULL},
    {"y", "north", "northing", NULL},
    {"z", "elevation", "elev", "rl", NULL},
    {"azimuth", "azi", "az", NULL},
    {"dip", NULL},
    {"length", "hole_length", "total_depth", "eoh", "max_depth", NULL},
    {"depth", "md", "measured_depth", NULL},
    {"alpha", NULL},
    {"beta", NULL},
    {"gamma", NULL},
    {"line_alpha", NULL},
    {"line_beta", NULL},
    {"kind", "feature", "type", "structure", NULL},
    {"confidence", "orientation_confidence", NULL},
    {"from", "depth_from", NULL},
    {"to", "depth_to", NULL},
    {"alpha_error", NULL},
    {"beta_error", NULL},
    {"line_error", NULL},
    {"depth_error", NULL},
    {"set", NULL},
    {"azimuth_error", NULL},
    {"dip_error", NULL},
    {"dip_direction", NULL},
    {"trend", NULL},
    {"plunge", NULL},
    {"status", NULL},
    {"polarity", "younging", NULL},
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
        if (strlen(known[i][0]) == len && strncasecmp(known[i][0], logical, len) == 0)
            return i;
    return -1;
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
        if (header->length[i] == n && strncasecmp(header->field[i], name, n) == 0)
            return (long)i;
    return -1;
}

long corax_column_find(const corax_row *header, const char *logical,
                       const corax_column_map *map)
{
    if (map) /* one mapping serves every table: a table without the mapped
              * name may still use the usual one */
        for (size_t i = 0; i < map->count; i++)
            if (strcasecmp(map->item[i].logical, logical) == 0) {
                long c = header_index(header, map->item[i].actual);
                if (c >= 0)
                    return c;
            }
    long k = known_index(logical, strlen(logical));
    if (k < 0)
        return header_index(header, logical);
    for (int j = 0; j < 6 && known[k][j]; j++) {
        long i = header_index(header, known[k][j]);
        if (i >= 0)
            return i;
    }
    return -1;
}

corax_status corax_header_check(const corax_row *header, corax_error *err)
{
    for (size_t i = 0; i < header->count; i++)
        for (size_t j = i + 1; j < header->count; j++)
            if (header->length[i] && header->length[i] == header->length[j] &&
                strncasecmp(header->field[i], header->field[j], header->length[i]) == 0)
                return corax_error_set(err, CORAX_EFORMAT, NULL, header->line,
                                       "column name '%s' appears twice in the header "
                                       "(columns %zu and %zu)",
                                       header->field[i], i + 1, j + 1);
    return CORAX_OK;
}
