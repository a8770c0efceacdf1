/*
 * plumb/turbulence.h - low-altitude gusts from the Dryden or von Karman
 * turbulence models of MIL-F-8785C (1980) / MIL-HDBK-1797 (1997), realised
 * as a sum of random Fourier modes.
 *
 * Model (below 1000 ft; h in ft, clamped to 10 ft .. 1000 ft; formulas
 * transcribed from general-purpose library documentation: the Modelica
 * Standard Library's DrydenContinuousTurbulence and the MathWorks Aerospace
 * Blockset's turbulence blocks, among others; the specifications' section
 * numbers and the 10 ft clamp from memory):
 *
 *     sigma_w = 0.1 W20          (W20: mean wind at 20 ft; light 15 kn,
 *                                 moderate 30 kn, severe 45 kn)
 *     sigma_u = sigma_v = sigma_w / (0.177 + 0.000823 h)^0.4
 *     L_w = h,  L_u = L_v = h / (0.177 + 0.000823 h)^1.2       (MIL-F-8785C)
 *
 * one-sided spectra in the spatial frequency Omega (int_0^inf = sigma^2):
 *     Dryden u:   sigma^2 (2L/pi) / (1 + (L Omega)^2)
 *     Dryden v,w: sigma^2 (L/pi) (1 + 3 (L Omega)^2) / (1 + (L Omega)^2)^2
 *     vK u:       sigma^2 (2L/pi) / (1 + (1.339 L Omega)^2)^(5/6)
 *     vK v,w:     sigma^2 (L/pi) (1 + 8/3 (1.339 L Omega)^2) / (1 + (1.339 L Omega)^2)^(11/6)
 *
 * u is along the mean wind, v across it, w up. The specifications give
 * these along a horizontal flight path; a falling object crosses them in
 * height. plumb's construction (its own, stated in the report): each
 * component is a function of the stretched height zeta(h) = int dh / L(h),
 * so that near every height its correlation length is the model's L(h) and
 * its variance sigma(h)^2:
 *
 *     g(z, t) = sigma(h) sqrt(2/N) sum_n cos(kappa_n zeta(h) + omega_n t + phi_n)
 *
 * with kappa_n drawn from the spectrum in unit length (random Fourier
 * modes: Kraichnan, Phys. Fluids 13, 1970; the sum's covariance over
 * realisations is exactly the spectrum's), phases phi_n uniform, and eddy
 * frequencies omega_n ~ N(0, (sigma_ref kappa_n / L_ref)^2) at the release
 * height (Kraichnan's time decorrelation, from memory) so that an object
 * that hardly moves still sees the gusts change. The spectra are cut at
 * L Omega = PLUMB_TURB_KAPPA_MAX (Dryden u keeps 99.4 % of its variance,
 * von Karman u 97.3 %) and the variance renormalised to sigma^2.
 *
 * A realisation is plain data inside plumb_turbulence_spec; the zone draws
 * one per sample from the sample's own random stream.
 */
#ifndef PLUMB_TURBULENCE_H
#define PLUMB_TURBULENCE_H

#include <stddef.h>

enum { PLUMB_TURB_MODES = 16, PLUMB_TURB_CHEB = 16 };
/* Largest L Omega kept (see above). */
#define PLUMB_TURB_KAPPA_MAX 30.0
/* von Karman's 1.339 as MIL-F-8785C prints it (the exact normalising
 * constant is Gamma(1/3) / (sqrt(pi) Gamma(5/6)) = 1.3389853, so the printed
 * spectra hold 1.3389853/1.339 = 0.999989 of sigma^2). */
#define PLUMB_TURB_VK_A 1.339
#define PLUMB_TURB_VK_A_EXACT 1.3389852790652803
/* Height limits of the low-altitude model, ft (10 ft clamp: common in
 * implementations, from memory; 1000 ft: MIL-F-8785C). */
