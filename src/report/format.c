/*
 * format.c - the shared number and unit formatter of the report writers
 * (format.h), and the finiteness checks made before a report is written.
 *
 * Units: the text and CSV reports show SI, or with --units us the units a
 * crew in the US works in: the international foot and pound (1959
 * agreement, PLUMB_FT_M and PLUMB_LB_KG), the inch (1/12 ft) for the size
 * of the body itself (plumbp_t_size), the statute mile of 5280 ft, the
 * international nautical mile of 1852 m (1929), the pound-force
 * lb x g0, the foot pound-force (PLUMB_FT_LBF_J) and the conventional inch
 * of mercury (NIST SP 811, 2008, Appendix B.8: 1 inHg = 3.386389e3 Pa).
 * Energy is always shown in both joules and foot pound-force.
 */
#include <ctype.h>
#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/format.h"

/* ---- finiteness: every figure checked before anything is written ------- */

void plumbp_need_finite(finite_check *fc, const char *what, double x)
{
    if (fc->status != PLUMB_OK || plumbp_finite(x))
        return;
    fc->status = PLUMB_RAISE(fc->diag, PLUMB_ENUMERIC,
                             "%s%s%s is not a finite number (%s); no report written",
                             fc->item ? fc->item : "", fc->item ? ": " : "", what,
                             isnan(x) ? "NaN" : "infinite");
}

plumb_status plumbp_check_item(const plumb_item_report *it, plumb_diag *diag)
{
    finite_check fc = {diag, it->spec->name[0] ? it->spec->name : NULL, PLUMB_OK};
    const plumb_fall_result *r = &it->result;
    const plumb_fall_spec *s = it->spec;
    plumbp_need_finite(&fc, "impact time", r->time_s);
    plumbp_need_finite(&fc, "impact point east", r->point_m[0]);
    plumbp_need_finite(&fc, "impact point north", r->point_m[1]);
    for (int k = 0; k < 3; k++)
        plumbp_need_finite(&fc, "impact velocity", r->velocity_m_s[k]);
    plumbp_need_finite(&fc, "impact speed", r->speed_m_s);
    plumbp_need_finite(&fc, "impact energy", r->energy_j);
    plumbp_need_finite(&fc, "impact momentum", r->momentum_kg_m_s);
    plumbp_need_finite(&fc, "impact angle", r->angle_deg);
    plumbp_need_finite(&fc, "drift", r->drift_m);
    plumbp_need_finite(&fc, "bearing", r->bearing_deg);
    plumbp_need_finite(&fc, "apex", r->apex_m);
    plumbp_need_finite(&fc, "terminal speed", r->terminal_speed_m_s);
    plumbp_need_finite(&fc, "drag-free speed", r->drag_free_speed_m_s);
    plumbp_need_finite(&fc, "drag-free energy", r->drag_free_energy_j);
    plumbp_need_finite(&fc, "work done by drag", r->drag_work_j);
    plumbp_need_finite(&fc, "largest Mach number", r->max_mach);
    plumbp_need_finite(&fc, "smallest Reynolds number", r->min_re);
    plumbp_need_finite(&fc, "largest Reynolds number", r->max_re);
    if (s->n_descent > 0) {
        for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
            if (!r->deployed[i])
                continue;
            plumbp_need_finite(&fc, "line-stretch time", r->deploy_time_s[i]);
            plumbp_need_finite(&fc, "line-stretch height", r->deploy_height_m[i]);
            plumbp_need_finite(&fc, "line-stretch air speed", r->deploy_speed_m_s[i]);
        }
        plumbp_need_finite(&fc, "peak drag force", r->peak_force_n);
        plumbp_need_finite(&fc, "peak load factor", r->peak_load_g);
        plumbp_need_finite(&fc, "steady descent speed", r->steady_speed_m_s);
        plumbp_need_finite(&fc, "steady descent speed with the devices opened",
                           r->steady_opened_m_s);
    }
    for (size_t i = 0; i < it->n_verdicts; i++) {
        plumbp_need_finite(&fc, "judged energy", it->verdicts[i].energy_j);
        plumbp_need_finite(&fc, "energy ratio", it->verdicts[i].ratio);
        plumbp_need_finite(&fc, "energy limit", it->verdicts[i].criterion->energy_limit_j);
    }
    plumbp_need_finite(&fc, "mass", s->mass_kg);
    plumbp_need_finite(&fc, "volume", s->volume_m3);
    plumbp_need_finite(&fc, "drag coefficient", s->drag.cd);
    plumbp_need_finite(&fc, "drag area", s->drag.area_m2);
    plumbp_need_finite(&fc, "drag area CdA", s->drag.cd_area_m2);
    plumbp_need_finite(&fc, "sphere diameter", s->drag.diameter_m);
    for (int k = 0; k < 3; k++) {
        plumbp_need_finite(&fc, "release point", s->release_m[k]);
        plumbp_need_finite(&fc, "release velocity", s->velocity_m_s[k]);
    }
    plumbp_need_finite(&fc, "site elevation", s->site_elevation_m);
    plumbp_need_finite(&fc, "wind speed", s->wind.speed_m_s);
    plumbp_need_finite(&fc, "wind direction", s->wind.from_deg);
    return fc.status;
}
/* ---- text and CSV writer context --------------------------------------- */






