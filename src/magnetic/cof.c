/* magnetic: models from coefficient files in the COF layout, and the built-in
 * World Magnetic Models (data/magnetic/, compiled in). */
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "magnetic/model_int.h"

const char *const corax_magnetic_builtin_names[] = {"WMM",       "WMM2015", "WMM2015v2",
                                                    "WMM2020",   "WMM2025", NULL};

/* The parts of the built-in series "WMM", in date order. WMM2015v2 revised
 * WMM2015 in 2018 and replaces it for the whole of its five years. */
static const char *const series[] = {"WMM2015v2", "WMM2020", "WMM2025"};

/* A model as read, before its parts are laid out in time. */
typedef struct block {
    mag_part part;
    int wmm;        /* the WMM layout (else the multi-model one) */
    int sv_degree;  /* degree of the secular variation given (0: none) */
    double yrmax;   /* multi-model: the last date the header allows */
    long line;      /* its header's line */
    int coefficients; /* lines of coefficients read */
} block;

typedef struct reader {
    const char *source;
    block *b;
    size_t n, cap;
    corax_error *err;
} reader;

enum { MAX_TOKENS = 16 };

/* Split a line (copied into buf) at blanks; the number of tokens. */
static size_t tokens(const char *line, char *buf, size_t len, char **tok)
{
    snprintf(buf, len, "%s", line);
    size_t n = 0;
    char *save = NULL;
    for (char *p = strtok_r(buf, " \t\r", &save); p && n < MAX_TOKENS;
         p = strtok_r(NULL, " \t\r", &save))
        tok[n++] = p;
    return n;
}

static int number(const char *s, double *v)
{
    char *end;
    *v = strtod(s, &end);
    return end != s && *end == '\0' && isfinite(*v);
}

/* How many tokens from the first are numbers. */
static size_t leading_numbers(char **tok, size_t n, double *v)
{
    size_t k = 0;
    while (k < n && number(tok[k], &v[k]))
        k++;
    return k;
}

static block *new_block(reader *r, long line)
{
    block *grown = corax_grow(r->b, r->n, &r->cap, sizeof *grown, 4);
    if (!grown)
        return NULL;
    r->b = grown;
    block *b = &r->b[r->n++];
    memset(b, 0, sizeof *b);
    b->line = line;
    return b;
}

static corax_status fault(const reader *r, long line, const char *what)
{
    return corax_error_set(r->err, CORAX_EFORMAT, r->source, line, "%s", what);
}

static int whole(double v, int lo, int hi) { return v == floor(v) && v >= lo && v <= hi; }

/* A header line: "EPOCH NAME DATE" (the WMM's) or "NAME EPOCH NMAX NMAX_SV
 * NMAX_ACC YEAR_MIN YEAR_MAX ALT_MIN ALT_MAX ..." (the multi-model form). 1
 * when it is one (and a block was begun), 0 when not, -1 out of memory. */
static int header(reader *r, char **tok, size_t n, long line)
{
    double v[MAX_TOKENS];
    block *b;
    if (n == 3 && leading_numbers(tok, n, v) == 1) {
        if (!(b = new_block(r, line)))
            return -1;
        b->wmm = 1;
        b->sv_degree = CORAX_MAGNETIC_MAX_DEGREE;
        b->part.epoch = v[0];
        snprintf(b->part.name, sizeof b->part.name, "%s", tok[1]);
        return 1;
    }
    if (n >= 9 && !number(tok[0], &v[0]) && leading_numbers(tok + 1, 8, v + 1) == 8 &&
        whole(v[2], 1, 99) && whole(v[3], 0, 99) && v[6] >= v[5]) {
        if (!(b = new_block(r, line)))
            return -1;
        snprintf(b->part.name, sizeof b->part.name, "%s", tok[0]);
        b->part.epoch = v[1];
        b->part.nmax = (int)v[2];
        b->sv_degree = (int)v[3];
        b->part.from = v[5];
        b->yrmax = v[6];
        return 1;
    }
    return 0;
}

/* A line "n m g h [gdot hdot] ...": 1 read, 0 not such a line, or a status
 * (negated) for a fault. */
