/*
 * test_api_errors.c - the error paths of the public API that no input file
 * reaches: NULL arguments, specs built in code that break a contract,
 * arguments out of their documented ranges. Each call must return the
 * status its header promises, fill the diagnostic when given one, and make
 * nothing (its out-pointer NULL).
 *
 * Source: the contracts in include/plumb/ headers (the status each call returns
 * for each kind of bad argument), and for the ranges: the U.S. Standard
 * Atmosphere 1976 (NOAA-S/T 76-1562) spans -5 km to 86 km geometric height.
 */
#include <float.h>
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
static plumb_criteria *criteria;

static int setup(void **state)
{
    plumbt_setup_gsl(state);
    plumb_diag d;
    char dir[1024];
    snprintf(dir, sizeof dir, "%s/profiles/criteria", plumbt_srcdir());
    if (plumb_units_alloc(&units, &d) != PLUMB_OK ||
        plumb_criteria_load_dir(dir, units, &criteria, &d) != PLUMB_OK)
        return -1;
    return 0;
}

static int teardown(void **state)
{
    (void)state;
    plumb_criteria_free(criteria);
    plumb_units_free(units);
    return 0;
}

/* A 2.385 kg spanner (invented) with drag, dropped from 31.6 m. */
static void spanner(plumb_fall_spec *s)
{
    memset(s, 0, sizeof *s);
    snprintf(s->name, sizeof s->name, "spanner");
    s->mass_kg = 2.385;
    s->drag.model = PLUMB_DRAG_FIXED;
    s->drag.cd = 0.93;
    s->drag.area_m2 = 0.0187;
    s->drag.cd_area_m2 = 0.93 * 0.0187;
    s->release_m[2] = 31.6;
    plumb_wind_spec_init(&s->wind);
}

/* status, and the same status in the diagnostic with a message */
#define assert_raised(call, want, d)                   \
    do {                                               \
        plumb_diag_clear(&(d));                        \
        assert_int_equal((call), (want));              \
        assert_int_equal((d).status, (want));          \
        assert_true((d).message[0] != '\0');           \
    } while (0)

