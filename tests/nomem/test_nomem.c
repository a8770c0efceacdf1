/*
 * test_nomem.c - out of memory, everywhere: each call of the public API is
 * run with its 1st, 2nd, 3rd ... allocation failing (failalloc.h) until it
 * needs fewer allocations than the one armed to fail, and succeeds.
 * Every failed run must return PLUMB_ENOMEM with a diagnostic that says so
 * (never another status: running out of memory is not bad input, exit 3
 * not 2), must free what it made (under AddressSanitizer, make check's
 * second build, LeakSanitizer fails the program on any leak), and must
 * leave the objects it was given usable: the study the next run uses is
 * the one the failed runs used.
 *
 * What a call needs (units, criteria, a study, a result to report) is made
 * with the hook disarmed; only the call under test runs armed.
 *
 * Source: the contracts of include/plumb/ (every fallible call: PLUMB_ENOMEM,
 * nothing made); POSIX malloc (NULL, errno ENOMEM); libyaml's
 * YAML_MEMORY_ERROR; udunits2's UT_OS.
 */
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb/sheet.h"
#include "plumb_test.h"
#include "failalloc.h"

static struct {
    plumb_units *units;
    plumb_criteria *criteria;
    char dir[1024];              /* profiles/criteria */
    FILE *sink;                  /* where reports go: /dev/null, opened for writing */
} fx;

static int setup(void **state)
{
    plumbt_setup_gsl(state);
    failalloc_json_funcs();
    plumb_diag d;
    snprintf(fx.dir, sizeof fx.dir, "%s/profiles/criteria", plumbt_srcdir());
    fx.sink = fopen("/dev/null", "w");
    if (!fx.sink || plumb_units_alloc(&fx.units, &d) != PLUMB_OK ||
        plumb_criteria_load_dir(fx.dir, fx.units, &fx.criteria, &d) != PLUMB_OK)
        return -1;
    return 0;
}

static int teardown(void **state)
{
    (void)state;
    plumb_criteria_free(fx.criteria);
    plumb_units_free(fx.units);
    fclose(fx.sink);
    return 0;
}

/* One call under test: everything it makes, it frees. */
typedef plumb_status (*call_fn)(void *ctx, plumb_diag *d);

/* How many times each call path has been failed (open addressing). */
#define SEEN_SLOTS 65536u
typedef struct seen_set {
    unsigned long key[SEEN_SLOTS];
    unsigned char times[SEEN_SLOTS];
} seen_set;

static unsigned char *seen_times(seen_set *s, unsigned long key)
{
    unsigned long i = (key ^ (key >> 29)) & (SEEN_SLOTS - 1);
    while (s->times[i] != 0 && s->key[i] != key)
        i = (i + 1) & (SEEN_SLOTS - 1);
    s->key[i] = key;
    return &s->times[i];
}

/* Each allocation of a call is failed in turn, except that an allocation
 * reached through a call path (the chain of return addresses, failalloc.h)
 * already failed twice in this call is not failed again: a loop's first
 * pass fails with nothing made yet, its second with something to free, and
 * its later passes run the same lines. (Failing every one of them took
 * minutes, outside make check's budget.) */
#define FAILS_PER_PATH 2

/* Runs `call` once recording its allocations, then again with each
 * allocation failing in turn (FAILS_PER_PATH); every failure must be
 * PLUMB_ENOMEM, and said so in the diagnostic. */
