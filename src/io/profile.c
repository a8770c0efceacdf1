/*
 * profile.c - strict YAML payload profiles into fall specs (design.md
 * section 5; the numeric keys are described once in the key table,
 * src/io/keys.c, which tests/test_keys.c holds to the schema below; the
 * README's "Profile keys" table documents them for users).
 *
 * Method: the file is read whole (at most PLUMB_PROFILE_MAX_BYTES),
 * fingerprinted with SHA-256 (FIPS 180-4, sha256.c), parsed into a node
 * tree with positions (yamltree.c, on libyaml), overridden by `--set`
 * KEY=VALUE documents, checked against the schema below (unknown keys
 * with a did-you-mean, kinds of value), then interpreted: units through
 * udunits2 (units.c), ranges, required keys, the keys each model uses.
 * Conversions:
 *   release velocity (speed s, heading h clockwise from north, climb c):
 *       east = s sin h, north = s cos h, up = c
 *   wind table rows (speed, from) -> plumb_wind_components (wind.h)
 *   descent diameter D0 -> area S0 = pi D0^2 / 4 (Knacke, NWC TP 6575)
 *   sphere drag diameter d -> area pi d^2 / 4
 * The 1976 temperature (NOAA-S/T 76-1562) plus the offset must stay
 * above 0 K over the fall; it is piecewise linear in geopotential height,
 * so it is checked at both ends of the fall and at the layer bases between.
 *
 * Every diagnostic carries the file (or "--set"), line, column and the
 * dotted key. A loaded profile owns copies of everything; the parsed tree
 * is kept so that plumb_profile_derive can apply more overrides without
 * reading the file again.
 */
#include <limits.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/constants.h"
#include "plumb/profile.h"
#include "plumb/geodesy.h"
#include "core/internal.h"
#include "io/keys.h"
#include "io/attitude.h"
#include "io/sha256.h"
#include "io/yamltree.h"

#define ARRAY_LEN(a) (sizeof(a) / sizeof((a)[0]))

/* Defaults of the zone: map (README "Profile keys"). */
#define ZONE_SAMPLES_DEFAULT 100000ull   /* zone.samples */
#define ZONE_SAMPLES_MAX 100000000ull    /* zone.samples upper bound, 1e8 */
#define ZONE_SEED_DEFAULT 1ull           /* zone.seed */
#define ZONE_CONFIDENCE_DEFAULT 0.99     /* zone.confidence */
/* Most characters of a --set KEY path segment list. */
enum { KEY_SEGS = 16 };

/* Bases of the 1976 layers above 0 km, geopotential m (U.S. Standard
 * Atmosphere 1976, Table 4): the temperature's extremes lie at these. */
static const double std1976_bases_gp_m[] = {11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0};

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
static const plumby_schema edge_item[] = {S_NUM("", LENGTH, POSITIVE)};
static const plumby_schema shape_keys[] = {
    S_WORD("kind", shape_kinds),         S_NUM("diameter", LENGTH, POSITIVE),
    S_NUM("length", LENGTH, POSITIVE),   S_LIST("edges", edge_item),
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
static const plumby_schema atm_row_item[] = {S_MAP("", atm_row_keys)};
static const plumby_schema atm_keys[] = {
    S_WORD("model", atm_models),
    S_NUM("temperature_offset", TEMP_DIFF, ANY),
    S_NUM("pressure", PRESSURE, POSITIVE),
    S_NUM("temperature", TEMPERATURE, POSITIVE),
    S_NUM("lapse_rate", LAPSE, ANY),
    S_NUM("humidity", FRACTION, UNIT),
    S_LIST("table", atm_row_item),
};
static const plumby_schema wind_row_keys[] = {
    S_NUM("height", LENGTH, NONNEG),
    S_NUM("speed", SPEED, NONNEG),
    S_NUM("from", ANGLE, ANY),
};
static const plumby_schema wind_row_item[] = {S_MAP("", wind_row_keys)};
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
    S_LIST("table", wind_row_item),
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

/* ---- the profile ------------------------------------------------------- */

struct plumb_profile {
    char *path;                      /* as given to load */
    char name[PLUMB_NAME];           /* `name:` or the file stem */
    char sha256[PLUMBP_SHA256_HEX];  /* of the file's bytes */
    plumby_node *tree;               /* the tree after overrides, for derive */
    int inventory;                   /* 1: items: */
    size_t n_items;
    plumb_fall_spec *items;          /* n_items specs */
    plumb_shape_spec *shapes;        /* n_items shapes (kind NONE: drag given) */
    double (*att_drag)[PLUMB_MAX_ATTITUDES][2]; /* n_items rows: payload.attitude's drag, or NULL */
    plumb_atm_spec atm;              /* tables point into atm_* */
    double *atm_alt_m, *atm_rho_kg_m3, *atm_t_k;
    double *wind_h_m, *wind_e_m_s, *wind_n_m_s; /* the specs' wind table */
    size_t n_criteria;
    char **criteria;
    int (*criteria_pos)[3];          /* line, column, plumby_origin of each */
    size_t n_unc;
    plumb_uncertainty *unc;
    plumb_zone_spec zone;
    plumb_job job;                   /* `job:`, "" where not given */
};

void plumb_profile_free(plumb_profile *p)
{
    if (!p)
        return;
    free(p->path);
    plumby_free(p->tree);
    free(p->items);
    free(p->shapes);
    free(p->att_drag);
    free(p->atm_alt_m);
    free(p->atm_rho_kg_m3);
    free(p->atm_t_k);
    free(p->wind_h_m);
    free(p->wind_e_m_s);
    free(p->wind_n_m_s);
    for (size_t i = 0; i < p->n_criteria; i++)
        free(p->criteria[i]);
    free(p->criteria);
    free(p->criteria_pos);
    free(p->unc);
    free(p);
}

/* ---- key paths (overrides and plumb_profile_key_dim) -------------------- */

/* kseg.index when the segment has no [index], or selects an item by name */
enum { KSEG_NONE = -1, KSEG_NAMED = -2 };

typedef struct kseg {
    char name[PLUMB_DIAG_KEY];     /* key in its map (for uncertainty: the whole rest) */
    long index;                    /* [i] counted from 0, KSEG_NONE or KSEG_NAMED */
    char item[PLUMB_NAME];         /* KSEG_NAMED: the item's name, items[NAME] */
    int col;                       /* 1-based position of the segment in the key */
    const plumby_schema *schema;   /* its schema; NULL under uncertainty */
} kseg;

typedef struct keypath {
    size_t n;
    kseg seg[KEY_SEGS];
    int line; /* of a --set: which one (the "--set" pseudo-file's line) */
} keypath;

static int key_char(char c)
{
    return (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '_' || c == '-';
}

/* Resolves a dotted key ("descent[1].area") against the schema. Lists count
 * from 0, except the top-level items, which count from 1 as every report
 * numbers them ("items[2]" is index 1; "items[0]" is an error) and may be
 * named ("items[box of M12 bolts]", KSEG_NAMED, found in the tree later).
 * Errors are located at (file, line 1, column of the fault) when file is
 * not NULL. */
static plumb_status keypath_resolve(const char *key, keypath *kp, const char *file,
                                    int file_line, plumb_diag *diag)
{
    const plumby_schema *cur = &root_schema;
    size_t pos = 0;
    int line = file ? file_line : 0;
    kp->n = 0;
    kp->line = file_line > 0 ? file_line : 1;
#define KP_COL(p) (file ? (int)(p) + 1 : 0)
    if (!key[0])
        return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(0), key,
                              "expected a dotted key such as release.height, found nothing");
    for (;;) {
        if (kp->n >= KEY_SEGS)
            return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos), key,
                                  "a key of more than %d parts", KEY_SEGS);
        kseg *s = &kp->seg[kp->n];
        s->col = KP_COL(pos);
        s->index = KSEG_NONE;
        s->item[0] = '\0';
        if (cur->type == PLUMBY_T_FREE_MAP) {
            /* uncertainty: the rest is one (dotted) key */
            if (!key[pos])
                return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos), key,
                                      "expected a key after '%.*s'", (int)pos, key);
            plumbp_strlcpy(s->name, key + pos, sizeof s->name);
            s->schema = NULL;
            kp->n++;
            return PLUMB_OK;
        }
        size_t start = pos;
        while (key_char(key[pos]))
            pos++;
        if (pos == start)
            return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos), key,
                                  "expected a key name (a-z, 0-9, _ or -) at '%s'", key + pos);
        size_t len = pos - start;
        if (len >= sizeof s->name)
            len = sizeof s->name - 1;
        memcpy(s->name, key + start, len);
        s->name[len] = '\0';
        const plumby_schema *child = plumby_schema_child(cur, s->name);
        if (!child) {
            const char *best = plumby_schema_suggest(cur, s->name);
            if (best)
                return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, s->col, key,
                                      "unknown key '%s' (did you mean '%.*s%s'?)", key,
                                      (int)start, key, best);
            return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, s->col, key,
                                  "unknown key '%s': '%s' is not a key of %s", key, s->name,
                                  start ? "this map" : "a profile");
        }
        s->schema = child;
        if (key[pos] == '[') {
            if (child->type != PLUMBY_T_LIST && child->type != PLUMBY_T_MAP_OR_LIST)
                return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos), key,
                                      "'%s' is not a list, so it takes no [index]", s->name);
            size_t d0 = ++pos;
            /* an inventory's items: numbered from 1 as in the reports, or named */
            int items = kp->n == 0 && strcmp(s->name, PLUMBY_ITEMS_KEY) == 0;
            long idx = 0;
            while (key[pos] >= '0' && key[pos] <= '9') {
                if (idx > 1000000)
                    return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, file, line, KP_COL(d0), key,
                                          "index too large");
                idx = idx * 10 + (key[pos] - '0');
                pos++;
            }
            if (items && key[pos] != ']' && key[pos] != '\0') {
                const char *close = strchr(key + d0, ']');
                size_t nlen = close ? (size_t)(close - (key + d0)) : 0;
                if (!close)
                    return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(d0), key,
                                          "expected items[N], N from 1, or items[NAME]: no "
                                          "closing ']'");
                if (nlen >= sizeof s->item)
                    return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, file, line, KP_COL(d0), key,
                                          "an item's name has at most %d characters",
                                          (int)sizeof s->item - 1);
                memcpy(s->item, key + d0, nlen);
                s->item[nlen] = '\0';
                pos = d0 + nlen + 1;
                s->index = KSEG_NAMED;
            } else {
                if (pos == d0 || key[pos] != ']')
                    return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos), key,
                                          items ? "expected items[N], N from 1, or items[NAME]"
                                                : "expected [N] with a whole number N");
                if (items && idx == 0)
                    return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, file, line, KP_COL(d0), key,
                                          "items are numbered from 1, as in the reports: "
                                          "items[1] is the first item");
                pos++;
                s->index = items ? idx - 1 : idx;
            }
        }
        kp->n++;
        if (key[pos] == '\0')
            return PLUMB_OK;
        if (key[pos] != '.')
            return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos), key,
                                  "unexpected character '%c' in the key", key[pos]);
        pos++;
        switch (child->type) {
        case PLUMBY_T_LIST:
            if (s->index == KSEG_NONE)
                return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos - 1), key,
                                      "'%s' is a list: give an index, e.g. %s[%d].%s", s->name,
                                      s->name, kp->n == 1 && strcmp(s->name, PLUMBY_ITEMS_KEY) == 0,
                                      key + pos);
            cur = &child->sub[0];
            if (cur->type != PLUMBY_T_MAP)
                return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, KP_COL(pos), key,
                                      "the items of '%s' have no keys", s->name);
            break;
        case PLUMBY_T_MAP:
        case PLUMBY_T_MAP_OR_LIST:
        case PLUMBY_T_FREE_MAP:
            cur = child;
            break;
        default:
            return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, KP_COL(pos), key,
                                  "'%s' is a single value; it has no keys under it", s->name);
        }
    }
#undef KP_COL
}

plumb_status plumb_profile_key_dim(const char *key, plumb_dim *dim, plumb_diag *diag)
{
    keypath kp;
    if (!key || !dim)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_key_dim: NULL argument");
    plumb_status st = keypath_resolve(key, &kp, NULL, 0, diag);
    if (st != PLUMB_OK)
        return st;
    const kseg *leaf = &kp.seg[kp.n - 1];
    const plumby_schema *s = leaf->schema;
    if (s && s->type == PLUMBY_T_LIST && leaf->index != KSEG_NONE)
        s = &s->sub[0];
    if (!s || (s->type != PLUMBY_T_NUM && s->type != PLUMBY_T_COUNT))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key, "'%s' is not a numeric key", key);
    *dim = s->type == PLUMBY_T_NUM ? s->dim : PLUMB_DIM_NONE;
    return PLUMB_OK;
}

/* ---- overrides --------------------------------------------------------- */

PLUMBP_PRINTF(6, 7)
static plumb_status set_raise(plumb_diag *diag, plumb_status st, int line, int col,
                              const char *key, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumbp_vraise(diag, st, PLUMBY_SET_FILE, line, col, key, fmt, ap);
    va_end(ap);
    return st;
}

