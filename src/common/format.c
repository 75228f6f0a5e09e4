/* common: printf-style text of any length, and notes built phrase by phrase. */
#include <stdio.h>
#include <stdlib.h>

#include "common/format.h"

const char *corax_vformat(char *small, size_t size, char **heap, size_t *len, const char *fmt,
                          va_list ap)
{
    va_list again;
    va_copy(again, ap);
    *heap = NULL;
    int n = vsnprintf(small, size, fmt, ap);
    if (n < 0 || (size_t)n < size) {
        va_end(again);
        *len = n < 0 ? 0 : (size_t)n;
        return n < 0 ? NULL : small;
    }
    *heap = malloc((size_t)n + 1);
    if (*heap)
        vsnprintf(*heap, (size_t)n + 1, fmt, again);
    va_end(again);
    *len = (size_t)n;
    return *heap;
}

void corax_note_add(char *buf, size_t size, size_t *used, const char *fmt, ...)
{
    if (*used + 1 >= size)
        return;
    if (*used) {
        int n = snprintf(buf + *used, size - *used, "; ");
        *used += (size_t)n;
        if (*used + 1 >= size) {
            *used = size - 1;
            return;
        }
    }
    va_list ap;
    va_start(ap, fmt);
    int n = vsnprintf(buf + *used, size - *used, fmt, ap);
    va_end(ap);
    if (n > 0)
        *used += (size_t)n;
    if (*used >= size)
        *used = size - 1;
}
