/*
 * units.c - quantities with units ("2.4 kg", "11 ft lbf", "15 degC"),
 * parsed with udunits2 after an alias table for the trade's abbreviations.
 *
 * Method: the number is read with strtod; the unit text is rewritten token
 * by token (whole words only) through the alias table below, then parsed by
 * udunits2 (UDUNITS-2 C API, Unidata/UCAR, v2.2) in UTF-8 and converted to
 * the SI reference unit of the requested dimension:
 *
 *     value_SI = cv(value)          cv = ut_get_converter(unit, reference)
 *
 * Temperatures: PLUMB_DIM_TEMPERATURE keeps the scale's offset
 * (T/K = t/degC + 273.15 = (t/degF + 459.67)/1.8, NIST SP 811 (2008)
 * B.9); every other dimension uses the unit's interval only (udunits2
 * drops the offset of a unit multiplied by one), so "18 degF" as a
 * temperature difference is 10 K and "6.5 degC/km" is 0.0065 K/m.
 *
 * Angles: udunits2 treats the radian as a dimensionless unit, so a
 * percentage is "convertible" to degrees.  An angle must therefore carry
 * the radian to the first power in its definition, and a fraction must not
 * carry it at all.
 *
 * Exact definitions behind the alias table:
 *   foot = 0.3048 m, pound = 0.45359237 kg (international yard and pound
 *   agreement, 1959); g0 = 9.80665 m/s^2 (3rd CGPM, 1901), so
 *   lbf = 4.4482216152605 N; nautical mile = 1852 m, knot = 1852/3600 m/s;
 *   ounce (avoirdupois) = pound/16; conventional inch of mercury =
 *   3.386 389 E+03 Pa (NIST SP 811 (2008) Appendix B.8).
 *
 * Ownership and threads: the handle owns the udunits2 unit system; udunits2
 * is not thread-safe and ut_set_error_message_handler() is process-global
 * (set to ut_ignore here so that the library never prints).
 */
#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <udunits2.h>

#include "plumb/units.h"
#include "core/internal.h"

/* Longest quantity or unit text accepted, bytes (a sane unit is < 40). */
#define UNITS_TEXT_MAX 256
/* Room for the unit text once aliases are expanded. Aliases can grow a
 * text up to about nine times ("kn%" -> 27 bytes); a real unit grows far
 * less ("ft lbf" -> 34 bytes), so a text that needs more than this is not a
 * plausible unit and is refused. */
#define UNITS_EXPANDED_MAX (4 * UNITS_TEXT_MAX)
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

