/*
 * test_units.c - the units module: quantities with units parsed with
 * udunits2 and the alias table, checked against the exact definitions of
 * the units and against NIST SP 811 (2008), Guide for the Use of the
 * International System of Units, Appendix B.8 (factors to seven digits)
 * and B.9 (temperature).
 *
 * Exact definitions used below (not taken from the code under test):
 *   foot 0.3048 m, inch 0.0254 m, yard 0.9144 m, mile 5280 ft, pound
 *   0.45359237 kg: international yard and pound agreement, 1959;
 *   g0 = 9.80665 m/s^2: 3rd CGPM, 1901; nautical mile 1852 m: NIST SP 811
 *   B.8 (exact); ounce (avoirdupois) = pound/16 (16 oz = 1 lb, the
 *   avoirdupois system; NIST SP 811 B.8 gives 2.834 952 E-02 kg);
 *   hour 3600 s; degree = pi/180 rad (SI Brochure, Table 8).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <cmocka.h>
#include <udunits2.h>

#include "plumb/profile.h"
#include "plumb/units.h"
#include "plumb_test.h"

/* Exact definitions (see the file comment). */
#define FT_M 0.3048
#define IN_M 0.0254
#define YD_M 0.9144
#define MI_M (5280.0 * FT_M)
#define NMI_M 1852.0
#define LB_KG 0.45359237
#define OZ_KG (LB_KG / 16.0)
#define G0_M_S2 9.80665
#define LBF_N (LB_KG * G0_M_S2)
#define HOUR_S 3600.0
#define PI 3.14159265358979323846

/* A result exact by definition must come back to within rounding. */
#define EXACT 1e-12
/* NIST SP 811 B.8 tabulates seven significant digits: half a unit in the
 * seventh digit is at most 5e-7 of the value. The seven-digit figures
 * below are quoted from memory (the table was not at hand), except the
 * inch of mercury, 3.386 389 E+03 Pa, which was confirmed; each is also
 * checked against the exact definition. */
#define NIST7 5e-7

/* A value the parser must never leave behind on error. */
#define SENTINEL -7777.125

/* ---- helpers -------------------------------------------------------------- */

static double parse_ok(void **state, const char *text, plumb_dim dim)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    double v = SENTINEL;
    plumb_status st = plumb_units_parse(*state, text, dim, &v, &d);
    if (st != PLUMB_OK) {
        print_error("plumb_units_parse(\"%s\", %s) failed: %s\n", text, plumb_dim_name(dim),
                    d.message);
        fail();
    }
    assert_int_equal(d.status, PLUMB_OK);
    return v;
}

/* Checks that the diagnostic carries status and a message containing
 * `part`, and that file/line/col/key were left for the caller. */
static void check_diag(const plumb_diag *d, plumb_status status, const char *part)
{
    assert_int_equal(d->status, status);
    if (part && !strstr(d->message, part)) {
        print_error("message \"%s\" lacks \"%s\"\n", d->message, part);
        fail();
    }
    assert_string_equal(d->file, "");
    assert_string_equal(d->key, "");
    assert_int_equal(d->line, 0);
    assert_int_equal(d->col, 0);
}

static void parse_fails(void **state, const char *text, plumb_dim dim, plumb_status status,
                        const char *part)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    double v = SENTINEL;
    plumb_status st = plumb_units_parse(*state, text, dim, &v, &d);
    if (st != status) {
        print_error("plumb_units_parse(\"%s\", %s) gave %s (%s), expected %s\n", text,
                    plumb_dim_name(dim), plumb_strerror(st), d.message, plumb_strerror(status));
        fail();
    }
    assert_true(v == SENTINEL);
    check_diag(&d, status, part);
}

static double to_si_ok(void **state, double value, const char *unit, plumb_dim dim)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    double v = SENTINEL;
    plumb_status st = plumb_units_to_si(*state, value, unit, dim, &v, &d);
    if (st != PLUMB_OK) {
        print_error("plumb_units_to_si(%g, \"%s\") failed: %s\n", value, unit, d.message);
        fail();
    }
    return v;
}

static void to_si_fails(void **state, double value, const char *unit, plumb_dim dim,
                        plumb_status status, const char *part)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    double v = SENTINEL;
    plumb_status st = plumb_units_to_si(state ? *state : NULL, value, unit, dim, &v, &d);
    if (st != status) {
        print_error("plumb_units_to_si(%g, \"%s\") gave %s (%s), expected %s\n", value,
                    unit ? unit : "(null)", plumb_strerror(st), d.message,
                    plumb_strerror(status));
        fail();
    }
    assert_true(v == SENTINEL);
    check_diag(&d, status, part);
}

/* ---- speeds ---------------------------------------------------------------- */

static void test_mph_is_the_mile_per_hour_not_the_milliphot(void **state)
{
    /* NIST SP 811 B.8: mile per hour = 4.4704 E-01 m/s (exact). udunits2
     * alone reads "mph" as the milliphot, a unit of illuminance. */
    assert_rel(parse_ok(state, "1 mph", PLUMB_DIM_SPEED), 0.44704, EXACT);
    assert_rel(parse_ok(state, "23.7 mph", PLUMB_DIM_SPEED), 23.7 * MI_M / HOUR_S, EXACT);
    parse_fails(state, "23.7 mph", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "(a speed)");
}

static void test_every_knot_spelling_is_the_nautical_mile_per_hour(void **state)
{
    /* knot = 1852/3600 m/s exactly; NIST SP 811 B.8: 5.144 444 E-01 m/s. */
    const char *texts[] = {"15.3 kn", "15.3 kt", "15.3 kts", "15.3 knot", "15.3 knots",
                           "15.3kn"};
    for (size_t i = 0; i < sizeof texts / sizeof texts[0]; i++) {
        double v = parse_ok(state, texts[i], PLUMB_DIM_SPEED);
        assert_rel(v, 15.3 * NMI_M / HOUR_S, EXACT);
        assert_rel(v / 15.3, 5.144444e-01, NIST7);
    }
}

static void test_kt_is_the_knot_and_not_the_kilotonne(void **state)
{
    parse_fails(state, "3.7 kt", PLUMB_DIM_MASS, PLUMB_EUNIT, "(a speed)");
}

static void test_kilometres_per_hour_spellings_agree(void **state)
{
    /* km/h = 1000/3600 m/s; NIST SP 811 B.8: 2.777 778 E-01 m/s. */
    assert_rel(parse_ok(state, "36.6 km/h", PLUMB_DIM_SPEED), 36.6 * 1000.0 / HOUR_S, EXACT);
    assert_rel(parse_ok(state, "36.6 kph", PLUMB_DIM_SPEED), 36.6 * 1000.0 / HOUR_S, EXACT);
    assert_rel(parse_ok(state, "1 kph", PLUMB_DIM_SPEED), 2.777778e-01, NIST7);
}

static void test_feet_per_second_spellings_agree(void **state)
{
    /* foot per second = 0.3048 m/s exactly (NIST SP 811 B.8). */
    assert_rel(parse_ok(state, "47.3 fps", PLUMB_DIM_SPEED), 47.3 * FT_M, EXACT);
    assert_rel(parse_ok(state, "47.3 ft/s", PLUMB_DIM_SPEED), 47.3 * FT_M, EXACT);
    assert_rel(parse_ok(state, "8.25 m/s", PLUMB_DIM_SPEED), 8.25, EXACT);
}

/* ---- lengths and masses ---------------------------------------------------- */

static void test_lengths_match_the_1959_definitions(void **state)
{
    assert_rel(parse_ok(state, "30.7 ft", PLUMB_DIM_LENGTH), 30.7 * FT_M, EXACT);
    assert_rel(parse_ok(state, "30.7 feet", PLUMB_DIM_LENGTH), 30.7 * FT_M, EXACT);
    assert_rel(parse_ok(state, "1 foot", PLUMB_DIM_LENGTH), FT_M, EXACT);
    assert_rel(parse_ok(state, "13.5 in", PLUMB_DIM_LENGTH), 13.5 * IN_M, EXACT);
    assert_rel(parse_ok(state, "13.5 inch", PLUMB_DIM_LENGTH), 13.5 * IN_M, EXACT);
    assert_rel(parse_ok(state, "13.5 inches", PLUMB_DIM_LENGTH), 13.5 * IN_M, EXACT);
    assert_rel(parse_ok(state, "42.2 yd", PLUMB_DIM_LENGTH), 42.2 * YD_M, EXACT);
    assert_rel(parse_ok(state, "2.35 mi", PLUMB_DIM_LENGTH), 2.35 * MI_M, EXACT);
    assert_rel(parse_ok(state, "1 mi", PLUMB_DIM_LENGTH), 1609.344, EXACT);
    assert_rel(parse_ok(state, "0.83 nmi", PLUMB_DIM_LENGTH), 0.83 * NMI_M, EXACT);
    assert_rel(parse_ok(state, "352.5 m", PLUMB_DIM_LENGTH), 352.5, EXACT);
    assert_rel(parse_ok(state, "3.18 km", PLUMB_DIM_LENGTH), 3180.0, EXACT);
}

/* units.h, plumb_units_to_si_n: each value as plumb_units_to_si gives it,
 * the same double, the unit read once. Feet: 0.3048 m exactly (NIST SP
 * 811 B.8); degC: K = degC + 273.15 (NIST SP 811 4.2.1.1). Of values one
 * of which is below absolute zero, the error is that value's own, and the
 * values before it are converted. */
