/*
 * units_int.h - what the two files of the units module share: units.c
 * (reading and converting a quantity) and units_advice.c (the messages for
 * one that cannot be read). The handle's definition, the tables of
 * dimensions, aliases and other quantities, the shape of a parsed unit,
 * the test of two units' dimensions, and the raising functions units.c
 * calls (plumbp_units_ prefix). Internal to libplumb; not installed.
 *
 * The tables are static: each file has its own read-only copy, and
 * struct plumb_units sizes its `other` array by other_quantities[].
 */
#ifndef PLUMB_UNITS_INT_H
#define PLUMB_UNITS_INT_H

#include <stddef.h>

#include <udunits2.h>

#include "plumb/units.h"
#include "core/internal.h"

/* Longest quantity or unit text accepted, bytes (a sane unit is < 40). */
#define UNITS_TEXT_MAX 256
/* Longest piece of user text quoted in a diagnostic, bytes. */
#define UNITS_SHOW_MAX 80

/* Quantities plumb takes no input of, named in words when a unit of one
 * is given where another is wanted ("15 C" for a mass is an electric
 * charge): SI derived units, BIPM SI Brochure (9th ed., 2019) tables 2
 * and 4. Tried after the dimensions of plumb_dim; a unit that matches
 * none is "a unit that is not a mass". */
static const struct {
    const char *what;  /* with its article */
    const char *ud;    /* a unit of it, spelt for udunits2 */
} other_quantities[] = {
    {"an acceleration", "m/s^2"},
    {"a frequency (per time)", "1/s"},
    {"an electric current", "A"},
    {"an electric charge", "C"},
    {"an electric potential (a voltage)", "V"},
    {"a power", "W"},
    {"an electric resistance", "ohm"},
    {"an electric conductance", "S"},
    {"a capacitance", "F"},
    {"an inductance", "H"},
    {"a magnetic flux", "Wb"},
    {"a magnetic flux density", "T"},
    {"an amount of substance", "mol"},
    {"a luminous intensity", "cd"},
    {"an illuminance", "lx"},
    {"a dynamic viscosity", "Pa s"},
    {"a kinematic viscosity", "m^2/s"},
    {"a momentum", "kg m/s"},
    {"a mass flow", "kg/s"},
    {"a volume flow", "m^3/s"},
    {"a mass per area", "kg/m^2"},
    {"a mass per length", "kg/m"},
    {"a reciprocal length", "1/m"},
    {"an energy per mass", "J/kg"},
};

#define N_OTHER (sizeof other_quantities / sizeof other_quantities[0])

/* Where a handle's database stands: its load is deferred to the first
 * quantity that needs it (plumb_units_alloc_deferred), or done at once
 * (plumb_units_alloc). */
typedef enum units_state {
    UNITS_NOT_LOADED = 0,  /* not needed yet: sys and the units below are NULL */
    UNITS_LOADED,          /* sys and the units below made */
    UNITS_FAILED           /* the load failed (load_diag): every later quantity fails so too */
} units_state;

struct plumb_units {
    /* This handle, writable: the callers hold it const (it reads the same
     * quantities the same way, loaded or not), and the first quantity that
     * needs the database loads it through here. */
    plumb_units *self;
    units_state state;
    plumb_diag load_diag;            /* why the load failed, when state is UNITS_FAILED */
    ut_system *sys;                  /* the udunits2 unit system (owned) */
    ut_unit *ref[PLUMB_DIM_COUNT];   /* SI reference unit of each dimension (owned) */
    ut_unit *radian;                 /* the radian, to tell angles from numbers (owned) */
    ut_unit *one;                    /* the dimensionless unit one (owned) */
    ut_unit *other[N_OTHER];         /* units of other_quantities[], NULL if unknown (owned) */
};

/* What every dimension is called, returned in and exemplified by. */
typedef struct dim_info {
    const char *name;     /* human name, "mass" */
    const char *article;  /* "a" or "an" before the name */
    const char *si;       /* SI unit shown to people, "kg" */
    const char *ud;       /* the same unit spelt for udunits2 */
    const char *example;  /* an example value, used when no number was given */
} dim_info;

