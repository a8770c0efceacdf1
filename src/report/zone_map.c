/*
 * zone_map.c - a zone for a map: RFC 7946 GeoJSON (plumb_report_zone with
 * PLUMB_FORMAT_GEOJSON) and the same shapes as CSV in local metres
 * (plumb_report_zone_regions); conventions of include/plumb/report.h.
 *
 * GeoJSON (H. Butler et al., RFC 7946, 2016): one FeatureCollection; the
 * cautions, the warnings, the method and the site in its "properties";
 * positions [longitude, latitude] in WGS 84 degrees (section 4), from the
 * local east, north metres by plumb_geodesy_forward (geodesy.h: the Gauss
 * mid-latitude formulas, within 2 cm at 10 km); polygons with
 * counter-clockwise exterior rings whose last position repeats the first
 * (section 3.1.6). A region of several parts is a MultiPolygon. A circle
 * is a polygon of CIRCLE_SIDES sides drawn around it (each vertex at
 * r / cos(pi / CIRCLE_SIDES)), so the polygon holds the whole circle.
 * Every feature says in its properties what it is ("kind"), which item
 * and which run it belongs to, its fraction of impacts and the confidence
 * of that bound, and its radius or area in metres.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <jansson.h>

#include "plumb/constants.h"
#include "plumb/dispersion.h"
#include "plumb/geodesy.h"
#include "plumb/report.h"
#include "plumb/version.h"
#include "core/internal.h"
#include "report/jsonout.h"
#include "report/format.h"
#include "report/zone_map.h"

/* Sides of the polygon drawn around a circle. */
#define CIRCLE_SIDES 72

/* ---- shapes in local metres ------------------------------------------------- */

/* One shape of a zone: a point, a circle or a region of rings. */
typedef struct shape {
    const char *kind;          /* "release_point", "landing_region" ... */
    const char *what;          /* words for a person */
    const char *pass;          /* "planned release" or "released at the aiming point" */
    double point[2];           /* point or circle centre, m */
    double radius_m;           /* circle: > 0 */
    const plumb_region_polygon *region; /* region, or NULL */
    double p;                  /* fraction of impacts, or 0 */
    double scatter_m;          /* allowance included, m */
    double extra_m;            /* circle: its radius before the allowance, m */
} shape;

typedef void (*shape_fn)(void *user, const char *item, int kit, const shape *s);

/* Every shape of one item's result, in a fixed order. */
static void each_shape(const plumb_zone_result *r, const char *item, int kit, shape_fn fn,
                       void *user)
{
    const plumb_zone_stats *z = &r->zone;
    const char *pass0 = "planned release";
    shape s;
    memset(&s, 0, sizeof s);
    s = (shape){"release_point", "the planned release point", pass0, {z->release_m[0], z->release_m[1]},
                0.0, NULL, 0.0, 0.0, 0.0};
    fn(user, item, kit, &s);
    s = (shape){"mean_impact", "the mean impact point", pass0, {z->mean_m[0], z->mean_m[1]}, 0.0,
                NULL, 0.0, 0.0, 0.0};
    fn(user, item, kit, &s);
    s = (shape){"median_impact", "the median impact point (east and north medians)", pass0,
                {z->release_m[0] + z->displacement[0].value, z->release_m[1] + z->displacement[1].value},
                0.0, NULL, 0.5, 0.0, 0.0};
    fn(user, item, kit, &s);
    s = (shape){"clearance_circle",
                "the clearance radius around the planned drop point (upper bound of the radius "
                "percentile plus the scatter allowance)",
                pass0, {z->centre_m[0], z->centre_m[1]}, z->clearance_radius_m, NULL,
                r->confidence, z->scatter_m, z->radius_conf.hi};
    if (s.radius_m > 0.0 && !z->radius_conf.hi_open)
        fn(user, item, kit, &s);
    if (!z->landing_radius.hi_open && z->landing_circle_m > 0.0) {
        s = (shape){"landing_circle",
                    "the smallest circle around the impact cloud's centre holding the fraction of "
                    "impacts (upper bound), with the scatter allowance added",
                    pass0, {z->landing_centre_m[0], z->landing_centre_m[1]}, z->landing_circle_m,
                    NULL, r->confidence, z->scatter_m, z->landing_radius.hi};
        fn(user, item, kit, &s);
    }
    if (!z->landing.open) {
        s = (shape){"landing_region",
                    "the region holding the fraction of impacts (split-conformal highest-density "
                    "region), without the scatter allowance",
                    pass0, {0.0, 0.0}, 0.0, &z->landing.polygon, r->confidence, 0.0, 0.0};
        fn(user, item, kit, &s);
        s = (shape){"landing_region_buffered",
                    "the landing region with the scatter allowance added as a buffer", pass0,
                    {0.0, 0.0}, 0.0, &z->landing.buffered, r->confidence, z->scatter_m, 0.0};
        fn(user, item, kit, &s);
    }
    if (r->has_target) {
        const plumb_zone_stats *t = &r->at_target;
        const char *pass1 = "released at the aiming point";
        s = (shape){"target", "the target", pass1, {r->target_m[0], r->target_m[1]}, 0.0, NULL,
                    0.0, 0.0, 0.0};
        fn(user, item, kit, &s);
        s = (shape){"aim_release_point",
                    "the release point that puts the median impact on the target", pass1,
                    {r->aim_release_m[0], r->aim_release_m[1]}, 0.0, NULL, 0.0, 0.0, 0.0};
        fn(user, item, kit, &s);
        s = (shape){"target_clearance_circle",
                    "the clearance radius around the target, released at the aiming point", pass1,
                    {t->centre_m[0], t->centre_m[1]}, t->clearance_radius_m, NULL, r->confidence,
                    t->scatter_m, t->radius_conf.hi};
        if (s.radius_m > 0.0 && !t->radius_conf.hi_open)
            fn(user, item, kit, &s);
        if (!t->landing.open) {
            s = (shape){"target_landing_region_buffered",
                        "the landing region of the run released at the aiming point, with the "
                        "scatter allowance as a buffer",
                        pass1, {0.0, 0.0}, 0.0, &t->landing.buffered, r->confidence,
                        t->scatter_m, 0.0};
            fn(user, item, kit, &s);
        }
    }
}

