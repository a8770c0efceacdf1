/*
 * fall_text.c - the text report of a fall: one item in full (impact,
 * verdicts, descent devices (fall_descent_text.c), inputs, air, solver)
 * or an inventory as a table with the worst item named
 * (plumb_report_fall, report.c).
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/common.h"

/* ---- text: single fall --------------------------------------------------- */

/* The title line of every text report, "plumb VERSION - what: NAME". A
 * name too long for the line is wrapped at TEXT_WIDTH onto continuation
 * lines indented under its first character, never cut; a word longer than
 * the room is broken (wrap_cell). The name is the user's own text, so the
 * whole of it is shown whatever its length. */
void plumbp_text_header(writer *w, const plumb_report_options *opt, const char *what,
                        const char *name)
{
    enum { NAME_ROOM_MIN = 24 }; /* narrowest name column before the name starts a line of its own */
    char lead[NUMBUF];
    if (opt->version)
        snprintf(lead, sizeof lead, "plumb %s - %s: ", opt->version, what);
    else
        snprintf(lead, sizeof lead, "plumb - %s: ", what);
    size_t indent = shown_width(lead);
    int first = 1;
    if (indent + NAME_ROOM_MIN > TEXT_WIDTH) {
        /* a lead too long to leave room: the name on lines of its own */
        put(w, "%.*s\n", (int)(strlen(lead) - 1), lead);
        indent = 2;
        first = 0;
    } else {
        put(w, "%s", lead);
    }
    const char *rest = name;
    do {
        char part[4 * TEXT_WIDTH + 1]; /* a line of the name, 4 bytes a character */
        rest = wrap_cell(rest, TEXT_WIDTH - indent, part, sizeof part);
        put(w, "%*s%s\n", first ? 0 : (int)indent, "", part);
        first = 0;
    } while (*rest);
}

static void text_impact(writer *w, const plumb_item_report *it)
{
    const plumb_fall_result *r = &it->result;
    put(w, "\nImpact\n");
    if (w->us)
        put(w, "  speed      %s (%s mph)%s\n", plumbp_t_speed(w, r->speed_m_s),
            num(w, r->speed_m_s / MPH_M_S, TEXT_SIG), plumbp_si_bracket(w, r->speed_m_s, "m/s"));
    else
        put(w, "  speed      %s (%s km/h)\n", plumbp_t_speed(w, r->speed_m_s),
            num(w, r->speed_m_s / KMH_M_S, TEXT_SIG));
    /* as many figures as the criteria below need to show its side of each
     * limit (plumbp_energy_sig), so that the one figure reads the same */
    put(w, "  energy     %s\n",
        plumbp_t_energy_at(w, r->energy_j, plumbp_energy_sig(it->verdicts, it->n_verdicts, TEXT_SIG)));
    put(w, "  time       %s s after release\n", num(w, r->time_s, TEXT_SIG));
    if (r->drift_m < DRIFT_SHOWN_M)
        put(w, "  drift      %s: lands below the release point\n", plumbp_t_drift(w, r->drift_m, 1));
    else
        put(w, "  drift      %s toward %s from the release point%s\n",
            plumbp_t_drift(w, r->drift_m, 1), plumbp_t_bearing(w, r->bearing_deg),
            plumbp_si_bracket(w, r->drift_m, "m"));
    const plumb_fall_spec *s = it->spec;
    if (s->release_m[0] != 0.0 || s->release_m[1] != 0.0)
        put(w, "  lands at   %s, %s of the planned drop point\n",
            plumbp_t_offset(w, r->point_m[0], "east", "west"),
            plumbp_t_offset(w, r->point_m[1], "north", "south"));
    if (w->us)
        put(w, "  momentum   %s lbf·s [%s kg·m/s]\n",
            num(w, r->momentum_kg_m_s / LBF_N, TEXT_SIG), num(w, r->momentum_kg_m_s, TEXT_SIG));
    else
        put(w, "  momentum   %s kg·m/s\n", num(w, r->momentum_kg_m_s, TEXT_SIG));
    put(w, "  angle      %s° below horizontal\n", plumbp_fixed(w, r->angle_deg, 1));
}

/* A criterion's limit, rounded down in both units (the strict side), to
 * sig significant figures. */
