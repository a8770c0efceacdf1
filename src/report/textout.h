/*
 * textout.h - what the text and CSV report writers share (the files of
 * src/report/): a memory-stream writer that remembers any non-finite
 * figure, numbers in plain decimal, word wrapping that never parts a number
 * from its unit, CSV fields and comment lines, compass points. Internal to
 * libplumb; the inline helpers keep one definition for both writers.
 */
#ifndef PLUMB_TEXTOUT_H
#define PLUMB_TEXTOUT_H

#include <ctype.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/report.h"
#include "core/internal.h"

/* Significant digits of text figures; digits of CSV numbers. */
#define TEXT_SIG 4
#define CSV_DIGITS 10
/* Width the text wraps sentences at, and the widest a table may be. */
#define TEXT_WIDTH 78
#define TABLE_WIDTH 80
/* Compass points naming a bearing. */
#define COMPASS_POINTS 16

enum { RING = 48, NUMBUF = 96 };

/* Joins a number to its unit so word wrapping never parts them; replaced
 * by a plain space before the text leaves the writer. */
#define NBSP "\x1F"
#define NBSP_CHAR '\x1F'


typedef struct writer {
    FILE *f;                 /* memory stream being written */
    char *buf;               /* its text (writer_finish), the writer's to free */
    size_t len;
    int us;                  /* 1: US customary display units */
    int bad;                 /* a non-finite figure was asked for */
    int exact;               /* 1: echoing inputs (see qty) */
    int strict;              /* 1: an upper limit, rounded down (see qty) */
    int round_dir;           /* +1: a keep-clear distance, rounded up; -1: the low end
                                of its interval, rounded down; 0: to nearest (see qty,
                                plumbp_t_round) */
    int sig;                 /* figures of a computed quantity; 0: TEXT_SIG (see qty) */
    int nomem;               /* an allocation failed: the report is refused */
    char ring[RING][NUMBUF]; /* formatted numbers, reused round-robin */
    unsigned next;
} writer;

static inline void put(writer *w, const char *fmt, ...) PLUMBP_PRINTF(2, 3);

static inline void put(writer *w, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vfprintf(w->f, fmt, ap);
    va_end(ap);
}

static inline char *slot(writer *w)
{
    char *b = w->ring[w->next % RING];
    w->next++;
    return b;
}

/* A slot for the figure x. When x is not finite the writer is flagged
 * (the report will be refused), the slot holds "?" and *ok is 0. */
static inline char *num_slot(writer *w, double x, int *ok)
{
    char *b = slot(w);
    *ok = plumbp_finite(x);
    if (!*ok) {
        w->bad = 1;
        snprintf(b, NUMBUF, "?");
    }
    return b;
}

/* x with `sig` significant digits in plain decimal notation (no exponent),
 * never "-0". Flags a non-finite x. */
static inline const char *num(writer *w, double x, int sig)
{
    int ok;
    char *b = num_slot(w, x, &ok);
    if (!ok)
        return b;
    if (x == 0.0) {
        snprintf(b, NUMBUF, "0");
        return b;
    }
    int mag = (int)floor(log10(fabs(x)));
    int dec = sig - 1 - mag;
    if (dec < 0) {
        /* Large figures keep `sig` digits and zeros after: 29984211 -> 29980000. */
        double unit = pow(10.0, (double)-dec);
        snprintf(b, NUMBUF, "%.0f", round(x / unit) * unit);
        return b;
    }
    if (dec > 15)
        dec = 15;
    snprintf(b, NUMBUF, "%.*f", dec, x);
    /* Rounding up to the next power of ten (9.9996 -> 10.000) adds a digit. */
    double back = strtod(b, NULL);
    if (back != 0.0 && (int)floor(log10(fabs(back))) > mag && dec > 0)
        snprintf(b, NUMBUF, "%.*f", dec - 1, x);
    if (strspn(b, "-0.") == strlen(b))
        snprintf(b, NUMBUF, "0");
    return b;
}

/* x in the shortest of %g's forms with `sig` significant digits ("0.9");
 * format.c. */
const char *plumbp_gnum(writer *w, double x, int sig);

/* A number for CSV: sig significant digits, shortest form. */
static inline const char *csvnum_at(writer *w, double x, int sig)
{
    return plumbp_gnum(w, x, sig);
}