static void each_allocation_fails_in_turn(const char *what, call_fn call, void *ctx)
{
    clock_t t0 = clock();
    plumb_diag d;
    plumb_diag_clear(&d);
    failalloc_record(1);
    plumb_status st = call(ctx, &d);
    failalloc_record(0);
    if (st != PLUMB_OK)
        fail_msg("%s: fails with no allocation failing: %s: %s", what, plumb_strerror(st),
                 d.message);
    unsigned long total = failalloc_recorded();
    if (total >= FAILALLOC_MAX_RECORD)
        fail_msg("%s: more than %lu allocations", what, FAILALLOC_MAX_RECORD);
    unsigned long *path = malloc((total + 1) * sizeof *path);
    seen_set *seen = calloc(1, sizeof *seen);
    assert_true(path && seen);
    for (unsigned long i = 0; i < total; i++)
        path[i] = failalloc_path(i);

    unsigned long tried = 0;
    for (unsigned long n = 1; n <= total; n++) {
        unsigned char *times = seen_times(seen, path[n - 1]);
        if (*times >= FAILS_PER_PATH)
            continue;
        (*times)++;
        tried++;
        plumb_diag_clear(&d);
        failalloc_arm(n);
        st = call(ctx, &d);
        int fired = failalloc_fired();
        failalloc_disarm();
        if (!fired) /* a run on threads may allocate in another order: nothing to check */
            continue;
        if (st != PLUMB_ENOMEM || d.status != PLUMB_ENOMEM || d.message[0] == '\0') {
            /* once more, showing where the allocation was */
            failalloc_trace(1);
            plumb_diag d2;
            failalloc_arm(n);
            (void)call(ctx, &d2);
            failalloc_disarm();
            failalloc_trace(0);
            free(path);
            free(seen);
            fail_msg("%s: allocation %lu of %lu failing gives status %d (%s), diagnostic %d "
                     "\"%s\"; want PLUMB_ENOMEM",
                     what, n, total, (int)st, plumb_strerror(st), (int)d.status, d.message);
        }
    }
    free(path);
    free(seen);
    print_message("%s: %lu allocations, %lu failed in turn (%.2f s of processor time)\n", what,
                  total, tried, (double)(clock() - t0) / CLOCKS_PER_SEC);
}

static const char *src_path(const char *rel, char *buf, size_t size)
{
    snprintf(buf, size, "%s/%s", plumbt_srcdir(), rel);
    return buf;
}

/* The profiles the calls run on: every bundled demo and the CLI tests'
 * own (an inventory, a canopy, a thrown item, surface air ...). */
static const char *const profiles[] = {
    "profiles/demo/hand-tool.yaml",     "profiles/demo/tower-kit.yaml",
    "profiles/demo/drone-release.yaml", "profiles/demo/drone-canopy.yaml",
    "tests/cli/profiles/canopy.yaml",   "tests/cli/profiles/inventory.yaml",
    "tests/cli/profiles/light.yaml",    "tests/cli/profiles/surface-air.yaml",
    "tests/cli/profiles/thrown.yaml",
};
enum { N_PROFILES = sizeof profiles / sizeof profiles[0] };

/* A study of a profile, made with the hook disarmed. */
typedef struct study_ctx {
    plumb_profile *profile;
    plumb_study *study;
} study_ctx;

static void study_make(study_ctx *c, const char *rel, const char *const *sets, size_t n_sets)
{
    char path[1024];
    plumb_diag d;
    memset(c, 0, sizeof *c);
    if (plumb_profile_load(src_path(rel, path, sizeof path), fx.units, sets, n_sets, &c->profile,
                           &d) != PLUMB_OK ||
        plumb_study_open(c->profile, fx.criteria, fx.units, NULL, &c->study, &d) != PLUMB_OK)
        fail_msg("%s: %s", rel, d.message);
}

/* The same from the text of a profile. */
static void study_make_text(study_ctx *c, const char *text)
{
    plumb_diag d;
    memset(c, 0, sizeof *c);
    if (plumb_profile_load_buffer("<test>", text, strlen(text), fx.units, NULL, 0, &c->profile,
                                  &d) != PLUMB_OK ||
        plumb_study_open(c->profile, fx.criteria, fx.units, NULL, &c->study, &d) != PLUMB_OK)
        fail_msg("<test>: %s", d.message);
}

/* A short canopy fall (invented): the limits on a descent device's keys
 * run a few hundred falls per allocation failed, so the fall is short. */
static const char short_canopy[] =
    "name: marker under a small canopy\n"
    "payload:\n"
    "  mass: 1.93 kg\n"
    "  drag: {cd: 1.05, area: 0.0187 m^2}\n"
    "descent:\n"
    "  kind: parachute\n"
    "  cd: 0.78\n"
    "  diameter: 1.1 m\n"
    "  deploy: {after: 0.4 s}\n"
    "  fill_time: 0.3 s\n"
    "release:\n"
    "  height: 14.5 m\n"
    "wind: {profile: power, speed: 5.3 m/s, from: 235 deg}\n"
    "criteria: [us-part107-cat3]\n";

static void study_done(study_ctx *c)
{
    plumb_study_free(c->study);
    plumb_profile_free(c->profile);
}

/* ---- units, criteria, profiles ------------------------------------------------ */

static plumb_status call_units_alloc(void *ctx, plumb_diag *d)
{
    (void)ctx;
    plumb_units *u = NULL;
    plumb_status st = plumb_units_alloc(&u, d);
    plumb_units_free(u);
    return st;
}

/* A deferred handle, its database loaded by its first quantity: each
 * allocation of the load fails as plumb_units_alloc's does. */
