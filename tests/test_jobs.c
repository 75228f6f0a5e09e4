/* Tests of the jobs through the public API alone: this file includes only
 * corax/corax.h (built without the library's internal headers) and links
 * only libcorax.a. Each job runs on the command-line tests' data. The checks
 * are the jobs' own promises, not numbers: one output row per input row,
 * the same bytes whatever the number of threads, nothing printed (messages
 * come back as data), files whole or not at all and held until published,
 * every progress stage ended, and the summaries agreeing with the files. */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include <cmocka.h>

#include "corax/corax.h"

#define DATA "tests/cli/data/"

static char dir[] = "/tmp/corax-jobs.XXXXXX";
static char made[64][256]; /* every file a test asked for, removed at the end */
static size_t nmade;

/* A path in the test's folder. */
static const char *out(const char *name)
{
    assert_true(nmade < 64);
    snprintf(made[nmade], sizeof made[nmade], "%s/%s", dir, name);
    return made[nmade++];
}

static int setup(void **state)
{
    (void)state;
    return mkdtemp(dir) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    for (size_t i = 0; i < nmade; i++) {
        unlink(made[i]);
        char about[300];
        snprintf(about, sizeof about, "%.256s.about", made[i]);
        unlink(about);
    }
    return rmdir(dir);
}

/* The whole of a file (free() it); NULL when it is not there. */
static char *slurp(const char *path, size_t *len)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return NULL;
    size_t cap = 4096, n = 0;
    char *text = malloc(cap);
    size_t got;
    while (text && (got = fread(text + n, 1, cap - n - 1, f)) > 0) {
        n += got;
        if (cap - n - 1 == 0) {
            char *grown = realloc(text, cap *= 2);
            if (!grown)
                free(text);
            text = grown;
        }
    }
    fclose(f);
    if (text)
        text[n] = '\0';
    if (len)
        *len = n;
    return text;
}

static size_t lines(const char *path)
{
    char *text = slurp(path, NULL);
    assert_non_null(text);
    size_t n = 0;
    for (const char *p = text; *p; p++)
        n += *p == '\n';
    free(text);
    return n;
}

static int exists(const char *path) { return access(path, F_OK) == 0; }

/* A job that keeps its messages (no callback) and counts its stages. */
typedef struct watch {
    int begun, ended, phases;
} watch;

static void on_stage(void *user, corax_stage *s)
{
    watch *w = user;
    if (s->state == CORAX_STAGE_BEGIN) {
        assert_null(s->display);
        s->display = w; /* the callback's own, kept until the end */
        w->begun++;
    } else if (s->state == CORAX_STAGE_END) {
        assert_ptr_equal(s->display, w);
        w->ended++;
    } else if (s->state == CORAX_STAGE_PHASE) {
        w->phases++;
    }
}

static void job_start(corax_job *job, watch *w, corax_record *record)
{
    corax_job_init(job);
    memset(w, 0, sizeof *w);
    job->on_stage = on_stage;
    job->user = w;
    job->record = record;
}

static corax_program *program(corax_job *job, const char *collars, const char *surveys)
{
    corax_load_options lo = corax_load_options_default();
    corax_program *prog = NULL;
    assert_int_equal(corax_job_program_load(job, collars, surveys, &lo, &prog), CORAX_OK);
    assert_non_null(prog);
    return prog;
}

/* A table and the tables read: the job notes each once. */
static int was_read(const corax_job *job, corax_table_role role, const char *path)
{
    for (size_t i = 0; i < job->nread; i++)
        if (job->read[i].role == role && strcmp(job->read[i].path, path) == 0)
            return 1;
    return 0;
}

