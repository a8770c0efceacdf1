/*
 * inverse.c - the value of one input at which a limit is just met
 * (see include/plumb/inverse.h for the method: bracketing, then Brent's
 * method, R. P. Brent 1973, through GSL's gsl_root_fsolver_brent).
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>

#include "plumb/inverse.h"
#include "internal.h"

/* Geometric and additive bracketing: each step doubles the distance. */
#define GROWTH 2.0
/* Positive inputs are searched from base / SPAN to base x SPAN. */
#define SPAN 1e6
/* Brent iterations at most. */
#define MAX_ITER 200

typedef enum range_kind {
    RANGE_POSITIVE,   /* (0, hi]: geometric steps */
    RANGE_NONNEG,     /* [0, hi]: additive steps from the base */
    RANGE_SIGNED,     /* [lo, hi] both signs: additive steps */
    RANGE_BOUNDED     /* [lo, hi] given */
} range_kind;

typedef struct key_range {
    range_kind kind;
    double lo, hi;
} key_range;

typedef struct solver_ctx {
    const plumb_profile *profile;
    const plumb_units *units;
    size_t item;
    char set_key[PLUMB_DIAG_KEY + 16];
    plumb_dim dim;
    plumb_metric metric;
    double limit;
    plumb_trajectory *traj;
    size_t evals, max_evals;
    plumb_status fail;
    plumb_diag *diag;
    int out_of_range;   /* the last x was refused by the profile's checks */
} solver_ctx;

void plumb_limit_options_init(plumb_limit_options *opt)
{
    opt->rel_tol = 1e-10;
    opt->max_evaluations = 200;
}

static const char *metric_name(plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? "impact speed" : m == PLUMB_METRIC_DRIFT ? "drift" : "impact energy";
}

static const char *metric_unit(plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? "m/s" : m == PLUMB_METRIC_DRIFT ? "m" : "J";
}

static double metric_of(const plumb_fall_result *r, plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? r->speed_m_s : m == PLUMB_METRIC_DRIFT ? r->drift_m : r->energy_j;
}

static int starts_with(const char *s, const char *prefix)
{
    return strncmp(s, prefix, strlen(prefix)) == 0;
}

static key_range range_of(const char *key, plumb_dim dim, const plumb_fall_spec *spec)
{
    key_range r = {RANGE_POSITIVE, 0.0, INFINITY};
    if (strcmp(key, "release.height") == 0) {
        r.hi = 86000.0 - spec->site_elevation_m;
    } else if (strcmp(key, "site.elevation") == 0) {
        r = (key_range){RANGE_BOUNDED, -5000.0, 86000.0 - spec->release_m[2]};
    } else if (starts_with(key, "release.velocity.") && strcmp(key, "release.velocity.speed") != 0) {
        r = (key_range){RANGE_SIGNED, -1000.0, 1000.0};
    } else if (starts_with(key, "release.position.")) {
        r = (key_range){RANGE_SIGNED, -1e6, 1e6};
    } else if (dim == PLUMB_DIM_TEMP_DIFF) {
        r = (key_range){RANGE_SIGNED, -150.0, 150.0};
    } else if (dim == PLUMB_DIM_FRACTION) {
        r = (key_range){RANGE_BOUNDED, 0.0, 1.0};
    } else if (dim == PLUMB_DIM_NONE && strstr(key, "cd") != NULL) {
        r = (key_range){RANGE_BOUNDED, 0.0, 10.0};
    } else if (dim == PLUMB_DIM_SPEED || dim == PLUMB_DIM_TIME || dim == PLUMB_DIM_NONE) {
        r = (key_range){RANGE_NONNEG, 0.0, dim == PLUMB_DIM_SPEED ? 1000.0 : 1e6};
    }
    return r;
}

/* Base value of the key in the item's spec (or the atmosphere). */
static int base_value(const plumb_profile *p, size_t item, const char *key, double *out)
{
    plumb_fall_spec copy = *plumb_profile_item(p, item);
    if (strcmp(key, "release.velocity.speed") == 0) {
        *out = hypot(copy.velocity_m_s[0], copy.velocity_m_s[1]);
        return 1;
    }
    double *f = plumb_fall_spec_field(&copy, key);
    if (f) {
        *out = *f;
        return 1;
    }
    const plumb_atm_spec *a = plumb_profile_atmosphere(p);
    if (strcmp(key, "atmosphere.temperature_offset") == 0)
        *out = a->temperature_offset_k;
    else if (strcmp(key, "atmosphere.pressure") == 0)
        *out = a->station_pressure_pa;
    else if (strcmp(key, "atmosphere.temperature") == 0)
        *out = a->station_temperature_k;
    else if (strcmp(key, "atmosphere.lapse_rate") == 0)
        *out = a->lapse_rate_k_m;
    else if (strcmp(key, "atmosphere.humidity") == 0)
        *out = a->relative_humidity;
    else
        return 0;
    return 1;
}

/* One fall at key = x. Returns the metric minus the limit, or NaN with
 * ctx->fail set (or ctx->out_of_range for a value the profile refuses). */
