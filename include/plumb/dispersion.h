/*
 * plumb/dispersion.h - the Monte Carlo clearance zone (README.md "plumb
 * zone").
 *
 * N falls are computed, each with its uncertain inputs drawn from the
 * profile's `uncertainty:` distributions. Sample i draws from its own
 * random stream, seeded from (seed, i) by splitmix64 (G. L. Steele, D. Lea,
 * C. H. Flood, "Fast splittable pseudorandom number generators", OOPSLA
 * 2014), so the result does not depend on the number of threads: every
 * statistic is accumulated in sample order.
 *
 * Results, from the impact points p_i = (east, north) and energies E_i:
 *   mean and 95% ellipse   sample mean m and covariance S of p_i; the ellipse
 *                          (p - m)' S^-1 (p - m) = chi2_2(0.95) = 5.991, semi-axes
 *                          sqrt(chi2_2(0.95) lambda_k), lambda_k the eigenvalues
 *                          of S (Johnson & Wichern, Applied Multivariate
 *                          Statistical Analysis, 6th ed., result 4.7)
 *   percentiles            x_p = the ceil(p N)-th smallest sample, read from a
 *                          fine log-linear histogram (relative bin width 2^-12)
 *   percentile interval    [x_(l), x_(u)] with P(Bin(N, p) >= l) >= 1 - a/2 and
 *                          P(Bin(N, p) <= u - 1) >= 1 - a/2: distribution-free
 *                          order-statistic bounds (H. A. David, H. N. Nagaraja,
 *                          Order Statistics, 3rd ed., 2003, section 7.1), the
 *                          ranks whose Clopper-Pearson interval excludes p
 *   exceedance             k of N samples exceeding a criterion (plumb_criterion_judge); the
 *                          Clopper-Pearson interval (Biometrika 26, 404, 1934):
 *                          P(Bin(N, lo) >= k) = a/2, P(Bin(N, hi) <= k) = a/2
 *   clearance radius       upper bound of the radius percentile at the zone's
 *                          confidence, plus the scatter allowance
 *   ballistic throw        drag-free range from height H with release speed
 *                          components v_h, v_z: v_h (v_z + sqrt(v_z^2 + 2 g H)) / g
 *                          (= v_h sqrt(2 H / g) for a level throw)
 * a = 1 - ci_level (default 0.95).
 *
 * Memory does not grow with N: histograms have a fixed number of bins, set
 * from a deterministic pilot (the first samples); nothing is kept per
 * sample except through the on_sample callback.
 *
 * Ownership: everything passed in is borrowed for the call. A result is
 * plain data; its exceedance entries point to the criteria passed in, which
 * must outlive the result's use. A plumb_sampler owns its random stream and
 * a copy of the base spec and of the uncertainty entries; use one per
 * thread.
 */
#ifndef PLUMB_DISPERSION_H
#define PLUMB_DISPERSION_H

#include <stddef.h>
#include <stdio.h>
#include "plumb/error.h"
#include "plumb/atmosphere.h"
#include "plumb/trajectory.h"
#include "plumb/criteria.h"
#include "plumb/judge.h"
#include "plumb/profile.h"
#include "plumb/region.h"

enum {
    PLUMB_ZONE_MAX_INPUTS = 32,    /* uncertain inputs per run */
    PLUMB_ZONE_MAX_CRITERIA = 32,  /* criteria judged per run */
    PLUMB_ZONE_RADII = 4,          /* radius percentiles: 50, 90, 99, 99.9 % */
    PLUMB_ZONE_ENERGIES = 3,       /* energy percentiles: 50, 95, 99 % */
    PLUMB_ZONE_MAX_WARNINGS = 16,  /* warnings per zone result */
    /* bytes of one warning, with its '\0': a fall's (plumb/judge.h), since
     * a zone carries its fall's warnings as plumb fall prints them */
    PLUMB_ZONE_WARNING = PLUMB_WARNING
};

/* Largest spread of the impact points, m, below which the uncertain inputs
 * are said not to move the impact point (impact_point_fixed). */
#define PLUMB_ZONE_FIXED_M 1e-6

/* Largest number of samples a run accepts. */
#define PLUMB_ZONE_MAX_SAMPLES 100000000u

/* Largest seed, 2^53 - 1: reports print the seed, and integers up to it
 * read back exactly from JSON (IEEE 754 double, the number type of most
 * JSON readers). */
