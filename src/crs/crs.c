/* crs: projected coordinate reference systems through PROJ: latitude,
 * longitude and grid convergence at an easting and northing. PROJ's own
 * messages are switched off; every fault comes back as a corax_error. */
#include <math.h>
#include <proj.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "corax/crs.h"

struct corax_crs {
    PJ_CONTEXT *ctx;
    PJ *crs;      /* the projected CRS (the horizontal part of a compound one) */
    PJ *inverse;  /* easting, northing to longitude, latitude in degrees (forward) */
    PJ *projection; /* the bare map projection, for its factors: longitude and
                       latitude in radians in, whatever the CRS's axis order */
    char *definition;
    char name[160];
};

void corax_crs_free(corax_crs *c)
{
    if (!c)
        return;
    proj_destroy(c->projection);
    proj_destroy(c->inverse);
    proj_destroy(c->crs);
    if (c->ctx)
        proj_context_destroy(c->ctx);
    free(c->definition);
    free(c);
}

const char *corax_crs_definition(const corax_crs *c) { return c->definition; }
const char *corax_crs_name(const corax_crs *c) { return c->name; }

/* The horizontal part of a compound CRS (a projected CRS with heights), or
 * the CRS itself. Takes ownership of crs. */
static PJ *horizontal(PJ_CONTEXT *ctx, PJ *crs)
{
    if (proj_get_type(crs) != PJ_TYPE_COMPOUND_CRS)
        return crs;
    PJ *h = proj_crs_get_sub_crs(ctx, crs, 0);
    proj_destroy(crs);
    return h;
}

/* The map projection of a projected CRS as a bare operation, from its PROJ
 * string without "+type=crs": PROJ's factors of the CRS object itself follow
 * the CRS's axis order, which differs from one CRS to the next. */
static PJ *bare_projection(PJ_CONTEXT *ctx, const PJ *crs)
{
    const char *text = proj_as_proj_string(ctx, crs, PJ_PROJ_5, NULL);
    if (!text)
        return NULL;
    size_t n = strlen(text);
    char *copy = malloc(n + 1);
    if (!copy)
        return NULL;
    memcpy(copy, text, n + 1);
    char *type = strstr(copy, " +type=crs");
    if (type)
        memmove(type, type + 10, strlen(type + 10) + 1);
    PJ *p = proj_create(ctx, copy);
    free(copy);
    return p;
}

/* 1 when every axis is in metres; else 0 with the unit's name in unit. */
static int in_metres(PJ_CONTEXT *ctx, const PJ *crs, char *unit, size_t len)
{
    PJ *cs = proj_crs_get_coordinate_system(ctx, crs);
    int ok = cs != NULL, n = cs ? proj_cs_get_axis_count(ctx, cs) : 0;
    for (int i = 0; i < n && ok; i++) {
        double factor = 0.0;
        const char *name = NULL;
        if (!proj_cs_get_axis_info(ctx, cs, i, NULL, NULL, NULL, &factor, &name, NULL, NULL))
            ok = 0;
        else if (fabs(factor - 1.0) > 1e-12) {
            snprintf(unit, len, "%s", name ? name : "a unit other than metres");
            ok = 0;
        }
    }
    proj_destroy(cs);
    return ok;
}

corax_status corax_crs_new(const char *definition, corax_crs **out, corax_error *err)
{
    *out = NULL;
    corax_crs *c = calloc(1, sizeof *c);
    if (!c || !(c->definition = strdup(definition)) || !(c->ctx = proj_context_create())) {
        corax_crs_free(c);
        return CORAX_ENOMEM;
    }
    proj_log_level(c->ctx, PJ_LOG_NONE); /* the library never prints */
    PJ *crs = proj_create(c->ctx, definition);
    corax_status st = CORAX_OK;
    char unit[80] = "";
    if (!crs || !proj_is_crs(crs)) {
        st = corax_error_set(err, CORAX_ENOTFOUND, NULL, 0,
                             "PROJ does not know the coordinate reference system '%s'",
                             definition);
        proj_destroy(crs);
    } else if (!(c->crs = horizontal(c->ctx, crs)) ||
               proj_get_type(c->crs) != PJ_TYPE_PROJECTED_CRS) {
        st = corax_error_set(err, CORAX_EVALUE, NULL, 0,
                             "'%s' (%s) is not a projected coordinate reference system: collar "
                             "coordinates must be eastings and northings in metres",
                             definition, c->crs ? proj_get_name(c->crs) : "?");
    } else if (!in_metres(c->ctx, c->crs, unit, sizeof unit)) {
        st = corax_error_set(err, CORAX_EVALUE, NULL, 0,
                             "'%s' (%s) has coordinates in %s: corax needs metres", definition,
                             proj_get_name(c->crs), unit[0] ? unit : "an unknown unit");
    }
    if (st == CORAX_OK) {
        snprintf(c->name, sizeof c->name, "%s", proj_get_name(c->crs));
        PJ *geog = proj_crs_get_geodetic_crs(c->ctx, c->crs);
        PJ *t = geog ? proj_create_crs_to_crs_from_pj(c->ctx, c->crs, geog, NULL, NULL) : NULL;
        c->inverse = t ? proj_normalize_for_visualization(c->ctx, t) : NULL; /* E,N -> lon,lat */
        proj_destroy(t);
        proj_destroy(geog);
        c->projection = bare_projection(c->ctx, c->crs);
        if (!c->inverse || !c->projection)
            st = corax_error_set(err, CORAX_EVALUE, NULL, 0,
                                 "PROJ cannot turn '%s' into latitude and longitude", definition);
    }
    if (st != CORAX_OK) {
        corax_crs_free(c);
        return st;
    }
    *out = c;
    return CORAX_OK;
}

corax_status corax_crs_locate(const corax_crs *c, double easting, double northing,
                              double *latitude, double *longitude, double *convergence,
                              corax_error *err)
{
    PJ_COORD r = {{NAN, NAN, 0.0, 0.0}};
    PJ_FACTORS f;
    memset(&f, 0, sizeof f);
    int ok = isfinite(easting) && isfinite(northing);
    if (ok) {
        proj_errno_reset(c->inverse);
        r = proj_trans(c->inverse, PJ_FWD, proj_coord(easting, northing, 0.0, 0.0));
        ok = isfinite(r.lp.lam) && isfinite(r.lp.phi) && fabs(r.lp.lam) < 1e30 &&
             proj_errno(c->inverse) == 0;
    }
    if (ok) {
        proj_errno_reset(c->projection);
        f = proj_factors(c->projection,
                         proj_coord(proj_torad(r.lp.lam), proj_torad(r.lp.phi), 0, 0));
        ok = proj_errno(c->projection) == 0 && isfinite(f.meridian_convergence);
    }
    if (!ok)
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "easting %.3f, northing %.3f is outside what %s can map",
                               easting, northing, c->definition);
    if (latitude)
        *latitude = proj_torad(r.lp.phi);
    if (longitude)
        *longitude = proj_torad(r.lp.lam);
    if (convergence)
        *convergence = f.meridian_convergence;
    return CORAX_OK;
}
