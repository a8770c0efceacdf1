/*
 * report.c - fall and air reports in text, JSON (jansson) and CSV, and the
 * cautions (include/plumb/report.h). The verdicts and warnings they print
 * are made by src/criteria/judge.c.
 *
 * Method: a report is first made in a memory stream (POSIX open_memstream)
 * or, for JSON, as a jansson tree; only when it is complete, and every
 * figure in it has been found finite, is it copied to the caller's stream.
 * So a refused report writes nothing at all.
 *
 * Units: the text and CSV reports show SI, or with --units us the units a
 * crew in the US works in: the international foot and pound (1959
 * agreement, PLUMB_FT_M and PLUMB_LB_KG), the statute mile of 5280 ft, the
 * international nautical mile of 1852 m (1929), the pound-force
 * lb x g0, the foot pound-force (PLUMB_FT_LBF_J) and the conventional inch
 * of mercury (NIST SP 811, 2008, Appendix B.8: 1 inHg = 3.386389e3 Pa).
 * Energy is always shown in both joules and foot pound-force.
 * JSON is always SI, with unit-suffixed keys (design.md section 6), and its
 * numbers are printed with 17 significant digits, enough for any IEEE 754
 * double to read back exactly (IEEE 754-2008, section 5.12.2).
 * CSV follows RFC 4180 (fields with commas, quotes or line ends quoted),
 * with the cautions as leading "# " comment lines.
 */
#include <ctype.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <jansson.h>

#include "report/jsonout.h"
#include "report/textout.h"

#include "plumb/constants.h"
#include "plumb/report.h"
#include "plumb/sweep.h"
#include "plumb/inverse.h"
#include "plumb/wind.h"
#include "plumb/gravity.h"
#include "core/internal.h"

/* ---- named constants ---------------------------------------------------- */

/* Statute mile per hour, m/s: 5280 international feet per 3600 s. */
#define MPH_M_S (5280.0 * PLUMB_FT_M / 3600.0)
/* Knot, m/s: international nautical mile 1852 m (1929) per 3600 s. */
#define KNOT_M_S (1852.0 / 3600.0)
/* Kilometre per hour, m/s. */
#define KMH_M_S (1000.0 / 3600.0)
/* Pound-force, N: the avoirdupois pound under standard gravity. */
#define LBF_N (PLUMB_LB_KG * PLUMB_G0_M_S2)
/* Conventional inch of mercury, Pa (NIST SP 811, 2008, Appendix B.8). */
#define INHG_PA 3386.389
/* Pascals per hectopascal. */
#define HPA_PA 100.0
/* Kelvin to degree Celsius offset, K (ITS-90 definition of the Celsius scale). */
#define CELSIUS_ZERO_K 273.15
/* Fahrenheit scale: T(degF) = T(K) x 9/5 - 459.67 (NIST SP 811, B.8). */
#define FAHRENHEIT_PER_K 1.8
#define FAHRENHEIT_ZERO_OFFSET 459.67

/* Degrees per radian, 180 / pi (C11 has no M_PI). */
#define DEG_PER_RAD 57.29577951308232087680


/* Horizontal distance below which the text report says the object lands
 * below its release point: half the last digit the text shows (1 cm). */
#define DRIFT_SHOWN_M 0.005

/* Significant digits of figures in the text report, and of numbers in CSV. */
#define INPUT_SIG 6
#define RATIO_SIG 3
/* Width the text report wraps warnings and cautions at. */
/* Most rows of a wind table the text report lists. */
#define WIND_ROWS_SHOWN 6
/* Compass points used to name a bearing. */

/* ---- the cautions (design.md section 7; SAFETY.md has the full text) ---- */

static const char *const cautions[] = {
    "These figures are an engineering estimate from a point-mass model, not a measurement.",
    "Real objects deflect, bounce, break and tumble: where one lands and how hard it strikes "
    "can differ from these figures.",
    "Energy thresholds are not guarantees of safety: sharp or dense objects injure below them.",
    "Follow local codes and regulations and the judgment of a competent or licensed person.",
    "See SAFETY.md for the full text of these cautions, their scope and their limits.",
};

const char *const *plumb_cautions(size_t *n)
{
    if (n)
        *n = sizeof cautions / sizeof cautions[0];
    return cautions;
}

/* ---- finiteness: every figure checked before anything is written ------- */

typedef struct finite_check {
    plumb_diag *diag;
    const char *item;      /* item name for the message */
    plumb_status status;
} finite_check;

static void need_finite(finite_check *fc, const char *what, double x)
{
    if (fc->status != PLUMB_OK || plumbp_finite(x))
        return;
    fc->status = PLUMB_RAISE(fc->diag, PLUMB_ENUMERIC,
                             "%s%s%s is not a finite number (%s); no report written",
                             fc->item ? fc->item : "", fc->item ? ": " : "", what,
                             isnan(x) ? "NaN" : "infinite");
}

static plumb_status check_item(const plumb_item_report *it, plumb_diag *diag)
{
    finite_check fc = {diag, it->spec->name[0] ? it->spec->name : NULL, PLUMB_OK};
    const plumb_fall_result *r = &it->result;
    const plumb_fall_spec *s = it->spec;
    need_finite(&fc, "impact time", r->time_s);
    need_finite(&fc, "impact point east", r->point_m[0]);
    need_finite(&fc, "impact point north", r->point_m[1]);
    for (int k = 0; k < 3; k++)
        need_finite(&fc, "impact velocity", r->velocity_m_s[k]);
    need_finite(&fc, "impact speed", r->speed_m_s);
    need_finite(&fc, "impact energy", r->energy_j);
    need_finite(&fc, "impact momentum", r->momentum_kg_m_s);
    need_finite(&fc, "impact angle", r->angle_deg);
    need_finite(&fc, "drift", r->drift_m);
    need_finite(&fc, "bearing", r->bearing_deg);
    need_finite(&fc, "apex", r->apex_m);
    need_finite(&fc, "terminal speed", r->terminal_speed_m_s);
    need_finite(&fc, "drag-free speed", r->drag_free_speed_m_s);
    need_finite(&fc, "drag-free energy", r->drag_free_energy_j);
    need_finite(&fc, "work done by drag", r->drag_work_j);
    need_finite(&fc, "largest Mach number", r->max_mach);
    need_finite(&fc, "smallest Reynolds number", r->min_re);
    need_finite(&fc, "largest Reynolds number", r->max_re);
    if (s->n_descent > 0) {
        for (size_t i = 0; i < r->n_deployed && i < PLUMB_MAX_DESCENT; i++) {
            need_finite(&fc, "line-stretch time", r->deploy_time_s[i]);
            need_finite(&fc, "line-stretch height", r->deploy_height_m[i]);
            need_finite(&fc, "line-stretch air speed", r->deploy_speed_m_s[i]);
        }
        need_finite(&fc, "peak drag force", r->peak_force_n);
        need_finite(&fc, "peak load factor", r->peak_load_g);
        need_finite(&fc, "steady descent speed", r->steady_speed_m_s);
    }
    for (size_t i = 0; i < it->n_verdicts; i++) {
        need_finite(&fc, "judged energy", it->verdicts[i].energy_j);
        need_finite(&fc, "energy ratio", it->verdicts[i].ratio);
        need_finite(&fc, "energy limit", it->verdicts[i].criterion->energy_limit_j);
    }
    need_finite(&fc, "mass", s->mass_kg);
    need_finite(&fc, "volume", s->volume_m3);
    need_finite(&fc, "drag coefficient", s->drag.cd);
    need_finite(&fc, "drag area", s->drag.area_m2);
    need_finite(&fc, "drag area CdA", s->drag.cd_area_m2);
    need_finite(&fc, "sphere diameter", s->drag.diameter_m);
    for (int k = 0; k < 3; k++) {
        need_finite(&fc, "release point", s->release_m[k]);
        need_finite(&fc, "release velocity", s->velocity_m_s[k]);
    }
    need_finite(&fc, "site elevation", s->site_elevation_m);
    need_finite(&fc, "wind speed", s->wind.speed_m_s);
    need_finite(&fc, "wind direction", s->wind.from_deg);
    return fc.status;
}

/* ---- shared helpers ----------------------------------------------------- */

/* Air at the strike level [0] and at the release height [1]. */
typedef struct item_air {
    plumb_air at[2];
    double g_m_s2;          /* gravity at the strike level */
    double wind_release[2]; /* wind at the release height: speed m/s, from deg */
} item_air;


/* Speed and direction blown from of an (east, north) air motion. */
static void wind_polar(double e, double n, double *speed, double *from_deg)
{
    *speed = hypot(e, n);
    *from_deg = *speed > 0.0 ? wrap_deg(atan2(-e, -n) * DEG_PER_RAD) : 0.0;
}

static plumb_status air_for(const plumb_fall_spec *s, const plumb_atmosphere *atm,
                            item_air *ia, plumb_diag *diag)
{
    double alt[2] = {s->site_elevation_m, s->site_elevation_m + s->release_m[2]};
    for (int k = 0; k < 2; k++) {
        plumb_status st = plumb_atmosphere_at(atm, alt[k], &ia->at[k]);
        if (st != PLUMB_OK)
            return PLUMB_RAISE(diag, st, "no air properties at %.1f m above sea level", alt[k]);
        finite_check fc = {diag, NULL, PLUMB_OK};
        need_finite(&fc, "air temperature", ia->at[k].t_k);
        need_finite(&fc, "air pressure", ia->at[k].p_pa);
        need_finite(&fc, "air density", ia->at[k].rho_kg_m3);
        need_finite(&fc, "air viscosity", ia->at[k].mu_pa_s);
        need_finite(&fc, "speed of sound", ia->at[k].a_m_s);
        if (fc.status != PLUMB_OK)
            return fc.status;
    }
    ia->g_m_s2 = plumb_gravity_at(&s->gravity, s->site_elevation_m);
    double e, n;
    plumb_wind_at(&s->wind, s->release_m[2], &e, &n);
    wind_polar(e, n, &ia->wind_release[0], &ia->wind_release[1]);
    return PLUMB_OK;
}

static const char *verdict_word(const plumb_verdict *v)
{
    return v->exceeds ? "exceeds" : "within";
}

static const char *crit_kind_name(plumb_criterion_kind k)
{
    return k == PLUMB_CRIT_HELMET_TEST ? "helmet-test" : "limit";
}

static const char *drag_model_name(plumb_drag_model m)
{
    switch (m) {
    case PLUMB_DRAG_SPHERE_MORRISON: return "sphere";
    case PLUMB_DRAG_SPHERE_CGW: return "sphere-cgw";
    default: return "fixed";
    }
}

static const char *shape_kind_name(plumb_shape_kind k)
{
    switch (k) {
    case PLUMB_SHAPE_SPHERE: return "sphere";
    case PLUMB_SHAPE_CYLINDER: return "cylinder";
    case PLUMB_SHAPE_BOX: return "box";
    case PLUMB_SHAPE_PLATE: return "plate";
    default: return "none";
    }
}

static const char *attitude_name(plumb_attitude a)
{
    switch (a) {
    case PLUMB_ATTITUDE_BROADSIDE: return "broadside";
    case PLUMB_ATTITUDE_END_ON: return "end-on";
    default: return "tumbling";
    }
}

static const char *atm_model_name(plumb_atm_model m)
{
    switch (m) {
    case PLUMB_ATM_SURFACE: return "surface";
    case PLUMB_ATM_TABLE: return "table";
    default: return "standard-1976";
    }
}

static const char *wind_profile_name(plumb_wind_profile p)
{
    switch (p) {
    case PLUMB_WIND_POWER: return "power";
    case PLUMB_WIND_LOG: return "log";
    case PLUMB_WIND_TABLE: return "table";
    default: return "uniform";
    }
}

/* Effective fixed CdA of the body, m^2 (fixed model only). */
static double body_cd_area(const plumb_drag_spec *d)
{
    return d->area_m2 > 0.0 ? d->cd * d->area_m2 : d->cd_area_m2;
}

/* Index of the strictest criterion (lowest limit) among the verdicts of an
 * item, or -1 when there are none. */
static long strictest(const plumb_item_report *it)
{
    long best = -1;
    for (size_t i = 0; i < it->n_verdicts; i++)
        if (best < 0 || it->verdicts[i].criterion->energy_limit_j <
                            it->verdicts[best].criterion->energy_limit_j)
            best = (long)i;
    return best;
}

/* The worst item: highest energy ratio against the strictest criterion,
 * or, without criteria, highest energy. Ties go to the first. */
static size_t worst_item(const plumb_fall_report *rep)
{
    size_t w = 0;
    for (size_t i = 1; i < rep->n_items; i++) {
        const plumb_item_report *a = &rep->items[i], *b = &rep->items[w];
        long sa = strictest(a), sb = strictest(b);
        double ka = sa >= 0 ? a->verdicts[sa].ratio : a->result.energy_j;
        double kb = sb >= 0 ? b->verdicts[sb].ratio : b->result.energy_j;
        if (ka > kb)
            w = i;
    }
    return w;
}

static size_t largest_drift_item(const plumb_fall_report *rep)
{
    size_t w = 0;
    for (size_t i = 1; i < rep->n_items; i++)
        if (rep->items[i].result.drift_m > rep->items[w].result.drift_m)
            w = i;
    return w;
}

/* All items must be judged against the same criteria, in the same order,
 * for the inventory table and the CSV columns. */
static plumb_status check_same_criteria(const plumb_fall_report *rep, plumb_diag *diag)
{
    const plumb_item_report *first = &rep->items[0];
    for (size_t i = 1; i < rep->n_items; i++) {
        const plumb_item_report *it = &rep->items[i];
        int same = it->n_verdicts == first->n_verdicts;
        for (size_t k = 0; same && k < it->n_verdicts; k++)
            same = it->verdicts[k].criterion == first->verdicts[k].criterion;
        if (!same)
            return PLUMB_RAISE(diag, PLUMB_EINVAL,
                               "item %zu was judged against other criteria than item 1", i + 1);
    }
    return PLUMB_OK;
}

/* ---- text and CSV writer context --------------------------------------- */






