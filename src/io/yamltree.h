/*
 * yamltree.h - a small, strict YAML node tree with positions, and a schema
 * checker over it (internal; shared by profile.c and criteria.c). The tree
 * is yamltree.c; the schema and the readers of a checked map are
 * yamltree_schema.c.
 *
 * The tree is built from libyaml's event parser (YAML 1.1, pyyaml.org/
 * wiki/LibYAML). Every string is copied out of libyaml's buffers, so
 * nothing in a tree points into them. Refused while building, each with
 * the line and column where it happens: bytes that are not UTF-8 (libyaml
 * reader), tab characters in the indentation or inside a value (a tab
 * before or inside a comment, or between a key and its value, is white
 * space, as YAML 1.2.2 6.1 allows), anchors, aliases and tags (an alias
 * bomb cannot be built), keys that are not scalars, duplicate keys, maps
 * with more than PLUMBY_MAX_KEYS keys, nesting deeper than PLUMBY_MAX_DEPTH,
 * NUL characters in scalars, a second document, and a stream with no
 * document or an empty one.
 *
 * Lines and columns are 1-based and count characters, as libyaml does.
 * A node remembers its origin: the profile file, or a `--set` override,
 * whose diagnostics name the file "--set".
 *
 * Ownership: plumby_parse returns a tree the caller frees with
 * plumby_free; plumby_copy makes an independent deep copy. Schemas are
 * static tables owned by the caller.
 */
#ifndef PLUMB_YAMLTREE_H
#define PLUMB_YAMLTREE_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/units.h"
#include "core/internal.h"

/* Deepest nesting of maps and lists accepted. */
#define PLUMBY_MAX_DEPTH 32
/* Most keys in one map (keeps the duplicate check linear-time bounded). */
#define PLUMBY_MAX_KEYS 1024
/* File name that diagnostics of override nodes carry. */
#define PLUMBY_SET_FILE PLUMB_DIAG_SET_FILE
/* The key of an inventory's list of items. Its items are numbered from 1
 * in keys ("items[1]" is the first), as in every report, --set, --vary
 * and message; every other list counts from 0 ("descent[0]"). */
#define PLUMBY_ITEMS_KEY "items"

typedef enum plumby_kind { PLUMBY_SCALAR = 0, PLUMBY_SEQ, PLUMBY_MAP } plumby_kind;

typedef enum plumby_origin { PLUMBY_FROM_FILE = 0, PLUMBY_FROM_SET } plumby_origin;

typedef struct plumby_node plumby_node;

/* One key: value pair of a map. */
typedef struct plumby_pair {
    char *key;                 /* owned, NUL-terminated */
    int line, col;             /* where the key was written */
    plumby_origin origin;      /* file or --set */
    plumby_node *value;        /* owned */
} plumby_pair;

struct plumby_node {
    plumby_kind kind;          /* scalar, list or map */
    int line, col;             /* 1-based start of the node */
    plumby_origin origin;      /* file or --set */
    int plain;                 /* scalar: 1 when written without quotes */
    char *text;                /* scalar: owned, NUL-terminated; else NULL */
    size_t n;                  /* list items or map pairs */
    size_t cap;                /* allocated items or pairs */
    plumby_node **items;       /* list: owned items */
    plumby_pair *pairs;        /* map: owned pairs, in file order */
};

/* Reads a whole file of at most max_bytes. A directory, a file that
 * cannot be opened or read (PLUMB_EIO), or a longer one (PLUMB_ERANGE)
 * is refused with the file named in diag. On success *buf is malloc'd
 * (NUL-terminated, the caller frees it) and *len its length. */
plumb_status plumby_read_file(const char *path, size_t max_bytes, char **buf, size_t *len,
                              plumb_diag *diag);

/* Parses one YAML document of len bytes into a tree whose nodes carry
 * `origin`. Errors are reported in `file`, at the line and column, plus
 * col_offset on line 1 (for an override whose value starts col_offset
 * characters into the argument), with the dotted key of the place,
 * prefixed by key_prefix (may be NULL). On error *out is NULL, diag is
 * located and nothing leaks. */
plumb_status plumby_parse(const char *buf, size_t len, const char *file, plumby_origin origin,
                          int col_offset, const char *key_prefix, plumby_node **out,
                          plumb_diag *diag);

/* New empty node of `kind` at a position; NULL when out of memory. */
plumby_node *plumby_new(plumby_kind kind, int line, int col, plumby_origin origin);