static const dim_info dims[PLUMB_DIM_COUNT] = {
    [PLUMB_DIM_NONE] = {"dimensionless number", "a", "1", "1", "0.9"},
    [PLUMB_DIM_LENGTH] = {"length", "a", "m", "m", "30 m"},
    [PLUMB_DIM_MASS] = {"mass", "a", "kg", "kg", "2.4 kg"},
    [PLUMB_DIM_TIME] = {"time", "a", "s", "s", "1.5 s"},
    [PLUMB_DIM_SPEED] = {"speed", "a", "m/s", "m/s", "8 m/s"},
    [PLUMB_DIM_AREA] = {"area", "an", "m^2", "m^2", "0.021 m^2"},
    [PLUMB_DIM_VOLUME] = {"volume", "a", "m^3", "m^3", "0.0015 m^3"},
    [PLUMB_DIM_ENERGY] = {"energy", "an", "J", "J", "80 J"},
    [PLUMB_DIM_FORCE] = {"force", "a", "N", "N", "40 N"},
    [PLUMB_DIM_ANGLE] = {"angle", "an", "deg", "arc_degree", "270 deg"},
    [PLUMB_DIM_TEMPERATURE] = {"temperature", "a", "K", "K", "288.15 K"},
    [PLUMB_DIM_TEMP_DIFF] = {"temperature difference", "a", "K", "K", "10 K"},
    [PLUMB_DIM_PRESSURE] = {"pressure", "a", "Pa", "Pa", "101325 Pa"},
    [PLUMB_DIM_DENSITY] = {"density", "a", "kg/m^3", "kg/m^3", "1.225 kg/m^3"},
    [PLUMB_DIM_LAPSE] = {"lapse rate", "a", "K/m", "K/m", "0.0065 K/m"},
    [PLUMB_DIM_FRACTION] = {"fraction", "a", "1", "1", "0.5"},
};

/* The alias table: a whole word of the unit text and the unambiguous
 * udunits2 spelling that replaces it.  `dim` is what the alias measures;
 * plumb_units_alloc() checks every entry against it, so a database that
 * disagrees fails loudly instead of converting silently.  udunits2 2.2.28
 * alone reads "mph" and "kph" as the milliphot and kilophot, "oz" as the
 * US fluid ounce (a volume), "nmi" as a nano-mile, its avoirdupois_ounce is
 * rounded to 2.834952e-2 kg, and it knows no "kn", "deg", "fps", "lbs" or
 * "ftlbf". */
typedef struct unit_alias {
    const char *word;   /* token as written in a profile, case-sensitive */
    const char *ud;     /* udunits2 expression it stands for */
    plumb_dim dim;      /* what it measures */
} unit_alias;

