/* Tests of the orientation statistics: Fisher mean and cone, draws from the
 * Fisher distribution, the orientation tensor and Woodcock's measures,
 * Terzaghi weights and Kamb density, each against its named source. */
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "corax/projection.h"
#include "corax/stats.h"
#include "support/check.h"

static corax_vec3 line(double trend_deg, double plunge_deg)
{
    return corax_direction(corax_rad(trend_deg), corax_rad(plunge_deg));
}

static double angle_deg(corax_vec3 a, corax_vec3 b)
{
    corax_vec3 c = {a.y * b.z - a.z * b.y, a.z * b.x - a.x * b.z, a.x * b.y - a.y * b.x};
    return corax_deg(atan2(sqrt(c.x * c.x + c.y * c.y + c.z * c.z),
                           a.x * b.x + a.y * b.y + a.z * b.z));
}

/* Ten directions (declination/inclination, inclination positive down) listed
 * in P. Vermeesch's lecture notes on directional data; statistics by Fisher
 * (1953) as given in L. Tauxe et al., Essentials of Paleomagnetism, ch. 11.
 * derived: mean 46.287/20.148, R 9.92767, k 124.42, alpha95 4.348. */
static const double ten[10][2] = {{47.9, 28.6}, {46.3, 20.1}, {44.7, 15.6}, {50.9, 18.1},
                                  {56.4, 17.5}, {42.6, 28.7}, {44.9, 12.2}, {41.5, 24.5},
                                  {47.9, 20.6}, {39.6, 15.0}};

static void check_ten(const corax_fisher *f, const char *what)
{
    double dec, inc;
    corax_direction_angles(f->mean, &dec, &inc);
    assert_close(corax_deg(dec), 46.287, 0, 1e-3, what);
    assert_close(corax_deg(inc), 20.148, 0, 1e-3, what);
    assert_close(f->resultant, 9.92767, 0, 1e-5, what);
    assert_close(f->kappa, 124.42, 0, 5e-3, what);
    assert_close(corax_deg(f->alpha95), 4.348, 0, 1e-3, what);
}

static void test_fisher_ten_directions_tauxe(void **state)
{
    (void)state;
    corax_vec3 v[10];
    for (int i = 0; i < 10; i++)
        v[i] = line(ten[i][0], ten[i][1]);
    corax_fisher f;
    assert_int_equal(corax_fisher_mean(v, NULL, 10, &f), CORAX_OK);
    check_ten(&f, "Fisher statistics of the ten directions (Tauxe, Essentials ch. 11)");
    /* equal weights of any size change nothing (they are rescaled to n) */
    double w[10];
    for (int i = 0; i < 10; i++)
        w[i] = 2.5;
    assert_int_equal(corax_fisher_mean(v, w, 10, &f), CORAX_OK);
    check_ten(&f, "equal weights of 2.5 (Tauxe, Essentials ch. 11)");
}

/* The same readings as axes, half of them given by their upper ends: the
 * tensor fixes the sign, and the mean and cone come out as for directions. */
static void test_axial_summary_takes_sign_from_tensor(void **state)
{
    (void)state;
    corax_vec3 v[10];
    for (int i = 0; i < 10; i++) {
        v[i] = line(ten[i][0], ten[i][1]);
        if (i % 2)
            v[i] = (corax_vec3){-v[i].x, -v[i].y, -v[i].z};
    }
    corax_axial_summary s;
    assert_int_equal(corax_axial_summary_compute(v, NULL, 10, &s), CORAX_OK);
    assert_int_equal(s.n, 10);
    assert_close(s.weight_sum, 10, 0, 0, "weight sum without weights");
    check_ten(&s.fisher, "axial mean of the ten directions (Tauxe, Essentials ch. 11)");
    assert_true(angle_deg(s.tensor.axis[0], s.fisher.mean) < 1.0);
}

/* The summary is, bit for bit, the tensor of the readings (corax_tensor_compute)
 * and the Fisher mean of the readings turned to its first axis
 * (corax_fisher_mean), weighted or not, whether it is met in arrays or in
 * passes over the readings (corax_axial_stream): the larger jobs (the QA's
 * convention test) take it in passes over data they cannot hold. Random
 * axial sets, a property of the code, no outside value. */
