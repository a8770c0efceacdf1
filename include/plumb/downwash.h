/*
 * plumb/downwash.h - the rotor wake of a hovering multirotor, which a
 * payload let go under it falls through.
 *
 * Hover thrust T = m_aircraft g. Actuator-disk momentum theory (Glauert;
 * J. G. Leishman, Principles of Helicopter Aerodynamics, 2nd ed., CUP
 * 2006, ch. 2; seen in a transcription) over the total rotor disk area A:
 *
 *     v_i = sqrt(T / (2 rho A))        induced velocity at the disk
 *     2 v_i                            far-wake velocity, wake area A/2
 *
 * Along the wake, at depth d below the rotor plane (plumb's construction
 * from momentum theory and the round-jet law, not a published fit; the
 * source of each part is named with it):
 *  - near: the axial velocity of the vortex cylinder that an actuator disk
 *    of radius R = sqrt(A/pi) sheds, u_n = v_i (1 + d / sqrt(d^2 + R^2))
 *    (classical vortex-theory result, from memory): v_i at the disk, 2 v_i
 *    far below it, smoothly falling to 0 above it;
 *  - far: a round turbulent jet with the wake's momentum flux, u_j =
 *    B (2 v_i) d_w / d, d_w = sqrt(2A/pi) the diameter of the contracted
 *    wake, B = 6.11 (A. A. Abdel-Rahman, S. F. Al-Fahed, W. Chakroun, Mech.
 *    Res. Commun. 23, 1996, Re 19 400; seen; handbooks give 5.8 to 6.3,
 *    from memory);
 *  - the two blended as u_c = (u_n^-4 + u_j^-4)^(-1/4) (plumb's own
 *    blend): the near form where the jet's would be larger;
 *  - across the wake a Gaussian, u = u_c exp(-ln 2 (r/b)^2) (Pope,
 *    Turbulent Flows 2000, ch. 5; seen in a transcription), with the
 *    half-width b = sqrt(R_w^2 + (S d)^2), R_w = R / sqrt 2 the contracted
 *    wake's radius and S = 0.1 (round-jet spreading rate, Pope; from
 *    memory): plumb's blend of the two.
 *  - Forward flight or wind: the air moves past the rotor at V_rel (wind
 *    at release height minus the aircraft's velocity); the induced velocity
 *    drops to Glauert's v_i^2 = (-V^2 + sqrt(V^4 + 4 v_h^4)) / 2 (disk
 *    edge-on; from memory) and the wake leans downwind from the vertical by
 *    the skew angle chi = atan(V_rel / v_i) (Leishman; from memory). The
 *    aircraft is taken to keep its release velocity for the whole fall.
 *
 * Valid for hover and slow flight (V_rel below about v_h): at higher
 * speeds the wake is swept away behind the aircraft and this is a rough
 * guide only. Plain functions; nothing to allocate.
 */
#ifndef PLUMB_DOWNWASH_H
#define PLUMB_DOWNWASH_H

/* Round-jet decay constant, U_c = B U_J d / x (Abdel-Rahman et al. 1996). */
#define PLUMB_DOWNWASH_JET_B 6.11
/* Round-jet spreading rate of the half-width, b = S x (Pope 2000, from memory). */
#define PLUMB_DOWNWASH_JET_S 0.10

typedef struct plumb_downwash_spec {
    double aircraft_mass_kg;  /* hovering aircraft's mass (thrust = weight); 0: no downwash */
    double disk_area_m2;      /* total rotor disk area, m^2; 0: no downwash */
} plumb_downwash_spec;

/* The wake of one release, resolved once. */
typedef struct plumb_downwash {
    int on;                   /* 1: a wake is applied */
    double thrust_n;          /* T, N */
    double v_hover_m_s;       /* v_h = sqrt(T / (2 rho A)), m/s */
    double v_i_m_s;           /* induced velocity at V_rel (Glauert), m/s */
    double radius_m;          /* R = sqrt(A / pi) */
    double wake_d_m;          /* d_w = sqrt(2 A / pi) */
    double skew_rad;          /* chi, from the vertical */
    double dir[2];            /* unit horizontal direction the wake leans (east, north) */
    double origin_m[3];       /* rotor hub at release, m */
    double aircraft_v_m_s[2]; /* aircraft's horizontal velocity, m/s */
} plumb_downwash;

/* Resolves the wake: rho at the rotor, g there, the release point and
 * velocity (the aircraft's) and the relative wind (wind at the rotor minus
 * the aircraft's velocity, east and north). out->on is 0 when the spec
 * gives no aircraft mass or disk area. */
void plumb_downwash_init(const plumb_downwash_spec *spec, double rho_kg_m3, double g_m_s2,
                         const double release_m[3], const double aircraft_v_m_s[2],
                         const double v_rel_m_s[2], plumb_downwash *out);

/* Air velocity of the wake (east, north, up; up is negative: the wake
 * blows down) at point p_m and time t_s. Zero when out->on is 0. */
void plumb_downwash_at(const plumb_downwash *dw, double t_s, const double p_m[3],
                       double w_m_s[3]);

/* Centreline speed at depth d below the rotor in hover (no skew), m/s. */
double plumb_downwash_centreline(const plumb_downwash *dw, double d_m);

#endif /* PLUMB_DOWNWASH_H */