/* Vertex k of the polygon drawn around a circle, counter-clockwise from east. */
static void circle_vertex(const shape *s, int k, double out[2])
{
    double R = s->radius_m / cos(PLUMB_PI / CIRCLE_SIDES);
    double t = 2.0 * PLUMB_PI * (double)(k % CIRCLE_SIDES) / CIRCLE_SIDES;
    out[0] = s->point[0] + R * cos(t);
    out[1] = s->point[1] + R * sin(t);
}

/* ---- GeoJSON -------------------------------------------------------------------- */

typedef struct geo {
    jctx *j;
    json_t *features;
    double site[2];
    double level;
    const char *kit_item;      /* name of the item that sets the kit's zone, or NULL */
    plumb_status st;
    plumb_diag *diag;
} geo;

static json_t *position(geo *g, const double en[2])
{
    double ll[2] = {0.0, 0.0};
    if (g->st == PLUMB_OK)
        g->st = plumb_geodesy_forward(g->site[0], g->site[1], en[0], en[1], ll, g->diag);
    json_t *p = jarr(g->j);
    jpush(g->j, p, jreal(g->j, ll[1]));
    jpush(g->j, p, jreal(g->j, ll[0]));
    return p;
}

static void add_feature(void *user, const char *item, int kit, const shape *s)
{
    geo *g = user;
    jctx *j = g->j;
    json_t *geom = jobj(j), *coords;
    if (s->region) {
        const plumb_region_polygon *pg = s->region;
        json_t *polys = jarr(j);
        for (size_t r = 0; r < pg->n_rings; r++) {
            json_t *ring = jarr(j), *poly = jarr(j);
            for (size_t k = 0; k < pg->ring_count[r]; k++)
                jpush(j, ring, position(g, pg->vertex_m[pg->ring_first[r] + k]));
            jpush(j, poly, ring);
            jpush(j, polys, poly);
        }
        if (pg->n_rings == 1) {
            jset(j, geom, "type", jstr(j, "Polygon"));
            coords = json_incref(json_array_get(polys, 0));
            json_decref(polys);
        } else {
            jset(j, geom, "type", jstr(j, "MultiPolygon"));
            coords = polys;
        }
    } else if (s->radius_m > 0.0) {
        jset(j, geom, "type", jstr(j, "Polygon"));
        json_t *ring = jarr(j);
        for (int k = 0; k <= CIRCLE_SIDES; k++) {
            double v[2];
            circle_vertex(s, k, v);
            jpush(j, ring, position(g, v));
        }
        coords = jarr(j);
        jpush(j, coords, ring);
    } else {
        jset(j, geom, "type", jstr(j, "Point"));
        coords = position(g, s->point);
    }
    jset(j, geom, "coordinates", coords);
    json_t *pr = jobj(j);
    jset(j, pr, "kind", jstr(j, s->kind));
    jset(j, pr, "description", jstr(j, s->what));
    if (kit)
        jset(j, pr, "item", jstr(j, item));
    if (kit)
        jset(j, pr, "sets_kit_zone", json_boolean(g->kit_item && strcmp(g->kit_item, item) == 0));
    jset(j, pr, "run", jstr(j, s->pass));
    if (s->region || s->radius_m > 0.0) {
        jset(j, pr, "fraction_of_impacts", jreal(j, s->p));
        jset(j, pr, "confidence", jreal(j, g->level));
        jset(j, pr, "scatter_m", jreal(j, s->scatter_m));
    }
    if (s->region) {
        jset(j, pr, "area_m2", jreal(j, s->region->area_m2));
        jset(j, pr, "parts", jint(j, s->region->n_rings));
    } else if (s->radius_m > 0.0) {
        jset(j, pr, "radius_m", jreal(j, s->radius_m));
        jset(j, pr, "radius_without_scatter_m", jreal(j, s->extra_m));
        json_t *c = jarr(j);
        jpush(j, c, jreal(j, s->point[0]));
        jpush(j, c, jreal(j, s->point[1]));
        jset(j, pr, "centre_east_north_m", c);
        jset(j, pr, "polygon_sides", jint(j, CIRCLE_SIDES));
    } else {
        json_t *c = jarr(j);
        jpush(j, c, jreal(j, s->point[0]));
        jpush(j, c, jreal(j, s->point[1]));
        jset(j, pr, "east_north_m", c);
    }
    json_t *f = jobj(j);
    jset(j, f, "type", jstr(j, "Feature"));
    jset(j, f, "properties", pr);
    jset(j, f, "geometry", geom);
    jpush(j, g->features, f);
}