/* x with a fixed number of decimals, never "-0". */
static char *fixed(writer *w, double x, int dec)
{
    char *b = slot(w);
    if (!plumbp_finite(x)) {
        w->bad = 1;
        snprintf(b, NUMBUF, "?");
        return b;
    }
    snprintf(b, NUMBUF, "%.*f", dec, x);
    if (strspn(b, "-0.") == strlen(b))
        snprintf(b, NUMBUF, "%.*f", dec, 0.0);
    return b;
}

/* x in scientific notation with `sig` significant digits. */
static const char *sci(writer *w, double x, int sig)
{
    char *b = slot(w);
    if (!plumbp_finite(x)) {
        w->bad = 1;
        snprintf(b, NUMBUF, "?");
        return b;
    }
    snprintf(b, NUMBUF, "%.*e", sig - 1, x);
    return b;
}

/* x with at most `dec` decimals, trailing zeros dropped ("1000", "12.5"). */
static const char *trimmed(writer *w, double x, int dec)
{
    char *b = fixed(w, x, dec);
    if (strchr(b, '.')) {
        size_t n = strlen(b);
        while (n > 0 && b[n - 1] == '0')
            b[--n] = '\0';
        if (n > 0 && b[n - 1] == '.')
            b[--n] = '\0';
    }
    return b;
}

/* x in the shortest of %g's forms with `sig` significant digits ("0.9"). */
static const char *gnum(writer *w, double x, int sig)
{
    char *b = slot(w);
    if (!plumbp_finite(x)) {
        w->bad = 1;
        snprintf(b, NUMBUF, "?");
        return b;
    }
    snprintf(b, NUMBUF, "%.*g", sig, x == 0.0 ? 0.0 : x);
    return b;
}

/* A quantity in the text: TEXT_SIG figures; inputs echoed as given (in SI,
 * INPUT_SIG figures) or converted (US, TEXT_SIG figures), zeros dropped. */
static const char *qty(writer *w, double x)
{
    if (!w->exact)
        return num(w, x, TEXT_SIG);
    return gnum(w, x, w->us ? TEXT_SIG : INPUT_SIG);
}






/* ---- text: quantities in the chosen units ------------------------------ */

static const char *t_len(writer *w, double m)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft", qty(w, m / PLUMB_FT_M));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m", qty(w, m));
    return b;
}

/* "3.2 m west", "1.1 m north": an offset along one axis in words. One
 * that prints as zero takes the word of the positive side: never
 * "0 m south". */
static const char *t_offset(writer *w, double x, const char *pos, const char *neg)
{
    char *b = slot(w);
    const char *l = t_len(w, fabs(x));
    size_t n = strcspn(l, NBSP);
    int zero = n > 0 && strspn(l, "0.") >= n;
    snprintf(b, NUMBUF, "%s %s", l, x < 0.0 && !zero ? neg : pos);
    return b;
}

static const char *t_speed(writer *w, double v)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft/s", qty(w, v / PLUMB_FT_M));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m/s", qty(w, v));
    return b;
}

/* A wind speed as a crew reads it: m/s, or mph with knots. */
static const char *t_wind(writer *w, double v)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "mph (%s" NBSP "kn)", qty(w, v / MPH_M_S),
                 qty(w, v / KNOT_M_S));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m/s", qty(w, v));
    return b;
}

/* Energy in both units, the display system's first. */
static const char *t_energy(writer *w, double j)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft·lbf (%s" NBSP "J)",
                 qty(w, j / PLUMB_FT_LBF_J), qty(w, j));
    else
        snprintf(b, NUMBUF, "%s" NBSP "J (%s" NBSP "ft·lbf)", qty(w, j),
                 qty(w, j / PLUMB_FT_LBF_J));
    return b;
}

static const char *t_mass(writer *w, double kg)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "lb (%s" NBSP "kg)", qty(w, kg / PLUMB_LB_KG),
                 qty(w, kg));
    else
        snprintf(b, NUMBUF, "%s" NBSP "kg", qty(w, kg));
    return b;
}

static const char *t_area(writer *w, double m2)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft²", qty(w, m2 / (PLUMB_FT_M * PLUMB_FT_M)));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m²", qty(w, m2));
    return b;
}

static const char *t_force(writer *w, double n)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "lbf", num(w, n / LBF_N, TEXT_SIG));
    else
        snprintf(b, NUMBUF, "%s" NBSP "N", num(w, n, TEXT_SIG));
    return b;
}

static const char *t_temp(writer *w, double k)
{
    char *b = slot(w);
    double f = k * FAHRENHEIT_PER_K - FAHRENHEIT_ZERO_OFFSET, c = k - CELSIUS_ZERO_K;
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "°F", w->exact ? gnum(w, f, TEXT_SIG) : fixed(w, f, 1));
    else if (w->exact)
        snprintf(b, NUMBUF, "%s" NBSP "K (%s" NBSP "°C)", gnum(w, k, INPUT_SIG),
                 gnum(w, c, INPUT_SIG));
    else
        snprintf(b, NUMBUF, "%s" NBSP "K (%s" NBSP "°C)", fixed(w, k, 1), fixed(w, c, 1));
    return b;
}

static const char *t_press(writer *w, double pa)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "inHg", qty(w, pa / INHG_PA));
    else
        snprintf(b, NUMBUF, "%s" NBSP "hPa", qty(w, pa / HPA_PA));
    return b;
}

static const char *t_density(writer *w, double rho)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "lb/ft³",
                 num(w, rho * PLUMB_FT_M * PLUMB_FT_M * PLUMB_FT_M / PLUMB_LB_KG, TEXT_SIG));
    else
        snprintf(b, NUMBUF, "%s" NBSP "kg/m³", num(w, rho, TEXT_SIG));
    return b;
}

/* " [23.61 m/s]" after a US figure; "" in SI. */
static const char *si_bracket(writer *w, double x, const char *unit)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, " [%s" NBSP "%s]", num(w, x, TEXT_SIG), unit);
    else
        b[0] = '\0';
    return b;
}


/* "085° (E)" */
static const char *t_bearing(writer *w, double deg)
{
    char *b = slot(w);
    double d = wrap_deg(deg);
    if (lround(d) == 360)
        d = 0.0;
    snprintf(b, NUMBUF, "%03ld° (%s)", lround(d), compass(d));
    return b;
}

static void caution_lines_text(writer *w)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    put(w, "\nCautions\n");
    for (size_t i = 0; i < n; i++)
        wrapped(w, "  - ", c[i]);
}

/* ---- warnings shared by several items ------------------------------------ */

static int item_has_warning(const plumb_item_report *it, const char *text)
{
    for (size_t k = 0; k < it->n_warnings; k++)
        if (strcmp(it->warnings[k], text) == 0)
            return 1;
    return 0;
}

typedef void (*warning_fn)(writer *w, const char *who, const char *text);

/* Calls fn once per distinct warning of the report, with the names of the
 * items that have it, or "" when every item has it. */
static void each_warning(writer *w, const plumb_fall_report *rep, warning_fn fn)
{
    for (size_t i = 0; i < rep->n_items; i++)
        for (size_t k = 0; k < rep->items[i].n_warnings; k++) {
            const char *text = rep->items[i].warnings[k];
            int seen = 0;
            for (size_t j = 0; j < i && !seen; j++)
                seen = item_has_warning(&rep->items[j], text);
            if (seen)
                continue;
            char who[PLUMB_NAME * 4] = "";
            size_t count = 0, len = 0;
            for (size_t j = i; j < rep->n_items; j++) {
                if (!item_has_warning(&rep->items[j], text))
                    continue;
                int n = snprintf(who + len, sizeof who - len, "%s%s", count ? ", " : "",
                                 rep->items[j].spec->name);
                if (n > 0 && (size_t)n < sizeof who - len)
                    len += (size_t)n;
                count++;
            }
            fn(w, count == rep->n_items ? "" : who, text);
        }
}

static void text_warning_line(writer *w, const char *who, const char *text)
{
    char line[PLUMB_NAME * 4 + PLUMB_WARNING + 8];
    snprintf(line, sizeof line, "%s%s%s", who, who[0] ? ": " : "", text);
    wrapped(w, "  - ", line);
}

static void csv_warning_line(writer *w, const char *who, const char *text);

/* ---- text: single fall --------------------------------------------------- */

static void text_header(writer *w, const plumb_report_options *opt, const char *what,
                        const char *name)
{
    if (opt->version)
        put(w, "plumb %s - %s: %s\n", opt->version, what, name);
    else
        put(w, "plumb - %s: %s\n", what, name);
}

static void text_impact(writer *w, const plumb_item_report *it)
{
    const plumb_fall_result *r = &it->result;
    put(w, "\nImpact\n");
    if (w->us)
        put(w, "  speed      %s (%s mph)%s\n", t_speed(w, r->speed_m_s),
            num(w, r->speed_m_s / MPH_M_S, TEXT_SIG), si_bracket(w, r->speed_m_s, "m/s"));
    else
        put(w, "  speed      %s (%s km/h)\n", t_speed(w, r->speed_m_s),
            num(w, r->speed_m_s / KMH_M_S, TEXT_SIG));
    put(w, "  energy     %s\n", t_energy(w, r->energy_j));
    put(w, "  time       %s s after release\n", num(w, r->time_s, TEXT_SIG));
    if (r->drift_m < DRIFT_SHOWN_M)
        put(w, "  drift      none: lands below the release point\n");
    else
        put(w, "  drift      %s toward %s from the release point%s\n", t_len(w, r->drift_m),
            t_bearing(w, r->bearing_deg), si_bracket(w, r->drift_m, "m"));
    const plumb_fall_spec *s = it->spec;
    if (s->release_m[0] != 0.0 || s->release_m[1] != 0.0)
        put(w, "  lands at   %s, %s of the planned drop point\n",
            t_offset(w, r->point_m[0], "east", "west"), t_offset(w, r->point_m[1], "north", "south"));
    if (w->us)
        put(w, "  momentum   %s lbf·s [%s kg·m/s]\n",
            num(w, r->momentum_kg_m_s / LBF_N, TEXT_SIG), num(w, r->momentum_kg_m_s, TEXT_SIG));
    else
        put(w, "  momentum   %s kg·m/s\n", num(w, r->momentum_kg_m_s, TEXT_SIG));
    put(w, "  angle      %s° below horizontal\n", fixed(w, r->angle_deg, 1));
}

static void text_limit(writer *w, const plumb_criterion *c, char *buf, size_t size)
{
    if (w->us)
        snprintf(buf, size, "limit %s ft·lbf (%s J)",
                 num(w, c->energy_limit_j / PLUMB_FT_LBF_J, TEXT_SIG),
                 num(w, c->energy_limit_j, TEXT_SIG));
    else
        snprintf(buf, size, "limit %s J (%s ft·lbf)", num(w, c->energy_limit_j, TEXT_SIG),
                 num(w, c->energy_limit_j / PLUMB_FT_LBF_J, TEXT_SIG));
}

/* How sure the criterion's figure is, when it is not read in the source
 * itself (criteria files: seen | transcribed | memory). */
static const char *status_note(const plumb_criterion *c)
{
    return status_note_of(c->status);
}

static void text_verdicts(writer *w, const plumb_item_report *it)
{
    if (it->n_verdicts == 0) {
        put(w, "\nCriteria\n  none judged\n");
        return;
    }
    put(w, "\nCriteria, against %s at impact\n", t_energy(w, it->result.energy_j));
    for (size_t i = 0; i < it->n_verdicts; i++) {
        const plumb_verdict *v = &it->verdicts[i];
        const plumb_criterion *c = v->criterion;
        char lim[NUMBUF * 2], line[NUMBUF * 4];
        text_limit(w, c, lim, sizeof lim);
        put(w, "  %-8s %s\n", v->exceeds ? "EXCEEDS" : "WITHIN", c->name);
        snprintf(line, sizeof line, "%s, ratio %s, %s%s", lim, num(w, v->ratio, RATIO_SIG),
                 verdict_word(v),
                 c->kind == PLUMB_CRIT_HELMET_TEST ? " (helmet test, not a safe limit)" : "");
        wrapped(w, "           ", line);
        char src[PLUMB_CRIT_TEXT + 2 * PLUMB_CRIT_ID + 64];
        snprintf(src, sizeof src, "%s [%s]%s%s%s", c->source[0] ? c->source : "source not given",
                 c->id, status_note(c)[0] ? " (" : "", status_note(c), status_note(c)[0] ? ")" : "");
        wrapped(w, "           source: ", src);
    }
}

static void text_comparison(writer *w, const plumb_item_report *it)
{
    const plumb_fall_result *r = &it->result;
    put(w, "\nFor comparison\n");
    if (r->terminal_speed_m_s > 0.0)
        put(w, "  terminal speed   %s in still air at the strike level%s\n",
            t_speed(w, r->terminal_speed_m_s), si_bracket(w, r->terminal_speed_m_s, "m/s"));
    else
        put(w, "  terminal speed   none: without drag the speed grows without bound\n");
    put(w, "  without drag     %s, %s%s\n", t_speed(w, r->drag_free_speed_m_s),
        t_energy(w, r->drag_free_energy_j),
        it->spec->volume_m3 > 0.0 ? " (and without buoyancy)" : "");
    if (r->drag_free_energy_j > 0.0 && r->drag_work_j != 0.0)
        put(w, "  drag took        %s, %s %% of the drag-free energy\n",
            t_energy(w, fabs(r->drag_work_j)),
            num(w, 100.0 * fabs(r->drag_work_j) / r->drag_free_energy_j, RATIO_SIG));
    if (r->apex_m > it->spec->release_m[2])
        put(w, "  highest point    %s above the strike level\n", t_len(w, r->apex_m));
}

static void text_deploy_rule(writer *w, const plumb_descent_spec *d, char *buf, size_t size)
{
    char fill[NUMBUF * 2];
    w->exact = 1;
    if (d->fill_constant > 0.0)
        snprintf(fill, sizeof fill, "fills in n D0 / v with n = %s", gnum(w, d->fill_constant, 3));
    else if (d->fill_time_s > 0.0)
        snprintf(fill, sizeof fill, "fills in %s" NBSP "s", gnum(w, d->fill_time_s, TEXT_SIG));
    else
        snprintf(fill, sizeof fill, "opens at once");
    if (d->trigger == PLUMB_DEPLOY_AFTER)
        snprintf(buf, size, "deploys %s" NBSP "s after release, %s",
                 gnum(w, d->deploy_value, TEXT_SIG), fill);
    else
        snprintf(buf, size, "deploys below %s, %s", t_len(w, d->deploy_value), fill);
    w->exact = 0;
}