/* Deep copy; NULL when out of memory (nothing leaks). */
plumby_node *plumby_copy(const plumby_node *node);

/* Frees a tree. Accepts NULL. */
void plumby_free(plumby_node *node);

/* Appends an item to a list node (takes ownership on success). */
plumb_status plumby_seq_push(plumby_node *seq, plumby_node *item);

/* Appends key: value to a map node (copies key; takes value on success). */
plumb_status plumby_map_push(plumby_node *map, const char *key, int line, int col,
                             plumby_origin origin, plumby_node *value);

/* The pair with this key in a map node, or NULL. */
plumby_pair *plumby_find(const plumby_node *map, const char *key);

/* True for a plain scalar that YAML reads as null: "", "~", "null". */
int plumby_is_null(const plumby_node *node);

/* A short description of a node for "found ..." ("'2.4 kg'", "a map",
 * "a list", "an empty value") into buf. Returns buf. */
const char *plumby_describe(const plumby_node *node, char *buf, size_t size);

/* ---- schema ------------------------------------------------------------ */

typedef enum plumby_type {
    PLUMBY_T_NUM = 0,     /* scalar: number with the unit of `dim`, in `range` */
    PLUMBY_T_COUNT,       /* scalar: a whole number written in digits */
    PLUMBY_T_WORD,        /* scalar: one of `words` (any word when words is NULL) */
    PLUMBY_T_TEXT,        /* scalar: free text */
    PLUMBY_T_MAP,         /* map with the keys in sub[0..n_sub) */
    PLUMBY_T_LIST,        /* list whose items all follow sub[0] */
    PLUMBY_T_MAP_OR_LIST, /* a map with the keys in sub[], or a list of such maps */
    PLUMBY_T_FREE_MAP     /* map with free keys; the caller checks them */
} plumby_type;

/* Valid ranges of numeric values (SI units). */
typedef enum plumby_range {
    PLUMBY_R_ANY = 0,     /* any finite value */
    PLUMBY_R_POSITIVE,    /* > 0 */
    PLUMBY_R_NONNEG,      /* >= 0 */
    PLUMBY_R_CD,          /* 0 .. 10 (0: drag-free) */
    PLUMBY_R_CD_POSITIVE, /* > 0 .. 10 */
    PLUMBY_R_UNIT,        /* 0 .. 1 */
    PLUMBY_R_UNIT_OPEN,   /* 0 < x < 1 */
    PLUMBY_R_LATITUDE,    /* -90 .. 90 deg */
    PLUMBY_R_LONGITUDE,   /* -180 .. 180 deg */
    PLUMBY_R_ALTITUDE,    /* PLUMB_STD1976_BOTTOM_M .. PLUMB_STD1976_TOP_M, the span of the 1976 atmosphere */
    PLUMBY_R_SUBSONIC,    /* -PLUMB_SOUND_SPEED_SL_M_S .. PLUMB_SOUND_SPEED_SL_M_S */
    PLUMBY_R_SUBSONIC_NONNEG, /* 0 .. PLUMB_SOUND_SPEED_SL_M_S */
    PLUMBY_R_TEMP_OFFSET, /* -PLUMB_TEMP_OFFSET_MAX_K .. PLUMB_TEMP_OFFSET_MAX_K */
    PLUMBY_R_AIR_TEMPERATURE, /* PLUMB_AIR_TEMPERATURE_MIN_K .. PLUMB_AIR_TEMPERATURE_MAX_K */
    PLUMBY_R_MASS         /* > 0 .. PLUMB_MASS_MAX_KG */
} plumby_range;

/* A row of the key table (io/keys.h), which describes every numeric key of
 * a profile. */
struct plumbp_key;

/* One node of a schema. A numeric leaf of the profile's schema (NUM or
 * COUNT) names its row of the key table in `key` and leaves dim and range
 * unset: the row gives them (plumby_num_dim, plumby_num_range). A schema
 * outside the profile (a criteria file) has no key table; its NUM leaves
 * give dim and range here, with `key` NULL. */
typedef struct plumby_schema plumby_schema;
struct plumby_schema {
    const char *name;              /* key in its parent map ("" for a list item) */
    plumby_type type;              /* what the value must be */
    plumb_dim dim;                 /* NUM without a key row: the dimension */
    plumby_range range;            /* NUM without a key row: valid range */
    const plumby_schema *sub;      /* MAP, MAP_OR_LIST: the keys; LIST: the item */
    size_t n_sub;                  /* entries in sub */
    const char *const *words;      /* WORD: allowed words, or NULL for any */
    size_t n_words;                /* entries in words */
    const struct plumbp_key *key;  /* NUM, COUNT: the key's row, or NULL (see above) */
};

