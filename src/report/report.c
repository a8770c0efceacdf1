/*
 * report.c - what every fall, air, sweep and limit writer shares
 * (include/plumb/report.h): the cautions, the air at the strike and
 * release levels of each item, names of the enumerations a report shows,
 * the worst item, warnings grouped over items, and the all-or-nothing
 * output; and plumb_report_fall, which hands a fall to its text, CSV or
 * JSON writer (fall_text.c, fall_csv.c, fall_json.c). The verdicts and
 * warnings the reports print are made by src/criteria/judge.c.
 *
 * Method: a report is first made in a memory stream (POSIX open_memstream)
 * or, for JSON, as a jansson tree; only when it is complete, and every
 * figure in it has been found finite, is it copied to the caller's stream.
 * So a refused report writes nothing at all. Units and number forms are
 * those of format.c; JSON is always SI (README.md "Common options").
 */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/gravity.h"
#include "plumb/wind.h"
#include "report/common.h"

/* ---- the cautions (README.md "Cautions", SAFETY.md section 1) ----------- */

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
/* ---- shared helpers ----------------------------------------------------- */



/* Speed and direction blown from of an (east, north) air motion. */
void plumbp_wind_polar(double e, double n, double *speed, double *from_deg)
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
        plumbp_need_finite(&fc, "air temperature", ia->at[k].t_k);
        plumbp_need_finite(&fc, "air pressure", ia->at[k].p_pa);
        plumbp_need_finite(&fc, "air density", ia->at[k].rho_kg_m3);
        plumbp_need_finite(&fc, "air viscosity", ia->at[k].mu_pa_s);
        plumbp_need_finite(&fc, "speed of sound", ia->at[k].a_m_s);
        if (fc.status != PLUMB_OK)
            return fc.status;
    }
    ia->g_m_s2 = plumb_gravity_at(&s->gravity, s->site_elevation_m);
    double e, n;
    plumb_wind_at(&s->wind, s->release_m[2], &e, &n);
    plumbp_wind_polar(e, n, &ia->wind_release[0], &ia->wind_release[1]);
    return PLUMB_OK;
}

const char *plumbp_verdict_word(const plumb_verdict *v)
{
    return v->exceeds ? "exceeds" : "within";
}

const char *plumbp_crit_kind_name(plumb_criterion_kind k)
{
    return k == PLUMB_CRIT_HELMET_TEST ? "helmet-test" : "limit";
}

const char *plumbp_drag_model_name(plumb_drag_model m)
{
    switch (m) {
    case PLUMB_DRAG_SPHERE_MORRISON: return "sphere";
    case PLUMB_DRAG_SPHERE_CGW: return "sphere-cgw";
    default: return "fixed";
    }
}

const char *plumbp_shape_kind_name(plumb_shape_kind k)
{
    switch (k) {
    case PLUMB_SHAPE_SPHERE: return "sphere";
    case PLUMB_SHAPE_CYLINDER: return "cylinder";
    case PLUMB_SHAPE_BOX: return "box";
    case PLUMB_SHAPE_PLATE: return "plate";
    default: return "none";
    }
}

const char *plumbp_attitude_name(plumb_attitude a)
{
    switch (a) {
    case PLUMB_ATTITUDE_BROADSIDE: return "broadside";
    case PLUMB_ATTITUDE_END_ON: return "end-on";
    default: return "tumbling";
    }
}

const char *plumbp_atm_model_name(plumb_atm_model m)
{
    switch (m) {
    case PLUMB_ATM_SURFACE: return "surface";
    case PLUMB_ATM_TABLE: return "table";
    default: return "standard-1976";
    }
}

const char *plumbp_wind_profile_name(plumb_wind_profile p)
{
    switch (p) {
    case PLUMB_WIND_POWER: return "power";
    case PLUMB_WIND_LOG: return "log";
    case PLUMB_WIND_TABLE: return "table";
    default: return "uniform";
    }
}


/* Index of the strictest criterion (lowest limit) among the verdicts of an
 * item, or -1 when there are none. */
long plumbp_strictest(const plumb_item_report *it)
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
size_t plumbp_worst_item(const plumb_fall_report *rep)
{
    size_t w = 0;
    for (size_t i = 1; i < rep->n_items; i++) {
        const plumb_item_report *a = &rep->items[i], *b = &rep->items[w];
        long sa = plumbp_strictest(a), sb = plumbp_strictest(b);
        double ka = sa >= 0 ? a->verdicts[sa].ratio : a->result.energy_j;
        double kb = sb >= 0 ? b->verdicts[sb].ratio : b->result.energy_j;
        if (ka > kb)
            w = i;
    }
    return w;
}

size_t plumbp_largest_drift_item(const plumb_fall_report *rep)
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
void plumbp_caution_lines_text(writer *w)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    put(w, "\nCautions\n");
    for (size_t i = 0; i < n; i++)
        wrapped(w, "  - ", c[i]);
}

/* ---- warnings shared by several items ------------------------------------ */

