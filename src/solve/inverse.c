/*
 * inverse.c - the value of one input at which a limit is just met
 * (see include/plumb/inverse.h for the method: bracketing, then Brent's
 * method, R. P. Brent 1973, through GSL's gsl_root_fsolver_brent).
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>

#include "plumb/constants.h"
#include "plumb/inverse.h"
#include "core/internal.h"
#include "io/keys.h"
#include "io/vary.h"
#include "solve/inverse_internal.h"
#include "physics/physics.h"

/* Values scanned for changes of sign before Brent refines them: 10 per
 * decade over a positive key's 6 decades. */
#define SCAN_POINTS 61
/* Positive inputs are scanned from base / SPAN to base x SPAN. */
#define SPAN 1e3
/* A canopy is scanned over a narrower span: one 30 times the size falls
 * for minutes. */
#define DEVICE_SPAN 30.0
/* Practical ranges of the other inputs (SI). */
#define MAX_SPEED_M_S 300.0
#define MAX_WIND_M_S 60.0
#define MAX_OFFSET_M 1e4
#define MAX_TEMP_DIFF_K 100.0
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
    int at_air_top;   /* 1: hi is the air model's top, not the end of the span */
} key_range;

/* What a scan found (scan, solve): the values computed, in increasing
 * order, with the metric at each (not less the limit) and the canopy
 * still filling there, and why it starts and ends where it does. */
typedef struct scan_memo {
    int done;                  /* 1: filled */
    double xs[SCAN_POINTS + 1], ms[SCAN_POINTS + 1];
    size_t fl[SCAN_POINTS + 1]; /* c->filling at each */
    size_t n;
    double m0;                 /* the metric at the profile's own value */
    size_t fill0;
    int low_refused;           /* values below the lowest computed were refused */
    char low_key[PLUMB_DIAG_KEY]; /* the key whose check refused the last of them */
    plumb_status top_out;      /* why the values above the highest computed were left out */
    char top_key[PLUMB_DIAG_KEY];
    size_t evals;              /* falls computed by its end */
    plumb_diag diag;           /* the diagnostic as it left it */
} scan_memo;

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
    int out_of_range;   /* the last x was refused by the profile's checks, or its
                           fall could not be computed (left_out says which) */
    plumb_status left_out; /* why the last x was left out: an input error (refused), or
                              the fall's PLUMB_EOUTSIDE, EBUDGET, ENOLAND, ENUMERIC */
    char refused_key[PLUMB_DIAG_KEY]; /* the key whose check refused it ("" if none named) */
    double last_x;             /* the value of the last evaluation */
    /* the fast path: the key set on copies of a template's resolved specs
     * (io/vary.h); the template is the first profile the loader derives
     * with the key set, or a profile built in code */
    const plumb_profile *tmpl; /* NULL until the loader has made one */
    plumb_profile *own_tmpl;   /* the template when derived here, owned */
    int fast;                  /* 1: the key is set on copies of tmpl's specs */
    plumbp_vary vary;
    plumb_fall_spec *work;     /* a copy of tmpl's item solved for, owned */
    plumb_atmosphere *atm;     /* tmpl's air, owned (keys that leave the air) */
    /* plumb_limit_fall_at: the fall of the last evaluation judged into
     * *judged against *criteria, while its spec and air are alive (a
     * derived profile's wind and air tables go with it) */
    const plumb_criteria *criteria;
    plumb_item_report *judged;
    plumb_status judge_status;
    plumb_diag *judge_diag;    /* why the judging failed; NULL: diag */
    scan_memo *memo;           /* a scan shared by several limits, or NULL */
    /* the last fall computed had a canopy still filling at impact: the
     * device index + 1 of the first such, 0 when none */
    size_t filling;
} solver_ctx;

/* descent[i] + 1 for the first device of r still filling at impact
 * (plumb_fall_device_at_impact), 0 when none is. */
static size_t filling_device(const plumb_fall_spec *spec, const plumb_fall_result *r)
{
    for (size_t i = 0; i < spec->n_descent && i < PLUMB_MAX_DESCENT; i++)
        if (plumb_fall_device_at_impact(spec, r, i, NULL) == PLUMB_DEVICE_FILLING)
            return i + 1;
    return 0;
}

/* Judges the evaluation's fall into c->judged, when asked to; the report
 * then names the caller's item (its spec outlives this fall's). */
static void keep(solver_ctx *c, const plumb_fall_spec *spec, const plumb_atmosphere *atm,
                 const plumb_fall_result *r)
{
    if (!c->judged)
        return;
    plumb_item_report *it = c->judged;
    memset(it, 0, sizeof *it);
    it->spec = spec;
    it->shape = plumb_profile_item_shape(c->profile, c->item);
    it->result = *r;
    c->judge_status = plumb_item_judge(it, c->profile, c->criteria, atm,
                                       c->judge_diag ? c->judge_diag : c->diag);
    it->spec = plumb_profile_item(c->profile, c->item);
}

void plumb_limit_options_init(plumb_limit_options *opt)
{
    opt->rel_tol = 1e-10;
    opt->max_evaluations = 200;
}

static double metric_of(const plumb_fall_result *r, plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? r->speed_m_s : m == PLUMB_METRIC_DRIFT ? r->drift_m : r->energy_j;
}

static int starts_with(const char *s, const char *prefix)
{
    return strncmp(s, prefix, strlen(prefix)) == 0;
}

/* The range a key is scanned over. Positive quantities: SPAN either way
 * of the profile's value (capped by physics, e.g. the release height at
 * 86 km above sea level); others: their physical or practical range. */