/* x with a fixed number of decimals, never "-0". */
char *plumbp_fixed(writer *w, double x, int dec)
{
    int ok;
    char *b = num_slot(w, x, &ok);
    if (!ok)
        return b;
    snprintf(b, NUMBUF, "%.*f", dec, x);
    if (strspn(b, "-0.") == strlen(b))
        snprintf(b, NUMBUF, "%.*f", dec, 0.0);
    return b;
}

/* x in scientific notation with `sig` significant digits. */
const char *plumbp_sci(writer *w, double x, int sig)
{
    int ok;
    char *b = num_slot(w, x, &ok);
    if (!ok)
        return b;
    snprintf(b, NUMBUF, "%.*e", sig - 1, x);
    return b;
}

/* Drops the trailing zeros of a decimal fraction, and a bare point. */
static void strip_zeros(char *b)
{
    if (!strchr(b, '.'))
        return;
    size_t n = strlen(b);
    while (n > 0 && b[n - 1] == '0')
        b[--n] = '\0';
    if (n > 0 && b[n - 1] == '.')
        b[--n] = '\0';
}

/* x with at most `dec` decimals, trailing zeros dropped ("1000", "12.5"). */
const char *plumbp_trimmed(writer *w, double x, int dec)
{
    char *b = plumbp_fixed(w, x, dec);
    strip_zeros(b);
    return b;
}

/* x with at most `sig` significant digits and `dec` decimals, trailing
 * zeros dropped: inputs as given ("0.8"), percents ("99.9"), and figures
 * whose last digit would be below what they are good for (mm, mJ). */
const char *plumbp_trim_to(writer *w, double x, int sig, int dec, int strip)
{
    int ok;
    char *b = num_slot(w, x, &ok);
    if (!ok)
        return b;
    double ax = fabs(x);
    int d = ax > 0.0 ? sig - 1 - (int)floor(log10(ax)) : 0;
    if (d > dec)
        d = dec;
    if (w->round_dir && ax > 0.0) {
        /* at the last digit shown, toward the safe side; a figure rounded
         * up to the next power of ten (9.9996 -> 10.000) shows one decimal
         * fewer, as its figures say */
        x = d < 0 ? plumbp_round_safe(x, sig, w->round_dir < 0)
                  : plumbp_round_safe_at(x, d, w->round_dir < 0);
        ax = fabs(x);
        int d2 = ax > 0.0 ? sig - 1 - (int)floor(log10(ax)) : 0;
        if (d2 < d)
            d = d2;
    }
    if (d < 0)
        return num(w, x, sig);
    snprintf(b, NUMBUF, "%.*f", d, x);
    if (strip)
        strip_zeros(b);
    if (strspn(b, "-0.") == strlen(b))
        strcpy(b, "0");
    return b;
}

/* x rounded to `sig` significant figures, down (round_down 1) or up: the
 * side of a limit that meets it, so that a printed limit or answer is
 * never more lenient than the figure it stands for. A quotient that is a
 * whole number to within round-off (25 ft·lbf from 33.895 J) stays that
 * number rather than dropping to the next one down. */
double plumbp_round_safe(double x, int sig, int round_down)
{
    if (x == 0.0 || !plumbp_finite(x))
        return x;
    double scale = pow(10.0, floor(log10(fabs(x))) - (sig - 1));
    double q = x / scale, whole = nearbyint(q);
    /* within the round-off of a conversion, a few units in the last
     * place of q, not a fraction of the last digit shown */
    if (fabs(q - whole) <= 16.0 * DBL_EPSILON * fabs(q))
        return whole * scale;
    return (round_down ? floor(q) : ceil(q)) * scale;
}

