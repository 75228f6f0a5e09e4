/* Tests of the io module: numbers, CSV reading and writing, column names,
 * whole-or-nothing output files, and loading a drill program. */
#include <dirent.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "common/format.h"
#include "corax/load.h"
#include "corax/output.h"
#include "corax/table.h"
#include "io/spool.h"
#include "support/check.h"

static corax_number_status parse(const char *s, char decimal, double *v)
{
    return corax_parse_number(s, strlen(s), decimal, v);
}

static void test_numbers_parse_like_strtod(void **state)
{
    (void)state;
    static const char *const ok[] = {
        "0", "-0", "12", "+12", "12.5", ".5", "5.", "-0.000123", "1e3", "1.5E-7", "  42.25\t",
        "123456789012345678901234567890", "0.1", "0.3", "359.99", "1e308", "4.9e-324",
        "9007199254740993", "3.141592653589793238462643383279", "1e-400",
    };
    for (size_t i = 0; i < sizeof ok / sizeof ok[0]; i++) {
        double v = -1, ref = strtod(ok[i], NULL);
        assert_int_equal(parse(ok[i], '.', &v), CORAX_NUMBER_OK);
        /* strtod (C library) is the reference: correctly rounded */
        assert_memory_equal(&v, &ref, sizeof v);
    }
    uint64_t seed = 11;
    char buf[64];
    for (int i = 0; i < 100000; i++) { /* random short decimals, as in drill logs */
        double x = (test_uniform(&seed) - 0.5) * pow(10, (int)(test_uniform(&seed) * 12) - 4);
        snprintf(buf, sizeof buf, "%.*f", (int)(test_uniform(&seed) * 9), x);
        double v, ref = strtod(buf, NULL);
        assert_int_equal(parse(buf, '.', &v), CORAX_NUMBER_OK);
        if (v != ref)
            fail_msg("'%s' parsed as %.17g, strtod gives %.17g", buf, v, ref);
    }
    for (int i = 0; i < 100000; i++) { /* any finite double, all its digits or some */
        double x;
        do {
            uint64_t bits = (uint64_t)(test_uniform(&seed) * 0x1p32) << 32 |
                            (uint64_t)(test_uniform(&seed) * 0x1p32);
            memcpy(&x, &bits, sizeof x);
        } while (!isfinite(x));
        if (i % 2)
            snprintf(buf, sizeof buf, "%.17g", x);
        else
            snprintf(buf, sizeof buf, "%.*e", (int)(test_uniform(&seed) * 20), x);
        double v, ref = strtod(buf, NULL);
        corax_number_status st = parse(buf, '.', &v);
        if (fabs(ref) == HUGE_VAL) /* beyond the doubles: refused, not rounded to infinity */
            assert_int_equal(st, CORAX_NUMBER_NOT_FINITE);
        else if (st != CORAX_NUMBER_OK || memcmp(&v, &ref, sizeof v) != 0)
            fail_msg("'%s' parsed as %.17g, strtod gives %.17g", buf, v, ref);
    }
}

static void test_numbers_refused(void **state)
{
    (void)state;
    double v = 7;
    assert_int_equal(parse("", '.', &v), CORAX_NUMBER_EMPTY);
    assert_int_equal(parse("   ", '.', &v), CORAX_NUMBER_EMPTY);
    static const char *const bad[] = {"abc", "12abc", "1.2.3", "--1", "1e", "e5", ".", "-",
                                      "0x10", "1,5", "12 3", "1e+"};
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++)
        assert_int_equal(parse(bad[i], '.', &v), CORAX_NUMBER_NOT_NUMBER);
    static const char *const inf[] = {"nan", "NaN", "-inf", "Infinity", "1e400", "-1e309"};
    for (size_t i = 0; i < sizeof inf / sizeof inf[0]; i++)
        assert_int_equal(parse(inf[i], '.', &v), CORAX_NUMBER_NOT_FINITE);
    assert_close(v, 7, 0, 0, "a refused number leaves the value alone");
}

static void test_decimal_comma(void **state)
{
    (void)state;
    double v;
    assert_int_equal(parse("-12,75", ',', &v), CORAX_NUMBER_OK);
    assert_close(v, -12.75, 0, 0, "decimal comma");
    assert_int_equal(parse("1,5e2", ',', &v), CORAX_NUMBER_OK);
    assert_close(v, 150, 0, 0, "decimal comma with exponent");
    assert_int_equal(parse("12.75", ',', &v), CORAX_NUMBER_NOT_NUMBER);
}

/* A value for the formatter's sweep: spread over magnitudes, on and next to
 * ties at d decimals, or any finite bit pattern. */
static double format_sample(uint64_t *seed, int d, int kind)
{
    double x;
    switch (kind) {
    case 0:
        return (test_uniform(seed) - 0.5) * pow(10, (int)(test_uniform(seed) * 18) - 4);
    case 1: /* a decimal tie, as the nearest double gives it */
        x = floor(test_uniform(seed) * 1e6) / pow(10, (int)(test_uniform(seed) * 7)) +
            0.5 * pow(10, -d);
        return test_uniform(seed) < 0.5 ? -x : x;
    case 2: /* exact binary ties: multiples of 2^-k */
        return ldexp(floor(test_uniform(seed) * 1e6), -(int)(test_uniform(seed) * 12));
    default:
        do {
            uint64_t bits = (uint64_t)(test_uniform(seed) * 0x1p32) << 32 |
                            (uint64_t)(test_uniform(seed) * 0x1p32);
            memcpy(&x, &bits, sizeof x);
        } while (!isfinite(x));
        return x;
    }
}

