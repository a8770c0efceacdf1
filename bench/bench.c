/*
 * bench.c - `make bench`: the cost of one fall, measured, not asserted.
 *
 * For four fixed cases (still air, wind, a canopy, a stiff light object:
 * the integrator's kinds of work) it prints the RHS evaluations per fall,
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
 * Then `plumb zone` throughput on the drone case with mass +-10 %, Cd
 * +-20 % and wind 0-12 m/s from any direction (uniform), at 1 thread and
 * at all threads, and the peak resident memory of whole zone runs of 1e5,
 * 1e6 and 1e7 samples (each in a child process, getrusage). The baseline
 * measured in the same run is a general-purpose ODE script: SciPy's
 * solve_ivp (DOP853, rtol 1e-10) on the same drone fall, when
 * /usr/bin/python3 has SciPy.
 * Then the cost of one `plumb sweep` row and of one `plumb limit`
 * evaluation, each as a ratio to one bare plumb_trajectory_run of the same
 * fall (target: at most 1.5, so that a sweep or limit costs little more
 * than the falls it is made of), on a profile like the drone case
 * (log wind, 1976 air with an offset, a site 1650 m up): the sweep over a
 * wind key and over an air key (which rebuilds the air), the limit over
 * release.position.east (every fall costs the same) and over
 * atmosphere.temperature_offset (air rebuilt per evaluation).
 * Set PLUMB_BENCH_MAX_SAMPLES to stop the memory runs earlier.
 *
 * Usage: bench [SECTION...], SECTION one of fall, study (sweep rows and
 * limit evaluations), memory, zone, baseline; none: all of them, in that
 * order (`make bench`). E.g. `BUILD/bench/bench study` for the sweep and
 * limit ratios alone.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>
#include <stdlib.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

#include <gsl/gsl_errno.h>

#include "plumb/plumb.h"
#include "core/internal.h"
#include "physics/physics.h"

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

/* The same drone fall by a general-purpose ODE script (SciPy solve_ivp,
 * DOP853, the 1976 troposphere and the power law written again), timed in
 * the same run; prints plumb's per-fall time as a ratio of it. */
static void scipy_baseline(double plumb_us)
{
    static const char script[] =
        "import math,time\n"
        "from scipy.integrate import solve_ivp\n"
        "def air(z):\n"
        "    h=6356766.0*z/(6356766.0+z); t=288.15-0.0065*h\n"
        "    p=101325.0*(288.15/t)**(9.80665*28.9644/(8314.32*-0.0065)); return p/(287.05307*t)\n"
        "def f(t,y):\n"
        "    w=8.0*(y[2]/10.0)**(1/7) if y[2]>0 else 0.0\n"
        "    vr=(y[3]-w,y[4],y[5]); s=math.sqrt(vr[0]**2+vr[1]**2+vr[2]**2)\n"
        "    k=0.5*air(y[2])*0.02*s/0.5\n"
        "    return [y[3],y[4],y[5],-k*vr[0],-k*vr[1],-k*vr[2]-9.80665]\n"
        "def g(t,y): return y[2]\n"
        "g.terminal=True; g.direction=-1\n"
        "n=20; t0=time.perf_counter()\n"
        "for i in range(n): solve_ivp(f,(0,100),[0,0,120,0,10,0],method='DOP853',rtol=1e-10,atol=1e-10,events=g)\n"
        "print((time.perf_counter()-t0)/n*1e6)\n";
    char path[] = "/tmp/plumb-bench-XXXXXX";
    int fd = mkstemp(path);
    if (fd < 0)
        return;
    if (write(fd, script, sizeof script - 1) != (ssize_t)(sizeof script - 1)) {
        close(fd);
        unlink(path);
        return;
    }
    close(fd);
    char cmd[128];
    snprintf(cmd, sizeof cmd, "/usr/bin/python3 %s 2>/dev/null", path);
    FILE *py = popen(cmd, "r");
    double us = 0.0;
    if (py) {
        if (fscanf(py, "%lf", &us) != 1)
            us = 0.0;
        pclose(py);
    }
    unlink(path);
    if (us > 0.0)
        printf("\nbaseline: the drone fall by SciPy solve_ivp (DOP853) takes %.0f us; plumb %.1f us, "
               "%.0fx faster\n", us, plumb_us, us / plumb_us);
    else
        printf("\nbaseline: /usr/bin/python3 with SciPy not found; no baseline\n");
}

/* The zone case: the drone fall with mass +-10 %, Cd +-20 %, wind
 * 0-12 m/s from any direction. */
/* ---- sweep rows and limit evaluations against bare falls -------------- */

