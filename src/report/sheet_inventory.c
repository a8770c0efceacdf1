/*
 * sheet_inventory.c - the inventory section of the PDF sheet (a kit's
 * items, worst first, with their figures and each criterion's ratio and
 * verdict), in as many tables as the criteria need.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/sheet_doc.h"
#include "report/common.h"

/* ---- 6. the inventory ------------------------------------------------------------ */

enum { TABLE_COLS = 6 + PLUMB_MAX_VERDICTS };

/* The table's type: 8 pt, smaller by half points to 6.5 pt when the
 * columns' longest words do not fit the width beside each other; past
 * that the ratio columns go on in further tables (below the first, each
 * with the items' numbers and names), as the text report splits its
 * criteria. */
#define TABLE_PT_MAX SHEET_SMALL
#define TABLE_PT_MIN 6.5
/* Space between columns, pt (table_row leaves it at each column's right). */
#define TABLE_PAD 4.0
/* The widest the item's name asks its column to be, as a share of the
 * width: a name wider than that is broken (name_lines), so that one long
 * name without spaces does not take half the page from the figures. */
#define NAME_CAP 0.3

/* 1 when a name may break after byte c, as the text reports break a word
 * (textout.h, break_after): after a hyphen, a slash or an underscore. */
static int name_break(char c)
{
    return c == '-' || c == '/' || c == '_';
}

/* s[0..n) escaped for pango markup into out (size bytes, cut short at a
 * whole entity), appended at *o. Uses no ring: a row's cells live in
 * sheet_fmt's ring while its name is laid out. */
static void esc_into(char *out, size_t size, size_t *o, const char *s, size_t n)
{
    for (size_t i = 0; i < n && *o + 7 < size; i++) {
        const char *ent = s[i] == '&' ? "&amp;" : s[i] == '<' ? "&lt;" : s[i] == '>' ? "&gt;"
                                                : NULL;
        if (ent)
            *o += (size_t)snprintf(out + *o, size - *o, "%s", ent);
        else
            out[(*o)++] = s[i];
    }
    out[*o] = '\0';
}

/* The width of name[0..n) in font, as text, with `mark` after it. */
static double piece_width(sheet_doc *d, const char *font, const char *name, size_t n,
                          const char *mark)
{
    char buf[FMT_LEN];
    size_t o = 0;
    esc_into(buf, sizeof buf, &o, name, n);
    esc_into(buf, sizeof buf, &o, mark, strlen(mark));
    return sheet_text_width(d, font, buf);
}

/* The item's name as markup into out (size bytes) in lines of at most w
 * points in font: its words as pango wraps them, a word wider than w
 * broken after its own '-', '/' or '_' (as much as fits on each line),
 * and only a piece with none cut where the line ends, the cut marked with
 * CUT_MARK ('\\') as the text reports mark theirs (textout.h): no
 * character added or dropped but the marks. */
static const char *name_lines(sheet_doc *d, const char *font, const char *name, double w,
                              char *out, size_t size)
{
    size_t o = 0;
    out[0] = '\0';
    const char *p = name;
    while (*p && o + 8 < size) {
        size_t sp = strcspn(p, " ");
        size_t len = sp;
        /* a word that fits is left to pango */
        while (len > 0 && piece_width(d, font, p, len, "") > w && o + 8 < size) {
            /* the longest head ending at a break character that fits */
            size_t brk = 0, fit = 0;
            for (size_t i = 1; i <= len; i++) {
                if (i < len && (p[i] & 0xC0) == 0x80)
                    continue; /* inside a character */
                if (piece_width(d, font, p, i, "") > w)
                    break;
                if (name_break(p[i - 1]))
                    brk = i;
            }
            if (!brk) {
                /* none: as many whole characters as fit with the mark */
                for (size_t i = 1; i <= len; i++) {
                    if (i < len && (p[i] & 0xC0) == 0x80)
                        continue;
                    if (piece_width(d, font, p, i, CUT_MARK) > w)
                        break;
                    fit = i;
                }
                if (!fit) /* no room even for one: one, so the name moves on */
                    while (fit < len && (fit == 0 || (p[fit] & 0xC0) == 0x80))
                        fit++;
            }
            size_t head = brk ? brk : fit;
            esc_into(out, size, &o, p, head);
            esc_into(out, size, &o, brk ? "\n" : CUT_MARK "\n", brk ? 1 : 2);
            p += head;
            len -= head;
            sp -= head;
        }
        esc_into(out, size, &o, p, len);
        p += sp;
        if (*p == ' ') {
            esc_into(out, size, &o, " ", 1);
            p++;
        }
    }
    return out;
}

