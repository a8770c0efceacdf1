/*
 * report_zone.c - text, JSON (jansson) and CSV reports of a Monte Carlo
 * clearance zone (include/plumb/dispersion.h; conventions of
 * include/plumb/report.h).
 *
 * Method: the whole report is made first, in a memory stream (POSIX
 * open_memstream) or as a jansson tree, and every figure is checked to be
 * finite on the way; only a complete, finite report is copied to the
 * caller's stream, so a refused report writes nothing.
 *
 * Units: text and CSV in SI, or with --units us in international feet and
 * pounds (1959 agreement: PLUMB_FT_M, PLUMB_LB_KG) and foot pound-force
 * (PLUMB_FT_LBF_J); energy in the text always in both J and ft lbf. JSON
 * is always SI with unit-suffixed keys and 17 significant digits (enough
 * for any IEEE 754 double to read back exactly, IEEE 754-2008 sec.
 * 5.12.2). CSV follows RFC 4180, the cautions as leading "# " lines.
 * The thread count is printed outside the "zone" objects: nothing in them
 * depends on it.
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
#include "plumb/version.h"
#include "plumb/dispersion.h"
#include "core/internal.h"
#include "report/jsonout.h"
#include "report/format.h"
#include "report/zone_map.h"

/* Significant digits of text figures; CSV digits (JSON: jsonout.h). */
/* Width the text wraps sentences at. */
/* Compass points naming a bearing. */
#define FULL_TURN_DEG 360.0
/* Percent per unit fraction. */
#define PERCENT 100.0


static const char *const radius_names[PLUMB_ZONE_RADII] = {"p50", "p90", "p99", "p999"};
static const char *const energy_names[PLUMB_ZONE_ENERGIES] = {"p50", "p95", "p99"};

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

/* Decimals figures are shown to: a millimetre, a millijoule, a hundredth
 * of a percent, input digits. */
#define LEN_DEC 3
#define ENERGY_DEC 3
#define PCT_DEC 2
#define INPUT_DEC 9


static double len_shown(const writer *w, double m)
{
    return w->us ? m / PLUMB_FT_M : m;
}

static const char *len_unit(const writer *w)
{
    return w->us ? "ft" : "m";
}

/* Lengths and energies of a zone keep TEXT_SIG figures but no digit below
 * a millimetre or a millijoule (a spread of samples is not known finer);
 * the fall reports' plumbp_t_len and plumbp_t_energy keep all TEXT_SIG
 * figures. Speeds are the shared plumbp_t_speed. */
static const char *t_len(writer *w, double m)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s %s", fig(w, len_shown(w, m), LEN_DEC), len_unit(w));
    return b;
}

static const char *t_energy(writer *w, double j)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s ft·lbf (%s J)", fig(w, j / PLUMB_FT_LBF_J, ENERGY_DEC),
                 fig(w, j, ENERGY_DEC));
    else
        snprintf(b, NUMBUF, "%s J (%s ft·lbf)", fig(w, j, ENERGY_DEC),
                 fig(w, j / PLUMB_FT_LBF_J, ENERGY_DEC));
    return b;
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
        if (w->us) { *unit = "ft"; return 1.0 / PLUMB_FT_M; }
        return 1.0;
    case PLUMB_DIM_SPEED:
        /* a wind speed as a crew reads it, as plumbp_show_key gives it */
        if (w->us && strncmp(key, "wind.", 5) == 0) { *unit = "mph"; return 1.0 / MPH_M_S; }
        if (w->us) { *unit = "ft/s"; return 1.0 / PLUMB_FT_M; }
        return 1.0;
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

static const char *dist_word(plumb_dist_kind k)
{
    switch (k) {
    case PLUMB_DIST_UNIFORM: return "uniform";
    case PLUMB_DIST_TRIANGULAR: return "triangular";
    case PLUMB_DIST_CHOICE: return "choice";
    default: return "normal";
    }
}

