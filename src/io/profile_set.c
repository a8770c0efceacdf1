/*
 * profile_set.c - `--set KEY=VALUE` overrides applied to the parsed tree
 * (with the keys they make moot dropped), an inventory's items numbered
 * as written for every --set, at key paths resolved by profile_keypath.c.
 */
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/suggest.h"
#include "io/profile_int.h"
#include "io/units_int.h"
#include "io/vary.h"

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
    const char *near = plumb_suggest_closest(s->item, names, n);
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
            long found = plumbp_item_named(list, s->item);
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
            long at = s->index == KSEG_NAMED ? plumbp_item_named(v, s->item) : s->index;
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

/* ---- one key, one --set ------------------------------------------------- */

/* The first nseg segments of kp as one key, items[N] numbered as the
 * profile is written (slot: the item's slot, from 0; -1 when kp names no
 * item) and one descent given as a map called descent[0], so that
 * items[glove].mass and items[3].mass, descent.area and descent[0].area,
 * are one key. `last` (may be NULL) replaces the name of the last
 * segment. Can't fail (a key too long is cut, which only makes two keys
 * compare unequal). */
static void key_resolved(const keypath *kp, size_t nseg, long slot, const char *last, char *out,
                         size_t size)
{
    size_t len = 0;
    out[0] = '\0';
    for (size_t i = 0; i < nseg && len < size; i++) {
        const kseg *s = &kp->seg[i];
        const char *name = last && i + 1 == nseg ? last : s->name;
        int n;
        if (i == 0 && slot >= 0)
            n = snprintf(out + len, size - len, "%s[%ld]", name, slot + 1);
        else if (s->index >= 0)
            n = snprintf(out + len, size - len, "%s%s[%ld]", i ? "." : "", name, s->index);
        else if (i + 1 < nseg && s->schema && s->schema->type == PLUMBY_T_MAP_OR_LIST)
            n = snprintf(out + len, size - len, "%s%s[0]", i ? "." : "", name);
        else
            n = snprintf(out + len, size - len, "%s%s", i ? "." : "", name);
        if (n < 0)
            return;
        len += (size_t)n;
    }
}

/* 1 when key `inner` lies inside key `outer` (release.height in release,
 * descent[0].area in descent). */
static int key_within(const char *inner, const char *outer)
{
    size_t n = strlen(outer);
    return strncmp(inner, outer, n) == 0 && (inner[n] == '.' || inner[n] == '[');
}

/* Two --set options of one key would let the last silently win, as a
 * second --format would (README.md "Common options": a repeated option is
 * refused): refuses the line-th --set of `key` (resolved: key_resolved)
 * when an earlier one sets the same key; sets a key inside it (the whole
 * map, release, would drop the earlier release.height); or gives this key
 * in its own value (release={height: ...} then release.height). A key set
 * inside a map an earlier --set gave whole, which that --set did not
 * give, adds to it and is taken (release={height: 10 m} then
 * release.velocity.up). kp (resolved in root) finds the node now there. */
static plumb_status set_twice(const plumbp_set_items *nb, const plumby_node *root,
                              const keypath *kp, const char *resolved, const char *typed, int line,
                              plumb_diag *diag)
{
    const plumby_node *now = NULL;
    int looked = 0;
    for (size_t i = 0; i < nb->n_keys; i++) {
        const plumbp_set_key *e = &nb->keys[i];
        char same[PLUMB_DIAG_KEY + 64] = "";
        if (strcmp(e->typed, typed) != 0)
            snprintf(same, sizeof same, " (as '%s')", e->typed);
        if (strcmp(e->key, resolved) == 0)
            return set_raise(diag, PLUMB_EINVAL, line, 1, typed,
                             "set twice, by --set %d%s and by this --set %d: give each key once "
                             "(the last would silently replace the first)",
                             e->line, same, line);
        if (key_within(e->key, resolved) && !e->removed)
            return set_raise(diag, PLUMB_EINVAL, line, 1, typed,
                             "this --set %d replaces all of %s, in which --set %d sets '%s': "
                             "that value would be silently lost; give it in this --set's value, "
                             "or set the keys one by one",
                             line, typed, e->line, e->typed);
        if (key_within(resolved, e->key)) {
            if (!looked) {
                now = plumbp_tree_get(root, kp);
                looked = 1;
            }
            if (now && now->origin == PLUMBY_FROM_SET && now->line == e->line)
                return set_raise(diag, PLUMB_EINVAL, line, 1, typed,
                                 "set twice: --set %d ('%s') gives it in its value, and this "
                                 "--set %d again: give each key once (the last would silently "
                                 "replace the first)",
                                 e->line, e->typed, line);
        }
    }
    return PLUMB_OK;
}

