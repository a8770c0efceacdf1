/*
 * test_region.c - the landing region (include/plumb/region.h) on points
 * whose distribution is known in closed form.
 *
 * Sources:
 *  - Bivariate normal points, drawn with GSL (gsl_ran_bivariate_gaussian);
 *    the highest-density region holding p of a bivariate normal is the
 *    ellipse (x - m)' S^-1 (x - m) <= -2 ln(1 - p), of area
 *    -2 ln(1 - p) pi sqrt(det S) (Johnson & Wichern, Applied Multivariate
 *    Statistical Analysis, 6th ed., result 4.7).
 *  - Coverage: the region holds at least p with probability >= level over
 *    the calibration points (split conformal, Lei, Robins & Wasserman, JASA
 *    2013; order-statistic bound, David & Nagaraja, Order Statistics, sec.
 *    7.1): checked with fresh points from the same distribution, counted
 *    by the even-odd crossing rule (point in polygon, J. O'Rourke,
 *    Computational Geometry in C, 2nd ed., sec. 7.4).
 *  - Ring orientation and area by the shoelace formula (O'Rourke, sec. 1.3).
 *  - The buffer holds every point within the buffer distance of the region
 *    (the Minkowski sum with a disc): the region's vertices moved out by
 *    the distance in 16 directions lie inside the buffered polygon.
 *  - The main axis: a bivariate normal whose major axis (sd a) is turned to
 *    bearing beta has that axis as its covariance's major eigenvector
 *    (closed form: S = R diag(a^2, b^2) R'); the sample estimate's angle
 *    has asymptotic sd sqrt(l1 l2) / ((l1 - l2) sqrt(n)) rad (T. W.
 *    Anderson, Ann. Math. Statist. 34 (1963) 122-148; from memory). The
 *    major axis of a 2 x 2 covariance lies at atan2(2 S_en, S_ee - S_nn) / 2
 *    from east (eigenvectors of a symmetric 2 x 2 matrix, closed form).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>

#include "plumb/plumb.h"
#include "plumb/dispersion.h"
#include "plumb/region.h"
#include "plumb_test.h"

static int in_ring(const plumb_region_polygon *pg, size_t r, double x, double y)
{
    int in = 0;
    const double (*v)[2] = pg->vertex_m + pg->ring_first[r];
    size_t n = pg->ring_count[r];
    for (size_t i = 0, j = n - 1; i < n; j = i++)
        if ((v[i][1] > y) != (v[j][1] > y) &&
            x < (v[j][0] - v[i][0]) * (y - v[i][1]) / (v[j][1] - v[i][1]) + v[i][0])
            in = !in;
    return in;
}

static int in_polygon(const plumb_region_polygon *pg, double x, double y)
{
    for (size_t r = 0; r < pg->n_rings; r++)
        if (in_ring(pg, r, x, y))
            return 1;
    return 0;
}

static double shoelace(const plumb_region_polygon *pg, size_t r)
{
    const double (*v)[2] = pg->vertex_m + pg->ring_first[r];
    double a = 0.0;
    for (size_t i = 0; i + 1 < pg->ring_count[r]; i++)
        a += v[i][0] * v[i + 1][1] - v[i + 1][0] * v[i][1];
    return 0.5 * a;
}

/* Closed, counter-clockwise rings whose shoelace areas add to area_m2. */
static void check_rings(const plumb_region_polygon *pg)
{
    assert_true(pg->n_rings >= 1);
    double total = 0.0;
    for (size_t r = 0; r < pg->n_rings; r++) {
        size_t f = pg->ring_first[r], n = pg->ring_count[r];
        assert_true(n >= 5); /* a cell: 4 corners and the closing one */
        assert_true(pg->vertex_m[f][0] == pg->vertex_m[f + n - 1][0]);
        assert_true(pg->vertex_m[f][1] == pg->vertex_m[f + n - 1][1]);
        double a = shoelace(pg, r);
        assert_true(a > 0.0); /* counter-clockwise */
        total += a;
    }
    assert_true(fabs(total - pg->area_m2) <= 1e-9 * pg->area_m2);
}