json_t *plumbp_zone_geojson(jctx *j, const plumb_report_options *opt,
                            const plumb_zone_report *rep, plumb_status *st, plumb_diag *diag)
{
    *st = PLUMB_OK;
    if (!rep->has_site) {
        *st = PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "site.longitude",
                              "GeoJSON needs the site on the map: give site.latitude and "
                              "site.longitude (WGS 84 degrees)");
        return NULL;
    }
    const plumb_zone_result *r0 = rep->items[0].result;
    geo g = {j, jarr(j), {rep->site_deg[0], rep->site_deg[1]}, r0->ci_level,
             rep->inventory ? rep->items[rep->kit_item].name : NULL, PLUMB_OK, diag};
    for (size_t i = 0; i < rep->n_items; i++)
        each_shape(rep->items[i].result, rep->items[i].name, rep->inventory, add_feature, &g);
    json_t *root = jobj(j);
    jset(j, root, "type", jstr(j, "FeatureCollection"));
    json_t *pr = jobj(j);
    const char *version = opt->version ? opt->version : PLUMB_VERSION;
    char generator[64];
    snprintf(generator, sizeof generator, "plumb %s", version);
    jset(j, pr, "generator", jstr(j, generator));
    jset(j, pr, "plumb_version", jstr(j, version)); /* as every JSON report names it */
    jset(j, pr, "profile", jstr(j, rep->profile_name));
    jset(j, pr, "profile_path", jstr(j, rep->profile_path));
    jset(j, pr, "profile_sha256", jstr(j, rep->profile_sha256));
    json_t *site = jarr(j);
    jpush(j, site, jreal(j, rep->site_deg[1]));
    jpush(j, site, jreal(j, rep->site_deg[0]));
    jset(j, pr, "site_lon_lat_deg", site);
    jset(j, pr, "coordinates",
         jstr(j, "WGS 84 longitude, latitude (RFC 7946); from local east, north metres by the "
                 "Gauss mid-latitude formulas on the WGS 84 ellipsoid, within 2 cm at 10 km"));
    jset(j, pr, "samples", jint(j, r0->samples));
    jset(j, pr, "seed", jint(j, r0->seed));
    jset(j, pr, "fraction_of_impacts", jreal(j, r0->confidence));
    jset(j, pr, "confidence", jreal(j, r0->ci_level));
    jset(j, pr, "method",
         jstr(j, "Monte Carlo over the profile's uncertainty; circles: upper order-statistic "
                 "bounds of the distance; regions: split-conformal highest-density regions (Lei, "
                 "Robins & Wasserman, JASA 2013); the scatter allowance added as a buffer"));
    if (rep->inventory) {
        jset(j, pr, "kit_zone_item", jstr(j, rep->items[rep->kit_item].name));
        jset(j, pr, "kit_clearance_radius_m",
             jreal(j, rep->items[rep->kit_item].result->zone.clearance_radius_m));
    }
    json_t *warn = jarr(j);
    for (size_t i = 0; i < rep->n_items; i++)
        for (size_t k = 0; k < rep->items[i].result->n_warnings; k++) {
            char buf[PLUMB_NAME + PLUMB_ZONE_WARNING * 2 + 4], text[PLUMB_ZONE_WARNING * 2];
            if (!plumbp_warning_plain(rep->items[i].result->warnings[k], 0, text, sizeof text))
                j->bad = 1;
            /* the sentence whole, then the item in brackets, as plumb fall
             * says it (plumbp_who_text) */
            jpush(j, warn, jstr(j, plumbp_who_text(buf, sizeof buf,
                                                   rep->inventory ? rep->items[i].name : "",
                                                   text)));
        }
    jset(j, pr, "warnings", warn);
    jset(j, pr, "cautions", j_cautions(j));
    jset(j, root, "properties", pr);
    jset(j, root, "features", g.features);
    if (g.st != PLUMB_OK) {
        *st = g.st;
        json_decref(root);
        return NULL;
    }
    return root;
}