static key_range range_of(const char *key, plumb_dim dim, const plumb_fall_spec *spec, double base)
{
    const plumbp_key *k = plumbp_key_find(key, NULL, NULL);
    double span = starts_with(key, "descent") ? DEVICE_SPAN : SPAN;
    key_range r = {RANGE_POSITIVE, base / span, base * span, 0};
    if (strcmp(key, "release.height") == 0) {
        double top = PLUMB_STD1976_TOP_M - spec->site_elevation_m;
        if (r.hi >= top) {
            r.hi = top;
            r.at_air_top = 1;
        }
    } else if (strcmp(key, "site.elevation") == 0) {
        r = (key_range){RANGE_BOUNDED, PLUMB_STD1976_BOTTOM_M,
                        PLUMB_STD1976_TOP_M - spec->release_m[2], 1};
    } else if (starts_with(key, "release.velocity.") && strcmp(key, "release.velocity.speed") != 0) {
        r = (key_range){RANGE_SIGNED, -MAX_SPEED_M_S, MAX_SPEED_M_S, 0};
    } else if (starts_with(key, "release.position.")) {
        r = (key_range){RANGE_SIGNED, -MAX_OFFSET_M, MAX_OFFSET_M, 0};
    } else if (dim == PLUMB_DIM_TEMPERATURE && k) {
        double lo, hi;
        int lo_open;
        plumbp_key_bounds(k, &lo, &hi, &lo_open);
        r = (key_range){RANGE_BOUNDED, lo, hi, 0};
    } else if (dim == PLUMB_DIM_TEMP_DIFF) {
        r = (key_range){RANGE_SIGNED, -MAX_TEMP_DIFF_K, MAX_TEMP_DIFF_K, 0};
    } else if (dim == PLUMB_DIM_FRACTION) {
        r = (key_range){RANGE_BOUNDED, 0.0, 1.0, 0};
    } else if (k && (k->range == PLUMBY_R_CD || k->range == PLUMBY_R_CD_POSITIVE)) {
        r = (key_range){RANGE_BOUNDED, 0.0, PLUMBY_CD_MAX, 0};
    } else if (strcmp(key, "wind.speed") == 0) {
        r = (key_range){RANGE_NONNEG, 0.0, MAX_WIND_M_S, 0};
    } else if (dim == PLUMB_DIM_SPEED) {
        r = (key_range){RANGE_NONNEG, 0.0, MAX_SPEED_M_S, 0};
    } else if (dim == PLUMB_DIM_TIME || dim == PLUMB_DIM_NONE || !(base > 0.0)) {
        double hi = base > 0.0 ? base * SPAN : 1.0;
        r = (key_range){RANGE_NONNEG, 0.0, hi, 0};
    }
    if (r.kind == RANGE_POSITIVE && k) {
        /* never past the key's own bound (a mass: PLUMB_MASS_MAX_KG) */
        double lo, hi;
        int lo_open;
        plumbp_key_bounds(k, &lo, &hi, &lo_open);
        if (r.hi > hi)
            r.hi = hi;
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
    /* lengths the spec keeps only through what they imply */
    size_t dev = 0;
    if (strcmp(key, "descent.diameter") == 0 ||
        sscanf(key, "descent[%zu].diameter", &dev) == 1) {
        if (dev >= copy.n_descent)
            return 0;
        const plumb_descent_spec *d = &copy.descent[dev];
        *out = d->diameter_m > 0.0 ? d->diameter_m : sqrt(4.0 * d->area_m2 / PLUMB_PI);
        return 1;
    }
    if (strcmp(key, "payload.drag.diameter") == 0 && copy.drag.diameter_m > 0.0) {
        *out = copy.drag.diameter_m;
        return 1;
    }
    const plumb_shape_spec *sh = plumb_profile_item_shape(p, item);
    if (sh && sh->kind != PLUMB_SHAPE_NONE) {
        int cyl = sh->kind == PLUMB_SHAPE_CYLINDER;
        if (strcmp(key, "payload.shape.diameter") == 0 && (cyl || sh->kind == PLUMB_SHAPE_SPHERE)) {
            *out = cyl ? sh->dims_m[1] : sh->dims_m[0];
            return 1;
        }
        if (strcmp(key, "payload.shape.length") == 0 && cyl) {
            *out = sh->dims_m[0];
            return 1;
        }
        if (strcmp(key, "payload.shape.thickness") == 0 && sh->kind == PLUMB_SHAPE_PLATE) {
            *out = sh->dims_m[2];
            return 1;
        }
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

/* The falls's status into the context: metric - limit, or NaN. A fall
 * that cannot be computed at x (it leaves the air model, runs past its
 * budget, never lands, or fails on both steppers: PLUMB_ENUMERIC) leaves
 * x out of the scan, as a value the profile refuses does: one value that
 * cannot be computed is no reason to fail the answer at the others (the
 * solve says so when such values end the scan). Anything else (out of
 * memory) stops the solve. */
static double eval_done(solver_ctx *c, plumb_status st, const plumb_fall_result *r,
                        const plumb_diag *d)
{
    c->evals++;
    if (st == PLUMB_EINVAL || st == PLUMB_ERANGE || st == PLUMB_EOUTSIDE || st == PLUMB_EBUDGET ||
        st == PLUMB_ENOLAND || st == PLUMB_ENUMERIC) {
        c->out_of_range = 1;
        c->left_out = st;
        plumbp_strlcpy(c->refused_key, d->key, sizeof c->refused_key);
        if (c->diag)
            *c->diag = *d;
        return NAN;
    }
    if (st != PLUMB_OK) {
        if (c->diag)
            *c->diag = *d;
        c->fail = st;
        return NAN;
    }
    return metric_of(r, c->metric) - c->limit;
}

/* A value the profile or the air refuses (an input error) is out of the
 * key's range and the search goes on; anything else (out of memory) stops
 * it with that status. Returns NaN. */
static double eval_refused(solver_ctx *c, plumb_status st, const plumb_diag *d)
{
    if (c->diag)
        *c->diag = *d;
    if (plumb_status_is_input_error(st)) {
        c->out_of_range = 1;
        c->left_out = st;
        plumbp_strlcpy(c->refused_key, d->key, sizeof c->refused_key);
    } else
        c->fail = st;
    return NAN;
}

/* Makes p the template of the fast path (used when the key can be set on
 * copies of its specs); own is p when derived here (kept to the end of the
 * solve, then freed), NULL for the caller's profile. PLUMB_ENOMEM stops. */
static plumb_status take_template(solver_ctx *c, const plumb_profile *p, plumb_profile *own)
{
    c->tmpl = p;
    c->own_tmpl = own;
    c->fast = plumbp_vary_init(&c->vary, p, c->set_key);
    if (c->fast && !(c->work = malloc(sizeof *c->work)))
        return PLUMB_RAISE(c->diag, PLUMB_ENOMEM, "out of memory");
    if (c->fast && !plumbp_vary_air(&c->vary)) {
        plumb_diag d;
        plumb_diag_clear(&d);
        plumb_status st = plumb_atmosphere_alloc(plumb_profile_atmosphere(p), &c->atm, &d);
        if (st == PLUMB_ENOMEM) {
            if (c->diag)
                *c->diag = d;
            return st;
        }
        c->fast = st == PLUMB_OK; /* air the profile cannot have: every value goes through
                                     the loader, which says why */
    }
    return PLUMB_OK;
}

/* One fall at key = x through the loader, from the text "KEY=x SI-unit";
 * the first profile it makes becomes the fast path's template. */
static double eval_slow(solver_ctx *c, double x)
{
    char set[PLUMB_DIAG_KEY + 64];
    const char *unit = plumb_dim_si_unit(c->dim);
    int bare = !*unit || strcmp(unit, "1") == 0;
    snprintf(set, sizeof set, "%s=%.17g%s%s", c->set_key, x, bare ? "" : " ", bare ? "" : unit);
    const char *sets[1] = {set};
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_profile_derive(c->profile, c->units, sets, 1, &p, &d);
    if (st != PLUMB_OK)
        return eval_refused(c, st, &d);
    if (!c->tmpl) {
        st = take_template(c, p, p);
        if (st != PLUMB_OK) {
            c->fail = st;
            return NAN;
        }
    }
    plumb_atmosphere *atm = NULL;
    st = plumb_atmosphere_alloc(plumb_profile_atmosphere(p), &atm, &d);
    if (st != PLUMB_OK) {
        if (p != c->own_tmpl)
            plumb_profile_free(p);
        return eval_refused(c, st, &d);
    }
    plumb_fall_result r;
    st = plumb_trajectory_run(c->traj, plumb_profile_item(p, c->item), atm, &r, &d);
    c->filling = st == PLUMB_OK ? filling_device(plumb_profile_item(p, c->item), &r) : 0;
    if (st == PLUMB_OK)
        keep(c, plumb_profile_item(p, c->item), atm, &r);
    plumb_atmosphere_free(atm);
    if (p != c->own_tmpl)
        plumb_profile_free(p);
    return eval_done(c, st, &r, &d);
}

/* One fall at key = x on copies of the template's spec and air (io/vary.h):
 * the same double the loader would have stored from "KEY=x SI-unit" (the
 * SI unit converts to itself exactly), checked as the loader checks it; the
 * air built again only for a key that changes it. A value a copy refuses,
 * or air that cannot be made, goes through the loader for its own
 * diagnostic. */
static double eval_fast(solver_ctx *c, double x)
{
    /* only the item solved for: the answer is each item's own, so a value
     * another item's checks refuse (a release below another item's
     * deploy.below) is no bound on this one's */
    memcpy(c->work, plumb_profile_item(c->tmpl, c->item), sizeof *c->work);
    plumb_atm_spec as = *plumb_profile_atmosphere(c->tmpl);
    int coded = plumbp_vary_is_template(c->tmpl);
    if (!plumbp_vary_set(&c->vary, x, c->work, 1, &as)) {
        if (!coded)
            return eval_slow(c, x);
        plumb_diag why;
        plumb_diag_clear(&why);
        return eval_refused(c, plumbp_vary_refusal(&c->vary, x, c->work, 1, &as, &why), &why);
    }
    const plumb_fall_spec *spec = &c->work[0];
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_fall_result r;
    plumb_status st;
    if (plumbp_vary_air(&c->vary)) {
        plumb_atmosphere *atm = NULL;
        st = plumb_atmosphere_alloc(&as, &atm, &d);
        if (st == PLUMB_ENOMEM || (st != PLUMB_OK && coded))
            return eval_refused(c, st, &d);
        if (st != PLUMB_OK)
            return eval_slow(c, x);
        st = plumb_trajectory_run(c->traj, spec, atm, &r, &d);
        if (st == PLUMB_OK)
            keep(c, spec, atm, &r);
        plumb_atmosphere_free(atm);
    } else {
        st = plumb_trajectory_run(c->traj, spec, c->atm, &r, &d);
        if (st == PLUMB_OK)
            keep(c, spec, c->atm, &r);
    }
    c->filling = st == PLUMB_OK ? filling_device(spec, &r) : 0;
    return eval_done(c, st, &r, &d);
}

/* One fall at key = x. Returns the metric minus the limit, or NaN with
 * ctx->fail set (or ctx->out_of_range for a value the profile refuses). */
static double eval_at(double x, void *params)
{
    solver_ctx *c = params;
    c->out_of_range = 0;
    c->last_x = x;
    c->filling = 0;
    if (c->evals >= c->max_evals) {
        c->fail = PLUMB_RAISE_KEY(c->diag, PLUMB_ENUMERIC, c->set_key,
                                  "no answer within %zu falls", c->max_evals);
        return NAN;
    }
    /* the scan reads the metric and the canopy's state at impact, never
     * the peak force: only a fall judged for the report locates it */
    int was = plumbp_traj_peak_unread(c->traj, c->judged == NULL);
    double f = c->fast ? eval_fast(c, x) : eval_slow(c, x);
    plumbp_traj_peak_unread(c->traj, was);
    return f;
}

/* Where Brent's method met a value it could not compute (brent): w, the
 * end of its last bracket on the side that meets the limit (f(w) <= 0),
 * and x, the value left out, between w and the bracket's other end. */
typedef struct bracket_gap {
    int hit;          /* 1: the refinement stopped at a value left out */
    double w;         /* the end that meets the limit */
    double x;         /* the value left out */
} bracket_gap;

/* Brent's method on [a, b] (f(a), f(b) of opposite signs) to rel_tol. The
 * answer is the end of the final bracket on the side that meets the limit
 * (f <= 0), so the value reported is never one that breaks it. A value in
 * the bracket whose fall is left out (eval_done: it cannot be computed, or
 * the profile refuses it) has no sign to refine by: the search stops
 * there with gap->hit set, the last bracket and that value in *gap, and
 * *root the bracket's end that meets the limit. */
static plumb_status brent(solver_ctx *c, double a, double fa, double b, double fb, double rel_tol,
                          double *root, bracket_gap *gap)
{
    gsl_function F = {eval_at, c};
    gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!s)
        return PLUMB_RAISE(c->diag, PLUMB_ENOMEM, "out of memory");
    double lo = a < b ? a : b, hi = a < b ? b : a;
    double f_lo = a < b ? fa : fb;
    gap->hit = 0;
    int rc = gsl_root_fsolver_set(s, &F, lo, hi);
    for (int it = 0; rc == GSL_SUCCESS && it < MAX_ITER; it++) {
        /* the bracket before this step: a step whose fall is left out
         * returns GSL_EBADFUNC and leaves the bracket as it was */
        double x_lo = gsl_root_fsolver_x_lower(s), x_hi = gsl_root_fsolver_x_upper(s);
        rc = gsl_root_fsolver_iterate(s);
        if (rc == GSL_EBADFUNC && c->fail == PLUMB_OK && c->out_of_range) {
            /* the left-out value is the one evaluated last, inside the bracket */
            double x = c->last_x;
            gap->hit = 1;
            gap->w = f_lo <= 0.0 ? x_lo : x_hi;
            gap->x = x > x_lo && x < x_hi ? x : 0.5 * (x_lo + x_hi);
            *root = gap->w;
            gsl_root_fsolver_free(s);
            return PLUMB_OK;
        }
        if (rc != GSL_SUCCESS)
            break;
        rc = gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s), 0.0,
                                    rel_tol);
        if (rc == GSL_SUCCESS)
            break;
        if (rc == GSL_CONTINUE)
            rc = GSL_SUCCESS;
    }
    *root = f_lo <= 0.0 ? gsl_root_fsolver_x_lower(s) : gsl_root_fsolver_x_upper(s);
    gsl_root_fsolver_free(s);
    if (c->fail != PLUMB_OK)
        return c->fail;
    if (rc != GSL_SUCCESS)
        return PLUMB_RAISE_KEY(c->diag, PLUMB_ENUMERIC, c->set_key, "root finder failed: %s",
                               gsl_strerror(rc));
    return PLUMB_OK;
}

