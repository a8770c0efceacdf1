/*
 * study_lint.c - a profile checked as a study would take it, without
 * computing a fall (plumb_study_lint, plumb/study.h; `plumb lint`).
 *
 * The profile's errors are found by io's lint (io/profile_lint.c), which
 * goes on past each one. io knows no criteria set, so the ids under
 * `criteria:` are checked through a hook the loader calls as it reads
 * each id (plumbp_id_check, io/profile_int.h): an unknown id is then an
 * error of the file like any other, at the id's line and column, listed
 * in file order with the rest and set aside (left out of the list) so
 * that the check goes on. The set is loaded on first need.
 */
#include <stdio.h>
#include <stdlib.h>

#include "plumb/study.h"
#include "core/internal.h"
#include "io/profile_int.h"

/* The hook's state: the criteria, or where to load them from. */
typedef struct lint_criteria {
    const char *dir;          /* where the set is loaded from when *set is NULL */
    const plumb_units *units; /* for the criteria files' energies */
    plumb_criteria **set;     /* the caller's */
    int failed;               /* 1: the set did not load (load_err) */
    plumb_diag load_err;      /* why */
} lint_criteria;

/* plumbp_id_check's criterion: the id checked against the set, loaded
 * first when it is not yet; an id is taken when the set does not load. */
static plumb_status check_criterion(void *ctx, const char *id, char *msg, size_t size)
{
    lint_criteria *lc = ctx;
    if (!*lc->set && !lc->failed &&
        plumb_criteria_load_dir(lc->dir, lc->units, lc->set, &lc->load_err) != PLUMB_OK)
        lc->failed = 1;
    if (lc->failed)
        return PLUMB_OK;
    return plumb_criteria_check_id(*lc->set, id, msg, size);
}

plumb_status plumb_study_lint(const char *name, const char *buf, size_t len,
                              const plumb_units *units, const char *const *sets, size_t n_sets,
                              const char *criteria_dir, plumb_criteria **criteria,
                              plumb_diag *errs, size_t max, size_t *n)
{
    if (n)
        *n = 0;
    if (!name || !units || !errs || max == 0 || !n || !criteria || (!*criteria && !criteria_dir) ||
        (n_sets > 0 && !sets)) {
        if (n && errs && max > 0)
            *n = 1;
        return PLUMB_RAISE(errs, PLUMB_EINVAL, "plumb_study_lint: NULL argument");
    }
    lint_criteria lc = {criteria_dir, units, criteria, 0, {0}};
    plumbp_id_check check = {check_criterion, &lc};
    plumb_profile *prof = NULL;
    plumb_status st = plumbp_profile_lint_checked(name, buf, len, units, sets, n_sets, &check,
                                                  errs, max, n, &prof);
    if (st == PLUMB_OK) {
        plumb_atmosphere *atm = NULL;
        st = plumb_atmosphere_alloc(plumb_profile_atmosphere(prof), &atm, &errs[0]);
        plumb_atmosphere_free(atm);
        *n = st != PLUMB_OK;
    }
    plumb_profile_free(prof);
    if (st != PLUMB_OK && *n == 0)
        *n = 1; /* an error is never without its diagnostic */
    if (lc.failed && !plumb_status_is_input_error(lc.load_err.status) &&
        (st == PLUMB_OK || plumb_status_is_input_error(st))) {
        /* the set failed to load for want of memory, not for its files:
         * the machine's failure, not a list of the input's errors */
        errs[0] = lc.load_err;
        *n = 1;
        return lc.load_err.status;
    }
    if (lc.failed && *n < max && (st == PLUMB_OK || plumb_status_is_input_error(st))) {
        errs[(*n)++] = lc.load_err;
        if (st == PLUMB_OK)
            st = lc.load_err.status;
    }
    return st;
}