/* One table of section 6: the criteria k0 .. k1 - 1 as ratio columns;
 * `full` adds mass, energy, verdict and drift (the first table). */
typedef struct inv_table {
    size_t k0, k1;
    int full;
    size_t n;          /* columns */
    double pt;         /* type size */
    double cx[TABLE_COLS]; /* column starts, fractions of the width */
} inv_table;

/* The column of the full list (#, item, mass, energy, C1..Cn, verdict,
 * drift) that column c of table t shows. */
static size_t table_col(const plumb_brief *b, const inv_table *t, size_t c)
{
    if (c < 2)
        return c;
    if (t->full) {
        if (c < 4)
            return c;
        if (c < 4 + (t->k1 - t->k0))
            return 4 + t->k0 + (c - 4);
        return 4 + b->n_criteria + (c - 4 - (t->k1 - t->k0));
    }
    return 4 + t->k0 + (c - 2);
}

static void table_fonts(double pt, char *font, char *bold, size_t size)
{
    snprintf(font, size, "%s %.1f", SHEET_FONT, pt);
    snprintf(bold, size, "%s Bold %.1f", SHEET_FONT, pt);
}

/* The text of the ratio cells, one per criterion: kept here, not in the
 * ring of sheet_fmt, which 32 criteria would go round. */
typedef struct ratio_store {
    char cell[PLUMB_MAX_VERDICTS][48];
} ratio_store;

/* The header of every column (the full list), as markup. */
static void inventory_header_cells(const plumb_brief *b, const char **cells, ratio_store *rs)
{
    cells[0] = "#";
    cells[1] = "Item";
    cells[2] = "Mass";
    cells[3] = "Impact energy";
    for (size_t k = 0; k < b->n_criteria; k++) {
        /* the key of section 2's list of criteria: an id does not fit a
         * ratio's column without being broken */
        snprintf(rs->cell[k], sizeof rs->cell[k], "Ratio to\nC%zu", k + 1);
        cells[4 + k] = rs->cell[k];
    }
    cells[4 + b->n_criteria] = "Verdict";
    cells[5 + b->n_criteria] = "Drift";
}

/* Row r (worst first), every column of the full list, as markup. The
 * strings other than the ratios live in the ring of sheet_fmt: use them
 * before making another row. */
static void inventory_row_cells(sheet_doc *d, const plumb_brief *b, size_t r, const char **cells,
                                ratio_store *rs)
{
    writer *P = sheet_primary(d);
    const plumb_item_report *it = &b->fall->items[b->order[r]];
    int exceeds = 0;
    cells[0] = sheet_fmt(d, "%zu", plumb_profile_item_number(b->profile, b->order[r]));
    cells[1] = sheet_esc(d, it->spec->name);
    /* the mass as the text report's table gives it (TEXT_SIG figures, no
     * padding zeros: "0.9 kg", not "0.9000 kg", which claims a precision
     * the profile did not give) */
    cells[2] = sheet_fmt(d, "%s %s",
                         plumbp_gnum(P, it->spec->mass_kg / (P->us ? PLUMB_LB_KG : 1.0), TEXT_SIG),
                         P->us ? "lb" : "kg");
    cells[3] = sheet_fmt(d, "%s", plumbp_t_energy_at(P, it->result.energy_j,
                                                       plumbp_energy_sig(it->verdicts, it->n_verdicts, TEXT_SIG)));
    for (size_t k = 0; k < b->n_criteria; k++) {
        cells[4 + k] = "-";
        for (size_t v = 0; v < it->n_verdicts; v++)
            if (it->verdicts[v].criterion == b->criteria[k]) {
                snprintf(rs->cell[k], sizeof rs->cell[k], "%s\n%s",
                         plumbp_t_ratio(P, &it->verdicts[v]),
                         it->verdicts[v].exceeds ? "exceeds" : "within");
                cells[4 + k] = rs->cell[k];
                exceeds |= it->verdicts[v].exceeds;
            }
    }
    cells[4 + b->n_criteria] = exceeds ? "<b>exceeds</b>" : "within all";
    cells[5 + b->n_criteria] =
        it->result.drift_m < DRIFT_SHOWN_M
            ? plumbp_t_drift(P, it->result.drift_m, 1)
            : sheet_fmt(d, "%s toward %s", plumbp_t_drift(P, it->result.drift_m, 1),
                        plumbp_t_bearing(P, it->result.bearing_deg));
}

