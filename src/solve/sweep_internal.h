/*
 * sweep_internal.h - what sweep_boundary.c needs of a sweep's storage
 * (sweep.c). Internal to the solve layer.
 */
#ifndef PLUMB_SWEEP_INTERNAL_H
#define PLUMB_SWEEP_INTERNAL_H

#include "plumb/sweep.h"

/* (Re)makes the sweep's table of boundaries for `item` and the n criteria,
 * axes[0].n x n entries, zeroed; NULL when out of memory. Owned by the
 * sweep. */
plumb_sweep_boundary *plumbp_sweep_boundaries_alloc(plumb_sweep *s, size_t item,
                                                    const plumb_criterion *const *crit, size_t n);

#endif /* PLUMB_SWEEP_INTERNAL_H */
