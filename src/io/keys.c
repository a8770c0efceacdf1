/*
 * keys.c - the one table of numeric profile keys (io/keys.h).
 *
 * Each row: the key, its dimension and range (the only place either is
 * written: the loader's schema names the row, profile_schema.c; README
 * "Profile keys" documents them for users), where the value lives in a
 * resolved spec, when it applies, and what else changes with it.
 * Ranges: plumby_range (yamltree.h), whose bounds plumby_range_bounds
 * gives; the altitude floor and ceiling are PLUMB_STD1976_BOTTOM_M and
 * PLUMB_STD1976_TOP_M (constants.h).
 */
#include <stdio.h>
#include <string.h>

#include "io/keys.h"
#include "core/internal.h"

#define SPEC(f) PLUMBP_HOME_SPEC, offsetof(plumb_fall_spec, f)
#define DEV(f) PLUMBP_HOME_DEVICE, offsetof(plumb_descent_spec, f)
#define AIR(f) PLUMBP_HOME_AIR, offsetof(plumb_atm_spec, f)
#define SHAPE(i) PLUMBP_HOME_SHAPE, (i)
#define DERIVED PLUMBP_HOME_DERIVED, 0
#define ROW PLUMBP_HOME_ROW, 0
#define ZONE PLUMBP_HOME_ZONE, 0
#define D(x) PLUMB_DIM_##x
#define R(x) PLUMBY_R_##x
#define W(x) PLUMBP_WHEN_##x
#define SB(k) PLUMBP_SHAPE_BIT(PLUMB_SHAPE_##k)
enum {
    AIRK = PLUMBP_KEY_AIR | PLUMBP_KEY_SHARED,
    SHARED = PLUMBP_KEY_SHARED,
    CHECKED = PLUMBP_KEY_CHECKED,
    DRAG = PLUMBP_KEY_DRAG
};

/* key, dim, count, range, angle, home, offset, when, shapes, effects; in the
 * order of plumbp_key_id (keys.h) */
