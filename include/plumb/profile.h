/*
 * plumb/profile.h - payload profiles: strict YAML (libyaml) into fall specs.
 *
 * The format is README.md's "Profiles" and "Profile keys". Every
 * dimensional value carries its unit; unknown keys are errors with a
 * did-you-mean; duplicate keys, anchors and aliases, tabs, invalid UTF-8,
 * files over 1 MiB and empty files are refused. Every error fills the
 * diagnostic with file, line, column and the dotted key.
 *
 * Overrides ("KEY=VALUE", as `--set`) replace or add a scalar at a dotted
 * key path before the profile is interpreted, with the same units and
 * checks as the YAML; their diagnostics name the file "--set". Each key is
 * given by one override of a call: a second of the same key (an item by
 * its name or its number), of a map around it, of a key standing instead
 * of it, or of a key the first gave in its value, is PLUMB_EINVAL at the
 * second (README.md "Common options").
 *
 * Ownership: a plumb_profile owns everything it returns (specs, tables,
 * strings); nothing points into libyaml's buffers. Pointers returned are
 * valid until plumb_profile_free. A loaded profile is read-only.
 */
#ifndef PLUMB_PROFILE_H
#define PLUMB_PROFILE_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/units.h"
#include "plumb/atmosphere.h"
#include "plumb/trajectory.h"

/* Largest profile file accepted, bytes. */
#define PLUMB_PROFILE_MAX_BYTES (1024u * 1024u)

typedef enum plumb_dist_kind {
    PLUMB_DIST_NORMAL = 0,     /* normal: [mean, sd]; positive quantities truncated at 0 */
    PLUMB_DIST_UNIFORM,        /* uniform: [lo, hi], or "value +- tolerance" */
    PLUMB_DIST_TRIANGULAR,     /* triangular: [lo, mode, hi] */
    PLUMB_DIST_CHOICE          /* payload.attitude: one of n_choice attitudes, by weight */
} plumb_dist_kind;

enum { PLUMB_MAX_ATTITUDES = 4, PLUMB_ATTITUDE_NAME = 24 };

/* One uncertain input. Parameters are in the key's SI unit. */
typedef struct plumb_uncertainty {
    char key[PLUMB_DIAG_KEY];  /* dotted key, e.g. "wind.speed" */
    plumb_dist_kind kind;      /* distribution */
    int from_set;              /* 1: given by a --set override, whose number (from 1) is
                                  `line`; 0: in the profile's file (or built in code) */
    double param[3];           /* normal: mean, sd; uniform: lo, hi; triangular: lo, mode, hi */
    int line, col;             /* where it was given */
    /* choice (key "payload.attitude"): the attitudes, their weights (> 0,
     * as given) and, for one item, the drag of each: cd and area, m^2
     * (plumb_profile_attitude_drag gives every item's; the entries of
     * plumb_profile_uncertainty hold the first item's) */
    size_t n_choice;
    char choice[PLUMB_MAX_ATTITUDES][PLUMB_ATTITUDE_NAME];
    double weight[PLUMB_MAX_ATTITUDES];
    double choice_drag[PLUMB_MAX_ATTITUDES][2];
} plumb_uncertainty;

/* The profile's `zone:` map, with defaults filled. */
typedef struct plumb_zone_spec {
    size_t samples;            /* default 100 000 */
    unsigned long seed;        /* default 1 */
    double confidence;         /* 0 < c < 1, default 0.99 */
    double scatter_m;          /* bounce/deflection allowance, m, default 0 */
    int has_target;            /* 1: target_m is set */
    double target_m[2];        /* east, north, m (given so, or from zone.target.latitude
                                  and .longitude) */
    int has_site;              /* 1: site.latitude and site.longitude are both given */
    double site_deg[2];        /* the site (the origin of east, north): WGS 84 latitude,
                                  longitude, deg */
} plumb_zone_spec;

/* The profile's optional `job:` map, for the printed sheet: what the
 * calculation is for and who prepared and checked it. "" where not given. */
enum { PLUMB_JOB_TEXT = 256 };
typedef struct plumb_job {
    char title[PLUMB_JOB_TEXT];        /* the job, e.g. "Feeder swap, north face" */
    char site[PLUMB_JOB_TEXT];         /* where */
    char reference[PLUMB_JOB_TEXT];    /* permit or job number */
    char prepared_by[PLUMB_JOB_TEXT];  /* who prepared the calculation */
    char checked_by[PLUMB_JOB_TEXT];   /* who checked it */
} plumb_job;

typedef struct plumb_profile plumb_profile;

