/* common: a hole's shard, from its name alone (shard.h). */
#include <stdint.h>

#include "corax/shard.h"

unsigned corax_shard_of(const char *name, size_t len, unsigned count)
{
    if (count <= 1)
        return 1;
    uint64_t h = 14695981039346656037u; /* FNV-1a 64 */
    for (size_t i = 0; i < len; i++) {
        h ^= (unsigned char)name[i];
        h *= 1099511628211u;
    }
    return (unsigned)(h % count) + 1;
}
