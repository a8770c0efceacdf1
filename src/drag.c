/*
 * drag.c - drag coefficients and areas of payloads.
 *
 * Sources:
 *  - Sphere Cd(Re): F. A. Morrison, "Data Correlation for Drag Coefficient
 *    for Sphere", Department of Chemical Engineering, Michigan Technological
 *    University, 2010, eq. (1) (seen in a transcription of the handout;
 *    valid Re <= 1e6):
 *      Cd = 24/Re + 2.6 (Re/5) / (1 + (Re/5)^1.52)
 *           + 0.411 (Re/263000)^-7.94 / (1 + (Re/263000)^-8) + Re^0.8 / 461000
 *    This is the form plumb uses and the one it cites. Morrison's book (An
 *    Introduction to Fluid Mechanics, CUP 2013) prints a correlation of the
 *    same family; a later form replaces the last term by
 *    0.25 (Re/1e6) / (1 + Re/1e6) (from memory, not confirmed here: Cd then
 *    differs by up to 0.3 % below Re 1e5 and by 9 % at 1e6). The book's
 *    equation could not be checked, so it is not cited for the figures.
 *  - Sphere Cd(Re), standard drag curve: R. Clift, J. R. Grace, M. E. Weber,
 *    Bubbles, Drops, and Particles, Academic Press 1978, Table 5.2
 *    (piecewise in w = log10 Re; coefficients from memory except the
 *    4e5 < Re <= 1e6 piece, 0.1 w - 0.49, which shared/references.md
 *    transcribes and which a widely copied version gets wrong).
 *  - Bluff bodies: frontal-area Cd at subcritical Re ~1e5 from the
 *    Aeronautical Engineer Data Book, Fig. 5.13 (Hoerner-type data),
 *    transcribed in shared/references.md.
 *  - Tumbling: Cauchy's surface-area formula (mean projected area of a
 *    convex body over all orientations = surface area / 4; see
 *    Tsukerman & Veomett, arXiv:1604.05815). No published tumbling Cd was
 *    found; plumb derives one (see tumbling_cd below) and says so.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "plumb/constants.h"
#include "plumb/drag.h"
#include "internal.h"

double plumb_drag_sphere_morrison(double re)
{
    double a = re / 5.0;
    double b = re / 263000.0;
    return 24.0 / re + 2.6 * a / (1.0 + pow(a, 1.52)) +
           0.411 * pow(b, -7.94) / (1.0 + pow(b, -8.0)) + pow(re, 0.8) / 461000.0;
}

double plumb_drag_sphere_cgw(double re)
{
    double w = log10(re);
    if (re <= 0.01)
        return 3.0 / 16.0 + 24.0 / re;
    if (re <= 20.0)
        return 24.0 / re * (1.0 + 0.1315 * pow(re, 0.82 - 0.05 * w));
    if (re <= 260.0)
        return 24.0 / re * (1.0 + 0.1935 * pow(re, 0.6305));
    if (re <= 1.5e3)
        return pow(10.0, 1.6435 - 1.1242 * w + 0.1558 * w * w);
    if (re <= 1.2e4)
        return pow(10.0, -2.4571 + 2.5558 * w - 0.9295 * w * w + 0.1049 * w * w * w);
    if (re <= 4.4e4)
        return pow(10.0, -1.9181 + 0.6370 * w - 0.0636 * w * w);
    if (re <= 3.38e5)
        return pow(10.0, -4.3390 + 1.5809 * w - 0.1546 * w * w);
    if (re <= 4.0e5)
        return 29.78 - 5.3 * w;
    if (re <= 1.0e6)
        return 0.1 * w - 0.49;
    return 0.19 - 8.0e4 / re;
}

double plumb_drag_cd_area(const plumb_drag_spec *spec, double re)
{
    switch (spec->model) {
    case PLUMB_DRAG_SPHERE_MORRISON:
        return re > 0.0 ? plumb_drag_sphere_morrison(re) * spec->area_m2 : 0.0;
    case PLUMB_DRAG_SPHERE_CGW:
        return re > 0.0 ? plumb_drag_sphere_cgw(re) * spec->area_m2 : 0.0;
    case PLUMB_DRAG_FIXED:
    default:
        return spec->area_m2 > 0.0 ? spec->cd * spec->area_m2 : spec->cd_area_m2;
    }
}

/* Reynolds-number intervals outside which Cd(Re) Re^2 never decreases, so
 * that the drag balance 1/2 rho Cd(Re) A v^2 = m g has at most one root
 * there (Re is proportional to v). Inside them (the drag crisis, and the
 * two small downward jumps where the Clift-Grace-Weber pieces meet) it
 * may have several. Found by scanning each curve at a ratio of 1 + 1e-5
 * in Re from 1e-3 to 1e9 (Morrison: decreasing on 2.392e5..3.563e5;
 * Clift-Grace-Weber: at the joins 1.2e4 and 4.4e4 and on 3.380e5..4.000e5)
 * and widened; tests/test_drag.c repeats the scan. */
