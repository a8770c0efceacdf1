/*
 * test_report.c - the report module: cautions in every format, refusal of
 * non-finite figures with nothing written, verdict ratios and words against
 * the published criteria values, warnings, JSON contract keys and
 * round-trip precision, CSV quoting and units, inventory summary lines.
 *
 * Sources of the checked values:
 *   - 14 CFR 107.130(a)(1): 25 ft lbf (seen) and 14 CFR 107.120(a)(1):
 *     11 ft lbf (transcribed), with 1 ft lbf = 1.3558179483 J exactly
 *     (0.3048 m x 0.45359237 kg x 9.80665 m/s^2: 1959 international yard
 *     and pound agreement, CGPM 1901 standard gravity), so
 *     33.895 J and 14.914 J.
 *   - EN 397:2012+A1:2012 shock absorption test energy 49 J (a 5.0 kg
 *     striker dropped 1 m; from memory, not confirmed in the standard; a
 *     helmet test, not a safe limit).
 *   - U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), Table I at 0 m
 *     (transcribed).
 *   - IEEE 754-2008 section 5.12.2: 17 significant decimal digits recover
 *     any binary64 value exactly.
 *   - RFC 4180 section 2: fields containing commas or quotes are quoted,
 *     quotes doubled.
 *   - README.md "plumb fall" and "Cautions", SAFETY.md section 1: the JSON
 *     keys and the cautions.
 * The fall results are hand-built (not computed): these tests check what
 * the report does with figures, not the physics that made them.
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
#include <jansson.h>

#include "plumb/plumb.h"
#include "core/internal.h"
#include "plumb_test.h"

/* 1 ft lbf in J, exact by definition: the international foot 0.3048 m and
 * pound 0.45359237 kg (1959 agreement) under standard gravity 9.80665 m/s^2
 * (CGPM 1901): 1.3558179483 J to ten decimals. */
#define FT_LBF_J (0.3048 * 0.45359237 * 9.80665)

typedef struct fixture {
    char dir[64];             /* temporary directory */
    char crit_dir[96];        /* its criteria/ */
    plumb_units *units;
    plumb_criteria *crit;
} fixture;

static void write_file(const char *path, const char *text)
{
    FILE *f = fopen(path, "w");
    assert_non_null(f);
    assert_true(fputs(text, f) >= 0);
    assert_int_equal(fclose(f), 0);
}

static void remove_tree(const char *dir)
{
    char cmd[256];
    snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
    assert_int_equal(system(cmd), 0);
}

static int setup(void **state)
{
    plumbt_setup_gsl(state);
    fixture *fx = calloc(1, sizeof *fx);
    if (!fx)
        return -1;
    snprintf(fx->dir, sizeof fx->dir, "/tmp/plumb-test-report-XXXXXX");
    if (!mkdtemp(fx->dir)) {
        free(fx);
        return -1;
    }
    snprintf(fx->crit_dir, sizeof fx->crit_dir, "%s/criteria", fx->dir);
    char cmd[160];
    snprintf(cmd, sizeof cmd, "mkdir '%s'", fx->crit_dir);
    if (system(cmd) != 0) {
        free(fx);
        return -1;
    }
    char path[160];
    /* 14 CFR 107.130(a)(1), seen: 25 ft lbf. */
    snprintf(path, sizeof path, "%s/us-part107-cat3.yaml", fx->crit_dir);
    write_file(path, "name: US operations over people, category 3\n"
                     "kind: limit\n"
                     "energy_limit: 25 ft lbf\n"
                     "applies_to: rigid object striking a person\n"
                     "source: 14 CFR 107.130(a)(1)\n"
                     "status: seen\n");
    /* 14 CFR 107.120(a)(1), transcribed: 11 ft lbf. */
    snprintf(path, sizeof path, "%s/us-part107-cat2.yaml", fx->crit_dir);
    write_file(path, "name: US operations over people, category 2\n"
                     "kind: limit\n"
                     "energy_limit: 11 ft lbf\n"
                     "applies_to: rigid object striking a person\n"
                     "source: 14 CFR 107.120(a)(1)\n"
                     "status: transcribed\n");
    /* EN 397:2012+A1:2012 shock absorption, 49 J (from memory; the
     * fixture's status is its own). */
    snprintf(path, sizeof path, "%s/en397-shock-49j.yaml", fx->crit_dir);
    write_file(path, "name: EN 397 helmet shock absorption test\n"
                     "kind: helmet-test\n"
                     "energy_limit: 49 J\n"
                     "applies_to: industrial safety helmet, as tested (not a safe limit)\n"
                     "source: EN 397, shock absorption test\n"
                     "status: transcribed\n");
    plumb_diag diag;
    plumb_diag_clear(&diag);
    if (plumb_units_alloc(&fx->units, &diag) != PLUMB_OK)
        return -1;
    if (plumb_criteria_load_dir(fx->crit_dir, fx->units, &fx->crit, &diag) != PLUMB_OK) {
        fprintf(stderr, "criteria: %s\n", diag.message);
        return -1;
    }
    *state = fx;
    return 0;
}

static int teardown(void **state)
{
    fixture *fx = *state;
    plumb_criteria_free(fx->crit);
    plumb_units_free(fx->units);
    remove_tree(fx->dir);
    free(fx);
    return 0;
}

/* Loads a profile written into the fixture's directory. */
static plumb_profile *load_profile(fixture *fx, const char *name, const char *yaml)
{
    char path[160];
    snprintf(path, sizeof path, "%s/%s", fx->dir, name);
    write_file(path, yaml);
    plumb_profile *p = NULL;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_status st = plumb_profile_load(path, fx->units, NULL, 0, &p, &diag);
    if (st != PLUMB_OK)
        fprintf(stderr, "profile: %s: %s\n", diag.key, diag.message);
    assert_int_equal(st, PLUMB_OK);
    return p;
}

static const char spanner_yaml[] =
    "name: Test spanner, 3/8 in\n"
    "payload:\n"
    "  mass: 2.385 kg\n"
    "  drag: {cd: 0.93, area: 0.0187 m^2}\n"
    "release:\n"
    "  height: 28.7 m\n"
    "criteria: [us-part107-cat3, us-part107-cat2]\n";

/* A hand-built fall of the 2.385 kg spanner at impact speed v. */
static void hand_built(plumb_item_report *it, const plumb_profile *p, double v)
{
    memset(it, 0, sizeof *it);
    it->spec = plumb_profile_item(p, 0);
    it->shape = plumb_profile_item_shape(p, 0);
    plumb_fall_result *r = &it->result;
    double m = it->spec->mass_kg;
    r->time_s = 2.6381;
    r->velocity_m_s[0] = 0.0;
    r->velocity_m_s[1] = 0.0;
    r->velocity_m_s[2] = -v;
    r->speed_m_s = v;
    r->energy_j = 0.5 * m * v * v;
    r->momentum_kg_m_s = m * v;
    r->angle_deg = 90.0;
    r->apex_m = 28.7;
    r->terminal_speed_m_s = 46.713;
    r->drag_free_speed_m_s = sqrt(2.0 * PLUMB_G0_M_S2 * 28.7);
    r->drag_free_energy_j = m * PLUMB_G0_M_S2 * 28.7;
    r->drag_work_j = r->energy_j - r->drag_free_energy_j;
    r->max_mach = v / 340.29;
    r->solver.method = "rk8pd";
    r->solver.steps = 37;
    r->solver.rhs_evaluations = 481;
}

/* Runs the fall report into a string (caller frees); *st gets the status. */
static char *fall_report(const plumb_profile *p, plumb_item_report *items, size_t n,
                         plumb_format format, plumb_unit_system units, plumb_status *st,
                         plumb_diag *diag)
{
    char *buf = NULL;
    size_t len = 0;
    FILE *f = open_memstream(&buf, &len);
    assert_non_null(f);
    plumb_report_options opt = {format, units, "9.9.9"};
    plumb_fall_report rep = {p, n, items};
    plumb_diag_clear(diag);
    *st = plumb_report_fall(f, &opt, &rep, diag);
    assert_int_equal(fclose(f), 0);
    return buf;
}

