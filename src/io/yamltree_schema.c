/*
 * yamltree_schema.c - the schema checker over a YAML tree (yamltree.h) and
 * the readers of a checked map: every key known (with a did-you-mean by
 * edit distance), every value of the right kind, words in their lists;
 * then numbers with their units (units.c) in their ranges, words, one-line
 * text and whole numbers, each error located at the file, line, column and
 * dotted key of the value. The altitude range is the span of the U.S.
 * Standard Atmosphere 1976 (plumb/constants.h).
 */
#include <errno.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/constants.h"
#include "plumb/suggest.h"
#include "io/keys.h"
#include "io/units_int.h"
#include "io/yamltree.h"

/* ---- schema ------------------------------------------------------------ */

plumb_status plumby_raise(const plumby_ctx *ctx, plumby_origin origin, int line, int col,
                          const char *key, plumb_status status, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumbp_vraise(ctx->diag, status, origin == PLUMBY_FROM_SET ? PLUMBY_SET_FILE : ctx->file,
                  line, col, key, fmt, ap);
    va_end(ap);
    return status;
}

const plumby_schema *plumby_schema_child(const plumby_schema *map, const char *name)
{
    if (!map || (map->type != PLUMBY_T_MAP && map->type != PLUMBY_T_MAP_OR_LIST))
        return NULL;
    for (size_t i = 0; i < map->n_sub; i++)
        if (strcmp(map->sub[i].name, name) == 0)
            return &map->sub[i];
    return NULL;
}

const char *plumby_schema_suggest(const plumby_schema *map, const char *name)
{
    if (!map || (map->type != PLUMBY_T_MAP && map->type != PLUMBY_T_MAP_OR_LIST))
        return NULL;
    /* The keys' names a block at a time, the nearest so far first, so that
     * the first of equally near keys wins as in one call. */
    const char *names[32];
    const char *best = NULL;
    for (size_t i = 0; i < map->n_sub;) {
        size_t n = 0;
        if (best)
            names[n++] = best;
        while (i < map->n_sub && n < sizeof names / sizeof names[0])
            names[n++] = map->sub[i++].name;
        best = plumb_suggest_closest(name, names, n);
    }
    return best;
}

/* Appends ".part" (or "part" at the start) to path[size]; 0 when it does
 * not fit (path unchanged). */
static int path_push(char *path, size_t size, const char *part)
{
    size_t len = strlen(path);
    int n = snprintf(path + len, size - len, "%s%s", len ? "." : "", part);
    if (n < 0 || (size_t)n >= size - len) {
        path[len] = '\0';
        return 0;
    }
    return 1;
}

/* Breadth first, to `depth` levels below map: the path of the nearest
 * map that has a key `name` (a list's item written [N]). */
static int nested_below(const plumby_schema *map, const char *name, char *path, size_t size,
                        int depth)
{
    size_t len = strlen(path);
    for (size_t i = 0; i < map->n_sub; i++) {
        const plumby_schema *c = &map->sub[i];
        const plumby_schema *m = c->type == PLUMBY_T_LIST && c->n_sub ? &c->sub[0] : c;
        if ((m->type == PLUMBY_T_MAP || m->type == PLUMBY_T_MAP_OR_LIST) &&
            plumby_schema_child(m, name) && path_push(path, size, c->name) &&
            (m == c || path_push(path, size, "[N]")))
            return 1;
        path[len] = '\0';
    }
    if (depth <= 1)
        return 0;
    for (size_t i = 0; i < map->n_sub; i++) {
        const plumby_schema *c = &map->sub[i];
        const plumby_schema *m = c->type == PLUMBY_T_LIST && c->n_sub ? &c->sub[0] : c;
        if ((m->type == PLUMBY_T_MAP || m->type == PLUMBY_T_MAP_OR_LIST) &&
            path_push(path, size, c->name) && (m == c || path_push(path, size, "[N]")) &&
            nested_below(m, name, path, size, depth - 1))
            return 1;
        path[len] = '\0';
    }
    return 0;
}

const char *plumby_schema_nested(const plumby_schema *map, const char *name, char *path,
                                 size_t size)
{
    if (!map || !size || (map->type != PLUMBY_T_MAP && map->type != PLUMBY_T_MAP_OR_LIST))
        return NULL;
    path[0] = '\0';
    return nested_below(map, name, path, size, 4) ? path : NULL;
}

