/*
 * plumb/inverse.h - inverse answers: the value of one input at which a
 * limit on the fall is just met ("how high is too high", "how big a
 * canopy", "how much wind").
 *
 * Method: f(x) = metric(fall at x) - limit. The key is scanned over its
 * range (61 values: geometric over three decades either way of the
 * profile's own value for a positive quantity, linear over the physical
 * range otherwise), and every change of sign is refined by Brent's method
 * (GSL gsl_root_fsolver_brent; R. P. Brent, Algorithms for Minimization
 * without Derivatives, 1973) to rel_tol. A metric need not be monotonic in
 * its key (a canopy opens only above some height; wind adds to the impact
 * speed): all crossings are reported, and the answer is the one nearest
 * the profile's own value. A window narrower than the scan's spacing can
 * be missed; the result says what was scanned. Each
 * evaluation is a full fall of the profile with KEY set to x, bit for bit
 * what `plumb fall --set KEY=x` gives: the first is derived by the loader
 * from the text; for most keys the others set x on copies of that
 * profile's resolved specs, with the loader's checks, and rebuild the air
 * only for a key that changes it (the rest go through the loader each
 * time).
 * A fall that cannot be computed at a scanned value (above the air
 * model, past its budget, or failing) leaves that value out of the scan
 * rather than failing the answer; when such values, or the air model's
 * top, end the scan above every value computed and the limit is met
 * throughout, the outcome is "not reached" (within the values that can be
 * computed), never "unlimited".
 * A fall that cannot be computed (or a value the profile refuses) inside
 * the bracket of a crossing leaves that value out as well: the refinement
 * closes in on it from the side that meets the limit, and where it cannot
 * get past, the answer is the last value computed that meets the limit,
 * with explanation saying why it stops short of the crossing (found, with
 * words); never a failed answer for a value that need not be computed.
 * Where no value in the range meets the limit the result says why
 * (unlimited, or impossible even at the edge of the range), in figures
 * and, where the figures do not say it, in words without figures: the
 * report writers (report.h) word the figures in the report's units.
 *
 * Ownership: everything is borrowed for the call; the result is plain data.
 */
#ifndef PLUMB_INVERSE_H
#define PLUMB_INVERSE_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/units.h"
#include "plumb/profile.h"
#include "plumb/trajectory.h"
#include "plumb/atmosphere.h"
#include "plumb/criteria.h"
#include "plumb/judge.h"

typedef enum plumb_metric {
    PLUMB_METRIC_ENERGY = 0,   /* impact energy, J */
    PLUMB_METRIC_SPEED,        /* impact speed, m/s */
    PLUMB_METRIC_DRIFT         /* horizontal drift, m */
} plumb_metric;

typedef enum plumb_limit_outcome {
    PLUMB_LIMIT_FOUND = 0,     /* value is where the limit is just met */
    PLUMB_LIMIT_UNLIMITED,     /* the limit is met everywhere in the range */
    PLUMB_LIMIT_IMPOSSIBLE,    /* the limit is broken everywhere in the range */
    PLUMB_LIMIT_NOT_APPLICABLE, /* an inventory item without the key (a shape length of an
                                  item whose drag is given) */
    PLUMB_LIMIT_NOT_ASKED,     /* an inventory item another than the one asked for
                                  (plumb_study_limit with an items[N] key); no figures */
    PLUMB_LIMIT_NOT_REACHED    /* the limit is met at every value that can be computed,
                                  but the scan stopped at the edge of what can be: higher
                                  values leave the air model (its top, or a fall above
                                  it), run past the fall's budget, or fail; scan_hi_si is
                                  the highest value computed, metric_at_scan_hi its
                                  metric, explanation says why it goes no higher */
} plumb_limit_outcome;

typedef struct plumb_limit_options {
    double rel_tol;            /* relative tolerance on the key's value, default 1e-10 */
    size_t max_evaluations;    /* falls allowed in all, default 200 */
} plumb_limit_options;

enum { PLUMB_LIMIT_TEXT = 512, PLUMB_LIMIT_MAX_CROSSINGS = 8, PLUMB_LIMIT_UNIT = 32 };

