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
 *   shape          a body's Cd on its frontal area from published bluff-body
 *                  tables (subcritical Re, sharp edges), interpolated by aspect
 *                  ratio, each row with its source and status (src/drag.c):
 *                  rectangular plates by b/h (White, Fluid Mechanics, Table 7.3,
 *                  after Hoerner 1965), square prisms along the flow by L/D
 *                  (cube: Munson et al. Fig. 9.20; L/D 1.5-5: DNVGL-RP-N103
 *                  Table B-2), circular cylinders end-on from the disc (L/D 0)
 *                  to L/D 7 and broadside by L/D (Aeronautical Engineer Data
 *                  Book Fig. 5.13). A box face is Cd_plate(b/h) x
 *                  Cd_prism(depth / sqrt(face area)) / Cd_prism(0). Tumbling:
 *                  Cauchy's mean projected area (surface / 4) with
 *                  Cd = sum(w Cd A) / sum(w A) over the tabulated orientations,
 *                  a box's edge-on ones from the cube's edge-on value (plumb's
 *                  own averaging; no published tumbling Cd).
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
    int extrapolated;         /* 1: a shape's aspect ratio lay outside a table it uses (end value held) */
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

/* Fills *out (model, cd, area_m2, cd_area_m2, extrapolated, source) from a
 * shape, with published Cd values interpolated by aspect ratio (see the top
 * of this header); out->source names every value, the table rows it came
 * from and their sources with status, and out->extrapolated is 1 when an
 * aspect ratio lay outside a table (its end row held). Broadside: a
 * cylinder's axis across the flow, a box's or plate's largest face to it;
 * end-on: the axis along the flow, the smallest face to it. PLUMB_EINVAL
 * for a non-positive or non-finite edge, *out then untouched. */
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

/* The drag area as the profile gives it, cd x area or cd_area, m^2,
 * whatever the model (a fixed drag's CdA at any Re). Can't fail. */
double plumb_drag_given_cd_area(const plumb_drag_spec *spec);

#endif /* PLUMB_DRAG_H */
