/*
 * plumb/drag.h - aerodynamic drag of the payload and of descent devices.
 *
 * Drag force D = 1/2 rho CdA |v_rel| v_rel, with v_rel = v - w.
 * CdA comes from one of:
 *   fixed          cd x area, or cd_area directly (cd = 0: drag-free)
 *   sphere         Cd(Re) of a sphere of the given diameter, Re = rho |v_rel| D / mu,
 *                  by Morrison's correlation (F. A. Morrison, "Data Correlation
 *                  for Drag Coefficient for Sphere", Michigan Technological
 *                  University 2010, eq. 1, valid Re <= 1e6) or the
 *                  Clift-Grace-Weber standard drag curve (Bubbles, Drops,
 *                  and Particles, 1978, Table 5.2).
 */
#ifndef PLUMB_DRAG_H
#define PLUMB_DRAG_H

#include "plumb/error.h"

typedef enum plumb_drag_model {
    PLUMB_DRAG_FIXED = 0,         /* constant cd_area_m2 */
    PLUMB_DRAG_SPHERE_MORRISON,   /* Cd(Re), Morrison 2010 eq. 1 */
    PLUMB_DRAG_SPHERE_CGW         /* Cd(Re), Clift, Grace & Weber 1978 */
} plumb_drag_model;

/* Room for a source text: a shape's names every value and its source. */
enum { PLUMB_DRAG_SOURCE = 1536 };

typedef struct plumb_drag_spec {
    plumb_drag_model model;   /* how CdA is found */
    double cd;                /* drag coefficient on area_m2 (fixed), 0..10 */
    double area_m2;           /* reference area, m^2; > 0: CdA = cd x area_m2 */
    double cd_area_m2;        /* CdA, m^2, used when area_m2 is 0 (`cd_area:` given) */
    double diameter_m;        /* sphere models: diameter, m (area_m2 = pi d^2 / 4) */
    int extrapolated;         /* 1: a shape's aspect ratio lay outside the handbook table (end value held) */
    char source[PLUMB_DRAG_SOURCE]; /* where cd and area came from, for the report */
} plumb_drag_spec;

typedef enum plumb_shape_kind {
    PLUMB_SHAPE_NONE = 0,   /* no shape: drag given directly */
    PLUMB_SHAPE_SPHERE,     /* dims[0] = diameter */
    PLUMB_SHAPE_CYLINDER,   /* dims[0] = length, dims[1] = diameter */
    PLUMB_SHAPE_BOX,        /* dims[0..2] = the three edges */
    PLUMB_SHAPE_PLATE       /* dims[0..1] = the two edges, dims[2] = thickness */
} plumb_shape_kind;

typedef enum plumb_attitude {
    PLUMB_ATTITUDE_TUMBLING = 0, /* mean projected area, Cauchy: surface area / 4 */
    PLUMB_ATTITUDE_BROADSIDE,    /* cylinder axis across the flow; box: largest face to the flow */
    PLUMB_ATTITUDE_END_ON        /* cylinder axis along the flow; box: smallest face to the flow */
} plumb_attitude;

typedef struct plumb_shape_spec {
    plumb_shape_kind kind;    /* which body */
    double dims_m[3];         /* edges as documented on each kind, m (> 0) */
    plumb_attitude attitude;  /* how it meets the air */
} plumb_shape_spec;

/* Fills *out (model, cd, area_m2, cd_area_m2, source) from a shape, with
 * handbook Cd values interpolated by aspect ratio; every value's source is
 * written into out->source. PLUMB_EINVAL for a non-positive edge. */
plumb_status plumb_drag_from_shape(const plumb_shape_spec *shape, plumb_drag_spec *out);

/* Surface area / 4 of a convex body (Cauchy's mean projected area), m^2. */
double plumb_shape_mean_projected_area(const plumb_shape_spec *shape);

/* Sphere drag coefficient by Morrison's correlation (2010 handout, eq. 1,
 * with the last term Re^0.8 / 461000), Re > 0. */
double plumb_drag_sphere_morrison(double re);

/* Sphere drag coefficient by the Clift-Grace-Weber curve, Re > 0. */
double plumb_drag_sphere_cgw(double re);

/* CdA of the body at Reynolds number based on its diameter (ignored for
 * fixed drag), m^2. */
double plumb_drag_cd_area(const plumb_drag_spec *spec, double re);

#endif /* PLUMB_DRAG_H */
