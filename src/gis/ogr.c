/* gis: vector files through GDAL/OGR, the only place in corax that knows
 * GDAL. Layers and features in, whole files out: OGR writes into a private
 * folder beside the real name and the commit moves the result into place.
 * GDAL's messages are caught (a quiet handler pushed around every call) and
 * returned in error records. GDAL itself is loaded when a GIS file is first
 * asked for, not when corax starts: its libraries take some 40 ms to load,
 * which every command would pay. */
#include <dlfcn.h>
#include <errno.h>
#include <math.h>
#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cpl_error.h>
#include <gdal.h>
#include <ogr_api.h>
#include <ogr_srs_api.h>

#include "common/grow.h"
#include "corax/gis.h"

#ifndef CORAX_GDAL_LIBRARY /* the build gives the soname of the GDAL it builds against */
#define CORAX_GDAL_LIBRARY "libgdal.so"
#endif

/* Every GDAL function corax calls, reached through this table once GDAL is
 * loaded. */
#define GDAL_FUNCTIONS(X) \
    X(CPLErrorReset) \
    X(CPLGetLastErrorMsg) \
    X(CPLGetLastErrorType) \
    X(CPLPopErrorHandler) \
    X(CPLPushErrorHandler) \
    X(CPLQuietErrorHandler) \
    X(GDALAllRegister) \
    X(GDALClose) \
    X(GDALCreate) \
    X(GDALDatasetCommitTransaction) \
    X(GDALDatasetCreateLayer) \
    X(GDALDatasetStartTransaction) \
    X(GDALDatasetTestCapability) \
    X(GDALGetDriver) \
    X(GDALGetDriverByName) \
    X(GDALGetDriverCount) \
    X(GDALGetDriverShortName) \
    X(GDALGetMetadataItem) \
    X(GDALVersionInfo) \
    X(OGR_FD_GetFieldIndex) \
    X(OGR_F_Create) \
    X(OGR_F_Destroy) \
    X(OGR_F_GetGeometryRef) \
    X(OGR_F_SetFieldDouble) \
    X(OGR_F_SetFieldInteger64) \
    X(OGR_F_SetFieldString) \
    X(OGR_F_SetGeometryDirectly) \
    X(OGR_Fld_Create) \
    X(OGR_Fld_Destroy) \
    X(OGR_G_AddPoint) \
    X(OGR_G_AddPointZM) \
    X(OGR_G_CreateGeometry) \
    X(OGR_G_SetPoint) \
    X(OGR_L_CreateFeature) \
    X(OGR_L_CreateField) \
    X(OGR_L_GetLayerDefn) \
    X(OSRIsGeographic) \
    X(OSRNewSpatialReference) \
    X(OSRRelease) \
    X(OSRSetAxisMappingStrategy) \
    X(OSRSetFromUserInput)

static struct {
#define X(f) __typeof__(&f) f;
    GDAL_FUNCTIONS(X)
#undef X
} gdal;

static pthread_once_t gdal_once = PTHREAD_ONCE_INIT;
static int gdal_ready;        /* GDAL is loaded and every function found */
static char gdal_trouble[512]; /* why not, when it is not */

