/*
 * test_atmosphere.c - the atmosphere models against the U.S. Standard
 * Atmosphere 1976 (NOAA-S/T 76-1562), Tables I and 2 (transcribed),
 * against the defining equations (hydrostatic law, ideal gas, virtual
 * temperature, Magnus), and every error path of plumb_atmosphere_alloc/_at.
 *
 * Table rows are checked to their printed precision, +-1 in the last
 * printed digit (the table is rounded there; each transcribed row was
 * re-derived from the standard's defining equations to that digit).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/atmosphere.h"
#include "plumb/constants.h"
#include "plumb_test.h"

/* Geometric altitude of geopotential height h_m, m (inverse of H = r0 z / (r0 + z)). */
static double geometric(double h_m)
{
    return PLUMB_R0_M * h_m / (PLUMB_R0_M - h_m);
}

static plumb_air std_at(double alt_m, double dt_k)
{
    plumb_air a;
    memset(&a, 0, sizeof a);
    assert_int_equal(plumb_std1976(alt_m, dt_k, &a), PLUMB_OK);
    return a;
}

static plumb_air model_at(const plumb_atmosphere *atm, double alt_m)
{
    plumb_air a;
    memset(&a, 0, sizeof a);
    assert_int_equal(plumb_atmosphere_at(atm, alt_m, &a), PLUMB_OK);
    return a;
}

static plumb_atmosphere *make(const plumb_atm_spec *spec)
{
    plumb_atmosphere *atm = NULL;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_status st = plumb_atmosphere_alloc(spec, &atm, &diag);
    if (st != PLUMB_OK)
        print_error("alloc failed: %s: %s\n", diag.key, diag.message);
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(atm);
    return atm;
}

/* Expects alloc to fail with status and diag key; checks *out is NULL. */
static void expect_refused(const plumb_atm_spec *spec, plumb_status status, const char *key)
{
    static char sentinel;
    plumb_atmosphere *atm = (plumb_atmosphere *)(void *)&sentinel; /* must become NULL */
    plumb_diag diag;
    plumb_diag_clear(&diag);
    assert_int_equal(plumb_atmosphere_alloc(spec, &atm, &diag), status);
    assert_null(atm);
    assert_int_equal(diag.status, status);
    assert_string_equal(diag.key, key);
    assert_true(diag.message[0] != '\0');
}

/* ---- U.S. Standard Atmosphere 1976, Table I --------------------------------- */

/* Source: U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), Table I,
 * geometric altitude (transcribed); each *_ulp is one unit in the last
 * printed digit. */
static const struct {
    double z_m, t_k, t_ulp, p_pa, p_ulp, rho, rho_ulp;
} table_i[] = {
    {0.0, 288.150, 0.001, 101325.0, 1.0, 1.2250, 0.0001},
    {1000.0, 281.651, 0.001, 89876.0, 1.0, 1.1117, 0.0001},
    {2000.0, 275.154, 0.001, 79501.0, 1.0, 1.0066, 0.0001},
    {5000.0, 255.676, 0.001, 54048.0, 1.0, 0.73643, 0.00001},
    {10000.0, 223.252, 0.001, 26499.0, 1.0, 0.41351, 0.00001},
    {11000.0, 216.774, 0.001, 22699.0, 1.0, 0.36480, 0.00001},
    {15000.0, 216.650, 0.001, 12111.0, 1.0, 0.19476, 0.00001},
    {20000.0, 216.650, 0.001, 5529.3, 0.1, 0.088910, 0.000001},
    {30000.0, 226.509, 0.001, 1197.0, 0.1, 0.018410, 0.000001},
    {32000.0, 228.490, 0.001, 889.06, 0.01, 0.013555, 0.000001},
    {50000.0, 270.650, 0.001, 79.779, 0.001, 1.0269e-3, 0.0001e-3},
    {86000.0, 186.87, 0.01, 0.37338, 0.00001, 6.958e-6, 0.001e-6},
};

static void test_every_table_i_row_matches_to_its_printed_precision(void **state)
{
    (void)state;
    for (size_t i = 0; i < sizeof table_i / sizeof table_i[0]; i++) {
        plumb_air a = std_at(table_i[i].z_m, 0.0);
        assert_abs(a.alt_m, table_i[i].z_m, 0.0);
        assert_abs(a.t_k, table_i[i].t_k, table_i[i].t_ulp);
        assert_abs(a.p_pa, table_i[i].p_pa, table_i[i].p_ulp);
        assert_abs(a.rho_kg_m3, table_i[i].rho, table_i[i].rho_ulp);
    }
}

/* The 86 km row (Table I) gives the kinetic temperature T = T_M M/M0 with
 * M/M0 = 0.999579 (Table 8, transcribed), while p and rho follow the
 * molecular-scale temperature T_M = 214.65 - 2.0 (84.852 - 71) = 186.946 K
 * (Table 4 layer 6). Without the ratio T would print as 186.95, not 186.87;
 * with rho = p / (R T) the density would print 6.961e-6, not 6.958e-6. */
