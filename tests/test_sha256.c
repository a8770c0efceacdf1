/*
 * test_sha256.c - SHA-256 against the published example vectors.
 *
 * Sources: NIST FIPS 180-2 (2002), Appendix B.1 ("abc"), B.2 (the 448-bit
 * message) and B.3 (one million 'a'); the empty message digest from the
 * NIST "Example Algorithms" SHA-256 sheet (from memory, confirmed with GNU
 * coreutils sha256sum). The padding-boundary lengths 55, 56, 63, 64 and 119
 * were computed with GNU coreutils sha256sum 9.1, an independent
 * implementation.
 */
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "plumb_test.h"
#include "io/sha256.h"

static void test_digest_of_abc_matches_fips_180_2_appendix_b1(void **state)
{
    (void)state;
    char hex[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex("abc", 3, hex);
    assert_string_equal(hex, "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad");
}

static void test_digest_of_448_bit_message_matches_fips_180_2_appendix_b2(void **state)
{
    (void)state;
    const char *msg = "abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq";
    assert_int_equal(strlen(msg) * 8, 448);
    char hex[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(msg, strlen(msg), hex);
    assert_string_equal(hex, "248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1");
}

static void test_digest_of_empty_message_matches_nist_example(void **state)
{
    (void)state;
    char hex[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex("", 0, hex);
    assert_string_equal(hex, "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855");
}

/* One million 'a' fed in uneven pieces (7, 13, 1009 ... bytes), so that the
 * partial-block path of update is crossed many times. */
static void test_million_a_in_uneven_pieces_matches_fips_180_2_appendix_b3(void **state)
{
    (void)state;
    char piece[1009];
    memset(piece, 'a', sizeof piece);
    static const size_t sizes[] = {7, 13, 1009, 64, 1, 63, 500};
    plumbp_sha256 ctx;
    plumbp_sha256_init(&ctx);
    size_t left = 1000000, k = 0;
    while (left > 0) {
        size_t n = sizes[k++ % (sizeof sizes / sizeof sizes[0])];
        if (n > left)
            n = left;
        plumbp_sha256_update(&ctx, piece, n);
        left -= n;
    }
    unsigned char d[PLUMBP_SHA256_BYTES];
    plumbp_sha256_final(&ctx, d);
    static const unsigned char want[PLUMBP_SHA256_BYTES] = {
        0xcd, 0xc7, 0x6e, 0x5c, 0x99, 0x14, 0xfb, 0x92, 0x81, 0xa1, 0xc7,
        0xe2, 0x84, 0xd7, 0x3e, 0x67, 0xf1, 0x80, 0x9a, 0x48, 0xa4, 0x97,
        0x20, 0x0e, 0x04, 0x6d, 0x39, 0xcc, 0xc7, 0x11, 0x2c, 0xd0};
    assert_memory_equal(d, want, sizeof want);
}

/* Lengths either side of the 56-byte padding boundary and of one and two
 * blocks; digests from GNU coreutils sha256sum. */
static void test_padding_boundary_lengths_match_coreutils_sha256sum(void **state)
{
    (void)state;
    static const struct {
        size_t n;
        const char *hex;
    } cases[] = {
        {55, "9f4390f8d30c2dd92ec9f095b65e2b9ae9b0a925a5258e241c9f1e910f734318"},
        {56, "b35439a4ac6f0948b6d6f9e3c6af0f5f590ce20f1bde7090ef7970686ec6738a"},
        {63, "7d3e74a05d7db15bce4ad9ec0658ea98e3f06eeecf16b4c6fff2da457ddc2f34"},
        {64, "ffe054fe7ae0cb6dc65c3af9b61d5209f439851db43d0ba5997337df154668eb"},
        {119, "31eba51c313a5c08226adf18d4a359cfdfd8d2e816b13f4af952f7ea6584dcfb"},
    };
    char msg[128];
    memset(msg, 'a', sizeof msg);
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        char hex[PLUMBP_SHA256_HEX];
        plumbp_sha256_hex(msg, cases[i].n, hex);
        assert_string_equal(hex, cases[i].hex);
    }
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_digest_of_abc_matches_fips_180_2_appendix_b1),
        cmocka_unit_test(test_digest_of_448_bit_message_matches_fips_180_2_appendix_b2),
        cmocka_unit_test(test_digest_of_empty_message_matches_nist_example),
        cmocka_unit_test(test_million_a_in_uneven_pieces_matches_fips_180_2_appendix_b3),
        cmocka_unit_test(test_padding_boundary_lengths_match_coreutils_sha256sum),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
