/*
 * zone_text.c - the text report of a Monte Carlo clearance zone: the
 * inputs echoed, the radii, clearance, cloud, attitudes, energies,
 * exceedances, landing region and rules of each item, its warnings, and
 * the cautions (conventions of report_zone.c and include/plumb/report.h).
 */
#include <limits.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <jansson.h>

#include "plumb/constants.h"
#include "plumb/report.h"
#include "plumb/dispersion.h"
#include "plumb/glide.h"
#include "core/internal.h"
#include "report/jsonout.h"
#include "report/format.h"
#include "report/common.h"
#include "report/zone_map.h"
#include "report/report_zone_int.h"

/* ---- writer ---------------------------------------------------------------- */






/* Inputs and percents without trailing zeros; computed figures with them. */
static const char *trim(writer *w, double x, int sig, int dec)
{
    return plumbp_trim_to(w, x, sig, dec, 1);
}

static const char *fig(writer *w, double x, int dec)
{
    return plumbp_trim_to(w, x, TEXT_SIG, dec, 0);
}

/* Decimals figures are shown to: a millimetre, input digits (energies and
 * percents: plumbp_t_zone_energy, plumbp_t_pct). */
#define LEN_DEC 3
#define INPUT_DEC 9

/* Lengths and energies of a zone keep TEXT_SIG figures but no digit below
 * a millimetre or a millijoule (a spread of samples is not known finer);
 * the fall reports' plumbp_t_len and plumbp_t_energy keep all TEXT_SIG
 * figures. Speeds are the shared plumbp_t_speed. */
static const char *t_len(writer *w, double m)
{
    return plumbp_t_zone_len(w, m);
}

/* A keep-clear distance (a radius, a landing circle, a rule's radius, a
 * glide): rounded up at its last digit shown, so that no distance to keep
 * clear prints below the figure computed. */
static const char *t_clear(writer *w, double m)
{
    return plumbp_t_clear(w, t_len, m);
}

/* A keep-clear sum as printed, "total = bound + scatter" (a clearance
 * radius, a landing circle): the figures of the total (TEXT_SIG, at most
 * LEN_DEC decimals, at least a whole unit) fix one decimal place, each
 * part is rounded up at it and the total is the sum of the printed parts.
 * So the line adds up as printed, and neither the total nor a part is
 * below the figure it stands for (the total may be one unit of its last
 * digit above the true total rounded up). The kit's table shows the same
 * total. */
typedef struct clear_sum {
    const char *total, *bound, *scatter; /* each with its unit */
} clear_sum;

static clear_sum t_clear_sum(writer *w, double total_m, double bound_m, double scatter_m)
{
    /* the total, bound + scatter as the result defines it, is checked as
     * every figure is, though the parts are what is printed */
    if (!plumbp_finite(total_m))
        w->bad = 1;
    double b = len_shown(w, bound_m), sc = len_shown(w, scatter_m), t = b + sc;
    int d = LEN_DEC;
    if (t > 0.0 && plumbp_finite(t) && TEXT_SIG - 1 - (int)floor(log10(t)) < d)
        d = TEXT_SIG - 1 - (int)floor(log10(t));
    if (d < 0)
        d = 0;
    double bu = plumbp_round_safe_at(b, d, 0), su = plumbp_round_safe_at(sc, d, 0);
    clear_sum c;
    char *p = slot(w);
    snprintf(p, NUMBUF, "%s %s", plumbp_fixed(w, bu + su, d), len_unit(w));
    c.total = p;
    p = slot(w);
    snprintf(p, NUMBUF, "%s %s", plumbp_fixed(w, bu, d), len_unit(w));
    c.bound = p;
    p = slot(w);
    snprintf(p, NUMBUF, "%s %s", plumbp_fixed(w, su, d), len_unit(w));
    c.scatter = p;
    return c;
}

static const char *t_energy(writer *w, double j)
{
    return plumbp_t_zone_energy(w, j);
}


/* A point as "12.3 m E, 4.56 m S". A coordinate that prints as zero is
 * E or N whatever its sign: never "0 m S" for -1e-12 m. */
