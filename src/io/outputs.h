/* The files of one run, made public together (internal to io). */
#ifndef CORAX_IO_OUTPUTS_H
#define CORAX_IO_OUTPUTS_H

#include "corax/output.h"

/* Where a file goes: into a temporary name beside its target (renamed on
 * publish), or straight to a device, a pipe or standard output. */
typedef struct corax_target {
    char *path;   /* as given, for messages */
    char *final;  /* the file a rename makes public (a symlink's target), or NULL
                     when written straight */
    char *tmp;    /* the temporary name, or NULL */
    int fd;
} corax_target;

/* Open a target for writing (see corax_writer_open_in()). CORAX_EIO with a
 * message naming the path when it cannot be written; CORAX_ENOMEM. */
corax_status corax_target_open(corax_outputs *set, const char *path, corax_target *t,
                               corax_error *err);

/* Close a target whose writes ended with errno `failed` (0 when they all
 * went out): a file is synced, closed and, without a set, renamed into
 * place; with a set, handed to it to publish. Frees t's strings. CORAX_EIO
 * naming the path when anything failed (the temporary is gone then). */
corax_status corax_target_close(corax_outputs *set, corax_target *t, int failed,
                                corax_error *err);

/* A hint, no more: start writing `length` bytes from `from` of a file to
 * be synced at its close to the disk now, without waiting for them (where
 * the system can; a target written straight is left alone). */
void corax_target_writeback(const corax_target *t, long long from, long long length);

/* Abandon a target: close it and remove its temporary. */
void corax_target_discard(corax_outputs *set, corax_target *t);

#endif
