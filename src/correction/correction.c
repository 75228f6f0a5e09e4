/* correction: what each survey station's azimuth needs to reach the grid of
 * the collar coordinates: declination, grid convergence and local grid
 * rotation, from constants or from a magnetic model and a CRS. */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#include "common/grow.h"
#include "corax/correction.h"

static const char *const north_names[] = {"magnetic", "true", "grid"};

const char *corax_north_name(corax_north north)
{
    return (unsigned)north < 3 ? north_names[north] : "unknown";
}

int corax_north_parse(const char *text, size_t len, corax_north *out)
{
    for (int i = 0; i < 3; i++)
        if (strlen(north_names[i]) == len && strncasecmp(text, north_names[i], len) == 0) {
            *out = (corax_north)i;
            return 0;
        }
    return -1;
}

corax_corrector corax_corrector_default(void)
{
    corax_corrector c;
    memset(&c, 0, sizeof c);
    c.date = NAN;
    c.north = CORAX_NORTH_MAGNETIC;
    return c;
}

corax_status corax_corrector_site(const corax_corrector *c, corax_vec3 position, double latitude,
                                  double longitude, corax_site *out, corax_error *err)
{
    out->latitude = latitude;
    out->longitude = longitude;
    out->height = position.z;
    out->convergence = c->convergence_from_crs ? (double)NAN : c->convergence;
    out->rotation = c->local_grid ? c->local_grid->rotation : 0.0;
    out->east = out->north = NAN;
    if (c->convergence_from_crs && !c->crs)
        return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                               "the grid convergence is to come from a CRS, but none is given");
    int need_place = c->model && !(isfinite(latitude) && isfinite(longitude));
    if (!c->crs) {
        if (need_place)
            return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                                   "the magnetic model needs the collar's place: give a CRS "
                                   "for the collar coordinates, or latitude and longitude");
        return CORAX_OK;
    }
    out->east = position.x;
    out->north = position.y;
    if (c->local_grid)
        corax_local_grid_to_crs(c->local_grid, position.x, position.y, &out->east, &out->north);
    if (!need_place && !c->convergence_from_crs)
        return CORAX_OK;
    double lat, lon, conv;
    corax_status st = corax_crs_locate(c->crs, out->east, out->north, &lat, &lon, &conv, err);
    if (st != CORAX_OK)
        return st;
    if (need_place) {
        out->latitude = lat;
        out->longitude = lon;
    }
    if (c->convergence_from_crs)
        out->convergence = conv;
    return CORAX_OK;
}

static void no_field(corax_magnetic_field *f)
{
    f->north = f->east = f->down = f->horizontal = f->total = NAN;
    f->declination = f->inclination = NAN;
    f->model = NULL;
}

corax_status corax_corrector_station(const corax_corrector *c, const corax_site *site,
                                     double date, corax_north north, corax_correction *out,
                                     corax_error *err)
{
    out->date = isfinite(date) ? date : c->date;
    out->north = north;
    out->declination = out->convergence = out->rotation = 0.0;
    no_field(&out->field);
    if (north == CORAX_NORTH_MAGNETIC) {
        out->declination = c->declination;
        if (c->model) {
            if (!isfinite(out->date))
                return corax_error_set(err, CORAX_EVALUE, NULL, 0,
                                       "no survey date for the magnetic model: the station and "
                                       "its collar have none, and no default date is set");
            corax_status st = corax_magnetic_field_at(c->model, out->date, site->latitude,
                                                      site->longitude, site->height, &out->field,
                                                      err);
            if (st != CORAX_OK)
                return st;
            out->declination = out->field.declination;
        }
    }
    if (north != CORAX_NORTH_GRID) {
        out->convergence = site->convergence;
        out->rotation = site->rotation;
    }
    out->total = out->declination - out->convergence - out->rotation;
    return CORAX_OK;
}

corax_status corax_corrections_add(corax_corrections *l, const char *hole,
                                   const corax_station_record *rec)
{
    corax_station_record *grown = corax_grow(l->item, l->count, &l->capacity, sizeof *grown, 64);
    if (!grown)
        return CORAX_ENOMEM;
    l->item = grown;
    corax_station_record *r = &l->item[l->count];
    *r = *rec;
    if (!(r->hole = strdup(hole)))
        return CORAX_ENOMEM;
    l->count++;
    l->sorted = 0;
    return CORAX_OK;
}

static int record_cmp(const void *a, const void *b)
{
    const corax_station_record *x = a, *y = b;
    int c = strcmp(x->hole, y->hole);
    if (c)
        return c;
    return x->line < y->line ? -1 : x->line > y->line;
}

void corax_corrections_sort(corax_corrections *l)
{
    if (l->count)
        qsort(l->item, l->count, sizeof *l->item, record_cmp);
    l->sorted = 1;
}

const corax_station_record *corax_corrections_find(const corax_corrections *l, const char *hole,
                                                   long line)
{
    corax_station_record key;
    memset(&key, 0, sizeof key);
    key.hole = (char *)hole; /* the key is only read */
    key.line = line;
    if (!l->sorted || !l->count)
        return NULL;
    return bsearch(&key, l->item, l->count, sizeof *l->item, record_cmp);
}

void corax_corrections_clear(corax_corrections *l)
{
    for (size_t i = 0; i < l->count; i++)
        free(l->item[i].hole);
    free(l->item);
    memset(l, 0, sizeof *l);
}
