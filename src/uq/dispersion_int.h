/*
 * dispersion_int.h - what the files of the zone's Monte Carlo share:
 * dispersion.c (one pass: the workers, the in-order merge, the
 * statistics, plumb_zone_run), dispersion_rng.c (the random stream),
 * dispersion_sampler.c (the sampler of uncertain inputs),
 * dispersion_bounds.c (binomial bounds: quantile ranks, Clopper-Pearson)
 * and dispersion_sketch.c (the log-linear histograms). The named
 * constants, the sampler's and the histogram's definitions, and the
 * functions called across files (plumbp_ prefix). Internal to libplumb;
 * not installed.
 */
#ifndef PLUMB_DISPERSION_INT_H
#define PLUMB_DISPERSION_INT_H

#include <stddef.h>
#include <stdint.h>

#include <gsl/gsl_rng.h>

#include "plumb/constants.h"
#include "plumb/dispersion.h"
#include "core/internal.h"
#include "io/keys.h"

/* ---- named constants ---------------------------------------------------- */

/* Default level of every interval. */
#define ZONE_CI_LEVEL 0.95
/* Default samples per work unit and pilot size. */
#define ZONE_BLOCK 256u
#define ZONE_PILOT 1024u
/* Blocks a worker may run ahead of the merge, per thread. */
#define ZONE_WINDOW_PER_THREAD 4u
/* Redraws allowed for one truncated normal value: with at least half the
 * distribution inside the range, failing 64 times has probability 2^-64. */
#define TRUNC_MAX_DRAWS 64
/* Least fraction of a normal distribution that must lie inside the key's
 * range for truncation to be accepted. */
#define TRUNC_MIN_MASS 0.5
/* A tail of a normal beyond an end of the key's range that is reported as
 * cutting it: smaller tails (past about 7 sd, e.g. a wind speed's bound at
 * the speed of sound) are still enforced but not worth a line. */
#define TRUNC_TAIL_SHOWN 1e-12
/* Level of the impact ellipse. */
#define ELLIPSE_LEVEL 0.95
/* Degrees in a full turn. */
#define FULL_TURN_DEG 360.0
#define DEG_PER_RAD (180.0 / PLUMB_PI)

/* Histogram layout: 2^SK_SUB_BITS bins per octave, SK_OCTAVES octaves,
 * floor 2^-SK_FLOOR_SHIFT of the pilot scale. */
#define SK_SUB_BITS 12
#define SK_SUB (1u << SK_SUB_BITS)
#define SK_OCTAVES 44
#define SK_FLOOR_SHIFT 20
#define SK_SIDE ((size_t)2 + (size_t)SK_OCTAVES * SK_SUB)
/* Groups of SK_SUB bins whose totals are kept, so that a rank is found
 * without visiting every bin: bin 0, the octaves, the overflow bin. */
#define SK_GROUPS ((size_t)SK_OCTAVES + 2)

/* Binomial window: mode +- (BINOM_SD_SPAN sd + BINOM_PAD). */
#define BINOM_SD_SPAN 12.0
#define BINOM_PAD 50.0
/* Bisection steps for a Clopper-Pearson bound (the interval halves each). */
#define CP_MAX_STEPS 200

/* ---- the random stream -------------------------------------------------- */

typedef struct taus_state {
    uint32_t s1, s2, s3;
} taus_state;

/* ---- keys ----------------------------------------------------------------- */

typedef enum target_kind {
    TGT_FIELD = 0,    /* a double of the spec, by offset */
    TGT_SPEED,        /* release.velocity.speed */
    TGT_HEADING,      /* release.velocity.heading */
    TGT_CLIMB,        /* release.velocity.climb */
    TGT_CHOICE        /* payload.attitude: the drag of one attitude */
} target_kind;

/* Range of a key's values; angles wrap instead. */
typedef struct key_rule {
    const char *key;   /* normalised dotted key ("descent[1].cd" -> "descent.cd") */
    double lo, hi;     /* range */
    int lo_open;       /* 1: lo itself is not allowed */
    int angle;         /* 1: degrees, wrapped into [0, 360) */
} key_rule;

/* ---- the sampler -------------------------------------------------------- */

typedef struct entry {
    plumb_uncertainty u;     /* as given */
    target_kind target;      /* where the value goes */
    size_t offset;           /* TGT_FIELD: byte offset of the double in the spec */
    key_rule rule;           /* range and angle flag */
    int truncated;           /* normal with a finite end of range */
    int cut_lo, cut_hi;      /* which ends cut a tail above TRUNC_TAIL_SHOWN */
    double a, c, b;          /* uniform/triangular: lo, mode, hi, unwrapped for angles */
    double cum[PLUMB_MAX_ATTITUDES]; /* choice: cumulative weights, the last 1 */
} entry;

struct plumb_sampler {
    plumb_fall_spec base;    /* the spec without its uncertainty */
    size_t n;
    entry e[PLUMB_ZONE_MAX_INPUTS];
    int has_speed, has_heading, has_climb;
    int choice;              /* index of the payload.attitude entry, or -1 */
    double base_speed_m_s, base_heading_deg, base_up_m_s;
    gsl_rng *rng;
};

/* ---- histograms ----------------------------------------------------------- */

typedef struct sketch {
    int two_sided;          /* signed values around centre */
    double centre;          /* one-sided: 0 */
    double floor;           /* width of bin 0, a power of 2 */
    uint32_t *pos, *neg;    /* SK_SIDE counts each; neg NULL when one-sided */
    uint32_t gpos[SK_GROUPS], gneg[SK_GROUPS]; /* totals by group (sk_group) */
    double max_pos, max_neg;/* largest distance from centre on each side */
    double min, max;        /* extremes of the values */
    size_t n;
} sketch;

/* dispersion_rng.c */
uint64_t plumbp_splitmix64_mix(uint64_t z);
void plumbp_taus_seed(taus_state *t, unsigned long seed, size_t index);
double plumbp_taus_get_double(void *vstate);
extern const gsl_rng_type plumbp_rng_type;

/* dispersion_sketch.c */
void plumbp_sk_add(sketch *s, double v);
double plumbp_sk_rank(const sketch *s, size_t r);
void plumbp_sk_configure(sketch *s, double *v, size_t n, double *scratch);
void plumbp_sk_reset(sketch *s);

#endif
