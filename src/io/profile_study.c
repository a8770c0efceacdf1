/*
 * profile_study.c - reading what a profile asks of the study: the
 * criteria to judge by, the uncertainty of each numeric key (a
 * distribution per key), the zone map (samples, seed, confidence,
 * target) and the job it is for; and whether an item sinks at all in the
 * study's air (plumbp_profile_item_sinks).
 */
#include <limits.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/suggest.h"
#include "io/attitude.h"
#include "io/profile_int.h"
#include "io/units_int.h"
#include "io/vary.h"

plumb_status plumbp_profile_read_criteria(loader *L)
{
    const plumby_node *c = plumby_get(&L->root, "criteria");
    if (!c)
        return PLUMB_OK;
    if (c->n == 0)
        return plumby_raise_value(&L->root, "criteria", PLUMB_EINVAL,
                                  "an empty list: name at least one criterion, or leave criteria "
                                  "out to judge against all of them");
    if (!(L->p->criteria = calloc(c->n, sizeof(char *))) ||
        !(L->p->criteria_pos = calloc(c->n, sizeof *L->p->criteria_pos)))
        return nomem(L);
    for (size_t i = 0; i < c->n; i++) {
        char id[PLUMB_DIAG_KEY], key[PLUMB_DIAG_KEY]; /* an id longer than a criterion id is unknown */
        const plumby_node *it = c->items[i];
        plumby_key_join(key, sizeof key, "criteria", NULL, i);
        plumb_status st = plumby_text_node(&L->ctx, it, key, id, sizeof id);
        if (st != PLUMB_OK)
            return st;
        for (size_t j = 0; j < i; j++)
            if (strcmp(L->p->criteria[j], id) == 0)
                return plumby_raise(&L->ctx, it->origin, it->line, it->col, key, PLUMB_EKEY,
                                    "criterion '%s' is listed twice (also criteria[%zu])", id, j);
        if (L->check && L->check->criterion) {
            char msg[PLUMB_DIAG_MSG];
            msg[0] = '\0';
            st = L->check->criterion(L->check->ctx, id, msg, sizeof msg);
            if (st != PLUMB_OK)
                return plumby_raise(&L->ctx, it->origin, it->line, it->col, key, st, "%s", msg);
        }
        if (!(L->p->criteria[i] = malloc(strlen(id) + 1)))
            return nomem(L);
        memcpy(L->p->criteria[i], id, strlen(id) + 1);
        L->p->criteria_pos[i][0] = it->line;
        L->p->criteria_pos[i][1] = it->col;
        L->p->criteria_pos[i][2] = (int)it->origin;
        L->p->n_criteria = i + 1;
    }
    return PLUMB_OK;
}

/* Why a numeric key cannot carry an uncertainty in this profile. */
static const char *unc_reason(const char *key)
{
    if (strncmp(key, "payload.shape", 13) == 0)
        return "the shape is turned into cd and area when the profile is loaded; put the "
               "uncertainty on payload.drag.cd or payload.drag.area";
    if (strstr(key, "diameter"))
        return "the area is derived from the diameter; put the uncertainty on the area";
    if (strncmp(key, "atmosphere.", 11) == 0)
        return "the atmosphere is shared by every fall and cannot vary from sample to sample";
    if (strncmp(key, "zone.", 5) == 0)
        return "zone settings are not inputs of a fall";
    if (strncmp(key, "wind.table", 10) == 0)
        return "wind table rows cannot vary; use a uniform, power or log profile";
    if (strncmp(key, "items", 5) == 0)
        return "in an inventory, name the key payload.KEY: it then applies to every item";
    return "this profile does not use it as an input (it is not given, or the model or form "
           "chosen does not use it)";
}

/* The ways "+-" is mistyped, most specific first: "5 m/s +/- 1 m/s" is
 * read as no tolerance at all. */
static const char *const plus_minus_slips[] = {"+/-", "-/+", "+ -", "-+"};

/* 1 when text holds a slip of "+-" (plus_minus_slips) and no "+-": out
 * (size bytes) is text with it written "+-". */
static int plus_minus_slip(const char *text, char *out, size_t size)
{
    if (strstr(text, "+-") || strstr(text, "\xc2\xb1"))
        return 0;
    for (size_t i = 0; i < sizeof plus_minus_slips / sizeof plus_minus_slips[0]; i++) {
        const char *at = strstr(text, plus_minus_slips[i]);
        if (!at)
            continue;
        int n = snprintf(out, size, "%.*s+-%s", (int)(at - text), text,
                         at + strlen(plus_minus_slips[i]));
        return n > 0 && (size_t)n < size;
    }
    return 0;
}

