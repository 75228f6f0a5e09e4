/* stats: Terzaghi's (1965) correction for the bias of sampling planes along
 * a line: a hole meets planes nearly parallel to it rarely, so each plane it
 * does meet stands for 1 / |cos delta| of them. */
#include <math.h>

#include "corax/stats.h"
#include "geometry/vec.h"

double corax_terzaghi_weight(corax_vec3 normal, corax_vec3 hole, double min_angle)
{
    double c = fabs(vec_dot(normal, hole)); /* sin of the angle between hole and plane */
    double floor_ = sin(min_angle);
    return 1.0 / (c > floor_ ? c : floor_);
}
