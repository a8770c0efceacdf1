/*
 * sha256.h - SHA-256 message digest (internal; not installed).
 *
 * Method: NIST FIPS 180-4, Secure Hash Standard (2015), sections 4.1.2,
 * 4.2.2, 5.1.1, 5.3.3 and 6.2. Used for the profile fingerprint that
 * every report prints (style.md rule 8).
 *
 * Ownership: a plumbp_sha256 context is plain caller storage.
 */
#ifndef PLUMB_SHA256_H
#define PLUMB_SHA256_H

#include <stddef.h>
#include <stdint.h>

enum { PLUMBP_SHA256_BYTES = 32, PLUMBP_SHA256_HEX = 65 };

typedef struct plumbp_sha256 {
    uint32_t h[8];          /* intermediate hash value H(i) */
    uint64_t n_bytes;       /* message length so far, bytes */
    unsigned char blk[64];  /* partial 512-bit block */
    size_t n_blk;           /* bytes in blk, 0..63 */
} plumbp_sha256;

/* Starts a digest (H(0) of FIPS 180-4 section 5.3.3). Can't fail. */
void plumbp_sha256_init(plumbp_sha256 *ctx);

/* Adds n bytes of message. Can't fail. */
void plumbp_sha256_update(plumbp_sha256 *ctx, const void *data, size_t n);

/* Pads (section 5.1.1) and writes the 32-byte digest. Can't fail. */
void plumbp_sha256_final(plumbp_sha256 *ctx, unsigned char out[PLUMBP_SHA256_BYTES]);

/* Digest of one buffer as 64 lowercase hex digits and a NUL. Can't fail. */
void plumbp_sha256_hex(const void *data, size_t n, char hex[PLUMBP_SHA256_HEX]);

#endif /* PLUMB_SHA256_H */
