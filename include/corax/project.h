/* corax: reading project files (INI) with exact line numbers. What the keys
 * mean is up to the caller; this only reads them in order. */
#ifndef CORAX_PROJECT_H
#define CORAX_PROJECT_H

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Called for each section heading (key NULL, value NULL) and for each
 * key = value line, with the line number. Return 0 to go on; nonzero stops the
 * read, which then returns CORAX_EFORMAT with err filled by the handler. */
typedef int (*corax_ini_handler)(void *user, const char *section, const char *key,
                                 const char *value, long line, corax_error *err);

/* Read an INI file: [section] headings, key = value lines, ';' or '#'
 * comments. CORAX_EIO when it cannot be opened (or is a folder),
 * CORAX_EFORMAT for a line that is neither, an indented line (which INI
 * readers take as the continuation of the value above), or when the handler
 * stops; err names the file and line. */
corax_status corax_ini_read(const char *path, corax_ini_handler handler, void *user,
                            corax_error *err);

#ifdef __cplusplus
}
#endif
#endif
