/*
 * trajectory_terminal.c - the terminal speed of a body falling through
 * still air: the lowest root of the drag balance, with Brent's method
 * (GSL gsl_root_fsolver_brent, gsl_min_fminimizer_brent) over the
 * stretches of the drag curve (plumb_terminal_speed), and the bound on
 * the time a fall takes that follows from it (plumbp_traj_outlasts_budget).
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "physics/trajectory_int.h"

/* ---- terminal speed ------------------------------------------------------- */

/* The drag balance B(v) = 1/2 rho CdA(Re(v)) v^2 - m g (1 - rho V / m) of a
 * body falling through still air. With fixed drag it has one root, in
 * closed form. With Cd(Re) it may have several in the drag crisis (a 50 mm
 * steel ball in sea-level air, Clift-Grace-Weber curve: 93.72, 101.96 and
 * 209.41 m/s). A body falling from rest accelerates while B < 0 and so
 * settles at the lowest root: that is the terminal speed. It is found by
 * walking up from v = 0 over the stretches where Cd Re^2 cannot decrease
 * (one root at most: Brent's method on the stretch when B changes sign
 * over it) and scanning the crisis intervals of the drag curve
 * (plumbp_drag_crisis) at a ratio of CRISIS_SCAN_RATIO, with a local
 * maximum of the samples refined (Brent minimisation of -B) so that a pair
 * of roots closer than the scan step is not missed. */
#define CRISIS_SCAN_RATIO 1.001
#define ROOT_MAX_ITER 200
#define ROOT_REL_TOL 1e-14
#define TERMINAL_MAX_M_S PLUMB_TERMINAL_MAX_M_S

typedef struct term_ctx {
    const plumb_fall_spec *spec;
    plumb_air air;
    double g_net_m_s2;   /* g (1 - rho V / m) */
    double extra_m2;     /* device CdS */
} term_ctx;

static double term_balance(double v, void *p)
{
    const term_ctx *c = p;
    double re = c->air.rho_kg_m3 * v * c->spec->drag.diameter_m / c->air.mu_pa_s;
    double cda = plumb_drag_cd_area(&c->spec->drag, re) + c->extra_m2;
    return 0.5 * c->air.rho_kg_m3 * cda * v * v - c->spec->mass_kg * c->g_net_m_s2;
}

static double term_neg_balance(double v, void *p)
{
    return -term_balance(v, p);
}

/* The root of B in [lo, hi], where B(lo) < 0 <= B(hi). */
static plumb_status term_bracketed(term_ctx *c, gsl_root_fsolver *s, double lo, double hi,
                                   double *v_m_s)
{
    if (term_balance(hi, c) == 0.0) {
        *v_m_s = hi;
        return PLUMB_OK;
    }
    gsl_function F = {term_balance, c};
    int rc = gsl_root_fsolver_set(s, &F, lo, hi);
    for (int it = 0; rc == GSL_SUCCESS && it < ROOT_MAX_ITER; it++) {
        rc = gsl_root_fsolver_iterate(s);
        if (rc != GSL_SUCCESS)
            break;
        rc = gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s),
                                    0.0, ROOT_REL_TOL);
        if (rc == GSL_SUCCESS)
            break;
        if (rc == GSL_CONTINUE)
            rc = GSL_SUCCESS;
    }
    if (rc != GSL_SUCCESS)
        return PLUMB_RAISE(NULL, PLUMB_ENUMERIC, "terminal speed root finder failed: %s",
                           gsl_strerror(rc));
    *v_m_s = gsl_root_fsolver_root(s);
    return PLUMB_OK;
}

/* The largest B on [a, b] around the sample m (B(m) >= B(a), B(b)), by
 * Brent minimisation of -B; *at is where. */
static double term_local_max(term_ctx *c, gsl_min_fminimizer *mz, double a, double m, double b,
                             double *at)
{
    gsl_function F = {term_neg_balance, c};
    double fm = term_neg_balance(m, c);
    *at = m;
    if (!(fm < term_neg_balance(a, c) && fm < term_neg_balance(b, c)))
        return -fm; /* flat to rounding: the sample is the maximum */
    int rc = gsl_min_fminimizer_set_with_values(mz, &F, m, fm, a, term_neg_balance(a, c), b,
                                                term_neg_balance(b, c));
    for (int it = 0; rc == GSL_SUCCESS && it < ROOT_MAX_ITER; it++) {
        rc = gsl_min_fminimizer_iterate(mz);
        if (rc != GSL_SUCCESS)
            break;
        if (-gsl_min_fminimizer_f_minimum(mz) >= 0.0)
            break;
        rc = gsl_min_test_interval(gsl_min_fminimizer_x_lower(mz), gsl_min_fminimizer_x_upper(mz),
                                   0.0, ROOT_REL_TOL);
        if (rc == GSL_SUCCESS)
            break;
        if (rc == GSL_CONTINUE)
            rc = GSL_SUCCESS;
    }
    *at = gsl_min_fminimizer_x_minimum(mz);
    return -gsl_min_fminimizer_f_minimum(mz);
}

