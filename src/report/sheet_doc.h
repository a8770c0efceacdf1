/*
 * sheet_doc.h - what the files of the PDF sheet share (sheet.c: the
 * document; sheet_page.c: its text, pages and footers; sheet_sections.c:
 * its text sections; sheet_plot.c: the side view and the energy plot;
 * sheet_plan.c: the plan view; sheet_inventory.c: a kit's table;
 * sheet_descent.c: the descent devices). Internal to libplumb-sheet.
 *
 * Units on the page are PostScript points (1/72 in), y downwards.
 */
#ifndef PLUMB_SHEET_DOC_H
#define PLUMB_SHEET_DOC_H

#include <cairo.h>
#include <pango/pangocairo.h>

#include "plumb/sheet.h"
#include "report/format.h"

/* The type: one family, embedded; a character it lacks comes from an
 * installed font that has it (fontconfig's fallback), and a text with one
 * that no font has is refused (sheet_page.c). Sizes in points. */
#define SHEET_FONT "DejaVu Sans"
#define SHEET_MONO "DejaVu Sans Mono"
#define SHEET_BODY 10.0
#define SHEET_SMALL 8.0

/* Millimetres to points. */
#define MM_PT (72.0 / 25.4)
/* Margins, pt: 15 mm each side, the footer's band at the bottom. */
#define MARGIN (15.0 * MM_PT)
#define FOOTER_BAND 50.0
/* Space after a block, pt. */
#define GAP 6.0
#define SECTION_GAP 12.0

/* Formatted strings kept at once (sheet_fmt, sheet_esc), and their size. */
enum { SHEET_RING = 32, FMT_LEN = 2048 };

typedef struct sheet_doc {
    cairo_t *cr;
    PangoLayout *layout;
    const plumb_sheet_options *opt;
    double pw, ph;               /* page size */
    double left, right;          /* text margins (x) */
    double top, bottom;          /* the body's top and bottom (y); the footer is below */
    double y;                    /* where the next block goes */
    int page;                    /* the page being drawn, from 1 (0: none yet) */
    int pages;                   /* pages in all (0 on the counting pass) */
    char footer_hash[PLUMB_CRIT_SHA256]; /* the profile of the pages being drawn */
    const char *running;         /* the section going on, repeated on a new page */
    int section;                 /* the last section's number (sheet_heading) */
    char heading[96];            /* the last section's numbered title */
    writer si, us;               /* number formatters, SI and US customary */
    char ring[SHEET_RING][FMT_LEN];  /* sheet_fmt's strings, reused round-robin */
    unsigned next;
    /* The first text set with characters no installed font has (pango
     * would draw each as an empty box), and them: "" while there is none;
     * the sheet is refused when it is not (sheet_page.c, sheet.c). */
    char no_glyph[480];
} sheet_doc;

/* The body's width. */
static inline double sheet_width(const sheet_doc *d) { return d->right - d->left; }

/* The formatter of the sheet's units, and of the other system (beside). */
static inline writer *sheet_primary(sheet_doc *d)
{
    return d->opt->units == PLUMB_UNITS_US ? &d->us : &d->si;
}
static inline writer *sheet_secondary(sheet_doc *d)
{
    return d->opt->units == PLUMB_UNITS_US ? &d->si : &d->us;
}

/* Text at (x, y) in width w (0: no wrapping): `markup` in pango markup,
 * `font` a pango font description ("DejaVu Sans Bold 9"). Draws only when
 * draw is 1; returns the height. */
double sheet_text(sheet_doc *d, double x, double y, double w, const char *font,
                  const char *markup, int draw);
/* The width of one line of text (no wrapping). */
double sheet_text_width(sheet_doc *d, const char *font, const char *markup);
/* Text right-aligned to x, or centred on it (align 1: right, 2: centre). */
void sheet_text_at(sheet_doc *d, double x, double y, int align, const char *font,
                   const char *markup);

/* "[id]" as markup kept on one line (pango allow_breaks="false"), unless
 * it is wider than w points in font by itself (w <= 0: no check). */
const char *sheet_id(sheet_doc *d, const char *font, const char *id, double w);
/* Starts a new page when h more points do not fit. */
void sheet_need(sheet_doc *d, double h);
/* A paragraph across the body (markup), paginated as a block. */
void sheet_para(sheet_doc *d, const char *font, const char *markup);
/* A numbered section heading, kept with `keep` points of what follows. */
void sheet_heading(sheet_doc *d, const char *name, double keep);

/* printf into a ring of buffers, with the formatters' number-unit joins
 * made non-breaking spaces; the text is escaped for pango markup unless
 * the format starts with '\x02' (already markup). */
