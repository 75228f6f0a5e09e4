/* Test helpers shared by the cmocka suites. */
#ifndef CORAX_TEST_CHECK_H
#define CORAX_TEST_CHECK_H

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>

#include <cmocka.h>

#include "corax/qa.h"

/* |a - b| <= atol + rtol |b|, else fail with both values and the context
 * (which should name the source of the expected value). cmocka 1.1.5 has no
 * double assertion, and assert_float_equal rounds to float. */
void check_close_at(double actual, double expected, double rtol, double atol,
                    const char *what, const char *file, int line);
#define assert_close(a, b, rtol, atol, what) \
    check_close_at((a), (b), (rtol), (atol), (what), __FILE__, __LINE__)

/* The angle between two azimuths in degrees, in [0, 180]. */
double azimuth_gap(double a, double b);

/* A fixed-seed uniform number in [0, 1) for property tests (splitmix64). */
double test_uniform(uint64_t *state);

/* A path for a scratch file under the build's temporary folder. */
const char *test_tmp_path(const char *name);

/* Write text to a file (for table tests); fails the test on error. */
void test_write_file(const char *path, const char *text);

/* A sorted QA log of n readings (corax_qa_log_sort()); fails the test on
 * error. corax_qa_log_free() it. */
corax_qa_log *test_qa_log(const corax_qa_reading *r, size_t n);

/* A whole file in memory, NUL-terminated (it may hold other NULs: *length,
 * which may be NULL, gets its size); fails the test on error. free() it. */
char *test_read_file(const char *path, size_t *length);

#endif
