/*
 * test_report_zone.c - the zone report (plumb_report_zone, written by
 * src/report_zone.c; include/plumb/dispersion.h): the cautions in every
 * format, never a NaN or an infinity, a non-finite figure refused with
 * nothing written, figures that read back, US units, the inventory's
 * worst item, and the refusals of an empty or inconsistent report.
 *
 * The zone is a real run (drag-free, 500 samples, with a target and two
 * criteria, one input a truncated normal) made once for the file; the tests
 * check what the writer does with its figures, not the statistics (those
 * are test_dispersion.c's).
 *
 * Sources of the checked values:
 *   - SAFETY.md section 1 / report.h: the cautions (plumb_cautions) in every
 *     report, text and CSV as closing or "# " lines, JSON as "cautions";
 *     reports never contain NaN or infinity; a non-finite figure makes the
 *     writer fail with PLUMB_ENUMERIC before anything is written.
 *   - IEEE 754-2008, 5.12.2: 17 significant digits read back to the same
 *     binary64 value (the JSON writer's precision).
 *   - 1 ft = 0.3048 m and 1 ft lbf = 0.3048 x 0.45359237 x 9.80665 J,
 *     exactly (1959 international yard and pound agreement; CGPM 1901).
 *   - RFC 4180, section 2: a field holding a comma is quoted.
 *   - README "plumb zone": JSON "worst" names the item with the largest
 *     clearance radius; an interval end that N samples cannot bound is
 *     "open" (JSON null).
 *   - 14 CFR 107.130(a)(1): 25 ft lbf (seen); EN 397:2012+A1:2012
 *     Industrial safety helmets, shock absorption test: 49 J (from memory,
 *     not confirmed in the standard; a helmet test, not a safe limit).
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
#include <unistd.h>
#include <cmocka.h>
#include <jansson.h>

#include "plumb/plumb.h"
#include "plumb/dispersion.h"
#include "plumb_test.h"

/* 1 ft, m, and 1 ft lbf, J, by definition (1959 agreement, CGPM 1901). */
#define FT_M 0.3048
#define FT_LBF_J (0.3048 * 0.45359237 * 9.80665)

static plumb_criterion crit[2];
static plumb_zone_result base;

static plumb_uncertainty unc(const char *key, plumb_dist_kind kind, double a, double b)
{
    plumb_uncertainty u;
    memset(&u, 0, sizeof u);
    snprintf(u.key, sizeof u.key, "%s", key);
    u.kind = kind;
    u.param[0] = a;
    u.param[1] = b;
    u.line = 11;
    u.col = 3;
    return u;
}

static int group_setup(void **state)
{
    plumbt_setup_gsl(state);
    /* 14 CFR 107.130(a)(1): 25 ft lbf */
    snprintf(crit[0].id, sizeof crit[0].id, "us-part107-cat3");
    snprintf(crit[0].name, sizeof crit[0].name, "US operations over people, category 3");
    snprintf(crit[0].source, sizeof crit[0].source, "14 CFR 107.130(a)(1)");
    crit[0].kind = PLUMB_CRIT_LIMIT;
    crit[0].energy_limit_j = 25.0 * FT_LBF_J;
    /* EN 397 shock absorption test, 49 J: a helmet test */
    snprintf(crit[1].id, sizeof crit[1].id, "en397-shock-49j");
    snprintf(crit[1].name, sizeof crit[1].name, "EN 397 helmet shock absorption test");
    snprintf(crit[1].source, sizeof crit[1].source, "EN 397, shock absorption test");
    crit[1].kind = PLUMB_CRIT_HELMET_TEST;
    crit[1].energy_limit_j = 49.0;

    /* a drag-free 2.385 kg bag released at 23.7 m */
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    snprintf(s.name, sizeof s.name, "marker bag");
    s.mass_kg = 2.385;
    s.drag.model = PLUMB_DRAG_FIXED;
    s.drag.area_m2 = 0.0187;
    s.release_m[2] = 23.7;
    s.velocity_m_s[0] = 4.3;
    plumb_wind_spec_init(&s.wind);
    plumb_uncertainty u[3] = {
        unc("release.velocity.east", PLUMB_DIST_NORMAL, 4.3, 1.3),
        unc("release.velocity.north", PLUMB_DIST_UNIFORM, -0.7, 0.9),
        unc("payload.mass", PLUMB_DIST_NORMAL, 2.385, 0.9), /* truncated at 0 kg */
    };
    plumb_zone_spec z;
    memset(&z, 0, sizeof z);
    z.samples = 500; /* too few to bound the 99.9 % radius above: an open end */
    z.seed = 20240917;
    z.confidence = 0.9;
    z.scatter_m = 1.7;
    z.has_target = 1;
    z.target_m[0] = 12.5;
    z.target_m[1] = -4.3;
    plumb_atmosphere *atm = plumbt_std_air(0.0);
    const plumb_criterion *cl[2] = {&crit[0], &crit[1]};
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.threads = 1;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_zone_run(&s, atm, u, 3, &z, cl, 2, &o, &base, &d);
    plumb_atmosphere_free(atm);
    if (st != PLUMB_OK) {
        fprintf(stderr, "zone: %s: %s\n", d.key, d.message);
        return -1;
    }
    return 0;
}

static int group_teardown(void **state)
{
    (void)state;
    return 0;
}

static const char sha[] = "0123456789abcdef0123456789abcdef0123456789abcdef0123456789abcdef";

/* A one-item report of r. */
static plumb_zone_report single(const plumb_zone_item *item)
{
    plumb_zone_report rep;
    memset(&rep, 0, sizeof rep);
    rep.profile_name = "Test drop, field 7";
    rep.profile_path = "tests/t.yaml";
    rep.profile_sha256 = sha;
    rep.inventory = 0;
    rep.n_items = 1;
    rep.items = item;
    rep.threads = 3;
    return rep;
}

/* Writes rep in a format into a string (caller frees); *st its status. */
static char *report(const plumb_zone_report *rep, plumb_format f, plumb_unit_system u,
                    plumb_status *st, plumb_diag *d, size_t *len)
{
    char *buf = NULL;
    size_t n = 0;
    FILE *out = open_memstream(&buf, &n);
    assert_non_null(out);
    plumb_report_options opt = {f, u, "9.9.9"};
    plumb_diag_clear(d);
    *st = plumb_report_zone(out, &opt, rep, d);
    assert_int_equal(fclose(out), 0);
    if (len)
        *len = n;
    return buf;
}

