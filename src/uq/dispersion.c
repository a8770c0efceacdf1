/*
 * dispersion.c - the Monte Carlo clearance zone (include/plumb/dispersion.h,
 * design.md section 3).
 *
 * Methods and sources:
 *  - Random streams: sample i of seed s uses outputs 2i+1 and 2i+2 of the
 *    splitmix64 sequence started at mix(s) (Steele, Lea & Flood, OOPSLA
 *    2014), which fill the 88-bit state of a combined Tausworthe generator
 *    with the taus88 parameters (P. L'Ecuyer, "Maximally equidistributed
 *    combined Tausworthe generators", Math. Comp. 65, 203-213, 1996; the
 *    recurrence GSL's taus2 runs). It is given to GSL as a gsl_rng_type, so
 *    GSL's samplers draw from it. Why not gsl_rng_taus2 itself: its
 *    gsl_rng_set keeps 32 bits of the seed, and 1e7 samples seeded through
 *    32 bits would share about 1e4 streams (birthday bound n^2 / 2^33).
 *  - Normal draws: gsl_ran_gaussian_ziggurat (Marsaglia & Tsang, J. Stat.
 *    Softw. 5(8), 2000). Truncation to a key's range by rejection.
 *  - Triangular draws by the inverse distribution function (S. Kotz,
 *    J. R. van Dorp, Beyond Beta, World Scientific 2004, ch. 1):
 *    x = a + sqrt(u (b-a)(c-a)) for u < (c-a)/(b-a), else
 *    x = b - sqrt((1-u)(b-a)(b-c)).
 *  - Streaming mean and covariance: B. P. Welford, Technometrics 4, 419
 *    (1962), in sample order.
 *  - Percentiles from a log-linear histogram: bin 0 holds [0, f), then each
 *    octave [f 2^k, f 2^(k+1)) is cut into 2^12 equal bins (the layout of
 *    a floating-point number, as in G. Tene's HdrHistogram), so a bin is at
 *    most 2^-12 of its value wide. The scale f = 2^-20 x (pilot median) is
 *    set from the first samples, which are kept until then; values beyond
 *    2^44 f fall into one overflow bin whose top is the exact maximum.
 *    Counts are integers, so the order of insertion does not matter.
 *  - Binomial bounds (Clopper-Pearson 1934; order-statistic intervals,
 *    David & Nagaraja 2003, sec. 7.1) from the binomial distribution itself,
 *    summed over mode +- (12 sd + 50) with the ratio recurrence
 *    pmf(j+1) / pmf(j) = (n-j) / (j+1) x p / (1-p), self-normalised (the
 *    mass outside is below 1e-30). I_x(k, n-k+1) = P(Bin(n, x) >= k) makes
 *    this the beta-quantile form of the same bounds. GSL's
 *    gsl_cdf_beta_Pinv is not used: measured here (GSL 2.7) it returns NaN
 *    for a = 5000, b = 5001 and does not return for a = b = 5e6;
 *    gsl_cdf_beta_P returns NaN for a = b = 5e6.
 *  - The 95% ellipse: chi-square with 2 degrees of freedom is exponential
 *    with mean 2, so its q-quantile is -2 ln(1 - q) (5.991 at 0.95).
 *
 * Threads: blocks of samples are handed out in order; each worker owns a
 * trajectory workspace and a sampler (its random stream) and writes its
 * block's records into a ring of slots. Blocks are merged strictly in block
 * order, under the lock, by whichever worker completes the next one, so
 * every statistic sees the samples in sample order: the result is that of
 * a serial run, for any thread count. A worker may run at most `window`
 * blocks ahead of the merge, which bounds the memory.
 */
#include <float.h>
#include <stdarg.h>
#include <stdio.h>
#include <math.h>
#include <stddef.h>
#include <pthread.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_randist.h>
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
/* Level of the impact ellipse. */
#define ELLIPSE_LEVEL 0.95
/* Degrees in a full turn. */
#define FULL_TURN_DEG 360.0
#define DEG_PER_RAD (180.0 / PLUMB_PI)
#define RAD_PER_DEG (PLUMB_PI / 180.0)

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

#define SPLITMIX_GAMMA UINT64_C(0x9E3779B97F4A7C15)

/* splitmix64 output for counter value x (Steele, Lea & Flood 2014). */
static uint64_t splitmix64_mix(uint64_t z)
{
    z = (z ^ (z >> 30)) * UINT64_C(0xBF58476D1CE4E5B9);
    z = (z ^ (z >> 27)) * UINT64_C(0x94D049BB133111EB);
    return z ^ (z >> 31);
}

/* State of sample `index` of stream `seed`: outputs 2 index + 1 and
 * 2 index + 2 of the splitmix64 sequence whose counter starts at
 * mix(seed). The Tausworthe components need s1 >= 2, s2 >= 8, s3 >= 16
 * (L'Ecuyer 1996), fixed as GSL's taus2 does. */