static plumb_status call_units_deferred(void *ctx, plumb_diag *d)
{
    (void)ctx;
    plumb_units *u = NULL;
    double v = 0.0;
    plumb_status st = plumb_units_alloc_deferred(&u, d);
    if (st == PLUMB_OK)
        st = plumb_units_parse(u, "31.6 ft", PLUMB_DIM_LENGTH, &v, d);
    plumb_units_free(u);
    return st;
}

/* Quantities of several kinds: a plain unit, a prefixed one, an offset
 * temperature as a difference (the interval path), a compound. */
static plumb_status call_units_parse(void *ctx, plumb_diag *d)
{
    (void)ctx;
    static const struct { const char *text; plumb_dim dim; } q[] = {
        {"31.6 ft", PLUMB_DIM_LENGTH},       {"2.385 kg", PLUMB_DIM_MASS},
        {"18 degF", PLUMB_DIM_TEMP_DIFF},    {"12.5 degC", PLUMB_DIM_TEMPERATURE},
        {"25 ft lbf", PLUMB_DIM_ENERGY},     {"15 kn", PLUMB_DIM_SPEED},
        {"1013.25 hPa", PLUMB_DIM_PRESSURE}, {"6.5 K/km", PLUMB_DIM_LAPSE},
    };
    for (size_t i = 0; i < sizeof q / sizeof q[0]; i++) {
        double v;
        plumb_status st = plumb_units_parse(fx.units, q[i].text, q[i].dim, &v, d);
        if (st != PLUMB_OK)
            return st;
    }
    return PLUMB_OK;
}

static plumb_status call_criteria_load(void *ctx, plumb_diag *d)
{
    (void)ctx;
    plumb_criteria *c = NULL;
    plumb_status st = plumb_criteria_load_dir(fx.dir, fx.units, &c, d);
    plumb_criteria_free(c);
    return st;
}

static plumb_status call_profile_load(void *ctx, plumb_diag *d)
{
    char path[1024];
    plumb_profile *p = NULL;
    const char *const *rel = ctx;
    plumb_status st =
        plumb_profile_load(src_path(*rel, path, sizeof path), fx.units, NULL, 0, &p, d);
    plumb_profile_free(p);
    return st;
}

/* --set overrides: a value with a unit, a key given instead of another,
 * a removed key, an item by name. */
static const char *const sets[] = {
    "release.height=30 ft", "wind.speed=15 kn", "items[2].mass=0.4 kg",
};

static plumb_status call_profile_load_sets(void *ctx, plumb_diag *d)
{
    (void)ctx;
    char path[1024];
    plumb_profile *p = NULL;
    plumb_status st = plumb_profile_load(
        src_path("tests/cli/profiles/inventory.yaml", path, sizeof path), fx.units, sets,
        sizeof sets / sizeof sets[0], &p, d);
    plumb_profile_free(p);
    return st;
}

static plumb_status call_profile_load_buffer(void *ctx, plumb_diag *d)
{
    (void)ctx;
    static const char text[] = "name: Test spanner\n"
                               "payload:\n"
                               "  mass: 2.385 kg\n"
                               "  drag: {cd: 0.93, area: 0.0187 m^2}\n"
                               "release:\n"
                               "  height: 28.7 m\n"
                               "criteria: [us-part107-cat3]\n";
    plumb_profile *p = NULL;
    plumb_status st =
        plumb_profile_load_buffer("<buffer>", text, sizeof text - 1, fx.units, NULL, 0, &p, d);
    plumb_profile_free(p);
    return st;
}

static plumb_status call_profile_derive(void *ctx, plumb_diag *d)
{
    study_ctx *c = ctx;
    plumb_profile *p = NULL;
    plumb_status st = plumb_profile_derive(c->profile, fx.units, sets, 2, &p, d);
    plumb_profile_free(p);
    return st;
}

/* ---- a spec built in code --------------------------------------------------- */

/* A 2.385 kg spanner (invented) dropped from 31.6 m with drag. */
static void spanner_spec(plumb_fall_spec *s)
{
    memset(s, 0, sizeof *s);
    snprintf(s->name, sizeof s->name, "spanner");
    s->mass_kg = 2.385;
    s->drag.model = PLUMB_DRAG_FIXED;
    s->drag.cd = 0.93;
    s->drag.area_m2 = 0.0187;
    s->release_m[2] = 31.6;
    plumb_wind_spec_init(&s->wind);
}

