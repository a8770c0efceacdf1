/*
 * profile_item.c - reading one payload (or one item of an inventory)
 * from a profile: its mass and drag (given, or from a sphere, cylinder,
 * box or plate shape), its descent devices with deployment and inflation
 * (Knacke, NWC TP 6575: area S0 = pi D0^2 / 4), and its glide.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "io/profile_int.h"

void plumbp_profile_fixed_drag(plumb_drag_spec *d)
{
    if (d->area_m2 > 0.0) {
        d->cd_area_m2 = d->cd * d->area_m2;
        snprintf(d->source, sizeof d->source, "cd and area as given in the profile");
    } else {
        snprintf(d->source, sizeof d->source, "cd_area as given in the profile");
    }
}

static plumb_status read_drag(const loader *L, const plumby_map *item, plumb_fall_spec *spec,
                              plumb_shape_spec *shape)
{
    plumby_map dm, sm;
    plumby_sub(item, "drag", &dm);
    plumby_sub(item, "shape", &sm);
    plumb_status st;
    memset(shape, 0, sizeof *shape);
    memset(&spec->drag, 0, sizeof spec->drag);
    if (dm.node && sm.node)
        return plumby_forbid(item, "shape", "together with 'drag' (give drag or shape, not both)");
    if (!dm.node && !sm.node)
        return plumby_missing(item, "drag",
                              "give drag: {cd: ..., area: ...} (or cd_area), or shape: {kind: ...}");
    if (dm.node) {
        plumb_drag_spec *d = &spec->drag;
        int model;
        if ((st = plumby_word(&dm, "model", 0, &model)) != PLUMB_OK)
            return st;
        char user_source[PLUMB_DRAG_SOURCE];
        if ((st = plumby_text(&dm, "source", "", user_source, sizeof user_source)) != PLUMB_OK)
            return st;
        if (model == 0) {
            d->model = PLUMB_DRAG_FIXED;
            if ((st = plumby_forbid(&dm, "diameter", "with model fixed (only the sphere models "
                                                     "take a diameter)")) != PLUMB_OK)
                return st;
            if (plumby_get(&dm, "cd_area")) {
                if ((st = plumby_forbid(&dm, "cd", "together with cd_area (give cd and area, "
                                                   "or cd_area)")) != PLUMB_OK ||
                    (st = plumby_forbid(&dm, "area", "together with cd_area (give cd and area, "
                                                     "or cd_area)")) != PLUMB_OK ||
                    (st = plumby_num(&dm, "cd_area", 1, 0.0, &d->cd_area_m2, NULL)) != PLUMB_OK)
                    return st;
                plumbp_profile_fixed_drag(d);
            } else {
                if (!plumby_get(&dm, "cd"))
                    return plumby_missing(&dm, "cd", "give cd and area, or cd_area");
                if (!plumby_get(&dm, "area"))
                    return plumby_missing(&dm, "area", "give cd and area, or cd_area");
                if ((st = plumby_num(&dm, "cd", 1, 0.0, &d->cd, NULL)) != PLUMB_OK ||
                    (st = plumby_num(&dm, "area", 1, 0.0, &d->area_m2, NULL)) != PLUMB_OK)
                    return st;
                plumbp_profile_fixed_drag(d);
            }
        } else {
            d->model = model == 1 ? PLUMB_DRAG_SPHERE_MORRISON : PLUMB_DRAG_SPHERE_CGW;
            const char *why = model == 1 ? "with model sphere (Cd comes from the Reynolds number)"
                                         : "with model sphere-cgw (Cd comes from the Reynolds "
                                           "number)";
            if ((st = plumby_forbid(&dm, "cd", why)) != PLUMB_OK ||
                (st = plumby_forbid(&dm, "area", why)) != PLUMB_OK ||
                (st = plumby_forbid(&dm, "cd_area", why)) != PLUMB_OK ||
                (st = plumby_num(&dm, "diameter", 1, 0.0, &d->diameter_m, NULL)) != PLUMB_OK)
                return st;
            d->area_m2 = PLUMB_PI * d->diameter_m * d->diameter_m / 4.0;
            snprintf(d->source, sizeof d->source,
                     "diameter as given in the profile: Cd(Re) by %s, area pi d^2/4",
                     model == 1 ? "Morrison (2010)" : "Clift, Grace & Weber (1978), Table 5.2");
        }
        if (user_source[0])
            memcpy(d->source, user_source, sizeof d->source);
        return PLUMB_OK;
    }
    /* shape */
    int kind, att = 0;
    if ((st = plumby_word(&sm, "kind", -1, &kind)) != PLUMB_OK)
        return st;
    static const char *const why_kind[] = {"for a sphere", "for a cylinder", "for a box",
                                           "for a plate"};
    const char *why = why_kind[kind];
    switch (kind) {
    case 0:
        shape->kind = PLUMB_SHAPE_SPHERE;
        if ((st = plumby_forbid(&sm, "length", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "edges", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "thickness", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "attitude", "for a sphere (it looks the same every way)")) !=
                PLUMB_OK ||
            (st = plumby_num(&sm, "diameter", 1, 0.0, &shape->dims_m[0], NULL)) != PLUMB_OK)
            return st;
        break;
    case 1:
        shape->kind = PLUMB_SHAPE_CYLINDER;
        if ((st = plumby_forbid(&sm, "edges", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "thickness", why)) != PLUMB_OK ||
            (st = plumby_num(&sm, "length", 1, 0.0, &shape->dims_m[0], NULL)) != PLUMB_OK ||
            (st = plumby_num(&sm, "diameter", 1, 0.0, &shape->dims_m[1], NULL)) != PLUMB_OK)
            return st;
        break;
    default: {
        int plate = kind == 3;
        shape->kind = plate ? PLUMB_SHAPE_PLATE : PLUMB_SHAPE_BOX;
        size_t want = plate ? 2 : 3;
        if ((st = plumby_forbid(&sm, "diameter", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "length", plate ? "for a plate (give edges: [a, b] and "
                                                       "thickness)"
                                                     : "for a box (give edges: [a, b, c])")) !=
                PLUMB_OK)
            return st;
        if (!plate && (st = plumby_forbid(&sm, "thickness", "for a box (give edges: [a, b, c])")) !=
                          PLUMB_OK)
            return st;
        const plumby_node *edges = plumby_get(&sm, "edges");
        if (!edges)
            return plumby_missing(&sm, "edges", plate ? "a plate needs edges: [a, b]"
                                                      : "a box needs edges: [a, b, c]");
        char ekey[PLUMB_DIAG_KEY];
        plumby_key_join(ekey, sizeof ekey, sm.key, "edges", 0);
        if (edges->n != want)
            return plumby_raise(&L->ctx, edges->origin, edges->line, edges->col, ekey,
                                PLUMB_EINVAL, "expected %zu edges for a %s, found %zu", want,
                                plate ? "plate" : "box", edges->n);
        for (size_t i = 0; i < want; i++) {
            char ikey[PLUMB_DIAG_KEY];
            plumby_key_join(ikey, sizeof ikey, ekey, NULL, i);
            if ((st = plumby_num_node(&L->ctx, edges->items[i], &plumbp_profile_edge_item[0], ikey,
                                      &shape->dims_m[i])) != PLUMB_OK)
                return st;
        }
        if (plate && (st = plumby_num(&sm, "thickness", 1, 0.0, &shape->dims_m[2], NULL)) !=
                         PLUMB_OK)
            return st;
        break;
    }
    }
    if ((st = plumby_word(&sm, "attitude", 0, &att)) != PLUMB_OK)
        return st;
    shape->attitude = att == 0   ? PLUMB_ATTITUDE_TUMBLING
                      : att == 1 ? PLUMB_ATTITUDE_BROADSIDE
                                 : PLUMB_ATTITUDE_END_ON;
    st = plumb_drag_from_shape(shape, &spec->drag);
    if (st != PLUMB_OK)
        return plumby_raise(&L->ctx, sm.origin, sm.line, sm.col, sm.key, st,
                            "the drag of this shape could not be found (%s)", plumb_strerror(st));
    return PLUMB_OK;
}