/* x rounded at `dec` decimals (a negative dec: to tens, hundreds ...),
 * down or up: plumbp_round_safe counted in decimals rather than in
 * significant figures, for a figure printed to a fixed decimal place. */
double plumbp_round_safe_at(double x, int dec, int round_down)
{
    if (x == 0.0 || !plumbp_finite(x))
        return x;
    return plumbp_round_safe(x, (int)floor(log10(fabs(x))) + 1 + dec, round_down);
}

/* x in the display units through t, each figure rounded at its last digit
 * shown toward the safe side: dir +1 up (a keep-clear distance: a radius,
 * a landing circle, a glide; the top of its interval), -1 down (the
 * bottom of that interval). */
const char *plumbp_t_round(writer *w, const char *(*t)(writer *, double), double x, int dir)
{
    int was = w->round_dir;
    w->round_dir = dir;
    const char *b = t(w, x);
    w->round_dir = was;
    return b;
}

/* A keep-clear distance through t, rounded up (plumbp_t_round). */
const char *plumbp_t_clear(writer *w, const char *(*t)(writer *, double), double x)
{
    return plumbp_t_round(w, t, x, 1);
}

/* An upper limit in the display units, each figure rounded down: the
 * strict side (a criterion's limit, --energy-max, --speed-max). */
const char *plumbp_t_limit(writer *w, const char *(*t)(writer *, double), double x)
{
    int was = w->strict;
    w->strict = 1;
    const char *b = t(w, x);
    w->strict = was;
    return b;
}

const char *plumbp_t_limit_energy(writer *w, double j)
{
    return plumbp_t_limit(w, plumbp_t_energy, j);
}

/* A criterion's energy limit in a CSV comment, CSV_DIGITS (or sig) figures
 * rounded down (the strict side): "33.89544871 J", or with --units us
 * "25 ft·lbf (33.89544871 J)". */
const char *plumbp_csv_limit(writer *w, double j)
{
    return plumbp_csv_limit_at(w, j, CSV_DIGITS);
}

const char *plumbp_csv_limit_at(writer *w, double j, int sig)
{
    char si[40], us[40]; /* up to 17 figures and an exponent */
    snprintf(si, sizeof si, "%.*g", sig, plumbp_round_safe(j, sig, 1));
    snprintf(us, sizeof us, "%.*g", sig, plumbp_round_safe(j / PLUMB_FT_LBF_J, sig, 1));
    if (!plumbp_finite(j))
        w->bad = 1;
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s ft·lbf (%s J)", us, si);
    else
        snprintf(b, NUMBUF, "%s J", si);
    return b;
}

/* x in the shortest of %g's forms with `sig` significant digits ("0.9"). */
const char *plumbp_gnum(writer *w, double x, int sig)
{
    int ok;
    char *b = num_slot(w, x, &ok);
    if (!ok)
        return b;
    snprintf(b, NUMBUF, "%.*g", sig, x == 0.0 ? 0.0 : x);
    return b;
}

/* A quantity in the text: TEXT_SIG figures (w->sig when set); inputs
 * echoed as given (in SI, INPUT_SIG figures) or converted (US, TEXT_SIG
 * figures), zeros dropped. */
static const char *qty(writer *w, double x)
{
    if (w->strict)
        return num(w, plumbp_round_safe(x, w->sig ? w->sig : TEXT_SIG, 1),
                   w->sig ? w->sig : TEXT_SIG);
    if (w->round_dir) {
        int sig = w->sig ? w->sig : TEXT_SIG;
        return num(w, plumbp_round_safe(x, sig, w->round_dir < 0), sig);
    }
    if (!w->exact)
        return num(w, x, w->sig ? w->sig : TEXT_SIG);
    return plumbp_gnum(w, x, w->us ? TEXT_SIG : INPUT_SIG);
}

/* ---- a figure beside the limit it is judged against -------------------- */

/* The most figures a compared pair is given: a double's 17 tell any two
 * apart that differ at all. */
#define PAIR_SIG_MAX 17

/* x to `sig` significant figures, to the nearest, as num and csvnum show
 * it (%.*g rounds as num's fixed decimals do), read back. */