static char *good(const plumb_zone_report *rep, plumb_format f, plumb_unit_system u)
{
    plumb_status st;
    plumb_diag d;
    char *buf = report(rep, f, u, &st, &d, NULL);
    if (st != PLUMB_OK)
        fprintf(stderr, "zone report: %s\n", d.message);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(buf);
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
        if (*p == ' ' || *p == '\n') {
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

static void assert_cautions_in(const char *out, plumb_format f)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    assert_true(n >= 4);
    if (f == PLUMB_FORMAT_JSON) {
        json_t *root = json_loads(out, 0, NULL);
        assert_non_null(root);
        json_t *a = json_object_get(root, "cautions");
        assert_int_equal(json_array_size(a), n);
        for (size_t i = 0; i < n; i++)
            assert_string_equal(json_string_value(json_array_get(a, i)), c[i]);
        json_decref(root);
    } else if (f == PLUMB_FORMAT_CSV) {
        const char *header = strstr(out, "\nitem_number,item,quantity,value,ci_low,ci_high,unit\n");
        assert_non_null(header);
        for (size_t i = 0; i < n; i++) {
            char line[512];
            snprintf(line, sizeof line, "# %s\n", c[i]);
            const char *at = strstr(out, line);
            if (!at || at > header)
                fail_msg("CSV lacks caution before the header: %s", c[i]);
        }
    } else {
        char *flat = squeeze(out);
        for (size_t i = 0; i < n; i++) {
            char *want = squeeze(c[i]);
            if (!strstr(flat, want))
                fail_msg("text lacks caution: %s", c[i]);
            free(want);
        }
        free(flat);
    }
}

/* ---- cautions ------------------------------------------------------------------ */

static void test_every_format_and_unit_system_carries_the_cautions(void **state)
{
    (void)state;
    plumb_zone_item item = {"marker bag", &base, 0};
    plumb_zone_report rep = single(&item);
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        for (int u = PLUMB_UNITS_SI; u <= PLUMB_UNITS_US; u++) {
            char *out = good(&rep, (plumb_format)f, (plumb_unit_system)u);
            assert_cautions_in(out, (plumb_format)f);
            free(out);
        }
    }
    /* an inventory too */
    plumb_zone_item items[2] = {{"marker bag", &base, 0}, {"tag line", &base, 0}};
    rep.inventory = 1;
    rep.n_items = 2;
    rep.items = items;
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        char *out = good(&rep, (plumb_format)f, PLUMB_UNITS_SI);
        assert_cautions_in(out, (plumb_format)f);
        free(out);
    }
}

static void test_a_helmet_test_criterion_is_called_not_a_safe_limit(void **state)
{
    (void)state;
    plumb_zone_item item = {"marker bag", &base, 0};
    plumb_zone_report rep = single(&item);
    char *out = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    char *flat = squeeze(out);
    assert_non_null(strstr(flat, "[en397-shock-49j]; source: EN 397, shock absorption test "
                                 "(the energy a helmet is tested to, not a safe limit)"));
    assert_null(strstr(flat, "[us-part107-cat3]; source: 14 CFR 107.130(a)(1) (the energy"));
    free(flat);
    free(out);
}

/* ---- no NaN, no infinity ---------------------------------------------------------- */

/* 1 when text has the word nan, inf or infinity in any case. */
static int has_non_finite_word(const char *text)
{
    const char *p = text;
    while (*p) {
        while (*p && !((*p >= 'a' && *p <= 'z') || (*p >= 'A' && *p <= 'Z')))
            p++;
        const char *s = p;
        while ((*p >= 'a' && *p <= 'z') || (*p >= 'A' && *p <= 'Z'))
            p++;
        size_t n = (size_t)(p - s);
        char w[16];
        if (n > 0 && n < sizeof w) {
            for (size_t i = 0; i < n; i++)
                w[i] = (char)(s[i] | 0x20);
            w[n] = '\0';
            if (!strcmp(w, "nan") || !strcmp(w, "inf") || !strcmp(w, "infinity"))
                return 1;
        }
    }
    return 0;
}

static void test_no_format_prints_nan_or_infinity_for_open_ends_and_half_ranges(void **state)
{
    (void)state;
    /* the run has what could print as inf: a 99.9 % radius with no upper
     * bound at 500 samples, and a normal truncated at 0 kg only */
    assert_true(base.zone.radius[3].hi_open);
    assert_int_equal(base.n_inputs, 3);
    assert_true(base.inputs[2].truncated);
    assert_true(isinf(base.inputs[2].upper));
    assert_true(has_non_finite_word("x = NaN") && has_non_finite_word("-inf m"));
    assert_false(has_non_finite_word("information, infinite, nano"));
    plumb_zone_item item = {"marker bag", &base, 0};
    plumb_zone_report rep = single(&item);
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        for (int u = PLUMB_UNITS_SI; u <= PLUMB_UNITS_US; u++) {
            char *out = good(&rep, (plumb_format)f, (plumb_unit_system)u);
            if (has_non_finite_word(out))
                fail_msg("format %d units %d prints NaN or infinity:\n%s", f, u, out);
            free(out);
        }
    }
    /* JSON: open ends and the missing bound are null */
    char *out = good(&rep, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI);
    json_t *root = json_loads(out, 0, NULL);
    assert_non_null(root);
    json_t *zone = json_object_get(root, "zone");
    json_t *ci = json_object_get(json_object_get(zone, "radius_ci_m"), "p999");
    assert_true(json_is_null(json_array_get(ci, 1)));
    json_t *in = json_array_get(json_object_get(zone, "inputs"), 2);
    assert_string_equal(json_string_value(json_object_get(in, "key")), "payload.mass");
    json_t *range = json_object_get(in, "range");
    assert_true(json_is_number(json_array_get(range, 0)));
    assert_true(json_is_null(json_array_get(range, 1)));
    json_decref(root);
    free(out);
}

/* ---- non-finite figures ------------------------------------------------------------ */