struct plumb_units {
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

/* Dimensions tried, in this order, to name what a wrong unit measures.
 * TEMP_DIFF and FRACTION are left out: they share TEMPERATURE's and
 * NONE's dimension; angles and numbers are told apart by the radian. */
static const plumb_dim describe_order[] = {
    PLUMB_DIM_LENGTH, PLUMB_DIM_MASS,     PLUMB_DIM_TIME,        PLUMB_DIM_SPEED,
    PLUMB_DIM_AREA,   PLUMB_DIM_VOLUME,   PLUMB_DIM_ENERGY,      PLUMB_DIM_FORCE,
    PLUMB_DIM_PRESSURE, PLUMB_DIM_DENSITY, PLUMB_DIM_TEMPERATURE, PLUMB_DIM_LAPSE,
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

/* The units a quantity of each dimension is usually written in: the only
 * candidates of a did-you-mean (with the alias words of the dimension), and
 * the list a wrong unit's message shows. Each must read as its dimension
 * (tests/test_units.c checks every one through the message). */
static const char *const dim_units[PLUMB_DIM_COUNT] = {
    [PLUMB_DIM_NONE] = "",
    [PLUMB_DIM_LENGTH] = "m, km, cm, mm, ft, in, yd, mi, nmi",
    [PLUMB_DIM_MASS] = "kg, g, mg, t, lb, oz",
    [PLUMB_DIM_TIME] = "s, ms, min, h",
    [PLUMB_DIM_SPEED] = "m/s, km/h, kn, kt, mph, ft/s",
    [PLUMB_DIM_AREA] = "m^2, cm^2, mm^2, ft^2, in^2",
    [PLUMB_DIM_VOLUME] = "m^3, L, cm^3, ft^3, in^3",
    [PLUMB_DIM_ENERGY] = "J, kJ, ft lbf, in lbf",
    [PLUMB_DIM_FORCE] = "N, kN, lbf",
    [PLUMB_DIM_ANGLE] = "deg, rad",
    [PLUMB_DIM_TEMPERATURE] = "K, degC, degF",
    [PLUMB_DIM_TEMP_DIFF] = "K, degC, degF",
    [PLUMB_DIM_PRESSURE] = "Pa, hPa, kPa, bar, mbar, inHg, psi",
    [PLUMB_DIM_DENSITY] = "kg/m^3, g/cm^3, lb/ft^3",
    [PLUMB_DIM_LAPSE] = "K/m, K/km, degC/km",
    [PLUMB_DIM_FRACTION] = "%",
};

/* Words people write for a unit that udunits2 reads otherwise or not at
 * all, with what they mean where `dim` is wanted ("5 kilos" is 5000 s to
 * udunits2: the prefix kilo on the second). `why` (may be NULL) completes
 * the description of what was found. */
static const struct {
    const char *word;
    plumb_dim dim;
    const char *use;
    const char *why;
} unit_hints[] = {
    {"kilo", PLUMB_DIM_MASS, "kg", NULL},
    {"kilos", PLUMB_DIM_MASS, "kg", "\"kilos\" reads as kiloseconds"},
    {"kgs", PLUMB_DIM_MASS, "kg", NULL},
    {"C", PLUMB_DIM_TEMPERATURE, "degC", "C is the coulomb"},
    {"C", PLUMB_DIM_TEMP_DIFF, "degC", "C is the coulomb"},
    {"F", PLUMB_DIM_TEMPERATURE, "degF", "F is the farad"},
    {"F", PLUMB_DIM_TEMP_DIFF, "degF", "F is the farad"},
    {"hrs", PLUMB_DIM_TIME, "h", NULL},
    {"mins", PLUMB_DIM_TIME, "min", NULL},
    {"kmh", PLUMB_DIM_SPEED, "km/h", NULL},
    {"kmph", PLUMB_DIM_SPEED, "km/h", NULL},
    {"mps", PLUMB_DIM_SPEED, "m/s", NULL},
};

#define N_HINTS (sizeof unit_hints / sizeof unit_hints[0])

/* What a one-letter unit symbol or prefix is, to say why a change of case
 * matters (BIPM SI Brochure, 9th ed., tables 4, 7 and 8). */
static const struct {
    char c;
    const char *is;
} letters[] = {
    {'A', "the ampere"}, {'C', "the coulomb"}, {'E', "the prefix exa"}, {'F', "the farad"},
    {'G', "the prefix giga"}, {'H', "the henry"}, {'J', "the joule"}, {'K', "the kelvin"},
    {'L', "the litre"}, {'M', "the prefix mega"}, {'N', "the newton"}, {'P', "the prefix peta"},
    {'S', "the siemens"}, {'T', "the tesla (or the prefix tera)"}, {'V', "the volt"},
    {'W', "the watt"}, {'g', "the gram"}, {'h', "the hour"}, {'k', "the prefix kilo"},
    {'m', "the metre"}, {'s', "the second"}, {'t', "the tonne"},
};

static int valid_dim(plumb_dim dim)
{
    return (unsigned)dim < (unsigned)PLUMB_DIM_COUNT;
}

const char *plumb_dim_si_unit(plumb_dim dim)
{
    return valid_dim(dim) ? dims[dim].si : "?";
}

const char *plumb_dim_name(plumb_dim dim)
{
    return valid_dim(dim) ? dims[dim].name : "unknown dimension";
}

/* ---- the unit's shape, from a udunits2 visitor ---------------------------- */

/* What a parsed unit is made of, beyond its dimension. */
typedef struct unit_shape {
    const ut_visitor *self;   /* this visitor, to descend into Galilean units */
    const ut_unit *radian;    /* the radian of the system */
    int rad_power;            /* power of the radian in the definition */
    int has_offset;           /* a Galilean unit with an offset (degC, degF) */
    int is_timestamp;         /* "s since 2000-01-01" */
    int is_log;               /* a logarithmic unit */
} unit_shape;

static ut_status visit_basic(const ut_unit *unit, void *arg)
{
    unit_shape *shape = arg;
    if (ut_compare(unit, shape->radian) == 0)
        shape->rad_power += 1;
    return UT_SUCCESS;
}

static ut_status visit_product(const ut_unit *unit, int count, const ut_unit *const *basic,
                               const int *powers, void *arg)
{
    unit_shape *shape = arg;
    for (int i = 0; i < count; i++)
        if (ut_compare(basic[i], shape->radian) == 0)
            shape->rad_power += powers[i];
    (void)unit;
    return UT_SUCCESS;
}

static ut_status visit_galilean(const ut_unit *unit, double scale, const ut_unit *underlying,
                                double offset, void *arg)
{
    unit_shape *shape = arg;
    (void)unit;
    (void)scale;
    if (offset != 0.0)
        shape->has_offset = 1;
    return ut_accept_visitor(underlying, shape->self, arg);
}

static ut_status visit_timestamp(const ut_unit *unit, const ut_unit *time_unit, double origin,
                                 void *arg)
{
    unit_shape *shape = arg;
    (void)unit;
    (void)time_unit;
    (void)origin;
    shape->is_timestamp = 1;
    return UT_SUCCESS;
}

static ut_status visit_logarithmic(const ut_unit *unit, double base, const ut_unit *reference,
                                   void *arg)
{
    unit_shape *shape = arg;
    (void)unit;
    (void)base;
    (void)reference;
    shape->is_log = 1;
    return UT_SUCCESS;
}

static const ut_visitor shape_visitor = {
    visit_basic, visit_product, visit_galilean, visit_timestamp, visit_logarithmic,
};

/* Fills *shape for unit. Returns 0, or -1 when udunits2 could not visit it. */
static int unit_shape_of(const plumb_units *units, const ut_unit *unit, unit_shape *shape)
{
    memset(shape, 0, sizeof *shape);
    shape->self = &shape_visitor;
    shape->radian = units->radian;
    return ut_accept_visitor(unit, &shape_visitor, shape) == UT_SUCCESS ? 0 : -1;
}

/* 1 when udunits2's last call failed for want of memory (UT_OS: its
 * allocation failed, errno ENOMEM; udunits2.h). */
static int ut_out_of_memory(void)
{
    return ut_get_status() == UT_OS;
}

/* ---- rewriting the unit text ---------------------------------------------- */

static int is_word_char(unsigned char c)
{
    return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z') || c == '_';
}

static const unit_alias *find_alias(const char *word, size_t len)
{
    for (size_t i = 0; i < N_ALIASES; i++)
        if (strlen(aliases[i].word) == len && memcmp(aliases[i].word, word, len) == 0)
            return &aliases[i];
    return NULL;
}

/* A bounded output buffer: `full` is set instead of overflowing. */
typedef struct outbuf {
    char *p;
    size_t len, cap;
    int full;
} outbuf;

static void out_bytes(outbuf *o, const char *s, size_t n)
{
    if (o->full || o->len + n >= o->cap) {
        o->full = 1;
        return;
    }
    memcpy(o->p + o->len, s, n);
    o->len += n;
    o->p[o->len] = '\0';
}

static void out_str(outbuf *o, const char *s)
{
    out_bytes(o, s, strlen(s));
}

/* If s starts with a UTF-8 superscript digit or sign, returns its byte
 * length and stores its ASCII counterpart in *ascii; else returns 0.
 * Superscripts: U+00B2 U+00B3 U+00B9 U+2070 U+2074..U+2079 U+207A U+207B. */
static size_t superscript(const unsigned char *s, char *ascii)
{
    if (s[0] == 0xC2 && (s[1] == 0xB2 || s[1] == 0xB3)) {
        *ascii = (char)('2' + (s[1] - 0xB2));
        return 2;
    }
    if (s[0] == 0xC2 && s[1] == 0xB9) {
        *ascii = '1';
        return 2;
    }
    if (s[0] == 0xE2 && s[1] == 0x81) {
        if (s[2] == 0xB0) {
            *ascii = '0';
            return 3;
        }
        if (s[2] >= 0xB4 && s[2] <= 0xB9) {
            *ascii = (char)('4' + (s[2] - 0xB4));
            return 3;
        }
        if (s[2] == 0xBA || s[2] == 0xBB) {
            *ascii = s[2] == 0xBA ? '+' : '-';
            return 3;
        }
    }
    return 0;
}

/* Length of a UTF-8 multiplication dot at s (U+00B7 middle dot, U+22C5 dot
 * operator), else 0. */
static size_t mult_dot(const unsigned char *s)
{
    if (s[0] == 0xC2 && s[1] == 0xB7)
        return 2;
    if (s[0] == 0xE2 && s[1] == 0x8B && s[2] == 0x85)
        return 3;
    return 0;
}

/* Rewrites the unit text for udunits2: whole-word aliases replaced, "%"
 * spelt out, a multiplication dot made a space, superscript exponents
 * ("m⁻³", which udunits2 2.2.28 cannot read) made ASCII ("m^-3"). A
 * hyphen between names ("ft-lbf") is already a product for udunits2, and
 * an exponent after an alias ("ft2" -> "international_foot2") still reads
 * as a power.
 * Returns 0, or -1 when the result does not fit. */
static int rewrite_unit(const char *in, char *out, size_t cap)
{
    outbuf o = {out, 0, cap, 0};
    const unsigned char *s = (const unsigned char *)in;
    out[0] = '\0';
    size_t i = 0;
    while (s[i]) {
        char sup;
        size_t n;
        if (is_word_char(s[i])) {
            size_t start = i;
            while (is_word_char(s[i]))
                i++;
            const unit_alias *a = find_alias(in + start, i - start);
            if (a)
                out_str(&o, a->ud);
            else
                out_bytes(&o, in + start, i - start);
        } else if (s[i] == '%') {
            out_str(&o, find_alias("%", 1)->ud);
            i++;
        } else if ((n = mult_dot(s + i)) > 0) {
            out_str(&o, " ");
            i += n;
        } else if ((n = superscript(s + i, &sup)) > 0) {
            out_str(&o, "^");
            while ((n = superscript(s + i, &sup)) > 0) {
                out_bytes(&o, &sup, 1);
                i += n;
            }
        } else {
            out_bytes(&o, in + i, 1);
            i++;
        }
    }
    return o.full ? -1 : 0;
}

/* True when the unit text holds a number that is not an exponent, e.g.
 * "kg 3", "lb/16", "ft.5": udunits2 would silently scale by it.  An
 * exponent follows a name, ")" or "^" ("m2", "m^2", "s-1", "(ft)2", "m**2").
 * The unit "1" and a leading "1/" ("1/s") are allowed. */
static int has_number_factor(const char *unit)
{
    const unsigned char *s = (const unsigned char *)unit;
    size_t i = 0;
    if (s[0] == '1' && (s[1] == '\0' || s[1] == '/'))
        i = 1;
    for (; s[i]; i++) {
        if (s[i] == '.' && isdigit(s[i + 1]))
            return 1; /* ".5", "ft.5", "m2.5": no decimal exponents */
        if (!isdigit(s[i]) || (i > 0 && (isdigit(s[i - 1]) || s[i - 1] == '.')))
            continue; /* not a digit, or inside a number already judged */
        if (i == 0)
            return 1;
        unsigned char p = s[i - 1];
        if (is_word_char(p) || p == ')' || p == '^')
            continue;
        if (p == '*' && i >= 2 && s[i - 2] == '*')
            continue;
        if ((p == '-' || p == '+') && i >= 2 && (is_word_char(s[i - 2]) || s[i - 2] == ')'))
            continue;
        return 1;
    }
    return 0;
}

/* ---- dimensions ------------------------------------------------------------ */

/* True when a and b measure the same quantity. ut_are_convertible() is not
 * enough: udunits2 2.2.28 also holds a unit convertible into its
 * reciprocal, and its converter inverts the value (seen here: "5 1/kg"
 * was read as a mass of 0.2 kg, "2 Hz" as a time of 0.5 s; its header
 * does not say so). The quotient of two units of the same dimension is
 * dimensionless. Returns 1 (same), 0 (not), or -1 when udunits2 ran out of
 * memory. */
static int same_dimension(const plumb_units *units, const ut_unit *a, const ut_unit *b)
{
    ut_unit *q = ut_divide(a, b);
    if (!q)
        return ut_out_of_memory() ? -1 : 0;
    int same = ut_are_convertible(q, units->one) != 0;
    ut_free(q);
    return same;
}

/* ---- diagnostics ----------------------------------------------------------- */

/* Describes what `unit` measures, in words: "a length", "an angle", "an
 * electric charge". Returns 0, or -1 (buf untouched) when it is none of the
 * quantities named in this file. */
static int describe_unit(const plumb_units *units, const ut_unit *unit, const unit_shape *shape,
                         char *buf, size_t size)
{
    if (ut_are_convertible(unit, units->one)) {
        snprintf(buf, size, "%s", shape->rad_power == 1 ? "an angle" : "a dimensionless number");
        return 0;
    }
    for (size_t i = 0; i < sizeof describe_order / sizeof describe_order[0]; i++) {
        plumb_dim d = describe_order[i];
        if (same_dimension(units, unit, units->ref[d]) > 0) {
            snprintf(buf, size, "%s %s", dims[d].article, dims[d].name);
            return 0;
        }
    }
    for (size_t i = 0; i < N_OTHER; i++) {
        if (units->other[i] && same_dimension(units, unit, units->other[i]) > 0) {
            /* udunits2 takes the radian for a number: rad/s is a frequency */
            int angular = shape->rad_power != 0 && strcmp(other_quantities[i].ud, "1/s") == 0;
            snprintf(buf, size, "%s", angular ? "an angular speed" : other_quantities[i].what);
            return 0;
        }
    }
    return -1;
}

/* What a caller wanted, for messages: "a mass (kg)", "a fraction (a bare
 * number or \"%\")", "a bare number". */
static void describe_want(plumb_dim want, char *buf, size_t size)
{
    if (want == PLUMB_DIM_NONE)
        snprintf(buf, size, "a bare number (dimensionless)");
    else if (want == PLUMB_DIM_FRACTION)
        snprintf(buf, size, "a fraction (a bare number or \"%%\")");
    else
        snprintf(buf, size, "%s %s (%s)", dims[want].article, dims[want].name, dims[want].si);
}

/* The ASCII lower case of s into dst (size bytes). */
static void fold(const char *s, char *dst, size_t size)
{
    size_t i = 0;
    for (; s[i] && i + 1 < size; i++)
        dst[i] = (char)(s[i] >= 'A' && s[i] <= 'Z' ? s[i] - 'A' + 'a' : s[i]);
    dst[i] = '\0';
}

/* What the one-letter symbol c stands for, or NULL. */
static const char *letter_is(char c)
{
    for (size_t i = 0; i < sizeof letters / sizeof letters[0]; i++)
        if (letters[i].c == c)
            return letters[i].is;
    return NULL;
}

/* Advice on a unit that is unknown or of the wrong dimension. */
typedef struct unit_advice {
    char use[UNITS_SHOW_MAX];   /* the unit to write instead, "" when none is near */
    const char *why;            /* completes what was found ("C is the coulomb"), or NULL */
    char note[128];             /* "unit symbols are case-sensitive: ...", or "" */
} unit_advice;

/* Most candidates of one dimension (its list plus its alias words). */
#define UNITS_CANDIDATES 48

/* The units of dimension want that a did-you-mean may offer, into cand[];
 * their text lives in store. Returns how many. */
static size_t candidates(plumb_dim want, const char **cand, char *store, size_t size)
{
    size_t n = 0;
    plumbp_strlcpy(store, dim_units[want], size);
    for (char *p = store; *p && n < UNITS_CANDIDATES;) {
        cand[n++] = p;
        char *comma = strstr(p, ", ");
        if (!comma)
            break;
        *comma = '\0';
        p = comma + 2;
    }
    plumb_dim alias_dim = want == PLUMB_DIM_TEMP_DIFF ? PLUMB_DIM_TEMPERATURE : want;
    for (size_t i = 0; i < N_ALIASES && n < UNITS_CANDIDATES; i++)
        if (aliases[i].dim == alias_dim)
            cand[n++] = aliases[i].word;
    return n;
}

/* Looks for the unit of dimension `want` that `unit` was meant to be: a
 * known slip (unit_hints), the same letters in another case ("KG" -> "kg",
 * with a note that symbols are case-sensitive), or a near spelling. Only
 * units of the wanted dimension are offered, and a one- or two-letter unit
 * only for a change of case: "M" is one edit from "g", which says nothing. */
static void advise(plumb_dim want, const char *unit, unit_advice *adv)
{
    memset(adv, 0, sizeof *adv);
    for (size_t i = 0; i < N_HINTS; i++)
        if (unit_hints[i].dim == want && strcmp(unit, unit_hints[i].word) == 0) {
            plumbp_strlcpy(adv->use, unit_hints[i].use, sizeof adv->use);
            adv->why = unit_hints[i].why;
            return;
        }
    const char *cand[UNITS_CANDIDATES];
    char store[UNITS_SHOW_MAX * 2];
    size_t n = candidates(want, cand, store, sizeof store);
    char lower[UNITS_SHOW_MAX], lc[UNITS_SHOW_MAX];
    fold(unit, lower, sizeof lower);
    for (size_t i = 0; i < n; i++) {
        fold(cand[i], lc, sizeof lc);
        if (strcmp(lower, lc) != 0 || strcmp(unit, cand[i]) == 0)
            continue;
        plumbp_strlcpy(adv->use, cand[i], sizeof adv->use);
        size_t k = 0;
        while (unit[k] == cand[i][k])
            k++;
        const char *was = letter_is(unit[k]);
        const char *meant = cand[i][1] == '\0' ? letter_is(cand[i][0]) : NULL;
        if (was && meant)
            snprintf(adv->note, sizeof adv->note,
                     "unit symbols are case-sensitive: %c is %s, not %s", unit[k], was, meant);
        else if (was)
            snprintf(adv->note, sizeof adv->note, "unit symbols are case-sensitive: %c is %s",
                     unit[k], was);
        else
            snprintf(adv->note, sizeof adv->note, "unit symbols are case-sensitive");
        return;
    }
    size_t len = strlen(unit);
    int limit = len <= 2 ? 0 : len <= 4 ? 1 : 2;
    int best_d = limit + 1;
    for (size_t i = 0; i < n; i++) {
        fold(cand[i], lc, sizeof lc);
        int d = plumbp_edit_distance(lower, lc);
        if (d < best_d) {
            best_d = d;
            plumbp_strlcpy(adv->use, cand[i], sizeof adv->use);
        }
    }
}

/* The end of a wrong-unit message: "; did you mean \"5 kg\"? (note)", or
 * the units of the wanted dimension. */
static void advice_tail(plumb_dim want, const char *number, const unit_advice *adv, char *buf,
                        size_t size)
{
    if (adv->use[0])
        snprintf(buf, size, "; did you mean \"%.*s %s\"?%s%s%s", UNITS_SHOW_MAX, number,
                 adv->use, adv->note[0] ? " (" : "", adv->note, adv->note[0] ? ")" : "");
    else if (dim_units[want][0])
        snprintf(buf, size, "; units of %s %s: %s", dims[want].article, dims[want].name,
                 dim_units[want]);
    else
        buf[0] = '\0';
}

/* Raises the "unknown unit" error, with the unit of the wanted dimension
 * that was probably meant, or the list of them. */
static plumb_status raise_unknown(plumb_diag *diag, plumb_dim want, const char *unit,
                                  const char *shown, const char *number)
{
    char w[UNITS_SHOW_MAX + 64], tail[UNITS_SHOW_MAX * 5];
    describe_want(want, w, sizeof w);
    unit_advice adv;
    advise(want, unit, &adv);
    advice_tail(want, number, &adv, tail, sizeof tail);
    return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s; unknown unit \"%.*s\" in \"%.*s\"%s", w,
                       UNITS_SHOW_MAX, unit, UNITS_SHOW_MAX, shown, tail);
}

/* Raises the error of a unit of another dimension: what it measures, in
 * words, and what was probably meant. */
static plumb_status raise_wrong(const plumb_units *units, plumb_diag *diag, plumb_dim want,
                                const ut_unit *unit, const unit_shape *shape, const char *text,
                                const char *shown, const char *number)
{
    char w[UNITS_SHOW_MAX + 64], found[128], tail[UNITS_SHOW_MAX * 5];
    describe_want(want, w, sizeof w);
    unit_advice adv;
    advise(want, text, &adv);
    if (describe_unit(units, unit, shape, found, sizeof found) != 0)
        snprintf(found, sizeof found, "a unit that is not %s %s", dims[want].article,
                 dims[want].name);
    advice_tail(want, number, &adv, tail, sizeof tail);
    return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s, found \"%.*s\" (%s%s%s)%s", w,
                       UNITS_SHOW_MAX, shown, found, adv.why ? ": " : "", adv.why ? adv.why : "",
                       tail);
}