/* The fixed formatter against the C library's printf("%.*f") (the reference:
 * the exact binary value rounded half to even; docs/check-values.md), digit
 * for digit, on a random sweep, ties and random bit patterns included; only
 * -0 differs, by design. */
static void test_fixed_format_matches_printf(void **state)
{
    (void)state;
    uint64_t seed = 5;
    char a[64], b[64];
    for (int i = 0; i < 400000; i++) {
        int d = (int)(test_uniform(&seed) * 10);
        double x = format_sample(&seed, d, i % 4);
        if (!(fabs(x) * pow(10, d) < 9e15))
            continue; /* all 17 digits instead: checked below */
        size_t n = corax_format_fixed(a, x, d);
        a[n] = '\0';
        snprintf(b, sizeof b, "%.*f", d, x);
        if (b[0] == '-' && strtod(b, NULL) == 0.0) /* we never print -0 */
            memmove(b, b + 1, strlen(b));
        if (strcmp(a, b) != 0)
            fail_msg("%.17g to %d places: '%s', printf '%s'", x, d, a, b);
    }
    static const struct {
        double x;
        int d;
        const char *text;
    } ties[] = {{0.125, 2, "0.12"}, {0.375, 2, "0.38"}, {2.5, 0, "2"}, {-3.5, 0, "-4"},
                {1.005, 2, "1.00"}, {0.0625, 3, "0.062"}};
    for (size_t i = 0; i < sizeof ties / sizeof ties[0]; i++) {
        a[corax_format_fixed(a, ties[i].x, ties[i].d)] = '\0';
        assert_string_equal(a, ties[i].text);
    }
    assert_int_equal(corax_format_fixed(a, NAN, 2), 0);
    a[corax_format_fixed(a, -0.0001, 2)] = '\0';
    assert_string_equal(a, "0.00");
    a[corax_format_fixed(a, -1e300, 1)] = '\0';
    assert_close(strtod(a, NULL), -1e300, 1e-16, 0, "huge values keep all their digits");
}

/* The notes' thresholds as printf's "%.3g" gives them, digit for digit: whole
 * numbers without printf, anything else through it. The C library's printf
 * is the reference (docs/check-values.md). */
static void test_g3_matches_printf(void **state)
{
    (void)state;
    uint64_t seed = 9;
    char a[64], b[64];
    for (int i = 0; i < 100000; i++) {
        double x = i % 3 == 0 ? floor((test_uniform(&seed) - 0.5) * 2400)
                   : i % 3 == 1 ? (test_uniform(&seed) - 0.5) * pow(10, (int)(test_uniform(&seed) * 8) - 3)
                                : floor(test_uniform(&seed) * 2000) / 4;
        a[corax_format_g3(a, x)] = '\0';
        snprintf(b, sizeof b, "%.3g", x);
        if (strcmp(a, b) != 0)
            fail_msg("%.17g: '%s', printf '%s'", x, a, b);
    }
    a[corax_format_g3(a, -0.0)] = '\0';
    assert_string_equal(a, "-0");
}

/* A note's phrases from pieces are cut short exactly as printf's are. */
static void test_note_pieces_like_note_add(void **state)
{
    (void)state;
    const char *const piece[] = {"alpha ", "7.5", " is below ", "10", ": a phrase"};
    for (size_t size = 1; size < 80; size++) {
        char a[80], b[80];
        size_t ua = 0, ub = 0;
        a[0] = b[0] = '\0';
        corax_note_add(a, size, &ua, "first");
        corax_note_add(b, size, &ub, "first");
        corax_note_pieces(a, size, &ua, piece, 5);
        corax_note_add(b, size, &ub, "%s%s%s%s%s", piece[0], piece[1], piece[2], piece[3], piece[4]);
        assert_int_equal(ua, ub);
        assert_string_equal(a, b);
    }
}

/* Read a whole small table into one string: fields joined by '|', rows by '/',
 * each row prefixed with its line. */
static corax_status slurp(const char *path, corax_table_format fmt, char *out, size_t n,
                          corax_error *err)
{
    corax_reader *r;
    corax_status st = corax_reader_open(path, fmt, &r, err);
    if (st != CORAX_OK)
        return st;
    corax_row row;
    size_t used = 0;
    out[0] = '\0';
    while ((st = corax_reader_next(r, &row, err)) == CORAX_OK) {
        used += (size_t)snprintf(out + used, n - used, "%ld:", row.line);
        for (size_t i = 0; i < row.count; i++)
            used += (size_t)snprintf(out + used, n - used, "%s%s", i ? "|" : "", row.field[i]);
        used += (size_t)snprintf(out + used, n - used, "/");
    }
    corax_reader_close(r);
    return st;
}

