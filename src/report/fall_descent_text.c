/*
 * fall_descent_text.c - the descent devices of a fall in the text report
 * (fall_text.c): each device's deploy rule, inflation, line stretch and
 * Pflanz's opening-force estimate, the peak drag force and the steady
 * descent, worded by which devices this fall opened. Its sentences are
 * built by plumbp_descent_* (common.h) so that the PDF sheet (sheet_*.c)
 * says the same in the same words; given a second writer `o`, each figure
 * with a unit has the other system's beside it (US first, SI in brackets;
 * SI first, US in parentheses), as the sheet gives its figures. The text
 * report passes NULL and shows its own units only.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "report/common.h"
#include "physics/physics.h"

/* common.h: the sheet's "6.550 m/s (21.49 ft/s)", the text's "6.550 m/s". */
const char *plumbp_t_beside(writer *w, writer *o, const char *(*t)(writer *, double), double x)
{
    if (!o)
        return t(w, x);
    int exact = o->exact, sig = o->sig, strict = o->strict;
    o->exact = w->exact;
    o->sig = w->sig;
    o->strict = w->strict;
    char *b = slot(w);
    snprintf(b, NUMBUF, w->us ? "%s [%s]" : "%s (%s)", t(w, x), t(o, x));
    o->exact = exact;
    o->sig = sig;
    o->strict = strict;
    if (o->bad)
        w->bad = 1;
    return b;
}

void plumbp_descent_rule(writer *w, writer *o, const plumb_descent_spec *d, char *buf,
                         size_t size)
{
    char fill[NUMBUF * 2];
    w->exact = 1;
    if (d->fill_constant > 0.0)
        snprintf(fill, sizeof fill, "fills in n D0 / v with n = %s",
                 plumbp_gnum(w, d->fill_constant, 3));
    else if (d->fill_time_s > 0.0)
        snprintf(fill, sizeof fill, "fills in %s" NBSP "s",
                 plumbp_gnum(w, d->fill_time_s, TEXT_SIG));
    else
        snprintf(fill, sizeof fill, "opens at once");
    if (d->trigger == PLUMB_DEPLOY_AFTER)
        snprintf(buf, size, "deploys %s" NBSP "s after release, %s",
                 plumbp_gnum(w, d->deploy_value, TEXT_SIG), fill);
    else
        snprintf(buf, size, "deploys below %s, %s",
                 plumbp_t_beside(w, o, plumbp_t_len, d->deploy_value), fill);
    w->exact = 0;
}

void plumbp_descent_size(writer *w, writer *o, const plumb_descent_spec *d, char *buf,
                         size_t size)
{
    w->exact = 1;
    snprintf(buf, size, "Cd %s on %s", plumbp_gnum(w, d->cd, INPUT_SIG),
             plumbp_t_beside(w, o, plumbp_t_area, d->area_m2));
    w->exact = 0;
}

int plumbp_descent_inflation(writer *w, const plumb_descent_spec *d, char *buf, size_t size)
{
    const plumb_canopy_info *ci = plumb_canopy_info_of(d->canopy);
    double j = d->inflation_exponent > 0.0 ? d->inflation_exponent : 1.0;
    if (!(d->fill_time_s > 0.0) && !(d->fill_constant > 0.0)) {
        /* no fill: the deploy rule already says "opens at once" */
        snprintf(buf, size, "%s", ci ? ci->name : "");
        return 0;
    }
    w->exact = 1;
    snprintf(buf, size, "%s%sdrag area grows as (t/t_f)^%s over the fill (Knacke 1991)%s",
             ci ? ci->name : "", ci ? " canopy: " : "", plumbp_gnum(w, j, 3),
             d->inflation_exponent > 0.0 ? "" : "; linear: no canopy type or exponent given");
    w->exact = 0;
    return 1;
}

/* The inflation curve of a device and where its figures come from. */
static void text_inflation(writer *w, const plumb_descent_spec *d)
{
    char line[NUMBUF * 8];
    const plumb_canopy_info *ci = plumb_canopy_info_of(d->canopy);
    if (!plumbp_descent_inflation(w, d, line, sizeof line)) {
        if (ci)
            wrapped(w, "                   canopy: ", line);
        return;
    }
    wrapped(w, "                   ", line);
    if (ci)
        wrapped(w, "                   source: ", ci->source);
}

