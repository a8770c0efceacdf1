/*
 * sha256.c - SHA-256 (NIST FIPS 180-4, Secure Hash Standard, 2015).
 *
 * Per 512-bit block M(i), with the message schedule (section 6.2.2)
 *     W_t = M_t                                          0 <= t <= 15
 *     W_t = s1(W_t-2) + W_t-7 + s0(W_t-15) + W_t-16      16 <= t <= 63
 * and 64 rounds of
 *     T1 = h + S1(e) + Ch(e,f,g) + K_t + W_t,  T2 = S0(a) + Maj(a,b,c)
 * where S0/S1/s0/s1 are the rotations of section 4.1.2 and K_t the
 * constants of section 4.2.2. Padding: a 1 bit, zeros, the 64-bit
 * big-endian bit length (section 5.1.1).
 */
#include <string.h>

#include "io/sha256.h"

/* First 32 bits of the fractional parts of the cube roots of the first
 * 64 primes (FIPS 180-4 section 4.2.2). */
static const uint32_t k256[64] = {
    0x428a2f98u, 0x71374491u, 0xb5c0fbcfu, 0xe9b5dba5u, 0x3956c25bu, 0x59f111f1u, 0x923f82a4u,
    0xab1c5ed5u, 0xd807aa98u, 0x12835b01u, 0x243185beu, 0x550c7dc3u, 0x72be5d74u, 0x80deb1feu,
    0x9bdc06a7u, 0xc19bf174u, 0xe49b69c1u, 0xefbe4786u, 0x0fc19dc6u, 0x240ca1ccu, 0x2de92c6fu,
    0x4a7484aau, 0x5cb0a9dcu, 0x76f988dau, 0x983e5152u, 0xa831c66du, 0xb00327c8u, 0xbf597fc7u,
    0xc6e00bf3u, 0xd5a79147u, 0x06ca6351u, 0x14292967u, 0x27b70a85u, 0x2e1b2138u, 0x4d2c6dfcu,
    0x53380d13u, 0x650a7354u, 0x766a0abbu, 0x81c2c92eu, 0x92722c85u, 0xa2bfe8a1u, 0xa81a664bu,
    0xc24b8b70u, 0xc76c51a3u, 0xd192e819u, 0xd6990624u, 0xf40e3585u, 0x106aa070u, 0x19a4c116u,
    0x1e376c08u, 0x2748774cu, 0x34b0bcb5u, 0x391c0cb3u, 0x4ed8aa4au, 0x5b9cca4fu, 0x682e6ff3u,
    0x748f82eeu, 0x78a5636fu, 0x84c87814u, 0x8cc70208u, 0x90befffau, 0xa4506cebu, 0xbef9a3f7u,
    0xc67178f2u,
};

static uint32_t rotr(uint32_t x, unsigned n)
{
    return (x >> n) | (x << (32u - n));
}

/* Processes one 64-byte block (FIPS 180-4 section 6.2.2). */
static void compress(uint32_t h[8], const unsigned char *p)
{
    uint32_t w[64];
    for (unsigned t = 0; t < 16; t++)
        w[t] = (uint32_t)p[4 * t] << 24 | (uint32_t)p[4 * t + 1] << 16 |
               (uint32_t)p[4 * t + 2] << 8 | (uint32_t)p[4 * t + 3];
    for (unsigned t = 16; t < 64; t++) {
        uint32_t s0 = rotr(w[t - 15], 7) ^ rotr(w[t - 15], 18) ^ (w[t - 15] >> 3);
        uint32_t s1 = rotr(w[t - 2], 17) ^ rotr(w[t - 2], 19) ^ (w[t - 2] >> 10);
        w[t] = s1 + w[t - 7] + s0 + w[t - 16];
    }
    uint32_t a = h[0], b = h[1], c = h[2], d = h[3], e = h[4], f = h[5], g = h[6], hh = h[7];
    for (unsigned t = 0; t < 64; t++) {
        uint32_t S1 = rotr(e, 6) ^ rotr(e, 11) ^ rotr(e, 25);
        uint32_t ch = (e & f) ^ (~e & g);
        uint32_t t1 = hh + S1 + ch + k256[t] + w[t];
        uint32_t S0 = rotr(a, 2) ^ rotr(a, 13) ^ rotr(a, 22);
        uint32_t maj = (a & b) ^ (a & c) ^ (b & c);
        uint32_t t2 = S0 + maj;
        hh = g;
        g = f;
        f = e;
        e = d + t1;
        d = c;
        c = b;
        b = a;
        a = t1 + t2;
    }
    h[0] += a;
    h[1] += b;
    h[2] += c;
    h[3] += d;
    h[4] += e;
    h[5] += f;
    h[6] += g;
    h[7] += hh;
}