static void text_limit(writer *w, const plumb_criterion *c, int sig, char *buf, size_t size)
{
    snprintf(buf, size, "limit %s", plumbp_t_limit_energy_at(w, c->energy_limit_j, sig));
}

/* How sure the criterion's figure is, when it is not read in the source
 * itself (criteria files: seen | transcribed | memory). */
const char *plumbp_status_note(const plumb_criterion *c)
{
    return status_note_of(c->status);
}

static void text_verdicts(writer *w, const plumb_item_report *it)
{
    if (it->n_verdicts == 0) {
        put(w, "\nCriteria\n  none judged\n");
        return;
    }
    /* the energy and each limit with the figures that show which side of
     * it the energy is (README.md "Criteria"): never "78.64 J" within a
     * limit of "78.63 J" */
    int esig = plumbp_energy_sig(it->verdicts, it->n_verdicts, TEXT_SIG);
    put(w, "\nCriteria, against %s at impact\n", plumbp_t_energy_at(w, it->result.energy_j, esig));
    for (size_t i = 0; i < it->n_verdicts; i++) {
        const plumb_verdict *v = &it->verdicts[i];
        const plumb_criterion *c = v->criterion;
        char lim[NUMBUF * 2], line[NUMBUF * 4];
        text_limit(w, c, plumbp_limit_sig(v, esig, TEXT_SIG), lim, sizeof lim);
        put(w, "  %-8s %s\n", v->exceeds ? "EXCEEDS" : "WITHIN", c->name);
        snprintf(line, sizeof line, "%s, ratio %s, %s%s", lim, plumbp_t_ratio(w, v),
                 plumbp_verdict_word(v),
                 c->kind == PLUMB_CRIT_HELMET_TEST ? " (helmet test, not a safe limit)" : "");
        wrapped(w, "           ", line);
        char src[PLUMB_CRIT_TEXT * 2 + 2 * PLUMB_CRIT_ID + 64], quoted[PLUMB_CRIT_TEXT * 2];
        snprintf(src, sizeof src, "%s [%s]%s%s%s",
                 c->source[0] ? plumbp_t_source(w, c, quoted, sizeof quoted) : "source not given",
                 c->id, plumbp_status_note(c)[0] ? " (" : "", plumbp_status_note(c),
                 plumbp_status_note(c)[0] ? ")" : "");
        wrapped(w, "           source: ", src);
    }
}

