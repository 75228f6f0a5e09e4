/* cli: option values by name (numbers, choices, table formats, units, dip
 * conventions), the core conventions' options and the uncertainty's. */
#include <math.h>
#include <stdlib.h>
#include <stdio.h>
#include <string.h>

#include "cli/cli.h"

int cli_value_number(const char *arg, double lo, double hi, double *value, char *why,
                     size_t whylen)
{
    double v;
    if (corax_parse_number(arg, strlen(arg), '.', &v) != CORAX_NUMBER_OK) {
        snprintf(why, whylen, "'%s' is not a number", arg);
        return -1;
    }
    if (v < lo || v > hi) {
        snprintf(why, whylen, "%s is outside [%g, %g]", arg, lo, hi);
        return -1;
    }
    *value = v;
    return 0;
}

int cli_value_shard(const char *arg, unsigned *shard, unsigned *shards, char *why, size_t whylen)
{
    char *end;
    unsigned long k = strtoul(arg, &end, 10), n = 0;
    int ok = end != arg && *end == '/' && arg[0] >= '0' && arg[0] <= '9';
    if (ok) {
        const char *p = end + 1;
        n = strtoul(p, &end, 10);
        ok = end != p && !*end && *p >= '0' && *p <= '9';
    }
    if (!ok || n < 1 || n > 1000000 || k < 1 || k > n) {
        snprintf(why, whylen, "'%s' is not K/N, shard K of N (1 <= K <= N <= 1000000)", arg);
        return -1;
    }
    *shard = (unsigned)k;
    *shards = (unsigned)n;
    return 0;
}

int cli_value_choice(const char *arg, const char *const *names, int count, int *value,
                     char *why, size_t whylen)
{
    for (int i = 0; i < count; i++)
        if (strcmp(arg, names[i]) == 0) {
            *value = i;
            return 0;
        }
    size_t used = (size_t)snprintf(why, whylen, "'%s' is not %s", arg, count > 2 ? "one of " : "");
    for (int i = 0; i < count && used < whylen; i++)
        used += (size_t)snprintf(why + used, whylen - used, "%s%s",
                                 i == 0 ? "" : i + 1 < count ? ", " : " or ", names[i]);
    return -1;
}

int cli_value_delimiter(const char *arg, int *value, char *why, size_t wl)
{
    static const char *const names[] = {"comma", "semicolon", "tab", "auto", ",", ";"};
    static const int chars[] = {',', ';', '\t', 0, ',', ';'};
    for (int k = 0; k < 6; k++)
        if (strcmp(arg, names[k]) == 0) {
            *value = chars[k];
            return 0;
        }
    int k;
    return cli_value_choice(arg, names, 4, &k, why, wl);
}

int cli_value_decimal(const char *arg, int *value, char *why, size_t wl)
{
    static const char *const names[] = {"point", "comma", "auto"};
    static const int chars[] = {'.', ',', 0};
    int k;
    if (cli_value_choice(arg, names, 3, &k, why, wl))
        return -1;
    *value = chars[k];
    return 0;
}

int cli_value_units(const char *arg, int *value, char *why, size_t wl)
{
    static const char *const names[] = {"metres", "feet", "meters", "m", "ft"};
    int k;
    if (cli_value_choice(arg, names, 5, &k, why, wl) == 0) {
        *value = k == 1 || k == 4;
        return 0;
    }
    cli_value_choice(arg, names, 2, &k, why, wl);
    return -1;
}

int cli_value_dip(const char *arg, int *value, char *why, size_t wl)
{
    static const char *const names[] = {"negative-down", "positive-down", "from-vertical"};
    return cli_value_choice(arg, names, 3, value, why, wl);
}

