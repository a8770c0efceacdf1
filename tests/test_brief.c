/*
 * test_brief.c - what a printed sheet says of a profile (include/plumb/brief.h),
 * checked against closed forms on a drag-free payload.
 *
 * Sources:
 *  - Drag-free fall (work-energy theorem): E(H) = 1/2 m |v0|^2 + m g H, and
 *    the height for an energy E is H = (E - 1/2 m |v0|^2) / (m g); g = g0 =
 *    9.80665 m/s^2 (3rd CGPM, 1901) with no latitude.
 *  - Drag-free projectile: d(t) = u t, z(t) = H + w t - g t^2 / 2, so the
 *    path is the parabola z(d) = H + (w / u) d - g d^2 / (2 u^2).
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

#define G0 9.80665

/* the units and the bundled criteria (tests/support/plumb_test.h) */
typedef plumbt_fixture fixture;

/* An invented drag-free payload thrown level at 3.1 m/s east from 17.3 m. */
static const char drag_free_yaml[] =
    "name: drag-free test weight\n"
    "job: {title: Test lift, site: Yard 4, prepared_by: A. Person}\n"
    "payload: {mass: 1.45 kg, drag: {cd: 0, area: 0.01 m^2}}\n"
    "release: {height: 17.3 m, velocity: {east: 3.1 m/s, north: 0 m/s, up: 0 m/s}}\n"
    "criteria: [us-part107-cat3, eu-c1-80j]\n";

static void open_brief(fixture *f, const char *yaml, plumb_profile **p, plumb_study **st,
                       plumb_brief **b)
{
    plumb_diag d;
    assert_int_equal(plumb_profile_load_buffer("<test>", yaml, strlen(yaml), f->units, NULL, 0, p,
                                               &d),
                     PLUMB_OK);
    assert_int_equal(plumb_study_open(*p, f->criteria, f->units, NULL, st, &d), PLUMB_OK);
    assert_int_equal(plumb_brief_alloc(*st, NULL, b, &d), PLUMB_OK);
}

/* The curve, the limit heights and the drag-free path of a drag-free
 * payload are the closed forms; the planned path is the same parabola. */
static void test_a_drag_free_brief_is_the_closed_form(void **state)
{
    fixture *f = *state;
    plumb_profile *p = NULL;
    plumb_study *st = NULL;
    plumb_brief *b = NULL;
    open_brief(f, drag_free_yaml, &p, &st, &b);
    const double m = 1.45, H = 17.3, u = 3.1;
    assert_int_equal(b->n_plots, 1);
    const plumb_brief_plot *pl = &b->plots[0];
    /* E(h) = 1/2 m u^2 + m g h at every height of the curve; 1e-12 relative,
     * the drag-free fall being a polynomial the 8th-order stepper follows */
    assert_true(pl->n_curve > 10);
    for (size_t i = 0; i < pl->n_curve; i++) {
        assert_true(pl->curve_ok[i]);
        assert_rel(pl->curve_e_j[i], 0.5 * m * u * u + m * G0 * pl->curve_h_m[i], 1e-12);
    }
    /* the curve reaches past twice the planned height */
    assert_true(pl->curve_h_m[pl->n_curve - 1] >= 2.0 * H * (1.0 - 1e-12));
    /* limit heights: (E - 1/2 m u^2) / (m g), to the solver's 1e-10 */
    const plumb_item_report *it = &b->fall->items[pl->item];
    assert_int_equal(pl->n_limits, 2);
    for (size_t k = 0; k < pl->n_limits; k++) {
        double e = it->verdicts[k].criterion->energy_limit_j;
        assert_int_equal(pl->limits[k].outcome, PLUMB_LIMIT_FOUND);
        assert_rel(pl->limits[k].value_si, (e - 0.5 * m * u * u) / (m * G0), 1e-9);
    }
    /* both paths on the parabola z(d) = H - g d^2 / (2 u^2), to 1e-9 of H */
    for (int k = 0; k < 2; k++) {
        const plumb_brief_path *path = k ? &pl->drag_free : &pl->path;
        assert_true(path->n >= 2);
        for (size_t i = 0; i < path->n; i++)
            assert_abs(path->z_m[i], H - G0 * path->d_m[i] * path->d_m[i] / (2.0 * u * u),
                       1e-9 * H);
        assert_abs(path->z_m[path->n - 1], 0.0, 1e-9 * H);
        assert_rel(path->d_m[path->n - 1], u * sqrt(2.0 * H / G0), 1e-9);
    }
    /* no uncertainty: no zone, said in words */
    assert_null(b->zone);
    assert_string_equal(b->no_zone, "no clearance zone: inputs carry no uncertainty");
    /* the criteria judged, each once, with their files' SHA-256 */
    assert_int_equal(b->n_criteria, 2);
    for (size_t k = 0; k < b->n_criteria; k++) {
        assert_int_equal(strlen(b->criteria[k]->sha256), 64);
        assert_non_null(strstr(b->criteria[k]->path, b->criteria[k]->id));
    }
    /* the job map */
    const plumb_job *job = plumb_profile_job(p);
    assert_string_equal(job->title, "Test lift");
    assert_string_equal(job->site, "Yard 4");
    assert_string_equal(job->prepared_by, "A. Person");
    assert_string_equal(job->checked_by, "");
    plumb_brief_free(b);
    plumb_study_free(st);
    plumb_profile_free(p);
}

