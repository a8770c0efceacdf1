/*
 * zone_json.c - the JSON report of a Monte Carlo clearance zone
 * (jansson; SI with unit-suffixed keys, 17 significant digits;
 * conventions of report_zone.c).
 */
#include <limits.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <jansson.h>

#include "plumb/constants.h"
#include "plumb/report.h"
#include "plumb/version.h"
#include "plumb/dispersion.h"
#include "core/internal.h"
#include "report/jsonout.h"
#include "report/format.h"
#include "report/zone_map.h"
#include "report/report_zone_int.h"

/* ---- JSON --------------------------------------------------------------- */


static json_t *jpair(jctx *j, double a, double b)
{
    json_t *v = jarr(j);
    jpush(j, v, jreal(j, a));
    jpush(j, v, jreal(j, b));
    return v;
}

/* [lo, hi] of a quantile, shifted by `off`; an open end is null. */
static json_t *jci(jctx *j, const plumb_zone_quantile *q, double off)
{
    json_t *v = jarr(j);
    jpush(j, v, q->lo_open ? json_null() : jreal(j, off + q->lo));
    jpush(j, v, q->hi_open ? json_null() : jreal(j, off + q->hi));
    return v;
}

/* A polygon's rings, each a list of [east, north] closed on its first point. */
static json_t *j_rings(jctx *j, const plumb_region_polygon *pg)
{
    json_t *rings = jarr(j);
    for (size_t r = 0; r < pg->n_rings; r++) {
        json_t *ring = jarr(j);
        for (size_t k = 0; k < pg->ring_count[r]; k++) {
            const double *v = pg->vertex_m[pg->ring_first[r] + k];
            jpush(j, ring, jpair(j, v[0], v[1]));
        }
        jpush(j, rings, ring);
    }
    return rings;
}

static json_t *j_landing(jctx *j, const plumb_zone_stats *z)
{
    const plumb_region_result *lr = &z->landing;
    json_t *o = jobj(j);
    jset(j, o, "p", jreal(j, z->landing_radius.p));
    jset(j, o, "training_samples", jint(j, z->landing_training));
    jset(j, o, "counted_samples", jint(j, z->samples - z->landing_training));
    json_t *c = jobj(j);
    jset(j, c, "centre_m", jpair(j, z->landing_centre_m[0], z->landing_centre_m[1]));
    jset(j, c, "radius_m", jreal(j, z->landing_radius.value));
    jset(j, c, "ci_m", jci(j, &z->landing_radius, 0.0));
    jset(j, c, "open", json_boolean(z->landing_radius.hi_open));
    jset(j, c, "radius_bound_m", z->landing_radius.hi_open ? json_null()
                                                          : jreal(j, z->landing_radius.hi));
    jset(j, c, "scatter_m", jreal(j, z->scatter_m));
    jset(j, c, "clearance_radius_m", z->landing_radius.hi_open ? json_null()
                                                              : jreal(j, z->landing_circle_m));
    jset(j, o, "circle", c);
    json_t *pg = jobj(j);
    jset(j, pg, "method", jstr(j, "split-conformal highest-density region"));
    jset(j, pg, "open", json_boolean(lr->open));
    if (!lr->open) {
        jset(j, pg, "area_m2", jreal(j, lr->polygon.area_m2));
        jset(j, pg, "calibration_rank", jint(j, lr->rank));
        jset(j, pg, "calibration_inside", jint(j, lr->inside));
        jset(j, pg, "cell_m", jpair(j, lr->cell_m[0], lr->cell_m[1]));
        jset(j, pg, "axis_bearing_deg", zone_has_ellipse(z) ? jreal(j, lr->axis_deg) : json_null());
        jset(j, pg, "rings_m", j_rings(j, &lr->polygon));
        jset(j, pg, "scatter_m", jreal(j, lr->buffer_m));
        jset(j, pg, "buffered_area_m2", jreal(j, lr->buffered.area_m2));
        jset(j, pg, "buffered_rings_m", j_rings(j, &lr->buffered));
    }
    jset(j, o, "polygon", pg);
    return o;
}

