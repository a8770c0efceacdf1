/*
 * trajectory.c - the 3-D fall of a point mass through moving air
 * (design.md section 2; equations in include/plumb/trajectory.h).
 *
 * Method: GSL gsl_odeiv2 evolve/control/step (rk8pd by default: Prince &
 * Dormand, J. Comp. Appl. Math. 7, 1981) over segments bounded by the
 * events of the fall: a descent device's line stretch (at a known time, or
 * when the height falls below a trigger), the end of its filling, and the
 * strike level. A height event is located by Henon's method (M. Henon,
 * Physica D 5, 412-414, 1982): the step that crossed it is undone and the
 * system is integrated with the height as independent variable from the
 * last point above to exactly the event height. The apex of an upward
 * throw is located the same way with the vertical velocity as independent
 * variable.
 *
 * State y: x, y, z (m), vx, vy, vz (m/s), W (J, work done by drag).
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_roots.h>

#include "plumb/constants.h"
#include "plumb/trajectory.h"
#include "core/internal.h"
#include "physics/physics.h"

#define NSTATE 7
enum { IX = 0, IY, IZ, IVX, IVY, IVZ, IW };

/* Height of the start of the Henon phase above the event may not be
 * reached with an upward or level velocity: the step before is halved
 * until the object is descending. Bounded. */
#define MAX_HALVINGS 60
/* Power-law wind: height below which the fall ends in Henon's s variable. */
#ifndef GROUND_SWITCH_M
#define GROUND_SWITCH_M 5.0
#endif
/* Height at which the wind is taken for the right-hand side at or below
 * the strike level (see local_at), m: far below any step the integrator
 * resolves, yet positive. */
#define WIND_Z_MIN_M 1e-9
/* Location of the peak opening force: Brent iterations and time tolerance, s. */
#define PEAK_MAX_ITER 100
#define PEAK_ABS_TOL_S 1e-9
/* Fraction of the predicted time to an event covered by the approach step. */
#define APPROACH_FRACTION 0.9
/* A rise this far above the drag-free apex means the object is buoyant. */
#define RISE_MARGIN_M 1.0

static double body_cda(const plumb_drag_spec *d);
typedef struct fall_ctx fall_ctx;
static void ctx_init(fall_ctx *c, const plumb_fall_spec *spec, const plumb_atmosphere *atm);

/* ---- per-run context of the right-hand side ---------------------------- */

typedef struct device_state {
    int deployed;        /* line stretch reached */
    int removed;         /* replaced by the next device */
    double t_ls_s;       /* line-stretch time */
    double fill_s;       /* fill time */
    double cds_m2;       /* full canopy CdS */
    double j;            /* inflation exponent */
} device_state;

struct fall_ctx {
    const plumb_fall_spec *spec;
    const plumb_atmosphere *atm;
    double inv_m;               /* 1 / mass */
    double body_cda_m2;         /* fixed-model CdA */
    int sphere;                 /* 1: Cd(Re) sphere model */
    double air_lo_m, air_hi_m;  /* altitudes the air model covers */
    int wind_table;             /* 1: table wind, components looked up */
    double wind_dir[2];         /* else: east, north components of a unit wind */
    size_t n_dev;
    device_state dev[PLUMB_MAX_DESCENT];
    size_t evals;               /* RHS evaluations */
    plumb_status fail;          /* set when the RHS cannot be evaluated */
    double fail_alt_m;
    double vt_max_m_s;          /* fixed drag: largest body terminal speed at the accepted points */
};

static void ctx_init(fall_ctx *c, const plumb_fall_spec *spec, const plumb_atmosphere *atm)
{
    memset(c, 0, sizeof *c);
    c->spec = spec;
    c->atm = atm;
    c->inv_m = 1.0 / spec->mass_kg;
    c->body_cda_m2 = body_cda(&spec->drag);
    c->sphere = spec->drag.model != PLUMB_DRAG_FIXED;
    c->n_dev = spec->n_descent;
    c->wind_table = spec->wind.profile == PLUMB_WIND_TABLE;
    plumb_atmosphere_range(atm, &c->air_lo_m, &c->air_hi_m);
    plumb_wind_components(1.0, spec->wind.from_deg, &c->wind_dir[0], &c->wind_dir[1]);
}

/* Local air, relative velocity and drag acceleration at (t, y). */
typedef struct local {
    plumb_air air;
    double g;
    double vr[3];
    double vr_abs;
    double re;
    double cda;
} local;

static double devices_cds(const fall_ctx *c, double t)
{
    double s = 0.0;
    for (size_t i = 0; i < c->n_dev; i++) {
        const device_state *d = &c->dev[i];
        if (!d->deployed || d->removed || t < d->t_ls_s)
            continue;
        double f = d->fill_s > 0.0 ? (t - d->t_ls_s) / d->fill_s : 1.0;
        s += d->cds_m2 * plumb_inflation_fraction(f, d->j);
    }
    return s;
}

static int local_at(fall_ctx *c, double t, const double y[], local *L)
{
    const plumb_fall_spec *s = c->spec;
    double alt = s->site_elevation_m + y[IZ];
    if (!(alt >= c->air_lo_m && alt <= c->air_hi_m)) {
        /* A trial stage of a long step (or a stage past the strike level)
         * can leave the air model's range: it gets the air at the nearest
         * edge, so the stepper's error control, not a failed evaluation,
         * rejects the step. Accepted points are checked in observe(). */
        alt = alt < c->air_lo_m ? c->air_lo_m : alt > c->air_hi_m ? c->air_hi_m : NAN;
        if (isnan(alt))
            return GSL_EDOM; /* a stage of an unstable step overflowed: retry shorter */
    }
    if (plumb_atmosphere_at(c->atm, alt, &L->air) != PLUMB_OK) {
        c->fail = PLUMB_EOUTSIDE;
        c->fail_alt_m = alt;
        return GSL_EDOM;
    }
    L->g = plumb_gravity_at(&s->gravity, alt);
    /* The wind is calm at and below the strike level, but only the path
     * above it is ever used: at z <= 0 (the impact point itself, and trial
     * stages past it) the right-hand side takes the wind just above the
     * ground, so that a wind that does not vanish there (uniform, table)
     * gives no jump for the stepper to resolve at the very end of the fall
     * (measured: 1003 evaluations became 449 for the benchmark drone case
     * in uniform wind). The integrated path is the same. */
    double zw = y[IZ] > WIND_Z_MIN_M ? y[IZ] : WIND_Z_MIN_M;
    double we, wn;
    if (c->wind_table) {
        plumb_wind_at(&s->wind, zw, &we, &wn);
    } else {
        double w = plumb_wind_speed_at(&s->wind, zw);
        we = w * c->wind_dir[0];
        wn = w * c->wind_dir[1];
    }
    L->vr[0] = y[IVX] - we;
    L->vr[1] = y[IVY] - wn;
    L->vr[2] = y[IVZ];
    L->vr_abs = sqrt(L->vr[0] * L->vr[0] + L->vr[1] * L->vr[1] + L->vr[2] * L->vr[2]);
    if (c->sphere) {
        L->re = L->air.rho_kg_m3 * L->vr_abs * s->drag.diameter_m / L->air.mu_pa_s;
        L->cda = plumb_drag_cd_area(&s->drag, L->re);
    } else {
        L->re = 0.0;
        L->cda = c->body_cda_m2;
    }
    if (c->n_dev)
        L->cda += devices_cds(c, t);
    return GSL_SUCCESS;
}