static void text_descent(writer *w, const plumb_item_report *it, const char *who)
{
    const plumb_fall_spec *s = it->spec;
    const plumb_fall_result *r = &it->result;
    if (s->n_descent == 0)
        return;
    put(w, "\nDescent devices%s%s\n", who ? " of " : "", who ? who : "");
    for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        const plumb_descent_spec *d = &s->descent[i];
        char rule[NUMBUF * 4], line[NUMBUF * 8], lead[32];
        text_deploy_rule(w, d, rule, sizeof rule);
        snprintf(lead, sizeof lead, "  %-16s ", plumb_descent_kind_name(d->kind));
        w->exact = 1;
        snprintf(line, sizeof line, "Cd %s on %s; %s", gnum(w, d->cd, INPUT_SIG),
                 t_area(w, d->area_m2), rule);
        w->exact = 0;
        wrapped(w, lead, line);
        if (i < r->n_deployed)
            snprintf(line, sizeof line,
                     "line stretch %s" NBSP "s after release, %s above the strike level, at %s "
                     "air speed", num(w, r->deploy_time_s[i], TEXT_SIG),
                     t_len(w, r->deploy_height_m[i]), t_speed(w, r->deploy_speed_m_s[i]));
        else
            snprintf(line, sizeof line, "does not open before impact");
        wrapped(w, "                   ", line);
    }
    put(w, "  peak drag force  %s (%s" NBSP "g)\n", t_force(w, r->peak_force_n),
        num(w, r->peak_load_g, 3));
    put(w, "  steady descent   %s with the devices open, at the strike level\n",
        t_speed(w, r->steady_speed_m_s));
}

/* Drag as understood, in one line of prose. */
static void text_drag(writer *w, const plumb_item_report *it, char *buf, size_t size)
{
    const plumb_drag_spec *d = &it->spec->drag;
    char shape[NUMBUF * 4] = "";
    w->exact = 1;
    const plumb_shape_spec *sh = it->shape;
    if (sh && sh->kind != PLUMB_SHAPE_NONE) {
        switch (sh->kind) {
        case PLUMB_SHAPE_SPHERE:
            snprintf(shape, sizeof shape, "sphere of diameter %s, ", t_len(w, sh->dims_m[0]));
            break;
        case PLUMB_SHAPE_CYLINDER:
            snprintf(shape, sizeof shape, "cylinder %s long, diameter %s, %s, ",
                     t_len(w, sh->dims_m[0]), t_len(w, sh->dims_m[1]),
                     attitude_name(sh->attitude));
            break;
        case PLUMB_SHAPE_BOX:
            snprintf(shape, sizeof shape, "box %s x %s x %s, %s, ", t_len(w, sh->dims_m[0]),
                     t_len(w, sh->dims_m[1]), t_len(w, sh->dims_m[2]),
                     attitude_name(sh->attitude));
            break;
        default:
            snprintf(shape, sizeof shape, "plate %s x %s, %s thick, %s, ",
                     t_len(w, sh->dims_m[0]), t_len(w, sh->dims_m[1]), t_len(w, sh->dims_m[2]),
                     attitude_name(sh->attitude));
            break;
        }
    }
    char how[NUMBUF * 4];
    if (d->model == PLUMB_DRAG_SPHERE_MORRISON || d->model == PLUMB_DRAG_SPHERE_CGW) {
        const plumb_fall_result *r = &it->result;
        snprintf(how, sizeof how, "sphere of diameter %s, Cd(Re) by %s; Re %s to %s on the way",
                 t_len(w, d->diameter_m),
                 d->model == PLUMB_DRAG_SPHERE_CGW ? "Clift, Grace & Weber (1978)"
                                                   : "Morrison (2010)",
                 sci(w, r->min_re, 3), sci(w, r->max_re, 3));
    } else if (body_cd_area(d) == 0.0) {
        snprintf(how, sizeof how, "none (drag-free)");
    } else if (d->area_m2 > 0.0) {
        snprintf(how, sizeof how, "Cd %s on %s, CdA %s", gnum(w, d->cd, INPUT_SIG),
                 t_area(w, d->area_m2), t_area(w, body_cd_area(d)));
    } else {
        snprintf(how, sizeof how, "CdA %s", t_area(w, d->cd_area_m2));
    }
    snprintf(buf, size, "%s%s%s%s", shape, how, d->source[0] ? "; source: " : "", d->source);
    w->exact = 0;
}

static void text_release(writer *w, const plumb_fall_spec *s, char *buf, size_t size)
{
    const double *v = s->velocity_m_s;
    char vel[NUMBUF * 4];
    w->exact = 1;
    if (v[0] == 0.0 && v[1] == 0.0 && v[2] == 0.0) {
        snprintf(vel, sizeof vel, "at rest");
    } else {
        double hs = hypot(v[0], v[1]);
        double heading = hs > 0.0 ? wrap_deg(atan2(v[0], v[1]) * DEG_PER_RAD) : 0.0;
        /* Ground speed as a crew reads it (mph and knots in US units). */
        const char *ground = w->us ? t_wind(w, hs) : t_speed(w, hs);
        if (hs > 0.0 && v[2] == 0.0)
            snprintf(vel, sizeof vel, "moving %s toward %s, level", ground,
                     t_bearing(w, heading));
        else if (hs > 0.0)
            snprintf(vel, sizeof vel, "moving %s toward %s, %s %s", ground,
                     t_bearing(w, heading), v[2] > 0.0 ? "climbing" : "sinking",
                     t_speed(w, fabs(v[2])));
        else
            snprintf(vel, sizeof vel, "moving straight %s at %s", v[2] > 0.0 ? "up" : "down",
                     t_speed(w, fabs(v[2])));
    }
    char pos[NUMBUF * 3] = "";
    if (s->release_m[0] != 0.0 || s->release_m[1] != 0.0)
        snprintf(pos, sizeof pos, ", %s and %s of the planned drop point",
                 t_offset(w, s->release_m[0], "east", "west"),
                 t_offset(w, s->release_m[1], "north", "south"));
    snprintf(buf, size, "%s above the strike level, %s%s", t_len(w, s->release_m[2]), vel, pos);
    w->exact = 0;
}

static void text_atmosphere(writer *w, const plumb_atm_spec *a, char *buf, size_t size)
{
    char what[NUMBUF * 4];
    switch (a->model) {
    case PLUMB_ATM_SURFACE:
        w->exact = 1;
        snprintf(what, sizeof what, "surface: station %s, %s, lapse rate %s" NBSP "K/km",
                 t_press(w, a->station_pressure_pa), t_temp(w, a->station_temperature_k),
                 gnum(w, a->lapse_rate_k_m * 1000.0, INPUT_SIG));
        w->exact = 0;
        break;
    case PLUMB_ATM_TABLE:
        snprintf(what, sizeof what, "table of %zu densities by altitude%s", a->table_n,
                 a->table_t_k ? " with temperatures"
                              : "; temperature (for viscosity and the speed of sound) from "
                                "the 1976 model with the offset");
        break;
    default:
        if (a->temperature_offset_k != 0.0 && w->us)
            snprintf(what, sizeof what,
                     "U.S. Standard Atmosphere 1976, temperature offset %s%s" NBSP "°F (%s"
                     NBSP "K)", a->temperature_offset_k > 0.0 ? "+" : "",
                     gnum(w, a->temperature_offset_k * FAHRENHEIT_PER_K, 3),
                     gnum(w, a->temperature_offset_k, 3));
        else if (a->temperature_offset_k != 0.0)
            snprintf(what, sizeof what,
                     "U.S. Standard Atmosphere 1976, temperature offset %s%s" NBSP "K",
                     a->temperature_offset_k > 0.0 ? "+" : "",
                     gnum(w, a->temperature_offset_k, 3));
        else
            snprintf(what, sizeof what, "U.S. Standard Atmosphere 1976");
        break;
    }
    if (a->relative_humidity > 0.0)
        snprintf(buf, size, "%s, relative humidity %s" NBSP "%%", what,
                 gnum(w, a->relative_humidity * 100.0, 3));
    else
        snprintf(buf, size, "%s, dry", what);
}

static void text_air_line(writer *w, const char *lead, const plumb_air *a)
{
    char line[NUMBUF * 6];
    snprintf(line, sizeof line, "%s, %s, %s", t_temp(w, a->t_k), t_press(w, a->p_pa),
             t_density(w, a->rho_kg_m3));
    wrapped(w, lead, line);
}

static void text_wind(writer *w, const plumb_fall_spec *s, const item_air *ia, char *buf,
                      size_t size)
{
    const plumb_wind_spec *wd = &s->wind;
    char at_release[NUMBUF * 3];
    snprintf(at_release, sizeof at_release, "%s from %s at the release height",
             t_wind(w, ia->wind_release[0]), t_bearing(w, ia->wind_release[1]));
    w->exact = 1;
    switch (wd->profile) {
    case PLUMB_WIND_POWER:
        snprintf(buf, size, "%s from %s at %s, power law exponent %s; %s",
                 t_wind(w, wd->speed_m_s), t_bearing(w, wd->from_deg),
                 t_len(w, wd->ref_height_m), gnum(w, wd->exponent, INPUT_SIG), at_release);
        break;
    case PLUMB_WIND_LOG:
        snprintf(buf, size, "%s from %s at %s, log law roughness %s; %s",
                 t_wind(w, wd->speed_m_s), t_bearing(w, wd->from_deg),
                 t_len(w, wd->ref_height_m), t_len(w, wd->roughness_m), at_release);
        break;
    case PLUMB_WIND_TABLE: {
        /* The rows themselves when they are few enough to read. */
        size_t len = (size_t)snprintf(buf, size, "table:");
        for (size_t i = 0; i < wd->table_n && len < size; i++) {
            double sp, from;
            wind_polar(wd->table_east_m_s[i], wd->table_north_m_s[i], &sp, &from);
            if (wd->table_n > WIND_ROWS_SHOWN) {
                len += (size_t)snprintf(buf + len, size - len, " %zu heights;", wd->table_n);
                break;
            }
            len += (size_t)snprintf(buf + len, size - len, " %s from %s at %s;",
                                    t_wind(w, sp), t_bearing(w, from),
                                    t_len(w, wd->table_h_m[i]));
        }
        if (len < size)
            snprintf(buf + len, size - len, " %s", at_release);
        break;
    }
    default:
        if (wd->speed_m_s == 0.0)
            snprintf(buf, size, "calm");
        else
            snprintf(buf, size, "%s from %s at every height", t_wind(w, wd->speed_m_s),
                     t_bearing(w, wd->from_deg));
        break;
    }
    w->exact = 0;
}

static void text_site(writer *w, const plumb_fall_spec *s, const item_air *ia, char *buf,
                      size_t size)
{
    char g[NUMBUF * 2];
    if (s->gravity.has_latitude)
        snprintf(g, sizeof g, "latitude %s°, WGS" NBSP "84 gravity %s" NBSP "m/s²",
                 gnum(w, s->gravity.latitude_deg, 6), fixed(w, ia->g_m_s2, 5));
    else
        snprintf(g, sizeof g, "standard gravity %s" NBSP "m/s²", fixed(w, ia->g_m_s2, 5));
    w->exact = 1;
    snprintf(buf, size, "strike level %s above mean sea level; %s",
             t_len(w, s->site_elevation_m), g);
    w->exact = 0;
}

/* Inputs of one item as understood (payload lines only when `payload`). */
static void text_inputs(writer *w, const plumb_item_report *it, const plumb_profile *p,
                        const item_air *ia, int payload)
{
    const plumb_fall_spec *s = it->spec;
    char line[PLUMB_DRAG_SOURCE + NUMBUF * 8];
    if (payload) {
        char mass[NUMBUF * 3];
        w->exact = 1;
        snprintf(mass, sizeof mass, "%s%s", t_mass(w, s->mass_kg),
                 s->volume_m3 > 0.0 ? ", buoyancy included" : "");
        w->exact = 0;
        wrapped(w, "  mass        ", mass);
        text_drag(w, it, line, sizeof line);
        wrapped(w, "  drag        ", line);
    }
    text_release(w, s, line, sizeof line);
    wrapped(w, "  release     ", line);
    text_site(w, s, ia, line, sizeof line);
    wrapped(w, "  site        ", line);
    text_atmosphere(w, plumb_profile_atmosphere(p), line, sizeof line);
    wrapped(w, "  atmosphere  ", line);
    text_air_line(w, "  air         strike level  ", &ia->at[0]);
    text_air_line(w, "              release       ", &ia->at[1]);
    text_wind(w, s, ia, line, sizeof line);
    wrapped(w, "  wind        ", line);
}

static void text_solver(writer *w, const plumb_item_report *it)
{
    const plumb_solver_stats *st = &it->result.solver;
    put(w, "  solver      %s, %zu steps, %zu right-hand-side evaluations\n",
        st->method ? st->method : "unknown", st->steps, st->rhs_evaluations);
}

static void text_profile(writer *w, const plumb_profile *p)
{
    put(w, "\nProfile  %s\nSHA-256  %s\n", plumb_profile_path(p), plumb_profile_sha256(p));
}

static void text_single(writer *w, const plumb_report_options *opt,
                        const plumb_fall_report *rep, const item_air *ia)
{
    const plumb_item_report *it = &rep->items[0];
    text_header(w, opt, "fall", plumb_profile_name(rep->profile));
    text_impact(w, it);
    text_verdicts(w, it);
    text_comparison(w, it);
    text_descent(w, it, NULL);
    if (it->n_warnings) {
        put(w, "\nWarnings\n");
        for (size_t i = 0; i < it->n_warnings; i++)
            wrapped(w, "  - ", it->warnings[i]);
    }
    put(w, "\nInputs as understood\n");
    text_inputs(w, it, rep->profile, ia, 1);
    text_solver(w, it);
    text_profile(w, rep->profile);
    caution_lines_text(w);
}

/* ---- text: inventory ----------------------------------------------------- */

