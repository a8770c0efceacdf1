/*
 * region.c - the region of the ground that holds a stated fraction of the
 * impact points (include/plumb/region.h): split conformal prediction over
 * a kernel density estimate on a fixed grid (Lei, Robins & Wasserman,
 * JASA 2013), the cell region traced to polygons, and its buffer.
 *
 * Steps:
 *   train      mean c and covariance S of the first m points; the grid's
 *              axes are S's eigenvectors (the major axis at angle
 *              theta = atan2(2 S_en, S_ee - S_nn) / 2 from east), its cells
 *              cover the training points' extent plus 4 bandwidths on every
 *              side; the density at each cell centre is the sum over the
 *              training points of exp(-(a^2 + b^2) / 2), a and b the offsets
 *              in bandwidths, cut at a^2 + b^2 > 16 (unnormalised: only
 *              its order matters).
 *   count      each later point adds 1 to the count of its cell (or to the
 *              points outside the grid, whose score is 0).
 *   finish     cells in decreasing density; the threshold is the density
 *              of the cell holding the u-th calibration point in that order,
 *              and every cell at least that dense is in the region (ties
 *              included). The region is then enlarged only: holes filled,
 *              corner-only contacts joined (and, should the outline not fit
 *              the result, grown by one cell until it does).
 *   trace      each region cell contributes the edges it shares with an
 *              empty cell, directed with the region on their left; with no
 *              corner-only contacts every grid vertex starts at most one
 *              edge, so the edges link into simple counter-clockwise rings.
 *   axis       the bearing of the landing region's main axis (axis_deg) is
 *              the major principal axis of the sample covariance of every
 *              point added, training and calibration alike (K. Pearson,
 *              "On lines and planes of closest fit", Phil. Mag. 2 (1901)
 *              559-572): for the 2 x 2 covariance S, the major axis lies at
 *              theta = atan2(2 S_en, S_ee - S_nn) / 2 from east. The sums
 *              are updated point by point (B. P. Welford, Technometrics 4
 *              (1962) 419-420, its co-moment form), in the order the points
 *              are added, which the zone makes the sample order: the same
 *              bits for any thread count. The grid's own axes follow the
 *              training points only, as split conformal needs (a grid fixed
 *              before the calibration points are seen).
 */
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/constants.h"
#include "plumb/region.h"
#include "plumb/dispersion.h"
#include "core/internal.h"

#define G PLUMB_REGION_GRID
#define BG PLUMB_REGION_BUFFER_GRID
/* Kernel cut-off: 4 bandwidths (the Gaussian is below 3.4e-4 of its peak). */
#define KERNEL_CUT 4.0
/* Bandwidth floor: 0.1 mm, and 1e-3 of the wider axis's bandwidth, so that
 * a cloud that is a line or a point still has cells of some width. */
#define H_FLOOR_M 1e-4
#define H_FLOOR_REL 1e-3
/* Most times the region is grown by one cell to make its outline fit. */
#define MAX_GROW 16
#define DEG_PER_RAD (180.0 / PLUMB_PI)

/* A cell and its density, for ordering the cells. */
typedef struct cell_rank {
    double d;
    size_t i;
} cell_rank;

struct plumb_region {
    size_t m;                     /* training points wanted */
    size_t n;                     /* points added */
    int trained;
    double (*train)[2];           /* m training points */
    double c[2];                  /* training mean */
    double all_mean[2];           /* mean of every point added (east, north), m */
    double all_m2[3];             /* their sums of squared deviations: ee, nn, en, m^2 */
    double cs, sn;                /* cos, sin of the grid's first axis from east */
    double u0, v0, du, dv;        /* grid corner and cell sides in the axes frame */
    double *dens;                 /* G x G, cell (i, j) at i + G j */
    size_t *count;                /* G x G calibration counts */
    size_t outside, n_cal;
    /* work space of finish */
    unsigned char *mask;          /* BG x BG */
    int32_t *next;                /* (BG + 1) x (BG + 1) vertex successors */
    int32_t *stack;               /* BG x BG */
    cell_rank *order;             /* G x G */
};

