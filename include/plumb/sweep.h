/*
 * plumb/sweep.h - ranges of an input ("FROM:TO:STEP" with units) and the
 * table of falls over one or two of them (`plumb sweep`).
 *
 * A range's values are computed in the unit the user typed when FROM, TO
 * and STEP share it, else in SI: value_i = FROM + i STEP for every value
 * not past TO, written with 15 significant digits (so 0.1 x 3 is "0.3",
 * as a user would type it). A range may run down (60m:2m:-2m); its STEP's
 * sign is checked in the unit it is counted in, and a temperature's STEP
 * is a difference (0degC:30degC:5degC counts 0, 5, ... 30 degC; -20degC is
 * a step down, not 253.15 K). The count is made in double and refused
 * above the cap before it is converted, so no range wraps round. Every
 * row of a sweep is bit for bit what `plumb fall --set KEY=<value> <unit>`
 * gives: the first row the loader can make is derived from that text;
 * for most keys the other rows set the value, converted by the same
 * udunits2 converter (plumb_range_value_si), on copies of that profile's
 * resolved specs, with the loader's checks, and rebuild the air only for
 * a key that changes it. Keys that the loader alone can set (derived
 * ones such as release.velocity.speed, rows of tables, shape dimensions,
 * one item of an inventory) and values the copies refuse go through the
 * loader row by row, so a refused row carries the loader's diagnostic.
 *
 * Ownership: a plumb_sweep owns its rows' profiles and results; the
 * report structs it hands out point into it and live until
 * plumb_sweep_free. It keeps nothing of the profile it was run on.
 */
#ifndef PLUMB_SWEEP_H
#define PLUMB_SWEEP_H

#include <stddef.h>
#include "plumb/error.h"
#include "plumb/units.h"
#include "plumb/profile.h"
#include "plumb/criteria.h"
#include "plumb/trajectory.h"
#include "plumb/judge.h"
#include "plumb/inverse.h"

/* Rows allowed in one range and in a whole sweep. */
#define PLUMB_RANGE_MAX_VALUES 100000u
#define PLUMB_SWEEP_MAX_ROWS 10000u

enum { PLUMB_UNIT_TEXT = 64, PLUMB_MAX_AXES = 2 };

typedef struct plumb_range {
    char key[PLUMB_DIAG_KEY];     /* the profile key, "" for a bare range */
    plumb_dim dim;                /* its dimension */
    char unit[PLUMB_UNIT_TEXT];   /* the unit the values are written in ("" for bare numbers) */
    double from, to, step;        /* in `unit` */
    size_t n;                     /* number of values (>= 1) */
} plumb_range;

/* Parses "FROM:TO:STEP" (each a quantity of dimension dim, e.g.
 * "2m:60m:2m" or "0 kn:25 kn:5 kn") into *out; `what` names the option
 * and, after a space, the key it varies ("--vary release.height",
 * "--alt"): an error is located at the option (plumb_diag_option, index
 * 1, the column in text of the part at fault), with the key. STEP must not be zero
 * and must lead from FROM towards TO (negative when TO < FROM); all three
 * of the same dimension (STEP a difference for a temperature); at most
 * PLUMB_RANGE_MAX_VALUES values.
 * Errors: PLUMB_EPARSE (shape), PLUMB_EUNIT (units), PLUMB_ERANGE (a zero
 * STEP, one of the wrong sign, too many values). */
plumb_status plumb_range_parse(const plumb_units *units, const char *text, plumb_dim dim,
                               const char *what, plumb_range *out, plumb_diag *diag);

/* Parses "KEY=FROM:TO:STEP" for a numeric profile key (its dimension
 * from plumb_profile_key_dim), as the value of --vary: errors are located
 * at "--vary", index 1 (the caller gives the N-th --vary its N), the
 * column in text, with KEY. */
plumb_status plumb_range_parse_key(const plumb_units *units, const char *text,
                                   plumb_range *out, plumb_diag *diag);

/* The i-th value in the range's unit (i < n). */
double plumb_range_value(const plumb_range *r, size_t i);

/* The i-th value in SI, into *si_out, converted by udunits2 as the profile
 * loader converts a --set value (so a sweep row equals `plumb fall --set`
 * bit for bit). The unit was checked by plumb_range_parse, so the only
 * failure is PLUMB_ENOMEM (*si_out unchanged): never a value left in the
 * range's own unit. */
plumb_status plumb_range_value_si(const plumb_range *r, const plumb_units *units, size_t i,
                                  double *si_out, plumb_diag *diag);

/* Every value of the range in SI, si_out[0 .. r->n): plumb_range_value_si
 * of each, the same doubles, with the unit read once (plumb_units_to_si_n).
 * Fails with PLUMB_EINVAL for a NULL argument, PLUMB_ENOMEM, or the failed
 * load of a deferred units handle's database (plumb_units_load_error); on
 * failure si_out may hold values still in the range's own unit: discard it. */
plumb_status plumb_range_values_si(const plumb_range *r, const plumb_units *units,
                                   double *si_out, plumb_diag *diag);

/* "KEY=<value> <unit>" for the i-th value, as --set takes it. */
void plumb_range_set_text(const plumb_range *r, size_t i, char *buf, size_t size);

/* One row: the axis values and the fall report of that profile, or why
 * there is none. Fields added after `report` are new in this version; the
 * struct is only ever handed out by the library. */
typedef struct plumb_sweep_row {
    size_t index[PLUMB_MAX_AXES];      /* value index on each axis */
    double value[PLUMB_MAX_AXES];      /* value in the axis unit */
    double value_si[PLUMB_MAX_AXES];   /* value in SI */
    plumb_fall_report report;          /* the fall(s), as `plumb fall` reports them;
                                          n_items 0 and profile NULL when status != OK */
    plumb_status status;               /* PLUMB_OK, or why this row has no figures */
    plumb_diag error;                  /* when status != PLUMB_OK: where and why */
} plumb_sweep_row;

