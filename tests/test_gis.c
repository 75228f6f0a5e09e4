/* Tests of the GIS writer: what corax_gis hands to OGR comes back through
 * OGR's own reader (GDAL's C API, independent of corax): layers, typed
 * fields with nulls, 3-D points and measured lines; layer names that clash;
 * files whole or not at all; formats GDAL does not have. */
#include <dirent.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include <gdal.h>
#include <ogr_api.h>
#include <ogr_srs_api.h>

#include "corax/gis.h"
#include "support/check.h"

static char folder[64];

static int setup(void **state)
{
    (void)state;
    snprintf(folder, sizeof folder, "/tmp/corax-gis.XXXXXX");
    return mkdtemp(folder) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    char cmd[128];
    snprintf(cmd, sizeof cmd, "rm -rf %s", folder);
    return system(cmd) == 0 ? 0 : -1;
}

static size_t entries(void)
{
    size_t n = 0;
    DIR *d = opendir(folder);
    struct dirent *e;
    while ((e = readdir(d)) != NULL)
        n += strcmp(e->d_name, ".") != 0 && strcmp(e->d_name, "..") != 0;
    closedir(d);
    return n;
}

static const corax_gis_field fields[] = {
    {"hole", CORAX_GIS_TEXT}, {"depth", CORAX_GIS_REAL}, {"count", CORAX_GIS_INTEGER}};

static void test_geopackage_read_back(void **state)
{
    (void)state;
    char path[128];
    snprintf(path, sizeof path, "%s/t.gpkg", folder);
    corax_gis *g;
    corax_error err;
    corax_error_clear(&err);
    assert_int_equal(corax_gis_open(NULL, path, "gpkg", "EPSG:28355", &g, &err), CORAX_OK);
    assert_true(corax_gis_measured(g));
    assert_false(corax_gis_cad(g));
    int points, lines, other;
    assert_int_equal(corax_gis_layer(g, "points", CORAX_GIS_POINTS, 0, fields, 3, &points, &err),
                     CORAX_OK);
    assert_int_equal(corax_gis_layer(g, "lines", CORAX_GIS_LINES, 1, fields, 1, &lines, &err),
                     CORAX_OK);
    /* GeoPackage table names ignore case: a clash */
    assert_int_equal(corax_gis_layer(g, "POINTS", CORAX_GIS_POINTS, 0, fields, 1, &other, &err),
                     CORAX_EARG);
    assert_non_null(strstr(err.message, "two layers named 'POINTS'"));
    assert_int_equal(corax_gis_feature(g, points), CORAX_OK);
    corax_gis_text(g, 0, "QC001x", 5);
    corax_gis_real(g, 1, 12.25);
    corax_gis_integer(g, 2, 7);
    corax_gis_point(g, (corax_vec3){10250.125, 50120.5, 512.375});
    assert_int_equal(corax_gis_write(g, &err), CORAX_OK);
    assert_int_equal(corax_gis_feature(g, points), CORAX_OK);
    corax_gis_real(g, 1, NAN); /* null, as is everything not set */
    assert_int_equal(corax_gis_write(g, &err), CORAX_OK);
    corax_vec3 p[3] = {{0, 0, 100}, {1, 2, 90}, {2, 4, 80}};
    double m[3] = {0, 10.5, 21};
    assert_int_equal(corax_gis_feature(g, lines), CORAX_OK);
    corax_gis_text(g, 0, "L", 1);
    corax_gis_line(g, p, m, 3);
    assert_int_equal(corax_gis_write(g, &err), CORAX_OK);
    /* nothing under the real name until the commit */
    assert_int_equal(access(path, F_OK), -1);
    assert_int_equal(corax_gis_commit(g, &err), CORAX_OK);
    assert_int_equal(entries(), 1); /* the file alone: the private folder is gone */

    GDALDatasetH ds = GDALOpenEx(path, GDAL_OF_VECTOR, NULL, NULL, NULL);
    assert_non_null(ds);
    assert_int_equal(GDALDatasetGetLayerCount(ds), 2);
    OGRLayerH l = GDALDatasetGetLayerByName(ds, "points");
    assert_int_equal(OGR_L_GetFeatureCount(l, 1), 2);
    assert_int_equal(OGR_L_GetGeomType(l), wkbPoint25D);
    OGRSpatialReferenceH srs = OGR_L_GetSpatialRef(l);
    assert_non_null(srs);
    assert_string_equal(OSRGetAuthorityCode(srs, NULL), "28355");
    OGR_L_ResetReading(l);
    OGRFeatureH f = OGR_L_GetNextFeature(l);
    assert_string_equal(OGR_F_GetFieldAsString(f, 0), "QC001");
    assert_close(OGR_F_GetFieldAsDouble(f, 1), 12.25, 0, 0, "depth as written");
    assert_int_equal(OGR_F_GetFieldAsInteger64(f, 2), 7);
    OGRGeometryH geom = OGR_F_GetGeometryRef(f);
    assert_close(OGR_G_GetX(geom, 0), 10250.125, 0, 0, "x as written");
    assert_close(OGR_G_GetZ(geom, 0), 512.375, 0, 0, "z as written");
    OGR_F_Destroy(f);
    f = OGR_L_GetNextFeature(l);
    assert_true(OGR_F_IsFieldNull(f, 0) && OGR_F_IsFieldNull(f, 1) && OGR_F_IsFieldNull(f, 2));
    assert_null(OGR_F_GetGeometryRef(f));
    OGR_F_Destroy(f);
    l = GDALDatasetGetLayerByName(ds, "lines");
    assert_int_equal(OGR_L_GetGeomType(l), wkbLineStringZM);
    OGR_L_ResetReading(l);
    f = OGR_L_GetNextFeature(l);
    geom = OGR_F_GetGeometryRef(f);
    assert_int_equal(OGR_G_GetPointCount(geom), 3);
    assert_close(OGR_G_GetM(geom, 1), 10.5, 0, 0, "the measure is the depth");
    assert_close(OGR_G_GetZ(geom, 2), 80, 0, 0, "z of the last vertex");
    OGR_F_Destroy(f);
    GDALClose(ds);
    unlink(path);
}

