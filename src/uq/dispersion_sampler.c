/*
 * dispersion_sampler.c - the sampler of a zone's uncertain inputs
 * (plumb_sampler_*): each profile uncertainty checked against its key's
 * range and effect, then drawn per sample from the random stream
 * (dispersion_rng.c) with GSL's samplers: normal by the ziggurat
 * (Marsaglia & Tsang, J. Stat. Softw. 5(8), 2000), truncated by
 * rejection; triangular by the inverse distribution function (Kotz & van
 * Dorp, Beyond Beta, 2004, ch. 1); angles wrapped into [0, 360).
 */
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_randist.h>

#include "uq/dispersion_int.h"

#define INF_ HUGE_VAL
static const key_rule unbounded_rule = {"", -INF_, INF_, 0, 0};

/* "descent[1].fill_time" -> "descent.fill_time"; other keys unchanged. */
static void normalise_key(const char *key, char *out, size_t size)
{
    const char *br = strchr(key, '[');
    if (strncmp(key, "descent[", 8) == 0 && br) {
        const char *close = strchr(br, ']');
        if (close) {
            snprintf(out, size, "descent%s", close + 1);
            return;
        }
    }
    plumbp_strlcpy(out, key, size);
}

/* The range of a key from the key table (io/keys.h); 0 for a key not in it. */
static int find_rule(const char *key, key_rule *out)
{
    const plumbp_key *k = plumbp_key_find(key, NULL, NULL);
    if (!k)
        return 0;
    out->key = k->key;
    out->angle = k->angle;
    if (k->angle) {
        out->lo = 0.0;
        out->hi = FULL_TURN_DEG;
        out->lo_open = 0;
    } else {
        plumbp_key_bounds(k, &out->lo, &out->hi, &out->lo_open);
    }
    return 1;
}

static double wrap_deg(double a)
{
    double w = fmod(a, FULL_TURN_DEG);
    if (w < 0.0)
        w += FULL_TURN_DEG;
    if (w >= FULL_TURN_DEG)
        w = 0.0;
    return w;
}

size_t plumb_sampler_count(const plumb_sampler *s)
{
    return s ? s->n : 0;
}

int plumb_sampler_truncated(const plumb_sampler *s, size_t i, double *lo, double *hi)
{
    if (!s || i >= s->n || !s->e[i].truncated || !(s->e[i].cut_lo || s->e[i].cut_hi))
        return 0;
    if (lo)
        *lo = s->e[i].cut_lo ? s->e[i].rule.lo : -HUGE_VAL;
    if (hi)
        *hi = s->e[i].cut_hi ? s->e[i].rule.hi : HUGE_VAL;
    return 1;
}

void plumb_sampler_free(plumb_sampler *s)
{
    if (!s)
        return;
    if (s->rng)
        gsl_rng_free(s->rng);
    free(s);
}

static const char *dist_name(plumb_dist_kind k)
{
    switch (k) {
    case PLUMB_DIST_UNIFORM: return "uniform";
    case PLUMB_DIST_TRIANGULAR: return "triangular";
    default: return "normal";
    }
}

/* Whether x lies in the rule's range (lower end open or closed, upper closed). */
static int in_range(const key_rule *r, double x)
{
    if (r->lo_open ? !(x > r->lo) : !(x >= r->lo))
        return 0;
    return x <= r->hi;
}

/* The rule's range in words: "> 0", ">= 0", "0 to 10", "-90 to 90". */
static const char *range_text(const key_rule *r, char *buf, size_t size)
{
    if (isfinite(r->lo) && isfinite(r->hi))
        snprintf(buf, size, "%g to %g", r->lo, r->hi);
    else if (isfinite(r->lo))
        snprintf(buf, size, "%s %g", r->lo_open ? ">" : ">=", r->lo);
    else if (isfinite(r->hi))
        snprintf(buf, size, "<= %g", r->hi);
    else
        snprintf(buf, size, "any value");
    return buf;
}

/* Why a key resolved to a spec field still does not change this fall, or
 * NULL. norm is the normalised key; dev the descent device it addresses. */
