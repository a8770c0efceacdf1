/*
 * profile_lint.c - every error of a profile, for `plumb lint`
 * (plumb_profile_lint_buffer, profile.h): the profile is built again and
 * again (profile.c, plumbp_profile_build), each time with the errors found
 * so far set aside, until it loads, no progress is made or max errors are
 * listed; then the errors are sorted into file order.
 *
 * Setting an error aside is an edit of a copy of the parsed tree, never of
 * the text:
 *   - a value that is refused (a bare number, a wrong unit, out of range,
 *     refused against another key, a word not in the key's list) is
 *     replaced by a stand-in the loader takes at that place, so that the
 *     key stays written and nothing that depends on its presence changes.
 *     A number's stand-ins, tried in order: the number written, in SI
 *     units, when it is one the key takes (what the user most likely
 *     meant), then plain values (1, 0.5, 0, 10, 100 ... in the key's
 *     range); a word's: its did-you-mean, then the key's words;
 *   - anything else (an unknown key, a map where a value was wanted, text,
 *     a list's item) is left out.
 * An error that is only a consequence of one set aside is not listed:
 *   - one that another stand-in of the same key avoids (a deploy height
 *     of 60 m "not below" a release height -3 m stood in as 1 m): the
 *     other stand-in is kept from then on, and the first is not tried
 *     again, so that the check cannot go back and forth;
 *   - a required key now missing because its value was left out: a
 *     numeric one gets a stand-in, a map below a section an empty map
 *     (descent.deploy: 5), whose required keys then get stand-ins in turn
 *     (its section's other keys are still checked), else the check
 *     stops; "payload"
 *     missing once "items" was left out (a profile has one of the two)
 *     gets a stand-in, so that the check goes on;
 *   - a required key now missing whose misspelt twin (the unknown key of
 *     the same map whose did-you-mean it is) was listed, or the twin of
 *     a key the map takes instead of it (deploy: {belw: 20 m}, with
 *     "after" missing: "give after: TIME or below: HEIGHT"): the misspelt
 *     key is read as the right one from then on, and its value checked;
 *   - a list or map found wanting once a part of it was left out (a
 *     choice of one attitude once the other was), or an uncertain input
 *     (uncertainty.descent.cd) of a top-level section left out: left out
 *     in turn;
 *   - an error of another section whose message names a part left out
 *     (release.position.latitude "needs the site's: site.latitude and
 *     site.longitude" once site is): its map (release.position) is left
 *     out in turn, so that the check goes on;
 *   - an error about a list or map that holds a value stood in (an air
 *     table's span once its refused altitude is stood in): left out;
 *   - a key missing under a map that was left out, or missing where a key
 *     of the same name was written one level too high, and an error at
 *     the place of a stand-in: the check cannot go on in that section, so
 *     the top-level section that holds it (atmosphere, wind, descent ...)
 *     is left out and the check goes on with the others; it stops when the
 *     profile needs the section (payload, release).
 * A required numeric key missing on its own is listed and given a stand-in
 * where it should be, so that the check goes on (a key of no stand-in, the
 * rows of an air table, leaves its section out). An error outside the file
 * (a --set), or one that is not the user's (out of memory), stops it.
 */
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/suggest.h"
#include "io/profile_int.h"

/* Most edits of one check (each error listed makes at most one, each
 * consequence turns one into another), and most stand-ins of one. */
enum { LINT_EDITS = 64, LINT_CANDS = 12 };
/* The stand-in of a map: an empty map (apply_one). */
#define MAP_STAND_IN "{}"


typedef enum ed_kind {
    ED_REMOVE = 0, /* the pair or list item left out */
    ED_STAND,      /* its value replaced by a stand-in */
    ED_RENAME,     /* the pair read under the key `name` */
    ED_INSERT      /* key `name` added to the map at `key`'s parent, with a stand-in */
} ed_kind;

