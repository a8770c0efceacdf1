/*
 * limit_answer.c - the answer of a limit search (plumb_report_limit): the
 * largest or smallest value of an input that keeps a fall within a limit,
 * in text, CSV and JSON.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "report/common.h"

/* ---- limit answer ------------------------------------------------------- */

/* Room for a sentence of the answer: the explanation's words and up to
 * PLUMB_LIMIT_MAX_CROSSINGS figures with their units. */
#define EXPLAIN_TEXT (PLUMB_LIMIT_TEXT * 3)

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

/* The formatter of a metric's figure. */
typedef const char *(*metric_fmt)(writer *, double);
static metric_fmt metric_formatter(plumb_metric m)
{
    return m == PLUMB_METRIC_SPEED ? plumbp_t_speed
           : m == PLUMB_METRIC_DRIFT ? plumbp_t_len
                                     : plumbp_t_energy;
}

static const char *t_metric(writer *w, plumb_metric m, double x)
{
    return metric_formatter(m)(w, x);
}

/* The metric at a found answer, which meets the limit (inverse.h): each
 * figure rounded down as the limit is (plumbp_t_limit), so that the answer
 * never reads as above the limit it meets (30.59 J is 22.56 ft·lbf, not
 * the 22.57 that rounding to the nearest gives beside a limit of 22.56). */
static const char *t_metric_met(writer *w, plumb_metric m, double x)
{
    return plumbp_t_limit(w, metric_formatter(m), x);
}

static const char *outcome_word(plumb_limit_outcome o)
{
    return o == PLUMB_LIMIT_FOUND       ? "found"
           : o == PLUMB_LIMIT_UNLIMITED ? "unlimited"
           : o == PLUMB_LIMIT_NOT_REACHED ? "not reached"
           : o == PLUMB_LIMIT_IMPOSSIBLE ? "impossible"
           : o == PLUMB_LIMIT_NOT_ASKED  ? "not asked"
                                         : "not applicable";
}

static const char *t_value(writer *w, const char *key, plumb_dim dim, double si)
{
    shown v = plumbp_show_key(w, key, dim, si);
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s%s%s", plumbp_gnum(w, v.x, 6), v.unit[0] ? NBSP : "", v.unit);
    return b;
}

/* x to 6 significant figures, rounded down or up: toward the side of the
 * answer that meets the limit, so a printed value never breaks it. */
static double round_safe(double x, int round_down)
{
    return plumbp_round_safe(x, 6, round_down);
}

static const char *t_limit_value(writer *w, const char *key, plumb_dim dim, double si,
                                 int round_down)
{
    shown v = plumbp_show_key(w, key, dim, si);
    double x = round_safe(v.x, round_down);
    char *b = slot(w);
    snprintf(b, NUMBUF, "%s%s%s", plumbp_gnum(w, x, 6), v.unit[0] ? NBSP : "", v.unit);
    return b;
}

/* The answer in the unit the profile (or --set) gave the key in, rounded toward the
 * side that meets the limit like t_limit_value, as " (11.5003 ft)"; ""
 * when the key was not given with a unit or that is the unit shown. */
static const char *t_given_value(writer *w, const char *key, const plumb_limit_result *r,
                                 int round_down)
{
    char *b = slot(w);
    b[0] = '\0';
    if (!r->given_unit[0] || !(r->given_scale_si != 0.0))
        return b;
    shown v = plumbp_show_key(w, key, r->dim, r->value_si);
    char given[PLUMB_LIMIT_UNIT * 2]; /* "m²" for "m^2": never longer than typed */
    snprintf(given, sizeof given, "%s", unit_shown(w, r->given_unit));
    if (strcmp(v.unit, given) == 0)
        return b;
    double x = (r->value_si - r->given_offset_si) / r->given_scale_si;
    x = round_safe(x, r->given_scale_si < 0.0 ? !round_down : round_down);
    snprintf(b, NUMBUF, " (%s%s%s, the unit it was given in)", plumbp_gnum(w, x, 6), NBSP, given);
    return b;
}

/* 1 when the values just below crossing k of r meet the limit: the low
 * end's verdict, turned at each crossing below k (the rule that sets
 * limit_is_upper_bound for the answer, inverse.c). A crossing is printed
 * rounded toward that side (t_limit_value), as the answer is, so the
 * answer and the same crossing in the list read the same. */