static void taus_seed(taus_state *t, unsigned long seed, size_t index)
{
    uint64_t base = splitmix64_mix((uint64_t)seed + SPLITMIX_GAMMA);
    uint64_t c = base + (2u * (uint64_t)index + 1u) * SPLITMIX_GAMMA;
    uint64_t a = splitmix64_mix(c);
    uint64_t b = splitmix64_mix(c + SPLITMIX_GAMMA);
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

static double taus_get_double(void *vstate)
{
    return (double)taus_get(vstate) / 4294967296.0;
}

static void taus_set(void *vstate, unsigned long seed)
{
    taus_seed(vstate, seed, 0);
}

static const gsl_rng_type plumb_rng_type = {
    "plumb-taus88-splitmix64", 0xffffffffUL, 0, sizeof(taus_state),
    taus_set, taus_get, taus_get_double,
};

/* ---- keys ----------------------------------------------------------------- */

typedef enum target_kind {
    TGT_FIELD = 0,    /* a double of the spec, by offset */
    TGT_SPEED,        /* release.velocity.speed */
    TGT_HEADING,      /* release.velocity.heading */
    TGT_CLIMB         /* release.velocity.climb */
} target_kind;

/* Range of a key's values; angles wrap instead. */
typedef struct key_rule {
    const char *key;   /* normalised dotted key ("descent[1].cd" -> "descent.cd") */
    double lo, hi;     /* range */
    int lo_open;       /* 1: lo itself is not allowed */
    int angle;         /* 1: degrees, wrapped into [0, 360) */
} key_rule;

#define INF_ HUGE_VAL
static const key_rule unbounded_rule = {"", -INF_, INF_, 0, 0};

/* "descent[1].fill_time" -> "descent.fill_time"; other keys unchanged. */
static void normalise_key(const char *key, char *out, size_t size)
{
    const char *br = strchr(key, '[');
    if (strncmp(key, "descent[", 8) == 0 && br) {
        const char *close = strchr(br, ']');
        if (close) {
            snprintf(out, size, "descent%s", close + 1);
            return;
        }
    }
    plumbp_strlcpy(out, key, size);
}

/* The range of a key from the key table (io/keys.h); 0 for a key not in it. */
static int find_rule(const char *key, key_rule *out)
{
    const plumbp_key *k = plumbp_key_find(key, NULL, NULL);
    if (!k)
        return 0;
    out->key = k->key;
    out->angle = k->angle;
    if (k->angle) {
        out->lo = 0.0;
        out->hi = FULL_TURN_DEG;
        out->lo_open = 0;
    } else {
        plumbp_key_bounds(k, &out->lo, &out->hi, &out->lo_open);
    }
    return 1;
}

static double wrap_deg(double a)
{
    double w = fmod(a, FULL_TURN_DEG);
    if (w < 0.0)
        w += FULL_TURN_DEG;
    if (w >= FULL_TURN_DEG)
        w = 0.0;
    return w;
}

/* ---- the sampler -------------------------------------------------------- */

typedef struct entry {
    plumb_uncertainty u;     /* as given */
    target_kind target;      /* where the value goes */
    size_t offset;           /* TGT_FIELD: byte offset of the double in the spec */
    key_rule rule;           /* range and angle flag */
    int truncated;           /* normal with a finite end of range */
    double a, c, b;          /* uniform/triangular: lo, mode, hi, unwrapped for angles */
} entry;

struct plumb_sampler {
    plumb_fall_spec base;    /* the spec without its uncertainty */
    size_t n;
    entry e[PLUMB_ZONE_MAX_INPUTS];
    int has_speed, has_heading, has_climb;
    double base_speed_m_s, base_heading_deg, base_up_m_s;
    gsl_rng *rng;
};

size_t plumb_sampler_count(const plumb_sampler *s)
{
    return s ? s->n : 0;
}

int plumb_sampler_truncated(const plumb_sampler *s, size_t i, double *lo, double *hi)
{
    if (!s || i >= s->n || !s->e[i].truncated)
        return 0;
    if (lo)
        *lo = s->e[i].rule.lo;
    if (hi)
        *hi = s->e[i].rule.hi;
    return 1;
}

void plumb_sampler_free(plumb_sampler *s)
{
    if (!s)
        return;
    if (s->rng)
        gsl_rng_free(s->rng);
    free(s);
}

static const char *dist_name(plumb_dist_kind k)
{
    switch (k) {
    case PLUMB_DIST_UNIFORM: return "uniform";
    case PLUMB_DIST_TRIANGULAR: return "triangular";
    default: return "normal";
    }
}

/* Whether x lies in the rule's range (lower end open or closed, upper closed). */
static int in_range(const key_rule *r, double x)
{
    if (r->lo_open ? !(x > r->lo) : !(x >= r->lo))
        return 0;
    return x <= r->hi;
}

/* The rule's range in words: "> 0", ">= 0", "0 to 10", "-90 to 90". */
static const char *range_text(const key_rule *r, char *buf, size_t size)
{
    if (isfinite(r->lo) && isfinite(r->hi))
        snprintf(buf, size, "%g to %g", r->lo, r->hi);
    else if (isfinite(r->lo))
        snprintf(buf, size, "%s %g", r->lo_open ? ">" : ">=", r->lo);
    else if (isfinite(r->hi))
        snprintf(buf, size, "<= %g", r->hi);
    else
        snprintf(buf, size, "any value");
    return buf;
}

/* Why a key resolved to a spec field still does not change this fall, or
 * NULL. norm is the normalised key; dev the descent device it addresses. */
static const char *no_effect(const plumb_fall_spec *b, const char *norm, const plumb_descent_spec *dev)
{
    const plumb_drag_spec *d = &b->drag;
    int fixed = d->model == PLUMB_DRAG_FIXED;
    if (strcmp(norm, "payload.drag.cd") == 0) {
        if (!fixed)
            return "the sphere drag model takes its drag coefficient from the Reynolds number";
        if (!(d->area_m2 > 0.0))
            return "the drag is given as cd_area, so cd is not used";
    }
    if (strcmp(norm, "payload.drag.area") == 0 && fixed && !(d->area_m2 > 0.0))
        return "the drag is given as cd_area, so area is not used";
    if (strcmp(norm, "payload.drag.cd_area") == 0 && (!fixed || d->area_m2 > 0.0))
        return "the drag is given as cd and area (or by a sphere model), so cd_area is not used";
    if (strcmp(norm, "payload.drag.diameter") == 0 && fixed)
        return "the diameter is used by the sphere drag models only";
    if (dev) {
        if (strcmp(norm, "descent.deploy.after") == 0 && dev->trigger != PLUMB_DEPLOY_AFTER)
            return "this device deploys below a height, not after a time";
        if (strcmp(norm, "descent.deploy.below") == 0 && dev->trigger != PLUMB_DEPLOY_BELOW)
            return "this device deploys after a time, not below a height";
        if (strcmp(norm, "descent.fill_time") == 0 && dev->fill_constant > 0.0)
            return "this device's fill time comes from its fill constant";
        if (strcmp(norm, "descent.fill_constant") == 0 && !(dev->diameter_m > 0.0))
            return "a fill constant needs the device's diameter";
    }
    const plumb_wind_spec *w = &b->wind;
    if ((strcmp(norm, "wind.speed") == 0 || strcmp(norm, "wind.from") == 0) &&
        w->profile == PLUMB_WIND_TABLE)
        return "the wind is given as a table";
    if (strcmp(norm, "wind.reference_height") == 0 &&
        (w->profile == PLUMB_WIND_UNIFORM || w->profile == PLUMB_WIND_TABLE))
        return "a uniform or tabulated wind has no reference height";
    if (strcmp(norm, "wind.exponent") == 0 && w->profile != PLUMB_WIND_POWER)
        return "the exponent belongs to the power-law wind profile";
    if (strcmp(norm, "wind.roughness") == 0 && w->profile != PLUMB_WIND_LOG)
        return "the roughness length belongs to the log-law wind profile";
    return NULL;
}

/* Checks an entry's distribution against its rule; fills e->a, b, c and
 * e->truncated. */
static plumb_status check_dist(entry *e, const char *source, plumb_diag *diag)
{
    const plumb_uncertainty *u = &e->u;
    const key_rule *r = &e->rule;
    const double *q = u->param;
    char rt[64];
    int np = u->kind == PLUMB_DIST_TRIANGULAR ? 3 : 2;
    for (int i = 0; i < np; i++)
        if (!isfinite(q[i]))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                  "the %s distribution's parameters must be finite numbers",
                                  dist_name(u->kind));
    switch (u->kind) {
    case PLUMB_DIST_NORMAL: {
        double mean = q[0], sd = q[1];
        if (sd < 0.0)
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                  "normal: the standard deviation must be >= 0, found %g", sd);
        e->truncated = !r->angle && (isfinite(r->lo) || isfinite(r->hi));
        if (!e->truncated)
            return PLUMB_OK;
        if (!in_range(r, mean))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                  "normal: the mean %g lies outside the key's range (%s)",
                                  mean, range_text(r, rt, sizeof rt));
        if (sd > 0.0) {
            double mass = gsl_cdf_ugaussian_P((r->hi - mean) / sd) -
                          gsl_cdf_ugaussian_P((r->lo - mean) / sd);
            if (!(mass >= TRUNC_MIN_MASS))
                return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                      "normal [%g, %g]: only %.0f%% of it lies in the key's range "
                                      "(%s); truncating it there would change it beyond "
                                      "recognition: give a smaller sd or a uniform or "
                                      "triangular distribution", mean, sd, 100.0 * mass,
                                      range_text(r, rt, sizeof rt));
        } else if (r->lo_open && !(mean > r->lo)) {
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                  "normal: the mean must be > %g", r->lo);
        }
        return PLUMB_OK;
    }
    case PLUMB_DIST_UNIFORM:
    case PLUMB_DIST_TRIANGULAR: {
        double a = q[0], b = u->kind == PLUMB_DIST_UNIFORM ? q[1] : q[2];
        double c = u->kind == PLUMB_DIST_UNIFORM ? 0.5 * (q[0] + q[1]) : q[1];
        if (r->angle) {
            if (b < a)
                b += FULL_TURN_DEG; /* a sector through north */
            if (u->kind == PLUMB_DIST_TRIANGULAR && c < a)
                c += FULL_TURN_DEG;
            if (!(b - a <= FULL_TURN_DEG))
                return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                      "%s: the sector from %g to %g deg is wider than a full turn",
                                      dist_name(u->kind), q[0], u->kind == PLUMB_DIST_UNIFORM ? q[1] : q[2]);
        } else if (b < a) {
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                  "%s: the low end %g is above the high end %g", dist_name(u->kind),
                                  a, b);
        }
        if (u->kind == PLUMB_DIST_TRIANGULAR && !(c >= a && c <= b))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                  "triangular: the mode %g must lie between the low end %g and "
                                  "the high end %g", q[1], q[0], q[2]);
        if (!r->angle && (!in_range(r, a) || !in_range(r, b)))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                                  "%s [%g .. %g] leaves the key's range (%s)",
                                  dist_name(u->kind), a, b, range_text(r, rt, sizeof rt));
        e->a = a;
        e->b = b;
        e->c = c;
        return PLUMB_OK;
    }
    default:
        return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, u->line, u->col, u->key,
                              "unknown distribution kind %d", (int)u->kind);
    }
}

