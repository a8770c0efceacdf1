/*
 * test_drag.c - drag coefficients and areas against published values.
 *
 * Sources:
 *  - Morrison, "Data Correlation for Drag Coefficient for Sphere" (Michigan
 *    Technological University 2010, eq. 1): Cd(200) = 0.767731559965325
 *    (transcribed).
 *  - Clift, Grace & Weber (1978) Table 5.2: for 4e5 < Re <= 1e6,
 *    Cd = 0.1 log10(Re) - 0.49 (transcribed from several codes that print
 *    the table).
 *  - Gunn & Kinzer, J. Meteorology 6, 243-248 (1949): terminal speeds of
 *    water drops in stagnant air near sea level (test air 1013 hPa, 20 degC,
 *    50 % RH from memory); drops up to 1 mm are close to rigid spheres.
 *  - Cauchy's surface-area formula (Tsukerman & Veomett, arXiv:1604.05815):
 *    the mean projected area of a convex body is its surface area / 4,
 *    checked here by integrating the projected area over all directions.
 *  - Bluff-body Cd by aspect ratio, each row named beside its check with its
 *    status: White, Fluid Mechanics, Table 7.3 after Hoerner, Fluid-Dynamic
 *    Drag (1965) (from memory); Munson et al., Fundamentals of Fluid
 *    Mechanics 6th ed., Fig. 9.20, DNVGL-RP-N103 Table B-2, Aeronautical
 *    Engineer Data Book Fig. 5.13, Hoerner's disc via aerospaceweb.org
 *    (transcribed). Where plumb combines or averages them, the rule is
 *    plumb's own (README) and the expected value is worked by hand from
 *    the published rows.
 */
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>
#include <gsl/gsl_integration.h>

#include "plumb/plumb.h"
#include "core/internal.h"
#include "physics/physics.h"
#include "plumb_test.h"

static void test_morrison_cd_at_re_200_equals_the_published_value(void **state)
{
    (void)state;
    assert_rel(plumb_drag_sphere_morrison(200.0), 0.767731559965325, 1e-14);
}

/* Morrison, "Data Correlation for Drag Coefficient for Sphere" (Michigan
 * Technological University, 2010), eq. (1), the form with Re^0.8/461000,
 * evaluated independently in Python (double precision) from the printed
 * equation: Cd(1e2) 1.038186638787341, Cd(1e4) 0.393564428240075,
 * Cd(1e5) 0.42467662223471664, Cd(1e6) 0.1414557643778477. The later form
 * with 0.25 (Re/1e6)/(1 + Re/1e6) gives 1.0381252789837834,
 * 0.39260172957727624, 0.4257119209923581 and 0.1295886614537276: the
 * checks at 1e4 and 1e6 tell the two apart. */
static void test_morrison_cd_follows_the_2010_handout_at_four_reynolds_numbers(void **state)
{
    (void)state;
    assert_rel(plumb_drag_sphere_morrison(1e2), 1.038186638787341, 1e-13);
    assert_rel(plumb_drag_sphere_morrison(1e4), 0.393564428240075, 1e-13);
    assert_rel(plumb_drag_sphere_morrison(1e5), 0.42467662223471664, 1e-13);
    assert_rel(plumb_drag_sphere_morrison(1e6), 0.1414557643778477, 1e-13);
}

/* Outside the intervals plumbp_drag_crisis names, Cd(Re) Re^2 never
 * decreases, so the drag balance has one root there; the terminal-speed
 * search relies on it. Scanned here at a ratio of 1 + 1e-5 over Re 1e-3 to
 * 1e8 for both curves (a property of the published formulas). */