static void text_inventory(writer *w, const plumb_report_options *opt,
                           const plumb_fall_report *rep, const item_air *ia)
{
    const plumb_item_report *first = &rep->items[0];
    size_t nv = first->n_verdicts;
    text_header(w, opt, "fall, inventory", plumb_profile_name(rep->profile));
    put(w, "%zu items, each falling alone under the same release, site, air and wind.\n",
        rep->n_items);

    /* Column widths: item names, then fixed numeric columns, then one per criterion. */
    size_t name_w = strlen("item");
    for (size_t i = 0; i < rep->n_items; i++) {
        size_t n = shown_width(rep->items[i].spec->name);
        if (n > name_w)
            name_w = n;
    }
    enum { NUM_W = 10, CRIT_W = 14 };
    const char *u_mass = w->us ? "lb" : "kg", *u_speed = w->us ? "ft/s" : "m/s";
    const char *u_len = w->us ? "ft" : "m";
    put(w, "\n   # ");
    pad(w, "item", name_w, 0);
    const char *heads[] = {"mass", "speed", "energy", "energy", "drift"};
    for (size_t k = 0; k < 5; k++)
        pad(w, heads[k], NUM_W, 1);
    for (size_t k = 0; k < nv; k++) {
        char h[32];
        snprintf(h, sizeof h, "C%zu", k + 1);
        pad(w, h, CRIT_W, 1);
    }
    put(w, "\n     ");
    pad(w, "", name_w, 0);
    const char *units[] = {u_mass, u_speed, "J", "ft·lbf", u_len};
    for (size_t k = 0; k < 5; k++)
        pad(w, units[k], NUM_W, 1);
    for (size_t k = 0; k < nv; k++)
        pad(w, "ratio verdict", CRIT_W, 1);
    put(w, "\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_item_report *it = &rep->items[i];
        const plumb_fall_result *r = &it->result;
        put(w, "%4zu ", i + 1);
        pad(w, it->spec->name, name_w, 0);
        double conv_len = w->us ? PLUMB_FT_M : 1.0;
        pad(w, gnum(w, it->spec->mass_kg / (w->us ? PLUMB_LB_KG : 1.0), TEXT_SIG), NUM_W, 1);
        pad(w, num(w, r->speed_m_s / conv_len, TEXT_SIG), NUM_W, 1);
        pad(w, num(w, r->energy_j, TEXT_SIG), NUM_W, 1);
        pad(w, num(w, r->energy_j / PLUMB_FT_LBF_J, TEXT_SIG), NUM_W, 1);
        pad(w, fixed(w, r->drift_m / conv_len, 2), NUM_W, 1);
        for (size_t k = 0; k < nv; k++) {
            char cell[NUMBUF];
            snprintf(cell, sizeof cell, "%s %s", num(w, it->verdicts[k].ratio, RATIO_SIG),
                     it->verdicts[k].exceeds ? "EXCEEDS" : "within");
            pad(w, cell, CRIT_W, 1);
        }
        put(w, "\n");
    }

    if (nv) {
        put(w, "\nCriteria\n");
        for (size_t k = 0; k < nv; k++) {
            const plumb_criterion *c = first->verdicts[k].criterion;
            char lead[32], lim[NUMBUF * 2];
            char line[PLUMB_CRIT_TEXT * 2 + PLUMB_CRIT_ID + NUMBUF * 3];
            snprintf(lead, sizeof lead, "  C%zu  ", k + 1);
            text_limit(w, c, lim, sizeof lim);
            snprintf(line, sizeof line, "%s [%s]: %s%s; source: %s%s%s%s", c->name, c->id, lim,
                     c->kind == PLUMB_CRIT_HELMET_TEST ? " (helmet test, not a safe limit)" : "",
                     c->source[0] ? c->source : "not given", status_note(c)[0] ? " (" : "",
                     status_note(c), status_note(c)[0] ? ")" : "");
            wrapped(w, lead, line);
        }
    }

    size_t wi = worst_item(rep), di = largest_drift_item(rep);
    const plumb_item_report *worst = &rep->items[wi], *drift = &rep->items[di];
    char line[PLUMB_NAME + NUMBUF * 6];
    long sk = strictest(worst);
    if (sk >= 0)
        snprintf(line, sizeof line, "%s: %s at %s, %s times the strictest limit (C%ld, %s J): %s",
                 worst->spec->name, t_energy(w, worst->result.energy_j),
                 t_speed(w, worst->result.speed_m_s), num(w, worst->verdicts[sk].ratio, RATIO_SIG),
                 sk + 1, num(w, worst->verdicts[sk].criterion->energy_limit_j, TEXT_SIG),
                 verdict_word(&worst->verdicts[sk]));
    else
        snprintf(line, sizeof line, "%s: %s at %s", worst->spec->name,
                 t_energy(w, worst->result.energy_j), t_speed(w, worst->result.speed_m_s));
    put(w, "\n");
    wrapped(w, "Worst item     ", line);
    if (drift->result.drift_m < DRIFT_SHOWN_M)
        snprintf(line, sizeof line, "none: every item lands below the release point");
    else
        snprintf(line, sizeof line, "%s: %s toward %s", drift->spec->name,
                 t_len(w, drift->result.drift_m), t_bearing(w, drift->result.bearing_deg));
    wrapped(w, "Largest drift  ", line);

    for (size_t i = 0; i < rep->n_items; i++) {
        if (rep->items[i].spec->n_descent == 0)
            continue;
        text_descent(w, &rep->items[i], rep->items[i].spec->name);
    }

    int any_warning = 0;
    for (size_t i = 0; i < rep->n_items; i++)
        any_warning |= rep->items[i].n_warnings > 0;
    if (any_warning) {
        put(w, "\nWarnings\n");
        each_warning(w, rep, text_warning_line);
    }

    put(w, "\nInputs as understood\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_item_report *it = &rep->items[i];
        char lead[32], text[PLUMB_NAME + PLUMB_DRAG_SOURCE + NUMBUF * 10];
        char drag[PLUMB_DRAG_SOURCE + NUMBUF * 8];
        snprintf(lead, sizeof lead, "  %4zu  ", i + 1);
        text_drag(w, it, drag, sizeof drag);
        w->exact = 1;
        snprintf(text, sizeof text, "%s: %s%s; drag %s", it->spec->name,
                 t_mass(w, it->spec->mass_kg),
                 it->spec->volume_m3 > 0.0 ? ", buoyancy included" : "", drag);
        w->exact = 0;
        wrapped(w, lead, text);
    }
    text_inputs(w, first, rep->profile, ia, 0);
    size_t steps = 0, evals = 0;
    for (size_t i = 0; i < rep->n_items; i++) {
        steps += rep->items[i].result.solver.steps;
        evals += rep->items[i].result.solver.rhs_evaluations;
    }
    const char *method = first->result.solver.method;
    put(w, "  solver      %s, %zu steps, %zu right-hand-side evaluations in all\n",
        method ? method : "unknown", steps, evals);
    text_profile(w, rep->profile);
    caution_lines_text(w);
}

/* ---- CSV ----------------------------------------------------------------- */



static void csv_warning_line(writer *w, const char *who, const char *text)
{
    char line[PLUMB_NAME * 4 + PLUMB_WARNING + 16];
    snprintf(line, sizeof line, "warning: %s%s%s", who, who[0] ? ": " : "", text);
    csv_comment(w, line);
}

static void csv_cautions(writer *w)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    for (size_t i = 0; i < n; i++)
        csv_comment(w, c[i]);
}

/* The names of one item's columns, in US and SI units. */
static const char csv_item_cols_us[] =
    "name,mass_lb,time_s,speed_ft_s,speed_mph,energy_ft_lbf,energy_j,momentum_lbf_s,"
    "angle_deg,drift_ft,bearing_deg,east_ft,north_ft,terminal_speed_ft_s,apex_ft,"
    "drag_free_speed_ft_s,drag_free_energy_ft_lbf";
static const char csv_item_cols_si[] =
    "name,mass_kg,time_s,speed_m_s,energy_j,energy_ft_lbf,momentum_kg_m_s,"
    "angle_deg,drift_m,bearing_deg,east_m,north_m,terminal_speed_m_s,apex_m,"
    "drag_free_speed_m_s,drag_free_energy_j";

/* The header of one item's columns (after any leading columns the caller
 * wrote), the line left open; returns how many columns it names. */
static size_t csv_header_cols(writer *w, const plumb_item_report *first)
{
    char text[PLUMB_CRIT_ID + 16];
    const char *cols = w->us ? csv_item_cols_us : csv_item_cols_si;
    size_t n = 1;
    for (const char *c = cols; *c; c++)
        n += *c == ',';
    put(w, "%s", cols);
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const char *id = first->verdicts[k].criterion->id;
        put(w, ",");
        snprintf(text, sizeof text, "%s_ratio", id);
        csv_field(w, text);
        put(w, ",");
        snprintf(text, sizeof text, "%s_verdict", id);
        csv_field(w, text);
    }
    return n + 2 * first->n_verdicts;
}

/* The header of one item's columns, ending the line. */
static void csv_header(writer *w, const plumb_item_report *first)
{
    (void)csv_header_cols(w, first);
    put(w, "\n");
}

/* The bearing of the drift, empty when there is no drift to have one. */
static const char *csv_bearing(writer *w, const plumb_fall_result *r)
{
    return r->drift_m < DRIFT_SHOWN_M ? "" : csvnum(w, r->bearing_deg);
}

/* One item's columns, the line left open. */
static void csv_item_cols(writer *w, const plumb_item_report *it)
{
    const plumb_fall_result *r = &it->result;
    csv_field(w, it->spec->name);
    if (w->us) {
        double ft = PLUMB_FT_M;
        put(w, ",%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s",
            csvnum(w, it->spec->mass_kg / PLUMB_LB_KG), csvnum(w, r->time_s),
            csvnum(w, r->speed_m_s / ft), csvnum(w, r->speed_m_s / MPH_M_S),
            csvnum(w, r->energy_j / PLUMB_FT_LBF_J), csvnum(w, r->energy_j),
            csvnum(w, r->momentum_kg_m_s / LBF_N), csvnum(w, r->angle_deg),
            csvnum(w, r->drift_m / ft), csv_bearing(w, r),
            csvnum(w, r->point_m[0] / ft), csvnum(w, r->point_m[1] / ft),
            r->terminal_speed_m_s > 0.0 ? csvnum(w, r->terminal_speed_m_s / ft) : "");
        /* The ring holds RING numbers: the rest in a second call. */
        put(w, ",%s,%s,%s", csvnum(w, r->apex_m / ft), csvnum(w, r->drag_free_speed_m_s / ft),
            csvnum(w, r->drag_free_energy_j / PLUMB_FT_LBF_J));
    } else {
        put(w, ",%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s",
            csvnum(w, it->spec->mass_kg), csvnum(w, r->time_s), csvnum(w, r->speed_m_s),
            csvnum(w, r->energy_j), csvnum(w, r->energy_j / PLUMB_FT_LBF_J),
            csvnum(w, r->momentum_kg_m_s), csvnum(w, r->angle_deg), csvnum(w, r->drift_m),
            csv_bearing(w, r), csvnum(w, r->point_m[0]), csvnum(w, r->point_m[1]),
            r->terminal_speed_m_s > 0.0 ? csvnum(w, r->terminal_speed_m_s) : "");
        put(w, ",%s,%s,%s", csvnum(w, r->apex_m), csvnum(w, r->drag_free_speed_m_s),
            csvnum(w, r->drag_free_energy_j));
    }
    for (size_t k = 0; k < it->n_verdicts; k++)
        put(w, ",%s,%s", csvnum(w, it->verdicts[k].ratio), verdict_word(&it->verdicts[k]));
}

/* One item's columns, ending the row. */
static void csv_item_row(writer *w, const plumb_item_report *it)
{
    csv_item_cols(w, it);
    put(w, "\n");
}

static void csv_fall(writer *w, const plumb_fall_report *rep)
{
    const plumb_item_report *first = &rep->items[0];
    char text[PLUMB_CRIT_TEXT * 2 + PLUMB_DIAG_FILE + NUMBUF * 2];
    csv_cautions(w);
    snprintf(text, sizeof text, "profile: %s (%s), sha256 %s", plumb_profile_name(rep->profile),
             plumb_profile_path(rep->profile), plumb_profile_sha256(rep->profile));
    csv_comment(w, text);
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        snprintf(text, sizeof text, "criterion %s: %s, kind %s, limit %.*g J, source: %s, status %s",
                 c->id, c->name, crit_kind_name(c->kind), CSV_DIGITS, c->energy_limit_j,
                 c->source[0] ? c->source : "not given", c->status[0] ? c->status : "not given");
        csv_comment(w, text);
    }
    each_warning(w, rep, csv_warning_line);

    csv_header(w, first);
    for (size_t i = 0; i < rep->n_items; i++)
        csv_item_row(w, &rep->items[i]);
}

/* ---- JSON ----------------------------------------------------------------- */

static json_t *jvec(jctx *j, const double *x, size_t n)
{
    json_t *a = jarr(j);
    for (size_t i = 0; i < n; i++)
        jpush(j, a, jreal(j, x[i]));
    return a;
}

static json_t *j_air(jctx *j, const plumb_air *a)
{
    json_t *o = jobj(j);
    jset(j, o, "altitude_m", jreal(j, a->alt_m));
    jset(j, o, "temperature_k", jreal(j, a->t_k));
    jset(j, o, "pressure_pa", jreal(j, a->p_pa));
    jset(j, o, "density_kg_m3", jreal(j, a->rho_kg_m3));
    jset(j, o, "viscosity_pa_s", jreal(j, a->mu_pa_s));
    jset(j, o, "speed_of_sound_m_s", jreal(j, a->a_m_s));
    return o;
}

static json_t *j_impact(jctx *j, const plumb_fall_result *r)
{
    json_t *o = jobj(j);
    jset(j, o, "time_s", jreal(j, r->time_s));
    jset(j, o, "speed_m_s", jreal(j, r->speed_m_s));
    jset(j, o, "energy_j", jreal(j, r->energy_j));
    jset(j, o, "energy_ft_lbf", jreal(j, r->energy_j / PLUMB_FT_LBF_J));
    jset(j, o, "momentum_kg_m_s", jreal(j, r->momentum_kg_m_s));
    jset(j, o, "angle_deg", jreal(j, r->angle_deg));
    jset(j, o, "point_m", jvec(j, r->point_m, 2));
    jset(j, o, "drift_m", jreal(j, r->drift_m));
    jset(j, o, "bearing_deg", jreal(j, r->bearing_deg));
    jset(j, o, "velocity_m_s", jvec(j, r->velocity_m_s, 3));
    return o;
}

