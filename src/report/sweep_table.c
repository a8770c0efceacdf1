/*
 * sweep_table.c - the table of a sweep (plumb_report_sweep): one row per
 * value of the varied inputs, with each row's verdicts and the warnings
 * counted over the rows, as text; CSV and JSON are sweep_data.c's.
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "io/keys.h"
#include "io/vary.h"
#include "report/common.h"
#include "report/sweep_int.h"

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
        return w->us ? (shown){si * FAHRENHEIT_PER_K * 1000.0 * ft, "°F/1000 ft"}
                     : (shown){si * 1000.0, "K/km"};
    case PLUMB_DIM_FRACTION:
    case PLUMB_DIM_NONE:
    default:
        return (shown){si, ""};
    }
}

/* Axis a's value v as shown: a direction swept through north (wind.from
 * NW:NE:22.5deg runs 315 to 405 deg, io/vary.h) as the bearing it is, from
 * 0 to 360 deg; any other value as it is. */
static double shown_value(const plumb_range *ax, double v)
{
    if (!plumbp_key_is_direction(ax->key) || strcmp(ax->unit, "deg") != 0)
        return v;
    double b = fmod(v, 360.0);
    return b < 0.0 ? b + 360.0 : b;
}

double plumbp_sweep_row_value(const plumb_sweep *sw, const plumb_sweep_row *row, size_t a)
{
    return shown_value(plumb_sweep_axis(sw, a), row->value[a]);
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


/* ---- the varied values as shown ------------------------------------------ */

/* A varied value in the report's units (plumbp_show_key, as `plumb limit`
 * gives its answer): a US report is US throughout, whatever unit the
 * range was typed in. A direction keeps to 0 .. 360 deg. */
static shown axis_display(const writer *w, const plumb_range *ax, double si)
{
    shown v = plumbp_show_key(w, ax->key, ax->dim, si);
    if (plumbp_key_is_direction(ax->key) && ax->dim == PLUMB_DIM_ANGLE) {
        v.x = fmod(v.x, 360.0);
        v.x += v.x < 0.0 ? 360.0 : 0.0;
    }
    return v;
}

/* 1 when the display value of `si` is `typed` itself (to 1e-12): the
 * range was typed in the unit the report shows, in any spelling. */
static int same_number(const writer *w, const plumb_range *ax, double typed, double si)
{
    double x = axis_display(w, ax, si).x, t = shown_value(ax, typed);
    double scale = fabs(t) > 1.0 ? fabs(t) : 1.0;
    return fabs(x - t) <= 1e-12 * scale;
}

int plumbp_sweep_axis_as_typed(const writer *w, const plumb_sweep *sw, size_t a)
{
    const plumb_range *ax = plumb_sweep_axis(sw, a);
    size_t nr = plumb_sweep_row_count(sw);
    if (!ax->unit[0] || nr == 0)
        return 1;
    /* the first row holds every range's FROM, the last every range's last
     * value: two values of each range (one when it has one) */
    const plumb_sweep_row *first = plumb_sweep_row_at(sw, 0), *last = plumb_sweep_row_at(sw, nr - 1);
    return same_number(w, ax, first->value[a], first->value_si[a]) &&
           same_number(w, ax, last->value[a], last->value_si[a]);
}

const char *plumbp_sweep_axis_unit(writer *w, const plumb_sweep *sw, size_t a)
{
    const plumb_range *ax = plumb_sweep_axis(sw, a);
    if (plumbp_sweep_axis_as_typed(w, sw, a))
        return unit_shown(w, ax->unit);
    return axis_display(w, ax, 0.0).unit;
}

double plumbp_sweep_si_shown(const writer *w, const plumb_sweep *sw, size_t a, double typed,
                             double si)
{
    const plumb_range *ax = plumb_sweep_axis(sw, a);
    return plumbp_sweep_axis_as_typed(w, sw, a) ? shown_value(ax, typed) : axis_display(w, ax, si).x;
}

double plumbp_sweep_row_shown(const writer *w, const plumb_sweep *sw, const plumb_sweep_row *row,
                              size_t a)
{
    return plumbp_sweep_si_shown(w, sw, a, row->value[a], row->value_si[a]);
}

/* Significant digits of a converted range: enough that its steps stay
 * apart (2 beyond the ratio of its largest value to its step), at least
 * TEXT_SIG, at most CSV_DIGITS. */
static int converted_sig(const writer *w, const plumb_sweep *sw, size_t a)
{
    const plumb_range *ax = plumb_sweep_axis(sw, a);
    size_t nr = plumb_sweep_row_count(sw);
    if (ax->n < 2 || nr == 0)
        return TEXT_SIG;
    double x0 = axis_display(w, ax, plumb_sweep_row_at(sw, 0)->value_si[a]).x;
    double x1 = axis_display(w, ax, plumb_sweep_row_at(sw, nr - 1)->value_si[a]).x;
    double step = fabs(x1 - x0) / (double)(ax->n - 1);
    double big = fabs(x0) > fabs(x1) ? fabs(x0) : fabs(x1);
    if (!(step > 0.0) || !(big > 0.0))
        return TEXT_SIG;
    double sig = ceil(log10(big / step)) + 2.0;
    return sig < TEXT_SIG ? TEXT_SIG : sig > CSV_DIGITS ? CSV_DIGITS : (int)sig;
}

const char *plumbp_sweep_num(writer *w, const plumb_sweep *sw, size_t a, double x, int sig)
{
    if (plumbp_sweep_axis_as_typed(w, sw, a))
        return plumbp_gnum(w, x, sig);
    return plumbp_gnum(w, x, converted_sig(w, sw, a));
}

/* "C1".."Cn" legend of the criteria a row was judged against, each limit
 * with the figures the row that needs the most takes to show its side of
 * it (plumbp_limit_sig; a row's energy at plumbp_energy_sig). */
static void text_criteria_legend(writer *w, const plumb_sweep *sw, const plumb_item_report *first)
{
    size_t nr = plumb_sweep_row_count(sw);
    if (first->n_verdicts == 0)
        return;
    put(w, "\nCriteria (ratio = energy / limit)\n");
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        char lead[32], text[PLUMB_CRIT_TEXT * 4 + PLUMB_CRIT_ID + NUMBUF + 64];
        char quoted[PLUMB_CRIT_TEXT * 2];
        int sig = TEXT_SIG;
        for (size_t i = 0; i < nr; i++) {
            const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
            int s = row->status == PLUMB_OK ? plumbp_report_limit_sig(&row->report, k, TEXT_SIG)
                                            : TEXT_SIG;
            sig = s > sig ? s : sig;
        }
        snprintf(lead, sizeof lead, "  C%zu  ", k + 1);
        snprintf(text, sizeof text, "%s, limit %s%s; %s [%s]%s%s%s", c->name,
                 plumbp_t_limit_energy_at(w, c->energy_limit_j, sig),
                 c->kind == PLUMB_CRIT_HELMET_TEST ? " (helmet test, not a safe limit)" : "",
                 c->source[0] ? plumbp_t_source(w, c, quoted, sizeof quoted) : "source not given",
                 c->id,
                 plumbp_status_note(c)[0] ? " (" : "", plumbp_status_note(c),
                 plumbp_status_note(c)[0] ? ")" : "");
        wrapped(w, lead, text);
    }
}