static double shown_nearest(double x, int sig)
{
    char b[64];
    snprintf(b, sizeof b, "%.*g", sig, x);
    return strtod(b, NULL);
}

/* 1 when a figure shown as e beside a limit shown as l reads as the
 * verdict says: exceeds when above it (at or above it for a limit worded
 * "less than", plumb_criterion.strict), within otherwise. */
static int sides_agree(double e, double l, int exceeds, int strict)
{
    if (exceeds)
        return strict ? e >= l : e > l;
    return strict ? e < l : e <= l;
}

/* 1 when a figure x and a limit l, shown as xs and ls, read as the
 * verdict says and on the same side of each other as they are: a figure
 * below its limit is shown below it, not equal to it, so that the pair
 * shows which side it is on (equal only when they are). */
static int shown_agree(double xs, double ls, double x, double l, int exceeds, int strict)
{
    /* a figure equal to its limit to within the round-off of its
     * conversions (a few units in the last place, as plumbp_round_safe
     * takes a whole number) is at the limit: shown equal to it, its verdict
     * word tells the side, rather than with the 17 figures that would */
    if (fabs(x - l) <= 16.0 * DBL_EPSILON * fmax(fabs(x), fabs(l)))
        return xs == ls || sides_agree(xs, ls, exceeds, strict);
    if (!sides_agree(xs, ls, exceeds, strict))
        return 0;
    return (xs < ls) == (x < l) && xs != ls;
}

/* 1 when v's energy at esig figures (to the nearest) and its limit at lsig
 * (rounded down, as every report prints a limit: plumbp_t_limit) read as
 * its verdict, in joules and in foot pound-force alike (a report shows
 * both). */
static int pair_agrees(const plumb_verdict *v, int esig, int lsig)
{
    static const double per_unit[2] = {1.0, PLUMB_FT_LBF_J};
    const plumb_criterion *c = v->criterion;
    for (size_t u = 0; u < 2; u++) {
        double e = v->energy_j / per_unit[u], l = c->energy_limit_j / per_unit[u];
        if (!shown_agree(shown_nearest(e, esig), plumbp_round_safe(l, lsig, 1), e, l, v->exceeds,
                         c->strict))
            return 0;
    }
    return 1;
}

int plumbp_energy_sig(const plumb_verdict *v, size_t n, int base)
{
    for (int sig = base; sig < PAIR_SIG_MAX; sig++) {
        size_t k = 0;
        while (k < n && pair_agrees(&v[k], sig, sig))
            k++;
        if (k == n)
            return sig;
    }
    return PAIR_SIG_MAX;
}

int plumbp_limit_sig(const plumb_verdict *v, int esig, int base)
{
    for (int sig = base; sig < PAIR_SIG_MAX; sig++)
        if (pair_agrees(v, esig, sig))
            return sig;
    return PAIR_SIG_MAX;
}

int plumbp_ratio_sig(const plumb_verdict *v, int base)
{
    for (int sig = base; sig < PAIR_SIG_MAX; sig++)
        if (shown_agree(shown_nearest(v->ratio, sig), 1.0, v->ratio, 1.0, v->exceeds,
                        v->criterion->strict))
            return sig;
    return PAIR_SIG_MAX;
}

int plumbp_report_limit_sig(const plumb_fall_report *rep, size_t k, int base)
{
    int sig = base;
    for (size_t i = 0; rep->items && i < rep->n_items; i++) {
        const plumb_item_report *it = &rep->items[i];
        if (k >= it->n_verdicts)
            continue;
        int s = plumbp_limit_sig(&it->verdicts[k],
                                 plumbp_energy_sig(it->verdicts, it->n_verdicts, base), base);
        sig = s > sig ? s : sig;
    }
    return sig;
}

const char *plumbp_t_ratio(writer *w, const plumb_verdict *v)
{
    return num(w, v->ratio, plumbp_ratio_sig(v, RATIO_SIG));
}

/* f(w, j) with `sig` figures in place of w->sig. */
static const char *with_sig(writer *w, double j, int sig,
                            const char *(*f)(writer *, double))
{
    int was = w->sig;
    w->sig = sig;
    const char *b = f(w, j);
    w->sig = was;
    return b;
}

const char *plumbp_t_energy_at(writer *w, double j, int sig)
{
    return with_sig(w, j, sig, plumbp_t_energy);
}