static const char *t_point(writer *w, const double p[2])
{
    char *b = slot(w);
    const char *e = t_len(w, fabs(p[0])), *n = t_len(w, fabs(p[1]));
    snprintf(b, NUMBUF, "%s %s, %s %s", e, p[0] < 0.0 && !plumbp_shows_zero(e) ? "W" : "E", n,
             p[1] < 0.0 && !plumbp_shows_zero(n) ? "S" : "N");
    return b;
}

/* Joins a number to its unit inside a sentence so that wrapping never
 * parts them; printed as a space. */


/* ---- input echo --------------------------------------------------------- */

/* Display factor and unit of a key's SI values. */
static double key_unit(const writer *w, const char *key, const char **unit)
{
    plumb_dim dim = PLUMB_DIM_NONE;
    if (plumb_profile_key_dim(key, &dim, NULL) != PLUMB_OK)
        dim = PLUMB_DIM_NONE;
    *unit = plumb_dim_si_unit(dim);
    /* one spelling of square and cubic metres in every report */
    if (dim == PLUMB_DIM_AREA)
        *unit = "m²";
    else if (dim == PLUMB_DIM_VOLUME)
        *unit = "m³";
    else if (dim == PLUMB_DIM_DENSITY)
        *unit = "kg/m³";
    switch (dim) {
    case PLUMB_DIM_NONE: case PLUMB_DIM_FRACTION:
        *unit = "";
        return 1.0;
    case PLUMB_DIM_ANGLE:
        *unit = "°";
        return 1.0;
    case PLUMB_DIM_LENGTH:
    case PLUMB_DIM_SPEED:
    {
        /* linear: the factor is the display value of 1 m or 1 m/s (a size
         * of the body in inches and a wind speed in mph in US units, as
         * everywhere) */
        shown v = plumbp_show_key(w, key, dim, 1.0);
        *unit = v.unit;
        return v.x;
    }
    case PLUMB_DIM_MASS:
        if (w->us) { *unit = "lb"; return 1.0 / PLUMB_LB_KG; }
        return 1.0;
    case PLUMB_DIM_AREA:
        if (w->us) { *unit = "ft²"; return 1.0 / (PLUMB_FT_M * PLUMB_FT_M); }
        return 1.0;
    case PLUMB_DIM_VOLUME:
        if (w->us) { *unit = "ft³"; return 1.0 / (PLUMB_FT_M * PLUMB_FT_M * PLUMB_FT_M); }
        return 1.0;
    default:
        return 1.0;
    }
}

static const char *pct(writer *w, double p);

/* The gusts each sample falls through (plumb/turbulence.h). */
static void text_gusts(writer *w, const plumb_zone_result *r)
{
    if (r->gust_model == PLUMB_TURB_NONE)
        return;
    char line[256];
    snprintf(line, sizeof line,
             "%s (MIL-F-8785C low altitude), W20 %s: each sample falls through its own "
             "realisation", r->gust_model == PLUMB_TURB_DRYDEN ? "Dryden" : "von Karman",
             plumbp_t_wind(w, r->gust_w20_m_s));
    wrapped(w, "  wind.turbulence            ", line);
}

