/*
 * sweep_boundary.c - the boundary of a two-way sweep (include/plumb/sweep.h):
 * for each value of the first input and each criterion, the value of the
 * second input at which the impact energy just reaches the limit, by the
 * limit solver (inverse.c: a scan over the key's range, then Brent's
 * method on each change of sign) on the profile derived with the first
 * input set to that value, exactly as --set sets it.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "plumb/sweep.h"
#include "core/internal.h"
#include "io/keys.h"
#include "solve/sweep_internal.h"
#include "solve/inverse_internal.h"

/* The item of `profile` that key names (items[N].X, N as the profile is
 * written, or items[NAME].X), into *item, with the key as the limit solver
 * takes it for that item ("payload.X") into solve_key; 0 for a key of no
 * one item (release.height), or an item the profile does not have. */
static int key_item(const plumb_profile *profile, const char *key, size_t *item,
                    char *solve_key, size_t size)
{
    size_t device;
    long n;
    const char *close = strchr(key, ']');
    if (strncmp(key, "items[", 6) != 0 || !close || close[1] != '.' ||
        !plumbp_key_find(key, &device, &n) || n == -1)
        return 0;
    for (size_t i = 0; i < plumb_profile_item_count(profile); i++) {
        const char *name = plumb_profile_item(profile, i)->name;
        if (n >= 0 ? plumb_profile_item_number(profile, i) == (size_t)n + 1
                   : strlen(name) == (size_t)(close - key - 6) &&
                         strncmp(name, key + 6, (size_t)(close - key - 6)) == 0) {
            *item = i;
            snprintf(solve_key, size, "payload%s", close + 1);
            return 1;
        }
    }
    return 0;
}

/* value_si = offset + scale x for a value x in `unit` (SI when ""); 1, or 0
 * when the unit cannot be read back, or -1 when memory ran out. */
static int unit_map(const plumb_units *units, const char *unit, plumb_dim dim, double *offset,
                    double *scale)
{
    *offset = 0.0;
    *scale = 1.0;
    if (!unit[0])
        return 1;
    char text[PLUMB_UNIT_TEXT + 8];
    double zero, one;
    plumb_status st;
    snprintf(text, sizeof text, "0 %s", unit);
    if ((st = plumb_units_parse(units, text, dim, &zero, NULL)) != PLUMB_OK)
        return st == PLUMB_ENOMEM ? -1 : 0;
    snprintf(text, sizeof text, "1 %s", unit);
    if ((st = plumb_units_parse(units, text, dim, &one, NULL)) != PLUMB_OK || !(one != zero))
        return st == PLUMB_ENOMEM ? -1 : 0;
    *offset = zero;
    *scale = one - zero;
    return 1;
}

