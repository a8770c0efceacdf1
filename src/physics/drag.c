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
 *    4e5 < Re <= 1e6 piece, 0.1 w - 0.49, transcribed from several codes
 *    that print the table; a widely copied version gets it wrong).
 *  - Bluff bodies: frontal-area Cd at subcritical Re, by aspect ratio, from
 *    the tables below, each row with its source and status: White, Fluid
 *    Mechanics, Table 7.3 (after Hoerner, Fluid-Dynamic Drag, 1965; from
 *    memory), Munson et al., Fundamentals of Fluid Mechanics, 6th ed.,
 *    Fig. 9.20, DNVGL-RP-N103 (2017) Table B-2 and the Aeronautical
 *    Engineer Data Book Fig. 5.13(b), Hoerner-type data (transcribed).
 *  - Tumbling: Cauchy's surface-area formula (mean projected area of a
 *    convex body over all orientations = surface area / 4; see
 *    Tsukerman & Veomett, arXiv:1604.05815). No published tumbling Cd was
 *    found; plumb averages the tabulated orientations (see orientations()
 *    below) and says so.
 */
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include "plumb/constants.h"
#include "plumb/drag.h"
#include "core/internal.h"
#include "physics/physics.h"

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
        return plumb_drag_given_cd_area(spec);
    }
}

