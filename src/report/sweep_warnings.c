/*
 * sweep_warnings.c - the warnings of a sweep (plumb_report_sweep): each
 * sentence said once over the rows and numbered, in order of first
 * appearance; each row (and item) marked with the numbers of its own, so
 * that a printed table shows which rows a warning is about. For the text
 * table (sweep_table.c: "W1" beside a row, "W1" before the sentence with
 * the rows it is in) and the CSV (sweep_data.c: a `warnings` column of
 * numbers, "# warning N: ..." above the header).
 */
#include <ctype.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/common.h"
#include "report/sweep_int.h"

/* ---- one warning over the rows: the same sentence, other figures -------- */

/* 1 when a figure (a number a row can change) starts at t + i, its end at
 * *end: digits, a decimal part and an exponent, after the start, a space,
 * a no-break space or "(", and not followed by a letter; so "descent[0]",
 * "eu-c1-80j" and "MIL-F-8785C" are words of the sentence, not figures. */
static int figure_at(const char *t, size_t i, size_t *end)
{
    size_t k = i;
    if (i > 0 && t[i - 1] != ' ' && t[i - 1] != '(' && t[i - 1] != NBSP_CHAR)
        return 0;
    if (t[k] == '-')
        k++;
    if (!isdigit((unsigned char)t[k]))
        return 0;
    while (isdigit((unsigned char)t[k]))
        k++;
    if (t[k] == '.' && isdigit((unsigned char)t[k + 1]))
        for (k++; isdigit((unsigned char)t[k]);)
            k++;
    if ((t[k] == 'e' || t[k] == 'E') &&
        (isdigit((unsigned char)t[k + 1]) ||
         ((t[k + 1] == '-' || t[k + 1] == '+') && isdigit((unsigned char)t[k + 2]))))
        for (k += 2; isdigit((unsigned char)t[k]);)
            k++;
    if (isalpha((unsigned char)t[k]) || t[k] == '_' || t[k] == '[')
        return 0;
    *end = k;
    return 1;
}

/* 1 when a and b are the same sentence but for their figures. */
static int same_but_figures(const char *a, const char *b)
{
    size_t i = 0, j = 0, ea, eb;
    for (;;) {
        int fa = figure_at(a, i, &ea), fb = figure_at(b, j, &eb);
        if (fa != fb)
            return 0;
        if (fa) {
            i = ea;
            j = eb;
            continue;
        }
        if (a[i] != b[j])
            return 0;
        if (!a[i])
            return 1;
        i++;
        j++;
    }
}

/* The k-th figure of t (from 0): its start in *at, its length returned
 * (0 when there is none). */
static size_t figure_k(const char *t, size_t k, const char **at)
{
    size_t end;
    for (size_t i = 0; t[i];) {
        if (figure_at(t, i, &end)) {
            if (k-- == 0) {
                *at = t + i;
                return end - i;
            }
            i = end;
        } else {
            i++;
        }
    }
    return 0;
}

/* Warning d's sentence over its rows into out: that of its first row,
 * each figure that differs between the rows said as its least and
 * greatest, "46.3 to 70.1" (each as a row printed it). */
