/*
 * plumb/inflation.h - how a canopy fills, and the published hand estimate
 * of its opening force.
 *
 * Inflation curve: after line stretch (t = 0) the canopy's drag area grows
 * as a power of time until the end of filling t_f,
 *
 *     CdS(t) = (CdS)_0 (t / t_f)^j,        0 <= t <= t_f,
 *
 * with the exponent j by canopy type, and t_f = n D0 / v_1 from the fill
 * constant n, the nominal diameter D0 and the air speed v_1 at line
 * stretch (Knacke, Parachute Recovery Systems Design Manual, NWC TP 6575,
 * Naval Weapons Center 1991, ch. 5; the form and t_f = n D0 / v seen in a
 * transcription, the per-type values of j, n and C_x from memory: see the
 * table in inflation.c).
 *
 * Pflanz's method (as Knacke presents it): horizontal deployment, no
 * gravity, constant density, point mass. With the ballistic parameter
 *
 *     A = 2 m / (rho (CdS)_0 v_1 t_f)
 *
 * the speed during the fill is v/v_1 = 1 / (1 + tau^(j+1) / (A (j+1))),
 * tau = t/t_f, and the force F = q_1 (CdS)_0 tau^j (v/v_1)^2. Its largest
 * value over 0 <= tau <= 1 is the force-reduction factor X_1 (closed form,
 * derived from those assumptions; it replaces Knacke's chart):
 *
 *     tau*^(j+1) = A j (j+1) / (j+2);
 *     tau* < 1:  X_1 = tau*^j ((j+2) / (2j+2))^2
 *     else:      X_1 = 1 / (1 + 1 / (A (j+1)))^2
 *
 * and the opening force F_x = C_x X_1 q_1 (CdS)_0, C_x the infinite-mass
 * opening-force coefficient by canopy type (wind-tunnel values).
 *
 * Plain functions and static tables; nothing to allocate or free.
 */
#ifndef PLUMB_INFLATION_H
#define PLUMB_INFLATION_H

/* Largest inflation exponent accepted: the published curves run from 1/2
 * to about 6 (Knacke 1991); beyond 20 the curve is a step in all but name. */
#define PLUMB_INFLATION_J_MAX 20.0

typedef enum plumb_canopy {
    PLUMB_CANOPY_UNSPECIFIED = 0, /* no type given: linear fill (j = 1) unless given */
    PLUMB_CANOPY_FLAT_CIRCULAR,   /* "flat-circular" (solid flat textile) */
    PLUMB_CANOPY_CONICAL,         /* "conical" (solid textile) */
    PLUMB_CANOPY_HEMISPHERICAL,   /* "hemispherical" (solid textile) */
    PLUMB_CANOPY_EXTENDED_SKIRT,  /* "extended-skirt" */
    PLUMB_CANOPY_CROSS,           /* "cross" */
    PLUMB_CANOPY_RIBBON,          /* "ribbon" (flat ribbon) */
    PLUMB_CANOPY_RINGSLOT,        /* "ringslot" */
    PLUMB_CANOPY_RINGSAIL,        /* "ringsail" */
    PLUMB_CANOPY_COUNT
} plumb_canopy;

/* Published figures for one canopy type. A figure the map of sources does
 * not give for the type is 0 (the profile must then give it). */
typedef struct plumb_canopy_info {
    const char *name;           /* the profile's word, e.g. "flat-circular" */
    double exponent;            /* j of CdS ~ (t/t_f)^j, or 0 */
    double fill_constant;       /* n of t_f = n D0 / v_1, or 0 */
    double opening_factor;      /* C_x, infinite-mass opening-force coefficient, or 0 */
    const char *source;         /* where the three come from, with their status */
} plumb_canopy_info;

/* The figures of a canopy type; NULL for PLUMB_CANOPY_UNSPECIFIED or a
 * value out of range. Static storage. Can't fail otherwise. */
const plumb_canopy_info *plumb_canopy_info_of(plumb_canopy c);

/* The canopy type named by word ("ringslot"), or PLUMB_CANOPY_UNSPECIFIED
 * when the word names none. */
plumb_canopy plumb_canopy_from_name(const char *word);

/* CdS(t)/(CdS)_0 = tau^j for 0 <= tau <= 1 (1 above, 0 below). j > 0. */
double plumb_inflation_fraction(double tau, double j);

/* Pflanz's ballistic parameter A = 2 m / (rho CdS0 v1 tf); all inputs > 0. */
double plumb_pflanz_ballistic(double mass_kg, double rho_kg_m3, double cds0_m2, double v1_m_s,
                              double tf_s);

/* Pflanz's force-reduction factor X_1(A, j) by the closed form above, and
 * (when tau_peak is not NULL) the fraction of the fill time at which the
 * force peaks. A > 0, j > 0; otherwise returns 0. Can't fail. */
double plumb_pflanz_x1(double A, double j, double *tau_peak);

#endif /* PLUMB_INFLATION_H */
