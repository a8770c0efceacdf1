/*
 * test_yamltree.c - the positioned YAML tree (src/yamltree.[ch]): where
 * nodes are, what is refused and where, the file reader's size limit, deep
 * copies, and the schema checker's words.
 *
 * Sources of the checked values:
 *   - YAML 1.2.2 (yaml.org/spec/1.2.2): section 6.1 (tabs are never
 *     indentation), 3.2.2.2 and 6.9.2 (anchors, aliases, tags), 3.2.1.1
 *     (mapping keys are unique), 9.1.1 (a byte-order mark is not content),
 *     9.2 (a stream of several documents).
 *   - RFC 3629, section 4 (UTF-8 syntax): 0xC3 0x28 is not UTF-8 (a lead
 *     byte followed by a non-continuation byte), nor is a lone 0xFF.
 *   - The contract of src/yamltree.h: lines and columns are 1-based and
 *     count characters, not bytes; PLUMBY_MAX_DEPTH, PLUMBY_MAX_KEYS; the
 *     override column offset and key prefix.
 *   - Expected lines and columns are counted by hand from the texts below.
 *   - SI: 1 g = 0.001 kg (SI Brochure, 9th ed., table 7, prefixes).
 */
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
#include "io/yamltree.h"

static plumb_units *units;

static int group_setup(void **state)
{
    plumbt_setup_gsl(state);
    plumb_diag d;
    plumb_diag_clear(&d);
    return plumb_units_alloc(&units, &d) == PLUMB_OK ? 0 : -1;
}

static int group_teardown(void **state)
{
    (void)state;
    plumb_units_free(units);
    return 0;
}

/* Parses text from a file named "t.yaml"; returns the tree (NULL on error). */
static plumby_node *parse(const char *text, plumb_status *st, plumb_diag *d)
{
    plumby_node *root = NULL;
    plumb_diag_clear(d);
    *st = plumby_parse(text, strlen(text), "t.yaml", PLUMBY_FROM_FILE, 0, NULL, &root, d);
    return root;
}

static plumby_node *parsed(const char *text)
{
    plumb_status st;
    plumb_diag d;
    plumby_node *root = parse(text, &st, &d);
    if (st != PLUMB_OK)
        fprintf(stderr, "%d:%d: %s: %s\n", d.line, d.col, d.key, d.message);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(root);
    return root;
}

/* Parses text that must be refused with status want at line:col, with the
 * dotted key (may be "") and a part of the message. */
static void refused_n(const char *text, size_t len, plumb_status want, int line, int col,
                      const char *key, const char *part)
{
    plumby_node *root = (plumby_node *)1;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumby_parse(text, len, "t.yaml", PLUMBY_FROM_FILE, 0, NULL, &root, &d);
    if (st != want || d.line != line || d.col != col || strcmp(d.key, key) != 0 ||
        !strstr(d.message, part))
        fprintf(stderr, "got status %d at %d:%d key '%s': %s\n", (int)st, d.line, d.col, d.key,
                d.message);
    assert_int_equal(st, want);
    assert_null(root);
    assert_int_equal(d.status, want);
    assert_string_equal(d.file, "t.yaml");
    assert_int_equal(d.line, line);
    assert_int_equal(d.col, col);
    assert_string_equal(d.key, key);
    assert_non_null(strstr(d.message, part));
}

static void refused(const char *text, plumb_status want, int line, int col, const char *key,
                    const char *part)
{
    refused_n(text, strlen(text), want, line, col, key, part);
}

static const plumby_node *value_of(const plumby_node *map, const char *key)
{
    const plumby_pair *p = plumby_find(map, key);
    if (!p)
        fail_msg("no key '%s'", key);
    return p->value;
}

/* ---- positions ----------------------------------------------------------- */