static void text_comparison(writer *w, const plumb_item_report *it)
{
    const plumb_fall_result *r = &it->result;
    put(w, "\nFor comparison\n");
    if (r->terminal_speed_m_s > 0.0) {
        char line[NUMBUF * 4];
        snprintf(line, sizeof line, "%s in still air at the strike level%s%s",
                 plumbp_t_speed(w, r->terminal_speed_m_s),
                 /* the body's own: the devices' is the steady descent below */
                 it->spec->n_descent ? ", without the descent devices" : "",
                 plumbp_si_bracket(w, r->terminal_speed_m_s, "m/s"));
        wrapped(w, "  terminal speed   ", line);
    } else if (plumb_drag_given_cd_area(&it->spec->drag) > 0.0 ||
             it->spec->drag.model != PLUMB_DRAG_FIXED)
        put(w, "  terminal speed   none up to %s: too little drag for the weight\n",
            plumbp_t_speed(w, PLUMB_TERMINAL_MAX_M_S));
    else
        put(w, "  terminal speed   none: without drag the speed grows without bound\n");
    put(w, "  without drag     %s, %s%s\n", plumbp_t_speed(w, r->drag_free_speed_m_s),
        plumbp_t_energy(w, r->drag_free_energy_j),
        it->spec->volume_m3 > 0.0 ? " (and without buoyancy)" : "");
    /* the air's work on the body: taken from it, or, in a wind that
     * drives it faster than it would fall, given to it */
    if (r->drag_free_energy_j > 0.0 && r->drag_work_j < 0.0)
        put(w, "  drag took        %s, %s %% of the drag-free energy\n",
            plumbp_t_energy(w, -r->drag_work_j),
            num(w, -100.0 * r->drag_work_j / r->drag_free_energy_j, RATIO_SIG));
    else if (r->drag_free_energy_j > 0.0 && r->drag_work_j > 0.0)
        put(w, "  wind added       %s, %s %% above the drag-free energy\n",
            plumbp_t_energy(w, r->drag_work_j),
            num(w, 100.0 * r->drag_work_j / r->drag_free_energy_j, RATIO_SIG));
    if (r->apex_m > it->spec->release_m[2])
        put(w, "  highest point    %s above the strike level\n", plumbp_t_len(w, r->apex_m));
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
            snprintf(shape, sizeof shape, "sphere of diameter %s, ",
                     plumbp_t_size(w, sh->dims_m[0]));
            break;
        case PLUMB_SHAPE_CYLINDER:
            snprintf(shape, sizeof shape, "cylinder %s long, diameter %s, %s, ",
                     plumbp_t_size(w, sh->dims_m[0]), plumbp_t_size(w, sh->dims_m[1]),
                     plumbp_attitude_name(sh->attitude));
            break;
        case PLUMB_SHAPE_BOX:
            snprintf(shape, sizeof shape, "box %s x %s x %s, %s, ", plumbp_t_size(w, sh->dims_m[0]),
                     plumbp_t_size(w, sh->dims_m[1]), plumbp_t_size(w, sh->dims_m[2]),
                     plumbp_attitude_name(sh->attitude));
            break;
        default:
            snprintf(shape, sizeof shape, "plate %s x %s, %s thick, %s, ",
                     plumbp_t_size(w, sh->dims_m[0]), plumbp_t_size(w, sh->dims_m[1]),
                     plumbp_t_size(w, sh->dims_m[2]), plumbp_attitude_name(sh->attitude));
            break;
        }
    }
    char how[NUMBUF * 4];
    if (d->model == PLUMB_DRAG_SPHERE_MORRISON || d->model == PLUMB_DRAG_SPHERE_CGW) {
        const plumb_fall_result *r = &it->result;
        shape[0] = '\0'; /* the sphere is named once, with its drag law */
        snprintf(how, sizeof how, "sphere of diameter %s, Cd(Re) by %s; Re %s to %s on the way",
                 plumbp_t_size(w, d->diameter_m),
                 d->model == PLUMB_DRAG_SPHERE_CGW ? "Clift, Grace & Weber (1978)"
                                                   : "Morrison (2010)",
                 plumbp_sci(w, r->min_re, 3), plumbp_sci(w, r->max_re, 3));
    } else if (plumb_drag_given_cd_area(d) == 0.0) {
        snprintf(how, sizeof how, "none (drag-free)");
    } else if (d->area_m2 > 0.0) {
        snprintf(how, sizeof how, "Cd %s on %s, CdA %s", plumbp_gnum(w, d->cd, INPUT_SIG),
                 plumbp_t_area(w, d->area_m2), plumbp_t_area(w, plumb_drag_given_cd_area(d)));
    } else {
        snprintf(how, sizeof how, "CdA %s", plumbp_t_area(w, d->cd_area_m2));
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
        /* the object's own speed, in the unit of every object speed (ft/s
         * in US units); mph and knots are for the wind */
        const char *ground = plumbp_t_speed(w, hs);
        if (hs > 0.0 && v[2] == 0.0)
            snprintf(vel, sizeof vel, "moving %s toward %s, level", ground,
                     plumbp_t_bearing(w, heading));
        else if (hs > 0.0)
            snprintf(vel, sizeof vel, "moving %s toward %s, %s %s", ground,
                     plumbp_t_bearing(w, heading), v[2] > 0.0 ? "climbing" : "sinking",
                     plumbp_t_speed(w, fabs(v[2])));
        else
            snprintf(vel, sizeof vel, "moving straight %s at %s", v[2] > 0.0 ? "up" : "down",
                     plumbp_t_speed(w, fabs(v[2])));
    }
    char pos[NUMBUF * 3] = "";
    if (s->release_m[0] != 0.0 || s->release_m[1] != 0.0)
        snprintf(pos, sizeof pos, ", %s and %s of the planned drop point",
                 plumbp_t_offset(w, s->release_m[0], "east", "west"),
                 plumbp_t_offset(w, s->release_m[1], "north", "south"));
    snprintf(buf, size, "%s above the strike level, %s%s", plumbp_t_len(w, s->release_m[2]), vel,
             pos);
    w->exact = 0;
}

