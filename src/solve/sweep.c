/*
 * sweep.c - ranges of an input and the table of falls over them
 * (include/plumb/sweep.h). Every row is exactly what `plumb fall --set`
 * gives at its values. The first row the loader can make is derived from
 * the row's values as --set texts (plumb_profile_derive); it is the
 * template of the others, which set the values on copies of its resolved
 * specs (io/vary.h), with the air rebuilt only for a key that changes it.
 * A row goes through the loader again when a key cannot be set on a copy
 * (see io/vary.h for which) or when the copy refuses the value, so that
 * its diagnostic is the loader's own.
 */
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/sweep.h"
#include "plumb/atmosphere.h"
#include "core/internal.h"
#include "io/vary.h"
#include "solve/sweep_internal.h"

/* Digits a range value is written with: enough for any value a user types,
 * few enough that 0.1 x 3 is written "0.3", as the user would type it. */
#define RANGE_DIGITS 15

struct plumb_sweep {
    size_t n_axes;
    plumb_range axes[PLUMB_MAX_AXES];
    size_t n_rows;
    size_t n_failed;            /* rows without figures (status != PLUMB_OK) */
    plumb_sweep_row *rows;
    plumb_item_report **items;  /* one per row, owned: the row's report.items */
    plumb_profile **profiles;   /* one per row, owned (the template's row: see tmpl) */
    plumb_atmosphere **atms;    /* one per row, owned unless it is `air` (verdict warnings
                                   use it) */
    /* rows varied on copies (io/vary.h) */
    const plumb_profile *tmpl;  /* the rows' template: own_tmpl, or the caller's profile
                                   when it was built in code; NULL before */
    plumb_profile *own_tmpl;    /* the first row the loader made, owned */
    int fast;                   /* 1: every axis is set on copies of tmpl's specs */
    plumbp_vary vary[PLUMB_MAX_AXES];
    plumb_fall_spec *work;      /* tmpl's items, copied and varied row by row */
    plumb_atmosphere *air;      /* tmpl's air, owned: rows whose keys leave the air share it */
    /* the boundary of a two-way sweep (sweep_boundary.c), owned */
    size_t n_bcrit, b_item, b_axis; /* b_axis: the axis whose key names b_item, or
                                       PLUMB_MAX_AXES (the item with the highest energy) */
    const plumb_criterion *bcrit[PLUMB_MAX_VERDICTS];
    plumb_sweep_boundary *bounds; /* [value of the first input][criterion] */
    /* why a boundary has no answer: the distinct diagnostics, and for each
     * boundary the index of its own (PLUMBP_NO_WHY: none kept) */
    plumb_diag bwhy[PLUMB_SWEEP_BOUNDARY_REASONS];
    size_t n_bwhy;
    unsigned char *bwhy_of;
};

static const char *trim(char *s)
{
    while (isspace((unsigned char)*s))
        s++;
    char *e = s + strlen(s);
    while (e > s && isspace((unsigned char)e[-1]))
        *--e = '\0';
    return s;
}

/* An error in a range, at its option (plumb_diag_option): `what` is the
 * option, then after a space the key it varies ("--vary release.height",
 * "--alt"); col the column in the range's text where the part at fault
 * starts (plumb_range_parse_key adds the key's). Returns st. */
PLUMBP_PRINTF(5, 6)
static plumb_status range_error(plumb_diag *diag, plumb_status st, const char *what, int col,
                                const char *fmt, ...)
{
    char option[PLUMB_DIAG_KEY];
    const char *sp = strchr(what, ' ');
    snprintf(option, sizeof option, "%.*s", sp ? (int)(sp - what) : (int)strlen(what), what);
    va_list ap;
    va_start(ap, fmt);
    plumb_diag_voption(diag, st, option, 1, col, sp ? sp + 1 : NULL, fmt, ap);
    va_end(ap);
    return st;
}
#define RANGE_ERROR(diag, st, what, col, ...) range_error((diag), (st), (what), (col), __VA_ARGS__)

/* Splits "FROM:TO:STEP" of `text` into buf, the three parts trimmed, and
 * the column in text where each starts (cols, 1-based). */
