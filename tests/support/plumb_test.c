/*
 * plumb_test.c - shared test support (see plumb_test.h).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdlib.h>
#include <cmocka.h>
#include <gsl/gsl_errno.h>

#include "plumb_test.h"

void plumbt_assert_rel(double got, double want, double rel, const char *expr,
                       const char *file, int line)
{
    double err = fabs(got - want);
    double lim = want == 0.0 ? rel : rel * fabs(want);
    if (!(err <= lim)) {
        double r = want == 0.0 ? err : err / fabs(want);
        print_error("%s = %.17g, expected %.17g (relative error %.3g > %.3g)\n", expr, got, want,
                    r, rel);
        _fail(file, line);
    }
}

void plumbt_assert_abs(double got, double want, double tol, const char *expr,
                       const char *file, int line)
{
    double err = fabs(got - want);
    if (!(err <= tol)) {
        print_error("%s = %.17g, expected %.17g (error %.3g > %.3g)\n", expr, got, want, err,
                    tol);
        _fail(file, line);
    }
}

int plumbt_setup_gsl(void **state)
{
    (void)state;
    gsl_set_error_handler_off();
    return 0;
}

const char *plumbt_srcdir(void)
{
    const char *d = getenv("PLUMB_SRCDIR");
    return d && *d ? d : ".";
}
