/*
 * test_inverse_gap.c - plumb_limit_solve (include/plumb/inverse.h) when
 * falls inside the bracket of a crossing cannot be computed: the answer
 * is the last value computed that meets the limit, with words saying why
 * it stops there, never a failed answer (exit 3) for values the answer
 * need not compute.
 *
 * No profile makes falls fail in a window of heights between two that
 * can be computed (a fall fails above a height, the air model's top or
 * the fall's budget, not inside a range), so this program is linked with
 * --wrap=plumb_trajectory_run (Makefile): its wrapper fails, as the
 * integration failing on both methods does (PLUMB_ENUMERIC), every fall
 * released from a height inside the window set by the test, and passes
 * every other to the real integration.
 *
 * Sources of the expected values:
 *   - work-energy theorem for a drag-free fall from rest (no air force,
 *     constant g): E = m g H, so the height at which the impact energy is
 *     E is H(E) = E / (m g);
 *   - standard gravity g0 = 9.80665 m/s^2 (3rd CGPM, 1901), used without a
 *     latitude (README, site.latitude);
 *   - the scan: 61 heights 31.6 m x 10^((i - 30) / 10) (inverse.h: three
 *     decades either way of the profile's own value, geometric).
 * Tolerances: Brent's 1e-10 relative on the key (inverse.h); a drag-free
 * fall is a polynomial in time, which the 8th-order stepper follows
 * exactly, so its energy is within 1e-9 of m g H (README, "The model").
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

#define G0 9.80665
#define MASS_KG 2.385
#define HEIGHT_M 31.6

/* The window of release heights whose falls fail, m (open at both ends);
 * empty when lo >= hi. */
static double fail_lo_m = 0.0, fail_hi_m = 0.0;
static size_t n_failed;

plumb_status __real_plumb_trajectory_run(plumb_trajectory *traj, const plumb_fall_spec *spec,
                                         const plumb_atmosphere *atm, plumb_fall_result *res,
                                         plumb_diag *diag);
plumb_status __wrap_plumb_trajectory_run(plumb_trajectory *traj, const plumb_fall_spec *spec,
                                         const plumb_atmosphere *atm, plumb_fall_result *res,
                                         plumb_diag *diag);

plumb_status __wrap_plumb_trajectory_run(plumb_trajectory *traj, const plumb_fall_spec *spec,
                                         const plumb_atmosphere *atm, plumb_fall_result *res,
                                         plumb_diag *diag)
{
    double h = spec->release_m[2];
    if (h > fail_lo_m && h < fail_hi_m) {
        n_failed++;
        if (diag) {
            plumb_diag_clear(diag);
            diag->status = PLUMB_ENUMERIC;
            snprintf(diag->message, sizeof diag->message,
                     "the integration failed on both methods (the test's window)");
        }
        return PLUMB_ENUMERIC;
    }
    return __real_plumb_trajectory_run(traj, spec, atm, res, diag);
}

static plumb_units *units;
static plumb_trajectory *traj;
static char path[300];

static int group_setup(void **state)
{
    plumbt_setup_gsl(state);
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_units_alloc(&units, &d) != PLUMB_OK || plumb_trajectory_alloc(NULL, &traj) != PLUMB_OK)
        return -1;
    const char *tmp = getenv("TMPDIR");
    snprintf(path, sizeof path, "%s/plumb-test-inverse-gap-XXXXXX", tmp && *tmp ? tmp : "/tmp");
    int fd = mkstemp(path);
    if (fd < 0)
        return -1;
    static const char yaml[] = "name: drag-free payload\n"
                               "payload: {mass: 2.385 kg, drag: {cd: 0, area: 0.0117 m^2}}\n"
                               "release: {height: 31.6 m}\n";
    ssize_t n = write(fd, yaml, sizeof yaml - 1);
    close(fd);
    return n == (ssize_t)(sizeof yaml - 1) ? 0 : -1;
}

static int group_teardown(void **state)
{
    (void)state;
    unlink(path);
    plumb_trajectory_free(traj);
    plumb_units_free(units);
    return 0;
}

static plumb_profile *load(void)
{
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, &p, &d), PLUMB_OK);
    return p;
}

/* The limit's height is H(E) = E / (m g0) = 90 m, between the scan's
 * heights 79.37 m (i = 34) and 99.93 m (i = 35), both computed; falls from
 * 85 m to 95 m fail. The answer is the highest height computed below
 * them, 85 m to Brent's tolerance, which meets the limit (m g0 85 m < E),
 * found, with words saying why it stops short of the crossing. */
