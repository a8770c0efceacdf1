/*
 * plumb/report.h - text, JSON (jansson) and CSV reports, and the cautions.
 *
 * Every report in every format carries the cautions (README.md "Cautions";
 * SAFETY.md section 1 holds the full text): text and CSV as closing lines
 * (CSV as "# " comment lines), JSON as the "cautions" array. JSON is always
 * SI with unit-suffixed keys; --units changes text and CSV only.
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
#include "plumb/verify.h"
#include "plumb/profile.h"
#include "plumb/judge.h"
#include "plumb/sweep.h"
#include "plumb/inverse.h"
#include "plumb/dispersion.h"

typedef enum plumb_format {
    PLUMB_FORMAT_TEXT = 0,
    PLUMB_FORMAT_JSON,
    PLUMB_FORMAT_CSV,
    PLUMB_FORMAT_GEOJSON  /* RFC 7946; the zone report only (plumb_report_zone) */
} plumb_format;
typedef enum plumb_unit_system { PLUMB_UNITS_SI = 0, PLUMB_UNITS_US } plumb_unit_system;

typedef struct plumb_report_options {
    plumb_format format;          /* text, json or csv */
    plumb_unit_system units;      /* display units for text and CSV */
    const char *version;          /* program version for the header, may be NULL */
} plumb_report_options;

/* The cautions, in order; *n gets their count. Static strings. Can't fail. */
const char *const *plumb_cautions(size_t *n);

/* A warning of a fall or a zone (plumb_item_report's and
 * plumb_zone_result's `warnings`) as a sentence in the given units. The
 * library keeps a warning's figures as marks, each with its SI value, so
 * that every report shows them in its own units (text and CSV in the
 * --units chosen, JSON in SI); this is how a program reads one. Writes at
 * most size bytes to buf ('\0'-terminated when size > 0; buf may be NULL
 * with size 0) and returns the length of the whole sentence, as snprintf
 * does. A figure that is not finite shows as "?". Can't fail. */
size_t plumb_report_warning(const char *warning, plumb_unit_system units, char *buf,
                            size_t size);

/* Writes a fall report. PLUMB_ENUMERIC if any figure is not finite,
 * PLUMB_EWRITE on a write error. */
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

/* Writes the published reference checks (`plumb verify`, verify.h):
 * each check's figure against its source's, the count of those that
 * pass, and the cautions. PLUMB_ENUMERIC if a figure is not finite. */
plumb_status plumb_report_verify(FILE *out, const plumb_report_options *opt,
                                 const plumb_check *checks, size_t n, plumb_diag *diag);

/* One profile of a lint report (`plumb lint`): its name and the errors
 * found in it (plumb_study_lint: the file, its criteria, then the air). */
typedef struct plumb_lint_entry {
    const char *profile;        /* its name as given; "<stdin>" for standard input */
    const plumb_diag *errors;   /* borrowed: n_errors diagnostics, in file order */
    size_t n_errors;            /* 0: the profile is good */
    int listed_all;             /* 1: every error found is listed; 0: the list stopped
                                   at the most the checker was asked for, so there
                                   may be more */
} plumb_lint_entry;

/* Writes a lint report of n profiles. Text: "PROFILE: ok" for each good
 * profile, nothing else (the command line prints the errors on standard
 * error). JSON: plumb_version, "profiles" (each "name", "ok" and
 * "errors", each error's "file", "line", "column", "key" and "message"
 * apart, null when not known; "listed_all"), "passed" and "failed" (good
 * and bad profiles) and "cautions"; messages as the library gives them,
 * SI. CSV: the cautions and any list cut short as "# " lines, then one row
 * per error (profile,ok,file,line,column,key,message) and one per good
 * profile (its error columns empty); messages as
 * plumb_report_diag_message gives them in the report's units.
 * PLUMB_EINVAL for a NULL argument, PLUMB_ENOMEM, PLUMB_EWRITE. */
