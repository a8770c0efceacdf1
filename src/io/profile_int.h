/*
 * profile_int.h - what the files of the profile module share: profile.c
 * (loading, building, interpreting and reading a profile back),
 * profile_schema.c (the schema of the keys; a numeric key's dimension
 * and range are its row's in the key table, io/keys.h), profile_keypath.c
 * (dotted key paths, key dimensions and units), profile_set.c (--set
 * overrides),
 * profile_item.c (a payload or item: drag, shape, descent devices,
 * glide), profile_scene.c (release, site, atmosphere, wind, turbulence),
 * profile_study.c (criteria, uncertainty, zone, job), profile_spec.c (a
 * profile of a spec built in code) and vary.c (an input set on copies of
 * a resolved profile, io/vary.h). The profile's definition, the loader, the key
 * path, the schema items the readers walk, and the functions called
 * across files (plumbp_profile_ prefix). Internal to libplumb; not
 * installed.
 */
#ifndef PLUMB_PROFILE_INT_H
#define PLUMB_PROFILE_INT_H

#include <stddef.h>

#include "plumb/constants.h"
#include "plumb/profile.h"
#include "core/internal.h"
#include "io/keys.h"
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
    int borrowed;                    /* 1: a variant (vary.c): only the struct and items are
                                        its own, the rest is its template's */
    /* An inventory's numbering, as items[N] counts (profile_set.c): */
    size_t *item_no;                 /* n_items: item i is items[item_no[i]], from 1; NULL:
                                        items[i + 1] (no items, or built in code) */
    size_t n_item_no;                /* entries in item_no: the list's length when loaded */
    size_t n_slots;                  /* numbers given out: the items as written and any a
                                        --set added */
    int *slot_removed_by;            /* n_slots: 0 present, else the --set that removed it
                                        (-1: removed with the whole list) */
};

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

/* ---- interpretation ---------------------------------------------------- */

/* A check the loader makes of each criterion id a profile names, as it
 * reads it, for a caller above io that knows the criteria set (io does
 * not; plumb_study_lint, study/lint.c): criterion returns PLUMB_OK to take
 * the id, else an input error status with msg (size bytes) what was
 * expected, which the loader raises at the id (its file or --set, line,
 * column and key criteria[i]), so that plumb lint lists an unknown id in
 * file order with the profile's other errors. */
typedef struct plumbp_id_check {
    plumb_status (*criterion)(void *ctx, const char *id, char *msg, size_t size);
    void *ctx; /* the caller's, passed back */
} plumbp_id_check;

typedef struct loader {
    plumby_ctx ctx;
    const plumbp_id_check *check; /* NULL: the ids are checked later (study) */
    plumb_profile *p;
    plumby_map root;
    double height_m;        /* release.height */
    double elevation_m;     /* site.elevation */
} loader;

static inline plumb_status nomem(const loader *L)
{
    return PLUMB_RAISE(L->ctx.diag, PLUMB_ENOMEM, "out of memory loading the profile");
}

/* The schema's list items that the readers walk (profile_schema.c). */
extern const plumby_schema plumbp_profile_edge_item[];
extern const plumby_schema plumbp_profile_atm_row_item[];
extern const plumby_schema plumbp_profile_wind_row_item[];

/* ---- the loader's checks of a value against other keys ----------------
 *
 * Each is used by the loader, which raises its own message, and by vary.c,
 * which checks a varied copy of a resolved profile again (plumbp_vary_set),
 * so that both refuse the same values. */

/* The release point above the top of the 1976 atmosphere. */
static inline int plumbp_release_too_high(double elevation_m, double height_m)
{
    return elevation_m + height_m > PLUMB_STD1976_TOP_M;
}

/* A device deploying below a height at or above the release height. */
static inline int plumbp_deploy_not_below(const plumb_descent_spec *d, double height_m)
{
    return d->trigger == PLUMB_DEPLOY_BELOW && !(d->deploy_value < height_m);
}

