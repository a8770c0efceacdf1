/*
 * plumb_test.c - shared test support (see plumb_test.h).
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <cmocka.h>
#include <gsl/gsl_errno.h>

#include "plumb/plumb.h"
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

int plumbt_setup_units_criteria(void **state)
{
    plumbt_setup_gsl(state);
    plumbt_fixture *f = calloc(1, sizeof *f);
    plumb_diag d;
    char dir[1024];
    snprintf(dir, sizeof dir, "%s/profiles/criteria", plumbt_srcdir());
    if (!f || plumb_units_alloc(&f->units, &d) != PLUMB_OK ||
        plumb_criteria_load_dir(dir, f->units, &f->criteria, &d) != PLUMB_OK) {
        if (f)
            plumb_units_free(f->units);
        free(f);
        return -1;
    }
    *state = f;
    return 0;
}

int plumbt_teardown_units_criteria(void **state)
{
    plumbt_fixture *f = *state;
    plumb_criteria_free(f->criteria);
    plumb_units_free(f->units);
    free(f);
    return 0;
}

const char *plumbt_srcdir(void)
{
    const char *d = getenv("PLUMB_SRCDIR");
    return d && *d ? d : ".";
}

char *plumbt_mkdtemp(const char *stem, char *buf, size_t size)
{
    const char *dir = getenv("TMPDIR");
    int n = snprintf(buf, size, "%s/plumb-%s-XXXXXX", dir && *dir ? dir : "/tmp", stem);
    if (n < 0 || (size_t)n >= size)
        return NULL;
    return mkdtemp(buf);
}

static const double const_alt_m[2] = {-1000.0, 30000.0};
static const double const_t_k[2] = {293.15, 293.15};

plumb_atmosphere *plumbt_constant_air(void)
{
    return plumbt_constant_air_rho(PLUMBT_CONST_RHO);
}

plumb_atmosphere *plumbt_constant_air_rho(double rho_kg_m3)
{
    const double const_rho[2] = {rho_kg_m3, rho_kg_m3};
    plumb_atm_spec a;
    plumb_atm_spec_init(&a);
    a.model = PLUMB_ATM_TABLE;
    a.table_n = 2;
    a.table_alt_m = const_alt_m;
    a.table_rho_kg_m3 = const_rho;
    a.table_t_k = const_t_k;
    plumb_atmosphere *atm = NULL;
    plumb_diag d;
    assert_int_equal(plumb_atmosphere_alloc(&a, &atm, &d), PLUMB_OK);
    return atm;
}

plumb_atmosphere *plumbt_std_air(double dt_k)
{
    plumb_atm_spec a;
    plumb_atm_spec_init(&a);
    a.temperature_offset_k = dt_k;
    plumb_atmosphere *atm = NULL;
    plumb_diag d;
    assert_int_equal(plumb_atmosphere_alloc(&a, &atm, &d), PLUMB_OK);
    return atm;
}