/* Compass letters after an angle ("54.2 N", "3.1 deg W"): 1 for N or E,
 * -1 for S or W, 0 for anything else. */
static int compass_letter(const char *unit)
{
    static const char *const degree_words[] = {"degrees", "degree", "deg", "\xC2\xB0"};
    for (size_t i = 0; i < sizeof degree_words / sizeof degree_words[0]; i++) {
        size_t n = strlen(degree_words[i]);
        if (strncmp(unit, degree_words[i], n) == 0) {
            unit += n;
            break;
        }
    }
    while (*unit == ' ')
        unit++;
    if (unit[0] == '\0' || unit[1] != '\0')
        return 0;
    switch (unit[0]) {
    case 'N': case 'n': case 'E': case 'e': return 1;
    case 'S': case 's': case 'W': case 'w': return -1;
    default: return 0;
    }
}

/* Raises the error of a compass letter after an angle, with the signed
 * angle it means. */
static plumb_status raise_compass(plumb_diag *diag, int sign, const char *shown,
                                  const char *number)
{
    const char *digits = number[0] == '+' || number[0] == '-' ? number + 1 : number;
    int negative = (number[0] == '-') != (sign < 0);
    return PLUMB_RAISE(diag, PLUMB_EUNIT,
                       "expected an angle (deg), found \"%.*s\": compass letters are not units; "
                       "a latitude or longitude is a signed number of degrees, north and east "
                       "positive: write \"%s%.*s deg\"",
                       UNITS_SHOW_MAX, shown, negative ? "-" : "", UNITS_SHOW_MAX, digits);
}

