/* Fuzzing harness: the names of a table. Column maps ("hole=HOLE_ID,..."),
 * merged as the tables' settings merge them, then looked up in a header;
 * the header's check for a repeated name; the names corax gives carried
 * columns; code words ("BD=bedding,...") and the tally of values without a
 * meaning. The input, split at 0x1e: a column map, a second one merged
 * under it, a header (fields split at ','), code words, values (split at
 * ','). Each answer is checked against a plain restatement of its
 * contract. */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/codes.h"
#include "corax/table.h"
#include "fuzz.h"
#include "io/fields.h"

enum { PARTS = 5, MAX_FIELDS = 256 };

int LLVMFuzzerInitialize(int *argc, char ***argv)
{
    (void)argc;
    (void)argv;
    return 0;
}

/* A part as a C string (up to its first NUL). */
static char *text(fuzz_part p)
{
    char *s = strndup((const char *)p.data, p.size);
    if (!s)
        fuzz_fail("out of memory");
    return s;
}

/* Split s at ',' into fields (pointers into s, which is cut). */
static size_t split(char *s, const char **field, size_t *length, size_t max)
{
    size_t n = 0;
    for (char *p = s; n < max;) {
        char *comma = strchr(p, ',');
        if (comma)
            *comma = '\0';
        field[n] = p;
        length[n++] = strlen(p);
        if (!comma)
            break;
        p = comma + 1;
    }
    return n;
}

static void check_find(const corax_row *header, const corax_column_map *map)
{
    const char *logical;
    for (size_t i = 0; (logical = corax_column_at(i, NULL, NULL)) != NULL; i++) {
        if (!corax_column_known(logical))
            fuzz_fail("'%s' is listed but not known", logical);
        const char *mapped = corax_column_mapped(map, logical);
        long c = corax_column_find(header, logical, map);
        if (c < CORAX_COLUMN_MAPPED_MISSING || c >= (long)header->count)
            fuzz_fail("corax_column_find gave %ld for %zu fields", c, header->count);
        if (c == CORAX_COLUMN_MAPPED_MISSING && !mapped)
            fuzz_fail("'%s' is missing as mapped, without a mapping", logical);
        if (mapped && c >= 0 &&
            !corax_column_name_match(header->field[c], header->length[c], mapped, strlen(mapped)))
            fuzz_fail("'%s' mapped to '%s' found '%s'", logical, mapped, header->field[c]);
        for (size_t k = 0; mapped && c == CORAX_COLUMN_MAPPED_MISSING && k < header->count; k++)
            if (corax_column_name_match(header->field[k], header->length[k], mapped,
                                        strlen(mapped)))
                fuzz_fail("'%s' mapped to '%s' is in the header, yet missing", logical, mapped);
    }
}

/* corax_header_check against the plain pairwise look. */
static void check_header(const corax_row *header)
{
    size_t first = header->count, second = 0;
    for (size_t i = 0; i < header->count && first == header->count; i++)
        for (size_t j = i + 1; j < header->count; j++)
            if (header->field[i][0] && strcasecmp(header->field[i], header->field[j]) == 0) {
                first = i;
                second = j;
                break;
            }
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_header_check(header, &err);
    if ((st == CORAX_OK) != (first == header->count))
        fuzz_fail("corax_header_check says %d, the pairwise look %s", st,
                  first == header->count ? "no repeat" : "a repeat");
    if (st != CORAX_OK) {
        char want[64];
        snprintf(want, sizeof want, "(columns %zu and %zu)", first + 1, second + 1);
        if (!strstr(err.message, want))
            fuzz_fail("corax_header_check: '%s' does not say %s", err.message, want);
    }
}

/* A carried column's name never clashes with corax's own. */
static void check_carried(const corax_row *header)
{
    static const char *const own[] = {"x", "y", "z", "dip", "dip_direction", "status", "note",
                                      "hole_azimuth", "hole_plunge", "log_x"};
    const size_t nown = sizeof own / sizeof *own;
    for (size_t i = 0; i < header->count; i++) {
        char out[128];
        size_t n = corax_carried_name(header->field[i], own, nown, out, sizeof out);
        if (n != strlen(out))
            fuzz_fail("corax_carried_name gave length %zu for '%s'", n, out);
        if (n + 4 >= sizeof out)
            continue; /* too long to take another prefix */
        for (size_t k = 0; k < nown; k++)
            if (corax_column_name_match(out, n, own[k], strlen(own[k])))
                fuzz_fail("carried '%s' as '%s', which is corax's '%s'", header->field[i], out,
                          own[k]);
    }
}

