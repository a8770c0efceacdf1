/*
 * test_trajectory.c - the fall integrator against closed forms.
 *
 * Sources:
 *  - Vertical fall with quadratic drag in constant air (closed forms of
 *    m dv/dt = m g - rho CdA v^2 / 2; any mechanics text, e.g. Marion &
 *    Thornton, Classical Dynamics, sec. 2.4):
 *      v_t = sqrt(2 m g / (rho CdA)),  v(y) = v_t sqrt(1 - exp(-2 g y / v_t^2)),
 *      y(t) = (v_t^2 / g) ln cosh(g t / v_t).
 *  - Drag-free projectile: v = sqrt(v0^2 + 2 g H), E = m g H (+ 1/2 m v0^2),
 *    horizontal range x = v0 sqrt(2 H / g), apex H + v0z^2 / (2 g).
 *  - Work-energy theorem: the mechanical energy lost equals the work done by
 *    drag, integrated alongside the motion.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb_test.h"
#include "physics/physics.h"

static void base_spec(plumb_fall_spec *s, double mass_kg, double cda_m2, double h_m)
{
    memset(s, 0, sizeof *s);
    s->mass_kg = mass_kg;
    s->drag.model = PLUMB_DRAG_FIXED;
    s->drag.cd_area_m2 = cda_m2;
    s->release_m[2] = h_m;
    plumb_wind_spec_init(&s->wind);
}

static plumb_trajectory *workspace(void)
{
    plumb_trajectory *t = NULL;
    assert_int_equal(plumb_trajectory_alloc(NULL, &t), PLUMB_OK);
    return t;
}

/* t(y) for the quadratic-drag fall from rest: inverse of y(t), written to
 * avoid overflow: acosh(e^a) = a + ln(1 + sqrt(1 - e^-2a)). */
static double closed_time(double y, double vt, double g)
{
    double a = g * y / (vt * vt);
    return vt / g * (a + log1p(sqrt(-expm1(-2.0 * a))));
}