static void test_values_converted_together_are_those_converted_one_by_one(void **state)
{
    const double ft[5] = {30.7, -2.35, 0.0, 1e5, 17.125};
    double si[5], one;
    plumb_diag d;
    assert_int_equal(plumb_units_to_si_n(*state, ft, 5, " ft ", PLUMB_DIM_LENGTH, si, &d),
                     PLUMB_OK);
    for (int i = 0; i < 5; i++) {
        assert_rel(si[i], ft[i] * FT_M, EXACT);
        assert_int_equal(plumb_units_to_si(*state, ft[i], " ft ", PLUMB_DIM_LENGTH, &one, &d),
                         PLUMB_OK);
        assert_memory_equal(&si[i], &one, sizeof one);
    }
    double c[4] = {21.5, -40.0, -300.0, 8.0};
    double k[4] = {SENTINEL, SENTINEL, SENTINEL, SENTINEL};
    plumb_diag alone;
    assert_int_equal(plumb_units_to_si(*state, -300.0, "degC", PLUMB_DIM_TEMPERATURE, &one,
                                       &alone), PLUMB_ERANGE);
    assert_int_equal(plumb_units_to_si_n(*state, c, 4, "degC", PLUMB_DIM_TEMPERATURE, k, &d),
                     PLUMB_ERANGE);
    assert_string_equal(d.message, alone.message);
    assert_rel(k[0], 294.65, EXACT);
    assert_rel(k[1], 233.15, EXACT);
    assert_true(k[2] == SENTINEL && k[3] == SENTINEL);
    /* in place, as plumb_range_values_si converts */
    assert_int_equal(plumb_units_to_si_n(*state, c, 2, "degC", PLUMB_DIM_TEMPERATURE, c, &d),
                     PLUMB_OK);
    assert_memory_equal(c, k, 2 * sizeof *c);
    /* nothing to read or nowhere to write (units.h: errors as plumb_units_to_si's) */
    assert_int_equal(plumb_units_to_si_n(*state, NULL, 1, "m", PLUMB_DIM_LENGTH, k, &d),
                     PLUMB_EINVAL);
    assert_int_equal(plumb_units_to_si_n(*state, c, 1, "m", PLUMB_DIM_LENGTH, NULL, &d),
                     PLUMB_EINVAL);
}

static void test_aliases_replace_whole_words_only(void **state)
{
    /* "min" holds "mi" and "in", "kft" holds "ft", "inHg" holds "in": each
     * must keep its own meaning (minute, kilofoot, inch of mercury). */
    assert_rel(parse_ok(state, "1.5 min", PLUMB_DIM_TIME), 90.0, EXACT);
    assert_rel(parse_ok(state, "2.7 kft", PLUMB_DIM_LENGTH), 2700.0 * FT_M, EXACT);
    parse_fails(state, "29.92 inHg", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "(a pressure)");
}

static void test_pounds_are_avoirdupois_pounds(void **state)
{
    /* pound (avoirdupois) = 0.45359237 kg exactly (1959). */
    assert_rel(parse_ok(state, "5.29 lb", PLUMB_DIM_MASS), 5.29 * LB_KG, EXACT);
    assert_rel(parse_ok(state, "5.29 lbs", PLUMB_DIM_MASS), 5.29 * LB_KG, EXACT);
    assert_rel(parse_ok(state, "5.29 lbm", PLUMB_DIM_MASS), 5.29 * LB_KG, EXACT);
    assert_rel(parse_ok(state, "2.385 kg", PLUMB_DIM_MASS), 2.385, EXACT);
    assert_rel(parse_ok(state, "385 g", PLUMB_DIM_MASS), 0.385, EXACT);
}

static void test_oz_is_the_avoirdupois_ounce_and_not_the_fluid_ounce(void **state)
{
    /* ounce = pound/16 = 0.028349523125 kg; NIST SP 811 B.8: 2.834 952 E-02
     * kg. udunits2 alone reads "oz" as the US fluid ounce (a volume) and
     * rounds its avoirdupois_ounce to 2.834952e-2 kg. */
    assert_rel(parse_ok(state, "1 oz", PLUMB_DIM_MASS), 0.028349523125, EXACT);
    assert_rel(parse_ok(state, "7.6 oz", PLUMB_DIM_MASS), 7.6 * OZ_KG, EXACT);
    assert_rel(parse_ok(state, "1 oz", PLUMB_DIM_MASS), 2.834952e-02, NIST7);
    parse_fails(state, "7.6 oz", PLUMB_DIM_VOLUME, PLUMB_EUNIT, "(a mass)");
}

/* ---- force and energy ------------------------------------------------------ */

static void test_lbf_is_the_pound_force_of_standard_gravity(void **state)
{
    /* lbf = 0.45359237 kg x 9.80665 m/s^2 = 4.4482216152605 N exactly;
     * NIST SP 811 B.8: 4.448 222 E+00 N. */
    assert_rel(parse_ok(state, "1 lbf", PLUMB_DIM_FORCE), 4.4482216152605, EXACT);
    assert_rel(parse_ok(state, "12.6 lbf", PLUMB_DIM_FORCE), 12.6 * LBF_N, EXACT);
    assert_rel(parse_ok(state, "1 lbf", PLUMB_DIM_FORCE), 4.448222, NIST7);
    assert_rel(parse_ok(state, "41.5 N", PLUMB_DIM_FORCE), 41.5, EXACT);
}

static void test_every_foot_pound_force_spelling_is_the_same_energy(void **state)
{
    /* ft lbf = 0.3048 m x lbf = 1.3558179483314004 J; NIST SP 811 B.8:
     * 1.355 818 E+00 J. */
    const char *texts[] = {"11.3 ft lbf", "11.3 ft·lbf", "11.3 ft-lbf", "11.3 ftlbf",
                           "11.3 ft*lbf", "11.3 ft.lbf", "11.3 lbf ft", "11.3ft lbf",
                           "11.3 ft⋅lbf"};
    for (size_t i = 0; i < sizeof texts / sizeof texts[0]; i++)
        assert_rel(parse_ok(state, texts[i], PLUMB_DIM_ENERGY), 11.3 * FT_M * LBF_N, EXACT);
    assert_rel(parse_ok(state, "1 ft lbf", PLUMB_DIM_ENERGY), 1.3558179483314004, EXACT);
    assert_rel(parse_ok(state, "1 ft lbf", PLUMB_DIM_ENERGY), 1.355818, NIST7);
}

static void test_inch_pound_force_spellings_are_the_same_energy(void **state)
{
    /* in lbf = 0.0254 m x lbf; NIST SP 811 B.8: 1.129 848 E-01 N m. */
    const char *texts[] = {"93.5 in lbf", "93.5 in·lbf", "93.5 in-lbf", "93.5 inlbf"};
    for (size_t i = 0; i < sizeof texts / sizeof texts[0]; i++)
        assert_rel(parse_ok(state, texts[i], PLUMB_DIM_ENERGY), 93.5 * IN_M * LBF_N, EXACT);
    assert_rel(parse_ok(state, "1 in lbf", PLUMB_DIM_ENERGY), 1.129848e-01, NIST7);
    assert_rel(parse_ok(state, "81.5 J", PLUMB_DIM_ENERGY), 81.5, EXACT);
    assert_rel(parse_ok(state, "81.5 N m", PLUMB_DIM_ENERGY), 81.5, EXACT);
}

/* ---- pressure -------------------------------------------------------------- */

static void test_pressures_match_nist_sp_811(void **state)
{
    /* hPa = 100 Pa (SI prefix). */
    assert_rel(parse_ok(state, "1013.25 hPa", PLUMB_DIM_PRESSURE), 101325.0, EXACT);
    /* inch of mercury, conventional = 3.386 389 E+03 Pa (NIST SP 811 B.8);
     * plumb uses the tabulated figure. */
    assert_rel(parse_ok(state, "29.92 inHg", PLUMB_DIM_PRESSURE), 29.92 * 3386.389, EXACT);
    /* psi = lbf / in^2; NIST SP 811 B.8: 6.894 757 E+03 Pa. */
    double psi_pa = LBF_N / (IN_M * IN_M);
    assert_rel(parse_ok(state, "14.7 psi", PLUMB_DIM_PRESSURE), 14.7 * psi_pa, EXACT);
    assert_rel(parse_ok(state, "1 psi", PLUMB_DIM_PRESSURE), 6.894757e+03, NIST7);
    assert_rel(parse_ok(state, "97.3 kPa", PLUMB_DIM_PRESSURE), 97300.0, EXACT);
}

/* ---- temperatures ---------------------------------------------------------- */

