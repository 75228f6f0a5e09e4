/* Arrays that grow by doubling (internal to the library and the commands). */
#ifndef CORAX_GROW_H
#define CORAX_GROW_H

#include <stddef.h>

/* Room for one more item in the array p, which holds count items of size
 * bytes in room for *cap: p itself while it has room, else p reallocated to
 * twice its room (`first` items the first time) with *cap updated. NULL
 * when out of memory; p is then unchanged and still the caller's. */
void *corax_grow(void *p, size_t count, size_t *cap, size_t size, size_t first);

#endif