static void test_vertical_fall_matches_closed_form_in_constant_air(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory *w = workspace();
    const double heights[] = {0.5, 3.7, 31.4, 247.0, 2000.0};
    const double vts[] = {5.0, 23.7, 61.3, 150.0};
    const double g = PLUMB_G0_M_S2, m = 2.385, rho = PLUMBT_CONST_RHO;
    for (size_t i = 0; i < sizeof heights / sizeof *heights; i++) {
        for (size_t j = 0; j < sizeof vts / sizeof *vts; j++) {
            double H = heights[i], vt = vts[j];
            plumb_fall_spec s;
            base_spec(&s, m, 2.0 * m * g / (rho * vt * vt), H);
            plumb_fall_result r;
            plumb_diag d;
            assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
            double v_want = vt * sqrt(-expm1(-2.0 * g * H / (vt * vt)));
            assert_rel(r.speed_m_s, v_want, 1e-9);
            assert_rel(r.time_s, closed_time(H, vt, g), 1e-9);
            assert_rel(r.terminal_speed_m_s, vt, 1e-12);
            assert_abs(r.drift_m, 0.0, 1e-12);
            assert_rel(r.angle_deg, 90.0, 1e-12);
        }
    }
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_drag_free_fall_gives_vacuum_speed_energy_and_range(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, m = 0.731, H = 43.7, v0 = 3.85;
    plumb_fall_spec s;
    base_spec(&s, m, 0.0, H);
    s.drag.cd = 0.0;
    s.drag.area_m2 = 0.0183; /* cd: 0 is the explicit drag-free case */
    s.velocity_m_s[0] = v0;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    double t_fall = sqrt(2.0 * H / g);
    assert_rel(r.time_s, t_fall, 1e-12);
    assert_rel(r.point_m[0], v0 * t_fall, 1e-12);
    assert_abs(r.point_m[1], 0.0, 1e-12);
    assert_rel(r.speed_m_s, sqrt(v0 * v0 + 2.0 * g * H), 1e-12);
    assert_rel(r.energy_j, 0.5 * m * v0 * v0 + m * g * H, 1e-12);
    assert_rel(r.drag_free_speed_m_s, sqrt(v0 * v0 + 2.0 * g * H), 1e-15);
    assert_rel(r.drag_free_energy_j, 0.5 * m * v0 * v0 + m * g * H, 1e-15);
    assert_rel(r.bearing_deg, 90.0, 1e-12);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_drag_free_vertical_drop_reproduces_sqrt_2gh_and_mgh(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, m = 2.385;
    const double heights[] = {0.5, 7.3, 61.0, 1830.0};
    for (size_t i = 0; i < sizeof heights / sizeof *heights; i++) {
        plumb_fall_spec s;
        base_spec(&s, m, 0.0, heights[i]);
        plumb_fall_result r;
        plumb_diag d;
        assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
        assert_rel(r.speed_m_s, sqrt(2.0 * g * heights[i]), 1e-12);
        assert_rel(r.energy_j, m * g * heights[i], 1e-12);
    }
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_drag_free_fall_ignores_every_wind_profile(void **state)
{
    (void)state;
    /* No drag, no wind force: sqrt(2 g H) whatever the wind, including the
     * log law's kink at its roughness length (an event the integration
     * stops at) and the power law's ground layer. */
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    const plumb_wind_profile profiles[] = {PLUMB_WIND_UNIFORM, PLUMB_WIND_POWER, PLUMB_WIND_LOG};
    const double g = PLUMB_G0_M_S2, H = 31.7;
    for (size_t i = 0; i < 3; i++) {
        plumb_fall_spec s;
        base_spec(&s, 1.13, 0.0, H);
        s.wind.profile = profiles[i];
        s.wind.speed_m_s = 5.3;
        s.wind.from_deg = 270.0;
        plumb_fall_result r;
        plumb_diag d;
        assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
        assert_rel(r.speed_m_s, sqrt(2.0 * g * H), 1e-12);
        assert_abs(r.drift_m, 0.0, 1e-12);
    }
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_drag_free_upward_throw_reaches_the_ballistic_apex(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, H = 12.5, v0z = 7.9;
    plumb_fall_spec s;
    base_spec(&s, 0.412, 0.0, H);
    s.velocity_m_s[2] = v0z;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_rel(r.apex_m, H + v0z * v0z / (2.0 * g), 1e-12);
    double t_fall = (v0z + sqrt(v0z * v0z + 2.0 * g * H)) / g;
    assert_rel(r.time_s, t_fall, 1e-12);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_mechanical_energy_lost_equals_drag_work(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(12.0);
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, m = 1.137, H = 87.3;
    plumb_fall_spec s;
    base_spec(&s, m, 0.0, H);
    s.drag.cd = 0.93;
    s.drag.area_m2 = 0.0127;
    s.site_elevation_m = 640.0;
    s.velocity_m_s[0] = 1.3;
    s.velocity_m_s[1] = -0.7;
    s.velocity_m_s[2] = 2.1;
    s.wind.profile = PLUMB_WIND_POWER;
    s.wind.speed_m_s = 7.4;
    s.wind.from_deg = 250.0;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    const double *v0 = s.velocity_m_s;
    double e0 = 0.5 * m * (v0[0] * v0[0] + v0[1] * v0[1] + v0[2] * v0[2]) + m * g * H;
    double e1 = r.energy_j;
    assert_true(r.drag_work_j < 0.0);
    assert_rel(e1 - e0, r.drag_work_j, 1e-8);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_wind_from_270_degrees_carries_the_object_east(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 0.52, 0.0, 40.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.02;
    s.wind.speed_m_s = 8.0;
    s.wind.from_deg = 270.0;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_true(r.point_m[0] > 1.0);
    assert_abs(r.point_m[1], 0.0, 1e-9 * r.point_m[0]);
    assert_rel(r.bearing_deg, 90.0, 1e-9);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_power_law_with_exponent_zero_equals_uniform_wind(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 0.52, 0.0, 75.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.02;
    s.wind.speed_m_s = 6.3;
    s.wind.from_deg = 137.0;
    plumb_fall_result a, b;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &a, &d), PLUMB_OK);
    s.wind.profile = PLUMB_WIND_POWER;
    s.wind.exponent = 0.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &b, &d), PLUMB_OK);
    assert_rel(b.point_m[0], a.point_m[0], 1e-14);
    assert_rel(b.point_m[1], a.point_m[1], 1e-14);
    assert_rel(b.speed_m_s, a.speed_m_s, 1e-14);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_impact_point_agrees_with_a_much_tighter_run(void **state)
{
    (void)state;
    /* Henon's method puts the impact at z = 0 exactly, whatever the step. */
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace(), *tight = NULL;
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.rel_tol = 1e-13;
    o.abs_tol = 1e-13;
    assert_int_equal(plumb_trajectory_alloc(&o, &tight), PLUMB_OK);
    plumb_fall_spec s;
    base_spec(&s, 0.5, 0.0, 120.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.02;
    s.velocity_m_s[1] = 10.0;
    s.wind.profile = PLUMB_WIND_POWER;
    s.wind.speed_m_s = 8.0;
    s.wind.from_deg = 270.0;
    s.wind.exponent = 1.0 / 7.0;
    plumb_fall_result a, b;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &a, &d), PLUMB_OK);
    assert_int_equal(plumb_trajectory_run(tight, &s, atm, &b, &d), PLUMB_OK);
    assert_rel(a.time_s, b.time_s, 1e-9);
    assert_rel(a.speed_m_s, b.speed_m_s, 1e-9);
    assert_rel(a.drift_m, b.drift_m, 1e-9);
    plumb_trajectory_free(tight);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_parachute_descends_at_body_plus_canopy_terminal_speed(void **state)
{
    (void)state;
    /* Closed-form terminal speed sqrt(2 m g / (rho CdA)), CdA = body + canopy. */
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, m = 2.07, rho = PLUMBT_CONST_RHO;
    plumb_fall_spec s;
    base_spec(&s, m, 0.0, 400.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.0213;
    s.n_descent = 1;
    s.descent[0].kind = PLUMB_DESCENT_PARACHUTE;
    s.descent[0].cd = 0.8;
    s.descent[0].area_m2 = 1.23;
    s.descent[0].trigger = PLUMB_DEPLOY_AFTER;
    s.descent[0].deploy_value = 1.5;
    s.descent[0].fill_time_s = 0.8;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    double vs = sqrt(2.0 * m * g / (rho * (0.0213 + 0.8 * 1.23)));
    assert_rel(r.steady_speed_m_s, vs, 1e-12);
    assert_rel(r.speed_m_s, vs, 1e-9);
    assert_int_equal(r.n_deployed, 1);
    assert_rel(r.deploy_time_s[0], 1.5, 1e-15);
    /* the opening load lies above the steady drag (= weight) */
    assert_true(r.peak_force_n > m * g);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* Opening load (Knacke, Parachute Recovery Systems Design Manual, NWC TP
 * 6575, 1991, sec. 5): F = Cx X1 q (CdS)0. In plumb's model the drag area
 * grows linearly to (CdS)0 and never overshoots, so Cx = 1; at infinite
 * mass the speed does not fall during filling and X1 = 1, which bounds the
 * peak by q_ls (CdS)0. A payload that slows while filling has X1 < 1; one
 * whose canopy fills in a moment reaches the bound (the same limit). */
/* A 1.05 Cd body under a 0.78 x 2.27 m^2 canopy opening 3.1 s after release. */
static void opening_spec(plumb_fall_spec *s, double mass_kg, double fill_s)
{
    base_spec(s, mass_kg, 0.0, 600.0);
    s->drag.cd = 1.05;
    s->drag.area_m2 = 0.0314;
    s->n_descent = 1;
    s->descent[0].cd = 0.78;
    s->descent[0].area_m2 = 2.27;
    s->descent[0].trigger = PLUMB_DEPLOY_AFTER;
    s->descent[0].deploy_value = 3.1;
    s->descent[0].fill_time_s = fill_s;
}

static double opening_case(double mass_kg, double fill_s, plumb_fall_result *r)
{
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    opening_spec(&s, mass_kg, fill_s);
    plumb_diag d;
    plumb_status st = plumb_trajectory_run(w, &s, atm, r, &d);
    if (st != PLUMB_OK)
        print_error("%s\n", d.message);
    assert_int_equal(st, PLUMB_OK);
    double q = 0.5 * PLUMBT_CONST_RHO * r->deploy_speed_m_s[0] * r->deploy_speed_m_s[0];
    /* lower bounds: the body's own drag at line stretch, and, when the
     * canopy opens above its steady speed, the weight (it must slow down) */
    assert_true(r->peak_force_n >= q * 1.05 * 0.0314);
    if (r->deploy_speed_m_s[0] > r->steady_speed_m_s)
        assert_true(r->peak_force_n >= mass_kg * PLUMB_G0_M_S2);
    double bound = q * (1.05 * 0.0314 + 0.78 * 2.27);
    assert_true(r->peak_force_n <= bound * (1.0 + 1e-9));
    assert_rel(r->peak_load_g, r->peak_force_n / (mass_kg * PLUMB_G0_M_S2), 1e-15);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
    return r->peak_force_n / bound;
}

static void test_opening_force_lies_within_the_knacke_bounds(void **state)
{
    (void)state;
    plumb_fall_result r;
    double x_instant = opening_case(1.9, 1e-4, &r); /* no time to slow down */
    assert_rel(x_instant, 1.0, 0.01);
    double x_slow = opening_case(1.9, 0.35, &r);
    assert_true(x_slow < 0.8);
    double x_heavy = opening_case(40.0, 0.35, &r);
    assert_true(x_heavy > x_slow);
}

static void test_peak_force_is_located_between_steps_not_sampled(void **state)
{
    (void)state;
    /* A light payload peaks inside the filling; the located peak must not
     * move when the steps are made much finer. */
    plumb_fall_result a, b;
    opening_case(1.9, 0.93, &a);
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.rel_tol = 1e-13;
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    plumb_fall_spec s;
    opening_spec(&s, 1.9, 0.93);
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &b, &d), PLUMB_OK);
    assert_rel(a.peak_force_n, b.peak_force_n, 1e-8);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* physics.h, plumbp_traj_peak_unread: a fall whose peak force is left
 * unread (the limit's scan) has every other figure the same, bit for bit;
 * its peak is the largest at the accepted points, which the located one
 * (between them) can only exceed. A 1.83 kg body thrown under a canopy
 * that fills in power-law wind, and the same spec 1.83 g light (the
 * force has a local maximum at almost every step there). */
static void test_a_fall_with_its_peak_unread_has_every_other_figure_the_same(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(6.5);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 1.83, 0.0, 142.0);
    s.drag.cd = 1.05;
    s.drag.area_m2 = 0.0187;
    s.velocity_m_s[0] = 6.1;
    s.velocity_m_s[1] = -2.2;
    s.wind.profile = PLUMB_WIND_POWER;
    s.wind.speed_m_s = 6.4;
    s.wind.from_deg = 200.0;
    s.n_descent = 1;
    s.descent[0].cd = 0.78;
    s.descent[0].area_m2 = 0.95;
    s.descent[0].trigger = PLUMB_DEPLOY_AFTER;
    s.descent[0].deploy_value = 1.7;
    s.descent[0].fill_time_s = 0.65;
    for (int light = 0; light < 2; light++) {
        s.mass_kg = light ? 1.83e-3 : 1.83;
        plumb_fall_result on, off;
        plumb_diag d;
        assert_int_equal(plumbp_traj_peak_unread(w, 0), 0);
        assert_int_equal(plumb_trajectory_run(w, &s, atm, &on, &d), PLUMB_OK);
        assert_int_equal(plumbp_traj_peak_unread(w, 1), 0);
        assert_int_equal(plumb_trajectory_run(w, &s, atm, &off, &d), PLUMB_OK);
        assert_int_equal(plumbp_traj_peak_unread(w, 0), 1);
        assert_true(off.peak_force_n > 0.0 && off.peak_force_n <= on.peak_force_n);
        assert_true(off.solver.rhs_evaluations < on.solver.rhs_evaluations);
        off.peak_force_n = on.peak_force_n;
        off.peak_load_g = on.peak_load_g;
        off.solver.rhs_evaluations = on.solver.rhs_evaluations;
        assert_memory_equal(&off, &on, sizeof on);
    }
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_energy_balance_holds_with_a_filling_canopy(void **state)
{
    (void)state;
    /* Work-energy theorem with the drag of body and canopy, through the
     * filling: the mechanical energy lost equals the drag work, 1e-8. */
    plumb_atmosphere *atm = plumbt_std_air(6.5);
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, m = 1.83, H = 142.0;
    plumb_fall_spec s;
    base_spec(&s, m, 0.0, H);
    s.drag.cd = 1.05;
    s.drag.area_m2 = 0.0187;
    s.velocity_m_s[0] = 6.1;
    s.velocity_m_s[1] = -2.2;
    s.wind.profile = PLUMB_WIND_POWER;
    s.wind.speed_m_s = 6.4;
    s.wind.from_deg = 200.0;
    s.n_descent = 1;
    s.descent[0].cd = 0.78;
    s.descent[0].area_m2 = 0.95;
    s.descent[0].trigger = PLUMB_DEPLOY_AFTER;
    s.descent[0].deploy_value = 1.7;
    s.descent[0].fill_time_s = 0.65;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    const double *v0 = s.velocity_m_s;
    double e0 = 0.5 * m * (v0[0] * v0[0] + v0[1] * v0[1] + v0[2] * v0[2]) + m * g * H;
    assert_int_equal(r.n_deployed, 1);
    assert_rel(r.energy_j - e0, r.drag_work_j, 1e-8);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_drogue_then_main_open_in_sequence(void **state)
{
    (void)state;
    /* The main replaces the drogue at its line stretch: the steady speed is
     * the closed-form terminal speed with body + main only. */
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, m = 4.37, rho = PLUMBT_CONST_RHO;
    plumb_fall_spec s;
    base_spec(&s, m, 0.0, 900.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.031;
    s.n_descent = 2;
    s.descent[0] = (plumb_descent_spec){PLUMB_DESCENT_DROGUE, 0.55, 0.21, 0.0, PLUMB_DEPLOY_AFTER,
                                        0.8, 0.2, 0.0, 0, PLUMB_CANOPY_UNSPECIFIED, 0.0, 0.0};
    s.descent[1] = (plumb_descent_spec){PLUMB_DESCENT_PARACHUTE, 0.8, 3.4, 0.0, PLUMB_DEPLOY_BELOW,
                                        250.0, 1.1, 0.0, 1, PLUMB_CANOPY_UNSPECIFIED, 0.0, 0.0};
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_int_equal(r.n_deployed, 2);
    assert_rel(r.deploy_time_s[0], 0.8, 1e-15);
    assert_rel(r.deploy_height_m[1], 250.0, 1e-12);
    /* under the drogue alone the speed approaches its own terminal speed */
    double v_drogue = sqrt(2.0 * m * g / (rho * (0.031 + 0.55 * 0.21)));
    assert_rel(r.deploy_speed_m_s[1], v_drogue, 1e-3);
    double v_main = sqrt(2.0 * m * g / (rho * (0.031 + 0.8 * 3.4)));
    assert_rel(r.steady_speed_m_s, v_main, 1e-12);
    assert_rel(r.speed_m_s, v_main, 1e-9);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* Devices with different triggers open in the order the fall reaches them,
 * not the order they are listed: a drogue timed for 20 s listed before a
 * main opening below 250 m opens after it. The figures stay the device's
 * own ([i] is descent[i]); a drogue timed for after the landing never
 * opens while the main does. The main's steady speed is the closed form
 * sqrt(2 m g / (rho CdA)) in constant air. */
static void test_devices_opening_out_of_listed_order_keep_their_own_figures(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory *w = workspace();
    const double g = PLUMB_G0_M_S2, m = 4.37, rho = PLUMBT_CONST_RHO;
    plumb_fall_spec s;
    base_spec(&s, m, 0.0, 300.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.031;
    s.n_descent = 2;
    s.descent[0] = (plumb_descent_spec){PLUMB_DESCENT_DROGUE, 0.55, 0.21, 0.0, PLUMB_DEPLOY_AFTER,
                                        20.0, 0.2, 0.0, 0, PLUMB_CANOPY_UNSPECIFIED, 0.0, 0.0};
    s.descent[1] = (plumb_descent_spec){PLUMB_DESCENT_PARACHUTE, 0.8, 3.4, 0.0, PLUMB_DEPLOY_BELOW,
                                        250.0, 1.1, 0.0, 0, PLUMB_CANOPY_UNSPECIFIED, 0.0, 0.0};
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_int_equal(r.n_deployed, 2);
    assert_true(r.deployed[0] && r.deployed[1]);
    assert_rel(r.deploy_time_s[0], 20.0, 1e-15);
    assert_rel(r.deploy_height_m[1], 250.0, 1e-12);
    assert_true(r.deploy_time_s[1] < r.deploy_time_s[0]);
    /* timed for after the landing: the drogue never opens, the main does */
    s.descent[0].deploy_value = 600.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_int_equal(r.n_deployed, 1);
    assert_false(r.deployed[0]);
    assert_true(r.deployed[1]);
    assert_rel(r.deploy_height_m[1], 250.0, 1e-12);
    double v_main = sqrt(2.0 * m * g / (rho * (0.031 + 0.8 * 3.4)));
    assert_rel(r.speed_m_s, v_main, 1e-6);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_deploy_below_a_height_opens_exactly_there(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 1.5, 0.0, 150.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.02;
    s.n_descent = 1;
    s.descent[0].cd = 0.75;
    s.descent[0].area_m2 = 0.9;
    s.descent[0].trigger = PLUMB_DEPLOY_BELOW;
    s.descent[0].deploy_value = 60.0;
    s.descent[0].fill_time_s = 0.5;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_int_equal(r.n_deployed, 1);
    assert_rel(r.deploy_height_m[0], 60.0, 1e-12);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_invalid_specs_are_refused(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    plumb_fall_result r;
    plumb_diag d;
    base_spec(&s, 0.0, 0.01, 10.0);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "payload.mass");
    base_spec(&s, 1.0, 0.01, -2.0);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "release.height");
    base_spec(&s, 1.0, 0.0, 10.0);
    s.drag.cd = 11.0;
    s.drag.area_m2 = 0.01;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EINVAL);
    base_spec(&s, 1.0, 0.01, 10.0);
    s.velocity_m_s[0] = NAN;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EINVAL);
    base_spec(&s, 1.0, 0.01, 10.0);
    s.n_descent = 1;
    s.descent[0].cd = 0.8;
    s.descent[0].area_m2 = 1.0;
    s.descent[0].trigger = PLUMB_DEPLOY_BELOW;
    s.descent[0].deploy_value = 12.0; /* above the release height */
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EINVAL);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_buoyant_object_never_lands_and_says_so(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 0.010, 0.0, 20.0);
    s.drag.cd = 0.47;
    s.drag.area_m2 = 0.05;
    s.volume_m3 = 0.0167; /* a helium-light balloon: rho V = 0.0204 kg > 0.010 kg */
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_ENOLAND);
    assert_non_null(strstr(d.message, "never reaches"));
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* A profile refuses such a mass (PLUMB_MASS_MAX_KG, tests/cli/failures.sh);
 * a spec built in code is refused by the fall: 4.5e307 kg x g x 30 m is
 * beyond DBL_MAX, about 1.8e308 (IEEE 754 binary64), so no figure of the
 * fall can be checked and none is given (README.md, "Exit status"). */
static void test_a_mass_whose_energies_overflow_a_double_is_a_failed_fall(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 4.536e307, 0.018, 30.0);
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_ENUMERIC);
    assert_non_null(strstr(d.message, "beyond what a double can hold"));
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_step_and_time_budgets_are_errors_not_numbers(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.max_steps = 3;
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    plumb_fall_spec s;
    base_spec(&s, 0.01, 0.01, 500.0);
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EBUDGET);
    plumb_trajectory_free(w);
    plumb_trajectory_options_init(&o);
    o.max_time_s = 2.0;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EBUDGET);
    assert_non_null(strstr(d.message, "time budget"));
    plumb_trajectory_free(w);
    plumb_trajectory_options_init(&o);
    o.rel_tol = 0.0;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_EINVAL);
    assert_null(w);
    plumb_trajectory_free(NULL);
    plumb_atmosphere_free(atm);
}

/* A fall that cannot end within the time budget is refused before it is
 * integrated, by a bound no fall can beat: in constant air the closed-form
 * time of the fall from rest (closed_time) is H / v_t + (v_t / g) ln 2 for
 * large g H / v_t^2, and the refusal comes only below H / (sqrt 2 v_t)
 * of the budget. Budget 100 s, v_t 1 m/s. */
static void test_a_fall_longer_than_its_budget_is_refused_at_once(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.max_time_s = 100.0;
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    const double g = PLUMB_G0_M_S2, m = 0.002, vt = 1.0, rho = PLUMBT_CONST_RHO;
    plumb_fall_spec s;
    plumb_fall_result r;
    plumb_diag d;
    /* 200 m takes 200.07 s: refused before integrating, saying why */
    base_spec(&s, m, 2.0 * m * g / (rho * vt * vt), 200.0);
    assert_true(closed_time(200.0, vt, g) > 200.0);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EBUDGET);
    assert_non_null(strstr(d.message, "falls too slowly"));
    assert_non_null(strstr(d.message, "terminal speed is at most 1 m/s"));
    /* thrown down at 50 m/s it still takes 199.6 s (slowed within
     * v_t^2 / (2 g) ln(v0^2 / v_t^2 - 1) = 0.4 m): refused the same way */
    s.velocity_m_s[2] = -50.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EBUDGET);
    assert_non_null(strstr(d.message, "falls too slowly"));
    /* 130 m takes 130.07 s, over the budget but not by the bound: the
     * integration finds it */
    base_spec(&s, m, 2.0 * m * g / (rho * vt * vt), 130.0);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EBUDGET);
    assert_null(strstr(d.message, "falls too slowly"));
    assert_non_null(strstr(d.message, "time budget"));
    /* 95 m takes 95.07 s: computed, and on the closed form */
    base_spec(&s, m, 2.0 * m * g / (rho * vt * vt), 95.0);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_rel(r.time_s, closed_time(95.0, vt, g), 1e-8);
    assert_true(r.time_s >= 95.0 / (sqrt(2.0) * vt));
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_path_outside_the_atmosphere_is_a_range_error(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 1.0, 0.01, 1000.0);
    s.site_elevation_m = 85500.0; /* release at 86.5 km */
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EOUTSIDE);
    assert_false(plumb_status_is_input_error(PLUMB_EOUTSIDE)); /* exit status 3 */
    assert_false(plumb_status_is_input_error(PLUMB_ENOMEM));   /* not the user's input: 3 */
    assert_false(plumb_status_is_input_error(PLUMB_EWRITE));
    assert_true(plumb_status_is_input_error(PLUMB_EIO));       /* a profile that cannot be read: 2 */
    /* thrown up through the top of the model: an error, not a budget run-out */
    s.site_elevation_m = 84000.0;
    s.release_m[2] = 1500.0;
    s.velocity_m_s[2] = 400.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_EOUTSIDE);
    assert_non_null(strstr(d.message, "leaves the air model's range"));
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_recorded_path_starts_at_release_and_ends_on_the_ground(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.record_path = 1;
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    plumb_fall_spec s;
    base_spec(&s, 2.4, 0.005, 30.0);
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    size_t n = 0;
    const plumb_path_point *p = plumb_trajectory_path(w, &n);
    assert_true(n >= 2);
    assert_rel(p[0].z_m, 30.0, 0.0);
    assert_abs(p[n - 1].z_m, 0.0, 0.0);
    assert_rel(p[n - 1].t_s, r.time_s, 0.0);
    assert_true(r.solver.rhs_evaluations > 0 && r.solver.steps > 0);
    assert_string_equal(r.solver.method, "rk8pd");
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_stiff_light_fall_switches_to_msbdf_and_stays_accurate(void **state)
{
    (void)state;
    /* 0.5 g card, Cd 1, 0.01 m^2, from 1000 m: 2 g H / v_t^2 ~ 24 000.
     * Reference: the explicit rk8pd stepper at rel_tol 1e-13. */
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace(), *ref = NULL;
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.stepper = PLUMB_STEPPER_RK8PD;
    o.rel_tol = 1e-13;
    o.abs_tol = 1e-13;
    assert_int_equal(plumb_trajectory_alloc(&o, &ref), PLUMB_OK);
    plumb_fall_spec s;
    base_spec(&s, 0.0005, 0.0, 1000.0);
    s.drag.cd = 1.0;
    s.drag.area_m2 = 0.01;
    s.wind.profile = PLUMB_WIND_POWER;
    s.wind.speed_m_s = 5.0;
    plumb_fall_result a, b;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &a, &d), PLUMB_OK);
    assert_int_equal(plumb_trajectory_run(ref, &s, atm, &b, &d), PLUMB_OK);
    assert_string_equal(a.solver.method, "msbdf");
    assert_rel(a.speed_m_s, b.speed_m_s, 1e-8);
    assert_rel(a.time_s, b.time_s, 1e-8);
    assert_rel(a.drift_m, b.drift_m, 1e-8);
    assert_true(a.solver.rhs_evaluations * 5 < b.solver.rhs_evaluations);
    plumb_trajectory_free(ref);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_sphere_terminal_speed_balances_weight_and_morrison_drag(void **state)
{
    (void)state;
    /* A rigid 1 mm water sphere: at v_t, 1/2 rho Cd(Re) A v^2 = m g. */
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_fall_spec s;
    double dmm = 1.0e-3;
    base_spec(&s, 998.2 * PLUMB_PI * dmm * dmm * dmm / 6.0, 0.0, 10.0);
    s.drag.model = PLUMB_DRAG_SPHERE_MORRISON;
    s.drag.diameter_m = dmm;
    s.drag.area_m2 = PLUMB_PI * dmm * dmm / 4.0;
    double vt = 0.0;
    assert_int_equal(plumb_terminal_speed(&s, atm, 0.0, 0, &vt), PLUMB_OK);
    plumb_air air;
    assert_int_equal(plumb_atmosphere_at(atm, 0.0, &air), PLUMB_OK);
    double re = air.rho_kg_m3 * vt * dmm / air.mu_pa_s;
    double drag = 0.5 * air.rho_kg_m3 * plumb_drag_sphere_morrison(re) * s.drag.area_m2 * vt * vt;
    assert_rel(drag, s.mass_kg * PLUMB_G0_M_S2, 1e-10);
    plumb_atmosphere_free(atm);
}

