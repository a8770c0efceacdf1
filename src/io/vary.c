/*
 * vary.c - one numeric input set on copies of a resolved profile's specs
 * (io/vary.h): the key table's field (io/keys.h), what the loader derives
 * from it, and the loader's own checks of it against other keys
 * (io/profile_int.h).
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "io/vary.h"
#include "io/profile_int.h"

/* The profile's payload.drag.source read as the loader reads it
 * (profile_item.c, read_drag): 1 when one is given. */
static int drag_source_given(const plumb_profile *p)
{
    plumby_ctx ctx = {.file = p->path};
    plumby_map root, pm, dm;
    plumby_map_init(&root, &ctx, p->tree, plumbp_profile_schema(), "");
    plumby_sub(&root, "payload", &pm);
    plumby_sub(&pm, "drag", &dm);
    char text[PLUMB_DRAG_SOURCE];
    if (plumby_text(&dm, "source", "", text, sizeof text) != PLUMB_OK)
        return 1; /* not read: never remade */
    return text[0] != '\0';
}

int plumbp_vary_init(plumbp_vary *v, const plumb_profile *p, const char *key)
{
    memset(v, 0, sizeof *v);
    size_t device = 0;
    long item = -1;
    const plumbp_key *k = plumbp_key_find(key, &device, &item);
    if (!k || !p || item != -1)
        return 0;
    if (k->home != PLUMBP_HOME_SPEC && k->home != PLUMBP_HOME_DEVICE &&
        k->home != PLUMBP_HOME_AIR)
        return 0;
    if (k->effects & PLUMBP_KEY_LOADER)
        return 0;
    if (p->inventory && !(k->effects & PLUMBP_KEY_SHARED))
        return 0;
    for (size_t i = 0; i < p->n_items; i++) {
        if (!plumbp_key_applies(k, &p->items[i], &p->shapes[i], &p->atm, device))
            return 0;
        if ((k->effects & PLUMBP_KEY_GLIDE) && p->items[i].glide.from_shape)
            return 0;
    }
    v->k = k;
    v->key = key;
    v->device = device;
    v->keep_source = (k->effects & PLUMBP_KEY_DRAG) && (!p->tree || drag_source_given(p));
    return 1;
}

int plumbp_vary_is_template(const plumb_profile *p)
{
    return p && !p->tree;
}

int plumbp_vary_air(const plumbp_vary *v)
{
    return (v->k->effects & PLUMBP_KEY_AIR) != 0;
}

/* The loader's checks of values against other keys (profile_scene.c,
 * profile_item.c), on the resolved copies: NULL when all pass, else what
 * fails, in words (written into why[size] where it has figures). */
static const char *loader_check_fails(const plumb_fall_spec *specs, size_t n,
                                      const plumb_atm_spec *atm, char *why, size_t size)
{
    for (size_t i = 0; i < n; i++) {
        const plumb_fall_spec *s = &specs[i];
        double h = s->release_m[2], lo = s->site_elevation_m;
        if (plumbp_release_too_high(lo, h))
            return "the release point is above the top of the 1976 atmosphere";
        if (plumbp_log_wind_too_rough(&s->wind))
            return "the wind's roughness length must be below its reference height";
        for (size_t j = 0; j < s->n_descent; j++) {
            const plumb_descent_spec *d = &s->descent[j];
            if (plumbp_deploy_not_below(d, h)) {
                snprintf(why, size, "descent[%zu] must deploy below the release height", j);
                return why;
            }
            if (plumbp_inflation_exponent_too_large(d->inflation_exponent)) {
                snprintf(why, size, "descent[%zu]'s inflation exponent must lie between 0 and %g",
                         j, PLUMB_INFLATION_J_MAX);
                return why;
            }
            if (j > 0 && plumbp_devices_out_of_order(&s->descent[j - 1], d)) {
                snprintf(why, size,
                         "devices are listed in deployment order: descent[%zu] deploys before "
                         "descent[%zu]", j, j - 1);
                return why;
            }
        }
        /* the air is checked over the fall (every item shares release and site) */
        double hi = lo + h, at_m, t_k;
        plumb_status st;
        switch (atm->model) {
        case PLUMB_ATM_STD1976:
            if (plumbp_std_temperature_fails(atm->temperature_offset_k, lo, hi, &at_m, &t_k, &st))
                return "the 1976 temperature plus the offset must stay above 0 K over the fall";
            break;
        case PLUMB_ATM_SURFACE:
            if (!(plumbp_surface_top_k(atm, h) > 0.0))
                return "the temperature at the release height must stay above 0 K";
            break;
        case PLUMB_ATM_TABLE:
            if (plumbp_table_misses(atm, lo, hi))
                return "the table of air must span the fall";
            if (!atm->table_t_k &&
                plumbp_std_temperature_fails(atm->temperature_offset_k, lo, hi, &at_m, &t_k, &st))
                return "the 1976 temperature plus the offset must stay above 0 K over the fall";
            break;
        }
    }
    return NULL;
}