static const char *no_effect(const plumb_fall_spec *b, const char *norm, const plumb_descent_spec *dev)
{
    const plumb_drag_spec *d = &b->drag;
    int fixed = d->model == PLUMB_DRAG_FIXED;
    if (strcmp(norm, "payload.drag.cd") == 0) {
        if (!fixed)
            return "the sphere drag model takes its drag coefficient from the Reynolds number";
        if (!(d->area_m2 > 0.0))
            return "the drag is given as cd_area, so cd is not used";
    }
    if (strcmp(norm, "payload.drag.area") == 0 && fixed && !(d->area_m2 > 0.0))
        return "the drag is given as cd_area, so area is not used";
    if (strcmp(norm, "payload.drag.cd_area") == 0 && (!fixed || d->area_m2 > 0.0))
        return "the drag is given as cd and area (or by a sphere model), so cd_area is not used";
    if (strcmp(norm, "payload.drag.diameter") == 0 && fixed)
        return "the diameter is used by the sphere drag models only";
    if (dev) {
        if (strcmp(norm, "descent.deploy.after") == 0 && dev->trigger != PLUMB_DEPLOY_AFTER)
            return "this device deploys below a height, not after a time";
        if (strcmp(norm, "descent.deploy.below") == 0 && dev->trigger != PLUMB_DEPLOY_BELOW)
            return "this device deploys after a time, not below a height";
        if (strcmp(norm, "descent.fill_time") == 0 && dev->fill_constant > 0.0)
            return "this device's fill time comes from its fill constant";
        if (strcmp(norm, "descent.fill_constant") == 0 && !(dev->diameter_m > 0.0))
            return "a fill constant needs the device's diameter";
    }
    const plumb_wind_spec *w = &b->wind;
    if ((strcmp(norm, "wind.speed") == 0 || strcmp(norm, "wind.from") == 0) &&
        w->profile == PLUMB_WIND_TABLE)
        return "the wind is given as a table";
    if (strcmp(norm, "wind.reference_height") == 0 &&
        (w->profile == PLUMB_WIND_UNIFORM || w->profile == PLUMB_WIND_TABLE))
        return "a uniform or tabulated wind has no reference height";
    if (strcmp(norm, "wind.exponent") == 0 && w->profile != PLUMB_WIND_POWER)
        return "the exponent belongs to the power-law wind profile";
    if (strcmp(norm, "wind.roughness") == 0 && w->profile != PLUMB_WIND_LOG)
        return "the roughness length belongs to the log-law wind profile";
    return NULL;
}

/* The file an entry's error names: "--set" for an entry an override
 * gave (its line is which --set), else the profile's. */
static const char *at(const plumb_uncertainty *u, const char *source)
{
    return u->from_set ? PLUMB_DIAG_SET_FILE : source;
}

/* A distribution of zero width (a normal of sd 0, a uniform or triangular
 * whose ends meet, "x +- 0"): every sample takes the same value, so it
 * gives the zone no spread. Refused like any input whose sampling has no
 * effect, whether or not other inputs vary: a zone needs the spread of its
 * inputs and is never a radius from identical falls (README.md, "plumb
 * zone"), and a zero width among real ones is almost surely a slip (an sd
 * typed as 0, a range whose ends were copied), not a way to fix the input,
 * which leaving it out of `uncertainty:` does. */
static plumb_status zero_width(const plumb_uncertainty *u, const char *source, const char *why,
                               plumb_diag *diag)
{
    return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                          "sampling it has no effect: the %s distribution has zero width (%s), "
                          "so every sample takes the same value. A zone needs the spread of "
                          "its inputs, never a radius from identical falls: give its real "
                          "spread, or leave the key out of `uncertainty:`",
                          dist_name(u->kind), why);
}

/* Checks an entry's distribution against its rule; fills e->a, b, c and
 * e->truncated. */
