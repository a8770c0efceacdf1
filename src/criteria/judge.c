/*
 * judge.c - a finished fall judged against the criteria, and the warnings
 * that go with its figures (include/plumb/judge.h). Judging lives with the
 * criteria: the report writers only print what is decided here.
 */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include "plumb/constants.h"
#include "plumb/judge.h"
#include "plumb/trajectory.h"
#include "core/internal.h"
#include "physics/physics.h"

/* Mach number above which the report warns: drag coefficients measured in
 * incompressible flow no longer hold (common practice, no source). */
#define WARN_MACH 0.5
/* Upper end of the Reynolds-number range of the sphere-drag correlations:
 * Morrison (2010 handout, eq. 1) states Re <= 1e6; the Clift-Grace-Weber curve (1978,
 * Table 5.2) ends with its 4e5 < Re < 1e6 piece. */
#define MORRISON_RE_MAX 1.0e6
#define CGW_RE_MAX 1.0e6
/* Height above the strike level past which the power and log wind laws are
 * no model of the wind: the top of the atmospheric boundary layer, "up to
 * around 1 km" above the ground, the free atmosphere above it (Wikipedia,
 * "Log wind profile", read in a copy; the same article limits the log law
 * itself to the surface layer, "the lowest 100 m"). The layer's depth
 * varies from a few hundred metres to a few kilometres with the day and
 * the weather (from memory: R. B. Stull, An Introduction to Boundary Layer
 * Meteorology, 1988, ch. 1); 1 km is a round middle value, chosen to mark
 * a fall that is mostly outside the layer, not to split hairs below it
 * (SAFETY.md section 3.3 says the rest). */
#define WIND_LAW_TOP_M 1000.0

/* ---- verdicts and warnings ---------------------------------------------- */

/* Appends a warning (a sentence) to the item, whole; one that does not
 * fit is marked, never cut or dropped in silence (plumbp_warning_add). */
static void add_warning(plumb_item_report *item, const char *fmt, ...) PLUMBP_PRINTF(2, 3);

static void add_warning(plumb_item_report *item, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumbp_warning_vadd(&item->warnings[0][0], PLUMB_WARNING, PLUMB_MAX_WARNINGS,
                        &item->n_warnings, fmt, ap);
    va_end(ap);
}

/* PLUMB_EKEY located at the profile's index-th criterion, which the set
 * does not have (plumb_criteria_check_id's message). */
static plumb_status unknown_criterion(const char *name, size_t index,
                                      const plumb_profile *profile,
                                      const plumb_criteria *criteria, plumb_diag *diag)
{
    char key[PLUMB_DIAG_KEY], msg[PLUMB_DIAG_MSG];
    snprintf(key, sizeof key, "criteria[%zu]", index);
    int line, col;
    plumb_profile_criterion_position(profile, index, &line, &col);
    const char *file = plumb_profile_criterion_file(profile, index);
    plumb_status st = plumb_criteria_check_id(criteria, name, msg, sizeof msg);
    return PLUMB_RAISE_AT(diag, st == PLUMB_OK ? PLUMB_EKEY : st, file, line, col, key, "%s",
                          msg);
}

/* Names the helmet-test criteria among the verdicts in one sentence, or
 * says so without names when the sentence with them would not fit in a
 * warning. */
static void warn_helmet_tests(plumb_item_report *item)
{
    char names[PLUMB_WARNING] = "";
    size_t count = 0, len = 0;
    int fits = 1;
    for (size_t i = 0; i < item->n_verdicts; i++) {
        const plumb_criterion *c = item->verdicts[i].criterion;
        if (c->kind != PLUMB_CRIT_HELMET_TEST)
            continue;
        int w = snprintf(names + len, sizeof names - len, "%s%s", count ? ", " : "", c->id);
        if (w < 0 || (size_t)w >= sizeof names - len)
            fits = 0;
        else
            len += (size_t)w;
        count++;
    }
    if (count == 0)
        return;
    char sentence[PLUMB_WARNING * 2];
    int n = -1;
    if (fits && count == 1)
        n = snprintf(sentence, sizeof sentence,
                     "%s is the energy a helmet is tested to, not a safe limit: a blow below it "
                     "can still injure, with or without a helmet.", names);
    else if (fits)
        n = snprintf(sentence, sizeof sentence,
                     "%s are the energies helmets are tested to, not safe limits: a blow below "
                     "them can still injure, with or without a helmet.", names);
    /* the names alone may fit where the sentence around them does not */
    if (n < 0 || (size_t)n >= PLUMB_WARNING)
        snprintf(sentence, sizeof sentence,
                 "%zu of the criteria are the energies helmets are tested to, not safe limits: "
                 "a blow below them can still injure, with or without a helmet.", count);
    add_warning(item, "%s", sentence);
}

