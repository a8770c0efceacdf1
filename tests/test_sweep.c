/*
 * test_sweep.c - ranges of an input and the sweep over them (src/sweep.c).
 *
 * Sources of the checked values:
 *   - NIST SP 811 (2008), B.9: T/K = t/degC + 273.15 and
 *     t/degC = (t/degF - 32) / 1.8, exactly; a temperature interval of
 *     1 degC is 1 K, of 1 degF is 1/1.8 K.
 *   - The count of FROM:TO:STEP is 1 + floor((TO - FROM) / STEP), the
 *     arithmetic of an inclusive range (closed form, as `seq` counts).
 *   - Archimedes' principle and the U.S. Standard Atmosphere 1976
 *     (NOAA-S/T 76-1562, Table I, transcribed) for when a light payload
 *     floats.
 *   - The caps PLUMB_RANGE_MAX_VALUES and PLUMB_SWEEP_MAX_ROWS are the
 *     contract of include/plumb/sweep.h.
 * The regression these tests keep fixed: a step typed in degC was checked
 * in kelvin (-20 degC read as +253.15 K), counted from a negative span into
 * about 2^64 values, and two such ranges wrapped past the row cap.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb_test.h"

static plumb_units *units;

static int group_setup(void **state)
{
    plumb_diag d;
    plumbt_setup_gsl(state);
    return plumb_units_alloc(&units, &d) == PLUMB_OK ? 0 : -1;
}

static int group_teardown(void **state)
{
    (void)state;
    plumb_units_free(units);
    return 0;
}

/* Parses a range that must be refused; checks the status, that the
 * diagnostic names the option and the command line, and a message part. */
/* Refused, located as README.md "Exit status" says: the option ("--vary"
 * of what "--vary x") as the file, line 1, the key ("x") apart; col, when
 * not 0, the column in text of the part at fault. */
static void refused_at(const char *text, plumb_dim dim, const char *what, plumb_status want,
                       const char *part, int col)
{
    plumb_range r;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_range_parse(units, text, dim, what, &r, &d);
    const char *sp = strchr(what, ' ');
    char option[64];
    snprintf(option, sizeof option, "%.*s", sp ? (int)(sp - what) : (int)strlen(what), what);
    if (st != want || strcmp(d.file, option) != 0 || !strstr(d.message, part) ||
        (col && d.col != col))
        fprintf(stderr, "range '%s': status %d, at %s:%d:%d, key '%s', message '%s'\n", text,
                (int)st, d.file, d.line, d.col, d.key, d.message);
    assert_int_equal(st, want);
    assert_string_equal(d.file, option);
    assert_string_equal(d.key, sp ? sp + 1 : "");
    assert_int_equal(d.line, 1);
    assert_true(d.col >= 1);
    if (col)
        assert_int_equal(d.col, col);
    assert_non_null(strstr(d.message, part));
}

static void refused(const char *text, plumb_dim dim, const char *what, plumb_status want,
                    const char *part)
{
    refused_at(text, dim, what, want, part, 0);
}

/* The i-th value of r in SI; fails the test when it cannot be had. */
static double value_si(const plumb_range *r, size_t i)
{
    double si = 0.0;
    plumb_diag d;
    assert_int_equal(plumb_range_value_si(r, units, i, &si, &d), PLUMB_OK);
    return si;
}

static plumb_range parsed(const char *text, plumb_dim dim)
{
    plumb_range r;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_range_parse(units, text, dim, "--vary x", &r, &d);
    if (st != PLUMB_OK)
        fprintf(stderr, "range '%s': %s\n", text, d.message);
    assert_int_equal(st, PLUMB_OK);
    return r;
}

/* The case: -20 degC is a step down, not +253.15 K. */
static void test_celsius_step_of_wrong_sign_is_refused_naming_the_option(void **state)
{
    (void)state;
    refused("0degC:30degC:-20degC", PLUMB_DIM_TEMPERATURE,
            "--vary atmosphere.table[0].temperature", PLUMB_ERANGE, "positive STEP");
    refused("30 degF:0 degF:5 degF", PLUMB_DIM_TEMPERATURE, "--vary x", PLUMB_ERANGE,
            "negative STEP");
}