static int coefficient(reader *r, char **tok, size_t n, long line, corax_status *st)
{
    double v[MAX_TOKENS];
    size_t k = leading_numbers(tok, n, v);
    if (k < 4 || !whole(v[0], 1, 999) || !whole(v[1], 0, 999))
        return 0;
    if (r->n == 0) {
        *st = fault(r, line, "coefficients before the model's header line");
        return -1;
    }
    block *b = &r->b[r->n - 1];
    int deg = (int)v[0], ord = (int)v[1];
    if (ord > deg) {
        *st = fault(r, line, "an order above its degree");
        return -1;
    }
    if (deg > CORAX_MAGNETIC_MAX_DEGREE) {
        *st = corax_error_set(r->err, CORAX_EFORMAT, r->source, line,
                              "degree %d is above the %d corax evaluates", deg,
                              CORAX_MAGNETIC_MAX_DEGREE);
        return -1;
    }
    if (b->wmm && k < 6) {
        *st = fault(r, line, "a WMM coefficient line needs n, m, g, h, gdot and hdot");
        return -1;
    }
    size_t i = mag_index(deg, ord);
    b->part.g[i] = v[2];
    b->part.h[i] = v[3];
    if (k >= 6 && deg <= b->sv_degree) {
        b->part.gdot[i] = v[4];
        b->part.hdot[i] = v[5];
    }
    if (b->wmm && deg > b->part.nmax)
        b->part.nmax = deg;
    b->coefficients++;
    return 1;
}

/* A line of nines ends a WMM file. */
static int nines(const char *line)
{
    while (*line == ' ')
        line++;
    size_t n = strspn(line, "9");
    return n >= 8 && line[strspn(line, "9 \t\r")] == '\0';
}

/* Lay the blocks out in time: a WMM for five years from its epoch (up to the
 * next one); a multi-model epoch without secular variation up to the next
 * epoch, toward which it is interpolated; the last up to its YEAR_MAX. */
static corax_status lay_out(reader *r, corax_magnetic_model *m)
{
    for (size_t i = 0; i < r->n; i++) {
        block *b = &r->b[i];
        if (b->coefficients == 0)
            return fault(r, b->line, "a model header without coefficients");
        if (b->part.nmax > CORAX_MAGNETIC_MAX_DEGREE)
            return corax_error_set(r->err, CORAX_EFORMAT, r->source, b->line,
                                   "degree %d is above the %d corax evaluates", b->part.nmax,
                                   CORAX_MAGNETIC_MAX_DEGREE);
        if (b->wmm != r->b[0].wmm)
            return fault(r, b->line, "the WMM and the multi-model layouts mixed in one file");
        if (i > 0 && b->part.epoch <= r->b[i - 1].part.epoch)
            return fault(r, b->line, "models out of date order");
    }
    m->part = malloc(r->n * sizeof *m->part);
    if (!m->part)
        return CORAX_ENOMEM;
    m->n = r->n;
    for (size_t i = 0; i < r->n; i++) {
        mag_part *p = &m->part[i];
        const block *b = &r->b[i], *next = i + 1 < r->n ? &r->b[i + 1] : NULL;
        *p = b->part;
        if (b->wmm) {
            p->from = p->epoch;
            p->to = next ? next->part.epoch : p->epoch + 5.0;
        } else if (next && b->sv_degree == 0) {
            const mag_part *q = &next->part;
            double span = q->from - p->from;
            p->nmax = p->nmax > q->nmax ? p->nmax : q->nmax;
            for (size_t k = 0; k < MAG_NCOEF; k++) {
                p->gdot[k] = (q->g[k] - p->g[k]) / span;
                p->hdot[k] = (q->h[k] - p->h[k]) / span;
            }
            p->epoch = p->from;
            p->to = q->from;
        } else {
            p->epoch = p->from;
            p->to = next ? next->part.from : b->yrmax;
        }
    }
    if (r->b[0].wmm || r->n == 1)
        snprintf(m->name, sizeof m->name, "%s", m->part[0].name);
    else
        snprintf(m->name, sizeof m->name, "%s to %s", m->part[0].name, m->part[m->n - 1].name);
    return CORAX_OK;
}

corax_status corax_magnetic_parse(const char *const *lines, size_t nlines, const char *source,
                                  corax_magnetic_model **out, corax_error *err)
{
    *out = NULL;
    reader r = {source, NULL, 0, 0, err};
    corax_status st = CORAX_OK;
    for (size_t i = 0; i < nlines && st == CORAX_OK; i++) {
        long line = (long)i + 1;
        char buf[512], *tok[MAX_TOKENS];
        if (strlen(lines[i]) >= sizeof buf) {
            st = fault(&r, line, "the line is too long for a coefficient file");
            break;
        }
        size_t n = tokens(lines[i], buf, sizeof buf, tok);
        if (n == 0)
            continue;
        if (nines(lines[i])) {
            if (r.n && r.b[r.n - 1].wmm)
                break;
            st = fault(&r, line, "a line of nines, which ends only a WMM file");
            break;
        }
        int k = header(&r, tok, n, line);
        if (k < 0)
            st = CORAX_ENOMEM;
        else if (k == 0 && coefficient(&r, tok, n, line, &st) == 0)
            st = fault(&r, line, "neither a model header nor a line of coefficients "
                                 "(is this a coefficient file in the COF layout?)");
    }
    if (st == CORAX_OK && r.n == 0)
        st = corax_error_set(err, CORAX_EFORMAT, source, 0, "no model in the coefficient file");
    corax_magnetic_model *m = NULL;
    if (st == CORAX_OK && !(m = calloc(1, sizeof *m)))
        st = CORAX_ENOMEM;
    if (st == CORAX_OK)
        st = lay_out(&r, m);
    free(r.b);
    if (st != CORAX_OK) {
        corax_magnetic_model_free(m);
        return st;
    }
    *out = m;
    return CORAX_OK;
}

