/* job: the record of what a run assumed, as INI text built up in memory, and
 * the pieces several jobs record alike (conventions, code words). */
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/convert.h"
#include "corax/uncertainty.h"
#include "job/job_int.h"

struct corax_record {
    char *text;
    size_t len, cap;
};

corax_record *corax_record_new(void) { return calloc(1, sizeof(corax_record)); }

void corax_record_free(corax_record *r)
{
    if (r)
        free(r->text);
    free(r);
}

/* Append n bytes; a record that cannot grow keeps what it has. */
static void add(corax_record *r, const char *s, size_t n)
{
    if (!r)
        return;
    if (r->len + n + 1 > r->cap) {
        size_t cap = r->cap ? r->cap : 1024;
        while (cap < r->len + n + 1)
            cap *= 2;
        char *t = realloc(r->text, cap);
        if (!t)
            return;
        r->text = t;
        r->cap = cap;
    }
    memcpy(r->text + r->len, s, n);
    r->len += n;
    r->text[r->len] = '\0';
}

static void add_string(corax_record *r, const char *s) { add(r, s, strlen(s)); }

void corax_record_line(corax_record *r, const char *text)
{
    add_string(r, text);
    add_string(r, "\n");
}

void corax_record_section(corax_record *r, const char *name)
{
    add_string(r, "\n[");
    add_string(r, name);
    add_string(r, "]\n");
}

void corax_record_set(corax_record *r, const char *key, const char *fmt, ...)
{
    if (!r)
        return;
    char value[1024];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(value, sizeof value, fmt, ap);
    va_end(ap);
    add_string(r, key);
    add_string(r, " = ");
    add_string(r, value);
    add_string(r, "\n");
}

void corax_record_append(corax_record *r, const corax_record *from)
{
    if (from && from->len)
        add(r, from->text, from->len);
}

const char *corax_record_text(const corax_record *r, size_t *length)
{
    if (length)
        *length = r ? r->len : 0;
    return r && r->text ? r->text : "";
}

void corax_record_conventions(corax_record *a, const corax_convert_options *cv)
{
    const corax_core_conventions *c = &cv->conventions;
    corax_record_set(a, "reference_line", "%s", c->top_reference ? "top" : "bottom");
    corax_record_set(a, "beta_end", "%s", c->beta_to_uphole_end ? "up-hole" : "down-hole");
    corax_record_set(a, "beta_sense", "%s (looking down the hole)",
                     c->beta_anticlockwise ? "anticlockwise" : "clockwise");
    corax_record_set(a, "gamma_zero", "%s", c->gamma_from_uphole ? "up-hole" : "down-hole");
    corax_record_set(a, "gamma_sense", "%s (seen from the up-hole side of the plane)",
                     c->gamma_anticlockwise ? "anticlockwise" : "clockwise");
    corax_record_set(a, "near_parallel", "%g", corax_deg(cv->near_parallel));
    corax_record_set(a, "near_perpendicular", "%g", corax_deg(cv->near_perpendicular));
    corax_record_set(a, "vertical_limit", "%g", corax_deg(cv->vertical_limit));
}

static void record_codes(corax_record *a, const char *key, const corax_codes *codes)
{
    char text[1000] = "";
    size_t used = 0;
    const char *word, *code;
    for (size_t i = 0; (code = corax_codes_at(codes, i, &word)) && used < sizeof text; i++)
        used += (size_t)snprintf(text + used, sizeof text - used, "%s%s=%s", i ? "," : "", code,
                                 word);
    if (used)
        corax_record_set(a, key, "%s", text);
}

void corax_record_codes(corax_record *a, const corax_codes *kind_codes,
                        const corax_codes *confidence_codes)
{
    record_codes(a, "kind_codes", kind_codes);
    record_codes(a, "confidence_codes", confidence_codes);
}

void corax_record_uncertainty(corax_record *a, const corax_error_model *e, size_t draws,
                              uint64_t seed, int core_line)
{
    corax_record_section(a, "uncertainty");
    corax_record_set(a, "draws", "%zu", draws);
    corax_record_set(a, "seed", "%llu", (unsigned long long)seed);
    corax_record_set(a, "generator", "GSL taus2, Gaussians by the ziggurat method (Marsaglia and "
                     "Tsang 2000) on its 32-bit output; one "
                     "stream per hole, seeded from the seed and the hole's name");
    corax_record_set(a, "alpha_error", "%g", corax_deg(e->alpha));
    if (core_line) {
        corax_record_set(a, "beta_error", "%g", corax_deg(e->beta));
        corax_record_set(a, "line_error", "%g", corax_deg(e->line));
        corax_record_set(a, "gravity_error", "%g (the orientation line's error grows as "
                         "atan(sin g / sin h), h the hole's angle from vertical)",
                         corax_deg(e->gravity));
    }
    corax_record_set(a, "depth_error", "%g", e->depth);
    corax_record_set(a, "azimuth_error", "%g", corax_deg(e->azimuth));
    corax_record_set(a, "dip_error", "%g", corax_deg(e->dip));
    corax_record_set(a, "azimuth_error_per_hole", "%g", corax_deg(e->azimuth_hole));
    corax_record_set(a, "dip_error_per_hole", "%g", corax_deg(e->dip_hole));
}
