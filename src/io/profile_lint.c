/*
 * profile_lint.c - every error of a profile, for `plumb lint`
 * (plumb_profile_lint_buffer, profile.h): the profile is built again and
 * again (profile.c, plumbp_profile_build), each time with the errors found
 * so far set aside, until it loads, no progress is made or max errors are
 * listed; then the errors are sorted into file order.
 *
 * Setting an error aside is an edit of a copy of the parsed tree, never of
 * the text:
 *   - a numeric value that is refused (a bare number, a wrong unit, out of
 *     range, refused against another key) is replaced by a stand-in of
 *     the key's dimension in its range: the number written, in SI units,
 *     when it is one the key takes (so that checks against other keys see
 *     what the user most likely meant), else a plain value (1, 0.5, 0 ...)
 *     that the loader does not refuse at that place. The key stays
 *     written, so that nothing that depends on its presence changes;
 *   - a word refused with a did-you-mean is replaced by that word;
 *   - anything else (an unknown key, a map where a value was wanted, text)
 *     is left out.
 * An error that is only a consequence of one set aside is not listed:
 *   - a required key now missing because its value was left out: the
 *     value gets a stand-in if the key is numeric, else the check stops;
 *   - a required key now missing whose misspelt twin (the unknown key of
 *     the same map whose did-you-mean it is) was listed: the misspelt key
 *     is read as the right one from then on, and its value is checked;
 *   - a key missing under a map that was left out, or missing where a key
 *     of the same name was written one level too high: the check stops;
 *   - an error at the place of a stand-in: the check stops.
 * A required numeric key missing on its own is listed and given a stand-in
 * where it should be, so that the check goes on. An error outside the file
 * (a --set), or one that is not the user's (out of memory), stops it.
 *
 * Limits: a stand-in is a guess; a check of one key against another may
 * still meet the guess instead of the user's value (a release height given
 * as -3 m checked as 1 m against a deploy height of 60 m) and list an error
 * that would not remain once the first is fixed.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/suggest.h"
#include "io/profile_int.h"

/* Most edits of one check (each error listed makes at most one, each
 * consequence turns one into another). */
enum { LINT_EDITS = 64 };

typedef enum ed_kind {
    ED_REMOVE = 0, /* the pair or list item left out */
    ED_NUMBER,     /* its value replaced by a stand-in number */
    ED_WORD,       /* its value replaced by the word in `name` */
    ED_RENAME,     /* the pair read under the key `name` */
    ED_INSERT      /* key `name` added to the map at `key`'s parent, with a stand-in */
} ed_kind;

typedef struct edit {
    ed_kind kind;
    int line, col;              /* the error's place: the pair's key or value, or the map */
    char key[PLUMB_DIAG_KEY];   /* the error's dotted key */
    char name[PLUMB_DIAG_KEY];  /* ED_WORD: the word; ED_RENAME, ED_INSERT: the key */
    char text[96];              /* ED_NUMBER, ED_INSERT: the stand-in as written */
    int listed;                 /* 1: the error is listed (0: a consequence) */
} edit;

typedef struct lint_run {
    const char *name, *sha;
    const plumby_node *tree;
    const plumb_units *units;
    const char *const *sets;
    size_t n_sets;
    edit ed[LINT_EDITS];
    size_t n_ed;
} lint_run;

/* 1 when the dotted key ends with the map key `name` as a whole part. */
static int key_ends_with(const char *dkey, const char *name)
{
    size_t a = strlen(dkey), b = strlen(name);
    return b > 0 && b <= a && strcmp(dkey + a - b, name) == 0 && (a == b || dkey[a - b - 1] == '.');
}

/* 1 when `key` names a map or list that holds `under` ("payload" holds
 * "payload.drag.cd", "descent" holds "descent[0].cd"). */
static int key_holds(const char *key, const char *under)
{
    size_t n = strlen(key);
    return strncmp(key, under, n) == 0 && (under[n] == '.' || under[n] == '[');
}

/* The node an error at line:col with dotted key dkey is about: a pair
 * whose key or value starts there and whose key ends dkey, or (for a key
 * ending in ']') a list item that starts there. *parent and *idx say
 * where it is. 0 when there is none. */