static void text_inputs(writer *w, const plumb_zone_result *r)
{
    if (r->n_inputs == 0) {
        put(w, "Uncertain inputs\n  none: every sample is the same fall, so the radius below is "
               "that fall's\n  drift alone; give the inputs' uncertainty to size a zone\n\n");
        return;
    }
    put(w, "Uncertain inputs\n");
    for (size_t i = 0; i < r->n_inputs; i++) {
        const plumb_zone_input *in = &r->inputs[i];
        const char *u;
        double f = key_unit(w, in->key, &u);
        const char *sp = u[0] && strcmp(u, "°") != 0 ? NBSP : "";
        /* as given, or, converted to another unit, to the report's figures
         * (8.948 mph, not the 8.94775 that 4 m/s converts to) */
        int sig = f == 1.0 ? INPUT_SIG : TEXT_SIG;
        char line[512];
        switch (in->kind) {
        case PLUMB_DIST_CHOICE: {
            double total = 0.0;
            for (size_t k = 0; k < in->n_choice; k++)
                total += in->weight[k];
            size_t len = (size_t)snprintf(line, sizeof line, "one of");
            for (size_t k = 0; k < in->n_choice && len < sizeof line; k++)
                len += (size_t)snprintf(line + len, sizeof line - len, "%s %s (%s, cd %s on %s)",
                                        k ? "," : "", in->choice[k],
                                        pct(w, in->weight[k] / total),
                                        trim(w, in->choice_drag[k][0], sig, INPUT_DEC),
                                        plumbp_t_area(w, in->choice_drag[k][1]));
            break;
        }
        case PLUMB_DIST_UNIFORM:
            snprintf(line, sizeof line, "uniform %s%s%s to %s%s%s", trim(w, f * in->param[0], sig, INPUT_DEC),
                     sp, u, trim(w, f * in->param[1], sig, INPUT_DEC), sp, u);
            break;
        case PLUMB_DIST_TRIANGULAR:
            snprintf(line, sizeof line, "triangular %s%s%s, mode %s%s%s, to %s%s%s",
                     trim(w, f * in->param[0], sig, INPUT_DEC), sp, u, trim(w, f * in->param[1], sig, INPUT_DEC), sp, u,
                     trim(w, f * in->param[2], sig, INPUT_DEC), sp, u);
            break;
        default:
            snprintf(line, sizeof line, "normal, mean %s%s%s, sd %s%s%s", trim(w, f * in->param[0], sig, INPUT_DEC),
                     sp, u, trim(w, f * in->param[1], sig, INPUT_DEC), sp, u);
            break;
        }
        if (in->truncated) {
            size_t len = strlen(line);
            char lo[64] = "", hi[64] = "";
            if (isfinite(in->lower))
                snprintf(lo, sizeof lo, "%s%s%s", trim(w, f * in->lower, sig, INPUT_DEC), sp, u);
            if (isfinite(in->upper))
                snprintf(hi, sizeof hi, "%s%s%s", trim(w, f * in->upper, sig, INPUT_DEC), sp, u);
            if (lo[0] && hi[0])
                snprintf(line + len, sizeof line - len, "; truncated to %s – %s", lo, hi);
            else
                snprintf(line + len, sizeof line - len, "; truncated at %s", lo[0] ? lo : hi);
            len = strlen(line);
            snprintf(line + len, sizeof line - len,
                     " (%zu draw%s fell outside and %s drawn again, for %zu samples)",
                     in->redraws, in->redraws == 1 ? "" : "s", in->redraws == 1 ? "was" : "were",
                     r->samples);
        }
        char lead[PLUMB_DIAG_KEY + 8];
        snprintf(lead, sizeof lead, "  %-26s ", in->key);
        wrapped(w, lead, line);
    }
    text_gusts(w, r);
    put(w, "\n");
}

/* ---- text --------------------------------------------------------------- */

/* A percentile's interval; widened at the digits shown (the low end
 * rounded down, the high end up) when `widen`: the interval of a
 * keep-clear distance, whose high end is the bound the clearance uses. */
static const char *t_interval(writer *w, const plumb_zone_quantile *q, double scale,
                              const char *unit, int widen)
{
    char *b = slot(w);
    int was = w->round_dir;
    w->round_dir = widen ? -1 : 0;
    const char *lo = fig(w, q->lo * scale, LEN_DEC);
    w->round_dir = widen ? 1 : 0;
    const char *hi = fig(w, q->hi * scale, LEN_DEC);
    w->round_dir = was;
    snprintf(b, NUMBUF, "%s%s – %s %s%s", q->lo_open ? "(open) " : "", lo, hi,
             unit, q->hi_open ? " (open: more samples needed)" : "");
    return b;
}

static const char *pct(writer *w, double p)
{
    return plumbp_t_pct(w, p);
}

static void text_radii(writer *w, const plumb_zone_stats *z, double level, const char *from)
{
    put(w, "Distance from %s\n", from);
    put(w, "  %-8s %-12s %s interval\n", "", "radius", pct(w, level));
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        const plumb_zone_quantile *q = &z->radius[i];
        put(w, "  %-8s %-12s %s\n", pct(w, q->p), t_clear(w, q->value),
            t_interval(w, q, len_shown(w, 1.0), len_unit(w), 1));
    }
    put(w, "  %-8s %s\n\n", "largest", t_clear(w, z->radius_max_m));
}

