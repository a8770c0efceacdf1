/*
 * sheet_descent.c - the descent devices on the PDF sheet: what the fall
 * made of each device (section 2 for a single payload, the inventory's
 * section for a kit: opened or not, line stretch, Pflanz's opening force,
 * the peak drag force, the steady descent), and each device as understood
 * (the inputs' section: kind, Cd, area and diameter, deploy rule, fill,
 * canopy type), keyed as the profile writes it ("descent[0]",
 * "items[3].descent[1]") so that a signed sheet names the canopy assumed.
 * The sentences are the text report's (fall_descent_text.c,
 * plumbp_descent_*), each figure with the other unit system's beside it.
 */
#include <stdio.h>
#include <string.h>

#include "plumb/inflation.h"
#include "report/sheet_doc.h"
#include "report/common.h"

enum { DEVICE_KEY = 64, ITEM_KEY = 32 };

/* Item k's devices are its own (`items[N].descent:`) rather than the
 * profile's `descent:`, which every item without its own takes. */
static int own_devices(const plumb_profile *p, size_t k)
{
    if (!plumb_profile_is_inventory(p))
        return 0;
    char key[ITEM_KEY];
    int line, col;
    snprintf(key, sizeof key, "items[%zu].descent", plumb_profile_item_number(p, k));
    return plumb_profile_key_origin(p, key, &line, &col) != NULL;
}

/* Device i of item k, keyed as the profile writes it (and as --set takes
 * it): "descent[0]", or "items[3].descent[0]" for an item's own. */
static void device_key(const plumb_profile *p, size_t k, size_t i, char *buf, size_t size)
{
    if (own_devices(p, k))
        snprintf(buf, size, "items[%zu].descent[%zu]", plumb_profile_item_number(p, k), i);
    else
        snprintf(buf, size, "descent[%zu]", i);
}

/* A paragraph indented by `indent` points, paginated as a block. */
static void para_in(sheet_doc *d, double indent, const char *font, const char *markup)
{
    double w = sheet_width(d) - indent;
    double h = sheet_text(d, d->left + indent, d->y, w, font, markup, 0);
    sheet_need(d, h);
    sheet_text(d, d->left + indent, d->y, w, font, markup, 1);
    d->y += h + GAP / 3.0;
}

/* A bold title kept on its page with the height `keep` that follows. */
static void title(sheet_doc *d, const char *text, double keep)
{
    char bold[64];
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, SHEET_BODY);
    const char *m = sheet_esc(d, text);
    double h = sheet_text(d, d->left, d->y, sheet_width(d), bold, m, 0);
    sheet_need(d, h + 2.0 + keep);
    d->y += sheet_text(d, d->left, d->y, sheet_width(d), bold, m, 1) + 2.0;
}

/* The figures of one item's fall for its devices: one paragraph per
 * device in deployment order, then the peak drag force and the steady
 * descent. `who`: the item's number and name in a kit, or NULL. */
static void item_figures(sheet_doc *d, const plumb_brief *b, size_t k, const char *who,
                         const char *font, double indent)
{
    writer *P = sheet_primary(d), *S = sheet_secondary(d);
    const plumb_item_report *it = &b->fall->items[k];
    const plumb_fall_spec *s = it->spec;
    const plumb_fall_result *r = &it->result;
    char bold[64];
    snprintf(bold, sizeof bold, "%s Bold %.1f", SHEET_FONT, SHEET_SMALL + 1.0);
    if (who)
        para_in(d, 0.0, bold, sheet_esc(d, who));
    for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        char key[DEVICE_KEY], open[NUMBUF * 8], pflanz[NUMBUF * 8] = "";
        device_key(b->profile, k, i, key, sizeof key);
        plumbp_descent_opening(P, S, s, r, i, open, sizeof open);
        if (r->deployed[i])
            plumbp_descent_pflanz(P, S, s, r, i, s->mass_kg * PLUMB_G0_M_S2, pflanz,
                                  sizeof pflanz);
        /* a device not open at impact says so in bold: the fall above is
         * without it, or with its canopy part-filled; so does one cut away
         * while still filling, which never opened fully */
        plumb_device_at_impact at;
        plumb_device_state st = plumb_fall_device_at_impact(s, r, i, &at);
        int is_open = st == PLUMB_DEVICE_OPEN ||
                      (st == PLUMB_DEVICE_REPLACED && !(at.fill_fraction < 1.0));
        para_in(d, indent, font,
                sheet_fmt(d, "\x02<b>%s</b>, %s: %s%s%s%s%s.", sheet_esc(d, key),
                          plumb_descent_kind_name(s->descent[i].kind),
                          is_open ? "opens; " : "<b>",
                          sheet_fmt(d, "%s", open), is_open ? "" : "</b>",
                          pflanz[0] ? "; " : "", sheet_fmt(d, "%s", pflanz)));
    }
    char line[NUMBUF * 5];
    plumbp_descent_peak(P, S, r, line, sizeof line);
    para_in(d, indent, font,
            sheet_fmt(d, "\x02<b>Peak drag force</b> %s.", sheet_fmt(d, "%s", line)));
    plumbp_descent_steady(P, S, s, r, line, sizeof line);
    para_in(d, indent, font,
            sheet_fmt(d, "\x02<b>Steady descent</b> %s.", sheet_fmt(d, "%s", line)));
}