static void j_stats_into(jctx *j, json_t *o, const plumb_zone_stats *z)
{
    jset(j, o, "release_point_m", jpair(j, z->release_m[0], z->release_m[1]));
    jset(j, o, "centre_m", jpair(j, z->centre_m[0], z->centre_m[1]));
    jset(j, o, "mean_point_m", jpair(j, z->mean_m[0], z->mean_m[1]));
    json_t *cov = jobj(j);
    jset(j, cov, "ee_m2", jreal(j, z->cov_m2[0]));
    jset(j, cov, "nn_m2", jreal(j, z->cov_m2[1]));
    jset(j, cov, "en_m2", jreal(j, z->cov_m2[2]));
    jset(j, o, "covariance", cov);
    json_t *el = jobj(j);
    jset(j, el, "semi_major_m", jreal(j, z->semi_major_m));
    jset(j, el, "semi_minor_m", jreal(j, z->semi_minor_m));
    jset(j, el, "bearing_deg", zone_has_ellipse(z) ? jreal(j, z->bearing_deg) : json_null());
    jset(j, el, "chi2", jreal(j, z->ellipse_chi2));
    jset(j, o, "ellipse95", el);
    json_t *rad = jobj(j), *rci = jobj(j);
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        jset(j, rad, plumbp_zone_radius_names[i], jreal(j, z->radius[i].value));
        jset(j, rci, plumbp_zone_radius_names[i], jci(j, &z->radius[i], 0.0));
    }
    jset(j, o, "radius_m", rad);
    jset(j, o, "radius_ci_m", rci);
    jset(j, o, "radius_max_m", jreal(j, z->radius_max_m));
    json_t *conf = jobj(j);
    jset(j, conf, "p", jreal(j, z->radius_conf.p));
    jset(j, conf, "radius_m", jreal(j, z->radius_conf.value));
    jset(j, conf, "ci_m", jci(j, &z->radius_conf, 0.0));
    jset(j, o, "radius_at_confidence", conf);
    jset(j, o, "radius_bound_m", jreal(j, z->radius_conf.hi));
    jset(j, o, "scatter_m", jreal(j, z->scatter_m));
    /* false: no scatter allowance (zone.scatter 0 or not given), so bounce
     * and deflection are not in the clearance radius */
    jset(j, o, "scatter_included", json_boolean(z->scatter_m > 0.0));
    jset(j, o, "clearance_radius_m", jreal(j, z->clearance_radius_m));
    json_t *en = jobj(j), *eci = jobj(j);
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++) {
        jset(j, en, plumbp_zone_energy_names[i], jreal(j, z->energy[i].value));
        jset(j, eci, plumbp_zone_energy_names[i], jci(j, &z->energy[i], 0.0));
    }
    jset(j, en, "max", jreal(j, z->energy_max_j));
    jset(j, o, "energy_j", en);
    jset(j, o, "energy_ci_j", eci);
    json_t *ex = jarr(j);
    for (size_t i = 0; i < z->n_exceedance; i++) {
        const plumb_zone_exceedance *x = &z->exceedance[i];
        json_t *e = jobj(j);
        jset(j, e, "criterion", jstr(j, x->criterion->id));
        jset(j, e, "name", jstr(j, x->criterion->name));
        jset(j, e, "energy_limit_j", jreal(j, x->criterion->energy_limit_j));
        jset(j, e, "source", jstr(j, x->criterion->source));
        jset(j, e, "status", jstr(j, x->criterion->status));
        jset(j, e, "count", jint(j, x->count));
        jset(j, e, "probability", jreal(j, x->probability));
        jset(j, e, "ci", jpair(j, x->lo, x->hi));
        jpush(j, ex, e);
    }
    jset(j, o, "exceedance", ex);
    json_t *md = jarr(j);
    jpush(j, md, jreal(j, z->displacement[0].value));
    jpush(j, md, jreal(j, z->displacement[1].value));
    jset(j, o, "median_displacement_m", md);
    jset(j, o, "landing", j_landing(j, z));
    if (z->n_attitudes) {
        json_t *at = jarr(j);
        for (size_t k = 0; k < z->n_attitudes; k++) {
            json_t *a = jobj(j);
            jset(j, a, "attitude", jstr(j, z->attitude[k].name));
            jset(j, a, "samples", jint(j, z->attitude[k].count));
            jset(j, a, "energy_max_j", jreal(j, z->attitude[k].energy_max_j));
            jset(j, a, "radius_max_m", jreal(j, z->attitude[k].radius_max_m));
            jpush(j, at, a);
        }
        jset(j, o, "attitudes", at);
        jset(j, o, "attitude_sets_energy", jstr(j, z->attitude[z->attitude_energy].name));
        jset(j, o, "attitude_sets_radius", jstr(j, z->attitude[z->attitude_radius].name));
    }
    json_t *sol = jobj(j);
    jset(j, sol, "steps", jint(j, z->steps));
    jset(j, sol, "rhs_evaluations", jint(j, z->rhs_evaluations));
    jset(j, o, "solver", sol);
}

