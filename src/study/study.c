/*
 * study.c - the one engine under every command (include/plumb/study.h):
 * a profile and a set of criteria resolved once (air, trajectory
 * workspace, the criteria the profile names), then the fall of each item,
 * a sweep, a limit or a zone from it. The command-line handlers only parse
 * options, call these and write.
 */
#include <stdio.h>
#include <stdlib.h>
#include <ctype.h>
#include <string.h>

#include "plumb/study.h"
#include "core/internal.h"
#include "study/study_internal.h"
#include "io/profile_int.h"
#include "io/vary.h"
#include "solve/inverse_internal.h"

struct plumb_study {
    const plumb_profile *profile;   /* borrowed, or own_profile */
    plumb_profile *own_profile;     /* plumb_study_open_spec's */
    const plumb_criteria *criteria; /* borrowed */
    const plumb_units *units;       /* borrowed */
    plumb_atmosphere *atm;
    plumb_trajectory *traj;
    size_t n_items;
    plumb_item_report *items;       /* the falls (plumb_study_fall) */
    plumb_fall_report fall;
    plumb_limit_result *limits;     /* the limits (plumb_study_limit) */
    plumb_item_report *limit_falls; /* the fall there, judged (its warnings) */
    plumb_limit_report limit;
    char limit_key[PLUMB_DIAG_KEY];
    plumb_zone_result *zones;       /* the zones (plumb_study_zone) */
    plumb_zone_item *zone_items;
    plumb_zone_report zone;
};

void plumb_study_free(plumb_study *s)
{
    if (!s)
        return;
    free(s->items);
    free(s->limits);
    free(s->limit_falls);
    free(s->zones);
    free(s->zone_items);
    plumb_trajectory_free(s->traj);
    plumb_atmosphere_free(s->atm);
    plumb_profile_free(s->own_profile);
    free(s);
}

plumb_status plumb_study_open(const plumb_profile *profile, const plumb_criteria *criteria,
                              const plumb_units *units, const plumb_trajectory_options *opt,
                              plumb_study **out, plumb_diag *diag)
{
    *out = NULL;
    if (!profile || !criteria || !units)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a study needs a profile, criteria and units");
    plumb_study *s = calloc(1, sizeof *s);
    if (!s)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    s->profile = profile;
    s->criteria = criteria;
    s->units = units;
    s->n_items = plumb_profile_item_count(profile);
    plumb_status st = plumb_profile_criteria_check(profile, criteria, diag);
    if (st == PLUMB_OK)
        st = plumb_atmosphere_alloc(plumb_profile_atmosphere(profile), &s->atm, diag);
    for (size_t i = 0; st == PLUMB_OK && i < s->n_items; i++)
        st = plumbp_profile_item_sinks(s->profile, i, s->atm, diag);
    if (st == PLUMB_OK && (st = plumb_trajectory_alloc(opt, &s->traj)) != PLUMB_OK)
        st = plumbp_raise(diag, st, NULL, 0, 0, NULL, "cannot make the trajectory workspace: %s",
                          plumb_strerror(st));
    if (st == PLUMB_OK && !(s->items = calloc(s->n_items ? s->n_items : 1, sizeof *s->items)))
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    if (st != PLUMB_OK) {
        plumb_study_free(s);
        return st;
    }
    *out = s;
    return PLUMB_OK;
}

plumb_status plumb_study_open_spec(const plumb_fall_spec *spec, const plumb_atm_spec *atm,
                                   const char *const *criterion_ids, size_t n_ids,
                                   const plumb_criteria *criteria, const plumb_units *units,
                                   plumb_study **out, plumb_diag *diag)
{
    *out = NULL;
    plumb_profile *p = NULL;
    plumb_status st = plumb_profile_from_spec(spec, atm, criterion_ids, n_ids, &p, diag);
    if (st != PLUMB_OK)
        return st;
    st = plumb_study_open(p, criteria, units, NULL, out, diag);
    if (st != PLUMB_OK) {
        plumb_profile_free(p);
        return st;
    }
    (*out)->own_profile = p;
    return PLUMB_OK;
}

