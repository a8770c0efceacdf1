/*
 * test_keys.c - the one table of numeric profile keys (src/io/keys.c)
 * against the profile loader's schema (src/io/profile_schema.c), and the
 * one altitude floor.
 *
 * A key's dimension and range are written only in the table: each numeric
 * leaf of the schema names its row (plumbp_key_id), and the loader takes
 * the dimension and range from there. What can still go wrong is the
 * binding, so this checks it both ways: every numeric leaf the loader
 * accepts names a row, and the row of its own key (a leaf that named no
 * row would be read with no dimension and no range); whole numbers are
 * whole numbers in the table too; and every row is named by some leaf,
 * so the table holds no key the loader refuses. The reference for the
 * keys is the loader's schema itself, walked from the top. A range's
 * bounds are written once too (plumby_range_bounds); its check, the
 * sampler's bounds and its message are held to them. The altitude
 * floor is the bottom of the U.S. Standard Atmosphere 1976 tables,
 * -5000 m geometric (NOAA-S/T 76-1562, Table I, from memory).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb_test.h"
#include "io/keys.h"
#include "io/yamltree.h"

/* Numeric leaves found in the schema walk; the schema has fewer. */
enum { MAX_LEAVES = 128 };

typedef struct seen {
    size_t n;                          /* leaves found */
    const plumbp_key *row[MAX_LEAVES]; /* the row each one names */
    char why[2 * PLUMB_DIAG_KEY + 96]; /* the first fault found, or "" */
} seen;

/* The general form the table uses: items[] -> payload; an item's own
 * descent is descent. */
static void general(const char *path, char *out, size_t size)
{
    if (strncmp(path, "items[].descent.", 16) == 0)
        snprintf(out, size, "%s", path + 8);
    else if (strncmp(path, "items[].", 8) == 0)
        snprintf(out, size, "payload.%s", path + 8);
    else
        snprintf(out, size, "%s", path);
}

/* Walks a schema below `path`, recording each numeric leaf's row and the
 * first leaf that names no row, the row of another key, or a row of the
 * other kind (quantity or whole number), or that gives a dimension or
 * range of its own (a second description of the key). */
static void walk(const plumby_schema *s, const char *path, seen *found)
{
    char here[PLUMB_DIAG_KEY];
    here[0] = 0;
    if (s->name[0])
        snprintf(here, sizeof here, "%s%s%s", path, path[0] ? "." : "", s->name);
    else
        snprintf(here, sizeof here, "%s", path);
    switch (s->type) {
    case PLUMBY_T_NUM:
    case PLUMBY_T_COUNT: {
        char g[PLUMB_DIAG_KEY];
        general(here, g, sizeof g);
        const plumbp_key *k = s->key;
        if (found->why[0])
            break;
        if (!k)
            snprintf(found->why, sizeof found->why, "the leaf of %s names no row", g);
        else if (strcmp(k->key, g) != 0)
            snprintf(found->why, sizeof found->why, "the leaf of %s names the row of %s", g,
                     k->key);
        else if (k->count != (s->type == PLUMBY_T_COUNT))
            snprintf(found->why, sizeof found->why, "%s is a %s to the loader, not to the table",
                     g, s->type == PLUMBY_T_COUNT ? "whole number" : "quantity");
        else if (s->dim != PLUMB_DIM_NONE || s->range != PLUMBY_R_ANY)
            snprintf(found->why, sizeof found->why, "the leaf of %s gives its own dimension or "
                     "range", g);
        else if (found->n < MAX_LEAVES)
            found->row[found->n++] = k;
        break;
    }
    case PLUMBY_T_MAP:
    case PLUMBY_T_MAP_OR_LIST:
        for (size_t i = 0; i < s->n_sub; i++)
            walk(&s->sub[i], here, found);
        break;
    case PLUMBY_T_LIST: {
        char items[PLUMB_DIAG_KEY + 4];
        snprintf(items, sizeof items, "%s[]", here);
        walk(&s->sub[0], items, found);
        break;
    }
    default:
        break;
    }
}

