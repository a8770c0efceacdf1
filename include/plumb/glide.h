/*
 * plumb/glide.h - plates that glide, flutter or tumble sideways as they fall.
 *
 * A falling plate, sheet or panel does not fall straight: it flutters
 * (rocks from side to side) or tumbles (autorotates), and a tumbling plate
 * makes lift about as large as its drag, so it glides sideways.
 *  - Tumbling: E. H. Smith, "Autorotating wings: an experimental
 *    investigation", Univ. of Michigan, July 1970 (DTIC AD0710288), Re
 *    2.4e5: mean lift coefficient 2.20, mean drag coefficient 1.60 (seen);
 *    glide L/D = 1.375, a path 36.0 deg below horizontal, so the sideways
 *    travel is up to 1.375 x the height fallen in still air (computed).
 *    Freely falling wings behaved like the fixed-axis ones (seen).
 *  - Fluttering: thin disks in air at Re about 1e2 fall straight,
 *    broadside, or drift at an angle below 20 deg from the vertical,
 *    lateral/vertical < tan 20 deg = 0.364 (A. Tinklenberg, M. Guala,
 *    F. Coletti, "Thin disks falling in air", J. Fluid Mech. 2023; seen).
 *  - Regime: by the dimensionless moment of inertia I* = rho_s h / (rho_f l)
 *    (h thickness, l width; A. Andersen, U. Pesavento, Z. J. Wang, J. Fluid
 *    Mech. 541, 2005: definition from memory), whose plates fluttered at
 *    I* about 0.16 and tumbled at about 0.32 (from memory); plumb takes
 *    I* >= 0.3 as tumbling. The published Froude-number boundary (Fr_c =
 *    0.67 +- 0.05, Belmonte, Eisenberg & Moses, Phys. Rev. Lett. 81, 1998,
 *    seen) is not applied: the lengths in its Fr were not seen.
 *
 * The direction is random (the spin sense decides it), so a zone draws a
 * uniform azimuth and a glide ratio uniform between 0 and the regime's
 * largest (plumb's own choice of distribution, no source).
 */
#ifndef PLUMB_GLIDE_H
#define PLUMB_GLIDE_H

/* Smith (1970): mean C_L / mean C_D of an autorotating plate. */
#define PLUMB_GLIDE_TUMBLE_RATIO (2.20 / 1.60)
/* Tinklenberg et al. (2023): tan 20 deg. */
#define PLUMB_GLIDE_FLUTTER_RATIO 0.36397023426620234
/* I* at and above which a plate is taken to tumble (Andersen et al. 2005,
 * between their fluttering 0.16 and tumbling 0.32; from memory). */
#define PLUMB_GLIDE_TUMBLE_ISTAR 0.3
/* A box is plate-like when its smallest edge is at most this fraction of
 * its middle edge (plumb's rule: common practice, no source). */
#define PLUMB_GLIDE_THIN_FRACTION 0.2

typedef enum plumb_glide_mode {
    PLUMB_GLIDE_OFF = 0,     /* no glide (not plate-like, or "off") */
    PLUMB_GLIDE_TUMBLE,      /* autorotating: ratio up to Smith's 1.375 */
    PLUMB_GLIDE_FLUTTER      /* fluttering: ratio up to tan 20 deg */
} plumb_glide_mode;

typedef struct plumb_glide_spec {
    plumb_glide_mode mode;   /* off, tumble or flutter */
    double istar;            /* I* from the shape and mass, 0 when not computed */
    int from_shape;          /* 1: the regime was chosen from I* ("auto") */
} plumb_glide_spec;

/* Largest lateral travel over height fallen for a mode (0 when off). */
double plumb_glide_ratio_max(plumb_glide_mode mode);

/* I* = rho_s h / (rho_f l) of a plate of mass m with faces a x b (l the
 * shorter, b), thickness h: rho_s h = m / (a b). rho_f in kg/m^3. */
double plumb_glide_istar(double mass_kg, double a_m, double b_m, double rho_f_kg_m3);

/* The regime for an I*: tumble at and above PLUMB_GLIDE_TUMBLE_ISTAR. */
plumb_glide_mode plumb_glide_regime(double istar);

/* Glide displacement (east, north, m) after falling height_m, from two
 * uniform numbers in [0, 1): ratio = u_ratio x max, azimuth 2 pi u_dir
 * clockwise from north. Zero when the mode is off. */
void plumb_glide_offset(plumb_glide_mode mode, double height_m, double u_ratio, double u_dir,
                        double out_m[2]);

/* The profile's word for a mode ("off", "tumble", "flutter"). */
const char *plumb_glide_mode_name(plumb_glide_mode mode);

#endif /* PLUMB_GLIDE_H */
