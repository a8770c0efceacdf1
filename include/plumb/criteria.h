/*
 * plumb/criteria.h - named impact-energy criteria and verdicts.
 *
 * A criterion is one YAML file in profiles/criteria/ (its id is the file
 * name without .yaml), e.g.
 *
 *     name: US operations over people, category 3
 *     kind: limit                # or: helmet-test (what a helmet is tested to, not a safe limit)
 *     energy_limit: 25 ft lbf
 *     applies_to: rigid object striking a person, unmanned aircraft operations over people
 *     source: 14 CFR 107.130(a)(1)
 *     status: seen               # seen | transcribed | memory
 *
 *     exceeded_when: above       # optional: above (default) | at-or-above
 *
 * Verdict: ratio = energy / limit; "exceeds" when energy > limit (or >=
 * for exceeded_when: at-or-above, a limit worded "less than"), else
 * "within".
 *
 * Ownership: a plumb_criteria set owns its criteria; pointers returned by
 * plumb_criteria_get/find are valid until the set is freed.
 */
#ifndef PLUMB_CRITERIA_H
#define PLUMB_CRITERIA_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/units.h"

enum { PLUMB_CRIT_ID = 64, PLUMB_CRIT_TEXT = 256, PLUMB_CRIT_PATH = 1024, PLUMB_CRIT_SHA256 = 65 };

typedef enum plumb_criterion_kind {
    PLUMB_CRIT_LIMIT = 0,      /* a published energy limit */
    PLUMB_CRIT_HELMET_TEST     /* the energy a helmet is tested to: not a safe limit */
} plumb_criterion_kind;

typedef struct plumb_criterion {
    char id[PLUMB_CRIT_ID];              /* file stem, e.g. "us-part107-cat3" */
    char name[PLUMB_CRIT_TEXT];          /* human name */
    plumb_criterion_kind kind;           /* limit or helmet test */
    double energy_limit_j;               /* J (> 0) */
    char applies_to[PLUMB_CRIT_TEXT];    /* what it applies to */
    char source[PLUMB_CRIT_TEXT];        /* published source */
    char status[PLUMB_CRIT_ID];          /* seen | transcribed | memory */
    int strict;                          /* 1: reaching the limit exceeds it ("less than 80 J") */
    char path[PLUMB_CRIT_PATH];          /* the file it was read from ("" when built in code) */
    char sha256[PLUMB_CRIT_SHA256];      /* hex SHA-256 of that file's bytes ("" likewise) */
} plumb_criterion;

typedef struct plumb_verdict {
    const plumb_criterion *criterion;    /* borrowed from the set */
    double energy_j;                     /* the energy judged, J */
    double ratio;                        /* energy / limit */
    int exceeds;                         /* 1: energy > limit */
} plumb_verdict;

typedef struct plumb_criteria plumb_criteria;

/* Loads every *.yaml in dir, in name order. Each file is parsed strictly
 * (unknown keys, missing keys and bare numbers are errors with file, line
 * and column). On error *out is NULL. */
plumb_status plumb_criteria_load_dir(const char *dir, const plumb_units *units,
                                     plumb_criteria **out, plumb_diag *diag);

/* Frees the set. Accepts NULL. */
void plumb_criteria_free(plumb_criteria *set);

/* Number of criteria in the set; 0 for NULL. */
size_t plumb_criteria_count(const plumb_criteria *set);

/* The i-th criterion, NULL when i is out of range. */
const plumb_criterion *plumb_criteria_get(const plumb_criteria *set, size_t i);

/* The criterion with this id, or NULL. */
const plumb_criterion *plumb_criteria_find(const plumb_criteria *set, const char *id);

/* The criterion whose id is nearest to `id` (a mistyped one), for a
 * did-you-mean: the least Levenshtein distance to the whole id, or to the
 * id's first strlen(id) characters plus one (so "eu-c2" finds "eu-c1-80j"),
 * with an id that contains `id` (of 3 or more characters) at distance 1;
 * ties go to the first in name order. NULL only when the set is empty or
 * an argument is NULL. Can't fail. */
const plumb_criterion *plumb_criteria_nearest(const plumb_criteria *set, const char *id);

/* Every id as near to `id` as the nearest (plumb_criteria_nearest), in
 * name order, written into buf as "'a'", "'a' or 'b'", "'a', 'b' or 'c'" (cut
 * with "..." where buf ends), so that "en397" names both EN 397 criteria;
 * only when that distance is near enough to suggest, by the rule of every
 * did-you-mean (plumb/suggest.h: at most PLUMB_SUGGEST_MAX_EDITS, and at
 * most half the longer word). Returns how many; 0 (buf "") when none is
 * near, for an empty set or a NULL argument. Can't fail. */
size_t plumb_criteria_nearest_ids(const plumb_criteria *set, const char *id, char *buf,
                                  size_t size);

/* Checks that the set has a criterion of this id, as a profile's
 * `criteria:` names it: PLUMB_OK (msg "") when it does; else PLUMB_EKEY
 * and msg (size bytes) what was expected: "unknown criterion 'ID'; did
 * you mean 'A' or 'B'? (the criteria directory has N: ...)", the nearest
 * ids (plumb_criteria_nearest_ids) and as many of the set's ids as fit,
 * or without the did-you-mean when no id is near ("unknown criterion
 * 'ID'; the criteria directory has N: ..."); for a former id of a bundled
 * criterion whose new id is in the set, "criterion 'ID' was renamed 'NEW'
 * (why): give 'NEW'" (a former id is not taken: its limit changed); or
 * "unknown criterion 'ID'; no criteria are loaded" for an empty or NULL
 * set. It is the message of plumb_profile_criteria_check and of
 * plumb_study_lint, which place it at the id in the profile.
 * PLUMB_EINVAL for a NULL id or msg, or size 0. */
plumb_status plumb_criteria_check_id(const plumb_criteria *set, const char *id, char *msg,
                                     size_t size);

/* Judges an energy against a criterion. Can't fail. */
void plumb_criterion_judge(const plumb_criterion *c, double energy_j, plumb_verdict *out);

#endif /* PLUMB_CRITERIA_H */