/* Widens need[c] to the widest word of each cell (words end at a space or
 * a line break; a number and its unit are joined by a no-break space and
 * stay one word), in font. */
static void widest_words(sheet_doc *d, const char *const *cells, size_t n, const char *font,
                         double *need)
{
    for (size_t c = 0; c < n; c++) {
        char word[FMT_LEN];
        const char *p = cells[c];
        while (*p) {
            size_t len = strcspn(p, " \n");
            if (len > 0 && len < sizeof word) {
                memcpy(word, p, len);
                word[len] = '\0';
                double w = sheet_text_width(d, font, word);
                if (w > need[c])
                    need[c] = w;
            }
            p += len;
            p += strspn(p, " \n");
        }
    }
}

/* The widest word of every column of the full list at TABLE_PT_MAX, pt,
 * without the space between columns: a word's width at another size is
 * taken in proportion (with 3 % to spare for the hinting). */
static void inventory_words(sheet_doc *d, const plumb_brief *b, double *need8)
{
    size_t n = 6 + b->n_criteria;
    char font[64], bold[64];
    table_fonts(TABLE_PT_MAX, font, bold, sizeof font);
    const char *cells[TABLE_COLS];
    ratio_store rs;
    for (size_t c = 0; c < n; c++)
        need8[c] = 0.0;
    inventory_header_cells(b, cells, &rs);
    widest_words(d, cells, n, bold, need8);
    double name_need = need8[1];
    for (size_t r = 0; r < b->fall->n_items; r++) {
        inventory_row_cells(d, b, r, cells, &rs);
        double item = need8[1];
        widest_words(d, cells, n, font, need8);
        need8[1] = item; /* the name's, below */
        /* the name: its widest piece between breaks, up to the cap */
        const char *nm = b->fall->items[b->order[r]].spec->name;
        for (const char *q = nm; *q;) {
            size_t len = 0;
            while (q[len] && q[len] != ' ' && !(len > 0 && name_break(q[len - 1])))
                len++;
            if (len > 0) {
                double pw = piece_width(d, font, q, len, "");
                if (pw > name_need)
                    name_need = pw;
            }
            q += len;
            q += strspn(q, " ");
        }
    }
    double cap = NAME_CAP * sheet_width(d);
    need8[1] = name_need < cap ? name_need : cap;
}

/* What column c of t needs at its size, pt. */
static double col_need(const plumb_brief *b, const inv_table *t, const double *need8, size_t c,
                       double pt)
{
    return need8[table_col(b, t, c)] * pt / TABLE_PT_MAX * 1.03 + TABLE_PAD + 1.0;
}

/* The size of t (its type from TABLE_PT_MAX down to TABLE_PT_MIN) at
 * which every column holds its widest word within the width W, or 0
 * when none does. */
static double table_fits(const plumb_brief *b, inv_table *t, const double *need8, double W)
{
    t->n = (t->full ? 6 : 2) + (t->k1 - t->k0);
    for (double pt = TABLE_PT_MAX; pt >= TABLE_PT_MIN - 1e-9; pt -= 0.5) {
        double total = 0.0;
        for (size_t c = 0; c < t->n; c++)
            total += col_need(b, t, need8, c, pt);
        if (total <= W)
            return pt;
    }
    return 0.0;
}