/* The lowest root of the drag balance (see above) into *v_m_s, which may
 * lie above TERMINAL_MAX_M_S (the caller checks). */
static plumb_status terminal_root(const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                                  double z_m, unsigned devices, gsl_root_fsolver *root,
                                  gsl_min_fminimizer *mz, double *v_m_s)
{
    term_ctx c = {.spec = spec};
    double alt = spec->site_elevation_m + z_m;
    if (plumb_atmosphere_at(atm, alt, &c.air) != PLUMB_OK)
        return PLUMB_RAISE(NULL, PLUMB_EOUTSIDE, "altitude %.1f m is outside the atmosphere model", alt);
    double g = plumb_gravity_at(&spec->gravity, alt);
    c.g_net_m_s2 = g * (1.0 - c.air.rho_kg_m3 * spec->volume_m3 / spec->mass_kg);
    for (size_t i = 0; i < spec->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        if (!(devices & (1u << i)))
            continue;
        if (i + 1 < spec->n_descent && (devices & (1u << (i + 1))) &&
            spec->descent[i + 1].disreefs_previous)
            continue; /* replaced by the next device, open too */
        c.extra_m2 += spec->descent[i].cd * spec->descent[i].area_m2;
    }
    if (!(c.g_net_m_s2 > 0.0))
        return PLUMB_RAISE(NULL, PLUMB_ENOLAND, "buoyancy exceeds weight: no terminal speed");
    if (spec->drag.model == PLUMB_DRAG_FIXED) {
        double cda = plumb_drag_given_cd_area(&spec->drag) + c.extra_m2;
        if (!(cda > 0.0))
            return PLUMB_RAISE(NULL, PLUMB_ENOSOLUTION, "no drag: no terminal speed");
        *v_m_s = sqrt(2.0 * spec->mass_kg * c.g_net_m_s2 / (c.air.rho_kg_m3 * cda));
        return PLUMB_OK;
    }
    /* v per unit Re */
    double v_per_re = c.air.mu_pa_s / (c.air.rho_kg_m3 * spec->drag.diameter_m);
    const double (*crisis)[2];
    size_t n = plumbp_drag_crisis(spec->drag.model, &crisis);
    double lo = 0.0; /* B(lo) < 0 */
    for (size_t i = 0; i < n; i++) {
        double a = crisis[i][0] * v_per_re, b = crisis[i][1] * v_per_re;
        if (term_balance(a, &c) >= 0.0)
            return term_bracketed(&c, root, lo, a, v_m_s); /* one root on [lo, a] */
        /* scan the crisis interval */
        double xp = a, fp = term_balance(a, &c), x0 = a, f0 = fp;
        for (int last = 0; !last;) {
            double x1 = x0 * CRISIS_SCAN_RATIO;
            if (x1 >= b) {
                x1 = b;
                last = 1;
            }
            double f1 = term_balance(x1, &c);
            if (f1 >= 0.0)
                return term_bracketed(&c, root, x0, x1, v_m_s);
            if (x0 > xp && f0 > fp && f0 >= f1) {
                double at, top = term_local_max(&c, mz, xp, x0, x1, &at);
                if (top >= 0.0)
                    return term_bracketed(&c, root, xp, at, v_m_s);
            }
            xp = x0;
            fp = f0;
            x0 = x1;
            f0 = f1;
        }
        lo = b;
    }
    double hi = lo > 0.0 ? 2.0 * lo : 1.0;
    while (term_balance(hi, &c) < 0.0 && hi < TERMINAL_MAX_M_S) {
        lo = hi;
        hi *= 2.0;
    }
    if (term_balance(hi, &c) < 0.0)
        return PLUMB_RAISE(NULL, PLUMB_ENOSOLUTION, "terminal speed above %g m/s", TERMINAL_MAX_M_S);
    return term_bracketed(&c, root, lo, hi, v_m_s);
}

/* trajectory.h: a body with no drag, or with so little that it balances
 * the weight only above TERMINAL_MAX_M_S (a CdA of 1e-20 m^2; one so
 * small that the closed form overflows), has no terminal speed:
 * PLUMB_ENOSOLUTION, never a huge number, *v_m_s untouched. */
plumb_status plumbp_traj_terminal_speed(const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                                        double z_m, unsigned devices, gsl_root_fsolver *root,
                                        gsl_min_fminimizer *mz, double *v_m_s)
{
    double v = 0.0;
    plumb_status st = terminal_root(spec, atm, z_m, devices, root, mz, &v);
    if (st != PLUMB_OK)
        return st;
    if (!(v <= TERMINAL_MAX_M_S))
        return PLUMB_RAISE(NULL, PLUMB_ENOSOLUTION, "too little drag: no terminal speed up to %g m/s",
                           TERMINAL_MAX_M_S);
    *v_m_s = v;
    return PLUMB_OK;
}