static void test_86_km_row_needs_the_molecular_weight_ratio(void **state)
{
    (void)state;
    plumb_air a = std_at(PLUMB_STD1976_TOP_M, 0.0);
    double h = PLUMB_R0_M * PLUMB_STD1976_TOP_M / (PLUMB_R0_M + PLUMB_STD1976_TOP_M);
    double tm = 214.65 - 0.0020 * (h - 71000.0);   /* Table 4, layer 6 */
    assert_abs(tm, 186.946, 0.001);                /* Table 4 top, T_M = 186.946 K */
    assert_rel(a.t_k, tm * 0.999579, 1e-12);       /* Table 8 at 86 km */
    assert_rel(a.rho_kg_m3, a.p_pa / (PLUMB_RAIR_J_KG_K * tm), 1e-12);
    assert_true(fabs(a.p_pa / (PLUMB_RAIR_J_KG_K * a.t_k) - 6.958e-6) > 0.001e-6);
    /* Speed of sound from T_M: 274.10 m/s at 86 km (Table I, from memory). */
    assert_abs(a.a_m_s, 274.10, 0.01);
}

/* Below 80 km M/M0 = 1 exactly (Table 8 starts at 80 km). */
static void test_kinetic_and_molecular_temperature_agree_below_80_km(void **state)
{
    (void)state;
    plumb_air a = std_at(79999.0, 0.0);
    double h = PLUMB_R0_M * 79999.0 / (PLUMB_R0_M + 79999.0);
    assert_rel(a.t_k, 214.65 - 0.0020 * (h - 71000.0), 1e-13); /* Table 4 layer 6 */
    assert_rel(a.rho_kg_m3, a.p_pa / (PLUMB_RAIR_J_KG_K * a.t_k), 1e-14);
}

/* Base pressures P_b of NOAA-S/T 76-1562 Table 4 as printed (7 figures,
 * transcribed from several copies; one public copy has 3.956720 for the
 * 71 km' value) and the equations chained again here from p0. */
static void test_base_pressures_equal_the_layer_equations_chained_from_p0(void **state)
{
    (void)state;
    static const double hb[] = {0.0, 11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0,
                                84852.0};
    static const double lapse[] = {-0.0065, 0.0, 0.0010, 0.0028, 0.0, -0.0028, -0.0020};
    static const double printed[] = {101325.0, 22632.06, 5474.889, 868.0187,
                                     110.9063, 66.93887, 3.956420, 0.3733836};
    static const double printed_ulp[] = {1.0, 0.01, 0.001, 0.0001, 0.0001, 0.00001,
                                         0.000001, 0.0000001};
    double gmr = PLUMB_G0_M_S2 * PLUMB_M0_KG_KMOL / PLUMB_RSTAR_J_KMOL_K;
    double t = PLUMB_T0_K, p = PLUMB_P0_PA;
    for (size_t i = 0; i < 8; i++) {
        double z = geometric(hb[i]);
        plumb_air a = std_at(z, 0.0);
        assert_abs(a.p_pa, printed[i], printed_ulp[i]);
        assert_rel(a.p_pa, p, 1e-12);
        /* The top, 84 852 m', is geometric 85 999.95 m: M/M0 from Table 8's
         * 85.5 and 86 km rows, linearly. */
        double m_ratio = i < 7 ? 1.0 : 0.999579 + (0.999641 - 0.999579) * (86000.0 - z) / 500.0;
        assert_rel(a.t_k, t * m_ratio, 1e-12);
        if (i == 7)
            break;
        double dh = hb[i + 1] - hb[i], t1 = t + lapse[i] * dh;
        p = lapse[i] == 0.0 ? p * exp(-gmr * dh / t) : p * pow(t / t1, gmr / lapse[i]);
        t = t1;
    }
}

/* Table 4: T_M is continuous, with the listed lapse on each side of every
 * base; p is continuous (hydrostatic law, d ln p / dH = -g0 M0 / (R* T)).
 * Each side, taken eps from the base, is carried to the base to first order. */