plumb_dim plumby_num_dim(const plumby_schema *s)
{
    return s->key ? s->key->dim : s->dim;
}

plumby_range plumby_num_range(const plumby_schema *s)
{
    return s->key ? s->key->range : s->range;
}

const char *plumby_expected(const plumby_schema *s, char *buf, size_t size)
{
    switch (s->type) {
    case PLUMBY_T_NUM: {
        plumb_dim dim = plumby_num_dim(s);
        if (dim == PLUMB_DIM_NONE)
            snprintf(buf, size, "a number");
        else if (dim == PLUMB_DIM_FRACTION)
            snprintf(buf, size, "a fraction (0.5, or 50 %%)");
        else
            snprintf(buf, size, "%s %s with its unit (SI: %s)",
                     (unsigned)dim < (unsigned)PLUMB_DIM_COUNT ? dims[dim].article : "a",
                     plumb_dim_name(dim), plumb_dim_si_unit(dim));
        break;
    }
    case PLUMBY_T_COUNT:
        snprintf(buf, size, "a whole number");
        break;
    case PLUMBY_T_WORD:
        if (s->words) {
            size_t used = (size_t)snprintf(buf, size, "one of ");
            for (size_t i = 0; i < s->n_words && used < size; i++)
                used += (size_t)snprintf(buf + used, size - used, "%s%s", i ? " | " : "",
                                         s->words[i]);
        } else {
            snprintf(buf, size, "a word");
        }
        break;
    case PLUMBY_T_TEXT:
        snprintf(buf, size, "text");
        break;
    case PLUMBY_T_MAP:
    case PLUMBY_T_FREE_MAP:
        snprintf(buf, size, "a map (key: value lines or {key: value})");
        break;
    case PLUMBY_T_LIST:
        snprintf(buf, size, "a list%s",
                 s->n_sub && s->sub[0].type == PLUMBY_T_MAP ? " of maps" : " ([a, b] or - lines)");
        break;
    case PLUMBY_T_MAP_OR_LIST:
        snprintf(buf, size, "a map, or a list of maps");
        break;
    }
    return buf;
}

static plumb_status mismatch(const plumby_ctx *ctx, const plumby_node *node,
                             const plumby_schema *s, const char *key)
{
    char want[256], found[64];
    plumby_expected(s, want, sizeof want);
    plumby_describe(node, found, sizeof found);
    return plumby_raise(ctx, node->origin, node->line, node->col, key, PLUMB_EINVAL,
                        "expected %s, found %s", want, found);
}

static plumb_status check_map(const plumby_ctx *ctx, const plumby_node *node,
                              const plumby_schema *s, const char *key)
{
    char sub_key[PLUMB_DIAG_KEY];
    for (size_t i = 0; i < node->n; i++) {
        const plumby_pair *p = &node->pairs[i];
        const plumby_schema *c = plumby_schema_child(s, p->key);
        plumby_key_join(sub_key, sizeof sub_key, key, p->key, 0);
        if (!c) {
            const char *best = plumby_schema_suggest(s, p->key);
            if (best)
                return plumby_raise(ctx, p->origin, p->line, p->col, sub_key, PLUMB_EKEY,
                                    "unknown key '%s' (did you mean '%s'?)", p->key, best);
            char path[PLUMB_DIAG_KEY];
            const char *under = plumby_schema_nested(s, p->key, path, sizeof path);
            if (under)
                return plumby_raise(ctx, p->origin, p->line, p->col, sub_key, PLUMB_EKEY,
                                    "unknown key '%s' here; it is a key of '%s' (did you mean "
                                    "'%s.%s'?)", p->key, under, under, p->key);
            char list[512];
            size_t used = 0;
            list[0] = '\0';
            for (size_t k = 0; k < s->n_sub && used < sizeof list; k++)
                used += (size_t)snprintf(list + used, sizeof list - used, "%s%s", k ? ", " : "",
                                         s->sub[k].name);
            return plumby_raise(ctx, p->origin, p->line, p->col, sub_key, PLUMB_EKEY,
                                "unknown key '%s' (keys here: %s)", p->key, list);
        }
        plumb_status st = plumby_check(ctx, p->value, c, sub_key);
        if (st != PLUMB_OK)
            return st;
    }
    return PLUMB_OK;
}

