/* corax: the code words of a log (kinds of feature, confidence levels) and
 * the words they stand for, and a tally of values that have no meaning. */
#ifndef CORAX_CODES_H
#define CORAX_CODES_H

#include <stddef.h>

#include "corax/status.h"

#ifdef __cplusplus
extern "C" {
#endif

/* A mapping of codes to words ("G" to "good", "BD" to "bedding"). */
typedef struct corax_codes corax_codes;

/* Add entries from a specification such as "G=good,M=fair,P=poor"; *codes
 * may be NULL at first. Codes match without regard to case; a later entry
 * for the same code wins. CORAX_EARG (with a message) for an entry that is
 * not CODE=WORD or has an empty side. */
corax_status corax_codes_add(corax_codes **codes, const char *spec, corax_error *err);
void corax_codes_free(corax_codes *codes);

/* Number of entries (0 for NULL). */
size_t corax_codes_count(const corax_codes *codes);

/* The i-th entry, in the order added: its code (returned) and word; NULL
 * past the end. */
const char *corax_codes_at(const corax_codes *codes, size_t i, const char **word);

/* The word a value stands for: the word of its code, or the value itself
 * when it is one of the words (a log may mix "G" and "good"); NULL when it is
 * neither, or empty. Blanks around the value and case are ignored. *wordlen
 * gets the word's length. */
const char *corax_codes_word(const corax_codes *codes, const char *text, size_t len,
                             size_t *wordlen);

/* Values met without a meaning, each counted with the first place it was
 * seen (a file, given by its name and its position in the run's list of
 * files, and a line). */
typedef struct corax_tally corax_tally;

corax_tally *corax_tally_new(void);
void corax_tally_free(corax_tally *tally);

/* Count one more of a value (text of len bytes, compared without regard to
 * case). file must outlive the tally. */
corax_status corax_tally_add(corax_tally *tally, const char *text, size_t len,
                             const char *file, size_t file_index, long line);

/* Add every count of `from` to `into`, keeping the earliest place. */
corax_status corax_tally_merge(corax_tally *into, const corax_tally *from);

size_t corax_tally_count(const corax_tally *tally);

/* The i-th value in order of first appearance (file, then line): its text,
 * with its count, file and line. NULL past the end. */
const char *corax_tally_at(const corax_tally *tally, size_t i, size_t *count,
                           const char **file, long *line);

#ifdef __cplusplus
}
#endif
#endif
