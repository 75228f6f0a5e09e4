/* corax: work split by hole across machines. A hole's shard depends on its
 * name alone, so that convert --shard and check --shard run anywhere (a
 * batch scheduler's array job, GNU parallel over ssh) and their outputs put
 * together give the single run's. */
#ifndef CORAX_SHARD_H
#define CORAX_SHARD_H

#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* The shard (1 to count) of a hole named by len bytes. The hash is FNV-1a 64
 * (offset basis 14695981039346656037, prime 1099511628211) of the name's
 * bytes as the table holds them, taken modulo count, plus one: stable across
 * machines, runs and versions, so that shards run anywhere merge into the
 * single run. count 0 or 1: every hole is shard 1. */
unsigned corax_shard_of(const char *name, size_t len, unsigned count);

#ifdef __cplusplus
}
#endif
#endif
