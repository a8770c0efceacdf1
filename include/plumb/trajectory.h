/*
 * plumb/trajectory.h - the fall of a point mass through moving air.
 *
 * Frame: x east, y north, z up, metres; z = 0 is the strike level, whose
 * height above MSL is site_elevation_m. Air is taken at elevation + z.
 * Equation of motion (README.md "The model"):
 *
 *     m dv/dt = -m g(alt) z^ - 1/2 rho(alt) CdA(t, Re) |v - w(z)| (v - w(z))
 *               + rho(alt) V g(alt) z^                     (buoyancy, V > 0)
 *     dx/dt   = v
 *     dW/dt   = F_drag . v                                 (work done by drag)
 *
 * Integrated with GSL gsl_odeiv2 (rk8pd, 8th-order Dormand-Prince, by
 * default) under adaptive error control. The impact, z = 0, is located by
 * Henon's method (M. Henon, "On the numerical computation of Poincare
 * maps", Physica D 5, 412-414, 1982): from the last state above the
 * strike level the system is integrated with z as the independent
 * variable, d(state)/dz = f / (dz/dt), from z_last to exactly 0.
 * A fall that never lands (buoyant, held aloft) or exceeds the step or
 * time budget is an error, never a number.
 *
 * Ownership: a plumb_trajectory workspace owns its GSL objects; reuse one
 * per thread. The spec and the atmosphere are borrowed for the call.
 */
#ifndef PLUMB_TRAJECTORY_H
#define PLUMB_TRAJECTORY_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/atmosphere.h"
#include "plumb/gravity.h"
#include "plumb/wind.h"
#include "plumb/drag.h"
#include "plumb/inflation.h"
#include "plumb/glide.h"
#include "plumb/downwash.h"
#include "plumb/turbulence.h"

enum { PLUMB_MAX_DESCENT = 2, PLUMB_NAME = 128 };

typedef enum plumb_descent_kind {
    PLUMB_DESCENT_PARACHUTE = 0,  /* "parachute" */
    PLUMB_DESCENT_STREAMER,       /* "streamer" */
    PLUMB_DESCENT_DROGUE          /* "drogue" */
} plumb_descent_kind;

/* The profile's word for a kind of device ("parachute", "streamer",
 * "drogue"); a static string. Can't fail. */
const char *plumb_descent_kind_name(plumb_descent_kind kind);

typedef enum plumb_deploy_trigger {
    PLUMB_DEPLOY_AFTER = 0,       /* deploy_value is a time from release, s */
    PLUMB_DEPLOY_BELOW            /* deploy_value is a height above the strike level, m */
} plumb_deploy_trigger;

/* A descent device: after line stretch the canopy's CdS grows from 0 to
 * cd x area as (t / t_f)^j over the fill time t_f (plumb/inflation.h), and
 * adds to the body's CdA. */
typedef struct plumb_descent_spec {
    plumb_descent_kind kind;       /* parachute, streamer, drogue */
    double cd;                     /* canopy drag coefficient on area_m2 */
    double area_m2;                /* nominal area S0, m^2 */
    double diameter_m;             /* nominal diameter D0, m (0 if area given directly) */
    plumb_deploy_trigger trigger;  /* after a time or below a height */
    double deploy_value;           /* s (after) or m (below) */
    double fill_time_s;            /* fill time, s; used when fill_constant is 0 */
    double fill_constant;          /* n in t_f = n D0 / v at line stretch; 0: use fill_time_s */
    int disreefs_previous;         /* 1: this device replaces the previous one (main after drogue) */
    plumb_canopy canopy;           /* canopy type (0: unspecified); the loader fills j, n and
                                      C_x from its table where the profile gives none */
    double inflation_exponent;     /* j of CdS ~ (t/t_f)^j; 0 means 1 (linear) */
    double opening_factor;         /* C_x for Pflanz's estimate; 0: not known */
} plumb_descent_spec;