static void test_axial_summary_in_passes_is_exact(void **state)
{
    (void)state;
    enum { N = 500 };
    static corax_vec3 v[N], turned[N];
    static double w[N];
    uint64_t seed = 77;
    for (size_t n = 1; n <= N; n = n * 3 + 1)
        for (int weighted = 0; weighted < 2; weighted++) {
            for (size_t i = 0; i < n; i++) {
                v[i] = corax_fisher_draw(line(120, 30), 5.0, test_uniform(&seed),
                                         test_uniform(&seed));
                if (test_uniform(&seed) < 0.5)
                    v[i] = (corax_vec3){-v[i].x, -v[i].y, -v[i].z};
                w[i] = 1.0 + 9.0 * test_uniform(&seed);
            }
            const double *wp = weighted ? w : NULL;
            corax_axial_summary s, p;
            assert_int_equal(corax_axial_summary_compute(v, wp, n, &s), CORAX_OK);
            corax_tensor t;
            corax_fisher f;
            assert_int_equal(corax_tensor_compute(v, wp, n, &t), CORAX_OK);
            for (size_t i = 0; i < n; i++) {
                double d = v[i].x * t.axis[0].x + v[i].y * t.axis[0].y + v[i].z * t.axis[0].z;
                turned[i] = d < 0 ? (corax_vec3){-v[i].x, -v[i].y, -v[i].z} : v[i];
            }
            assert_int_equal(corax_fisher_mean(turned, wp, n, &f), CORAX_OK);
            if (f.mean.z > 0)
                f.mean = (corax_vec3){-f.mean.x, -f.mean.y, -f.mean.z};
            assert_true(memcmp(&s.tensor, &t, sizeof t) == 0);
            assert_true(s.fisher.resultant == f.resultant && s.fisher.n == f.n);
            assert_true(s.fisher.mean.x == f.mean.x && s.fisher.mean.y == f.mean.y &&
                        s.fisher.mean.z == f.mean.z);
            assert_true(n < 3 || (s.fisher.kappa == f.kappa && s.fisher.alpha95 == f.alpha95));
            corax_axial_stream st;
            corax_axial_stream_begin(&st, weighted);
            for (size_t i = 0; i < n; i++)
                corax_axial_stream_weigh(&st, w[i]);
            for (size_t i = 0; i < n; i++)
                corax_axial_stream_tensor(&st, v[i], w[i]);
            corax_axial_stream_axes(&st);
            for (size_t i = 0; i < n; i++)
                corax_axial_stream_mean(&st, v[i], w[i]);
            assert_int_equal(corax_axial_stream_end(&st, &p), CORAX_OK);
            assert_true(memcmp(&p.tensor, &s.tensor, sizeof p.tensor) == 0);
            assert_true(p.n == s.n && p.weight_sum == s.weight_sum);
            assert_true(p.fisher.mean.x == s.fisher.mean.x && p.fisher.mean.z == s.fisher.mean.z &&
                        p.fisher.resultant == s.fisher.resultant);
        }
    /* bad weights fail in passes as in arrays; none at all is no summary */
    corax_axial_stream st;
    corax_axial_summary p;
    corax_axial_stream_begin(&st, 1);
    corax_axial_stream_weigh(&st, 1.0);
    corax_axial_stream_weigh(&st, -1.0);
    assert_int_equal(corax_axial_stream_end(&st, &p), CORAX_EARG);
    assert_int_equal(p.n, 2);
    assert_true(isnan(p.fisher.resultant) && isnan(p.tensor.eigenvalue[0]));
    corax_axial_stream_begin(&st, 0);
    assert_int_equal(corax_axial_stream_end(&st, &p), CORAX_OK);
    assert_true(p.n == 0 && isnan(p.fisher.kappa));
}

/* SciPy's directional_stats documentation (general statistics library):
 * (0.8660254, 0.5, 0) and (0.8660254, -0.5, 0) have mean direction (1, 0, 0)
 * and mean resultant length 0.8660254. Two readings get no kappa or cone. */