static plumb_status range_split(const char *text, const char *what, char *buf, size_t size,
                                const char *parts[3], int cols[3], plumb_diag *diag)
{
    if (snprintf(buf, size, "%s", text) >= (int)size)
        return RANGE_ERROR(diag, PLUMB_EPARSE, what, 1, "range too long: '%s'", text);
    char *p = buf;
    for (int i = 0; i < 3; i++) {
        char *colon = strchr(p, ':');
        if (i < 2 && !colon)
            return RANGE_ERROR(diag, PLUMB_EPARSE, what, 1,
                               "expected FROM:TO:STEP, each with its unit (e.g. 2m:60m:2m); "
                               "found '%s'", text);
        if (i == 2 && colon)
            return RANGE_ERROR(diag, PLUMB_EPARSE, what, (int)(colon - buf) + 1,
                               "expected FROM:TO:STEP, three parts; found '%s'", text);
        if (colon)
            *colon = '\0';
        parts[i] = trim(p);
        cols[i] = (int)(parts[i] - buf) + 1;
        if (colon)
            p = colon + 1;
    }
    return PLUMB_OK;
}

plumb_status plumb_range_parse(const plumb_units *units, const char *text, plumb_dim dim,
                               const char *what, plumb_range *out, plumb_diag *diag)
{
    char buf[256];
    const char *parts[3];
    int cols[3];
    plumb_status st = range_split(text, what, buf, sizeof buf, parts, cols, diag);
    if (st != PLUMB_OK)
        return st;
    static const char *const names[3] = {"FROM", "TO", "STEP"};
    /* A step is a difference: "5 degC" as a step is 5 K, not 278.15 K. */
    plumb_dim dims[3] = {dim, dim, dim == PLUMB_DIM_TEMPERATURE ? PLUMB_DIM_TEMP_DIFF : dim};
    double si[3], num[3];
    char unit[3][PLUMB_UNIT_TEXT];
    int typed = 1; /* 1: all three are NUMBER UNIT in one unit, and count in it */
    for (int i = 0; i < 3; i++) {
        plumb_diag d;
        plumb_diag_clear(&d);
        st = plumb_units_parse(units, parts[i], dims[i], &si[i], &d);
        if (st != PLUMB_OK)
            return RANGE_ERROR(diag, st, what, cols[i], "%s '%s': %s", names[i], parts[i],
                               d.message);
        char *end = NULL;
        num[i] = strtod(parts[i], &end);
        char rest[PLUMB_UNIT_TEXT];
        plumbp_strlcpy(rest, end ? end : "", sizeof rest);
        plumbp_strlcpy(unit[i], trim(rest), sizeof unit[i]);
        /* the number and unit must give back the quantity udunits read */
        double back = num[i];
        plumb_status bs = PLUMB_OK;
        if (end && end != parts[i] && plumbp_finite(num[i]) && unit[i][0]) {
            bs = plumb_units_to_si(units, num[i], unit[i], dims[i], &back, &d);
            if (bs == PLUMB_ENOMEM) /* not a reason to count in SI: a failure */
                return PLUMB_RAISE(diag, bs, "%s", d.message);
        }
        if (!end || end == parts[i] || !plumbp_finite(num[i]) || bs != PLUMB_OK ||
            !(fabs(back - si[i]) <= 1e-12 * fabs(si[i])))
            typed = 0;
    }
    typed = typed && strcmp(unit[0], unit[1]) == 0 && strcmp(unit[1], unit[2]) == 0;
    memset(out, 0, sizeof *out);
    out->dim = dim;
    if (typed) {
        plumbp_strlcpy(out->unit, unit[0], sizeof out->unit);
        out->from = num[0];
        out->to = num[1];
        out->step = num[2];
    } else {
        const char *u = plumb_dim_si_unit(dim);
        plumbp_strlcpy(out->unit, strcmp(u, "1") == 0 ? "" : u, sizeof out->unit);
        out->from = si[0];
        out->to = si[1];
        out->step = si[2];
    }
    /* Signs and the count in the unit the values are counted in. */
    if (out->step == 0.0)
        return RANGE_ERROR(diag, PLUMB_ERANGE, what, cols[2], "STEP must not be zero, found '%s'",
                           parts[2]);
    if ((out->to > out->from && out->step < 0.0) || (out->to < out->from && out->step > 0.0))
        return RANGE_ERROR(diag, PLUMB_ERANGE, what, cols[2],
                           "STEP '%s' goes the wrong way: from %s %s to %s needs a %s STEP",
                           parts[2], parts[0], out->to > out->from ? "up" : "down", parts[1],
                           out->to > out->from ? "positive" : "negative");
    /* >= 0, in double: never wraps; each end divided first, so that ends
     * near the largest double do not overflow their difference */
    double span = out->to / out->step - out->from / out->step;
    if (!plumbp_finite(span))
        return RANGE_ERROR(diag, PLUMB_ERANGE, what, 1,
                           "'%s' makes more values than can be counted, far more than %u; use "
                           "a larger STEP", text, PLUMB_RANGE_MAX_VALUES);
    /* the values counted once, here, for every range (--vary, a
     * direction's range, --alt): the relative slack lets 0:1:0.1 end on 1 despite
     * rounding, and the limit is checked on that count, never on the span
     * before it (0m:1m:0.00001m spans 99999.99999999999 steps and makes
     * 100001 values) */
    double count = floor(span * (1.0 + 1e-12) + 1e-12) + 1.0;
    if (!(count <= (double)PLUMB_RANGE_MAX_VALUES))
        return RANGE_ERROR(diag, PLUMB_ERANGE, what, 1,
                           "'%s' makes %s%.*g values, more than %u; use a larger STEP", text,
                           count < 1e12 ? "" : "about ", count < 1e12 ? 12 : 2, count,
                           PLUMB_RANGE_MAX_VALUES);
    out->n = (size_t)count;
    return PLUMB_OK;
}

