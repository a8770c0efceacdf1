/*
 * test_sweep_falls.c - the sweep (include/plumb/sweep.h): ranges counted
 * as the contract says, rows that are the falls `plumb fall --set` gives,
 * in the documented order, judged against the criteria, and equal to the
 * closed forms where there are some. (Range parsing in detail, with
 * temperatures and downward ranges, is for test_sweep.c.)
 *
 * Sources of the expected values:
 *   - sweep.h: value_i = FROM + i STEP for every value not above TO, in the
 *     unit typed when FROM, TO and STEP share it, else in SI; written with
 *     15 significant digits; two axes, the first varying slowest; at most
 *     PLUMB_SWEEP_MAX_ROWS rows. The count of an inclusive range is
 *     1 + floor((TO - FROM) / STEP) (arithmetic).
 *   - 1 ft = 0.3048 m exactly (1959 international yard and pound
 *     agreement); 1 ft lbf = 0.3048 x 0.45359237 x 9.80665 J.
 *   - 14 CFR 107.130(a)(1): 25 ft lbf (profiles/criteria/us-part107-cat3).
 *   - work-energy theorem, drag-free fall from rest: E = m g0 H,
 *     g0 = 9.80665 m/s^2 (3rd CGPM, 1901).
 *   - constant density, fall from rest (closed-form solution of
 *     m dv/dt = m g - rho Cd A v^2 / 2):
 *     v(H) = v_t sqrt(1 - exp(-2 g H / v_t^2)), v_t = sqrt(2 m g / (rho Cd A)).
 * Tolerances: 1e-12 for a drag-free fall (a polynomial in time, followed
 * exactly by the 8th-order stepper), 1e-9 for a fall in drag (the
 * documented accuracy of a fall, README "The model"); rows against a
 * direct fall: bit for bit (sweep.h).
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

/* Standard gravity, m/s^2 (3rd CGPM, 1901). */
#define G0 9.80665
/* 1 ft, m, and 1 ft lbf, J, by definition (1959 agreement). */
#define FT_M 0.3048
#define FT_LBF_J (0.3048 * 0.45359237 * 9.80665)

static plumb_units *units;
static plumb_criteria *crit;
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
    char cdir[512];
    snprintf(cdir, sizeof cdir, "%s/profiles/criteria", plumbt_srcdir());
    if (plumb_criteria_load_dir(cdir, units, &crit, &d) != PLUMB_OK) {
        fprintf(stderr, "%s: %s\n", cdir, d.message);
        return -1;
    }
    if (plumb_trajectory_alloc(NULL, &traj) != PLUMB_OK)
        return -1;
    const char *tmp = getenv("TMPDIR");
    snprintf(dir, sizeof dir, "%s/plumb-test-sweep-falls-XXXXXX", tmp && *tmp ? tmp : "/tmp");
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
    plumb_criteria_free(crit);
    plumb_units_free(units);
    return 0;
}

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

/* The i-th value of r in SI; fails the test when it cannot be had. */
static double value_si(const plumb_range *r, size_t i)
{
    double si = 0.0;
    plumb_diag d;
    assert_int_equal(plumb_range_value_si(r, units, i, &si, &d), PLUMB_OK);
    return si;
}

static plumb_range range(const char *text)
{
    plumb_range r;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_range_parse_key(units, text, &r, &d);
    if (st != PLUMB_OK)
        fprintf(stderr, "%s: %s\n", text, d.message);
    assert_int_equal(st, PLUMB_OK);
    return r;
}

static plumb_sweep *sweep(const plumb_profile *p, const plumb_range *axes, size_t n)
{
    plumb_sweep *s = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_sweep_run(p, units, crit, axes, n, traj, &s, &d);
    if (st != PLUMB_OK)
        fprintf(stderr, "sweep: %s: %s\n", d.key, d.message);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(s);
    return s;
}

/* A spanner off a stack in a power-law wind, with a level release speed:
 * no closed form, so rows are compared with direct falls. */
