/*
 * geodesy.c - local east/north metres to WGS 84 latitude and longitude
 * and back by the Gauss mid-latitude formulas (include/plumb/geodesy.h).
 */
#include <math.h>

#include "plumb/geodesy.h"
#include "core/internal.h"

/* pi to double precision (the core layer has no physics constants) */
#define GEO_PI 3.14159265358979323846
#define RAD (GEO_PI / 180.0)
/* Nearest a site may be to a pole, deg: east has no meaning at the pole. */
#define POLE_MARGIN_DEG 0.1
/* Fixed-point steps of the forward form (converges by s/R each step). */
#define FORWARD_STEPS 8
/* A point whose great-circle distance is past the range by more than the
 * sphere's error (0.6 %, here 2 %) is refused before the Gauss formulas. */
#define FAR_FACTOR 1.02

void plumb_geodesy_radii(double lat_deg, double *m, double *n)
{
    double e2 = PLUMB_WGS84_F * (2.0 - PLUMB_WGS84_F);
    double s = sin(lat_deg * RAD);
    double w = 1.0 - e2 * s * s;
    *n = PLUMB_WGS84_A / sqrt(w);
    *m = PLUMB_WGS84_A * (1.0 - e2) / (w * sqrt(w));
}

static double wrap_lon(double lon)
{
    double x = fmod(lon + 180.0, 360.0);
    if (x < 0.0)
        x += 360.0;
    return x - 180.0;
}

static plumb_status check(double lat0, double lon0, double a, double b, plumb_diag *diag)
{
    if (!isfinite(lat0) || !isfinite(lon0) || !isfinite(a) || !isfinite(b))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "geodesy: a coordinate is not a finite number");
    if (fabs(lat0) > 90.0 - POLE_MARGIN_DEG)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "site.latitude",
                               "map output needs a site more than %g deg from a pole, found %g deg",
                               POLE_MARGIN_DEG, lat0);
    return PLUMB_OK;
}

plumb_status plumb_geodesy_forward(double lat0, double lon0, double east, double north,
                                   double out[2], plumb_diag *diag)
{
    plumb_status st = check(lat0, lon0, east, north, diag);
    if (st != PLUMB_OK)
        return st;
    if (hypot(east, north) > PLUMB_GEODESY_RANGE_M)
        return PLUMB_RAISE(diag, PLUMB_EINVAL,
                           "a point %.0f m from the site is beyond the %.0f m the map conversion "
                           "holds for", hypot(east, north), PLUMB_GEODESY_RANGE_M);
    /* s and the azimuth at the site; the azimuth at the mid-point is
     * alpha1 + dlambda sin(phi_m) / 2 (the meridians converge) */
    double s = hypot(east, north), a1 = atan2(east, north);
    double phi = lat0, dlam = 0.0;
    for (int k = 0; k < FORWARD_STEPS; k++) {
        double m, n, mid = 0.5 * (lat0 + phi);
        plumb_geodesy_radii(mid, &m, &n);
        double am = a1 + 0.5 * dlam * sin(mid * RAD);
        phi = lat0 + s * cos(am) / m / RAD;
        dlam = s * sin(am) / (n * cos(mid * RAD));
    }
    out[0] = phi;
    out[1] = wrap_lon(lon0 + dlam / RAD);
    return PLUMB_OK;
}

/* Great-circle distance, m, on the sphere of the mean radius R1 = (2a + b)/3
 * (Moritz 1980, Geodetic Reference System 1980), by the haversine form
 * (Sinnott 1984), which keeps its accuracy for near and antipodal points:
 * within 0.6 % of the ellipsoidal distance anywhere. */
static double great_circle(double lat0, double lon0, double lat, double lon)
{
    double b = PLUMB_WGS84_A * (1.0 - PLUMB_WGS84_F);
    double r1 = (2.0 * PLUMB_WGS84_A + b) / 3.0;
    double sp = sin(0.5 * (lat - lat0) * RAD), sl = sin(0.5 * wrap_lon(lon - lon0) * RAD);
    double h = sp * sp + cos(lat0 * RAD) * cos(lat * RAD) * sl * sl;
    return 2.0 * r1 * asin(fmin(1.0, sqrt(h)));
}

plumb_status plumb_geodesy_inverse(double lat0, double lon0, double lat, double lon,
                                   double out[2], plumb_diag *diag)
{
    plumb_status st = check(lat0, lon0, lat, lon, diag);
    if (st != PLUMB_OK)
        return st;
    /* Far points first, by the great circle on the mean sphere: the
     * mid-latitude formulas below lose all accuracy far out (over a pole
     * they give 3488 km for 2224 km), and only the message needs the
     * distance then. */
    double far = great_circle(lat0, lon0, lat, lon);
    if (far > PLUMB_GEODESY_RANGE_M * FAR_FACTOR)
        return PLUMB_RAISE(diag, PLUMB_EINVAL,
                           "the point (%.7f, %.7f) is about %.0f km from the site, beyond the "
                           "%.0f m the map conversion holds for", lat, lon, far / 1000.0,
                           PLUMB_GEODESY_RANGE_M);
    double mid = 0.5 * (lat0 + lat), m, n;
    plumb_geodesy_radii(mid, &m, &n);
    double dlam = wrap_lon(lon - lon0) * RAD;
    double se = dlam * n * cos(mid * RAD), sn = (lat - lat0) * RAD * m; /* s sin, s cos of alpha_m */
    double s = hypot(se, sn), a1 = atan2(se, sn) - 0.5 * dlam * sin(mid * RAD);
    out[0] = s * sin(a1);
    out[1] = s * cos(a1);
    if (hypot(out[0], out[1]) > PLUMB_GEODESY_RANGE_M * (1.0 + 1e-9))
        return PLUMB_RAISE(diag, PLUMB_EINVAL,
                           "the point (%.7f, %.7f) is %.0f m from the site, beyond the %.0f m the "
                           "map conversion holds for", lat, lon, hypot(out[0], out[1]),
                           PLUMB_GEODESY_RANGE_M);
    return PLUMB_OK;
}

void plumbp_sincos_deg(double deg, double *s, double *c)
{
    if (!isfinite(deg)) {
        *s = *c = NAN;
        return;
    }
    double q = nearbyint(deg / 90.0);
    double r = (deg - 90.0 * q) * RAD;
    double sr = sin(r), cr = cos(r);
    int quadrant = (int)fmod(q, 4.0);
    if (quadrant < 0)
        quadrant += 4;
    switch (quadrant) {
    case 0: *s = sr; *c = cr; break;
    case 1: *s = cr; *c = -sr; break;
    case 2: *s = -sr; *c = -cr; break;
    default: *s = -cr; *c = sr; break;
    }
    /* + 0.0 turns a -0 (cos 90 deg reduced) into +0 */
    *s += 0.0;
    *c += 0.0;
}