/* Index of the item of list whose name is `name`, or -1. */
static long item_named(const plumby_node *list, const char *name)
{
    for (size_t i = 0; i < list->n; i++) {
        const plumby_node *it = list->items[i];
        const plumby_pair *np = it->kind == PLUMBY_MAP ? plumby_find(it, "name") : NULL;
        if (np && np->value->kind == PLUMBY_SCALAR && strcmp(np->value->text, name) == 0)
            return (long)i;
    }
    return -1;
}

/* Most bytes of the item names an "no item is named" message lists. */
#define ITEM_LIST_MAX 200

/* Raises "no item is named ...", with the nearest name and the names. */
static plumb_status no_item_named(plumb_diag *diag, int line, const kseg *s, const char *key,
                                  const plumby_node *list)
{
    const char *names[64];
    size_t n = 0;
    char all[ITEM_LIST_MAX];
    size_t len = 0;
    all[0] = '\0';
    for (size_t i = 0; i < list->n; i++) {
        const plumby_node *it = list->items[i];
        const plumby_pair *np = it->kind == PLUMBY_MAP ? plumby_find(it, "name") : NULL;
        if (!np || np->value->kind != PLUMBY_SCALAR)
            continue;
        const char *name = np->value->text;
        if (n < sizeof names / sizeof names[0])
            names[n++] = name;
        if (len + strlen(name) + 8 + sizeof ", ..." > sizeof all) {
            if (len + sizeof ", ..." <= sizeof all)
                len += (size_t)snprintf(all + len, sizeof all - len, ", ...");
            continue;
        }
        len += (size_t)snprintf(all + len, sizeof all - len, "%s'%s'", len ? ", " : "", name);
    }
    const char *near = plumbp_closest(s->item, names, n);
    return set_raise(diag, PLUMB_EKEY, line, s->col, key, "no item is named '%s'%s%s%s; the items are %s",
                     s->item, near ? " (did you mean '" : "", near ? near : "",
                     near ? "'?)" : "", all[0] ? all : "unnamed");
}

/* Puts value (owned; freed on error) at the key path in root. */
static plumb_status tree_put(plumby_node *root, const keypath *kp, const char *key,
                             plumby_node *value, plumb_diag *diag)
{
    plumby_node *cur = root;
    plumb_status st = PLUMB_OK;
    for (size_t i = 0; i < kp->n; i++) {
        const kseg *s = &kp->seg[i];
        int last = i + 1 == kp->n;
        if (cur->kind != PLUMBY_MAP) {
            char found[64];
            st = set_raise(diag, PLUMB_EINVAL, kp->line, s->col, key,
                           "cannot set it: the profile gives %s at line %d, column %d, not a map",
                           plumby_describe(cur, found, sizeof found), cur->line, cur->col);
            goto fail;
        }
        plumby_pair *pair = plumby_find(cur, s->name);
        if (s->index == KSEG_NONE) {
            if (last) {
                if (pair) {
                    plumby_free(pair->value);
                    pair->value = value;
                } else if ((st = plumby_map_push(cur, s->name, kp->line, s->col, PLUMBY_FROM_SET,
                                                 value)) != PLUMB_OK) {
                    goto nomem;
                }
                return PLUMB_OK;
            }
            if (!pair) {
                plumby_node *m = plumby_new(PLUMBY_MAP, kp->line, s->col, PLUMBY_FROM_SET);
                if (!m || plumby_map_push(cur, s->name, kp->line, s->col, PLUMBY_FROM_SET, m) != PLUMB_OK) {
                    plumby_free(m);
                    goto nomem;
                }
                cur = m;
            } else {
                cur = pair->value;
            }
            continue;
        }
        /* indexed; items count from 1 in what people see */
        int base = i == 0 && strcmp(s->name, PLUMBY_ITEMS_KEY) == 0;
        plumby_node *list;
        if (!pair) {
            if (s->index != 0) {
                st = set_raise(diag, PLUMB_ERANGE, kp->line, s->col, key,
                               "'%s' has no items yet: the first one is %s[%d]", s->name, s->name,
                               base);
                goto fail;
            }
            list = plumby_new(PLUMBY_SEQ, kp->line, s->col, PLUMBY_FROM_SET);
            if (!list ||
                plumby_map_push(cur, s->name, kp->line, s->col, PLUMBY_FROM_SET, list) != PLUMB_OK) {
                plumby_free(list);
                goto nomem;
            }
        } else {
            list = pair->value;
        }
        if (list->kind == PLUMBY_MAP && s->schema && s->schema->type == PLUMBY_T_MAP_OR_LIST) {
            /* one device given as a map: it is [0]; [1] makes it a list */
            if (s->index == 0) {
                if (last) {
                    plumby_free(pair->value);
                    pair->value = value;
                    return PLUMB_OK;
                }
                cur = list;
                continue;
            }
            plumby_node *seq = plumby_new(PLUMBY_SEQ, list->line, list->col, list->origin);
            if (!seq || plumby_seq_push(seq, list) != PLUMB_OK) {
                plumby_free(seq);
                goto nomem;
            }
            pair->value = seq;
            list = seq;
        }
        if (list->kind != PLUMBY_SEQ) {
            char found[64];
            st = set_raise(diag, PLUMB_EINVAL, kp->line, s->col, key,
                           "cannot index it: the profile gives %s for '%s' at line %d, column %d, "
                           "not a list",
                           plumby_describe(list, found, sizeof found), s->name, list->line,
                           list->col);
            goto fail;
        }
        size_t idx;
        if (s->index == KSEG_NAMED) {
            long found = item_named(list, s->item);
            if (found < 0) {
                st = no_item_named(diag, kp->line, s, key, list);
                goto fail;
            }
            idx = (size_t)found;
        } else {
            idx = (size_t)s->index;
        }
        if (idx > list->n) {
            st = set_raise(diag, PLUMB_ERANGE, kp->line, s->col, key,
                           "index %zu is past the end: '%s' has %zu item%s (the next is [%zu])",
                           idx + (size_t)base, s->name, list->n, list->n == 1 ? "" : "s",
                           list->n + (size_t)base);
            goto fail;
        }
        if (last) {
            if (idx < list->n) {
                plumby_free(list->items[idx]);
                list->items[idx] = value;
            } else if (plumby_seq_push(list, value) != PLUMB_OK) {
                goto nomem;
            }
            return PLUMB_OK;
        }
        if (idx == list->n) {
            plumby_node *m = plumby_new(PLUMBY_MAP, kp->line, s->col, PLUMBY_FROM_SET);
            if (!m || plumby_seq_push(list, m) != PLUMB_OK) {
                plumby_free(m);
                goto nomem;
            }
        }
        cur = list->items[idx];
    }
    return PLUMB_OK;
nomem:
    st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory applying --set %s", key);
fail:
    plumby_free(value);
    return st;
}

/* Removes the node at the key path, if there is one. */
static void tree_remove(plumby_node *root, const keypath *kp)
{
    plumby_node *cur = root;
    for (size_t i = 0; i < kp->n; i++) {
        const kseg *s = &kp->seg[i];
        plumby_pair *pair = cur->kind == PLUMBY_MAP ? plumby_find(cur, s->name) : NULL;
        if (!pair)
            return;
        plumby_node *v = pair->value;
        int last = i + 1 == kp->n;
        if (s->index != KSEG_NONE && v->kind == PLUMBY_SEQ) {
            long at = s->index == KSEG_NAMED ? item_named(v, s->item) : s->index;
            if (at < 0 || (size_t)at >= v->n)
                return;
            size_t idx = (size_t)at;
            if (last) {
                plumby_free(v->items[idx]);
                memmove(&v->items[idx], &v->items[idx + 1], (v->n - idx - 1) * sizeof *v->items);
                v->n--;
                return;
            }
            cur = v->items[idx];
            continue;
        }
        if (s->index > 0 || s->index == KSEG_NAMED)
            return;
        if (last) {
            size_t at = (size_t)(pair - cur->pairs);
            free(pair->key);
            plumby_free(pair->value);
            memmove(&cur->pairs[at], &cur->pairs[at + 1], (cur->n - at - 1) * sizeof *cur->pairs);
            cur->n--;
            return;
        }
        cur = v;
    }
}

/* Keys that stand instead of one another in the same map: an override of
 * one replaces the others, so `--set descent.area=1.2m^2` works on a
 * profile that gives the canopy's diameter (and `plumb limit --find
 * descent.area` with it). Within a map named `parent` ("" for any). */
static const struct { const char *parent, *key, *drops[2]; } alternatives[] = {
    {"descent", "area", {"diameter", NULL}},
    {"descent", "diameter", {"area", NULL}},
    {"descent", "fill_time", {"fill_constant", NULL}},
    {"descent", "fill_constant", {"fill_time", NULL}},
    {"deploy", "after", {"below", NULL}},
    {"deploy", "below", {"after", NULL}},
    {"drag", "cd_area", {"cd", "area"}},
};

static void drop_alternatives(plumby_node *root, const keypath *kp)
{
    if (kp->n < 2)
        return;
    const kseg *last = &kp->seg[kp->n - 1], *parent = &kp->seg[kp->n - 2];
    if (last->index != KSEG_NONE)
        return;
    for (size_t i = 0; i < sizeof alternatives / sizeof alternatives[0]; i++) {
        if (strcmp(alternatives[i].key, last->name) != 0 ||
            strcmp(alternatives[i].parent, parent->name) != 0)
            continue;
        for (size_t k = 0; k < 2 && alternatives[i].drops[k]; k++) {
            keypath other = *kp;
            plumbp_strlcpy(other.seg[kp->n - 1].name, alternatives[i].drops[k],
                           sizeof other.seg[kp->n - 1].name);
            tree_remove(root, &other);
        }
    }
}

/* Applies one "KEY=VALUE" to the tree; VALUE ~ or null removes KEY; a key
 * given instead of another (see alternatives) replaces it. */
/* Every node of a --set value at `line`: the overrides are the lines of
 * the "--set" pseudo-file, so an error names which --set it is in. */
static void set_lines(plumby_node *n, int line)
{
    if (!n)
        return;
    n->line = line;
    for (size_t i = 0; n->items && i < n->n; i++)
        set_lines(n->items[i], line);
    for (size_t i = 0; n->pairs && i < n->n; i++) {
        n->pairs[i].line = line;
        set_lines(n->pairs[i].value, line);
    }
}

/* Applies the override `arg`, the line-th --set (counted from 1). */
static plumb_status apply_set(plumby_node *root, const char *arg, int line, plumb_diag *diag)
{
    const char *eq = strchr(arg, '=');
    if (!eq || eq == arg)
        return set_raise(diag, PLUMB_EPARSE, line, 1, "",
                         "expected KEY=VALUE (e.g. release.height=\"30 ft\"), found '%s'", arg);
    char key[PLUMB_DIAG_KEY];
    size_t klen = (size_t)(eq - arg);
    if (klen >= sizeof key)
        return set_raise(diag, PLUMB_EPARSE, line, 1, "", "the key of '%s' is too long", arg);
    memcpy(key, arg, klen);
    key[klen] = '\0';
    keypath kp;
    plumb_status st = keypath_resolve(key, &kp, PLUMBY_SET_FILE, line, diag);
    if (st != PLUMB_OK)
        return st;
    const char *val = eq + 1;
    int col0 = (int)klen + 1;
    if (strspn(val, " ") == strlen(val))
        return set_raise(diag, PLUMB_EPARSE, line, col0 + 1, key,
                         "expected a value after '=', found nothing");
    size_t lead = strspn(val, " "), vlen = strlen(val + lead);
    while (vlen > 0 && val[lead + vlen - 1] == ' ')
        vlen--;
    if ((vlen == 1 && val[lead] == '~') || (vlen == 4 && strncmp(val + lead, "null", 4) == 0)) {
        tree_remove(root, &kp);
        return PLUMB_OK;
    }
    plumby_node *node;
    st = plumby_parse(val, strlen(val), PLUMBY_SET_FILE, PLUMBY_FROM_SET, col0, key, &node, diag);
    if (st != PLUMB_OK) {
        if (diag && strcmp(diag->file, PLUMBY_SET_FILE) == 0)
            diag->line = line;
        return st;
    }
    set_lines(node, line);
    st = tree_put(root, &kp, key, node, diag);
    if (st == PLUMB_OK)
        drop_alternatives(root, &kp);
    return st;
}

/* ---- interpretation ---------------------------------------------------- */

typedef struct loader {
    plumby_ctx ctx;
    plumb_profile *p;
    plumby_map root;
    double height_m;        /* release.height */
    double elevation_m;     /* site.elevation */
} loader;

static plumb_status nomem(const loader *L)
{
    return PLUMB_RAISE(L->ctx.diag, PLUMB_ENOMEM, "out of memory loading the profile");
}

/* Name of the file without directories and .yaml/.yml. */
static void file_stem(const char *path, char *dst, size_t size)
{
    const char *b = strrchr(path, '/');
    b = b ? b + 1 : path;
    size_t n = strlen(b);
    if (n > 5 && strcmp(b + n - 5, ".yaml") == 0)
        n -= 5;
    else if (n > 4 && strcmp(b + n - 4, ".yml") == 0)
        n -= 4;
    if (n >= size)
        n = size - 1;
    memcpy(dst, b, n);
    dst[n] = '\0';
}