static void test_fisher_two_vectors_scipy(void **state)
{
    (void)state;
    corax_vec3 v[2] = {{0.8660254, 0.5, 0}, {0.8660254, -0.5, 0}};
    corax_fisher f;
    assert_int_equal(corax_fisher_mean(v, NULL, 2, &f), CORAX_OK);
    assert_close(f.mean.x, 1, 0, 1e-12, "mean direction x (SciPy directional_stats example)");
    assert_close(f.mean.y, 0, 0, 1e-12, "mean direction y (SciPy directional_stats example)");
    assert_close(f.resultant / 2, 0.8660254, 0, 1e-7,
                 "mean resultant length (SciPy directional_stats example)");
    assert_true(isnan(f.kappa) && isnan(f.alpha95));
    /* identical readings: no spread, kappa unbounded */
    corax_vec3 one = line(10, 20), same[3] = {one, one, one};
    assert_int_equal(corax_fisher_mean(same, NULL, 3, &f), CORAX_OK);
    assert_true(isinf(f.kappa));
    assert_close(f.alpha95, 0, 0, 0, "identical readings: a cone of 0");
    /* bad weights are refused */
    double bad[2] = {1, -1}, zero[2] = {0, 0};
    assert_int_equal(corax_fisher_mean(v, bad, 2, &f), CORAX_EARG);
    assert_int_equal(corax_fisher_mean(v, zero, 2, &f), CORAX_EARG);
}

/* Fisher (1953): a reading far from the rest pulls the mean; given weight 0
 * it no longer does, and the mean is that of the others. */
static void test_fisher_zero_weight_removes_pull(void **state)
{
    (void)state;
    corax_vec3 v[4] = {line(10, 40), line(20, 45), line(15, 50), line(200, 10)};
    double w[4] = {1, 1, 1, 0};
    corax_fisher all, three, weighted;
    corax_fisher_mean(v, NULL, 4, &all);
    corax_fisher_mean(v, NULL, 3, &three);
    corax_fisher_mean(v, w, 4, &weighted);
    assert_true(angle_deg(all.mean, three.mean) > 5);
    assert_close(angle_deg(weighted.mean, three.mean), 0, 0, 1e-9, "weight 0 drops a reading");
}

/* Wood (1994), exact inverse for three dimensions: check values derived for
 * k 10, U 0.5 -> 0.9306853 (21.458 deg) and k 50, U 0.5 -> 0.9861371
 * (9.551 deg). */
static void test_wood_sampler_check_values(void **state)
{
    (void)state;
    assert_close(corax_fisher_cosine(10, 0.5), 0.9306853, 0, 1e-7, "Wood (1994), k 10, U 0.5");
    assert_close(corax_deg(acos(corax_fisher_cosine(10, 0.5))), 21.458, 0, 1e-3,
                 "Wood (1994), k 10, U 0.5, angle");
    assert_close(corax_fisher_cosine(50, 0.5), 0.9861371, 0, 1e-7, "Wood (1994), k 50, U 0.5");
    assert_close(corax_deg(acos(corax_fisher_cosine(50, 0.5))), 9.551, 0, 1e-3,
                 "Wood (1994), k 50, U 0.5, angle");
    corax_vec3 m = line(300, 20), d = corax_fisher_draw(m, 10, 0.5, 0.3);
    assert_close(angle_deg(m, d), 21.458, 0, 1e-3, "a draw lies at Wood's angle from the mean");
}

/* Fisher (1953): the 95% cone holds the true mean in 95% of samples, and
 * kappa estimates the concentration. Samples drawn by Wood's (1994) method. */
static void test_fisher_cone_covers_95_percent(void **state)
{
    (void)state;
    uint64_t seed = 77;
    corax_vec3 truth = line(75, 35), v[15];
    int covered = 0, trials = 4000;
    for (int t = 0; t < trials; t++) {
        for (int i = 0; i < 15; i++)
            v[i] = corax_fisher_draw(truth, 20, test_uniform(&seed), test_uniform(&seed));
        corax_fisher f;
        corax_fisher_mean(v, NULL, 15, &f);
        covered += angle_deg(f.mean, truth) <= corax_deg(f.alpha95);
    }
    assert_close((double)covered / trials, 0.95, 0, 0.012,
                 "share of cones holding the true mean (Fisher 1953)");
    corax_vec3 *big = malloc(20000 * sizeof *big);
    assert_non_null(big);
    for (int i = 0; i < 20000; i++)
        big[i] = corax_fisher_draw(truth, 30, test_uniform(&seed), test_uniform(&seed));
    corax_fisher f;
    corax_fisher_mean(big, NULL, 20000, &f);
    assert_close(f.kappa, 30, 0.03, 0, "kappa of a large sample drawn with kappa 30 (Fisher 1953)");
    free(big);
}