/* A force with its load in g: "70.16 N (3.71 g)"; beside the other
 * system's "70.16 N (15.77 lbf), 3.71 g". */
static const char *force_g(writer *w, writer *o, double n, double g)
{
    char *b = slot(w);
    snprintf(b, NUMBUF, o ? "%s, %s" NBSP "g" : "%s (%s" NBSP "g)",
             plumbp_t_beside(w, o, plumbp_t_force, n), num(w, g, 3));
    return b;
}

void plumbp_descent_pflanz(writer *w, writer *o, const plumb_fall_spec *s,
                           const plumb_fall_result *r, size_t i, double weight_n, char *buf,
                           size_t size)
{
    const plumb_descent_spec *d = &s->descent[i];
    /* a canopy still filling at impact, or cut away while still filling,
     * never felt the full opening */
    plumb_device_at_impact at;
    plumb_device_state st = plumb_fall_device_at_impact(s, r, i, &at);
    const char *unfilled = st == PLUMB_DEVICE_FILLING
                               ? ", for a full fill, which this fall did not reach"
                           : st == PLUMB_DEVICE_REPLACED && at.fill_fraction < 1.0
                               ? ", for a full fill, which it did not reach before it was cut "
                                 "away"
                               : "";
    if (!(r->fill_time_s[i] > 0.0))
        snprintf(buf, size, "opens at once: no fill, so no Pflanz estimate");
    else if (d->opening_factor > 0.0)
        snprintf(buf, size,
                 "fill time %s" NBSP "s; Pflanz's hand estimate (weightless, horizontal): A %s, "
                 "X1 %s, C_x %s: opening force %s%s",
                 num(w, r->fill_time_s[i], TEXT_SIG), num(w, r->pflanz_a[i], 3),
                 num(w, r->pflanz_x1[i], 3), num(w, d->opening_factor, 3),
                 force_g(w, o, r->pflanz_force_n[i], r->pflanz_force_n[i] / weight_n), unfilled);
    else
        snprintf(buf, size,
                 "fill time %s" NBSP "s; Pflanz's hand estimate (weightless, horizontal): A %s, "
                 "X1 %s: X1 q1 CdS0 %s, times C_x (not known: give canopy or "
                 "opening_factor)%s",
                 num(w, r->fill_time_s[i], TEXT_SIG), num(w, r->pflanz_a[i], 3),
                 num(w, r->pflanz_x1[i], 3),
                 plumbp_t_beside(w, o, plumbp_t_force, r->pflanz_x1[i] * r->pflanz_q1s_n[i]),
                 unfilled);
}

void plumbp_descent_opening(writer *w, writer *o, const plumb_fall_spec *s,
                            const plumb_fall_result *r, size_t i, char *buf, size_t size)
{
    plumb_device_at_impact at;
    plumb_device_state st = plumb_fall_device_at_impact(s, r, i, &at);
    if (st == PLUMB_DEVICE_NOT_DEPLOYED) {
        snprintf(buf, size, "does not open before impact");
        return;
    }
    int len = snprintf(buf, size,
                       "line stretch %s" NBSP "s after release, %s above the strike level, at %s "
                       "air speed",
                       num(w, r->deploy_time_s[i], TEXT_SIG),
                       plumbp_t_beside(w, o, plumbp_t_len, r->deploy_height_m[i]),
                       plumbp_t_beside(w, o, plumbp_t_speed, r->deploy_speed_m_s[i]));
    if (st == PLUMB_DEVICE_FILLING && len >= 0 && (size_t)len < size)
        snprintf(buf + len, size - (size_t)len,
                 "; still filling at impact, %s" NBSP "s later: %s" NBSP "%% of its fill time, "
                 "drag area %s of the full %s",
                 num(w, r->time_s - r->deploy_time_s[i], TEXT_SIG),
                 num(w, 100.0 * at.fill_fraction, 3),
                 plumbp_t_beside(w, o, plumbp_t_area, at.cds_m2),
                 plumbp_t_beside(w, o, plumbp_t_area, at.cds_full_m2));
    /* replaced before the end of its fill: cut away part-filled, worded as
     * the filling canopy above, at the next device's line stretch */
    if (st == PLUMB_DEVICE_REPLACED && at.fill_fraction < 1.0 && i + 1 < s->n_descent &&
        len >= 0 && (size_t)len < size)
        snprintf(buf + len, size - (size_t)len,
                 "; cut away while still filling, at the %s's line stretch %s" NBSP "s later: "
                 "%s" NBSP "%% of its fill time, drag area %s of the full %s",
                 plumb_descent_kind_name(s->descent[i + 1].kind),
                 num(w, r->deploy_time_s[i + 1] - r->deploy_time_s[i], TEXT_SIG),
                 num(w, 100.0 * at.fill_fraction, 3),
                 plumbp_t_beside(w, o, plumbp_t_area, plumbp_device_cds_at(&s->descent[i],
                                                                          at.fill_fraction)),
                 plumbp_t_beside(w, o, plumbp_t_area, at.cds_full_m2));
}

