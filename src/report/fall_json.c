/*
 * fall_json.c - the JSON report of a fall (jansson), always SI with the
 * unit-suffixed keys README.md "plumb fall" fixes; numbers with 17
 * significant digits, enough for any IEEE 754 double to read back exactly
 * (IEEE 754-2008, section 5.12.2). The item object is shared with the
 * sweep.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/version.h"
#include "report/common.h"

/* ---- JSON ----------------------------------------------------------------- */

static json_t *jvec(jctx *j, const double *x, size_t n)
{
    json_t *a = jarr(j);
    for (size_t i = 0; i < n; i++)
        jpush(j, a, jreal(j, x[i]));
    return a;
}

json_t *plumbp_j_air(jctx *j, const plumb_air *a)
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
    /* README.md "plumb fall" fixes the key as a number: 0 for a drift the
     * text calls none, as the CSV leaves it empty */
    jset(j, o, "bearing_deg", jreal(j, r->drift_m < DRIFT_SHOWN_M ? 0.0 : r->bearing_deg));
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
        jset(j, o, "kind", jstr(j, plumbp_crit_kind_name(c->kind)));
        jset(j, o, "applies_to", jstr(j, c->applies_to));
        jset(j, o, "status", jstr(j, c->status));
        jset(j, o, "energy_limit_j", jreal(j, c->energy_limit_j));
        jset(j, o, "energy_j", jreal(j, v->energy_j));
        jset(j, o, "ratio", jreal(j, v->ratio));
        jset(j, o, "verdict", jstr(j, plumbp_verdict_word(v)));
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
        const plumb_canopy_info *ci = plumb_canopy_info_of(d->canopy);
        json_t *inf = jobj(j);
        jset(j, inf, "canopy", ci ? jstr(j, ci->name) : json_null());
        jset(j, inf, "exponent", jreal(j, d->inflation_exponent > 0.0 ? d->inflation_exponent : 1.0));
        jset(j, inf, "opening_factor",
             d->opening_factor > 0.0 ? jreal(j, d->opening_factor) : json_null());
        jset(j, inf, "source",
             jstr(j, ci ? ci->source
                        : d->inflation_exponent > 0.0 ? "given in the profile"
                                                      : "linear fill: no canopy type or exponent given"));
        jset(j, dv, "inflation", inf);
        jset(j, dv, "deployed", json_boolean(r->deployed[i]));
        /* its state at impact: a canopy still filling is not open; one
         * replaced before the end of its fill was cut away part-filled */
        plumb_device_at_impact at;
        plumb_device_state st = plumb_fall_device_at_impact(s, r, i, &at);
        json_t *ai = jobj(j);
        jset(j, ai, "state", jstr(j, st == PLUMB_DEVICE_OPEN       ? "open"
                                     : st == PLUMB_DEVICE_FILLING  ? "filling"
                                     : st == PLUMB_DEVICE_REPLACED && at.fill_fraction < 1.0
                                         ? "cut_away_filling"
                                     : st == PLUMB_DEVICE_REPLACED ? "replaced"
                                                                   : "not_deployed"));
        jset(j, ai, "fill_fraction", jreal(j, at.fill_fraction));
        jset(j, ai, "drag_area_m2", jreal(j, at.cds_m2));
        jset(j, ai, "drag_area_full_m2", jreal(j, at.cds_full_m2));
        jset(j, dv, "at_impact", ai);
        if (r->deployed[i]) {
            json_t *ls = jobj(j);
            jset(j, ls, "time_s", jreal(j, r->deploy_time_s[i]));
            jset(j, ls, "height_m", jreal(j, r->deploy_height_m[i]));
            jset(j, ls, "airspeed_m_s", jreal(j, r->deploy_speed_m_s[i]));
            jset(j, dv, "line_stretch", ls);
            jset(j, dv, "fill_time_used_s", jreal(j, r->fill_time_s[i]));
            if (r->fill_time_s[i] > 0.0) {
                json_t *pf = jobj(j);
                jset(j, pf, "method", jstr(j, "Pflanz (Knacke 1991): weightless, horizontal "
                                              "deployment, constant density, point mass"));
                jset(j, pf, "ballistic_parameter", jreal(j, r->pflanz_a[i]));
                jset(j, pf, "x1", jreal(j, r->pflanz_x1[i]));
                jset(j, pf, "q1_cds0_n", jreal(j, r->pflanz_q1s_n[i]));
                jset(j, pf, "opening_force_n",
                     d->opening_factor > 0.0 ? jreal(j, r->pflanz_force_n[i]) : json_null());
                jset(j, pf, "opening_load_g",
                     d->opening_factor > 0.0
                         ? jreal(j, r->pflanz_force_n[i] / (s->mass_kg * PLUMB_G0_M_S2))
                         : json_null());
                /* the estimate is a full fill's: false when the canopy was still
                 * filling at impact, so the force shown was never felt */
                jset(j, pf, "full_fill_reached", json_boolean(at.fill_fraction >= 1.0));
                jset(j, dv, "pflanz", pf);
            } else {
                jset(j, dv, "pflanz", json_null());
            }
        } else {
            jset(j, dv, "line_stretch", json_null());
        }
        jpush(j, devs, dv);
    }
    jset(j, o, "devices", devs);
    jset(j, o, "peak_force_n", jreal(j, r->peak_force_n));
    jset(j, o, "peak_load_g", jreal(j, r->peak_load_g));
    /* null when there is none, as terminal_speed_m_s */
    jset(j, o, "steady_speed_m_s",
         r->steady_speed_m_s > 0.0 ? jreal(j, r->steady_speed_m_s) : json_null());
    /* with only the devices this fall opened (filled before impact,
     * plumb_fall_opened_devices): null when none opened */
    jset(j, o, "steady_speed_opened_m_s",
         r->steady_opened_m_s > 0.0 ? jreal(j, r->steady_opened_m_s) : json_null());
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
    jset(j, drag, "model", jstr(j, plumbp_drag_model_name(d->model)));
    if (d->model == PLUMB_DRAG_FIXED) {
        jset(j, drag, "cd", jreal(j, d->cd));
        jset(j, drag, "area_m2", jreal(j, d->area_m2));
        jset(j, drag, "cd_area_m2", jreal(j, plumb_drag_given_cd_area(d)));
    } else {
        jset(j, drag, "diameter_m", jreal(j, d->diameter_m));
        jset(j, drag, "reynolds_min", jreal(j, it->result.min_re));
        jset(j, drag, "reynolds_max", jreal(j, it->result.max_re));
    }
    jset(j, drag, "source", jstr(j, d->source));
    jset(j, o, "drag", drag);
    if (it->shape && it->shape->kind != PLUMB_SHAPE_NONE) {
        json_t *sh = jobj(j);
        jset(j, sh, "kind", jstr(j, plumbp_shape_kind_name(it->shape->kind)));
        size_t nd = it->shape->kind == PLUMB_SHAPE_SPHERE ? 1
                    : it->shape->kind == PLUMB_SHAPE_CYLINDER ? 2 : 3;
        jset(j, sh, "dims_m", jvec(j, it->shape->dims_m, nd));
        jset(j, sh, "attitude", jstr(j, plumbp_attitude_name(it->shape->attitude)));
        jset(j, o, "shape", sh);
    }

    json_t *rel = jobj(j);
    jset(j, rel, "height_m", jreal(j, s->release_m[2]));
    jset(j, rel, "position_m", jvec(j, s->release_m, 2));
    jset(j, rel, "velocity_m_s", jvec(j, s->velocity_m_s, 3));
    if (s->downwash.aircraft_mass_kg > 0.0 && s->downwash.disk_area_m2 > 0.0) {
        json_t *dw = jobj(j);
        jset(j, dw, "aircraft_mass_kg", jreal(j, s->downwash.aircraft_mass_kg));
        jset(j, dw, "disk_area_m2", jreal(j, s->downwash.disk_area_m2));
        jset(j, rel, "downwash", dw);
    }
    jset(j, o, "release", rel);

    json_t *site = jobj(j);
    jset(j, site, "elevation_m", jreal(j, s->site_elevation_m));
    jset(j, site, "latitude_deg",
         s->gravity.has_latitude ? jreal(j, s->gravity.latitude_deg) : json_null());
    jset(j, site, "gravity_m_s2", jreal(j, ia->g_m_s2));
    jset(j, o, "site", site);

    const plumb_atm_spec *a = plumb_profile_atmosphere(p);
    json_t *atm = jobj(j);
    jset(j, atm, "model", jstr(j, plumbp_atm_model_name(a->model)));
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
    jset(j, atm, "strike_level", plumbp_j_air(j, &ia->at[0]));
    jset(j, atm, "release", plumbp_j_air(j, &ia->at[1]));
    jset(j, o, "atmosphere", atm);

    const plumb_wind_spec *wd = &s->wind;
    json_t *wind = jobj(j);
    jset(j, wind, "profile", jstr(j, plumbp_wind_profile_name(wd->profile)));
    if (wd->profile == PLUMB_WIND_TABLE) {
        json_t *rows = jarr(j);
        for (size_t i = 0; i < wd->table_n; i++) {
            json_t *row = jobj(j);
            double sp, from;
            plumbp_wind_polar(wd->table_east_m_s[i], wd->table_north_m_s[i], &sp, &from);
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
void plumbp_j_item_into(jctx *j, json_t *o, const plumb_item_report *it, const plumb_profile *p,
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
        jpush(j, warn, jwarning(j, it->warnings[i]));
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

json_t *plumbp_j_profile(jctx *j, const plumb_profile *p)
{
    json_t *o = jobj(j);
    jset(j, o, "path", jstr(j, plumb_profile_path(p)));
    jset(j, o, "name", jstr(j, plumb_profile_name(p)));
    jset(j, o, "sha256", jstr(j, plumb_profile_sha256(p)));
    return o;
}

/* One shape for a single payload and a kit: a single payload is a kit of
 * one ("inventory", "items", "worst", "largest_drift" always there), and
 * keeps its figures at the top level of o too, where README.md "plumb
 * fall" fixes them. Used by the fall report and by every row of a sweep. */
void plumbp_j_items_into(jctx *j, json_t *o, const plumb_fall_report *rep, const item_air *ia)
{
    int kit = plumb_profile_is_inventory(rep->profile);
    if (!kit) {
        /* its figures, and its number, at the top level as in its item */
        plumbp_j_item_into(j, o, &rep->items[0], rep->profile, &ia[0]);
        jset(j, o, "item_number", jint(j, plumb_profile_item_number(rep->profile, 0)));
    }
    jset(j, o, "inventory", json_boolean(kit));
    json_t *items = jarr(j);
    for (size_t i = 0; i < rep->n_items; i++) {
        json_t *io = jobj(j);
        /* the number items[N] gives it: as written, kept after a removal */
        jset(j, io, "item_number", jint(j, plumb_profile_item_number(rep->profile, i)));
        plumbp_j_item_into(j, io, &rep->items[i], rep->profile, &ia[i]);
        jpush(j, items, io);
    }
    jset(j, o, "items", items);
    jset(j, o, "worst", jstr(j, rep->items[plumbp_worst_item(rep)].spec->name));
    /* no item drifts: no largest drift to name */
    const plumb_item_report *d = &rep->items[plumbp_largest_drift_item(rep)];
    jset(j, o, "largest_drift",
         d->result.drift_m < DRIFT_SHOWN_M ? json_null() : jstr(j, d->spec->name));
}

json_t *plumbp_j_fall(jctx *j, const plumb_report_options *opt, const plumb_fall_report *rep,
                      const item_air *ia)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    plumbp_j_items_into(j, root, rep, ia);
    jset(j, root, "profile", plumbp_j_profile(j, rep->profile));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

