/*
 * plumb/gravity.h - gravitational acceleration.
 *
 * Without a latitude: g0 = 9.80665 m/s^2 at every altitude.
 * With a latitude phi: WGS 84 normal gravity by Somigliana's closed form
 * (NIMA TR8350.2, 3rd ed., eq. 4-1)
 *     gamma(phi) = gamma_e (1 + k sin^2 phi) / sqrt(1 - e^2 sin^2 phi)
 * minus the free-air gradient 3.086e-6 s^-2 times the altitude above MSL.
 */
#ifndef PLUMB_GRAVITY_H
#define PLUMB_GRAVITY_H

typedef struct plumb_gravity {
    int has_latitude;       /* 0: constant g0; 1: WGS 84 at latitude_deg */
    double latitude_deg;    /* geodetic latitude, -90..90 deg */
} plumb_gravity;

/* Gravity at altitude alt_m above MSL, m/s^2. Can't fail. */
double plumb_gravity_at(const plumb_gravity *g, double alt_m);

#endif /* PLUMB_GRAVITY_H */