void plumb_region_free(plumb_region *r)
{
    if (!r)
        return;
    free(r->train);
    free(r->dens);
    free(r->count);
    free(r->mask);
    free(r->next);
    free(r->stack);
    free(r->order);
    free(r);
}

plumb_status plumb_region_alloc(plumb_region **out, plumb_diag *diag)
{
    *out = NULL;
    plumb_region *r = calloc(1, sizeof *r);
    if (!r)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    r->train = calloc(PLUMB_REGION_MAX_TRAINING, sizeof *r->train);
    r->dens = calloc((size_t)G * G, sizeof *r->dens);
    r->count = calloc((size_t)G * G, sizeof *r->count);
    r->mask = calloc((size_t)BG * BG, 1);
    r->next = calloc((size_t)(BG + 1) * (BG + 1), sizeof *r->next);
    r->stack = calloc((size_t)BG * BG, sizeof *r->stack);
    r->order = calloc((size_t)G * G, sizeof *r->order);
    if (!r->train || !r->dens || !r->count || !r->mask || !r->next || !r->stack || !r->order) {
        plumb_region_free(r);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory for the landing region's grids");
    }
    *out = r;
    return PLUMB_OK;
}

plumb_status plumb_region_reset(plumb_region *r, size_t training, plumb_diag *diag)
{
    if (training < 1 || training > PLUMB_REGION_MAX_TRAINING)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "the landing region needs 1 to %d training points, "
                                               "found %zu", PLUMB_REGION_MAX_TRAINING, training);
    r->m = training;
    r->n = r->n_cal = r->outside = 0;
    r->trained = 0;
    r->c[0] = r->c[1] = 0.0;
    r->all_mean[0] = r->all_mean[1] = 0.0;
    r->all_m2[0] = r->all_m2[1] = r->all_m2[2] = 0.0;
    memset(r->dens, 0, (size_t)G * G * sizeof *r->dens);
    memset(r->count, 0, (size_t)G * G * sizeof *r->count);
    return PLUMB_OK;
}

void plumb_region_centre(const plumb_region *r, double centre[2])
{
    centre[0] = r->c[0];
    centre[1] = r->c[1];
}

/* East, north to the grid's axes frame, and back. */
static void to_axes(const plumb_region *r, double e, double n, double *u, double *v)
{
    double de = e - r->c[0], dn = n - r->c[1];
    *u = de * r->cs + dn * r->sn;
    *v = -de * r->sn + dn * r->cs;
}

static void from_axes(const plumb_region *r, double u, double v, double out[2])
{
    out[0] = r->c[0] + u * r->cs - v * r->sn;
    out[1] = r->c[1] + u * r->sn + v * r->cs;
}

