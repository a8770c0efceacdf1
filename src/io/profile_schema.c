/*
 * profile_schema.c - the schema of a payload profile (README.md
 * "Profiles"): every key, its kind of value and the words it takes. A
 * numeric key is not described here: its leaf names its row of the one
 * key table (src/io/keys.c), which gives its dimension and range;
 * tests/test_keys.c checks that every numeric leaf names the row of its
 * own key and that every row is reached from here. plumby_check
 * (yamltree_schema.c) holds a profile to the schema; the README's
 * "Profile keys" table documents the same keys for users.
 */
#include <stddef.h>

#include "io/profile_int.h"

/* ---- the schema -------------------------------------------------------- */

static const char *const drag_models[] = {"fixed", "sphere", "sphere-cgw"};
static const char *const shape_kinds[] = {"sphere", "cylinder", "box", "plate"};
static const char *const attitudes[] = {"tumbling", "broadside", "end-on"};
static const char *const descent_kinds[] = {"parachute", "streamer", "drogue"};
/* the words of plumb_canopy, in its order after PLUMB_CANOPY_UNSPECIFIED */
static const char *const canopy_kinds[] = {"flat-circular", "conical", "hemispherical",
                                           "extended-skirt", "cross", "ribbon",
                                           "ringslot", "ringsail"};
static const char *const glide_words[] = {"auto", "tumble", "flutter", "off"};
static const char *const atm_models[] = {"standard-1976", "surface", "table"};
static const char *const wind_profiles[] = {"uniform", "power", "log", "table"};

/* A numeric leaf names its row of the key table (io/keys.h), which gives its
 * dimension and range: S_NUM("mass", PAYLOAD_MASS) is payload.mass. */
#define KEY_ROW(k) (&plumbp_key_table[PLUMBP_K_##k])
#define S_NUM(n, k) {.name = n, .type = PLUMBY_T_NUM, .key = KEY_ROW(k)}
#define S_COUNT(n, k) {.name = n, .type = PLUMBY_T_COUNT, .key = KEY_ROW(k)}
#define S_WORD(n, w) {.name = n, .type = PLUMBY_T_WORD, .words = w, .n_words = ARRAY_LEN(w)}
#define S_TEXT(n) {.name = n, .type = PLUMBY_T_TEXT}
#define S_MAP(n, c) {.name = n, .type = PLUMBY_T_MAP, .sub = c, .n_sub = ARRAY_LEN(c)}
#define S_LIST(n, item) {.name = n, .type = PLUMBY_T_LIST, .sub = item, .n_sub = 1}
#define S_MAP_OR_LIST(n, c) \
    {.name = n, .type = PLUMBY_T_MAP_OR_LIST, .sub = c, .n_sub = ARRAY_LEN(c)}
#define S_FREE_MAP(n) {.name = n, .type = PLUMBY_T_FREE_MAP}