typedef struct plumb_limit_result {
    plumb_limit_outcome outcome;  /* found, unlimited, not reached or impossible */
    double value_si;              /* the key's value where the limit is met (found), SI unit of its dimension */
    plumb_dim dim;                /* the key's dimension */
    double metric_at_value;       /* the metric there (found) */
    double base_value_si;         /* the profile's own value of the key */
    double metric_at_base;        /* the metric at the profile's own value */
    int increasing;               /* 1: the metric grows with the key through the answer */
    int limit_is_upper_bound;     /* 1: values just below value_si meet the limit */
    size_t n_crossings;           /* values where the metric crosses the limit (found) */
    double crossings_si[PLUMB_LIMIT_MAX_CROSSINGS]; /* in increasing order */
    int within_at_low_end;        /* 1: the lowest value scanned meets the limit */
    size_t evaluations;           /* falls computed */
    /* Why, in words without figures or units, "" when the figures say it
     * all: "it levels off as the fall reaches its terminal speed"
     * (unlimited release height, energy or speed), "there is no wind and
     * no sideways release velocity: nothing moves it sideways, ..." (an
     * unlimited drift that is 0 at every value scanned), "even at
     * (almost) zero height the limit is exceeded"
     * (impossible release height), "this item's drag does not use KEY"
     * (not applicable), "the limit is crossed between this value and the
     * next value computed, ... but the values just beyond this one cannot
     * be computed: ..." (found, short of a crossing whose bracket holds
     * values left out). The report writers word the figures (the range
     * scanned, the crossings, the metric) in the report's units from the
     * fields of this struct. */
    char explanation[PLUMB_LIMIT_TEXT];
    /* The unit the profile gave the key in ("" for none or a bare number;
     * filled by plumb_study_limit, not by plumb_limit_solve), and how a
     * value in it converts: value_si = given_offset_si + given_scale_si x. */
    char given_unit[PLUMB_LIMIT_UNIT];
    double given_offset_si, given_scale_si;
    /* What was scanned (every outcome but not applicable): the lowest and
     * highest values of the key computed, SI unit of its dimension; how
     * many values were computed (the profile's own value among them;
     * values the profile refuses are left out); and the metric at the
     * highest one, SI unit of the metric. */
    double scan_lo_si, scan_hi_si;
    size_t n_scanned;
    double metric_at_scan_hi;
} plumb_limit_result;

/* A whole `plumb limit` answer, for the report writer (report.h). */
typedef struct plumb_limit_report {
    const plumb_profile *profile;        /* borrowed */
    const char *key;                     /* the key solved for */
    plumb_metric metric;                 /* what is limited */
    double limit;                        /* the limit, SI unit of the metric */
    const char *criterion;               /* id of the criterion the limit came from, or NULL */
    size_t n_items;                      /* one answer per item */
    const plumb_limit_result *results;   /* borrowed array of n_items */
    const plumb_criterion *criterion_info; /* that criterion (source, status), or NULL;
                                            borrowed */
    const plumb_item_report *falls;      /* borrowed array of n_items, or NULL: each item's
                                            fall at its answer (at the profile's own
                                            value when none is found), judged: the
                                            report gives its warnings (0.4.0) */
} plumb_limit_report;

/* Defaults as documented on each field. Can't fail. */
void plumb_limit_options_init(plumb_limit_options *opt);

/* Finds the value of `key` (a numeric profile key; for an inventory the
 * item's own key, e.g. "payload.mass" means the key items[item + 1].mass,
 * item counting from 0 here and items from 1 in keys) at which `metric`
 * of item `item` equals `limit` (in the metric's SI unit).
 * PLUMB_EKEY / PLUMB_EINVAL for a key that is unknown or not numeric, or
 * an items[...] key (find payload.KEY: it is answered for each item);
 * PLUMB_ENUMERIC when a fall fails. An unlimited or impossible answer is
 * PLUMB_OK with the outcome, the range scanned and the explanation set. */
plumb_status plumb_limit_solve(const plumb_profile *profile, const plumb_units *units,
                               size_t item, const char *key, plumb_metric metric, double limit,
                               const plumb_limit_options *opt, plumb_trajectory *traj,
                               plumb_limit_result *res, plumb_diag *diag);

/* The key as `plumb fall --set` takes it for item `item` (from 0) of
 * profile, into out (size bytes): for an inventory, an item's own key
 * "payload.X" is "items[N].X" and "descent.X" is "items[N].descent.X" when
 * the item has its own descent device; any other key is itself. Re-running
 * `plumb fall --set SETKEY=VALUE` at an answer meets the limit.
 * PLUMB_EINVAL for NULL arguments or an item out of range; can't fail
 * otherwise. */
plumb_status plumb_limit_set_key(const plumb_profile *profile, size_t item, const char *key,
                                 char *out, size_t size);

/* The fall of item `item` with `key` set to x (SI unit of its dimension),
 * computed as plumb_limit_solve computes each of its falls and judged
 * against `criteria` as plumb fall judges a fall (plumb_item_judge): for
 * the warnings of the fall at an answer. *judged gets the result, the
 * verdicts and the warnings; its spec is the profile's own item (for its
 * name: the fall's own spec, with the key set, does not outlive the call).
 * The key's errors are plumb_limit_solve's; a value the profile refuses is
 * its input error (PLUMB_ERANGE, PLUMB_EINVAL ...), a fall that fails its
 * status, a judgement that fails plumb_item_judge's. */
plumb_status plumb_limit_fall_at(const plumb_profile *profile, const plumb_units *units,
                                 size_t item, const char *key, double x,
                                 plumb_trajectory *traj, const plumb_criteria *criteria,
                                 plumb_item_report *judged, plumb_diag *diag);

#endif /* PLUMB_INVERSE_H */
