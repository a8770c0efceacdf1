/*
 * test_turbulence.c - low-altitude gusts (plumb/turbulence.h) against the
 * MIL-F-8785C / MIL-HDBK-1797 formulas (transcribed from library
 * documentation; see turbulence.h): parameter and spectrum test vectors
 * computed independently from those formulas (not published figures), the
 * spectra's normalisation by GSL quadrature, and the statistics of many
 * realisations against the models' closed-form correlations (Dryden:
 * exponential forms; von Karman: the Bessel K_1/3 form, via GSL) and the
 * truncated spectrum's cosine transform (GSL QAWO).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include <gsl/gsl_integration.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_sf_bessel.h>
#include <gsl/gsl_sf_gamma.h>

#include "plumb/constants.h"
#include "plumb/turbulence.h"
#include "plumb/trajectory.h"
#include "plumb/dispersion.h"
#include "physics/physics.h"
#include "plumb_test.h"

#define KN 0.514444444444444 /* m/s per knot */

/* L_u (m) and sigma_u / sigma_w by height, computed from the MIL-F-8785C
 * low-altitude forms (transcribed; not published figures). */
static void test_length_scales_and_intensities_match_the_mil_vectors(void **state)
{
    (void)state;
    static const struct { double h_ft, lu_m, ratio; } rows[] = {
        {10, 23.1, 1.9630}, {50, 94.7, 1.8386}, {100, 154.0, 1.7158},
        {200, 221.2, 1.5367}, {500, 287.9, 1.2362}, {1000, 304.8, 1.0000}};
    for (size_t i = 0; i < 6; i++) {
        double z = rows[i].h_ft * PLUMB_FT_M;
        assert_abs(plumb_turbulence_length(PLUMB_TURB_U, z), rows[i].lu_m, 0.06);
        assert_rel(plumb_turbulence_length(PLUMB_TURB_W, z), z, 1e-12);
        assert_abs(plumb_turbulence_sigma(PLUMB_TURB_U, 15.43, z) /
                       plumb_turbulence_sigma(PLUMB_TURB_W, 15.43, z), rows[i].ratio, 6e-5);
    }
    /* sigma_w = 0.1 W20; moderate is W20 = 30 kn */
    assert_rel(plumb_turbulence_sigma(PLUMB_TURB_W, PLUMB_TURB_W20_MODERATE_M_S, 30.0), 1.54333,
               5e-6); /* to the 6 digits printed */
    assert_rel(PLUMB_TURB_W20_LIGHT_M_S, 15.0 * KN, 1e-12);
    /* clamped below 10 ft and above 1000 ft */
    assert_rel(plumb_turbulence_length(PLUMB_TURB_U, 1.0), plumb_turbulence_length(PLUMB_TURB_U, 3.048), 1e-12);
    assert_rel(plumb_turbulence_length(PLUMB_TURB_W, 900.0), 304.8, 1e-12);
}

/* Dryden and von Karman spectra of MIL-F-8785C (transcribed), computed at
 * h 100 ft, W20 30 kn (not published figures; sigma_w
 * 1.54333, sigma_u 2.64812 m/s, L_w 30.48 m, L_u 153.9756 m). */
static void test_spectra_match_the_tabulated_values(void **state)
{
    (void)state;
    const double om[4] = {0.001, 0.01, 0.1, 1.0};
    const double du[4] = {671.479, 203.925, 2.8872, 0.0289926};
    const double dw[4] = {23.1306, 24.7396, 6.30069, 0.0744897};
    const double ku[4] = {663.961, 172.594, 4.42559, 0.0955314};
    const double kw[4] = {23.1411, 25.1615, 5.43261, 0.127266};
    double z = 100.0 * PLUMB_FT_M, w20 = PLUMB_TURB_W20_MODERATE_M_S;
    double su = plumb_turbulence_sigma(PLUMB_TURB_U, w20, z);
    double sw = plumb_turbulence_sigma(PLUMB_TURB_W, w20, z);
    double lu = plumb_turbulence_length(PLUMB_TURB_U, z), lw = plumb_turbulence_length(PLUMB_TURB_W, z);
    assert_rel(su, 2.64812, 5e-6); /* to the 6 digits printed (rounded intermediates) */
    assert_rel(lu, 153.9756, 2e-6);
    for (int i = 0; i < 4; i++) {
        assert_rel(su * su * lu * plumb_turbulence_unit_spectrum(PLUMB_TURB_DRYDEN, PLUMB_TURB_U, om[i] * lu), du[i], 2e-5);
        assert_rel(sw * sw * lw * plumb_turbulence_unit_spectrum(PLUMB_TURB_DRYDEN, PLUMB_TURB_W, om[i] * lw), dw[i], 2e-5);
        assert_rel(su * su * lu * plumb_turbulence_unit_spectrum(PLUMB_TURB_VON_KARMAN, PLUMB_TURB_U, om[i] * lu), ku[i], 2e-5);
        assert_rel(sw * sw * lw * plumb_turbulence_unit_spectrum(PLUMB_TURB_VON_KARMAN, PLUMB_TURB_W, om[i] * lw), kw[i], 2e-5);
    }
}