/* t's column starts: each column as wide as its widest word, so that no
 * word is broken inside it ("exceeds", "(616.7 ft·lbf)" stay whole); the
 * width left over goes to the columns that want more than their words,
 * most to the item's name, as the shares below say. A table that does not
 * fit even so (one criterion with words too wide) is squeezed, and pango
 * breaks what it must. */
static void table_columns(const plumb_brief *b, inv_table *t, const double *need8, double W)
{
    double want[TABLE_COLS], need[TABLE_COLS], width[TABLE_COLS], total = 0.0, more = 0.0;
    size_t nk = t->k1 - t->k0;
    double ratio_w = 0.085, item_w = (t->full ? 0.47 : 0.83) - ratio_w * (double)nk;
    if (item_w < 0.16)
        item_w = 0.16;
    for (size_t c = 0; c < t->n; c++) {
        size_t f = table_col(b, t, c);
        want[c] = f == 0 ? 0.035 : f == 1 ? item_w : f == 2 ? 0.095 : f == 3 ? 0.14
                  : f < 4 + b->n_criteria ? ratio_w : f == 4 + b->n_criteria ? 0.09 : 0.12;
        need[c] = col_need(b, t, need8, c, t->pt);
        total += need[c];
        more += fmax(want[c] * W - need[c], 0.0);
    }
    for (size_t c = 0; c < t->n; c++) {
        if (total > W)
            width[c] = need[c] * W / total;
        else
            width[c] = need[c] + (W - total) * (more > 0.0 ? fmax(want[c] * W - need[c], 0.0) / more
                                                           : (c == 1 ? 1.0 : 0.0));
    }
    /* the name's column no wider than its cap (unless its need is), the
     * rest to the other columns alike */
    double cap = fmax(NAME_CAP * W, need[1]);
    if (t->n > 2 && width[1] > cap) {
        double extra = (width[1] - cap) / (double)(t->n - 1);
        width[1] = cap;
        for (size_t c = 0; c < t->n; c++)
            if (c != 1)
                width[c] += extra;
    }
    t->cx[0] = 0.0;
    for (size_t c = 1; c < t->n; c++)
        t->cx[c] = t->cx[c - 1] + width[c - 1] / W;
}

/* Splits the criteria into tables: the first with as many ratio columns
 * as fit beside the item's figures, the others with as many as fit beside
 * its number and name (at least one each). Returns how many tables. */
static size_t inventory_tables(const plumb_brief *b, const double *need8, double W,
                               inv_table *tables)
{
    size_t nt = 0, k0 = 0;
    do {
        inv_table *t = &tables[nt];
        memset(t, 0, sizeof *t);
        t->full = nt == 0;
        t->k0 = k0;
        size_t k1 = b->n_criteria;
        for (;; k1--) {
            t->k1 = k1;
            t->pt = table_fits(b, t, need8, W);
            if (t->pt > 0.0 || k1 <= k0 + 1)
                break;
        }
        if (t->pt <= 0.0)
            t->pt = TABLE_PT_MIN;
        t->k1 = k1;
        t->n = (t->full ? 6 : 2) + (t->k1 - t->k0);
        table_columns(b, t, need8, W);
        k0 = k1;
        nt++;
    } while (k0 < b->n_criteria && nt < PLUMB_MAX_VERDICTS);
    return nt;
}

/* A row of t; `name` the item's name as given (NULL: the header row),
 * drawn in lines of its column (name_lines). */
static double table_row(sheet_doc *d, const plumb_brief *b, const inv_table *t,
                        const char *const *all, const char *name, const char *font, int draw)
{
    double w = sheet_width(d), h = 0.0;
    for (size_t c = 0; c < t->n; c++) {
        double cw = (c + 1 < t->n ? t->cx[c + 1] : 1.0) * w - t->cx[c] * w - TABLE_PAD;
        size_t f = table_col(b, t, c);
        char lines[FMT_LEN];
        double ch = sheet_text(d, d->left + t->cx[c] * w, d->y, cw, font,
                               f == 1 && name ? name_lines(d, font, name, cw, lines, sizeof lines)
                                              : all[f], draw);
        if (ch > h)
            h = ch;
    }
    return h;
}