static void test_whole_or_nothing(void **state)
{
    (void)state;
    char path[128];
    snprintf(path, sizeof path, "%s/d.gpkg", folder);
    corax_gis *g;
    corax_error err;
    int layer;
    assert_int_equal(corax_gis_open(NULL, path, "GPKG", NULL, &g, &err), CORAX_OK);
    assert_int_equal(corax_gis_layer(g, "a", CORAX_GIS_POINTS, 0, fields, 3, &layer, &err),
                     CORAX_OK);
    assert_int_equal(entries(), 1); /* the private folder */
    corax_gis_discard(g);
    assert_int_equal(entries(), 0);
    corax_gis_discard(NULL);

    /* shapefiles: a folder of files; a folder already there and not empty
     * is not replaced, and the attempt leaves nothing else */
    snprintf(path, sizeof path, "%s/shapes", folder);
    mkdir(path, 0777);
    char keep[160];
    snprintf(keep, sizeof keep, "%s/keep.txt", path);
    FILE *k = fopen(keep, "w");
    fputs("mine\n", k);
    fclose(k);
    assert_int_equal(corax_gis_open(NULL, path, "shp", NULL, &g, &err), CORAX_OK);
    assert_int_equal(corax_gis_layer(g, "a", CORAX_GIS_POINTS, 0, fields, 3, &layer, &err),
                     CORAX_OK);
    assert_int_equal(corax_gis_commit(g, &err), CORAX_EIO);
    assert_non_null(strstr(err.message, "not empty"));
    assert_int_equal(entries(), 1);
    assert_int_equal(access(keep, F_OK), 0);
    unlink(keep);
    rmdir(path);
}

/* GDAL, not linked into corax, is loaded by the soname of the GDAL the build
 * found; the one this test links is that GDAL, so the two agree. */
static void test_gdal_is_loaded_on_demand(void **state)
{
    (void)state;
    const char *why = corax_gis_unavailable();
    if (why)
        fail_msg("GDAL cannot be loaded: %s", why);
    char ours[64]; /* GDAL's answer lives only until it is asked again */
    snprintf(ours, sizeof ours, "%s", corax_gis_gdal_version());
    assert_string_equal(ours, GDALVersionInfo("RELEASE_NAME"));
}

static void test_formats(void **state)
{
    (void)state;
    corax_gis *g;
    corax_error err;
    char path[128];
    snprintf(path, sizeof path, "%s/x", folder);
    corax_error_clear(&err);
    assert_int_equal(corax_gis_open(NULL, path, "no-such-format", NULL, &g, &err), CORAX_ENOTFOUND);
    assert_non_null(strstr(err.message, "not a vector format"));
    assert_null(g);
    /* a raster driver writes no vectors */
    assert_null(corax_gis_driver("GTiff"));
    assert_string_equal(corax_gis_driver("shp"), "ESRI Shapefile");
    assert_string_equal(corax_gis_driver("flatgeobuf"), "FlatGeobuf");
    assert_true(corax_gis_known_format("DXF") && !corax_gis_known_format("gml"));
    char list[4096];
    corax_gis_drivers(list, sizeof list);
    assert_non_null(strstr(list, "GPKG"));
    assert_null(strstr(list, "GTiff"));
    assert_int_equal(corax_gis_open(NULL, path, "gpkg", "EPSG:4326", &g, &err), CORAX_EARG);
    assert_non_null(strstr(err.message, "geographic"));
    assert_int_equal(corax_gis_open(NULL, path, "gpkg", "not a crs", &g, &err), CORAX_EARG);
    assert_int_equal(entries(), 0);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_geopackage_read_back),
        cmocka_unit_test(test_whole_or_nothing),
        cmocka_unit_test(test_gdal_is_loaded_on_demand),
        cmocka_unit_test(test_formats),
    };
    return cmocka_run_group_tests_name("gis", tests, setup, teardown);
}
