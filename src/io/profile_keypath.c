/*
 * profile_keypath.c - dotted key paths into a profile ("descent[1].area",
 * "items[box of M12 bolts].mass") resolved against the schema, for the
 * overrides of profile_set.c and to tell a key's dimension
 * (plumb_profile_key_dim), whether it is a direction, the unit it was
 * given in (plumb_profile_key_unit) and where (plumb_profile_key_origin).
 */
#include <stdarg.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/suggest.h"
#include "io/profile_int.h"
#include "io/units_int.h"
#include "io/vary.h"

/* ---- key paths (overrides and plumb_profile_key_dim) -------------------- */

long plumbp_item_named(const plumby_node *list, const char *name)
{
    for (size_t i = 0; i < list->n; i++) {
        const plumby_node *it = list->items[i];
        const plumby_pair *np = it->kind == PLUMBY_MAP ? plumby_find(it, "name") : NULL;
        if (np && np->value->kind == PLUMBY_SCALAR && strcmp(np->value->text, name) == 0)
            return (long)i;
    }
    return -1;
}

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
                                    int file_line, plumb_diag *diag, char *fix, size_t fix_size);

/* The whole key the user most likely meant, when a part of it is unknown:
 * the part at key[start, end) replaced by `with`, and the rest of the key
 * kept and itself corrected, so that "relase.height" suggests
 * "release.height", not "release". Writes fix ("" when the corrected key
 * does not resolve either) and returns whether it found one. */
static int whole_key_fix(const char *key, size_t start, size_t end, const char *with,
                         char *fix, size_t fix_size)
{
    char cand[PLUMB_DIAG_KEY];
    fix[0] = '\0';
    int n = snprintf(cand, sizeof cand, "%.*s%s%s", (int)start, key, with, key + end);
    if (n < 0 || (size_t)n >= sizeof cand)
        return 0;
    keypath kp;
    char deeper[PLUMB_DIAG_KEY];
    if (keypath_resolve(cand, &kp, NULL, 0, NULL, deeper, sizeof deeper) == PLUMB_OK)
        plumbp_strlcpy(fix, cand, fix_size);
    else if (deeper[0])
        plumbp_strlcpy(fix, deeper, fix_size);
    return fix[0] != '\0';
}

plumb_status plumbp_profile_keypath_resolve(const char *key, keypath *kp, const char *file,
                                            int file_line, plumb_diag *diag)
{
    char fix[PLUMB_DIAG_KEY];
    return keypath_resolve(key, kp, file, file_line, diag, fix, sizeof fix);
}

/* fix: the corrected whole key of an unknown one, or "" (whole_key_fix). */
static plumb_status keypath_resolve(const char *key, keypath *kp, const char *file,
                                    int file_line, plumb_diag *diag, char *fix, size_t fix_size)
{
    fix[0] = '\0';
    const plumby_schema *cur = plumbp_profile_schema();
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
            if (best && whole_key_fix(key, start, pos, best, fix, fix_size))
                return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, s->col, key,
                                      "unknown key '%s' (did you mean '%s'?)", key, fix);
            if (best)
                return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, s->col, key,
                                      "unknown key '%s' (did you mean '%.*s%s'?)", key,
                                      (int)start, key, best);
            char path[PLUMB_DIAG_KEY];
            const char *under = plumby_schema_nested(cur, s->name, path, sizeof path);
            char moved[PLUMB_DIAG_KEY];
            if ((size_t)snprintf(moved, sizeof moved, "%.*s.%s", PLUMB_DIAG_KEY / 2,
                                 under ? under : "", s->name) >= sizeof moved)
                under = NULL; /* too long to suggest: the plain message below */
            if (under && whole_key_fix(key, start, pos, moved, fix, fix_size))
                return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, s->col, key,
                                      "unknown key '%s': '%s' is a key of '%s' (did you mean "
                                      "'%s'?)", key, s->name, under, fix);
            if (under)
                return PLUMB_RAISE_AT(diag, PLUMB_EKEY, file, line, s->col, key,
                                      "unknown key '%s': '%s' is a key of '%s' (did you mean "
                                      "'%.*s%s.%s'?)", key, s->name, under, (int)start, key,
                                      under, s->name);
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
            if (s->index == KSEG_NONE) {
                int from_one = kp->n == 1 && strcmp(s->name, PLUMBY_ITEMS_KEY) == 0;
                const char *rest = key + pos;
                size_t nd = strspn(rest, "0123456789");
                /* the whole key as it should be written: the user's own
                 * index, given as a dotted part (items.2.mass), moved into
                 * brackets (items[2].mass), an item 0, which does not
                 * exist, as the first (items[1]) */
                if (nd > 0 && nd <= 7 && (rest[nd] == '.' || rest[nd] == '\0')) {
                    long given = strtol(rest, NULL, 10);
                    return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos - 1), key,
                                          "'%s' is a list: give an index, e.g. %.*s[%ld]%s",
                                          s->name, (int)(pos - 1), key,
                                          from_one && given == 0 ? 1L : given, rest + nd);
                }
                return PLUMB_RAISE_AT(diag, PLUMB_EPARSE, file, line, KP_COL(pos - 1), key,
                                      "'%s' is a list: give an index, e.g. %.*s[%d].%s", s->name,
                                      (int)(pos - 1), key, from_one, rest);
            }
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

