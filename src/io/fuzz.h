/* Hooks of the fuzzing build (internal to io and tests/fuzz).
 *
 * Built with -DCORAX_FUZZ (make fuzz), the library can be made to fail a
 * chosen output operation, so that fuzzing reaches every path of a failed
 * write (a full disk in the middle of a run, a rename refused while the
 * run's files are made public); writes only inside one folder, so that a
 * fuzzed project file cannot name a file elsewhere; and reads in small
 * blocks, so that lines and quoted fields cut by a block's end are common.
 * In every other build these are constants: no state, no cost. */
#ifndef CORAX_IO_FUZZ_H
#define CORAX_IO_FUZZ_H

#include <stddef.h>

#ifdef CORAX_FUZZ

/* From now, output operation n (0 the next one: a write, the making of a
 * file or folder, a change of mode, a sync, a close or a rename) fails
 * with errnum, once; n < 0 for none. */
void corax_fuzz_fail_at(long n, int errnum);

/* Whether the failure asked for has been made. */
int corax_fuzz_failed(void);

/* Outputs are written only inside this absolute folder (without a trailing
 * '/'), or to /dev/null, /dev/full and standard output; any other fails
 * with EACCES. NULL for no limit. */
void corax_fuzz_sandbox(const char *folder);

/* Read tables in blocks of this many bytes (at least 16; 0 for the usual
 * size). */
void corax_fuzz_read_block(size_t bytes);

/* 1, with errno set, when this output operation is the one to fail. */
int corax_fuzz_fails(void);

/* 0 when an output may go to path; else -1 with errno set. */
int corax_fuzz_may_write(const char *path);

/* The read block's size. */
size_t corax_fuzz_block(size_t usual);

#define CORAX_FAILS() corax_fuzz_fails()
#define CORAX_MAY_WRITE(path) corax_fuzz_may_write(path)
#define CORAX_READ_BLOCK(usual) corax_fuzz_block(usual)

#else

#define CORAX_FAILS() 0
#define CORAX_MAY_WRITE(path) 0
#define CORAX_READ_BLOCK(usual) (usual)

#endif
#endif