const plumb_profile *plumb_study_profile(const plumb_study *s)
{
    return s->profile;
}

const plumb_atmosphere *plumb_study_atmosphere(const plumb_study *s)
{
    return s->atm;
}

const plumb_units *plumbp_study_units(const plumb_study *s)
{
    return s->units;
}

plumb_trajectory *plumbp_study_trajectory(plumb_study *s)
{
    return s->traj;
}

/* Points a failed item's diagnostic at the profile and, for an inventory,
 * at the item, counted from 1 as the reports count. */
static void locate(plumb_diag *diag, const plumb_profile *prof, size_t item)
{
    if (!diag)
        return;
    if (diag->file[0] == '\0')
        plumbp_strlcpy(diag->file, plumb_profile_path(prof), sizeof diag->file);
    if (diag->key[0] == '\0' && plumb_profile_is_inventory(prof))
        snprintf(diag->key, sizeof diag->key, "items[%zu]", plumb_profile_item_number(prof, item));
}

plumb_status plumb_study_fall(plumb_study *s, const plumb_fall_report **out, plumb_diag *diag)
{
    *out = NULL;
    for (size_t i = 0; i < s->n_items; i++) {
        plumb_item_report *it = &s->items[i];
        memset(it, 0, sizeof *it);
        it->spec = plumb_profile_item(s->profile, i);
        it->shape = plumb_profile_item_shape(s->profile, i);
        plumb_status st = plumb_trajectory_run(s->traj, it->spec, s->atm, &it->result, diag);
        if (st == PLUMB_OK)
            st = plumb_item_judge(it, s->profile, s->criteria, s->atm, diag);
        if (st != PLUMB_OK) {
            locate(diag, s->profile, i);
            return st;
        }
    }
    s->fall = (plumb_fall_report){s->profile, s->n_items, s->items};
    *out = &s->fall;
    return PLUMB_OK;
}

plumb_status plumb_study_sweep(plumb_study *s, const plumb_range *axes, size_t n_axes,
                               plumb_sweep_progress_fn progress, void *user, plumb_sweep **out,
                               plumb_diag *diag)
{
    return plumb_sweep_run_progress(s->profile, s->units, s->criteria, axes, n_axes, s->traj,
                                    progress, user, out, diag);
}

plumb_status plumb_study_sweep_boundaries(plumb_study *s, plumb_sweep *sweep, plumb_diag *diag)
{
    return plumb_sweep_find_boundaries(sweep, s->profile, s->units, s->traj, diag);
}

/* An error in an option's value (its unit, its key), moved to that
 * option (plumb_diag_option: OPTION:1:COL:), its key, column and message
 * kept. */
static plumb_status at_option(plumb_diag *diag, plumb_status st, const char *option)
{
    if (diag) {
        char msg[PLUMB_DIAG_MSG], key[PLUMB_DIAG_KEY];
        plumbp_strlcpy(msg, diag->message, sizeof msg);
        plumbp_strlcpy(key, diag->key, sizeof key);
        plumb_diag_option(diag, st, option, 1, diag->col, key[0] ? key : NULL, "%s", msg);
    }
    return st;
}

