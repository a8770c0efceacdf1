/*
 * internal.h - helpers shared inside libplumb (plumbp_ prefix). Not installed.
 */
#ifndef PLUMB_INTERNAL_H
#define PLUMB_INTERNAL_H

#include <stdarg.h>
#include <stddef.h>
#include "plumb/error.h"

#if defined(__GNUC__)
#define PLUMBP_PRINTF(f, a) __attribute__((format(printf, f, a)))
#else
#define PLUMBP_PRINTF(f, a)
#endif

/* Every error the library raises goes through this one function: a
 * breakpoint on plumbp_raise catches all of them. Fills diag (when not
 * NULL) and returns status. file may be NULL, line/col 0, key NULL. */
plumb_status plumbp_raise(plumb_diag *diag, plumb_status status, const char *file, int line,
                          int col, const char *key, const char *fmt, ...) PLUMBP_PRINTF(7, 8);

plumb_status plumbp_vraise(plumb_diag *diag, plumb_status status, const char *file, int line,
                           int col, const char *key, const char *fmt, va_list ap);

/* Raise with no location: PLUMB_RAISE(diag, PLUMB_EINVAL, "mass must be > 0, found %g", m) */
#define PLUMB_RAISE(diag, status, ...) plumbp_raise((diag), (status), NULL, 0, 0, NULL, __VA_ARGS__)

/* Raise with a key: PLUMB_RAISE_KEY(diag, PLUMB_ERANGE, "payload.mass", "...") */
#define PLUMB_RAISE_KEY(diag, status, key, ...) \
    plumbp_raise((diag), (status), NULL, 0, 0, (key), __VA_ARGS__)

/* Raise at a location: PLUMB_RAISE_AT(diag, status, file, line, col, key, fmt, ...) */
#define PLUMB_RAISE_AT(diag, status, file, line, col, key, ...) \
    plumbp_raise((diag), (status), (file), (line), (col), (key), __VA_ARGS__)

/* The plural ending of a count's noun: "" for one, "s" otherwise ("1
 * step", "41 steps"), for every message and report. Can't fail. */
static inline const char *plumbp_s(size_t n)
{
    return n == 1 ? "" : "s";
}

/* Copies src into dst of size n, always NUL-terminated; returns dst. */
char *plumbp_strlcpy(char *dst, const char *src, size_t n);

/* Levenshtein distance of two strings of at most 63 characters, 99 for
 * longer ones (suggest.c, the distance of plumb_suggest_closest); for a
 * did-you-mean scored its own way (criteria ids, units). Can't fail. */
int plumbp_edit_distance(const char *a, const char *b);

/* 1 when a word d edits away from a candidate, the longer of the two
 * `longer` characters, is near enough to suggest: the rule of
 * plumb_suggest_closest (plumb/suggest.h), for a distance scored another
 * way (criteria ids). Can't fail. */
int plumbp_suggest_near(int d, size_t longer);

/* A quantity in a warning sentence: the sentence is made below the report
 * layer, which alone knows the display units (--units si|us), so a figure
 * with a unit is kept as a mark, its kind and its SI value, and the report
 * writers put it in the chosen units with the one formatter they share
 * (src/report/format.c, plumbp_t_warning; plumb_report_warning for
 * programs). A mark is PLUMBP_QTY_OPEN, a kind letter, the value as "%.9g"
 * and PLUMBP_QTY_CLOSE. Each macro below is one printf conversion taking a
 * double in the SI unit named; the letters are read by plumbp_t_warning.
 * (The literals are split so that a hex escape never takes the letter.) */
#define PLUMBP_QTY_OPEN '\x02'
#define PLUMBP_QTY_CLOSE '\x03'
#define PLUMBP_Q_LENGTH "\x02" "L%.9g" "\x03"  /* m: m, or ft */
#define PLUMBP_Q_SMALL "\x02" "l%.9g" "\x03"   /* m: mm, or in */
#define PLUMBP_Q_SPEED "\x02" "S%.9g" "\x03"   /* m/s of an object: m/s, or ft/s */
#define PLUMBP_Q_AIR "\x02" "W%.9g" "\x03"     /* m/s of air (wind, gust, wake): m/s, or mph */
#define PLUMBP_Q_FORCE "\x02" "F%.9g" "\x03"   /* N: N, or lbf */
#define PLUMBP_Q_AREA "\x02" "A%.9g" "\x03"    /* m^2: m², or ft² */
#define PLUMBP_Q_ANGLE "\x02" "D%.9g" "\x03"   /* deg: ° in both */

/* The ends a warning gets when it does not fit (plumbp_warning_add). */
#define PLUMBP_WARNING_CUT " [warning cut short here: longer than plumb keeps; a defect, please report it]"
#define PLUMBP_WARNINGS_LEFT_OUT "Further warnings were left out: more than plumb keeps; a defect, please report it."

/* Appends a warning sentence to a list of `max` slots of `slot_size`
 * bytes each (slots[0..*n) in use) and counts it in *n. Never silent: a
 * sentence longer than its slot ends in PLUMBP_WARNING_CUT, cut at a
 * character boundary and never inside a quantity's mark; one more than
 * the list holds makes the last slot PLUMBP_WARNINGS_LEFT_OUT. The slots
 * are sized for the longest sentence the library writes, so neither
 * happens (tests/test_report.c). Can't fail. */
void plumbp_warning_add(char *slots, size_t slot_size, size_t max, size_t *n, const char *fmt, ...)
    PLUMBP_PRINTF(5, 6);
void plumbp_warning_vadd(char *slots, size_t slot_size, size_t max, size_t *n, const char *fmt,
                         va_list ap);

/* True when x is neither NaN nor infinite. */
int plumbp_finite(double x);

/* sin and cos of an angle in degrees, reduced to +-45 deg around the
 * nearest multiple of 90 deg first, so that the cardinal directions are
 * exact (a heading of 90 deg has a north component of 0, not 6e-17).
 * NaN for a value that is not finite. Can't fail (core/geodesy.c). */
void plumbp_sincos_deg(double deg, double *s, double *c);

#endif /* PLUMB_INTERNAL_H */