static void train(plumb_region *r)
{
    size_t m = r->m;
    double me = 0.0, mn = 0.0;
    for (size_t k = 0; k < m; k++) {
        me += r->train[k][0];
        mn += r->train[k][1];
    }
    me /= (double)m;
    mn /= (double)m;
    double see = 0.0, snn = 0.0, sen = 0.0;
    for (size_t k = 0; k < m; k++) {
        double a = r->train[k][0] - me, b = r->train[k][1] - mn;
        see += a * a;
        snn += b * b;
        sen += a * b;
    }
    r->c[0] = me;
    r->c[1] = mn;
    double theta = 0.5 * atan2(2.0 * sen, see - snn);
    r->cs = cos(theta);
    r->sn = sin(theta);
    /* the points in the axes frame: spread and extent */
    double umin = 0.0, umax = 0.0, vmin = 0.0, vmax = 0.0, suu = 0.0, svv = 0.0;
    for (size_t k = 0; k < m; k++) {
        double u, v;
        to_axes(r, r->train[k][0], r->train[k][1], &u, &v);
        r->train[k][0] = u;
        r->train[k][1] = v;
        suu += u * u;
        svv += v * v;
        if (k == 0 || u < umin) umin = u;
        if (k == 0 || u > umax) umax = u;
        if (k == 0 || v < vmin) vmin = v;
        if (k == 0 || v > vmax) vmax = v;
    }
    double f = pow((double)m, -1.0 / 6.0);
    double hu = sqrt(suu / (double)(m > 1 ? m - 1 : 1)) * f;
    double hv = sqrt(svv / (double)(m > 1 ? m - 1 : 1)) * f;
    double floor_h = fmax(H_FLOOR_M, H_FLOOR_REL * fmax(hu, hv));
    hu = fmax(hu, floor_h);
    hv = fmax(hv, floor_h);
    r->u0 = umin - KERNEL_CUT * hu;
    r->v0 = vmin - KERNEL_CUT * hv;
    r->du = (umax - umin + 2.0 * KERNEL_CUT * hu) / G;
    r->dv = (vmax - vmin + 2.0 * KERNEL_CUT * hv) / G;
    /* the density at the cell centres, one training point after another */
    for (size_t k = 0; k < m; k++) {
        double u = r->train[k][0], v = r->train[k][1];
        long i0 = (long)floor((u - KERNEL_CUT * hu - r->u0) / r->du);
        long i1 = (long)floor((u + KERNEL_CUT * hu - r->u0) / r->du);
        long j0 = (long)floor((v - KERNEL_CUT * hv - r->v0) / r->dv);
        long j1 = (long)floor((v + KERNEL_CUT * hv - r->v0) / r->dv);
        if (i0 < 0) i0 = 0;
        if (j0 < 0) j0 = 0;
        if (i1 > G - 1) i1 = G - 1;
        if (j1 > G - 1) j1 = G - 1;
        for (long j = j0; j <= j1; j++) {
            double b = (r->v0 + ((double)j + 0.5) * r->dv - v) / hv;
            for (long i = i0; i <= i1; i++) {
                double a = (r->u0 + ((double)i + 0.5) * r->du - u) / hu;
                double q = a * a + b * b;
                if (q <= KERNEL_CUT * KERNEL_CUT)
                    r->dens[i + G * j] += exp(-0.5 * q);
            }
        }
    }
    r->trained = 1;
}

/* Welford's update of the mean and co-moments by the k-th point (k >= 1). */
static void moments_add(plumb_region *r, size_t k, double east, double north)
{
    double de = east - r->all_mean[0], dn = north - r->all_mean[1];
    r->all_mean[0] += de / (double)k;
    r->all_mean[1] += dn / (double)k;
    double de2 = east - r->all_mean[0], dn2 = north - r->all_mean[1];
    r->all_m2[0] += de * de2;
    r->all_m2[1] += dn * dn2;
    r->all_m2[2] += de * dn2;
}

void plumb_region_add(plumb_region *r, double east, double north)
{
    if (r->m == 0)
        return; /* not reset yet: nothing to fill */
    moments_add(r, r->n + 1, east, north);
    if (!r->trained) {
        r->train[r->n][0] = east;
        r->train[r->n][1] = north;
        r->n++;
        if (r->n == r->m)
            train(r);
        return;
    }
    r->n++;
    r->n_cal++;
    double u, v;
    to_axes(r, east, north, &u, &v);
    double fi = floor((u - r->u0) / r->du), fj = floor((v - r->v0) / r->dv);
    if (!(fi >= 0.0 && fi < G && fj >= 0.0 && fj < G)) {
        r->outside++;
        return;
    }
    r->count[(size_t)fi + (size_t)G * (size_t)fj]++;
}

/* ---- the cell region ------------------------------------------------------- */

/* Fills the holes of a cell region and joins cells that meet only at a
 * corner, until neither is left (each step only adds cells). */
