/*
 * verify_report.c - the published reference checks (`plumb verify`,
 * include/plumb/verify.h) in text, CSV and JSON, with the cautions. The
 * checks are made and published in SI; with --units us, text and CSV give
 * each computed and published figure's US customary value beside it
 * (plumbp_show_dim's conversions: the international foot 0.3048 m and
 * pound 0.45359237 kg, NIST SP 811, 2008, Appendix B.8), JSON stays SI.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "report/common.h"

/* A check's SI unit as the reports spell units, in text and CSV alike:
 * "kg/m³", "m/s²" (unit_shown), and the product "Pa·s" as the air table
 * writes it and as the US column writes "lbf·s/ft²". JSON keeps the
 * check's own ASCII spelling. */
static const char *check_unit(writer *w, const char *unit)
{
    return strcmp(unit, "Pa s") == 0 ? "Pa·s" : unit_shown(w, unit);
}

/* "1.2250 kg/m³": a figure to the digits that tell it from its
 * neighbour, with its unit; with `zeros`, trailing zeros kept, so that
 * figures side by side show the same number of digits. */
static const char *figure_as(writer *w, double x, const char *unit, int digits, int zeros)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, zeros ? "%#.*g%s%s" : "%.*g%s%s", digits, x, unit[0] ? NBSP : "",
             check_unit(w, unit));
    return b;
}

static const char *figure(writer *w, double x, const char *unit, int digits)
{
    return figure_as(w, x, unit, digits, 0);
}

/* Significant digits of a US customary figure in the text, zeros kept:
 * enough to read, no more than the coarsest factor converting to it holds
 * (NIST SP 811's conventional inch of mercury, 3.386 389 E+03 Pa, 7
 * figures). */
#define US_SIG 7

/* The US customary value of a check's SI figure x in unit `unit`: 1 with
 * *us filled, or 0 when the unit is the same in both systems or there is
 * none ("", "s") or has no US counterpart here (then no figure is given:
 * tests/cli/verify.py requires one for every unit but those two). */
static int us_figure(const writer *w, const char *unit, double x, shown *us)
{
    static const struct {
        const char *si;
        plumb_dim dim;
    } dims[] = {
        {"m", PLUMB_DIM_LENGTH},       {"kg", PLUMB_DIM_MASS},         {"m/s", PLUMB_DIM_SPEED},
        {"N", PLUMB_DIM_FORCE},        {"J", PLUMB_DIM_ENERGY},        {"K", PLUMB_DIM_TEMPERATURE},
        {"Pa", PLUMB_DIM_PRESSURE},    {"kg/m^3", PLUMB_DIM_DENSITY},
    };
    if (strcmp(unit, "m/s^2") == 0) {
        /* an acceleration: a length per second squared, the second the same */
        *us = plumbp_show_dim(w, PLUMB_DIM_LENGTH, x);
        us->unit = "ft/s²";
        return 1;
    }
    if (strcmp(unit, "Pa s") == 0) {
        /* a dynamic viscosity, N s/m^2, as lbf s/ft^2 (air_table.c's) */
        *us = (shown){x * PLUMB_FT_M * PLUMB_FT_M / LBF_N, "lbf·s/ft²"};
        return 1;
    }
    for (size_t i = 0; i < sizeof dims / sizeof dims[0]; i++)
        if (strcmp(unit, dims[i].si) == 0) {
            *us = plumbp_show_dim(w, dims[i].dim, x);
            return 1;
        }
    return 0;
}

/* " [47.30184 °F]" after an SI figure in a US report, into buf (size
 * bytes); "" otherwise. Returns buf. */
static const char *us_bracket(writer *w, const char *unit, double x, char *buf, size_t size)
{
    shown us;
    buf[0] = '\0';
    if (w->us && us_figure(w, unit, x, &us))
        snprintf(buf, size, " [%s]", figure_as(w, us.x, us.unit, US_SIG, 1));
    return buf;
}