/* The gusts each sample falls through (plumb/turbulence.h). */
static void text_gusts(writer *w, const plumb_zone_result *r)
{
    if (r->gust_model == PLUMB_TURB_NONE)
        return;
    char line[256];
    snprintf(line, sizeof line,
             "%s (MIL-F-8785C low altitude), W20 %s: each sample falls through its own "
             "realisation", r->gust_model == PLUMB_TURB_DRYDEN ? "Dryden" : "von Karman",
             plumbp_t_speed(w, r->gust_w20_m_s));
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
                                        trim(w, in->choice_drag[k][0], INPUT_SIG, INPUT_DEC),
                                        plumbp_t_area(w, in->choice_drag[k][1]));
            break;
        }
        case PLUMB_DIST_UNIFORM:
            snprintf(line, sizeof line, "uniform %s%s%s to %s%s%s", trim(w, f * in->param[0], INPUT_SIG, INPUT_DEC),
                     sp, u, trim(w, f * in->param[1], INPUT_SIG, INPUT_DEC), sp, u);
            break;
        case PLUMB_DIST_TRIANGULAR:
            snprintf(line, sizeof line, "triangular %s%s%s, mode %s%s%s, to %s%s%s",
                     trim(w, f * in->param[0], INPUT_SIG, INPUT_DEC), sp, u, trim(w, f * in->param[1], INPUT_SIG, INPUT_DEC), sp, u,
                     trim(w, f * in->param[2], INPUT_SIG, INPUT_DEC), sp, u);
            break;
        default:
            snprintf(line, sizeof line, "normal, mean %s%s%s, sd %s%s%s", trim(w, f * in->param[0], INPUT_SIG, INPUT_DEC),
                     sp, u, trim(w, f * in->param[1], INPUT_SIG, INPUT_DEC), sp, u);
            break;
        }
        if (in->truncated) {
            size_t len = strlen(line);
            char lo[64] = "", hi[64] = "";
            if (isfinite(in->lower))
                snprintf(lo, sizeof lo, "%s%s%s", trim(w, f * in->lower, INPUT_SIG, INPUT_DEC), sp, u);
            if (isfinite(in->upper))
                snprintf(hi, sizeof hi, "%s%s%s", trim(w, f * in->upper, INPUT_SIG, INPUT_DEC), sp, u);
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

static const char *t_interval(writer *w, const plumb_zone_quantile *q, double scale,
                              const char *unit)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s%s – %s %s%s", q->lo_open ? "(open) " : "",
             fig(w, q->lo * scale, LEN_DEC), fig(w, q->hi * scale, LEN_DEC),
             unit, q->hi_open ? " (open: more samples needed)" : "");
    return b;
}

static const char *pct(writer *w, double p)
{
    char *b = slot(w);
    double x = PERCENT * p;
    /* a small non-zero bound keeps two figures rather than rounding to 0 */
    if (x > 0.0 && x < 0.5 * pow(10.0, -PCT_DEC))
        snprintf(b, NUMBUF, "%.2g %%", x);
    else
        snprintf(b, NUMBUF, "%s %%", trim(w, x, TEXT_SIG, PCT_DEC));
    return b;
}

static void text_radii(writer *w, const plumb_zone_stats *z, double level, const char *from)
{
    put(w, "Distance from %s\n", from);
    put(w, "  %-8s %-12s %s interval\n", "", "radius", pct(w, level));
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        const plumb_zone_quantile *q = &z->radius[i];
        put(w, "  %-8s %-12s %s\n", pct(w, q->p), t_len(w, q->value),
            t_interval(w, q, len_shown(w, 1.0), len_unit(w)));
    }
    put(w, "  %-8s %s\n\n", "largest", t_len(w, z->radius_max_m));
}

static void text_clearance(writer *w, const plumb_zone_stats *z, double confidence, double level,
                           const char *around)
{
    put(w, "Clearance radius at %s%s: %s\n", pct(w, confidence), around, t_len(w, z->clearance_radius_m));
    put(w, "  = %-12s upper %s bound of the %s radius (estimate %s)\n",
        t_len(w, z->radius_conf.hi), pct(w, level), pct(w, confidence), t_len(w, z->radius_conf.value));
    put(w, "  + %-12s scatter allowance for bounce and deflection, as given\n\n",
        t_len(w, z->scatter_m));
}

static void text_cloud(writer *w, const plumb_zone_stats *z)
{
    put(w, "  mean impact     %s\n", t_point(w, z->mean_m));
    double b2 = z->bearing_deg + 180.0;
    if (z->semi_major_m == 0.0) {
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
            t_interval(w, q, w->us ? 1.0 / PLUMB_FT_LBF_J : 1.0, w->us ? "ft·lbf" : "J"));
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
        char src[2 * PLUMB_CRIT_TEXT + PLUMB_CRIT_ID + 128];
        const char *note = status_note_of(c->status);
        snprintf(src, sizeof src, "%s [%s]; source: %s%s%s%s%s", c->name, c->id,
                 c->source[0] ? c->source : "not given", note[0] ? " (" : "", note,
                 note[0] ? ")" : "",
                 c->kind == PLUMB_CRIT_HELMET_TEST
                     ? " (the energy a helmet is tested to, not a safe limit)" : "");
        wrapped(w, "            ", src);
    }
    put(w, "\n");
}

/* Where the impacts land: the circle around the cloud's centre and the
 * polygon, each holding the confidence's share of impacts. */
