/*
 * test_wind.c - wind direction convention and speed profiles against their
 * closed forms (plumb/wind.h; README.md "The model").
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <cmocka.h>

#include "plumb/wind.h"
#include "physics/physics.h"
#include "plumb_test.h"

static plumb_wind_spec spec_of(plumb_wind_profile profile, double speed, double from)
{
    plumb_wind_spec w;
    plumb_wind_spec_init(&w);
    w.profile = profile;
    w.speed_m_s = speed;
    w.from_deg = from;
    return w;
}

/* Speed of the wind at z (hypot of the components). */
static double speed_at(const plumb_wind_spec *w, double z)
{
    double e, n;
    plumb_wind_at(w, z, &e, &n);
    return hypot(e, n);
}

/* Meteorological convention (WMO-No. 8): a wind from 270 deg is a west
 * wind, blowing toward the east. */
static void test_wind_from_270_deg_blows_toward_east(void **state)
{
    (void)state;
    double e, n;
    plumb_wind_components(7.35, 270.0, &e, &n);
    assert_abs(e, 7.35, 0.0);
    assert_abs(n, 0.0, 0.0);
}

/* A wind from 0 deg (north wind) blows toward the south, -north. */
static void test_wind_from_0_deg_blows_toward_south(void **state)
{
    (void)state;
    double e, n;
    plumb_wind_components(7.35, 0.0, &e, &n);
    assert_abs(e, 0.0, 0.0);
    assert_abs(n, -7.35, 0.0);
    plumb_wind_components(7.35, 360.0, &e, &n); /* the same direction */
    assert_abs(e, 0.0, 0.0);
    assert_abs(n, -7.35, 0.0);
}

/* w = -s (sin from, cos from) (wind.h): from 90 toward west, from 180 toward
 * north, from 225 (south-west) toward the north-east at s / sqrt 2 each. */
static void test_wind_components_follow_minus_sin_and_cos_of_from(void **state)
{
    (void)state;
    double e, n;
    plumb_wind_components(4.27, 90.0, &e, &n);
    assert_abs(e, -4.27, 0.0);
    assert_abs(n, 0.0, 0.0);
    plumb_wind_components(4.27, 180.0, &e, &n);
    assert_abs(e, 0.0, 0.0);
    assert_abs(n, 4.27, 0.0);
    plumb_wind_components(4.27, 225.0, &e, &n);
    assert_rel(e, 4.27 / sqrt(2.0), 1e-15);
    assert_rel(n, 4.27 / sqrt(2.0), 1e-15);
    plumb_wind_components(4.27, 123.4, &e, &n);
    const double rad = 123.4 * 3.14159265358979323846 / 180.0;
    assert_rel(e, -4.27 * sin(rad), 1e-14);
    assert_rel(n, -4.27 * cos(rad), 1e-14);
    plumb_wind_components(4.27, -236.6, &e, &n); /* -236.6 = 123.4 - 360 */
    assert_rel(e, -4.27 * sin(rad), 1e-14);
    assert_rel(n, -4.27 * cos(rad), 1e-14);
}

static void test_uniform_wind_is_the_reference_wind_at_every_height(void **state)
{
    (void)state;
    plumb_wind_spec w = spec_of(PLUMB_WIND_UNIFORM, 8.35, 237.5);
    double e0, n0, e, n;
    plumb_wind_components(8.35, 237.5, &e0, &n0);
    const double z[] = {0.013, 2.5, 10.0, 143.7};
    for (size_t i = 0; i < 4; i++) {
        plumb_wind_at(&w, z[i], &e, &n);
        assert_abs(e, e0, 0.0);
        assert_abs(n, n0, 0.0);
    }
}

/* Power law with alpha = 0: (z/z_ref)^0 = 1, the uniform wind. */
static void test_power_law_with_exponent_0_equals_uniform(void **state)
{
    (void)state;
    plumb_wind_spec p = spec_of(PLUMB_WIND_POWER, 6.15, 312.0);
    plumb_wind_spec u = spec_of(PLUMB_WIND_UNIFORM, 6.15, 312.0);
    p.exponent = 0.0;
    const double z[] = {0.013, 2.5, 10.0, 143.7};
    for (size_t i = 0; i < 4; i++) {
        double pe, pn, ue, un;
        plumb_wind_at(&p, z[i], &pe, &pn);
        plumb_wind_at(&u, z[i], &ue, &un);
        assert_abs(pe, ue, 0.0);
        assert_abs(pn, un, 0.0);
    }
}

/* Power law s = s_ref (z / z_ref)^alpha (wind.h): s_ref at z_ref, s_ref 2^alpha
 * at 2 z_ref; default alpha 1/7 (common practice, no source). */