/* Why a crossing was refined no further (refine), for its words. */
typedef struct gap_why {
    int unrefined;                /* 1: the answer stops short of the crossing */
    plumb_status left_out;        /* why the values beyond it were left out */
    char refused_key[PLUMB_DIAG_KEY]; /* the key whose check refused them, or "" */
} gap_why;

/* Halvings at most while closing in on values left out inside a bracket:
 * 2^-60 of the bracket is below a double's resolution of its ends. */
#define MAX_GAP_HALVINGS 60

/* The crossing in [a, b] (f(a), f(b) of opposite signs), by Brent's method
 * (brent). Where a value inside has a fall that is left out, there is no
 * sign to go by: the search closes in on it by halving from the side that
 * meets the limit, as long as the values there can be computed, and goes
 * back to Brent's method in any smaller bracket it finds. When it cannot
 * get past the values left out, *root is the last value computed that
 * meets the limit and why->unrefined says why the answer stops there:
 * every value reported meets the limit, as brent's answers do. */
static plumb_status refine(solver_ctx *c, double a, double fa, double b, double fb, double rel_tol,
                           double *root, gap_why *why)
{
    memset(why, 0, sizeof *why);
    for (;;) {
        bracket_gap gap = {0, 0.0, 0.0};
        plumb_status st = brent(c, a, fa, b, fb, rel_tol, root, &gap);
        if (st != PLUMB_OK || !gap.hit)
            return st;
        /* the first value left out names the reason */
        if (!why->unrefined) {
            why->unrefined = 1;
            why->left_out = c->left_out;
            plumbp_strlcpy(why->refused_key, c->refused_key, sizeof why->refused_key);
        }
        double w = gap.w, x = gap.x;
        int again = 0;
        for (int k = 0; k < MAX_GAP_HALVINGS &&
                        fabs(x - w) > rel_tol * fmax(fabs(w), fabs(x)); k++) {
            double m = 0.5 * (w + x);
            double fm = eval_at(m, c);
            if (c->fail != PLUMB_OK)
                return c->fail;
            if (isnan(fm)) {
                x = m; /* left out too: the gap begins nearer */
            } else if (fm <= 0.0) {
                w = m; /* still within: the answer moves up to it */
            } else {
                /* beyond the limit, and computed: the crossing is in
                 * [w, m], which Brent's method refines again */
                a = w;
                fa = eval_at(w, c);
                if (c->fail != PLUMB_OK)
                    return c->fail;
                b = m;
                fb = fm;
                again = !isnan(fa);
                break;
            }
        }
        if (!again) {
            *root = w;
            return PLUMB_OK;
        }
        why->unrefined = 0; /* past the gap: refined after all */
    }
}