static void text_landing(writer *w, const plumb_zone_stats *z, double confidence, double level)
{
    const plumb_zone_quantile *q = &z->landing_radius;
    const plumb_region_result *lr = &z->landing;
    put(w, "Where %s of the impacts land, wherever that is on the ground\n", pct(w, confidence));
    char line[512];
    put(w, "  circle centre   %s (mean of the first %zu samples)\n",
        t_point(w, z->landing_centre_m), z->landing_training);
    if (q->hi_open) {
        put(w, "  circle radius   open: more samples needed to bound it\n");
    } else {
        put(w, "  circle radius   %s, %s interval %s\n", t_len(w, q->value), pct(w, level),
            t_interval(w, q, len_shown(w, 1.0), len_unit(w)));
        put(w, "  landing circle  %s = upper bound %s + scatter %s\n",
            t_len(w, z->landing_circle_m), t_len(w, q->hi), t_len(w, z->scatter_m));
    }
    if (lr->open) {
        put(w, "  polygon         open: more samples needed to bound it\n");
    } else {
        put(w, "  polygon         %s in %zu part%s; with the scatter allowance as a buffer\n"
               "                  %s\n",
            plumbp_t_area(w, lr->polygon.area_m2),
            lr->polygon.n_rings, lr->polygon.n_rings == 1 ? "" : "s",
            plumbp_t_area(w, lr->buffered.area_m2));
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
    put(w, "  %-26s %s\n", "radius = drop height", t_len(w, z->drop_height_m));
    char line[256];
    if (z->glide_ratio_max > 0.0) {
        snprintf(line, sizeof line,
                 "up to %s (%s x the drop height): a plate gliding in still air, published "
                 "range of glide ratios 0 to %s; \"radius = drop height\" is not conservative "
                 "for it (plumb/glide.h)",
                 t_len(w, z->glide_ratio_max * z->drop_height_m),
                 num(w, z->glide_ratio_max, 3), num(w, z->glide_ratio_max, 4));
        wrapped(w, "  plate glide                ", line);
    }
    snprintf(line, sizeof line,
             "%s: the range, without drag or wind, of the sample released fastest (%s, in "
             "its own direction)",
             t_len(w, z->ballistic_throw_m), plumbp_t_speed(w, z->max_release_speed_m_s));
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
    for (size_t i = 0; i < r->n_warnings; i++)
        wrapped(w, "  - ", r->warnings[i]);
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
    text_landing(w, z, r->confidence, r->ci_level);
    text_rules(w, z);
    text_energy(w, z, r->ci_level);
    text_attitudes(w, z);
    text_exceedance(w, z, r->ci_level);
    if (r->has_target) {
        const plumb_zone_stats *t = &r->at_target;
        put(w, "Target %s\n", t_point(w, r->target_m));
        put(w, "  release at      %s puts the median impact on the target\n",
            t_point(w, r->aim_release_m));
        double med[2] = {t->release_m[0] + t->displacement[0].value,
                         t->release_m[1] + t->displacement[1].value};
        put(w, "  median impact   %s, in a run of %zu samples released there\n", t_point(w, med),
            t->samples);
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
    char line[512];
    snprintf(line, sizeof line, "%s around the planned drop point, set by %s (the item with "
             "the largest radius; every item's zone lies within it)",
             t_len(w, k->zone.clearance_radius_m), rep->items[rep->kit_item].name);
    put(w, "Kit clearance radius at %s:\n", pct(w, k->confidence));
    wrapped(w, "  ", line);
    if (!l->zone.landing_radius.hi_open) {
        snprintf(line, sizeof line, "largest landing circle %s (with the scatter allowance), "
                 "set by %s", t_len(w, l->zone.landing_circle_m),
                 rep->items[rep->kit_landing_item].name);
        wrapped(w, "  ", line);
    }
    put(w, "  %-30s %-14s %s\n", "item", "clearance", "landing circle");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_stats *z = &rep->items[i].result->zone;
        put(w, "  %-30.30s %-14s %s\n", rep->items[i].name, t_len(w, z->clearance_radius_m),
            z->landing_radius.hi_open ? "open" : t_len(w, z->landing_circle_m));
    }
    put(w, "\n");
}

static void text_report(writer *w, const plumb_report_options *opt, const plumb_zone_report *rep)
{
    const plumb_zone_result *r0 = rep->items[0].result;
    put(w, "plumb %s - zone: %s\n\n", opt->version ? opt->version : PLUMB_VERSION,
        rep->profile_name ? rep->profile_name : rep->items[0].name);
    put(w, "Monte Carlo  %zu samples per run, seed %lu, %zu thread%s (the figures do not\n"
           "             depend on the thread count); intervals at %s: order statistics\n"
           "             for percentiles, Clopper-Pearson for probabilities\n\n",
        r0->samples, r0->seed, rep->threads, rep->threads == 1 ? "" : "s", pct(w, r0->ci_level));
    for (size_t i = 0; i < rep->n_items; i++) {
        if (rep->inventory)
            put(w, "==== %s\n\n", rep->items[i].name);
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

/* ---- CSV ---------------------------------------------------------------- */


static void csv_row(writer *w, const char *item, const char *quantity, double value,
                    const double *lo, const double *hi, const char *unit)
{
    csv_field(w, item);
    put(w, ",");
    csv_field(w, quantity);
    put(w, ",%s,%s,%s,", csvnum(w, value), lo ? csvnum(w, *lo) : "", hi ? csvnum(w, *hi) : "");
    csv_field(w, unit);
    put(w, "\n");
}

static void csv_quantile(writer *w, const char *item, const char *name,
                         const plumb_zone_quantile *q, double scale, const char *unit)
{
    double lo = q->lo * scale, hi = q->hi * scale;
    csv_row(w, item, name, q->value * scale, q->lo_open ? NULL : &lo, q->hi_open ? NULL : &hi, unit);
}

static void csv_stats(writer *w, const char *item, const char *prefix, const plumb_zone_stats *z,
                      int target_pass)
{
    char q[128];
    double L = len_shown(w, 1.0);
    const char *lu = len_unit(w);
    const char *eu = w->us ? "ft_lbf" : "J";
    double E = w->us ? 1.0 / PLUMB_FT_LBF_J : 1.0;
#define Q(name) (snprintf(q, sizeof q, "%s%s", prefix, name), q)
    csv_row(w, item, Q("release_east"), z->release_m[0] * L, NULL, NULL, lu);
    csv_row(w, item, Q("release_north"), z->release_m[1] * L, NULL, NULL, lu);
    if (target_pass) {
        double me = z->release_m[0] + z->displacement[0].value, mn = z->release_m[1] + z->displacement[1].value;
        double elo = (z->release_m[0] + z->displacement[0].lo) * L, ehi = (z->release_m[0] + z->displacement[0].hi) * L;
        double nlo = (z->release_m[1] + z->displacement[1].lo) * L, nhi = (z->release_m[1] + z->displacement[1].hi) * L;
        csv_row(w, item, Q("median_impact_east"), me * L, &elo, &ehi, lu);
        csv_row(w, item, Q("median_impact_north"), mn * L, &nlo, &nhi, lu);
    }
    csv_row(w, item, Q("mean_east"), z->mean_m[0] * L, NULL, NULL, lu);
    csv_row(w, item, Q("mean_north"), z->mean_m[1] * L, NULL, NULL, lu);
    csv_row(w, item, Q("ellipse95_semi_major"), z->semi_major_m * L, NULL, NULL, lu);
    csv_row(w, item, Q("ellipse95_semi_minor"), z->semi_minor_m * L, NULL, NULL, lu);
    csv_row(w, item, Q("ellipse95_bearing"), z->bearing_deg, NULL, NULL, "deg");
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        char name[32];
        snprintf(name, sizeof name, "radius_%s", radius_names[i]);
        csv_quantile(w, item, Q(name), &z->radius[i], L, lu);
    }
    csv_row(w, item, Q("radius_max"), z->radius_max_m * L, NULL, NULL, lu);
    csv_quantile(w, item, Q("radius_at_confidence"), &z->radius_conf, L, lu);
    csv_row(w, item, Q("scatter"), z->scatter_m * L, NULL, NULL, lu);
    csv_row(w, item, Q("clearance_radius"), z->clearance_radius_m * L, NULL, NULL, lu);
    csv_row(w, item, Q("landing_centre_east"), z->landing_centre_m[0] * L, NULL, NULL, lu);
    csv_row(w, item, Q("landing_centre_north"), z->landing_centre_m[1] * L, NULL, NULL, lu);
    csv_quantile(w, item, Q("landing_radius"), &z->landing_radius, L, lu);
    if (!z->landing_radius.hi_open)
        csv_row(w, item, Q("landing_circle"), z->landing_circle_m * L, NULL, NULL, lu);
    if (!z->landing.open) {
        double A = L * L;
        const char *au = w->us ? "ft2" : "m2";
        csv_row(w, item, Q("landing_area"), z->landing.polygon.area_m2 * A, NULL, NULL, au);
        csv_row(w, item, Q("landing_area_buffered"), z->landing.buffered.area_m2 * A, NULL, NULL,
                au);
    }
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++) {
        char name[32];
        snprintf(name, sizeof name, "energy_%s", energy_names[i]);
        csv_quantile(w, item, Q(name), &z->energy[i], E, eu);
    }
    csv_row(w, item, Q("energy_max"), z->energy_max_j * E, NULL, NULL, eu);
    for (size_t i = 0; i < z->n_exceedance; i++) {
        const plumb_zone_exceedance *x = &z->exceedance[i];
        char name[PLUMB_CRIT_ID + 32];
        snprintf(name, sizeof name, "exceedance_%s", x->criterion->id);
        csv_row(w, item, Q(name), x->probability, &x->lo, &x->hi, "probability");
    }
    if (!target_pass) {
        csv_row(w, item, Q("drop_height"), z->drop_height_m * L, NULL, NULL, lu);
        csv_row(w, item, Q("ballistic_throw"), z->ballistic_throw_m * L, NULL, NULL, lu);
        if (z->glide_ratio_max > 0.0)
            csv_row(w, item, Q("plate_glide"), z->glide_ratio_max * z->drop_height_m * L, NULL,
                    NULL, lu);
        csv_row(w, item, Q("max_release_speed"), z->max_release_speed_m_s * L, NULL, NULL,
                w->us ? "ft/s" : "m/s");
    }
#undef Q
}

static void csv_report(writer *w, const plumb_zone_report *rep)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    for (size_t i = 0; i < n; i++)
        put(w, "# %s\n", c[i]);
    const plumb_zone_result *r0 = rep->items[0].result;
    put(w, "# profile: %s (%s), sha256 %s\n", rep->profile_name ? rep->profile_name : "",
        rep->profile_path ? rep->profile_path : "", rep->profile_sha256 ? rep->profile_sha256 : "");
    put(w, "# zone: %zu samples, seed %lu, confidence %s, intervals at %s, %zu thread%s (the "
           "figures do not depend on the number)\n", r0->samples, r0->seed,
        csvnum(w, r0->confidence), csvnum(w, r0->ci_level), rep->threads,
        rep->threads == 1 ? "" : "s");
    /* the criteria of the exceedance rows, with their source and status */
    for (size_t k = 0; k < r0->zone.n_exceedance; k++) {
        const plumb_criterion *cr = r0->zone.exceedance[k].criterion;
        put(w, "# criterion %s: %s, limit %s, source: %s, status %s\n", cr->id, cr->name,
            plumbp_csv_limit(w, cr->energy_limit_j), cr->source[0] ? cr->source : "not given",
            cr->status[0] ? cr->status : "not given");
    }
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        for (size_t k = 0; k < r->n_warnings; k++)
            put(w, "# warning: %s: %s\n", rep->items[i].name, r->warnings[k]);
    }
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        for (size_t k = 0; k < r->n_inputs; k++)
            if (r->inputs[k].truncated)
                put(w, "# %s: %s: normal truncated to its range, %zu draws redrawn\n",
                    rep->items[i].name, r->inputs[k].key, r->inputs[k].redraws);
    }
    put(w, "item,quantity,value,ci_low,ci_high,unit\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        csv_stats(w, rep->items[i].name, "", &r->zone, 0);
        if (r->has_target) {
            csv_row(w, rep->items[i].name, "target.east", r->target_m[0] * len_shown(w, 1.0), NULL,
                    NULL, len_unit(w));
            csv_row(w, rep->items[i].name, "target.north", r->target_m[1] * len_shown(w, 1.0), NULL,
                    NULL, len_unit(w));
            csv_stats(w, rep->items[i].name, "target.", &r->at_target, 1);
        }
    }
}