/* Copy of s with every run of white space made one space. */
static char *squeeze(const char *s)
{
    char *out = malloc(strlen(s) + 1);
    assert_non_null(out);
    size_t k = 0;
    int space = 0;
    for (const char *p = s; *p; p++) {
        if (*p == ' ' || *p == '\n' || *p == '\t') {
            space = 1;
            continue;
        }
        if (space && k > 0)
            out[k++] = ' ';
        space = 0;
        out[k++] = *p;
    }
    out[k] = '\0';
    return out;
}

static plumb_item_report judged_spanner(fixture *fx, const plumb_profile *p, double v)
{
    plumb_item_report it;
    hand_built(&it, p, v);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_OK);
    return it;
}

/* ---- cautions ----------------------------------------------------------- */

static void test_cautions_make_every_point_of_safety_md_section_1(void **state)
{
    (void)state;
    size_t n = 0;
    const char *const *c = plumb_cautions(&n);
    assert_true(n >= 4);
    char all[2048] = "";
    for (size_t i = 0; i < n; i++) {
        assert_true(strlen(all) + strlen(c[i]) + 2 < sizeof all);
        strcat(all, c[i]);
        strcat(all, " ");
    }
    /* SAFETY.md section 1 (README.md "Cautions"), point by point. */
    assert_non_null(strstr(all, "engineering estimate"));
    assert_non_null(strstr(all, "point-mass model"));
    assert_non_null(strstr(all, "deflect, bounce, break and tumble"));
    assert_non_null(strstr(all, "not guarantees of safety"));
    assert_non_null(strstr(all, "sharp or dense objects injure below them"));
    assert_non_null(strstr(all, "local codes and regulations"));
    assert_non_null(strstr(all, "competent or licensed person"));
    assert_non_null(strstr(all, "SAFETY.md"));
}

static void test_cautions_appear_in_text_json_and_csv_fall_reports(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    plumb_item_report it = judged_spanner(fx, p, 22.913);
    size_t n;
    const char *const *c = plumb_cautions(&n);
    plumb_status st;
    plumb_diag diag;

    char *text = fall_report(p, &it, 1, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    char *flat = squeeze(text);
    for (size_t i = 0; i < n; i++) {
        char *want = squeeze(c[i]);
        if (!strstr(flat, want))
            fail_msg("text report lacks caution: %s", c[i]);
        free(want);
    }
    free(flat);
    free(text);

    char *json = fall_report(p, &it, 1, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    json_error_t err;
    json_t *root = json_loads(json, 0, &err);
    assert_non_null(root);
    json_t *arr = json_object_get(root, "cautions");
    assert_true(json_is_array(arr));
    assert_int_equal(json_array_size(arr), n);
    for (size_t i = 0; i < n; i++)
        assert_string_equal(json_string_value(json_array_get(arr, i)), c[i]);
    json_decref(root);
    free(json);

    char *csv = fall_report(p, &it, 1, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    const char *header = strstr(csv, "\nitem_number,name,");
    assert_non_null(header);
    for (size_t i = 0; i < n; i++) {
        char line[512];
        snprintf(line, sizeof line, "# %s\n", c[i]);
        const char *at = strstr(csv, line);
        if (!at || at > header)
            fail_msg("CSV lacks caution comment before the header: %s", c[i]);
    }
    free(csv);
    plumb_profile_free(p);
}

static void test_cautions_appear_in_air_reports_of_every_format(void **state)
{
    (void)state;
    plumb_air row = {0.0, 288.15, 101325.0, 1.2250, 1.7894e-5, 340.294};
    size_t n;
    const char *const *c = plumb_cautions(&n);
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        char *buf = NULL;
        size_t len = 0;
        FILE *out = open_memstream(&buf, &len);
        plumb_report_options opt = {(plumb_format)f, PLUMB_UNITS_SI, NULL};
        plumb_diag diag;
        plumb_diag_clear(&diag);
        assert_int_equal(plumb_report_air(out, &opt, &row, 1, &diag), PLUMB_OK);
        fclose(out);
        char *flat = squeeze(buf);
        for (size_t i = 0; i < n; i++) {
            char *want = squeeze(c[i]);
            if (!strstr(flat, want))
                fail_msg("air report (format %d) lacks caution: %s", f, c[i]);
            free(want);
        }
        free(flat);
        free(buf);
    }
}

/* ---- refusal of non-finite figures --------------------------------------- */

static void test_non_finite_impact_speed_is_refused_with_nothing_written(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        plumb_item_report it = judged_spanner(fx, p, 22.913);
        it.result.speed_m_s = NAN;
        plumb_status st;
        plumb_diag diag;
        char *buf = fall_report(p, &it, 1, (plumb_format)f, PLUMB_UNITS_SI, &st, &diag);
        assert_int_equal(st, PLUMB_ENUMERIC);
        assert_int_equal(diag.status, PLUMB_ENUMERIC);
        assert_non_null(strstr(diag.message, "impact speed"));
        assert_true(buf == NULL || buf[0] == '\0');
        free(buf);
    }
    plumb_profile_free(p);
}

static void test_infinite_energy_ratio_is_refused_with_nothing_written(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        plumb_item_report it = judged_spanner(fx, p, 22.913);
        it.verdicts[1].ratio = INFINITY;
        plumb_status st;
        plumb_diag diag;
        char *buf = fall_report(p, &it, 1, (plumb_format)f, PLUMB_UNITS_US, &st, &diag);
        assert_int_equal(st, PLUMB_ENUMERIC);
        assert_true(buf == NULL || buf[0] == '\0');
        free(buf);
    }
    plumb_profile_free(p);
}

static void test_non_finite_air_density_is_refused_with_nothing_written(void **state)
{
    (void)state;
    plumb_air rows[2] = {{0.0, 288.15, 101325.0, 1.2250, 1.7894e-5, 340.294},
                         {1000.0, 281.651, 89876.0, NAN, 1.7579e-5, 336.43}};
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        char *buf = NULL;
        size_t len = 0;
        FILE *out = open_memstream(&buf, &len);
        plumb_report_options opt = {(plumb_format)f, PLUMB_UNITS_SI, NULL};
        plumb_diag diag;
        plumb_diag_clear(&diag);
        assert_int_equal(plumb_report_air(out, &opt, rows, 2, &diag), PLUMB_ENUMERIC);
        fclose(out);
        assert_int_equal(len, 0);
        free(buf);
    }
}

/* ---- verdicts ------------------------------------------------------------ */