static void test_reader_handles_real_world_csv(void **state)
{
    (void)state;
    const char *path = test_tmp_path("real.csv");
    char got[1024];
    corax_table_format f = corax_table_format_default();
    /* byte-order mark, CRLF, blank line, quoted comma, doubled quote, quoted
     * newline, trailing spaces, last line without a line end */
    test_write_file(path, "\xEF\xBB\xBFhole,depth,note\r\nA,1.5,\"x, y\"\r\n\r\n"
                          "B , 2 ,\"say \"\"hi\"\"\"\r\nC,3,\"two\r\nlines\"\r\nD,4,end");
    assert_int_equal(slurp(path, f, got, sizeof got, NULL), CORAX_END);
    assert_string_equal(got, "1:hole|depth|note/2:A|1.5|x, y/4:B|2|say \"hi\"/"
                             "5:C|3|two\r\nlines/7:D|4|end/");
    /* old Mac line ends (CR only) count as lines too */
    test_write_file(path, "a,b\rc,d\re,f\r");
    assert_int_equal(slurp(path, f, got, sizeof got, NULL), CORAX_END);
    assert_string_equal(got, "1:a|b/2:c|d/3:e|f/");
    /* semicolons, with decimal commas left inside fields */
    f.delimiter = ';';
    f.decimal = ',';
    test_write_file(path, "hole;depth\nA;12,5\n");
    assert_int_equal(slurp(path, f, got, sizeof got, NULL), CORAX_END);
    assert_string_equal(got, "1:hole|depth/2:A|12,5/");
    unlink(path);
}

static void test_reader_faults(void **state)
{
    (void)state;
    const char *path = test_tmp_path("broken.csv");
    char got[256];
    corax_error err;
    corax_table_format f = corax_table_format_default();
    test_write_file(path, "a,b\n1,2\n3,\"never closed\n4,5\n");
    assert_int_equal(slurp(path, f, got, sizeof got, &err), CORAX_EFORMAT);
    assert_int_equal(err.line, 3);
    assert_string_equal(err.file, path);
    unlink(path);
    assert_int_equal(slurp(path, f, got, sizeof got, &err), CORAX_EIO);
    assert_non_null(strstr(err.message, "cannot open"));
    test_write_file(path, "");
    assert_int_equal(slurp(path, f, got, sizeof got, &err), CORAX_END);
    assert_string_equal(got, "");
    unlink(path);
}

/* A table bigger than the reader's block, with rows straddling block edges. */
static void test_reader_large_file(void **state)
{
    (void)state;
    const char *path = test_tmp_path("large.csv");
    FILE *fp = fopen(path, "w");
    assert_non_null(fp);
    fprintf(fp, "hole,depth,text\n");
    for (int i = 0; i < 120000; i++)
        fprintf(fp, "H%d,%d.5,\"quoted, %d\"\r\n", i % 97, i, i);
    fclose(fp);
    corax_reader *r;
    assert_int_equal(corax_reader_open(path, corax_table_format_default(), &r, NULL), CORAX_OK);
    corax_row row;
    long n = 0;
    char want[64];
    while (corax_reader_next(r, &row, NULL) == CORAX_OK) {
        if (n > 0) {
            assert_int_equal(row.count, 3);
            snprintf(want, sizeof want, "quoted, %ld", n - 1);
            assert_string_equal(row.field[2], want);
            assert_int_equal(row.line, n + 1);
        }
        n++;
    }
    assert_int_equal(n, 120001);
    corax_reader_close(r);
    unlink(path);
}

/* A line of blanks cut by the end of a read block (1 MiB) is a blank row
 * all the same, as it is anywhere else (found by fuzzing the reader in
 * small blocks). */
static void test_reader_blank_line_across_blocks(void **state)
{
    (void)state;
    const char *path = test_tmp_path("cut_blank.csv");
    FILE *fp = fopen(path, "w");
    assert_non_null(fp);
    fputs("a,b\n", fp);
    for (int i = 0; i < 262142; i++) /* to byte 1,048,572 */
        fputs("1,2\n", fp);
    fputs("    \n", fp); /* four blanks before byte 1 MiB, the line end after */
    fputs(",\n1,2\n", fp);
    fclose(fp);
    corax_reader *r;
    assert_int_equal(corax_reader_open(path, corax_table_format_default(), &r, NULL), CORAX_OK);
    corax_row row;
    size_t rows = 0;
    while (corax_reader_next(r, &row, NULL) == CORAX_OK)
        rows++;
    corax_table_info info;
    corax_reader_info(r, &info);
    assert_int_equal(rows, 1 + 262142 + 1);
    assert_int_equal(info.blank_rows, 2); /* the blank line and the row "," */
    assert_int_equal(row.line, 262146);
    corax_reader_close(r);
    unlink(path);
}

/* A random field for the round trip: letters, digits, inner blanks, and now
 * and then a delimiter, a quote or a line end (which need quotes). */
static size_t random_field(uint64_t *seed, char *out, int first)
{
    static const char chars[] = "abcxyz0189.- ,\"\n\r";
    size_t n = (size_t)(test_uniform(seed) * (test_uniform(seed) < 0.9 ? 12 : 70)) + first;
    for (size_t i = 0; i < n; i++) {
        size_t k = (size_t)(test_uniform(seed) * (test_uniform(seed) < 0.9 ? 10 : 17));
        out[i] = chars[k];
        if (out[i] == ' ' && (i == 0 || i + 1 == n))
            out[i] = 'q'; /* blanks around a value are not part of it */
    }
    out[n] = '\0';
    return n;
}