plumb_status plumb_terminal_speed(const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                                  double z_m, int with_devices, double *v_m_s)
{
    gsl_root_fsolver *root = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    gsl_min_fminimizer *mz = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    unsigned all = with_devices ? PLUMBP_ALL_DEVICES : 0u;
    plumb_status st = root && mz ? plumbp_traj_terminal_speed(spec, atm, z_m, all, root, mz, v_m_s)
                                 : PLUMB_RAISE(NULL, PLUMB_ENOMEM, "out of memory");
    if (root)
        gsl_root_fsolver_free(root);
    if (mz)
        gsl_min_fminimizer_free(mz);
    return st;
}

/* ---- a fall too slow for its budget ------------------------------------- */

/* Heights sampled for the thinnest air of a path (a table atmosphere need
 * not thin upward everywhere). */
#define OUTLAST_SAMPLES 64

/* The least time a fall of spec can take in air of density rho_kg_m3 or
 * more everywhere on its path (see plumbp_traj_outlasts_budget); *vt_m_s the terminal
 * speed in that air. */
static double least_fall_time(const plumb_fall_spec *spec, double cda, double g,
                              double rho_kg_m3, double *vt_m_s)
{
    double vt = sqrt(2.0 * spec->mass_kg * g / (rho_kg_m3 * cda));
    const double *v = spec->velocity_m_s;
    double s0sq = v[0] * v[0] + v[1] * v[1] + v[2] * v[2];
    double d0 = s0sq > 2.0 * vt * vt ? vt * vt / (2.0 * g) * log(s0sq / (vt * vt) - 1.0) : 0.0;
    *vt_m_s = vt;
    return (spec->release_m[2] - d0) / (M_SQRT2 * vt);
}

/* A fall that cannot end within the time budget, known before it is
 * integrated: a feather-light object in deep air would otherwise run both
 * methods to their budgets (seconds of work) before failing. Only where a
 * bound is rigorous: fixed drag, still air vertically (no rotor wake, no
 * gusts). Descending at speed s, the drag is at least 1/2 rho CdA s^2 (the
 * relative speed is at least the vertical one), so with g the largest
 * gravity of the path (at the strike level) and v_t = sqrt(2 m g /
 * (rho CdA)) in the thinnest air of the path, ds/dt <= g (1 - s^2 / v_t^2)
 * (buoyancy and devices only slow it). A start faster than sqrt 2 v_t
 * slows to it within d0 = v_t^2 / (2 g) ln(s0^2 / v_t^2 - 1), and the
 * speed never climbs back above it; so the fall of H takes at least
 * (H - d0) / (sqrt 2 v_t). The air at the top of the path is tried first
 * (one look, the thinnest in any air that thins upward); only a fall that
 * outlasts the budget there has its path's air sampled. 1 when the fall
 * cannot end in time; *t_min_s and *vt_m_s then say why. */
int plumbp_traj_outlasts_budget(const plumb_trajectory_options *opt, const plumb_fall_spec *spec,
                                const plumb_atmosphere *atm, double *t_min_s, double *vt_m_s)
{
    if (spec->drag.model != PLUMB_DRAG_FIXED || spec->turbulence.n_modes > 0 ||
        (spec->downwash.aircraft_mass_kg > 0.0 && spec->downwash.disk_area_m2 > 0.0))
        return 0;
    double cda = plumb_drag_given_cd_area(&spec->drag);
    double H = spec->release_m[2];
    if (!(cda > 0.0) || !(H > 0.0))
        return 0;
    double g = plumb_gravity_at(&spec->gravity, spec->site_elevation_m);
    double up = spec->velocity_m_s[2] > 0.0 ? spec->velocity_m_s[2] : 0.0;
    double top = H + up * up / (2.0 * g); /* no higher than a drag-free rise */
    plumb_air air;
    if (plumb_atmosphere_at(atm, spec->site_elevation_m + top, &air) != PLUMB_OK)
        return 0;
    double rho = air.rho_kg_m3;
    if (!(least_fall_time(spec, cda, g, rho, vt_m_s) > opt->max_time_s))
        return 0;
    for (int i = 0; i < OUTLAST_SAMPLES; i++) {
        if (plumb_atmosphere_at(atm, spec->site_elevation_m + top * i / OUTLAST_SAMPLES, &air) !=
            PLUMB_OK)
            return 0;
        rho = fmin(rho, air.rho_kg_m3);
    }
    double t_min = least_fall_time(spec, cda, g, rho, vt_m_s);
    if (!isfinite(t_min) || t_min <= opt->max_time_s)
        return 0;
    *t_min_s = t_min;
    return 1;
}