/* The k-th figure every format prints, in r; NULL past the last. */
static double *figure(plumb_zone_result *r, int k, const char **name)
{
    plumb_zone_stats *z = &r->zone, *t = &r->at_target;
#define F(expr)        \
    do {               \
        *name = #expr; \
        return &(expr); \
    } while (0)
    switch (k) {
    case 0: F(z->mean_m[0]);
    case 1: F(z->mean_m[1]);
    case 2: F(z->semi_minor_m);
    case 3: F(z->bearing_deg);
    case 4: F(z->radius[0].value);
    case 5: F(z->radius[1].value);
    case 6: F(z->radius[2].value);
    case 7: F(z->radius[3].value);
    case 8: F(z->radius[2].lo);
    case 9: F(z->radius[2].hi);
    case 10: F(z->radius_max_m);
    case 11: F(z->radius_conf.value);
    case 12: F(z->radius_conf.hi);
    case 13: F(z->scatter_m);
    case 14: F(z->clearance_radius_m);
    case 15: F(z->energy[0].value);
    case 16: F(z->energy[2].value);
    case 17: F(z->energy[1].lo);
    case 18: F(z->energy_max_j);
    case 19: F(z->exceedance[0].probability);
    case 20: F(z->exceedance[1].lo);
    case 21: F(z->exceedance[1].hi);
    case 22: F(z->drop_height_m);
    case 23: F(z->ballistic_throw_m);
    case 24: F(z->max_release_speed_m_s);
    case 25: F(z->release_m[0]);
    case 26: F(r->confidence);
    case 27: F(r->ci_level);
    case 28: F(r->target_m[0]);
    case 29: F(t->clearance_radius_m);
    case 30: F(t->displacement[0].value);
    case 31: F(t->mean_m[1]);
    case 32: F(t->radius[1].hi);
    case 33: F(z->semi_major_m); /* text once said "every sample lands on one point" */
    default: return NULL;
    }
#undef F
}

static void test_a_non_finite_figure_fails_every_format_and_writes_nothing(void **state)
{
    (void)state;
    static const double bad_values[3] = {NAN, INFINITY, -INFINITY};
    const char *name = NULL;
    int k;
    for (k = 0; k < 100; k++) {
        plumb_zone_result r = base;
        double *x = figure(&r, k, &name);
        if (!x)
            break;
        *x = bad_values[k % 3];
        plumb_zone_item item = {"marker bag", &r, 0};
        plumb_zone_report rep = single(&item);
        for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
            for (int u = PLUMB_UNITS_SI; u <= PLUMB_UNITS_US; u++) {
                plumb_status st;
                plumb_diag d;
                size_t len = 0;
                char *out = report(&rep, (plumb_format)f, (plumb_unit_system)u, &st, &d, &len);
                if (st != PLUMB_ENUMERIC || len != 0)
                    fail_msg("%s = %g: format %d units %d gave status %d and %zu bytes", name,
                             *x, f, u, (int)st, len);
                assert_int_equal(d.status, PLUMB_ENUMERIC);
                assert_non_null(strstr(d.message, "not a finite number"));
                free(out);
            }
        }
    }
    assert_int_equal(k, 34); /* every figure of the list was tried */
}

static void test_json_refuses_non_finite_figures_only_it_prints(void **state)
{
    (void)state;
    /* the covariance, the centre and the ellipse's chi-square are JSON's own */
    for (int k = 0; k < 3; k++) {
        plumb_zone_result r = base;
        double *x = k == 0 ? &r.zone.cov_m2[2] : k == 1 ? &r.zone.centre_m[1] : &r.zone.ellipse_chi2;
        *x = NAN;
        plumb_zone_item item = {"marker bag", &r, 0};
        plumb_zone_report rep = single(&item);
        plumb_status st;
        plumb_diag d;
        size_t len = 1;
        char *out = report(&rep, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, &st, &d, &len);
        assert_int_equal(st, PLUMB_ENUMERIC);
        assert_int_equal(len, 0);
        free(out);
    }
}

/* ---- figures -------------------------------------------------------------------------- */

static void test_json_figures_read_back_to_the_same_doubles(void **state)
{
    (void)state;
    plumb_zone_item item = {"marker bag", &base, 0};
    plumb_zone_report rep = single(&item);
    char *out = good(&rep, PLUMB_FORMAT_JSON, PLUMB_UNITS_US); /* JSON is SI whatever --units */
    json_t *root = json_loads(out, 0, NULL);
    assert_non_null(root);
    json_t *zone = json_object_get(root, "zone");
    const plumb_zone_stats *z = &base.zone;
    /* IEEE 754-2008 5.12.2: 17 digits give back the same double */
    assert_true(json_real_value(json_object_get(zone, "clearance_radius_m")) ==
                z->clearance_radius_m);
    assert_true(json_real_value(json_object_get(json_object_get(zone, "radius_m"), "p99")) ==
                z->radius[2].value);
    assert_true(json_real_value(json_object_get(json_object_get(zone, "energy_j"), "max")) ==
                z->energy_max_j);
    assert_true(json_real_value(json_object_get(json_object_get(zone, "ellipse95"),
                                                "semi_major_m")) == z->semi_major_m);
    json_t *ex = json_array_get(json_object_get(zone, "exceedance"), 0);
    assert_string_equal(json_string_value(json_object_get(ex, "criterion")), "us-part107-cat3");
    assert_true(json_real_value(json_object_get(ex, "probability")) ==
                z->exceedance[0].probability);
    assert_rel(json_real_value(json_object_get(ex, "energy_limit_j")), 25.0 * FT_LBF_J, 1e-15);
    assert_int_equal(json_integer_value(json_object_get(root, "seed")), 20240917);
    assert_null(json_object_get(root, "threads")); /* nothing depends on the thread count */
    assert_int_equal(json_integer_value(json_object_get(zone, "samples")), 500);
    json_t *prof = json_object_get(root, "profile");
    assert_string_equal(json_string_value(json_object_get(prof, "sha256")), sha);
    json_t *tg = json_object_get(zone, "target");
    assert_true(json_is_object(tg));
    json_t *tp = json_object_get(tg, "target_m");
    assert_true(json_real_value(json_array_get(tp, 0)) == 12.5);
    assert_true(json_real_value(json_array_get(tp, 1)) == -4.3);
    json_decref(root);
    free(out);
}

/* The value column of the CSV row of `quantity` for `item` (after its
 * item_number). */