#define PLUMB_ZONE_MAX_SEED 9007199254740991.0

/* ---- the sampler ----------------------------------------------------------
 *
 * Draws the uncertain inputs of one fall into a copy of the base spec.
 * Keys must be per-fall numeric keys (plumb_fall_spec_field), or the derived
 * release.velocity.speed / .heading / .climb, which set the components
 * east = speed sin(heading), north = speed cos(heading), up = climb; the
 * parts not uncertain come from the base spec's components (a zero planned
 * horizontal speed has no heading: north, unless heading is uncertain).
 * Parameters are in the key's SI unit, angles in degrees.
 *  - normal [mean, sd]: a quantity with a range (mass, areas, cd, speeds,
 *    heights, times ... > 0 or >= 0; cd and exponents also <= 10 or 1;
 *    latitude -90..90) is truncated to it by redrawing, at most 64 times;
 *    refused when less than half of the distribution lies in the range.
 *  - uniform [lo, hi], triangular [lo, mode, hi]: must lie in the range.
 *  - angles (wind.from, release.velocity.heading) are wrapped into
 *    [0, 360); a uniform or triangular with lo > hi is a sector through
 *    north, e.g. uniform [350, 10].
 * A key that does not change the fall (payload.drag.cd when the drag is
 * given as cd_area, wind.exponent without a power law ...) is refused. */
typedef struct plumb_sampler plumb_sampler;

/* Checks the n entries against the base spec and makes a sampler. source
 * names the file for diagnostics (may be NULL); an entry's line and column
 * locate its error, in PLUMB_DIAG_SET_FILE for an entry with from_set. PLUMB_EINVAL (key set) for a key that is not a
 * per-fall numeric input, a duplicate or conflicting key, sd < 0, lo > hi
 * for a non-angle key, a mode outside [lo, hi], a range violated, or more
 * than PLUMB_ZONE_MAX_INPUTS entries. On error *out is NULL and nothing is
 * leaked. */
plumb_status plumb_sampler_alloc(const plumb_fall_spec *base, const plumb_uncertainty *u,
                                 size_t n, const char *source, plumb_sampler **out,
                                 plumb_diag *diag);

/* Frees a sampler. Accepts NULL. */
void plumb_sampler_free(plumb_sampler *s);

/* Number of entries (n at alloc). Can't fail. */
size_t plumb_sampler_count(const plumb_sampler *s);

/* 1 when entry i is a normal distribution truncated to [*lo, *hi] (either
 * may be infinite), else 0. An end of the key's range that cuts off less
 * than 1e-12 of the distribution (past about 7 sd) is still enforced but
 * given here as infinite, and an entry with no other end is not counted as
 * truncated. lo, hi may be NULL. Can't fail. */
int plumb_sampler_truncated(const plumb_sampler *s, size_t i, double *lo, double *hi);

/* Draws sample `index` of the stream `seed`: *out = base with the drawn
 * values set. values (n doubles, may be NULL) gets each entry's drawn
 * value, angles wrapped; redraws (n counters, may be NULL) is incremented
 * by the draws each truncated entry rejected. The same (seed, index) always
 * gives the same draw. Allocates nothing. PLUMB_ENUMERIC (key set) if a
 * truncated normal found no value in 64 draws. */
plumb_status plumb_sampler_draw(plumb_sampler *s, unsigned long seed, size_t index,
                                plumb_fall_spec *out, double *values, size_t *redraws,
                                plumb_diag *diag);

/* ---- the zone run --------------------------------------------------------- */

/* One sample, as handed to the on_sample callback. */
typedef struct plumb_zone_sample {
    double point_m[2];        /* impact point east, north, m */
    double energy_j;          /* impact kinetic energy, J */
    double speed_m_s;         /* impact speed, m/s */
    double time_s;            /* time from release to impact, s */
} plumb_zone_sample;

/* Called for every sample of pass 0 (released at the planned point) and,
 * with a target, of pass 1 (released at the aiming point), in sample order
 * (index 0, 1, 2 ...), from one thread at a time; return 0 to go on,
 * nonzero to stop the run (it then fails with PLUMB_EWRITE). */
typedef int (*plumb_zone_sample_fn)(void *user, int pass, size_t index,
                                    const plumb_zone_sample *s);

/* Called after each block of samples with the samples done so far and the
 * total (of this pass; a targeted run makes two passes, pass 0 and 1), from
 * one thread at a time. Must not block for long. */