static void text_verify(writer *w, const plumb_report_options *opt, const plumb_check *c,
                        size_t n)
{
    plumbp_text_header(w, opt, "verify", "published reference checks of this build");
    size_t failed = 0;
    for (size_t i = 0; i < n; i++) {
        char line[PLUMB_CHECK_TEXT * 2 + NUMBUF * 6], usc[NUMBUF + 4], usp[NUMBUF + 4];
        put(w, "\n  %-6s %s\n", c[i].passed ? "ok" : "FAILED", c[i].name);
        snprintf(line, sizeof line, "computed %s%s, published %s%s, within %s; %s (%s)",
                 figure(w, c[i].computed, c[i].unit, 12), us_bracket(w, c[i].unit, c[i].computed, usc, sizeof usc),
                 figure(w, c[i].published, c[i].unit, 12),
                 us_bracket(w, c[i].unit, c[i].published, usp, sizeof usp),
                 figure(w, c[i].tolerance, c[i].unit, 3), c[i].source, c[i].status);
        wrapped(w, "         ", line);
        failed += !c[i].passed;
    }
    put(w, "\nverify: %zu passed, %zu failed\n", n - failed, failed);
    if (failed)
        wrapped(w, "",
                "A failed check means this build does not compute what the published sources "
                "give: do not rely on its figures until the cause is found.");
    plumbp_caution_lines_text(w);
}

static void csv_verify(writer *w, const plumb_check *c, size_t n)
{
    plumbp_csv_cautions(w);
    /* US figures in columns of their own, after the SI ones, so that a
     * reader of the SI columns finds them where they always are */
    put(w, "name,passed,computed,published,tolerance,unit,source,status%s\n",
        w->us ? ",computed_us,published_us,unit_us" : "");
    for (size_t i = 0; i < n; i++) {
        csv_field(w, c[i].name);
        put(w, ",%s,%s,%s,%s,", c[i].passed ? "true" : "false", csvnum(w, c[i].computed),
            csvnum(w, c[i].published), csvnum(w, c[i].tolerance));
        csv_field(w, check_unit(w, c[i].unit));
        put(w, ",");
        csv_field(w, c[i].source);
        put(w, ",");
        csv_field(w, c[i].status);
        shown uc, up;
        if (w->us && us_figure(w, c[i].unit, c[i].computed, &uc) &&
            us_figure(w, c[i].unit, c[i].published, &up)) {
            put(w, ",%s,%s,", csvnum(w, uc.x), csvnum(w, up.x));
            csv_field(w, uc.unit);
        } else if (w->us) {
            put(w, ",,,");
        }
        put(w, "\n");
    }
}

plumb_status plumb_report_verify(FILE *out, const plumb_report_options *opt,
                                 const plumb_check *checks, size_t n, plumb_diag *diag)
{
    plumb_report_options def;
    opt = plumbp_opts_or_default(opt, &def);
    if (!out || (n > 0 && !checks))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no checks to write");
    for (size_t i = 0; i < n; i++) {
        finite_check fc = {diag, NULL, PLUMB_OK};
        plumbp_need_finite(&fc, "published value", checks[i].published);
        plumbp_need_finite(&fc, "tolerance", checks[i].tolerance);
        /* a computed figure that is not finite is a failed check, shown as
         * such in text; JSON has no NaN: the check is refused instead */
        plumbp_need_finite(&fc, "computed value", checks[i].computed);
        if (fc.status != PLUMB_OK)
            return fc.status;
    }
    if (opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        json_t *root = jobj(&j);
        if (opt->version)
            jset(&j, root, "plumb_version", jstr(&j, opt->version));
        json_t *arr = jarr(&j);
        size_t failed = 0;
        for (size_t i = 0; i < n; i++) {
            json_t *o = jobj(&j);
            jset(&j, o, "name", jstr(&j, checks[i].name));
            jset(&j, o, "passed", json_boolean(checks[i].passed));
            jset(&j, o, "computed", jreal(&j, checks[i].computed));
            jset(&j, o, "published", jreal(&j, checks[i].published));
            jset(&j, o, "tolerance", jreal(&j, checks[i].tolerance));
            jset(&j, o, "unit", jstr(&j, checks[i].unit));
            jset(&j, o, "source", jstr(&j, checks[i].source));
            jset(&j, o, "status", jstr(&j, checks[i].status));
            jpush(&j, arr, o);
            failed += !checks[i].passed;
        }
        jset(&j, root, "checks", arr);
        jset(&j, root, "passed", jint(&j, n - failed));
        jset(&j, root, "failed", jint(&j, failed));
        jset(&j, root, "cautions", j_cautions(&j));
        return emit_json(out, &j, root, diag);
    }
    writer w;
    plumb_status st = plumbp_writer_open(&w, opt->units, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_CSV)
        csv_verify(&w, checks, n);
    else
        text_verify(&w, opt, checks, n);
    return plumbp_writer_close(&w, out, diag);
}