static void test_temperatures_are_absolute(void **state)
{
    /* NIST SP 811 B.9: T/K = t/degC + 273.15; T/K = (t/degF + 459.67)/1.8. */
    assert_rel(parse_ok(state, "15 degC", PLUMB_DIM_TEMPERATURE), 288.15, EXACT);
    assert_rel(parse_ok(state, "59 degF", PLUMB_DIM_TEMPERATURE), 288.15, EXACT);
    assert_rel(parse_ok(state, "-40 degC", PLUMB_DIM_TEMPERATURE), 233.15, EXACT);
    assert_rel(parse_ok(state, "-40 degF", PLUMB_DIM_TEMPERATURE), 233.15, EXACT);
    assert_rel(parse_ok(state, "-3.5 degC", PLUMB_DIM_TEMPERATURE), 269.65, EXACT);
    assert_rel(parse_ok(state, "83.3 degF", PLUMB_DIM_TEMPERATURE), (83.3 + 459.67) / 1.8,
               EXACT);
    assert_rel(parse_ok(state, "291.4 K", PLUMB_DIM_TEMPERATURE), 291.4, EXACT);
    assert_rel(parse_ok(state, "15 °C", PLUMB_DIM_TEMPERATURE), 288.15, EXACT);
    assert_rel(parse_ok(state, "15 ℃", PLUMB_DIM_TEMPERATURE), 288.15, EXACT);
    assert_rel(parse_ok(state, "59 °F", PLUMB_DIM_TEMPERATURE), 288.15, EXACT);
}

static void test_temperature_differences_carry_no_offset(void **state)
{
    /* A difference of 1 degC is 1 K, of 1 degF is 1/1.8 K (NIST SP 811 B.9). */
    assert_rel(parse_ok(state, "10 K", PLUMB_DIM_TEMP_DIFF), 10.0, EXACT);
    assert_rel(parse_ok(state, "10 degC", PLUMB_DIM_TEMP_DIFF), 10.0, EXACT);
    assert_rel(parse_ok(state, "18 degF", PLUMB_DIM_TEMP_DIFF), 10.0, EXACT);
    assert_rel(parse_ok(state, "7.3 degC", PLUMB_DIM_TEMP_DIFF), 7.3, EXACT);
    assert_rel(parse_ok(state, "0.0017 degC", PLUMB_DIM_TEMP_DIFF), 0.0017, EXACT);
    assert_rel(parse_ok(state, "-4.6 degF", PLUMB_DIM_TEMP_DIFF), -4.6 / 1.8, EXACT);
}

static void test_lapse_rates_are_differences_per_height(void **state)
{
    /* 6.5 K/km is the US Standard Atmosphere 1976 tropospheric gradient. */
    assert_rel(parse_ok(state, "6.5 K/km", PLUMB_DIM_LAPSE), 0.0065, EXACT);
    assert_rel(parse_ok(state, "6.5 degC/km", PLUMB_DIM_LAPSE), 0.0065, EXACT);
    assert_rel(parse_ok(state, "3.56 degF/kft", PLUMB_DIM_LAPSE),
               3.56 / 1.8 / (1000.0 * FT_M), EXACT);
    assert_rel(parse_ok(state, "0.0098 K/m", PLUMB_DIM_LAPSE), 0.0098, EXACT);
    /* Per a count of a unit, as lapse rates are quoted ("3.57 degF per
     * 1000 ft" is the 1976 gradient in US units) and as US reports print
     * them: the count divides, it does not multiply (udunits2 alone reads
     * "K/1000 m" as (K/1000) m). 1 ft = 0.3048 m exactly (NIST SP 811 B.9). */
    assert_rel(parse_ok(state, "3.57 degF/1000ft", PLUMB_DIM_LAPSE),
               3.57 / 1.8 / (1000.0 * FT_M), EXACT);
    assert_rel(parse_ok(state, "3.57 °F/1000 ft", PLUMB_DIM_LAPSE),
               3.57 / 1.8 / (1000.0 * FT_M), EXACT);
    assert_rel(parse_ok(state, "6.5 K/1000 m", PLUMB_DIM_LAPSE), 0.0065, EXACT);
    assert_rel(parse_ok(state, "0.65 degC/100m", PLUMB_DIM_LAPSE), 0.0065, EXACT);
    /* Any other number in the unit still scales silently in udunits2. */
    parse_fails(state, "6.5 K/1000", PLUMB_DIM_LAPSE, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "6.5 K/1000 m 3", PLUMB_DIM_LAPSE, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "6.5 K/1.5 m", PLUMB_DIM_LAPSE, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "6.5 K/1000 m/s", PLUMB_DIM_LAPSE, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "6.5 K/0 m", PLUMB_DIM_LAPSE, PLUMB_EUNIT, "");
    parse_fails(state, "6.5 K", PLUMB_DIM_LAPSE, PLUMB_EUNIT, "(a temperature)");
}

static void test_a_temperature_below_absolute_zero_is_out_of_range(void **state)
{
    parse_fails(state, "-300 degC", PLUMB_DIM_TEMPERATURE, PLUMB_ERANGE, "absolute zero");
    parse_fails(state, "-2.5 K", PLUMB_DIM_TEMPERATURE, PLUMB_ERANGE, "absolute zero");
}

/* ---- angles and fractions -------------------------------------------------- */

static void test_angles_are_returned_in_degrees(void **state)
{
    /* degree = pi/180 rad (SI Brochure, 9th ed., Table 8). */
    assert_rel(parse_ok(state, "0.5 rad", PLUMB_DIM_ANGLE), 0.5 * 180.0 / PI, EXACT);
    assert_rel(parse_ok(state, "0.5 rad", PLUMB_DIM_ANGLE), 28.6479, 1e-6);
    const char *texts[] = {"271.5 deg", "271.5 degree", "271.5 degrees", "271.5°",
                           "271.5 arc_degree"};
    for (size_t i = 0; i < sizeof texts / sizeof texts[0]; i++)
        assert_rel(parse_ok(state, texts[i], PLUMB_DIM_ANGLE), 271.5, EXACT);
    assert_rel(parse_ok(state, "-12.5 deg", PLUMB_DIM_ANGLE), -12.5, EXACT);
}

static void test_a_dimensionless_unit_is_not_an_angle(void **state)
{
    /* udunits2 makes the radian dimensionless; plumb does not let "%" or
     * "m/m" pass for an angle, nor the steradian (rad^2). */
    parse_fails(state, "0.5 %", PLUMB_DIM_ANGLE, PLUMB_EUNIT, "(a dimensionless number)");
    parse_fails(state, "0.5 m/m", PLUMB_DIM_ANGLE, PLUMB_EUNIT, "(a dimensionless number)");
    parse_fails(state, "0.5 sr", PLUMB_DIM_ANGLE, PLUMB_EUNIT, "expected an angle (deg)");
    parse_fails(state, "0.5", PLUMB_DIM_ANGLE, PLUMB_EUNIT, "found a bare number");
}

static void test_percent_is_a_fraction(void **state)
{
    assert_rel(parse_ok(state, "50 %", PLUMB_DIM_FRACTION), 0.5, EXACT);
    assert_rel(parse_ok(state, "37.5%", PLUMB_DIM_FRACTION), 0.375, EXACT);
    assert_rel(parse_ok(state, "12.5 percent", PLUMB_DIM_FRACTION), 0.125, EXACT);
    assert_rel(parse_ok(state, "0.375", PLUMB_DIM_FRACTION), 0.375, EXACT);
    assert_rel(parse_ok(state, "0.375 1", PLUMB_DIM_FRACTION), 0.375, EXACT);
}

static void test_a_fraction_rejects_angles_and_dimensions(void **state)
{
    parse_fails(state, "50 m", PLUMB_DIM_FRACTION, PLUMB_EUNIT,
                "expected a fraction (a bare number or \"%\"), found \"50 m\" (a length)");
    parse_fails(state, "0.5 rad", PLUMB_DIM_FRACTION, PLUMB_EUNIT, "(an angle)");
}

static void test_a_dimensionless_key_takes_a_bare_number_only(void **state)
{
    assert_rel(parse_ok(state, "0.873", PLUMB_DIM_NONE), 0.873, EXACT);
    assert_rel(parse_ok(state, "0.873 1", PLUMB_DIM_NONE), 0.873, EXACT);
    assert_rel(parse_ok(state, " -1.25e-1 ", PLUMB_DIM_NONE), -0.125, EXACT);
    parse_fails(state, "0.873 kg", PLUMB_DIM_NONE, PLUMB_EUNIT,
                "expected a bare number (dimensionless), found \"0.873 kg\" with a unit");
    parse_fails(state, "87.3 %", PLUMB_DIM_NONE, PLUMB_EUNIT, "with a unit");
}

/* ---- spellings ------------------------------------------------------------- */

static void test_utf8_superscripts_and_dots_are_understood(void **state)
{
    assert_rel(parse_ok(state, "0.021 m²", PLUMB_DIM_AREA), 0.021, EXACT);
    assert_rel(parse_ok(state, "0.021 m^2", PLUMB_DIM_AREA), 0.021, EXACT);
    assert_rel(parse_ok(state, "0.021 m2", PLUMB_DIM_AREA), 0.021, EXACT);
    assert_rel(parse_ok(state, "0.226 ft²", PLUMB_DIM_AREA), 0.226 * FT_M * FT_M, EXACT);
    assert_rel(parse_ok(state, "0.226 ft2", PLUMB_DIM_AREA), 0.226 * FT_M * FT_M, EXACT);
    assert_rel(parse_ok(state, "32.5 in^2", PLUMB_DIM_AREA), 32.5 * IN_M * IN_M, EXACT);
    assert_rel(parse_ok(state, "0.0015 m³", PLUMB_DIM_VOLUME), 0.0015, EXACT);
    assert_rel(parse_ok(state, "0.37 ft³", PLUMB_DIM_VOLUME), 0.37 * FT_M * FT_M * FT_M,
               EXACT);
    assert_rel(parse_ok(state, "1.225 kg/m³", PLUMB_DIM_DENSITY), 1.225, EXACT);
    assert_rel(parse_ok(state, "1.225 kg·m⁻³", PLUMB_DIM_DENSITY), 1.225, EXACT);
    assert_rel(parse_ok(state, "1.225 kg m-3", PLUMB_DIM_DENSITY), 1.225, EXACT);
    assert_rel(parse_ok(state, "0.0765 lb/ft³", PLUMB_DIM_DENSITY),
               0.0765 * LB_KG / (FT_M * FT_M * FT_M), EXACT);
    assert_rel(parse_ok(state, "8.25 m·s⁻¹", PLUMB_DIM_SPEED), 8.25, EXACT);
    assert_rel(parse_ok(state, "6.5 K·km⁻¹", PLUMB_DIM_LAPSE), 0.0065, EXACT);
    assert_rel(parse_ok(state, "350 µs", PLUMB_DIM_TIME), 350e-6, EXACT);
}