/* Loads and checks a profile. `sets` are n_sets "KEY=VALUE" overrides
 * (may be NULL when n_sets is 0). In keys, an inventory's items count
 * from 1 ("items[1]" is the first, plumb_profile_item(p, 0)) or are named
 * ("items[glove].mass"); other lists count from 0 ("descent[0]"). On
 * error *out is NULL, diag is filled (a --set's own value first, else the
 * file's first error in file order, plumb_profile_lint's first), nothing
 * is leaked. */
plumb_status plumb_profile_load(const char *path, const plumb_units *units,
                                const char *const *sets, size_t n_sets,
                                plumb_profile **out, plumb_diag *diag);

/* Checks a profile as plumb_profile_load does, but goes on past an error:
 * each error found in the file is set aside (a refused value replaced by
 * a stand-in the loader takes there, anything else left out) and the
 * profile checked again, so that every error is found, not only the first
 * the loader meets; an error that only follows from one set aside (a
 * required key then missing, a check that another stand-in passes) is not
 * counted. Up to max diagnostics go
 * into errs[0 .. *n), in file order. Returns PLUMB_OK when the profile
 * loads (*n 0; *out, if out is not NULL, the profile, the caller's to
 * free), else the status of the first error found (*out NULL). */
plumb_status plumb_profile_lint(const char *path, const plumb_units *units,
                                const char *const *sets, size_t n_sets, plumb_diag *errs,
                                size_t max, size_t *n, plumb_profile **out);
/* The same for the len bytes at buf, named `name` in diagnostics. */
plumb_status plumb_profile_lint_buffer(const char *name, const char *buf, size_t len,
                                       const plumb_units *units, const char *const *sets,
                                       size_t n_sets, plumb_diag *errs, size_t max, size_t *n,
                                       plumb_profile **out);

/* Loads and checks a profile from the len bytes at buf (not necessarily
 * NUL-terminated), as plumb_profile_load does from a file: `name` stands
 * for the file in diagnostics and reports ("<stdin>"), and the SHA-256 is
 * of these bytes. More than PLUMB_PROFILE_MAX_BYTES is PLUMB_ERANGE.
 * The buffer is not kept. On error *out is NULL, diag is filled, nothing
 * is leaked. */
plumb_status plumb_profile_load_buffer(const char *name, const char *buf, size_t len,
                                       const plumb_units *units, const char *const *sets,
                                       size_t n_sets, plumb_profile **out, plumb_diag *diag);

/* Makes a new profile from an already loaded one with more overrides
 * applied (no file is read again). Same errors as plumb_profile_load. */
plumb_status plumb_profile_derive(const plumb_profile *base, const plumb_units *units,
                                  const char *const *sets, size_t n_sets,
                                  plumb_profile **out, plumb_diag *diag);

/* The path of a profile made by plumb_profile_from_spec. */
#define PLUMB_PROFILE_FROM_CODE "<built in code>"

/* Makes a one-item profile of a fall spec built in code, with its air and
 * the ids of the criteria it names (n_criteria 0: none named, so every
 * criterion of a set applies). Everything is copied: the spec, its wind
 * table, the air spec's tables, the ids. Its path is
 * PLUMB_PROFILE_FROM_CODE, its name spec->name ("payload" when empty), its
 * zone settings the defaults, with no uncertainty; its SHA-256 is that of
 * a canonical text of every input (each number to 17 significant digits),
 * so its reports can be traced to what was computed. PLUMB_EINVAL for a
 * table wind or air without its rows; on error *out is NULL. The spec's
 * values are checked when it is run, not here. Such a profile has no
 * profile text, so plumb_profile_derive refuses it (PLUMB_EINVAL): a sweep,
 * or a limit on a key that is not set directly on the spec, needs a
 * profile loaded from text. */
plumb_status plumb_profile_from_spec(const plumb_fall_spec *spec, const plumb_atm_spec *atm,
                                     const char *const *criteria, size_t n_criteria,
                                     plumb_profile **out, plumb_diag *diag);

/* The unit a numeric key was written in, as typed ("ft" for
 * "release.height: 100 ft", "kn" for "--set wind.speed=15 kn"; for an
 * inventory, "payload.X" is item's own X), into unit (size bytes). "" when
 * the key was not given, was a bare number, or the profile was built in
 * code. PLUMB_EINVAL for NULL arguments; otherwise can't fail. */
plumb_status plumb_profile_key_unit(const plumb_profile *p, size_t item, const char *key,
                                    char *unit, size_t size);

