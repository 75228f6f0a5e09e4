/* section: vertical cross-sections: projecting points onto the section
 * plane, the slab either side of it, and apparent dips (pure math). */
#include <math.h>

#include "corax/section.h"

corax_section corax_section_make(double x, double y, double azimuth, double width)
{
    corax_section s = {x, y, corax_wrap_azimuth(azimuth), 0.5 * width, -HUGE_VAL, HUGE_VAL};
    return s;
}

corax_section_point corax_section_project(const corax_section *s, corax_vec3 p)
{
    /* along the azimuth u = (sin a, cos a); to its right (azimuth + 90)
     * r = (cos a, -sin a) */
    double sa = sin(s->azimuth), ca = cos(s->azimuth);
    double dx = p.x - s->x, dy = p.y - s->y;
    corax_section_point q = {dx * sa + dy * ca, dx * ca - dy * sa, p.z};
    return q;
}

int corax_section_in_slab(const corax_section *s, const corax_section_point *p)
{
    return fabs(p->offset) <= s->half_width;
}

int corax_section_in_range(const corax_section *s, double along)
{
    return along >= s->from && along <= s->to;
}

corax_section_dip corax_section_plane(const corax_section *s, corax_plane plane)
{
    corax_section_dip d;
    d.apparent = corax_apparent_dip(plane, s->azimuth, &d.toward);
    if (d.toward == 0) {
        d.toward_azimuth = NAN;
        d.along = 1.0;
        d.up = 0.0;
    } else {
        d.toward_azimuth = corax_wrap_azimuth(s->azimuth + (d.toward > 0 ? 0.0 : CORAX_PI));
        d.along = (double)d.toward * cos(d.apparent);
        d.up = -sin(d.apparent);
    }
    return d;
}