/* Property: any table, written with the quoting CSV asks for and a random
 * line end on each row (LF, CRLF, CR), reads back field for field with the
 * right line numbers, across the reader's blocks: the word-at-a-time line
 * scan and the in-place split agree with libcsv on every byte. */
static void test_reader_round_trip(void **state)
{
    (void)state;
    enum { ROWS = 30000, WIDTH = 8 };
    static const char *const ends[] = {"\n", "\r\n", "\r"};
    const char *path = test_tmp_path("round.csv");
    FILE *fp = fopen(path, "wb");
    assert_non_null(fp);
    uint64_t seed = 404, replay = seed;
    long *lines = malloc(ROWS * sizeof *lines), line = 1;
    assert_non_null(lines);
    char field[128];
    for (int r = 0; r < ROWS; r++) {
        int width = 1 + (int)(test_uniform(&seed) * WIDTH);
        lines[r] = line;
        for (int c = 0; c < width; c++) {
            size_t n = random_field(&seed, field, c == 0);
            int quoted = strpbrk(field, ",\"\n\r") != NULL || test_uniform(&seed) < 0.05;
            fputs(c ? "," : "", fp);
            if (!quoted) {
                fputs(field, fp);
                continue;
            }
            fputc('"', fp);
            for (size_t i = 0; i < n; i++) {
                fputc(field[i], fp);
                if (field[i] == '"')
                    fputc('"', fp);
                /* a quoted CR LF is one line end, as is a lone CR or LF */
                line += field[i] == '\n' ? !(i && field[i - 1] == '\r') : field[i] == '\r';
            }
            fputc('"', fp);
        }
        fputs(ends[(int)(test_uniform(&seed) * 3)], fp);
        line++;
    }
    fclose(fp);
    corax_reader *rd;
    corax_table_format f = {',', '.'};
    assert_int_equal(corax_reader_open(path, f, &rd, NULL), CORAX_OK);
    corax_row row;
    for (int r = 0; r < ROWS; r++) {
        assert_int_equal(corax_reader_next(rd, &row, NULL), CORAX_OK);
        int width = 1 + (int)(test_uniform(&replay) * WIDTH);
        assert_int_equal(row.count, (size_t)width);
        assert_int_equal(row.line, lines[r]);
        for (int c = 0; c < width; c++) {
            size_t n = random_field(&replay, field, c == 0);
            if (!(strpbrk(field, ",\"\n\r") != NULL))
                (void)test_uniform(&replay);
            assert_int_equal(row.length[c], n);
            assert_string_equal(row.field[c], field);
        }
        (void)test_uniform(&replay); /* the line end */
    }
    assert_int_equal(corax_reader_next(rd, &row, NULL), CORAX_END);
    corax_reader_close(rd);
    free(lines);
    unlink(path);
}

/* Blanks around a value are not part of it (the reader's rule): none at
 * either end of a field of the writer's round trip; the field ended. */
static void unblank(char *field, size_t n)
{
    if (n && (field[0] == ' ' || field[0] == '\t'))
        field[0] = 'q';
    if (n && (field[n - 1] == ' ' || field[n - 1] == '\t'))
        field[n - 1] = 'q';
    field[n] = '\0';
}

/* Property: any row of fields written through the writer (short fields
 * copied and checked at once, long ones the slow way; delimiters, quotes,
 * line ends, tabs, a '#' opening the row) reads back field for field, with
 * comma and with semicolon as the delimiter. Fields are never empty: a row
 * of empty fields is a blank line to the reader. */
static void test_writer_fields_read_back(void **state)
{
    (void)state;
    enum { ROWS = 20000, WIDTH = 7 };
    static const char chars[] = "abxyz0189.- ,;\"\n\r\t#";
    const char delimiters[] = {',', ';'};
    for (int k = 0; k < 2; k++) {
        const char *path = test_tmp_path("written.csv");
        corax_writer *w;
        assert_int_equal(corax_writer_open(path, &w, NULL), CORAX_OK);
        corax_table_format f = {delimiters[k], '.'};
        corax_writer_format(w, f);
        uint64_t seed = 77 + (uint64_t)k, replay = seed;
        char field[128];
        for (int r = 0; r < ROWS; r++) {
            int width = 1 + (int)(test_uniform(&seed) * WIDTH);
            for (int c = 0; c < width; c++) {
                size_t n = 1 + (size_t)(test_uniform(&seed) * (test_uniform(&seed) < 0.8 ? 33 : 90));
                for (size_t i = 0; i < n; i++)
                    field[i] = chars[(size_t)(test_uniform(&seed) *
                                              (test_uniform(&seed) < 0.9 ? 12 : 18))];
                unblank(field, n);
                corax_writer_field(w, field, n);
            }
            corax_writer_end_row(w);
        }
        assert_int_equal(corax_writer_commit(w, NULL), CORAX_OK);
        corax_reader *rd;
        assert_int_equal(corax_reader_open(path, f, &rd, NULL), CORAX_OK);
        corax_row row;
        for (int r = 0; r < ROWS; r++) {
            int width = 1 + (int)(test_uniform(&replay) * WIDTH);
            char want[WIDTH][128];
            size_t len[WIDTH];
            for (int c = 0; c < width; c++) {
                len[c] = 1 + (size_t)(test_uniform(&replay) * (test_uniform(&replay) < 0.8 ? 33 : 90));
                for (size_t i = 0; i < len[c]; i++)
                    want[c][i] = chars[(size_t)(test_uniform(&replay) *
                                                (test_uniform(&replay) < 0.9 ? 12 : 18))];
                unblank(want[c], len[c]);
            }
            assert_int_equal(corax_reader_next(rd, &row, NULL), CORAX_OK);
            assert_int_equal(row.count, (size_t)width);
            for (int c = 0; c < width; c++) {
                assert_int_equal(row.length[c], len[c]);
                assert_memory_equal(row.field[c], want[c], len[c]);
            }
        }
        assert_int_equal(corax_reader_next(rd, &row, NULL), CORAX_END);
        corax_reader_close(rd);
        unlink(path);
    }
}

