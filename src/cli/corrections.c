/* cli: the azimuth corrections' options (declination from a magnetic model,
 * convergence from a CRS, a local mine grid, survey dates and references),
 * their checks, and their record in .about files. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"

/* A number in degrees, or the word that asks for the per-station value. */
static int number_or_word(const char *arg, const char *word, int *flag, double *value, char *why,
                          size_t wl)
{
    if (strcmp(arg, word) == 0) {
        *flag = 1;
        return 1;
    }
    if (cli_value_number(arg, -180, 180, value, why, wl)) {
        if (strstr(why, "not a number"))
            snprintf(why, wl, "'%s' is neither a number nor %s", arg, word);
        return -1;
    }
    *flag = 0;
    return 1;
}

static int open_crs(cli_corrections *k, const char *arg, char *why, size_t wl)
{
    corax_crs *crs;
    corax_error err;
    corax_error_clear(&err);
    if (corax_crs_new(arg, &crs, &err) != CORAX_OK) {
        snprintf(why, wl, "%s", err.message);
        return -1;
    }
    corax_crs_free(k->crs); /* the command line overrides the project file */
    k->crs = crs;
    k->crs_text = arg;
    return 1;
}

int cli_corrections_option(cli_common *c, int opt, const char *arg, char *why, size_t wl)
{
    cli_corrections *k = &c->corr;
    corax_error err;
    corax_error_clear(&err);
    corax_north north;
    switch (opt) {
    case OPT_DECLINATION:
        return number_or_word(arg, "model", &k->declination_model, &c->load.declination, why,
                              wl);
    case OPT_CONVERGENCE:
        return number_or_word(arg, "projection", &k->convergence_projection,
                              &c->load.convergence, why, wl);
    case OPT_CRS: return open_crs(k, arg, why, wl);
    case OPT_LOCAL_GRID:
        if (corax_local_grid_parse(arg, &k->grid, &err) != CORAX_OK) {
            snprintf(why, wl, "%s", err.message);
            return -1;
        }
        k->grid_text = arg;
        return 1;
    case OPT_SURVEY_DATE:
        k->corrector.date = corax_date_parse(arg, strlen(arg));
        if (isnan(k->corrector.date)) {
            snprintf(why, wl, "'%s' is not an ISO 8601 date (YYYY-MM-DD)", arg);
            return -1;
        }
        k->date_text = arg;
        return 1;
    case OPT_MAGNETIC_MODEL: k->model_name = arg; return 1;
    case OPT_SURVEY_REFERENCE:
        if (corax_north_parse(arg, strlen(arg), &north) != 0) {
            snprintf(why, wl, "'%s' is not magnetic, true or grid", arg);
            return -1;
        }
        k->north = (int)north;
        return 1;
    }
    return 0;
}

int cli_corrections_asked(const cli_common *c)
{
    const cli_corrections *k = &c->corr;
    return c->load.declination != 0.0 || c->load.convergence != 0.0 || k->declination_model ||
           k->convergence_projection || k->crs || k->grid_text || k->date_text ||
           k->model_name || k->north != CORAX_NORTH_MAGNETIC;
}

int cli_corrections_prepare(cli_common *c)
{
    cli_corrections *k = &c->corr;
    if (k->convergence_projection && !k->crs)
        return cli_usage(c->command, "--convergence projection needs --crs (the CRS of the "
                                     "collar coordinates)");
    if (k->model_name && !k->declination_model)
        return cli_usage(c->command, "--magnetic-model goes with --declination model");
    if (k->declination_model && !k->model) {
        const char *name = k->model_name ? k->model_name : "WMM";
        corax_error err;
        corax_error_clear(&err);
        corax_status st = corax_magnetic_is_builtin(name)
                              ? corax_magnetic_builtin(name, &k->model, &err)
                              : corax_magnetic_read(name, &k->model, &err);
        if (st != CORAX_OK) {
            cli_error_record(&err, st);
            return EXIT_DATA;
        }
    }
    corax_corrector *r = &k->corrector;
    r->declination = corax_rad(c->load.declination);
    r->model = k->declination_model ? k->model : NULL;
    r->convergence = corax_rad(c->load.convergence);
    r->convergence_from_crs = k->convergence_projection;
    r->crs = k->crs;
    r->local_grid = k->grid_text ? &k->grid : NULL;
    r->north = (corax_north)k->north;
    c->load.corrector = r;
    c->load.corrections = k->keep_record ? &k->record : NULL;
    return 0;
}

void cli_corrections_about(cli_about *a, const cli_common *c)
{
    const cli_corrections *k = &c->corr;
    if (k->declination_model && !k->model) { /* no surveys read: nothing was corrected */
        corax_record_set(a, "declination", "model (not used: no survey table read)");
    } else if (k->declination_model) {
        char valid[64];
        corax_magnetic_validity_text(k->model, valid, sizeof valid);
        corax_record_set(a, "declination", "model: %s, valid %s, at each station's date and its "
                         "collar's place and elevation (taken as height above the ellipsoid)",
                         corax_magnetic_model_name(k->model), valid);
        if (k->model_name && !corax_magnetic_is_builtin(k->model_name))
            corax_record_set(a, "magnetic_model_file", "%s", k->model_name);
        corax_record_set(a, "survey_dates", "the surveys' date column, else the collars' date, "
                         "else %s",
                         k->date_text ? k->date_text : "none (a station without is an error)");
    } else {
        corax_record_set(a, "declination", "%g", c->load.declination);
    }
    if (k->convergence_projection)
        corax_record_set(a, "convergence",
                         "projection: PROJ's meridian convergence at each collar");
    else
        corax_record_set(a, "convergence", "%g", c->load.convergence);
    if (k->crs)
        corax_record_set(a, "crs", "%s (%s)", corax_crs_definition(k->crs), corax_crs_name(k->crs));
    if (k->grid_text) {
        corax_record_set(a, "local_grid", "%s", k->grid_text);
        corax_record_set(a, "local_grid_rotation", "%.6f (degrees, from the CRS's grid north to "
                         "local north, clockwise positive)", corax_deg(k->grid.rotation));
        corax_record_set(a, "local_grid_scale", "%.8f (CRS metres per local unit)", k->grid.scale);
        corax_record_set(a, "local_grid_origin", "%.3f, %.3f (the local origin in the CRS)",
                         k->grid.east, k->grid.north);
    }
    corax_record_set(a, "survey_reference", "%s (the surveys' reference column overrides it)",
                     corax_north_name((corax_north)k->north));
    if (!k->declination_model && !k->convergence_projection && !k->grid_text)
        corax_record_set(a, "azimuth_correction", "%g (added to every magnetic survey azimuth; "
                         "collar azimuths are taken as given)",
                         c->load.declination - c->load.convergence);
    corax_record_set(a, "sign_convention",
                     "total correction added to a magnetic survey azimuth = declination (east "
                     "positive) - convergence (positive when grid north is east of true north) - "
                     "local grid rotation (positive when local north is clockwise of grid north); "
                     "a true-north survey gets - convergence - rotation, a grid survey nothing; "
                     "collar azimuths are taken as given, in the grid of the coordinates");
}

void cli_corrections_free(cli_corrections *k)
{
    corax_crs_free(k->crs);
    k->crs = NULL;
    corax_magnetic_model_free(k->model);
    k->model = NULL;
    corax_corrections_clear(&k->record);
}