void plumbp_sha256_init(plumbp_sha256 *ctx)
{
    /* First 32 bits of the fractional parts of the square roots of the
     * first 8 primes (FIPS 180-4 section 5.3.3). */
    static const uint32_t h0[8] = {0x6a09e667u, 0xbb67ae85u, 0x3c6ef372u, 0xa54ff53au,
                                   0x510e527fu, 0x9b05688cu, 0x1f83d9abu, 0x5be0cd19u};
    memcpy(ctx->h, h0, sizeof h0);
    ctx->n_bytes = 0;
    ctx->n_blk = 0;
}

void plumbp_sha256_update(plumbp_sha256 *ctx, const void *data, size_t n)
{
    const unsigned char *p = data;
    ctx->n_bytes += n;
    if (ctx->n_blk > 0) {
        size_t take = sizeof ctx->blk - ctx->n_blk;
        if (take > n)
            take = n;
        memcpy(ctx->blk + ctx->n_blk, p, take);
        ctx->n_blk += take;
        p += take;
        n -= take;
        if (ctx->n_blk < sizeof ctx->blk)
            return;
        compress(ctx->h, ctx->blk);
        ctx->n_blk = 0;
    }
    for (; n >= sizeof ctx->blk; p += sizeof ctx->blk, n -= sizeof ctx->blk)
        compress(ctx->h, p);
    memcpy(ctx->blk, p, n);
    ctx->n_blk = n;
}

void plumbp_sha256_final(plumbp_sha256 *ctx, unsigned char out[PLUMBP_SHA256_BYTES])
{
    uint64_t bits = ctx->n_bytes * 8u;
    unsigned char pad[72] = {0x80};
    /* 1 bit, then zeros up to 56 mod 64, then the 8-byte length. */
    size_t n_pad = (ctx->n_blk < 56 ? 56 : 120) - ctx->n_blk;
    for (unsigned i = 0; i < 8; i++)
        pad[n_pad + i] = (unsigned char)(bits >> (56 - 8 * i));
    uint64_t n_msg = ctx->n_bytes;
    plumbp_sha256_update(ctx, pad, n_pad + 8);
    ctx->n_bytes = n_msg;
    for (unsigned i = 0; i < 8; i++) {
        out[4 * i] = (unsigned char)(ctx->h[i] >> 24);
        out[4 * i + 1] = (unsigned char)(ctx->h[i] >> 16);
        out[4 * i + 2] = (unsigned char)(ctx->h[i] >> 8);
        out[4 * i + 3] = (unsigned char)ctx->h[i];
    }
}

void plumbp_sha256_hex(const void *data, size_t n, char hex[PLUMBP_SHA256_HEX])
{
    static const char digits[] = "0123456789abcdef";
    plumbp_sha256 ctx;
    unsigned char d[PLUMBP_SHA256_BYTES];
    plumbp_sha256_init(&ctx);
    plumbp_sha256_update(&ctx, data, n);
    plumbp_sha256_final(&ctx, d);
    for (unsigned i = 0; i < PLUMBP_SHA256_BYTES; i++) {
        hex[2 * i] = digits[d[i] >> 4];
        hex[2 * i + 1] = digits[d[i] & 0x0fu];
    }
    hex[2 * PLUMBP_SHA256_BYTES] = '\0';
}
