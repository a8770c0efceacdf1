/*
 * report_zone_int.h - what the writers of the zone report share:
 * report_zone.c (plumb_report_zone: the checks and the choice of format),
 * zone_text.c (the text report), zone_csv.c (CSV, RFC 4180) and
 * zone_json.c (JSON, jansson). Names of the percentiles, the small
 * helpers two writers use (static inline), and the writers (plumbp_zone_
 * prefix). Internal to libplumb; not installed.
 */
#ifndef PLUMB_REPORT_ZONE_INT_H
#define PLUMB_REPORT_ZONE_INT_H

#include <math.h>

#include <jansson.h>

#include "plumb/constants.h"
#include "plumb/report.h"
#include "plumb/dispersion.h"
#include "report/jsonout.h"
#include "report/textout.h"

extern const char *const plumbp_zone_radius_names[PLUMB_ZONE_RADII];
extern const char *const plumbp_zone_energy_names[PLUMB_ZONE_ENERGIES];

/* A 95 % ellipse, and so a bearing of its major axis, only when the
 * samples spread: when every sample lands on the same point the covariance
 * is zero and its axis (atan2(0, 0): east) means nothing. The text then
 * says "none", the CSV leaves the bearing empty and JSON gives null; the
 * landing polygon's grid, laid along the same samples' principal axis,
 * has no bearing either. */
static inline int zone_has_ellipse(const plumb_zone_stats *z)
{
    /* != rather than >: a non-finite axis is not "none" but a figure the
     * writers refuse (PLUMB_ENUMERIC) */
    return z->semi_major_m != 0.0;
}

/* Item i's number, as items[N] names it (plumb_zone_item). */
static inline size_t item_number(const plumb_zone_report *rep, size_t i)
{
    return rep->items[i].number ? rep->items[i].number : i + 1;
}

static inline double len_shown(const writer *w, double m)
{
    return w->us ? m / PLUMB_FT_M : m;
}

static inline const char *len_unit(const writer *w)
{
    return w->us ? "ft" : "m";
}

/* How far from the planned drop point a kit item's landing circle
 * reaches: its centre's distance from that point plus its radius (the
 * scatter allowance included, as landing_circle_m has it), m. The kit's
 * clearance radius is the largest of the items' clearance radii, circles
 * all around the drop point, so each of those lies within it; a landing
 * circle lies around its item's own centre, is another estimate from
 * other samples (the first landing_training fix its centre, the rest are
 * counted), and can reach beyond it. The writers say which, and how far.
 * Sets *item to the bounded circle that reaches farthest and returns 1;
 * 0 when every circle is open. */
static inline int kit_landing_reach(const plumb_zone_report *rep, size_t *item, double *reach_m)
{
    int any = 0;
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_stats *z = &rep->items[i].result->zone;
        if (z->landing_radius.hi_open)
            continue;
        double r = hypot(z->landing_centre_m[0] - z->release_m[0],
                         z->landing_centre_m[1] - z->release_m[1]) + z->landing_circle_m;
        if (!any || r > *reach_m) {
            *item = i;
            *reach_m = r;
            any = 1;
        }
    }
    return any;
}

static inline const char *dist_word(plumb_dist_kind k)
{
    switch (k) {
    case PLUMB_DIST_UNIFORM: return "uniform";
    case PLUMB_DIST_TRIANGULAR: return "triangular";
    case PLUMB_DIST_CHOICE: return "choice";
    default: return "normal";
    }
}

void plumbp_zone_text_report(writer *w, const plumb_report_options *opt,
                             const plumb_zone_report *rep);
void plumbp_zone_csv_report(writer *w, const plumb_zone_report *rep);
json_t *plumbp_zone_json_report(jctx *j, const plumb_report_options *opt,
                                const plumb_zone_report *rep);

#endif
