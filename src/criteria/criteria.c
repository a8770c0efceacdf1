/*
 * criteria.c - named impact-energy criteria (README.md "Criteria") and
 * verdicts.
 *
 * Each criterion is one strict YAML file (yamltree.c: no unknown or
 * duplicate keys, no anchors, units required) in a directory, loaded in
 * file-name order (strcmp, i.e. bytewise, so the order does not depend on
 * the locale). Keys: name, kind (limit | helmet-test, default limit),
 * energy_limit (an ENERGY with its unit, > 0), applies_to, source, status
 * (seen | transcribed | memory); all but kind are required.
 *
 * Verdict: ratio = E / E_limit; "exceeds" when E > E_limit.
 */
#include <dirent.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/criteria.h"
#include "plumb/profile.h" /* PLUMB_PROFILE_MAX_BYTES: a criteria file is read as a profile is */
#include "core/internal.h"
#include "io/sha256.h"
#include "io/yamltree.h"

#define ARRAY_LEN(a) (sizeof(a) / sizeof((a)[0]))
/* File name ending of a criterion. */
#define CRIT_SUFFIX ".yaml"

static const char *const crit_kinds[] = {"limit", "helmet-test"};
static const char *const crit_statuses[] = {"seen", "transcribed", "memory"};
/* When the limit counts as exceeded: energy above it (the default), or at
 * or above it, for a criterion worded "less than" (EU 2019/945 C1). */
static const char *const crit_exceeded[] = {"above", "at-or-above"};

/* The one number of a criterion is no profile key: its dimension and range
 * are given here, not by the key table (io/keys.h). */
static const plumby_schema crit_keys[] = {
    {.name = "name", .type = PLUMBY_T_TEXT},
    {.name = "kind", .type = PLUMBY_T_WORD, .words = crit_kinds, .n_words = ARRAY_LEN(crit_kinds)},
    {.name = "energy_limit", .type = PLUMBY_T_NUM, .dim = PLUMB_DIM_ENERGY,
     .range = PLUMBY_R_POSITIVE},
    {.name = "applies_to", .type = PLUMBY_T_TEXT},
    {.name = "source", .type = PLUMBY_T_TEXT},
    {.name = "status", .type = PLUMBY_T_WORD, .words = crit_statuses,
     .n_words = ARRAY_LEN(crit_statuses)},
    {.name = "exceeded_when", .type = PLUMBY_T_WORD, .words = crit_exceeded,
     .n_words = ARRAY_LEN(crit_exceeded)},
};
static const plumby_schema crit_schema = {
    .name = "", .type = PLUMBY_T_MAP, .sub = crit_keys, .n_sub = ARRAY_LEN(crit_keys)};

struct plumb_criteria {
    size_t n;                 /* criteria in c */
    plumb_criterion *c;       /* in file-name order */
};

void plumb_criteria_free(plumb_criteria *set)
{
    if (!set)
        return;
    free(set->c);
    free(set);
}

size_t plumb_criteria_count(const plumb_criteria *set)
{
    return set ? set->n : 0;
}

const plumb_criterion *plumb_criteria_get(const plumb_criteria *set, size_t i)
{
    return set && i < set->n ? &set->c[i] : NULL;
}

const plumb_criterion *plumb_criteria_find(const plumb_criteria *set, const char *id)
{
    if (!set || !id)
        return NULL;
    for (size_t i = 0; i < set->n; i++)
        if (strcmp(set->c[i].id, id) == 0)
            return &set->c[i];
    return NULL;
}

/* How far a typed id is from a real one (see plumb_criteria_nearest). */
static int id_distance(const char *typed, const char *id)
{
    size_t lt = strlen(typed), li = strlen(id);
    if (lt >= 3 && strstr(id, typed))
        return lt == li ? 0 : 1;
    int d = plumbp_edit_distance(typed, id);
    if (li > lt && lt < PLUMB_CRIT_ID) {
        char head[PLUMB_CRIT_ID];
        memcpy(head, id, lt);
        head[lt] = '\0';
        int dh = plumbp_edit_distance(typed, head) + 1;
        if (dh < d)
            d = dh;
    }
    return d;
}

const plumb_criterion *plumb_criteria_nearest(const plumb_criteria *set, const char *id)
{
    if (!set || !id || set->n == 0)
        return NULL;
    size_t best = 0;
    int best_d = id_distance(id, set->c[0].id);
    for (size_t i = 1; i < set->n; i++) {
        int d = id_distance(id, set->c[i].id);
        if (d < best_d) {
            best_d = d;
            best = i;
        }
    }
    return &set->c[best];
}

/* 1 when criterion c is as near to the typed id as d and near enough to
 * suggest (plumbp_suggest_near: the did-you-mean rule of every message). */
static int near_at(const char *typed, const plumb_criterion *c, int d)
{
    size_t lt = strlen(typed), li = strlen(c->id);
    return id_distance(typed, c->id) == d && plumbp_suggest_near(d, lt > li ? lt : li);
}

