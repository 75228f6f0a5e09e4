/* io: code words of a log and the words they stand for; a tally of values
 * that stand for nothing, to be reported once each. */
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "corax/codes.h"

typedef struct code_entry {
    char *code, *word;
} code_entry;

struct corax_codes {
    code_entry *item;
    size_t count;
};

static int blank(char c) { return c == ' ' || c == '\t'; }

static void trim(const char **s, size_t *n)
{
    while (*n && blank(**s)) {
        (*s)++;
        (*n)--;
    }
    while (*n && blank((*s)[*n - 1]))
        (*n)--;
}

static int same(const char *a, size_t alen, const char *b)
{
    return strlen(b) == alen && strncasecmp(a, b, alen) == 0;
}

static corax_status put(corax_codes *c, const char *code, size_t clen, const char *word,
                        size_t wlen)
{
    char *w = strndup(word, wlen);
    if (!w)
        return CORAX_ENOMEM;
    for (size_t i = 0; i < c->count; i++)
        if (same(code, clen, c->item[i].code)) {
            free(c->item[i].word);
            c->item[i].word = w;
            return CORAX_OK;
        }
    code_entry *p = realloc(c->item, (c->count + 1) * sizeof *p);
    char *k = p ? strndup(code, clen) : NULL;
    if (p)
        c->item = p;
    if (!k) {
        free(w);
        return CORAX_ENOMEM;
    }
    c->item[c->count++] = (code_entry){k, w};
    return CORAX_OK;
}

corax_status corax_codes_add(corax_codes **codes, const char *spec, corax_error *err)
{
    if (!*codes && !(*codes = calloc(1, sizeof **codes)))
        return CORAX_ENOMEM;
    for (const char *s = spec; *s;) {
        const char *end = strchr(s, ',');
        if (!end)
            end = s + strlen(s);
        const char *eq = memchr(s, '=', (size_t)(end - s));
        const char *code = s, *word = eq ? eq + 1 : end;
        size_t clen = eq ? (size_t)(eq - s) : 0, wlen = eq ? (size_t)(end - word) : 0;
        trim(&code, &clen);
        trim(&word, &wlen);
        if (!eq || !clen || !wlen)
            return corax_error_set(err, CORAX_EARG, NULL, 0, "'%.*s' is not CODE=WORD",
                                   (int)(end - s), s);
        corax_status st = put(*codes, code, clen, word, wlen);
        if (st != CORAX_OK)
            return st;
        s = *end ? end + 1 : end;
    }
    return CORAX_OK;
}

void corax_codes_free(corax_codes *c)
{
    if (!c)
        return;
    for (size_t i = 0; i < c->count; i++) {
        free(c->item[i].code);
        free(c->item[i].word);
    }
    free(c->item);
    free(c);
}

size_t corax_codes_count(const corax_codes *c) { return c ? c->count : 0; }

const char *corax_codes_at(const corax_codes *c, size_t i, const char **word)
{
    if (!c || i >= c->count)
        return NULL;
    *word = c->item[i].word;
    return c->item[i].code;
}

const char *corax_codes_word(const corax_codes *c, const char *text, size_t len, size_t *wordlen)
{
    trim(&text, &len);
    if (!c || !len)
        return NULL;
    for (size_t i = 0; i < c->count; i++)
        if (same(text, len, c->item[i].code)) {
            *wordlen = strlen(c->item[i].word);
            return c->item[i].word;
        }
    for (size_t i = 0; i < c->count; i++)
        if (same(text, len, c->item[i].word)) {
            *wordlen = len;
            return text;
        }
    return NULL;
}

/* ---- the tally ---- */

typedef struct tally_entry {
    char *text;
    size_t count, file_index;
    const char *file;
    long line;
} tally_entry;

struct corax_tally {
    tally_entry *item;
    size_t count;
};

corax_tally *corax_tally_new(void) { return calloc(1, sizeof(corax_tally)); }

void corax_tally_free(corax_tally *t)
{
    if (!t)
        return;
    for (size_t i = 0; i < t->count; i++)
        free(t->item[i].text);
    free(t->item);
    free(t);
}

static int earlier(size_t fa, long la, size_t fb, long lb)
{
    return fa < fb || (fa == fb && la < lb);
}

static corax_status tally_put(corax_tally *t, const char *text, size_t len, size_t count,
                              const char *file, size_t file_index, long line)
{
    for (size_t i = 0; i < t->count; i++) {
        tally_entry *e = &t->item[i];
        if (!same(text, len, e->text))
            continue;
        e->count += count;
        if (earlier(file_index, line, e->file_index, e->line)) {
            e->file = file;
            e->file_index = file_index;
            e->line = line;
        }
        return CORAX_OK;
    }
    tally_entry *p = realloc(t->item, (t->count + 1) * sizeof *p);
    char *copy = p ? strndup(text, len) : NULL;
    if (p)
        t->item = p;
    if (!copy)
        return CORAX_ENOMEM;
    size_t k = t->count++; /* keep the order of first appearance */
    while (k > 0 && earlier(file_index, line, t->item[k - 1].file_index, t->item[k - 1].line)) {
        t->item[k] = t->item[k - 1];
        k--;
    }
    t->item[k] = (tally_entry){copy, count, file_index, file, line};
    return CORAX_OK;
}

corax_status corax_tally_add(corax_tally *t, const char *text, size_t len, const char *file,
                             size_t file_index, long line)
{
    trim(&text, &len);
    return tally_put(t, text, len, 1, file, file_index, line);
}

corax_status corax_tally_merge(corax_tally *into, const corax_tally *from)
{
    for (size_t i = 0; i < from->count; i++) {
        const tally_entry *e = &from->item[i];
        corax_status st = tally_put(into, e->text, strlen(e->text), e->count, e->file,
                                    e->file_index, e->line);
        if (st != CORAX_OK)
            return st;
    }
    return CORAX_OK;
}

size_t corax_tally_count(const corax_tally *t) { return t ? t->count : 0; }

const char *corax_tally_at(const corax_tally *t, size_t i, size_t *count, const char **file,
                           long *line)
{
    if (!t || i >= t->count)
        return NULL;
    *count = t->item[i].count;
    *file = t->item[i].file;
    *line = t->item[i].line;
    return t->item[i].text;
}
