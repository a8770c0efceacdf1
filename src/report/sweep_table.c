/*
 * sweep_table.c - the table of a sweep (plumb_report_sweep): one row per
 * value of the varied inputs, in text, CSV and JSON, with each row's
 * verdicts and the warnings counted over the rows.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "io/keys.h"
#include "report/common.h"

/* ---- sweep table --------------------------------------------------------- */

shown plumbp_show_dim(const writer *w, plumb_dim dim, double si)
{
    double ft = PLUMB_FT_M;
    switch (dim) {
    case PLUMB_DIM_LENGTH:
        return w->us ? (shown){si / ft, "ft"} : (shown){si, "m"};
    case PLUMB_DIM_MASS:
        return w->us ? (shown){si / PLUMB_LB_KG, "lb"} : (shown){si, "kg"};
    case PLUMB_DIM_TIME:
        return (shown){si, "s"};
    case PLUMB_DIM_SPEED:
        return w->us ? (shown){si / ft, "ft/s"} : (shown){si, "m/s"};
    case PLUMB_DIM_AREA:
        return w->us ? (shown){si / (ft * ft), "ft²"} : (shown){si, "m²"};
    case PLUMB_DIM_VOLUME:
        return w->us ? (shown){si / (ft * ft * ft), "ft³"} : (shown){si, "m³"};
    case PLUMB_DIM_ENERGY:
        return w->us ? (shown){si / PLUMB_FT_LBF_J, "ft·lbf"} : (shown){si, "J"};
    case PLUMB_DIM_FORCE:
        return w->us ? (shown){si / LBF_N, "lbf"} : (shown){si, "N"};
    case PLUMB_DIM_ANGLE:
        return (shown){si, "°"};
    case PLUMB_DIM_TEMPERATURE:
        return w->us ? (shown){si * FAHRENHEIT_PER_K - FAHRENHEIT_ZERO_OFFSET, "°F"}
                     : (shown){si, "K"};
    case PLUMB_DIM_TEMP_DIFF:
        return w->us ? (shown){si * FAHRENHEIT_PER_K, "°F"} : (shown){si, "K"};
    case PLUMB_DIM_PRESSURE:
        return w->us ? (shown){si / INHG_PA, "inHg"} : (shown){si / HPA_PA, "hPa"};
    case PLUMB_DIM_DENSITY:
        return w->us ? (shown){si * ft * ft * ft / PLUMB_LB_KG, "lb/ft³"} : (shown){si, "kg/m³"};
    case PLUMB_DIM_LAPSE:
        return (shown){si * 1000.0, "K/km"};
    case PLUMB_DIM_FRACTION:
    case PLUMB_DIM_NONE:
    default:
        return (shown){si, ""};
    }
}

/* 1 when `key` (in any written form: items[N].shape.length,
 * payload.shape.edges[1]) is a size of the body itself: a shape's
 * diameter, length, edges or thickness, or a sphere drag model's
 * diameter. A canopy's diameter is not: it is sized with its area. */
static int body_size_key(const char *key)
{
    const plumbp_key *k = plumbp_key_find(key, NULL, NULL);
    return k && k->dim == PLUMB_DIM_LENGTH &&
           (strncmp(k->key, "payload.shape.", strlen("payload.shape.")) == 0 ||
            strcmp(k->key, "payload.drag.diameter") == 0);
}

/* A value of input `key` in the display units: as plumbp_show_dim, but in
 * US units a wind speed is in mph, as a crew reads it (plumbp_t_wind), and
 * a size of the body itself in inches (plumbp_t_size). */
shown plumbp_show_key(const writer *w, const char *key, plumb_dim dim, double si)
{
    if (w->us && dim == PLUMB_DIM_SPEED && strncmp(key, "wind.", 5) == 0)
        return (shown){si / MPH_M_S, "mph"};
    if (w->us && dim == PLUMB_DIM_LENGTH && body_size_key(key))
        return (shown){si / INCH_M, "in"};
    return plumbp_show_dim(w, dim, si);
}