/* Device b, listed after a, deploying before it. */
static inline int plumbp_devices_out_of_order(const plumb_descent_spec *a,
                                              const plumb_descent_spec *b)
{
    return a->trigger == b->trigger &&
           (a->trigger == PLUMB_DEPLOY_AFTER ? b->deploy_value < a->deploy_value
                                             : b->deploy_value > a->deploy_value);
}

/* An inflation exponent beyond the published curves' range. */
static inline int plumbp_inflation_exponent_too_large(double j)
{
    return j > PLUMB_INFLATION_J_MAX;
}

/* A log wind's roughness length not below its reference height. */
static inline int plumbp_log_wind_too_rough(const plumb_wind_spec *w)
{
    return w->profile == PLUMB_WIND_LOG && !(w->roughness_m < w->ref_height_m);
}

/* The surface model's temperature at the release height, K. */
static inline double plumbp_surface_top_k(const plumb_atm_spec *a, double height_m)
{
    return a->station_temperature_k - a->lapse_rate_k_m * height_m;
}

/* A table of air not spanning lo_m .. hi_m. */
static inline int plumbp_table_misses(const plumb_atm_spec *a, double lo_m, double hi_m)
{
    return a->table_alt_m[0] > lo_m || a->table_alt_m[a->table_n - 1] < hi_m;
}

/* profile_scene.c: the first height of lo_m .. hi_m (its ends and the 1976
 * layer bases between) where the 1976 temperature plus dt_k is not above
 * 0 K: 1 with *at_m, the standard temperature there *t_k and *st
 * PLUMB_ERANGE, or *st the status of plumb_std1976 when it has no
 * temperature there; 0 when it stays above 0 K. */
int plumbp_std_temperature_fails(double dt_k, double lo_m, double hi_m, double *at_m, double *t_k,
                                 plumb_status *st);

/* profile_keypath.c */
/* Index of the item of list whose name is `name`, or -1. */
long plumbp_item_named(const plumby_node *list, const char *name);
/* The node at kp in root, an item segment by its place in the list or by
 * its name, or NULL: the walk of tree_remove, reading. Can't fail. */
const plumby_node *plumbp_tree_get(const plumby_node *root, const keypath *kp);
plumb_status plumbp_profile_keypath_resolve(const char *key, keypath *kp, const char *file,
                                            int file_line, plumb_diag *diag);
/* `key` of item `item` (from 0) as p's file wrote it, into out[size]: a
 * descent device's "descent[N].X" is "descent.X" where the profile gave
 * `descent:` as one map, and an item's own device is items[M].descent...;
 * any other key is copied. For a diagnostic after a fall or a zone, whose
 * keys name devices by index. Can't fail. */
void plumbp_profile_key_spelt(const plumb_profile *p, size_t item, const char *key, char *out,
                              size_t size);
/* profile_set.c */
/* How the --set options of one command number an inventory's items: as
 * the profile is written, before any --set removes or adds one, so that
 * items[N] is the same item in every --set. Slot k is items[k + 1]: its
 * node in the tree, or NULL once a --set removed it (removed_by, that
 * --set's number); items a --set adds take the next slots. Zeroed before
 * the first --set; plumbp_set_items_free frees it. */
typedef struct plumbp_set_items {
    int ready;
    size_t n, cap;
    plumby_node **node;
    int *removed_by;
    /* the key each --set of this call set or removed, items[N] numbered
     * as written (an item's name turned into its number), so that two of
     * one key are refused (profile_set.c, set_twice) */
    struct plumbp_set_key *keys;
    size_t n_keys, cap_keys;
} plumbp_set_items;

/* One --set's key (plumbp_set_items.keys). */
typedef struct plumbp_set_key {
    char key[PLUMB_DIAG_KEY];    /* resolved: "items[5].mass", "descent[0].area" */
    char typed[PLUMB_DIAG_KEY];  /* as the --set wrote it */
    int line;                    /* which --set, from 1 */
    int removed;                 /* 1: KEY=~, a removal */
} plumbp_set_key;

