/* cli: the uncertainty options shared by the commands that draw (convert,
 * solve), and their record in the .about file. */
#include <math.h>
#include <stdio.h>

#include "cli/cli.h"

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

void cli_about_uncertainty(cli_about *a, const corax_error_model *e, size_t draws, uint64_t seed,
                           int core_line)
{
    cli_about_section(a, "uncertainty");
    cli_about_set(a, "draws", "%zu", draws);
    cli_about_set(a, "seed", "%llu", (unsigned long long)seed);
    cli_about_set(a, "generator", "GSL taus2, Gaussians by the ziggurat method (Marsaglia and "
                  "Tsang 2000) on its 32-bit output; one "
                  "stream per hole, seeded from the seed and the hole's name");
    cli_about_set(a, "alpha_error", "%g", corax_deg(e->alpha));
    if (core_line) {
        cli_about_set(a, "beta_error", "%g", corax_deg(e->beta));
        cli_about_set(a, "line_error", "%g", corax_deg(e->line));
        cli_about_set(a, "gravity_error", "%g (the orientation line's error grows as "
                      "atan(sin g / sin h), h the hole's angle from vertical)",
                      corax_deg(e->gravity));
    }
    cli_about_set(a, "depth_error", "%g", e->depth);
    cli_about_set(a, "azimuth_error", "%g", corax_deg(e->azimuth));
    cli_about_set(a, "dip_error", "%g", corax_deg(e->dip));
    cli_about_set(a, "azimuth_error_per_hole", "%g", corax_deg(e->azimuth_hole));
    cli_about_set(a, "dip_error_per_hole", "%g", corax_deg(e->dip_hole));
}
