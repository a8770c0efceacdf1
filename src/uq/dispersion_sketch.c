/*
 * dispersion_sketch.c - the zone's log-linear histograms: bin 0 holds
 * [0, f), then each octave is cut into 2^12 equal bins (the layout of a
 * floating-point number, as in G. Tene's HdrHistogram), so a percentile
 * is read to 2^-12 of its value whatever the order of insertion.
 */
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "uq/dispersion_int.h"

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

void plumbp_sk_add(sketch *s, double v)
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
double plumbp_sk_rank(const sketch *s, size_t r)
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
void plumbp_sk_configure(sketch *s, double *v, size_t n, double *scratch)
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
void plumbp_sk_reset(sketch *s)
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