static void test_part107_verdicts_use_33_895_and_14_914_joules(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    /* 5.291 m/s: 0.5 x 2.385 x 5.291^2 = 33.384 J, within 25 ft lbf but
     * above 11 ft lbf. */
    plumb_item_report it = judged_spanner(fx, p, 5.291);
    assert_int_equal(it.n_verdicts, 2);
    const plumb_verdict *cat3 = &it.verdicts[0], *cat2 = &it.verdicts[1];
    assert_string_equal(cat3->criterion->id, "us-part107-cat3");
    assert_string_equal(cat2->criterion->id, "us-part107-cat2");
    /* 14 CFR 107.130(a)(1): 25 ft lbf = 33.895 J; 107.120(a)(1): 11 ft lbf = 14.914 J. */
    assert_rel(cat3->criterion->energy_limit_j, 33.895, 2e-5);
    assert_rel(cat2->criterion->energy_limit_j, 14.914, 2e-5);
    double e = 0.5 * 2.385 * 5.291 * 5.291;
    assert_rel(cat3->ratio, e / (25.0 * FT_LBF_J), 1e-12);
    assert_rel(cat2->ratio, e / (11.0 * FT_LBF_J), 1e-12);
    assert_false(cat3->exceeds);
    assert_true(cat2->exceeds);

    plumb_status st;
    plumb_diag diag;
    char *json = fall_report(p, &it, 1, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    json_t *root = json_loads(json, 0, NULL);
    assert_non_null(root);
    json_t *crit = json_object_get(root, "criteria");
    assert_int_equal(json_array_size(crit), 2);
    json_t *c0 = json_array_get(crit, 0), *c1 = json_array_get(crit, 1);
    assert_string_equal(json_string_value(json_object_get(c0, "verdict")), "within");
    assert_string_equal(json_string_value(json_object_get(c1, "verdict")), "exceeds");
    assert_string_equal(json_string_value(json_object_get(c0, "source")), "14 CFR 107.130(a)(1)");
    assert_rel(json_real_value(json_object_get(c0, "energy_limit_j")), 33.895, 2e-5);
    assert_rel(json_real_value(json_object_get(c1, "ratio")), e / (11.0 * FT_LBF_J), 1e-12);
    json_decref(root);
    free(json);

    char *text = fall_report(p, &it, 1, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(strstr(text, "WITHIN   US operations over people, category 3"));
    assert_non_null(strstr(text, "EXCEEDS  US operations over people, category 2"));
    /* Limits shown in both units, each rounded down (the strict side, issue
     * 9): 25 ft lbf = 33.8954 J -> 33.89 J, 11 ft lbf = 14.9140 J -> 14.91 J
     * (1 ft lbf = 1.3558179483 J exactly, 1959 agreement and CGPM 1901). */
    assert_non_null(strstr(text, "limit 33.89 J (25.00 ft·lbf)"));
    assert_non_null(strstr(text, "limit 14.91 J (11.00 ft·lbf)"));
    /* Ratio e / 14.914 = 2.238 shown to three figures. */
    assert_non_null(strstr(text, "ratio 2.24"));
    free(text);
    plumb_profile_free(p);
}

/* A ratio that would print as 1.00 keeps the side of the limit it is on:
 * it is given with the figures that show it (README.md "Criteria"), the
 * verdict word beside it in text and CSV. Energies 0.04 % below and above
 * 25 ft lbf (14 CFR 107.130(a)(1), seen; 1 ft lbf = 1.3558179483 J):
 * ratios 0.9996 and 1.0004, both 1.00 to three figures, so 4 are given. */
static void test_a_ratio_printed_as_one_shows_its_verdict_beside_it(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    static const double factor[2] = {0.9996, 1.0004};
    static const char *const text_want[2] = {"ratio 0.9996, within", "ratio 1.0004, exceeds"};
    static const char *const csv_want[2] = {",0.9996,within,", ",1.0004,exceeds,"};
    for (int i = 0; i < 2; i++) {
        double e = factor[i] * 25.0 * FT_LBF_J;
        plumb_item_report it = judged_spanner(fx, p, sqrt(2.0 * e / 2.385));
        assert_rel(it.verdicts[0].ratio, factor[i], 1e-12);
        plumb_status st;
        plumb_diag diag;
        char *text = fall_report(p, &it, 1, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, &st, &diag);
        assert_int_equal(st, PLUMB_OK);
        if (!strstr(text, text_want[i]))
            fail_msg("text lacks '%s':\n%s", text_want[i], text);
        free(text);
        char *csv = fall_report(p, &it, 1, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI, &st, &diag);
        assert_int_equal(st, PLUMB_OK);
        if (!strstr(csv, csv_want[i]))
            fail_msg("CSV lacks '%s':\n%s", csv_want[i], csv);
        free(csv);
    }
    plumb_profile_free(p);
}

static void test_energy_is_shown_in_joules_and_foot_pounds_in_both_unit_systems(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    /* v such that E = 25 ft lbf exactly: 33.895 J. */
    double v = sqrt(2.0 * 25.0 * FT_LBF_J / 2.385);
    plumb_item_report it = judged_spanner(fx, p, v);
    plumb_status st;
    plumb_diag diag;
    char *si = fall_report(p, &it, 1, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(strstr(si, "energy     33.90 J (25.00 ft·lbf)"));
    char *us = fall_report(p, &it, 1, PLUMB_FORMAT_TEXT, PLUMB_UNITS_US, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(strstr(us, "energy     25.00 ft·lbf (33.90 J)"));
    /* 1 ft = 0.3048 m: v m/s = v / 0.3048 ft/s. */
    char want[64];
    snprintf(want, sizeof want, "speed      %.2f ft/s", v / 0.3048);
    assert_non_null(strstr(us, want));
    free(si);
    free(us);
    plumb_profile_free(p);
}

static void test_unknown_named_criterion_is_a_key_error_with_did_you_mean(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "typo.yaml",
                                    "name: Typo\n"
                                    "payload: {mass: 0.734 kg, drag: {cd_area: 0.0041 m^2}}\n"
                                    "release: {height: 17.3 m}\n"
                                    "criteria: [us-part107-cat3, us-part-107-cat3]\n");
    plumb_item_report it;
    hand_built(&it, p, 14.2);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_EKEY);
    assert_int_equal(diag.status, PLUMB_EKEY);
    assert_string_equal(diag.key, "criteria[1]");
    assert_non_null(strstr(diag.message, "'us-part-107-cat3'"));
    assert_non_null(strstr(diag.message, "did you mean 'us-part107-cat3'"));
    plumb_profile_free(p);
}

/* A criterion named by --set is reported in "--set", at its column in the
 * argument (README.md "Exit status", DEVELOPERS.md "Errors": the file is
 * the profile's path, "--set" for an override), even when the profile has
 * no criteria key. */
static void test_unknown_criterion_from_set_names_set_and_the_nearest_id(void **state)
{
    fixture *fx = *state;
    char path[160];
    snprintf(path, sizeof path, "%s/nocrit.yaml", fx->dir);
    write_file(path, "payload: {mass: 0.734 kg, drag: {cd_area: 0.0041 m^2}}\n"
                     "release: {height: 17.3 m}\n");
    const char *sets[] = {"criteria=[en397-shok]"};
    plumb_profile *p = NULL;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_profile_load(path, fx->units, sets, 1, &p, &diag), PLUMB_OK);
    assert_string_equal(plumb_profile_criterion_file(p, 0), "--set");
    plumb_item_report it;
    hand_built(&it, p, 14.2);
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_EKEY);
    assert_string_equal(diag.file, "--set");
    assert_int_equal(diag.line, 1);
    assert_int_equal(diag.col, 11); /* criteria=[ is 10 characters */
    assert_string_equal(diag.key, "criteria[0]");
    assert_non_null(strstr(diag.message, "did you mean 'en397-shock-49j'"));
    plumb_profile_free(p);
}

static void test_profile_naming_no_criteria_is_judged_against_all(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "all.yaml",
                                    "payload: {mass: 0.734 kg, drag: {cd_area: 0.0041 m^2}}\n"
                                    "release: {height: 17.3 m}\n");
    plumb_item_report it;
    hand_built(&it, p, 14.2);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_OK);
    assert_int_equal(it.n_verdicts, plumb_criteria_count(fx->crit));
    assert_int_equal(it.n_verdicts, 3);
    plumb_profile_free(p);
}

/* ---- warnings ------------------------------------------------------------ */

static int has_warning(const plumb_item_report *it, const char *needle)
{
    for (size_t i = 0; i < it->n_warnings; i++)
        if (strstr(it->warnings[i], needle))
            return 1;
    return 0;
}

static void test_mach_above_one_half_gives_a_warning(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    plumb_item_report it;
    hand_built(&it, p, 22.913);
    it.result.max_mach = 0.537;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_OK);
    assert_true(has_warning(&it, "Mach 0.54"));
    hand_built(&it, p, 22.913);
    it.result.max_mach = 0.493;
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_OK);
    assert_false(has_warning(&it, "Mach"));
    plumb_profile_free(p);
}

static void test_reynolds_number_beyond_morrison_range_gives_a_warning(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    plumb_fall_spec sphere = *plumb_profile_item(p, 0);
    sphere.drag.model = PLUMB_DRAG_SPHERE_MORRISON;
    sphere.drag.diameter_m = 0.347;
    plumb_item_report it;
    hand_built(&it, p, 22.913);
    it.spec = &sphere;
    /* Morrison (2010 handout, eq. 1): the correlation holds for Re <= 1e6. */
    it.result.min_re = 1.13e4;
    it.result.max_re = 1.27e6;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_OK);
    assert_true(has_warning(&it, "Reynolds number runs from 1.13e+04 to 1.27e+06"));
    it.result.max_re = 9.71e5;
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_OK);
    assert_false(has_warning(&it, "Reynolds"));
    plumb_profile_free(p);
}