static json_t *j_zone(jctx *j, const plumb_zone_result *r)
{
    json_t *o = jobj(j);
    jset(j, o, "samples", jint(j, r->samples));
    jset(j, o, "seed", r->seed <= (unsigned long)LLONG_MAX ? json_integer((json_int_t)r->seed)
                                                         : (j->bad = 1, json_null()));
    jset(j, o, "confidence", jreal(j, r->confidence));
    jset(j, o, "interval_level", jreal(j, r->ci_level));
    jset(j, o, "impact_point_fixed", json_boolean(r->zone.impact_point_fixed));
    json_t *warn = jarr(j);
    for (size_t i = 0; i < r->n_warnings; i++)
        jpush(j, warn, jwarning(j, r->warnings[i]));
    jset(j, o, "warnings", warn);
    j_stats_into(j, o, &r->zone);
    json_t *rules = jobj(j);
    jset(j, rules, "drop_height_m", jreal(j, r->zone.drop_height_m));
    jset(j, rules, "ballistic_throw_m", jreal(j, r->zone.ballistic_throw_m));
    jset(j, rules, "glide_ratio_max", jreal(j, r->zone.glide_ratio_max));
    jset(j, rules, "glide_m", jreal(j, r->zone.glide_ratio_max * r->zone.drop_height_m));
    jset(j, rules, "max_release_speed_m_s", jreal(j, r->zone.max_release_speed_m_s));
    jset(j, o, "rules_of_thumb", rules);
    json_t *tr = jarr(j), *inputs = jarr(j);
    for (size_t i = 0; i < r->n_inputs; i++) {
        const plumb_zone_input *in = &r->inputs[i];
        if (in->truncated)
            jpush(j, tr, jstr(j, in->key));
        json_t *e = jobj(j);
        jset(j, e, "key", jstr(j, in->key));
        jset(j, e, "distribution", jstr(j, dist_word(in->kind)));
        json_t *pa = jarr(j);
        for (int k = 0; k < (in->kind == PLUMB_DIST_TRIANGULAR ? 3 : 2); k++)
            jpush(j, pa, jreal(j, in->param[k]));
        jset(j, e, "params", pa);
        jset(j, e, "truncated", json_boolean(in->truncated));
        if (in->kind == PLUMB_DIST_CHOICE) {
            json_t *ch = jarr(j);
            for (size_t k = 0; k < in->n_choice; k++) {
                json_t *c = jobj(j);
                jset(j, c, "attitude", jstr(j, in->choice[k]));
                jset(j, c, "weight", jreal(j, in->weight[k]));
                jset(j, c, "cd", jreal(j, in->choice_drag[k][0]));
                jset(j, c, "area_m2", jreal(j, in->choice_drag[k][1]));
                jpush(j, ch, c);
            }
            jset(j, e, "choice", ch);
        }
        if (in->truncated) {
            json_t *rg = jarr(j);
            jpush(j, rg, isfinite(in->lower) ? jreal(j, in->lower) : json_null());
            jpush(j, rg, isfinite(in->upper) ? jreal(j, in->upper) : json_null());
            jset(j, e, "range", rg);
            jset(j, e, "redraws", jint(j, in->redraws));
        }
        jpush(j, inputs, e);
    }
    jset(j, o, "truncated", tr);
    jset(j, o, "inputs", inputs);
    if (r->gust_model != PLUMB_TURB_NONE) {
        json_t *g = jobj(j);
        jset(j, g, "model", jstr(j, plumb_turbulence_model_name((plumb_turbulence_model)r->gust_model)));
        jset(j, g, "w20_m_s", jreal(j, r->gust_w20_m_s));
        jset(j, g, "realisation", jstr(j, "one per sample, from the sample's own random stream"));
        jset(j, o, "gusts", g);
    }
    if (r->has_target) {
        const plumb_zone_stats *t = &r->at_target;
        json_t *tg = jobj(j);
        jset(j, tg, "target_m", jpair(j, r->target_m[0], r->target_m[1]));
        jset(j, tg, "median_impact_m", jpair(j, t->release_m[0] + t->displacement[0].value,
                                             t->release_m[1] + t->displacement[1].value));
        json_t *mci = jobj(j);
        jset(j, mci, "east", jci(j, &t->displacement[0], t->release_m[0]));
        jset(j, mci, "north", jci(j, &t->displacement[1], t->release_m[1]));
        jset(j, tg, "median_impact_ci_m", mci);
        j_stats_into(j, tg, t);
        jset(j, o, "target", tg);
    }
    return o;
}

