/*
 * air_table.c - the air at one altitude or a table of altitudes
 * (plumb_report_air, plumb_report_air_table) in text, CSV and JSON.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/common.h"

/* ---- air table --------------------------------------------------------- */

/* "U.S. Standard Atmosphere 1976, temperature offset +10 K, dry". */
static void air_model_text(writer *w, double dt_k, char *buf, size_t size)
{
    plumb_atm_spec a;
    plumb_atm_spec_init(&a);
    a.temperature_offset_k = dt_k;
    plumbp_text_atmosphere(w, &a, buf, size);
    if (dt_k == 0.0) {
        size_t n = strlen(buf);
        snprintf(buf + n, size - n, "; no temperature offset");
    }
    for (char *p = buf; *p; p++)
        if (*p == NBSP_CHAR)
            *p = ' ';
}

/* Decimals of the altitude column: at least `least` (the column's usual
 * 1 mm, or 0.01 ft), more when neighbouring rows lie closer than that, so
 * that every row a user asked for (--alt 0m:1m:0.00001m) is labelled with
 * its own altitude rather than seven rows of "0": the smallest step
 * between rows, in the unit shown (`per` metres), sets it. At most 9: a
 * range has at most 100 000 values (README.md, plumb air), so a finer
 * step is not one a user asked for. */
static int alt_decimals(const plumb_air *rows, size_t n, double per, int least)
{
    double d_min = HUGE_VAL;
    for (size_t i = 1; i < n; i++) {
        double d = fabs(rows[i].alt_m - rows[i - 1].alt_m) / per;
        if (d > 0.0 && d < d_min)
            d_min = d;
    }
    int dec = least;
    if (d_min < HUGE_VAL) {
        /* the slack keeps a step of 1e-5 that reads 0.99999999e-5 at 5 */
        double need = ceil(-log10(d_min) - 1e-6);
        if (need > dec)
            dec = need > 9.0 ? 9 : (int)need;
    }
    return dec;
}

static void text_air(writer *w, const plumb_report_options *opt, const plumb_air *rows,
                     size_t n, double dt_k)
{
    char model[NUMBUF * 5];
    plumbp_text_header(w, opt, "air", "properties by geometric altitude above mean sea level");
    air_model_text(w, dt_k, model, sizeof model);
    put(w, "  %s\n", model);
    enum { COL_W = 13 }; /* six columns in 80 */
    const char *heads[] = {"altitude", "temperature", "pressure", "density", "viscosity",
                           "sound speed"};
    const char *si[] = {"m", "K", "Pa", "kg/m³", "Pa·s", "m/s"};
    const char *us[] = {"ft", "°F", "inHg", "lb/ft³", "lbf·s/ft²", "ft/s"};
    double ft = PLUMB_FT_M, ft2 = ft * ft, ft3 = ft2 * ft;
    double alt_per = w->us ? ft : 1.0;
    int alt_dec = alt_decimals(rows, n, alt_per, w->us ? 2 : 3);
    /* the altitude column widens when its decimals need it, so that two
     * columns never run together */
    size_t alt_w = COL_W;
    for (size_t i = 0; i < n; i++) {
        size_t len = strlen(plumbp_trimmed(w, rows[i].alt_m / alt_per, alt_dec)) + 2;
        if (len > alt_w)
            alt_w = len;
    }
    put(w, "\n");
    for (size_t k = 0; k < 6; k++)
        pad(w, heads[k], k ? COL_W : alt_w, 1);
    put(w, "\n");
    for (size_t k = 0; k < 6; k++)
        pad(w, w->us ? us[k] : si[k], k ? COL_W : alt_w, 1);
    put(w, "\n");
    for (size_t i = 0; i < n; i++) {
        const plumb_air *a = &rows[i];
        if (w->us) {
            pad(w, plumbp_trimmed(w, a->alt_m / ft, alt_dec), alt_w, 1);
            pad(w, plumbp_fixed(w, a->t_k * FAHRENHEIT_PER_K - FAHRENHEIT_ZERO_OFFSET, 2), COL_W,
                1);
            pad(w, num(w, a->p_pa / INHG_PA, 5), COL_W, 1);
            pad(w, num(w, a->rho_kg_m3 * ft3 / PLUMB_LB_KG, 5), COL_W, 1);
            pad(w, plumbp_sci(w, a->mu_pa_s * ft2 / LBF_N, 5), COL_W, 1);
            pad(w, plumbp_fixed(w, a->a_m_s / ft, 1), COL_W, 1);
        } else {
            pad(w, plumbp_trimmed(w, a->alt_m, alt_dec), alt_w, 1);
            pad(w, plumbp_fixed(w, a->t_k, 3), COL_W, 1);
            pad(w, num(w, a->p_pa, 6), COL_W, 1);
            pad(w, num(w, a->rho_kg_m3, 5), COL_W, 1);
            pad(w, plumbp_sci(w, a->mu_pa_s, 5), COL_W, 1);
            pad(w, plumbp_fixed(w, a->a_m_s, 2), COL_W, 1);
        }
        put(w, "\n");
    }
    plumbp_caution_lines_text(w);
}

static void csv_air(writer *w, const plumb_air *rows, size_t n, double dt_k)
{
    char model[NUMBUF * 5], line[NUMBUF * 6];
    plumbp_csv_cautions(w);
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
    opt = plumbp_opts_or_default(opt, &def);
    if (!out || !table || (table->n_rows > 0 && !table->rows))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no air table to write");
    const plumb_air *rows = table->rows;
    size_t n_rows = table->n_rows;
    double dt_k = table->temperature_offset_k;
    if (!plumbp_finite(dt_k))
        return PLUMB_RAISE(diag, PLUMB_ENUMERIC, "the temperature offset is not a finite number");
    for (size_t i = 0; i < n_rows; i++) {
        finite_check fc = {diag, NULL, PLUMB_OK};
        plumbp_need_finite(&fc, "altitude", rows[i].alt_m);
        plumbp_need_finite(&fc, "air temperature", rows[i].t_k);
        plumbp_need_finite(&fc, "air pressure", rows[i].p_pa);
        plumbp_need_finite(&fc, "air density", rows[i].rho_kg_m3);
        plumbp_need_finite(&fc, "air viscosity", rows[i].mu_pa_s);
        plumbp_need_finite(&fc, "speed of sound", rows[i].a_m_s);
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
            jpush(&j, arr, plumbp_j_air(&j, &rows[i]));
        jset(&j, root, "rows", arr);
        jset(&j, root, "cautions", j_cautions(&j));
        return emit_json(out, &j, root, diag);
    }
    writer w;
    plumb_status st = plumbp_writer_open(&w, opt->units, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_CSV)
        csv_air(&w, rows, n_rows, dt_k);
    else
        text_air(&w, opt, rows, n_rows, dt_k);
    return plumbp_writer_close(&w, out, diag);
}