static plumb_status read_drag(const loader *L, const plumby_map *item, plumb_fall_spec *spec,
                              plumb_shape_spec *shape)
{
    plumby_map dm, sm;
    plumby_sub(item, "drag", &dm);
    plumby_sub(item, "shape", &sm);
    plumb_status st;
    memset(shape, 0, sizeof *shape);
    memset(&spec->drag, 0, sizeof spec->drag);
    if (dm.node && sm.node)
        return plumby_forbid(item, "shape", "together with 'drag' (give drag or shape, not both)");
    if (!dm.node && !sm.node)
        return plumby_missing(item, "drag",
                              "give drag: {cd: ..., area: ...} (or cd_area), or shape: {kind: ...}");
    if (dm.node) {
        plumb_drag_spec *d = &spec->drag;
        int model;
        if ((st = plumby_word(&dm, "model", 0, &model)) != PLUMB_OK)
            return st;
        char user_source[PLUMB_DRAG_SOURCE];
        if ((st = plumby_text(&dm, "source", "", user_source, sizeof user_source)) != PLUMB_OK)
            return st;
        if (model == 0) {
            d->model = PLUMB_DRAG_FIXED;
            if ((st = plumby_forbid(&dm, "diameter", "with model fixed (only the sphere models "
                                                     "take a diameter)")) != PLUMB_OK)
                return st;
            if (plumby_get(&dm, "cd_area")) {
                if ((st = plumby_forbid(&dm, "cd", "together with cd_area (give cd and area, "
                                                   "or cd_area)")) != PLUMB_OK ||
                    (st = plumby_forbid(&dm, "area", "together with cd_area (give cd and area, "
                                                     "or cd_area)")) != PLUMB_OK ||
                    (st = plumby_num(&dm, "cd_area", 1, 0.0, &d->cd_area_m2, NULL)) != PLUMB_OK)
                    return st;
                snprintf(d->source, sizeof d->source,
                         "cd_area %.6g m² as given in the profile", d->cd_area_m2);
            } else {
                if (!plumby_get(&dm, "cd"))
                    return plumby_missing(&dm, "cd", "give cd and area, or cd_area");
                if (!plumby_get(&dm, "area"))
                    return plumby_missing(&dm, "area", "give cd and area, or cd_area");
                if ((st = plumby_num(&dm, "cd", 1, 0.0, &d->cd, NULL)) != PLUMB_OK ||
                    (st = plumby_num(&dm, "area", 1, 0.0, &d->area_m2, NULL)) != PLUMB_OK)
                    return st;
                d->cd_area_m2 = d->cd * d->area_m2;
                snprintf(d->source, sizeof d->source,
                         "cd %.6g and area %.6g m² as given in the profile", d->cd, d->area_m2);
            }
        } else {
            d->model = model == 1 ? PLUMB_DRAG_SPHERE_MORRISON : PLUMB_DRAG_SPHERE_CGW;
            const char *why = model == 1 ? "with model sphere (Cd comes from the Reynolds number)"
                                         : "with model sphere-cgw (Cd comes from the Reynolds "
                                           "number)";
            if ((st = plumby_forbid(&dm, "cd", why)) != PLUMB_OK ||
                (st = plumby_forbid(&dm, "area", why)) != PLUMB_OK ||
                (st = plumby_forbid(&dm, "cd_area", why)) != PLUMB_OK ||
                (st = plumby_num(&dm, "diameter", 1, 0.0, &d->diameter_m, NULL)) != PLUMB_OK)
                return st;
            d->area_m2 = PLUMB_PI * d->diameter_m * d->diameter_m / 4.0;
            snprintf(d->source, sizeof d->source,
                     "sphere of diameter %.6g m as given in the profile: Cd(Re) by %s, area pi d^2/4",
                     d->diameter_m,
                     model == 1 ? "Morrison (2010)" : "Clift, Grace & Weber (1978), Table 5.2");
        }
        if (user_source[0])
            memcpy(d->source, user_source, sizeof d->source);
        return PLUMB_OK;
    }
    /* shape */
    int kind, att = 0;
    if ((st = plumby_word(&sm, "kind", -1, &kind)) != PLUMB_OK)
        return st;
    static const char *const why_kind[] = {"for a sphere", "for a cylinder", "for a box",
                                           "for a plate"};
    const char *why = why_kind[kind];
    switch (kind) {
    case 0:
        shape->kind = PLUMB_SHAPE_SPHERE;
        if ((st = plumby_forbid(&sm, "length", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "edges", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "thickness", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "attitude", "for a sphere (it looks the same every way)")) !=
                PLUMB_OK ||
            (st = plumby_num(&sm, "diameter", 1, 0.0, &shape->dims_m[0], NULL)) != PLUMB_OK)
            return st;
        break;
    case 1:
        shape->kind = PLUMB_SHAPE_CYLINDER;
        if ((st = plumby_forbid(&sm, "edges", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "thickness", why)) != PLUMB_OK ||
            (st = plumby_num(&sm, "length", 1, 0.0, &shape->dims_m[0], NULL)) != PLUMB_OK ||
            (st = plumby_num(&sm, "diameter", 1, 0.0, &shape->dims_m[1], NULL)) != PLUMB_OK)
            return st;
        break;
    default: {
        int plate = kind == 3;
        shape->kind = plate ? PLUMB_SHAPE_PLATE : PLUMB_SHAPE_BOX;
        size_t want = plate ? 2 : 3;
        if ((st = plumby_forbid(&sm, "diameter", why)) != PLUMB_OK ||
            (st = plumby_forbid(&sm, "length", plate ? "for a plate (give edges: [a, b] and "
                                                       "thickness)"
                                                     : "for a box (give edges: [a, b, c])")) !=
                PLUMB_OK)
            return st;
        if (!plate && (st = plumby_forbid(&sm, "thickness", "for a box (give edges: [a, b, c])")) !=
                          PLUMB_OK)
            return st;
        const plumby_node *edges = plumby_get(&sm, "edges");
        if (!edges)
            return plumby_missing(&sm, "edges", plate ? "a plate needs edges: [a, b]"
                                                      : "a box needs edges: [a, b, c]");
        char ekey[PLUMB_DIAG_KEY];
        plumby_key_join(ekey, sizeof ekey, sm.key, "edges", 0);
        if (edges->n != want)
            return plumby_raise(&L->ctx, edges->origin, edges->line, edges->col, ekey,
                                PLUMB_EINVAL, "expected %zu edges for a %s, found %zu", want,
                                plate ? "plate" : "box", edges->n);
        for (size_t i = 0; i < want; i++) {
            char ikey[PLUMB_DIAG_KEY];
            plumby_key_join(ikey, sizeof ikey, ekey, NULL, i);
            if ((st = plumby_num_node(&L->ctx, edges->items[i], &edge_item[0], ikey,
                                      &shape->dims_m[i])) != PLUMB_OK)
                return st;
        }
        if (plate && (st = plumby_num(&sm, "thickness", 1, 0.0, &shape->dims_m[2], NULL)) !=
                         PLUMB_OK)
            return st;
        break;
    }
    }
    if ((st = plumby_word(&sm, "attitude", 0, &att)) != PLUMB_OK)
        return st;
    shape->attitude = att == 0   ? PLUMB_ATTITUDE_TUMBLING
                      : att == 1 ? PLUMB_ATTITUDE_BROADSIDE
                                 : PLUMB_ATTITUDE_END_ON;
    st = plumb_drag_from_shape(shape, &spec->drag);
    if (st != PLUMB_OK)
        return plumby_raise(&L->ctx, sm.origin, sm.line, sm.col, sm.key, st,
                            "the drag of this shape could not be found (%s)", plumb_strerror(st));
    return PLUMB_OK;
}

/* The canopy type and its inflation curve (plumb/inflation.h): j and C_x
 * from the type's table unless given; the fill constant n from the table
 * when neither fill_time nor fill_constant is given (t_f = n D0 / v_1, D0
 * the nominal diameter when only the area is given). */
static plumb_status read_inflation(const plumby_map *dm, plumb_descent_spec *d, int has_fill)
{
    plumb_status st;
    int word = -1;
    if ((plumby_get(dm, "canopy") && (st = plumby_word(dm, "canopy", 0, &word)) != PLUMB_OK) ||
        (st = plumby_num(dm, "inflation_exponent", 0, 0.0, &d->inflation_exponent, NULL)) !=
            PLUMB_OK ||
        (st = plumby_num(dm, "opening_factor", 0, 0.0, &d->opening_factor, NULL)) != PLUMB_OK)
        return st;
    if (d->inflation_exponent > PLUMB_INFLATION_J_MAX)
        return plumby_raise_value(dm, "inflation_exponent", PLUMB_ERANGE,
                                  "must lie between 0 and %g (published curves run from 1/2 to "
                                  "about 6), found '%s'",
                                  PLUMB_INFLATION_J_MAX, plumby_get(dm, "inflation_exponent")->text);
    d->canopy = word < 0 ? PLUMB_CANOPY_UNSPECIFIED : (plumb_canopy)(word + 1);
    const plumb_canopy_info *ci = plumb_canopy_info_of(d->canopy);
    if (!ci)
        return PLUMB_OK;
    if (!(d->inflation_exponent > 0.0)) {
        if (!(ci->exponent > 0.0))
            return plumby_missing(dm, "inflation_exponent",
                                  "the map of published values gives no inflation exponent for "
                                  "this canopy type: give inflation_exponent");
        d->inflation_exponent = ci->exponent;
    }
    if (!(d->opening_factor > 0.0))
        d->opening_factor = ci->opening_factor;
    if (!has_fill) {
        if (!(ci->fill_constant > 0.0))
            return plumby_missing(dm, "fill_time",
                                  "the map of published values gives no fill constant for this "
                                  "canopy type: give fill_time or fill_constant");
        d->fill_constant = ci->fill_constant;
    }
    return PLUMB_OK;
}

/* One descent device from map dm (index i of the list). */
static plumb_status read_device(const loader *L, const plumby_map *dm, plumb_descent_spec *d)
{
    plumb_status st;
    int kind;
    memset(d, 0, sizeof *d);
    if ((st = plumby_word(dm, "kind", 0, &kind)) != PLUMB_OK ||
        (st = plumby_num(dm, "cd", 1, 0.0, &d->cd, NULL)) != PLUMB_OK)
        return st;
    d->kind = kind == 0 ? PLUMB_DESCENT_PARACHUTE
              : kind == 1 ? PLUMB_DESCENT_STREAMER
                          : PLUMB_DESCENT_DROGUE;
    int has_area = plumby_get(dm, "area") != NULL, has_d = plumby_get(dm, "diameter") != NULL;
    if (has_area && has_d)
        return plumby_forbid(dm, "diameter", "together with area (give area or diameter)");
    if (!has_area && !has_d)
        return plumby_missing(dm, "area", "give the canopy's area or its diameter");
    if (has_area) {
        if ((st = plumby_num(dm, "area", 1, 0.0, &d->area_m2, NULL)) != PLUMB_OK)
            return st;
    } else {
        if ((st = plumby_num(dm, "diameter", 1, 0.0, &d->diameter_m, NULL)) != PLUMB_OK)
            return st;
        d->area_m2 = PLUMB_PI * d->diameter_m * d->diameter_m / 4.0;
    }
    plumby_map dep;
    plumby_sub(dm, "deploy", &dep);
    if (!dep.node)
        return plumby_missing(dm, "deploy", "give deploy: {after: TIME} or {below: HEIGHT}");
    int has_after = plumby_get(&dep, "after") != NULL, has_below = plumby_get(&dep, "below") != NULL;
    if (has_after && has_below)
        return plumby_forbid(&dep, "below", "together with after (give after or below)");
    if (!has_after && !has_below)
        return plumby_missing(&dep, "after", "give after: TIME or below: HEIGHT");
    if (has_after) {
        d->trigger = PLUMB_DEPLOY_AFTER;
        if ((st = plumby_num(&dep, "after", 1, 0.0, &d->deploy_value, NULL)) != PLUMB_OK)
            return st;
    } else {
        d->trigger = PLUMB_DEPLOY_BELOW;
        if ((st = plumby_num(&dep, "below", 1, 0.0, &d->deploy_value, NULL)) != PLUMB_OK)
            return st;
        if (!(d->deploy_value < L->height_m))
            return plumby_raise_value(&dep, "below", PLUMB_ERANGE,
                                      "must be below the release height %.6g m, found '%s'",
                                      L->height_m, plumby_get(&dep, "below")->text);
    }
    int has_ft = plumby_get(dm, "fill_time") != NULL, has_fc = plumby_get(dm, "fill_constant") != NULL;
    if (has_ft && has_fc)
        return plumby_forbid(dm, "fill_constant",
                             "together with fill_time (give fill_time or fill_constant)");
    if ((st = plumby_num(dm, "fill_time", 0, 0.0, &d->fill_time_s, NULL)) != PLUMB_OK ||
        (st = plumby_num(dm, "fill_constant", 0, 0.0, &d->fill_constant, NULL)) != PLUMB_OK)
        return st;
    if (has_fc && !has_d)
        return plumby_raise_value(dm, "fill_constant", PLUMB_EINVAL,
                                  "needs the canopy's diameter (t_f = n D0 / v); give diameter "
                                  "instead of area, or use fill_time");
    return read_inflation(dm, d, has_ft || has_fc);
}

