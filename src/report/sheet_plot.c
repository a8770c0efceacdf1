/*
 * sheet_plot.c - the sheet's two graphs: the side view of the fall
 * (height against horizontal distance, the drag-free path dashed, the
 * deploy point of a descent device marked) and impact energy against drop
 * height (one curve per plotted item, each criterion's limit a labelled
 * horizontal line with the height where it is reached, the planned height
 * marked). Black lines that differ by weight and dash, every one named.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "report/sheet_doc.h"
#include "report/common.h"

/* Space for the tick labels and axis titles, pt. */
#define AX_LEFT 46.0
#define AX_BOTTOM 28.0
#define AX_TOP 6.0
#define AX_RIGHT 8.0
#define TICK 3.0
/* Between a y tick label and its tick, pt. */
#define TICK_GAP 2.0
/* The y title: its distance from the plot's left edge, the gap between
 * it and the widest y tick label, and the room kept clear at each end of
 * the frame's height (so it never reaches the heading above), pt. */
#define YTITLE_EDGE 2.0
#define YTITLE_GAP 4.0
#define YTITLE_CLEAR 1.0
#define LEGEND_LINE 22.0
/* The energy axis is logarithmic when the largest energy shown is more
 * than this many times the lowest limit. */
#define LOG_RATIO 8.0

double sheet_ax_x(const sheet_axes *a, double v)
{
    return a->x + (v - a->x0) / (a->x1 - a->x0) * a->w;
}

double sheet_ax_y(const sheet_axes *a, double v)
{
    if (a->ylog) /* below the axis for v <= 0: the caller clips */
        return a->y + a->h - (v > 0.0 ? log10(v / a->y0) / log10(a->y1 / a->y0) : -1.0) * a->h;
    return a->y + a->h - (v - a->y0) / (a->y1 - a->y0) * a->h;
}

double sheet_nice_step(double span, double n)
{
    if (!(span > 0.0))
        return 1.0;
    double raw = span / n, mag = pow(10.0, floor(log10(raw))), f = raw / mag;
    return (f < 1.5 ? 1.0 : f < 3.5 ? 2.0 : f < 7.5 ? 5.0 : 10.0) * mag;
}

/* A tick value as text: as few digits as the step needs. */
static const char *tick_text(sheet_doc *d, double v, double step)
{
    int dec = step >= 1.0 ? 0 : (int)ceil(-log10(step) - 1e-9);
    if (fabs(v) < step * 1e-6)
        v = 0.0;
    return sheet_fmt(d, "%.*f", dec, v);
}

/* The y ticks' values and their label steps: on a logarithmic axis 1, 2
 * and 5 times each power of ten in the range; else multiples of a nice
 * step. Returns how many (at most SHEET_YTICKS). */
enum { SHEET_YTICKS = 64 };
static size_t y_ticks(const sheet_axes *a, double *v, double *step)
{
    size_t n = 0;
    if (a->ylog) {
        for (double dec = pow(10.0, floor(log10(a->y0))); dec <= a->y1 && n < SHEET_YTICKS - 3;
             dec *= 10.0)
            for (int m = 0; m < 3; m++) {
                double t = dec * (m == 0 ? 1.0 : m == 1 ? 2.0 : 5.0);
                if (t >= a->y0 * (1.0 - 1e-9) && t <= a->y1 * (1.0 + 1e-9)) {
                    v[n] = t;
                    step[n++] = t < 1.0 ? pow(10.0, floor(log10(t))) : 1.0;
                }
            }
        return n;
    }
    double sy = sheet_nice_step(a->y1 - a->y0, 5.0);
    for (double t = ceil(a->y0 / sy) * sy; t <= a->y1 + sy * 1e-9 && n < SHEET_YTICKS;
         t += sy) {
        v[n] = t;
        step[n++] = sy;
    }
    return n;
}

