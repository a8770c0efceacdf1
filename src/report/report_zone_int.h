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
