/*
 * trajectory_int.h - what the files of the fall share: trajectory.c (the
 * run: segments between events, Henon's method, the checks of a result),
 * trajectory_rhs.c (the right-hand side of the equations of motion and
 * Henon's form of it), trajectory_work.c (the workspace and the checks of
 * a spec) and trajectory_terminal.c (the terminal speed). The state
 * layout, the right-hand side's context, the workspace's definition, and
 * the functions called across files (plumbp_traj_ prefix). Internal to
 * libplumb; not installed.
 */
#ifndef PLUMB_TRAJECTORY_INT_H
#define PLUMB_TRAJECTORY_INT_H

#include <stddef.h>

#include <gsl/gsl_min.h>
#include <gsl/gsl_odeiv2.h>
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
 * the strike level (see plumbp_traj_local_at), m: far below any step the
 * integrator resolves, yet positive. */
#define WIND_Z_MIN_M 1e-9
/* Location of the peak opening force: Brent iterations and time tolerance, s.
 * Near a smooth maximum F(t* + d) = F* (1 - d^2 / (2 tau^2)) with tau the
 * force's time scale (0.01 s or more through a fill), so 1e-6 s places the
 * peak force to 5e-9 relative at worst, 5e-11 at tau = 0.1 s (measured: the
 * drone-canopy demo's peak is the same to all 17 digits as at 1e-9 s, with
 * 1477 right-hand-side evaluations instead of 5915). */
#define PEAK_MAX_ITER 100
#define PEAK_ABS_TOL_S 1e-6
/* Fraction of the predicted time to an event covered by the approach step. */
#define APPROACH_FRACTION 0.9
/* A rise this far above the drag-free apex means the object is buoyant. */
#define RISE_MARGIN_M 1.0

typedef struct fall_ctx fall_ctx;

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
    double wind_log_span;       /* log-law wind: plumbp_wind_log_span (else unused) */
    size_t n_dev;
    device_state dev[PLUMB_MAX_DESCENT];
    size_t evals;               /* RHS evaluations */
    plumb_status fail;          /* set when the RHS cannot be evaluated */
    double fail_alt_m;
    double vt_max_m_s;          /* fixed drag: largest body terminal speed at the accepted points */
    plumb_downwash dw;          /* the rotor wake at release, if any */
    int turb;                   /* 1: realised gusts are added to the wind */
    double w20_m_s;             /* their W20 */
    double g_normal_m_s2;       /* plumbp_gravity_normal of the spec's gravity */
    /* the air, gravity and mean wind at the last height (height_terms) */
    int memo_ok;                /* 1: the fields below hold */
    double memo_z;              /* y[IZ] they are for, m (compared bit for bit) */
    plumb_air memo_air;
    double memo_g, memo_we, memo_wn;
};


/* Local air, relative velocity and drag acceleration at (t, y). */
typedef struct local {
    plumb_air air;
    double g;
    double vr[3];
    double vr_abs;
    double re;
    double cda;
} local;

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

/* ---- workspace ------------------------------------------------------------ */

struct plumb_trajectory {
    plumb_trajectory_options opt;
    fall_ctx ctx;                  /* the run's right-hand-side context */
    gsl_odeiv2_system sys;         /* plumbp_traj_rhs_time over ctx */
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
    int peak_unread;               /* 1: the caller reads neither peak_force_n nor peak_load_g
                                      (plumbp_traj_peak_unread) */
};

/* trajectory_rhs.c */
void plumbp_traj_ctx_init(fall_ctx *c, const plumb_fall_spec *spec, const plumb_atmosphere *atm);
int plumbp_traj_local_at(fall_ctx *c, double t, const double y[], local *L);
int plumbp_traj_rhs_time(double t, const double y[], double f[], void *params);
int plumbp_traj_jac_time(double t, const double y[], double *dfdy, double dfdt[], void *params);
int plumbp_traj_rhs_henon(double s, const double u[], double du[], void *params);

/* trajectory_work.c */
plumb_status plumbp_traj_check_spec(const plumb_fall_spec *s, plumb_diag *diag);

/* trajectory_terminal.c */
/* The terminal speed at z_m with the descent devices whose bits are set
 * in `devices` open (bit i: descent[i]; 0: the body alone;
 * PLUMBP_ALL_DEVICES: every one); a device replaced by the next one
 * (disreefs_previous) counts only when that one is not open. */
#define PLUMBP_ALL_DEVICES (~0u)
plumb_status plumbp_traj_terminal_speed(const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                                        double z_m, unsigned devices, gsl_root_fsolver *root,
                                        gsl_min_fminimizer *mz, double *v_m_s);

/* trajectory_terminal.c: 1 when the fall of spec cannot end within
 * opt->max_time_s, by a bound no fall beats (fixed drag, no vertical air
 * motion; see there); *t_min_s the least time, *vt_m_s the terminal speed
 * in the thinnest air of the path. 0 when it may end in time or no bound
 * applies. */
int plumbp_traj_outlasts_budget(const plumb_trajectory_options *opt, const plumb_fall_spec *spec,
                                const plumb_atmosphere *atm, double *t_min_s, double *vt_m_s);

#endif