/* The leading columns of a sweep table: the varied keys' values, and for
 * an inventory the item's name in a column name_w wide. */
typedef struct sweep_cols {
    const plumb_sweep *sw;
    size_t na;
    const size_t *wkey;
    int inv;
    size_t name_w;
    int own_line; /* 1: no room for a name column; each name on a line of its own */
} sweep_cols;

/* The header of a varied key's column, on one line or more: line[n - 1]
 * (the name line, beside the figures' names) and the lines above it. */
enum { KEY_HEAD_LINES = 12 };
typedef struct key_head {
    char line[KEY_HEAD_LINES][PLUMB_DIAG_KEY];
    size_t n;
} key_head;

/* The headers of the figures' columns; no key's header may be one of them. */
static const char *const sweep_fig_heads[] = {"speed", "energy", "time", "drift", "bearing",
                                              "item"};

/* The last `parts` dotted parts of key, or all of it; a dot inside an
 * item's name (items[1/2 in. wrench].mass) parts nothing. */
static const char *key_suffix(const char *key, size_t parts)
{
    size_t n = 0;
    int depth = 0;
    for (const char *p = key + strlen(key); p > key; p--) {
        depth += p[-1] == ']' ? 1 : p[-1] == '[' ? -1 : 0;
        if (p[-1] == '.' && depth == 0 && ++n == parts)
            return p;
    }
    return key;
}

/* 1 when head[a] is a figure's header or another key's. */
static int key_head_clashes(const char *const *head, size_t na, size_t a)
{
    for (size_t k = 0; k < sizeof sweep_fig_heads / sizeof sweep_fig_heads[0]; k++)
        if (strcmp(head[a], sweep_fig_heads[k]) == 0)
            return 1;
    for (size_t b = 0; b < na; b++)
        if (b != a && strcmp(head[a], head[b]) == 0)
            return 1;
    return 0;
}

/* A piece of a header: a dotted part with its dot, or a line's worth of a
 * part too long for a line; `glue` 1 when the next piece may follow it on
 * its line without a space (the next dotted part). */
typedef struct head_piece {
    char text[PLUMB_DIAG_KEY];
    int glue;
} head_piece;