/* NIST SP 811 B.9: 5 degC = 278.15 K; 7 values from 0 to 30 by 5. */
static void test_celsius_range_counts_in_celsius(void **state)
{
    (void)state;
    plumb_range r = parsed("0degC:30degC:5degC", PLUMB_DIM_TEMPERATURE);
    assert_int_equal(r.n, 7);
    assert_string_equal(r.unit, "degC");
    assert_abs(plumb_range_value(&r, 1), 5.0, 0.0);
    assert_rel(value_si(&r, 1), 278.15, 1e-12);
    assert_rel(value_si(&r, 6), 303.15, 1e-12);
}

/* NIST SP 811 B.9: 212 degF = 100 degC = 373.15 K; 32 to 212 by 18 is 11 values. */
static void test_fahrenheit_range_counts_in_fahrenheit(void **state)
{
    (void)state;
    plumb_range r = parsed("32 degF:212 degF:18 degF", PLUMB_DIM_TEMPERATURE);
    assert_int_equal(r.n, 11);
    assert_rel(value_si(&r, 10), 373.15, 1e-12);
    assert_rel(value_si(&r, 0), 273.15, 1e-12);
}

/* Mixed units count in K, with the step a difference: 273.15 to 300 K by
 * 5 K is 1 + floor(26.85 / 5) = 6 values (not one, as a 5 degC step read
 * as 278.15 K would give). */
static void test_mixed_temperature_units_count_in_kelvin_with_the_step_a_difference(void **state)
{
    (void)state;
    plumb_range r = parsed("0degC:300K:5degC", PLUMB_DIM_TEMPERATURE);
    assert_string_equal(r.unit, "K");
    assert_int_equal(r.n, 6);
    assert_rel(plumb_range_value(&r, 5), 298.15, 1e-12);
}

static void test_zero_step_is_refused(void **state)
{
    (void)state;
    refused("2m:20m:0m", PLUMB_DIM_LENGTH, "--vary release.height", PLUMB_ERANGE,
            "must not be zero");
    refused("0m:20km:-0km", PLUMB_DIM_LENGTH, "--alt", PLUMB_ERANGE, "must not be zero");
}

/* 60 m down to 2 m by -2 m: 1 + floor(58 / 2) = 30 values, last 2 m. */
static void test_a_range_may_run_down_with_a_negative_step(void **state)
{
    (void)state;
    plumb_range r = parsed("60m:2m:-2m", PLUMB_DIM_LENGTH);
    assert_int_equal(r.n, 30);
    assert_abs(plumb_range_value(&r, 0), 60.0, 0.0);
    assert_abs(plumb_range_value(&r, 29), 2.0, 0.0);
    refused("20km:0m:1km", PLUMB_DIM_LENGTH, "--alt", PLUMB_ERANGE, "negative STEP");
}

/* 1 + floor(9.9999 / 1e-4) = 100000 values is the cap; 10 m gives 100001. */
static void test_count_stops_at_the_cap(void **state)
{
    (void)state;
    plumb_range r = parsed("0 mm:99999 mm:1 mm", PLUMB_DIM_LENGTH);
    assert_int_equal(r.n, PLUMB_RANGE_MAX_VALUES);
    refused("0 mm:100000 mm:1 mm", PLUMB_DIM_LENGTH, "--vary x", PLUMB_ERANGE, "100001 values");
}

/* A count far past size_t is refused, never converted: 1e300 / 1e-300. */
static void test_a_count_past_any_integer_is_refused_without_overflow(void **state)
{
    (void)state;
    refused("0m:1e300m:1e-300m", PLUMB_DIM_LENGTH, "--vary x", PLUMB_ERANGE,
            "more than 100000");
    refused("0degC:30degC:1e-20degC", PLUMB_DIM_TEMPERATURE, "--vary x", PLUMB_ERANGE,
            "more than 100000");
}

