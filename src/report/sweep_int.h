/*
 * report/sweep_int.h - what the sweep's writers share (internal):
 * sweep_table.c (text, and plumb_report_sweep) and sweep_data.c (CSV,
 * JSON).
 */
#ifndef PLUMB_REPORT_SWEEP_INT_H
#define PLUMB_REPORT_SWEEP_INT_H

#include "report/common.h"

/* Row `row`'s value of axis a as shown: a direction swept through north
 * as the bearing it is (0 to 360 deg), any other value as it is. */
double plumbp_sweep_row_value(const plumb_sweep *sw, const plumb_sweep_row *row, size_t a);

/* Each warning of the rows once, with how many rows give it, to fn. */
void plumbp_each_sweep_warning(writer *w, const plumb_sweep *sw,
                               void (*fn)(writer *w, const char *text, size_t rows, size_t of));

/* The first row with figures (plumb_sweep_run fails when there is none). */
const plumb_sweep_row *plumbp_sweep_first_row(const plumb_sweep *sw);

/* The diagnostic of a row that has no figures, as one line. */
void plumbp_sweep_row_error(const plumb_sweep_row *row, char *buf, size_t size);

/* sweep_data.c */
void plumbp_sweep_csv(writer *w, const plumb_sweep *sw);
json_t *plumbp_sweep_json(jctx *j, const plumb_report_options *opt, const plumb_sweep *sw,
                          item_air *const *ia);

#endif /* PLUMB_REPORT_SWEEP_INT_H */
