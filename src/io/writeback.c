/* io: the disk's work on an output file started while it is being written,
 * so that the sync before it is made public finds little left to do (a
 * table of hundreds of megabytes otherwise waits on the disk at the end). */
#define _GNU_SOURCE /* sync_file_range, where the system has it */
#include <fcntl.h>

#include "io/outputs.h"

void corax_target_writeback(const corax_target *t, long long from, long long length)
{
#ifdef SYNC_FILE_RANGE_WRITE
    if (t->tmp && t->fd >= 0 && length > 0)
        (void)sync_file_range(t->fd, (off_t)from, (off_t)length, SYNC_FILE_RANGE_WRITE);
#else
    (void)t;
    (void)from;
    (void)length;
#endif
}