/* Everything about one fall. Plain data; copy freely. */
typedef struct plumb_fall_spec {
    char name[PLUMB_NAME];         /* payload name, for reports */
    double mass_kg;                /* payload mass, kg (> 0) */
    double volume_m3;              /* displaced volume for buoyancy, m^3 (0: none) */
    plumb_drag_spec drag;          /* the body's drag */
    size_t n_descent;              /* number of descent devices, 0..PLUMB_MAX_DESCENT */
    plumb_descent_spec descent[PLUMB_MAX_DESCENT]; /* in deployment order */
    double release_m[3];           /* release point: east, north, height above strike level, m */
    double velocity_m_s[3];        /* release velocity: east, north, up, m/s (ground frame) */
    double site_elevation_m;       /* strike level above MSL, m */
    plumb_gravity gravity;         /* g0 or WGS 84 at a latitude */
    plumb_wind_spec wind;          /* wind by height */
    plumb_glide_spec glide;        /* sideways glide of a plate, applied by the zone only */
    plumb_downwash_spec downwash;  /* rotor wake of the aircraft at release (0: none) */
    plumb_turbulence_spec turbulence; /* gusts: the model, and a realisation (zone samples only) */
} plumb_fall_spec;

typedef enum plumb_stepper {
    PLUMB_STEPPER_RK8PD = 0,   /* explicit 8th-order Dormand-Prince (default) */
    PLUMB_STEPPER_RKF45,       /* explicit Runge-Kutta-Fehlberg 4(5) */
    PLUMB_STEPPER_MSBDF,       /* implicit multistep BDF, for stiff (very light) falls */
    PLUMB_STEPPER_AUTO         /* rk8pd, or msbdf when 2 g H / v_t^2 exceeds stiff_ratio */
} plumb_stepper;

typedef struct plumb_trajectory_options {
    plumb_stepper stepper;     /* default PLUMB_STEPPER_AUTO */
    double rel_tol;            /* relative error per step, default 1e-9 (measured: <= 2.5e-10
                                  relative error in impact speed and time against the closed
                                  form over 1 m to 3 km and 1 g to 100 g at CdA 0.01 m^2;
                                  1e-8 gave up to 2e-9) */
    double abs_tol;            /* absolute error per step, default 1e-12 (m, m/s, J) */
    double event_rel_tol;      /* the same for the short Henon phases that locate the
                                  impact, a deployment height and the apex, default 1e-10 */
    double event_abs_tol;      /* default 1e-10 */
    double first_step_s;       /* initial step, s, default 1e-3 */
    size_t max_steps;          /* step budget, default 2 000 000 */
    double max_time_s;         /* fall-time budget, s, default 86 400 */
    double stiff_ratio;        /* AUTO switches to msbdf above this 2gH/v_t^2, default 3000
                                  (measured break-even: rk8pd 5436 vs msbdf 7444 evaluations
                                  at 1224, 17097 vs 8012 at 4897, 208847 vs 10500 at 73450) */
    double stiff_rel_tol;      /* msbdf relative tolerance, default 1e-12 (its global error
                                  is ~7e-10 in impact speed there; at 1e-11 it is 5e-9) */
    double stiff_abs_tol;      /* msbdf absolute tolerance, default 1e-14 */
    double energy_check_tol;   /* every fall is checked by the work-energy theorem: the
                                  change of kinetic energy must equal the work of gravity,
                                  buoyancy and drag (integrated alongside) within this
                                  fraction of the larger of the drag-free energy and the
                                  drag work, default 1e-8 (measured: <= 5e-11 on a grid
                                  of light, stiff and parachute falls) */
    double speed_check_tol;    /* a fall from rest in still air can never arrive faster
                                  than the largest terminal speed along its path: allowed
                                  excess, relative, default 1e-9 (the fall's tolerance) */
    int record_path;           /* 1: keep the accepted points for plumb_trajectory_path */
} plumb_trajectory_options;

/* Where the numbers of a fall came from, so cost is visible. */
typedef struct plumb_solver_stats {
    const char *method;        /* GSL stepper name, static string */
    size_t steps;              /* accepted steps */
    size_t rhs_evaluations;    /* evaluations of the right-hand side */
} plumb_solver_stats;