static plumb_status call_study_from_spec(void *ctx, plumb_diag *d)
{
    (void)ctx;
    plumb_fall_spec s;
    spanner_spec(&s);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    const char *ids[] = {"us-part107-cat3"};
    plumb_study *study = NULL;
    plumb_status st = plumb_study_open_spec(&s, &atm, ids, 1, fx.criteria, fx.units, &study, d);
    const plumb_fall_report *rep = NULL;
    if (st == PLUMB_OK)
        st = plumb_study_fall(study, &rep, d);
    if (st == PLUMB_OK) {
        plumb_report_options o = {PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, NULL};
        st = plumb_report_fall(fx.sink, &o, rep, d);
    }
    plumb_study_free(study);
    return st;
}

static plumb_status call_trajectory(void *ctx, plumb_diag *d)
{
    (void)ctx;
    plumb_fall_spec s;
    spanner_spec(&s);
    plumb_atm_spec as;
    plumb_atm_spec_init(&as);
    plumb_atmosphere *atm = NULL;
    plumb_trajectory *traj = NULL;
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    o.record_path = 1;
    plumb_status st = plumb_atmosphere_alloc(&as, &atm, d);
    if (st == PLUMB_OK) {
        st = plumb_trajectory_alloc(&o, &traj);
        if (st != PLUMB_OK) {
            plumb_diag_clear(d);
            d->status = st;
            snprintf(d->message, sizeof d->message, "%s", plumb_strerror(st));
        }
    }
    plumb_fall_result r;
    if (st == PLUMB_OK)
        st = plumb_trajectory_run(traj, &s, atm, &r, d);
    plumb_trajectory_free(traj);
    plumb_atmosphere_free(atm);
    return st;
}

/* ---- a study: open, fall, report ---------------------------------------------- */

static plumb_status call_study_open(void *ctx, plumb_diag *d)
{
    study_ctx *c = ctx;
    plumb_study *s = NULL;
    plumb_status st = plumb_study_open(c->profile, fx.criteria, fx.units, NULL, &s, d);
    plumb_study_free(s);
    return st;
}

static plumb_status call_study_fall(void *ctx, plumb_diag *d)
{
    study_ctx *c = ctx;
    const plumb_fall_report *rep = NULL;
    return plumb_study_fall(c->study, &rep, d);
}

/* A report of a result made beforehand, in one format and unit system. */
typedef struct report_ctx {
    const void *result;
    plumb_format format;
    plumb_unit_system units;
} report_ctx;

static plumb_status call_report_fall(void *ctx, plumb_diag *d)
{
    report_ctx *c = ctx;
    plumb_report_options o = {c->format, c->units, "9.9.9"};
    return plumb_report_fall(fx.sink, &o, c->result, d);
}

static plumb_status call_report_sweep(void *ctx, plumb_diag *d)
{
    report_ctx *c = ctx;
    plumb_report_options o = {c->format, c->units, NULL};
    return plumb_report_sweep(fx.sink, &o, c->result, d);
}

static plumb_status call_report_zone(void *ctx, plumb_diag *d)
{
    report_ctx *c = ctx;
    plumb_report_options o = {c->format, c->units, NULL};
    return plumb_report_zone(fx.sink, &o, c->result, d);
}

/* Each format and unit system of a report, each allocation failing in turn. */
static void every_report(const char *what, call_fn call, const void *result)
{
    static const char *const fmt[] = {"text", "json", "csv"};
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++)
        for (int u = PLUMB_UNITS_SI; u <= PLUMB_UNITS_US; u++) {
            if (f == PLUMB_FORMAT_JSON && u == PLUMB_UNITS_US)
                continue; /* JSON is always SI */
            char name[256];
            snprintf(name, sizeof name, "%s, %s, %s", what, fmt[f - PLUMB_FORMAT_TEXT],
                     u == PLUMB_UNITS_SI ? "si" : "us");
            report_ctx c = {result, (plumb_format)f, (plumb_unit_system)u};
            each_allocation_fails_in_turn(name, call, &c);
        }
}

typedef struct sweep_ctx {
    study_ctx *sc;
    const char *vary[2];
    size_t n;
    plumb_sweep **keep;          /* non-NULL: keep the sweep made here */
} sweep_ctx;

static plumb_status call_sweep(void *ctx, plumb_diag *d)
{
    sweep_ctx *c = ctx;
    plumb_range axes[2];
    plumb_status st = PLUMB_OK;
    for (size_t i = 0; st == PLUMB_OK && i < c->n; i++)
        st = plumb_range_parse_key(fx.units, c->vary[i], &axes[i], d);
    plumb_sweep *sw = NULL;
    if (st == PLUMB_OK)
        st = plumb_study_sweep(c->sc->study, axes, c->n, NULL, NULL, &sw, d);
    if (c->keep && st == PLUMB_OK)
        *c->keep = sw;
    else
        plumb_sweep_free(sw);
    return st;
}