/* The canopy type and its inflation curve (plumb/inflation.h): j and C_x
 * from the type's table unless given; the fill constant n from the table
 * when neither fill_time nor fill_constant is given (t_f = n D0 / v_1, D0
 * the nominal diameter when only the area is given). */
static plumb_status read_inflation(const plumby_map *dm, plumb_descent_spec *d, int has_fill)
{
    plumb_status st;
    int word = -1;
    if ((plumby_get(dm, "canopy") && (st = plumby_word(dm, "canopy", 0, &word)) != PLUMB_OK) ||
        (st = plumby_num(dm, "inflation_exponent", 0, 0.0, &d->inflation_exponent, NULL)) !=
            PLUMB_OK ||
        (st = plumby_num(dm, "opening_factor", 0, 0.0, &d->opening_factor, NULL)) != PLUMB_OK)
        return st;
    if (plumbp_inflation_exponent_too_large(d->inflation_exponent))
        return plumby_raise_value(dm, "inflation_exponent", PLUMB_ERANGE,
                                  "must lie between 0 and %g (published curves run from 1/2 to "
                                  "about 6), found '%s'",
                                  PLUMB_INFLATION_J_MAX, plumby_get(dm, "inflation_exponent")->text);
    d->canopy = word < 0 ? PLUMB_CANOPY_UNSPECIFIED : (plumb_canopy)(word + 1);
    const plumb_canopy_info *ci = plumb_canopy_info_of(d->canopy);
    if (!ci)
        return PLUMB_OK;
    if (!(d->inflation_exponent > 0.0)) {
        if (!(ci->exponent > 0.0))
            return plumby_missing(dm, "inflation_exponent",
                                  "the map of published values gives no inflation exponent for "
                                  "this canopy type: give inflation_exponent");
        d->inflation_exponent = ci->exponent;
    }
    if (!(d->opening_factor > 0.0))
        d->opening_factor = ci->opening_factor;
    if (!has_fill) {
        if (!(ci->fill_constant > 0.0))
            return plumby_missing(dm, "fill_time",
                                  "the map of published values gives no fill constant for this "
                                  "canopy type: give fill_time or fill_constant");
        d->fill_constant = ci->fill_constant;
    }
    return PLUMB_OK;
}

