/*
 * plumb/report.h - text, JSON (jansson) and CSV reports, and the cautions.
 *
 * Every report in every format carries the cautions of design.md section 7
 * (SAFETY.md holds the full text): text and CSV as closing lines (CSV as
 * "# " comment lines), JSON as the "cautions" array. JSON is always SI with
 * unit-suffixed keys; --units changes text and CSV only.
 * Reports never contain NaN or infinity: a non-finite figure makes the
 * writer fail with PLUMB_ENUMERIC before anything is written.
 *
 * Ownership: the report structs borrow everything they point to.
 * Writers write to a caller's stream; the CLI passes a memory stream and
 * writes the file only once the whole report has been made.
 */
#ifndef PLUMB_REPORT_H
#define PLUMB_REPORT_H

#include <stdio.h>
#include <stddef.h>
#include "plumb/error.h"
#include "plumb/atmosphere.h"
#include "plumb/trajectory.h"
#include "plumb/criteria.h"
#include "plumb/profile.h"

enum { PLUMB_MAX_VERDICTS = 32, PLUMB_MAX_WARNINGS = 16, PLUMB_WARNING = 256 };

typedef enum plumb_format { PLUMB_FORMAT_TEXT = 0, PLUMB_FORMAT_JSON, PLUMB_FORMAT_CSV } plumb_format;
typedef enum plumb_unit_system { PLUMB_UNITS_SI = 0, PLUMB_UNITS_US } plumb_unit_system;

typedef struct plumb_report_options {
    plumb_format format;          /* text, json or csv */
    plumb_unit_system units;      /* display units for text and CSV */
    const char *version;          /* program version for the header, may be NULL */
} plumb_report_options;

/* One payload's fall, judged. */
typedef struct plumb_item_report {
    const plumb_fall_spec *spec;                 /* borrowed */
    const plumb_shape_spec *shape;               /* borrowed, kind NONE if drag given */
    plumb_fall_result result;                    /* the computed fall */
    size_t n_verdicts;                           /* verdicts[0..n) */
    plumb_verdict verdicts[PLUMB_MAX_VERDICTS];  /* one per criterion of the profile */
    size_t n_warnings;                           /* warnings[0..n) */
    char warnings[PLUMB_MAX_WARNINGS][PLUMB_WARNING]; /* Mach, correlation range ... */
} plumb_item_report;

/* A whole `plumb fall` report. */
typedef struct plumb_fall_report {
    const plumb_profile *profile;   /* borrowed: name, path, sha256, inputs */
    size_t n_items;                 /* 1 unless inventory */
    plumb_item_report *items;       /* borrowed array of n_items */
} plumb_fall_report;

/* The cautions, in order; *n gets their count. Static strings. Can't fail. */
const char *const *plumb_cautions(size_t *n);

/* Checks that every criterion the profile names is in the set: PLUMB_EKEY
 * located at the entry, with a did-you-mean, for one that is not. */
plumb_status plumb_profile_criteria_check(const plumb_profile *profile,
                                          const plumb_criteria *criteria, plumb_diag *diag);

/* Computes item->verdicts and item->warnings for a finished fall.
 * Criteria named by the profile and missing from the set give PLUMB_EKEY
 * with a did-you-mean. */
plumb_status plumb_item_judge(plumb_item_report *item, const plumb_profile *profile,
                              const plumb_criteria *criteria, const plumb_atmosphere *atm,
                              plumb_diag *diag);

/* Writes a fall report. PLUMB_ENUMERIC if any figure is not finite,
 * PLUMB_EIO on a write error. */
plumb_status plumb_report_fall(FILE *out, const plumb_report_options *opt,
                               const plumb_fall_report *rep, plumb_diag *diag);

/* An air-properties table (`plumb air`): rows of the dry U.S. Standard
 * Atmosphere 1976 with a temperature offset. */
typedef struct plumb_air_table {
    const plumb_air *rows;         /* borrowed array of n_rows */
    size_t n_rows;
    double temperature_offset_k;   /* added to the standard temperature, K */
} plumb_air_table;

/* Writes an air-properties table, stating the model and its temperature
 * offset in every format. PLUMB_ENUMERIC if any figure is not finite. */
plumb_status plumb_report_air_table(FILE *out, const plumb_report_options *opt,
                                    const plumb_air_table *table, plumb_diag *diag);

/* The same for rows with no temperature offset. */
plumb_status plumb_report_air(FILE *out, const plumb_report_options *opt,
                              const plumb_air *rows, size_t n_rows, plumb_diag *diag);

struct plumb_sweep;         /* sweep.h */
struct plumb_limit_report;  /* inverse.h */

/* Writes the table of a `plumb sweep`: one row per value (per item for an
 * inventory), each row's figures exactly those of `plumb fall` at that
 * value; text adds an energy matrix for a two-way sweep. */
plumb_status plumb_report_sweep(FILE *out, const plumb_report_options *opt,
                                const struct plumb_sweep *sweep, plumb_diag *diag);

/* Writes the answer of a `plumb limit`: the value found per item, or why
 * there is none. */
plumb_status plumb_report_limit(FILE *out, const plumb_report_options *opt,
                                const struct plumb_limit_report *rep, plumb_diag *diag);

#endif /* PLUMB_REPORT_H */