static void test_the_unit_may_follow_the_number_without_a_space(void **state)
{
    assert_rel(parse_ok(state, "2.4kg", PLUMB_DIM_MASS), 2.4, EXACT);
    assert_rel(parse_ok(state, "2.4 kg", PLUMB_DIM_MASS), 2.4, EXACT);
    assert_rel(parse_ok(state, "  2.4   kg \t", PLUMB_DIM_MASS), 2.4, EXACT);
    assert_rel(parse_ok(state, "2.4e-3kg", PLUMB_DIM_MASS), 2.4e-3, EXACT);
    assert_rel(parse_ok(state, "+30ft", PLUMB_DIM_LENGTH), 30.0 * FT_M, EXACT);
}

/* ---- errors: missing, unknown and wrong units ------------------------------ */

static void test_a_bare_number_for_a_mass_suggests_the_si_unit(void **state)
{
    parse_fails(state, "2.4", PLUMB_DIM_MASS, PLUMB_EUNIT,
                "expected a mass with its unit (e.g. \"2.4 kg\"); found a bare number \"2.4\"");
    parse_fails(state, "8", PLUMB_DIM_SPEED, PLUMB_EUNIT, "(e.g. \"8 m/s\")");
    parse_fails(state, "15", PLUMB_DIM_TEMPERATURE, PLUMB_EUNIT, "(e.g. \"15 K\")");
    parse_fails(state, "0.021", PLUMB_DIM_AREA, PLUMB_EUNIT, "an area with its unit");
}

static void test_a_unit_of_another_dimension_names_both(void **state)
{
    parse_fails(state, "3 m", PLUMB_DIM_MASS, PLUMB_EUNIT,
                "expected a mass (kg), found \"3 m\" (a length)");
    parse_fails(state, "3.5 s", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "(a time)");
    parse_fails(state, "3.5 J", PLUMB_DIM_FORCE, PLUMB_EUNIT, "(an energy)");
    parse_fails(state, "3.5 N", PLUMB_DIM_ENERGY, PLUMB_EUNIT, "(a force)");
    parse_fails(state, "3.5 kg/m^3", PLUMB_DIM_PRESSURE, PLUMB_EUNIT, "(a density)");
    parse_fails(state, "3.5 m^3", PLUMB_DIM_AREA, PLUMB_EUNIT, "(a volume)");
    parse_fails(state, "3.5 m^2", PLUMB_DIM_VOLUME, PLUMB_EUNIT, "(an area)");
    parse_fails(state, "3.5 Pa", PLUMB_DIM_DENSITY, PLUMB_EUNIT, "(a pressure)");
    parse_fails(state, "3.5 kg", PLUMB_DIM_TIME, PLUMB_EUNIT, "(a mass)");
    parse_fails(state, "3.5 K/m", PLUMB_DIM_TEMP_DIFF, PLUMB_EUNIT, "(a lapse rate)");
    parse_fails(state, "3.5 deg", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "(an angle)");
    parse_fails(state, "3.5 %", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "(a dimensionless number)");
    /* named in words, never in udunits2's base units ("s.A"): the SI
     * Brochure (BIPM, 9th ed., 2019, table 4) names A, C and W (seen) */
    parse_fails(state, "3.5 A", PLUMB_DIM_MASS, PLUMB_EUNIT, "(an electric current)");
    parse_fails(state, "15 C", PLUMB_DIM_MASS, PLUMB_EUNIT, "(an electric charge)");
    parse_fails(state, "15 W", PLUMB_DIM_SPEED, PLUMB_EUNIT, "(a power)");
    parse_fails(state, "3 mol/s", PLUMB_DIM_MASS, PLUMB_EUNIT, "(a unit that is not a mass)");
}

/* A unit's reciprocal measures another quantity (dimensional analysis:
 * dim(1/kg) = M^-1, not M), though udunits2 converts between the two:
 * "5 1/kg" must not read as a mass of 0.2 kg, nor "2 Hz" as 0.5 s. */
static void test_the_reciprocal_of_a_unit_is_not_that_unit(void **state)
{
    parse_fails(state, "5 1/kg", PLUMB_DIM_MASS, PLUMB_EUNIT, "(a unit that is not a mass)");
    parse_fails(state, "2.6 1/m", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "(a reciprocal length)");
    parse_fails(state, "2 Hz", PLUMB_DIM_TIME, PLUMB_EUNIT, "(a frequency (per time))");
    parse_fails(state, "4.1 s/m", PLUMB_DIM_SPEED, PLUMB_EUNIT, "(a unit that is not a speed)");
    parse_fails(state, "0.3 1/Pa", PLUMB_DIM_PRESSURE, PLUMB_EUNIT, "not a pressure");
    /* the siemens is the reciprocal ohm (SI Brochure table 4): named as itself */
    parse_fails(state, "10 S", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "(an electric conductance)");
    to_si_fails(state, 2.0, "1/s", PLUMB_DIM_TIME, PLUMB_EUNIT, "expected a time (s)");
}

static void test_an_unknown_unit_is_named(void **state)
{
    parse_fails(state, "2.4 kgz", PLUMB_DIM_MASS, PLUMB_EUNIT,
                "unknown unit \"kgz\" in \"2.4 kgz\"; did you mean \"2.4 kg\"?");
    parse_fails(state, "2.4 qwertyuiop", PLUMB_DIM_MASS, PLUMB_EUNIT,
                "unknown unit \"qwertyuiop\" in \"2.4 qwertyuiop\"; units of a mass: kg, g");
    parse_fails(state, "2.4 kg^", PLUMB_DIM_MASS, PLUMB_EUNIT, "unknown unit \"kg^\"");
}

/* ---- what a wrong unit's message suggests ----------------------------------- */

/* Parses text as dim, expecting status; returns the message (static). */
static const char *message_of(void **state, const char *text, plumb_dim dim, plumb_status status)
{
    static plumb_diag d;
    plumb_diag_clear(&d);
    double v = SENTINEL;
    plumb_status st = plumb_units_parse(*state, text, dim, &v, &d);
    if (st != status) {
        print_error("plumb_units_parse(\"%s\", %s) gave %s (%s), expected %s\n", text,
                    plumb_dim_name(dim), plumb_strerror(st), d.message, plumb_strerror(status));
        fail();
    }
    return d.message;
}

static void lacks(const char *message, const char *part)
{
    if (strstr(message, part)) {
        print_error("message \"%s\" has \"%s\"\n", message, part);
        fail();
    }
}

static void has(const char *message, const char *part)
{
    if (!strstr(message, part)) {
        print_error("message \"%s\" lacks \"%s\"\n", message, part);
        fail();
    }
}

/* The quantity a message suggests ("did you mean \"5 kg\"?") parses as dim:
 * a suggestion is never of another dimension. */
static void suggestion_reads_as(void **state, const char *message, plumb_dim dim)
{
    const char *p = strstr(message, "did you mean \"");
    assert_non_null(p);
    p += strlen("did you mean \"");
    char text[64];
    size_t n = strcspn(p, "\"");
    assert_true(n < sizeof text);
    memcpy(text, p, n);
    text[n] = '\0';
    (void)parse_ok(state, text, dim);
}

/* Cases a new user met. Unit symbols are case-sensitive: M is the prefix mega, m
 * the metre, K the kelvin, k the prefix kilo (BIPM SI Brochure, 9th ed.,
 * 2019, tables 2 and 7; seen). A suggestion is a unit of the dimension
 * wanted, so never the kelvin for a mass nor the gram for a length. */
