/*
 * sheet_sections.c - the sections of the PDF sheet that sheet.c draws in
 * order: the header, the answer (verdicts, the zone), the inputs and what
 * the model assumes, the cautions, and the frames of the pictures
 * (sheet_plot.c, sheet_plan.c); a kit's inventory table is
 * sheet_inventory.c's.
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

/* What the model assumes (README.md "The model", SAFETY.md section 3), for
 * section 7 of the sheet. */
static const char *const assumptions[] = {
    "The payload is a point mass: its drag is a drag coefficient on a reference area (or a "
    "shape's correlation), with no lift, spin or tumbling dynamics beyond the attitude stated.",
    "Air is the atmosphere model named in the inputs, at rest except for the wind profile given; "
    "gusts and turbulence enter only through the uncertainty of the clearance zone.",
    "The ground is level at the strike level; the figures are for the first impact. Bounce, roll, "
    "deflection and breakage are not modelled: the zone's scatter allowance stands for them.",
    "A descent device opens as stated (line stretch at its trigger, canopy area growing over the "
    "fill time); a device that fails to open is not considered unless the profile is run without "
    "it.",
    "The clearance zone is a Monte Carlo estimate over the stated input distributions: it is only "
    "as good as those distributions.",
};

/* ---- 1. the header ------------------------------------------------------------ */

static const char *or_blank(sheet_doc *d, const char *s)
{
    return s && s[0] ? sheet_esc(d, s) : "";
}

/* "label: value" with a line to write on when the value is blank. A
 * value too long for its room wraps (a field with a signature keeps the
 * right half for it). Returns the height it takes beyond one line, for
 * the caller to move the next row down by. */
static double field(sheet_doc *d, double x, double y, double w, const char *label,
                    const char *value, int sign)
{
    char font[64], bold[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_BODY);
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, SHEET_BODY);
    double lw = sheet_text_width(d, bold, sheet_esc(d, label)) + 4.0;
    double lh = sheet_text(d, x, y, 0.0, bold, sheet_esc(d, label), 1), h = lh;
    double room = (sign ? x + w * 0.5 : x + w) - (x + lw);
    if (value[0])
        h = fmax(h, sheet_text(d, x + lw, y, room, font, value, 1));
    double base = y + SHEET_BODY * 1.35;
    /* a line for the name when none is given, then one to sign on */
    double from = value[0] ? x + lw + fmin(sheet_text_width(d, font, value), room) + 8.0 : x + lw;
    double name_end = sign && !value[0] ? x + w * 0.5 : x + w;
    if (!value[0]) {
        cairo_move_to(d->cr, from, base);
        cairo_line_to(d->cr, name_end, base);
        sheet_stroke(d, SHEET_SOLID, 0.5);
        from = name_end + 8.0;
    }
    /* the signature at one column, given a name or not, so that every
     * signed row's lines stand under each other */
    if (sign)
        from = x + w * 0.5 + 8.0;
    if (sign) {
        sheet_text(d, from, y, 0.0, font, "signature", 1);
        from += sheet_text_width(d, font, "signature") + 4.0;
        cairo_move_to(d->cr, from, base);
        cairo_line_to(d->cr, x + w, base);
        sheet_stroke(d, SHEET_SOLID, 0.5);
    }
    return h - lh;
}

static void when_text(const plumb_sheet_options *o, char *buf, size_t size)
{
    time_t t = (time_t)o->time_utc, lt = (time_t)(o->time_utc + o->utc_offset_s);
    struct tm u, l;
    gmtime_r(&t, &u);
    gmtime_r(&lt, &l);
    int off = o->utc_offset_s < 0 ? -o->utc_offset_s : o->utc_offset_s;
    snprintf(buf, size,
             "%04d-%02d-%02d %02d:%02d:%02d UTC (local %04d-%02d-%02d %02d:%02d, UTC%c%02d:%02d)",
             u.tm_year + 1900, u.tm_mon + 1, u.tm_mday, u.tm_hour, u.tm_min, u.tm_sec,
             l.tm_year + 1900, l.tm_mon + 1, l.tm_mday, l.tm_hour, l.tm_min,
             o->utc_offset_s < 0 ? '-' : '+', off / 3600, off % 3600 / 60);
}

static void file_row(sheet_doc *d, const char *what, const char *path, const char *sha)
{
    char font[64], mono[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_SMALL);
    snprintf(mono, sizeof mono, "%s %.1f", SHEET_MONO, 7.5);
    double w = sheet_width(d);
    const char *name = sheet_fmt(d, "%s  %s", what, path);
    double h1 = sheet_text(d, d->left, d->y, w, font, name, 0);
    sheet_need(d, h1 + 9.0);
    sheet_text(d, d->left, d->y, w, font, name, 1);
    d->y += h1;
    d->y += sheet_text(d, d->left + 10.0, d->y, w - 10.0, mono, sheet_fmt(d, "SHA-256 %s", sha), 1) +
            1.5;
}

void sheet_section_header(sheet_doc *d, const plumb_brief *b)
{
    const plumb_job *job = plumb_profile_job(b->profile);
    char big[64], font[64];
    snprintf(big, sizeof big, "%s Bold %.1f", SHEET_FONT, 20.0);
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_BODY);
    double w = sheet_width(d);
    d->running = NULL;
    sheet_need(d, 200.0);
    const char *title = job->title[0] ? job->title : plumb_profile_name(b->profile);
    d->y += sheet_text(d, d->left, d->y, w, big, sheet_esc(d, title), 1) + 2.0;
    d->y += sheet_text(d, d->left, d->y, w, font,
                       sheet_fmt(d, "Drop and fall safety sheet. %s: %s", b->fall->n_items > 1 ?
                                 "Inventory" : "Payload", plumb_profile_name(b->profile)), 1) + 6.0;
    sheet_heading(d, "Job, date and inputs", 120.0);
    char when[160];
    when_text(d->opt, when, sizeof when);
    double row = SHEET_BODY * 2.0, half = (w - 12.0) / 2.0;
    double more = field(d, d->left, d->y, half, "Site:", or_blank(d, job->site), 0);
    more = fmax(more, field(d, d->left + half + 12.0, d->y, half, "Reference:",
                            or_blank(d, job->reference), 0));
    d->y += row + more;
    d->y += row + field(d, d->left, d->y, w, "Calculated:", sheet_esc(d, when), 0);
    d->y += row + field(d, d->left, d->y, w, "Prepared by:", or_blank(d, job->prepared_by), 1);
    d->y += row + field(d, d->left, d->y, w, "Checked by:", or_blank(d, job->checked_by), 1);
    const plumb_zone_result *z = b->zone ? b->zone->items[b->zone_item].result : NULL;
    const char *prog = sheet_fmt(d, "plumb %s", d->opt->version ? d->opt->version : "");
    const char *seed = z ? sheet_fmt(d, "%lu, %zu samples", z->seed, z->samples)
                         : "none (no clearance zone)";
    more = field(d, d->left, d->y, half, "Program:", prog, 0);
    d->y += row + fmax(more, field(d, d->left + half + 12.0, d->y, half, "Seed:", seed, 0));
    file_row(d, "Profile", plumb_profile_path(b->profile), plumb_profile_sha256(b->profile));
    for (size_t i = 0; i < b->n_criteria; i++) {
        const plumb_criterion *c = b->criteria[i];
        file_row(d, sheet_fmt(d, "Criterion %s", c->id), c->path[0] ? c->path : "(built in code)",
                 c->sha256[0] ? c->sha256 : "(none: not read from a file)");
    }
}

