/* Internal to src/draw: which marks a picture draws when it cannot draw them
 * all. A picture keeps to a budget of marks so that its file stays a few
 * megabytes whatever the table's size (an SVG of a million marks is too big
 * for a browser); beyond it, it draws one mark in every k and says so. */
#ifndef CORAX_DRAW_SAMPLE_H
#define CORAX_DRAW_SAMPLE_H

#include <stddef.h>
#include <stdint.h>

/* One in how many of `count` marks to draw so that at most `limit` are
 * drawn (1: all). */
static inline size_t corax_sample_every(size_t count, size_t limit)
{
    limit = limit ? limit : 1;
    return count <= limit ? 1 : (count + limit - 1) / limit;
}

/* Whether mark i is drawn: one in each run of `every`, at a place in the run
 * fixed by a hash of the run's number, so the same marks are drawn on every
 * run and the sample does not beat with a period in the table (every k-th
 * row of a log that cycles through k holes would be one hole's). */
static inline int corax_sample_drawn(size_t i, size_t every)
{
    if (every <= 1)
        return 1;
    uint64_t z = (uint64_t)(i / every) * 0x9E3779B97F4A7C15u;
    z = (z ^ (z >> 31)) * 0xBF58476D1CE4E5B9u;
    return i % every == (size_t)((z ^ (z >> 29)) % every);
}

/* How many of `count` marks are drawn, one in every `every`. */
static inline size_t corax_sample_count(size_t count, size_t every)
{
    size_t k = 0;
    for (size_t i = 0; i < count; i++)
        k += corax_sample_drawn(i, every);
    return k;
}

#endif