typedef void (*plumb_zone_progress_fn)(void *user, int pass, size_t done, size_t total);

typedef struct plumb_zone_options {
    size_t threads;                       /* worker threads; 0: the online processors */
    plumb_trajectory_options trajectory;  /* integrator for every sample; _init sets the
                                             defaults of plumb fall (rel_tol 1e-8: on 300
                                             falls of the benchmark zone case the impact
                                             speed is within 1e-10 of a rel_tol 1e-13 run),
                                             so each sample is exactly the fall `plumb
                                             fall` computes for the same inputs */
    double ci_level;                      /* level of every interval, 0 < l < 1, default 0.95 */
    size_t block_samples;                 /* samples per work unit, default 256 (changes
                                             speed only, never the result) */
    size_t pilot_samples;                 /* samples that set the histogram scales,
                                             default 1024 (>= 1) */
    const char *source;                   /* file for diagnostics of the entries, or NULL */
    plumb_zone_progress_fn progress;      /* or NULL */
    void *progress_user;                  /* passed to progress */
    plumb_zone_sample_fn on_sample;       /* or NULL: every sample, in order */
    void *sample_user;                    /* passed to on_sample */
} plumb_zone_options;

/* A percentile and its interval, in the unit of the quantity. */
typedef struct plumb_zone_quantile {
    double p;                 /* probability level, e.g. 0.99 */
    double value;             /* the ceil(p N)-th smallest sample (histogram, 2^-12 relative) */
    double lo;                /* lower end of the ci_level interval, order statistic l */
    double hi;                /* upper end of the ci_level interval, order statistic u */
    int lo_open;              /* 1: N too small to bound it below; lo is the smallest sample */
    int hi_open;              /* 1: N too small to bound it above; hi is the largest sample */
} plumb_zone_quantile;

/* The probability that one criterion's energy limit is exceeded. */
typedef struct plumb_zone_exceedance {
    const plumb_criterion *criterion; /* borrowed from the caller's list */
    size_t count;             /* samples whose impact energy exceeds the limit, as
                                 plumb_criterion_judge decides (> limit, or >= for a
                                 limit worded "less than") */
    double probability;       /* count / samples */
    double lo, hi;            /* Clopper-Pearson interval at ci_level */
} plumb_zone_exceedance;

/* The statistics of one pass: N falls released around one planned point,
 * radii measured from one centre. */
typedef struct plumb_zone_stats {
    size_t samples;           /* N */
    double release_m[2];      /* planned release point east, north (no uncertainty), m */
    double centre_m[2];       /* the point radii are measured from, m */
    double mean_m[2];         /* mean impact point east, north, m */
    double cov_m2[3];         /* sample covariance of the impact point: ee, nn, en, m^2 */
    double ellipse_chi2;      /* chi-square(2) 0.95 quantile used for the ellipse */
    double semi_major_m;      /* 95% ellipse semi-major axis, m */
    double semi_minor_m;      /* 95% ellipse semi-minor axis, m */
    double bearing_deg;       /* bearing of the major axis from north, [0, 180) deg */
    plumb_zone_quantile radius[PLUMB_ZONE_RADII]; /* distance from centre: p 0.5, 0.9, 0.99, 0.999, m */
    plumb_zone_quantile radius_conf; /* the same at the zone's confidence, m */
    double radius_max_m;      /* largest distance from the centre, m */
    double scatter_m;         /* bounce/deflection allowance, m */
    double clearance_radius_m;/* radius_conf.hi + scatter_m, m */
    plumb_zone_quantile energy[PLUMB_ZONE_ENERGIES]; /* impact energy: p 0.5, 0.95, 0.99, J */
    double energy_max_j;      /* largest impact energy, J */
    size_t n_exceedance;      /* exceedance[0..n) */
    plumb_zone_exceedance exceedance[PLUMB_ZONE_MAX_CRITERIA]; /* in the caller's order */
    plumb_zone_quantile displacement[2]; /* median of impact - planned release point,
                                            east and north (component-wise), m */
    double drop_height_m;     /* the "radius = height" rule's height: the planned release
                                 height, or the largest drawn when it is uncertain, m */
    double planned_height_m;  /* the planned release height, m (0.4.0) */
    double glide_ratio_max;   /* a plate's largest glide, sideways travel / height fallen
                                 (plumb/glide.h); 0: no glide */
    double max_release_speed_m_s; /* largest release speed sampled, m/s */
    double ballistic_throw_m; /* drag-free throw of the sample with that speed, m */
    /* Where things land, wherever that is on the ground (region.h): the
     * first landing_training samples fix the centre (their mean) and the
     * density grid; the others are counted against them. */
    size_t landing_training;  /* m = min(pilot, max(1, N / 4)) */
    double landing_centre_m[2]; /* centre of the landing circle: mean of those m, m */
    plumb_zone_quantile landing_radius; /* distance from that centre of the other N - m
                                 samples at p = the zone's confidence, with its interval:
                                 the smallest circle there holding p of the impacts */
    double landing_circle_m;  /* landing_radius.hi + scatter_m: the landing circle with
                                 the scatter allowance as a buffer (0 when hi_open) */
    plumb_region_result landing; /* the polygon holding p of the impacts, with the
                                    scatter allowance as a buffer */
    /* The attitude (payload.attitude), when it is uncertain: the samples
     * of each, and the attitude of the largest impact energy (which sets
     * the top energy percentiles) and of the farthest impact from the
     * planned point (which sets the radii). */
    size_t n_attitudes;       /* 0: the attitude is not uncertain */
    struct {
        char name[PLUMB_ATTITUDE_NAME];
        size_t count;         /* samples that fell in it */
        double energy_max_j;  /* largest impact energy among them, J */
        double radius_max_m;  /* farthest distance from centre_m among them, m */
    } attitude[PLUMB_MAX_ATTITUDES];
    size_t attitude_energy;   /* index of the attitude of the largest energy */
    size_t attitude_radius;   /* index of the attitude of the farthest impact */
    int impact_point_fixed;   /* 1: every impact lies within PLUMB_ZONE_FIXED_M of the
                                 first in east and north: the uncertainty does not move
                                 the impact point, the radii are one fall's drift */
    size_t steps;             /* integrator steps, all samples */
    size_t rhs_evaluations;   /* right-hand-side evaluations, all samples */
} plumb_zone_stats;