static double csv_value(const char *csv, const char *item_quantity)
{
    char needle[160];
    snprintf(needle, sizeof needle, ",%s,", item_quantity);
    const char *at = strstr(csv, needle);
    if (!at)
        fail_msg("no CSV row %s", item_quantity);
    char *end = NULL;
    double v = strtod(at + strlen(needle), &end);
    assert_true(end && *end == ',');
    return v;
}

static void test_us_csv_gives_feet_and_foot_pounds_and_quotes_names(void **state)
{
    (void)state;
    plumb_zone_item item = {"marker bag, red", &base, 0};
    plumb_zone_report rep = single(&item);
    char *si = good(&rep, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI);
    char *us = good(&rep, PLUMB_FORMAT_CSV, PLUMB_UNITS_US);
    const plumb_zone_stats *z = &base.zone;
    /* RFC 4180: the name with a comma is quoted; CSV numbers have 10 digits */
    const char *row = "\"marker bag, red\",clearance_radius";
    assert_rel(csv_value(si, row), z->clearance_radius_m, 1e-9);
    assert_rel(csv_value(us, row), z->clearance_radius_m / FT_M, 1e-9); /* 1 ft = 0.3048 m */
    assert_non_null(strstr(us, "\n1,\"marker bag, red\",clearance_radius,"));
    row = "\"marker bag, red\",energy_max";
    assert_rel(csv_value(si, row), z->energy_max_j, 1e-9);
    assert_rel(csv_value(us, row), z->energy_max_j / FT_LBF_J, 1e-9);
    /* the energy unit spelt as the comment lines and the text spell it
     * ("limit 36.14 ft·lbf (49 J)"), not as a column name's ft_lbf */
    assert_non_null(strstr(us, ",energy_max,"));
    assert_non_null(strstr(us, ",ft·lbf\n"));
    assert_null(strstr(us, ",ft_lbf\n"));
    assert_non_null(strstr(si, ",J\n"));
    row = "\"marker bag, red\",target.east";
    assert_rel(csv_value(us, row), 12.5 / FT_M, 1e-9);
    free(si);
    free(us);
}

static void test_inventory_json_names_the_item_with_the_largest_clearance_radius(void **state)
{
    (void)state;
    plumb_zone_result wider = base;
    wider.zone.clearance_radius_m = 1.37 * base.zone.clearance_radius_m;
    plumb_zone_item items[3] = {{"marker bag", &base, 0}, {"tag line", &wider, 0}, {"radio", &base, 0}};
    plumb_zone_report rep = single(items);
    rep.inventory = 1;
    rep.n_items = 3;
    char *out = good(&rep, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI);
    json_t *root = json_loads(out, 0, NULL);
    assert_non_null(root);
    assert_string_equal(json_string_value(json_object_get(root, "worst")), "tag line");
    assert_int_equal(json_array_size(json_object_get(root, "items")), 3);
    assert_null(json_object_get(root, "zone"));
    json_decref(root);
    free(out);
    out = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    assert_non_null(strstr(out, "==== 2 tag line\n")); /* numbered as items[N] is */
    free(out);
}

/* README "Kits": the kit's clearance radius and landing circle and the
 * items that set them, in CSV as in text and JSON: a "# kit:" comment and
 * a row of each in the row of the item that sets it. */
static void test_inventory_csv_gives_the_kit_clearance_and_the_item_that_sets_it(void **state)
{
    (void)state;
    plumb_zone_result wider = base, landing = base;
    wider.zone.clearance_radius_m = 1.37 * base.zone.clearance_radius_m;
    landing.zone.landing_radius.hi_open = 0;
    landing.zone.landing_circle_m = 0.83 * base.zone.clearance_radius_m;
    plumb_zone_item items[3] = {{"marker bag", &base, 0}, {"tag line, orange", &wider, 0},
                                {"radio", &landing, 0}};
    plumb_zone_report rep = single(items);
    rep.inventory = 1;
    rep.n_items = 3;
    rep.kit_item = 1;
    rep.kit_landing_item = 2;
    char *si = good(&rep, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI);
    char *us = good(&rep, PLUMB_FORMAT_CSV, PLUMB_UNITS_US);
    double r = wider.zone.clearance_radius_m, c = landing.zone.landing_circle_m;
    assert_rel(csv_value(si, "\"tag line, orange\",kit_clearance_radius"), r, 1e-9);
    assert_rel(csv_value(us, "\"tag line, orange\",kit_clearance_radius"), r / FT_M, 1e-9);
    assert_rel(csv_value(si, "radio,kit_landing_circle"), c, 1e-9);
    assert_rel(csv_value(us, "radio,kit_landing_circle"), c / FT_M, 1e-9); /* 1 ft = 0.3048 m */
    /* one row each, nowhere else */
    assert_null(strstr(si, "marker bag,kit_"));
    const char *row = "\"tag line, orange\",kit_clearance_radius";
    assert_null(strstr(strstr(si, row) + strlen(row), ",kit_clearance_radius"));
    const char *kit = strstr(si, "\n# kit: clearance radius at confidence 0.9: ");
    assert_non_null(kit);
    assert_true(kit < strstr(si, "\nitem_number,item,quantity,"));
    /* the claim is of the clearance circles, all around the drop point */
    assert_non_null(strstr(kit, ", set by tag line, orange (the largest of the items' clearance "
                                "radii: every item's clearance circle, around the same point, "
                                "lies within it)"));
    assert_non_null(strstr(kit, "largest landing circle "));
    assert_non_null(strstr(strstr(us, "\n# kit: "), " ft, set by radio\n"));
    free(si);
    free(us);
    /* a landing circle no item bounds: no row, the comment says open */
    landing.zone.landing_radius.hi_open = 1;
    si = good(&rep, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI);
    assert_null(strstr(si, ",kit_landing_circle,"));
    assert_non_null(strstr(si, "largest landing circle open"));
    free(si);
    /* a single payload has no kit rows */
    plumb_zone_report one = single(items);
    si = good(&one, PLUMB_FORMAT_CSV, PLUMB_UNITS_SI);
    assert_null(strstr(si, "kit"));
    free(si);
}

