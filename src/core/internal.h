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

/* True when x is neither NaN nor infinite. */
int plumbp_finite(double x);

#endif /* PLUMB_INTERNAL_H */