const char *sheet_fmt(sheet_doc *d, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;
/* A string escaped for pango markup (ring buffer). */
const char *sheet_esc(sheet_doc *d, const char *s);

/* Line styles: every line says what it is by weight and dash. */
typedef enum sheet_line {
    SHEET_SOLID = 0,   /* the planned fall, the clearance radius */
    SHEET_DASHED,      /* drag-free path, criteria limits */
    SHEET_DOTTED,      /* comparisons: ellipse, planned height */
    SHEET_DASHDOT,
    SHEET_DASHDOTDOT,  /* the energy plot's third item */
    SHEET_LONGDASH     /* the energy plot's fourth item: long dashes, short gaps */
} sheet_line;
void sheet_stroke(sheet_doc *d, sheet_line style, double width);

/* Axes of a plot: the frame at (x, y, w, h), value ranges, ticks and labels. */
typedef struct sheet_axes {
    double x, y, w, h;
    double x0, x1, y0, y1;      /* value ranges shown */
    int ylog;                   /* 1: y on a logarithmic scale (y0 > 0) */
} sheet_axes;
double sheet_ax_x(const sheet_axes *a, double v);
double sheet_ax_y(const sheet_axes *a, double v);
/* A tick step of about `span / n` rounded to 1, 2 or 5 times a power of ten. */
double sheet_nice_step(double span, double n);
/* The frame, grid, ticks and titles. The y title is wrapped to the
 * frame's height (it never reaches past the frame, into the heading above
 * it); when it and the tick labels need more room than the plot gives at
 * the left, a->x moves right (and a->w shrinks) to make it. */
void sheet_draw_axes(sheet_doc *d, sheet_axes *a, const char *xlabel, const char *ylabel);

/* The sections drawn by sheet_plot.c and sheet_plan.c; each returns the
 * height used. */
double sheet_side_view(sheet_doc *d, const plumb_brief *b, double x, double y, double w, double h);
double sheet_energy_plot(sheet_doc *d, const plumb_brief *b, double x, double y, double w,
                         double h);

/* ---- the plan view (sheet_plan.c) ------------------------------------------
 * Whatever a zone gives, in metres east and north of the planned drop
 * point's origin: circles, polygons, points and a density grid, each with
 * its words; the drop point, the target, the wind. */
enum { SHEET_PLAN_CIRCLES = 8, SHEET_PLAN_POLYGONS = 4, SHEET_PLAN_LABEL = 160 };

typedef struct sheet_circle {
    double centre_m[2], radius_m;
    sheet_line style;
    double width;               /* line width, pt */
    char label[SHEET_PLAN_LABEL];
} sheet_circle;

typedef struct sheet_polygon {
    size_t n;                   /* vertices */
    const double *xy_m;         /* east, north pairs, borrowed */
    sheet_line style;
    double width;
    char label[SHEET_PLAN_LABEL];
} sheet_polygon;

typedef struct sheet_grid {
    size_t nx, ny;              /* cells east and north */
    double x0_m, y0_m, cell_m;  /* south-west corner and cell size */
    const double *density;      /* nx * ny, row by row from the south; any scale */
    char label[SHEET_PLAN_LABEL];
} sheet_grid;

typedef struct sheet_plan {
    double drop_m[2];           /* the planned drop point */
    int has_target;
    double target_m[2];
    int has_aim;
    double aim_m[2];            /* the release point that aims at the target */
    double wind_m_s, wind_from_deg; /* the wind at the release height */
    size_t n_circles;
    sheet_circle circles[SHEET_PLAN_CIRCLES];
    size_t n_polygons;
    sheet_polygon polygons[SHEET_PLAN_POLYGONS];
    size_t n_points;            /* impact points, east, north pairs, borrowed */
    const double *points_m;
    const sheet_grid *grid;     /* or NULL */
    char points_label[SHEET_PLAN_LABEL];
} sheet_plan;

double sheet_plan_view(sheet_doc *d, const sheet_plan *p, double x, double y, double w, double h);

/* Pages (sheet_page.c): the current one ended with its footer; a new
 * one begun. */
void sheet_end_page(sheet_doc *d);
void sheet_new_page(sheet_doc *d);

/* The figures criterion c's limit is shown with on the sheet: as many as
 * the item of the fall that needs the most to show its side of it
 * (plumbp_limit_sig), as the tables give its energy (sheet_sections.c). */
int sheet_limit_sig(const plumb_brief *b, const plumb_criterion *c);

/* The sections that are text (sheet_sections.c), in the sheet's order. */
void sheet_section_header(sheet_doc *d, const plumb_brief *b);
plumb_status sheet_section_answer(sheet_doc *d, const plumb_brief *b, plumb_diag *diag);
void sheet_section_inventory(sheet_doc *d, const plumb_brief *b);
plumb_status sheet_section_inputs(sheet_doc *d, const plumb_brief *b, plumb_diag *diag);
void sheet_section_cautions(sheet_doc *d);
void sheet_section_plots(sheet_doc *d, const plumb_brief *b);
void sheet_section_plan(sheet_doc *d, const plumb_brief *b);
/* The descent devices (sheet_descent.c): what each item's fall made of
 * them (section 2 for one item, the inventory's section for a kit), and
 * each device as understood (the inputs' section). Nothing when no item
 * has a device. */
void sheet_descent_figures(sheet_doc *d, const plumb_brief *b);
void sheet_descent_inputs(sheet_doc *d, const plumb_brief *b);

#endif /* PLUMB_SHEET_DOC_H */
