/*
 * report/sweep_int.h - what the sweep's writers share (internal):
 * sweep_table.c (text, and plumb_report_sweep), sweep_boundary_text.c
 * (a two-way table's boundary), sweep_warnings.c (the warnings over the
 * rows) and sweep_data.c (CSV, JSON).
 */
#ifndef PLUMB_REPORT_SWEEP_INT_H
#define PLUMB_REPORT_SWEEP_INT_H

#include "report/common.h"

/* Numeric columns of a sweep row, and the spaces between columns. */
enum {
    SWEEP_NUM_COLS = 6,
    SWEEP_GAP = 2,
    SWEEP_KEY_COL = 15,
    SWEEP_KEY_HEAD = 16,
    SWEEP_NAME_MIN = 4,
    SWEEP_NAME_ROOM = 12 /* narrower than this, a name goes on a line of its own */
};

/* Row `row`'s value of axis a as shown: a direction swept through north
 * as the bearing it is (0 to 360 deg), any other value as it is. */
double plumbp_sweep_row_value(const plumb_sweep *sw, const plumb_sweep_row *row, size_t a);

/* sweep_warnings.c: each warning of the rows once, with how many rows
 * give it, to fn; fn for the text's Warnings block; 1 when any row has a
 * warning. */
void plumbp_each_sweep_warning(writer *w, const plumb_sweep *sw,
                               void (*fn)(writer *w, const char *text, size_t rows, size_t of));
void plumbp_sweep_text_warning(writer *w, const char *text, size_t rows, size_t of);
int plumbp_sweep_has_warnings(const plumb_sweep *sw);

/* sweep_boundary_text.c: the boundary block of a two-way sweep's text. */
void plumbp_sweep_text_boundary(writer *w, const plumb_sweep *sw);

/* The first row with figures (plumb_sweep_run fails when there is none). */
const plumb_sweep_row *plumbp_sweep_first_row(const plumb_sweep *sw);

/* The diagnostic of a row that has no figures, as one line. */
void plumbp_sweep_row_error(const plumb_sweep_row *row, char *buf, size_t size);

/* sweep_data.c */
void plumbp_sweep_csv(writer *w, const plumb_sweep *sw);
json_t *plumbp_sweep_json(jctx *j, const plumb_report_options *opt, const plumb_sweep *sw,
                          item_air *const *ia);

#endif /* PLUMB_REPORT_SWEEP_INT_H */