static json_t *j_criteria(jctx *j, const plumb_item_report *it)
{
    json_t *a = jarr(j);
    for (size_t i = 0; i < it->n_verdicts; i++) {
        const plumb_verdict *v = &it->verdicts[i];
        const plumb_criterion *c = v->criterion;
        json_t *o = jobj(j);
        jset(j, o, "name", jstr(j, c->name));
        jset(j, o, "id", jstr(j, c->id));
        jset(j, o, "source", jstr(j, c->source));
        jset(j, o, "kind", jstr(j, crit_kind_name(c->kind)));
        jset(j, o, "applies_to", jstr(j, c->applies_to));
        jset(j, o, "status", jstr(j, c->status));
        jset(j, o, "energy_limit_j", jreal(j, c->energy_limit_j));
        jset(j, o, "energy_j", jreal(j, v->energy_j));
        jset(j, o, "ratio", jreal(j, v->ratio));
        jset(j, o, "verdict", jstr(j, verdict_word(v)));
        jpush(j, a, o);
    }
    return a;
}

static json_t *j_descent(jctx *j, const plumb_item_report *it)
{
    const plumb_fall_spec *s = it->spec;
    const plumb_fall_result *r = &it->result;
    json_t *o = jobj(j);
    json_t *devs = jarr(j);
    for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        const plumb_descent_spec *d = &s->descent[i];
        json_t *dv = jobj(j);
        jset(j, dv, "kind", jstr(j, plumb_descent_kind_name(d->kind)));
        jset(j, dv, "cd", jreal(j, d->cd));
        jset(j, dv, "area_m2", jreal(j, d->area_m2));
        if (d->diameter_m > 0.0)
            jset(j, dv, "diameter_m", jreal(j, d->diameter_m));
        json_t *dep = jobj(j);
        if (d->trigger == PLUMB_DEPLOY_AFTER)
            jset(j, dep, "after_s", jreal(j, d->deploy_value));
        else
            jset(j, dep, "below_m", jreal(j, d->deploy_value));
        jset(j, dv, "deploy", dep);
        if (d->fill_constant > 0.0)
            jset(j, dv, "fill_constant", jreal(j, d->fill_constant));
        else
            jset(j, dv, "fill_time_s", jreal(j, d->fill_time_s));
        jset(j, dv, "deployed", json_boolean(i < r->n_deployed));
        if (i < r->n_deployed) {
            json_t *ls = jobj(j);
            jset(j, ls, "time_s", jreal(j, r->deploy_time_s[i]));
            jset(j, ls, "height_m", jreal(j, r->deploy_height_m[i]));
            jset(j, ls, "airspeed_m_s", jreal(j, r->deploy_speed_m_s[i]));
            jset(j, dv, "line_stretch", ls);
        } else {
            jset(j, dv, "line_stretch", json_null());
        }
        jpush(j, devs, dv);
    }
    jset(j, o, "devices", devs);
    jset(j, o, "peak_force_n", jreal(j, r->peak_force_n));
    jset(j, o, "peak_load_g", jreal(j, r->peak_load_g));
    jset(j, o, "steady_speed_m_s", jreal(j, r->steady_speed_m_s));
    return o;
}

static json_t *j_inputs(jctx *j, const plumb_item_report *it, const plumb_profile *p,
                        const item_air *ia)
{
    const plumb_fall_spec *s = it->spec;
    json_t *o = jobj(j);
    jset(j, o, "mass_kg", jreal(j, s->mass_kg));
    jset(j, o, "volume_m3", jreal(j, s->volume_m3));

    json_t *drag = jobj(j);
    const plumb_drag_spec *d = &s->drag;
    jset(j, drag, "model", jstr(j, drag_model_name(d->model)));
    if (d->model == PLUMB_DRAG_FIXED) {
        jset(j, drag, "cd", jreal(j, d->cd));
        jset(j, drag, "area_m2", jreal(j, d->area_m2));
        jset(j, drag, "cd_area_m2", jreal(j, body_cd_area(d)));
    } else {
        jset(j, drag, "diameter_m", jreal(j, d->diameter_m));
        jset(j, drag, "reynolds_min", jreal(j, it->result.min_re));
        jset(j, drag, "reynolds_max", jreal(j, it->result.max_re));
    }
    jset(j, drag, "source", jstr(j, d->source));
    jset(j, o, "drag", drag);
    if (it->shape && it->shape->kind != PLUMB_SHAPE_NONE) {
        json_t *sh = jobj(j);
        jset(j, sh, "kind", jstr(j, shape_kind_name(it->shape->kind)));
        size_t nd = it->shape->kind == PLUMB_SHAPE_SPHERE ? 1
                    : it->shape->kind == PLUMB_SHAPE_CYLINDER ? 2 : 3;
        jset(j, sh, "dims_m", jvec(j, it->shape->dims_m, nd));
        jset(j, sh, "attitude", jstr(j, attitude_name(it->shape->attitude)));
        jset(j, o, "shape", sh);
    }

    json_t *rel = jobj(j);
    jset(j, rel, "height_m", jreal(j, s->release_m[2]));
    jset(j, rel, "position_m", jvec(j, s->release_m, 2));
    jset(j, rel, "velocity_m_s", jvec(j, s->velocity_m_s, 3));
    jset(j, o, "release", rel);

    json_t *site = jobj(j);
    jset(j, site, "elevation_m", jreal(j, s->site_elevation_m));
    jset(j, site, "latitude_deg",
         s->gravity.has_latitude ? jreal(j, s->gravity.latitude_deg) : json_null());
    jset(j, site, "gravity_m_s2", jreal(j, ia->g_m_s2));
    jset(j, o, "site", site);

    const plumb_atm_spec *a = plumb_profile_atmosphere(p);
    json_t *atm = jobj(j);
    jset(j, atm, "model", jstr(j, atm_model_name(a->model)));
    if (a->model == PLUMB_ATM_SURFACE) {
        jset(j, atm, "pressure_pa", jreal(j, a->station_pressure_pa));
        jset(j, atm, "temperature_k", jreal(j, a->station_temperature_k));
        jset(j, atm, "lapse_rate_k_m", jreal(j, a->lapse_rate_k_m));
    } else {
        jset(j, atm, "temperature_offset_k", jreal(j, a->temperature_offset_k));
        if (a->model == PLUMB_ATM_TABLE)
            jset(j, atm, "table_rows", json_integer((json_int_t)a->table_n));
    }
    jset(j, atm, "relative_humidity", jreal(j, a->relative_humidity));
    jset(j, atm, "strike_level", j_air(j, &ia->at[0]));
    jset(j, atm, "release", j_air(j, &ia->at[1]));
    jset(j, o, "atmosphere", atm);

    const plumb_wind_spec *wd = &s->wind;
    json_t *wind = jobj(j);
    jset(j, wind, "profile", jstr(j, wind_profile_name(wd->profile)));
    if (wd->profile == PLUMB_WIND_TABLE) {
        json_t *rows = jarr(j);
        for (size_t i = 0; i < wd->table_n; i++) {
            json_t *row = jobj(j);
            double sp, from;
            wind_polar(wd->table_east_m_s[i], wd->table_north_m_s[i], &sp, &from);
            jset(j, row, "height_m", jreal(j, wd->table_h_m[i]));
            jset(j, row, "speed_m_s", jreal(j, sp));
            jset(j, row, "from_deg", jreal(j, from));
            jpush(j, rows, row);
        }
        jset(j, wind, "table", rows);
    } else {
        jset(j, wind, "speed_m_s", jreal(j, wd->speed_m_s));
        jset(j, wind, "from_deg", jreal(j, wd->from_deg));
        if (wd->profile != PLUMB_WIND_UNIFORM)
            jset(j, wind, "reference_height_m", jreal(j, wd->ref_height_m));
        if (wd->profile == PLUMB_WIND_POWER)
            jset(j, wind, "exponent", jreal(j, wd->exponent));
        if (wd->profile == PLUMB_WIND_LOG)
            jset(j, wind, "roughness_m", jreal(j, wd->roughness_m));
    }
    jset(j, wind, "at_release_speed_m_s", jreal(j, ia->wind_release[0]));
    jset(j, wind, "at_release_from_deg", jreal(j, ia->wind_release[1]));
    jset(j, o, "wind", wind);
    return o;
}

/* The per-fall keys of one item, into obj. */
static void j_item_into(jctx *j, json_t *o, const plumb_item_report *it, const plumb_profile *p,
                        const item_air *ia)
{
    const plumb_fall_result *r = &it->result;
    jset(j, o, "name", jstr(j, it->spec->name));
    jset(j, o, "impact", j_impact(j, r));
    /* null when there is no terminal speed (no drag, or buoyancy at least
     * the weight); never a made-up number */
    jset(j, o, "terminal_speed_m_s",
         r->terminal_speed_m_s > 0.0 ? jreal(j, r->terminal_speed_m_s) : json_null());
    jset(j, o, "apex_m", jreal(j, r->apex_m));
    json_t *df = jobj(j);
    jset(j, df, "speed_m_s", jreal(j, r->drag_free_speed_m_s));
    jset(j, df, "energy_j", jreal(j, r->drag_free_energy_j));
    jset(j, o, "drag_free", df);
    jset(j, o, "drag_work_j", jreal(j, r->drag_work_j));
    jset(j, o, "max_mach", jreal(j, r->max_mach));
    jset(j, o, "criteria", j_criteria(j, it));
    json_t *warn = jarr(j);
    for (size_t i = 0; i < it->n_warnings; i++)
        jpush(j, warn, jstr(j, it->warnings[i]));
    jset(j, o, "warnings", warn);
    json_t *sol = jobj(j);
    jset(j, sol, "method", jstr(j, r->solver.method ? r->solver.method : "unknown"));
    jset(j, sol, "rhs_evaluations", json_integer((json_int_t)r->solver.rhs_evaluations));
    jset(j, sol, "steps", json_integer((json_int_t)r->solver.steps));
    jset(j, o, "solver", sol);
    if (it->spec->n_descent > 0)
        jset(j, o, "descent", j_descent(j, it));
    jset(j, o, "inputs", j_inputs(j, it, p, ia));
}

static json_t *j_profile(jctx *j, const plumb_profile *p)
{
    json_t *o = jobj(j);
    jset(j, o, "path", jstr(j, plumb_profile_path(p)));
    jset(j, o, "name", jstr(j, plumb_profile_name(p)));
    jset(j, o, "sha256", jstr(j, plumb_profile_sha256(p)));
    return o;
}

static json_t *j_fall(jctx *j, const plumb_report_options *opt, const plumb_fall_report *rep,
                      const item_air *ia)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    if (!plumb_profile_is_inventory(rep->profile)) {
        j_item_into(j, root, &rep->items[0], rep->profile, &ia[0]);
    } else {
        json_t *items = jarr(j);
        for (size_t i = 0; i < rep->n_items; i++) {
            json_t *o = jobj(j);
            j_item_into(j, o, &rep->items[i], rep->profile, &ia[i]);
            jpush(j, items, o);
        }
        jset(j, root, "items", items);
        jset(j, root, "worst", jstr(j, rep->items[worst_item(rep)].spec->name));
        jset(j, root, "largest_drift", jstr(j, rep->items[largest_drift_item(rep)].spec->name));
    }
    jset(j, root, "profile", j_profile(j, rep->profile));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

/* ---- output: all or nothing ---------------------------------------------- */

/* Opens the memory stream a text or CSV report is made in. */
static plumb_status writer_open(writer *w, char **buf, size_t *len, plumb_unit_system units,
                                plumb_diag *diag)
{
    if (!writer_start(w, buf, len, units == PLUMB_UNITS_US))
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the report");
    return PLUMB_OK;
}

static plumb_status writer_close(writer *w, char **buf, size_t *len, FILE *out,
                                 plumb_diag *diag)
{
    int failed = !writer_finish(w, buf, len);
    plumb_status st = PLUMB_OK;
    if (w->bad)
        st = PLUMB_RAISE(diag, PLUMB_ENUMERIC, "a figure is not a finite number; no report "
                                               "written");
    else if (failed)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the report");
    else
        st = emit(out, *buf, *len, diag);
    free(*buf);
    *buf = NULL;
    return st;
}

static const plumb_report_options *opts_or_default(const plumb_report_options *opt,
                                                   plumb_report_options *def)
{
    if (opt)
        return opt;
    memset(def, 0, sizeof *def);
    def->format = PLUMB_FORMAT_TEXT;
    def->units = PLUMB_UNITS_SI;
    return def;
}

/* Checks a fall report and finds the air each item's text needs. On
 * success *ia (n_items entries) is the caller's to free. */
static plumb_status prepare_fall(const plumb_fall_report *rep, item_air **ia, plumb_diag *diag)
{
    *ia = NULL;
    if (!rep || !rep->profile || rep->n_items == 0 || !rep->items)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no fall report to write");
    for (size_t i = 0; i < rep->n_items; i++)
        if (!rep->items[i].spec)
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "item %zu has no fall spec", i + 1);
    plumb_status st = check_same_criteria(rep, diag);
    for (size_t i = 0; st == PLUMB_OK && i < rep->n_items; i++)
        st = check_item(&rep->items[i], diag);
    if (st != PLUMB_OK)
        return st;
    plumb_atmosphere *atm = NULL;
    st = plumb_atmosphere_alloc(plumb_profile_atmosphere(rep->profile), &atm, diag);
    if (st != PLUMB_OK)
        return st;
    *ia = calloc(rep->n_items, sizeof **ia);
    if (!*ia) {
        plumb_atmosphere_free(atm);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the report");
    }
    for (size_t i = 0; st == PLUMB_OK && i < rep->n_items; i++)
        st = air_for(rep->items[i].spec, atm, &(*ia)[i], diag);
    plumb_atmosphere_free(atm);
    if (st != PLUMB_OK) {
        free(*ia);
        *ia = NULL;
    }
    return st;
}