/* The dimension and the range of a NUM leaf: its key row's, or its own
 * when it has no row. Can't fail. */
plumb_dim plumby_num_dim(const plumby_schema *s);
plumby_range plumby_num_range(const plumby_schema *s);

/* Largest drag coefficient accepted (a plausibility bound, common
 * practice, no source: bluff bodies stay below about 2). */
#define PLUMBY_CD_MAX 10.0

/* Everything a checker or reader needs to raise a located error. */
/* A key a --set removed (KEY=~ or KEY=null): a required key then missing
 * is that --set's doing, and is told at it. */
typedef struct plumby_removal {
    char key[PLUMB_DIAG_KEY];      /* the dotted key removed, items[N] as written */
    int line, col;                 /* the --set (line of the "--set" pseudo-file) and
                                      the column of its ~ */
} plumby_removal;

typedef struct plumby_ctx {
    const char *file;              /* file name for PLUMBY_FROM_FILE nodes */
    const plumb_units *units;      /* for numbers with units */
    plumb_diag *diag;              /* filled on error (may be NULL) */
    const size_t *item_no;         /* the top-level items' numbers, from 1, as items[N]
                                      counts them (NULL: place in the list + 1) */
    size_t n_item_no;              /* entries in item_no */
    const plumby_removal *removed; /* the keys --set options removed (may be NULL) */
    size_t n_removed;              /* entries in removed */
} plumby_ctx;

/* Raises status at a position of the given origin. */
plumb_status plumby_raise(const plumby_ctx *ctx, plumby_origin origin, int line, int col,
                          const char *key, plumb_status status, const char *fmt, ...)
    PLUMBP_PRINTF(7, 8);

/* Checks the numbers of the tree on their own, each its unit and its
 * key's range, and raises the earliest error in line and column order:
 * with only_set, those a --set gave (origin PLUMBY_FROM_SET), so that an
 * error in a --set's own value is told first (the earliest --set's), not
 * a consequence elsewhere of what that --set replaced (drag: given by
 * --set over a shape: lacks its cd); else all of them, so that of the
 * values a file gets wrong the first in file order is told, whatever
 * order the loader reads the keys in. Errors as plumby_num_node; an
 * unknown key or a value of the wrong kind is left to plumby_check, but
 * with only_set a value a --set gave is checked by plumby_check as well
 * (payload.drag=5: a --set of the wrong kind is its own error too). */
plumb_status plumby_check_values(const plumby_ctx *ctx, const plumby_node *node,
                                 const plumby_schema *s, int only_set);

/* The child of a MAP or MAP_OR_LIST schema with this name, or NULL. */
const plumby_schema *plumby_schema_child(const plumby_schema *map, const char *name);

/* Closest child name of a map schema to `name` (did-you-mean), or NULL. */
const char *plumby_schema_suggest(const plumby_schema *map, const char *name);

/* Where, below a map schema, the key `name` belongs when it was written
 * too high: the dotted path of the nearest map (up to four levels down,
 * a list's item written [N]) that has it ("drag" for "area" in payload,
 * "release" for "downwash" at the top), written into path[size] and
 * returned; NULL when no map below has it. */
const char *plumby_schema_nested(const plumby_schema *map, const char *name, char *path,
                                 size_t size);

/* Checks a tree against a schema: every key known (with a did-you-mean
 * otherwise), every value of the right kind (scalar, map, list), words in
 * their lists. `key` is the dotted key of node ("" at the top). */
plumb_status plumby_check(const plumby_ctx *ctx, const plumby_node *node,
                          const plumby_schema *schema, const char *key);

/* "what a value of this schema looks like", e.g. "a mass with its unit
 * (SI: kg)", into buf. Returns buf. */
const char *plumby_expected(const plumby_schema *schema, char *buf, size_t size);

/* The bounds of a range, SI: lo .. hi (-HUGE_VAL, HUGE_VAL where it has
 * none); *lo_open, *hi_open 1 when the bound itself is outside. The one
 * meaning of each range: plumby_range_ok and plumbp_key_bounds (io/keys.h)
 * read it from here. Can't fail. */