typedef struct plumb_sweep plumb_sweep;

/* Runs the falls of `profile` over one or two ranges (the first varies
 * slowest), judging each against `criteria` as `plumb fall` does. More
 * than PLUMB_SWEEP_MAX_ROWS rows (the product of the counts, computed
 * without overflow) is PLUMB_ERANGE before anything runs.
 * A row that cannot be computed (a value out of its key's range, a fall
 * that never lands, the air model left ...) keeps its status and
 * diagnostic in the row and the other rows are still computed; the sweep
 * succeeds when at least one row has figures (plumb_sweep_failed_count
 * says how many have none). When no row can be computed, or memory runs
 * out, the sweep fails: *out is NULL and diag is the first row's error,
 * naming its values. */
plumb_status plumb_sweep_run(const plumb_profile *profile, const plumb_units *units,
                             const plumb_criteria *criteria, const plumb_range *axes,
                             size_t n_axes, plumb_trajectory *traj, plumb_sweep **out,
                             plumb_diag *diag);

/* Called after each row with the rows done and in all (for a person
 * waiting: an estimate, progress). */
typedef void (*plumb_sweep_progress_fn)(void *user, size_t done, size_t total);

/* plumb_sweep_run, calling progress (if not NULL) after each row. */
plumb_status plumb_sweep_run_progress(const plumb_profile *profile, const plumb_units *units,
                                      const plumb_criteria *criteria, const plumb_range *axes,
                                      size_t n_axes, plumb_trajectory *traj,
                                      plumb_sweep_progress_fn progress, void *user,
                                      plumb_sweep **out, plumb_diag *diag);

void plumb_sweep_free(plumb_sweep *s);

size_t plumb_sweep_axis_count(const plumb_sweep *s);
const plumb_range *plumb_sweep_axis(const plumb_sweep *s, size_t i);
size_t plumb_sweep_row_count(const plumb_sweep *s);
/* Rows without figures (status != PLUMB_OK). Can't fail. */
size_t plumb_sweep_failed_count(const plumb_sweep *s);
const plumb_sweep_row *plumb_sweep_row_at(const plumb_sweep *s, size_t i);

/* ---- the boundary of a two-way sweep (sweep_boundary.c) -------------------
 *
 * For each value of the first input and each criterion, the value of the
 * second input at which the impact energy of one item just reaches the
 * criterion's limit: plumb_limit_solve on the profile derived with the
 * first input set to that value (the text "KEY=<value> <unit>" of --set),
 * so each boundary is exactly what `plumb limit --set KEY=<value> --find
 * KEY2 --energy-max ID` gives. The item is the one a varied key belongs
 * to (items[N].X: the second key's, else the first's), whose limit the
 * key moves: another item does not depend on it; else the one with the
 * highest impact energy in the first computed row (the only one for a
 * single payload). The criteria are that item's verdicts there, in order.
 * A boundary with no answer keeps why (plumb_sweep_boundary_why): the
 * value refused, the fall that failed, or the key the solver cannot solve
 * for (a direction: no one value of it marks a limit). */
typedef struct plumb_sweep_boundary {
    plumb_status status;            /* PLUMB_OK, or why there is no answer (the first
                                       value refused, a fall failed ...) */
    plumb_limit_outcome outcome;    /* found, unlimited or impossible (status OK) */
    double value_si;                /* the second input there (found), SI */
    double value;                   /* the same in the second range's unit */
    int limit_is_upper_bound;       /* 1: values below it keep within the limit */
} plumb_sweep_boundary;

/* Finds every boundary of a two-way sweep of `profile` (the profile the
 * sweep was run on), keeping them in the sweep. A boundary that cannot be
 * found keeps its status; PLUMB_EINVAL for a sweep that is not two-way,
 * PLUMB_ENOMEM. */
plumb_status plumb_sweep_find_boundaries(plumb_sweep *s, const plumb_profile *profile,
                                         const plumb_units *units, plumb_trajectory *traj,
                                         plumb_diag *diag);

/* Criteria with boundaries (0 until plumb_sweep_find_boundaries has run),
 * the k-th of them, the item the boundaries are of, and the boundary for
 * value i0 of the first input and criterion k (NULL out of range). */
size_t plumb_sweep_boundary_criteria(const plumb_sweep *s);
const plumb_criterion *plumb_sweep_boundary_criterion(const plumb_sweep *s, size_t k);
size_t plumb_sweep_boundary_item(const plumb_sweep *s);
const plumb_sweep_boundary *plumb_sweep_boundary_at(const plumb_sweep *s, size_t i0, size_t k);

/* The varied key (items[N].X) that named the item the boundaries are of,
 * or NULL when it is the item with the highest energy (or there are no
 * boundaries). Borrowed from the sweep. Can't fail. (Added after 0.3.0.) */
const char *plumb_sweep_boundary_item_key(const plumb_sweep *s);

/* Distinct reasons a sweep keeps for boundaries with no answer. */
enum { PLUMB_SWEEP_BOUNDARY_REASONS = 8 };

/* Why boundary (i0, k) has no answer: the diagnostic of the value the
 * profile refused or of plumb_limit_solve. NULL when it has an answer,
 * is out of range, or its reason is not one of the first
 * PLUMB_SWEEP_BOUNDARY_REASONS distinct ones kept (its status still says
 * what kind of failure it was). Borrowed from the sweep. Can't fail.
 * (Added after 0.3.0.) */
const plumb_diag *plumb_sweep_boundary_why(const plumb_sweep *s, size_t i0, size_t k);

#endif /* PLUMB_SWEEP_H */
