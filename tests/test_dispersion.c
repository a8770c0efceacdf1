/*
 * test_dispersion.c - the Monte Carlo clearance zone against closed forms
 * and the definitions of its statistics.
 *
 * Sources:
 *  - Drag-free fall from height H with constant g: time sqrt(2H/g), impact
 *    speed^2 = v0^2 + 2 g H, range v_h (v_z + sqrt(v_z^2 + 2 g H)) / g (any
 *    mechanics text, e.g. Marion & Thornton, Classical Dynamics, ch. 2).
 *  - With a normal horizontal release velocity of sd sigma per axis the
 *    drift is Rayleigh with scale s = sigma sqrt(2H/g):
 *    P(R <= r) = 1 - exp(-r^2 / (2 s^2)), r_p = s sqrt(-2 ln(1 - p))
 *    (Papoulis & Pillai, Probability, Random Variables and Stochastic
 *    Processes, 4th ed., sec. 6-2 / 5-4, Rayleigh density).
 *  - Moments: uniform mean (a+b)/2, variance (b-a)^2/12; triangular mean
 *    (a+b+c)/3, variance (a^2+b^2+c^2-ab-ac-bc)/18 (Kotz & van Dorp, Beyond
 *    Beta, 2004, ch. 1); half-normal mean sigma sqrt(2/pi), variance
 *    sigma^2 (1 - 2/pi), kurtosis 3 + 8(pi-3)/(pi-2)^2; truncated normal
 *    mean mu + sigma phi(a)/(1 - Phi(a)), a = -mu/sigma (Johnson, Kotz &
 *    Balakrishnan, Continuous Univariate Distributions vol. 1, 2nd ed.,
 *    sec. 10.1). Kurtosis of normal 3, uniform 1.8, triangular 2.4 (same
 *    sources). Sample variance standard error sqrt((kurtosis - 1) / n)
 *    sigma^2 (large-sample, Cramer, Mathematical Methods of Statistics,
 *    sec. 27.4).
 *  - Clopper & Pearson, Biometrika 26, 404 (1934): at k = 0 the upper bound
 *    is 1 - (a/2)^(1/n), at k = n the lower bound (a/2)^(1/n); in general
 *    lo = Beta^-1(a/2; k, n-k+1), hi = Beta^-1(1-a/2; k+1, n-k), checked
 *    against GSL's gsl_cdf_beta_Pinv where it converges (small n).
 *  - Order-statistic interval for a quantile: P(Bin(n,p) >= l) >= 1 - a/2,
 *    P(Bin(n,p) <= u - 1) >= 1 - a/2 (David & Nagaraja, Order Statistics,
 *    3rd ed., sec. 7.1), checked with GSL's gsl_cdf_binomial_P.
 *  - The 95% ellipse of a bivariate normal: semi-axes sqrt(chi2_2(0.95)
 *    lambda) with chi2_2(0.95) = -2 ln 0.05 = 5.991 (Johnson & Wichern,
 *    Applied Multivariate Statistical Analysis, 6th ed., result 4.7).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include <gsl/gsl_cdf.h>

#include "plumb/plumb.h"
#include "plumb/dispersion.h"
#include "plumb_test.h"

/* ---- helpers of this file ------------------------------------------------ */

/* A drag-free (cd 0) payload dropped from h_m, constant g0, calm air. */
static void drag_free_spec(plumb_fall_spec *s, double mass_kg, double h_m)
{
    memset(s, 0, sizeof *s);
    snprintf(s->name, sizeof s->name, "drag-free test mass");
    s->mass_kg = mass_kg;
    s->drag.model = PLUMB_DRAG_FIXED;
    s->drag.cd = 0.0;
    s->drag.area_m2 = 0.0187;
    s->release_m[2] = h_m;
    plumb_wind_spec_init(&s->wind);
}

/* An invented drone payload release: 0.485 kg pouch, 31.6 m, log-law wind. */
static void drone_spec(plumb_fall_spec *s)
{
    memset(s, 0, sizeof *s);
    snprintf(s->name, sizeof s->name, "test pouch");
    s->mass_kg = 0.485;
    s->drag.model = PLUMB_DRAG_FIXED;
    s->drag.cd = 1.03;
    s->drag.area_m2 = 0.0371;
    s->release_m[2] = 31.6;
    s->velocity_m_s[0] = -6.37;
    s->velocity_m_s[1] = 1.13;
    s->site_elevation_m = 1630.0;
    s->gravity.has_latitude = 1;
    s->gravity.latitude_deg = -31.4;
    plumb_wind_spec_init(&s->wind);
    s->wind.profile = PLUMB_WIND_LOG;
    s->wind.speed_m_s = 5.7;
    s->wind.from_deg = 281.0;
}

static plumb_uncertainty unc(const char *key, plumb_dist_kind kind, double a, double b, double c)
{
    plumb_uncertainty u;
    memset(&u, 0, sizeof u);
    snprintf(u.key, sizeof u.key, "%s", key);
    u.kind = kind;
    u.param[0] = a;
    u.param[1] = b;
    u.param[2] = c;
    u.line = 17;
    u.col = 3;
    return u;
}

static plumb_zone_spec zone_spec(size_t n, unsigned long seed, double confidence)
{
    plumb_zone_spec z;
    memset(&z, 0, sizeof z);
    z.samples = n;
    z.seed = seed;
    z.confidence = confidence;
    z.scatter_m = 1.73;
    return z;
}

/* A criterion made for a test, with a chosen limit. */
static plumb_criterion test_criterion(const char *id, double limit_j)
{
    plumb_criterion c;
    memset(&c, 0, sizeof c);
    snprintf(c.id, sizeof c.id, "%s", id);
    snprintf(c.name, sizeof c.name, "test limit %s", id);
    c.energy_limit_j = limit_j;
    return c;
}

static const double rad_p[PLUMB_ZONE_RADII] = {0.5, 0.9, 0.99, 0.999};

/* ---- 1. Rayleigh drift ------------------------------------------------------ */

/* Closed form: drag-free drift with normal release velocity is Rayleigh,
 * r_p = sigma sqrt(2H/g) sqrt(-2 ln(1-p)) (Papoulis, Rayleigh density).
 * Four percentiles are checked in one run, so each interval is taken at
 * 1 - 0.05/4 (Bonferroni): together they miss with probability <= 5%. Each
 * estimate is also within 4 asymptotic standard errors of the closed form,
 * sqrt(p(1-p)/N) / f(r_p) (Cramer, Mathematical Methods of Statistics,
 * sec. 28.5). */