static int crossing_within_below(const plumb_limit_result *r, size_t k)
{
    int within = r->within_at_low_end;
    for (size_t i = 0; i < k; i++)
        within = !within;
    return within;
}

/* The crossings of r, comma-separated, each rounded toward the side that
 * meets the limit (crossing_within_below), into list. */
static void crossing_list(writer *w, const char *key, const plumb_limit_result *r, char *list,
                          size_t size)
{
    size_t len = 0;
    list[0] = '\0';
    for (size_t k = 0; k < r->n_crossings && len + NUMBUF < size; k++)
        len += (size_t)snprintf(list + len, size - len, "%s%s", k ? ", " : "",
                                t_limit_value(w, key, r->dim, r->crossings_si[k],
                                              crossing_within_below(r, k)));
}

/* The limit in the report's units, each figure rounded down (the strict
 * side), as the header states it. */
static const char *t_the_limit(writer *w, const plumb_limit_report *rep)
{
    return plumbp_t_limit(w, metric_formatter(rep->metric), rep->limit);
}

/* Why, in words, with every figure in the writer's units: what the solver
 * returned as numbers (the range scanned, the crossings, the metric) and
 * its words without figures (r->explanation), into buf. The text and CSV
 * reports word it in the report's units; the JSON in SI, as all of the
 * JSON (README.md "Common options", --units). label: the key as the
 * answer names it, as `plumb fall --set` takes it (items[N].X for an item
 * of an inventory). */
static void explain(writer *w, const plumb_limit_report *rep, const plumb_limit_result *r,
                    const char *label, char *buf, size_t size)
{
    const char *key = rep->key, *note = r->explanation;
    const char *sep = note[0] ? "; " : "";
    char scanned[NUMBUF * 3];
    snprintf(scanned, sizeof scanned, "from %s to %s", t_value(w, key, r->dim, r->scan_lo_si),
             t_value(w, key, r->dim, r->scan_hi_si));
    /* a scan left with one value computed (the profile's own, every other
     * refused or not computable) is no range: "from 30 m to 30 m" would
     * read as one; it is worded as the single value it is */
    int single = r->n_scanned == 1 && r->outcome != PLUMB_LIMIT_FOUND;
    const char *only = t_value(w, key, r->dim, r->scan_hi_si);
    if (single) {
        switch (r->outcome) {
        case PLUMB_LIMIT_UNLIMITED:
            snprintf(buf, size,
                     "the %s stays below the limit of %s at the only value of %s that could be "
                     "computed, %s, where it is %s%s%s",
                     metric_word(rep->metric), t_the_limit(w, rep), label, only,
                     t_metric(w, rep->metric, r->metric_at_scan_hi), sep, note);
            return;
        case PLUMB_LIMIT_NOT_REACHED:
            snprintf(buf, size,
                     "not reached within the values of %s that can be computed: the %s stays "
                     "below the limit of %s at the only value that could be computed, %s, "
                     "where it is %s%s%s",
                     label, metric_word(rep->metric), t_the_limit(w, rep), only,
                     t_metric(w, rep->metric, r->metric_at_scan_hi), sep, note);
            return;
        case PLUMB_LIMIT_IMPOSSIBLE:
            snprintf(buf, size,
                     "the %s exceeds the limit of %s at the only value of %s that could be "
                     "computed, %s, where it is %s%s%s",
                     metric_word(rep->metric), t_the_limit(w, rep), label, only,
                     t_metric(w, rep->metric, r->metric_at_scan_hi), sep, note);
            return;
        default:
            break;
        }
    }
    switch (r->outcome) {
    case PLUMB_LIMIT_UNLIMITED:
        snprintf(buf, size,
                 "the %s stays below the limit of %s for every %s scanned %s (%zu value%s); at "
                 "the top of that range it is %s%s%s",
                 metric_word(rep->metric), t_the_limit(w, rep), label, scanned, r->n_scanned,
                 plumbp_s(r->n_scanned), t_metric(w, rep->metric, r->metric_at_scan_hi), sep, note);
        break;
    case PLUMB_LIMIT_NOT_REACHED:
        snprintf(buf, size,
                 "not reached within the values of %s that can be computed: the %s stays "
                 "below the limit of %s for every value computed %s (%zu value%s); at the "
                 "highest, %s, it is %s%s%s",
                 label, metric_word(rep->metric), t_the_limit(w, rep), scanned, r->n_scanned,
                 plumbp_s(r->n_scanned), t_value(w, key, r->dim, r->scan_hi_si),
                 t_metric(w, rep->metric, r->metric_at_scan_hi), sep, note);
        break;
    case PLUMB_LIMIT_IMPOSSIBLE:
        snprintf(buf, size,
                 "the %s exceeds the limit of %s for every %s scanned %s (%zu value%s)%s%s",
                 metric_word(rep->metric), t_the_limit(w, rep), label, scanned, r->n_scanned,
                 plumbp_s(r->n_scanned), sep, note);
        break;
    case PLUMB_LIMIT_FOUND:
        if (r->n_crossings < 2) {
            snprintf(buf, size,
                     "%s = %s gives the limit, %s %s; %s values stay within it (scanned %s, %zu "
                     "value%s)%s%s",
                     label, t_limit_value(w, key, r->dim, r->value_si, r->limit_is_upper_bound),
                     metric_word(rep->metric), t_metric_met(w, rep->metric, r->metric_at_value),
                     r->limit_is_upper_bound ? "lower" : "higher", scanned, r->n_scanned,
                     plumbp_s(r->n_scanned), sep, note);
        } else {
            char list[PLUMB_LIMIT_TEXT];
            crossing_list(w, key, r, list, sizeof list);
            snprintf(buf, size,
                     "the %s is not monotonic in %s: it crosses the limit at %s (scanned %s, %zu "
                     "value%s); %s below the first crossing, and alternately beyond%s%s",
                     metric_word(rep->metric), label, list, scanned, r->n_scanned,
                     plumbp_s(r->n_scanned),
                     r->within_at_low_end ? "within" : "exceeded", sep, note);
        }
        break;
    default: /* not applicable: no figures */
        snprintf(buf, size, "%s", note);
        break;
    }
}