/* Splits "VALUE +- TOL" (or "±") into two scalar nodes' texts. */
static int split_plus_minus(const char *t, char *a, char *b, size_t size)
{
    const char *pm = strstr(t, "+-");
    size_t sep = 2;
    if (!pm) {
        pm = strstr(t, "\xc2\xb1");
        sep = 2;
    }
    if (!pm)
        return 0;
    size_t la = (size_t)(pm - t);
    if (la >= size || strlen(pm + sep) >= size)
        return 0;
    memcpy(a, t, la);
    a[la] = '\0';
    while (la > 0 && a[la - 1] == ' ')
        a[--la] = '\0';
    const char *r = pm + sep;
    while (*r == ' ')
        r++;
    plumbp_strlcpy(b, r, size);
    return 1;
}


/* A value of an uncertainty: for a direction (an angle of any value, which
 * the loader reads as plumby_num_node does) a compass point alone is its
 * bearing ("NW" is 315 deg), as in the key itself. */
static plumb_status unc_quantity(const plumby_ctx *ctx, const plumby_node *node,
                                 const plumby_schema *ks, plumb_dim dim, const char *key,
                                 double *out)
{
    double bearing = dim == PLUMB_DIM_ANGLE && plumby_num_range(ks) == PLUMBY_R_ANY
                         ? plumbp_units_compass_bearing(node->text) : -1.0;
    if (bearing >= 0.0) {
        *out = bearing; /* angles are read in degrees (units.h) */
        return PLUMB_OK;
    }
    return plumby_quantity(ctx, node, dim, key, out);
}

/* The unit part of a quantity's text ("9 mph" -> "mph"), trimmed; "deg"
 * for a compass point. */
static void unit_text(const char *text, char *out, size_t size)
{
    if (plumbp_units_compass_bearing(text) >= 0.0) {
        plumbp_strlcpy(out, "deg", size);
        return;
    }
    char *end = NULL;
    (void)strtod(text, &end);
    const char *u = end && end != text ? end : text;
    while (*u == ' ')
        u++;
    plumbp_strlcpy(out, u, size);
    size_t n = strlen(out);
    while (n > 0 && out[n - 1] == ' ')
        out[--n] = '\0';
}

