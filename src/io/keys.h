/*
 * io/keys.h - the one table of numeric profile keys (internal to the
 * library; not installed).
 *
 * Every numeric key a profile accepts is described once, in src/io/keys.c:
 * its dotted key, its dimension, its allowed range, where it lives in a
 * resolved plumb_fall_spec (or the atmosphere spec), when it applies to a
 * given spec, and what else changes when it changes. Nothing else gives a
 * key's dimension or range: the profile loader's schema (profile_schema.c)
 * names, at each numeric leaf, the row of its key (plumbp_key_id), and
 * the checker and readers (yamltree_schema.c), --set and the uncertainty
 * block take the dimension and range from that row. The rows are bound at
 * build time, so loading costs no lookup; tests/test_keys.c fails when a
 * leaf names a row of another key, a key the loader accepts has no row, or
 * a row is a key the loader does not accept. plumb_fall_spec_field, the
 * zone's sampler ranges (dispersion_sampler.c) and the limit's scan
 * (inverse.c) read the table by key (plumbp_key_find); the sweep and the
 * limit set a key on copies of a resolved profile by it (io/vary.h).
 *
 * Keys are written in their general form: an inventory's items[N].X is
 * payload.X; descent[i].X is descent.X; a list's rows are "[]"
 * (atmosphere.table[].density, payload.shape.edges[]).
 */
#ifndef PLUMB_IO_KEYS_H
#define PLUMB_IO_KEYS_H

#include <stddef.h>
#include "plumb/atmosphere.h"
#include "plumb/trajectory.h"
#include "plumb/units.h"
#include "io/yamltree.h"

/* Where a key's value lives once the profile is resolved. */
typedef enum plumbp_key_home {
    PLUMBP_HOME_SPEC = 0,   /* the double at `offset` in plumb_fall_spec */
    PLUMBP_HOME_DEVICE,     /* the double at `offset` in the addressed plumb_descent_spec */
    PLUMBP_HOME_AIR,        /* the double at `offset` in plumb_atm_spec */
    PLUMBP_HOME_SHAPE,      /* plumb_shape_spec.dims_m[`offset`], for the shapes in `when` */
    PLUMBP_HOME_DERIVED,    /* kept only through what it implies (speed, heading, diameters) */
    PLUMBP_HOME_ROW,        /* a row of a table (atmosphere, wind, shape edges) */
    PLUMBP_HOME_ZONE        /* a zone setting, not an input of the fall */
} plumbp_key_home;

/* When a key applies to a resolved spec (plumbp_key_applies). */
typedef enum plumbp_key_when {
    PLUMBP_WHEN_ALWAYS = 0,
    PLUMBP_WHEN_CD_AND_AREA,    /* fixed drag given as cd and area */
    PLUMBP_WHEN_CD_AREA,        /* fixed drag given as cd_area */
    PLUMBP_WHEN_SPHERE_DRAG,    /* a sphere drag model (diameter) */
    PLUMBP_WHEN_SHAPE,          /* a shape: `shape` bits say which kinds */
    PLUMBP_WHEN_DEVICE,         /* a descent device exists at the index */
    PLUMBP_WHEN_DEPLOY_AFTER,   /* ... deployed after a time */
    PLUMBP_WHEN_DEPLOY_BELOW,   /* ... deployed below a height */
    PLUMBP_WHEN_FILL_TIME,      /* ... opening over a fill time */
    PLUMBP_WHEN_FILL_CONSTANT,  /* ... opening by a fill constant */
    PLUMBP_WHEN_LATITUDE,       /* gravity at a latitude */
    PLUMBP_WHEN_WIND_PARAM,     /* a wind profile other than table */
    PLUMBP_WHEN_WIND_REF,       /* power or log wind */
    PLUMBP_WHEN_WIND_POWER,
    PLUMBP_WHEN_WIND_LOG,
    PLUMBP_WHEN_WIND_TABLE,
    PLUMBP_WHEN_AIR_OFFSET,     /* standard-1976, or a table without temperatures */
    PLUMBP_WHEN_AIR_SURFACE,    /* the surface model */
    PLUMBP_WHEN_AIR_TABLE
} plumbp_key_when;