static int find_at(plumby_node *n, int line, int col, const char *dkey, plumby_node **parent,
                   size_t *idx)
{
    size_t klen = strlen(dkey);
    int item_key = klen > 0 && dkey[klen - 1] == ']';
    for (size_t i = 0; i < n->n; i++) {
        plumby_node *child;
        int here;
        if (n->kind == PLUMBY_MAP) {
            const plumby_pair *p = &n->pairs[i];
            child = p->value;
            here = key_ends_with(dkey, p->key) &&
                   ((p->line == line && p->col == col) ||
                    (child && child->line == line && child->col == col));
        } else if (n->kind == PLUMBY_SEQ) {
            child = n->items[i];
            here = item_key && child && child->line == line && child->col == col;
        } else {
            return 0;
        }
        if (here) {
            *parent = n;
            *idx = i;
            return 1;
        }
        if (child && find_at(child, line, col, dkey, parent, idx))
            return 1;
    }
    return 0;
}

/* The schema of a dotted key (a list item's for "descent[0]"), or NULL. */
static const plumby_schema *schema_of(const char *dkey)
{
    keypath kp;
    if (!dkey[0] || plumbp_profile_keypath_resolve(dkey, &kp, NULL, 0, NULL) != PLUMB_OK ||
        kp.n == 0)
        return NULL;
    const kseg *s = &kp.seg[kp.n - 1];
    const plumby_schema *sc = s->schema;
    if (sc && s->index >= 0 && sc->type == PLUMBY_T_LIST && sc->n_sub)
        sc = &sc->sub[0];
    return sc;
}

/* The schema of the map at a dotted key ("" the top), or NULL. */
static const plumby_schema *map_schema(const char *dkey)
{
    const plumby_schema *s = dkey[0] ? schema_of(dkey) : plumbp_profile_schema();
    return s && (s->type == PLUMBY_T_MAP || s->type == PLUMBY_T_MAP_OR_LIST) ? s : NULL;
}

/* The node at a dotted key in the tree, or NULL. */
static plumby_node *node_at(plumby_node *root, const char *dkey)
{
    if (!dkey[0])
        return root;
    keypath kp;
    if (plumbp_profile_keypath_resolve(dkey, &kp, NULL, 0, NULL) != PLUMB_OK)
        return NULL;
    plumby_node *n = root;
    for (size_t i = 0; i < kp.n; i++) {
        if (!n || n->kind != PLUMBY_MAP)
            return NULL;
        plumby_pair *p = plumby_find(n, kp.seg[i].name);
        if (!p)
            return NULL;
        n = p->value;
        if (kp.seg[i].index == KSEG_NAMED)
            return NULL;
        if (kp.seg[i].index >= 0) {
            if (!n || n->kind != PLUMBY_SEQ || (size_t)kp.seg[i].index >= n->n)
                return NULL;
            n = n->items[kp.seg[i].index];
        }
    }
    return n;
}

/* Splits a dotted key into the key of its map (parent[size]) and its last
 * part, a plain key name (not a list item). 0 when it has no such part. */
static int split_key(const char *dkey, char *parent, size_t size, const char **last)
{
    const char *dot = strrchr(dkey, '.');
    *last = dot ? dot + 1 : dkey;
    if (!**last || strpbrk(*last, "[]"))
        return 0;
    size_t n = dot ? (size_t)(dot - dkey) : 0;
    if (n >= size)
        return 0;
    memcpy(parent, dkey, n);
    parent[n] = '\0';
    return 1;
}

/* A new scalar node with text at a place; NULL when out of memory. */
static plumby_node *scalar(const char *text, int line, int col)
{
    plumby_node *v = plumby_new(PLUMBY_SCALAR, line, col, PLUMBY_FROM_FILE);
    size_t n = strlen(text);
    if (v && !(v->text = malloc(n + 1))) {
        plumby_free(v);
        return NULL;
    }
    if (v)
        memcpy(v->text, text, n + 1);
    return v;
}

/* Applies one edit to a tree; PLUMB_ENOMEM is its only failure (an edit
 * that finds nothing to change changes nothing). */