void plumbp_descent_peak(writer *w, writer *o, const plumb_fall_result *r, char *buf, size_t size)
{
    snprintf(buf, size, "%s, integrated along the fall",
             force_g(w, o, r->peak_force_n, r->peak_load_g));
}

/* The state of each of the n devices of r at impact (plumb/trajectory.h). */
static void device_states(const plumb_fall_spec *s, const plumb_fall_result *r, size_t n,
                          plumb_device_state st[PLUMB_MAX_DESCENT])
{
    for (size_t i = 0; i < n; i++)
        st[i] = plumb_fall_device_at_impact(s, r, i, NULL);
}

/* "the parachute", "the drogue and the parachute": the devices in state
 * `want`, by kind, then the verb for one or for several; appended at
 * buf + *len. */
static void devices_in_state(const plumb_fall_spec *s, const plumb_device_state *st, size_t n,
                             plumb_device_state want, const char *one, const char *several,
                             char *buf, size_t size, size_t *len)
{
    size_t count = 0, seen = 0;
    for (size_t i = 0; i < n; i++)
        count += st[i] == want;
    for (size_t i = 0; i < n && *len < size; i++) {
        if (st[i] != want)
            continue;
        int w = snprintf(buf + *len, size - *len, "%s%s",
                         seen == 0 ? "the " : seen + 1 == count ? " and the " : ", the ",
                         plumb_descent_kind_name(s->descent[i].kind));
        *len += w > 0 ? (size_t)w : 0;
        seen++;
    }
    if (*len < size) {
        int w = snprintf(buf + *len, size - *len, " %s", count > 1 ? several : one);
        *len += w > 0 ? (size_t)w : 0;
    }
}

/* "the parachute does not open before impact", "the parachute is still
 * filling at impact", "the drogue does not open before impact and the
 * parachute is still filling at impact": the devices of s not open at
 * impact, by kind and state; counted when one of them shares its kind
 * with another device, open or not. */
