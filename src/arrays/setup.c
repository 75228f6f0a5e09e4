/* arrays: a run's options set by the project file's words, for callers that
 * hold no C structs (see corax/arrays.h). Ranges and words are the command
 * line's. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "arrays/setup.h"
#include "corax/magnetic.h"
#include "corax/table.h"

corax_setup *corax_setup_new(void)
{
    corax_setup *s = calloc(1, sizeof *s);
    if (!s)
        return NULL;
    for (int i = 0; i < SETUP_TABLES; i++)
        s->table[i] = (setup_table){-1, -1, NAN, -1, NULL};
    s->date = NAN;
    s->north = CORAX_NORTH_MAGNETIC;
    s->convert = corax_convert_options_default();
    s->errors = corax_error_model_default();
    s->seed = 1;
    return s;
}

void corax_setup_free(corax_setup *s)
{
    if (!s)
        return;
    for (int i = 0; i < SETUP_TABLES; i++)
        corax_column_map_free(s->table[i].columns);
    for (size_t i = 0; i < s->nreject; i++)
        free((char *)s->reject[i].hole);
    free(s->reject);
    corax_crs_free(s->crs);
    free(s->model_name);
    free(s);
}

static int pick(int own, int all, int fallback)
{
    return own >= 0 ? own : all >= 0 ? all : fallback;
}

corax_table_settings corax_setup_table(const corax_setup *s, setup_table_id id,
                                       corax_column_map **merged)
{
    const setup_table *own = &s->table[id], *all = &s->table[SETUP_ALL];
    corax_table_settings t = corax_table_settings_default();
    t.format.delimiter = (char)pick(own->delimiter, all->delimiter, 0);
    t.format.decimal = (char)pick(own->decimal, all->decimal, 0);
    t.unit = !isnan(own->unit) ? own->unit : !isnan(all->unit) ? all->unit : 1.0;
    t.columns = own->columns ? own->columns : all->columns;
    *merged = NULL;
    if (own->columns && all->columns &&
        (corax_column_map_merge(merged, all->columns) != CORAX_OK ||
         corax_column_map_merge(merged, own->columns) != CORAX_OK)) {
        corax_column_map_free(*merged); /* out of memory: the table's own alone */
        *merged = NULL;
    }
    if (*merged)
        t.columns = *merged;
    return t;
}

corax_dip_convention corax_setup_dip(const corax_setup *s, setup_table_id id)
{
    return (corax_dip_convention)pick(s->table[id].dip, s->table[SETUP_ALL].dip,
                                      CORAX_DIP_NEGATIVE_DOWN);
}

/* ---- values ---- */

static corax_status bad(corax_error *err, const char *key, const char *fmt, const char *value)
{
    char why[200];
    snprintf(why, sizeof why, fmt, value);
    return corax_error_set(err, CORAX_EVALUE, NULL, 0, "%s: %s", key, why);
}

/* A library function's message, with the key before it. */
static corax_status keyed(corax_error *err, corax_status st, const char *key)
{
    char why[sizeof err->message];
    snprintf(why, sizeof why, "%s", err->message);
    return corax_error_set(err, st, NULL, 0, "%s: %s", key, why);
}

/* One of n words: its index, or -1 with err naming them all. */
static int choice(const char *key, const char *value, const char *const *words, int n,
                  corax_error *err)
{
    for (int i = 0; i < n; i++)
        if (strcmp(value, words[i]) == 0)
            return i;
    char list[200];
    size_t used = 0;
    for (int i = 0; i < n && used < sizeof list; i++)
        used += (size_t)snprintf(list + used, sizeof list - used, "%s%s",
                                 i == 0 ? "" : i + 1 < n ? ", " : " or ", words[i]);
    corax_error_set(err, CORAX_EVALUE, NULL, 0, "%s: '%s' is not %s%s", key, value,
                    n > 2 ? "one of " : "", list);
    return -1;
}

static corax_status number(const char *key, const char *value, double lo, double hi, double *out,
                           corax_error *err)
{
    double v;
    if (corax_parse_number(value, strlen(value), '.', &v) != CORAX_NUMBER_OK)
        return bad(err, key, "'%s' is not a number", value);
    if (v < lo || v > hi)
        return corax_error_set(err, CORAX_EVALUE, NULL, 0, "%s: %s is outside [%g, %g]", key,
                               value, lo, hi);
    *out = v;
    return CORAX_OK;
}

static int yes_no(const char *key, const char *value, corax_error *err)
{
    static const char *const words[] = {"no", "yes", "false", "true", "off", "on", "0", "1"};
    for (int i = 0; i < 8; i++)
        if (strcmp(value, words[i]) == 0)
            return i % 2;
    bad(err, key, "'%s' is not yes or no", value);
    return -1;
}

/* ---- the tables' keys ---- */

static const struct {
    const char *prefix;
    setup_table_id id;
} prefixes[] = {{"collars_", SETUP_COLLARS}, {"surveys_", SETUP_SURVEYS},
                {"structures_", SETUP_STRUCTURES}};