/* n points of a bivariate normal (sd sx, sy, correlation rho, mean mx, my)
 * into a region with m training points; the region at p, level 0.95. */
static void run_normal(unsigned long seed, size_t m, size_t n, double sx, double sy, double rho,
                       double mx, double my, double p, double buffer, plumb_region_result *out)
{
    plumb_region *reg = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_region_alloc(&reg, &d), PLUMB_OK);
    assert_int_equal(plumb_region_reset(reg, m, &d), PLUMB_OK);
    gsl_rng *g = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(g, seed);
    for (size_t i = 0; i < n; i++) {
        double x, y;
        gsl_ran_bivariate_gaussian(g, sx, sy, rho, &x, &y);
        plumb_region_add(reg, mx + x, my + y);
    }
    assert_int_equal(plumb_region_finish(reg, p, 0.95, buffer, out, &d), PLUMB_OK);
    gsl_rng_free(g);
    plumb_region_free(reg);
}

/* Fraction of fresh points of the same normal inside the polygon. */
static double coverage(const plumb_region_polygon *pg, unsigned long seed, size_t n, double sx,
                       double sy, double rho, double mx, double my)
{
    gsl_rng *g = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(g, seed);
    size_t in = 0;
    for (size_t i = 0; i < n; i++) {
        double x, y;
        gsl_ran_bivariate_gaussian(g, sx, sy, rho, &x, &y);
        in += (size_t)in_polygon(pg, mx + x, my + y);
    }
    gsl_rng_free(g);
    return (double)in / (double)n;
}

static void region_of_a_tilted_normal_holds_p_and_is_near_the_ellipse(void **state)
{
    (void)state;
    static plumb_region_result r;
    double sx = 6.0, sy = 2.0, rho = 0.6, p = 0.9;
    run_normal(11, 1024, 40000, sx, sy, rho, 120.0, -35.0, p, 0.0, &r);
    assert_false(r.open);
    check_rings(&r.polygon);
    assert_true(r.inside >= r.rank);
    /* coverage >= p (the bound at 95 %): 200000 fresh points, standard
     * error 0.0007 */
    double cov = coverage(&r.polygon, 99, 200000, sx, sy, rho, 120.0, -35.0);
    assert_true(cov >= p);
    /* and near the highest-density ellipse's area: within 10 % (grid and
     * the finite-sample bound only add area) */
    double ell = -2.0 * log1p(-p) * PLUMB_PI * sx * sy * sqrt(1.0 - rho * rho);
    assert_true(r.polygon.area_m2 >= 0.97 * ell);
    assert_true(r.polygon.area_m2 <= 1.10 * ell);
}

/* n points of a normal with sds a (major) and b, its major axis at bearing
 * beta_deg from north, centred on (mx, my), added to reg. */
static void add_turned_normal(plumb_region *reg, gsl_rng *g, size_t n, double a, double b,
                              double beta_deg, double mx, double my)
{
    double th = (90.0 - beta_deg) * PLUMB_PI / 180.0; /* from east toward north */
    for (size_t i = 0; i < n; i++) {
        double u = gsl_ran_gaussian(g, a), v = gsl_ran_gaussian(g, b);
        plumb_region_add(reg, mx + u * cos(th) - v * sin(th), my + u * sin(th) + v * cos(th));
    }
}

/* The bearing from north, [0, 180), of the major axis of covariance
 * (see, snn, sen): closed form. */
static double major_bearing(double see, double snn, double sen)
{
    double th = 0.5 * atan2(2.0 * sen, see - snn) * 180.0 / PLUMB_PI;
    return fmod(90.0 - th + 360.0, 180.0);
}

/* Smallest difference of two axis bearings (mod 180), deg. */
static double axis_diff(double x, double y)
{
    double d = fmod(fabs(x - y), 180.0);
    return d > 90.0 ? 180.0 - d : d;
}