/* A landing circle the samples do not bound says what that
 * leaves and what to do, in the words the sheet uses too: how many were
 * counted, how many it takes, the whole clearance radius kept clear, and
 * a sample count that bounds it. A 90 % circle at 95 % confidence needs
 * 0.9^n <= 0.025 (the largest of n samples bounds the quantile; order
 * statistics, closed form): n >= 36; with max(1, N / 4) samples fixing
 * the centre (dispersion.h, landing_training), N = 47 is the smallest run
 * that counts 36. Where that run is past PLUMB_ZONE_MAX_SAMPLES, a lower
 * confidence is the advice. A kit's text says its largest circle is open. */
static void test_an_open_landing_circle_says_what_it_leaves_and_what_to_do(void **state)
{
    (void)state;
    plumb_zone_result open = base;
    open.samples = open.zone.samples = 40;
    open.zone.landing_training = 10;
    open.confidence = 0.9;
    open.ci_level = 0.95;
    open.zone.landing_radius.hi_open = 1;
    open.zone.landing_circle_m = 0.0;
    plumb_zone_item item = {"marker bag", &open, 0};
    plumb_zone_report rep = single(&item);
    char *raw = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    char *t = squeeze(raw);
    assert_non_null(strstr(t, "circle radius open: more samples needed to bound it; only 30 of "
                              "the 40 samples are counted against its centre, and bounding it "
                              "takes at least 36. Keep the whole clearance radius around the drop "
                              "point clear: do not narrow the exclusion zone to where the impacts "
                              "seem to land. For a landing circle, run the zone with 47 samples "
                              "or more (zone.samples or --samples)."));
    free(raw);
    free(t);
    /* 1 - 4e-8: n = ceil(ln 0.025 / ln(1 - 4e-8)) = 92 221 985 counted
     * (evaluated in Python's math.log), which takes more than
     * PLUMB_ZONE_MAX_SAMPLES = 1e8 in all (n / (1 - 1/4) > 1.2e8) */
    open.confidence = 1.0 - 4e-8;
    open.samples = open.zone.samples = 92221985u + 100u;
    open.zone.landing_training = 4096;
    raw = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    t = squeeze(raw);
    assert_non_null(strstr(t, "only 92217989 of the 92222085 samples are counted against its "
                              "centre, and bounding it takes at least 92221985."));
    assert_non_null(strstr(t, "For a landing circle, run the zone at a lower confidence "
                              "(zone.confidence)."));
    free(raw);
    free(t);
    /* a kit whose landing circles are open says so */
    open = base;
    open.zone.landing_radius.hi_open = 1;
    open.zone.landing_circle_m = 0.0;
    plumb_zone_item items[2] = {{"marker bag", &open, 0}, {"radio", &open, 0}};
    plumb_zone_report kit = single(items);
    kit.inventory = 1;
    kit.n_items = 2;
    raw = good(&kit, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    assert_non_null(strstr(raw, "\n  largest landing circle open: more samples needed to bound it\n"));
    free(raw);
}

/* A zone dropped from rest has no throw: the drag-free throw rule says so
 * plainly instead of "0 m ... (0 m/s, in its own direction)";
 * with a release velocity it gives the range and the speed. The range of
 * a drag-free throw is kinematics (v t, t the fall time). */
static void test_a_drop_from_rest_says_there_is_no_throw(void **state)
{
    (void)state;
    plumb_zone_result rest = base;
    rest.zone.max_release_speed_m_s = 0.0;
    rest.zone.ballistic_throw_m = 0.0;
    plumb_zone_item item = {"marker bag", &rest, 0};
    plumb_zone_report rep = single(&item);
    for (int u = PLUMB_UNITS_SI; u <= PLUMB_UNITS_US; u++) {
        char *out = good(&rep, PLUMB_FORMAT_TEXT, (plumb_unit_system)u);
        char *flat = squeeze(out);
        assert_non_null(strstr(flat, "drag-free throw none: every sample is dropped from rest "
                                     "(no release velocity), so nothing is thrown"));
        assert_null(strstr(flat, "in its own direction"));
        free(flat);
        free(out);
    }
    /* thrown: the range and the fastest release speed */
    item.result = &base;
    char *out = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    char *flat = squeeze(out);
    assert_true(base.zone.max_release_speed_m_s > 1.0);
    assert_non_null(strstr(flat, "of the sample released fastest ("));
    assert_null(strstr(flat, "dropped from rest"));
    free(flat);
    free(out);
}

/* ---- keep-clear figures rounded up -------------------------------------------------- */

/* The number after the first `label` in s (squeezed text), and its
 * decimals; fails when there is none. */
static double number_after(const char *s, const char *label, int *decimals)
{
    const char *at = strstr(s, label);
    if (!at)
        fail_msg("no \"%s\" in:\n%s", label, s);
    at += strlen(label);
    char *end = NULL;
    double v = strtod(at, &end);
    assert_true(end && end > at);
    const char *dot = memchr(at, '.', (size_t)(end - at));
    *decimals = dot ? (int)(end - dot - 1) : 0;
    return v;
}

/* 1 when a printed figure is at least x, to within the round-off that
 * plumbp_round_safe leaves as it is (16 units in the last place: a
 * figure computed as 7.7997621000000006 is the decimal 7.7997621). */
static int at_least(double printed, double x)
{
    return printed >= x - 32.0 * DBL_EPSILON * fabs(x);
}

/* A sum "T = B + C" as printed: each figure at least the one it stands
 * for (x 1 ft = 0.3048 m, 1959 agreement, in US units), all three at one
 * decimal place, the printed parts adding up to the printed total exactly
 * (decimal arithmetic) and the total within one unit of its last digit
 * per part of the true total. Rounding a distance to keep clear away from
 * the safe side: common practice, no source. */
static void assert_sum_rounded_up(const char *flat, const char *total_label, const char *bound_label,
                                  const char *scatter_label, double bound, double scatter, double f)
{
    int dt, db, ds;
    double t = number_after(flat, total_label, &dt);
    double b = number_after(strstr(flat, total_label), bound_label, &db);
    double c = number_after(strstr(strstr(flat, total_label), bound_label), scatter_label, &ds);
    assert_int_equal(db, dt);
    assert_int_equal(ds, dt);
    double unit = pow(10.0, -dt);
    if (!(at_least(t, (bound + scatter) * f) && at_least(b, bound * f) && at_least(c, scatter * f)))
        fail_msg("%g = %g + %g is below %.17g = %.17g + %.17g", t, b, c, (bound + scatter) * f,
                 bound * f, scatter * f);
    assert_true(llround(t / unit) == llround(b / unit) + llround(c / unit));
    assert_true(t <= (bound + scatter) * f + 2.0 * unit);
}

static void test_clearance_figures_are_rounded_up_and_their_sums_add_up_as_printed(void **state)
{
    (void)state;
    /* bounds and allowances whose nearest rounding falls below them: the
     * brief's 98.3359 m + 3 m (printed 101.3 m to nearest), sums crossing
     * a power of ten, and a small one */
    const double bound[] = {98.3359, 56.64453125, 9.99961, 0.98765, 1234.5671, 99.9951};
    const double scatter[] = {3.0, 2.0, 1.7, 0.0004, 3.0, 0.0049};
    for (size_t k = 0; k < sizeof bound / sizeof bound[0]; k++) {
        plumb_zone_result r = base;
        plumb_zone_stats *z = &r.zone;
        z->radius_conf.hi = bound[k];
        z->radius_conf.value = 0.97 * bound[k];
        z->scatter_m = scatter[k];
        z->clearance_radius_m = bound[k] + scatter[k];
        z->landing_radius.hi_open = 0;
        z->landing_radius.hi = 0.61 * bound[k];
        z->landing_radius.value = 0.58 * bound[k];
        z->landing_circle_m = z->landing_radius.hi + scatter[k];
        plumb_zone_item item = {"marker bag", &r, 0};
        plumb_zone_report rep = single(&item);
        for (int u = PLUMB_UNITS_SI; u <= PLUMB_UNITS_US; u++) {
            double f = u == PLUMB_UNITS_US ? 1.0 / FT_M : 1.0;
            char *out = good(&rep, PLUMB_FORMAT_TEXT, (plumb_unit_system)u);
            char *flat = squeeze(out);
            assert_sum_rounded_up(flat, "Clearance radius at 90 %: ", "= ", "+ ", bound[k],
                                  scatter[k], f);
            assert_sum_rounded_up(flat, "landing circle ", "= upper bound ", "+ scatter ",
                                  z->landing_radius.hi, scatter[k], f);
            free(flat);
            free(out);
            /* CSV: CSV_DIGITS figures, each rounded up */
            out = good(&rep, PLUMB_FORMAT_CSV, (plumb_unit_system)u);
            assert_true(at_least(csv_value(out, "marker bag,clearance_radius"),
                                 z->clearance_radius_m * f));
            assert_true(at_least(csv_value(out, "marker bag,landing_circle"),
                                 z->landing_circle_m * f));
            assert_true(at_least(csv_value(out, "marker bag,scatter"), scatter[k] * f));
            free(out);
        }
    }
    /* the brief's case, in words: 98.3359 m + 3 m = 101.3359 m shows as
     * 101.4 m = 98.4 m + 3.0 m (4 figures rounded up), never 101.3 m */
    plumb_zone_result r = base;
    r.zone.radius_conf.hi = 98.3359;
    r.zone.scatter_m = 3.0;
    r.zone.clearance_radius_m = 101.3359;
    plumb_zone_item item = {"marker bag", &r, 0};
    plumb_zone_report rep = single(&item);
    char *out = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    assert_non_null(strstr(out, "Clearance radius at 90 %: 101.4 m\n  = 98.4 m "));
    assert_non_null(strstr(out, "\n  + 3.0 m        scatter allowance"));
    free(out);
}

/* Every other distance to keep clear is rounded up at its last digit
 * shown, and a radius's interval is widened (its low end rounded down),
 * in text and CSV: the radii, the largest, the landing circle's radius,
 * the polygon's areas, the simple rules. Each value below is one whose
 * nearest rounding falls on the other side (4 figures, at most 3
 * decimals: 73.3319 -> 73.34, not 73.33). Common practice, no source. */
static void test_radii_areas_and_rules_are_rounded_up_and_intervals_widened(void **state)
{
    (void)state;
    plumb_zone_result r = base;
    plumb_zone_stats *z = &r.zone;
    z->radius[0].value = 73.3319;
    z->radius[0].lo = 72.7190;
    z->radius[0].hi = 74.0214;
    z->radius[0].lo_open = z->radius[0].hi_open = 0;
    z->radius_max_m = 150.6207;
    z->landing_radius.hi_open = 0;
    z->landing_radius.value = 54.80078;
    z->landing.open = 0;
    z->landing.polygon.area_m2 = 6646.446812345; /* 10 figures: ...812 to nearest */
    z->landing.buffered.area_m2 = 7632.2;
    z->drop_height_m = 23.70004;
    z->ballistic_throw_m = 18.8412;
    z->glide_ratio_max = 0.0;
    plumb_zone_item item = {"marker bag", &r, 0};
    plumb_zone_report rep = single(&item);
    char *out = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI);
    char *flat = squeeze(out);
    const char *want[] = {"50 % 73.34 m 72.71 – 74.03 m", "largest 150.7 m",
                          "circle radius 54.81 m,", "polygon 6647 m² in", "7633 m²",
                          "radius = drop height 23.71 m", "drag-free throw 18.85 m:"};
    for (size_t i = 0; i < sizeof want / sizeof want[0]; i++)
        if (!strstr(flat, want[i]))
            fail_msg("no \"%s\" in:\n%s", want[i], out);
    free(flat);
    free(out);
    out = good(&rep, PLUMB_FORMAT_CSV, PLUMB_UNITS_US);
    assert_non_null(strstr(out, ",radius_p50,")); /* the row, then its figures */
    double f = 1.0 / FT_M;                         /* 1 ft = 0.3048 m */
    assert_true(at_least(csv_value(out, "marker bag,radius_p50"), 73.3319 * f));
    assert_true(at_least(csv_value(out, "marker bag,radius_max"), 150.6207 * f));
    assert_true(at_least(csv_value(out, "marker bag,drop_height"), 23.70004 * f));
    assert_true(at_least(csv_value(out, "marker bag,landing_area"), 6646.446812345 * f * f));
    /* the low end of the interval, in the column after the value */
    const char *row = strstr(out, "marker bag,radius_p50,");
    double lo = strtod(strchr(row + strlen("marker bag,radius_p50,"), ',') + 1, NULL);
    assert_true(lo <= 72.7190 * f);
    free(out);
    /* the --regions-out CSV: the landing region's area rounded up too */
    char *buf = NULL;
    size_t len = 0;
    FILE *mf = open_memstream(&buf, &len);
    assert_non_null(mf);
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_report_zone_regions(mf, &rep, &d), PLUMB_OK);
    assert_int_equal(fclose(mf), 0);
    size_t rows = 0;
    for (const char *l = strstr(buf, "\nmarker bag,landing_region,"); l;
         l = strstr(l + 1, "\nmarker bag,landing_region,")) {
        const char *c = l + 1;
        for (int k = 0; k < 8; k++) /* area_m2 is the 9th column */
            c = strchr(c, ',') + 1;
        assert_true(strtod(c, NULL) == 6646.446813); /* 10 figures, up */
        rows++;
    }
    assert_true(rows > 0);
    free(buf);
}

