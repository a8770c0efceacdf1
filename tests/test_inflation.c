/*
 * test_inflation.c - canopy inflation curves and Pflanz's opening-force
 * estimate (plumb/inflation.h) against the method's closed form, an
 * independent integration with GSL, and worked cases computed
 * independently from the method (Knacke, Parachute Recovery Systems Design
 * Manual, NWC TP 6575, 1991, ch. 5), with a separate Runge-Kutta check;
 * not published figures.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>

#include "plumb/constants.h"
#include "plumb/inflation.h"
#include "plumb/trajectory.h"
#include "plumb/atmosphere.h"
#include "plumb_test.h"

/* X_1 table computed from the closed form under Pflanz's assumptions
 * (checked by an independent RK4 integration to 6 digits; not a published
 * table: Knacke's chart has only j = 1/2, 1, 2). */
static void test_x1_matches_the_tabulated_closed_form(void **state)
{
    (void)state;
    static const struct { double a, j, x1; } rows[] = {
        {0.05, 0.5, 0.1713}, {0.1, 1.0, 0.1452}, {0.2, 2.0, 0.1992}, {0.5, 3.0, 0.4444},
        {1.0, 6.0, 0.7656},  {2.0, 0.5, 0.5857}, {5.0, 1.0, 0.8264}, {10.0, 2.0, 0.9365},
        {100.0, 3.0, 0.9950}, {0.05, 6.0, 0.1038}, {0.5, 1.0, 0.3248}, {2.0, 6.0, 0.8711},
    };
    for (size_t i = 0; i < sizeof rows / sizeof *rows; i++)
        assert_abs(plumb_pflanz_x1(rows[i].a, rows[i].j, NULL), rows[i].x1, 0.00006);
    /* exact spot values of the same closed form (computed) */
    assert_abs(plumb_pflanz_x1(1.0, 2.0, NULL), 9.0 / 16.0, 1e-15);
    assert_abs(plumb_pflanz_x1(1.0, 1.0, NULL), 0.459279, 5e-7);
    assert_abs(plumb_pflanz_x1(10.0, 1.0, NULL), 0.907029, 5e-7);
}

/* Infinite-mass limit: the canopy fills at constant speed, so the peak is
 * the full q_1 (CdS)_0 at tau = 1, X_1 -> 1 as 1 - 2 / (A (j+1)). */
static void test_x1_tends_to_one_for_infinite_mass(void **state)
{
    (void)state;
    const double js[] = {0.5, 1.0, 2.0, 3.0, 6.0};
    for (size_t i = 0; i < sizeof js / sizeof *js; i++) {
        double tau;
        double A = 3.7e7, x1 = plumb_pflanz_x1(A, js[i], &tau);
        assert_abs(tau, 1.0, 0.0);
        assert_rel(1.0 - x1, 2.0 / (A * (js[i] + 1.0)), 1e-6);
    }
}

/* Finite (small) mass limit: the peak comes early, at
 * tau*^(j+1) = A j (j+1) / (j+2), and X_1 = tau*^j ((j+2)/(2j+2))^2, so
 * X_1 / A^(j/(j+1)) tends to a constant. */
static void test_x1_follows_the_early_peak_for_small_mass(void **state)
{
    (void)state;
    const double js[] = {0.5, 1.0, 2.0, 6.0};
    for (size_t i = 0; i < sizeof js / sizeof *js; i++) {
        double j = js[i], A = 2.35e-4, tau;
        double x1 = plumb_pflanz_x1(A, j, &tau);
        double c = pow(j * (j + 1.0) / (j + 2.0), j / (j + 1.0)) *
                   pow((j + 2.0) / (2.0 * j + 2.0), 2.0);
        assert_rel(x1, c * pow(A, j / (j + 1.0)), 1e-12);
        assert_rel(tau, pow(A * j * (j + 1.0) / (j + 2.0), 1.0 / (j + 1.0)), 1e-12);
        assert_true(tau < 1.0);
    }
    /* the switch: the peak reaches the end of the fill at A = (j+2)/(j(j+1)) (1.5 for j = 1) */
    double tau;
    plumb_pflanz_x1(1.49, 1.0, &tau);
    assert_true(tau < 1.0);
    plumb_pflanz_x1(1.51, 1.0, &tau);
    assert_abs(tau, 1.0, 0.0);
}

/* Pflanz's ODE, m dv/dt = -1/2 rho CdS0 tau^j v^2, integrated with GSL
 * (rkf45, a general-purpose integrator) on a fine grid: its largest force
 * equals the closed form. */
typedef struct { double k, tf, j; } pflanz_ode;
static int pflanz_rhs(double t, const double y[], double f[], void *p)
{
    const pflanz_ode *o = p;
    double tau = t / o->tf;
    f[0] = -o->k * pow(tau, o->j) * y[0] * y[0];
    return GSL_SUCCESS;
}