void sheet_descent_figures(sheet_doc *d, const plumb_brief *b)
{
    const plumb_fall_report *f = b->fall;
    size_t with = 0;
    for (size_t k = 0; k < f->n_items; k++)
        with += f->items[k].spec->n_descent > 0;
    if (with == 0)
        return;
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 9.0);
    d->y += GAP / 2.0;
    title(d, with == f->n_items && f->n_items == 1 ? "Descent devices, as this fall used them"
                                                   : "Descent devices, as each item's fall used "
                                                     "them",
          40.0);
    if (f->n_items == 1) {
        item_figures(d, b, 0, NULL, font, 0.0);
        return;
    }
    /* a kit: in the table's order, worst first */
    for (size_t r = 0; r < f->n_items; r++) {
        size_t k = b->order[r];
        if (f->items[k].spec->n_descent == 0)
            continue;
        char who[PLUMB_NAME + 32];
        snprintf(who, sizeof who, "%zu  %s", plumb_profile_item_number(b->profile, k),
                 f->items[k].spec->name);
        d->y += GAP / 3.0;
        sheet_need(d, 40.0); /* the item's name kept with its first device */
        item_figures(d, b, k, who, font, 10.0);
    }
}

/* One device as understood: kind, Cd on its area (and the diameter it
 * came from), the deploy rule and fill, the inflation curve and where
 * its figures come from. */
static void device_input(sheet_doc *d, const char *key, const char *note,
                         const plumb_descent_spec *dv, const char *font)
{
    writer *P = sheet_primary(d), *S = sheet_secondary(d);
    char size[NUMBUF * 2], dia[NUMBUF * 2] = "", rule[NUMBUF * 4], infl[NUMBUF * 8];
    char text[FMT_LEN];
    plumbp_descent_size(P, S, dv, size, sizeof size);
    if (dv->diameter_m > 0.0) {
        P->exact = 1;
        snprintf(dia, sizeof dia, ", from a diameter of %s",
                 plumbp_t_beside(P, S, plumbp_t_len, dv->diameter_m));
        P->exact = 0;
    }
    plumbp_descent_rule(P, S, dv, rule, sizeof rule);
    int curve = plumbp_descent_inflation(P, dv, infl, sizeof infl);
    const plumb_canopy_info *ci = plumb_canopy_info_of(dv->canopy);
    snprintf(text, sizeof text, "%s%s; %s%s%s%s%s%s", size, dia, rule,
             curve || ci ? "; " : "", !curve && ci ? "canopy: " : "", infl,
             ci ? "; source: " : "", ci ? ci->source : "");
    para_in(d, 0.0, font,
            sheet_fmt(d, "\x02<b>%s</b>%s, %s: %s.", sheet_esc(d, key), sheet_esc(d, note),
                      plumb_descent_kind_name(dv->kind), sheet_fmt(d, "%s", text)));
}

void sheet_descent_inputs(sheet_doc *d, const plumb_brief *b)
{
    const plumb_fall_report *f = b->fall;
    char font[64];
    snprintf(font, sizeof font, "%s %.1f", SHEET_FONT, 9.0);
    /* the profile's own `descent:`, once, with the items that take it */
    size_t shared = 0, first = 0;
    for (size_t k = f->n_items; k-- > 0;)
        if (f->items[k].spec->n_descent > 0 && !own_devices(b->profile, k)) {
            shared++;
            first = k;
        }
    size_t own = 0;
    for (size_t k = 0; k < f->n_items; k++)
        own += f->items[k].spec->n_descent > 0 && own_devices(b->profile, k);
    if (shared + own == 0)
        return;
    d->y += GAP;
    title(d, "Descent devices as understood, in deployment order", 30.0);
    char note[PLUMB_NAME + 64] = "";
    if (plumb_profile_is_inventory(b->profile) && shared > 0)
        snprintf(note, sizeof note, " (%s)",
                 shared == f->n_items ? "for every item" : "for every item without its own");
    const plumb_fall_spec *s = shared ? f->items[first].spec : NULL;
    for (size_t i = 0; s && i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        char key[DEVICE_KEY];
        device_key(b->profile, first, i, key, sizeof key);
        device_input(d, key, note, &s->descent[i], font);
    }
    for (size_t k = 0; k < f->n_items; k++) {
        const plumb_fall_spec *sk = f->items[k].spec;
        if (sk->n_descent == 0 || !own_devices(b->profile, k))
            continue;
        snprintf(note, sizeof note, " (%s)", sk->name);
        for (size_t i = 0; i < sk->n_descent && i < PLUMB_MAX_DESCENT; i++) {
            char key[DEVICE_KEY];
            device_key(b->profile, k, i, key, sizeof key);
            device_input(d, key, note, &sk->descent[i], font);
        }
    }
}
