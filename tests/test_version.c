/*
 * test_version.c - plumb_version() at run time against the headers'
 * PLUMB_VERSION and the form of a version number.
 */
#include <ctype.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb_test.h"

/* The library linked here is the one these headers describe. */
static void test_run_time_version_is_the_headers_version(void **state)
{
    (void)state;
    assert_non_null(plumb_version());
    assert_string_equal(plumb_version(), PLUMB_VERSION);
}

/* Semantic Versioning 2.0.0, clause 2 (semver.org, seen): "X.Y.Z where X,
 * Y, and Z are non-negative integers, and MUST NOT contain leading zeroes".
 * The Makefile relies on it for the SONAME (libplumb.so.X). */
static void test_version_is_three_numbers_without_leading_zeros(void **state)
{
    (void)state;
    const char *v = plumb_version();
    int parts = 0;
    while (*v) {
        size_t n = 0;
        while (isdigit((unsigned char)v[n]))
            n++;
        assert_true(n > 0);
        assert_false(n > 1 && v[0] == '0');
        parts++;
        v += n;
        if (*v == '.')
            v++;
        else
            assert_int_equal(*v, '\0');
    }
    assert_int_equal(parts, 3);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_run_time_version_is_the_headers_version),
        cmocka_unit_test(test_version_is_three_numbers_without_leading_zeros),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