typedef struct limit_ctx {
    study_ctx *sc;
    const char *key;
    plumb_metric metric;
    const char *limit;
    const plumb_limit_report *rep; /* the last limit made (owned by the study) */
} limit_ctx;

/* The limit alone; its reports are failed in turn on a limit made
 * beforehand (every_report), as the sweep's and the zone's are: a report
 * reads the result the study keeps, so its allocations are the same
 * whether the solve ran just before it or not, and each of its failures
 * no longer re-runs the solve's few hundred falls. */
static plumb_status call_limit(void *ctx, plumb_diag *d)
{
    limit_ctx *c = ctx;
    double limit;
    const plumb_criterion *crit = NULL;
    plumb_status st =
        plumb_study_limit_value(c->sc->study, c->metric, c->limit, "--limit", &limit, &crit, d);
    /* a coarse tolerance: fewer falls, the same code */
    plumb_limit_options lo;
    plumb_limit_options_init(&lo);
    lo.rel_tol = 1e-2;
    c->rep = NULL;
    if (st == PLUMB_OK)
        st = plumb_study_limit(c->sc->study, c->key, c->metric, limit, crit, &lo, &c->rep, d);
    return st;
}

static plumb_status call_report_limit(void *ctx, plumb_diag *d)
{
    report_ctx *c = ctx;
    plumb_report_options o = {c->format, c->units, NULL};
    return plumb_report_limit(fx.sink, &o, c->result, d);
}

/* A limit failing at each allocation, then each of its reports. */
static void limit_and_its_reports(const char *what, limit_ctx *c)
{
    each_allocation_fails_in_turn(what, call_limit, c);
    plumb_diag d;
    assert_int_equal(call_limit(c, &d), PLUMB_OK); /* the last run above failed */
    assert_non_null(c->rep);
    every_report(what, call_report_limit, c->rep);
}

typedef struct zone_ctx {
    study_ctx *sc;
    size_t threads;
    size_t samples;               /* 0: 160 */
    const plumb_zone_report *rep; /* the last zone made (owned by the study) */
} zone_ctx;

static plumb_status call_zone(void *ctx, plumb_diag *d)
{
    zone_ctx *c = ctx;
    plumb_zone_spec z = *plumb_profile_zone(c->sc->profile);
    z.samples = c->samples ? c->samples : 160;
    z.confidence = 0.9;
    z.seed = 7;
    z.has_target = 1;
    z.target_m[0] = 3.5;
    z.target_m[1] = -1.25;
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.threads = c->threads;
    o.block_samples = 64;
    o.pilot_samples = 128;
    c->rep = NULL;
    return plumb_study_zone(c->sc->study, &z, &o, NULL, NULL, &c->rep, d);
}

static plumb_status call_air_table(void *ctx, plumb_diag *d)
{
    (void)ctx;
    plumb_range alt;
    plumb_status st = plumb_range_parse(fx.units, "0 ft:3000 ft:500 ft", PLUMB_DIM_LENGTH,
                                        "--alt", &alt, d);
    plumb_air rows[16];
    for (size_t i = 0; st == PLUMB_OK && i < alt.n && i < 16; i++) {
        double alt_m = 0.0;
        st = plumb_range_value_si(&alt, fx.units, i, &alt_m, d);
        if (st == PLUMB_OK)
            st = plumb_std1976(alt_m, 4.0, &rows[i]);
    }
    plumb_air_table t = {rows, alt.n < 16 ? alt.n : 16, 4.0};
    for (int f = PLUMB_FORMAT_TEXT; st == PLUMB_OK && f <= PLUMB_FORMAT_CSV; f++) {
        plumb_report_options o = {(plumb_format)f, PLUMB_UNITS_US, NULL};
        st = plumb_report_air_table(fx.sink, &o, &t, d);
    }
    return st;
}

/* ---- the tests ---------------------------------------------------------------- */