plumb_status plumb_sampler_alloc(const plumb_fall_spec *base, const plumb_uncertainty *u,
                                 size_t n, const char *source, plumb_sampler **out,
                                 plumb_diag *diag)
{
    *out = NULL;
    if (!base || (n > 0 && !u))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_sampler_alloc: NULL argument");
    if (n > PLUMB_ZONE_MAX_INPUTS)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "uncertainty",
                               "%zu uncertain inputs; at most %d are sampled", n,
                               PLUMB_ZONE_MAX_INPUTS);
    plumb_sampler *s = calloc(1, sizeof *s);
    if (!s)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    s->base = *base;
    s->n = n;
    plumb_status st = PLUMB_OK;
    int has_east = 0, has_north = 0, has_up = 0;
    for (size_t i = 0; i < n && st == PLUMB_OK; i++) {
        entry *e = &s->e[i];
        e->u = u[i];
        e->u.key[sizeof e->u.key - 1] = '\0';
        const char *key = e->u.key;
        char norm[PLUMB_DIAG_KEY];
        normalise_key(key, norm, sizeof norm);
        if (!find_rule(key, &e->rule))
            e->rule = unbounded_rule;
        const plumb_descent_spec *dev = NULL;
        if (strcmp(norm, "release.velocity.speed") == 0) {
            e->target = TGT_SPEED;
        } else if (strcmp(norm, "release.velocity.heading") == 0) {
            e->target = TGT_HEADING;
        } else if (strcmp(norm, "release.velocity.climb") == 0) {
            e->target = TGT_CLIMB;
        } else {
            plumb_fall_spec probe = *base;
            double *f = plumb_fall_spec_field(&probe, key);
            const char *lo = (const char *)&probe, *hi = lo + sizeof probe;
            if (!f || (const char *)f < lo || (const char *)(f + 1) > hi) {
                const char *why = no_effect(base, norm, NULL);
                if (!why)
                    why = strncmp(norm, "atmosphere.", 11) == 0
                              ? "the atmosphere is built once per run, so it cannot vary from "
                                "fall to fall"
                          : strncmp(norm, "descent.", 8) == 0
                              ? "this payload has no such descent device or input"
                          : strstr(norm, "diameter")
                              ? "the area is derived from the diameter; put the uncertainty on "
                                "the area"
                              : "it is not a per-fall numeric input of this payload";
                st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, e->u.line, e->u.col, key,
                                    "cannot be sampled: %s", why);
                break;
            }
            e->target = TGT_FIELD;
            e->offset = (size_t)((const char *)f - lo);
            for (size_t k = 0; k < base->n_descent && k < PLUMB_MAX_DESCENT; k++) {
                const char *dk = (const char *)&probe.descent[k];
                if ((const char *)f >= dk && (const char *)f < dk + sizeof probe.descent[k])
                    dev = &base->descent[k];
            }
            if (e->offset == offsetof(plumb_fall_spec, velocity_m_s))
                has_east = 1;
            if (e->offset == offsetof(plumb_fall_spec, velocity_m_s) + sizeof(double))
                has_north = 1;
            if (e->offset == offsetof(plumb_fall_spec, velocity_m_s) + 2 * sizeof(double))
                has_up = 1;
        }
        const char *why = no_effect(base, norm, dev);
        if (!why && e->target == TGT_HEADING && !(hypot(base->velocity_m_s[0], base->velocity_m_s[1]) > 0.0)) {
            int speed_too = 0;
            for (size_t k = 0; k < n; k++) {
                char nk[PLUMB_DIAG_KEY];
                normalise_key(u[k].key, nk, sizeof nk);
                speed_too |= strcmp(nk, "release.velocity.speed") == 0;
            }
            if (!speed_too)
                why = "the planned horizontal release speed is 0, so a heading changes nothing";
        }
        if (why) {
            st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, e->u.line, e->u.col, key,
                                "sampling it has no effect: %s", why);
            break;
        }
        for (size_t k = 0; k < i; k++) {
            const entry *o = &s->e[k];
            int same = o->target == e->target &&
                       (e->target != TGT_FIELD || o->offset == e->offset);
            if (same) {
                st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, e->u.line, e->u.col, key,
                                    "is uncertain twice (also as '%s')", o->u.key);
                break;
            }
        }
        if (st != PLUMB_OK)
            break;
        if (e->target == TGT_SPEED)
            s->has_speed = 1;
        if (e->target == TGT_HEADING)
            s->has_heading = 1;
        if (e->target == TGT_CLIMB)
            s->has_climb = 1;
        if ((s->has_speed || s->has_heading) && (has_east || has_north))
            st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, e->u.line, e->u.col, key,
                                "the release velocity's uncertainty must be given either as "
                                "east/north or as speed/heading, not both");
        else if (s->has_climb && has_up)
            st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, source, e->u.line, e->u.col, key,
                                "release.velocity.climb and release.velocity.up are the same "
                                "input; give one");
        if (st == PLUMB_OK)
            st = check_dist(e, source, diag);
    }
    if (st != PLUMB_OK) {
        free(s);
        return st;
    }
    const double *v = base->velocity_m_s;
    s->base_speed_m_s = hypot(v[0], v[1]);
    s->base_heading_deg = s->base_speed_m_s > 0.0 ? wrap_deg(atan2(v[0], v[1]) * DEG_PER_RAD) : 0.0;
    s->base_up_m_s = v[2];
    s->rng = gsl_rng_alloc(&plumb_rng_type);
    if (!s->rng) {
        free(s);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory allocating a random stream");
    }
    *out = s;
    return PLUMB_OK;
}

/* One value of entry e from the stream. */
static plumb_status draw_one(const entry *e, gsl_rng *r, size_t index, double *x, size_t *redraw,
                             plumb_diag *diag)
{
    const double *q = e->u.param;
    double v;
    switch (e->u.kind) {
    case PLUMB_DIST_NORMAL:
        v = q[0] + gsl_ran_gaussian_ziggurat(r, q[1]);
        if (e->truncated) {
            int tries = 1;
            while (!in_range(&e->rule, v)) {
                if (redraw)
                    (*redraw)++;
                if (tries++ >= TRUNC_MAX_DRAWS)
                    return PLUMB_RAISE_KEY(diag, PLUMB_ENUMERIC, e->u.key,
                                           "sample %zu: no value inside the key's range in %d "
                                           "draws of the truncated normal", index + 1,
                                           TRUNC_MAX_DRAWS);
                v = q[0] + gsl_ran_gaussian_ziggurat(r, q[1]);
            }
        }
        break;
    case PLUMB_DIST_UNIFORM:
        v = e->a + (e->b - e->a) * gsl_rng_uniform(r);
        break;
    default: { /* triangular */
        double w = e->b - e->a, uu = gsl_rng_uniform(r);
        if (!(w > 0.0))
            v = e->a;
        else if (uu * w < e->c - e->a)
            v = e->a + sqrt(uu * w * (e->c - e->a));
        else
            v = e->b - sqrt((1.0 - uu) * w * (e->b - e->c));
        break;
    }
    }
    *x = e->rule.angle ? wrap_deg(v) : v;
    return PLUMB_OK;
}

plumb_status plumb_sampler_draw(plumb_sampler *s, unsigned long seed, size_t index,
                                plumb_fall_spec *out, double *values, size_t *redraws,
                                plumb_diag *diag)
{
    *out = s->base;
    taus_seed(s->rng->state, seed, index);
    double speed = s->base_speed_m_s, heading = s->base_heading_deg, climb = s->base_up_m_s;
    char *bytes = (char *)out;
    for (size_t i = 0; i < s->n; i++) {
        const entry *e = &s->e[i];
        double x = 0.0;
        plumb_status st = draw_one(e, s->rng, index, &x, redraws ? &redraws[i] : NULL, diag);
        if (st != PLUMB_OK)
            return st;
        if (values)
            values[i] = x;
        switch (e->target) {
        case TGT_SPEED: speed = x; break;
        case TGT_HEADING: heading = x; break;
        case TGT_CLIMB: climb = x; break;
        default:
            memcpy(bytes + e->offset, &x, sizeof x);
            break;
        }
    }
    if (s->has_speed || s->has_heading) {
        double h = heading * RAD_PER_DEG;
        out->velocity_m_s[0] = speed * sin(h);
        out->velocity_m_s[1] = speed * cos(h);
    }
    if (s->has_climb)
        out->velocity_m_s[2] = climb;
    return PLUMB_OK;
}

/* ---- binomial bounds ------------------------------------------------------ */

/* The Bin(n, x) distribution over its window, for 0 < x < 1, scaled so that
 * pmf(mode) = 1. */
typedef struct binom {
    size_t n, mode, j0, j1;
    double x, odds;       /* x / (1 - x) */
    double below;         /* sum of pmf over j0 .. mode */
    double total;         /* sum over the window */
} binom;

