/*
 * zone_csv.c - the CSV report of a Monte Carlo clearance zone (RFC 4180,
 * the cautions as leading "# " lines; conventions of report_zone.c).
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

/* ---- CSV ---------------------------------------------------------------- */


typedef struct csv_item {
    size_t number;
    const char *name;
} csv_item;

/* A row; a NULL value, lo or hi leaves its cell empty (a figure that does
 * not exist, such as the bearing of an ellipse that does not). */
static void csv_row_of(writer *w, const csv_item *item, const char *quantity, const double *value,
                       const double *lo, const double *hi, const char *unit)
{
    put(w, "%zu,", item->number);
    csv_field(w, item->name);
    put(w, ",");
    csv_field(w, quantity);
    put(w, ",%s,%s,%s,", value ? csvnum(w, *value) : "", lo ? csvnum(w, *lo) : "",
        hi ? csvnum(w, *hi) : "");
    csv_field(w, unit);
    put(w, "\n");
}

static void csv_row(writer *w, const csv_item *item, const char *quantity, double value,
                    const double *lo, const double *hi, const char *unit)
{
    csv_row_of(w, item, quantity, &value, lo, hi, unit);
}

/* A keep-clear figure (a radius, a landing circle, an area, a rule's
 * radius) at CSV_DIGITS figures rounded up, and its interval widened (the
 * low end rounded down): no distance to keep clear below the one computed. */
static double up(double x)
{
    return plumbp_round_safe(x, CSV_DIGITS, 0);
}

static void csv_clear_row(writer *w, const csv_item *item, const char *quantity, double value,
                          const double *lo, const double *hi, const char *unit)
{
    double l = lo ? plumbp_round_safe(*lo, CSV_DIGITS, 1) : 0.0, h = hi ? up(*hi) : 0.0;
    csv_row(w, item, quantity, up(value), lo ? &l : NULL, hi ? &h : NULL, unit);
}

static void csv_quantile(writer *w, const csv_item *item, const char *name,
                         const plumb_zone_quantile *q, double scale, const char *unit, int clear)
{
    double lo = q->lo * scale, hi = q->hi * scale;
    (clear ? csv_clear_row : csv_row)(w, item, name, q->value * scale, q->lo_open ? NULL : &lo,
                                      q->hi_open ? NULL : &hi, unit);
}