/* The first row of the table no leaf of the walk named, or NULL. */
static const plumbp_key *unnamed_row(const seen *found)
{
    size_t n;
    const plumbp_key *t = plumbp_keys(&n);
    for (size_t i = 0; i < n; i++) {
        int hit = 0;
        for (size_t j = 0; j < found->n; j++)
            hit |= found->row[j] == &t[i];
        if (!hit)
            return &t[i];
    }
    return NULL;
}

/* The reference: the loader's own schema, leaf by leaf. */
static void test_every_numeric_leaf_names_its_own_row_and_every_row_is_named(void **state)
{
    seen found = {0};
    walk(plumbp_profile_schema(), "", &found);
    if (found.why[0])
        fail_msg("%s", found.why);
    size_t n;
    const plumbp_key *t = plumbp_keys(&n);
    assert_int_equal(n, PLUMBP_K_COUNT);
    assert_ptr_equal(t, plumbp_key_table);
    assert_true(found.n > n); /* item keys share the payload's rows */
    assert_true(found.n < MAX_LEAVES);
    const plumbp_key *lone = unnamed_row(&found);
    if (lone)
        fail_msg("the key table has %s, which no leaf of the loader's schema names", lone->key);
    for (size_t i = 0; i < n; i++) {
        /* every written form of a row resolves to it, and --set reads its dimension */
        plumb_dim dim;
        char written[PLUMB_DIAG_KEY];
        snprintf(written, sizeof written, "%s", t[i].key);
        char *br = strstr(written, "[]");
        if (br)
            memmove(br + 2, br + 1, strlen(br + 1) + 1), br[1] = '0';
        plumb_diag d;
        assert_int_equal(plumb_profile_key_dim(written, &dim, &d), PLUMB_OK);
        assert_int_equal(dim, t[i].dim);
        assert_ptr_equal(plumbp_key_find(written, NULL, NULL), &t[i]);
    }
    (void)state;
}

/* The walk above refuses what would bring a second description or none:
 * a leaf without its row (read with no dimension and no range), with the
 * row of another key, with a dimension of its own, and a table row no
 * leaf names. Shown on small schemas of our own. */
static void test_the_check_refuses_a_leaf_without_its_row_and_a_row_without_a_leaf(void **state)
{
    const plumbp_key *mass = &plumbp_key_table[PLUMBP_K_PAYLOAD_MASS];
    const plumbp_key *volume = &plumbp_key_table[PLUMBP_K_PAYLOAD_VOLUME];
    assert_string_equal(mass->key, "payload.mass");
    assert_string_equal(volume->key, "payload.volume");
    plumby_schema leaf[1] = {{.name = "mass", .type = PLUMBY_T_NUM, .key = mass}};
    plumby_schema payload[1] = {{.name = "payload", .type = PLUMBY_T_MAP, .sub = leaf, .n_sub = 1}};
    plumby_schema top = {.name = "", .type = PLUMBY_T_MAP, .sub = payload, .n_sub = 1};

    seen found = {0};
    walk(&top, "", &found);
    assert_string_equal(found.why, "");
    assert_int_equal(found.n, 1);
    assert_ptr_equal(unnamed_row(&found), volume); /* the rows after payload.mass: unnamed */

    leaf[0].key = NULL;
    memset(&found, 0, sizeof found);
    walk(&top, "", &found);
    assert_string_equal(found.why, "the leaf of payload.mass names no row");
    assert_int_equal(plumby_num_dim(&leaf[0]), PLUMB_DIM_NONE); /* what the loader would read */
    assert_int_equal(plumby_num_range(&leaf[0]), PLUMBY_R_ANY);

    leaf[0].key = volume;
    memset(&found, 0, sizeof found);
    walk(&top, "", &found);
    assert_string_equal(found.why, "the leaf of payload.mass names the row of payload.volume");

    leaf[0].key = mass;
    leaf[0].dim = PLUMB_DIM_MASS;
    memset(&found, 0, sizeof found);
    walk(&top, "", &found);
    assert_string_equal(found.why, "the leaf of payload.mass gives its own dimension or range");

    leaf[0].dim = PLUMB_DIM_NONE;
    leaf[0].type = PLUMBY_T_COUNT;
    memset(&found, 0, sizeof found);
    walk(&top, "", &found);
    assert_string_equal(found.why,
                        "payload.mass is a whole number to the loader, not to the table");
    (void)state;
}