/* A range of a direction (io/vary.h) whose FROM or TO is a compass point
 * ("NW:NE:22.5deg"), as degrees into buf: each point is its bearing, and
 * the values run from FROM the way STEP turns (positive clockwise, as
 * bearings count) until they reach TO, through north when TO lies behind:
 * NW:NE:22.5deg is 315 to 405 deg, NE:NW:-22.5deg 45 to -45 deg (a
 * direction of 405 deg is one of 45 deg; the wind and the heading take any
 * value). A range without a compass point is copied as it is, and its
 * STEP's sign checked as any other. STEP is an angle: a compass point there
 * is an error naming the option. */
static plumb_status direction_range(const plumb_units *units, const char *text, const char *what,
                                    char *buf, size_t size, plumb_diag *diag)
{
    char split[256];
    const char *parts[3];
    int cols[3];
    plumb_status st = range_split(text, what, split, sizeof split, parts, cols, diag);
    if (st != PLUMB_OK)
        return st;
    double from = plumbp_direction_bearing(parts[0]), to = plumbp_direction_bearing(parts[1]);
    if (plumbp_direction_bearing(parts[2]) >= 0.0)
        return RANGE_ERROR(diag, PLUMB_EPARSE, what, cols[2],
                           "STEP '%s' is a compass point, a direction; a step is an angle "
                           "turned, e.g. 22.5 deg (one point of 16) or -22.5 deg "
                           "(anticlockwise)", parts[2]);
    if (from < 0.0 && to < 0.0) {
        plumbp_strlcpy(buf, text, size);
        return PLUMB_OK;
    }
    plumb_diag d;
    plumb_diag_clear(&d);
    double v[2], step;
    const double given[2] = {from, to};
    for (int i = 0; i < 2; i++) {
        if (given[i] >= 0.0)
            v[i] = given[i];
        else if ((st = plumb_units_parse(units, parts[i], PLUMB_DIM_ANGLE, &v[i], &d)) !=
                 PLUMB_OK)
            return RANGE_ERROR(diag, st, what, cols[i], "%s '%s': %s", i ? "TO" : "FROM", parts[i],
                               d.message);
    }
    if ((st = plumb_units_parse(units, parts[2], PLUMB_DIM_ANGLE, &step, &d)) != PLUMB_OK)
        return RANGE_ERROR(diag, st, what, cols[2], "STEP '%s': %s", parts[2], d.message);
    /* angles are read in degrees (units.h) */
    if (step > 0.0 && v[1] < v[0])
        v[1] += 360.0;
    else if (step < 0.0 && v[1] > v[0])
        v[1] -= 360.0;
    if (snprintf(buf, size, "%.*g deg:%.*g deg:%.*g deg", RANGE_DIGITS, v[0], RANGE_DIGITS, v[1],
                 RANGE_DIGITS, step) >= (int)size)
        return RANGE_ERROR(diag, PLUMB_EPARSE, what, 1, "range too long: '%s'", text);
    return PLUMB_OK;
}