/* A number for CSV: CSV_DIGITS significant digits, shortest form. */
static inline const char *csvnum(writer *w, double x)
{
    int ok;
    char *b = num_slot(w, x, &ok);
    if (!ok)
        return b;
    snprintf(b, NUMBUF, "%.*g", CSV_DIGITS, x == 0.0 ? 0.0 : x);
    return b;
}

/* The character starting at s (UTF-8, as the loader accepts it): its
 * length in bytes into *len (at least 1, never past a NUL), and the
 * columns it takes on a terminal: 2 for an East Asian wide or fullwidth
 * character, 0 for a combining mark, 1 otherwise (Unicode UAX #11 East
 * Asian Width, classes W and F, and general categories Mn and Me: the
 * main blocks of each, from memory of EastAsianWidth.txt, checked against
 * Python's unicodedata by tests/cli/report_width.py). */
static inline size_t char_cols(const char *s, size_t *len)
{
    const unsigned char *p = (const unsigned char *)s;
    size_t n = p[0] < 0x80 ? 1 : p[0] >= 0xF0 ? 4 : p[0] >= 0xE0 ? 3 : p[0] >= 0xC0 ? 2 : 1;
    unsigned long c = n == 1 ? p[0] : (unsigned long)(p[0] & (0x7F >> n));
    for (size_t i = 1; i < n; i++) {
        if ((p[i] & 0xC0) != 0x80) { /* cut short: what there is, as one */
            n = i;
            break;
        }
        c = (c << 6) | (p[i] & 0x3Fu);
    }
    *len = n;
    if ((c >= 0x0300 && c <= 0x036F) || (c >= 0x1AB0 && c <= 0x1AFF) ||
        (c >= 0x1DC0 && c <= 0x1DFF) || (c >= 0x20D0 && c <= 0x20FF) ||
        (c >= 0xFE00 && c <= 0xFE0F) || (c >= 0xFE20 && c <= 0xFE2F))
        return 0;
    if ((c >= 0x1100 && c <= 0x115F) || (c >= 0x2E80 && c <= 0x303E) ||
        (c >= 0x3041 && c <= 0x33FF) || (c >= 0x3400 && c <= 0x4DBF) ||
        (c >= 0x4E00 && c <= 0x9FFF) || (c >= 0xA000 && c <= 0xA4CF) ||
        (c >= 0xA960 && c <= 0xA97F) || (c >= 0xAC00 && c <= 0xD7A3) ||
        (c >= 0xF900 && c <= 0xFAFF) || (c >= 0xFE10 && c <= 0xFE19) ||
        (c >= 0xFE30 && c <= 0xFE6F) || (c >= 0xFF00 && c <= 0xFF60) ||
        (c >= 0xFFE0 && c <= 0xFFE6) || (c >= 0x1F300 && c <= 0x1F64F) ||
        (c >= 0x1F900 && c <= 0x1F9FF) || (c >= 0x20000 && c <= 0x3FFFD))
        return 2;
    return 1;
}

/* Columns a UTF-8 string takes on a terminal (char_cols). */
static inline size_t shown_width(const char *s)
{
    size_t n = 0, len;
    for (; *s; s += len)
        n += char_cols(s, &len);
    return n;
}

/* A unit as typed ("m^2", "m2", "m**2", "kg/m^3") as the reports spell
 * it ("m²", "kg/m³"): one spelling of square and cubic units whatever the
 * user typed. Other text is returned as it is. */
static inline const char *unit_shown(writer *w, const char *u)
{
    char *b = slot(w);
    size_t n = 0;
    /* a temperature as every report writes it */
    if (strcmp(u, "degC") == 0 || strcmp(u, "degF") == 0) {
        snprintf(b, NUMBUF, "\xC2\xB0%c", u[3]);
        return b;
    }
    for (const char *p = u; *p && n + 3 < NUMBUF;) {
        const char *sup = NULL;
        size_t skip = 0;
        char d = 0;
        if (p[0] == '^' && (p[1] == '2' || p[1] == '3'))
            d = p[1], skip = 2;
        else if (p[0] == '*' && p[1] == '*' && (p[2] == '2' || p[2] == '3'))
            d = p[2], skip = 3;
        else if ((p[0] == '2' || p[0] == '3') && p > u && isalpha((unsigned char)p[-1]))
            d = p[0], skip = 1;
        /* only a whole exponent: "m^2" and "m2/s", never the 2 of "m^25" */
        if (d && isdigit((unsigned char)p[skip]))
            d = 0;
        if (d)
            sup = d == '2' ? "\xC2\xB2" : "\xC2\xB3";
        if (sup) {
            b[n++] = sup[0];
            b[n++] = sup[1];
            p += skip;
        } else {
            b[n++] = *p++;
        }
    }
    b[n] = '\0';
    return b;
}