static const char study_profile[] =
    "name: bench study\n"
    "payload:\n  mass: 0.85 kg\n  drag: {cd: 1.05, area: 0.0376 m^2}\n"
    "release:\n  height: 30 m\n  velocity: {east: -6.4 m/s, north: 1.13 m/s, up: 0 m/s}\n"
    "site: {elevation: 1650 m, latitude: -31.4 deg}\n"
    "atmosphere: {model: standard-1976, temperature_offset: 18 K, humidity: 25 %}\n"
    "wind: {profile: log, speed: 5.8 m/s, from: 280 deg, reference_height: 10 m, "
    "roughness: 0.03 m}\n";

/* This thread's CPU time, s: on a machine shared with other work, a
 * figure that being descheduled does not inflate. */
static double cpu_s(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_THREAD_CPUTIME_ID, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

/* Rounds of a study case: each round times the command's work and then
 * the same number of bare falls, interleaved, and the least time of each
 * over the rounds is kept (the least disturbed by other work). */
#define STUDY_ROUNDS 15

/* CPU time of one bare fall of each spec (with its own air), s. */
static double bare_pass(plumb_trajectory *w, const plumb_fall_spec *const *specs,
                        plumb_atmosphere *const *atms, size_t n)
{
    plumb_fall_result r;
    plumb_diag d;
    double t0 = cpu_s();
    for (size_t k = 0; k < n; k++)
        plumb_trajectory_run(w, specs[k], atms[k], &r, &d);
    return cpu_s() - t0;
}

static void sweep_case(const plumb_profile *p, const plumb_units *u, const plumb_criteria *cr,
                       plumb_trajectory *w, const char *vary)
{
    plumb_range ax;
    plumb_diag d;
    if (plumb_range_parse_key(u, vary, &ax, &d) != PLUMB_OK) {
        fprintf(stderr, "bench: %s: %s\n", vary, d.message);
        return;
    }
    /* the same falls, bare: each row's spec in that row's air */
    plumb_sweep *sw = NULL;
    if (plumb_sweep_run(p, u, cr, &ax, 1, w, &sw, &d) != PLUMB_OK) {
        fprintf(stderr, "bench: sweep %s: %s\n", vary, d.message);
        return;
    }
    size_t nr = plumb_sweep_row_count(sw);
    const plumb_fall_spec *specs[64] = {NULL};
    plumb_atmosphere *atms[64] = {NULL};
    size_t m = 0;
    for (size_t i = 0; i < nr && m < 64; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status != PLUMB_OK)
            continue;
        if (plumb_atmosphere_alloc(plumb_profile_atmosphere(row->report.profile), &atms[m], &d) !=
            PLUMB_OK)
            break;
        specs[m++] = row->report.items[0].spec;
    }
    double per_row = HUGE_VAL, bare = HUGE_VAL;
    for (int k = 0; k < STUDY_ROUNDS && m > 0; k++) {
        plumb_sweep *one = NULL;
        double t0 = cpu_s();
        plumb_status st = plumb_sweep_run(p, u, cr, &ax, 1, w, &one, &d);
        double t = cpu_s() - t0;
        plumb_sweep_free(one);
        if (st != PLUMB_OK)
            break;
        if (t / (double)nr < per_row)
            per_row = t / (double)nr;
        t = bare_pass(w, specs, atms, m) / (double)m;
        if (t < bare)
            bare = t;
    }
    printf("sweep %-44s %5zu rows %9.2f us/row %9.2f us/fall %6.2f\n", vary, nr, per_row * 1e6,
           bare * 1e6, per_row / bare);
    for (size_t i = 0; i < m; i++)
        plumb_atmosphere_free(atms[i]);
    plumb_sweep_free(sw);
}

static void limit_case(const plumb_profile *p, const plumb_units *u, plumb_trajectory *w,
                       const char *key, plumb_metric metric, double limit)
{
    plumb_limit_result res;
    plumb_diag d;
    plumb_atmosphere *atm = NULL;
    if (plumb_atmosphere_alloc(plumb_profile_atmosphere(p), &atm, &d) != PLUMB_OK)
        return;
    const plumb_fall_spec *spec = plumb_profile_item(p, 0);
    double per_eval = HUGE_VAL, bare = HUGE_VAL;
    for (int k = 0; k < STUDY_ROUNDS; k++) {
        double t0 = cpu_s();
        if (plumb_limit_solve(p, u, 0, key, metric, limit, NULL, w, &res, &d) != PLUMB_OK) {
            fprintf(stderr, "bench: limit %s: %s\n", key, d.message);
            plumb_atmosphere_free(atm);
            return;
        }
        double t = (cpu_s() - t0) / (double)res.evaluations;
        if (t < per_eval)
            per_eval = t;
        /* as many bare falls as the solve made, so that both take as long */
        t0 = cpu_s();
        for (size_t i = 0; i < res.evaluations; i++)
            bare_pass(w, &spec, &atm, 1);
        t = (cpu_s() - t0) / (double)res.evaluations;
        if (t < bare)
            bare = t;
    }
    printf("limit %-44s %5zu evals %8.2f us/eval %8.2f us/fall %6.2f\n", key, res.evaluations,
           per_eval * 1e6, bare * 1e6, per_eval / bare);
    plumb_atmosphere_free(atm);
}

