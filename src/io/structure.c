/* io: located structures read from converted tables, and the register of
 * feature kinds that gives each kind its code. */
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "corax/structure.h"
#include "io/fields.h"

/* ---- feature kinds ---- */

static const char *const common_kind[] = {NULL,    "bedding", "foliation", "cleavage",
                                          "vein",  "fault",   "shear",     "joint",
                                          "fracture", "contact", "lineation"};
enum { NCOMMON = sizeof common_kind / sizeof common_kind[0] };

struct corax_kinds {
    unsigned char common_seen[NCOMMON];
    char **other; /* other kinds, code CORAX_KIND_OTHER + index */
    size_t nother, cap;
};

corax_kinds *corax_kinds_new(void) { return calloc(1, sizeof(corax_kinds)); }

void corax_kinds_free(corax_kinds *k)
{
    if (!k)
        return;
    for (size_t i = 0; i < k->nother; i++)
        free(k->other[i]);
    free(k->other);
    free(k);
}

static int same_word(const char *a, const char *b, size_t len)
{
    return strlen(b) == len && strncasecmp(a, b, len) == 0;
}

int corax_kinds_code(corax_kinds *k, const char *text, size_t len)
{
    while (len && isspace((unsigned char)*text)) {
        text++;
        len--;
    }
    while (len && isspace((unsigned char)text[len - 1]))
        len--;
    int code = -1;
    if (len == 0)
        code = CORAX_KIND_NONE;
    for (int i = 1; code < 0 && i < NCOMMON; i++)
        if (same_word(text, common_kind[i], len))
            code = i;
    if (code >= 0) {
        k->common_seen[code] = 1;
        return code;
    }
    for (size_t i = 0; i < k->nother; i++)
        if (same_word(text, k->other[i], len))
            return CORAX_KIND_OTHER + (int)i;
    char **grown = corax_grow(k->other, k->nother, &k->cap, sizeof *grown, 8);
    if (!grown)
        return -1;
    k->other = grown;
    char *name = malloc(len + 1);
    if (!name)
        return -1;
    memcpy(name, text, len);
    name[len] = '\0';
    k->other[k->nother++] = name;
    return CORAX_KIND_OTHER + (int)(k->nother - 1);
}

size_t corax_kinds_count(const corax_kinds *k)
{
    size_t n = k->nother;
    for (int i = 0; i < NCOMMON; i++)
        n += k->common_seen[i];
    return n;
}

int corax_kinds_at(const corax_kinds *k, size_t i, const char **name)
{
    for (int c = 0; c < NCOMMON; c++)
        if (k->common_seen[c] && i-- == 0) {
            *name = c == CORAX_KIND_NONE ? "none" : common_kind[c];
            return c;
        }
    if (i >= k->nother)
        return -1;
    *name = k->other[i];
    return CORAX_KIND_OTHER + (int)i;
}

const char *corax_kinds_name(const corax_kinds *k, int code)
{
    if (code >= 0 && code < NCOMMON)
        return code == CORAX_KIND_NONE ? "none" : common_kind[code];
    if (code >= CORAX_KIND_OTHER && (size_t)(code - CORAX_KIND_OTHER) < k->nother)
        return k->other[code - CORAX_KIND_OTHER];
    return NULL;
}

/* ---- rows of a converted table ---- */

const char *const corax_structure_column_names[CORAX_STRUCTURE_COLUMNS] = {
    "x", "y", "z", "dip", "dip_direction", "hole", "depth", "kind", "polarity", "nx", "ny", "nz"};

void corax_structure_columns_set(corax_structure_columns *c, const long *col)
{
    c->x = col[0];
    c->y = col[1];
    c->z = col[2];
    c->dip = col[3];
    c->dip_direction = col[4];
    c->hole = col[5];
    c->depth = col[6];
    c->kind = col[7];
    c->polarity = col[8];
    c->nx = col[9];
    c->ny = col[10];
    c->nz = col[11];
}

/* Read n numbers, all given or all empty: 1 given, 0 empty, -1 unusable
 * (why says which and why). */
static int read_group(const corax_row *row, const long *col, const char *const *name, int n,
                      char decimal, double *v, char *why, size_t whylen)
{
    int given = 0, empty = 0;
    for (int i = 0; i < n; i++) {
        corax_number_status st =
            corax_field_number(row, col[i], decimal, name[i], &v[i], why, whylen);
        if (st == CORAX_NUMBER_EMPTY)
            empty++;
        else if (st == CORAX_NUMBER_OK)
            given++;
        else
            return -1;
    }
    if (given && empty) {
        if (n == 3)
            snprintf(why, whylen, "%s, %s, %s: some given and some empty", name[0], name[1],
                     name[2]);
        else
            snprintf(why, whylen, "%s and %s: some given and some empty", name[0], name[1]);
        return -1;
    }
    return given > 0;
}

/* Refine a plane read from dip and dip direction with the row's unit normal,
 * when it has one: 1 ok (plane refined or left), 0 unusable (why says). */
