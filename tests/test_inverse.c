/*
 * test_inverse.c - plumb_limit_solve (include/plumb/inverse.h) against
 * closed forms: the value of an input at which a limit is just met, the
 * side it is reported on, the range scanned, the unlimited and impossible
 * answers with their words, several crossings, and every refusal.
 *
 * Sources of the expected values:
 *   - work-energy theorem for a drag-free fall (no air force, constant g):
 *     E = 1/2 m v0^2 + m g H for any direction of the release velocity
 *     v0; so H(E) = E/(m g) - v0^2/(2 g), m(E) = E / (g H + v0^2/2), and
 *     the vertical release speed giving E is +-sqrt(2 E/m - 2 g H).
 *   - standard gravity g0 = 9.80665 m/s^2 (3rd CGPM, 1901), used without a
 *     latitude (README, site.latitude).
 *   - constant density, vertical fall from rest with quadratic drag
 *     (closed-form solution of m dv/dt = m g - rho Cd A v^2 / 2):
 *     v_t = sqrt(2 m g / (rho Cd A)),
 *     v(H) = v_t sqrt(1 - exp(-2 g H / v_t^2)), so
 *     H(v) = -(v_t^2/(2 g)) ln(1 - v^2/v_t^2); v(H) < v_t for every H.
 * The range scanned is inverse.h's: three decades either way of the
 * profile's own value for a positive key, 61 values and the profile's own.
 * Tolerances: the limit's Brent tolerance is 1e-10 relative on the key
 * (inverse.h); a fall's speed is within 1e-9 relative of the closed form
 * (README, "The model"). A drag-free fall is a polynomial in time, which
 * the 8th-order stepper follows exactly, so 1e-9 there covers Brent with
 * room; in drag, 1e-9 on the speed becomes 1e-9 kappa on the key, kappa
 * the condition number |d ln key / d ln v| of the closed form.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb_test.h"
#include "solve/inverse_internal.h"

/* Standard gravity, m/s^2 (3rd CGPM, 1901). */
#define G0 9.80665
/* The test payload: 2.385 kg released at 31.6 m. */
#define MASS_KG 2.385
#define HEIGHT_M 31.6
/* Constant air, kg/m^3, and the body's Cd and area. */
#define RHO 1.2041
#define CD 0.87
#define AREA_M2 0.0213

static plumb_units *units;
static plumb_trajectory *traj;
static char dir[256];
static int n_files;

static int group_setup(void **state)
{
    plumbt_setup_gsl(state);
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_units_alloc(&units, &d) != PLUMB_OK)
        return -1;
    if (plumb_trajectory_alloc(NULL, &traj) != PLUMB_OK)
        return -1;
    const char *tmp = getenv("TMPDIR");
    snprintf(dir, sizeof dir, "%s/plumb-test-inverse-XXXXXX", tmp && *tmp ? tmp : "/tmp");
    return mkdtemp(dir) ? 0 : -1;
}

static int group_teardown(void **state)
{
    (void)state;
    char path[300];
    for (int i = 0; i < n_files; i++) {
        snprintf(path, sizeof path, "%s/p%d.yaml", dir, i);
        unlink(path);
    }
    rmdir(dir);
    plumb_trajectory_free(traj);
    plumb_units_free(units);
    return 0;
}

/* Writes yaml to a new file in the test directory and loads it. */
static plumb_profile *load(const char *yaml)
{
    char path[300];
    snprintf(path, sizeof path, "%s/p%d.yaml", dir, n_files++);
    FILE *f = fopen(path, "w");
    assert_non_null(f);
    assert_true(fputs(yaml, f) >= 0);
    assert_int_equal(fclose(f), 0);
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_profile_load(path, units, NULL, 0, &p, &d);
    if (st != PLUMB_OK)
        fprintf(stderr, "%s:%d:%d: %s: %s\n", d.file, d.line, d.col, d.key, d.message);
    assert_int_equal(st, PLUMB_OK);
    return p;
}

/* A drag-free 2.385 kg payload at 31.6 m with release velocity `vel`. */
static plumb_profile *drag_free(const char *vel)
{
    char yaml[512];
    snprintf(yaml, sizeof yaml,
             "name: drag-free payload\n"
             "payload: {mass: 2.385 kg, drag: {cd: 0, area: 0.0117 m^2}}\n"
             "release:\n"
             "  height: 31.6 m\n"
             "  velocity: %s\n",
             vel);
    return load(yaml);
}