typedef struct edit {
    ed_kind kind;
    int line, col;              /* the error's place: the pair's key or value, or the map */
    char key[PLUMB_DIAG_KEY];   /* the error's dotted key */
    char name[PLUMB_DIAG_KEY];  /* ED_RENAME, ED_INSERT: the key */
    char cand[LINT_CANDS][64];  /* ED_STAND, ED_INSERT: the stand-ins as written */
    size_t n_cand;              /* entries in cand */
    size_t cur;                 /* the stand-in in use */
    unsigned dropped;           /* bit i: cand[i] is not to be used again */
} edit;

typedef struct lint_run {
    const char *name, *sha;
    const plumby_node *tree;
    const plumb_units *units;
    const char *const *sets;
    size_t n_sets;
    const plumbp_id_check *check; /* of the criteria ids, or NULL */
    edit ed[LINT_EDITS];
    size_t n_ed;
    plumb_diag *machine; /* the first failure of the machine (out of memory)
                          * in any build, the lint's answer; status 0: none */
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
        plumby_node *v = scalar(e->cand[e->cur], e->line, e->col);
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
    case ED_STAND: {
        const plumby_node *old = *slot;
        int line = old ? old->line : e->line, col = old ? old->col : e->col;
        plumby_node *v = strcmp(e->cand[e->cur], MAP_STAND_IN) == 0
                             ? plumby_new(PLUMBY_MAP, line, col, PLUMBY_FROM_FILE)
                             : scalar(e->cand[e->cur], line, col);
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
 * memory (then r->machine says so: the lint fails with it). */
static plumby_node *edited(const lint_run *r, size_t n)
{
    plumby_node *copy = plumby_copy(r->tree);
    for (size_t i = 0; copy && i < n; i++)
        if (apply_one(copy, &r->ed[i]) != PLUMB_OK) {
            plumby_free(copy);
            copy = NULL;
        }
    if (!copy && r->machine->status == PLUMB_OK)
        PLUMB_RAISE(r->machine, PLUMB_ENOMEM, "out of memory checking the profile");
    return copy;
}

/* The key of error d as the file counts its lists: a list item left out
 * (the first n edits) moves the items after it up one in the edited
 * tree, so that the loader names "criteria[1]" of the file "criteria[0]";
 * the index of d's key in that list is raised by the items left out
 * before d (in file order). */
static void renumber(const lint_run *r, size_t n, plumb_diag *d)
{
    for (size_t i = 0; i < n; i++) {
        const edit *e = &r->ed[i];
        size_t klen = strlen(e->key);
        const char *open = strrchr(e->key, '[');
        if (e->kind != ED_REMOVE || klen == 0 || e->key[klen - 1] != ']' || !open)
            continue;
        size_t plen = (size_t)(open - e->key); /* the list's key, "criteria" */
        const char *idx = d->key + plen;
        if (strncmp(d->key, e->key, plen) != 0 || *idx != '[' ||
            (e->line > d->line || (e->line == d->line && e->col >= d->col)))
            continue;
        char *end;
        unsigned long k = strtoul(idx + 1, &end, 10);
        if (end == idx + 1 || *end != ']')
            continue;
        char key[PLUMB_DIAG_KEY];
        int w = snprintf(key, sizeof key, "%.*s[%lu]%s", (int)plen, d->key, k + 1, end + 1);
        if (w > 0 && (size_t)w < sizeof key)
            memcpy(d->key, key, (size_t)w + 1);
    }
}

/* Builds the tree with the first n edits: the status, *d its first error,
 * *out (may be NULL) the profile when it loads. */
static plumb_status try_build(const lint_run *r, size_t n, plumb_diag *d, plumb_profile **out)
{
    plumb_profile *p = NULL;
    plumb_diag_clear(d);
    plumby_node *copy = edited(r, n);
    plumb_status st =
        copy ? plumbp_profile_build(r->name, r->sha, copy, r->units, r->sets, r->n_sets, r->check,
                                    &p, d)
             : PLUMB_RAISE(d, PLUMB_ENOMEM, "out of memory checking the profile");
    /* a build that failed for want of memory says nothing of the input,
     * whichever helper asked for it: the whole lint fails with it */
    if (st != PLUMB_OK && !plumb_status_is_input_error(st) && r->machine->status == PLUMB_OK)
        *r->machine = *d;
    if (!copy)
        return st;
    renumber(r, n, d);
    if (out && st == PLUMB_OK)
        *out = p;
    else
        plumb_profile_free(p);
    return st;
}

/* Adds a stand-in to e unless it has it or is full. */
static void add_cand(edit *e, const char *text)
{
    for (size_t i = 0; i < e->n_cand; i++)
        if (strcmp(e->cand[i], text) == 0)
            return;
    if (e->n_cand < LINT_CANDS && strlen(text) < sizeof e->cand[0])
        plumbp_strlcpy(e->cand[e->n_cand++], text, sizeof e->cand[0]);
}

/* The stand-ins of key e->key, of schema s, whose value was node (NULL:
 * it is missing) into e->cand, in the order tried (the top of this file):
 * how many. */
static size_t stand_ins(const lint_run *r, edit *e, const plumby_schema *s,
                        const plumby_node *node)
{
    e->n_cand = 0;
    e->cur = 0;
    e->dropped = 0;
    const char *text = node && node->kind == PLUMBY_SCALAR ? node->text : NULL;
    if (s && s->type == PLUMBY_T_WORD && s->words) {
        const char *best = text ? plumb_suggest_closest(text, s->words, s->n_words) : NULL;
        if (best)
            add_cand(e, best);
        for (size_t i = 0; i < s->n_words; i++)
            add_cand(e, s->words[i]);
        return e->n_cand;
    }
    if (s && s->type == PLUMBY_T_MAP && strpbrk(e->key, ".[")) {
        /* a map below a section (descent.deploy: 5): an empty one, whose
         * required keys then get stand-ins (absent_consequence), so that
         * the rest of the section is still checked */
        add_cand(e, MAP_STAND_IN);
        return e->n_cand;
    }
    if (!s || s->type != PLUMBY_T_NUM)
        return 0;
    plumb_dim dim = plumby_num_dim(s);
    plumby_range range = plumby_num_range(s);
    double c[12]; /* the written value twice, the plain ones, the middle */
    size_t nc = 0;
    if (text) {
        plumby_ctx ctx;
        memset(&ctx, 0, sizeof ctx);
        ctx.file = r->name;
        ctx.units = r->units;
        double q;
        char *end;
        plumb_diag dq;
        ctx.diag = &dq;
        plumb_status sq = plumby_quantity(&ctx, node, dim, e->key, &q);
        if (sq == PLUMB_OK)
            c[nc++] = q;
        else if (!plumb_status_is_input_error(sq) && r->machine->status == PLUMB_OK)
            *r->machine = dq; /* out of memory: the lint fails with it */
        q = strtod(text, &end);
        if (end != text)
            c[nc++] = q;
    }
    static const double plain[] = {1.0, 0.5, 0.0, 10.0, 100.0, 0.1, 1000.0, 0.01};
    for (size_t i = 0; i < sizeof plain / sizeof plain[0]; i++)
        c[nc++] = plain[i];
    /* a range none of the plain values is in (air temperature, 150 K ..
     * 400 K): its middle */
    double lo, hi;
    int lo_open, hi_open;
    plumby_range_bounds(range, &lo, &hi, &lo_open, &hi_open);
    if (isfinite(lo) && isfinite(hi))
        c[nc++] = 0.5 * (lo + hi);
    int bare = dim == PLUMB_DIM_NONE || dim == PLUMB_DIM_FRACTION;
    for (size_t i = 0; i < nc; i++) {
        if (!isfinite(c[i]) || !plumby_range_ok(range, c[i]))
            continue;
        char t[64];
        snprintf(t, sizeof t, "%.17g%s%s", c[i], bare ? "" : " ",
                 bare ? "" : plumb_dim_si_unit(dim));
        add_cand(e, t);
    }
    return e->n_cand;
}

/* 1 when error d is at the place of a stand-in (any when e is NULL, else
 * e's). */
static int at_stand_in(const lint_run *r, const edit *e, const plumb_diag *d)
{
    for (size_t i = 0; i < r->n_ed; i++) {
        const edit *x = &r->ed[i];
        if ((e ? x == e : x->kind != ED_REMOVE) && x->line == d->line && x->col == d->col)
            return 1;
    }
    return e && e->line == d->line && e->col == d->col;
}

/* 1 when e stands in an empty map for a value and error d is a key
 * missing from it (given a stand-in in turn by absent_consequence). */
static int map_stand_in_wants(const edit *e, const plumb_diag *d)
{
    return (e->kind == ED_STAND || e->kind == ED_INSERT) && e->cur < e->n_cand &&
           strcmp(e->cand[e->cur], MAP_STAND_IN) == 0 && key_holds(e->key, d->key);
}

/* Makes e (its line, col and key set; a new edit at r->ed[r->n_ed] or one
 * of them) a stand-in of this kind (ED_STAND, ED_INSERT) for the key of
 * schema s, whose value node was `node` (NULL: missing): the first of its
 * stand-ins after which the check no longer stops at its place. 0 when
 * none does (e's kind unchanged). */
static int give_stand_in(lint_run *r, edit *e, ed_kind kind, const plumby_schema *s,
                         const plumby_node *node)
{
    ed_kind was = e->kind;
    e->kind = kind;
    size_t n = stand_ins(r, e, s, node);
    size_t upto = (size_t)(e - r->ed) + 1;
    if (upto < r->n_ed)
        upto = r->n_ed;
    for (size_t i = 0; i < n; i++) {
        e->cur = i;
        plumb_diag d;
        plumb_status st = try_build(r, upto, &d, NULL);
        if (st == PLUMB_ENOMEM)
            break;
        if (st == PLUMB_OK || !at_stand_in(r, e, &d) || map_stand_in_wants(e, &d))
            return 1;
        e->dropped |= 1u << i;
    }
    e->n_cand = 0;
    e->kind = was;
    return 0;
}

/* 1 when the two errors are the same. */
static int same_error(const plumb_diag *a, const plumb_diag *b)
{
    return a->status == b->status && a->line == b->line && a->col == b->col &&
           strcmp(a->key, b->key) == 0 && strcmp(a->message, b->message) == 0;
}

/* 1 when text names the key `word` as a whole word (not "cd" in
 * "cd_area"). */
static int names_word(const char *text, const char *word)
{
    size_t n = strlen(word);
    for (const char *p = text; n > 0 && (p = strstr(p, word)) != NULL; p++) {
        int before = p > text && (isalnum((unsigned char)p[-1]) || p[-1] == '_');
        int after = isalnum((unsigned char)p[n]) || p[n] == '_';
        if (!before && !after)
            return 1;
    }
    return 0;
}

static int insert_stand_in(lint_run *r, const plumb_diag *d);

/* Edit i, a value left out, made a stand-in (give_stand_in): 1 done. */
static int stand_in_removed(lint_run *r, size_t i)
{
    edit *e = &r->ed[i];
    plumby_node *t = edited(r, i);
    plumby_node *parent;
    size_t j;
    const plumby_node *old = NULL;
    if (t && find_at(t, e->line, e->col, e->key, &parent, &j))
        old = parent->kind == PLUMBY_MAP ? parent->pairs[j].value : parent->items[j];
    int ok = give_stand_in(r, e, ED_STAND, schema_of(e->key), old);
    plumby_free(t);
    return ok;
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
    /* "payload" missing once "items" was left out: the profile gave its
     * objects as items (src/io/profile.c, payload: or items:), so that is
     * not an error of its own; a stand-in payload lets the check go on */
    if (strcmp(d->key, "payload") == 0)
        for (size_t i = 0; i < r->n_ed; i++)
            if (r->ed[i].kind == ED_REMOVE && strcmp(r->ed[i].key, "items") == 0)
                return insert_stand_in(r, d) > 0 ? 1 : -1;
    for (size_t i = 0; i < r->n_ed; i++) {
        edit *e = &r->ed[i];
        if (strcmp(e->key, d->key) == 0)
            /* its value left out: a numeric one gets a stand-in, a map
             * below a section an empty one */
            return e->kind == ED_REMOVE && stand_in_removed(r, i) ? 1 : -1;
        if (map_stand_in_wants(e, d))
            return insert_stand_in(r, d) > 0 ? 1 : -1; /* under a map stood in */
        if (key_holds(e->key, d->key)) {
            /* under a map left out: an empty one in its place, when it is
             * a map below a section, so that the rest of it is checked */
            const plumby_schema *ms = schema_of(e->key);
            return e->kind == ED_REMOVE && ms && ms->type == PLUMBY_T_MAP &&
                           stand_in_removed(r, i) ? 1 : -1;
        }
        if (e->kind == ED_REMOVE && key_holds(d->key, e->key))
            return -1; /* a map left out in turn (above), now missing */
        if (e->kind != ED_REMOVE || !dsplit || !split_key(e->key, epar, sizeof epar, &elast))
            continue;
        if (strcmp(epar, dpar) == 0) {
            /* its misspelt twin, or the twin of one of the keys the map
             * takes instead of it (the message names them: "give after:
             * TIME or below: HEIGHT"): read under the name it should have */
            const plumby_schema *ms = map_schema(dpar);
            const char *best = ms && !plumby_schema_child(ms, elast)
                                   ? plumby_schema_suggest(ms, elast) : NULL;
            if (best && (strcmp(best, dlast) == 0 || names_word(d->message, best))) {
                e->kind = ED_RENAME;
                plumbp_strlcpy(e->name, best, sizeof e->name);
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

/* A stand-in inserted for the key missing of error d, where it belongs:
 * 1 done (a new edit), 0 when no stand-in lets the check go on, -1 when
 * no edit can be made (no room, or d's key is a list's item). */
static int insert_stand_in(lint_run *r, const plumb_diag *d)
{
    char parent_key[PLUMB_DIAG_KEY];
    const char *last;
    edit *e = split_key(d->key, parent_key, sizeof parent_key, &last)
                  ? new_edit(r, d, ED_INSERT) : NULL;
    if (!e)
        return -1;
    plumbp_strlcpy(e->name, last, sizeof e->name);
    if (!give_stand_in(r, e, ED_INSERT, schema_of(d->key), NULL))
        return 0;
    r->n_ed++;
    return 1;
}

/* Sets aside error d, found at a written node: 1 done, 0 no way to. */
static int set_aside(lint_run *r, const plumb_diag *d)
{
    plumby_node *t = edited(r, r->n_ed);
    plumby_node *parent;
    size_t i;
    edit *e = NULL;
    if (t && find_at(t, d->line, d->col, d->key, &parent, &i) && (e = new_edit(r, d, ED_REMOVE))) {
        const plumby_node *v =
            parent->kind == PLUMBY_MAP ? parent->pairs[i].value : parent->items[i];
        const plumby_schema *sc = schema_of(d->key);
        /* a map is left out (an optional one is then simply not given);
         * only one then missing gets an empty map (absent_consequence) */
        if (!(sc && sc->type == PLUMBY_T_MAP))
            (void)give_stand_in(r, e, ED_STAND, sc, v);
        r->n_ed++;
    }
    plumby_free(t);
    return e != NULL;
}

/* The first error of the check once error d (written in the tree) is set
 * aside as well: 1 with *ref, or with *loads 1 when the profile then
 * loads; 0 when d cannot be set aside or the check then fails otherwise.
 * The edits are as before. */
static int error_after(lint_run *r, const plumb_diag *d, plumb_diag *ref, int *loads)
{
    size_t n0 = r->n_ed;
    *loads = 0;
    if (!set_aside(r, d) || r->n_ed == n0) {
        r->n_ed = n0;
        return 0;
    }
    plumb_status st = try_build(r, r->n_ed, ref, NULL);
    r->n_ed = n0;
    *loads = st == PLUMB_OK;
    return st == PLUMB_OK || plumb_status_is_input_error(st);
}

/* Whether error d follows from a stand-in: 1 when another stand-in of one
 * key avoids it (that one is used from then on, the one before never
 * again); 0 when none does, so that d is an error of its own. Another
 * stand-in avoids d when the profile then loads, or when the check then
 * stops where it would stop with d set aside: not at an error of that
 * stand-in's own making, met before d (an unknown wind profile stood in
 * as 'table' would stop at the table missing, and prove nothing). */
static int follows_from_stand_in(lint_run *r, const plumb_diag *d)
{
    plumb_diag ref;
    int ref_loads = 0, have_ref = -1;
    for (size_t i = 0; i < r->n_ed; i++) {
        edit *e = &r->ed[i];
        if (e->kind != ED_STAND && e->kind != ED_INSERT)
            continue;
        size_t keep = e->cur;
        for (size_t k = 0; k < e->n_cand; k++) {
            if (k == keep || (e->dropped & (1u << k)))
                continue;
            e->cur = k;
            plumb_diag d2;
            plumb_status st = try_build(r, r->n_ed, &d2, NULL);
            if (st == PLUMB_ENOMEM)
                break;
            if (st != PLUMB_OK && (!plumb_status_is_input_error(st) || at_stand_in(r, NULL, &d2) ||
                                   same_error(&d2, d)))
                continue;
            if (st != PLUMB_OK) {
                if (have_ref < 0) {
                    e->cur = keep;
                    have_ref = error_after(r, d, &ref, &ref_loads);
                    e->cur = k;
                }
                if (!have_ref || ref_loads || !same_error(&d2, &ref))
                    continue;
            }
            e->dropped |= 1u << keep;
            return 1;
        }
        e->cur = keep;
    }
    return 0;
}

/* 1 when error d is about a map or list that holds a part left out, or
 * a value stood in: what it says of the whole follows from the stand-in
 * (an air table "spans 100 m .. 1000 m" once its refused second altitude,
 * 0 m, is stood in as 1000 m), not from the file. */
static int holds_left_out(const lint_run *r, const plumb_diag *d)
{
    for (size_t i = 0; i < r->n_ed; i++)
        if ((r->ed[i].kind == ED_REMOVE || r->ed[i].kind == ED_STAND) &&
            key_holds(d->key, r->ed[i].key))
            return 1;
    return 0;
}

/* 1 when error d is about an uncertain input under a top-level section
 * left out ("uncertainty.descent.cd" once descent is): no longer given,
 * only because the section is left out. */
static int uncertain_in_left_out(const lint_run *r, const plumb_diag *d)
{
    static const char unc[] = "uncertainty.";
    if (strncmp(d->key, unc, sizeof unc - 1) != 0)
        return 0;
    const char *in = d->key + sizeof unc - 1;
    for (size_t i = 0; i < r->n_ed; i++) {
        const edit *e = &r->ed[i];
        if (e->kind == ED_REMOVE && e->key[strcspn(e->key, ".[")] == '\0' &&
            (strcmp(in, e->key) == 0 || key_holds(e->key, in)))
            return 1;
    }
    return 0;
}

/* 1 when text names key as a key: the dotted key itself as a whole
 * ("site.longitude"), or a key under it ("site.latitude" for "site"); a
 * top-level name alone is a word of the text ("the site's"), not a key. */
static int names_key(const char *text, const char *key)
{
    size_t n = strlen(key);
    int dotted = strpbrk(key, ".[") != NULL;
    for (const char *p = text; n > 0 && (p = strstr(p, key)) != NULL; p++) {
        int before = p > text && (isalnum((unsigned char)p[-1]) || p[-1] == '_' || p[-1] == '.');
        int after = isalnum((unsigned char)p[n]) || p[n] == '_';
        if (!before && !after && (dotted || p[n] == '.' || p[n] == '['))
            return 1;
    }
    return 0;
}

/* 1 when error d, about a key outside every part left out, follows from
 * one left out: its message names it (release.position.latitude "needs
 * the site's: site.latitude and site.longitude" once site, a list where
 * a map belongs, is left out). Not an error of the file as written: with
 * the part as the user meant it, it would not be made. */
static int follows_from_left_out(const lint_run *r, const plumb_diag *d)
{
    for (size_t i = 0; i < r->n_ed; i++) {
        const edit *e = &r->ed[i];
        if (e->kind != ED_REMOVE || strcmp(e->key, d->key) == 0 || key_holds(e->key, d->key) ||
            key_holds(d->key, e->key))
            continue;
        if (names_key(d->message, e->key))
            return 1;
    }
    return 0;
}

/* Leaves out error d's key as a consequence (not listed): the map that
 * holds it when that is below a top-level section (release.position for
 * release.position.latitude: a point given by half of its keys is an
 * error of its own), else the key. 1 done, 0 no room. */
static int leave_out_consequence(lint_run *r, const plumb_diag *d)
{
    char parent[PLUMB_DIAG_KEY], grand[PLUMB_DIAG_KEY];
    const char *last, *plast;
    edit *e = new_edit(r, d, ED_REMOVE);
    if (!e)
        return 0;
    if (split_key(d->key, parent, sizeof parent, &last) && strpbrk(parent, ".[") &&
        split_key(parent, grand, sizeof grand, &plast)) {
        plumby_node *t = edited(r, r->n_ed);
        plumby_node *g = t ? node_at(t, grand) : NULL;
        const plumby_pair *p = g && g->kind == PLUMBY_MAP ? plumby_find(g, plast) : NULL;
        if (p) {
            e->line = p->line;
            e->col = p->col;
            plumbp_strlcpy(e->key, parent, sizeof e->key);
        }
        plumby_free(t);
    }
    r->n_ed++;
    return 1;
}

/* 1 when error d is at the place of a stand-in, or a key already listed. */
static int no_progress(const lint_run *r, const plumb_diag *d, const plumb_diag *errs, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (strcmp(errs[i].key, d->key) == 0)
            return 1;
    return at_stand_in(r, NULL, d);
}

/* Where the check would stop at error d (a consequence it cannot go on
 * past, or an error at a stand-in's place), the top-level section that
 * holds d ("atmosphere" of "atmosphere.table") is left out instead, so
 * that the check goes on with the other sections: 1 done, 0 when it
 * cannot be (d is of the top level, the section is already left out, or
 * the profile needs it: with it left out the check would stop at a
 * top-level key missing, "payload" once "items" is gone, or at a key
 * under it). What the section holds past d is not checked. */
static int leave_out_section(lint_run *r, const plumb_diag *d)
{
    char top[PLUMB_DIAG_KEY];
    size_t n = strcspn(d->key, ".[");
    if (n == 0 || n >= sizeof top || r->n_ed >= LINT_EDITS)
        return 0;
    memcpy(top, d->key, n);
    top[n] = '\0';
    for (size_t i = 0; i < r->n_ed; i++)
        if (r->ed[i].kind == ED_REMOVE && strcmp(r->ed[i].key, top) == 0)
            return 0;
    plumby_node *t = edited(r, r->n_ed);
    const plumby_pair *p = t && t->kind == PLUMBY_MAP ? plumby_find(t, top) : NULL;
    if (!p) {
        plumby_free(t);
        return 0;
    }
    edit *e = &r->ed[r->n_ed];
    memset(e, 0, sizeof *e);
    e->kind = ED_REMOVE;
    e->line = p->line;
    e->col = p->col;
    plumbp_strlcpy(e->key, top, sizeof e->key);
    plumby_free(t);
    r->n_ed++;
    plumb_diag d2;
    plumb_status st = try_build(r, r->n_ed, &d2, NULL);
    if (st == PLUMB_OK)
        return 1;
    int ok = plumb_status_is_input_error(st) && strcmp(d2.file, r->name) == 0 && d2.line > 0 &&
             !at_stand_in(r, NULL, &d2) && strcmp(d2.key, top) != 0 && !key_holds(top, d2.key);
    if (ok) {
        plumby_node *t2 = edited(r, r->n_ed);
        plumby_node *parent;
        size_t j;
        /* a key missing at the top level is one the section stood for */
        ok = (t2 && find_at(t2, d2.line, d2.col, d2.key, &parent, &j)) ||
             strcspn(d2.key, ".[") < strlen(d2.key);
        plumby_free(t2);
    }
    if (!ok)
        r->n_ed--;
    return ok;
}

plumb_status plumbp_profile_lint_tree(const char *name, const char *sha, const plumby_node *tree,
                                      const plumb_units *units, const char *const *sets,
                                      size_t n_sets, const plumbp_id_check *check,
                                      plumb_diag *errs, size_t max, size_t *n,
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
    r->check = check;
    plumb_diag machine;
    plumb_diag_clear(&machine);
    r->machine = &machine;
    plumb_status first = PLUMB_OK;
    /* each pass lists an error or turns a consequence into an edit */
    for (size_t pass = 0; *n < max && pass < 4 * LINT_EDITS && machine.status == PLUMB_OK;
         pass++) {
        plumb_diag d;
        plumb_profile *p = NULL;
        plumb_status st = try_build(r, r->n_ed, &d, r->n_ed == 0 && out ? &p : NULL);
        if (st == PLUMB_OK) {
            if (out)
                *out = p; /* the profile as written loads: the caller's */
            break;
        }
        if (!plumb_status_is_input_error(st)) {
            /* the machine failed (out of memory), not the input: the
             * list so far is not the whole of it, so it is not given */
            errs[0] = d;
            *n = 1;
            first = st;
            break;
        }
        if (strcmp(d.file, name) != 0 || d.line <= 0) {
            /* not in the file, or not the user's: listed only when first */
            if (*n == 0) {
                errs[(*n)++] = d;
                first = st;
            }
            break;
        }
        if (follows_from_stand_in(r, &d))
            continue;
        plumby_node *t = edited(r, r->n_ed);
        plumby_node *parent;
        size_t i;
        int written = t && find_at(t, d.line, d.col, d.key, &parent, &i);
        plumby_free(t);
        if (!written) {
            int c = absent_consequence(r, &d);
            if (c > 0)
                continue;
            if (c < 0 || no_progress(r, &d, errs, *n)) {
                if (leave_out_section(r, &d))
                    continue;
                break;
            }
            errs[(*n)++] = d;
            if (first == PLUMB_OK)
                first = st;
            /* a numeric key missing on its own: a stand-in where it belongs */
            int ins = insert_stand_in(r, &d);
            if (ins == 0 && leave_out_section(r, &d))
                continue;
            if (ins <= 0)
                break;
            continue;
        }
        if (no_progress(r, &d, errs, *n)) {
            if (leave_out_section(r, &d))
                continue;
            break;
        }
        if (holds_left_out(r, &d) || uncertain_in_left_out(r, &d)) {
            /* a list or map found wanting once a part of it was left out,
             * or an uncertain input of a section left out: left out as
             * well, not listed */
            edit *e = new_edit(r, &d, ED_REMOVE);
            if (!e)
                break;
            r->n_ed++;
            continue;
        }
        if (follows_from_left_out(r, &d)) {
            /* a consequence in another section of a part left out */
            if (!leave_out_consequence(r, &d))
                break;
            continue;
        }
        errs[(*n)++] = d;
        if (first == PLUMB_OK)
            first = st;
        if (!set_aside(r, &d))
            break;
    }
    free(r);
    if (machine.status != PLUMB_OK) {
        errs[0] = machine;
        *n = 1;
        if (out) {
            plumb_profile_free(*out);
            *out = NULL;
        }
        return machine.status;
    }
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