static plumb_status read_one_uncertainty(loader *L, const plumby_pair *pr, plumb_uncertainty *u)
{
    plumb_status st;
    char dkey[PLUMB_DIAG_KEY];
    const plumby_ctx *ctx = &L->ctx;
    plumby_key_join(dkey, sizeof dkey, "uncertainty", pr->key, 0);
    memset(u, 0, sizeof *u);
    plumbp_strlcpy(u->key, pr->key, sizeof u->key);
    /* where it was given: the key, or the value when a --set replaced
     * the value of a key of the file */
    const plumby_node *val = pr->value;
    int replaced = val && val->origin != pr->origin;
    u->line = replaced ? val->line : pr->line;
    u->col = replaced ? val->col : pr->col;
    u->from_set = (replaced ? val->origin : pr->origin) == PLUMBY_FROM_SET;
    if (strcmp(pr->key, "payload.attitude") == 0) {
        free(L->p->att_drag);
        if (!(L->p->att_drag = calloc(L->p->n_items ? L->p->n_items : 1, sizeof *L->p->att_drag)))
            return nomem(L);
        return plumbp_attitude_read(ctx, pr, L->p->shapes, L->p->n_items, L->p->inventory, u,
                                    L->p->att_drag);
    }

    /* the key: numeric, and an input of every fall */
    plumb_dim dim;
    plumb_diag kd;
    plumb_diag_clear(&kd);
    keypath kp;
    st = plumb_profile_key_dim(pr->key, &dim, &kd);
    if (st != PLUMB_OK)
        return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, st, "%s", kd.message);
    (void)plumbp_profile_keypath_resolve(pr->key, &kp, NULL, 0, NULL);
    const plumby_schema *ks = kp.seg[kp.n - 1].schema;
    if (ks->type == PLUMBY_T_LIST)
        ks = &ks->sub[0];
    if (ks->type != PLUMBY_T_NUM)
        return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, PLUMB_EINVAL,
                            "'%s' is a count, not a quantity that can vary", pr->key);
    plumby_range range = plumby_num_range(ks);
    int polar = strcmp(pr->key, "release.velocity.speed") == 0 ||
                strcmp(pr->key, "release.velocity.heading") == 0;
    for (size_t i = 0; i < L->p->n_items && !polar; i++) {
        if (!plumb_fall_spec_field(&L->p->items[i], pr->key)) {
            if (L->p->inventory)
                return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, PLUMB_EINVAL,
                                    "'%s' is not an input of item %zu (%s): %s", pr->key,
                                    plumb_profile_item_number(L->p, i),
                                    L->p->items[i].name, unc_reason(pr->key));
            return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, PLUMB_EINVAL,
                                "'%s' cannot carry an uncertainty: %s", pr->key,
                                unc_reason(pr->key));
        }
    }

    const plumby_node *v = pr->value;
    char rtext[160];
    plumby_range_text(range, dim, rtext, sizeof rtext);
    if (v->kind == PLUMBY_SCALAR) {
        char a[PLUMB_DIAG_MSG], b[PLUMB_DIAG_MSG], fix[PLUMB_DIAG_MSG / 2 + 64] = "";
        if (!plumby_is_null(v) && plus_minus_slip(v->text, a, sizeof a))
            snprintf(fix, sizeof fix, "; did you mean \"%.*s\"? (the tolerance is written "
                                      "+- or \xc2\xb1)", PLUMB_DIAG_MSG / 2 - 8, a);
        if (plumby_is_null(v) || !split_plus_minus(v->text, a, b, sizeof a))
            return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_EINVAL,
                                "expected {normal: [MEAN, SD]}, {uniform: [LO, HI]}, {triangular: "
                                "[LO, MODE, HI]} or \"VALUE +- TOL\", found %s%s",
                                plumby_describe(v, rtext, sizeof rtext), fix);
        plumby_node na = *v, nb = *v;
        na.text = a;
        nb.text = b;
        double x, tol;
        if ((st = unc_quantity(ctx, &na, ks, dim, dkey, &x)) != PLUMB_OK ||
            (st = plumby_quantity(ctx, &nb, dim == PLUMB_DIM_TEMPERATURE ? PLUMB_DIM_TEMP_DIFF : dim,
                                  dkey, &tol)) != PLUMB_OK)
            return st;
        if (!(tol >= 0.0))
            return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_ERANGE,
                                "the tolerance must be >= 0, found '%s'", b);
        if (!plumby_range_ok(range, x - tol) || !plumby_range_ok(range, x + tol))
            return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_ERANGE,
                                "'%s' reaches outside the key's range (%s)", v->text, rtext);
        u->kind = PLUMB_DIST_UNIFORM;
        u->param[0] = x - tol;
        u->param[1] = x + tol;
        return PLUMB_OK;
    }
    if (v->kind != PLUMBY_MAP || v->n == 0)
        return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_EINVAL,
                            "expected {normal: [MEAN, SD]}, {uniform: [LO, HI]}, {triangular: "
                            "[LO, MODE, HI]} or \"VALUE +- TOL\", found %s",
                            plumby_describe(v, rtext, sizeof rtext));
    static const char *const dists[] = {"normal", "uniform", "triangular"};
    static const size_t n_params[] = {2, 2, 3};
    const plumby_pair *dp = &v->pairs[0];
    if (v->n > 1)
        return plumby_raise(ctx, v->pairs[1].origin, v->pairs[1].line, v->pairs[1].col, dkey,
                            PLUMB_EKEY, "give one distribution, found '%s' and '%s'", dp->key,
                            v->pairs[1].key);
    int kind = -1;
    for (int i = 0; i < 3; i++)
        if (strcmp(dp->key, dists[i]) == 0)
            kind = i;
    char pkey[PLUMB_DIAG_KEY];
    plumby_key_join(pkey, sizeof pkey, dkey, dp->key, 0);
    if (kind < 0) {
        const char *best = plumb_suggest_closest(dp->key, dists, 3);
        return plumby_raise(ctx, dp->origin, dp->line, dp->col, pkey, PLUMB_EKEY,
                            "unknown distribution '%s'%s%s%s (normal, uniform or triangular)",
                            dp->key, best ? " (did you mean '" : "", best ? best : "",
                            best ? "'?)" : "");
    }
    const plumby_node *list = dp->value;
    size_t want = n_params[kind];
    static const char *const forms[] = {"[MEAN, SD]", "[LO, HI]", "[LO, MODE, HI]"};
    if (list->kind != PLUMBY_SEQ || list->n != want) {
        char found[64];
        if (list->kind == PLUMBY_SEQ)
            snprintf(found, sizeof found, "a list of %zu", list->n);
        else
            plumby_describe(list, found, sizeof found);
        return plumby_raise(ctx, list->origin, list->line, list->col, pkey, PLUMB_EINVAL,
                            "expected %s, found %s", forms[kind], found);
    }
    for (size_t i = 0; i < want; i++) {
        const plumby_node *it = list->items[i];
        char ikey[PLUMB_DIAG_KEY];
        plumby_key_join(ikey, sizeof ikey, pkey, NULL, i);
        if (it->kind != PLUMBY_SCALAR || plumby_is_null(it)) {
            char found[64];
            return plumby_raise(ctx, it->origin, it->line, it->col, ikey, PLUMB_EINVAL,
                                "expected a value with the unit of %s, found %s", pr->key,
                                plumby_describe(it, found, sizeof found));
        }
        plumb_dim d = dim;
        if (kind == 0 && i == 1 && dim == PLUMB_DIM_TEMPERATURE)
            d = PLUMB_DIM_TEMP_DIFF;
        int compass_ok = !(kind == 0 && i == 1); /* a standard deviation is no direction */
        if ((st = compass_ok ? unc_quantity(ctx, it, ks, d, ikey, &u->param[i])
                             : plumby_quantity(ctx, it, d, ikey, &u->param[i])) != PLUMB_OK)
            return st;
        int is_sd = kind == 0 && i == 1;
        if (is_sd && !(u->param[1] >= 0.0))
            return plumby_raise(ctx, it->origin, it->line, it->col, ikey, PLUMB_ERANGE,
                                "the standard deviation must be >= 0, found '%s'", it->text);
        if (!is_sd && !plumby_range_ok(range, u->param[i]))
            return plumby_raise(ctx, it->origin, it->line, it->col, ikey, PLUMB_ERANGE,
                                "must be %s (the range of %s), found '%s'", rtext, pr->key,
                                it->text);
    }
    /* One unit in one distribution: [4 m/s, 9 mph] is a slip, not a range. */
    char unit0[PLUMB_DIAG_MSG], unit_i[PLUMB_DIAG_MSG];
    unit_text(list->items[0]->text, unit0, sizeof unit0);
    for (size_t i = 1; i < want; i++) {
        unit_text(list->items[i]->text, unit_i, sizeof unit_i);
        if (strcmp(unit0, unit_i) != 0) {
            char ikey[PLUMB_DIAG_KEY];
            plumby_key_join(ikey, sizeof ikey, pkey, NULL, i);
            return plumby_raise(ctx, list->items[i]->origin, list->items[i]->line,
                                list->items[i]->col, ikey, PLUMB_EUNIT,
                                "give every value of one distribution in the same unit: '%s' "
                                "after '%s'", list->items[i]->text, list->items[0]->text);
        }
    }
    u->kind = kind == 0 ? PLUMB_DIST_NORMAL : kind == 1 ? PLUMB_DIST_UNIFORM : PLUMB_DIST_TRIANGULAR;
    /* A direction sector may run through north: uniform [350 deg, 10 deg]. */
    if (kind == 1 && u->param[0] > u->param[1] && dim != PLUMB_DIM_ANGLE)
        return plumby_raise(ctx, list->origin, list->line, list->col, pkey, PLUMB_ERANGE,
                            "LO (%s) is above HI (%s)", list->items[0]->text,
                            list->items[1]->text);
    if (kind == 2 && !(u->param[0] <= u->param[1] && u->param[1] <= u->param[2]))
        return plumby_raise(ctx, list->origin, list->line, list->col, pkey, PLUMB_ERANGE,
                            "expected LO <= MODE <= HI, found [%s, %s, %s]", list->items[0]->text,
                            list->items[1]->text, list->items[2]->text);
    return PLUMB_OK;
}