/* Numeric columns of a sweep row, and the spaces between columns. */
enum {
    SWEEP_NUM_COLS = 6,
    SWEEP_GAP = 2,
    SWEEP_KEY_COL = 15,
    SWEEP_KEY_HEAD = 16,
    SWEEP_NAME_MIN = 4,
    SWEEP_NAME_ROOM = 12 /* narrower than this, a name goes on a line of its own */
};

/* "C1".."Cn" legend of the criteria a row was judged against. */
static void text_criteria_legend(writer *w, const plumb_item_report *first)
{
    if (first->n_verdicts == 0)
        return;
    put(w, "\nCriteria (ratio = energy / limit)\n");
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        char lead[32], text[PLUMB_CRIT_TEXT * 2 + PLUMB_CRIT_ID + NUMBUF + 64];
        snprintf(lead, sizeof lead, "  C%zu  ", k + 1);
        snprintf(text, sizeof text, "%s, limit %s%s; %s [%s]%s%s%s", c->name,
                 plumbp_t_limit_energy(w, c->energy_limit_j),
                 c->kind == PLUMB_CRIT_HELMET_TEST ? " (helmet test, not a safe limit)" : "",
                 c->source[0] ? c->source : "source not given", c->id,
                 plumbp_status_note(c)[0] ? " (" : "", plumbp_status_note(c),
                 plumbp_status_note(c)[0] ? ")" : "");
        wrapped(w, lead, text);
    }
}

/* The leading columns of a sweep table: the varied keys' values, and for
 * an inventory the item's name in a column name_w wide. */
typedef struct sweep_cols {
    size_t na;
    const size_t *wkey;
    int inv;
    size_t name_w;
    int own_line; /* 1: no room for a name column; each name on a line of its own */
} sweep_cols;

/* The header of a varied key's column: the key, or its last part when it
 * is longer than SWEEP_KEY_HEAD or is one of two (the lines above the
 * table name the whole keys), so the figures and names keep their room. */
static const char *sweep_key_head(const char *key, size_t n_axes)
{
    const char *dot = strrchr(key, '.');
    return (shown_width(key) > SWEEP_KEY_HEAD || n_axes > 1) && dot ? dot + 1 : key;
}

/* The two header lines of the leading columns: names (units = 0) or units. */
static void sweep_heads(writer *w, const plumb_sweep *sw, const sweep_cols *c,
                        const char *const *khead, int units)
{
    for (size_t a = 0; a < c->na; a++)
        pad(w, units ? unit_shown(w, plumb_sweep_axis(sw, a)->unit) : khead[a],
            c->wkey[a] + (a ? SWEEP_GAP : 1), 1);
    if (c->inv && !c->own_line) {
        put(w, "  ");
        pad(w, units ? "" : "item", c->name_w, 0);
    }
}

static void sweep_name_continued(writer *w, const sweep_cols *c, const char *rest);

/* The leading columns of item `it` of a row: the values on the row's first
 * line only, then the first line of the item's name. Returns the rest of
 * the name, for sweep_name_continued. */
static const char *sweep_lead(writer *w, const sweep_cols *c, const plumb_sweep_row *row,
                              size_t it)
{
    for (size_t a = 0; a < c->na; a++)
        pad(w, it == 0 ? plumbp_gnum(w, row->value[a], 8) : "", c->wkey[a] + (a ? SWEEP_GAP : 1),
            1);
    if (!c->inv)
        return "";
    char part[PLUMB_NAME];
    const char *rest = wrap_cell(row->report.items[it].spec->name, c->name_w, part, sizeof part);
    put(w, "  ");
    if (!c->own_line) {
        pad(w, part, c->name_w, 0);
        return rest;
    }
    /* the name on lines of its own, the figures on the next line */
    put(w, "%s\n", part);
    sweep_name_continued(w, c, rest);
    size_t keys_w = 0;
    for (size_t a = 0; a < c->na; a++)
        keys_w += c->wkey[a] + (a ? SWEEP_GAP : 1);
    put(w, "%*s", (int)keys_w, "");
    return "";
}

/* The continuation lines of an item's name wrapped in its column. */
static void sweep_name_continued(writer *w, const sweep_cols *c, const char *rest)
{
    size_t keys_w = 0;
    for (size_t a = 0; a < c->na; a++)
        keys_w += c->wkey[a] + (a ? SWEEP_GAP : 1);
    cell_continued(w, keys_w + SWEEP_GAP, rest, c->name_w);
}