static void main_axis_is_the_principal_axis_of_all_the_points(void **state)
{
    (void)state;
    static plumb_region_result r;
    plumb_region *reg = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_region_alloc(&reg, &d), PLUMB_OK);
    gsl_rng *g = gsl_rng_alloc(gsl_rng_mt19937);
    /* 40 000 points, sds 23.7 m and 6.1 m, major axis at 37.3 deg: the
     * estimate's sd is sqrt(l1 l2) / ((l1 - l2) sqrt(n)) = 0.079 deg
     * (Anderson 1963), so 0.4 deg is 5 sd */
    const double a = 23.7, b = 6.1, beta = 37.3;
    double sd_deg = a * b / ((a * a - b * b) * sqrt(40000.0)) * 180.0 / PLUMB_PI;
    assert_true(5.0 * sd_deg < 0.4);
    gsl_rng_set(g, 31);
    assert_int_equal(plumb_region_reset(reg, 1024, &d), PLUMB_OK);
    add_turned_normal(reg, g, 40000, a, b, beta, 412.6, -87.9);
    assert_int_equal(plumb_region_finish(reg, 0.9, 0.95, 0.0, &r, &d), PLUMB_OK);
    assert_false(r.open);
    assert_true(axis_diff(r.axis_deg, beta) <= 0.4);
    assert_true(r.axis_deg >= 0.0 && r.axis_deg < 180.0);

    /* the first 1 024 points (the training points that fix the grid) from
     * a cloud turned 90 deg the other way, then 38 976 from the one above:
     * the axis is the mixture's, S = (1024 S1 + 38976 S2) / 40000 (both
     * centred on the same point), not the training points' 127.3 deg */
    gsl_rng_set(g, 47);
    assert_int_equal(plumb_region_reset(reg, 1024, &d), PLUMB_OK);
    add_turned_normal(reg, g, 1024, a, b, beta + 90.0, 412.6, -87.9);
    add_turned_normal(reg, g, 38976, a, b, beta, 412.6, -87.9);
    /* (the grid those training points fix may leave the region open: the
     * axis is given all the same) */
    assert_int_equal(plumb_region_finish(reg, 0.9, 0.95, 0.0, &r, &d), PLUMB_OK);
    double w1 = 1024.0 / 40000.0, w2 = 1.0 - w1, see = 0.0, snn = 0.0, sen = 0.0;
    const double betas[2] = {beta + 90.0, beta}, ws[2] = {w1, w2};
    for (int k = 0; k < 2; k++) {
        double th = (90.0 - betas[k]) * PLUMB_PI / 180.0, c = cos(th), s = sin(th);
        /* R diag(a^2, b^2) R' */
        see += ws[k] * (a * a * c * c + b * b * s * s);
        snn += ws[k] * (a * a * s * s + b * b * c * c);
        sen += ws[k] * (a * a - b * b) * c * s;
    }
    double want = major_bearing(see, snn, sen);
    assert_true(axis_diff(want, beta) < 1e-9); /* turned the same way: the mix's axis is beta */
    assert_true(axis_diff(r.axis_deg, want) <= 0.4);
    assert_true(axis_diff(r.axis_deg, beta + 90.0) > 80.0);
    gsl_rng_free(g);
    plumb_region_free(reg);
}

static void coverage_fails_no_more_often_than_the_level_allows(void **state)
{
    (void)state;
    /* 40 independent regions of 1200 points (300 training), p = 0.9 at
     * 95 %: each falls short of p with probability <= 0.05, so more than 6
     * short of 40 has probability < 0.014 (binomial(40, 0.05) tail). */
    static plumb_region_result r;
    int short_of_p = 0;
    for (unsigned long s = 1; s <= 40; s++) {
        run_normal(1000 + s, 300, 1200, 3.0, 3.0, 0.0, 0.0, 0.0, 0.9, 0.0, &r);
        assert_false(r.open);
        check_rings(&r.polygon);
        if (coverage(&r.polygon, 5000 + s, 20000, 3.0, 3.0, 0.0, 0.0, 0.0) < 0.9)
            short_of_p++;
    }
    assert_true(short_of_p <= 6);
}

