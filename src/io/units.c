/*
 * units.c - quantities with units ("2.4 kg", "11 ft lbf", "15 degC"),
 * parsed with udunits2 after an alias table for the trade's abbreviations.
 *
 * Method: the number is read with strtod; the unit text is rewritten token
 * by token (whole words only) through the alias table (units_int.h), then
 * parsed by udunits2 (UDUNITS-2 C API, Unidata/UCAR, v2.2) in UTF-8 and
 * converted to the SI reference unit of the requested dimension:
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
 *
 * This file reads and converts; the messages for a quantity that cannot be
 * read (unknown or wrong unit, compass letter, decimal comma) are in
 * units_advice.c, and the tables both use in units_int.h.
 */
#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <udunits2.h>

#include "plumb/suggest.h"
#include "plumb/units.h"
#include "core/internal.h"
#include "io/units_int.h"

/* Room for the unit text once aliases are expanded. Aliases can grow a
 * text up to about nine times ("kn%" -> 27 bytes); a real unit grows far
 * less ("ft lbf" -> 34 bytes), so a text that needs more than this is not a
 * plausible unit and is refused. */
#define UNITS_EXPANDED_MAX (4 * UNITS_TEXT_MAX)

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

/* A count in the denominator: "degF/1000 ft", "K/100m", the way a lapse
 * rate is quoted per thousand feet (and the way plumb's US reports print
 * it). udunits2 reads "K/1000 m" as (K/1000) m, a product, so the count
 * and the unit after it are put in brackets: "K/(1000 m)". Only a whole
 * number above zero right after the one "/", with a unit after it, is
 * taken; *without gets the text with the count left out, for the check
 * for stray numbers. Returns 1 when rewritten, 0 when the unit has no such
 * denominator, -1 when the result does not fit. */
static int per_count(const char *unit, char *with, char *without, size_t cap)
{
    const char *slash = strchr(unit, '/');
    if (!slash || slash == unit || strchr(slash + 1, '/'))
        return 0;
    const char *n = slash + 1;
    while (*n == ' ')
        n++;
    const char *e = n;
    while (isdigit((unsigned char)*e))
        e++;
    if (e == n || *n == '0')
        return 0;
    const char *tail = e;
    while (*tail == ' ')
        tail++;
    if (*tail == '\0' || isdigit((unsigned char)*tail) || *tail == '.' || *tail == '^' ||
        *tail == '*' || *tail == '(' || *tail == ')' || *tail == '-' || *tail == '+')
        return 0;
    int head = (int)(slash - unit);
    int a = snprintf(with, cap, "%.*s/(%.*s %s)", head, unit, (int)(e - n), n, tail);
    int b = snprintf(without, cap, "%.*s/%s", head, unit, tail);
    if (a < 0 || b < 0 || (size_t)a >= cap || (size_t)b >= cap)
        return -1;
    return 1;
}

/* ---- conversion ------------------------------------------------------------ */

/* Converts value in unit text `unit` (trimmed, may be "") to the SI unit of
 * `want`. `shown` is the whole quantity as the user wrote it, `number` its
 * number, both for messages. Writes *si_out only on success. */
/* The trade writes an energy in "foot-pounds" (14 CFR 107.120 says
 * "11 foot-pounds"), and a small one, a torque wrench's, in "inch-pounds",
 * which read literally are a length times a mass: where an energy is
 * wanted these spellings mean the foot and the inch pound-force. */