static void test_convert_alike_on_any_threads(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    corax_record *record = corax_record_new();
    job_start(&job, &w, record);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    const char *logs[] = {DATA "log.csv"};
    corax_convert_job_options o = corax_convert_job_options_default();
    const char *one = out("one.csv"), *three = out("three.csv");
    corax_convert_job_summary sum;
    o.threads = 1;
    assert_int_equal(corax_convert_job_run(&job, prog, &o, logs, 1, one, &sum), CORAX_OK);
    size_t rows = sum.rows, converted = sum.count[CORAX_COND_COUNT];
    corax_convert_job_summary_clear(&sum);
    o.threads = 3;
    assert_int_equal(corax_convert_job_run(&job, prog, &o, logs, 1, three, &sum), CORAX_OK);
    /* one output row per input row, after the header */
    assert_int_equal(rows, lines(DATA "log.csv") - 1);
    assert_int_equal(lines(one), rows + 1);
    assert_int_equal(sum.rows, rows);
    assert_int_equal(sum.count[CORAX_COND_COUNT], converted);
    size_t n1, n3;
    char *a = slurp(one, &n1), *b = slurp(three, &n3);
    assert_int_equal(n1, n3);
    assert_memory_equal(a, b, n1);
    free(a);
    free(b);
    /* nothing went wrong, and nothing was printed: no callback, so the job
     * kept its messages (none are errors) */
    assert_int_equal(job.errors, 0);
    assert_int_equal(w.begun, w.ended);
    assert_true(was_read(&job, CORAX_ROLE_COLLARS, DATA "collars.csv"));
    assert_true(was_read(&job, CORAX_ROLE_STRUCTURES, DATA "log.csv"));
    assert_non_null(strstr(corax_record_text(record, NULL), "[convert]\nstructures = " DATA
                                                             "log.csv\n"));
    corax_convert_job_summary_clear(&sum);
    corax_program_free(prog);
    corax_record_free(record);
    corax_job_clear(&job);
}

static void test_convert_draws_and_cloud(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    const char *logs[] = {DATA "log_mc.csv"};
    corax_convert_job_options o = corax_convert_job_options_default();
    o.draws = 20;
    o.cloud = out("cloud.csv");
    const char *table = out("drawn.csv");
    corax_convert_job_summary sum;
    assert_int_equal(corax_convert_job_run(&job, prog, &o, logs, 1, table, &sum), CORAX_OK);
    assert_int_equal(lines(table), lines(DATA "log_mc.csv"));
    /* every draw of every reading drawn: a header and 20 rows a reading */
    size_t cloud = lines(o.cloud) - 1;
    assert_true(cloud > 0);
    assert_int_equal(cloud % 20, 0);
    assert_int_equal(w.begun, w.ended); /* the draws' stage among them */
    assert_true(w.begun >= 1);
    corax_convert_job_summary_clear(&sum);
    corax_program_free(prog);
    corax_job_clear(&job);
}

/* A log that cannot be read: an error message naming it, kept by the job
 * (nothing printed), a failed status, and no output at all. */
static void test_failure_is_a_message_and_no_file(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    const char *logs[] = {DATA "no_such_log.csv"};
    corax_convert_job_options o = corax_convert_job_options_default();
    const char *table = out("never.csv");
    corax_convert_job_summary sum;
    assert_int_not_equal(corax_convert_job_run(&job, prog, &o, logs, 1, table, &sum), CORAX_OK);
    assert_false(exists(table));
    assert_int_equal(job.errors, 1);
    assert_int_equal(job.nmessages, 1);
    assert_int_equal(job.message[0].severity, CORAX_ERROR);
    assert_non_null(strstr(job.message[0].file ? job.message[0].file : job.message[0].text,
                           "no_such_log.csv"));
    corax_convert_job_summary_clear(&sum);
    corax_program_free(prog);
    corax_job_clear(&job);
}

/* With a set of outputs, a job's file waits for the caller to publish it. */
static void test_outputs_held_until_published(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    job.outputs = corax_outputs_new();
    assert_non_null(job.outputs);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    corax_trace_job_options o = corax_trace_job_options_default();
    o.step = 10;
    const char *table = out("trace.csv");
    assert_int_equal(corax_trace_job_run(&job, prog, &o, table), CORAX_OK);
    assert_false(exists(table));
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_outputs_publish(job.outputs, &err), CORAX_OK);
    assert_true(exists(table));
    /* a point every 10 m and more (collars, stations, ends), each a row */
    assert_true(lines(table) > 1 + 200 / 10);
    corax_outputs_free(job.outputs);
    corax_program_free(prog);
    corax_job_clear(&job);
}

