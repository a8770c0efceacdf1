/*
 * units_advice.c - the messages of the units module for a quantity that
 * cannot be read: a unit that is unknown or measures something else
 * (named in words, with the unit probably meant: a known slip, the same
 * letters in another case, or a near spelling by edit distance), a compass
 * letter after an angle, and a number written with a comma. Unit symbols
 * and prefixes as in the BIPM SI Brochure (9th ed., 2019). units.c reads
 * and converts; units_int.h is what the two share.
 */
#include <ctype.h>
#include <stdio.h>
#include <string.h>

#include "io/units_int.h"

/* Dimensions tried, in this order, to name what a wrong unit measures.
 * TEMP_DIFF and FRACTION are left out: they share TEMPERATURE's and
 * NONE's dimension; angles and numbers are told apart by the radian. */
static const plumb_dim describe_order[] = {
    PLUMB_DIM_LENGTH, PLUMB_DIM_MASS,     PLUMB_DIM_TIME,        PLUMB_DIM_SPEED,
    PLUMB_DIM_AREA,   PLUMB_DIM_VOLUME,   PLUMB_DIM_ENERGY,      PLUMB_DIM_FORCE,
    PLUMB_DIM_PRESSURE, PLUMB_DIM_DENSITY, PLUMB_DIM_TEMPERATURE, PLUMB_DIM_LAPSE,
};

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
    [PLUMB_DIM_LAPSE] = "K/m, K/km, degC/km, degF/1000 ft",
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
    /* the barn is 1e-28 m^2 (BIPM SI Brochure, 9th ed., table 8) */
    {"mb", PLUMB_DIM_PRESSURE, "mbar", "mb is the millibarn, an area"},
    {"C", PLUMB_DIM_TEMPERATURE, "degC", "C is the coulomb"},
    {"C", PLUMB_DIM_TEMP_DIFF, "degC", "C is the coulomb"},
    {"F", PLUMB_DIM_TEMPERATURE, "degF", "F is the farad"},
    {"F", PLUMB_DIM_TEMP_DIFF, "degF", "F is the farad"},
    {"hrs", PLUMB_DIM_TIME, "h", NULL},
    {"mins", PLUMB_DIM_TIME, "min", NULL},
    {"kmh", PLUMB_DIM_SPEED, "km/h", NULL},
    {"kmph", PLUMB_DIM_SPEED, "km/h", NULL},
    {"mps", PLUMB_DIM_SPEED, "m/s", NULL},
    /* the prime and double prime, feet and inches in a drawing, read as
     * the arcminute and arcsecond (BIPM SI Brochure, 9th ed., table 8) */
    {"'", PLUMB_DIM_LENGTH, "ft", "' is the arcminute"},
    {"\"", PLUMB_DIM_LENGTH, "in", "\" is the arcsecond"},
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

/* ---- diagnostics ----------------------------------------------------------- */

/* Describes what `unit` measures, in words: "a length", "an angle", "an
 * electric charge". Returns 0, or -1 (buf untouched) when it is none of the
 * quantities named in units_int.h, -2 when udunits2 ran out of memory. */