/* A ratio with its verdict beside it, "1.00 EXCEEDS" / "0.997 within", so
 * that a ratio rounded to 1.00 still shows which side of the limit it is. */
static const char *ratio_cell(writer *w, const plumb_verdict *v)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s %s", num(w, v->ratio, RATIO_SIG), v->exceeds ? "EXCEEDS" : "within");
    return b;
}

/* The figure of numeric column k of a sweep row (speed, energy in the
 * display unit, energy in the other, time, drift, bearing). A fall with no
 * drift has no bearing. */
static const char *sweep_num_cell(writer *w, const plumb_item_report *item, int k)
{
    const plumb_fall_result *r = &item->result;
    double ft = PLUMB_FT_M;
    switch (k) {
    case 0:
        return num(w, w->us ? r->speed_m_s / ft : r->speed_m_s, TEXT_SIG);
    case 1:
        return num(w, w->us ? r->energy_j / PLUMB_FT_LBF_J : r->energy_j, TEXT_SIG);
    case 2:
        return num(w, w->us ? r->energy_j : r->energy_j / PLUMB_FT_LBF_J, TEXT_SIG);
    case 3:
        return num(w, r->time_s, TEXT_SIG);
    case 4:
        return r->drift_m < DRIFT_SHOWN_M ? "0" : num(w, w->us ? r->drift_m / ft : r->drift_m,
                                                     TEXT_SIG);
    default:
        return r->drift_m < DRIFT_SHOWN_M ? "-" : plumbp_fixed(w, r->bearing_deg, 0);
    }
}

/* Calls fn once for each distinct warning of any row and item of a sweep,
 * with the number of rows it appears in. */
static void each_sweep_warning(writer *w, const plumb_sweep *sw,
                               void (*fn)(writer *w, const char *text, size_t rows, size_t of))
{
    size_t nr = plumb_sweep_row_count(sw);
    for (size_t i = 0; i < nr; i++) {
        const plumb_fall_report *rep = &plumb_sweep_row_at(sw, i)->report;
        for (size_t it = 0; it < rep->n_items; it++) {
            const plumb_item_report *item = &rep->items[it];
            for (size_t k = 0; k < item->n_warnings; k++) {
                const char *text = item->warnings[k];
                int seen = 0; /* already reported from an earlier row or item */
                for (size_t j = 0; j <= i && !seen; j++) {
                    const plumb_fall_report *rj = &plumb_sweep_row_at(sw, j)->report;
                    size_t last = j < i ? rj->n_items : it;
                    for (size_t t = 0; t < last && !seen; t++)
                        seen = plumbp_item_has_warning(&rj->items[t], text);
                }
                if (seen)
                    continue;
                size_t rows = 0;
                for (size_t j = 0; j < nr; j++) {
                    const plumb_fall_report *rj = &plumb_sweep_row_at(sw, j)->report;
                    int in = 0;
                    for (size_t t = 0; t < rj->n_items && !in; t++)
                        in = plumbp_item_has_warning(&rj->items[t], text);
                    rows += (size_t)in;
                }
                fn(w, text, rows, nr);
            }
        }
    }
}

static void text_sweep_warning(writer *w, const char *text, size_t rows, size_t of)
{
    char line[PLUMB_WARNING + 64];
    snprintf(line, sizeof line, "%s (%zu of %zu rows)", text, rows, of);
    wrapped(w, "  - ", line);
}

static void csv_sweep_warning(writer *w, const char *text, size_t rows, size_t of)
{
    char line[PLUMB_WARNING + 64];
    snprintf(line, sizeof line, "warning: %s (%zu of %zu rows)", text, rows, of);
    csv_comment(w, line);
}

static int sweep_has_warnings(const plumb_sweep *sw)
{
    for (size_t i = 0; i < plumb_sweep_row_count(sw); i++) {
        const plumb_fall_report *rep = &plumb_sweep_row_at(sw, i)->report;
        for (size_t it = 0; it < rep->n_items; it++)
            if (rep->items[it].n_warnings)
                return 1;
    }
    return 0;
}

