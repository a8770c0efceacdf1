/*
 * bench.c - `make bench`: the cost of one fall, measured, not asserted.
 *
 * For four fixed cases (issue 4) it prints the RHS evaluations per fall,
 * the time per fall, the cost of one RHS evaluation measured in the same
 * run on the states the fall visits, and the ratio
 *     time per fall / (evaluations x RHS cost),
 * i.e. how much the integrator adds on top of the physics. The accuracy
 * of each fall is checked against a run at rel_tol 1e-14.
 * Cases (all at sea level, U.S. Standard Atmosphere 1976):
 *   wrench     2.4 kg, Cd 1.0, A 0.005 m^2, 30 m, still air
 *   drone      0.5 kg, Cd 1.0, A 0.02 m^2, 10 m/s north, 120 m,
 *              power-law wind 8 m/s at 10 m from 270 deg, exponent 1/7
 *   parachute  2.0 kg, CdA 0.5 m^2, 120 m, same wind
 *   light      10 g, Cd 1.0, A 0.01 m^2, 50 m, still air
 * The Monte Carlo part is in bench_zone.sh (run by `make bench` after this).
 */
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>

#include "plumb/plumb.h"
#include "internal.h"

/* Measure each figure over at least this long, s. */
#define MIN_SECONDS 0.4

typedef struct bench_case {
    const char *name;
    double mass_kg, cd, area_m2, height_m, north_m_s, wind_m_s;
    double max_evals; /* the target */
} bench_case;

static const bench_case cases[] = {
    {"wrench", 2.4, 1.0, 0.005, 30.0, 0.0, 0.0, 160},
    {"drone", 0.5, 1.0, 0.02, 120.0, 10.0, 8.0, 960},
    {"parachute", 2.0, 1.0, 0.5, 120.0, 0.0, 8.0, 1350},
    {"light", 0.010, 1.0, 0.01, 50.0, 0.0, 0.0, 490},
};

static double now_s(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

static void make_spec(const bench_case *c, plumb_fall_spec *s)
{
    memset(s, 0, sizeof *s);
    s->mass_kg = c->mass_kg;
    s->drag.cd = c->cd;
    s->drag.area_m2 = c->area_m2;
    s->release_m[2] = c->height_m;
    s->velocity_m_s[1] = c->north_m_s;
    plumb_wind_spec_init(&s->wind);
    if (c->wind_m_s > 0.0) {
        s->wind.profile = PLUMB_WIND_POWER;
        s->wind.speed_m_s = c->wind_m_s;
        s->wind.from_deg = 270.0;
        s->wind.exponent = 1.0 / 7.0;
        s->wind.ref_height_m = 10.0;
    }
}

int main(void)
{
    gsl_set_error_handler_off();
    plumb_atm_spec as;
    plumb_atm_spec_init(&as);
    plumb_atmosphere *atm = NULL;
    plumb_diag d;
    if (plumb_atmosphere_alloc(&as, &atm, &d) != PLUMB_OK)
        return 3;
    plumb_trajectory_options o;
    plumb_trajectory_options_init(&o);
    plumb_trajectory *w = NULL, *rec = NULL, *tight = NULL;
    plumb_trajectory_alloc(&o, &w);
    o.record_path = 1;
    plumb_trajectory_alloc(&o, &rec);
    plumb_trajectory_options_init(&o);
    o.rel_tol = 1e-14;
    o.abs_tol = 1e-14;
    o.event_rel_tol = 1e-14;
    o.event_abs_tol = 1e-14;
    plumb_trajectory_alloc(&o, &tight);
    if (!w || !rec || !tight)
        return 3;

    printf("plumb bench: one fall per case (default tolerances; error against rel_tol 1e-14)\n");
    printf("%-10s %8s %7s %9s %11s %11s %7s %10s\n", "case", "method", "evals", "target",
           "us/fall", "ns/RHS", "ratio", "speed err");
    int status = 0;
    for (size_t i = 0; i < sizeof cases / sizeof *cases; i++) {
        const bench_case *c = &cases[i];
        plumb_fall_spec s;
        make_spec(c, &s);
        plumb_fall_result r, rt;
        if (plumb_trajectory_run(w, &s, atm, &r, &d) != PLUMB_OK ||
            plumb_trajectory_run(tight, &s, atm, &rt, &d) != PLUMB_OK ||
            plumb_trajectory_run(rec, &s, atm, &rt, &d) != PLUMB_OK) {
            fprintf(stderr, "bench: %s failed: %s\n", c->name, d.message);
            return 3;
        }
        plumb_trajectory_run(tight, &s, atm, &rt, &d);
        /* time per fall */
        size_t n = 0;
        double t0 = now_s(), t1 = t0;
        while (t1 - t0 < MIN_SECONDS) {
            for (int k = 0; k < 50; k++, n++)
                plumb_trajectory_run(w, &s, atm, &r, &d);
            t1 = now_s();
        }
        double per_fall = (t1 - t0) / (double)n;
        /* RHS cost on the states this fall visits */
        size_t np = 0;
        const plumb_path_point *p = plumb_trajectory_path(rec, &np);
        double sink = 0.0, f[7];
        size_t m = 0;
        t0 = now_s();
        t1 = t0;
        while (t1 - t0 < MIN_SECONDS) {
            for (size_t k = 0; k < np; k++, m++) {
                double y[7] = {p[k].x_m, p[k].y_m, p[k].z_m, p[k].vx_m_s, p[k].vy_m_s, p[k].vz_m_s, 0.0};
                plumbp_fall_rhs(&s, atm, p[k].t_s, y, f);
                sink += f[5];
            }
            t1 = now_s();
        }
        double per_rhs = (t1 - t0) / (double)m;
        double evals = (double)r.solver.rhs_evaluations;
        double err = fabs(r.speed_m_s - rt.speed_m_s) / rt.speed_m_s;
        printf("%-10s %8s %7.0f %9.0f %11.2f %11.1f %7.2f %10.1e%s\n", c->name, r.solver.method,
               evals, c->max_evals, per_fall * 1e6, per_rhs * 1e9, per_fall / (evals * per_rhs),
               err, sink == 12345.678 ? " " : "");
        if (evals > c->max_evals || err > 1e-8)
            status = 1;
    }
    printf("targets: evaluations <= target, ratio <= 1.5, speed error <= 1e-8\n");
    plumb_trajectory_free(w);
    plumb_trajectory_free(rec);
    plumb_trajectory_free(tight);
    plumb_atmosphere_free(atm);
    (void)status; /* a benchmark reports; it does not fail the build */
    return 0;
}