static void test_malformed_ranges_are_refused(void **state)
{
    (void)state;
    refused("2m:20m", PLUMB_DIM_LENGTH, "--alt", PLUMB_EPARSE, "FROM:TO:STEP");
    refused("2m:20m:1m:1m", PLUMB_DIM_LENGTH, "--alt", PLUMB_EPARSE, "three parts");
    refused("2m:20s:1m", PLUMB_DIM_LENGTH, "--alt", PLUMB_EUNIT, "TO");
    /* the column of the part at fault: TO at 4, STEP at 8 (after the
     * spaces around it, which are not the part) */
    refused_at("2m:20s:1m", PLUMB_DIM_LENGTH, "--alt", PLUMB_EUNIT, "TO", 4);
    refused_at("2m:20m: -1m", PLUMB_DIM_LENGTH, "--vary release.height", PLUMB_ERANGE,
               "positive STEP", 9);
}

/* Closed form: 0.1 x 3 typed as 0:1:0.1 is "0.3", and 11 values end on 1. */
static void test_values_are_written_as_a_user_would_type_them(void **state)
{
    (void)state;
    plumb_range r = parsed("0:1:0.1", PLUMB_DIM_NONE);
    assert_int_equal(r.n, 11);
    char buf[128];
    snprintf(r.key, sizeof r.key, "payload.drag.cd");
    plumb_range_set_text(&r, 3, buf, sizeof buf);
    assert_string_equal(buf, "payload.drag.cd=0.3");
    plumb_range c = parsed("0degC:30degC:5degC", PLUMB_DIM_TEMPERATURE);
    snprintf(c.key, sizeof c.key, "atmosphere.table[0].temperature");
    plumb_range_set_text(&c, 2, buf, sizeof buf);
    assert_string_equal(buf, "atmosphere.table[0].temperature=10 degC");
}

/* The row cap is checked on the product of the counts without wrapping:
 * 2^32 x 2^32 is 2^64, 0 in a 64-bit size_t; 101 x 100 = 10100 > 10000. */
static void test_two_ranges_past_the_row_cap_are_refused_before_running(void **state)
{
    (void)state;
    plumb_range ax[2];
    memset(ax, 0, sizeof ax);
    snprintf(ax[0].key, sizeof ax[0].key, "release.height");
    snprintf(ax[1].key, sizeof ax[1].key, "wind.speed");
    ax[0].dim = PLUMB_DIM_LENGTH;
    ax[1].dim = PLUMB_DIM_SPEED;
    ax[0].from = ax[1].from = 1.0;
    ax[0].to = ax[1].to = 2.0;
    ax[0].step = ax[1].step = 1.0;
    ax[0].n = ax[1].n = (size_t)1 << (sizeof(size_t) * 4);
    plumb_sweep *s = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    /* no profile is needed: the counts are checked before any row runs */
    assert_int_equal(plumb_sweep_run(NULL, units, NULL, ax, 2, NULL, &s, &d), PLUMB_ERANGE);
    assert_null(s);
    ax[0].n = 101;
    ax[1].n = 100;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_sweep_run(NULL, units, NULL, ax, 2, NULL, &s, &d), PLUMB_ERANGE);
    assert_null(s);
    assert_non_null(strstr(d.message, "10100 rows"));
    /* at the second --vary, which takes the rows past the cap */
    assert_string_equal(d.file, "--vary");
    assert_int_equal(d.line, 2);
}

/* Loads tests/cli/profiles/<name> of the source tree. */
static plumb_profile *test_profile(const char *name)
{
    char path[512];
    snprintf(path, sizeof path, "%s/tests/cli/profiles/%s", plumbt_srcdir(), name);
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_profile_load(path, units, NULL, 0, &p, &d) != PLUMB_OK)
        fprintf(stderr, "%s: %s\n", path, d.message);
    assert_non_null(p);
    return p;
}

/* Archimedes: the 47 g grip of light.yaml floats in air of 1.2221 kg/m^3
 * (U.S. Standard Atmosphere 1976 at 25 m, transcribed) when its volume
 * exceeds 0.047 / 1.2221 = 0.03846 m^3. Of 0.030, 0.036, 0.042 and
 * 0.048 m^3 the last two never land: those rows carry the error (an
 * input error: the volume or the mass is at fault), the first two their
 * figures. */