static void test_a_suggested_unit_is_of_the_wanted_dimension(void **state)
{
    const char *m = message_of(state, "5 KG", PLUMB_DIM_MASS, PLUMB_EUNIT);
    has(m, "did you mean \"5 kg\"?");
    has(m, "unit symbols are case-sensitive: K is the kelvin");
    suggestion_reads_as(state, m, PLUMB_DIM_MASS);

    m = message_of(state, "10 KT", PLUMB_DIM_SPEED, PLUMB_EUNIT);
    has(m, "did you mean \"10 kt\"?");
    has(m, "case-sensitive");
    suggestion_reads_as(state, m, PLUMB_DIM_SPEED);

    m = message_of(state, "60 M", PLUMB_DIM_LENGTH, PLUMB_EUNIT);
    has(m, "did you mean \"60 m\"?");
    has(m, "M is the prefix mega, not the metre");
    suggestion_reads_as(state, m, PLUMB_DIM_LENGTH);

    m = message_of(state, "5 MG", PLUMB_DIM_MASS, PLUMB_EUNIT);
    has(m, "did you mean \"5 mg\"?");
    suggestion_reads_as(state, m, PLUMB_DIM_MASS);

    /* udunits2 reads "kilos" as kilo-seconds (the SI prefix on the second) */
    m = message_of(state, "5 kilos", PLUMB_DIM_MASS, PLUMB_EUNIT);
    has(m, "(a time: \"kilos\" reads as kiloseconds)");
    has(m, "did you mean \"5 kg\"?");
    suggestion_reads_as(state, m, PLUMB_DIM_MASS);

    /* mb is the millibarn (the barn, 1e-28 m^2: SI Brochure, 9th ed.,
     * table 8); a pressure means mbar */
    m = message_of(state, "1000 mb", PLUMB_DIM_PRESSURE, PLUMB_EUNIT);
    has(m, "(an area: mb is the millibarn, an area)");
    has(m, "did you mean \"1000 mbar\"?");
    suggestion_reads_as(state, m, PLUMB_DIM_PRESSURE);

    /* C is the coulomb (SI Brochure table 4); a temperature means degC */
    m = message_of(state, "15 C", PLUMB_DIM_TEMPERATURE, PLUMB_EUNIT);
    has(m, "(an electric charge: C is the coulomb)");
    has(m, "did you mean \"15 degC\"?");
    suggestion_reads_as(state, m, PLUMB_DIM_TEMPERATURE);
    m = message_of(state, "18 F", PLUMB_DIM_TEMP_DIFF, PLUMB_EUNIT);
    suggestion_reads_as(state, m, PLUMB_DIM_TEMP_DIFF);

    /* for a mass, C is nothing near: the list of mass units, no jargon */
    m = message_of(state, "15 C", PLUMB_DIM_MASS, PLUMB_EUNIT);
    lacks(m, "did you mean");
    lacks(m, "s.A");
    has(m, "units of a mass: kg, g");

    /* a one-letter unit gets no edit-distance guess ("M" is one edit from "g") */
    m = message_of(state, "60 Q", PLUMB_DIM_LENGTH, PLUMB_EUNIT);
    lacks(m, "did you mean");
    has(m, "units of a length: m, km");

    /* a unit of another dimension in another case: kg is a mass, so for an
     * area "KG" gets no "did you mean kg" but the area units and why KG is
     * unknown (SI Brochure, 9th ed., tables 2 and 7: symbols are
     * case-sensitive; seen) */
    m = message_of(state, "5 KG", PLUMB_DIM_AREA, PLUMB_EUNIT);
    lacks(m, "did you mean");
    has(m, "unit symbols are case-sensitive: KG is not a unit; kg is a mass");
    has(m, "units of an area: m^2");
    m = message_of(state, "10 KT", PLUMB_DIM_LENGTH, PLUMB_EUNIT);
    lacks(m, "did you mean");
    has(m, "KT is not a unit; kt is a speed");
    has(m, "units of a length: m,");
    m = message_of(state, "60 M", PLUMB_DIM_MASS, PLUMB_EUNIT);
    lacks(m, "did you mean");
    has(m, "M is the prefix mega, not a unit of its own; m is a length");
    has(m, "units of a mass: kg,");

    m = message_of(state, "30 fet", PLUMB_DIM_LENGTH, PLUMB_EUNIT);
    has(m, "did you mean \"30 ft\"?");
    lacks(m, "case-sensitive");
}

/* Latitude and longitude are signed degrees, north and east positive
 * (WGS 84 convention; from memory); a compass letter is not a unit. */
static void test_a_compass_letter_after_an_angle_is_explained(void **state)
{
    const char *m = message_of(state, "54.2 N", PLUMB_DIM_ANGLE, PLUMB_EUNIT);
    has(m, "signed number of degrees, north and east positive: write \"54.2 deg\"");
    lacks(m, "force");
    m = message_of(state, "54.2 S", PLUMB_DIM_ANGLE, PLUMB_EUNIT);
    has(m, "write \"-54.2 deg\"");
    m = message_of(state, "3.17 deg W", PLUMB_DIM_ANGLE, PLUMB_EUNIT);
    has(m, "write \"-3.17 deg\"");
    m = message_of(state, "-3.17 W", PLUMB_DIM_ANGLE, PLUMB_EUNIT);
    has(m, "write \"3.17 deg\"");
    m = message_of(state, "1.5 E", PLUMB_DIM_ANGLE, PLUMB_EUNIT);
    has(m, "write \"1.5 deg\"");
    /* a bearing written as a compass point: 16 points, 22.5 deg apart */
    m = message_of(state, "NW", PLUMB_DIM_ANGLE, PLUMB_EPARSE);
    has(m, "NW is \"315 deg\"");
    m = message_of(state, "ssw", PLUMB_DIM_ANGLE, PLUMB_EPARSE);
    has(m, "ssw is \"202.5 deg\"");
    /* elsewhere N is still the newton */
    m = message_of(state, "54.2 N", PLUMB_DIM_LENGTH, PLUMB_EUNIT);
    has(m, "(a force)");
}

/* plumb reads a decimal point only, and no thousands separator (the SI
 * Brochure, 9th ed., 5.4.4, allows either decimal marker and groups digits
 * with a thin space, never a comma; seen): a comma is explained. */
static void test_a_decimal_comma_is_explained(void **state)
{
    const char *m = message_of(state, "6,5 m", PLUMB_DIM_LENGTH, PLUMB_EPARSE);
    has(m, "found \"6,5 m\": use a decimal point: \"6.5 m\"");
    m = message_of(state, "0,85", PLUMB_DIM_NONE, PLUMB_EPARSE);
    has(m, "use a decimal point: \"0.85\"");
    m = message_of(state, "1,500 m", PLUMB_DIM_LENGTH, PLUMB_EPARSE);
    has(m, "write \"1.500 m\" or \"1500 m\", whichever is meant");
    m = message_of(state, "1,234,567.5 ft", PLUMB_DIM_LENGTH, PLUMB_EPARSE);
    has(m, "no thousands separator: write \"1234567.5 ft\"");
    m = message_of(state, "2,34,5 m", PLUMB_DIM_LENGTH, PLUMB_EPARSE);
    has(m, "no thousands separator");
}

/* Every unit a message lists for a dimension reads as that dimension. */
static void test_every_listed_unit_reads_as_its_dimension(void **state)
{
    for (int i = 1; i < PLUMB_DIM_COUNT; i++) {
        plumb_dim dim = (plumb_dim)i;
        const char *m = message_of(state, "1.25 qqqq", dim, PLUMB_EUNIT);
        const char *list = strstr(m, "units of ");
        assert_non_null(list);
        list = strstr(list, ": ");
        assert_non_null(list);
        char copy[256];
        snprintf(copy, sizeof copy, "%s", list + 2);
        size_t n = 0;
        for (char *u = strtok(copy, ","); u; u = strtok(NULL, ",")) {
            while (*u == ' ')
                u++;
            char text[64];
            snprintf(text, sizeof text, "1.25 %s", u);
            (void)parse_ok(state, text, dim);
            n++;
        }
        assert_true(n >= 1);
    }
}

static void test_a_time_stamp_is_not_a_duration(void **state)
{
    parse_fails(state, "3.5 s since 2000-01-01", PLUMB_DIM_TIME, PLUMB_EUNIT, "time stamp");
}

static void test_a_logarithmic_unit_is_not_a_number(void **state)
{
    parse_fails(state, "3.5 lg(re 1 mW)", PLUMB_DIM_FRACTION, PLUMB_EUNIT, "logarithmic");
}

static void test_a_number_inside_the_unit_is_refused(void **state)
{
    /* udunits2 would read "kg 3" as 3 kg and "lb/16" as an ounce. */
    parse_fails(state, "2.4 kg 3", PLUMB_DIM_MASS, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "2.4 lb/16", PLUMB_DIM_MASS, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "2.4 ft.5", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "2.4 (3 kg)", PLUMB_DIM_MASS, PLUMB_EUNIT, "contains a number");
    parse_fails(state, "2.4 m·2", PLUMB_DIM_LENGTH, PLUMB_EUNIT, "contains a number");
    /* exponents are not factors */
    assert_rel(parse_ok(state, "2.4 m**2", PLUMB_DIM_AREA), 2.4, EXACT);
    assert_rel(parse_ok(state, "8.25 m s-1", PLUMB_DIM_SPEED), 8.25, EXACT);
    assert_rel(parse_ok(state, "0.226 (ft)2", PLUMB_DIM_AREA), 0.226 * FT_M * FT_M, EXACT);
}

/* ---- errors: malformed numbers --------------------------------------------- */

static void test_a_second_number_is_a_parse_error(void **state)
{
    parse_fails(state, "2 3 kg", PLUMB_DIM_MASS, PLUMB_EPARSE, "one number then a unit");
    parse_fails(state, "2.4.5 kg", PLUMB_DIM_MASS, PLUMB_EPARSE, "one number then a unit");
    parse_fails(state, "2.4 -3 kg", PLUMB_DIM_MASS, PLUMB_EPARSE, "one number then a unit");
}