static void study_bench(plumb_trajectory *w)
{
    plumb_units *u = NULL;
    plumb_profile *p = NULL;
    plumb_criteria *cr = NULL;
    plumb_diag d;
    if (plumb_units_alloc(&u, &d) != PLUMB_OK ||
        plumb_profile_load_buffer("<bench>", study_profile, sizeof study_profile - 1, u, NULL, 0,
                                  &p, &d) != PLUMB_OK ||
        plumb_criteria_load_dir("profiles/criteria", u, &cr, &d) != PLUMB_OK) {
        fprintf(stderr, "bench: study profile: %s\n", d.message);
        plumb_profile_free(p);
        plumb_units_free(u);
        return;
    }
    printf("\nplumb bench: one sweep row and one limit evaluation against one bare fall\n"
           "(thread CPU time, least of %d interleaved rounds)\n", STUDY_ROUNDS);
    printf("%-50s %10s %16s %14s %6s\n", "case", "count", "cost", "bare", "ratio");
    sweep_case(p, u, cr, w, "wind.speed=5 m/s:5.9 m/s:0.1 m/s");
    sweep_case(p, u, cr, w, "payload.mass=0.80 kg:0.89 kg:0.01 kg");
    sweep_case(p, u, cr, w, "atmosphere.temperature_offset=10 K:19 K:1 K");
    limit_case(p, u, w, "release.position.east", PLUMB_METRIC_DRIFT, 1.0);
    limit_case(p, u, w, "atmosphere.temperature_offset", PLUMB_METRIC_ENERGY, 100.0);
    limit_case(p, u, w, "wind.speed", PLUMB_METRIC_DRIFT, 4.0);
    printf("target: ratio <= 1.5 (the study's overhead on a bare fall)\n");
    plumb_criteria_free(cr);
    plumb_profile_free(p);
    plumb_units_free(u);
}

static void zone_case(plumb_fall_spec *s, plumb_uncertainty u[4], plumb_zone_spec *z, size_t n)
{
    make_spec(&cases[1], s);
    memset(u, 0, 4 * sizeof *u);
    snprintf(u[0].key, sizeof u[0].key, "payload.mass");
    u[0].kind = PLUMB_DIST_UNIFORM;
    u[0].param[0] = 0.45, u[0].param[1] = 0.55;
    snprintf(u[1].key, sizeof u[1].key, "payload.drag.cd");
    u[1].kind = PLUMB_DIST_UNIFORM;
    u[1].param[0] = 0.8, u[1].param[1] = 1.2;
    snprintf(u[2].key, sizeof u[2].key, "wind.speed");
    u[2].kind = PLUMB_DIST_UNIFORM;
    u[2].param[0] = 0.0, u[2].param[1] = 12.0;
    snprintf(u[3].key, sizeof u[3].key, "wind.from");
    u[3].kind = PLUMB_DIST_UNIFORM;
    u[3].param[0] = 0.0, u[3].param[1] = 360.0;
    memset(z, 0, sizeof *z);
    z->samples = n;
    z->seed = 20250;
    z->confidence = 0.99;
}

static double zone_rate(const plumb_atmosphere *atm, size_t threads, size_t n)
{
    plumb_fall_spec s;
    plumb_uncertainty u[4];
    plumb_zone_spec z;
    zone_case(&s, u, &z, n);
    plumb_zone_options o;
    plumb_zone_options_init(&o);
    o.threads = threads;
    static plumb_zone_result res;
    plumb_diag d;
    double t0 = now_s();
    if (plumb_zone_run(&s, atm, u, 4, &z, NULL, 0, &o, &res, &d) != PLUMB_OK) {
        fprintf(stderr, "bench: zone failed: %s\n", d.message);
        return 0.0;
    }
    return (double)n / (now_s() - t0);
}

/* Peak memory of whole zone runs, each in a child forked before this
 * process has run any zone (so the child starts from the parent's small
 * footprint, printed first). */
