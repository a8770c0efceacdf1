/*
 * sheet_page.c - the PDF sheet's text and pages: pango markup set and
 * measured, escaped and formatted strings (the text report's formatters,
 * format.c), line styles, and the pages with their footers (page n of m
 * and the short caution, SAFETY.md section 1), headings and paragraphs
 * kept together.
 */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <cairo-pdf.h>

#include "report/sheet_doc.h"
#include "report/common.h"

/* The short caution of every footer (SAFETY.md section 1; README.md "plumb
 * sheet"). */
static const char footer_caution[] =
    "An engineering estimate from a point-mass model, not a measurement: real objects deflect, "
    "bounce, break and tumble, and energy limits are not guarantees of safety. Follow local codes "
    "and regulations and the judgment of a competent or licensed person.";


/* ---- text ------------------------------------------------------------------ */

/* The formatters' number-unit join (NBSP_CHAR) as a no-break space,
 * U+00A0, into out. */
static void join_nbsp(const char *in, char *out, size_t size)
{
    size_t j = 0;
    for (const char *p = in; *p && j + 3 < size; p++) {
        if (*p == NBSP_CHAR) {
            out[j++] = '\xC2';
            out[j++] = '\xA0';
        } else {
            out[j++] = *p;
        }
    }
    out[j] = '\0';
}

const char *sheet_esc(sheet_doc *d, const char *s)
{
    char *b = d->ring[d->next++ % SHEET_RING];
    char joined[FMT_LEN];
    join_nbsp(s, joined, sizeof joined);
    gchar *e = g_markup_escape_text(joined, -1);
    snprintf(b, FMT_LEN, "%s", e ? e : "");
    g_free(e);
    return b;
}

const char *sheet_fmt(sheet_doc *d, const char *fmt, ...)
{
    char raw[FMT_LEN];
    int markup = fmt[0] == '\x02';
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(raw, sizeof raw, markup ? fmt + 1 : fmt, ap);
    va_end(ap);
    char joined[FMT_LEN];
    join_nbsp(raw, joined, sizeof joined);
    if (markup) {
        char *b = d->ring[d->next++ % SHEET_RING];
        snprintf(b, FMT_LEN, "%s", joined);
        return b;
    }
    return sheet_esc(d, joined);
}

/* A criterion's id in brackets as markup that pango never breaks across
 * lines (a span with allow_breaks="false": no invisible characters, so the
 * PDF's text is the plain id, to be searched and copied), unless the id
 * alone is wider than `w` points in `font`, when breaking is the only way
 * to keep it inside the column (w <= 0: no check). */
const char *sheet_id(sheet_doc *d, const char *font, const char *id, double w)
{
    const char *esc = sheet_esc(d, id);
    char plain[FMT_LEN];
    snprintf(plain, sizeof plain, "[%s]", esc);
    if (w > 0.0 && sheet_text_width(d, font, plain) > w)
        return sheet_fmt(d, "\x02%s", plain);
    return sheet_fmt(d, "\x02<span allow_breaks=\"false\">%s</span>", plain);
}

/* Characters listed by name in the message of a text no font can draw. */
enum { GLYPHS_LISTED = 6, GLYPH_TEXT_CHARS = 40 };

/* The text just set, checked for characters that no installed font has:
 * pango draws each as an empty box, so a name in another script would be
 * lost from the signed sheet (README.md "plumb sheet": a missing font
 * exits 3). The first such text, shortened to GLYPH_TEXT_CHARS
 * characters on one line, and its characters as U+XXXX, go into
 * d->no_glyph, which makes the sheet fail. Pango marks such a glyph with
 * PANGO_GLYPH_UNKNOWN_FLAG over the character's code point (Pango
 * reference, PangoGlyph, PANGO_GET_UNKNOWN_GLYPH). */