static int rhs_time(double t, const double y[], double f[], void *params)
{
    fall_ctx *c = params;
    local L;
    c->evals++;
    int rc = local_at(c, t, y, &L);
    if (rc != GSL_SUCCESS)
        return rc;
    if (!isfinite(L.vr_abs) || !isfinite(y[IVZ]))
        return GSL_EDOM; /* as above: retry shorter */
    double k = 0.5 * L.air.rho_kg_m3 * L.cda * L.vr_abs * c->inv_m;
    f[IX] = y[IVX];
    f[IY] = y[IVY];
    f[IZ] = y[IVZ];
    f[IVX] = -k * L.vr[0];
    f[IVY] = -k * L.vr[1];
    f[IVZ] = -k * L.vr[2] - L.g + L.air.rho_kg_m3 * c->spec->volume_m3 * L.g * c->inv_m;
    f[IW] = -k * (L.vr[0] * y[IVX] + L.vr[1] * y[IVY] + L.vr[2] * y[IVZ]) / c->inv_m;
    return GSL_SUCCESS;
}

int plumbp_fall_rhs(const plumb_fall_spec *spec, const plumb_atmosphere *atm, double t_s,
                    const double y[NSTATE], double f[NSTATE])
{
    fall_ctx c;
    ctx_init(&c, spec, atm);
    return rhs_time(t_s, y, f, &c);
}

/* Finite-difference Jacobian for the implicit stepper (msbdf). */
static int jac_time(double t, const double y[], double *dfdy, double dfdt[], void *params)
{
    double f0[NSTATE], f1[NSTATE], yp[NSTATE];
    if (rhs_time(t, y, f0, params) != GSL_SUCCESS)
        return GSL_EBADFUNC;
    for (int j = 0; j < NSTATE; j++) {
        memcpy(yp, y, sizeof yp);
        double h = 1e-7 * (fabs(y[j]) + 1.0);
        yp[j] += h;
        if (rhs_time(t, yp, f1, params) != GSL_SUCCESS)
            return GSL_EBADFUNC;
        for (int i = 0; i < NSTATE; i++)
            dfdy[i * NSTATE + j] = (f1[i] - f0[i]) / h;
    }
    double ht = 1e-7 * (fabs(t) + 1.0);
    if (rhs_time(t + ht, y, f1, params) != GSL_SUCCESS)
        return GSL_EBADFUNC;
    for (int i = 0; i < NSTATE; i++)
        dfdt[i] = (f1[i] - f0[i]) / ht;
    return GSL_SUCCESS;
}

/* Henon's system: independent variable s = y[k]; state u = y with u[k]
 * replaced by the time t. du/ds = f / f[k], du[k]/ds = 1 / f[k]. */
/* With a power-law wind w ~ z^alpha the shear is unbounded at the ground,
 * and a stepper in z crawls toward it. Substituting z = target + s^m with
 * m = 1/alpha makes w ~ s, smooth: d(state)/ds = d(state)/dz m s^(m-1).
 * (m = 1 is Henon's plain form.) */
typedef struct henon_ctx {
    fall_ctx *fall;
    int k;
    double target;   /* the event value of y[k] */
    double m;        /* z = target + s^m; 1 for the plain form (s = y[k]) */
} henon_ctx;

static int rhs_henon(double s, const double u[], double du[], void *params)
{
    henon_ctx *h = params;
    double y[NSTATE], f[NSTATE];
    memcpy(y, u, sizeof y);
    double dyds = 1.0;
    if (h->m == 1.0) {
        y[h->k] = s;
    } else {
        double sm1 = s > 0.0 ? pow(s, h->m - 1.0) : 0.0;
        y[h->k] = h->target + sm1 * s;
        dyds = h->m * sm1;
    }
    double t = u[h->k];
    int rc = rhs_time(t, y, f, h->fall);
    if (rc != GSL_SUCCESS)
        return rc;
    if (f[h->k] == 0.0)
        return GSL_EBADFUNC;
    double inv = dyds / f[h->k];
    for (int i = 0; i < NSTATE; i++)
        du[i] = f[i] * inv;
    du[h->k] = inv;
    return GSL_SUCCESS;
}

const char *plumb_descent_kind_name(plumb_descent_kind kind)
{
    switch (kind) {
    case PLUMB_DESCENT_STREAMER: return "streamer";
    case PLUMB_DESCENT_DROGUE: return "drogue";
    case PLUMB_DESCENT_PARACHUTE:
    default: return "parachute";
    }
}

/* ---- workspace ------------------------------------------------------------ */

struct plumb_trajectory {
    plumb_trajectory_options opt;
    fall_ctx ctx;                  /* the run's right-hand-side context */
    gsl_odeiv2_system sys;         /* rhs_time over ctx */
    gsl_odeiv2_driver *msbdf;      /* msbdf needs a driver; its evolve/control are used */
    gsl_odeiv2_step *step[2];      /* rk8pd, rkf45 */
    gsl_odeiv2_control *control;
    gsl_odeiv2_evolve *evolve;
    gsl_odeiv2_step *side_step;    /* rk8pd for Henon phases and halvings */
    gsl_odeiv2_control *side_control;
    gsl_odeiv2_evolve *side_evolve;
    gsl_root_fsolver *root;        /* terminal speed: Brent root finder */
    gsl_min_fminimizer *min;       /* terminal speed: Brent minimiser */
    plumb_path_point *path;
    size_t path_n, path_cap;
};

void plumb_trajectory_options_init(plumb_trajectory_options *opt)
{
    opt->stepper = PLUMB_STEPPER_AUTO;
    opt->rel_tol = 1e-9;
    opt->abs_tol = 1e-12;
    opt->event_rel_tol = 1e-10;
    opt->event_abs_tol = 1e-10;
    opt->first_step_s = 1e-3;
    opt->max_steps = 2000000;
    opt->max_time_s = 86400.0;
    opt->stiff_ratio = 3000.0;
    opt->stiff_rel_tol = 1e-12;
    opt->stiff_abs_tol = 1e-14;
    opt->energy_check_tol = 1e-8;
    opt->speed_check_tol = 1e-9;
    opt->record_path = 0;
}

void plumb_trajectory_free(plumb_trajectory *traj)
{
    if (!traj)
        return;
    for (int i = 0; i < 2; i++)
        if (traj->step[i])
            gsl_odeiv2_step_free(traj->step[i]);
    if (traj->msbdf)
        gsl_odeiv2_driver_free(traj->msbdf);
    if (traj->control)
        gsl_odeiv2_control_free(traj->control);
    if (traj->evolve)
        gsl_odeiv2_evolve_free(traj->evolve);
    if (traj->side_step)
        gsl_odeiv2_step_free(traj->side_step);
    if (traj->side_control)
        gsl_odeiv2_control_free(traj->side_control);
    if (traj->side_evolve)
        gsl_odeiv2_evolve_free(traj->side_evolve);
    if (traj->root)
        gsl_root_fsolver_free(traj->root);
    if (traj->min)
        gsl_min_fminimizer_free(traj->min);
    free(traj->path);
    free(traj);
}