plumb_status plumby_check(const plumby_ctx *ctx, const plumby_node *node,
                          const plumby_schema *s, const char *key)
{
    char sub_key[PLUMB_DIAG_KEY];
    switch (s->type) {
    case PLUMBY_T_NUM:
    case PLUMBY_T_COUNT:
    case PLUMBY_T_WORD:
    case PLUMBY_T_TEXT:
        if (node->kind != PLUMBY_SCALAR || plumby_is_null(node))
            return mismatch(ctx, node, s, key);
        if (s->type == PLUMBY_T_WORD && s->words) {
            for (size_t i = 0; i < s->n_words; i++)
                if (strcmp(node->text, s->words[i]) == 0)
                    return PLUMB_OK;
            char want[256];
            plumby_expected(s, want, sizeof want);
            const char *best = plumb_suggest_closest(node->text, s->words, s->n_words);
            if (best)
                return plumby_raise(ctx, node->origin, node->line, node->col, key, PLUMB_EINVAL,
                                    "expected %s, found '%s' (did you mean '%s'?)", want,
                                    node->text, best);
            return plumby_raise(ctx, node->origin, node->line, node->col, key, PLUMB_EINVAL,
                                "expected %s, found '%s'", want, node->text);
        }
        return PLUMB_OK;
    case PLUMBY_T_MAP:
        if (node->kind != PLUMBY_MAP)
            return mismatch(ctx, node, s, key);
        return check_map(ctx, node, s, key);
    case PLUMBY_T_FREE_MAP:
        if (node->kind != PLUMBY_MAP)
            return mismatch(ctx, node, s, key);
        return PLUMB_OK;
    case PLUMBY_T_LIST:
        if (node->kind != PLUMBY_SEQ)
            return mismatch(ctx, node, s, key);
        for (size_t i = 0; i < node->n; i++) {
            /* an inventory's items are named by their number as written */
            size_t at = ctx->item_no && i < ctx->n_item_no && strcmp(key, PLUMBY_ITEMS_KEY) == 0
                            ? ctx->item_no[i] - 1 : i;
            plumby_key_join(sub_key, sizeof sub_key, key, NULL, at);
            plumb_status st = plumby_check(ctx, node->items[i], &s->sub[0], sub_key);
            if (st != PLUMB_OK)
                return st;
        }
        return PLUMB_OK;
    case PLUMBY_T_MAP_OR_LIST:
        if (node->kind == PLUMBY_MAP)
            return check_map(ctx, node, s, key);
        if (node->kind != PLUMBY_SEQ)
            return mismatch(ctx, node, s, key);
        for (size_t i = 0; i < node->n; i++) {
            plumby_key_join(sub_key, sizeof sub_key, key, NULL, i);
            if (node->items[i]->kind != PLUMBY_MAP) {
                char found[64];
                plumby_describe(node->items[i], found, sizeof found);
                return plumby_raise(ctx, node->items[i]->origin, node->items[i]->line,
                                    node->items[i]->col, sub_key, PLUMB_EINVAL,
                                    "expected a map, found %s", found);
            }
            plumb_status st = check_map(ctx, node->items[i], s, sub_key);
            if (st != PLUMB_OK)
                return st;
        }
        return PLUMB_OK;
    }
    return PLUMB_OK;
}

/* Error d (status st) kept in *best when it comes before it in line and
 * column order; out of memory before any: the machine failed, and the
 * list would not be the input's. */
static void keep_first(const plumb_diag *d, plumb_status st, plumb_diag *best,
                       plumb_status *best_st)
{
    int machine = st != PLUMB_OK && !plumb_status_is_input_error(st);
    int best_machine = *best_st != PLUMB_OK && !plumb_status_is_input_error(*best_st);
    if (st != PLUMB_OK && !best_machine &&
        (machine || *best_st == PLUMB_OK || d->line < best->line ||
         (d->line == best->line && d->col < best->col))) {
        *best = *d;
        *best_st = st;
    }
}