static void test_cd_re_squared_only_falls_inside_the_named_crisis_intervals(void **state)
{
    (void)state;
    const plumb_drag_model models[] = {PLUMB_DRAG_SPHERE_MORRISON, PLUMB_DRAG_SPHERE_CGW};
    for (size_t k = 0; k < 2; k++) {
        const double (*iv)[2];
        size_t n = plumbp_drag_crisis(models[k], &iv);
        assert_true(n > 0);
        double (*cd)(double) = models[k] == PLUMB_DRAG_SPHERE_CGW ? plumb_drag_sphere_cgw
                                                                  : plumb_drag_sphere_morrison;
        size_t falls_inside = 0;
        double re = 1e-3, prev = cd(re) * re * re;
        while (re < 1e8) {
            double re2 = re * (1.0 + 1e-5), f = cd(re2) * re2 * re2;
            int inside = 0;
            for (size_t i = 0; i < n; i++)
                inside |= re2 >= iv[i][0] && re <= iv[i][1];
            if (f < prev) {
                if (!inside)
                    fail_msg("Cd Re^2 falls at Re %.6g outside the named intervals", re);
                falls_inside++;
            }
            re = re2;
            prev = f;
        }
        assert_true(falls_inside > 0); /* the intervals are not empty claims */
    }
    const double (*iv)[2];
    assert_int_equal(plumbp_drag_crisis(PLUMB_DRAG_FIXED, &iv), 0);
}

static void test_morrison_sits_on_the_subcritical_plateau_near_re_1e5(void **state)
{
    (void)state;
    /* Sphere drag: plateau about 0.4-0.47 near Re = 1e5, crisis 2e5-4e5
     * (from memory; no source recorded for these bands) */
    double cd = plumb_drag_sphere_morrison(1e5);
    assert_true(cd > 0.40 && cd < 0.50);
    assert_true(plumb_drag_sphere_morrison(5e5) < 0.3);
}

static void test_clift_grace_weber_uses_the_corrected_high_re_piece(void **state)
{
    (void)state;
    const double re[] = {4.1e5, 6.0e5, 9.9e5};
    for (size_t i = 0; i < 3; i++)
        assert_rel(plumb_drag_sphere_cgw(re[i]), 0.1 * log10(re[i]) - 0.49, 1e-14);
    /* Stokes limit: Cd -> 24/Re (+3/16 Oseen) at Re <= 0.01 */
    assert_rel(plumb_drag_sphere_cgw(0.005), 3.0 / 16.0 + 24.0 / 0.005, 1e-14);
    /* the two curves agree to about 10% on the plateau */
    assert_rel(plumb_drag_sphere_cgw(1e4), plumb_drag_sphere_morrison(1e4), 0.1);
}

/* ---- Cauchy: integrate projected area over directions ---- */

typedef struct { double a, b, c; } box_dims;

/* Box with edges a, b, c: projected area along n = bc|nx| + ac|ny| + ab|nz|.
 * The mean over directions of |n_i| is 1/2; integrate |cos theta| sin theta
 * / 2 over theta numerically to keep the check independent. */
static double abs_cos_weight(double th, void *p)
{
    (void)p;
    return fabs(cos(th)) * sin(th) / 2.0;
}

static double cyl_projection(double th, void *p)
{
    const double *rl = p; /* r, L */
    double proj = PLUMB_PI * rl[0] * rl[0] * fabs(cos(th)) + 2.0 * rl[0] * rl[1] * sin(th);
    return proj * sin(th) / 2.0;
}

static double integrate(double (*f)(double, void *), void *p)
{
    gsl_integration_workspace *w = gsl_integration_workspace_alloc(200);
    gsl_function F = {f, p};
    double r = 0.0, err = 0.0;
    assert_int_equal(gsl_integration_qags(&F, 0.0, PLUMB_PI, 0.0, 1e-13, 200, w, &r, &err), 0);
    gsl_integration_workspace_free(w);
    return r;
}

