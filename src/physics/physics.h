/*
 * physics.h - helpers shared inside the physics layer, and with its tests
 * and benchmark (plumbp_ prefix). Not installed.
 */
#ifndef PLUMB_PHYSICS_INTERNAL_H
#define PLUMB_PHYSICS_INTERNAL_H

#include <stddef.h>
#include "plumb/drag.h"

/* One evaluation of the fall's right-hand side (trajectory_rhs.c) at time t_s
 * and state y (x, y, z, vx, vy, vz, W), into f; for measuring its cost
 * (`make bench`). Returns 0 on success. */
struct plumb_fall_spec;
struct plumb_atmosphere;
int plumbp_fall_rhs(const struct plumb_fall_spec *spec, const struct plumb_atmosphere *atm,
                    double t_s, const double y[7], double f[7]);

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