static void test_writer_quotes_and_commits_whole(void **state)
{
    (void)state;
    const char *path = test_tmp_path("out.csv");
    unlink(path);
    corax_writer *w;
    assert_int_equal(corax_writer_open(path, &w, NULL), CORAX_OK);
    corax_writer_field(w, "plain", 5);
    corax_writer_field(w, "a,b", 3);
    corax_writer_field(w, "say \"hi\"", 8);
    corax_writer_field(w, " lead", 5);
    corax_writer_number(w, 12.3456, 2);
    corax_writer_azimuth(w, 359.996, 2);
    corax_writer_number(w, NAN, 2);
    corax_writer_integer(w, -17);
    corax_writer_end_row(w);
    assert_int_equal(access(path, F_OK), -1); /* nothing under the real name yet */
    assert_int_equal(corax_writer_commit(w, NULL), CORAX_OK);
    char got[256];
    assert_int_equal(slurp(path, corax_table_format_default(), got, sizeof got, NULL), CORAX_END);
    FILE *fp = fopen(path, "r");
    char line[256];
    assert_non_null(fgets(line, sizeof line, fp));
    fclose(fp);
    assert_string_equal(line, "plain,\"a,b\",\"say \"\"hi\"\"\",\" lead\",12.35,0.00,,-17\n");

    /* a discarded output leaves the earlier file untouched and no temporary */
    assert_int_equal(corax_writer_open(path, &w, NULL), CORAX_OK);
    corax_writer_text(w, "half", 4);
    corax_writer_discard(w);
    fp = fopen(path, "r");
    assert_non_null(fgets(line, sizeof line, fp));
    fclose(fp);
    assert_string_equal(line, "plain,\"a,b\",\"say \"\"hi\"\"\",\" lead\",12.35,0.00,,-17\n");
    unlink(path);

    corax_error err;
    assert_int_equal(corax_writer_open("/nonexistent-dir/x.csv", &w, &err), CORAX_EIO);
    assert_string_equal(err.file, "/nonexistent-dir/x.csv");
}

/* The whole text of a small file ("" when it cannot be read). */
static const char *file_text(const char *path)
{
    static char buf[256];
    FILE *fp = fopen(path, "r");
    size_t n = fp ? fread(buf, 1, sizeof buf - 1, fp) : 0;
    if (fp)
        fclose(fp);
    buf[n] = '\0';
    return buf;
}

/* One output of a run cannot be put in place at the end: every other output
 * made public before it is put back as it was (found by fuzzing the
 * commands with a failed rename). */
static void test_outputs_all_or_nothing(void **state)
{
    (void)state;
    const char *old = test_tmp_path("kept.csv"), *fresh = test_tmp_path("fresh.csv");
    const char *blocked = test_tmp_path("blocked.csv");
    char inside[600];
    snprintf(inside, sizeof inside, "%s/x", blocked);
    test_write_file(old, "old\n");
    unlink(fresh);
    corax_outputs *set = corax_outputs_new();
    assert_non_null(set);
    const char *path[] = {old, fresh, blocked};
    for (int i = 0; i < 3; i++) {
        corax_writer *w;
        assert_int_equal(corax_writer_open_in(set, path[i], &w, NULL), CORAX_OK);
        corax_writer_text(w, "new\n", 4);
        assert_int_equal(corax_writer_commit(w, NULL), CORAX_OK);
    }
    assert_int_equal(corax_outputs_pending(set), 3);
    /* the last one's place is taken by a folder that is not empty */
    assert_int_equal(mkdir(blocked, 0777), 0);
    test_write_file(inside, "x");
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_outputs_publish(set, &err), CORAX_EIO);
    assert_string_equal(err.file, blocked);
    assert_string_equal(file_text(old), "old\n"); /* put back */
    assert_int_equal(access(fresh, F_OK), -1);     /* new: gone again */
    assert_int_equal(corax_outputs_pending(set), 0);
    corax_outputs_free(set);
    unlink(inside);
    rmdir(blocked);

    /* published whole: every file new, no second name left behind */
    set = corax_outputs_new();
    corax_writer *w;
    assert_int_equal(corax_writer_open_in(set, old, &w, NULL), CORAX_OK);
    corax_writer_text(w, "new\n", 4);
    assert_int_equal(corax_writer_commit(w, NULL), CORAX_OK);
    assert_int_equal(corax_outputs_publish(set, &err), CORAX_OK);
    assert_string_equal(file_text(old), "new\n");
    corax_outputs_free(set);
    unlink(old);
}