static void test_temperature_and_pressure_are_continuous_across_every_layer_boundary(
    void **state)
{
    (void)state;
    static const double hb[] = {11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0};
    static const double lapse[] = {-0.0065, 0.0, 0.0010, 0.0028, 0.0, -0.0028, -0.0020};
    const double eps = 1e-6, step = 10.0; /* m' */
    double gmr = PLUMB_G0_M_S2 * PLUMB_M0_KG_KMOL / PLUMB_RSTAR_J_KMOL_K;
    for (size_t i = 0; i < 6; i++) {
        plumb_air below = std_at(geometric(hb[i] - eps), 0.0);
        plumb_air above = std_at(geometric(hb[i] + eps), 0.0);
        assert_abs(below.t_k + lapse[i] * eps, above.t_k - lapse[i + 1] * eps, 1e-10);
        assert_rel(below.p_pa * exp(-gmr * eps / below.t_k),
                   above.p_pa * exp(gmr * eps / above.t_k), 1e-12);
        plumb_air below2 = std_at(geometric(hb[i] - step), 0.0);
        plumb_air above2 = std_at(geometric(hb[i] + step), 0.0);
        assert_abs((below.t_k - below2.t_k) / (step - eps), lapse[i], 1e-9);
        assert_abs((above2.t_k - above.t_k) / (step - eps), lapse[i + 1], 1e-9);
    }
}

/* U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), noted with the
 * transcribed Table I (no separate status recorded): at geometric 11 019 m
 * (H = 11 000 m') rho = 0.363918,
 * which some copies wrongly list at "11000 m". H = 11 000 m' is geometric
 * 11 019.07 m; the density at geometric 11 000 m is Table I's 0.36480. */
static void test_density_at_11000_m_geopotential_is_not_the_11000_m_geometric_value(
    void **state)
{
    (void)state;
    double z = geometric(11000.0);
    assert_abs(z, 11019.07, 0.01);
    assert_abs(std_at(z, 0.0).rho_kg_m3, 0.363918, 0.000001);
    assert_abs(std_at(11000.0, 0.0).rho_kg_m3, 0.36480, 0.00001);  /* Table I */
}

/* mu(0) = 1.7894e-5 (Table 2), mu(5000 m) = 1.6282e-5 (Table I), both
 * transcribed (U.S. Standard Atmosphere 1976, NOAA-S/T 76-1562);
 * Sutherland's law, eq. 51. */
static void test_viscosity_matches_1976_at_sea_level_and_5_km(void **state)
{
    (void)state;
    assert_abs(std_at(0.0, 0.0).mu_pa_s, 1.7894e-5, 0.0001e-5);
    assert_abs(std_at(5000.0, 0.0).mu_pa_s, 1.6282e-5, 0.0001e-5);
    assert_abs(plumb_sutherland_viscosity(PLUMB_T0_K), 1.7894e-5, 0.0001e-5);
    /* eq. 51 itself, at 251.37 K */
    assert_rel(plumb_sutherland_viscosity(251.37),
               1.458e-6 * pow(251.37, 1.5) / (251.37 + 110.4), 1e-14);
}

/* Sea-level speed of sound 340.294 m/s (ICAO/1976 sea-level value, from
 * memory); a = sqrt(gamma R T). */
static void test_speed_of_sound_at_sea_level_is_340_294_m_s(void **state)
{
    (void)state;
    assert_abs(std_at(0.0, 0.0).a_m_s, 340.294, 0.001);
}

/* plumb/atmosphere.h: T = T_std + dT, p = p_std, rho = p / (R T), so rho
 * scales by T_std / (T_std + dT). */
static void test_temperature_offset_keeps_pressure_and_scales_density(void **state)
{
    (void)state;
    const double z[] = {-3456.7, 0.0, 3217.4, 15321.9, 47123.4, 79876.5};
    const double dt = 12.35;
    for (size_t i = 0; i < sizeof z / sizeof z[0]; i++) {
        plumb_air s = std_at(z[i], 0.0), w = std_at(z[i], dt), c = std_at(z[i], -dt);
        assert_rel(w.p_pa, s.p_pa, 1e-15);
        assert_rel(w.t_k, s.t_k + dt, 1e-15);
        assert_rel(w.rho_kg_m3, s.rho_kg_m3 * s.t_k / (s.t_k + dt), 1e-14);
        assert_rel(c.rho_kg_m3, s.rho_kg_m3 * s.t_k / (s.t_k - dt), 1e-14);
        assert_rel(w.mu_pa_s, plumb_sutherland_viscosity(s.t_k + dt), 1e-15);
    }
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.temperature_offset_k = dt;
    plumb_atmosphere *atm = make(&spec);
    plumb_air a = model_at(atm, 3217.4), b = std_at(3217.4, dt);
    assert_rel(a.rho_kg_m3, b.rho_kg_m3, 1e-15);
    assert_rel(a.t_k, b.t_k, 1e-15);
    plumb_atmosphere_free(atm);
}

