/*
 * fall_csv.c - the CSV report of a fall, one row per item (RFC 4180:
 * fields with commas, quotes or line ends quoted), the cautions and
 * warnings as leading "# " comment lines. The item columns are shared
 * with the sweep table (sweep_table.c).
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/common.h"

/* ---- CSV ----------------------------------------------------------------- */



void plumbp_csv_warning_line(writer *w, const char *who, const char *text)
{
    char joined[PLUMB_NAME * 4 + PLUMB_WARNING * 2 + 8], line[sizeof joined + 16];
    snprintf(line, sizeof line, "warning: %s", plumbp_who_text(joined, sizeof joined, who, text));
    csv_comment(w, line);
}

void plumbp_csv_cautions(writer *w)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    for (size_t i = 0; i < n; i++)
        csv_comment(w, c[i]);
}

/* The names of one item's columns, in US and SI units. item_number is the
 * item's number as items[N] counts it: as the profile is written, so after
 * --set 'items[2]=~' the rows are 1, 3 ... (README.md "Profile keys",
 * "Inventory"). The descent devices' steady speed (every device open, as
 * JSON steady_speed_m_s) and peak drag force are empty without a device. */
static const char csv_item_cols_us[] =
    "item_number,name,mass_lb,time_s,speed_ft_s,speed_mph,energy_ft_lbf,energy_j,momentum_lbf_s,"
    "angle_deg,drift_ft,bearing_deg,east_ft,north_ft,terminal_speed_ft_s,apex_ft,"
    "drag_free_speed_ft_s,drag_free_energy_ft_lbf,steady_speed_ft_s,peak_force_lbf";
static const char csv_item_cols_si[] =
    "item_number,name,mass_kg,time_s,speed_m_s,energy_j,energy_ft_lbf,momentum_kg_m_s,"
    "angle_deg,drift_m,bearing_deg,east_m,north_m,terminal_speed_m_s,apex_m,"
    "drag_free_speed_m_s,drag_free_energy_j,steady_speed_m_s,peak_force_n";

/* The header of one item's columns (after any leading columns the caller
 * wrote), the line left open; returns how many columns it names. */
size_t plumbp_csv_header_cols(writer *w, const plumb_item_report *first)
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
    (void)plumbp_csv_header_cols(w, first);
    put(w, "\n");
}

/* The bearing of the drift, empty when there is no drift to have one. */
static const char *csv_bearing(writer *w, const plumb_fall_result *r)
{
    return r->drift_m < DRIFT_SHOWN_M ? "" : csvnum(w, r->bearing_deg);
}

/* One item's columns, the line left open. */
void plumbp_csv_item_cols(writer *w, const plumb_item_report *it, size_t number)
{
    const plumb_fall_result *r = &it->result;
    int dev = it->spec->n_descent > 0;
    /* the energy, each ratio and (in the comment lines) each limit with the
     * figures that show which side of the limit the energy is (README.md
     * "Criteria"), CSV_DIGITS at least */
    int esig = plumbp_energy_sig(it->verdicts, it->n_verdicts, CSV_DIGITS);
    put(w, "%zu,", number);
    csv_field(w, it->spec->name);
    if (w->us) {
        double ft = PLUMB_FT_M;
        put(w, ",%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s",
            csvnum(w, it->spec->mass_kg / PLUMB_LB_KG), csvnum(w, r->time_s),
            csvnum(w, r->speed_m_s / ft), csvnum(w, r->speed_m_s / MPH_M_S),
            csvnum_at(w, r->energy_j / PLUMB_FT_LBF_J, esig), csvnum_at(w, r->energy_j, esig),
            csvnum(w, r->momentum_kg_m_s / LBF_N), csvnum(w, r->angle_deg),
            csvnum(w, r->drift_m / ft), csv_bearing(w, r),
            csvnum(w, r->point_m[0] / ft), csvnum(w, r->point_m[1] / ft),
            r->terminal_speed_m_s > 0.0 ? csvnum(w, r->terminal_speed_m_s / ft) : "");
        /* The ring holds RING numbers: the rest in a second call. */
        put(w, ",%s,%s,%s", csvnum(w, r->apex_m / ft), csvnum(w, r->drag_free_speed_m_s / ft),
            csvnum(w, r->drag_free_energy_j / PLUMB_FT_LBF_J));
        put(w, ",%s,%s",
            dev && r->steady_speed_m_s > 0.0 ? csvnum(w, r->steady_speed_m_s / ft) : "",
            dev ? csvnum(w, r->peak_force_n / LBF_N) : "");
    } else {
        put(w, ",%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s,%s",
            csvnum(w, it->spec->mass_kg), csvnum(w, r->time_s), csvnum(w, r->speed_m_s),
            csvnum_at(w, r->energy_j, esig), csvnum_at(w, r->energy_j / PLUMB_FT_LBF_J, esig),
            csvnum(w, r->momentum_kg_m_s), csvnum(w, r->angle_deg), csvnum(w, r->drift_m),
            csv_bearing(w, r), csvnum(w, r->point_m[0]), csvnum(w, r->point_m[1]),
            r->terminal_speed_m_s > 0.0 ? csvnum(w, r->terminal_speed_m_s) : "");
        put(w, ",%s,%s,%s", csvnum(w, r->apex_m), csvnum(w, r->drag_free_speed_m_s),
            csvnum(w, r->drag_free_energy_j));
        put(w, ",%s,%s", dev && r->steady_speed_m_s > 0.0 ? csvnum(w, r->steady_speed_m_s) : "",
            dev ? csvnum(w, r->peak_force_n) : "");
    }
    for (size_t k = 0; k < it->n_verdicts; k++)
        put(w, ",%s,%s",
            csvnum_at(w, it->verdicts[k].ratio, plumbp_ratio_sig(&it->verdicts[k], CSV_DIGITS)),
            plumbp_verdict_word(&it->verdicts[k]));
}

/* One item's columns, ending the row. */
static void csv_item_row(writer *w, const plumb_item_report *it, size_t number)
{
    plumbp_csv_item_cols(w, it, number);
    put(w, "\n");
}

void plumbp_csv_fall(writer *w, const plumb_fall_report *rep)
{
    const plumb_item_report *first = &rep->items[0];
    char text[PLUMB_CRIT_TEXT * 4 + PLUMB_DIAG_FILE + NUMBUF * 2], quoted[PLUMB_CRIT_TEXT * 2];
    plumbp_csv_cautions(w);
    snprintf(text, sizeof text, "profile: %s (%s), sha256 %s", plumb_profile_name(rep->profile),
             plumb_profile_path(rep->profile), plumb_profile_sha256(rep->profile));
    csv_comment(w, text);
    for (size_t k = 0; k < first->n_verdicts; k++) {
        const plumb_criterion *c = first->verdicts[k].criterion;
        snprintf(text, sizeof text,
                 "criterion %s: %s, kind %s, limit %s, source: %s, status %s", c->id, c->name,
                 plumbp_crit_kind_name(c->kind),
                 plumbp_csv_limit_at(w, c->energy_limit_j, plumbp_report_limit_sig(rep, k, CSV_DIGITS)),
                 plumbp_t_source(w, c, quoted, sizeof quoted), c->status[0] ? c->status : "not given");
        csv_comment(w, text);
    }
    plumbp_each_warning(w, rep, plumbp_csv_warning_line);

    csv_header(w, first);
    for (size_t i = 0; i < rep->n_items; i++)
        csv_item_row(w, &rep->items[i], plumb_profile_item_number(rep->profile, i));
}

