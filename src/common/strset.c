/* common: a set of strings, each held once, numbered in order of addition.
 * The text lies back to back in one block; an open-addressing table of
 * 32-bit numbers and hash tags finds a string with one comparison. */
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "common/grow.h"
#include "common/strset.h"

typedef struct slot {
    uint32_t tag, index; /* index + 1; 0: empty */
} slot;

struct corax_strset {
    char *text;          /* every string, NUL-ended, back to back */
    size_t used, room;
    size_t *at;          /* where string i starts in text */
    size_t count, cap;
    slot *slot;
    size_t nslots;       /* a power of two, at least twice count */
};

static uint64_t hash_of(const char *s, size_t len)
{
    uint64_t h = 14695981039346656037u; /* FNV-1a 64 */
    for (size_t i = 0; i < len; i++)
        h = (h ^ (unsigned char)s[i]) * 1099511628211u;
    return h;
}

corax_strset *corax_strset_new(void) { return calloc(1, sizeof(corax_strset)); }

void corax_strset_free(corax_strset *s)
{
    if (!s)
        return;
    free(s->text);
    free(s->at);
    free(s->slot);
    free(s);
}

static size_t len_of(const corax_strset *s, size_t i)
{
    size_t end = i + 1 < s->count ? s->at[i + 1] : s->used;
    return end - s->at[i] - 1;
}

/* The slot holding the string, or the empty one where it would go. */
static slot *find_slot(const corax_strset *s, const char *text, size_t len, uint64_t h)
{
    size_t mask = s->nslots - 1;
    uint32_t tag = (uint32_t)(h >> 32);
    for (size_t i = (size_t)h & mask;; i = (i + 1) & mask) {
        slot *sl = &s->slot[i];
        if (!sl->index)
            return sl;
        size_t k = sl->index - 1;
        if (sl->tag == tag && len_of(s, k) == len && memcmp(s->text + s->at[k], text, len) == 0)
            return sl;
    }
}

static int rehash(corax_strset *s, size_t nslots)
{
    slot *grown = calloc(nslots, sizeof *grown);
    if (!grown)
        return 0;
    free(s->slot);
    s->slot = grown;
    s->nslots = nslots;
    for (size_t i = 0; i < s->count; i++) {
        const char *t = s->text + s->at[i];
        size_t len = len_of(s, i);
        uint64_t h = hash_of(t, len);
        slot *sl = find_slot(s, t, len, h);
        *sl = (slot){(uint32_t)(h >> 32), (uint32_t)(i + 1)};
    }
    return 1;
}

long corax_strset_find(const corax_strset *s, const char *text, size_t len)
{
    if (!s->nslots)
        return -1;
    const slot *sl = find_slot(s, text, len, hash_of(text, len));
    return sl->index ? (long)sl->index - 1 : -1;
}

long corax_strset_add(corax_strset *s, const char *text, size_t len)
{
    uint64_t h = hash_of(text, len);
    if (s->nslots) {
        slot *sl = find_slot(s, text, len, h);
        if (sl->index)
            return (long)sl->index - 1;
    }
    if (s->count >= UINT32_MAX - 1)
        return -1;
    if (2 * (s->count + 1) > s->nslots && !rehash(s, s->nslots ? 2 * s->nslots : 64))
        return -1;
    size_t *at = corax_grow(s->at, s->count, &s->cap, sizeof *at, 64);
    if (!at)
        return -1;
    s->at = at;
    if (s->used + len + 1 > s->room) {
        size_t room = s->room ? s->room : 1024;
        while (room < s->used + len + 1)
            room *= 2;
        char *t = realloc(s->text, room);
        if (!t)
            return -1;
        s->text = t;
        s->room = room;
    }
    slot *sl = find_slot(s, text, len, h); /* the empty one */
    *sl = (slot){(uint32_t)(h >> 32), (uint32_t)(s->count + 1)};
    memcpy(s->text + s->used, text, len);
    s->text[s->used + len] = '\0';
    s->at[s->count] = s->used;
    s->used += len + 1;
    return (long)s->count++;
}

const char *corax_strset_at(const corax_strset *s, size_t i, size_t *len)
{
    if (len)
        *len = len_of(s, i);
    return s->text + s->at[i];
}

size_t corax_strset_count(const corax_strset *s) { return s->count; }

size_t corax_strset_bytes(const corax_strset *s)
{
    return s->room + s->cap * sizeof *s->at + s->nslots * sizeof *s->slot;
}