static void test_default_spec_is_dry_standard_1976_over_minus_5_to_86_km(void **state)
{
    (void)state;
    plumb_atm_spec spec;
    memset(&spec, 0x5a, sizeof spec);
    plumb_atm_spec_init(&spec);
    assert_int_equal(spec.model, PLUMB_ATM_STD1976);
    assert_abs(spec.temperature_offset_k, 0.0, 0.0);
    assert_abs(spec.relative_humidity, 0.0, 0.0);
    assert_abs(spec.lapse_rate_k_m, 0.0065, 0.0); /* README.md "Profile keys" */
    assert_null(spec.table_alt_m);
    plumb_atmosphere *atm = make(&spec);
    double lo, hi;
    plumb_atmosphere_range(atm, &lo, &hi);
    assert_abs(lo, -5000.0, 0.0);
    assert_abs(hi, 86000.0, 0.0);
    plumb_air a = model_at(atm, 2000.0);
    assert_abs(a.rho_kg_m3, 1.0066, 0.0001); /* Table I */
    plumb_atmosphere_free(atm);
}

/* ---- surface model ---------------------------------------------------------- */

/* Given the 1976 sea-level values and lapse 6.5 K/km the surface model is
 * the 1976 troposphere (Table 4 layer 0) with geometric height in place of
 * geopotential height: surface(H) = 1976(z) where H = r0 z / (r0 + z). */
static void test_surface_model_with_1976_station_values_equals_1976(void **state)
{
    (void)state;
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_SURFACE;
    spec.station_alt_m = 0.0;
    spec.station_pressure_pa = PLUMB_P0_PA;
    spec.station_temperature_k = PLUMB_T0_K;
    plumb_atmosphere *atm = make(&spec);
    const double z[] = {-4321.5, 0.0, 137.2, 2345.6, 7890.1, 10999.0};
    for (size_t i = 0; i < sizeof z / sizeof z[0]; i++) {
        double h = PLUMB_R0_M * z[i] / (PLUMB_R0_M + z[i]);
        plumb_air s = model_at(atm, h), r = std_at(z[i], 0.0);
        assert_rel(s.t_k, r.t_k, 1e-13);
        assert_rel(s.p_pa, r.p_pa, 1e-12);
        assert_rel(s.rho_kg_m3, r.rho_kg_m3, 1e-12);
        assert_rel(s.mu_pa_s, r.mu_pa_s, 1e-12);
    }
    plumb_atmosphere_free(atm);
}

/* Closed form of atmosphere.h (dz geometric, see atmosphere.c) and the
 * hydrostatic law dp/dz = -rho g0 by central differences. */
static void test_surface_model_follows_closed_form_and_hydrostatic_law(void **state)
{
    (void)state;
    const double lapses[] = {0.0071, 0.0, -0.0042}; /* normal, isothermal, inversion */
    for (size_t k = 0; k < 3; k++) {
        plumb_atm_spec spec;
        plumb_atm_spec_init(&spec);
        spec.model = PLUMB_ATM_SURFACE;
        spec.station_alt_m = 1234.5;
        spec.station_pressure_pa = 87250.0;
        spec.station_temperature_k = 281.35;
        spec.lapse_rate_k_m = lapses[k];
        plumb_atmosphere *atm = make(&spec);
        double lo, hi;
        plumb_atmosphere_range(atm, &lo, &hi);
        assert_abs(lo, 1234.5 - 5000.0, 1e-9);
        assert_abs(hi, 1234.5 + 11000.0, 1e-9);
        const double z[] = {-2345.6, 1234.5, 1299.9, 3456.7, 9876.5};
        for (size_t i = 0; i < sizeof z / sizeof z[0]; i++) {
            plumb_air a = model_at(atm, z[i]);
            double dh = z[i] - 1234.5;
            double t = 281.35 - lapses[k] * dh;
            double p = lapses[k] == 0.0
                           ? 87250.0 * exp(-PLUMB_G0_M_S2 * dh / (PLUMB_RAIR_J_KG_K * 281.35))
                           : 87250.0 * pow(t / 281.35,
                                           PLUMB_G0_M_S2 / (PLUMB_RAIR_J_KG_K * lapses[k]));
            assert_rel(a.t_k, t, 1e-13);
            assert_rel(a.p_pa, p, 1e-12);
            assert_rel(a.rho_kg_m3, p / (PLUMB_RAIR_J_KG_K * t), 1e-12);
            const double d = 0.5;
            plumb_air up = model_at(atm, z[i] + d), dn = model_at(atm, z[i] - d);
            assert_rel((up.p_pa - dn.p_pa) / (2.0 * d), -a.rho_kg_m3 * PLUMB_G0_M_S2, 1e-8);
        }
        plumb_atmosphere_free(atm);
    }
}

/* ---- table model ------------------------------------------------------------ */

/* Linear interpolation in ln rho is exact for an exponential atmosphere
 * rho = rho0 exp(-z / Hs) (closed form). */