typedef struct plumb_fall_result {
    double time_s;             /* time from release to impact, s */
    double point_m[2];         /* impact point east, north, m */
    double velocity_m_s[3];    /* impact velocity east, north, up (ground frame), m/s */
    double speed_m_s;          /* |v| at impact, m/s */
    double energy_j;           /* 1/2 m v^2 at impact, J */
    double momentum_kg_m_s;    /* m |v| at impact, kg m/s */
    double angle_deg;          /* angle of the impact velocity below horizontal, deg */
    double drift_m;            /* horizontal distance from the release point, m */
    double bearing_deg;        /* bearing of the impact point from the release point, deg from north */
    double apex_m;             /* highest point above the strike level, m */
    double terminal_speed_m_s; /* still-air terminal speed of the body at the strike level, m/s;
                                  0 when it has none (plumb_terminal_speed's errors: no drag) */
    double drag_free_speed_m_s;/* sqrt(v0^2 + 2 g H): speed without drag, m/s */
    double drag_free_energy_j; /* 1/2 m v0^2 + m g H: energy without drag, J */
    double drag_work_j;        /* work done by drag on the body, J: negative when the air
                                  takes energy from it, positive when a wind drives it
                                  faster than its fall alone would */
    double max_mach;           /* largest Mach number of the relative air speed on the way */
    double min_re, max_re;     /* Reynolds number range seen (sphere models), else 0 */
    /* descent device figures (n_descent > 0), indexed as the spec's
     * descent[]: devices with different triggers may open in another
     * order than they are listed (a main by height before a drogue by
     * time), so [i] is always descent[i]'s, valid where deployed[i] */
    size_t n_deployed;         /* devices that reached line stretch before impact */
    int deployed[PLUMB_MAX_DESCENT];             /* 1: descent[i] reached line stretch */
    double deploy_time_s[PLUMB_MAX_DESCENT];     /* line stretch time, s */
    double deploy_height_m[PLUMB_MAX_DESCENT];   /* line stretch height, m */
    double deploy_speed_m_s[PLUMB_MAX_DESCENT];  /* airspeed at line stretch, m/s */
    double fill_time_s[PLUMB_MAX_DESCENT];       /* fill time used, s */
    /* Pflanz's hand estimate per deployed device (plumb/inflation.h), an
     * independent check beside the integrated peak: */
    double pflanz_a[PLUMB_MAX_DESCENT];          /* ballistic parameter A at line stretch */
    double pflanz_x1[PLUMB_MAX_DESCENT];         /* force-reduction factor X_1(A, j) */
    double pflanz_q1s_n[PLUMB_MAX_DESCENT];      /* q_1 (CdS)_0 at line stretch, N */
    double pflanz_force_n[PLUMB_MAX_DESCENT];    /* C_x X_1 q_1 (CdS)_0, N (0 when C_x unknown) */
    double peak_force_n;       /* largest drag force, N */
    double peak_load_g;        /* largest drag force / (m g0) */
    double steady_speed_m_s;   /* terminal speed with all devices open, at strike level, m/s;
                                  0 when there is none */
    double steady_opened_m_s;  /* the same with only the devices this fall opened, that is
                                  filled before impact (plumb_fall_opened_devices: one
                                  still filling has not opened): equal to steady_speed_m_s
                                  when all opened, 0 when none did or there is none
                                  (0.4.0) */
    plumb_solver_stats solver; /* cost of the integration */
} plumb_fall_result;

/* A descent device's state at the instant of impact, one concept for every
 * report (fall, sweep, limit, zone, sheet): it never reached line stretch;
 * it reached line stretch but the impact came before the end of its fill
 * time, so its canopy was still filling; it had filled; or a later device
 * that replaces it (disreefs_previous: a main after a drogue) reached line
 * stretch, so it was gone at impact. */
typedef enum plumb_device_state {
    PLUMB_DEVICE_NOT_DEPLOYED = 0, /* no line stretch before impact */
    PLUMB_DEVICE_FILLING,          /* line stretch, impact before t_ls + t_f */
    PLUMB_DEVICE_OPEN,             /* filled before impact (or no fill time) */
    PLUMB_DEVICE_REPLACED          /* released at the line stretch of the next device; with
                                      fill_fraction < 1 it was cut away while still
                                      filling, and the reports say so */
} plumb_device_state;

typedef struct plumb_device_at_impact {
    plumb_device_state state;
    double fill_fraction;      /* (t_impact - t_ls) / t_f while filling, in [0, 1);
                                  1 when open; when replaced, the same at the next
                                  device's line stretch, at most 1; 0 when not deployed */
    double cds_m2;             /* the canopy's drag area CdS at impact, m^2: the full one
                                  times plumb_inflation_fraction(fill_fraction, j); 0 when
                                  not deployed or replaced */
    double cds_full_m2;        /* the full canopy's cd x area, m^2 */
} plumb_device_at_impact;

