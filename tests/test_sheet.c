/*
 * test_sheet.c - the PDF sheet's own refusals (include/plumb/sheet.h,
 * libplumb-sheet.a): nothing to write, a stream that takes no more, a
 * figure that is not a finite number. Its figures are checked against the
 * fall and zone reports by tests/cli/sheet.py; its out-of-memory paths by
 * tests/nomem/test_nomem.c.
 *
 * Source: ISO 32000-1:2008 (PDF 1.7) section 7.5.2, a PDF file begins with
 * the header line "%PDF-1.n".
 */
#include <math.h>
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

/* An invented hand tool dropped from a platform. */
static const char tool_yaml[] =
    "name: test spanner\n"
    "job: {title: Test lift, site: Yard 4, prepared_by: A. Person}\n"
    "payload: {mass: 0.6 kg, drag: {cd: 1.0, area: 0.004 m^2}}\n"
    "release: {height: 12 m}\n"
    "criteria: [eu-c1-80j]\n";

typedef struct sheet_case {
    plumbt_fixture *f;
    plumb_profile *profile;
    plumb_study *study;
    plumb_brief *brief;
    plumb_sheet_options so;
} sheet_case;

static void open_case(void **state, sheet_case *c)
{
    plumb_diag d;
    memset(c, 0, sizeof *c);
    c->f = *state;
    assert_int_equal(plumb_profile_load_buffer("<test>", tool_yaml, strlen(tool_yaml),
                                               c->f->units, NULL, 0, &c->profile, &d),
                     PLUMB_OK);
    assert_int_equal(plumb_study_open(c->profile, c->f->criteria, c->f->units, NULL, &c->study, &d),
                     PLUMB_OK);
    assert_int_equal(plumb_brief_alloc(c->study, NULL, &c->brief, &d), PLUMB_OK);
    plumb_sheet_options_init(&c->so, 1767225600); /* 2026-01-01T00:00:00Z */
    assert_int_equal(c->so.paper, PLUMB_PAPER_A4);
    assert_string_equal(c->so.version, PLUMB_VERSION);
}

static void close_case(sheet_case *c)
{
    plumb_brief_free(c->brief);
    plumb_study_free(c->study);
    plumb_profile_free(c->profile);
}

/* Into a memory buffer: the status, and the bytes written. */
static plumb_status write_to(sheet_case *c, char *buf, size_t size, size_t n_briefs,
                             plumb_diag *d)
{
    memset(buf, 0, size);
    FILE *f = fmemopen(buf, size, "w");
    assert_non_null(f);
    const plumb_brief *const briefs[] = {c->brief};
    plumb_diag_clear(d);
    plumb_status st = plumb_sheet_write(f, &c->so, briefs, n_briefs, d);
    fclose(f);
    return st;
}

static void test_a_sheet_is_a_pdf(void **state)
{
    sheet_case c;
    open_case(state, &c);
    size_t size = 4u << 20;
    char *buf = malloc(size);
    assert_non_null(buf);
    plumb_diag d;
    assert_int_equal(write_to(&c, buf, size, 1, &d), PLUMB_OK);
    assert_memory_equal(buf, "%PDF-1.", 7);
    free(buf);
    close_case(&c);
}

/* The local offset from UTC, from the time zone: POSIX TZ "ABC-3" is three
 * hours east of UTC (IEEE Std 1003.1-2017, 8.3: the offset is added to
 * local time to give UTC), so local time is UTC + 10 800 s. */
static void test_the_local_offset_comes_from_the_time_zone(void **state)
{
    (void)state;
    const char *old = getenv("TZ");
    char *saved = old ? strdup(old) : NULL;
    setenv("TZ", "ABC-3", 1);
    tzset();
    plumb_sheet_options so;
    plumb_sheet_options_init(&so, 1767225600);
    assert_int_equal(so.utc_offset_s, 10800);
    assert_true(so.time_utc == 1767225600);
    if (saved)
        setenv("TZ", saved, 1);
    else
        unsetenv("TZ");
    tzset();
    free(saved);
}

static void test_nothing_to_write_is_refused(void **state)
{
    sheet_case c;
    open_case(state, &c);
    char buf[64];
    plumb_diag d;
    assert_int_equal(write_to(&c, buf, sizeof buf, 0, &d), PLUMB_EINVAL);
    assert_non_null(strstr(d.message, "nothing to write"));
    assert_int_equal(buf[0], '\0');
    close_case(&c);
}

/* A stream with room for 64 bytes: the write fails, said so (exit 3). */
static void test_a_stream_that_takes_no_more_is_a_write_error(void **state)
{
    sheet_case c;
    open_case(state, &c);
    char buf[64];
    plumb_diag d;
    assert_int_equal(write_to(&c, buf, sizeof buf, 1, &d), PLUMB_EWRITE);
    assert_non_null(strstr(d.message, "cannot write the sheet"));
    close_case(&c);
}

/* A figure that is not a finite number is never drawn: no sheet at all. */
static void test_a_figure_that_is_not_finite_gives_no_sheet(void **state)
{
    sheet_case c;
    open_case(state, &c);
    assert_true(c.brief->n_plots >= 1 && c.brief->plots[0].n_curve > 3);
    c.brief->plots[0].curve_e_j[3] = NAN;
    char buf[256];
    plumb_diag d;
    assert_int_equal(write_to(&c, buf, sizeof buf, 1, &d), PLUMB_ENUMERIC);
    assert_non_null(strstr(d.message, "not a finite number"));
    assert_int_equal(buf[0], '\0');
    close_case(&c);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_a_sheet_is_a_pdf),
        cmocka_unit_test(test_the_local_offset_comes_from_the_time_zone),
        cmocka_unit_test(test_nothing_to_write_is_refused),
        cmocka_unit_test(test_a_stream_that_takes_no_more_is_a_write_error),
        cmocka_unit_test(test_a_figure_that_is_not_finite_gives_no_sheet),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_units_criteria, plumbt_teardown_units_criteria);
}
