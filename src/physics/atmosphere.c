/*
 * atmosphere.c - air properties by geometric altitude (plumb/atmosphere.h).
 *
 * Sources:
 *  - U.S. Standard Atmosphere 1976, NOAA-S/T 76-1562: constants of Table 2
 *    (include/plumb/constants.h), the seven layers of Table 4 below 86 km,
 *    geopotential H = r0 z / (r0 + z), the hydrostatic layer equations
 *    (T_M = T_b + L (H - H_b); p as in plumb/atmosphere.h), density
 *    rho = p M0 / (R* T_M), speed of sound a = sqrt(gamma R* T_M / M0),
 *    Sutherland viscosity eq. 51 mu = beta T^1.5 / (T + S) (other equation
 *    numbers are not quoted: not confirmed here).
 *  - Above 80 km the 1976 tables give the kinetic temperature
 *    T = T_M (M / M0), with the molecular-weight ratio M/M0 of Table 8
 *    (80 km to 86 km every 0.5 km, transcribed; linear between rows, our
 *    choice). Pressure, density and sound speed follow T_M, viscosity T.
 *    At 86 km: T_M = 186.946 K, T = 186.87 K (Table I); rho = p / (R T_M)
 *    = 6.958e-6 kg/m^3 matches Table I, p / (R T) = 6.961e-6 would not.
 *  - Saturation vapour pressure over water: Magnus form of O. A. Alduchov
 *    and R. E. Eskridge, J. Appl. Meteor. 35 (1996) 601-609:
 *    e_s = 610.94 Pa exp(17.625 t / (t + 243.04)), t in deg C (their stated
 *    error, under 0.4 % from -40 to +50 deg C, from memory).
 *  - Virtual temperature Tv = T / (1 - (e/p)(1 - eps)): J. M. Wallace and
 *    P. V. Hobbs, Atmospheric Science, 2nd ed. (2006), section 3.1.
 *
 * Decisions (the header leaves them open):
 *  - Base pressures: the 1976 equations chained from p0 = 101325 Pa in
 *    IEEE double, written out to 17 digits below (they agree with the
 *    standard's printed P_b: 22632.06, 5474.889, 868.0187, 110.9063,
 *    66.93887, 3.956420 Pa); tests/test_atmosphere.c re-derives them.
 *  - A temperature offset dT adds to T and T_M alike; rho = p / (R (T_M + dT)).
 *  - Humidity uses e = RH e_s(T), capped at p (vapour cannot exceed the total
 *    pressure), and Tv from T_M; e_s is 0 below the Magnus pole (T < 30 K).
 *  - surface: dz is the geometric height above the station, the height the
 *    profile's lapse rate is quoted per (as README.md "The model" states
 *    it), with the hydrostatic law at constant g0. Given the 1976
 *    sea-level values it is the 1976 troposphere with geometric height in
 *    place of geopotential height (a difference of dz^2 / r0: 0.16 m at
 *    1 km).
 *    Its range is the 1976 range cut to 5 km below and 11 km above the
 *    station: one lapse rate describes at most a troposphere. The offset is
 *    not used (the station temperature is the measured one).
 *  - table: the tabulated density is that of dry air at the table's (or the
 *    1976 + offset) temperature; p = rho R T; humidity then lowers the density
 *    at that pressure. With table temperatures the offset is not used; they
 *    are interpolated linearly in altitude.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_interp.h>

#include "plumb/atmosphere.h"
#include "plumb/constants.h"
#include "core/internal.h"
#include "physics/physics.h"

/* surface model: how far below and above the station it is valid, m (our
 * choice: the 1976 tables' depth below sea level, and one troposphere). */
#define ATM_SURFACE_BELOW_M (-PLUMB_STD1976_BOTTOM_M)
#define ATM_SURFACE_ABOVE_M 11000.0
/* Default lapse rate of the surface model, K/m (US Std Atm 1976, layer 0). */
#define ATM_DEFAULT_LAPSE_K_M 0.0065
/* Magnus constants over water (Alduchov & Eskridge 1996): Pa, -, deg C. */
#define ATM_MAGNUS_E0_PA 610.94
#define ATM_MAGNUS_A 17.625
#define ATM_MAGNUS_B_C 243.04

/* g0 M0 / R* = g0 / R, K per geopotential metre (hydrostatic exponent). */
#define ATM_GMR (PLUMB_G0_M_S2 / PLUMB_RAIR_J_KG_K)