/* One descent device from map dm (index i of the list). */
static plumb_status read_device(const loader *L, const plumby_map *dm, plumb_descent_spec *d)
{
    plumb_status st;
    int kind;
    memset(d, 0, sizeof *d);
    if ((st = plumby_word(dm, "kind", 0, &kind)) != PLUMB_OK ||
        (st = plumby_num(dm, "cd", 1, 0.0, &d->cd, NULL)) != PLUMB_OK)
        return st;
    d->kind = kind == 0 ? PLUMB_DESCENT_PARACHUTE
              : kind == 1 ? PLUMB_DESCENT_STREAMER
                          : PLUMB_DESCENT_DROGUE;
    int has_area = plumby_get(dm, "area") != NULL, has_d = plumby_get(dm, "diameter") != NULL;
    if (has_area && has_d)
        return plumby_forbid(dm, "diameter", "together with area (give area or diameter)");
    if (!has_area && !has_d)
        return plumby_missing(dm, "area", "give the canopy's area or its diameter");
    if (has_area) {
        if ((st = plumby_num(dm, "area", 1, 0.0, &d->area_m2, NULL)) != PLUMB_OK)
            return st;
    } else {
        if ((st = plumby_num(dm, "diameter", 1, 0.0, &d->diameter_m, NULL)) != PLUMB_OK)
            return st;
        d->area_m2 = PLUMB_PI * d->diameter_m * d->diameter_m / 4.0;
    }
    plumby_map dep;
    plumby_sub(dm, "deploy", &dep);
    if (!dep.node)
        return plumby_missing(dm, "deploy", "give deploy: {after: TIME} or {below: HEIGHT}");
    int has_after = plumby_get(&dep, "after") != NULL, has_below = plumby_get(&dep, "below") != NULL;
    if (has_after && has_below)
        return plumby_forbid(&dep, "below", "together with after (give after or below)");
    if (!has_after && !has_below)
        return plumby_missing(&dep, "after", "give after: TIME or below: HEIGHT");
    if (has_after) {
        d->trigger = PLUMB_DEPLOY_AFTER;
        if ((st = plumby_num(&dep, "after", 1, 0.0, &d->deploy_value, NULL)) != PLUMB_OK)
            return st;
    } else {
        d->trigger = PLUMB_DEPLOY_BELOW;
        if ((st = plumby_num(&dep, "below", 1, 0.0, &d->deploy_value, NULL)) != PLUMB_OK)
            return st;
        if (plumbp_deploy_not_below(d, L->height_m)) {
            /* the release height as it was written (30 ft, not 9.144 m) */
            plumby_map rm;
            plumby_sub(&L->root, "release", &rm);
            const plumby_node *h = plumby_get(&rm, "height");
            char hm[32];
            snprintf(hm, sizeof hm, "%.6g m", L->height_m);
            return plumby_raise_value(&dep, "below", PLUMB_ERANGE,
                                      "must be below the release height %s, found '%s'",
                                      h && h->text ? h->text : hm, plumby_get(&dep, "below")->text);
        }
    }
    int has_ft = plumby_get(dm, "fill_time") != NULL, has_fc = plumby_get(dm, "fill_constant") != NULL;
    if (has_ft && has_fc)
        return plumby_forbid(dm, "fill_constant",
                             "together with fill_time (give fill_time or fill_constant)");
    if ((st = plumby_num(dm, "fill_time", 0, 0.0, &d->fill_time_s, NULL)) != PLUMB_OK ||
        (st = plumby_num(dm, "fill_constant", 0, 0.0, &d->fill_constant, NULL)) != PLUMB_OK)
        return st;
    if (has_fc && !has_d)
        return plumby_raise_value(dm, "fill_constant", PLUMB_EINVAL,
                                  "needs the canopy's diameter (t_f = n D0 / v); give diameter "
                                  "instead of area, or use fill_time");
    return read_inflation(dm, d, has_ft || has_fc);
}