plumb_status plumb_range_parse_key(const plumb_units *units, const char *text, plumb_range *out,
                                   plumb_diag *diag)
{
    const char *eq = strchr(text, '=');
    if (!eq || eq == text)
        return RANGE_ERROR(diag, PLUMB_EPARSE, "--vary", 1,
                           "expected KEY=FROM:TO:STEP (e.g. release.height=2m:60m:2m), found '%s'",
                           text);
    char key[PLUMB_DIAG_KEY];
    size_t klen = (size_t)(eq - text);
    if (klen >= sizeof key)
        return RANGE_ERROR(diag, PLUMB_EPARSE, "--vary", 1, "the key of '%.40s...' is too long",
                           text);
    memcpy(key, text, klen);
    key[klen] = '\0';
    plumb_dim dim;
    char what[PLUMB_DIAG_KEY + 8];
    snprintf(what, sizeof what, "--vary %s", key);
    plumb_status st = plumb_profile_key_dim(key, &dim, diag);
    if (st != PLUMB_OK) {
        /* the key is the option's: located as every other --vary error is,
         * at the column of its part at fault when the key's check knew it */
        if (diag && !diag->file[0]) {
            char msg[PLUMB_DIAG_MSG];
            plumbp_strlcpy(msg, diag->message, sizeof msg);
            plumb_diag_option(diag, st, "--vary", 1, diag->col, key, "%s", msg);
        }
        return st;
    }
    char turned[256];
    const char *range = eq + 1;
    if (plumbp_key_is_direction(key)) {
        st = direction_range(units, range, what, turned, sizeof turned, diag);
        if (st == PLUMB_OK && strcmp(turned, range) != 0)
            range = turned; /* compass points turned: a column in it is not the text's */
        else if (st == PLUMB_OK)
            turned[0] = '\0';
    }
    if (st == PLUMB_OK)
        st = plumb_range_parse(units, range, dim, what, out, diag);
    if (st == PLUMB_OK)
        plumbp_strlcpy(out->key, key, sizeof out->key);
    else if (diag && strcmp(diag->file, "--vary") == 0)
        /* the column in the whole KEY=FROM:TO:STEP */
        diag->col = range == turned ? (int)klen + 2 : diag->col + (int)klen + 1;
    return st;
}

double plumb_range_value(const plumb_range *r, size_t i)
{
    double v = r->from + (double)i * r->step;
    if ((r->step > 0.0 && v > r->to) || (r->step < 0.0 && v < r->to))
        v = r->to;
    char buf[64];
    snprintf(buf, sizeof buf, "%.*g", RANGE_DIGITS, v);
    return strtod(buf, NULL);
}

plumb_status plumb_range_value_si(const plumb_range *r, const plumb_units *units, size_t i,
                                  double *si_out, plumb_diag *diag)
{
    double v = plumb_range_value(r, i);
    if (!r->unit[0]) {
        *si_out = v;
        return PLUMB_OK;
    }
    return plumb_units_to_si(units, v, r->unit, r->dim, si_out, diag);
}

plumb_status plumb_range_values_si(const plumb_range *r, const plumb_units *units,
                                   double *si_out, plumb_diag *diag)
{
    for (size_t i = 0; i < r->n; i++)
        si_out[i] = plumb_range_value(r, i);
    if (!r->unit[0])
        return PLUMB_OK;
    return plumb_units_to_si_n(units, si_out, r->n, r->unit, r->dim, si_out, diag);
}

void plumb_range_set_text(const plumb_range *r, size_t i, char *buf, size_t size)
{
    snprintf(buf, size, "%s=%.*g%s%s", r->key, RANGE_DIGITS, plumb_range_value(r, i),
             r->unit[0] ? " " : "", r->unit);
}

void plumb_sweep_free(plumb_sweep *s)
{
    if (!s)
        return;
    for (size_t i = 0; i < s->n_rows; i++) {
        if (s->items)
            free(s->items[i]);
        if (s->profiles && s->profiles[i] != s->tmpl)
            plumb_profile_free(s->profiles[i]);
        if (s->atms && s->atms[i] != s->air)
            plumb_atmosphere_free(s->atms[i]);
    }
    plumb_profile_free(s->own_tmpl);
    plumb_atmosphere_free(s->air);
    free(s->work);
    free(s->rows);
    free(s->items);
    free(s->profiles);
    free(s->atms);
    free(s->bounds);
    free(s->bwhy_of);
    free(s);
}

/* ---- the boundary's storage (sweep_boundary.c fills it) ------------------------ */

plumb_sweep_boundary *plumbp_sweep_boundaries_alloc(plumb_sweep *s, size_t item, size_t axis,
                                                    const plumb_criterion *const *crit, size_t n)
{
    size_t cells = (s->axes[0].n ? s->axes[0].n : 1) * (n ? n : 1);
    free(s->bounds);
    free(s->bwhy_of);
    s->n_bcrit = 0;
    s->n_bwhy = 0;
    s->bounds = calloc(cells, sizeof *s->bounds);
    s->bwhy_of = malloc(cells);
    if (!s->bounds || !s->bwhy_of) {
        free(s->bounds);
        free(s->bwhy_of);
        s->bounds = NULL;
        s->bwhy_of = NULL;
        return NULL;
    }
    memset(s->bwhy_of, PLUMBP_NO_WHY, cells);
    s->b_item = item;
    s->b_axis = axis;
    s->n_bcrit = n;
    for (size_t k = 0; k < n; k++)
        s->bcrit[k] = crit[k];
    return s->bounds;
}