static void test_keys_and_values_carry_one_based_lines_and_columns(void **state)
{
    (void)state;
    plumby_node *root = parsed("name: Test spanner\n"
                               "payload:\n"
                               "  mass: 2.385 kg\n"
                               "  drag: {cd: 0.93, area: 0.0187 m^2}\n");
    assert_int_equal(root->kind, PLUMBY_MAP);
    assert_int_equal(root->n, 2);
    /* keys in file order */
    assert_string_equal(root->pairs[0].key, "name");
    assert_string_equal(root->pairs[1].key, "payload");
    assert_int_equal(root->pairs[1].line, 2);
    assert_int_equal(root->pairs[1].col, 1);
    const plumby_node *payload = value_of(root, "payload");
    assert_int_equal(payload->kind, PLUMBY_MAP);
    const plumby_pair *mass = plumby_find(payload, "mass");
    assert_non_null(mass);
    assert_int_equal(mass->line, 3); /* "  mass: 2.385 kg": key at column 3 */
    assert_int_equal(mass->col, 3);
    assert_int_equal(mass->value->line, 3); /* value at column 9 */
    assert_int_equal(mass->value->col, 9);
    assert_string_equal(mass->value->text, "2.385 kg");
    assert_true(mass->value->plain);
    const plumby_node *drag = value_of(payload, "drag");
    assert_int_equal(drag->kind, PLUMBY_MAP);
    assert_int_equal(drag->line, 4); /* the flow map's '{' at column 9 */
    assert_int_equal(drag->col, 9);
    const plumby_pair *area = plumby_find(drag, "area");
    assert_non_null(area);
    assert_int_equal(area->line, 4); /* "{cd: 0.93, area: 0.0187 m^2}": area at 20, value at 26 */
    assert_int_equal(area->col, 20);
    assert_int_equal(area->value->col, 26);
    assert_string_equal(area->value->text, "0.0187 m^2");
    assert_null(plumby_find(drag, "Area")); /* keys are compared exactly */
    plumby_free(root);
}

static void test_columns_count_characters_not_bytes_after_utf8_text(void **state)
{
    (void)state;
    /* "x: {a: ü, b: 7.3 m/s}": ü is two bytes, one character, so b is the
     * 11th character (the 12th byte). */
    plumby_node *root = parsed("name: Größe\nx: {a: ü, b: 7.3 m/s}\n");
    const plumby_pair *b = plumby_find(value_of(root, "x"), "b");
    assert_non_null(b);
    assert_int_equal(b->line, 2);
    assert_int_equal(b->col, 11);
    /* the text is copied byte for byte (RFC 3629: G r 0xC3 0xB6 0xC3 0x9F e) */
    assert_string_equal(value_of(root, "name")->text, "Gr\xC3\xB6\xC3\x9F" "e");
    plumby_free(root);
}

static void test_a_byte_order_mark_is_not_content(void **state)
{
    (void)state;
    plumby_node *root = parsed("\xEF\xBB\xBFmass: 2.385 kg\n");
    assert_int_equal(root->pairs[0].line, 1);
    assert_int_equal(root->pairs[0].col, 1); /* YAML 1.2.2, 9.1.1 */
    assert_string_equal(root->pairs[0].key, "mass");
    plumby_free(root);
}

static void test_lines_ended_by_crlf_are_counted_once(void **state)
{
    (void)state;
    refused("a: 1\r\nb: 2\r\nb: 3\r\n", PLUMB_EKEY, 3, 1, "b", "duplicate key 'b'");
}

/* ---- refusals --------------------------------------------------------------- */

static void test_a_duplicate_key_is_refused_at_the_second_naming_the_first(void **state)
{
    (void)state;
    refused("mass: 2.385 kg\nname: x\nmass: 2.4 kg\n", PLUMB_EKEY, 3, 1, "mass",
            "first given at line 1, column 1");
}

static void test_a_duplicate_key_in_a_nested_map_names_its_dotted_key(void **state)
{
    (void)state;
    refused("payload:\n  mass: 2.385 kg\n  drag: {cd: 0.93, cd: 0.87}\n", PLUMB_EKEY, 3, 20,
            "payload.drag.cd", "first given at line 3, column 10");
    /* in the second item of a list (counted from 0): table[1].density */
    refused("table:\n  - {altitude: 1 m, density: 1 kg/m^3}\n"
            "  - {altitude: 2 m, density: 1 kg/m^3, density: 2 kg/m^3}\n",
            PLUMB_EKEY, 3, 40, "table[1].density", "duplicate key 'density'");
}