/* ---- conversion ------------------------------------------------------------ */

/* Converts value in unit text `unit` (trimmed, may be "") to the SI unit of
 * `want`. `shown` is the whole quantity as the user wrote it, `number` its
 * number, both for messages. Writes *si_out only on success. */
/* The trade writes an energy in "foot-pounds" (14 CFR 107.120 says
 * "11 foot-pounds"), which read literally is a length times a mass: where
 * an energy is wanted these spellings mean the foot pound-force. */
static const char *const foot_pound_words[] = {
    "ft lb", "ft-lb", "ft lbs", "ft-lbs", "ft·lb", "ft·lbs", "ft*lb", "ft.lb",
    "foot-pound", "foot-pounds", "foot pound", "foot pounds", "ft-pound", "ft-pounds",
};

static plumb_status convert(const plumb_units *units, double value, const char *unit,
                            plumb_dim want, const char *shown, const char *number,
                            double *si_out, plumb_diag *diag)
{
    if (want == PLUMB_DIM_ENERGY)
        for (size_t i = 0; i < sizeof foot_pound_words / sizeof foot_pound_words[0]; i++)
            if (strcmp(unit, foot_pound_words[i]) == 0) {
                unit = "ft lbf";
                break;
            }
    char w[UNITS_SHOW_MAX + 64];
    describe_want(want, w, sizeof w);

    if (unit[0] == '\0') {
        if (want == PLUMB_DIM_NONE || want == PLUMB_DIM_FRACTION) {
            *si_out = value;
            return PLUMB_OK;
        }
        return PLUMB_RAISE(diag, PLUMB_EUNIT,
                           "expected %s %s with its unit (e.g. \"%.*s %s\"); found a bare number "
                           "\"%.*s\"",
                           dims[want].article, dims[want].name, UNITS_SHOW_MAX, number,
                           dims[want].si, UNITS_SHOW_MAX, number);
    }
    if (want == PLUMB_DIM_NONE) {
        if (strcmp(unit, "1") == 0) {
            *si_out = value;
            return PLUMB_OK;
        }
        return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s, found \"%.*s\" with a unit", w,
                           UNITS_SHOW_MAX, shown);
    }
    int sign = want == PLUMB_DIM_ANGLE ? compass_letter(unit) : 0;
    if (sign != 0)
        return raise_compass(diag, sign, shown, number);
    char expanded[UNITS_EXPANDED_MAX];
    if (rewrite_unit(unit, expanded, sizeof expanded) != 0)
        return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s; the unit in \"%.*s...\" is too long",
                           w, UNITS_SHOW_MAX, shown);

    ut_unit *parsed = ut_parse(units->sys, expanded, UT_UTF8);
    if (!parsed && ut_out_of_memory())
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory reading the unit of \"%.*s\"",
                           UNITS_SHOW_MAX, shown);
    if (!parsed)
        return raise_unknown(diag, want, unit, shown, number);

    unit_shape shape;
    plumb_status st = PLUMB_OK;
    ut_unit *interval = NULL;
    cv_converter *cv = NULL;
    if (unit_shape_of(units, parsed, &shape) != 0) {
        st = PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s; udunits2 could not inspect \"%.*s\"",
                         w, UNITS_SHOW_MAX, unit);
        goto done;
    }
    if (shape.is_timestamp || shape.is_log) {
        st = PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s, found \"%.*s\" (%s)", w,
                         UNITS_SHOW_MAX, shown,
                         shape.is_timestamp ? "a time stamp, not an amount"
                                            : "a logarithmic unit");
        goto done;
    }
    if (has_number_factor(unit)) {
        st = PLUMB_RAISE(diag, PLUMB_EUNIT,
                         "expected %s; the unit \"%.*s\" in \"%.*s\" contains a number "
                         "(write one number, then the unit)",
                         w, UNITS_SHOW_MAX, unit, UNITS_SHOW_MAX, shown);
        goto done;
    }
    /* Only an absolute temperature keeps the scale's offset; elsewhere the
     * unit is an interval ("10 degC" of difference is 10 K). */
    ut_unit *use = parsed;
    if (want != PLUMB_DIM_TEMPERATURE && shape.has_offset) {
        interval = ut_multiply(parsed, units->one);
        if (!interval) {
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory converting \"%.*s\"",
                             UNITS_SHOW_MAX, shown);
            goto done;
        }
        use = interval;
    }
    int ok = same_dimension(units, use, units->ref[want]);
    if (ok < 0) {
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory converting \"%.*s\"", UNITS_SHOW_MAX,
                         shown);
        goto done;
    }
    if (want == PLUMB_DIM_ANGLE && shape.rad_power != 1)
        ok = 0;
    if (want == PLUMB_DIM_FRACTION && shape.rad_power != 0)
        ok = 0;
    if (!ok) {
        st = raise_wrong(units, diag, want, use, &shape, unit, shown, number);
        goto done;
    }
    cv = ut_get_converter(use, units->ref[want]);
    if (!cv && ut_out_of_memory()) {
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory converting \"%.*s\"", UNITS_SHOW_MAX,
                         shown);
        goto done;
    }
    if (!cv) {
        st = PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s; udunits2 cannot convert \"%.*s\"", w,
                         UNITS_SHOW_MAX, unit);
        goto done;
    }
    double si = cv_convert_double(cv, value);
    if (!plumbp_finite(si)) {
        st = PLUMB_RAISE(diag, PLUMB_ERANGE, "\"%.*s\" is too large once converted to %s",
                         UNITS_SHOW_MAX, shown, dims[want].si);
        goto done;
    }
    if (want == PLUMB_DIM_TEMPERATURE && si < 0.0) {
        st = PLUMB_RAISE(diag, PLUMB_ERANGE,
                         "expected %s, found \"%.*s\", which is %.6g K: below absolute zero", w,
                         UNITS_SHOW_MAX, shown, si);
        goto done;
    }
    *si_out = si;