static void tidy(plumb_region *r, unsigned char *mask, int nu, int nv)
{
    int changed = 1;
    while (changed) {
        changed = 0;
        /* empty cells reached from the border (4-connected) are outside */
        size_t top = 0;
        for (int j = 0; j < nv; j++)
            for (int i = 0; i < nu; i++)
                if ((i == 0 || j == 0 || i == nu - 1 || j == nv - 1) && mask[i + nu * j] == 0) {
                    mask[i + nu * j] = 2;
                    r->stack[top++] = i + nu * j;
                }
        while (top > 0) {
            int32_t c = r->stack[--top];
            int i = c % nu, j = c / nu;
            int nb[4][2] = {{i - 1, j}, {i + 1, j}, {i, j - 1}, {i, j + 1}};
            for (int k = 0; k < 4; k++) {
                int a = nb[k][0], b = nb[k][1];
                if (a < 0 || b < 0 || a >= nu || b >= nv || mask[a + nu * b] != 0)
                    continue;
                mask[a + nu * b] = 2;
                r->stack[top++] = a + nu * b;
            }
        }
        for (int c = 0; c < nu * nv; c++) {
            if (mask[c] == 0) {
                mask[c] = 1; /* a hole */
                changed = 1;
            } else if (mask[c] == 2) {
                mask[c] = 0;
            }
        }
        for (int j = 0; j + 1 < nv; j++)
            for (int i = 0; i + 1 < nu; i++) {
                unsigned char *a = &mask[i + nu * j], *b = &mask[i + 1 + nu * j];
                unsigned char *c = &mask[i + nu * (j + 1)], *d = &mask[i + 1 + nu * (j + 1)];
                if ((*a && *d && !*b && !*c) || (*b && *c && !*a && !*d)) {
                    if (!*b)
                        *b = 1;
                    else
                        *a = 1;
                    changed = 1;
                }
            }
    }
}

/* Grows a cell region by one cell in the four directions. */
static void grow(unsigned char *mask, int nu, int nv)
{
    for (int c = 0; c < nu * nv; c++)
        if (mask[c] == 1) {
            int i = c % nu, j = c / nu;
            if (i > 0 && !mask[c - 1]) mask[c - 1] = 3;
            if (i < nu - 1 && !mask[c + 1]) mask[c + 1] = 3;
            if (j > 0 && !mask[c - nu]) mask[c - nu] = 3;
            if (j < nv - 1 && !mask[c + nu]) mask[c + nu] = 3;
        }
    for (int c = 0; c < nu * nv; c++)
        if (mask[c] == 3)
            mask[c] = 1;
}

/* The grid frame of a cell region: corner (u0, v0), cell sides du, dv. */
typedef struct frame {
    int nu, nv;
    double u0, v0, du, dv;
} frame;

/* Traces a tidy cell region into poly; -1 when it does not fit. */
static int trace(plumb_region *r, const unsigned char *mask, const frame *fr,
                 plumb_region_polygon *poly)
{
    int nu = fr->nu, nv = fr->nv, W = nu + 1;
    for (int k = 0; k < W * (nv + 1); k++)
        r->next[k] = -1;
    size_t cells = 0;
    for (int j = 0; j < nv; j++)
        for (int i = 0; i < nu; i++) {
            if (!mask[i + nu * j])
                continue;
            cells++;
            int v00 = i + W * j, v10 = v00 + 1, v01 = v00 + W, v11 = v01 + 1;
            if (j == 0 || !mask[i + nu * (j - 1)]) r->next[v00] = v10;
            if (i == nu - 1 || !mask[i + 1 + nu * j]) r->next[v10] = v11;
            if (j == nv - 1 || !mask[i + nu * (j + 1)]) r->next[v11] = v01;
            if (i == 0 || !mask[i - 1 + nu * j]) r->next[v01] = v00;
        }
    memset(poly, 0, sizeof *poly);
    poly->area_m2 = (double)cells * fr->du * fr->dv;
    for (int s = 0; s < W * (nv + 1); s++) {
        if (r->next[s] < 0)
            continue;
        if (poly->n_rings == PLUMB_REGION_MAX_RINGS)
            return -1;
        size_t first = poly->n_vertices;
        int v = s, prev = -1;
        /* the start is the lowest vertex of its ring: a corner */
        do {
            int nx = r->next[v];
            int turn = 1;
            if (prev >= 0) {
                int din = v - prev, dout = nx - v;
                turn = din != dout;
            }
            if (turn) {
                if (poly->n_vertices + 1 >= PLUMB_REGION_MAX_VERTICES)
                    return -1;
                double u = fr->u0 + (double)(v % W) * fr->du, w = fr->v0 + (double)(v / W) * fr->dv;
                from_axes(r, u, w, poly->vertex_m[poly->n_vertices++]);
            }
            r->next[v] = -1;
            prev = v;
            v = nx;
        } while (v != s);
        /* the start's own turn was taken on the first step; close the ring */
        memcpy(poly->vertex_m[poly->n_vertices], poly->vertex_m[first], sizeof poly->vertex_m[0]);
        poly->n_vertices++;
        poly->ring_first[poly->n_rings] = first;
        poly->ring_count[poly->n_rings] = poly->n_vertices - first;
        poly->n_rings++;
    }
    return 0;
}