/* How sure a criterion's figure is when it was not read in the source
 * itself (criteria files' status: seen | transcribed | memory), for every
 * report that names the criterion; "" for a figure seen in the source. */
static inline const char *status_note_of(const char *status)
{
    if (strcmp(status, "memory") == 0)
        return "figure from memory, not confirmed in the source";
    if (strcmp(status, "transcribed") == 0)
        return "figure transcribed from a copy of the source";
    return "";
}

/* s padded with spaces to `width` columns, left or right aligned. */
static inline void pad(writer *w, const char *s, size_t width, int right)
{
    size_t n = shown_width(s);
    size_t fill = n < width ? width - n : 0;
    if (right)
        put(w, "%*s%s", (int)fill, "", s);
    else
        put(w, "%s%*s", s, (int)fill, "");
}

/* One header over two columns that hold the same quantity in two units
 * (energy in J and in ft·lbf): the label centred in `width` shown
 * characters, dashes either side to mark how far it reaches, so that no
 * two columns of a table share a header; the unit line below tells the
 * two apart. */
static inline void span_head(writer *w, const char *label, size_t width)
{
    size_t n = shown_width(label), fill = width > n + 2 ? width - n : 2;
    size_t left = fill / 2, right = fill - left;
    for (size_t i = 0; i < left; i++)
        put(w, "-");
    put(w, "%s", label);
    for (size_t i = 0; i < right; i++)
        put(w, "-");
}

/* A criterion's cell in a table (the inventory of a fall, a sweep): the
 * ratio right-aligned in a column ratio_w wide, a space, the verdict word
 * ("EXCEEDS", "within") left-aligned in one VERDICT_W wide, after `gap`
 * spaces; so the ratios and the words of a criterion line up row under
 * row. The word is not padded when the cell ends its line (`last`): no
 * line ends in spaces. The header "ratio verdict" is a cell as well. */
enum { VERDICT_W = 7 };
static inline size_t verdict_cell_width(size_t gap, size_t ratio_w)
{
    return gap + ratio_w + 1 + VERDICT_W;
}

static inline void verdict_cell(writer *w, size_t gap, size_t ratio_w, const char *ratio,
                                const char *word, int last)
{
    put(w, "%*s", (int)gap, "");
    pad(w, ratio, ratio_w, 1);
    put(w, " ");
    if (last)
        put(w, "%s", word);
    else
        pad(w, word, VERDICT_W, 0);
}

/* 1 when a word looks like the unit of the number before it ("m",
 * "m^2", "kg", "ft·lbf", "%", "%)"): short and starting with a letter or
 * a percent sign (SI Brochure, 9th ed., 2019, 5.4.7: a space between the
 * number and %, which is as much the number's as a unit is). */
static inline int unit_like(const char *p, size_t len)
{
    return len > 0 && len <= 8 &&
           (isalpha((unsigned char)p[0]) || (unsigned char)p[0] >= 0x80 || p[0] == '%');
}

/* Columns of the first len bytes of s (see shown_width). */
static inline size_t shown_width_n(const char *s, size_t len)
{
    size_t n = 0, cl;
    for (size_t i = 0; i < len && s[i]; i += cl)
        n += char_cols(s + i, &cl);
    return n;
}

static inline int breaks_after_char(unsigned char c)
{
    return c == '-' || c == '/' || c == '_';
}

/* 1 when a word of p (len bytes, words parted by spaces) may be broken
 * after its byte i: after a '-' or '/' inside a word (the break after a
 * hyphen or a solidus of Unicode UAX #14, line breaking classes HY and
 * SY), or an '_' (common practice for names, no source); never after a
 * leading sign, at a word's end, inside a run of them ("--"), nor in a
 * figure ("1/2", "10-20"). */