/* ---- 2. the answer -------------------------------------------------------------- */


/* A figure in the other system beside the sheet's own: US beside SI in
 * parentheses, SI beside US in brackets, as the text reports give them
 * (README, --units). */
static const char *beside(sheet_doc *d, const char *other)
{
    return sheet_fmt(d, d->opt->units == PLUMB_UNITS_US ? "[%s]" : "(%s)", other);
}

static void answer_line(sheet_doc *d, const char *label, const char *value)
{
    char big[64], lab[64];
    snprintf(big, sizeof big, "%s Bold %.1f", SHEET_FONT, 18.0);
    snprintf(lab, sizeof lab, "%s %.1f", SHEET_FONT, 12.0);
    double lw = 110.0;
    double h = sheet_text(d, d->left + lw, d->y, sheet_width(d) - lw, big, value, 0);
    sheet_need(d, h);
    sheet_text(d, d->left, d->y + 3.0, lw, lab, sheet_esc(d, label), 1);
    sheet_text(d, d->left + lw, d->y, sheet_width(d) - lw, big, value, 1);
    d->y += h + 1.0;
}

static void zone_answer(sheet_doc *d, const plumb_brief *b)
{
    char font[64], bold[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_BODY);
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, 11.0);
    writer *P = sheet_primary(d), *S = sheet_secondary(d);
    if (!b->zone) {
        sheet_para(d, bold, sheet_esc(d, b->no_zone));
        return;
    }
    const plumb_zone_result *z = b->zone->items[b->zone_item].result;
    const plumb_zone_stats *s = &z->zone;
    /* plain text: the sheet_fmt it goes into escapes it, once */
    char who[PLUMB_NAME + 64] = "";
    if (b->zone->n_items > 1)
        snprintf(who, sizeof who, " (set by %s, the item with the largest radius)",
                 b->zone->items[b->zone_item].name);
    const char *keep = plumbp_t_clear(P, plumbp_t_len, s->clearance_radius_m);
    if (plumbp_shows_zero(keep)) {
        /* a bare "0 m" would read as "nothing to keep clear": it is
         * "no spread computed", and says what it leaves out */
        sheet_para(d, bold, sheet_fmt(d, "Keep clear: no spread computed (%s %s); keep clear as "
                                         "local practice requires",
                                      keep, beside(d, plumbp_t_clear(S, plumbp_t_len,
                                                                     s->clearance_radius_m))));
        sheet_para(d, font, sheet_fmt(d, "The %zu samples give no distance to keep clear: every "
                                         "sample lands on the same point%s, so %s is not a safe "
                                         "distance; " PLUMBP_NO_SCATTER ". Give the uncertainty "
                                         "of an input that moves the impact point (the warning "
                                         "impact_point_fixed says which), or a scatter "
                                         "allowance, to size one.",
                                      z->samples, who, keep));
    } else {
        sheet_para(d, bold, sheet_fmt(d, "Keep clear: %s %s around the planned drop point", keep,
                                      beside(d, plumbp_t_clear(S, plumbp_t_len,
                                                               s->clearance_radius_m))));
        sheet_para(d, font,
                   sheet_fmt(d, "%s%% of impacts fall within this radius, taken as the upper "
                                "%s%% confidence bound from %zu samples%s%s%s%s%s.",
                             plumbp_trimmed(P, 100.0 * z->confidence, 2),
                             plumbp_trimmed(P, 100.0 * z->ci_level, 2), z->samples,
                             s->scatter_m > 0.0 ? ", plus a scatter allowance of " : "",
                             s->scatter_m > 0.0
                                 ? sheet_fmt(d, "%s %s", plumbp_t_len(P, s->scatter_m),
                                             beside(d, plumbp_t_len(S, s->scatter_m)))
                                 : "",
                             s->scatter_m > 0.0 ? " for bounce and roll" : "", who,
                             /* the text report's words when nothing was added */
                             s->scatter_m > 0.0 ? "" : "; " PLUMBP_NO_SCATTER));
    }
    double dx = s->mean_m[0] - s->release_m[0], dy = s->mean_m[1] - s->release_m[1];
    if (s->impact_point_fixed)
        sheet_para(d, font, "The uncertain inputs do not move the impact point: the radii are "
                            "one fall's drift.");
    /* a kit's landing figures are those of the item that sets the
     * clearance, which may not be the worst item named above: say whose */
    char lands[PLUMB_NAME + 80] = "Where things land";
    if (b->zone->n_items > 1)
        snprintf(lands, sizeof lands, "Where %s lands (the item that sets the clearance)",
                 b->zone->items[b->zone_item].name);
    const char *its = b->zone->n_items > 1 ? "its " : "";
    int said = 0; /* "Where things land" said by the circle's paragraph */
    if (s->landing_radius.hi_open) {
        /* no circle to draw: say so, what it leaves and what to do, in
         * the text report's words (plumbp_landing_open) */
        char open[1024], kept[FMT_LEN];
        const char *esc = sheet_fmt(d, "%s: no landing circle, %s", lands,
                                    plumbp_landing_open(z, open, sizeof open));
        /* the option kept whole: pango would break it after its "--" */
        const char *opt = strstr(esc, "--samples");
        if (opt)
            snprintf(kept, sizeof kept, "%.*s<span allow_breaks=\"false\">--samples</span>%s",
                     (int)(opt - esc), esc, opt + strlen("--samples"));
        sheet_para(d, font, opt ? kept : esc);
        said = 1;
    } else if (s->landing_circle_m > 0.0) {
        double lx = s->landing_centre_m[0] - s->release_m[0];
        double ly = s->landing_centre_m[1] - s->release_m[1];
        sheet_para(d, font,
                   sheet_fmt(d, "%s: %s%% of %simpacts within %s %s of their "
                                "centre, %s %s toward %s of the drop point (the landing circle, "
                                "upper %s%% bound%s).",
                             lands, plumbp_trimmed(P, 100.0 * z->confidence, 2), its,
                             plumbp_t_clear(P, plumbp_t_len, s->landing_circle_m),
                             beside(d, plumbp_t_clear(S, plumbp_t_len, s->landing_circle_m)),
                             plumbp_t_len(P, hypot(lx, ly)),
                             beside(d, plumbp_t_len(S, hypot(lx, ly))),
                             plumbp_t_bearing(P, atan2(lx, ly) * DEG_PER_RAD),
                             plumbp_trimmed(P, 100.0 * z->ci_level, 2),
                             s->scatter_m > 0.0 ? ", with the scatter allowance" : ""));
        said = 1;
    }
    if (s->semi_major_m == 0.0) {
        /* no spread, no ellipse and no bearing of its axis (the text
         * report's "none: every sample lands on the same point") */
        const char *off = plumbp_t_len(P, hypot(dx, dy));
        sheet_para(d, font,
                   plumbp_shows_zero(off)
                       ? sheet_fmt(d, "%s%severy sample lands on the same point, the drop "
                                      "point (no 95%% ellipse).", said ? "" : lands,
                                 said ? "" : ": ")
                       : sheet_fmt(d, "%s%severy sample lands on the same point, %s %s toward "
                                      "%s of the drop point (no 95%% ellipse).",
                                   said ? "" : lands, said ? "" : ": ", off,
                                   beside(d, plumbp_t_len(S, hypot(dx, dy))),
                                   plumbp_t_bearing(P, atan2(dx, dy) * DEG_PER_RAD)));
    } else
        /* each length with the other system's beside it, as every other
         * length of this section (beside) */
        sheet_para(d, font,
                   sheet_fmt(d, "%s%s95%% of %simpacts within an ellipse of semi-axes %s %s "
                                "and %s %s (major axis toward %s) around the mean impact point, "
                                "%s %s toward %s of the drop point.",
                             said ? "" : lands, said ? "" : ": ", its,
                             plumbp_t_zone_len(P, s->semi_major_m),
                             beside(d, plumbp_t_zone_len(S, s->semi_major_m)),
                             plumbp_t_zone_len(P, s->semi_minor_m),
                             beside(d, plumbp_t_zone_len(S, s->semi_minor_m)),
                             plumbp_t_bearing(P, s->bearing_deg), plumbp_t_len(P, hypot(dx, dy)),
                             beside(d, plumbp_t_len(S, hypot(dx, dy))),
                             plumbp_t_bearing(P, atan2(dx, dy) * DEG_PER_RAD)));
    if (z->has_target) {
        /* the point, then the same point in the other system beside it,
         * as every other length of this section */
        char other[FMT_LEN];
        snprintf(other, sizeof other, "%s",
                 beside(d, sheet_fmt(d, "%s, %s",
                                     plumbp_t_offset(S, z->target_m[0], "east", "west"),
                                     plumbp_t_offset(S, z->target_m[1], "north", "south"))));
        sheet_para(d, font,
                   sheet_fmt(d, "Released to land on the target at %s, %s %s: keep clear %s %s "
                                "around the target.",
                             plumbp_t_offset(P, z->target_m[0], "east", "west"),
                             plumbp_t_offset(P, z->target_m[1], "north", "south"), other,
                             plumbp_t_clear(P, plumbp_t_len, z->at_target.clearance_radius_m),
                             beside(d, plumbp_t_clear(S, plumbp_t_len, z->at_target.clearance_radius_m))));
    }
}