static const unit_alias aliases[] = {
    /* length: 1959 international yard and pound agreement (exact) */
    {"ft", "international_foot", PLUMB_DIM_LENGTH},
    {"feet", "international_foot", PLUMB_DIM_LENGTH},
    {"foot", "international_foot", PLUMB_DIM_LENGTH},
    {"in", "international_inch", PLUMB_DIM_LENGTH},
    {"inch", "international_inch", PLUMB_DIM_LENGTH},
    {"inches", "international_inch", PLUMB_DIM_LENGTH},
    {"yd", "international_yard", PLUMB_DIM_LENGTH},
    {"mi", "international_mile", PLUMB_DIM_LENGTH},
    /* nautical mile = 1852 m exactly (NIST SP 811 (2008) B.8) */
    {"nmi", "nautical_mile", PLUMB_DIM_LENGTH},
    /* speed: mile per hour = 0.44704 m/s exactly; knot = 1852/3600 m/s
     * (NIST SP 811 (2008) B.8) */
    {"mph", "(international_mile/hour)", PLUMB_DIM_SPEED},
    {"kn", "(nautical_mile/hour)", PLUMB_DIM_SPEED},
    {"kt", "(nautical_mile/hour)", PLUMB_DIM_SPEED},
    {"kts", "(nautical_mile/hour)", PLUMB_DIM_SPEED},
    {"knot", "(nautical_mile/hour)", PLUMB_DIM_SPEED},
    {"knots", "(nautical_mile/hour)", PLUMB_DIM_SPEED},
    {"kph", "(kilometer/hour)", PLUMB_DIM_SPEED},
    {"fps", "(international_foot/second)", PLUMB_DIM_SPEED},
    /* mass: avoirdupois pound 0.45359237 kg exactly (1959), ounce = lb/16 */
    {"lb", "avoirdupois_pound", PLUMB_DIM_MASS},
    {"lbs", "avoirdupois_pound", PLUMB_DIM_MASS},
    {"lbm", "avoirdupois_pound", PLUMB_DIM_MASS},
    {"oz", "(avoirdupois_pound/16)", PLUMB_DIM_MASS},
    /* force and energy: lbf = 0.45359237 kg x 9.80665 m/s^2 (CGPM 1901) */
    {"lbf", "pound_force", PLUMB_DIM_FORCE},
    {"ftlbf", "(international_foot pound_force)", PLUMB_DIM_ENERGY},
    {"inlbf", "(international_inch pound_force)", PLUMB_DIM_ENERGY},
    /* temperature scales (NIST SP 811 (2008) B.9) */
    {"degC", "degree_Celsius", PLUMB_DIM_TEMPERATURE},
    {"degF", "degree_fahrenheit", PLUMB_DIM_TEMPERATURE},
    /* pressure: hectopascal; conventional inch of mercury 3.386 389 E+03 Pa
     * as tabulated in NIST SP 811 (2008) B.8 (udunits2's own inHg is
     * 0.0254 m x 13595.10 kg/m^3 x g0 = 3386.38864 Pa, the same to the
     * seven digits NIST gives); psi = lbf/in^2 */
    {"hPa", "hectopascal", PLUMB_DIM_PRESSURE},
    {"inHg", "(3386.389 pascal)", PLUMB_DIM_PRESSURE},
    {"psi", "(pound_force/international_inch^2)", PLUMB_DIM_PRESSURE},
    /* angle: degree = pi/180 rad */
    {"deg", "arc_degree", PLUMB_DIM_ANGLE},
    {"degree", "arc_degree", PLUMB_DIM_ANGLE},
    {"degrees", "arc_degree", PLUMB_DIM_ANGLE},
    {"rad", "radian", PLUMB_DIM_ANGLE},
    /* fraction: per cent */
    {"%", "percent", PLUMB_DIM_FRACTION},
};

#define N_ALIASES (sizeof aliases / sizeof aliases[0])

/* ---- the unit's shape and dimension ---------------------------------------- */

/* What a parsed unit is made of, beyond its dimension. */
typedef struct unit_shape {
    const ut_visitor *self;   /* this visitor, to descend into Galilean units */
    const ut_unit *radian;    /* the radian of the system */
    int rad_power;            /* power of the radian in the definition */
    int has_offset;           /* a Galilean unit with an offset (degC, degF) */
    int is_timestamp;         /* "s since 2000-01-01" */
    int is_log;               /* a logarithmic unit */
} unit_shape;

/* 1 when udunits2's last call failed for want of memory (UT_OS: its
 * allocation failed, errno ENOMEM; udunits2.h). */
static inline int ut_out_of_memory(void)
{
    return ut_get_status() == UT_OS;
}

/* True when a and b measure the same quantity. ut_are_convertible() is not
 * enough: udunits2 2.2.28 also holds a unit convertible into its
 * reciprocal, and its converter inverts the value (seen here: "5 1/kg"
 * was read as a mass of 0.2 kg, "2 Hz" as a time of 0.5 s; its header
 * does not say so). The quotient of two units of the same dimension is
 * dimensionless. Returns 1 (same), 0 (not), or -1 when udunits2 ran out of
 * memory. */
static inline int same_dimension(const plumb_units *units, const ut_unit *a, const ut_unit *b)
{
    ut_unit *q = ut_divide(a, b);
    if (!q)
        return ut_out_of_memory() ? -1 : 0;
    int same = ut_are_convertible(q, units->one) != 0;
    ut_free(q);
    return same;
}

/* ---- what a key accepts ----------------------------------------------------- */

/* The values a key accepts, in SI, so that a message never suggests one
 * the key would refuse ("45 K" for an air temperature of at least 150 K).
 * NULL where a quantity is read for no key: any value that converts. */