static void test_power_law_gives_reference_speed_at_z_ref_and_2_alpha_at_twice(void **state)
{
    (void)state;
    plumb_wind_spec w = spec_of(PLUMB_WIND_POWER, 6.15, 312.0);
    assert_rel(w.exponent, 1.0 / 7.0, 1e-15);
    w.ref_height_m = 12.5;
    w.exponent = 0.16; /* Hellmann exponent, neutral air, flat open coast
                          (transcribed; the table's publication not recorded) */
    assert_rel(speed_at(&w, 12.5), 6.15, 1e-15);
    assert_rel(speed_at(&w, 25.0), 6.15 * pow(2.0, 0.16), 1e-15);
    assert_rel(speed_at(&w, 3.7), 6.15 * pow(3.7 / 12.5, 0.16), 1e-15);
    double e, n, e0, n0;
    plumb_wind_at(&w, 25.0, &e, &n);
    plumb_wind_components(1.0, 312.0, &e0, &n0);
    assert_rel(atan2(e, n), atan2(e0, n0), 1e-15); /* direction kept */
}

/* Log law s = s_ref ln(z/z0) / ln(z_ref/z0) (wind.h): s_ref at z_ref; 0 at
 * and below z0 and at and below z = 0. z0 = 0.25 m: Davenport-Wieringa
 * "rough" (transcribed; the classification of J. Wieringa, "Updating the
 * Davenport roughness classification", J. Wind Eng. Ind. Aerodyn. 41
 * (1992), citation from memory). */
static void test_log_law_gives_reference_speed_at_z_ref_and_calm_at_z0(void **state)
{
    (void)state;
    plumb_wind_spec w = spec_of(PLUMB_WIND_LOG, 9.45, 205.0);
    assert_rel(w.roughness_m, 0.03, 1e-15); /* default: "open" */
    w.roughness_m = 0.25;
    assert_rel(speed_at(&w, 10.0), 9.45, 1e-15);
    assert_rel(speed_at(&w, 37.2), 9.45 * log(37.2 / 0.25) / log(10.0 / 0.25), 1e-15);
    assert_abs(speed_at(&w, 0.25), 0.0, 0.0);
    assert_abs(speed_at(&w, 0.11), 0.0, 0.0);
    assert_abs(speed_at(&w, 0.0), 0.0, 0.0);
    assert_abs(speed_at(&w, -1.3), 0.0, 0.0);
    assert_true(speed_at(&w, 0.26) > 0.0);
}

/* The fall's right-hand side takes ln(z_ref/z0) once per fall
 * (plumbp_wind_log_span, physics.h): with it the speed is the log law's
 * closed form (wind.h; z0 = 0.25 m as above) and, by its contract,
 * plumb_wind_speed_at's figure bit for bit, calm at and below z0; other
 * profiles ignore the span. */
static void test_log_law_with_its_span_taken_once_is_the_same_speed(void **state)
{
    (void)state;
    plumb_wind_spec w = spec_of(PLUMB_WIND_LOG, 6.83, 118.0);
    w.roughness_m = 0.25;
    w.ref_height_m = 12.7;
    double span = plumbp_wind_log_span(&w);
    assert_rel(span, log(12.7 / 0.25), 1e-15);
    const double z[] = {0.2500001, 0.73, 3.96, 12.7, 41.5, 388.2};
    for (size_t k = 0; k < sizeof z / sizeof z[0]; k++) {
        double s = plumbp_wind_speed_span(&w, z[k], span);
        assert_rel(s, 6.83 * log(z[k] / 0.25) / log(12.7 / 0.25), 1e-14);
        assert_true(s == plumb_wind_speed_at(&w, z[k]));
    }
    assert_abs(plumbp_wind_speed_span(&w, 0.25, span), 0.0, 0.0);
    assert_abs(plumbp_wind_speed_span(&w, 0.11, span), 0.0, 0.0);
    assert_abs(plumbp_wind_speed_span(&w, -1.3, span), 0.0, 0.0);
    assert_abs(plumbp_wind_speed_span(&w, NAN, span), 0.0, 0.0);
    plumb_wind_spec p = spec_of(PLUMB_WIND_POWER, 6.83, 118.0);
    assert_rel(plumbp_wind_speed_span(&p, 41.5, 0.0), 6.83 * pow(41.5 / 10.0, 1.0 / 7.0), 1e-15);
    plumb_wind_spec u = spec_of(PLUMB_WIND_UNIFORM, 6.83, 118.0);
    assert_abs(plumbp_wind_speed_span(&u, 41.5, 0.0), 6.83, 0.0);
}

/* Table: east and north components linear in height, held beyond the ends
 * (wind.h). */