/* A zone's plate glide: Smith 1970's largest ratio, 1.375, printed as it
 * is (not 1.38), and the distance 1.375 x 150 ft = 206.25 ft rounded up
 * to 206.3 ft (closed form; 1 ft = 0.3048 m). */
static void test_the_plate_glide_rule_prints_its_ratio_whole_and_rounds_up(void **state)
{
    (void)state;
    plumb_zone_result r = base;
    r.zone.glide_ratio_max = 1.375;
    r.zone.drop_height_m = 150.0 * FT_M;
    plumb_zone_item item = {"marker bag", &r, 0};
    plumb_zone_report rep = single(&item);
    char *out = good(&rep, PLUMB_FORMAT_TEXT, PLUMB_UNITS_US);
    char *flat = squeeze(out);
    if (!strstr(flat, "plate glide up to 206.3 ft (1.375 x the drop height)"))
        fail_msg("no plate glide of 206.3 ft, 1.375 x, in:\n%s", out);
    assert_non_null(strstr(flat, "range of glide ratios 0 to 1.375 ("));
    free(flat);
    free(out);
}

/* A zone without a scatter allowance (zone.scatter 0, its default) says
 * so in every format instead of "+ 0 m scatter allowance ..., as given":
 * the text says none was given and that bounce and deflection are not
 * included, CSV has a "# scatter:" line, JSON "scatter_included": false
 * (README "Profile keys", zone.scatter). With an allowance, as before. */