static plumb_status check_dist(entry *e, const char *source, plumb_diag *diag)
{
    const plumb_uncertainty *u = &e->u;
    const key_rule *r = &e->rule;
    const double *q = u->param;
    char rt[64];
    int np = u->kind == PLUMB_DIST_TRIANGULAR ? 3 : 2;
    for (int i = 0; i < np; i++)
        if (!isfinite(q[i]))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                  "the %s distribution's parameters must be finite numbers",
                                  dist_name(u->kind));
    switch (u->kind) {
    case PLUMB_DIST_NORMAL: {
        double mean = q[0], sd = q[1];
        if (sd < 0.0)
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                  "normal: the standard deviation must be >= 0, found %g", sd);
        if (sd == 0.0)
            return zero_width(u, source, "its standard deviation is 0", diag);
        e->truncated = !r->angle && (isfinite(r->lo) || isfinite(r->hi));
        if (!e->truncated)
            return PLUMB_OK;
        if (!in_range(r, mean))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                  "normal: the mean %g lies outside the key's range (%s)",
                                  mean, range_text(r, rt, sizeof rt));
        double mass = gsl_cdf_ugaussian_P((r->hi - mean) / sd) -
                      gsl_cdf_ugaussian_P((r->lo - mean) / sd);
        if (!(mass >= TRUNC_MIN_MASS))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                  "normal [%g, %g]: only %.0f%% of it lies in the key's range "
                                  "(%s); truncating it there would change it beyond "
                                  "recognition: give a smaller sd or a uniform or "
                                  "triangular distribution", mean, sd, 100.0 * mass,
                                  range_text(r, rt, sizeof rt));
        e->cut_lo = gsl_cdf_ugaussian_P((r->lo - mean) / sd) > TRUNC_TAIL_SHOWN;
        e->cut_hi = gsl_cdf_ugaussian_Q((r->hi - mean) / sd) > TRUNC_TAIL_SHOWN;
        return PLUMB_OK;
    }
    case PLUMB_DIST_UNIFORM:
    case PLUMB_DIST_TRIANGULAR: {
        double a = q[0], b = u->kind == PLUMB_DIST_UNIFORM ? q[1] : q[2];
        double c = u->kind == PLUMB_DIST_UNIFORM ? 0.5 * (q[0] + q[1]) : q[1];
        if (r->angle) {
            if (b < a)
                b += FULL_TURN_DEG; /* a sector through north */
            if (u->kind == PLUMB_DIST_TRIANGULAR && c < a)
                c += FULL_TURN_DEG;
            if (!(b - a <= FULL_TURN_DEG))
                return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                      "%s: the sector from %g to %g deg is wider than a full turn",
                                      dist_name(u->kind), q[0], u->kind == PLUMB_DIST_UNIFORM ? q[1] : q[2]);
        } else if (b < a) {
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                  "%s: the low end %g is above the high end %g", dist_name(u->kind),
                                  a, b);
        }
        if (b == a)
            return zero_width(u, source, u->kind == PLUMB_DIST_UNIFORM
                                             ? "its low and high ends are the same value, or its tolerance is 0"
                                             : "its low end, mode and high end are the same value",
                              diag);
        if (u->kind == PLUMB_DIST_TRIANGULAR && !(c >= a && c <= b))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                  "triangular: the mode %g must lie between the low end %g and "
                                  "the high end %g", q[1], q[0], q[2]);
        if (!r->angle && (!in_range(r, a) || !in_range(r, b)))
            return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                                  "%s [%g .. %g] leaves the key's range (%s)",
                                  dist_name(u->kind), a, b, range_text(r, rt, sizeof rt));
        e->a = a;
        e->b = b;
        e->c = c;
        return PLUMB_OK;
    }
    default:
        return PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(u, source), u->line, u->col, u->key,
                              "unknown distribution kind %d", (int)u->kind);
    }
}