plumb_status plumb_study_limit_value(const plumb_study *s, plumb_metric metric,
                                     const char *text, const char *option, double *limit,
                                     const plumb_criterion **criterion, plumb_diag *diag)
{
    *criterion = NULL;
    if (metric == PLUMB_METRIC_ENERGY) {
        const plumb_criterion *c = plumb_criteria_find(s->criteria, text);
        if (c) {
            *criterion = c;
            *limit = c->energy_limit_j;
            return PLUMB_OK;
        }
    }
    plumb_dim dim = metric == PLUMB_METRIC_ENERGY ? PLUMB_DIM_ENERGY
                    : metric == PLUMB_METRIC_SPEED ? PLUMB_DIM_SPEED
                                                   : PLUMB_DIM_LENGTH;
    double x = 0.0;
    plumb_status st = plumb_units_parse(s->units, text, dim, &x, diag);
    if (st != PLUMB_OK) {
        /* no number: perhaps a criterion's id mistyped ("en397-shock") */
        /* or its start: "en397" for the EN 397 criteria */
        char near[PLUMB_DIAG_MSG / 2] = "";
        const plumb_criterion *c = plumb_criteria_nearest(s->criteria, text);
        int id_like = metric == PLUMB_METRIC_ENERGY && !isdigit((unsigned char)text[0]) &&
                      !strpbrk(text, " \t") &&
                      (strchr(text, '-') ||
                       (strlen(text) >= 3 && c && strncmp(c->id, text, strlen(text)) == 0));
        if (id_like && plumb_criteria_nearest_ids(s->criteria, text, near, sizeof near) > 0)
            return plumb_diag_option(diag, PLUMB_EKEY, option, 1, 1, NULL,
                                  "'%s' is neither an energy with its unit nor a criterion's "
                                  "id; did you mean %s?",
                                  text, near);
        static const char more[] = " (or a criterion's id)";
        size_t len = diag ? strlen(diag->message) : 0;
        if (diag && metric == PLUMB_METRIC_ENERGY && len + sizeof more <= sizeof diag->message)
            memcpy(diag->message + len, more, sizeof more);
        if (diag)
            diag->file[0] = diag->key[0] = '\0';
        return at_option(diag, st, option);
    }
    if (!(x > 0.0))
        return plumb_diag_option(diag, PLUMB_ERANGE, option, 1, 1, NULL,
                                 "the limit must be > 0, found '%s'", text);
    *limit = x;
    return PLUMB_OK;
}

/* The unit the profile wrote the key in, and its conversion to SI (an
 * affine map, for degC and degF), so the answer can be given in it too.
 * A unit that cannot be had leaves the answer in SI only; running out of
 * memory is PLUMB_ENOMEM (the report would otherwise depend on it). */
static plumb_status given_unit(const plumb_study *s, size_t item, const char *key, plumb_dim dim,
                               plumb_limit_result *r, plumb_diag *diag)
{
    char unit[PLUMB_LIMIT_UNIT], text[PLUMB_LIMIT_UNIT + 8];
    double zero, one;
    r->given_unit[0] = '\0';
    if (plumb_profile_key_unit(s->profile, item, key, unit, sizeof unit) != PLUMB_OK || !unit[0])
        return PLUMB_OK;
    plumb_diag d;
    snprintf(text, sizeof text, "0 %s", unit);
    plumb_status st = plumb_units_parse(s->units, text, dim, &zero, &d);
    if (st == PLUMB_OK) {
        snprintf(text, sizeof text, "1 %s", unit);
        st = plumb_units_parse(s->units, text, dim, &one, &d);
    }
    if (st == PLUMB_ENOMEM)
        return PLUMB_RAISE(diag, st, "%s", d.message);
    if (st != PLUMB_OK || !(one != zero))
        return PLUMB_OK;
    plumbp_strlcpy(r->given_unit, unit, sizeof r->given_unit);
    r->given_offset_si = zero;
    r->given_scale_si = one - zero;
    return PLUMB_OK;
}

/* The fall of item i at its answer (the profile's own value when there is
 * none), judged as plumb fall judges a fall, for the warnings that qualify
 * the answer (Mach, a device that does not open there ...): the solve
 * judged it (plumbp_limit_solve_judged), jst and jd say how that went. An
 * item the key does not apply to gets a report with its spec (for its
 * name) and nothing else. */
static plumb_status judge_limit_fall(plumb_study *s, size_t i, const char *key, plumb_status jst,
                                     const plumb_diag *jd, plumb_diag *diag)
{
    plumb_item_report *it = &s->limit_falls[i];
    if (jst == PLUMB_OK && s->limits[i].outcome != PLUMB_LIMIT_NOT_APPLICABLE)
        return PLUMB_OK;
    memset(it, 0, sizeof *it);
    it->spec = plumb_profile_item(s->profile, i); /* its name, at least */
    if (jst == PLUMB_OK)
        return PLUMB_OK;
    if (jst == PLUMB_ENOMEM || jst == PLUMB_EKEY) {
        if (diag)
            *diag = *jd;
        return jst;
    }
    return PLUMB_RAISE_KEY(diag, PLUMB_ENUMERIC, key,
                           "the fall at the answer could not be computed again: %s", jd->message);
}