/* The first row with figures (plumb_sweep_run fails when there is none). */
static const plumb_sweep_row *first_computed_row(const plumb_sweep *sw)
{
    for (size_t i = 0; i < plumb_sweep_row_count(sw); i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status == PLUMB_OK && row->report.n_items > 0)
            return row;
    }
    return NULL;
}

/* "release.height = 0 m, wind.speed = 5 kn": the values of a row, in b. */
enum { ROW_VALUES = PLUMB_MAX_AXES * (PLUMB_DIAG_KEY + PLUMB_UNIT_TEXT + NUMBUF) };
static void row_values(writer *w, const plumb_sweep *sw, const plumb_sweep_row *row, char *b,
                       size_t size)
{
    b[0] = '\0';
    for (size_t a = 0; a < plumb_sweep_axis_count(sw); a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        size_t len = strlen(b);
        snprintf(b + len, size - len, "%s%s = %s%s%s", a ? ", " : "", ax->key,
                 plumbp_gnum(w, row->value[a], 10), ax->unit[0] ? " " : "",
                 unit_shown(w, ax->unit));
    }
}

/* The diagnostic of a row that has no figures, as one line. */
static void row_error_text(const plumb_sweep_row *row, char *buf, size_t size)
{
    plumb_diag_format(&row->error, buf, size);
}

/* A two-way sweep as its boundary: for each value of the first input and
 * each criterion, the value of the second at which the limit is reached
 * (plumb_sweep_find_boundaries). The full figures are in CSV and JSON. */
static const char *boundary_cell(writer *w, const plumb_sweep_boundary *b, const plumb_range *a1,
                                 int *beyond)
{
    if (!b || b->status != PLUMB_OK)
        return "-";
    switch (b->outcome) {
    case PLUMB_LIMIT_FOUND: {
        char *c = slot(w);
        double lo = a1->from < a1->to ? a1->from : a1->to, hi = a1->from < a1->to ? a1->to : a1->from;
        int out = b->value < lo || b->value > hi;
        *beyond |= out;
        snprintf(c, NUMBUF, "%s %s%s", b->limit_is_upper_bound ? "up to" : "from",
                 plumbp_gnum(w, b->value, 4), out ? "*" : "");
        return c;
    }
    case PLUMB_LIMIT_UNLIMITED: return "never reached";
    case PLUMB_LIMIT_IMPOSSIBLE: return "exceeded throughout";
    default: return "n/a";
    }
}