/* A key of the tables (delimiter, units, ...; with a table's prefix or not):
 * CORAX_ENOTFOUND when it is none. */
static corax_status table_key(corax_setup *s, const char *key, const char *value,
                              corax_error *err)
{
    setup_table_id id = SETUP_ALL;
    const char *base = key;
    for (size_t i = 0; i < sizeof prefixes / sizeof prefixes[0]; i++)
        if (strncmp(key, prefixes[i].prefix, strlen(prefixes[i].prefix)) == 0) {
            id = prefixes[i].id;
            base = key + strlen(prefixes[i].prefix);
        }
    setup_table *t = &s->table[id];
    int k;
    if (id == SETUP_STRUCTURES && strcmp(base, "units") != 0)
        return corax_error_set(err, CORAX_ENOTFOUND, NULL, 0, "%s: readings take units alone",
                               key);
    if (strcmp(base, "delimiter") == 0) {
        static const char *const words[] = {"comma", "semicolon", "tab", "auto"};
        static const int chars[] = {',', ';', '\t', 0};
        if ((k = choice(key, value, words, 4, err)) < 0)
            return CORAX_EVALUE;
        t->delimiter = chars[k];
    } else if (strcmp(base, "decimal_mark") == 0) {
        static const char *const words[] = {"point", "comma", "auto"};
        static const int chars[] = {'.', ',', 0};
        if ((k = choice(key, value, words, 3, err)) < 0)
            return CORAX_EVALUE;
        t->decimal = chars[k];
    } else if (strcmp(base, "units") == 0) {
        static const char *const words[] = {"metres", "feet", "meters", "m", "ft"};
        if ((k = choice(key, value, words, 5, err)) < 0) {
            choice(key, value, words, 2, err); /* the message names the two words */
            return CORAX_EVALUE;
        }
        t->unit = k == 1 || k == 4 ? CORAX_FOOT : 1.0;
    } else if (strcmp(base, "dip_convention") == 0) {
        static const char *const words[] = {"negative-down", "positive-down", "from-vertical"};
        if ((t->dip = choice(key, value, words, 3, err)) < 0)
            return CORAX_EVALUE;
    } else if (strcmp(base, "columns") == 0) {
        corax_status st = corax_column_map_add(&t->columns, value, err);
        if (st != CORAX_OK)
            return keyed(err, st == CORAX_ENOMEM ? st : CORAX_EVALUE, key);
    } else {
        return CORAX_ENOTFOUND;
    }
    return CORAX_OK;
}

/* ---- the survey's keys ---- */

/* "QC003@120,QC004@36.5": stations to leave out. */
static corax_status reject_stations(corax_setup *s, const char *key, const char *value,
                                    corax_error *err)
{
    corax_error e;
    corax_error_clear(&e);
    corax_status st = corax_station_refs_parse(value, &s->reject, &s->nreject, &e);
    if (st != CORAX_OK) /* the key first: "reject_station: 'X' is not HOLE@DEPTH" */
        return corax_error_set(err, st, NULL, 0, "%s: %s", key, e.message);
    return CORAX_OK;
}

/* A number of degrees, or the word that asks for the value per station. */
static corax_status degrees_or(const char *key, const char *value, const char *word, int *flag,
                               double *out, corax_error *err)
{
    if (strcmp(value, word) == 0) {
        *flag = 1;
        return CORAX_OK;
    }
    double v;
    if (corax_parse_number(value, strlen(value), '.', &v) != CORAX_NUMBER_OK)
        return corax_error_set(err, CORAX_EVALUE, NULL, 0, "%s: '%s' is neither a number nor %s",
                               key, value, word);
    corax_status st = number(key, value, -180, 180, out, err);
    if (st == CORAX_OK)
        *flag = 0;
    return st;
}

static corax_status survey_key(corax_setup *s, const char *key, const char *value,
                               corax_error *err)
{
    corax_status st;
    if (strcmp(key, "collar_station") == 0) {
        int v = yes_no(key, value, err);
        if (v < 0)
            return CORAX_EVALUE;
        s->collar_station = v;
        return CORAX_OK;
    }
    if (strcmp(key, "reject") == 0)
        return reject_stations(s, key, value, err);
    if (strcmp(key, "declination") == 0)
        return degrees_or(key, value, "model", &s->declination_model, &s->declination, err);
    if (strcmp(key, "convergence") == 0)
        return degrees_or(key, value, "projection", &s->convergence_projection,
                          &s->convergence, err);
    if (strcmp(key, "crs") == 0) {
        corax_crs *crs;
        if ((st = corax_crs_new(value, &crs, err)) != CORAX_OK)
            return keyed(err, st, key);
        corax_crs_free(s->crs);
        s->crs = crs;
        return CORAX_OK;
    }
    if (strcmp(key, "local_grid") == 0) {
        if ((st = corax_local_grid_parse(value, &s->grid, err)) != CORAX_OK)
            return keyed(err, st, key);
        s->has_grid = 1;
        return CORAX_OK;
    }
    if (strcmp(key, "survey_date") == 0) {
        double d = corax_date_parse(value, strlen(value));
        if (isnan(d))
            return bad(err, key, "'%s' is not an ISO 8601 date (YYYY-MM-DD)", value);
        s->date = d;
        return CORAX_OK;
    }
    if (strcmp(key, "magnetic_model") == 0) {
        char *name = strdup(value);
        if (!name)
            return corax_error_set(err, CORAX_ENOMEM, NULL, 0, "out of memory");
        free(s->model_name);
        s->model_name = name;
        return CORAX_OK;
    }
    if (strcmp(key, "reference") == 0) {
        if (corax_north_parse(value, strlen(value), &s->north) != 0)
            return bad(err, key, "'%s' is not magnetic, true or grid", value);
        return CORAX_OK;
    }
    return CORAX_ENOTFOUND;
}