/* h on lines of at most `limit` (up to SWEEP_KEY_HEAD) shown characters,
 * split after a dot outside brackets, a part longer than SWEEP_KEY_HEAD
 * wrapped at its spaces (wrap_cell); packed from the end, so that the name
 * line holds as much of the key's tail as fits. */
static void key_head_lines(const char *h, size_t limit, key_head *kh)
{
    head_piece piece[PLUMB_DIAG_KEY];
    size_t np = 0;
    int depth = 0;
    const char *start = h;
    for (const char *p = h; *p && np < PLUMB_DIAG_KEY; p++) {
        depth += *p == '[' ? 1 : *p == ']' ? -1 : 0;
        if ((*p != '.' || depth != 0) && p[1])
            continue;
        char part[PLUMB_DIAG_KEY];
        snprintf(part, sizeof part, "%.*s", (int)(p + 1 - start), start);
        start = p + 1;
        /* a part with spaces (an item's name) is wrapped; one word whole */
        for (const char *rest = part; *rest && np < PLUMB_DIAG_KEY;) {
            if (strchr(rest, ' '))
                rest = wrap_cell(rest, SWEEP_KEY_HEAD, piece[np].text, sizeof piece[np].text);
            else
                rest += snprintf(piece[np].text, sizeof piece[np].text, "%s", rest);
            piece[np++].glue = *rest == '\0';
        }
    }
    char lines[KEY_HEAD_LINES][PLUMB_DIAG_KEY];
    size_t nl = 0;
    char cur[PLUMB_DIAG_KEY] = "";
    for (size_t i = np; i-- > 0;) {
        char joined[2 * PLUMB_DIAG_KEY];
        snprintf(joined, sizeof joined, "%s%s", piece[i].text, cur);
        if (cur[0] && (!piece[i].glue || shown_width(joined) > limit ||
                       strlen(joined) >= sizeof cur) && nl + 1 < KEY_HEAD_LINES) {
            snprintf(lines[nl++], sizeof lines[0], "%s", cur);
            snprintf(cur, sizeof cur, "%s", piece[i].text);
        } else {
            snprintf(cur, sizeof cur, "%.*s", (int)(sizeof cur - 1), joined);
        }
    }
    snprintf(lines[nl++], sizeof lines[0], "%s", cur);
    kh->n = nl;
    for (size_t k = 0; k < nl; k++)
        snprintf(kh->line[k], sizeof kh->line[k], "%s", lines[nl - 1 - k]);
}

/* The headers of the varied keys' columns: each key, or its last part when
 * it is longer than SWEEP_KEY_HEAD or is one of two (the lines above the
 * table name the whole keys), so the figures and names keep their room,
 * but never for an item's key (items[2].mass is one item's, not every
 * item's mass, which "mass" beside the item column would read as);
 * but never the same header twice: a last part shared by two keys
 * (items[1].mass, items[2].mass) or by a figure's column (speed) takes the
 * parts before it until it is told apart. A header wider than
 * SWEEP_KEY_HEAD goes on lines of their own above the name line
 * (key_head_lines). */
/* An item named in its key's brackets with a word too long for a header
 * line (SWEEP_KEY_HEAD), by its number (items[5].mass: the item column
 * beside it names it, the lines above the table the key as typed), so
 * that its column stays narrow; into buf, from the first computed row's
 * items. Returns buf, or key when its words fit, it gives a number or no
 * row names the item. */
static const char *item_key_narrow(const plumb_sweep *sw, const char *key, char *buf,
                                   size_t size)
{
    const char *close = strncmp(key, "items[", 6) == 0 ? strchr(key + 6, ']') : NULL;
    size_t len = close ? (size_t)(close - (key + 6)) : 0;
    if (!close || strspn(key + 6, "0123456789") == len)
        return key;
    int too_long = 0; /* a word of "items[NAME]." wider than a header line */
    for (const char *w = key; w < close + 2 && *w;) {
        size_t n = strcspn(w, " ");
        if (w + n > close + 2)
            n = (size_t)(close + 2 - w);
        char word[PLUMB_DIAG_KEY];
        snprintf(word, sizeof word, "%.*s", (int)n, w);
        too_long = too_long || shown_width(word) > SWEEP_KEY_HEAD;
        w += n + (w[n] == ' ');
    }
    if (!too_long)
        return key;
    for (size_t r = 0; r < plumb_sweep_row_count(sw); r++) {
        const plumb_fall_report *rep = &plumb_sweep_row_at(sw, r)->report;
        for (size_t i = 0; rep->profile && i < rep->n_items; i++) {
            const char *name = rep->items[i].spec->name;
            if (strlen(name) == len && strncmp(name, key + 6, len) == 0) {
                snprintf(buf, size, "items[%zu]%s", plumb_profile_item_number(rep->profile, i),
                         close + 1);
                return buf;
            }
        }
    }
    return key;
}