/* Where a key's value was given, for a diagnostic about it: returns the
 * file (the profile's path, or PLUMB_DIAG_SET_FILE for a --set override,
 * whose number, from 1, is then *line) and sets *line and *col (1-based).
 * NULL, with *line and *col 0, when the key was not given (its default
 * holds), is not a key of a profile, or the profile was built in code.
 * Keys are spelt as --set takes them ("zone.samples", "items[2].mass").
 * Can't fail. */
const char *plumb_profile_key_origin(const plumb_profile *p, const char *key, int *line,
                                     int *col);

/* Frees a profile. Accepts NULL. */
void plumb_profile_free(plumb_profile *p);

const char *plumb_profile_path(const plumb_profile *p);    /* as given to load */
const char *plumb_profile_name(const plumb_profile *p);    /* `name:`, or the file stem */
const char *plumb_profile_sha256(const plumb_profile *p);  /* hex SHA-256 of the file's bytes */

/* 1 for a profile with `items:`, 0 for one with `payload:`. */
int plumb_profile_is_inventory(const plumb_profile *p);

/* Number of payloads (1 unless inventory) and the i-th one's fall spec. */
size_t plumb_profile_item_count(const plumb_profile *p);
const plumb_fall_spec *plumb_profile_item(const plumb_profile *p, size_t i);

/* The number of item i as items[N] counts it, from 1: its place in the
 * profile as written, before any --set removed an item (after --set
 * 'items[2]=~' the items are 1, 3, 4 ...; an item a --set added takes the
 * next number). i + 1 for a profile without removals or built in code; 0
 * when i is out of range or p is NULL. Reports number their rows by it.
 * Can't fail. */
size_t plumb_profile_item_number(const plumb_profile *p, size_t i);

/* The shape of item i if it was given by `shape:` (kind != NONE), else kind NONE. */
const plumb_shape_spec *plumb_profile_item_shape(const plumb_profile *p, size_t i);

/* The atmosphere spec; its tables are owned by the profile. */
const plumb_atm_spec *plumb_profile_atmosphere(const plumb_profile *p);

/* Names of the criteria listed under `criteria:`. */
size_t plumb_profile_criteria_count(const plumb_profile *p);
const char *plumb_profile_criterion(const plumb_profile *p, size_t i);
/* Where the i-th criterion was named in the file (0, 0 when not known). */
void plumb_profile_criterion_position(const plumb_profile *p, size_t i, int *line, int *col);
/* The file the i-th criterion was named in, for diagnostics: the profile's
 * path, or "--set" when an override named it. NULL only for a NULL p. */
const char *plumb_profile_criterion_file(const plumb_profile *p, size_t i);

/* `uncertainty:` entries, in file order. */
size_t plumb_profile_uncertainty_count(const plumb_profile *p);
const plumb_uncertainty *plumb_profile_uncertainty(const plumb_profile *p, size_t i);

/* `job:` settings, "" where not given. NULL only for a NULL p. */
const plumb_job *plumb_profile_job(const plumb_profile *p);

/* The drag (cd, area m^2) of each attitude of the payload.attitude
 * entry for item i, into out[0..n_choice). 0 when there is no such entry
 * or i is out of range, else 1. Can't fail. */
int plumb_profile_attitude_drag(const plumb_profile *p, size_t item,
                                double out[PLUMB_MAX_ATTITUDES][2]);

/* `zone:` settings, defaults filled. */
const plumb_zone_spec *plumb_profile_zone(const plumb_profile *p);

/* Dimension of a numeric profile key ("release.height" -> LENGTH).
 * PLUMB_EKEY with a did-you-mean for an unknown key, PLUMB_EINVAL for a
 * key that exists but is not numeric (e.g. "wind.profile"). */
plumb_status plumb_profile_key_dim(const char *key, plumb_dim *dim, plumb_diag *diag);

/* Checks si (SI unit of the key's dimension) against the key's range, the
 * one the profile loader applies: PLUMB_ERANGE saying the range for a value
 * outside it (or not finite), PLUMB_EKEY / PLUMB_EINVAL as
 * plumb_profile_key_dim. For options that set a profile key's quantity
 * (plumb air --temperature-offset). */
plumb_status plumb_profile_key_check(const char *key, double si, plumb_diag *diag);

/* Address of the double that a numeric key sets in a fall spec (for
 * sampling and root finding on a copy of a spec), or NULL when the key is
 * not a per-fall numeric input. Keys under payload.* refer to the item. */
double *plumb_fall_spec_field(plumb_fall_spec *spec, const char *key);

#endif /* PLUMB_PROFILE_H */