plumb_status plumb_sampler_alloc(const plumb_fall_spec *base, const plumb_uncertainty *u,
                                 size_t n, const char *source, plumb_sampler **out,
                                 plumb_diag *diag)
{
    *out = NULL;
    if (!base || (n > 0 && !u))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_sampler_alloc: NULL argument");
    if (n > PLUMB_ZONE_MAX_INPUTS)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "uncertainty",
                               "%zu uncertain inputs; at most %d are sampled", n,
                               PLUMB_ZONE_MAX_INPUTS);
    plumb_sampler *s = calloc(1, sizeof *s);
    if (!s)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    s->base = *base;
    s->n = n;
    s->choice = -1;
    plumb_status st = PLUMB_OK;
    int has_east = 0, has_north = 0, has_up = 0;
    for (size_t i = 0; i < n && st == PLUMB_OK; i++) {
        entry *e = &s->e[i];
        e->u = u[i];
        e->u.key[sizeof e->u.key - 1] = '\0';
        const char *key = e->u.key;
        char norm[PLUMB_DIAG_KEY];
        normalise_key(key, norm, sizeof norm);
        if (!find_rule(key, &e->rule))
            e->rule = unbounded_rule;
        const plumb_descent_spec *dev = NULL;
        if (e->u.kind == PLUMB_DIST_CHOICE) {
            /* the attitude: a weighted choice of drags (profile.h) */
            double total = 0.0;
            for (size_t k = 0; k < e->u.n_choice; k++)
                total += e->u.weight[k];
            if (strcmp(norm, "payload.attitude") != 0 || e->u.n_choice < 2 ||
                e->u.n_choice > PLUMB_MAX_ATTITUDES || !(total > 0.0) || !isfinite(total)) {
                st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                    "a choice is for payload.attitude, with 2 to %d attitudes of "
                                    "positive weight", PLUMB_MAX_ATTITUDES);
                break;
            }
            double c = 0.0;
            for (size_t k = 0; k < e->u.n_choice; k++) {
                c += e->u.weight[k];
                e->cum[k] = k + 1 == e->u.n_choice ? 1.0 : c / total;
                if (!(e->u.choice_drag[k][0] > 0.0) || !(e->u.choice_drag[k][1] > 0.0))
                    st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                        "attitude '%s' has no drag", e->u.choice[k]);
            }
            for (size_t k = 0; k < n && st == PLUMB_OK; k++) {
                char nk[PLUMB_DIAG_KEY];
                normalise_key(u[k].key, nk, sizeof nk);
                if (strncmp(nk, "payload.drag.", 13) == 0)
                    st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&u[k], source), u[k].line, u[k].col, u[k].key,
                                        "the attitude sets the drag; give no uncertainty of "
                                        "payload.drag besides it");
            }
            if (s->choice >= 0)
                st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                    "is uncertain twice");
            if (st != PLUMB_OK)
                break;
            e->target = TGT_CHOICE;
            s->choice = (int)i;
            continue;
        }
        if (strcmp(norm, "release.velocity.speed") == 0) {
            e->target = TGT_SPEED;
        } else if (strcmp(norm, "release.velocity.heading") == 0) {
            e->target = TGT_HEADING;
        } else if (strcmp(norm, "release.velocity.climb") == 0) {
            e->target = TGT_CLIMB;
        } else {
            plumb_fall_spec probe = *base;
            double *f = plumb_fall_spec_field(&probe, key);
            const char *lo = (const char *)&probe, *hi = lo + sizeof probe;
            if (!f || (const char *)f < lo || (const char *)(f + 1) > hi) {
                const char *why = no_effect(base, norm, NULL);
                if (!why)
                    why = strncmp(norm, "atmosphere.", 11) == 0
                              ? "the atmosphere is built once per run, so it cannot vary from "
                                "fall to fall"
                          : strncmp(norm, "descent.", 8) == 0
                              ? "this payload has no such descent device or input"
                          : strstr(norm, "diameter")
                              ? "the area is derived from the diameter; put the uncertainty on "
                                "the area"
                              : "it is not a per-fall numeric input of this payload";
                st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                    "cannot be sampled: %s", why);
                break;
            }
            e->target = TGT_FIELD;
            e->offset = (size_t)((const char *)f - lo);
            for (size_t k = 0; k < base->n_descent && k < PLUMB_MAX_DESCENT; k++) {
                const char *dk = (const char *)&probe.descent[k];
                if ((const char *)f >= dk && (const char *)f < dk + sizeof probe.descent[k])
                    dev = &base->descent[k];
            }
            if (e->offset == offsetof(plumb_fall_spec, velocity_m_s))
                has_east = 1;
            if (e->offset == offsetof(plumb_fall_spec, velocity_m_s) + sizeof(double))
                has_north = 1;
            if (e->offset == offsetof(plumb_fall_spec, velocity_m_s) + 2 * sizeof(double))
                has_up = 1;
        }
        const char *why = no_effect(base, norm, dev);
        if (!why && e->target == TGT_HEADING && !(hypot(base->velocity_m_s[0], base->velocity_m_s[1]) > 0.0)) {
            int speed_too = 0;
            for (size_t k = 0; k < n; k++) {
                char nk[PLUMB_DIAG_KEY];
                normalise_key(u[k].key, nk, sizeof nk);
                speed_too |= strcmp(nk, "release.velocity.speed") == 0;
            }
            if (!speed_too)
                why = "the planned horizontal release speed is 0, so a heading changes nothing";
        }
        if (why) {
            st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                "sampling it has no effect: %s", why);
            break;
        }
        for (size_t k = 0; k < i; k++) {
            const entry *o = &s->e[k];
            int same = o->target == e->target &&
                       (e->target != TGT_FIELD || o->offset == e->offset);
            if (same) {
                st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                    "is uncertain twice (also as '%s')", o->u.key);
                break;
            }
        }
        if (st != PLUMB_OK)
            break;
        if (e->target == TGT_SPEED)
            s->has_speed = 1;
        if (e->target == TGT_HEADING)
            s->has_heading = 1;
        if (e->target == TGT_CLIMB)
            s->has_climb = 1;
        if ((s->has_speed || s->has_heading) && (has_east || has_north))
            st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                "the release velocity's uncertainty must be given either as "
                                "east/north or as speed/heading, not both");
        else if (s->has_climb && has_up)
            st = PLUMB_RAISE_AT(diag, PLUMB_EINVAL, at(&e->u, source), e->u.line, e->u.col, key,
                                "release.velocity.climb and release.velocity.up are the same "
                                "input; give one");
        if (st == PLUMB_OK)
            st = check_dist(e, source, diag);
    }
    if (st != PLUMB_OK) {
        free(s);
        return st;
    }
    const double *v = base->velocity_m_s;
    s->base_speed_m_s = hypot(v[0], v[1]);
    s->base_heading_deg = s->base_speed_m_s > 0.0 ? wrap_deg(atan2(v[0], v[1]) * DEG_PER_RAD) : 0.0;
    s->base_up_m_s = v[2];
    s->rng = gsl_rng_alloc(&plumbp_rng_type);
    if (!s->rng) {
        free(s);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory allocating a random stream");
    }
    *out = s;
    return PLUMB_OK;
}