static void test_loading_units_criteria_and_profiles_fails_cleanly_at_every_allocation(void **s)
{
    (void)s;
    each_allocation_fails_in_turn("plumb_units_alloc", call_units_alloc, NULL);
    each_allocation_fails_in_turn("plumb_units_alloc_deferred", call_units_deferred, NULL);
    each_allocation_fails_in_turn("plumb_units_parse", call_units_parse, NULL);
    each_allocation_fails_in_turn("plumb_criteria_load_dir", call_criteria_load, NULL);
    for (size_t i = 0; i < N_PROFILES; i++) {
        const char *rel = profiles[i];
        each_allocation_fails_in_turn(rel, call_profile_load, &rel);
    }
    each_allocation_fails_in_turn("--set overrides", call_profile_load_sets, NULL);
    each_allocation_fails_in_turn("plumb_profile_load_buffer", call_profile_load_buffer, NULL);
    study_ctx sc;
    study_make(&sc, "tests/cli/profiles/inventory.yaml", NULL, 0);
    each_allocation_fails_in_turn("plumb_profile_derive", call_profile_derive, &sc);
    study_done(&sc);
}

/* plumb lint's check of a profile with errors of many kinds (invented):
 * a unit of no known kind ("5 kilos": the advice of the unit meant), a
 * decimal comma, a compass letter after an angle, a bare number whose
 * suggestions are checked against the key's range, a misspelt key, an
 * unknown criterion (the did-you-mean), with the criteria set loaded by
 * the lint itself (set_loaded 0) or given. The whole list, or
 * PLUMB_ENOMEM with its diagnostic: never a shorter list that does not
 * say what it lacks. */
static const char lint_text[] = "name: lint of many errors\n"
                                "payload:\n"
                                "  mass: 5 kilos\n"
                                "  shape: {kind: sphere, diamter: 0.1 m}\n"
                                "release:\n"
                                "  height: 6,5 m\n"
                                "site: {latitude: 54.2 N, longitude: 9.1 deg}\n"
                                "atmosphere: {model: surface, pressure: 1013 hPa, temperature: 45}\n"
                                "criteria: [eu-c2, en397]\n";

static plumb_status call_study_lint(void *ctx, plumb_diag *d)
{
    const int *given = ctx;
    plumb_diag errs[16];
    size_t n = 0;
    plumb_criteria *set = *given ? fx.criteria : NULL;
    plumb_status st = plumb_study_lint("<lint>", lint_text, sizeof lint_text - 1, fx.units, NULL,
                                       0, fx.dir, &set, errs, 16, &n);
    if (!*given)
        plumb_criteria_free(set);
    if (st == PLUMB_OK)
        return PLUMB_EINVAL; /* the profile has errors: a lint that finds none is wrong */
    if (plumb_status_is_input_error(st))
        return n >= 7 ? PLUMB_OK : PLUMB_EKEY; /* its list, at least one per line in error */
    for (size_t i = 0; i < n; i++)
        if (errs[i].status == st)
            *d = errs[i];
    return st;
}

/* A lint report of two profiles (a good one, one with a range error and a
 * name that is not UTF-8, which JSON writes with '?'). */
typedef struct lint_result {
    plumb_lint_entry e[2];
    plumb_diag err;
} lint_result;

static plumb_status call_report_lint(void *ctx, plumb_diag *d)
{
    report_ctx *c = ctx;
    const lint_result *r = c->result;
    plumb_report_options o = {c->format, c->units, "9.9.9"};
    return plumb_report_lint(fx.sink, &o, r->e, 2, d);
}

static void test_a_spec_built_in_code_and_a_bare_fall_fail_cleanly_at_every_allocation(void **s)
{
    (void)s;
    each_allocation_fails_in_turn("plumb_study_open_spec", call_study_from_spec, NULL);
    each_allocation_fails_in_turn("plumb_trajectory_run with a path", call_trajectory, NULL);
    each_allocation_fails_in_turn("air table", call_air_table, NULL);
    lint_result lr;
    memset(&lr, 0, sizeof lr);
    lr.err.status = PLUMB_ERANGE;
    snprintf(lr.err.file, sizeof lr.err.file, "b\xff.yaml");
    lr.err.line = 4;
    lr.err.col = 9;
    snprintf(lr.err.key, sizeof lr.err.key, "payload.mass");
    snprintf(lr.err.message, sizeof lr.err.message, "must be > 0 kg, found '-2 kg'");
    lr.e[0] = (plumb_lint_entry){"good.yaml", NULL, 0, 1};
    lr.e[1] = (plumb_lint_entry){"b\xff.yaml", &lr.err, 1, 1};
    every_report("lint report", call_report_lint, &lr);
    static int loaded_by_lint = 0, given = 1;
    each_allocation_fails_in_turn("plumb_study_lint, set loaded", call_study_lint,
                                  &loaded_by_lint);
    each_allocation_fails_in_turn("plumb_study_lint, set given", call_study_lint, &given);
}