static void buffer_holds_every_point_within_the_distance(void **state)
{
    (void)state;
    static plumb_region_result r;
    double s = 2.5;
    run_normal(7, 1024, 8000, 4.0, 1.5, -0.3, 10.0, 20.0, 0.99, s, &r);
    assert_false(r.open);
    check_rings(&r.polygon);
    check_rings(&r.buffered);
    assert_true(r.buffered.area_m2 > r.polygon.area_m2);
    for (size_t i = 0; i < r.polygon.n_vertices; i++)
        for (int k = 0; k < 16; k++) {
            double a = 2.0 * PLUMB_PI * k / 16.0;
            double x = r.polygon.vertex_m[i][0] + 0.999 * s * cos(a);
            double y = r.polygon.vertex_m[i][1] + 0.999 * s * sin(a);
            assert_true(in_polygon(&r.buffered, x, y));
        }
    /* and inside the polygon's bounding box grown by the buffer and one
     * cell diagonal (a buffer cell is at most that much wider than the
     * exact buffer; here the buffer grid has the density grid's cells) */
    double lo[2] = {HUGE_VAL, HUGE_VAL}, hi[2] = {-HUGE_VAL, -HUGE_VAL};
    for (size_t i = 0; i < r.polygon.n_vertices; i++)
        for (int k = 0; k < 2; k++) {
            lo[k] = fmin(lo[k], r.polygon.vertex_m[i][k]);
            hi[k] = fmax(hi[k], r.polygon.vertex_m[i][k]);
        }
    double grow = s + hypot(r.cell_m[0], r.cell_m[1]);
    for (size_t i = 0; i < r.buffered.n_vertices; i++)
        for (int k = 0; k < 2; k++) {
            assert_true(r.buffered.vertex_m[i][k] >= lo[k] - grow);
            assert_true(r.buffered.vertex_m[i][k] <= hi[k] + grow);
        }
}

static void too_few_points_leave_the_region_open(void **state)
{
    (void)state;
    static plumb_region_result r;
    /* the upper end of the two-sided 95 % interval of the 99 % quantile
     * needs n counted points with 0.99^n <= 0.025: n >= 368 (0.99^367 =
     * 0.02501, 0.99^368 = 0.02476) */
    run_normal(3, 100, 467, 1.0, 1.0, 0.0, 0.0, 0.0, 0.99, 0.0, &r);
    assert_true(r.open);
    assert_int_equal(r.polygon.n_rings, 0);
    run_normal(3, 100, 468, 1.0, 1.0, 0.0, 0.0, 0.0, 0.99, 0.0, &r);
    assert_false(r.open);
    assert_int_equal(r.rank, 368);
}

static void a_point_cloud_that_is_a_line_still_gives_a_polygon(void **state)
{
    (void)state;
    static plumb_region_result r;
    /* all points on the line north = 2 east: correlation 1 */
    run_normal(5, 256, 2000, 3.0, 6.0, 1.0, 0.0, 0.0, 0.9, 0.0, &r);
    assert_false(r.open);
    check_rings(&r.polygon);
    assert_true(r.polygon.area_m2 > 0.0);
}

static void bad_arguments_are_refused(void **state)
{
    (void)state;
    plumb_region *reg = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_region_alloc(&reg, &d), PLUMB_OK);
    assert_int_equal(plumb_region_reset(reg, 0, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_region_reset(reg, PLUMB_REGION_MAX_TRAINING + 1, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_region_reset(reg, 10, &d), PLUMB_OK);
    static plumb_region_result r;
    assert_int_equal(plumb_region_finish(reg, 1.0, 0.95, 0.0, &r, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_region_finish(reg, 0.9, 0.95, -1.0, &r, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_region_finish(reg, 0.9, 0.95, 0.0, &r, &d), PLUMB_OK);
    assert_true(r.open); /* no points yet */
    plumb_region_free(reg);
    plumb_region_free(NULL);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(region_of_a_tilted_normal_holds_p_and_is_near_the_ellipse),
        cmocka_unit_test(main_axis_is_the_principal_axis_of_all_the_points),
        cmocka_unit_test(coverage_fails_no_more_often_than_the_level_allows),
        cmocka_unit_test(buffer_holds_every_point_within_the_distance),
        cmocka_unit_test(too_few_points_leave_the_region_open),
        cmocka_unit_test(a_point_cloud_that_is_a_line_still_gives_a_polygon),
        cmocka_unit_test(bad_arguments_are_refused),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
