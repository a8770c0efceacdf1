/*
 * sheet.c - the printable safety sheet (include/plumb/sheet.h): the PDF
 * document, drawn section by section. Its text, pages and footers are in
 * sheet_page.c; the sections that are text (the header, the answer, the
 * inventory table, the inputs, the cautions) in sheet_sections.c; the
 * pictures in sheet_plot.c and sheet_plan.c.
 *
 * The document is drawn twice: once to count its pages (so every footer
 * can say "page n of m"), then for real into memory; only a whole PDF is
 * written out. Figures are formatted by the same formatters as the text
 * report (format.c), so the sheet and `plumb fall` agree digit for digit.
 */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <cairo-pdf.h>

#include "plumb/version.h"
#include "report/sheet_doc.h"
#include "report/common.h"

/* Page sizes, pt: ISO 216 A4 210 x 297 mm; US letter 8.5 x 11 in. */
#define A4_W (210.0 * MM_PT)
#define A4_H (297.0 * MM_PT)
#define LETTER_W (8.5 * 72.0)
#define LETTER_H (11.0 * 72.0)

/* ---- the document ---------------------------------------------------------------------- */

static plumb_status draw_all(sheet_doc *d, const plumb_brief *const *briefs, size_t n,
                             plumb_diag *diag)
{
    plumb_status st = PLUMB_OK;
    for (size_t i = 0; st == PLUMB_OK && i < n; i++) {
        const plumb_brief *b = briefs[i];
        d->running = NULL;
        d->section = 0;
        if (d->page > 0)
            sheet_end_page(d);
        d->page++;
        d->y = d->top;
        plumbp_strlcpy(d->footer_hash, plumb_profile_sha256(b->profile), sizeof d->footer_hash);
        sheet_section_header(d, b);
        st = sheet_section_answer(d, b, diag);
        if (st != PLUMB_OK)
            break;
        sheet_section_plots(d, b);
        sheet_section_plan(d, b);
        if (b->fall->n_items > 1)
            sheet_section_inventory(d, b);
        st = sheet_section_inputs(d, b, diag);
        if (st == PLUMB_OK)
            sheet_section_cautions(d);
    }
    sheet_end_page(d);
    return st;
}

typedef struct membuf {
    unsigned char *p;
    size_t len, cap;
    int failed;
} membuf;

static cairo_status_t to_mem(void *closure, const unsigned char *data, unsigned int length)
{
    membuf *m = closure;
    if (!m)
        return CAIRO_STATUS_SUCCESS; /* the counting pass */
    if (m->len + length > m->cap) {
        size_t cap = m->cap ? m->cap : 65536;
        while (cap < m->len + length)
            cap *= 2;
        unsigned char *p = realloc(m->p, cap);
        if (!p) {
            m->failed = 1;
            return CAIRO_STATUS_WRITE_ERROR;
        }
        m->p = p;
        m->cap = cap;
    }
    memcpy(m->p + m->len, data, length);
    m->len += length;
    return CAIRO_STATUS_SUCCESS;
}

/* The family pango will use for SHEET_FONT: DejaVu Sans must be there, or
 * the sheet would silently come out in another font. */
static int font_present(PangoLayout *layout, char *found, size_t size)
{
    PangoFontDescription *fd = pango_font_description_from_string(SHEET_FONT " 9");
    PangoFont *f = pango_context_load_font(pango_layout_get_context(layout), fd);
    pango_font_description_free(fd);
    int ok = 0;
    found[0] = '\0';
    if (f) {
        PangoFontDescription *got = pango_font_describe(f);
        const char *fam = pango_font_description_get_family(got);
        snprintf(found, size, "%s", fam ? fam : "");
        ok = fam && strcmp(fam, SHEET_FONT) == 0;
        pango_font_description_free(got);
        g_object_unref(f);
    }
    return ok;
}

static void iso_date(long long t, char *buf, size_t size)
{
    time_t tt = (time_t)t;
    struct tm u;
    gmtime_r(&tt, &u);
    if (strftime(buf, size, "%Y-%m-%dT%H:%M:%SZ", &u) == 0)
        buf[0] = '\0';
}