static void test_a_row_that_never_lands_is_that_rows_error(void **state)
{
    (void)state;
    plumb_profile *p = test_profile("light.yaml");
    char dir[512];
    snprintf(dir, sizeof dir, "%s/profiles/criteria", plumbt_srcdir());
    plumb_criteria *crit = NULL;
    plumb_trajectory *traj = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_criteria_load_dir(dir, units, &crit, &d), PLUMB_OK);
    assert_int_equal(plumb_trajectory_alloc(NULL, &traj), PLUMB_OK);
    plumb_range r;
    assert_int_equal(plumb_range_parse_key(units, "payload.volume=0.030m^3:0.048m^3:0.006m^3",
                                           &r, &d), PLUMB_OK);
    plumb_sweep *s = NULL;
    assert_int_equal(plumb_sweep_run(p, units, crit, &r, 1, traj, &s, &d), PLUMB_OK);
    assert_int_equal(plumb_sweep_row_count(s), 4);
    assert_int_equal(plumb_sweep_failed_count(s), 2);
    for (size_t i = 0; i < 4; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(s, i);
        if (i < 2) {
            assert_int_equal(row->status, PLUMB_OK);
            assert_int_equal(row->report.n_items, 1);
        } else {
            /* a floating object: its inputs are at fault */
            assert_int_equal(row->status, PLUMB_ERANGE);
            assert_int_equal(row->error.status, PLUMB_ERANGE);
            assert_non_null(strstr(row->error.message, "float or rise"));
            assert_int_equal(row->report.n_items, 0);
            assert_null(row->report.profile);
        }
    }
    plumb_sweep_free(s);

    /* every row floats: the sweep fails, naming the first row's value */
    assert_int_equal(plumb_range_parse_key(units, "payload.volume=0.042m^3:0.048m^3:0.006m^3",
                                           &r, &d), PLUMB_OK);
    plumb_diag_clear(&d);
    assert_int_equal(plumb_sweep_run(p, units, crit, &r, 1, traj, &s, &d), PLUMB_ERANGE);
    assert_null(s);
    assert_non_null(strstr(d.message, "(at payload.volume=0.042 m^3;"));

    /* every value out of range: an input error of the range */
    assert_int_equal(plumb_range_parse_key(units, "release.height=-8m:-2m:3m", &r, &d), PLUMB_OK);
    plumb_diag_clear(&d);
    assert_int_equal(plumb_sweep_run(p, units, crit, &r, 1, traj, &s, &d), PLUMB_ERANGE);
    assert_string_equal(d.file, "--vary");
    assert_string_equal(d.key, "release.height");
    plumb_trajectory_free(traj);

    /* No row computed, the first for its input (-2 m: release.height must
     * be > 0, README.md "Profile keys") and the others because their falls
     * failed (a step budget of 3 steps, too few for a fall of metres): the
     * sweep failed as a computation, whichever way the range runs (README.md
     * "plumb sweep": exit 2 only when every row's input is at fault). */
    plumb_trajectory_options topt;
    plumb_trajectory_options_init(&topt);
    topt.max_steps = 3;
    assert_int_equal(plumb_trajectory_alloc(&topt, &traj), PLUMB_OK);
    const char *mixed[] = {"release.height=-2m:10m:4m", "release.height=10m:-2m:-4m"};
    for (size_t k = 0; k < 2; k++) {
        assert_int_equal(plumb_range_parse_key(units, mixed[k], &r, &d), PLUMB_OK);
        plumb_diag_clear(&d);
        plumb_status st = plumb_sweep_run(p, units, crit, &r, 1, traj, &s, &d);
        assert_null(s);
        assert_false(plumb_status_is_input_error(st));
        assert_false(plumb_status_is_input_error(d.status));
    }
    plumb_trajectory_free(traj);
    plumb_criteria_free(crit);
    plumb_profile_free(p);
}

/* The boundary of a two-way sweep of an inventory over items[N].X is
 * that of item N: inventory.yaml's items are pin punch (1), chain sling
 * (2, the highest energy) and glove (3), so over items[3].mass the
 * boundaries are the glove's, and plumb_sweep_boundary_item_key names
 * the key. Over a direction no value marks a limit: every boundary has
 * the same reason, kept once, naming the key. A height the profile
 * refuses (-5 m: release.height must be > 0, profile format) keeps the
 * loader's reason. Without boundaries, and for NULL, both say nothing. */