static void csv_stats(writer *w, const csv_item *item, const char *prefix, const plumb_zone_stats *z,
                      int target_pass)
{
    char q[128];
    double L = len_shown(w, 1.0);
    const char *lu = len_unit(w);
    /* the unit as the comment lines and every text report spell it */
    const char *eu = w->us ? "ft·lbf" : "J";
    double E = w->us ? 1.0 / PLUMB_FT_LBF_J : 1.0;
#define Q(name) (snprintf(q, sizeof q, "%s%s", prefix, name), q)
    csv_row(w, item, Q("release_east"), z->release_m[0] * L, NULL, NULL, lu);
    csv_row(w, item, Q("release_north"), z->release_m[1] * L, NULL, NULL, lu);
    if (target_pass) {
        double me = z->release_m[0] + z->displacement[0].value, mn = z->release_m[1] + z->displacement[1].value;
        double elo = (z->release_m[0] + z->displacement[0].lo) * L, ehi = (z->release_m[0] + z->displacement[0].hi) * L;
        double nlo = (z->release_m[1] + z->displacement[1].lo) * L, nhi = (z->release_m[1] + z->displacement[1].hi) * L;
        csv_row(w, item, Q("median_impact_east"), me * L, &elo, &ehi, lu);
        csv_row(w, item, Q("median_impact_north"), mn * L, &nlo, &nhi, lu);
    }
    csv_row(w, item, Q("mean_east"), z->mean_m[0] * L, NULL, NULL, lu);
    csv_row(w, item, Q("mean_north"), z->mean_m[1] * L, NULL, NULL, lu);
    csv_row(w, item, Q("ellipse95_semi_major"), z->semi_major_m * L, NULL, NULL, lu);
    csv_row(w, item, Q("ellipse95_semi_minor"), z->semi_minor_m * L, NULL, NULL, lu);
    csv_row_of(w, item, Q("ellipse95_bearing"), zone_has_ellipse(z) ? &z->bearing_deg : NULL, NULL,
               NULL, "deg");
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        char name[32];
        snprintf(name, sizeof name, "radius_%s", plumbp_zone_radius_names[i]);
        csv_quantile(w, item, Q(name), &z->radius[i], L, lu, 1);
    }
    csv_clear_row(w, item, Q("radius_max"), z->radius_max_m * L, NULL, NULL, lu);
    csv_quantile(w, item, Q("radius_at_confidence"), &z->radius_conf, L, lu, 1);
    csv_clear_row(w, item, Q("scatter"), z->scatter_m * L, NULL, NULL, lu);
    csv_clear_row(w, item, Q("clearance_radius"), z->clearance_radius_m * L, NULL, NULL, lu);
    csv_row(w, item, Q("landing_centre_east"), z->landing_centre_m[0] * L, NULL, NULL, lu);
    csv_row(w, item, Q("landing_centre_north"), z->landing_centre_m[1] * L, NULL, NULL, lu);
    csv_quantile(w, item, Q("landing_radius"), &z->landing_radius, L, lu, 1);
    if (!z->landing_radius.hi_open)
        csv_clear_row(w, item, Q("landing_circle"), z->landing_circle_m * L, NULL, NULL, lu);
    if (!z->landing.open) {
        double A = L * L;
        const char *au = w->us ? "ft\xC2\xB2" : "m\xC2\xB2"; /* as the text and sweep CSV */
        csv_clear_row(w, item, Q("landing_area"), z->landing.polygon.area_m2 * A, NULL, NULL, au);
        csv_clear_row(w, item, Q("landing_area_buffered"), z->landing.buffered.area_m2 * A, NULL,
                      NULL, au);
    }
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++) {
        char name[32];
        snprintf(name, sizeof name, "energy_%s", plumbp_zone_energy_names[i]);
        csv_quantile(w, item, Q(name), &z->energy[i], E, eu, 0);
    }
    csv_row(w, item, Q("energy_max"), z->energy_max_j * E, NULL, NULL, eu);
    for (size_t i = 0; i < z->n_exceedance; i++) {
        const plumb_zone_exceedance *x = &z->exceedance[i];
        char name[PLUMB_CRIT_ID + 32];
        snprintf(name, sizeof name, "exceedance_%s", x->criterion->id);
        csv_row(w, item, Q(name), x->probability, &x->lo, &x->hi, "probability");
    }
    if (!target_pass) {
        csv_clear_row(w, item, Q("drop_height"), z->drop_height_m * L, NULL, NULL, lu);
        csv_clear_row(w, item, Q("ballistic_throw"), z->ballistic_throw_m * L, NULL, NULL, lu);
        if (z->glide_ratio_max > 0.0)
            csv_clear_row(w, item, Q("plate_glide"), z->glide_ratio_max * z->drop_height_m * L,
                          NULL, NULL, lu);
        csv_row(w, item, Q("max_release_speed"), z->max_release_speed_m_s * L, NULL, NULL,
                w->us ? "ft/s" : "m/s");
    }
#undef Q
}