size_t plumb_sweep_boundary_criteria(const plumb_sweep *s)
{
    return s && s->bounds ? s->n_bcrit : 0;
}

const plumb_criterion *plumb_sweep_boundary_criterion(const plumb_sweep *s, size_t k)
{
    return s && s->bounds && k < s->n_bcrit ? s->bcrit[k] : NULL;
}

size_t plumb_sweep_boundary_item(const plumb_sweep *s)
{
    return s ? s->b_item : 0;
}

const char *plumb_sweep_boundary_item_key(const plumb_sweep *s)
{
    return s && s->bounds && s->b_axis < s->n_axes ? s->axes[s->b_axis].key : NULL;
}

void plumbp_sweep_boundary_why(plumb_sweep *s, size_t i0, size_t k, const plumb_diag *d)
{
    size_t e = 0;
    while (e < s->n_bwhy && !(s->bwhy[e].status == d->status &&
                              strcmp(s->bwhy[e].key, d->key) == 0 &&
                              strcmp(s->bwhy[e].message, d->message) == 0))
        e++;
    if (e == s->n_bwhy && e < PLUMB_SWEEP_BOUNDARY_REASONS)
        s->bwhy[s->n_bwhy++] = *d;
    if (e < s->n_bwhy)
        s->bwhy_of[i0 * s->n_bcrit + k] = (unsigned char)e;
}

const plumb_diag *plumb_sweep_boundary_why(const plumb_sweep *s, size_t i0, size_t k)
{
    const plumb_sweep_boundary *b = plumb_sweep_boundary_at(s, i0, k);
    if (!b || b->status == PLUMB_OK)
        return NULL;
    unsigned char e = s->bwhy_of[i0 * s->n_bcrit + k];
    return e < s->n_bwhy ? &s->bwhy[e] : NULL;
}

const plumb_sweep_boundary *plumb_sweep_boundary_at(const plumb_sweep *s, size_t i0, size_t k)
{
    if (!s || !s->bounds || k >= s->n_bcrit || i0 >= s->axes[0].n)
        return NULL;
    return &s->bounds[i0 * s->n_bcrit + k];
}

/* Makes s->tmpl the template of the rows after it: fast when every axis
 * can be set on copies of its specs (io/vary.h). PLUMB_ENOMEM (in rd) is
 * the only failure. */
static plumb_status take_template(plumb_sweep *s, plumb_diag *rd)
{
    const plumb_profile *p = s->tmpl;
    s->fast = 1;
    for (size_t a = 0; a < s->n_axes; a++)
        s->fast = s->fast && plumbp_vary_init(&s->vary[a], p, s->axes[a].key);
    if (s->fast && !(s->work = malloc(plumb_profile_item_count(p) * sizeof *s->work)))
        return PLUMB_RAISE(rd, PLUMB_ENOMEM, "out of memory");
    return PLUMB_OK;
}

/* Row r's profile and air through the loader, from its values as --set
 * texts; the first profile it makes becomes the template of the rows
 * after it. Returns the row's status (rd says why it is not PLUMB_OK). */
static plumb_status derive_row(plumb_sweep *s, size_t r, const plumb_profile *base,
                               const plumb_units *units, plumb_diag *rd)
{
    char sets[PLUMB_MAX_AXES][PLUMB_DIAG_KEY + 64];
    const char *set_ptrs[PLUMB_MAX_AXES];
    for (size_t a = 0; a < s->n_axes; a++) {
        plumb_range_set_text(&s->axes[a], s->rows[r].index[a], sets[a], sizeof sets[a]);
        set_ptrs[a] = sets[a];
    }
    plumb_status st = plumb_profile_derive(base, units, set_ptrs, s->n_axes, &s->profiles[r], rd);
    if (st != PLUMB_OK && strcmp(rd->file, "--set") == 0)
        /* the override is the sweep's own, made from the line-th --vary,
         * KEY=VALUE as it wrote KEY=FROM:TO:STEP: the line and column are
         * that --vary's (the value's column is its FROM's) */
        plumbp_strlcpy(rd->file, "--vary", sizeof rd->file);
    if (st != PLUMB_OK)
        return st;
    if (!s->tmpl) {
        s->tmpl = s->own_tmpl = s->profiles[r];
        st = take_template(s, rd);
        if (st != PLUMB_OK)
            return st;
    }
    return plumb_atmosphere_alloc(plumb_profile_atmosphere(s->profiles[r]), &s->atms[r], rd);
}

