/*
 * trajectory.c - the 3-D fall of a point mass through moving air
 * (README.md "The model"; equations in include/plumb/trajectory.h).
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
 *
 * This file runs the fall; trajectory_int.h names the files of its
 * right-hand side, workspace and terminal speed.
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
#include "physics/trajectory_int.h"

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
    if (plumbp_traj_local_at(r->ctx, t, y, &L) != GSL_SUCCESS) {
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
    if (plumbp_traj_local_at(r->ctx, r->t, r->y, &L) != GSL_SUCCESS)
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
    if (r->ctx->n_dev && !r->w->peak_unread) {
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
    gsl_odeiv2_system hs = {plumbp_traj_rhs_henon, NULL, NSTATE, &hc};
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
    int rc = plumbp_traj_rhs_time(*t0, y0, f, r->ctx);
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
    if (plumbp_traj_local_at(r->ctx, r->t, r->y, &L) == GSL_SUCCESS)
        v_ls = L.vr_abs;
    /* D0: the given diameter, else the nominal diameter sqrt(4 S0 / pi) (Knacke) */
    double d0 = d->diameter_m > 0.0 ? d->diameter_m : sqrt(4.0 * d->area_m2 / PLUMB_PI);
    ds->fill_s = d->fill_constant > 0.0 && v_ls > 0.0 ? d->fill_constant * d0 / v_ls
                                                      : d->fill_time_s;
    ds->j = d->inflation_exponent > 0.0 ? d->inflation_exponent : 1.0;
    if (d->disreefs_previous && i > 0)
        r->ctx->dev[i - 1].removed = 1;
    size_t k = i; /* the result's figures are the device's, in any order of opening */
    r->res->n_deployed++;
    r->res->deployed[k] = 1;
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
    if (plumb_drag_given_cd_area(&s->drag) > 0.0 || s->drag.model != PLUMB_DRAG_FIXED)
        if (plumbp_traj_terminal_speed(s, atm, 0.0, 0, r->w->root, r->w->min, &vt) != PLUMB_OK)
            vt = 0.0;
    res->terminal_speed_m_s = vt;
    double vs = vt;
    if (s->n_descent && plumbp_traj_terminal_speed(s, atm, 0.0, PLUMBP_ALL_DEVICES, r->w->root,
                                                   r->w->min, &vs) != PLUMB_OK)
        vs = 0.0;
    res->steady_speed_m_s = vs;
    /* with only the devices this fall opened (plumb_fall_opened_devices) */
    unsigned opened = plumb_fall_opened_devices(s, res), all = 0;
    for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++)
        all |= 1u << i;
    double vo = 0.0;
    if (opened == all)
        vo = vs;
    else if (opened && plumbp_traj_terminal_speed(s, atm, 0.0, opened, r->w->root, r->w->min,
                                                  &vo) != PLUMB_OK)
        vo = 0.0;
    res->steady_opened_m_s = vo;
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
    if (!isfinite(gained) || !isfinite(work) || !isfinite(scale))
        return PLUMB_RAISE(diag, PLUMB_ENUMERIC,
                           "the fall's energies are beyond what a double can hold (mass %.6g kg, "
                           "height %.6g m): no figure of it can be checked",
                           s->mass_kg, H);
    if (!(fabs(gained - work) <= w->opt.energy_check_tol * scale))
        return PLUMB_RAISE(diag, PLUMB_ENUMERIC,
                           "the fall fails its energy balance: kinetic energy gained %.9g J, work "
                           "of gravity, buoyancy and drag %.9g J (method %s)",
                           gained, work, res->solver.method);
    if (v0sq == 0.0 && plumbp_wind_calm(&s->wind) && !w->ctx.dw.on && !w->ctx.turb && (plumb_drag_given_cd_area(&s->drag) > 0.0 || s->drag.model != PLUMB_DRAG_FIXED)) {
        double vt_top, vt_max = w->ctx.vt_max_m_s;
        if (plumbp_traj_terminal_speed(s, atm, H, 0, w->root, w->min, &vt_top) == PLUMB_OK &&
            vt_top > vt_max)
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

/* GSL's name of a method (gsl_odeiv2_step_type name). */
static const char *stepper_name(plumb_stepper kind)
{
    switch (kind) {
    case PLUMB_STEPPER_RKF45: return "rkf45";
    case PLUMB_STEPPER_MSBDF: return "msbdf";
    default: return "rk8pd";
    }
}

plumb_status plumb_trajectory_run(plumb_trajectory *w, const plumb_fall_spec *spec,
                                  const plumb_atmosphere *atm, plumb_fall_result *res,
                                  plumb_diag *diag)
{
    plumb_status st = plumbp_traj_check_spec(spec, diag);
    if (st != PLUMB_OK)
        return st;
    double t_min, vt_top;
    if (plumbp_traj_outlasts_budget(&w->opt, spec, atm, &t_min, &vt_top))
        return PLUMB_RAISE(diag, PLUMB_EBUDGET,
                           "the object falls too slowly to be followed: its terminal speed is at "
                           "most %.3g m/s (in the thinnest air of its path), so the fall of %.6g m "
                           "takes at least %.3g s (%.3g h), beyond the time budget of %g s; so "
                           "light an object drifts with the air rather than falling",
                           vt_top, spec->release_m[2], t_min, t_min / 3600.0, w->opt.max_time_s);
    plumb_stepper kind = w->opt.stepper;
    if (kind == PLUMB_STEPPER_AUTO) {
        double vt = 0.0;
        double g = plumb_gravity_at(&spec->gravity, spec->site_elevation_m);
        kind = spec->n_descent == 0 &&
                       plumbp_traj_terminal_speed(spec, atm, 0.0, 0, w->root, w->min, &vt) ==
                           PLUMB_OK &&
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
        /* both methods tried: say what each met, not what to try */
        return PLUMB_RAISE(diag, st,
                           "the fall could not be computed by either method: %s with %s, then "
                           "%s with %s",
                           first.message, stepper_name(kind), second.message,
                           stepper_name(other));
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
    plumbp_traj_ctx_init(r.ctx, spec, atm);
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
            /* no figure: the height here is only where the search stops,
             * not the top of the rise, and physics knows no display units */
            return PLUMB_RAISE(diag, PLUMB_ENOLAND,
                               "the object never reaches the strike level: its buoyancy exceeds "
                               "its weight, so it rises instead of falling");
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

double plumbp_device_cds_at(const plumb_descent_spec *d, double fill_fraction)
{
    double j = d->inflation_exponent > 0.0 ? d->inflation_exponent : 1.0;
    return d->cd * d->area_m2 * plumb_inflation_fraction(fill_fraction, j);
}

plumb_device_state plumb_fall_device_at_impact(const plumb_fall_spec *spec,
                                               const plumb_fall_result *res, size_t i,
                                               plumb_device_at_impact *out)
{
    plumb_device_at_impact c = {PLUMB_DEVICE_NOT_DEPLOYED, 0.0, 0.0, 0.0};
    size_t nd = spec && spec->n_descent < PLUMB_MAX_DESCENT ? spec->n_descent : PLUMB_MAX_DESCENT;
    if (spec && res && i < nd) {
        const plumb_descent_spec *d = &spec->descent[i];
        c.cds_full_m2 = d->cd * d->area_m2;
        if (!res->deployed[i]) {
            /* not deployed: the zero figures above */
        } else if (i + 1 < nd && spec->descent[i + 1].disreefs_previous && res->deployed[i + 1]) {
            /* released at the next device's line stretch (trajectory_rhs.c) */
            double tf = res->fill_time_s[i];
            double since = res->deploy_time_s[i + 1] - res->deploy_time_s[i];
            c.state = PLUMB_DEVICE_REPLACED;
            c.fill_fraction = tf > 0.0 && since < tf ? (since > 0.0 ? since / tf : 0.0) : 1.0;
        } else {
            /* the integrator stops at t_ls + t_f as an event computed the
             * same way, so an impact after the fill compares >= exactly */
            double tf = res->fill_time_s[i], since = res->time_s - res->deploy_time_s[i];
            if (tf > 0.0 && since < tf) {
                c.state = PLUMB_DEVICE_FILLING;
                c.fill_fraction = since > 0.0 ? since / tf : 0.0;
                c.cds_m2 = plumbp_device_cds_at(d, c.fill_fraction);
            } else {
                c.state = PLUMB_DEVICE_OPEN;
                c.fill_fraction = 1.0;
                c.cds_m2 = c.cds_full_m2;
            }
        }
    }
    if (out)
        *out = c;
    return c.state;
}

unsigned plumb_fall_opened_devices(const plumb_fall_spec *spec, const plumb_fall_result *res)
{
    unsigned opened = 0;
    size_t nd = spec->n_descent < PLUMB_MAX_DESCENT ? spec->n_descent : PLUMB_MAX_DESCENT;
    for (size_t i = nd; i-- > 0;) {
        plumb_device_state st = plumb_fall_device_at_impact(spec, res, i, NULL);
        if (st == PLUMB_DEVICE_OPEN || (st == PLUMB_DEVICE_REPLACED && (opened & (2u << i))))
            opened |= 1u << i;
    }
    return opened;
}
