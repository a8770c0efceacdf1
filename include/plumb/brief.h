/*
 * plumb/brief.h - everything a printed safety sheet says about one
 * profile, gathered from one study (plumb/study.h): the fall of every item
 * judged, the path of each plotted fall with its drag-free comparison, the
 * impact energy against drop height with the height at which each
 * criterion's limit is reached (plumb_study_limit), and the clearance zone
 * with its impact points, or why there is none.
 *
 * Which items are drawn: the items sorted worst first (highest ratio to
 * the strictest criterion, then highest energy); the first
 * PLUMB_BRIEF_PLOTTED get a path and an energy curve. The zone's plan view
 * is of the item whose clearance radius is largest (the item that sets
 * the zone).
 *
 * Ownership: a brief borrows its study (which must outlive it) and owns
 * every array it hands out; all of it lives until plumb_brief_free.
 */
#ifndef PLUMB_BRIEF_H
#define PLUMB_BRIEF_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/study.h"

enum {
    PLUMB_BRIEF_PLOTTED = 4,     /* items with a path and an energy curve */
    PLUMB_BRIEF_CURVE = 49,      /* points of an energy-against-height curve */
    PLUMB_BRIEF_TEXT = 160       /* a reason in words */
};

/* What the brief is asked to compute. */
typedef struct plumb_brief_options {
    int zone;                    /* 1: run the zone when the profile has uncertainty */
    size_t samples;              /* 0: the profile's zone.samples */
    int has_seed;                /* 1: seed replaces the profile's zone.seed */
    unsigned long seed;
    size_t threads;              /* 0: the online processors */
    size_t max_points;           /* impact points kept per pass for the plan view,
                                    the first ones in sample order; default 20000 */
} plumb_brief_options;

/* A path in the vertical plane through the release point and the impact
 * point: horizontal distance along the drift (m, signed) and height above
 * the strike level (m). */
typedef struct plumb_brief_path {
    size_t n;
    double *d_m, *z_m;
} plumb_brief_path;

/* One plotted item. */
typedef struct plumb_brief_plot {
    size_t item;                 /* index into the fall report */
    plumb_brief_path path;       /* the planned fall (the integrator's accepted points) */
    plumb_brief_path drag_free;  /* the same release without drag (closed form) */
    size_t n_deploy;             /* descent devices deployed: where, on the path */
    double deploy_d_m[PLUMB_MAX_DESCENT], deploy_z_m[PLUMB_MAX_DESCENT];
    size_t deploy_device[PLUMB_MAX_DESCENT]; /* [k]: which descent[] deployed there */
    size_t n_curve;              /* energy against drop height, over the same
                                    heights for every plotted item */
    double curve_h_m[PLUMB_BRIEF_CURVE], curve_e_j[PLUMB_BRIEF_CURVE];
    int curve_ok[PLUMB_BRIEF_CURVE]; /* 0: no fall at that height (a gap in the curve) */
    size_t n_limits;             /* one per verdict of the item, in its order */
    plumb_limit_result limits[PLUMB_MAX_VERDICTS]; /* release.height at the limit */
} plumb_brief_plot;

typedef struct plumb_brief {
    const plumb_study *study;             /* borrowed */
    const plumb_profile *profile;         /* the study's */
    const plumb_fall_report *fall;        /* every item, judged */
    size_t *order;                        /* item indices, worst first (fall->n_items) */
    size_t n_plots;
    plumb_brief_plot plots[PLUMB_BRIEF_PLOTTED];
    size_t n_criteria;                    /* the criteria judged, once each, in verdict order */
    const plumb_criterion *criteria[PLUMB_MAX_VERDICTS];
    /* The zone, or why there is none. */
    const plumb_zone_report *zone;        /* NULL when there is no zone */
    char no_zone[PLUMB_BRIEF_TEXT];       /* why not, when zone is NULL */
    size_t zone_item;                     /* the item with the largest clearance radius */
    size_t n_points[2];                   /* impact points kept, pass 0 and pass 1 (target) */
    double *points_m[2];                  /* east, north pairs of the zone_item's samples */
} plumb_brief;

/* Defaults as documented on each field (zone on). Can't fail. */
void plumb_brief_options_init(plumb_brief_options *opt);

/* Gathers a brief from an open study. The zone is run only when asked and
 * the profile has `uncertainty:`; otherwise no_zone says why in words.
 * Errors: those of plumb_study_fall, plumb_study_limit and plumb_study_zone
 * (a zone spec refused is PLUMB_EINVAL at zone.samples ...), PLUMB_ENOMEM.
 * On error *out is NULL. */
plumb_status plumb_brief_alloc(plumb_study *study, const plumb_brief_options *opt,
                              plumb_brief **out, plumb_diag *diag);

/* The falls the brief's zone will compute: samples (opt's, else the
 * profile's zone.samples) x items x passes (two with a target); 0 when no
 * zone is run (not asked for, or no uncertainty). For a note before a
 * long run. opt NULL: the defaults. Can't fail. */
double plumb_brief_zone_falls(const plumb_study *study, const plumb_brief_options *opt);

/* Frees a brief. Accepts NULL. */
void plumb_brief_free(plumb_brief *b);

#endif /* PLUMB_BRIEF_H */