static const double morrison_crisis[][2] = {{2.30e5, 3.70e5}};
static const double cgw_crisis[][2] = {{1.19e4, 1.21e4}, {4.39e4, 4.41e4}, {3.30e5, 4.10e5}};

size_t plumbp_drag_crisis(plumb_drag_model model, const double (**re)[2])
{
    switch (model) {
    case PLUMB_DRAG_SPHERE_MORRISON:
        *re = morrison_crisis;
        return sizeof morrison_crisis / sizeof *morrison_crisis;
    case PLUMB_DRAG_SPHERE_CGW:
        *re = cgw_crisis;
        return sizeof cgw_crisis / sizeof *cgw_crisis;
    case PLUMB_DRAG_FIXED:
    default:
        *re = NULL;
        return 0;
    }
}

/* ---- bluff-body tables (Aeronautical Engineer Data Book Fig. 5.13) ---- */

typedef struct { double ld, cd; } cd_row;

/* Circular cylinder, axis normal to the flow, Cd on L x D, by L/D (infinity as 1e9). */
static const cd_row cyl_broadside[] = {
    {1.0, 0.63}, {2.0, 0.68}, {5.0, 0.74}, {10.0, 0.82}, {40.0, 0.98}, {1e9, 1.20},
};
/* Circular cylinder, axis along the flow, Cd on pi D^2 / 4, by L/D. */
static const cd_row cyl_end_on[] = {
    {1.0, 0.91}, {2.0, 0.85}, {4.0, 0.87}, {7.0, 0.99},
};
#define CD_CUBE_FACE 1.05      /* cube face-on */
#define CD_PLATE_SQUARE 1.17   /* square flat plate normal to the flow */

/* Linear interpolation in a table, held at the end rows. Sets *clamped when
 * x lies outside the table. */
static double table_cd(const cd_row *t, size_t n, double x, int *clamped)
{
    if (x <= t[0].ld) {
        *clamped |= x < t[0].ld;
        return t[0].cd;
    }
    for (size_t i = 1; i < n; i++) {
        if (x <= t[i].ld) {
            double f = (x - t[i - 1].ld) / (t[i].ld - t[i - 1].ld);
            return t[i - 1].cd + f * (t[i].cd - t[i - 1].cd);
        }
    }
    *clamped = 1;
    return t[n - 1].cd;
}

/* Face-on Cd of a rectangular block with the given depth along the flow
 * over the face's mean width: a square plate (depth 0) 1.17, a cube
 * (depth = width) 1.05, linear between and held beyond. The in-between
 * values are an interpolation of ours, not handbook data. */
static double block_face_cd(double depth_over_width)
{
    double r = depth_over_width > 1.0 ? 1.0 : depth_over_width;
    return CD_PLATE_SQUARE + r * (CD_CUBE_FACE - CD_PLATE_SQUARE);
}

double plumb_shape_mean_projected_area(const plumb_shape_spec *s)
{
    const double *d = s->dims_m;
    switch (s->kind) {
    case PLUMB_SHAPE_SPHERE:
        return PLUMB_PI * d[0] * d[0] / 4.0;
    case PLUMB_SHAPE_CYLINDER: {
        double r = d[1] / 2.0;
        return (2.0 * PLUMB_PI * r * r + 2.0 * PLUMB_PI * r * d[0]) / 4.0;
    }
    case PLUMB_SHAPE_BOX:
    case PLUMB_SHAPE_PLATE:
        return 2.0 * (d[0] * d[1] + d[1] * d[2] + d[0] * d[2]) / 4.0;
    case PLUMB_SHAPE_NONE:
    default:
        return 0.0;
    }
}

/* The three principal orientations of a body: Cd and frontal area for the
 * flow along each axis. The tumbling Cd (our derivation, no published
 * source) is the frontal-area-weighted mean of the three,
 *     Cd_t = sum(Cd_i A_i) / sum(A_i),
 * applied to Cauchy's mean projected area: the body spends equal time
 * facing each axis and is dragged in proportion to the area it shows. */
typedef struct { double cd[3], area[3]; int clamped[3]; } orientations;