static void test_a_tab_in_the_indentation_is_refused_where_it_is(void **state)
{
    (void)state;
    refused("payload:\n\tmass: 2.385 kg\n", PLUMB_EPARSE, 2, 1, "", "tab");
    refused("payload:\n  mass: 2.385 kg\n  \tdrag: {cd_area: 0.0041 m^2}\n", PLUMB_EPARSE, 3, 3,
            "", "tab");
}

static void test_a_tab_inside_a_value_is_refused(void **state)
{
    (void)state;
    plumb_status st;
    plumb_diag d;
    plumby_node *root = parse("name: \"Test\tspanner\"\n", &st, &d);
    assert_int_equal(st, PLUMB_EPARSE);
    assert_null(root);
    assert_int_equal(d.line, 1);
    assert_int_equal(d.col, 12); /* where the tab is written */
    assert_non_null(strstr(d.message, "tab"));
}

static void test_anchors_aliases_and_tags_are_refused(void **state)
{
    (void)state;
    /* YAML 1.2.2, 6.9.2 (anchor "&", tag "!") and 7.1 (alias "*") */
    refused("a: &m 2.385 kg\nb: 1\n", PLUMB_EPARSE, 1, 4, "a", "anchors (&m)");
    refused("a: 1\nb: *m\n", PLUMB_EPARSE, 2, 4, "b", "aliases (*m)");
    refused("a: !!str 2.385\n", PLUMB_EPARSE, 1, 4, "a", "tags");
    refused("a: &l [1, 2]\n", PLUMB_EPARSE, 1, 4, "a", "anchors (&l)");
    refused("a: !m {b: 1}\n", PLUMB_EPARSE, 1, 4, "a", "tags (!m)");
}

static void test_bytes_that_are_not_utf8_are_refused_where_the_sequence_starts(void **state)
{
    (void)state;
    /* RFC 3629: 0xC3 must be followed by 0x80..0xBF; "name: ab" is 8 characters */
    refused("a: 1\nname: ab\xC3\x28\n", PLUMB_EPARSE, 2, 9, "", "not valid UTF-8");
    refused("a: 1\r\nname: \xFF\r\n", PLUMB_EPARSE, 2, 7, "", "not valid UTF-8");
}

static void test_a_second_document_is_refused(void **state)
{
    (void)state;
    /* YAML 1.2.2, 9.2: "---" starts the second document on line 2 */
    refused("a: 1\n---\nb: 2\n", PLUMB_EPARSE, 2, 1, "", "second YAML document");
}

static void test_empty_text_comments_only_and_a_null_document_are_refused(void **state)
{
    (void)state;
    refused("", PLUMB_EPARSE, 1, 1, "", "no YAML document");
    refused("# nothing here\n\n", PLUMB_EPARSE, 1, 1, "", "no YAML document");
    refused("~\n", PLUMB_EPARSE, 1, 1, "", "the YAML document is empty");
}

static void test_nesting_to_the_limit_is_taken_and_one_deeper_is_refused(void **state)
{
    (void)state;
    char text[2 * PLUMBY_MAX_DEPTH + 8];
    /* PLUMBY_MAX_DEPTH nested flow lists: accepted */
    size_t k = 0;
    for (int i = 0; i < PLUMBY_MAX_DEPTH; i++)
        text[k++] = '[';
    for (int i = 0; i < PLUMBY_MAX_DEPTH; i++)
        text[k++] = ']';
    text[k] = '\0';
    plumby_node *root = parsed(text);
    const plumby_node *n = root;
    int depth = 1;
    while (n->n == 1) {
        n = n->items[0];
        depth++;
    }
    assert_int_equal(depth, PLUMBY_MAX_DEPTH);
    plumby_free(root);
    /* one more: refused at the innermost '[', column PLUMBY_MAX_DEPTH + 1 */
    k = 0;
    for (int i = 0; i <= PLUMBY_MAX_DEPTH; i++)
        text[k++] = '[';
    for (int i = 0; i <= PLUMBY_MAX_DEPTH; i++)
        text[k++] = ']';
    text[k] = '\0';
    plumb_status st;
    plumb_diag d;
    root = parse(text, &st, &d);
    assert_int_equal(st, PLUMB_ERANGE);
    assert_null(root);
    assert_int_equal(d.line, 1);
    assert_int_equal(d.col, PLUMBY_MAX_DEPTH + 1);
    assert_non_null(strstr(d.message, "nesting deeper than 32"));
}