/* An items[N] or items[NAME] key asks for one item of an inventory: *only
 * is that item (SIZE_MAX for any other key, asked of every item) and
 * solved the key solved for it, the item's own payload.X or descent.X. */
static plumb_status asked_item(const plumb_study *s, const char *key, size_t *only,
                               char *solved, size_t size, plumb_diag *diag)
{
    *only = SIZE_MAX;
    if (strncmp(key, "items[", 6) != 0) {
        plumbp_strlcpy(solved, key, size);
        return PLUMB_OK;
    }
    const char *open = key + 6, *close = strchr(open, ']');
    if (!plumb_profile_is_inventory(s->profile))
        return plumb_diag_option(diag, PLUMB_EKEY, "--find", 1, 1, key,
                                 "the profile has one payload, not items: find payload.%s",
                                 close && close[1] == '.' ? close + 2 : "KEY");
    if (!close || close[1] != '.' || close == open)
        return plumb_diag_option(diag, PLUMB_EKEY, "--find", 1, 1, key,
                                 "expected items[N].KEY or items[NAME].KEY, e.g. items[1].mass");
    size_t len = (size_t)(close - open), digits = strspn(open, "0123456789");
    for (size_t i = 0; i < s->n_items && *only == SIZE_MAX; i++) {
        const char *name = plumb_profile_item(s->profile, i)->name;
        if (digits == len ? strtoul(open, NULL, 10) == plumb_profile_item_number(s->profile, i)
                          : strlen(name) == len && strncmp(name, open, len) == 0)
            *only = i;
    }
    /* the item's number or name starts at column 7, after "items[" */
    if (*only == SIZE_MAX && digits == len)
        return plumb_diag_option(diag, PLUMB_EKEY, "--find", 1, 7, key,
                                 "the profile has %zu items (items[1] to items[%zu])",
                                 s->n_items, s->n_items);
    if (*only == SIZE_MAX)
        return plumb_diag_option(diag, PLUMB_EKEY, "--find", 1, 7, key,
                                 "no item is named '%.*s' (give its number, items[1] to "
                                 "items[%zu], or its name as the profile writes it)",
                                 (int)len, open, s->n_items);
    const char *rest = close + 2;
    if (strncmp(rest, "descent", 7) == 0 && (rest[7] == '.' || rest[7] == '['))
        snprintf(solved, size, "%s", rest);
    else
        snprintf(solved, size, "payload.%s", rest);
    return PLUMB_OK;
}

plumb_status plumb_study_limit(plumb_study *s, const char *key, plumb_metric metric,
                               double limit, const plumb_criterion *criterion,
                               const plumb_limit_options *opt, const plumb_limit_report **out,
                               plumb_diag *diag)
{
    *out = NULL;
    plumb_dim kd;
    plumb_status st = plumb_profile_key_dim(key, &kd, diag);
    if (st != PLUMB_OK)
        return at_option(diag, st, "--find");
    size_t only;
    char solved[PLUMB_DIAG_KEY];
    if ((st = asked_item(s, key, &only, solved, sizeof solved, diag)) != PLUMB_OK)
        return st;
    key = solved;
    free(s->limits);
    free(s->limit_falls);
    size_t n = s->n_items ? s->n_items : 1;
    s->limits = calloc(n, sizeof *s->limits);
    s->limit_falls = calloc(n, sizeof *s->limit_falls);
    if (!s->limits || !s->limit_falls)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    for (size_t i = 0; i < s->n_items; i++) {
        if (only != SIZE_MAX && i != only) {
            s->limits[i].outcome = PLUMB_LIMIT_NOT_ASKED;
            s->limits[i].dim = kd;
            s->limit_falls[i].spec = plumb_profile_item(s->profile, i);
            continue;
        }
        plumb_status jst = PLUMB_OK;
        plumb_diag jd;
        plumb_diag_clear(&jd);
        st = plumbp_limit_solve_judged(s->profile, s->units, i, key, metric, limit, opt, s->traj,
                                       s->criteria, &s->limit_falls[i], &jst, &jd,
                                       &s->limits[i], diag);
        if (st == PLUMB_OK)
            st = given_unit(s, i, key, kd, &s->limits[i], diag);
        if (st == PLUMB_OK)
            st = judge_limit_fall(s, i, key, jst, &jd, diag);
        if (st != PLUMB_OK)
            return st;
    }
    plumbp_strlcpy(s->limit_key, key, sizeof s->limit_key);
    s->limit = (plumb_limit_report){s->profile, s->limit_key, metric, limit,
                                    criterion ? criterion->id : NULL, s->n_items, s->limits,
                                    criterion, s->limit_falls};
    *out = &s->limit;
    return PLUMB_OK;
}