/* The scan's i-th value of n over [lo, hi]: geometric for a positive
 * range, linear otherwise. */
static double scan_value(const key_range *r, double lo, double hi, size_t i, size_t n)
{
    double f = (double)i / (double)(n - 1);
    if (r->kind == RANGE_POSITIVE && lo > 0.0)
        return lo * pow(hi / lo, f);
    return lo + f * (hi - lo);
}

static plumb_status solve(solver_ctx *c, const plumb_profile *profile, const char *key,
                          plumb_metric metric, double limit, const plumb_limit_options *opt,
                          double base, const key_range *r_, plumb_limit_result *res);

/* Checks the key and sets up c for evaluations of item `item` with `key`
 * set (plumb_limit_solve, plumb_limit_fall_at): *base is the profile's
 * own value. PLUMB_OK with *na set for an inventory item whose drag does
 * not use the key (res, if not NULL, then says so). Free with ctx_close. */
static plumb_status ctx_open(solver_ctx *c, const plumb_profile *profile,
                             const plumb_units *units, size_t item, const char *key,
                             plumb_trajectory *traj, double *base, int *na,
                             plumb_limit_result *res, plumb_diag *diag)
{
    *na = 0;
    memset(c, 0, sizeof *c);
    if (item >= plumb_profile_item_count(profile))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "item %zu does not exist", item);
    plumb_dim dim;
    plumb_status st = plumb_profile_key_dim(key, &dim, diag);
    if (st != PLUMB_OK)
        return st;
    if (starts_with(key, "items[")) {
        /* an item's own key is found for each item: payload.X, or descent.X
         * for its descent device */
        const char *rest = strchr(key, ']');
        int dev = rest && starts_with(rest + 1, ".descent");
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                               "find %s%s instead: the answer is given for each item of the "
                               "inventory, by name",
                               dev ? "" : "payload",
                               rest && rest[1] == '.' ? rest + (dev ? 2 : 1) : ".KEY");
    }
    if (dim == PLUMB_DIM_ANGLE)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                               "a direction does not change the answer one way; use `plumb sweep` over it");
    *c = (solver_ctx){.profile = profile, .units = units, .item = item, .dim = dim,
                      .traj = traj, .max_evals = SIZE_MAX, .diag = diag};
    int inv = plumb_profile_is_inventory(profile);
    plumb_limit_set_key(profile, item, key, c->set_key, sizeof c->set_key);
    if (!base_value(profile, item, key, base)) {
        int dev = starts_with(key, "descent");
        if (inv && (starts_with(key, "payload.") || dev)) {
            *na = 1;
            if (res) {
                res->outcome = PLUMB_LIMIT_NOT_APPLICABLE;
                res->dim = dim;
                if (dev)
                    snprintf(res->explanation, sizeof res->explanation,
                             "this item has no descent device: %s does not apply", key);
                else
                    snprintf(res->explanation, sizeof res->explanation,
                             "this item's drag does not use %s", key);
            }
            return PLUMB_OK;
        }
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                               "this key cannot be solved for (it is not a single input of the fall)");
    }
    /* The fast path (io/vary.h): the key set on copies of the resolved
     * specs of the first profile the loader derives with it (the first
     * evaluation), or of a profile built in code, which has no text.
     * Keys it cannot set go through plumb_profile_derive every time. */
    st = plumbp_vary_is_template(profile) ? take_template(c, profile, NULL) : PLUMB_OK;
    if (st == PLUMB_OK && plumbp_vary_is_template(profile) && !c->fast)
        st = PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key,
                             "a profile built in code cannot vary this key: only the profile "
                             "loader derives it (read the profile from a file to vary it)");
    return st;
}