#define PLUMB_TURB_H_MIN_FT 10.0
#define PLUMB_TURB_H_MAX_FT 1000.0
#define PLUMB_FT_M 0.3048
/* W20 of the intensity words, m/s (15, 30, 45 kn; MIL-F-8785C via MathWorks docs). */
#define PLUMB_TURB_W20_LIGHT_M_S (15.0 * 1852.0 / 3600.0)
#define PLUMB_TURB_W20_MODERATE_M_S (30.0 * 1852.0 / 3600.0)
#define PLUMB_TURB_W20_SEVERE_M_S (45.0 * 1852.0 / 3600.0)
/* 20 ft in m: where W20 is read from the mean wind profile. */
#define PLUMB_TURB_W20_HEIGHT_M (20.0 * PLUMB_FT_M)

typedef enum plumb_turbulence_model {
    PLUMB_TURB_NONE = 0,     /* no gusts */
    PLUMB_TURB_DRYDEN,       /* "dryden" */
    PLUMB_TURB_VON_KARMAN    /* "von-karman" */
} plumb_turbulence_model;

typedef enum { PLUMB_TURB_U = 0, PLUMB_TURB_V, PLUMB_TURB_W } plumb_turbulence_axis;

typedef struct plumb_turbulence_spec {
    plumb_turbulence_model model;  /* none, Dryden or von Karman */
    double w20_m_s;                /* W20 (sigma_w = 0.1 W20), m/s; when 0 and from_wind, the mean wind at 20 ft */
    int from_wind;                 /* 1: W20 is the mean wind profile's at 20 ft */
    size_t n_modes;                /* modes realised per component; 0: none (a single fall) */
    double kappa[3][PLUMB_TURB_MODES]; /* L Omega of each mode, u v w */
    double omega_s[3][PLUMB_TURB_MODES]; /* eddy frequency, rad/s */
    double phase[3][PLUMB_TURB_MODES]; /* rad */
    double zeta_cheb[PLUMB_TURB_CHEB]; /* Chebyshev series of zeta_u(ln h) over 10..1000 ft,
                                          set by plumb_turbulence_realise */
} plumb_turbulence_spec;

/* The model's word ("dryden", "von-karman", "none"). */
const char *plumb_turbulence_model_name(plumb_turbulence_model m);

/* sigma of an axis at height z_m (m above the strike level) for W20, m/s. */
double plumb_turbulence_sigma(plumb_turbulence_axis axis, double w20_m_s, double z_m);

/* L of an axis at height z_m, m (MIL-F-8785C form). */
double plumb_turbulence_length(plumb_turbulence_axis axis, double z_m);

/* Stretched height zeta = int_{10 ft}^{h} dh / L(h) of an axis at z_m
 * (smooth, dzeta/dz = 1 / L). */
double plumb_turbulence_zeta(plumb_turbulence_axis axis, double z_m);

/* The spectrum in unit length, Phi(Omega L) / (sigma^2 L), one-sided. */
double plumb_turbulence_unit_spectrum(plumb_turbulence_model m, plumb_turbulence_axis axis,
                                      double kappa);

/* Draws a realisation into t (t->model and w20 set): n modes per component,
 * wavenumbers by rejection sampling from the unit spectrum, phases and eddy
 * frequencies (sigma_ref and L_ref at z_ref_m). uniform() returns numbers
 * in [0, 1) from the caller's stream. n is capped at PLUMB_TURB_MODES. */
void plumb_turbulence_realise(plumb_turbulence_spec *t, size_t n, double w20_m_s, double z_ref_m,
                              double (*uniform)(void *), void *stream);

/* The gust (u, v, w) at height z_m and time t_s, m/s, for W20; zero when no
 * modes are realised. */
void plumb_turbulence_at(const plumb_turbulence_spec *t, double w20_m_s, double z_m, double t_s,
                         double g_m_s[3]);

#endif /* PLUMB_TURBULENCE_H */