const char cli_convention_help[] =
    "Conventions (defaults first):\n"
    "  --reference-line bottom|top       the orientation line marks the bottom or top\n"
    "                                    of the hole\n"
    "  --beta-end down-hole|up-hole      beta runs to this end of the ellipse's long axis\n"
    "  --beta-sense clockwise|anticlockwise   looking down the hole\n"
    "  --gamma-zero down-hole|up-hole    gamma runs from this end of the long axis\n"
    "  --gamma-sense clockwise|anticlockwise  seen from the up-hole side of the plane\n"
    "  --near-parallel DEG       flag alpha below this (default 10)\n"
    "  --near-perpendicular DEG  flag alpha above this (default 80)\n"
    "  --vertical-limit DEG      a hole within this of vertical has no usable\n"
    "                            bottom-of-hole line (default 5)\n"
    "Core logs:\n"
    "  --interval-depth mid|from|to  where a reading of a from/to log sits (mid)\n"
    "  --kind-codes MAP          the log's codes for feature kinds, e.g. BD=bedding,VN=vein\n"
    "  --confidence-codes MAP    its codes for confidence, e.g. G=good,M=fair,P=poor\n";

int cli_convention_option(corax_convert_options *o, int opt, const char *arg, char *why,
                          size_t wl)
{
    static const char *const ref[] = {"bottom", "top"};
    static const char *const ends[] = {"down-hole", "up-hole"};
    static const char *const senses[] = {"clockwise", "anticlockwise"};
    corax_core_conventions *cv = &o->conventions;
    int *choice = opt == OPT_REFERENCE    ? &cv->top_reference
                  : opt == OPT_BETA_END   ? &cv->beta_to_uphole_end
                  : opt == OPT_BETA_SENSE ? &cv->beta_anticlockwise
                  : opt == OPT_GAMMA_ZERO ? &cv->gamma_from_uphole
                  : opt == OPT_GAMMA_SENSE ? &cv->gamma_anticlockwise
                                           : NULL;
    if (choice) {
        const char *const *names = opt == OPT_REFERENCE ? ref
                                   : (opt == OPT_BETA_END || opt == OPT_GAMMA_ZERO) ? ends
                                                                                    : senses;
        return cli_value_choice(arg, names, 2, choice, why, wl) ? -1 : 1;
    }
    double *angle = opt == OPT_NEAR_PARALLEL        ? &o->near_parallel
                    : opt == OPT_NEAR_PERPENDICULAR ? &o->near_perpendicular
                    : opt == OPT_VERTICAL_LIMIT     ? &o->vertical_limit
                                                    : NULL;
    if (!angle)
        return 0;
    double v;
    if (cli_value_number(arg, 0, 90, &v, why, wl))
        return -1;
    *angle = corax_rad(v);
    return 1;
}

int cli_uncertainty_option(corax_error_model *e, size_t *draws, uint64_t *seed, double min_draws,
                           int opt, const char *arg, char *why, size_t wl)
{
    double v;
    switch (opt) {
    case OPT_DRAWS:
        if (cli_value_number(arg, min_draws, 1e6, &v, why, wl))
            return -1;
        if (v != floor(v)) {
            snprintf(why, wl, "'%s' is not a whole number", arg);
            return -1;
        }
        *draws = (size_t)v;
        return 1;
    case OPT_SEED:
        if (cli_value_number(arg, 0, 4294967295.0, &v, why, wl))
            return -1;
        *seed = (uint64_t)v;
        return 1;
    }
    static const struct {
        int opt;
        double max;
        int metres;
    } sigma[] = {{OPT_ALPHA_ERROR, 45, 0},        {OPT_BETA_ERROR, 180, 0},
                 {OPT_LINE_ERROR, 180, 0},        {OPT_DEPTH_ERROR, 100, 1},
                 {OPT_AZIMUTH_ERROR, 45, 0},      {OPT_DIP_ERROR, 45, 0},
                 {OPT_AZIMUTH_ERROR_HOLE, 45, 0}, {OPT_DIP_ERROR_HOLE, 45, 0},
                 {OPT_GRAVITY_ERROR, 45, 0}};
    double *slot[] = {&e->alpha,   &e->beta, &e->line,         &e->depth,   &e->azimuth,
                      &e->dip,     &e->azimuth_hole, &e->dip_hole, &e->gravity};
    for (size_t i = 0; i < sizeof sigma / sizeof sigma[0]; i++)
        if (sigma[i].opt == opt) {
            if (cli_value_number(arg, 0, sigma[i].max, &v, why, wl))
                return -1;
            *slot[i] = sigma[i].metres ? v : corax_rad(v);
            return 1;
        }
    return 0;
}