static void zone_memory(const plumb_atmosphere *atm)
{
    size_t all = plumb_zone_default_threads();
    struct rusage self;
    getrusage(RUSAGE_SELF, &self);
    printf("\nplumb zone memory (this process before any zone run: %.1f MB)\n",
           (double)self.ru_maxrss / 1024.0);
    const char *cap_env = getenv("PLUMB_BENCH_MAX_SAMPLES");
    double cap = cap_env ? strtod(cap_env, NULL) : 1e7;
    printf("  peak resident memory of a whole zone run (child process, all threads):\n");
    for (double m = 1e5; m <= cap * (1.0 + 1e-9); m *= 10.0) {
        fflush(stdout);
        pid_t pid = fork();
        if (pid == 0) {
            double rate = zone_rate(atm, all, (size_t)m);
            _exit(rate > 0.0 ? 0 : 3);
        }
        int status = 0;
        struct rusage ru;
        double t0 = now_s();
        /* RUSAGE_CHILDREN holds the largest child's peak; the runs grow, so
         * it is this one's */
        if (pid < 0 || waitpid(pid, &status, 0) < 0 || getrusage(RUSAGE_CHILDREN, &ru) != 0) {
            printf("    %.0e samples: could not run\n", m);
            continue;
        }
        printf("    %.0e samples: %6.1f MB in %.1f s%s\n", m, (double)ru.ru_maxrss / 1024.0,
               now_s() - t0, WIFEXITED(status) && WEXITSTATUS(status) == 0 ? "" : " (failed)");
    }
    printf("  target: <= 64 MB at 1e7 samples\n");
}

static void zone_bench(const plumb_atmosphere *atm)
{
    size_t all = plumb_zone_default_threads();
    const size_t n = 100000;
    double r1 = zone_rate(atm, 1, n), ra = zone_rate(atm, all, n);
    printf("\nplumb zone, drone case (mass +-10%%, Cd +-20%%, wind 0-12 m/s from any direction), "
           "%zu samples\n", n);
    printf("  1 thread    %8.0f falls/s\n", r1);
    printf("  %zu threads  %8.0f falls/s, %.2fx the 1-thread rate\n", all, ra, ra / r1);
    printf("  targets: >= 30000 falls/s on 2 cores, 2 threads >= 1.8x 1 thread\n");
}

/* The four cases of one fall each: evaluations, time, RHS cost, error.
 * Returns 3 when a fall fails, 1 when a target is missed, else 0. */
static int fall_bench(plumb_trajectory *w, plumb_trajectory *rec, plumb_trajectory *tight,
                      const plumb_atmosphere *atm)
{
    plumb_diag d;
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
    return status;
}

/* 1 when the section is to run: no arguments, or named among them. */
static int wanted(int argc, char **argv, const char *section)
{
    if (argc < 2)
        return 1;
    for (int i = 1; i < argc; i++)
        if (strcmp(argv[i], section) == 0)
            return 1;
    return 0;
}

int main(int argc, char **argv)
{
    static const char *const sections[] = {"fall", "study", "memory", "zone", "baseline"};
    for (int i = 1; i < argc; i++) {
        size_t k = 0;
        while (k < sizeof sections / sizeof *sections && strcmp(argv[i], sections[k]) != 0)
            k++;
        if (k == sizeof sections / sizeof *sections) {
            fprintf(stderr, "bench: unknown section '%s' (fall, study, memory, zone, baseline)\n",
                    argv[i]);
            return 2;
        }
    }
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

    int status = wanted(argc, argv, "fall") ? fall_bench(w, rec, tight, atm) : 0;
    if (status == 3)
        return 3;
    double drone_us = 0.0;
    if (wanted(argc, argv, "baseline")) {
        plumb_fall_spec s;
        make_spec(&cases[1], &s);
        plumb_fall_result r;
        size_t n = 0;
        double t0 = now_s(), t1 = t0;
        while (t1 - t0 < MIN_SECONDS) {
            for (int k = 0; k < 50; k++, n++)
                plumb_trajectory_run(w, &s, atm, &r, &d);
            t1 = now_s();
        }
        drone_us = (t1 - t0) / (double)n * 1e6;
    }
    /* memory first: RUSAGE_CHILDREN keeps the largest child's peak, and the
     * SciPy baseline's interpreter is a child too */
    if (wanted(argc, argv, "study"))
        study_bench(w);
    if (wanted(argc, argv, "memory"))
        zone_memory(atm);
    if (wanted(argc, argv, "zone"))
        zone_bench(atm);
    if (wanted(argc, argv, "baseline"))
        scipy_baseline(drone_us);
    plumb_trajectory_free(w);
    plumb_trajectory_free(rec);
    plumb_trajectory_free(tight);
    plumb_atmosphere_free(atm);
    (void)status; /* a benchmark reports; it does not fail the build */
    return 0;
}
