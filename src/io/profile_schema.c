/*
 * profile_schema.c - the schema of a payload profile (design.md section
 * 5): every key, its kind of value, its dimension and range, and the
 * words it takes. plumby_check (yamltree_schema.c) holds a profile to it;
 * the key table (src/io/keys.c, tests/test_keys.c) and the README's
 * "Profile keys" table describe the same keys.
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

#define S_NUM(n, d, r) {n, PLUMBY_T_NUM, PLUMB_DIM_##d, PLUMBY_R_##r, NULL, 0, NULL, 0}
#define S_COUNT(n) {n, PLUMBY_T_COUNT, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, NULL, 0}
#define S_WORD(n, w) {n, PLUMBY_T_WORD, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, w, ARRAY_LEN(w)}
#define S_TEXT(n) {n, PLUMBY_T_TEXT, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, NULL, 0}
#define S_MAP(n, c) {n, PLUMBY_T_MAP, PLUMB_DIM_NONE, PLUMBY_R_ANY, c, ARRAY_LEN(c), NULL, 0}
#define S_LIST(n, item) {n, PLUMBY_T_LIST, PLUMB_DIM_NONE, PLUMBY_R_ANY, item, 1, NULL, 0}
#define S_MAP_OR_LIST(n, c) \
    {n, PLUMBY_T_MAP_OR_LIST, PLUMB_DIM_NONE, PLUMBY_R_ANY, c, ARRAY_LEN(c), NULL, 0}
#define S_FREE_MAP(n) {n, PLUMBY_T_FREE_MAP, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, NULL, 0}

static const plumby_schema drag_keys[] = {
    S_NUM("cd", NONE, CD),          S_NUM("area", AREA, POSITIVE),
    S_NUM("cd_area", AREA, NONNEG), S_WORD("model", drag_models),
    S_NUM("diameter", LENGTH, POSITIVE), S_TEXT("source"),
};
const plumby_schema plumbp_profile_edge_item[] = {S_NUM("", LENGTH, POSITIVE)};
static const plumby_schema shape_keys[] = {
    S_WORD("kind", shape_kinds),         S_NUM("diameter", LENGTH, POSITIVE),
    S_NUM("length", LENGTH, POSITIVE),   S_LIST("edges", plumbp_profile_edge_item),
    S_NUM("thickness", LENGTH, POSITIVE), S_WORD("attitude", attitudes),
};
static const plumby_schema deploy_keys[] = {
    S_NUM("after", TIME, NONNEG),
    S_NUM("below", LENGTH, POSITIVE),
};
static const plumby_schema descent_keys[] = {
    S_WORD("kind", descent_kinds),     S_NUM("cd", NONE, CD_POSITIVE),
    S_NUM("area", AREA, POSITIVE),     S_NUM("diameter", LENGTH, POSITIVE),
    S_MAP("deploy", deploy_keys),      S_NUM("fill_time", TIME, NONNEG),
    S_NUM("fill_constant", NONE, POSITIVE),
    S_WORD("canopy", canopy_kinds),    S_NUM("inflation_exponent", NONE, POSITIVE),
    S_NUM("opening_factor", NONE, POSITIVE),
};
static const plumby_schema payload_keys[] = {
    S_NUM("mass", MASS, POSITIVE), S_NUM("volume", VOLUME, NONNEG),
    S_MAP("drag", drag_keys),      S_MAP("shape", shape_keys),
    S_WORD("glide", glide_words),
};
static const plumby_schema item_keys[] = {
    S_TEXT("name"),           S_NUM("mass", MASS, POSITIVE),
    S_NUM("volume", VOLUME, NONNEG), S_MAP("drag", drag_keys),
    S_MAP("shape", shape_keys), S_MAP_OR_LIST("descent", descent_keys),
    S_WORD("glide", glide_words),
};
static const plumby_schema item_item[] = {S_MAP("", item_keys)};
static const plumby_schema velocity_keys[] = {
    S_NUM("east", SPEED, ANY),       S_NUM("north", SPEED, ANY),
    S_NUM("up", SPEED, ANY),         S_NUM("speed", SPEED, NONNEG),
    S_NUM("heading", ANGLE, ANY),    S_NUM("climb", SPEED, ANY),
};
static const plumby_schema position_keys[] = {
    S_NUM("east", LENGTH, ANY),
    S_NUM("north", LENGTH, ANY),
    S_NUM("latitude", ANGLE, LATITUDE),
    S_NUM("longitude", ANGLE, LONGITUDE),
};
static const plumby_schema downwash_keys[] = {
    S_NUM("aircraft_mass", MASS, POSITIVE),
    S_NUM("disk_area", AREA, POSITIVE),
};
static const plumby_schema release_keys[] = {
    S_NUM("height", LENGTH, POSITIVE),
    S_MAP("velocity", velocity_keys),
    S_MAP("position", position_keys),
    S_MAP("downwash", downwash_keys),
};
static const plumby_schema site_keys[] = {
    S_NUM("elevation", LENGTH, ALTITUDE),
    S_NUM("latitude", ANGLE, LATITUDE),
    S_NUM("longitude", ANGLE, LONGITUDE),
};
static const plumby_schema atm_row_keys[] = {
    S_NUM("altitude", LENGTH, ALTITUDE),
    S_NUM("density", DENSITY, POSITIVE),
    S_NUM("temperature", TEMPERATURE, POSITIVE),
};
const plumby_schema plumbp_profile_atm_row_item[] = {S_MAP("", atm_row_keys)};
static const plumby_schema atm_keys[] = {
    S_WORD("model", atm_models),
    S_NUM("temperature_offset", TEMP_DIFF, ANY),
    S_NUM("pressure", PRESSURE, POSITIVE),
    S_NUM("temperature", TEMPERATURE, POSITIVE),
    S_NUM("lapse_rate", LAPSE, ANY),
    S_NUM("humidity", FRACTION, UNIT),
    S_LIST("table", plumbp_profile_atm_row_item),
};
static const plumby_schema wind_row_keys[] = {
    S_NUM("height", LENGTH, NONNEG),
    S_NUM("speed", SPEED, NONNEG),
    S_NUM("from", ANGLE, ANY),
};
const plumby_schema plumbp_profile_wind_row_item[] = {S_MAP("", wind_row_keys)};
static const char *const turb_models[] = {"dryden", "von-karman"};
static const char *const turb_words[] = {"light", "moderate", "severe"};
static const plumby_schema turb_keys[] = {
    S_WORD("model", turb_models),
    S_WORD("intensity", turb_words),
    S_NUM("w20", SPEED, NONNEG),
};
static const plumby_schema wind_keys[] = {
    S_WORD("profile", wind_profiles),       S_NUM("speed", SPEED, NONNEG),
    S_NUM("from", ANGLE, ANY),              S_NUM("reference_height", LENGTH, POSITIVE),
    S_NUM("exponent", NONE, UNIT),          S_NUM("roughness", LENGTH, POSITIVE),
    S_LIST("table", plumbp_profile_wind_row_item),
    S_MAP("turbulence", turb_keys),
};
static const plumby_schema criteria_item[] = {
    {"", PLUMBY_T_WORD, PLUMB_DIM_NONE, PLUMBY_R_ANY, NULL, 0, NULL, 0}};
static const plumby_schema target_keys[] = {
    S_NUM("east", LENGTH, ANY),
    S_NUM("north", LENGTH, ANY),
    S_NUM("latitude", ANGLE, LATITUDE),
    S_NUM("longitude", ANGLE, LONGITUDE),
};
static const plumby_schema zone_keys[] = {
    S_COUNT("samples"), S_COUNT("seed"),
    S_NUM("confidence", FRACTION, UNIT_OPEN), S_NUM("scatter", LENGTH, NONNEG),
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
