/*
 * sweep_warnings.c - the warnings of a sweep (plumb_report_sweep): each
 * sentence said once over the rows, with the rows it is in; for the text
 * table (sweep_table.c) and the CSV comment lines (sweep_data.c).
 */
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/common.h"
#include "report/sweep_int.h"

/* Calls fn once for each distinct warning of any row and item of a sweep
 * as shown (the same sentence from rows whose figures differ only beyond
 * the digits shown is one), with the number of rows it appears in. */
void plumbp_each_sweep_warning(writer *w, const plumb_sweep *sw,
                               void (*fn)(writer *w, const char *text, size_t rows, size_t of))
{
    size_t nr = plumb_sweep_row_count(sw), n = 0;
    const plumb_fall_report **reps = calloc(nr ? nr : 1, sizeof *reps);
    if (!reps) {
        w->nomem = 1;
        return;
    }
    for (size_t i = 0; i < nr; i++)
        reps[i] = &plumb_sweep_row_at(sw, i)->report;
    said_warning *s = plumbp_said_warnings(w, reps, nr, &n);
    for (size_t e = 0; s && e < n; e++) {
        if (plumbp_said_before(s, e) < e)
            continue;
        size_t rows = 0, last = SIZE_MAX;
        for (size_t f = e; f < n; f++)
            if (s[f].report != last && strcmp(s[f].text, s[e].text) == 0) {
                last = s[f].report;
                rows++;
            }
        fn(w, s[e].text, rows, nr);
    }
    plumbp_said_free(s, n);
    free(reps);
}

void plumbp_sweep_text_warning(writer *w, const char *text, size_t rows, size_t of)
{
    char line[PLUMB_WARNING * 2 + 64];
    snprintf(line, sizeof line, "%s (%zu of %zu rows)", text, rows, of);
    wrapped(w, "  - ", line);
}

int plumbp_sweep_has_warnings(const plumb_sweep *sw)
{
    for (size_t i = 0; i < plumb_sweep_row_count(sw); i++) {
        const plumb_fall_report *rep = &plumb_sweep_row_at(sw, i)->report;
        for (size_t it = 0; it < rep->n_items; it++)
            if (rep->items[it].n_warnings)
                return 1;
    }
    return 0;
}