/* Derived: readings along the axes with weights 5, 3 and 2 have the tensor
 * diag(0.5, 0.3, 0.2): its eigenvalues and axes are known exactly, and
 * Woodcock's (1977) K and C follow from their definitions. */
static void test_tensor_known_eigenvalues(void **state)
{
    (void)state;
    corax_vec3 v[6] = {{0, 1, 0}, {0, -1, 0}, {1, 0, 0}, {-1, 0, 0}, {0, 0, 1}, {0, 0, -1}};
    double w[6] = {2.5, 2.5, 1.5, 1.5, 1, 1};
    corax_tensor t;
    assert_int_equal(corax_tensor_compute(v, w, 6, &t), CORAX_OK);
    assert_close(t.eigenvalue[0], 0.5, 0, 1e-12, "eigenvalue 1 (derived)");
    assert_close(t.eigenvalue[1], 0.3, 0, 1e-12, "eigenvalue 2 (derived)");
    assert_close(t.eigenvalue[2], 0.2, 0, 1e-12, "eigenvalue 3 (derived)");
    assert_close(fabs(t.axis[0].y), 1, 0, 1e-12, "axis 1 is north-south");
    assert_close(fabs(t.axis[1].x), 1, 0, 1e-12, "axis 2 is east-west");
    assert_close(t.axis[2].z, -1, 0, 1e-12, "axis 3 is vertical, given downward");
    assert_close(t.shape, log(0.5 / 0.3) / log(0.3 / 0.2), 0, 1e-12,
                 "Woodcock (1977) K = ln(S1/S2)/ln(S2/S3) (from memory of the paper)");
    assert_close(t.strength, log(0.5 / 0.2), 0, 1e-12,
                 "Woodcock (1977) C = ln(S1/S3) (from memory of the paper)");
    /* one reading: all in S1; K and C are not defined */
    corax_tensor one;
    assert_int_equal(corax_tensor_compute(v, NULL, 1, &one), CORAX_OK);
    assert_close(one.eigenvalue[0], 1, 0, 1e-12, "one reading: S1 = 1");
    assert_true(isnan(one.shape) && isnan(one.strength));
    assert_int_equal(corax_tensor_compute(v, NULL, 0, &one), CORAX_EARG);
}

/* Woodcock (1977), from memory: K above 1 for clusters, below 1 for girdles;
 * C grows with the strength of the fabric. */
static void test_woodcock_cluster_and_girdle(void **state)
{
    (void)state;
    uint64_t seed = 3;
    corax_vec3 v[500];
    corax_tensor cluster, girdle, loose;
    for (int i = 0; i < 500; i++)
        v[i] = corax_fisher_draw(line(40, 60), 40, test_uniform(&seed), test_uniform(&seed));
    corax_tensor_compute(v, NULL, 500, &cluster);
    /* a girdle: readings spread along the great circle of the plane 130/50 */
    corax_vec3 n = corax_plane_normal((corax_plane){corax_rad(50), corax_rad(130)});
    corax_vec3 strike = line(40, 0), down = {n.y * strike.z - n.z * strike.y,
                                             n.z * strike.x - n.x * strike.z,
                                             n.x * strike.y - n.y * strike.x};
    for (int i = 0; i < 500; i++) {
        double t = CORAX_PI * test_uniform(&seed);
        corax_vec3 p = {cos(t) * strike.x + sin(t) * down.x, cos(t) * strike.y + sin(t) * down.y,
                        cos(t) * strike.z + sin(t) * down.z};
        v[i] = corax_fisher_draw(p, 200, test_uniform(&seed), test_uniform(&seed));
    }
    corax_tensor_compute(v, NULL, 500, &girdle);
    for (int i = 0; i < 500; i++)
        v[i] = corax_fisher_draw(line(40, 60), 5, test_uniform(&seed), test_uniform(&seed));
    corax_tensor_compute(v, NULL, 500, &loose);
    assert_true(cluster.shape > 1);
    assert_true(girdle.shape < 1);
    assert_true(cluster.strength > loose.strength);
    /* the girdle's pole is the plane's normal, axis 3 */
    assert_true(angle_deg(girdle.axis[2], n) < 3 || angle_deg(girdle.axis[2], n) > 177);
}

