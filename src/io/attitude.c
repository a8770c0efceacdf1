/*
 * attitude.c - the attitude of a payload as an uncertain input
 * (src/io/attitude.h): a weighted choice among attitudes, each with its
 * drag, so one zone covers the attitude that falls fastest (the highest
 * energy) and the one that drifts farthest (README.md "plumb zone",
 * "Attitude").
 *
 * Named attitudes take the drag of the item's shape in that attitude
 * (plumb_drag_from_shape, drag.h: tumbling = Cauchy's mean projected
 * area, broadside, end-on, with the handbook Cd of each); explicit
 * alternatives give cd and area as the profile's `drag:` does.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "plumb/drag.h"
#include "plumb/suggest.h"
#include "io/attitude.h"
#include "io/keys.h"
#include "core/internal.h"

static const char *const names[] = {"tumbling", "broadside", "end-on"};
static const plumb_attitude kinds[] = {PLUMB_ATTITUDE_TUMBLING, PLUMB_ATTITUDE_BROADSIDE,
                                       PLUMB_ATTITUDE_END_ON};

#define FORMS "{choice: [tumbling, broadside, end-on]}, {choice: {end-on: 1, broadside: 2}} " \
              "or {choice: [{name: end-on, cd: 0.99, area: 0.0008 m^2, weight: 1}, ...]}"

static plumb_status bad(const plumby_ctx *ctx, const plumby_node *n, const char *key,
                        const char *what)
{
    char found[96];
    return plumby_raise(ctx, n->origin, n->line, n->col, key, PLUMB_EINVAL,
                        "%s; expected " FORMS ", found %s", what,
                        plumby_describe(n, found, sizeof found));
}

/* The index of a named attitude, or -1. */
static int named(const char *s)
{
    for (int i = 0; i < 3; i++)
        if (strcmp(s, names[i]) == 0)
            return i;
    return -1;
}

/* One alternative given by name: the drag of each item's shape in it. */
static plumb_status by_name(const plumby_ctx *ctx, const plumby_node *at, const char *key,
                            const char *name, const plumb_shape_spec *shapes, size_t n,
                            size_t k, double (*table)[PLUMB_MAX_ATTITUDES][2])
{
    int a = named(name);
    if (a < 0) {
        const char *best = plumb_suggest_closest(name, names, 3);
        return plumby_raise(ctx, at->origin, at->line, at->col, key, PLUMB_EINVAL,
                            "unknown attitude '%s'%s%s%s (tumbling, broadside or end-on)", name,
                            best ? " (did you mean '" : "", best ? best : "", best ? "'?)" : "");
    }
    for (size_t i = 0; i < n; i++) {
        if (shapes[i].kind == PLUMB_SHAPE_NONE || shapes[i].kind == PLUMB_SHAPE_SPHERE)
            return plumby_raise(ctx, at->origin, at->line, at->col, key, PLUMB_EINVAL,
                                "attitude '%s' needs a payload shape (cylinder, box or plate)%s; "
                                "with drag given as cd and area, give each attitude's: " FORMS,
                                name, n > 1 ? " for every item" : "");
        plumb_shape_spec sh = shapes[i];
        sh.attitude = kinds[a];
        plumb_drag_spec d;
        memset(&d, 0, sizeof d);
        if (plumb_drag_from_shape(&sh, &d) != PLUMB_OK)
            return plumby_raise(ctx, at->origin, at->line, at->col, key, PLUMB_EINVAL,
                                "attitude '%s': the shape gives no drag", name);
        table[i][k][0] = d.area_m2 > 0.0 ? d.cd : 1.0;
        table[i][k][1] = d.area_m2 > 0.0 ? d.area_m2 : d.cd_area_m2;
    }
    return PLUMB_OK;
}

/* A number or quantity of map m's key `name`, required. */
static plumb_status field(const plumby_ctx *ctx, const plumby_node *m, const char *key,
                          const char *name, plumb_dim dim, double *out, int required)
{
    for (size_t i = 0; i < m->n; i++)
        if (strcmp(m->pairs[i].key, name) == 0) {
            char fk[PLUMB_DIAG_KEY];
            plumby_key_join(fk, sizeof fk, key, name, 0);
            return plumby_quantity(ctx, m->pairs[i].value, dim, fk, out);
        }
    if (!required)
        return PLUMB_OK;
    return plumby_raise(ctx, m->origin, m->line, m->col, key, PLUMB_EKEY,
                        "an attitude given by its drag needs '%s'", name);
}

