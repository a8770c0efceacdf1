/*
 * trajectory_work.c - the fall's workspace (plumb_trajectory_alloc and
 * free: the GSL gsl_odeiv2 steppers, controls and evolves, the root finder
 * and minimiser of the terminal speed, the recorded path) and the checks
 * of a fall spec before a run.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "physics/trajectory_int.h"


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

int plumbp_traj_peak_unread(plumb_trajectory *w, int unread)
{
    int was = w->peak_unread;
    w->peak_unread = unread;
    return was;
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
    t->sys = (gsl_odeiv2_system){plumbp_traj_rhs_time, plumbp_traj_jac_time, NSTATE, &t->ctx};
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


/* The key of descent device i, numbered as the profile's keys count them
 * (descent[0] is the first), with the rest of the key: "descent[1].area". */
static const char *device_key(char *buf, size_t size, size_t i, const char *rest)
{
    snprintf(buf, size, "descent[%zu]%s", i, rest);
    return buf;
}

plumb_status plumbp_traj_check_spec(const plumb_fall_spec *s, plumb_diag *diag)
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
        double cda = plumb_drag_given_cd_area(d);
        if (!(cda >= 0.0) || !isfinite(cda) || !(d->cd >= 0.0 && d->cd <= 10.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "payload.drag", "drag must be finite with 0 <= cd <= 10 and CdA >= 0");
    } else if (!(d->diameter_m > 0.0) || !(d->area_m2 > 0.0) || !isfinite(d->area_m2)) {
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "payload.drag.diameter", "a sphere drag model needs a diameter > 0");
    }
    if (!(s->downwash.aircraft_mass_kg >= 0.0) || !isfinite(s->downwash.aircraft_mass_kg) ||
        !(s->downwash.disk_area_m2 >= 0.0) || !isfinite(s->downwash.disk_area_m2))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "release.downwash",
                               "aircraft mass and disk area must be finite and >= 0");
    if (s->n_descent > PLUMB_MAX_DESCENT)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "descent", "at most %d descent devices", PLUMB_MAX_DESCENT);
    for (size_t i = 0; i < s->n_descent; i++) {
        const plumb_descent_spec *dv = &s->descent[i];
        char k[48];
        if (!(dv->cd > 0.0 && dv->cd <= 10.0) || !(dv->area_m2 > 0.0) || !isfinite(dv->area_m2))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, device_key(k, sizeof k, i, ""), "needs 0 < cd <= 10 and area > 0");
        if (!(dv->fill_time_s >= 0.0) || !(dv->fill_constant >= 0.0) || !isfinite(dv->fill_constant))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, device_key(k, sizeof k, i, ".fill_time"), "fill time and fill constant must be >= 0");
        if (!(dv->inflation_exponent >= 0.0 && dv->inflation_exponent <= PLUMB_INFLATION_J_MAX))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, device_key(k, sizeof k, i, ".inflation_exponent"),
                                   "the inflation exponent must lie in 0 (linear) to %g",
                                   PLUMB_INFLATION_J_MAX);
        if (!(dv->opening_factor >= 0.0) || !isfinite(dv->opening_factor))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, device_key(k, sizeof k, i, ".opening_factor"), "C_x must be >= 0");
        if (dv->trigger == PLUMB_DEPLOY_AFTER && !(dv->deploy_value >= 0.0))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, device_key(k, sizeof k, i, ".deploy.after"), "deploy time must be >= 0 s");
        if (dv->trigger == PLUMB_DEPLOY_BELOW && !(dv->deploy_value > 0.0 && dv->deploy_value < r[2]))
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, device_key(k, sizeof k, i, ".deploy.below"),
                                   "deploy height must lie between 0 m and the release height %g m, found %g m",
                                   r[2], dv->deploy_value);
    }
    return PLUMB_OK;
}