plumb_status plumb_profile_criteria_check(const plumb_profile *profile,
                                          const plumb_criteria *criteria, plumb_diag *diag)
{
    size_t named = plumb_profile_criteria_count(profile);
    for (size_t i = 0; i < named; i++) {
        const char *name = plumb_profile_criterion(profile, i);
        if (!plumb_criteria_find(criteria, name))
            return unknown_criterion(name, i, profile, criteria, diag);
    }
    return PLUMB_OK;
}

/* The rotor wake's figures and assumptions (plumb/downwash.h). Its speeds
 * are speeds of air, shown as the wind is (PLUMBP_Q_AIR). */
static void note_downwash(plumb_item_report *item, const plumb_atmosphere *atm)
{
    const plumb_fall_spec *s = item->spec;
    if (!(s->downwash.aircraft_mass_kg > 0.0 && s->downwash.disk_area_m2 > 0.0) || !atm)
        return;
    double alt = s->site_elevation_m + s->release_m[2];
    plumb_air air;
    if (plumb_atmosphere_at(atm, alt, &air) != PLUMB_OK)
        return;
    double we, wn;
    plumb_wind_at(&s->wind, s->release_m[2], &we, &wn);
    const double *v = s->velocity_m_s;
    double rel[2] = {we - v[0], wn - v[1]};
    plumb_downwash dw;
    plumb_downwash_init(&s->downwash, air.rho_kg_m3, plumb_gravity_at(&s->gravity, alt),
                        s->release_m, v, rel, &dw);
    add_warning(item,
                "Rotor downwash: by momentum theory, hover thrust " PLUMBP_Q_FORCE " over "
                PLUMBP_Q_AREA " gives v_i " PLUMBP_Q_AIR " and a far wake of " PLUMBP_Q_AIR
                "; %s it decays below the rotor as a round jet (B %.3g; plumb's blend). The "
                "aircraft is taken to keep its release velocity for the whole fall.",
                dw.thrust_n, s->downwash.disk_area_m2, dw.v_hover_m_s, 2.0 * dw.v_hover_m_s,
                dw.skew_rad > 1e-9 ? "air moving past the rotor lowers v_i (Glauert) and leans "
                                     "the wake downwind;"
                                   : "in hover",
                PLUMB_DOWNWASH_JET_B);
    if (dw.skew_rad > 1e-9)
        add_warning(item,
                    "Rotor downwash: the air moves past the rotor at " PLUMBP_Q_AIR
                    ", so v_i is " PLUMBP_Q_AIR " and the wake leans " PLUMBP_Q_ANGLE
                    " from the vertical (Glauert, Leishman 2006; from memory). The model is "
                    "for hover and slow flight, below about " PLUMBP_Q_AIR "; faster, the "
                    "wake is swept behind the aircraft and this is a rough guide only.",
                    hypot(rel[0], rel[1]), dw.v_i_m_s, dw.skew_rad * 180.0 / PLUMB_PI,
                    dw.v_hover_m_s);
}

/* Where a fall's W20 comes from, in words: the mean wind at 20 ft, an
 * intensity word's (MIL-F-8785C: light 15 kn, moderate 30 kn, severe 45 kn
 * at 20 ft), or the profile's own wind.turbulence.w20. */
static const char *w20_source(const plumb_turbulence_spec *tb)
{
    if (tb->w20_m_s <= 0.0)
        return "the mean wind at 20 ft";
    if (tb->w20_m_s == PLUMB_TURB_W20_LIGHT_M_S)
        return "that of light turbulence (MIL-F-8785C)";
    if (tb->w20_m_s == PLUMB_TURB_W20_MODERATE_M_S)
        return "that of moderate turbulence (MIL-F-8785C)";
    if (tb->w20_m_s == PLUMB_TURB_W20_SEVERE_M_S)
        return "that of severe turbulence (MIL-F-8785C)";
    return "as wind.turbulence.w20 gives it";
}

/* A device not open at impact (plumb_fall_device_at_impact): one that never
 * reached line stretch, or one whose canopy was still filling, with how far
 * along its fill time and drag area it was, since the impact figures are
 * then those of a part-filled canopy and its steady descent and Pflanz's
 * opening force (a full fill's) were never reached. */