/* The descent devices of a node (map or list) at key into spec. */
static plumb_status read_descent(const loader *L, const plumby_node *node, const char *key,
                                 plumb_fall_spec *spec)
{
    plumb_status st;
    spec->n_descent = 0;
    if (!node)
        return PLUMB_OK;
    const plumby_schema *s = plumby_schema_child(plumbp_profile_schema(), "descent");
    if (node->kind == PLUMBY_MAP) {
        plumby_map dm;
        plumby_map_init(&dm, &L->ctx, node, s, key);
        if ((st = read_device(L, &dm, &spec->descent[0])) != PLUMB_OK)
            return st;
        spec->n_descent = 1;
        return PLUMB_OK;
    }
    if (node->n == 0)
        return plumby_raise(&L->ctx, node->origin, node->line, node->col, key, PLUMB_EINVAL,
                            "an empty list: give one or two devices, or leave descent out");
    if (node->n > PLUMB_MAX_DESCENT) {
        const plumby_node *x = node->items[PLUMB_MAX_DESCENT];
        char ikey[PLUMB_DIAG_KEY];
        plumby_key_join(ikey, sizeof ikey, key, NULL, PLUMB_MAX_DESCENT);
        return plumby_raise(&L->ctx, x->origin, x->line, x->col, ikey, PLUMB_ERANGE,
                            "at most %d descent devices (a drogue, then a main), found %zu",
                            PLUMB_MAX_DESCENT, node->n);
    }
    for (size_t i = 0; i < node->n; i++) {
        plumby_map dm;
        char ikey[PLUMB_DIAG_KEY];
        plumby_key_join(ikey, sizeof ikey, key, NULL, i);
        plumby_map_init(&dm, &L->ctx, node->items[i], s, ikey);
        if ((st = read_device(L, &dm, &spec->descent[i])) != PLUMB_OK)
            return st;
        if (i > 0) {
            const plumb_descent_spec *a = &spec->descent[i - 1], *b = &spec->descent[i];
            if (plumbp_devices_out_of_order(a, b)) {
                plumby_map dep;
                plumby_sub(&dm, "deploy", &dep);
                return plumby_raise_value(
                    &dep, a->trigger == PLUMB_DEPLOY_AFTER ? "after" : "below", PLUMB_ERANGE,
                    "devices are listed in deployment order: this one must deploy %s %.6g %s "
                    "(the previous one's %s)",
                    a->trigger == PLUMB_DEPLOY_AFTER ? "no sooner than" : "no higher than",
                    a->deploy_value, a->trigger == PLUMB_DEPLOY_AFTER ? "s" : "m",
                    a->trigger == PLUMB_DEPLOY_AFTER ? "after" : "below");
            }
            /* a main deploying after a drogue replaces it */
            spec->descent[i].disreefs_previous = a->kind == PLUMB_DESCENT_DROGUE;
        }
    }
    spec->n_descent = node->n;
    return PLUMB_OK;
}