/* A row opening with '#' would be a comment to the reader: the writer quotes
 * it, so a converted row whose hole is "#1" reads back (found by fuzzing
 * convert: every row of the log must come out, and read back). */
static void test_writer_quotes_a_row_opening_hash(void **state)
{
    (void)state;
    corax_writer *w;
    assert_int_equal(corax_writer_memory(&w), CORAX_OK);
    corax_writer_field(w, "#1", 2);
    corax_writer_field(w, "#2", 2);
    corax_writer_end_row(w);
    corax_writer_field(w, "a#", 2);
    corax_writer_end_row(w);
    size_t n;
    const char *text = corax_writer_contents(w, &n);
    assert_int_equal(n, strlen("\"#1\",#2\na#\n"));
    assert_memory_equal(text, "\"#1\",#2\na#\n", n);
    const char *path = test_tmp_path("hash.csv");
    FILE *fp = fopen(path, "w");
    assert_non_null(fp);
    fwrite(text, 1, n, fp);
    fclose(fp);
    corax_writer_discard(w);
    char got[64];
    assert_int_equal(slurp(path, corax_table_format_default(), got, sizeof got, NULL), CORAX_END);
    assert_string_equal(got, "1:#1|#2/2:a#/");
    unlink(path);
}

static void test_column_names_and_mapping(void **state)
{
    (void)state;
    const char *names[] = {"HOLE_NO", "Depth_M", "Easting", "Z", "depth", "Collar RL"};
    size_t len[6];
    for (int i = 0; i < 6; i++)
        len[i] = strlen(names[i]);
    corax_row header = {5, names, len, 1};
    assert_int_equal(corax_column_find(&header, "x", NULL), 2);
    assert_int_equal(corax_column_find(&header, "z", NULL), 3);
    assert_int_equal(corax_column_find(&header, "hole", NULL), 0); /* a usual spelling */
    assert_int_equal(corax_column_find(&header, "gamma", NULL), -1);
    assert_int_equal(corax_column_find(&header, "depth", NULL), 4);
    /* spaces, underscores, hyphens and full stops are one mark */
    corax_row spaced = {6, names, len, 1};
    spaced.field = names + 5;
    spaced.length = len + 5;
    spaced.count = 1;
    assert_int_equal(corax_column_find(&spaced, "z", NULL), 0);
    assert_true(corax_column_name_match("Hole ID", 7, "hole_id", 7));
    assert_true(corax_column_name_match("hole-id", 7, "HOLE.ID", 7));
    assert_false(corax_column_name_match("holeid", 6, "hole_id", 7));
    corax_column_map *map = NULL;
    corax_error err;
    assert_int_equal(corax_column_map_add(&map, "hole=hole_no, depth = DEPTH_M", &err), CORAX_OK);
    assert_int_equal(corax_column_find(&header, "hole", map), 0);
    assert_int_equal(corax_column_find(&header, "depth", map), 1);
    assert_int_equal(corax_column_map_add(&map, "depth=Z", &err), CORAX_OK);
    assert_int_equal(corax_column_find(&header, "depth", map), 3);
    /* a mapped header the table lacks never falls back to the usual names */
    assert_int_equal(corax_column_map_add(&map, "depth=DEPTH_FT", &err), CORAX_OK);
    assert_int_equal(corax_column_find(&header, "depth", map), CORAX_COLUMN_MAPPED_MISSING);
    assert_string_equal(corax_column_mapped(map, "depth"), "DEPTH_FT");
    assert_int_equal(corax_column_map_add(&map, "colour=red", &err), CORAX_EARG);
    assert_non_null(strstr(err.message, "colour"));
    assert_int_equal(corax_column_map_add(&map, "hole", &err), CORAX_EARG);
    assert_int_equal(corax_column_map_add(&map, "hole=", &err), CORAX_EARG);
    corax_column_map_free(map);

    const char *dup[] = {"hole", "depth", "DEPTH"};
    size_t dlen[] = {4, 5, 5};
    corax_row h2 = {3, dup, dlen, 3};
    assert_int_equal(corax_header_check(&h2, &err), CORAX_EFORMAT);
    assert_int_equal(err.line, 3);
    assert_non_null(strstr(err.message, "columns 2 and 3"));
}