/* trajectory.h: PLUMB_ENOSOLUTION when the body has no drag or its terminal
 * speed is above 1e6 m/s, *v_m_s untouched. Fixed drag of CdA = 0 (given
 * as cd_area 0, or cd 0 on an area) has no terminal speed; neither has a
 * CdA of 1e-20 m^2, whose closed-form v_t = sqrt(2 m g / (rho CdA)) is
 * 4.6e10 m/s for 1.3 kg in sea-level air (rho 1.225 kg/m^3, U.S. Standard
 * Atmosphere 1976, Table I, transcribed), nor the smallest CdA a double
 * holds, where 2 m g / (rho CdA) overflows. The same body under a canopy
 * has the closed-form speed of the canopy's CdS alone, sqrt(2 m g / (rho CdS)). */
static void test_a_body_without_drag_has_no_terminal_speed(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_fall_spec s;
    const double m = 1.3;
    const double cdas[] = {0.0, 1e-20, 4.9406564584124654e-324};
    for (size_t i = 0; i < sizeof cdas / sizeof *cdas; i++) {
        base_spec(&s, m, cdas[i], 21.7);
        double v = -1.0;
        assert_int_equal(plumb_terminal_speed(&s, atm, 0.0, 0, &v), PLUMB_ENOSOLUTION);
        assert_true(v == -1.0);
    }
    base_spec(&s, m, 0.0, 21.7);
    s.drag.cd = 0.0;
    s.drag.area_m2 = 0.0173;
    double v = -1.0;
    assert_int_equal(plumb_terminal_speed(&s, atm, 0.0, 0, &v), PLUMB_ENOSOLUTION);
    assert_true(v == -1.0);
    /* with a canopy: CdS 0.83 x 1.17 m^2 */
    s.n_descent = 1;
    s.descent[0].kind = PLUMB_DESCENT_PARACHUTE;
    s.descent[0].cd = 0.83;
    s.descent[0].area_m2 = 1.17;
    plumb_air air;
    assert_int_equal(plumb_atmosphere_at(atm, 0.0, &air), PLUMB_OK);
    assert_int_equal(plumb_terminal_speed(&s, atm, 0.0, 1, &v), PLUMB_OK);
    assert_rel(v, sqrt(2.0 * m * PLUMB_G0_M_S2 / (air.rho_kg_m3 * 0.83 * 1.17)), 1e-14);
    plumb_atmosphere_free(atm);
}