/* One 1976 layer: base geopotential height, base molecular-scale
 * temperature, base pressure, lapse rate dT_M/dH. */
typedef struct atm_layer {
    double h_m;       /* base geopotential height, m' */
    double t_k;       /* base molecular-scale temperature, K */
    double p_pa;      /* base pressure, Pa */
    double lapse_k_m; /* dT_M/dH, K/m' */
} atm_layer;

/* NOAA-S/T 76-1562 Table 4 (H_b, L_M,b); T_b from the lapses; P_b chained
 * from p0 by eqs. 33a/33b in IEEE double (see the file comment). The top of
 * the last layer is 84 852 m' = 86 km geometric. */
static const atm_layer std_layers[] = {
    {0.0, 288.15, 101325.0, -0.0065},
    {11000.0, 216.65, 22632.063973462933, 0.0},
    {20000.0, 216.65, 5474.8886696777799, 0.0010},
    {32000.0, 228.65, 868.01868475522883, 0.0028},
    {47000.0, 270.65, 110.90630555496621, 0.0},
    {51000.0, 270.65, 66.938873118687454, -0.0028},
    {71000.0, 214.65, 3.9564204280407447, -0.0020},
};
#define ATM_N_LAYERS (sizeof std_layers / sizeof std_layers[0])

/* NOAA-S/T 76-1562 Table 8: M/M0 at geometric 80.0, 80.5, ... 86.0 km (transcribed). */
static const double std_m_ratio[] = {
    1.000000, 0.999996, 0.999989, 0.999971, 0.999941, 0.999909, 0.999870,
    0.999829, 0.999786, 0.999741, 0.999694, 0.999641, 0.999579,
};
#define ATM_M_RATIO_BASE_M 80000.0
#define ATM_M_RATIO_STEP_M 500.0
#define ATM_N_M_RATIO (sizeof std_m_ratio / sizeof std_m_ratio[0])

struct plumb_atmosphere {
    plumb_atm_model model;
    double lo_m, hi_m;       /* valid range, geometric m above MSL */
    double dt_k;             /* standard-1976, table without T: offset, K */
    double rh;               /* relative humidity 0..1 */
    double st_h_m;           /* surface: station altitude, m */
    double st_p_pa;          /* surface: station pressure, Pa */
    double st_t_k;           /* surface: station temperature, K */
    double lapse_k_m;        /* surface: temperature fall per metre of height, K/m */
    double st_exponent;      /* surface: g0 / (R L), when L != 0 */
    size_t n;                /* table: rows */
    double *alt_m;           /* table: altitudes, m (owns the block below) */
    double *ln_rho;          /* table: ln of density, points into alt_m's block */
    double *t_k;             /* table: temperatures K, or NULL; into alt_m's block */
    gsl_interp *rho_interp;  /* table: linear interpolant of ln rho */
    gsl_interp *t_interp;    /* table: linear interpolant of T, or NULL */
};

static double geopotential_m(double alt_m)
{
    return PLUMB_R0_M * alt_m / (PLUMB_R0_M + alt_m);
}

static double geometric_m(double h_m)
{
    return PLUMB_R0_M * h_m / (PLUMB_R0_M - h_m);
}

/* M/M0 at geometric alt_m (1 below 80 km). */
static double std_m_ratio_at(double alt_m)
{
    if (alt_m <= ATM_M_RATIO_BASE_M)
        return 1.0;
    double x = (alt_m - ATM_M_RATIO_BASE_M) / ATM_M_RATIO_STEP_M;
    size_t k = (size_t)x;
    if (k > ATM_N_M_RATIO - 2)
        k = ATM_N_M_RATIO - 2;
    double f = x - (double)k;
    return std_m_ratio[k] + f * (std_m_ratio[k + 1] - std_m_ratio[k]);
}

/* A caller's pow(x, e) taken beside the air's own (plumbp_atmosphere_at_pow). */
typedef struct side_pow {
    double x, e;
    double *out;
} side_pow;

/* Dry 1976 state at geometric alt_m (assumed in range): molecular-scale
 * temperature, kinetic temperature, pressure. A side pow (sp, may be
 * NULL) is issued right after the pressure's, so that the processor
 * overlaps the two. */