static void binom_init(binom *B, size_t n, double x)
{
    B->n = n;
    B->x = x;
    B->odds = x / (1.0 - x);
    double mode = floor(((double)n + 1.0) * x);
    B->mode = mode > (double)n ? n : (size_t)mode;
    double w = ceil(BINOM_SD_SPAN * sqrt((double)n * x * (1.0 - x)) + BINOM_PAD);
    size_t wi = w >= (double)n ? n : (size_t)w;
    B->j0 = B->mode > wi ? B->mode - wi : 0;
    B->j1 = n - B->mode > wi ? B->mode + wi : n;
    double p = 1.0, sum = 1.0;
    for (size_t j = B->mode; j > B->j0; j--) {
        /* pmf(j - 1) = pmf(j) j / ((n - j + 1) odds) */
        p *= (double)j / ((double)(n - j + 1) * B->odds);
        sum += p;
    }
    B->below = sum;
    p = 1.0;
    double above = 0.0;
    for (size_t j = B->mode; j < B->j1; j++) {
        p *= (double)(n - j) / (double)(j + 1) * B->odds;
        above += p;
    }
    B->total = sum + above;
}

/* P(B <= j), for any j (size_t) or j = -1 given as below_zero. */
static double binom_cdf(const binom *B, size_t j)
{
    if (j >= B->j1)
        return 1.0;
    if (j < B->j0)
        return 0.0;
    double c = B->below, p = 1.0;
    if (j < B->mode) {
        for (size_t i = B->mode; i > j; i--) {
            c -= p;
            p *= (double)i / ((double)(B->n - i + 1) * B->odds);
        }
    } else {
        for (size_t i = B->mode; i < j; i++) {
            p *= (double)(B->n - i) / (double)(i + 1) * B->odds;
            c += p;
        }
    }
    double f = c / B->total;
    return f < 0.0 ? 0.0 : f > 1.0 ? 1.0 : f;
}

plumb_status plumb_quantile_ranks(size_t n, double p, double level, size_t *l, size_t *u)
{
    if (n == 0 || !(p > 0.0 && p < 1.0) || !(level > 0.0 && level < 1.0))
        return PLUMB_RAISE(NULL, PLUMB_EINVAL, "quantile ranks: need n >= 1, 0 < p < 1, 0 < level < 1");
    double t = 0.5 * (1.0 - level);
    binom B;
    binom_init(&B, n, p);
    /* l - 1 = the largest j with P(B <= j) <= t (l = 0: none, open). */
    size_t lo = 0;
    if (binom_cdf(&B, 0) > t) {
        lo = 0;
    } else {
        size_t a = 0, b = n; /* cdf(a) <= t < cdf(b) = 1 */
        while (b - a > 1) {
            size_t m = a + (b - a) / 2;
            if (binom_cdf(&B, m) <= t)
                a = m;
            else
                b = m;
        }
        lo = a + 1;
    }
    /* u - 1 = the smallest j with P(B <= j) >= 1 - t. */
    size_t a = 0, b = n; /* invariant: cdf(b) >= 1 - t */
    if (binom_cdf(&B, 0) >= 1.0 - t) {
        b = 0;
    } else {
        while (b - a > 1) {
            size_t m = a + (b - a) / 2;
            if (binom_cdf(&B, m) >= 1.0 - t)
                b = m;
            else
                a = m;
        }
    }
    *l = lo;
    *u = b + 1;
    return PLUMB_OK;
}

/* P(Bin(n, x) >= k) for 0 < x < 1, k >= 1. */
static double binom_tail_ge(size_t n, double x, size_t k)
{
    binom B;
    binom_init(&B, n, x);
    return 1.0 - binom_cdf(&B, k - 1);
}

/* P(Bin(n, x) <= k) for 0 < x < 1. */
static double binom_cdf_at(size_t n, double x, size_t k)
{
    binom B;
    binom_init(&B, n, x);
    return binom_cdf(&B, k);
}

plumb_status plumb_clopper_pearson(size_t k, size_t n, double level, double *lo, double *hi)
{
    if (n == 0 || k > n || !(level > 0.0 && level < 1.0))
        return PLUMB_RAISE(NULL, PLUMB_EINVAL, "Clopper-Pearson: need n >= 1, k <= n, 0 < level < 1");
    double t = 0.5 * (1.0 - level);
    double nn = (double)n;
    /* k = 0 and k = n in closed form: (1 - hi)^n = t, lo^n = t. */
    if (k == 0) {
        *lo = 0.0;
        *hi = -expm1(log(t) / nn);
        return PLUMB_OK;
    }
    if (k == n) {
        *lo = exp(log(t) / nn);
        *hi = 1.0;
        return PLUMB_OK;
    }
    /* lower: P(B >= k | x) = t, increasing in x. */
    double a = 0.0, b = 1.0;
    for (int it = 0; it < CP_MAX_STEPS && b - a > DBL_EPSILON * b; it++) {
        double m = 0.5 * (a + b);
        if (binom_tail_ge(n, m, k) < t)
            a = m;
        else
            b = m;
    }
    *lo = 0.5 * (a + b);
    /* upper: P(B <= k | x) = t, decreasing in x. */
    a = 0.0;
    b = 1.0;
    for (int it = 0; it < CP_MAX_STEPS && b - a > DBL_EPSILON * b; it++) {
        double m = 0.5 * (a + b);
        if (binom_cdf_at(n, m, k) > t)
            a = m;
        else
            b = m;
    }
    *hi = 0.5 * (a + b);
    return PLUMB_OK;
}

size_t plumb_zone_min_samples(double confidence, double ci_level)
{
    if (!(confidence > 0.0 && confidence < 1.0) || !(ci_level > 0.0 && ci_level < 1.0))
        return 0;
    /* The largest sample bounds the c-quantile above when 1 - c^N >= 1 - t. */
    double n = ceil(log(0.5 * (1.0 - ci_level)) / log(confidence));
    return n < 1.0 ? 1 : n > (double)PLUMB_ZONE_MAX_SAMPLES ? PLUMB_ZONE_MAX_SAMPLES + 1u : (size_t)n;
}

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

static size_t sk_index(const sketch *s, double a)
{
    if (!(a >= s->floor))
        return 0;
    int e;
    double f = frexp(a / s->floor, &e); /* a / floor = f 2^e, 0.5 <= f < 1, e >= 1 */
    if (e - 1 >= SK_OCTAVES)
        return SK_SIDE - 1;
    size_t sub = (size_t)((2.0 * f - 1.0) * (double)SK_SUB);
    if (sub >= SK_SUB)
        sub = SK_SUB - 1;
    return 1 + (size_t)(e - 1) * SK_SUB + sub;
}

/* Group of bin idx: 0 for bin 0, 1 + octave, SK_GROUPS - 1 for overflow. */
static size_t sk_group(size_t idx)
{
    if (idx == 0)
        return 0;
    if (idx == SK_SIDE - 1)
        return SK_GROUPS - 1;
    return 1 + (idx - 1) / SK_SUB;
}

/* First bin of group g and the number of bins in it. */
static void sk_group_bins(size_t g, size_t *first, size_t *count)
{
    if (g == 0) {
        *first = 0;
        *count = 1;
    } else if (g == SK_GROUPS - 1) {
        *first = SK_SIDE - 1;
        *count = 1;
    } else {
        *first = 1 + (g - 1) * SK_SUB;
        *count = SK_SUB;
    }
}

/* Distances from centre that bin idx covers on a side with largest
 * distance top. */
static void sk_edges(const sketch *s, size_t idx, double top, double *lo, double *hi)
{
    if (idx == 0) {
        *lo = 0.0;
        *hi = s->floor;
    } else if (idx == SK_SIDE - 1) {
        *lo = ldexp(s->floor, SK_OCTAVES);
        *hi = top > *lo ? top : *lo;
    } else {
        size_t oct = (idx - 1) / SK_SUB, sub = (idx - 1) % SK_SUB;
        *lo = ldexp(s->floor * (1.0 + (double)sub / SK_SUB), (int)oct);
        *hi = ldexp(s->floor * (1.0 + (double)(sub + 1) / SK_SUB), (int)oct);
    }
}