static void load_gdal(void)
{
    void *lib = dlopen(CORAX_GDAL_LIBRARY, RTLD_NOW | RTLD_LOCAL);
    if (!lib) {
        const char *why = dlerror();
        snprintf(gdal_trouble, sizeof gdal_trouble, "GDAL (%s) cannot be loaded: %s",
                 CORAX_GDAL_LIBRARY, why ? why : "no reason given");
        return;
    }
#define X(f)                                                                                  \
    {                                                                                         \
        void *sym = dlsym(lib, #f);                                                           \
        if (!sym) {                                                                           \
            snprintf(gdal_trouble, sizeof gdal_trouble, "GDAL (%s) has no %s",                \
                     CORAX_GDAL_LIBRARY, #f);                                                 \
            return;                                                                           \
        }                                                                                     \
        memcpy(&gdal.f, &sym, sizeof sym); /* POSIX: a function's address as a pointer */    \
    }
    GDAL_FUNCTIONS(X)
#undef X
    gdal_ready = 1;
}

/* Whether GDAL is there to call (loaded at the first call). */
static int have_gdal(void)
{
    pthread_once(&gdal_once, load_gdal);
    return gdal_ready;
}

/* corax's short names and the drivers they stand for. */
static const struct {
    const char *name, *driver;
} short_names[] = {
    {"gpkg", "GPKG"}, {"geojson", "GeoJSON"}, {"dxf", "DXF"}, {"shp", "ESRI Shapefile"}};
enum { NSHORT = sizeof short_names / sizeof short_names[0] };

typedef struct gis_layer {
    char *name;
    OGRLayerH layer;
    size_t nfields;
} gis_layer;

struct corax_gis {
    GDALDatasetH ds;
    OGRSpatialReferenceH srs;
    const char *driver;   /* OGR's name */
    int cad;              /* one layer of entities: DXF */
    int measured;
    int transaction;      /* a transaction is open */
    char *path;           /* the real name */
    char *dir;            /* the private folder OGR writes into */
    corax_outputs *set;   /* holds the folder until the run publishes it, or NULL */
    char *inside;         /* the dataset's path inside it */
    gis_layer *layer;
    size_t nlayers, cap;
    OGRLayerH entities;   /* the CAD layer, made with the first logical layer */
    int cad_layer_field;  /* its "Layer" field */
    OGRFeatureH feature;  /* the feature being built */
    int current;          /* its logical layer */
};

/* ---- GDAL's messages ---- */

static void quiet_begin(void)
{
    gdal.CPLPushErrorHandler(gdal.CPLQuietErrorHandler);
    gdal.CPLErrorReset();
}

static void quiet_end(void) { gdal.CPLPopErrorHandler(); }

/* GDAL's last message, or `fallback`. */
static const char *gdal_says(const char *fallback)
{
    const char *m = gdal.CPLGetLastErrorMsg();
    return m && *m ? m : fallback;
}

static int failed_quietly(void) { return gdal.CPLGetLastErrorType() >= CE_Failure; }

/* ---- drivers ---- */

static void register_drivers(void) { gdal.GDALAllRegister(); }

static int writes_vectors(GDALDriverH d)
{
    const char *vector = gdal.GDALGetMetadataItem(d, GDAL_DCAP_VECTOR, NULL);
    const char *create = gdal.GDALGetMetadataItem(d, GDAL_DCAP_CREATE, NULL);
    return vector && create && strcasecmp(vector, "YES") == 0 && strcasecmp(create, "YES") == 0;
}

const char *corax_gis_unavailable(void) { return have_gdal() ? NULL : gdal_trouble; }

const char *corax_gis_gdal_version(void)
{
    return have_gdal() ? gdal.GDALVersionInfo("RELEASE_NAME") : "none (not loaded)";
}

int corax_gis_known_format(const char *format)
{
    for (int i = 0; i < NSHORT; i++)
        if (strcasecmp(format, short_names[i].name) == 0)
            return 1;
    return 0;
}

static const char *ogr_name(const char *format)
{
    for (int i = 0; i < NSHORT; i++)
        if (strcasecmp(format, short_names[i].name) == 0)
            return short_names[i].driver;
    return format;
}

const char *corax_gis_driver(const char *format)
{
    if (!have_gdal())
        return NULL;
    register_drivers();
    GDALDriverH d = gdal.GDALGetDriverByName(ogr_name(format));
    return d && writes_vectors(d) ? gdal.GDALGetDriverShortName(d) : NULL;
}

void corax_gis_drivers(char *buf, size_t len)
{
    size_t used = 0;
    if (len)
        buf[0] = '\0';
    if (!have_gdal()) {
        snprintf(buf, len, "none (%s)", gdal_trouble);
        return;
    }
    register_drivers();
    for (int i = 0; i < gdal.GDALGetDriverCount() && used < len; i++) {
        GDALDriverH d = gdal.GDALGetDriver(i);
        if (writes_vectors(d))
            used += (size_t)snprintf(buf + used, len - used, "%s%s", used ? ", " : "",
                                     gdal.GDALGetDriverShortName(d));
    }
}

/* ---- the private folder ---- */

/* The private folder (see corax_outputs_folder()) and the dataset's path in
 * it. */
static corax_status make_private(corax_gis *g, const char *path, corax_error *err)
{
    corax_status st = corax_outputs_folder(g->set, path, &g->dir, err);
    if (st != CORAX_OK)
        return st;
    const char *slash = strrchr(path, '/');
    const char *base = slash ? slash + 1 : path;
    size_t n = strlen(g->dir) + strlen(base) + 2;
    g->inside = malloc(n);
    if (!g->inside)
        return CORAX_ENOMEM;
    snprintf(g->inside, n, "%s/%s", g->dir, base);
    return CORAX_OK;
}

/* ---- opening ---- */

static corax_status set_crs(corax_gis *g, const char *crs, const char *path, corax_error *err)
{
    if (!crs)
        return CORAX_OK;
    g->srs = gdal.OSRNewSpatialReference(NULL);
    if (!g->srs)
        return CORAX_ENOMEM;
    quiet_begin();
    OGRErr e = gdal.OSRSetFromUserInput(g->srs, crs);
    quiet_end();
    if (e != OGRERR_NONE)
        return corax_error_set(err, CORAX_EARG, path, 0,
                               "crs '%s' is not a coordinate reference system GDAL knows", crs);
    if (gdal.OSRIsGeographic(g->srs))
        return corax_error_set(err, CORAX_EARG, path, 0,
                               "crs '%s' is geographic (degrees); corax's coordinates are "
                               "metres east, north and up: give a projected system", crs);
    gdal.OSRSetAxisMappingStrategy(g->srs, OAMS_TRADITIONAL_GIS_ORDER);
    return CORAX_OK;
}

corax_status corax_gis_open(corax_outputs *set, const char *path, const char *format,
                            const char *crs, corax_gis **out, corax_error *err)
{
    *out = NULL;
    if (!have_gdal())
        return corax_error_set(err, CORAX_ENOTFOUND, NULL, 0, "%s", gdal_trouble);
    const char *name = corax_gis_driver(format);
    if (!name)
        return corax_error_set(err, CORAX_ENOTFOUND, NULL, 0,
                               corax_gis_known_format(format) ||
                                       gdal.GDALGetDriverByName(ogr_name(format))
                                   ? "this machine's GDAL has no driver that writes %s"
                                   : "'%s' is not a vector format GDAL knows",
                               format);
    corax_gis *g = calloc(1, sizeof *g);
    if (!g)
        return CORAX_ENOMEM;
    g->driver = name;
    g->set = set;
    g->cad = strcmp(name, "DXF") == 0;
    g->current = -1;
    g->cad_layer_field = -1;
    corax_status st = (g->path = strdup(path)) ? CORAX_OK : CORAX_ENOMEM;
    if (st == CORAX_OK)
        st = set_crs(g, crs, path, err);
    if (st == CORAX_OK)
        st = make_private(g, path, err);
    if (st == CORAX_OK) {
        quiet_begin();
        g->ds = gdal.GDALCreate(gdal.GDALGetDriverByName(name), g->inside, 0, 0, 0, GDT_Unknown, NULL);
        if (!g->ds)
            st = corax_error_set(err, CORAX_EIO, path, 0, "cannot write: %s",
                                 gdal_says("GDAL could not create it"));
        quiet_end();
    }
    if (st != CORAX_OK) {
        corax_gis_discard(g);
        return st;
    }
    g->measured = !g->cad && gdal.GDALDatasetTestCapability(g->ds, ODsCMeasuredGeometries);
    quiet_begin();
    g->transaction = gdal.GDALDatasetStartTransaction(g->ds, FALSE) == OGRERR_NONE;
    quiet_end();
    *out = g;
    return CORAX_OK;
}

int corax_gis_measured(const corax_gis *g) { return g->measured; }
int corax_gis_cad(const corax_gis *g) { return g->cad; }
const char *corax_gis_driver_name(const corax_gis *g) { return g->driver; }

/* ---- layers ---- */

static OGRwkbGeometryType geometry_type(const corax_gis *g, corax_gis_shape shape, int measured)
{
    if (g->cad)
        return wkbUnknown;
    if (shape == CORAX_GIS_POINTS)
        return wkbPoint25D;
    return measured && g->measured ? wkbLineStringZM : wkbLineString25D;
}

static OGRFieldType field_type(corax_gis_type t)
{
    return t == CORAX_GIS_REAL ? OFTReal : t == CORAX_GIS_INTEGER ? OFTInteger64 : OFTString;
}

static corax_status add_fields(corax_gis *g, OGRLayerH l, const corax_gis_field *f, size_t n,
                               corax_error *err)
{
    for (size_t i = 0; i < n; i++) {
        OGRFieldDefnH d = gdal.OGR_Fld_Create(f[i].name, field_type(f[i].type));
        quiet_begin();
        OGRErr e = gdal.OGR_L_CreateField(l, d, TRUE);
        const char *why = gdal_says("OGR refused it");
        corax_status st = e == OGRERR_NONE
                              ? CORAX_OK
                              : corax_error_set(err, CORAX_EIO, g->path, 0,
                                                "cannot make field '%s': %s", f[i].name, why);
        quiet_end();
        gdal.OGR_Fld_Destroy(d);
        if (st != CORAX_OK)
            return st;
    }
    return CORAX_OK;
}

/* The OGR layer behind a new logical layer. */
static corax_status ogr_layer(corax_gis *g, const char *name, corax_gis_shape shape,
                              int measured, OGRLayerH *out, corax_error *err)
{
    if (g->cad && g->entities) {
        *out = g->entities;
        return CORAX_OK;
    }
    if (g->nlayers > 0 && !gdal.GDALDatasetTestCapability(g->ds, ODsCCreateLayer))
        return corax_error_set(err, CORAX_EARG, g->path, 0,
                               "%s holds one layer per file and '%s' is already in it: "
                               "choose one layer with --layers", g->driver, g->layer[0].name);
    quiet_begin();
    OGRLayerH l = gdal.GDALDatasetCreateLayer(g->ds, g->cad ? "entities" : name, g->srs,
                                         geometry_type(g, shape, measured), NULL);
    corax_status st = l ? CORAX_OK
                        : corax_error_set(err, CORAX_EIO, g->path, 0,
                                          "cannot make layer '%s': %s", name,
                                          gdal_says("OGR refused it"));
    quiet_end();
    if (st != CORAX_OK)
        return st;
    if (g->cad) {
        g->entities = l;
        g->cad_layer_field = gdal.OGR_FD_GetFieldIndex(gdal.OGR_L_GetLayerDefn(l), "Layer");
    }
    *out = l;
    return CORAX_OK;
}

corax_status corax_gis_layer(corax_gis *g, const char *name, corax_gis_shape shape,
                             int measured, const corax_gis_field *fields, size_t n,
                             int *layer, corax_error *err)
{
    for (size_t i = 0; i < g->nlayers; i++)
        if (strcasecmp(g->layer[i].name, name) == 0)
            return corax_error_set(err, CORAX_EARG, g->path, 0,
                                   "two layers named '%s'%s: layer names must differ (in any "
                                   "case)", name,
                                   strcmp(g->layer[i].name, name) ? " in other cases" : "");
    gis_layer *p = corax_grow(g->layer, g->nlayers, &g->cap, sizeof *p, 8);
    if (!p)
        return CORAX_ENOMEM;
    g->layer = p;
    OGRLayerH l = NULL;
    corax_status st = ogr_layer(g, name, shape, measured, &l, err);
    if (st == CORAX_OK && !g->cad)
        st = add_fields(g, l, fields, n, err);
    if (st != CORAX_OK)
        return st;
    gis_layer *gl = &g->layer[g->nlayers];
    if (!(gl->name = strdup(name)))
        return CORAX_ENOMEM;
    gl->layer = l;
    gl->nfields = g->cad ? 0 : n;
    *layer = (int)g->nlayers++;
    return CORAX_OK;
}

/* ---- features ---- */

corax_status corax_gis_feature(corax_gis *g, int layer)
{
    if (g->feature)
        gdal.OGR_F_Destroy(g->feature);
    g->current = layer;
    g->feature = gdal.OGR_F_Create(gdal.OGR_L_GetLayerDefn(g->layer[layer].layer));
    if (!g->feature)
        return CORAX_ENOMEM;
    if (g->cad && g->cad_layer_field >= 0)
        gdal.OGR_F_SetFieldString(g->feature, g->cad_layer_field, g->layer[layer].name);
    return CORAX_OK;
}

static int field_ok(const corax_gis *g, size_t field)
{
    return g->feature && field < g->layer[g->current].nfields;
}

void corax_gis_real(corax_gis *g, size_t field, double value)
{
    if (field_ok(g, field) && isfinite(value))
        gdal.OGR_F_SetFieldDouble(g->feature, (int)field, value);
}

void corax_gis_integer(corax_gis *g, size_t field, long long value)
{
    if (field_ok(g, field))
        gdal.OGR_F_SetFieldInteger64(g->feature, (int)field, (GIntBig)value);
}

void corax_gis_text(corax_gis *g, size_t field, const char *text, size_t length)
{
    if (!field_ok(g, field))
        return;
    char small[256], *s = length < sizeof small ? small : malloc(length + 1);
    if (!s)
        return;
    memcpy(s, text, length);
    s[length] = '\0';
    gdal.OGR_F_SetFieldString(g->feature, (int)field, s);
    if (s != small)
        free(s);
}

void corax_gis_point(corax_gis *g, corax_vec3 p)
{
    if (!g->feature)
        return;
    OGRGeometryH geom = gdal.OGR_G_CreateGeometry(wkbPoint25D);
    gdal.OGR_G_SetPoint(geom, 0, p.x, p.y, p.z);
    gdal.OGR_F_SetGeometryDirectly(g->feature, geom);
}

void corax_gis_line(corax_gis *g, const corax_vec3 *p, const double *m, size_t n)
{
    if (!g->feature)
        return;
    int with_m = m && g->measured;
    OGRGeometryH geom = gdal.OGR_G_CreateGeometry(with_m ? wkbLineStringZM : wkbLineString25D);
    for (size_t i = 0; i < n; i++) {
        if (with_m)
            gdal.OGR_G_AddPointZM(geom, p[i].x, p[i].y, p[i].z, m[i]);
        else
            gdal.OGR_G_AddPoint(geom, p[i].x, p[i].y, p[i].z);
    }
    gdal.OGR_F_SetGeometryDirectly(g->feature, geom);
}

corax_status corax_gis_write(corax_gis *g, corax_error *err)
{
    if (!g->feature)
        return corax_error_set(err, CORAX_EARG, g->path, 0, "no feature begun");
    if (g->cad && !gdal.OGR_F_GetGeometryRef(g->feature)) { /* nothing to draw */
        gdal.OGR_F_Destroy(g->feature);
        g->feature = NULL;
        return CORAX_OK;
    }
    quiet_begin();
    OGRErr e = gdal.OGR_L_CreateFeature(g->layer[g->current].layer, g->feature);
    corax_status st = e == OGRERR_NONE
                          ? CORAX_OK
                          : corax_error_set(err, CORAX_EIO, g->path, 0,
                                            "cannot write to layer '%s': %s",
                                            g->layer[g->current].name,
                                            gdal_says("OGR refused the feature"));
    quiet_end();
    gdal.OGR_F_Destroy(g->feature);
    g->feature = NULL;
    return st;
}

/* ---- the end ---- */

static void release(corax_gis *g)
{
    if (g->feature)
        gdal.OGR_F_Destroy(g->feature);
    if (g->srs)
        gdal.OSRRelease(g->srs);
    for (size_t i = 0; i < g->nlayers; i++)
        free(g->layer[i].name);
    free(g->layer);
    free(g->path);
    free(g->dir);
    free(g->inside);
    free(g);
}

/* Close the dataset; 1 when GDAL reported no failure. */
static int close_dataset(corax_gis *g, int keep)
{
    quiet_begin();
    if (g->transaction && keep && gdal.GDALDatasetCommitTransaction(g->ds) != OGRERR_NONE)
        keep = 0;
    gdal.GDALClose(g->ds);
    g->ds = NULL;
    int ok = keep && !failed_quietly();
    quiet_end();
    return ok;
}

corax_status corax_gis_commit(corax_gis *g, corax_error *err)
{
    corax_status st = CORAX_OK;
    if (!close_dataset(g, 1))
        st = corax_error_set(err, CORAX_EIO, g->path, 0, "cannot write: %s",
                             gdal_says("GDAL could not finish the file"));
    if (st != CORAX_OK)
        corax_outputs_drop_folder(g->set, g->dir);
    else if (!g->set) /* with a set, the run puts it in place with its other files */
        st = corax_outputs_place_folder(g->dir, g->path, err);
    release(g);
    return st;
}

void corax_gis_discard(corax_gis *g)
{
    if (!g)
        return;
    if (g->ds)
        close_dataset(g, 0);
    if (g->dir)
        corax_outputs_drop_folder(g->set, g->dir);
    release(g);
}