/* A map of n keys "k0: 1" ... one per line; the caller frees it. */
static char *map_of(size_t n)
{
    char *text = malloc(n * 16 + 1);
    assert_non_null(text);
    size_t used = 0;
    for (size_t i = 0; i < n; i++)
        used += (size_t)sprintf(text + used, "k%zu: 1\n", i);
    return text;
}

static void test_a_map_of_the_most_keys_is_taken_and_one_more_is_refused(void **state)
{
    (void)state;
    char *text = map_of(PLUMBY_MAX_KEYS);
    plumby_node *root = parsed(text);
    assert_int_equal(root->n, PLUMBY_MAX_KEYS);
    plumby_free(root);
    free(text);
    text = map_of(PLUMBY_MAX_KEYS + 1);
    /* the 1025th key is on line 1025 */
    refused(text, PLUMB_ERANGE, PLUMBY_MAX_KEYS + 1, 1, "", "more than 1024 keys");
    free(text);
}

static void test_a_nul_character_in_a_value_is_refused(void **state)
{
    (void)state;
    /* the escape \0 of a double-quoted scalar (YAML 1.2.2, 5.7) */
    refused("a: 1\nname: \"x\\0y\"\n", PLUMB_EPARSE, 2, 7, "name", "NUL");
}

static void test_a_key_that_is_not_a_scalar_is_refused(void **state)
{
    (void)state;
    refused("? [a, b]\n: 1\n", PLUMB_EPARSE, 1, 3, "", "a key must be a plain word, found a list");
    refused("{a: 1}: 2\n", PLUMB_EPARSE, 1, 1, "", "found a map");
}

static void test_malformed_yaml_is_refused_with_a_position(void **state)
{
    (void)state;
    plumb_status st;
    plumb_diag d;
    plumby_node *root = parse("a: {b: 1\nc: 2\n", &st, &d);
    assert_int_equal(st, PLUMB_EPARSE);
    assert_null(root);
    assert_true(d.line >= 1 && d.line <= 3); /* inside the 2 lines, or at the end */
    assert_true(d.col >= 1);
    assert_non_null(strstr(d.message, "malformed YAML"));
}

static void test_an_override_is_located_on_its_own_line_with_its_column_offset(void **state)
{
    (void)state;
    /* as --set payload.drag={cd: 0.93, cd: 0.87}: the value starts 13
     * characters into the argument, so the second cd (column 12 of the
     * value) is column 25 */
    const char *text = "{cd: 0.93, cd: 0.87}";
    plumby_node *root = (plumby_node *)1;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumby_parse(text, strlen(text), PLUMBY_SET_FILE, PLUMBY_FROM_SET, 13,
                                   "payload.drag", &root, &d);
    assert_int_equal(st, PLUMB_EKEY);
    assert_null(root);
    assert_string_equal(d.file, "--set");
    assert_int_equal(d.line, 1);
    assert_int_equal(d.col, 25);
    assert_string_equal(d.key, "payload.drag.cd");
    /* a good override's nodes remember where they came from */
    st = plumby_parse("2.385 kg", 8, PLUMBY_SET_FILE, PLUMBY_FROM_SET, 13, "payload.mass", &root,
                      &d);
    assert_int_equal(st, PLUMB_OK);
    assert_int_equal(root->origin, PLUMBY_FROM_SET);
    assert_int_equal(root->col, 14);
    plumby_free(root);
}

/* ---- the file reader ----------------------------------------------------- */

static void write_bytes(const char *path, size_t n)
{
    FILE *f = fopen(path, "w");
    assert_non_null(f);
    for (size_t i = 0; i < n; i++)
        assert_int_not_equal(fputc(i % 64 == 63 ? '\n' : '#', f), EOF);
    assert_int_equal(fclose(f), 0);
}