void sheet_draw_axes(sheet_doc *d, sheet_axes *a, const char *xlabel_in, const char *ylabel_in)
{
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 8.0);
    /* kept: the titles may be sheet_fmt's, whose ring the tick labels reuse */
    char xlabel[FMT_LEN], ylabel[FMT_LEN];
    snprintf(xlabel, sizeof xlabel, "%s", xlabel_in);
    snprintf(ylabel, sizeof ylabel, "%s", ylabel_in);
    cairo_t *cr = d->cr;
    /* the room at the left: the y title (wrapped to the frame's height,
     * at most two lines in practice), a gap, the widest tick label; the
     * frame moves right when AX_LEFT is not enough */
    double yv[SHEET_YTICKS], ys[SHEET_YTICKS], tick_w = 0.0;
    size_t n_yt = y_ticks(a, yv, ys);
    for (size_t t = 0; t < n_yt; t++)
        tick_w = fmax(tick_w, sheet_text_width(d, font, tick_text(d, yv[t], ys[t])));
    double title_len = fmax(a->h - 2.0 * YTITLE_CLEAR, 1.0);
    /* too long for one line: a closing remark in brackets goes on the
     * second ("impact energy, J" / "(logarithmic scale)") */
    char *paren = strstr(ylabel, " (");
    if (paren && sheet_text_width(d, font, sheet_esc(d, ylabel)) > title_len)
        *paren = '\n';
    double title_h = sheet_text(d, 0.0, 0.0, title_len, font, sheet_esc(d, ylabel), 0);
    double room = YTITLE_EDGE + title_h + YTITLE_GAP + tick_w + TICK + TICK_GAP;
    double left = a->x - AX_LEFT; /* the plot's own left edge */
    if (room > AX_LEFT) {
        a->x += room - AX_LEFT;
        a->w -= room - AX_LEFT;
    }
    cairo_set_source_rgb(cr, 0, 0, 0);
    cairo_rectangle(cr, a->x, a->y, a->w, a->h);
    sheet_stroke(d, SHEET_SOLID, 0.7);
    double sx = sheet_nice_step(a->x1 - a->x0, 6.0);
    for (double v = ceil(a->x0 / sx) * sx; v <= a->x1 + sx * 1e-9; v += sx) {
        double px = sheet_ax_x(a, v);
        cairo_move_to(cr, px, a->y + a->h);
        cairo_line_to(cr, px, a->y + a->h + TICK);
        sheet_stroke(d, SHEET_SOLID, 0.6);
        cairo_move_to(cr, px, a->y);
        cairo_line_to(cr, px, a->y + a->h);
        cairo_set_source_rgb(cr, 0.82, 0.82, 0.82);
        sheet_stroke(d, SHEET_SOLID, 0.3);
        cairo_set_source_rgb(cr, 0, 0, 0);
        sheet_text_at(d, px, a->y + a->h + TICK + 1.0, 2, font, tick_text(d, v, sx));
    }
    for (size_t t = 0; t < n_yt; t++) {
        double py = sheet_ax_y(a, yv[t]);
        cairo_move_to(cr, a->x - TICK, py);
        cairo_line_to(cr, a->x, py);
        sheet_stroke(d, SHEET_SOLID, 0.6);
        cairo_move_to(cr, a->x, py);
        cairo_line_to(cr, a->x + a->w, py);
        cairo_set_source_rgb(cr, 0.82, 0.82, 0.82);
        sheet_stroke(d, SHEET_SOLID, 0.3);
        cairo_set_source_rgb(cr, 0, 0, 0);
        sheet_text_at(d, a->x - TICK - TICK_GAP, py - 4.5, 1, font, tick_text(d, yv[t], ys[t]));
    }
    sheet_text_at(d, a->x + a->w / 2.0, a->y + a->h + TICK + 11.0, 2, font, sheet_esc(d, xlabel));
    /* the y title, turned a quarter, centred on the frame's height and
     * never longer than it: it stays clear of the heading above the plot */
    cairo_save(cr);
    sheet_text(d, 0.0, 0.0, title_len, font, sheet_esc(d, ylabel), 0);
    pango_layout_set_alignment(d->layout, PANGO_ALIGN_CENTER);
    cairo_translate(cr, left + YTITLE_EDGE, a->y + a->h / 2.0 + title_len / 2.0);
    cairo_rotate(cr, -3.14159265358979323846 / 2.0);
    cairo_move_to(cr, 0.0, 0.0);
    pango_cairo_update_layout(cr, d->layout);
    pango_cairo_show_layout(cr, d->layout);
    pango_layout_set_alignment(d->layout, PANGO_ALIGN_LEFT);
    cairo_restore(cr);
    pango_cairo_update_layout(cr, d->layout);
}

/* A legend entry: a short line in the style, then the words. Returns the
 * height. */
static double legend(sheet_doc *d, double x, double y, double w, sheet_line style, double width,
                     const char *words)
{
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 8.5);
    cairo_set_source_rgb(d->cr, 0, 0, 0);
    cairo_move_to(d->cr, x, y + 5.0);
    cairo_line_to(d->cr, x + LEGEND_LINE - 4.0, y + 5.0);
    sheet_stroke(d, style, width);
    return sheet_text(d, x + LEGEND_LINE, y, w - LEGEND_LINE, font, words, 1) + 1.5;
}

static void polyline(sheet_doc *d, const sheet_axes *a, const double *x, const double *y, size_t n,
                     double xs, double ys)
{
    for (size_t i = 0; i < n; i++) {
        if (i == 0)
            cairo_move_to(d->cr, sheet_ax_x(a, x[i] * xs), sheet_ax_y(a, y[i] * ys));
        else
            cairo_line_to(d->cr, sheet_ax_x(a, x[i] * xs), sheet_ax_y(a, y[i] * ys));
    }
}

/* The energy plot's curves: none dashed like the limits' lines nor dotted
 * like the planned height's, and none like another. */
static const sheet_line item_styles[PLUMB_BRIEF_PLOTTED] = {SHEET_SOLID, SHEET_DASHDOT,
                                                            SHEET_DASHDOTDOT, SHEET_LONGDASH};

/* ---- where the limits' labels go -----------------------------------------------
 * Each label is a box tried along its own line, just above or below it,
 * then further away with a leader to the line; the place that costs least
 * wins: a label over a curve, another label, the planned height or a
 * circle costs far more than one moved away from its line, so a label
 * overlaps any of them only when nothing else is left. */
enum { LABEL_SEGS = PLUMB_BRIEF_PLOTTED * PLUMB_BRIEF_CURVE + PLUMB_MAX_VERDICTS * 2 + 4,
       LABEL_BOXES = PLUMB_MAX_VERDICTS * 2 + 2 };
#define COST_LABEL 1.0e6   /* over another label or its leader */
#define COST_CURVE 1.0e5   /* over a curve */
#define COST_MARK 1.0e5    /* over a circle where a curve reaches a limit */
#define COST_PLANNED 1.0e4 /* over the planned height's line */
#define COST_LINE 300.0    /* over another criterion's line: as much as 15 pt away */
#define COST_AWAY 20.0     /* each point away from its own line */
#define COST_TWO_LINES 40.0 /* a label on two lines rather than one */
#define LABEL_CLEAR 1.5    /* pt kept clear around a label */
#define LEADER_IN 6.0      /* the leader's place from the label's left, pt */
/* A label is beside its line when no more than this far from it, pt;
 * when one cannot be, or only over a curve, a circle or another label,
 * every line is numbered instead and the labels go to a key below. */
#define LABEL_NEAR 3.0
#define KEY_FONT 7.5       /* the lines' numbers, pt */
/* The numbers of a key go right of the frame, where no curve runs: each in
 * a box that its own line, drawn on past the frame, runs into. */
#define KEY_GAP 2.0        /* between the frame and the first box, and between boxes, pt */
#define KEY_SHIFT 3.5      /* a box's centre at most this far above or below its line, pt */
#define KEY_SLOTS 6        /* boxes side by side at most */
/* Relative gap (of the largest coordinate, plus 1 pt) by which a segment's
 * bounds and a box must lie apart for label_cost to skip seg_in_box. With
 * the segment wholly left of the box by more than this, seg_in_box's
 * x0 - s[0] and s[2] - s[0] differ by far more than their rounding
 * (2^-52 of the largest coordinate), so its first ratio exceeds 1 and it
 * returns 0; the same holds for each side and for a segment in either
 * direction. The skip changes no answer, only the time. */