plumb_status plumb_study_zone_check(const plumb_study *s, plumb_diag *diag)
{
    /* Without uncertain inputs every sample is the same fall: its drift
     * would be printed as a clearance radius. Refused, with an example. */
    if (plumb_profile_uncertainty_count(s->profile) == 0)
        return PLUMB_RAISE_AT(
            diag, PLUMB_EINVAL, plumb_profile_path(s->profile), 0, 0, "uncertainty",
            "a zone needs the uncertainty of the inputs, and the profile has no `uncertainty:` "
            "map, so every sample would be the same fall. Add one, for example:\n"
            "  uncertainty:\n"
            "    wind.speed: {normal: [5 m/s, 1.5 m/s]}\n"
            "    wind.from: \"270 deg +- 20 deg\"\n"
            "    release.position.east: {normal: [0 m, 1 m]}\n"
            "    release.position.north: {normal: [0 m, 1 m]}");
    return PLUMB_OK;
}

/* 1 when the setting `key` of zone is the profile's own value. */
static int profile_gave(const plumb_zone_spec *zone, const plumb_zone_spec *given, const char *key)
{
    if (strcmp(key, "zone.samples") == 0)
        return zone->samples == given->samples;
    if (strcmp(key, "zone.seed") == 0)
        return zone->seed == given->seed;
    if (strcmp(key, "zone.confidence") == 0)
        return zone->confidence == given->confidence;
    if (strcmp(key, "zone.scatter") == 0)
        return zone->scatter_m == given->scatter_m;
    if (strcmp(key, "zone.target") == 0)
        return zone->has_target == given->has_target && zone->target_m[0] == given->target_m[0] &&
               zone->target_m[1] == given->target_m[1];
    return 0;
}

/* How directly the setting `key` of zone was given: 3 by the caller over
 * the profile (a command-line option), 2 by --set, 1 in the profile's
 * file, 0 not at all (its default). */
static int zone_key_rank(const plumb_study *s, const plumb_zone_spec *zone, const char *key)
{
    if (!profile_gave(zone, plumb_profile_zone(s->profile), key))
        return 3;
    int line = 0, col = 0;
    const char *file = plumb_profile_key_origin(s->profile, key, &line, &col);
    return !file ? 0 : strcmp(file, PLUMB_DIAG_SET_FILE) == 0 ? 2 : 1;
}

