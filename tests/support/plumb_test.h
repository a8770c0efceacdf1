/*
 * plumb_test.h - shared test support: double asserts for cmocka (cmocka
 * 1.1.5's float assert casts to float) and common setup.
 *
 * Include after <stdarg.h>, <stddef.h>, <setjmp.h>, <stdint.h>, <cmocka.h>.
 */
#ifndef PLUMB_TEST_H
#define PLUMB_TEST_H

/* Fails unless |got - want| <= rel * |want| (or |got - want| <= rel when
 * want is 0). Prints both values to 17 digits. */
#define assert_rel(got, want, rel) \
    plumbt_assert_rel((got), (want), (rel), #got, __FILE__, __LINE__)
/* Fails unless |got - want| <= tol. */
#define assert_abs(got, want, tol) \
    plumbt_assert_abs((got), (want), (tol), #got, __FILE__, __LINE__)

void plumbt_assert_rel(double got, double want, double rel, const char *expr,
                       const char *file, int line);
void plumbt_assert_abs(double got, double want, double tol, const char *expr,
                       const char *file, int line);

/* Turns GSL's abort-on-error handler off; call in every test's group setup. */
int plumbt_setup_gsl(void **state);

/* Density of the constant air of plumbt_constant_air, kg/m^3. */
#define PLUMBT_CONST_RHO 1.2041

/* Constant air: a density table with equal rows (PLUMBT_CONST_RHO) and a
 * temperature column (293.15 K) from -1 km to 30 km, so rho is the same at
 * every altitude (linear in ln rho) and the closed forms of a fall in
 * constant air apply. Fails the test when it cannot be made. */
struct plumb_atmosphere *plumbt_constant_air(void);

/* The same at another density, kg/m^3. */
struct plumb_atmosphere *plumbt_constant_air_rho(double rho_kg_m3);

/* The U.S. Standard Atmosphere 1976 with a temperature offset dt_k. */
struct plumb_atmosphere *plumbt_std_air(double dt_k);

/* The units and the bundled criteria, for a group of tests that open
 * studies: plumbt_setup_units_criteria puts a plumbt_fixture in *state (it
 * also calls plumbt_setup_gsl); plumbt_teardown_units_criteria frees it. */
typedef struct plumbt_fixture {
    struct plumb_units *units;
    struct plumb_criteria *criteria;
} plumbt_fixture;
int plumbt_setup_units_criteria(void **state);
int plumbt_teardown_units_criteria(void **state);

/* Root of the source tree (where profiles/ lives): $PLUMB_SRCDIR or ".". */
const char *plumbt_srcdir(void);

/* Makes a new directory $TMPDIR/plumb-STEM-XXXXXX ($TMPDIR unset or empty:
 * /tmp) and writes its path into buf. Returns buf, or NULL when the path
 * does not fit or mkdtemp fails. The caller removes the directory. */
char *plumbt_mkdtemp(const char *stem, char *buf, size_t size);

#endif /* PLUMB_TEST_H */