plumb_status plumb_report_fall(FILE *out, const plumb_report_options *opt,
                               const plumb_fall_report *rep, plumb_diag *diag)
{
    plumb_report_options def;
    opt = opts_or_default(opt, &def);
    if (!out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no stream to write to");
    item_air *ia = NULL;
    plumb_status st = prepare_fall(rep, &ia, diag);
    if (st == PLUMB_OK && opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        json_t *root = j_fall(&j, opt, rep, ia);
        st = emit_json(out, &j, root, diag);
    } else if (st == PLUMB_OK) {
        writer w;
        char *buf;
        size_t len;
        st = writer_open(&w, &buf, &len, opt->units, diag);
        if (st == PLUMB_OK) {
            if (opt->format == PLUMB_FORMAT_CSV)
                csv_fall(&w, rep);
            else if (plumb_profile_is_inventory(rep->profile))
                text_inventory(&w, opt, rep, ia);
            else
                text_single(&w, opt, rep, ia);
            st = writer_close(&w, &buf, &len, out, diag);
        }
    }
    free(ia);
    return st;
}

/* ---- air table --------------------------------------------------------- */

/* "U.S. Standard Atmosphere 1976, temperature offset +10 K, dry". */
static void air_model_text(writer *w, double dt_k, char *buf, size_t size)
{
    plumb_atm_spec a;
    plumb_atm_spec_init(&a);
    a.temperature_offset_k = dt_k;
    text_atmosphere(w, &a, buf, size);
    if (dt_k == 0.0) {
        size_t n = strlen(buf);
        snprintf(buf + n, size - n, "; no temperature offset");
    }
    for (char *p = buf; *p; p++)
        if (*p == NBSP_CHAR)
            *p = ' ';
}

static void text_air(writer *w, const plumb_report_options *opt, const plumb_air *rows,
                     size_t n, double dt_k)
{
    char model[NUMBUF * 5];
    text_header(w, opt, "air", "properties by geometric altitude above mean sea level");
    air_model_text(w, dt_k, model, sizeof model);
    put(w, "  %s\n", model);
    enum { COL_W = 14 };
    const char *heads[] = {"altitude", "temperature", "pressure", "density", "viscosity",
                           "sound speed"};
    const char *si[] = {"m", "K", "Pa", "kg/m³", "Pa·s", "m/s"};
    const char *us[] = {"ft", "°F", "inHg", "lb/ft³", "lbf·s/ft²", "ft/s"};
    put(w, "\n");
    for (size_t k = 0; k < 6; k++)
        pad(w, heads[k], COL_W, 1);
    put(w, "\n");
    for (size_t k = 0; k < 6; k++)
        pad(w, w->us ? us[k] : si[k], COL_W, 1);
    put(w, "\n");
    double ft = PLUMB_FT_M, ft2 = ft * ft, ft3 = ft2 * ft;
    for (size_t i = 0; i < n; i++) {
        const plumb_air *a = &rows[i];
        if (w->us) {
            pad(w, trimmed(w, a->alt_m / ft, 2), COL_W, 1);
            pad(w, fixed(w, a->t_k * FAHRENHEIT_PER_K - FAHRENHEIT_ZERO_OFFSET, 2), COL_W, 1);
            pad(w, num(w, a->p_pa / INHG_PA, 5), COL_W, 1);
            pad(w, num(w, a->rho_kg_m3 * ft3 / PLUMB_LB_KG, 5), COL_W, 1);
            pad(w, sci(w, a->mu_pa_s * ft2 / LBF_N, 5), COL_W, 1);
            pad(w, fixed(w, a->a_m_s / ft, 1), COL_W, 1);
        } else {
            pad(w, trimmed(w, a->alt_m, 3), COL_W, 1);
            pad(w, fixed(w, a->t_k, 3), COL_W, 1);
            pad(w, num(w, a->p_pa, 6), COL_W, 1);
            pad(w, num(w, a->rho_kg_m3, 5), COL_W, 1);
            pad(w, sci(w, a->mu_pa_s, 5), COL_W, 1);
            pad(w, fixed(w, a->a_m_s, 2), COL_W, 1);
        }
        put(w, "\n");
    }
    caution_lines_text(w);
}

static void csv_air(writer *w, const plumb_air *rows, size_t n, double dt_k)
{
    char model[NUMBUF * 5], line[NUMBUF * 6];
    csv_cautions(w);
    air_model_text(w, dt_k, model, sizeof model);
    snprintf(line, sizeof line, "model: %s", model);
    csv_comment(w, line);
    if (w->us)
        put(w, "altitude_ft,temperature_degf,pressure_inhg,density_lb_ft3,viscosity_lbf_s_ft2,"
               "speed_of_sound_ft_s\n");
    else
        put(w, "altitude_m,temperature_k,pressure_pa,density_kg_m3,viscosity_pa_s,"
               "speed_of_sound_m_s\n");
    double ft = PLUMB_FT_M, ft2 = ft * ft, ft3 = ft2 * ft;
    for (size_t i = 0; i < n; i++) {
        const plumb_air *a = &rows[i];
        if (w->us)
            put(w, "%s,%s,%s,%s,%s,%s\n", csvnum(w, a->alt_m / ft),
                csvnum(w, a->t_k * FAHRENHEIT_PER_K - FAHRENHEIT_ZERO_OFFSET),
                csvnum(w, a->p_pa / INHG_PA), csvnum(w, a->rho_kg_m3 * ft3 / PLUMB_LB_KG),
                csvnum(w, a->mu_pa_s * ft2 / LBF_N), csvnum(w, a->a_m_s / ft));
        else
            put(w, "%s,%s,%s,%s,%s,%s\n", csvnum(w, a->alt_m), csvnum(w, a->t_k),
                csvnum(w, a->p_pa), csvnum(w, a->rho_kg_m3), csvnum(w, a->mu_pa_s),
                csvnum(w, a->a_m_s));
    }
}

plumb_status plumb_report_air(FILE *out, const plumb_report_options *opt,
                              const plumb_air *rows, size_t n_rows, plumb_diag *diag)
{
    plumb_air_table t = {rows, n_rows, 0.0};
    return plumb_report_air_table(out, opt, &t, diag);
}

plumb_status plumb_report_air_table(FILE *out, const plumb_report_options *opt,
                                    const plumb_air_table *table, plumb_diag *diag)
{
    plumb_report_options def;
    opt = opts_or_default(opt, &def);
    if (!out || !table || (table->n_rows > 0 && !table->rows))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no air table to write");
    const plumb_air *rows = table->rows;
    size_t n_rows = table->n_rows;
    double dt_k = table->temperature_offset_k;
    if (!plumbp_finite(dt_k))
        return PLUMB_RAISE(diag, PLUMB_ENUMERIC, "the temperature offset is not a finite number");
    for (size_t i = 0; i < n_rows; i++) {
        finite_check fc = {diag, NULL, PLUMB_OK};
        need_finite(&fc, "altitude", rows[i].alt_m);
        need_finite(&fc, "air temperature", rows[i].t_k);
        need_finite(&fc, "air pressure", rows[i].p_pa);
        need_finite(&fc, "air density", rows[i].rho_kg_m3);
        need_finite(&fc, "air viscosity", rows[i].mu_pa_s);
        need_finite(&fc, "speed of sound", rows[i].a_m_s);
        if (fc.status != PLUMB_OK)
            return fc.status;
    }
    if (opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        json_t *root = jobj(&j);
        if (opt->version)
            jset(&j, root, "plumb_version", jstr(&j, opt->version));
        jset(&j, root, "model", jstr(&j, "standard-1976"));
        jset(&j, root, "temperature_offset_k", jreal(&j, dt_k));
        json_t *arr = jarr(&j);
        for (size_t i = 0; i < n_rows; i++)
            jpush(&j, arr, j_air(&j, &rows[i]));
        jset(&j, root, "rows", arr);
        jset(&j, root, "cautions", j_cautions(&j));
        return emit_json(out, &j, root, diag);
    }
    writer w;
    char *buf;
    size_t len;
    plumb_status st = writer_open(&w, &buf, &len, opt->units, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_CSV)
        csv_air(&w, rows, n_rows, dt_k);
    else
        text_air(&w, opt, rows, n_rows, dt_k);
    return writer_close(&w, &buf, &len, out, diag);
}

/* ---- sweep table --------------------------------------------------------- */

/* A value of dimension `dim` in the display units, number and unit apart. */
typedef struct shown {
    double x;
    const char *unit;
} shown;

static shown show_dim(const writer *w, plumb_dim dim, double si)
{
    double ft = PLUMB_FT_M;
    switch (dim) {
    case PLUMB_DIM_LENGTH:
        return w->us ? (shown){si / ft, "ft"} : (shown){si, "m"};
    case PLUMB_DIM_MASS:
        return w->us ? (shown){si / PLUMB_LB_KG, "lb"} : (shown){si, "kg"};
    case PLUMB_DIM_TIME:
        return (shown){si, "s"};
    case PLUMB_DIM_SPEED:
        return w->us ? (shown){si / ft, "ft/s"} : (shown){si, "m/s"};
    case PLUMB_DIM_AREA:
        return w->us ? (shown){si / (ft * ft), "ft²"} : (shown){si, "m²"};
    case PLUMB_DIM_VOLUME:
        return w->us ? (shown){si / (ft * ft * ft), "ft³"} : (shown){si, "m³"};
    case PLUMB_DIM_ENERGY:
        return w->us ? (shown){si / PLUMB_FT_LBF_J, "ft·lbf"} : (shown){si, "J"};
    case PLUMB_DIM_FORCE:
        return w->us ? (shown){si / LBF_N, "lbf"} : (shown){si, "N"};
    case PLUMB_DIM_ANGLE:
        return (shown){si, "°"};
    case PLUMB_DIM_TEMPERATURE:
        return w->us ? (shown){si * FAHRENHEIT_PER_K - FAHRENHEIT_ZERO_OFFSET, "°F"}
                     : (shown){si, "K"};
    case PLUMB_DIM_TEMP_DIFF:
        return w->us ? (shown){si * FAHRENHEIT_PER_K, "°F"} : (shown){si, "K"};
    case PLUMB_DIM_PRESSURE:
        return w->us ? (shown){si / INHG_PA, "inHg"} : (shown){si / HPA_PA, "hPa"};
    case PLUMB_DIM_DENSITY:
        return w->us ? (shown){si * ft * ft * ft / PLUMB_LB_KG, "lb/ft³"} : (shown){si, "kg/m³"};
    case PLUMB_DIM_LAPSE:
        return (shown){si * 1000.0, "K/km"};
    case PLUMB_DIM_FRACTION:
    case PLUMB_DIM_NONE:
    default:
        return (shown){si, ""};
    }
}

/* Numeric columns of a sweep row, and the spaces between columns. */
enum { SWEEP_NUM_COLS = 6, SWEEP_GAP = 2, SWEEP_KEY_COL = 15 };

/* "C1".."Cn" legend of the criteria a row was judged against. */
static void text_criteria_legend(writer *w, const plumb_item_report *first)
{
    if (first->n_verdicts == 0)
        return;
    put(w, "\nCriteria (ratio = energy / limit)\n");
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        char lead[32], text[PLUMB_CRIT_TEXT * 2 + PLUMB_CRIT_ID + NUMBUF + 64];
        snprintf(lead, sizeof lead, "  C%zu  ", k + 1);
        snprintf(text, sizeof text, "%s, limit %s%s; %s [%s]%s%s%s", c->name,
                 t_energy(w, c->energy_limit_j),
                 c->kind == PLUMB_CRIT_HELMET_TEST ? " (helmet test, not a safe limit)" : "",
                 c->source[0] ? c->source : "source not given", c->id,
                 status_note(c)[0] ? " (" : "", status_note(c), status_note(c)[0] ? ")" : "");
        wrapped(w, lead, text);
    }
}

/* A ratio with its verdict beside it, "1.00 EXCEEDS" / "0.997 within", so
 * that a ratio rounded to 1.00 still shows which side of the limit it is. */
static const char *ratio_cell(writer *w, const plumb_verdict *v)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s %s", num(w, v->ratio, RATIO_SIG), v->exceeds ? "EXCEEDS" : "within");
    return b;
}

/* The figure of numeric column k of a sweep row (speed, energy in the
 * display unit, energy in the other, time, drift, bearing). A fall with no
 * drift has no bearing. */
static const char *sweep_num_cell(writer *w, const plumb_item_report *item, int k)
{
    const plumb_fall_result *r = &item->result;
    double ft = PLUMB_FT_M;
    switch (k) {
    case 0:
        return num(w, w->us ? r->speed_m_s / ft : r->speed_m_s, TEXT_SIG);
    case 1:
        return num(w, w->us ? r->energy_j / PLUMB_FT_LBF_J : r->energy_j, TEXT_SIG);
    case 2:
        return num(w, w->us ? r->energy_j : r->energy_j / PLUMB_FT_LBF_J, TEXT_SIG);
    case 3:
        return num(w, r->time_s, TEXT_SIG);
    case 4:
        return r->drift_m < DRIFT_SHOWN_M ? "0" : num(w, w->us ? r->drift_m / ft : r->drift_m,
                                                     TEXT_SIG);
    default:
        return r->drift_m < DRIFT_SHOWN_M ? "-" : fixed(w, r->bearing_deg, 0);
    }
}

/* Calls fn once for each distinct warning of any row and item of a sweep,
 * with the number of rows it appears in. */
static void each_sweep_warning(writer *w, const plumb_sweep *sw,
                               void (*fn)(writer *w, const char *text, size_t rows, size_t of))
{
    size_t nr = plumb_sweep_row_count(sw);
    for (size_t i = 0; i < nr; i++) {
        const plumb_fall_report *rep = &plumb_sweep_row_at(sw, i)->report;
        for (size_t it = 0; it < rep->n_items; it++) {
            const plumb_item_report *item = &rep->items[it];
            for (size_t k = 0; k < item->n_warnings; k++) {
                const char *text = item->warnings[k];
                int seen = 0; /* already reported from an earlier row or item */
                for (size_t j = 0; j <= i && !seen; j++) {
                    const plumb_fall_report *rj = &plumb_sweep_row_at(sw, j)->report;
                    size_t last = j < i ? rj->n_items : it;
                    for (size_t t = 0; t < last && !seen; t++)
                        seen = item_has_warning(&rj->items[t], text);
                }
                if (seen)
                    continue;
                size_t rows = 0;
                for (size_t j = 0; j < nr; j++) {
                    const plumb_fall_report *rj = &plumb_sweep_row_at(sw, j)->report;
                    int in = 0;
                    for (size_t t = 0; t < rj->n_items && !in; t++)
                        in = item_has_warning(&rj->items[t], text);
                    rows += (size_t)in;
                }
                fn(w, text, rows, nr);
            }
        }
    }
}