static void test_helmet_test_criterion_is_labelled_not_a_safe_limit(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "helmet.yaml",
                                    "payload: {mass: 0.734 kg, drag: {cd_area: 0.0041 m^2}}\n"
                                    "release: {height: 17.3 m}\n"
                                    "criteria: [en397-shock-49j, us-part107-cat2]\n");
    plumb_item_report it;
    hand_built(&it, p, 14.2);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, NULL, &diag), PLUMB_OK);
    assert_true(has_warning(&it, "en397-shock-49j is the energy a helmet is tested to, not a "
                                 "safe limit"));
    assert_false(has_warning(&it, "us-part107-cat2"));
    plumb_profile_free(p);
}

/* Fails unless a warning is whole: it ends its sentence with a full stop
 * and carries neither mark of a warning cut or left out
 * (core/internal.h), and it fits its slot with room to spare. */
static void assert_whole(const char *w)
{
    size_t n = strlen(w);
    if (n == 0 || w[n - 1] != '.' || strstr(w, PLUMBP_WARNING_CUT) ||
        strstr(w, PLUMBP_WARNINGS_LEFT_OUT) || n + 1 >= PLUMB_WARNING)
        fail_msg("warning not whole (%zu bytes): %s", n, w);
}

/* The zone carries a fall's warnings as plumb fall gives them (study.c):
 * each, added to a zone result, must read back the same, whole. */
static void assert_whole_in_a_zone(const plumb_item_report *it)
{
    plumb_zone_result *z = calloc(1, sizeof *z);
    assert_non_null(z);
    for (size_t i = 0; i < it->n_warnings; i++) {
        assert_whole(it->warnings[i]);
        plumb_zone_add_warning(z, "%s", it->warnings[i]);
        assert_string_equal(z->warnings[z->n_warnings - 1], it->warnings[i]);
    }
    assert_int_equal(z->n_warnings, it->n_warnings);
    free(z);
}

/* Every warning the judge writes, each at its longest: the widest words
 * (flutter, von Karman) and figures as wide as %.3g prints (three digits
 * and a three-digit exponent; the wake's a two-digit one, since its
 * fourth powers must stay finite), with room to spare in the slot. The Mach figure (%.2f) is given six integer digits: Mach
 * 98765 is 3.4e7 m/s, beyond the terminal speeds plumb computes. Before
 * this test a zone kept 320 bytes of each and cut the glide and downwash
 * warnings mid-word. */
static void test_the_longest_warnings_of_a_fall_are_whole_in_the_fall_and_its_zone(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    plumb_fall_spec s = *plumb_profile_item(p, 0);
    s.drag.model = PLUMB_DRAG_SPHERE_MORRISON;
    s.drag.diameter_m = 0.347;
    s.drag.extrapolated = 1;
    s.glide.mode = PLUMB_GLIDE_FLUTTER;
    s.glide.from_shape = 1;
    s.glide.istar = -1.23456e-100;
    /* a wake whose figures print wide but whose fourth powers stay finite */
    s.downwash.aircraft_mass_kg = 1.23456e+60;
    s.downwash.disk_area_m2 = 1.23456e-60;
    s.velocity_m_s[0] = -1.23456e+62; /* air past the rotor: the skewed wake too */
    s.turbulence.model = PLUMB_TURB_VON_KARMAN;
    s.turbulence.w20_m_s = 1.23456e+101;
    s.turbulence.n_modes = (size_t)-1;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    plumb_item_report it;
    hand_built(&it, p, 22.913);
    it.spec = &s;
    it.result.max_mach = 98765.4321;
    it.result.min_re = 1.23456e-100;
    it.result.max_re = 1.23456e+101;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, atm, &diag), PLUMB_OK);
    /* Mach, Reynolds, the table's end, the glide, two of downwash, gusts */
    assert_int_equal(it.n_warnings, 7);
    assert_true(has_warning(&it, "Plate-like: taken to flutter"));
    assert_true(has_warning(&it, "for the whole fall."));
    assert_true(has_warning(&it, "rough guide only."));
    assert_whole_in_a_zone(&it);
    /* the descent devices that do not open (no glide with a device) */
    s.n_descent = PLUMB_MAX_DESCENT;
    for (size_t i = 0; i < PLUMB_MAX_DESCENT; i++)
        s.descent[i].kind = PLUMB_DESCENT_STREAMER;
    it.result.n_deployed = 0;
    assert_int_equal(plumb_item_judge(&it, p, fx->crit, atm, &diag), PLUMB_OK);
    assert_true(has_warning(&it, "(descent[1]) does not open"));
    assert_false(has_warning(&it, "Plate-like"));
    assert_whole_in_a_zone(&it);
    plumb_atmosphere_free(atm);
    plumb_profile_free(p);
}

/* Helmet tests whose ids fit in a warning but whose sentence would not
 * are counted, not named and cut: seven ids of 60 characters are 432
 * bytes of names, the sentence about them 547 (PLUMB_WARNING is 512). */
static void test_helmet_tests_too_many_to_name_are_counted_not_cut(void **state)
{
    fixture *fx = *state;
    char dir[160], path[256], yaml[1024];
    snprintf(dir, sizeof dir, "%s/helmets", fx->dir);
    snprintf(path, sizeof path, "mkdir '%s'", dir);
    assert_int_equal(system(path), 0);
    size_t len = (size_t)snprintf(yaml, sizeof yaml, "payload: {mass: 0.734 kg, drag: {cd_area: "
                                  "0.0041 m^2}}\nrelease: {height: 17.3 m}\ncriteria: [");
    for (int i = 0; i < 7; i++) {
        char id[80];
        snprintf(id, sizeof id, "helmet-test-%d-with-an-identifier-as-long-as-a-file-may-give1", i);
        assert_int_equal(strlen(id), 60);
        snprintf(path, sizeof path, "%s/%s.yaml", dir, id);
        /* EN 397 shock absorption test energy, 49 J (see the file's sources) */
        write_file(path, "name: EN 397 helmet shock absorption test\nkind: helmet-test\n"
                         "energy_limit: 49 J\napplies_to: industrial safety helmet, as tested\n"
                         "source: EN 397, shock absorption test\nstatus: transcribed\n");
        len += (size_t)snprintf(yaml + len, sizeof yaml - len, "%s%s", i ? ", " : "", id);
    }
    snprintf(yaml + len, sizeof yaml - len, "]\n");
    plumb_criteria *crit = NULL;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_criteria_load_dir(dir, fx->units, &crit, &diag), PLUMB_OK);
    plumb_profile *p = load_profile(fx, "helmets.yaml", yaml);
    plumb_item_report it;
    hand_built(&it, p, 14.2);
    assert_int_equal(plumb_item_judge(&it, p, crit, NULL, &diag), PLUMB_OK);
    assert_int_equal(it.n_warnings, 1);
    assert_whole(it.warnings[0]);
    assert_non_null(strstr(it.warnings[0], "7 of the criteria are the energies helmets are "
                                           "tested to"));
    plumb_profile_free(p);
    plumb_criteria_free(crit);
}

/* A warning longer than its slot, or one more than a list holds, is
 * marked as such, never cut or dropped in silence. */
