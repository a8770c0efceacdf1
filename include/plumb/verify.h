/*
 * plumb/verify.h - published reference checks of the built library
 * (`plumb verify`): each computes one figure through the library's own
 * code and compares it with a published value or a closed-form solution,
 * within the last digit the source gives. A build whose checks fail is not
 * one to trust (a compiler or library fault, a broken port).
 *
 * The values and their sources: U.S. Standard Atmosphere 1976
 * (NOAA-S/T 76-1562, Table I and Table 2, transcribed), WGS 84 normal
 * gravity (NIMA TR8350.2, eq. 4-1, transcribed), Morrison's sphere drag
 * (F. A. Morrison, "Data Correlation for Drag Coefficient for Sphere",
 * Michigan Technological University, 2010, eq. (1), the correlation
 * plumb uses: physics/drag.c; transcribed), the closed forms of a fall in constant air (v_t =
 * sqrt(2 m g / (rho Cd A)), v(y) = v_t sqrt(1 - exp(-2 g y / v_t^2)), and
 * without drag v = sqrt(2 g h), t = sqrt(2 h / g)), and Pflanz's
 * force-reduction factor X_1 from its closed form (Knacke, NWC TP 6575,
 * 1991; the closed form derived from Pflanz's assumptions).
 */
#ifndef PLUMB_VERIFY_H
#define PLUMB_VERIFY_H

#include <stddef.h>
#include "plumb/error.h"

enum { PLUMB_CHECK_TEXT = 160, PLUMB_VERIFY_MAX = 32 };

/* One check: what was computed against what was published. */
typedef struct plumb_check {
    char name[PLUMB_CHECK_TEXT];   /* what is checked, with its conditions */
    char source[PLUMB_CHECK_TEXT]; /* the published source */
    const char *status;            /* "transcribed", "closed form" or "computed" (static) */
    const char *unit;              /* SI unit of the figures, "" for none (static) */
    double published;              /* the published or closed-form value */
    double computed;               /* the library's figure */
    double tolerance;              /* largest |computed - published| that passes: one
                                      unit of the last digit published (the transcribed
                                      tables hold to +-1 there), or the solver's accuracy
                                      for a closed form */
    int passed;                    /* 1: within the tolerance */
} plumb_check;

/* Runs every check into out[0 .. *n) (at most max; PLUMB_VERIFY_MAX
 * holds them all). A check that fails is passed = 0, not an error; an
 * error is a computation that cannot be made (PLUMB_ENOMEM, a fall that
 * fails), with diag saying which. */
plumb_status plumb_verify(plumb_check *out, size_t max, size_t *n, plumb_diag *diag);

#endif /* PLUMB_VERIFY_H */