static void text_clearance(writer *w, const plumb_zone_stats *z, double confidence, double level,
                           const char *around)
{
    clear_sum c = t_clear_sum(w, z->clearance_radius_m, z->radius_conf.hi, z->scatter_m);
    put(w, "Clearance radius at %s%s: %s\n", pct(w, confidence), around, c.total);
    put(w, "  = %-12s upper %s bound of the %s radius (estimate %s)\n",
        c.bound, pct(w, level), pct(w, confidence), t_clear(w, z->radius_conf.value));
    if (z->scatter_m > 0.0)
        put(w, "  + %-12s scatter allowance for bounce and deflection, as given\n\n",
            c.scatter);
    else {
        /* zone.scatter not given (or 0): nothing was added, and it says so */
        wrapped(w, "  + none         ", PLUMBP_NO_SCATTER);
        put(w, "\n");
    }
}

static void text_cloud(writer *w, const plumb_zone_stats *z)
{
    put(w, "  mean impact     %s\n", t_point(w, z->mean_m));
    double b2 = z->bearing_deg + 180.0;
    if (!zone_has_ellipse(z)) {
        put(w, "  95 %% ellipse    none: every sample lands on the same point\n");
        return;
    }
    put(w, "  95 %% ellipse    semi-major %s, semi-minor %s\n", t_len(w, z->semi_major_m),
        t_len(w, z->semi_minor_m));
    put(w, "                  major axis along %s° – %s° (%s–%s)\n", trim(w, z->bearing_deg, 4, 1),
        trim(w, b2, 4, 1), compass(z->bearing_deg), compass(b2));
}

/* Which attitude set the energy and which the distance. */
static void text_attitudes(writer *w, const plumb_zone_stats *z)
{
    if (z->n_attitudes == 0)
        return;
    char line[512];
    size_t len = (size_t)snprintf(line, sizeof line, "the largest impact energy came from a "
                                  "fall %s (it sets the top energy percentiles), the farthest "
                                  "impact from one %s (it sets the radii); samples:",
                                  z->attitude[z->attitude_energy].name,
                                  z->attitude[z->attitude_radius].name);
    for (size_t k = 0; k < z->n_attitudes && len < sizeof line; k++)
        len += (size_t)snprintf(line + len, sizeof line - len, "%s %s %zu", k ? "," : "",
                                z->attitude[k].name, z->attitude[k].count);
    put(w, "Attitude\n");
    wrapped(w, "  ", line);
    put(w, "\n");
}

static void text_energy(writer *w, const plumb_zone_stats *z, double level)
{
    put(w, "Impact energy, with the %s interval\n", pct(w, level));
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++) {
        const plumb_zone_quantile *q = &z->energy[i];
        put(w, "  %-8s %-26s %s\n", pct(w, q->p), t_energy(w, q->value),
            t_interval(w, q, w->us ? 1.0 / PLUMB_FT_LBF_J : 1.0, w->us ? "ft·lbf" : "J", 0));
    }
    put(w, "  %-8s %s\n\n", "largest", t_energy(w, z->energy_max_j));
}

static void text_exceedance(writer *w, const plumb_zone_stats *z, double level)
{
    if (z->n_exceedance == 0)
        return;
    put(w, "Probability that the impact energy exceeds each criterion (%s interval)\n",
        pct(w, level));
    for (size_t i = 0; i < z->n_exceedance; i++) {
        const plumb_zone_exceedance *x = &z->exceedance[i];
        const plumb_criterion *c = x->criterion;
        put(w, "  %-9s %s – %s, %zu of %zu samples above %s\n", pct(w, x->probability),
            pct(w, x->lo), pct(w, x->hi), x->count, z->samples, plumbp_t_limit_energy(w, c->energy_limit_j));
        char src[3 * PLUMB_CRIT_TEXT + PLUMB_CRIT_ID + 128], quoted[PLUMB_CRIT_TEXT * 2];
        const char *note = status_note_of(c->status);
        /* the source's own figures, with their US values under --units us */
        snprintf(src, sizeof src, "%s [%s]; source: %s%s%s%s%s", c->name, c->id,
                 plumbp_t_source(w, c, quoted, sizeof quoted), note[0] ? " (" : "", note,
                 note[0] ? ")" : "",
                 c->kind == PLUMB_CRIT_HELMET_TEST
                     ? " (the energy a helmet is tested to, not a safe limit)" : "");
        wrapped(w, "            ", src);
    }
    put(w, "\n");
}

/* Where the impacts land: the circle around the cloud's centre and the
 * polygon, each holding the confidence's share of impacts. */