static void principal(const plumb_shape_spec *s, orientations *o)
{
    const double *d = s->dims_m;
    memset(o, 0, sizeof *o);
    if (s->kind == PLUMB_SHAPE_CYLINDER) {
        double ld = d[0] / d[1];
        o->cd[0] = table_cd(cyl_end_on, sizeof cyl_end_on / sizeof *cyl_end_on, ld, &o->clamped[0]);
        o->area[0] = PLUMB_PI * d[1] * d[1] / 4.0;
        o->cd[1] = o->cd[2] = table_cd(cyl_broadside, sizeof cyl_broadside / sizeof *cyl_broadside,
                                       ld, &o->clamped[1]);
        o->clamped[2] = o->clamped[1];
        o->area[1] = o->area[2] = d[0] * d[1];
        return;
    }
    /* box and plate: the flow along edge i meets the face of the other two */
    for (int i = 0; i < 3; i++) {
        double a = d[(i + 1) % 3], b = d[(i + 2) % 3];
        o->area[i] = a * b;
        o->cd[i] = block_face_cd(d[i] / sqrt(a * b));
    }
}

plumb_status plumb_drag_from_shape(const plumb_shape_spec *shape, plumb_drag_spec *out)
{
    int ndims = shape->kind == PLUMB_SHAPE_SPHERE ? 1 : shape->kind == PLUMB_SHAPE_CYLINDER ? 2 : 3;
    if (shape->kind == PLUMB_SHAPE_NONE)
        return PLUMB_RAISE_KEY(NULL, PLUMB_EINVAL, "payload.shape", "no shape given");
    for (int i = 0; i < ndims; i++)
        if (!(shape->dims_m[i] > 0.0) || !isfinite(shape->dims_m[i]))
            return PLUMB_RAISE(NULL, PLUMB_EINVAL, "shape dimensions must be > 0");
    memset(out, 0, sizeof *out);
    out->model = PLUMB_DRAG_FIXED;
    if (shape->kind == PLUMB_SHAPE_SPHERE) {
        out->model = PLUMB_DRAG_SPHERE_MORRISON;
        out->diameter_m = shape->dims_m[0];
        out->area_m2 = PLUMB_PI * shape->dims_m[0] * shape->dims_m[0] / 4.0;
        out->cd = 0.47;
        snprintf(out->source, sizeof out->source,
                 "sphere of diameter %.4g m: Cd(Re) by Morrison (2010), area pi d^2/4",
                 shape->dims_m[0]);
        return PLUMB_OK;
    }
    orientations o;
    principal(shape, &o);
    const char *what = shape->kind == PLUMB_SHAPE_CYLINDER ? "cylinder"
                       : shape->kind == PLUMB_SHAPE_BOX    ? "box"
                                                           : "plate";
    const char *table = shape->kind == PLUMB_SHAPE_CYLINDER
                            ? "cylinder Cd by L/D, Aeronautical Engineer Data Book Fig. 5.13"
                            : "face-on Cd between square plate 1.17 and cube 1.05 by depth/width, "
                              "Aeronautical Engineer Data Book Fig. 5.13";
    /* A cylinder is end-on with its axis along the flow and broadside with
     * it across, whatever its L/D; a box or plate shows its largest face
     * broadside and its smallest end-on. */
    size_t big = 1, small = 0;
    if (shape->kind != PLUMB_SHAPE_CYLINDER) {
        big = 0;
        for (size_t i = 1; i < 3; i++) {
            if (o.area[i] > o.area[big])
                big = i;
            if (o.area[i] < o.area[small])
                small = i;
        }
    }
    int clamped = shape->attitude == PLUMB_ATTITUDE_BROADSIDE ? o.clamped[big]
                  : shape->attitude == PLUMB_ATTITUDE_END_ON  ? o.clamped[small]
                                                              : o.clamped[0] | o.clamped[1] | o.clamped[2];
    const char *clamp = clamped ? "; aspect ratio outside the table, end value held" : "";
    switch (shape->attitude) {
    case PLUMB_ATTITUDE_BROADSIDE:
        out->cd = o.cd[big];
        out->area_m2 = o.area[big];
        snprintf(out->source, sizeof out->source, "%s broadside: Cd %.3g on its frontal area (%s%s)",
                 what, out->cd, table, clamp);
        break;
    case PLUMB_ATTITUDE_END_ON:
        out->cd = o.cd[small];
        out->area_m2 = o.area[small];
        snprintf(out->source, sizeof out->source, "%s end-on: Cd %.3g on its frontal area (%s%s)",
                 what, out->cd, table, clamp);
        break;
    case PLUMB_ATTITUDE_TUMBLING:
    default: {
        double num = 0.0, den = 0.0;
        for (int i = 0; i < 3; i++) {
            num += o.cd[i] * o.area[i];
            den += o.area[i];
        }
        out->cd = num / den;
        out->area_m2 = plumb_shape_mean_projected_area(shape);
        snprintf(out->source, sizeof out->source,
                 "%s tumbling: area = surface/4 (Cauchy); Cd %.3g = frontal-area-weighted mean of "
                 "the three principal orientations (plumb's derivation, no published tumbling Cd; %s%s)",
                 what, out->cd, table, clamp);
        break;
    }
    }
    out->cd_area_m2 = out->cd * out->area_m2;
    out->extrapolated = clamped;
    return PLUMB_OK;
}