/* One pass: the whole document onto a PDF surface writing to m (NULL:
 * nowhere, to count the pages). */
static plumb_status one_pass(sheet_doc *d, const plumb_brief *const *briefs, size_t n, membuf *m,
                             plumb_diag *diag)
{
    cairo_surface_t *sf = cairo_pdf_surface_create_for_stream(to_mem, m, d->pw, d->ph);
    if (cairo_surface_status(sf) != CAIRO_STATUS_SUCCESS) {
        cairo_surface_destroy(sf);
        return PLUMB_RAISE(diag, PLUMB_EWRITE, "cannot make the PDF: %s",
                           cairo_status_to_string(cairo_surface_status(sf)));
    }
    char date[32], creator[64];
    iso_date(d->opt->time_utc, date, sizeof date);
    snprintf(creator, sizeof creator, "plumb %s", d->opt->version ? d->opt->version : "");
    cairo_pdf_surface_set_metadata(sf, CAIRO_PDF_METADATA_CREATE_DATE, date);
    cairo_pdf_surface_set_metadata(sf, CAIRO_PDF_METADATA_MOD_DATE, date);
    cairo_pdf_surface_set_metadata(sf, CAIRO_PDF_METADATA_CREATOR, creator);
    cairo_pdf_surface_set_metadata(sf, CAIRO_PDF_METADATA_TITLE,
                                   plumb_profile_name(briefs[0]->profile));
    d->cr = cairo_create(sf);
    d->layout = pango_cairo_create_layout(d->cr);
    /* no hinting: the same layout whatever the device */
    cairo_font_options_t *fo = cairo_font_options_create();
    cairo_font_options_set_hint_metrics(fo, CAIRO_HINT_METRICS_OFF);
    cairo_font_options_set_hint_style(fo, CAIRO_HINT_STYLE_NONE);
    pango_cairo_context_set_font_options(pango_layout_get_context(d->layout), fo);
    /* one point of type is one point of the page (pango's default is 96 dpi) */
    pango_cairo_context_set_resolution(pango_layout_get_context(d->layout), 72.0);
    cairo_font_options_destroy(fo);
    pango_layout_context_changed(d->layout);
    plumb_status st = PLUMB_OK;
    char found[128];
    if (!font_present(d->layout, found, sizeof found))
        st = PLUMB_RAISE(diag, PLUMB_EWRITE, "cannot make the PDF: the font '%s' is not installed "
                                             "(found '%s'; on Debian: apt-get install "
                                             "fonts-dejavu-core)", SHEET_FONT, found);
    d->page = 0;
    if (st == PLUMB_OK)
        st = draw_all(d, briefs, n, diag);
    if (st == PLUMB_OK && d->no_glyph[0])
        st = PLUMB_RAISE(diag, PLUMB_EWRITE, "cannot make the PDF: %s", d->no_glyph);
    g_object_unref(d->layout);
    d->layout = NULL;
    cairo_status_t cs = cairo_status(d->cr);
    cairo_destroy(d->cr);
    d->cr = NULL;
    cairo_surface_finish(sf);
    if (cs == CAIRO_STATUS_SUCCESS)
        cs = cairo_surface_status(sf);
    cairo_surface_destroy(sf);
    /* out of memory is not a write error: exit 3 either way, but the
     * status says which (include/plumb/error.h) */
    if (st == PLUMB_OK && m && m->failed)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the sheet");
    else if (st == PLUMB_OK && cs != CAIRO_STATUS_SUCCESS)
        st = PLUMB_RAISE(diag, PLUMB_EWRITE, "cannot make the PDF: %s",
                         cairo_status_to_string(cs));
    return st;
}

void plumb_sheet_options_init(plumb_sheet_options *opt, long long time_utc)
{
    memset(opt, 0, sizeof *opt);
    opt->paper = PLUMB_PAPER_A4;
    opt->units = PLUMB_UNITS_SI;
    opt->version = plumb_version();
    opt->time_utc = time_utc;
    /* the local offset from UTC then, from the local and UTC calendars */
    time_t tt = (time_t)time_utc;
    struct tm u, l;
    if (!gmtime_r(&tt, &u) || !localtime_r(&tt, &l))
        return;
    int days = l.tm_year != u.tm_year ? (l.tm_year > u.tm_year ? 1 : -1) : l.tm_yday - u.tm_yday;
    opt->utc_offset_s = days * 86400 + (l.tm_hour - u.tm_hour) * 3600 + (l.tm_min - u.tm_min) * 60 +
                        (l.tm_sec - u.tm_sec);
}