#define BOX_APART 1e-9

typedef struct label_obstacles {
    size_t n_segs, n_boxes;
    double seg[LABEL_SEGS][4], seg_cost[LABEL_SEGS];
    double seg_box[LABEL_SEGS][4];      /* each segment's bounds, widened (add_seg) */
    int seg_owner[LABEL_SEGS];          /* the criterion whose line it is, or -1 */
    double box[LABEL_BOXES][4], box_cost[LABEL_BOXES];
} label_obstacles;

static void add_seg(label_obstacles *o, double x0, double y0, double x1, double y1, double cost,
                    int owner)
{
    if (o->n_segs >= LABEL_SEGS)
        return;
    double *s = o->seg[o->n_segs], *b = o->seg_box[o->n_segs];
    s[0] = x0, s[1] = y0, s[2] = x1, s[3] = y1;
    double m = BOX_APART * (1.0 + fmax(fmax(fabs(x0), fabs(x1)), fmax(fabs(y0), fabs(y1))));
    b[0] = fmin(x0, x1) - m, b[1] = fmin(y0, y1) - m, b[2] = fmax(x0, x1) + m,
    b[3] = fmax(y0, y1) + m;
    o->seg_cost[o->n_segs] = cost;
    o->seg_owner[o->n_segs++] = owner;
}

static void add_box(label_obstacles *o, double x0, double y0, double x1, double y1, double cost)
{
    if (o->n_boxes >= LABEL_BOXES)
        return;
    double *b = o->box[o->n_boxes];
    b[0] = x0, b[1] = y0, b[2] = x1, b[3] = y1;
    o->box_cost[o->n_boxes++] = cost;
}

/* 1 when the segment crosses the box (x0, y0)-(x1, y1): Liang-Barsky
 * clipping of the segment to the box. */
static int seg_in_box(const double *s, double x0, double y0, double x1, double y1)
{
    double dx = s[2] - s[0], dy = s[3] - s[1], t0 = 0.0, t1 = 1.0;
    double p[4] = {-dx, dx, -dy, dy}, q[4] = {s[0] - x0, x1 - s[0], s[1] - y0, y1 - s[1]};
    for (int i = 0; i < 4; i++) {
        if (p[i] == 0.0) {
            if (q[i] < 0.0)
                return 0;
        } else {
            double t = q[i] / p[i];
            if (p[i] < 0.0) {
                if (t > t1)
                    return 0;
                if (t > t0)
                    t0 = t;
            } else {
                if (t < t0)
                    return 0;
                if (t < t1)
                    t1 = t;
            }
        }
    }
    return 1;
}

static double label_cost(const label_obstacles *o, int owner, double x0, double y0, double x1,
                         double y1, double py)
{
    double c = 0.0, cx0 = x0 - LABEL_CLEAR, cy0 = y0 - LABEL_CLEAR, cx1 = x1 + LABEL_CLEAR,
           cy1 = y1 + LABEL_CLEAR;
    /* A segment whose bounds lie apart from the box by more than rounding
     * is not clipped: seg_in_box would say 0 (see BOX_APART). Most of a
     * curve's segments are, for each of the many places tried. */
    double m = BOX_APART * (1.0 + fmax(fmax(fabs(cx0), fabs(cx1)), fmax(fabs(cy0), fabs(cy1))));
    double bx0 = cx0 - m, by0 = cy0 - m, bx1 = cx1 + m, by1 = cy1 + m;
    for (size_t i = 0; i < o->n_segs; i++) {
        const double *sb = o->seg_box[i];
        if (sb[2] < bx0 || sb[0] > bx1 || sb[3] < by0 || sb[1] > by1)
            continue;
        if (o->seg_owner[i] != owner && seg_in_box(o->seg[i], cx0, cy0, cx1, cy1))
            c += o->seg_cost[i];
    }
    for (size_t i = 0; i < o->n_boxes; i++) {
        const double *b = o->box[i];
        if (b[0] < cx1 && b[2] > cx0 && b[1] < cy1 && b[3] > cy0)
            c += o->box_cost[i];
    }
    /* away from its line: the gap, and the leader across what is between */
    double gap = y1 < py ? py - y1 : y0 > py ? y0 - py : 0.0;
    if (gap > 1.0) {
        double leader[4] = {x0 + LEADER_IN, y1 < py ? y1 : py, x0 + LEADER_IN, y1 < py ? py : y0};
        for (size_t i = 0; i < o->n_boxes; i++)
            if (seg_in_box(leader, o->box[i][0], o->box[i][1], o->box[i][2], o->box[i][3]))
                c += o->box_cost[i];
        c += COST_AWAY * gap;
    }
    return c;
}

/* A placed label becomes an obstacle, and so does its leader. */
static void label_claim(label_obstacles *o, double tx, double ty, double tw, double lh, double py)
{
    add_box(o, tx, ty, tx + tw, ty + lh, COST_LABEL);
    if (ty + lh < py - 1.0 || ty > py + 1.0)
        add_seg(o, tx + LEADER_IN, ty + lh < py ? ty + lh : ty, tx + LEADER_IN, py, COST_LABEL, -1);
}

/* The least costly place (*tx, *ty: top left) for a label tw x lh of the
 * line at py, inside the plot. Can't fail. */
static void place_label(const label_obstacles *o, const sheet_axes *a, int owner, double py,
                        double tw, double lh, double *tx, double *ty)
{
    double xmin = a->x + 3.0, xmax = a->x + a->w - tw - 3.0;
    double ymin = a->y + 1.0, ymax = a->y + a->h - lh - 1.0;
    if (xmax < xmin)
        xmax = xmin;
    double best = HUGE_VAL;
    *tx = xmin;
    *ty = fmin(fmax(py - lh - 0.5, ymin), ymax);
    /* just above, just below, then ever further away */
    for (int step = 0; step < 400; step++) {
        /* a row 2k pt further away costs at least COST_AWAY for each point */
        if (step >= 2 && best < COST_AWAY * (0.5 + 2.0 * (double)(step / 2)))
            break;
        double y = step == 0 ? py - lh - 0.5 : step == 1 ? py + 0.5
                 : (step % 2 ? py + 0.5 + (double)(step / 2) * 2.0
                             : py - lh - 0.5 - (double)(step / 2) * 2.0);
        if (y < ymin || y > ymax)
            continue;
        for (double x = xmin; x <= xmax + 1e-9; x += 4.0) {
            double c = label_cost(o, owner, x, y, x + tw, y + lh, py) + 1e-3 * (x - xmin);
            if (c < best) {
                best = c;
                *tx = x;
                *ty = y;
            }
        }
    }
}