/* Row r's profile and air set on copies of the template's (io/vary.h).
 * *done 0: the row is to go through the loader instead (a value a copy
 * refuses, air that cannot be made: the loader's diagnostic is wanted).
 * A template built in code has no loader: the row then fails here with
 * why (in rd). Returns PLUMB_OK, the row's status, or PLUMB_ENOMEM (in
 * rd). */
static plumb_status vary_row(plumb_sweep *s, size_t r, int *done, plumb_diag *rd)
{
    const plumb_profile *t = s->tmpl;
    size_t n = plumb_profile_item_count(t);
    int air = 0;
    *done = 0;
    memcpy(s->work, plumb_profile_item(t, 0), n * sizeof *s->work);
    plumb_atm_spec as = *plumb_profile_atmosphere(t);
    int coded = plumbp_vary_is_template(t);
    for (size_t a = 0; a < s->n_axes; a++) {
        double x = s->rows[r].value_si[a];
        if (!plumbp_vary_set(&s->vary[a], x, s->work, n, &as))
            return coded ? plumbp_vary_refusal(&s->vary[a], x, s->work, n, &as, rd) : PLUMB_OK;
        air = air || plumbp_vary_air(&s->vary[a]);
    }
    plumb_atmosphere *atm = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st;
    if (air) {
        st = plumb_atmosphere_alloc(&as, &atm, &d);
    } else {
        st = s->air ? PLUMB_OK : plumb_atmosphere_alloc(&as, &s->air, &d);
        atm = s->air;
    }
    if (st == PLUMB_ENOMEM || (st != PLUMB_OK && coded)) {
        if (rd)
            *rd = d;
        return st;
    }
    if (st != PLUMB_OK)
        return PLUMB_OK;
    st = plumbp_profile_variant(t, s->work, &as, &s->profiles[r], rd);
    if (st != PLUMB_OK) {
        if (atm != s->air)
            plumb_atmosphere_free(atm);
        return st;
    }
    s->atms[r] = atm;
    *done = 1;
    return PLUMB_OK;
}

/* Runs one row; its profile and atmosphere go into the sweep. A row that
 * cannot be computed (a value out of range, a fall that never lands ...)
 * keeps its status and diagnostic in the row, no figures, and returns
 * PLUMB_OK; only running out of memory stops the sweep. */
static plumb_status run_row(plumb_sweep *s, size_t r, const plumb_profile *base,
                            const plumb_units *units, const plumb_criteria *crit,
                            plumb_trajectory *traj, plumb_diag *diag)
{
    plumb_sweep_row *row = &s->rows[r];
    for (size_t a = 0; a < s->n_axes; a++) {
        row->value[a] = plumb_range_value(&s->axes[a], row->index[a]);
        plumb_status vs = plumb_range_value_si(&s->axes[a], units, row->index[a],
                                               &row->value_si[a], diag);
        if (vs != PLUMB_OK)
            return vs; /* out of memory: stops the sweep */
    }
    plumb_diag *rd = &row->error;
    plumb_diag_clear(rd);
    int done = 0;
    plumb_status st = s->fast ? vary_row(s, r, &done, rd) : PLUMB_OK;
    if (st == PLUMB_OK && !done)
        st = derive_row(s, r, base, units, rd);
    const plumb_profile *p = s->profiles[r];
    size_t n = st == PLUMB_OK ? plumb_profile_item_count(p) : 0;
    plumb_item_report *items = NULL;
    if (st == PLUMB_OK) {
        items = s->items[r] = calloc(n ? n : 1, sizeof *items);
        if (!items)
            return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
        row->report = (plumb_fall_report){p, n, items};
    }
    for (size_t i = 0; st == PLUMB_OK && i < n; i++) {
        plumb_item_report *it = &items[i];
        it->spec = plumb_profile_item(p, i);
        it->shape = plumb_profile_item_shape(p, i);
        st = plumbp_profile_item_sinks(p, i, s->atms[r], rd);
        for (size_t a = 0; st != PLUMB_OK && a < s->n_axes; a++)
            if (strcmp(rd->key, s->axes[a].key) == 0) {
                /* the volume is the row's own value, from the a-th --vary:
                 * at its FROM, after KEY= */
                char msg[PLUMB_DIAG_MSG];
                plumbp_strlcpy(msg, rd->message, sizeof msg);
                plumb_diag_option(rd, st, "--vary", (int)a + 1, (int)strlen(s->axes[a].key) + 2,
                                  s->axes[a].key, "%s", msg);
            }
        if (st == PLUMB_OK)
            st = plumb_trajectory_run(traj, it->spec, s->atms[r], &it->result, rd);
        if (st == PLUMB_OK)
            st = plumb_item_judge(it, p, crit, s->atms[r], rd);
        if (st != PLUMB_OK && plumb_profile_is_inventory(p)) {
            /* name the item whose fall failed */
            char where[PLUMB_DIAG_MSG + PLUMB_NAME + 16];
            snprintf(where, sizeof where, "item %s: %s", it->spec->name, rd->message);
            plumbp_strlcpy(rd->message, where, sizeof rd->message);
        }
    }
    if (st == PLUMB_ENOMEM) {
        if (diag)
            *diag = *rd;
        return st;
    }
    if (st != PLUMB_OK) {
        if (rd->status == PLUMB_OK)
            rd->status = st;
        row->status = st;
        /* no figures for this row: its profile and air go too (the
         * template stays for the rows after it) */
        free(items);
        s->items[r] = NULL;
        memset(&row->report, 0, sizeof row->report);
        if (s->atms[r] != s->air)
            plumb_atmosphere_free(s->atms[r]);
        if (s->profiles[r] != s->tmpl)
            plumb_profile_free(s->profiles[r]);
        s->atms[r] = NULL;
        s->profiles[r] = NULL;
        s->n_failed++;
    }
    return PLUMB_OK;
}