/* Harrison & Hudson (2000), Engineering Rock Mechanics Part 2, Q7.10: hole
 * 136/55; fractures (dip direction/dip) 201/39, 213/50, 215/63, 230/52,
 * 247/42, 253/28; published |cos delta| 0.484, 0.428, 0.274, 0.536, 0.746,
 * 0.846 and Terzaghi weights 2.066, 2.338, 3.645, 1.866, 1.340, 1.183. */
static void test_terzaghi_harrison_hudson_q7_10(void **state)
{
    (void)state;
    static const double planes[6][2] = {{201, 39}, {213, 50}, {215, 63},
                                        {230, 52}, {247, 42}, {253, 28}};
    static const double cosd[6] = {0.484, 0.428, 0.274, 0.536, 0.746, 0.846};
    static const double weight[6] = {2.066, 2.338, 3.645, 1.866, 1.340, 1.183};
    corax_vec3 hole = line(136, 55);
    for (int i = 0; i < 6; i++) {
        corax_vec3 n = corax_plane_normal(
            (corax_plane){corax_rad(planes[i][1]), corax_rad(planes[i][0])});
        double w = corax_terzaghi_weight(n, hole, corax_rad(15));
        assert_close(1 / w, cosd[i], 0, 5e-4, "|cos delta| (Harrison & Hudson 2000, Q7.10)");
        assert_close(w, weight[i], 0, 5e-4, "Terzaghi weight (Harrison & Hudson 2000, Q7.10)");
        /* the sense of the hole and of the normal does not matter */
        corax_vec3 up = {-hole.x, -hole.y, -hole.z};
        assert_close(corax_terzaghi_weight(n, up, corax_rad(15)), w, 1e-15, 0, "either sense");
    }
}

/* Common practice (from memory): the weight is capped at a minimum angle
 * between hole and plane; a plane across the hole weighs 1. */
static void test_terzaghi_cap(void **state)
{
    (void)state;
    corax_vec3 hole = line(0, 90);
    corax_vec3 vertical_plane = corax_plane_normal((corax_plane){corax_rad(90), 0});
    corax_vec3 flat = corax_plane_normal((corax_plane){0, 0});
    assert_close(corax_terzaghi_weight(vertical_plane, hole, corax_rad(15)),
                 1 / sin(corax_rad(15)), 1e-12, 0, "a plane along the hole: the capped weight");
    assert_close(corax_terzaghi_weight(flat, hole, corax_rad(15)), 1, 1e-15, 0,
                 "a plane across the hole weighs 1");
    corax_vec3 steep = corax_plane_normal((corax_plane){corax_rad(80), 0}); /* 10 deg to hole */
    assert_close(corax_terzaghi_weight(steep, hole, corax_rad(15)), 1 / sin(corax_rad(15)),
                 1e-12, 0, "within the cap angle");
    assert_close(corax_terzaghi_weight(steep, hole, corax_rad(5)), 1 / sin(corax_rad(10)), 1e-12,
                 0, "outside a smaller cap");
}

/* Kamb (1959): with A = 9/(n + 9) the expected count n A of uniform readings
 * is exactly 3 binomial sigmas, sqrt(n A (1 - A)); derived here for several n.
 * The smooth kernel's k = 2 (1 + n/9) (Vollmer 1995) does the same up to
 * terms in e^-k. */