static const char spanner[] = "name: test spanner\n"
                              "payload: {mass: 2.385 kg, drag: {cd: 0.93, area: 0.0187 m^2}}\n"
                              "release:\n"
                              "  height: 31.6 m\n"
                              "  velocity: {speed: 7.3 m/s, heading: 113.7 deg}\n"
                              "site: {elevation: 417 m, latitude: 52.7 deg}\n"
                              "wind: {profile: power, speed: 6.1 m/s, from: 247 deg}\n"
                              "criteria: [us-part107-cat3]\n";

/* ---- ranges ------------------------------------------------------------------- */

static void test_a_range_counts_from_from_by_step_while_not_above_to(void **state)
{
    (void)state;
    plumb_range r = range("release.height=3.7m:41.2m:6.25m");
    /* 1 + floor((41.2 - 3.7) / 6.25) = 7: 3.7, 9.95, ... 41.2 */
    assert_int_equal(r.n, 7);
    assert_string_equal(r.key, "release.height");
    assert_string_equal(r.unit, "m");
    assert_int_equal(r.dim, PLUMB_DIM_LENGTH);
    for (size_t i = 0; i < r.n; i++)
        assert_rel(plumb_range_value(&r, i), 3.7 + 6.25 * (double)i, 1e-15);
    /* TO not on the grid: 1 + floor((40 - 3.7) / 6.25) = 6, the last 34.95 */
    r = range("release.height=3.7m:40m:6.25m");
    assert_int_equal(r.n, 6);
    assert_rel(plumb_range_value(&r, 5), 34.95, 1e-15);
    /* one value when FROM = TO */
    r = range("release.height=31.6m:31.6m:2m");
    assert_int_equal(r.n, 1);
}

static void test_values_are_written_as_typed_so_tenths_add_up(void **state)
{
    (void)state;
    /* 0 + 3 x 0.1 is 0.30000000000000004 in binary; written with 15
     * digits it is 0.3, what a user types; and 0:1:0.1 ends on 1 (11 values) */
    plumb_range r = range("payload.drag.cd=0:1:0.1");
    assert_int_equal(r.n, 11);
    assert_string_equal(r.unit, "");
    assert_true(plumb_range_value(&r, 3) == 0.3);
    assert_true(plumb_range_value(&r, 10) == 1.0);
    char text[128];
    plumb_range_set_text(&r, 3, text, sizeof text);
    assert_string_equal(text, "payload.drag.cd=0.3");
}

static void test_a_range_in_feet_counts_in_feet_and_converts_by_0_3048(void **state)
{
    (void)state;
    plumb_range r = range("release.height=12.7ft:131ft:23.9ft");
    /* 1 + floor((131 - 12.7) / 23.9) = 1 + floor(4.95) = 5 */
    assert_int_equal(r.n, 5);
    assert_string_equal(r.unit, "ft");
    for (size_t i = 0; i < r.n; i++) {
        double ft = 12.7 + 23.9 * (double)i;
        assert_rel(plumb_range_value(&r, i), ft, 1e-15);
        assert_rel(value_si(&r, i), ft * FT_M, 1e-15); /* 1 ft = 0.3048 m */
    }
    char text[128];
    plumb_range_set_text(&r, 1, text, sizeof text);
    assert_string_equal(text, "release.height=36.6 ft");
    /* mixed units: counted in SI, from 10 ft = 3.048 m by 1 m to 10 m: 7 values */
    r = range("release.height=10ft:10m:1m");
    assert_string_equal(r.unit, "m");
    assert_rel(r.from, 10.0 * FT_M, 1e-15);
    assert_int_equal(r.n, 7);
}