/* The numbers of one tree node (only those a --set gave when only_set),
 * checked on their own (their unit and range), the earliest error (in
 * line and column order) kept in *best. With only_set, a value a --set
 * gave is checked against the schema too (plumby_check: its kind, and
 * the keys and words of what it holds), so that a --set of the wrong
 * kind (payload.drag=5) is told first as a --set's own unit or range is,
 * not after an error the file has elsewhere. */
static void set_values(const plumby_ctx *ctx, const plumby_node *node, const plumby_schema *s,
                       const char *key, int only_set, plumb_diag *best, plumb_status *best_st)
{
    char sub_key[PLUMB_DIAG_KEY];
    if (!node || !s)
        return;
    if (only_set && node->origin == PLUMBY_FROM_SET) {
        plumb_diag d;
        plumb_diag_clear(&d);
        plumby_ctx c = *ctx;
        c.diag = &d;
        keep_first(&d, plumby_check(&c, node, s, key), best, best_st);
    }
    switch (s->type) {
    case PLUMBY_T_NUM: {
        if (node->kind != PLUMBY_SCALAR || (only_set && node->origin != PLUMBY_FROM_SET) ||
            plumby_is_null(node))
            return;
        plumb_diag d;
        plumb_diag_clear(&d);
        plumby_ctx c = *ctx;
        c.diag = &d;
        double v;
        keep_first(&d, plumby_num_node(&c, node, s, key, &v), best, best_st);
        return;
    }
    case PLUMBY_T_MAP:
    case PLUMBY_T_MAP_OR_LIST:
        if (node->kind == PLUMBY_MAP) {
            for (size_t i = 0; i < node->n; i++) {
                plumby_key_join(sub_key, sizeof sub_key, key, node->pairs[i].key, 0);
                set_values(ctx, node->pairs[i].value, plumby_schema_child(s, node->pairs[i].key),
                           sub_key, only_set, best, best_st);
            }
        } else if (node->kind == PLUMBY_SEQ && s->type == PLUMBY_T_MAP_OR_LIST) {
            for (size_t i = 0; i < node->n; i++) {
                plumby_key_join(sub_key, sizeof sub_key, key, NULL, i);
                const plumby_node *it = node->items[i];
                for (size_t k = 0; it->kind == PLUMBY_MAP && k < it->n; k++) {
                    char item_key[PLUMB_DIAG_KEY];
                    plumby_key_join(item_key, sizeof item_key, sub_key, it->pairs[k].key, 0);
                    set_values(ctx, it->pairs[k].value, plumby_schema_child(s, it->pairs[k].key),
                               item_key, only_set, best, best_st);
                }
            }
        }
        return;
    case PLUMBY_T_LIST:
        if (node->kind != PLUMBY_SEQ || !s->n_sub)
            return;
        for (size_t i = 0; i < node->n; i++) {
            size_t at = ctx->item_no && i < ctx->n_item_no && strcmp(key, PLUMBY_ITEMS_KEY) == 0
                            ? ctx->item_no[i] - 1 : i;
            plumby_key_join(sub_key, sizeof sub_key, key, NULL, at);
            set_values(ctx, node->items[i], &s->sub[0], sub_key, only_set, best, best_st);
        }
        return;
    default:
        return;
    }
}

plumb_status plumby_check_values(const plumby_ctx *ctx, const plumby_node *node,
                                 const plumby_schema *s, int only_set)
{
    plumb_diag best;
    plumb_diag_clear(&best);
    plumb_status st = PLUMB_OK;
    set_values(ctx, node, s, "", only_set, &best, &st);
    if (st != PLUMB_OK && ctx->diag)
        *ctx->diag = best;
    return st;
}