/* The verdict table's columns, fractions of the width, and its header
 * row: drawn again at the top of every page the table goes on to, its
 * first cell marked "(continued)" there. The energy and the limit each on
 * two lines, the figure in the other unit system under the sheet's own;
 * the verdict as wide as its two lines, "exceeds (nominal)" and, whole,
 * "N % of samples above" (about 112 pt for a wide share, "0.0012 %", in
 * 8-pt DejaVu Sans; the column is 117 pt on A4). */
static const double verdict_cx[5] = {0.0, 0.38, 0.53, 0.68, 0.77};

static void verdict_header(sheet_doc *d, const char *bold, int continued)
{
    static const char *const head[5] = {"Criterion", "Energy", "Limit", "Ratio", "Verdict"};
    double w = sheet_width(d);
    for (int c = 0; c < 5; c++)
        sheet_text(d, d->left + verdict_cx[c] * w, d->y, 0.0, bold,
                   c == 0 && continued ? "Criterion (continued)" : head[c], 1);
    d->y += SHEET_BODY * 1.5;
}

/* The zone's exceedance of criterion c for item (an index of the fall
 * report, as of the zone's items): NULL when there is none. */
static const plumb_zone_exceedance *zone_share(const plumb_brief *b, size_t item,
                                               const plumb_criterion *c)
{
    if (!b->zone || item >= b->zone->n_items)
        return NULL;
    const plumb_zone_stats *z = &b->zone->items[item].result->zone;
    for (size_t i = 0; i < z->n_exceedance; i++)
        if (z->exceedance[i].criterion == c ||
            strcmp(z->exceedance[i].criterion->id, c->id) == 0)
            return &z->exceedance[i];
    return NULL;
}