void plumbp_text_atmosphere(writer *w, const plumb_atm_spec *a, char *buf, size_t size)
{
    char what[NUMBUF * 4];
    switch (a->model) {
    case PLUMB_ATM_SURFACE:
        w->exact = 1;
        snprintf(what, sizeof what, "surface: station %s, %s, lapse rate %s",
                 plumbp_t_press(w, a->station_pressure_pa),
                 plumbp_t_temp(w, a->station_temperature_k), plumbp_t_lapse(w, a->lapse_rate_k_m));
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
                     "U.S. Standard Atmosphere 1976, temperature offset %s%s" NBSP "°F [%s" NBSP
                     "K]",
                     a->temperature_offset_k > 0.0 ? "+" : "",
                     plumbp_gnum(w, a->temperature_offset_k * FAHRENHEIT_PER_K, 3),
                     plumbp_gnum(w, a->temperature_offset_k, 3));
        else if (a->temperature_offset_k != 0.0)
            snprintf(what, sizeof what,
                     "U.S. Standard Atmosphere 1976, temperature offset %s%s" NBSP "K",
                     a->temperature_offset_k > 0.0 ? "+" : "",
                     plumbp_gnum(w, a->temperature_offset_k, 3));
        else
            snprintf(what, sizeof what, "U.S. Standard Atmosphere 1976");
        break;
    }
    if (a->relative_humidity > 0.0)
        snprintf(buf, size, "%s, relative humidity %s" NBSP "%%", what,
                 plumbp_gnum(w, a->relative_humidity * 100.0, 3));
    else
        snprintf(buf, size, "%s, dry", what);
}

static void text_air_line(writer *w, const char *lead, const plumb_air *a)
{
    char line[NUMBUF * 6];
    snprintf(line, sizeof line, "%s, %s, %s", plumbp_t_temp(w, a->t_k), plumbp_t_press(w, a->p_pa),
             plumbp_t_density(w, a->rho_kg_m3));
    wrapped(w, lead, line);
}

static void text_wind(writer *w, const plumb_fall_spec *s, const item_air *ia, char *buf,
                      size_t size)
{
    const plumb_wind_spec *wd = &s->wind;
    char at_release[NUMBUF * 3];
    snprintf(at_release, sizeof at_release, "%s from %s at the release height",
             plumbp_t_wind(w, ia->wind_release[0]), plumbp_t_bearing(w, ia->wind_release[1]));
    w->exact = 1;
    switch (wd->profile) {
    case PLUMB_WIND_POWER:
        snprintf(buf, size, "%s from %s at %s, power law exponent %s; %s",
                 plumbp_t_wind(w, wd->speed_m_s), plumbp_t_bearing(w, wd->from_deg),
                 plumbp_t_len(w, wd->ref_height_m), plumbp_gnum(w, wd->exponent, INPUT_SIG),
                 at_release);
        break;
    case PLUMB_WIND_LOG:
        snprintf(buf, size, "%s from %s at %s, log law roughness %s; %s",
                 plumbp_t_wind(w, wd->speed_m_s), plumbp_t_bearing(w, wd->from_deg),
                 plumbp_t_len(w, wd->ref_height_m), plumbp_t_len(w, wd->roughness_m), at_release);
        break;
    case PLUMB_WIND_TABLE: {
        /* The rows themselves when they are few enough to read. */
        size_t len = (size_t)snprintf(buf, size, "table:");
        for (size_t i = 0; i < wd->table_n && len < size; i++) {
            double sp, from;
            plumbp_wind_polar(wd->table_east_m_s[i], wd->table_north_m_s[i], &sp, &from);
            if (wd->table_n > WIND_ROWS_SHOWN) {
                len += (size_t)snprintf(buf + len, size - len, " %zu heights;", wd->table_n);
                break;
            }
            len +=
                (size_t)snprintf(buf + len, size - len, " %s from %s at %s;", plumbp_t_wind(w, sp),
                                 plumbp_t_bearing(w, from), plumbp_t_len(w, wd->table_h_m[i]));
        }
        if (len < size)
            snprintf(buf + len, size - len, " %s", at_release);
        break;
    }
    default:
        if (wd->speed_m_s == 0.0)
            snprintf(buf, size, "calm");
        else
            snprintf(buf, size, "%s from %s at every height", plumbp_t_wind(w, wd->speed_m_s),
                     plumbp_t_bearing(w, wd->from_deg));
        break;
    }
    w->exact = 0;
}