static void test_x1_equals_the_largest_force_of_the_integrated_method(void **state)
{
    (void)state;
    const double m = 3.17, rho = 1.1, cds = 0.843, v1 = 17.3;
    const double tfs[] = {0.085, 0.62, 2.9};
    const double js[] = {0.5, 1.0, 2.0, 6.0};
    for (size_t a = 0; a < 3; a++) {
        for (size_t b = 0; b < 4; b++) {
            pflanz_ode o = {0.5 * rho * cds / m, tfs[a], js[b]};
            gsl_odeiv2_system sys = {pflanz_rhs, NULL, 1, &o};
            gsl_odeiv2_driver *d =
                gsl_odeiv2_driver_alloc_y_new(&sys, gsl_odeiv2_step_rkf45, 1e-6, 1e-12, 1e-12);
            double t = 0.0, y[1] = {v1}, best = 0.0;
            for (int k = 1; k <= 20000; k++) {
                double t1 = o.tf * k / 20000.0;
                assert_int_equal(gsl_odeiv2_driver_apply(d, &t, t1, y), GSL_SUCCESS);
                double f = 0.5 * rho * cds * pow(t1 / o.tf, o.j) * y[0] * y[0];
                if (f > best)
                    best = f;
            }
            gsl_odeiv2_driver_free(d);
            double A = plumb_pflanz_ballistic(m, rho, cds, v1, o.tf);
            double q1s = 0.5 * rho * v1 * v1 * cds;
            assert_rel(best / q1s, plumb_pflanz_x1(A, o.j, NULL), 2e-6);
        }
    }
}

static void test_inflation_fraction_is_the_power_law_held_at_the_ends(void **state)
{
    (void)state;
    assert_abs(plumb_inflation_fraction(-0.1, 6.0), 0.0, 0.0);
    assert_abs(plumb_inflation_fraction(0.0, 0.5), 0.0, 0.0);
    assert_rel(plumb_inflation_fraction(0.37, 6.0), pow(0.37, 6.0), 1e-15);
    assert_rel(plumb_inflation_fraction(0.37, 1.0), 0.37, 0.0);
    assert_abs(plumb_inflation_fraction(1.3, 2.0), 1.0, 0.0);
}

/* The table by type: the values the map of sources gives (from memory,
 * Knacke 1991), and a name for every type. */
static void test_canopy_table_carries_the_mapped_values(void **state)
{
    (void)state;
    const plumb_canopy_info *f = plumb_canopy_info_of(PLUMB_CANOPY_FLAT_CIRCULAR);
    assert_non_null(f);
    assert_string_equal(f->name, "flat-circular");
    assert_abs(f->exponent, 6.0, 0.0);
    assert_abs(f->fill_constant, 8.0, 0.0);
    assert_abs(f->opening_factor, 1.7, 0.0);
    assert_non_null(strstr(f->source, "from memory"));
    assert_abs(plumb_canopy_info_of(PLUMB_CANOPY_EXTENDED_SKIRT)->exponent, 2.0, 0.0);
    assert_abs(plumb_canopy_info_of(PLUMB_CANOPY_RINGSLOT)->exponent, 1.0, 0.0);
    assert_abs(plumb_canopy_info_of(PLUMB_CANOPY_CROSS)->exponent, 3.0, 0.0);
    assert_abs(plumb_canopy_info_of(PLUMB_CANOPY_RINGSAIL)->fill_constant, 7.0, 0.0);
    assert_null(plumb_canopy_info_of(PLUMB_CANOPY_UNSPECIFIED));
    assert_null(plumb_canopy_info_of(PLUMB_CANOPY_COUNT));
    for (int c = 1; c < PLUMB_CANOPY_COUNT; c++)
        assert_int_equal(plumb_canopy_from_name(plumb_canopy_info_of((plumb_canopy)c)->name), c);
    assert_int_equal(plumb_canopy_from_name("square"), PLUMB_CANOPY_UNSPECIFIED);
}

static void canopy_spec(plumb_fall_spec *s, double m, double h)
{
    memset(s, 0, sizeof *s);
    s->mass_kg = m;
    s->drag.model = PLUMB_DRAG_FIXED;
    s->release_m[2] = h;
    plumb_wind_spec_init(&s->wind);
    s->n_descent = 1;
    plumb_descent_spec *d = &s->descent[0];
    d->kind = PLUMB_DESCENT_PARACHUTE;
    d->trigger = PLUMB_DEPLOY_AFTER;
    d->deploy_value = 0.0;
}

/* A bad second device is named as the profile's keys count devices,
 * descent[1] (from 0, README "descent"), not "device 2", which no key is called. */
static void test_a_bad_second_device_is_named_descent_1(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.225);
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(NULL, &w), PLUMB_OK);
    plumb_fall_spec s;
    canopy_spec(&s, 10.0, 400.0);
    s.n_descent = 2;
    s.descent[0].cd = 0.8;
    s.descent[0].area_m2 = 1.0;
    s.descent[1] = s.descent[0];
    s.descent[1].opening_factor = -1.0; /* C_x must be >= 0 */
    plumb_fall_result r;
    plumb_diag dg;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &dg), PLUMB_EINVAL);
    assert_string_equal(dg.key, "descent[1].opening_factor");
    assert_null(strstr(dg.message, "device 2"));
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* Worked case (computed independently; not a published figure): 10 kg,
 * D0 2.0 m, C_D0 0.80, v_1 20 m/s, n 8, j 6, rho 1.225. Pflanz (no
 * gravity): A 0.40601, X_1 0.54719. Integrated as a vertical descent with
 * gravity the peak is 565.6 N (0.918 q_1 (CdS)_0): with j = 6 the canopy
 * has little area for most of the fill and the load regains speed. */
