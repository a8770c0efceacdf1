/*
 * dispersion_rng.c - the zone's random stream: sample i of seed s uses
 * outputs 2i+1 and 2i+2 of the splitmix64 sequence started at mix(s)
 * (Steele, Lea & Flood, OOPSLA 2014), which fill the 88-bit state of a
 * combined Tausworthe generator with the taus88 parameters (P. L'Ecuyer,
 * Math. Comp. 65, 203-213, 1996), given to GSL as a gsl_rng_type. Why it
 * is not gsl_rng_taus2: see dispersion.c.
 */
#include "uq/dispersion_int.h"

#define SPLITMIX_GAMMA UINT64_C(0x9E3779B97F4A7C15)

/* splitmix64 output for counter value x (Steele, Lea & Flood 2014). */
uint64_t plumbp_splitmix64_mix(uint64_t z)
{
    z = (z ^ (z >> 30)) * UINT64_C(0xBF58476D1CE4E5B9);
    z = (z ^ (z >> 27)) * UINT64_C(0x94D049BB133111EB);
    return z ^ (z >> 31);
}

/* State of sample `index` of stream `seed`: outputs 2 index + 1 and
 * 2 index + 2 of the splitmix64 sequence whose counter starts at
 * mix(seed). The Tausworthe components need s1 >= 2, s2 >= 8, s3 >= 16
 * (L'Ecuyer 1996), fixed as GSL's taus2 does. */
void plumbp_taus_seed(taus_state *t, unsigned long seed, size_t index)
{
    uint64_t base = plumbp_splitmix64_mix((uint64_t)seed + SPLITMIX_GAMMA);
    uint64_t c = base + (2u * (uint64_t)index + 1u) * SPLITMIX_GAMMA;
    uint64_t a = plumbp_splitmix64_mix(c);
    uint64_t b = plumbp_splitmix64_mix(c + SPLITMIX_GAMMA);
    t->s1 = (uint32_t)(a >> 32);
    t->s2 = (uint32_t)a;
    t->s3 = (uint32_t)(b >> 32);
    if (t->s1 < 2u)
        t->s1 += 2u;
    if (t->s2 < 8u)
        t->s2 += 8u;
    if (t->s3 < 16u)
        t->s3 += 16u;
}

static unsigned long taus_get(void *vstate)
{
    taus_state *t = vstate;
    t->s1 = ((t->s1 & UINT32_C(4294967294)) << 12) ^ (((t->s1 << 13) ^ t->s1) >> 19);
    t->s2 = ((t->s2 & UINT32_C(4294967288)) << 4) ^ (((t->s2 << 2) ^ t->s2) >> 25);
    t->s3 = ((t->s3 & UINT32_C(4294967280)) << 17) ^ (((t->s3 << 3) ^ t->s3) >> 11);
    return (unsigned long)(t->s1 ^ t->s2 ^ t->s3);
}

double plumbp_taus_get_double(void *vstate)
{
    return (double)taus_get(vstate) / 4294967296.0;
}

static void taus_set(void *vstate, unsigned long seed)
{
    plumbp_taus_seed(vstate, seed, 0);
}

const gsl_rng_type plumbp_rng_type = {
    "plumb-taus88-splitmix64", 0xffffffffUL, 0, sizeof(taus_state),
    taus_set, taus_get, plumbp_taus_get_double,
};