static void check_glyphs(sheet_doc *d)
{
    if (d->no_glyph[0] || pango_layout_get_unknown_glyphs_count(d->layout) == 0)
        return;
    gunichar seen[GLYPHS_LISTED];
    size_t n_seen = 0, n_more = 0;
    PangoLayoutIter *it = pango_layout_get_iter(d->layout);
    do {
        PangoGlyphItem *run = pango_layout_iter_get_run_readonly(it);
        for (int i = 0; run && i < run->glyphs->num_glyphs; i++) {
            PangoGlyph g = run->glyphs->glyphs[i].glyph;
            gunichar c = g & ~PANGO_GLYPH_UNKNOWN_FLAG;
            if (!(g & PANGO_GLYPH_UNKNOWN_FLAG) || c > 0x10FFFF)
                continue;
            size_t k = 0;
            while (k < n_seen && seen[k] != c)
                k++;
            if (k < n_seen)
                continue;
            if (n_seen < GLYPHS_LISTED)
                seen[n_seen++] = c;
            else
                n_more++;
        }
    } while (pango_layout_iter_next_run(it));
    pango_layout_iter_free(it);
    char chars[GLYPHS_LISTED * 12 + 32] = "";
    size_t len = 0;
    int private_use = n_seen > 0;
    for (size_t k = 0; k < n_seen; k++) {
        len += (size_t)snprintf(chars + len, sizeof chars - len, "%sU+%04X", k ? " " : "",
                                (unsigned)seen[k]);
        private_use = private_use && g_unichar_type(seen[k]) == G_UNICODE_PRIVATE_USE;
    }
    if (n_more)
        snprintf(chars + len, sizeof chars - len, " and %zu more", n_more);
    /* the text on one line, cut at a character's boundary */
    const char *text = pango_layout_get_text(d->layout);
    const char *end = text + strlen(text);
    if (g_utf8_strlen(text, -1) > GLYPH_TEXT_CHARS)
        end = g_utf8_offset_to_pointer(text, GLYPH_TEXT_CHARS);
    char line[GLYPH_TEXT_CHARS * 4 + 8];
    size_t j = 0;
    for (const char *p = text; p < end && j + 1 < sizeof line; p++)
        line[j++] = (*p == '\n' || *p == '\t' || *p == '\r') ? ' ' : *p;
    line[j] = '\0';
    snprintf(d->no_glyph, sizeof d->no_glyph,
             "no installed font has the characters %s of '%s%s' (they would print as empty "
             "boxes); %s",
             n_seen ? chars : "(not named by pango)", line, *end ? "..." : "",
             private_use ? "they are private-use characters, which only a font made for them "
                           "has: write the text without them"
                         : "install a font that has them (on Debian: apt-get install "
                           "fonts-wqy-microhei for Chinese, Japanese and Korean)");
}

static void set_markup(sheet_doc *d, double w, const char *font, const char *markup)
{
    PangoFontDescription *fd = pango_font_description_from_string(font);
    pango_layout_set_font_description(d->layout, fd);
    pango_font_description_free(fd);
    pango_layout_set_width(d->layout, w > 0.0 ? (int)(w * PANGO_SCALE) : -1);
    pango_layout_set_wrap(d->layout, PANGO_WRAP_WORD_CHAR);
    pango_layout_set_markup(d->layout, markup, -1);
    check_glyphs(d);
}

double sheet_text(sheet_doc *d, double x, double y, double w, const char *font, const char *markup,
                  int draw)
{
    set_markup(d, w, font, markup);
    int pw, ph;
    pango_layout_get_size(d->layout, &pw, &ph);
    if (draw) {
        cairo_move_to(d->cr, x, y);
        pango_cairo_show_layout(d->cr, d->layout);
    }
    return (double)ph / PANGO_SCALE;
}

double sheet_text_width(sheet_doc *d, const char *font, const char *markup)
{
    set_markup(d, 0.0, font, markup);
    int pw, ph;
    pango_layout_get_size(d->layout, &pw, &ph);
    return (double)pw / PANGO_SCALE;
}

void sheet_text_at(sheet_doc *d, double x, double y, int align, const char *font,
                   const char *markup)
{
    double w = sheet_text_width(d, font, markup);
    double x0 = align == 1 ? x - w : align == 2 ? x - w / 2.0 : x;
    cairo_move_to(d->cr, x0, y);
    pango_cairo_show_layout(d->cr, d->layout);
}