plumb_status plumb_limit_set_key(const plumb_profile *profile, size_t item, const char *key,
                                 char *out, size_t size)
{
    if (!profile || !key || !out || size == 0 || item >= plumb_profile_item_count(profile))
        return PLUMB_RAISE(NULL, PLUMB_EINVAL, "plumb_limit_set_key: no such item or key");
    int inv = plumb_profile_is_inventory(profile);
    size_t number = plumb_profile_item_number(profile, item);
    char own[PLUMB_DIAG_KEY + 16];
    int line, col;
    snprintf(own, sizeof own, "items[%zu].descent", number);
    if (inv && starts_with(key, "payload."))
        snprintf(out, size, "items[%zu].%s", number,
                 key + strlen("payload.")); /* items[N] as the profile is written */
    else if (inv && starts_with(key, "descent") &&
             plumb_profile_key_origin(profile, own, &line, &col))
        snprintf(out, size, "%s%s", own, key + strlen("descent"));
    else
        plumbp_strlcpy(out, key, size); /* shared, or a single payload */
    return PLUMB_OK;
}

static void ctx_close(solver_ctx *c)
{
    plumb_atmosphere_free(c->atm);
    free(c->work);
    plumb_profile_free(c->own_tmpl);
}

plumb_status plumbp_limit_solve_judged(const plumb_profile *profile, const plumb_units *units,
                                      size_t item, const char *key, plumb_metric metric,
                                      double limit, const plumb_limit_options *opt,
                                      plumb_trajectory *traj, const plumb_criteria *criteria,
                                      plumb_item_report *judged, plumb_status *judge_st,
                                      plumb_diag *judge_diag, plumb_limit_result *res,
                                      plumb_diag *diag)
{
    plumb_limit_options defaults;
    if (!opt) {
        plumb_limit_options_init(&defaults);
        opt = &defaults;
    }
    memset(res, 0, sizeof *res);
    if (judge_st)
        *judge_st = PLUMB_OK;
    if (!(limit > 0.0) || !isfinite(limit))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "the limit must be a finite value > 0");
    solver_ctx c;
    double base = 0.0;
    int na = 0;
    plumb_status st = ctx_open(&c, profile, units, item, key, traj, &base, &na, res, diag);
    if (st == PLUMB_OK && !na) {
        c.metric = metric;
        c.limit = limit;
        c.max_evals = opt->max_evaluations;
        c.criteria = criteria;
        c.judged = judged;
        c.judge_diag = judge_diag;
        key_range r = range_of(key, c.dim, plumb_profile_item(profile, item), base);
        st = solve(&c, profile, key, metric, limit, opt, base, &r, res);
        if (judge_st)
            *judge_st = c.judge_status;
    }
    ctx_close(&c);
    return st;
}

void plumbp_limit_solve_many(const plumb_profile *profile, const plumb_units *units,
                             size_t item, const char *key, plumb_metric metric,
                             const double *limits, size_t n, const plumb_limit_options *opt,
                             plumb_trajectory *traj, plumb_limit_result *res, plumb_status *st,
                             plumb_diag *diags)
{
    plumb_limit_options defaults;
    if (!opt) {
        plumb_limit_options_init(&defaults);
        opt = &defaults;
    }
    size_t first = n; /* the first limit that can be solved for */
    for (size_t k = 0; k < n; k++) {
        memset(&res[k], 0, sizeof res[k]);
        st[k] = PLUMB_OK;
        if (!(limits[k] > 0.0) || !isfinite(limits[k]))
            st[k] = PLUMB_RAISE(&diags[k], PLUMB_EINVAL, "the limit must be a finite value > 0");
        else if (first == n)
            first = k;
    }
    if (first == n)
        return;
    solver_ctx c;
    double base = 0.0;
    int na = 0;
    plumb_status open = ctx_open(&c, profile, units, item, key, traj, &base, &na, &res[first],
                                 &diags[first]);
    scan_memo memo;
    memo.done = 0;
    key_range r = {RANGE_POSITIVE, 0.0, 0.0, 0};
    if (open == PLUMB_OK && !na)
        r = range_of(key, c.dim, plumb_profile_item(profile, item), base);
    for (size_t k = first; k < n; k++) {
        if (st[k] != PLUMB_OK)
            continue;
        if (open != PLUMB_OK || na || (k > first && !memo.done)) {
            /* the same for every limit: the key's refusal, an item it does
             * not apply to, a scan that failed (it does not depend on the
             * limit) */
            st[k] = k == first ? open : st[first];
            res[k] = res[first];
            diags[k] = diags[first];
            continue;
        }
        c.diag = &diags[k];
        c.fail = PLUMB_OK;
        c.metric = metric;
        c.limit = limits[k];
        c.max_evals = opt->max_evaluations;
        c.memo = &memo;
        st[k] = solve(&c, profile, key, metric, limits[k], opt, base, &r, &res[k]);
    }
    ctx_close(&c);
}