/* The descent devices of a node (map or list) at key into spec. */
static plumb_status read_descent(const loader *L, const plumby_node *node, const char *key,
                                 plumb_fall_spec *spec)
{
    plumb_status st;
    spec->n_descent = 0;
    if (!node)
        return PLUMB_OK;
    const plumby_schema *s = plumby_schema_child(&root_schema, "descent");
    if (node->kind == PLUMBY_MAP) {
        plumby_map dm;
        plumby_map_init(&dm, &L->ctx, node, s, key);
        if ((st = read_device(L, &dm, &spec->descent[0])) != PLUMB_OK)
            return st;
        spec->n_descent = 1;
        return PLUMB_OK;
    }
    if (node->n == 0)
        return plumby_raise(&L->ctx, node->origin, node->line, node->col, key, PLUMB_EINVAL,
                            "an empty list: give one or two devices, or leave descent out");
    if (node->n > PLUMB_MAX_DESCENT) {
        const plumby_node *x = node->items[PLUMB_MAX_DESCENT];
        char ikey[PLUMB_DIAG_KEY];
        plumby_key_join(ikey, sizeof ikey, key, NULL, PLUMB_MAX_DESCENT);
        return plumby_raise(&L->ctx, x->origin, x->line, x->col, ikey, PLUMB_ERANGE,
                            "at most %d descent devices (a drogue, then a main), found %zu",
                            PLUMB_MAX_DESCENT, node->n);
    }
    for (size_t i = 0; i < node->n; i++) {
        plumby_map dm;
        char ikey[PLUMB_DIAG_KEY];
        plumby_key_join(ikey, sizeof ikey, key, NULL, i);
        plumby_map_init(&dm, &L->ctx, node->items[i], s, ikey);
        if ((st = read_device(L, &dm, &spec->descent[i])) != PLUMB_OK)
            return st;
        if (i > 0) {
            const plumb_descent_spec *a = &spec->descent[i - 1], *b = &spec->descent[i];
            int out_of_order = a->trigger == b->trigger &&
                               (a->trigger == PLUMB_DEPLOY_AFTER ? b->deploy_value < a->deploy_value
                                                                 : b->deploy_value > a->deploy_value);
            if (out_of_order) {
                plumby_map dep;
                plumby_sub(&dm, "deploy", &dep);
                return plumby_raise_value(
                    &dep, a->trigger == PLUMB_DEPLOY_AFTER ? "after" : "below", PLUMB_ERANGE,
                    "devices are listed in deployment order: this one must deploy %s %.6g %s "
                    "(the previous one's %s)",
                    a->trigger == PLUMB_DEPLOY_AFTER ? "no sooner than" : "no higher than",
                    a->deploy_value, a->trigger == PLUMB_DEPLOY_AFTER ? "s" : "m",
                    a->trigger == PLUMB_DEPLOY_AFTER ? "after" : "below");
            }
            /* a main deploying after a drogue replaces it */
            spec->descent[i].disreefs_previous = a->kind == PLUMB_DESCENT_DROGUE;
        }
    }
    spec->n_descent = node->n;
    return PLUMB_OK;
}

/* Air density for a plate's I* (plumb/glide.h): the 1976 standard at sea
 * level; I* only picks the regime, and a site's density changes it by a few
 * per cent. kg/m^3. */
#define GLIDE_RHO_F_KG_M3 1.225

/* payload.glide: auto (default: a plate, or a box whose smallest edge is at
 * most PLUMB_GLIDE_THIN_FRACTION of its middle one, glides in the regime
 * its I* gives; anything else does not), tumble, flutter or off. */
static plumb_status read_glide(const plumby_map *im, plumb_fall_spec *spec,
                               const plumb_shape_spec *shape)
{
    int word = 0;
    plumb_status st = plumby_word(im, "glide", 0, &word);
    if (st != PLUMB_OK)
        return st;
    memset(&spec->glide, 0, sizeof spec->glide);
    if (word == 1 || word == 2) {
        spec->glide.mode = word == 1 ? PLUMB_GLIDE_TUMBLE : PLUMB_GLIDE_FLUTTER;
        return PLUMB_OK;
    }
    if (word == 3 || !shape)
        return PLUMB_OK;
    const double *d = shape->dims_m;
    double a = 0.0, b = 0.0;
    if (shape->kind == PLUMB_SHAPE_PLATE) {
        a = d[0];
        b = d[1];
    } else if (shape->kind == PLUMB_SHAPE_BOX) {
        double e[3] = {d[0], d[1], d[2]};
        for (int i = 0; i < 2; i++) /* sort ascending */
            for (int k = 0; k < 2 - i; k++)
                if (e[k] > e[k + 1]) {
                    double t = e[k];
                    e[k] = e[k + 1];
                    e[k + 1] = t;
                }
        if (!(e[0] <= PLUMB_GLIDE_THIN_FRACTION * e[1]))
            return PLUMB_OK;
        a = e[1];
        b = e[2];
    } else {
        return PLUMB_OK;
    }
    spec->glide.istar = plumb_glide_istar(spec->mass_kg, a, b, GLIDE_RHO_F_KG_M3);
    spec->glide.mode = plumb_glide_regime(spec->glide.istar);
    spec->glide.from_shape = 1;
    return PLUMB_OK;
}

/* One payload (map at key "payload" or "items[i]") into spec and shape. */
static plumb_status read_item(const loader *L, const plumby_map *im, int is_item,
                              const plumb_fall_spec *base, plumb_fall_spec *spec,
                              plumb_shape_spec *shape)
{
    plumb_status st;
    *spec = *base;
    if (is_item) {
        if ((st = plumby_text(im, "name", NULL, spec->name, sizeof spec->name)) != PLUMB_OK)
            return st;
        if (!spec->name[0])
            return plumby_raise_value(im, "name", PLUMB_EINVAL, "expected a name, found ''");
    }
    if ((st = plumby_num(im, "mass", 1, 0.0, &spec->mass_kg, NULL)) != PLUMB_OK ||
        (st = plumby_num(im, "volume", 0, 0.0, &spec->volume_m3, NULL)) != PLUMB_OK ||
        (st = read_drag(L, im, spec, shape)) != PLUMB_OK ||
        (st = read_glide(im, spec, shape)) != PLUMB_OK)
        return st;
    const plumby_node *own = is_item ? plumby_get(im, "descent") : NULL;
    char key[PLUMB_DIAG_KEY];
    if (own) {
        plumby_key_join(key, sizeof key, im->key, "descent", 0);
        return read_descent(L, own, key, spec);
    }
    return read_descent(L, plumby_get(&L->root, "descent"), "descent", spec);
}

/* A point of `m` given as latitude and longitude instead of east and
 * north: turned into east, north metres from the site (geodesy.h). */
static plumb_status map_point(loader *L, const plumby_map *m, double en[2])
{
    const plumb_zone_spec *z = &L->p->zone;
    int has_lat = plumby_get(m, "latitude") != NULL, has_lon = plumby_get(m, "longitude") != NULL;
    if (!has_lat && !has_lon)
        return PLUMB_OK;
    plumb_status st;
    if ((st = plumby_forbid(m, "east", "together with latitude and longitude (give one or the "
                                       "other)")) != PLUMB_OK ||
        (st = plumby_forbid(m, "north", "together with latitude and longitude (give one or the "
                                        "other)")) != PLUMB_OK)
        return st;
    if (!has_lat || !has_lon)
        return plumby_missing(m, has_lat ? "longitude" : "latitude",
                              "a point on the map needs both latitude and longitude");
    double ll[2];
    if ((st = plumby_num(m, "latitude", 1, 0.0, &ll[0], NULL)) != PLUMB_OK ||
        (st = plumby_num(m, "longitude", 1, 0.0, &ll[1], NULL)) != PLUMB_OK)
        return st;
    if (!z->has_site)
        return plumby_raise_value(m, "latitude", PLUMB_EINVAL,
                                  "a point given by latitude and longitude needs the site's: "
                                  "site.latitude and site.longitude (WGS 84)");
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_geodesy_inverse(z->site_deg[0], z->site_deg[1], ll[0], ll[1], en, &d) != PLUMB_OK)
        return plumby_raise_value(m, "latitude", PLUMB_EINVAL, "%s", d.message);
    return PLUMB_OK;
}

static plumb_status read_release_site(loader *L, plumb_fall_spec *base)
{
    plumby_map rm, vm, pm, sm;
    plumb_status st;
    plumby_sub(&L->root, "release", &rm);
    plumby_sub(&rm, "velocity", &vm);
    plumby_sub(&rm, "position", &pm);
    plumby_sub(&L->root, "site", &sm);
    plumby_map dwm;
    plumby_sub(&rm, "downwash", &dwm);
    if (dwm.node &&
        ((st = plumby_num(&dwm, "aircraft_mass", 1, 0.0, &base->downwash.aircraft_mass_kg, NULL)) !=
             PLUMB_OK ||
         (st = plumby_num(&dwm, "disk_area", 1, 0.0, &base->downwash.disk_area_m2, NULL)) !=
             PLUMB_OK))
        return st;
    if ((st = plumby_num(&rm, "height", 1, 0.0, &L->height_m, NULL)) != PLUMB_OK ||
        (st = plumby_num(&pm, "east", 0, 0.0, &base->release_m[0], NULL)) != PLUMB_OK ||
        (st = plumby_num(&pm, "north", 0, 0.0, &base->release_m[1], NULL)) != PLUMB_OK)
        return st;
    base->release_m[2] = L->height_m;

    static const char *const cart[] = {"east", "north", "up"}, *const polar[] = {"speed", "heading",
                                                                                 "climb"};
    int has_cart = 0;
    for (size_t i = 0; i < 3; i++)
        has_cart |= plumby_get(&vm, cart[i]) != NULL;
    for (size_t i = 0; i < 3; i++)
        if (has_cart && (st = plumby_forbid(&vm, polar[i],
                                            "together with east/north/up (give east, north, up or "
                                            "speed, heading, climb)")) != PLUMB_OK)
            return st;
    if (has_cart || !vm.node || (!plumby_get(&vm, "speed") && !plumby_get(&vm, "heading") &&
                                 !plumby_get(&vm, "climb"))) {
        for (size_t i = 0; i < 3; i++)
            if ((st = plumby_num(&vm, cart[i], 0, 0.0, &base->velocity_m_s[i], NULL)) != PLUMB_OK)
                return st;
    } else {
        double speed, heading, climb;
        if (!plumby_get(&vm, "speed"))
            return plumby_missing(&vm, "speed", "heading and climb come with a speed");
        if ((st = plumby_num(&vm, "speed", 1, 0.0, &speed, NULL)) != PLUMB_OK)
            return st;
        if (!plumby_get(&vm, "heading"))
            return plumby_missing(&vm, "heading",
                                  "a speed needs the heading it moves toward, clockwise from north");
        if ((st = plumby_num(&vm, "heading", 1, 0.0, &heading, NULL)) != PLUMB_OK ||
            (st = plumby_num(&vm, "climb", 0, 0.0, &climb, NULL)) != PLUMB_OK)
            return st;
        double h = heading * PLUMB_PI / 180.0;
        base->velocity_m_s[0] = speed * sin(h);
        base->velocity_m_s[1] = speed * cos(h);
        base->velocity_m_s[2] = climb;
    }

    int has_lat;
    if ((st = plumby_num(&sm, "elevation", 0, 0.0, &L->elevation_m, NULL)) != PLUMB_OK ||
        (st = plumby_num(&sm, "latitude", 0, 0.0, &base->gravity.latitude_deg, &has_lat)) !=
            PLUMB_OK)
        return st;
    base->gravity.has_latitude = has_lat;
    base->site_elevation_m = L->elevation_m;
    int has_lon;
    double lon;
    if ((st = plumby_num(&sm, "longitude", 0, 0.0, &lon, &has_lon)) != PLUMB_OK)
        return st;
    if (has_lon && !has_lat)
        return plumby_missing(&sm, "latitude", "a site longitude needs the site latitude too");
    L->p->zone.has_site = has_lon;
    L->p->zone.site_deg[0] = base->gravity.latitude_deg;
    L->p->zone.site_deg[1] = has_lon ? lon : 0.0;
    if ((st = map_point(L, &pm, base->release_m)) != PLUMB_OK)
        return st;
    if (L->elevation_m + L->height_m > PLUMB_STD1976_TOP_M)
        return plumby_raise_value(&rm, "height", PLUMB_ERANGE,
                                  "the release point, %.6g m above the strike level at %.6g m "
                                  "above sea level, is above %.6g m, the top of the 1976 "
                                  "atmosphere",
                                  L->height_m, L->elevation_m, PLUMB_STD1976_TOP_M);
    return PLUMB_OK;
}