/* The same body with Cd 0.87 on 0.0213 m^2, from rest in constant air. */
static plumb_profile *constant_air(void)
{
    return load("name: constant-air payload\n"
                "payload: {mass: 2.385 kg, drag: {cd: 0.87, area: 0.0213 m^2}}\n"
                "release: {height: 31.6 m}\n"
                "atmosphere:\n"
                "  model: table\n"
                "  table:\n"
                "    - {altitude: -1000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}\n"
                "    - {altitude: 40000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}\n");
}

static plumb_status solve(const plumb_profile *p, const char *key, plumb_metric metric,
                          double limit, const plumb_limit_options *opt, plumb_limit_result *res,
                          plumb_diag *d)
{
    plumb_diag_clear(d);
    plumb_status st = plumb_limit_solve(p, units, 0, key, metric, limit, opt, traj, res, d);
    if (st != PLUMB_OK)
        fprintf(stderr, "%s: %s\n", d->key, d->message);
    return st;
}

/* v_t of the constant-air body with drag area cda, m/s (drag balance). */
static double terminal(double cda)
{
    return sqrt(2.0 * MASS_KG * G0 / (RHO * cda));
}

/* H(v) in constant air, m (closed form). */
static double height_for_speed(double v, double vt)
{
    return -(vt * vt / (2.0 * G0)) * log(1.0 - v * v / (vt * vt));
}

/* Condition number |d ln H / d ln v| of H(v). */
static double kappa_height(double v, double vt)
{
    double x2 = v * v / (vt * vt);
    return 2.0 * x2 / ((1.0 - x2) * -log(1.0 - x2));
}

/* ---- found: closed forms ---------------------------------------------------- */

static void test_drag_free_height_for_an_energy_is_the_work_energy_height(void **state)
{
    (void)state;
    const double v0 = 7.3, e = 913.7;
    const char *vels[] = {"{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}",
                          "{east: 0 m/s, north: 0 m/s, up: 7.3 m/s}",
                          "{east: 0 m/s, north: 0 m/s, up: -7.3 m/s}",
                          "{speed: 7.3 m/s, heading: 213.7 deg, climb: 0 m/s}"};
    for (size_t i = 0; i < sizeof vels / sizeof vels[0]; i++) {
        plumb_profile *p = drag_free(vels[i]);
        plumb_limit_result r;
        plumb_diag d;
        assert_int_equal(solve(p, "release.height", PLUMB_METRIC_ENERGY, e, NULL, &r, &d),
                         PLUMB_OK);
        assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
        /* work-energy theorem: H = E/(m g0) - v0^2/(2 g0) */
        double h = e / (MASS_KG * G0) - v0 * v0 / (2.0 * G0);
        assert_rel(r.value_si, h, 1e-9);
        assert_int_equal(r.dim, PLUMB_DIM_LENGTH);
        /* the energy there, and at the profile's own 31.6 m, by the same theorem */
        assert_rel(r.metric_at_value, 0.5 * MASS_KG * v0 * v0 + MASS_KG * G0 * r.value_si, 1e-12);
        /* inverse.h: reported on the side that meets the limit (the exact
         * height but for the rounding of the energy's sum, see below) */
        assert_true(r.metric_at_value <= e);
        assert_true(r.value_si <= h * (1.0 + 1e-13));
        assert_rel(r.base_value_si, HEIGHT_M, 0.0);
        assert_rel(r.metric_at_base, 0.5 * MASS_KG * v0 * v0 + MASS_KG * G0 * HEIGHT_M, 1e-12);
        /* E grows with H: lower heights stay within */
        assert_true(r.increasing);
        assert_true(r.limit_is_upper_bound);
        assert_true(r.within_at_low_end);
        assert_int_equal(r.n_crossings, 1);
        assert_rel(r.crossings_si[0], r.value_si, 0.0);
        assert_true(r.evaluations > 0 && r.evaluations <= 200);
        /* what was scanned (inverse.h), and the energy at its top by the
         * same theorem; the figures say it all: no words */
        assert_rel(r.scan_lo_si, HEIGHT_M / 1e3, 1e-12);
        assert_rel(r.scan_hi_si, HEIGHT_M * 1e3, 1e-12);
        assert_true(r.n_scanned == 61 || r.n_scanned == 62);
        assert_rel(r.metric_at_scan_hi,
                   0.5 * MASS_KG * v0 * v0 + MASS_KG * G0 * r.scan_hi_si, 1e-9);
        assert_string_equal(r.explanation, "");
        plumb_profile_free(p);
    }
}