static void said_over_rows(const sweep_marks *m, size_t d, char *out, size_t size)
{
    size_t first = 0;
    while (first < m->n && m->num[first] != d)
        first++;
    const char *t = m->s[first].text;
    size_t len = 0, i = 0, k = 0, end;
    out[0] = '\0';
    while (t[i] && len + 1 < size) {
        if (!figure_at(t, i, &end)) {
            out[len++] = t[i++];
            out[len] = '\0';
            continue;
        }
        const char *lo = t + i, *hi = t + i;
        size_t lo_n = end - i, hi_n = end - i;
        double lo_x = strtod(lo, NULL), hi_x = lo_x;
        for (size_t e = first + 1; e < m->n; e++) {
            const char *at;
            size_t n;
            if (m->num[e] != d || !(n = figure_k(m->s[e].text, k, &at)))
                continue;
            double x = strtod(at, NULL);
            if (x < lo_x) {
                lo = at, lo_n = n, lo_x = x;
            } else if (x > hi_x) {
                hi = at, hi_n = n, hi_x = x;
            }
        }
        int w;
        if (lo == hi || (lo_n == hi_n && memcmp(lo, hi, lo_n) == 0))
            w = snprintf(out + len, size - len, "%.*s", (int)lo_n, lo);
        else
            w = snprintf(out + len, size - len, "%.*s to %.*s", (int)lo_n, lo, (int)hi_n, hi);
        if (w < 0 || (size_t)w >= size - len)
            break; /* never cut inside a figure: the sentence ends before it */
        len += (size_t)w;
        i = end;
        k++;
    }
}

int plumbp_sweep_marks_open(writer *w, const plumb_sweep *sw, sweep_marks *m)
{
    size_t nr = plumb_sweep_row_count(sw);
    memset(m, 0, sizeof *m);
    m->sw = sw;
    const plumb_fall_report **reps = calloc(nr ? nr : 1, sizeof *reps);
    m->row_start = calloc(nr + 1, sizeof *m->row_start);
    if (!reps || !m->row_start) {
        free(reps);
        free(m->row_start);
        m->row_start = NULL;
        w->nomem = 1;
        return 0;
    }
    for (size_t i = 0; i < nr; i++)
        reps[i] = &plumb_sweep_row_at(sw, i)->report;
    m->s = plumbp_said_warnings(w, reps, nr, &m->n);
    free(reps);
    if (!m->s || !(m->num = calloc(m->n ? m->n : 1, sizeof *m->num))) {
        w->nomem = 1;
        plumbp_sweep_marks_close(m);
        return 0;
    }
    /* a sentence's number is that of its first appearance, figures
     * aside; s is in row order, so row r's warnings are
     * s[row_start[r] .. row_start[r + 1]) */
    for (size_t e = 0; e < m->n; e++) {
        size_t b = 0;
        while (b < e && !same_but_figures(m->s[b].text, m->s[e].text))
            b++;
        m->num[e] = b < e ? m->num[b] : ++m->n_distinct;
    }
    if (!(m->said = calloc(m->n_distinct ? m->n_distinct : 1, sizeof *m->said))) {
        w->nomem = 1;
        plumbp_sweep_marks_close(m);
        return 0;
    }
    for (size_t d = 1; d <= m->n_distinct; d++) {
        size_t size = PLUMB_WARNING * 4;
        if (!(m->said[d - 1] = malloc(size))) {
            w->nomem = 1;
            plumbp_sweep_marks_close(m);
            return 0;
        }
        said_over_rows(m, d, m->said[d - 1], size);
    }
    for (size_t r = 0, e = 0; r <= nr; r++) {
        while (e < m->n && m->s[e].report < r)
            e++;
        m->row_start[r] = e;
    }
    return 1;
}

void plumbp_sweep_marks_close(sweep_marks *m)
{
    for (size_t d = 0; m->said && d < m->n_distinct; d++)
        free(m->said[d]);
    free(m->said);
    plumbp_said_free(m->s, m->n);
    free(m->num);
    free(m->row_start);
    const plumb_sweep *sw = m->sw; /* still the sweep's: an empty set of marks */
    memset(m, 0, sizeof *m);
    m->sw = sw;
}