static const struct {
    const char *word;
    const char *unit;
} pound_force_words[] = {
    {"ft lb", "ft lbf"},       {"ft-lb", "ft lbf"},      {"ft lbs", "ft lbf"},
    {"ft-lbs", "ft lbf"},      {"ft·lb", "ft lbf"},      {"ft·lbs", "ft lbf"},
    {"ft*lb", "ft lbf"},       {"ft.lb", "ft lbf"},      {"foot-pound", "ft lbf"},
    {"foot-pounds", "ft lbf"}, {"foot pound", "ft lbf"}, {"foot pounds", "ft lbf"},
    {"ft-pound", "ft lbf"},    {"ft-pounds", "ft lbf"},  {"in lb", "in lbf"},
    {"in-lb", "in lbf"},       {"in lbs", "in lbf"},     {"in-lbs", "in lbf"},
    {"in·lb", "in lbf"},       {"in·lbs", "in lbf"},     {"in*lb", "in lbf"},
    {"in.lb", "in lbf"},       {"inch-pound", "in lbf"}, {"inch-pounds", "in lbf"},
    {"inch pound", "in lbf"},  {"inch pounds", "in lbf"}, {"in-pound", "in lbf"},
    {"in-pounds", "in lbf"},
};

static plumb_status units_load(const plumb_units *units, plumb_diag *diag);

static plumb_status convert_n(const plumb_units *units, const double *values, size_t n,
                              const char *unit, plumb_dim want, const plumbp_accept *acc,
                              const char *shown, const char *number, double *si_out,
                              plumb_diag *diag, size_t *done);

/* values[0] in unit to SI (*si_out); shown and number are how it was
 * written, for the messages. */
static plumb_status convert(const plumb_units *units, double value, const char *unit,
                            plumb_dim want, const plumbp_accept *acc, const char *shown,
                            const char *number, double *si_out, plumb_diag *diag)
{
    size_t done = 0;
    return convert_n(units, &value, 1, unit, want, acc, shown, number, si_out, diag, &done);
}

/* values[0 .. n) in one unit to SI (si_out[0 .. n)), the unit read and its
 * converter made once; shown and number are how values[0] was written,
 * for the messages. A later value the checks after the conversion refuse
 * (too large, below absolute zero) stops it with *done the values
 * converted, so that the caller can convert that one alone for its own
 * message. */