/* A range has one meaning, its bounds (plumby_range_bounds); the check,
 * the sampler's bounds and the message must all say the same. The bounds
 * themselves: latitude -90 .. 90 deg and longitude -180 .. 180 deg (WGS 84
 * definitions, from memory); the altitude span in the test below. */
static void test_each_range_reads_the_same_in_its_check_its_bounds_and_its_text(void **state)
{
    static const plumb_dim dims[] = {PLUMB_DIM_LENGTH, PLUMB_DIM_FRACTION, PLUMB_DIM_NONE};
    for (int r = PLUMBY_R_ANY; r <= PLUMBY_R_ALTITUDE; r++) {
        plumby_range range = (plumby_range)r;
        double lo, hi;
        int lo_open, hi_open;
        plumby_range_bounds(range, &lo, &hi, &lo_open, &hi_open);
        assert_true(lo < hi);
        const double eps = 1e-9;
        if (isfinite(lo)) {
            assert_int_equal(plumby_range_ok(range, lo), !lo_open);
            assert_false(plumby_range_ok(range, lo - eps));
            assert_true(plumby_range_ok(range, lo + eps));
        } else {
            assert_true(plumby_range_ok(range, -1e300));
        }
        if (isfinite(hi)) {
            assert_int_equal(plumby_range_ok(range, hi), !hi_open);
            assert_false(plumby_range_ok(range, hi + eps));
            assert_true(plumby_range_ok(range, hi - eps));
        } else {
            assert_true(plumby_range_ok(range, 1e300));
        }
        /* the message names each finite bound */
        for (size_t d = 0; d < sizeof dims / sizeof dims[0]; d++) {
            char text[96], num[32];
            plumby_range_text(range, dims[d], text, sizeof text);
            if (isfinite(lo)) {
                snprintf(num, sizeof num, "%g", lo);
                if (!strstr(text, num))
                    fail_msg("range %d: '%s' does not name its lower bound %s", r, text, num);
            }
            if (isfinite(hi)) {
                snprintf(num, sizeof num, "%g", hi);
                if (!strstr(text, num))
                    fail_msg("range %d: '%s' does not name its upper bound %s", r, text, num);
            }
        }
    }
    /* and a key's bounds are its range's */
    size_t n;
    const plumbp_key *t = plumbp_keys(&n);
    for (size_t i = 0; i < n; i++) {
        double lo, hi, klo, khi;
        int lo_open, hi_open, klo_open;
        plumby_range_bounds(t[i].range, &lo, &hi, &lo_open, &hi_open);
        plumbp_key_bounds(&t[i], &klo, &khi, &klo_open);
        assert_true(lo == klo && hi == khi && lo_open == klo_open);
    }
    double lo, hi;
    int lo_open, hi_open;
    plumby_range_bounds(PLUMBY_R_LATITUDE, &lo, &hi, &lo_open, &hi_open);
    assert_abs(lo, -90.0, 0.0);
    assert_abs(hi, 90.0, 0.0);
    plumby_range_bounds(PLUMBY_R_LONGITUDE, &lo, &hi, &lo_open, &hi_open);
    assert_abs(lo, -180.0, 0.0);
    assert_abs(hi, 180.0, 0.0);
    (void)state;
}

/* Forms of a key (README "Profile keys": items count from 1, lists from 0). */
static void test_written_forms_of_a_key_find_its_row(void **state)
{
    size_t dev;
    long item;
    const plumbp_key *k = plumbp_key_find("items[2].mass", &dev, &item);
    assert_non_null(k);
    assert_string_equal(k->key, "payload.mass");
    assert_int_equal(item, 1);
    k = plumbp_key_find("descent[1].deploy.below", &dev, &item);
    assert_non_null(k);
    assert_string_equal(k->key, "descent.deploy.below");
    assert_int_equal(dev, 1);
    assert_int_equal(item, -1);
    k = plumbp_key_find("items[glove].descent.cd", &dev, &item);
    assert_non_null(k);
    assert_string_equal(k->key, "descent.cd");
    assert_int_equal(item, -2);
    assert_null(plumbp_key_find("items[0].mass", NULL, NULL));
    assert_null(plumbp_key_find("wind.profile", NULL, NULL));
    assert_null(plumbp_key_find("payload.mas", NULL, NULL));
    (void)state;
}