static void sk_add(sketch *s, double v)
{
    double d = v - s->centre;
    if (s->n == 0 || v < s->min)
        s->min = v;
    if (s->n == 0 || v > s->max)
        s->max = v;
    s->n++;
    if (s->two_sided && d < 0.0) {
        size_t i = sk_index(s, -d);
        s->neg[i]++;
        s->gneg[sk_group(i)]++;
        if (-d > s->max_neg)
            s->max_neg = -d;
    } else {
        double a = fabs(d);
        size_t i = sk_index(s, a);
        s->pos[i]++;
        s->gpos[sk_group(i)]++;
        if (a > s->max_pos)
            s->max_pos = a;
    }
}

/* The r-th smallest value (1 <= r <= n), interpolated in its bin: the
 * values of the negative side come first, farthest from centre first. */
static double sk_rank(const sketch *s, size_t r)
{
    size_t cum = 0;
    double v = s->max;
    int found = 0;
    if (s->two_sided) {
        for (size_t g = SK_GROUPS; g-- > 0 && !found;) {
            if (cum + s->gneg[g] < r) {
                cum += s->gneg[g];
                continue;
            }
            size_t first, count;
            sk_group_bins(g, &first, &count);
            for (size_t i = first + count; i-- > first && !found;) {
                size_t c = s->neg[i];
                if (c && cum + c >= r) {
                    double lo, hi;
                    sk_edges(s, i, s->max_neg, &lo, &hi);
                    double frac = ((double)(r - cum) - 0.5) / (double)c;
                    v = s->centre - (hi - frac * (hi - lo));
                    found = 1;
                }
                cum += c;
            }
        }
    }
    for (size_t g = 0; g < SK_GROUPS && !found; g++) {
        if (cum + s->gpos[g] < r) {
            cum += s->gpos[g];
            continue;
        }
        size_t first, count;
        sk_group_bins(g, &first, &count);
        for (size_t i = first; i < first + count && !found; i++) {
            size_t c = s->pos[i];
            if (c && cum + c >= r) {
                double lo, hi;
                sk_edges(s, i, s->max_pos, &lo, &hi);
                double frac = ((double)(r - cum) - 0.5) / (double)c;
                v = s->centre + lo + frac * (hi - lo);
                found = 1;
            }
            cum += c;
        }
    }
    return v < s->min ? s->min : v > s->max ? s->max : v;
}

static int cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

/* Sets centre and floor from n pilot values (sorted in place). */
static void sk_configure(sketch *s, double *v, size_t n, double *scratch)
{
    qsort(v, n, sizeof *v, cmp_double);
    double centre = 0.0, scale;
    if (s->two_sided) {
        centre = n ? v[(n - 1) / 2] : 0.0;
        for (size_t i = 0; i < n; i++)
            scratch[i] = fabs(v[i] - centre);
        qsort(scratch, n, sizeof *scratch, cmp_double);
        scale = n ? scratch[(n - 1) / 2] : 0.0;
        if (!(scale > 0.0) && n)
            scale = scratch[n - 1];
    } else {
        scale = n ? fabs(v[(n - 1) / 2]) : 0.0;
        if (!(scale > 0.0) && n)
            scale = fabs(v[n - 1]);
    }
    if (!(scale > 0.0) || !isfinite(scale))
        scale = 1.0;
    int e;
    (void)frexp(scale, &e);
    s->centre = centre;
    s->floor = ldexp(1.0, e - SK_FLOOR_SHIFT);
}

/* Empties a histogram, visiting only the groups that hold counts. */
static void sk_reset(sketch *s)
{
    for (size_t g = 0; g < SK_GROUPS; g++) {
        size_t first, count;
        sk_group_bins(g, &first, &count);
        if (s->gpos[g])
            memset(s->pos + first, 0, count * sizeof *s->pos);
        if (s->neg && s->gneg[g])
            memset(s->neg + first, 0, count * sizeof *s->neg);
    }
    memset(s->gpos, 0, sizeof s->gpos);
    memset(s->gneg, 0, sizeof s->gneg);
    s->max_pos = s->max_neg = 0.0;
    s->min = s->max = 0.0;
    s->n = 0;
}

/* ---- one pass ---------------------------------------------------------- */

/* What a worker keeps of one sample. */
typedef struct rec {
    double dx, dy;           /* impact - planned release point, m */
    double energy_j, speed_m_s, time_s;
    double release_speed_m_s;/* |v0| */
    double throw_m;          /* drag-free throw from the release */
} rec;

/* What the pilot keeps: the four histogrammed values. */
enum { PV_R = 0, PV_E, PV_DX, PV_DY, PV_N };

typedef struct slot {
    int ready;               /* computed, waiting to be merged */
    size_t first, count;     /* samples first .. first + count */
    size_t n_ok;             /* samples computed (count unless one failed) */
    plumb_status st;         /* status of sample first + n_ok when it failed */
    plumb_diag diag;
    size_t redraws[PLUMB_ZONE_MAX_INPUTS];
    size_t steps, evals;
    rec *recs;
} slot;

typedef struct pass pass;

typedef struct worker {
    pass *ps;
    plumb_sampler *sampler;
    plumb_trajectory *traj;
    pthread_t tid;
    int started;
} worker;

/* Accumulators, touched only by the merger (under the lock). */
typedef struct acc {
    size_t n;
    double me, mn, cee, cnn, cen; /* Welford: means and co-moments of (dx, dy) */
    double r_max, e_max;
    double speed_max, throw_at_max;
    size_t exceed[PLUMB_ZONE_MAX_CRITERIA];
    size_t redraws[PLUMB_ZONE_MAX_INPUTS];
    size_t steps, evals;
    sketch sk[PV_N];
    sketch skc;              /* distance from the landing centre, samples >= train */
    plumb_region *reg;       /* the landing region */
    int configured;
    size_t pilot_n;
    double *pilot;           /* PV_N x pilot_cap, column-major by quantity */
    double *scratch;         /* pilot_cap */
} acc;

struct pass {
    pthread_mutex_t mu;
    pthread_cond_t cv;
    /* configuration */
    const plumb_atmosphere *atm;
    const plumb_zone_options *opt;
    const plumb_criterion *const *crit;
    size_t n_crit;
    unsigned long seed;
    int pass_no;
    size_t n, block, nblocks, window, pilot_cap;
    size_t train;            /* samples that fix the landing centre and grid (<= pilot_cap) */
    double shift[2];         /* added to the sampled release point */
    double release[2];       /* planned release point of this pass */
    double centre[2];        /* radii from here */
    /* scheduling */
    size_t next, merged, stop;
    int abort;
    slot *slots;
    /* outcome */
    plumb_status st;
    plumb_diag diag;
    acc a;
};

/* Drag-free range from height H with components v_h, v_z (see header). */
static double ballistic_throw(const plumb_fall_spec *s)
{
    const double *v = s->velocity_m_s;
    double H = s->release_m[2];
    double g = plumb_gravity_at(&s->gravity, s->site_elevation_m + 0.5 * H);
    double vh = hypot(v[0], v[1]);
    return vh * (v[2] + sqrt(v[2] * v[2] + 2.0 * g * H)) / g;
}

/* Substream `salt` of sample `index`: n uniforms in [0, 1) from a stream
 * of its own, so that what a sample draws for its inputs is untouched by
 * the draws of the glide or the gusts (and identical for any thread count). */
#define SALT_GLIDE UINT64_C(0x676C696465) /* "glide" */
static void substream_uniforms(unsigned long seed, uint64_t salt, size_t index, double *u, size_t n)
{
    taus_state t;
    taus_seed(&t, (unsigned long)((uint64_t)seed ^ splitmix64_mix(salt)), index);
    for (size_t i = 0; i < n; i++)
        u[i] = taus_get_double(&t);
}