void sheet_stroke(sheet_doc *d, sheet_line style, double width)
{
    static const double dash[] = {5.0, 3.0}, dot[] = {1.0, 2.5}, dashdot[] = {6.0, 2.5, 1.0, 2.5},
                        dashdotdot[] = {6.0, 2.0, 1.0, 2.0, 1.0, 2.0}, longdash[] = {12.0, 2.5};
    cairo_set_line_width(d->cr, width);
    switch (style) {
    case SHEET_DASHED: cairo_set_dash(d->cr, dash, 2, 0.0); break;
    case SHEET_DOTTED:
        cairo_set_line_cap(d->cr, CAIRO_LINE_CAP_ROUND);
        cairo_set_dash(d->cr, dot, 2, 0.0);
        break;
    case SHEET_DASHDOT: cairo_set_dash(d->cr, dashdot, 4, 0.0); break;
    case SHEET_DASHDOTDOT: cairo_set_dash(d->cr, dashdotdot, 6, 0.0); break;
    case SHEET_LONGDASH: cairo_set_dash(d->cr, longdash, 2, 0.0); break;
    default: cairo_set_dash(d->cr, NULL, 0, 0.0); break;
    }
    cairo_stroke(d->cr);
    cairo_set_dash(d->cr, NULL, 0, 0.0);
    cairo_set_line_cap(d->cr, CAIRO_LINE_CAP_BUTT);
}

/* ---- pages ------------------------------------------------------------------ */

static void footer(sheet_doc *d)
{
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 7.0);
    double y = d->ph - MARGIN - FOOTER_BAND + 8.0;
    cairo_set_source_rgb(d->cr, 0, 0, 0);
    cairo_move_to(d->cr, d->left, y - 4.0);
    cairo_line_to(d->cr, d->right, y - 4.0);
    sheet_stroke(d, SHEET_SOLID, 0.5);
    double h = sheet_text(d, d->left, y, sheet_width(d), font, sheet_esc(d, footer_caution), 1);
    const char *pg = d->pages ? sheet_fmt(d, "page %d of %d", d->page, d->pages)
                              : sheet_fmt(d, "page %d of %d", d->page, d->page);
    char mono[64];
    snprintf(mono, sizeof mono, "%s %.1f", SHEET_MONO, 7.0);
    sheet_text(d, d->left, y + h + 2.0, 0.0, mono,
               sheet_fmt(d, "profile SHA-256 %s", d->footer_hash), 1);
    char bold[64];
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, 8.0);
    sheet_text_at(d, d->right, y + h + 1.5, 1, bold, pg);
}

void sheet_end_page(sheet_doc *d)
{
    if (d->page == 0)
        return;
    footer(d);
    cairo_show_page(d->cr);
}

void sheet_new_page(sheet_doc *d)
{
    sheet_end_page(d);
    d->page++;
    d->y = d->top;
    if (d->running) {
        char font[64];
        snprintf(font, sizeof font, "%s Bold %.1f", SHEET_FONT, SHEET_BODY);
        d->y += sheet_text(d, d->left, d->y, sheet_width(d), font,
                           sheet_fmt(d, "%s (continued)", d->running), 1) + GAP;
    }
}

void sheet_need(sheet_doc *d, double h)
{
    if (d->page == 0 || d->y + h > d->bottom)
        sheet_new_page(d);
}

void sheet_para(sheet_doc *d, const char *font, const char *markup)
{
    double h = sheet_text(d, d->left, d->y, sheet_width(d), font, markup, 0);
    sheet_need(d, h);
    sheet_text(d, d->left, d->y, sheet_width(d), font, markup, 1);
    d->y += h + GAP / 2.0;
}

void sheet_heading(sheet_doc *d, const char *name, double keep)
{
    char font[64];
    snprintf(font, sizeof font, "%s Bold %.1f", SHEET_FONT, 13.0);
    d->running = NULL;
    /* numbered in the order drawn, so that no number is skipped when a
     * section does not apply (the inventory of a single payload) */
    snprintf(d->heading, sizeof d->heading, "%d. %s", ++d->section, name);
    const char *title = d->heading;
    double h = sheet_text(d, d->left, d->y, sheet_width(d), font, sheet_esc(d, title), 0);
    if (d->y > d->top)
        d->y += SECTION_GAP - GAP;
    sheet_need(d, h + 4.0 + keep);
    sheet_text(d, d->left, d->y, sheet_width(d), font, sheet_esc(d, title), 1);
    d->y += h + 1.5;
    cairo_move_to(d->cr, d->left, d->y);
    cairo_line_to(d->cr, d->right, d->y);
    sheet_stroke(d, SHEET_SOLID, 0.8);
    d->y += 4.0;
    d->running = title;
}