/* 1976 temperature + dt_k > 0 over lo_m..hi_m (see the file comment). */
static plumb_status check_std_temperature(const plumby_map *am, double dt_k, double lo_m,
                                          double hi_m)
{
    double at[2 + ARRAY_LEN(std1976_bases_gp_m)];
    size_t n = 0;
    at[n++] = lo_m;
    at[n++] = hi_m;
    for (size_t i = 0; i < ARRAY_LEN(std1976_bases_gp_m); i++) {
        double h = std1976_bases_gp_m[i];
        double z = PLUMB_R0_M * h / (PLUMB_R0_M - h);
        if (z > lo_m && z < hi_m)
            at[n++] = z;
    }
    for (size_t i = 0; i < n; i++) {
        plumb_air air;
        plumb_status st = plumb_std1976(at[i], 0.0, &air);
        if (st != PLUMB_OK)
            return plumby_raise_value(am, "temperature_offset", st,
                                      "the 1976 atmosphere has no temperature at %.6g m", at[i]);
        if (!(air.t_k + dt_k > 0.0))
            return plumby_raise_value(am, "temperature_offset", PLUMB_ERANGE,
                                      "the temperature at %.6g m above sea level would be %.6g K "
                                      "(1976 standard %.6g K %+.6g K); it must stay above 0 K",
                                      at[i], air.t_k + dt_k, air.t_k, dt_k);
    }
    return PLUMB_OK;
}

static plumb_status read_atmosphere(loader *L)
{
    plumb_atm_spec *a = &L->p->atm;
    plumby_map am;
    plumb_status st;
    int model;
    plumby_sub(&L->root, "atmosphere", &am);
    plumb_atm_spec_init(a);
    if ((st = plumby_word(&am, "model", 0, &model)) != PLUMB_OK ||
        (st = plumby_num(&am, "humidity", 0, 0.0, &a->relative_humidity, NULL)) != PLUMB_OK)
        return st;
    double lo = L->elevation_m, hi = L->elevation_m + L->height_m;
    if (model == 0) {
        a->model = PLUMB_ATM_STD1976;
        static const char why[] = "with model standard-1976";
        if ((st = plumby_forbid(&am, "pressure", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "temperature", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "lapse_rate", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "table", why)) != PLUMB_OK ||
            (st = plumby_num(&am, "temperature_offset", 0, 0.0, &a->temperature_offset_k, NULL)) !=
                PLUMB_OK)
            return st;
        return check_std_temperature(&am, a->temperature_offset_k, lo, hi);
    }
    if (model == 1) {
        a->model = PLUMB_ATM_SURFACE;
        static const char why[] = "with model surface";
        double lapse = a->lapse_rate_k_m;
        int has_lapse;
        if ((st = plumby_forbid(&am, "temperature_offset", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "table", why)) != PLUMB_OK ||
            (st = plumby_num(&am, "pressure", 1, 0.0, &a->station_pressure_pa, NULL)) != PLUMB_OK ||
            (st = plumby_num(&am, "temperature", 1, 0.0, &a->station_temperature_k, NULL)) !=
                PLUMB_OK ||
            (st = plumby_num(&am, "lapse_rate", 0, lapse, &a->lapse_rate_k_m, &has_lapse)) !=
                PLUMB_OK)
            return st;
        a->station_alt_m = L->elevation_m;
        double t_top = a->station_temperature_k - a->lapse_rate_k_m * L->height_m;
        if (!(t_top > 0.0))
            return plumby_raise_value(&am, has_lapse ? "lapse_rate" : "temperature", PLUMB_ERANGE,
                                      "the temperature at the release height would be %.6g K "
                                      "(%.6g K - %.6g K/m x %.6g m); it must stay above 0 K",
                                      t_top, a->station_temperature_k, a->lapse_rate_k_m,
                                      L->height_m);
        return PLUMB_OK;
    }
    a->model = PLUMB_ATM_TABLE;
    static const char why[] = "with model table";
    if ((st = plumby_forbid(&am, "pressure", why)) != PLUMB_OK ||
        (st = plumby_forbid(&am, "temperature", why)) != PLUMB_OK ||
        (st = plumby_forbid(&am, "lapse_rate", why)) != PLUMB_OK)
        return st;
    const plumby_node *t = plumby_get(&am, "table");
    if (!t)
        return plumby_missing(&am, "table",
                              "model table needs rows {altitude: ..., density: ...}");
    char tkey[PLUMB_DIAG_KEY];
    plumby_key_join(tkey, sizeof tkey, am.key, "table", 0);
    if (t->n < 2)
        return plumby_raise(&L->ctx, t->origin, t->line, t->col, tkey, PLUMB_EINVAL,
                            "expected at least 2 rows, found %zu", t->n);
    size_t n = t->n;
    L->p->atm_alt_m = calloc(n, sizeof(double));
    L->p->atm_rho_kg_m3 = calloc(n, sizeof(double));
    if (!L->p->atm_alt_m || !L->p->atm_rho_kg_m3)
        return nomem(L);
    const plumby_schema *row_schema = &atm_row_item[0];
    int with_t = 0;
    for (size_t i = 0; i < n; i++) {
        plumby_map rowm;
        char rkey[PLUMB_DIAG_KEY];
        plumby_key_join(rkey, sizeof rkey, tkey, NULL, i);
        plumby_map_init(&rowm, &L->ctx, t->items[i], row_schema, rkey);
        int has_t = plumby_get(&rowm, "temperature") != NULL;
        if (i == 0 && has_t) {
            with_t = 1;
            if (!(L->p->atm_t_k = calloc(n, sizeof(double))))
                return nomem(L);
        }
        if (has_t != with_t) {
            if (has_t)
                return plumby_forbid(&rowm, "temperature",
                                     "in only some rows (give temperature in every row or none)");
            return plumby_missing(&rowm, "temperature",
                                  "the first row gives a temperature, so every row must");
        }
        if ((st = plumby_num(&rowm, "altitude", 1, 0.0, &L->p->atm_alt_m[i], NULL)) != PLUMB_OK ||
            (st = plumby_num(&rowm, "density", 1, 0.0, &L->p->atm_rho_kg_m3[i], NULL)) !=
                PLUMB_OK)
            return st;
        if (with_t &&
            (st = plumby_num(&rowm, "temperature", 1, 0.0, &L->p->atm_t_k[i], NULL)) != PLUMB_OK)
            return st;
        if (i > 0 && !(L->p->atm_alt_m[i] > L->p->atm_alt_m[i - 1]))
            return plumby_raise_value(&rowm, "altitude", PLUMB_EINVAL,
                                      "altitudes must increase row by row: %.6g m follows %.6g m",
                                      L->p->atm_alt_m[i], L->p->atm_alt_m[i - 1]);
    }
    if (with_t && (st = plumby_forbid(&am, "temperature_offset",
                                      "when the table gives temperatures")) != PLUMB_OK)
        return st;
    if ((st = plumby_num(&am, "temperature_offset", 0, 0.0, &a->temperature_offset_k, NULL)) !=
        PLUMB_OK)
        return st;
    if (L->p->atm_alt_m[0] > lo || L->p->atm_alt_m[n - 1] < hi)
        return plumby_raise(&L->ctx, t->origin, t->line, t->col, tkey, PLUMB_ERANGE,
                            "the table spans %.6g m .. %.6g m above sea level, but the fall spans "
                            "%.6g m .. %.6g m",
                            L->p->atm_alt_m[0], L->p->atm_alt_m[n - 1], lo, hi);
    a->table_n = n;
    a->table_alt_m = L->p->atm_alt_m;
    a->table_rho_kg_m3 = L->p->atm_rho_kg_m3;
    a->table_t_k = L->p->atm_t_k;
    if (!with_t)
        return check_std_temperature(&am, a->temperature_offset_k, lo, hi);
    return PLUMB_OK;
}

/* wind.turbulence (plumb/turbulence.h): a model (default dryden) and its
 * intensity as a word or W20; neither: W20 from the mean wind at 20 ft. */
static plumb_status read_turbulence(loader *L, plumb_turbulence_spec *t)
{
    plumby_map wm, tm;
    plumb_status st;
    memset(t, 0, sizeof *t);
    plumby_sub(&L->root, "wind", &wm);
    plumby_sub(&wm, "turbulence", &tm);
    if (!tm.node)
        return PLUMB_OK;
    int model = 0, word = 0;
    if ((st = plumby_word(&tm, "model", 0, &model)) != PLUMB_OK)
        return st;
    t->model = model == 0 ? PLUMB_TURB_DRYDEN : PLUMB_TURB_VON_KARMAN;
    int has_i = plumby_get(&tm, "intensity") != NULL, has_w = plumby_get(&tm, "w20") != NULL;
    if (has_i && has_w)
        return plumby_forbid(&tm, "w20", "together with intensity (give intensity or w20)");
    if (has_i) {
        static const double w20[] = {PLUMB_TURB_W20_LIGHT_M_S, PLUMB_TURB_W20_MODERATE_M_S,
                                     PLUMB_TURB_W20_SEVERE_M_S};
        if ((st = plumby_word(&tm, "intensity", 0, &word)) != PLUMB_OK)
            return st;
        t->w20_m_s = w20[word];
    } else if (has_w) {
        if ((st = plumby_num(&tm, "w20", 1, 0.0, &t->w20_m_s, NULL)) != PLUMB_OK)
            return st;
    } else {
        t->from_wind = 1;
    }
    return PLUMB_OK;
}

static plumb_status read_wind(loader *L, plumb_wind_spec *w)
{
    plumby_map wm;
    plumb_status st;
    int prof;
    plumby_sub(&L->root, "wind", &wm);
    plumb_wind_spec_init(w);
    if ((st = plumby_word(&wm, "profile", 0, &prof)) != PLUMB_OK)
        return st;
    static const char *const why[] = {"with profile uniform", "with profile power",
                                      "with profile log", "with profile table"};
    static const plumb_wind_profile kinds[] = {PLUMB_WIND_UNIFORM, PLUMB_WIND_POWER, PLUMB_WIND_LOG,
                                               PLUMB_WIND_TABLE};
    w->profile = kinds[prof];
    if (prof != 1 && (st = plumby_forbid(&wm, "exponent", why[prof])) != PLUMB_OK)
        return st;
    if (prof != 2 && (st = plumby_forbid(&wm, "roughness", why[prof])) != PLUMB_OK)
        return st;
    if ((prof == 0 || prof == 3) &&
        (st = plumby_forbid(&wm, "reference_height", why[prof])) != PLUMB_OK)
        return st;
    if (prof != 3) {
        if ((st = plumby_forbid(&wm, "table", why[prof])) != PLUMB_OK ||
            (st = plumby_num(&wm, "speed", 0, 0.0, &w->speed_m_s, NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "from", 0, 0.0, &w->from_deg, NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "reference_height", 0, w->ref_height_m, &w->ref_height_m,
                             NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "exponent", 0, w->exponent, &w->exponent, NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "roughness", 0, w->roughness_m, &w->roughness_m, NULL)) !=
                PLUMB_OK)
            return st;
        if (prof == 2 && !(w->roughness_m < w->ref_height_m))
            return plumby_raise_value(&wm, plumby_get(&wm, "roughness") ? "roughness"
                                                                          : "reference_height",
                                      PLUMB_ERANGE,
                                      "the roughness length (%.6g m) must be below the reference "
                                      "height (%.6g m)",
                                      w->roughness_m, w->ref_height_m);
        return PLUMB_OK;
    }
    if ((st = plumby_forbid(&wm, "speed", why[3])) != PLUMB_OK ||
        (st = plumby_forbid(&wm, "from", why[3])) != PLUMB_OK)
        return st;
    const plumby_node *t = plumby_get(&wm, "table");
    if (!t)
        return plumby_missing(&wm, "table",
                              "profile table needs rows {height: ..., speed: ..., from: ...}");
    char tkey[PLUMB_DIAG_KEY];
    plumby_key_join(tkey, sizeof tkey, wm.key, "table", 0);
    if (t->n < 1)
        return plumby_raise(&L->ctx, t->origin, t->line, t->col, tkey, PLUMB_EINVAL,
                            "expected at least 1 row, found none");
    size_t n = t->n;
    L->p->wind_h_m = calloc(n, sizeof(double));
    L->p->wind_e_m_s = calloc(n, sizeof(double));
    L->p->wind_n_m_s = calloc(n, sizeof(double));
    if (!L->p->wind_h_m || !L->p->wind_e_m_s || !L->p->wind_n_m_s)
        return nomem(L);
    for (size_t i = 0; i < n; i++) {
        plumby_map rowm;
        char rkey[PLUMB_DIAG_KEY];
        double speed, from;
        plumby_key_join(rkey, sizeof rkey, tkey, NULL, i);
        plumby_map_init(&rowm, &L->ctx, t->items[i], &wind_row_item[0], rkey);
        if ((st = plumby_num(&rowm, "height", 1, 0.0, &L->p->wind_h_m[i], NULL)) != PLUMB_OK ||
            (st = plumby_num(&rowm, "speed", 1, 0.0, &speed, NULL)) != PLUMB_OK ||
            (st = plumby_num(&rowm, "from", 1, 0.0, &from, NULL)) != PLUMB_OK)
            return st;
        if (i > 0 && !(L->p->wind_h_m[i] > L->p->wind_h_m[i - 1]))
            return plumby_raise_value(&rowm, "height", PLUMB_EINVAL,
                                      "heights must increase row by row: %.6g m follows %.6g m",
                                      L->p->wind_h_m[i], L->p->wind_h_m[i - 1]);
        plumb_wind_components(speed, from, &L->p->wind_e_m_s[i], &L->p->wind_n_m_s[i]);
    }
    w->table_n = n;
    w->table_h_m = L->p->wind_h_m;
    w->table_east_m_s = L->p->wind_e_m_s;
    w->table_north_m_s = L->p->wind_n_m_s;
    return PLUMB_OK;
}