static void compute_block(worker *w, slot *sl)
{
    pass *ps = w->ps;
    plumb_fall_spec spec;
    plumb_fall_result res;
    plumb_diag d;
    sl->n_ok = 0;
    sl->st = PLUMB_OK;
    sl->steps = sl->evals = 0;
    memset(sl->redraws, 0, sizeof sl->redraws);
    for (size_t k = 0; k < sl->count; k++) {
        size_t i = sl->first + k;
        plumb_diag_clear(&d);
        plumb_status st = plumb_sampler_draw(w->sampler, ps->seed, i, &spec, NULL, sl->redraws, &d);
        if (st == PLUMB_OK) {
            spec.release_m[0] += ps->shift[0];
            spec.release_m[1] += ps->shift[1];
            st = plumb_trajectory_run(w->traj, &spec, ps->atm, &res, &d);
        }
        if (st != PLUMB_OK) {
            sl->st = st;
            plumbp_raise(&sl->diag, st, NULL, 0, 0, d.key[0] ? d.key : NULL,
                         "sample %zu of %zu (seed %lu): %s", i + 1, ps->n, ps->seed,
                         d.message[0] ? d.message : plumb_strerror(st));
            return;
        }
        rec *r = &sl->recs[k];
        r->dx = res.point_m[0] - ps->release[0];
        r->dy = res.point_m[1] - ps->release[1];
        if (spec.glide.mode != PLUMB_GLIDE_OFF && spec.n_descent == 0) {
            /* a plate glides sideways from its highest point (plumb/glide.h) */
            double u[2], g[2];
            substream_uniforms(ps->seed, SALT_GLIDE, i, u, 2);
            plumb_glide_offset(spec.glide.mode, res.apex_m, u[0], u[1], g);
            r->dx += g[0];
            r->dy += g[1];
        }
        r->energy_j = res.energy_j;
        r->speed_m_s = res.speed_m_s;
        r->time_s = res.time_s;
        const double *v = spec.velocity_m_s;
        r->release_speed_m_s = sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
        r->throw_m = ballistic_throw(&spec);
        sl->steps += res.solver.steps;
        sl->evals += res.solver.rhs_evaluations;
        sl->n_ok = k + 1;
    }
}

static void sk_insert(acc *a, const double v[PV_N])
{
    for (int q = 0; q < PV_N; q++)
        sk_add(&a->sk[q], v[q]);
}

/* Configures the histograms from the pilot and adds the pilot to them. */
static void configure(pass *ps)
{
    acc *a = &ps->a;
    size_t n = a->pilot_n;
    double *sorted = a->scratch + ps->pilot_cap; /* second half of scratch */
    for (int q = 0; q < PV_N; q++) {
        memcpy(sorted, a->pilot + (size_t)q * ps->pilot_cap, n * sizeof *sorted);
        sk_configure(&a->sk[q], sorted, n, a->scratch);
    }
    for (size_t i = 0; i < n; i++) {
        double v[PV_N];
        for (int q = 0; q < PV_N; q++)
            v[q] = a->pilot[(size_t)q * ps->pilot_cap + i];
        sk_insert(a, v);
    }
    /* the landing circle: distances from the training samples' mean, the
     * scale from the training samples, the counts from the others */
    double c[2];
    plumb_region_centre(a->reg, c);
    for (size_t i = 0; i < n; i++)
        sorted[i] = hypot(ps->release[0] + a->pilot[(size_t)PV_DX * ps->pilot_cap + i] - c[0],
                          ps->release[1] + a->pilot[(size_t)PV_DY * ps->pilot_cap + i] - c[1]);
    /* sorts the first train values in place, leaves the rest */
    sk_configure(&a->skc, sorted, ps->train < n ? ps->train : n, a->scratch);
    for (size_t i = ps->train; i < n; i++)
        sk_add(&a->skc, sorted[i]);
    a->configured = 1;
}

/* Merges one slot's samples, in order. Called with the lock held. */
static void merge_slot(pass *ps, slot *sl)
{
    acc *a = &ps->a;
    const plumb_zone_options *opt = ps->opt;
    double off_e = ps->release[0] - ps->centre[0], off_n = ps->release[1] - ps->centre[1];
    for (size_t k = 0; k < sl->n_ok; k++) {
        const rec *r = &sl->recs[k];
        size_t i = sl->first + k;
        if (opt->on_sample) {
            plumb_zone_sample smp = {{ps->release[0] + r->dx, ps->release[1] + r->dy},
                                     r->energy_j, r->speed_m_s, r->time_s};
            if (opt->on_sample(opt->sample_user, ps->pass_no, i, &smp) != 0) {
                ps->st = PLUMB_RAISE(&ps->diag, PLUMB_EWRITE,
                                     "the sample writer stopped the run at sample %zu", i + 1);
                ps->abort = 1;
                return;
            }
        }
        a->n++;
        double nn = (double)a->n;
        double de = r->dx - a->me, dn = r->dy - a->mn;
        a->me += de / nn;
        a->mn += dn / nn;
        a->cee += de * (r->dx - a->me);
        a->cnn += dn * (r->dy - a->mn);
        a->cen += de * (r->dy - a->mn);
        double rad = hypot(r->dx + off_e, r->dy + off_n);
        if (rad > a->r_max)
            a->r_max = rad;
        if (a->n == 1 || r->energy_j > a->e_max)
            a->e_max = r->energy_j;
        for (size_t c = 0; c < ps->n_crit; c++) {
            plumb_verdict verdict;
            plumb_criterion_judge(ps->crit[c], r->energy_j, &verdict);
            if (verdict.exceeds)
                a->exceed[c]++;
        }
        if (a->n == 1 || r->release_speed_m_s > a->speed_max ||
            (r->release_speed_m_s == a->speed_max && r->throw_m > a->throw_at_max)) {
            a->speed_max = r->release_speed_m_s;
            a->throw_at_max = r->throw_m;
        }
        double v[PV_N] = {rad, r->energy_j, r->dx, r->dy};
        double pe = ps->release[0] + r->dx, pn = ps->release[1] + r->dy;
        plumb_region_add(a->reg, pe, pn);
        if (a->configured) {
            sk_insert(a, v);
            double c[2];
            plumb_region_centre(a->reg, c);
            sk_add(&a->skc, hypot(pe - c[0], pn - c[1]));
        } else {
            for (int q = 0; q < PV_N; q++)
                a->pilot[(size_t)q * ps->pilot_cap + a->pilot_n] = v[q];
            if (++a->pilot_n == ps->pilot_cap)
                configure(ps);
        }
    }
    for (size_t i = 0; i < PLUMB_ZONE_MAX_INPUTS; i++)
        a->redraws[i] += sl->redraws[i];
    a->steps += sl->steps;
    a->evals += sl->evals;
    if (sl->st != PLUMB_OK) {
        ps->st = sl->st;
        ps->diag = sl->diag;
        ps->abort = 1;
    }
}

static void *worker_main(void *arg)
{
    worker *w = arg;
    pass *ps = w->ps;
    pthread_mutex_lock(&ps->mu);
    for (;;) {
        while (!ps->abort && ps->next < ps->nblocks && ps->next < ps->stop &&
               ps->next >= ps->merged + ps->window)
            pthread_cond_wait(&ps->cv, &ps->mu);
        if (ps->abort || ps->next >= ps->nblocks || ps->next >= ps->stop)
            break;
        size_t b = ps->next++;
        slot *sl = &ps->slots[b % ps->window];
        sl->first = b * ps->block;
        sl->count = ps->n - sl->first < ps->block ? ps->n - sl->first : ps->block;
        pthread_mutex_unlock(&ps->mu);

        compute_block(w, sl);

        pthread_mutex_lock(&ps->mu);
        sl->ready = 1;
        if (sl->st != PLUMB_OK && b + 1 < ps->stop)
            ps->stop = b + 1; /* blocks after a failure are not needed */
        while (!ps->abort && ps->merged < ps->nblocks && ps->slots[ps->merged % ps->window].ready) {
            slot *m = &ps->slots[ps->merged % ps->window];
            merge_slot(ps, m);
            m->ready = 0;
            ps->merged++;
            if (ps->opt->progress && !ps->abort)
                ps->opt->progress(ps->opt->progress_user, ps->pass_no,
                                  ps->merged * ps->block < ps->n ? ps->merged * ps->block : ps->n,
                                  ps->n);
        }
        pthread_cond_broadcast(&ps->cv);
    }
    pthread_cond_broadcast(&ps->cv);
    pthread_mutex_unlock(&ps->mu);
    return NULL;
}

/* Reads a quantile and its interval from a histogram. */
static void read_quantile(const sketch *s, size_t n, double p, double level, plumb_zone_quantile *q)
{
    memset(q, 0, sizeof *q);
    q->p = p;
    double x = p * (double)n;
    double kd = ceil(x - 4.0 * DBL_EPSILON * x);
    size_t k = kd < 1.0 ? 1 : kd > (double)n ? n : (size_t)kd;
    q->value = sk_rank(s, k);
    size_t l = 0, u = n + 1;
    (void)plumb_quantile_ranks(n, p, level, &l, &u);
    q->lo_open = l == 0;
    q->hi_open = u > n;
    q->lo = q->lo_open ? s->min : sk_rank(s, l);
    q->hi = q->hi_open ? s->max : sk_rank(s, u);
}