static void test_a_warning_that_does_not_fit_says_so(void **state)
{
    (void)state;
    plumb_zone_result *z = calloc(1, sizeof *z);
    assert_non_null(z);
    char longest[PLUMB_ZONE_WARNING + 200];
    memset(longest, 'x', sizeof longest - 1);
    longest[sizeof longest - 1] = '\0';
    /* the longest that fits is kept whole */
    plumb_zone_add_warning(z, "%.*s", PLUMB_ZONE_WARNING - 1, longest);
    assert_int_equal(strlen(z->warnings[0]), PLUMB_ZONE_WARNING - 1);
    assert_null(strstr(z->warnings[0], PLUMBP_WARNING_CUT));
    /* one byte more ends in the mark; a two-byte character is never split */
    plumb_zone_add_warning(z, "%s", longest);
    const char *w = z->warnings[1];
    assert_true(strlen(w) < PLUMB_ZONE_WARNING);
    assert_string_equal(w + strlen(w) - strlen(PLUMBP_WARNING_CUT), PLUMBP_WARNING_CUT);
    for (size_t i = 0; i + 1 < sizeof longest; i += 2)
        memcpy(longest + i, "\xC2\xB0", 2);
    longest[sizeof longest - 1 - (sizeof longest - 1) % 2] = '\0';
    plumb_zone_add_warning(z, "%s", longest);
    w = z->warnings[2];
    size_t keep = strlen(w) - strlen(PLUMBP_WARNING_CUT);
    assert_int_equal(keep % 2, 0);
    assert_int_equal(strncmp(w, longest, keep), 0);
    /* the list full: the last says that more were left out */
    while (z->n_warnings < PLUMB_ZONE_MAX_WARNINGS)
        plumb_zone_add_warning(z, "Warning %zu.", z->n_warnings);
    assert_string_equal(z->warnings[PLUMB_ZONE_MAX_WARNINGS - 1], "Warning 15.");
    plumb_zone_add_warning(z, "One too many.");
    assert_int_equal(z->n_warnings, PLUMB_ZONE_MAX_WARNINGS);
    assert_string_equal(z->warnings[PLUMB_ZONE_MAX_WARNINGS - 1], PLUMBP_WARNINGS_LEFT_OUT);
    free(z);
}

/* A warning's figures are marks with their SI values, shown in the units
 * asked for. Conversions: 1 lbf = 0.45359237 kg x 9.80665 m/s^2 =
 * 4.4482216152605 N, 1 ft = 0.3048 m (1959 international yard and pound
 * agreement; NIST SP 811, 2008, B.8); 1 mph = 1609.344 m / 3600 s =
 * 0.44704 m/s, 1 kn = 1852 m / 3600 s (NIST SP 811, B.8). */
static void test_a_warnings_figures_are_shown_in_the_units_asked_for(void **state)
{
    (void)state;
    plumb_zone_result *z = calloc(1, sizeof *z);
    assert_non_null(z);
    plumb_zone_add_warning(z, "thrust " PLUMBP_Q_FORCE " over " PLUMBP_Q_AREA ", wake "
                           PLUMBP_Q_AIR ", fall " PLUMBP_Q_SPEED ", leans " PLUMBP_Q_ANGLE
                           ", height " PLUMBP_Q_LENGTH ".",
                           2.0 * 4.4482216152605, 3.0 * 0.3048 * 0.3048, 5.0 * 0.44704,
                           7.0 * 0.3048, 74.4, 11.0 * 0.3048);
    char buf[PLUMB_ZONE_WARNING * 2];
    size_t n = plumb_report_warning(z->warnings[0], PLUMB_UNITS_US, buf, sizeof buf);
    assert_string_equal(buf, "thrust 2.00 lbf over 3.00 ft², wake 5.00 mph (4.34 kn), "
                             "fall 7.00 ft/s, leans 74°, height 11.0 ft.");
    assert_int_equal(n, strlen(buf));
    plumb_report_warning(z->warnings[0], PLUMB_UNITS_SI, buf, sizeof buf);
    assert_string_equal(buf, "thrust 8.90 N over 0.279 m², wake 2.24 m/s, fall 2.13 m/s, "
                             "leans 74°, height 3.35 m.");
    /* a small length: mm, or inches (1 in = 25.4 mm exactly, NIST SP 811 B.8) */
    plumb_zone_add_warning(z, "within " PLUMBP_Q_SMALL ".", 0.0254e-3);
    plumb_report_warning(z->warnings[1], PLUMB_UNITS_SI, buf, sizeof buf);
    assert_string_equal(buf, "within 0.0254 mm.");
    plumb_report_warning(z->warnings[1], PLUMB_UNITS_US, buf, sizeof buf);
    assert_string_equal(buf, "within 0.001 in.");
    plumb_report_warning(z->warnings[0], PLUMB_UNITS_SI, buf, sizeof buf);
    /* a short buffer gets what fits, and the length of the whole */
    char small[8];
    assert_int_equal(plumb_report_warning(z->warnings[0], PLUMB_UNITS_SI, small, sizeof small),
                     strlen(buf));
    assert_string_equal(small, "thrust ");
    /* a figure that is not finite is never printed as NaN */
    plumb_zone_add_warning(z, "wake " PLUMBP_Q_AIR ".", NAN);
    plumb_report_warning(z->warnings[2], PLUMB_UNITS_US, buf, sizeof buf);
    assert_null(strstr(buf, "nan"));
    assert_non_null(strstr(buf, "?"));
    /* a cut never parts a mark: the sentence ends before it, with the note */
    char pad[PLUMB_ZONE_WARNING];
    size_t room = PLUMB_ZONE_WARNING - strlen(PLUMBP_WARNING_CUT) - 1;
    memset(pad, 'x', room - 4);
    pad[room - 4] = '\0';
    char tail[200];
    memset(tail, 'y', sizeof tail - 1);
    tail[sizeof tail - 1] = '\0';
    plumb_zone_add_warning(z, "%s " PLUMBP_Q_FORCE " %s", pad, 4.4482216152605, tail);
    const char *w = z->warnings[3];
    assert_null(strchr(w, PLUMBP_QTY_OPEN));
    assert_int_equal(strncmp(w, pad, strlen(pad)), 0);
    assert_int_equal(strlen(w), strlen(pad) + 1 + strlen(PLUMBP_WARNING_CUT));
    assert_string_equal(w + strlen(w) - strlen(PLUMBP_WARNING_CUT), PLUMBP_WARNING_CUT);
    free(z);
}

/* ---- JSON ---------------------------------------------------------------- */