static void verdict_table(sheet_doc *d, const plumb_brief *b, const plumb_item_report *it)
{
    char font[64], bold[64], small[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_BODY);
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, SHEET_BODY);
    snprintf(small, sizeof small, "%s %.1f", SHEET_FONT, SHEET_SMALL);
    writer *P = sheet_primary(d);
    double w = sheet_width(d);
    const double *cx = verdict_cx;
    sheet_need(d, 30.0);
    verdict_header(d, bold, 0);
    for (size_t k = 0; k < it->n_verdicts; k++) {
        const plumb_verdict *v = &it->verdicts[k];
        /* the id in one piece: "[z89-" / "type2-30j]" cannot be searched;
         * kept out of the ring, which a new page's footer goes round */
        char name[FMT_LEN], energy[FMT_LEN];
        snprintf(name, sizeof name, "%s",
                 sheet_fmt(d, "\x02%s %s%s", sheet_esc(d, v->criterion->name),
                           sheet_id(d, font, v->criterion->id, cx[1] * w - 6.0),
                           v->criterion->kind == PLUMB_CRIT_HELMET_TEST
                               ? " (a helmet test, not a safe limit)" : ""));
        /* the energy and the limit with the figures that show which side
         * of it the energy is (plumbp_energy_sig; README.md "Criteria") */
        int esig = plumbp_energy_sig(it->verdicts, it->n_verdicts, TEXT_SIG);
        snprintf(energy, sizeof energy, "%s",
                 sheet_fmt(d, "%s", plumbp_t_energy_at(P, v->energy_j, esig)));
        /* the planned fall's verdict is one fall: beside it, the share of
         * the zone's samples above the same limit, so that a nominal
         * "within" is never the only verdict read */
        const plumb_zone_exceedance *x = zone_share(b, b->order[0], v->criterion);
        char share[FMT_LEN] = "", verdict[FMT_LEN], limit[FMT_LEN];
        if (x)
            snprintf(share, sizeof share, "%s",
                     sheet_fmt(d, "%s of samples above", plumbp_t_pct(P, x->probability)));
        /* "(nominal)" beside the verdict it qualifies, in the share's size */
        snprintf(verdict, sizeof verdict, "%s",
                 sheet_fmt(d, "\x02%s%s%s%s", v->exceeds ? "<b>exceeds</b>" : "within",
                           x ? " <span size=\"" : "",
                           x ? sheet_fmt(d, "%d", (int)(SHEET_SMALL * PANGO_SCALE)) : "",
                           x ? "\">(nominal)</span>" : ""));
        snprintf(limit, sizeof limit, "%s",
                 sheet_fmt(d, "%s", plumbp_t_limit_energy_at(
                                       P, v->criterion->energy_limit_j,
                                       plumbp_limit_sig(v, esig, TEXT_SIG))));
        double vw = (1.0 - cx[4]) * w;
        double h = sheet_text(d, d->left, d->y, cx[1] * w - 6.0, font, name, 0);
        double h2 = sheet_text(d, d->left + cx[1] * w, d->y, (cx[2] - cx[1]) * w - 4.0, font,
                               energy, 0);
        double h3 = sheet_text(d, d->left + cx[2] * w, d->y, (cx[3] - cx[2]) * w - 4.0, font,
                               limit, 0);
        double hv = sheet_text(d, d->left + cx[4] * w, d->y, vw, font, verdict, 0);
        double hs = share[0] ? sheet_text(d, d->left + cx[4] * w, d->y, vw, small, share, 0) : 0.0;
        h = fmax(h, fmax(h2, h3));
        if (hv + hs > h)
            h = hv + hs;
        if (d->y + h > d->bottom) {
            sheet_new_page(d);
            verdict_header(d, bold, 1);
        }
        sheet_text(d, d->left, d->y, cx[1] * w - 6.0, font, name, 1);
        sheet_text(d, d->left + cx[1] * w, d->y, (cx[2] - cx[1]) * w - 4.0, font, energy, 1);
        sheet_text(d, d->left + cx[2] * w, d->y, (cx[3] - cx[2]) * w - 4.0, font, limit, 1);
        sheet_text(d, d->left + cx[3] * w, d->y, 0.0, font,
                   sheet_fmt(d, "%s", plumbp_t_ratio(P, v)), 1);
        sheet_text(d, d->left + cx[4] * w, d->y, vw, font, verdict, 1);
        if (share[0])
            sheet_text(d, d->left + cx[4] * w, d->y + hv, vw, small, share, 1);
        d->y += h + 2.0;
    }
}

/* The words of a criterion's status, as the text report gives them
 * (plumbp_status_note), and for a figure seen in the source too, so that
 * every criterion on the sheet says how sure its figure is. */
static const char *status_words(const plumb_criterion *c)
{
    const char *note = plumbp_status_note(c);
    if (note[0])
        return note;
    return strcmp(c->status, "seen") == 0 ? "figure seen in the source" : "status not given";
}

/* sheet_doc.h */
int sheet_limit_sig(const plumb_brief *b, const plumb_criterion *c)
{
    /* every item is judged against the profile's criteria in one order,
     * as the text report reads them (plumbp_report_limit_sig's k) */
    const plumb_item_report *first = b->fall && b->fall->n_items ? &b->fall->items[0] : NULL;
    for (size_t k = 0; first && k < first->n_verdicts; k++)
        if (first->verdicts[k].criterion == c || strcmp(first->verdicts[k].criterion->id, c->id) == 0)
            return plumbp_report_limit_sig(b->fall, k, TEXT_SIG);
    return TEXT_SIG;
}

/* Every criterion used, keyed C1..Cn (the inventory's ratio columns),
 * with what it applies to, its source in full as its file gives it and
 * the status of its figure: what the adviser who signs the sheet cites. */
static void criteria_sources(sheet_doc *d, const plumb_brief *b)
{
    if (b->n_criteria == 0)
        return;
    char font[64], bold[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 9.0);
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, SHEET_BODY);
    writer *P = sheet_primary(d);
    double key_w = 22.0, w = sheet_width(d) - key_w;
    d->y += GAP / 2.0;
    double first = 0.0;
    for (size_t k = 0; k < b->n_criteria; k++) {
        const plumb_criterion *c = b->criteria[k];
        char quoted[PLUMB_CRIT_TEXT * 2]; /* the test method's SI figures, US beside them */
        const char *body = sheet_fmt(
            d, "\x02<b>%s</b> %s: limit %s%s; applies to %s; source: %s (%s).",
            sheet_esc(d, c->name), sheet_id(d, font, c->id, w),
            sheet_fmt(d, "%s", plumbp_t_limit_energy_at(P, c->energy_limit_j, sheet_limit_sig(b, c))),
            c->kind == PLUMB_CRIT_HELMET_TEST ? " (a helmet test, not a safe limit)" : "",
            c->applies_to[0] ? sheet_esc(d, c->applies_to) : "not given",
            sheet_esc(d, plumbp_t_source(P, c, quoted, sizeof quoted)),
            sheet_esc(d, status_words(c)));
        double h = sheet_text(d, d->left + key_w, d->y, w, font, body, 0);
        if (k == 0) { /* the title kept with the first entry */
            first = sheet_text(d, d->left, d->y, sheet_width(d), bold, "Criteria and their sources",
                               0) + 2.0;
            sheet_need(d, first + h);
            d->y += sheet_text(d, d->left, d->y, sheet_width(d), bold,
                               "Criteria and their sources", 1) + 2.0;
        } else if (d->y + h > d->bottom) {
            /* the list goes on: its title again, marked, over the rest */
            char keep[FMT_LEN];
            snprintf(keep, sizeof keep, "%s", body); /* the new page's footer uses the ring */
            sheet_new_page(d);
            d->y += sheet_text(d, d->left, d->y, sheet_width(d), bold,
                               "Criteria and their sources (continued)", 1) + 2.0;
            body = sheet_fmt(d, "\x02%s", keep);
        }
        sheet_text(d, d->left, d->y, key_w, font, sheet_fmt(d, "C%zu", k + 1), 1);
        sheet_text(d, d->left + key_w, d->y, w, font, body, 1);
        d->y += h + 2.0;
    }
}


