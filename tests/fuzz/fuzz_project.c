/* Fuzzing harness: project files. The input, after byte 0 and byte 1, is a
 * project file. It is read by corax_ini_read (every heading and key
 * reported in line order, a stop by the handler reported as one), then
 * given with -p to a command in-process (byte 0, bits 0-2: the command;
 * bits 3-7: which of its argument lines with -p), whose other files are
 * small good tables (tests/fuzz/commands.c) that the project file may name
 * (collars.csv, surveys.csv, log.csv, converted.csv, ...: the fuzzing
 * folder is the project file's folder). Byte 1 is where the main output
 * goes (see run.c). */
#include <stdlib.h>
#include <string.h>

#include "corax/project.h"
#include "fuzz.h"

int LLVMFuzzerInitialize(int *argc, char ***argv)
{
    (void)argc;
    (void)argv;
    fuzz_setup();
    return 0;
}

typedef struct reading {
    long line, stop_at, calls;
} reading;

static int on_line(void *user, const char *section, const char *key, const char *value,
                   long line, corax_error *err)
{
    reading *r = user;
    if (!section || (key && !value) || (!key && value))
        fuzz_fail("line %ld: section %p, key %p, value %p", line, (const void *)section,
                  (const void *)key, (const void *)value);
    if (line <= r->line)
        fuzz_fail("line %ld reported after line %ld", line, r->line);
    r->line = line;
    if (++r->calls == r->stop_at) {
        corax_error_set(err, CORAX_EFORMAT, NULL, line, "stopped");
        return 1;
    }
    return 0;
}

static void read_directly(const char *path, long stop_at)
{
    reading r = {0, stop_at, 0};
    corax_error err;
    corax_error_clear(&err);
    corax_status st = corax_ini_read(path, on_line, &r, &err);
    if (stop_at > 0 && r.calls >= stop_at && st != CORAX_EFORMAT)
        fuzz_fail("the handler stopped the read, which returned %d", st);
    if (st != CORAX_OK && strcmp(err.file, path) != 0)
        fuzz_fail("the error names '%s', not the project file", err.file);
}

/* The lines of a command that read a project file. */
static size_t with_project(const fuzz_cmd *cmd, size_t *index)
{
    size_t n = 0;
    for (size_t i = 0; i < FUZZ_VARIANTS && cmd->variant[i]; i++)
        if (strstr(cmd->variant[i], "{project.ini}"))
            index[n++] = i;
    return n;
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 2)
        return 0;
    const fuzz_cmd *cmd = &fuzz_commands[(data[0] & 7) % fuzz_ncommands];
    const char *project = fuzz_path(0, "project.ini");
    fuzz_write(project, data + 2, size - 2);
    read_directly(project, data[1] >> 4);

    size_t index[FUZZ_VARIANTS], n = with_project(cmd, index);
    if (!n)
        fuzz_fail("%s has no line with a project file", cmd->name);
    /* the command's own input: its files the good tables, the project last */
    size_t len = 2 + size;
    for (size_t i = 0; i < FUZZ_FILES && cmd->file[i]; i++)
        len += strlen(fuzz_table(cmd->file[i])) + 1;
    uint8_t *input = malloc(len), *p = input;
    if (!input)
        fuzz_fail("out of memory");
    *p++ = (uint8_t)index[(data[0] >> 3) % n];
    *p++ = data[1];
    for (size_t i = 0; i < FUZZ_FILES && cmd->file[i]; i++) {
        if (strcmp(cmd->file[i], "project.ini") == 0) {
            memcpy(p, data + 2, size - 2);
            p += size - 2;
            break; /* the project file is always the last */
        }
        size_t k = strlen(fuzz_table(cmd->file[i]));
        memcpy(p, fuzz_table(cmd->file[i]), k);
        p += k;
        *p++ = FUZZ_SEPARATOR;
    }
    fuzz_run_command(cmd, input, (size_t)(p - input));
    free(input);
    return 0;
}