/* One value of entry e from the stream. */
static plumb_status draw_one(const entry *e, gsl_rng *r, size_t index, double *x, size_t *redraw,
                             plumb_diag *diag)
{
    const double *q = e->u.param;
    double v;
    switch (e->u.kind) {
    case PLUMB_DIST_CHOICE: {
        double uu = gsl_rng_uniform(r);
        size_t k = 0;
        while (k + 1 < e->u.n_choice && !(uu < e->cum[k]))
            k++;
        *x = (double)k;
        return PLUMB_OK;
    }
    case PLUMB_DIST_NORMAL:
        v = q[0] + gsl_ran_gaussian_ziggurat(r, q[1]);
        if (e->truncated) {
            int tries = 1;
            while (!in_range(&e->rule, v)) {
                if (redraw)
                    (*redraw)++;
                if (tries++ >= TRUNC_MAX_DRAWS)
                    return PLUMB_RAISE_KEY(diag, PLUMB_ENUMERIC, e->u.key,
                                           "sample %zu: no value inside the key's range in %d "
                                           "draws of the truncated normal", index + 1,
                                           TRUNC_MAX_DRAWS);
                v = q[0] + gsl_ran_gaussian_ziggurat(r, q[1]);
            }
        }
        break;
    case PLUMB_DIST_UNIFORM:
        v = e->a + (e->b - e->a) * gsl_rng_uniform(r);
        break;
    default: { /* triangular */
        double w = e->b - e->a, uu = gsl_rng_uniform(r);
        if (!(w > 0.0))
            v = e->a;
        else if (uu * w < e->c - e->a)
            v = e->a + sqrt(uu * w * (e->c - e->a));
        else
            v = e->b - sqrt((1.0 - uu) * w * (e->b - e->c));
        break;
    }
    }
    *x = e->rule.angle ? wrap_deg(v) : v;
    return PLUMB_OK;
}

plumb_status plumb_sampler_draw(plumb_sampler *s, unsigned long seed, size_t index,
                                plumb_fall_spec *out, double *values, size_t *redraws,
                                plumb_diag *diag)
{
    *out = s->base;
    plumbp_taus_seed(s->rng->state, seed, index);
    double speed = s->base_speed_m_s, heading = s->base_heading_deg, climb = s->base_up_m_s;
    char *bytes = (char *)out;
    for (size_t i = 0; i < s->n; i++) {
        const entry *e = &s->e[i];
        double x = 0.0;
        plumb_status st = draw_one(e, s->rng, index, &x, redraws ? &redraws[i] : NULL, diag);
        if (st != PLUMB_OK)
            return st;
        if (values)
            values[i] = x;
        switch (e->target) {
        case TGT_SPEED: speed = x; break;
        case TGT_HEADING: heading = x; break;
        case TGT_CLIMB: climb = x; break;
        case TGT_CHOICE: {
            size_t k = (size_t)x;
            out->drag.model = PLUMB_DRAG_FIXED;
            out->drag.cd = e->u.choice_drag[k][0];
            out->drag.area_m2 = e->u.choice_drag[k][1];
            out->drag.cd_area_m2 = out->drag.cd * out->drag.area_m2;
            break;
        }
        default:
            memcpy(bytes + e->offset, &x, sizeof x);
            break;
        }
    }
    if (s->has_speed || s->has_heading) {
        double sh, ch;
        plumbp_sincos_deg(heading, &sh, &ch);
        out->velocity_m_s[0] = speed * sh;
        out->velocity_m_s[1] = speed * ch;
    }
    if (s->has_climb)
        out->velocity_m_s[2] = climb;
    return PLUMB_OK;
}

