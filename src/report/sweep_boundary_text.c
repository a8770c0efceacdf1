/*
 * sweep_boundary_text.c - the boundary block of a two-way sweep's text
 * table (sweep_table.c): where each limit is reached, found by
 * plumb_sweep_find_boundaries (solve/sweep_boundary.c).
 */
#include <stdio.h>
#include <string.h>

#include "report/common.h"
#include "report/sweep_int.h"

/* A reason a boundary has no answer, as a line (reason_text). */
enum { REASON_TEXT = PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16 };

/* A two-way sweep as its boundary: for each value of the first input and
 * each criterion, the value of the second at which the limit is reached
 * (plumb_sweep_find_boundaries). The full figures are in CSV and JSON. */
static const char *boundary_cell(writer *w, const plumb_sweep *sw, const plumb_sweep_boundary *b,
                                 int *beyond)
{
    const plumb_range *a1 = plumb_sweep_axis(sw, 1);
    if (!b || b->status != PLUMB_OK)
        return "-";
    switch (b->outcome) {
    case PLUMB_LIMIT_FOUND: {
        char *c = slot(w);
        double lo = a1->from < a1->to ? a1->from : a1->to, hi = a1->from < a1->to ? a1->to : a1->from;
        int out = b->value < lo || b->value > hi;
        *beyond |= out;
        /* rounded to the side that keeps within the limit, as plumb limit
         * gives it: down for "up to", up for "from" */
        /* in the unit of the table's column (plumbp_sweep_si_shown); a
         * scale of the opposite sign (none so far) would round the other way */
        double x = plumbp_sweep_si_shown(w, sw, 1, b->value, b->value_si);
        snprintf(c, NUMBUF, "%s %s%s", b->limit_is_upper_bound ? "up to" : "from",
                 plumbp_sweep_num(w, sw, 1, plumbp_round_safe(x, 4, b->limit_is_upper_bound), 4),
                 out ? "*" : "");
        return c;
    }
    case PLUMB_LIMIT_UNLIMITED: return "never reached";
    case PLUMB_LIMIT_NOT_REACHED: return "not reached";
    case PLUMB_LIMIT_IMPOSSIBLE: return "exceeded throughout";
    default: return "n/a";
    }
}

/* Value i of the first input as the table shows it. */
static const char *first_value(writer *w, const plumb_sweep *sw, size_t i)
{
    const plumb_sweep_row *row = plumb_sweep_row_at(sw, i * plumb_sweep_axis(sw, 1)->n);
    return plumbp_sweep_num(w, sw, 0, plumbp_sweep_row_shown(w, sw, row, 0), 8);
}

/* The number of boundaries with an answer. */
static size_t boundary_answers(const plumb_sweep *sw, size_t nc)
{
    size_t n = 0;
    for (size_t i = 0; i < plumb_sweep_axis(sw, 0)->n; i++)
        for (size_t k = 0; k < nc; k++)
            n += plumb_sweep_boundary_at(sw, i, k)->status == PLUMB_OK;
    return n;
}

/* The distinct reasons of the boundaries with no answer that the sweep
 * kept, into seen[] (PLUMB_SWEEP_BOUNDARY_REASONS long) if not NULL;
 * *other 1 when some boundary's reason was not kept. */
static size_t reason_count(const plumb_sweep *sw, size_t nc, const plumb_diag **seen, int *other)
{
    const plumb_diag *mine[PLUMB_SWEEP_BOUNDARY_REASONS];
    size_t n = 0;
    *other = 0;
    if (!seen)
        seen = mine;
    for (size_t i = 0; i < plumb_sweep_axis(sw, 0)->n; i++)
        for (size_t k = 0; k < nc; k++) {
            if (plumb_sweep_boundary_at(sw, i, k)->status == PLUMB_OK)
                continue;
            const plumb_diag *why = plumb_sweep_boundary_why(sw, i, k);
            size_t e = 0;
            while (why && e < n && seen[e] != why)
                e++;
            if (!why)
                *other = 1;
            else if (e == n && n < PLUMB_SWEEP_BOUNDARY_REASONS)
                seen[n++] = why;
        }
    return n;
}