static void test_kamb_three_sigma(void **state)
{
    (void)state;
    static const size_t ns[] = {10, 100, 12345, 1};
    for (size_t i = 0; i < 4; i++) {
        corax_density d;
        assert_int_equal(corax_density_init(&d, CORAX_DENSITY_KAMB, ns[i]), CORAX_OK);
        assert_close(d.area, 9.0 / (double)(ns[i] + 9), 1e-15, 0, "A = 9/(n + 9) (Kamb 1959)");
        assert_close(d.expected, 3 * d.sigma, 1e-12, 0, "E = 3 sigma (Kamb 1959, derived)");
        assert_int_equal(corax_density_init(&d, CORAX_DENSITY_SMOOTH, ns[i]), CORAX_OK);
        if (ns[i] == 1)
            continue; /* k = 2.2: no claim for a single reading */
        /* the terms in e^-k lower it a little for few readings (2.92 at n 10) */
        assert_close(d.expected / d.sigma, 3, ns[i] >= 100 ? 1e-3 : 0.03, 0,
                     "smooth kernel: E = 3 sigma (Vollmer 1995, derived)");
    }
    corax_density d;
    assert_int_equal(corax_density_init(&d, CORAX_DENSITY_KAMB, 0), CORAX_EARG);
}

/* Derived (Archimedes: z of a uniform direction is uniform): the axial cap
 * cos(theta) = 1 - A holds the fraction A of uniform readings. */
static void test_kamb_cap_area(void **state)
{
    (void)state;
    corax_density d;
    corax_density_init(&d, CORAX_DENSITY_KAMB, 91); /* A = 0.09 */
    uint64_t seed = 21;
    int in = 0, n = 400000;
    corax_vec3 u = line(33, 21);
    for (int i = 0; i < n; i++) {
        double z = 2 * test_uniform(&seed) - 1, phi = 2 * CORAX_PI * test_uniform(&seed);
        double h = sqrt(1 - z * z);
        corax_vec3 v = {h * cos(phi), h * sin(phi), z};
        in += fabs(v.x * u.x + v.y * u.y + v.z * u.z) >= d.cos_cap;
    }
    assert_close((double)in / n, 0.09, 0, 0.002, "share of the sphere in the Kamb caps (derived)");
}

static corax_vec3 *uniform_axes(size_t n, uint64_t *seed)
{
    corax_vec3 *v = malloc(n * sizeof *v);
    assert_non_null(v);
    for (size_t i = 0; i < n; i++) {
        double z = -test_uniform(seed), phi = 2 * CORAX_PI * test_uniform(seed);
        double h = sqrt(1 - z * z);
        v[i] = (corax_vec3){h * cos(phi), h * sin(phi), z};
    }
    return v;
}

/* The density of a large uniform sample, averaged over the net (equal-area
 * nodes inside the primitive stand for equal areas), equals the expected
 * count within a few percent, and spreads across the net by about sigma. */
static void test_density_uniform_sample(void **state)
{
    (void)state;
    enum { N = 4000, SIZE = 61 };
    uint64_t seed = 8;
    corax_vec3 *v = uniform_axes(N, &seed);
    double *grid = malloc(SIZE * SIZE * sizeof *grid);
    assert_non_null(grid);
    for (int m = 0; m < 2; m++) {
        corax_density d;
        assert_int_equal(corax_density_init(&d, (corax_density_method)m, N), CORAX_OK);
        assert_int_equal(corax_density_grid(&d, v, NULL, SIZE, grid), CORAX_OK);
        double h = 2 * sqrt(2) / (SIZE - 1), sum = 0, sum2 = 0;
        int count = 0;
        for (int j = 0; j < SIZE; j++)
            for (int i = 0; i < SIZE; i++) {
                double x = -sqrt(2) + i * h, y = -sqrt(2) + j * h;
                if (hypot(x, y) > 1)
                    continue;
                sum += grid[j * SIZE + i];
                sum2 += grid[j * SIZE + i] * grid[j * SIZE + i];
                count++;
            }
        double mean = sum / count, sd = sqrt(sum2 / count - mean * mean);
        assert_close(mean, d.expected, 0.03, 0,
                     m ? "mean smoothed density of a uniform sample is E (Vollmer 1995)"
                       : "mean Kamb count of a uniform sample is E (Kamb 1959)");
        assert_close(sd, d.sigma, 0.2, 0,
                     m ? "spread of the smoothed density is about sigma (Vollmer 1995)"
                       : "spread of the Kamb count is about sigma (Kamb 1959)");
    }
    free(grid);
    free(v);
}

/* A tight cluster about 120/40 peaks at its centre, by either method, and
 * the opposite (upward) ends of the same axes give the same grid. */