static void test_drag_free_drift_with_normal_release_velocity_is_rayleigh(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    const double H = 37.3, sigma = 1.85, m = 1.937;
    plumb_fall_spec s;
    drag_free_spec(&s, m, H);
    plumb_uncertainty u[2] = {unc("release.velocity.east", PLUMB_DIST_NORMAL, 0.0, sigma, 0.0),
                              unc("release.velocity.north", PLUMB_DIST_NORMAL, 0.0, sigma, 0.0)};
    plumb_zone_spec z = zone_spec(20000, 20261201, 0.99);
    static plumb_zone_result r, r95;
    plumb_diag d;
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.ci_level = 1.0 - 0.05 / PLUMB_ZONE_RADII;
    assert_int_equal(plumb_zone_run(&s, atm, u, 2, &z, NULL, 0, &o, &r, &d), PLUMB_OK);
    assert_int_equal(plumb_zone_run(&s, atm, u, 2, &z, NULL, 0, NULL, &r95, &d), PLUMB_OK);
    const double t = sqrt(2.0 * H / PLUMB_G0_M_S2), scale = sigma * t;
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        double want = scale * sqrt(-2.0 * log1p(-rad_p[i]));
        double f = want / (scale * scale) * exp(-want * want / (2.0 * scale * scale));
        double se = sqrt(rad_p[i] * (1.0 - rad_p[i]) / (double)z.samples) / f;
        assert_abs(r.zone.radius[i].value, want, 4.0 * se);
        /* the estimate does not depend on the interval level; the 95%
         * interval lies inside the wider one */
        assert_rel(r95.zone.radius[i].value, r.zone.radius[i].value, 0.0);
        assert_true(r.zone.radius[i].lo <= r95.zone.radius[i].lo &&
                    r95.zone.radius[i].hi <= r.zone.radius[i].hi);
        const plumb_zone_quantile *q = &r.zone.radius[i];
        assert_false(q->lo_open);
        assert_false(q->hi_open);
        if (!(q->lo <= want && want <= q->hi))
            fail_msg("p = %g: closed form %.6g m outside [%.6g, %.6g] m (estimate %.6g m)",
                     rad_p[i], want, q->lo, q->hi, q->value);
        assert_true(q->lo <= q->value && q->value <= q->hi);
    }
    /* the clearance radius is the upper bound of the 99% radius plus the scatter */
    assert_rel(r.zone.clearance_radius_m, r.zone.radius_conf.hi + 1.73, 1e-15);
    assert_rel(r.zone.radius_conf.hi, r.zone.radius[2].hi, 1e-15);
    /* bivariate normal impact cloud: mean 0, covariance s^2 I (5 standard errors) */
    double n = (double)z.samples;
    assert_abs(r.zone.mean_m[0], 0.0, 5.0 * scale / sqrt(n));
    assert_abs(r.zone.mean_m[1], 0.0, 5.0 * scale / sqrt(n));
    assert_rel(r.zone.cov_m2[0], scale * scale, 5.0 * sqrt(2.0 / n));
    assert_rel(r.zone.cov_m2[1], scale * scale, 5.0 * sqrt(2.0 / n));
    assert_abs(r.zone.cov_m2[2], 0.0, 5.0 * scale * scale / sqrt(n));
    /* 95% ellipse of a circular normal: radius sqrt(5.991) s (Johnson & Wichern) */
    assert_rel(r.zone.ellipse_chi2, 5.991464547107979, 1e-12);
    assert_rel(r.zone.semi_major_m, sqrt(5.991464547107979) * scale, 0.03);
    assert_rel(r.zone.semi_minor_m, sqrt(5.991464547107979) * scale, 0.03);
    /* level throw: the rule of thumb v_h,max sqrt(2H/g) is the largest drift */
    assert_rel(r.zone.ballistic_throw_m, r.zone.max_release_speed_m_s * t, 1e-12);
    assert_rel(r.zone.radius_max_m, r.zone.ballistic_throw_m, 1e-9);
    assert_rel(r.zone.drop_height_m, H, 1e-15);
    /* energy: 1/2 m (v0^2 + 2 g H) with v0^2 = sigma^2 chi2_2: median at
     * v0^2 = 2 sigma^2 ln 2 */
    assert_true(r.zone.energy[0].lo <= 0.5 * m * (2.0 * sigma * sigma * log(2.0) + 2.0 * PLUMB_G0_M_S2 * H));
    assert_true(r.zone.energy[0].hi >= 0.5 * m * (2.0 * sigma * sigma * log(2.0) + 2.0 * PLUMB_G0_M_S2 * H));
    plumb_atmosphere_free(atm);
}

/* Drag-free throw with an upward component: range v_h (v_z + sqrt(v_z^2 +
 * 2 g H)) / g; with v_z fixed the fastest sample throws farthest. */
static void test_ballistic_throw_includes_the_upward_release_component(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    const double H = 12.7, vz = 2.37;
    plumb_fall_spec s;
    drag_free_spec(&s, 0.731, H);
    s.velocity_m_s[2] = vz;
    plumb_uncertainty u[1] = {unc("release.velocity.east", PLUMB_DIST_UNIFORM, 1.9, 4.3, 0.0)};
    plumb_zone_spec z = zone_spec(600, 5, 0.9);
    static plumb_zone_result r;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_OK);
    double vmax = r.zone.max_release_speed_m_s, vh = sqrt(vmax * vmax - vz * vz);
    double g = PLUMB_G0_M_S2;
    assert_rel(r.zone.ballistic_throw_m, vh * (vz + sqrt(vz * vz + 2.0 * g * H)) / g, 1e-12);
    assert_rel(r.zone.radius_max_m, r.zone.ballistic_throw_m, 1e-9);
    assert_true(vh <= 4.3 && vh > 4.2); /* the largest of 600 uniform draws on [1.9, 4.3] */
    plumb_atmosphere_free(atm);
}

/* Johnson & Wichern result 4.7: the ellipse axes follow the covariance's
 * eigenvectors; east sd 3.1 m, north sd 1.2 m puts the major axis east. */
static void test_ellipse_major_axis_follows_the_larger_spread(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_fall_spec s;
    drag_free_spec(&s, 2.385, 23.9);
    s.velocity_m_s[1] = 1.41;
    plumb_uncertainty u[2] = {unc("release.position.east", PLUMB_DIST_NORMAL, 0.0, 3.1, 0.0),
                              unc("release.position.north", PLUMB_DIST_NORMAL, 0.0, 1.2, 0.0)};
    plumb_zone_spec z = zone_spec(4000, 77, 0.9);
    static plumb_zone_result r;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, u, 2, &z, NULL, 0, NULL, &r, &d), PLUMB_OK);
    double k = sqrt(-2.0 * log(0.05));
    assert_rel(r.zone.semi_major_m, k * 3.1, 0.05);
    assert_rel(r.zone.semi_minor_m, k * 1.2, 0.05);
    assert_abs(r.zone.bearing_deg > 90.0 ? r.zone.bearing_deg - 90.0 : 90.0 - r.zone.bearing_deg,
               0.0, 3.0);
    /* the mean lands where the deterministic drift puts it: north 1.41 sqrt(2H/g) */
    assert_abs(r.zone.mean_m[1], 1.41 * sqrt(2.0 * 23.9 / PLUMB_G0_M_S2), 5.0 * 1.2 / sqrt(4000.0));
    plumb_atmosphere_free(atm);
}

/* ---- 2. coverage ------------------------------------------------------------ */

/* Order-statistic intervals at 95% (David & Nagaraja sec. 7.1) and
 * Clopper-Pearson intervals for an exceedance probability, over 200 runs of
 * 200 samples: each should cover the true value (Rayleigh closed form;
 * P(E > L) = exp(-v*^2 / (2 sigma^2)), v*^2 = 2L/m - 2gH) in at least 93%
 * of the runs. The exact coverage of the order-statistic intervals at
 * n = 200 is P(l <= Bin(200, p) < u), at least 95%. */
static void test_intervals_cover_the_true_values_in_at_least_93_percent_of_200_runs(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    const double H = 9.31, sigma = 2.17, m = 0.613, g = PLUMB_G0_M_S2;
    plumb_fall_spec s;
    drag_free_spec(&s, m, H);
    plumb_uncertainty u[2] = {unc("release.velocity.east", PLUMB_DIST_NORMAL, 0.0, sigma, 0.0),
                              unc("release.velocity.north", PLUMB_DIST_NORMAL, 0.0, sigma, 0.0)};
    const double p_exceed = 0.31;
    double vstar2 = -2.0 * sigma * sigma * log(p_exceed);
    plumb_criterion crit = test_criterion("coverage", 0.5 * m * (vstar2 + 2.0 * g * H));
    const plumb_criterion *cl[1] = {&crit};
    const double scale = sigma * sqrt(2.0 * H / g);
    const double r50 = scale * sqrt(2.0 * log(2.0)), r90 = scale * sqrt(-2.0 * log(0.1));
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.threads = 1;
    int cover50 = 0, cover90 = 0, cover_ex = 0;
    const int runs = 200;
    for (int k = 0; k < runs; k++) {
        plumb_zone_spec z = zone_spec(200, 1000u + (unsigned long)k, 0.9);
        static plumb_zone_result r;
        plumb_diag d;
        assert_int_equal(plumb_zone_run(&s, atm, u, 2, &z, cl, 1, &o, &r, &d), PLUMB_OK);
        cover50 += r.zone.radius[0].lo <= r50 && r50 <= r.zone.radius[0].hi;
        cover90 += r.zone.radius[1].lo <= r90 && r90 <= r.zone.radius[1].hi;
        cover_ex += r.zone.exceedance[0].lo <= p_exceed && p_exceed <= r.zone.exceedance[0].hi;
    }
    assert_true(cover50 >= 186);
    assert_true(cover90 >= 186);
    assert_true(cover_ex >= 186);
    plumb_atmosphere_free(atm);
}

/* criteria.h: a limit is exceeded above it, or from it on for a limit
 * worded "less than" (EU 2019/945 C1, `exceeded_when: at-or-above`): with
 * every sample exactly at the limit, the probability is 0 or 1. */