/* ---- JSON --------------------------------------------------------------- */


static json_t *jpair(jctx *j, double a, double b)
{
    json_t *v = jarr(j);
    jpush(j, v, jreal(j, a));
    jpush(j, v, jreal(j, b));
    return v;
}

/* [lo, hi] of a quantile, shifted by `off`; an open end is null. */
static json_t *jci(jctx *j, const plumb_zone_quantile *q, double off)
{
    json_t *v = jarr(j);
    jpush(j, v, q->lo_open ? json_null() : jreal(j, off + q->lo));
    jpush(j, v, q->hi_open ? json_null() : jreal(j, off + q->hi));
    return v;
}

/* A polygon's rings, each a list of [east, north] closed on its first point. */
static json_t *j_rings(jctx *j, const plumb_region_polygon *pg)
{
    json_t *rings = jarr(j);
    for (size_t r = 0; r < pg->n_rings; r++) {
        json_t *ring = jarr(j);
        for (size_t k = 0; k < pg->ring_count[r]; k++) {
            const double *v = pg->vertex_m[pg->ring_first[r] + k];
            jpush(j, ring, jpair(j, v[0], v[1]));
        }
        jpush(j, rings, ring);
    }
    return rings;
}

static json_t *j_landing(jctx *j, const plumb_zone_stats *z)
{
    const plumb_region_result *lr = &z->landing;
    json_t *o = jobj(j);
    jset(j, o, "p", jreal(j, z->landing_radius.p));
    jset(j, o, "training_samples", jint(j, z->landing_training));
    jset(j, o, "counted_samples", jint(j, z->samples - z->landing_training));
    json_t *c = jobj(j);
    jset(j, c, "centre_m", jpair(j, z->landing_centre_m[0], z->landing_centre_m[1]));
    jset(j, c, "radius_m", jreal(j, z->landing_radius.value));
    jset(j, c, "ci_m", jci(j, &z->landing_radius, 0.0));
    jset(j, c, "open", json_boolean(z->landing_radius.hi_open));
    jset(j, c, "radius_bound_m", z->landing_radius.hi_open ? json_null()
                                                          : jreal(j, z->landing_radius.hi));
    jset(j, c, "scatter_m", jreal(j, z->scatter_m));
    jset(j, c, "clearance_radius_m", z->landing_radius.hi_open ? json_null()
                                                              : jreal(j, z->landing_circle_m));
    jset(j, o, "circle", c);
    json_t *pg = jobj(j);
    jset(j, pg, "method", jstr(j, "split-conformal highest-density region"));
    jset(j, pg, "open", json_boolean(lr->open));
    if (!lr->open) {
        jset(j, pg, "area_m2", jreal(j, lr->polygon.area_m2));
        jset(j, pg, "calibration_rank", jint(j, lr->rank));
        jset(j, pg, "calibration_inside", jint(j, lr->inside));
        jset(j, pg, "cell_m", jpair(j, lr->cell_m[0], lr->cell_m[1]));
        jset(j, pg, "axis_bearing_deg", jreal(j, lr->axis_deg));
        jset(j, pg, "rings_m", j_rings(j, &lr->polygon));
        jset(j, pg, "scatter_m", jreal(j, lr->buffer_m));
        jset(j, pg, "buffered_area_m2", jreal(j, lr->buffered.area_m2));
        jset(j, pg, "buffered_rings_m", j_rings(j, &lr->buffered));
    }
    jset(j, o, "polygon", pg);
    return o;
}