void plumby_range_bounds(plumby_range range, double *lo, double *hi, int *lo_open,
                         int *hi_open)
{
    *lo = -HUGE_VAL;
    *hi = HUGE_VAL;
    *lo_open = *hi_open = 0;
    switch (range) {
    case PLUMBY_R_ANY: break;
    case PLUMBY_R_POSITIVE: *lo = 0.0; *lo_open = 1; break;
    case PLUMBY_R_NONNEG: *lo = 0.0; break;
    case PLUMBY_R_CD: *lo = 0.0; *hi = PLUMBY_CD_MAX; break;
    case PLUMBY_R_CD_POSITIVE: *lo = 0.0; *hi = PLUMBY_CD_MAX; *lo_open = 1; break;
    case PLUMBY_R_UNIT: *lo = 0.0; *hi = 1.0; break;
    case PLUMBY_R_UNIT_OPEN: *lo = 0.0; *hi = 1.0; *lo_open = *hi_open = 1; break;
    case PLUMBY_R_LATITUDE: *lo = -90.0; *hi = 90.0; break;
    case PLUMBY_R_LONGITUDE: *lo = -180.0; *hi = 180.0; break;
    case PLUMBY_R_ALTITUDE: *lo = PLUMB_STD1976_BOTTOM_M; *hi = PLUMB_STD1976_TOP_M; break;
    case PLUMBY_R_SUBSONIC: *lo = -PLUMB_SOUND_SPEED_SL_M_S; *hi = PLUMB_SOUND_SPEED_SL_M_S; break;
    case PLUMBY_R_SUBSONIC_NONNEG: *lo = 0.0; *hi = PLUMB_SOUND_SPEED_SL_M_S; break;
    case PLUMBY_R_TEMP_OFFSET: *lo = -PLUMB_TEMP_OFFSET_MAX_K; *hi = PLUMB_TEMP_OFFSET_MAX_K; break;
    case PLUMBY_R_AIR_TEMPERATURE:
        *lo = PLUMB_AIR_TEMPERATURE_MIN_K;
        *hi = PLUMB_AIR_TEMPERATURE_MAX_K;
        break;
    case PLUMBY_R_MASS: *lo = 0.0; *hi = PLUMB_MASS_MAX_KG; *lo_open = 1; break;
    }
}

int plumby_range_ok(plumby_range range, double v)
{
    double lo, hi;
    int lo_open, hi_open;
    if (range == PLUMBY_R_ANY)
        return 1;
    plumby_range_bounds(range, &lo, &hi, &lo_open, &hi_open);
    return (lo_open ? v > lo : v >= lo) && (hi_open ? v < hi : v <= hi);
}

const char *plumby_range_text(plumby_range range, plumb_dim dim, char *buf, size_t size)
{
    char u[32] = "";
    if (dim != PLUMB_DIM_NONE && dim != PLUMB_DIM_FRACTION)
        snprintf(u, sizeof u, " %s", plumb_dim_si_unit(dim));
    switch (range) {
    case PLUMBY_R_ANY: snprintf(buf, size, "a finite number"); break;
    case PLUMBY_R_POSITIVE: snprintf(buf, size, "> 0%s", u); break;
    case PLUMBY_R_NONNEG: snprintf(buf, size, ">= 0%s", u); break;
    case PLUMBY_R_CD: snprintf(buf, size, "0 .. %g (0: drag-free)", PLUMBY_CD_MAX); break;
    case PLUMBY_R_CD_POSITIVE: snprintf(buf, size, "> 0 and <= %g", PLUMBY_CD_MAX); break;
    case PLUMBY_R_UNIT:
        snprintf(buf, size, dim == PLUMB_DIM_FRACTION ? "0 .. 1 (0 %% .. 100 %%)" : "0 .. 1");
        break;
    case PLUMBY_R_UNIT_OPEN: snprintf(buf, size, "> 0 and < 1"); break;
    case PLUMBY_R_LATITUDE: snprintf(buf, size, "-90%s .. 90%s", u, u); break;
    case PLUMBY_R_LONGITUDE: snprintf(buf, size, "-180%s .. 180%s", u, u); break;
    case PLUMBY_R_ALTITUDE:
        snprintf(buf, size, "%g%s .. %g%s", PLUMB_STD1976_BOTTOM_M, u, PLUMB_STD1976_TOP_M, u);
        break;
    case PLUMBY_R_SUBSONIC:
    case PLUMBY_R_SUBSONIC_NONNEG:
        snprintf(buf, size,
                 "%g%s .. %g%s (below the speed of sound at sea level: the drag model is for "
                 "subsonic air speeds)",
                 range == PLUMBY_R_SUBSONIC ? -PLUMB_SOUND_SPEED_SL_M_S : 0.0, u,
                 PLUMB_SOUND_SPEED_SL_M_S, u);
        break;
    case PLUMBY_R_TEMP_OFFSET:
        snprintf(buf, size,
                 "-%g%s .. %g%s (air on Earth: surface records lie within 100 K of the "
                 "standard 15 degC)", PLUMB_TEMP_OFFSET_MAX_K, u, PLUMB_TEMP_OFFSET_MAX_K, u);
        break;
    case PLUMBY_R_AIR_TEMPERATURE:
        /* the bounds in degC exactly (-123.15 .. 126.85), never rounded
         * outward: "127 degC" would name a temperature that is refused */
        snprintf(buf, size,
                 "%g%s .. %g%s (%g degC .. %g degC: air on Earth; was the unit meant degC "
                 "or degF?)", PLUMB_AIR_TEMPERATURE_MIN_K, u, PLUMB_AIR_TEMPERATURE_MAX_K, u,
                 PLUMB_AIR_TEMPERATURE_MIN_K - PLUMB_CELSIUS_ZERO_K,
                 PLUMB_AIR_TEMPERATURE_MAX_K - PLUMB_CELSIUS_ZERO_K);
        break;
    case PLUMBY_R_MASS:
        snprintf(buf, size,
                 "> 0%s and <= %g%s (%g t: five times the heaviest single lift yet made)", u,
                 PLUMB_MASS_MAX_KG, u, PLUMB_MASS_MAX_KG / 1000.0);
        break;
    }
    return buf;
}

