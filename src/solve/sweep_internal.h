/*
 * sweep_internal.h - what sweep_boundary.c needs of a sweep's storage
 * (sweep.c). Internal to the solve layer.
 */
#ifndef PLUMB_SWEEP_INTERNAL_H
#define PLUMB_SWEEP_INTERNAL_H

#include "plumb/sweep.h"

/* (Re)makes the sweep's table of boundaries for `item` and the n criteria,
 * axes[0].n x n entries, zeroed, with no reasons kept; `axis` is the axis
 * whose key names the item (PLUMB_MAX_AXES: the item with the highest
 * energy). NULL when out of memory. Owned by the sweep. */
plumb_sweep_boundary *plumbp_sweep_boundaries_alloc(plumb_sweep *s, size_t item, size_t axis,
                                                    const plumb_criterion *const *crit, size_t n);

/* No reason kept for a boundary (plumb_sweep_boundary_why gives NULL). */
enum { PLUMBP_NO_WHY = 0xff };

/* Keeps d as the reason boundary (i0, k) has no answer: one copy of each
 * distinct diagnostic, up to PLUMB_SWEEP_BOUNDARY_REASONS of them. Can't
 * fail. */
void plumbp_sweep_boundary_why(plumb_sweep *s, size_t i0, size_t k, const plumb_diag *d);

#endif /* PLUMB_SWEEP_INTERNAL_H */