typedef struct plumbp_accept {
    double lo, hi;          /* bounds in SI (-HUGE_VAL, HUGE_VAL: none) */
    int lo_open, hi_open;   /* 1: the bound itself is refused */
    const char *range;      /* the bounds as the key's range message gives them */
} plumbp_accept;

/* 1 when the quantity `text` (number and unit) reads as dimension want and
 * acc accepts it (always when acc is NULL), 0 when not, -1 when udunits2
 * ran out of memory. Can't fail otherwise. */
int plumbp_units_fits(const plumb_units *units, const plumbp_accept *acc, plumb_dim want,
                      const char *text);

/* plumb_units_parse for a key that accepts acc (may be NULL): the same
 * value and errors; only the values the messages suggest differ. */
plumb_status plumbp_units_parse_in(const plumb_units *units, const char *text, plumb_dim want,
                                   const plumbp_accept *acc, double *si_out, plumb_diag *diag);

/* ---- the messages (units_advice.c) ---------------------------------------- */

/* Raises PLUMB_EUNIT for a bare number where want needs a unit, with an
 * example of the number and a unit that acc accepts: the SI unit, else
 * (45 for an air temperature) the others of the dimension that do ("45
 * degC" or "45 degF"), else none, with the range. Returns the status
 * raised (PLUMB_ENOMEM when udunits2 ran out of memory). */
plumb_status plumbp_units_raise_bare(const plumb_units *units, const plumbp_accept *acc,
                                     plumb_diag *diag, plumb_dim want, const char *number);

/* An example of dimension want for a message, that acc accepts:
 * "e.g. \"30 m\"", or "must be RANGE" when the usual example is refused
 * (an angle of 270 deg for a latitude). Returns buf. */
const char *plumbp_units_example(const plumb_units *units, const plumbp_accept *acc,
                                 plumb_dim want, char *buf, size_t size);

/* What a caller wanted, for messages: "a mass (kg)", "a fraction (a bare
 * number or \"%\")", "a bare number". Can't fail. */
void plumbp_units_describe_want(plumb_dim want, char *buf, size_t size);

/* Raises PLUMB_EUNIT for the unit text `unit`, which udunits2 cannot read,
 * with the unit of dimension want probably meant or the list of them.
 * `shown` is the quantity as written, `number` its number. Returns the
 * status raised. */
plumb_status plumbp_units_raise_unknown(const plumb_units *units, const plumbp_accept *acc,
                                        plumb_diag *diag, plumb_dim want, const char *unit,
                                        const char *shown, const char *number);

/* Raises PLUMB_EUNIT for `unit` (parsed from the text `text`, of the given
 * shape), which is not of dimension want: what it measures, in words, and
 * what was probably meant. Returns the status raised. */
plumb_status plumbp_units_raise_wrong(const plumb_units *units, const plumbp_accept *acc,
                                      plumb_diag *diag, plumb_dim want, const ut_unit *unit,
                                      const unit_shape *shape, const char *text,
                                      const char *shown, const char *number);

/* The bearing in degrees of a 16-point compass point written alone ("NE",
 * any case; N = 0, clockwise in steps of 22.5 deg), or -1. Can't fail. */
double plumbp_units_compass_bearing(const char *text);

/* Compass letters after an angle ("54.2 N", "3.1 deg W"): 1 for N or E,
 * -1 for S or W, 0 for anything else. */
int plumbp_units_compass_letter(const char *unit);

/* Raises PLUMB_EUNIT for a compass letter (sign from
 * plumbp_units_compass_letter) after an angle, with the signed angle it
 * means. Returns the status raised. */
plumb_status plumbp_units_raise_compass(const plumb_units *units, const plumbp_accept *acc,
                                        plumb_diag *diag, int sign, const char *shown,
                                        const char *number);

/* Raises PLUMB_EPARSE for a number written with a comma ("6,5 m",
 * "1,500 m"); `end` is where strtod stopped in `shown`, at the comma.
 * Returns the status raised. */
plumb_status plumbp_units_raise_comma(const plumb_units *units, const plumbp_accept *acc,
                                      plumb_diag *diag, plumb_dim want, const char *shown,
                                      const char *end);

#endif /* PLUMB_UNITS_INT_H */
