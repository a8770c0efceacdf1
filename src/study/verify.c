/*
 * verify.c - published reference checks of the built library
 * (include/plumb/verify.h). Each check computes its figure through the
 * library's public functions, as a program would.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "plumb/verify.h"
#include "plumb/atmosphere.h"
#include "plumb/constants.h"
#include "plumb/drag.h"
#include "plumb/gravity.h"
#include "plumb/inflation.h"
#include "plumb/trajectory.h"
#include "plumb/wind.h"
#include "core/internal.h"

static const char STD1976[] = "U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), Table I";

/* What a check asks of the 1976 atmosphere. */
enum { AIR_T, AIR_P, AIR_RHO, AIR_MU };

typedef struct check_def {
    const char *name;
    const char *source;
    const char *status;
    const char *unit;
    double published, tolerance;
    int kind;      /* which computation (the enum below) */
    double arg[2]; /* its inputs */
} check_def;

enum {
    K_AIR,        /* arg: altitude m, what (AIR_*) */
    K_GRAVITY,    /* arg: latitude deg */
    K_MORRISON,   /* arg: Re */
    K_PFLANZ,     /* arg: A, j */
    K_TERMINAL,   /* constant air: the fall's terminal speed */
    K_FALL_SPEED, /* constant air: impact speed after a drop of arg[0] m */
    K_FREE_SPEED, /* no drag: impact speed after arg[0] m */
    K_FREE_TIME   /* no drag: fall time of arg[0] m */
};

/* The fall of the closed-form checks: 2 kg with CdA 0.02 m^2 in air of
 * constant density 1.225 kg/m^3 at standard gravity, no wind. */
#define CF_MASS_KG 2.0
#define CF_CDA_M2 0.02
#define CF_RHO 1.225
#define CF_VT sqrt(2.0 * CF_MASS_KG * PLUMB_G0_M_S2 / (CF_RHO * CF_CDA_M2))
#define CF_SPEED(y) (CF_VT * sqrt(-expm1(-2.0 * PLUMB_G0_M_S2 * (y) / (CF_VT * CF_VT))))

static const check_def checks[] = {
    {"air density at 0 m", STD1976, "transcribed", "kg/m^3", 1.2250, 1e-4, K_AIR, {0.0, AIR_RHO}},
    {"air temperature at 1000 m", STD1976, "transcribed", "K", 281.651, 1e-3, K_AIR,
     {1000.0, AIR_T}},
    {"air pressure at 2000 m", STD1976, "transcribed", "Pa", 79501.0, 1.0, K_AIR,
     {2000.0, AIR_P}},
    {"air density at 11000 m", STD1976, "transcribed", "kg/m^3", 0.36480, 1e-5, K_AIR,
     {11000.0, AIR_RHO}},
    {"air pressure at 20000 m", STD1976, "transcribed", "Pa", 5529.3, 0.1, K_AIR,
     {20000.0, AIR_P}},
    {"air temperature at 32000 m", STD1976, "transcribed", "K", 228.490, 1e-3, K_AIR,
     {32000.0, AIR_T}},
    {"air density at 50000 m", STD1976, "transcribed", "kg/m^3", 1.0269e-3, 1e-7, K_AIR,
     {50000.0, AIR_RHO}},
    {"air density at 86000 m", STD1976, "transcribed", "kg/m^3", 6.958e-6, 1e-9, K_AIR,
     {86000.0, AIR_RHO}},
    {"air viscosity at 0 m", "U.S. Standard Atmosphere 1976 (NOAA-S/T 76-1562), Table 2",
     "transcribed", "Pa s", 1.7894e-5, 1e-9, K_AIR, {0.0, AIR_MU}},
    {"normal gravity at the equator", "WGS 84 (NIMA TR8350.2, eq. 4-1)", "transcribed", "m/s^2",
     9.7803253359, 1e-10, K_GRAVITY, {0.0, 0.0}},
    {"normal gravity at the pole", "WGS 84 (NIMA TR8350.2, eq. 4-1)", "transcribed", "m/s^2",
     9.8321849378, 1e-10, K_GRAVITY, {90.0, 0.0}},
    {"sphere drag coefficient at Re 200",
     "F. A. Morrison, Data Correlation for Drag Coefficient for Sphere (Michigan "
     "Technological University, 2010), eq. (1)", "transcribed", "",
     0.767731559965325, 1e-15, K_MORRISON, {200.0, 0.0}},
    {"Pflanz force-reduction factor X1 at A 1, j 1",
     "Knacke, NWC TP 6575 (1991), Pflanz's method; X1 from its closed form", "computed", "",
     0.4593, 1e-4, K_PFLANZ, {1.0, 1.0}},
    {"Pflanz force-reduction factor X1 at A 0.1, j 6",
     "Knacke, NWC TP 6575 (1991), Pflanz's method; X1 from its closed form", "computed", "",
     0.1880, 1e-4, K_PFLANZ, {0.1, 6.0}},
    {"terminal speed, 2 kg, CdA 0.02 m^2, 1.225 kg/m^3", "v_t = sqrt(2 m g / (rho Cd A))",
     "closed form", "m/s", 0.0, 1e-9, K_TERMINAL, {0.0, 0.0}},
    {"impact speed after 30 m, 2 kg, CdA 0.02 m^2, 1.225 kg/m^3",
     "v(y) = v_t sqrt(1 - exp(-2 g y / v_t^2))", "closed form", "m/s", 0.0, 1e-6,
     K_FALL_SPEED, {30.0, 0.0}},
    {"impact speed after 30 m without drag", "v = sqrt(2 g h)", "closed form", "m/s", 0.0, 1e-7,
     K_FREE_SPEED, {30.0, 0.0}},
    {"fall time of 30 m without drag", "t = sqrt(2 h / g)", "closed form", "s", 0.0, 1e-7,
     K_FREE_TIME, {30.0, 0.0}},
};
enum { N_CHECKS = sizeof checks / sizeof checks[0] };
_Static_assert((int)N_CHECKS <= (int)PLUMB_VERIFY_MAX, "PLUMB_VERIFY_MAX holds every check");