void plumbp_set_items_free(plumbp_set_items *numbering);
/* Once the --set options are applied: p's item_no, n_slots and
 * slot_removed_by from the numbering and the list in root. PLUMB_ENOMEM
 * (nothing raised: the caller says so) is the only failure. */
plumb_status plumbp_set_items_numbers(plumbp_set_items *numbering, plumby_node *root,
                                      plumb_profile *p);
/* Before the --set options of a derived profile: the numbering of base,
 * whose tree root is a copy of, so that items[N] means the same item in
 * every --set of a command however many steps apply them (a sweep's rows
 * after the command's --set). PLUMB_ENOMEM is the only failure. */
plumb_status plumbp_set_items_seed(plumbp_set_items *numbering, plumby_node *root,
                                   const plumb_profile *base);
/* Applies the override `arg`, the line-th --set (from 1). A removal
 * (KEY=~) fills *removal (may be NULL) with the key, items[N] numbered as
 * written; otherwise removal->key is "". */
plumb_status plumbp_profile_apply_set(plumby_node *root, const char *arg, int line,
                                      plumbp_set_items *numbering, plumby_removal *removal,
                                      plumb_diag *diag);

/* profile.c: applies sets to tree (owned), checks and interprets it into
 * *out, as plumb_profile_load does after parsing; check (may be NULL) the
 * check of each criterion id. */
plumb_status plumbp_profile_build(const char *path, const char *sha, plumby_node *tree,
                                  const plumb_units *units, const char *const *sets,
                                  size_t n_sets, const plumbp_id_check *check,
                                  plumb_profile **out, plumb_diag *diag);

/* profile.c: plumb_profile_lint (buf NULL: the file at name is read) and
 * plumb_profile_lint_buffer (the len bytes at buf), each criterion id
 * checked as it is read by check (may be NULL). */
plumb_status plumbp_profile_lint_checked(const char *name, const char *buf, size_t len,
                                         const plumb_units *units, const char *const *sets,
                                         size_t n_sets, const plumbp_id_check *check,
                                         plumb_diag *errs, size_t max, size_t *n,
                                         plumb_profile **out);

/* profile_lint.c: the errors of a parsed profile (tree, not changed), as
 * plumb_profile_lint_buffer lists them; check as for plumbp_profile_build. */
plumb_status plumbp_profile_lint_tree(const char *name, const char *sha, const plumby_node *tree,
                                      const plumb_units *units, const char *const *sets,
                                      size_t n_sets, const plumbp_id_check *check,
                                      plumb_diag *errs, size_t max, size_t *n,
                                      plumb_profile **out);

/* profile_item.c */
/* A fixed drag given as cd and area (area_m2 > 0: cd_area_m2 = cd x area)
 * or as cd_area: its cd_area_m2 and the source text that names the values. */
void plumbp_profile_fixed_drag(plumb_drag_spec *d);
plumb_status plumbp_profile_read_item(const loader *L, const plumby_map *im, int is_item,
                                      const plumb_fall_spec *base, plumb_fall_spec *spec,
                                      plumb_shape_spec *shape);

/* profile_scene.c */
plumb_status plumbp_profile_map_point(loader *L, const plumby_map *m, double en[2]);
plumb_status plumbp_profile_read_release_site(loader *L, plumb_fall_spec *base);
plumb_status plumbp_profile_read_atmosphere(loader *L);
plumb_status plumbp_profile_read_turbulence(loader *L, plumb_turbulence_spec *t);
plumb_status plumbp_profile_read_wind(loader *L, plumb_wind_spec *w);

/* profile_study.c */
plumb_status plumbp_profile_read_criteria(loader *L);
plumb_status plumbp_profile_read_uncertainty(loader *L);
plumb_status plumbp_profile_read_zone(loader *L);
plumb_status plumbp_profile_read_job(loader *L);

#endif
