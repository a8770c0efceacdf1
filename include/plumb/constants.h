/*
 * plumb/constants.h - physical constants, each with its unit and source.
 */
#ifndef PLUMB_CONSTANTS_H
#define PLUMB_CONSTANTS_H

/* Standard gravity, m/s^2 (CGPM 1901; U.S. Standard Atmosphere 1976, Table 2). */
#define PLUMB_G0_M_S2 9.80665
/* Universal gas constant as used by US Std Atm 1976, J/(kmol K) (Table 2). */
#define PLUMB_RSTAR_J_KMOL_K 8314.32
/* Mean molecular weight of sea-level air, kg/kmol (US Std Atm 1976, Table 2). */
#define PLUMB_M0_KG_KMOL 28.9644
/* Specific gas constant of dry air R* / M0, J/(kg K). */
#define PLUMB_RAIR_J_KG_K (PLUMB_RSTAR_J_KMOL_K / PLUMB_M0_KG_KMOL)
/* Effective Earth radius for geopotential height, m (US Std Atm 1976). */
#define PLUMB_R0_M 6356766.0
/* Ratio of specific heats of air (US Std Atm 1976). */
#define PLUMB_GAMMA_AIR 1.400
/* Sutherland's law constants, kg/(s m K^1/2) and K (US Std Atm 1976, eq. 51). */
#define PLUMB_SUTHERLAND_BETA 1.458e-6
#define PLUMB_SUTHERLAND_S_K 110.4
/* Sea-level standard temperature K and pressure Pa (US Std Atm 1976). */
#define PLUMB_T0_K 288.15
#define PLUMB_P0_PA 101325.0
/* 0 degC in kelvin, exact (the definition of the Celsius scale; BIPM SI
 * Brochure, 9th ed., 2019, 2.3.1). */
#define PLUMB_CELSIUS_ZERO_K 273.15
/* Speed of sound at sea level in the standard atmosphere, m/s (US Std Atm
 * 1976, Table 1: Cs = 340.294 m/s at 0 m). The largest release and wind
 * speed a profile may give: the drag model is for subsonic air speeds. */
#define PLUMB_SOUND_SPEED_SL_M_S 340.294
/* The largest temperature offset from the 1976 atmosphere a profile may
 * give, K. Surface air on Earth has been recorded from -89.2 degC (Vostok,
 * 1983) to 56.7 degC (Death Valley, 1913; WMO archive of weather and
 * climate extremes, from memory): -104 K to +42 K from the standard 15 degC;
 * 100 K either way spans them (the colder side nearly) and keeps the 1976
 * model's coldest layer (186.87 K at 86 km) above 0 K. */
#define PLUMB_TEMP_OFFSET_MAX_K 100.0
/* The range of an air temperature a profile may give, K: surface air has
 * been recorded from -89.2 degC (183.95 K) to 56.7 degC (329.85 K) (WMO
 * archive of weather and climate extremes, from memory), and the 1976
 * atmosphere's coldest layer is 186.87 K; 150 K to 400 K spans both with
 * room, and refuses a temperature typed in the wrong unit (20 K for 20 degC). */
#define PLUMB_AIR_TEMPERATURE_MIN_K 150.0
#define PLUMB_AIR_TEMPERATURE_MAX_K 400.0
/* The largest mass a profile may give, kg (payload.mass, an item's mass,
 * release.downwash.aircraft_mass): 100 000 t, five times the heaviest
 * single lift yet made (about 20 000 t, a shipyard gantry crane, 2008;
 * from memory) and far above any load lifted over people or any aircraft
 * (about 640 t; from memory). A plausibility bound (common practice, no
 * source): it refuses a mass typed with a wrong exponent or unit as an
 * input error, where an unbounded one (1e308 lb) failed only in the fall,
 * its energies beyond what a double holds. */
#define PLUMB_MASS_MAX_KG 1.0e8
/* Geometric altitude of the top of the 1976 model, m. */
#define PLUMB_STD1976_TOP_M 86000.0
/* Geometric altitude of the bottom of the 1976 model's tables, m
 * (NOAA-S/T 76-1562, Table I starts at -5000 m). The one altitude floor:
 * the air models, the profile's altitude keys, the zone's ranges and the
 * limit's scan all use it. */
#define PLUMB_STD1976_BOTTOM_M (-5000.0)
/* Ratio of molar masses water vapour / dry air (Rd/Rv), dimensionless
 * (Wallace & Hobbs, Atmospheric Science, 2nd ed., eq. 3.14). */
#define PLUMB_EPSILON_VAPOUR 0.622
/* WGS 84 normal gravity, Somigliana closed form (NIMA TR8350.2, eq. 4-1):
 * equatorial gravity m/s^2, k, first eccentricity squared. */
#define PLUMB_WGS84_GAMMA_E 9.7803253359
#define PLUMB_WGS84_K 0.00193185265241
#define PLUMB_WGS84_E2 0.00669437999013
/* Free-air gradient of gravity, s^-2 (NIMA TR8350.2, common approximation). */
#define PLUMB_FREE_AIR_GRADIENT_S2 3.086e-6
/* 1 foot pound-force in joules, exact (0.3048 m x 0.45359237 kg x g0). */
#define PLUMB_FT_LBF_J 1.3558179483314004
/* 1 foot in metres, exact (international yard and pound agreement, 1959). */
#define PLUMB_FT_M 0.3048
/* 1 pound in kilograms, exact (1959 agreement). */
#define PLUMB_LB_KG 0.45359237

/* pi, to double precision. */
#define PLUMB_PI 3.14159265358979323846

#endif /* PLUMB_CONSTANTS_H */