done:
    cv_free(cv);
    ut_free(interval);
    ut_free(parsed);
    return st;
}

/* ---- public functions ------------------------------------------------------ */

static const char *ut_status_text(ut_status s)
{
    switch (s) {
    case UT_OPEN_ARG: return "cannot open the named database file";
    case UT_OPEN_ENV: return "cannot open the database named by UDUNITS2_XML_PATH";
    case UT_OPEN_DEFAULT: return "cannot open the installed database";
    case UT_PARSE: return "the database is malformed";
    case UT_OS: return "operating-system error";
    default: return "udunits2 error";
    }
}

/*
 * Loads the default udunits2 database and builds the reference units.
 * Every alias is parsed and checked against the dimension it claims, so a
 * database that lacks or redefines one fails here (PLUMB_EIO), not later.
 * On error *out is NULL and everything made so far is freed.
 */
plumb_status plumb_units_alloc(plumb_units **out, plumb_diag *diag)
{
    if (!out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_units_alloc: out is NULL");
    *out = NULL;
    plumb_units *u = calloc(1, sizeof *u);
    if (!u)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory allocating the unit system");

    plumb_status st = PLUMB_OK;
    ut_set_error_message_handler(ut_ignore);
    u->sys = ut_read_xml(NULL);
    if (!u->sys) {
        ut_status us = ut_get_status();
        st = ut_out_of_memory()
                 ? PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the udunits2 unit database")
                 : PLUMB_RAISE(diag, PLUMB_EIO, "cannot load the udunits2 unit database: %s",
                               ut_status_text(us));
        goto fail;
    }
    u->one = ut_get_dimensionless_unit_one(u->sys);
    u->radian = ut_get_unit_by_name(u->sys, "radian");
    if (!u->one || !u->radian) {
        st = PLUMB_RAISE(diag, PLUMB_EIO, "the udunits2 database has no %s",
                         u->one ? "radian" : "dimensionless unit one");
        goto fail;
    }
    for (int d = 0; d < PLUMB_DIM_COUNT; d++) {
        u->ref[d] = ut_parse(u->sys, dims[d].ud, UT_ASCII);
        if (!u->ref[d] && ut_out_of_memory()) {
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the unit \"%s\"",
                             dims[d].ud);
            goto fail;
        }
        if (!u->ref[d]) {
            st = PLUMB_RAISE(diag, PLUMB_EIO, "the udunits2 database has no unit \"%s\" (%s)",
                             dims[d].ud, dims[d].name);
            goto fail;
        }
    }
    for (size_t i = 0; i < N_ALIASES; i++) {
        ut_unit *a = ut_parse(u->sys, aliases[i].ud, UT_ASCII);
        int ok = a ? same_dimension(u, a, u->ref[aliases[i].dim]) : ut_out_of_memory() ? -1 : 0;
        ut_free(a);
        if (ok < 0) {
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the unit \"%s\"",
                             aliases[i].ud);
            goto fail;
        }
        if (!ok) {
            st = PLUMB_RAISE(diag, PLUMB_EIO,
                             "the udunits2 database does not define \"%s\" (for \"%s\") as %s %s",
                             aliases[i].ud, aliases[i].word, dims[aliases[i].dim].article,
                             dims[aliases[i].dim].name);
            goto fail;
        }
    }
    /* only for naming a wrong unit: one the database lacks stays NULL */
    for (size_t i = 0; i < N_OTHER; i++) {
        u->other[i] = ut_parse(u->sys, other_quantities[i].ud, UT_ASCII);
        if (!u->other[i] && ut_out_of_memory()) {
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the unit \"%s\"",
                             other_quantities[i].ud);
            goto fail;
        }
    }
    *out = u;
    return PLUMB_OK;
