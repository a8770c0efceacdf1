/*
 * dispersion_bounds.c - binomial bounds for the zone's statistics: the
 * ranks of a distribution-free quantile interval (order statistics,
 * David & Nagaraja 2003, sec. 7.1), the Clopper-Pearson (1934) interval
 * of a proportion, and the least sample count for a confidence, all from
 * the binomial distribution summed over its window (see dispersion.c for
 * why not GSL's beta quantile).
 */
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_cdf.h>

#include "uq/dispersion_int.h"

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