plumb_status plumbp_attitude_read(const plumby_ctx *ctx, const plumby_pair *pr,
                                  const plumb_shape_spec *shapes, size_t n, int inventory,
                                  plumb_uncertainty *u, double (*table)[PLUMB_MAX_ATTITUDES][2])
{
    char key[PLUMB_DIAG_KEY];
    plumby_key_join(key, sizeof key, "uncertainty", pr->key, 0);
    const plumby_node *v = pr->value;
    if (v->kind != PLUMBY_MAP || v->n != 1 || strcmp(v->pairs[0].key, "choice") != 0)
        return bad(ctx, v, key, "an attitude is a choice");
    plumby_key_join(key, sizeof key, key, "choice", 0);
    const plumby_node *c = v->pairs[0].value;
    u->kind = PLUMB_DIST_CHOICE;
    if ((c->kind != PLUMBY_SEQ && c->kind != PLUMBY_MAP) || c->n < 2 ||
        c->n > PLUMB_MAX_ATTITUDES)
        return bad(ctx, c, key, "a choice of 2 to 4 attitudes");
    u->n_choice = c->n;
    plumb_status st;
    for (size_t k = 0; k < c->n; k++) {
        char ik[PLUMB_DIAG_KEY];
        plumby_key_join(ik, sizeof ik, key, NULL, k);
        u->weight[k] = 1.0;
        if (c->kind == PLUMBY_MAP) { /* name: weight */
            const plumby_pair *p = &c->pairs[k];
            plumbp_strlcpy(u->choice[k], p->key, sizeof u->choice[k]);
            plumby_key_join(ik, sizeof ik, key, p->key, 0);
            if ((st = plumby_quantity(ctx, p->value, PLUMB_DIM_NONE, ik, &u->weight[k])) !=
                PLUMB_OK)
                return st;
            if ((st = by_name(ctx, p->value, ik, p->key, shapes, n, k, table)) != PLUMB_OK)
                return st;
        } else if (c->items[k]->kind == PLUMBY_SCALAR) { /* a name */
            const plumby_node *it = c->items[k];
            plumbp_strlcpy(u->choice[k], it->text, sizeof u->choice[k]);
            if ((st = by_name(ctx, it, ik, it->text, shapes, n, k, table)) != PLUMB_OK)
                return st;
        } else if (c->items[k]->kind == PLUMBY_MAP) { /* {name, cd, area, weight} */
            const plumby_node *m = c->items[k];
            if (inventory)
                return plumby_raise(ctx, m->origin, m->line, m->col, ik, PLUMB_EINVAL,
                                    "in an inventory each item's drag differs: give the "
                                    "attitudes by name (tumbling, broadside, end-on) and each "
                                    "item a shape");
            const char *nm = NULL;
            for (size_t i = 0; i < m->n; i++) {
                const char *f = m->pairs[i].key;
                if (strcmp(f, "name") == 0 && m->pairs[i].value->kind == PLUMBY_SCALAR)
                    nm = m->pairs[i].value->text;
                else if (strcmp(f, "name") != 0 && strcmp(f, "cd") != 0 &&
                         strcmp(f, "area") != 0 && strcmp(f, "weight") != 0)
                    return plumby_raise(ctx, m->pairs[i].origin, m->pairs[i].line,
                                        m->pairs[i].col, ik, PLUMB_EKEY,
                                        "unknown key '%s' (name, cd, area, weight)", f);
            }
            if (!nm || !nm[0])
                return plumby_raise(ctx, m->origin, m->line, m->col, ik, PLUMB_EKEY,
                                    "an attitude needs a name");
            plumbp_strlcpy(u->choice[k], nm, sizeof u->choice[k]);
            /* cd and area as payload.drag gives them (the key table's rows), but
             * with drag: a falling attitude without any is no alternative */
            const plumbp_key *cd = &plumbp_key_table[PLUMBP_K_PAYLOAD_DRAG_CD];
            const plumbp_key *area = &plumbp_key_table[PLUMBP_K_PAYLOAD_DRAG_AREA];
            if ((st = field(ctx, m, ik, "cd", cd->dim, &table[0][k][0], 1)) != PLUMB_OK ||
                (st = field(ctx, m, ik, "area", area->dim, &table[0][k][1], 1)) != PLUMB_OK ||
                (st = field(ctx, m, ik, "weight", PLUMB_DIM_NONE, &u->weight[k], 0)) != PLUMB_OK)
                return st;
            char area_range[64];
            if (!plumby_range_ok(PLUMBY_R_CD_POSITIVE, table[0][k][0]) ||
                !plumby_range_ok(area->range, table[0][k][1]))
                return plumby_raise(ctx, m->origin, m->line, m->col, ik, PLUMB_ERANGE,
                                    "expected 0 < cd <= %g and an area %s", PLUMBY_CD_MAX,
                                    plumby_range_text(area->range, area->dim, area_range,
                                                      sizeof area_range));
        } else {
            return bad(ctx, c->items[k], ik, "an attitude is a name or a map");
        }
        if (!(u->weight[k] > 0.0) || !isfinite(u->weight[k]))
            return plumby_raise(ctx, c->origin, c->line, c->col, ik, PLUMB_ERANGE,
                                "attitude '%s': the weight must be > 0", u->choice[k]);
        for (size_t j = 0; j < k; j++)
            if (strcmp(u->choice[j], u->choice[k]) == 0)
                return plumby_raise(ctx, c->origin, c->line, c->col, ik, PLUMB_EINVAL,
                                    "attitude '%s' is given twice", u->choice[k]);
    }
    memcpy(u->choice_drag, table[0], sizeof u->choice_drag);
    return PLUMB_OK;
}