static void test_trace_at_keeps_every_row(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    corax_trace_job_options o = corax_trace_job_options_default();
    o.at = DATA "at.csv";
    const char *table = out("at.csv");
    assert_int_equal(corax_trace_job_run(&job, prog, &o, table), CORAX_OK);
    assert_int_equal(lines(table), lines(DATA "at.csv"));
    assert_true(was_read(&job, CORAX_ROLE_DEPTHS, DATA "at.csv"));
    corax_program_free(prog);
    corax_job_clear(&job);
}

static void test_check_findings_agree(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_load_options lo = corax_load_options_default();
    lo.repair = 1;
    corax_program *prog = NULL;
    corax_findings found = {0};
    assert_int_equal(corax_job_program_findings(&job, DATA "collars.csv", DATA "surveys.csv", &lo,
                                                &prog, &found),
                     CORAX_OK);
    const char *logs[] = {DATA "log.csv"};
    corax_check_job_options o = corax_check_job_options_default();
    o.collars = DATA "collars.csv";
    o.surveys = DATA "surveys.csv";
    o.logs = logs;
    o.nlogs = 1;
    o.report = out("report.html");
    o.when = "2026-01-01 00:00 UTC";
    const char *table = out("findings.csv");
    corax_check_job_summary sum;
    assert_int_equal(corax_check_job_run(&job, prog, &o, &found, table, &sum), CORAX_OK);
    assert_int_equal(sum.errors + sum.warnings + sum.notes, found.count);
    assert_int_equal(lines(table), found.count + 1);
    assert_int_equal(sum.readings, lines(DATA "log.csv") - 1);
    assert_true(exists(o.report));
    assert_true(w.phases >= 2); /* checking, writing the report */
    corax_check_job_summary_clear(&sum);
    corax_findings_clear(&found);
    corax_program_free(prog);
    corax_job_clear(&job);
}

static void test_section_accounts_for_every_row(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    corax_section_job_options o = corax_section_job_options_default();
    o.x = 1000;
    o.y = 2000;
    o.azimuth = 90;
    o.width = 100;
    o.svg = out("section.svg");
    const char *table = out("section.csv");
    corax_section_job_summary sum;
    assert_int_equal(
        corax_section_job_run(&job, prog, &o, DATA "converted.csv", table, &sum), CORAX_OK);
    assert_int_equal(sum.kept + sum.outside + sum.other_kinds + sum.unlocated,
                     lines(DATA "converted.csv") - 1);
    assert_true(sum.kept > 0);
    assert_int_equal(lines(table), sum.kept + 1);
    assert_true(exists(o.svg));
    corax_program_free(prog);
    corax_job_clear(&job);
}

static void test_export_csv_and_vtk(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    const char *inputs[] = {DATA "converted.csv"};
    corax_export_job_options o = corax_export_job_options_default();
    const char *csv = out("model.csv"), *vtk = out("model.vtk");
    corax_export_job_summary sum;
    assert_int_equal(corax_export_job_run(&job, NULL, &o, inputs, 1, csv, &sum), CORAX_OK);
    assert_int_equal(sum.structures + sum.left_out, lines(DATA "converted.csv") - 1);
    assert_int_equal(lines(csv), sum.structures + 1);
    o.format = CORAX_EXPORT_JOB_VTK;
    o.format_name = "vtk";
    assert_int_equal(corax_export_job_run(&job, prog, &o, inputs, 1, vtk, &sum), CORAX_OK);
    char *text = slurp(vtk, NULL);
    assert_non_null(text);
    assert_memory_equal(text, "# vtk DataFile", 14);
    free(text);
    corax_program_free(prog);
    corax_job_clear(&job);
}

/* Layers asked for that the export cannot make: a usage message, CORAX_EARG
 * and no file. */