/* 1 when a fall at an answer has warnings. */
static int limit_has_warnings(const plumb_limit_report *rep)
{
    int any = 0;
    for (size_t i = 0; rep->falls && i < rep->n_items; i++)
        any |= rep->falls[i].spec && rep->falls[i].n_warnings > 0;
    return any;
}

/* Calls fn for each distinct warning of the falls at the answers. */
static void each_limit_warning(writer *w, const plumb_limit_report *rep, warning_fn fn)
{
    if (!limit_has_warnings(rep))
        return;
    plumb_fall_report fr = {rep->profile, rep->n_items, rep->falls};
    plumbp_each_warning(w, &fr, fn);
}

/* The key the answer is for, as `plumb fall --set` takes it: one item's
 * own (items[N].X) when only that item was asked, else the key solved for
 * each item (payload.X). */
static void asked_key(const plumb_limit_report *rep, char *out, size_t size)
{
    size_t asked = 0, which = 0;
    for (size_t i = 0; i < rep->n_items; i++)
        if (rep->results[i].outcome != PLUMB_LIMIT_NOT_ASKED) {
            asked++;
            which = i;
        }
    if (asked == 1 && rep->n_items > 1)
        plumb_limit_set_key(rep->profile, which, rep->key, out, size);
    else
        plumbp_strlcpy(out, rep->key, size);
}