plumb_status plumb_limit_solve(const plumb_profile *profile, const plumb_units *units,
                               size_t item, const char *key, plumb_metric metric, double limit,
                               const plumb_limit_options *opt, plumb_trajectory *traj,
                               plumb_limit_result *res, plumb_diag *diag)
{
    return plumbp_limit_solve_judged(profile, units, item, key, metric, limit, opt, traj, NULL,
                                     NULL, NULL, NULL, res, diag);
}

plumb_status plumb_limit_fall_at(const plumb_profile *profile, const plumb_units *units,
                                 size_t item, const char *key, double x,
                                 plumb_trajectory *traj, const plumb_criteria *criteria,
                                 plumb_item_report *judged, plumb_diag *diag)
{
    solver_ctx c;
    double base = 0.0;
    int na = 0;
    plumb_status st = ctx_open(&c, profile, units, item, key, traj, &base, &na, NULL, diag);
    if (st == PLUMB_OK && na)
        st = PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key, "this item's drag does not use %s", key);
    if (st == PLUMB_OK && !c.tmpl) {
        /* the profile's own value first, as the solve began: it makes the
         * template whose item alone a value is checked against */
        (void)eval_at(base, &c);
        st = c.fail;
    }
    if (st == PLUMB_OK) {
        c.criteria = criteria;
        c.judged = judged;
        double f = eval_at(x, &c);
        if (c.fail != PLUMB_OK)
            st = c.fail;
        else if (isnan(f))
            st = diag && diag->status != PLUMB_OK ? diag->status : PLUMB_ENUMERIC;
        else
            st = c.judge_status;
    }
    ctx_close(&c);
    return st;
}

/* Why a drift stays within its limit over all of the scan (fs: drift -
 * limit at the n values scanned), in words: the drift is 0 at every value
 * and the spec has no wind and no sideways release velocity, so nothing
 * moves the item sideways. "" otherwise: the figures say the rest (a
 * drift need not level off: the thinner air of a higher release carries
 * it further). Never the terminal speed, which bounds a fall's speed and
 * energy, not how far it is carried. */
static void drift_unlimited_why(const plumb_fall_spec *spec, const char *key, const double *fs,
                                size_t n, double limit, plumb_limit_result *res)
{
    int moved = 0;
    for (size_t i = 0; i < n; i++)
        moved |= fs[i] + limit != 0.0;
    int calm = spec && plumbp_wind_calm(&spec->wind);
    int thrown = spec && (spec->velocity_m_s[0] != 0.0 || spec->velocity_m_s[1] != 0.0);
    char what[PLUMB_DIAG_KEY + 16];
    if (strcmp(key, "release.height") == 0)
        plumbp_strlcpy(what, "height", sizeof what);
    else
        snprintf(what, sizeof what, "value of %s", key);
    if (!moved && calm && !thrown)
        snprintf(res->explanation, sizeof res->explanation,
                 "there is no wind and no sideways release velocity: nothing moves it sideways, "
                 "so no %s gives a drift as large as the limit", what);
}

/* Why a scan whose every value meets the limit goes no higher, in words
 * without figures (the report writers give the highest value computed and
 * its metric): top_out, why the values above the highest computed were
 * left out (PLUMB_OK: the range ends at the air model's top), top_key the
 * key whose check refused them ("" if none named). */
static void not_reached_why(const char *key, plumb_status top_out, const char *top_key,
                            plumb_limit_result *res)
{
    const char *what = strcmp(key, "release.height") == 0 ? "heights" : "values";
    char *e = res->explanation;
    size_t size = sizeof res->explanation;
    switch (top_out) {
    case PLUMB_OK:
        snprintf(e, size, "higher %s are above the highest altitude plumb's air models "
                          "reach (the top of the U.S. Standard Atmosphere 1976), so the scan "
                          "ends there", what);
        break;
    case PLUMB_EOUTSIDE:
        snprintf(e, size, "the falls from higher %s leave the air model's range, so the scan "
                          "ends there", what);
        break;
    case PLUMB_EBUDGET:
        snprintf(e, size, "the falls from higher %s run past the fall's step or time budget, "
                          "so the scan ends there", what);
        break;
    case PLUMB_ENOLAND:
        snprintf(e, size, "from higher %s the object never reaches the strike level, so the "
                          "scan ends there", what);
        break;
    case PLUMB_ENUMERIC:
        snprintf(e, size, "the falls from higher %s could not be computed (the integration "
                          "failed on both methods), so the scan ends there", what);
        break;
    default:
        if (top_key[0] && strcmp(top_key, key) != 0)
            snprintf(e, size, "higher %s are refused by the profile's check of %s, so the scan "
                              "ends there", what, top_key);
        else
            snprintf(e, size, "higher %s are refused by the profile, so the scan ends there",
                     what);
        break;
    }
}

/* Why the answer stops short of the crossing (refine), in words without
 * figures, into res->explanation: the values beyond it, toward those
 * that break the limit, were left out, and why. */
static void gap_words(const char *key, const gap_why *g, plumb_limit_result *res)
{
    const char *what = strcmp(key, "release.height") == 0 ? "heights" : "values";
    char why[PLUMB_DIAG_KEY + 64];
    switch (g->left_out) {
    case PLUMB_EOUTSIDE:
        snprintf(why, sizeof why, "their falls leave the air model's range");
        break;
    case PLUMB_EBUDGET:
        snprintf(why, sizeof why, "their falls run past the fall's step or time budget");
        break;
    case PLUMB_ENOLAND:
        snprintf(why, sizeof why, "from them the object never reaches the strike level");
        break;
    case PLUMB_ENUMERIC:
        snprintf(why, sizeof why, "their falls could not be computed (the integration failed "
                                  "on both methods)");
        break;
    default:
        if (g->refused_key[0] && strcmp(g->refused_key, key) != 0)
            snprintf(why, sizeof why, "they are refused by the profile's check of %s",
                     g->refused_key);
        else
            snprintf(why, sizeof why, "they are refused by the profile");
        break;
    }
    snprintf(res->explanation, sizeof res->explanation,
             "the limit is crossed between this value and the next %s computed, which "
             "exceeds it, but the %s just beyond this one cannot be computed: %s; so the answer "
             "stops at the last value computed that meets the limit",
             strcmp(key, "release.height") == 0 ? "height" : "value", what, why);
}