const char *plumbp_t_limit_energy_at(writer *w, double j, int sig)
{
    return with_sig(w, j, sig, plumbp_t_limit_energy);
}

/* ---- text: quantities in the chosen units ------------------------------ */

const char *plumbp_t_len(writer *w, double m)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft", qty(w, m / PLUMB_FT_M));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m", qty(w, m));
    return b;
}

/* format.h */
const char *plumbp_t_drift(writer *w, double m, int unit)
{
    if (m < DRIFT_SHOWN_M) {
        char *b = slot(w);
        snprintf(b, NUMBUF, "none");
        return b;
    }
    if (unit)
        return plumbp_t_len(w, m);
    return qty(w, w->us ? m / PLUMB_FT_M : m);
}

/* A length of a zone's spread (format.h): TEXT_SIG figures, none below a
 * millimetre (or a thousandth of a foot). */
#define ZONE_LEN_DEC 3

const char *plumbp_t_zone_len(writer *w, double m)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s" NBSP "%s",
             plumbp_trim_to(w, w->us ? m / PLUMB_FT_M : m, TEXT_SIG, ZONE_LEN_DEC, 0),
             w->us ? "ft" : "m");
    return b;
}

/* Decimals of a zone's energies (a millijoule) and percents (a hundredth). */
#define ZONE_ENERGY_DEC 3
#define ZONE_PCT_DEC 2

const char *plumbp_t_zone_energy(writer *w, double j)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s ft·lbf (%s J)",
                 plumbp_trim_to(w, j / PLUMB_FT_LBF_J, TEXT_SIG, ZONE_ENERGY_DEC, 0),
                 plumbp_trim_to(w, j, TEXT_SIG, ZONE_ENERGY_DEC, 0));
    else
        snprintf(b, NUMBUF, "%s J (%s ft·lbf)", plumbp_trim_to(w, j, TEXT_SIG, ZONE_ENERGY_DEC, 0),
                 plumbp_trim_to(w, j / PLUMB_FT_LBF_J, TEXT_SIG, ZONE_ENERGY_DEC, 0));
    return b;
}

const char *plumbp_t_pct(writer *w, double p)
{
    char *b = slot(w);
    double x = 100.0 * p;
    /* a small non-zero share keeps two figures rather than rounding to 0 */
    if (x > 0.0 && x < 0.5 * pow(10.0, -ZONE_PCT_DEC))
        snprintf(b, NUMBUF, "%.2g %%", x);
    else
        snprintf(b, NUMBUF, "%s %%", plumbp_trim_to(w, x, TEXT_SIG, ZONE_PCT_DEC, 1));
    return b;
}

/* format.h. The centre is fixed by m = min(pilot, max(1, N / 4)) samples
 * (plumb_zone_stats.landing_training) and the circle bounded from the
 * other N - m, which must number plumb_zone_min_samples(confidence,
 * ci_level); N - max(1, N / 4) >= that is enough whatever the pilot, so
 * the smallest such N is a run that bounds it. */
const char *plumbp_landing_open(const plumb_zone_result *r, char *out, size_t size)
{
    const plumb_zone_stats *z = &r->zone;
    size_t need = plumb_zone_min_samples(r->confidence, r->ci_level);
    size_t counted = z->samples > z->landing_training ? z->samples - z->landing_training : 0;
    size_t n = need;
    while (n <= PLUMB_ZONE_MAX_SAMPLES && n - (n / 4 > 1 ? n / 4 : 1) < need)
        n++;
    char todo[160];
    if (n <= PLUMB_ZONE_MAX_SAMPLES)
        snprintf(todo, sizeof todo, "For a landing circle, run the zone with %zu samples or more "
                 "(zone.samples or --samples).", n);
    else
        snprintf(todo, sizeof todo, "For a landing circle, run the zone at a lower confidence "
                 "(zone.confidence).");
    snprintf(out, size, PLUMBP_OPEN_BOUND "; only %zu of the %zu samples are counted against its "
             "centre, and bounding it takes at least %zu. Keep the whole clearance radius around "
             "the drop point clear: do not narrow the exclusion zone to where the impacts seem "
             "to land. %s", counted, z->samples, need, todo);
    return out;
}