/* Where the numbers of the lines at py[0..n-1] (page y, any order) go:
 * each box nh tall, its centre ky[i] within KEY_SHIFT of its line and
 * at least 1 pt of it above and below the line, so that the line ends
 * in it; its slot ks[i], 0 next to the frame. From the top line down,
 * each takes the first slot, nearest its line, where its box touches
 * no other box, no other line runs through it and its own line runs
 * through no other box on its way from the frame; where there is no such
 * place (lines a point or two apart), the one that breaks these least,
 * a box over a box last of all. Returns the slots used. Can't fail. */
static int key_layout(const double *py, size_t n, double nh, double ymin, double ymax,
                      double *ky, int *ks)
{
    size_t ord[PLUMB_MAX_VERDICTS];
    for (size_t i = 0; i < n; i++)
        ord[i] = i;
    for (size_t i = 1; i < n; i++) /* the top line first */
        for (size_t j = i; j > 0 && py[ord[j]] < py[ord[j - 1]]; j--) {
            size_t t = ord[j];
            ord[j] = ord[j - 1];
            ord[j - 1] = t;
        }
    int used = 0;
    for (size_t i = 0; i < n; i++) {
        size_t q = ord[i];
        double best = HUGE_VAL;
        ky[q] = py[q];
        ks[q] = 0;
        for (int s = 0; s < KEY_SLOTS && best > 0.0; s++)
            for (int k = 0; k <= (int)(4.0 * KEY_SHIFT) && best > 0.0; k++) {
                /* 0, +0.5, -0.5, +1, ... pt from the line */
                double cy = py[q] + (k % 2 ? 0.5 : -0.5) * (double)((k + 1) / 2);
                cy = fmin(fmax(cy, ymin + nh / 2.0), ymax - nh / 2.0);
                if (fabs(cy - py[q]) > nh / 2.0 - 1.0)
                    continue;
                double bad = 0.0;
                for (size_t j = 0; j < i; j++) {
                    size_t p = ord[j];
                    if (ks[p] == s) /* a number over a number: far the worst */
                        bad += 100.0 * fmax(0.0, nh + 1.0 - fabs(ky[p] - cy));
                    else if (ks[p] > s) /* p's line runs past this box */
                        bad += fmax(0.0, nh / 2.0 + 0.5 - fabs(py[p] - cy));
                    else /* this line runs past p's box */
                        bad += fmax(0.0, nh / 2.0 + 0.5 - fabs(py[q] - ky[p]));
                }
                if (bad < best) {
                    best = bad;
                    ky[q] = cy;
                    ks[q] = s;
                }
            }
        if (ks[q] + 1 > used)
            used = ks[q] + 1;
    }
    return used;
}

double sheet_side_view(sheet_doc *d, const plumb_brief *b, double x, double y, double w, double h)
{
    if (b->n_plots == 0)
        return 0.0;
    int us = d->opt->units == PLUMB_UNITS_US;
    double ls = us ? 1.0 / PLUMB_FT_M : 1.0;
    const char *lu = us ? "ft" : "m";
    const plumb_brief_plot *pl = &b->plots[0];
    const plumb_item_report *it = &b->fall->items[pl->item];
    double dmin = 0.0, dmax = 0.0, zmax = 0.0;
    for (int k = 0; k < 2; k++) {
        const plumb_brief_path *p = k ? &pl->drag_free : &pl->path;
        for (size_t i = 0; i < p->n; i++) {
            dmin = fmin(dmin, p->d_m[i]);
            dmax = fmax(dmax, p->d_m[i]);
            zmax = fmax(zmax, p->z_m[i]);
        }
    }
    double span = dmax - dmin;
    if (span < 0.1 * zmax) { /* a nearly vertical fall: some room either side */
        double mid = (dmax + dmin) / 2.0;
        dmin = mid - 0.05 * zmax;
        dmax = mid + 0.05 * zmax;
    }
    double legend_h = 34.0 + (pl->n_deploy ? 12.0 : 0.0);
    sheet_axes a = {x + AX_LEFT, y + AX_TOP, w - AX_LEFT - AX_RIGHT, h - AX_TOP - AX_BOTTOM - legend_h,
                    dmin * ls, dmax * ls, 0.0, zmax * 1.05 * ls, 0};
    double pad = 0.04 * (a.x1 - a.x0);
    a.x0 -= pad;
    a.x1 += pad;
    sheet_draw_axes(d, &a, sheet_fmt(d, "horizontal distance along the drift from the release "
                                        "point, %s", lu),
                    sheet_fmt(d, "height above the strike level, %s", lu));
    cairo_save(d->cr);
    cairo_rectangle(d->cr, a.x, a.y, a.w, a.h);
    cairo_clip(d->cr);
    cairo_set_source_rgb(d->cr, 0, 0, 0);
    polyline(d, &a, pl->drag_free.d_m, pl->drag_free.z_m, pl->drag_free.n, ls, ls);
    sheet_stroke(d, SHEET_DASHED, 1.0);
    polyline(d, &a, pl->path.d_m, pl->path.z_m, pl->path.n, ls, ls);
    sheet_stroke(d, SHEET_SOLID, 1.8);
    for (size_t k = 0; k < pl->n_deploy; k++) {
        double px = sheet_ax_x(&a, pl->deploy_d_m[k] * ls), py = sheet_ax_y(&a, pl->deploy_z_m[k] * ls);
        cairo_rectangle(d->cr, px - 3.5, py - 3.5, 7.0, 7.0);
        sheet_stroke(d, SHEET_SOLID, 1.2);
    }
    cairo_restore(d->cr);
    writer *P = sheet_primary(d);
    double ly = a.y + a.h + AX_BOTTOM;
    ly += legend(d, x, ly, w, SHEET_SOLID, 1.8,
                 sheet_fmt(d, "%s: the planned fall, landing %s from the release point after %s s",
                           it->spec->name, plumbp_t_len(P, it->result.drift_m),
                           num(P, it->result.time_s, TEXT_SIG)));
    ly += legend(d, x, ly, w, SHEET_DASHED, 1.0,
                 sheet_fmt(d, "the same release without drag, for comparison (%s)",
                           plumbp_t_speed(P, it->result.drag_free_speed_m_s)));
    for (size_t k = 0; k < pl->n_deploy; k++) {
        size_t dev = pl->deploy_device[k];
        char font[64];
        snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 8.5);
        cairo_rectangle(d->cr, x + 7.0, ly + 1.5, 7.0, 7.0);
        sheet_stroke(d, SHEET_SOLID, 1.2);
        ly += sheet_text(d, x + LEGEND_LINE, ly, w - LEGEND_LINE, font,
                         sheet_fmt(d, "square: the %s deploys (line stretch) at %s, %s s after "
                                      "release",
                                   plumb_descent_kind_name(it->spec->descent[dev].kind),
                                   plumbp_t_len(P, it->result.deploy_height_m[dev]),
                                   num(P, it->result.deploy_time_s[dev], TEXT_SIG)), 1) + 1.5;
    }
    return ly - y + 4.0;
}

