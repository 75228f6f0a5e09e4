/* The fuzzing harnesses' shared pieces (tests/fuzz; see DEVELOPERS.md).
 *
 * Each harness defines LLVMFuzzerTestOneInput. `make fuzz` links them with
 * libFuzzer (clang); `make check` links them with replay.c, which runs the
 * seed corpus through them once, so that every input kept there (the
 * findings' among them) stays a regression test in the ordinary builds. */
#ifndef CORAX_TESTS_FUZZ_H
#define CORAX_TESTS_FUZZ_H

#include <stddef.h>
#include <stdint.h>

int LLVMFuzzerInitialize(int *argc, char ***argv);
int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

/* The byte that separates the files of one input (ASCII record
 * separator: text tables do not hold it). */
#define FUZZ_SEPARATOR 0x1e

/* A piece of the input. */
typedef struct fuzz_part {
    const uint8_t *data;
    size_t size;
} fuzz_part;

/* Split data at FUZZ_SEPARATOR into at most max parts (the last takes the
 * rest, separators and all); parts not present are empty. Returns the
 * number present. */
size_t fuzz_split(const uint8_t *data, size_t size, fuzz_part *part, size_t max);

/* Stop the process with a message on standard error (libFuzzer reports it
 * as a crash, with the input). */
_Noreturn void fuzz_fail(const char *fmt, ...) __attribute__((format(printf, 1, 2)));

/* The run's private folder (made on the first call; an absolute path) and a
 * file in it (a static buffer per slot: slot 0..7). */
const char *fuzz_dir(void);
const char *fuzz_path(int slot, const char *name);

/* Write a file whole (a failure stops the process). */
void fuzz_write(const char *path, const void *data, size_t size);

/* Compare a file with data: 1 when it holds exactly that. */
int fuzz_holds(const char *path, const void *data, size_t size);

/* Remove everything inside a folder (not the folder). */
void fuzz_empty(const char *dir);

/* Quiet the process for in-process runs: standard input from /dev/null,
 * standard output to /dev/null, GSL's abort-on-error off (as main does),
 * and, in the fuzzing build, writes kept inside fuzz_dir(). */
void fuzz_setup(void);

/* Run a command as main would (argv[0] is its name), with standard output
 * going to /dev/full when full_stdout: its exit status, with a failed flush
 * of standard output an error as in main. */
int fuzz_command(int (*run)(int, char **), int argc, char **argv, int full_stdout);

/* What a command harness runs: the command, its files (part i of the input
 * fills file i, in fuzz_dir()), and argument lines with {FILE} for a file's
 * path, {o.EXT} for the main output (where it goes is chosen by the input)
 * and {s.EXT}, {t.EXT} for other outputs. */
enum { FUZZ_FILES = 5, FUZZ_VARIANTS = 8 };
typedef struct fuzz_cmd {
    const char *name;
    int (*run)(int, char **);
    const char *file[FUZZ_FILES];
    const char *variant[FUZZ_VARIANTS];
    /* for each line, the file whose every row comes out as one row of the
     * main output (as often as the line names it), or NULL */
    const char *rows[FUZZ_VARIANTS];
} fuzz_cmd;

/* Every command, and the small good tables the commands' files are named
 * after ("" for another name). */
extern const fuzz_cmd fuzz_commands[];
extern const size_t fuzz_ncommands;
const char *fuzz_table(const char *name);

/* Run cmd on an input: byte 0 picks the argument line, byte 1 where the
 * main output goes and which output operation fails (fuzzing build), the
 * rest holds the files, split at FUZZ_SEPARATOR (the last file takes the
 * rest, separators and all). Checks what every run must keep: no temporary file
 * left, nothing made public by a failed run, inputs and the files behind a
 * symlink or a device untouched, a failed write never reported as success,
 * every row of a table whose rows each give one row out (cmd->rows) found in
 * the output. */
void fuzz_run_command(const fuzz_cmd *cmd, const uint8_t *data, size_t size);

#endif