static plumb_status read_criteria(loader *L)
{
    const plumby_node *c = plumby_get(&L->root, "criteria");
    if (!c)
        return PLUMB_OK;
    if (c->n == 0)
        return plumby_raise_value(&L->root, "criteria", PLUMB_EINVAL,
                                  "an empty list: name at least one criterion, or leave criteria "
                                  "out to judge against all of them");
    if (!(L->p->criteria = calloc(c->n, sizeof(char *))) ||
        !(L->p->criteria_pos = calloc(c->n, sizeof *L->p->criteria_pos)))
        return nomem(L);
    for (size_t i = 0; i < c->n; i++) {
        char id[PLUMB_DIAG_KEY], key[PLUMB_DIAG_KEY]; /* an id longer than a criterion id is unknown */
        const plumby_node *it = c->items[i];
        plumby_key_join(key, sizeof key, "criteria", NULL, i);
        plumb_status st = plumby_text_node(&L->ctx, it, key, id, sizeof id);
        if (st != PLUMB_OK)
            return st;
        for (size_t j = 0; j < i; j++)
            if (strcmp(L->p->criteria[j], id) == 0)
                return plumby_raise(&L->ctx, it->origin, it->line, it->col, key, PLUMB_EKEY,
                                    "criterion '%s' is listed twice (also criteria[%zu])", id, j);
        if (!(L->p->criteria[i] = malloc(strlen(id) + 1)))
            return nomem(L);
        memcpy(L->p->criteria[i], id, strlen(id) + 1);
        L->p->criteria_pos[i][0] = it->line;
        L->p->criteria_pos[i][1] = it->col;
        L->p->criteria_pos[i][2] = (int)it->origin;
        L->p->n_criteria = i + 1;
    }
    return PLUMB_OK;
}

/* Why a numeric key cannot carry an uncertainty in this profile. */
static const char *unc_reason(const char *key)
{
    if (strncmp(key, "payload.shape", 13) == 0)
        return "the shape is turned into cd and area when the profile is loaded; put the "
               "uncertainty on payload.drag.cd or payload.drag.area";
    if (strstr(key, "diameter"))
        return "the area is derived from the diameter; put the uncertainty on the area";
    if (strncmp(key, "atmosphere.", 11) == 0)
        return "the atmosphere is shared by every fall and cannot vary from sample to sample";
    if (strncmp(key, "zone.", 5) == 0)
        return "zone settings are not inputs of a fall";
    if (strncmp(key, "wind.table", 10) == 0)
        return "wind table rows cannot vary; use a uniform, power or log profile";
    if (strncmp(key, "items", 5) == 0)
        return "in an inventory, name the key payload.KEY: it then applies to every item";
    return "this profile does not use it as an input (it is not given, or the model or form "
           "chosen does not use it)";
}

/* Splits "VALUE +- TOL" (or "±") into two scalar nodes' texts. */
static int split_plus_minus(const char *t, char *a, char *b, size_t size)
{
    const char *pm = strstr(t, "+-");
    size_t sep = 2;
    if (!pm) {
        pm = strstr(t, "\xc2\xb1");
        sep = 2;
    }
    if (!pm)
        return 0;
    size_t la = (size_t)(pm - t);
    if (la >= size || strlen(pm + sep) >= size)
        return 0;
    memcpy(a, t, la);
    a[la] = '\0';
    while (la > 0 && a[la - 1] == ' ')
        a[--la] = '\0';
    const char *r = pm + sep;
    while (*r == ' ')
        r++;
    plumbp_strlcpy(b, r, size);
    return 1;
}


/* The unit part of a quantity's text ("9 mph" -> "mph"), trimmed. */
static void unit_text(const char *text, char *out, size_t size)
{
    char *end = NULL;
    (void)strtod(text, &end);
    const char *u = end && end != text ? end : text;
    while (*u == ' ')
        u++;
    plumbp_strlcpy(out, u, size);
    size_t n = strlen(out);
    while (n > 0 && out[n - 1] == ' ')
        out[--n] = '\0';
}

static plumb_status read_one_uncertainty(loader *L, const plumby_pair *pr, plumb_uncertainty *u)
{
    plumb_status st;
    char dkey[PLUMB_DIAG_KEY];
    const plumby_ctx *ctx = &L->ctx;
    plumby_key_join(dkey, sizeof dkey, "uncertainty", pr->key, 0);
    memset(u, 0, sizeof *u);
    plumbp_strlcpy(u->key, pr->key, sizeof u->key);
    u->line = pr->line;
    u->col = pr->col;
    if (strcmp(pr->key, "payload.attitude") == 0) {
        free(L->p->att_drag);
        if (!(L->p->att_drag = calloc(L->p->n_items ? L->p->n_items : 1, sizeof *L->p->att_drag)))
            return nomem(L);
        return plumbp_attitude_read(ctx, pr, L->p->shapes, L->p->n_items, L->p->inventory, u,
                                    L->p->att_drag);
    }

    /* the key: numeric, and an input of every fall */
    plumb_dim dim;
    plumb_diag kd;
    plumb_diag_clear(&kd);
    keypath kp;
    st = plumb_profile_key_dim(pr->key, &dim, &kd);
    if (st != PLUMB_OK)
        return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, st, "%s", kd.message);
    (void)keypath_resolve(pr->key, &kp, NULL, 0, NULL);
    const plumby_schema *ks = kp.seg[kp.n - 1].schema;
    if (ks->type == PLUMBY_T_LIST)
        ks = &ks->sub[0];
    if (ks->type != PLUMBY_T_NUM)
        return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, PLUMB_EINVAL,
                            "'%s' is a count, not a quantity that can vary", pr->key);
    int polar = strcmp(pr->key, "release.velocity.speed") == 0 ||
                strcmp(pr->key, "release.velocity.heading") == 0;
    for (size_t i = 0; i < L->p->n_items && !polar; i++) {
        if (!plumb_fall_spec_field(&L->p->items[i], pr->key)) {
            if (L->p->inventory)
                return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, PLUMB_EINVAL,
                                    "'%s' is not an input of item %zu (%s): %s", pr->key, i + 1,
                                    L->p->items[i].name, unc_reason(pr->key));
            return plumby_raise(ctx, pr->origin, pr->line, pr->col, dkey, PLUMB_EINVAL,
                                "'%s' cannot carry an uncertainty: %s", pr->key,
                                unc_reason(pr->key));
        }
    }

    const plumby_node *v = pr->value;
    char rtext[96];
    plumby_range_text(ks->range, dim, rtext, sizeof rtext);
    if (v->kind == PLUMBY_SCALAR) {
        char a[PLUMB_DIAG_MSG], b[PLUMB_DIAG_MSG];
        if (plumby_is_null(v) || !split_plus_minus(v->text, a, b, sizeof a))
            return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_EINVAL,
                                "expected {normal: [MEAN, SD]}, {uniform: [LO, HI]}, {triangular: "
                                "[LO, MODE, HI]} or \"VALUE +- TOL\", found %s",
                                plumby_describe(v, rtext, sizeof rtext));
        plumby_node na = *v, nb = *v;
        na.text = a;
        nb.text = b;
        double x, tol;
        if ((st = plumby_quantity(ctx, &na, dim, dkey, &x)) != PLUMB_OK ||
            (st = plumby_quantity(ctx, &nb, dim == PLUMB_DIM_TEMPERATURE ? PLUMB_DIM_TEMP_DIFF : dim,
                                  dkey, &tol)) != PLUMB_OK)
            return st;
        if (!(tol >= 0.0))
            return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_ERANGE,
                                "the tolerance must be >= 0, found '%s'", b);
        if (!plumby_range_ok(ks->range, x - tol) || !plumby_range_ok(ks->range, x + tol))
            return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_ERANGE,
                                "'%s' reaches outside the key's range (%s)", v->text, rtext);
        u->kind = PLUMB_DIST_UNIFORM;
        u->param[0] = x - tol;
        u->param[1] = x + tol;
        return PLUMB_OK;
    }
    if (v->kind != PLUMBY_MAP || v->n == 0)
        return plumby_raise(ctx, v->origin, v->line, v->col, dkey, PLUMB_EINVAL,
                            "expected {normal: [MEAN, SD]}, {uniform: [LO, HI]}, {triangular: "
                            "[LO, MODE, HI]} or \"VALUE +- TOL\", found %s",
                            plumby_describe(v, rtext, sizeof rtext));
    static const char *const dists[] = {"normal", "uniform", "triangular"};
    static const size_t n_params[] = {2, 2, 3};
    const plumby_pair *dp = &v->pairs[0];
    if (v->n > 1)
        return plumby_raise(ctx, v->pairs[1].origin, v->pairs[1].line, v->pairs[1].col, dkey,
                            PLUMB_EKEY, "give one distribution, found '%s' and '%s'", dp->key,
                            v->pairs[1].key);
    int kind = -1;
    for (int i = 0; i < 3; i++)
        if (strcmp(dp->key, dists[i]) == 0)
            kind = i;
    char pkey[PLUMB_DIAG_KEY];
    plumby_key_join(pkey, sizeof pkey, dkey, dp->key, 0);
    if (kind < 0) {
        const char *best = plumbp_closest(dp->key, dists, 3);
        return plumby_raise(ctx, dp->origin, dp->line, dp->col, pkey, PLUMB_EKEY,
                            "unknown distribution '%s'%s%s%s (normal, uniform or triangular)",
                            dp->key, best ? " (did you mean '" : "", best ? best : "",
                            best ? "'?)" : "");
    }
    const plumby_node *list = dp->value;
    size_t want = n_params[kind];
    static const char *const forms[] = {"[MEAN, SD]", "[LO, HI]", "[LO, MODE, HI]"};
    if (list->kind != PLUMBY_SEQ || list->n != want) {
        char found[64];
        if (list->kind == PLUMBY_SEQ)
            snprintf(found, sizeof found, "a list of %zu", list->n);
        else
            plumby_describe(list, found, sizeof found);
        return plumby_raise(ctx, list->origin, list->line, list->col, pkey, PLUMB_EINVAL,
                            "expected %s, found %s", forms[kind], found);
    }
    for (size_t i = 0; i < want; i++) {
        const plumby_node *it = list->items[i];
        char ikey[PLUMB_DIAG_KEY];
        plumby_key_join(ikey, sizeof ikey, pkey, NULL, i);
        if (it->kind != PLUMBY_SCALAR || plumby_is_null(it)) {
            char found[64];
            return plumby_raise(ctx, it->origin, it->line, it->col, ikey, PLUMB_EINVAL,
                                "expected a value with the unit of %s, found %s", pr->key,
                                plumby_describe(it, found, sizeof found));
        }
        plumb_dim d = dim;
        if (kind == 0 && i == 1 && dim == PLUMB_DIM_TEMPERATURE)
            d = PLUMB_DIM_TEMP_DIFF;
        if ((st = plumby_quantity(ctx, it, d, ikey, &u->param[i])) != PLUMB_OK)
            return st;
        int is_sd = kind == 0 && i == 1;
        if (is_sd && !(u->param[1] >= 0.0))
            return plumby_raise(ctx, it->origin, it->line, it->col, ikey, PLUMB_ERANGE,
                                "the standard deviation must be >= 0, found '%s'", it->text);
        if (!is_sd && !plumby_range_ok(ks->range, u->param[i]))
            return plumby_raise(ctx, it->origin, it->line, it->col, ikey, PLUMB_ERANGE,
                                "must be %s (the range of %s), found '%s'", rtext, pr->key,
                                it->text);
    }
    /* One unit in one distribution: [4 m/s, 9 mph] is a slip, not a range. */
    char unit0[PLUMB_DIAG_MSG], unit_i[PLUMB_DIAG_MSG];
    unit_text(list->items[0]->text, unit0, sizeof unit0);
    for (size_t i = 1; i < want; i++) {
        unit_text(list->items[i]->text, unit_i, sizeof unit_i);
        if (strcmp(unit0, unit_i) != 0) {
            char ikey[PLUMB_DIAG_KEY];
            plumby_key_join(ikey, sizeof ikey, pkey, NULL, i);
            return plumby_raise(ctx, list->items[i]->origin, list->items[i]->line,
                                list->items[i]->col, ikey, PLUMB_EUNIT,
                                "give every value of one distribution in the same unit: '%s' "
                                "after '%s'", list->items[i]->text, list->items[0]->text);
        }
    }
    u->kind = kind == 0 ? PLUMB_DIST_NORMAL : kind == 1 ? PLUMB_DIST_UNIFORM : PLUMB_DIST_TRIANGULAR;
    /* A direction sector may run through north: uniform [350 deg, 10 deg]. */
    if (kind == 1 && u->param[0] > u->param[1] && dim != PLUMB_DIM_ANGLE)
        return plumby_raise(ctx, list->origin, list->line, list->col, pkey, PLUMB_ERANGE,
                            "LO (%s) is above HI (%s)", list->items[0]->text,
                            list->items[1]->text);
    if (kind == 2 && !(u->param[0] <= u->param[1] && u->param[1] <= u->param[2]))
        return plumby_raise(ctx, list->origin, list->line, list->col, pkey, PLUMB_ERANGE,
                            "expected LO <= MODE <= HI, found [%s, %s, %s]", list->items[0]->text,
                            list->items[1]->text, list->items[2]->text);
    return PLUMB_OK;
}

