/*
 * common.h - what the fall, air, sweep and limit writers share inside the
 * report layer: the air each item's text needs, names of enumerations,
 * the worst item, warnings grouped over items, the memory-stream writer
 * opened and closed all or nothing, and the pieces of one writer another
 * reuses (the fall's text header and atmosphere line, the CSV item
 * columns, the JSON item object). Internal to the report layer.
 */
#ifndef PLUMB_REPORT_COMMON_H
#define PLUMB_REPORT_COMMON_H

#include <jansson.h>

#include "plumb/atmosphere.h"
#include "plumb/inverse.h"
#include "plumb/report.h"
#include "plumb/sweep.h"
#include "report/format.h"
#include "report/jsonout.h"

/* Air at the strike level [0] and at the release height [1]. */
typedef struct item_air {
    plumb_air at[2];
    double g_m_s2;          /* gravity at the strike level */
    double wind_release[2]; /* wind at the release height: speed m/s, from deg */
} item_air;

/* Called once per distinct warning (plumbp_each_warning). */
typedef void (*warning_fn)(writer *w, const char *who, const char *text);

/* A value of dimension `dim` in the display units, number and unit apart. */
typedef struct shown {
    double x;
    const char *unit;
} shown;

void plumbp_csv_cautions(writer *w);
size_t plumbp_csv_header_cols(writer *w, const plumb_item_report *first);
/* `number` is the item's as items[N] counts it (plumb_profile_item_number). */
void plumbp_csv_item_cols(writer *w, const plumb_item_report *it, size_t number);
void plumbp_csv_fall(writer *w, const plumb_fall_report *rep);
json_t *plumbp_j_air(jctx *j, const plumb_air *a);
void plumbp_j_item_into(jctx *j, json_t *o, const plumb_item_report *it, const plumb_profile *p,
                        const item_air *ia);
json_t *plumbp_j_profile(jctx *j, const plumb_profile *p);
void plumbp_j_items_into(jctx *j, json_t *o, const plumb_fall_report *rep, const item_air *ia);
json_t *plumbp_j_fall(jctx *j, const plumb_report_options *opt, const plumb_fall_report *rep,
                      const item_air *ia);
/* fall_descent_text.c: the "Descent devices" block of an item (who: the
 * item's name in an inventory, or NULL). */
void plumbp_text_descent(writer *w, const plumb_item_report *it, const char *who);
/* A quantity t(w, x), with t(o, x) beside it when o is given: "[...]"
 * after US figures, "(...)" after SI ones, as the sheet gives them; o
 * takes w's rounding for the call (an input echoed exactly is echoed so
 * in both). A slot of w's ring. */
const char *plumbp_t_beside(writer *w, writer *o, const char *(*t)(writer *, double), double x);
/* Its sentences, one each into buf (size bytes), for the text report and
 * the PDF sheet alike. o: NULL, or the other unit system's writer, whose
 * figure is then given beside each of w's ("21.49 ft/s [6.550 m/s]",
 * "6.550 m/s (21.49 ft/s)"). A device's inputs: "Cd 0.78 on 0.9503 m²";
 * "deploys below 40 m, fills in 0.6 s"; its inflation curve ("" when
 * none, then returns 0, and buf holds the canopy type's name if any). */
void plumbp_descent_size(writer *w, writer *o, const plumb_descent_spec *d, char *buf,
                         size_t size);
void plumbp_descent_rule(writer *w, writer *o, const plumb_descent_spec *d, char *buf,
                         size_t size);
int plumbp_descent_inflation(writer *w, const plumb_descent_spec *d, char *buf, size_t size);
/* A fall's figures of device i: line stretch (or "does not open before
 * impact"), and how far its canopy had filled when one was still filling
 * at impact (plumb_fall_device_at_impact); fill time and Pflanz's opening
 * force (deployed devices only; weight_n = m g0), said to be a full
 * fill's when the canopy was still filling; the peak drag force with its
 * load in g; the steady descent, worded by which devices opened ("does
 * not apply (the parachute does not open before impact)", "not reached
 * (the parachute is still filling at impact); ..."). */