/* ---- the core's and the uncertainty's keys ---- */

static corax_status core_key(corax_setup *s, const char *key, const char *value,
                             corax_error *err)
{
    static const char *const ref[] = {"bottom", "top"};
    static const char *const ends[] = {"down-hole", "up-hole"};
    static const char *const senses[] = {"clockwise", "anticlockwise"};
    corax_core_conventions *c = &s->convert.conventions;
    const struct {
        const char *key;
        const char *const *words;
        int *slot;
    } choices[] = {{"reference_line", ref, &c->top_reference},
                   {"beta_end", ends, &c->beta_to_uphole_end},
                   {"beta_sense", senses, &c->beta_anticlockwise},
                   {"gamma_zero", ends, &c->gamma_from_uphole},
                   {"gamma_sense", senses, &c->gamma_anticlockwise}};
    for (size_t i = 0; i < sizeof choices / sizeof choices[0]; i++)
        if (strcmp(key, choices[i].key) == 0) {
            int k = choice(key, value, choices[i].words, 2, err);
            if (k < 0)
                return CORAX_EVALUE;
            *choices[i].slot = k;
            return CORAX_OK;
        }
    const struct {
        const char *key;
        double *slot;
        double max;  /* degrees (metres for depth) */
        int metres;
    } angles[] = {{"near_parallel", &s->convert.near_parallel, 90, 0},
                  {"near_perpendicular", &s->convert.near_perpendicular, 90, 0},
                  {"vertical_limit", &s->convert.vertical_limit, 90, 0},
                  {"alpha_error", &s->errors.alpha, 45, 0},
                  {"beta_error", &s->errors.beta, 180, 0},
                  {"line_error", &s->errors.line, 180, 0},
                  {"gravity_error", &s->errors.gravity, 45, 0},
                  {"depth_error", &s->errors.depth, 100, 1},
                  {"azimuth_error", &s->errors.azimuth, 45, 0},
                  {"dip_error", &s->errors.dip, 45, 0},
                  {"azimuth_error_per_hole", &s->errors.azimuth_hole, 45, 0},
                  {"dip_error_per_hole", &s->errors.dip_hole, 45, 0}};
    for (size_t i = 0; i < sizeof angles / sizeof angles[0]; i++)
        if (strcmp(key, angles[i].key) == 0) {
            double v;
            corax_status st = number(key, value, 0, angles[i].max, &v, err);
            if (st == CORAX_OK)
                *angles[i].slot = angles[i].metres ? v : corax_rad(v);
            return st;
        }
    double v;
    corax_status st;
    if (strcmp(key, "draws") == 0) {
        if ((st = number(key, value, 2, 1e6, &v, err)) != CORAX_OK)
            return st;
        if (v != floor(v))
            return bad(err, key, "'%s' is not a whole number", value);
        s->draws = (size_t)v;
        return CORAX_OK;
    }
    if (strcmp(key, "seed") == 0) {
        if ((st = number(key, value, 0, 4294967295.0, &v, err)) != CORAX_OK)
            return st;
        if (v != floor(v))
            return bad(err, key, "'%s' is not a whole number", value);
        s->seed = (uint64_t)v;
        return CORAX_OK;
    }
    return CORAX_ENOTFOUND;
}

corax_status corax_setup_set(corax_setup *s, const char *key, const char *value,
                             corax_error *err)
{
    corax_error e; /* a key's own message tells a known key from an unknown one */
    corax_error_clear(&e);
    corax_status st = CORAX_ENOTFOUND;
    corax_status (*const groups[])(corax_setup *, const char *, const char *, corax_error *) = {
        table_key, survey_key, core_key};
    if (!s || !key || !value)
        st = corax_error_set(&e, CORAX_EARG, NULL, 0, "no setup, key or value");
    for (size_t i = 0; st == CORAX_ENOTFOUND && !e.message[0] && i < 3; i++)
        st = groups[i](s, key, value, &e);
    if (st == CORAX_ENOTFOUND && !e.message[0])
        corax_error_set(&e, st, NULL, 0, "'%s' is not an option corax knows", key);
    if (err)
        *err = e;
    return st;
}