static void text_site(writer *w, const plumb_fall_spec *s, const item_air *ia, char *buf,
                      size_t size)
{
    char g[NUMBUF * 2];
    if (s->gravity.has_latitude)
        snprintf(g, sizeof g, "latitude %s°, WGS" NBSP "84 gravity %s",
                 plumbp_gnum(w, s->gravity.latitude_deg, 6), plumbp_t_gravity(w, ia->g_m_s2));
    else
        snprintf(g, sizeof g, "standard gravity %s", plumbp_t_gravity(w, ia->g_m_s2));
    w->exact = 1;
    snprintf(buf, size, "strike level %s above mean sea level; %s",
             plumbp_t_len(w, s->site_elevation_m), g);
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
        snprintf(mass, sizeof mass, "%s%s", plumbp_t_mass(w, s->mass_kg),
                 s->volume_m3 > 0.0 ? ", buoyancy included" : "");
        w->exact = 0;
        wrapped(w, "  mass        ", mass);
        text_drag(w, it, line, sizeof line);
        wrapped(w, "  drag        ", line);
    }
    text_release(w, s, line, sizeof line);
    wrapped(w, "  release     ", line);
    if (s->downwash.aircraft_mass_kg > 0.0 && s->downwash.disk_area_m2 > 0.0) {
        /* the rotor wake's inputs, beside the warnings that give its figures */
        char mass[NUMBUF * 3], area[NUMBUF * 3];
        w->exact = 1;
        snprintf(mass, sizeof mass, "%s", plumbp_t_mass(w, s->downwash.aircraft_mass_kg));
        snprintf(area, sizeof area, "%s", plumbp_t_area(w, s->downwash.disk_area_m2));
        w->exact = 0;
        snprintf(line, sizeof line, "aircraft mass %s, rotor disk area %s (all rotors)", mass,
                 area);
        wrapped(w, "  downwash    ", line);
    }
    text_site(w, s, ia, line, sizeof line);
    wrapped(w, "  site        ", line);
    plumbp_text_atmosphere(w, plumb_profile_atmosphere(p), line, sizeof line);
    wrapped(w, "  atmosphere  ", line);
    text_air_line(w, "  air         strike level  ", &ia->at[0]);
    text_air_line(w, "              release       ", &ia->at[1]);
    text_wind(w, s, ia, line, sizeof line);
    wrapped(w, "  wind        ", line);
}

static void text_solver(writer *w, const plumb_item_report *it)
{
    const plumb_solver_stats *st = &it->result.solver;
    put(w, "  solver      %s, %zu step%s, %zu right-hand-side evaluation%s\n",
        st->method ? st->method : "unknown", st->steps, plumbp_s(st->steps), st->rhs_evaluations,
        plumbp_s(st->rhs_evaluations));
}

void plumbp_text_profile(writer *w, const plumb_profile *p)
{
    put(w, "\nProfile  %s\nSHA-256  %s\n", plumb_profile_path(p), plumb_profile_sha256(p));
}

void plumbp_text_single(writer *w, const plumb_report_options *opt, const plumb_fall_report *rep,
                        const item_air *ia)
{
    const plumb_item_report *it = &rep->items[0];
    plumbp_text_header(w, opt, "fall", plumb_profile_name(rep->profile));
    text_impact(w, it);
    text_verdicts(w, it);
    text_comparison(w, it);
    plumbp_text_descent(w, it, NULL);
    if (it->n_warnings) {
        put(w, "\nWarnings\n");
        for (size_t i = 0; i < it->n_warnings; i++) {
            char text[PLUMB_WARNING * 2];
            wrapped(w, "  - ", plumbp_t_warning(w, it->warnings[i], text, sizeof text));
        }
    }
    put(w, "\nInputs as understood\n");
    text_inputs(w, it, rep->profile, ia, 1);
    text_solver(w, it);
    plumbp_text_profile(w, rep->profile);
    plumbp_caution_lines_text(w);
}