static void test_a_boundary_is_of_the_item_its_key_names_and_keeps_why_it_is_missing(void **state)
{
    (void)state;
    plumb_profile *p = test_profile("inventory.yaml");
    char dir[512];
    snprintf(dir, sizeof dir, "%s/profiles/criteria", plumbt_srcdir());
    plumb_criteria *crit = NULL;
    plumb_trajectory *traj = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_criteria_load_dir(dir, units, &crit, &d), PLUMB_OK);
    assert_int_equal(plumb_trajectory_alloc(NULL, &traj), PLUMB_OK);
    plumb_range r[2];
    assert_int_equal(plumb_range_parse_key(units, "release.height=-5m:15m:10m", &r[0], &d),
                     PLUMB_OK);
    assert_int_equal(plumb_range_parse_key(units, "items[3].mass=0.05kg:0.25kg:0.1kg", &r[1], &d),
                     PLUMB_OK);
    plumb_sweep *s = NULL;
    assert_int_equal(plumb_sweep_run(p, units, crit, r, 2, traj, &s, &d), PLUMB_OK);
    assert_null(plumb_sweep_boundary_item_key(s));
    assert_null(plumb_sweep_boundary_why(s, 0, 0));
    assert_int_equal(plumb_sweep_find_boundaries(s, p, units, traj, &d), PLUMB_OK);
    assert_int_equal(plumb_sweep_boundary_item(s), 2);
    assert_string_equal(plumb_sweep_boundary_item_key(s), "items[3].mass");
    assert_true(plumb_sweep_boundary_criteria(s) > 0);
    /* -5 m refused by the loader, with its reason; 5 m and 15 m answered */
    assert_int_not_equal(plumb_sweep_boundary_at(s, 0, 0)->status, PLUMB_OK);
    const plumb_diag *why = plumb_sweep_boundary_why(s, 0, 0);
    assert_non_null(why);
    assert_string_equal(why->key, "release.height");
    for (size_t i = 1; i < 3; i++) {
        assert_int_equal(plumb_sweep_boundary_at(s, i, 0)->status, PLUMB_OK);
        assert_null(plumb_sweep_boundary_why(s, i, 0));
    }
    plumb_sweep_free(s);

    /* over a direction: one reason for every boundary, naming the key */
    assert_int_equal(plumb_range_parse_key(units, "release.height=5m:15m:10m", &r[0], &d),
                     PLUMB_OK);
    assert_int_equal(plumb_range_parse_key(units, "wind.from=0deg:90deg:45deg", &r[1], &d),
                     PLUMB_OK);
    assert_int_equal(plumb_sweep_run(p, units, crit, r, 2, traj, &s, &d), PLUMB_OK);
    assert_int_equal(plumb_sweep_find_boundaries(s, p, units, traj, &d), PLUMB_OK);
    assert_null(plumb_sweep_boundary_item_key(s));
    const plumb_diag *first = plumb_sweep_boundary_why(s, 0, 0);
    assert_non_null(first);
    assert_int_equal(first->status, PLUMB_EINVAL);
    assert_string_equal(first->key, "wind.from");
    for (size_t i = 0; i < 2; i++)
        for (size_t k = 0; k < plumb_sweep_boundary_criteria(s); k++)
            assert_ptr_equal(plumb_sweep_boundary_why(s, i, k), first);
    plumb_sweep_free(s);
    assert_null(plumb_sweep_boundary_item_key(NULL));
    assert_null(plumb_sweep_boundary_why(NULL, 0, 0));
    plumb_trajectory_free(traj);
    plumb_criteria_free(crit);
    plumb_profile_free(p);
}

/* A direction's range may start or end at a compass point. On the
 * 16-point rose each point is 360/16 = 22.5 deg clockwise from the one
 * before, N = 0 (the rose's definition; common practice, no source): NW is
 * 315 deg, NE 45 deg. The values turn the way STEP turns (positive is
 * clockwise, as bearings count) and so cross north when TO lies behind
 * FROM: NW:NE:22.5deg is 315, 337.5, 360, 382.5, 405 deg, five values. */