/* The schema of a numeric key's value (a table row's when the key names a
 * row), or PLUMB_EKEY / PLUMB_EINVAL as plumb_profile_key_dim; a count
 * (zone.samples) is numeric only when counts is 1. */
static plumb_status numeric_schema(const char *key, int counts, const plumby_schema **out,
                                   plumb_diag *diag)
{
    keypath kp;
    plumb_status st = plumbp_profile_keypath_resolve(key, &kp, NULL, 0, diag);
    if (st != PLUMB_OK)
        return st;
    const kseg *leaf = &kp.seg[kp.n - 1];
    const plumby_schema *s = leaf->schema;
    if (s && s->type == PLUMBY_T_LIST && leaf->index != KSEG_NONE)
        s = &s->sub[0];
    if (!s || (s->type != PLUMBY_T_NUM && !(counts && s->type == PLUMBY_T_COUNT)))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, key, "'%s' is not a numeric key", key);
    *out = s;
    return PLUMB_OK;
}

plumb_status plumb_profile_key_dim(const char *key, plumb_dim *dim, plumb_diag *diag)
{
    if (!key || !dim)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_key_dim: NULL argument");
    const plumby_schema *s = NULL;
    plumb_status st = numeric_schema(key, 1, &s, diag);
    if (st != PLUMB_OK)
        return st;
    *dim = s->type == PLUMBY_T_NUM ? plumby_num_dim(s) : PLUMB_DIM_NONE;
    return PLUMB_OK;
}

plumb_status plumb_profile_key_check(const char *key, double si, plumb_diag *diag)
{
    if (!key)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_key_check: NULL key");
    const plumby_schema *s = NULL;
    plumb_status st = numeric_schema(key, 0, &s, diag);
    if (st != PLUMB_OK)
        return st;
    plumby_range range = plumby_num_range(s);
    if (isfinite(si) && plumby_range_ok(range, si))
        return PLUMB_OK;
    char r[160];
    plumby_range_text(range, plumby_num_dim(s), r, sizeof r);
    const char *u = plumb_dim_si_unit(plumby_num_dim(s));
    return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, key, "%g%s%s is out of range: must be %s", si,
                           strcmp(u, "1") == 0 ? "" : " ", strcmp(u, "1") == 0 ? "" : u, r);
}

/* A direction is an angle of any value (wind.from, a heading, a wind
 * table's from): the keys that take a compass point alone. */
int plumbp_key_is_direction(const char *key)
{
    keypath kp;
    if (!key || plumbp_profile_keypath_resolve(key, &kp, NULL, 0, NULL) != PLUMB_OK)
        return 0;
    const plumby_schema *s = kp.seg[kp.n - 1].schema;
    if (s && s->type == PLUMBY_T_LIST && kp.seg[kp.n - 1].index != KSEG_NONE)
        s = &s->sub[0];
    return s && s->type == PLUMBY_T_NUM && plumby_num_dim(s) == PLUMB_DIM_ANGLE &&
           plumby_num_range(s) == PLUMBY_R_ANY;
}

