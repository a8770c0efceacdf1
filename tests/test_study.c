/*
 * test_study.c - the study API (include/plumb/study.h): one engine under
 * every command, checked against closed forms and against itself.
 *
 * Sources:
 *  - Drag-free fall: v = sqrt(v0^2 + 2 g H), E = 1/2 m v0^2 + m g H, and
 *    the height for an energy H = E / (m g) - v0^2 / (2 g) (work-energy
 *    theorem; g = g0 = 9.80665 m/s^2, CGPM 1901, with no latitude).
 *  - Quadratic drag in constant air: v(H) = v_t sqrt(1 - exp(-2 g H / v_t^2)),
 *    v_t = sqrt(2 m g / (rho CdA)) (any mechanics text, e.g. Marion &
 *    Thornton, Classical Dynamics, sec. 2.4).
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

/* the units and the bundled criteria (tests/support/plumb_test.h) */
typedef plumbt_fixture fixture;

static void drag_free_spec(plumb_fall_spec *s, double m_kg, double h_m, double v0_east)
{
    memset(s, 0, sizeof *s);
    snprintf(s->name, sizeof s->name, "test weight");
    s->mass_kg = m_kg;
    s->drag.model = PLUMB_DRAG_FIXED; /* cd 0: drag-free */
    s->release_m[2] = h_m;
    s->velocity_m_s[0] = v0_east;
    plumb_wind_spec_init(&s->wind);
}

/* A spec built in code runs, is judged and reports: closed-form drag-free
 * figures, the verdict against a named criterion, and a JSON report that
 * names it as built in code with a SHA-256 of its inputs. */
static void test_a_spec_built_in_code_is_run_judged_and_reported(void **state)
{
    fixture *f = *state;
    plumb_fall_spec s;
    drag_free_spec(&s, 2.385, 31.6, 7.3);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    const char *ids[] = {"us-part107-cat3"};
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_study_open_spec(&s, &atm, ids, 1, f->criteria, f->units, &st, &d),
                     PLUMB_OK);
    const plumb_fall_report *rep = NULL;
    assert_int_equal(plumb_study_fall(st, &rep, &d), PLUMB_OK);
    assert_int_equal(rep->n_items, 1);
    const double g = PLUMB_G0_M_S2;
    assert_rel(rep->items[0].result.speed_m_s, sqrt(7.3 * 7.3 + 2.0 * g * 31.6), 1e-12);
    assert_rel(rep->items[0].result.energy_j, 0.5 * 2.385 * 7.3 * 7.3 + 2.385 * g * 31.6, 1e-12);
    assert_int_equal(rep->items[0].n_verdicts, 1);
    assert_string_equal(rep->items[0].verdicts[0].criterion->id, "us-part107-cat3");
    /* 14 CFR 107.130(a)(1): 25 ft-lbf = 33.8954 J; the weight brings ~802 J */
    assert_true(rep->items[0].verdicts[0].exceeds);

    char *buf = NULL;
    size_t len = 0;
    FILE *mem = open_memstream(&buf, &len);
    assert_non_null(mem);
    plumb_report_options ro = {PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, NULL};
    assert_int_equal(plumb_report_fall(mem, &ro, rep, &d), PLUMB_OK);
    fclose(mem);
    assert_non_null(strstr(buf, PLUMB_PROFILE_FROM_CODE));
    assert_non_null(strstr(buf, "test weight"));
    const char *sha = plumb_profile_sha256(plumb_study_profile(st));
    assert_int_equal(strlen(sha), 64);
    assert_non_null(strstr(buf, sha));
    assert_non_null(strstr(buf, "cautions"));
    free(buf);
    plumb_study_free(st);
}

/* The SHA-256 of a code-built profile follows its inputs: the same spec
 * gives the same hash, a mass differing in the last digit another. */
static void test_a_code_built_profile_is_traced_by_the_hash_of_its_inputs(void **state)
{
    (void)state;
    plumb_fall_spec s;
    drag_free_spec(&s, 0.731, 43.7, 0.0);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    plumb_profile *a = NULL, *b = NULL, *c = NULL;
    plumb_diag d;
    assert_int_equal(plumb_profile_from_spec(&s, &atm, NULL, 0, &a, &d), PLUMB_OK);
    assert_int_equal(plumb_profile_from_spec(&s, &atm, NULL, 0, &b, &d), PLUMB_OK);
    s.mass_kg = nextafter(s.mass_kg, 1.0);
    assert_int_equal(plumb_profile_from_spec(&s, &atm, NULL, 0, &c, &d), PLUMB_OK);
    assert_string_equal(plumb_profile_sha256(a), plumb_profile_sha256(b));
    assert_string_not_equal(plumb_profile_sha256(a), plumb_profile_sha256(c));
    assert_string_equal(plumb_profile_path(a), PLUMB_PROFILE_FROM_CODE);
    plumb_profile_free(a);
    plumb_profile_free(b);
    plumb_profile_free(c);
    /* a table wind without its rows is refused, nothing made */
    s.wind.profile = PLUMB_WIND_TABLE;
    assert_int_equal(plumb_profile_from_spec(&s, &atm, NULL, 0, &a, &d), PLUMB_EINVAL);
    assert_null(a);
}