double plumb_drag_given_cd_area(const plumb_drag_spec *spec)
{
    return spec->area_m2 > 0.0 ? spec->cd * spec->area_m2 : spec->cd_area_m2;
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

/* ---- bluff-body tables ----------------------------------------------------
 *
 * Cd on the frontal area normal to the flow, subcritical Re (about 1e4 to
 * 1e6), sharp edges. Every row names its source and its status: seen (read
 * in the document), transcribed (read in a faithful copy of it) or from
 * memory (not confirmed here). The text a report shows cites each value's
 * rows by tag and lists the sources of the tags used. */

enum { SRC_WHITE, SRC_LONG_PLATE, SRC_AEDB, SRC_DISC, SRC_MUNSON, SRC_DNV, N_SRC };

static const struct { char tag; const char *text; } sources[N_SRC] = {
    [SRC_WHITE] = {'W', "F. M. White, Fluid Mechanics, Table 7.3, after S. F. Hoerner, "
                        "Fluid-Dynamic Drag (1965): from memory"},
    [SRC_LONG_PLATE] = {'L', "2.0, White, Table 7.2 (2-D plate), and 1.98, Aeronautical "
                             "Engineer Data Book Fig. 5.13: transcribed"},
    [SRC_AEDB] = {'A', "Aeronautical Engineer Data Book, Fig. 5.13: transcribed"},
    [SRC_DISC] = {'H', "disc, Hoerner (1965) via aerospaceweb.org: transcribed"},
    [SRC_MUNSON] = {'M', "Munson et al., Fundamentals of Fluid Mechanics, 6th ed., Fig. 9.20 "
                         "(cube, on D^2): transcribed"},
    [SRC_DNV] = {'D', "DNVGL-RP-N103 (2017), Table B-2: transcribed"},
};

typedef struct { double x, cd; int src; } cd_row;
typedef struct { const char *name, *var; const cd_row *row; size_t n; } cd_table;
#define TABLE(name, var, rows) {name, var, rows, sizeof rows / sizeof *rows}

/* Thin rectangular plate normal to the flow, Cd on its face, by the ratio of
 * its long edge to its short edge b/h. Cross-checks (transcribed): square
 * plate 1.17 (Aeronautical Engineer Data Book) and 1.16 (DNVGL-RP-N103
 * Table B-2), which also gives 1.20 at 5 but 1.50 at 10 (White: 1.3) and
 * 1.90 for a long plate. */
static const cd_row plate_rows[] = {
    {1.0, 1.18, SRC_WHITE},  {5.0, 1.20, SRC_WHITE}, {10.0, 1.30, SRC_WHITE},
    {20.0, 1.50, SRC_WHITE}, {INFINITY, 2.0, SRC_LONG_PLATE},
};
/* Square prism (a square bar or block) with its axis along the flow, Cd on
 * its square end, by length over side L/D. L/D 0 is the square plate above;
 * L/D 1 the cube face-on, 1.05, where Munson and Palmer (Table 5-3, Re 1e5;
 * transcribed; no fuller citation of Palmer recorded) agree, DNVGL-RP-N103
 * gives 1.15 and White 1.07 (from memory); L/D 1.5 to 5 DNVGL-RP-N103 (the
 * row's name, "square rod parallel to flow", is from memory). */
static const cd_row prism_rows[] = {
    {0.0, 1.18, SRC_WHITE}, {1.0, 1.05, SRC_MUNSON}, {1.5, 0.97, SRC_DNV}, {2.0, 0.87, SRC_DNV},
    {2.5, 0.90, SRC_DNV},   {3.0, 0.93, SRC_DNV},    {4.0, 0.95, SRC_DNV}, {5.0, 0.95, SRC_DNV},
};
/* Circular cylinder, axis along the flow, Cd on pi D^2 / 4, by L/D; L/D 0 is
 * the thin disc. Cross-checks, Munson Fig. 9.20 (transcribed): thin disc
 * 1.1, L/D 0.5 1.1, 1 0.93, 2 0.83, 4 0.85. */
static const cd_row cyl_end_rows[] = {
    {0.0, 1.17, SRC_DISC}, {0.5, 1.15, SRC_WHITE}, {1.0, 0.91, SRC_AEDB},
    {2.0, 0.85, SRC_AEDB}, {4.0, 0.87, SRC_AEDB},  {7.0, 0.99, SRC_AEDB},
};
/* Circular cylinder, axis across the flow, Cd on L x D, by L/D. */
static const cd_row cyl_side_rows[] = {
    {1.0, 0.63, SRC_AEDB},  {2.0, 0.68, SRC_AEDB},  {5.0, 0.74, SRC_AEDB},
    {10.0, 0.82, SRC_AEDB}, {40.0, 0.98, SRC_AEDB}, {INFINITY, 1.20, SRC_AEDB},
};
static const cd_table plate_table = TABLE("rectangular plate", "b/h", plate_rows);
static const cd_table prism_table = TABLE("square prism", "L/D", prism_rows);
static const cd_table cyl_end_table = TABLE("cylinder end-on", "L/D", cyl_end_rows);
static const cd_table cyl_side_table = TABLE("cylinder broadside", "L/D", cyl_side_rows);

/* Cube, Munson Fig. 9.20 (transcribed), both on the face area D^2: face-on
 * 1.05, edge-on (turned 45 degrees about an edge across the flow) 0.80.
 * White gives 1.07 and 0.81 (from memory). */
#define CD_CUBE_FACE 1.05
#define CD_CUBE_EDGE 0.80

/* One look-up: the rows used (lo == hi for a row hit exactly or held) and
 * whether x lay outside the table (its end row held). */
typedef struct {
    const cd_table *t;
    double x, cd;
    size_t lo, hi;
    int clamped;
} lookup;

/* Linear interpolation in x between rows; between the last finite row x0
 * and a row at infinity, linear in 1/x from 1/x0 to 0 (plumb's rule). Held
 * at the end rows outside the table. */
static lookup table_lookup(const cd_table *t, double x)
{
    lookup r = {t, x, t->row[0].cd, 0, 0, 0};
    if (x <= t->row[0].x) {
        r.clamped = x < t->row[0].x;
        return r;
    }
    for (size_t i = 1; i < t->n; i++) {
        const cd_row *a = &t->row[i - 1], *b = &t->row[i];
        if (x > b->x)
            continue;
        double f = isinf(b->x) ? 1.0 - a->x / x : (x - a->x) / (b->x - a->x);
        r.lo = f >= 1.0 ? i : i - 1;
        r.hi = f <= 0.0 ? i - 1 : i;
        r.cd = a->cd + f * (b->cd - a->cd);
        return r;
    }
    r.lo = r.hi = t->n - 1;
    r.cd = t->row[t->n - 1].cd;
    r.clamped = 1;
    return r;
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

/* The orientations the tables give for a body. Each has a Cd on its frontal
 * area, that area and a weight in the tumbling mean.
 *  - Box and plate: face-on along each edge i (the face of the other two
 *    edges a >= b meets the flow, depth d_i behind it):
 *        Cd = Cd_plate(a/b) x Cd_prism(d_i / sqrt(a b)) / Cd_prism(0),
 *    plumb's combination of the two tables: a thin plate (depth 0) gets the
 *    plate table, a square face the square-prism table, a long bar
 *    broadside (sqrt(a b) large against its depth) nearly its plate value.
 *    Edge-on about each edge k (k across the flow, the flow at 45 degrees
 *    between the faces along the other edges p and q): the cube's published
 *    ratio of edge-on to face-on drag on the same area,
 *        CdA = (0.80 / 1.05) x (CdA_p + CdA_q) / 2 on A = d_k (d_p + d_q) / sqrt(2),
 *    weighted min(d_p, d_q) / max(d_p, d_q): the datum is for a square
 *    section turned 45 degrees, and counts less the less square the
 *    section is (plumb's own rule; a thin plate's edge-on terms nearly
 *    vanish, a cube's count in full).
 *  - Cylinder: end-on (weight 1) and broadside (weight 2, two axes).
 * Tumbling Cd (plumb's own averaging, no published tumbling Cd):
 *        Cd_t = sum(w Cd A) / sum(w A)  on Cauchy's mean projected area,
 * the drag-area-per-frontal-area of the tabulated orientations; the
 * projected area, whose change with orientation is exact, is Cauchy's. */
enum { MAX_ORIENT = 6 };
typedef struct {
    double cd, area, weight;
    lookup plate, prism; /* box face-on; cylinder: plate holds its one look-up */
} orient;

static size_t orientations(const plumb_shape_spec *s, orient *o)
{
    const double *d = s->dims_m;
    memset(o, 0, MAX_ORIENT * sizeof *o);
    if (s->kind == PLUMB_SHAPE_CYLINDER) {
        double ld = d[0] / d[1];
        o[0].plate = table_lookup(&cyl_end_table, ld);
        o[0].cd = o[0].plate.cd;
        o[0].area = PLUMB_PI * d[1] * d[1] / 4.0;
        o[0].weight = 1.0;
        o[1].plate = table_lookup(&cyl_side_table, ld);
        o[1].cd = o[1].plate.cd;
        o[1].area = d[0] * d[1];
        o[1].weight = 2.0;
        return 2;
    }
    for (size_t i = 0; i < 3; i++) {
        double a = d[(i + 1) % 3], b = d[(i + 2) % 3];
        o[i].plate = table_lookup(&plate_table, fmax(a, b) / fmin(a, b));
        o[i].prism = table_lookup(&prism_table, d[i] / sqrt(a * b));
        o[i].cd = o[i].plate.cd * o[i].prism.cd / prism_rows[0].cd;
        o[i].area = a * b;
        o[i].weight = 1.0;
    }
    for (size_t k = 0; k < 3; k++) {
        size_t p = (k + 1) % 3, q = (k + 2) % 3;
        orient *e = &o[3 + k];
        double cda = CD_CUBE_EDGE / CD_CUBE_FACE *
                     (o[p].cd * o[p].area + o[q].cd * o[q].area) / 2.0;
        e->area = d[k] * (d[p] + d[q]) / sqrt(2.0);
        e->cd = cda / e->area;
        e->weight = fmin(d[p], d[q]) / fmax(d[p], d[q]);
    }
    return 6;
}

/* ---- the source text ------------------------------------------------- */

typedef struct {
    char *buf;
    size_t size, len;
    unsigned used; /* bit per source tag cited */
} text;

static void add(text *t, const char *fmt, ...) PLUMBP_PRINTF(2, 3);
static void add(text *t, const char *fmt, ...)
{
    if (t->len + 1 >= t->size)
        return;
    va_list ap;
    va_start(ap, fmt);
    int n = vsnprintf(t->buf + t->len, t->size - t->len, fmt, ap);
    va_end(ap);
    if (n > 0)
        t->len = (size_t)n < t->size - t->len ? t->len + (size_t)n : t->size - 1;
}

static void add_x(text *t, double x)
{
    if (isinf(x))
        add(t, "infinity");
    else
        add(t, "%.3g", x);
}

static void add_row(text *t, const cd_row *r)
{
    add_x(t, r->x);
    add(t, " [%c]", sources[r->src].tag);
    t->used |= 1u << r->src;
}

/* "b/h 1.45 (between 1 [W] and 5 [W])", "L/D 2 (row [D])" or
 * "L/D 13.4 (held at 5 [D]: outside the table)" */
static void add_lookup(text *t, const lookup *l)
{
    add(t, "%s ", l->t->var);
    add_x(t, l->x);
    if (l->clamped) {
        add(t, " (held at ");
        add_row(t, &l->t->row[l->lo]);
        add(t, ": outside the table)");
    } else if (l->lo == l->hi) {
        add(t, " (row ");
        add_row(t, &l->t->row[l->lo]);
        add(t, ")");
    } else {
        add(t, " (between ");
        add_row(t, &l->t->row[l->lo]);
        add(t, " and ");
        add_row(t, &l->t->row[l->hi]);
        add(t, ")");
    }
}

/* The tags of the rows the look-ups used, each once, e.g. "[W][M]"; marks them used. */
static void add_tags(text *t, const lookup *ls, size_t n)
{
    unsigned mine = 0;
    for (size_t i = 0; i < n; i++)
        for (size_t r = ls[i].lo; r <= ls[i].hi; r++)
            mine |= 1u << ls[i].t->row[r].src;
    for (int s = 0; s < N_SRC; s++)
        if (mine & (1u << s))
            add(t, "[%c]", sources[s].tag);
    t->used |= mine;
}

static void add_face(text *t, const orient *o)
{
    add(t, "rectangular-plate Cd %.3g at ", o->plate.cd);
    add_lookup(t, &o->plate);
    add(t, " x square-prism Cd %.3g at ", o->prism.cd);
    add_lookup(t, &o->prism);
    add(t, " / %.3g (square plate; plumb's combination of the two tables)", prism_rows[0].cd);
}

static void add_legend(text *t)
{
    add(t, ". Sources:");
    const char *sep = " ";
    for (int s = 0; s < N_SRC; s++) {
        if (!(t->used & (1u << s)))
            continue;
        add(t, "%s[%c] %s", sep, sources[s].tag, sources[s].text);
        sep = "; ";
    }
}

static int clamped(const orient *o)
{
    return o->plate.clamped || o->prism.clamped;
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
                 "sphere: Cd(Re) by Morrison (2010), area pi d^2/4");
        return PLUMB_OK;
    }
    orient o[MAX_ORIENT];
    size_t n = orientations(shape, o);
    int cyl = shape->kind == PLUMB_SHAPE_CYLINDER;
    const char *what = cyl ? "cylinder" : shape->kind == PLUMB_SHAPE_BOX ? "box" : "plate";
    text t = {out->source, sizeof out->source, 0, 0};
    int held = 0;

    if (shape->attitude == PLUMB_ATTITUDE_TUMBLING) {
        double num = 0.0, den = 0.0;
        for (size_t i = 0; i < n; i++) {
            num += o[i].weight * o[i].cd * o[i].area;
            den += o[i].weight * o[i].area;
            held |= o[i].weight > 0.0 && clamped(&o[i]);
        }
        out->cd = num / den;
        out->area_m2 = plumb_shape_mean_projected_area(shape);
        add(&t, "%s tumbling: Cd %.3g on surface/4 (Cauchy's mean projected area) = "
                "sum(w Cd A) / sum(w A) over the tabulated orientations (plumb's own averaging; "
                "no published tumbling Cd): ", what, out->cd);
        if (cyl) {
            add(&t, "end-on Cd %.3g at ", o[0].cd);
            add_lookup(&t, &o[0].plate);
            add(&t, ", w 1; broadside Cd %.3g at ", o[1].cd);
            add_lookup(&t, &o[1].plate);
            add(&t, ", w 2");
        } else {
            add(&t, "face-on along each edge in the order given Cd %.3g, %.3g, %.3g, w 1 "
                    "(plate Cd by b/h ", o[0].cd, o[1].cd, o[2].cd);
            lookup pl[3] = {o[0].plate, o[1].plate, o[2].plate};
            lookup pr[3] = {o[0].prism, o[1].prism, o[2].prism};
            add_tags(&t, pl, 3);
            add(&t, " x square-prism Cd by L/D = depth/sqrt(face area) ");
            add_tags(&t, pr, 3);
            add(&t, " / %.3g); edge-on across the same edges Cd %.3g, %.3g, %.3g, w %.2g, %.2g, "
                    "%.2g (the cube's edge-on/face-on %.2f/%.2f [%c] times the two faces' mean "
                    "CdA, on the frontal area; w = how square the section is; plumb's own rule)",
                prism_rows[0].cd, o[3].cd, o[4].cd, o[5].cd, o[3].weight, o[4].weight,
                o[5].weight, CD_CUBE_EDGE, CD_CUBE_FACE, sources[SRC_MUNSON].tag);
            t.used |= 1u << SRC_MUNSON;
            for (size_t i = 0; i < 3; i++)
                if (o[i].prism.clamped) {
                    add(&t, "; %s at ", o[i].prism.t->name);
                    add_lookup(&t, &o[i].prism);
                }
        }
        add_legend(&t);
        out->cd_area_m2 = out->cd * out->area_m2;
        out->extrapolated = held;
        return PLUMB_OK;
    }

    int broadside = shape->attitude == PLUMB_ATTITUDE_BROADSIDE;
    size_t pick = broadside ? 1 : 0;
    if (!cyl) {
        /* a box or plate shows its largest face broadside, its smallest end-on */
        pick = 0;
        for (size_t i = 1; i < 3; i++)
            if (broadside ? o[i].area > o[pick].area : o[i].area < o[pick].area)
                pick = i;
    }
    const char *att = broadside ? "broadside" : "end-on";
    out->cd = o[pick].cd;
    out->area_m2 = o[pick].area;
    held = clamped(&o[pick]);
    if (cyl) {
        add(&t, "cylinder %s: Cd %.3g on %s at ", att, out->cd, broadside ? "L x D" : "pi D^2/4");
        add_lookup(&t, &o[pick].plate);
    } else {
        /* the largest face is that of the two longest edges, the smallest
         * that of the two shortest */
        add(&t, "%s %s: Cd %.3g on its %s face, its %s edge deep = ", what, att, out->cd,
            broadside ? "largest" : "smallest", broadside ? "shortest" : "longest");
        add_face(&t, &o[pick]);
    }
    add_legend(&t);
    out->cd_area_m2 = out->cd * out->area_m2;
    out->extrapolated = held;
    return PLUMB_OK;
}
