/* corax: the merge job. Tables converted shard by shard (convert --shard K/N,
 * each shard on any machine) put together as the single run would have
 * written them, byte for byte: the core logs are read again for the order of
 * their rows, and each row is taken from its hole's shard. */
#ifndef CORAX_JOB_MERGE_H
#define CORAX_JOB_MERGE_H

#include <stddef.h>

#include "corax/job.h"
#include "corax/table.h"

#ifdef __cplusplus
extern "C" {
#endif

/* What a merge did: rows written, and rows taken from each shard (the
 * caller's array of nshards counts, or NULL). */
typedef struct corax_merge_job_summary {
    size_t rows;
    size_t *per_shard;
} corax_merge_job_summary;

/* Merge the outputs shards[0..nshards) of convert --shard 1/N .. N/N (N =
 * nshards, in that order) of the core logs logs[0..nlogs) (read with `log`,
 * the settings convert read them with) into output ("-": standard output),
 * in job->outputs. Every shard must hold the same header and exactly the rows
 * of its holes, in order, and each row's hole must be the log's: else an
 * error message and CORAX_EFORMAT, and nothing written. The job's record
 * gets a [merge] section. */
corax_status corax_merge_job_run(corax_job *job, const corax_table_settings *log,
                                 const char *const *logs, size_t nlogs,
                                 const char *const *shards, size_t nshards, const char *output,
                                 corax_merge_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
