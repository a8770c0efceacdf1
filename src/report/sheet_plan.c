/*
 * sheet_plan.c - the plan view of a clearance zone: whatever the zone
 * gives (circles, polygons, impact points and a density grid, each with
 * its words), the drop point and any target, a wind arrow, a north arrow
 * and a scale bar in metres (and feet with --units us). North is up and
 * one metre is the same length both ways. The impacts are grey shading
 * (darker where more fell); every line is named in the legend by its
 * weight and dash, so nothing depends on colour.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/sheet_doc.h"
#include "report/common.h"

#define PI 3.14159265358979323846
/* Cells of the density grid made from impact points, each way. */
#define GRID_N 60
/* Room round the zone, as a fraction of its size. */
#define PAD 0.08

static void mark_cross(cairo_t *cr, double x, double y, double r)
{
    cairo_move_to(cr, x - r, y);
    cairo_line_to(cr, x + r, y);
    cairo_move_to(cr, x, y - r);
    cairo_line_to(cr, x, y + r);
}

/* An arrow from (x0, y0) to (x1, y1), head at the end. */
static void arrow(sheet_doc *d, double x0, double y0, double x1, double y1, double width)
{
    cairo_t *cr = d->cr;
    cairo_move_to(cr, x0, y0);
    cairo_line_to(cr, x1, y1);
    sheet_stroke(d, SHEET_SOLID, width);
    double a = atan2(y1 - y0, x1 - x0), l = 6.0;
    cairo_move_to(cr, x1, y1);
    cairo_line_to(cr, x1 - l * cos(a - 0.4), y1 - l * sin(a - 0.4));
    cairo_line_to(cr, x1 - l * cos(a + 0.4), y1 - l * sin(a + 0.4));
    cairo_close_path(cr);
    cairo_fill(cr);
}

/* The scale bar: a round length about a fifth of the view, in `unit_m`
 * metres per unit, labelled. Returns its height: the bar, its labels and
 * a gap, so that a second bar (feet) does not touch the labels above it. */
static double scale_bar(sheet_doc *d, double x, double y, double pt_per_m, double view_m,
                        double unit_m, const char *unit)
{
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 8.0);
    double len = sheet_nice_step(view_m / unit_m, 4.0); /* in the unit */
    double w = len * unit_m * pt_per_m;
    cairo_t *cr = d->cr;
    cairo_set_source_rgb(cr, 0, 0, 0);
    cairo_rectangle(cr, x, y, w / 2.0, 3.0);
    cairo_fill(cr);
    cairo_rectangle(cr, x, y, w, 3.0);
    sheet_stroke(d, SHEET_SOLID, 0.6);
    sheet_text_at(d, x, y + 4.0, 2, font, "0");
    sheet_text_at(d, x + w, y + 4.0, 2, font, sheet_fmt(d, "%g %s", len, unit));
    return 4.0 + sheet_text(d, 0.0, 0.0, 0.0, font, "0", 0) + 3.0;
}

double sheet_plan_view(sheet_doc *d, const sheet_plan *p, double x, double y, double w, double h)
{
    cairo_t *cr = d->cr;
    char font[64], bold[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 8.5);
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, 8.5);
    /* the extent: every circle, polygon, point and mark */
    double lo[2] = {p->drop_m[0], p->drop_m[1]}, hi[2] = {p->drop_m[0], p->drop_m[1]};
#define TAKE(px, py)                                                                           \
    do {                                                                                       \
        lo[0] = fmin(lo[0], (px));                                                             \
        hi[0] = fmax(hi[0], (px));                                                             \
        lo[1] = fmin(lo[1], (py));                                                             \
        hi[1] = fmax(hi[1], (py));                                                             \
    } while (0)
    for (size_t i = 0; i < p->n_circles; i++) {
        const sheet_circle *c = &p->circles[i];
        TAKE(c->centre_m[0] - c->radius_m, c->centre_m[1] - c->radius_m);
        TAKE(c->centre_m[0] + c->radius_m, c->centre_m[1] + c->radius_m);
    }
    for (size_t i = 0; i < p->n_polygons; i++)
        for (size_t k = 0; k < p->polygons[i].n; k++)
            TAKE(p->polygons[i].xy_m[2 * k], p->polygons[i].xy_m[2 * k + 1]);
    if (p->has_target)
        TAKE(p->target_m[0], p->target_m[1]);
    if (p->has_aim)
        TAKE(p->aim_m[0], p->aim_m[1]);