static void j_stats_into(jctx *j, json_t *o, const plumb_zone_stats *z)
{
    jset(j, o, "release_point_m", jpair(j, z->release_m[0], z->release_m[1]));
    jset(j, o, "centre_m", jpair(j, z->centre_m[0], z->centre_m[1]));
    jset(j, o, "mean_point_m", jpair(j, z->mean_m[0], z->mean_m[1]));
    json_t *cov = jobj(j);
    jset(j, cov, "ee_m2", jreal(j, z->cov_m2[0]));
    jset(j, cov, "nn_m2", jreal(j, z->cov_m2[1]));
    jset(j, cov, "en_m2", jreal(j, z->cov_m2[2]));
    jset(j, o, "covariance", cov);
    json_t *el = jobj(j);
    jset(j, el, "semi_major_m", jreal(j, z->semi_major_m));
    jset(j, el, "semi_minor_m", jreal(j, z->semi_minor_m));
    jset(j, el, "bearing_deg", jreal(j, z->bearing_deg));
    jset(j, el, "chi2", jreal(j, z->ellipse_chi2));
    jset(j, o, "ellipse95", el);
    json_t *rad = jobj(j), *rci = jobj(j);
    for (int i = 0; i < PLUMB_ZONE_RADII; i++) {
        jset(j, rad, radius_names[i], jreal(j, z->radius[i].value));
        jset(j, rci, radius_names[i], jci(j, &z->radius[i], 0.0));
    }
    jset(j, o, "radius_m", rad);
    jset(j, o, "radius_ci_m", rci);
    jset(j, o, "radius_max_m", jreal(j, z->radius_max_m));
    json_t *conf = jobj(j);
    jset(j, conf, "p", jreal(j, z->radius_conf.p));
    jset(j, conf, "radius_m", jreal(j, z->radius_conf.value));
    jset(j, conf, "ci_m", jci(j, &z->radius_conf, 0.0));
    jset(j, o, "radius_at_confidence", conf);
    jset(j, o, "radius_bound_m", jreal(j, z->radius_conf.hi));
    jset(j, o, "scatter_m", jreal(j, z->scatter_m));
    jset(j, o, "clearance_radius_m", jreal(j, z->clearance_radius_m));
    json_t *en = jobj(j), *eci = jobj(j);
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++) {
        jset(j, en, energy_names[i], jreal(j, z->energy[i].value));
        jset(j, eci, energy_names[i], jci(j, &z->energy[i], 0.0));
    }
    jset(j, en, "max", jreal(j, z->energy_max_j));
    jset(j, o, "energy_j", en);
    jset(j, o, "energy_ci_j", eci);
    json_t *ex = jarr(j);
    for (size_t i = 0; i < z->n_exceedance; i++) {
        const plumb_zone_exceedance *x = &z->exceedance[i];
        json_t *e = jobj(j);
        jset(j, e, "criterion", jstr(j, x->criterion->id));
        jset(j, e, "name", jstr(j, x->criterion->name));
        jset(j, e, "energy_limit_j", jreal(j, x->criterion->energy_limit_j));
        jset(j, e, "source", jstr(j, x->criterion->source));
        jset(j, e, "status", jstr(j, x->criterion->status));
        jset(j, e, "count", jint(j, x->count));
        jset(j, e, "probability", jreal(j, x->probability));
        jset(j, e, "ci", jpair(j, x->lo, x->hi));
        jpush(j, ex, e);
    }
    jset(j, o, "exceedance", ex);
    json_t *md = jarr(j);
    jpush(j, md, jreal(j, z->displacement[0].value));
    jpush(j, md, jreal(j, z->displacement[1].value));
    jset(j, o, "median_displacement_m", md);
    jset(j, o, "landing", j_landing(j, z));
    if (z->n_attitudes) {
        json_t *at = jarr(j);
        for (size_t k = 0; k < z->n_attitudes; k++) {
            json_t *a = jobj(j);
            jset(j, a, "attitude", jstr(j, z->attitude[k].name));
            jset(j, a, "samples", jint(j, z->attitude[k].count));
            jset(j, a, "energy_max_j", jreal(j, z->attitude[k].energy_max_j));
            jset(j, a, "radius_max_m", jreal(j, z->attitude[k].radius_max_m));
            jpush(j, at, a);
        }
        jset(j, o, "attitudes", at);
        jset(j, o, "attitude_sets_energy", jstr(j, z->attitude[z->attitude_energy].name));
        jset(j, o, "attitude_sets_radius", jstr(j, z->attitude[z->attitude_radius].name));
    }
    json_t *sol = jobj(j);
    jset(j, sol, "steps", jint(j, z->steps));
    jset(j, sol, "rhs_evaluations", jint(j, z->rhs_evaluations));
    jset(j, o, "solver", sol);
}