void plumby_range_bounds(plumby_range range, double *lo, double *hi, int *lo_open,
                         int *hi_open);

/* 1 when v lies in the range (any v for PLUMBY_R_ANY). */
int plumby_range_ok(plumby_range range, double v);

/* The range as text, e.g. "> 0 kg" or "0 .. 10", into buf. Returns buf. */
const char *plumby_range_text(plumby_range range, plumb_dim dim, char *buf, size_t size);

/* Parses a scalar node as a finite quantity of `dim` (SI), no range check. */
plumb_status plumby_quantity(const plumby_ctx *ctx, const plumby_node *node, plumb_dim dim,
                             const char *key, double *out);

/* ---- reading a checked map --------------------------------------------- */

/* A map being read. node is NULL when the map is absent; missing keys are
 * then reported where the map should have been (line/col/origin). */
typedef struct plumby_map {
    const plumby_ctx *ctx;
    const plumby_node *node;       /* the map node, or NULL */
    const plumby_schema *schema;   /* schema whose sub[] are its keys */
    char key[PLUMB_DIAG_KEY];      /* dotted key of the map, "" at the top */
    int line, col;                 /* where to report a missing key */
    plumby_origin origin;
} plumby_map;

/* Joins "prefix" and "name" into "prefix.name" ("name" for an empty
 * prefix); "prefix[i]" when name is NULL, i counted from 0, except under
 * PLUMBY_ITEMS_KEY, where the i-th item is "items[i+1]". Returns dst. */
char *plumby_key_join(char *dst, size_t size, const char *prefix, const char *name, size_t i);

/* Starts reading a map node (checked with plumby_check) at key. */
void plumby_map_init(plumby_map *m, const plumby_ctx *ctx, const plumby_node *node,
                     const plumby_schema *schema, const char *key);

/* The value of key `name`, or NULL when absent (or the map is absent). */
const plumby_node *plumby_get(const plumby_map *m, const char *name);

/* The sub-map `name` of m, absent or not (reported at m then). */
void plumby_sub(const plumby_map *m, const char *name, plumby_map *out);

/* The removal by a --set of the dotted key, or of a map that holds it
 * ("release" holds "release.height"); NULL when no --set removed it. */
const plumby_removal *plumby_removed(const plumby_ctx *ctx, const char *key);

/* PLUMB_EKEY "required key ... is missing", at the map, or at the --set
 * that removed it (plumby_removed). */
plumb_status plumby_missing(const plumby_map *m, const char *name, const char *why);

/* PLUMB_EKEY at key `name` when it is present: it is not used here
 * (`why` completes "is not used ..."). PLUMB_OK when it is absent. */
plumb_status plumby_forbid(const plumby_map *m, const char *name, const char *why);

/* Raises at the value of key `name` (at the map if absent). */
plumb_status plumby_raise_value(const plumby_map *m, const char *name, plumb_status status,
                                const char *fmt, ...) PLUMBP_PRINTF(4, 5);

/* Reads the number `name` (schema NUM) in SI units, range-checked. When
 * absent: PLUMB_EKEY if required, else *out = dflt. *present (may be
 * NULL) says whether it was given. */
plumb_status plumby_num(const plumby_map *m, const char *name, int required, double dflt,
                        double *out, int *present);

/* Reads a schema NUM value node (a list item, say) at dotted key. */
plumb_status plumby_num_node(const plumby_ctx *ctx, const plumby_node *node,
                             const plumby_schema *schema, const char *key, double *out);

/* Reads the word `name` (schema WORD) as its index in the schema's words;
 * dflt < 0 makes it required. */
plumb_status plumby_word(const plumby_map *m, const char *name, int dflt, int *out);

/* Copies the text `name` into dst (size bytes); dflt NULL makes it
 * required. Longer text, or control characters, are PLUMB_ERANGE/EINVAL. */
plumb_status plumby_text(const plumby_map *m, const char *name, const char *dflt, char *dst,
                         size_t size);

/* Copies a TEXT or WORD scalar node into dst, same checks as plumby_text. */
plumb_status plumby_text_node(const plumby_ctx *ctx, const plumby_node *node, const char *key,
                              char *dst, size_t size);

/* Reads the whole number `name` in lo..hi; absent: *out = dflt. */
plumb_status plumby_count(const plumby_map *m, const char *name, unsigned long long dflt,
                          unsigned long long lo, unsigned long long hi, unsigned long long *out);

#endif /* PLUMB_YAMLTREE_H */