static const double radius_p[PLUMB_ZONE_RADII] = {0.5, 0.9, 0.99, 0.999};
static const double energy_p[PLUMB_ZONE_ENERGIES] = {0.5, 0.95, 0.99};

static plumb_status finish_stats(pass *ps, const plumb_fall_spec *base, const plumb_zone_spec *zone,
                                 double level, plumb_zone_stats *z, plumb_diag *diag)
{
    acc *a = &ps->a;
    if (!a->configured)
        configure(ps);
    memset(z, 0, sizeof *z);
    size_t n = a->n;
    z->samples = n;
    for (int k = 0; k < 2; k++) {
        z->release_m[k] = ps->release[k];
        z->centre_m[k] = ps->centre[k];
    }
    z->mean_m[0] = ps->release[0] + a->me;
    z->mean_m[1] = ps->release[1] + a->mn;
    if (n >= 2) {
        z->cov_m2[0] = a->cee / (double)(n - 1);
        z->cov_m2[1] = a->cnn / (double)(n - 1);
        z->cov_m2[2] = a->cen / (double)(n - 1);
    }
    z->ellipse_chi2 = -2.0 * log1p(-ELLIPSE_LEVEL);
    double see = z->cov_m2[0], snn = z->cov_m2[1], sen = z->cov_m2[2];
    double half = 0.5 * (see + snn), disc = hypot(0.5 * (see - snn), sen);
    double l1 = half + disc, l2 = half - disc;
    z->semi_major_m = sqrt(z->ellipse_chi2 * (l1 > 0.0 ? l1 : 0.0));
    z->semi_minor_m = sqrt(z->ellipse_chi2 * (l2 > 0.0 ? l2 : 0.0));
    /* major axis at angle theta from east toward north; bearing from north */
    double theta = 0.5 * atan2(2.0 * sen, see - snn);
    double bearing = fmod(90.0 - theta * DEG_PER_RAD + 2.0 * FULL_TURN_DEG, 180.0);
    z->bearing_deg = bearing >= 180.0 ? 0.0 : bearing;
    for (int i = 0; i < PLUMB_ZONE_RADII; i++)
        read_quantile(&a->sk[PV_R], n, radius_p[i], level, &z->radius[i]);
    read_quantile(&a->sk[PV_R], n, zone->confidence, level, &z->radius_conf);
    z->radius_max_m = a->r_max;
    z->scatter_m = zone->scatter_m;
    z->clearance_radius_m = z->radius_conf.hi + zone->scatter_m;
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++)
        read_quantile(&a->sk[PV_E], n, energy_p[i], level, &z->energy[i]);
    z->energy_max_j = a->e_max;
    z->n_exceedance = ps->n_crit;
    for (size_t c = 0; c < ps->n_crit; c++) {
        plumb_zone_exceedance *x = &z->exceedance[c];
        x->criterion = ps->crit[c];
        x->count = a->exceed[c];
        x->probability = (double)x->count / (double)n;
        if (plumb_clopper_pearson(x->count, n, level, &x->lo, &x->hi) != PLUMB_OK)
            return PLUMB_RAISE(diag, PLUMB_ENUMERIC, "Clopper-Pearson interval failed");
    }
    read_quantile(&a->sk[PV_DX], n, 0.5, level, &z->displacement[0]);
    read_quantile(&a->sk[PV_DY], n, 0.5, level, &z->displacement[1]);
    z->drop_height_m = base->release_m[2];
    z->glide_ratio_max =
        base->n_descent == 0 ? plumb_glide_ratio_max(base->glide.mode) : 0.0;
    z->max_release_speed_m_s = a->speed_max;
    z->ballistic_throw_m = a->throw_at_max;
    z->landing_training = ps->train;
    plumb_region_centre(a->reg, z->landing_centre_m);
    size_t ncal = n - ps->train;
    if (ncal >= 1) {
        read_quantile(&a->skc, ncal, zone->confidence, level, &z->landing_radius);
    } else {
        z->landing_radius.p = zone->confidence;
        z->landing_radius.lo_open = z->landing_radius.hi_open = 1;
    }
    z->landing_circle_m = z->landing_radius.hi_open ? 0.0 : z->landing_radius.hi + zone->scatter_m;
    plumb_status rst = plumb_region_finish(a->reg, zone->confidence, level, zone->scatter_m,
                                           &z->landing, diag);
    if (rst != PLUMB_OK)
        return rst;
    z->impact_point_fixed = a->sk[PV_DX].max - a->sk[PV_DX].min <= PLUMB_ZONE_FIXED_M &&
                            a->sk[PV_DY].max - a->sk[PV_DY].min <= PLUMB_ZONE_FIXED_M;
    z->steps = a->steps;
    z->rhs_evaluations = a->evals;
    return PLUMB_OK;
}

void plumb_zone_add_warning(plumb_zone_result *res, const char *fmt, ...)
{
    if (!res || res->n_warnings >= PLUMB_ZONE_MAX_WARNINGS)
        return;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(res->warnings[res->n_warnings], PLUMB_ZONE_WARNING, fmt, ap);
    va_end(ap);
    res->n_warnings++;
}

/* Shared storage of both passes. */
typedef struct run {
    size_t threads;
    worker *w;
    slot *slots;
    rec *recs;
    uint32_t *bins;
    double *pilot, *scratch;
    plumb_region *reg;
} run;

static void run_free(run *r)
{
    if (r->w)
        for (size_t i = 0; i < r->threads; i++) {
            plumb_sampler_free(r->w[i].sampler);
            plumb_trajectory_free(r->w[i].traj);
        }
    free(r->w);
    free(r->slots);
    free(r->recs);
    free(r->bins);
    free(r->pilot);
    free(r->scratch);
    plumb_region_free(r->reg);
}

static plumb_status do_pass(run *rn, pass *ps, plumb_diag *diag)
{
    ps->next = ps->merged = 0;
    ps->stop = ps->nblocks;
    ps->abort = 0;
    ps->st = PLUMB_OK;
    acc *a = &ps->a;
    a->n = 0;
    a->me = a->mn = a->cee = a->cnn = a->cen = 0.0;
    a->r_max = a->e_max = a->speed_max = a->throw_at_max = 0.0;
    memset(a->exceed, 0, sizeof a->exceed);
    memset(a->redraws, 0, sizeof a->redraws);
    a->steps = a->evals = 0;
    for (int q = 0; q < PV_N; q++)
        sk_reset(&a->sk[q]);
    sk_reset(&a->skc);
    a->configured = 0;
    plumb_status rst = plumb_region_reset(a->reg, ps->train, diag);
    if (rst != PLUMB_OK)
        return rst;
    a->pilot_n = 0;
    for (size_t i = 0; i < ps->window; i++)
        ps->slots[i].ready = 0;
    if (pthread_mutex_init(&ps->mu, NULL) != 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "cannot make a mutex");
    if (pthread_cond_init(&ps->cv, NULL) != 0) {
        pthread_mutex_destroy(&ps->mu);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "cannot make a condition variable");
    }
    size_t t = rn->threads < ps->nblocks ? rn->threads : ps->nblocks;
    for (size_t i = 0; i < t; i++) {
        rn->w[i].ps = ps;
        rn->w[i].started = 0;
    }
    /* Thread 0 is this one; a thread that cannot be started is left out
     * (fewer threads change the speed, not the result). */
    for (size_t i = 1; i < t; i++)
        rn->w[i].started = pthread_create(&rn->w[i].tid, NULL, worker_main, &rn->w[i]) == 0;
    worker_main(&rn->w[0]);
    for (size_t i = 1; i < t; i++)
        if (rn->w[i].started)
            pthread_join(rn->w[i].tid, NULL);
    pthread_cond_destroy(&ps->cv);
    pthread_mutex_destroy(&ps->mu);
    if (ps->st != PLUMB_OK) {
        if (diag)
            *diag = ps->diag;
        return ps->st;
    }
    if (a->n != ps->n)
        return PLUMB_RAISE(diag, PLUMB_ENUMERIC, "the zone merged %zu of %zu samples", a->n, ps->n);
    return PLUMB_OK;
}

void plumb_zone_options_init(plumb_zone_options *opt)
{
    memset(opt, 0, sizeof *opt);
    opt->threads = 0;
    plumb_trajectory_options_init(&opt->trajectory);
    opt->ci_level = ZONE_CI_LEVEL;
    opt->block_samples = ZONE_BLOCK;
    opt->pilot_samples = ZONE_PILOT;
}