static void test_cauchy_mean_projected_area_is_exact_for_sphere_cube_cylinder(void **state)
{
    (void)state;
    plumb_shape_spec s = {PLUMB_SHAPE_SPHERE, {0.0731, 0, 0}, PLUMB_ATTITUDE_TUMBLING};
    assert_rel(plumb_shape_mean_projected_area(&s), PLUMB_PI * 0.0731 * 0.0731 / 4.0, 1e-15);

    double mean_abs_cos = integrate(abs_cos_weight, NULL);
    assert_rel(mean_abs_cos, 0.5, 1e-12);
    double a = 0.137;
    s = (plumb_shape_spec){PLUMB_SHAPE_BOX, {a, a, a}, PLUMB_ATTITUDE_TUMBLING};
    assert_rel(plumb_shape_mean_projected_area(&s), 3.0 * a * a * mean_abs_cos, 1e-12);
    assert_rel(plumb_shape_mean_projected_area(&s), 1.5 * a * a, 1e-15);

    double rl[2] = {0.0175, 0.61};
    s = (plumb_shape_spec){PLUMB_SHAPE_CYLINDER, {rl[1], 2.0 * rl[0], 0}, PLUMB_ATTITUDE_TUMBLING};
    assert_rel(plumb_shape_mean_projected_area(&s), integrate(cyl_projection, rl), 1e-12);

    box_dims b = {0.31, 0.17, 0.083};
    s = (plumb_shape_spec){PLUMB_SHAPE_BOX, {b.a, b.b, b.c}, PLUMB_ATTITUDE_TUMBLING};
    assert_rel(plumb_shape_mean_projected_area(&s),
               (b.b * b.c + b.a * b.c + b.a * b.b) * mean_abs_cos, 1e-12);
}

/* ---- shapes: published bluff-body tables by aspect ratio ---- */

/* The drag of a shape, checked to have been found. */
static plumb_drag_spec shape_drag(plumb_shape_kind kind, double d0, double d1, double d2,
                                  plumb_attitude att)
{
    plumb_shape_spec s = {kind, {d0, d1, d2}, att};
    plumb_drag_spec d;
    assert_int_equal(plumb_drag_from_shape(&s, &d), PLUMB_OK);
    assert_true(strlen(d.source) < PLUMB_DRAG_SOURCE - 1); /* not cut short */
    return d;
}

/* Thin rectangular plate normal to the flow, Cd by b/h: F. M. White, Fluid
 * Mechanics, Table 7.3 (3-D bodies, Re >= 1e4), after Hoerner, Fluid-Dynamic
 * Drag (1965): 1 -> 1.18, 5 -> 1.2, 10 -> 1.3, 20 -> 1.5 (from memory);
 * infinity -> 2.0 (White Table 7.2, 2-D thin plate, transcribed in a Python
 * library; 1.98 "long flat plate", Aeronautical Engineer Data Book Fig.
 * 5.13, transcribed). A plate 1e-9 m thick is the thin plate to 1e-9. */