/* ---- text: inventory ----------------------------------------------------- */

/* An item's verdict on criterion k as a table cell (verdict_cell). */
static void inventory_verdict(writer *w, const plumb_verdict *v, size_t gap, size_t ratio_w,
                              int last)
{
    verdict_cell(w, gap, ratio_w, plumbp_t_ratio(w, v), v->exceeds ? "EXCEEDS" : "within",
                 last);
}

/* The two header lines' criterion cells k0..k1 of an inventory table. */
static void inventory_crit_heads(writer *w, size_t k0, size_t k1, size_t gap, const size_t *rw,
                                 int units)
{
    for (size_t k = k0; k < k1; k++) {
        if (units) {
            verdict_cell(w, gap, rw[k], "ratio", "verdict", k + 1 == k1);
        } else {
            char h[32];
            snprintf(h, sizeof h, "C%zu", k + 1);
            pad(w, h, verdict_cell_width(gap, rw[k]), 1);
        }
    }
}

/* The continuation lines of a name wrapped in its table column, under
 * the "%4zu " of the item's number. */
static void name_continued(writer *w, const char *rest, size_t name_w)
{
    cell_continued(w, 5, rest, name_w);
}

void plumbp_text_inventory(writer *w, const plumb_report_options *opt, const plumb_fall_report *rep,
                           const item_air *ia)
{
    const plumb_item_report *first = &rep->items[0];
    size_t nv = first->n_verdicts;
    plumbp_text_header(w, opt, "fall, inventory", plumb_profile_name(rep->profile));
    put(w, "%zu item%s, each falling alone under the same release, site, air and wind.\n",
        rep->n_items, plumbp_s(rep->n_items));

    /* Columns: number, item name, five figures, then one per criterion.
     * The table keeps to TABLE_WIDTH columns: a long name is wrapped onto
     * continuation lines of its own column, never cut, and criteria that
     * do not fit beside the figures get a table of their own, as many per
     * block as fit. Each criterion's ratios are right-aligned in a column
     * as wide as the widest of them, its verdict words left-aligned beside
     * it (verdict_cell). */
    enum { NUM_W = 10, NUM_GAP = 4, CRIT_GAP = 2, NO_W = 5, NAME_MIN = 4 };
    size_t name_w = NAME_MIN;
    for (size_t i = 0; i < rep->n_items; i++) {
        size_t n = shown_width(rep->items[i].spec->name);
        if (n > name_w)
            name_w = n;
    }
    size_t figs_w = NO_W + 5 * NUM_W;
    if (name_w > TABLE_WIDTH - figs_w)
        name_w = TABLE_WIDTH - figs_w;
    size_t rw[PLUMB_MAX_VERDICTS], crit_w = 0;
    for (size_t k = 0; k < nv && k < PLUMB_MAX_VERDICTS; k++) {
        rw[k] = shown_width("ratio");
        for (size_t i = 0; i < rep->n_items; i++) {
            size_t n = shown_width(plumbp_t_ratio(w, &rep->items[i].verdicts[k]));
            if (n > rw[k])
                rw[k] = n;
        }
        crit_w += verdict_cell_width(CRIT_GAP, rw[k]);
    }
    int inline_crit = figs_w + name_w + crit_w <= TABLE_WIDTH;
    const char *u_mass = w->us ? "lb" : "kg", *u_speed = w->us ? "ft/s" : "m/s";
    const char *u_len = w->us ? "ft" : "m";
    put(w, "\n   # ");
    pad(w, "item", name_w, 0);
    const char *heads[] = {"mass", "speed", "energy", "energy", "drift"};
    for (size_t k = 0; k < 5; k++) {
        if (k == 2) { /* one header over the energy in both units */
            put(w, "%*s", NUM_GAP, "");
            span_head(w, heads[k], 2 * NUM_W - NUM_GAP);
            k++;
            continue;
        }
        pad(w, heads[k], NUM_W, 1);
    }
    if (inline_crit)
        inventory_crit_heads(w, 0, nv, CRIT_GAP, rw, 0);
    put(w, "\n     ");
    pad(w, "", name_w, 0);
    /* energy in the display system's unit first, as everywhere else */
    const char *units[] = {u_mass, u_speed, w->us ? "ft·lbf" : "J", w->us ? "J" : "ft·lbf",
                           u_len};
    for (size_t k = 0; k < 5; k++)
        pad(w, units[k], NUM_W, 1);
    if (inline_crit)
        inventory_crit_heads(w, 0, nv, CRIT_GAP, rw, 1);
    put(w, "\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_item_report *it = &rep->items[i];
        const plumb_fall_result *r = &it->result;
        char part[PLUMB_NAME];
        const char *rest = wrap_cell(it->spec->name, name_w, part, sizeof part);
        put(w, "%4zu ", plumb_profile_item_number(rep->profile, i));
        pad(w, part, name_w, 0);
        double conv_len = w->us ? PLUMB_FT_M : 1.0;
        double e_j = r->energy_j, e_ftlbf = r->energy_j / PLUMB_FT_LBF_J;
        int esig = plumbp_energy_sig(it->verdicts, it->n_verdicts, TEXT_SIG);
        pad(w, plumbp_gnum(w, it->spec->mass_kg / (w->us ? PLUMB_LB_KG : 1.0), TEXT_SIG), NUM_W, 1);
        pad(w, num(w, r->speed_m_s / conv_len, TEXT_SIG), NUM_W, 1);
        pad(w, num(w, w->us ? e_ftlbf : e_j, esig), NUM_W, 1);
        pad(w, num(w, w->us ? e_j : e_ftlbf, esig), NUM_W, 1);
        pad(w, plumbp_t_drift(w, r->drift_m, 0), NUM_W, 1); /* as the single fall's */
        for (size_t k = 0; inline_crit && k < nv; k++)
            inventory_verdict(w, &it->verdicts[k], CRIT_GAP, rw[k], k + 1 == nv);
        put(w, "\n");
        name_continued(w, rest, name_w);
    }
    /* the verdicts, in blocks of as many criteria as fit */
    for (size_t k0 = 0; !inline_crit && k0 < nv;) {
        size_t k1 = k0, used = NO_W + name_w;
        while (k1 < nv &&
               (k1 == k0 || used + verdict_cell_width(CRIT_GAP, rw[k1]) <= TABLE_WIDTH))
            used += verdict_cell_width(CRIT_GAP, rw[k1++]);
        put(w, "\n   # ");
        pad(w, "item", name_w, 0);
        inventory_crit_heads(w, k0, k1, CRIT_GAP, rw, 0);
        put(w, "\n     ");
        pad(w, "", name_w, 0);
        inventory_crit_heads(w, k0, k1, CRIT_GAP, rw, 1);
        put(w, "\n");
        for (size_t i = 0; i < rep->n_items; i++) {
            const plumb_item_report *it = &rep->items[i];
            char part[PLUMB_NAME];
            const char *rest = wrap_cell(it->spec->name, name_w, part, sizeof part);
            put(w, "%4zu ", plumb_profile_item_number(rep->profile, i));
            pad(w, part, name_w, 0);
            for (size_t k = k0; k < k1; k++)
                inventory_verdict(w, &it->verdicts[k], CRIT_GAP, rw[k], k + 1 == k1);
            put(w, "\n");
            name_continued(w, rest, name_w);
        }
        k0 = k1;
    }

    if (nv) {
        put(w, "\nCriteria\n");
        for (size_t k = 0; k < nv; k++) {
            const plumb_criterion *c = first->verdicts[k].criterion;
            char lead[32], lim[NUMBUF * 2];
            char line[PLUMB_CRIT_TEXT * 4 + PLUMB_CRIT_ID + NUMBUF * 3], quoted[PLUMB_CRIT_TEXT * 2];
            snprintf(lead, sizeof lead, "  C%zu  ", k + 1);
            text_limit(w, c, plumbp_report_limit_sig(rep, k, TEXT_SIG), lim, sizeof lim);
            snprintf(line, sizeof line, "%s [%s]: %s%s; source: %s%s%s%s", c->name, c->id, lim,
                     c->kind == PLUMB_CRIT_HELMET_TEST ? " (helmet test, not a safe limit)" : "",
                     plumbp_t_source(w, c, quoted, sizeof quoted), plumbp_status_note(c)[0] ? " (" : "",
                     plumbp_status_note(c), plumbp_status_note(c)[0] ? ")" : "");
            wrapped(w, lead, line);
        }
    }

    size_t wi = plumbp_worst_item(rep), di = plumbp_largest_drift_item(rep);
    const plumb_item_report *worst = &rep->items[wi], *drift = &rep->items[di];
    char line[PLUMB_NAME + NUMBUF * 6];
    long sk = plumbp_strictest(worst);
    if (sk >= 0)
        snprintf(line, sizeof line, "%s: %s at %s, %s times the strictest limit, C%ld of %s: %s",
                 worst->spec->name,
                 plumbp_t_energy_at(w, worst->result.energy_j,
                                    plumbp_energy_sig(worst->verdicts, worst->n_verdicts, TEXT_SIG)),
                 plumbp_t_speed(w, worst->result.speed_m_s),
                 plumbp_t_ratio(w, &worst->verdicts[sk]), sk + 1,
                 plumbp_t_limit_energy_at(w, worst->verdicts[sk].criterion->energy_limit_j,
                                          plumbp_report_limit_sig(rep, (size_t)sk, TEXT_SIG)),
                 plumbp_verdict_word(&worst->verdicts[sk]));
    else
        snprintf(line, sizeof line, "%s: %s at %s", worst->spec->name,
                 plumbp_t_energy(w, worst->result.energy_j),
                 plumbp_t_speed(w, worst->result.speed_m_s));
    put(w, "\n");
    wrapped(w, "Worst item     ", line);
    if (drift->result.drift_m < DRIFT_SHOWN_M)
        snprintf(line, sizeof line, "none: every item lands below the release point");
    else
        snprintf(line, sizeof line, "%s: %s toward %s", drift->spec->name,
                 plumbp_t_len(w, drift->result.drift_m),
                 plumbp_t_bearing(w, drift->result.bearing_deg));
    /* a plate's glide is not in the fall (judge.c warns): the largest
     * sideways travel it may add, beside the drift computed; a distance to
     * keep clear, so rounded up */
    const plumb_item_report *plate = NULL;
    double glide = 0.0;
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_fall_spec *s = rep->items[i].spec;
        double g = s->glide.mode != PLUMB_GLIDE_OFF && s->n_descent == 0
                       ? plumb_glide_ratio_max(s->glide.mode) * s->release_m[2]
                       : 0.0;
        if (g > glide) {
            glide = g;
            plate = &rep->items[i];
        }
    }
    if (plate) {
        size_t len = strlen(line);
        snprintf(line + len, sizeof line - len,
                 "; not counting the glide of %s, a plate, which may carry it up to %s "
                 "sideways (see Warnings)",
                 plate->spec->name, plumbp_t_clear(w, plumbp_t_len, glide));
    }
    wrapped(w, "Largest drift  ", line);

    for (size_t i = 0; i < rep->n_items; i++) {
        if (rep->items[i].spec->n_descent == 0)
            continue;
        plumbp_text_descent(w, &rep->items[i], rep->items[i].spec->name);
    }

    int any_warning = 0;
    for (size_t i = 0; i < rep->n_items; i++)
        any_warning |= rep->items[i].n_warnings > 0;
    if (any_warning) {
        put(w, "\nWarnings\n");
        plumbp_each_warning(w, rep, plumbp_text_warning_line);
    }

    put(w, "\nInputs as understood\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_item_report *it = &rep->items[i];
        char lead[32], text[PLUMB_NAME + PLUMB_DRAG_SOURCE + NUMBUF * 10];
        char drag[PLUMB_DRAG_SOURCE + NUMBUF * 8];
        snprintf(lead, sizeof lead, "  %4zu  ", plumb_profile_item_number(rep->profile, i));
        text_drag(w, it, drag, sizeof drag);
        w->exact = 1;
        snprintf(text, sizeof text, "%s: %s%s; drag %s", it->spec->name,
                 plumbp_t_mass(w, it->spec->mass_kg),
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
    put(w, "  solver      %s, %zu step%s, %zu right-hand-side evaluation%s in all\n",
        method ? method : "unknown", steps, plumbp_s(steps), evals, plumbp_s(evals));
    plumbp_text_profile(w, rep->profile);
    plumbp_caution_lines_text(w);
}