/* Keeps the key of the line-th --set (removed: KEY=~) for set_twice. -1
 * out of memory. */
static int set_key_push(plumbp_set_items *nb, const char *resolved, const char *typed, int line,
                        int removed)
{
    if (nb->n_keys == nb->cap_keys) {
        size_t cap = nb->cap_keys ? 2 * nb->cap_keys : 8;
        plumbp_set_key *k2 = realloc(nb->keys, cap * sizeof *k2);
        if (!k2)
            return -1;
        nb->keys = k2;
        nb->cap_keys = cap;
    }
    plumbp_set_key *k = &nb->keys[nb->n_keys++];
    plumbp_strlcpy(k->key, resolved, sizeof k->key);
    plumbp_strlcpy(k->typed, typed, sizeof k->typed);
    k->line = line;
    k->removed = removed;
    return 0;
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
    {"payload", "drag", {"shape", NULL}},
    {"payload", "shape", {"drag", NULL}},
    {"items", "drag", {"shape", NULL}},
    {"items", "shape", {"drag", NULL}},
};

/* Drops what the key of kp stands instead of, and what any key on its way
 * does (payload.shape.kind replaces the profile's payload.drag). A key an
 * earlier --set of this call gave (nb: its keys; slot as key_resolved
 * takes it) is not dropped: the line-th --set `key` is refused instead,
 * since the earlier one would be silently lost. */
