/*
 * plumb/sheet.h - the printable safety sheet (`plumb sheet`): one PDF of
 * one or more briefs (plumb/brief.h), drawn with cairo, its text laid out
 * by pango in DejaVu Sans (embedded), vector throughout.
 *
 * The sheet is in its own archive, libplumb-sheet.a (src/report/sheet*.c),
 * so that libplumb and its shared object do not depend on cairo or pango:
 * link -lplumb-sheet -lplumb and `pkg-config --libs cairo pangocairo`.
 *
 * Each brief gives, in this order: 1 the header (job, date and time of
 * the calculation, prepared and checked by, version, the SHA-256 of the
 * profile and of every criteria file, the seed), 2 the answer (with the
 * zone's spread beside the planned fall: energy percentiles, the share of
 * samples above each limit, the zone's warnings and uncertain inputs; and
 * what the fall made of each descent device), 3 a side view of the fall, 4
 * impact energy against drop height with each criterion's limit (named
 * beside its line, or numbered there and named in a key below), 5 the
 * plan view of the clearance zone, 6 for an inventory the table of items
 * worst first (and each item's descent devices), 7 the inputs as
 * understood (each descent device keyed as the profile writes it) and the
 * model's assumptions, 8 the cautions in full. Every page has a
 * footer: the short caution and the deference to local codes and
 * competent or licensed practice, "page n of m" and the profile's SHA-256.
 * Nothing relies on colour: lines differ by weight and dash, and every
 * line is named in words.
 */
#ifndef PLUMB_SHEET_H
#define PLUMB_SHEET_H

#include <stdio.h>
#include "plumb/error.h"
#include "plumb/report.h"
#include "plumb/brief.h"

typedef enum plumb_paper { PLUMB_PAPER_A4 = 0, PLUMB_PAPER_LETTER } plumb_paper;

typedef struct plumb_sheet_options {
    plumb_paper paper;           /* A4 (210 x 297 mm) or US letter (8.5 x 11 in) */
    plumb_unit_system units;     /* the unit system shown first; the answer gives both */
    const char *version;         /* program version for the header, may be NULL */
    long long time_utc;          /* when the calculation was made, s since 1970 UTC */
    int utc_offset_s;            /* the local offset from UTC at that time, s */
} plumb_sheet_options;

/* Defaults: A4, SI, this library's version, the calculation made at
 * time_utc (s since 1970 UTC), and the local time zone's offset from UTC
 * then (localtime_r, so TZ decides). Can't fail. */
void plumb_sheet_options_init(plumb_sheet_options *opt, long long time_utc);

/* Writes the sheet of n briefs (n >= 1) as one PDF to out. The PDF's
 * creation date is time_utc, so the same inputs and time give the same
 * bytes. PLUMB_ENUMERIC if a figure is not finite; PLUMB_EWRITE when the
 * font cannot be found or the PDF cannot be made or written. Nothing is
 * written to out on an error. */
plumb_status plumb_sheet_write(FILE *out, const plumb_sheet_options *opt,
                               const plumb_brief *const *briefs, size_t n, plumb_diag *diag);

#endif /* PLUMB_SHEET_H */