static void text_limit_answer(writer *w, const plumb_report_options *opt,
                              const plumb_limit_report *rep)
{
    const plumb_profile *p = rep->profile;
    plumbp_text_header(w, opt, "limit", plumb_profile_name(p));
    char text[EXPLAIN_TEXT], asked[PLUMB_DIAG_KEY + 16];
    asked_key(rep, asked, sizeof asked);
    snprintf(text, sizeof text, "the %s of %s at which the %s is %s%s%s%s", "value", asked,
             metric_word(rep->metric), t_the_limit(w, rep), rep->criterion ? " (criterion " : "", rep->criterion ? rep->criterion : "",
             rep->criterion ? ")" : "");
    wrapped(w, "  ", text);
    const plumb_criterion *c = rep->criterion_info;
    if (c) {
        char src[PLUMB_CRIT_TEXT * 4 + PLUMB_CRIT_ID + 64], quoted[PLUMB_CRIT_TEXT * 2];
        snprintf(src, sizeof src, "%s: %s%s%s%s%s", c->id, plumbp_t_source(w, c, quoted, sizeof quoted),
                 plumbp_status_note(c)[0] ? " (" : "", plumbp_status_note(c),
                 plumbp_status_note(c)[0] ? ")" : "",
                 c->kind == PLUMB_CRIT_HELMET_TEST ? "; a helmet test, not a safe limit" : "");
        wrapped(w, "  source of ", src);
    }
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_limit_result *r = &rep->results[i];
        if (r->outcome == PLUMB_LIMIT_NOT_ASKED)
            continue;
        char set_key[PLUMB_DIAG_KEY + 16];
        plumb_limit_set_key(p, i, rep->key, set_key, sizeof set_key);
        put(w, "\n");
        if (plumb_profile_is_inventory(p)) {
            /* numbered as items[N] counts them, the name wrapped */
            char lead[32];
            snprintf(lead, sizeof lead, "Item %zu  ", plumb_profile_item_number(p, i));
            wrapped(w, lead, plumb_profile_item(p, i)->name);
        }
        if (r->outcome == PLUMB_LIMIT_FOUND) {
            snprintf(text, sizeof text, "%s = %s%s", set_key,
                     t_limit_value(w, rep->key, r->dim, r->value_si, r->limit_is_upper_bound),
                     t_given_value(w, rep->key, r, r->limit_is_upper_bound));
            wrapped(w, "  ", text);
            /* another crossing on the side that keeps within the limit? */
            int next = r->n_crossings > 1 &&
                       (r->limit_is_upper_bound ? r->value_si > r->crossings_si[0]
                                                : r->value_si < r->crossings_si[r->n_crossings - 1]);
            snprintf(text, sizeof text, "there the %s is %s; %s values keep within the limit%s",
                     metric_word(rep->metric), t_metric_met(w, rep->metric, r->metric_at_value),
                     r->limit_is_upper_bound ? "lower" : "higher",
                     !next                     ? "."
                     : r->limit_is_upper_bound ? ", down to the next crossing."
                                               : ", up to the next crossing.");
            wrapped(w, "  ", text);
            if (r->n_crossings > 1) {
                char list[PLUMB_LIMIT_TEXT];
                crossing_list(w, rep->key, r, list, sizeof list);
                snprintf(text, sizeof text,
                         "the %s is not monotonic in %s: it crosses the limit at %s; %s at the "
                         "low end of the range and alternately between the crossings.",
                         metric_word(rep->metric), rep->key, list,
                         r->within_at_low_end ? "within" : "exceeded");
                wrapped(w, "  ", text);
            }
            /* why the answer stops short of its crossing, or why a crossing
             * is there (a canopy that does not fill): inverse.h */
            if (r->explanation[0]) {
                snprintf(text, sizeof text, "%s.", r->explanation);
                wrapped(w, "  ", text);
            }
        } else if (r->outcome == PLUMB_LIMIT_NOT_APPLICABLE) {
            explain(w, rep, r, set_key, text, sizeof text);
            wrapped(w, "  ", text);
            continue;
        } else {
            put(w, "  %s: %s\n", set_key,
                r->outcome == PLUMB_LIMIT_UNLIMITED     ? "no limit in the physical range"
                : r->outcome == PLUMB_LIMIT_NOT_REACHED ? "the limit is not reached"
                                                        : "no value meets the limit");
            explain(w, rep, r, set_key, text, sizeof text);
            wrapped(w, "  ", text);
        }
        snprintf(text, sizeof text, "the profile's own value %s gives %s (%zu fall%s computed)",
                 t_value(w, rep->key, r->dim, r->base_value_si), t_metric(w, rep->metric, r->metric_at_base),
                 r->evaluations, plumbp_s(r->evaluations));
        wrapped(w, "  ", text);
    }
    if (limit_has_warnings(rep)) {
        size_t found = 0, applies = 0;
        for (size_t i = 0; i < rep->n_items; i++) {
            found += rep->results[i].outcome == PLUMB_LIMIT_FOUND;
            applies += rep->results[i].outcome != PLUMB_LIMIT_NOT_APPLICABLE &&
                       rep->results[i].outcome != PLUMB_LIMIT_NOT_ASKED;
        }
        put(w, "\nWarnings, of the fall %s\n",
            found == applies ? "at the answer"
            : found == 0     ? "at the profile's own value (no value meets the limit)"
                             : "at each item's answer, or at its own value if none");
        each_limit_warning(w, rep, plumbp_text_warning_line);
    }
    plumbp_text_profile(w, p);
    plumbp_caution_lines_text(w);
}