static void text_landing(writer *w, const plumb_zone_result *r)
{
    const plumb_zone_stats *z = &r->zone;
    double confidence = r->confidence, level = r->ci_level;
    const plumb_zone_quantile *q = &z->landing_radius;
    const plumb_region_result *lr = &z->landing;
    put(w, "Where %s of the impacts land, wherever that is on the ground\n", pct(w, confidence));
    char line[512];
    put(w, "  circle centre   %s (mean of the first %zu samples)\n",
        t_point(w, z->landing_centre_m), z->landing_training);
    if (q->hi_open) {
        /* what an open circle leaves and what to do: the sheet's words too */
        wrapped(w, "  circle radius   ", plumbp_landing_open(r, line, sizeof line));
    } else {
        put(w, "  circle radius   %s, %s interval %s\n", t_clear(w, q->value), pct(w, level),
            t_interval(w, q, len_shown(w, 1.0), len_unit(w), 1));
        clear_sum c = t_clear_sum(w, z->landing_circle_m, q->hi, z->scatter_m);
        if (z->scatter_m > 0.0)
            put(w, "  landing circle  %s = upper bound %s + scatter %s\n", c.total, c.bound,
                c.scatter);
        else
            put(w, "  landing circle  %s, the upper bound: no scatter allowance\n", c.total);
    }
    /* the areas too are keep-clear figures: rounded up */
    if (lr->open) {
        put(w, "  polygon         " PLUMBP_OPEN_BOUND "\n");
    } else if (z->scatter_m > 0.0) {
        /* the buffered area on a line of its own: "under 0.01 ft² in 3
         * parts; with the scatter allowance as a buffer" would pass 80 */
        put(w, "  polygon         %s in %zu part%s\n"
               "                  %s with the scatter allowance as a buffer\n",
            plumbp_t_region_area(w, lr->polygon.area_m2),
            lr->polygon.n_rings, lr->polygon.n_rings == 1 ? "" : "s",
            plumbp_t_region_area(w, lr->buffered.area_m2));
    } else {
        put(w, "  polygon         %s in %zu part%s, no scatter allowance added\n",
            plumbp_t_region_area(w, lr->polygon.area_m2),
            lr->polygon.n_rings, lr->polygon.n_rings == 1 ? "" : "s");
    }
    snprintf(line, sizeof line,
             "the first %zu samples fix the centre and a density grid; the other %zu are "
             "counted against them, so each figure holds at least %s of the impacts with %s "
             "confidence (order statistics; split conformal for the polygon, Lei, Robins & "
             "Wasserman 2013). The polygons are in --regions-out and --format geojson.",
             z->landing_training, z->samples - z->landing_training, pct(w, confidence),
             pct(w, level));
    wrapped(w, "  ", line);
    put(w, "\n");
}

static void text_rules(writer *w, const plumb_zone_stats *z)
{
    put(w, "Simple rules, beside the computed radius\n");
    if (z->drop_height_m > z->planned_height_m) {
        char text[NUMBUF * 3];
        snprintf(text, sizeof text, "%s, the largest release height drawn (planned %s)",
                 t_clear(w, z->drop_height_m), plumbp_t_len(w, z->planned_height_m));
        wrapped(w, "  radius = drop height       ", text);
    } else
        put(w, "  %-26s %s\n", "radius = drop height", t_clear(w, z->drop_height_m));
    char line[256];
    if (z->glide_ratio_max > 0.0) {
        /* the published source of the largest ratio: a tumbling plate's
         * (Smith), or a fluttering one's (Tinklenberg et al.) */
        int tumbling = z->glide_ratio_max >= PLUMB_GLIDE_TUMBLE_RATIO;
        snprintf(line, sizeof line,
                 "up to %s (%s x the drop height): a plate gliding in still air, published "
                 "range of glide ratios 0 to %s (%s); \"radius = drop height\" is not "
                 "conservative for it",
                 t_clear(w, z->glide_ratio_max * z->drop_height_m),
                 plumbp_gnum(w, z->glide_ratio_max, INPUT_SIG),
                 plumbp_gnum(w, z->glide_ratio_max, INPUT_SIG),
                 tumbling ? "tumbling plates, Smith 1970"
                          : "fluttering plates, Tinklenberg et al. 2023");
        wrapped(w, "  plate glide                ", line);
    }
    const char *speed = plumbp_t_speed(w, z->max_release_speed_m_s);
    if (plumbp_shows_zero(speed))
        /* dropped from rest: there is no throw to give a range */
        snprintf(line, sizeof line, "none: every sample is dropped from rest (no release "
                 "velocity), so nothing is thrown");
    else
        snprintf(line, sizeof line,
                 "%s: the range, without drag or wind, of the sample released fastest (%s, "
                 "in its own direction)",
                 t_clear(w, z->ballistic_throw_m), speed);
    for (char *c = line; *c; c++)
        if (*c == ' ' && c > line && c[-1] >= '0' && c[-1] <= '9')
            *c = NBSP_CHAR;
    wrapped(w, "  drag-free throw            ", line);
    put(w, "\n");
}