static void test_exceedance_follows_the_criterion_wording_at_the_limit(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_fall_spec s;
    drag_free_spec(&s, 1.377, 14.2);
    plumb_zone_spec z = zone_spec(400, 9, 0.9);
    static plumb_zone_result r;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, NULL, 0, &z, NULL, 0, NULL, &r, &d), PLUMB_OK);
    double e0 = r.zone.energy_max_j; /* every sample is the same fall */
    assert_rel(r.zone.energy[0].value, e0, 0.0);
    plumb_criterion above = test_criterion("above", e0), at = test_criterion("at-or-above", e0);
    at.strict = 1;
    const plumb_criterion *cl[2] = {&above, &at};
    assert_int_equal(plumb_zone_run(&s, atm, NULL, 0, &z, cl, 2, NULL, &r, &d), PLUMB_OK);
    assert_int_equal(r.zone.exceedance[0].count, 0);
    assert_int_equal(r.zone.exceedance[1].count, 400);
    assert_rel(r.zone.exceedance[1].probability, 1.0, 0.0);
    /* Clopper-Pearson at k = n: lower bound 0.025^(1/n) */
    assert_rel(r.zone.exceedance[1].lo, pow(0.025, 1.0 / 400.0), 1e-14);
    plumb_atmosphere_free(atm);
}

/* ---- 3. determinism --------------------------------------------------------- */

static void drone_uncertainty(plumb_uncertainty *u)
{
    u[0] = unc("payload.drag.cd", PLUMB_DIST_TRIANGULAR, 0.81, 0.97, 1.07);
    u[1] = unc("wind.speed", PLUMB_DIST_NORMAL, 5.7, 1.6, 0.0);
    u[2] = unc("wind.from", PLUMB_DIST_UNIFORM, 346.0, 13.0, 0.0);
    u[3] = unc("release.velocity.speed", PLUMB_DIST_UNIFORM, 5.9, 7.1, 0.0);
    u[4] = unc("release.velocity.heading", PLUMB_DIST_NORMAL, 280.0, 6.5, 0.0);
    u[5] = unc("release.position.east", PLUMB_DIST_NORMAL, 0.0, 1.45, 0.0);
    u[6] = unc("payload.mass", PLUMB_DIST_NORMAL, 0.485, 0.031, 0.0);
}

/* README.md "plumb zone": each sample's stream comes from (seed, index), so
 * the result is the same for any thread count and block size, and for the
 * same seed on every run (compared byte for byte). */
static void test_zone_is_identical_for_one_two_and_three_threads(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(17.0);
    plumb_fall_spec s;
    drone_spec(&s);
    plumb_uncertainty u[7];
    drone_uncertainty(u);
    plumb_zone_spec z = zone_spec(1100, 4242, 0.99);
    z.has_target = 1;
    z.target_m[0] = -18.3;
    z.target_m[1] = 2.9;
    plumb_criterion c1 = test_criterion("a", 33.895), c2 = test_criterion("b", 61.0);
    const plumb_criterion *cl[2] = {&c1, &c2};
    static plumb_zone_result r[5];
    const size_t threads[5] = {1, 2, 3, 2, 1};
    const size_t blocks[5] = {256, 256, 256, 37, 256};
    for (int k = 0; k < 5; k++) {
        plumb_zone_options o;
        plumb_zone_options_init(&o);
        o.threads = threads[k];
        o.block_samples = blocks[k];
        plumb_diag d;
        assert_int_equal(plumb_zone_run(&s, atm, u, 7, &z, cl, 2, &o, &r[k], &d), PLUMB_OK);
    }
    for (int k = 1; k < 5; k++)
        assert_memory_equal(&r[0], &r[k], sizeof r[0]);
    assert_true(r[0].has_target);
    /* a different seed gives a different cloud */
    z.seed = 4243;
    static plumb_zone_result other;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, u, 7, &z, cl, 2, NULL, &other, &d), PLUMB_OK);
    assert_true(other.zone.mean_m[0] != r[0].zone.mean_m[0]);
    plumb_atmosphere_free(atm);
}

/* ---- descent devices that do not open ---------------------------------------- */

/* A bag under a parachute that opens `after_s` after release, from 30 m. */
static void late_chute_spec(plumb_fall_spec *s, double after_s)
{
    drag_free_spec(s, 1.213, 30.0);
    s->drag.cd = 0.93;
    s->descent[0].kind = PLUMB_DESCENT_PARACHUTE;
    s->descent[0].cd = 0.78;
    s->descent[0].area_m2 = 1.47;
    s->descent[0].trigger = PLUMB_DEPLOY_AFTER;
    s->descent[0].deploy_value = after_s;
    s->descent[0].fill_time_s = 0.8;
    s->n_descent = 1;
}

typedef struct times {
    size_t n;
    double t[600];
} times;

static int keep_time(void *user, int pass, size_t index, const plumb_zone_sample *smp)
{
    times *tm = user;
    if (pass == 0 && index < 600) {
        tm->t[index] = smp->time_s;
        tm->n = index + 1;
    }
    return 0;
}

/* The zone says when a device did not open before impact in some samples,
 * or was still filling at impact (as plumb fall does for its one fall),
 * with both counts. The count is
 * checked by logic, not by the deployed[] flags it is made from: a device
 * set to open `after` a time opens if and only if the body is still in
 * the air then, so it stayed shut in exactly the samples whose drawn
 * deploy time (plumb_sampler_draw, the same (seed, index) stream as the
 * zone's: dispersion.h) is at least their impact time. A warning is part
 * of the result, so it too is the same for one and three threads. */
static void test_a_device_that_does_not_open_in_some_samples_is_counted_in_a_warning(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(15.0);
    plumb_fall_spec s;
    late_chute_spec(&s, 2.9);
    /* deploy times around the fall time (about 2.6 s from 30 m) */
    plumb_uncertainty u[2] = {unc("descent.deploy.after", PLUMB_DIST_UNIFORM, 1.3, 4.7, 0.0),
                              unc("wind.speed", PLUMB_DIST_UNIFORM, 0.5, 6.1, 0.0)};
    plumb_zone_spec z = zone_spec(600, 8311, 0.9);
    static times tm;
    static plumb_zone_result r[2];
    for (int k = 0; k < 2; k++) {
        plumb_zone_options o;
        plumb_zone_options_init(&o);
        o.threads = k == 0 ? 1 : 3;
        o.block_samples = 64;
        o.on_sample = keep_time;
        o.sample_user = &tm;
        plumb_diag d;
        plumb_diag_clear(&d);
        if (plumb_zone_run(&s, atm, u, 2, &z, NULL, 0, &o, &r[k], &d) != PLUMB_OK)
            fail_msg("%s: %s", d.key, d.message);
    }
    assert_memory_equal(&r[0], &r[1], sizeof r[0]);
    assert_int_equal(tm.n, 600);
    plumb_sampler *smp = NULL;
    plumb_diag d;
    assert_int_equal(plumb_sampler_alloc(&s, u, 2, NULL, &smp, &d), PLUMB_OK);
    /* line stretch at the deploy time t_d (a timed deployment), and a fixed
     * fill time t_f = 0.8 s: a canopy is still filling at impact when
     * t_d < t_impact < t_d + t_f (the definition of the fill time) */
    size_t shut = 0, filling = 0;
    for (size_t i = 0; i < 600; i++) {
        plumb_fall_spec drawn;
        assert_int_equal(plumb_sampler_draw(smp, z.seed, i, &drawn, NULL, NULL, &d), PLUMB_OK);
        double td = drawn.descent[0].deploy_value;
        shut += td >= tm.t[i];
        filling += td < tm.t[i] && tm.t[i] < td + drawn.descent[0].fill_time_s;
    }
    plumb_sampler_free(smp);
    assert_true(shut > 0 && shut < 600); /* some open, some do not */
    assert_true(filling > 0 && shut + filling < 600); /* and some are still filling */
    char want[PLUMB_ZONE_WARNING];
    size_t k = shut + filling;
    snprintf(want, sizeof want, "The parachute (descent[0]) was not fully open at impact in %zu "
             "of 600 samples (%.1f %%): in %zu (%.1f %%) it did not open before impact, in %zu "
             "(%.1f %%) it was still filling. Those land faster than under the open parachute: "
             "without it, or under a part-filled canopy.", k, 100.0 * (double)k / 600.0, shut,
             100.0 * (double)shut / 600.0, filling, 100.0 * (double)filling / 600.0);
    size_t found = 0;
    for (size_t i = 0; i < r[0].n_warnings; i++)
        found += strcmp(r[0].warnings[i], want) == 0;
    if (found != 1)
        fail_msg("no warning \"%s\" (%zu warnings; first: %s)", want, r[0].n_warnings,
                 r[0].n_warnings ? r[0].warnings[0] : "");

    /* opening 60 s after release from 30 m: every fall lands first (each
     * impact time is below 60 s), so none opens, and the warning says so */
    late_chute_spec(&s, 60.0);
    plumb_uncertainty w[1] = {unc("wind.speed", PLUMB_DIST_UNIFORM, 0.5, 6.1, 0.0)};
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.on_sample = keep_time;
    o.sample_user = &tm;
    assert_int_equal(plumb_zone_run(&s, atm, w, 1, &z, NULL, 0, &o, &r[0], &d), PLUMB_OK);
    for (size_t i = 0; i < 600; i++)
        assert_true(tm.t[i] < 60.0);
    assert_int_equal(r[0].n_warnings, 1);
    assert_string_equal(r[0].warnings[0], "The parachute (descent[0]) did not open before impact "
                                          "in any of the 600 samples: every figure is that of a "
                                          "fall without it.");
    /* opening at once (after 0 s): every one opens, no warning */
    late_chute_spec(&s, 0.0);
    assert_int_equal(plumb_zone_run(&s, atm, w, 1, &z, NULL, 0, &o, &r[0], &d), PLUMB_OK);
    assert_int_equal(r[0].n_warnings, 0);
    plumb_atmosphere_free(atm);
}