static plumb_status read_uncertainty(loader *L)
{
    const plumby_node *u = plumby_get(&L->root, "uncertainty");
    if (!u || u->n == 0)
        return PLUMB_OK;
    if (!(L->p->unc = calloc(u->n, sizeof *L->p->unc)))
        return nomem(L);
    for (size_t i = 0; i < u->n; i++) {
        plumb_status st = read_one_uncertainty(L, &u->pairs[i], &L->p->unc[i]);
        if (st != PLUMB_OK)
            return st;
        L->p->n_unc = i + 1;
    }
    return PLUMB_OK;
}

static plumb_status read_zone(loader *L)
{
    plumb_zone_spec *z = &L->p->zone;
    plumby_map zm, tm;
    plumb_status st;
    unsigned long long samples, seed;
    plumby_sub(&L->root, "zone", &zm);
    plumby_sub(&zm, "target", &tm);
    if ((st = plumby_count(&zm, "samples", ZONE_SAMPLES_DEFAULT, 1, ZONE_SAMPLES_MAX, &samples)) !=
            PLUMB_OK ||
        (st = plumby_count(&zm, "seed", ZONE_SEED_DEFAULT, 0, ULONG_MAX, &seed)) != PLUMB_OK ||
        (st = plumby_num(&zm, "confidence", 0, ZONE_CONFIDENCE_DEFAULT, &z->confidence, NULL)) !=
            PLUMB_OK ||
        (st = plumby_num(&zm, "scatter", 0, 0.0, &z->scatter_m, NULL)) != PLUMB_OK)
        return st;
    z->samples = (size_t)samples;
    z->seed = (unsigned long)seed;
    z->has_target = tm.node != NULL;
    if (tm.node && (plumby_get(&tm, "latitude") || plumby_get(&tm, "longitude")))
        return map_point(L, &tm, z->target_m);
    if (tm.node && ((st = plumby_num(&tm, "east", 1, 0.0, &z->target_m[0], NULL)) != PLUMB_OK ||
                    (st = plumby_num(&tm, "north", 1, 0.0, &z->target_m[1], NULL)) != PLUMB_OK))
        return st;
    return PLUMB_OK;
}

/* The optional `job:` map: who and what the calculation is for. */
static plumb_status read_job(loader *L)
{
    plumb_job *j = &L->p->job;
    plumby_map jm;
    plumb_status st;
    plumby_sub(&L->root, "job", &jm);
    if ((st = plumby_text(&jm, "title", "", j->title, sizeof j->title)) != PLUMB_OK ||
        (st = plumby_text(&jm, "site", "", j->site, sizeof j->site)) != PLUMB_OK ||
        (st = plumby_text(&jm, "reference", "", j->reference, sizeof j->reference)) != PLUMB_OK ||
        (st = plumby_text(&jm, "prepared_by", "", j->prepared_by, sizeof j->prepared_by)) !=
            PLUMB_OK ||
        (st = plumby_text(&jm, "checked_by", "", j->checked_by, sizeof j->checked_by)) != PLUMB_OK)
        return st;
    return PLUMB_OK;
}

static plumb_status interpret(loader *L)
{
    plumb_profile *p = L->p;
    plumb_status st;
    char stem[PLUMB_NAME];
    file_stem(p->path, stem, sizeof stem);
    if ((st = plumby_text(&L->root, "name", stem, p->name, sizeof p->name)) != PLUMB_OK)
        return st;
    if (!p->name[0])
        return plumby_raise_value(&L->root, "name", PLUMB_EINVAL, "expected a name, found ''");

    plumb_fall_spec base;
    memset(&base, 0, sizeof base);
    plumbp_strlcpy(base.name, p->name, sizeof base.name);
    if ((st = read_release_site(L, &base)) != PLUMB_OK || (st = read_atmosphere(L)) != PLUMB_OK ||
        (st = read_wind(L, &base.wind)) != PLUMB_OK ||
        (st = read_turbulence(L, &base.turbulence)) != PLUMB_OK)
        return st;

    const plumby_node *items = plumby_get(&L->root, "items");
    const plumby_node *payload = plumby_get(&L->root, "payload");
    if (items && payload)
        return plumby_forbid(&L->root, "items",
                             "together with payload (a profile has payload: or items:)");
    if (!items && !payload)
        return plumby_missing(&L->root, "payload",
                              "give payload: {mass: ..., drag: ...}, or items: for an inventory");
    p->inventory = items != NULL;
    p->n_items = items ? items->n : 1;
    if (items && items->n == 0)
        return plumby_raise_value(&L->root, "items", PLUMB_EINVAL,
                                  "an empty list: give at least one item");
    p->items = calloc(p->n_items, sizeof *p->items);
    p->shapes = calloc(p->n_items, sizeof *p->shapes);
    if (!p->items || !p->shapes)
        return nomem(L);
    if (!items) {
        plumby_map pm;
        plumby_sub(&L->root, "payload", &pm);
        if ((st = read_item(L, &pm, 0, &base, &p->items[0], &p->shapes[0])) != PLUMB_OK)
            return st;
    } else {
        const plumby_schema *is = &plumby_schema_child(&root_schema, "items")->sub[0];
        for (size_t i = 0; i < items->n; i++) {
            plumby_map im;
            char key[PLUMB_DIAG_KEY];
            plumby_key_join(key, sizeof key, "items", NULL, i);
            plumby_map_init(&im, &L->ctx, items->items[i], is, key);
            if ((st = read_item(L, &im, 1, &base, &p->items[i], &p->shapes[i])) != PLUMB_OK)
                return st;
            for (size_t j = 0; j < i; j++)
                if (strcmp(p->items[j].name, p->items[i].name) == 0)
                    return plumby_raise_value(&im, "name", PLUMB_EKEY,
                                              "item name '%s' is used twice (also items[%zu])",
                                              p->items[i].name, j + 1);
        }
    }
    if ((st = read_criteria(L)) != PLUMB_OK || (st = read_uncertainty(L)) != PLUMB_OK ||
        (st = read_zone(L)) != PLUMB_OK || (st = read_job(L)) != PLUMB_OK)
        return st;
    return PLUMB_OK;
}

/* Applies sets to tree (owned), checks and interprets it into *out. */
static plumb_status build(const char *path, const char *sha, plumby_node *tree,
                          const plumb_units *units, const char *const *sets, size_t n_sets,
                          plumb_profile **out, plumb_diag *diag)
{
    plumb_status st;
    for (size_t i = 0; i < n_sets; i++) {
        if (!sets[i]) {
            plumby_free(tree);
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "override %zu is NULL", i);
        }
        if (tree->kind != PLUMBY_MAP)
            break; /* reported by the check below */
        if ((st = apply_set(tree, sets[i], (int)i + 1, diag)) != PLUMB_OK) {
            plumby_free(tree);
            return st;
        }
    }
    plumb_profile *p = calloc(1, sizeof *p);
    size_t plen = strlen(path);
    if (!p || !(p->path = malloc(plen + 1))) {
        free(p);
        plumby_free(tree);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the profile");
    }
    memcpy(p->path, path, plen + 1);
    p->tree = tree;
    plumbp_strlcpy(p->sha256, sha, sizeof p->sha256);

    loader L;
    memset(&L, 0, sizeof L);
    L.ctx.file = path;
    L.ctx.units = units;
    L.ctx.diag = diag;
    L.p = p;
    st = plumby_check(&L.ctx, tree, &root_schema, "");
    if (st == PLUMB_OK) {
        plumby_map_init(&L.root, &L.ctx, tree, &root_schema, "");
        st = interpret(&L);
    }
    if (st != PLUMB_OK) {
        plumb_profile_free(p);
        return st;
    }
    *out = p;
    return PLUMB_OK;
}