static int plane_from_normal(const corax_row *row, const corax_structure_columns *c,
                             char decimal, corax_plane *plane, char *why, size_t whylen)
{
    static const char *const name[] = {"nx", "ny", "nz"};
    long col[3] = {c->nx, c->ny, c->nz};
    double n[3];
    int given = read_group(row, col, name, 3, decimal, n, why, whylen);
    if (given <= 0)
        return given == 0;
    corax_vec3 v = {n[0], n[1], n[2]}, from_dip = corax_plane_normal(*plane);
    double len = sqrt(v.x * v.x + v.y * v.y + v.z * v.z);
    if (fabs(len - 1.0) > 1e-3) {
        snprintf(why, whylen, "nx, ny, nz is not a unit vector (length %.6g)", len);
        return 0;
    }
    corax_plane refined = corax_plane_from_normal(v, &v);
    /* the angle between the two normals, stable at small angles */
    double cx = v.y * from_dip.z - v.z * from_dip.y, cy = v.z * from_dip.x - v.x * from_dip.z,
           cz = v.x * from_dip.y - v.y * from_dip.x;
    double gap = corax_deg(atan2(sqrt(cx * cx + cy * cy + cz * cz),
                                 v.x * from_dip.x + v.y * from_dip.y + v.z * from_dip.z));
    if (gap > 0.05) {
        snprintf(why, whylen, "nx, ny, nz lie %.2f degrees from the normal of dip and "
                 "dip_direction", gap);
        return 0;
    }
    *plane = refined;
    return 1;
}

static int read_polarity(const char *t, size_t n, int *polarity)
{
    static const char *const up[] = {"1", "+1", "upright"};
    static const char *const over[] = {"-1", "overturned"};
    static const char *const unknown[] = {"", "0", "unknown"};
    while (n && isspace((unsigned char)*t)) {
        t++;
        n--;
    }
    while (n && isspace((unsigned char)t[n - 1]))
        n--;
    for (int i = 0; i < 3; i++) {
        if (same_word(t, up[i], n)) {
            *polarity = 1;
            return 1;
        }
        if (same_word(t, unknown[i], n)) {
            *polarity = 0;
            return 1;
        }
    }
    for (int i = 0; i < 2; i++)
        if (same_word(t, over[i], n)) {
            *polarity = -1;
            return 1;
        }
    return 0;
}

/* A dip in [0, 90] with an empty dip direction (convert's dip-only rows). */
static int dip_alone(const corax_row *row, const corax_structure_columns *c, char decimal)
{
    double dip, dd;
    char why[80];
    return corax_field_number(row, c->dip, decimal, "dip", &dip, why, sizeof why) ==
               CORAX_NUMBER_OK &&
           dip >= 0.0 && dip <= 90.0 &&
           corax_field_number(row, c->dip_direction, decimal, "dip_direction", &dd, why,
                              sizeof why) == CORAX_NUMBER_EMPTY;
}

corax_status corax_structure_read(const corax_row *row, const corax_structure_columns *c,
                                  char decimal, corax_structure *s, char *why, size_t whylen)
{
    static const char *const pos_name[] = {"x", "y", "z"};
    static const char *const dip_name[] = {"dip", "dip_direction"};
    memset(s, 0, sizeof *s);
    s->hole = corax_field_text(row, c->hole, &s->hole_len);
    s->kind = corax_field_text(row, c->kind, &s->kind_len);
    s->depth = NAN;
    if (c->depth >= 0) {
        corax_number_status st =
            corax_field_number(row, c->depth, decimal, "depth", &s->depth, why, whylen);
        if (st == CORAX_NUMBER_EMPTY)
            s->depth = NAN;
        else if (st != CORAX_NUMBER_OK ||
                 !corax_field_plausible(s->depth, CORAX_MAX_DEPTH, "depth", why, whylen))
            return CORAX_EVALUE;
    }
    long pc[3] = {c->x, c->y, c->z}, dc[2] = {c->dip, c->dip_direction};
    double p[3], d[2];
    int located = read_group(row, pc, pos_name, 3, decimal, p, why, whylen);
    int oriented = located < 0 ? -1 : read_group(row, dc, dip_name, 2, decimal, d, why, whylen);
    if (located >= 0 && oriented < 0 && dip_alone(row, c, decimal))
        oriented = 0; /* a dip without its direction (a hole near vertical): not oriented */
    if (located < 0 || oriented < 0)
        return CORAX_EVALUE;
    for (int k = 0; located && k < 3; k++)
        if (!corax_field_plausible(p[k], CORAX_MAX_COORDINATE, pos_name[k], why, whylen))
            return CORAX_EVALUE;
    if (oriented && (!corax_field_in_range(d[0], 0, 90, "dip", why, whylen) ||
                     !corax_field_in_range(d[1], 0, 360, "dip_direction", why, whylen)))
        return CORAX_EVALUE;
    s->located = located;
    s->position = (corax_vec3){p[0], p[1], p[2]};
    s->oriented = oriented;
    if (oriented) {
        s->plane = (corax_plane){corax_rad(d[0]), corax_wrap_azimuth(corax_rad(d[1]))};
        if (!plane_from_normal(row, c, decimal, &s->plane, why, whylen))
            return CORAX_EVALUE;
    }
    size_t n;
    const char *t = corax_field_text(row, c->polarity, &n);
    if (!read_polarity(t, n, &s->polarity)) {
        snprintf(why, whylen, "polarity '%.40s' is not one of 1, -1, upright, overturned, 0, unknown",
                 t);
        return CORAX_EVALUE;
    }
    return CORAX_OK;
}