/* ---- 4. histogram against an exact sort -------------------------------------- */

typedef struct collected {
    size_t n;
    double *e, *no, *energy;
    int in_order;
} collected;

static int collect(void *user, int pass, size_t index, const plumb_zone_sample *smp)
{
    collected *c = user;
    if (pass != 0)
        return 1;
    if (index != c->n)
        c->in_order = 0;
    c->e[c->n] = smp->point_m[0];
    c->no[c->n] = smp->point_m[1];
    c->energy[c->n] = smp->energy_j;
    c->n++;
    return 0;
}

static int cmp_d(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

static size_t rank_of(double p, size_t n)
{
    double x = p * (double)n;
    size_t k = (size_t)ceil(x - 1e-9);
    return k < 1 ? 1 : k > n ? n : k;
}

/* The estimate is the ceil(pN)-th smallest sample and the interval ends are
 * the order statistics l and u: compare with an exact sort of the same
 * 1e5 samples, to 0.1% of the value (the acceptance bound; bins are
 * 2^-12 of their value wide). Mean and covariance against a two-pass sum. */
static void test_binned_percentiles_match_an_exact_sort_of_1e5_samples(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_fall_spec s;
    drag_free_spec(&s, 1.217, 17.9);
    s.velocity_m_s[0] = 2.3;
    plumb_uncertainty u[3] = {unc("release.velocity.east", PLUMB_DIST_NORMAL, 2.3, 1.6, 0.0),
                              unc("release.velocity.north", PLUMB_DIST_UNIFORM, -0.7, 3.9, 0.0),
                              unc("release.height", PLUMB_DIST_TRIANGULAR, 15.2, 17.9, 21.4)};
    const size_t n = 100000;
    plumb_zone_spec z = zone_spec(n, 99, 0.999);
    collected c = {0, malloc(n * sizeof(double)), malloc(n * sizeof(double)),
                   malloc(n * sizeof(double)), 1};
    assert_non_null(c.e);
    assert_non_null(c.no);
    assert_non_null(c.energy);
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.on_sample = collect;
    o.sample_user = &c;
    static plumb_zone_result r;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, u, 3, &z, NULL, 0, &o, &r, &d), PLUMB_OK);
    assert_int_equal(c.n, n);
    assert_true(c.in_order);

    double me = 0.0, mn = 0.0;
    for (size_t i = 0; i < n; i++) {
        me += c.e[i];
        mn += c.no[i];
    }
    me /= (double)n;
    mn /= (double)n;
    double see = 0.0, snn = 0.0, sen = 0.0;
    for (size_t i = 0; i < n; i++) {
        see += (c.e[i] - me) * (c.e[i] - me);
        snn += (c.no[i] - mn) * (c.no[i] - mn);
        sen += (c.e[i] - me) * (c.no[i] - mn);
    }
    assert_rel(r.zone.mean_m[0], me, 1e-12);
    assert_rel(r.zone.mean_m[1], mn, 1e-12);
    assert_rel(r.zone.cov_m2[0], see / (double)(n - 1), 1e-10);
    assert_rel(r.zone.cov_m2[1], snn / (double)(n - 1), 1e-10);
    assert_rel(r.zone.cov_m2[2], sen / (double)(n - 1), 1e-9);

    double *rad = malloc(n * sizeof *rad);
    assert_non_null(rad);
    for (size_t i = 0; i < n; i++)
        rad[i] = hypot(c.e[i], c.no[i]);
    qsort(rad, n, sizeof *rad, cmp_d);
    qsort(c.energy, n, sizeof *c.energy, cmp_d);
    qsort(c.e, n, sizeof *c.e, cmp_d);
    qsort(c.no, n, sizeof *c.no, cmp_d);
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        const plumb_zone_quantile *q = &r.zone.radius[i];
        size_t l, uu;
        assert_int_equal(plumb_quantile_ranks(n, rad_p[i], 0.95, &l, &uu), PLUMB_OK);
        assert_rel(q->value, rad[rank_of(rad_p[i], n) - 1], 1e-3);
        assert_rel(q->lo, rad[l - 1], 1e-3);
        assert_rel(q->hi, rad[uu - 1], 1e-3);
    }
    const double ep[PLUMB_ZONE_ENERGIES] = {0.5, 0.95, 0.99};
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++)
        assert_rel(r.zone.energy[i].value, c.energy[rank_of(ep[i], n) - 1], 1e-3);
    assert_rel(r.zone.energy_max_j, c.energy[n - 1], 1e-15);
    assert_rel(r.zone.radius_max_m, rad[n - 1], 1e-15);
    /* component medians of the displacement, to 0.1% of the spread */
    assert_abs(r.zone.displacement[0].value, c.e[rank_of(0.5, n) - 1], 1e-3 * sqrt(see / (double)n));
    assert_abs(r.zone.displacement[1].value, c.no[rank_of(0.5, n) - 1], 1e-3 * sqrt(snn / (double)n));
    free(rad);
    free(c.e);
    free(c.no);
    free(c.energy);
    plumb_atmosphere_free(atm);
}

/* ---- 5. targeting ------------------------------------------------------------ */

/* Released at target - median displacement, the median impact lands on the
 * target: the target lies inside the median's interval, each component. */
static void test_release_point_puts_the_median_impact_on_the_target(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_std_air(17.0);
    plumb_fall_spec s;
    drone_spec(&s);
    plumb_uncertainty u[7];
    drone_uncertainty(u);
    plumb_zone_spec z = zone_spec(2000, 31, 0.99);
    z.has_target = 1;
    z.target_m[0] = -20.4;
    z.target_m[1] = 3.7;
    static plumb_zone_result r;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, u, 7, &z, NULL, 0, NULL, &r, &d), PLUMB_OK);
    assert_true(r.has_target);
    for (int k = 0; k < 2; k++) {
        assert_rel(r.aim_release_m[k], z.target_m[k] - r.zone.displacement[k].value, 1e-15);
        assert_rel(r.at_target.release_m[k], r.aim_release_m[k], 1e-15);
        assert_rel(r.at_target.centre_m[k], z.target_m[k], 1e-15);
        const plumb_zone_quantile *q = &r.at_target.displacement[k];
        double lo = r.aim_release_m[k] + q->lo, hi = r.aim_release_m[k] + q->hi;
        assert_true(lo <= z.target_m[k] && z.target_m[k] <= hi);
    }
    /* the cloud moved with the release point (wind and air depend on height
     * only): mean impact minus release is unchanged, to the integrator's
     * tolerance, which is relative to |x| and so to the shifted position */
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    for (int k = 0; k < 2; k++) {
        double moved = r.at_target.mean_m[k] - r.at_target.release_m[k];
        double was = r.zone.mean_m[k] - r.zone.release_m[k];
        double shift = fabs(r.at_target.release_m[k] - r.zone.release_m[k]);
        assert_abs(moved, was, o.trajectory.rel_tol * (shift + fabs(was)));
    }
    plumb_atmosphere_free(atm);
}