/* key into out (size bytes) with an item named in its brackets turned into
 * its number, items[glove].mass into items[3].mass, so that two --vary of
 * one item's key are one key however each names the item; any other key
 * (or a profile NULL, or a name no item has) is copied. Can't fail. */
static void key_numbered(const plumb_profile *p, const char *key, char *out, size_t size)
{
    snprintf(out, size, "%s", key);
    const char *close = strncmp(key, "items[", 6) == 0 ? strchr(key + 6, ']') : NULL;
    size_t len = close ? (size_t)(close - (key + 6)) : 0;
    for (size_t i = 0; p && close && i < plumb_profile_item_count(p); i++) {
        const char *name = plumb_profile_item(p, i)->name;
        if (strlen(name) == len && strncmp(name, key + 6, len) == 0) {
            snprintf(out, size, "items[%zu]%s", plumb_profile_item_number(p, i), close + 1);
            return;
        }
    }
}

plumb_status plumb_sweep_run(const plumb_profile *profile, const plumb_units *units,
                             const plumb_criteria *criteria, const plumb_range *axes,
                             size_t n_axes, plumb_trajectory *traj, plumb_sweep **out,
                             plumb_diag *diag)
{
    return plumb_sweep_run_progress(profile, units, criteria, axes, n_axes, traj, NULL, NULL, out,
                                    diag);
}

