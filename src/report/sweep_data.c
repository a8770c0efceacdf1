/*
 * sweep_data.c - a sweep for programs (plumb_report_sweep, sweep_table.c):
 * CSV, one line per row and item, and JSON, every row with its values and
 * its fall report or its error.
 */
#include <ctype.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/common.h"
#include "report/sweep_int.h"

/* A unit as the end of a CSV header, as every other header ends
 * (speed_m_s, energy_ft_lbf, density_lb_ft3, temperature_degf): lower
 * case, "°" as "deg", "²" and "³" as 2 and 3, any other mark between
 * words one '_'. "" for no unit. */
static void csv_unit_suffix(const char *u, char *buf, size_t size)
{
    size_t n = 0;
    int gap = 0;
    for (const unsigned char *p = (const unsigned char *)u; *p && n + 4 < size;) {
        const char *put_s = NULL;
        size_t skip = 1;
        if (p[0] == 0xC2 && p[1] == 0xB0)
            put_s = "deg", skip = 2;
        else if (p[0] == 0xC2 && p[1] == 0xB2)
            put_s = "2", skip = 2;
        else if (p[0] == 0xC2 && p[1] == 0xB3)
            put_s = "3", skip = 2;
        else if (isalnum(*p))
            put_s = NULL;
        else if (*p == '^')
            put_s = "";
        else
            put_s = "_";
        if (put_s && strcmp(put_s, "_") == 0) {
            gap = n > 0;
        } else {
            if (gap)
                buf[n++] = '_';
            gap = 0;
            if (put_s)
                for (const char *q = put_s; *q && n + 1 < size; q++)
                    buf[n++] = *q;
            else
                buf[n++] = (char)tolower(*p);
        }
        while (skip-- > 0 && *p)
            p++;
    }
    buf[n] = '\0';
}

/* The header of a varied key's column: "release.height_ft", the key and
 * its unit's suffix (csv_unit_suffix), then the comma. */
static void csv_key_head(writer *w, const char *key, const char *unit)
{
    char suffix[PLUMB_UNIT_TEXT * 2], text[PLUMB_DIAG_KEY + sizeof suffix + 2];
    csv_unit_suffix(unit, suffix, sizeof suffix);
    snprintf(text, sizeof text, "%s%s%s", key, suffix[0] ? "_" : "", suffix);
    csv_field(w, text);
    put(w, ",");
}

/* A row's varied values: each as the text shows it (the report's units),
 * then as typed when that is another unit (plumbp_sweep_axis_as_typed). */
static void csv_key_cells(writer *w, const plumb_sweep *sw, const plumb_sweep_row *row)
{
    for (size_t a = 0; a < plumb_sweep_axis_count(sw); a++) {
        put(w, "%s,", csvnum(w, plumbp_sweep_row_shown(w, sw, row, a)));
        if (!plumbp_sweep_axis_as_typed(w, sw, a))
            put(w, "%s,", csvnum(w, plumbp_sweep_row_value(sw, row, a)));
    }
}

