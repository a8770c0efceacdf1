/*
 * test_downwash.c - the rotor wake under a hovering multirotor
 * (plumb/downwash.h) against actuator-disk momentum theory (Glauert;
 * Leishman 2006 ch. 2), test vectors computed independently from those
 * formulas (not published figures), the round-jet law it decays by, and a
 * fall through a wide wake.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/constants.h"
#include "plumb/downwash.h"
#include "plumb/trajectory.h"
#include "plumb_test.h"

static plumb_downwash wake(double m_kg, double a_m2, double ve, double vn)
{
    plumb_downwash_spec sp = {m_kg, a_m2};
    plumb_downwash dw;
    const double rel0[3] = {0.0, 0.0, 40.0}, v0[2] = {0.0, 0.0}, rel[2] = {ve, vn};
    plumb_downwash_init(&sp, 1.225, PLUMB_G0_M_S2, rel0, v0, rel, &dw);
    return dw;
}

/* Momentum theory v_i = sqrt(T / (2 rho A)), rho 1.225; vectors computed
 * from it (not published figures). */
static void test_hover_induced_velocity_is_momentum_theory(void **state)
{
    (void)state;
    static const struct { double m, a, vi; } rows[] = {
        {0.9, 0.1791, 4.485}, {2.0, 0.2027, 6.285}, {25.0, 2.7362, 6.047}};
    for (size_t i = 0; i < 3; i++) {
        plumb_downwash dw = wake(rows[i].m, rows[i].a, 0.0, 0.0);
        assert_true(dw.on);
        assert_abs(dw.v_hover_m_s, rows[i].vi, 0.0006);
        assert_rel(dw.v_i_m_s, dw.v_hover_m_s, 1e-15);
        /* ideal power T v_i equals the momentum flux's energy: T = rho (A/2) (2 v_i)^2 */
        assert_rel(1.225 * rows[i].a / 2.0 * 4.0 * dw.v_i_m_s * dw.v_i_m_s, dw.thrust_n, 1e-12);
        assert_abs(dw.skew_rad, 0.0, 0.0);
    }
    plumb_downwash off = wake(0.0, 0.2, 0.0, 0.0);
    assert_false(off.on);
}

/* Momentum theory's limits on the axis: v_i at the disk, the far wake
 * 2 v_i well below it (before the jet decay takes over, for a wide disk),
 * and never more than 2 v_i; nothing far above the rotor. */
static void test_centreline_runs_from_v_i_at_the_disk_toward_twice_v_i(void **state)
{
    (void)state;
    plumb_downwash dw = wake(2.0, 0.2027, 0.0, 0.0);
    double vi = dw.v_i_m_s;
    assert_rel(plumb_downwash_centreline(&dw, 0.0), vi, 1e-15);
    for (double d = -3.0; d < 60.0; d += 0.173)
        assert_true(plumb_downwash_centreline(&dw, d) <= 2.0 * vi * (1.0 + 1e-12));
    assert_true(plumb_downwash_centreline(&dw, -30.0) < 0.001 * vi);
    /* 1.5 R below: the vortex cylinder's 1 + 1.5/sqrt(3.25) of v_i; the jet
       law is 6.3 times larger there, so the blend moves it by (1/6.3)^4 / 4 */
    double R = dw.radius_m, d = 1.5 * R;
    assert_rel(plumb_downwash_centreline(&dw, d), vi * (1.0 + 1.5 / sqrt(3.25)), 3e-4);
}

/* Far below, the round-jet law U_c = B U_J d_w / x with U_J = 2 v_i
 * (computed: crossover z_c = B d_w = 2.08 m for the 2 kg quad at B 5.8;
 * here B 6.11), and the momentum-flux form B sqrt(4T/(pi rho)) / x. */
static void test_far_wake_decays_as_a_round_jet(void **state)
{
    (void)state;
    plumb_downwash dw = wake(2.0, 0.2027, 0.0, 0.0);
    double B = PLUMB_DOWNWASH_JET_B;
    for (double x = 30.0; x <= 90.0; x += 20.0) {
        double uj = B * 2.0 * dw.v_i_m_s * dw.wake_d_m / x;
        assert_rel(plumb_downwash_centreline(&dw, x), uj, 2e-3);
        assert_rel(uj, B * sqrt(4.0 * dw.thrust_n / (PLUMB_PI * 1.225)) / x, 1e-12);
    }
    assert_rel(dw.wake_d_m, 0.359, 2e-3);
}

