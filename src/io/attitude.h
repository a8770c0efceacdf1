/*
 * attitude.h - the attitude of a payload as an uncertain input
 * (`uncertainty: payload.attitude: {choice: ...}`, src/io/attitude.c).
 */
#ifndef PLUMB_IO_ATTITUDE_H
#define PLUMB_IO_ATTITUDE_H

#include "plumb/profile.h"
#include "io/yamltree.h"

/* Reads the entry pr into *u (kind PLUMB_DIST_CHOICE) and the drag of
 * each attitude for each of the n items into table[i] (cd, area m^2).
 * Forms:
 *   {choice: [tumbling, broadside, end-on]}       equal weights; every item
 *   {choice: {end-on: 1, broadside: 2}}           needs a shape (not a sphere)
 *   {choice: [{name: end-on, cd: 0.99, area: 8e-4 m^2, weight: 1}, ...]}
 *                                                  one payload with drag given
 * PLUMB_EINVAL / PLUMB_EKEY located at the offending node. */
plumb_status plumbp_attitude_read(const plumby_ctx *ctx, const plumby_pair *pr,
                                  const plumb_shape_spec *shapes, size_t n, int inventory,
                                  plumb_uncertainty *u, double (*table)[PLUMB_MAX_ATTITUDES][2]);

#endif /* PLUMB_IO_ATTITUDE_H */