/* ---- 6. distributions -------------------------------------------------------- */

typedef struct moments {
    double mean, var;
} moments;

static moments sample_moments(const double *x, size_t n)
{
    double m = 0.0;
    for (size_t i = 0; i < n; i++)
        m += x[i];
    m /= (double)n;
    double v = 0.0;
    for (size_t i = 0; i < n; i++)
        v += (x[i] - m) * (x[i] - m);
    return (moments){m, v / (double)(n - 1)};
}

/* Mean within 5 standard errors; variance within 5 standard errors of the
 * sample variance, sqrt((kurtosis - 1) / n) var (Cramer sec. 27.4). */
static void check_moments(const double *x, size_t n, double mean, double var, double kurtosis)
{
    moments got = sample_moments(x, n);
    assert_abs(got.mean, mean, 5.0 * sqrt(var / (double)n));
    assert_abs(got.var, var, 5.0 * var * sqrt((kurtosis - 1.0) / (double)n));
}

/* A normal near the top of a wind speed's range (the sea-level speed of
 * sound, US Std Atm 1976) is cut there and only there: the end at 0 lies
 * 33 sd below and cuts nothing worth reporting. */
static void test_a_normal_is_reported_cut_only_where_its_range_cuts_it(void **state)
{
    (void)state;
    plumb_fall_spec s;
    drone_spec(&s);
    s.wind.profile = PLUMB_WIND_UNIFORM;
    plumb_uncertainty u[1] = {unc("wind.speed", PLUMB_DIST_NORMAL, 330.0, 10.0, 0.0)};
    plumb_sampler *sm = NULL;
    plumb_diag d;
    assert_int_equal(plumb_sampler_alloc(&s, u, 1, "t.yaml", &sm, &d), PLUMB_OK);
    double lo = 0.0, hi = 0.0;
    assert_true(plumb_sampler_truncated(sm, 0, &lo, &hi));
    assert_true(isinf(lo) && lo < 0.0);
    assert_abs(hi, PLUMB_SOUND_SPEED_SL_M_S, 0.0);
    plumb_sampler_free(sm);
}

/* A distribution of zero width gives every sample the same value: a zone
 * needs spread (README.md, "plumb zone"), so each form is refused at its
 * entry (file, line, column, key), even beside an input that varies. */
static void test_a_zero_width_distribution_is_refused_at_its_key(void **state)
{
    (void)state;
    plumb_fall_spec s;
    drone_spec(&s);
    s.wind.profile = PLUMB_WIND_UNIFORM;
    const plumb_uncertainty zero[] = {
        unc("wind.speed", PLUMB_DIST_NORMAL, 6.3, 0.0, 0.0),
        unc("wind.speed", PLUMB_DIST_UNIFORM, 6.3, 6.3, 0.0),
        unc("wind.speed", PLUMB_DIST_TRIANGULAR, 6.3, 6.3, 6.3),
        unc("wind.from", PLUMB_DIST_UNIFORM, 247.0, 247.0, 0.0),
    };
    for (size_t k = 0; k < sizeof zero / sizeof zero[0]; k++) {
        plumb_uncertainty u[2] = {unc("release.position.east", PLUMB_DIST_NORMAL, 0.0, 1.7, 0.0),
                                  zero[k]};
        u[1].line = 23;
        plumb_sampler *sm = NULL;
        plumb_diag d;
        memset(&d, 0, sizeof d);
        assert_int_equal(plumb_sampler_alloc(&s, u, 2, "t.yaml", &sm, &d), PLUMB_EINVAL);
        assert_null(sm);
        assert_string_equal(d.key, zero[k].key);
        assert_string_equal(d.file, "t.yaml");
        assert_int_equal(d.line, 23);
        assert_int_equal(d.col, 3);
        assert_non_null(strstr(d.message, "zero width"));
    }
}

/* Each distribution's sample mean and variance against its definition. */
static void test_every_distribution_matches_its_mean_and_variance(void **state)
{
    (void)state;
    plumb_fall_spec s;
    drone_spec(&s);
    s.wind.profile = PLUMB_WIND_UNIFORM;
    const double tri_a = 0.41, tri_c = 0.47, tri_b = 0.66;
    const double sig = 2.3;
    plumb_uncertainty u[6] = {
        unc("release.velocity.east", PLUMB_DIST_NORMAL, 1.37, 2.71, 0.0),
        unc("payload.drag.cd", PLUMB_DIST_UNIFORM, 0.62, 1.13, 0.0),
        unc("payload.mass", PLUMB_DIST_TRIANGULAR, tri_a, tri_c, tri_b),
        unc("wind.speed", PLUMB_DIST_NORMAL, 0.0, sig, 0.0),          /* half-normal */
        unc("release.height", PLUMB_DIST_NORMAL, 0.83, 0.97, 0.0),    /* truncated at 0 */
        unc("release.velocity.up", PLUMB_DIST_UNIFORM, -0.4, 0.4, 0.0),
    };
    plumb_sampler *sm = NULL;
    plumb_diag d;
    assert_int_equal(plumb_sampler_alloc(&s, u, 6, "t.yaml", &sm, &d), PLUMB_OK);
    assert_int_equal(plumb_sampler_count(sm), 6);
    double lo, hi;
    assert_false(plumb_sampler_truncated(sm, 0, &lo, &hi));
    assert_false(plumb_sampler_truncated(sm, 1, &lo, &hi)); /* uniform: not truncated */
    assert_true(plumb_sampler_truncated(sm, 3, &lo, &hi));
    assert_abs(lo, 0.0, 0.0);
    /* the speed of sound bounds a wind speed too, but 148 sd away it cuts
     * nothing worth reporting (plumb_sampler_truncated) */
    assert_true(isinf(hi));
    const size_t n = 100000;
    double *x = malloc(6 * n * sizeof *x);
    assert_non_null(x);
    size_t redraws[6] = {0};
    for (size_t i = 0; i < n; i++) {
        plumb_fall_spec out;
        double v[6];
        assert_int_equal(plumb_sampler_draw(sm, 8u, i, &out, v, redraws, &d), PLUMB_OK);
        for (int k = 0; k < 6; k++)
            x[(size_t)k * n + i] = v[k];
        /* the values land in the spec's fields */
        assert_true(out.velocity_m_s[0] == v[0] && out.drag.cd == v[1] && out.mass_kg == v[2] &&
                    out.wind.speed_m_s == v[3] && out.release_m[2] == v[4]);
        assert_true(v[3] > 0.0 && v[4] > 0.0);
    }
    check_moments(x, n, 1.37, 2.71 * 2.71, 3.0);
    check_moments(x + n, n, 0.5 * (0.62 + 1.13), (1.13 - 0.62) * (1.13 - 0.62) / 12.0, 1.8);
    check_moments(x + 2 * n, n, (tri_a + tri_b + tri_c) / 3.0,
                  (tri_a * tri_a + tri_b * tri_b + tri_c * tri_c - tri_a * tri_b - tri_a * tri_c -
                   tri_b * tri_c) / 18.0, 2.4);
    const double pi = PLUMB_PI;
    check_moments(x + 3 * n, n, sig * sqrt(2.0 / pi), sig * sig * (1.0 - 2.0 / pi),
                  3.0 + 8.0 * (pi - 3.0) / ((pi - 2.0) * (pi - 2.0)));
    /* truncated normal, a = -mu/sigma: mean mu + sigma phi(a) / (1 - Phi(a)),
     * variance sigma^2 (1 + a lam - lam^2), lam = phi(a) / (1 - Phi(a)) (JKB sec. 10.1) */
    double mu = 0.83, sd = 0.97, a = -mu / sd;
    double lam = exp(-0.5 * a * a) / sqrt(2.0 * pi) / gsl_cdf_ugaussian_Q(a);
    check_moments(x + 4 * n, n, mu + sd * lam, sd * sd * (1.0 + a * lam - lam * lam), 4.0);
    check_moments(x + 5 * n, n, 0.0, 0.8 * 0.8 / 12.0, 1.8);
    /* rejected draws: half of the half-normal's, P(X < 0) = Phi(a) of the other */
    double rd = (double)redraws[3] / (double)(n + redraws[3]);
    assert_abs(rd, 0.5, 5.0 * sqrt(0.25 / (double)n));
    double rh = (double)redraws[4] / (double)(n + redraws[4]);
    assert_abs(rh, gsl_cdf_ugaussian_P(a), 5.0 * sqrt(0.25 / (double)n));
    assert_int_equal(redraws[0] + redraws[1] + redraws[2] + redraws[5], 0);
    free(x);
    plumb_sampler_free(sm);
}

