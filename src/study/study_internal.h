/*
 * study_internal.h - what the study layer's own files (brief.c) take from
 * an open study beyond the public API: the units, criteria and trajectory
 * workspace it resolved once. Internal to the study layer.
 */
#ifndef PLUMB_STUDY_INTERNAL_H
#define PLUMB_STUDY_INTERNAL_H

#include "plumb/study.h"

const plumb_units *plumbp_study_units(const plumb_study *s);
plumb_trajectory *plumbp_study_trajectory(plumb_study *s);

#endif /* PLUMB_STUDY_INTERNAL_H */