/* The "Uncertain inputs" block of a zone's text report as a list: each
 * key (in mono) with its distribution, the report's continuation lines
 * joined, so that the sheet wraps it to its own width. */
static void input_list(sheet_doc *d, const char *font, const char *text)
{
    const char *a = strstr(text, "\nUncertain inputs\n");
    if (!a)
        return;
    a += strlen("\nUncertain inputs\n");
    const char *end = strstr(a, "\n\n");
    if (!end)
        end = a + strlen(a);
    char entry[FMT_LEN] = "";
    size_t n = 0;
    while (a < end) {
        const char *nl = memchr(a, '\n', (size_t)(end - a));
        size_t len = nl ? (size_t)(nl - a) : (size_t)(end - a);
        size_t ind = 0;
        while (ind < len && a[ind] == ' ')
            ind++;
        /* a new entry is indented two, its continuation lines further */
        if (ind <= 2 && n > 0) {
            sheet_para(d, font, sheet_fmt(d, "\x02\u2022 %s", entry));
            n = 0;
        }
        const char *t = a + ind, *te = a + len;
        if (ind <= 2) {
            const char *k = t;
            while (t < te && *t != ' ')
                t++;
            const char *r = t;
            while (r < te && *r == ' ')
                r++;
            n = (size_t)snprintf(entry, sizeof entry, "<tt>%s</tt> %s",
                                 sheet_esc(d, sheet_fmt(d, "%.*s", (int)(t - k), k)),
                                 sheet_fmt(d, "%.*s", (int)(te - r), r));
        } else if (n > 0 && n < sizeof entry) {
            n += (size_t)snprintf(entry + n, sizeof entry - n, " %s",
                                  sheet_fmt(d, "%.*s", (int)(te - t), t));
        }
        a += len + (nl ? 1 : 0);
    }
    if (n > 0)
        sheet_para(d, font, sheet_fmt(d, "\x02\u2022 %s", entry));
}

/* 1 when a zone's warnings, shown, include text. */
static int zone_warning_has(writer *P, const plumb_zone_result *r, const char *text)
{
    for (size_t i = 0; i < r->n_warnings; i++) {
        char t[PLUMB_ZONE_WARNING * 2];
        if (strcmp(plumbp_t_warning(P, r->warnings[i], t, sizeof t), text) == 0)
            return 1;
    }
    return 0;
}

/* 1 when the fall of the kit's item `item` gives the warning text too:
 * section 7's list of warnings says it. */
static int fall_warning_has(writer *P, const plumb_brief *b, size_t item, const char *text)
{
    if (item >= b->fall->n_items)
        return 0;
    const plumb_item_report *it = &b->fall->items[item];
    for (size_t i = 0; i < it->n_warnings; i++) {
        char t[PLUMB_WARNING * 2];
        if (strcmp(plumbp_t_warning(P, it->warnings[i], t, sizeof t), text) == 0)
            return 1;
    }
    return 0;
}

/* 1 when the zone's warning i of warned[k] (shown as text) was said here
 * already (an earlier
 * warning of the same words, of this item or of an earlier one, that
 * was said here). */
static int zone_warning_said(writer *P, const plumb_brief *b, const plumb_zone_item *const *warned,
                             const size_t *idx, size_t k, size_t i, const char *text)
{
    for (size_t k0 = 0; k0 <= k; k0++) {
        const plumb_zone_result *r = warned[k0]->result;
        for (size_t i0 = 0; i0 < (k0 < k ? r->n_warnings : i); i0++) {
            char t[PLUMB_ZONE_WARNING * 2];
            if (strcmp(plumbp_t_warning(P, r->warnings[i0], t, sizeof t), text) == 0 &&
                !fall_warning_has(P, b, idx[k0], text))
                return 1;
        }
    }
    return 0;
}

/* "Spread over N samples": what the zone's samples say beside the planned
 * fall's figures above, for the item those are of (a kit's worst). The
 * energy at 50, 95 and 99 % (the zone's own figures,
 * plumbp_t_zone_energy), the share of samples above each criterion's
 * limit with its upper bound, the zone's warnings in the text report's
 * words (plumbp_t_warning; of a kit, the worst item's and the one's that
 * sets the clearance, each named) and the uncertain inputs the radius
 * rests on, as `plumb zone` echoes them (its text report of the item that
 * sets the clearance, read back). Nothing when there is no zone. */
