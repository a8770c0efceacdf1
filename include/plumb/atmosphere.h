/*
 * plumb/atmosphere.h - air properties by geometric altitude above sea level.
 *
 * Models:
 *   standard-1976  U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), to
 *                  86 km geometric. Geometric z -> geopotential
 *                  H = r0 z / (r0 + z), r0 = 6 356 766 m. In a layer with
 *                  base Hb, Tb, pb and lapse L (K/m'):
 *                    T = Tb + L (H - Hb)
 *                    p = pb (Tb / T)^(g0 M0 / (R* L))          L != 0
 *                    p = pb exp(-g0 M0 (H - Hb) / (R* Tb))      L == 0
 *                  With a temperature offset dT: T = T_std + dT, p = p_std,
 *                  rho = p / (R T).
 *   surface        station pressure p_s and temperature T_s at the strike
 *                  level (site elevation), linear lapse rate L (default
 *                  6.5 K/km), hydrostatic above and below:
 *                    T = T_s - L dz,  p = p_s (T / T_s)^(g0 / (R L))
 *                  (p = p_s exp(-g0 dz / (R T_s)) when L == 0).
 *   table          density by altitude, interpolated linearly in ln rho
 *                  (GSL linear interpolation); temperature from the table
 *                  when given, else from the 1976 model plus offset;
 *                  p = rho R T.
 * Humidity (optional, all models): relative humidity RH turns T into the
 * virtual temperature Tv = T / (1 - (e/p)(1 - eps)), eps = 0.622, with the
 * vapour pressure e = RH e_s(T) and e_s by the Magnus formula over water
 * (Alduchov & Eskridge, J. Appl. Meteor. 35, 1996: 6.1094 hPa
 * exp(17.625 t / (t + 243.04)), t in degC); rho = p / (R Tv).
 * Viscosity: Sutherland's law mu = beta T^1.5 / (T + S) (US Std Atm 1976
 * eq. 51), from the actual (not virtual) temperature.
 * Speed of sound a = sqrt(gamma R T).
 *
 * Ownership: plumb_atmosphere_alloc copies everything it needs out of the
 * spec (including the tables), so the spec may be freed afterwards. A
 * plumb_atmosphere is read-only once made and may be shared by threads.
 */
#ifndef PLUMB_ATMOSPHERE_H
#define PLUMB_ATMOSPHERE_H

#include <stddef.h>
#include "plumb/error.h"

typedef enum plumb_atm_model {
    PLUMB_ATM_STD1976 = 0,  /* "standard-1976" */
    PLUMB_ATM_SURFACE,      /* "surface" */
    PLUMB_ATM_TABLE         /* "table" */
} plumb_atm_model;

typedef struct plumb_atm_spec {
    plumb_atm_model model;        /* which model */
    double temperature_offset_k;  /* standard-1976 and table: dT added to T_std, K */
    double station_alt_m;         /* surface: altitude of the station above MSL, m (the site elevation) */
    double station_pressure_pa;   /* surface: station pressure, Pa (> 0) */
    double station_temperature_k; /* surface: station temperature, K (> 0) */
    double lapse_rate_k_m;        /* surface: temperature fall per metre, K/m (default 0.0065) */
    double relative_humidity;     /* 0..1; 0 means dry air */
    size_t table_n;               /* table: number of rows (>= 2) */
    const double *table_alt_m;    /* table: altitudes above MSL, strictly increasing, m */
    const double *table_rho_kg_m3;/* table: densities, kg/m^3 (> 0) */
    const double *table_t_k;      /* table: temperatures, K, or NULL for 1976 + offset */
} plumb_atm_spec;

typedef struct plumb_air {
    double alt_m;           /* geometric altitude above MSL, m */
    double t_k;             /* temperature, K */
    double p_pa;            /* pressure, Pa */
    double rho_kg_m3;       /* density, kg/m^3 */
    double mu_pa_s;         /* dynamic viscosity, Pa s */
    double a_m_s;           /* speed of sound, m/s */
} plumb_air;

typedef struct plumb_atmosphere plumb_atmosphere;

/* Fills a spec with the defaults: standard-1976, no offset, dry air,
 * lapse rate 6.5 K/km. Can't fail. */
void plumb_atm_spec_init(plumb_atm_spec *spec);

/* Validates the spec and builds the model. On error *out is NULL and diag
 * (key set to the atmosphere.* key at fault) says why. */
plumb_status plumb_atmosphere_alloc(const plumb_atm_spec *spec, plumb_atmosphere **out,
                                    plumb_diag *diag);

/* Frees the model. Accepts NULL. */
void plumb_atmosphere_free(plumb_atmosphere *atm);

/* Air at geometric altitude alt_m above MSL. PLUMB_ERANGE outside the
 * model's range (-5 km .. 86 km for standard-1976, the table's span for
 * table) or where the temperature is not positive. Thread-safe. */
plumb_status plumb_atmosphere_at(const plumb_atmosphere *atm, double alt_m, plumb_air *out);

/* Lowest and highest altitude the model is valid for, m. Can't fail. */
void plumb_atmosphere_range(const plumb_atmosphere *atm, double *lo_m, double *hi_m);

/* The bare U.S. Standard Atmosphere 1976 (dry, offset dT_k), for tests
 * and `plumb air`. Same range rules as plumb_atmosphere_at. */
plumb_status plumb_std1976(double alt_m, double dt_k, plumb_air *out);

/* Sutherland viscosity at temperature t_k, Pa s. */
double plumb_sutherland_viscosity(double t_k);

#endif /* PLUMB_ATMOSPHERE_H */