static void devices_not_open(const plumb_fall_spec *s, const plumb_fall_result *r, char *buf,
                             size_t size)
{
    size_t n = s->n_descent < PLUMB_MAX_DESCENT ? s->n_descent : PLUMB_MAX_DESCENT;
    plumb_device_state st[PLUMB_MAX_DESCENT];
    device_states(s, r, n, st);
    size_t closed = 0, filling = 0;
    int same = 0;
    for (size_t i = 0; i < n; i++) {
        if (st[i] != PLUMB_DEVICE_NOT_DEPLOYED && st[i] != PLUMB_DEVICE_FILLING)
            continue; /* open, or replaced by the next device */
        closed += st[i] == PLUMB_DEVICE_NOT_DEPLOYED;
        filling += st[i] == PLUMB_DEVICE_FILLING;
        for (size_t k = 0; k < n; k++) /* open or not: "the drogue" would not say which */
            same |= k != i && s->descent[i].kind == s->descent[k].kind;
    }
    buf[0] = '\0';
    if (same) {
        /* two of a kind: counted, since their names would not tell them apart */
        if (closed && filling)
            snprintf(buf, size, "%zu of the %zu devices %s not open before impact and %zu %s "
                     "still filling at impact", closed, n, closed > 1 ? "do" : "does", filling,
                     filling > 1 ? "are" : "is");
        else if (closed == n)
            snprintf(buf, size, "none of the %zu devices opens before impact", n);
        else if (closed)
            snprintf(buf, size, "%zu of the %zu devices %s not open before impact", closed, n,
                     closed > 1 ? "do" : "does");
        else if (filling == n)
            snprintf(buf, size, "all %zu devices are still filling at impact", n);
        else
            snprintf(buf, size, "%zu of the %zu devices %s still filling at impact", filling, n,
                     filling > 1 ? "are" : "is");
        return;
    }
    size_t len = 0;
    if (closed)
        devices_in_state(s, st, n, PLUMB_DEVICE_NOT_DEPLOYED, "does not open before impact",
                         "do not open before impact", buf, size, &len);
    if (closed && filling && len < size)
        len += (size_t)snprintf(buf + len, size - len, " and ");
    if (filling)
        devices_in_state(s, st, n, PLUMB_DEVICE_FILLING, "is still filling at impact",
                         "are still filling at impact", buf, size, &len);
}

/* The bits of descent[0 .. n). */
#define PLUMBP_ALL_MASK(n) ((n) >= 32 ? ~0u : (1u << (n)) - 1u)

/* "the parachute", "the drogue and the parachute": the devices of `mask`
 * that count in a steady descent, named as the text names them; *note
 * " (it replaces the drogue)" for one a later device replaces, else "". */
typedef struct counted {
    char names[NUMBUF * 2];
    char note[NUMBUF];
} counted;

static void devices_counted(const plumb_fall_spec *s, unsigned mask, counted *c)
{
    char *buf = c->names;
    size_t size = sizeof c->names;
    c->note[0] = '\0';
    size_t n = s->n_descent < PLUMB_MAX_DESCENT ? s->n_descent : PLUMB_MAX_DESCENT;
    size_t len = 0, seen = 0, count = 0;
    const char *replaced = NULL;
    buf[0] = '\0';
    for (size_t i = 0; i < n; i++)
        count += (mask >> i) & 1u;
    for (size_t i = 0; i < n && len < size; i++) {
        if (!((mask >> i) & 1u))
            continue;
        if (i + 1 < n && ((mask >> (i + 1)) & 1u) && s->descent[i + 1].disreefs_previous) {
            replaced = plumb_descent_kind_name(s->descent[i].kind);
            count--;
            continue;
        }
        len += (size_t)snprintf(buf + len, size - len, "%s%s",
                                seen == 0 ? "the " : seen + 1 == count ? " and the " : ", the ",
                                plumb_descent_kind_name(s->descent[i].kind));
        seen++;
    }
    if (replaced)
        snprintf(c->note, sizeof c->note, " (it replaces the %s)", replaced);
}

/* The steady descent speed, worded by what this fall opened: a device
 * that never opens, or whose canopy is still filling at impact
 * (plumb_fall_device_at_impact), gives none in this fall, so with no
 * device open the figure does not apply, or is not reached while one is
 * still filling (the speed with every device fully open follows); with
 * some open, the speed with those (JSON steady_speed_opened_m_s) and then
 * with every one (steady_speed_m_s). */