static plumb_status apply_one(plumby_node *root, const edit *e)
{
    if (e->kind == ED_INSERT) {
        char parent[PLUMB_DIAG_KEY];
        const char *last;
        plumby_node *map = split_key(e->key, parent, sizeof parent, &last)
                               ? node_at(root, parent) : NULL;
        if (!map || map->kind != PLUMBY_MAP || plumby_find(map, e->name))
            return PLUMB_OK;
        plumby_node *v = scalar(e->text, e->line, e->col);
        if (!v)
            return PLUMB_ENOMEM;
        if (plumby_map_push(map, e->name, e->line, e->col, PLUMBY_FROM_FILE, v) != PLUMB_OK) {
            plumby_free(v);
            return PLUMB_ENOMEM;
        }
        return PLUMB_OK;
    }
    plumby_node *parent;
    size_t i;
    if (!find_at(root, e->line, e->col, e->key, &parent, &i))
        return PLUMB_OK;
    int map = parent->kind == PLUMBY_MAP;
    plumby_node **slot = map ? &parent->pairs[i].value : &parent->items[i];
    switch (e->kind) {
    case ED_REMOVE:
        if (map) {
            free(parent->pairs[i].key);
            plumby_free(parent->pairs[i].value);
            memmove(&parent->pairs[i], &parent->pairs[i + 1],
                    (parent->n - i - 1) * sizeof *parent->pairs);
        } else {
            plumby_free(parent->items[i]);
            memmove(&parent->items[i], &parent->items[i + 1],
                    (parent->n - i - 1) * sizeof *parent->items);
        }
        parent->n--;
        return PLUMB_OK;
    case ED_NUMBER:
    case ED_WORD: {
        const plumby_node *old = *slot;
        plumby_node *v = scalar(e->kind == ED_NUMBER ? e->text : e->name,
                                old ? old->line : e->line, old ? old->col : e->col);
        if (!v)
            return PLUMB_ENOMEM;
        plumby_free(*slot);
        *slot = v;
        return PLUMB_OK;
    }
    case ED_RENAME: {
        if (!map)
            return PLUMB_OK;
        size_t n = strlen(e->name);
        char *k = malloc(n + 1);
        if (!k)
            return PLUMB_ENOMEM;
        memcpy(k, e->name, n + 1);
        free(parent->pairs[i].key);
        parent->pairs[i].key = k;
        return PLUMB_OK;
    }
    case ED_INSERT:
        break;
    }
    return PLUMB_OK;
}

/* A copy of the tree with the first n edits applied, or NULL when out of
 * memory. */
static plumby_node *edited(const lint_run *r, size_t n)
{
    plumby_node *copy = plumby_copy(r->tree);
    for (size_t i = 0; copy && i < n; i++)
        if (apply_one(copy, &r->ed[i]) != PLUMB_OK) {
            plumby_free(copy);
            copy = NULL;
        }
    return copy;
}

/* Builds the tree with the first n edits: the status, *d its first error,
 * *out (may be NULL) the profile when it loads. */
static plumb_status try_build(const lint_run *r, size_t n, plumb_diag *d, plumb_profile **out)
{
    plumb_profile *p = NULL;
    plumb_diag_clear(d);
    plumby_node *copy = edited(r, n);
    if (!copy)
        return PLUMB_RAISE(d, PLUMB_ENOMEM, "out of memory checking the profile");
    plumb_status st = plumbp_profile_build(r->name, r->sha, copy, r->units, r->sets, r->n_sets,
                                           &p, d);
    if (out && st == PLUMB_OK)
        *out = p;
    else
        plumb_profile_free(p);
    return st;
}

/* The stand-ins of a numeric key, in the order tried: the number written
 * (node, may be NULL), in SI units if it has a unit the key takes, then
 * plain values. Those in the key's range go into v (at most 10); their
 * count. */
static size_t stand_ins(const lint_run *r, const plumby_schema *s, const plumby_node *node,
                        const char *dkey, double v[10])
{
    plumb_dim dim = plumby_num_dim(s);
    plumby_range range = plumby_num_range(s);
    double c[12];
    size_t nc = 0, n = 0;
    if (node && node->kind == PLUMBY_SCALAR && node->text) {
        plumby_ctx ctx;
        memset(&ctx, 0, sizeof ctx);
        ctx.file = r->name;
        ctx.units = r->units;
        double q;
        char *end;
        if (plumby_quantity(&ctx, node, dim, dkey, &q) == PLUMB_OK)
            c[nc++] = q;
        q = strtod(node->text, &end);
        if (end != node->text)
            c[nc++] = q;
    }
    static const double plain[] = {1.0, 0.5, 0.0, 10.0, 100.0, 0.1, 1000.0, 0.01};
    for (size_t i = 0; i < sizeof plain / sizeof plain[0]; i++)
        c[nc++] = plain[i];
    for (size_t i = 0; i < nc && n < 10; i++) {
        int dup = 0;
        for (size_t j = 0; j < n; j++)
            dup |= v[j] == c[i];
        if (isfinite(c[i]) && plumby_range_ok(range, c[i]) && !dup)
            v[n++] = c[i];
    }
    return n;
}

