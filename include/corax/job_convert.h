/* corax: the convert job. Core logs to located, true orientations for a
 * whole drill program: every input row gives one output row, in order, with
 * the log's columns first and corax's after them (x, y, z, hole_azimuth,
 * hole_plunge, dip, dip_direction, strike, pole_trend, pole_plunge, nx, ny,
 * nz; trend and plunge when the log has lines; the apparent dip in a
 * section; the uncertainty's columns; status and note).
 *
 * Without draws or references the logs stream through in batches, converted
 * in parallel and written in row order: the output is the same byte for byte
 * whatever the number of threads, and memory does not grow with the logs.
 * With draws (the Monte Carlo) or references (runs without an orientation
 * mark, turned to fit them) every log is held in memory. */
#ifndef CORAX_JOB_CONVERT_H
#define CORAX_JOB_CONVERT_H

#include <stddef.h>
#include <stdint.h>

#include "corax/codes.h"
#include "corax/convert.h"
#include "corax/job.h"
#include "corax/output.h"
#include "corax/uncertainty.h"

#ifdef __cplusplus
extern "C" {
#endif

/* A confidence word of the log and the orientation line's error it stands
 * for. */
typedef struct corax_convert_confidence {
    char name[32];
    double sigma; /* radians */
} corax_convert_confidence;

/* A reference that orients runs without a mark: a feature kind and either
 * its known plane or the mean of the hole's oriented readings of that kind
 * near the run. */
typedef struct corax_convert_reference {
    char kind[64];
    int nearby;
    corax_plane plane; /* when not nearby */
} corax_convert_reference;

enum { CORAX_CONVERT_CONFIDENCES = 16, CORAX_CONVERT_REFERENCES = 8 };

typedef struct corax_convert_job_options {
    corax_convert_options convert;
    corax_table_settings log;  /* how the core logs are read */
    corax_reading_place place; /* where an interval puts its reading */
    const corax_codes *kind_codes, *confidence_codes; /* NULL: values are words */
    corax_table_format output; /* the converted table's format */
    int has_section;
    double section_azimuth;    /* radians: the apparent dip in this section */
    /* the uncertainty (draws 0: none) */
    size_t draws;
    uint64_t seed;
    corax_error_model errors;
    corax_convert_confidence confidence[CORAX_CONVERT_CONFIDENCES];
    size_t nconfidence;
    const char *cloud;         /* every draw written here, or NULL */
    /* runs without an orientation mark */
    const corax_runs *runs;        /* NULL: none given */
    const char *unoriented_word;   /* the confidence word of such runs */
    corax_convert_reference refs[CORAX_CONVERT_REFERENCES];
    size_t nrefs;
    double nearby_within;          /* metres: how far a nearby reference reaches */
    int threads;                   /* 0: OpenMP's default */
    /* work split by hole: only the rows whose hole is in shard `shard` of
     * `shards` (corax_shard_of()); shards 0: every row */
    unsigned shard, shards;
} corax_convert_job_options;

/* The defaults: the convert defaults, core logs found as they are, readings
 * at their interval's middle, comma and point out, no section, no draws (seed
 * 1, the default error model, good 3, fair 8 and poor 20 degrees for the
 * line), "unoriented" runs, nearby references within 30 m. */
corax_convert_job_options corax_convert_job_options_default(void);

/* What a convert job did. */
typedef struct corax_convert_job_summary {
    size_t rows;
    size_t other_shards; /* rows left to the other shards */
    size_t count[CORAX_COND_COUNT + 1]; /* rows by their first condition (see
                                           corax_condition_name); the last:
                                           converted with none */
    /* values with no meaning, each with its count and first place: kind and
     * confidence codes without a word, confidence words without a line error
     * (with draws) */
    corax_tally *unknown_kind, *unknown_confidence, *no_line_error;
} corax_convert_job_summary;

void corax_convert_job_summary_clear(corax_convert_job_summary *summary);

/* Convert the core logs logs[0..nlogs) ("-" for standard input, once) of a
 * program into one table at output ("-" for standard output), and the cloud
 * when asked for, into job->outputs. The first log sets the output's
 * columns; later logs must have the same header. The job's record gets a
 * [convert] section. An error message and a status when a log cannot be
 * read; rows that cannot be converted are rows with a status of their own. */
corax_status corax_convert_job_run(corax_job *job, const corax_program *program,
                                   const corax_convert_job_options *options,
                                   const char *const *logs, size_t nlogs, const char *output,
                                   corax_convert_job_summary *summary);

/* The summary's values with no meaning, one warning each. */
void corax_convert_job_warn(corax_job *job, const corax_convert_job_options *options,
                            const corax_convert_job_summary *summary);

#ifdef __cplusplus
}
#endif
#endif