plumb_status plumbp_profile_read_uncertainty(loader *L)
{
    const plumby_node *u = plumby_get(&L->root, "uncertainty");
    if (!u || u->n == 0)
        return PLUMB_OK;
    if (!(L->p->unc = calloc(u->n, sizeof *L->p->unc)))
        return nomem(L);
    for (size_t i = 0; i < u->n; i++) {
        plumb_status st = read_one_uncertainty(L, &u->pairs[i], &L->p->unc[i]);
        if (st != PLUMB_OK)
            return st;
        L->p->n_unc = i + 1;
    }
    return PLUMB_OK;
}

plumb_status plumbp_profile_read_zone(loader *L)
{
    plumb_zone_spec *z = &L->p->zone;
    plumby_map zm, tm;
    plumb_status st;
    unsigned long long samples, seed;
    plumby_sub(&L->root, "zone", &zm);
    plumby_sub(&zm, "target", &tm);
    if ((st = plumby_count(&zm, "samples", ZONE_SAMPLES_DEFAULT, 1, ZONE_SAMPLES_MAX, &samples)) !=
            PLUMB_OK ||
        (st = plumby_count(&zm, "seed", ZONE_SEED_DEFAULT, 0, ULONG_MAX, &seed)) != PLUMB_OK ||
        (st = plumby_num(&zm, "confidence", 0, ZONE_CONFIDENCE_DEFAULT, &z->confidence, NULL)) !=
            PLUMB_OK ||
        (st = plumby_num(&zm, "scatter", 0, 0.0, &z->scatter_m, NULL)) != PLUMB_OK)
        return st;
    z->samples = (size_t)samples;
    z->seed = (unsigned long)seed;
    z->has_target = tm.node != NULL;
    if (tm.node && (plumby_get(&tm, "latitude") || plumby_get(&tm, "longitude")))
        return plumbp_profile_map_point(L, &tm, z->target_m);
    if (tm.node && ((st = plumby_num(&tm, "east", 1, 0.0, &z->target_m[0], NULL)) != PLUMB_OK ||
                    (st = plumby_num(&tm, "north", 1, 0.0, &z->target_m[1], NULL)) != PLUMB_OK))
        return st;
    return PLUMB_OK;
}