static void sweep_key_heads(const plumb_sweep *sw, size_t na, key_head *kh)
{
    const char *head[PLUMB_MAX_AXES];
    size_t parts[PLUMB_MAX_AXES];
    char narrow[PLUMB_MAX_AXES][PLUMB_DIAG_KEY];
    const char *base[PLUMB_MAX_AXES]; /* the key each head is a part of */
    for (size_t a = 0; a < na; a++) {
        const char *key = item_key_narrow(sw, plumb_sweep_axis(sw, a)->key, narrow[a],
                                          sizeof narrow[a]);
        parts[a] = 1;
        /* an item's key keeps its item: "mass" alone, beside the item
         * column, reads as every item's mass */
        int item = strncmp(key, "items[", 6) == 0;
        base[a] = key;
        head[a] = !item && (shown_width(key) > SWEEP_KEY_HEAD || na > 1) ? key_suffix(key, 1)
                                                                         : key;
    }
    /* every clashing header grows at once, so two keys that share their
     * last part are both told apart, not only the first */
    for (int changed = 1; changed;) {
        int grow[PLUMB_MAX_AXES];
        changed = 0;
        for (size_t a = 0; a < na; a++)
            grow[a] = head[a] != base[a] && key_head_clashes(head, na, a);
        for (size_t a = 0; a < na; a++)
            if (grow[a]) {
                head[a] = key_suffix(base[a], ++parts[a]);
                changed = 1;
            }
    }
    /* an item's key in a two-way table: a dotted part a line, so that
     * its column is no wider than its parts (items[2]. above mass) */
    for (size_t a = 0; a < na; a++)
        key_head_lines(head[a],
                       na > 1 && strncmp(head[a], "items[", 6) == 0 ? 1 : SWEEP_KEY_HEAD, &kh[a]);
}

/* The widest line of a key's header. */
static size_t key_head_width(const key_head *kh)
{
    size_t wid = 0;
    for (size_t k = 0; k < kh->n; k++)
        if (shown_width(kh->line[k]) > wid)
            wid = shown_width(kh->line[k]);
    return wid;
}

/* A header line of the leading columns: the keys' name lines (line 1) or
 * units (2); the lines above the name line are sweep_top_heads'. */
static void sweep_heads(writer *w, const plumb_sweep *sw, const sweep_cols *c,
                        const key_head *kh, int line)
{
    for (size_t a = 0; a < c->na; a++)
        pad(w, line == 2 ? plumbp_sweep_axis_unit(w, sw, a) : kh[a].line[kh[a].n - 1],
            c->wkey[a] + (a ? SWEEP_GAP : 1), 1);
    if (c->inv && !c->own_line) {
        put(w, "  ");
        pad(w, line == 2 ? "" : "item", c->name_w, 0);
    }
}

/* The lines of the keys' headers above their name lines, bottom-aligned;
 * nothing when every header is one line. */
static void sweep_top_heads(writer *w, const sweep_cols *c, const key_head *kh)
{
    size_t top = 0;
    for (size_t a = 0; a < c->na; a++)
        if (kh[a].n - 1 > top)
            top = kh[a].n - 1;
    for (size_t t = 0; t < top; t++) {
        size_t last = 0; /* no line ends in spaces: the last key with a line here */
        for (size_t a = 0; a < c->na; a++)
            if (t + kh[a].n - 1 >= top)
                last = a;
        for (size_t a = 0; a <= last; a++) {
            size_t above = kh[a].n - 1; /* lines above this key's name line */
            pad(w, t + above >= top ? kh[a].line[t + above - top] : "",
                c->wkey[a] + (a ? SWEEP_GAP : 1), 1);
        }
        put(w, "\n");
    }
}

static void sweep_name_continued(writer *w, const sweep_cols *c, const char *rest);

/* An item's cell: its number as items[N] counts it, then its name
 * ("2 torque wrench 1/2 in"), as the fall's table numbers it. */
static const char *item_label(const plumb_sweep_row *row, size_t it, char *buf, size_t size)
{
    snprintf(buf, size, "%zu %s", plumb_profile_item_number(row->report.profile, it),
             row->report.items[it].spec->name);
    return buf;
}

/* The leading columns of item `it` of a row: the values on the row's first
 * line only, then the first line of the item's cell (item_label, made in
 * label[size]). Returns the rest of the cell, for sweep_name_continued. */