/* One uncertain input as it was used. */
typedef struct plumb_zone_input {
    char key[PLUMB_DIAG_KEY]; /* dotted key */
    plumb_dist_kind kind;     /* normal, uniform or triangular */
    double param[3];          /* as given, key's SI unit (angles deg) */
    int truncated;            /* 1: normal truncated to [lower, upper] */
    double lower, upper;      /* the range when truncated (either may be infinite) */
    size_t redraws;           /* draws rejected and redrawn in pass 0 */
    size_t n_choice;          /* choice: the attitudes, weights and drag (cd, area m^2) */
    char choice[PLUMB_MAX_ATTITUDES][PLUMB_ATTITUDE_NAME];
    double weight[PLUMB_MAX_ATTITUDES];
    double choice_drag[PLUMB_MAX_ATTITUDES][2];
} plumb_zone_input;

typedef struct plumb_zone_result {
    size_t samples;           /* N */
    unsigned long seed;       /* the seed */
    double confidence;        /* the zone's confidence, 0 < c < 1 */
    double ci_level;          /* level of every interval */
    int gust_model;           /* plumb_turbulence_model of the gusts (0: none) */
    double gust_w20_m_s;      /* their W20, m/s (each sample has its own realisation) */
    size_t n_inputs;          /* inputs[0..n) */
    plumb_zone_input inputs[PLUMB_ZONE_MAX_INPUTS]; /* in the entries' order */
    plumb_zone_stats zone;    /* pass 0: released at the planned point, radii from it */
    int has_target;           /* 1: a target was given; the fields below are set */
    double target_m[2];       /* target east, north, m */
    double aim_release_m[2];  /* release point putting the median impact on the target:
                                 target - zone.displacement[].value, m */
    plumb_zone_stats at_target; /* pass 1: released at aim_release_m, radii from the target */
    size_t n_warnings;        /* warnings[0..n) */
    char warnings[PLUMB_ZONE_MAX_WARNINGS][PLUMB_ZONE_WARNING]; /* sentences qualifying the
                                 figures: the impact point fixed (first, when so), and those
                                 the caller adds (plumb_zone_add_warning); figures kept as
                                 marks: read with plumb_report_warning (report.h) */
} plumb_zone_result;

/* Appends a warning (a sentence) to a result, whole. Never silent: a
 * sentence longer than PLUMB_ZONE_WARNING - 1 bytes ends in a note that it
 * was cut, and one more than PLUMB_ZONE_MAX_WARNINGS makes the last say
 * that some were left out. Can't fail. */