static void inventory_header(sheet_doc *d, const plumb_brief *b, const inv_table *t,
                             const char *bold)
{
    const char *cells[TABLE_COLS];
    ratio_store rs;
    inventory_header_cells(b, cells, &rs);
    double h = table_row(d, b, t, cells, NULL, bold, 0);
    sheet_need(d, h + 16.0);
    table_row(d, b, t, cells, NULL, bold, 1);
    d->y += h + 1.0;
    cairo_move_to(d->cr, d->left, d->y);
    cairo_line_to(d->cr, d->right, d->y);
    sheet_stroke(d, SHEET_SOLID, 0.6);
    d->y += 2.0;
}

void sheet_section_inventory(sheet_doc *d, const plumb_brief *b)
{
    writer *P = sheet_primary(d);
    sheet_heading(d, "Every item, worst first", 60.0);
    /* markup made once: each name escaped once (sheet_fmt without \x02
     * escapes what it is given, so a note built of two would escape the
     * inner one twice: "nuts &amp;amp; bolts") */
    const char *zone_note = "";
    if (b->zone) {
        const plumb_zone_item *zi = &b->zone->items[b->zone_item];
        zone_note = sheet_fmt(d, "\x02 The clearance zone is set by %s (largest clearance radius, "
                                 "%s).",
                              sheet_esc(d, zi->name),
                              sheet_fmt(d, "%s",
                                        plumbp_t_clear(P, plumbp_t_len, zi->result->zone.clearance_radius_m)));
    }
    const char *note = sheet_fmt(
        d, "\x02%zu items, sorted by their largest ratio to a criterion. Worst: %s.%s",
        b->fall->n_items, sheet_esc(d, b->fall->items[b->order[0]].spec->name), zone_note);
    char body[64];
    snprintf(body, sizeof body, "%s %.1f", SHEET_FONT, SHEET_BODY);
    sheet_para(d, body, note);
    if (b->n_criteria > 0) { /* the key of the ratio columns */
        char key[FMT_LEN] = "";
        size_t len = 0;
        for (size_t k = 0; k < b->n_criteria && len < sizeof key; k++)
            len += (size_t)snprintf(key + len, sizeof key - len, "%sC%zu %s", k ? ", " : "", k + 1,
                                    sheet_id(d, body, b->criteria[k]->id, sheet_width(d)));
        sheet_para(d, body, sheet_fmt(d, "\x02Ratio columns: %s (their sources are in section 2).",
                                      key));
    }
    double need8[TABLE_COLS];
    inv_table tables[PLUMB_MAX_VERDICTS];
    inventory_words(d, b, need8);
    size_t nt = inventory_tables(b, need8, sheet_width(d), tables);
    for (size_t ti = 0; ti < nt; ti++) {
        const inv_table *t = &tables[ti];
        char font[64], bold[64];
        table_fonts(t->pt, font, bold, sizeof font);
        d->running = d->heading;
        if (nt > 1) {
            d->y += ti > 0 ? GAP : 0.0;
            sheet_need(d, 60.0);
            sheet_para(d, body, sheet_fmt(d, "Ratios to C%zu to C%zu%s", t->k0 + 1, t->k1,
                                          ti + 1 < nt ? "" : " (the last of the ratio columns)"));
        }
        inventory_header(d, b, t, bold);
        for (size_t r = 0; r < b->fall->n_items; r++) {
            const char *cells[TABLE_COLS];
            ratio_store rs;
            inventory_row_cells(d, b, r, cells, &rs);
            const char *name = b->fall->items[b->order[r]].spec->name;
            double h = table_row(d, b, t, cells, name, font, 0);
            if (d->y + h > d->bottom) {
                sheet_new_page(d);
                inventory_header(d, b, t, bold);
                inventory_row_cells(d, b, r, cells, &rs); /* the page's footer used the ring */
            }
            table_row(d, b, t, cells, name, font, 1);
            d->y += h + 1.5;
        }
    }
    d->running = d->heading;
    sheet_descent_figures(d, b);
    d->running = NULL;
}