const char *plumbp_sweep_mark(const sweep_marks *m, size_t row, size_t item, const char *prefix,
                              const char *sep, char *buf, size_t size)
{
    size_t len = 0, last = 0;
    buf[0] = '\0';
    if (!m->row_start || row >= plumb_sweep_row_count(m->sw))
        return buf;
    /* the numbers in ascending order, each once: the least above the last */
    for (;;) {
        size_t next = SIZE_MAX;
        for (size_t e = m->row_start[row]; e < m->row_start[row + 1]; e++)
            if ((item == SIZE_MAX || m->s[e].item == item) && m->num[e] > last &&
                m->num[e] < next)
                next = m->num[e];
        if (next == SIZE_MAX)
            return buf;
        int k = snprintf(buf + len, size - len, "%s%s%zu", len ? sep : "", prefix, next);
        if (k < 0 || (size_t)k >= size - len)
            return buf;
        len += (size_t)k;
        last = next;
    }
}

/* 1 when row r has warning number d. */
static int row_has(const sweep_marks *m, size_t r, size_t d)
{
    for (size_t e = m->row_start[r]; e < m->row_start[r + 1]; e++)
        if (m->num[e] == d)
            return 1;
    return 0;
}

/* Warning d's sentence over its rows. */
static const char *sentence(const sweep_marks *m, size_t d)
{
    return m->said && d >= 1 && d <= m->n_distinct && m->said[d - 1] ? m->said[d - 1] : "";
}

/* 1 when warning d's sentence gives figures as ranges over its rows. */
static int ranged(const sweep_marks *m, size_t d)
{
    for (size_t e = 0; e < m->n; e++)
        if (m->num[e] == d)
            return strcmp(m->s[e].text, sentence(m, d)) != 0;
    return 0;
}

/* The words after the rows of a warning whose figures are ranges. */
#define RANGED_NOTE "; a figure that differs between them given as its least to its greatest"

/* The number of rows with warning d. */
static size_t rows_with(const sweep_marks *m, size_t d)
{
    size_t rows = 0;
    for (size_t r = 0; r < plumb_sweep_row_count(m->sw); r++)
        rows += (size_t)row_has(m, r, d);
    return rows;
}

void plumbp_sweep_csv_warnings(writer *w, const sweep_marks *m)
{
    size_t nr = plumb_sweep_row_count(m->sw);
    for (size_t d = 1; d <= m->n_distinct; d++) {
        char line[PLUMB_WARNING * 4 + 160];
        snprintf(line, sizeof line, "warning %zu: %s (%zu of %zu row%s%s)", d, sentence(m, d),
                 rows_with(m, d), nr, plumbp_s(nr), ranged(m, d) ? RANGED_NOTE : "");
        csv_comment(w, line);
    }
}

/* Rows listed in a warning's line, at most; the table's marks show the rest. */
enum { LISTED_ROWS = 8 };

/* Row r's values as a person reads them off the table: "20 m", or
 * "10 m, 0.3 kg" for a two-way sweep. */
static void row_label(writer *w, const plumb_sweep *sw, size_t r, char *buf, size_t size)
{
    size_t len = 0;
    buf[0] = '\0';
    for (size_t a = 0; a < plumb_sweep_axis_count(sw); a++) {
        const char *u = plumbp_sweep_axis_unit(w, sw, a);
        double x = plumbp_sweep_row_shown(w, sw, plumb_sweep_row_at(sw, r), a);
        int k = snprintf(buf + len, size - len, "%s%s%s%s", a ? ", " : "",
                         plumbp_sweep_num(w, sw, a, x, 8), u[0] ? " " : "", u);
        if (k < 0 || (size_t)k >= size - len)
            return;
        len += (size_t)k;
    }
}

/* Appends text to buf (len so far in *len), cutting nothing: a part that
 * does not fit is left out whole. */
static void append(char *buf, size_t size, size_t *len, const char *text)
{
    size_t n = strlen(text);
    if (*len + n < size) {
        memcpy(buf + *len, text, n + 1);
        *len += n;
    }
}

/* For an inventory, "; items 1, 2, 5" (as items[N] counts them) after the
 * rows when warning d is not said of every item. */