static void test_malformed_ranges_are_refused(void **state)
{
    (void)state;
    static const struct {
        const char *text;
        plumb_status want;
    } cases[] = {
        {"release.height=2m:60m", PLUMB_EPARSE},          /* two parts */
        {"release.height=2m:60m:2m:4m", PLUMB_EPARSE},    /* four parts */
        {"release.height=2 kg:60 m:2 m", PLUMB_EUNIT},    /* a mass for a length */
        {"release.height=2:60:2", PLUMB_EUNIT},           /* a length needs its unit */
        {"release.height=2m:60m:0m", PLUMB_ERANGE},       /* zero step */
        {"release.height=60m:2m:2m", PLUMB_ERANGE},       /* a step away from TO */
        {"release.height=0.001m:1000m:0.001m", PLUMB_ERANGE}, /* a million values */
        {"release.hieght=2m:60m:2m", PLUMB_EKEY},         /* unknown key */
        {"wind.profile=2m:60m:2m", PLUMB_EINVAL},         /* not numeric */
        {"=2m:60m:2m", PLUMB_EPARSE},                     /* no key */
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        plumb_range r;
        plumb_diag d;
        plumb_diag_clear(&d);
        plumb_status st = plumb_range_parse_key(units, cases[i].text, &r, &d);
        if (st != cases[i].want)
            fprintf(stderr, "%s: status %d: %s\n", cases[i].text, (int)st, d.message);
        assert_int_equal(st, cases[i].want);
        assert_int_equal(d.status, cases[i].want);
        assert_true(d.message[0] != '\0');
    }
}

/* ---- rows ----------------------------------------------------------------------- */

/* The fall of p with one more override, run directly. */
static plumb_fall_result direct_fall(const plumb_profile *p, const char *set, size_t item)
{
    plumb_profile *q = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    const char *sets[1] = {set};
    assert_int_equal(plumb_profile_derive(p, units, sets, 1, &q, &d), PLUMB_OK);
    plumb_atmosphere *atm = NULL;
    assert_int_equal(plumb_atmosphere_alloc(plumb_profile_atmosphere(q), &atm, &d), PLUMB_OK);
    plumb_fall_result r;
    assert_int_equal(plumb_trajectory_run(traj, plumb_profile_item(q, item), atm, &r, &d),
                     PLUMB_OK);
    plumb_atmosphere_free(atm);
    plumb_profile_free(q);
    return r;
}

static void assert_same_fall(const plumb_fall_result *a, const plumb_fall_result *b)
{
    /* bit for bit (sweep.h) */
    assert_true(a->time_s == b->time_s);
    assert_true(a->speed_m_s == b->speed_m_s);
    assert_true(a->energy_j == b->energy_j);
    assert_true(a->point_m[0] == b->point_m[0]);
    assert_true(a->point_m[1] == b->point_m[1]);
    assert_true(a->velocity_m_s[2] == b->velocity_m_s[2]);
    assert_true(a->drift_m == b->drift_m);
    assert_true(a->apex_m == b->apex_m);
    assert_true(a->terminal_speed_m_s == b->terminal_speed_m_s);
}

static void test_every_row_is_the_fall_of_the_profile_set_to_its_value(void **state)
{
    (void)state;
    plumb_profile *p = load(spanner);
    plumb_range r = range("wind.speed=1.3kn:19.3kn:4.5kn");
    plumb_sweep *s = sweep(p, &r, 1);
    assert_int_equal(plumb_sweep_axis_count(s), 1);
    assert_string_equal(plumb_sweep_axis(s, 0)->key, "wind.speed");
    assert_null(plumb_sweep_axis(s, 1));
    assert_int_equal(plumb_sweep_row_count(s), 5); /* 1 + floor(18 / 4.5) */
    for (size_t i = 0; i < 5; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(s, i);
        assert_non_null(row);
        assert_int_equal(row->index[0], i);
        assert_rel(row->value[0], 1.3 + 4.5 * (double)i, 1e-15);
        /* 1 kn = 1852 m / 3600 s (international nautical mile) */
        assert_rel(row->value_si[0], (1.3 + 4.5 * (double)i) * 1852.0 / 3600.0, 1e-14);
        char set[128];
        plumb_range_set_text(&r, i, set, sizeof set);
        plumb_fall_result f = direct_fall(p, set, 0);
        assert_int_equal(row->report.n_items, 1);
        assert_same_fall(&row->report.items[0].result, &f);
        /* judged as plumb fall judges: ratio to 25 ft lbf (14 CFR 107.130(a)(1)) */
        assert_int_equal(row->report.items[0].n_verdicts, 1);
        const plumb_verdict *v = &row->report.items[0].verdicts[0];
        assert_string_equal(v->criterion->id, "us-part107-cat3");
        assert_rel(v->ratio, f.energy_j / (25.0 * FT_LBF_J), 1e-12);
        assert_int_equal(v->exceeds, f.energy_j > 25.0 * FT_LBF_J);
    }
    assert_null(plumb_sweep_row_at(s, 5));
    plumb_sweep_free(s);
    plumb_profile_free(p);
}