static plumb_status spread_block(sheet_doc *d, const plumb_brief *b, plumb_diag *diag)
{
    if (!b->zone)
        return PLUMB_OK;
    char font[64], bold[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 9.0);
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, SHEET_BODY);
    writer *P = sheet_primary(d);
    int kit = b->zone->n_items > 1;
    size_t worst = b->order[0] < b->zone->n_items ? b->order[0] : b->zone_item;
    const plumb_zone_item *zi = &b->zone->items[b->zone_item], *zw = &b->zone->items[worst];
    const plumb_zone_result *r = zw->result;
    const plumb_zone_stats *z = &r->zone;
    d->y += GAP / 2.0;
    sheet_need(d, 5.0 * SHEET_BODY * 1.4);
    sheet_para(d, bold, kit ? sheet_fmt(d, "Spread over %zu samples of %s, the item judged above",
                                        z->samples, zw->name)
                            : sheet_fmt(d, "Spread over %zu samples", z->samples));
    const plumb_zone_quantile *e = z->energy;
    sheet_para(d, font,
               sheet_fmt(d, "Impact energy: %s at %s, %s at %s, %s at %s of samples; largest %s. "
                            "The figures above are the planned fall's.",
                         plumbp_t_zone_energy(P, e[0].value), plumbp_t_pct(P, e[0].p),
                         plumbp_t_zone_energy(P, e[1].value), plumbp_t_pct(P, e[1].p),
                         plumbp_t_zone_energy(P, e[2].value), plumbp_t_pct(P, e[2].p),
                         plumbp_t_zone_energy(P, z->energy_max_j)));
    for (size_t i = 0; i < z->n_exceedance; i++) {
        const plumb_zone_exceedance *x = &z->exceedance[i];
        const plumb_criterion *c = x->criterion;
        sheet_para(d, font,
                   sheet_fmt(d, "\x02\u2022 %s %s, limit %s: <b>%s of samples above</b> (%zu of "
                                "%zu; up to %s, upper %s bound).",
                             sheet_esc(d, c->name), sheet_id(d, font, c->id, sheet_width(d)),
                             sheet_esc(d, sheet_fmt(d, "%s", plumbp_t_limit_energy(P, c->energy_limit_j))),
                             sheet_esc(d, plumbp_t_pct(P, x->probability)), x->count, z->samples,
                             sheet_esc(d, plumbp_t_pct(P, x->hi)),
                             sheet_esc(d, plumbp_t_pct(P, r->ci_level))));
    }
    /* each warning once, with the items it concerns ("sentence. (item,
     * item)", as the text reports say it); one the fall of that item
     * gives too is left to section 7's list, which says it once for all */
    const plumb_zone_item *warned[2] = {zw, zi};
    size_t n_warned = zi != zw ? 2 : 1, idx[2] = {worst, b->zone_item};
    int heading = 0, in_falls = 0;
    for (size_t k = 0; k < n_warned; k++) {
        const plumb_zone_result *wr = warned[k]->result;
        for (size_t i = 0; i < wr->n_warnings; i++) {
            char text[PLUMB_ZONE_WARNING * 2], who[PLUMB_NAME * 2 + 8] = "";
            plumbp_t_warning(P, wr->warnings[i], text, sizeof text);
            if (fall_warning_has(P, b, idx[k], text)) {
                in_falls = 1;
                continue;
            }
            if (zone_warning_said(P, b, warned, idx, k, i, text))
                continue;
            /* named in the profile's order, as the text reports name them */
            for (size_t j = 0; kit && j < n_warned; j++) {
                size_t k2 = n_warned == 2 && idx[0] > idx[1] ? 1 - j : j;
                if (zone_warning_has(P, warned[k2]->result, text) &&
                    !fall_warning_has(P, b, idx[k2], text))
                    snprintf(who + strlen(who), sizeof who - strlen(who), "%s%s",
                             who[0] ? ", " : "", warned[k2]->name);
            }
            if (!heading) {
                sheet_need(d, 3.0 * SHEET_BODY * 1.4);
                sheet_para(d, bold, "The zone's warnings");
                heading = 1;
            }
            sheet_para(d, font, kit ? sheet_fmt(d, "\u2022 %s (%s)", text, who)
                                    : sheet_fmt(d, "\u2022 %s", text));
        }
    }
    if (in_falls) {
        if (!heading) {
            sheet_need(d, 3.0 * SHEET_BODY * 1.4);
            sheet_para(d, bold, "The zone's warnings");
        }
        sheet_para(d, font, sheet_fmt(d, "\u2022 %s the fall%s warnings too: section 7 lists "
                                         "them once%s.", heading ? "The others are" : "They are",
                                      kit ? "s'" : "'s",
                                      kit ? ", with the items they concern" : ""));
    }
    /* the inputs as plumb zone echoes them: its text report of this item */
    plumb_zone_report one = *b->zone;
    one.inventory = 0;
    one.n_items = 1;
    one.items = zi;
    one.kit_item = one.kit_landing_item = 0;
    char *buf = NULL;
    size_t len = 0;
    FILE *mem = open_memstream(&buf, &len);
    if (!mem)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the sheet");
    plumb_report_options ro = {PLUMB_FORMAT_TEXT, d->opt->units, d->opt->version};
    plumb_status st = plumb_report_zone(mem, &ro, &one, diag);
    if (fclose(mem) != 0 && st == PLUMB_OK)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the sheet");
    if (st == PLUMB_OK) {
        sheet_need(d, 3.0 * SHEET_BODY * 1.4);
        sheet_para(d, bold, kit ? sheet_fmt(d, "The uncertain inputs the clearance radius "
                                               "rests on (of %s, the item that sets it)", zi->name)
                                : "The uncertain inputs the clearance radius rests on");
        input_list(d, font, buf);
    }
    free(buf);
    return st;
}

plumb_status sheet_section_answer(sheet_doc *d, const plumb_brief *b, plumb_diag *diag)
{
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_BODY);
    writer *P = sheet_primary(d), *S = sheet_secondary(d);
    const plumb_item_report *it = &b->fall->items[b->order[0]];
    const plumb_fall_result *r = &it->result;
    sheet_heading(d, "The answer", 120.0);
    if (b->fall->n_items > 1)
        sheet_para(d, font, sheet_fmt(d, "For the worst of %zu items, %s (every item is in "
                                         "section 6).", b->fall->n_items, it->spec->name));
    answer_line(d, "Impact speed", sheet_fmt(d, "%s %s", plumbp_t_speed(P, r->speed_m_s),
                                             beside(d, plumbp_t_speed(S, r->speed_m_s))));
    answer_line(d, "Impact energy",
                sheet_fmt(d, "%s", plumbp_t_energy_at(P, r->energy_j,
                                                      plumbp_energy_sig(it->verdicts, it->n_verdicts,
                                                                        TEXT_SIG))));
    answer_line(d, "Time of fall", sheet_fmt(d, "%s s", num(P, r->time_s, TEXT_SIG)));
    answer_line(d, "Drift", r->drift_m < DRIFT_SHOWN_M
                                ? sheet_fmt(d, "%s: lands below the release point",
                                            plumbp_t_drift(P, r->drift_m, 1))
                                : sheet_fmt(d, "%s %s toward %s", plumbp_t_drift(P, r->drift_m, 1),
                                            beside(d, plumbp_t_len(S, r->drift_m)),
                                            plumbp_t_bearing(P, r->bearing_deg)));
    d->y += GAP / 2.0;
    zone_answer(d, b);
    d->y += GAP / 2.0;
    if (it->n_verdicts > 0)
        verdict_table(d, b, it);
    else
        sheet_para(d, font, "No criterion was judged.");
    plumb_status st = spread_block(d, b, diag);
    if (st != PLUMB_OK)
        return st;
    criteria_sources(d, b);
    if (b->fall->n_items == 1) /* a kit's are in its table's section */
        sheet_descent_figures(d, b);
    return PLUMB_OK;
}