/* A size of the body itself (a shape's edges, length, diameter and
 * thickness, a sphere's diameter): m, or in US units inches, as a tool or
 * a box is measured (heights and distances stay in feet). */
const char *plumbp_t_size(writer *w, double m)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "in", qty(w, m / INCH_M));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m", qty(w, m));
    return b;
}

/* 1 when a figure as printed ("0 m", "0.000 ft") is zero. */
int plumbp_shows_zero(const char *s)
{
    size_t n = strcspn(s, " " NBSP);
    return n > 0 && strspn(s, "0.") >= n;
}

/* "3.2 m west", "1.1 m north": an offset along one axis in words. One
 * that prints as zero takes the word of the positive side: never
 * "0 m south". */
const char *plumbp_t_offset(writer *w, double x, const char *pos, const char *neg)
{
    char *b = slot(w);
    const char *l = plumbp_t_len(w, fabs(x));
    snprintf(b, NUMBUF, "%s %s", l, x < 0.0 && !plumbp_shows_zero(l) ? neg : pos);
    return b;
}

const char *plumbp_t_speed(writer *w, double v)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft/s", qty(w, v / PLUMB_FT_M));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m/s", qty(w, v));
    return b;
}

/* A wind speed as a crew reads it: m/s, or mph with knots. */
const char *plumbp_t_wind(writer *w, double v)
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
const char *plumbp_t_energy(writer *w, double j)
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

/* A mass: kg, or lb with the kilograms in the brackets that hold a US
 * report's SI figures ("1.874 lb [0.85 kg]"). */
const char *plumbp_t_mass(writer *w, double kg)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "lb [%s" NBSP "kg]", qty(w, kg / PLUMB_LB_KG),
                 qty(w, kg));
    else
        snprintf(b, NUMBUF, "%s" NBSP "kg", qty(w, kg));
    return b;
}

const char *plumbp_t_area(writer *w, double m2)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft²", qty(w, m2 / (PLUMB_FT_M * PLUMB_FT_M)));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m²", qty(w, m2));
    return b;
}

/* Smallest region area shown as a number, in the display unit (m² or
 * ft²): below it a fixed-point figure would be a long row of zeros
 * ("0.000000001682 ft²" for impacts that all land on one point). */
#define AREA_SHOWN_MIN 0.01

const char *plumbp_t_region_area(writer *w, double m2)
{
    double in_unit = w->us ? m2 / (PLUMB_FT_M * PLUMB_FT_M) : m2;
    if (!(in_unit >= AREA_SHOWN_MIN) && in_unit >= 0.0) {
        char *b = slot(w);
        snprintf(b, NUMBUF, "under" NBSP "0.01" NBSP "%s", w->us ? "ft²" : "m²");
        return b;
    }
    return plumbp_t_clear(w, plumbp_t_area, m2);
}

const char *plumbp_t_force(writer *w, double n)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "lbf", qty(w, n / LBF_N));
    else
        snprintf(b, NUMBUF, "%s" NBSP "N", qty(w, n));
    return b;
}

const char *plumbp_t_temp(writer *w, double k)
{
    char *b = slot(w);
    double f = k * FAHRENHEIT_PER_K - FAHRENHEIT_ZERO_OFFSET, c = k - CELSIUS_ZERO_K;
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "°F",
                 w->exact ? plumbp_gnum(w, f, TEXT_SIG) : plumbp_fixed(w, f, 1));
    else if (w->exact)
        snprintf(b, NUMBUF, "%s" NBSP "K (%s" NBSP "°C)", plumbp_gnum(w, k, INPUT_SIG),
                 plumbp_gnum(w, c, INPUT_SIG));
    else
        snprintf(b, NUMBUF, "%s" NBSP "K (%s" NBSP "°C)", plumbp_fixed(w, k, 1),
                 plumbp_fixed(w, c, 1));
    return b;
}

const char *plumbp_t_press(writer *w, double pa)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "inHg", qty(w, pa / INHG_PA));
    else
        snprintf(b, NUMBUF, "%s" NBSP "hPa", qty(w, pa / HPA_PA));
    return b;
}

const char *plumbp_t_density(writer *w, double rho)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "lb/ft³",
                 num(w, rho * PLUMB_FT_M * PLUMB_FT_M * PLUMB_FT_M / PLUMB_LB_KG, TEXT_SIG));
    else
        snprintf(b, NUMBUF, "%s" NBSP "kg/m³", num(w, rho, TEXT_SIG));
    return b;
}