static void text_sweep_warning(writer *w, const char *text, size_t rows, size_t of)
{
    char line[PLUMB_WARNING + 64];
    snprintf(line, sizeof line, "%s (%zu of %zu rows)", text, rows, of);
    wrapped(w, "  - ", line);
}

static void csv_sweep_warning(writer *w, const char *text, size_t rows, size_t of)
{
    char line[PLUMB_WARNING + 64];
    snprintf(line, sizeof line, "warning: %s (%zu of %zu rows)", text, rows, of);
    csv_comment(w, line);
}

static int sweep_has_warnings(const plumb_sweep *sw)
{
    for (size_t i = 0; i < plumb_sweep_row_count(sw); i++) {
        const plumb_fall_report *rep = &plumb_sweep_row_at(sw, i)->report;
        for (size_t it = 0; it < rep->n_items; it++)
            if (rep->items[it].n_warnings)
                return 1;
    }
    return 0;
}

/* The first row with figures (plumb_sweep_run fails when there is none). */
static const plumb_sweep_row *first_computed_row(const plumb_sweep *sw)
{
    for (size_t i = 0; i < plumb_sweep_row_count(sw); i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status == PLUMB_OK && row->report.n_items > 0)
            return row;
    }
    return NULL;
}

/* "release.height = 0 m, wind.speed = 5 kn": the values of a row, in b. */
enum { ROW_VALUES = PLUMB_MAX_AXES * (PLUMB_DIAG_KEY + PLUMB_UNIT_TEXT + NUMBUF) };
static void row_values(writer *w, const plumb_sweep *sw, const plumb_sweep_row *row, char *b,
                       size_t size)
{
    b[0] = '\0';
    for (size_t a = 0; a < plumb_sweep_axis_count(sw); a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        size_t len = strlen(b);
        snprintf(b + len, size - len, "%s%s = %s%s%s", a ? ", " : "", ax->key,
                 gnum(w, row->value[a], 10), ax->unit[0] ? " " : "", unit_shown(w, ax->unit));
    }
}

/* The diagnostic of a row that has no figures, as one line. */
static void row_error_text(const plumb_sweep_row *row, char *buf, size_t size)
{
    plumb_diag_format(&row->error, buf, size);
}

static void text_sweep(writer *w, const plumb_report_options *opt, const plumb_sweep *sw)
{
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    const plumb_sweep_row *r0 = first_computed_row(sw);
    const plumb_profile *p = r0->report.profile;
    int inv = plumb_profile_is_inventory(p);
    const plumb_item_report *first = &r0->report.items[0];
    text_header(w, opt, "sweep", plumb_profile_name(p));
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        double last = plumb_range_value(ax, ax->n - 1);
        const char *u = unit_shown(w, ax->unit);
        put(w, "  %s %s from %s to %s%s%s in steps of %s%s%s (%zu values)%s%s\n",
            a ? "and" : "over", ax->key, gnum(w, ax->from, 10), gnum(w, last, 10),
            u[0] ? " " : "", u, gnum(w, ax->step, 10), u[0] ? " " : "", u, ax->n,
            last != ax->to ? "; the steps stop short of " : "",
            last != ax->to ? gnum(w, ax->to, 10) : "");
    }
    put(w, "\n");
    /* Column widths: the widest header, unit or cell of each, so that no
     * two figures ever touch and a one-criterion table stays narrow. */
    size_t nv = first->n_verdicts;
    size_t wkey[PLUMB_MAX_AXES], wnum[SWEEP_NUM_COLS], wcrit[PLUMB_MAX_VERDICTS];
    const char *heads[SWEEP_NUM_COLS] = {"speed", "energy", "energy", "time", "drift", "bearing"};
    const char *units_si[SWEEP_NUM_COLS] = {"m/s", "J", "ft·lbf", "s", "m", "deg"};
    const char *units_us[SWEEP_NUM_COLS] = {"ft/s", "ft·lbf", "J", "s", "ft", "deg"};
    const char *const *units = w->us ? units_us : units_si;
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        wkey[a] = shown_width(ax->key);
        if (shown_width(unit_shown(w, ax->unit)) > wkey[a])
            wkey[a] = shown_width(unit_shown(w, ax->unit));
    }
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        wnum[k] = shown_width(heads[k]) > shown_width(units[k]) ? shown_width(heads[k])
                                                                : shown_width(units[k]);
    for (size_t k = 0; k < nv; k++)
        wcrit[k] = shown_width("ratio verdict");
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        for (size_t a = 0; a < na; a++)
            if (shown_width(gnum(w, row->value[a], 8)) > wkey[a])
                wkey[a] = shown_width(gnum(w, row->value[a], 8));
        for (size_t it = 0; it < row->report.n_items; it++) {
            const plumb_item_report *item = &row->report.items[it];
            for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
                if (shown_width(sweep_num_cell(w, item, (int)k)) > wnum[k])
                    wnum[k] = shown_width(sweep_num_cell(w, item, (int)k));
            for (size_t k = 0; k < nv && k < item->n_verdicts; k++)
                if (shown_width(ratio_cell(w, &item->verdicts[k])) > wcrit[k])
                    wcrit[k] = shown_width(ratio_cell(w, &item->verdicts[k]));
        }
    }
    for (size_t a = 0; a < na; a++)
        pad(w, plumb_sweep_axis(sw, a)->key, wkey[a] + (a ? SWEEP_GAP : 1), 1);
    if (inv)
        put(w, "  %-18s", "item");
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        pad(w, heads[k], wnum[k] + SWEEP_GAP, 1);
    for (size_t k = 0; k < nv; k++) {
        char c[32];
        snprintf(c, sizeof c, "C%zu", k + 1);
        pad(w, c, wcrit[k] + SWEEP_GAP, 1);
    }
    put(w, "\n");
    for (size_t a = 0; a < na; a++)
        pad(w, unit_shown(w, plumb_sweep_axis(sw, a)->unit), wkey[a] + (a ? SWEEP_GAP : 1), 1);
    if (inv)
        put(w, "  %-18s", "");
    for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
        pad(w, units[k], wnum[k] + SWEEP_GAP, 1);
    for (size_t k = 0; k < nv; k++)
        pad(w, "ratio verdict", wcrit[k] + SWEEP_GAP, 1);
    put(w, "\n");
    size_t n_failed = 0;
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status != PLUMB_OK) {
            for (size_t a = 0; a < na; a++)
                pad(w, gnum(w, row->value[a], 8), wkey[a] + (a ? SWEEP_GAP : 1), 1);
            put(w, "  not computed, see (%zu) below\n", ++n_failed);
            continue;
        }
        for (size_t it = 0; it < row->report.n_items; it++) {
            const plumb_item_report *item = &row->report.items[it];
            for (size_t a = 0; a < na; a++)
                pad(w, it == 0 ? gnum(w, row->value[a], 8) : "", wkey[a] + (a ? SWEEP_GAP : 1), 1);
            if (inv) {
                char name[PLUMB_NAME + 4];
                if (shown_width(item->spec->name) > 18)
                    snprintf(name, sizeof name, "%.17s~", item->spec->name);
                else
                    snprintf(name, sizeof name, "%s", item->spec->name);
                put(w, "  %-18s", name);
            }
            for (size_t k = 0; k < SWEEP_NUM_COLS; k++)
                pad(w, sweep_num_cell(w, item, (int)k), wnum[k] + SWEEP_GAP, 1);
            for (size_t k = 0; k < item->n_verdicts; k++)
                pad(w, ratio_cell(w, &item->verdicts[k]), wcrit[k] + SWEEP_GAP, 1);
            put(w, "\n");
        }
    }
    if (na == 2) {
        /* the energy of the worst item, as a matrix */
        const plumb_range *a0 = plumb_sweep_axis(sw, 0), *a1 = plumb_sweep_axis(sw, 1);
        put(w, "\nImpact energy (%s%s) by %s (down) and %s (across); ! = a criterion exceeded%s\n",
            w->us ? "ft·lbf" : "J", inv ? ", worst item" : "", a0->key, a1->key,
            n_failed ? ", - = not computed" : "");
        pad(w, "", SWEEP_KEY_COL, 1);
        for (size_t j = 0; j < a1->n; j++)
            pad(w, gnum(w, plumb_range_value(a1, j), 6), 9, 1);
        put(w, "\n");
        for (size_t i = 0; i < a0->n; i++) {
            pad(w, gnum(w, plumb_range_value(a0, i), 8), SWEEP_KEY_COL, 1);
            for (size_t j = 0; j < a1->n; j++) {
                const plumb_sweep_row *row = plumb_sweep_row_at(sw, i * a1->n + j);
                if (row->status != PLUMB_OK) {
                    pad(w, "-", 9, 1);
                    continue;
                }
                double e = 0.0;
                int ex = 0;
                for (size_t it = 0; it < row->report.n_items; it++) {
                    const plumb_item_report *item = &row->report.items[it];
                    if (item->result.energy_j > e)
                        e = item->result.energy_j;
                    for (size_t k = 0; k < item->n_verdicts; k++)
                        ex |= item->verdicts[k].exceeds;
                }
                char cell[NUMBUF + 2];
                snprintf(cell, sizeof cell, "%s%s", num(w, w->us ? e / PLUMB_FT_LBF_J : e, 4),
                         ex ? "!" : "");
                pad(w, cell, 9, 1);
            }
            put(w, "\n");
        }
    }
    if (n_failed) {
        put(w, "\nRows not computed (%zu of %zu)\n", n_failed, nr);
        size_t k = 0;
        for (size_t i = 0; i < nr; i++) {
            const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
            if (row->status == PLUMB_OK)
                continue;
            char lead[32], why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            char vals[ROW_VALUES], text[sizeof why + sizeof vals + 8];
            snprintf(lead, sizeof lead, "  (%zu) ", ++k);
            row_error_text(row, why, sizeof why);
            row_values(w, sw, row, vals, sizeof vals);
            snprintf(text, sizeof text, "%s: %s", vals, why);
            wrapped(w, lead, text);
        }
    }
    text_criteria_legend(w, first);
    if (sweep_has_warnings(sw)) {
        put(w, "\nWarnings\n");
        each_sweep_warning(w, sw, text_sweep_warning);
    }
    put(w, "\nEach row is exactly what `plumb fall` gives with --set at that value.\n");
    text_profile(w, p);
    caution_lines_text(w);
}

static void csv_sweep(writer *w, const plumb_sweep *sw)
{
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    const plumb_sweep_row *r0 = first_computed_row(sw);
    const plumb_profile *p = r0->report.profile;
    char text[PLUMB_CRIT_TEXT * 2 + PLUMB_DIAG_FILE + NUMBUF * 2];
    csv_cautions(w);
    snprintf(text, sizeof text, "profile: %s (%s), sha256 %s", plumb_profile_name(p),
             plumb_profile_path(p), plumb_profile_sha256(p));
    csv_comment(w, text);
    const plumb_item_report *first = &r0->report.items[0];
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        snprintf(text, sizeof text, "criterion %s: %s, limit %.*g J, source: %s, status %s", c->id,
                 c->name, CSV_DIGITS, c->energy_limit_j, c->source[0] ? c->source : "not given",
                 c->status[0] ? c->status : "not given");
        csv_comment(w, text);
    }
    each_sweep_warning(w, sw, csv_sweep_warning);
    if (plumb_sweep_failed_count(sw) > 0) {
        snprintf(text, sizeof text, "%zu of %zu rows could not be computed: their figures are "
                 "empty and the last column says why", plumb_sweep_failed_count(sw), nr);
        csv_comment(w, text);
    }
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        snprintf(text, sizeof text, "%s%s%s", ax->key, ax->unit[0] ? " " : "",
                 unit_shown(w, ax->unit));
        csv_field(w, text);
        put(w, ",");
    }
    size_t n_cols = csv_header_cols(w, first);
    put(w, ",error\n");
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        if (row->status != PLUMB_OK) {
            char why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            for (size_t a = 0; a < na; a++)
                put(w, "%s,", csvnum(w, row->value[a]));
            for (size_t c = 0; c < n_cols; c++)
                put(w, ",");
            row_error_text(row, why, sizeof why);
            csv_field(w, why);
            put(w, "\n");
            continue;
        }
        for (size_t it = 0; it < row->report.n_items; it++) {
            for (size_t a = 0; a < na; a++)
                put(w, "%s,", csvnum(w, row->value[a]));
            csv_item_cols(w, &row->report.items[it]);
            put(w, ",\n");
        }
    }
}