static inline int break_after(const char *p, size_t i, size_t len)
{
    if (!breaks_after_char((unsigned char)p[i]) || i == 0 || i + 1 >= len)
        return 0;
    unsigned char a = (unsigned char)p[i - 1], b = (unsigned char)p[i + 1];
    if (a == ' ' || a == NBSP_CHAR || b == ' ' || b == NBSP_CHAR || b == '\0' ||
        breaks_after_char(b))
        return 0;
    return !(isdigit(a) && isdigit(b));
}

/* 1 when a word of p (len bytes) may be broken between its character at
 * byte i (cl bytes) and the next: after a hyphen, solidus or underscore
 * (break_after), or between two East Asian wide characters (char_cols 2:
 * ideographs, kana, Hangul, UAX #14 class ID, a break opportunity before
 * and after each; written without a mark, as CJK text is). */
static inline int break_between(const char *p, size_t i, size_t cl, size_t len)
{
    if (cl == 1)
        return break_after(p, i, len);
    size_t ncl;
    return i + cl < len && p[i + cl] != '\0' && char_cols(p + i, &ncl) == 2 &&
           char_cols(p + i + cl, &ncl) == 2;
}

/* The mark that ends a line where a word was cut with no break
 * opportunity there (an 85-letter part number): a backslash, one column.
 * Not a hyphen: the reports break names after their own hyphens, so an
 * added one could not be told from the name's, and the name could not be
 * read back whole (or typed into --set items[NAME]); a backslash is the
 * line continuation of the shell and of C, and what a terminal editor
 * (Emacs) shows at the edge of a continued line (from memory). */
#define CUT_MARK "\\"
#define CUT_MARK_COLS 1

/* The longest head of p (n bytes) of whole characters at most `cols`
 * columns wide, in bytes; a zero-width mark stays with its base. */
static inline size_t head_within(const char *p, size_t n, size_t cols)
{
    size_t m = 0, shown = 0, cl;
    while (m < n && p[m]) {
        size_t cw = char_cols(p + m, &cl);
        if (shown + cw > cols || m + cl > n) /* a character is never split */
            break;
        shown += cw;
        m += cl;
    }
    return m;
}

/* The longest head of the word p (len bytes, no spaces) that is at most
 * `room` columns wide and ends at a break (break_between), in bytes; 0
 * when there is none. With `hard`, when there is none, the whole
 * characters that fit with the cut mark after them (at least one): the
 * word is cut where the line ends, *cut set to 1 so that the caller
 * writes CUT_MARK after the head, and its rest goes on the next line,
 * never dropped. *cut is 0 otherwise. */
static inline size_t word_head(const char *p, size_t len, size_t room, int hard, int *cut)
{
    size_t shown = 0, brk = 0, cl;
    *cut = 0;
    for (size_t i = 0; i < len; i += cl) {
        size_t cw = char_cols(p + i, &cl);
        if (shown + cw > room)
            break;
        shown += cw;
        if (break_between(p, i, cl, len))
            brk = i + cl;
    }
    if (brk || !hard)
        return brk;
    size_t fit = room > CUT_MARK_COLS ? head_within(p, len, room - CUT_MARK_COLS) : 0;
    if (fit > 0) {
        *cut = 1;
        return fit;
    }
    /* no room even for one character and the mark: one, so the text moves on */
    (void)char_cols(p, &cl);
    return cl < len ? cl : len;
}

/* Writes text after `lead`, word-wrapped at TEXT_WIDTH, continuation lines
 * indented to the width of `lead`. A number stays on the line of its unit;
 * a word longer than a whole line (an item's name without spaces) is
 * broken after a hyphen, slash or underscore or between wide characters
 * (word_head), as much of it as fits on the line it starts, and only where
 * it has none is it cut where the line ends, the cut marked (CUT_MARK): no
 * line is wider than TEXT_WIDTH unless the lead is, and no word is cut
 * short. */
