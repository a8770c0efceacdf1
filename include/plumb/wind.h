/*
 * plumb/wind.h - horizontal wind by height above the strike level.
 *
 * `from` is the direction the wind blows FROM, degrees clockwise from
 * north (meteorological convention), so a wind from 270 deg blows toward
 * the east: w = -s (sin from, cos from) in (east, north).
 * Profiles of speed s(z), z above the strike level:
 *   uniform  s = s_ref
 *   power    s = s_ref (z / z_ref)^alpha  (alpha default 1/7, common
 *            practice for neutral air over open land)
 *   log      s = s_ref ln(z / z0) / ln(z_ref / z0) for z > z0, else 0
 *            (neutral surface layer; z0 by Davenport-Wieringa class)
 *   table    rows (height, speed, from); the east and north components are
 *            interpolated linearly in height, held at the end rows beyond
 *            the table.
 * Every profile gives w = 0 at and below z = 0.
 *
 * Ownership: the table arrays are borrowed; they must outlive the spec's use.
 */
#ifndef PLUMB_WIND_H
#define PLUMB_WIND_H

#include <stddef.h>

typedef enum plumb_wind_profile {
    PLUMB_WIND_UNIFORM = 0,  /* "uniform" */
    PLUMB_WIND_POWER,        /* "power" */
    PLUMB_WIND_LOG,          /* "log" */
    PLUMB_WIND_TABLE         /* "table" */
} plumb_wind_profile;

typedef struct plumb_wind_spec {
    plumb_wind_profile profile;  /* which profile */
    double speed_m_s;            /* reference speed s_ref, m/s (>= 0) */
    double from_deg;             /* direction blown from, deg clockwise from north */
    double ref_height_m;         /* z_ref, m (> 0; default 10 m) */
    double exponent;             /* power-law alpha (>= 0; default 1/7) */
    double roughness_m;          /* log-law z0, m (> 0, < z_ref; default 0.03 m) */
    size_t table_n;              /* table: number of rows (>= 1) */
    const double *table_h_m;     /* table: heights above strike level, increasing, m */
    const double *table_east_m_s;  /* table: east component, m/s */
    const double *table_north_m_s; /* table: north component, m/s */
} plumb_wind_spec;

/* Defaults: uniform calm, reference height 10 m, exponent 1/7, z0 0.03 m. */
void plumb_wind_spec_init(plumb_wind_spec *spec);

/* Wind components at height z_m above the strike level, m/s. Can't fail
 * for a valid spec. */
void plumb_wind_at(const plumb_wind_spec *spec, double z_m, double *east_m_s, double *north_m_s);

/* Wind speed s(z) of a uniform, power or log profile at height z_m, m/s
 * (0 for a table profile, whose direction varies: use plumb_wind_at).
 * With the direction fixed, the components are s(z) times
 * plumb_wind_components(1, from). Can't fail. */
double plumb_wind_speed_at(const plumb_wind_spec *spec, double z_m);

/* Converts (speed, from) into (east, north) components of the air's motion. */
void plumb_wind_components(double speed_m_s, double from_deg, double *east_m_s, double *north_m_s);

#endif /* PLUMB_WIND_H */