static void test_every_fall_and_its_reports_fail_cleanly_at_every_allocation(void **s)
{
    (void)s;
    for (size_t i = 0; i < N_PROFILES; i++) {
        study_ctx sc;
        study_make(&sc, profiles[i], NULL, 0);
        each_allocation_fails_in_turn(profiles[i], call_study_open, &sc);
        each_allocation_fails_in_turn(profiles[i], call_study_fall, &sc);
        /* the reports of three: a table atmosphere, an inventory, a canopy */
        if (i < 4 && i != 2) {
            const plumb_fall_report *rep = NULL;
            plumb_diag d;
            assert_int_equal(plumb_study_fall(sc.study, &rep, &d), PLUMB_OK);
            every_report(profiles[i], call_report_fall, rep);
        }
        study_done(&sc);
    }
}

/* The boundaries of a two-way sweep kept by call_sweep (*keep). */
static plumb_status call_sweep_boundaries(void *ctx, plumb_diag *d)
{
    sweep_ctx *c = ctx;
    return plumb_study_sweep_boundaries(c->sc->study, *c->keep, d);
}

/* The regions file (CSV polygons) of the last zone made. */
static plumb_status call_zone_regions(void *ctx, plumb_diag *d)
{
    zone_ctx *c = ctx;
    return plumb_report_zone_regions(fx.sink, c->rep, d);
}

static void test_sweeps_and_limits_fail_cleanly_at_every_allocation(void **s)
{
    (void)s;
    study_ctx sc;
    study_make(&sc, "tests/cli/profiles/inventory.yaml", NULL, 0);
    plumb_sweep *sw = NULL;
    sweep_ctx one = {&sc, {"release.height=20m:60m:20m"}, 1, NULL};
    each_allocation_fails_in_turn("one-way sweep", call_sweep, &one);
    sweep_ctx two = {&sc, {"release.height=20m:40m:20m",
                           "atmosphere.temperature_offset=-10K:10K:20K"}, 2, &sw};
    each_allocation_fails_in_turn("two-way sweep", call_sweep, &two);
    assert_non_null(sw);
    every_report("two-way sweep", call_report_sweep, sw);
    sweep_ctx bound = {&sc, {NULL}, 0, &sw};
    each_allocation_fails_in_turn("two-way sweep's boundaries", call_sweep_boundaries, &bound);
    plumb_sweep_free(sw);
    study_done(&sc);

    /* release.height is re-read from the profile's text at each fall */
    study_make(&sc, "tests/cli/profiles/light.yaml", NULL, 0);
    limit_ctx lim = {&sc, "release.height", PLUMB_METRIC_ENERGY, "us-part107-cat3", NULL};
    limit_and_its_reports("limit on release.height", &lim);
    study_done(&sc);

    study_make_text(&sc, short_canopy);
    limit_ctx area = {&sc, "descent.area", PLUMB_METRIC_ENERGY, "40 J", NULL};
    limit_and_its_reports("limit on descent.area", &area);
    limit_ctx drift = {&sc, "wind.speed", PLUMB_METRIC_DRIFT, "3 m", NULL};
    limit_and_its_reports("limit on wind.speed", &drift);
    study_done(&sc);
}

static void test_zones_fail_cleanly_at_every_allocation_on_one_and_two_threads(void **s)
{
    (void)s;
    study_ctx sc;
    study_make(&sc, "profiles/demo/drone-release.yaml", NULL, 0);
    zone_ctx one = {&sc, 1, 0, NULL}, two = {&sc, 2, 0, NULL};
    each_allocation_fails_in_turn("zone, one thread", call_zone, &one);
    each_allocation_fails_in_turn("zone, two threads", call_zone, &two);
    plumb_diag d;
    assert_int_equal(call_zone(&two, &d), PLUMB_OK); /* the last run above failed */
    every_report("zone", call_report_zone, two.rep);
    each_allocation_fails_in_turn("zone regions (CSV)", call_zone_regions, &two);
    study_done(&sc);
}

/* The brief of a study (include/plumb/brief.h): its falls, paths and,
 * with uncertainty, a small zone. */
static plumb_status call_brief(void *ctx, plumb_diag *d)
{
    study_ctx *c = ctx;
    plumb_brief_options o;
    plumb_brief_options_init(&o);
    o.zone = 1;
    o.samples = 368; /* the fewest that bound the profile's 99 % radius at 95 % */
    o.has_seed = 1;
    o.seed = 5;
    o.threads = 1;
    o.max_points = 100;
    plumb_brief *b = NULL;
    plumb_status st = plumb_brief_alloc(c->study, &o, &b, d);
    plumb_brief_free(b);
    return st;
}

