/*
 * test_gravity.c - WGS 84 normal gravity (Somigliana, NIMA TR8350.2) and
 * standard gravity, against published values.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <cmocka.h>

#include "plumb/constants.h"
#include "plumb/gravity.h"
#include "physics/physics.h"
#include "plumb_test.h"

static double g_at(double lat_deg, double alt_m)
{
    plumb_gravity g = {1, lat_deg};
    return plumb_gravity_at(&g, alt_m);
}

/* NIMA TR8350.2 (3rd ed.): gamma_e = 9.7803253359 m/s^2 (transcribed). */
static void test_gravity_at_the_equator_is_wgs84_gamma_e(void **state)
{
    (void)state;
    assert_abs(g_at(0.0, 0.0), 9.7803253359, 1e-10);
}

/* NIMA TR8350.2 (3rd ed.): gamma_p = 9.8321849378 m/s^2 (transcribed). */
static void test_gravity_at_both_poles_is_wgs84_gamma_p(void **state)
{
    (void)state;
    assert_abs(g_at(90.0, 0.0), 9.8321849378, 1e-10);
    assert_abs(g_at(-90.0, 0.0), 9.8321849378, 1e-10);
}

/* No WGS 84 value at 45 deg was transcribed from NIMA TR8350.2. GRS 80
 * (H. Moritz, Geodetic Reference System 1980, Bull. Geodesique 54, 1980)
 * gives 9.806199203 m/s^2 at 45 deg (transcribed from several codes), and
 * its equator and pole values 9.7803267715 and 9.832186368 m/s^2
 * (transcribed) sit 1.4356e-6 and 1.4302e-6 m/s^2 above WGS 84's; at
 * 45 deg (sin^2 = 1/2) the gap is their mean to a few 1e-9 m/s^2 (the
 * printed digits). */
static void test_gravity_at_45_deg_sits_the_grs80_gap_below_grs80(void **state)
{
    (void)state;
    double gap_eq = 9.7803267715 - 9.7803253359, gap_pole = 9.832186368 - 9.8321849378;
    assert_abs(9.806199203 - g_at(45.0, 0.0), 0.5 * (gap_eq + gap_pole), 3e-9);
    assert_abs(g_at(-45.0, 0.0), g_at(45.0, 0.0), 0.0); /* symmetric in latitude */
}

/* Free-air gradient 3.086e-6 s^-2 (NIMA TR8350.2, transcribed). */
static void test_gravity_falls_by_the_free_air_gradient_with_altitude(void **state)
{
    (void)state;
    const double lat = 52.37, h = 2468.3;
    assert_rel(g_at(lat, 0.0) - g_at(lat, h), 3.086e-6 * h, 1e-9);
    assert_rel(g_at(lat, -398.7) - g_at(lat, 0.0), 3.086e-6 * 398.7, 1e-9);
}

/* Without a latitude: standard gravity 9.80665 m/s^2 (CGPM 1901; US Std Atm
 * 1976 Table 2), the same at every altitude (README.md "The model"). */
static void test_gravity_without_latitude_is_g0_at_every_altitude(void **state)
{
    (void)state;
    plumb_gravity g = {0, 52.37};
    assert_abs(plumb_gravity_at(&g, 0.0), 9.80665, 0.0);
    assert_abs(plumb_gravity_at(&g, 3456.7), 9.80665, 0.0);
    assert_abs(plumb_gravity_at(NULL, 123.4), 9.80665, 0.0);
}

/* The fall takes the altitude-free part once (plumbp_gravity_normal,
 * physics.h): at the equator it is gamma_e = 9.7803253359 m/s^2 (NIMA
 * TR8350.2, 3rd ed., transcribed), without a latitude g0 = 9.80665 m/s^2
 * (CGPM 1901); less the free-air gradient it is plumb_gravity_at's figure,
 * by its contract bit for bit. */
static void test_normal_gravity_taken_once_gives_the_same_gravity(void **state)
{
    (void)state;
    plumb_gravity eq = {1, 0.0}, at = {1, 55.1}, none = {0, 55.1};
    assert_abs(plumbp_gravity_normal(&eq), 9.7803253359, 1e-10);
    assert_abs(plumbp_gravity_normal(&none), 9.80665, 0.0);
    assert_abs(plumbp_gravity_normal(NULL), 9.80665, 0.0);
    double n = plumbp_gravity_normal(&at);
    const double alt[] = {-398.7, 0.0, 351.5, 2468.3};
    for (size_t k = 0; k < sizeof alt / sizeof alt[0]; k++) {
        double g = plumbp_gravity_from(&at, n, alt[k]);
        assert_rel(n - g, 3.086e-6 * alt[k], 1e-9);
        assert_true(g == plumb_gravity_at(&at, alt[k]));
        assert_abs(plumbp_gravity_from(&none, plumbp_gravity_normal(&none), alt[k]), 9.80665, 0.0);
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_gravity_at_the_equator_is_wgs84_gamma_e),
        cmocka_unit_test(test_gravity_at_both_poles_is_wgs84_gamma_p),
        cmocka_unit_test(test_gravity_at_45_deg_sits_the_grs80_gap_below_grs80),
        cmocka_unit_test(test_gravity_falls_by_the_free_air_gradient_with_altitude),
        cmocka_unit_test(test_gravity_without_latitude_is_g0_at_every_altitude),
        cmocka_unit_test(test_normal_gravity_taken_once_gives_the_same_gravity),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
