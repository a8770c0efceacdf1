/*
 * fall_descent_text.c - the descent devices of a fall in the text report
 * (fall_text.c): each device's deploy rule, inflation, line stretch and
 * Pflanz's opening-force estimate, the peak drag force and the steady
 * descent, worded by which devices this fall opened.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "report/common.h"

static void text_deploy_rule(writer *w, const plumb_descent_spec *d, char *buf, size_t size)
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
        snprintf(buf, size, "deploys below %s, %s", plumbp_t_len(w, d->deploy_value), fill);
    w->exact = 0;
}

/* The inflation curve of a device and where its figures come from. */
static void text_inflation(writer *w, const plumb_descent_spec *d)
{
    char line[NUMBUF * 8];
    const plumb_canopy_info *ci = plumb_canopy_info_of(d->canopy);
    double j = d->inflation_exponent > 0.0 ? d->inflation_exponent : 1.0;
    if (!(d->fill_time_s > 0.0) && !(d->fill_constant > 0.0)) {
        /* no fill: the deploy rule already says "opens at once" */
        if (ci)
            wrapped(w, "                   canopy: ", ci->name);
        return;
    }
    w->exact = 1;
    snprintf(line, sizeof line, "%s%sdrag area grows as (t/t_f)^%s over the fill (Knacke 1991)%s",
             ci ? ci->name : "", ci ? " canopy: " : "", plumbp_gnum(w, j, 3),
             d->inflation_exponent > 0.0 ? "" : "; linear: no canopy type or exponent given");
    w->exact = 0;
    wrapped(w, "                   ", line);
    if (ci)
        wrapped(w, "                   source: ", ci->source);
}

/* Pflanz's hand estimate beside the integrated peak. */
static void text_pflanz(writer *w, const plumb_descent_spec *d, const plumb_fall_result *r,
                        size_t i, double weight_n)
{
    char line[NUMBUF * 10];
    if (!(r->fill_time_s[i] > 0.0)) {
        wrapped(w, "                   ", "opens at once: no fill, so no Pflanz estimate");
        return;
    }
    if (d->opening_factor > 0.0)
        snprintf(line, sizeof line,
                 "fill time %s" NBSP "s; Pflanz's hand estimate (weightless, horizontal): A %s, "
                 "X1 %s, C_x %s: opening force %s (%s" NBSP "g)",
                 num(w, r->fill_time_s[i], TEXT_SIG), num(w, r->pflanz_a[i], 3),
                 num(w, r->pflanz_x1[i], 3), num(w, d->opening_factor, 3),
                 plumbp_t_force(w, r->pflanz_force_n[i]),
                 num(w, r->pflanz_force_n[i] / weight_n, 3));
    else
        snprintf(line, sizeof line,
                 "fill time %s" NBSP "s; Pflanz's hand estimate (weightless, horizontal): A %s, "
                 "X1 %s: X1 q1 CdS0 %s, times C_x (not known: give canopy or opening_factor)",
                 num(w, r->fill_time_s[i], TEXT_SIG), num(w, r->pflanz_a[i], 3),
                 num(w, r->pflanz_x1[i], 3),
                 plumbp_t_force(w, r->pflanz_x1[i] * r->pflanz_q1s_n[i]));
    wrapped(w, "                   ", line);
}

/* "the drogue and the parachute do not open", "the parachute does not
 * open": the devices i0..n of s that never open, by kind; by number when
 * two of them are of one kind. */