static void test_read_file_takes_a_file_at_the_limit_and_refuses_one_byte_more(void **state)
{
    (void)state;
    const char *tmp = getenv("TMPDIR");
    char dir[256];
    snprintf(dir, sizeof dir, "%s/plumb-test-yamltree-XXXXXX", tmp && *tmp ? tmp : "/tmp");
    assert_non_null(mkdtemp(dir));
    char path[300];
    snprintf(path, sizeof path, "%s/f.yaml", dir);
    const size_t limit = 5000; /* more than one 4096-byte read buffer */
    char *buf = (char *)1;
    size_t len = 1;
    plumb_diag d;

    write_bytes(path, limit);
    plumb_diag_clear(&d);
    assert_int_equal(plumby_read_file(path, limit, &buf, &len, &d), PLUMB_OK);
    assert_int_equal(len, limit);
    assert_int_equal(buf[limit], '\0'); /* NUL-terminated */
    assert_int_equal(buf[63], '\n');
    free(buf);

    write_bytes(path, limit + 1);
    plumb_diag_clear(&d);
    assert_int_equal(plumby_read_file(path, limit, &buf, &len, &d), PLUMB_ERANGE);
    assert_null(buf);
    assert_int_equal(len, 0);
    assert_string_equal(d.file, path);
    assert_non_null(strstr(d.message, "5001 bytes"));
    assert_non_null(strstr(d.message, "at most 5000"));

    /* a stream that is not a regular file has no size: counted as read */
    plumb_diag_clear(&d);
    assert_int_equal(plumby_read_file("/dev/zero", limit, &buf, &len, &d), PLUMB_ERANGE);
    assert_null(buf);
    assert_non_null(strstr(d.message, "longer than 5000 bytes"));

    /* a directory and a missing file: PLUMB_EIO naming the path */
    plumb_diag_clear(&d);
    assert_int_equal(plumby_read_file(dir, limit, &buf, &len, &d), PLUMB_EIO);
    assert_null(buf);
    assert_string_equal(d.file, dir);
    assert_non_null(strstr(d.message, "directory"));
    assert_int_equal(unlink(path), 0);
    plumb_diag_clear(&d);
    assert_int_equal(plumby_read_file(path, limit, &buf, &len, &d), PLUMB_EIO);
    assert_null(buf);
    assert_non_null(strstr(d.message, "cannot open"));
    assert_int_equal(rmdir(dir), 0);
}

/* ---- copies and descriptions --------------------------------------------- */

static void test_a_copy_is_deep_and_keeps_positions_and_origin(void **state)
{
    (void)state;
    plumby_node *root = parsed("payload:\n  mass: 2.385 kg\nlist: [7.3 m/s, '31.6 m']\n");
    plumby_node *copy = plumby_copy(root);
    assert_non_null(copy);
    plumby_pair *mass = plumby_find(value_of(copy, "payload"), "mass");
    assert_non_null(mass);
    assert_int_equal(mass->line, 2);
    assert_int_equal(mass->col, 3);
    assert_int_equal(mass->value->col, 9);
    const plumby_node *list = value_of(copy, "list");
    assert_int_equal(list->n, 2);
    assert_true(list->items[0]->plain);
    assert_false(list->items[1]->plain); /* quoted */
    assert_int_equal(list->items[1]->col, 17);
    /* changing the copy leaves the original as it was */
    mass->value->text[0] = '9';
    assert_string_equal(plumby_find(value_of(root, "payload"), "mass")->value->text, "2.385 kg");
    assert_string_equal(mass->value->text, "9.385 kg");
    plumby_free(copy);
    plumby_free(root);
    plumby_free(NULL); /* accepted */
}

