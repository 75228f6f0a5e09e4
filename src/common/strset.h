/* A set of strings, each held once and numbered in the order it was first
 * added (internal to the library): the hole names, kinds and confidence
 * words of a core log held as small numbers. */
#ifndef CORAX_STRSET_H
#define CORAX_STRSET_H

#include <stddef.h>

typedef struct corax_strset corax_strset;

/* NULL when out of memory. */
corax_strset *corax_strset_new(void);
void corax_strset_free(corax_strset *set);

/* The number of the string of len bytes (0, 1, ... in order of first
 * addition), added when it is new; -1 when out of memory or past
 * UINT32_MAX - 1 strings. */
long corax_strset_add(corax_strset *set, const char *text, size_t len);

/* Its number, or -1 when it is not in the set. */
long corax_strset_find(const corax_strset *set, const char *text, size_t len);

/* String i, NUL-ended, valid until the next addition; its length in *len
 * (may be NULL). */
const char *corax_strset_at(const corax_strset *set, size_t i, size_t *len);

size_t corax_strset_count(const corax_strset *set);

/* The bytes the set holds (for the memory a job keeps). */
size_t corax_strset_bytes(const corax_strset *set);

#endif