static void text_boundary(writer *w, const plumb_sweep *sw)
{
    const plumb_range *a0 = plumb_sweep_axis(sw, 0), *a1 = plumb_sweep_axis(sw, 1);
    size_t nc = plumb_sweep_boundary_criteria(sw);
    if (nc == 0) {
        put(w, "\nNo boundary was computed; every figure is in --format csv or json.\n");
        return;
    }
    const plumb_sweep_row *r0 = first_computed_row(sw);
    int inv = r0->report.n_items > 1;
    char text[PLUMB_NAME + PLUMB_DIAG_KEY * 2 + 3 * PLUMB_UNIT_TEXT + 320];
    snprintf(text, sizeof text,
             "Where each limit is reached%s%s%s: the %s%s%s%s at which the impact energy "
             "equals the criterion's limit, for each %s%s%s%s (plumb limit's solver); within "
             "the limit up to or from that value.",
             inv ? " (the item with the highest energy, " : "",
             inv ? r0->report.items[plumb_sweep_boundary_item(sw)].spec->name : "", inv ? ")" : "",
             a1->key, a1->unit[0] ? " (" : "", unit_shown(w, a1->unit), a1->unit[0] ? ")" : "",
             a0->key, a0->unit[0] ? " (" : "", unit_shown(w, a0->unit), a0->unit[0] ? ")" : "");
    put(w, "\n");
    wrapped(w, "", text);
    /* Columns headed C1..Cn as in the legend below; each as wide as its
     * widest cell, in blocks of as many as fit in TABLE_WIDTH columns. */
    const plumb_item_report *it0 = &r0->report.items[0];
    size_t wk = shown_width(a0->key) > SWEEP_KEY_COL ? shown_width(a0->key) : SWEEP_KEY_COL;
    size_t wc[PLUMB_MAX_VERDICTS];
    char head[PLUMB_MAX_VERDICTS][PLUMB_CRIT_ID + 8];
    int missing = 0, beyond = 0;
    for (size_t i = 0; i < a0->n; i++)
        if (shown_width(plumbp_gnum(w, plumb_range_value(a0, i), 8)) > wk)
            wk = shown_width(plumbp_gnum(w, plumb_range_value(a0, i), 8));
    for (size_t k = 0; k < nc && k < PLUMB_MAX_VERDICTS; k++) {
        const plumb_criterion *c = plumb_sweep_boundary_criterion(sw, k);
        snprintf(head[k], sizeof head[k], "%s", c->id);
        for (size_t v = 0; v < it0->n_verdicts; v++)
            if (strcmp(it0->verdicts[v].criterion->id, c->id) == 0)
                snprintf(head[k], sizeof head[k], "C%zu", v + 1);
        wc[k] = shown_width(head[k]);
        for (size_t i = 0; i < a0->n; i++) {
            int dummy = 0;
            size_t cw = shown_width(boundary_cell(w, plumb_sweep_boundary_at(sw, i, k), a1, &dummy));
            if (cw > wc[k])
                wc[k] = cw;
        }
    }
    if (nc > PLUMB_MAX_VERDICTS)
        nc = PLUMB_MAX_VERDICTS;
    for (size_t k0 = 0; k0 < nc;) {
        size_t k1 = k0, used = wk;
        while (k1 < nc && (k1 == k0 || used + wc[k1] + SWEEP_GAP <= TABLE_WIDTH))
            used += wc[k1++] + SWEEP_GAP;
        if (k0 > 0)
            put(w, "\n");
        pad(w, a0->key, wk, 1);
        for (size_t k = k0; k < k1; k++)
            pad(w, head[k], wc[k] + SWEEP_GAP, 1);
        put(w, "\n");
        for (size_t i = 0; i < a0->n; i++) {
            pad(w, plumbp_gnum(w, plumb_range_value(a0, i), 8), wk, 1);
            for (size_t k = k0; k < k1; k++) {
                const plumb_sweep_boundary *b = plumb_sweep_boundary_at(sw, i, k);
                missing |= !b || b->status != PLUMB_OK;
                pad(w, boundary_cell(w, b, a1, &beyond), wc[k] + SWEEP_GAP, 1);
            }
            put(w, "\n");
        }
        k0 = k1;
    }
    if (beyond)
        put(w, "  * = beyond the range swept (%s to %s)\n", plumbp_gnum(w, a1->from, 8),
            plumbp_gnum(w, a1->to, 8));
    if (missing)
        put(w, "  - = no answer at that value (the value is refused or a fall fails there)\n");
    put(w, "Every row's figures are in --format csv and --format json.\n");
}