void plumbp_zone_csv_report(writer *w, const plumb_zone_report *rep)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    for (size_t i = 0; i < n; i++)
        put(w, "# %s\n", c[i]);
    const plumb_zone_result *r0 = rep->items[0].result;
    put(w, "# profile: %s (%s), sha256 %s\n", rep->profile_name ? rep->profile_name : "",
        rep->profile_path ? rep->profile_path : "", rep->profile_sha256 ? rep->profile_sha256 : "");
    put(w, "# zone: %zu samples, seed %lu, confidence %s, intervals at %s, %zu thread%s (the "
           "figures do not depend on the number)\n", r0->samples, r0->seed,
        csvnum(w, r0->confidence), csvnum(w, r0->ci_level), rep->threads,
        rep->threads == 1 ? "" : "s");
    /* a scatter allowance of 0 is no allowance: said, not left as a 0 row */
    if (!(r0->zone.scatter_m > 0.0))
        put(w, "# scatter: none given (zone.scatter): bounce and deflection are not included in "
               "the clearance radius, the landing circle or the landing area\n");
    /* the criteria of the exceedance rows, with their source and status */
    for (size_t k = 0; k < r0->zone.n_exceedance; k++) {
        const plumb_criterion *cr = r0->zone.exceedance[k].criterion;
        char quoted[PLUMB_CRIT_TEXT * 2];
        put(w, "# criterion %s: %s, limit %s, source: %s, status %s\n", cr->id, cr->name,
            plumbp_csv_limit(w, cr->energy_limit_j), plumbp_t_source(w, cr, quoted, sizeof quoted),
            cr->status[0] ? cr->status : "not given");
    }
    if (rep->inventory) {
        /* the kit as a whole, as the text and JSON give it */
        const plumb_zone_result *kr = rep->items[rep->kit_item].result;
        const plumb_zone_result *lr = rep->items[rep->kit_landing_item].result;
        put(w, "# kit: clearance radius at confidence %s: %s %s, set by %s (the largest of the "
               "items' clearance radii: every item's clearance circle, around the same point, "
               "lies within it); ", csvnum(w, kr->confidence),
            csvnum(w, up(len_shown(w, kr->zone.clearance_radius_m))), len_unit(w),
            rep->items[rep->kit_item].name);
        if (lr->zone.landing_radius.hi_open)
            put(w, "largest landing circle " PLUMBP_OPEN_BOUND "\n");
        else
            put(w, "largest landing circle %s %s, set by %s\n",
                csvnum(w, up(len_shown(w, lr->zone.landing_circle_m))), len_unit(w),
                rep->items[rep->kit_landing_item].name);
        /* the landing circles lie around their own centres (kit_landing_reach) */
        size_t ri = 0;
        double reach = 0.0;
        if (kit_landing_reach(rep, &ri, &reach))
            put(w, "# kit: the landing circle reaching farthest from the drop point, %s's, reaches "
                   "%s %s, %s\n", rep->items[ri].name, csvnum(w, up(len_shown(w, reach))),
                len_unit(w),
                reach > kr->zone.clearance_radius_m
                    ? "beyond the kit clearance radius (another estimate of where the impacts "
                      "land, around the item's own centre): fence it to keep that circle clear too"
                    : "within the kit clearance radius");
    }
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        for (size_t k = 0; k < r->n_warnings; k++) {
            /* as plumb fall's CSV says it: the sentence whole, then the
             * item it is said of in brackets, in a kit (plumbp_who_text) */
            char text[PLUMB_ZONE_WARNING * 2], line[PLUMB_NAME + PLUMB_ZONE_WARNING * 2 + 8];
            put(w, "# warning: %s\n",
                plumbp_who_text(line, sizeof line, rep->inventory ? rep->items[i].name : "",
                                plumbp_t_warning(w, r->warnings[k], text, sizeof text)));
        }
    }
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        for (size_t k = 0; k < r->n_inputs; k++)
            if (r->inputs[k].truncated)
                put(w, "# %s: %s: normal truncated to its range, %zu draw%s redrawn\n",
                    rep->items[i].name, r->inputs[k].key, r->inputs[k].redraws,
                    plumbp_s(r->inputs[k].redraws));
    }
    put(w, "item_number,item,quantity,value,ci_low,ci_high,unit\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        const csv_item it = {item_number(rep, i), rep->items[i].name};
        csv_stats(w, &it, "", &r->zone, 0);
        if (r->has_target) {
            csv_row(w, &it, "target.east", r->target_m[0] * len_shown(w, 1.0), NULL,
                    NULL, len_unit(w));
            csv_row(w, &it, "target.north", r->target_m[1] * len_shown(w, 1.0), NULL,
                    NULL, len_unit(w));
            csv_stats(w, &it, "target.", &r->at_target, 1);
        }
    }
    /* the kit's clearance radius and landing circle, each in the row of the
     * item that sets it (the landing circle only when bounded, as an item's) */
    if (rep->inventory) {
        const plumb_zone_result *kr = rep->items[rep->kit_item].result;
        const plumb_zone_result *lr = rep->items[rep->kit_landing_item].result;
        const csv_item ki = {item_number(rep, rep->kit_item), rep->items[rep->kit_item].name};
        const csv_item li = {item_number(rep, rep->kit_landing_item),
                             rep->items[rep->kit_landing_item].name};
        csv_clear_row(w, &ki, "kit_clearance_radius",
                      len_shown(w, kr->zone.clearance_radius_m), NULL, NULL, len_unit(w));
        if (!lr->zone.landing_radius.hi_open)
            csv_clear_row(w, &li, "kit_landing_circle",
                          len_shown(w, lr->zone.landing_circle_m), NULL, NULL, len_unit(w));
    }
}

