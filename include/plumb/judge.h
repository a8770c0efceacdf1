/*
 * plumb/judge.h - a finished fall judged against the criteria: one verdict
 * per criterion (plumb_criterion_judge, criteria.h) and the warnings that
 * qualify its figures (Mach above 0.5, a drag correlation or table used
 * beyond its range, a descent device that does not open, helmet-test
 * energies that are not safe limits). Judging lives with the criteria; the
 * report writers (report.h) print what is decided here. A warning's
 * figures with a unit are kept as marks with their SI values, which the
 * writers show in the report's units (plumb_report_warning, report.h), so
 * that --units us puts a rotor wake in mph and its thrust in lbf.
 *
 * Ownership: an item report borrows its spec and shape; the verdicts
 * point at criteria owned by the plumb_criteria set, which must outlive
 * the report.
 */
#ifndef PLUMB_JUDGE_H
#define PLUMB_JUDGE_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/atmosphere.h"
#include "plumb/trajectory.h"
#include "plumb/criteria.h"
#include "plumb/profile.h"

enum { PLUMB_MAX_VERDICTS = 32, PLUMB_MAX_WARNINGS = 16, PLUMB_WARNING = 512 };

/* One payload's fall, judged. */
typedef struct plumb_item_report {
    const plumb_fall_spec *spec;                 /* borrowed */
    const plumb_shape_spec *shape;               /* borrowed, kind NONE if drag given */
    plumb_fall_result result;                    /* the computed fall */
    size_t n_verdicts;                           /* verdicts[0..n) */
    plumb_verdict verdicts[PLUMB_MAX_VERDICTS];  /* one per criterion of the profile */
    size_t n_warnings;                           /* warnings[0..n) */
    char warnings[PLUMB_MAX_WARNINGS][PLUMB_WARNING]; /* Mach, correlation range ...;
                                 figures kept as marks: read with plumb_report_warning */
} plumb_item_report;

/* A whole `plumb fall` report. */
typedef struct plumb_fall_report {
    const plumb_profile *profile;   /* borrowed: name, path, sha256, inputs */
    size_t n_items;                 /* 1 unless inventory */
    const plumb_item_report *items; /* borrowed array of n_items */
} plumb_fall_report;

/* Checks that every criterion the profile names is in the set: PLUMB_EKEY
 * located at the entry, with a did-you-mean, for one that is not. */
plumb_status plumb_profile_criteria_check(const plumb_profile *profile,
                                          const plumb_criteria *criteria, plumb_diag *diag);

/* Computes item->verdicts and item->warnings for a finished fall. A
 * result with time_s 0 stands for no fall yet (plumb zone judges before
 * its samples): it gets the notes on the criteria and the inputs, not
 * those on what a single fall leaves out (the plate glide and the gusts,
 * which the zone's samples include).
 * Criteria named by the profile and missing from the set give PLUMB_EKEY
 * with a did-you-mean. */
plumb_status plumb_item_judge(plumb_item_report *item, const plumb_profile *profile,
                              const plumb_criteria *criteria, const plumb_atmosphere *atm,
                              plumb_diag *diag);

#endif /* PLUMB_JUDGE_H */