/* Why the scan starts where it does when lower values were refused, in
 * words without figures: low_key is the key whose check refused them (""
 * if none named). */
static void low_refused_why(const char *key, const char *low_key, char *e, size_t size)
{
    if (low_key[0] && strcmp(low_key, key) != 0)
        snprintf(e, size, "lower values are refused by the profile's check of %s, so the "
                          "scan starts there", low_key);
    else
        snprintf(e, size, "lower values are refused by the profile, so the scan starts there");
}

/* The words of a crossing (k, counted from 0) at which the limit is broken
 * on one side because descent[dev] is still filling at impact there
 * (above: the side that breaks it is the higher values), appended to
 * res->explanation. For a key of the canopy's size
 * the reason: its fill time t_f = n D0 / v (Knacke 1991, README.md
 * "Canopy inflation") grows with its diameter, so a larger canopy may not
 * fill before impact. */
static void filling_crossing(const plumb_fall_spec *spec, const char *key, size_t k, size_t dev,
                             int above, plumb_limit_result *res)
{
    static const char *const ordinal[PLUMB_LIMIT_MAX_CROSSINGS] = {
        "first", "second", "third", "fourth", "fifth", "sixth", "seventh", "eighth"};
    char who[32];
    if (spec->n_descent > 1)
        snprintf(who, sizeof who, "descent[%zu]", dev);
    else
        plumbp_strlcpy(who, "the canopy", sizeof who);
    const char *dot = strrchr(key, '.');
    int size_key = starts_with(key, "descent") && dot &&
                   (strcmp(dot, ".diameter") == 0 || strcmp(dot, ".area") == 0);
    size_t len = strlen(res->explanation);
    snprintf(res->explanation + len, sizeof res->explanation - len,
             "%s%s the %s crossing the limit is broken because %s does not fill before impact: "
             "it is still filling when the object lands%s",
             len ? "; " : "", above ? "above" : "below", ordinal[k % PLUMB_LIMIT_MAX_CROSSINGS],
             who,
             size_key ? " (its fill time, n D0 / v, grows with its diameter)" : "");
}

/* The scan and the refinement (plumb_limit_solve, after its checks). */
/* Scans the range (solve): the metric itself (the limit set to 0 while
 * it runs, so that metric - limit is the metric exactly) at the profile's
 * own value and at every value scanned, into *sm. The scan does not
 * depend on the limit, so several limits share one (plumbp_limit_solve_many). */
static plumb_status scan(solver_ctx *c, const char *key, double base, const key_range *r,
                         scan_memo *sm)
{
    plumb_diag *diag = c->diag;
    double limit = c->limit;
    c->limit = 0.0;
    /* The fall to judge for the report (plumbp_limit_solve_judged) is the
     * answer's, or the profile's own when there is none: both are
     * evaluations of the solve, judged as they are made rather than
     * computed again (c->judged is set for those two only). */
    double f0 = eval_at(base, c);
    c->limit = limit;
    if (c->fail != PLUMB_OK)
        return c->fail;
    if (isnan(f0) && diag && plumb_status_is_input_error(diag->status))
        return diag->status; /* the profile cannot be re-made at its own value (built in code) */
    if (isnan(f0)) {
        char why[PLUMB_DIAG_MSG];
        plumbp_strlcpy(why, diag ? diag->message : "", sizeof why);
        return PLUMB_RAISE_KEY(diag, PLUMB_ENUMERIC, key,
                               "the profile's own value cannot be computed%s%s", why[0] ? ": " : "",
                               why);
    }
    sm->m0 = f0;
    size_t fill0 = sm->fill0 = c->filling;

    double *xs = sm->xs, *fs = sm->ms;
    size_t *fl = sm->fl;
    size_t n = 0;
    int base_done = 0;
    sm->low_refused = 0;
    sm->low_key[0] = '\0';
    sm->top_out = PLUMB_OK;
    sm->top_key[0] = '\0';
    plumb_item_report *keep_judged = c->judged;
    c->judged = NULL;
    c->limit = 0.0;
    for (size_t i = 0; i < SCAN_POINTS; i++) {
        double x = scan_value(r, r->lo, r->hi, i, SCAN_POINTS);
        if (!base_done && x >= base) {
            if (x != base) {
                xs[n] = base;
                fl[n] = fill0;
                fs[n++] = f0;
            }
            base_done = 1;
        }
        double fx = eval_at(x, c);
        if (c->fail != PLUMB_OK)
            break;
        if (isnan(fx)) {
            if (c->out_of_range && n == 0) {
                sm->low_refused = 1;
                plumbp_strlcpy(sm->low_key, c->refused_key, sizeof sm->low_key);
            }
            if (n > 0 && x > base && sm->top_out == PLUMB_OK) {
                sm->top_out = c->left_out;
                plumbp_strlcpy(sm->top_key, c->refused_key, sizeof sm->top_key);
            }
            continue; /* refused by the profile, or not computable: left out */
        }
        if (x > base)
            sm->top_out = PLUMB_OK; /* computed again above a value left out */
        xs[n] = x;
        fl[n] = c->filling;
        fs[n++] = fx;
    }
    c->limit = limit;
    c->judged = keep_judged;
    if (c->fail != PLUMB_OK)
        return c->fail;
    if (!base_done) {
        xs[n] = base;
        fl[n] = fill0;
        fs[n++] = f0;
    }
    sm->n = n;
    sm->evals = c->evals;
    if (diag)
        sm->diag = *diag;
    sm->done = 1;
    return PLUMB_OK;
}