static void test_a_direction_range_may_run_between_compass_points(void **state)
{
    (void)state;
    plumb_range r;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_range_parse_key(units, "wind.from=NW:NE:22.5deg", &r, &d), PLUMB_OK);
    assert_string_equal(r.key, "wind.from");
    assert_string_equal(r.unit, "deg");
    assert_rel(r.from, 315.0, 1e-15);
    assert_rel(r.to, 405.0, 1e-15);
    assert_int_equal(r.n, 5);
    /* anticlockwise from NE (45) to NW (315): 45, 0, -45 */
    assert_int_equal(plumb_range_parse_key(units, "wind.from=ne:nw:-45 deg", &r, &d), PLUMB_OK);
    assert_rel(r.from, 45.0, 1e-15);
    assert_rel(r.to, -45.0, 1e-15);
    assert_int_equal(r.n, 3);
    /* a point at one end, degrees at the other; the heading is a direction */
    assert_int_equal(plumb_range_parse_key(units, "release.velocity.heading=S:200deg:10deg", &r,
                                           &d), PLUMB_OK);
    assert_rel(r.from, 180.0, 1e-15);
    assert_int_equal(r.n, 3);
    assert_int_equal(plumb_range_parse_key(units, "wind.table[1].from=ESE:SE:11.25deg", &r, &d),
                     PLUMB_OK);
    assert_rel(r.from, 112.5, 1e-15);
    assert_int_equal(r.n, 3);
    /* degrees alone keep their own check of STEP's sign */
    plumb_diag_clear(&d);
    assert_int_equal(plumb_range_parse_key(units, "wind.from=315deg:45deg:22.5deg", &r, &d),
                     PLUMB_ERANGE);
    /* README.md "Exit status": --vary:1:COL:, COL the STEP's in the whole
     * KEY=FROM:TO:STEP: "wind.from=" is 10 characters, "315deg:" 7,
     * "45deg:" 6 */
    assert_string_equal(d.file, "--vary");
    assert_string_equal(d.key, "wind.from");
    assert_int_equal(d.col, 24);
    /* a compass point is no step, and no latitude */
    plumb_diag_clear(&d);
    assert_int_equal(plumb_range_parse_key(units, "wind.from=N:E:NE", &r, &d), PLUMB_EPARSE);
    assert_string_equal(d.file, "--vary");
    assert_string_equal(d.key, "wind.from");
    assert_int_equal(d.col, 15);
    assert_non_null(strstr(d.message, "STEP 'NE' is a compass point"));
    plumb_diag_clear(&d);
    assert_int_equal(plumb_range_parse_key(units, "site.latitude=N:E:1deg", &r, &d), PLUMB_EPARSE);
    assert_string_equal(d.file, "--vary");
    assert_string_equal(d.key, "site.latitude");
    assert_non_null(strstr(d.message, "FROM 'N'"));
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_celsius_step_of_wrong_sign_is_refused_naming_the_option),
        cmocka_unit_test(test_celsius_range_counts_in_celsius),
        cmocka_unit_test(test_fahrenheit_range_counts_in_fahrenheit),
        cmocka_unit_test(test_mixed_temperature_units_count_in_kelvin_with_the_step_a_difference),
        cmocka_unit_test(test_zero_step_is_refused),
        cmocka_unit_test(test_a_range_may_run_down_with_a_negative_step),
        cmocka_unit_test(test_count_stops_at_the_cap),
        cmocka_unit_test(test_a_count_past_any_integer_is_refused_without_overflow),
        cmocka_unit_test(test_malformed_ranges_are_refused),
        cmocka_unit_test(test_values_are_written_as_a_user_would_type_them),
        cmocka_unit_test(test_two_ranges_past_the_row_cap_are_refused_before_running),
        cmocka_unit_test(test_a_row_that_never_lands_is_that_rows_error),
        cmocka_unit_test(test_a_direction_range_may_run_between_compass_points),
        cmocka_unit_test(test_a_boundary_is_of_the_item_its_key_names_and_keeps_why_it_is_missing),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