static const char *sweep_lead(writer *w, const sweep_cols *c, const plumb_sweep_row *row,
                              size_t it, char *label, size_t size)
{
    for (size_t a = 0; a < c->na; a++)
        pad(w, it == 0 ? plumbp_sweep_num(w, c->sw, a, plumbp_sweep_row_shown(w, c->sw, row, a), 8)
                       : "",
            c->wkey[a] + (a ? SWEEP_GAP : 1), 1);
    if (!c->inv)
        return "";
    char part[PLUMB_NAME + 24];
    const char *rest = wrap_cell(item_label(row, it, label, size), c->name_w, part, sizeof part);
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
 * that a ratio rounded to 1.00 still shows which side of the limit it is;
 * the ratio right-aligned in ratio_w, the word in a column of its own
 * (verdict_cell), SWEEP_GAP spaces before. */
static void ratio_cell(writer *w, const plumb_verdict *v, size_t ratio_w, int last)
{
    verdict_cell(w, SWEEP_GAP, ratio_w, plumbp_t_ratio(w, v),
                 v->exceeds ? "EXCEEDS" : "within", last);
}

/* The "ratio verdict" header of criteria k0..k1 (wratio: their ratio
 * columns' widths). */
static void ratio_heads(writer *w, size_t k0, size_t k1, const size_t *wratio)
{
    for (size_t k = k0; k < k1; k++)
        verdict_cell(w, SWEEP_GAP, wratio[k], "ratio", "verdict", k + 1 == k1);
}

/* The figure of numeric column k of a sweep row (speed, energy in the
 * display unit, energy in the other, time, drift, bearing). A fall with no
 * drift has no bearing. */
static const char *sweep_num_cell(writer *w, const plumb_item_report *item, int k)
{
    const plumb_fall_result *r = &item->result;
    double ft = PLUMB_FT_M;
    /* the energy with the figures that show its side of each limit */
    int esig = k == 1 || k == 2 ? plumbp_energy_sig(item->verdicts, item->n_verdicts, TEXT_SIG)
                                : TEXT_SIG;
    switch (k) {
    case 0:
        return num(w, w->us ? r->speed_m_s / ft : r->speed_m_s, TEXT_SIG);
    case 1:
        return num(w, w->us ? r->energy_j / PLUMB_FT_LBF_J : r->energy_j, esig);
    case 2:
        return num(w, w->us ? r->energy_j : r->energy_j / PLUMB_FT_LBF_J, esig);
    case 3:
        return num(w, r->time_s, TEXT_SIG);
    case 4:
        return r->drift_m < DRIFT_SHOWN_M ? "0" : num(w, w->us ? r->drift_m / ft : r->drift_m,
                                                     TEXT_SIG);
    default:
        return r->drift_m < DRIFT_SHOWN_M ? "-" : plumbp_fixed(w, r->bearing_deg, 0);
    }
}

/* The first row with figures (plumb_sweep_run fails when there is none). */
const plumb_sweep_row *plumbp_sweep_first_row(const plumb_sweep *sw)
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
        const char *u = plumbp_sweep_axis_unit(w, sw, a);
        snprintf(b + len, size - len, "%s%s = %s%s%s", a ? ", " : "", ax->key,
                 plumbp_sweep_num(w, sw, a, plumbp_sweep_row_shown(w, sw, row, a), 10),
                 u[0] ? " " : "", u);
    }
}

/* The diagnostic of a row that has no figures, as one line. */
void plumbp_sweep_row_error(const plumb_sweep_row *row, char *buf, size_t size)
{
    plumb_diag_format(&row->error, buf, size);
}


/* The header of the warnings' marks, and room for a row's marks. */
#define MARK_HEAD "warn"
enum { MARK_TEXT = 128 };

/* The marks of item `it` of row i ("W1,W3"), "" when it has no warning. */
static const char *row_mark(const sweep_marks *m, size_t i, size_t it, char *buf, size_t size)
{
    return plumbp_sweep_mark(m, i, it, "W", ",", buf, size);
}

/* "release.height from 20 to 60 m in steps of 20 m (3 values)"; a range
 * in another unit than the report's is given in the report's, then as
 * typed: "from 65.62 to 196.9 ft in steps of 65.62 ft (3 values; typed as
 * 20 to 60 m in steps of 20 m)". A direction through north says which
 * way it turns; a range whose steps stop short of TO says so; one value
 * is "at 20 m (one value)". */