static json_t *j_sweep(jctx *j, const plumb_report_options *opt, const plumb_sweep *sw,
                       item_air *const *ia)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    size_t na = plumb_sweep_axis_count(sw), nr = plumb_sweep_row_count(sw);
    json_t *vary = jarr(j);
    for (size_t a = 0; a < na; a++) {
        const plumb_range *ax = plumb_sweep_axis(sw, a);
        json_t *o = jobj(j);
        jset(j, o, "key", jstr(j, ax->key));
        jset(j, o, "unit", jstr(j, ax->unit));
        jset(j, o, "from", jreal(j, ax->from));
        jset(j, o, "to", jreal(j, ax->to));
        jset(j, o, "step", jreal(j, ax->step));
        jset(j, o, "count", json_integer((json_int_t)ax->n));
        jpush(j, vary, o);
    }
    jset(j, root, "vary", vary);
    jset(j, root, "failed_rows", jint(j, plumb_sweep_failed_count(sw)));
    json_t *rows = jarr(j);
    for (size_t i = 0; i < nr; i++) {
        const plumb_sweep_row *row = plumb_sweep_row_at(sw, i);
        const plumb_fall_report *rep = &row->report;
        json_t *o = jobj(j);
        json_t *vals = jobj(j), *vals_si = jobj(j);
        for (size_t a = 0; a < na; a++) {
            jset(j, vals, plumb_sweep_axis(sw, a)->key, jreal(j, row->value[a]));
            jset(j, vals_si, plumb_sweep_axis(sw, a)->key, jreal(j, row->value_si[a]));
        }
        jset(j, o, "values_as_given", vals); /* in each range's unit, see "vary" */
        jset(j, o, "values_si", vals_si);
        if (row->status != PLUMB_OK) {
            /* no figures: why, as the command line would print it */
            char why[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 16];
            row_error_text(row, why, sizeof why);
            json_t *e = jobj(j);
            jset(j, e, "message", jstr(j, why));
            jset(j, e, "kind", jstr(j, plumb_strerror(row->status)));
            jset(j, e, "computation_failed",
                 json_boolean(!plumb_status_is_input_error(row->status)));
            jset(j, o, "error", e);
            jpush(j, rows, o);
            continue;
        }
        if (!plumb_profile_is_inventory(rep->profile)) {
            j_item_into(j, o, &rep->items[0], rep->profile, &ia[i][0]);
        } else {
            json_t *items = jarr(j);
            for (size_t it = 0; it < rep->n_items; it++) {
                json_t *io = jobj(j);
                j_item_into(j, io, &rep->items[it], rep->profile, &ia[i][it]);
                jpush(j, items, io);
            }
            jset(j, o, "items", items);
            jset(j, o, "worst", jstr(j, rep->items[worst_item(rep)].spec->name));
            jset(j, o, "largest_drift", jstr(j, rep->items[largest_drift_item(rep)].spec->name));
        }
        jpush(j, rows, o);
    }
    jset(j, root, "rows", rows);
    jset(j, root, "profile", j_profile(j, first_computed_row(sw)->report.profile));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

plumb_status plumb_report_sweep(FILE *out, const plumb_report_options *opt,
                                const plumb_sweep *sw, plumb_diag *diag)
{
    plumb_report_options def;
    opt = opts_or_default(opt, &def);
    if (!out || !sw || plumb_sweep_row_count(sw) == 0 || !first_computed_row(sw))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no sweep to write");
    size_t nr = plumb_sweep_row_count(sw);
    item_air **ia = calloc(nr, sizeof *ia);
    if (!ia)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the report");
    plumb_status st = PLUMB_OK;
    for (size_t i = 0; st == PLUMB_OK && i < nr; i++)
        if (plumb_sweep_row_at(sw, i)->status == PLUMB_OK)
            st = prepare_fall(&plumb_sweep_row_at(sw, i)->report, &ia[i], diag);
    if (st == PLUMB_OK && opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        st = emit_json(out, &j, j_sweep(&j, opt, sw, ia), diag);
    } else if (st == PLUMB_OK) {
        writer w;
        char *buf;
        size_t len;
        st = writer_open(&w, &buf, &len, opt->units, diag);
        if (st == PLUMB_OK) {
            if (opt->format == PLUMB_FORMAT_CSV)
                csv_sweep(&w, sw);
            else
                text_sweep(&w, opt, sw);
            st = writer_close(&w, &buf, &len, out, diag);
        }
    }
    for (size_t i = 0; i < nr; i++)
        free(ia[i]);
    free(ia);
    return st;
}

/* ---- limit answer ------------------------------------------------------- */

static const char *metric_word(plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? "impact speed" : m == PLUMB_METRIC_DRIFT ? "drift"
                                                                              : "impact energy";
}

static const char *metric_key(plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? "speed_max_m_s" : m == PLUMB_METRIC_DRIFT ? "drift_max_m"
                                                                               : "energy_max_j";
}

static const char *metric_stem(plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? "speed" : m == PLUMB_METRIC_DRIFT ? "drift" : "energy";
}

static const char *metric_unit_key(plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? "m_s" : m == PLUMB_METRIC_DRIFT ? "m" : "j";
}

static const char *t_metric(writer *w, plumb_metric m, double x)
{
    return m == PLUMB_METRIC_SPEED ? t_speed(w, x) : m == PLUMB_METRIC_DRIFT ? t_len(w, x)
                                                                             : t_energy(w, x);
}

static const char *outcome_word(plumb_limit_outcome o)
{
    return o == PLUMB_LIMIT_FOUND       ? "found"
           : o == PLUMB_LIMIT_UNLIMITED ? "unlimited"
           : o == PLUMB_LIMIT_IMPOSSIBLE ? "impossible"
                                         : "not applicable";
}

static const char *t_value(writer *w, plumb_dim dim, double si)
{
    shown v = show_dim(w, dim, si);
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s%s%s", gnum(w, v.x, 6), v.unit[0] ? NBSP : "", v.unit);
    return b;
}

/* A limit's value, 6 figures, rounded toward the side that meets the limit
 * (down when lower values do), so that the printed value is a safe one. */
static const char *t_limit_value(writer *w, plumb_dim dim, double si, int round_down)
{
    shown v = show_dim(w, dim, si);
    double x = v.x;
    if (x != 0.0 && plumbp_finite(x)) {
        double scale = pow(10.0, floor(log10(fabs(x))) - 5.0);
        x = (round_down ? floor(x / scale) : ceil(x / scale)) * scale;
    }
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s%s%s", gnum(w, x, 6), v.unit[0] ? NBSP : "", v.unit);
    return b;
}

static void text_limit_answer(writer *w, const plumb_report_options *opt,
                              const plumb_limit_report *rep)
{
    const plumb_profile *p = rep->profile;
    text_header(w, opt, "limit", plumb_profile_name(p));
    char text[PLUMB_LIMIT_TEXT + 256];
    snprintf(text, sizeof text, "the %s of %s at which the %s is %s%s%s%s", "value", rep->key,
             metric_word(rep->metric), t_metric(w, rep->metric, rep->limit),
             rep->criterion ? " (criterion " : "", rep->criterion ? rep->criterion : "",
             rep->criterion ? ")" : "");
    wrapped(w, "  ", text);
    const plumb_criterion *c = rep->criterion_info;
    if (c) {
        char src[PLUMB_CRIT_TEXT * 2 + PLUMB_CRIT_ID + 64];
        snprintf(src, sizeof src, "%s: %s%s%s%s%s", c->id, c->source[0] ? c->source : "not given",
                 status_note(c)[0] ? " (" : "", status_note(c), status_note(c)[0] ? ")" : "",
                 c->kind == PLUMB_CRIT_HELMET_TEST ? "; a helmet test, not a safe limit" : "");
        wrapped(w, "  source of ", src);
    }
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_limit_result *r = &rep->results[i];
        put(w, "\n");
        if (plumb_profile_is_inventory(p))
            put(w, "%s\n", plumb_profile_item(p, i)->name);
        if (r->outcome == PLUMB_LIMIT_FOUND) {
            put(w, "  %s = %s\n", rep->key,
                t_limit_value(w, r->dim, r->value_si, r->limit_is_upper_bound));
            snprintf(text, sizeof text, "there the %s is %s; %s values keep within the limit%s",
                     metric_word(rep->metric), t_metric(w, rep->metric, r->metric_at_value),
                     r->limit_is_upper_bound ? "lower" : "higher",
                     r->n_crossings < 2           ? "."
                     : r->limit_is_upper_bound ? ", down to the next crossing."
                                               : ", up to the next crossing.");
            wrapped(w, "  ", text);
            if (r->n_crossings > 1) {
                char list[PLUMB_LIMIT_TEXT];
                size_t len = 0;
                list[0] = '\0';
                for (size_t k = 0; k < r->n_crossings && len + NUMBUF < sizeof list; k++)
                    len += (size_t)snprintf(list + len, sizeof list - len, "%s%s", k ? ", " : "",
                                            t_value(w, r->dim, r->crossings_si[k]));
                snprintf(text, sizeof text,
                         "the %s is not monotonic in %s: it crosses the limit at %s; %s at the "
                         "low end of the range and alternately between the crossings.",
                         metric_word(rep->metric), rep->key, list,
                         r->within_at_low_end ? "within" : "exceeded");
                wrapped(w, "  ", text);
            }
        } else if (r->outcome == PLUMB_LIMIT_NOT_APPLICABLE) {
            wrapped(w, "  ", r->explanation);
            continue;
        } else {
            put(w, "  %s: %s\n", rep->key,
                r->outcome == PLUMB_LIMIT_UNLIMITED ? "no limit in the physical range"
                                                    : "no value meets the limit");
            wrapped(w, "  ", r->explanation);
        }
        snprintf(text, sizeof text, "the profile's own value %s gives %s (%zu falls computed)",
                 t_value(w, r->dim, r->base_value_si), t_metric(w, rep->metric, r->metric_at_base),
                 r->evaluations);
        wrapped(w, "  ", text);
    }
    text_profile(w, p);
    caution_lines_text(w);
}

static void csv_limit(writer *w, const plumb_limit_report *rep)
{
    char text[PLUMB_CRIT_TEXT + PLUMB_DIAG_FILE + NUMBUF * 2];
    csv_cautions(w);
    snprintf(text, sizeof text, "profile: %s (%s), sha256 %s", plumb_profile_name(rep->profile),
             plumb_profile_path(rep->profile), plumb_profile_sha256(rep->profile));
    csv_comment(w, text);
    const plumb_criterion *c = rep->criterion_info;
    if (c) {
        char line[PLUMB_CRIT_TEXT * 2 + PLUMB_CRIT_ID + NUMBUF * 2];
        snprintf(line, sizeof line, "criterion %s: %s, kind %s, limit %.*g J, source: %s, status %s",
                 c->id, c->name, crit_kind_name(c->kind), CSV_DIGITS, c->energy_limit_j,
                 c->source[0] ? c->source : "not given", c->status[0] ? c->status : "not given");
        csv_comment(w, line);
    }
    put(w, "name,key,outcome,value,unit,value_si,metric,limit_si,metric_at_value_si,"
           "base_value_si,metric_at_base_si,crossings,evaluations,explanation\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_limit_result *r = &rep->results[i];
        shown v = show_dim(w, r->dim, r->value_si);
        int found = r->outcome == PLUMB_LIMIT_FOUND; /* else no value: empty fields */
        csv_field(w, plumb_profile_item(rep->profile, i)->name);
        put(w, ",");
        csv_field(w, rep->key);
        put(w, ",%s,%s,", outcome_word(r->outcome), found ? csvnum(w, v.x) : "");
        csv_field(w, v.unit);
        put(w, ",%s,%s,%s,%s,%s,%s,%zu,%zu,", found ? csvnum(w, r->value_si) : "",
            metric_word(rep->metric), csvnum(w, rep->limit),
            found ? csvnum(w, r->metric_at_value) : "", csvnum(w, r->base_value_si),
            csvnum(w, r->metric_at_base), r->n_crossings, r->evaluations);
        csv_field(w, r->explanation);
        put(w, "\n");
    }
}

static json_t *j_limit(jctx *j, const plumb_report_options *opt, const plumb_limit_report *rep)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    json_t *lim = jobj(j);
    jset(j, lim, "key", jstr(j, rep->key));
    jset(j, lim, "metric", jstr(j, metric_word(rep->metric)));
    jset(j, lim, metric_key(rep->metric), jreal(j, rep->limit));
    if (rep->criterion)
        jset(j, lim, "criterion", jstr(j, rep->criterion));
    if (rep->criterion_info) {
        jset(j, lim, "criterion_source", jstr(j, rep->criterion_info->source));
        jset(j, lim, "criterion_status", jstr(j, rep->criterion_info->status));
    }
    json_t *items = jarr(j);
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_limit_result *r = &rep->results[i];
        json_t *o = jobj(j);
        const char *u = plumb_dim_si_unit(r->dim);
        jset(j, o, "name", jstr(j, plumb_profile_item(rep->profile, i)->name));
        jset(j, o, "outcome", jstr(j, outcome_word(r->outcome)));
        char k_value[64], k_base[64];
        snprintf(k_value, sizeof k_value, "%s_at_value_%s", metric_stem(rep->metric),
                 metric_unit_key(rep->metric));
        snprintf(k_base, sizeof k_base, "%s_at_base_%s", metric_stem(rep->metric),
                 metric_unit_key(rep->metric));
        /* the key's value: in the SI unit named by unit_si (it varies with the key) */
        if (r->outcome == PLUMB_LIMIT_FOUND) {
            jset(j, o, "value_si", jreal(j, r->value_si));
            jset(j, o, k_value, jreal(j, r->metric_at_value));
            json_t *cr = jarr(j);
            for (size_t k = 0; k < r->n_crossings; k++)
                jpush(j, cr, jreal(j, r->crossings_si[k]));
            jset(j, o, "crossings_si", cr);
        }
        jset(j, o, "unit_si", jstr(j, strcmp(u, "1") == 0 ? "" : u));
        jset(j, o, "base_value_si", jreal(j, r->base_value_si));
        jset(j, o, k_base, jreal(j, r->metric_at_base));
        jset(j, o, "within_at_low_end", json_boolean(r->within_at_low_end));
        jset(j, o, "lower_values_meet_limit",
             json_boolean(r->outcome == PLUMB_LIMIT_FOUND && r->limit_is_upper_bound));
        jset(j, o, "evaluations", json_integer((json_int_t)r->evaluations));
        jset(j, o, "explanation", jstr(j, r->explanation));
        jpush(j, items, o);
    }
    jset(j, lim, "items", items);
    jset(j, root, "limit", lim);
    jset(j, root, "profile", j_profile(j, rep->profile));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

plumb_status plumb_report_limit(FILE *out, const plumb_report_options *opt,
                                const plumb_limit_report *rep, plumb_diag *diag)
{
    plumb_report_options def;
    opt = opts_or_default(opt, &def);
    if (!out || !rep || !rep->profile || !rep->results || rep->n_items == 0 || !rep->key)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no limit answer to write");
    if (opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        return emit_json(out, &j, j_limit(&j, opt, rep), diag);
    }
    writer w;
    char *buf;
    size_t len;
    plumb_status st = writer_open(&w, &buf, &len, opt->units, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_CSV)
        csv_limit(&w, rep);
    else
        text_limit_answer(&w, opt, rep);
    return writer_close(&w, &buf, &len, out, diag);
}