/* A sector through north: uniform [350, 10] deg and triangular [337, 356,
 * 21] deg are drawn on the unwrapped circle and wrapped into [0, 360); the
 * unwrapped values follow the uniform and triangular moments. Speed and
 * heading become east = speed sin(heading), north = speed cos(heading). */
static void test_direction_sectors_across_north_and_polar_velocity(void **state)
{
    (void)state;
    plumb_fall_spec s;
    drone_spec(&s);
    s.wind.profile = PLUMB_WIND_UNIFORM;
    plumb_uncertainty u[3] = {
        unc("wind.from", PLUMB_DIST_UNIFORM, 350.0, 10.0, 0.0),
        unc("release.velocity.heading", PLUMB_DIST_TRIANGULAR, 337.0, 356.0, 21.0),
        unc("release.velocity.speed", PLUMB_DIST_UNIFORM, 5.9, 7.1, 0.0),
    };
    plumb_sampler *sm = NULL;
    plumb_diag d;
    assert_int_equal(plumb_sampler_alloc(&s, u, 3, NULL, &sm, &d), PLUMB_OK);
    const size_t n = 60000;
    double *w = malloc(2 * n * sizeof *w);
    assert_non_null(w);
    size_t north_of_zero = 0;
    for (size_t i = 0; i < n; i++) {
        plumb_fall_spec out;
        double v[3];
        assert_int_equal(plumb_sampler_draw(sm, 3u, i, &out, v, NULL, &d), PLUMB_OK);
        assert_true(v[0] >= 0.0 && v[0] < 360.0 && v[1] >= 0.0 && v[1] < 360.0);
        assert_true(v[0] >= 350.0 || v[0] < 10.0);
        assert_true(v[1] >= 337.0 || v[1] <= 21.0);
        north_of_zero += v[0] < 180.0;
        w[i] = v[0] < 180.0 ? v[0] : v[0] - 360.0;
        w[n + i] = v[1] < 180.0 ? v[1] + 360.0 : v[1];
        assert_true(out.wind.from_deg == v[0]);
        /* the reference: the heading brought within 180 deg of 0 (exactly),
         * then sin and cos in long double; sin of a heading near 360 deg
         * taken in double radians loses the argument's rounding, which is
         * large beside a small sine (the sampler reduces in degrees first,
         * plumbp_sincos_deg) */
        double d360 = v[1] >= 180.0 ? v[1] - 360.0 : v[1]; /* exact (Sterbenz) */
        long double h = (long double)d360 * (3.14159265358979323846264338327950288L / 180.0L);
        assert_rel(out.velocity_m_s[0], (double)((long double)v[2] * sinl(h)), 1e-15);
        assert_rel(out.velocity_m_s[1], (double)((long double)v[2] * cosl(h)), 1e-15);
        assert_rel(out.velocity_m_s[2], s.velocity_m_s[2], 0.0); /* climb not uncertain */
    }
    assert_abs((double)north_of_zero / (double)n, 0.5, 5.0 * sqrt(0.25 / (double)n));
    check_moments(w, n, 0.0, 20.0 * 20.0 / 12.0, 1.8);
    double a = 337.0, c = 356.0, b = 381.0;
    check_moments(w + n, n, (a + b + c) / 3.0, (a * a + b * b + c * c - a * b - a * c - b * c) / 18.0,
                  2.4);
    free(w);
    plumb_sampler_free(sm);
}

/* The draw of sample i depends on (seed, i) only: the same pair gives the
 * same spec whatever was drawn before. */
static void test_a_sample_draw_depends_on_seed_and_index_only(void **state)
{
    (void)state;
    plumb_fall_spec s, a, b, c;
    drone_spec(&s);
    plumb_uncertainty u[7];
    drone_uncertainty(u);
    plumb_sampler *s1 = NULL, *s2 = NULL;
    plumb_diag d;
    assert_int_equal(plumb_sampler_alloc(&s, u, 7, NULL, &s1, &d), PLUMB_OK);
    assert_int_equal(plumb_sampler_alloc(&s, u, 7, NULL, &s2, &d), PLUMB_OK);
    assert_int_equal(plumb_sampler_draw(s1, 11u, 123457u, &a, NULL, NULL, &d), PLUMB_OK);
    for (size_t i = 0; i < 50; i++)
        assert_int_equal(plumb_sampler_draw(s2, 11u, i, &c, NULL, NULL, &d), PLUMB_OK);
    assert_int_equal(plumb_sampler_draw(s2, 11u, 123457u, &b, NULL, NULL, &d), PLUMB_OK);
    assert_memory_equal(&a, &b, sizeof a);
    assert_int_equal(plumb_sampler_draw(s2, 12u, 123457u, &b, NULL, NULL, &d), PLUMB_OK);
    assert_true(a.wind.speed_m_s != b.wind.speed_m_s);
    plumb_sampler_free(s1);
    plumb_sampler_free(s2);
}

/* ---- binomial bounds ------------------------------------------------------- */

/* Clopper & Pearson 1934: closed forms at k = 0 and k = n, and the beta
 * quantiles of GSL's gsl_cdf_beta_Pinv where it converges (n = 57). */
static void test_clopper_pearson_matches_closed_forms_and_beta_quantiles(void **state)
{
    (void)state;
    double lo, hi;
    assert_int_equal(plumb_clopper_pearson(0, 83, 0.95, &lo, &hi), PLUMB_OK);
    assert_abs(lo, 0.0, 0.0);
    assert_rel(hi, 1.0 - pow(0.025, 1.0 / 83.0), 1e-14);
    assert_int_equal(plumb_clopper_pearson(83, 83, 0.95, &lo, &hi), PLUMB_OK);
    assert_rel(lo, pow(0.025, 1.0 / 83.0), 1e-14);
    assert_abs(hi, 1.0, 0.0);
    const size_t ks[] = {1, 19, 56};
    for (size_t i = 0; i < sizeof ks / sizeof ks[0]; i++) {
        double k = (double)ks[i];
        assert_int_equal(plumb_clopper_pearson(ks[i], 57, 0.95, &lo, &hi), PLUMB_OK);
        assert_rel(lo, gsl_cdf_beta_Pinv(0.025, k, 57.0 - k + 1.0), 1e-9);
        assert_rel(hi, gsl_cdf_beta_Pinv(0.975, k + 1.0, 57.0 - k), 1e-9);
    }
    /* large n, where the beta quantile functions of GSL fail: the Wilson
     * score interval (JASA 22, 209, 1927) agrees with Clopper-Pearson to
     * O(1/n) */
    size_t n = 10000000, k = 3141593;
    assert_int_equal(plumb_clopper_pearson(k, n, 0.95, &lo, &hi), PLUMB_OK);
    double p = (double)k / (double)n, zq = 1.959963984540054, nn = (double)n;
    double centre = (p + zq * zq / (2 * nn)) / (1 + zq * zq / nn);
    double half = zq * sqrt(p * (1 - p) / nn + zq * zq / (4 * nn * nn)) / (1 + zq * zq / nn);
    assert_abs(lo, centre - half, 2.0 / nn);
    assert_abs(hi, centre + half, 2.0 / nn);
    assert_int_equal(plumb_clopper_pearson(5, 4, 0.95, &lo, &hi), PLUMB_EINVAL);
    assert_int_equal(plumb_clopper_pearson(1, 4, 1.0, &lo, &hi), PLUMB_EINVAL);
}

/* David & Nagaraja sec. 7.1: l is the largest rank with P(Bin >= l) >=
 * 0.975, u the smallest with P(Bin <= u - 1) >= 0.975 (GSL binomial CDF). */