/* A reason as a clause: the diagnostic, without the key when it is the
 * one solved for (the sentence names it); when none was kept, where to
 * find it. */
static void reason_text(const plumb_diag *why, const plumb_range *a1, char *buf, size_t size)
{
    if (!why)
        snprintf(buf, size, "%s", "another reason: `plumb limit` with --set at that value "
                 "says which");
    else if (!why->file[0] && strcmp(why->key, a1->key) == 0)
        snprintf(buf, size, "%s", why->message);
    else
        plumb_diag_format(why, buf, size);
}

/* The legend of "-": no answer at that value, and each reason once. */
static void missing_reasons(writer *w, const plumb_sweep *sw, size_t nc)
{
    const plumb_diag *seen[PLUMB_SWEEP_BOUNDARY_REASONS];
    int other;
    size_t n = reason_count(sw, nc, seen, &other);
    char why[REASON_TEXT], text[REASON_TEXT + 64];
    if (n + (size_t)other == 1) {
        reason_text(n ? seen[0] : NULL, plumb_sweep_axis(sw, 1), why, sizeof why);
        snprintf(text, sizeof text, "no answer at that value: %s", why);
        wrapped(w, "  - = ", text);
        return;
    }
    put(w, "  - = no answer at that value, for these reasons:\n");
    for (size_t e = 0; e <= n; e++) {
        if (e == n && !other)
            break;
        reason_text(e < n ? seen[e] : NULL, plumb_sweep_axis(sw, 1), why, sizeof why);
        wrapped(w, "      ", why);
    }
}

/* The last dotted part of a key, after its last dot outside brackets
 * ("mass" of "items[box of M12 bolts].mass"). */
static const char *key_last_part(const char *key)
{
    const char *last = key;
    int depth = 0;
    for (const char *p = key; *p; p++) {
        depth += *p == '[' ? 1 : *p == ']' ? -1 : 0;
        if (*p == '.' && depth == 0 && p[1])
            last = p + 1;
    }
    return last;
}