fail:
    plumb_units_free(u);
    return st;
}

void plumb_units_free(plumb_units *units)
{
    if (!units)
        return;
    for (int d = 0; d < PLUMB_DIM_COUNT; d++)
        ut_free(units->ref[d]);
    for (size_t i = 0; i < N_OTHER; i++)
        ut_free(units->other[i]);
    ut_free(units->radian);
    ut_free(units->one);
    ut_free_system(units->sys);
    free(units);
}

/* Copies [b, e) trimmed of white space into dst of size n; returns its
 * length, or n when it does not fit. */
static size_t copy_trimmed(char *dst, size_t n, const char *b, const char *e)
{
    while (b < e && isspace((unsigned char)*b))
        b++;
    while (e > b && isspace((unsigned char)e[-1]))
        e--;
    size_t len = (size_t)(e - b);
    if (len >= n)
        return n;
    memcpy(dst, b, len);
    dst[len] = '\0';
    return len;
}

/* The sixteen compass points, clockwise from north in steps of 22.5 deg. */
static const char *const compass_points[16] = {
    "N", "NNE", "NE", "ENE", "E", "ESE", "SE", "SSE",
    "S", "SSW", "SW", "WSW", "W", "WNW", "NW", "NNW",
};

/* The bearing of a compass point written in text (any case), or -1. */
static double compass_bearing(const char *text)
{
    char up[8];
    size_t n = strlen(text);
    if (n == 0 || n >= sizeof up)
        return -1.0;
    for (size_t i = 0; i <= n; i++)
        up[i] = (char)(text[i] >= 'a' && text[i] <= 'z' ? text[i] - 'a' + 'A' : text[i]);
    for (int i = 0; i < 16; i++)
        if (strcmp(up, compass_points[i]) == 0)
            return 22.5 * i;
    return -1.0;
}