static void test_density_cluster_peaks_at_centre(void **state)
{
    (void)state;
    enum { N = 300, SIZE = 81 };
    uint64_t seed = 13;
    corax_vec3 centre = line(120, 40), v[N], flipped[N];
    for (int i = 0; i < N; i++) {
        v[i] = corax_fisher_draw(centre, 60, test_uniform(&seed), test_uniform(&seed));
        flipped[i] = (corax_vec3){-v[i].x, -v[i].y, -v[i].z};
    }
    double *grid = malloc(SIZE * SIZE * sizeof *grid), *grid2 = malloc(SIZE * SIZE * sizeof *grid);
    assert_non_null(grid);
    assert_non_null(grid2);
    for (int m = 0; m < 2; m++) {
        corax_density d;
        corax_density_init(&d, (corax_density_method)m, N);
        corax_density_grid(&d, v, NULL, SIZE, grid);
        corax_density_grid(&d, flipped, NULL, SIZE, grid2);
        size_t best = 0;
        for (size_t k = 0; k < SIZE * SIZE; k++) {
            assert_close(grid2[k], grid[k], 1e-12, 1e-12, "axial: either end counts the same");
            if (grid[k] > grid[best])
                best = k;
        }
        double h = 2 * sqrt(2) / (SIZE - 1);
        corax_vec3 at;
        corax_unproject(CORAX_EQUAL_AREA, -sqrt(2) + (double)(best % SIZE) * h,
                        -sqrt(2) + (double)(best / SIZE) * h, &at);
        double off = angle_deg(at, centre);
        if (off > 90)
            off = 180 - off;
        assert_true(off < 4);
        assert_true(grid[best] / d.sigma > 10); /* far above a uniform 3 sigma */
        assert_close(corax_density_at(&d, centre, v, NULL) / grid[best], 1, 0.1, 0,
                     "density at the centre is the peak");
    }
    free(grid);
    free(grid2);
}

/* The density grid as it was first written, kept as the reference
 * (docs/check-values.md): every reading against every node (Kamb 1959
 * counting; Vollmer 1995 smoothing with terms below e^-40 dropped), weights
 * rescaled to sum to n. */
static double reference_count(const corax_density *d, corax_vec3 u, const corax_vec3 *v,
                              const double *w, double scale)
{
    double sum = 0.0;
    for (size_t i = 0; i < d->n; i++) {
        double c = fabs(u.x * v[i].x + u.y * v[i].y + u.z * v[i].z);
        double wi = w ? w[i] * scale : 1.0;
        if (d->method == CORAX_DENSITY_SMOOTH) {
            double e = d->k * (c - 1.0);
            if (e > -40.0)
                sum += wi * exp(e);
        } else if (c >= d->cos_cap) {
            sum += wi;
        }
    }
    return sum;
}

static void reference_grid(const corax_density *d, const corax_vec3 *v, const double *w,
                           size_t size, double *values)
{
    double scale = 1.0;
    if (w) {
        double sum = 0.0;
        for (size_t i = 0; i < d->n; i++)
            sum += w[i];
        scale = (double)d->n / sum;
    }
    double edge = sqrt(2.0), h = 2.0 * edge / (double)(size - 1);
    double up = reference_count(d, (corax_vec3){0, 0, 1}, v, w, scale);
    for (size_t j = 0; j < size; j++)
        for (size_t i = 0; i < size; i++) {
            corax_vec3 u;
            if (corax_unproject(CORAX_EQUAL_AREA, -edge + (double)i * h, -edge + (double)j * h,
                                &u) != CORAX_OK)
                values[j * size + i] = up;
            else
                values[j * size + i] = reference_count(d, u, v, w, scale);
        }
}

/* A random set of axes of one of five shapes: uniform, a tight cluster, a
 * girdle hugging the horizon (so caps cross it), a cluster about the
 * vertical, and one holding exactly horizontal and vertical axes of both
 * senses (and, in the test, a reading that is not a number). */