/* An unknown criterion id is refused when the study is opened, with the
 * nearest id suggested. */
static void test_a_study_refuses_an_unknown_criterion_when_opened(void **state)
{
    fixture *f = *state;
    plumb_fall_spec s;
    drag_free_spec(&s, 1.0, 10.0, 0.0);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    const char *ids[] = {"us-part107-cat4"};
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_study_open_spec(&s, &atm, ids, 1, f->criteria, f->units, &st, &d),
                     PLUMB_EKEY);
    assert_null(st);
    assert_string_equal(d.key, "criteria[0]");
    assert_non_null(strstr(d.message, "us-part107-cat"));
}

/* plumb_study_lint: an unknown criterion id is listed with the profile's
 * other errors, in file order, at the id's own line and column (counted
 * here in the text), and the second unknown id keeps its index; the
 * criteria are loaded only for a profile that names one, and a set that
 * does not load is listed last. Positions: YAML 1.2 counts lines and
 * columns from 1, as libyaml's marks plus one. */
static void test_lint_lists_an_unknown_criterion_with_the_other_errors(void **state)
{
    fixture *f = *state;
    static const char text[] = "name: lint of criteria\n"
                               "payload:\n"
                               "  mass: 2.385\n"
                               "  drag: {cd_area: 0.019 m^2}\n"
                               "release: {height: 31.6 m}\n"
                               "criteria: [eu-c9, us-part107-cat3, en397]\n"
                               "zone: {samples: -4}\n";
    plumb_diag errs[8];
    size_t n = 0;
    plumb_criteria *set = f->criteria;
    assert_int_not_equal(plumb_study_lint("t.yaml", text, strlen(text), f->units, NULL, 0, NULL,
                                          &set, errs, 8, &n),
                         PLUMB_OK);
    assert_int_equal(n, 4);
    static const struct { int line, col; const char *key; } want[] = {
        {3, 9, "payload.mass"}, {6, 12, "criteria[0]"}, {6, 36, "criteria[2]"},
        {7, 17, "zone.samples"}};
    for (size_t i = 0; i < 4; i++) {
        assert_int_equal(errs[i].line, want[i].line);
        assert_int_equal(errs[i].col, want[i].col);
        assert_string_equal(errs[i].key, want[i].key);
        assert_string_equal(errs[i].file, "t.yaml");
    }
    assert_int_equal(errs[1].status, PLUMB_EKEY);
    assert_non_null(strstr(errs[1].message, "unknown criterion 'eu-c9'; did you mean 'eu-c1-80j'?"));
    assert_non_null(strstr(errs[2].message, "'en397-penetration-29j' or 'en397-shock-49j'"));
    assert_ptr_equal(set, f->criteria);

    /* no criteria given: the set is loaded from the directory on first
     * need only, and one that does not load comes last */
    char dir[512];
    assert_non_null(plumbt_mkdtemp("lint", dir, sizeof dir));
    char missing[600];
    snprintf(missing, sizeof missing, "%s/none", dir);
    static const char good[] = "payload:\n"
                               "  mass: 2.385 kg\n"
                               "  drag: {cd_area: 0.019 m^2}\n"
                               "release: {height: 31.6 m}\n";
    set = NULL;
    assert_int_equal(plumb_study_lint("g.yaml", good, strlen(good), f->units, NULL, 0, missing,
                                      &set, errs, 8, &n),
                     PLUMB_OK);
    assert_int_equal(n, 0);
    assert_null(set);
    assert_int_not_equal(plumb_study_lint("t.yaml", text, strlen(text), f->units, NULL, 0,
                                          missing, &set, errs, 8, &n),
                         PLUMB_OK);
    assert_null(set);
    assert_int_equal(n, 3);
    assert_string_equal(errs[1].key, "zone.samples");
    assert_string_equal(errs[2].file, missing);
    assert_int_equal(errs[2].status, PLUMB_EIO);
    assert_int_equal(rmdir(dir), 0);

    assert_int_equal(plumb_study_lint(NULL, text, strlen(text), f->units, NULL, 0, missing,
                                      &set, errs, 8, &n),
                     PLUMB_EINVAL);
    assert_int_equal(plumb_study_lint("t.yaml", text, strlen(text), f->units, NULL, 0, NULL,
                                      &set, errs, 8, &n),
                     PLUMB_EINVAL);
    assert_int_equal(n, 1);
}