static void test_non_numbers_are_parse_errors(void **state)
{
    parse_fails(state, "", PLUMB_DIM_MASS, PLUMB_EPARSE, "found an empty value");
    parse_fails(state, " \t ", PLUMB_DIM_MASS, PLUMB_EPARSE, "found an empty value");
    parse_fails(state, "kg", PLUMB_DIM_MASS, PLUMB_EPARSE,
                "found \"kg\", which does not start with a number");
    parse_fails(state, "heavy", PLUMB_DIM_MASS, PLUMB_EPARSE, "does not start with a number");
    parse_fails(state, "0x1A kg", PLUMB_DIM_MASS, PLUMB_EPARSE, "hexadecimal");
    parse_fails(state, "-0x1p3 m", PLUMB_DIM_LENGTH, PLUMB_EPARSE, "hexadecimal");
}

static void test_nan_and_infinity_are_refused(void **state)
{
    const char *texts[] = {"nan kg", "NaN", "inf kg", "-inf kg", "infinity", "nan(123) kg"};
    for (size_t i = 0; i < sizeof texts / sizeof texts[0]; i++)
        parse_fails(state, texts[i], PLUMB_DIM_MASS, PLUMB_EPARSE, "not a finite number");
}

static void test_overflow_and_underflow_are_range_errors(void **state)
{
    parse_fails(state, "1e999 kg", PLUMB_DIM_MASS, PLUMB_ERANGE, "too large for a double");
    parse_fails(state, "-1e999 kg", PLUMB_DIM_MASS, PLUMB_ERANGE, "too large for a double");
    parse_fails(state, "1e-999 kg", PLUMB_DIM_MASS, PLUMB_ERANGE, "too small for a double");
    /* finite as written, infinite once converted */
    parse_fails(state, "1e308 mi", PLUMB_DIM_LENGTH, PLUMB_ERANGE, "too large once converted");
}

static void test_an_overlong_text_is_refused(void **state)
{
    char text[600];
    memset(text, 'm', sizeof text - 1);
    text[0] = '1';
    text[1] = ' ';
    text[sizeof text - 1] = '\0';
    parse_fails(state, text, PLUMB_DIM_LENGTH, PLUMB_EPARSE, "more than 256 bytes");
    char unit[400];
    memset(unit, 'm', sizeof unit - 1);
    unit[sizeof unit - 1] = '\0';
    to_si_fails(state, 1.0, unit, PLUMB_DIM_LENGTH, PLUMB_EUNIT, "more than 256 bytes");
}

static void test_an_alias_heavy_unit_that_expands_too_far_is_refused(void **state)
{
    /* 120 "mph" tokens (240 bytes with spaces) expand past the buffer. */
    char text[256] = "1 ";
    for (int i = 0; i < 63; i++)
        strcat(text, "mph ");
    parse_fails(state, text, PLUMB_DIM_SPEED, PLUMB_EUNIT, "too long");
}

/* ---- errors: arguments ----------------------------------------------------- */

static void test_parse_refuses_null_arguments_and_bad_dimensions(void **state)
{
    plumb_diag d;
    double v = SENTINEL;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_parse(NULL, "2.4 kg", PLUMB_DIM_MASS, &v, &d), PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "units is NULL");
    assert_int_equal(plumb_units_parse(*state, NULL, PLUMB_DIM_MASS, &v, &d), PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "text is NULL");
    assert_int_equal(plumb_units_parse(*state, "2.4 kg", PLUMB_DIM_MASS, NULL, &d),
                     PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "si_out is NULL");
    assert_int_equal(plumb_units_parse(*state, "2.4 kg", PLUMB_DIM_COUNT, &v, &d),
                     PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "out of range");
    assert_int_equal(plumb_units_parse(*state, "2.4 kg", (plumb_dim)-1, &v, &d), PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "out of range");
    assert_true(v == SENTINEL);
}

static void test_a_null_diagnostic_is_allowed(void **state)
{
    double v = SENTINEL;
    assert_int_equal(plumb_units_parse(*state, "3 m", PLUMB_DIM_MASS, &v, NULL), PLUMB_EUNIT);
    assert_int_equal(plumb_units_parse(*state, "nan", PLUMB_DIM_MASS, &v, NULL), PLUMB_EPARSE);
    assert_int_equal(plumb_units_to_si(*state, 3.0, "m", PLUMB_DIM_MASS, &v, NULL),
                     PLUMB_EUNIT);
    assert_true(v == SENTINEL);
    assert_int_equal(plumb_units_parse(*state, "3.25 m", PLUMB_DIM_LENGTH, &v, NULL),
                     PLUMB_OK);
    assert_rel(v, 3.25, EXACT);
}

/* ---- plumb_units_to_si ----------------------------------------------------- */

static void test_to_si_converts_a_value_in_a_unit(void **state)
{
    assert_rel(to_si_ok(state, 11.3, "ft lbf", PLUMB_DIM_ENERGY), 11.3 * FT_M * LBF_N, EXACT);
    assert_rel(to_si_ok(state, 15.3, "kn", PLUMB_DIM_SPEED), 15.3 * NMI_M / HOUR_S, EXACT);
    assert_rel(to_si_ok(state, 30.7, " ft ", PLUMB_DIM_LENGTH), 30.7 * FT_M, EXACT);
    assert_rel(to_si_ok(state, 59.0, "degF", PLUMB_DIM_TEMPERATURE), 288.15, EXACT);
    assert_rel(to_si_ok(state, 18.0, "degF", PLUMB_DIM_TEMP_DIFF), 10.0, EXACT);
    assert_rel(to_si_ok(state, 0.873, "", PLUMB_DIM_NONE), 0.873, EXACT);
    assert_rel(to_si_ok(state, 37.5, "%", PLUMB_DIM_FRACTION), 0.375, EXACT);
}

static void test_to_si_reports_the_same_errors_as_parse(void **state)
{
    to_si_fails(state, 2.4, "", PLUMB_DIM_MASS, PLUMB_EUNIT,
                "expected a mass with its unit (e.g. \"2.4 kg\"); found a bare number \"2.4\"");
    to_si_fails(state, 3.0, "m", PLUMB_DIM_MASS, PLUMB_EUNIT,
                "expected a mass (kg), found \"3 m\" (a length)");
    to_si_fails(state, 2.4, "kgz", PLUMB_DIM_MASS, PLUMB_EUNIT, "unknown unit \"kgz\"");
    to_si_fails(state, 2.4, "kg 3", PLUMB_DIM_MASS, PLUMB_EUNIT, "contains a number");
    to_si_fails(state, 1e308, "mi", PLUMB_DIM_LENGTH, PLUMB_ERANGE, "too large");
    to_si_fails(state, -300.0, "degC", PLUMB_DIM_TEMPERATURE, PLUMB_ERANGE, "absolute zero");
    to_si_fails(state, 0.9, "kg", PLUMB_DIM_NONE, PLUMB_EUNIT, "with a unit");
}

static void test_to_si_refuses_null_arguments_bad_dimensions_and_non_finite_values(
    void **state)
{
    to_si_fails(NULL, 2.4, "kg", PLUMB_DIM_MASS, PLUMB_EINVAL, "units is NULL");
    to_si_fails(state, 2.4, NULL, PLUMB_DIM_MASS, PLUMB_EINVAL, "unit is NULL");
    to_si_fails(state, 2.4, "kg", PLUMB_DIM_COUNT, PLUMB_EINVAL, "out of range");
    to_si_fails(state, NAN, "kg", PLUMB_DIM_MASS, PLUMB_EINVAL, "not finite");
    to_si_fails(state, INFINITY, "kg", PLUMB_DIM_MASS, PLUMB_EINVAL, "not finite");
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_to_si(*state, 2.4, "kg", PLUMB_DIM_MASS, NULL, &d),
                     PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "si_out is NULL");
}

/* ---- names ----------------------------------------------------------------- */

static void test_every_dimension_has_a_name_and_an_si_unit(void **state)
{
    (void)state;
    for (int i = 0; i < PLUMB_DIM_COUNT; i++) {
        assert_non_null(plumb_dim_name((plumb_dim)i));
        assert_true(plumb_dim_name((plumb_dim)i)[0] != '\0');
        assert_non_null(plumb_dim_si_unit((plumb_dim)i));
        assert_true(plumb_dim_si_unit((plumb_dim)i)[0] != '\0');
    }
    assert_string_equal(plumb_dim_si_unit(PLUMB_DIM_MASS), "kg");
    assert_string_equal(plumb_dim_si_unit(PLUMB_DIM_SPEED), "m/s");
    assert_string_equal(plumb_dim_si_unit(PLUMB_DIM_ANGLE), "deg");
    assert_string_equal(plumb_dim_si_unit(PLUMB_DIM_LAPSE), "K/m");
    assert_string_equal(plumb_dim_name(PLUMB_DIM_MASS), "mass");
    assert_string_equal(plumb_dim_name(PLUMB_DIM_TEMP_DIFF), "temperature difference");
    assert_non_null(plumb_dim_name(PLUMB_DIM_COUNT));
    assert_non_null(plumb_dim_si_unit((plumb_dim)-1));
    assert_string_equal(plumb_dim_name(PLUMB_DIM_COUNT), "unknown dimension");
}

