/*
 * plumb/study.h - the one engine under every command: a study of a loaded
 * profile (or of a fall spec built in code) against a set of criteria.
 *
 * A study is made once: the atmosphere, the trajectory workspace, the
 * items and the criteria the profile names are resolved and checked when
 * it is opened. From it come the answers every command gives, each as a
 * result the report writers (report.h) format:
 *   plumb_study_fall   the fall of each item, judged (verdicts, warnings)
 *   plumb_study_sweep  the same over one or two ranges of an input
 *   plumb_study_limit  the value of an input at which a limit is just met
 *   plumb_study_zone   the clearance zone under the profile's uncertainty
 * and, before a study can be opened, plumb_study_lint: every error of a
 * profile that would keep it from opening (`plumb lint`).
 * A command-line handler, a test, a script (through the shared library)
 * or another program calls these the same way.
 *
 * Ownership: the study borrows the profile, criteria and units given to
 * plumb_study_open for its whole life (plumb_study_open_spec makes and
 * owns a profile of its own). Results returned through `const` pointers
 * are owned by the study and valid until the next call of the same
 * function or plumb_study_free; a plumb_sweep is the caller's to free.
 */
#ifndef PLUMB_STUDY_H
#define PLUMB_STUDY_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/units.h"
#include "plumb/atmosphere.h"
#include "plumb/trajectory.h"
#include "plumb/profile.h"
#include "plumb/criteria.h"
#include "plumb/judge.h"
#include "plumb/dispersion.h"
#include "plumb/sweep.h"
#include "plumb/inverse.h"

typedef struct plumb_study plumb_study;

/* Opens a study of a loaded profile: builds its atmosphere and a
 * trajectory workspace (opt NULL: the defaults of plumb fall) and checks
 * that every criterion the profile names is in the set (PLUMB_EKEY at the
 * entry, with the nearest id), and that no item is buoyant: PLUMB_ERANGE
 * at its volume key when the air it displaces at the strike level weighs
 * at least as much as it does. On error *out is NULL and nothing is
 * leaked. */
plumb_status plumb_study_open(const plumb_profile *profile, const plumb_criteria *criteria,
                              const plumb_units *units, const plumb_trajectory_options *opt,
                              plumb_study **out, plumb_diag *diag);

/* Opens a study of one fall spec built in code, with its air (atm) and
 * the ids of the criteria to judge against (n_ids 0: every criterion of
 * the set). The spec, its wind table and the air spec's tables are copied.
 * The report names the payload by spec->name, its source as "<built in
 * code>" and its SHA-256 as that of plumb_profile_from_spec's canonical
 * text of the inputs. Same errors as plumb_study_open, and PLUMB_EINVAL
 * for a spec that plumb_profile_from_spec refuses. */
plumb_status plumb_study_open_spec(const plumb_fall_spec *spec, const plumb_atm_spec *atm,
                                   const char *const *criterion_ids, size_t n_ids,
                                   const plumb_criteria *criteria, const plumb_units *units,
                                   plumb_study **out, plumb_diag *diag);

/* Frees a study. Accepts NULL. */
void plumb_study_free(plumb_study *study);

/* What the study was opened on. Never NULL for an open study. */
const plumb_profile *plumb_study_profile(const plumb_study *study);
const plumb_atmosphere *plumb_study_atmosphere(const plumb_study *study);

/* The fall of every item, judged as plumb fall reports it. On a failed
 * fall diag names the profile and, for an inventory, the item
 * ("items[2]", counted from 1); *out is NULL. */
plumb_status plumb_study_fall(plumb_study *study, const plumb_fall_report **out,
                              plumb_diag *diag);

/* The falls over one or two ranges (plumb_sweep_run_progress; progress
 * may be NULL); the caller frees *out with plumb_sweep_free. */
plumb_status plumb_study_sweep(plumb_study *study, const plumb_range *axes, size_t n_axes,
                               plumb_sweep_progress_fn progress, void *user, plumb_sweep **out,
                               plumb_diag *diag);

/* For a two-way sweep made by plumb_study_sweep: the value of the second
 * input at which each limit is reached, for each value of the first
 * (plumb_sweep_find_boundaries), kept in the sweep for its text report. */
plumb_status plumb_study_sweep_boundaries(plumb_study *study, plumb_sweep *sweep,
                                          plumb_diag *diag);