/* Tidies and traces, growing the region until its outline fits. */
static plumb_status outline(plumb_region *r, unsigned char *mask, const frame *fr,
                            plumb_region_polygon *poly, plumb_diag *diag)
{
    for (int g = 0; g <= MAX_GROW; g++) {
        tidy(r, mask, fr->nu, fr->nv);
        if (trace(r, mask, fr, poly) == 0)
            return PLUMB_OK;
        grow(mask, fr->nu, fr->nv);
    }
    return PLUMB_RAISE(diag, PLUMB_ENUMERIC, "the landing region's outline has more than %d "
                                             "vertices", PLUMB_REGION_MAX_VERTICES);
}

static int by_density(const void *a, const void *b)
{
    const cell_rank *x = a, *y = b;
    if (x->d != y->d)
        return x->d > y->d ? -1 : 1;
    return (x->i > y->i) - (x->i < y->i);
}

/* hypot(gu, gv) <= s, with hypot's own figure: a zero leg gives the other
 * one exactly (C11 F.10.4.3: hypot(x, +-0) is fabs(x)), so the call is
 * needed only off the rows and columns of the cell. */
static int within(double gu, double gv, double s)
{
    if (gu == 0.0)
        return gv <= s;
    if (gv == 0.0)
        return gu <= s;
    return hypot(gu, gv) <= s;
}

/* Every buffer cell within buffer_m of a region cell (distance between the
 * cell rectangles), on a grid covering the region plus the buffer. */
static void buffer_mask(plumb_region *r, const unsigned char *reg, double s, frame *bf)
{
    int imin = G, imax = -1, jmin = G, jmax = -1;
    for (int j = 0; j < G; j++)
        for (int i = 0; i < G; i++)
            if (reg[i + G * j]) {
                if (i < imin) imin = i;
                if (i > imax) imax = i;
                if (j < jmin) jmin = j;
                if (j > jmax) jmax = j;
            }
    double ua = r->u0 + imin * r->du, ub = r->u0 + (imax + 1) * r->du;
    double va = r->v0 + jmin * r->dv, vb = r->v0 + (jmax + 1) * r->dv;
    double eu = ub - ua + 2.0 * s, ev = vb - va + 2.0 * s;
    bf->du = fmax(r->du, eu / (BG - 2));
    bf->dv = fmax(r->dv, ev / (BG - 2));
    bf->nu = (int)fmin(BG, ceil(eu / bf->du) + 2.0);
    bf->nv = (int)fmin(BG, ceil(ev / bf->dv) + 2.0);
    bf->u0 = ua - s - bf->du;
    bf->v0 = va - s - bf->dv;
    unsigned char *m = r->mask;
    memset(m, 0, (size_t)BG * BG);
    double hu = 0.5 * (r->du + bf->du), hv = 0.5 * (r->dv + bf->dv);
    for (int j = jmin; j <= jmax; j++)
        for (int i = imin; i <= imax; i++) {
            if (!reg[i + G * j])
                continue;
            int edge = i == 0 || j == 0 || i == G - 1 || j == G - 1 || !reg[i - 1 + G * j] ||
                       !reg[i + 1 + G * j] || !reg[i + G * (j - 1)] || !reg[i + G * (j + 1)];
            double uc = r->u0 + (i + 0.5) * r->du, vc = r->v0 + (j + 0.5) * r->dv;
            /* an interior cell marks the buffer cells it overlaps; one on the
             * edge every buffer cell within s */
            double reach = edge ? s : 0.0;
            int a0 = (int)floor((uc - 0.5 * r->du - reach - bf->u0) / bf->du);
            int a1 = (int)floor((uc + 0.5 * r->du + reach - bf->u0) / bf->du);
            int b0 = (int)floor((vc - 0.5 * r->dv - reach - bf->v0) / bf->dv);
            int b1 = (int)floor((vc + 0.5 * r->dv + reach - bf->v0) / bf->dv);
            if (a0 < 0) a0 = 0;
            if (b0 < 0) b0 = 0;
            if (a1 > bf->nu - 1) a1 = bf->nu - 1;
            if (b1 > bf->nv - 1) b1 = bf->nv - 1;
            for (int b = b0; b <= b1; b++) {
                double gv = fmax(0.0, fabs(bf->v0 + (b + 0.5) * bf->dv - vc) - hv);
                for (int a = a0; a <= a1; a++) {
                    unsigned char *cell = &m[a + bf->nu * b];
                    if (*cell)
                        continue; /* marked by a neighbour already: the test could not unmark it */
                    double gu = fmax(0.0, fabs(bf->u0 + (a + 0.5) * bf->du - uc) - hu);
                    if (!edge || within(gu, gv, s))
                        *cell = 1;
                }
            }
        }
}