/* The limit through the study: the drag-free mass for 913.7 J of a weight
 * thrown level at 7.3 m/s from 31.6 m, m = E / (v0^2/2 + g H) (work-energy
 * theorem); and the limit given as text, a quantity or a criterion's id.
 * A key that only the loader derives is refused for a code-built profile. */
static void test_the_study_limit_meets_the_work_energy_theorem(void **state)
{
    fixture *f = *state;
    plumb_fall_spec s;
    drag_free_spec(&s, 2.385, 31.6, 7.3);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_study_open_spec(&s, &atm, NULL, 0, f->criteria, f->units, &st, &d),
                     PLUMB_OK);
    double limit;
    const plumb_criterion *c;
    assert_int_equal(plumb_study_limit_value(st, PLUMB_METRIC_ENERGY, "913.7 J", "--energy-max",
                                             &limit, &c, &d), PLUMB_OK);
    assert_null(c);
    assert_rel(limit, 913.7, 1e-15);
    const plumb_limit_report *lr = NULL;
    assert_int_equal(plumb_study_limit(st, "payload.mass", PLUMB_METRIC_ENERGY, limit, NULL,
                                       NULL, &lr, &d), PLUMB_OK);
    const double g = PLUMB_G0_M_S2;
    assert_int_equal(lr->results[0].outcome, PLUMB_LIMIT_FOUND);
    assert_rel(lr->results[0].value_si, 913.7 / (0.5 * 7.3 * 7.3 + g * 31.6), 1e-9);
    /* a key the loader checks against others varies on the spec too:
     * H = E / (m g) - v0^2 / (2 g) (work-energy theorem) */
    assert_int_equal(plumb_study_limit(st, "release.height", PLUMB_METRIC_ENERGY, limit, NULL,
                                       NULL, &lr, &d), PLUMB_OK);
    assert_int_equal(lr->results[0].outcome, PLUMB_LIMIT_FOUND);
    assert_rel(lr->results[0].value_si, 913.7 / (2.385 * g) - 7.3 * 7.3 / (2.0 * g), 1e-9);
    /* a key only the loader derives (the speed of a velocity given by
     * components) is refused, saying why */
    assert_int_equal(plumb_study_limit(st, "release.velocity.speed", PLUMB_METRIC_ENERGY, limit,
                                       NULL, NULL, &lr, &d), PLUMB_EINVAL);
    assert_non_null(strstr(d.message, "built in code"));
    /* a criterion's id: 14 CFR 107.130(a)(1), 25 ft-lbf */
    assert_int_equal(plumb_study_limit_value(st, PLUMB_METRIC_ENERGY, "us-part107-cat3",
                                             "--energy-max", &limit, &c, &d), PLUMB_OK);
    assert_non_null(c);
    assert_rel(limit, 25.0 * PLUMB_FT_LBF_J, 1e-12);
    /* not a quantity of the metric's dimension, nor an id: located at the option */
    assert_int_not_equal(plumb_study_limit_value(st, PLUMB_METRIC_SPEED, "8 m", "--speed-max",
                                                 &limit, &c, &d), PLUMB_OK);
    assert_string_equal(d.file, "--speed-max");
    assert_int_equal(d.line, 1);
    assert_int_equal(d.col, 1);
    assert_int_equal(plumb_study_limit_value(st, PLUMB_METRIC_DRIFT, "-3 m", "--drift-max",
                                             &limit, &c, &d), PLUMB_ERANGE);
    /* an unknown key */
    assert_int_equal(plumb_study_limit(st, "release.hieght", PLUMB_METRIC_ENERGY, 10.0, NULL,
                                       NULL, &lr, &d), PLUMB_EKEY);
    plumb_study_free(st);
}

/* A sweep of a spec built in code: every row on a copy of the spec, with
 * the drag-free energy E = 1/2 m v0^2 + m g H (work-energy theorem) at
 * each height; a height above the top of the 1976 atmosphere (86 km,
 * NOAA-S/T 76-1562) is that row's error, saying why, and the other rows
 * are still given. */