static void test_table_model_is_exact_for_an_exponential_atmosphere(void **state)
{
    (void)state;
    const double rho0 = 1.2173, hs = 8434.5;
    double alt[] = {-120.0, 1500.0, 4000.0, 9000.0};
    double rho[4];
    for (size_t i = 0; i < 4; i++)
        rho[i] = rho0 * exp(-alt[i] / hs);
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_TABLE;
    spec.table_n = 4;
    spec.table_alt_m = alt;
    spec.table_rho_kg_m3 = rho;
    plumb_atmosphere *atm = make(&spec);
    alt[1] = 777.0; /* the model holds its own copy (atmosphere.h ownership) */
    rho[2] = 5.0;
    double lo, hi;
    plumb_atmosphere_range(atm, &lo, &hi);
    assert_abs(lo, -120.0, 0.0);
    assert_abs(hi, 9000.0, 0.0);
    const double z[] = {-120.0, 0.0, 812.3, 1500.0, 2718.3, 6543.2, 9000.0};
    for (size_t i = 0; i < sizeof z / sizeof z[0]; i++) {
        plumb_air a = model_at(atm, z[i]);
        plumb_air s = std_at(z[i], 0.0); /* temperature from 1976 + 0 offset */
        assert_rel(a.rho_kg_m3, rho0 * exp(-z[i] / hs), 1e-12);
        assert_rel(a.t_k, s.t_k, 1e-15);
        assert_rel(a.p_pa, a.rho_kg_m3 * PLUMB_RAIR_J_KG_K * a.t_k, 1e-14);
    }
    plumb_atmosphere_free(atm);
}

/* Table temperatures: linear in altitude; p = rho R T (ideal gas). The
 * offset applies to 1976 temperatures only. */
static void test_table_model_uses_table_temperatures_when_given(void **state)
{
    (void)state;
    const double alt[] = {250.0, 1250.0, 3250.0};
    const double rho[] = {1.1873, 1.0791, 0.8812};
    const double t[] = {291.3, 287.9, 275.1};
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_TABLE;
    spec.table_n = 3;
    spec.table_alt_m = alt;
    spec.table_rho_kg_m3 = rho;
    spec.table_t_k = t;
    spec.temperature_offset_k = 7.5; /* not used with table temperatures */
    plumb_atmosphere *atm = make(&spec);
    plumb_air a = model_at(atm, 2000.0);
    double f = 750.0 / 2000.0;
    assert_rel(a.t_k, 287.9 + f * (275.1 - 287.9), 1e-14);
    assert_rel(a.rho_kg_m3, exp(log(1.0791) + f * (log(0.8812) - log(1.0791))), 1e-13);
    assert_rel(a.p_pa, a.rho_kg_m3 * PLUMB_RAIR_J_KG_K * a.t_k, 1e-14);
    assert_rel(a.mu_pa_s, plumb_sutherland_viscosity(a.t_k), 1e-15);
    plumb_air top = model_at(atm, 3250.0);
    assert_rel(top.rho_kg_m3, 0.8812, 1e-14);
    assert_rel(top.t_k, 275.1, 1e-15);
    plumb_atmosphere_free(atm);
}

/* ---- humidity ---------------------------------------------------------------- */

static double magnus_pa(double t_k)
{
    /* Alduchov & Eskridge 1996 (atmosphere.h): 6.1094 hPa exp(17.625 t / (t + 243.04)) */
    double t = t_k - 273.15;
    return 610.94 * exp(17.625 * t / (t + 243.04));
}

/* rho = p / (R Tv), Tv = T / (1 - (e/p)(1 - 0.622)), e = RH e_s(T) (atmosphere.h);
 * and the same density as the sum of the partial densities of dry air and
 * vapour (Dalton; M_w = 18.01528 kg/kmol, IUPAC), which differs only by
 * eps = 0.622 against M_w / M0 = 0.62198. */
static void test_humidity_lowers_density_as_virtual_temperature_says(void **state)
{
    (void)state;
    const double rh[] = {0.0, 0.37, 0.85, 1.0};
    for (size_t k = 0; k < 4; k++) {
        plumb_atm_spec spec;
        plumb_atm_spec_init(&spec);
        spec.relative_humidity = rh[k];
        spec.temperature_offset_k = 14.85; /* 30 deg C at sea level */
        plumb_atmosphere *atm = make(&spec);
        const double z[] = {0.0, 1234.5, 4321.0};
        for (size_t i = 0; i < 3; i++) {
            plumb_air a = model_at(atm, z[i]), d = std_at(z[i], 14.85);
            double e = rh[k] * magnus_pa(d.t_k);
            double tv = d.t_k / (1.0 - e / d.p_pa * (1.0 - 0.622));
            assert_rel(a.rho_kg_m3, d.p_pa / (PLUMB_RAIR_J_KG_K * tv), 1e-13);
            double rv = PLUMB_RSTAR_J_KMOL_K / 18.01528;
            double dalton = (d.p_pa - e) / (PLUMB_RAIR_J_KG_K * d.t_k) + e / (rv * d.t_k);
            assert_rel(a.rho_kg_m3, dalton, 1e-6);
            if (rh[k] > 0.0)
                assert_true(a.rho_kg_m3 < d.rho_kg_m3);
            assert_rel(a.t_k, d.t_k, 1e-15);         /* T itself unchanged */
            assert_rel(a.p_pa, d.p_pa, 1e-15);       /* p unchanged */
            assert_rel(a.mu_pa_s, d.mu_pa_s, 1e-15); /* viscosity from actual T */
        }
        plumb_atmosphere_free(atm);
    }
}

