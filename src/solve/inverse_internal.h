/*
 * inverse_internal.h - the limit solve with the fall at its answer judged
 * as it is made (inverse.c), for the study. Internal to the library.
 */
#ifndef PLUMB_INVERSE_INTERNAL_H
#define PLUMB_INVERSE_INTERNAL_H

#include "plumb/inverse.h"

/* plumb_limit_solve, and the fall plumb_limit_fall_at would compute
 * again (at the answer when one is found, else at the profile's own
 * value) judged into *judged against criteria, from the solve's own
 * evaluation of it: the same figures, without a second derivation of the
 * profile and two more falls. *judge_st is the judging's status
 * (judge_diag why it failed), PLUMB_OK when nothing was judged (an item
 * the key does not apply to leaves *judged untouched). Returns what
 * plumb_limit_solve returns. judged NULL: plumb_limit_solve. */
plumb_status plumbp_limit_solve_judged(const plumb_profile *profile, const plumb_units *units,
                                      size_t item, const char *key, plumb_metric metric,
                                      double limit, const plumb_limit_options *opt,
                                      plumb_trajectory *traj, const plumb_criteria *criteria,
                                      plumb_item_report *judged, plumb_status *judge_st,
                                      plumb_diag *judge_diag, plumb_limit_result *res,
                                      plumb_diag *diag);

/* plumb_limit_solve for each of limits[0 .. n) (res[k], its status st[k],
 * its diagnostic diags[k]): the same results, figures and counts of falls
 * as n solves of their own, with the scan of the key's range, which does
 * not depend on the limit, made once (the sheet's drop heights for each
 * criterion, a two-way sweep's boundary). Can't fail otherwise. */
void plumbp_limit_solve_many(const plumb_profile *profile, const plumb_units *units,
                             size_t item, const char *key, plumb_metric metric,
                             const double *limits, size_t n, const plumb_limit_options *opt,
                             plumb_trajectory *traj, plumb_limit_result *res, plumb_status *st,
                             plumb_diag *diags);

#endif /* PLUMB_INVERSE_INTERNAL_H */