/* plumby_quantity with what the key accepts (acc, or NULL), so that no
 * message suggests a value it refuses. */
static plumb_status quantity_in(const plumby_ctx *ctx, const plumby_node *node, plumb_dim dim,
                                const plumbp_accept *acc, const char *key, double *out)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    double v = 0.0;
    plumb_status st = plumbp_units_parse_in(ctx->units, node->text, dim, acc, &v, &d);
    if (st != PLUMB_OK)
        return plumby_raise(ctx, node->origin, node->line, node->col, key, st, "%s",
                            d.message[0] ? d.message : plumb_strerror(st));
    if (!plumbp_finite(v))
        return plumby_raise(ctx, node->origin, node->line, node->col, key, PLUMB_ERANGE,
                            "expected a finite number, found '%s'", node->text);
    *out = v;
    return PLUMB_OK;
}

plumb_status plumby_quantity(const plumby_ctx *ctx, const plumby_node *node, plumb_dim dim,
                             const char *key, double *out)
{
    return quantity_in(ctx, node, dim, NULL, key, out);
}

/* ---- reading ----------------------------------------------------------- */

char *plumby_key_join(char *dst, size_t size, const char *prefix, const char *name, size_t i)
{
    /* Built in room for the longest key and index, then cut to size: a key
     * longer than dst is shortened; the diagnostic still names its start. */
    char tmp[2 * PLUMB_DIAG_KEY + 32];
    if (!name)
        snprintf(tmp, sizeof tmp, "%s[%zu]", prefix ? prefix : "",
                 prefix && strcmp(prefix, PLUMBY_ITEMS_KEY) == 0 ? i + 1 : i);
    else if (!prefix || !prefix[0])
        snprintf(tmp, sizeof tmp, "%s", name);
    else
        snprintf(tmp, sizeof tmp, "%s.%s", prefix, name);
    plumbp_strlcpy(dst, tmp, size);
    return dst;
}

void plumby_map_init(plumby_map *m, const plumby_ctx *ctx, const plumby_node *node,
                     const plumby_schema *schema, const char *key)
{
    m->ctx = ctx;
    m->node = node;
    m->schema = schema;
    plumbp_strlcpy(m->key, key, sizeof m->key);
    m->line = node ? node->line : 1;
    m->col = node ? node->col : 1;
    m->origin = node ? node->origin : PLUMBY_FROM_FILE;
}

const plumby_node *plumby_get(const plumby_map *m, const char *name)
{
    const plumby_pair *p = plumby_find(m->node, name);
    return p ? p->value : NULL;
}

void plumby_sub(const plumby_map *m, const char *name, plumby_map *out)
{
    const plumby_node *v = plumby_get(m, name);
    char key[PLUMB_DIAG_KEY];
    plumby_key_join(key, sizeof key, m->key, name, 0);
    plumby_map_init(out, m->ctx, v, plumby_schema_child(m->schema, name), key);
    if (!v) {
        out->line = m->line;
        out->col = m->col;
        out->origin = m->origin;
    }
}

