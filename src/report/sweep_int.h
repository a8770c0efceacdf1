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

/* How a varied value is shown in text and CSV: in the unit the range was
 * typed in when that is the report's unit for the key (the same numbers),
 * else in the report's unit (plumbp_show_key: a US report is US
 * throughout, ft for a height typed in m, mph for a wind typed in kn);
 * the values as typed stay in the text's range line, in a CSV column of
 * their own and in JSON's values_as_given. plumbp_sweep_axis_as_typed
 * says which; plumbp_sweep_axis_unit is the unit shown;
 * plumbp_sweep_si_shown a value (typed, and si, the same in SI) as shown;
 * plumbp_sweep_row_shown row's; plumbp_sweep_num a shown value: with
 * `sig` significant digits as typed; converted, with as many as keep the
 * steps apart (at least TEXT_SIG: a converted value is no exact input). */
int plumbp_sweep_axis_as_typed(const writer *w, const plumb_sweep *sw, size_t a);
const char *plumbp_sweep_axis_unit(writer *w, const plumb_sweep *sw, size_t a);
double plumbp_sweep_si_shown(const writer *w, const plumb_sweep *sw, size_t a, double typed,
                             double si);
double plumbp_sweep_row_shown(const writer *w, const plumb_sweep *sw, const plumb_sweep_row *row,
                              size_t a);
const char *plumbp_sweep_num(writer *w, const plumb_sweep *sw, size_t a, double x, int sig);

/* sweep_warnings.c: the warnings of every row and item (said_warning,
 * in row order), each sentence numbered from 1 in order of first
 * appearance. Sentences that differ only in their figures (a canopy still
 * filling at impact, so far along its fill time in each row) are one
 * warning, numbered once: said with each figure that differs as its
 * least and greatest over the rows ("46.3 to 70.1 %"). */
typedef struct sweep_marks {
    const plumb_sweep *sw;
    said_warning *s;       /* every warning of every row and item, n of them */
    size_t n;
    size_t *num;           /* s[e]'s number, 1 .. n_distinct */
    size_t n_distinct;
    size_t *row_start;     /* row r's are s[row_start[r] .. row_start[r + 1]) */
    char **said;           /* warning d's sentence over its rows, said[d - 1] */
} sweep_marks;

/* Makes m for sw; 0 when out of memory (w->nomem set, m empty). Close
 * with plumbp_sweep_marks_close either way. */
int plumbp_sweep_marks_open(writer *w, const plumb_sweep *sw, sweep_marks *m);
void plumbp_sweep_marks_close(sweep_marks *m);

/* The numbers of the warnings of row `row`, item `item` (SIZE_MAX: of any
 * item), ascending, each after `prefix` and separated by `sep` ("W1,W3"
 * for text, "1;3" for CSV) in buf; "" when it has none. */
const char *plumbp_sweep_mark(const sweep_marks *m, size_t row, size_t item, const char *prefix,
                              const char *sep, char *buf, size_t size);

/* The text's Warnings block, "  W1  SENTENCE (2 of 5 rows: 20 m, 40 m)"
 * (so many rows, and how many more are marked W1; or, when the table had
 * no room for marks, `marked` 0, where to find them), and the CSV's "# warning 1: SENTENCE (2 of 5 rows)"
 * lines. */
void plumbp_sweep_text_warnings(writer *w, const sweep_marks *m, int marked);
void plumbp_sweep_csv_warnings(writer *w, const sweep_marks *m);

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
