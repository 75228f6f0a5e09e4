/* Test helpers shared by the cmocka suites. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <sys/stat.h>
#include <unistd.h>

#include "check.h"

void check_close_at(double actual, double expected, double rtol, double atol,
                    const char *what, const char *file, int line)
{
    double tol = atol + rtol * fabs(expected);
    if (!(fabs(actual - expected) <= tol)) {
        print_error("%s: got %.12g, expected %.12g (tolerance %.3g)\n", what, actual, expected,
                    tol);
        _fail(file, line);
    }
}

double azimuth_gap(double a, double b)
{
    double d = fmod(fabs(a - b), 360.0);
    return d > 180.0 ? 360.0 - d : d;
}

double test_uniform(uint64_t *s)
{
    uint64_t z = (*s += 0x9E3779B97F4A7C15u);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9u;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBu;
    z ^= z >> 31;
    return (double)(z >> 11) * 0x1.0p-53;
}

const char *test_tmp_path(const char *name)
{
    static char buf[4][512];
    static int k;
    const char *dir = getenv("CORAX_TEST_TMP");
    if (!dir)
        dir = "/tmp";
    mkdir(dir, 0777);
    k = (k + 1) % 4;
    snprintf(buf[k], sizeof buf[k], "%s/%ld-%s", dir, (long)getpid(), name);
    return buf[k];
}

char *test_read_file(const char *path, size_t *length)
{
    FILE *f = fopen(path, "rb");
    assert_non_null(f);
    assert_int_equal(fseek(f, 0, SEEK_END), 0);
    long n = ftell(f);
    assert_true(n >= 0);
    rewind(f);
    char *buf = malloc((size_t)n + 1);
    assert_non_null(buf);
    assert_int_equal(fread(buf, 1, (size_t)n, f), (size_t)n);
    buf[n] = '\0';
    fclose(f);
    if (length)
        *length = (size_t)n;
    return buf;
}

void test_write_file(const char *path, const char *text)
{
    FILE *f = fopen(path, "wb");
    assert_non_null(f);
    fputs(text, f);
    assert_int_equal(fclose(f), 0);
}

corax_qa_log *test_qa_log(const corax_qa_reading *r, size_t n)
{
    corax_qa_log *log = corax_qa_log_new();
    assert_non_null(log);
    for (size_t i = 0; i < n; i++)
        assert_int_equal(corax_qa_log_add(log, &r[i]), CORAX_OK);
    assert_int_equal(corax_qa_log_sort(log), CORAX_OK);
    return log;
}
