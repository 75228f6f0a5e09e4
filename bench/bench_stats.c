/* Benchmark: orientation statistics and density contouring of 100,000 and
 * 4,000,000 poles (an invented cluster and girdle), and a whole net of them;
 * reports rates and peak memory. The density's floor is binning the poles
 * alone: the equal-area point and cell of each, which any counting that
 * looks only near each node must do. */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <sys/resource.h>
#include <time.h>

#include "bench.h"
#include "corax/corax.h"
#include "corax/stereonet.h"

enum { GRID = 121 };

/* Seconds to find every pole's cell on the net (the density's floor). */
static double binning_floor(const corax_vec3 *poles, size_t n)
{
    enum { CELLS = 950 };
    unsigned *count = calloc(CELLS * CELLS, sizeof *count);
    if (!count)
        return NAN;
    double t0 = now();
    for (size_t i = 0; i < n; i++) {
        corax_vec3 v = poles[i];
        if (v.z > 0)
            v = (corax_vec3){-v.x, -v.y, -v.z};
        double f = 1.0 / sqrt(1.0 - v.z);
        size_t cx = (size_t)((v.x * f + 1.0) * 0.5 * (CELLS - 1));
        size_t cy = (size_t)((v.y * f + 1.0) * 0.5 * (CELLS - 1));
        count[cy * CELLS + cx]++;
    }
    double t = now() - t0;
    free(count);
    return t;
}

static int run(size_t npoles)
{
    corax_vec3 *poles = malloc(npoles * sizeof *poles);
    double *grid = malloc(GRID * GRID * sizeof *grid);
    if (!poles || !grid)
        return 1;
    uint64_t seed = 1;
    corax_vec3 a = corax_direction(corax_rad(300), corax_rad(50));
    corax_vec3 b = corax_direction(corax_rad(120), corax_rad(10));
    for (size_t i = 0; i < npoles; i++)
        poles[i] = corax_fisher_draw(i % 3 ? a : b, i % 3 ? 25 : 8, uniform(&seed), uniform(&seed));

    double t0 = now();
    corax_axial_summary s;
    if (corax_axial_summary_compute(poles, NULL, npoles, &s) != CORAX_OK)
        return 1;
    double t_stats = now() - t0;
    printf("%zu poles, density grid %d x %d\n", npoles, GRID, GRID);
    printf("  Fisher mean and orientation tensor: %.1f million poles per second\n",
           (double)npoles / t_stats / 1e6);
    printf("  floor (each pole's cell on the net, one thread): %.3f s\n",
           binning_floor(poles, npoles));
    for (int m = 0; m < 2; m++) {
        corax_density d;
        corax_density_init(&d, (corax_density_method)m, npoles);
        t0 = now();
        corax_density_grid(&d, poles, NULL, GRID, grid);
        double t = now() - t0;
        printf("  %-6s density grid: %.3f s (%.1f million poles per second)\n",
               corax_density_method_name((corax_density_method)m), t, (double)npoles / t / 1e6);
    }
    double edge = sqrt(2.0), h = 2 * edge / (GRID - 1);
    corax_grid g = {GRID, GRID, -edge, -edge, h, h, grid};
    corax_isolines lines = {0};
    double top = 0;
    for (size_t k = 0; k < GRID * GRID; k++)
        top = fmax(top, grid[k]);
    t0 = now();
    size_t points = 0;
    for (int k = 1; k <= 50; k++) {
        corax_isolines_trace(&g, (double)k * top / 51.0, &lines);
        points += lines.points;
    }
    printf("  isolines: 50 levels in %.4f s (%zu points)\n", now() - t0, points);
    corax_isolines_clear(&lines);

    corax_net_set set = {.name = "bench", .poles = poles, .npoles = npoles, .pole_summary = &s};
    corax_net_style style = corax_net_style_default();
    corax_svg *svg;
    t0 = now();
    if (corax_stereonet_page(&set, 1, &style, 0, &svg) != CORAX_OK)
        return 1;
    size_t bytes;
    corax_svg_finish(svg, &bytes);
    printf("  whole net (Kamb contours, a sample of the poles drawn): %.3f s, %.2f MB of SVG\n",
           now() - t0, bytes / 1e6);
    corax_svg_free(svg);
    free(poles);
    free(grid);
    return 0;
}

int main(void)
{
    if (run(100000) || run(4000000))
        return 1;
    struct rusage ru;
    getrusage(RUSAGE_SELF, &ru);
    printf("  peak memory (resident): %.1f MiB (the 4M poles alone: %.1f MiB)\n",
           (double)ru.ru_maxrss / 1024.0, 4e6 * sizeof(corax_vec3) / 1048576.0);
    return 0;
}
