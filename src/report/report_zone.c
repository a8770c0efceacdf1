/*
 * report_zone.c - text, JSON (jansson) and CSV reports of a Monte Carlo
 * clearance zone (include/plumb/dispersion.h; conventions of
 * include/plumb/report.h).
 *
 * Method: the whole report is made first, in a memory stream (POSIX
 * open_memstream) or as a jansson tree, and every figure is checked to be
 * finite on the way; only a complete, finite report is copied to the
 * caller's stream, so a refused report writes nothing.
 *
 * Units: text and CSV in SI, or with --units us in international feet and
 * pounds (1959 agreement: PLUMB_FT_M, PLUMB_LB_KG) and foot pound-force
 * (PLUMB_FT_LBF_J); energy in the text always in both J and ft lbf. JSON
 * is always SI with unit-suffixed keys and 17 significant digits (enough
 * for any IEEE 754 double to read back exactly, IEEE 754-2008 sec.
 * 5.12.2). CSV follows RFC 4180, the cautions as leading "# " lines.
 * The thread count is printed outside the "zone" objects: nothing in them
 * depends on it.
 *
 * This file checks a report and picks its writer: zone_text.c, zone_csv.c,
 * zone_json.c or zone_map.c (GeoJSON); report_zone_int.h is what they
 * share.
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

/* Significant digits of text figures; CSV digits (JSON: jsonout.h). */
/* Width the text wraps sentences at. */
/* Compass points naming a bearing. */
#define FULL_TURN_DEG 360.0


const char *const plumbp_zone_radius_names[PLUMB_ZONE_RADII] = {"p50", "p90", "p99", "p999"};
const char *const plumbp_zone_energy_names[PLUMB_ZONE_ENERGIES] = {"p50", "p95", "p99"};

/* ---- output --------------------------------------------------------------- */

static plumb_status check_report(const plumb_zone_report *rep, plumb_diag *diag)
{
    if (!rep || rep->n_items == 0 || !rep->items)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no zone report to write");
    if (!rep->inventory && rep->n_items != 1)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a single-payload zone report has one item");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        if (!r || !rep->items[i].name)
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "zone item %zu has no result or name", i + 1);
        if (r->samples != rep->items[0].result->samples || r->seed != rep->items[0].result->seed)
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "zone items were run with other settings");
        for (size_t k = 0; k < r->zone.n_exceedance; k++)
            if (!r->zone.exceedance[k].criterion)
                return PLUMB_RAISE(diag, PLUMB_EINVAL, "zone item %zu: criterion missing", i + 1);
    }
    return PLUMB_OK;
}

plumb_status plumb_report_zone(FILE *out, const plumb_report_options *opt_in,
                               const plumb_zone_report *rep, plumb_diag *diag)
{
    plumb_report_options def;
    memset(&def, 0, sizeof def);
    const plumb_report_options *opt = opt_in ? opt_in : &def;
    if (!out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no output stream");
    plumb_status st = check_report(rep, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        return emit_json(out, &j, plumbp_zone_json_report(&j, opt, rep), diag);
    }
    if (opt->format == PLUMB_FORMAT_GEOJSON) {
        jctx j = {0, 0};
        json_t *root = plumbp_zone_geojson(&j, opt, rep, &st, diag);
        return st != PLUMB_OK ? st : emit_json(out, &j, root, diag);
    }
    writer w;
    if ((st = plumbp_writer_open(&w, opt->units, diag)) != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_CSV)
        plumbp_zone_csv_report(&w, rep);
    else
        plumbp_zone_text_report(&w, opt, rep);
    return plumbp_writer_close(&w, out, diag);
}