static void std1976_dry(double alt_m, double *tm_k, double *t_k, double *p_pa,
                        const side_pow *sp)
{
    double h = geopotential_m(alt_m);
    /* the highest layer whose base is at or below h, else the first:
     * searched upward, as most falls stay in the lowest layer (the same
     * layer as a downward search for every h but NaN, which the callers
     * never pass: they check the range) */
    size_t i = 0;
    while (i + 1 < ATM_N_LAYERS && h >= std_layers[i + 1].h_m)
        i++;
    const atm_layer *b = &std_layers[i];
    double dh = h - b->h_m;
    double tm = b->t_k + b->lapse_k_m * dh;
    if (b->lapse_k_m == 0.0)
        *p_pa = b->p_pa * exp(-ATM_GMR * dh / b->t_k);
    else
        *p_pa = b->p_pa * pow(b->t_k / tm, ATM_GMR / b->lapse_k_m);
    if (sp)
        *sp->out = pow(sp->x, sp->e);
    *tm_k = tm;
    *t_k = tm * std_m_ratio_at(alt_m);
}

/* Saturation vapour pressure over water at t_k, Pa (Magnus, A&E 1996). */
static double magnus_pa(double t_k)
{
    double t_c = t_k - PLUMB_CELSIUS_ZERO_K;
    if (t_c <= -ATM_MAGNUS_B_C)
        return 0.0;
    return ATM_MAGNUS_E0_PA * exp(ATM_MAGNUS_A * t_c / (t_c + ATM_MAGNUS_B_C));
}

/* Fills out from the actual temperature t_k, the temperature tm_k that
 * carries the equation of state (T_M in the 1976 model, else t_k), the
 * pressure and the relative humidity. */
static void air_fill(double alt_m, double t_k, double tm_k, double p_pa, double rh,
                     plumb_air *out)
{
    double tv = tm_k;
    if (rh > 0.0) {
        double e = rh * magnus_pa(t_k);
        if (e > p_pa)
            e = p_pa;
        tv = tm_k / (1.0 - (e / p_pa) * (1.0 - PLUMB_EPSILON_VAPOUR));
    }
    out->alt_m = alt_m;
    out->t_k = t_k;
    out->p_pa = p_pa;
    out->rho_kg_m3 = p_pa / (PLUMB_RAIR_J_KG_K * tv);
    out->mu_pa_s = plumb_sutherland_viscosity(t_k);
    out->a_m_s = sqrt(PLUMB_GAMMA_AIR * PLUMB_RAIR_J_KG_K * tm_k);
}

static int in_range(double x, double lo, double hi)
{
    return x >= lo && x <= hi; /* false for NaN */
}

static plumb_status std1976_air(double alt_m, double dt_k, double rh, plumb_air *out,
                                const side_pow *sp)
{
    if (!in_range(alt_m, PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M))
        return PLUMB_RAISE(NULL, PLUMB_ERANGE, "altitude outside the 1976 model's %g..%g m",
                           PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M);
    double tm, t, p;
    std1976_dry(alt_m, &tm, &t, &p, sp);
    t += dt_k;
    tm += dt_k;
    if (!(t > 0.0))
        return PLUMB_RAISE(NULL, PLUMB_ERANGE, "temperature not positive at %.1f m", alt_m);
    air_fill(alt_m, t, tm, p, rh, out);
    return PLUMB_OK;
}

plumb_status plumb_std1976(double alt_m, double dt_k, plumb_air *out)
{
    if (!out || !isfinite(dt_k))
        return PLUMB_RAISE(NULL, PLUMB_EINVAL, "plumb_std1976: NULL output or non-finite offset");
    return std1976_air(alt_m, dt_k, 0.0, out, NULL);
}

double plumb_sutherland_viscosity(double t_k)
{
    return PLUMB_SUTHERLAND_BETA * t_k * sqrt(t_k) / (t_k + PLUMB_SUTHERLAND_S_K);
}

void plumb_atm_spec_init(plumb_atm_spec *spec)
{
    memset(spec, 0, sizeof *spec);
    spec->model = PLUMB_ATM_STD1976;
    spec->lapse_rate_k_m = ATM_DEFAULT_LAPSE_K_M;
    spec->table_t_k = NULL;
    spec->table_alt_m = NULL;
    spec->table_rho_kg_m3 = NULL;
}

/* ---- validation ---------------------------------------------------------- */

/* Checks that the 1976 temperature plus dt_k stays positive over [lo, hi]:
 * T is piecewise monotonic, so its minimum lies at an end or at a layer
 * boundary. */