const plumbp_key plumbp_key_table[] = {
    {"payload.mass", D(MASS), 0, R(MASS), 0, SPEC(mass_kg), W(ALWAYS), 0, PLUMBP_KEY_GLIDE},
    {"payload.volume", D(VOLUME), 0, R(NONNEG), 0, SPEC(volume_m3), W(ALWAYS), 0, 0},
    {"payload.drag.cd", D(NONE), 0, R(CD), 0, SPEC(drag.cd), W(CD_AND_AREA), 0, DRAG},
    {"payload.drag.area", D(AREA), 0, R(POSITIVE), 0, SPEC(drag.area_m2), W(CD_AND_AREA), 0, DRAG},
    {"payload.drag.cd_area", D(AREA), 0, R(NONNEG), 0, SPEC(drag.cd_area_m2), W(CD_AREA), 0, DRAG},
    {"payload.drag.diameter", D(LENGTH), 0, R(POSITIVE), 0, DERIVED, W(SPHERE_DRAG), 0, DRAG},
    {"payload.shape.diameter", D(LENGTH), 0, R(POSITIVE), 0, SHAPE(0), W(SHAPE),
     SB(SPHERE) | SB(CYLINDER), DRAG},
    {"payload.shape.length", D(LENGTH), 0, R(POSITIVE), 0, SHAPE(0), W(SHAPE), SB(CYLINDER), DRAG},
    {"payload.shape.edges[]", D(LENGTH), 0, R(POSITIVE), 0, ROW, W(SHAPE), SB(BOX) | SB(PLATE),
     DRAG},
    {"payload.shape.thickness", D(LENGTH), 0, R(POSITIVE), 0, SHAPE(2), W(SHAPE), SB(PLATE), DRAG},
    {"descent.cd", D(NONE), 0, R(CD_POSITIVE), 0, DEV(cd), W(DEVICE), 0, 0},
    {"descent.area", D(AREA), 0, R(POSITIVE), 0, DEV(area_m2), W(DEVICE), 0, CHECKED},
    {"descent.diameter", D(LENGTH), 0, R(POSITIVE), 0, DERIVED, W(DEVICE), 0, PLUMBP_KEY_AREA},
    {"descent.deploy.after", D(TIME), 0, R(NONNEG), 0, DEV(deploy_value), W(DEPLOY_AFTER), 0,
     CHECKED},
    {"descent.deploy.below", D(LENGTH), 0, R(POSITIVE), 0, DEV(deploy_value), W(DEPLOY_BELOW), 0,
     CHECKED},
    {"descent.fill_time", D(TIME), 0, R(NONNEG), 0, DEV(fill_time_s), W(FILL_TIME), 0, 0},
    {"descent.fill_constant", D(NONE), 0, R(POSITIVE), 0, DEV(fill_constant), W(FILL_CONSTANT), 0,
     0},
    /* checked against PLUMB_INFLATION_J_MAX by the loader */
    {"descent.inflation_exponent", D(NONE), 0, R(POSITIVE), 0, DEV(inflation_exponent), W(DEVICE),
     0, CHECKED},
    {"descent.opening_factor", D(NONE), 0, R(POSITIVE), 0, DEV(opening_factor), W(DEVICE), 0, 0},
    {"release.height", D(LENGTH), 0, R(POSITIVE), 0, SPEC(release_m[2]), W(ALWAYS), 0,
     SHARED | CHECKED},
    {"release.velocity.east", D(SPEED), 0, R(SUBSONIC), 0, SPEC(velocity_m_s[0]), W(ALWAYS), 0, SHARED | CHECKED},
    {"release.velocity.north", D(SPEED), 0, R(SUBSONIC), 0, SPEC(velocity_m_s[1]), W(ALWAYS), 0, SHARED | CHECKED},
    {"release.velocity.up", D(SPEED), 0, R(SUBSONIC), 0, SPEC(velocity_m_s[2]), W(ALWAYS), 0, SHARED | CHECKED},
    {"release.velocity.speed", D(SPEED), 0, R(SUBSONIC_NONNEG), 0, DERIVED, W(ALWAYS), 0,
     SHARED | PLUMBP_KEY_VELOCITY},
    {"release.velocity.heading", D(ANGLE), 0, R(ANY), 1, DERIVED, W(ALWAYS), 0,
     SHARED | PLUMBP_KEY_VELOCITY},
    {"release.velocity.climb", D(SPEED), 0, R(SUBSONIC), 0, SPEC(velocity_m_s[2]), W(ALWAYS), 0, SHARED | CHECKED},
    {"release.downwash.aircraft_mass", D(MASS), 0, R(MASS), 0,
     SPEC(downwash.aircraft_mass_kg), W(ALWAYS), 0, SHARED},
    {"release.downwash.disk_area", D(AREA), 0, R(POSITIVE), 0, SPEC(downwash.disk_area_m2),
     W(ALWAYS), 0, SHARED},
    {"release.position.east", D(LENGTH), 0, R(ANY), 0, SPEC(release_m[0]), W(ALWAYS), 0, SHARED},
    {"release.position.north", D(LENGTH), 0, R(ANY), 0, SPEC(release_m[1]), W(ALWAYS), 0, SHARED},
    /* the release point on the map, turned into east and north from the site */
    {"release.position.latitude", D(ANGLE), 0, R(LATITUDE), 0, ZONE, W(ALWAYS), 0, 0},
    {"release.position.longitude", D(ANGLE), 0, R(LONGITUDE), 0, ZONE, W(ALWAYS), 0, 0},
    {"site.elevation", D(LENGTH), 0, R(ALTITUDE), 0, SPEC(site_elevation_m), W(ALWAYS), 0,
     AIRK | CHECKED | PLUMBP_KEY_STATION},
    /* places the release point and the zone's target given by latitude and longitude */
    {"site.latitude", D(ANGLE), 0, R(LATITUDE), 0, SPEC(gravity.latitude_deg), W(LATITUDE), 0,
     SHARED | PLUMBP_KEY_LOADER},
    /* WGS 84; only for map output (plumb zone --format geojson) */
    {"site.longitude", D(ANGLE), 0, R(LONGITUDE), 0, ZONE, W(ALWAYS), 0, 0},
    {"atmosphere.temperature_offset", D(TEMP_DIFF), 0, R(TEMP_OFFSET), 0, AIR(temperature_offset_k),
     W(AIR_OFFSET), 0, AIRK | CHECKED},
    {"atmosphere.pressure", D(PRESSURE), 0, R(POSITIVE), 0, AIR(station_pressure_pa),
     W(AIR_SURFACE), 0, AIRK},
    {"atmosphere.temperature", D(TEMPERATURE), 0, R(AIR_TEMPERATURE), 0, AIR(station_temperature_k),
     W(AIR_SURFACE), 0, AIRK | CHECKED},
    {"atmosphere.lapse_rate", D(LAPSE), 0, R(ANY), 0, AIR(lapse_rate_k_m), W(AIR_SURFACE), 0,
     AIRK | CHECKED},
    {"atmosphere.humidity", D(FRACTION), 0, R(UNIT), 0, AIR(relative_humidity), W(ALWAYS), 0, AIRK},
    {"atmosphere.table[].altitude", D(LENGTH), 0, R(ALTITUDE), 0, ROW, W(AIR_TABLE), 0,
     AIRK | CHECKED},
    {"atmosphere.table[].density", D(DENSITY), 0, R(POSITIVE), 0, ROW, W(AIR_TABLE), 0, AIRK},
    {"atmosphere.table[].temperature", D(TEMPERATURE), 0, R(AIR_TEMPERATURE), 0, ROW, W(AIR_TABLE), 0,
     AIRK},
    {"wind.speed", D(SPEED), 0, R(SUBSONIC_NONNEG), 0, SPEC(wind.speed_m_s), W(WIND_PARAM), 0, SHARED},
    {"wind.from", D(ANGLE), 0, R(ANY), 1, SPEC(wind.from_deg), W(WIND_PARAM), 0, SHARED},
    {"wind.reference_height", D(LENGTH), 0, R(POSITIVE), 0, SPEC(wind.ref_height_m), W(WIND_REF), 0,
     SHARED | CHECKED},
    {"wind.exponent", D(NONE), 0, R(UNIT), 0, SPEC(wind.exponent), W(WIND_POWER), 0, SHARED},
    {"wind.roughness", D(LENGTH), 0, R(POSITIVE), 0, SPEC(wind.roughness_m), W(WIND_LOG), 0,
     SHARED | CHECKED},
    {"wind.turbulence.w20", D(SPEED), 0, R(SUBSONIC_NONNEG), 0, SPEC(turbulence.w20_m_s), W(ALWAYS), 0,
     SHARED},
    {"wind.table[].height", D(LENGTH), 0, R(NONNEG), 0, ROW, W(WIND_TABLE), 0, SHARED | CHECKED},
    {"wind.table[].speed", D(SPEED), 0, R(SUBSONIC_NONNEG), 0, ROW, W(WIND_TABLE), 0, SHARED},
    {"wind.table[].from", D(ANGLE), 0, R(ANY), 1, ROW, W(WIND_TABLE), 0, SHARED},
    {"zone.samples", D(NONE), 1, R(ANY), 0, ZONE, W(ALWAYS), 0, 0},
    {"zone.seed", D(NONE), 1, R(ANY), 0, ZONE, W(ALWAYS), 0, 0},
    {"zone.confidence", D(FRACTION), 0, R(UNIT_OPEN), 0, ZONE, W(ALWAYS), 0, 0},
    {"zone.scatter", D(LENGTH), 0, R(NONNEG), 0, ZONE, W(ALWAYS), 0, 0},
    {"zone.target.east", D(LENGTH), 0, R(ANY), 0, ZONE, W(ALWAYS), 0, 0},
    {"zone.target.north", D(LENGTH), 0, R(ANY), 0, ZONE, W(ALWAYS), 0, 0},
    {"zone.target.latitude", D(ANGLE), 0, R(LATITUDE), 0, ZONE, W(ALWAYS), 0, 0},
    {"zone.target.longitude", D(ANGLE), 0, R(LONGITUDE), 0, ZONE, W(ALWAYS), 0, 0},
};