void plumbp_descent_steady(writer *w, writer *o, const plumb_fall_spec *s,
                           const plumb_fall_result *r, char *line, size_t size)
{
    size_t n = s->n_descent < PLUMB_MAX_DESCENT ? s->n_descent : PLUMB_MAX_DESCENT;
    char closed[NUMBUF * 4];
    counted all, opened;
    unsigned open_mask = plumb_fall_opened_devices(s, r);
    int filling = 0;
    for (size_t i = 0; i < n; i++)
        filling |= plumb_fall_device_at_impact(s, r, i, NULL) == PLUMB_DEVICE_FILLING;
    devices_counted(s, PLUMBP_ALL_MASK(n), &all);
    if (open_mask == 0) {
        devices_not_open(s, r, closed, sizeof closed);
        if (filling && r->steady_speed_m_s > 0.0)
            snprintf(line, size, "not reached (%s); %s with %s fully open%s, at the strike "
                     "level", closed, plumbp_t_beside(w, o, plumbp_t_speed, r->steady_speed_m_s),
                     all.names, all.note);
        else
            snprintf(line, size, "does not apply (%s)", closed);
    } else if (open_mask == PLUMBP_ALL_MASK(n)) {
        if (r->steady_speed_m_s > 0.0)
            snprintf(line, size, "%s with %s open%s, at the strike level",
                     plumbp_t_beside(w, o, plumbp_t_speed, r->steady_speed_m_s), all.names,
                     all.note);
        else
            snprintf(line, size, "none up to %s even with %s open%s: too little drag",
                     plumbp_t_beside(w, o, plumbp_t_speed, PLUMB_TERMINAL_MAX_M_S), all.names,
                     all.note);
    } else {
        /* some opened: the speed with those, this fall's, then with all */
        devices_not_open(s, r, closed, sizeof closed);
        devices_counted(s, open_mask, &opened);
        char with_opened[NUMBUF * 4];
        if (r->steady_opened_m_s > 0.0)
            snprintf(with_opened, sizeof with_opened, "%s with %s open, as in this fall",
                     plumbp_t_beside(w, o, plumbp_t_speed, r->steady_opened_m_s), opened.names);
        else
            snprintf(with_opened, sizeof with_opened, "none up to %s with %s open",
                     plumbp_t_beside(w, o, plumbp_t_speed, PLUMB_TERMINAL_MAX_M_S), opened.names);
        if (strcmp(opened.names, all.names) == 0) /* the same devices count: one figure */
            snprintf(line, size, "%s (%s), at the strike level", with_opened, closed);
        else if (r->steady_speed_m_s > 0.0)
            snprintf(line, size, "%s (%s); %s with %s open%s; at the strike level",
                     with_opened, closed,
                     plumbp_t_beside(w, o, plumbp_t_speed, r->steady_speed_m_s), all.names,
                     all.note);
        else
            snprintf(line, size, "%s (%s); none up to %s even with %s open%s",
                     with_opened, closed,
                     plumbp_t_beside(w, o, plumbp_t_speed, PLUMB_TERMINAL_MAX_M_S), all.names,
                     all.note);
    }
}

void plumbp_text_descent(writer *w, const plumb_item_report *it, const char *who)
{
    const plumb_fall_spec *s = it->spec;
    const plumb_fall_result *r = &it->result;
    if (s->n_descent == 0)
        return;
    put(w, "\nDescent devices%s%s\n", who ? " of " : "", who ? who : "");
    for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        const plumb_descent_spec *d = &s->descent[i];
        char rule[NUMBUF * 4], size[NUMBUF * 2], line[NUMBUF * 8], lead[32];
        plumbp_descent_rule(w, NULL, d, rule, sizeof rule);
        plumbp_descent_size(w, NULL, d, size, sizeof size);
        snprintf(lead, sizeof lead, "  %-16s ", plumb_descent_kind_name(d->kind));
        snprintf(line, sizeof line, "%s; %s", size, rule);
        wrapped(w, lead, line);
        text_inflation(w, d);
        plumbp_descent_opening(w, NULL, s, r, i, line, sizeof line);
        wrapped(w, "                   ", line);
        if (r->deployed[i]) {
            plumbp_descent_pflanz(w, NULL, s, r, i, s->mass_kg * PLUMB_G0_M_S2, line, sizeof line);
            wrapped(w, "                   ", line);
        }
    }
    char line[NUMBUF * 5];
    plumbp_descent_peak(w, NULL, r, line, sizeof line);
    put(w, "  peak drag force  %s\n", line);
    plumbp_descent_steady(w, NULL, s, r, line, sizeof line);
    wrapped(w, "  steady descent   ", line);
}