static plumb_status convert_n(const plumb_units *units, const double *values, size_t n,
                              const char *unit, plumb_dim want, const plumbp_accept *acc,
                              const char *shown, const char *number, double *si_out,
                              plumb_diag *diag, size_t *done)
{
    *done = 0;
    if (want == PLUMB_DIM_ENERGY)
        for (size_t i = 0; i < sizeof pound_force_words / sizeof pound_force_words[0]; i++)
            if (strcmp(unit, pound_force_words[i].word) == 0) {
                unit = pound_force_words[i].unit;
                break;
            }
    char w[UNITS_SHOW_MAX + 64];
    plumbp_units_describe_want(want, w, sizeof w);

    if (unit[0] == '\0') {
        if (want == PLUMB_DIM_NONE || want == PLUMB_DIM_FRACTION) {
            memmove(si_out, values, n * sizeof *si_out);
            *done = n;
            return PLUMB_OK;
        }
        return plumbp_units_raise_bare(units, acc, diag, want, number);
    }
    if (want == PLUMB_DIM_NONE) {
        if (strcmp(unit, "1") == 0) {
            memmove(si_out, values, n * sizeof *si_out);
            *done = n;
            return PLUMB_OK;
        }
        return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s, found \"%.*s\" with a unit", w,
                           UNITS_SHOW_MAX, shown);
    }
    int sign = want == PLUMB_DIM_ANGLE ? plumbp_units_compass_letter(unit) : 0;
    if (sign != 0)
        return plumbp_units_raise_compass(units, acc, diag, sign, shown, number);
    char per[UNITS_EXPANDED_MAX], check[UNITS_EXPANDED_MAX];
    const char *checked = unit; /* the text judged for stray numbers */
    int has_per = per_count(unit, per, check, sizeof per);
    if (has_per > 0)
        checked = check;
    char expanded[UNITS_EXPANDED_MAX];
    if (has_per < 0 || rewrite_unit(has_per > 0 ? per : unit, expanded, sizeof expanded) != 0)
        return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s; the unit in \"%.*s...\" is too long",
                           w, UNITS_SHOW_MAX, shown);

    plumb_status loaded = units_load(units, diag);
    if (loaded != PLUMB_OK)
        return loaded;
    ut_unit *parsed = ut_parse(units->sys, expanded, UT_UTF8);
    if (!parsed && ut_out_of_memory())
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory reading the unit of \"%.*s\"",
                           UNITS_SHOW_MAX, shown);
    if (!parsed)
        return plumbp_units_raise_unknown(units, acc, diag, want, unit, shown, number);

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
    if (has_number_factor(checked)) {
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
        st = plumbp_units_raise_wrong(units, acc, diag, want, use, &shape, unit, shown, number);
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
    for (size_t i = 0; i < n; i++) {
        double si = cv_convert_double(cv, values[i]);
        int bad = !plumbp_finite(si) || (want == PLUMB_DIM_TEMPERATURE && si < 0.0);
        if (bad && i > 0)
            goto done; /* the caller converts values[i] alone, for its message */
        if (!plumbp_finite(si)) {
            st = PLUMB_RAISE(diag, PLUMB_ERANGE, "\"%.*s\" is too large once converted to %s",
                             UNITS_SHOW_MAX, shown, dims[want].si);
            goto done;
        }
        if (want == PLUMB_DIM_TEMPERATURE && si < 0.0) {
            st = PLUMB_RAISE(diag, PLUMB_ERANGE,
                             "expected %s, found \"%.*s\", which is %.6g K: below absolute zero",
                             w, UNITS_SHOW_MAX, shown, si);
            goto done;
        }
        si_out[i] = si;
        *done = i + 1;
    }
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

/* Frees what a load made, leaving the handle as before it. */
static void units_unload(plumb_units *u)
{
    for (int d = 0; d < PLUMB_DIM_COUNT; d++) {
        ut_free(u->ref[d]);
        u->ref[d] = NULL;
    }
    for (size_t i = 0; i < N_OTHER; i++) {
        ut_free(u->other[i]);
        u->other[i] = NULL;
    }
    ut_free(u->radian);
    ut_free(u->one);
    ut_free_system(u->sys);
    u->radian = u->one = NULL;
    u->sys = NULL;
}

/*
 * Loads the default udunits2 database and builds the reference units.
 * Every alias is parsed and checked against the dimension it claims, so a
 * database that lacks or redefines one fails here (PLUMB_EIO), not later.
 * On error everything made so far is freed.
 */
static plumb_status units_read(plumb_units *u, plumb_diag *diag)
{
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
    return PLUMB_OK;
fail:
    units_unload(u);
    return st;
}

/* The database of a handle, loaded at its first need: PLUMB_OK once
 * loaded; else the status of the failed load with its diagnostic, the
 * same at every call (a failed load is not tried again). */
static plumb_status units_load(const plumb_units *units, plumb_diag *diag)
{
    plumb_units *u = units->self;
    if (u->state == UNITS_NOT_LOADED) {
        plumb_diag_clear(&u->load_diag);
        u->state = units_read(u, &u->load_diag) == PLUMB_OK ? UNITS_LOADED : UNITS_FAILED;
    }
    if (u->state == UNITS_LOADED)
        return PLUMB_OK;
    if (diag)
        *diag = u->load_diag;
    return u->load_diag.status;
}

/* A handle whose database is not loaded yet; `fn` names the caller in
 * the message for a NULL out. */
static plumb_status units_new(plumb_units **out, const char *fn, plumb_diag *diag)
{
    if (!out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "%s: out is NULL", fn);
    *out = NULL;
    plumb_units *u = calloc(1, sizeof *u);
    if (!u)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory allocating the unit system");
    u->self = u;
    *out = u;
    return PLUMB_OK;
}

plumb_status plumb_units_alloc(plumb_units **out, plumb_diag *diag)
{
    plumb_status st = units_new(out, "plumb_units_alloc", diag);
    if (st == PLUMB_OK && (st = units_load(*out, diag)) != PLUMB_OK) {
        plumb_units_free(*out);
        *out = NULL;
    }
    return st;
}

plumb_status plumb_units_alloc_deferred(plumb_units **out, plumb_diag *diag)
{
    return units_new(out, "plumb_units_alloc_deferred", diag);
}

plumb_status plumb_units_load_error(const plumb_units *units, plumb_diag *diag)
{
    if (!units || units->state != UNITS_FAILED)
        return PLUMB_OK;
    return units_load(units, diag);
}

void plumb_units_free(plumb_units *units)
{
    if (!units)
        return;
    units_unload(units);
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
double plumbp_units_compass_bearing(const char *text)
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

/* A compass point for a word that is not one, into buf: the point of a
 * direction written out ("West", "north-east") or the nearest by
 * spelling ("SWW": WSW); NULL when none is near. */
static const char *compass_hint(const char *text, char *buf, size_t size)
{
    static const char *const words[] = {"NORTH", "EAST", "SOUTH", "WEST"};
    static const char *const points[] = {"N", "E", "S", "W"};
    char up[32];
    size_t n = 0;
    for (const char *p = text; *p && n + 1 < sizeof up; p++) {
        if (*p == '-' || *p == ' ' || *p == '_')
            continue;
        if (!isalpha((unsigned char)*p))
            return NULL;
        up[n++] = (char)toupper((unsigned char)*p);
    }
    up[n] = '\0';
    if (n == 0)
        return NULL;
    /* words written out: NORTHEAST is NE, SOUTHSOUTHWEST is SSW */
    char pt[8];
    size_t k = 0, at = 0;
    while (at < n && k + 1 < sizeof pt) {
        size_t w = 0;
        while (w < 4 && strncmp(up + at, words[w], strlen(words[w])) != 0)
            w++;
        if (w == 4)
            break;
        pt[k++] = points[w][0];
        at += strlen(words[w]);
    }
    pt[k] = '\0';
    if (at == n && k > 0 && plumbp_units_compass_bearing(pt) >= 0.0) {
        snprintf(buf, size, "%s", pt);
        return buf;
    }
    const char *near = plumb_suggest_closest(up, compass_points, 16);
    if (!near || strlen(up) > 4)
        return NULL;
    snprintf(buf, size, "%s", near);
    return buf;
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
    return plumbp_units_parse_in(units, text, want, NULL, si_out, diag);
}

int plumbp_units_fits(const plumb_units *units, const plumbp_accept *acc, plumb_dim want,
                      const char *text)
{
    if (!acc)
        return 1;
    plumb_diag d;
    plumb_diag_clear(&d);
    double v = 0.0;
    plumb_status st = plumbp_units_parse_in(units, text, want, NULL, &v, &d);
    if (st == PLUMB_ENOMEM)
        return -1;
    if (st != PLUMB_OK)
        return 0;
    return (acc->lo_open ? v > acc->lo : v >= acc->lo) &&
           (acc->hi_open ? v < acc->hi : v <= acc->hi);
}

plumb_status plumbp_units_parse_in(const plumb_units *units, const char *text, plumb_dim want,
                                   const plumbp_accept *acc, double *si_out, plumb_diag *diag)
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
    char eg[UNITS_SHOW_MAX + 160];
    if (len == 0)
        return PLUMB_RAISE(diag, PLUMB_EPARSE, "expected %s %s (%s); found an empty value",
                           dims[want].article, dims[want].name,
                           plumbp_units_example(units, acc, want, eg, sizeof eg));

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
    double bearing = want == PLUMB_DIM_ANGLE ? plumbp_units_compass_bearing(shown) : -1.0;
    if (end == shown && bearing >= 0.0)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected an angle (%s); found \"%s\": a compass point "
                           "names a direction (wind.from, release.velocity.heading take one); "
                           "here give a number of degrees (as a direction, %s is \"%g deg\")",
                           plumbp_units_example(units, acc, want, eg, sizeof eg), shown, shown,
                           bearing);
    char hint[8];
    if (end == shown && want == PLUMB_DIM_ANGLE && compass_hint(shown, hint, sizeof hint))
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected an angle (%s); found \"%.*s\", which does not "
                           "start with a number; a direction (wind.from, "
                           "release.velocity.heading) may be one of the 16 compass points: did "
                           "you mean %s?",
                           plumbp_units_example(units, acc, want, eg, sizeof eg), UNITS_SHOW_MAX,
                           shown, hint);
    if (end == shown)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected %s %s (%s); found \"%.*s\", which does not start "
                           "with a number%s",
                           dims[want].article, dims[want].name,
                           plumbp_units_example(units, acc, want, eg, sizeof eg), UNITS_SHOW_MAX,
                           shown,
                           want == PLUMB_DIM_ANGLE
                               ? "; a direction (wind.from, release.velocity.heading) may also "
                                 "be one of the 16 compass points, N, NNE, NE ... NNW"
                               : "");
    if (err == ERANGE)
        return PLUMB_RAISE(diag, PLUMB_ERANGE, "the number in \"%.*s\" is too %s for a double",
                           UNITS_SHOW_MAX, shown, fabs(value) > 1.0 ? "large" : "small");
    if (!plumbp_finite(value))
        return PLUMB_RAISE(diag, PLUMB_EPARSE, "expected %s %s, found \"%.*s\": not a finite number",
                           dims[want].article, dims[want].name, UNITS_SHOW_MAX, shown);

    if (end[0] == ',' && isdigit((unsigned char)end[1]))
        return plumbp_units_raise_comma(units, acc, diag, want, shown, end);

    char number[UNITS_TEXT_MAX + 1];
    char unit[UNITS_TEXT_MAX + 1];
    copy_trimmed(number, sizeof number, shown, end);
    copy_trimmed(unit, sizeof unit, end, shown + len);
    int unit_one = strcmp(unit, "1") == 0 || strncmp(unit, "1/", 2) == 0;
    if (!unit_one && (isdigit((unsigned char)unit[0]) || unit[0] == '.' || unit[0] == '+' ||
                      unit[0] == '-'))
        return PLUMB_RAISE(diag, PLUMB_EPARSE, "expected one number then a unit, found \"%.*s\"",
                           UNITS_SHOW_MAX, shown);
    return convert(units, value, unit, want, acc, shown, number, si_out, diag);
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
    return convert(units, value, trimmed, want, NULL, shown, number, si_out, diag);
}