/* An inventory's order is worst first: by the largest ratio to a
 * criterion, which for drag-free items from one height is by mass. */
static void test_an_inventory_is_ordered_worst_first(void **state)
{
    fixture *f = *state;
    static const char yaml[] =
        "name: three weights\n"
        "items:\n"
        "  - {name: light, mass: 0.2 kg, drag: {cd: 0, area: 0.01 m^2}}\n"
        "  - {name: heavy, mass: 3.1 kg, drag: {cd: 0, area: 0.01 m^2}}\n"
        "  - {name: middle, mass: 1.2 kg, drag: {cd: 0, area: 0.01 m^2}}\n"
        "release: {height: 9.5 m}\n"
        "criteria: [eu-c1-80j]\n";
    plumb_profile *p = NULL;
    plumb_study *st = NULL;
    plumb_brief *b = NULL;
    open_brief(f, yaml, &p, &st, &b);
    assert_int_equal(b->order[0], 1);
    assert_int_equal(b->order[1], 2);
    assert_int_equal(b->order[2], 0);
    assert_int_equal(b->n_plots, 3);
    assert_int_equal(b->plots[0].item, 1);
    /* heavy: E = m g H = 3.1 x 9.80665 x 9.5 J */
    assert_rel(b->fall->items[1].result.energy_j, 3.1 * G0 * 9.5, 1e-12);
    plumb_brief_free(b);
    plumb_study_free(st);
    plumb_profile_free(p);
}

/* A job value that is not text is refused where it is (exit 2 input error). */
static void test_a_bad_job_value_is_refused(void **state)
{
    fixture *f = *state;
    static const char yaml[] = "name: t\njob: {title: [a, b]}\n"
                               "payload: {mass: 1 kg, drag: {cd: 1, area: 0.01 m^2}}\n"
                               "release: {height: 5 m}\n";
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_status s = plumb_profile_load_buffer("<test>", yaml, strlen(yaml), f->units, NULL, 0, &p,
                                               &d);
    assert_true(plumb_status_is_input_error(s));
    assert_null(p);
    assert_int_equal(d.line, 2);
    assert_non_null(strstr(d.key, "job.title"));
}

/* The falls the zone will run, for the note before a long run: the drone
 * release demo (one payload, zone.samples 50000, a target: two passes)
 * runs 100 000, or 2 x --samples; a profile without uncertainty none. */
static void test_the_zone_falls_are_counted_before_the_run(void **state)
{
    fixture *f = *state;
    char path[1024];
    snprintf(path, sizeof path, "%s/profiles/demo/drone-release.yaml", plumbt_srcdir());
    plumb_profile *p = NULL;
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_profile_load(path, f->units, NULL, 0, &p, &d), PLUMB_OK);
    assert_int_equal(plumb_study_open(p, f->criteria, f->units, NULL, &st, &d), PLUMB_OK);
    plumb_brief_options o;
    plumb_brief_options_init(&o);
    assert_true(plumb_brief_zone_falls(st, NULL) == 100000.0);
    o.samples = 1234;
    assert_true(plumb_brief_zone_falls(st, &o) == 2468.0);
    o.zone = 0;
    assert_true(plumb_brief_zone_falls(st, &o) == 0.0);
    plumb_study_free(st);
    plumb_profile_free(p);
    assert_int_equal(plumb_profile_load_buffer("<test>", drag_free_yaml, strlen(drag_free_yaml),
                                               f->units, NULL, 0, &p, &d), PLUMB_OK);
    assert_int_equal(plumb_study_open(p, f->criteria, f->units, NULL, &st, &d), PLUMB_OK);
    assert_true(plumb_brief_zone_falls(st, NULL) == 0.0);
    plumb_study_free(st);
    plumb_profile_free(p);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_a_drag_free_brief_is_the_closed_form),
        cmocka_unit_test(test_an_inventory_is_ordered_worst_first),
        cmocka_unit_test(test_a_bad_job_value_is_refused),
        cmocka_unit_test(test_the_zone_falls_are_counted_before_the_run),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_units_criteria, plumbt_teardown_units_criteria);
}