typedef struct { plumb_turbulence_model m; plumb_turbulence_axis a; } spec_ctx;
static double unit_spec(double k, void *p)
{
    const spec_ctx *c = p;
    return plumb_turbulence_unit_spectrum(c->m, c->a, k);
}

/* One-sided spectra hold the whole variance: int_0^inf Phi = sigma^2
 * (GSL QAGIU); von Karman's with the printed 1.339, 1.3389853/1.339 of it. */
static void test_unit_spectra_integrate_to_one(void **state)
{
    (void)state;
    gsl_integration_workspace *ws = gsl_integration_workspace_alloc(1000);
    for (int m = 1; m <= 2; m++)
        for (int a = 0; a < 3; a += 2) {
            spec_ctx c = {(plumb_turbulence_model)m, (plumb_turbulence_axis)a};
            gsl_function f = {unit_spec, &c};
            double r, err;
            assert_int_equal(gsl_integration_qagiu(&f, 0.0, 1e-12, 1e-10, 1000, ws, &r, &err), 0);
            assert_rel(r, m == PLUMB_TURB_DRYDEN ? 1.0 : PLUMB_TURB_VK_A_EXACT / PLUMB_TURB_VK_A,
                       1e-8);
        }
    gsl_integration_workspace_free(ws);
}

/* The stretched height: dzeta/dz = 1 / L(z), and the realisation's fast
 * series equals the quadrature. */
static void test_stretched_height_has_slope_one_over_l(void **state)
{
    (void)state;
    plumb_turbulence_spec t;
    memset(&t, 0, sizeof t);
    t.model = PLUMB_TURB_DRYDEN;
    gsl_rng *r = gsl_rng_alloc(gsl_rng_mt19937);
    plumb_turbulence_realise(&t, 4, 10.0, 30.0, (double (*)(void *))gsl_rng_uniform, r);
    gsl_rng_free(r);
    const double zs[] = {1.3, 4.7, 17.0, 61.0, 150.0, 290.0, 400.0};
    for (size_t i = 0; i < sizeof zs / sizeof *zs; i++) {
        for (int a = 0; a < 3; a += 2) {
            double h = 1e-4 * zs[i];
            double d = (plumb_turbulence_zeta((plumb_turbulence_axis)a, zs[i] + h) -
                        plumb_turbulence_zeta((plumb_turbulence_axis)a, zs[i] - h)) / (2.0 * h);
            assert_rel(d, 1.0 / plumb_turbulence_length((plumb_turbulence_axis)a, zs[i]), 1e-6);
        }
        assert_abs(plumbp_turbulence_zeta_fast(&t, zs[i]), plumb_turbulence_zeta(PLUMB_TURB_U, zs[i]), 1e-9);
    }
}

/* The truncated spectrum's correlation at lag d (unit length): its cosine
 * transform over [0, kappa_max] (GSL QAWO) over its integral there. */
static double truncated_corr(plumb_turbulence_model m, plumb_turbulence_axis a, double d)
{
    spec_ctx c = {m, a};
    gsl_function f = {unit_spec, &c};
    gsl_integration_workspace *ws = gsl_integration_workspace_alloc(2000);
    gsl_integration_qawo_table *tb = gsl_integration_qawo_table_alloc(d, PLUMB_TURB_KAPPA_MAX, GSL_INTEG_COSINE, 60);
    double num, den, err;
    gsl_integration_qawo(&f, 0.0, 1e-13, 1e-10, 2000, ws, tb, &num, &err);
    gsl_integration_qag(&f, 0.0, PLUMB_TURB_KAPPA_MAX, 1e-13, 1e-10, 2000, GSL_INTEG_GAUSS61, ws, &den, &err);
    gsl_integration_qawo_table_free(tb);
    gsl_integration_workspace_free(ws);
    return num / den;
}