double plumbp_direction_bearing(const char *text)
{
    return text ? plumbp_units_compass_bearing(text) : -1.0;
}

/* ---- the unit a key was given in -------------------------------------- */

/* profile_int.h */
const plumby_node *plumbp_tree_get(const plumby_node *root, const keypath *kp)
{
    const plumby_node *cur = root;
    for (size_t i = 0; cur && i < kp->n; i++) {
        const kseg *s = &kp->seg[i];
        const plumby_pair *pair = cur->kind == PLUMBY_MAP ? plumby_find(cur, s->name) : NULL;
        if (!pair)
            return NULL;
        cur = pair->value;
        if (s->index != KSEG_NONE && cur->kind == PLUMBY_SEQ) {
            long at = s->index == KSEG_NAMED ? plumbp_item_named(cur, s->item) : s->index;
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
    if (!p->tree || plumbp_profile_keypath_resolve(full, &kp, NULL, 0, NULL) != PLUMB_OK)
        return NULL;
    const plumby_node *n = plumbp_tree_get(p->tree, &kp);
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

void plumbp_profile_key_spelt(const plumb_profile *p, size_t item, const char *key, char *out,
                              size_t size)
{
    plumbp_strlcpy(out, key ? key : "", size);
    if (!p || !key || !p->tree || strncmp(key, "descent[", 8) != 0)
        return;
    char *end = NULL;
    unsigned long j = strtoul(key + 8, &end, 10);
    if (end == key + 8 || *end != ']')
        return;
    const char *rest = end + 1;
    /* the item's own descent: first; else the profile's, shared */
    char prefix[64] = "";
    const plumby_node *dev = NULL;
    const plumby_pair *items = p->inventory ? plumby_find(p->tree, PLUMBY_ITEMS_KEY) : NULL;
    if (items && items->value->kind == PLUMBY_SEQ && item < items->value->n &&
        items->value->items[item]->kind == PLUMBY_MAP) {
        const plumby_pair *d = plumby_find(items->value->items[item], "descent");
        if (d) {
            dev = d->value;
            snprintf(prefix, sizeof prefix, "%s[%zu].", PLUMBY_ITEMS_KEY,
                     p->item_no && item < p->n_item_no ? p->item_no[item] : item + 1);
        }
    }
    if (!dev) {
        const plumby_pair *d = plumby_find(p->tree, "descent");
        dev = d ? d->value : NULL;
    }
    if (dev && dev->kind == PLUMBY_MAP && j == 0)
        snprintf(out, size, "%sdescent%s", prefix, rest);
    else if (dev && dev->kind == PLUMBY_SEQ)
        snprintf(out, size, "%sdescent[%lu]%s", prefix, j, rest);
}

const char *plumb_profile_key_origin(const plumb_profile *p, const char *key, int *line,
                                     int *col)
{
    *line = 0;
    *col = 0;
    keypath kp;
    if (!p || !key || !p->tree || plumbp_profile_keypath_resolve(key, &kp, NULL, 0, NULL) != PLUMB_OK)
        return NULL;
    if (p->item_no && strcmp(kp.seg[0].name, PLUMBY_ITEMS_KEY) == 0 && kp.seg[0].index >= 0) {
        /* items[N] as written: the item's place in the list now */
        long at = -1;
        for (size_t i = 0; i < p->n_item_no; i++)
            if (p->item_no[i] == (size_t)kp.seg[0].index + 1)
                at = (long)i;
        if (at < 0)
            return NULL;
        kp.seg[0].index = at;
    }
    const plumby_node *n = plumbp_tree_get(p->tree, &kp);
    if (!n)
        return NULL;
    *line = n->line;
    *col = n->col;
    return n->origin == PLUMBY_FROM_SET ? PLUMBY_SET_FILE : p->path;
}