/* A limit given as text: a criterion's id (energy only) or a quantity of
 * the metric's dimension ("25 ft lbf", "8 m/s", "30 m"), > 0. `option`
 * names it in messages ("--energy-max"). *criterion is the criterion or
 * NULL. Errors PLUMB_EUNIT, PLUMB_EPARSE, PLUMB_ERANGE, located at the
 * option (plumb_diag_option: "--energy-max:1:1:"). */
plumb_status plumb_study_limit_value(const plumb_study *study, plumb_metric metric,
                                     const char *text, const char *option, double *limit,
                                     const plumb_criterion **criterion, plumb_diag *diag);

/* For every item, the value of `key` at which `metric` just meets `limit`
 * (plumb_limit_solve, opt NULL: defaults); criterion, if not NULL, is
 * where the limit came from. An unknown or non-numeric key is PLUMB_EKEY
 * or PLUMB_EINVAL; an items[N] no item answers is located at --find
 * (plumb_diag_option: "--find:1:7:", the item's number or name). */
plumb_status plumb_study_limit(plumb_study *study, const char *key, plumb_metric metric,
                               double limit, const plumb_criterion *criterion,
                               const plumb_limit_options *opt, const plumb_limit_report **out,
                               plumb_diag *diag);

/* The clearance zone of every item under the profile's `uncertainty:`,
 * with `zone` (the profile's zone settings, possibly overridden) and
 * `opt` (threads, progress, per-sample callback; opt->source is set to
 * the profile's path). Each item is judged against the criteria exactly as
 * plumb fall judges it. `on_item`, if not NULL, is called before each
 * item's run (for progress and per-item sample files). */
typedef void (*plumb_study_item_fn)(void *user, size_t item, const plumb_fall_spec *spec);
/* PLUMB_EINVAL (key "uncertainty", with an example of the map) when the
 * profile has no uncertain inputs: a zone of identical falls is refused.
 * plumb_study_zone checks it first; a caller may check it before its own
 * checks of the options. */
plumb_status plumb_study_zone_check(const plumb_study *study, plumb_diag *diag);

/* Checks the zone settings of a run (plumb_zone_check), as plumb_study_zone
 * does before its first fall, so that a caller can refuse them before it
 * starts anything else. A setting the profile gave (its value is the
 * profile's) is located where it was given: the profile's file or --set,
 * line and column (plumb_profile_key_origin); a default, or a value the
 * caller put in `zone`, at the profile without a line (a caller that knows
 * where its value came from may say so). PLUMB_EINVAL with the setting's
 * key. */
plumb_status plumb_study_zone_check_settings(const plumb_study *study,
                                             const plumb_zone_spec *zone,
                                             const plumb_zone_options *opt, plumb_diag *diag);

plumb_status plumb_study_zone(plumb_study *study, const plumb_zone_spec *zone,
                              const plumb_zone_options *opt, plumb_study_item_fn on_item,
                              void *user, const plumb_zone_report **out, plumb_diag *diag);

/* Checks a profile as plumb fall takes it (plumb_profile_load, then
 * plumb_study_open), without computing a fall, for `plumb lint`: every
 * error of the file (plumb_profile_lint), with each criterion it names
 * checked against the criteria as it is read (plumb_criteria_check_id),
 * so that an unknown id is listed in its place among the other errors,
 * at its line and column with the nearest ids, however many other keys
 * are wrong; then, when the profile loads, its atmosphere
 * (plumb_atmosphere_alloc). buf NULL: the file at `name` is read; else
 * the len bytes at buf stand for it, named `name` ("<stdin>").
 * The criteria are *criteria. When it is NULL they are loaded from
 * criteria_dir when the profile names one (a profile that names none
 * does not need them), and are then the caller's to free
 * (plumb_criteria_free), so that one set serves a run over many
 * profiles; a set that does not load is listed as the profile's last
 * error, and its ids go unchecked.
 * Up to max diagnostics go into errs[0 .. *n), the profile's own in file
 * order. Returns PLUMB_OK when the profile is good (*n 0), else the
 * status of the first error. PLUMB_EINVAL (one diagnostic) for a NULL
 * name, units, errs, n or criteria, max 0, or sets NULL with n_sets > 0. */
plumb_status plumb_study_lint(const char *name, const char *buf, size_t len,
                              const plumb_units *units, const char *const *sets, size_t n_sets,
                              const char *criteria_dir, plumb_criteria **criteria,
                              plumb_diag *errs, size_t max, size_t *n);

#endif /* PLUMB_STUDY_H */