size_t plumb_zone_default_threads(void)
{
    long n = sysconf(_SC_NPROCESSORS_ONLN);
    return n >= 1 ? (size_t)n : 1;
}

static plumb_status check_zone(const plumb_zone_spec *z, const plumb_zone_options *o,
                               plumb_diag *diag)
{
    if (z->samples < 1 || z->samples > PLUMB_ZONE_MAX_SAMPLES)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.samples",
                               "expected 1 to %u samples, found %zu", PLUMB_ZONE_MAX_SAMPLES,
                               z->samples);
    if (!(z->confidence > 0.0 && z->confidence < 1.0))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.confidence",
                               "expected 0 < confidence < 1, found %g", z->confidence);
    if (!(z->scatter_m >= 0.0) || !isfinite(z->scatter_m))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.scatter",
                               "expected a length >= 0 m, found %g m", z->scatter_m);
    if (z->has_target && (!isfinite(z->target_m[0]) || !isfinite(z->target_m[1])))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.target", "the target must be finite");
    if (!(o->ci_level > 0.0 && o->ci_level < 1.0))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "the interval level must lie in (0, 1), found %g",
                           o->ci_level);
    if (o->block_samples < 1 || o->pilot_samples < 1)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "block and pilot sizes must be >= 1");
    size_t need = plumb_zone_min_samples(z->confidence, o->ci_level);
    if (z->samples < need)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.samples",
                               "%zu samples cannot bound the %g%% radius at %g%% confidence; "
                               "at least %zu are needed", z->samples, 100.0 * z->confidence,
                               100.0 * o->ci_level, need);
    return PLUMB_OK;
}

plumb_status plumb_zone_run(const plumb_fall_spec *base, const plumb_atmosphere *atm,
                            const plumb_uncertainty *u, size_t n_u,
                            const plumb_zone_spec *zone,
                            const plumb_criterion *const *criteria, size_t n_crit,
                            const plumb_zone_options *opt_in, plumb_zone_result *res,
                            plumb_diag *diag)
{
    if (!base || !atm || !zone || !res || (n_crit > 0 && !criteria))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_zone_run: NULL argument");
    plumb_zone_options opt;
    if (opt_in)
        opt = *opt_in;
    else
        plumb_zone_options_init(&opt);
    plumb_status st = check_zone(zone, &opt, diag);
    if (st != PLUMB_OK)
        return st;
    if (n_crit > PLUMB_ZONE_MAX_CRITERIA)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "criteria",
                               "%zu criteria; at most %d are judged", n_crit,
                               PLUMB_ZONE_MAX_CRITERIA);
    for (size_t c = 0; c < n_crit; c++)
        if (!criteria[c])
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "criteria", "criterion %zu is NULL", c);

    run rn;
    memset(&rn, 0, sizeof rn);
    rn.threads = opt.threads ? opt.threads : plumb_zone_default_threads();
    pass ps;
    memset(&ps, 0, sizeof ps);
    ps.n = zone->samples;
    ps.block = opt.block_samples;
    ps.nblocks = (ps.n + ps.block - 1) / ps.block;
    if (rn.threads > ps.nblocks)
        rn.threads = ps.nblocks;
    ps.window = ZONE_WINDOW_PER_THREAD * rn.threads;
    ps.pilot_cap = opt.pilot_samples < ps.n ? opt.pilot_samples : ps.n;
    ps.train = ps.n / 4 > 1 ? ps.n / 4 : 1;
    if (ps.train > ps.pilot_cap)
        ps.train = ps.pilot_cap;
    if (ps.train > PLUMB_REGION_MAX_TRAINING)
        ps.train = PLUMB_REGION_MAX_TRAINING;

    /* Workers: a sampler (checks the entries) and a workspace each. */
    rn.w = calloc(rn.threads, sizeof *rn.w);
    if (!rn.w)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    for (size_t i = 0; i < rn.threads && st == PLUMB_OK; i++) {
        st = plumb_sampler_alloc(base, u, n_u, opt.source, &rn.w[i].sampler, diag);
        if (st == PLUMB_OK && (st = plumb_trajectory_alloc(&opt.trajectory, &rn.w[i].traj)) != PLUMB_OK)
            PLUMB_RAISE(diag, st, "cannot make a trajectory workspace: %s", plumb_strerror(st));
    }
    if (st == PLUMB_OK) {
        rn.slots = calloc(ps.window, sizeof *rn.slots);
        rn.recs = calloc(ps.window * ps.block, sizeof *rn.recs);
        rn.bins = calloc(7 * SK_SIDE, sizeof *rn.bins);
        if (plumb_region_alloc(&rn.reg, diag) != PLUMB_OK)
            st = PLUMB_ENOMEM;
        rn.pilot = calloc(PV_N * ps.pilot_cap, sizeof *rn.pilot);
        rn.scratch = calloc(2 * ps.pilot_cap, sizeof *rn.scratch);
        if (st == PLUMB_OK && (!rn.slots || !rn.recs || !rn.bins || !rn.pilot || !rn.scratch))
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory for the zone's histograms");
    }
    if (st != PLUMB_OK) {
        run_free(&rn);
        return st;
    }
    for (size_t i = 0; i < ps.window; i++)
        rn.slots[i].recs = rn.recs + i * ps.block;
    ps.slots = rn.slots;
    ps.a.pilot = rn.pilot;
    ps.a.scratch = rn.scratch;
    uint32_t *bins = rn.bins;
    for (int q = 0; q < PV_N; q++) {
        sketch *s = &ps.a.sk[q];
        s->two_sided = q == PV_DX || q == PV_DY;
        s->pos = bins;
        bins += SK_SIDE;
        if (s->two_sided) {
            s->neg = bins;
            bins += SK_SIDE;
        }
    }
    ps.a.skc.pos = bins;
    ps.a.reg = rn.reg;
    ps.atm = atm;
    ps.opt = &opt;
    ps.crit = criteria;
    ps.n_crit = n_crit;
    ps.seed = zone->seed;

    memset(res, 0, sizeof *res);
    res->samples = zone->samples;
    res->seed = zone->seed;
    res->confidence = zone->confidence;
    res->ci_level = opt.ci_level;

    /* Pass 0: released at the planned point, radii from it. */
    ps.pass_no = 0;
    ps.release[0] = ps.centre[0] = base->release_m[0];
    ps.release[1] = ps.centre[1] = base->release_m[1];
    st = do_pass(&rn, &ps, diag);
    if (st == PLUMB_OK)
        st = finish_stats(&ps, base, zone, opt.ci_level, &res->zone, diag);
    if (st == PLUMB_OK) {
        const plumb_sampler *s0 = rn.w[0].sampler;
        res->n_inputs = n_u;
        for (size_t i = 0; i < n_u; i++) {
            plumb_zone_input *in = &res->inputs[i];
            plumbp_strlcpy(in->key, u[i].key, sizeof in->key);
            in->kind = u[i].kind;
            memcpy(in->param, u[i].param, sizeof in->param);
            in->truncated = plumb_sampler_truncated(s0, i, &in->lower, &in->upper);
            in->redraws = ps.a.redraws[i];
        }
        if (res->zone.impact_point_fixed)
            plumb_zone_add_warning(
                res, "impact_point_fixed: the uncertain inputs do not move the impact point "
                     "(every sample lands within %g mm of the same point), so the radii are "
                     "the drift of one fall, not a zone. Give the uncertainty of the wind, "
                     "the release point or the release velocity to size one.",
                1e3 * PLUMB_ZONE_FIXED_M);
    }
    /* Pass 1: released where the median impact falls on the target. */
    if (st == PLUMB_OK && zone->has_target) {
        res->has_target = 1;
        for (int k = 0; k < 2; k++) {
            res->target_m[k] = zone->target_m[k];
            res->aim_release_m[k] = zone->target_m[k] - res->zone.displacement[k].value;
            ps.release[k] = res->aim_release_m[k];
            ps.centre[k] = zone->target_m[k];
            ps.shift[k] = res->aim_release_m[k] - base->release_m[k];
        }
        ps.pass_no = 1;
        st = do_pass(&rn, &ps, diag);
        if (st == PLUMB_OK)
            st = finish_stats(&ps, base, zone, opt.ci_level, &res->at_target, diag);
    }
    run_free(&rn);
    return st;
}