static double eval_at(double x, void *params)
{
    solver_ctx *c = params;
    c->out_of_range = 0;
    if (c->evals >= c->max_evals) {
        c->fail = PLUMB_RAISE_KEY(c->diag, PLUMB_ENUMERIC, c->set_key,
                                  "no answer within %zu falls", c->max_evals);
        return NAN;
    }
    char set[PLUMB_DIAG_KEY + 64];
    const char *unit = plumb_dim_si_unit(c->dim);
    int bare = !*unit || strcmp(unit, "1") == 0;
    snprintf(set, sizeof set, "%s=%.17g%s%s", c->set_key, x, bare ? "" : " ", bare ? "" : unit);
    const char *sets[1] = {set};
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_profile_derive(c->profile, c->units, sets, 1, &p, &d);
    if (st != PLUMB_OK) {
        c->out_of_range = 1;
        if (c->diag)
            *c->diag = d;
        return NAN;
    }
    plumb_atmosphere *atm = NULL;
    st = plumb_atmosphere_alloc(plumb_profile_atmosphere(p), &atm, &d);
    if (st != PLUMB_OK) {
        plumb_profile_free(p);
        c->out_of_range = 1;
        if (c->diag)
            *c->diag = d;
        return NAN;
    }
    plumb_fall_result r;
    st = plumb_trajectory_run(c->traj, plumb_profile_item(p, c->item), atm, &r, &d);
    plumb_atmosphere_free(atm);
    plumb_profile_free(p);
    c->evals++;
    if (st == PLUMB_EINVAL || st == PLUMB_ERANGE) {
        c->out_of_range = 1;
        if (c->diag)
            *c->diag = d;
        return NAN;
    }
    if (st != PLUMB_OK) {
        if (c->diag)
            *c->diag = d;
        c->fail = st;
        return NAN;
    }
    return metric_of(&r, c->metric) - c->limit;
}

/* Next trial value outward from base, step k (1, 2, ...), in direction dir. */
static double trial(const key_range *r, double base, double unit, int dir, int k)
{
    double x;
    if (r->kind == RANGE_POSITIVE && base > 0.0)
        x = base * pow(GROWTH, dir * k);
    else
        x = base + dir * unit * pow(GROWTH, k - 1);
    if (x < r->lo)
        x = r->lo;
    if (x > r->hi)
        x = r->hi;
    return x;
}

static plumb_status brent(solver_ctx *c, double a, double fa, double b, double fb, double rel_tol,
                          double *root)
{
    (void)fa;
    (void)fb;
    gsl_function F = {eval_at, c};
    gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!s)
        return PLUMB_RAISE(c->diag, PLUMB_ENOMEM, "out of memory");
    double lo = a < b ? a : b, hi = a < b ? b : a;
    int rc = gsl_root_fsolver_set(s, &F, lo, hi);
    for (int it = 0; rc == GSL_SUCCESS && it < MAX_ITER; it++) {
        rc = gsl_root_fsolver_iterate(s);
        if (rc != GSL_SUCCESS)
            break;
        rc = gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s), 0.0,
                                    rel_tol);
        if (rc == GSL_SUCCESS)
            break;
        if (rc == GSL_CONTINUE)
            rc = GSL_SUCCESS;
    }
    *root = gsl_root_fsolver_root(s);
    gsl_root_fsolver_free(s);
    if (c->fail != PLUMB_OK)
        return c->fail;
    if (rc != GSL_SUCCESS)
        return PLUMB_RAISE_KEY(c->diag, PLUMB_ENUMERIC, c->set_key, "root finder failed: %s",
                               gsl_strerror(rc));
    return PLUMB_OK;
}