plumb_status plumb_report_lint(FILE *out, const plumb_report_options *opt,
                               const plumb_lint_entry *entries, size_t n, plumb_diag *diag);

/* An error's message as a report in `units` gives it: the message itself;
 * in US units, for a value outside the range of its key (the profile
 * keys' table, README "Profile keys"), the range is given again in US
 * customary units after it ("must be > 0 m^2, found '-0.0217 m^2' [US:
 * > 0 ft²]"), each limit rounded toward the inside of the range. Writes
 * at most size bytes to buf ('\0'-terminated when size > 0) and returns
 * the length of the whole, as snprintf does. Can't fail. */
size_t plumb_report_diag_message(const plumb_diag *error, plumb_unit_system units, char *buf,
                                 size_t size);

/* The same for rows with no temperature offset. */
plumb_status plumb_report_air(FILE *out, const plumb_report_options *opt,
                              const plumb_air *rows, size_t n_rows, plumb_diag *diag);

/* Writes the table of a `plumb sweep`: one row per value (per item for an
 * inventory), each row's figures exactly those of `plumb fall` at that
 * value; text adds an energy matrix for a two-way sweep. */
plumb_status plumb_report_sweep(FILE *out, const plumb_report_options *opt,
                                const plumb_sweep *sweep, plumb_diag *diag);

/* Writes the answer of a `plumb limit`: the value found per item, or why
 * there is none. */
plumb_status plumb_report_limit(FILE *out, const plumb_report_options *opt,
                                const plumb_limit_report *rep, plumb_diag *diag);

/* ---- the zone report (src/report/report_zone.c) ---------------------------------------
 *
 * Same conventions as plumb/report.h: the cautions in every format, JSON
 * always SI with unit-suffixed keys and 17 significant digits, CSV as
 * RFC 4180 with "# " comment lines; a figure that is not finite makes the
 * writer fail with PLUMB_ENUMERIC before anything is written. Nothing in
 * JSON's "zone" objects depends on the thread count; `threads` is printed
 * beside them. */

/* Writes a zone report. PLUMB_ENUMERIC if a figure is not finite,
 * PLUMB_EWRITE on a write error, PLUMB_EINVAL for an empty report. */
plumb_status plumb_report_zone(FILE *out, const plumb_report_options *opt,
                               const plumb_zone_report *rep, plumb_diag *diag);

/* Writes the zone's circles and regions as polygons in local east, north
 * metres (CSV, src/report/zone_map.c): one row per vertex, each ring
 * closed and counter-clockwise, the cautions as "# " lines. Format
 * PLUMB_FORMAT_GEOJSON of plumb_report_zone writes the same shapes on the
 * map (RFC 7946); it needs rep->has_site (PLUMB_EINVAL, key
 * site.longitude, without). */
plumb_status plumb_report_zone_regions(FILE *out, const plumb_zone_report *rep, plumb_diag *diag);

/* The per-sample file of a zone (src/report/zone_samples.c, `plumb zone
 * --samples-out`): CSV whose columns are item, pass, sample (numbered from
 * 1), east_m, north_m, energy_j, speed_m_s, time_s, SI units, 17
 * significant digits. plumb_report_zone_samples_head writes the cautions
 * as "# " lines, a line saying what the rows are, and the header row;
 * plumb_report_zone_sample one row, for a plumb_zone_sample_fn to call with
 * what it is given (index from 0) and the item's name. PLUMB_EWRITE when
 * the stream has failed, PLUMB_ENUMERIC (nothing written) for a figure
 * that is not finite. */
plumb_status plumb_report_zone_samples_head(FILE *out, plumb_diag *diag);
plumb_status plumb_report_zone_sample(FILE *out, const char *item, int pass, size_t index,
                                      const plumb_zone_sample *smp, plumb_diag *diag);

#endif /* PLUMB_REPORT_H */