static void warn_device_at_impact(plumb_item_report *item, size_t i)
{
    const plumb_fall_spec *s = item->spec;
    const plumb_fall_result *r = &item->result;
    const char *kind = plumb_descent_kind_name(s->descent[i].kind);
    plumb_device_at_impact at;
    switch (plumb_fall_device_at_impact(s, r, i, &at)) {
    case PLUMB_DEVICE_NOT_DEPLOYED:
        add_warning(item,
                    "The %s (descent[%zu]) does not open before impact: the figures are "
                    "those of a fall without it.", kind, i);
        break;
    case PLUMB_DEVICE_FILLING: {
        double pct_area = at.cds_full_m2 > 0.0 ? 100.0 * at.cds_m2 / at.cds_full_m2 : 0.0;
        int pflanz = s->descent[i].opening_factor > 0.0 && r->pflanz_force_n[i] > 0.0;
        add_warning(item,
                    "The %s (descent[%zu]) was still filling at impact: line stretch at %.4f s, "
                    "impact at %.4f s, %.4f s into its %.4f s fill time (%.1f %%); its drag area "
                    "was " PLUMBP_Q_AREA " of the full " PLUMBP_Q_AREA " (%.2g %%). The impact "
                    "figures are this part-filled fall's; its steady descent was not reached%s.",
                    kind, i, r->deploy_time_s[i], r->time_s, r->time_s - r->deploy_time_s[i],
                    r->fill_time_s[i], 100.0 * at.fill_fraction, at.cds_m2, at.cds_full_m2,
                    pct_area,
                    pflanz ? ", and Pflanz's opening force is that of a full fill, which this "
                             "fall did not make"
                           : "");
        break;
    }
    case PLUMB_DEVICE_REPLACED: {
        /* a device that filled before the next one replaced it did its
         * work, and the next device's state says what held at impact; one
         * cut away while still filling never reached its full drag area,
         * so its figures (Pflanz's force, a full fill's) were never felt */
        if (!(at.fill_fraction < 1.0) || i + 1 >= s->n_descent)
            break;
        double cds = plumbp_device_cds_at(&s->descent[i], at.fill_fraction);
        double pct_area = at.cds_full_m2 > 0.0 ? 100.0 * cds / at.cds_full_m2 : 0.0;
        int pflanz = s->descent[i].opening_factor > 0.0 && r->pflanz_force_n[i] > 0.0;
        add_warning(item,
                    "The %s (descent[%zu]) was cut away while still filling: the %s "
                    "(descent[%zu]) reached line stretch at %.4f s, %.4f s into the %s's "
                    "%.4f s fill time (%.1f %%), when the %s's drag area was " PLUMBP_Q_AREA " of "
                    "the full " PLUMBP_Q_AREA " (%.2g %%). It never filled%s.",
                    kind, i, plumb_descent_kind_name(s->descent[i + 1].kind), i + 1,
                    r->deploy_time_s[i + 1], r->deploy_time_s[i + 1] - r->deploy_time_s[i],
                    kind, r->fill_time_s[i], 100.0 * at.fill_fraction, kind, cds, at.cds_full_m2,
                    pct_area,
                    pflanz ? ": Pflanz's opening force for it is that of a full fill, which "
                             "this fall did not make"
                           : "");
        break;
    }
    case PLUMB_DEVICE_OPEN:
        break;
    }
}

