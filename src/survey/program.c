/* survey: a drill program, its holes looked up by name (open addressing). */
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "corax/survey.h"

/* A hash slot: the hole's index + 1 (0: empty) and 32 bits of its name's
 * hash, so that a probe compares names only when the hashes agree. */
typedef struct slot {
    uint32_t hash, index;
} slot;

struct corax_program {
    corax_hole **hole; /* in order of addition */
    size_t count, capacity;
    slot *slot;
    size_t nslots;     /* a power of two, kept at least twice count */
    /* every name, NUL-ended, one after another: a look-up reads a few
     * kilobytes that stay in cache, not one scattered hole after another */
    char *names;
    size_t names_used, names_cap;
    size_t *name_at;   /* where hole i's name starts in names */
};

static uint64_t hash_name(const char *s, size_t len)
{
    uint64_t h = 1469598103934665603u; /* FNV-1a */
    for (size_t i = 0; i < len; i++)
        h = (h ^ (unsigned char)s[i]) * 1099511628211u;
    return h;
}

corax_program *corax_program_new(void)
{
    return calloc(1, sizeof(corax_program));
}

void corax_program_free(corax_program *p)
{
    if (!p)
        return;
    for (size_t i = 0; i < p->count; i++)
        corax_hole_free(p->hole[i]);
    free(p->hole);
    free(p->slot);
    free(p->names);
    free(p->name_at);
    free(p);
}

/* The slot holding the name, or the empty slot where it would go. */
static slot *find_slot(const corax_program *p, const char *name, size_t len, uint64_t hash)
{
    size_t mask = p->nslots - 1;
    uint32_t tag = (uint32_t)(hash >> 32);
    for (size_t i = (size_t)hash & mask;; i = (i + 1) & mask) {
        slot *s = &p->slot[i];
        if (!s->index)
            return s;
        if (s->hash != tag)
            continue;
        const char *other = p->names + p->name_at[s->index - 1];
        if (memcmp(other, name, len) == 0 && other[len] == '\0')
            return s;
    }
}

static void place(corax_program *p, size_t i)
{
    const char *name = p->names + p->name_at[i];
    size_t len = strlen(name);
    uint64_t hash = hash_name(name, len);
    slot *s = find_slot(p, name, len, hash);
    s->hash = (uint32_t)(hash >> 32);
    s->index = (uint32_t)(i + 1);
}

static corax_status grow(corax_program *p)
{
    size_t cap = p->capacity ? 2 * p->capacity : 64;
    if (cap >= UINT32_MAX)
        return CORAX_ENOMEM;
    size_t nslots = 2 * cap;
    slot *sl = calloc(nslots, sizeof *sl);
    corax_hole **h = realloc(p->hole, cap * sizeof *h);
    if (h)
        p->hole = h;
    size_t *at = h ? realloc(p->name_at, cap * sizeof *at) : NULL;
    if (at)
        p->name_at = at;
    if (!sl || !h || !at) {
        free(sl);
        return CORAX_ENOMEM;
    }
    p->capacity = cap;
    free(p->slot);
    p->slot = sl;
    p->nslots = nslots;
    for (size_t i = 0; i < p->count; i++)
        place(p, i);
    return CORAX_OK;
}

/* Keep a copy of the name in names; its offset in *at. */
static corax_status keep_name(corax_program *p, const char *name, size_t len, size_t *at)
{
    if (p->names_used + len + 1 > p->names_cap) {
        size_t cap = p->names_cap ? p->names_cap : 1024;
        while (cap < p->names_used + len + 1)
            cap *= 2;
        char *n = realloc(p->names, cap);
        if (!n)
            return CORAX_ENOMEM;
        p->names = n;
        p->names_cap = cap;
    }
    *at = p->names_used;
    memcpy(p->names + p->names_used, name, len + 1);
    p->names_used += len + 1;
    return CORAX_OK;
}

corax_status corax_program_add(corax_program *p, corax_hole *hole)
{
    if (p->count == p->capacity && grow(p) != CORAX_OK) {
        corax_hole_free(hole);
        return CORAX_ENOMEM;
    }
    const char *name = corax_hole_name(hole);
    size_t len = strlen(name);
    if (find_slot(p, name, len, hash_name(name, len))->index) {
        corax_hole_free(hole);
        return CORAX_EARG;
    }
    if (keep_name(p, name, len, &p->name_at[p->count]) != CORAX_OK) {
        corax_hole_free(hole);
        return CORAX_ENOMEM;
    }
    p->hole[p->count] = hole;
    place(p, p->count++);
    return CORAX_OK;
}

long corax_program_index(const corax_program *p, const char *name, size_t len)
{
    if (!p->nslots)
        return -1;
    return (long)find_slot(p, name, len, hash_name(name, len))->index - 1;
}

const corax_hole *corax_program_find(const corax_program *p, const char *name, size_t len)
{
    long i = corax_program_index(p, name, len);
    return i >= 0 ? p->hole[i] : NULL;
}

size_t corax_program_size(const corax_program *p) { return p->count; }

const corax_hole *corax_program_hole(const corax_program *p, size_t i)
{
    return i < p->count ? p->hole[i] : NULL;
}
