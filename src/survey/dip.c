/* survey: dip conventions of hole tables, stations, and names of places down a hole. */
#include <math.h>

#include "corax/survey.h"

static const char *const dip_names[] = {"negative-down", "positive-down", "from-vertical"};

const char *corax_dip_convention_name(corax_dip_convention convention)
{
    return (unsigned)convention < 3 ? dip_names[convention] : "unknown";
}

corax_status corax_dip_to_plunge(double dip, corax_dip_convention convention, double *plunge)
{
    if (!isfinite(dip))
        return CORAX_EVALUE;
    switch (convention) {
    case CORAX_DIP_NEGATIVE_DOWN:
        if (dip < -90.0 || dip > 90.0)
            return CORAX_EVALUE;
        *plunge = corax_rad(-dip);
        return CORAX_OK;
    case CORAX_DIP_POSITIVE_DOWN:
        if (dip < -90.0 || dip > 90.0)
            return CORAX_EVALUE;
        *plunge = corax_rad(dip);
        return CORAX_OK;
    case CORAX_DIP_FROM_VERTICAL:
        if (dip < 0.0 || dip > 180.0)
            return CORAX_EVALUE;
        *plunge = corax_rad(90.0 - dip);
        return CORAX_OK;
    }
    return CORAX_EARG;
}

double corax_plunge_to_dip(double plunge, corax_dip_convention convention)
{
    double p = corax_deg(plunge);
    switch (convention) {
    case CORAX_DIP_NEGATIVE_DOWN: return -p;
    case CORAX_DIP_POSITIVE_DOWN: return p;
    case CORAX_DIP_FROM_VERTICAL: return 90.0 - p;
    }
    return NAN;
}

const char *corax_where_name(corax_where where)
{
    switch (where) {
    case CORAX_WHERE_SURVEYED: return "ok";
    case CORAX_WHERE_EXTRAPOLATED: return "extrapolated";
    case CORAX_WHERE_COLLAR_ONLY: return "collar-only";
    case CORAX_WHERE_BEYOND_END: return "beyond-end";
    }
    return "unknown";
}

corax_station corax_station_make(double depth, double azimuth, double plunge, long line)
{
    corax_station s = {depth, azimuth, plunge, line, 0, 0.0, 0.0};
    return s;
}