static void test_rectangular_plate_cd_follows_the_published_rows_by_b_over_h(void **state)
{
    (void)state;
    const double bh[] = {1.0, 5.0, 10.0, 20.0};
    const double cd[] = {1.18, 1.20, 1.30, 1.50}; /* White Table 7.3, from memory */
    for (size_t i = 0; i < 4; i++) {
        plumb_drag_spec d = shape_drag(PLUMB_SHAPE_PLATE, 0.1 * bh[i], 0.1, 1e-9,
                                       PLUMB_ATTITUDE_BROADSIDE);
        assert_rel(d.cd, cd[i], 1e-7);
        assert_rel(d.area_m2, 0.01 * bh[i], 1e-14);
        assert_int_equal(d.extrapolated, 0);
        assert_non_null(strstr(d.source, "White, Fluid Mechanics, Table 7.3"));
        assert_non_null(strstr(d.source, "from memory"));
    }
    /* cross-checks of the square plate, transcribed: 1.17 (Aeronautical
     * Engineer Data Book Fig. 5.13) and 1.16 (DNVGL-RP-N103 Table B-2) */
    plumb_drag_spec sq = shape_drag(PLUMB_SHAPE_PLATE, 0.3, 0.3, 1e-9, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(sq.cd, 1.17, 0.01);
    assert_rel(sq.cd, 1.16, 0.02);
    /* b/h 5: DNVGL-RP-N103 Table B-2 gives 1.20 too (transcribed) */
    plumb_drag_spec five = shape_drag(PLUMB_SHAPE_PLATE, 0.5, 0.1, 1e-9, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(five.cd, 1.20, 1e-7);
    /* a very long plate reaches the 2-D plate, 2.0 (transcribed), and lies
     * within 1 % of the Data Book's 1.98 */
    plumb_drag_spec lng = shape_drag(PLUMB_SHAPE_PLATE, 1e5, 0.1, 1e-9, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(lng.cd, 2.0, 1e-5);
    assert_rel(lng.cd, 1.98, 0.011);
    assert_non_null(strstr(lng.source, "Table 7.2"));
    assert_non_null(strstr(lng.source, "transcribed"));
}

/* Between rows, linear in b/h (evaluated by hand from White's rows);
 * between 20 and infinity, linear in h/b (plumb's rule, README): b/h 40 is
 * half way from 1/20 to 0, so 1.5 + 0.5 (2.0 - 1.5). */
static void test_plate_cd_between_rows_is_interpolated(void **state)
{
    (void)state;
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_PLATE, 0.75, 0.1, 1e-9, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(d.cd, 1.25, 1e-7); /* b/h 7.5: half way from 1.2 to 1.3 */
    assert_non_null(strstr(d.source, "between 5 [W] and 10 [W]"));
    d = shape_drag(PLUMB_SHAPE_PLATE, 0.1, 0.3, 1e-9, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(d.cd, 1.18 + 0.5 * 0.02, 1e-7); /* b/h 3, edges in either order */
    d = shape_drag(PLUMB_SHAPE_PLATE, 4.0, 0.1, 1e-9, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(d.cd, 1.75, 1e-7);
    assert_int_equal(d.extrapolated, 0);
}

/* The strip: 1 m x 0.05 m, 2 mm thick, broadside. b/h 20: handbooks
 * give about 1.5 (White Table 7.3, from memory); before, plumb gave the
 * square plate's 1.17. */
static void test_a_long_strip_broadside_gets_about_1_5_not_the_square_plate_value(void **state)
{
    (void)state;
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_PLATE, 1.0, 0.05, 0.002, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(d.cd, 1.5, 0.01);
    assert_true(d.cd > 1.4);
    assert_rel(d.area_m2, 0.05, 1e-14);
    assert_non_null(strstr(d.source, "b/h 20"));
}

/* Square prism along the flow (a square bar end-on), Cd on its end by L/D:
 * L/D 1 the cube face-on, 1.05 (Munson et al., Fundamentals of Fluid
 * Mechanics, 6th ed., Fig. 9.20, transcribed; Palmer, Table 5-3, Re 1e5,
 * transcribed, no fuller citation of Palmer recorded); 1.5 -> 0.97,
 * 2 -> 0.87, 2.5 -> 0.90, 3 -> 0.93, 4 -> 0.95, 5 -> 0.95 (DNVGL-RP-N103
 * Table B-2, transcribed from a public copy). The face is square, so the plate factor is 1. */
static void test_square_bar_end_on_cd_follows_the_published_prism_rows(void **state)
{
    (void)state;
    const double ld[] = {1.0, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0};
    const double cd[] = {1.05, 0.97, 0.87, 0.90, 0.93, 0.95, 0.95};
    for (size_t i = 0; i < 7; i++) {
        plumb_drag_spec d = shape_drag(PLUMB_SHAPE_BOX, 0.1, 0.1 * ld[i], 0.1,
                                       PLUMB_ATTITUDE_END_ON);
        assert_rel(d.cd, cd[i], 1e-14);
        assert_rel(d.area_m2, 0.01, 1e-14);
        assert_int_equal(d.extrapolated, 0);
        assert_non_null(strstr(d.source, i == 0 ? "Munson" : "DNVGL-RP-N103"));
    }
    /* the square bar, L/D 4: not the cube's 1.05 any more, and
     * within 10 % of a cylinder end-on at the same L/D (0.87, Data Book) */
    plumb_drag_spec bar = shape_drag(PLUMB_SHAPE_BOX, 0.4, 0.1, 0.1, PLUMB_ATTITUDE_END_ON);
    assert_rel(bar.cd, 0.87, 0.1);
    /* L/D 3.5: half way from 0.93 to 0.95 */
    plumb_drag_spec mid = shape_drag(PLUMB_SHAPE_BOX, 0.35, 0.1, 0.1, PLUMB_ATTITUDE_END_ON);
    assert_rel(mid.cd, 0.94, 1e-14);
    assert_non_null(strstr(mid.source, "between 3 [D] and 4 [D]"));
    /* L/D 0.5 (a thick square tile face-on): half way from the square plate
     * 1.18 (White, from memory) to the cube 1.05 (Munson, transcribed) */
    plumb_drag_spec tile = shape_drag(PLUMB_SHAPE_BOX, 0.2, 0.2, 0.1, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(tile.cd, 1.115, 1e-14);
}

/* A bar longer than the prism table (L/D 5) is held at its end, 0.95, and
 * says so (the report then warns). */
static void test_a_bar_beyond_the_prism_table_is_held_and_flagged(void **state)
{
    (void)state;
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_BOX, 0.8, 0.1, 0.1, PLUMB_ATTITUDE_END_ON);
    assert_rel(d.cd, 0.95, 1e-14);
    assert_int_equal(d.extrapolated, 1);
    assert_non_null(strstr(d.source, "held at 5 [D]: outside the table"));
    /* broadside the same bar is a plate of b/h 8 and depth 0.1/sqrt(0.08):
     * inside both tables, no flag. Plate: 1.2 + 0.6 (1.3 - 1.2) = 1.26
     * (White); prism at L/D 0.35355: 1.18 - 0.35355 (1.18 - 1.05); plumb's
     * combination Cd_plate Cd_prism / 1.18. */
    plumb_drag_spec b = shape_drag(PLUMB_SHAPE_BOX, 0.8, 0.1, 0.1, PLUMB_ATTITUDE_BROADSIDE);
    double prism = 1.18 - sqrt(0.125) * 0.13;
    assert_rel(b.cd, 1.26 * prism / 1.18, 1e-13);
    assert_int_equal(b.extrapolated, 0);
}

/* Circular cylinder end-on, Cd on pi D^2/4 by L/D: the disc, L/D 0, 1.17
 * (Hoerner 1965 via aerospaceweb.org, transcribed; Munson's thin disc 1.1,
 * transcribed, within 7 %); L/D 0.5 1.15 (White Table 7.3, from memory;
 * Munson Fig. 9.20 gives 1.1, transcribed, within 5 %); L/D 1 0.91, 2 0.85,
 * 4 0.87, 7 0.99 (Aeronautical Engineer Data Book Fig. 5.13, transcribed). */
static void test_cylinder_end_on_cd_runs_from_the_disc_to_the_data_book_rows(void **state)
{
    (void)state;
    const double ld[] = {0.5, 1.0, 2.0, 4.0, 7.0};
    const double cd[] = {1.15, 0.91, 0.85, 0.87, 0.99};
    for (size_t i = 0; i < 5; i++) {
        plumb_drag_spec d = shape_drag(PLUMB_SHAPE_CYLINDER, 0.1 * ld[i], 0.1, 0,
                                       PLUMB_ATTITUDE_END_ON);
        assert_rel(d.cd, cd[i], 1e-14);
        assert_rel(d.area_m2, PLUMB_PI * 0.01 / 4.0, 1e-15);
        assert_int_equal(d.extrapolated, 0);
    }
    plumb_drag_spec disc = shape_drag(PLUMB_SHAPE_CYLINDER, 1e-9, 0.1, 0, PLUMB_ATTITUDE_END_ON);
    assert_rel(disc.cd, 1.17, 1e-7);
    assert_rel(disc.cd, 1.1, 0.07);
    assert_non_null(strstr(disc.source, "aerospaceweb.org: transcribed"));
    plumb_drag_spec half = shape_drag(PLUMB_SHAPE_CYLINDER, 0.05, 0.1, 0, PLUMB_ATTITUDE_END_ON);
    assert_rel(half.cd, 1.1, 0.05);
}

/* The short cylinder, L/D 0.2 end-on: about 1.15 from the table
 * (1.17 + 0.4 (1.15 - 1.17) = 1.162), no longer held at 0.91 with a
 * warning. */
static void test_a_short_cylinder_end_on_is_read_from_the_table_not_held(void **state)
{
    (void)state;
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_CYLINDER, 0.02, 0.1, 0, PLUMB_ATTITUDE_END_ON);
    assert_rel(d.cd, 1.162, 1e-14);
    assert_rel(d.cd, 1.15, 0.02);
    assert_int_equal(d.extrapolated, 0);
    assert_non_null(strstr(d.source, "between 0 [H] and 0.5 [W]"));
    /* past the last row, L/D 7, the end value is held and flagged */
    d = shape_drag(PLUMB_SHAPE_CYLINDER, 1.2, 0.1, 0, PLUMB_ATTITUDE_END_ON);
    assert_rel(d.cd, 0.99, 1e-15);
    assert_int_equal(d.extrapolated, 1);
    assert_non_null(strstr(d.source, "outside the table"));
}

/* Circular cylinder broadside, Cd on L x D: 1 0.63, 2 0.68, 5 0.74, 10 0.82,
 * 40 0.98, infinity 1.20 (Aeronautical Engineer Data Book Fig. 5.13,
 * transcribed); L/D 7.5 half way from 5 to 10; L/D 80 half way from 1/40 to
 * 0 (plumb's rule towards an infinite row): 0.98 + 0.5 (1.20 - 0.98). */
static void test_cylinder_broadside_cd_follows_the_data_book_rows(void **state)
{
    (void)state;
    const double ld[] = {1.0, 2.0, 5.0, 10.0, 40.0};
    const double cd[] = {0.63, 0.68, 0.74, 0.82, 0.98};
    for (size_t i = 0; i < 5; i++) {
        plumb_drag_spec d = shape_drag(PLUMB_SHAPE_CYLINDER, 0.1 * ld[i], 0.1, 0,
                                       PLUMB_ATTITUDE_BROADSIDE);
        assert_rel(d.cd, cd[i], 1e-14);
        assert_rel(d.area_m2, 0.01 * ld[i], 1e-14);
        assert_non_null(strstr(d.source, "Aeronautical Engineer Data Book, Fig. 5.13: "
                                         "transcribed"));
    }
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_CYLINDER, 0.75, 0.1, 0, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(d.cd, 0.78, 1e-14);
    d = shape_drag(PLUMB_SHAPE_CYLINDER, 8.0, 0.1, 0, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(d.cd, 1.09, 1e-14);
    assert_int_equal(d.extrapolated, 0);
    /* shorter than the table (L/D 1): held, flagged */
    d = shape_drag(PLUMB_SHAPE_CYLINDER, 0.05, 0.1, 0, PLUMB_ATTITUDE_BROADSIDE);
    assert_rel(d.cd, 0.63, 1e-15);
    assert_int_equal(d.extrapolated, 1);
}

/* A tumbling cube averages the orientations the source tabulates: face-on
 * 1.05 and edge-on 0.80, both on the face area D^2 (Munson et al. Fig.
 * 9.20, transcribed; White gives 1.07 and 0.81, from memory). Frontal
 * areas D^2 face-on and sqrt(2) D^2 edge-on (geometry), three of each.
 * plumb's averaging (its own, no published tumbling Cd; README): Cd =
 * sum(Cd A) / sum(A) on Cauchy's 1.5 D^2. Without the edge-on value the
 * cube would get 1.05. */
static void test_a_tumbling_cube_uses_the_edge_on_value(void **state)
{
    (void)state;
    double a = 0.2;
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_BOX, a, a, a, PLUMB_ATTITUDE_TUMBLING);
    double want = (3.0 * 1.05 + 3.0 * 0.80) / (3.0 + 3.0 * sqrt(2.0));
    assert_rel(d.cd, want, 1e-13);
    assert_rel(d.area_m2, 1.5 * a * a, 1e-14);
    assert_rel(d.cd_area_m2, want * 1.5 * a * a, 1e-13);
    assert_true(d.cd < 1.0);
    assert_int_equal(d.extrapolated, 0);
    assert_non_null(strstr(d.source, "edge-on"));
    assert_non_null(strstr(d.source, "0.80/1.05 [M]"));
    assert_non_null(strstr(d.source, "plumb's own averaging; no published tumbling Cd"));
    assert_non_null(strstr(d.source, "Cauchy"));
}

/* A 2 x 1 x 1 bar tumbling, by hand from the published rows and plumb's
 * stated rule (README: Cd_face = Cd_plate(b/h) Cd_prism(depth/sqrt(face))
 * / 1.18; edge-on about edge k: (0.80/1.05) x the mean face-on CdA of the
 * two faces along the other edges, on d_k (d_p + d_q)/sqrt(2), weighted by
 * min/max of d_p, d_q; Cd = sum(w Cd A)/sum(w A)).
 *  - flow along the 2 m edge: 1 x 1 face, L/D 2: 0.87 (DNV), A = 1
 *  - along a 1 m edge (twice): 2 x 1 face, b/h 2: 1.185 (White), L/D
 *    1/sqrt(2): 1.18 - 0.70711 x 0.13 (White, Munson); A = 2
 *  - edge-on about the 2 m edge: section 1 x 1, w 1, CdA = r x mean of the
 *    two 2 x 1 faces, A = 2 x 2/sqrt(2)
 *  - edge-on about a 1 m edge (twice): section 2 x 1, w 1/2, CdA = r x mean
 *    of the 1 x 1 face and a 2 x 1 face, A = 1 x 3/sqrt(2) */
static void test_a_tumbling_bar_averages_its_face_and_edge_orientations(void **state)
{
    (void)state;
    double r = 0.80 / 1.05;
    double cd_end = 0.87;
    double cd_side = 1.185 * (1.18 - sqrt(0.5) * 0.13) / 1.18;
    double cda_end = cd_end * 1.0, cda_side = cd_side * 2.0;
    double num = cda_end + 2.0 * cda_side + r * cda_side + 2.0 * 0.5 * r * (cda_end + cda_side) / 2.0;
    double den = 1.0 + 2.0 * 2.0 + 2.0 * 2.0 / sqrt(2.0) + 2.0 * 0.5 * 3.0 / sqrt(2.0);
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_BOX, 2.0, 1.0, 1.0, PLUMB_ATTITUDE_TUMBLING);
    assert_rel(d.cd, num / den, 1e-13);
    assert_rel(d.area_m2, (2.0 + 2.0 + 1.0) * 2.0 / 4.0, 1e-14);
    /* a thin plate's edge-on terms nearly vanish (weights t/b): its
     * tumbling Cd stays within 1 % of the face-on-only mean */
    plumb_drag_spec p = shape_drag(PLUMB_SHAPE_PLATE, 0.3, 0.3, 1e-4, PLUMB_ATTITUDE_TUMBLING);
    assert_rel(p.cd, 1.18, 0.01);
}

/* A tumbling shape warns when a table end is held for any orientation it
 * averages, and names it; the whole source text fits its field. */
static void test_a_tumbling_shape_flags_a_held_table_end_and_lists_its_sources(void **state)
{
    (void)state;
    plumb_drag_spec d = shape_drag(PLUMB_SHAPE_PLATE, 0.3, 0.05, 0.01, PLUMB_ATTITUDE_TUMBLING);
    assert_int_equal(d.extrapolated, 1); /* along 0.3 m: L/D 13.4 > 5 */
    assert_non_null(strstr(d.source, "held at 5 [D]: outside the table"));
    const char *tags[] = {"[W] F. M. White", "[L] 2.0, White, Table 7.2", "[M] Munson",
                          "[D] DNVGL-RP-N103"};
    for (size_t i = 0; i < 4; i++)
        assert_non_null(strstr(d.source, tags[i]));
    size_t n = strlen(d.source);
    assert_true(n > 11);
    assert_string_equal(d.source + n - 11, "transcribed");
    d = shape_drag(PLUMB_SHAPE_CYLINDER, 0.6, 0.035, 0, PLUMB_ATTITUDE_TUMBLING);
    assert_int_equal(d.extrapolated, 1); /* end-on L/D 17 > 7 */
    assert_rel(d.area_m2, (2.0 * PLUMB_PI * 0.0175 * 0.0175 + 2.0 * PLUMB_PI * 0.0175 * 0.6) / 4.0,
               1e-14);
}

static void test_a_shape_with_a_non_positive_edge_is_refused(void **state)
{
    (void)state;
    plumb_drag_spec d;
    plumb_shape_spec s = {PLUMB_SHAPE_BOX, {0.2, -0.1, 0.3}, PLUMB_ATTITUDE_TUMBLING};
    assert_int_equal(plumb_drag_from_shape(&s, &d), PLUMB_EINVAL);
    s = (plumb_shape_spec){PLUMB_SHAPE_SPHERE, {0.0, 0, 0}, PLUMB_ATTITUDE_TUMBLING};
    assert_int_equal(plumb_drag_from_shape(&s, &d), PLUMB_EINVAL);
    s = (plumb_shape_spec){PLUMB_SHAPE_CYLINDER, {0.3, NAN, 0}, PLUMB_ATTITUDE_TUMBLING};
    assert_int_equal(plumb_drag_from_shape(&s, &d), PLUMB_EINVAL);
}

static void test_rigid_water_spheres_fall_at_gunn_kinzer_speeds(void **state)
{
    (void)state;
    /* Air of the measurements (from memory): 1013 hPa, 20 degC, 50 % RH.
     * Water 998.2 kg/m^3 at 20 degC (CRC Handbook). Buoyancy included. */
    plumb_atm_spec a;
    plumb_atm_spec_init(&a);
    a.model = PLUMB_ATM_SURFACE;
    a.station_pressure_pa = 101300.0;
    a.station_temperature_k = 293.15;
    a.relative_humidity = 0.5;
    plumb_atmosphere *atm = NULL;
    plumb_diag diag;
    assert_int_equal(plumb_atmosphere_alloc(&a, &atm, &diag), PLUMB_OK);
    const double d_mm[] = {0.1, 0.2, 0.4, 0.6, 0.8, 1.0};
    const double v_gk[] = {0.27, 0.72, 1.62, 2.47, 3.27, 4.03};
    for (size_t i = 0; i < 6; i++) {
        double d = d_mm[i] * 1e-3;
        plumb_fall_spec s;
        memset(&s, 0, sizeof s);
        s.volume_m3 = PLUMB_PI * d * d * d / 6.0;
        s.mass_kg = 998.2 * s.volume_m3;
        s.drag.model = PLUMB_DRAG_SPHERE_MORRISON;
        s.drag.diameter_m = d;
        s.drag.area_m2 = PLUMB_PI * d * d / 4.0;
        s.release_m[2] = 10.0;
        plumb_wind_spec_init(&s.wind);
        double vt = 0.0;
        assert_int_equal(plumb_terminal_speed(&s, atm, 0.0, 0, &vt), PLUMB_OK);
        assert_rel(vt, v_gk[i], 0.05);
    }
    plumb_atmosphere_free(atm);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_morrison_cd_at_re_200_equals_the_published_value),
        cmocka_unit_test(test_morrison_cd_follows_the_2010_handout_at_four_reynolds_numbers),
        cmocka_unit_test(test_cd_re_squared_only_falls_inside_the_named_crisis_intervals),
        cmocka_unit_test(test_morrison_sits_on_the_subcritical_plateau_near_re_1e5),
        cmocka_unit_test(test_clift_grace_weber_uses_the_corrected_high_re_piece),
        cmocka_unit_test(test_cauchy_mean_projected_area_is_exact_for_sphere_cube_cylinder),
        cmocka_unit_test(test_rectangular_plate_cd_follows_the_published_rows_by_b_over_h),
        cmocka_unit_test(test_plate_cd_between_rows_is_interpolated),
        cmocka_unit_test(test_a_long_strip_broadside_gets_about_1_5_not_the_square_plate_value),
        cmocka_unit_test(test_square_bar_end_on_cd_follows_the_published_prism_rows),
        cmocka_unit_test(test_a_bar_beyond_the_prism_table_is_held_and_flagged),
        cmocka_unit_test(test_cylinder_end_on_cd_runs_from_the_disc_to_the_data_book_rows),
        cmocka_unit_test(test_a_short_cylinder_end_on_is_read_from_the_table_not_held),
        cmocka_unit_test(test_cylinder_broadside_cd_follows_the_data_book_rows),
        cmocka_unit_test(test_a_tumbling_cube_uses_the_edge_on_value),
        cmocka_unit_test(test_a_tumbling_bar_averages_its_face_and_edge_orientations),
        cmocka_unit_test(test_a_tumbling_shape_flags_a_held_table_end_and_lists_its_sources),
        cmocka_unit_test(test_a_shape_with_a_non_positive_edge_is_refused),
        cmocka_unit_test(test_rigid_water_spheres_fall_at_gunn_kinzer_speeds),
    };
    return cmocka_run_group_tests(tests, plumbt_setup_gsl, NULL);
}