corax_status corax_magnetic_read(const char *path, corax_magnetic_model **out, corax_error *err)
{
    *out = NULL;
    FILE *f = fopen(path, "r");
    if (!f)
        return corax_error_set(err, CORAX_EIO, path, 0, "cannot open the coefficient file");
    char **lines = NULL, *line = NULL;
    size_t n = 0, cap = 0, linecap = 0;
    corax_status st = CORAX_OK;
    ssize_t len;
    while ((len = getline(&line, &linecap, f)) >= 0) {
        while (len > 0 && (line[len - 1] == '\n' || line[len - 1] == '\r'))
            line[--len] = '\0';
        char **grown = corax_grow(lines, n, &cap, sizeof *grown, 128);
        if (!grown) {
            st = CORAX_ENOMEM;
            break;
        }
        lines = grown;
        if (!(lines[n] = strdup(line))) {
            st = CORAX_ENOMEM;
            break;
        }
        n++;
    }
    if (st == CORAX_OK && ferror(f))
        st = corax_error_set(err, CORAX_EIO, path, 0, "cannot read the coefficient file");
    fclose(f);
    free(line);
    if (st == CORAX_OK)
        st = corax_magnetic_parse((const char *const *)lines, n, path, out, err);
    for (size_t i = 0; i < n; i++)
        free(lines[i]);
    free(lines);
    return st;
}

void corax_magnetic_model_free(corax_magnetic_model *m)
{
    if (!m)
        return;
    free(m->part);
    free(m);
}

int corax_magnetic_is_builtin(const char *name)
{
    for (size_t i = 0; corax_magnetic_builtin_names[i]; i++)
        if (strcasecmp(name, corax_magnetic_builtin_names[i]) == 0)
            return 1;
    return 0;
}

/* One built-in file as a model, named as the file. */
static corax_status builtin_file(const char *name, corax_magnetic_model **out, corax_error *err)
{
    for (size_t i = 0; i < corax_magnetic_builtin_file_count; i++) {
        const mag_builtin_file *f = &corax_magnetic_builtin_files[i];
        if (strcasecmp(f->name, name) != 0)
            continue;
        corax_status st = corax_magnetic_parse(f->lines, f->nlines, f->name, out, err);
        if (st == CORAX_OK) {
            snprintf((*out)->name, sizeof (*out)->name, "%s", f->name);
            snprintf((*out)->part[0].name, sizeof (*out)->part[0].name, "%s", f->name);
        }
        return st;
    }
    return corax_error_set(err, CORAX_ENOTFOUND, NULL, 0,
                           "no magnetic model '%s': the built-in ones are WMM (the series), "
                           "WMM2015, WMM2015v2, WMM2020 and WMM2025; or give a COF file", name);
}

corax_status corax_magnetic_builtin(const char *name, corax_magnetic_model **out,
                                    corax_error *err)
{
    *out = NULL;
    if (strcasecmp(name, "WMM") != 0)
        return builtin_file(name, out, err);
    enum { NSERIES = sizeof series / sizeof series[0] };
    corax_magnetic_model *m = calloc(1, sizeof *m);
    if (!m || !(m->part = malloc(NSERIES * sizeof *m->part))) {
        corax_magnetic_model_free(m);
        return CORAX_ENOMEM;
    }
    snprintf(m->name, sizeof m->name, "WMM");
    for (size_t i = 0; i < NSERIES; i++) {
        corax_magnetic_model *one;
        corax_status st = builtin_file(series[i], &one, err);
        if (st != CORAX_OK) {
            corax_magnetic_model_free(m);
            return st;
        }
        m->part[m->n++] = one->part[0];
        corax_magnetic_model_free(one);
    }
    *out = m;
    return CORAX_OK;
}