/* Saturated air at 20 deg C: the vapour pressure implied by the density
 * drop must be within the Magnus formula's stated 0.4 % (Alduchov &
 * Eskridge 1996, from memory) of 2339.3 Pa, the saturation vapour pressure
 * of water at 20 deg C (CRC Handbook of Chemistry and Physics, from memory). */
static void test_saturated_air_at_20_c_implies_the_handbook_vapour_pressure(void **state)
{
    (void)state;
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_SURFACE;
    spec.station_alt_m = 123.4;
    spec.station_pressure_pa = 100870.0;
    spec.station_temperature_k = 293.15;
    plumb_atmosphere *dry = make(&spec);
    spec.relative_humidity = 1.0;
    plumb_atmosphere *wet = make(&spec);
    plumb_air d = model_at(dry, 123.4), w = model_at(wet, 123.4);
    double e = d.p_pa * (1.0 - w.rho_kg_m3 / d.rho_kg_m3) / (1.0 - 0.622);
    assert_rel(e, 2339.3, 0.004);
    plumb_atmosphere_free(dry);
    plumb_atmosphere_free(wet);
}

/* The table model's density is that of dry air; humidity lowers it at the
 * same pressure (atmosphere.c). */
static void test_humidity_applies_to_the_table_model_at_constant_pressure(void **state)
{
    (void)state;
    const double alt[] = {0.0, 2000.0};
    const double rho[] = {1.2012, 0.9871};
    const double t[] = {296.4, 283.4};
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_TABLE;
    spec.table_n = 2;
    spec.table_alt_m = alt;
    spec.table_rho_kg_m3 = rho;
    spec.table_t_k = t;
    spec.relative_humidity = 0.64;
    plumb_atmosphere *atm = make(&spec);
    plumb_air a = model_at(atm, 0.0);
    double p = 1.2012 * PLUMB_RAIR_J_KG_K * 296.4;
    double tv = 296.4 / (1.0 - 0.64 * magnus_pa(296.4) / p * (1.0 - 0.622));
    assert_rel(a.p_pa, p, 1e-14);
    assert_rel(a.rho_kg_m3, p / (PLUMB_RAIR_J_KG_K * tv), 1e-13);
    plumb_atmosphere_free(atm);
}

/* ---- error paths ------------------------------------------------------------- */