static const plumby_schema drag_keys[] = {
    S_NUM("cd", PAYLOAD_DRAG_CD),
    S_NUM("area", PAYLOAD_DRAG_AREA),
    S_NUM("cd_area", PAYLOAD_DRAG_CD_AREA),
    S_WORD("model", drag_models),
    S_NUM("diameter", PAYLOAD_DRAG_DIAMETER),
    S_TEXT("source"),
};
const plumby_schema plumbp_profile_edge_item[] = {S_NUM("", PAYLOAD_SHAPE_EDGES)};
static const plumby_schema shape_keys[] = {
    S_WORD("kind", shape_kinds),
    S_NUM("diameter", PAYLOAD_SHAPE_DIAMETER),
    S_NUM("length", PAYLOAD_SHAPE_LENGTH),
    S_LIST("edges", plumbp_profile_edge_item),
    S_NUM("thickness", PAYLOAD_SHAPE_THICKNESS),
    S_WORD("attitude", attitudes),
};
static const plumby_schema deploy_keys[] = {
    S_NUM("after", DESCENT_DEPLOY_AFTER),
    S_NUM("below", DESCENT_DEPLOY_BELOW),
};
static const plumby_schema descent_keys[] = {
    S_WORD("kind", descent_kinds),
    S_NUM("cd", DESCENT_CD),
    S_NUM("area", DESCENT_AREA),
    S_NUM("diameter", DESCENT_DIAMETER),
    S_MAP("deploy", deploy_keys),
    S_NUM("fill_time", DESCENT_FILL_TIME),
    S_NUM("fill_constant", DESCENT_FILL_CONSTANT),
    S_WORD("canopy", canopy_kinds),
    S_NUM("inflation_exponent", DESCENT_INFLATION_EXPONENT),
    S_NUM("opening_factor", DESCENT_OPENING_FACTOR),
};
static const plumby_schema payload_keys[] = {
    S_NUM("mass", PAYLOAD_MASS),
    S_NUM("volume", PAYLOAD_VOLUME),
    S_MAP("drag", drag_keys),
    S_MAP("shape", shape_keys),
    S_WORD("glide", glide_words),
};
static const plumby_schema item_keys[] = {
    S_TEXT("name"),
    S_NUM("mass", PAYLOAD_MASS), /* an item's keys are payload's in the key table */
    S_NUM("volume", PAYLOAD_VOLUME),
    S_MAP("drag", drag_keys),
    S_MAP("shape", shape_keys),
    S_MAP_OR_LIST("descent", descent_keys),
    S_WORD("glide", glide_words),
};
static const plumby_schema item_item[] = {S_MAP("", item_keys)};
static const plumby_schema velocity_keys[] = {
    S_NUM("east", RELEASE_VELOCITY_EAST),
    S_NUM("north", RELEASE_VELOCITY_NORTH),
    S_NUM("up", RELEASE_VELOCITY_UP),
    S_NUM("speed", RELEASE_VELOCITY_SPEED),
    S_NUM("heading", RELEASE_VELOCITY_HEADING),
    S_NUM("climb", RELEASE_VELOCITY_CLIMB),
};
static const plumby_schema position_keys[] = {
    S_NUM("east", RELEASE_POSITION_EAST),
    S_NUM("north", RELEASE_POSITION_NORTH),
    S_NUM("latitude", RELEASE_POSITION_LATITUDE),
    S_NUM("longitude", RELEASE_POSITION_LONGITUDE),
};
static const plumby_schema downwash_keys[] = {
    S_NUM("aircraft_mass", RELEASE_DOWNWASH_AIRCRAFT_MASS),
    S_NUM("disk_area", RELEASE_DOWNWASH_DISK_AREA),
};
static const plumby_schema release_keys[] = {
    S_NUM("height", RELEASE_HEIGHT),
    S_MAP("velocity", velocity_keys),
    S_MAP("position", position_keys),
    S_MAP("downwash", downwash_keys),
};
static const plumby_schema site_keys[] = {
    S_NUM("elevation", SITE_ELEVATION),
    S_NUM("latitude", SITE_LATITUDE),
    S_NUM("longitude", SITE_LONGITUDE),
};
static const plumby_schema atm_row_keys[] = {
    S_NUM("altitude", ATMOSPHERE_TABLE_ALTITUDE),
    S_NUM("density", ATMOSPHERE_TABLE_DENSITY),
    S_NUM("temperature", ATMOSPHERE_TABLE_TEMPERATURE),
};
const plumby_schema plumbp_profile_atm_row_item[] = {S_MAP("", atm_row_keys)};
static const plumby_schema atm_keys[] = {
    S_WORD("model", atm_models),
    S_NUM("temperature_offset", ATMOSPHERE_TEMPERATURE_OFFSET),
    S_NUM("pressure", ATMOSPHERE_PRESSURE),
    S_NUM("temperature", ATMOSPHERE_TEMPERATURE),
    S_NUM("lapse_rate", ATMOSPHERE_LAPSE_RATE),
    S_NUM("humidity", ATMOSPHERE_HUMIDITY),
    S_LIST("table", plumbp_profile_atm_row_item),
};
static const plumby_schema wind_row_keys[] = {
    S_NUM("height", WIND_TABLE_HEIGHT),
    S_NUM("speed", WIND_TABLE_SPEED),
    S_NUM("from", WIND_TABLE_FROM),
};
const plumby_schema plumbp_profile_wind_row_item[] = {S_MAP("", wind_row_keys)};
static const char *const turb_models[] = {"dryden", "von-karman"};
static const char *const turb_words[] = {"light", "moderate", "severe"};
static const plumby_schema turb_keys[] = {
    S_WORD("model", turb_models),
    S_WORD("intensity", turb_words),
    S_NUM("w20", WIND_TURBULENCE_W20),
};
static const plumby_schema wind_keys[] = {
    S_WORD("profile", wind_profiles),
    S_NUM("speed", WIND_SPEED),
    S_NUM("from", WIND_FROM),
    S_NUM("reference_height", WIND_REFERENCE_HEIGHT),
    S_NUM("exponent", WIND_EXPONENT),
    S_NUM("roughness", WIND_ROUGHNESS),
    S_LIST("table", plumbp_profile_wind_row_item),
    S_MAP("turbulence", turb_keys),
};
static const plumby_schema criteria_item[] = {{.name = "", .type = PLUMBY_T_WORD}};
static const plumby_schema target_keys[] = {
    S_NUM("east", ZONE_TARGET_EAST),
    S_NUM("north", ZONE_TARGET_NORTH),
    S_NUM("latitude", ZONE_TARGET_LATITUDE),
    S_NUM("longitude", ZONE_TARGET_LONGITUDE),
};
static const plumby_schema zone_keys[] = {
    S_COUNT("samples", ZONE_SAMPLES),
    S_COUNT("seed", ZONE_SEED),
    S_NUM("confidence", ZONE_CONFIDENCE),
    S_NUM("scatter", ZONE_SCATTER),
    S_MAP("target", target_keys),
};
static const plumby_schema job_keys[] = {
    S_TEXT("title"),       S_TEXT("site"),       S_TEXT("reference"),
    S_TEXT("prepared_by"), S_TEXT("checked_by"),
};
static const plumby_schema root_keys[] = {
    S_TEXT("name"),
    S_MAP("job", job_keys),
    S_MAP("payload", payload_keys),
    S_LIST("items", item_item),
    S_MAP_OR_LIST("descent", descent_keys),
    S_MAP("release", release_keys),
    S_MAP("site", site_keys),
    S_MAP("atmosphere", atm_keys),
    S_MAP("wind", wind_keys),
    S_LIST("criteria", criteria_item),
    S_FREE_MAP("uncertainty"),
    S_MAP("zone", zone_keys),
};
static const plumby_schema root_schema = S_MAP("", root_keys);

const plumby_schema *plumbp_profile_schema(void)
{
    return &root_schema;
}