static void test_a_sweep_of_a_spec_built_in_code_runs_every_row(void **state)
{
    fixture *f = *state;
    plumb_fall_spec s;
    drag_free_spec(&s, 0.613, 12.0, 3.1);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_study_open_spec(&s, &atm, NULL, 0, f->criteria, f->units, &st, &d),
                     PLUMB_OK);
    plumb_range r;
    assert_int_equal(plumb_range_parse_key(f->units, "release.height=10 m:90 km:44995 m", &r, &d),
                     PLUMB_OK);
    assert_int_equal(r.n, 3);
    plumb_sweep *sw = NULL;
    assert_int_equal(plumb_study_sweep(st, &r, 1, NULL, NULL, &sw, &d), PLUMB_OK);
    assert_int_equal(plumb_sweep_row_count(sw), 3);
    assert_int_equal(plumb_sweep_failed_count(sw), 1);
    const double g = PLUMB_G0_M_S2;
    for (size_t i = 0; i < 2; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        double h = 10.0 + 44995.0 * (double)i;
        assert_int_equal(row->status, PLUMB_OK);
        assert_rel(row->value_si[0], h, 1e-15);
        assert_rel(row->report.items[0].result.energy_j,
                   0.5 * 0.613 * 3.1 * 3.1 + 0.613 * g * h, 1e-9);
    }
    const plumb_sweep_row *top = plumb_sweep_row_at(sw, 2);
    assert_int_equal(top->status, PLUMB_ERANGE);
    assert_string_equal(top->error.key, "release.height");
    assert_non_null(strstr(top->error.message, "1976 atmosphere"));
    plumb_sweep_free(sw);
    /* a key only the loader derives: refused before any row runs */
    assert_int_equal(plumb_range_parse_key(f->units, "release.velocity.speed=1 m/s:3 m/s:1 m/s",
                                           &r, &d), PLUMB_OK);
    assert_int_equal(plumb_study_sweep(st, &r, 1, NULL, NULL, &sw, &d), PLUMB_EINVAL);
    assert_null(sw);
    assert_non_null(strstr(d.message, "built in code"));
    plumb_study_free(st);
}

/* The same study answers a fall in constant air as the closed form says,
 * twice in a row (results are the study's, recomputed each call). */
static void test_a_study_of_a_profile_gives_the_closed_form_in_constant_air(void **state)
{
    fixture *f = *state;
    plumb_fall_spec s;
    drag_free_spec(&s, 0.0241, 317.0, 0.0);
    s.drag.cd_area_m2 = 0.01;
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    const double alt[2] = {-100.0, 5000.0}, rho[2] = {1.2, 1.2};
    atm.model = PLUMB_ATM_TABLE;
    atm.table_n = 2;
    atm.table_alt_m = alt;
    atm.table_rho_kg_m3 = rho;
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_study_open_spec(&s, &atm, NULL, 0, f->criteria, f->units, &st, &d),
                     PLUMB_OK);
    const double g = PLUMB_G0_M_S2, vt = sqrt(2.0 * 0.0241 * g / (1.2 * 0.01));
    for (int k = 0; k < 2; k++) {
        const plumb_fall_report *rep = NULL;
        assert_int_equal(plumb_study_fall(st, &rep, &d), PLUMB_OK);
        assert_rel(rep->items[0].result.speed_m_s, vt * sqrt(-expm1(-2.0 * g * 317.0 / (vt * vt))),
                   1e-9);
        /* every criterion of the set is judged when none is named */
        assert_int_equal(rep->items[0].n_verdicts, plumb_criteria_count(f->criteria));
    }
    plumb_study_free(st);
}

/* A profile with one uncertain input, loaded from text with overrides. */
static plumb_study *settings_study(fixture *f, const char *zone, const char *const *sets,
                                   size_t n_sets, plumb_profile **p)
{
    char text[512];
    snprintf(text, sizeof text,
             "payload: {mass: 2.385 kg, drag: {cd: 0.93, area: 0.0217 m^2}}\n"
             "release: {height: 27.4 m}\n"
             "uncertainty:\n"
             "  wind.speed: {normal: [4.3 m/s, 1.1 m/s]}\n"
             "%s",
             zone);
    plumb_diag d;
    assert_int_equal(plumb_profile_load_buffer("settings.yaml", text, strlen(text), f->units,
                                               sets, n_sets, p, &d),
                     PLUMB_OK);
    plumb_study *st = NULL;
    assert_int_equal(plumb_study_open(*p, f->criteria, f->units, NULL, &st, &d), PLUMB_OK);
    return st;
}

/* Zone settings are refused where they were given (where they can be corrected): the file's
 * line and column, the --set's, the profile alone for a default or the
 * caller's own value. Too few samples: the 99 % radius needs
 * 0.99^N <= 0.025, N >= 368 (the order-statistic bound of dispersion.h). */