said_warning *plumbp_said_warnings(writer *w, const plumb_fall_report *const *reps, size_t n,
                                   size_t *n_said)
{
    size_t total = 0;
    *n_said = 0;
    for (size_t r = 0; r < n; r++)
        for (size_t i = 0; i < reps[r]->n_items; i++)
            total += reps[r]->items[i].n_warnings;
    said_warning *s = calloc(total ? total : 1, sizeof *s);
    if (!s) {
        w->nomem = 1;
        return NULL;
    }
    for (size_t r = 0; r < n; r++)
        for (size_t i = 0; i < reps[r]->n_items; i++)
            for (size_t k = 0; k < reps[r]->items[i].n_warnings; k++) {
                char shown_text[PLUMB_WARNING * 2];
                plumbp_t_warning(w, reps[r]->items[i].warnings[k], shown_text,
                                 sizeof shown_text);
                said_warning *e = &s[(*n_said)++];
                size_t len = strlen(shown_text) + 1;
                e->report = r;
                e->item = i;
                if ((e->text = malloc(len)) != NULL)
                    memcpy(e->text, shown_text, len);
                else {
                    w->nomem = 1;
                    plumbp_said_free(s, *n_said);
                    *n_said = 0;
                    return NULL;
                }
            }
    return s;
}

void plumbp_said_free(said_warning *s, size_t n)
{
    for (size_t i = 0; s && i < n; i++)
        free(s[i].text);
    free(s);
}

size_t plumbp_said_before(const said_warning *s, size_t e)
{
    size_t i = 0;
    while (i < e && strcmp(s[i].text, s[e].text) != 0)
        i++;
    return i;
}

/* Calls fn once per distinct warning of the report as shown, with the
 * names of the items that have it, or "" when every item has it. */
void plumbp_each_warning(writer *w, const plumb_fall_report *rep, warning_fn fn)
{
    size_t n;
    said_warning *s = plumbp_said_warnings(w, &rep, 1, &n);
    for (size_t e = 0; s && e < n; e++) {
        if (plumbp_said_before(s, e) < e)
            continue;
        char who[PLUMB_NAME * 4] = "";
        size_t count = 0, len = 0, last = SIZE_MAX;
        for (size_t f = e; f < n; f++) {
            if (s[f].item == last || strcmp(s[f].text, s[e].text) != 0)
                continue;
            last = s[f].item;
            int k = snprintf(who + len, sizeof who - len, "%s%s", count ? ", " : "",
                             rep->items[s[f].item].spec->name);
            if (k > 0 && (size_t)k < sizeof who - len)
                len += (size_t)k;
            count++;
        }
        fn(w, count == rep->n_items ? "" : who, s[e].text);
    }
    plumbp_said_free(s, n);
}

const char *plumbp_who_text(char *buf, size_t size, const char *who, const char *text)
{
    snprintf(buf, size, who[0] ? "%s (%s)" : "%s", text, who);
    return buf;
}

void plumbp_text_warning_line(writer *w, const char *who, const char *text)
{
    char line[PLUMB_NAME * 4 + PLUMB_WARNING * 2 + 8];
    wrapped(w, "  - ", plumbp_who_text(line, sizeof line, who, text));
}

/* ---- output: all or nothing ---------------------------------------------- */

/* Opens the memory stream a text or CSV report is made in. */
plumb_status plumbp_writer_open(writer *w, plumb_unit_system units, plumb_diag *diag)
{
    if (!writer_start(w, units == PLUMB_UNITS_US))
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the report");
    return PLUMB_OK;
}

plumb_status plumbp_writer_close(writer *w, FILE *out, plumb_diag *diag)
{
    int failed = !writer_finish(w);
    plumb_status st = PLUMB_OK;
    if (w->bad)
        st = PLUMB_RAISE(diag, PLUMB_ENUMERIC, "a figure is not a finite number; no report "
                                               "written");
    else if (failed || w->nomem)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the report");
    else
        st = emit(out, w->buf, w->len, diag);
    free(w->buf);
    w->buf = NULL;
    return st;
}

const plumb_report_options *plumbp_opts_or_default(const plumb_report_options *opt,
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
plumb_status plumbp_prepare_fall(const plumb_fall_report *rep, item_air **ia, plumb_diag *diag)
{
    *ia = NULL;
    if (!rep || !rep->profile || rep->n_items == 0 || !rep->items)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no fall report to write");
    for (size_t i = 0; i < rep->n_items; i++)
        if (!rep->items[i].spec)
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "item %zu has no fall spec", i + 1);
    plumb_status st = check_same_criteria(rep, diag);
    for (size_t i = 0; st == PLUMB_OK && i < rep->n_items; i++)
        st = plumbp_check_item(&rep->items[i], diag);
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
    opt = plumbp_opts_or_default(opt, &def);
    if (!out)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no stream to write to");
    item_air *ia = NULL;
    plumb_status st = plumbp_prepare_fall(rep, &ia, diag);
    if (st == PLUMB_OK && opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        json_t *root = plumbp_j_fall(&j, opt, rep, ia);
        st = emit_json(out, &j, root, diag);
    } else if (st == PLUMB_OK) {
        writer w;
        st = plumbp_writer_open(&w, opt->units, diag);
        if (st == PLUMB_OK) {
            if (opt->format == PLUMB_FORMAT_CSV)
                plumbp_csv_fall(&w, rep);
            else if (plumb_profile_is_inventory(rep->profile))
                plumbp_text_inventory(&w, opt, rep, ia);
            else
                plumbp_text_single(&w, opt, rep, ia);
            st = plumbp_writer_close(&w, out, diag);
        }
    }
    free(ia);
    return st;
}