/* Makes edit e (its kind, line, col and key set, n_ed edits before it) a
 * stand-in for the numeric key of schema s, whose value node was `node`
 * (NULL: it is missing): the first stand-in after which the check no
 * longer stops at the same place. 0 when none does (e unchanged). */
static int give_stand_in(lint_run *r, edit *e, const plumby_schema *s, const plumby_node *node)
{
    if (!s || s->type != PLUMBY_T_NUM)
        return 0;
    double v[10];
    size_t n = stand_ins(r, s, node, e->key, v);
    plumb_dim dim = plumby_num_dim(s);
    int bare = dim == PLUMB_DIM_NONE || dim == PLUMB_DIM_FRACTION;
    edit keep = *e;
    for (size_t i = 0; i < n; i++) {
        snprintf(e->text, sizeof e->text, "%.17g%s%s", v[i], bare ? "" : " ",
                 bare ? "" : plumb_dim_si_unit(dim));
        plumb_diag d;
        size_t at = (size_t)(e - r->ed) + 1;
        plumb_status st = try_build(r, at > r->n_ed ? at : r->n_ed, &d, NULL);
        if (st == PLUMB_ENOMEM)
            break;
        if (st == PLUMB_OK || d.line != e->line || d.col != e->col ||
            strcmp(d.key, e->key) != 0)
            return 1;
    }
    *e = keep;
    return 0;
}

/* What an error about a key that is not written (a required key missing,
 * or a check of a map) follows from: 1 when it is a consequence of an
 * edit, now changed so that the check goes on; -1 when it is one and the
 * check cannot go on; 0 when it is an error of its own. */
static int absent_consequence(lint_run *r, const plumb_diag *d)
{
    char dpar[PLUMB_DIAG_KEY], epar[PLUMB_DIAG_KEY];
    const char *dlast, *elast;
    int dsplit = split_key(d->key, dpar, sizeof dpar, &dlast);
    for (size_t i = 0; i < r->n_ed; i++) {
        edit *e = &r->ed[i];
        if (strcmp(e->key, d->key) == 0) {
            /* its value left out: a numeric one gets a stand-in */
            if (e->kind == ED_REMOVE) {
                plumby_node *t = edited(r, i);
                plumby_node *parent;
                size_t j;
                const plumby_node *old = NULL;
                if (t && find_at(t, e->line, e->col, e->key, &parent, &j))
                    old = parent->kind == PLUMBY_MAP ? parent->pairs[j].value : parent->items[j];
                e->kind = ED_NUMBER;
                int ok = give_stand_in(r, e, schema_of(e->key), old);
                plumby_free(t);
                if (ok)
                    return 1;
                e->kind = ED_REMOVE;
            }
            return -1;
        }
        if (key_holds(e->key, d->key))
            return -1; /* under a map left out */
        if (e->kind != ED_REMOVE || !dsplit || !split_key(e->key, epar, sizeof epar, &elast))
            continue;
        if (strcmp(epar, dpar) == 0) {
            /* its misspelt twin: read under the name it should have */
            const plumby_schema *ms = map_schema(dpar);
            const char *best = ms && !plumby_schema_child(ms, elast)
                                   ? plumby_schema_suggest(ms, elast) : NULL;
            if (best && strcmp(best, dlast) == 0) {
                e->kind = ED_RENAME;
                plumbp_strlcpy(e->name, dlast, sizeof e->name);
                return 1;
            }
        } else if (strcmp(elast, dlast) == 0 && (!epar[0] || key_holds(epar, dpar))) {
            return -1; /* written one level too high */
        }
    }
    return 0;
}

/* A new edit for error d; NULL when there is no room. */
static edit *new_edit(lint_run *r, const plumb_diag *d, ed_kind kind)
{
    if (r->n_ed >= LINT_EDITS)
        return NULL;
    edit *e = &r->ed[r->n_ed];
    memset(e, 0, sizeof *e);
    e->kind = kind;
    e->line = d->line;
    e->col = d->col;
    plumbp_strlcpy(e->key, d->key, sizeof e->key);
    return e;
}

