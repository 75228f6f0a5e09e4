/* common: arrays that grow by doubling. */
#include <stdlib.h>

#include "common/grow.h"

void *corax_grow(void *p, size_t count, size_t *cap, size_t size, size_t first)
{
    if (count < *cap)
        return p;
    size_t n = *cap ? 2 * *cap : first;
    if (n <= count) /* never shrink, whatever first says */
        n = count + 1;
    void *q = realloc(p, n * size);
    if (q)
        *cap = n;
    return q;
}