static void text_sweep(writer *w, const plumb_report_options *opt, const plumb_sweep *sw)
{
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    const plumb_sweep_row *r0 = first_computed_row(sw);
    const plumb_profile *p = r0->report.profile;
    int inv = plumb_profile_is_inventory(p);
    const plumb_item_report *first = &r0->report.items[0];
    plumbp_text_header(w, opt, "sweep", plumb_profile_name(p));
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        double last = plumb_range_value(ax, ax->n - 1);
        const char *u = unit_shown(w, ax->unit);
        put(w, "  %s %s from %s to %s%s%s in steps of %s%s%s (%zu values)%s%s%s%s\n",
            a ? "and" : "over", ax->key, plumbp_gnum(w, ax->from, 10), plumbp_gnum(w, last, 10),
            u[0] ? " " : "", u, plumbp_gnum(w, ax->step, 10), u[0] ? " " : "", u, ax->n,
            last != ax->to ? "; the steps stop short of " : "",
            last != ax->to ? plumbp_gnum(w, ax->to, 10) : "", last != ax->to && u[0] ? " " : "",
            last != ax->to ? u : "");
    }
    put(w, "\n");
    /* Column widths: the widest header, unit or cell of each, so that no
     * two figures ever touch and a one-criterion table stays narrow. The
     * table keeps to TABLE_WIDTH columns: an item's name is wrapped onto
     * continuation lines of its own column, never cut, and criteria that
     * do not fit beside the figures get a table of their own, in blocks of
     * as many as fit, as the inventory table of `plumb fall` does. */
    size_t nv = first->n_verdicts;
    size_t wkey[PLUMB_MAX_AXES], wnum[SWEEP_NUM_COLS], wcrit[PLUMB_MAX_VERDICTS];
    const char *khead[PLUMB_MAX_AXES];
    const char *heads[SWEEP_NUM_COLS] = {"speed", "energy", "energy", "time", "drift", "bearing"};
    const char *units_si[SWEEP_NUM_COLS] = {"m/s", "J", "ft·lbf", "s", "m", "deg"};
    const char *units_us[SWEEP_NUM_COLS] = {"ft/s", "ft·lbf", "J", "s", "ft", "deg"};
    const char *const *units = w->us ? units_us : units_si;
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        khead[a] = sweep_key_head(ax->key, na);
        wkey[a] = shown_width(khead[a]);
        if (shown_width(unit_shown(w, ax->unit)) > wkey[a])
            wkey[a] = shown_width(unit_shown(w, ax->unit));
    }
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        wnum[k] = shown_width(heads[k]) > shown_width(units[k]) ? shown_width(heads[k])
                                                                : shown_width(units[k]);
    for (size_t k = 0; k < nv; k++)
        wcrit[k] = shown_width("ratio verdict");
    size_t name_w = SWEEP_NAME_MIN;
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        for (size_t a = 0; a < na; a++)
            if (shown_width(plumbp_gnum(w, row->value[a], 8)) > wkey[a])
                wkey[a] = shown_width(plumbp_gnum(w, row->value[a], 8));
        for (size_t it = 0; it < row->report.n_items; it++) {
            const plumb_item_report *item = &row->report.items[it];
            if (shown_width(item->spec->name) > name_w)
                name_w = shown_width(item->spec->name);
            for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
                if (shown_width(sweep_num_cell(w, item, (int)k)) > wnum[k])
                    wnum[k] = shown_width(sweep_num_cell(w, item, (int)k));
            for (size_t k = 0; k < nv && k < item->n_verdicts; k++)
                if (shown_width(ratio_cell(w, &item->verdicts[k])) > wcrit[k])
                    wcrit[k] = shown_width(ratio_cell(w, &item->verdicts[k]));
        }
    }
    sweep_cols c = {na, wkey, inv, 0, 0};
    size_t keys_w = 0, figs_w = 0, crit_w = 0;
    for (size_t a = 0; a < na; a++)
        keys_w += wkey[a] + (a ? SWEEP_GAP : 1);
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        figs_w += wnum[k] + SWEEP_GAP;
    for (size_t k = 0; k < nv; k++)
        crit_w += wcrit[k] + SWEEP_GAP;
    if (inv) {
        size_t room = TABLE_WIDTH > keys_w + figs_w + SWEEP_GAP
                          ? TABLE_WIDTH - keys_w - figs_w - SWEEP_GAP
                          : 0;
        c.own_line = room < SWEEP_NAME_ROOM && name_w > room;
        c.name_w = c.own_line ? TABLE_WIDTH - keys_w - SWEEP_GAP : name_w < room ? name_w : room;
    }
    size_t lead_w = keys_w + (inv && !c.own_line ? SWEEP_GAP + c.name_w : 0);
    int inline_crit = lead_w + figs_w + crit_w <= TABLE_WIDTH;
    sweep_heads(w, sw, &c, khead, 0);
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        pad(w, heads[k], wnum[k] + SWEEP_GAP, 1);
    for (size_t k = 0; inline_crit && k < nv; k++) {
        char h[32];
        snprintf(h, sizeof h, "C%zu", k + 1);
        pad(w, h, wcrit[k] + SWEEP_GAP, 1);
    }
    put(w, "\n");
    sweep_heads(w, sw, &c, khead, 1);
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        pad(w, units[k], wnum[k] + SWEEP_GAP, 1);
    for (size_t k = 0; inline_crit && k < nv; k++)
        pad(w, "ratio verdict", wcrit[k] + SWEEP_GAP, 1);
    put(w, "\n");
    size_t n_failed = 0;
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status != PLUMB_OK) {
            for (size_t a = 0; a < na; a++)
                pad(w, plumbp_gnum(w, row->value[a], 8), wkey[a] + (a ? SWEEP_GAP : 1), 1);
            put(w, "  not computed, see (%zu) below\n", ++n_failed);
            continue;
        }
        for (size_t it = 0; it < row->report.n_items; it++) {
            const plumb_item_report *item = &row->report.items[it];
            const char *rest = sweep_lead(w, &c, row, it);
            for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
                pad(w, sweep_num_cell(w, item, (int)k), wnum[k] + SWEEP_GAP, 1);
            for (size_t k = 0; inline_crit && k < item->n_verdicts; k++)
                pad(w, ratio_cell(w, &item->verdicts[k]), wcrit[k] + SWEEP_GAP, 1);
            put(w, "\n");
            sweep_name_continued(w, &c, rest);
        }
    }
    /* the verdicts, in blocks of as many criteria as fit */
    for (size_t k0 = 0; !inline_crit && k0 < nv;) {
        size_t k1 = k0, used = lead_w;
        while (k1 < nv && (k1 == k0 || used + wcrit[k1] + SWEEP_GAP <= TABLE_WIDTH))
            used += wcrit[k1++] + SWEEP_GAP;
        put(w, "\nAgainst the criteria, C%zu to C%zu (ratio = energy / limit)\n", k0 + 1, k1);
        sweep_heads(w, sw, &c, khead, 0);
        for (size_t k = k0; k < k1; k++) {
            char h[32];
            snprintf(h, sizeof h, "C%zu", k + 1);
            pad(w, h, wcrit[k] + SWEEP_GAP, 1);
        }
        put(w, "\n");
        sweep_heads(w, sw, &c, khead, 1);
        for (size_t k = k0; k < k1; k++)
            pad(w, "ratio verdict", wcrit[k] + SWEEP_GAP, 1);
        put(w, "\n");
        for (size_t i = 0; i < nr; i++) {
            const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
            if (row->status != PLUMB_OK)
                continue;
            for (size_t it = 0; it < row->report.n_items; it++) {
                const plumb_item_report *item = &row->report.items[it];
                const char *rest = sweep_lead(w, &c, row, it);
                for (size_t k = k0; k < k1 && k < item->n_verdicts; k++)
                    pad(w, ratio_cell(w, &item->verdicts[k]), wcrit[k] + SWEEP_GAP, 1);
                put(w, "\n");
                sweep_name_continued(w, &c, rest);
            }
        }
        k0 = k1;
    }
    if (na == 2)
        text_boundary(w, sw);
    if (n_failed) {
        put(w, "\nRows not computed (%zu of %zu)\n", n_failed, nr);
        size_t k = 0;
        for (size_t i = 0; i < nr; i++) {
            const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
            if (row->status == PLUMB_OK)
                continue;
            char lead[32], why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            char vals[ROW_VALUES], text[sizeof why + sizeof vals + 8];
            snprintf(lead, sizeof lead, "  (%zu) ", ++k);
            row_error_text(row, why, sizeof why);
            row_values(w, sw, row, vals, sizeof vals);
            snprintf(text, sizeof text, "%s: %s", vals, why);
            wrapped(w, lead, text);
        }
    }
    text_criteria_legend(w, first);
    if (sweep_has_warnings(sw)) {
        put(w, "\nWarnings\n");
        each_sweep_warning(w, sw, text_sweep_warning);
    }
    put(w, "\nEach row is exactly what `plumb fall` gives with --set at that value.\n");
    plumbp_text_profile(w, p);
    plumbp_caution_lines_text(w);
}