static void range_line(writer *w, const plumb_sweep *sw, size_t a, char *line, size_t size)
{
    const plumb_range *ax = plumb_sweep_axis(sw, a);
    size_t nr = plumb_sweep_row_count(sw);
    double last = plumb_range_value(ax, ax->n - 1);
    const char *tu = unit_shown(w, ax->unit), *tsp = tu[0] ? " " : "";
    /* a direction through north: its bearings, and which way it turns */
    int north = shown_value(ax, 360.0) == 0.0 && floor(ax->from / 360.0) != floor(last / 360.0);
    const char *turn = !north ? "" : ax->step > 0.0 ? " clockwise through north"
                                                    : " anticlockwise through north";
    char typed[2 * PLUMB_UNIT_TEXT + NUMBUF * 4], shortof[PLUMB_UNIT_TEXT + NUMBUF + 32] = "";
    if (last != ax->to)
        snprintf(shortof, sizeof shortof, "; the steps stop short of %s%s%s",
                 plumbp_gnum(w, ax->to, 10), tsp, tu);
    if (ax->n == 1)
        snprintf(typed, sizeof typed, "%s%s%s", plumbp_gnum(w, shown_value(ax, ax->from), 10),
                 tsp, tu);
    else
        snprintf(typed, sizeof typed, "%s to %s%s%s%s in steps of %s%s%s",
                 plumbp_gnum(w, shown_value(ax, ax->from), 10),
                 plumbp_gnum(w, shown_value(ax, last), 10), tsp, tu, turn,
                 plumbp_gnum(w, ax->step, 10), tsp, tu);
    if (plumbp_sweep_axis_as_typed(w, sw, a)) {
        if (ax->n == 1)
            snprintf(line, size, "%s at %s (one value)%s", ax->key, typed, shortof);
        else
            snprintf(line, size, "%s from %s (%zu values)%s", ax->key, typed, ax->n, shortof);
        return;
    }
    const char *u = plumbp_sweep_axis_unit(w, sw, a), *sp = u[0] ? " " : "";
    const plumb_sweep_row *r0 = plumb_sweep_row_at(sw, 0), *rn = plumb_sweep_row_at(sw, nr - 1);
    double x0 = plumbp_sweep_row_shown(w, sw, r0, a), x1 = plumbp_sweep_row_shown(w, sw, rn, a);
    if (ax->n == 1) {
        snprintf(line, size, "%s at %s%s%s (one value; typed as %s)%s", ax->key,
                 plumbp_sweep_num(w, sw, a, x0, TEXT_SIG), sp, u, typed, shortof);
        return;
    }
    /* the step from the values unwrapped, so a direction turning through
     * north keeps its sign */
    double step = (plumbp_show_key(w, ax->key, ax->dim, rn->value_si[a]).x -
                   plumbp_show_key(w, ax->key, ax->dim, r0->value_si[a]).x) /
                  (double)(ax->n - 1);
    snprintf(line, size, "%s from %s to %s%s%s%s in steps of %s%s%s (%zu values; typed as %s)%s",
             ax->key, plumbp_sweep_num(w, sw, a, x0, TEXT_SIG),
             plumbp_sweep_num(w, sw, a, x1, TEXT_SIG), sp, u, turn,
             plumbp_sweep_num(w, sw, a, step, TEXT_SIG), sp, u, ax->n, typed, shortof);
}