static plumb_status solve(solver_ctx *c, const plumb_profile *profile, const char *key,
                          plumb_metric metric, double limit, const plumb_limit_options *opt,
                          double base, const key_range *r_, plumb_limit_result *res)
{
    key_range r = *r_;
    plumb_diag *diag = c->diag;
    plumb_status st;
    plumb_dim dim = c->dim;
    (void)profile;
    (void)metric;
    res->dim = dim;
    res->base_value_si = base;

    /* Scan the range, then refine every change of sign with Brent's
     * method: a metric need not be monotonic in its key (a canopy that
     * opens only above some height, wind that adds to the impact speed).
     * A scan shared by several limits is made once; each limit's figures
     * and count of falls are then those of a solve of its own. */
    scan_memo own;
    scan_memo *sm = c->memo ? c->memo : &own;
    if (!c->memo)
        own.done = 0;
    plumb_item_report *judged = c->judged;
    if (!sm->done) {
        st = scan(c, key, base, &r, sm);
        if (st != PLUMB_OK)
            return st;
    } else {
        c->evals = sm->evals;
        if (diag)
            *diag = sm->diag;
    }
    c->judged = NULL;
    double f0 = sm->m0 - limit;
    res->metric_at_base = f0 + limit;
    const double *xs = sm->xs;
    const size_t *fl = sm->fl; /* the fall's canopy still filling at impact (c->filling) */
    double fs[SCAN_POINTS + 1] = {0.0};
    size_t n = sm->n;
    for (size_t i = 0; i < n; i++)
        fs[i] = sm->ms[i] - limit;
    int low_refused = sm->low_refused;
    const char *low_key = sm->low_key;
    plumb_status top_out = sm->top_out;
    const char *top_key = sm->top_key;
    double x_lo = xs[0], x_hi = xs[n - 1];
    gap_why gaps[PLUMB_LIMIT_MAX_CROSSINGS];
    for (size_t i = 1; i < n && res->n_crossings < PLUMB_LIMIT_MAX_CROSSINGS; i++) {
        if ((fs[i - 1] > 0.0) == (fs[i] > 0.0))
            continue;
        double root = NAN;
        st = refine(c, xs[i - 1], fs[i - 1], xs[i], fs[i], opt->rel_tol, &root,
                    &gaps[res->n_crossings]);
        if (st != PLUMB_OK)
            return st;
        /* a crossing beyond which a canopy has not filled at impact, on
         * the side that breaks the limit: it breaks it for want of the
         * canopy (on the other side it may be filling too, further along) */
        size_t out = fs[i] > 0.0 ? i : i - 1;
        if (fl[out])
            filling_crossing(plumb_profile_item(profile, c->item), key, res->n_crossings,
                             fl[out] - 1, out == i, res);
        res->crossings_si[res->n_crossings++] = root;
    }
    res->evaluations = c->evals;
    res->within_at_low_end = fs[0] <= 0.0;
    res->scan_lo_si = x_lo;
    res->scan_hi_si = x_hi;
    res->n_scanned = n;
    res->metric_at_scan_hi = fs[n - 1] + limit;
    if (res->n_crossings == 0) {
        res->outcome = fs[0] <= 0.0 ? PLUMB_LIMIT_UNLIMITED : PLUMB_LIMIT_IMPOSSIBLE;
        if (res->outcome == PLUMB_LIMIT_UNLIMITED && (top_out != PLUMB_OK || r.at_air_top)) {
            /* met at every value computed, but the scan ends at the edge of
             * what can be computed: a larger value may yet break it */
            res->outcome = PLUMB_LIMIT_NOT_REACHED;
            not_reached_why(key, top_out, top_key, res);
            size_t len = strlen(res->explanation);
            if (n == 1 && low_refused) {
                /* one value computed: nothing is seen to level off, and the
                 * scan ends below it as well as above */
                snprintf(res->explanation + len, sizeof res->explanation - len, "; ");
                len = strlen(res->explanation);
                low_refused_why(key, low_key, res->explanation + len,
                                sizeof res->explanation - len);
            } else if (n > 1 && metric != PLUMB_METRIC_DRIFT &&
                       strcmp(key, "release.height") == 0)
                snprintf(res->explanation + len, sizeof res->explanation - len,
                         "; below that it levels off as the fall reaches its terminal speed");
            return PLUMB_OK;
        }
        /* the figures (range scanned, the metric at its top) say the rest */
        if (low_refused && (res->outcome == PLUMB_LIMIT_IMPOSSIBLE || n == 1)) {
            low_refused_why(key, low_key, res->explanation, sizeof res->explanation);
        } else if (metric == PLUMB_METRIC_DRIFT && res->outcome == PLUMB_LIMIT_UNLIMITED) {
            drift_unlimited_why(plumb_profile_item(profile, c->item), key, fs, n, limit, res);
        } else if (strcmp(key, "release.height") == 0) {
            plumbp_strlcpy(res->explanation,
                           res->outcome == PLUMB_LIMIT_UNLIMITED
                               ? "it levels off as the fall reaches its terminal speed"
                               : "even at (almost) zero height the limit is exceeded",
                           sizeof res->explanation);
        }
        return PLUMB_OK;
    }
    /* The answer: the crossing nearest the profile's own value. */
    size_t best = 0;
    for (size_t k = 1; k < res->n_crossings; k++) {
        double dk = fabs(r.kind == RANGE_POSITIVE ? log(res->crossings_si[k] / base)
                                                  : res->crossings_si[k] - base);
        double db = fabs(r.kind == RANGE_POSITIVE ? log(res->crossings_si[best] / base)
                                                  : res->crossings_si[best] - base);
        if (dk < db)
            best = k;
    }
    double root = res->crossings_si[best];
    c->judged = judged;
    double froot = eval_at(root, c);
    res->evaluations = c->evals;
    if (c->fail != PLUMB_OK)
        return c->fail;
    if (isnan(froot)) /* computed before, so not expected: never a figure of NaN */
        return PLUMB_RAISE_KEY(diag, PLUMB_ENUMERIC, key,
                               "the fall at the answer, computed before, could not be computed "
                               "again");
    if (gaps[best].unrefined)
        gap_words(key, &gaps[best], res);
    res->outcome = PLUMB_LIMIT_FOUND;
    res->value_si = root;
    res->metric_at_value = froot + limit;
    /* within below the answer when the number of crossings below it and
     * the low end's verdict say so */
    int within = res->within_at_low_end;
    for (size_t k = 0; k < best; k++)
        within = !within;
    res->limit_is_upper_bound = within;
    res->increasing = within;
    return PLUMB_OK;
}