/* ---- CSV of the shapes ------------------------------------------------------------ */

typedef struct csvctx {
    writer *w;
} csvctx;

static void csv_vertex(writer *w, const char *item, const shape *s, size_t part, size_t k,
                       const double v[2])
{
    csv_field(w, item);
    put(w, ",");
    csv_field(w, s->kind);
    put(w, ",");
    csv_field(w, s->pass);
    put(w, ",%zu,%zu,%s,%s,%s,%s,%s\n", part + 1, k + 1, csvnum(w, v[0]), csvnum(w, v[1]),
        csvnum(w, s->p),
        /* the area and the allowance of a shape to keep clear: rounded up */
        csvnum(w, plumbp_round_safe(s->region ? s->region->area_m2
                                              : PLUMB_PI * s->radius_m * s->radius_m,
                                    CSV_DIGITS, 0)),
        csvnum(w, plumbp_round_safe(s->scatter_m, CSV_DIGITS, 0)));
}

static void csv_shape(void *user, const char *item, int kit, const shape *s)
{
    (void)kit;
    writer *w = ((csvctx *)user)->w;
    if (s->region) {
        for (size_t r = 0; r < s->region->n_rings; r++)
            for (size_t k = 0; k < s->region->ring_count[r]; k++)
                csv_vertex(w, item, s, r, k, s->region->vertex_m[s->region->ring_first[r] + k]);
    } else if (s->radius_m > 0.0) {
        for (int k = 0; k <= CIRCLE_SIDES; k++) {
            double v[2];
            circle_vertex(s, k, v);
            csv_vertex(w, item, s, 0, (size_t)k, v);
        }
    }
}

plumb_status plumb_report_zone_regions(FILE *out, const plumb_zone_report *rep, plumb_diag *diag)
{
    if (!out || !rep || rep->n_items == 0 || !rep->items)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no zone report to write");
    writer w;
    plumb_status st = plumbp_writer_open(&w, PLUMB_UNITS_SI, diag);
    if (st != PLUMB_OK)
        return st;
    size_t nc;
    const char *const *c = plumb_cautions(&nc);
    for (size_t i = 0; i < nc; i++)
        put(&w, "# %s\n", c[i]);
    const plumb_zone_result *r0 = rep->items[0].result;
    put(&w, "# the zone's circles and regions as polygons in local metres east and north of "
            "east = north = 0, each ring counter-clockwise and closed (its last vertex repeats "
            "the first); circles as %d-sided polygons drawn around them; fraction_of_impacts "
            "held with %s confidence; area_m2 of the whole shape (all parts); %zu samples, "
            "seed %lu\n", CIRCLE_SIDES, csvnum(&w, r0->ci_level), r0->samples, r0->seed);
    if (rep->inventory)
        put(&w, "# the kit's zone is set by: %s\n", rep->items[rep->kit_item].name);
    put(&w, "item,shape,run,part,vertex,east_m,north_m,fraction_of_impacts,area_m2,scatter_m\n");
    csvctx cc = {&w};
    for (size_t i = 0; i < rep->n_items; i++)
        each_shape(rep->items[i].result, rep->items[i].name, rep->inventory, csv_shape, &cc);
    return plumbp_writer_close(&w, out, diag);
}