static void random_axes(corax_vec3 *v, size_t n, int shape, uint64_t *seed)
{
    corax_vec3 centre = line(360 * test_uniform(seed), 90 * test_uniform(seed));
    for (size_t i = 0; i < n; i++) {
        double z, phi = 2 * CORAX_PI * test_uniform(seed);
        switch (shape) {
        case 0: z = 2 * test_uniform(seed) - 1; break;
        case 1:
            v[i] = corax_fisher_draw(centre, 300, test_uniform(seed), test_uniform(seed));
            continue;
        case 2: z = 0.04 * (test_uniform(seed) - 0.5); break;
        case 3:
            v[i] = corax_fisher_draw((corax_vec3){0, 0, -1}, 100, test_uniform(seed),
                                     test_uniform(seed));
            continue;
        default: z = i % 3 == 0 ? 0.0 : i % 3 == 1 ? (i % 2 ? 1.0 : -1.0) : 2 * test_uniform(seed) - 1;
        }
        double h = sqrt(1 - z * z), sign = test_uniform(seed) < 0.5 ? -1 : 1;
        v[i] = (corax_vec3){sign * h * cos(phi), sign * h * sin(phi), sign * z};
    }
}

/* Property: the binned grid equals the reference double loop on random sets of
 * every shape and size, both methods, with and without weights: exactly for
 * unweighted Kamb counts (whole numbers), to 1e-9 relative otherwise (the same
 * terms summed in another order). */
static void test_density_grid_matches_reference(void **state)
{
    (void)state;
    static const size_t ns[] = {3, 10, 57, 400, 5000, 30000};
    static const size_t sizes[] = {3, 41, 61};
    uint64_t seed = 77;
    for (size_t a = 0; a < sizeof ns / sizeof ns[0]; a++)
        for (int shape = 0; shape < 5; shape++) {
            size_t n = ns[a], size = sizes[(a + (size_t)shape) % 3];
            corax_vec3 *v = malloc(n * sizeof *v);
            double *w = malloc(n * sizeof *w), *got = malloc(size * size * sizeof *got),
                   *want = malloc(size * size * sizeof *want);
            assert_true(v && w && got && want);
            random_axes(v, n, shape, &seed);
            if (shape == 4 && n > 5) /* a reading that is not a number counts nowhere */
                v[n / 2] = (corax_vec3){NAN, NAN, NAN};
            for (size_t i = 0; i < n; i++)
                w[i] = 0.2 + 5 * test_uniform(&seed);
            for (int m = 0; m < 4; m++) {
                corax_density d;
                const double *wt = m & 2 ? w : NULL;
                assert_int_equal(corax_density_init(&d, (corax_density_method)(m & 1), n),
                                 CORAX_OK);
                assert_int_equal(corax_density_grid(&d, v, wt, size, got), CORAX_OK);
                reference_grid(&d, v, wt, size, want);
                for (size_t k = 0; k < size * size; k++) {
                    if (m == 0 && got[k] != want[k])
                        fail_msg("n %zu shape %d node %zu: Kamb count %.17g, reference %.17g",
                                 n, shape, k, got[k], want[k]);
                    assert_close(got[k], want[k], 1e-9, 1e-9 * (double)n,
                                 "binned density equals the double loop");
                }
            }
            free(v);
            free(w);
            free(got);
            free(want);
        }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_fisher_ten_directions_tauxe),
        cmocka_unit_test(test_axial_summary_takes_sign_from_tensor),
        cmocka_unit_test(test_axial_summary_in_passes_is_exact),
        cmocka_unit_test(test_fisher_two_vectors_scipy),
        cmocka_unit_test(test_fisher_zero_weight_removes_pull),
        cmocka_unit_test(test_wood_sampler_check_values),
        cmocka_unit_test(test_fisher_cone_covers_95_percent),
        cmocka_unit_test(test_tensor_known_eigenvalues),
        cmocka_unit_test(test_woodcock_cluster_and_girdle),
        cmocka_unit_test(test_terzaghi_harrison_hudson_q7_10),
        cmocka_unit_test(test_terzaghi_cap),
        cmocka_unit_test(test_kamb_three_sigma),
        cmocka_unit_test(test_kamb_cap_area),
        cmocka_unit_test(test_density_uniform_sample),
        cmocka_unit_test(test_density_cluster_peaks_at_centre),
        cmocka_unit_test(test_density_grid_matches_reference),
    };
    return cmocka_run_group_tests_name("stats", tests, NULL, NULL);
}