static void test_quantile_ranks_satisfy_the_binomial_coverage_conditions(void **state)
{
    (void)state;
    const unsigned ns[] = {200, 1000, 30011};
    const double ps[] = {0.5, 0.9, 0.99, 0.999};
    for (size_t i = 0; i < sizeof ns / sizeof ns[0]; i++)
        for (size_t j = 0; j < sizeof ps / sizeof ps[0]; j++) {
            unsigned n = ns[i];
            double p = ps[j];
            size_t l, u;
            assert_int_equal(plumb_quantile_ranks(n, p, 0.95, &l, &u), PLUMB_OK);
            /* P(B >= r) = 1 - P(B <= r - 1); 1e-12 allows for the two
             * implementations' rounding at an exact tie */
            if (l >= 1) {
                assert_true(1.0 - gsl_cdf_binomial_P((unsigned)(l - 1), p, n) >= 0.975 - 1e-12);
                assert_true(1.0 - gsl_cdf_binomial_P((unsigned)l, p, n) < 0.975 + 1e-12);
            } else {
                assert_true(1.0 - gsl_cdf_binomial_P(0, p, n) < 0.975);
            }
            if (u <= n) {
                assert_true(gsl_cdf_binomial_P((unsigned)(u - 1), p, n) >= 0.975 - 1e-12);
                if (u >= 2)
                    assert_true(gsl_cdf_binomial_P((unsigned)(u - 2), p, n) < 0.975 + 1e-12);
            } else {
                assert_true(gsl_cdf_binomial_P(n - 1, p, n) < 0.975);
            }
        }
    /* n = 1e8 (GSL's binomial CDF gives NaN there): De Moivre-Laplace,
     * l ~ np - 1.96 sqrt(np(1-p)) within a few ranks */
    size_t l, u, n = 100000000;
    assert_int_equal(plumb_quantile_ranks(n, 0.5, 0.95, &l, &u), PLUMB_OK);
    double sdr = sqrt(1e8 * 0.25);
    assert_abs((double)l, 5e7 - 1.959963984540054 * sdr, 3.0);
    assert_abs((double)u, 5e7 + 1.959963984540054 * sdr, 3.0);
    /* the fewest samples that bound the 99% radius: 0.99^N <= 0.025 */
    assert_int_equal(plumb_zone_min_samples(0.99, 0.95), 368);
    assert_true(pow(0.99, 368.0) <= 0.025 && pow(0.99, 367.0) > 0.025);
}

/* ---- 7. bad input -------------------------------------------------------------- */

static void expect_bad(const plumb_fall_spec *s, plumb_uncertainty u0, const char *key,
                       const char *fragment)
{
    plumb_sampler *sm = (plumb_sampler *)0x1;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_sampler_alloc(s, &u0, 1, "p.yaml", &sm, &d);
    if (st != PLUMB_EINVAL)
        fail_msg("%s %s [%g, %g, %g]: status %d, expected PLUMB_EINVAL", u0.key,
                 u0.kind == PLUMB_DIST_NORMAL ? "normal" : "uniform/triangular", u0.param[0],
                 u0.param[1], u0.param[2], (int)st);
    assert_null(sm);
    assert_string_equal(d.key, key);
    assert_string_equal(d.file, "p.yaml");
    assert_int_equal(d.line, 17);
    assert_int_equal(d.col, 3);
    if (!strstr(d.message, fragment))
        fail_msg("message '%s' lacks '%s'", d.message, fragment);
}