void plumb_zone_add_warning(plumb_zone_result *res, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;

/* Defaults as documented on each field. Can't fail. */
void plumb_zone_options_init(plumb_zone_options *opt);

/* The number of threads used when threads is 0 (online processors, >= 1). */
size_t plumb_zone_default_threads(void);

/* The fewest samples that bound the `confidence` percentile above at
 * ci_level: ceil(ln((1 - ci_level) / 2) / ln(confidence)). 0 for invalid
 * arguments. */
size_t plumb_zone_min_samples(double confidence, double ci_level);

/* Checks a zone's settings as plumb_zone_run does before its first fall:
 * zone->samples from 1 to PLUMB_ZONE_MAX_SAMPLES and enough to bound the
 * zone->confidence percentile at opt->ci_level (plumb_zone_min_samples),
 * 0 < confidence < 1, scatter >= 0, a finite target, a seed at most
 * PLUMB_ZONE_MAX_SEED, and opt's levels and sizes (opt NULL: defaults).
 * PLUMB_EINVAL with the setting's key ("zone.samples", "zone.seed" ...)
 * and no file. */
plumb_status plumb_zone_check(const plumb_zone_spec *zone, const plumb_zone_options *opt,
                              plumb_diag *diag);

/* Runs the zone of one payload: zone->samples falls of `base` with the n_u
 * uncertain inputs, judged against the n_crit criteria (may be 0), and,
 * with zone->has_target, a second pass released at the aiming point.
 * opt NULL: defaults. The result is the same for every thread count.
 * Errors: PLUMB_EINVAL (key "zone.samples", "zone.confidence" ...) for a
 * bad zone spec (plumb_zone_check), or a bad entry (see
 * plumb_sampler_alloc); a sample whose fall fails stops the run with that
 * fall's status and the sample's index in the message (the lowest failing
 * index, whatever the threads); PLUMB_EWRITE when on_sample stops it;
 * PLUMB_ENOMEM. On error *res is unspecified. */
plumb_status plumb_zone_run(const plumb_fall_spec *base, const plumb_atmosphere *atm,
                            const plumb_uncertainty *u, size_t n_u,
                            const plumb_zone_spec *zone,
                            const plumb_criterion *const *criteria, size_t n_crit,
                            const plumb_zone_options *opt, plumb_zone_result *res,
                            plumb_diag *diag);

/* Exact Clopper-Pearson interval for k successes in n trials at `level`
 * (0 < level < 1, k <= n, n >= 1). Can't fail for valid arguments; returns
 * PLUMB_EINVAL otherwise. */
plumb_status plumb_clopper_pearson(size_t k, size_t n, double level, double *lo, double *hi);

/* Ranks (1-based) of the order statistics bounding the p-quantile of n
 * samples at `level`: *l = 0 when no rank bounds it below, *u = n + 1 when
 * none bounds it above. PLUMB_EINVAL for bad arguments. */
plumb_status plumb_quantile_ranks(size_t n, double p, double level, size_t *l, size_t *u);

/* A zone report: the zones of a profile's items, for the writer
 * plumb_report_zone (report.h). */
typedef struct plumb_zone_item {
    const char *name;                 /* payload name, borrowed */
    const plumb_zone_result *result;  /* borrowed */
    size_t number;                    /* the item's number as the profile is written
                                         (items[N], plumb_profile_item_number); 0: its
                                         place in items[], from 1 */
} plumb_zone_item;

typedef struct plumb_zone_report {
    const char *profile_name;         /* borrowed, may be NULL */
    const char *profile_path;         /* borrowed, may be NULL */
    const char *profile_sha256;       /* hex SHA-256 of the profile file, may be NULL */
    int inventory;                    /* 1: "items": [...]; 0: one "zone" */
    size_t n_items;                   /* items[0..n), >= 1 */
    const plumb_zone_item *items;     /* borrowed */
    size_t threads;                   /* threads used (reported outside "zone") */
    size_t kit_item;                  /* the item that sets the kit's zone: the largest
                                         clearance radius around the planned drop point
                                         (the first of equals); 0 for one payload */
    size_t kit_landing_item;          /* the item with the largest landing circle */
    int has_site;                     /* 1: site_deg is the WGS 84 site (map output) */
    double site_deg[2];               /* latitude, longitude of east = north = 0, deg */
} plumb_zone_report;

#endif /* PLUMB_DISPERSION_H */