/* Air density for a plate's I* (plumb/glide.h): the 1976 standard at sea
 * level; I* only picks the regime, and a site's density changes it by a few
 * per cent. kg/m^3. */
#define GLIDE_RHO_F_KG_M3 1.225

/* payload.glide: auto (default: a plate, or a box whose smallest edge is at
 * most PLUMB_GLIDE_THIN_FRACTION of its middle one, glides in the regime
 * its I* gives; anything else does not), tumble, flutter or off. */
static plumb_status read_glide(const plumby_map *im, plumb_fall_spec *spec,
                               const plumb_shape_spec *shape)
{
    int word = 0;
    plumb_status st = plumby_word(im, "glide", 0, &word);
    if (st != PLUMB_OK)
        return st;
    memset(&spec->glide, 0, sizeof spec->glide);
    if (word == 1 || word == 2) {
        spec->glide.mode = word == 1 ? PLUMB_GLIDE_TUMBLE : PLUMB_GLIDE_FLUTTER;
        return PLUMB_OK;
    }
    if (word == 3 || !shape)
        return PLUMB_OK;
    const double *d = shape->dims_m;
    double a = 0.0, b = 0.0;
    if (shape->kind == PLUMB_SHAPE_PLATE) {
        a = d[0];
        b = d[1];
    } else if (shape->kind == PLUMB_SHAPE_BOX) {
        double e[3] = {d[0], d[1], d[2]};
        for (int i = 0; i < 2; i++) /* sort ascending */
            for (int k = 0; k < 2 - i; k++)
                if (e[k] > e[k + 1]) {
                    double t = e[k];
                    e[k] = e[k + 1];
                    e[k + 1] = t;
                }
        if (!(e[0] <= PLUMB_GLIDE_THIN_FRACTION * e[1]))
            return PLUMB_OK;
        a = e[1];
        b = e[2];
    } else {
        return PLUMB_OK;
    }
    spec->glide.istar = plumb_glide_istar(spec->mass_kg, a, b, GLIDE_RHO_F_KG_M3);
    spec->glide.mode = plumb_glide_regime(spec->glide.istar);
    spec->glide.from_shape = 1;
    return PLUMB_OK;
}

/* One payload (map at key "payload" or "items[i]") into spec and shape. */
plumb_status plumbp_profile_read_item(const loader *L, const plumby_map *im, int is_item,
                                      const plumb_fall_spec *base, plumb_fall_spec *spec,
                                      plumb_shape_spec *shape)
{
    plumb_status st;
    *spec = *base;
    if (is_item) {
        if ((st = plumby_text(im, "name", NULL, spec->name, sizeof spec->name)) != PLUMB_OK)
            return st;
        if (!spec->name[0])
            return plumby_raise_value(im, "name", PLUMB_EINVAL, "expected a name, found ''");
    }
    if ((st = plumby_num(im, "mass", 1, 0.0, &spec->mass_kg, NULL)) != PLUMB_OK ||
        (st = plumby_num(im, "volume", 0, 0.0, &spec->volume_m3, NULL)) != PLUMB_OK ||
        (st = read_drag(L, im, spec, shape)) != PLUMB_OK ||
        (st = read_glide(im, spec, shape)) != PLUMB_OK)
        return st;
    const plumby_node *own = is_item ? plumby_get(im, "descent") : NULL;
    char key[PLUMB_DIAG_KEY];
    if (own) {
        plumby_key_join(key, sizeof key, im->key, "descent", 0);
        return read_descent(L, own, key, spec);
    }
    return read_descent(L, plumby_get(&L->root, "descent"), "descent", spec);
}

