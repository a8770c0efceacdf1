/*
 * zone_map.h - the zone for a map (src/report/zone_map.c): the GeoJSON
 * tree plumb_report_zone writes for PLUMB_FORMAT_GEOJSON.
 */
#ifndef PLUMB_REPORT_ZONE_MAP_H
#define PLUMB_REPORT_ZONE_MAP_H

#include <jansson.h>

#include "plumb/dispersion.h"
#include "plumb/report.h"
#include "report/jsonout.h"

/* The RFC 7946 FeatureCollection of a zone report, or NULL with *st set:
 * PLUMB_EINVAL (key site.longitude) without a site, or for a point too far
 * from the site for the map conversion (geodesy.h). */
json_t *plumbp_zone_geojson(jctx *j, const plumb_report_options *opt,
                            const plumb_zone_report *rep, plumb_status *st, plumb_diag *diag);

#endif /* PLUMB_REPORT_ZONE_MAP_H */
