/* survey: a drill program, its holes looked up by name (open addressing). */
#include <stdlib.h>
#include <string.h>

#include "corax/survey.h"

struct corax_program {
    corax_hole **hole; /* in order of addition */
    size_t count, capacity;
    size_t *slot;      /* hash slots: index + 1 into hole[], 0 empty */
    size_t nslots;     /* a power of two, kept at least twice count */
};

static size_t hash_name(const char *s, size_t len)
{
    size_t h = 1469598103934665603u; /* FNV-1a */
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
    free(p);
}

static size_t *find_slot(const corax_program *p, const char *name, size_t len)
{
    size_t mask = p->nslots - 1;
    for (size_t i = hash_name(name, len) & mask;; i = (i + 1) & mask) {
        if (!p->slot[i])
            return &p->slot[i];
        const char *other = corax_hole_name(p->hole[p->slot[i] - 1]);
        if (strncmp(other, name, len) == 0 && other[len] == '\0')
            return &p->slot[i];
    }
}

static corax_status grow(corax_program *p)
{
    size_t cap = p->capacity ? 2 * p->capacity : 64;
    size_t nslots = 2 * cap;
    size_t *slot = calloc(nslots, sizeof *slot);
    if (!slot)
        return CORAX_ENOMEM;
    corax_hole **h = realloc(p->hole, cap * sizeof *h);
    if (!h) {
        free(slot);
        return CORAX_ENOMEM;
    }
    p->hole = h;
    p->capacity = cap;
    free(p->slot);
    p->slot = slot;
    p->nslots = nslots;
    for (size_t i = 0; i < p->count; i++) {
        const char *name = corax_hole_name(p->hole[i]);
        *find_slot(p, name, strlen(name)) = i + 1;
    }
    return CORAX_OK;
}

corax_status corax_program_add(corax_program *p, corax_hole *hole)
{
    if (p->count == p->capacity && grow(p) != CORAX_OK) {
        corax_hole_free(hole);
        return CORAX_ENOMEM;
    }
    const char *name = corax_hole_name(hole);
    size_t *s = find_slot(p, name, strlen(name));
    if (*s) {
        corax_hole_free(hole);
        return CORAX_EARG;
    }
    p->hole[p->count++] = hole;
    *s = p->count;
    return CORAX_OK;
}

long corax_program_index(const corax_program *p, const char *name, size_t len)
{
    if (!p->nslots)
        return -1;
    return (long)*find_slot(p, name, len) - 1;
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