/* When a key applies: drag.cd only with cd and area, descent[1] only
 * with two devices (README.md "Profile keys"). */
static void test_a_key_reaches_the_spec_only_where_it_applies(void **state)
{
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    plumb_wind_spec_init(&s.wind);
    s.drag.model = PLUMB_DRAG_FIXED;
    s.drag.cd = 0.83;
    s.drag.area_m2 = 0.0217;
    s.n_descent = 1;
    s.descent[0].trigger = PLUMB_DEPLOY_BELOW;
    assert_ptr_equal(plumb_fall_spec_field(&s, "payload.drag.cd"), &s.drag.cd);
    assert_null(plumb_fall_spec_field(&s, "payload.drag.cd_area"));
    assert_ptr_equal(plumb_fall_spec_field(&s, "descent.deploy.below"), &s.descent[0].deploy_value);
    assert_null(plumb_fall_spec_field(&s, "descent.deploy.after"));
    assert_null(plumb_fall_spec_field(&s, "descent[1].cd"));
    assert_null(plumb_fall_spec_field(&s, "wind.exponent")); /* uniform wind */
    assert_null(plumb_fall_spec_field(&s, "atmosphere.humidity")); /* the air is not in a spec */
    s.drag.area_m2 = 0.0;
    s.drag.cd_area_m2 = 0.018;
    assert_null(plumb_fall_spec_field(&s, "payload.drag.cd"));
    assert_ptr_equal(plumb_fall_spec_field(&s, "payload.drag.cd_area"), &s.drag.cd_area_m2);
    (void)state;
}

/* NOAA-S/T 76-1562, Table I starts at -5000 m (from memory): the one
 * floor, used by the air model, the loader's ranges and the key table. */
static void test_the_altitude_floor_is_the_1976_tables_bottom_everywhere(void **state)
{
    assert_abs(PLUMB_STD1976_BOTTOM_M, -5000.0, 0.0);
    plumb_air a;
    assert_int_equal(plumb_std1976(PLUMB_STD1976_BOTTOM_M, 0.0, &a), PLUMB_OK);
    assert_int_equal(plumb_std1976(PLUMB_STD1976_BOTTOM_M - 0.5, 0.0, &a), PLUMB_ERANGE);
    assert_true(plumby_range_ok(PLUMBY_R_ALTITUDE, PLUMB_STD1976_BOTTOM_M));
    assert_false(plumby_range_ok(PLUMBY_R_ALTITUDE, PLUMB_STD1976_BOTTOM_M - 0.5));
    char buf[64];
    assert_string_equal(plumby_range_text(PLUMBY_R_ALTITUDE, PLUMB_DIM_LENGTH, buf, sizeof buf),
                        "-5000 m .. 86000 m");
    double lo, hi;
    int open;
    plumbp_key_bounds(plumbp_key_find("site.elevation", NULL, NULL), &lo, &hi, &open);
    assert_abs(lo, -5000.0, 0.0);
    assert_abs(hi, 86000.0, 0.0);
    assert_int_equal(open, 0);
    (void)state;
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_every_numeric_leaf_names_its_own_row_and_every_row_is_named),
        cmocka_unit_test(test_the_check_refuses_a_leaf_without_its_row_and_a_row_without_a_leaf),
        cmocka_unit_test(test_each_range_reads_the_same_in_its_check_its_bounds_and_its_text),
        cmocka_unit_test(test_written_forms_of_a_key_find_its_row),
        cmocka_unit_test(test_a_key_reaches_the_spec_only_where_it_applies),
        cmocka_unit_test(test_the_altitude_floor_is_the_1976_tables_bottom_everywhere),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