static void text_warnings(writer *w, const plumb_zone_result *r)
{
    if (r->n_warnings == 0)
        return;
    put(w, "Warnings\n");
    for (size_t i = 0; i < r->n_warnings; i++) {
        char text[PLUMB_ZONE_WARNING * 2];
        wrapped(w, "  - ", plumbp_t_warning(w, r->warnings[i], text, sizeof text));
    }
    put(w, "\n");
}

static void text_item(writer *w, const plumb_zone_result *r)
{
    const plumb_zone_stats *z = &r->zone;
    text_warnings(w, r);
    text_inputs(w, r);
    put(w, "Impact cloud, released at the planned drop point (%s)\n", t_point(w, z->release_m));
    text_cloud(w, z);
    put(w, "\n");
    text_radii(w, z, r->ci_level, "the planned drop point");
    text_clearance(w, z, r->confidence, r->ci_level, "");
    text_landing(w, r);
    text_rules(w, z);
    text_energy(w, z, r->ci_level);
    text_attitudes(w, z);
    text_exceedance(w, z, r->ci_level);
    if (r->has_target) {
        const plumb_zone_stats *t = &r->at_target;
        put(w, "Target %s\n", t_point(w, r->target_m));
        /* wrapped: with --units us, long figures and a large run pass 80
         * columns (TEXT_WIDTH), continuation lines under the figures */
        char text[2 * NUMBUF + 96];
        snprintf(text, sizeof text, "%s puts the median impact on the target",
                 t_point(w, r->aim_release_m));
        wrapped(w, "  release at      ", text);
        double med[2] = {t->release_m[0] + t->displacement[0].value,
                         t->release_m[1] + t->displacement[1].value};
        snprintf(text, sizeof text, "%s, in a run of %zu sample%s released there",
                 t_point(w, med), t->samples, plumbp_s(t->samples));
        wrapped(w, "  median impact   ", text);
        text_cloud(w, t);
        put(w, "\n");
        text_radii(w, t, r->ci_level, "the target, released at that point");
        text_clearance(w, t, r->confidence, r->ci_level, " around the target");
        text_energy(w, t, r->ci_level);
        text_exceedance(w, t, r->ci_level);
    }
}

static void text_cautions(writer *w)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    put(w, "Cautions\n");
    for (size_t i = 0; i < n; i++)
        wrapped(w, "  - ", c[i]);
}

/* The kit as a whole: the largest clearance radius and landing circle,
 * and the items that set them. */