static plumb_status check_offset(double dt_k, double lo_m, double hi_m, plumb_diag *diag)
{
    if (!isfinite(dt_k))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "atmosphere.temperature_offset",
                               "expected a finite temperature offset");
    double at[ATM_N_LAYERS + 2];
    size_t n = 0;
    at[n++] = lo_m;
    at[n++] = hi_m;
    for (size_t i = 1; i < ATM_N_LAYERS; i++) {
        double z = geometric_m(std_layers[i].h_m);
        if (z > lo_m && z < hi_m)
            at[n++] = z;
    }
    for (size_t i = 0; i < n; i++) {
        double tm, t, p;
        std1976_dry(at[i], &tm, &t, &p, NULL);
        if (!(t + dt_k > 0.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, "atmosphere.temperature_offset",
                                   "an offset of %g K makes the temperature %g K at %.0f m; "
                                   "it must stay above 0 K",
                                   dt_k, t + dt_k, at[i]);
    }
    return PLUMB_OK;
}

static plumb_status check_positive(double x, const char *key, const char *what,
                                   const char *unit, plumb_diag *diag)
{
    if (!isfinite(x))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key, "expected a finite %s", what);
    if (!(x > 0.0))
        return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, key, "expected a %s > 0 %s, found %g %s",
                               what, unit, x, unit);
    return PLUMB_OK;
}

static plumb_status setup_surface(const plumb_atm_spec *s, plumb_atmosphere *a,
                                  plumb_diag *diag)
{
    plumb_status st;
    if (!isfinite(s->station_alt_m))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "site.elevation",
                               "expected a finite station altitude");
    if (!in_range(s->station_alt_m, PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M))
        return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, "site.elevation",
                               "expected a station altitude within %g..%g m, found %g m",
                               PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M, s->station_alt_m);
    if ((st = check_positive(s->station_pressure_pa, "atmosphere.pressure",
                             "station pressure", "Pa", diag)) != PLUMB_OK)
        return st;
    if ((st = check_positive(s->station_temperature_k, "atmosphere.temperature",
                             "station temperature", "K", diag)) != PLUMB_OK)
        return st;
    if (!isfinite(s->lapse_rate_k_m))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "atmosphere.lapse_rate",
                               "expected a finite lapse rate");
    a->lo_m = fmax(s->station_alt_m - ATM_SURFACE_BELOW_M, PLUMB_STD1976_BOTTOM_M);
    a->hi_m = fmin(s->station_alt_m + ATM_SURFACE_ABOVE_M, PLUMB_STD1976_TOP_M);
    a->st_h_m = s->station_alt_m;
    a->st_p_pa = s->station_pressure_pa;
    a->st_t_k = s->station_temperature_k;
    a->lapse_k_m = s->lapse_rate_k_m;
    if (a->lapse_k_m != 0.0)
        a->st_exponent = PLUMB_G0_M_S2 / (PLUMB_RAIR_J_KG_K * a->lapse_k_m);
    const double ends[2] = {a->lo_m, a->hi_m};
    for (size_t i = 0; i < 2; i++) {
        double t = a->st_t_k - a->lapse_k_m * (ends[i] - a->st_h_m);
        if (!(t > 0.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, "atmosphere.lapse_rate",
                                   "a lapse rate of %g K/m from %g K makes the temperature "
                                   "%g K at %.0f m (the model spans %.0f..%.0f m); it must "
                                   "stay above 0 K",
                                   a->lapse_k_m, a->st_t_k, t, ends[i], a->lo_m, a->hi_m);
    }
    return PLUMB_OK;
}