const plumby_removal *plumby_removed(const plumby_ctx *ctx, const char *key)
{
    for (size_t i = 0; ctx && ctx->removed && i < ctx->n_removed; i++) {
        const char *r = ctx->removed[i].key;
        size_t n = strlen(r);
        if (n > 0 && strncmp(key, r, n) == 0 &&
            (key[n] == '\0' || key[n] == '.' || key[n] == '['))
            return &ctx->removed[i];
    }
    return NULL;
}

plumb_status plumby_missing(const plumby_map *m, const char *name, const char *why)
{
    char key[PLUMB_DIAG_KEY];
    plumby_key_join(key, sizeof key, m->key, name, 0);
    const char *where = m->key[0] ? m->key : "the top level";
    const plumby_removal *r = plumby_removed(m->ctx, key);
    if (r && strcmp(r->key, key) == 0)
        return plumby_raise(m->ctx, PLUMBY_FROM_SET, r->line, r->col, key, PLUMB_EKEY,
                            "required key '%s' is missing from %s: this --set removed it%s%s",
                            name, where, why ? "; " : "", why ? why : "");
    if (r)
        return plumby_raise(m->ctx, PLUMBY_FROM_SET, r->line, r->col, key, PLUMB_EKEY,
                            "required key '%s' of %s is missing: this --set removed %s%s%s",
                            name, where, r->key, why ? "; " : "", why ? why : "");
    if (!m->node)
        return plumby_raise(m->ctx, m->origin, m->line, m->col, key, PLUMB_EKEY,
                            "required key '%s' is missing (%s is not given)%s%s", name, where,
                            why ? ": " : "", why ? why : "");
    return plumby_raise(m->ctx, m->origin, m->line, m->col, key, PLUMB_EKEY,
                        "required key '%s' is missing from %s%s%s", name, where,
                        why ? ": " : "", why ? why : "");
}

plumb_status plumby_forbid(const plumby_map *m, const char *name, const char *why)
{
    const plumby_pair *p = plumby_find(m->node, name);
    if (!p)
        return PLUMB_OK;
    char key[PLUMB_DIAG_KEY];
    plumby_key_join(key, sizeof key, m->key, name, 0);
    return plumby_raise(m->ctx, p->origin, p->line, p->col, key, PLUMB_EKEY,
                        "'%s' is not used %s; remove it", name, why);
}

plumb_status plumby_raise_value(const plumby_map *m, const char *name, plumb_status status,
                                const char *fmt, ...)
{
    char key[PLUMB_DIAG_KEY];
    plumby_key_join(key, sizeof key, m->key, name, 0);
    const plumby_node *v = plumby_get(m, name);
    va_list ap;
    va_start(ap, fmt);
    if (v)
        plumbp_vraise(m->ctx->diag, status,
                      v->origin == PLUMBY_FROM_SET ? PLUMBY_SET_FILE : m->ctx->file, v->line,
                      v->col, key, fmt, ap);
    else
        plumbp_vraise(m->ctx->diag, status,
                      m->origin == PLUMBY_FROM_SET ? PLUMBY_SET_FILE : m->ctx->file, m->line,
                      m->col, key, fmt, ap);
    va_end(ap);
    return status;
}

plumb_status plumby_num_node(const plumby_ctx *ctx, const plumby_node *node,
                             const plumby_schema *s, const char *key, double *out)
{
    double v;
    plumb_dim dim = plumby_num_dim(s);
    plumby_range range = plumby_num_range(s);
    /* a direction (an angle of any value: wind.from, a heading) may be a
     * compass point alone, as people on site give it: "NE" is 45 deg */
    double bearing = dim == PLUMB_DIM_ANGLE && range == PLUMBY_R_ANY && node->text
                         ? plumbp_units_compass_bearing(node->text) : -1.0;
    if (bearing >= 0.0) {
        *out = bearing; /* angles are read in degrees (units.h) */
        return PLUMB_OK;
    }
    /* what the key accepts, so that no message suggests a value it refuses */
    char r[160];
    plumby_range_text(range, dim, r, sizeof r);
    plumbp_accept acc = {0.0, 0.0, 0, 0, r};
    plumby_range_bounds(range, &acc.lo, &acc.hi, &acc.lo_open, &acc.hi_open);
    plumb_status st = quantity_in(ctx, node, dim, range == PLUMBY_R_ANY ? NULL : &acc, key, &v);
    if (st != PLUMB_OK)
        return st;
    if (!plumby_range_ok(range, v)) {
        return plumby_raise(ctx, node->origin, node->line, node->col, key, PLUMB_ERANGE,
                            "must be %s, found '%s'", r, node->text);
    }
    *out = v;
    return PLUMB_OK;
}