static void test_table_wind_interpolates_components_linearly_in_height(void **state)
{
    (void)state;
    const double h[] = {5.0, 20.0, 60.0};
    const double east[] = {1.2, 3.9, 7.4};
    const double north[] = {-0.6, 0.8, -2.1};
    plumb_wind_spec w = spec_of(PLUMB_WIND_TABLE, 0.0, 0.0);
    w.table_n = 3;
    w.table_h_m = h;
    w.table_east_m_s = east;
    w.table_north_m_s = north;
    double e, n;
    plumb_wind_at(&w, 12.5, &e, &n);
    assert_rel(e, 1.2 + 0.5 * (3.9 - 1.2), 1e-15);
    assert_rel(n, -0.6 + 0.5 * (0.8 + 0.6), 1e-15);
    plumb_wind_at(&w, 47.3, &e, &n);
    assert_rel(e, 3.9 + (27.3 / 40.0) * (7.4 - 3.9), 1e-14);
    assert_rel(n, 0.8 + (27.3 / 40.0) * (-2.1 - 0.8), 1e-14);
    plumb_wind_at(&w, 20.0, &e, &n);
    assert_abs(e, 3.9, 0.0);
    assert_abs(n, 0.8, 0.0);
    plumb_wind_at(&w, 2.0, &e, &n); /* below the first row: held */
    assert_abs(e, 1.2, 0.0);
    assert_abs(n, -0.6, 0.0);
    plumb_wind_at(&w, 80.0, &e, &n); /* above the last row: held */
    assert_abs(e, 7.4, 0.0);
    assert_abs(n, -2.1, 0.0);
    w.table_n = 1; /* a single row is uniform above ground */
    plumb_wind_at(&w, 33.3, &e, &n);
    assert_abs(e, 1.2, 0.0);
    assert_abs(n, -0.6, 0.0);
}

/* README.md "The model": w = 0 at and below z = 0 for every profile. */
static void test_every_profile_is_calm_at_and_below_the_strike_level(void **state)
{
    (void)state;
    const double h[] = {0.0, 20.0}, east[] = {3.1, 5.2}, north[] = {1.1, -0.4};
    const plumb_wind_profile profiles[] = {PLUMB_WIND_UNIFORM, PLUMB_WIND_POWER,
                                           PLUMB_WIND_LOG, PLUMB_WIND_TABLE};
    for (size_t i = 0; i < 4; i++) {
        plumb_wind_spec w = spec_of(profiles[i], 11.7, 293.0);
        w.table_n = 2;
        w.table_h_m = h;
        w.table_east_m_s = east;
        w.table_north_m_s = north;
        const double z[] = {0.0, -0.0, -2.4, NAN};
        for (size_t k = 0; k < 4; k++) {
            double e = 99.0, n = 99.0;
            plumb_wind_at(&w, z[k], &e, &n);
            assert_abs(e, 0.0, 0.0);
            assert_abs(n, 0.0, 0.0);
        }
        assert_true(speed_at(&w, 0.5) > 0.0);
    }
}

/* wind.h: uniform calm, reference height 10 m, exponent 1/7, z0 0.03 m. */
static void test_default_wind_is_calm_with_documented_defaults(void **state)
{
    (void)state;
    plumb_wind_spec w;
    plumb_wind_spec_init(&w);
    assert_int_equal(w.profile, PLUMB_WIND_UNIFORM);
    assert_abs(w.speed_m_s, 0.0, 0.0);
    assert_abs(w.ref_height_m, 10.0, 0.0);
    assert_rel(w.exponent, 1.0 / 7.0, 1e-15);
    assert_abs(w.roughness_m, 0.03, 0.0);
    assert_int_equal(w.table_n, 0);
    assert_null(w.table_h_m);
    assert_abs(speed_at(&w, 25.0), 0.0, 0.0);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_wind_from_270_deg_blows_toward_east),
        cmocka_unit_test(test_wind_from_0_deg_blows_toward_south),
        cmocka_unit_test(test_wind_components_follow_minus_sin_and_cos_of_from),
        cmocka_unit_test(test_uniform_wind_is_the_reference_wind_at_every_height),
        cmocka_unit_test(test_power_law_with_exponent_0_equals_uniform),
        cmocka_unit_test(test_power_law_gives_reference_speed_at_z_ref_and_2_alpha_at_twice),
        cmocka_unit_test(test_log_law_gives_reference_speed_at_z_ref_and_calm_at_z0),
        cmocka_unit_test(test_log_law_with_its_span_taken_once_is_the_same_speed),
        cmocka_unit_test(test_table_wind_interpolates_components_linearly_in_height),
        cmocka_unit_test(test_every_profile_is_calm_at_and_below_the_strike_level),
        cmocka_unit_test(test_default_wind_is_calm_with_documented_defaults),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