static plumb_status drop_alternatives(plumby_node *root, const keypath *kp,
                                      const plumbp_set_items *nb, long slot, const char *key,
                                      int line, plumb_diag *diag)
{
    for (size_t n = 2; n <= kp->n; n++) {
        const kseg *last = &kp->seg[n - 1], *parent = &kp->seg[n - 2];
        if (last->index != KSEG_NONE)
            continue;
        for (size_t i = 0; i < sizeof alternatives / sizeof alternatives[0]; i++) {
            if (strcmp(alternatives[i].key, last->name) != 0 ||
                strcmp(alternatives[i].parent, parent->name) != 0)
                continue;
            /* only where the key path itself is the alternative's map */
            if (strcmp(parent->name, "payload") == 0 && n != 2)
                continue;
            if (strcmp(parent->name, PLUMBY_ITEMS_KEY) == 0 && n != 2)
                continue;
            for (size_t k = 0; k < 2 && alternatives[i].drops[k]; k++) {
                char dropped[PLUMB_DIAG_KEY];
                key_resolved(kp, n, slot, alternatives[i].drops[k], dropped, sizeof dropped);
                for (size_t e = 0; e < nb->n_keys; e++)
                    if (!nb->keys[e].removed && (strcmp(nb->keys[e].key, dropped) == 0 ||
                                                 key_within(nb->keys[e].key, dropped)))
                        return set_raise(diag, PLUMB_EINVAL, line, 1, key,
                                         "stands instead of %s, which --set %d sets ('%s'): "
                                         "that value would be silently lost; give one of "
                                         "the two",
                                         alternatives[i].drops[k], nb->keys[e].line,
                                         nb->keys[e].typed);
                keypath other = *kp;
                other.n = n;
                plumbp_strlcpy(other.seg[n - 1].name, alternatives[i].drops[k],
                               sizeof other.seg[n - 1].name);
                tree_remove(root, &other);
            }
        }
    }
    return PLUMB_OK;
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

/* ---- one numbering of the items for every --set ------------------------ */

void plumbp_set_items_free(plumbp_set_items *numbering)
{
    if (!numbering)
        return;
    free(numbering->node);
    free(numbering->removed_by);
    free(numbering->keys);
    memset(numbering, 0, sizeof *numbering);
}

/* The top-level items list of root, or NULL. */
static plumby_node *items_list(plumby_node *root)
{
    plumby_pair *pair = root->kind == PLUMBY_MAP ? plumby_find(root, PLUMBY_ITEMS_KEY) : NULL;
    return pair && pair->value->kind == PLUMBY_SEQ ? pair->value : NULL;
}

static int slot_push(plumbp_set_items *nb, plumby_node *node)
{
    if (nb->n == nb->cap) {
        size_t cap = nb->cap ? 2 * nb->cap : 16;
        plumby_node **n2 = realloc(nb->node, cap * sizeof *n2);
        if (!n2)
            return -1;
        nb->node = n2;
        int *r2 = realloc(nb->removed_by, cap * sizeof *r2);
        if (!r2)
            return -1;
        nb->removed_by = r2;
        nb->cap = cap;
    }
    nb->node[nb->n] = node;
    nb->removed_by[nb->n] = 0;
    nb->n++;
    return 0;
}

/* Takes the numbering from the items of root as they are now. */
static int slots_capture(plumbp_set_items *nb, plumby_node *root)
{
    nb->n = 0;
    nb->ready = 1;
    const plumby_node *list = items_list(root);
    for (size_t i = 0; list && i < list->n; i++)
        if (slot_push(nb, list->items[i]) != 0)
            return -1;
    return 0;
}

/* The slot holding node, or -1. */
static long slot_of(const plumbp_set_items *nb, const plumby_node *node)
{
    for (size_t k = 0; node && k < nb->n; k++)
        if (nb->node[k] == node)
            return (long)k;
    return -1;
}

/* Turns a numbered items[N] of kp (N as the profile is written) into the
 * item's place in the list now, or raises when that item is gone or N is
 * past the end. *target is the item's node (NULL for one to be added). */
static plumb_status slot_resolve(plumbp_set_items *nb, plumby_node *root, keypath *kp,
                                 const char *key, int line, plumby_node **target,
                                 plumb_diag *diag)
{
    kseg *s = &kp->seg[0];
    plumby_node *list = items_list(root);
    *target = NULL;
    if (s->index == KSEG_NAMED) {
        long at = list ? plumbp_item_named(list, s->item) : -1;
        if (at >= 0) {
            *target = list->items[at];
            s->index = at;
        }
        return PLUMB_OK;
    }
    size_t k = (size_t)s->index;
    if (k < nb->n && !nb->node[k])
        return set_raise(diag, PLUMB_EKEY, line, s->col, key,
                         "items[%zu] was removed by --set %d; items[N] counts the items of the "
                         "profile as written, before any --set removes or adds one, so every "
                         "--set of a command means the same item by the same number",
                         k + 1, nb->removed_by[k]);
    if (k > nb->n && (list || nb->n > 0))
        return set_raise(diag, PLUMB_ERANGE, line, s->col, key,
                         "items[%zu] is past the end: counted as the profile is written, with "
                         "any item a --set added, there %s %zu item%s (the next is items[%zu])",
                         k + 1, nb->n == 1 ? "is" : "are", nb->n, nb->n == 1 ? "" : "s",
                         nb->n + 1);
    if (k == nb->n && list && kp->n > 1 && strcmp(kp->seg[1].name, "name") != 0)
        /* one key of an item that is not there: a typo of N more often than
         * a new item, which begins with its name */
        return set_raise(diag, PLUMB_EKEY, line, s->col, key,
                         "the profile has %zu item%s (items[1] to items[%zu]), so items[%zu] "
                         "would be a new one: add it whole (--set 'items[%zu]={name: ..., "
                         "mass: ..., ...}') or by its name first (--set 'items[%zu].name=...')",
                         nb->n, nb->n == 1 ? "" : "s", nb->n, k + 1, k + 1, k + 1);
    if (k >= nb->n) {
        /* a new item, at the end (past it, with no list yet: tree_put says so) */
        s->index = list ? (long)list->n : (long)k;
        return PLUMB_OK;
    }
    *target = nb->node[k];
    for (size_t i = 0; list && i < list->n; i++)
        if (list->items[i] == *target) {
            s->index = (long)i;
            return PLUMB_OK;
        }
    return PLUMB_RAISE(diag, PLUMB_EINVAL, "--set %d: items[%zu] is lost from the list", line,
                       k + 1);
}

plumb_status plumbp_set_items_numbers(plumbp_set_items *nb, plumby_node *root,
                                      plumb_profile *p)
{
    plumby_node *list = items_list(root);
    if (!list || list->n == 0)
        return PLUMB_OK;
    if (!nb->ready && slots_capture(nb, root) != 0)
        return PLUMB_ENOMEM;
    p->item_no = malloc(list->n * sizeof *p->item_no);
    p->slot_removed_by = calloc(nb->n ? nb->n : 1, sizeof *p->slot_removed_by);
    if (!p->item_no || !p->slot_removed_by)
        return PLUMB_ENOMEM;
    p->n_slots = nb->n;
    p->n_item_no = list->n;
    for (size_t k = 0; k < nb->n; k++)
        p->slot_removed_by[k] = nb->node[k] ? 0 : nb->removed_by[k] ? nb->removed_by[k] : -1;
    for (size_t j = 0; j < list->n; j++) {
        long k = slot_of(nb, list->items[j]);
        /* every item now in the list holds a slot (slot_resolve, slot_push) */
        p->item_no[j] = k >= 0 ? (size_t)k + 1 : j + 1;
    }
    return PLUMB_OK;
}

plumb_status plumbp_set_items_seed(plumbp_set_items *nb, plumby_node *root,
                                   const plumb_profile *base)
{
    plumby_node *list = items_list(root);
    if (!list || !base->item_no || base->n_item_no != list->n)
        return PLUMB_OK; /* counted from the tree as it is, on first use */
    nb->n = 0;
    nb->ready = 1;
    for (size_t k = 0; k < base->n_slots; k++) {
        if (slot_push(nb, NULL) != 0)
            return PLUMB_ENOMEM;
        nb->removed_by[k] = base->slot_removed_by[k] > 0 ? base->slot_removed_by[k] : 0;
    }
    for (size_t j = 0; j < list->n; j++) {
        size_t k = base->item_no[j] - 1;
        if (k < nb->n)
            nb->node[k] = list->items[j];
    }
    return PLUMB_OK;
}

/* Refuses a --set of payload.X on an inventory, and of items[N].X on a
 * profile of one payload: the schema would blame the file's own key, far
 * from the --set that is wrong. */
static plumb_status check_payload_or_items(plumby_node *root, const keypath *kp,
                                           const char *key, int line, plumb_diag *diag)
{
    if (root->kind != PLUMBY_MAP)
        return PLUMB_OK;
    const kseg *s = &kp->seg[0];
    const plumby_pair *items = plumby_find(root, PLUMBY_ITEMS_KEY);
    const plumby_pair *payload = plumby_find(root, "payload");
    /* the key after its first part (past items[NAME], whose name may hold a '.') */
    const char *after = s->index != KSEG_NONE ? strchr(key, ']') : key;
    const char *dot = kp->n > 1 && after ? strchr(after, '.') : NULL;
    const char *rest = dot ? dot + 1 : NULL;
    if (strcmp(s->name, "payload") == 0 && items && !payload) {
        if (rest)
            return set_raise(diag, PLUMB_EKEY, line, 1, key,
                             "the profile is an inventory (items: at line %d), with no single "
                             "payload: set one item's %s with items[N].%s (N from 1, as the "
                             "report numbers them) or items[NAME].%s; remove items (--set "
                             "items=~) first to give one payload instead",
                             items->line, rest, rest, rest);
        return set_raise(diag, PLUMB_EKEY, line, 1, key,
                         "the profile is an inventory (items: at line %d): a payload is not "
                         "used together with items; remove items (--set items=~) first to give "
                         "one payload instead",
                         items->line);
    }
    if (strcmp(s->name, PLUMBY_ITEMS_KEY) == 0 && payload && !items && s->index != KSEG_NONE)
        return set_raise(diag, PLUMB_EKEY, line, 1, key,
                         "the profile has a single payload (payload: at line %d), not items: "
                         "set its keys as payload.X%s%s",
                         payload->line, rest ? ", here payload." : "", rest ? rest : "");
    return PLUMB_OK;
}

/* Applies the override `arg`, the line-th --set (counted from 1). */
plumb_status plumbp_profile_apply_set(plumby_node *root, const char *arg, int line,
                                      plumbp_set_items *numbering, plumby_removal *removal,
                                      plumb_diag *diag)
{
    if (removal)
        removal->key[0] = '\0';
    if (!numbering->ready && slots_capture(numbering, root) != 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory applying --set %d", line);
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
    plumb_status st = plumbp_profile_keypath_resolve(key, &kp, PLUMBY_SET_FILE, line, diag);
    if (st != PLUMB_OK)
        return st;
    int on_items = strcmp(kp.seg[0].name, PLUMBY_ITEMS_KEY) == 0;
    if ((st = check_payload_or_items(root, &kp, key, line, diag)) != PLUMB_OK)
        return st;
    int whole_item = on_items && kp.n == 1 && kp.seg[0].index != KSEG_NONE;
    plumby_node *target = NULL;
    long slot = -1, typed_index = kp.seg[0].index;
    if (on_items && kp.seg[0].index != KSEG_NONE) {
        if ((st = slot_resolve(numbering, root, &kp, key, line, &target, diag)) != PLUMB_OK)
            return st;
        slot = target ? slot_of(numbering, target) : -1;
    }
    const char *val = eq + 1;
    int col0 = (int)klen + 1;
    if (strspn(val, " ") == strlen(val))
        return set_raise(diag, PLUMB_EPARSE, line, col0 + 1, key,
                         "expected a value after '=', found nothing");
    /* the key resolved: an item by its number as written (a new one's is
     * the number typed); an unknown name is tree_put's error */
    long key_slot = !on_items || kp.seg[0].index == KSEG_NONE ? -1
                    : typed_index >= 0                       ? typed_index
                                                             : slot;
    char resolved[PLUMB_DIAG_KEY];
    key_resolved(&kp, kp.n, key_slot, NULL, resolved, sizeof resolved);
    int known = !(on_items && kp.seg[0].index != KSEG_NONE && key_slot < 0);
    if (known && (st = set_twice(numbering, root, &kp, resolved, key, line, diag)) != PLUMB_OK)
        return st;
    size_t lead = strspn(val, " "), vlen = strlen(val + lead);
    while (vlen > 0 && val[lead + vlen - 1] == ' ')
        vlen--;
    int removing = (vlen == 1 && val[lead] == '~') ||
                   (vlen == 4 && strncmp(val + lead, "null", 4) == 0);
    if (known && set_key_push(numbering, resolved, key, line, removing) != 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory applying --set %d", line);
    if (removing) {
        tree_remove(root, &kp);
        if (removal) {
            /* the key as the loader names it: an item by its number as
             * written (items[glove].mass is items[2].mass) */
            const char *rest = on_items && kp.seg[0].index != KSEG_NONE ? strchr(key, ']') : NULL;
            if (rest && slot >= 0)
                snprintf(removal->key, sizeof removal->key, "%s[%ld]%s", PLUMBY_ITEMS_KEY,
                         slot + 1, rest + 1);
            else if (!rest)
                plumbp_strlcpy(removal->key, key, sizeof removal->key);
            removal->line = line;
            removal->col = col0 + 1 + (int)lead;
        }
        if (whole_item && slot >= 0) {
            numbering->node[slot] = NULL;
            numbering->removed_by[slot] = line;
        } else if (on_items && kp.seg[0].index == KSEG_NONE && kp.n == 1) {
            numbering->n = 0; /* no items: a later items[1] starts a new list */
        }
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
    if (st != PLUMB_OK)
        return st;
    if ((st = drop_alternatives(root, &kp, numbering, key_slot, key, line, diag)) != PLUMB_OK)
        return st;
    if (on_items && kp.seg[0].index == KSEG_NONE && kp.n == 1) {
        /* the whole list given: later --set options count it as given */
        if (slots_capture(numbering, root) != 0)
            return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory applying --set %d", line);
    } else if (on_items && kp.seg[0].index != KSEG_NONE) {
        plumby_node *list = items_list(root);
        plumby_node *now = list && (size_t)kp.seg[0].index < list->n
                               ? list->items[kp.seg[0].index] : NULL;
        if (slot >= 0)
            numbering->node[slot] = now; /* the same item, perhaps given anew */
        else if (!target && now && slot_push(numbering, now) != 0)
            return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory applying --set %d", line);
    }
    return PLUMB_OK;
}
