/*
 * test_geodesy.c - local east/north metres to WGS 84 latitude and
 * longitude (include/plumb/geodesy.h) against an independent solution of
 * the geodesic inverse problem.
 *
 * Sources:
 *  - T. Vincenty, "Direct and inverse solutions of geodesics on the
 *    ellipsoid with application of nested equations", Survey Review 23
 *    (176), 88-93, 1975: the inverse solution (equations 13-18 and the
 *    iteration on lambda), written here from the paper's equations, to
 *    0.1 mm; it is not plumb's method (plumb uses the mid-latitude
 *    formulas), so it checks them independently.
 *  - WGS 84 a = 6378137 m, f = 1/298.257223563 (NIMA TR8350.2, 2000).
 *  - Radii of curvature at the equator: M = a (1 - e^2) = 6335439.327 m,
 *    N = a; at the pole both a / sqrt(1 - e^2) = 6399593.626 m (NIMA
 *    TR8350.2, table 3.3, from memory).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb/constants.h"
#include "plumb/geodesy.h"
#include "plumb_test.h"

#define RAD (PLUMB_PI / 180.0)

/* Vincenty (1975) inverse: distance s and forward azimuth alpha1 (rad)
 * from (lat1, lon1) to (lat2, lon2), degrees. */
static void vincenty_inverse(double lat1, double lon1, double lat2, double lon2, double *s,
                             double *alpha1)
{
    const double a = PLUMB_WGS84_A, f = PLUMB_WGS84_F, b = a * (1.0 - f);
    double dl = fmod(lon2 - lon1 + 540.0, 360.0) - 180.0; /* across the antimeridian too */
    double L = dl * RAD;
    double U1 = atan((1.0 - f) * tan(lat1 * RAD)), U2 = atan((1.0 - f) * tan(lat2 * RAD));
    double sU1 = sin(U1), cU1 = cos(U1), sU2 = sin(U2), cU2 = cos(U2);
    double lambda = L, prev, ss = 0, cs = 0, sigma = 0, sa, c2a = 0, c2sm = 0;
    int it = 0;
    do {
        double sl = sin(lambda), cl = cos(lambda);
        ss = sqrt((cU2 * sl) * (cU2 * sl) + (cU1 * sU2 - sU1 * cU2 * cl) * (cU1 * sU2 - sU1 * cU2 * cl));
        cs = sU1 * sU2 + cU1 * cU2 * cl;
        sigma = atan2(ss, cs);
        sa = cU1 * cU2 * sl / ss;
        c2a = 1.0 - sa * sa;
        c2sm = c2a != 0.0 ? cs - 2.0 * sU1 * sU2 / c2a : 0.0;
        double C = f / 16.0 * c2a * (4.0 + f * (4.0 - 3.0 * c2a));
        prev = lambda;
        lambda = L + (1.0 - C) * f * sa *
                         (sigma + C * ss * (c2sm + C * cs * (-1.0 + 2.0 * c2sm * c2sm)));
    } while (fabs(lambda - prev) > 1e-13 && ++it < 200);
    double u2 = c2a * (a * a - b * b) / (b * b);
    double A = 1.0 + u2 / 16384.0 * (4096.0 + u2 * (-768.0 + u2 * (320.0 - 175.0 * u2)));
    double B = u2 / 1024.0 * (256.0 + u2 * (-128.0 + u2 * (74.0 - 47.0 * u2)));
    double ds = B * ss * (c2sm + B / 4.0 * (cs * (-1.0 + 2.0 * c2sm * c2sm) -
                                           B / 6.0 * c2sm * (-3.0 + 4.0 * ss * ss) *
                                               (-3.0 + 4.0 * c2sm * c2sm)));
    *s = b * A * (sigma - ds);
    double sl = sin(lambda), cl = cos(lambda);
    *alpha1 = atan2(cU2 * sl, cU1 * sU2 - sU1 * cU2 * cl);
}

/* Largest position error, m, of plumb's forward form for points at
 * distance s in 16 directions from sites at latitudes 0 .. 70 deg. */