/* Over many realisations (each from its own seeded stream), the gusts at a
 * height have the model's variance sigma(h)^2, and at two heights one
 * stretched unit apart (one L) the model's correlation: Dryden u e^-1,
 * Dryden w (1 - 1/2) e^-1, von Karman u 2^(2/3)/Gamma(1/3) x^(1/3)
 * K_1/3(x), x = 1/a; the spectrum cut at kappa_max moves these by under
 * 0.03 (checked against the truncated transform, which the sampled
 * correlation must match within 4 standard errors). */
static void test_realised_gusts_have_the_model_variance_and_correlation(void **state)
{
    (void)state;
    enum { M = 20000 };
    const double w20 = 13.7;
    for (int m = 1; m <= 2; m++) {
        double z1 = 20.0, z2w = z1 * exp(1.0); /* zeta_w = ln h: one L apart */
        /* for u, find z2 with zeta_u(z2) - zeta_u(z1) = 1 by bisection */
        double lo = z1, hi = 300.0 / 0.3048 * 0.3048;
        double zu1 = plumb_turbulence_zeta(PLUMB_TURB_U, z1);
        for (int it = 0; it < 200; it++) {
            double mid = 0.5 * (lo + hi);
            if (plumb_turbulence_zeta(PLUMB_TURB_U, mid) - zu1 < 1.0)
                lo = mid;
            else
                hi = mid;
        }
        double z2u = 0.5 * (lo + hi);
        double s11[3] = {0}, s22[3] = {0}, s12[3] = {0};
        gsl_rng *r = gsl_rng_alloc(gsl_rng_mt19937);
        for (int k = 0; k < M; k++) {
            plumb_turbulence_spec t;
            memset(&t, 0, sizeof t);
            t.model = (plumb_turbulence_model)m;
            gsl_rng_set(r, 1000u + (unsigned long)k);
            plumb_turbulence_realise(&t, PLUMB_TURB_MODES, w20, 40.0, (double (*)(void *))gsl_rng_uniform, r);
            double g1[3], g2u[3], g2w[3];
            plumb_turbulence_at(&t, w20, z1, 0.0, g1);
            plumb_turbulence_at(&t, w20, z2u, 0.0, g2u);
            plumb_turbulence_at(&t, w20, z2w, 0.0, g2w);
            for (int a = 0; a < 3; a++) {
                double g2 = a == 2 ? g2w[a] : g2u[a];
                s11[a] += g1[a] * g1[a];
                s22[a] += g2 * g2;
                s12[a] += g1[a] * g2;
            }
        }
        gsl_rng_free(r);
        for (int a = 0; a < 3; a++) {
            plumb_turbulence_axis ax = (plumb_turbulence_axis)a;
            double sig = plumb_turbulence_sigma(ax, w20, z1);
            /* variance within 4 standard errors (Gaussian: sigma^2 sqrt(2/M)) */
            assert_rel(s11[a] / M, sig * sig, 4.0 * sqrt(2.0 / M));
            double rho = s12[a] / sqrt(s11[a] * s22[a]);
            double rt = truncated_corr((plumb_turbulence_model)m, a == 0 ? PLUMB_TURB_U : PLUMB_TURB_W, 1.0);
            assert_abs(rho, rt, 4.0 / sqrt((double)M));
            double exact;
            if (m == PLUMB_TURB_DRYDEN)
                exact = a == 0 ? exp(-1.0) : 0.5 * exp(-1.0);
            else if (a == 0) {
                double x = 1.0 / PLUMB_TURB_VK_A_EXACT;
                exact = pow(2.0, 2.0 / 3.0) / gsl_sf_gamma(1.0 / 3.0) * pow(x, 1.0 / 3.0) *
                        gsl_sf_bessel_Knu(1.0 / 3.0, x);
            } else {
                continue; /* the vK transverse form is checked through its spectrum */
            }
            assert_abs(rt, exact, 0.03);
        }
    }
}

/* Zero intensity (W20 0) or no realisation gives the fall without gusts,
 * bit for bit. */
