/*
 * gravity.c - gravitational acceleration (plumb/gravity.h).
 *
 * Without a latitude: standard gravity g0 = 9.80665 m/s^2 (CGPM 1901), at
 * every altitude. With a latitude phi: WGS 84 normal gravity on the
 * ellipsoid by Somigliana's closed form (NIMA TR8350.2, 3rd ed., eq. 4-1)
 *     gamma(phi) = gamma_e (1 + k sin^2 phi) / sqrt(1 - e^2 sin^2 phi)
 * less the free-air gradient 3.086e-6 s^-2 times the altitude above MSL
 * (first-order, adequate within a few km of the surface).
 */
#include <math.h>

#include "plumb/constants.h"
#include "plumb/gravity.h"
#include "physics/physics.h"

/* Degrees to radians. */
#define GRAVITY_RAD_PER_DEG (3.14159265358979323846 / 180.0)

double plumbp_gravity_normal(const plumb_gravity *g)
{
    if (!g || !g->has_latitude)
        return PLUMB_G0_M_S2;
    double s = sin(g->latitude_deg * GRAVITY_RAD_PER_DEG);
    double s2 = s * s;
    return PLUMB_WGS84_GAMMA_E * (1.0 + PLUMB_WGS84_K * s2) / sqrt(1.0 - PLUMB_WGS84_E2 * s2);
}

double plumb_gravity_at(const plumb_gravity *g, double alt_m)
{
    return plumbp_gravity_from(g, plumbp_gravity_normal(g), alt_m);
}