/* Loading a program: row faults become findings at their file and line. */
static void test_load_program_reports_row_faults(void **state)
{
    (void)state;
    const char *cpath = test_tmp_path("collars.csv"), *spath = test_tmp_path("surveys.csv");
    test_write_file(cpath, "hole,x,y,z,azimuth,dip,length\n"
                           "A,100,200,50,90,-60,300\n"
                           "B,abc,200,50,,,\n"          /* line 3: bad x */
                           "C,0,0,0,,,\n"               /* no direction, no surveys */
                           "D,1,2,3,45,-95,\n"          /* line 5: dip out of range */
                           "A,1,1,1,,,\n");             /* line 6: second collar */
    test_write_file(spath, "hole,depth,azimuth,dip\n"
                           "A,0,90,-60\n"
                           "A,100,361,-60\n"            /* line 3: azimuth out of range */
                           "A,50,92,-59\n"
                           "Z,0,10,-50\n"               /* line 5: no collar */
                           "E,0,nan,-50\n");            /* line 6: not finite */
    corax_program *prog;
    corax_findings found = {0};
    corax_load_options o = corax_load_options_default();
    assert_int_equal(corax_program_load(cpath, spath, &o, &prog, &found, NULL, NULL), CORAX_OK);
    static const struct {
        long line;
        corax_severity sev;
        const char *words;
    } want[] = {
        {3, CORAX_ERROR, "x 'abc' is not a number"},
        {5, CORAX_ERROR, "dip -95 does not fit the table's dip convention, negative-down"},
        {3, CORAX_ERROR, "azimuth 361 is outside [0, 360]"},
        {6, CORAX_ERROR, "azimuth 'nan' is not a finite number"},
        {6, CORAX_ERROR, "second collar"},
        {5, CORAX_WARNING, "has surveys but no collar"},
    };
    assert_int_equal(found.count, 6);
    for (size_t i = 0; i < 6; i++) {
        assert_int_equal(found.item[i].line, want[i].line);
        assert_int_equal(found.item[i].severity, want[i].sev);
        if (!strstr(found.item[i].message, want[i].words))
            fail_msg("finding %zu: '%s' lacks '%s'", i, found.item[i].message, want[i].words);
    }
    assert_int_equal(corax_program_size(prog), 2);
    const corax_hole *a = corax_program_find(prog, "A", 1);
    assert_non_null(a);
    assert_int_equal(corax_hole_station_count(a), 2);
    corax_findings_clear(&found);
    corax_program_free(prog);

    /* a missing required column stops the load, naming the file and line */
    test_write_file(spath, "hole,at,azimuth,dip\nA,0,90,-60\n");
    corax_error err;
    assert_int_equal(corax_program_load(cpath, spath, &o, &prog, &found, NULL, &err), CORAX_EFORMAT);
    assert_string_equal(err.file, spath);
    assert_int_equal(err.line, 1);
    assert_non_null(strstr(err.message, "no 'depth' column"));
    /* ... and a mapping fixes it */
    corax_column_map *map = NULL;
    assert_int_equal(corax_column_map_add(&map, "depth=at", NULL), CORAX_OK);
    o.collars.columns = o.surveys.columns = map;
    assert_int_equal(corax_program_load(cpath, spath, &o, &prog, &found, NULL, &err), CORAX_OK);
    corax_program_free(prog);
    corax_column_map_free(map);
    corax_findings_clear(&found);
    unlink(cpath);
    unlink(spath);
}

/* A whole table in memory keeps every row, ragged or not, with its line. */
static void test_table_in_memory(void **state)
{
    (void)state;
    const char *path = test_tmp_path("table.csv");
    test_write_file(path, "Hole,Depth,Kind\nA,1.5,vein\n\nB,x\nC,3,\"joint, open\",extra\n");
    corax_table *t;
    assert_int_equal(corax_table_load(path, corax_table_format_default(), &t, NULL), CORAX_OK);
    assert_int_equal(corax_table_rows(t), 3);
    assert_int_equal(corax_table_columns(t), 3);
    assert_string_equal(corax_table_header_name(t, 2), "Kind");
    assert_int_equal(corax_table_find(t, "depth"), 1);
    assert_int_equal(corax_table_find(t, "dip"), -1);
    assert_int_equal(corax_table_width(t, 1), 2);
    assert_int_equal(corax_table_width(t, 2), 4);
    assert_int_equal(corax_table_line(t, 1), 4);
    assert_string_equal(corax_table_cell(t, 2, 2, NULL), "joint, open");
    assert_string_equal(corax_table_cell(t, 1, 2, NULL), "");
    assert_string_equal(corax_table_cell(t, 1, -1, NULL), "");
    double v;
    assert_int_equal(corax_table_number(t, 0, 1, &v), CORAX_NUMBER_OK);
    assert_close(v, 1.5, 0, 0, "number cell");
    assert_int_equal(corax_table_number(t, 1, 1, &v), CORAX_NUMBER_NOT_NUMBER);
    assert_true(isnan(v));
    corax_table_free(t);
    corax_error err;
    test_write_file(path, "a,b,A\n1,2,3\n");
    assert_int_equal(corax_table_load(path, corax_table_format_default(), &t, &err), CORAX_EFORMAT);
    assert_string_equal(err.file, path);
    unlink(path);
}

/* A record of the spool tests: its number and values made from it. */
typedef struct spooled {
    size_t i;
    double v[4];
    char tag[12];
} spooled;

static spooled spooled_record(size_t i)
{
    spooled r;
    memset(&r, 0, sizeof r);
    r.i = i;
    for (int k = 0; k < 4; k++)
        r.v[k] = (double)i * 0.001 + k;
    snprintf(r.tag, sizeof r.tag, "r%zu", i);
    return r;
}