plumb_status plumb_study_zone_check_settings(const plumb_study *s, const plumb_zone_spec *zone,
                                             const plumb_zone_options *opt, plumb_diag *diag)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_zone_check(zone, opt, &d);
    if (st == PLUMB_OK)
        return PLUMB_OK;
    /* Too few samples for the confidence: the fault is the one of the two
     * given last (an option over --set over the file over a default), so
     * `--set zone.confidence=0.999` over a file's samples is told at that
     * --set, as zone.confidence, not at the file's zone.samples. */
    if (strcmp(d.key, "zone.samples") == 0 && zone->samples >= 1 &&
        zone->samples <= PLUMB_ZONE_MAX_SAMPLES &&
        zone_key_rank(s, zone, "zone.confidence") > zone_key_rank(s, zone, "zone.samples")) {
        plumb_zone_options dflt;
        if (!opt) {
            plumb_zone_options_init(&dflt);
            opt = &dflt;
        }
        plumbp_strlcpy(d.key, "zone.confidence", sizeof d.key);
        snprintf(d.message, sizeof d.message,
                 "the %g %% radius needs at least %zu samples to bound it at %g %% confidence, "
                 "and the zone has %zu (zone.samples)", 100.0 * zone->confidence,
                 plumb_zone_min_samples(zone->confidence, opt->ci_level), 100.0 * opt->ci_level,
                 zone->samples);
    }
    const char *file = NULL;
    if (profile_gave(zone, plumb_profile_zone(s->profile), d.key))
        file = plumb_profile_key_origin(s->profile, d.key, &d.line, &d.col);
    plumbp_strlcpy(d.file, file ? file : plumb_profile_path(s->profile), sizeof d.file);
    if (diag)
        *diag = d;
    return st;
}

/* A zone's fall failed (a sample out of a range, a device deployed above
 * the release): its key as the profile wrote it ("descent.deploy.below",
 * not the run's "descent[0].deploy.below", for a `descent:` of one map),
 * and where it was given: for a sampled key, its uncertainty entry (in the
 * file or a --set); else the key's own value (file or --set); else the
 * profile. */
static void zone_error_origin(const plumb_profile *p, size_t item, const plumb_uncertainty *unc,
                              size_t n_u, plumb_diag *diag)
{
    const char *file = NULL;
    int line = 0, col = 0;
    char key[PLUMB_DIAG_KEY];
    plumbp_profile_key_spelt(p, item, diag->key, key, sizeof key);
    for (size_t k = 0; diag->key[0] && k < n_u; k++) {
        char ek[PLUMB_DIAG_KEY];
        plumbp_profile_key_spelt(p, item, unc[k].key, ek, sizeof ek);
        if (strcmp(ek, key) != 0 && strcmp(unc[k].key, key) != 0)
            continue;
        file = unc[k].from_set ? PLUMB_DIAG_SET_FILE : plumb_profile_path(p);
        line = unc[k].line;
        col = unc[k].col;
        snprintf(diag->key, sizeof diag->key, "uncertainty.%.*s", PLUMB_DIAG_KEY - 13,
                 unc[k].key);
        break;
    }
    if (!file && diag->key[0]) {
        file = plumb_profile_key_origin(p, key, &line, &col);
        plumbp_strlcpy(diag->key, key, sizeof diag->key);
    }
    plumbp_strlcpy(diag->file, file ? file : plumb_profile_path(p), sizeof diag->file);
    diag->line = file ? line : 0;
    diag->col = file ? col : 0;
}