plumb_status plumb_sweep_run_progress(const plumb_profile *profile, const plumb_units *units,
                                      const plumb_criteria *criteria, const plumb_range *axes,
                                      size_t n_axes, plumb_trajectory *traj,
                                      plumb_sweep_progress_fn progress, void *user,
                                      plumb_sweep **out, plumb_diag *diag)
{
    *out = NULL;
    if (n_axes < 1 || n_axes > PLUMB_MAX_AXES)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a sweep takes one or two --vary ranges");
    char k0[PLUMB_DIAG_KEY], k1[PLUMB_DIAG_KEY];
    if (n_axes == 2) {
        key_numbered(profile, axes[0].key, k0, sizeof k0);
        key_numbered(profile, axes[1].key, k1, sizeof k1);
    }
    if (n_axes == 2 && strcmp(k0, k1) == 0)
        return plumb_diag_option(diag, PLUMB_EINVAL, "--vary", 2, 1, axes[1].key,
                                 "the same key as --vary 1%s%s%s: vary each key once",
                                 strcmp(axes[0].key, axes[1].key) ? " ('" : "",
                                 strcmp(axes[0].key, axes[1].key) ? axes[0].key : "",
                                 strcmp(axes[0].key, axes[1].key) ? "')" : "");
    /* The rows in double: a product of two counts never wraps. */
    double rows = 1.0;
    for (size_t a = 0; a < n_axes; a++) {
        if (axes[a].n < 1 || axes[a].n > PLUMB_RANGE_MAX_VALUES)
            return plumb_diag_option(diag, PLUMB_ERANGE, "--vary", (int)a + 1,
                                     (int)strlen(axes[a].key) + 2, axes[a].key,
                                     "a range has 1 to %u values, found %zu",
                                     PLUMB_RANGE_MAX_VALUES, axes[a].n);
        rows *= (double)axes[a].n;
    }
    if (rows > (double)PLUMB_SWEEP_MAX_ROWS) {
        /* at the --vary that takes the rows past the limit */
        if (n_axes == 2)
            return plumb_diag_option(diag, PLUMB_ERANGE, "--vary", 2, 1, NULL,
                                     "%zu x %zu values make %.0f rows, more than %u; use larger "
                                     "steps", axes[0].n, axes[1].n, rows, PLUMB_SWEEP_MAX_ROWS);
        return plumb_diag_option(diag, PLUMB_ERANGE, "--vary", 1, 1, NULL,
                                 "%zu values make more than %u rows; use a larger step",
                                 axes[0].n, PLUMB_SWEEP_MAX_ROWS);
    }
    size_t total = (size_t)rows;
    plumb_sweep *s = calloc(1, sizeof *s);
    if (!s)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    s->n_axes = n_axes;
    memcpy(s->axes, axes, n_axes * sizeof *axes);
    s->rows = calloc(total, sizeof *s->rows);
    s->items = calloc(total, sizeof *s->items);
    s->profiles = calloc(total, sizeof *s->profiles);
    s->atms = calloc(total, sizeof *s->atms);
    s->n_rows = total;
    if (!s->rows || !s->items || !s->profiles || !s->atms) {
        plumb_sweep_free(s);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    }
    if (plumbp_vary_is_template(profile)) {
        /* built in code: no loader to derive rows from, only copies */
        s->tmpl = profile;
        plumb_status st = take_template(s, diag);
        for (size_t a = 0; st == PLUMB_OK && !s->fast && a < n_axes; a++)
            if (!plumbp_vary_init(&s->vary[a], profile, axes[a].key))
                st = PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, axes[a].key,
                                     "a profile built in code cannot vary this key: only "
                                     "the profile loader derives it (read the profile from "
                                     "a file to vary it)");
        if (st != PLUMB_OK) {
            plumb_sweep_free(s);
            return st;
        }
    }
    size_t inner = n_axes == 2 ? axes[1].n : 1;
    for (size_t r = 0; r < total; r++) {
        s->rows[r].index[0] = r / inner;
        if (n_axes == 2)
            s->rows[r].index[1] = r % inner;
        plumb_status st = run_row(s, r, profile, units, criteria, traj, diag);
        if (st != PLUMB_OK) {
            plumb_sweep_free(s);
            return st;
        }
        if (progress)
            progress(user, r + 1, total);
    }
    if (s->n_failed == total) {
        /* No row has figures: the range itself is at fault (a key the
         * profile cannot take, every value out of range, an object that
         * floats at every value) or the falls failed. An input error only
         * when every row's is one (README.md "plumb sweep"): a fall that
         * failed is reported before them, whichever way the range runs.
         * The first such row's error, naming its values. */
        size_t first = 0;
        while (first < total && plumb_status_is_input_error(s->rows[first].status))
            first++;
        if (first == total)
            first = 0;
        plumb_status st = s->rows[first].status;
        if (diag) {
            *diag = s->rows[first].error;
            char at[PLUMB_MAX_AXES * (PLUMB_DIAG_KEY + 64) + 16] = "", one[PLUMB_DIAG_KEY + 64];
            for (size_t a = 0; a < n_axes; a++) {
                plumb_range_set_text(&s->axes[a], s->rows[first].index[a], one, sizeof one);
                snprintf(at + strlen(at), sizeof at - strlen(at), "%s%s", a ? ", " : "", one);
            }
            char msg[PLUMB_DIAG_MSG + sizeof at + 64];
            snprintf(msg, sizeof msg, "%s (at %s; no row of the sweep could be computed)",
                     diag->message, at);
            plumbp_strlcpy(diag->message, msg, sizeof diag->message);
        }
        plumb_sweep_free(s);
        return st;
    }
    *out = s;
    return PLUMB_OK;
}

size_t plumb_sweep_axis_count(const plumb_sweep *s)
{
    return s->n_axes;
}

const plumb_range *plumb_sweep_axis(const plumb_sweep *s, size_t i)
{
    return i < s->n_axes ? &s->axes[i] : NULL;
}

size_t plumb_sweep_row_count(const plumb_sweep *s)
{
    return s->n_rows;
}

size_t plumb_sweep_failed_count(const plumb_sweep *s)
{
    return s->n_failed;
}

const plumb_sweep_row *plumb_sweep_row_at(const plumb_sweep *s, size_t i)
{
    return i < s->n_rows ? &s->rows[i] : NULL;
}
