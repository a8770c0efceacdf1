/*
 * physics.h - helpers shared inside the physics layer, and with its tests
 * and benchmark (plumbp_ prefix). Not installed.
 */
#ifndef PLUMB_PHYSICS_INTERNAL_H
#define PLUMB_PHYSICS_INTERNAL_H

#include <stddef.h>
#include "plumb/atmosphere.h"
#include "plumb/constants.h"
#include "plumb/drag.h"
#include "plumb/gravity.h"
#include "plumb/wind.h"

/* One evaluation of the fall's right-hand side (trajectory_rhs.c) at time t_s
 * and state y (x, y, z, vx, vy, vz, W), into f; for measuring its cost
 * (`make bench`). Returns 0 on success. */
struct plumb_fall_spec;
struct plumb_atmosphere;
int plumbp_fall_rhs(const struct plumb_fall_spec *spec, const struct plumb_atmosphere *atm,
                    double t_s, const double y[7], double f[7]);

/* Whether the falls run on workspace w locate their peak drag force
 * between accepted points (trajectory.c, track_peak: Brent's search with
 * a side step per trial, which is most of the cost of a slow fall under a
 * canopy, where the force has a local maximum at almost every step). With
 * unread = 1 a fall's peak_force_n is only the largest force at its
 * accepted points, peak_load_g with it, and rhs_evaluations leaves out
 * the search's; every other figure is the same bit for bit (the search
 * runs on its own stepper from copies of accepted points and changes no
 * state the fall goes on from). Only a fall whose search itself would fail
 * (a side step that cannot be taken from an accepted point, not seen) is
 * then computed instead of failing. For a caller that reads neither figure
 * (the limit's scan, inverse.c). Returns the previous setting. Can't fail. */
struct plumb_trajectory;
int plumbp_traj_peak_unread(struct plumb_trajectory *w, int unread);

/* The air at alt_m, as plumb_atmosphere_at gives it (the same figures
 * and errors), and pow(x, e) beside it: where the air needs a pow() of its
 * own (the 1976 layers with a lapse rate) the two are issued together, so
 * that the processor overlaps them; the fall's right-hand side asks for
 * the power-law wind this way (atmosphere.c). *x_pow_e is set in any
 * case. */
plumb_status plumbp_atmosphere_at_pow(const plumb_atmosphere *atm, double alt_m, double x,
                                      double e, plumb_air *out, double *x_pow_e);

/* The drag area CdS of descent device d at fill_fraction of its fill
 * time, m^2: the full cd x area times plumb_inflation_fraction(fraction,
 * j), j its inflation exponent (1, a linear fill, when none is given).
 * The one place of the formula, for the area of a canopy still filling at
 * impact (plumb_fall_device_at_impact) and of one cut away while still
 * filling (the warning and the text that say so). Can't fail. */
struct plumb_descent_spec;
double plumbp_device_cds_at(const struct plumb_descent_spec *d, double fill_fraction);

/* The part of plumb_gravity_at(g, alt) that is the same at every
 * altitude: WGS 84 normal gravity on the ellipsoid gamma(phi) with a
 * latitude, else g0, m/s^2 (gravity.c). A fall takes it once (its sin and
 * sqrt were a tenth of a zone's time when taken at every evaluation of
 * the right-hand side). Can't fail. */
double plumbp_gravity_normal(const plumb_gravity *g);

/* plumb_gravity_at(g, alt_m) from normal_m_s2 = plumbp_gravity_normal(g):
 * the same figure bit for bit (it is plumb_gravity_at's own last step).
 * Can't fail. */
static inline double plumbp_gravity_from(const plumb_gravity *g, double normal_m_s2,
                                         double alt_m)
{
    if (!g || !g->has_latitude)
        return normal_m_s2;
    return normal_m_s2 - PLUMB_FREE_AIR_GRADIENT_S2 * alt_m;
}

/* 1 when the wind is calm at every height: a speed of 0, or a table of
 * calm rows (wind.c). Can't fail. */
int plumbp_wind_calm(const plumb_wind_spec *w);

/* The log-law wind's ln(z_ref / z0), the same at every height (wind.c).
 * Can't fail. */
double plumbp_wind_log_span(const plumb_wind_spec *spec);

/* plumb_wind_speed_at(spec, z_m) given log_span =
 * plumbp_wind_log_span(spec) (read for a log profile only): the same
 * figure bit for bit, with one log() instead of two. For the fall's
 * right-hand side, which takes the span once per fall. Can't fail. */
double plumbp_wind_speed_span(const plumb_wind_spec *spec, double z_m, double log_span);

/* The power-law wind speed at z_m is spec->speed_m_s * pow(*x, *e):
 * returns 1 and sets *x and *e for a power profile and z_m > 0, else
 * returns 0. The one place of the formula, for plumb_wind_speed_at
 * (wind.c) and the fall's right-hand side (inline: it is called at every
 * evaluation). Can't fail. */
static inline int plumbp_wind_power_terms(const plumb_wind_spec *spec, double z_m, double *x,
                                          double *e)
{
    if (spec->profile != PLUMB_WIND_POWER || !(z_m > 0.0))
        return 0;
    *x = z_m / spec->ref_height_m;
    *e = spec->exponent;
    return 1;
}

/* The Reynolds-number intervals of a sphere drag model on which
 * Cd(Re) Re^2 may decrease (drag.c), sorted and disjoint; outside them the
 * drag balance has at most one root. Sets *re (static table) and returns
 * their number; 0 and NULL for fixed drag. */
size_t plumbp_drag_crisis(plumb_drag_model model, const double (**re)[2]);

/* zeta_u from a realisation's Chebyshev series (turbulence.c), for tests
 * against plumb_turbulence_zeta. */
struct plumb_turbulence_spec;
double plumbp_turbulence_zeta_fast(const struct plumb_turbulence_spec *t, double z_m);

#endif /* PLUMB_PHYSICS_INTERNAL_H */