size_t plumb_criteria_nearest_ids(const plumb_criteria *set, const char *id, char *buf,
                                  size_t size)
{
    if (buf && size)
        buf[0] = '\0';
    const plumb_criterion *best = plumb_criteria_nearest(set, id);
    if (!best || !buf || size == 0)
        return 0;
    int d = id_distance(id, best->id);
    size_t n = 0, total = 0, len = 0;
    for (size_t i = 0; i < set->n; i++)
        if (near_at(id, &set->c[i], d))
            total++;
    for (size_t i = 0; i < set->n && len < size; i++) {
        if (!near_at(id, &set->c[i], d))
            continue;
        const char *sep = n == 0 ? "" : n + 1 == total ? " or " : ", ";
        int w = snprintf(buf + len, size - len, "%s'%s'", sep, set->c[i].id);
        if (w < 0 || (size_t)w >= size - len) {
            if (size >= 4)
                memcpy(buf + size - 4, "...", 4);
            return n + 1;
        }
        len += (size_t)w;
        n++;
    }
    return n;
}

/* Most bytes of the list of criterion ids an unknown-criterion message
 * quotes; a longer list ends in "...". */
#define CRIT_LIST_MAX 300

/* Former ids of bundled criteria: a profile written before a rename
 * names the old id, and is told the new one and why it changed (not only
 * a did-you-mean, which a far rename would not get). A former id is never
 * taken in place of the new one: the limit changed with it. From the
 * renames in the history of profiles/criteria/. */
static const struct former_id {
    const char *id;     /* the former id */
    const char *now;    /* the id it was renamed */
    const char *why;    /* the reason, said after the new id */
} former_ids[] = {
    {"z89-type2-31j", "z89-type2-30j",
     "its limit 31 J was the test energy 30.625 J rounded toward the lenient side; it is "
     "now 30.6 J, rounded toward the strict side"},
    {"ddesb-fragment-79j", "ddesb-fragment-58ftlbf",
     "its id showed 79 J, above the published limit of 58 ft lbf, 78.64 J"},
};

plumb_status plumb_criteria_check_id(const plumb_criteria *set, const char *id, char *msg,
                                     size_t size)
{
    if (!id || !msg || size == 0)
        return PLUMB_EINVAL;
    msg[0] = '\0';
    if (plumb_criteria_find(set, id))
        return PLUMB_OK;
    size_t n = plumb_criteria_count(set);
    if (n == 0) {
        snprintf(msg, size, "unknown criterion '%s'; no criteria are loaded", id);
        return PLUMB_EKEY;
    }
    for (size_t i = 0; i < ARRAY_LEN(former_ids); i++)
        if (strcmp(id, former_ids[i].id) == 0 && plumb_criteria_find(set, former_ids[i].now)) {
            snprintf(msg, size, "criterion '%s' was renamed '%s' (%s): give '%s'", id,
                     former_ids[i].now, former_ids[i].why, former_ids[i].now);
            return PLUMB_EKEY;
        }
    /* the ids there are, as many as fit */
    char ids[CRIT_LIST_MAX];
    size_t len = 0;
    ids[0] = '\0';
    for (size_t i = 0; i < n; i++) {
        const char *c = set->c[i].id;
        if (len + strlen(c) + 2 + sizeof ", ..." > sizeof ids) {
            snprintf(ids + len, sizeof ids - len, ", ...");
            break;
        }
        len += (size_t)snprintf(ids + len, sizeof ids - len, "%s%s", i ? ", " : "", c);
    }
    char near[CRIT_LIST_MAX];
    if (plumb_criteria_nearest_ids(set, id, near, sizeof near) > 0)
        snprintf(msg, size, "unknown criterion '%s'; did you mean %s? (the criteria directory "
                 "has %zu: %s)", id, near, n, ids);
    else
        snprintf(msg, size, "unknown criterion '%s'; the criteria directory has %zu: %s", id, n,
                 ids);
    return PLUMB_EKEY;
}

void plumb_criterion_judge(const plumb_criterion *c, double energy_j, plumb_verdict *out)
{
    if (!out)
        return;
    out->criterion = c;
    out->energy_j = energy_j;
    out->ratio = c && c->energy_limit_j > 0.0 ? energy_j / c->energy_limit_j : 0.0;
    out->exceeds = c ? (c->strict ? energy_j >= c->energy_limit_j : energy_j > c->energy_limit_j)
                     : 0;
}

static int by_name(const void *a, const void *b)
{
    return strcmp(*(const char *const *)a, *(const char *const *)b);
}

static int is_criterion_file(const char *name)
{
    size_t n = strlen(name), s = strlen(CRIT_SUFFIX);
    return name[0] != '.' && n > s && strcmp(name + n - s, CRIT_SUFFIX) == 0;
}