static void test_falls_failing_inside_the_bracket_stop_the_answer_below_them(void **state)
{
    (void)state;
    plumb_profile *p = load();
    double e_j = MASS_KG * G0 * 90.0;
    fail_lo_m = 85.0;
    fail_hi_m = 95.0;
    n_failed = 0;
    plumb_limit_result r;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_ENERGY, e_j,
                                        NULL, traj, &r, &d);
    if (st != PLUMB_OK)
        fprintf(stderr, "%s: %s\n", d.key, d.message);
    assert_int_equal(st, PLUMB_OK);
    assert_true(n_failed > 0); /* the window was reached */
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_int_equal(r.n_crossings, 1);
    assert_true(r.limit_is_upper_bound);
    assert_true(r.value_si <= 85.0);
    assert_rel(r.value_si, 85.0, 1e-9);
    assert_rel(r.metric_at_value, MASS_KG * G0 * r.value_si, 1e-9);
    assert_true(r.metric_at_value < e_j);
    assert_non_null(strstr(r.explanation, "cannot be computed: their falls could not be computed "
                                          "(the integration failed on both methods)"));
    assert_non_null(strstr(r.explanation, "the last value computed that meets the limit"));
    /* the same solve with every fall computed finds H(E) itself */
    fail_lo_m = fail_hi_m = 0.0;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_ENERGY, e_j,
                                       NULL, traj, &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_rel(r.value_si, 90.0, 1e-9);
    assert_string_equal(r.explanation, "");
    plumb_profile_free(p);
}

/* Falls fail from 86 m to 91 m, over the crossing at 90 m and past it:
 * the answer closes in on them from below, 86 m to Brent's tolerance. */
static void test_a_window_over_the_crossing_stops_the_answer_at_its_start(void **state)
{
    (void)state;
    plumb_profile *p = load();
    double e_j = MASS_KG * G0 * 90.0;
    fail_lo_m = 86.0;
    fail_hi_m = 91.0;
    n_failed = 0;
    plumb_limit_result r;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_ENERGY, e_j,
                                       NULL, traj, &r, &d),
                     PLUMB_OK);
    assert_true(n_failed > 0);
    assert_int_equal(r.outcome, PLUMB_LIMIT_FOUND);
    assert_true(r.value_si <= 86.0);
    assert_rel(r.value_si, 86.0, 1e-9);
    assert_non_null(strstr(r.explanation, "stops at the last value computed"));
    fail_lo_m = fail_hi_m = 0.0;
    plumb_profile_free(p);
}

/* The report words the stop in every format: the text gives the
 * explanation under the answer, the JSON and CSV in theirs. */
static void test_the_report_says_why_the_answer_stops_short(void **state)
{
    (void)state;
    plumb_profile *p = load();
    double e_j = MASS_KG * G0 * 90.0;
    fail_lo_m = 85.0;
    fail_hi_m = 95.0;
    plumb_limit_result r;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_limit_solve(p, units, 0, "release.height", PLUMB_METRIC_ENERGY, e_j,
                                       NULL, traj, &r, &d),
                     PLUMB_OK);
    fail_lo_m = fail_hi_m = 0.0;
    plumb_limit_report rep = {.profile = p, .key = "release.height",
                              .metric = PLUMB_METRIC_ENERGY, .limit = e_j, .n_items = 1,
                              .results = &r};
    static const plumb_format formats[] = {PLUMB_FORMAT_TEXT, PLUMB_FORMAT_JSON,
                                           PLUMB_FORMAT_CSV};
    for (size_t k = 0; k < 3; k++) {
        char *buf = NULL;
        size_t len = 0;
        FILE *f = open_memstream(&buf, &len);
        assert_non_null(f);
        plumb_report_options o = {formats[k], PLUMB_UNITS_SI, NULL};
        assert_int_equal(plumb_report_limit(f, &o, &rep, &d), PLUMB_OK);
        assert_int_equal(fclose(f), 0);
        /* the text wraps: its words joined again */
        for (char *c = buf; *c; c++)
            if (*c == '\n')
                *c = ' ';
        char *flat = buf, *out = buf;
        for (char *c = buf; *c; c++)
            if (!(*c == ' ' && out > flat && out[-1] == ' '))
                *out++ = *c;
        *out = '\0';
        assert_non_null(strstr(flat, "the limit is crossed between this value and the next "
                                     "height computed, which exceeds it, but the heights "
                                     "just beyond this one cannot be computed"));
        assert_non_null(strstr(flat, "so the answer stops at the last value computed that "
                                     "meets the limit"));
        free(buf);
    }
    plumb_profile_free(p);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_falls_failing_inside_the_bracket_stop_the_answer_below_them),
        cmocka_unit_test(test_a_window_over_the_crossing_stops_the_answer_at_its_start),
        cmocka_unit_test(test_the_report_says_why_the_answer_stops_short),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