static void csv_limit(writer *w, const plumb_limit_report *rep)
{
    char text[EXPLAIN_TEXT];
    plumbp_csv_cautions(w);
    snprintf(text, sizeof text, "profile: %s (%s), sha256 %s", plumb_profile_name(rep->profile),
             plumb_profile_path(rep->profile), plumb_profile_sha256(rep->profile));
    csv_comment(w, text);
    const plumb_criterion *c = rep->criterion_info;
    if (c) {
        char line[PLUMB_CRIT_TEXT * 4 + PLUMB_CRIT_ID + NUMBUF * 2], quoted[PLUMB_CRIT_TEXT * 2];
        snprintf(line, sizeof line,
                 "criterion %s: %s, kind %s, limit %s, source: %s, status %s", c->id, c->name,
                 plumbp_crit_kind_name(c->kind), plumbp_csv_limit(w, c->energy_limit_j),
                 plumbp_t_source(w, c, quoted, sizeof quoted), c->status[0] ? c->status : "not given");
        csv_comment(w, line);
    }
    each_limit_warning(w, rep, plumbp_csv_warning_line);
    put(w, "item_number,name,key,outcome,value,unit,value_si,metric,limit_si,metric_at_value_si,"
           "base_value_si,metric_at_base_si,crossings,evaluations,explanation\n");
    for (size_t i = 0; i < rep->n_items; i++) {
        const plumb_limit_result *r = &rep->results[i];
        if (r->outcome == PLUMB_LIMIT_NOT_ASKED)
            continue;
        char set_key[PLUMB_DIAG_KEY + 16];
        plumb_limit_set_key(rep->profile, i, rep->key, set_key, sizeof set_key);
        /* value and unit: in the unit the key was given in, when it was
         * given in one, else in the report's units */
        shown v = plumbp_show_key(w, rep->key, r->dim, r->value_si);
        int down = r->limit_is_upper_bound, v_down = down;
        if (r->given_unit[0] && r->given_scale_si != 0.0) {
            v = (shown){(r->value_si - r->given_offset_si) / r->given_scale_si,
                        unit_shown(w, r->given_unit)};
            v_down = r->given_scale_si < 0.0 ? !down : down;
        }
        /* the answer's CSV_DIGITS figures rounded toward the side that
         * meets the limit, as the text's are: fed back, it meets it */
        v.x = plumbp_round_safe(v.x, CSV_DIGITS, v_down);
        double value_si = plumbp_round_safe(r->value_si, CSV_DIGITS, down);
        int found = r->outcome == PLUMB_LIMIT_FOUND; /* else no value: empty fields */
        put(w, "%zu,", plumb_profile_item_number(rep->profile, i));
        csv_field(w, plumb_profile_item(rep->profile, i)->name);
        put(w, ",");
        csv_field(w, set_key); /* as `plumb fall --set` takes it */
        put(w, ",%s,%s,", outcome_word(r->outcome), found ? csvnum(w, v.x) : "");
        csv_field(w, v.unit);
        put(w, ",%s,%s,%s,%s,%s,%s,%zu,%zu,", found ? csvnum(w, value_si) : "",
            metric_word(rep->metric), csvnum(w, rep->limit),
            found ? csvnum(w, r->metric_at_value) : "", csvnum(w, r->base_value_si),
            csvnum(w, r->metric_at_base), r->n_crossings, r->evaluations);
        explain(w, rep, r, set_key, text, sizeof text);
        csv_field(w, text);
        put(w, "\n");
    }
}

/* The explanation of the JSON: in SI, whatever --units says (README.md
 * "Common options"), words joined by plain spaces. */
static const char *j_explain(jctx *j, const plumb_limit_report *rep, const plumb_limit_result *r,
                             const char *label, char *buf, size_t size)
{
    writer si;
    memset(&si, 0, sizeof si); /* no stream: only its figures are used */
    explain(&si, rep, r, label, buf, size);
    for (char *c = buf; *c; c++)
        if (*c == NBSP_CHAR)
            *c = ' ';
    if (si.bad)
        j->bad = 1;
    return buf;
}