static void test_loading_and_opening_refuse_null_arguments(void **state)
{
    (void)state;
    plumb_diag d;
    plumb_profile *p = (plumb_profile *)&d; /* must come back NULL */
    assert_raised(plumb_profile_load_buffer(NULL, "x", 1, units, NULL, 0, &p, &d), PLUMB_EINVAL, d);
    assert_null(p);
    assert_raised(plumb_profile_load_buffer("b", NULL, 3, units, NULL, 0, &p, &d), PLUMB_EINVAL, d);
    /* more than PLUMB_PROFILE_MAX_BYTES: refused before it is read */
    size_t big = (size_t)PLUMB_PROFILE_MAX_BYTES + 1;
    char *buf = calloc(big, 1);
    assert_non_null(buf);
    memset(buf, '#', big);
    assert_raised(plumb_profile_load_buffer("big", buf, big, units, NULL, 0, &p, &d), PLUMB_ERANGE,
                  d);
    assert_null(p);
    free(buf);

    plumb_fall_spec s;
    spanner(&s);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    assert_raised(plumb_profile_from_spec(NULL, &atm, NULL, 0, &p, &d), PLUMB_EINVAL, d);
    assert_raised(plumb_profile_from_spec(&s, NULL, NULL, 0, &p, &d), PLUMB_EINVAL, d);
    atm.model = PLUMB_ATM_TABLE; /* with no rows */
    assert_raised(plumb_profile_from_spec(&s, &atm, NULL, 0, &p, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "atmosphere.table");
    assert_null(p);

    plumb_study *st = (plumb_study *)&d;
    assert_raised(plumb_study_open(NULL, criteria, units, NULL, &st, &d), PLUMB_EINVAL, d);
    assert_null(st);

    char unit[32];
    assert_int_equal(plumb_profile_key_unit(NULL, 0, "payload.mass", unit, sizeof unit),
                     PLUMB_EINVAL);
}

static void test_the_air_refuses_altitudes_outside_the_1976_model(void **state)
{
    (void)state;
    plumb_atm_spec as;
    plumb_atm_spec_init(&as);
    plumb_atmosphere *atm = NULL;
    plumb_diag d;
    assert_int_equal(plumb_atmosphere_alloc(&as, &atm, &d), PLUMB_OK);
    plumb_air air;
    assert_int_equal(plumb_atmosphere_at(atm, -5001.0, &air), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(atm, 86001.0, &air), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(NULL, 0.0, &air), PLUMB_EINVAL);
    assert_int_equal(plumb_atmosphere_at(atm, 0.0, NULL), PLUMB_EINVAL);
    /* the terminal speed asked for outside the model */
    plumb_fall_spec s;
    spanner(&s);
    double v = -1.0;
    assert_int_equal(plumb_terminal_speed(&s, atm, 90000.0, 0, &v), PLUMB_EOUTSIDE);
    assert_true(v == -1.0); /* untouched */
    /* a sphere whose terminal speed is above 1e6 m/s (trajectory.h): a
     * 1000 t mass on a 0.1 mm sphere (Morrison 2010 Cd(Re) <= ~0.5 at high
     * Re: 1/2 rho Cd A v^2 stays below m g well past 1e6 m/s) */
    s.mass_kg = 1e6;
    s.drag.model = PLUMB_DRAG_SPHERE_MORRISON;
    s.drag.diameter_m = 1e-4;
    s.drag.area_m2 = 7.853981634e-9; /* its cross-section, pi d^2 / 4 */
    s.drag.cd_area_m2 = 0.0;
    assert_int_equal(plumb_terminal_speed(&s, atm, 10.0, 0, &v), PLUMB_ENOSOLUTION);
    plumb_atmosphere_free(atm);
}

static void test_a_fall_refuses_specs_that_break_its_contract(void **state)
{
    (void)state;
    plumb_atm_spec as;
    plumb_atm_spec_init(&as);
    plumb_atmosphere *atm = NULL;
    plumb_trajectory *traj = NULL;
    plumb_diag d;
    assert_int_equal(plumb_atmosphere_alloc(&as, &atm, &d), PLUMB_OK);
    assert_int_equal(plumb_trajectory_alloc(NULL, &traj), PLUMB_OK);
    plumb_fall_result r;
    plumb_fall_spec s;

    spanner(&s);
    s.volume_m3 = -0.001;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "payload.volume");

    spanner(&s);
    s.n_descent = PLUMB_MAX_DESCENT + 1;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "descent");

    spanner(&s);
    s.n_descent = 1;
    s.descent[0].cd = 0.0; /* 0 < cd <= 10 */
    s.descent[0].area_m2 = 0.95;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "descent[0]"); /* numbered as the keys are */

    s.descent[0].cd = 0.78;
    s.descent[0].fill_time_s = -0.5;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "descent[0].fill_time");

    s.descent[0].fill_time_s = 0.6;
    s.descent[0].trigger = PLUMB_DEPLOY_AFTER;
    s.descent[0].deploy_value = -1.0;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "descent[0].deploy.after");

    spanner(&s);
    s.drag.model = PLUMB_DRAG_SPHERE_MORRISON; /* Morrison's Cd(Re) needs the diameter for Re */
    s.drag.diameter_m = 0.0;
    s.drag.area_m2 = 0.01;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "payload.drag.diameter");

    spanner(&s);
    s.downwash.aircraft_mass_kg = -1.0;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "release.downwash");
    spanner(&s);
    s.downwash.disk_area_m2 = INFINITY;
    assert_raised(plumb_trajectory_run(traj, &s, atm, &r, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "release.downwash");

    plumb_trajectory_free(traj);
    plumb_atmosphere_free(atm);

    plumb_shape_spec shape;
    memset(&shape, 0, sizeof shape);
    shape.kind = PLUMB_SHAPE_NONE;
    plumb_drag_spec drag;
    assert_int_equal(plumb_drag_from_shape(&shape, &drag), PLUMB_EINVAL);
}