/* Raises the error of a number written with a comma ("6,5 m", "1,500 m"):
 * plumb reads a decimal point and no thousands separator. `end` is where
 * strtod stopped in `shown`, at the comma. */
static plumb_status raise_comma(plumb_diag *diag, plumb_dim want, const char *shown,
                                const char *end)
{
    char w[UNITS_SHOW_MAX + 64];
    describe_want(want, w, sizeof w);
    const char *q = end;
    int commas = 0, threes = 1, point = memchr(shown, '.', (size_t)(end - shown)) != NULL;
    while (q[0] == ',' && isdigit((unsigned char)q[1])) {
        commas++;
        size_t nd = 0;
        for (q++; isdigit((unsigned char)*q); q++)
            nd++;
        threes &= nd == 3;
    }
    if (q[0] == '.' && isdigit((unsigned char)q[1])) {
        point = 1;
        for (q++; isdigit((unsigned char)*q); q++)
            ;
    }
    /* the number with its commas as points, and without them */
    char as_point[UNITS_TEXT_MAX + 1], as_plain[UNITS_TEXT_MAX + 1];
    size_t a = 0, b = 0;
    for (const char *c = shown; *c; c++) {
        int in_number = c < q;
        as_point[a++] = in_number && *c == ',' ? '.' : *c;
        if (!(in_number && *c == ','))
            as_plain[b++] = *c;
    }
    as_point[a] = as_plain[b] = '\0';
    if (commas == 1 && !point && !threes)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected %s, found \"%.*s\": use a decimal point: \"%.*s\"", w,
                           UNITS_SHOW_MAX, shown, UNITS_SHOW_MAX, as_point);
    if (commas == 1 && !point)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected %s, found \"%.*s\": numbers take a decimal point and no "
                           "thousands separator: write \"%.*s\" or \"%.*s\", whichever is meant",
                           w, UNITS_SHOW_MAX, shown, UNITS_SHOW_MAX, as_point, UNITS_SHOW_MAX,
                           as_plain);
    return PLUMB_RAISE(diag, PLUMB_EPARSE,
                       "expected %s, found \"%.*s\": numbers take a decimal point and no "
                       "thousands separator%s%.*s%s",
                       w, UNITS_SHOW_MAX, shown, threes && commas > 0 ? ": write \"" : "",
                       threes && commas > 0 ? UNITS_SHOW_MAX : 0, as_plain,
                       threes && commas > 0 ? "\"" : "");
}

