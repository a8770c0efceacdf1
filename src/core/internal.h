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

/* Copies src into dst of size n, always NUL-terminated; returns dst. */
char *plumbp_strlcpy(char *dst, const char *src, size_t n);

/* Levenshtein distance of two strings of at most 63 characters, 99 for
 * longer ones (suggest.c, the distance of plumb_suggest_closest); for a
 * did-you-mean scored its own way (criteria ids, units). Can't fail. */
int plumbp_edit_distance(const char *a, const char *b);

/* The ends a warning gets when it does not fit (plumbp_warning_add). */
#define PLUMBP_WARNING_CUT " [warning cut short here: longer than plumb keeps; a defect, please report it]"
#define PLUMBP_WARNINGS_LEFT_OUT "Further warnings were left out: more than plumb keeps; a defect, please report it."

/* Appends a warning sentence to a list of `max` slots of `slot_size`
 * bytes each (slots[0..*n) in use) and counts it in *n. Never silent: a
 * sentence longer than its slot ends in PLUMBP_WARNING_CUT, cut at a
 * character boundary; one more than the list holds makes the last slot
 * PLUMBP_WARNINGS_LEFT_OUT. The slots are sized for the longest sentence
 * the library writes, so neither happens (tests/test_report.c). Can't fail. */
void plumbp_warning_add(char *slots, size_t slot_size, size_t max, size_t *n, const char *fmt, ...)
    PLUMBP_PRINTF(5, 6);
void plumbp_warning_vadd(char *slots, size_t slot_size, size_t max, size_t *n, const char *fmt,
                         va_list ap);

/* True when x is neither NaN nor infinite. */
int plumbp_finite(double x);

#endif /* PLUMB_INTERNAL_H */
