/*
 * test_suggest.c - the did-you-mean (plumb/suggest.h): the Levenshtein
 * distance against worked examples and its defining properties, and which
 * candidate plumb_suggest_closest offers.
 */
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "core/internal.h"
#include "plumb_test.h"

/* The textbook example: kitten -> sitting is 3 edits (k->s, e->i, insert
 * g), the worked example of the Wikipedia article "Levenshtein distance"
 * (from memory); flaw -> lawn is 2 (delete f, insert n), the same
 * article's second example (from memory). */
static void test_distance_of_the_worked_examples(void **state)
{
    (void)state;
    assert_int_equal(plumbp_edit_distance("kitten", "sitting"), 3);
    assert_int_equal(plumbp_edit_distance("sitting", "kitten"), 3);
    assert_int_equal(plumbp_edit_distance("flaw", "lawn"), 2);
}

/* The definition (Levenshtein 1966): d(a, a) = 0, d(a, "") = |a|, one
 * substitution, insertion or deletion is 1, and a transposition is 2 (it
 * is not one of the three edits). */
static void test_distance_follows_its_definition(void **state)
{
    (void)state;
    assert_int_equal(plumbp_edit_distance("format", "format"), 0);
    assert_int_equal(plumbp_edit_distance("samples", ""), 7);
    assert_int_equal(plumbp_edit_distance("", "seed"), 4);
    assert_int_equal(plumbp_edit_distance("--format", "--frmat"), 1);   /* deletion */
    assert_int_equal(plumbp_edit_distance("fal", "fall"), 1);           /* insertion */
    assert_int_equal(plumbp_edit_distance("limit", "limjt"), 1);        /* substitution */
    assert_int_equal(plumbp_edit_distance("height", "hieght"), 2);      /* transposition */
}

/* Words past the 63 characters of one row are never near anything. */
static void test_distance_of_a_long_word_is_far(void **state)
{
    (void)state;
    char longw[80];
    memset(longw, 'a', sizeof longw - 1);
    longw[sizeof longw - 1] = '\0';
    assert_int_equal(plumbp_edit_distance(longw, "a"), 99);
    const char *cand[] = {longw};
    assert_null(plumb_suggest_closest(longw, cand, 1));
}

/* The nearest candidate is offered; of equally near ones, the first. */
static void test_the_nearest_candidate_is_suggested(void **state)
{
    (void)state;
    const char *opts[] = {"--set", "--format", "--units", "--output", "--quiet"};
    assert_string_equal(plumb_suggest_closest("--frmat", opts, 5), "--format");
    assert_string_equal(plumb_suggest_closest("--unit", opts, 5), "--units");
    const char *cmds[] = {"fall", "sweep", "limit", "zone", "sheet", "air", "lint"};
    assert_string_equal(plumb_suggest_closest("fal", cmds, 7), "fall");
    assert_string_equal(plumb_suggest_closest("swep", cmds, 7), "sweep");
    /* "lmit" is 1 from limit, 2 from lint: the nearer wins, whatever the order */
    assert_string_equal(plumb_suggest_closest("lmit", cmds, 7), "limit");
    const char *tie[] = {"cat", "cot"};
    assert_string_equal(plumb_suggest_closest("cut", tie, 2), "cat");
}

/* Not a suggestion: more than PLUMB_SUGGEST_MAX_EDITS edits, or edits
 * over half the word typed (the rule of plumb/suggest.h, common practice,
 * no source). */
static void test_a_word_far_from_every_candidate_gets_none(void **state)
{
    (void)state;
    const char *cmds[] = {"fall", "sweep", "limit", "zone", "sheet", "air", "lint"};
    /* xyz -> air is 3 edits of 3 letters */
    assert_int_equal(plumbp_edit_distance("xyz", "air"), 3);
    assert_null(plumb_suggest_closest("xyz", cmds, 7));
    /* edits over half the longer word: "ab" -> "job" is 2 of 3 */
    const char *top[] = {"job", "payload", "release"};
    assert_int_equal(plumbp_edit_distance("ab", "job"), 2);
    assert_null(plumb_suggest_closest("ab", top, 3));
    /* a 4-letter word 2 edits away is still suggested, and an
     * abbreviation 2 edits short of a 5-letter word ... */
    const char *keys[] = {"drag"};
    assert_string_equal(plumb_suggest_closest("drga", keys, 1), "drag");
    const char *profiles[] = {"uniform", "power", "log", "table"};
    assert_string_equal(plumb_suggest_closest("pow", profiles, 4), "power");
    /* ... a long one 4 edits away is not */
    const char *words[] = {"standard-1976"};
    assert_int_equal(plumbp_edit_distance("standard-2000", "standard-1976"), 4);
    assert_null(plumb_suggest_closest("standard-2000", words, 1));
    assert_string_equal(plumb_suggest_closest("standard-1967", words, 1), "standard-1976");
    /* nothing to choose from */
    assert_null(plumb_suggest_closest("fall", cmds, 0));
    assert_null(plumb_suggest_closest(NULL, cmds, 7));
    assert_null(plumb_suggest_closest("fall", NULL, 7));
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_distance_of_the_worked_examples),
        cmocka_unit_test(test_distance_follows_its_definition),
        cmocka_unit_test(test_distance_of_a_long_word_is_far),
        cmocka_unit_test(test_the_nearest_candidate_is_suggested),
        cmocka_unit_test(test_a_word_far_from_every_candidate_gets_none),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