static int loader_checks_pass(const plumb_fall_spec *specs, size_t n, const plumb_atm_spec *atm)
{
    char why[160];
    return loader_check_fails(specs, n, atm, why, sizeof why) == NULL;
}

int plumbp_vary_set(const plumbp_vary *v, double x, plumb_fall_spec *specs, size_t n,
                    plumb_atm_spec *atm)
{
    const plumbp_key *k = v->k;
    if (!plumby_range_ok(k->range, x))
        return 0;
    for (size_t i = 0; i < n; i++) {
        double *f = plumbp_key_field(k, &specs[i], atm, v->device);
        if (!f)
            return 0;
        *f = x;
        if (k->effects & PLUMBP_KEY_DRAG) {
            /* the source text goes with the values unless it was given */
            char source[PLUMB_DRAG_SOURCE];
            memcpy(source, specs[i].drag.source, sizeof source);
            plumbp_profile_fixed_drag(&specs[i].drag);
            if (v->keep_source)
                memcpy(specs[i].drag.source, source, sizeof source);
        }
        if ((k->effects & PLUMBP_KEY_STATION) && atm->model == PLUMB_ATM_SURFACE)
            atm->station_alt_m = x;
        if (k->home == PLUMBP_HOME_AIR)
            break; /* the air is one for every item */
    }
    return !(k->effects & PLUMBP_KEY_CHECKED) || loader_checks_pass(specs, n, atm);
}

plumb_status plumbp_vary_refusal(const plumbp_vary *v, double x, const plumb_fall_spec *specs,
                                  size_t n, const plumb_atm_spec *atm, plumb_diag *diag)
{
    const plumbp_key *k = v->k;
    const char *unit = plumb_dim_si_unit(k->dim);
    int bare = !*unit || strcmp(unit, "1") == 0;
    if (!plumby_range_ok(k->range, x)) {
        char r[160];
        plumby_range_text(k->range, k->dim, r, sizeof r);
        return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, v->key, "must be %s, found %.6g%s%s", r, x,
                               bare ? "" : " ", bare ? "" : unit);
    }
    char buf[160];
    const char *why = loader_check_fails(specs, n, atm, buf, sizeof buf);
    return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, v->key, "%.6g%s%s is refused: %s", x,
                           bare ? "" : " ", bare ? "" : unit,
                           why ? why : "the key has no place in this profile");
}

plumb_status plumbp_profile_variant(const plumb_profile *tmpl, const plumb_fall_spec *items,
                                    const plumb_atm_spec *atm, plumb_profile **out,
                                    plumb_diag *diag)
{
    *out = NULL;
    plumb_profile *p = malloc(sizeof *p);
    plumb_fall_spec *own = malloc(tmpl->n_items * sizeof *own);
    if (!p || !own) {
        free(p);
        free(own);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    }
    memcpy(own, items, tmpl->n_items * sizeof *own);
    *p = *tmpl;
    p->items = own;
    p->atm = *atm;
    p->borrowed = 1;
    *out = p;
    return PLUMB_OK;
}