static void test_writers_refuse_a_missing_report_or_stream(void **state)
{
    (void)state;
    FILE *sink = fopen("/dev/null", "w");
    assert_non_null(sink);
    plumb_report_options o = {PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, NULL};
    plumb_diag d;
    assert_raised(plumb_report_fall(sink, &o, NULL, &d), PLUMB_EINVAL, d);
    assert_raised(plumb_report_air_table(sink, &o, NULL, &d), PLUMB_EINVAL, d);
    assert_raised(plumb_report_sweep(sink, &o, NULL, &d), PLUMB_EINVAL, d);
    assert_raised(plumb_report_limit(sink, &o, NULL, &d), PLUMB_EINVAL, d);
    plumb_fall_report empty = {NULL, 0, NULL};
    assert_raised(plumb_report_fall(sink, &o, &empty, &d), PLUMB_EINVAL, d);
    plumb_item_report item;
    memset(&item, 0, sizeof item); /* no spec */
    plumb_fall_report noitem = {NULL, 1, &item};
    assert_raised(plumb_report_fall(sink, &o, &noitem, &d), PLUMB_EINVAL, d);
    assert_raised(plumb_item_judge(NULL, NULL, criteria, NULL, &d), PLUMB_EINVAL, d);
    fclose(sink);
}

/* A sweep's boundaries need a two-way sweep; the regions file a zone report. */
static void test_boundaries_and_regions_refuse_what_they_cannot_draw(void **state)
{
    (void)state;
    plumb_diag d;
    assert_raised(plumb_sweep_find_boundaries(NULL, NULL, NULL, NULL, &d), PLUMB_EINVAL, d);
    assert_non_null(strstr(d.message, "two-way sweep"));
    FILE *sink = fopen("/dev/null", "w");
    assert_non_null(sink);
    assert_raised(plumb_report_zone_regions(sink, NULL, &d), PLUMB_EINVAL, d);
    assert_non_null(strstr(d.message, "no zone report"));
    assert_raised(plumb_report_zone_regions(NULL, NULL, &d), PLUMB_EINVAL, d);
    fclose(sink);
}

/* Uncertainties built in code that the profile loader would have refused:
 * the sampler refuses them too, each with its own message and position. */
static void test_the_sampler_refuses_uncertainties_the_loader_would(void **state)
{
    (void)state;
    plumb_fall_spec s;
    spanner(&s);
    plumb_sampler *smp = NULL;
    plumb_diag d;
    plumb_uncertainty u[2];
    memset(u, 0, sizeof u);
    strcpy(u[0].key, "payload.mass");
    u[0].line = 7;
    u[0].col = 3;

    u[0].kind = (plumb_dist_kind)99;
    assert_raised(plumb_sampler_alloc(&s, u, 1, "code", &smp, &d), PLUMB_EINVAL, d);
    assert_non_null(strstr(d.message, "unknown distribution kind 99"));
    assert_int_equal(d.line, 7);
    assert_null(smp);

    u[0].kind = PLUMB_DIST_CHOICE; /* a choice of masses */
    u[0].n_choice = 2;
    strcpy(u[0].choice[0], "light");
    strcpy(u[0].choice[1], "heavy");
    u[0].weight[0] = u[0].weight[1] = 1.0;
    for (int k = 0; k < 2; k++) {
        u[0].choice_drag[k][0] = 0.9;
        u[0].choice_drag[k][1] = 0.01;
    }
    assert_raised(plumb_sampler_alloc(&s, u, 1, "code", &smp, &d), PLUMB_EINVAL, d);
    assert_non_null(strstr(d.message, "a choice is for payload.attitude"));

    strcpy(u[0].key, "payload.attitude");
    u[1] = u[0];
    u[1].line = 9;
    assert_raised(plumb_sampler_alloc(&s, u, 2, "code", &smp, &d), PLUMB_EINVAL, d);
    assert_non_null(strstr(d.message, "is uncertain twice"));

    u[0].choice_drag[1][1] = 0.0; /* an attitude of no area */
    assert_raised(plumb_sampler_alloc(&s, u, 1, "code", &smp, &d), PLUMB_EINVAL, d);
    assert_non_null(strstr(d.message, "attitude 'heavy' has no drag"));
    assert_null(smp);
}