/* A temperature lapse rate (fall per height), an input: K/km as given
 * (INPUT_SIG figures), or converted to °F per 1000 ft (TEXT_SIG). */
const char *plumbp_t_lapse(writer *w, double k_m)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "°F/1000" NBSP "ft",
                 plumbp_gnum(w, k_m * FAHRENHEIT_PER_K * 1000.0 * PLUMB_FT_M, TEXT_SIG));
    else
        snprintf(b, NUMBUF, "%s" NBSP "K/km", plumbp_gnum(w, k_m * 1000.0, INPUT_SIG));
    return b;
}

/* Gravity to six figures: m/s², or ft/s² in US units. */
const char *plumbp_t_gravity(writer *w, double g)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "ft/s²", plumbp_fixed(w, g / PLUMB_FT_M, 4));
    else
        snprintf(b, NUMBUF, "%s" NBSP "m/s²", plumbp_fixed(w, g, 5));
    return b;
}

/* " [23.61 m/s]" after a US figure; "" in SI. */
const char *plumbp_si_bracket(writer *w, double x, const char *unit)
{
    char *b = slot(w);
    if (w->us)
        snprintf(b, NUMBUF, " [%s" NBSP "%s]", num(w, x, TEXT_SIG), unit);
    else
        b[0] = '\0';
    return b;
}


/* "085° (E)" */
const char *plumbp_t_bearing(writer *w, double deg)
{
    char *b = slot(w);
    double d = wrap_deg(deg);
    if (lround(d) == 360)
        d = 0.0;
    snprintf(b, NUMBUF, "%03ld° (%s)", lround(d), compass(d));
    return b;
}

/* A small length (a tolerance, a gap): mm, or in inches in US units,
 * trailing zeros dropped ("0.001 mm", "0.0000394 in"). */
const char *plumbp_t_small(writer *w, double m)
{
    char *b = slot(w);
    int sig = w->sig ? w->sig : TEXT_SIG;
    if (w->us)
        snprintf(b, NUMBUF, "%s" NBSP "in", plumbp_trim_to(w, m / INCH_M, sig, 12, 1));
    else
        snprintf(b, NUMBUF, "%s" NBSP "mm", plumbp_trim_to(w, m * 1e3, sig, 12, 1));
    return b;
}

/* An angle in whole degrees, "74°", in both unit systems. */
const char *plumbp_t_angle(writer *w, double deg)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s°", plumbp_fixed(w, deg, 0));
    return b;
}

/* ---- warnings: their quantities in the display units -------------------- */

/* Significant figures of a quantity in a warning: the rough figures of a
 * model's assumptions (a rotor wake, a gust), not results. */
#define WARNING_SIG 3

/* The quantity of one mark (PLUMBP_Q_*, core/internal.h), or NULL for a
 * kind letter this formatter does not know. */
static const char *warning_qty(writer *w, char kind, double x)
{
    switch (kind) {
    case 'L': return plumbp_t_len(w, x);
    case 'l': return plumbp_t_small(w, x);
    case 'S': return plumbp_t_speed(w, x);
    case 'W': return plumbp_t_wind(w, x);
    case 'F': return plumbp_t_force(w, x);
    case 'A': return plumbp_t_area(w, x);
    case 'D': return plumbp_t_angle(w, x);
    default: return NULL;
    }
}

const char *plumbp_t_warning(writer *w, const char *text, char *out, size_t size)
{
    size_t n = 0;
    int was_sig = w->sig, was_exact = w->exact, was_strict = w->strict, was_dir = w->round_dir;
    w->sig = WARNING_SIG;
    w->exact = w->strict = w->round_dir = 0;
    if (size == 0)
        return out;
    out[0] = '\0';
    for (const char *p = text; *p && n + 1 < size;) {
        const char *end = *p == PLUMBP_QTY_OPEN ? strchr(p, PLUMBP_QTY_CLOSE) : NULL;
        const char *shown = NULL;
        if (end) {
            char *stop;
            double x = strtod(p + 2, &stop);
            if (stop == end && stop > p + 2)
                shown = warning_qty(w, p[1], x);
        }
        if (!shown && *p == PLUMBP_QTY_OPEN) {
            /* a mark that cannot be read: never printed as it is */
            w->bad = 1;
            shown = "?";
            end = end ? end : p + strlen(p) - 1;
        }
        if (shown) {
            int k = snprintf(out + n, size - n, "%s", shown);
            n = k < 0 ? n : (size_t)k < size - n ? n + (size_t)k : size - 1;
            p = end + 1;
        } else if (*p == ' ' && n > 0 && isdigit((unsigned char)out[n - 1]) &&
                   unit_like(p + 1, strcspn(p + 1, " "))) {
            /* a number written into the sentence with its unit or % ("1.5000 s",
             * "40.3 %"): joined as the marks' are, so no line parts them */
            out[n++] = NBSP_CHAR;
            out[n] = '\0';
            p++;
        } else {
            out[n++] = *p++;
            out[n] = '\0';
        }
    }
    w->sig = was_sig;
    w->exact = was_exact;
    w->strict = was_strict;
    w->round_dir = was_dir;
    return out;
}