/* Loads one criterion file into c (id = stem). */
static plumb_status load_one(const char *path, const char *stem, const plumb_units *units,
                             plumb_criterion *c, plumb_diag *diag)
{
    char *buf;
    size_t len;
    plumb_status st = plumby_read_file(path, PLUMB_PROFILE_MAX_BYTES, &buf, &len, diag);
    if (st != PLUMB_OK)
        return st;
    plumby_node *tree;
    char sha[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(buf, len, sha);
    st = plumby_parse(buf, len, path, PLUMBY_FROM_FILE, 0, NULL, &tree, diag);
    free(buf);
    if (st != PLUMB_OK)
        return st;
    plumby_ctx ctx = {.file = path, .units = units, .diag = diag};
    plumby_map m;
    int kind = 0, status = 0, exceeded = 0;
    memset(c, 0, sizeof *c);
    plumbp_strlcpy(c->id, stem, sizeof c->id);
    plumbp_strlcpy(c->path, path, sizeof c->path);
    plumbp_strlcpy(c->sha256, sha, sizeof c->sha256);
    plumby_map_init(&m, &ctx, tree, &crit_schema, "");
    if ((st = plumby_check(&ctx, tree, &crit_schema, "")) != PLUMB_OK ||
        (st = plumby_text(&m, "name", NULL, c->name, sizeof c->name)) != PLUMB_OK ||
        (st = plumby_word(&m, "kind", 0, &kind)) != PLUMB_OK ||
        (st = plumby_num(&m, "energy_limit", 1, 0.0, &c->energy_limit_j, NULL)) != PLUMB_OK ||
        (st = plumby_text(&m, "applies_to", NULL, c->applies_to, sizeof c->applies_to)) !=
            PLUMB_OK ||
        (st = plumby_text(&m, "source", NULL, c->source, sizeof c->source)) != PLUMB_OK ||
        (st = plumby_word(&m, "status", -1, &status)) != PLUMB_OK ||
        (st = plumby_word(&m, "exceeded_when", 0, &exceeded)) != PLUMB_OK) {
        plumby_free(tree);
        return st;
    }
    c->kind = kind == 0 ? PLUMB_CRIT_LIMIT : PLUMB_CRIT_HELMET_TEST;
    c->strict = exceeded == 1;
    plumbp_strlcpy(c->status, crit_statuses[status], sizeof c->status);
    plumby_free(tree);
    return PLUMB_OK;
}

plumb_status plumb_criteria_load_dir(const char *dir, const plumb_units *units,
                                     plumb_criteria **out, plumb_diag *diag)
{
    if (out)
        *out = NULL;
    if (!dir || !units || !out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_criteria_load_dir: NULL argument");
    DIR *d = opendir(dir);
    if (!d) {
        char why[128];
        if (strerror_r(errno, why, sizeof why) != 0)
            snprintf(why, sizeof why, "error %d", errno);
        return PLUMB_RAISE_AT(diag, PLUMB_EIO, dir, 0, 0, NULL,
                              "cannot open the criteria directory: %s", why);
    }
    char **names = NULL;
    size_t n = 0, cap = 0;
    plumb_status st = PLUMB_OK;
    plumb_criteria *set = NULL;
    char *path = NULL;
    const struct dirent *e;
    while ((e = readdir(d)) != NULL) {
        if (!is_criterion_file(e->d_name))
            continue;
        if (n == cap) {
            size_t nc = cap ? 2 * cap : 16;
            char **nn = realloc(names, nc * sizeof *nn);
            if (!nn)
                goto nomem;
            names = nn;
            cap = nc;
        }
        size_t len = strlen(e->d_name);
        if (!(names[n] = malloc(len + 1)))
            goto nomem;
        memcpy(names[n++], e->d_name, len + 1);
    }
    closedir(d);
    d = NULL;
    if (n > 0)
        qsort(names, n, sizeof *names, by_name);
    if (!(set = calloc(1, sizeof *set)) || (n > 0 && !(set->c = calloc(n, sizeof *set->c))))
        goto nomem;
    size_t dlen = strlen(dir);
    for (size_t i = 0; i < n; i++) {
        size_t nlen = strlen(names[i]), slen = nlen - strlen(CRIT_SUFFIX);
        free(path);
        if (!(path = malloc(dlen + 1 + nlen + 1)))
            goto nomem;
        snprintf(path, dlen + 1 + nlen + 1, "%s/%s", dir, names[i]);
        if (slen >= PLUMB_CRIT_ID) {
            st = PLUMB_RAISE_AT(diag, PLUMB_ERANGE, path, 0, 0, NULL,
                                "a criterion id (the file name without %s) of %zu characters; at "
                                "most %d are accepted",
                                CRIT_SUFFIX, slen, PLUMB_CRIT_ID - 1);
            goto fail;
        }
        char stem[PLUMB_CRIT_ID];
        memcpy(stem, names[i], slen);
        stem[slen] = '\0';
        if ((st = load_one(path, stem, units, &set->c[i], diag)) != PLUMB_OK)
            goto fail;
        set->n = i + 1;
    }
    free(path);
    for (size_t i = 0; i < n; i++)
        free(names[i]);
    free(names);
    *out = set;
    return PLUMB_OK;
nomem:
    st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading criteria from %s", dir);
fail:
    if (d)
        closedir(d);
    free(path);
    for (size_t i = 0; i < n; i++)
        free(names[i]);
    free(names);
    plumb_criteria_free(set);
    return st;
}
