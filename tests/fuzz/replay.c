/* A harness's inputs replayed once, without libFuzzer: `make check` and
 * `make sanitize` run every harness over its seed corpus
 * (tests/fuzz/corpus/HARNESS), which holds the inputs of past findings, so
 * that each stays a regression test in the ordinary builds.
 *
 * usage: HARNESS FILE|FOLDER...   (a folder: every file in it, in name
 * order) */
#include <dirent.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "fuzz.h"

static int by_name(const void *a, const void *b)
{
    return strcmp(*(char *const *)a, *(char *const *)b);
}

static void replay_file(const char *path)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        fuzz_fail("cannot open %s", path);
    size_t cap = 4096, n = 0, k;
    unsigned char *data = malloc(cap);
    while (data && (k = fread(data + n, 1, cap - n, f)) > 0)
        if ((n += k) == cap && !(data = realloc(data, cap *= 2)))
            break;
    fclose(f);
    if (!data)
        fuzz_fail("out of memory");
    /* a copy of its own size, so that reading past the input is caught */
    unsigned char *input = malloc(n ? n : 1);
    if (!input)
        fuzz_fail("out of memory");
    memcpy(input, data, n);
    free(data);
    LLVMFuzzerTestOneInput(input, n);
    free(input);
}

static size_t replay(const char *path)
{
    struct stat st;
    if (stat(path, &st) != 0)
        fuzz_fail("no %s", path);
    if (!S_ISDIR(st.st_mode)) {
        replay_file(path);
        return 1;
    }
    DIR *d = opendir(path);
    if (!d)
        fuzz_fail("cannot read %s", path);
    char **name = NULL;
    size_t n = 0, done = 0;
    struct dirent *e;
    while ((e = readdir(d)) != NULL) {
        if (e->d_name[0] == '.')
            continue;
        char **more = realloc(name, (n + 1) * sizeof *name);
        if (!more || !(more[n] = malloc(strlen(path) + strlen(e->d_name) + 2)))
            fuzz_fail("out of memory");
        name = more;
        sprintf(name[n++], "%s/%s", path, e->d_name);
    }
    closedir(d);
    qsort(name, n, sizeof *name, by_name);
    for (size_t i = 0; i < n; i++) {
        done += replay(name[i]);
        free(name[i]);
    }
    free(name);
    return done;
}

int main(int argc, char **argv)
{
    LLVMFuzzerInitialize(&argc, &argv);
    size_t n = 0;
    for (int i = 1; i < argc; i++)
        n += replay(argv[i]);
    fprintf(stderr, "%s: %zu inputs replayed\n", argv[0], n);
    return 0;
}