static void test_no_scatter_allowance_is_said_in_every_format(void **state)
{
    (void)state;
    plumb_zone_result r = base;
    r.zone.scatter_m = 0.0;
    r.zone.clearance_radius_m = r.zone.radius_conf.hi;
    r.zone.landing_radius.hi_open = 0;
    r.zone.landing_circle_m = r.zone.landing_radius.hi;
    r.zone.landing.open = 0;
    r.at_target.scatter_m = 0.0; /* both passes share the zone's allowance */
    r.at_target.clearance_radius_m = r.at_target.radius_conf.hi;
    plumb_zone_item item = {"marker bag", &r, 0};
    plumb_zone_report rep = single(&item);
    for (int pass = 0; pass < 2; pass++) {
        int none = pass == 0;
        item.result = none ? &r : &base;
        for (int u = PLUMB_UNITS_SI; u <= PLUMB_UNITS_US; u++) {
            char *out = good(&rep, PLUMB_FORMAT_TEXT, (plumb_unit_system)u);
            char *flat = squeeze(out);
            const char *said = "+ none no scatter allowance given (zone.scatter): bounce and "
                               "deflection are not included";
            assert_true((strstr(flat, said) != NULL) == none);
            assert_true((strstr(flat, "scatter allowance for bounce and deflection, as given") !=
                         NULL) == !none);
            if (none) {
                assert_non_null(strstr(flat, ", the upper bound: no scatter allowance"));
                assert_non_null(strstr(flat, " part, no scatter allowance added"));
                assert_null(strstr(flat, "+ scatter "));
            }
            free(flat);
            free(out);
            out = good(&rep, PLUMB_FORMAT_CSV, (plumb_unit_system)u);
            assert_true((strstr(out, "\n# scatter: none given (zone.scatter): bounce and "
                                     "deflection are not included") != NULL) == none);
            free(out);
        }
        char *out = good(&rep, PLUMB_FORMAT_JSON, PLUMB_UNITS_SI);
        json_t *root = json_loads(out, 0, NULL);
        assert_non_null(root);
        json_t *inc = json_object_get(json_object_get(root, "zone"), "scatter_included");
        assert_true(json_is_boolean(inc));
        assert_true(json_is_true(inc) == !none);
        json_decref(root);
        free(out);
    }
}

/* ---- refusals ----------------------------------------------------------------------------- */

static void refused(const plumb_zone_report *rep, const char *part)
{
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        plumb_status st;
        plumb_diag d;
        size_t len = 1;
        char *out = report(rep, (plumb_format)f, PLUMB_UNITS_SI, &st, &d, &len);
        if (st != PLUMB_EINVAL || !strstr(d.message, part))
            fprintf(stderr, "status %d: %s\n", (int)st, d.message);
        assert_int_equal(st, PLUMB_EINVAL);
        assert_int_equal(len, 0);
        assert_non_null(strstr(d.message, part));
        free(out);
    }
}

static void test_empty_and_inconsistent_reports_are_refused_with_nothing_written(void **state)
{
    (void)state;
    plumb_zone_item items[2] = {{"marker bag", &base, 0}, {"tag line", &base, 0}};
    plumb_zone_report rep = single(items);
    rep.n_items = 0;
    refused(&rep, "no zone report");
    refused(NULL, "no zone report");
    rep.n_items = 2; /* two items but not an inventory */
    refused(&rep, "one item");
    rep.inventory = 1;
    plumb_zone_result other = base;
    other.samples = 501;
    items[1].result = &other;
    refused(&rep, "other settings");
    other = base;
    other.seed = base.seed + 1;
    refused(&rep, "other settings");
    items[1].result = NULL;
    refused(&rep, "no result or name");
    items[1].result = &base;
    items[1].name = NULL;
    refused(&rep, "no result or name");
    items[1].name = "tag line";
    other = base;
    other.zone.exceedance[1].criterion = NULL;
    items[1].result = &other;
    refused(&rep, "criterion missing");
    /* no stream */
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_report_options opt = {PLUMB_FORMAT_TEXT, PLUMB_UNITS_SI, NULL};
    assert_int_equal(plumb_report_zone(NULL, &opt, &rep, &d), PLUMB_EINVAL);
}