/* ---- 7. inputs and assumptions; 8. cautions ---------------------------------------- */

/* The text report's block from `from` up to `to`, as lines in mono. */
static void text_block(sheet_doc *d, const char *text, const char *from, const char *to)
{
    const char *a = strstr(text, from);
    if (!a)
        return;
    a += strlen(from);
    const char *z = strstr(a, to);
    if (!z)
        z = a + strlen(a);
    char mono[64];
    snprintf(mono, sizeof mono, "%s %.1f", SHEET_MONO, 8.0);
    while (a < z) {
        const char *nl = memchr(a, '\n', (size_t)(z - a));
        size_t len = nl ? (size_t)(nl - a) : (size_t)(z - a);
        char line[FMT_LEN];
        snprintf(line, sizeof line, "%.*s", (int)(len < sizeof line ? len : sizeof line - 1), a);
        const char *m = sheet_fmt(d, "%s", line[0] ? line : " ");
        double h = sheet_text(d, d->left, d->y, sheet_width(d), mono, m, 0);
        sheet_need(d, h);
        sheet_text(d, d->left, d->y, sheet_width(d), mono, m, 1);
        d->y += h;
        a += len + (nl ? 1 : 0);
    }
}

plumb_status sheet_section_inputs(sheet_doc *d, const plumb_brief *b, plumb_diag *diag)
{
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_BODY);
    sheet_heading(d, "Inputs as understood, and the model's assumptions", 80.0);
    char *buf = NULL;
    size_t len = 0;
    FILE *mem = open_memstream(&buf, &len);
    if (!mem)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the sheet");
    plumb_report_options ro = {PLUMB_FORMAT_TEXT, d->opt->units, d->opt->version};
    plumb_status st = plumb_report_fall(mem, &ro, b->fall, diag);
    if (fclose(mem) != 0 && st == PLUMB_OK)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the sheet");
    if (st == PLUMB_OK) {
        text_block(d, buf, "\nInputs as understood\n", "\nProfile  ");
        sheet_descent_inputs(d, b);
        /* each title kept with its first lines, never alone at a page's foot */
        if (strstr(buf, "\nWarnings\n")) {
            d->y += GAP;
            sheet_need(d, 3.0 * SHEET_BODY * 1.5);
            sheet_para(d, sheet_fmt(d, "%s Bold %.1f", SHEET_FONT, SHEET_BODY), "Warnings");
            text_block(d, buf, "\nWarnings\n", "\nInputs as understood\n");
        }
        d->y += GAP;
        sheet_need(d, 4.0 * SHEET_BODY * 1.5);
        sheet_para(d, sheet_fmt(d, "%s Bold %.1f", SHEET_FONT, SHEET_BODY), "The model assumes");
        for (size_t i = 0; i < sizeof assumptions / sizeof assumptions[0]; i++)
            sheet_para(d, font, sheet_fmt(d, "\u2022 %s", assumptions[i]));
    }
    free(buf);
    return st;
}

void sheet_section_cautions(sheet_doc *d)
{
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, SHEET_BODY);
    size_t n;
    const char *const *c = plumb_cautions(&n);
    /* kept whole on one page: read together, and never a last page that
     * holds only the end of the list under "(continued)" */
    double keep = 0.0;
    for (size_t i = 0; i < n; i++)
        keep += sheet_text(d, d->left, d->y, sheet_width(d), font,
                           sheet_fmt(d, "\u2022 %s", c[i]), 0) + GAP / 2.0;
    sheet_heading(d, "Cautions", keep);
    for (size_t i = 0; i < n; i++)
        sheet_para(d, font, sheet_fmt(d, "\u2022 %s", c[i]));
}

/* ---- the pictures' sections --------------------------------------------------------- */

/* Under the energy plot of a kit with more items than it draws: which are. */
static void sheet_plotted_note(sheet_doc *d, const plumb_brief *b)
{
    if (b->fall->n_items <= b->n_plots)
        return;
    sheet_para(d, sheet_fmt(d, "%s %.1f", SHEET_FONT, SHEET_BODY),
               sheet_fmt(d, "The %zu worst of the %zu items are drawn (highest ratio to the "
                            "strictest criterion first); \u201cEvery item, worst first\u201d "
                            "lists them all.", b->n_plots, b->fall->n_items));
}

void sheet_section_plots(sheet_doc *d, const plumb_brief *b)
{
    double w = sheet_width(d);
    double note = b->fall->n_items > b->n_plots ? 30.0 : 0.0;
    sheet_heading(d, "Side view of the fall", 220.0);
    d->y += sheet_side_view(d, b, d->left, d->y, w, 215.0);
    /* taller with more criteria, so that their labels find room beside
     * their lines and clear of the curves (it still fits a letter page
     * under the side view) */
    double h = 250.0 + 14.0 * (b->n_criteria > 3 ? (double)(b->n_criteria - 3) : 0.0);
    if (h > 370.0)
        h = 370.0;
    /* and room for a key of the limits' labels, two to a row, when they
     * do not fit beside their lines */
    double key = b->n_criteria > 1 ? 11.5 * (double)((b->n_criteria + 1) / 2) : 0.0;
    sheet_heading(d, "Impact energy against drop height", h + 10.0 + note + key);
    sheet_plotted_note(d, b);
    d->y += sheet_energy_plot(d, b, d->left, d->y, w, h);
}

/* The plan view from whatever the zone gives: circles around the drop
 * point and the target, the 95 % ellipse as a polygon, the impact points
 * binned into a density grid. */

