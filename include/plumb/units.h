/*
 * plumb/units.h - quantities with units, parsed with udunits2.
 *
 * A quantity is a number followed by a unit: "2.4 kg", "30 ft", "15 kn",
 * "11 ft lbf", "-3.5 degC". The unit is parsed by udunits2 after a small
 * alias table for the trade's abbreviations has been applied, so that
 * "mph" is the mile per hour (udunits2 alone reads it as the milliphot),
 * "kn"/"kt" the knot, "lb" the avoirdupois pound, "oz" the avoirdupois
 * ounce, "lbf" the pound-force, "inHg" the conventional inch of mercury,
 * "degC"/"degF" the Celsius and Fahrenheit scales.
 *
 * The value is converted to the SI unit of the dimension the caller asks
 * for; a unit of another dimension is an error that names both.
 *
 * Ownership: a plumb_units handle owns the udunits2 unit system; it is
 * read-only once its database is loaded (at once, or at its first need:
 * plumb_units_alloc_deferred). udunits2 is not thread-safe, so parse
 * profiles before starting threads.
 */
#ifndef PLUMB_UNITS_H
#define PLUMB_UNITS_H

#include "plumb/error.h"

/* The dimensions profile keys need. The comment gives the SI unit the
 * value is returned in. */
typedef enum plumb_dim {
    PLUMB_DIM_NONE = 0,     /* dimensionless, bare number allowed (Cd, exponent) */
    PLUMB_DIM_LENGTH,       /* m */
    PLUMB_DIM_MASS,         /* kg */
    PLUMB_DIM_TIME,         /* s */
    PLUMB_DIM_SPEED,        /* m/s */
    PLUMB_DIM_AREA,         /* m^2 */
    PLUMB_DIM_VOLUME,       /* m^3 */
    PLUMB_DIM_ENERGY,       /* J */
    PLUMB_DIM_FORCE,        /* N */
    PLUMB_DIM_ANGLE,        /* deg (degrees, not radians: the profile's convention) */
    PLUMB_DIM_TEMPERATURE,  /* K, absolute; "15 degC" gives 288.15 */
    PLUMB_DIM_TEMP_DIFF,    /* K, a difference; "10 degC" and "18 degF" give 10 */
    PLUMB_DIM_PRESSURE,     /* Pa */
    PLUMB_DIM_DENSITY,      /* kg/m^3 */
    PLUMB_DIM_LAPSE,        /* K/m (temperature fall per height) */
    PLUMB_DIM_FRACTION,     /* dimensionless 0..1; "50 %" gives 0.5 */
    PLUMB_DIM_COUNT
} plumb_dim;

typedef struct plumb_units plumb_units;

/* Loads the udunits2 database (the system's default XML) and the alias
 * table. On error, *out is NULL, diag says why, and nothing is leaked. */
plumb_status plumb_units_alloc(plumb_units **out, plumb_diag *diag);

/* The same handle without the database: it is loaded by the first call
 * that reads a unit (plumb_units_parse, plumb_units_to_si, or a library
 * call given the handle, such as a profile's load at its first quantity),
 * so that a run that reads none (a malformed profile, a usage error) does
 * not pay for it (some 5 ms; 25 ms under AddressSanitizer). A failed load
 * is that call's error, with plumb_units_alloc's diagnostic, and that of
 * every later call that reads a unit (a bare number or fraction read
 * without one needs no database): it is not tried again, and
 * plumb_units_load_error tells it. On error (PLUMB_ENOMEM, or PLUMB_EINVAL for a NULL out) *out is
 * NULL and nothing is leaked. Since the load happens in whichever call
 * comes first, the handle, like udunits2, is for one thread at a time. */
plumb_status plumb_units_alloc_deferred(plumb_units **out, plumb_diag *diag);

/* PLUMB_OK when the handle's database is loaded or has not been needed
 * yet (or units is NULL); else the status of its failed load, with
 * plumb_units_alloc's diagnostic in *diag (may be NULL): what to tell of a
 * call that failed because it could not read a unit. Can't fail. */
plumb_status plumb_units_load_error(const plumb_units *units, plumb_diag *diag);

/* Frees the handle. Accepts NULL. */
void plumb_units_free(plumb_units *units);

/* Parses "NUMBER UNIT" (or a bare NUMBER for PLUMB_DIM_NONE and
 * PLUMB_DIM_FRACTION) into *si_out in the SI unit of `want`.
 * The number is read with strtod and must be finite; a missing unit where
 * one is required, an unknown unit or one of another dimension is
 * PLUMB_EUNIT, a non-number PLUMB_EPARSE, an overflow PLUMB_ERANGE.
 * The diagnostic's message says what was expected (with the SI unit
 * suggested) and what was found, in words ("an electric charge", never
 * udunits2's "s.A"); for a unit that is unknown or of another dimension it
 * offers the unit of the wanted dimension that was probably meant ("5 KG":
 * "5 kg", saying that symbols are case-sensitive) or lists that
 * dimension's units. A decimal comma ("6,5 m") is PLUMB_EPARSE with the
 * number written with a point; a compass letter after an angle ("54.2 N")
 * is PLUMB_EUNIT with the signed angle meant. Its file/line/col/key are
 * left for the caller to fill. On error *si_out is unchanged. */
plumb_status plumb_units_parse(const plumb_units *units, const char *text,
                               plumb_dim want, double *si_out, plumb_diag *diag);

/* Converts `value` given in `unit` (e.g. "ft", "ft lbf", "kn") into the SI
 * unit of `want`. Same errors as plumb_units_parse. */
plumb_status plumb_units_to_si(const plumb_units *units, double value, const char *unit,
                               plumb_dim want, double *si_out, plumb_diag *diag);

/* plumb_units_to_si of each of values[0 .. n) into si_out[0 .. n), the
 * same doubles and the same errors (those of the first value that fails,
 * the values before it converted), with the unit read and its converter
 * made once rather than once a value (a 100 000-row `plumb air` table);
 * si_out may be values itself. */
plumb_status plumb_units_to_si_n(const plumb_units *units, const double *values, size_t n,
                                 const char *unit, plumb_dim want, double *si_out,
                                 plumb_diag *diag);

/* The SI unit symbol a dimension is returned in ("kg", "m/s", ...). Never NULL. */
const char *plumb_dim_si_unit(plumb_dim dim);

/* A human name of the dimension ("mass", "speed", ...). Never NULL. */
const char *plumb_dim_name(plumb_dim dim);

#endif /* PLUMB_UNITS_H */