static void test_export_refuses_layers_as_usage(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_program *prog = program(&job, DATA "collars.csv", DATA "surveys.csv");
    corax_export_job_options o = corax_export_job_options_default();
    o.format = CORAX_EXPORT_JOB_GIS;
    o.format_name = "gpkg";
    o.layers = "no-such-layer";
    const char *gpkg = out("layers.gpkg");
    corax_export_job_summary sum;
    assert_int_equal(corax_export_job_run(&job, prog, &o, NULL, 0, gpkg, &sum), CORAX_EARG);
    assert_false(exists(gpkg));
    assert_true(job.nmessages >= 1);
    assert_true(job.message[job.nmessages - 1].usage);
    corax_program_free(prog);
    corax_job_clear(&job);
}

static void test_solve_sets(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_program *prog = program(&job, DATA "solve_collars.csv", DATA "solve_surveys.csv");
    const char *inputs[] = {DATA "solve_readings.csv"};
    corax_solve_job_options o = corax_solve_job_options_default();
    o.draws = 50;
    o.residuals = out("residuals.csv");
    const char *table = out("solved.csv");
    corax_solve_job_summary sum;
    assert_int_equal(corax_solve_job_run(&job, prog, &o, inputs, 1, table, &sum), CORAX_OK);
    size_t by_status = 0;
    for (int s = 0; s <= CORAX_SOLVE_NO_READINGS; s++)
        by_status += sum.count[s];
    assert_int_equal(by_status, sum.sets);
    assert_true(sum.sets > 0);
    assert_true(lines(table) >= sum.sets + 1); /* a row per set and candidate */
    assert_int_equal(sum.readings, lines(DATA "solve_readings.csv") - 1);
    assert_int_equal(lines(o.residuals), sum.readings + 1);
    corax_program_free(prog);
    corax_job_clear(&job);
}

static void test_plan_holes_by_sets(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    corax_plan_job_options o = corax_plan_job_options_default();
    o.holes = DATA "plan_holes.csv";
    o.sets = DATA "plan_sets.csv";
    const char *table = out("sampling.csv");
    corax_plan_job_summary sum;
    assert_int_equal(corax_plan_job_run(&job, &o, table, &sum), CORAX_OK);
    assert_int_equal(sum.nholes, lines(DATA "plan_holes.csv") - 1);
    assert_int_equal(sum.nsets, lines(DATA "plan_sets.csv") - 1);
    assert_int_equal(lines(table), sum.nholes * sum.nsets + 1);
    for (size_t i = 0; i < sum.nsets; i++)
        assert_true(sum.set[i].program.holes_ok <= sum.nholes);
    corax_plan_job_summary_clear(&sum);
    corax_job_clear(&job);
}

static void test_stereonet_net_and_stats(void **state)
{
    (void)state;
    corax_job job;
    watch w;
    job_start(&job, &w, NULL);
    const char *inputs[] = {DATA "converted.csv"};
    corax_stereonet_job_options o = corax_stereonet_job_options_default();
    o.group_by = "kind";
    o.stats = out("stats.csv");
    const char *svg = out("net.svg");
    corax_stereonet_job_summary sum;
    assert_int_equal(corax_stereonet_job_run(&job, &o, inputs, 1, svg, &sum), CORAX_OK);
    assert_true(sum.groups > 1);
    assert_true(lines(o.stats) >= sum.groups + 1); /* a row per group and kind of data */
    char *text = slurp(svg, NULL);
    assert_non_null(text);
    assert_non_null(strstr(text, "<svg"));
    free(text);
    corax_job_clear(&job);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_convert_alike_on_any_threads),
        cmocka_unit_test(test_convert_draws_and_cloud),
        cmocka_unit_test(test_failure_is_a_message_and_no_file),
        cmocka_unit_test(test_outputs_held_until_published),
        cmocka_unit_test(test_trace_at_keeps_every_row),
        cmocka_unit_test(test_check_findings_agree),
        cmocka_unit_test(test_section_accounts_for_every_row),
        cmocka_unit_test(test_export_csv_and_vtk),
        cmocka_unit_test(test_export_refuses_layers_as_usage),
        cmocka_unit_test(test_solve_sets),
        cmocka_unit_test(test_plan_holes_by_sets),
        cmocka_unit_test(test_stereonet_net_and_stats),
    };
    return cmocka_run_group_tests_name("jobs", tests, setup, teardown);
}