static inline void wrapped(writer *w, const char *lead, const char *text)
{
    size_t indent = shown_width(lead);
    size_t col = indent;
    put(w, "%s", lead);
    const char *p = text;
    int first = 1;
    while (*p) {
        while (*p == ' ')
            p++;
        if (!*p)
            break;
        size_t len = strcspn(p, " ");
        size_t ww = shown_width_n(p, len);
        /* a number and its unit stay on one line: fit them as one */
        size_t need = ww;
        const char *next = p + len;
        while (*next == ' ')
            next++;
        size_t nlen = strcspn(next, " ");
        if (isdigit((unsigned char)p[len - 1]) && unit_like(next, nlen))
            need += 1 + shown_width_n(next, nlen);
        if (indent + ww > TEXT_WIDTH) {
            /* too long for any line: broken, its first piece on this line */
            for (;;) {
                size_t used = col + (first ? 0 : 1);
                size_t room = TEXT_WIDTH > used ? TEXT_WIDTH - used : 0;
                if (ww <= room)
                    break;
                int cut;
                size_t head = word_head(p, len, room, first, &cut);
                if (head > 0) {
                    put(w, "%s%.*s%s", first ? "" : " ", (int)head, p, cut ? CUT_MARK : "");
                    p += head;
                    len -= head;
                    ww = shown_width_n(p, len);
                }
                put(w, "\n%*s", (int)indent, "");
                col = indent;
                first = 1;
            }
        } else if (!first && col + 1 + need > TEXT_WIDTH) {
            put(w, "\n%*s", (int)indent, "");
            col = indent;
            first = 1;
        }
        put(w, "%s%.*s", first ? "" : " ", (int)len, p);
        col += ww + (first ? 0 : 1);
        first = 0;
        p += len;
    }
    put(w, "\n");
}

/* The first line of s word-wrapped to `width` columns, into part. The
 * line ends at its last space, or at a break inside a word (after a
 * hyphen, slash or underscore, or between wide characters:
 * break_between) when that fills it better (the last space, if any, in its
 * first half); a word longer than the width with none of these is cut
 * where the line ends, the cut marked (CUT_MARK, within the width), rather
 * than moved down whole to a line it would not fit either ("5" alone above
 * the name of item 5).
 * Returns the rest of s (past the spaces that end the line), "" when s
 * fits. */
static inline const char *wrap_cell(const char *s, size_t width, char *part, size_t size)
{
    size_t n = 0, shown = 0, len = strlen(s), cl;
    size_t space = 0, space_shown = 0, brk = 0;
    int has_space = 0;
    for (; s[n]; n += cl) {
        size_t cw = char_cols(s + n, &cl);
        /* a multi-byte character is never split */
        if (shown + cw > width || n + cl + 1 > size)
            break;
        if (s[n] == ' ') {
            space = n;
            space_shown = shown;
            has_space = 1;
        } else if (break_between(s, n, cl, len)) {
            brk = n + cl;
        }
        shown += cw;
    }
    int cut = 0;
    /* the word after the last space is cut wherever it goes: here */
    int must_cut = has_space && shown_width_n(s + space + 1, strcspn(s + space + 1, " ")) > width;
    if (s[n] && s[n] != ' ') {
        int hard = 0;
        if (must_cut && brk > space)
            n = brk;
        else if (must_cut)
            hard = 1;
        else if (has_space && (brk < space || 2 * space_shown >= width))
            n = space;
        else if (brk)
            n = brk;
        else if (has_space)
            n = space;
        else
            hard = 1;
        if (hard && n == 0 && size > 4) {
            (void)char_cols(s, &n); /* not even one character fits: one, so the text moves on */
        } else if (hard && width > CUT_MARK_COLS && size > sizeof CUT_MARK) {
            /* cut, with room for the mark in the width and in part */
            size_t bytes = size - sizeof CUT_MARK;
            size_t m = head_within(s, n < bytes ? n : bytes, width - CUT_MARK_COLS);
            if (m > 0) {
                n = m;
                cut = 1;
            }
        }
    }
    const char *p = s + n;
    memcpy(part, s, n);
    while (n > 0 && part[n - 1] == ' ')
        n--;
    if (cut) {
        memcpy(part + n, CUT_MARK, sizeof CUT_MARK - 1);
        n += sizeof CUT_MARK - 1;
    }
    part[n] = '\0';
    while (*p == ' ')
        p++;
    return p;
}