static int all_finite(const double *x, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (!isfinite(x[i]))
            return 0;
    return 1;
}

/* 1 when every number the sheet draws from the brief is finite: the
 * paths, the energy curves where there is a fall, the deploy points, the
 * limit heights found and the zone's impact points. (The figures printed
 * as text go through the number writer, which marks a non-finite one.) */
static int brief_finite(const plumb_brief *b)
{
    for (size_t i = 0; i < b->n_plots; i++) {
        const plumb_brief_plot *pl = &b->plots[i];
        if (!all_finite(pl->path.d_m, pl->path.n) || !all_finite(pl->path.z_m, pl->path.n) ||
            !all_finite(pl->drag_free.d_m, pl->drag_free.n) ||
            !all_finite(pl->drag_free.z_m, pl->drag_free.n) ||
            !all_finite(pl->deploy_d_m, pl->n_deploy) || !all_finite(pl->deploy_z_m, pl->n_deploy))
            return 0;
        for (size_t k = 0; k < pl->n_curve; k++)
            if (pl->curve_ok[k] && !(isfinite(pl->curve_h_m[k]) && isfinite(pl->curve_e_j[k])))
                return 0;
        for (size_t k = 0; k < pl->n_limits; k++)
            if (pl->limits[k].outcome == PLUMB_LIMIT_FOUND &&
                !(isfinite(pl->limits[k].value_si) && isfinite(pl->limits[k].metric_at_value)))
                return 0;
    }
    for (int pass = 0; pass < 2; pass++)
        if (!all_finite(b->points_m[pass], 2 * b->n_points[pass]))
            return 0;
    return 1;
}

plumb_status plumb_sheet_write(FILE *out, const plumb_sheet_options *opt,
                               const plumb_brief *const *briefs, size_t n, plumb_diag *diag)
{
    if (!out || !opt || !briefs || n == 0)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_sheet_write: nothing to write");
    for (size_t i = 0; i < n; i++)
        if (!briefs[i] || !brief_finite(briefs[i]))
            return PLUMB_RAISE(diag, briefs[i] ? PLUMB_ENUMERIC : PLUMB_EINVAL,
                               briefs[i] ? "a figure is not a finite number; no sheet written"
                                         : "plumb_sheet_write: no brief %zu", i + 1);
    sheet_doc d;
    memset(&d, 0, sizeof d);
    d.opt = opt;
    d.pw = opt->paper == PLUMB_PAPER_LETTER ? LETTER_W : A4_W;
    d.ph = opt->paper == PLUMB_PAPER_LETTER ? LETTER_H : A4_H;
    d.left = MARGIN;
    d.right = d.pw - MARGIN;
    d.top = MARGIN;
    d.bottom = d.ph - MARGIN - FOOTER_BAND;
    if (!writer_start(&d.si, 0) || !writer_start(&d.us, 1)) {
        if (d.si.f)
            fclose(d.si.f);
        free(d.si.buf);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the sheet");
    }
    plumb_status st = one_pass(&d, briefs, n, NULL, diag);
    membuf m = {NULL, 0, 0, 0};
    if (st == PLUMB_OK) {
        d.pages = d.page;
        st = one_pass(&d, briefs, n, &m, diag);
    }
    int bad = d.si.bad || d.us.bad;
    writer_finish(&d.si);
    writer_finish(&d.us);
    free(d.si.buf);
    free(d.us.buf);
    if (st == PLUMB_OK && bad)
        st = PLUMB_RAISE(diag, PLUMB_ENUMERIC, "a figure is not a finite number; no sheet written");
    if (st == PLUMB_OK && (fwrite(m.p, 1, m.len, out) != m.len || fflush(out) != 0))
        st = PLUMB_RAISE(diag, PLUMB_EWRITE, "cannot write the sheet");
    free(m.p);
    return st;
}