static void devices_not_open(const plumb_fall_spec *s, const plumb_fall_result *r, char *buf,
                             size_t size)
{
    size_t n = s->n_descent < PLUMB_MAX_DESCENT ? s->n_descent : PLUMB_MAX_DESCENT;
    size_t closed = 0, last = 0;
    int same = 0;
    for (size_t i = 0; i < n; i++) {
        if (r->deployed[i])
            continue;
        closed++;
        last = i;
        for (size_t k = i + 1; k < n; k++)
            same |= !r->deployed[k] && s->descent[i].kind == s->descent[k].kind;
    }
    if (same) {
        /* two of a kind: counted, since their names would not tell them apart */
        if (closed == n)
            snprintf(buf, size, "none of the %zu devices opens", n);
        else
            snprintf(buf, size, "%zu of the %zu devices do not open", closed, n);
        return;
    }
    size_t len = (size_t)snprintf(buf, size, "the");
    size_t seen = 0;
    for (size_t i = 0; i < n && len < size; i++) {
        if (r->deployed[i])
            continue;
        len += (size_t)snprintf(buf + len, size - len, "%s %s",
                                seen == 0 ? "" : i == last ? " and the" : ", the",
                                plumb_descent_kind_name(s->descent[i].kind));
        seen++;
    }
    if (len < size)
        snprintf(buf + len, size - len, " %s", closed > 1 ? "do not open" : "does not open");
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

/* The steady descent speed, worded by what this fall deployed: a device
 * that never opens gives none, so with no device open the figure does not
 * apply; with some open, the figure (with every device open, as in JSON
 * steady_speed_m_s) is not what this fall reaches, and says so. */
static void text_steady(writer *w, const plumb_fall_spec *s, const plumb_fall_result *r)
{
    size_t n = s->n_descent < PLUMB_MAX_DESCENT ? s->n_descent : PLUMB_MAX_DESCENT;
    char closed[NUMBUF * 2], line[NUMBUF * 12];
    counted all, opened;
    unsigned open_mask = 0;
    for (size_t i = 0; i < n; i++)
        if (r->deployed[i])
            open_mask |= 1u << i;
    devices_counted(s, PLUMBP_ALL_MASK(n), &all);
    if (r->n_deployed == 0) {
        devices_not_open(s, r, closed, sizeof closed);
        snprintf(line, sizeof line, "does not apply (%s before impact)", closed);
    } else if (r->n_deployed >= n) {
        if (r->steady_speed_m_s > 0.0)
            snprintf(line, sizeof line, "%s with %s open%s, at the strike level",
                     plumbp_t_speed(w, r->steady_speed_m_s), all.names, all.note);
        else
            snprintf(line, sizeof line, "none up to %s even with %s open%s: too little drag",
                     plumbp_t_speed(w, PLUMB_TERMINAL_MAX_M_S), all.names, all.note);
    } else {
        /* some opened: the speed with those, this fall's, then with all */
        devices_not_open(s, r, closed, sizeof closed);
        devices_counted(s, open_mask, &opened);
        char with_opened[NUMBUF * 3];
        if (r->steady_opened_m_s > 0.0)
            snprintf(with_opened, sizeof with_opened, "%s with %s open, as in this fall",
                     plumbp_t_speed(w, r->steady_opened_m_s), opened.names);
        else
            snprintf(with_opened, sizeof with_opened, "none up to %s with %s open",
                     plumbp_t_speed(w, PLUMB_TERMINAL_MAX_M_S), opened.names);
        if (strcmp(opened.names, all.names) == 0) /* the same devices count: one figure */
            snprintf(line, sizeof line, "%s (%s before impact), at the strike level",
                     with_opened, closed);
        else if (r->steady_speed_m_s > 0.0)
            snprintf(line, sizeof line,
                     "%s (%s before impact); %s with %s open%s; at the strike level",
                     with_opened, closed, plumbp_t_speed(w, r->steady_speed_m_s), all.names,
                     all.note);
        else
            snprintf(line, sizeof line,
                     "%s (%s before impact); none up to %s even with %s open%s",
                     with_opened, closed, plumbp_t_speed(w, PLUMB_TERMINAL_MAX_M_S), all.names,
                     all.note);
    }
    wrapped(w, "  steady descent   ", line);
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
        char rule[NUMBUF * 4], line[NUMBUF * 8], lead[32];
        text_deploy_rule(w, d, rule, sizeof rule);
        snprintf(lead, sizeof lead, "  %-16s ", plumb_descent_kind_name(d->kind));
        w->exact = 1;
        snprintf(line, sizeof line, "Cd %s on %s; %s", plumbp_gnum(w, d->cd, INPUT_SIG),
                 plumbp_t_area(w, d->area_m2), rule);
        w->exact = 0;
        wrapped(w, lead, line);
        text_inflation(w, d);
        if (r->deployed[i])
            snprintf(line, sizeof line,
                     "line stretch %s" NBSP "s after release, %s above the strike level, at %s "
                     "air speed",
                     num(w, r->deploy_time_s[i], TEXT_SIG), plumbp_t_len(w, r->deploy_height_m[i]),
                     plumbp_t_speed(w, r->deploy_speed_m_s[i]));
        else
            snprintf(line, sizeof line, "does not open before impact");
        wrapped(w, "                   ", line);
        if (r->deployed[i])
            text_pflanz(w, d, r, i, s->mass_kg * PLUMB_G0_M_S2);
    }
    put(w, "  peak drag force  %s (%s" NBSP "g), integrated along the fall\n",
        plumbp_t_force(w, r->peak_force_n), num(w, r->peak_load_g, 3));
    text_steady(w, s, r);
}