/* The continuation lines of a table cell wrapped in its column (an item's
 * name in the tables of fall, sweep and zone): the rest of the cell after
 * its first line (wrap_cell), `width` columns a line, each line
 * `indent` spaces in. Writes nothing when rest is "". */
static inline void cell_continued(writer *w, size_t indent, const char *rest, size_t width)
{
    while (*rest) {
        char part[4 * TABLE_WIDTH + 1]; /* a line of the widest column, 4 bytes a character */
        rest = wrap_cell(rest, width, part, sizeof part);
        put(w, "%*s%s\n", (int)indent, "", part);
    }
}

static inline double wrap_deg(double a)
{
    double w = fmod(a, 360.0);
    if (w < 0.0)
        w += 360.0;
    return w;
}

static inline const char *compass(double bearing_deg)
{
    static const char *const points[COMPASS_POINTS] = {
        "N", "NNE", "NE", "ENE", "E", "ESE", "SE", "SSE",
        "S", "SSW", "SW", "WSW", "W", "WNW", "NW", "NNW"};
    double sector = 360.0 / COMPASS_POINTS;
    long k = lround(floor(wrap_deg(bearing_deg + sector / 2.0) / sector));
    return points[(size_t)k % COMPASS_POINTS];
}

/* 1 when a text cell starts with a character a spreadsheet may take as
 * the start of a formula (= + - @, a tab or a carriage return: OWASP,
 * "CSV Injection", owasp.org/www-community/attacks/CSV_Injection). */
static inline int csv_formula_start(const char *s)
{
    return s[0] != '\0' && strchr("=+-@\t\r", s[0]) != NULL;
}

/* A TEXT cell of every CSV report (a name, a key, a unit, a message),
 * quoted as RFC 4180 asks when it holds a comma, quote or line end. A text
 * that a spreadsheet would read as a formula ("=1+2 formula", "@SUM(...)",
 * "-2+3") is neutralised as OWASP's "CSV Injection" guidance recommends: a
 * single quote before it, so the cell shows as text and no formula runs.
 * Numbers never go through here (csvnum, put), so a negative number stays
 * a number. README.md "plumb fall", CSV. */
static inline void csv_field(writer *w, const char *s)
{
    const char *lead = csv_formula_start(s) ? "'" : "";
    if (strpbrk(s, ",\"\r\n") == NULL) {
        put(w, "%s%s", lead, s);
        return;
    }
    fputc('"', w->f);
    fputs(lead, w->f);
    for (const char *p = s; *p; p++) {
        if (*p == '"')
            fputc('"', w->f);
        fputc(*p, w->f);
    }
    fputc('"', w->f);
}

static inline void csv_comment(writer *w, const char *text)
{
    /* A comment line never contains a line end of its own. */
    fputs("# ", w->f);
    for (const char *p = text; *p; p++)
        fputc((*p == '\n' || *p == '\r') ? ' ' : *p, w->f);
    fputc('\n', w->f);
}

/* Opens the memory stream a report is made in. */
/* report.c: a text or CSV report made in memory and written all or
 * nothing. plumbp_writer_open starts w (US units for PLUMB_UNITS_US;
 * PLUMB_ENOMEM when it cannot); plumbp_writer_close ends it and writes its
 * text to out, or refuses it: PLUMB_ENUMERIC when a figure was not finite,
 * PLUMB_ENOMEM when memory ran out on the way, PLUMB_EWRITE when out
 * fails. Either way w's text is freed. */
plumb_status plumbp_writer_open(writer *w, plumb_unit_system units, plumb_diag *diag);
plumb_status plumbp_writer_close(writer *w, FILE *out, plumb_diag *diag);

static inline int writer_start(writer *w, int us)
{
    memset(w, 0, sizeof *w);
    w->us = us;
    w->f = open_memstream(&w->buf, &w->len);
    return w->f != NULL;
}

/* Closes the stream and turns the number-unit joins into spaces; returns
 * 0 when the stream failed. */
static inline int writer_finish(writer *w)
{
    int ok = !ferror(w->f);
    if (fclose(w->f) != 0)
        ok = 0;
    w->f = NULL;
    for (size_t i = 0; w->buf && i < w->len; i++)
        if (w->buf[i] == NBSP_CHAR)
            w->buf[i] = ' ';
    return ok && w->buf;
}

#endif /* PLUMB_TEXTOUT_H */