/* a row added or removed here is added or removed in plumbp_key_id too */
_Static_assert(sizeof plumbp_key_table / sizeof plumbp_key_table[0] == PLUMBP_K_COUNT,
               "one plumbp_key_id per row of the key table");

const plumbp_key *plumbp_keys(size_t *n)
{
    *n = PLUMBP_K_COUNT;
    return plumbp_key_table;
}

/* Writes the general form of key into out: items[..] -> payload, a
 * descent's [i] dropped (its index into *device), other [i] -> []. */
static int general_form(const char *key, char *out, size_t size, size_t *device, long *item)
{
    size_t o = 0;
    const char *p = key;
    *device = 0;
    *item = -1;
    if (strncmp(p, "items[", 6) == 0) {
        const char *close = strchr(p, ']');
        if (!close || close[1] != '.')
            return 0;
        long n = 0;
        int digits = 1;
        for (const char *q = p + 6; q < close; q++) {
            if (*q < '0' || *q > '9') {
                digits = 0;
                break;
            }
            n = n * 10 + (*q - '0');
            if (n > 1000000)
                return 0;
        }
        *item = digits && close > p + 6 ? n - 1 : -2;
        if (*item == -1)
            return 0; /* items[0] */
        o = (size_t)snprintf(out, size, "payload");
        p = close + 1;
    }
    while (*p && o + 3 < size) {
        if (*p == '[') {
            const char *close = strchr(p, ']');
            if (!close)
                return 0;
            size_t idx = 0;
            for (const char *q = p + 1; q < close; q++) {
                if (*q < '0' || *q > '9')
                    return 0;
                idx = idx * 10 + (size_t)(*q - '0');
                if (idx > 1000000)
                    return 0;
            }
            if (close == p + 1)
                return 0;
            if (o >= 7 && strncmp(out + o - 7, "descent", 7) == 0) {
                *device = idx;
            } else {
                out[o++] = '[';
                out[o++] = ']';
            }
            p = close + 1;
            continue;
        }
        out[o++] = *p++;
    }
    if (*p)
        return 0;
    out[o] = '\0';
    /* an item's own descent is the descent of its fall */
    if (strncmp(out, "payload.descent.", 16) == 0)
        memmove(out, out + 8, strlen(out + 8) + 1);
    return 1;
}