#undef TAKE
    double span = fmax(fmax(hi[0] - lo[0], hi[1] - lo[1]), 1.0) * (1.0 + 2.0 * PAD);
    double cxm = (lo[0] + hi[0]) / 2.0, cym = (lo[1] + hi[1]) / 2.0;
    /* the map square on the left, the legend on the right */
    double side = fmin(h, w * 0.55);
    double mx = x, my = y, ppm = side / span;
    double e0 = cxm - span / 2.0, n1 = cym + span / 2.0;
#define PX(e) (mx + ((e) - e0) * ppm)
#define PY(n) (my + (n1 - (n)) * ppm)
    cairo_save(cr);
    cairo_rectangle(cr, mx, my, side, side);
    cairo_clip(cr);
    /* the impacts: a grid of grey cells, darker where more fell */
    double grid[GRID_N * GRID_N];
    if (p->n_points > 0) {
        memset(grid, 0, sizeof grid);
        double cell = span / GRID_N, gmax = 0.0;
        for (size_t i = 0; i < p->n_points; i++) {
            long gx = (long)floor((p->points_m[2 * i] - e0) / cell);
            long gy = (long)floor((n1 - p->points_m[2 * i + 1]) / cell);
            if (gx < 0 || gy < 0 || gx >= GRID_N || gy >= GRID_N)
                continue;
            double *g = &grid[gy * GRID_N + gx];
            *g += 1.0;
            gmax = fmax(gmax, *g);
        }
        for (int gy = 0; gy < GRID_N; gy++)
            for (int gx = 0; gx < GRID_N; gx++) {
                double v = grid[gy * GRID_N + gx];
                if (v <= 0.0)
                    continue;
                double shade = 0.92 - 0.6 * sqrt(v / gmax);
                cairo_set_source_rgb(cr, shade, shade, shade);
                cairo_rectangle(cr, mx + gx * cell * ppm, my + gy * cell * ppm, cell * ppm + 0.05,
                                cell * ppm + 0.05);
                cairo_fill(cr);
            }
    }
    if (p->grid && p->grid->nx && p->grid->ny) {
        const sheet_grid *g = p->grid;
        double gmax = 0.0;
        for (size_t i = 0; i < g->nx * g->ny; i++)
            gmax = fmax(gmax, g->density[i]);
        for (size_t j = 0; gmax > 0.0 && j < g->ny; j++)
            for (size_t i = 0; i < g->nx; i++) {
                double v = g->density[j * g->nx + i];
                if (v <= 0.0)
                    continue;
                double shade = 0.92 - 0.6 * sqrt(v / gmax);
                cairo_set_source_rgb(cr, shade, shade, shade);
                double ex = g->x0_m + (double)i * g->cell_m, ny = g->y0_m + (double)(j + 1) * g->cell_m;
                cairo_rectangle(cr, PX(ex), PY(ny), g->cell_m * ppm, g->cell_m * ppm);
                cairo_fill(cr);
            }
    }
    cairo_set_source_rgb(cr, 0, 0, 0);
    for (size_t i = 0; i < p->n_polygons; i++) {
        const sheet_polygon *pg = &p->polygons[i];
        for (size_t k = 0; k < pg->n; k++) {
            double px = PX(pg->xy_m[2 * k]), py = PY(pg->xy_m[2 * k + 1]);
            if (k == 0)
                cairo_move_to(cr, px, py);
            else
                cairo_line_to(cr, px, py);
        }
        cairo_close_path(cr);
        sheet_stroke(d, pg->style, pg->width);
    }
    for (size_t i = 0; i < p->n_circles; i++) {
        const sheet_circle *c = &p->circles[i];
        cairo_new_sub_path(cr);
        cairo_arc(cr, PX(c->centre_m[0]), PY(c->centre_m[1]), c->radius_m * ppm, 0.0, 2.0 * PI);
        sheet_stroke(d, c->style, c->width);
    }
    /* the drop point: a cross in a circle; the target: a cross; the aim: a square */
    mark_cross(cr, PX(p->drop_m[0]), PY(p->drop_m[1]), 6.0);
    sheet_stroke(d, SHEET_SOLID, 1.2);
    cairo_arc(cr, PX(p->drop_m[0]), PY(p->drop_m[1]), 3.5, 0.0, 2.0 * PI);
    sheet_stroke(d, SHEET_SOLID, 1.0);
    if (p->has_target) {
        mark_cross(cr, PX(p->target_m[0]), PY(p->target_m[1]), 6.0);
        sheet_stroke(d, SHEET_SOLID, 2.0);
    }
    if (p->has_aim) {
        cairo_rectangle(cr, PX(p->aim_m[0]) - 3.0, PY(p->aim_m[1]) - 3.0, 6.0, 6.0);
        sheet_stroke(d, SHEET_SOLID, 1.0);
    }
    cairo_restore(cr);
    cairo_set_source_rgb(cr, 0, 0, 0);
    cairo_rectangle(cr, mx, my, side, side);
    sheet_stroke(d, SHEET_SOLID, 0.7);