static void test_vertical_fill_with_gravity_reaches_the_computed_peak(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.225);
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(NULL, &w), PLUMB_OK);
    plumb_fall_spec s;
    canopy_spec(&s, 10.0, 400.0);
    s.velocity_m_s[2] = -20.0;
    plumb_descent_spec *d = &s.descent[0];
    d->cd = 0.8;
    d->diameter_m = 2.0;
    d->area_m2 = PLUMB_PI;
    d->fill_constant = 8.0;
    d->inflation_exponent = 6.0;
    d->opening_factor = 1.7;
    d->canopy = PLUMB_CANOPY_FLAT_CIRCULAR;
    plumb_fall_result r;
    plumb_diag dg;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &dg), PLUMB_OK);
    assert_rel(r.fill_time_s[0], 0.8, 1e-12);
    assert_rel(r.pflanz_a[0], 0.40601, 2e-5);
    assert_rel(r.pflanz_x1[0], 0.54719, 2e-5);
    assert_rel(r.pflanz_q1s_n[0], 615.75, 1e-5);
    assert_rel(r.pflanz_force_n[0], 572.8, 1e-4);
    assert_rel(r.peak_force_n, 565.6, 1e-3);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* Under Pflanz's own assumptions (a fast horizontal deployment and a fill
 * short against v/g, so gravity barely acts), plumb's integrated peak is
 * Pflanz's X_1 q_1 (CdS)_0 for each published exponent. The fill lasts
 * 0.05 s at 70 m/s: gravity turns the path by under 0.5 deg. */
static void test_horizontal_fast_fill_integrates_to_the_pflanz_peak(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.225);
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(NULL, &w), PLUMB_OK);
    const double js[] = {0.5, 1.0, 2.0, 6.0};
    const double masses[] = {0.37, 2.9, 41.0};
    for (size_t a = 0; a < 4; a++) {
        for (size_t b = 0; b < 3; b++) {
            plumb_fall_spec s;
            canopy_spec(&s, masses[b], 300.0);
            s.velocity_m_s[0] = 70.0;
            plumb_descent_spec *d = &s.descent[0];
            d->cd = 0.75;
            d->area_m2 = 1.13;
            d->fill_time_s = 0.05;
            d->inflation_exponent = js[a];
            plumb_fall_result r;
            plumb_diag dg;
            assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &dg), PLUMB_OK);
            double pf = r.pflanz_x1[0] * r.pflanz_q1s_n[0];
            assert_rel(r.peak_force_n, pf, 0.01);
            assert_abs(r.pflanz_force_n[0], 0.0, 0.0); /* no C_x given */
        }
    }
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* Linear fill (j = 0 means 1) gives the same fall as j = 1 bit for bit. */
static void test_exponent_zero_is_the_linear_fill(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.225);
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(NULL, &w), PLUMB_OK);
    plumb_fall_result r0, r1;
    plumb_diag dg;
    plumb_fall_spec s;
    canopy_spec(&s, 1.93, 90.0);
    s.descent[0].cd = 0.78;
    s.descent[0].area_m2 = 0.95;
    s.descent[0].deploy_value = 1.2;
    s.descent[0].fill_time_s = 0.6;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r0, &dg), PLUMB_OK);
    s.descent[0].inflation_exponent = 1.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r1, &dg), PLUMB_OK);
    assert_true(r0.peak_force_n == r1.peak_force_n && r0.time_s == r1.time_s);
    s.descent[0].inflation_exponent = 21.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r1, &dg), PLUMB_EINVAL);
    s.descent[0].inflation_exponent = 1.0;
    s.descent[0].opening_factor = -1.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r1, &dg), PLUMB_EINVAL);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_x1_matches_the_tabulated_closed_form),
        cmocka_unit_test(test_x1_tends_to_one_for_infinite_mass),
        cmocka_unit_test(test_x1_follows_the_early_peak_for_small_mass),
        cmocka_unit_test(test_x1_equals_the_largest_force_of_the_integrated_method),
        cmocka_unit_test(test_inflation_fraction_is_the_power_law_held_at_the_ends),
        cmocka_unit_test(test_canopy_table_carries_the_mapped_values),
        cmocka_unit_test(test_a_bad_second_device_is_named_descent_1),
        cmocka_unit_test(test_vertical_fill_with_gravity_reaches_the_computed_peak),
        cmocka_unit_test(test_horizontal_fast_fill_integrates_to_the_pflanz_peak),
        cmocka_unit_test(test_exponent_zero_is_the_linear_fill),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