plumb_status plumb_item_judge(plumb_item_report *item, const plumb_profile *profile,
                              const plumb_criteria *criteria, const plumb_atmosphere *atm,
                              plumb_diag *diag)
{
    if (!item || !item->spec)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no fall to judge");
    item->n_verdicts = 0;
    item->n_warnings = 0;
    const plumb_fall_result *r = &item->result;

    size_t named = profile ? plumb_profile_criteria_count(profile) : 0;
    size_t total = named ? named : plumb_criteria_count(criteria);
    if (total > PLUMB_MAX_VERDICTS)
        return PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, "criteria",
                               "%zu criteria to judge; at most %d are reported", total,
                               PLUMB_MAX_VERDICTS);
    for (size_t i = 0; i < total; i++) {
        const plumb_criterion *c;
        if (named) {
            const char *name = plumb_profile_criterion(profile, i);
            c = plumb_criteria_find(criteria, name);
            if (!c) {
                item->n_verdicts = 0;
                return unknown_criterion(name, i, profile, criteria, diag);
            }
        } else {
            c = plumb_criteria_get(criteria, i);
        }
        plumb_criterion_judge(c, r->energy_j, &item->verdicts[item->n_verdicts++]);
    }

    /* no drag at all (a fixed Cd of 0, no device): no coefficient to doubt */
    const plumb_drag_spec *dr = &item->spec->drag;
    int has_drag = dr->model != PLUMB_DRAG_FIXED || item->spec->n_descent > 0 ||
                   plumb_drag_cd_area(dr, 0.0) > 0.0;
    if (has_drag && r->max_mach > WARN_MACH)
        add_warning(item,
                    "The air speed reaches Mach %.2f on the way (above %.1f): the drag "
                    "coefficient, measured in slower air, no longer holds, so the speed and "
                    "energy are less certain.", r->max_mach, WARN_MACH);
    const plumb_drag_spec *d = &item->spec->drag;
    if (d->model == PLUMB_DRAG_SPHERE_MORRISON && r->max_re > MORRISON_RE_MAX)
        add_warning(item,
                    "The Reynolds number runs from %.3g to %.3g, beyond Morrison's sphere-drag "
                    "correlation (valid for Re up to %.0e): its drag is extrapolated there.",
                    r->min_re, r->max_re, MORRISON_RE_MAX);
    if (d->model == PLUMB_DRAG_SPHERE_CGW && r->max_re > CGW_RE_MAX)
        add_warning(item,
                    "The Reynolds number runs from %.3g to %.3g, beyond the Clift-Grace-Weber "
                    "sphere-drag curve (Re up to %.0e): its drag is extrapolated there.",
                    r->min_re, r->max_re, CGW_RE_MAX);
    if (d->extrapolated)
        add_warning(item,
                    "The shape's aspect ratio lies outside the handbook table its drag "
                    "coefficient comes from; the table's end value is used.");
    for (size_t i = 0; i < item->spec->n_descent && i < PLUMB_MAX_DESCENT; i++)
        warn_device_at_impact(item, i);
    const plumb_glide_spec *gl = &item->spec->glide;
    char why[96] = "as the profile says";
    if (gl->from_shape)
        snprintf(why, sizeof why, "I* %.3g, Andersen et al. 2005", gl->istar);
    /* no fall yet (plumb zone judges before its samples, which add the
     * glide and the gusts): the notes on what this one fall leaves out
     * would be wrong there */
    int one_fall = r->time_s > 0.0;
    if (one_fall && gl->mode != PLUMB_GLIDE_OFF && item->spec->n_descent == 0)
        add_warning(item,
                    "Plate-like: taken to %s (%s). Tumbling plates glide sideways up to 1.375 x "
                    "the height fallen in still air (" PLUMBP_Q_ANGLE " below horizontal; "
                    "Smith 1970), fluttering ones up to 0.36 x (Tinklenberg et al. 2023). "
                    "plumb zone adds the glide, this fall does not; \"radius = drop height\" "
                    "is not conservative for plates.",
                    gl->mode == PLUMB_GLIDE_TUMBLE ? "tumble" : "flutter", why,
                    atan(1.0 / 1.375) * 180.0 / PLUMB_PI);
    note_downwash(item, atm);
    /* the highest point of the fall: the release height before it is
     * computed (plumb zone's judging), its apex after */
    const plumb_wind_spec *wd = &item->spec->wind;
    double top_m = item->spec->release_m[2] > r->apex_m ? item->spec->release_m[2] : r->apex_m;
    if ((wd->profile == PLUMB_WIND_POWER || wd->profile == PLUMB_WIND_LOG) &&
        wd->speed_m_s > 0.0 && top_m > WIND_LAW_TOP_M)
        add_warning(item,
                    "The fall reaches above " PLUMBP_Q_LENGTH ", about the top of the "
                    "atmospheric boundary layer: the %s law (wind.profile) describes the wind "
                    "near the ground and is extrapolated above it, so the drift is uncertain. "
                    "Give the wind aloft as a table (wind.profile: table), from a forecast or "
                    "a sounding.",
                    WIND_LAW_TOP_M, wd->profile == PLUMB_WIND_POWER ? "power" : "log");
    const plumb_turbulence_spec *tb = &item->spec->turbulence;
    const char *w20_from = w20_source(tb);
    if (one_fall && tb->model != PLUMB_TURB_NONE && tb->n_modes == 0)
        add_warning(item,
                    "Gusts of the %s model (wind.turbulence) with W20 = " PLUMBP_Q_AIR
                    ", %s, apply only to plumb zone, where every sample "
                    "falls through its own realisation; this single fall uses the mean wind.",
                    tb->model == PLUMB_TURB_DRYDEN ? "Dryden" : "von Karman",
                    plumb_fall_w20(item->spec), w20_from);
    else if (one_fall && tb->model != PLUMB_TURB_NONE)
        add_warning(item,
                    "Gusts: this fall went through one realisation of the %s model with "
                    "W20 = " PLUMBP_Q_AIR ", %s, a sum of %zu random "
                    "Fourier modes per component.",
                    tb->model == PLUMB_TURB_DRYDEN ? "Dryden" : "von Karman",
                    plumb_fall_w20(item->spec), w20_from, tb->n_modes);
    warn_helmet_tests(item);
    return PLUMB_OK;
}