/* The optional `job:` map: who and what the calculation is for. */
plumb_status plumbp_profile_read_job(loader *L)
{
    plumb_job *j = &L->p->job;
    plumby_map jm;
    plumb_status st;
    plumby_sub(&L->root, "job", &jm);
    if ((st = plumby_text(&jm, "title", "", j->title, sizeof j->title)) != PLUMB_OK ||
        (st = plumby_text(&jm, "site", "", j->site, sizeof j->site)) != PLUMB_OK ||
        (st = plumby_text(&jm, "reference", "", j->reference, sizeof j->reference)) != PLUMB_OK ||
        (st = plumby_text(&jm, "prepared_by", "", j->prepared_by, sizeof j->prepared_by)) !=
            PLUMB_OK ||
        (st = plumby_text(&jm, "checked_by", "", j->checked_by, sizeof j->checked_by)) != PLUMB_OK)
        return st;
    return PLUMB_OK;
}

/* An object whose volume displaces at least its own mass of air at the
 * strike level, the densest air of its path, floats or rises: it never
 * lands, which is a fault of the inputs (a volume or a mass mistyped), not
 * of the computation. Said with the key and where it was given. The weight
 * of the displaced air, rho V g, is Archimedes' principle. */
plumb_status plumbp_profile_item_sinks(const plumb_profile *p, size_t i,
                                       const plumb_atmosphere *atm, plumb_diag *diag)
{
    const plumb_fall_spec *spec = plumb_profile_item(p, i);
    if (!(spec->volume_m3 > 0.0))
        return PLUMB_OK;
    plumb_air air;
    if (plumb_atmosphere_at(atm, spec->site_elevation_m, &air) != PLUMB_OK)
        return PLUMB_OK; /* outside the air: the fall itself says so */
    double displaced = air.rho_kg_m3 * spec->volume_m3;
    if (displaced < spec->mass_kg)
        return PLUMB_OK;
    char key[PLUMB_DIAG_KEY];
    if (plumb_profile_is_inventory(p))
        snprintf(key, sizeof key, "items[%zu].volume", plumb_profile_item_number(p, i));
    else
        snprintf(key, sizeof key, "payload.volume");
    int line = 0, col = 0;
    const char *file = plumb_profile_key_origin(p, key, &line, &col);
    return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, file ? file : plumb_profile_path(p), line,
                          col, key,
                          "a volume of %.4g m³ displaces %.4g kg of air at the strike level "
                          "(%.4g kg/m³), at least the object's mass of %.4g kg: it would float "
                          "or rise, never land. Check the mass and the volume (the object's own, "
                          "for buoyancy; leave it out to neglect buoyancy)",
                          spec->volume_m3, displaced, air.rho_kg_m3, spec->mass_kg);
}