static void test_two_axes_make_every_pair_with_the_first_varying_slowest(void **state)
{
    (void)state;
    plumb_profile *p = load(spanner);
    plumb_range axes[2] = {range("release.height=12.7m:31.6m:9.45m"),
                           range("payload.mass=0.413kg:2.385kg:0.986kg")};
    assert_int_equal(axes[0].n, 3);
    assert_int_equal(axes[1].n, 3);
    plumb_sweep *s = sweep(p, axes, 2);
    assert_int_equal(plumb_sweep_row_count(s), 9);
    for (size_t k = 0; k < 9; k++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(s, k);
        assert_int_equal(row->index[0], k / 3);
        assert_int_equal(row->index[1], k % 3);
        assert_rel(row->value_si[0], 12.7 + 9.45 * (double)(k / 3), 1e-15);
        assert_rel(row->value_si[1], 0.413 + 0.986 * (double)(k % 3), 1e-15);
        /* the row's spec carries both values */
        const plumb_fall_spec *spec = row->report.items[0].spec;
        assert_rel(spec->release_m[2], row->value_si[0], 0.0);
        assert_rel(spec->mass_kg, row->value_si[1], 0.0);
    }
    plumb_sweep_free(s);
    plumb_profile_free(p);
}

static void test_an_inventory_gives_every_item_in_every_row(void **state)
{
    (void)state;
    plumb_profile *p = load("name: kit\n"
                            "items:\n"
                            "  - {name: spanner, mass: 2.385 kg, drag: {cd: 0.93, area: 0.0187 m^2}}\n"
                            "  - {name: radio, mass: 0.412 kg, drag: {cd_area: 0.0063 m^2}}\n"
                            "release: {height: 31.6 m}\n"
                            "criteria: [us-part107-cat3]\n");
    plumb_range r = range("release.height=7.3m:21.9m:7.3m");
    plumb_sweep *s = sweep(p, &r, 1);
    assert_int_equal(plumb_sweep_row_count(s), 3);
    for (size_t i = 0; i < 3; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(s, i);
        assert_int_equal(row->report.n_items, 2);
        char set[128];
        plumb_range_set_text(&r, i, set, sizeof set);
        for (size_t it = 0; it < 2; it++) {
            plumb_fall_result f = direct_fall(p, set, it);
            assert_same_fall(&row->report.items[it].result, &f);
        }
    }
    plumb_sweep_free(s);
    plumb_profile_free(p);
}

/* ---- rows against closed forms --------------------------------------------------- */

static void test_drag_free_rows_carry_energies_m_g_h(void **state)
{
    (void)state;
    plumb_profile *p = load("name: drag-free\n"
                            "payload: {mass: 2.385 kg, drag: {cd: 0, area: 0.0117 m^2}}\n"
                            "release: {height: 31.6 m}\n"
                            "criteria: [us-part107-cat3]\n");
    plumb_range r = range("release.height=3.7m:41.2m:6.25m");
    plumb_sweep *s = sweep(p, &r, 1);
    assert_int_equal(plumb_sweep_row_count(s), 7);
    for (size_t i = 0; i < 7; i++) {
        const plumb_fall_result *f = &plumb_sweep_row_at(s, i)->report.items[0].result;
        double h = 3.7 + 6.25 * (double)i;
        assert_rel(f->energy_j, 2.385 * G0 * h, 1e-12);   /* work-energy theorem */
        assert_rel(f->speed_m_s, sqrt(2.0 * G0 * h), 1e-12);
        assert_rel(f->drag_work_j, 0.0, 1e-12);           /* no drag, no work */
    }
    plumb_sweep_free(s);
    plumb_profile_free(p);
}