/* The closed forms' published values, computed here (not constants of
 * the table: sqrt and exp are not constant expressions). */
static double closed_form(const check_def *c)
{
    double h = c->arg[0];
    switch (c->kind) {
    case K_TERMINAL: return CF_VT;
    case K_FALL_SPEED: return CF_SPEED(h);
    case K_FREE_SPEED: return sqrt(2.0 * PLUMB_G0_M_S2 * h);
    case K_FREE_TIME: return sqrt(2.0 * h / PLUMB_G0_M_S2);
    default: return c->published;
    }
}

/* A fall of the closed-form checks: cda 0 for one without drag. */
static plumb_status closed_fall(double h_m, double cda_m2, plumb_fall_result *r, double *vt,
                                plumb_diag *diag)
{
    static const double alt[2] = {-1000.0, 5000.0};
    const double rho[2] = {CF_RHO, CF_RHO};
    plumb_atm_spec a;
    plumb_atm_spec_init(&a);
    a.model = PLUMB_ATM_TABLE;
    a.table_n = 2;
    a.table_alt_m = alt;
    a.table_rho_kg_m3 = rho;
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    s.mass_kg = CF_MASS_KG;
    s.drag.model = PLUMB_DRAG_FIXED;
    s.drag.cd_area_m2 = cda_m2;
    s.release_m[2] = h_m;
    plumb_wind_spec_init(&s.wind);
    plumb_atmosphere *atm = NULL;
    plumb_trajectory *w = NULL;
    plumb_status st = plumb_atmosphere_alloc(&a, &atm, diag);
    if (st == PLUMB_OK)
        st = plumb_trajectory_alloc(NULL, &w) == PLUMB_OK
                 ? PLUMB_OK
                 : PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    if (st == PLUMB_OK)
        st = plumb_trajectory_run(w, &s, atm, r, diag);
    if (st == PLUMB_OK && vt)
        st = plumb_terminal_speed(&s, atm, 0.0, 0, vt);
    plumb_trajectory_free(w);
    plumb_atmosphere_free(atm);
    return st;
}

static plumb_status compute(const check_def *c, double *out, plumb_diag *diag)
{
    plumb_air air;
    plumb_fall_result r;
    plumb_status st;
    switch (c->kind) {
    case K_AIR:
        if ((st = plumb_std1976(c->arg[0], 0.0, &air)) != PLUMB_OK)
            return PLUMB_RAISE(diag, st, "%s: %s", c->name, plumb_strerror(st));
        *out = c->arg[1] == AIR_T ? air.t_k
               : c->arg[1] == AIR_P ? air.p_pa
               : c->arg[1] == AIR_RHO ? air.rho_kg_m3
                                      : air.mu_pa_s;
        return PLUMB_OK;
    case K_GRAVITY: {
        plumb_gravity g = {1, c->arg[0]};
        *out = plumb_gravity_at(&g, 0.0);
        return PLUMB_OK;
    }
    case K_MORRISON: *out = plumb_drag_sphere_morrison(c->arg[0]); return PLUMB_OK;
    case K_PFLANZ: *out = plumb_pflanz_x1(c->arg[0], c->arg[1], NULL); return PLUMB_OK;
    case K_TERMINAL: return closed_fall(10.0, CF_CDA_M2, &r, out, diag);
    case K_FALL_SPEED:
        st = closed_fall(c->arg[0], CF_CDA_M2, &r, NULL, diag);
        *out = r.speed_m_s;
        return st;
    default:
        st = closed_fall(c->arg[0], 0.0, &r, NULL, diag);
        *out = c->kind == K_FREE_SPEED ? r.speed_m_s : r.time_s;
        return st;
    }
}

plumb_status plumb_verify(plumb_check *out, size_t max, size_t *n, plumb_diag *diag)
{
    if (!out || !n)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_verify: NULL argument");
    *n = 0;
    for (size_t i = 0; i < N_CHECKS && i < max; i++) {
        const check_def *c = &checks[i];
        plumb_check *k = &out[i];
        memset(k, 0, sizeof *k);
        plumbp_strlcpy(k->name, c->name, sizeof k->name);
        plumbp_strlcpy(k->source, c->source, sizeof k->source);
        k->status = c->status;
        k->unit = c->unit;
        k->published = closed_form(c);
        k->tolerance = c->tolerance;
        plumb_status st = compute(c, &k->computed, diag);
        if (st != PLUMB_OK)
            return st;
        k->passed = isfinite(k->computed) && fabs(k->computed - k->published) <= k->tolerance;
        *n = i + 1;
    }
    return PLUMB_OK;
}
