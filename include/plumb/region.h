/*
 * plumb/region.h - where things land: a region of the ground that holds a
 * stated fraction p of the impact points, from a stream of points, with a
 * distribution-free bound on its coverage (README.md "plumb zone", "Where
 * the impacts land").
 *
 * Method: split conformal prediction (J. Lei, J. Robins, L. Wasserman,
 * "Distribution-free prediction sets", JASA 108 (2013) 278-287). The
 * first m points (the training points) fix, once, a Gaussian kernel
 * density estimate on a fixed grid of PLUMB_REGION_GRID x PLUMB_REGION_GRID
 * cells laid along the principal axes of the training points (bandwidth
 * per axis by Scott's rule h = sd m^(-1/6), D. W. Scott, Multivariate
 * Density Estimation, 1992, eq. 6.42; kernel cut at 4 h). Every later point
 * (the calibration points, counted one by one, nothing kept per point)
 * scores the density of the cell it falls in. The region is the set of
 * cells whose density is at least the u-th largest calibration score, u
 * the rank of plumb_quantile_ranks (dispersion.h) that bounds the
 * p-quantile from above at `level`: the calibration points are
 * independent of the grid, so with probability >= level the region holds
 * at least p of all impacts (the distribution-free order-statistic bound,
 * H. A. David, H. N. Nagaraja, Order Statistics, 3rd ed., 2003, sec. 7.1;
 * the training-conditional form of split conformal, V. Vovk, "Conditional
 * validity of inductive conformal predictors", ACML 2012). Enlarging the
 * region keeps that bound, so holes are filled and two cells meeting only
 * at a corner are joined: every part is then a simple polygon, traced
 * counter-clockwise along the cell edges.
 *
 * The buffer (the scatter allowance) is the same kind of cell region on a
 * second grid: every cell that comes within the buffer distance of the
 * region, the distance taken between cell rectangles, so it holds the
 * exact buffer (the Minkowski sum with a disc) and overstates it by at
 * most one buffer cell.
 *
 * Memory is fixed (the grids and m <= PLUMB_REGION_MAX_TRAINING training
 * points), whatever the number of points; the result depends only on the
 * points and their order.
 *
 * Ownership: a plumb_region owns its grids; a result is plain data.
 */
#ifndef PLUMB_REGION_H
#define PLUMB_REGION_H

#include <stddef.h>
#include "plumb/error.h"

enum {
    PLUMB_REGION_GRID = 128,            /* density grid cells per axis */
    PLUMB_REGION_BUFFER_GRID = 256,     /* most buffer grid cells per axis */
    PLUMB_REGION_MAX_TRAINING = 4096,   /* most training points */
    PLUMB_REGION_MAX_RINGS = 32,        /* most parts of one polygon */
    PLUMB_REGION_MAX_VERTICES = 2048    /* most vertices of one polygon, all rings */
};

/* A polygon of one or more parts, each a closed counter-clockwise ring
 * (the last vertex repeats the first; RFC 7946 section 3.1.6 winding),
 * without holes, in east, north metres. */
typedef struct plumb_region_polygon {
    size_t n_rings;                               /* rings[0..n) */
    size_t ring_first[PLUMB_REGION_MAX_RINGS];    /* first vertex of each ring */
    size_t ring_count[PLUMB_REGION_MAX_RINGS];    /* vertices of each ring, closing one too */
    size_t n_vertices;
    double vertex_m[PLUMB_REGION_MAX_VERTICES][2];/* east, north, m */
    double area_m2;                               /* area of all parts, m^2 */
} plumb_region_polygon;

/* The region of one stream of points. */
typedef struct plumb_region_result {
    double p;                 /* fraction of impacts the region is to hold */
    double level;             /* confidence of that bound */
    size_t training;          /* m: points that fixed the grid */
    size_t calibration;       /* points counted against it */
    int open;                 /* 1: too few calibration points, or the bound falls
                                 outside the grid: no polygon */
    size_t rank;              /* u: the calibration score rank used */
    size_t inside;            /* calibration points inside the polygon (>= rank) */
    double cell_m[2];         /* density cell sides along the grid's axes (the training
                                 points' principal axes), m */
    double axis_deg;          /* bearing from north, [0, 180) deg, of the main axis of the
                                 landing region: the major principal axis of the sample
                                 covariance of every point added (K. Pearson 1901), in
                                 the order added; 90 (east) when the points do not
                                 spread */
    double buffer_m;          /* buffer distance, m */
    plumb_region_polygon polygon;  /* the region (when not open) */
    plumb_region_polygon buffered; /* the region with the buffer (when not open) */
} plumb_region_result;

typedef struct plumb_region plumb_region;

/* Makes an empty region accumulator. PLUMB_ENOMEM. */
plumb_status plumb_region_alloc(plumb_region **out, plumb_diag *diag);

/* Frees it. Accepts NULL. */
void plumb_region_free(plumb_region *r);

/* Starts over: the next `training` points (1 <= training <=
 * PLUMB_REGION_MAX_TRAINING) fix the grid, the rest are counted.
 * PLUMB_EINVAL for a bad count. */
plumb_status plumb_region_reset(plumb_region *r, size_t training, plumb_diag *diag);

/* Adds the next point (east, north, m; finite); ignored before the first
 * plumb_region_reset. Can't fail. */
void plumb_region_add(plumb_region *r, double east, double north);

/* The mean of the training points (both 0 before any). Can't fail. */
void plumb_region_centre(const plumb_region *r, double centre[2]);

/* The region holding p of the points at `level` (0 < p, level < 1), and
 * it buffered by buffer_m >= 0, into *out. Before the training points are
 * all in, or with too few calibration points, out->open is 1. PLUMB_EINVAL
 * for bad arguments. */
plumb_status plumb_region_finish(plumb_region *r, double p, double level, double buffer_m,
                                 plumb_region_result *out, plumb_diag *diag);

#endif /* PLUMB_REGION_H */