static void test_constant_air_rows_carry_the_closed_form_speeds(void **state)
{
    (void)state;
    plumb_profile *p =
        load("name: constant air\n"
             "payload: {mass: 2.385 kg, drag: {cd: 0.87, area: 0.0213 m^2}}\n"
             "release: {height: 31.6 m}\n"
             "atmosphere:\n"
             "  model: table\n"
             "  table:\n"
             "    - {altitude: -1000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}\n"
             "    - {altitude: 40000 m, density: 1.2041 kg/m^3, temperature: 293.15 K}\n"
             "criteria: [us-part107-cat3]\n");
    plumb_range r = range("release.height=4.37m:187.3m:13.9m");
    plumb_sweep *s = sweep(p, &r, 1);
    assert_int_equal(plumb_sweep_row_count(s), 14); /* 1 + floor(182.93 / 13.9) */
    double vt = sqrt(2.0 * 2.385 * G0 / (1.2041 * 0.87 * 0.0213)); /* drag balance */
    for (size_t i = 0; i < 14; i++) {
        const plumb_fall_result *f = &plumb_sweep_row_at(s, i)->report.items[0].result;
        double h = 4.37 + 13.9 * (double)i;
        double v = vt * sqrt(1.0 - exp(-2.0 * G0 * h / (vt * vt))); /* closed form v(H) */
        assert_rel(f->speed_m_s, v, 1e-9);
        assert_rel(f->terminal_speed_m_s, vt, 1e-12);
    }
    plumb_sweep_free(s);
    plumb_profile_free(p);
}

/* ---- refusals ---------------------------------------------------------------------- */

static void test_sweeps_of_no_axes_a_key_twice_or_too_many_rows_are_refused(void **state)
{
    (void)state;
    plumb_profile *p = load(spanner);
    plumb_range axes[3] = {range("release.height=12.7m:31.6m:9.45m"),
                           range("release.height=2m:4m:1m"),
                           range("payload.mass=0.413kg:2.385kg:0.986kg")};
    plumb_sweep *s = (plumb_sweep *)1;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_sweep_run(p, units, crit, axes, 0, traj, &s, &d), PLUMB_EINVAL);
    assert_null(s);
    assert_int_equal(plumb_sweep_run(p, units, crit, axes, 3, traj, &s, &d), PLUMB_EINVAL);
    assert_null(s);
    assert_int_equal(plumb_sweep_run(p, units, crit, axes, 2, traj, &s, &d), PLUMB_EINVAL);
    assert_null(s);
    assert_string_equal(d.key, "release.height");
    /* 101 x 100 = 10 100 rows > PLUMB_SWEEP_MAX_ROWS (10 000), refused before any fall */
    plumb_range big[2] = {range("release.height=1m:101m:1m"),
                          range("payload.mass=0.01kg:1kg:0.01kg")};
    assert_int_equal(big[0].n, 101);
    assert_int_equal(big[1].n, 100);
    plumb_diag_clear(&d);
    assert_int_equal(plumb_sweep_run(p, units, crit, big, 2, traj, &s, &d), PLUMB_ERANGE);
    assert_null(s);
    assert_non_null(strstr(d.message, "10000"));
    plumb_sweep_free(NULL); /* accepted */
    plumb_profile_free(p);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_a_range_counts_from_from_by_step_while_not_above_to),
        cmocka_unit_test(test_values_are_written_as_typed_so_tenths_add_up),
        cmocka_unit_test(test_a_range_in_feet_counts_in_feet_and_converts_by_0_3048),
        cmocka_unit_test(test_malformed_ranges_are_refused),
        cmocka_unit_test(test_every_row_is_the_fall_of_the_profile_set_to_its_value),
        cmocka_unit_test(test_two_axes_make_every_pair_with_the_first_varying_slowest),
        cmocka_unit_test(test_an_inventory_gives_every_item_in_every_row),
        cmocka_unit_test(test_drag_free_rows_carry_energies_m_g_h),
        cmocka_unit_test(test_constant_air_rows_carry_the_closed_form_speeds),
        cmocka_unit_test(test_sweeps_of_no_axes_a_key_twice_or_too_many_rows_are_refused),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