void sheet_section_plan(sheet_doc *d, const plumb_brief *b)
{
    char font[64], body[64];
    snprintf(font, sizeof font, "%s Bold %.1f", SHEET_FONT, 11.0);
    snprintf(body, sizeof body, "%s %.1f", SHEET_FONT, SHEET_BODY);
    /* what the zone could not bound is not drawn, and the legend says why
     * (the text report's words, PLUMBP_OPEN_BOUND) */
    char missing[256] = "";
    if (b->zone) {
        const plumb_zone_stats *zs = &b->zone->items[b->zone_item].result->zone;
        int circle = zs->landing_radius.hi_open, region = zs->landing.open;
        if (circle || region)
            snprintf(missing, sizeof missing, "%s%s%s",
                     circle ? "The landing circle is not drawn, " PLUMBP_OPEN_BOUND ". " : "",
                     region ? "The landing region is not drawn, " PLUMBP_OPEN_BOUND ". " : "",
                     circle ? "Section 2 says what that leaves for the exclusion zone and what "
                              "to do." : "");
    }
    double note = missing[0] ? sheet_text(d, d->left, d->y, sheet_width(d), body,
                                          sheet_esc(d, missing), 0) + GAP / 2.0 : 0.0;
    sheet_heading(d, "Plan view of the clearance zone", b->zone ? 330.0 + note : 20.0);
    if (!b->zone) {
        sheet_para(d, font, sheet_esc(d, b->no_zone));
        return;
    }
    writer *P = sheet_primary(d);
    const plumb_zone_result *z = b->zone->items[b->zone_item].result;
    const plumb_zone_stats *s = &z->zone;
    const plumb_fall_spec *spec = b->fall->items[b->zone_item].spec;
    if (b->zone->n_items > 1)
        sheet_para(d, sheet_fmt(d, "%s %.1f", SHEET_FONT, SHEET_BODY),
                   sheet_fmt(d, "The zone of %s, the item with the largest clearance radius; "
                                "section %d names every item.", b->zone->items[b->zone_item].name,
                             d->section + 1));
    if (missing[0])
        sheet_para(d, body, sheet_esc(d, missing));
    sheet_plan pv;
    memset(&pv, 0, sizeof pv);
    pv.drop_m[0] = s->release_m[0];
    pv.drop_m[1] = s->release_m[1];
    double we, wn;
    plumb_wind_at(&spec->wind, spec->release_m[2], &we, &wn);
    plumbp_wind_polar(we, wn, &pv.wind_m_s, &pv.wind_from_deg);
    sheet_circle *c = &pv.circles[pv.n_circles++];
    *c = (sheet_circle){{s->centre_m[0], s->centre_m[1]}, s->clearance_radius_m, SHEET_SOLID, 1.8,
                        ""};
    snprintf(c->label, sizeof c->label, "heavy solid circle: keep clear, %s around the drop point",
             sheet_fmt(d, "%s", plumbp_t_clear(P, plumbp_t_len, s->clearance_radius_m)));
    /* the 90 % radius around the drop point */
    c = &pv.circles[pv.n_circles++];
    *c = (sheet_circle){{s->centre_m[0], s->centre_m[1]}, s->radius[1].value, SHEET_DASHED, 0.8,
                        ""};
    snprintf(c->label, sizeof c->label, "dashed circle: %s%% of impacts within %s of the drop point",
             sheet_fmt(d, "%s", plumbp_trimmed(P, 100.0 * s->radius[1].p, 2)),
             sheet_fmt(d, "%s", plumbp_t_clear(P, plumbp_t_len, s->radius[1].value)));
    /* where things land: the landing circle around the impacts' centre */
    if (s->landing_circle_m > 0.0) {
        c = &pv.circles[pv.n_circles++];
        *c = (sheet_circle){{s->landing_centre_m[0], s->landing_centre_m[1]}, s->landing_circle_m,
                            SHEET_SOLID, 0.8, ""};
        snprintf(c->label, sizeof c->label,
                 "thin solid circle: where things land, %s%% of impacts within %s of their centre",
                 sheet_fmt(d, "%s", plumbp_trimmed(P, 100.0 * z->confidence, 2)),
                 sheet_fmt(d, "%s", plumbp_t_clear(P, plumbp_t_len, s->landing_circle_m)));
    }
    if (z->has_target) {
        pv.has_target = 1;
        pv.target_m[0] = z->target_m[0];
        pv.target_m[1] = z->target_m[1];
        pv.has_aim = 1;
        pv.aim_m[0] = z->aim_release_m[0];
        pv.aim_m[1] = z->aim_release_m[1];
        c = &pv.circles[pv.n_circles++];
        *c = (sheet_circle){{z->target_m[0], z->target_m[1]}, z->at_target.clearance_radius_m,
                            SHEET_DASHDOT, 1.2, ""};
        snprintf(c->label, sizeof c->label,
                 "dash-dot circle: keep clear, %s around the target when released to land on it",
                 sheet_fmt(d, "%s", plumbp_t_clear(P, plumbp_t_len, z->at_target.clearance_radius_m)));
    }
    /* the landing region: the polygon holding the zone's share of the
     * impacts, with the scatter allowance as a buffer, one entry per ring */
    const plumb_region_polygon *rg = &s->landing.buffered;
    for (size_t r = 0; !s->landing.open && r < rg->n_rings && pv.n_polygons < SHEET_PLAN_POLYGONS;
         r++) {
        sheet_polygon *pg = &pv.polygons[pv.n_polygons++];
        *pg = (sheet_polygon){rg->ring_count[r], &rg->vertex_m[rg->ring_first[r]][0], SHEET_DOTTED,
                              1.3, ""};
        if (r == 0)
            snprintf(pg->label, sizeof pg->label,
                     "dotted outline: the landing region, %s%% of impacts inside (%s%s)",
                     sheet_fmt(d, "%s", plumbp_trimmed(P, 100.0 * s->landing.p, 2)),
                     sheet_fmt(d, "%s", plumbp_t_region_area(P, rg->area_m2)),
                     /* the text report's words for the buffered area */
                     s->scatter_m > 0.0 ? " with the scatter allowance as a buffer"
                                        : ", no scatter allowance added");
    }
    pv.n_points = b->n_points[0];
    pv.points_m = b->points_m[0];
    snprintf(pv.points_label, sizeof pv.points_label,
             "grey shading: where the first %zu of %zu sampled impacts fell, darker where more did",
             b->n_points[0], z->samples);
    d->y += sheet_plan_view(d, &pv, d->left, d->y, sheet_width(d), 300.0);
}