static void test_every_dimension_si_unit_parses_back_to_one(void **state)
{
    /* The SI unit the module names must itself be accepted, at factor 1. */
    for (int i = PLUMB_DIM_NONE + 1; i < PLUMB_DIM_COUNT; i++) {
        if (i == PLUMB_DIM_FRACTION)
            continue;
        char text[64];
        snprintf(text, sizeof text, "2.385 %s", plumb_dim_si_unit((plumb_dim)i));
        assert_rel(parse_ok(state, text, (plumb_dim)i), 2.385, EXACT);
    }
}

/* ---- plumb_units_alloc ----------------------------------------------------- */

/* Runs plumb_units_alloc with UDUNITS2_XML_PATH pointing at `xml_path` and
 * checks that it fails with status and a message containing part. */
static void alloc_fails_with_database(const char *xml_path, plumb_status status,
                                      const char *part)
{
    const char *old = getenv("UDUNITS2_XML_PATH");
    char saved[1024] = "";
    if (old)
        snprintf(saved, sizeof saved, "%s", old);
    assert_int_equal(setenv("UDUNITS2_XML_PATH", xml_path, 1), 0);
    static int dummy;
    plumb_units *u = (plumb_units *)(void *)&dummy; /* not NULL: must be reset */
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_units_alloc(&u, &d);
    if (old)
        setenv("UDUNITS2_XML_PATH", saved, 1);
    else
        unsetenv("UDUNITS2_XML_PATH");
    assert_int_equal(st, status);
    assert_null(u);
    check_diag(&d, status, part);
}

/* Writes text to a new temporary file; returns its path in buf. */
static void write_temp(char *buf, size_t size, const char *text)
{
    const char *dir = getenv("TMPDIR");
    snprintf(buf, size, "%s/plumb_units_XXXXXX", dir && *dir ? dir : "/tmp");
    int fd = mkstemp(buf);
    assert_true(fd >= 0);
    FILE *f = fdopen(fd, "w");
    assert_non_null(f);
    assert_true(fputs(text, f) >= 0);
    assert_int_equal(fclose(f), 0);
}

static void test_alloc_refuses_a_null_out_pointer(void **state)
{
    (void)state;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_alloc(NULL, &d), PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "out is NULL");
}

static void test_alloc_and_free_release_everything(void **state)
{
    (void)state;
    plumb_units *u = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_alloc(&u, &d), PLUMB_OK);
    assert_non_null(u);
    plumb_units_free(u);
    plumb_units_free(NULL);
}

/* Not tested: a malformed database. udunits2 2.2.28's ut_read_xml() leaks
 * 124 bytes of its own when the XML is malformed, which would fail the
 * sanitizer run for reasons outside plumb. */
static void test_alloc_fails_cleanly_without_a_database(void **state)
{
    (void)state;
    alloc_fails_with_database("/nonexistent/plumb/udunits2.xml", PLUMB_EIO,
                              "cannot open the database named by UDUNITS2_XML_PATH");
}

static void test_alloc_fails_cleanly_on_a_database_without_the_radian(void **state)
{
    (void)state;
    char path[512];
    write_temp(path, sizeof path,
               "<?xml version=\"1.0\" encoding=\"US-ASCII\"?>\n<unit-system>\n"
               "<unit><base/><name><singular>meter</singular></name><symbol>m</symbol>"
               "</unit>\n</unit-system>\n");
    alloc_fails_with_database(path, PLUMB_EIO, "has no radian");
    unlink(path);
}

static void test_alloc_fails_cleanly_on_a_database_without_the_kilogram(void **state)
{
    (void)state;
    char path[512];
    write_temp(path, sizeof path,
               "<?xml version=\"1.0\" encoding=\"US-ASCII\"?>\n<unit-system>\n"
               "<unit><base/><name><singular>meter</singular></name><symbol>m</symbol>"
               "</unit>\n<unit><dimensionless/><name><singular>radian</singular></name>"
               "<symbol>rad</symbol></unit>\n</unit-system>\n");
    alloc_fails_with_database(path, PLUMB_EIO, "has no unit \"kg\"");
    unlink(path);
}

static void test_alloc_fails_cleanly_when_an_alias_is_undefined(void **state)
{
    (void)state;
    /* The installed database without its "common" part has every SI unit
     * but not the international foot the aliases rely on. */
    ut_status us;
    const char *def = ut_get_path_xml(NULL, &us);
    assert_non_null(def);
    char dir[512];
    snprintf(dir, sizeof dir, "%s", def);
    char *slash = strrchr(dir, '/');
    assert_non_null(slash);
    *slash = '\0';
    char xml[4096];
    snprintf(xml, sizeof xml,
             "<?xml version=\"1.0\" encoding=\"US-ASCII\"?>\n<unit-system>\n"
             "<import>%s/udunits2-prefixes.xml</import>\n"
             "<import>%s/udunits2-base.xml</import>\n"
             "<import>%s/udunits2-derived.xml</import>\n"
             "<import>%s/udunits2-accepted.xml</import>\n</unit-system>\n",
             dir, dir, dir, dir);
    char path[512];
    write_temp(path, sizeof path, xml);
    alloc_fails_with_database(path, PLUMB_EIO, "international_foot");
    unlink(path);
}

/* ---- plumb_units_alloc_deferred --------------------------------------------- */

static void test_deferred_alloc_refuses_a_null_out_pointer(void **state)
{
    (void)state;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_alloc_deferred(NULL, &d), PLUMB_EINVAL);
    check_diag(&d, PLUMB_EINVAL, "plumb_units_alloc_deferred: out is NULL");
}

/* A deferred handle reads what a loaded one reads, the database loaded at
 * its first quantity. 1 ft = 0.3048 m, 1 lbf = 4.4482216152605 N exactly
 * (1959 yard and pound agreement; 3rd CGPM, 1901: g0 = 9.80665 m/s^2). */
static void test_deferred_alloc_reads_quantities_as_a_loaded_handle(void **state)
{
    (void)state;
    plumb_units *u = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_alloc_deferred(&u, &d), PLUMB_OK);
    assert_non_null(u);
    assert_int_equal(plumb_units_load_error(u, &d), PLUMB_OK);
    double v = 0.0;
    assert_int_equal(plumb_units_parse(u, "31.6 ft", PLUMB_DIM_LENGTH, &v, &d), PLUMB_OK);
    assert_rel(v, 31.6 * FT_M, EXACT);
    assert_int_equal(plumb_units_to_si(u, 2.385, "lbf", PLUMB_DIM_FORCE, &v, &d), PLUMB_OK);
    assert_rel(v, 2.385 * 4.4482216152605, EXACT);
    assert_int_equal(plumb_units_load_error(u, &d), PLUMB_OK);
    plumb_units_free(u);
}

/* Without a database: no error until a quantity needs it (a text that is
 * no number needs none); then that quantity's error is plumb_units_alloc's,
 * the same at every later call, even once the database is back (a failed
 * load is not tried again), and plumb_units_load_error tells it. */
static void test_deferred_alloc_without_a_database_fails_at_the_first_unit_read(void **state)
{
    (void)state;
    const char *old = getenv("UDUNITS2_XML_PATH");
    char saved[1024] = "";
    if (old)
        snprintf(saved, sizeof saved, "%s", old);
    assert_int_equal(setenv("UDUNITS2_XML_PATH", "/nonexistent/plumb/udunits2.xml", 1), 0);
    plumb_units *u = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_alloc_deferred(&u, &d), PLUMB_OK);
    double v = 7.5;
    assert_int_equal(plumb_units_parse(u, "heavy", PLUMB_DIM_MASS, &v, &d), PLUMB_EPARSE);
    assert_int_equal(plumb_units_load_error(u, &d), PLUMB_OK);
    plumb_diag_clear(&d);
    plumb_status st = plumb_units_parse(u, "2.385 kg", PLUMB_DIM_MASS, &v, &d);
    if (old)
        setenv("UDUNITS2_XML_PATH", saved, 1);
    else
        unsetenv("UDUNITS2_XML_PATH");
    assert_int_equal(st, PLUMB_EIO);
    check_diag(&d, PLUMB_EIO,
               "cannot load the udunits2 unit database: cannot open the database named by "
               "UDUNITS2_XML_PATH");
    assert_rel(v, 7.5, EXACT); /* untouched */
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_to_si(u, 31.6, "ft", PLUMB_DIM_LENGTH, &v, &d), PLUMB_EIO);
    check_diag(&d, PLUMB_EIO, "cannot open the database named by UDUNITS2_XML_PATH");
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_load_error(u, &d), PLUMB_EIO);
    check_diag(&d, PLUMB_EIO, "cannot open the database named by UDUNITS2_XML_PATH");
    assert_int_equal(plumb_units_load_error(u, NULL), PLUMB_EIO);
    assert_int_equal(plumb_units_load_error(NULL, NULL), PLUMB_OK);
    plumb_units_free(u);
}

/* A profile whose first quantity is a bare number, read through a deferred
 * handle without a database: the bare number's advice (which units would
 * bring it into range) needs the database, so the error is the failed
 * load's (PLUMB_EIO, plumb_units_alloc's words), not a bare-number
 * PLUMB_EUNIT that says no unit fits. */