static json_t *j_limit(jctx *j, const plumb_report_options *opt, const plumb_limit_report *rep)
{
    char text[EXPLAIN_TEXT];
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
        if (r->outcome == PLUMB_LIMIT_NOT_ASKED)
            continue;
        json_t *o = jobj(j);
        const char *u = plumb_dim_si_unit(r->dim);
        char set_key[PLUMB_DIAG_KEY + 16];
        plumb_limit_set_key(rep->profile, i, rep->key, set_key, sizeof set_key);
        jset(j, o, "name", jstr(j, plumb_profile_item(rep->profile, i)->name));
        jset(j, o, "item_number", jint(j, plumb_profile_item_number(rep->profile, i)));
        jset(j, o, "set_key", jstr(j, set_key));
        jset(j, o, "outcome", jstr(j, outcome_word(r->outcome)));
        char k_value[64], k_base[64];
        snprintf(k_value, sizeof k_value, "%s_at_value_%s", metric_stem(rep->metric),
                 metric_unit_key(rep->metric));
        snprintf(k_base, sizeof k_base, "%s_at_base_%s", metric_stem(rep->metric),
                 metric_unit_key(rep->metric));
        /* the key's value: in the SI unit named by unit_si (it varies with the key) */
        if (r->outcome == PLUMB_LIMIT_FOUND) {
            jset(j, o, "value_si", jreal(j, r->value_si));
            if (r->given_unit[0] && r->given_scale_si != 0.0) {
                /* the same value in the unit the profile gave the key in */
                jset(j, o, "given_unit", jstr(j, r->given_unit));
                jset(j, o, "value_in_given_unit",
                     jreal(j, (r->value_si - r->given_offset_si) / r->given_scale_si));
            }
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
        if (r->outcome != PLUMB_LIMIT_NOT_APPLICABLE) {
            jset(j, o, "scanned_from_si", jreal(j, r->scan_lo_si));
            jset(j, o, "scanned_to_si", jreal(j, r->scan_hi_si));
            jset(j, o, "values_scanned", jint(j, r->n_scanned));
            /* the metric at the highest value computed: for "not reached",
             * how far below the limit the scan ended */
            char k_top[64];
            snprintf(k_top, sizeof k_top, "%s_at_scanned_to_%s", metric_stem(rep->metric),
                     metric_unit_key(rep->metric));
            jset(j, o, k_top, jreal(j, r->metric_at_scan_hi));
        }
        jset(j, o, "explanation", jstr(j, j_explain(j, rep, r, set_key, text, sizeof text)));
        /* the fall at the answer (at the profile's own value where none is
         * found): its warnings */
        json_t *warn = jarr(j);
        for (size_t k = 0; rep->falls && rep->falls[i].spec && k < rep->falls[i].n_warnings; k++)
            jpush(j, warn, jwarning(j, rep->falls[i].warnings[k]));
        jset(j, o, "warnings", warn);
        jpush(j, items, o);
    }
    jset(j, lim, "items", items);
    jset(j, root, "limit", lim);
    jset(j, root, "profile", plumbp_j_profile(j, rep->profile));
    jset(j, root, "cautions", j_cautions(j));
    return root;
}

plumb_status plumb_report_limit(FILE *out, const plumb_report_options *opt,
                                const plumb_limit_report *rep, plumb_diag *diag)
{
    plumb_report_options def;
    opt = plumbp_opts_or_default(opt, &def);
    if (!out || !rep || !rep->profile || !rep->results || rep->n_items == 0 || !rep->key)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "no limit answer to write");
    if (opt->format == PLUMB_FORMAT_JSON) {
        jctx j = {0, 0};
        return emit_json(out, &j, j_limit(&j, opt, rep), diag);
    }
    writer w;
    plumb_status st = plumbp_writer_open(&w, opt->units, diag);
    if (st != PLUMB_OK)
        return st;
    if (opt->format == PLUMB_FORMAT_CSV)
        csv_limit(&w, rep);
    else
        text_limit_answer(&w, opt, rep);
    return plumbp_writer_close(&w, out, diag);
}