json_t *plumbp_zone_json_report(jctx *j, const plumb_report_options *opt,
                                const plumb_zone_report *rep)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    json_t *p = jobj(j);
    jset(j, p, "path", jstr(j, rep->profile_path));
    jset(j, p, "name", jstr(j, rep->profile_name));
    jset(j, p, "sha256", jstr(j, rep->profile_sha256));
    jset(j, root, "profile", p);
    const plumb_zone_result *r0 = rep->items[0].result;
    jset(j, root, "seed", r0->seed <= (unsigned long)LLONG_MAX ? json_integer((json_int_t)r0->seed)
                                                             : (j->bad = 1, json_null()));
    /* no thread count: nothing in the JSON depends on it (the text names it) */
    /* One shape for a single payload and a kit, as in the fall JSON: a
     * single payload is a kit of one, and keeps its zone at the top too. */
    if (!rep->inventory)
        jset(j, root, "zone", j_zone(j, r0));
    jset(j, root, "inventory", json_boolean(rep->inventory));
    {
        json_t *items = jarr(j);
        size_t worst = 0;
        for (size_t i = 0; i < rep->n_items; i++) {
            json_t *o = jobj(j);
            jset(j, o, "item_number", json_integer((json_int_t)item_number(rep, i)));
            jset(j, o, "name", jstr(j, rep->items[i].name));
            jset(j, o, "zone", j_zone(j, rep->items[i].result));
            jpush(j, items, o);
            if (rep->items[i].result->zone.clearance_radius_m >
                rep->items[worst].result->zone.clearance_radius_m)
                worst = i;
        }
        jset(j, root, "items", items);
        jset(j, root, "worst", jstr(j, rep->items[worst].name));
        json_t *kit = jobj(j);
        const plumb_zone_result *kr = rep->items[rep->kit_item].result;
        const plumb_zone_result *lr = rep->items[rep->kit_landing_item].result;
        jset(j, kit, "clearance_radius_m", jreal(j, kr->zone.clearance_radius_m));
        jset(j, kit, "set_by", jstr(j, rep->items[rep->kit_item].name));
        jset(j, kit, "landing_circle_m", lr->zone.landing_radius.hi_open
                                             ? json_null()
                                             : jreal(j, lr->zone.landing_circle_m));
        /* an open circle is set by no item: null, as the text's and CSV's "open" */
        jset(j, kit, "landing_circle_set_by", lr->zone.landing_radius.hi_open
                                                  ? json_null()
                                                  : jstr(j, rep->items[rep->kit_landing_item].name));
        jset(j, root, "kit", kit);
    }
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