/* What else changes when the key changes (bits). */
enum {
    PLUMBP_KEY_AIR = 1u << 0,       /* the atmosphere is rebuilt */
    PLUMBP_KEY_DRAG = 1u << 1,      /* the body's drag is derived again (shape, sphere diameter,
                                       cd x area and its source text) */
    PLUMBP_KEY_AREA = 1u << 2,      /* a canopy's area is derived again from its diameter */
    PLUMBP_KEY_VELOCITY = 1u << 3,  /* the release velocity is derived again (speed, heading) */
    PLUMBP_KEY_SHARED = 1u << 4,    /* the same for every item (release, site, air, wind) */
    PLUMBP_KEY_CHECKED = 1u << 5,   /* checked against other keys by the loader (release
                                       height, deploy heights, the air's temperature, the
                                       inflation exponent's top): a varied copy is checked
                                       again the same way (io/vary.h) */
    PLUMBP_KEY_GLIDE = 1u << 6,     /* a plate's glide taken from its shape is derived again
                                       (its I* from the mass) */
    PLUMBP_KEY_STATION = 1u << 7,   /* the surface air's station altitude follows it */
    PLUMBP_KEY_LOADER = 1u << 8     /* varied only through the loader: it places other
                                       values (points given by latitude and longitude) */
};

/* Shape kinds for PLUMBP_WHEN_SHAPE (bits of plumb_shape_kind). */
#define PLUMBP_SHAPE_BIT(k) (1u << (unsigned)(k))

typedef struct plumbp_key {
    const char *key;          /* general dotted form (see the file comment) */
    plumb_dim dim;            /* SI dimension; NONE for a number or a count */
    int count;                /* 1: a whole number (zone.samples, zone.seed) */
    plumby_range range;       /* allowed range, as the loader checks it */
    int angle;                /* 1: degrees, sampled wrapped into [0, 360) */
    plumbp_key_home home;     /* where the value lives */
    size_t offset;            /* SPEC, DEVICE, AIR: byte offset; SHAPE: index of dims_m */
    plumbp_key_when when;     /* when it applies */
    unsigned shapes;          /* WHEN_SHAPE: PLUMBP_SHAPE_BIT of each kind that takes it */
    unsigned effects;         /* PLUMBP_KEY_* */
} plumbp_key;

/* The rows of the table, in its order: PLUMBP_K_ and the general key in
 * capitals, "." as "_", "[]" left out. A schema leaf names its key by
 * this id (profile_schema.c); keys.c refuses to build when the table has
 * another number of rows, and tests/test_keys.c checks each id against
 * its row's key. */