static void csv_sweep(writer *w, const plumb_sweep *sw)
{
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    const plumb_sweep_row *r0 = first_computed_row(sw);
    const plumb_profile *p = r0->report.profile;
    char text[PLUMB_CRIT_TEXT * 2 + PLUMB_DIAG_FILE + NUMBUF * 2];
    plumbp_csv_cautions(w);
    snprintf(text, sizeof text, "profile: %s (%s), sha256 %s", plumb_profile_name(p),
             plumb_profile_path(p), plumb_profile_sha256(p));
    csv_comment(w, text);
    const plumb_item_report *first = &r0->report.items[0];
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        snprintf(text, sizeof text, "criterion %s: %s, limit %s, source: %s, status %s", c->id,
                 c->name, plumbp_csv_limit(w, c->energy_limit_j), c->source[0] ? c->source : "not given",
                 c->status[0] ? c->status : "not given");
        csv_comment(w, text);
    }
    each_sweep_warning(w, sw, csv_sweep_warning);
    if (plumb_sweep_failed_count(sw) > 0) {
        snprintf(text, sizeof text, "%zu of %zu rows could not be computed: their figures are "
                 "empty and the last column says why", plumb_sweep_failed_count(sw), nr);
        csv_comment(w, text);
    }
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        snprintf(text, sizeof text, "%s%s%s", ax->key, ax->unit[0] ? " " : "",
                 unit_shown(w, ax->unit));
        csv_field(w, text);
        put(w, ",");
    }
    size_t n_cols = plumbp_csv_header_cols(w, first);
    put(w, ",error\n");
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status != PLUMB_OK) {
            char why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            for (size_t a = 0; a < na; a++)
                put(w, "%s,", csvnum(w, row->value[a]));
            for (size_t c = 0; c < n_cols; c++)
                put(w, ",");
            row_error_text(row, why, sizeof why);
            csv_field(w, why);
            put(w, "\n");
            continue;
        }
        for (size_t it = 0; it < row->report.n_items; it++) {
            for (size_t a = 0; a < na; a++)
                put(w, "%s,", csvnum(w, row->value[a]));
            plumbp_csv_item_cols(w, &row->report.items[it],
                                 plumb_profile_item_number(row->report.profile, it));
            put(w, ",\n");
        }
    }
}