static void test_descriptions_quote_short_scalars_and_cut_long_ones(void **state)
{
    (void)state;
    plumby_node *root = parsed("a: 2.385 kg\nb: {c: 1}\nd: [1]\ne:\n"
                               "f: abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ\n");
    char buf[96];
    assert_string_equal(plumby_describe(value_of(root, "a"), buf, sizeof buf), "'2.385 kg'");
    assert_string_equal(plumby_describe(value_of(root, "b"), buf, sizeof buf), "a map");
    assert_string_equal(plumby_describe(value_of(root, "d"), buf, sizeof buf), "a list");
    assert_string_equal(plumby_describe(value_of(root, "e"), buf, sizeof buf), "an empty value");
    /* longer than 40 characters: the first 40 and "..." */
    assert_string_equal(plumby_describe(value_of(root, "f"), buf, sizeof buf),
                        "'abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMN...'");
    plumby_free(root);
}

static void test_null_is_a_plain_empty_tilde_or_null_and_never_quoted(void **state)
{
    (void)state;
    /* YAML 1.2.2, 10.3.2 (core schema): null | Null | NULL | ~ | empty */
    plumby_node *root = parsed("a:\nb: ~\nc: null\nd: NULL\ne: 'null'\nf: \"\"\ng: nil\n");
    assert_true(plumby_is_null(value_of(root, "a")));
    assert_true(plumby_is_null(value_of(root, "b")));
    assert_true(plumby_is_null(value_of(root, "c")));
    assert_true(plumby_is_null(value_of(root, "d")));
    assert_false(plumby_is_null(value_of(root, "e")));
    assert_false(plumby_is_null(value_of(root, "f")));
    assert_false(plumby_is_null(value_of(root, "g")));
    assert_false(plumby_is_null(root));
    plumby_free(root);
}

/* ---- the schema ------------------------------------------------------------ */

static const char *const kinds[] = {"parachute", "streamer", "drogue"};
static const plumby_schema drag_keys[] = {
    {"cd", PLUMBY_T_NUM, PLUMB_DIM_NONE, PLUMBY_R_CD, NULL, 0, NULL, 0, NULL},
    {"area", PLUMBY_T_NUM, PLUMB_DIM_AREA, PLUMBY_R_POSITIVE, NULL, 0, NULL, 0, NULL},
};
static const plumby_schema payload_keys[] = {
    {"mass", PLUMBY_T_NUM, PLUMB_DIM_MASS, PLUMBY_R_POSITIVE, NULL, 0, NULL, 0, NULL},
    {"drag", PLUMBY_T_MAP, PLUMB_DIM_NONE, PLUMBY_R_ANY, drag_keys, 2, NULL, 0, NULL},
    {"kind", PLUMBY_T_WORD, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, kinds, 3, NULL},
    {"name", PLUMBY_T_TEXT, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, NULL, 0, NULL},
    {"samples", PLUMBY_T_COUNT, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, NULL, 0, NULL},
};
static const plumby_schema top_keys[] = {
    {"payload", PLUMBY_T_MAP, PLUMB_DIM_NONE, PLUMBY_R_ANY, payload_keys, 5, NULL, 0, NULL},
};
static const plumby_schema top = {"", PLUMBY_T_MAP, PLUMB_DIM_NONE, PLUMBY_R_ANY, top_keys, 1,
                                  NULL, 0, NULL};

/* Checks text against the schema; returns the status, d filled. */
static plumb_status checked(const char *text, plumb_diag *d, plumby_node **out)
{
    plumby_node *root = parsed(text);
    plumby_ctx ctx = {.file = "t.yaml", .units = units, .diag = d};
    plumb_diag_clear(d);
    plumb_status st = plumby_check(&ctx, root, &top, "");
    if (out)
        *out = root;
    else
        plumby_free(root);
    return st;
}

static void test_an_unknown_key_is_refused_with_a_did_you_mean(void **state)
{
    (void)state;
    plumb_diag d;
    assert_int_equal(checked("payload:\n  mass: 2.385 kg\n  drga: {cd: 0.93}\n", &d, NULL),
                     PLUMB_EKEY);
    assert_string_equal(d.key, "payload.drga");
    assert_int_equal(d.line, 3);
    assert_int_equal(d.col, 3);
    assert_non_null(strstr(d.message, "did you mean 'drag'?"));
    /* nothing close: the keys of that map are listed */
    assert_int_equal(checked("payload:\n  colour: red\n", &d, NULL), PLUMB_EKEY);
    assert_non_null(strstr(d.message, "keys here: mass, drag, kind, name, samples"));
    /* a key written a level too high: where it belongs is named */
    assert_int_equal(checked("cd: 0.93\n", &d, NULL), PLUMB_EKEY);
    assert_string_equal(d.key, "cd");
    assert_non_null(strstr(d.message, "it is a key of 'payload.drag' (did you mean "
                                      "'payload.drag.cd'?)"));
    /* a word not in its list: the nearest one suggested */
    assert_int_equal(checked("payload: {kind: parchute}\n", &d, NULL), PLUMB_EINVAL);
    assert_string_equal(d.key, "payload.kind");
    assert_non_null(strstr(d.message, "did you mean 'parachute'?"));
}