/* Every refusal of plumb_sampler_alloc, with its key and location. */
static void test_bad_uncertainty_is_refused_with_its_key_and_location(void **state)
{
    (void)state;
    plumb_fall_spec s;
    drone_spec(&s);
    expect_bad(&s, unc("wind.speed", PLUMB_DIST_NORMAL, 5.0, -1.0, 0.0), "wind.speed",
               "standard deviation must be >= 0");
    expect_bad(&s, unc("payload.mass", PLUMB_DIST_UNIFORM, 0.6, 0.4, 0.0), "payload.mass",
               "above the high end");
    expect_bad(&s, unc("payload.mass", PLUMB_DIST_TRIANGULAR, 0.4, 0.7, 0.6), "payload.mass",
               "mode");
    expect_bad(&s, unc("payload.mass", PLUMB_DIST_UNIFORM, -0.1, 0.4, 0.0), "payload.mass",
               "range");
    expect_bad(&s, unc("payload.mass", PLUMB_DIST_NORMAL, -0.2, 0.1, 0.0), "payload.mass",
               "outside the key's range");
    /* cd's range is [0, 10]: normal [0.9, 25] has 16% of its mass inside */
    expect_bad(&s, unc("payload.drag.cd", PLUMB_DIST_NORMAL, 0.9, 25.0, 0.0), "payload.drag.cd",
               "lies in the key's range");
    expect_bad(&s, unc("payload.drag.cd", PLUMB_DIST_UNIFORM, 0.9, 11.0, 0.0), "payload.drag.cd",
               "range");
    expect_bad(&s, unc("atmosphere.temperature_offset", PLUMB_DIST_NORMAL, 10.0, 2.0, 0.0),
               "atmosphere.temperature_offset", "atmosphere");
    expect_bad(&s, unc("descent.cd", PLUMB_DIST_NORMAL, 0.8, 0.1, 0.0), "descent.cd", "descent");
    expect_bad(&s, unc("wind.exponent", PLUMB_DIST_UNIFORM, 0.1, 0.2, 0.0), "wind.exponent",
               "power-law");
    expect_bad(&s, unc("payload.drag.cd_area", PLUMB_DIST_UNIFORM, 0.01, 0.02, 0.0),
               "payload.drag.cd_area", "cd_area");
    expect_bad(&s, unc("wind.from", PLUMB_DIST_UNIFORM, 10.0, 380.0, 0.0), "wind.from",
               "full turn");
    expect_bad(&s, unc("wind.speed", PLUMB_DIST_UNIFORM, NAN, 3.0, 0.0), "wind.speed", "finite");
    plumb_fall_spec still = s;
    still.velocity_m_s[0] = still.velocity_m_s[1] = 0.0;
    expect_bad(&still, unc("release.velocity.heading", PLUMB_DIST_UNIFORM, 10.0, 30.0, 0.0),
               "release.velocity.heading", "speed is 0");

    /* conflicting and duplicate keys */
    plumb_uncertainty two[2] = {unc("release.velocity.speed", PLUMB_DIST_UNIFORM, 5.0, 6.0, 0.0),
                                unc("release.velocity.east", PLUMB_DIST_UNIFORM, -6.0, -5.0, 0.0)};
    plumb_sampler *sm = NULL;
    plumb_diag d;
    assert_int_equal(plumb_sampler_alloc(&s, two, 2, NULL, &sm, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "release.velocity.east");
    assert_null(sm);
    two[0] = unc("release.velocity.climb", PLUMB_DIST_UNIFORM, -1.0, 1.0, 0.0);
    two[1] = unc("release.velocity.up", PLUMB_DIST_UNIFORM, -1.0, 1.0, 0.0);
    assert_int_equal(plumb_sampler_alloc(&s, two, 2, NULL, &sm, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "release.velocity.up");
    two[0] = unc("wind.speed", PLUMB_DIST_UNIFORM, 4.0, 6.0, 0.0);
    two[1] = unc("wind.speed", PLUMB_DIST_NORMAL, 5.0, 1.0, 0.0);
    assert_int_equal(plumb_sampler_alloc(&s, two, 2, NULL, &sm, &d), PLUMB_EINVAL);
    assert_non_null(strstr(d.message, "twice"));
    plumb_uncertainty many[PLUMB_ZONE_MAX_INPUTS + 1];
    for (size_t i = 0; i <= PLUMB_ZONE_MAX_INPUTS; i++)
        many[i] = unc("wind.speed", PLUMB_DIST_UNIFORM, 4.0, 6.0, 0.0);
    assert_int_equal(plumb_sampler_alloc(&s, many, PLUMB_ZONE_MAX_INPUTS + 1, NULL, &sm, &d),
                     PLUMB_EINVAL);
    assert_string_equal(d.key, "uncertainty");
    plumb_sampler_free(NULL);
}

/* An entry given by a --set is located in "--set", its line the number of
 * that --set, where it can be corrected; the others in the file named, even beside it. */
static void test_bad_uncertainty_from_a_set_names_the_set(void **state)
{
    (void)state;
    plumb_fall_spec s;
    drone_spec(&s);
    plumb_uncertainty two[2] = {unc("release.velocity.speed", PLUMB_DIST_UNIFORM, 5.0, 6.0, 0.0),
                                unc("release.velocity.east", PLUMB_DIST_UNIFORM, -6.0, -5.0, 0.0)};
    two[1].from_set = 1;
    two[1].line = 2;
    two[1].col = 13;
    plumb_sampler *sm = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_sampler_alloc(&s, two, 2, "p.yaml", &sm, &d), PLUMB_EINVAL);
    assert_null(sm);
    assert_string_equal(d.file, PLUMB_DIAG_SET_FILE);
    assert_string_equal(d.file, "--set");
    assert_int_equal(d.line, 2);
    assert_int_equal(d.col, 13);
    assert_string_equal(d.key, "release.velocity.east");
    /* the entry at fault is the file's: the file is named */
    two[0] = unc("wind.from", PLUMB_DIST_UNIFORM, 10.0, 380.0, 0.0);
    two[1] = unc("wind.speed", PLUMB_DIST_UNIFORM, 4.0, 6.0, 0.0);
    two[1].from_set = 1;
    assert_int_equal(plumb_sampler_alloc(&s, two, 2, "p.yaml", &sm, &d), PLUMB_EINVAL);
    assert_string_equal(d.file, "p.yaml");
    assert_int_equal(d.line, 17);
    assert_string_equal(d.key, "wind.from");
}

/* Bad zone settings, through plumb_zone_run. */
static void test_bad_zone_settings_are_refused_with_their_key(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_fall_spec s;
    drag_free_spec(&s, 1.3, 10.7);
    plumb_uncertainty u = unc("release.velocity.east", PLUMB_DIST_NORMAL, 0.0, 1.0, 0.0);
    static plumb_zone_result r;
    plumb_diag d;
    plumb_zone_spec z = zone_spec(0, 1, 0.99);
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.samples");
    z = zone_spec(1000, 1, 1.0);
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.confidence");
    z = zone_spec(1000, 1, 0.999); /* 0.999^N <= 0.025 needs N >= 3688 */
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.samples");
    assert_non_null(strstr(d.message, "3688"));
    z = zone_spec(1000, 1, 0.9);
    z.scatter_m = -1.0;
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.scatter");
    /* the seed is printed in JSON: at most 2^53 - 1, the largest integer
     * below which every integer is a binary64 (53-bit significand, IEEE
     * 754-2008, table 3.5), so 2^53 + 1 would read back as 2^53 */
    z = zone_spec(1000, 1, 0.9);
    z.seed = 9007199254740993ul;
    assert_int_equal(plumb_zone_check(&z, NULL, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.seed");
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, NULL, &r, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.seed");
    z.seed = 9007199254740991ul;
    assert_int_equal(plumb_zone_check(&z, NULL, &d), PLUMB_OK);
    assert_int_equal(plumb_zone_check(NULL, NULL, &d), PLUMB_EINVAL);
    assert_true((double)z.seed == 9007199254740991.0);
    plumb_atmosphere_free(atm);
}

static int stop_at_40(void *user, int pass, size_t index, const plumb_zone_sample *smp)
{
    (void)user;
    (void)pass;
    (void)smp;
    return index == 40;
}

/* A fall that fails stops the run with the lowest failing sample, whatever
 * the threads: a buoyant sample (rho V > m) never lands. */
static void test_a_failing_sample_stops_the_run_at_the_same_index_for_any_threads(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_fall_spec s;
    drag_free_spec(&s, 0.0113, 8.3);
    s.drag.cd = 1.1; /* drag so that a light sample falls slowly */
    plumb_uncertainty u = unc("payload.volume", PLUMB_DIST_UNIFORM, 0.0, 0.0102, 0.0);
    plumb_zone_spec z = zone_spec(3000, 6, 0.9);
    static plumb_zone_result r;
    char first[PLUMB_DIAG_MSG] = "";
    for (size_t t = 1; t <= 3; t++) {
        plumb_zone_options o;
        plumb_zone_options_init(&o);
        o.threads = t;
        o.block_samples = 7;
        plumb_diag d;
        assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, &o, &r, &d), PLUMB_ENOLAND);
        assert_non_null(strstr(d.message, "sample "));
        if (t == 1)
            snprintf(first, sizeof first, "%s", d.message);
        else
            assert_string_equal(d.message, first);
    }
    /* a sample writer that stops the run */
    drag_free_spec(&s, 1.3, 10.7);
    u = unc("release.velocity.east", PLUMB_DIST_NORMAL, 0.0, 1.0, 0.0);
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.on_sample = stop_at_40;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, &o, &r, &d), PLUMB_EWRITE);
    /* the callback's index counts from 0; the message counts from 1, as
       the sample file and every list a person reads do */
    assert_non_null(strstr(d.message, "at sample 41"));
    plumb_atmosphere_free(atm);
}

typedef struct progress_log {
    size_t calls, last;
    int monotone;
} progress_log;

static void progress(void *user, int pass, size_t done, size_t total)
{
    progress_log *p = user;
    if (pass != 0 || done < p->last || done > total)
        p->monotone = 0;
    p->last = done;
    p->calls++;
}

/* The progress callback sees increasing counts ending at the total. */
static void test_progress_is_reported_in_increasing_counts_to_the_total(void **state)
{
    (void)state;
    plumb_atmosphere *atm = plumbt_constant_air();
    plumb_fall_spec s;
    drag_free_spec(&s, 1.3, 10.7);
    plumb_uncertainty u = unc("release.velocity.east", PLUMB_DIST_NORMAL, 0.0, 1.0, 0.0);
    plumb_zone_spec z = zone_spec(1000, 2, 0.9);
    progress_log log = {0, 0, 1};
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.threads = 2;
    o.block_samples = 100;
    o.progress = progress;
    o.progress_user = &log;
    static plumb_zone_result r;
    plumb_diag d;
    assert_int_equal(plumb_zone_run(&s, atm, &u, 1, &z, NULL, 0, &o, &r, &d), PLUMB_OK);
    assert_int_equal(log.calls, 10);
    assert_int_equal(log.last, 1000);
    assert_true(log.monotone);
    plumb_atmosphere_free(atm);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_drag_free_drift_with_normal_release_velocity_is_rayleigh),
        cmocka_unit_test(test_a_zero_width_distribution_is_refused_at_its_key),
        cmocka_unit_test(test_ballistic_throw_includes_the_upward_release_component),
        cmocka_unit_test(test_ellipse_major_axis_follows_the_larger_spread),
        cmocka_unit_test(test_intervals_cover_the_true_values_in_at_least_93_percent_of_200_runs),
        cmocka_unit_test(test_exceedance_follows_the_criterion_wording_at_the_limit),
        cmocka_unit_test(test_zone_is_identical_for_one_two_and_three_threads),
        cmocka_unit_test(test_a_device_that_does_not_open_in_some_samples_is_counted_in_a_warning),
        cmocka_unit_test(test_binned_percentiles_match_an_exact_sort_of_1e5_samples),
        cmocka_unit_test(test_release_point_puts_the_median_impact_on_the_target),
        cmocka_unit_test(test_every_distribution_matches_its_mean_and_variance),
        cmocka_unit_test(test_a_normal_is_reported_cut_only_where_its_range_cuts_it),
        cmocka_unit_test(test_direction_sectors_across_north_and_polar_velocity),
        cmocka_unit_test(test_a_sample_draw_depends_on_seed_and_index_only),
        cmocka_unit_test(test_clopper_pearson_matches_closed_forms_and_beta_quantiles),
        cmocka_unit_test(test_quantile_ranks_satisfy_the_binomial_coverage_conditions),
        cmocka_unit_test(test_bad_uncertainty_is_refused_with_its_key_and_location),
        cmocka_unit_test(test_bad_uncertainty_from_a_set_names_the_set),
        cmocka_unit_test(test_bad_zone_settings_are_refused_with_their_key),
        cmocka_unit_test(test_a_failing_sample_stops_the_run_at_the_same_index_for_any_threads),
        cmocka_unit_test(test_progress_is_reported_in_increasing_counts_to_the_total),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