plumb_status plumb_sweep_find_boundaries(plumb_sweep *s, const plumb_profile *profile,
                                         const plumb_units *units, plumb_trajectory *traj,
                                         plumb_diag *diag)
{
    if (!s || !profile || !units || !traj || plumb_sweep_axis_count(s) != 2)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a boundary needs a two-way sweep");
    const plumb_sweep_row *first = NULL;
    for (size_t r = 0; !first && r < plumb_sweep_row_count(s); r++)
        if (plumb_sweep_row_at(s, r)->status == PLUMB_OK)
            first = plumb_sweep_row_at(s, r);
    if (!first)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a boundary needs a computed row");
    const plumb_range *a0 = plumb_sweep_axis(s, 0), *a1 = plumb_sweep_axis(s, 1);
    /* the item a varied key belongs to: only its limit moves with that
     * key (the second's first: it is the one solved for); else the item
     * with the highest impact energy there. Its criteria, in order. */
    char key1[PLUMB_DIAG_KEY], unused[PLUMB_DIAG_KEY];
    size_t item = 0, axis = PLUMB_MAX_AXES;
    plumbp_strlcpy(key1, a1->key, sizeof key1);
    if (key_item(profile, a1->key, &item, key1, sizeof key1))
        axis = 1;
    else if (key_item(profile, a0->key, &item, unused, sizeof unused))
        axis = 0;
    if (item >= first->report.n_items) { /* not an item of the rows: as for no item */
        plumbp_strlcpy(key1, a1->key, sizeof key1);
        axis = PLUMB_MAX_AXES;
    }
    if (axis == PLUMB_MAX_AXES)
        for (size_t i = (item = 0) + 1; i < first->report.n_items; i++)
            if (first->report.items[i].result.energy_j >
                first->report.items[item].result.energy_j)
                item = i;
    const plumb_item_report *it = &first->report.items[item];
    const plumb_criterion *crit[PLUMB_MAX_VERDICTS];
    size_t n = it->n_verdicts;
    for (size_t k = 0; k < n; k++)
        crit[k] = it->verdicts[k].criterion;
    plumb_sweep_boundary *b = plumbp_sweep_boundaries_alloc(s, item, axis, crit, n);
    if (!b)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    double off = 0.0, scale = 1.0;
    int mapped = unit_map(units, a1->unit, a1->dim, &off, &scale);
    if (mapped < 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    for (size_t i = 0; i < a0->n; i++) {
        char set[PLUMB_DIAG_KEY + 64];
        plumb_range_set_text(a0, i, set, sizeof set);
        const char *sets[1] = {set};
        plumb_profile *derived = NULL;
        plumb_diag d;
        plumb_diag_clear(&d);
        plumb_status st = plumb_profile_derive(profile, units, sets, 1, &derived, &d);
        if (st == PLUMB_ENOMEM) /* a failure of the machine, not a row's outcome */
            return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
        plumb_diag refused = d; /* why the value was refused, for each criterion */
        /* every criterion's limit from one scan of the key (plumbp_limit_solve_many) */
        double lim[PLUMB_MAX_VERDICTS];
        plumb_limit_result lres[PLUMB_MAX_VERDICTS];
        plumb_status lst[PLUMB_MAX_VERDICTS];
        plumb_diag ld[PLUMB_MAX_VERDICTS];
        if (st == PLUMB_OK && a1->dim != PLUMB_DIM_ANGLE) {
            for (size_t k = 0; k < n; k++) {
                lim[k] = crit[k]->energy_limit_j;
                plumb_diag_clear(&ld[k]);
            }
            plumbp_limit_solve_many(derived, units, item, key1, PLUMB_METRIC_ENERGY, lim, n, NULL,
                                    traj, lres, lst, ld);
        }
        for (size_t k = 0; k < n; k++) {
            plumb_sweep_boundary *bk = &b[i * n + k];
            bk->status = st;
            if (st != PLUMB_OK) {
                plumbp_sweep_boundary_why(s, i, k, &refused);
                continue;
            }
            const plumb_limit_result *res = &lres[k];
            plumb_diag_clear(&d);
            if (a1->dim == PLUMB_DIM_ANGLE) { /* plumb limit's refusal, said for a sweep */
                bk->status = PLUMB_RAISE_KEY(&d, PLUMB_EINVAL, a1->key,
                                             "a direction does not raise or lower the energy "
                                             "one way, so no one value of it marks a limit "
                                             "(read each row's verdict)");
            } else {
                bk->status = lst[k];
                d = ld[k];
            }
            if (bk->status == PLUMB_ENOMEM) {
                plumb_profile_free(derived);
                return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
            }
            if (bk->status != PLUMB_OK) {
                plumbp_sweep_boundary_why(s, i, k, &d);
                continue;
            }
            bk->outcome = res->outcome;
            bk->limit_is_upper_bound = res->limit_is_upper_bound;
            if (res->outcome == PLUMB_LIMIT_FOUND) {
                bk->value_si = res->value_si;
                if (mapped) {
                    bk->value = (res->value_si - off) / scale;
                } else { /* a unit that cannot be read back: no value rather than a wrong one */
                    bk->status = PLUMB_EUNIT;
                }
            }
        }
        plumb_profile_free(derived);
    }
    return PLUMB_OK;
}