/* A fall reports no terminal speed (0, printed as none) rather than a
 * number when there is none: the 1.3 kg body of CdA 1e-20 m^2 from 21.7 m
 * lands at the drag-free speed sqrt(2 g H) (work-energy theorem). */
static void test_a_fall_without_a_terminal_speed_reports_none(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 1.3, 1e-20, 21.7);
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_true(r.terminal_speed_m_s == 0.0);
    assert_rel(r.speed_m_s, sqrt(2.0 * PLUMB_G0_M_S2 * 21.7), 1e-9);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* Closed form (header): v(H) = v_t sqrt(1 - exp(-2 g H / v_t^2)), t(H) by
 * closed_time. A grid of heights 1 m to 3 km and masses 1 g to 100 g at
 * CdA 0.01 m^2 in constant air spans 2gH/v_t^2 from 0.08 to 36 000, so it
 * covers both the explicit and the implicit (stiff) path; each fall is
 * checked on the path AUTO picks and on each path forced, and must meet
 * 1e-9 on speed and time there (the retry on the other path would show
 * as a different method name, which fails the check). */
static void check_closed_form_grid(plumb_stepper kind)
{
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.stepper = kind;
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    const double masses[] = {0.001, 0.00237, 0.0052, 0.0113, 0.0241, 0.0538, 0.1};
    const double g = PLUMB_G0_M_S2, rho = PLUMBT_CONST_RHO, cda = 0.01;
    size_t n_stiff = 0, n = 0;
    for (size_t i = 0; i < sizeof masses / sizeof *masses; i++) {
        for (double H = 1.0; H <= 3000.0; H *= 1.23) {
            plumb_fall_spec s;
            base_spec(&s, masses[i], cda, H);
            double vt = sqrt(2.0 * masses[i] * g / (rho * cda));
            plumb_fall_result r;
            plumb_diag d;
            assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
            int stiff = 2.0 * g * H / (vt * vt) > o.stiff_ratio;
            const char *want = kind == PLUMB_STEPPER_MSBDF || (kind == PLUMB_STEPPER_AUTO && stiff)
                                   ? "msbdf" : "rk8pd";
            assert_string_equal(r.solver.method, want);
            n_stiff += strcmp(r.solver.method, "msbdf") == 0;
            n++;
            assert_rel(r.speed_m_s, vt * sqrt(-expm1(-2.0 * g * H / (vt * vt))), 1e-9);
            assert_rel(r.time_s, closed_time(H, vt, g), 1e-9);
            assert_true(r.speed_m_s <= vt * (1.0 + 1e-9));
            /* work-energy theorem: m g H + W_drag = 1/2 m v^2 */
            assert_abs(r.energy_j - r.drag_work_j, masses[i] * g * H, 1e-9 * masses[i] * g * H);
        }
    }
    if (kind == PLUMB_STEPPER_AUTO)
        assert_true(n_stiff > 0 && n_stiff < n); /* both paths were taken */
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

static void test_light_falls_meet_the_closed_form_on_the_path_auto_picks(void **state)
{
    (void)state;
    check_closed_form_grid(PLUMB_STEPPER_AUTO);
}

static void test_light_falls_meet_the_closed_form_on_the_implicit_path(void **state)
{
    (void)state;
    check_closed_form_grid(PLUMB_STEPPER_MSBDF);
}

static void test_light_falls_meet_the_closed_form_on_the_explicit_path(void **state)
{
    (void)state;
    check_closed_form_grid(PLUMB_STEPPER_RK8PD);
}

/* The two falls of a 1 g object (CdA 0.01 m^2, 1.2 kg/m^3, g0) that were
 * printed wrong: closed form from 630 m 1.2784528410 m/s and 492.87350 s,
 * from 1500 m 1173.38 s (values of the closed form in the header). */
static void test_one_gram_from_630_and_1500_m_is_right_on_the_stiff_path(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.2);
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    plumb_fall_result r;
    plumb_diag d;
    base_spec(&s, 0.001, 0.01, 630.0);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_string_equal(r.solver.method, "msbdf");
    assert_abs(r.speed_m_s, 1.2784528410, 1e-10);
    assert_abs(r.time_s, 492.87350, 1e-5);
    base_spec(&s, 0.001, 0.01, 1500.0);
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_abs(r.time_s, 1173.38, 0.005);
    /* drag took what gravity gave, less the kinetic energy at impact */
    assert_rel(-r.drag_work_j, 0.001 * PLUMB_G0_M_S2 * 1500.0 - r.energy_j, 1e-9);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* A fall integrated too coarsely to balance its energy is refused on both
 * paths: an error (exit status 3 at the command line), never a figure.
 * The tolerances are loosened far past any sensible setting, so that the
 * integration error is large, and the check is kept strict. */
static void test_a_fall_that_fails_its_energy_balance_is_an_error(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.stepper = PLUMB_STEPPER_RKF45;
    o.rel_tol = o.stiff_rel_tol = 0.5;
    o.abs_tol = o.stiff_abs_tol = 1.0;
    o.energy_check_tol = 1e-14;
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    plumb_fall_spec s;
    base_spec(&s, 0.0241, 0.01, 317.0);
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_ENUMERIC);
    assert_non_null(strstr(d.message, "energy balance"));
    /* both methods named, and no advice the user cannot follow */
    assert_non_null(strstr(d.message, "could not be computed by either method"));
    assert_non_null(strstr(d.message, "with rkf45, then"));
    assert_non_null(strstr(d.message, "with msbdf"));
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* The same coarse integration with the energy check relaxed: the speed
 * bound (never faster than the terminal speed from rest in still air)
 * still refuses a fall whose integration overshoots. */
static void test_a_fall_faster_than_its_terminal_speed_is_an_error(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.stepper = PLUMB_STEPPER_RKF45;
    o.rel_tol = o.stiff_rel_tol = 0.5;
    o.abs_tol = o.stiff_abs_tol = 1.0;
    o.energy_check_tol = 1e6;
    o.speed_check_tol = 0.0;
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(&o, &w), PLUMB_OK);
    int refused = 0;
    for (double H = 50.0; H < 2000.0; H *= 1.37) {
        plumb_fall_spec s;
        base_spec(&s, 0.0241, 0.01, H);
        plumb_fall_result r;
        plumb_diag d;
        plumb_status st = plumb_trajectory_run(w, &s, atm, &r, &d);
        if (st == PLUMB_OK) {
            /* whatever passes obeys the bound */
            double vt = sqrt(2.0 * 0.0241 * PLUMB_G0_M_S2 / (PLUMBT_CONST_RHO * 0.01));
            assert_true(r.speed_m_s <= vt);
        } else {
            assert_int_equal(st, PLUMB_ENUMERIC);
            assert_non_null(strstr(d.message, "faster than its terminal speed"));
            refused++;
        }
    }
    assert_true(refused > 0);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* Drag-crisis spheres in U.S. Standard Atmosphere 1976 sea-level air
 * (rho = 101325 M0 / (R* 288.15) with the 1976 constants M0 = 28.9644,
 * R* = 8314.32, mu by Sutherland): the terminal
 * speed is the lowest root of 1/2 rho Cd(Re) A v^2 = m g. Expected roots
 * computed independently in Python from the published correlations
 * (Morrison 2010 eq. 1; Clift, Grace & Weber 1978 Table 5.2) by a sign
 * scan at a ratio of 1 + 2e-5 and bisection; all roots listed, the lowest
 * is the one a ball falling from rest settles at. */
static void test_terminal_speed_is_the_lowest_root_in_the_drag_crisis(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    static const struct {
        plumb_drag_model model;
        double d_m, m_kg, vt_m_s; /* lowest root; the others in the comment */
    } cases[] = {
        {PLUMB_DRAG_SPHERE_CGW, 0.05, 0.5138, 93.716200054},     /* 101.958, 209.410 */
        {PLUMB_DRAG_SPHERE_CGW, 0.065, 0.55, 74.753808811},      /* 76.878, 165.620 */
        {PLUMB_DRAG_SPHERE_CGW, 0.08, 0.55, 60.737469659},       /* 62.463, 134.567 */
        {PLUMB_DRAG_SPHERE_CGW, 0.03, 0.110977, 70.649148775},   /* single root */
        {PLUMB_DRAG_SPHERE_MORRISON, 0.05, 0.175, 59.041029509}, /* 81.998, 129.709 */
        {PLUMB_DRAG_SPHERE_MORRISON, 0.065, 0.15, 41.147548637}, /* 69.926, 91.509 */
        {PLUMB_DRAG_SPHERE_MORRISON, 0.04, 0.263056, 192.838111093}, /* single root */
    };
    for (size_t i = 0; i < sizeof cases / sizeof *cases; i++) {
        plumb_fall_spec s;
        base_spec(&s, cases[i].m_kg, 0.0, 10.0);
        s.drag.model = cases[i].model;
        s.drag.diameter_m = cases[i].d_m;
        s.drag.area_m2 = PLUMB_PI * cases[i].d_m * cases[i].d_m / 4.0;
        double vt = 0.0;
        assert_int_equal(plumb_terminal_speed(&s, atm, 0.0, 0, &vt), PLUMB_OK);
        assert_rel(vt, cases[i].vt_m_s, 1e-9);
        /* and the fall reports the same value */
        plumb_trajectory *w = workspace();
        plumb_fall_result r;
        plumb_diag d;
        assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
        assert_rel(r.terminal_speed_m_s, cases[i].vt_m_s, 1e-9);
        plumb_trajectory_free(w);
    }
    plumb_atmosphere_free(atm);
}

/* A ball dropped from rest through the drag crisis in constant air
 * settles at the lowest root and never passes it: the 50 mm steel ball of
 * the case above from 8 km (2gH/v_t^2 about 18, so v is v_t to 1e-7). */
static void test_a_crisis_ball_from_rest_settles_at_the_lowest_root(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    base_spec(&s, 0.5138, 0.0, 8000.0);
    s.drag.model = PLUMB_DRAG_SPHERE_CGW;
    s.drag.diameter_m = 0.05;
    s.drag.area_m2 = PLUMB_PI * 0.05 * 0.05 / 4.0;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_true(r.speed_m_s <= r.terminal_speed_m_s * (1.0 + 1e-9));
    assert_rel(r.speed_m_s, r.terminal_speed_m_s, 1e-6);
    assert_true(r.terminal_speed_m_s < 100.0); /* the lowest root, not 209 m/s */
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

/* A canopy still filling at impact (plumb_fall_device_at_impact). The body
 * has no drag of its own, so up to line stretch the fall is exactly
 * drag-free: z = H - g t^2 / 2, v = g t (elementary mechanics), and the
 * canopy only slows it afterwards, so the impact comes no sooner than
 * sqrt(2 H / g). The deploy time is set 0.154 s before that and the fill
 * (0.43 s, linear: CdS = CdS0 t / t_f, Knacke 1991 with j = 1) cannot end
 * first: the fill fraction at impact is (t_impact - t_stretch) / t_f, the
 * definition of the fill time. */
static void test_a_canopy_still_filling_at_impact_is_not_open(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_trajectory *w = workspace();
    plumb_fall_spec s;
    const double h = 27.4, g = PLUMB_G0_M_S2;
    base_spec(&s, 3.17, 0.0, h);
    const double t0 = sqrt(2.0 * h / g), td = t0 - 0.154, tf = 0.43;
    s.n_descent = 1;
    s.descent[0].cd = 0.81;
    s.descent[0].area_m2 = 1.93;
    s.descent[0].trigger = PLUMB_DEPLOY_AFTER;
    s.descent[0].deploy_value = td;
    s.descent[0].fill_time_s = tf;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_true(r.deployed[0]);
    assert_rel(r.deploy_time_s[0], td, 1e-12);
    assert_rel(r.deploy_height_m[0], h - 0.5 * g * td * td, 1e-9); /* drag-free */
    assert_rel(r.deploy_speed_m_s[0], g * td, 1e-9);
    assert_true(r.time_s >= t0 * (1.0 - 1e-9) && r.time_s < td + tf);
    plumb_device_at_impact at;
    assert_int_equal(plumb_fall_device_at_impact(&s, &r, 0, &at), PLUMB_DEVICE_FILLING);
    double frac = (r.time_s - r.deploy_time_s[0]) / r.fill_time_s[0];
    assert_rel(at.fill_fraction, frac, 1e-12);
    assert_rel(at.cds_full_m2, 0.81 * 1.93, 1e-15);
    assert_rel(at.cds_m2, 0.81 * 1.93 * frac, 1e-12); /* linear fill */
    /* nothing opened: no steady speed of this fall's; the all-open one stays */
    assert_int_equal(plumb_fall_opened_devices(&s, &r), 0u);
    assert_true(r.steady_opened_m_s == 0.0 && r.steady_speed_m_s > 0.0);

    /* the same state read from times alone: the fill ending exactly at
     * impact is open, an instant later still filling; no fill time opens
     * at once; an index past the devices is not deployed */
    plumb_fall_result x = r;
    x.time_s = x.deploy_time_s[0] + x.fill_time_s[0];
    assert_int_equal(plumb_fall_device_at_impact(&s, &x, 0, &at), PLUMB_DEVICE_OPEN);
    assert_true(at.fill_fraction == 1.0 && at.cds_m2 == at.cds_full_m2);
    assert_int_equal(plumb_fall_opened_devices(&s, &x), 1u);
    x.time_s = nextafter(x.time_s, 0.0);
    assert_int_equal(plumb_fall_device_at_impact(&s, &x, 0, NULL), PLUMB_DEVICE_FILLING);
    x.fill_time_s[0] = 0.0;
    assert_int_equal(plumb_fall_device_at_impact(&s, &x, 0, NULL), PLUMB_DEVICE_OPEN);
    assert_int_equal(plumb_fall_device_at_impact(&s, &x, 1, &at), PLUMB_DEVICE_NOT_DEPLOYED);
    assert_true(at.cds_m2 == 0.0 && at.fill_fraction == 0.0);
    x.deployed[0] = 0;
    assert_int_equal(plumb_fall_device_at_impact(&s, &x, 0, NULL), PLUMB_DEVICE_NOT_DEPLOYED);

    /* a main that replaces a drogue: the drogue is replaced once the main
     * reaches line stretch, and counts as open only with the main open */
    plumb_fall_spec two = s;
    two.n_descent = 2;
    two.descent[1] = s.descent[0];
    two.descent[1].disreefs_previous = 1;
    plumb_fall_result y;
    memset(&y, 0, sizeof y);
    y.deployed[0] = y.deployed[1] = 1;
    y.deploy_time_s[0] = 1.1;
    y.fill_time_s[0] = 0.2;
    y.deploy_time_s[1] = 1.4;
    y.fill_time_s[1] = 0.5;
    y.time_s = 1.7; /* the main 60 % filled */
    assert_int_equal(plumb_fall_device_at_impact(&two, &y, 0, &at), PLUMB_DEVICE_REPLACED);
    assert_true(at.fill_fraction == 1.0 && at.cds_m2 == 0.0);
    assert_int_equal(plumb_fall_device_at_impact(&two, &y, 1, &at), PLUMB_DEVICE_FILLING);
    assert_rel(at.fill_fraction, 0.3 / 0.5, 1e-12);
    assert_int_equal(plumb_fall_opened_devices(&two, &y), 0u);
    y.time_s = 2.3;
    assert_int_equal(plumb_fall_opened_devices(&two, &y), 3u);
    y.deployed[1] = 0; /* the main never opens: the drogue is open */
    assert_int_equal(plumb_fall_device_at_impact(&two, &y, 0, NULL), PLUMB_DEVICE_OPEN);
    assert_int_equal(plumb_fall_opened_devices(&two, &y), 1u);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_vertical_fall_matches_closed_form_in_constant_air),
        cmocka_unit_test(test_drag_free_fall_gives_vacuum_speed_energy_and_range),
        cmocka_unit_test(test_drag_free_vertical_drop_reproduces_sqrt_2gh_and_mgh),
        cmocka_unit_test(test_drag_free_fall_ignores_every_wind_profile),
        cmocka_unit_test(test_drag_free_upward_throw_reaches_the_ballistic_apex),
        cmocka_unit_test(test_mechanical_energy_lost_equals_drag_work),
        cmocka_unit_test(test_wind_from_270_degrees_carries_the_object_east),
        cmocka_unit_test(test_power_law_with_exponent_zero_equals_uniform_wind),
        cmocka_unit_test(test_impact_point_agrees_with_a_much_tighter_run),
        cmocka_unit_test(test_parachute_descends_at_body_plus_canopy_terminal_speed),
        cmocka_unit_test(test_opening_force_lies_within_the_knacke_bounds),
        cmocka_unit_test(test_peak_force_is_located_between_steps_not_sampled),
        cmocka_unit_test(test_energy_balance_holds_with_a_filling_canopy),
        cmocka_unit_test(test_drogue_then_main_open_in_sequence),
        cmocka_unit_test(test_deploy_below_a_height_opens_exactly_there),
        cmocka_unit_test(test_devices_opening_out_of_listed_order_keep_their_own_figures),
        cmocka_unit_test(test_invalid_specs_are_refused),
        cmocka_unit_test(test_buoyant_object_never_lands_and_says_so),
        cmocka_unit_test(test_a_mass_whose_energies_overflow_a_double_is_a_failed_fall),
        cmocka_unit_test(test_step_and_time_budgets_are_errors_not_numbers),
        cmocka_unit_test(test_a_fall_longer_than_its_budget_is_refused_at_once),
        cmocka_unit_test(test_path_outside_the_atmosphere_is_a_range_error),
        cmocka_unit_test(test_recorded_path_starts_at_release_and_ends_on_the_ground),
        cmocka_unit_test(test_stiff_light_fall_switches_to_msbdf_and_stays_accurate),
        cmocka_unit_test(test_sphere_terminal_speed_balances_weight_and_morrison_drag),
        cmocka_unit_test(test_a_body_without_drag_has_no_terminal_speed),
        cmocka_unit_test(test_a_fall_without_a_terminal_speed_reports_none),
        cmocka_unit_test(test_light_falls_meet_the_closed_form_on_the_path_auto_picks),
        cmocka_unit_test(test_light_falls_meet_the_closed_form_on_the_implicit_path),
        cmocka_unit_test(test_light_falls_meet_the_closed_form_on_the_explicit_path),
        cmocka_unit_test(test_one_gram_from_630_and_1500_m_is_right_on_the_stiff_path),
        cmocka_unit_test(test_a_fall_that_fails_its_energy_balance_is_an_error),
        cmocka_unit_test(test_a_fall_faster_than_its_terminal_speed_is_an_error),
        cmocka_unit_test(test_terminal_speed_is_the_lowest_root_in_the_drag_crisis),
        cmocka_unit_test(test_a_crisis_ball_from_rest_settles_at_the_lowest_root),
        cmocka_unit_test(test_a_canopy_still_filling_at_impact_is_not_open),
        cmocka_unit_test(test_a_fall_with_its_peak_unread_has_every_other_figure_the_same),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