plumb_status plumb_limit_solve(const plumb_profile *profile, const plumb_units *units,
                               size_t item, const char *key, plumb_metric metric, double limit,
                               const plumb_limit_options *opt, plumb_trajectory *traj,
                               plumb_limit_result *res, plumb_diag *diag)
{
    plumb_limit_options defaults;
    if (!opt) {
        plumb_limit_options_init(&defaults);
        opt = &defaults;
    }
    memset(res, 0, sizeof *res);
    if (item >= plumb_profile_item_count(profile))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "item %zu does not exist", item);
    if (!(limit > 0.0) || !isfinite(limit))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "the limit must be a finite value > 0");
    plumb_dim dim;
    plumb_status st = plumb_profile_key_dim(key, &dim, diag);
    if (st != PLUMB_OK)
        return st;
    if (dim == PLUMB_DIM_ANGLE)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                               "a direction does not change the answer one way; use `plumb sweep` over it");
    solver_ctx c = {.profile = profile, .units = units, .item = item, .dim = dim, .metric = metric,
                    .limit = limit, .traj = traj, .max_evals = opt->max_evaluations, .diag = diag};
    if (plumb_profile_is_inventory(profile) && starts_with(key, "payload."))
        snprintf(c.set_key, sizeof c.set_key, "items[%zu].%s", item, key + strlen("payload."));
    else
        plumbp_strlcpy(c.set_key, key, sizeof c.set_key);
    double base;
    if (!base_value(profile, item, key, &base))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key, "this key cannot be solved for");
    const plumb_fall_spec *spec = plumb_profile_item(profile, item);
    key_range r = range_of(key, dim, spec);
    if (r.kind == RANGE_POSITIVE) {
        r.lo = base > 0.0 ? base / SPAN : 0.0;
        if (!isfinite(r.hi))
            r.hi = base > 0.0 ? base * SPAN : SPAN;
    }
    double unit = fabs(base) > 0.0 ? fabs(base) / 4.0 : 1.0;
    if (r.kind == RANGE_BOUNDED)
        unit = (r.hi - r.lo) / 64.0;
    res->dim = dim;
    res->base_value_si = base;

    double f0 = eval_at(base, &c);
    if (c.fail != PLUMB_OK)
        return c.fail;
    if (isnan(f0))
        return PLUMB_RAISE_KEY(diag, PLUMB_ENUMERIC, key, "the profile's own value cannot be computed");
    res->metric_at_base = f0 + limit;

    /* Bracket: step outward both ways until the sign of f changes. */
    double a = base, fa = f0, b = NAN, fb = NAN;
    double edge[2] = {NAN, NAN}, fedge[2] = {NAN, NAN};
    int done[2] = {0, 0};
    for (int k = 1; !(done[0] && done[1]) && isnan(b); k++) {
        for (int s = 0; s < 2 && isnan(b); s++) {
            if (done[s])
                continue;
            int dir = s == 0 ? 1 : -1;
            double x = trial(&r, base, unit, dir, k);
            double fx = eval_at(x, &c);
            if (c.fail != PLUMB_OK)
                return c.fail;
            if (isnan(fx)) { /* refused by the profile: the edge is nearer */
                done[s] = 1;
                continue;
            }
            double prev = isnan(edge[s]) ? f0 : fedge[s];
            double px = isnan(edge[s]) ? base : edge[s];
            edge[s] = x;
            fedge[s] = fx;
            if ((fx > 0.0) != (prev > 0.0)) {
                a = px;
                fa = prev;
                b = x;
                fb = fx;
            }
            if (x <= r.lo || x >= r.hi)
                done[s] = 1;
        }
    }
    res->evaluations = c.evals;
    if (isnan(b)) {
        double x_hi = isnan(edge[0]) ? base : edge[0], x_lo = isnan(edge[1]) ? base : edge[1];
        if (f0 <= 0.0) {
            res->outcome = PLUMB_LIMIT_UNLIMITED;
            double vt = 0.0;
            plumb_atmosphere *atm = NULL;
            if (strcmp(key, "release.height") == 0 && metric != PLUMB_METRIC_DRIFT &&
                plumb_atmosphere_alloc(plumb_profile_atmosphere(profile), &atm, NULL) == PLUMB_OK &&
                plumb_terminal_speed(spec, atm, 0.0, 1, &vt) == PLUMB_OK) {
                double e = 0.5 * spec->mass_kg * vt * vt;
                snprintf(res->explanation, sizeof res->explanation,
                         "terminal speed (%.4g m/s, %.4g J at the strike level) keeps the %s below "
                         "the limit at any height: %s is unlimited up to %.6g m",
                         vt, e, metric_name(metric), key, x_hi);
            } else {
                snprintf(res->explanation, sizeof res->explanation,
                         "the %s stays below the limit of %.6g %s for every %s from %.6g to %.6g "
                         "(SI): no value of it breaks the limit",
                         metric_name(metric), limit, metric_unit(metric), key, x_lo, x_hi);
            }
            plumb_atmosphere_free(atm);
        } else {
            res->outcome = PLUMB_LIMIT_IMPOSSIBLE;
            snprintf(res->explanation, sizeof res->explanation,
                     "the %s exceeds the limit of %.6g %s for every %s from %.6g to %.6g (SI)%s",
                     metric_name(metric), limit, metric_unit(metric), key, x_lo, x_hi,
                     strcmp(key, "release.height") == 0 ? ": even at (almost) zero height the limit is exceeded" : "");
        }
        return PLUMB_OK;
    }
    double root = NAN;
    st = brent(&c, a, fa, b, fb, opt->rel_tol, &root);
    res->evaluations = c.evals;
    if (st != PLUMB_OK)
        return st;
    double froot = eval_at(root, &c);
    res->evaluations = c.evals;
    if (c.fail != PLUMB_OK)
        return c.fail;
    res->outcome = PLUMB_LIMIT_FOUND;
    res->value_si = root;
    res->metric_at_value = froot + limit;
    res->increasing = (fb - fa) * (b - a) > 0.0;
    res->limit_is_upper_bound = res->increasing;
    snprintf(res->explanation, sizeof res->explanation,
             "%s = %.6g (SI) gives the limit, %s %.6g %s; %s values stay within it",
             key, root, metric_name(metric), froot + limit, metric_unit(metric),
             res->increasing ? "lower" : "higher");
    return PLUMB_OK;
}
