/*
 * test_keys.c - the one table of numeric profile keys (src/io/keys.c)
 * against the profile loader's schema (src/io/profile.c), and the one
 * altitude floor.
 *
 * The reference for the keys is the loader itself: every numeric key it
 * accepts must be in the table with the same dimension and range, and
 * every key of the table must be one the loader accepts. The altitude
 * floor is the bottom of the U.S. Standard Atmosphere 1976 tables,
 * -5000 m geometric (NOAA-S/T 76-1562, Table I, from memory).
 */
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

enum { MAX_SEEN = 128 };

typedef struct seen {
    size_t n;
    char key[MAX_SEEN][PLUMB_DIAG_KEY];
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
        size_t n;
        const plumbp_key *t = plumbp_keys(&n);
        const plumbp_key *k = NULL;
        for (size_t i = 0; i < n; i++)
            if (strcmp(t[i].key, g) == 0)
                k = &t[i];
        if (!k)
            fail_msg("the loader accepts the numeric key %s; the key table lacks it", g);
        assert_int_equal(k->count, s->type == PLUMBY_T_COUNT);
        if (s->type == PLUMBY_T_NUM) {
            if (k->dim != s->dim || k->range != s->range)
                fail_msg("%s: the table says dim %d range %d, the loader dim %d range %d", g,
                         (int)k->dim, (int)k->range, (int)s->dim, (int)s->range);
        }
        if (found->n < MAX_SEEN)
            snprintf(found->key[found->n++], PLUMB_DIAG_KEY, "%s", g);
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

/* The reference: the loader's own schema, key by key. */
static void test_every_numeric_key_the_loader_accepts_is_in_the_table_and_back(void **state)
{
    seen found = {0};
    walk(plumbp_profile_schema(), "", &found);
    size_t n;
    const plumbp_key *t = plumbp_keys(&n);
    assert_true(found.n > 30);
    for (size_t i = 0; i < n; i++) {
        int hit = 0;
        for (size_t j = 0; j < found.n; j++)
            hit |= strcmp(found.key[j], t[i].key) == 0;
        if (!hit)
            fail_msg("the key table has %s, which the loader does not accept", t[i].key);
        /* and every written form of it resolves to its row */
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
 * with two devices (design.md section 5). */
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
        cmocka_unit_test(test_every_numeric_key_the_loader_accepts_is_in_the_table_and_back),
        cmocka_unit_test(test_written_forms_of_a_key_find_its_row),
        cmocka_unit_test(test_a_key_reaches_the_spec_only_where_it_applies),
        cmocka_unit_test(test_the_altitude_floor_is_the_1976_tables_bottom_everywhere),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