/* The energy plot at (x, y), w x h; key: the limits' lines numbered, their
 * labels in a key below. *want_key: 1 when the labels found no place
 * beside their lines clear of the curves and of one another. */
static double energy_plot(sheet_doc *d, const plumb_brief *b, double x, double y, double w,
                          double h, int key, int *want_key)
{
    int us = d->opt->units == PLUMB_UNITS_US;
    double ls = us ? 1.0 / PLUMB_FT_M : 1.0, es = us ? 1.0 / PLUMB_FT_LBF_J : 1.0;
    const char *lu = us ? "ft" : "m", *eu = us ? "ft\u00B7lbf" : "J";
    writer *P = us ? &d->us : &d->si;
    double hmax = 0.0, emax = 0.0;
    for (size_t p = 0; p < b->n_plots; p++)
        for (size_t i = 0; i < b->plots[p].n_curve; i++) {
            hmax = fmax(hmax, b->plots[p].curve_h_m[i]);
            if (b->plots[p].curve_ok[i])
                emax = fmax(emax, b->plots[p].curve_e_j[i]);
        }
    for (size_t k = 0; k < b->n_criteria; k++)
        emax = fmax(emax, b->criteria[k]->energy_limit_j);
    double lmin = emax;
    for (size_t k = 0; k < b->n_criteria; k++)
        lmin = fmin(lmin, b->criteria[k]->energy_limit_j);
    /* limits far below the energies: a logarithmic energy axis, so the
     * lines and where the curves cross them can be read */
    int ylog = b->n_criteria > 0 && emax > LOG_RATIO * lmin;
    size_t n_leg = b->n_plots + 2;
    /* the key, when there is one, goes below this: the plot keeps its
     * height (sheet_section_plots keeps room for it) */
    double legend_h = 11.0 * (double)n_leg + 6.0 + (ylog ? 11.0 : 0.0);
    sheet_axes a = {x + AX_LEFT, y + AX_TOP, w - AX_LEFT - AX_RIGHT, h - AX_TOP - AX_BOTTOM - legend_h,
                    0.0, hmax * ls, 0.0, emax * 1.12 * es, ylog};
    if (ylog) {
        a.y0 = pow(10.0, floor(log10(lmin * es / 4.0)));
        /* the top: the next 1, 2 or 5 times a power of ten */
        double top = emax * es * 1.05, dec = pow(10.0, floor(log10(top)));
        a.y1 = top <= dec ? dec : top <= 2.0 * dec ? 2.0 * dec : top <= 5.0 * dec ? 5.0 * dec
                                                                               : 10.0 * dec;
    }
    size_t byy[PLUMB_MAX_VERDICTS];
    for (size_t k = 0; k < b->n_criteria; k++)
        byy[k] = k;
    for (size_t k = 1; k < b->n_criteria; k++) /* by limit, lowest first */
        for (size_t j = k; j > 0 && b->criteria[byy[j]]->energy_limit_j <
                                        b->criteria[byy[j - 1]]->energy_limit_j; j--) {
            size_t t = byy[j];
            byy[j] = byy[j - 1];
            byy[j - 1] = t;
        }
    /* numbered lines: their numbers right of the frame, which gives up
     * the room they take (the heights of the lines do not change) */
    char kfont[64];
    snprintf(kfont, sizeof kfont, "%s Bold %.1f", SHEET_FONT, KEY_FONT);
    double key_y[PLUMB_MAX_VERDICTS], key_w = 0.0, key_h = KEY_FONT + 1.5;
    int key_slot[PLUMB_MAX_VERDICTS];
    if (key && b->n_criteria > 0) {
        double py[PLUMB_MAX_VERDICTS];
        for (size_t q = 0; q < b->n_criteria; q++)
            py[q] = sheet_ax_y(&a, b->criteria[byy[q]]->energy_limit_j * es);
        /* as wide as the widest number: the highest, which has the most
         * digits, and every digit of DejaVu Sans is as wide as another */
        key_w = sheet_text_width(d, kfont, sheet_fmt(d, "%zu", b->n_criteria)) + 3.0;
        int slots = key_layout(py, b->n_criteria, key_h, a.y - AX_TOP + 1.0, a.y + a.h + TICK,
                               key_y, key_slot);
        a.w -= KEY_GAP + (double)slots * (key_w + KEY_GAP);
    }
    sheet_draw_axes(d, &a, sheet_fmt(d, "drop height above the strike level, %s", lu),
                    sheet_fmt(d, "impact energy, %s%s", eu, ylog ? " (logarithmic scale)" : ""));
    char font[64], bold[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 8.0);
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, 8.0);
    cairo_save(d->cr);
    cairo_rectangle(d->cr, a.x, a.y, a.w, a.h);
    cairo_clip(d->cr);
    cairo_set_source_rgb(d->cr, 0, 0, 0);
    /* the curves, from the origin, broken where a height has no fall */
    for (size_t p = 0; p < b->n_plots; p++) {
        const plumb_brief_plot *pl = &b->plots[p];
        int pen = 0;
        for (size_t i = 0; i < pl->n_curve; i++) {
            if (!pl->curve_ok[i] || (a.ylog && !(pl->curve_e_j[i] > 0.0))) {
                pen = 0;
                continue;
            }
            double px = sheet_ax_x(&a, pl->curve_h_m[i] * ls), py = sheet_ax_y(&a, pl->curve_e_j[i] * es);
            if (!pen)
                cairo_move_to(d->cr, px, py);
            else
                cairo_line_to(d->cr, px, py);
            pen = 1;
        }
        sheet_stroke(d, item_styles[p], p == 0 ? 1.8 : 1.1);
    }
    cairo_restore(d->cr);
    /* what the labels must keep clear of: the curves, every limit line,
     * the planned height's line and its label, the circles where the
     * first curve reaches a limit, and the labels already placed */
    label_obstacles ob;
    memset(&ob, 0, sizeof ob);
    for (size_t p = 0; p < b->n_plots; p++) {
        const plumb_brief_plot *pl = &b->plots[p];
        int pen = 0;
        double qx = 0.0, qy = 0.0;
        for (size_t i = 0; i < pl->n_curve; i++) {
            if (!pl->curve_ok[i] || (a.ylog && !(pl->curve_e_j[i] > 0.0))) {
                pen = 0;
                continue;
            }
            double px = sheet_ax_x(&a, pl->curve_h_m[i] * ls), py = sheet_ax_y(&a, pl->curve_e_j[i] * es);
            if (pen)
                add_seg(&ob, qx, qy, px, py, COST_CURVE, -1);
            qx = px;
            qy = py;
            pen = 1;
        }
    }
    const plumb_brief_plot *w0 = &b->plots[0];
    const plumb_item_report *worst = &b->fall->items[w0->item];
    double hp = worst->spec->release_m[2];
    double px_plan = sheet_ax_x(&a, hp * ls);
    add_seg(&ob, px_plan, a.y, px_plan, a.y + a.h, COST_PLANNED, -1);
    /* each criterion: a horizontal line with its name and where it is
     * reached, from the lowest line up */
    double mark_x[PLUMB_MAX_VERDICTS], mark_y[PLUMB_MAX_VERDICTS];
    size_t n_marks = 0;
    char where[PLUMB_MAX_VERDICTS][FMT_LEN / 8];
    for (size_t q = 0; q < b->n_criteria; q++) { /* every line first, then the words */
        const plumb_criterion *c = b->criteria[byy[q]];
        double py = sheet_ax_y(&a, c->energy_limit_j * es);
        cairo_move_to(d->cr, a.x, py);
        /* numbered: on past the frame into its number's box */
        cairo_line_to(d->cr, key ? a.x + a.w + KEY_GAP + (double)key_slot[q] * (key_w + KEY_GAP)
                                 : a.x + a.w, py);
        sheet_stroke(d, SHEET_DASHED, 0.8);
        add_seg(&ob, a.x, py, a.x + a.w, py, COST_LINE, (int)q);
        where[q][0] = '\0';
        const plumb_item_report *it = &b->fall->items[w0->item];
        for (size_t v = 0; v < w0->n_limits && v < it->n_verdicts; v++) {
            if (it->verdicts[v].criterion != c)
                continue;
            const plumb_limit_result *r = &w0->limits[v];
            if (r->outcome == PLUMB_LIMIT_FOUND) {
                /* rounded down when lower heights keep within the limit:
                 * the printed height is a safe one */
                snprintf(where[q], sizeof where[q], "%s",
                         sheet_fmt(d, ", reached at %s",
                                   r->limit_is_upper_bound
                                       ? plumbp_t_limit(P, plumbp_t_len, r->value_si)
                                       : plumbp_t_len(P, r->value_si)));
                if (r->value_si * ls <= a.x1 && n_marks < PLUMB_MAX_VERDICTS) {
                    mark_x[n_marks] = sheet_ax_x(&a, r->value_si * ls);
                    mark_y[n_marks] = py;
                    add_box(&ob, mark_x[n_marks] - 4.0, py - 4.0, mark_x[n_marks] + 4.0, py + 4.0,
                            COST_MARK);
                    n_marks++;
                }
            } else if (r->outcome == PLUMB_LIMIT_UNLIMITED) {
                snprintf(where[q], sizeof where[q], ", not reached at any height");
            } else if (r->outcome == PLUMB_LIMIT_NOT_REACHED) {
                snprintf(where[q], sizeof where[q], ", not reached at any height computed");
            } else if (r->outcome == PLUMB_LIMIT_IMPOSSIBLE) {
                snprintf(where[q], sizeof where[q], ", exceeded at every height");
            }
        }
    }
    /* the planned height's label beside its line, at the top of the plot
     * or at its foot, right of the line or left of it: the first place
     * clear of the curves and the limits' lines (the top right unless a
     * curve runs there; kept: sheet_fmt's ring is reused before it is drawn) */
    char pl_text[FMT_LEN];
    snprintf(pl_text, sizeof pl_text, "%s", sheet_fmt(d, "planned %s", plumbp_t_len(P, hp)));
    double pl_w = sheet_text_width(d, font, pl_text), pl_x = 0.0, pl_y = 0.0, pl_best = HUGE_VAL;
    for (int k = 0; k < 4; k++) {
        double cx = k % 2 == 0 ? px_plan + 2.0 : px_plan - pl_w - 5.0;
        double cy = k < 2 ? a.y + 2.0 : a.y + a.h - 11.0;
        if (cx < a.x + 1.0 || cx + pl_w + 2.0 > a.x + a.w - 1.0)
            continue;
        double c = label_cost(&ob, -2, cx, cy, cx + pl_w + 2.0, cy + 9.0, cy); /* -2: no owner */
        if (c < pl_best) {
            pl_best = c;
            pl_x = cx;
            pl_y = cy;
        }
    }
    if (pl_best == HUGE_VAL) { /* no room either side: where it was */
        pl_x = px_plan + 3.0 + pl_w + 4.0 > a.x + a.w ? px_plan - pl_w - 5.0 : px_plan + 2.0;
        pl_y = a.y + 2.0;
    }
    add_box(&ob, pl_x, pl_y, pl_x + pl_w + 2.0, pl_y + 9.0, COST_LABEL);
    /* each label on one line, or on two ("ID: LIMIT," / "reached at H"),
     * which fits where one line does not */
    char text[PLUMB_MAX_VERDICTS][2][FMT_LEN / 4];
    double tw[PLUMB_MAX_VERDICTS][2], th[PLUMB_MAX_VERDICTS][2], line_y[PLUMB_MAX_VERDICTS];
    for (size_t q = 0; q < b->n_criteria; q++) {
        const plumb_criterion *c = b->criteria[byy[q]];
        line_y[q] = sheet_ax_y(&a, c->energy_limit_j * es);
        /* the limit in the axis's unit only (both are in section 2): a
         * shorter label finds a clear place more often */
        char lim[FMT_LEN / 8];
        snprintf(lim, sizeof lim, "%s",
                 plumbp_t_limit_energy_at(P, c->energy_limit_j, sheet_limit_sig(b, c)));
        char *other = strstr(lim, " (");
        if (other)
            *other = '\0';
        const char *id = sheet_esc(d, c->id), *lm = sheet_fmt(d, "%s", lim);
        snprintf(text[q][0], sizeof text[q][0], "%.200s: %.60s%.200s", id, lm, where[q]);
        if (where[q][0])
            snprintf(text[q][1], sizeof text[q][1], "%.200s: %.60s,\n%.200s", id, lm, where[q] + 2);
        else
            text[q][1][0] = '\0';
        for (int v = 0; v < 2; v++) {
            tw[q][v] = text[q][v][0] ? sheet_text_width(d, bold, text[q][v]) + 2.0 : 0.0;
            th[q][v] = v == 0 ? 10.0 : sheet_text(d, 0.0, 0.0, 0.0, bold, text[q][v], 0) + 0.7;
        }
    }
    /* placed from the lowest line up, then from the highest down: the
     * order with the lesser cost is drawn */
    double lx_[PLUMB_MAX_VERDICTS], ly_[PLUMB_MAX_VERDICTS], lc_[PLUMB_MAX_VERDICTS],
        best_total = HUGE_VAL;
    int lv_[PLUMB_MAX_VERDICTS];
    for (int order = 0; order < 2; order++) {
        label_obstacles trial = ob;
        double total = 0.0, px_[PLUMB_MAX_VERDICTS], py_[PLUMB_MAX_VERDICTS],
               pc_[PLUMB_MAX_VERDICTS];
        int pv_[PLUMB_MAX_VERDICTS];
        for (size_t i = 0; i < b->n_criteria; i++) {
            size_t q = order == 0 ? i : b->n_criteria - 1 - i;
            double cost = HUGE_VAL;
            for (int v = 0; v < 2; v++) {
                if (!text[q][v][0])
                    continue;
                double tx, ty;
                place_label(&trial, &a, (int)q, line_y[q], tw[q][v], th[q][v], &tx, &ty);
                double cv = label_cost(&trial, (int)q, tx, ty, tx + tw[q][v], ty + th[q][v],
                                       line_y[q]) + (v ? COST_TWO_LINES : 0.0);
                if (cv < cost) {
                    cost = cv;
                    px_[q] = tx;
                    py_[q] = ty;
                    pv_[q] = v;
                }
            }
            total += cost;
            pc_[q] = cost;
            label_claim(&trial, px_[q], py_[q], tw[q][pv_[q]], th[q][pv_[q]], line_y[q]);
        }
        if (total < best_total) {
            best_total = total;
            memcpy(lx_, px_, sizeof lx_);
            memcpy(ly_, py_, sizeof ly_);
            memcpy(lv_, pv_, sizeof lv_);
            memcpy(lc_, pc_, sizeof lc_);
        }
    }
    *want_key = 0;
    for (size_t q = 0; q < b->n_criteria; q++) {
        double lh = th[q][lv_[q]], py = line_y[q], ty = ly_[q];
        double gap = ty + lh < py ? py - (ty + lh) : ty > py ? ty - py : 0.0;
        if (gap > LABEL_NEAR || lc_[q] >= COST_PLANNED)
            *want_key = 1;
    }
    /* numbered lines: each number right of the frame, in a box its line
     * runs into (key_layout) */
    for (size_t q = 0; key && q < b->n_criteria; q++) {
        const char *num_s = sheet_fmt(d, "%zu", b->n_criteria - q); /* 1: the highest line */
        double bx = a.x + a.w + KEY_GAP + (double)key_slot[q] * (key_w + KEY_GAP);
        double ny = key_y[q] - key_h / 2.0;
        cairo_set_source_rgb(d->cr, 1, 1, 1);
        cairo_rectangle(d->cr, bx, ny, key_w, key_h);
        cairo_fill(d->cr);
        cairo_set_source_rgb(d->cr, 0, 0, 0);
        cairo_rectangle(d->cr, bx, ny, key_w, key_h);
        sheet_stroke(d, SHEET_SOLID, 0.5);
        sheet_text_at(d, bx + key_w / 2.0, ny + (key_h - KEY_FONT * 1.25) / 2.0, 2, kfont, num_s);
    }
    for (size_t q = 0; !key && q < b->n_criteria; q++) {
        double tx = lx_[q], ty = ly_[q], w_ = tw[q][lv_[q]], lh = th[q][lv_[q]], py = line_y[q];
        /* a white ground so the grid does not cross the words */
        cairo_set_source_rgb(d->cr, 1, 1, 1);
        cairo_rectangle(d->cr, tx, ty, w_, lh - 0.5);
        cairo_fill(d->cr);
        cairo_set_source_rgb(d->cr, 0, 0, 0);
        sheet_text_at(d, tx + 1.0, ty, 0, bold, sheet_fmt(d, "\x02%s", text[q][lv_[q]]));
        double lx = tx + LEADER_IN;
        if (ty + lh < py - 1.0 || ty > py + 1.0) { /* away from its line: a leader to it */
            cairo_move_to(d->cr, lx, ty + lh < py ? ty + lh : ty);
            cairo_line_to(d->cr, lx, py);
            sheet_stroke(d, SHEET_SOLID, 0.5);
            cairo_new_sub_path(d->cr); /* a dot where it meets its line */
            cairo_arc(d->cr, lx, py, 1.6, 0.0, 2.0 * 3.14159265358979323846);
            cairo_fill(d->cr);
        }
    }
    /* where the first curve reaches each limit, over the labels */
    for (size_t k = 0; k < n_marks; k++) {
        cairo_new_sub_path(d->cr);
        cairo_arc(d->cr, mark_x[k], mark_y[k], 3.0, 0.0, 2.0 * 3.14159265358979323846);
        cairo_set_source_rgb(d->cr, 1, 1, 1);
        cairo_fill_preserve(d->cr);
        cairo_set_source_rgb(d->cr, 0, 0, 0);
        sheet_stroke(d, SHEET_SOLID, 1.0);
    }
    /* the planned height */
    cairo_move_to(d->cr, px_plan, a.y);
    cairo_line_to(d->cr, px_plan, a.y + a.h);
    sheet_stroke(d, SHEET_DOTTED, 1.2);
    cairo_set_source_rgb(d->cr, 1, 1, 1);
    cairo_rectangle(d->cr, pl_x, pl_y, pl_w + 2.0, 9.0);
    cairo_fill(d->cr);
    cairo_set_source_rgb(d->cr, 0, 0, 0);
    sheet_text_at(d, pl_x + 1.0, pl_y, 0, font, pl_text);
    /* the legend */
    double ly = a.y + a.h + AX_BOTTOM;
    for (size_t p = 0; p < b->n_plots; p++) {
        const plumb_item_report *it = &b->fall->items[b->plots[p].item];
        ly += legend(d, x, ly, w, item_styles[p], p == 0 ? 1.8 : 1.1,
                     sheet_fmt(d, "%s: %s at the planned %s", it->spec->name,
                               plumbp_t_energy_at(P, it->result.energy_j,
                                                  plumbp_energy_sig(it->verdicts, it->n_verdicts,
                                                                    TEXT_SIG)),
                               plumbp_t_len(P, hp)));
    }
    ly += legend(d, x, ly, w, SHEET_DASHED, 0.8,
                 key ? "each criterion's energy limit, numbered at its right end and named below; "
                       "a circle where the first curve reaches it (plumb limit --find "
                       "release.height)"
                     : "each criterion's energy limit, named on the line; a circle where the "
                       "first curve reaches it (plumb limit --find release.height)");
    if (key) { /* two columns, from the highest line down */
        double col = (w - LEGEND_LINE) / 2.0, row_h = 0.0;
        for (size_t i = 0; i < b->n_criteria; i++) {
            size_t q = b->n_criteria - 1 - i;
            double cx = x + LEGEND_LINE + (double)(i % 2) * col;
            double th_ = sheet_text(d, cx, ly, col - 6.0, font,
                                    sheet_fmt(d, "\x02<b>%zu</b>  %s", i + 1, text[q][0]), 1);
            row_h = fmax(row_h, th_);
            if (i % 2 == 1 || i + 1 == b->n_criteria) {
                ly += row_h + 1.5;
                row_h = 0.0;
            }
        }
    }
    ly += legend(d, x, ly, w, SHEET_DOTTED, 1.2, "the planned drop height");
    if (ylog)
        ly += sheet_text(d, x + LEGEND_LINE, ly, w - LEGEND_LINE, font,
                         "The energy axis is logarithmic: its marks are at 1, 2 and 5 times "
                         "each power of ten, and equal distances up are equal ratios of energy "
                         "(10 to 100 as far as 100 to 1000).",
                         1) + 1.5;
    /* a curve with no figures at some heights says why, rather than
     * leaving a gap the reader might take for zero energy */
    for (size_t p = 0; p < b->n_plots; p++) {
        const plumb_brief_plot *cp = &b->plots[p];
        const plumb_fall_spec *sp = b->fall->items[cp->item].spec;
        size_t first = 0, missing = 0;
        for (size_t i = 1; i < cp->n_curve; i++) {
            if (!cp->curve_ok[i])
                missing++;
            else if (!first)
                first = i;
        }
        if (!missing)
            continue;
        double below = 0.0;
        size_t dev = 0;
        for (size_t k = 0; k < sp->n_descent && k < PLUMB_MAX_DESCENT; k++)
            if (sp->descent[k].trigger == PLUMB_DEPLOY_BELOW && sp->descent[k].deploy_value > below) {
                below = sp->descent[k].deploy_value;
                dev = k;
            }
        const char *why =
            below > 0.0 && first > 1 && cp->curve_h_m[first - 1] <= below
                ? sheet_fmt(d, "%s: no curve at drop heights up to %s; its %s deploys "
                               "below that height, so the drop must start above it.",
                            sheet_esc(d, sp->name), plumbp_t_len(P, below),
                            plumb_descent_kind_name(sp->descent[dev].kind))
                : sheet_fmt(d, "%s: no curve at %zu of the %zu heights plotted, where the fall "
                               "cannot be computed.",
                            sheet_esc(d, sp->name), missing, cp->n_curve);
        ly += sheet_text(d, x + LEGEND_LINE, ly, w - LEGEND_LINE, font, why, 1) + 1.5;
    }
    return ly - y + 4.0;
}

double sheet_energy_plot(sheet_doc *d, const plumb_brief *b, double x, double y, double w, double h)
{
    if (b->n_plots == 0)
        return 0.0;
    /* laid out once unseen, to learn whether the labels fit beside their
     * lines; then drawn, with a key when they do not */
    int want_key = 0, unused = 0;
    cairo_push_group(d->cr);
    energy_plot(d, b, x, y, w, h, 0, &want_key);
    cairo_pattern_destroy(cairo_pop_group(d->cr));
    return energy_plot(d, b, x, y, w, h, want_key, &unused);
}