void plumbp_sweep_text_boundary(writer *w, const plumb_sweep *sw)
{
    const plumb_range *a0 = plumb_sweep_axis(sw, 0), *a1 = plumb_sweep_axis(sw, 1);
    size_t nc = plumb_sweep_boundary_criteria(sw);
    if (nc == 0) {
        put(w, "\nNo boundary was computed; every figure is in --format csv or json.\n");
        return;
    }
    const plumb_sweep_row *r0 = plumbp_sweep_first_row(sw);
    int inv = r0->report.n_items > 1;
    char text[PLUMB_NAME + PLUMB_DIAG_KEY * 3 + 3 * PLUMB_UNIT_TEXT + REASON_TEXT + 320];
    char who[PLUMB_NAME + PLUMB_DIAG_KEY + 64] = "";
    const char *name = r0->report.items[plumb_sweep_boundary_item(sw)].spec->name;
    const char *item_key = plumb_sweep_boundary_item_key(sw);
    /* the item judged, and why that one: no other item depends on its key */
    if (inv && item_key)
        snprintf(who, sizeof who, " (%s, the item whose %s is varied)", name, item_key);
    else if (inv)
        snprintf(who, sizeof who, " (the item with the highest energy, %s)", name);
    int other;
    if (boundary_answers(sw, nc) == 0 && reason_count(sw, nc, NULL, &other) == 1 && !other) {
        /* one reason for every value: said once, not as a table of dashes */
        char why[REASON_TEXT];
        reason_text(plumb_sweep_boundary_why(sw, 0, 0), a1, why, sizeof why);
        snprintf(text, sizeof text, "Where each limit is reached%s: not found for %s; %s.", who,
                 a1->key, why);
        put(w, "\n");
        wrapped(w, "", text);
        put(w, "Every row's figures are in --format csv and --format json.\n");
        return;
    }
    const char *u0 = plumbp_sweep_axis_unit(w, sw, 0), *u1 = plumbp_sweep_axis_unit(w, sw, 1);
    snprintf(text, sizeof text,
             "Where each limit is reached%s: the %s%s%s%s at which the impact energy "
             "equals the criterion's limit, for each %s%s%s%s (plumb limit's solver); within "
             "the limit up to or from that value.", who,
             a1->key, u1[0] ? " (" : "", u1, u1[0] ? ")" : "",
             a0->key, u0[0] ? " (" : "", u0, u0[0] ? ")" : "");
    put(w, "\n");
    wrapped(w, "", text);
    /* Columns headed C1..Cn as in the legend below; each as wide as its
     * widest cell, in blocks of as many as fit in TABLE_WIDTH columns. */
    const plumb_item_report *it0 = &r0->report.items[0];
    size_t wc[PLUMB_MAX_VERDICTS], wc_max = 0;
    char head[PLUMB_MAX_VERDICTS][PLUMB_CRIT_ID + 8];
    int missing = 0, beyond = 0;
    for (size_t k = 0; k < nc && k < PLUMB_MAX_VERDICTS; k++) {
        const plumb_criterion *c = plumb_sweep_boundary_criterion(sw, k);
        snprintf(head[k], sizeof head[k], "%s", c->id);
        for (size_t v = 0; v < it0->n_verdicts; v++)
            if (strcmp(it0->verdicts[v].criterion->id, c->id) == 0)
                snprintf(head[k], sizeof head[k], "C%zu", v + 1);
        wc[k] = shown_width(head[k]);
        for (size_t i = 0; i < a0->n; i++) {
            int dummy = 0;
            size_t cw = shown_width(boundary_cell(w, sw, plumb_sweep_boundary_at(sw, i, k), &dummy));
            if (cw > wc[k])
                wc[k] = cw;
        }
        wc_max = wc[k] > wc_max ? wc[k] : wc_max;
    }
    if (nc > PLUMB_MAX_VERDICTS)
        nc = PLUMB_MAX_VERDICTS;
    /* The key's column is headed by the whole key, or by its last part
     * when the whole leaves no room beside it for a criterion's column
     * (an item named in the key: the sentence above names it whole). */
    const char *khead = a0->key;
    if (shown_width(khead) + wc_max + SWEEP_GAP > TABLE_WIDTH)
        khead = key_last_part(khead);
    size_t wk = shown_width(khead) > SWEEP_KEY_COL ? shown_width(khead) : SWEEP_KEY_COL;
    /* the first input's values, each from the first row of its value (row
     * i * a1->n: the first range varies slowest) */
    for (size_t i = 0; i < a0->n; i++)
        if (shown_width(first_value(w, sw, i)) > wk)
            wk = shown_width(first_value(w, sw, i));
    for (size_t k0 = 0; k0 < nc;) {
        size_t k1 = k0, used = wk;
        while (k1 < nc && (k1 == k0 || used + wc[k1] + SWEEP_GAP <= TABLE_WIDTH))
            used += wc[k1++] + SWEEP_GAP;
        if (k0 > 0)
            put(w, "\n");
        pad(w, khead, wk, 1);
        for (size_t k = k0; k < k1; k++)
            pad(w, head[k], wc[k] + SWEEP_GAP, 1);
        put(w, "\n");
        for (size_t i = 0; i < a0->n; i++) {
            pad(w, first_value(w, sw, i), wk, 1);
            for (size_t k = k0; k < k1; k++) {
                const plumb_sweep_boundary *b = plumb_sweep_boundary_at(sw, i, k);
                missing |= !b || b->status != PLUMB_OK;
                pad(w, boundary_cell(w, sw, b, &beyond), wc[k] + SWEEP_GAP, 1);
            }
            put(w, "\n");
        }
        k0 = k1;
    }
    if (beyond) { /* the second input's first and last values: rows 0 and a1->n - 1 */
        const plumb_sweep_row *lo = plumb_sweep_row_at(sw, 0), *hi = plumb_sweep_row_at(sw, a1->n - 1);
        put(w, "  * = beyond the range swept (%s to %s)\n",
            plumbp_sweep_num(w, sw, 1, plumbp_sweep_row_shown(w, sw, lo, 1), 8),
            plumbp_sweep_num(w, sw, 1, plumbp_sweep_row_shown(w, sw, hi, 1), 8));
    }
    if (missing)
        missing_reasons(w, sw, nc);
    put(w, "Every row's figures are in --format csv and --format json.\n");
}