static double worst_error(double s)
{
    double worst = 0.0;
    for (int la = 0; la <= 70; la += 10)
        for (int k = 0; k < 16; k++) {
            double lat0 = (double)la * (k % 2 ? -1.0 : 1.0) + 0.37, lon0 = 179.9 - 13.0 * k;
            double az = 2.0 * PLUMB_PI * (k + 0.25) / 16.0;
            double e = s * sin(az), n = s * cos(az), ll[2];
            plumb_diag d;
            plumb_diag_clear(&d);
            assert_int_equal(plumb_geodesy_forward(lat0, lon0, e, n, ll, &d), PLUMB_OK);
            double sv, av;
            vincenty_inverse(lat0, lon0, ll[0], ll[1], &sv, &av);
            double err = hypot(sv * sin(av) - e, sv * cos(av) - n);
            if (err > worst)
                worst = err;
            /* and back: the inverse undoes the forward form */
            double en[2];
            assert_int_equal(plumb_geodesy_inverse(lat0, lon0, ll[0], ll[1], en, &d), PLUMB_OK);
            assert_true(fabs(en[0] - e) < 1e-6 && fabs(en[1] - n) < 1e-6);
        }
    return worst;
}

static void within_a_tenth_of_a_millimetre_at_one_kilometre(void **state)
{
    (void)state;
    double w = worst_error(1000.0);
    print_message("worst error at 1 km: %.3g m\n", w);
    assert_true(w < 1e-4);
}

static void within_two_centimetres_at_ten_kilometres(void **state)
{
    (void)state;
    double w = worst_error(10000.0);
    print_message("worst error at 10 km: %.3g m\n", w);
    assert_true(w < 0.02);
}

static void radii_of_curvature_at_the_equator_and_pole(void **state)
{
    (void)state;
    double m, n;
    plumb_geodesy_radii(0.0, &m, &n);
    assert_true(fabs(m - 6335439.327) < 1e-3);
    assert_true(fabs(n - 6378137.0) < 1e-6);
    plumb_geodesy_radii(90.0, &m, &n);
    assert_true(fabs(m - 6399593.626) < 1e-3);
    assert_true(fabs(n - 6399593.626) < 1e-3);
}

static void across_the_antimeridian_longitude_wraps(void **state)
{
    (void)state;
    double ll[2], en[2];
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_geodesy_forward(-41.0, 179.999, 500.0, 0.0, ll, &d), PLUMB_OK);
    assert_true(ll[1] < -179.99 && ll[1] >= -180.0);
    assert_int_equal(plumb_geodesy_inverse(-41.0, 179.999, ll[0], ll[1], en, &d), PLUMB_OK);
    assert_true(fabs(en[0] - 500.0) < 1e-6);
}

static void bad_points_are_refused(void **state)
{
    (void)state;
    double ll[2];
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_geodesy_forward(89.95, 0.0, 10.0, 0.0, ll, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_geodesy_forward(10.0, 0.0, 10001.0, 0.0, ll, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_geodesy_forward(10.0, 0.0, NAN, 0.0, ll, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_geodesy_inverse(10.0, 0.0, 10.2, 0.0, ll, &d), PLUMB_EINVAL);
}

/* A far point is refused with its distance right: over the pole from
 * (80 N, 0) to (80 N, 180 E) is 20 degrees of arc, 2224 km on the sphere
 * of the mean radius 6371.0088 km (20 x pi/180 x R1; Moritz 1980); the
 * ellipsoid's meridian arc is within 0.5 % of it. The mid-latitude
 * formulas alone said 3488 km. And 5 degrees of a meridian from 45 N,
 * 556 km (WGS 84 meridian arc 45 to 50 deg: 555.9 km, from memory). */
static void far_points_get_their_distance(void **state)
{
    (void)state;
    double en[2];
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_geodesy_inverse(80.0, 0.0, 80.0, 180.0, en, &d), PLUMB_EINVAL);
    double km = 0.0;
    const char *p = strstr(d.message, "about ");
    assert_non_null(p);
    assert_int_equal(sscanf(p, "about %lf km", &km), 1);
    assert_true(fabs(km - 2224.0) <= 0.01 * 2224.0);
    assert_non_null(strstr(d.message, "beyond the 10000 m"));
    plumb_diag_clear(&d);
    assert_int_equal(plumb_geodesy_inverse(45.0, 7.0, 50.0, 7.0, en, &d), PLUMB_EINVAL);
    p = strstr(d.message, "about ");
    assert_non_null(p);
    assert_int_equal(sscanf(p, "about %lf km", &km), 1);
    assert_true(fabs(km - 556.0) <= 0.01 * 556.0);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(within_a_tenth_of_a_millimetre_at_one_kilometre),
        cmocka_unit_test(within_two_centimetres_at_ten_kilometres),
        cmocka_unit_test(radii_of_curvature_at_the_equator_and_pole),
        cmocka_unit_test(across_the_antimeridian_longitude_wraps),
        cmocka_unit_test(bad_points_are_refused),
        cmocka_unit_test(far_points_get_their_distance),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
