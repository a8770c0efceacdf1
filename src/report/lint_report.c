/*
 * lint_report.c - the report of `plumb lint` (plumb_report_lint): which
 * profiles are good and every error found in the others, in text, JSON and
 * CSV, with the cautions in every format as in every report (README.md
 * "Cautions"); and an error's message in the report's units
 * (plumb_report_diag_message): a value outside its key's range gets the
 * range again in US customary units, converted by plumbp_show_key (the
 * international foot 0.3048 m and pound 0.45359237 kg, NIST SP 811, 2008,
 * Appendix B.8), so that a US reader need not convert the limits.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "io/keys.h"
#include "io/yamltree.h"
#include "report/common.h"

/* "> 0 ft²", "-189.67 °F .. 260.33 °F": the limits of range r of a key of
 * dimension dim in w's units into buf, each rounded toward the inside of
 * the range (a value within the limits shown is within the range). 0 when
 * the range has no limit with a unit to convert. */
static int range_us(writer *w, const char *key, plumb_dim dim, plumby_range r, char *buf,
                    size_t size)
{
    double lo, hi;
    int lo_open, hi_open;
    plumby_range_bounds(r, &lo, &hi, &lo_open, &hi_open);
    shown si_unit = plumbp_show_dim(&(writer){.us = 0}, dim, 1.0);
    shown l = plumbp_show_key(w, key, dim, lo), h = plumbp_show_key(w, key, dim, hi);
    if (r == PLUMBY_R_ANY || !plumbp_finite(lo) || strcmp(l.unit, si_unit.unit) == 0)
        return 0;
    const char *ls = plumbp_gnum(w, plumbp_round_safe(l.x, INPUT_SIG, 0), INPUT_SIG);
    if (!plumbp_finite(hi)) {
        snprintf(buf, size, "%s %s %s", lo_open ? ">" : ">=", ls, l.unit);
        return 1;
    }
    const char *hs = plumbp_gnum(w, plumbp_round_safe(h.x, INPUT_SIG, 1), INPUT_SIG);
    if (lo_open) /* "> 0 lb and <= 2.205e+08 lb", as the SI range says it */
        snprintf(buf, size, "> %s %s and %s %s %s", ls, l.unit, hi_open ? "<" : "<=", hs, h.unit);
    else
        snprintf(buf, size, "%s %s .. %s %s", ls, l.unit, hs, h.unit);
    return 1;
}

size_t plumb_report_diag_message(const plumb_diag *error, plumb_unit_system units, char *buf,
                                 size_t size)
{
    const char *msg = error ? error->message : "";
    char note[NUMBUF * 2] = "";
    const plumbp_key *k = NULL;
    if (error && units == PLUMB_UNITS_US && error->status == PLUMB_ERANGE)
        k = plumbp_key_find(error->key, NULL, NULL);
    if (k) {
        /* only the message of the key's own range ("must be > 0 m^2, found
         * ..."), not another check that names the key */
        char si[160], lead[176];
        plumby_range_text(k->range, k->dim, si, sizeof si);
        snprintf(lead, sizeof lead, "must be %s", si);
        writer w;
        memset(&w, 0, sizeof w);
        w.us = 1;
        char us[NUMBUF * 2 - 8];
        if (strncmp(msg, lead, strlen(lead)) == 0 &&
            range_us(&w, error->key, k->dim, k->range, us, sizeof us))
            snprintf(note, sizeof note, " [US: %s]", us);
    }
    int n = snprintf(buf, size, "%s%s", msg, note);
    return n < 0 ? 0 : (size_t)n;
}

/* 1 when s is UTF-8 by its byte patterns (lead byte, then as many
 * continuation bytes as it announces). */
static int utf8_ok(const char *s)
{
    for (const unsigned char *p = (const unsigned char *)s; *p;) {
        int more = *p < 0x80          ? 0
                   : (*p >> 5) == 6   ? 1
                   : (*p >> 4) == 14  ? 2
                   : (*p >> 3) == 30  ? 3
                                      : -1;
        if (more < 0)
            return 0;
        for (p++; more > 0; more--, p++)
            if ((*p & 0xC0) != 0x80)
                return 0;
    }
    return 1;
}

/* A string for JSON; one that is not UTF-8 (a file name of other bytes)
 * with '?' for each byte above ASCII, rather than no report. */
static json_t *jtext_safe(jctx *j, const char *s)
{
    if (utf8_ok(s))
        return jstr(j, s);
    char *c = strdup(s);
    if (!c) {
        j->nomem = 1;
        return NULL;
    }
    for (char *p = c; *p; p++)
        if ((unsigned char)*p >= 0x80)
            *p = '?';
    json_t *v = jstr(j, c);
    free(c);
    return v;
}