static void text_kit(writer *w, const plumb_zone_report *rep)
{
    const plumb_zone_result *k = rep->items[rep->kit_item].result;
    const plumb_zone_result *l = rep->items[rep->kit_landing_item].result;
    put(w, "==== The kit\n\n");
    char line[1024];
    snprintf(line, sizeof line, "%s around the planned drop point, set by %s (the largest of "
             "the items' clearance radii: every item's clearance circle, around the same "
             "point, lies within it)",
             t_clear_sum(w, k->zone.clearance_radius_m, k->zone.radius_conf.hi,
                         k->zone.scatter_m).total,
             rep->items[rep->kit_item].name);
    put(w, "Kit clearance radius at %s:\n", pct(w, k->confidence));
    wrapped(w, "  ", line);
    /* the landing circles lie around their own centres (kit_landing_reach) */
    size_t ri = 0;
    double reach = 0.0;
    if (kit_landing_reach(rep, &ri, &reach)) {
        if (reach > k->zone.clearance_radius_m)
            snprintf(line, sizeof line, "the landing circles lie around each item's own centre "
                     "and are another estimate of where %s land: %s's reaches %s from the drop "
                     "point, beyond this radius; fence %s to keep it clear too",
                     pct(w, k->confidence), rep->items[ri].name, t_clear(w, reach),
                     t_clear(w, reach));
        else
            snprintf(line, sizeof line, "every item's landing circle, around its own centre, "
                     "lies within it too (the farthest, %s's, reaches %s from the drop point)",
                     rep->items[ri].name, t_clear(w, reach));
        wrapped(w, "  ", line);
    }
    if (!l->zone.landing_radius.hi_open) {
        snprintf(line, sizeof line, "largest landing circle %s (%s scatter allowance), "
                 "set by %s", t_clear_sum(w, l->zone.landing_circle_m, l->zone.landing_radius.hi,
                                             l->zone.scatter_m).total,
                 l->zone.scatter_m > 0.0 ? "with the" : "no",
                 rep->items[rep->kit_landing_item].name);
        wrapped(w, "  ", line);
    } else {
        wrapped(w, "  ", "largest landing circle " PLUMBP_OPEN_BOUND);
    }
    /* The table keeps to TABLE_WIDTH columns: a long name is wrapped onto
     * continuation lines of its own column, never cut, as in the tables of
     * plumb fall and sweep. */
    enum { LEAD_W = 5, GAP_W = 2, FIG_W = 13, LAST_W = 14, NAME_MIN = 4 };
    const char *heads[2] = {"clearance", "landing circle"};
    size_t name_w = NAME_MIN;
    for (size_t i = 0; i < rep->n_items; i++)
        if (shown_width(rep->items[i].name) > name_w)
            name_w = shown_width(rep->items[i].name);
    if (name_w > TABLE_WIDTH - LEAD_W - GAP_W - FIG_W - 1 - LAST_W)
        name_w = TABLE_WIDTH - LEAD_W - GAP_W - FIG_W - 1 - LAST_W;
    put(w, "%*s ", LEAD_W - 1, "#");
    pad(w, "item", name_w, 0);
    put(w, "%*s%-*s %s\n", GAP_W, "", FIG_W, heads[0], heads[1]);
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_stats *z = &rep->items[i].result->zone;
        char part[4 * TABLE_WIDTH + 1];
        const char *rest = wrap_cell(rep->items[i].name, name_w, part, sizeof part);
        put(w, "%*zu ", LEAD_W - 1, item_number(rep, i));
        pad(w, part, name_w, 0);
        put(w, "%*s%-*s %s\n", GAP_W, "", FIG_W,
            t_clear_sum(w, z->clearance_radius_m, z->radius_conf.hi, z->scatter_m).total,
            z->landing_radius.hi_open ? "open"
                                      : t_clear_sum(w, z->landing_circle_m, z->landing_radius.hi,
                                                      z->scatter_m).total);
        cell_continued(w, LEAD_W, rest, name_w);
    }
    put(w, "\n");
}

void plumbp_zone_text_report(writer *w, const plumb_report_options *opt,
                             const plumb_zone_report *rep)
{
    const plumb_zone_result *r0 = rep->items[0].result;
    plumbp_text_header(w, opt, "zone", rep->profile_name ? rep->profile_name : rep->items[0].name);
    put(w, "\n");
    put(w, "Monte Carlo  %zu samples per run, seed %lu, %zu thread%s (the figures do not\n"
           "             depend on the thread count); intervals at %s: order statistics\n"
           "             for percentiles, Clopper-Pearson for probabilities\n\n",
        r0->samples, r0->seed, rep->threads, rep->threads == 1 ? "" : "s", pct(w, r0->ci_level));
    for (size_t i = 0; i < rep->n_items; i++) {
        if (rep->inventory) {
            /* numbered as items[N] is, the profile as written */
            char head[PLUMB_NAME + 32];
            snprintf(head, sizeof head, "%zu %s", item_number(rep, i), rep->items[i].name);
            wrapped(w, "==== ", head);
            put(w, "\n");
        }
        text_item(w, rep->items[i].result);
    }
    if (rep->inventory)
        text_kit(w, rep);
    if (rep->profile_path)
        put(w, "Profile  %s\n", rep->profile_path);
    if (rep->profile_sha256)
        put(w, "SHA-256  %s\n", rep->profile_sha256);
    put(w, "\n");
    text_cautions(w);
}