static void test_a_map_where_a_number_belongs_is_refused_saying_what_was_expected(void **state)
{
    (void)state;
    plumb_diag d;
    assert_int_equal(checked("payload:\n  mass: {value: 2.385}\n", &d, NULL), PLUMB_EINVAL);
    assert_string_equal(d.key, "payload.mass");
    assert_int_equal(d.line, 2);
    assert_int_equal(d.col, 9);
    assert_non_null(strstr(d.message, "expected a mass with its unit (SI: kg), found a map"));
    assert_int_equal(checked("payload: [1, 2]\n", &d, NULL), PLUMB_EINVAL);
    assert_non_null(strstr(d.message, "found a list"));
}

static void test_numbers_are_read_in_si_and_refused_outside_their_range(void **state)
{
    (void)state;
    plumb_diag d;
    plumby_node *root = NULL;
    assert_int_equal(checked("payload: {mass: 2385 g, drag: {cd: 10.5, area: 0.0187 m^2}}\n",
                             &d, &root),
                     PLUMB_OK);
    plumby_ctx ctx = {.file = "t.yaml", .units = units, .diag = &d};
    plumby_map m, p, dr;
    plumby_map_init(&m, &ctx, root, &top, "");
    plumby_sub(&m, "payload", &p);
    double mass = 0.0, cd = 0.0;
    assert_int_equal(plumby_num(&p, "mass", 1, 0.0, &mass, NULL), PLUMB_OK);
    assert_rel(mass, 2.385, 1e-15); /* SI Brochure: 1 g = 0.001 kg */
    plumby_sub(&p, "drag", &dr);
    plumb_diag_clear(&d);
    assert_int_equal(plumby_num(&dr, "cd", 1, 0.0, &cd, NULL), PLUMB_ERANGE);
    assert_string_equal(d.key, "payload.drag.cd");
    assert_int_equal(d.col, 36); /* "payload: {mass: 2385 g, drag: {cd: 10.5": 10.5 at 36 */
    assert_non_null(strstr(d.message, "must be 0 .. 10 (0: drag-free), found '10.5'"));
    /* an optional key that is absent takes its default; a required one is missing */
    int present = 1;
    double dflt = 0.0;
    assert_int_equal(plumby_num(&p, "samples", 0, 7.3, &dflt, &present), PLUMB_OK);
    assert_false(present);
    assert_rel(dflt, 7.3, 0.0);
    plumb_diag_clear(&d);
    assert_int_equal(plumby_num(&p, "samples", 1, 0.0, &dflt, NULL), PLUMB_EKEY);
    assert_string_equal(d.key, "payload.samples");
    assert_non_null(strstr(d.message, "required key 'samples' is missing from payload"));
    plumby_free(root);
}