static json_t *j_sweep(jctx *j, const plumb_report_options *opt, const plumb_sweep *sw,
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
            jset(j, vals, plumb_sweep_axis(sw, a)->key, jreal(j, row->value[a]));
            jset(j, vals_si, plumb_sweep_axis(sw, a)->key, jreal(j, row->value_si[a]));
        }
        jset(j, o, "values_as_given", vals); /* in each range's unit, see "vary" */
        jset(j, o, "values_si", vals_si);
        if (row->status != PLUMB_OK) {
            /* no figures: why, as the command line would print it */
            char why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            row_error_text(row, why, sizeof why);
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
    jset(j, root, "profile", plumbp_j_profile(j, first_computed_row(sw)->report.profile));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

plumb_status plumb_report_sweep(FILE *out, const plumb_report_options *opt,
                                const plumb_sweep *sw, plumb_diag *diag)
{
    plumb_report_options def;
    opt = plumbp_opts_or_default(opt, &def);
    if (!out || !sw || plumb_sweep_row_count(sw) == 0 || !first_computed_row(sw))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no sweep to write");
    size_t nr = plumb_sweep_row_count(sw);
    item_air **ia = calloc(nr, sizeof *ia);
    if (!ia)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the report");
    plumb_status st = PLUMB_OK;
    for (size_t i = 0; st == PLUMB_OK && i < nr; i++)
        if (plumb_sweep_row_at(sw, i)->status == PLUMB_OK)
            st = plumbp_prepare_fall(&plumb_sweep_row_at(sw, i)->report, &ia[i], diag);
    if (st == PLUMB_OK && opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        st = emit_json(out, &j, j_sweep(&j, opt, sw, ia), diag);
    } else if (st == PLUMB_OK) {
        writer w;
        char *buf;
        size_t len;
        st = plumbp_writer_open(&w, &buf, &len, opt->units, diag);
        if (st == PLUMB_OK) {
            if (opt->format == PLUMB_FORMAT_CSV)
                csv_sweep(&w, sw);
            else
                text_sweep(&w, opt, sw);
            st = plumbp_writer_close(&w, &buf, &len, out, diag);
        }
    }
    for (size_t i = 0; i < nr; i++)
        free(ia[i]);
    free(ia);
    return st;
}