static void item_list(const sweep_marks *m, size_t d, char *buf, size_t size)
{
    const plumb_sweep_row *r0 = plumbp_sweep_first_row(m->sw);
    size_t n_items = r0->report.n_items, len = strlen(buf), count = 0;
    if (n_items < 2)
        return;
    unsigned char *has = calloc(n_items, 1);
    if (!has)
        return; /* the rows' marks still say which items */
    for (size_t e = 0; e < m->n; e++)
        if (m->num[e] == d && m->s[e].item < n_items && !has[m->s[e].item]) {
            has[m->s[e].item] = 1;
            count++;
        }
    if (count < n_items) {
        append(buf, size, &len, count == 1 ? "; item " : "; items ");
        for (size_t i = 0, k = 0; i < n_items; i++) {
            if (!has[i])
                continue;
            char num[32];
            snprintf(num, sizeof num, "%s%zu", k++ ? ", " : "",
                     plumb_profile_item_number(r0->report.profile, i));
            append(buf, size, &len, num);
        }
    }
    free(has);
}

void plumbp_sweep_text_warnings(writer *w, const sweep_marks *m, int marked)
{
    const plumb_sweep *sw = m->sw;
    size_t nr = plumb_sweep_row_count(sw);
    int one_way = plumb_sweep_axis_count(sw) == 1;
    for (size_t d = 1; d <= m->n_distinct; d++) {
        char rows[LISTED_ROWS * 2 * (NUMBUF + PLUMB_UNIT_TEXT + 8) + 96], lead[72];
        char line[PLUMB_WARNING * 4 + sizeof rows + 16];
        size_t n = rows_with(m, d), len = 0, listed = 0, in_list = 0;
        if (n == nr) {
            /* "all 4 rows", "the one row" */
            if (nr == 1)
                snprintf(rows, sizeof rows, "the one row");
            else
                snprintf(rows, sizeof rows, "all %zu rows", nr);
        } else {
            snprintf(rows, sizeof rows, "%zu of %zu rows: ", n, nr);
            len = strlen(rows);
            /* each row, or for a one-way sweep each run of three or more
             * rows in a row as "FIRST to LAST"; so many and no more */
            for (size_t r = 0; r < nr && listed < LISTED_ROWS; r++) {
                if (!row_has(m, r, d))
                    continue;
                size_t end = r;
                while (one_way && end + 1 < nr && row_has(m, end + 1, d))
                    end++;
                char a[NUMBUF + PLUMB_UNIT_TEXT + 8], b[NUMBUF + PLUMB_UNIT_TEXT + 8];
                row_label(w, sw, r, a, sizeof a);
                append(rows, sizeof rows, &len, listed ? (one_way ? ", " : "; ") : "");
                append(rows, sizeof rows, &len, a);
                if (end >= r + 2) {
                    row_label(w, sw, end, b, sizeof b);
                    append(rows, sizeof rows, &len, " to ");
                    append(rows, sizeof rows, &len, b);
                } else {
                    end = r;
                }
                in_list += end - r + 1;
                listed++;
                r = end;
            }
            if (in_list < n) {
                char more[64];
                if (marked)
                    snprintf(more, sizeof more, " and %zu more, marked W%zu", n - in_list, d);
                else /* the table had no room for marks */
                    snprintf(more, sizeof more, " and %zu more: --format csv says which",
                             n - in_list);
                append(rows, sizeof rows, &len, more);
            }
        }
        char label[32], widest[32];
        snprintf(label, sizeof label, "W%zu", d);
        snprintf(widest, sizeof widest, "W%zu", m->n_distinct);
        snprintf(lead, sizeof lead, "  %-*s  ", (int)strlen(widest), label);
        item_list(m, d, rows, sizeof rows);
        if (ranged(m, d)) {
            size_t at = strlen(rows);
            append(rows, sizeof rows, &at, RANGED_NOTE);
        }
        snprintf(line, sizeof line, "%s (%s)", sentence(m, d), rows);
        wrapped(w, lead, line);
    }
}