plumb_status plumb_trajectory_alloc(const plumb_trajectory_options *opt, plumb_trajectory **out)
{
    *out = NULL;
    plumb_trajectory *t = calloc(1, sizeof *t);
    if (!t)
        return PLUMB_RAISE(NULL, PLUMB_ENOMEM, "out of memory");
    if (opt)
        t->opt = *opt;
    else
        plumb_trajectory_options_init(&t->opt);
    if (!(t->opt.rel_tol > 0.0) || !(t->opt.abs_tol >= 0.0) || t->opt.max_steps == 0 ||
        !(t->opt.max_time_s > 0.0) || !(t->opt.first_step_s > 0.0) ||
        !(t->opt.event_rel_tol > 0.0) || !(t->opt.event_abs_tol >= 0.0) ||
        !(t->opt.stiff_rel_tol > 0.0) || !(t->opt.stiff_abs_tol >= 0.0) ||
        !(t->opt.energy_check_tol > 0.0) || !(t->opt.speed_check_tol >= 0.0)) {
        free(t);
        return PLUMB_RAISE(NULL, PLUMB_EINVAL, "invalid trajectory options");
    }
    t->step[0] = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rk8pd, NSTATE);
    t->step[1] = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rkf45, NSTATE);
    t->sys = (gsl_odeiv2_system){rhs_time, jac_time, NSTATE, &t->ctx};
    t->msbdf = gsl_odeiv2_driver_alloc_y_new(&t->sys, gsl_odeiv2_step_msbdf, t->opt.first_step_s,
                                             t->opt.stiff_abs_tol, t->opt.stiff_rel_tol);
    t->control = gsl_odeiv2_control_y_new(t->opt.abs_tol, t->opt.rel_tol);
    t->evolve = gsl_odeiv2_evolve_alloc(NSTATE);
    t->side_step = gsl_odeiv2_step_alloc(gsl_odeiv2_step_rk8pd, NSTATE);
    t->side_control = gsl_odeiv2_control_y_new(t->opt.event_abs_tol, t->opt.event_rel_tol);
    t->side_evolve = gsl_odeiv2_evolve_alloc(NSTATE);
    t->root = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    t->min = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    if (!t->step[0] || !t->step[1] || !t->msbdf || !t->control || !t->evolve ||
        !t->side_step || !t->side_control || !t->side_evolve || !t->root || !t->min) {
        plumb_trajectory_free(t);
        return PLUMB_RAISE(NULL, PLUMB_ENOMEM, "out of memory allocating the ODE workspace");
    }
    *out = t;
    return PLUMB_OK;
}

const plumb_path_point *plumb_trajectory_path(const plumb_trajectory *traj, size_t *n)
{
    *n = traj->path_n;
    return traj->path_n ? traj->path : NULL;
}

/* ---- spec checks ---------------------------------------------------------- */

static double body_cda(const plumb_drag_spec *d)
{
    return d->area_m2 > 0.0 ? d->cd * d->area_m2 : d->cd_area_m2;
}

static plumb_status check_spec(const plumb_fall_spec *s, plumb_diag *diag)
{
    const double *r = s->release_m, *v = s->velocity_m_s;
    for (int i = 0; i < 3; i++)
        if (!isfinite(r[i]) || !isfinite(v[i]))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "release", "release point and velocity must be finite");
    if (!(s->mass_kg > 0.0) || !isfinite(s->mass_kg))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "payload.mass", "mass must be > 0 kg, found %g kg", s->mass_kg);
    if (!(r[2] > 0.0))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "release.height", "release height must be > 0 m, found %g m", r[2]);
    if (!(s->volume_m3 >= 0.0) || !isfinite(s->volume_m3))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "payload.volume", "volume must be >= 0 m^3");
    const plumb_drag_spec *d = &s->drag;
    if (d->model == PLUMB_DRAG_FIXED) {
        double cda = body_cda(d);
        if (!(cda >= 0.0) || !isfinite(cda) || !(d->cd >= 0.0 && d->cd <= 10.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "payload.drag", "drag must be finite with 0 <= cd <= 10 and CdA >= 0");
    } else if (!(d->diameter_m > 0.0) || !(d->area_m2 > 0.0) || !isfinite(d->area_m2)) {
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "payload.drag.diameter", "a sphere drag model needs a diameter > 0");
    }
    if (s->n_descent > PLUMB_MAX_DESCENT)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent", "at most %d descent devices", PLUMB_MAX_DESCENT);
    for (size_t i = 0; i < s->n_descent; i++) {
        const plumb_descent_spec *dv = &s->descent[i];
        if (!(dv->cd > 0.0 && dv->cd <= 10.0) || !(dv->area_m2 > 0.0) || !isfinite(dv->area_m2))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent", "device %zu needs 0 < cd <= 10 and area > 0", i + 1);
        if (!(dv->fill_time_s >= 0.0) || !(dv->fill_constant >= 0.0) || !isfinite(dv->fill_constant))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent.fill_time", "device %zu: fill time and fill constant must be >= 0", i + 1);
        if (!(dv->inflation_exponent >= 0.0 && dv->inflation_exponent <= PLUMB_INFLATION_J_MAX))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent.inflation_exponent",
                                   "device %zu: the inflation exponent must lie in 0 (linear) to %g",
                                   i + 1, PLUMB_INFLATION_J_MAX);
        if (!(dv->opening_factor >= 0.0) || !isfinite(dv->opening_factor))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent.opening_factor", "device %zu: C_x must be >= 0", i + 1);
        if (dv->trigger == PLUMB_DEPLOY_AFTER && !(dv->deploy_value >= 0.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent.deploy.after", "deploy time must be >= 0 s");
        if (dv->trigger == PLUMB_DEPLOY_BELOW && !(dv->deploy_value > 0.0 && dv->deploy_value < r[2]))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent.deploy.below",
                                   "deploy height must lie between 0 m and the release height %g m, found %g m",
                                   r[2], dv->deploy_value);
    }
    return PLUMB_OK;
}

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
#define TERMINAL_MAX_M_S 1e6

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