/*
 * Parses "NUMBER UNIT" (see units.h). Statuses: PLUMB_EINVAL for a NULL
 * argument or a dimension out of range; PLUMB_EPARSE for an empty text, a
 * text that does not start with a number, a NaN or infinity, a hexadecimal
 * number or a second number; PLUMB_ERANGE when the number over- or
 * underflows a double, when the converted value overflows, or when a
 * temperature lies below absolute zero; PLUMB_EUNIT for a missing, unknown
 * or wrong unit. A fraction is not range-checked here (the caller knows
 * its bounds). Can't fail otherwise; allocates nothing that outlives it.
 */
plumb_status plumb_units_parse(const plumb_units *units, const char *text, plumb_dim want,
                               double *si_out, plumb_diag *diag)
{
    if (!units || !text || !si_out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_units_parse: %s is NULL",
                           !units ? "units" : !text ? "text" : "si_out");
    if (!valid_dim(want))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_units_parse: dimension %d is out of range",
                           (int)want);

    char shown[UNITS_TEXT_MAX + 1];
    size_t len = copy_trimmed(shown, sizeof shown, text, text + strlen(text));
    if (len >= sizeof shown)
        return PLUMB_RAISE(diag, PLUMB_EPARSE, "expected %s %s, found a text of more than %d bytes",
                           dims[want].article, dims[want].name, UNITS_TEXT_MAX);
    if (len == 0)
        return PLUMB_RAISE(diag, PLUMB_EPARSE, "expected %s %s (e.g. \"%s\"); found an empty value",
                           dims[want].article, dims[want].name, dims[want].example);

    const char *p = shown;
    if (*p == '+' || *p == '-')
        p++;
    if (p[0] == '0' && (p[1] == 'x' || p[1] == 'X'))
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected %s %s, found \"%.*s\": hexadecimal numbers are not accepted",
                           dims[want].article, dims[want].name, UNITS_SHOW_MAX, shown);

    char *end;
    errno = 0;
    double value = strtod(shown, &end);
    int err = errno;
    double bearing = want == PLUMB_DIM_ANGLE ? compass_bearing(shown) : -1.0;
    if (end == shown && bearing >= 0.0)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected an angle (e.g. \"%s\"); found \"%s\": a direction is a "
                           "number of degrees clockwise from north, so %s is \"%g deg\"",
                           dims[want].example, shown, shown, bearing);
    if (end == shown)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected %s %s (e.g. \"%s\"); found \"%.*s\", which does not start "
                           "with a number",
                           dims[want].article, dims[want].name, dims[want].example, UNITS_SHOW_MAX,
                           shown);
    if (err == ERANGE)
        return PLUMB_RAISE(diag, PLUMB_ERANGE, "the number in \"%.*s\" is too %s for a double",
                           UNITS_SHOW_MAX, shown, fabs(value) > 1.0 ? "large" : "small");
    if (!plumbp_finite(value))
        return PLUMB_RAISE(diag, PLUMB_EPARSE, "expected %s %s, found \"%.*s\": not a finite number",
                           dims[want].article, dims[want].name, UNITS_SHOW_MAX, shown);

    if (end[0] == ',' && isdigit((unsigned char)end[1]))
        return raise_comma(diag, want, shown, end);

    char number[UNITS_TEXT_MAX + 1];
    char unit[UNITS_TEXT_MAX + 1];
    copy_trimmed(number, sizeof number, shown, end);
    copy_trimmed(unit, sizeof unit, end, shown + len);
    int unit_one = strcmp(unit, "1") == 0 || strncmp(unit, "1/", 2) == 0;
    if (!unit_one && (isdigit((unsigned char)unit[0]) || unit[0] == '.' || unit[0] == '+' ||
                      unit[0] == '-'))
        return PLUMB_RAISE(diag, PLUMB_EPARSE, "expected one number then a unit, found \"%.*s\"",
                           UNITS_SHOW_MAX, shown);
    return convert(units, value, unit, want, shown, number, si_out, diag);
}

/*
 * Converts value in unit (see units.h). Statuses as plumb_units_parse,
 * plus PLUMB_EINVAL for a NaN or infinite value; an empty unit counts as a
 * bare number.
 */
plumb_status plumb_units_to_si(const plumb_units *units, double value, const char *unit,
                               plumb_dim want, double *si_out, plumb_diag *diag)
{
    if (!units || !unit || !si_out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_units_to_si: %s is NULL",
                           !units ? "units" : !unit ? "unit" : "si_out");
    if (!valid_dim(want))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_units_to_si: dimension %d is out of range",
                           (int)want);
    if (!plumbp_finite(value))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_units_to_si: the value is not finite");

    char trimmed[UNITS_TEXT_MAX + 1];
    size_t len = copy_trimmed(trimmed, sizeof trimmed, unit, unit + strlen(unit));
    if (len >= sizeof trimmed)
        return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s %s, found a unit of more than %d bytes",
                           dims[want].article, dims[want].name, UNITS_TEXT_MAX);
    char number[32];
    char shown[sizeof number + UNITS_TEXT_MAX + 2];
    snprintf(number, sizeof number, "%.10g", value);
    snprintf(shown, sizeof shown, "%s%s%s", number, len ? " " : "", trimmed);
    return convert(units, value, trimmed, want, shown, number, si_out, diag);
}