static json_t *j_zone(jctx *j, const plumb_zone_result *r)
{
    json_t *o = jobj(j);
    jset(j, o, "samples", jint(j, r->samples));
    jset(j, o, "seed", r->seed <= (unsigned long)LLONG_MAX ? json_integer((json_int_t)r->seed)
                                                         : (j->bad = 1, json_null()));
    jset(j, o, "confidence", jreal(j, r->confidence));
    jset(j, o, "interval_level", jreal(j, r->ci_level));
    jset(j, o, "impact_point_fixed", json_boolean(r->zone.impact_point_fixed));
    json_t *warn = jarr(j);
    for (size_t i = 0; i < r->n_warnings; i++)
        jpush(j, warn, jstr(j, r->warnings[i]));
    jset(j, o, "warnings", warn);
    j_stats_into(j, o, &r->zone);
    json_t *rules = jobj(j);
    jset(j, rules, "drop_height_m", jreal(j, r->zone.drop_height_m));
    jset(j, rules, "ballistic_throw_m", jreal(j, r->zone.ballistic_throw_m));
    jset(j, rules, "glide_ratio_max", jreal(j, r->zone.glide_ratio_max));
    jset(j, rules, "glide_m", jreal(j, r->zone.glide_ratio_max * r->zone.drop_height_m));
    jset(j, rules, "max_release_speed_m_s", jreal(j, r->zone.max_release_speed_m_s));
    jset(j, o, "rules_of_thumb", rules);
    json_t *tr = jarr(j), *inputs = jarr(j);
    for (size_t i = 0; i < r->n_inputs; i++) {
        const plumb_zone_input *in = &r->inputs[i];
        if (in->truncated)
            jpush(j, tr, jstr(j, in->key));
        json_t *e = jobj(j);
        jset(j, e, "key", jstr(j, in->key));
        jset(j, e, "distribution", jstr(j, dist_word(in->kind)));
        json_t *pa = jarr(j);
        for (int k = 0; k < (in->kind == PLUMB_DIST_TRIANGULAR ? 3 : 2); k++)
            jpush(j, pa, jreal(j, in->param[k]));
        jset(j, e, "params", pa);
        jset(j, e, "truncated", json_boolean(in->truncated));
        if (in->kind == PLUMB_DIST_CHOICE) {
            json_t *ch = jarr(j);
            for (size_t k = 0; k < in->n_choice; k++) {
                json_t *c = jobj(j);
                jset(j, c, "attitude", jstr(j, in->choice[k]));
                jset(j, c, "weight", jreal(j, in->weight[k]));
                jset(j, c, "cd", jreal(j, in->choice_drag[k][0]));
                jset(j, c, "area_m2", jreal(j, in->choice_drag[k][1]));
                jpush(j, ch, c);
            }
            jset(j, e, "choice", ch);
        }
        if (in->truncated) {
            json_t *rg = jarr(j);
            jpush(j, rg, isfinite(in->lower) ? jreal(j, in->lower) : json_null());
            jpush(j, rg, isfinite(in->upper) ? jreal(j, in->upper) : json_null());
            jset(j, e, "range", rg);
            jset(j, e, "redraws", jint(j, in->redraws));
        }
        jpush(j, inputs, e);
    }
    jset(j, o, "truncated", tr);
    jset(j, o, "inputs", inputs);
    if (r->gust_model != PLUMB_TURB_NONE) {
        json_t *g = jobj(j);
        jset(j, g, "model", jstr(j, plumb_turbulence_model_name((plumb_turbulence_model)r->gust_model)));
        jset(j, g, "w20_m_s", jreal(j, r->gust_w20_m_s));
        jset(j, g, "realisation", jstr(j, "one per sample, from the sample's own random stream"));
        jset(j, o, "gusts", g);
    }
    if (r->has_target) {
        const plumb_zone_stats *t = &r->at_target;
        json_t *tg = jobj(j);
        jset(j, tg, "target_m", jpair(j, r->target_m[0], r->target_m[1]));
        jset(j, tg, "median_impact_m", jpair(j, t->release_m[0] + t->displacement[0].value,
                                             t->release_m[1] + t->displacement[1].value));
        json_t *mci = jobj(j);
        jset(j, mci, "east", jci(j, &t->displacement[0], t->release_m[0]));
        jset(j, mci, "north", jci(j, &t->displacement[1], t->release_m[1]));
        jset(j, tg, "median_impact_ci_m", mci);
        j_stats_into(j, tg, t);
        jset(j, o, "target", tg);
    }
    return o;
}