const plumbp_key *plumbp_key_find(const char *key, size_t *device, long *item)
{
    char g[PLUMB_DIAG_KEY];
    size_t dev_dummy;
    long item_dummy;
    if (!device)
        device = &dev_dummy;
    if (!item)
        item = &item_dummy;
    if (!key || !general_form(key, g, sizeof g, device, item))
        return NULL;
    for (size_t i = 0; i < PLUMBP_K_COUNT; i++)
        if (strcmp(plumbp_key_table[i].key, g) == 0)
            return &plumbp_key_table[i];
    return NULL;
}

int plumbp_key_applies(const plumbp_key *k, const plumb_fall_spec *s,
                       const plumb_shape_spec *shape, const plumb_atm_spec *atm, size_t device)
{
    const plumb_descent_spec *d = s && device < s->n_descent ? &s->descent[device] : NULL;
    int fixed = s && s->drag.model == PLUMB_DRAG_FIXED, by_area = s && s->drag.area_m2 > 0.0;
    plumb_wind_profile wp = s ? s->wind.profile : PLUMB_WIND_UNIFORM;
    switch (k->when) {
    case PLUMBP_WHEN_ALWAYS: return 1;
    case PLUMBP_WHEN_CD_AND_AREA: return fixed && by_area;
    case PLUMBP_WHEN_CD_AREA: return fixed && !by_area;
    case PLUMBP_WHEN_SPHERE_DRAG: return s && !fixed;
    case PLUMBP_WHEN_SHAPE:
        return shape && shape->kind != PLUMB_SHAPE_NONE &&
               (k->shapes & PLUMBP_SHAPE_BIT(shape->kind)) != 0;
    case PLUMBP_WHEN_DEVICE: return d != NULL;
    case PLUMBP_WHEN_DEPLOY_AFTER: return d && d->trigger == PLUMB_DEPLOY_AFTER;
    case PLUMBP_WHEN_DEPLOY_BELOW: return d && d->trigger == PLUMB_DEPLOY_BELOW;
    case PLUMBP_WHEN_FILL_TIME: return d && !(d->fill_constant > 0.0);
    case PLUMBP_WHEN_FILL_CONSTANT: return d && d->fill_constant > 0.0;
    case PLUMBP_WHEN_LATITUDE: return s && s->gravity.has_latitude;
    case PLUMBP_WHEN_WIND_PARAM: return s && wp != PLUMB_WIND_TABLE;
    case PLUMBP_WHEN_WIND_REF: return s && (wp == PLUMB_WIND_POWER || wp == PLUMB_WIND_LOG);
    case PLUMBP_WHEN_WIND_POWER: return s && wp == PLUMB_WIND_POWER;
    case PLUMBP_WHEN_WIND_LOG: return s && wp == PLUMB_WIND_LOG;
    case PLUMBP_WHEN_WIND_TABLE: return s && wp == PLUMB_WIND_TABLE;
    case PLUMBP_WHEN_AIR_OFFSET:
        return atm && (atm->model == PLUMB_ATM_STD1976 ||
                       (atm->model == PLUMB_ATM_TABLE && !atm->table_t_k));
    case PLUMBP_WHEN_AIR_SURFACE: return atm && atm->model == PLUMB_ATM_SURFACE;
    case PLUMBP_WHEN_AIR_TABLE: return atm && atm->model == PLUMB_ATM_TABLE;
    }
    return 0;
}

double *plumbp_key_field(const plumbp_key *k, plumb_fall_spec *spec, plumb_atm_spec *atm,
                         size_t device)
{
    if (!plumbp_key_applies(k, spec, NULL, atm, device))
        return NULL;
    switch (k->home) {
    case PLUMBP_HOME_SPEC:
        return spec ? (double *)(void *)((char *)spec + k->offset) : NULL;
    case PLUMBP_HOME_DEVICE:
        return spec && device < spec->n_descent
                   ? (double *)(void *)((char *)&spec->descent[device] + k->offset)
                   : NULL;
    case PLUMBP_HOME_AIR:
        return atm ? (double *)(void *)((char *)atm + k->offset) : NULL;
    default:
        return NULL;
    }
}

void plumbp_key_bounds(const plumbp_key *k, double *lo, double *hi, int *lo_open)
{
    int hi_open; /* only zone.confidence has one, and no sampler draws it */
    plumby_range_bounds(k->range, lo, hi, lo_open, &hi_open);
}