#undef PX
#undef PY
    /* north arrow, top right of the map */
    double nx = mx + side - 14.0, ny = my + 10.0;
    arrow(d, nx, ny + 22.0, nx, ny, 1.2);
    sheet_text_at(d, nx + 5.0, ny + 4.0, 0, bold, "N");
    /* the legend */
    double lx = mx + side + 12.0, lw = x + w - lx, ly = y;
    int us = d->opt->units == PLUMB_UNITS_US;
    writer *P = us ? &d->us : &d->si;
    /* the wind: an arrow the way the air moves */
    if (p->wind_m_s > 0.0) {
        double to = (p->wind_from_deg + 180.0) * PI / 180.0;
        double ax = lx + 10.0, ay = ly + 10.0;
        arrow(d, ax - 9.0 * sin(to), ay + 9.0 * cos(to), ax + 9.0 * sin(to), ay - 9.0 * cos(to), 1.2);
        ly += sheet_text(d, lx + 24.0, ly, lw - 24.0, font,
                         sheet_fmt(d, "arrow: the way the wind blows, %s from %s at the release height",
                                   plumbp_t_wind(P, p->wind_m_s),
                                   plumbp_t_bearing(P, p->wind_from_deg)), 1) + 6.0;
    } else {
        ly += sheet_text(d, lx, ly, lw, font, "still air", 1) + 4.0;
    }
    mark_cross(cr, lx + 9.0, ly + 5.0, 6.0);
    sheet_stroke(d, SHEET_SOLID, 1.2);
    cairo_arc(cr, lx + 9.0, ly + 5.0, 3.5, 0.0, 2.0 * PI);
    sheet_stroke(d, SHEET_SOLID, 1.0);
    ly += sheet_text(d, lx + 24.0, ly, lw - 24.0, font, "the planned drop point", 1) + 3.0;
    if (p->has_target) {
        mark_cross(cr, lx + 9.0, ly + 5.0, 6.0);
        sheet_stroke(d, SHEET_SOLID, 2.0);
        ly += sheet_text(d, lx + 24.0, ly, lw - 24.0, font, "heavy cross: the target", 1) + 3.0;
    }
    if (p->has_aim) {
        cairo_rectangle(cr, lx + 6.0, ly + 2.0, 6.0, 6.0);
        sheet_stroke(d, SHEET_SOLID, 1.0);
        ly += sheet_text(d, lx + 24.0, ly, lw - 24.0, font,
                         "square: the release point that lands on the target", 1) + 3.0;
    }
    for (size_t i = 0; i < p->n_circles; i++) {
        cairo_move_to(cr, lx, ly + 5.0);
        cairo_line_to(cr, lx + 18.0, ly + 5.0);
        sheet_stroke(d, p->circles[i].style, p->circles[i].width);
        ly += sheet_text(d, lx + 24.0, ly, lw - 24.0, font, sheet_fmt(d, "%s", p->circles[i].label),
                         1) + 3.0;
    }
    for (size_t i = 0; i < p->n_polygons; i++) {
        cairo_move_to(cr, lx, ly + 5.0);
        cairo_line_to(cr, lx + 18.0, ly + 5.0);
        sheet_stroke(d, p->polygons[i].style, p->polygons[i].width);
        ly += sheet_text(d, lx + 24.0, ly, lw - 24.0, font, sheet_fmt(d, "%s", p->polygons[i].label),
                         1) + 3.0;
    }
    if (p->n_points > 0 || p->grid) {
        cairo_set_source_rgb(cr, 0.55, 0.55, 0.55);
        cairo_rectangle(cr, lx + 2.0, ly + 1.0, 14.0, 8.0);
        cairo_fill(cr);
        cairo_set_source_rgb(cr, 0, 0, 0);
        ly += sheet_text(d, lx + 24.0, ly, lw - 24.0, font,
                         sheet_fmt(d, "%s", p->grid ? p->grid->label : p->points_label), 1) + 6.0;
    }
    /* the scale bars: metres, and feet with --units us */
    ly += 4.0;
    ly += scale_bar(d, lx + 4.0, ly, ppm, span, 1.0, "m");
    if (us)
        ly += scale_bar(d, lx + 4.0, ly, ppm, span, PLUMB_FT_M, "ft");
    ly += sheet_text(d, lx, ly, lw, font, "north is up; one scale both ways", 1);
    return fmax(side, ly - y) + 6.0;
}