static void test_a_stream_that_cannot_be_written_is_a_write_error(void **state)
{
    (void)state;
    plumb_zone_item item = {"marker bag", &base, 0};
    plumb_zone_report rep = single(&item);
    for (int f = PLUMB_FORMAT_TEXT; f <= PLUMB_FORMAT_CSV; f++) {
        FILE *full = fopen("/dev/full", "w"); /* every write fails with ENOSPC */
        assert_non_null(full);
        plumb_report_options opt = {(plumb_format)f, PLUMB_UNITS_SI, NULL};
        plumb_diag d;
        plumb_diag_clear(&d);
        assert_int_equal(plumb_report_zone(full, &opt, &rep, &d), PLUMB_EWRITE);
        assert_int_equal(d.status, PLUMB_EWRITE);
        fclose(full);
    }
}

/* The per-sample file: the cautions first as "# " lines, the header row,
 * then rows whose numbers read back to the same doubles (IEEE 754-2008,
 * 5.12.2: 17 significant digits) and whose item name is quoted when it
 * holds a comma or a quote, the quote doubled (RFC 4180, section 2, rules
 * 6 and 7); a non-finite figure is refused with nothing written; a stream
 * that cannot be written is a write error. */
static void test_the_samples_file_reads_back_and_quotes_names(void **state)
{
    (void)state;
    char *buf = NULL;
    size_t len = 0;
    FILE *mem = open_memstream(&buf, &len);
    assert_non_null(mem);
    plumb_diag d;
    plumb_diag_clear(&d);
    const plumb_zone_sample smp = {{12.345678901234567, -0.1}, 31.6 / 3.0, 7.3e-3, 2.385};
    assert_int_equal(plumb_report_zone_samples_head(mem, &d), PLUMB_OK);
    assert_int_equal(plumb_report_zone_sample(mem, "bag, \"red\"", 1, 41, &smp, &d), PLUMB_OK);
    plumb_zone_sample bad = smp;
    bad.energy_j = NAN;
    long before = ftell(mem);
    assert_int_equal(plumb_report_zone_sample(mem, "bag", 0, 42, &bad, &d), PLUMB_ENUMERIC);
    assert_int_equal(d.status, PLUMB_ENUMERIC);
    assert_int_equal(ftell(mem), before);
    assert_int_equal(fclose(mem), 0);

    size_t nc;
    const char *const *c = plumb_cautions(&nc);
    const char *at = buf;
    for (size_t i = 0; i < nc; i++) {
        assert_true(strncmp(at, "# ", 2) == 0);
        assert_true(strncmp(at + 2, c[i], strlen(c[i])) == 0);
        at = strchr(at, '\n') + 1;
    }
    const char *head = strstr(at, "\nitem,pass,sample,east_m,north_m,energy_j,speed_m_s,time_s\n");
    assert_non_null(head);
    const char *row = strchr(head + 1, '\n') + 1;
    const char *want = "\"bag, \"\"red\"\"\",1,42,";
    assert_true(strncmp(row, want, strlen(want)) == 0);
    const char *p = row + strlen(want);
    const double v[5] = {smp.point_m[0], smp.point_m[1], smp.energy_j, smp.speed_m_s, smp.time_s};
    for (int k = 0; k < 5; k++) {
        char *end = NULL;
        double got = strtod(p, &end);
        assert_true(got == v[k]);
        assert_int_equal(*end, k < 4 ? ',' : '\n');
        p = end + 1;
    }
    assert_int_equal(*p, '\0');
    free(buf);

    /* a stream open for reading only: every write fails */
    char dir[256];
    assert_non_null(plumbt_mkdtemp("report-zone", dir, sizeof dir));
    char path[300];
    snprintf(path, sizeof path, "%s/ro.csv", dir);
    FILE *w = fopen(path, "w");
    assert_non_null(w);
    fclose(w);
    FILE *ro = fopen(path, "r");
    assert_non_null(ro);
    assert_int_equal(plumb_report_zone_samples_head(ro, &d), PLUMB_EWRITE);
    assert_int_equal(plumb_report_zone_sample(ro, "bag", 0, 0, &smp, &d), PLUMB_EWRITE);
    fclose(ro);
    assert_int_equal(unlink(path), 0);
    assert_int_equal(rmdir(dir), 0);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_every_format_and_unit_system_carries_the_cautions),
        cmocka_unit_test(test_a_helmet_test_criterion_is_called_not_a_safe_limit),
        cmocka_unit_test(test_no_format_prints_nan_or_infinity_for_open_ends_and_half_ranges),
        cmocka_unit_test(test_a_non_finite_figure_fails_every_format_and_writes_nothing),
        cmocka_unit_test(test_json_refuses_non_finite_figures_only_it_prints),
        cmocka_unit_test(test_json_figures_read_back_to_the_same_doubles),
        cmocka_unit_test(test_us_csv_gives_feet_and_foot_pounds_and_quotes_names),
        cmocka_unit_test(test_inventory_json_names_the_item_with_the_largest_clearance_radius),
        cmocka_unit_test(test_inventory_csv_gives_the_kit_clearance_and_the_item_that_sets_it),
        cmocka_unit_test(test_a_drop_from_rest_says_there_is_no_throw),
        cmocka_unit_test(test_clearance_figures_are_rounded_up_and_their_sums_add_up_as_printed),
        cmocka_unit_test(test_radii_areas_and_rules_are_rounded_up_and_intervals_widened),
        cmocka_unit_test(test_the_plate_glide_rule_prints_its_ratio_whole_and_rounds_up),
        cmocka_unit_test(test_no_scatter_allowance_is_said_in_every_format),
        cmocka_unit_test(test_empty_and_inconsistent_reports_are_refused_with_nothing_written),
        cmocka_unit_test(test_a_stream_that_cannot_be_written_is_a_write_error),
        cmocka_unit_test(test_the_samples_file_reads_back_and_quotes_names),
        cmocka_unit_test(test_an_open_landing_circle_says_what_it_leaves_and_what_to_do),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