static void text_sweep(writer *w, const plumb_report_options *opt, const plumb_sweep *sw)
{
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    const plumb_sweep_row *r0 = plumbp_sweep_first_row(sw);
    const plumb_profile *p = r0->report.profile;
    int inv = plumb_profile_is_inventory(p);
    const plumb_item_report *first = &r0->report.items[0];
    plumbp_text_header(w, opt, "sweep", plumb_profile_name(p));
    for (size_t a = 0; a < na; a++) {
        char line[PLUMB_DIAG_KEY + 4 * PLUMB_UNIT_TEXT + NUMBUF * 8];
        range_line(w, sw, a, line, sizeof line);
        wrapped(w, a ? "  and " : "  over ", line);
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
    size_t wratio[PLUMB_MAX_VERDICTS]; /* the ratio's part of wcrit */
    key_head khead[PLUMB_MAX_AXES];
    const char *heads[SWEEP_NUM_COLS] = {"speed", "energy", "energy", "time", "drift", "bearing"};
    const char *units_si[SWEEP_NUM_COLS] = {"m/s", "J", "ft·lbf", "s", "m", "deg"};
    const char *units_us[SWEEP_NUM_COLS] = {"ft/s", "ft·lbf", "J", "s", "ft", "deg"};
    const char *const *units = w->us ? units_us : units_si;
    sweep_key_heads(sw, na, khead);
    for (size_t a = 0; a < na; a++) {
        wkey[a] = key_head_width(&khead[a]);
        if (shown_width(plumbp_sweep_axis_unit(w, sw, a)) > wkey[a])
            wkey[a] = shown_width(plumbp_sweep_axis_unit(w, sw, a));
    }
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        wnum[k] = shown_width(heads[k]) > shown_width(units[k]) ? shown_width(heads[k])
                                                                : shown_width(units[k]);
    for (size_t k = 0; k < nv; k++)
        wratio[k] = shown_width("ratio");
    size_t name_w = SWEEP_NAME_MIN;
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        for (size_t a = 0; a < na; a++) {
            const char *v = plumbp_sweep_num(w, sw, a, plumbp_sweep_row_shown(w, sw, row, a), 8);
            if (shown_width(v) > wkey[a])
                wkey[a] = shown_width(v);
        }
        for (size_t it = 0; it < row->report.n_items; it++) {
            const plumb_item_report *item = &row->report.items[it];
            char label[PLUMB_NAME + 24];
            if (shown_width(item_label(row, it, label, sizeof label)) > name_w)
                name_w = shown_width(label);
            for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
                if (shown_width(sweep_num_cell(w, item, (int)k)) > wnum[k])
                    wnum[k] = shown_width(sweep_num_cell(w, item, (int)k));
            for (size_t k = 0; k < nv && k < item->n_verdicts; k++)
                if (shown_width(plumbp_t_ratio(w, &item->verdicts[k])) > wratio[k])
                    wratio[k] = shown_width(plumbp_t_ratio(w, &item->verdicts[k]));
        }
    }
    for (size_t k = 0; k < nv; k++)
        wcrit[k] = verdict_cell_width(0, wratio[k]);
    sweep_cols c = {sw, na, wkey, inv, 0, 0};
    size_t keys_w = 0, figs_w = 0, crit_w = 0;
    for (size_t a = 0; a < na; a++)
        keys_w += wkey[a] + (a ? SWEEP_GAP : 1);
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        figs_w += wnum[k] + SWEEP_GAP;
    for (size_t k = 0; k < nv; k++)
        crit_w += wcrit[k] + SWEEP_GAP;
    /* the warnings' marks ("W1,W2"), last on each line of a row that has
     * warnings, in a column only when some row does */
    sweep_marks marks;
    plumbp_sweep_marks_open(w, sw, &marks);
    size_t wmark = 0;
    for (size_t i = 0; marks.n_distinct && i < nr; i++)
        for (size_t it = 0; it < plumb_sweep_row_at(sw, i)->report.n_items; it++) {
            char mark[MARK_TEXT];
            size_t mw = shown_width(row_mark(&marks, i, it, mark, sizeof mark));
            wmark = mw > wmark ? mw : wmark;
        }
    if (marks.n_distinct)
        wmark = SWEEP_GAP + (wmark > shown_width(MARK_HEAD) ? wmark : shown_width(MARK_HEAD));
    if (inv) {
        size_t room = TABLE_WIDTH > keys_w + figs_w + SWEEP_GAP
                          ? TABLE_WIDTH - keys_w - figs_w - SWEEP_GAP
                          : 0;
        c.own_line = room < SWEEP_NAME_ROOM && name_w > room;
        c.name_w = c.own_line ? TABLE_WIDTH - keys_w - SWEEP_GAP : name_w < room ? name_w : room;
    }
    size_t lead_w = keys_w + (inv && !c.own_line ? SWEEP_GAP + c.name_w : 0);
    /* the marks beside the figures where they fit as the table is, the
     * items' names kept in their column; else beside the verdicts, in the
     * criteria's own tables; with neither, the Warnings block lists every
     * row */
    int fig_marks = wmark && (c.own_line ? keys_w : lead_w) + figs_w + wmark <= TABLE_WIDTH;
    int inline_crit = lead_w + figs_w + crit_w + (fig_marks ? wmark : 0) <= TABLE_WIDTH &&
                      (fig_marks || !wmark);
    int marked = fig_marks || (wmark && nv > 0);
    sweep_top_heads(w, &c, khead);
    sweep_heads(w, sw, &c, khead, 1);
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++) {
        if (k == 1) { /* one header over the energy in both units */
            put(w, "%*s", SWEEP_GAP, "");
            span_head(w, heads[k], wnum[1] + SWEEP_GAP + wnum[2]);
            k++;
            continue;
        }
        pad(w, heads[k], wnum[k] + SWEEP_GAP, 1);
    }
    for (size_t k = 0; inline_crit && k < nv; k++) {
        char h[32];
        snprintf(h, sizeof h, "C%zu", k + 1);
        pad(w, h, wcrit[k] + SWEEP_GAP, 1);
    }
    if (fig_marks)
        put(w, "%*s%s", SWEEP_GAP, "", MARK_HEAD);
    put(w, "\n");
    sweep_heads(w, sw, &c, khead, 2);
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        pad(w, units[k], wnum[k] + SWEEP_GAP, 1);
    if (inline_crit)
        ratio_heads(w, 0, nv, wratio);
    put(w, "\n");
    size_t n_failed = 0;
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status != PLUMB_OK) {
            for (size_t a = 0; a < na; a++)
                pad(w, plumbp_sweep_num(w, sw, a, plumbp_sweep_row_shown(w, sw, row, a), 8),
                    wkey[a] + (a ? SWEEP_GAP : 1), 1);
            put(w, "  not computed, see (%zu) below\n", ++n_failed);
            continue;
        }
        for (size_t it = 0; it < row->report.n_items; it++) {
            const plumb_item_report *item = &row->report.items[it];
            char label[PLUMB_NAME + 24], mark[MARK_TEXT];
            const char *rest = sweep_lead(w, &c, row, it, label, sizeof label);
            row_mark(&marks, i, it, mark, sizeof mark);
            mark[fig_marks ? sizeof mark - 1 : 0] = '\0';
            for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
                pad(w, sweep_num_cell(w, item, (int)k), wnum[k] + SWEEP_GAP, 1);
            for (size_t k = 0; inline_crit && k < item->n_verdicts; k++)
                ratio_cell(w, &item->verdicts[k], wratio[k],
                           k + 1 == item->n_verdicts && !mark[0]);
            if (mark[0])
                put(w, "%*s%s", SWEEP_GAP, "", mark);
            put(w, "\n");
            sweep_name_continued(w, &c, rest);
        }
    }
    /* the verdicts, in blocks of as many criteria as fit */
    for (size_t k0 = 0; !inline_crit && k0 < nv;) {
        size_t k1 = k0, used = lead_w + wmark;
        while (k1 < nv && (k1 == k0 || used + wcrit[k1] + SWEEP_GAP <= TABLE_WIDTH))
            used += wcrit[k1++] + SWEEP_GAP;
        if (k1 == k0 + 1)
            put(w, "\nAgainst the criterion C%zu (ratio = energy / limit)\n", k1);
        else
            put(w, "\nAgainst the criteria, C%zu to C%zu (ratio = energy / limit)\n", k0 + 1, k1);
        sweep_top_heads(w, &c, khead);
        sweep_heads(w, sw, &c, khead, 1);
        for (size_t k = k0; k < k1; k++) {
            char h[32];
            snprintf(h, sizeof h, "C%zu", k + 1);
            pad(w, h, wcrit[k] + SWEEP_GAP, 1);
        }
        if (wmark)
            put(w, "%*s%s", SWEEP_GAP, "", MARK_HEAD);
        put(w, "\n");
        sweep_heads(w, sw, &c, khead, 2);
        ratio_heads(w, k0, k1, wratio);
        put(w, "\n");
        for (size_t i = 0; i < nr; i++) {
            const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
            if (row->status != PLUMB_OK)
                continue;
            for (size_t it = 0; it < row->report.n_items; it++) {
                const plumb_item_report *item = &row->report.items[it];
                char label[PLUMB_NAME + 24], mark[MARK_TEXT];
                const char *rest = sweep_lead(w, &c, row, it, label, sizeof label);
                row_mark(&marks, i, it, mark, sizeof mark);
                for (size_t k = k0; k < k1 && k < item->n_verdicts; k++)
                    ratio_cell(w, &item->verdicts[k], wratio[k], k + 1 == k1 && !mark[0]);
                if (mark[0])
                    put(w, "%*s%s", SWEEP_GAP, "", mark);
                put(w, "\n");
                sweep_name_continued(w, &c, rest);
            }
        }
        k0 = k1;
    }
    if (na == 2)
        plumbp_sweep_text_boundary(w, sw);
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
            plumbp_sweep_row_error(row, why, sizeof why);
            row_values(w, sw, row, vals, sizeof vals);
            snprintf(text, sizeof text, "%s: %s", vals, why);
            wrapped(w, lead, text);
        }
    }
    text_criteria_legend(w, sw, first);
    if (marks.n_distinct) {
        put(w, "\nWarnings%s\n", marked ? " (each marked beside the rows it is about)" : "");
        plumbp_sweep_text_warnings(w, &marks, marked);
    }
    plumbp_sweep_marks_close(&marks);
    put(w, "\nEach row is exactly what `plumb fall` gives with --set at that value.\n");
    plumbp_text_profile(w, p);
    plumbp_caution_lines_text(w);
}

plumb_status plumb_report_sweep(FILE *out, const plumb_report_options *opt,
                                const plumb_sweep *sw, plumb_diag *diag)
{
    plumb_report_options def;
    opt = plumbp_opts_or_default(opt, &def);
    if (!out || !sw || plumb_sweep_row_count(sw) == 0 || !plumbp_sweep_first_row(sw))
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
        st = emit_json(out, &j, plumbp_sweep_json(&j, opt, sw, ia), diag);
    } else if (st == PLUMB_OK) {
        writer w;
        st = plumbp_writer_open(&w, opt->units, diag);
        if (st == PLUMB_OK) {
            if (opt->format == PLUMB_FORMAT_CSV)
                plumbp_sweep_csv(&w, sw);
            else
                text_sweep(&w, opt, sw);
            st = plumbp_writer_close(&w, out, diag);
        }
    }
    for (size_t i = 0; i < nr; i++)
        free(ia[i]);
    free(ia);
    return st;
}