/* n records into a spool beside `beside`; the status of the adding. */
static corax_status spool_fill(corax_spool *s, size_t n, corax_error *err)
{
    for (size_t i = 0; i < n; i++) {
        spooled r = spooled_record(i);
        corax_status st = corax_spool_add(s, &r, err);
        if (st != CORAX_OK)
            return st;
    }
    return CORAX_OK;
}

/* Every record read back in order, three times over. */
static void spool_reads_back(corax_spool *s, size_t n)
{
    for (int pass = 0; pass < 3; pass++) {
        corax_spool_rewind(s);
        size_t i = 0;
        for (const spooled *r; (r = corax_spool_next(s)); i++) {
            spooled want = spooled_record(i);
            assert_memory_equal(r, &want, sizeof want);
        }
        assert_int_equal(i, n);
        assert_int_equal(corax_spool_status(s, NULL), CORAX_OK);
    }
}

static int folder_is_empty(const char *path)
{
    DIR *d = opendir(path);
    assert_non_null(d);
    int empty = 1;
    for (struct dirent *e; (e = readdir(d));)
        empty &= strcmp(e->d_name, ".") == 0 || strcmp(e->d_name, "..") == 0;
    closedir(d);
    return empty;
}

/* A spool gives back what it took, in order, as often as asked: few records
 * in its buffer, many through a file beside the output (and left nowhere),
 * or in TMPDIR when the output's folder cannot take it; neither: an error. */
static void test_spool_round_trip(void **state)
{
    (void)state;
    const char *dir = test_tmp_path("spool");
    mkdir(dir, 0777);
    char beside[600], nowhere[600];
    snprintf(beside, sizeof beside, "%s/out.vtk", dir);
    snprintf(nowhere, sizeof nowhere, "%s/no-such-folder/out.vtk", dir);
    const char *old = getenv("TMPDIR");
    char *saved = old ? strdup(old) : NULL;
    setenv("TMPDIR", nowhere, 1); /* only the output's folder can take the file */
    size_t sizes[] = {0, 1, 7, 100000};
    for (size_t k = 0; k < sizeof sizes / sizeof sizes[0]; k++) {
        corax_spool *s = corax_spool_new(sizeof(spooled), beside, NULL);
        assert_non_null(s);
        assert_int_equal(spool_fill(s, sizes[k], NULL), CORAX_OK);
        assert_int_equal(corax_spool_count(s), sizes[k]);
        spool_reads_back(s, sizes[k]);
        spooled r = spooled_record(0);
        corax_error err;
        assert_int_equal(corax_spool_add(s, &r, &err), CORAX_EARG);
        corax_spool_free(s);
        assert_true(folder_is_empty(dir));
    }
    /* the output's folder is missing: the file goes to TMPDIR */
    setenv("TMPDIR", dir, 1);
    corax_spool *s = corax_spool_new(sizeof(spooled), nowhere, NULL);
    assert_int_equal(spool_fill(s, 50000, NULL), CORAX_OK);
    spool_reads_back(s, 50000);
    corax_spool_free(s);
    assert_true(folder_is_empty(dir));
    /* neither: adding fails once the buffer is full, and says why */
    setenv("TMPDIR", nowhere, 1);
    s = corax_spool_new(sizeof(spooled), "-", "spooled records");
    corax_error err;
    assert_int_equal(spool_fill(s, 50000, &err), CORAX_EIO);
    char want[700];
    snprintf(want, sizeof want, "cannot make a temporary file in %s for spooled records: ",
             nowhere);
    assert_non_null(strstr(err.message, want));
    assert_int_equal(corax_spool_status(s, NULL), CORAX_EIO);
    corax_spool_free(s);
    assert_null(corax_spool_new(0, NULL, NULL));
    if (saved)
        setenv("TMPDIR", saved, 1);
    else
        unsetenv("TMPDIR");
    free(saved);
    rmdir(dir);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_numbers_parse_like_strtod),
        cmocka_unit_test(test_numbers_refused),
        cmocka_unit_test(test_decimal_comma),
        cmocka_unit_test(test_fixed_format_matches_printf),
        cmocka_unit_test(test_g3_matches_printf),
        cmocka_unit_test(test_note_pieces_like_note_add),
        cmocka_unit_test(test_reader_handles_real_world_csv),
        cmocka_unit_test(test_reader_faults),
        cmocka_unit_test(test_reader_large_file),
        cmocka_unit_test(test_reader_blank_line_across_blocks),
        cmocka_unit_test(test_reader_round_trip),
        cmocka_unit_test(test_writer_fields_read_back),
        cmocka_unit_test(test_writer_quotes_and_commits_whole),
        cmocka_unit_test(test_outputs_all_or_nothing),
        cmocka_unit_test(test_writer_quotes_a_row_opening_hash),
        cmocka_unit_test(test_column_names_and_mapping),
        cmocka_unit_test(test_load_program_reports_row_faults),
        cmocka_unit_test(test_table_in_memory),
        cmocka_unit_test(test_spool_round_trip),
    };
    return cmocka_run_group_tests_name("io", tests, NULL, NULL);
}
