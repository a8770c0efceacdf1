/*
 * test_glide.c - plates that glide sideways (plumb/glide.h): the published
 * glide ratios (Smith 1970; Tinklenberg et al. 2023), plate I* test
 * vectors computed from the definition I* = rho_s h / (rho_f l) of
 * A. Andersen, U. Pesavento, Z. J. Wang, J. Fluid Mech. 541 (2005) 65-90
 * (the definition from memory; the vectors not published figures), and
 * the zone's glide displacement against the distribution it is drawn from.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/constants.h"
#include "plumb/glide.h"
#include "plumb/trajectory.h"
#include "plumb/dispersion.h"
#include "plumb_test.h"

/* Smith (1970): mean C_L 2.20 and C_D 1.60 give L/D 1.375, a glide path
 * 36.0 deg below horizontal; Tinklenberg et al.: drift below 20 deg from
 * the vertical, tan 20 deg = 0.364. */
static void test_glide_ratios_are_the_published_ones(void **state)
{
    (void)state;
    double t = plumb_glide_ratio_max(PLUMB_GLIDE_TUMBLE);
    assert_rel(t, 1.375, 1e-15);
    assert_abs(atan(1.0 / t) * 180.0 / PLUMB_PI, 36.03, 0.005);
    assert_rel(plumb_glide_ratio_max(PLUMB_GLIDE_FLUTTER), tan(20.0 * PLUMB_PI / 180.0), 1e-15);
    assert_abs(plumb_glide_ratio_max(PLUMB_GLIDE_OFF), 0.0, 0.0);
}

/* I* = rho_s h / (rho_f l) (Andersen et al. 2005; definition from memory),
 * computed for these plates (not published figures). */
static void test_plate_istar_matches_the_computed_vectors(void **state)
{
    (void)state;
    /* Al 2700 kg/m^3, 0.81 mm and 1.62 mm thick, 14 mm wide, in water */
    assert_abs(plumb_glide_istar(2700.0 * 0.00081 * 0.014 * 0.5, 0.5, 0.014, 1000.0), 0.156, 5e-4);
    assert_abs(plumb_glide_istar(2700.0 * 0.00162 * 0.014 * 0.5, 0.014, 0.5, 1000.0), 0.312, 5e-4);
    /* paper 800 kg/m^3, 0.1 mm, 5 cm wide, in air */
    assert_abs(plumb_glide_istar(800.0 * 0.0001 * 0.05 * 0.3, 0.05, 0.3, 1.225), 1.31, 0.005);
    /* steel 7850 kg/m^3, 1 mm, 20 cm wide, in air */
    assert_abs(plumb_glide_istar(7850.0 * 0.001 * 0.2 * 0.7, 0.7, 0.2, 1.225), 32.0, 0.05);
    /* Andersen et al.: the 0.16 plate fluttered, the 0.32 one tumbled */
    assert_int_equal(plumb_glide_regime(0.156), PLUMB_GLIDE_FLUTTER);
    assert_int_equal(plumb_glide_regime(0.312), PLUMB_GLIDE_TUMBLE);
}

static void test_glide_offset_is_ratio_times_height_along_the_azimuth(void **state)
{
    (void)state;
    double g[2];
    plumb_glide_offset(PLUMB_GLIDE_TUMBLE, 23.7, 1.0, 0.25, g); /* due east, the longest */
    assert_rel(g[0], 1.375 * 23.7, 1e-14);
    assert_abs(g[1], 0.0, 1e-12);
    plumb_glide_offset(PLUMB_GLIDE_FLUTTER, 23.7, 0.5, 0.5, g); /* due south, half */
    assert_abs(g[0], 0.0, 1e-12);
    assert_rel(g[1], -0.5 * PLUMB_GLIDE_FLUTTER_RATIO * 23.7, 1e-14);
    plumb_glide_offset(PLUMB_GLIDE_OFF, 23.7, 0.9, 0.1, g);
    assert_abs(hypot(g[0], g[1]), 0.0, 0.0);
}

/* A tumbling plate dropped from rest in still air lands at ratio x H from
 * the release point with the ratio uniform on [0, 1.375]: its radial
 * percentile p is p 1.375 H. Each percentile's interval must hold it, and
 * the mean point lies within 4 standard errors of the centre (the azimuth
 * is uniform: E[x^2] = (1.375 H)^2 / 6). */
static void test_zone_glide_radii_follow_the_uniform_glide_ratio(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.225);
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    s.mass_kg = 3.2;
    s.drag.model = PLUMB_DRAG_FIXED;
    s.drag.cd_area_m2 = 0.121;
    s.release_m[2] = 25.3;
    plumb_wind_spec_init(&s.wind);
    s.glide.mode = PLUMB_GLIDE_TUMBLE;
    plumb_uncertainty u;
    memset(&u, 0, sizeof u);
    snprintf(u.key, sizeof u.key, "payload.mass");
    u.kind = PLUMB_DIST_UNIFORM;
    u.param[0] = 3.0;
    u.param[1] = 3.4;
    plumb_zone_spec z;
    memset(&z, 0, sizeof z);
    z.samples = 3000;
    z.seed = 41;
    z.confidence = 0.9;
    plumb_zone_result r;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_OK);
    double R = 1.375 * 25.3;
    const double p[PLUMB_ZONE_RADII] = {0.5, 0.9, 0.99, 0.999};
    for (int k = 0; k < 3; k++) { /* 0.999 needs more samples to be bounded */
        assert_true(r.zone.radius[k].lo <= p[k] * R * (1.0 + 1e-3));
        assert_true(r.zone.radius[k].hi >= p[k] * R * (1.0 - 1e-3));
    }
    assert_true(r.zone.radius_max_m <= R * (1.0 + 1e-9));
    assert_true(r.zone.radius_max_m > 0.99 * R);
    double se = R / sqrt(6.0 * 3000.0);
    assert_abs(r.zone.mean_m[0], 0.0, 4.0 * se);
    assert_abs(r.zone.mean_m[1], 0.0, 4.0 * se);
    assert_rel(r.zone.glide_ratio_max, 1.375, 1e-15);
    /* the same with glide off: every sample lands under the release point */
    s.glide.mode = PLUMB_GLIDE_OFF;
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_OK);
    assert_abs(r.zone.radius_max_m, 0.0, 1e-9);
    assert_abs(r.zone.glide_ratio_max, 0.0, 0.0);
    plumb_atmosphere_free(atm);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_glide_ratios_are_the_published_ones),
        cmocka_unit_test(test_plate_istar_matches_the_computed_vectors),
        cmocka_unit_test(test_glide_offset_is_ratio_times_height_along_the_azimuth),
        cmocka_unit_test(test_zone_glide_radii_follow_the_uniform_glide_ratio),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