static void test_zone_settings_are_refused_where_they_were_given(void **state)
{
    fixture *f = *state;
    plumb_zone_options opt;
    plumb_zone_options_init(&opt);
    plumb_diag d;
    plumb_profile *p = NULL;
    const char *few = "zone:\n  samples: 100\n  confidence: 0.99\n";

    plumb_study *st = settings_study(f, few, NULL, 0, &p);
    plumb_zone_spec z = *plumb_profile_zone(p);
    assert_int_equal(plumb_study_zone_check_settings(st, &z, &opt, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.samples");
    assert_string_equal(d.file, "settings.yaml");
    assert_int_equal(d.line, 6);
    assert_int_equal(d.col, 12);
    assert_non_null(strstr(d.message, "at least 368"));
    /* the caller's own value: the profile, no line */
    z.samples = 367;
    assert_int_equal(plumb_study_zone_check_settings(st, &z, &opt, &d), PLUMB_EINVAL);
    assert_string_equal(d.file, "settings.yaml");
    assert_int_equal(d.line, 0);
    assert_int_equal(d.col, 0);
    z.samples = 368;
    assert_int_equal(plumb_study_zone_check_settings(st, &z, &opt, &d), PLUMB_OK);
    plumb_study_free(st);
    plumb_profile_free(p);

    /* given by the second --set */
    const char *sets[] = {"zone.seed=11", "zone.samples=50"};
    st = settings_study(f, few, sets, 2, &p);
    z = *plumb_profile_zone(p);
    assert_int_equal(plumb_study_zone_check_settings(st, &z, &opt, &d), PLUMB_EINVAL);
    assert_string_equal(d.file, PLUMB_DIAG_SET_FILE);
    assert_int_equal(d.line, 2);
    assert_int_equal(d.col, (int)strlen("zone.samples=") + 1);
    /* and plumb_study_zone refuses it the same way, before any fall */
    const plumb_zone_report *rep = NULL;
    assert_int_equal(plumb_study_zone(st, &z, &opt, NULL, NULL, &rep, &d), PLUMB_EINVAL);
    assert_null(rep);
    assert_string_equal(d.file, PLUMB_DIAG_SET_FILE);
    assert_int_equal(d.line, 2);
    plumb_study_free(st);
    plumb_profile_free(p);

    /* a default (100 000 samples) too few for a confidence the caller asks:
     * the confidence, given last, is the fault; 0.99999^N <= 0.025 needs
     * N >= 368 887 */
    st = settings_study(f, "", NULL, 0, &p);
    z = *plumb_profile_zone(p);
    z.confidence = 0.99999;
    assert_int_equal(plumb_study_zone_check_settings(st, &z, &opt, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.confidence");
    assert_string_equal(d.file, "settings.yaml");
    assert_int_equal(d.line, 0);
    assert_non_null(strstr(d.message, "at least 368887 samples"));
    plumb_study_free(st);
    plumb_profile_free(p);

    /* a --set confidence over the file's samples: at that --set, as the
     * confidence (0.999^N <= 0.025 needs N >= 3688) */
    const char *conf[] = {"zone.confidence=0.999"};
    st = settings_study(f, "zone:\n  samples: 1000\n", conf, 1, &p);
    z = *plumb_profile_zone(p);
    assert_int_equal(plumb_study_zone_check_settings(st, &z, &opt, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "zone.confidence");
    assert_string_equal(d.file, PLUMB_DIAG_SET_FILE);
    assert_int_equal(d.line, 1);
    assert_int_equal(d.col, (int)strlen("zone.confidence=") + 1);
    assert_non_null(strstr(d.message, "at least 3688 samples"));
    plumb_study_free(st);
    plumb_profile_free(p);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_a_spec_built_in_code_is_run_judged_and_reported),
        cmocka_unit_test(test_a_code_built_profile_is_traced_by_the_hash_of_its_inputs),
        cmocka_unit_test(test_a_study_refuses_an_unknown_criterion_when_opened),
        cmocka_unit_test(test_lint_lists_an_unknown_criterion_with_the_other_errors),
        cmocka_unit_test(test_the_study_limit_meets_the_work_energy_theorem),
        cmocka_unit_test(test_a_sweep_of_a_spec_built_in_code_runs_every_row),
        cmocka_unit_test(test_a_study_of_a_profile_gives_the_closed_form_in_constant_air),
        cmocka_unit_test(test_zone_settings_are_refused_where_they_were_given),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_units_criteria, plumbt_teardown_units_criteria);
}
