/*
 * wind.c - horizontal wind by height above the strike level (plumb/wind.h).
 *
 * Direction: meteorological convention (WMO-No. 8, Guide to Instruments and
 * Methods of Observation): `from` is where the wind blows from, clockwise
 * from north, so the air moves toward from + 180 deg:
 *     (east, north) = -s (sin from, cos from).
 * Speed profiles:
 *   power  s = s_ref (z / z_ref)^alpha (Hellmann power law; alpha = 1/7 for
 *          neutral air over open land is common practice)
 *   log    s = s_ref ln(z / z0) / ln(z_ref / z0) for z > z0, else 0 (the
 *          neutral logarithmic surface layer u = (u_star / kappa) ln(z / z0),
 *          with u_star / kappa fixed by s_ref at z_ref; z0 by the
 *          Davenport-Wieringa roughness classes)
 *   table  east and north components linear in height, held beyond the ends.
 * Every profile is calm at and below z = 0.
 *
 * plumb_wind_at is called at every right-hand side of the equation of motion:
 * it allocates nothing and keeps no state (the spec is plain data). It takes
 * one sin/cos pair per call for the direction; a caller that needs more
 * speed can cache plumb_wind_components(1, from) and scale it.
 */
#include <math.h>
#include <string.h>

#include "plumb/wind.h"
#include "core/internal.h"
#include "physics/physics.h"

/* Defaults: anemometer height 10 m (WMO-No. 8 standard exposure); power-law
 * exponent 1/7 (common practice for neutral air over open land); roughness
 * length 0.03 m (Davenport-Wieringa class "open"). */
#define WIND_DEFAULT_REF_HEIGHT_M 10.0
#define WIND_DEFAULT_EXPONENT (1.0 / 7.0)
#define WIND_DEFAULT_ROUGHNESS_M 0.03

void plumb_wind_components(double speed_m_s, double from_deg, double *east_m_s,
                           double *north_m_s)
{
    double s, c;
    plumbp_sincos_deg(from_deg, &s, &c);
    /* + 0.0 turns a -0 (e.g. the north component of a west wind) into +0. */
    *east_m_s = -speed_m_s * s + 0.0;
    *north_m_s = -speed_m_s * c + 0.0;
}

void plumb_wind_spec_init(plumb_wind_spec *spec)
{
    memset(spec, 0, sizeof *spec);
    spec->profile = PLUMB_WIND_UNIFORM;
    spec->ref_height_m = WIND_DEFAULT_REF_HEIGHT_M;
    spec->exponent = WIND_DEFAULT_EXPONENT;
    spec->roughness_m = WIND_DEFAULT_ROUGHNESS_M;
    spec->table_h_m = NULL;
    spec->table_east_m_s = NULL;
    spec->table_north_m_s = NULL;
}

/* Table components at z: linear between rows, held beyond the ends. The
 * rows are searched by bisection (heights increasing). */
static void table_at(const plumb_wind_spec *w, double z_m, double *east, double *north)
{
    const double *h = w->table_h_m;
    size_t n = w->table_n;
    if (z_m <= h[0]) {
        *east = w->table_east_m_s[0];
        *north = w->table_north_m_s[0];
        return;
    }
    if (z_m >= h[n - 1]) {
        *east = w->table_east_m_s[n - 1];
        *north = w->table_north_m_s[n - 1];
        return;
    }
    size_t lo = 0, hi = n - 1; /* h[lo] < z < h[hi] */
    while (hi - lo > 1) {
        size_t mid = lo + (hi - lo) / 2;
        if (h[mid] <= z_m)
            lo = mid;
        else
            hi = mid;
    }
    double f = (z_m - h[lo]) / (h[hi] - h[lo]);
    *east = w->table_east_m_s[lo] + f * (w->table_east_m_s[hi] - w->table_east_m_s[lo]);
    *north = w->table_north_m_s[lo] + f * (w->table_north_m_s[hi] - w->table_north_m_s[lo]);
}

/* The log-law speed at z_m > z0, given log_span = ln(z_ref / z0). */
static double log_speed(const plumb_wind_spec *spec, double z_m, double log_span)
{
    return spec->speed_m_s * log(z_m / spec->roughness_m) / log_span;
}

double plumb_wind_speed_at(const plumb_wind_spec *spec, double z_m)
{
    if (!(z_m > 0.0)) /* calm at and below the strike level (and for NaN) */
        return 0.0;
    switch (spec->profile) {
    case PLUMB_WIND_UNIFORM:
        return spec->speed_m_s;
    case PLUMB_WIND_POWER: {
        double x, e;
        plumbp_wind_power_terms(spec, z_m, &x, &e);
        return spec->speed_m_s * pow(x, e);
    }
    case PLUMB_WIND_LOG:
        if (!(z_m > spec->roughness_m))
            return 0.0;
        return log_speed(spec, z_m, plumbp_wind_log_span(spec));
    case PLUMB_WIND_TABLE:
    default:
        return 0.0;
    }
}

double plumbp_wind_log_span(const plumb_wind_spec *spec)
{
    return log(spec->ref_height_m / spec->roughness_m);
}

double plumbp_wind_speed_span(const plumb_wind_spec *spec, double z_m, double log_span)
{
    if (spec->profile != PLUMB_WIND_LOG)
        return plumb_wind_speed_at(spec, z_m);
    if (!(z_m > 0.0) || !(z_m > spec->roughness_m))
        return 0.0;
    return log_speed(spec, z_m, log_span);
}

void plumb_wind_at(const plumb_wind_spec *spec, double z_m, double *east_m_s, double *north_m_s)
{
    *east_m_s = 0.0;
    *north_m_s = 0.0;
    if (!(z_m > 0.0))
        return;
    if (spec->profile == PLUMB_WIND_TABLE) {
        if (spec->table_n > 0 && spec->table_h_m && spec->table_east_m_s && spec->table_north_m_s)
            table_at(spec, z_m, east_m_s, north_m_s);
        return;
    }
    double s = plumb_wind_speed_at(spec, z_m);
    if (s != 0.0)
        plumb_wind_components(s, spec->from_deg, east_m_s, north_m_s);
}

int plumbp_wind_calm(const plumb_wind_spec *w)
{
    if (w->profile != PLUMB_WIND_TABLE)
        return w->speed_m_s == 0.0;
    for (size_t i = 0; i < w->table_n; i++)
        if (w->table_east_m_s[i] != 0.0 || w->table_north_m_s[i] != 0.0)
            return 0;
    return 1;
}