static int describe_unit(const plumb_units *units, const ut_unit *unit, const unit_shape *shape,
                         char *buf, size_t size)
{
    if (ut_are_convertible(unit, units->one)) {
        snprintf(buf, size, "%s", shape->rad_power == 1 ? "an angle" : "a dimensionless number");
        return 0;
    }
    for (size_t i = 0; i < sizeof describe_order / sizeof describe_order[0]; i++) {
        plumb_dim d = describe_order[i];
        int same = same_dimension(units, unit, units->ref[d]);
        if (same < 0)
            return -2;
        if (same > 0) {
            snprintf(buf, size, "%s %s", dims[d].article, dims[d].name);
            return 0;
        }
    }
    for (size_t i = 0; i < N_OTHER; i++) {
        int same = units->other[i] ? same_dimension(units, unit, units->other[i]) : 0;
        if (same < 0)
            return -2;
        if (same > 0) {
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
void plumbp_units_describe_want(plumb_dim want, char *buf, size_t size)
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

/* The units of dimension want's list (dim_units: the SI unit first), into
 * cand[] (at most UNITS_CANDIDATES); their text lives in store. Returns
 * how many. */
static size_t listed_units(plumb_dim want, const char **cand, char *store, size_t size)
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
    return n;
}

/* The units of dimension want that a did-you-mean may offer, into cand[]:
 * its list, then the words that name units of it; their text lives in
 * store. Returns how many. */
static size_t candidates(plumb_dim want, const char **cand, char *store, size_t size)
{
    size_t n = listed_units(want, cand, store, size);
    plumb_dim alias_dim = want == PLUMB_DIM_TEMP_DIFF ? PLUMB_DIM_TEMPERATURE : want;
    for (size_t i = 0; i < N_ALIASES && n < UNITS_CANDIDATES; i++)
        if (aliases[i].dim == alias_dim)
            cand[n++] = aliases[i].word;
    return n;
}

/* Dimensions whose units an unknown unit may be another case of. */
static const plumb_dim case_order[] = {
    PLUMB_DIM_LENGTH, PLUMB_DIM_MASS,     PLUMB_DIM_TIME,        PLUMB_DIM_SPEED,
    PLUMB_DIM_AREA,   PLUMB_DIM_VOLUME,   PLUMB_DIM_ENERGY,      PLUMB_DIM_FORCE,
    PLUMB_DIM_ANGLE,  PLUMB_DIM_PRESSURE, PLUMB_DIM_DENSITY,     PLUMB_DIM_TEMPERATURE,
    PLUMB_DIM_LAPSE,
};

/* An unknown unit that is a unit of another dimension in another case
 * ("KG" for an area: kg is a mass) gets a note saying so, since offering
 * "kg" for an area would be wrong and saying nothing leaves the reader
 * wondering why KG is unknown. Returns 1 when the note was written. */
static int case_of_other_dimension(plumb_dim want, const char *unit, unit_advice *adv)
{
    const char *cand[UNITS_CANDIDATES];
    char store[UNITS_SHOW_MAX * 2], lower[UNITS_SHOW_MAX], lc[UNITS_SHOW_MAX];
    fold(unit, lower, sizeof lower);
    for (size_t j = 0; j < sizeof case_order / sizeof case_order[0]; j++) {
        plumb_dim d = case_order[j];
        if (d == want || (want == PLUMB_DIM_TEMP_DIFF && d == PLUMB_DIM_TEMPERATURE))
            continue;
        size_t n = candidates(d, cand, store, sizeof store);
        for (size_t i = 0; i < n; i++) {
            fold(cand[i], lc, sizeof lc);
            if (strcmp(lower, lc) != 0 || strcmp(unit, cand[i]) == 0)
                continue;
            const char *is = unit[1] == '\0' ? letter_is(unit[0]) : NULL;
            snprintf(adv->note, sizeof adv->note,
                     "unit symbols are case-sensitive: %.16s is %s%s; %.16s is %s %s", unit,
                     is ? is : "not a unit", is ? ", not a unit of its own" : "", cand[i],
                     dims[d].article, dims[d].name);
            return 1;
        }
    }
    return 0;
}

/* Looks for the unit of dimension `want` that `unit` was meant to be: a
 * known slip (unit_hints), the same letters in another case ("KG" -> "kg",
 * with a note that symbols are case-sensitive), or a near spelling. Only
 * units of the wanted dimension are offered, and a one- or two-letter unit
 * only for a change of case: "M" is one edit from "g", which says nothing.
 * An `unknown` unit that is another dimension's unit in another case gets
 * a note naming that dimension instead ("KG" for an area). */
static void advise(plumb_dim want, const char *unit, int unknown, unit_advice *adv)
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
    if (unknown && case_of_other_dimension(want, unit, adv))
        return;
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
 * the units of the wanted dimension. A value the key would refuse is not
 * offered: the unit is named, and the range. -1 when udunits2 ran out of
 * memory, else 0. */
static int advice_tail(const plumb_units *units, const plumbp_accept *acc, plumb_dim want,
                       const char *number, const unit_advice *adv, char *buf, size_t size)
{
    int fits = 1;
    if (adv->use[0]) {
        char q[UNITS_SHOW_MAX * 2 + 2];
        snprintf(q, sizeof q, "%.*s %s", UNITS_SHOW_MAX, number, adv->use);
        if ((fits = plumbp_units_fits(units, acc, want, q)) < 0)
            return -1;
    }
    if (adv->use[0] && fits)
        snprintf(buf, size, "; did you mean \"%.*s %s\"?%s%s%s", UNITS_SHOW_MAX, number,
                 adv->use, adv->note[0] ? " (" : "", adv->note, adv->note[0] ? ")" : "");
    else if (adv->use[0])
        snprintf(buf, size, "; the unit meant is probably %s%s%s%s, but \"%.*s %s\" is out of "
                 "range too: must be %s", adv->use, adv->note[0] ? " (" : "", adv->note,
                 adv->note[0] ? ")" : "", UNITS_SHOW_MAX, number, adv->use, acc->range);
    else if (dim_units[want][0])
        snprintf(buf, size, "%s%s%s; units of %s %s: %s", adv->note[0] ? " (" : "", adv->note,
                 adv->note[0] ? ")" : "", dims[want].article, dims[want].name, dim_units[want]);
    else
        buf[0] = '\0';
    return 0;
}

/* Raises the "unknown unit" error, with the unit of the wanted dimension
 * that was probably meant, or the list of them. */
plumb_status plumbp_units_raise_unknown(const plumb_units *units, const plumbp_accept *acc,
                                        plumb_diag *diag, plumb_dim want, const char *unit,
                                        const char *shown, const char *number)
{
    char w[UNITS_SHOW_MAX + 64], tail[UNITS_SHOW_MAX * 5 + 256];
    plumbp_units_describe_want(want, w, sizeof w);
    unit_advice adv;
    advise(want, unit, 1, &adv);
    if (advice_tail(units, acc, want, number, &adv, tail, sizeof tail) < 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory reading the unit of \"%.*s\"",
                           UNITS_SHOW_MAX, shown);
    return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s; unknown unit \"%.*s\" in \"%.*s\"%s", w,
                       UNITS_SHOW_MAX, unit, UNITS_SHOW_MAX, shown, tail);
}

/* Raises the error of a unit of another dimension: what it measures, in
 * words, and what was probably meant. */
plumb_status plumbp_units_raise_wrong(const plumb_units *units, const plumbp_accept *acc,
                                      plumb_diag *diag, plumb_dim want, const ut_unit *unit,
                                      const unit_shape *shape, const char *text,
                                      const char *shown, const char *number)
{
    char w[UNITS_SHOW_MAX + 64], found[128], tail[UNITS_SHOW_MAX * 5 + 256];
    plumbp_units_describe_want(want, w, sizeof w);
    unit_advice adv;
    advise(want, text, 0, &adv);
    int described = describe_unit(units, unit, shape, found, sizeof found);
    if (described == -1)
        snprintf(found, sizeof found, "a unit that is not %s %s", dims[want].article,
                 dims[want].name);
    if (described == -2 || advice_tail(units, acc, want, number, &adv, tail, sizeof tail) < 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory reading the unit of \"%.*s\"",
                           UNITS_SHOW_MAX, shown);
    return PLUMB_RAISE(diag, PLUMB_EUNIT, "expected %s, found \"%.*s\" (%s%s%s)%s", w,
                       UNITS_SHOW_MAX, shown, found, adv.why ? ": " : "", adv.why ? adv.why : "",
                       tail);
}

/* Compass letters after an angle ("54.2 N", "3.1 deg W"): 1 for N or E,
 * -1 for S or W, 0 for anything else. */
int plumbp_units_compass_letter(const char *unit)
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
plumb_status plumbp_units_raise_compass(const plumb_units *units, const plumbp_accept *acc,
                                        plumb_diag *diag, int sign, const char *shown,
                                        const char *number)
{
    const char *digits = number[0] == '+' || number[0] == '-' ? number + 1 : number;
    int negative = (number[0] == '-') != (sign < 0);
    char q[UNITS_SHOW_MAX + 8], out[UNITS_SHOW_MAX + 200] = "";
    snprintf(q, sizeof q, "%s%.*s deg", negative ? "-" : "", UNITS_SHOW_MAX, digits);
    int fits = plumbp_units_fits(units, acc, PLUMB_DIM_ANGLE, q);
    if (fits < 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory reading \"%.*s\"", UNITS_SHOW_MAX,
                           shown);
    if (!fits)
        snprintf(out, sizeof out, " (out of range here too: must be %s)", acc->range);
    return PLUMB_RAISE(diag, PLUMB_EUNIT,
                       "expected an angle (deg), found \"%.*s\": compass letters are not units; "
                       "a latitude or longitude is a signed number of degrees, north and east "
                       "positive: write \"%s\"%s; a direction is degrees clockwise from "
                       "north (\"%.*s deg\") or a compass point alone (\"NE\")",
                       UNITS_SHOW_MAX, shown, q, out, UNITS_SHOW_MAX, digits);
}

/* Raises the error of a number written with a comma ("6,5 m", "1,500 m"):
 * plumb reads a decimal point and no thousands separator. `end` is where
 * strtod stopped in `shown`, at the comma. */
/* " (out of range here too: must be RANGE)" after a suggested quantity
 * that acc refuses, else "". Returns 0, or -1 when udunits2 ran out of
 * memory (the message would lack its note: the caller fails instead). */
static int refused_note(const plumb_units *units, const plumbp_accept *acc, plumb_dim want,
                        const char *text, char *buf, size_t size)
{
    buf[0] = '\0';
    int fits = plumbp_units_fits(units, acc, want, text);
    if (fits == 0)
        snprintf(buf, size, " (out of range here too: must be %s)", acc->range);
    return fits < 0 ? -1 : 0;
}

plumb_status plumbp_units_raise_comma(const plumb_units *units, const plumbp_accept *acc,
                                      plumb_diag *diag, plumb_dim want, const char *shown,
                                      const char *end)
{
    char n1[200], n2[200];
    char w[UNITS_SHOW_MAX + 64];
    plumbp_units_describe_want(want, w, sizeof w);
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
    if (refused_note(units, acc, want, as_point, n1, sizeof n1) < 0 ||
        refused_note(units, acc, want, as_plain, n2, sizeof n2) < 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory reading \"%.*s\"", UNITS_SHOW_MAX,
                           shown);
    if (commas == 1 && !point && !threes)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected %s, found \"%.*s\": use a decimal point: \"%.*s\"%s", w,
                           UNITS_SHOW_MAX, shown, UNITS_SHOW_MAX, as_point, n1);
    if (commas == 1 && !point)
        return PLUMB_RAISE(diag, PLUMB_EPARSE,
                           "expected %s, found \"%.*s\": numbers take a decimal point and no "
                           "thousands separator: write \"%.*s\"%s or \"%.*s\"%s, whichever is "
                           "meant",
                           w, UNITS_SHOW_MAX, shown, UNITS_SHOW_MAX, as_point, n1, UNITS_SHOW_MAX,
                           as_plain, n2);
    return PLUMB_RAISE(diag, PLUMB_EPARSE,
                       "expected %s, found \"%.*s\": numbers take a decimal point and no "
                       "thousands separator%s%.*s%s%s",
                       w, UNITS_SHOW_MAX, shown, threes && commas > 0 ? ": write \"" : "",
                       threes && commas > 0 ? UNITS_SHOW_MAX : 0, as_plain,
                       threes && commas > 0 ? "\"" : "",
                       threes && commas > 0 ? n2 : "");
}