/* The state of descent[i] at the impact of the fall res of spec (by its
 * line-stretch time, fill time and impact time: open when
 * t_impact >= t_ls + t_f). out may be NULL. Returns the state; an index
 * past spec->n_descent is PLUMB_DEVICE_NOT_DEPLOYED with zero figures.
 * Can't fail. */
plumb_device_state plumb_fall_device_at_impact(const plumb_fall_spec *spec,
                                               const plumb_fall_result *res, size_t i,
                                               plumb_device_at_impact *out);

/* The devices of res that count in its steady_opened_m_s, bit i for
 * descent[i]: those open at impact (PLUMB_DEVICE_OPEN), and one replaced
 * by a device that is (as the all-open figure counts it; the terminal
 * speed then takes the later one). Can't fail. */
unsigned plumb_fall_opened_devices(const plumb_fall_spec *spec, const plumb_fall_result *res);

/* One recorded point of the path. */
typedef struct plumb_path_point {
    double t_s, x_m, y_m, z_m, vx_m_s, vy_m_s, vz_m_s;
} plumb_path_point;

typedef struct plumb_trajectory plumb_trajectory;

/* Defaults as documented on each field. Can't fail. */
void plumb_trajectory_options_init(plumb_trajectory_options *opt);

/* Allocates a workspace (opt NULL: defaults). On error *out is NULL. */
plumb_status plumb_trajectory_alloc(const plumb_trajectory_options *opt, plumb_trajectory **out);

/* Frees a workspace. Accepts NULL. */
void plumb_trajectory_free(plumb_trajectory *traj);

/* Integrates one fall. On success fills *res. On failure *res is
 * unspecified and diag says what failed and when ("ODE step failed at
 * t=12.40 s"): PLUMB_ENOLAND (never reaches the strike level),
 * PLUMB_EBUDGET (step or time budget), PLUMB_ENUMERIC (the integration
 * failed, or its result failed the energy-balance or terminal-speed check
 * on both kinds of stepper), PLUMB_EOUTSIDE when the path leaves the
 * atmosphere model's range, PLUMB_ENOMEM when recording the path runs out
 * of memory. Invalid specs (mass <= 0, release height <= 0 ...) give
 * PLUMB_EINVAL. Allocates nothing unless record_path is set. */
plumb_status plumb_trajectory_run(plumb_trajectory *traj, const plumb_fall_spec *spec,
                                  const plumb_atmosphere *atm, plumb_fall_result *res,
                                  plumb_diag *diag);

/* The points recorded by the last run (record_path = 1), else NULL / 0.
 * Owned by the workspace; valid until the next run or free. */
const plumb_path_point *plumb_trajectory_path(const plumb_trajectory *traj, size_t *n);

/* W20 of the spec's turbulence, m/s: as given, or the mean wind's speed at
 * 20 ft (6.096 m) when from_wind is set; 0 without turbulence. Can't fail. */
double plumb_fall_w20(const plumb_fall_spec *spec);

/* Terminal speeds above this are none (PLUMB_ENOSOLUTION), m/s: a body
 * with so little drag falls as if it had none over any height the air
 * model spans. */
#define PLUMB_TERMINAL_MAX_M_S 1e6

/* Still-air terminal speed of the spec's body (with all devices open when
 * with_devices is 1) at height z_m above the strike level, m/s: the lowest
 * root of 1/2 rho CdA(Re) v^2 = m g (1 - rho V / m), where a body falling
 * from rest settles (a sphere in the drag crisis can have three roots).
 * Errors: PLUMB_ENOSOLUTION when the body has no drag (or its terminal
 * speed is above PLUMB_TERMINAL_MAX_M_S), PLUMB_ENOLAND when buoyancy exceeds weight,
 * PLUMB_EOUTSIDE when the altitude is outside the air model, PLUMB_ENUMERIC
 * when the root finder fails, PLUMB_ENOMEM. *v_m_s is untouched on error.
 * Allocates its solver per call: plumb_trajectory_run uses the workspace's. */
plumb_status plumb_terminal_speed(const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                                  double z_m, int with_devices, double *v_m_s);

#endif /* PLUMB_TRAJECTORY_H */