static void test_zero_intensity_gives_the_calm_fall_bit_for_bit(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.2);
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(NULL, &w), PLUMB_OK);
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    s.mass_kg = 0.41;
    s.drag.model = PLUMB_DRAG_FIXED;
    s.drag.cd_area_m2 = 0.0061;
    s.release_m[2] = 47.0;
    plumb_wind_spec_init(&s.wind);
    s.wind.profile = PLUMB_WIND_POWER;
    s.wind.speed_m_s = 7.3;
    s.wind.from_deg = 250.0;
    plumb_fall_result r0, r1;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r0, &d), PLUMB_OK);
    s.turbulence.model = PLUMB_TURB_DRYDEN;
    s.turbulence.w20_m_s = 0.0;
    gsl_rng *r = gsl_rng_alloc(gsl_rng_mt19937);
    plumb_turbulence_realise(&s.turbulence, PLUMB_TURB_MODES, 0.0, 47.0, (double (*)(void *))gsl_rng_uniform, r);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r1, &d), PLUMB_OK);
    assert_memory_equal(&r0.point_m, &r1.point_m, sizeof r0.point_m);
    assert_true(r0.speed_m_s == r1.speed_m_s && r0.time_s == r1.time_s);
    /* with an intensity, the same realisation moves the impact */
    s.turbulence.w20_m_s = PLUMB_TURB_W20_SEVERE_M_S;
    plumb_turbulence_realise(&s.turbulence, PLUMB_TURB_MODES, s.turbulence.w20_m_s, 47.0, (double (*)(void *))gsl_rng_uniform, r);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r1, &d), PLUMB_OK);
    assert_true(hypot(r1.point_m[0] - r0.point_m[0], r1.point_m[1] - r0.point_m[1]) > 1e-3);
    /* a model without a realisation (a single fall) is the calm fall too */
    s.turbulence.n_modes = 0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r1, &d), PLUMB_OK);
    assert_true(r0.speed_m_s == r1.speed_m_s && r0.time_s == r1.time_s);
    gsl_rng_free(r);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* A zone with gusts is the same for 1 and 2 threads: every sample draws its
 * realisation from a stream of its own. */
static void test_zone_with_gusts_is_the_same_for_any_thread_count(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.2);
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    s.mass_kg = 0.41;
    s.drag.model = PLUMB_DRAG_FIXED;
    s.drag.cd_area_m2 = 0.0061;
    s.release_m[2] = 31.0;
    plumb_wind_spec_init(&s.wind);
    s.wind.speed_m_s = 6.1;
    s.wind.from_deg = 250.0;
    s.turbulence.model = PLUMB_TURB_VON_KARMAN;
    s.turbulence.from_wind = 1;
    plumb_uncertainty u;
    memset(&u, 0, sizeof u);
    snprintf(u.key, sizeof u.key, "payload.mass");
    u.kind = PLUMB_DIST_UNIFORM;
    u.param[0] = 0.39;
    u.param[1] = 0.43;
    plumb_zone_spec z;
    memset(&z, 0, sizeof z);
    z.samples = 240;
    z.seed = 12;
    z.confidence = 0.9;
    plumb_zone_options o1, o2;
    plumb_zone_options_init(&o1);
    plumb_zone_options_init(&o2);
    o1.threads = 1;
    o2.threads = 2;
    static plumb_zone_result r1, r2;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, &o1, &r1, &d), PLUMB_OK);
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, &o2, &r2, &d), PLUMB_OK);
    assert_memory_equal(&r1.zone.mean_m, &r2.zone.mean_m, sizeof r1.zone.mean_m);
    assert_memory_equal(&r1.zone.cov_m2, &r2.zone.cov_m2, sizeof r1.zone.cov_m2);
    assert_true(r1.zone.radius_max_m == r2.zone.radius_max_m);
    /* the gusts spread the impacts beyond the mass's own spread */
    s.turbulence.model = PLUMB_TURB_NONE;
    static plumb_zone_result r0;
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, &o1, &r0, &d), PLUMB_OK);
    assert_true(r1.zone.cov_m2[0] + r1.zone.cov_m2[1] > 4.0 * (r0.zone.cov_m2[0] + r0.zone.cov_m2[1]));
    plumb_atmosphere_free(atm);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_length_scales_and_intensities_match_the_mil_vectors),
        cmocka_unit_test(test_spectra_match_the_tabulated_values),
        cmocka_unit_test(test_unit_spectra_integrate_to_one),
        cmocka_unit_test(test_stretched_height_has_slope_one_over_l),
        cmocka_unit_test(test_realised_gusts_have_the_model_variance_and_correlation),
        cmocka_unit_test(test_zero_intensity_gives_the_calm_fall_bit_for_bit),
        cmocka_unit_test(test_zone_with_gusts_is_the_same_for_any_thread_count),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