/* A stream that cannot be written (ENOSPC from the full device) is an
 * output failure, PLUMB_EWRITE, and not an input error (exit 3, not 2). */
static void test_a_fall_report_to_a_full_stream_is_a_write_error(void **state)
{
    (void)state;
    plumb_fall_spec s;
    spanner(&s);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_study_open_spec(&s, &atm, NULL, 0, criteria, units, &st, &d), PLUMB_OK);
    const plumb_fall_report *rep = NULL;
    assert_int_equal(plumb_study_fall(st, &rep, &d), PLUMB_OK);
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        FILE *full = fopen("/dev/full", "w");
        if (!full)
            skip();
        plumb_report_options o = {(plumb_format)f, PLUMB_UNITS_SI, NULL};
        assert_raised(plumb_report_fall(full, &o, rep, &d), PLUMB_EWRITE, d);
        assert_false(plumb_status_is_input_error(d.status));
        fclose(full);
    }
    plumb_study_free(st);
}

static void test_sweeps_samplers_and_zones_refuse_bad_arguments(void **state)
{
    (void)state;
    plumb_diag d;
    plumb_range r;
    /* a key longer than a diagnostic's key field */
    char text[PLUMB_DIAG_KEY + 64];
    memset(text, 'k', PLUMB_DIAG_KEY + 8);
    snprintf(text + PLUMB_DIAG_KEY + 8, sizeof text - PLUMB_DIAG_KEY - 8, "=1m:2m:1m");
    assert_raised(plumb_range_parse_key(units, text, &r, &d), PLUMB_EPARSE, d);

    size_t l, u;
    assert_int_equal(plumb_quantile_ranks(0, 0.5, 0.95, &l, &u), PLUMB_EINVAL);
    assert_int_equal(plumb_quantile_ranks(100, 1.0, 0.95, &l, &u), PLUMB_EINVAL);

    plumb_sampler *smp = (plumb_sampler *)&d;
    assert_raised(plumb_sampler_alloc(NULL, NULL, 0, NULL, &smp, &d), PLUMB_EINVAL, d);
    assert_null(smp);

    plumb_fall_spec s;
    spanner(&s);
    plumb_atm_spec as;
    plumb_atm_spec_init(&as);
    plumb_atmosphere *atm = NULL;
    assert_int_equal(plumb_atmosphere_alloc(&as, &atm, &d), PLUMB_OK);
    plumb_zone_spec z;
    memset(&z, 0, sizeof z);
    z.samples = 1000;
    z.seed = 3;
    z.confidence = 0.9;
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    plumb_zone_result res;
    assert_raised(plumb_zone_run(NULL, atm, NULL, 0, &z, NULL, 0, &o, &res, &d), PLUMB_EINVAL, d);
    z.has_target = 1;
    z.target_m[0] = NAN;
    assert_raised(plumb_zone_run(&s, atm, NULL, 0, &z, NULL, 0, &o, &res, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "zone.target");
    z.has_target = 0;
    o.ci_level = 1.0;
    assert_raised(plumb_zone_run(&s, atm, NULL, 0, &z, NULL, 0, &o, &res, &d), PLUMB_EINVAL, d);
    plumb_zone_options_init(&o);
    o.block_samples = 0;
    assert_raised(plumb_zone_run(&s, atm, NULL, 0, &z, NULL, 0, &o, &res, &d), PLUMB_EINVAL, d);
    plumb_zone_options_init(&o);
    const plumb_criterion *none[1] = {NULL};
    assert_raised(plumb_zone_run(&s, atm, NULL, 0, &z, none, 1, &o, &res, &d), PLUMB_EINVAL, d);
    assert_string_equal(d.key, "criteria");
    plumb_atmosphere_free(atm);
}

/* --set keys that cannot name anything, each refused where it goes wrong. */
static void test_set_keys_that_cannot_name_a_value_are_refused(void **state)
{
    (void)state;
    static const char text[] = "name: Test spanner (invented)\n"
                               "payload:\n"
                               "  mass: 2.385 kg\n"
                               "  drag: {cd: 0.93, area: 0.0187 m^2}\n"
                               "release:\n"
                               "  height: 28.7 m\n"
                               "criteria: [us-part107-cat3]\n";
    static char long_key[300];
    memset(long_key, 'k', 260);
    strcpy(long_key + 260, "=1");
    static const struct { const char *set; plumb_status st; const char *want; } bad[] = {
        {"release.height!=3 m", PLUMB_EPARSE, "unexpected character '!'"},
        {"uncertainty.=1", PLUMB_EPARSE, "expected a key after"},
        {"items[99999999].mass=1 kg", PLUMB_ERANGE, "index too large"},
        {"criteria[1].foo=1", PLUMB_EKEY, "have no keys"},
        {"release[1].height=3 m", PLUMB_EPARSE, "takes no [index]"},
        {long_key, PLUMB_EPARSE, "is too long"},
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        plumb_profile *p = NULL;
        plumb_diag d;
        const char *sets[1] = {bad[i].set};
        plumb_diag_clear(&d);
        plumb_status st =
            plumb_profile_load_buffer("<test>", text, sizeof text - 1, units, sets, 1, &p, &d);
        if (st != bad[i].st || !strstr(d.message, bad[i].want))
            fail_msg("--set %.40s: status %d, \"%s\"; want %d, \"%s\"", bad[i].set, (int)st,
                     d.message, (int)bad[i].st, bad[i].want);
        assert_string_equal(d.file, "--set");
        assert_null(p);
    }
}

/* A hand-made report whose figure is not finite is never written
 * (README.md "Common options": never NaN or infinity); an item without
 * its spec is refused. */
static void test_a_report_with_a_figure_not_finite_is_not_written(void **state)
{
    (void)state;
    plumb_fall_spec s;
    spanner(&s);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    plumb_study *st = NULL;
    plumb_diag d;
    assert_int_equal(plumb_study_open_spec(&s, &atm, NULL, 0, criteria, units, &st, &d), PLUMB_OK);
    const plumb_fall_report *rep = NULL;
    assert_int_equal(plumb_study_fall(st, &rep, &d), PLUMB_OK);
    plumb_item_report item = rep->items[0];
    plumb_fall_report copy = *rep;
    copy.items = &item;
    char *buf = NULL;
    size_t len = 0;
    FILE *mem = open_memstream(&buf, &len);
    assert_non_null(mem);
    plumb_report_options o = {PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, NULL};
    item.result.speed_m_s = NAN;
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        o.format = (plumb_format)f;
        assert_raised(plumb_report_fall(mem, &o, &copy, &d), PLUMB_ENUMERIC, d);
    }
    fflush(mem);
    assert_int_equal(len, 0); /* nothing written */
    /* two items judged against different criteria: no common table or columns */
    assert_true(rep->items[0].n_verdicts >= 2);
    plumb_item_report two[2] = {rep->items[0], rep->items[0]};
    two[1].n_verdicts--;
    plumb_fall_report pair = {rep->profile, 2, two};
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        o.format = (plumb_format)f;
        assert_raised(plumb_report_fall(mem, &o, &pair, &d), PLUMB_EINVAL, d);
        assert_non_null(strstr(d.message, "item 2 was judged against other criteria"));
    }
    fflush(mem);
    assert_int_equal(len, 0);
    o.format = PLUMB_FORMAT_TEXT;
    item = rep->items[0];
    item.spec = NULL;
    assert_raised(plumb_report_fall(mem, &o, &copy, &d), PLUMB_EINVAL, d);
    assert_raised(plumb_report_fall(NULL, &o, rep, &d), PLUMB_EINVAL, d);
    fclose(mem);
    free(buf);
    plumb_study_free(st);
}