static void test_json_has_the_fixed_keys_of_plumb_fall(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    plumb_item_report it = judged_spanner(fx, p, 22.913);
    plumb_status st;
    plumb_diag diag;
    char *json = fall_report(p, &it, 1, PLUMB_FORMAT_JSON, PLUMB_UNITS_US, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    json_t *root = json_loads(json, 0, NULL);
    assert_non_null(root);
    json_t *impact = json_object_get(root, "impact");
    static const char *const impact_keys[] = {"time_s", "speed_m_s", "energy_j",
                                              "momentum_kg_m_s", "angle_deg", "drift_m",
                                              "bearing_deg"};
    for (size_t i = 0; i < sizeof impact_keys / sizeof impact_keys[0]; i++)
        assert_true(json_is_number(json_object_get(impact, impact_keys[i])));
    assert_int_equal(json_array_size(json_object_get(impact, "point_m")), 2);
    assert_int_equal(json_array_size(json_object_get(impact, "velocity_m_s")), 3);
    assert_true(json_is_number(json_object_get(root, "terminal_speed_m_s")));
    assert_true(json_is_number(json_object_get(root, "apex_m")));
    json_t *df = json_object_get(root, "drag_free");
    assert_true(json_is_number(json_object_get(df, "speed_m_s")));
    assert_true(json_is_number(json_object_get(df, "energy_j")));
    assert_true(json_is_array(json_object_get(root, "criteria")));
    assert_true(json_is_array(json_object_get(root, "warnings")));
    assert_true(json_is_object(json_object_get(root, "solver")));
    assert_true(json_is_object(json_object_get(root, "inputs")));
    assert_null(json_object_get(root, "descent"));
    json_t *prof = json_object_get(root, "profile");
    assert_string_equal(json_string_value(json_object_get(prof, "sha256")),
                        plumb_profile_sha256(p));
    /* JSON is SI whatever --units says: the speed is in m/s. */
    assert_rel(json_real_value(json_object_get(impact, "speed_m_s")), 22.913, 1e-15);
    json_decref(root);
    free(json);
    plumb_profile_free(p);
}

static void test_json_numbers_read_back_to_the_same_double(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    /* Values whose shortest decimal forms need all 17 digits. */
    plumb_item_report it = judged_spanner(fx, p, 22.913000000000004);
    it.result.time_s = 2.6381000000000001 + 2.220446049250313e-16;
    plumb_status st;
    plumb_diag diag;
    char *json = fall_report(p, &it, 1, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    json_t *root = json_loads(json, 0, NULL);
    json_t *impact = json_object_get(root, "impact");
    assert_true(json_real_value(json_object_get(impact, "speed_m_s")) == it.result.speed_m_s);
    assert_true(json_real_value(json_object_get(impact, "time_s")) == it.result.time_s);
    assert_true(json_real_value(json_object_get(impact, "energy_j")) == it.result.energy_j);
    json_decref(root);
    free(json);
    plumb_profile_free(p);
}

static void test_air_json_rows_carry_the_1976_sea_level_values(void **state)
{
    (void)state;
    /* U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), Table I, 0 m (transcribed). */
    plumb_air row = {0.0, 288.15, 101325.0, 1.2250, 1.7894e-5, 340.294};
    char *buf = NULL;
    size_t len = 0;
    FILE *out = open_memstream(&buf, &len);
    plumb_report_options opt = {PLUMB_FORMAT_JSON, PLUMB_UNITS_US, NULL};
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_report_air(out, &opt, &row, 1, &diag), PLUMB_OK);
    fclose(out);
    json_t *root = json_loads(buf, 0, NULL);
    assert_non_null(root);
    json_t *r0 = json_array_get(json_object_get(root, "rows"), 0);
    assert_true(json_real_value(json_object_get(r0, "temperature_k")) == 288.15);
    assert_true(json_real_value(json_object_get(r0, "pressure_pa")) == 101325.0);
    assert_true(json_real_value(json_object_get(r0, "density_kg_m3")) == 1.2250);
    assert_true(json_real_value(json_object_get(r0, "viscosity_pa_s")) == 1.7894e-5);
    assert_true(json_is_number(json_object_get(r0, "altitude_m")));
    assert_true(json_is_number(json_object_get(r0, "speed_of_sound_m_s")));
    json_decref(root);
    free(buf);
}

/* The air table with a temperature offset states it in every format, and
 * its JSON names the program version like every other report. The row is
 * the 1976 sea-level air 10 K warmer: T = 288.15 + 10 = 298.15 K (U.S.
 * Standard Atmosphere 1976, T0 = 288.15 K, transcribed); 10 K is 18 degF
 * as a difference (NIST SP 811 (2008) B.9: 1 K = 1.8 degF). */
static void test_air_table_states_its_temperature_offset_in_every_format(void **state)
{
    (void)state;
    plumb_air row;
    assert_int_equal(plumb_std1976(0.0, 10.0, &row), PLUMB_OK);
    assert_rel(row.t_k, 298.15, 1e-12);
    plumb_air_table t = {&row, 1, 10.0};
    static const char *const want[3] = {"temperature offset +10 K",
                                        "\"temperature_offset_k\": 10.0",
                                        "# model: U.S. Standard Atmosphere 1976, temperature "
                                        "offset +10 K"};
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        char *buf = NULL;
        size_t len = 0;
        FILE *out = open_memstream(&buf, &len);
        plumb_report_options opt = {(plumb_format)f, PLUMB_UNITS_SI, "9.9.9"};
        plumb_diag diag;
        plumb_diag_clear(&diag);
        assert_int_equal(plumb_report_air_table(out, &opt, &t, &diag), PLUMB_OK);
        fclose(out);
        if (!strstr(buf, want[f]))
            fail_msg("air report (format %d) lacks '%s':\n%s", f, want[f], buf);
        if (f == PLUMB_FORMAT_JSON) {
            json_t *root = json_loads(buf, 0, NULL);
            assert_non_null(root);
            assert_string_equal(json_string_value(json_object_get(root, "plumb_version")), "9.9.9");
            assert_true(json_real_value(json_object_get(root, "temperature_offset_k")) == 10.0);
            json_decref(root);
        }
        free(buf);
    }
    /* US text: the offset as a difference in degF, kelvin in the SI brackets */
    char *buf = NULL;
    size_t len = 0;
    FILE *out = open_memstream(&buf, &len);
    plumb_report_options opt = {PLUMB_FORMAT_TEXT, PLUMB_UNITS_US, NULL};
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_report_air_table(out, &opt, &t, &diag), PLUMB_OK);
    fclose(out);
    assert_non_null(strstr(buf, "temperature offset +18 °F [10 K]"));
    free(buf);
    /* a table with no offset says so */
    buf = NULL;
    out = open_memstream(&buf, &len);
    opt.units = PLUMB_UNITS_SI;
    assert_int_equal(plumb_report_air(out, &opt, &row, 1, &diag), PLUMB_OK);
    fclose(out);
    assert_non_null(strstr(buf, "no temperature offset"));
    free(buf);
    /* a non-finite offset is refused */
    t.temperature_offset_k = NAN;
    buf = NULL;
    out = open_memstream(&buf, &len);
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_report_air_table(out, &opt, &t, &diag), PLUMB_ENUMERIC);
    fclose(out);
    assert_int_equal(len, 0);
    free(buf);
}

/* ---- CSV ----------------------------------------------------------------- */