void plumbp_sweep_csv(writer *w, const plumb_sweep *sw)
{
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    const plumb_sweep_row *r0 = plumbp_sweep_first_row(sw);
    const plumb_profile *p = r0->report.profile;
    char text[PLUMB_CRIT_TEXT * 4 + PLUMB_DIAG_FILE + NUMBUF * 2], quoted[PLUMB_CRIT_TEXT * 2];
    plumbp_csv_cautions(w);
    snprintf(text, sizeof text, "profile: %s (%s), sha256 %s", plumb_profile_name(p),
             plumb_profile_path(p), plumb_profile_sha256(p));
    csv_comment(w, text);
    const plumb_item_report *first = &r0->report.items[0];
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        int sig = CSV_DIGITS; /* as many figures as the row that needs the most */
        for (size_t i = 0; i < nr; i++) {
            const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
            int s = row->status == PLUMB_OK ? plumbp_report_limit_sig(&row->report, k, CSV_DIGITS)
                                            : CSV_DIGITS;
            sig = s > sig ? s : sig;
        }
        snprintf(text, sizeof text, "criterion %s: %s, limit %s, source: %s, status %s", c->id,
                 c->name, plumbp_csv_limit_at(w, c->energy_limit_j, sig),
                 plumbp_t_source(w, c, quoted, sizeof quoted),
                 c->status[0] ? c->status : "not given");
        csv_comment(w, text);
    }
    sweep_marks marks;
    plumbp_sweep_marks_open(w, sw, &marks);
    plumbp_sweep_csv_warnings(w, &marks);
    if (plumb_sweep_failed_count(sw) > 0) {
        snprintf(text, sizeof text, "%zu of %zu rows could not be computed: their figures are "
                 "empty and the last column says why", plumb_sweep_failed_count(sw), nr);
        csv_comment(w, text);
    }
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        csv_key_head(w, ax->key, plumbp_sweep_axis_unit(w, sw, a));
        if (!plumbp_sweep_axis_as_typed(w, sw, a))
            csv_key_head(w, ax->key, unit_shown(w, ax->unit));
    }
    size_t n_cols = plumbp_csv_header_cols(w, first);
    put(w, ",warnings,error\n");
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status != PLUMB_OK) {
            char why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            csv_key_cells(w, sw, row);
            for (size_t c = 0; c < n_cols + 1; c++) /* the figures, then no warnings */
                put(w, ",");
            plumbp_sweep_row_error(row, why, sizeof why);
            csv_field(w, why);
            put(w, "\n");
            continue;
        }
        for (size_t it = 0; it < row->report.n_items; it++) {
            csv_key_cells(w, sw, row);
            plumbp_csv_item_cols(w, &row->report.items[it],
                                 plumb_profile_item_number(row->report.profile, it));
            char mark[128]; /* this row's and item's warnings by number, "1;3" */
            put(w, ",%s,\n", plumbp_sweep_mark(&marks, i, it, "", ";", mark, sizeof mark));
        }
    }
    plumbp_sweep_marks_close(&marks);
}

json_t *plumbp_sweep_json(jctx *j, const plumb_report_options *opt, const plumb_sweep *sw,
                          item_air *const *ia)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    json_t *vary = jarr(j);
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        json_t *o = jobj(j);
        jset(j, o, "key", jstr(j, ax->key));
        jset(j, o, "unit", jstr(j, ax->unit));
        jset(j, o, "from", jreal(j, ax->from));
        jset(j, o, "to", jreal(j, ax->to));
        jset(j, o, "step", jreal(j, ax->step));
        jset(j, o, "count", json_integer((json_int_t)ax->n));
        jpush(j, vary, o);
    }
    jset(j, root, "vary", vary);
    jset(j, root, "failed_rows", jint(j, plumb_sweep_failed_count(sw)));
    json_t *rows = jarr(j);
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        const plumb_fall_report *rep = &row->report;
        json_t *o = jobj(j);
        json_t *vals = jobj(j), *vals_si = jobj(j);
        for (size_t a = 0; a < na; a++) {
            jset(j, vals, plumb_sweep_axis(sw, a)->key, jreal(j, plumbp_sweep_row_value(sw, row, a)));
            jset(j, vals_si, plumb_sweep_axis(sw, a)->key, jreal(j, row->value_si[a]));
        }
        jset(j, o, "values_as_given", vals); /* in each range's unit, see "vary" */
        jset(j, o, "values_si", vals_si);
        if (row->status != PLUMB_OK) {
            /* no figures: why, as the command line would print it */
            char why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            plumbp_sweep_row_error(row, why, sizeof why);
            json_t *e = jobj(j);
            jset(j, e, "message", jstr(j, why));
            jset(j, e, "kind", jstr(j, plumb_strerror(row->status)));
            jset(j, e, "computation_failed",
                 json_boolean(!plumb_status_is_input_error(row->status)));
            jset(j, o, "error", e);
            jpush(j, rows, o);
            continue;
        }
        plumbp_j_items_into(j, o, rep, ia[i]);
        jpush(j, rows, o);
    }
    jset(j, root, "rows", rows);
    jset(j, root, "profile", plumbp_j_profile(j, plumbp_sweep_first_row(sw)->report.profile));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}