plumb_status plumb_profile_load(const char *path, const plumb_units *units,
                                const char *const *sets, size_t n_sets, plumb_profile **out,
                                plumb_diag *diag)
{
    if (out)
        *out = NULL;
    if (!path || !units || !out || (n_sets > 0 && !sets))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_load: NULL argument");
    char *buf;
    size_t len;
    plumb_status st = plumby_read_file(path, PLUMB_PROFILE_MAX_BYTES, &buf, &len, diag);
    if (st != PLUMB_OK)
        return st;
    char sha[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(buf, len, sha);
    plumby_node *tree;
    st = plumby_parse(buf, len, path, PLUMBY_FROM_FILE, 0, NULL, &tree, diag);
    free(buf);
    if (st != PLUMB_OK)
        return st;
    return build(path, sha, tree, units, sets, n_sets, out, diag);
}

plumb_status plumb_profile_load_buffer(const char *name, const char *buf, size_t len,
                                       const plumb_units *units, const char *const *sets,
                                       size_t n_sets, plumb_profile **out, plumb_diag *diag)
{
    if (out)
        *out = NULL;
    if (!name || (!buf && len > 0) || !units || !out || (n_sets > 0 && !sets))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_load_buffer: NULL argument");
    if (len > PLUMB_PROFILE_MAX_BYTES)
        return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, name, 0, 0, NULL,
                              "the profile has %zu bytes; at most %u bytes are accepted", len,
                              PLUMB_PROFILE_MAX_BYTES);
    char sha[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(buf ? buf : "", len, sha);
    plumby_node *tree;
    plumb_status st = plumby_parse(buf ? buf : "", len, name, PLUMBY_FROM_FILE, 0, NULL, &tree,
                                   diag);
    if (st != PLUMB_OK)
        return st;
    return build(name, sha, tree, units, sets, n_sets, out, diag);
}

plumb_status plumb_profile_derive(const plumb_profile *base, const plumb_units *units,
                                  const char *const *sets, size_t n_sets, plumb_profile **out,
                                  plumb_diag *diag)
{
    if (out)
        *out = NULL;
    if (!base || !units || !out || (n_sets > 0 && !sets))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_derive: NULL argument");
    if (!base->tree)
        return PLUMB_RAISE(diag, PLUMB_EINVAL,
                           "a profile built in code (plumb_profile_from_spec) has no profile "
                           "text to derive another from: change its spec and make a new one");
    plumby_node *tree = plumby_copy(base->tree);
    if (!tree)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory copying the profile");
    return build(base->path, base->sha256, tree, units, sets, n_sets, out, diag);
}

/* ---- accessors --------------------------------------------------------- */

const char *plumb_profile_path(const plumb_profile *p) { return p ? p->path : NULL; }
const char *plumb_profile_name(const plumb_profile *p) { return p ? p->name : NULL; }
const char *plumb_profile_sha256(const plumb_profile *p) { return p ? p->sha256 : NULL; }
int plumb_profile_is_inventory(const plumb_profile *p) { return p ? p->inventory : 0; }
size_t plumb_profile_item_count(const plumb_profile *p) { return p ? p->n_items : 0; }

const plumb_fall_spec *plumb_profile_item(const plumb_profile *p, size_t i)
{
    return p && i < p->n_items ? &p->items[i] : NULL;
}

const plumb_shape_spec *plumb_profile_item_shape(const plumb_profile *p, size_t i)
{
    return p && i < p->n_items ? &p->shapes[i] : NULL;
}

const plumb_atm_spec *plumb_profile_atmosphere(const plumb_profile *p)
{
    return p ? &p->atm : NULL;
}

size_t plumb_profile_criteria_count(const plumb_profile *p) { return p ? p->n_criteria : 0; }

void plumb_profile_criterion_position(const plumb_profile *p, size_t i, int *line, int *col)
{
    int ok = p && i < p->n_criteria && p->criteria_pos;
    *line = ok ? p->criteria_pos[i][0] : 0;
    *col = ok ? p->criteria_pos[i][1] : 0;
}

const char *plumb_profile_criterion_file(const plumb_profile *p, size_t i)
{
    if (!p)
        return NULL;
    if (i < p->n_criteria && p->criteria_pos && p->criteria_pos[i][2] == PLUMBY_FROM_SET)
        return PLUMBY_SET_FILE;
    return p->path;
}

const char *plumb_profile_criterion(const plumb_profile *p, size_t i)
{
    return p && i < p->n_criteria ? p->criteria[i] : NULL;
}

size_t plumb_profile_uncertainty_count(const plumb_profile *p) { return p ? p->n_unc : 0; }

const plumb_uncertainty *plumb_profile_uncertainty(const plumb_profile *p, size_t i)
{
    return p && i < p->n_unc ? &p->unc[i] : NULL;
}

const plumb_zone_spec *plumb_profile_zone(const plumb_profile *p) { return p ? &p->zone : NULL; }

const plumb_job *plumb_profile_job(const plumb_profile *p) { return p ? &p->job : NULL; }

int plumb_profile_attitude_drag(const plumb_profile *p, size_t item,
                                double out[PLUMB_MAX_ATTITUDES][2])
{
    if (!p || !p->att_drag || item >= p->n_items)
        return 0;
    memcpy(out, p->att_drag[item], sizeof p->att_drag[item]);
    return 1;
}

/* ---- fields of a fall spec --------------------------------------------- */

const plumby_schema *plumbp_profile_schema(void)
{
    return &root_schema;
}

/*
 * The double a key sets, or NULL when the key is not a per-fall numeric
 * input of this spec: not a single double of the spec (the key table's
 * home, io/keys.c: release.velocity.speed and heading become east/north;
 * shapes become cd and area; a diameter becomes an area; the air is not
 * in a fall spec), or not in effect for the spec's form or model (the
 * table's `when`: payload.drag.cd when cd_area was given, descent[1] with
 * one device, deploy.below for a device deployed `after`, site.latitude
 * without a latitude, wind.exponent for a profile other than power ...).
 */
double *plumb_fall_spec_field(plumb_fall_spec *s, const char *key)
{
    if (!s || !key)
        return NULL;
    size_t dev;
    long item;
    const plumbp_key *k = plumbp_key_find(key, &dev, &item);
    if (!k || item != -1 || k->home == PLUMBP_HOME_AIR)
        return NULL;
    return plumbp_key_field(k, s, NULL, dev);
}

/* ---- a profile of a spec built in code ------------------------------------ */

/* Appends "name=value\n" with the value to 17 significant digits (enough
 * to read back any double exactly): the canonical text that a code-built
 * profile's SHA-256 is taken of. */
static void canon(plumbp_sha256 *h, const char *name, double x)
{
    char line[PLUMB_DIAG_KEY + 40];
    int n = snprintf(line, sizeof line, "%s=%.17g\n", name, x);
    if (n > 0)
        plumbp_sha256_update(h, line, (size_t)n < sizeof line ? (size_t)n : sizeof line - 1);
}

static double *dup_doubles(const double *x, size_t n)
{
    double *d = x && n ? malloc(n * sizeof *d) : NULL;
    if (d)
        memcpy(d, x, n * sizeof *d);
    return d;
}

plumb_status plumb_profile_from_spec(const plumb_fall_spec *spec, const plumb_atm_spec *atm,
                                     const char *const *criteria, size_t n_criteria,
                                     plumb_profile **out, plumb_diag *diag)
{
    *out = NULL;
    if (!spec || !atm)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a profile from a spec needs the spec and its air");
    if (spec->wind.profile == PLUMB_WIND_TABLE &&
        (!spec->wind.table_n || !spec->wind.table_h_m || !spec->wind.table_east_m_s ||
         !spec->wind.table_north_m_s))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "wind.table", "a table wind needs its rows");
    if (atm->model == PLUMB_ATM_TABLE && (atm->table_n < 2 || !atm->table_alt_m ||
                                          !atm->table_rho_kg_m3))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "atmosphere.table",
                               "a table atmosphere needs at least 2 rows");
    plumb_profile *p = calloc(1, sizeof *p);
    if (!p)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    int oom = !(p->path = strdup(PLUMB_PROFILE_FROM_CODE)) ||
              !(p->items = malloc(sizeof *p->items)) || !(p->shapes = calloc(1, sizeof *p->shapes));
    if (!oom) {
        p->n_items = 1;
        p->items[0] = *spec;
        p->atm = *atm;
        plumbp_strlcpy(p->name, spec->name[0] ? spec->name : "payload", sizeof p->name);
        plumbp_strlcpy(p->items[0].name, p->name, sizeof p->items[0].name);
        if (spec->wind.profile == PLUMB_WIND_TABLE) {
            size_t n = spec->wind.table_n;
            p->wind_h_m = dup_doubles(spec->wind.table_h_m, n);
            p->wind_e_m_s = dup_doubles(spec->wind.table_east_m_s, n);
            p->wind_n_m_s = dup_doubles(spec->wind.table_north_m_s, n);
            oom = !p->wind_h_m || !p->wind_e_m_s || !p->wind_n_m_s;
            p->items[0].wind.table_h_m = p->wind_h_m;
            p->items[0].wind.table_east_m_s = p->wind_e_m_s;
            p->items[0].wind.table_north_m_s = p->wind_n_m_s;
        }
        if (!oom && atm->model == PLUMB_ATM_TABLE) {
            size_t n = atm->table_n;
            p->atm_alt_m = dup_doubles(atm->table_alt_m, n);
            p->atm_rho_kg_m3 = dup_doubles(atm->table_rho_kg_m3, n);
            p->atm_t_k = atm->table_t_k ? dup_doubles(atm->table_t_k, n) : NULL;
            oom = !p->atm_alt_m || !p->atm_rho_kg_m3 || (atm->table_t_k && !p->atm_t_k);
            p->atm.table_alt_m = p->atm_alt_m;
            p->atm.table_rho_kg_m3 = p->atm_rho_kg_m3;
            p->atm.table_t_k = p->atm_t_k;
        }
    }
    if (!oom && n_criteria) {
        oom = !(p->criteria = calloc(n_criteria, sizeof *p->criteria)) ||
              !(p->criteria_pos = calloc(n_criteria, sizeof *p->criteria_pos));
        for (size_t i = 0; !oom && i < n_criteria; i++) {
            oom = !(p->criteria[i] = strdup(criteria[i] ? criteria[i] : ""));
            if (!oom)
                p->n_criteria++;
        }
    }
    if (oom) {
        plumb_profile_free(p);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    }
    p->zone.samples = (size_t)ZONE_SAMPLES_DEFAULT;
    p->zone.seed = (unsigned long)ZONE_SEED_DEFAULT;
    p->zone.confidence = ZONE_CONFIDENCE_DEFAULT;

    /* SHA-256 of a canonical text of every input, so a report of a spec
     * built in code can still be traced to what was computed. */
    const plumb_fall_spec *s = &p->items[0];
    plumbp_sha256 h;
    plumbp_sha256_init(&h);
    plumbp_sha256_update(&h, p->name, strlen(p->name));
    canon(&h, "\nmass", s->mass_kg);
    canon(&h, "volume", s->volume_m3);
    canon(&h, "drag.model", (double)s->drag.model);
    canon(&h, "drag.cd", s->drag.cd);
    canon(&h, "drag.area", s->drag.area_m2);
    canon(&h, "drag.cd_area", s->drag.cd_area_m2);
    canon(&h, "drag.diameter", s->drag.diameter_m);
    for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        const plumb_descent_spec *d = &s->descent[i];
        canon(&h, "descent.kind", (double)d->kind);
        canon(&h, "descent.cd", d->cd);
        canon(&h, "descent.area", d->area_m2);
        canon(&h, "descent.diameter", d->diameter_m);
        canon(&h, "descent.trigger", (double)d->trigger);
        canon(&h, "descent.deploy", d->deploy_value);
        canon(&h, "descent.fill_time", d->fill_time_s);
        canon(&h, "descent.fill_constant", d->fill_constant);
        canon(&h, "descent.disreefs", (double)d->disreefs_previous);
        if (d->canopy != PLUMB_CANOPY_UNSPECIFIED || d->inflation_exponent > 0.0 ||
            d->opening_factor > 0.0) {
            canon(&h, "descent.canopy", (double)d->canopy);
            canon(&h, "descent.inflation_exponent", d->inflation_exponent);
            canon(&h, "descent.opening_factor", d->opening_factor);
        }
    }
    for (int i = 0; i < 3; i++) {
        canon(&h, "release", s->release_m[i]);
        canon(&h, "velocity", s->velocity_m_s[i]);
    }
    if (s->downwash.aircraft_mass_kg > 0.0 || s->downwash.disk_area_m2 > 0.0) {
        canon(&h, "downwash.aircraft_mass", s->downwash.aircraft_mass_kg);
        canon(&h, "downwash.disk_area", s->downwash.disk_area_m2);
    }
    if (s->glide.mode != PLUMB_GLIDE_OFF)
        canon(&h, "glide", (double)s->glide.mode);
    if (s->turbulence.model != PLUMB_TURB_NONE) {
        canon(&h, "turbulence.model", (double)s->turbulence.model);
        canon(&h, "turbulence.w20", s->turbulence.from_wind ? NAN : s->turbulence.w20_m_s);
    }
    canon(&h, "site.elevation", s->site_elevation_m);
    canon(&h, "gravity.latitude", s->gravity.has_latitude ? s->gravity.latitude_deg : NAN);
    canon(&h, "wind.profile", (double)s->wind.profile);
    canon(&h, "wind.speed", s->wind.speed_m_s);
    canon(&h, "wind.from", s->wind.from_deg);
    canon(&h, "wind.reference_height", s->wind.ref_height_m);
    canon(&h, "wind.exponent", s->wind.exponent);
    canon(&h, "wind.roughness", s->wind.roughness_m);
    for (size_t i = 0; s->wind.profile == PLUMB_WIND_TABLE && i < s->wind.table_n; i++) {
        canon(&h, "wind.table.height", s->wind.table_h_m[i]);
        canon(&h, "wind.table.east", s->wind.table_east_m_s[i]);
        canon(&h, "wind.table.north", s->wind.table_north_m_s[i]);
    }
    canon(&h, "atmosphere.model", (double)atm->model);
    canon(&h, "atmosphere.temperature_offset", atm->temperature_offset_k);
    canon(&h, "atmosphere.station_altitude", atm->station_alt_m);
    canon(&h, "atmosphere.pressure", atm->station_pressure_pa);
    canon(&h, "atmosphere.temperature", atm->station_temperature_k);
    canon(&h, "atmosphere.lapse_rate", atm->lapse_rate_k_m);
    canon(&h, "atmosphere.humidity", atm->relative_humidity);
    for (size_t i = 0; atm->model == PLUMB_ATM_TABLE && i < atm->table_n; i++) {
        canon(&h, "atmosphere.table.altitude", atm->table_alt_m[i]);
        canon(&h, "atmosphere.table.density", atm->table_rho_kg_m3[i]);
        canon(&h, "atmosphere.table.temperature", atm->table_t_k ? atm->table_t_k[i] : NAN);
    }
    for (size_t i = 0; i < p->n_criteria; i++) {
        plumbp_sha256_update(&h, "criterion=", 10);
        plumbp_sha256_update(&h, p->criteria[i], strlen(p->criteria[i]));
    }
    unsigned char dig[PLUMBP_SHA256_BYTES];
    plumbp_sha256_final(&h, dig);
    for (int i = 0; i < PLUMBP_SHA256_BYTES; i++)
        snprintf(p->sha256 + 2 * i, 3, "%02x", dig[i]);
    *out = p;
    return PLUMB_OK;
}

/* ---- the unit a key was given in -------------------------------------- */

/* The node at a resolved key path in a tree, or NULL: the walk of
 * tree_remove, reading. */
static const plumby_node *tree_get(const plumby_node *root, const keypath *kp)
{
    const plumby_node *cur = root;
    for (size_t i = 0; cur && i < kp->n; i++) {
        const kseg *s = &kp->seg[i];
        const plumby_pair *pair = cur->kind == PLUMBY_MAP ? plumby_find(cur, s->name) : NULL;
        if (!pair)
            return NULL;
        cur = pair->value;
        if (s->index != KSEG_NONE && cur->kind == PLUMBY_SEQ) {
            long at = s->index == KSEG_NAMED ? item_named(cur, s->item) : s->index;
            cur = at >= 0 && (size_t)at < cur->n ? cur->items[at] : NULL;
        } else if (s->index > 0 || s->index == KSEG_NAMED) {
            return NULL;
        }
    }
    return cur;
}

/* The scalar node of a dotted key ("release.height", "descent[1].area";
 * for an inventory, "payload.X" is item's own X, items[item + 1].X), or
 * NULL, through the key parser --set uses. */
static const plumby_node *key_node(const plumb_profile *p, size_t item, const char *key)
{
    char full[PLUMB_DIAG_KEY + 32];
    if (p->inventory && strncmp(key, "payload.", 8) == 0)
        snprintf(full, sizeof full, "items[%zu].%s", item + 1, key + 8);
    else
        snprintf(full, sizeof full, "%s", key);
    keypath kp;
    if (!p->tree || keypath_resolve(full, &kp, NULL, 0, NULL) != PLUMB_OK)
        return NULL;
    const plumby_node *n = tree_get(p->tree, &kp);
    return n && n->kind == PLUMBY_SCALAR ? n : NULL;
}

plumb_status plumb_profile_key_unit(const plumb_profile *p, size_t item, const char *key,
                                    char *unit, size_t size)
{
    if (!p || !key || !unit || size == 0)
        return PLUMB_RAISE(NULL, PLUMB_EINVAL, "plumb_profile_key_unit: NULL argument");
    unit[0] = '\0';
    const plumby_node *n = key_node(p, item, key);
    if (!n || !n->text)
        return PLUMB_OK;
    char *end;
    (void)strtod(n->text, &end);
    if (end == n->text)
        return PLUMB_OK;
    while (*end == ' ' || *end == '\t')
        end++;
    plumbp_strlcpy(unit, end, size);
    return PLUMB_OK;
}