plumb_status plumb_study_zone(plumb_study *s, const plumb_zone_spec *zone,
                              const plumb_zone_options *opt, plumb_study_item_fn on_item,
                              void *user, const plumb_zone_report **out, plumb_diag *diag)
{
    *out = NULL;
    plumb_status zst = plumb_study_zone_check(s, diag);
    if (zst == PLUMB_OK)
        zst = plumb_study_zone_check_settings(s, zone, opt, diag);
    if (zst != PLUMB_OK)
        return zst;
    free(s->zones);
    free(s->zone_items);
    s->zones = calloc(s->n_items ? s->n_items : 1, sizeof *s->zones);
    s->zone_items = calloc(s->n_items ? s->n_items : 1, sizeof *s->zone_items);
    if (!s->zones || !s->zone_items)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    size_t n_u = plumb_profile_uncertainty_count(s->profile);
    plumb_uncertainty *unc = calloc(n_u ? n_u : 1, sizeof *unc);
    if (!unc)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    for (size_t i = 0; i < n_u; i++)
        unc[i] = *plumb_profile_uncertainty(s->profile, i);
    plumb_zone_options zopt = *opt;
    zopt.source = plumb_profile_path(s->profile);
    plumb_status st = PLUMB_OK;
    for (size_t i = 0; st == PLUMB_OK && i < s->n_items; i++) {
        const plumb_fall_spec *spec = plumb_profile_item(s->profile, i);
        /* the criteria exactly as plumb fall judges them (all when none named) */
        plumb_item_report probe;
        memset(&probe, 0, sizeof probe);
        probe.spec = spec;
        probe.shape = plumb_profile_item_shape(s->profile, i);
        /* no fall yet: nothing to say of Mach, Reynolds or a device opening */
        probe.result.n_deployed = spec->n_descent;
        for (size_t k = 0; k < spec->n_descent && k < PLUMB_MAX_DESCENT; k++)
            probe.result.deployed[k] = 1;
        st = plumb_item_judge(&probe, s->profile, s->criteria, s->atm, diag);
        const plumb_criterion *clist[PLUMB_MAX_VERDICTS];
        for (size_t k = 0; st == PLUMB_OK && k < probe.n_verdicts; k++)
            clist[k] = probe.verdicts[k].criterion;
        if (on_item)
            on_item(user, i, spec);
        /* the attitude's drag is the item's own */
        for (size_t k = 0; k < n_u; k++)
            if (unc[k].kind == PLUMB_DIST_CHOICE)
                (void)plumb_profile_attitude_drag(s->profile, i, unc[k].choice_drag);
        if (st == PLUMB_OK)
            st = plumb_zone_run(spec, s->atm, unc, n_u, zone, clist, probe.n_verdicts, &zopt,
                                &s->zones[i], diag);
        /* the notes that qualify the criteria (a helmet test energy is not a
         * safe limit; a drag table used beyond its range), as plumb fall gives */
        for (size_t k = 0; st == PLUMB_OK && k < probe.n_warnings; k++)
            plumb_zone_add_warning(&s->zones[i], "%s", probe.warnings[k]);
        if (st != PLUMB_OK && diag && diag->file[0] == '\0')
            zone_error_origin(s->profile, i, unc, n_u, diag);
        if (st != PLUMB_OK && diag) {
            if (plumb_profile_is_inventory(s->profile)) {
                /* "item 2 (spanner): " before the message, which is cut to fit */
                char prefix[PLUMB_NAME + 32];
                snprintf(prefix, sizeof prefix, "item %zu (%.*s): ",
                         plumb_profile_item_number(s->profile, i), PLUMB_NAME - 1,
                         spec->name);
                size_t pl = strlen(prefix), ml = strlen(diag->message);
                if (pl + ml >= sizeof diag->message)
                    ml = sizeof diag->message - pl - 1;
                memmove(diag->message + pl, diag->message, ml);
                memcpy(diag->message, prefix, pl);
                diag->message[pl + ml] = '\0';
            }
        }
        s->zone_items[i].name = spec->name;
        s->zone_items[i].number = plumb_profile_item_number(s->profile, i);
        s->zone_items[i].result = &s->zones[i];
    }
    free(unc);
    if (st != PLUMB_OK)
        return st;
    memset(&s->zone, 0, sizeof s->zone);
    s->zone.profile_name = plumb_profile_name(s->profile);
    s->zone.profile_path = plumb_profile_path(s->profile);
    s->zone.profile_sha256 = plumb_profile_sha256(s->profile);
    s->zone.inventory = plumb_profile_is_inventory(s->profile);
    s->zone.n_items = s->n_items;
    s->zone.items = s->zone_items;
    s->zone.threads = zopt.threads;
    for (size_t i = 1; i < s->n_items; i++) {
        if (s->zones[i].zone.clearance_radius_m > s->zones[s->zone.kit_item].zone.clearance_radius_m)
            s->zone.kit_item = i;
        if (s->zones[i].zone.landing_circle_m >
            s->zones[s->zone.kit_landing_item].zone.landing_circle_m)
            s->zone.kit_landing_item = i;
    }
    const plumb_zone_spec *pz = plumb_profile_zone(s->profile);
    s->zone.has_site = pz->has_site;
    s->zone.site_deg[0] = pz->site_deg[0];
    s->zone.site_deg[1] = pz->site_deg[1];
    *out = &s->zone;
    return PLUMB_OK;
}