static json_t *j_report(jctx *j, const plumb_report_options *opt, const plumb_zone_report *rep)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    json_t *p = jobj(j);
    jset(j, p, "path", jstr(j, rep->profile_path));
    jset(j, p, "name", jstr(j, rep->profile_name));
    jset(j, p, "sha256", jstr(j, rep->profile_sha256));
    jset(j, root, "profile", p);
    const plumb_zone_result *r0 = rep->items[0].result;
    jset(j, root, "seed", r0->seed <= (unsigned long)LLONG_MAX ? json_integer((json_int_t)r0->seed)
                                                             : (j->bad = 1, json_null()));
    /* no thread count: nothing in the JSON depends on it (the text names it) */
    /* One shape for a single payload and a kit, as in the fall JSON: a
     * single payload is a kit of one, and keeps its zone at the top too. */
    if (!rep->inventory)
        jset(j, root, "zone", j_zone(j, r0));
    jset(j, root, "inventory", json_boolean(rep->inventory));
    {
        json_t *items = jarr(j);
        size_t worst = 0;
        for (size_t i = 0; i < rep->n_items; i++) {
            json_t *o = jobj(j);
            jset(j, o, "name", jstr(j, rep->items[i].name));
            jset(j, o, "zone", j_zone(j, rep->items[i].result));
            jpush(j, items, o);
            if (rep->items[i].result->zone.clearance_radius_m >
                rep->items[worst].result->zone.clearance_radius_m)
                worst = i;
        }
        jset(j, root, "items", items);
        jset(j, root, "worst", jstr(j, rep->items[worst].name));
        json_t *kit = jobj(j);
        const plumb_zone_result *kr = rep->items[rep->kit_item].result;
        const plumb_zone_result *lr = rep->items[rep->kit_landing_item].result;
        jset(j, kit, "clearance_radius_m", jreal(j, kr->zone.clearance_radius_m));
        jset(j, kit, "set_by", jstr(j, rep->items[rep->kit_item].name));
        jset(j, kit, "landing_circle_m", lr->zone.landing_radius.hi_open
                                             ? json_null()
                                             : jreal(j, lr->zone.landing_circle_m));
        jset(j, kit, "landing_circle_set_by", jstr(j, rep->items[rep->kit_landing_item].name));
        jset(j, root, "kit", kit);
    }
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