static void check_codes(const corax_codes *codes, const char *const *value, const size_t *len,
                        size_t n)
{
    for (size_t i = 0; i < corax_codes_count(codes); i++) {
        const char *word, *code = corax_codes_at(codes, i, &word);
        if (!code || !word || !*code || !*word)
            fuzz_fail("code %zu is empty", i);
        size_t wl;
        const char *got = corax_codes_word(codes, code, strlen(code), &wl);
        if (!got)
            fuzz_fail("code '%s' has no word", code);
        if (strcmp(got, word) != 0 || wl != strlen(word))
            fuzz_fail("code '%s' gave '%.*s' for '%s'", code, (int)wl, got, word);
    }
    if (corax_codes_at(codes, corax_codes_count(codes), &(const char *){NULL}))
        fuzz_fail("an entry past the end");
    corax_tally *t = corax_tally_new(), *all = corax_tally_new();
    if (!t || !all)
        fuzz_fail("out of memory");
    size_t unknown = 0;
    for (size_t i = 0; i < n; i++) {
        size_t wl = 0;
        const char *w = corax_codes_word(codes, value[i], len[i], &wl);
        if (w && (wl == 0 || memchr(w, '\0', wl)))
            fuzz_fail("value '%s' gave a word of %zu bytes", value[i], wl);
        if (!w) {
            /* as the commands read them: files in order, lines in order */
            if (corax_tally_add(t, value[i], len[i], "log.csv", i / 100, (long)i + 2) != CORAX_OK)
                fuzz_fail("out of memory");
            unknown++;
        }
    }
    if (corax_tally_merge(all, t) != CORAX_OK || corax_tally_merge(all, t) != CORAX_OK)
        fuzz_fail("out of memory");
    size_t total = 0, total_all = 0, count;
    const char *file;
    long line, last_line = 0;
    size_t last_index = 0;
    for (size_t i = 0; i < corax_tally_count(t); i++) {
        corax_tally_at(t, i, &count, &file, &line);
        if (!count)
            fuzz_fail("a tallied value with no count");
        size_t index = (size_t)(line - 2) / 100;
        if (i && (index < last_index || (index == last_index && line < last_line)))
            fuzz_fail("the tally is not in order of first appearance");
        last_index = index;
        last_line = line;
        total += count;
    }
    for (size_t i = 0; i < corax_tally_count(all); i++) {
        corax_tally_at(all, i, &count, &file, &line);
        total_all += count;
    }
    if (total != unknown || total_all != 2 * unknown ||
        corax_tally_count(all) != corax_tally_count(t))
        fuzz_fail("the tally counts %zu (merged twice %zu) of %zu values", total, total_all,
                  unknown);
    corax_tally_free(t);
    corax_tally_free(all);
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    fuzz_part part[PARTS];
    fuzz_split(data, size, part, PARTS);
    char *spec = text(part[0]), *spec2 = text(part[1]), *head = text(part[2]);
    char *code_spec = text(part[3]), *values = text(part[4]);
    corax_error err;
    corax_error_clear(&err);

    corax_column_map *map = NULL, *own = NULL;
    corax_column_map_add(&map, spec, &err);
    corax_column_map_add(&own, spec2, &err);
    if (corax_column_map_merge(&map, own) != CORAX_OK)
        fuzz_fail("out of memory");

    const char *field[MAX_FIELDS];
    size_t length[MAX_FIELDS];
    corax_row header = {split(head, field, length, MAX_FIELDS), field, length, 1};
    check_find(&header, map);
    check_find(&header, NULL);
    check_header(&header);
    check_carried(&header);

    corax_codes *codes = NULL;
    corax_codes_add(&codes, code_spec, &err);
    const char *value[MAX_FIELDS];
    size_t vlen[MAX_FIELDS];
    check_codes(codes, value, vlen, split(values, value, vlen, MAX_FIELDS));

    corax_codes_free(codes);
    corax_column_map_free(map);
    corax_column_map_free(own);
    free(spec);
    free(spec2);
    free(head);
    free(code_spec);
    free(values);
    return 0;
}
