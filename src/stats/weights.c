/* stats: orientation statistics (Fisher, the orientation tensor, Terzaghi
 * weights, Kamb density). This file: the weights they share. */
#include <math.h>

#include "stats/stats_int.h"

corax_status corax_stats_weight_scale(const double *w, size_t n, double *scale, double *sum)
{
    double s = (double)n;
    if (w) {
        s = 0.0;
        for (size_t i = 0; i < n; i++) {
            if (!(w[i] >= 0.0) || !isfinite(w[i]))
                return CORAX_EARG;
            s += w[i];
        }
        if (!(s > 0.0))
            return CORAX_EARG;
    }
    *scale = (double)n / s;
    if (sum)
        *sum = s;
    return CORAX_OK;
}