static void test_counts_and_texts_are_refused_when_malformed(void **state)
{
    (void)state;
    plumb_diag d;
    plumby_node *root = NULL;
    assert_int_equal(checked("payload: {samples: 12x, name: \"a\\x07b\"}\n", &d, &root),
                     PLUMB_OK);
    plumby_ctx ctx = {.file = "t.yaml", .units = units, .diag = &d};
    plumby_map m, p;
    plumby_map_init(&m, &ctx, root, &top, "");
    plumby_sub(&m, "payload", &p);
    unsigned long long n = 0;
    plumb_diag_clear(&d);
    assert_int_equal(plumby_count(&p, "samples", 1, 1, 100, &n), PLUMB_EINVAL);
    assert_string_equal(d.key, "payload.samples");
    assert_non_null(strstr(d.message, "expected a whole number 1 .. 100, found '12x'"));
    char text[8];
    plumb_diag_clear(&d);
    assert_int_equal(plumby_text(&p, "name", NULL, text, sizeof text), PLUMB_EINVAL);
    assert_non_null(strstr(d.message, "control character 0x07"));
    plumby_free(root);

    assert_int_equal(checked("payload: {samples: 101, name: abcdefgh}\n", &d, &root), PLUMB_OK);
    plumby_map_init(&m, &ctx, root, &top, "");
    plumby_sub(&m, "payload", &p);
    plumb_diag_clear(&d);
    assert_int_equal(plumby_count(&p, "samples", 1, 1, 100, &n), PLUMB_ERANGE);
    plumb_diag_clear(&d);
    /* 8 characters do not fit 8 bytes with the NUL */
    assert_int_equal(plumby_text(&p, "name", NULL, text, sizeof text), PLUMB_ERANGE);
    assert_non_null(strstr(d.message, "text of 8 bytes; at most 7 are accepted"));
    plumby_free(root);

    assert_int_equal(checked("payload: {samples: 100, name: abcdefg}\n", &d, &root), PLUMB_OK);
    plumby_map_init(&m, &ctx, root, &top, "");
    plumby_sub(&m, "payload", &p);
    assert_int_equal(plumby_count(&p, "samples", 1, 1, 100, &n), PLUMB_OK);
    assert_int_equal(n, 100);
    assert_int_equal(plumby_text(&p, "name", NULL, text, sizeof text), PLUMB_OK);
    assert_string_equal(text, "abcdefg");
    plumby_free(root);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_keys_and_values_carry_one_based_lines_and_columns),
        cmocka_unit_test(test_columns_count_characters_not_bytes_after_utf8_text),
        cmocka_unit_test(test_a_byte_order_mark_is_not_content),
        cmocka_unit_test(test_lines_ended_by_crlf_are_counted_once),
        cmocka_unit_test(test_a_duplicate_key_is_refused_at_the_second_naming_the_first),
        cmocka_unit_test(test_a_duplicate_key_in_a_nested_map_names_its_dotted_key),
        cmocka_unit_test(test_a_tab_in_the_indentation_is_refused_where_it_is),
        cmocka_unit_test(test_a_tab_inside_a_value_is_refused),
        cmocka_unit_test(test_anchors_aliases_and_tags_are_refused),
        cmocka_unit_test(test_bytes_that_are_not_utf8_are_refused_where_the_sequence_starts),
        cmocka_unit_test(test_a_second_document_is_refused),
        cmocka_unit_test(test_empty_text_comments_only_and_a_null_document_are_refused),
        cmocka_unit_test(test_nesting_to_the_limit_is_taken_and_one_deeper_is_refused),
        cmocka_unit_test(test_a_map_of_the_most_keys_is_taken_and_one_more_is_refused),
        cmocka_unit_test(test_a_nul_character_in_a_value_is_refused),
        cmocka_unit_test(test_a_key_that_is_not_a_scalar_is_refused),
        cmocka_unit_test(test_malformed_yaml_is_refused_with_a_position),
        cmocka_unit_test(test_an_override_is_located_on_its_own_line_with_its_column_offset),
        cmocka_unit_test(test_read_file_takes_a_file_at_the_limit_and_refuses_one_byte_more),
        cmocka_unit_test(test_a_copy_is_deep_and_keeps_positions_and_origin),
        cmocka_unit_test(test_descriptions_quote_short_scalars_and_cut_long_ones),
        cmocka_unit_test(test_null_is_a_plain_empty_tilde_or_null_and_never_quoted),
        cmocka_unit_test(test_an_unknown_key_is_refused_with_a_did_you_mean),
        cmocka_unit_test(test_a_map_where_a_number_belongs_is_refused_saying_what_was_expected),
        cmocka_unit_test(test_numbers_are_read_in_si_and_refused_outside_their_range),
        cmocka_unit_test(test_counts_and_texts_are_refused_when_malformed),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