/* Glauert, disk edge-on (Leishman 2006 ch. 2; the relation and the skew
 * angle from memory, the values computed from them), 2 kg quad, v_h 6.285:
 * V 2, 5, 10, 15 m/s give v_i 6.128, 5.378, 3.704, 2.595 and skew
 * atan(V / v_i) 18.1, 42.9, 69.7, 80.2 deg; the wake leans downwind. */
static void test_forward_flight_lowers_v_i_and_skews_the_wake(void **state)
{
    (void)state;
    static const struct { double v, vi, chi; } rows[] = {
        {2.0, 6.128, 18.1}, {5.0, 5.378, 42.9}, {10.0, 3.704, 69.7}, {15.0, 2.595, 80.2}};
    for (size_t i = 0; i < 4; i++) {
        plumb_downwash dw = wake(2.0, 0.2027, 0.0, -rows[i].v); /* air moving south */
        assert_abs(dw.v_i_m_s, rows[i].vi, 0.0015);
        assert_abs(dw.skew_rad * 180.0 / PLUMB_PI, rows[i].chi, 0.06);
        assert_abs(dw.dir[0], 0.0, 0.0);
        assert_abs(dw.dir[1], -1.0, 0.0);
        /* the wake's velocity points along its leaning axis */
        double w[3], p[3] = {0.0, -5.0 * tan(dw.skew_rad), 35.0};
        plumb_downwash_at(&dw, 0.0, p, w);
        assert_rel(w[1] / w[2], tan(dw.skew_rad), 1e-12);
        assert_true(w[2] < 0.0);
    }
}

/* Across the wake a Gaussian: half the centreline speed at r = b. */
static void test_wake_profile_is_half_at_the_half_width(void **state)
{
    (void)state;
    plumb_downwash dw = wake(2.0, 0.2027, 0.0, 0.0);
    double d = 12.0, b = sqrt(dw.radius_m * dw.radius_m / 2.0 +
                              PLUMB_DOWNWASH_JET_S * PLUMB_DOWNWASH_JET_S * d * d);
    double w0[3], w1[3], p0[3] = {0.0, 0.0, 40.0 - d}, p1[3] = {b, 0.0, 40.0 - d};
    plumb_downwash_at(&dw, 0.0, p0, w0);
    plumb_downwash_at(&dw, 0.0, p1, w1);
    assert_rel(-w0[2], plumb_downwash_centreline(&dw, d), 1e-14);
    assert_rel(w1[2] / w0[2], 0.5, 1e-12);
}

/* A light payload under a very wide rotor (disk 1200 m^2, R 19.5 m) falls
 * at its still-air terminal speed plus the wake's speed: in constant air
 * it arrives at v_t + u_c(H) within 1 %, as the momentum-theory wake says. */
static void test_a_light_payload_falls_at_terminal_speed_plus_the_wake(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air_rho(1.225);
    plumb_trajectory *w = NULL;
    assert_int_equal(plumb_trajectory_alloc(NULL, &w), PLUMB_OK);
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    s.mass_kg = 0.0413;
    s.drag.model = PLUMB_DRAG_FIXED;
    double vt = 2.37;
    s.drag.cd_area_m2 = 2.0 * s.mass_kg * PLUMB_G0_M_S2 / (1.225 * vt * vt);
    s.release_m[2] = 30.0;
    plumb_wind_spec_init(&s.wind);
    s.downwash.aircraft_mass_kg = 150.0;
    s.downwash.disk_area_m2 = 1200.0;
    plumb_fall_result r;
    plumb_diag d;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    plumb_downwash dw = wake(150.0, 1200.0, 0.0, 0.0);
    double uc = plumb_downwash_centreline(&dw, 30.0);
    assert_rel(r.speed_m_s, vt + uc, 0.01);
    assert_abs(r.drift_m, 0.0, 1e-9);
    /* and without the wake, its terminal speed */
    s.downwash.aircraft_mass_kg = 0.0;
    assert_int_equal(plumb_trajectory_run(w, &s, atm, &r, &d), PLUMB_OK);
    assert_rel(r.speed_m_s, vt, 1e-6);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_hover_induced_velocity_is_momentum_theory),
        cmocka_unit_test(test_centreline_runs_from_v_i_at_the_disk_toward_twice_v_i),
        cmocka_unit_test(test_far_wake_decays_as_a_round_jet),
        cmocka_unit_test(test_forward_flight_lowers_v_i_and_skews_the_wake),
        cmocka_unit_test(test_wake_profile_is_half_at_the_half_width),
        cmocka_unit_test(test_a_light_payload_falls_at_terminal_speed_plus_the_wake),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