plumb_status plumby_num(const plumby_map *m, const char *name, int required, double dflt,
                        double *out, int *present)
{
    const plumby_node *v = plumby_get(m, name);
    if (present)
        *present = v != NULL;
    if (!v) {
        if (required)
            return plumby_missing(m, name, NULL);
        *out = dflt;
        return PLUMB_OK;
    }
    char key[PLUMB_DIAG_KEY];
    plumby_key_join(key, sizeof key, m->key, name, 0);
    return plumby_num_node(m->ctx, v, plumby_schema_child(m->schema, name), key, out);
}

plumb_status plumby_word(const plumby_map *m, const char *name, int dflt, int *out)
{
    const plumby_node *v = plumby_get(m, name);
    if (!v) {
        if (dflt < 0)
            return plumby_missing(m, name, NULL);
        *out = dflt;
        return PLUMB_OK;
    }
    const plumby_schema *s = plumby_schema_child(m->schema, name);
    for (size_t i = 0; i < s->n_words; i++) {
        if (strcmp(v->text, s->words[i]) == 0) {
            *out = (int)i;
            return PLUMB_OK;
        }
    }
    /* plumby_check has refused other words already. */
    return plumby_raise_value(m, name, PLUMB_EINVAL, "unexpected word '%s'", v->text);
}

plumb_status plumby_text_node(const plumby_ctx *ctx, const plumby_node *node, const char *key,
                              char *dst, size_t size)
{
    size_t len = strlen(node->text);
    if (len >= size)
        return plumby_raise(ctx, node->origin, node->line, node->col, key, PLUMB_ERANGE,
                            "text of %zu bytes; at most %zu are accepted", len, size - 1);
    for (size_t i = 0; i < len; i++) {
        unsigned char c = (unsigned char)node->text[i];
        if (c < 0x20u || c == 0x7fu)
            return plumby_raise(ctx, node->origin, node->line, node->col, key, PLUMB_EINVAL,
                                "control character 0x%02X in text (one line of text expected)",
                                (unsigned)c);
    }
    memcpy(dst, node->text, len + 1);
    return PLUMB_OK;
}

plumb_status plumby_text(const plumby_map *m, const char *name, const char *dflt, char *dst,
                         size_t size)
{
    const plumby_node *v = plumby_get(m, name);
    if (!v) {
        if (!dflt)
            return plumby_missing(m, name, NULL);
        plumbp_strlcpy(dst, dflt, size);
        return PLUMB_OK;
    }
    char key[PLUMB_DIAG_KEY];
    plumby_key_join(key, sizeof key, m->key, name, 0);
    return plumby_text_node(m->ctx, v, key, dst, size);
}

plumb_status plumby_count(const plumby_map *m, const char *name, unsigned long long dflt,
                          unsigned long long lo, unsigned long long hi, unsigned long long *out)
{
    const plumby_node *v = plumby_get(m, name);
    if (!v) {
        *out = dflt;
        return PLUMB_OK;
    }
    const char *t = v->text;
    int digits = t[0] != '\0';
    for (const char *c = t; *c; c++)
        if (*c < '0' || *c > '9')
            digits = 0;
    errno = 0;
    unsigned long long x = digits ? strtoull(t, NULL, 10) : 0;
    if (!digits || errno == ERANGE || x < lo || x > hi)
        return plumby_raise_value(m, name, digits ? PLUMB_ERANGE : PLUMB_EINVAL,
                                  "expected a whole number %llu .. %llu, found '%s'", lo, hi, t);
    *out = x;
    return PLUMB_OK;
}