static void test_drag_free_mass_for_an_energy_is_the_work_energy_mass(void **state)
{
    (void)state;
    const double v0 = 7.3, e = 913.7;
    plumb_profile *p = drag_free("{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}");
    plumb_limit_result r;
    plumb_diag d;
    assert_int_equal(solve(p, "payload.mass", PLUMB_METRIC_ENERGY, e, NULL, &r, &d), PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    /* work-energy theorem: E = m (g0 H + v0^2/2) */
    double m = e / (G0 * HEIGHT_M + 0.5 * v0 * v0);
    assert_rel(r.value_si, m, 1e-9);
    assert_true(r.value_si <= m * (1.0 + 1e-13)); /* the safe side, but for rounding */
    assert_int_equal(r.dim, PLUMB_DIM_MASS);
    assert_true(r.limit_is_upper_bound);
    plumb_profile_free(p);
}

static void test_constant_air_height_for_a_speed_is_the_closed_form_height(void **state)
{
    (void)state;
    plumb_profile *p = constant_air();
    double vt = terminal(CD * AREA_M2);
    const double speeds[] = {23.7, 31.6, 44.9};
    for (size_t i = 0; i < 3; i++) {
        double v = speeds[i];
        plumb_limit_result r;
        plumb_diag d;
        assert_int_equal(solve(p, "release.height", PLUMB_METRIC_SPEED, v, NULL, &r, &d),
                         PLUMB_OK);
        assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
        /* constant-density closed form H(v) */
        assert_rel(r.value_si, height_for_speed(v, vt), 1e-9 * kappa_height(v, vt) + 2e-10);
        assert_true(r.metric_at_value <= v);
        assert_rel(r.metric_at_value, v, 1e-9);
        assert_true(r.limit_is_upper_bound);
    }
    plumb_profile_free(p);
}

/* The v_t at which a fall from HEIGHT_M arrives at v: the root of
 * v_t^2 (1 - exp(-2 g H / v_t^2)) = v^2 (closed form v(H)), which grows
 * with v_t, found by bisection to the last bit. */
static double terminal_for_speed_at_height(double v)
{
    double lo = v, hi = 1e4 * v;
    for (int i = 0; i < 400 && lo < hi; i++) {
        double mid = 0.5 * (lo + hi);
        if (mid == lo || mid == hi)
            break;
        double f = mid * mid * (1.0 - exp(-2.0 * G0 * HEIGHT_M / (mid * mid))) - v * v;
        if (f < 0.0)
            lo = mid;
        else
            hi = mid;
    }
    return 0.5 * (lo + hi);
}

static void test_constant_air_area_for_a_speed_is_the_closed_form_area(void **state)
{
    (void)state;
    /* A larger area is slower: the limit is a lower bound on the area. */
    plumb_profile *p = constant_air();
    const double v = 19.37;
    plumb_limit_result r;
    plumb_diag d;
    assert_int_equal(solve(p, "payload.drag.area", PLUMB_METRIC_SPEED, v, NULL, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    /* v_t from v(H) = v, then A = 2 m g / (rho Cd v_t^2) */
    double vt = terminal_for_speed_at_height(v);
    double area = 2.0 * MASS_KG * G0 / (RHO * CD * vt * vt);
    /* kappa = |d ln A / d ln v|, from the closed form by central differences */
    double vp = terminal_for_speed_at_height(v * (1.0 + 1e-5));
    double vm = terminal_for_speed_at_height(v * (1.0 - 1e-5));
    double kappa = fabs(log(vm * vm / (vp * vp)) / (2e-5));
    assert_rel(r.value_si, area, 1e-9 * kappa + 2e-10);
    assert_true(r.metric_at_value <= v);
    assert_false(r.increasing);
    assert_false(r.limit_is_upper_bound);
    assert_false(r.within_at_low_end);
    assert_int_equal(r.dim, PLUMB_DIM_AREA);
    /* three decades either way of the profile's own area (inverse.h) */
    assert_rel(r.scan_lo_si, AREA_M2 / 1e3, 1e-12);
    assert_rel(r.scan_hi_si, AREA_M2 * 1e3, 1e-12);
    plumb_profile_free(p);
}

static void test_a_metric_even_in_its_key_has_two_crossings_and_takes_the_nearer(void **state)
{
    (void)state;
    /* E is even in the vertical release speed: the limit is met at
     * +-sqrt(2 E/m - 2 g0 H) (work-energy theorem); the profile's -2.1 m/s
     * is nearer the negative one. */
    const double e = 913.7;
    plumb_profile *p = drag_free("{east: 0 m/s, north: 0 m/s, up: -2.1 m/s}");
    plumb_limit_result r;
    plumb_diag d;
    assert_int_equal(solve(p, "release.velocity.up", PLUMB_METRIC_ENERGY, e, NULL, &r, &d),
                     PLUMB_OK);
    double vstar = sqrt(2.0 * e / MASS_KG - 2.0 * G0 * HEIGHT_M);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_int_equal(r.n_crossings, 2);
    assert_rel(r.crossings_si[0], -vstar, 1e-9);
    assert_rel(r.crossings_si[1], vstar, 1e-9);
    /* each on its safe side, inside [-v*, v*], but for the rounding of the
     * energy's sum (a few ulp; 1e-13 leaves a factor 100, and a value on
     * the wrong side would be off by up to Brent's 1e-10) */
    assert_true(r.crossings_si[0] >= -vstar * (1.0 + 1e-13));
    assert_true(r.crossings_si[1] <= vstar * (1.0 + 1e-13));
    assert_rel(r.value_si, -vstar, 1e-9);
    assert_int_equal(r.dim, PLUMB_DIM_SPEED);
    /* from -300 m/s up: exceeded, then within between the crossings */
    assert_false(r.within_at_low_end);
    assert_false(r.limit_is_upper_bound);
    /* a signed key is scanned linearly across zero: both crossings inside */
    assert_true(r.scan_lo_si < -vstar && r.scan_hi_si > vstar);
    assert_true(r.n_scanned == 61 || r.n_scanned == 62);
    plumb_profile_free(p);
}

static void test_a_coarse_tolerance_still_reports_a_value_that_meets_the_limit(void **state)
{
    (void)state;
    plumb_profile *p = drag_free("{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}");
    plumb_limit_options opt;
    plumb_limit_options_init(&opt);
    assert_rel(opt.rel_tol, 1e-10, 0.0); /* inverse.h: default 1e-10 */
    assert_int_equal(opt.max_evaluations, 200);
    opt.rel_tol = 1e-3;
    const double v0 = 7.3, e = 913.7;
    plumb_limit_result r;
    plumb_diag d;
    assert_int_equal(solve(p, "release.height", PLUMB_METRIC_ENERGY, e, &opt, &r, &d), PLUMB_OK);
    double h = e / (MASS_KG * G0) - v0 * v0 / (2.0 * G0); /* work-energy theorem */
    assert_true(r.value_si <= h * (1.0 + 1e-13)); /* the safe side, but for rounding */
    assert_rel(r.value_si, h, 1e-3);
    assert_true(r.metric_at_value <= e);
    plumb_profile_free(p);
}

/* ---- unlimited and impossible ------------------------------------------------ */

static void test_a_speed_limit_above_terminal_speed_is_unlimited_and_says_so(void **state)
{
    (void)state;
    plumb_profile *p = constant_air();
    double vt = terminal(CD * AREA_M2); /* 45.787 m/s */
    plumb_limit_result r;
    plumb_diag d;
    /* v(H) < v_t for every H (closed form), so 1.033 v_t is never reached */
    assert_int_equal(solve(p, "release.height", PLUMB_METRIC_SPEED, 1.033 * vt, NULL, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_UNLIMITED);
    assert_int_equal(r.n_crossings, 0);
    assert_true(r.within_at_low_end);
    assert_non_null(strstr(r.explanation, "terminal speed"));
    /* scanned up to three decades above 31.6 m (inverse.h), where the
     * speed is the closed form's v(H), just below v_t */
    assert_rel(r.scan_hi_si, HEIGHT_M * 1e3, 1e-12);
    assert_rel(r.metric_at_scan_hi,
               vt * sqrt(1.0 - exp(-2.0 * G0 * r.scan_hi_si / (vt * vt))), 1e-9);
    /* the profile's own figure is the closed form's */
    assert_rel(r.metric_at_base, vt * sqrt(1.0 - exp(-2.0 * G0 * HEIGHT_M / (vt * vt))), 1e-9);
    plumb_profile_free(p);
}

static void test_an_energy_below_the_release_energy_is_impossible_and_says_so(void **state)
{
    (void)state;
    /* thrown down at 7.3 m/s: E > 1/2 m v0^2 = 63.55 J at every H > 0 */
    plumb_profile *p = drag_free("{east: 0 m/s, north: 0 m/s, up: -7.3 m/s}");
    const double e_release = 0.5 * MASS_KG * 7.3 * 7.3;
    plumb_limit_result r;
    plumb_diag d;
    assert_int_equal(solve(p, "release.height", PLUMB_METRIC_ENERGY, 0.97 * e_release, NULL, &r,
                           &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_IMPOSSIBLE);
    assert_int_equal(r.n_crossings, 0);
    assert_false(r.within_at_low_end);
    assert_non_null(strstr(r.explanation, "even at (almost) zero height"));
    /* from three decades below 31.6 m (inverse.h); at the top, the
     * work-energy theorem */
    assert_rel(r.scan_lo_si, HEIGHT_M / 1e3, 1e-12);
    assert_rel(r.metric_at_scan_hi, e_release + MASS_KG * G0 * r.scan_hi_si, 1e-9);
    /* just above it, a few centimetres do: H = (E - 1/2 m v0^2) / (m g0) */
    double e = 1.0237 * e_release;
    assert_int_equal(solve(p, "release.height", PLUMB_METRIC_ENERGY, e, NULL, &r, &d), PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_rel(r.value_si, (e - e_release) / (MASS_KG * G0), 1e-9);
    plumb_profile_free(p);
}

/* A new user's review: a drift limit with no wind and no sideways
 * release velocity was "unlimited" because "it levels off as the fall
 * reaches its terminal speed". Nothing acts sideways on the body: drag
 * lies along its velocity relative to still air, vertical from rest, so
 * the drift is 0 at every height (Newton's first law; closed form), and
 * the answer says so, not the terminal speed. */
static void test_a_drift_nothing_moves_sideways_is_unlimited_and_says_why(void **state)
{
    (void)state;
    plumb_profile *p = constant_air();
    plumb_limit_result r;
    plumb_diag d;
    assert_int_equal(solve(p, "release.height", PLUMB_METRIC_DRIFT, 2.137, NULL, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_UNLIMITED);
    assert_int_equal(r.n_crossings, 0);
    assert_abs(r.metric_at_base, 0.0, 0.0);
    assert_abs(r.metric_at_scan_hi, 0.0, 0.0);
    assert_non_null(strstr(r.explanation, "there is no wind and no sideways release velocity: "
                                          "nothing moves it sideways, so no height gives a drift"));
    assert_null(strstr(r.explanation, "terminal speed"));
    plumb_profile_free(p);
    /* the same for a key other than the height: "no value of" it */
    p = constant_air();
    assert_int_equal(solve(p, "payload.mass", PLUMB_METRIC_DRIFT, 2.137, NULL, &r, &d), PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_UNLIMITED);
    assert_non_null(strstr(r.explanation, "so no value of payload.mass gives a drift"));
    plumb_profile_free(p);
}

/* Thrown sideways at 7.3 m/s in still constant air, the body drifts, but
 * never 5000 m: drag only slows the sideways speed, and |v| >= |v_x| gives
 * v_x <= v0 / (1 + k v0 t / m), k = rho Cd A / 2, so the drift is at most
 * (m / k) ln(1 + k v0 t / m) = 213.8 m x ln(1 + 0.03415 t/s), under 5000 m
 * for any fall shorter than 4e8 s (comparison of the ODEs; closed form).
 * Unlimited, then, but not for want of a sideways push, nor because of the
 * terminal speed, which bounds a speed, not a distance. */
static void test_a_drift_that_moves_sideways_is_not_explained_by_terminal_speed(void **state)
{
    (void)state;
    plumb_profile *p = load("name: constant-air payload thrown\n"
                            "payload: {mass: 2.385 kg, drag: {cd: 0.87, area: 0.0213 m^2}}\n"
                            "release:\n"
                            "  height: 31.6 m\n"
                            "  velocity: {east: 7.3 m/s, north: 0 m/s, up: 0 m/s}\n"
                            "atmosphere:\n"
                            "  model: table\n"
                            "  table:\n"
                            "    - {altitude: -1000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}\n"
                            "    - {altitude: 40000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}\n");
    plumb_limit_result r;
    plumb_diag d;
    assert_int_equal(solve(p, "release.height", PLUMB_METRIC_DRIFT, 5000.0, NULL, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_UNLIMITED);
    double k = 0.5 * RHO * CD * AREA_M2;
    assert_true(r.metric_at_scan_hi > 0.0);
    assert_true(r.metric_at_scan_hi < (MASS_KG / k) * log(1.0 + k * 7.3 * 4e8 / MASS_KG));
    assert_null(strstr(r.explanation, "terminal speed"));
    assert_null(strstr(r.explanation, "nothing moves it sideways"));
    plumb_profile_free(p);
}

/* A fall that cannot be computed at the top of the scan (here past a
 * fall-time budget of 47.3 s) leaves those heights out; it does not fail
 * the answer. Drag-free, thrown east at 7.3 m/s: the fall lasts
 * T = sqrt(2 H / g0) and drifts 7.3 m/s x T (closed form, uniform motion
 * sideways, free fall down), so heights above g0 T^2 / 2 = 10 970 m run
 * past the budget, and a drift of 413.7 m (T = 56.67 s) is not reached at
 * any height computed: "not reached", with the highest height computed and
 * its drift, never "unlimited" nor a failure. */
static void test_a_fall_past_its_budget_at_the_scan_top_gives_not_reached(void **state)
{
    (void)state;
    plumb_profile *p = drag_free("{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}");
    plumb_trajectory_options to;
    plumb_trajectory_options_init(&to);
    to.max_time_s = 47.3;
    plumb_trajectory *short_traj = NULL;
    assert_int_equal(plumb_trajectory_alloc(&to, &short_traj), PLUMB_OK);
    plumb_limit_result r;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_DRIFT, 413.7,
                                       NULL, short_traj, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_NOT_REACHED);
    assert_int_equal(r.n_crossings, 0);
    assert_true(r.within_at_low_end);
    /* the scan: 0.0316 m x 10^(i/10) (inverse.h); the highest of them
     * under 10 970 m is i = 55, 9 992 m */
    double h_max = 0.5 * G0 * 47.3 * 47.3;
    assert_rel(r.scan_hi_si, HEIGHT_M / 1e3 * pow(10.0, 5.5), 1e-12);
    assert_true(r.scan_hi_si < h_max && r.scan_hi_si * pow(10.0, 0.1) > h_max);
    assert_rel(r.metric_at_scan_hi, 7.3 * sqrt(2.0 * r.scan_hi_si / G0), 1e-9);
    assert_non_null(strstr(r.explanation, "step or time budget"));
    /* the same solve with the default budget (86 400 s) finds the height
     * of the closed form, H = g0 (413.7 / 7.3)^2 / 2 = 15 748 m */
    assert_int_equal(solve(p, "release.height", PLUMB_METRIC_DRIFT, 413.7, NULL, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_rel(r.value_si, 0.5 * G0 * (413.7 / 7.3) * (413.7 / 7.3), 1e-9);
    plumb_trajectory_free(short_traj);
    plumb_profile_free(p);
}

static void test_an_item_whose_drag_lacks_the_key_is_not_applicable(void **state)
{
    (void)state;
    plumb_profile *p = load("name: kit\n"
                            "items:\n"
                            "  - {name: spanner, mass: 2.385 kg, drag: {cd: 0.93, area: 0.0187 m^2}}\n"
                            "  - {name: radio, mass: 0.412 kg, drag: {cd_area: 0.0063 m^2}}\n"
                            "release: {height: 31.6 m}\n");
    plumb_limit_result r;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 1, "payload.drag.cd", PLUMB_METRIC_ENERGY, 913.7,
                                       NULL, traj, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_NOT_APPLICABLE);
    assert_non_null(strstr(r.explanation, "does not use payload.drag.cd"));
    /* and there is no fall at an answer for it (inverse.h, plumb_limit_fall_at) */
    plumb_item_report *judged = calloc(1, sizeof *judged);
    assert_non_null(judged);
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_fall_at(p, units, 1, "payload.drag.cd", 1.0, traj, NULL, judged,
                                         &d),
                     PLUMB_EINVAL);
    assert_non_null(strstr(d.message, "does not use payload.drag.cd"));
    free(judged);
    plumb_profile_free(p);
}

/* Each item is answered against its own checks: a release height at or
 * below an item's deploy height is refused for that item (README,
 * descent.deploy.below: below the release height), but it is no bound on
 * another item's answer, since each item falls alone. For the drag-free
 * spanner of an inventory whose radio opens a streamer below 17.3 m, the
 * height for 250 J by the work-energy theorem, H = E/(m g0) = 10.69 m, lies
 * below the radio's deploy height and is the spanner's answer; so is
 * 21.38 m for 500 J. The radio's own scan starts above its 17.3 m and its
 * explanation names the check that bounds it. */
static void test_each_item_is_answered_against_its_own_checks(void **state)
{
    (void)state;
    plumb_profile *p = load("name: kit with a streamer\n"
                            "items:\n"
                            "  - {name: spanner, mass: 2.385 kg, drag: {cd: 0, area: 0.0117 m^2}}\n"
                            "  - name: radio\n"
                            "    mass: 0.412 kg\n"
                            "    drag: {cd_area: 0.0063 m^2}\n"
                            "    descent: {kind: streamer, cd: 0.4, area: 0.083 m^2,\n"
                            "              deploy: {below: 17.3 m}, fill_time: 0.2 s}\n"
                            "release: {height: 31.6 m}\n");
    plumb_limit_result r;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_ENERGY, 250.0,
                                       NULL, traj, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_rel(r.value_si, 250.0 / (MASS_KG * G0), 1e-9);
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_ENERGY, 500.0,
                                       NULL, traj, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_rel(r.value_si, 500.0 / (MASS_KG * G0), 1e-9);
    /* the radio: 0.1 J is below what any height above 17.3 m gives */
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 1, "release.height", PLUMB_METRIC_ENERGY, 0.1,
                                       NULL, traj, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_IMPOSSIBLE);
    assert_true(r.scan_lo_si > 17.3);
    assert_non_null(strstr(r.explanation, "descent.deploy.below"));
    plumb_profile_free(p);
}

/* ---- refusals ------------------------------------------------------------------ */

static void refused(const plumb_profile *p, size_t item, const char *key, double limit,
                    const plumb_limit_options *opt, plumb_status want, const char *dkey,
                    const char *part)
{
    plumb_limit_result r;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st =
        plumb_limit_solve(p, units, item, key, PLUMB_METRIC_ENERGY, limit, opt, traj, &r, &d);
    if (st != want || strcmp(d.key, dkey) != 0 || !strstr(d.message, part))
        fprintf(stderr, "%s: status %d key '%s': %s\n", key, (int)st, d.key, d.message);
    assert_int_equal(st, want);
    assert_int_equal(d.status, want);
    assert_string_equal(d.key, dkey);
    assert_non_null(strstr(d.message, part));
}

static void test_bad_limits_items_and_keys_are_refused_with_their_reason(void **state)
{
    (void)state;
    plumb_profile *p = drag_free("{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}");
    refused(p, 0, "release.height", 0.0, NULL, PLUMB_EINVAL, "", "finite value > 0");
    refused(p, 0, "release.height", -913.7, NULL, PLUMB_EINVAL, "", "finite value > 0");
    refused(p, 0, "release.height", NAN, NULL, PLUMB_EINVAL, "", "finite value > 0");
    refused(p, 0, "release.height", INFINITY, NULL, PLUMB_EINVAL, "", "finite value > 0");
    refused(p, 1, "release.height", 913.7, NULL, PLUMB_EINVAL, "", "item 1 does not exist");
    refused(p, 0, "release.hieght", 913.7, NULL, PLUMB_EKEY, "release.hieght", "height");
    refused(p, 0, "wind.profile", 913.7, NULL, PLUMB_EINVAL, "wind.profile", "not a numeric key");
    refused(p, 0, "wind.from", 913.7, NULL, PLUMB_EINVAL, "wind.from", "direction");
    refused(p, 0, "zone.scatter", 913.7, NULL, PLUMB_EINVAL, "zone.scatter",
            "cannot be solved for");
    plumb_profile_free(p);
    /* a profile whose own fall never lands has no answer: 47 g in 0.048 m^3
     * floats, rho V = 1.2250 x 0.048 = 0.0588 kg > 0.047 kg at sea level
     * (Archimedes' principle; rho of U.S. Standard Atmosphere 1976,
     * Table I, transcribed) */
    p = load("name: floating grip\n"
             "payload: {mass: 0.047 kg, volume: 0.048 m^3, drag: {cd_area: 0.0031 m^2}}\n"
             "release: {height: 25 m}\n");
    refused(p, 0, "release.height", 1.0, NULL, PLUMB_ENUMERIC, "release.height",
            "own value cannot be computed");
    plumb_profile_free(p);
}

/* solve/inverse_internal.h, plumbp_limit_solve_many: each limit's result
 * is the one a solve of its own gives, bit for bit, its count of falls
 * included, though the scan is made once; a limit that is refused is
 * refused alone. The constant-air body's release height for 3 energies,
 * one of them below any the scan reaches (none found) and one refused. */
static void test_limits_solved_together_are_those_solved_one_by_one(void **state)
{
    (void)state;
    plumb_profile *p = constant_air();
    const double lim[4] = {301.7, 88.25, -4.0, 0.731};
    plumb_limit_result many[4], one;
    plumb_status st[4];
    plumb_diag d[4], d1;
    for (int k = 0; k < 4; k++)
        plumb_diag_clear(&d[k]);
    plumbp_limit_solve_many(p, units, 0, "release.height", PLUMB_METRIC_ENERGY, lim, 4, NULL,
                            traj, many, st, d);
    for (int k = 0; k < 4; k++) {
        plumb_diag_clear(&d1);
        plumb_status st1 = plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_ENERGY,
                                             lim[k], NULL, traj, &one, &d1);
        assert_int_equal(st[k], st1);
        assert_memory_equal(&many[k], &one, sizeof one);
        if (st1 != PLUMB_OK)
            assert_string_equal(d[k].message, d1.message);
    }
    assert_int_equal(st[2], PLUMB_EINVAL);
    assert_int_equal(many[0].outcome, PLUMB_LIMIT_FOUND);
    assert_true(many[0].evaluations > 61); /* inverse.h: 61 values scanned, then Brent */
    plumb_profile_free(p);
}

static void test_running_out_of_falls_is_a_numerical_failure_naming_the_key(void **state)
{
    (void)state;
    plumb_profile *p = drag_free("{east: 7.3 m/s, north: 0 m/s, up: 0 m/s}");
    plumb_limit_options opt;
    plumb_limit_options_init(&opt);
    opt.max_evaluations = 7; /* fewer than the 61-value scan */
    refused(p, 0, "release.height", 913.7, &opt, PLUMB_ENUMERIC, "release.height",
            "no answer within 7 falls");
    plumb_profile_free(p);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_drag_free_height_for_an_energy_is_the_work_energy_height),
        cmocka_unit_test(test_drag_free_mass_for_an_energy_is_the_work_energy_mass),
        cmocka_unit_test(test_constant_air_height_for_a_speed_is_the_closed_form_height),
        cmocka_unit_test(test_constant_air_area_for_a_speed_is_the_closed_form_area),
        cmocka_unit_test(test_a_metric_even_in_its_key_has_two_crossings_and_takes_the_nearer),
        cmocka_unit_test(test_a_coarse_tolerance_still_reports_a_value_that_meets_the_limit),
        cmocka_unit_test(test_a_speed_limit_above_terminal_speed_is_unlimited_and_says_so),
        cmocka_unit_test(test_an_energy_below_the_release_energy_is_impossible_and_says_so),
        cmocka_unit_test(test_a_drift_nothing_moves_sideways_is_unlimited_and_says_why),
        cmocka_unit_test(test_a_drift_that_moves_sideways_is_not_explained_by_terminal_speed),
        cmocka_unit_test(test_a_fall_past_its_budget_at_the_scan_top_gives_not_reached),
        cmocka_unit_test(test_an_item_whose_drag_lacks_the_key_is_not_applicable),
        cmocka_unit_test(test_each_item_is_answered_against_its_own_checks),
        cmocka_unit_test(test_bad_limits_items_and_keys_are_refused_with_their_reason),
        cmocka_unit_test(test_running_out_of_falls_is_a_numerical_failure_naming_the_key),
        cmocka_unit_test(test_limits_solved_together_are_those_solved_one_by_one),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