static plumb_status setup_table(const plumb_atm_spec *s, plumb_atmosphere *a, plumb_diag *diag)
{
    const char *key = "atmosphere.table";
    size_t n = s->table_n;
    if (n < 2 || !s->table_alt_m || !s->table_rho_kg_m3)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                               "expected at least 2 rows of altitude and density, found %zu",
                               n);
    for (size_t i = 0; i < n; i++) {
        double z = s->table_alt_m[i], rho = s->table_rho_kg_m3[i];
        if (!isfinite(z) || !isfinite(rho) || (s->table_t_k && !isfinite(s->table_t_k[i])))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                                   "row %zu: expected finite numbers", i + 1);
        if (i > 0 && !(z > s->table_alt_m[i - 1]))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                                   "row %zu: altitudes must increase strictly, found %g m "
                                   "after %g m",
                                   i + 1, z, s->table_alt_m[i - 1]);
        if (!(rho > 0.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                                   "row %zu: expected a density > 0 kg/m^3, found %g kg/m^3",
                                   i + 1, rho);
        if (s->table_t_k && !(s->table_t_k[i] > 0.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                                   "row %zu: expected a temperature > 0 K, found %g K", i + 1,
                                   s->table_t_k[i]);
    }
    a->lo_m = s->table_alt_m[0];
    a->hi_m = s->table_alt_m[n - 1];
    if (!s->table_t_k) {
        if (!in_range(a->lo_m, PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M) ||
            !in_range(a->hi_m, PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M))
            return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, key,
                                   "without temperatures the table must lie within the 1976 "
                                   "model's %g..%g m, found %g..%g m",
                                   PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M, a->lo_m, a->hi_m);
        plumb_status st = check_offset(s->temperature_offset_k, a->lo_m, a->hi_m, diag);
        if (st != PLUMB_OK)
            return st;
        a->dt_k = s->temperature_offset_k;
    }

    size_t cols = s->table_t_k ? 3 : 2;
    a->alt_m = malloc(cols * n * sizeof *a->alt_m);
    a->rho_interp = gsl_interp_alloc(gsl_interp_linear, n);
    if (s->table_t_k)
        a->t_interp = gsl_interp_alloc(gsl_interp_linear, n);
    if (!a->alt_m || !a->rho_interp || (s->table_t_k && !a->t_interp))
        return PLUMB_RAISE_KEY(diag, PLUMB_ENOMEM, key, "out of memory for a %zu-row table", n);
    a->n = n;
    a->ln_rho = a->alt_m + n;
    memcpy(a->alt_m, s->table_alt_m, n * sizeof *a->alt_m);
    for (size_t i = 0; i < n; i++)
        a->ln_rho[i] = log(s->table_rho_kg_m3[i]);
    int rc = gsl_interp_init(a->rho_interp, a->alt_m, a->ln_rho, n);
    if (rc == GSL_SUCCESS && s->table_t_k) {
        a->t_k = a->alt_m + 2 * n;
        memcpy(a->t_k, s->table_t_k, n * sizeof *a->t_k);
        rc = gsl_interp_init(a->t_interp, a->alt_m, a->t_k, n);
    }
    if (rc != GSL_SUCCESS)
        return PLUMB_RAISE_KEY(diag, PLUMB_ENUMERIC, key, "GSL interpolation setup failed: %s",
                               gsl_strerror(rc));
    return PLUMB_OK;
}

plumb_status plumb_atmosphere_alloc(const plumb_atm_spec *spec, plumb_atmosphere **out,
                                    plumb_diag *diag)
{
    if (!out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_atmosphere_alloc: out is NULL");
    *out = NULL;
    if (!spec)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_atmosphere_alloc: spec is NULL");
    if (!isfinite(spec->relative_humidity))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "atmosphere.humidity",
                               "expected a finite relative humidity");
    if (!in_range(spec->relative_humidity, 0.0, 1.0))
        return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, "atmosphere.humidity",
                               "expected a relative humidity from 0 to 1 (0 to 100 %%), "
                               "found %g",
                               spec->relative_humidity);

    plumb_atmosphere *a = calloc(1, sizeof *a);
    if (!a)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory for an atmosphere");
    a->model = spec->model;
    a->rh = spec->relative_humidity;
    plumb_status st;
    switch (spec->model) {
    case PLUMB_ATM_STD1976:
        a->lo_m = PLUMB_STD1976_BOTTOM_M;
        a->hi_m = PLUMB_STD1976_TOP_M;
        a->dt_k = spec->temperature_offset_k;
        st = check_offset(spec->temperature_offset_k, a->lo_m, a->hi_m, diag);
        break;
    case PLUMB_ATM_SURFACE:
        st = setup_surface(spec, a, diag);
        break;
    case PLUMB_ATM_TABLE:
        st = setup_table(spec, a, diag);
        break;
    default:
        st = PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "atmosphere.model",
                             "expected standard-1976, surface or table");
        break;
    }
    if (st != PLUMB_OK) {
        plumb_atmosphere_free(a);
        return st;
    }
    *out = a;
    return PLUMB_OK;
}