/* Sets aside error d, found at a written node: 1 done, 0 no way to. */
static int set_aside(lint_run *r, const plumb_diag *d)
{
    plumby_node *t = edited(r, r->n_ed);
    plumby_node *parent;
    size_t i;
    if (!t || !find_at(t, d->line, d->col, d->key, &parent, &i)) {
        plumby_free(t);
        return 0;
    }
    const plumby_node *v = parent->kind == PLUMBY_MAP ? parent->pairs[i].value : parent->items[i];
    const plumby_schema *s = schema_of(d->key);
    edit *e = new_edit(r, d, ED_NUMBER);
    int ok = e != NULL;
    if (ok && s && s->type == PLUMBY_T_NUM && give_stand_in(r, e, s, v)) {
        r->n_ed++;
    } else if (ok && s && s->type == PLUMBY_T_WORD && s->words && v &&
               v->kind == PLUMBY_SCALAR && v->text &&
               plumb_suggest_closest(v->text, s->words, s->n_words)) {
        e->kind = ED_WORD;
        plumbp_strlcpy(e->name,
                       plumb_suggest_closest(v->text, s->words, s->n_words),
                       sizeof e->name);
        r->n_ed++;
    } else if (ok) {
        e->kind = ED_REMOVE;
        r->n_ed++;
    }
    plumby_free(t);
    return ok;
}

/* 1 when error d is at the place of a stand-in, or a key already listed. */
static int no_progress(const lint_run *r, const plumb_diag *d, const plumb_diag *errs, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (strcmp(errs[i].key, d->key) == 0)
            return 1;
    for (size_t i = 0; i < r->n_ed; i++)
        if (r->ed[i].kind != ED_REMOVE && r->ed[i].line == d->line && r->ed[i].col == d->col)
            return 1;
    return 0;
}

plumb_status plumbp_profile_lint_tree(const char *name, const char *sha, const plumby_node *tree,
                                      const plumb_units *units, const char *const *sets,
                                      size_t n_sets, plumb_diag *errs, size_t max, size_t *n,
                                      plumb_profile **out)
{
    lint_run *r = calloc(1, sizeof *r);
    if (!r) {
        *n = 1;
        return PLUMB_RAISE(&errs[0], PLUMB_ENOMEM, "out of memory checking the profile");
    }
    r->name = name;
    r->sha = sha;
    r->tree = tree;
    r->units = units;
    r->sets = sets;
    r->n_sets = n_sets;
    plumb_status first = PLUMB_OK;
    /* each pass lists an error or turns a consequence into an edit */
    for (size_t pass = 0; *n < max && pass < 2 * LINT_EDITS; pass++) {
        plumb_diag d;
        plumb_profile *p = NULL;
        plumb_status st = try_build(r, r->n_ed, &d, r->n_ed == 0 && out ? &p : NULL);
        if (st == PLUMB_OK) {
            if (out)
                *out = p; /* the profile as written loads: the caller's */
            break;
        }
        if (!plumb_status_is_input_error(st) || strcmp(d.file, name) != 0 || d.line <= 0) {
            /* not in the file, or not the user's: listed only when first */
            if (*n == 0) {
                errs[(*n)++] = d;
                first = st;
            }
            break;
        }
        plumby_node *t = edited(r, r->n_ed);
        plumby_node *parent;
        size_t i;
        int written = t && find_at(t, d.line, d.col, d.key, &parent, &i);
        plumby_free(t);
        if (!written) {
            int c = absent_consequence(r, &d);
            if (c > 0)
                continue;
            if (c < 0 || no_progress(r, &d, errs, *n))
                break;
            errs[(*n)++] = d;
            if (first == PLUMB_OK)
                first = st;
            /* a numeric key missing on its own: a stand-in where it belongs */
            char parent_key[PLUMB_DIAG_KEY];
            const char *last;
            edit *e = split_key(d.key, parent_key, sizeof parent_key, &last)
                          ? new_edit(r, &d, ED_INSERT) : NULL;
            if (!e)
                break;
            plumbp_strlcpy(e->name, last, sizeof e->name);
            if (!give_stand_in(r, e, schema_of(d.key), NULL))
                break;
            r->n_ed++;
            continue;
        }
        if (no_progress(r, &d, errs, *n))
            break;
        errs[(*n)++] = d;
        if (first == PLUMB_OK)
            first = st;
        if (!set_aside(r, &d))
            break;
    }
    free(r);
    /* in file order */
    for (size_t i = 1; i < *n; i++)
        for (size_t j = i; j > 0 && (errs[j].line < errs[j - 1].line ||
                                     (errs[j].line == errs[j - 1].line &&
                                      errs[j].col < errs[j - 1].col)); j--) {
            plumb_diag t = errs[j];
            errs[j] = errs[j - 1];
            errs[j - 1] = t;
        }
    return first;
}