static json_t *j_lint(jctx *j, const plumb_report_options *opt, const plumb_lint_entry *e,
                      size_t n)
{
    json_t *root = jobj(j);
    if (opt->version)
        jset(j, root, "plumb_version", jstr(j, opt->version));
    json_t *arr = jarr(j);
    size_t bad = 0;
    for (size_t i = 0; i < n; i++) {
        json_t *o = jobj(j), *errs = jarr(j);
        jset(j, o, "name", jtext_safe(j, e[i].profile));
        jset(j, o, "ok", json_boolean(e[i].n_errors == 0));
        for (size_t k = 0; k < e[i].n_errors; k++) {
            const plumb_diag *d = &e[i].errors[k];
            json_t *x = jobj(j);
            jset(j, x, "file", d->file[0] ? jtext_safe(j, d->file) : json_null());
            jset(j, x, "line", d->line > 0 ? jint(j, (size_t)d->line) : json_null());
            jset(j, x, "column", d->col > 0 ? jint(j, (size_t)d->col) : json_null());
            jset(j, x, "key", d->key[0] ? jtext_safe(j, d->key) : json_null());
            jset(j, x, "message", jtext_safe(j, d->message));
            jpush(j, errs, x);
        }
        jset(j, o, "errors", errs);
        jset(j, o, "listed_all", json_boolean(e[i].n_errors == 0 || e[i].listed_all));
        jpush(j, arr, o);
        bad += e[i].n_errors > 0;
    }
    jset(j, root, "profiles", arr);
    jset(j, root, "passed", jint(j, n - bad));
    jset(j, root, "failed", jint(j, bad));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

static void csv_lint(writer *w, const plumb_lint_entry *e, size_t n)
{
    plumbp_csv_cautions(w);
    for (size_t i = 0; i < n; i++)
        if (e[i].n_errors > 0 && !e[i].listed_all) {
            char line[PLUMB_DIAG_FILE + 96];
            snprintf(line, sizeof line, "%s: the first %zu errors are listed; there may be more",
                     e[i].profile, e[i].n_errors);
            csv_comment(w, line);
        }
    put(w, "profile,ok,file,line,column,key,message\n");
    for (size_t i = 0; i < n; i++) {
        if (e[i].n_errors == 0) {
            csv_field(w, e[i].profile);
            put(w, ",true,,,,,\n");
        }
        for (size_t k = 0; k < e[i].n_errors; k++) {
            const plumb_diag *d = &e[i].errors[k];
            char msg[PLUMB_DIAG_MSG + NUMBUF * 2];
            plumb_report_diag_message(d, w->us ? PLUMB_UNITS_US : PLUMB_UNITS_SI, msg,
                                      sizeof msg);
            csv_field(w, e[i].profile);
            put(w, ",false,");
            csv_field(w, d->file);
            if (d->line > 0)
                put(w, ",%d", d->line);
            else
                put(w, ",");
            if (d->col > 0)
                put(w, ",%d,", d->col);
            else
                put(w, ",,");
            csv_field(w, d->key);
            put(w, ",");
            csv_field(w, msg);
            put(w, "\n");
        }
    }
}

plumb_status plumb_report_lint(FILE *out, const plumb_report_options *opt,
                               const plumb_lint_entry *entries, size_t n, plumb_diag *diag)
{
    plumb_report_options def;
    opt = plumbp_opts_or_default(opt, &def);
    size_t broken = 0;
    while (entries && broken < n && entries[broken].profile &&
           (entries[broken].n_errors == 0 || entries[broken].errors))
        broken++;
    if (!out || (n > 0 && broken < n))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no lint report to write: %s",
                           !out ? "no stream" : "an entry without its name or errors");
    if (opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        return emit_json(out, &j, j_lint(&j, opt, entries, n), diag);
    }
    writer w;
    plumb_status st = plumbp_writer_open(&w, opt->units, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_CSV) {
        csv_lint(&w, entries, n);
    } else {
        for (size_t i = 0; i < n; i++)
            if (entries[i].n_errors == 0)
                put(&w, "%s: ok\n", entries[i].profile);
        /* every report in every format carries the cautions (README.md
         * "Cautions"): a profile that loads is not one whose figures are
         * safe to act on */
        plumbp_caution_lines_text(&w);
    }
    return plumbp_writer_close(&w, out, diag);
}