plumb_status plumb_region_finish(plumb_region *r, double p, double level, double buffer_m,
                                 plumb_region_result *out, plumb_diag *diag)
{
    if (!(p > 0.0 && p < 1.0) || !(level > 0.0 && level < 1.0) || !(buffer_m >= 0.0) ||
        !isfinite(buffer_m))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "landing region: bad fraction, level or buffer");
    memset(out, 0, sizeof *out);
    out->p = p;
    out->level = level;
    out->training = r->trained ? r->m : r->n;
    out->calibration = r->n_cal;
    out->buffer_m = buffer_m;
    out->open = 1;
    if (!r->trained || r->n_cal == 0)
        return PLUMB_OK;
    out->cell_m[0] = r->du;
    out->cell_m[1] = r->dv;
    /* the major principal axis of all the points (see the top of the file) */
    double theta = 0.5 * atan2(2.0 * r->all_m2[2], r->all_m2[0] - r->all_m2[1]);
    double bearing = fmod(90.0 - theta * DEG_PER_RAD + 360.0, 180.0);
    out->axis_deg = bearing >= 180.0 ? 0.0 : bearing;
    size_t lo = 0, u = 0;
    if (plumb_quantile_ranks(r->n_cal, p, level, &lo, &u) != PLUMB_OK || u > r->n_cal)
        return PLUMB_OK;
    out->rank = u;
    /* cells in decreasing density, ties by index: the same order every run */
    size_t nc = (size_t)G * G;
    for (size_t c = 0; c < nc; c++)
        r->order[c] = (cell_rank){r->dens[c], c};
    qsort(r->order, nc, sizeof *r->order, by_density);
    size_t cum = 0, k = 0;
    while (k < nc && cum < u)
        cum += r->count[r->order[k++].i];
    if (cum < u)
        return PLUMB_OK;
    double tau = r->order[k - 1].d;
    if (!(tau > 0.0))
        return PLUMB_OK; /* the bound reaches points of no density: no bounded region */
    unsigned char reg[(size_t)G * G];
    memset(reg, 0, sizeof reg);
    for (size_t c = 0; c < nc && r->order[c].d >= tau; c++)
        reg[r->order[c].i] = 1;
    frame fr = {G, G, r->u0, r->v0, r->du, r->dv};
    plumb_status st = outline(r, reg, &fr, &out->polygon, diag);
    if (st != PLUMB_OK)
        return st;
    for (size_t c = 0; c < nc; c++)
        if (reg[c])
            out->inside += r->count[c];
    if (buffer_m > 0.0) {
        frame bf;
        buffer_mask(r, reg, buffer_m, &bf);
        st = outline(r, r->mask, &bf, &out->buffered, diag);
        if (st != PLUMB_OK)
            return st;
    } else {
        out->buffered = out->polygon;
    }
    out->open = 0;
    return PLUMB_OK;
}