void plumb_atmosphere_free(plumb_atmosphere *atm)
{
    if (!atm)
        return;
    if (atm->rho_interp)
        gsl_interp_free(atm->rho_interp);
    if (atm->t_interp)
        gsl_interp_free(atm->t_interp);
    free(atm->alt_m);
    free(atm);
}

void plumb_atmosphere_range(const plumb_atmosphere *atm, double *lo_m, double *hi_m)
{
    if (lo_m)
        *lo_m = atm->lo_m;
    if (hi_m)
        *hi_m = atm->hi_m;
}

/* ---- evaluation (called at every ODE right-hand side) ---------------------- */

static plumb_status surface_air(const plumb_atmosphere *a, double alt_m, plumb_air *out)
{
    double dh = alt_m - a->st_h_m;
    double t = a->st_t_k - a->lapse_k_m * dh;
    if (!(t > 0.0))
        return PLUMB_RAISE(NULL, PLUMB_ERANGE, "temperature not positive at %.1f m", alt_m);
    double p;
    if (a->lapse_k_m == 0.0)
        p = a->st_p_pa * exp(-PLUMB_G0_M_S2 * dh / (PLUMB_RAIR_J_KG_K * a->st_t_k));
    else
        p = a->st_p_pa * pow(t / a->st_t_k, a->st_exponent);
    air_fill(alt_m, t, t, p, a->rh, out);
    return PLUMB_OK;
}

static plumb_status table_air(const plumb_atmosphere *a, double alt_m, plumb_air *out)
{
    double ln_rho, t, tm;
    int rc = gsl_interp_eval_e(a->rho_interp, a->alt_m, a->ln_rho, alt_m, NULL, &ln_rho);
    if (rc != GSL_SUCCESS)
        return PLUMB_RAISE(NULL, PLUMB_ENUMERIC, "table density interpolation failed: %s",
                           gsl_strerror(rc));
    if (a->t_interp) {
        rc = gsl_interp_eval_e(a->t_interp, a->alt_m, a->t_k, alt_m, NULL, &t);
        if (rc != GSL_SUCCESS)
            return PLUMB_RAISE(NULL, PLUMB_ENUMERIC,
                               "table temperature interpolation failed: %s", gsl_strerror(rc));
        tm = t;
    } else {
        double p_std;
        std1976_dry(alt_m, &tm, &t, &p_std, NULL);
        t += a->dt_k;
        tm += a->dt_k;
    }
    if (!(t > 0.0))
        return PLUMB_RAISE(NULL, PLUMB_ERANGE, "temperature not positive at %.1f m", alt_m);
    double p = exp(ln_rho) * PLUMB_RAIR_J_KG_K * tm;
    air_fill(alt_m, t, tm, p, a->rh, out);
    return PLUMB_OK;
}

plumb_status plumbp_atmosphere_at_pow(const plumb_atmosphere *atm, double alt_m, double x,
                                      double e, plumb_air *out, double *x_pow_e)
{
    if (atm && out && atm->model == PLUMB_ATM_STD1976 && in_range(alt_m, atm->lo_m, atm->hi_m) &&
        in_range(alt_m, PLUMB_STD1976_BOTTOM_M, PLUMB_STD1976_TOP_M)) {
        side_pow sp = {x, e, x_pow_e};
        return std1976_air(alt_m, atm->dt_k, atm->rh, out, &sp);
    }
    *x_pow_e = pow(x, e);
    return plumb_atmosphere_at(atm, alt_m, out);
}

plumb_status plumb_atmosphere_at(const plumb_atmosphere *atm, double alt_m, plumb_air *out)
{
    if (!atm || !out)
        return PLUMB_RAISE(NULL, PLUMB_EINVAL, "plumb_atmosphere_at: NULL argument");
    if (!in_range(alt_m, atm->lo_m, atm->hi_m))
        return PLUMB_RAISE(NULL, PLUMB_ERANGE, "altitude outside the model's %.0f..%.0f m",
                           atm->lo_m, atm->hi_m);
    switch (atm->model) {
    case PLUMB_ATM_SURFACE:
        return surface_air(atm, alt_m, out);
    case PLUMB_ATM_TABLE:
        return table_air(atm, alt_m, out);
    case PLUMB_ATM_STD1976:
    default:
        return std1976_air(alt_m, atm->dt_k, atm->rh, out, NULL);
    }
}