/* ---- output --------------------------------------------------------------- */

static plumb_status check_report(const plumb_zone_report *rep, plumb_diag *diag)
{
    if (!rep || rep->n_items == 0 || !rep->items)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no zone report to write");
    if (!rep->inventory && rep->n_items != 1)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a single-payload zone report has one item");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_zone_result *r = rep->items[i].result;
        if (!r || !rep->items[i].name)
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "zone item %zu has no result or name", i + 1);
        if (r->samples != rep->items[0].result->samples || r->seed != rep->items[0].result->seed)
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "zone items were run with other settings");
        for (size_t k = 0; k < r->zone.n_exceedance; k++)
            if (!r->zone.exceedance[k].criterion)
                return PLUMB_RAISE(diag, PLUMB_EINVAL, "zone item %zu: criterion missing", i + 1);
    }
    return PLUMB_OK;
}

plumb_status plumb_report_zone(FILE *out, const plumb_report_options *opt_in,
                               const plumb_zone_report *rep, plumb_diag *diag)
{
    plumb_report_options def;
    memset(&def, 0, sizeof def);
    const plumb_report_options *opt = opt_in ? opt_in : &def;
    if (!out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no output stream");
    plumb_status st = check_report(rep, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        return emit_json(out, &j, j_report(&j, opt, rep), diag);
    }
    if (opt->format == PLUMB_FORMAT_GEOJSON) {
        jctx j = {0, 0};
        json_t *root = plumbp_zone_geojson(&j, opt, rep, &st, diag);
        return st != PLUMB_OK ? st : emit_json(out, &j, root, diag);
    }
    writer w;
    char *buf;
    size_t len;
    if (!writer_start(&w, &buf, &len, opt->units == PLUMB_UNITS_US))
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the zone report");
    if (opt->format == PLUMB_FORMAT_CSV)
        csv_report(&w, rep);
    else
        text_report(&w, opt, rep);
    int failed = !writer_finish(&w, &buf, &len);
    if (w.bad)
        st = PLUMB_RAISE(diag, PLUMB_ENUMERIC, "a zone figure is not a finite number; no report "
                                               "written");
    else if (failed || !buf)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the zone report");
    else
        st = emit(out, buf, len, diag);
    free(buf);
    return st;
}