int plumbp_warning_plain(const char *text, int us, char *out, size_t size)
{
    writer w;
    memset(&w, 0, sizeof w);
    w.us = us;
    plumbp_t_warning(&w, text, out, size);
    for (char *c = out; size > 0 && *c; c++)
        if (*c == NBSP_CHAR)
            *c = ' ';
    return !w.bad;
}

size_t plumb_report_warning(const char *warning, plumb_unit_system units, char *buf, size_t size)
{
    char whole[PLUMB_WARNING * 2];
    plumbp_warning_plain(warning ? warning : "", units == PLUMB_UNITS_US, whole, sizeof whole);
    if (buf && size > 0)
        plumbp_strlcpy(buf, whole, size);
    return strlen(whole);
}

/* The SI quantities a criterion's source quotes from its standard ("5.0 kg
 * striker, 1 m drop, at most 5.0 kN transmitted") with, in a US report, the
 * US figure in brackets after each, to 3 significant digits ("5.0 kg
 * [11.0 lb] striker, 1 m [3.28 ft] drop"): the quote stays as the standard
 * words it. A number counts when it starts a word and its unit, after one
 * space, ends one; "g" (a load factor) and times are left alone. */
static const struct {
    const char *si, *us;
    double per_us; /* SI units in one US unit */
} quoted_units[] = {
    {"m/s", "ft/s", PLUMB_FT_M},
    {"kN", "lbf", PLUMB_LB_KG * PLUMB_G0_M_S2 / 1000.0},
    {"kg", "lb", PLUMB_LB_KG},
    {"N", "lbf", PLUMB_LB_KG * PLUMB_G0_M_S2},
    {"J", "ft\xC2\xB7lbf", PLUMB_FT_LBF_J},
    {"m", "ft", PLUMB_FT_M},
};

static int word_char(char c)
{
    return isalnum((unsigned char)c) || c == '/' || c == '.' || c == '_';
}

const char *plumbp_t_source(writer *w, const plumb_criterion *c, char *buf, size_t size)
{
    const char *s = c->source[0] ? c->source : "not given";
    if (!w->us || !c->source[0]) {
        snprintf(buf, size, "%s", s);
        return buf;
    }
    size_t o = 0;
    for (const char *p = s; *p && o + 1 < size;) {
        int starts = isdigit((unsigned char)*p) && (p == s || !word_char(p[-1]));
        if (starts) {
            char *end;
            double x = strtod(p, &end);
            size_t k = 0, ulen = 0;
            if (end[0] == ' ')
                for (k = 0; k < sizeof quoted_units / sizeof quoted_units[0]; k++) {
                    ulen = strlen(quoted_units[k].si);
                    if (strncmp(end + 1, quoted_units[k].si, ulen) == 0 &&
                        !word_char(end[1 + ulen]))
                        break;
                }
            if (end[0] == ' ' && k < sizeof quoted_units / sizeof quoted_units[0] &&
                isfinite(x)) {
                int n = snprintf(buf + o, size - o, "%.*s" NBSP "%s [%s" NBSP "%s]",
                                 (int)(end - p), p, quoted_units[k].si,
                                 num(w, x / quoted_units[k].per_us, 3), quoted_units[k].us);
                if (n < 0 || (size_t)n >= size - o)
                    break;
                o += (size_t)n;
                p = end + 1 + ulen;
                continue;
            }
        }
        buf[o++] = *p++;
    }
    buf[o < size ? o : size - 1] = '\0';
    return buf;
}