typedef enum plumbp_key_id {
    PLUMBP_K_PAYLOAD_MASS, PLUMBP_K_PAYLOAD_VOLUME, PLUMBP_K_PAYLOAD_DRAG_CD,
    PLUMBP_K_PAYLOAD_DRAG_AREA, PLUMBP_K_PAYLOAD_DRAG_CD_AREA, PLUMBP_K_PAYLOAD_DRAG_DIAMETER,
    PLUMBP_K_PAYLOAD_SHAPE_DIAMETER, PLUMBP_K_PAYLOAD_SHAPE_LENGTH, PLUMBP_K_PAYLOAD_SHAPE_EDGES,
    PLUMBP_K_PAYLOAD_SHAPE_THICKNESS,
    PLUMBP_K_DESCENT_CD, PLUMBP_K_DESCENT_AREA, PLUMBP_K_DESCENT_DIAMETER,
    PLUMBP_K_DESCENT_DEPLOY_AFTER, PLUMBP_K_DESCENT_DEPLOY_BELOW, PLUMBP_K_DESCENT_FILL_TIME,
    PLUMBP_K_DESCENT_FILL_CONSTANT, PLUMBP_K_DESCENT_INFLATION_EXPONENT,
    PLUMBP_K_DESCENT_OPENING_FACTOR,
    PLUMBP_K_RELEASE_HEIGHT, PLUMBP_K_RELEASE_VELOCITY_EAST, PLUMBP_K_RELEASE_VELOCITY_NORTH,
    PLUMBP_K_RELEASE_VELOCITY_UP, PLUMBP_K_RELEASE_VELOCITY_SPEED,
    PLUMBP_K_RELEASE_VELOCITY_HEADING, PLUMBP_K_RELEASE_VELOCITY_CLIMB,
    PLUMBP_K_RELEASE_DOWNWASH_AIRCRAFT_MASS, PLUMBP_K_RELEASE_DOWNWASH_DISK_AREA,
    PLUMBP_K_RELEASE_POSITION_EAST, PLUMBP_K_RELEASE_POSITION_NORTH,
    PLUMBP_K_RELEASE_POSITION_LATITUDE, PLUMBP_K_RELEASE_POSITION_LONGITUDE,
    PLUMBP_K_SITE_ELEVATION, PLUMBP_K_SITE_LATITUDE, PLUMBP_K_SITE_LONGITUDE,
    PLUMBP_K_ATMOSPHERE_TEMPERATURE_OFFSET, PLUMBP_K_ATMOSPHERE_PRESSURE,
    PLUMBP_K_ATMOSPHERE_TEMPERATURE, PLUMBP_K_ATMOSPHERE_LAPSE_RATE,
    PLUMBP_K_ATMOSPHERE_HUMIDITY, PLUMBP_K_ATMOSPHERE_TABLE_ALTITUDE,
    PLUMBP_K_ATMOSPHERE_TABLE_DENSITY, PLUMBP_K_ATMOSPHERE_TABLE_TEMPERATURE,
    PLUMBP_K_WIND_SPEED, PLUMBP_K_WIND_FROM, PLUMBP_K_WIND_REFERENCE_HEIGHT,
    PLUMBP_K_WIND_EXPONENT, PLUMBP_K_WIND_ROUGHNESS, PLUMBP_K_WIND_TURBULENCE_W20,
    PLUMBP_K_WIND_TABLE_HEIGHT, PLUMBP_K_WIND_TABLE_SPEED, PLUMBP_K_WIND_TABLE_FROM,
    PLUMBP_K_ZONE_SAMPLES, PLUMBP_K_ZONE_SEED, PLUMBP_K_ZONE_CONFIDENCE, PLUMBP_K_ZONE_SCATTER,
    PLUMBP_K_ZONE_TARGET_EAST, PLUMBP_K_ZONE_TARGET_NORTH, PLUMBP_K_ZONE_TARGET_LATITUDE,
    PLUMBP_K_ZONE_TARGET_LONGITUDE,
    PLUMBP_K_COUNT /* rows in the table */
} plumbp_key_id;

/* The table itself: PLUMBP_K_COUNT rows, the row of each id at that index;
 * declared for the schema's leaves, which name their row by address
 * (&plumbp_key_table[PLUMBP_K_...]). Elsewhere use plumbp_keys or
 * plumbp_key_find. */
extern const plumbp_key plumbp_key_table[];

/* The table: *n entries. Can't fail. */
const plumbp_key *plumbp_keys(size_t *n);

/* The entry of a key in any written form ("items[2].mass", "items[box].mass",
 * "descent[1].cd", "wind.table[3].speed"), or NULL. *device is the descent
 * index it addresses (0 when none), *item the items[N] index (counting
 * from 0; -1 for none, -2 for a named item). Can't fail. */
const plumbp_key *plumbp_key_find(const char *key, size_t *device, long *item);

/* 1 when the key is an input of this spec as resolved (see `when`). */
int plumbp_key_applies(const plumbp_key *k, const plumb_fall_spec *spec,
                       const plumb_shape_spec *shape, const plumb_atm_spec *atm, size_t device);

/* The double the key sets in spec (SPEC, DEVICE) or atm (AIR) when it
 * applies, else NULL. spec or atm may be NULL when not needed. */
double *plumbp_key_field(const plumbp_key *k, plumb_fall_spec *spec, plumb_atm_spec *atm,
                         size_t device);

/* Lower and upper bound of the key's range, SI; *lo_open 1 when lo itself
 * is refused. Can't fail. */
void plumbp_key_bounds(const plumbp_key *k, double *lo, double *hi, int *lo_open);

/* The profile loader's schema (profile_schema.c), for tests/test_keys.c. */
const plumby_schema *plumbp_profile_schema(void);

#endif /* PLUMB_IO_KEYS_H */