static void test_csv_quotes_a_name_with_a_comma_as_rfc_4180_says(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    plumb_fall_spec named = *plumb_profile_item(p, 0);
    snprintf(named.name, sizeof named.name, "Spanner, \"3/8\" drive");
    plumb_item_report it = judged_spanner(fx, p, 22.913);
    it.spec = &named;
    plumb_status st;
    plumb_diag diag;
    char *csv = fall_report(p, &it, 1, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(strstr(csv, "\n1,\"Spanner, \"\"3/8\"\" drive\",2.385,"));
    free(csv);
    plumb_profile_free(p);
}

static void test_us_units_csv_names_columns_in_feet_and_pounds(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "spanner.yaml", spanner_yaml);
    plumb_item_report it = judged_spanner(fx, p, 22.913);
    plumb_status st;
    plumb_diag diag;
    char *csv = fall_report(p, &it, 1, PLUMB_FORMAT_CSV, PLUMB_UNITS_US, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    const char *h =
        strstr(csv, "\nitem_number,name,mass_lb,time_s,speed_ft_s,speed_mph,energy_ft_lbf,energy_j,");
    assert_non_null(h);
    assert_non_null(strstr(h, ",us-part107-cat3_ratio,us-part107-cat3_verdict,"));
    const char *row = strchr(h + 1, '\n');
    assert_non_null(row);
    /* mass 2.385 kg / 0.45359237 kg/lb; speed 22.913 m/s / 0.3048 m/ft. */
    /* The name "Test spanner, 3/8 in" is quoted (RFC 4180); the numbers follow it. */
    const char *after = strstr(row, "\",");
    assert_non_null(after);
    double mass_lb, time_s, speed_ft_s;
    assert_int_equal(sscanf(after + 2, "%lf,%lf,%lf", &mass_lb, &time_s, &speed_ft_s), 3);
    assert_rel(mass_lb, 2.385 / 0.45359237, 1e-9);
    assert_rel(speed_ft_s, 22.913 / 0.3048, 1e-9);
    free(csv);
    plumb_profile_free(p);
}

/* ---- inventory ------------------------------------------------------------ */

static void test_inventory_names_the_worst_item_and_the_largest_drift(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(
        fx, "kit.yaml",
        "name: Tower kit\n"
        "items:\n"
        "  - {name: Radio, mass: 0.412 kg, drag: {cd_area: 0.0063 m^2}}\n"
        "  - {name: Torque wrench, mass: 2.385 kg, drag: {cd_area: 0.0174 m^2}}\n"
        "  - {name: Tag line, mass: 0.916 kg, drag: {cd_area: 0.0412 m^2}}\n"
        "release: {height: 41.3 m}\n"
        "criteria: [us-part107-cat3]\n");
    assert_int_equal(plumb_profile_item_count(p), 3);
    plumb_item_report items[3];
    double speed[3] = {21.37, 26.05, 17.82}, drift[3] = {1.93, 0.41, 6.77};
    for (size_t i = 0; i < 3; i++) {
        memset(&items[i], 0, sizeof items[i]);
        items[i].spec = plumb_profile_item(p, i);
        double m = items[i].spec->mass_kg;
        plumb_fall_result *r = &items[i].result;
        r->speed_m_s = speed[i];
        r->energy_j = 0.5 * m * speed[i] * speed[i];
        r->momentum_kg_m_s = m * speed[i];
        r->drift_m = drift[i];
        r->bearing_deg = 81.0;
        r->time_s = 3.1;
        r->angle_deg = 78.0;
        r->solver.method = "rk8pd";
        plumb_diag diag;
        plumb_diag_clear(&diag);
        assert_int_equal(plumb_item_judge(&items[i], p, fx->crit, NULL, &diag), PLUMB_OK);
    }
    plumb_status st;
    plumb_diag diag;
    char *json = fall_report(p, items, 3, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    json_t *root = json_loads(json, 0, NULL);
    assert_non_null(root);
    /* 0.5 x 2.385 x 26.05^2 = 809.2 J, the highest ratio to 33.895 J. */
    assert_string_equal(json_string_value(json_object_get(root, "worst")), "Torque wrench");
    assert_string_equal(json_string_value(json_object_get(root, "largest_drift")), "Tag line");
    assert_int_equal(json_array_size(json_object_get(root, "items")), 3);
    json_t *item1 = json_array_get(json_object_get(root, "items"), 1);
    assert_string_equal(json_string_value(json_object_get(item1, "name")), "Torque wrench");
    assert_int_equal(json_integer_value(json_object_get(item1, "item_number")), 2);
    assert_true(json_is_object(json_object_get(item1, "impact")));
    assert_true(json_is_array(json_object_get(root, "cautions")));
    json_decref(root);
    free(json);

    char *text = fall_report(p, items, 3, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(strstr(text, "Worst item     Torque wrench: "));
    assert_non_null(strstr(text, "Largest drift  Tag line: 6.770 m"));
    free(text);

    char *csv = fall_report(p, items, 3, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI, &st, &diag);
    assert_int_equal(st, PLUMB_OK);
    /* each row starts with the item's number as items[N] counts it */
    assert_non_null(strstr(csv, "\n1,Radio,0.412,"));
    assert_non_null(strstr(csv, "\n2,Torque wrench,2.385,"));
    assert_non_null(strstr(csv, "\n3,Tag line,0.916,"));
    free(csv);
    plumb_profile_free(p);
}

/* The glide a plate may add to its drift is a distance to keep clear: it
 * is rounded up at its last digit shown, never to nearest. Smith 1970:
 * a tumbling plate glides up to 1.375 x the height fallen (the ratio of
 * plumb_glide_ratio_max, plumb/glide.h); from 150 ft that is 206.25 ft
 * exactly (1.375 x 150, a closed form), shown to 4 figures as 206.3 ft,
 * not 206.2 ft; 150 ft = 45.72 m and 1.375 x 45.72 = 62.865 m, shown as
 * 62.87 m (1 ft = 0.3048 m, 1959 agreement). */
static void test_a_plates_glide_distance_is_rounded_up(void **state)
{
    fixture *fx = *state;
    plumb_profile *p = load_profile(fx, "plate.yaml",
                                    "name: Test kit\n"
                                    "items:\n"
                                    "  - {name: Radio, mass: 0.412 kg, drag: {cd_area: 0.0063 m^2}}\n"
                                    "  - {name: Plate, mass: 0.0613 kg, drag: {cd_area: 0.0213 m^2},"
                                    " glide: tumble}\n"
                                    "release: {height: 150 ft}\n"
                                    "criteria: [us-part107-cat3]\n");
    assert_rel(plumb_glide_ratio_max(PLUMB_GLIDE_TUMBLE), 1.375, 1e-15); /* Smith 1970 */
    plumb_item_report it[2];
    plumb_diag diag;
    for (size_t i = 0; i < 2; i++) {
        hand_built(&it[i], p, 9.73 + 3.1 * (double)i);
        it[i].spec = plumb_profile_item(p, i);
        it[i].shape = plumb_profile_item_shape(p, i);
        it[i].result.drift_m = 3.917;
        plumb_diag_clear(&diag);
        assert_int_equal(plumb_item_judge(&it[i], p, fx->crit, NULL, &diag), PLUMB_OK);
    }
    plumb_status st;
    const char *want[2] = {"which may carry it up to 62.87 m sideways",
                           "which may carry it up to 206.3 ft sideways"};
    for (int u = 0; u < 2; u++) {
        char *text = fall_report(p, it, 2, PLUMB_FORMAT_TEXT,
                                 u ? PLUMB_UNITS_US : PLUMB_UNITS_SI, &st, &diag);
        assert_int_equal(st, PLUMB_OK);
        char *flat = squeeze(text);
        if (!strstr(flat, want[u]))
            fail_msg("no \"%s\" in:\n%s", want[u], text);
        free(flat);
        free(text);
    }
    plumb_profile_free(p);
}

/* plumb verify's report: a check that fails is said to, in text and JSON,
 * beside the count; one whose figure is not finite is refused (the JSON
 * could not hold it). The figures here are invented for the writer. */
static void test_a_failed_verify_check_is_reported_as_failed(void **state)
{
    (void)state;
    plumb_check c[2];
    memset(c, 0, sizeof c);
    snprintf(c[0].name, sizeof c[0].name, "a check that holds");
    snprintf(c[0].source, sizeof c[0].source, "a source");
    c[0].status = "transcribed";
    c[0].unit = "m/s";
    c[0].published = 1.0;
    c[0].computed = 1.0;
    c[0].tolerance = 1e-3;
    c[0].passed = 1;
    c[1] = c[0];
    snprintf(c[1].name, sizeof c[1].name, "a check that fails");
    c[1].computed = 1.5;
    c[1].passed = 0;
    for (int f = 0; f < 2; f++) {
        char *buf = NULL;
        size_t len = 0;
        FILE *out = open_memstream(&buf, &len);
        plumb_report_options opt = {f ? PLUMB_FORMAT_JSON : PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI,
                                    NULL};
        plumb_diag diag;
        plumb_diag_clear(&diag);
        assert_int_equal(plumb_report_verify(out, &opt, c, 2, &diag), PLUMB_OK);
        fclose(out);
        if (f) {
            assert_non_null(strstr(buf, "\"failed\": 1"));
            assert_non_null(strstr(buf, "\"passed\": false"));
        } else {
            assert_non_null(strstr(buf, "FAILED a check that fails"));
            assert_non_null(strstr(buf, "verify: 1 passed, 1 failed"));
            assert_non_null(strstr(buf, "Cautions"));
        }
        free(buf);
    }
    c[1].computed = NAN;
    char *buf = NULL;
    size_t len = 0;
    FILE *out = open_memstream(&buf, &len);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_report_verify(out, NULL, c, 2, &diag), PLUMB_ENUMERIC);
    fclose(out);
    assert_int_equal(len, 0);
    free(buf);
}

/* ---- plumb lint's report ------------------------------------------------ */

static plumb_diag range_error(const char *key, const char *message)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    d.status = PLUMB_ERANGE;
    snprintf(d.file, sizeof d.file, "a.yaml");
    d.line = 8;
    d.col = 62;
    snprintf(d.key, sizeof d.key, "%s", key);
    snprintf(d.message, sizeof d.message, "%s", message);
    return d;
}

/* In US units a value outside its key's range gets the range again in US
 * units: 150 K .. 400 K is -189.67 degF .. 260.33 degF (t/degF = 1.8 T/K -
 * 459.67, NIST SP 811, 2008, B.8), the sea-level speed of sound 340.294
 * m/s (U.S. Standard Atmosphere 1976, Table I, transcribed) is 1116.450 ft/s
 * by the international foot 0.3048 m, shown rounded down to 1116.45; > 0 kg
 * is > 0 lb, and 1e8 kg, a mass's bound, 220462262.2 lb (NIST SP 811,
 * 2008, B.8: 1 lb = 0.45359237 kg exactly), shown rounded down to 6
 * figures. Another message of the key, an angle and SI get nothing. */
static void test_a_range_error_gets_its_limits_in_us_units(void **state)
{
    (void)state;
    char buf[PLUMB_DIAG_MSG + 200];
    plumb_diag t = range_error("atmosphere.temperature",
                               "must be 150 K .. 400 K (-123.15 degC .. 126.85 degC: air on Earth; was "
                               "the unit meant degC or degF?), found '20 K'");
    size_t n = plumb_report_diag_message(&t, PLUMB_UNITS_US, buf, sizeof buf);
    assert_int_equal(n, strlen(buf));
    assert_non_null(strstr(buf, "found '20 K' [US: -189.67 \u00b0F .. 260.33 \u00b0F]"));
    plumb_report_diag_message(&t, PLUMB_UNITS_SI, buf, sizeof buf);
    assert_string_equal(buf, t.message);
    plumb_diag v = range_error("release.velocity.speed",
                               "must be 0 m/s .. 340.294 m/s (below the speed of sound at sea "
                               "level: the drag model is for subsonic air speeds), found '1e6 m/s'");
    plumb_report_diag_message(&v, PLUMB_UNITS_US, buf, sizeof buf);
    assert_non_null(strstr(buf, "[US: 0 ft/s .. 1116.45 ft/s]"));
    plumb_diag m = range_error("items[3].mass", "must be > 0 kg and <= 1e+08 kg (100000 t: five times the heaviest single lift yet made), found '-0.68 kg'");
    plumb_report_diag_message(&m, PLUMB_UNITS_US, buf, sizeof buf);
    assert_string_equal(buf, "must be > 0 kg and <= 1e+08 kg (100000 t: five times the heaviest single lift yet made), found '-0.68 kg' [US: > 0 lb and <= 2.20462e+08 lb]");
    plumb_diag other = range_error("descent.deploy.below",
                                   "must be below the release height 27.4 m, found '40 m'");
    plumb_report_diag_message(&other, PLUMB_UNITS_US, buf, sizeof buf);
    assert_string_equal(buf, other.message);
    plumb_diag angle = range_error("site.latitude", "must be -90 deg .. 90 deg, found '95 deg'");
    plumb_report_diag_message(&angle, PLUMB_UNITS_US, buf, sizeof buf);
    assert_string_equal(buf, angle.message);
    assert_int_equal(plumb_report_diag_message(NULL, PLUMB_UNITS_US, NULL, 0), 0);
}

/* The lint report: JSON gives each error's parts apart (null for a line
 * not known) and the cautions; CSV a row per error and per good profile
 * after the cautions; an entry without its name is refused, nothing
 * written. */
static void test_a_lint_report_gives_each_errors_parts_apart(void **state)
{
    (void)state;
    plumb_diag e[2] = {range_error("payload.mass", "must be > 0 kg and <= 1e+08 kg (100000 t: five times the heaviest single lift yet made), found '-2 kg'"),
                       range_error("release.height", "a made-up message")};
    e[1].line = e[1].col = 0;
    plumb_lint_entry ent[2] = {{"good.yaml", NULL, 0, 1}, {"a.yaml", e, 2, 0}};
    const char *want[3] = {"\"line\": null", "# a.yaml: the first 2 errors are listed",
                           "good.yaml: ok\n"};
    for (int f = 0; f < 3; f++) {
        char *buf = NULL;
        size_t len = 0;
        FILE *out = open_memstream(&buf, &len);
        plumb_report_options opt = {f == 0 ? PLUMB_FORMAT_JSON
                                    : f == 1 ? PLUMB_FORMAT_CSV : PLUMB_FORMAT_TEXT,
                                    PLUMB_UNITS_US, "9.9.9"};
        plumb_diag diag;
        plumb_diag_clear(&diag);
        assert_int_equal(plumb_report_lint(out, &opt, ent, 2, &diag), PLUMB_OK);
        fclose(out);
        assert_non_null(strstr(buf, want[f]));
        if (f == 0) {
            assert_non_null(strstr(buf, "\"column\": 62"));
            assert_non_null(strstr(buf, "\"message\": \"must be > 0 kg and <= 1e+08 kg (100000 t: five times the heaviest single lift yet made), found '-2 kg'\""));
            assert_non_null(strstr(buf, "\"failed\": 1"));
            assert_non_null(strstr(buf, "\"cautions\""));
        } else if (f == 1) {
            assert_non_null(strstr(buf, "good.yaml,true,,,,,\n"));
            assert_non_null(strstr(buf, "a.yaml,false,a.yaml,8,62,payload.mass,\"must be > 0 kg and <= 1e+08 kg (100000 t: five times the heaviest single lift yet made), "
                                        "found '-2 kg' [US: > 0 lb and <= 2.20462e+08 lb]\"\n"));
            assert_non_null(strstr(buf, "a.yaml,false,a.yaml,,,release.height,"));
        } else {
            assert_null(strstr(buf, "a.yaml"));
        }
        free(buf);
    }
    ent[0].profile = NULL;
    char *buf = NULL;
    size_t len = 0;
    FILE *out = open_memstream(&buf, &len);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_report_lint(out, NULL, ent, 2, &diag), PLUMB_EINVAL);
    fclose(out);
    assert_int_equal(len, 0);
    free(buf);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_cautions_make_every_point_of_safety_md_section_1),
        cmocka_unit_test(test_cautions_appear_in_text_json_and_csv_fall_reports),
        cmocka_unit_test(test_cautions_appear_in_air_reports_of_every_format),
        cmocka_unit_test(test_a_failed_verify_check_is_reported_as_failed),
        cmocka_unit_test(test_a_range_error_gets_its_limits_in_us_units),
        cmocka_unit_test(test_a_lint_report_gives_each_errors_parts_apart),
        cmocka_unit_test(test_non_finite_impact_speed_is_refused_with_nothing_written),
        cmocka_unit_test(test_infinite_energy_ratio_is_refused_with_nothing_written),
        cmocka_unit_test(test_non_finite_air_density_is_refused_with_nothing_written),
        cmocka_unit_test(test_part107_verdicts_use_33_895_and_14_914_joules),
        cmocka_unit_test(test_a_ratio_printed_as_one_shows_its_verdict_beside_it),
        cmocka_unit_test(test_energy_is_shown_in_joules_and_foot_pounds_in_both_unit_systems),
        cmocka_unit_test(test_unknown_named_criterion_is_a_key_error_with_did_you_mean),
        cmocka_unit_test(test_unknown_criterion_from_set_names_set_and_the_nearest_id),
        cmocka_unit_test(test_profile_naming_no_criteria_is_judged_against_all),
        cmocka_unit_test(test_mach_above_one_half_gives_a_warning),
        cmocka_unit_test(test_reynolds_number_beyond_morrison_range_gives_a_warning),
        cmocka_unit_test(test_helmet_test_criterion_is_labelled_not_a_safe_limit),
        cmocka_unit_test(test_json_has_the_fixed_keys_of_plumb_fall),
        cmocka_unit_test(test_json_numbers_read_back_to_the_same_double),
        cmocka_unit_test(test_air_json_rows_carry_the_1976_sea_level_values),
        cmocka_unit_test(test_air_table_states_its_temperature_offset_in_every_format),
        cmocka_unit_test(test_csv_quotes_a_name_with_a_comma_as_rfc_4180_says),
        cmocka_unit_test(test_us_units_csv_names_columns_in_feet_and_pounds),
        cmocka_unit_test(test_inventory_names_the_worst_item_and_the_largest_drift),
        cmocka_unit_test(test_a_plates_glide_distance_is_rounded_up),
        cmocka_unit_test(test_the_longest_warnings_of_a_fall_are_whole_in_the_fall_and_its_zone),
        cmocka_unit_test(test_helmet_tests_too_many_to_name_are_counted_not_cut),
        cmocka_unit_test(test_a_warning_that_does_not_fit_says_so),
        cmocka_unit_test(test_a_warnings_figures_are_shown_in_the_units_asked_for),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