static void test_a_brief_fails_cleanly_at_every_allocation(void **s)
{
    (void)s;
    study_ctx sc;
    study_make(&sc, "profiles/demo/drone-release.yaml", NULL, 0);
    each_allocation_fails_in_turn("brief with a zone", call_brief, &sc);
    study_done(&sc);
    study_make(&sc, "tests/cli/profiles/inventory.yaml", NULL, 0);
    each_allocation_fails_in_turn("brief of an inventory", call_brief, &sc);
    study_done(&sc);
}

/* The PDF sheet of a brief (include/plumb/sheet.h, libplumb-sheet.a):
 * only the sheet's own allocations are wrapped (cairo's and pango's are
 * inside their shared libraries, not ours to fail). The PDF goes to a
 * temporary file opened before the hook is armed. */
typedef struct sheet_ctx {
    plumb_brief *brief;
    FILE *out;
} sheet_ctx;

static plumb_status call_sheet(void *ctx, plumb_diag *d)
{
    sheet_ctx *c = ctx;
    plumb_sheet_options so;
    memset(&so, 0, sizeof so);
    so.paper = PLUMB_PAPER_A4;
    so.units = PLUMB_UNITS_US;
    so.version = PLUMB_VERSION;
    const plumb_brief *const briefs[] = {c->brief};
    rewind(c->out);
    return plumb_sheet_write(c->out, &so, briefs, 1, d);
}

static void test_a_sheet_fails_cleanly_at_every_allocation(void **s)
{
    (void)s;
    study_ctx sc;
    study_make(&sc, "tests/cli/profiles/inventory.yaml", NULL, 0);
    plumb_brief_options o;
    plumb_brief_options_init(&o);
    sheet_ctx c = {NULL, tmpfile()};
    plumb_diag d;
    assert_non_null(c.out);
    assert_int_equal(plumb_brief_alloc(sc.study, &o, &c.brief, &d), PLUMB_OK);
    each_allocation_fails_in_turn("sheet of an inventory", call_sheet, &c);
    plumb_brief_free(c.brief);
    fclose(c.out);
    study_done(&sc);
}

/* Allocations one call makes (recorded, none failing). */
static unsigned long allocations_of(call_fn call, void *ctx)
{
    plumb_diag d;
    failalloc_record(1);
    plumb_status st = call(ctx, &d);
    failalloc_record(0);
    assert_int_equal(st, PLUMB_OK);
    return failalloc_recorded();
}

/* Nothing is allocated per fall or per sample (memory stays flat as the
 * samples grow, README "plumb zone"); the workspaces are
 * made once. A study's fall allocates nothing once the study is open, and
 * a zone of 8 times the samples makes as many allocations. */
static void test_nothing_is_allocated_per_fall_or_per_sample(void **s)
{
    (void)s;
    study_ctx sc;
    study_make(&sc, "profiles/demo/drone-release.yaml", NULL, 0);
    assert_int_equal(allocations_of(call_study_fall, &sc), 0);
    assert_int_equal(allocations_of(call_study_fall, &sc), 0);
    zone_ctx few = {&sc, 1, 160, NULL}, many = {&sc, 1, 1280, NULL};
    unsigned long a_few = allocations_of(call_zone, &few);
    unsigned long a_many = allocations_of(call_zone, &many);
    print_message("zone: %lu allocations for 160 samples, %lu for 1280\n", a_few, a_many);
    assert_int_equal(a_few, a_many);
    study_done(&sc);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_loading_units_criteria_and_profiles_fails_cleanly_at_every_allocation),
        cmocka_unit_test(test_a_spec_built_in_code_and_a_bare_fall_fail_cleanly_at_every_allocation),
        cmocka_unit_test(test_every_fall_and_its_reports_fail_cleanly_at_every_allocation),
        cmocka_unit_test(test_sweeps_and_limits_fail_cleanly_at_every_allocation),
        cmocka_unit_test(test_zones_fail_cleanly_at_every_allocation_on_one_and_two_threads),
        cmocka_unit_test(test_nothing_is_allocated_per_fall_or_per_sample),
        cmocka_unit_test(test_a_brief_fails_cleanly_at_every_allocation),
        cmocka_unit_test(test_a_sheet_fails_cleanly_at_every_allocation),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