static plumb_status terminal_speed(const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                                   double z_m, int with_devices, gsl_root_fsolver *root,
                                   gsl_min_fminimizer *mz, double *v_m_s)
{
    term_ctx c = {.spec = spec};
    double alt = spec->site_elevation_m + z_m;
    if (plumb_atmosphere_at(atm, alt, &c.air) != PLUMB_OK)
        return PLUMB_RAISE(NULL, PLUMB_EOUTSIDE, "altitude %.1f m is outside the atmosphere model", alt);
    double g = plumb_gravity_at(&spec->gravity, alt);
    c.g_net_m_s2 = g * (1.0 - c.air.rho_kg_m3 * spec->volume_m3 / spec->mass_kg);
    if (with_devices)
        for (size_t i = 0; i < spec->n_descent; i++) {
            if (i + 1 < spec->n_descent && spec->descent[i + 1].disreefs_previous)
                continue; /* replaced by the next device */
            c.extra_m2 += spec->descent[i].cd * spec->descent[i].area_m2;
        }
    if (!(c.g_net_m_s2 > 0.0))
        return PLUMB_RAISE(NULL, PLUMB_ENOLAND, "buoyancy exceeds weight: no terminal speed");
    if (spec->drag.model == PLUMB_DRAG_FIXED) {
        double cda = body_cda(&spec->drag) + c.extra_m2;
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

plumb_status plumb_terminal_speed(const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                                  double z_m, int with_devices, double *v_m_s)
{
    gsl_root_fsolver *root = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    gsl_min_fminimizer *mz = gsl_min_fminimizer_alloc(gsl_min_fminimizer_brent);
    plumb_status st = root && mz ? terminal_speed(spec, atm, z_m, with_devices, root, mz, v_m_s)
                                 : PLUMB_RAISE(NULL, PLUMB_ENOMEM, "out of memory");
    if (root)
        gsl_root_fsolver_free(root);
    if (mz)
        gsl_min_fminimizer_free(mz);
    return st;
}

/* ---- the run -------------------------------------------------------------- */

typedef struct runner {
    plumb_trajectory *w;
    fall_ctx *ctx;                 /* the workspace's */
    gsl_odeiv2_system *sys;        /* the workspace's */
    gsl_odeiv2_step *step;         /* main stepper and its evolve/control */
    gsl_odeiv2_evolve *evolve;
    gsl_odeiv2_control *control;
    plumb_fall_result *res;
    plumb_diag *diag;
    double t;
    double y[NSTATE];
    double h;
    size_t steps;
    /* the last three accepted points (devices only), for the peak force */
    size_t n_hist;
    double hist_t[3], hist_y[3][NSTATE], hist_f[3];
} runner;

static plumb_status fail_rhs(runner *r, int rc, const char *what)
{
    return PLUMB_RAISE(r->diag, PLUMB_ENUMERIC, "%s failed at t=%.2f s, %.2f m above the strike "
                       "level: %s", what, r->t, r->y[IZ], gsl_strerror(rc));
}

/* Advances (t0, y) by exactly h with the side stepper (rk8pd). One step
 * is taken when its error estimate meets the main tolerances, as an
 * accepted step of the explicit path does; otherwise (the step of an
 * implicit stepper can span hundreds of the explicit one's stability
 * limit, where a single explicit step is garbage) the span is integrated
 * adaptively under the event tolerances. dydt_in may be NULL. */
static int side_advance(runner *r, double t0, double h, double y[], const double dydt_in[])
{
    double y1[NSTATE], err[NSTATE];
    memcpy(y1, y, sizeof y1);
    gsl_odeiv2_step_reset(r->w->side_step);
    int rc = gsl_odeiv2_step_apply(r->w->side_step, t0, h, y1, err, dydt_in, NULL, r->sys);
    if (rc == GSL_SUCCESS) {
        int ok = 1;
        for (int i = 0; i < NSTATE && ok; i++)
            ok = isfinite(y1[i]) &&
                 fabs(err[i]) <= r->w->opt.abs_tol + r->w->opt.rel_tol * fabs(y1[i]);
        if (ok) {
            memcpy(y, y1, sizeof y1);
            return GSL_SUCCESS;
        }
    }
    double t = t0, t1 = t0 + h, hh = h;
    gsl_odeiv2_evolve_reset(r->w->side_evolve);
    gsl_odeiv2_step_reset(r->w->side_step);
    for (size_t n = 0; t < t1; n++) {
        if (n >= r->w->opt.max_steps)
            return GSL_EMAXITER;
        rc = gsl_odeiv2_evolve_apply(r->w->side_evolve, r->w->side_control, r->w->side_step, r->sys,
                                     &t, t1, &hh, y);
        if (rc != GSL_SUCCESS)
            return rc;
    }
    return GSL_SUCCESS;
}

/* Drag force at time t inside the step that starts at history point i:
 * one rk8pd step from there (no longer than the accepted step). */
typedef struct peak_ctx {
    runner *r;
    size_t i;
    int fail;
} peak_ctx;

static double neg_force_at(double t, void *params)
{
    peak_ctx *p = params;
    runner *r = p->r;
    size_t i = t <= r->hist_t[1] ? 0 : 1;
    double y[NSTATE];
    memcpy(y, r->hist_y[i], sizeof y);
    double h = t - r->hist_t[i];
    if (h > 0.0 && side_advance(r, r->hist_t[i], h, y, NULL) != GSL_SUCCESS) {
        p->fail = 1;
        return 0.0;
    }
    local L;
    if (local_at(r->ctx, t, y, &L) != GSL_SUCCESS) {
        p->fail = 1;
        return 0.0;
    }
    return -0.5 * L.air.rho_kg_m3 * L.cda * L.vr_abs * L.vr_abs;
}

/* Keeps the last three points; when the middle one is a local maximum of
 * the drag force, the maximum between its neighbours is located by Brent's
 * minimisation (GSL gsl_min_fminimizer_brent) on -F(t). */
static plumb_status track_peak(runner *r, double force)
{
    if (r->n_hist == 3) {
        memmove(r->hist_t, r->hist_t + 1, 2 * sizeof *r->hist_t);
        memmove(r->hist_f, r->hist_f + 1, 2 * sizeof *r->hist_f);
        memmove(r->hist_y, r->hist_y + 1, 2 * sizeof *r->hist_y);
        r->n_hist = 2;
    }
    r->hist_t[r->n_hist] = r->t;
    r->hist_f[r->n_hist] = force;
    memcpy(r->hist_y[r->n_hist], r->y, sizeof r->y);
    r->n_hist++;
    if (r->n_hist < 3 || !(r->hist_f[1] > r->hist_f[0] && r->hist_f[1] >= r->hist_f[2]) ||
        !(r->hist_t[0] < r->hist_t[1] && r->hist_t[1] < r->hist_t[2]))
        return PLUMB_OK;
    peak_ctx p = {r, 0, 0};
    gsl_function F = {neg_force_at, &p};
    gsl_min_fminimizer *m = r->w->min; /* the workspace's: nothing allocated per fall */
    int rc = gsl_min_fminimizer_set_with_values(m, &F, r->hist_t[1], -r->hist_f[1], r->hist_t[0],
                                                -r->hist_f[0], r->hist_t[2], -r->hist_f[2]);
    for (int it = 0; rc == GSL_SUCCESS && it < PEAK_MAX_ITER && !p.fail; it++) {
        rc = gsl_min_fminimizer_iterate(m);
        if (rc != GSL_SUCCESS)
            break;
        rc = gsl_min_test_interval(gsl_min_fminimizer_x_lower(m), gsl_min_fminimizer_x_upper(m),
                                   PEAK_ABS_TOL_S, 0.0);
        if (rc == GSL_SUCCESS)
            break;
        if (rc == GSL_CONTINUE)
            rc = GSL_SUCCESS;
    }
    double best = -gsl_min_fminimizer_f_minimum(m);
    if (p.fail)
        return fail_rhs(r, GSL_EBADFUNC, "peak force location");
    if (best > r->res->peak_force_n)
        r->res->peak_force_n = best;
    return PLUMB_OK;
}

/* Records what is observed at an accepted point: Mach, Re, drag force, path. */
static plumb_status observe(runner *r)
{
    for (int i = 0; i < NSTATE; i++)
        if (!isfinite(r->y[i]))
            return PLUMB_RAISE(r->diag, PLUMB_ENUMERIC,
                               "the integration produced a non-finite state at t=%.2f s", r->t);
    double alt = r->ctx->spec->site_elevation_m + r->y[IZ];
    if (!(alt >= r->ctx->air_lo_m && alt <= r->ctx->air_hi_m))
        return PLUMB_RAISE(r->diag, PLUMB_EOUTSIDE,
                           "the path leaves the air model's range (%.0f to %.0f m above sea level): "
                           "it reaches %.1f m at t=%.2f s", r->ctx->air_lo_m, r->ctx->air_hi_m, alt, r->t);
    local L;
    if (local_at(r->ctx, r->t, r->y, &L) != GSL_SUCCESS)
        return fail_rhs(r, GSL_EBADFUNC, "air lookup");
    plumb_fall_result *res = r->res;
    double mach = L.vr_abs / L.air.a_m_s;
    if (mach > res->max_mach)
        res->max_mach = mach;
    if (r->ctx->sphere && L.re > 0.0) {
        if (res->min_re == 0.0 || L.re < res->min_re)
            res->min_re = L.re;
        if (L.re > res->max_re)
            res->max_re = L.re;
    }
    if (!r->ctx->sphere && r->ctx->body_cda_m2 > 0.0) {
        const plumb_fall_spec *s = r->ctx->spec;
        double g_net = L.g * (1.0 - L.air.rho_kg_m3 * s->volume_m3 * r->ctx->inv_m);
        double vt = sqrt(2.0 * s->mass_kg * g_net / (L.air.rho_kg_m3 * r->ctx->body_cda_m2));
        if (vt > r->ctx->vt_max_m_s)
            r->ctx->vt_max_m_s = vt;
    }
    double force = 0.5 * L.air.rho_kg_m3 * L.cda * L.vr_abs * L.vr_abs;
    if (force > res->peak_force_n)
        res->peak_force_n = force;
    if (r->ctx->n_dev) {
        plumb_status st = track_peak(r, force);
        if (st != PLUMB_OK)
            return st;
    }
    if (r->y[IZ] > res->apex_m)
        res->apex_m = r->y[IZ];
    if (r->w->opt.record_path) {
        plumb_trajectory *w = r->w;
        if (w->path_n == w->path_cap) {
            size_t cap = w->path_cap ? 2 * w->path_cap : 256;
            plumb_path_point *p = realloc(w->path, cap * sizeof *p);
            if (!p)
                return PLUMB_RAISE(r->diag, PLUMB_ENOMEM, "out of memory recording the path");
            w->path = p;
            w->path_cap = cap;
        }
        w->path[w->path_n++] = (plumb_path_point){r->t, r->y[IX], r->y[IY], r->y[IZ],
                                                  r->y[IVX], r->y[IVY], r->y[IVZ]};
    }
    return PLUMB_OK;
}

/* Integrates the state (t0, y0) along component k until y[k] == target,
 * by Henon's method. Writes the time and state there. */
static plumb_status henon_to(runner *r, int k, double target, double *t_io, double y_io[])
{
    henon_ctx hc = {r->ctx, k, target, 1.0};
    const plumb_wind_spec *wind = &r->ctx->spec->wind;
    if (k == IZ && target == 0.0 && y_io[IZ] > 0.0 && wind->profile == PLUMB_WIND_POWER &&
        wind->speed_m_s > 0.0 && wind->exponent > 0.0 && wind->exponent < 1.0)
        hc.m = 1.0 / wind->exponent;
    gsl_odeiv2_system hs = {rhs_henon, NULL, NSTATE, &hc};
    double u[NSTATE];
    memcpy(u, y_io, sizeof u);
    u[k] = *t_io;
    double s = hc.m == 1.0 ? y_io[k] : pow(y_io[k] - target, 1.0 / hc.m);
    double s_end = hc.m == 1.0 ? target : 0.0;
    double h = s_end - s;
    gsl_odeiv2_evolve_reset(r->w->side_evolve);
    gsl_odeiv2_step_reset(r->w->side_step);
    /* until s reaches s_end: a last step may land a rounding error past it */
    const int down = h < 0.0;
    for (size_t n = 0; down ? s > s_end : s < s_end; n++) {
        if (n >= r->w->opt.max_steps)
            return PLUMB_RAISE(r->diag, PLUMB_EBUDGET, "event location ran past its step budget at t=%.2f s", *t_io);
        int rc = gsl_odeiv2_evolve_apply(r->w->side_evolve, r->w->side_control, r->w->side_step, &hs,
                                         &s, s_end, &h, u);
        if (rc != GSL_SUCCESS)
            return fail_rhs(r, rc, "event location");
    }
    *t_io = u[k];
    memcpy(y_io, u, sizeof u);
    y_io[k] = target;
    return PLUMB_OK;
}

/* Apex inside the step from (t0, y0) to the current state: vz changed sign. */
static plumb_status locate_apex(runner *r, double t0, const double y0[])
{
    double t = t0, y[NSTATE];
    memcpy(y, y0, sizeof y);
    plumb_status st = henon_to(r, IVZ, 0.0, &t, y);
    if (st != PLUMB_OK)
        return st;
    if (y[IZ] > r->res->apex_m)
        r->res->apex_m = y[IZ];
    return PLUMB_OK;
}

/* The step from (t0, y0) crossed z_event: make sure the object descends at
 * the start of the Henon phase, halving the step (of size h) where it
 * does not. */
static plumb_status descend_start(runner *r, double *t0, double y0[], double h, double z_event)
{
    for (int n = 0; y0[IVZ] >= 0.0 && n < MAX_HALVINGS; n++) {
        double y[NSTATE];
        h *= 0.5;
        memcpy(y, y0, sizeof y);
        int rc = side_advance(r, *t0, h, y, NULL);
        if (rc != GSL_SUCCESS)
            return fail_rhs(r, rc, "ODE step");
        if (y[IZ] > z_event) {
            if (y0[IVZ] > 0.0 && y[IVZ] <= 0.0) {
                plumb_status st = locate_apex(r, *t0, y0);
                if (st != PLUMB_OK)
                    return st;
            }
            *t0 += h;
            memcpy(y0, y, sizeof y);
        }
    }
    if (y0[IVZ] >= 0.0)
        return PLUMB_RAISE(r->diag, PLUMB_ENUMERIC, "could not locate the crossing of z=%.3f m at t=%.2f s", z_event, *t0);
    return PLUMB_OK;
}

/* Brings the descending state (t0, y0) close above z_event with one time
 * step, so that the Henon phase spans only a short height: the step length
 * is APPROACH_FRACTION of the time to the event predicted from the
 * current height, vertical speed and acceleration (constant-acceleration
 * kinematics). The step is no longer than the accepted step h_max, so it
 * is at least as accurate; if it would pass the event it is not taken. */
static plumb_status approach(runner *r, double *t0, double y0[], double h_max, double z_event)
{
    double f[NSTATE], y[NSTATE];
    int rc = rhs_time(*t0, y0, f, r->ctx);
    if (rc != GSL_SUCCESS)
        return fail_rhs(r, rc, "ODE step");
    double dz = y0[IZ] - z_event, v = -y0[IVZ], a = -f[IVZ]; /* downward positive */
    double disc = v * v + 2.0 * a * dz;
    double h = disc > 0.0 && a != 0.0 ? (-v + sqrt(disc)) / a : dz / v;
    if (!(h > 0.0) || !isfinite(h))
        return PLUMB_OK;
    h *= APPROACH_FRACTION;
    if (h > h_max)
        h = h_max;
    memcpy(y, y0, sizeof y);
    rc = side_advance(r, *t0, h, y, f);
    if (rc != GSL_SUCCESS)
        return fail_rhs(r, rc, "ODE step");
    if (y[IZ] > z_event && y[IVZ] < 0.0) {
        *t0 += h;
        memcpy(y0, y, sizeof y);
    }
    return PLUMB_OK;
}

static void deploy(runner *r, size_t i)
{
    const plumb_descent_spec *d = &r->ctx->spec->descent[i];
    device_state *ds = &r->ctx->dev[i];
    local L;
    memset(&L, 0, sizeof L);
    ds->deployed = 1;
    ds->t_ls_s = r->t;
    ds->cds_m2 = d->cd * d->area_m2;
    double v_ls = 0.0;
    if (local_at(r->ctx, r->t, r->y, &L) == GSL_SUCCESS)
        v_ls = L.vr_abs;
    /* D0: the given diameter, else the nominal diameter sqrt(4 S0 / pi) (Knacke) */
    double d0 = d->diameter_m > 0.0 ? d->diameter_m : sqrt(4.0 * d->area_m2 / PLUMB_PI);
    ds->fill_s = d->fill_constant > 0.0 && v_ls > 0.0 ? d->fill_constant * d0 / v_ls
                                                      : d->fill_time_s;
    ds->j = d->inflation_exponent > 0.0 ? d->inflation_exponent : 1.0;
    if (d->disreefs_previous && i > 0)
        r->ctx->dev[i - 1].removed = 1;
    size_t k = r->res->n_deployed++;
    r->res->deploy_time_s[k] = r->t;
    r->res->deploy_height_m[k] = r->y[IZ];
    r->res->deploy_speed_m_s[k] = v_ls;
    r->res->fill_time_s[k] = ds->fill_s;
    /* Pflanz's estimate from the state at line stretch (inflation.h) */
    if (v_ls > 0.0 && ds->fill_s > 0.0) {
        double rho = L.air.rho_kg_m3;
        double a = plumb_pflanz_ballistic(r->ctx->spec->mass_kg, rho, ds->cds_m2, v_ls, ds->fill_s);
        double q1s = 0.5 * rho * v_ls * v_ls * ds->cds_m2;
        r->res->pflanz_a[k] = a;
        r->res->pflanz_x1[k] = plumb_pflanz_x1(a, ds->j, NULL);
        r->res->pflanz_q1s_n[k] = q1s;
        r->res->pflanz_force_n[k] = d->opening_factor * r->res->pflanz_x1[k] * q1s;
    }
}

/* After an event the right-hand side changes form (a canopy opens or
 * finishes filling): restart the stepper from a short step, since the
 * drag may now be far larger than what the last step size was made for. */
static void restart(runner *r)
{
    gsl_odeiv2_evolve_reset(r->evolve);
    gsl_odeiv2_step_reset(r->step);
    if (r->h > r->w->opt.first_step_s)
        r->h = r->w->opt.first_step_s;
}

/* Next time at which the right-hand side changes form: a timed deployment
 * or the end of a filling. */
static double next_time_event(const runner *r)
{
    double next = r->w->opt.max_time_s;
    const plumb_fall_spec *s = r->ctx->spec;
    for (size_t i = 0; i < s->n_descent; i++) {
        const device_state *d = &r->ctx->dev[i];
        if (!d->deployed) {
            if (s->descent[i].trigger == PLUMB_DEPLOY_AFTER && s->descent[i].deploy_value < next)
                next = s->descent[i].deploy_value;
        } else if (d->t_ls_s + d->fill_s > r->t && d->t_ls_s + d->fill_s < next) {
            next = d->t_ls_s + d->fill_s;
        }
    }
    return next;
}

/* Highest pending height event below the object: a `below` trigger or 0. */
/* Height below which a fall in power-law wind finishes in Henon's s
 * variable (0 for other winds): GROUND_SWITCH_M, or half the release
 * height when that is lower. */
static double ground_switch_m(const plumb_fall_spec *s)
{
    const plumb_wind_spec *w = &s->wind;
    if (w->profile != PLUMB_WIND_POWER || !(w->speed_m_s > 0.0) || !(w->exponent > 0.0) ||
        !(w->exponent < 1.0))
        return 0.0;
    double half = 0.5 * s->release_m[2];
    return half < GROUND_SWITCH_M ? half : GROUND_SWITCH_M;
}

/* Highest pending height event below the object: a `below` trigger
 * (*device its index), a height where the wind profile has a kink (the
 * log law's roughness length, a table's rows: *device WIND_KINK), or the
 * strike level (0, *device NO_DEVICE). Stopping exactly at a kink keeps
 * the stepper from straddling it. */
#define NO_DEVICE ((size_t)-1)
#define WIND_KINK ((size_t)-2)
static double next_height_event(const runner *r, size_t *device)
{
    double z = 0.0, here = r->y[IZ];
    *device = NO_DEVICE;
    const plumb_fall_spec *s = r->ctx->spec;
    for (size_t i = 0; i < s->n_descent; i++)
        if (!r->ctx->dev[i].deployed && s->descent[i].trigger == PLUMB_DEPLOY_BELOW &&
            s->descent[i].deploy_value > z && s->descent[i].deploy_value < here) {
            z = s->descent[i].deploy_value;
            *device = i;
        }
    const plumb_wind_spec *w = &s->wind;
    if (w->speed_m_s > 0.0 && w->profile == PLUMB_WIND_LOG && w->roughness_m > z &&
        w->roughness_m < here) {
        z = w->roughness_m;
        *device = WIND_KINK;
    }
    if (w->profile == PLUMB_WIND_TABLE && w->table_h_m)
        for (size_t i = 0; i < w->table_n; i++)
            if (w->table_h_m[i] > z && w->table_h_m[i] < here) {
                z = w->table_h_m[i];
                *device = WIND_KINK;
            }
    return z;
}

static plumb_status finish(runner *r, const plumb_atmosphere *atm)
{
    const plumb_fall_spec *s = r->ctx->spec;
    plumb_fall_result *res = r->res;
    const double *v = &r->y[IVX];
    res->time_s = r->t;
    res->point_m[0] = r->y[IX];
    res->point_m[1] = r->y[IY];
    memcpy(res->velocity_m_s, v, 3 * sizeof *v);
    double vh = hypot(v[0], v[1]);
    res->speed_m_s = sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
    res->energy_j = 0.5 * s->mass_kg * res->speed_m_s * res->speed_m_s;
    res->momentum_kg_m_s = s->mass_kg * res->speed_m_s;
    res->angle_deg = atan2(-v[2], vh) * 180.0 / PLUMB_PI;
    double dx = r->y[IX] - s->release_m[0], dy = r->y[IY] - s->release_m[1];
    res->drift_m = hypot(dx, dy);
    double b = atan2(dx, dy) * 180.0 / PLUMB_PI;
    res->bearing_deg = res->drift_m > 0.0 ? (b < 0.0 ? b + 360.0 : b) : 0.0;
    res->drag_work_j = r->y[IW];
    /* Vacuum figures: gravity is linear in altitude, so its mean over the
     * drop is its value at mid-height, exactly. */
    double H = s->release_m[2];
    double g_mid = plumb_gravity_at(&s->gravity, s->site_elevation_m + 0.5 * H);
    const double *v0 = s->velocity_m_s;
    double v0sq = v0[0] * v0[0] + v0[1] * v0[1] + v0[2] * v0[2];
    res->drag_free_speed_m_s = sqrt(v0sq + 2.0 * g_mid * H);
    res->drag_free_energy_j = 0.5 * s->mass_kg * v0sq + s->mass_kg * g_mid * H;
    double vt = 0.0;
    if (body_cda(&s->drag) > 0.0 || s->drag.model != PLUMB_DRAG_FIXED)
        if (terminal_speed(s, atm, 0.0, 0, r->w->root, r->w->min, &vt) != PLUMB_OK)
            vt = 0.0;
    res->terminal_speed_m_s = vt;
    double vs = vt;
    if (s->n_descent && terminal_speed(s, atm, 0.0, 1, r->w->root, r->w->min, &vs) != PLUMB_OK)
        vs = 0.0;
    res->steady_speed_m_s = vs;
    res->peak_load_g = res->peak_force_n / (s->mass_kg * PLUMB_G0_M_S2);
    res->solver.steps = r->steps;
    res->solver.rhs_evaluations = r->ctx->evals;
    res->solver.method = gsl_odeiv2_step_name(r->step);
    return PLUMB_OK;
}

static plumb_status run_with(plumb_trajectory *w, const plumb_fall_spec *spec,
                             const plumb_atmosphere *atm, plumb_fall_result *res,
                             plumb_diag *diag, plumb_stepper kind);

/* Work of buoyancy, rho V g, from the strike level to height H: composite
 * Simpson over BUOY_PANELS panels (the buoyancy is at most a small part of
 * the weight, so its quadrature error is far below the check's). */
#define BUOY_PANELS 256
static plumb_status buoyancy_work(const plumb_fall_spec *s, const plumb_atmosphere *atm,
                                  double *w_j)
{
    double H = s->release_m[2], h = H / BUOY_PANELS, sum = 0.0;
    *w_j = 0.0;
    if (!(s->volume_m3 > 0.0))
        return PLUMB_OK;
    for (int i = 0; i <= BUOY_PANELS; i++) {
        double alt = s->site_elevation_m + i * h;
        plumb_air air;
        if (plumb_atmosphere_at(atm, alt, &air) != PLUMB_OK)
            return PLUMB_RAISE(NULL, PLUMB_EOUTSIDE, "altitude %.1f m is outside the atmosphere model", alt);
        double f = air.rho_kg_m3 * s->volume_m3 * plumb_gravity_at(&s->gravity, alt);
        sum += f * (i == 0 || i == BUOY_PANELS ? 1.0 : i % 2 ? 4.0 : 2.0);
    }
    *w_j = sum * h / 3.0;
    return PLUMB_OK;
}

static int calm(const plumb_wind_spec *w)
{
    if (w->profile != PLUMB_WIND_TABLE)
        return w->speed_m_s == 0.0;
    for (size_t i = 0; i < w->table_n; i++)
        if (w->table_east_m_s[i] != 0.0 || w->table_north_m_s[i] != 0.0)
            return 0;
    return 1;
}

/* The checks every fall passes before its figures are given:
 *  - the work-energy theorem, 1/2 m (v^2 - v0^2) = m g_mid H + W_buoyancy
 *    + W_drag, with W_drag integrated alongside the motion and g linear in
 *    altitude (so its work is m g(mid-height) H exactly);
 *  - from rest in still air the object accelerates only while it is
 *    slower than the local terminal speed (the lowest root of the drag
 *    balance), so it can never arrive faster than the largest terminal
 *    speed on its path: at the ends, and for fixed drag at every accepted
 *    point as well. */
static plumb_status verify(plumb_trajectory *w, const plumb_fall_spec *s, const plumb_atmosphere *atm,
                           const plumb_fall_result *res, plumb_diag *diag)
{
    const double *v0 = s->velocity_m_s;
    double H = s->release_m[2];
    double v0sq = v0[0] * v0[0] + v0[1] * v0[1] + v0[2] * v0[2];
    double g_mid = plumb_gravity_at(&s->gravity, s->site_elevation_m + 0.5 * H);
    double wb;
    plumb_status st = buoyancy_work(s, atm, &wb);
    if (st != PLUMB_OK)
        return plumbp_raise(diag, st, NULL, 0, 0, NULL, "energy check: altitude outside the air model");
    double gained = res->energy_j - 0.5 * s->mass_kg * v0sq;
    double work = s->mass_kg * g_mid * H - wb + res->drag_work_j;
    double scale = fmax(0.5 * s->mass_kg * v0sq + s->mass_kg * g_mid * H, fabs(res->drag_work_j));
    if (!(fabs(gained - work) <= w->opt.energy_check_tol * scale))
        return PLUMB_RAISE(diag, PLUMB_ENUMERIC,
                           "the fall fails its energy balance: kinetic energy gained %.9g J, work "
                           "of gravity, buoyancy and drag %.9g J (method %s)",
                           gained, work, res->solver.method);
    if (v0sq == 0.0 && calm(&s->wind) && (body_cda(&s->drag) > 0.0 || s->drag.model != PLUMB_DRAG_FIXED)) {
        double vt_top, vt_max = w->ctx.vt_max_m_s;
        if (terminal_speed(s, atm, H, 0, w->root, w->min, &vt_top) == PLUMB_OK && vt_top > vt_max)
            vt_max = vt_top;
        if (res->terminal_speed_m_s > vt_max)
            vt_max = res->terminal_speed_m_s;
        if (vt_max > 0.0 && !(res->speed_m_s <= vt_max * (1.0 + w->opt.speed_check_tol)))
            return PLUMB_RAISE(diag, PLUMB_ENUMERIC,
                               "the fall arrives at %.10g m/s from rest in still air, faster than "
                               "its terminal speed %.10g m/s (method %s)",
                               res->speed_m_s, vt_max, res->solver.method);
    }
    return PLUMB_OK;
}

plumb_status plumb_trajectory_run(plumb_trajectory *w, const plumb_fall_spec *spec,
                                  const plumb_atmosphere *atm, plumb_fall_result *res,
                                  plumb_diag *diag)
{
    plumb_status st = check_spec(spec, diag);
    if (st != PLUMB_OK)
        return st;
    plumb_stepper kind = w->opt.stepper;
    if (kind == PLUMB_STEPPER_AUTO) {
        double vt = 0.0;
        double g = plumb_gravity_at(&spec->gravity, spec->site_elevation_m);
        kind = spec->n_descent == 0 &&
                       terminal_speed(spec, atm, 0.0, 0, w->root, w->min, &vt) == PLUMB_OK &&
                       2.0 * g * spec->release_m[2] / (vt * vt) > w->opt.stiff_ratio
                   ? PLUMB_STEPPER_MSBDF
                   : PLUMB_STEPPER_RK8PD;
    }
    /* A fall whose integration fails, or whose figures fail their checks,
     * is run again with the other kind of method (implicit msbdf for the
     * explicit steppers, rk8pd for msbdf); if that fails too, it is an
     * error, never a figure. */
    st = run_with(w, spec, atm, res, diag, kind);
    if (st == PLUMB_OK)
        st = verify(w, spec, atm, res, diag);
    if (st != PLUMB_ENUMERIC && st != PLUMB_EBUDGET)
        return st;
    plumb_diag first;
    if (diag)
        first = *diag;
    plumb_stepper other = kind == PLUMB_STEPPER_MSBDF ? PLUMB_STEPPER_RK8PD : PLUMB_STEPPER_MSBDF;
    plumb_status st2 = run_with(w, spec, atm, res, diag, other);
    if (st2 == PLUMB_OK)
        st2 = verify(w, spec, atm, res, diag);
    if (st2 == PLUMB_OK || (st2 != PLUMB_ENUMERIC && st2 != PLUMB_EBUDGET))
        return st2;
    if (diag) {
        plumb_diag second = *diag;
        return PLUMB_RAISE(diag, st, "%s; run again with another method: %s", first.message,
                           second.message);
    }
    return st;
}

static plumb_status run_with(plumb_trajectory *w, const plumb_fall_spec *spec,
                             const plumb_atmosphere *atm, plumb_fall_result *res,
                             plumb_diag *diag, plumb_stepper kind)
{
    plumb_status st;
    memset(res, 0, sizeof *res);
    runner r = {.w = w, .res = res, .diag = diag};
    r.ctx = &w->ctx;
    r.sys = &w->sys;
    ctx_init(r.ctx, spec, atm);
    w->path_n = 0;
    if (kind == PLUMB_STEPPER_MSBDF) {
        r.step = w->msbdf->s;
        r.evolve = w->msbdf->e;
        r.control = w->msbdf->c;
    } else {
        r.step = w->step[kind == PLUMB_STEPPER_RKF45 ? 1 : 0];
        r.evolve = w->evolve;
        r.control = w->control;
    }

    memcpy(r.y, spec->release_m, 3 * sizeof(double));
    memcpy(&r.y[IVX], spec->velocity_m_s, 3 * sizeof(double));
    r.y[IW] = 0.0;
    r.t = 0.0;
    r.h = w->opt.first_step_s;
    res->apex_m = r.y[IZ];
    /* The highest the object could rise without drag, for buoyancy detection. */
    double g0 = plumb_gravity_at(&spec->gravity, spec->site_elevation_m + r.y[IZ]);
    double rise_cap = r.y[IZ] + (r.y[IVZ] > 0.0 ? r.y[IVZ] * r.y[IVZ] / (2.0 * g0) : 0.0) + RISE_MARGIN_M;

    gsl_odeiv2_evolve_reset(r.evolve);
    gsl_odeiv2_step_reset(r.step);
    /* Deployments due at release. */
    for (size_t i = 0; i < spec->n_descent; i++)
        if (spec->descent[i].trigger == PLUMB_DEPLOY_AFTER && spec->descent[i].deploy_value == 0.0)
            deploy(&r, i);
    if ((st = observe(&r)) != PLUMB_OK)
        return st;

    for (;;) {
        size_t dev;
        double z_event = next_height_event(&r, &dev);
        double t_event = next_time_event(&r);
        /* Power-law wind: the last stretch to the ground is integrated in
         * the smooth variable s (see henon_ctx) from the first point below
         * the switch height, not crawled to by the time stepper. */
        double z_detect = z_event == 0.0 ? ground_switch_m(spec) : z_event;
        double t0 = r.t, y0[NSTATE];
        memcpy(y0, r.y, sizeof y0);
        if (r.steps >= w->opt.max_steps)
            return PLUMB_RAISE(diag, PLUMB_EBUDGET,
                               "the fall ran past its budget of %zu steps at t=%.2f s, z=%.2f m",
                               w->opt.max_steps, r.t, r.y[IZ]);
        r.ctx->fail = PLUMB_OK;
        int rc = gsl_odeiv2_evolve_apply(r.evolve, r.control, r.step, r.sys, &r.t, t_event, &r.h, r.y);
        if (rc != GSL_SUCCESS)
            return fail_rhs(&r, rc, "ODE step");
        r.steps++;
        if (r.y[IZ] <= z_detect) {
            /* Crossed a height event inside this step: undo it, then Henon. */
            double h_used = r.t - t0, tt = t0, yy[NSTATE];
            r.t = t0;
            memcpy(r.y, y0, sizeof y0);
            memcpy(yy, y0, sizeof yy);
            st = descend_start(&r, &tt, yy, h_used, z_detect);
            if (st != PLUMB_OK)
                return st;
            if (z_detect == z_event)
                st = approach(&r, &tt, yy, h_used, z_event);
            if (st != PLUMB_OK)
                return st;
            st = henon_to(&r, IZ, z_event, &tt, yy);
            if (st != PLUMB_OK)
                return st;
            r.t = tt;
            memcpy(r.y, yy, sizeof yy);
            if ((st = observe(&r)) != PLUMB_OK)
                return st;
            if (z_event == 0.0)
                return finish(&r, atm);
            if (dev != WIND_KINK)
                deploy(&r, dev);
            restart(&r);
            continue;
        }
        if (y0[IVZ] > 0.0 && r.y[IVZ] <= 0.0 && (st = locate_apex(&r, t0, y0)) != PLUMB_OK)
            return st;
        if ((st = observe(&r)) != PLUMB_OK)
            return st;
        if (r.y[IZ] > rise_cap && r.y[IVZ] > 0.0)
            return PLUMB_RAISE(diag, PLUMB_ENOLAND,
                               "the object never reaches the strike level: it rises to %.1f m at t=%.2f s "
                               "(buoyancy exceeds its weight)", r.y[IZ], r.t);
        if (r.t >= t_event) {
            if (t_event >= w->opt.max_time_s)
                return PLUMB_RAISE(diag, PLUMB_EBUDGET,
                                   "the fall did not end within its time budget of %g s (z=%.2f m)",
                                   w->opt.max_time_s, r.y[IZ]);
            for (size_t i = 0; i < spec->n_descent; i++)
                if (!r.ctx->dev[i].deployed && spec->descent[i].trigger == PLUMB_DEPLOY_AFTER &&
                    spec->descent[i].deploy_value <= r.t)
                    deploy(&r, i);
            restart(&r);
        }
    }
}