static void test_out_of_range_altitudes_are_refused(void **state)
{
    (void)state;
    plumb_air a;
    assert_int_equal(plumb_std1976(-5000.0, 0.0, &a), PLUMB_OK);
    assert_int_equal(plumb_std1976(86000.0, 0.0, &a), PLUMB_OK);
    assert_int_equal(plumb_std1976(-5000.01, 0.0, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_std1976(86000.01, 0.0, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_std1976(NAN, 0.0, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_std1976(INFINITY, 0.0, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_std1976(100.0, NAN, &a), PLUMB_EINVAL);
    assert_int_equal(plumb_std1976(100.0, 0.0, NULL), PLUMB_EINVAL);

    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    plumb_atmosphere *atm = make(&spec);
    assert_int_equal(plumb_atmosphere_at(atm, 86000.5, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(atm, -5000.5, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(atm, NAN, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(atm, 10.0, NULL), PLUMB_EINVAL);
    assert_int_equal(plumb_atmosphere_at(NULL, 10.0, &a), PLUMB_EINVAL);
    plumb_atmosphere_free(atm);

    spec.model = PLUMB_ATM_SURFACE;
    spec.station_alt_m = 350.0;
    spec.station_pressure_pa = 97310.0;
    spec.station_temperature_k = 284.6;
    atm = make(&spec);
    assert_int_equal(plumb_atmosphere_at(atm, 350.0 - 5000.0, &a), PLUMB_OK);
    assert_int_equal(plumb_atmosphere_at(atm, 350.0 + 11000.0, &a), PLUMB_OK);
    assert_int_equal(plumb_atmosphere_at(atm, 350.0 - 5000.5, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(atm, 350.0 + 11000.5, &a), PLUMB_ERANGE);
    plumb_atmosphere_free(atm);

    const double alt[] = {100.0, 900.0}, rho[] = {1.21, 1.12};
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_TABLE;
    spec.table_n = 2;
    spec.table_alt_m = alt;
    spec.table_rho_kg_m3 = rho;
    atm = make(&spec);
    assert_int_equal(plumb_atmosphere_at(atm, 99.9, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(atm, 900.1, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_atmosphere_at(atm, 900.0, &a), PLUMB_OK);
    plumb_atmosphere_free(atm);
}

/* The coldest 1976 point is 86 km (186.87 K, Table I); between 10 and 25 km
 * the minimum, 216.65 K, lies inside the span at the 11 000 and 20 000 m'
 * boundaries (Table 4), not at its ends (223.25 K and 221.55 K). */
static void test_temperature_offset_that_freezes_below_0_k_is_refused(void **state)
{
    (void)state;
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.temperature_offset_k = -186.8;
    plumb_atmosphere *atm = make(&spec);
    plumb_atmosphere_free(atm);
    spec.temperature_offset_k = -186.9;
    expect_refused(&spec, PLUMB_ERANGE, "atmosphere.temperature_offset");
    spec.temperature_offset_k = NAN;
    expect_refused(&spec, PLUMB_EINVAL, "atmosphere.temperature_offset");

    plumb_air a;
    assert_int_equal(plumb_std1976(86000.0, -186.9, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_std1976(0.0, -288.15, &a), PLUMB_ERANGE);
    assert_int_equal(plumb_std1976(0.0, -288.0, &a), PLUMB_OK);

    const double alt[] = {10000.0, 25000.0}, rho[] = {0.4135, 0.0401};
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_TABLE;
    spec.table_n = 2;
    spec.table_alt_m = alt;
    spec.table_rho_kg_m3 = rho;
    spec.temperature_offset_k = -216.6;
    atm = make(&spec);
    plumb_atmosphere_free(atm);
    spec.temperature_offset_k = -220.0; /* positive at both ends, not inside */
    expect_refused(&spec, PLUMB_ERANGE, "atmosphere.temperature_offset");
}

static void test_bad_surface_values_are_refused_with_their_key(void **state)
{
    (void)state;
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_SURFACE;
    spec.station_alt_m = 350.0;
    spec.station_pressure_pa = 97310.0;
    spec.station_temperature_k = 284.6;
    plumb_atm_spec bad = spec;
    bad.station_pressure_pa = 0.0; /* the default: surface needs it given */
    expect_refused(&bad, PLUMB_ERANGE, "atmosphere.pressure");
    bad.station_pressure_pa = -97310.0;
    expect_refused(&bad, PLUMB_ERANGE, "atmosphere.pressure");
    bad.station_pressure_pa = INFINITY;
    expect_refused(&bad, PLUMB_EINVAL, "atmosphere.pressure");
    bad = spec;
    bad.station_temperature_k = 0.0;
    expect_refused(&bad, PLUMB_ERANGE, "atmosphere.temperature");
    bad.station_temperature_k = NAN;
    expect_refused(&bad, PLUMB_EINVAL, "atmosphere.temperature");
    bad = spec;
    bad.lapse_rate_k_m = NAN;
    expect_refused(&bad, PLUMB_EINVAL, "atmosphere.lapse_rate");
    bad.lapse_rate_k_m = 0.03; /* 284.6 K - 0.03 K/m x 11 km < 0 */
    expect_refused(&bad, PLUMB_ERANGE, "atmosphere.lapse_rate");
    bad.lapse_rate_k_m = -0.06; /* inversion: 284.6 K - 0.06 K/m x 5 km < 0 */
    expect_refused(&bad, PLUMB_ERANGE, "atmosphere.lapse_rate");
    bad = spec;
    bad.station_alt_m = 86000.5;
    expect_refused(&bad, PLUMB_ERANGE, "site.elevation");
    bad.station_alt_m = NAN;
    expect_refused(&bad, PLUMB_EINVAL, "site.elevation");
}

static void test_bad_tables_are_refused_with_the_table_key(void **state)
{
    (void)state;
    double alt[] = {100.0, 600.0, 1400.0};
    double rho[] = {1.213, 1.155, 1.067};
    double t[] = {287.5, 284.3, 279.1};
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.model = PLUMB_ATM_TABLE;
    spec.table_n = 3;
    spec.table_alt_m = alt;
    spec.table_rho_kg_m3 = rho;
    spec.table_t_k = t;
    plumb_atmosphere *atm = make(&spec);
    plumb_atmosphere_free(atm);

    const char *key = "atmosphere.table";
    plumb_atm_spec bad = spec;
    bad.table_n = 1;
    expect_refused(&bad, PLUMB_EINVAL, key);
    bad = spec;
    bad.table_alt_m = NULL;
    expect_refused(&bad, PLUMB_EINVAL, key);
    bad = spec;
    bad.table_rho_kg_m3 = NULL;
    expect_refused(&bad, PLUMB_EINVAL, key);

    alt[1] = 100.0; /* repeated altitude */
    expect_refused(&spec, PLUMB_EINVAL, key);
    alt[1] = 50.0; /* decreasing */
    expect_refused(&spec, PLUMB_EINVAL, key);
    alt[1] = NAN;
    expect_refused(&spec, PLUMB_EINVAL, key);
    alt[1] = 600.0;
    rho[2] = 0.0;
    expect_refused(&spec, PLUMB_EINVAL, key);
    rho[2] = -1.067;
    expect_refused(&spec, PLUMB_EINVAL, key);
    rho[2] = 1.067;
    t[0] = 0.0;
    expect_refused(&spec, PLUMB_EINVAL, key);
    t[0] = INFINITY;
    expect_refused(&spec, PLUMB_EINVAL, key);
    t[0] = 287.5;

    /* Without temperatures the table must lie inside the 1976 range. */
    double high[] = {80000.0, 90000.0}, thin[] = {1.8e-5, 3.4e-6};
    bad = spec;
    bad.table_n = 2;
    bad.table_alt_m = high;
    bad.table_rho_kg_m3 = thin;
    bad.table_t_k = NULL;
    expect_refused(&bad, PLUMB_ERANGE, key);
    double t_high[] = {198.6, 186.9};
    bad.table_t_k = t_high;
    atm = make(&bad); /* with temperatures it may */
    plumb_atmosphere_free(atm);
}

static void test_bad_humidity_model_and_arguments_are_refused(void **state)
{
    (void)state;
    plumb_atm_spec spec;
    plumb_atm_spec_init(&spec);
    spec.relative_humidity = -0.01;
    expect_refused(&spec, PLUMB_ERANGE, "atmosphere.humidity");
    spec.relative_humidity = 1.2;
    expect_refused(&spec, PLUMB_ERANGE, "atmosphere.humidity");
    spec.relative_humidity = NAN;
    expect_refused(&spec, PLUMB_EINVAL, "atmosphere.humidity");
    plumb_atm_spec_init(&spec);
    spec.model = (plumb_atm_model)7;
    expect_refused(&spec, PLUMB_EINVAL, "atmosphere.model");

    plumb_atmosphere *atm = NULL;
    plumb_diag diag;
    assert_int_equal(plumb_atmosphere_alloc(NULL, &atm, &diag), PLUMB_EINVAL);
    assert_null(atm);
    plumb_atm_spec_init(&spec);
    assert_int_equal(plumb_atmosphere_alloc(&spec, NULL, &diag), PLUMB_EINVAL);
    assert_int_equal(plumb_atmosphere_alloc(&spec, &atm, NULL), PLUMB_OK); /* diag optional */
    plumb_atmosphere_free(atm);
    plumb_atmosphere_free(NULL); /* a no-op */
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_every_table_i_row_matches_to_its_printed_precision),
        cmocka_unit_test(test_86_km_row_needs_the_molecular_weight_ratio),
        cmocka_unit_test(test_kinetic_and_molecular_temperature_agree_below_80_km),
        cmocka_unit_test(test_base_pressures_equal_the_layer_equations_chained_from_p0),
        cmocka_unit_test(
            test_temperature_and_pressure_are_continuous_across_every_layer_boundary),
        cmocka_unit_test(
            test_density_at_11000_m_geopotential_is_not_the_11000_m_geometric_value),
        cmocka_unit_test(test_viscosity_matches_1976_at_sea_level_and_5_km),
        cmocka_unit_test(test_speed_of_sound_at_sea_level_is_340_294_m_s),
        cmocka_unit_test(test_temperature_offset_keeps_pressure_and_scales_density),
        cmocka_unit_test(test_default_spec_is_dry_standard_1976_over_minus_5_to_86_km),
        cmocka_unit_test(test_surface_model_with_1976_station_values_equals_1976),
        cmocka_unit_test(test_surface_model_follows_closed_form_and_hydrostatic_law),
        cmocka_unit_test(test_table_model_is_exact_for_an_exponential_atmosphere),
        cmocka_unit_test(test_table_model_uses_table_temperatures_when_given),
        cmocka_unit_test(test_humidity_lowers_density_as_virtual_temperature_says),
        cmocka_unit_test(test_saturated_air_at_20_c_implies_the_handbook_vapour_pressure),
        cmocka_unit_test(test_humidity_applies_to_the_table_model_at_constant_pressure),
        cmocka_unit_test(test_out_of_range_altitudes_are_refused),
        cmocka_unit_test(test_temperature_offset_that_freezes_below_0_k_is_refused),
        cmocka_unit_test(test_bad_surface_values_are_refused_with_their_key),
        cmocka_unit_test(test_bad_tables_are_refused_with_the_table_key),
        cmocka_unit_test(test_bad_humidity_model_and_arguments_are_refused),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