void plumbp_descent_opening(writer *w, writer *o, const plumb_fall_spec *s,
                            const plumb_fall_result *r, size_t i, char *buf, size_t size);
void plumbp_descent_pflanz(writer *w, writer *o, const plumb_fall_spec *s,
                           const plumb_fall_result *r, size_t i, double weight_n, char *buf,
                           size_t size);
void plumbp_descent_peak(writer *w, writer *o, const plumb_fall_result *r, char *buf, size_t size);
void plumbp_descent_steady(writer *w, writer *o, const plumb_fall_spec *s,
                           const plumb_fall_result *r, char *buf, size_t size);
void plumbp_text_header(writer *w, const plumb_report_options *opt, const char *what,
                        const char *name);
const char *plumbp_status_note(const plumb_criterion *c);
void plumbp_text_atmosphere(writer *w, const plumb_atm_spec *a, char *buf, size_t size);
void plumbp_text_profile(writer *w, const plumb_profile *p);
void plumbp_text_single(writer *w, const plumb_report_options *opt, const plumb_fall_report *rep,
                        const item_air *ia);
void plumbp_text_inventory(writer *w, const plumb_report_options *opt, const plumb_fall_report *rep,
                           const item_air *ia);
void plumbp_wind_polar(double e, double n, double *speed, double *from_deg);
const char *plumbp_verdict_word(const plumb_verdict *v);
const char *plumbp_crit_kind_name(plumb_criterion_kind k);
const char *plumbp_drag_model_name(plumb_drag_model m);
const char *plumbp_shape_kind_name(plumb_shape_kind k);
const char *plumbp_attitude_name(plumb_attitude a);
const char *plumbp_atm_model_name(plumb_atm_model m);
const char *plumbp_wind_profile_name(plumb_wind_profile p);
long plumbp_strictest(const plumb_item_report *it);
size_t plumbp_worst_item(const plumb_fall_report *rep);
size_t plumbp_largest_drift_item(const plumb_fall_report *rep);
void plumbp_caution_lines_text(writer *w);
/* A warning as a report shows it: the same sentence said of two items or
 * rows is one warning, though the marks of its figures (PLUMBP_Q_*) may
 * differ beyond the digits shown. */
typedef struct said_warning {
    size_t report;   /* which of the reports given (a sweep's row) */
    size_t item;     /* which item of it */
    char *text;      /* the sentence in the writer's units (plumbp_t_warning) */
} said_warning;
/* Every warning of n reports, in order (report, item, warning), each
 * shown once; *n_said of them. NULL when out of memory, with w->nomem
 * set (the report is refused). Free with plumbp_said_free. */
said_warning *plumbp_said_warnings(writer *w, const plumb_fall_report *const *reps, size_t n,
                                   size_t *n_said);
void plumbp_said_free(said_warning *s, size_t n);
/* The first of s[0..e] with the sentence of s[e] (e when none before it). */
size_t plumbp_said_before(const said_warning *s, size_t e);
void plumbp_each_warning(writer *w, const plumb_fall_report *rep, warning_fn fn);
void plumbp_text_warning_line(writer *w, const char *who, const char *text);
/* "# warning: WHO: TEXT" (fall_csv.c). */
void plumbp_csv_warning_line(writer *w, const char *who, const char *text);
const plumb_report_options *plumbp_opts_or_default(const plumb_report_options *opt,
                                                   plumb_report_options *def);
plumb_status plumbp_prepare_fall(const plumb_fall_report *rep, item_air **ia, plumb_diag *diag);
shown plumbp_show_dim(const writer *w, plumb_dim dim, double si);
shown plumbp_show_key(const writer *w, const char *key, plumb_dim dim, double si);

#endif /* PLUMB_REPORT_COMMON_H */