const char *plumbp_units_example(const plumb_units *units, const plumbp_accept *acc,
                                 plumb_dim want, char *buf, size_t size)
{
    if (plumbp_units_fits(units, acc, want, dims[want].example) != 0)
        snprintf(buf, size, "e.g. \"%s\"", dims[want].example);
    else
        snprintf(buf, size, "must be %s", acc->range);
    return buf;
}

plumb_status plumbp_units_raise_bare(const plumb_units *units, const plumbp_accept *acc,
                                     plumb_diag *diag, plumb_dim want, const char *number)
{
    /* the SI unit first, then the others of the dimension's list */
    const char *cand[UNITS_CANDIDATES];
    char store[UNITS_SHOW_MAX * 2];
    size_t n = listed_units(want, cand, store, sizeof store);
    char eg[2][UNITS_SHOW_MAX * 2 + 2];
    size_t n_eg = 0;
    snprintf(eg[0], sizeof eg[0], "%.*s %s", UNITS_SHOW_MAX, number, dims[want].si);
    int fits = plumbp_units_fits(units, acc, want, eg[0]);
    if (fits > 0)
        n_eg = 1;
    for (size_t i = 0; fits == 0 && i < n && n_eg < 2; i++) {
        if (strcmp(cand[i], dims[want].si) == 0)
            continue;
        snprintf(eg[n_eg], sizeof eg[n_eg], "%.*s %s", UNITS_SHOW_MAX, number, cand[i]);
        int f = plumbp_units_fits(units, acc, want, eg[n_eg]);
        if (f < 0)
            fits = -1;
        else if (f > 0)
            n_eg++;
    }
    /* a deferred database that failed to load (plumbp_units_fits reads it
     * as "does not fit"): its own error, not advice on the bare number */
    plumb_status loaded = plumb_units_load_error(units, diag);
    if (loaded != PLUMB_OK)
        return loaded;
    if (fits < 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory reading \"%.*s\"", UNITS_SHOW_MAX,
                           number);
    if (n_eg == 0)
        return PLUMB_RAISE(diag, PLUMB_EUNIT,
                           "expected %s %s with its unit (SI: %s); found a bare number \"%.*s\", "
                           "which no unit of %s %s brings into range: must be %s",
                           dims[want].article, dims[want].name, dims[want].si, UNITS_SHOW_MAX,
                           number, dims[want].article, dims[want].name, acc->range);
    return PLUMB_RAISE(diag, PLUMB_EUNIT,
                       "expected %s %s with its unit (e.g. \"%s\"%s%s%s); found a bare number "
                       "\"%.*s\"",
                       dims[want].article, dims[want].name, eg[0], n_eg > 1 ? " or \"" : "",
                       n_eg > 1 ? eg[1] : "", n_eg > 1 ? "\"" : "", UNITS_SHOW_MAX, number);
}