static void test_deferred_alloc_without_a_database_fails_a_bare_number_with_the_load_error(
    void **state)
{
    (void)state;
    const char *old = getenv("UDUNITS2_XML_PATH");
    char saved[1024] = "";
    if (old)
        snprintf(saved, sizeof saved, "%s", old);
    assert_int_equal(setenv("UDUNITS2_XML_PATH", "/nonexistent/plumb/udunits2.xml", 1), 0);
    plumb_units *u = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_units_alloc_deferred(&u, &d), PLUMB_OK);
    static const char text[] = "name: bare mass\npayload:\n  mass: 12\n"
                               "  drag: {cd: 1.0, area: 0.01 m^2}\nrelease: {height: 10 m}\n";
    plumb_profile *p = NULL;
    plumb_status st = plumb_profile_load_buffer("bare.yaml", text, sizeof text - 1, u, NULL, 0,
                                                &p, &d);
    if (old)
        setenv("UDUNITS2_XML_PATH", saved, 1);
    else
        unsetenv("UDUNITS2_XML_PATH");
    assert_null(p);
    assert_int_equal(st, PLUMB_EIO);
    assert_int_equal(d.status, PLUMB_EIO);
    assert_non_null(strstr(d.message, "cannot open the database named by UDUNITS2_XML_PATH"));
    assert_string_equal(d.file, "bare.yaml"); /* where a unit was first needed */
    plumb_units_free(u);
}

/* ---- group ----------------------------------------------------------------- */

static int group_setup(void **state)
{
    plumbt_setup_gsl(state);
    plumb_units *u = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_units_alloc(&u, &d) != PLUMB_OK) {
        print_error("plumb_units_alloc: %s\n", d.message);
        return -1;
    }
    *state = u;
    return 0;
}

static int group_teardown(void **state)
{
    plumb_units_free(*state);
    return 0;
}

static void test_foot_pounds_mean_foot_pound_force_where_an_energy_is_wanted(void **state)
{
    /* 14 CFR 107.120(a)(1) writes "11 foot-pounds"; 1 ft lbf = 0.3048 m x
     * 0.45359237 kg x 9.80665 m/s^2 exactly (1959 agreement, CGPM 1901). */
    const plumb_units *u = *state;
    const char *const spellings[] = {"11 ft lb", "11 ft-lbs", "11 foot-pounds", "11 ft·lb"};
    for (size_t i = 0; i < 4; i++) {
        double j = 0.0;
        plumb_diag d;
        assert_int_equal(plumb_units_parse(u, spellings[i], PLUMB_DIM_ENERGY, &j, &d), PLUMB_OK);
        assert_rel(j, 11.0 * 0.3048 * 0.45359237 * 9.80665, 1e-14);
    }
    /* as a length times a mass elsewhere: not an energy alias for a mass */
    double x = 0.0;
    plumb_diag d;
    assert_int_equal(plumb_units_parse(u, "11 ft lb", PLUMB_DIM_MASS, &x, &d), PLUMB_EUNIT);
}

static void test_inch_pounds_mean_inch_pound_force_where_an_energy_is_wanted(void **state)
{
    /* NIST SP 811 (2008) B.8, exact by the 1959 agreement: 1 in = 0.0254 m,
     * 1 lbf = 4.4482216152605 N; so 300 in lbf = 25 ft lbf = 33.895 J. */
    const plumb_units *u = *state;
    const char *const spellings[] = {"300 in lb", "300 in-lbs", "300 inch-pounds", "300 in·lb",
                                     "300 in lbf"};
    for (size_t i = 0; i < sizeof spellings / sizeof spellings[0]; i++) {
        double j = 0.0;
        plumb_diag d;
        assert_int_equal(plumb_units_parse(u, spellings[i], PLUMB_DIM_ENERGY, &j, &d), PLUMB_OK);
        assert_rel(j, 300.0 * 0.0254 * 4.4482216152605, 1e-14);
        assert_rel(j, 25.0 * 0.3048 * 4.4482216152605, 1e-14);
        assert_abs(j, 33.895, 5e-4); /* 33.8954... J, to the 3 decimals quoted */
    }
    /* a length times a mass where a mass is wanted: still refused */
    double x = 0.0;
    plumb_diag d;
    assert_int_equal(plumb_units_parse(u, "300 in lb", PLUMB_DIM_MASS, &x, &d), PLUMB_EUNIT);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_foot_pounds_mean_foot_pound_force_where_an_energy_is_wanted),
        cmocka_unit_test(test_inch_pounds_mean_inch_pound_force_where_an_energy_is_wanted),
        cmocka_unit_test(test_mph_is_the_mile_per_hour_not_the_milliphot),
        cmocka_unit_test(test_every_knot_spelling_is_the_nautical_mile_per_hour),
        cmocka_unit_test(test_kt_is_the_knot_and_not_the_kilotonne),
        cmocka_unit_test(test_kilometres_per_hour_spellings_agree),
        cmocka_unit_test(test_feet_per_second_spellings_agree),
        cmocka_unit_test(test_lengths_match_the_1959_definitions),
        cmocka_unit_test(test_aliases_replace_whole_words_only),
        cmocka_unit_test(test_pounds_are_avoirdupois_pounds),
        cmocka_unit_test(test_oz_is_the_avoirdupois_ounce_and_not_the_fluid_ounce),
        cmocka_unit_test(test_lbf_is_the_pound_force_of_standard_gravity),
        cmocka_unit_test(test_every_foot_pound_force_spelling_is_the_same_energy),
        cmocka_unit_test(test_inch_pound_force_spellings_are_the_same_energy),
        cmocka_unit_test(test_pressures_match_nist_sp_811),
        cmocka_unit_test(test_temperatures_are_absolute),
        cmocka_unit_test(test_temperature_differences_carry_no_offset),
        cmocka_unit_test(test_lapse_rates_are_differences_per_height),
        cmocka_unit_test(test_a_temperature_below_absolute_zero_is_out_of_range),
        cmocka_unit_test(test_angles_are_returned_in_degrees),
        cmocka_unit_test(test_a_dimensionless_unit_is_not_an_angle),
        cmocka_unit_test(test_percent_is_a_fraction),
        cmocka_unit_test(test_a_fraction_rejects_angles_and_dimensions),
        cmocka_unit_test(test_a_dimensionless_key_takes_a_bare_number_only),
        cmocka_unit_test(test_utf8_superscripts_and_dots_are_understood),
        cmocka_unit_test(test_the_unit_may_follow_the_number_without_a_space),
        cmocka_unit_test(test_a_bare_number_for_a_mass_suggests_the_si_unit),
        cmocka_unit_test(test_a_unit_of_another_dimension_names_both),
        cmocka_unit_test(test_an_unknown_unit_is_named),
        cmocka_unit_test(test_a_time_stamp_is_not_a_duration),
        cmocka_unit_test(test_a_logarithmic_unit_is_not_a_number),
        cmocka_unit_test(test_a_number_inside_the_unit_is_refused),
        cmocka_unit_test(test_a_second_number_is_a_parse_error),
        cmocka_unit_test(test_non_numbers_are_parse_errors),
        cmocka_unit_test(test_nan_and_infinity_are_refused),
        cmocka_unit_test(test_overflow_and_underflow_are_range_errors),
        cmocka_unit_test(test_an_overlong_text_is_refused),
        cmocka_unit_test(test_an_alias_heavy_unit_that_expands_too_far_is_refused),
        cmocka_unit_test(test_parse_refuses_null_arguments_and_bad_dimensions),
        cmocka_unit_test(test_a_null_diagnostic_is_allowed),
        cmocka_unit_test(test_to_si_converts_a_value_in_a_unit),
        cmocka_unit_test(test_to_si_reports_the_same_errors_as_parse),
        cmocka_unit_test(test_to_si_refuses_null_arguments_bad_dimensions_and_non_finite_values),
        cmocka_unit_test(test_every_dimension_has_a_name_and_an_si_unit),
        cmocka_unit_test(test_every_dimension_si_unit_parses_back_to_one),
        cmocka_unit_test(test_alloc_refuses_a_null_out_pointer),
        cmocka_unit_test(test_alloc_and_free_release_everything),
        cmocka_unit_test(test_alloc_fails_cleanly_without_a_database),
        cmocka_unit_test(test_alloc_fails_cleanly_on_a_database_without_the_radian),
        cmocka_unit_test(test_alloc_fails_cleanly_on_a_database_without_the_kilogram),
        cmocka_unit_test(test_alloc_fails_cleanly_when_an_alias_is_undefined),
        cmocka_unit_test(test_deferred_alloc_refuses_a_null_out_pointer),
        cmocka_unit_test(test_deferred_alloc_reads_quantities_as_a_loaded_handle),
        cmocka_unit_test(test_deferred_alloc_without_a_database_fails_at_the_first_unit_read),
        cmocka_unit_test(test_deferred_alloc_without_a_database_fails_a_bare_number_with_the_load_error),
        cmocka_unit_test(test_a_suggested_unit_is_of_the_wanted_dimension),
        cmocka_unit_test(test_a_compass_letter_after_an_angle_is_explained),
        cmocka_unit_test(test_a_decimal_comma_is_explained),
        cmocka_unit_test(test_every_listed_unit_reads_as_its_dimension),
        cmocka_unit_test(test_the_reciprocal_of_a_unit_is_not_that_unit),
        cmocka_unit_test(test_values_converted_together_are_those_converted_one_by_one),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
