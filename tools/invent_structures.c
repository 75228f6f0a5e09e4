/* Invent a table of converted structures, in the shape `corax convert`
 * writes, for demos, tests and benchmarks: invented holes of an invented
 * prospect, invented families of planes and one of lines. Each hole meets a
 * plane with a probability proportional to |cos| of the angle between the
 * plane's pole and the hole, as a real hole does, so the table carries the
 * sampling bias that Terzaghi weighting corrects.
 *
 * usage: invent_structures ROWS [SEED] > structures.csv */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>

#include "corax/corax.h"

typedef struct family {
    const char *kind;
    double dip_direction, dip, kappa; /* degrees; the population's mean plane */
} family;

static const family families[] = {
    {"bedding", 125, 35, 40}, {"foliation", 305, 72, 25}, {"vein", 210, 80, 18},
    {"fault", 40, 60, 10},    {"joint", 0, 85, 4},
};

typedef struct hole {
    const char *name;
    double x, y, z, azimuth, dip; /* dip negative down */
} hole;

static const hole holes[] = {
    {"LB001", 5120, 8340, 412, 300, -60}, {"LB002", 5260, 8410, 409, 120, -55},
    {"LB003", 5050, 8520, 415, 30, -70},  {"LB004", 5390, 8290, 404, 210, -50},
    {"LB005", 5180, 8620, 418, 90, -85},  {"LB006", 5310, 8560, 411, 330, -45},
};

enum { NHOLES = sizeof holes / sizeof holes[0], NFAMILIES = sizeof families / sizeof families[0] };

static uint64_t state;

static double uniform(void)
{
    uint64_t z = (state += 0x9E3779B97F4A7C15u);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9u;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBu;
    return (double)((z ^ (z >> 31)) >> 11) * 0x1.0p-53;
}

static corax_vec3 cross(corax_vec3 a, corax_vec3 b)
{
    return (corax_vec3){a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x};
}

static double dot(corax_vec3 a, corax_vec3 b) { return a.x * b.x + a.y * b.y + a.z * b.z; }

/* alpha and beta of a plane of unit normal n met by a hole going t, with the
 * bottom-of-hole line and beta clockwise looking down the hole. */
static void core_angles(corax_vec3 n, corax_vec3 t, double *alpha, double *beta)
{
    if (dot(n, t) < 0)
        n = (corax_vec3){-n.x, -n.y, -n.z};
    double s = dot(n, t);
    *alpha = asin(fmin(1.0, s));
    corax_vec3 u = {0, 0, 1}, r = {u.x - dot(u, t) * t.x, u.y - dot(u, t) * t.y, u.z - dot(u, t) * t.z};
    double rn = sqrt(dot(r, r));
    r = (corax_vec3){-r.x / rn, -r.y / rn, -r.z / rn};
    corax_vec3 e = {s * t.x - n.x, s * t.y - n.y, s * t.z - n.z}; /* along the ellipse axis */
    *beta = atan2(dot(e, cross(t, r)), dot(e, r));
}

static void plane_row(const hole *h, double depth, const char *kind, corax_vec3 n, corax_vec3 t,
                      const char *status)
{
    double alpha, beta;
    core_angles(n, t, &alpha, &beta);
    corax_vec3 up;
    corax_plane p = corax_plane_from_normal(n, &up);
    double dd = corax_deg(p.dip_direction), dip = corax_deg(p.dip);
    printf("%s,%.2f,%.1f,%.1f,,%s,%s,%.2f,%.2f,%.2f,%.1f,%.1f,%.2f,%.2f,%.2f,%.2f,%.2f,"
           "%.5f,%.5f,%.5f,,,%s,\n",
           h->name, depth, corax_deg(alpha), corax_wrap_degrees(corax_deg(beta), 1), kind,
           uniform() < 0.8 ? "high" : "low", h->x + 0.4 * depth, h->y + 0.3 * depth,
           h->z - 0.8 * depth, h->azimuth, -h->dip, dip, corax_wrap_degrees(dd, 2),
           corax_wrap_degrees(dd - 90, 2), corax_wrap_degrees(dd + 180, 2), 90 - dip, up.x,
           up.y, up.z, status);
}

int main(int argc, char **argv)
{
    if (argc < 2 || atol(argv[1]) < 1) {
        fprintf(stderr, "usage: invent_structures ROWS [SEED] > structures.csv\n");
        return 2;
    }
    long rows = atol(argv[1]);
    state = argc > 2 ? (uint64_t)atoll(argv[2]) : 2024;
    printf("hole,depth,alpha,beta,gamma,kind,confidence,x,y,z,hole_azimuth,hole_plunge,dip,"
           "dip_direction,strike,pole_trend,pole_plunge,nx,ny,nz,trend,plunge,status,note\n");
    for (long i = 0; i < rows; i++) {
        const hole *h = &holes[i % NHOLES];
        double plunge;
        corax_dip_to_plunge(h->dip, CORAX_DIP_NEGATIVE_DOWN, &plunge);
        corax_vec3 t = corax_direction(corax_rad(h->azimuth), plunge);
        double depth = 5 + 400 * (double)(i / NHOLES) / (double)(rows / NHOLES + 1);
        if (i % 23 == 7) { /* a reading the logger could not orient */
            printf("%s,%.2f,%.1f,,,joint,low,%.2f,%.2f,%.2f,%.1f,%.1f,,,,,,,,,,,unoriented,"
                   "no orientation line\n", h->name, depth, 20 + 60 * uniform(), h->x, h->y,
                   h->z - depth, h->azimuth, -h->dip);
            continue;
        }
        if (i % 9 == 4) { /* a lineation: lines cluster about 150/30 */
            corax_vec3 l = corax_fisher_draw(corax_direction(corax_rad(150), corax_rad(30)), 30,
                                             uniform(), uniform());
            double trend, pl;
            corax_line_trend_plunge(l, &trend, &pl);
            printf("%s,%.2f,,,,lineation,high,%.2f,%.2f,%.2f,%.1f,%.1f,,,,,,,,,%.2f,%.2f,ok,\n",
                   h->name, depth, h->x + 0.4 * depth, h->y + 0.3 * depth, h->z - 0.8 * depth,
                   h->azimuth, -h->dip, corax_wrap_degrees(corax_deg(trend), 2), corax_deg(pl));
            continue;
        }
        const family *f;
        corax_vec3 n;
        do { /* the hole meets a plane with probability |cos delta| */
            f = &families[(size_t)(uniform() * NFAMILIES)];
            corax_vec3 mean = corax_plane_normal((corax_plane){corax_rad(f->dip),
                                                               corax_rad(f->dip_direction)});
            n = corax_fisher_draw(mean, f->kappa, uniform(), uniform());
        } while (uniform() > fabs(dot(n, t)));
        plane_row(h, depth, f->kind, n, t, fabs(dot(n, t)) < 0.17 ? "near-parallel" : "ok");
    }
    return 0;
}