/* Calls of this session's functions with bad arguments (their headers'
 * contracts): lint of NULL and of an oversize buffer (PLUMB_PROFILE_MAX_BYTES,
 * profile.h), a key check of NULL, verify into NULL, a verify report of no
 * checks, the derivation of a profile built in code (it has no text), and
 * surface air whose lapse rate takes the temperature below 0 K above the
 * station (an ideal gas has no such air). */
static void test_this_sessions_calls_refuse_bad_arguments(void **state)
{
    (void)state;
    plumb_diag d, errs[4];
    size_t n = 9;
    plumb_profile *p = (plumb_profile *)&n; /* not NULL: must be reset */
    assert_int_equal(plumb_profile_lint_buffer(NULL, "", 0, units, NULL, 0, errs, 4, &n, &p),
                     PLUMB_EINVAL);
    assert_null(p);
    assert_int_equal(n, 0);
    assert_int_equal(plumb_profile_lint(NULL, units, NULL, 0, errs, 4, &n, NULL), PLUMB_EINVAL);
    /* a buffer NULL with bytes said to be in it (an empty one is "") */
    assert_int_equal(plumb_profile_lint_buffer("x.yaml", NULL, 5, units, NULL, 0, errs, 4, &n, &p),
                     PLUMB_EINVAL);
    assert_null(p);
    assert_non_null(strstr(errs[0].message, "NULL argument"));
    size_t big = (size_t)PLUMB_PROFILE_MAX_BYTES + 1;
    char *buf = malloc(big);
    assert_non_null(buf);
    memset(buf, '#', big);
    assert_int_equal(plumb_profile_lint_buffer("big.yaml", buf, big, units, NULL, 0, errs, 4, &n,
                                               NULL),
                     PLUMB_ERANGE);
    assert_int_equal(n, 1);
    assert_non_null(strstr(errs[0].message, "at most"));
    free(buf);

    plumb_diag_clear(&d);
    assert_int_equal(plumb_profile_key_check(NULL, 1.0, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_profile_key_check("release.height", -1.0, &d), PLUMB_ERANGE);
    assert_non_null(strstr(d.message, "must be > 0 m"));
    assert_int_equal(plumb_verify(NULL, 0, NULL, &d), PLUMB_EINVAL);
    char *out = NULL;
    size_t len = 0;
    FILE *f = open_memstream(&out, &len);
    assert_int_equal(plumb_report_verify(f, NULL, NULL, 1, &d), PLUMB_EINVAL);
    fclose(f);
    assert_int_equal(len, 0);
    free(out);

    plumb_fall_spec spec;
    memset(&spec, 0, sizeof spec);
    spec.mass_kg = 1.0;
    spec.drag.model = PLUMB_DRAG_FIXED;
    spec.drag.cd_area_m2 = 0.01;
    spec.release_m[2] = 10.0;
    plumb_wind_spec_init(&spec.wind);
    plumb_atm_spec air;
    plumb_atm_spec_init(&air);
    plumb_profile *coded = NULL, *derived = NULL;
    assert_int_equal(plumb_profile_from_spec(&spec, &air, NULL, 0, &coded, &d), PLUMB_OK);
    const char *sets[1] = {"release.height=20 m"};
    assert_int_equal(plumb_profile_derive(coded, units, sets, 1, &derived, &d), PLUMB_EINVAL);
    assert_null(derived);
    assert_non_null(strstr(d.message, "built in code"));
    /* a set key for an item the profile has not, or no key at all */
    char key[64];
    assert_int_equal(plumb_limit_set_key(coded, 1, "release.height", key, sizeof key),
                     PLUMB_EINVAL);
    assert_int_equal(plumb_limit_set_key(coded, 0, NULL, key, sizeof key), PLUMB_EINVAL);
    assert_int_equal(plumb_limit_set_key(coded, 0, "release.height", key, 0), PLUMB_EINVAL);
    plumb_profile_free(coded);

    /* surface air at 250 K falling 30 K/km: none above 8.3 km */
    air.model = PLUMB_ATM_SURFACE;
    air.station_pressure_pa = 101325.0;
    air.station_temperature_k = 250.0;
    air.lapse_rate_k_m = 0.030;
    plumb_atmosphere *atm = NULL;
    if (plumb_atmosphere_alloc(&air, &atm, &d) == PLUMB_OK) {
        plumb_air a;
        assert_int_equal(plumb_atmosphere_at(atm, 9000.0, &a), PLUMB_ERANGE);
        plumb_atmosphere_free(atm);
    }
}

/* Whether s is well-formed UTF-8 (RFC 3629 section 4: a lead byte and
 * as many continuation bytes as it announces; no stray continuation). */
static int utf8_well_formed(const char *s)
{
    for (const unsigned char *u = (const unsigned char *)s; *u;) {
        size_t need = *u < 0x80 ? 1 : *u >= 0xF0 ? 4 : *u >= 0xE0 ? 3 : *u >= 0xC0 ? 2 : 0;
        if (need == 0)
            return 0;
        for (size_t k = 1; k < need; k++)
            if ((u[k] & 0xC0) != 0x80)
                return 0;
        u += need;
    }
    return 1;
}

/* A message or key too long for its buffer is cut at the end of a whole
 * character, never inside one: an item's name in Chinese (three bytes a
 * character in UTF-8, RFC 3629) or with accents (two bytes) repeated past
 * PLUMB_DIAG_MSG and PLUMB_DIAG_KEY, at every offset of the cut, is still
 * well-formed UTF-8 and keeps all it can. */
static void test_a_cut_message_ends_in_a_whole_character(void **state)
{
    (void)state;
    static const char *const chars[] = {"\xc3\xa9", "\xe6\x89\xad", "\xf0\x9f\xaa\x9b"};
    char text[2 * PLUMB_DIAG_MSG + 8];
    for (size_t c = 0; c < sizeof chars / sizeof *chars; c++) {
        size_t w = strlen(chars[c]);
        for (size_t shift = 0; shift < w; shift++) {
            size_t n = 0;
            memset(text, 'a', shift);
            n = shift;
            while (n + w < sizeof text) {
                memcpy(text + n, chars[c], w);
                n += w;
            }
            text[n] = '\0';
            plumb_diag d;
            plumb_diag_clear(&d);
            assert_int_equal(plumb_diag_option(&d, PLUMB_EINVAL, "--vary", 1, 1, text, "%s", text),
                             PLUMB_EINVAL);
            assert_true(utf8_well_formed(d.message));
            assert_true(utf8_well_formed(d.key));
            /* all that fits: at most one character short of the buffer */
            assert_true(strlen(d.message) + w >= sizeof d.message - 1);
            assert_true(strlen(d.key) + w >= sizeof d.key - 1);
            assert_memory_equal(d.message, text, strlen(d.message));
        }
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_loading_and_opening_refuse_null_arguments),
        cmocka_unit_test(test_this_sessions_calls_refuse_bad_arguments),
        cmocka_unit_test(test_the_air_refuses_altitudes_outside_the_1976_model),
        cmocka_unit_test(test_a_fall_refuses_specs_that_break_its_contract),
        cmocka_unit_test(test_writers_refuse_a_missing_report_or_stream),
        cmocka_unit_test(test_a_fall_report_to_a_full_stream_is_a_write_error),
        cmocka_unit_test(test_boundaries_and_regions_refuse_what_they_cannot_draw),
        cmocka_unit_test(test_the_sampler_refuses_uncertainties_the_loader_would),
        cmocka_unit_test(test_sweeps_samplers_and_zones_refuse_bad_arguments),
        cmocka_unit_test(test_set_keys_that_cannot_name_a_value_are_refused),
        cmocka_unit_test(test_a_report_with_a_figure_not_finite_is_not_written),
        cmocka_unit_test(test_a_cut_message_ends_in_a_whole_character),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