plumb_status plumb_units_to_si_n(const plumb_units *units, const double *values, size_t n,
                                 const char *unit, plumb_dim want, double *si_out,
                                 plumb_diag *diag)
{
    if (!values || !si_out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_units_to_si_n: %s is NULL",
                           !values ? "values" : "si_out");
    size_t i = 0;
    while (i < n) {
        /* the first value of what is left alone, with every check and the
         * message of its own text; then the rest by the same converter */
        plumb_status st = plumb_units_to_si(units, values[i], unit, want, &si_out[i], diag);
        if (st != PLUMB_OK)
            return st;
        i++;
        size_t k;
        for (k = 0; k < n - i && plumbp_finite(values[i + k]); k++)
            ;
        if (k == 0)
            continue; /* values[i] is not finite: its own message */
        char trimmed[UNITS_TEXT_MAX + 1];
        copy_trimmed(trimmed, sizeof trimmed, unit, unit + strlen(unit));
        char number[32];
        char shown[sizeof number + UNITS_TEXT_MAX + 2];
        snprintf(number, sizeof number, "%.10g", values[i]);
        snprintf(shown, sizeof shown, "%s%s%s", number, trimmed[0] ? " " : "", trimmed);
        size_t done = 0;
        st = convert_n(units, &values[i], k, trimmed, want, NULL, shown, number, &si_out[i],
                       diag, &done);
        if (st != PLUMB_OK)
            return st;
        i += done;
    }
    return PLUMB_OK;
}
