/*
 * brief.c - everything a printed sheet says about one profile, gathered
 * from one study (include/plumb/brief.h). The figures are the study's: the
 * falls of plumb fall, the limits of plumb limit (plumb_limit_solve on
 * release.height), the zone of plumb zone. What is added here is only
 * what a picture needs: the path of each plotted fall (the integrator's
 * accepted points), the drag-free path of the same release in closed form,
 * impact energy at a series of drop heights, and the impact points of the
 * item that sets the zone.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/brief.h"
#include "plumb/constants.h"
#include "core/internal.h"
#include "study/study_internal.h"
#include "solve/inverse_internal.h"

/* Points of the drag-free path (closed form, evenly spaced in time). */
#define FREE_POINTS 64
/* The energy curve runs to this many times the planned height at least, and
 * past a limit height found below LIMIT_REACH times it by LIMIT_MARGIN;
 * every plotted item's curve runs to the largest of these heights. */
#define CURVE_SPAN 2.0
#define LIMIT_REACH 10.0
#define LIMIT_MARGIN 1.25
/* Impact points kept per pass by default. */
#define DEFAULT_MAX_POINTS 20000u

void plumb_brief_options_init(plumb_brief_options *opt)
{
    memset(opt, 0, sizeof *opt);
    opt->zone = 1;
    opt->max_points = DEFAULT_MAX_POINTS;
}

static void path_free(plumb_brief_path *p)
{
    free(p->d_m);
    free(p->z_m);
    p->d_m = p->z_m = NULL;
    p->n = 0;
}

void plumb_brief_free(plumb_brief *b)
{
    if (!b)
        return;
    for (size_t i = 0; i < b->n_plots; i++) {
        path_free(&b->plots[i].path);
        path_free(&b->plots[i].drag_free);
    }
    free(b->order);
    free(b->points_m[0]);
    free(b->points_m[1]);
    free(b);
}

static int path_alloc(plumb_brief_path *p, size_t n)
{
    p->n = n;
    p->d_m = calloc(n ? n : 1, sizeof *p->d_m);
    p->z_m = calloc(n ? n : 1, sizeof *p->z_m);
    return p->d_m && p->z_m;
}

/* How bad an item is: its largest ratio to a criterion (its energy when it
 * is judged against none). */
static double badness(const plumb_item_report *it)
{
    if (it->n_verdicts == 0)
        return it->result.energy_j;
    double r = 0.0;
    for (size_t k = 0; k < it->n_verdicts; k++)
        if (it->verdicts[k].ratio > r)
            r = it->verdicts[k].ratio;
    return r;
}

/* An item's place in the worst-first order. */
typedef struct rank_key {
    size_t item;
    double badness, energy_j;
} rank_key;

static int worst_first(const void *a, const void *b)
{
    const rank_key *x = a, *y = b;
    if (x->badness != y->badness)
        return x->badness > y->badness ? -1 : 1;
    if (x->energy_j != y->energy_j)
        return x->energy_j > y->energy_j ? -1 : 1;
    return x->item < y->item ? -1 : x->item > y->item;
}

/* The plotted fall's path, projected on the vertical plane through the
 * release and impact points, and the drag-free path of the same release. */
static plumb_status make_paths(const plumb_study *study, plumb_trajectory *traj,
                               const plumb_item_report *it, plumb_brief_plot *pl, plumb_diag *diag)
{
    const plumb_fall_spec *s = it->spec;
    plumb_fall_result res;
    plumb_status st = plumb_trajectory_run(traj, s, plumb_study_atmosphere(study), &res, diag);
    if (st != PLUMB_OK)
        return st;
    size_t n = 0;
    const plumb_path_point *pts = plumb_trajectory_path(traj, &n);
    double dx = res.point_m[0] - s->release_m[0], dy = res.point_m[1] - s->release_m[1];
    double len = hypot(dx, dy), ux = 0.0, uy = 1.0;
    if (len > 0.0) {
        ux = dx / len;
        uy = dy / len;
    } else if (hypot(s->velocity_m_s[0], s->velocity_m_s[1]) > 0.0) {
        double v = hypot(s->velocity_m_s[0], s->velocity_m_s[1]);
        ux = s->velocity_m_s[0] / v;
        uy = s->velocity_m_s[1] / v;
    }
    if (!path_alloc(&pl->path, n))
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    for (size_t i = 0; i < n; i++) {
        pl->path.d_m[i] = (pts[i].x_m - s->release_m[0]) * ux + (pts[i].y_m - s->release_m[1]) * uy;
        pl->path.z_m[i] = pts[i].z_m;
    }
    pl->n_deploy = 0;
    for (size_t dev = 0; dev < s->n_descent && dev < PLUMB_MAX_DESCENT; dev++) {
        if (!res.deployed[dev])
            continue;
        size_t k = pl->n_deploy++;
        double zd = res.deploy_height_m[dev];
        pl->deploy_device[k] = dev;
        pl->deploy_z_m[k] = zd;
        /* the distance along the path where it passes the deploy height */
        pl->deploy_d_m[k] = 0.0;
        for (size_t i = 1; i < n; i++)
            if (pts[i].z_m <= zd) {
                double z0 = pl->path.z_m[i - 1], z1 = pl->path.z_m[i];
                double f = z0 != z1 ? (z0 - zd) / (z0 - z1) : 0.0;
                pl->deploy_d_m[k] = pl->path.d_m[i - 1] + f * (pl->path.d_m[i] - pl->path.d_m[i - 1]);
                break;
            }
    }
    /* drag-free: z = H + w t - g t^2 / 2, d = u t, with g at the strike level */
    double g = plumb_gravity_at(&s->gravity, s->site_elevation_m);
    double H = s->release_m[2], w = s->velocity_m_s[2];
    double u = s->velocity_m_s[0] * ux + s->velocity_m_s[1] * uy;
    double T = (w + sqrt(w * w + 2.0 * g * H)) / g;
    if (!path_alloc(&pl->drag_free, FREE_POINTS))
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    for (size_t i = 0; i < FREE_POINTS; i++) {
        double t = T * (double)i / (double)(FREE_POINTS - 1);
        pl->drag_free.d_m[i] = u * t;
        pl->drag_free.z_m[i] = i + 1 == FREE_POINTS ? 0.0 : H + w * t - 0.5 * g * t * t;
    }
    return PLUMB_OK;
}

/* For each criterion of the item, the drop height at which its limit is
 * reached (plumb limit --find release.height); *top is raised to the
 * height its curve should reach: past the planned one and the limits
 * found. */
static plumb_status make_limits(plumb_study *study, const plumb_item_report *it,
                                plumb_brief_plot *pl, double *top, plumb_diag *diag)
{
    const plumb_profile *prof = plumb_study_profile(study);
    plumb_trajectory *traj = plumbp_study_trajectory(study);
    double H = it->spec->release_m[2];
    if (CURVE_SPAN * H > *top)
        *top = CURVE_SPAN * H;
    pl->n_limits = it->n_verdicts;
    /* one scan of the heights for every criterion (plumbp_limit_solve_many) */
    double lim[PLUMB_MAX_VERDICTS];
    plumb_status sts[PLUMB_MAX_VERDICTS];
    plumb_diag ds[PLUMB_MAX_VERDICTS];
    for (size_t k = 0; k < it->n_verdicts; k++) {
        lim[k] = it->verdicts[k].criterion->energy_limit_j;
        plumb_diag_clear(&ds[k]);
    }
    plumbp_limit_solve_many(prof, plumbp_study_units(study), pl->item, "release.height",
                            PLUMB_METRIC_ENERGY, lim, it->n_verdicts, NULL, traj, pl->limits, sts,
                            ds);
    for (size_t k = 0; k < it->n_verdicts; k++) {
        plumb_limit_result *r = &pl->limits[k];
        if (sts[k] != PLUMB_OK) {
            if (diag)
                *diag = ds[k];
            return sts[k];
        }
        if (r->outcome == PLUMB_LIMIT_FOUND && r->value_si < LIMIT_REACH * H &&
            LIMIT_MARGIN * r->value_si > *top)
            *top = LIMIT_MARGIN * r->value_si;
    }
    return PLUMB_OK;
}

/* The item's energy at a series of heights from 0 to top: every plotted
 * item over the same heights, so that no curve stops short of another. */
static void make_curve(plumb_study *study, const plumb_item_report *it, plumb_brief_plot *pl,
                       double top)
{
    plumb_trajectory *traj = plumbp_study_trajectory(study);
    pl->n_curve = PLUMB_BRIEF_CURVE;
    /* from zero height, where the impact energy is the release's kinetic
     * energy 1/2 m |v0|^2 (no fall, nothing to integrate) */
    const double *v0 = it->spec->velocity_m_s;
    pl->curve_h_m[0] = 0.0;
    pl->curve_e_j[0] = 0.5 * it->spec->mass_kg * (v0[0] * v0[0] + v0[1] * v0[1] + v0[2] * v0[2]);
    pl->curve_ok[0] = 1;
    for (size_t i = 1; i < PLUMB_BRIEF_CURVE; i++) {
        plumb_fall_spec s = *it->spec;
        double h = top * (double)i / (double)(PLUMB_BRIEF_CURVE - 1);
        double *f = plumb_fall_spec_field(&s, "release.height");
        pl->curve_h_m[i] = h;
        if (!f) {
            pl->curve_ok[i] = 0;
            continue;
        }
        *f = h;
        plumb_fall_result res;
        plumb_diag d;
        plumb_diag_clear(&d);
        pl->curve_ok[i] = plumb_trajectory_run(traj, &s, plumb_study_atmosphere(study), &res, &d) ==
                              PLUMB_OK &&
                          isfinite(res.energy_j);
        pl->curve_e_j[i] = pl->curve_ok[i] ? res.energy_j : 0.0;
    }
}

/* ---- the zone's impact points ------------------------------------------------ */

typedef struct points_ctx {
    size_t item, n_items, max;
    size_t *n;          /* [item * 2 + pass] */
    double **pts;       /* [item * 2 + pass], max pairs each */
    int failed;
} points_ctx;

static void on_item(void *user, size_t item, const plumb_fall_spec *spec)
{
    (void)spec;
    ((points_ctx *)user)->item = item;
}

static int on_sample(void *user, int pass, size_t index, const plumb_zone_sample *smp)
{
    points_ctx *c = user;
    (void)index;
    size_t slot = c->item * 2 + (size_t)(pass != 0);
    if (c->n[slot] >= c->max)
        return 0;
    if (!c->pts[slot] && !(c->pts[slot] = malloc(c->max * 2 * sizeof(double)))) {
        c->failed = 1;
        return 1;
    }
    c->pts[slot][2 * c->n[slot]] = smp->point_m[0];
    c->pts[slot][2 * c->n[slot] + 1] = smp->point_m[1];
    c->n[slot]++;
    return 0;
}

static plumb_status make_zone(plumb_study *study, const plumb_brief_options *opt, plumb_brief *b,
                              plumb_diag *diag)
{
    const plumb_profile *prof = b->profile;
    if (!opt->zone) {
        plumbp_strlcpy(b->no_zone, "no clearance zone: not asked for", sizeof b->no_zone);
        return PLUMB_OK;
    }
    if (plumb_profile_uncertainty_count(prof) == 0) {
        plumbp_strlcpy(b->no_zone, "no clearance zone: inputs carry no uncertainty",
                       sizeof b->no_zone);
        return PLUMB_OK;
    }
    plumb_zone_spec zone = *plumb_profile_zone(prof);
    if (opt->samples)
        zone.samples = opt->samples;
    if (opt->has_seed)
        zone.seed = opt->seed;
    plumb_zone_options zopt;
    plumb_zone_options_init(&zopt);
    zopt.threads = opt->threads;
    size_t n = b->fall->n_items;
    points_ctx pc = {0, n, opt->max_points ? opt->max_points : DEFAULT_MAX_POINTS,
                     calloc(2 * n, sizeof(size_t)), calloc(2 * n, sizeof(double *)), 0};
    plumb_status st = PLUMB_OK;
    if (!pc.n || !pc.pts)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    zopt.on_sample = on_sample;
    zopt.sample_user = &pc;
    if (st == PLUMB_OK)
        st = plumb_study_zone(study, &zone, &zopt, on_item, &pc, &b->zone, diag);
    if (st != PLUMB_OK && pc.failed)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory keeping the impact points");
    if (st == PLUMB_OK) {
        /* the item that sets the zone: the largest clearance radius */
        size_t z = 0;
        for (size_t i = 1; i < b->zone->n_items; i++)
            if (b->zone->items[i].result->zone.clearance_radius_m >
                b->zone->items[z].result->zone.clearance_radius_m)
                z = i;
        b->zone_item = z;
        for (int p = 0; p < 2; p++) {
            b->n_points[p] = pc.n[z * 2 + (size_t)p];
            b->points_m[p] = pc.pts[z * 2 + (size_t)p];
            pc.pts[z * 2 + (size_t)p] = NULL;
        }
    } else {
        b->zone = NULL;
    }
    for (size_t i = 0; pc.pts && i < 2 * n; i++)
        free(pc.pts[i]);
    free(pc.pts);
    free(pc.n);
    return st;
}

double plumb_brief_zone_falls(const plumb_study *study, const plumb_brief_options *opt)
{
    const plumb_profile *prof = plumb_study_profile(study);
    if ((opt && !opt->zone) || plumb_profile_uncertainty_count(prof) == 0)
        return 0.0;
    const plumb_zone_spec *z = plumb_profile_zone(prof);
    double samples = (double)(opt && opt->samples ? opt->samples : z->samples);
    return samples * (double)plumb_profile_item_count(prof) * (z->has_target ? 2.0 : 1.0);
}

plumb_status plumb_brief_alloc(plumb_study *study, const plumb_brief_options *opt, plumb_brief **out,
                              plumb_diag *diag)
{
    *out = NULL;
    plumb_brief_options def;
    if (!opt) {
        plumb_brief_options_init(&def);
        opt = &def;
    }
    plumb_brief *b = calloc(1, sizeof *b);
    if (!b)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    b->study = study;
    b->profile = plumb_study_profile(study);
    plumb_status st = plumb_study_fall(study, &b->fall, diag);
    size_t n = st == PLUMB_OK ? b->fall->n_items : 0;
    if (st == PLUMB_OK && !(b->order = calloc(n ? n : 1, sizeof *b->order)))
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    if (st == PLUMB_OK) {
        rank_key *keys = calloc(n ? n : 1, sizeof *keys);
        if (!keys) {
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
        } else {
            for (size_t i = 0; i < n; i++)
                keys[i] = (rank_key){i, badness(&b->fall->items[i]),
                                     b->fall->items[i].result.energy_j};
            qsort(keys, n, sizeof *keys, worst_first);
            for (size_t i = 0; i < n; i++)
                b->order[i] = keys[i].item;
            free(keys);
        }
        /* the criteria judged, once each */
        for (size_t i = 0; i < n; i++)
            for (size_t k = 0; k < b->fall->items[i].n_verdicts; k++) {
                const plumb_criterion *c = b->fall->items[i].verdicts[k].criterion;
                size_t j = 0;
                while (j < b->n_criteria && b->criteria[j] != c)
                    j++;
                if (j == b->n_criteria && j < PLUMB_MAX_VERDICTS)
                    b->criteria[b->n_criteria++] = c;
            }
    }
    plumb_trajectory *traj = NULL;
    plumb_trajectory_options topt;
    plumb_trajectory_options_init(&topt);
    topt.record_path = 1;
    if (st == PLUMB_OK && plumb_trajectory_alloc(&topt, &traj) != PLUMB_OK)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    double top = 0.0; /* the height every curve reaches */
    for (size_t i = 0; st == PLUMB_OK && i < n && i < PLUMB_BRIEF_PLOTTED; i++) {
        plumb_brief_plot *pl = &b->plots[b->n_plots++];
        pl->item = b->order[i];
        st = make_paths(study, traj, &b->fall->items[pl->item], pl, diag);
        if (st == PLUMB_OK)
            st = make_limits(study, &b->fall->items[pl->item], pl, &top, diag);
    }
    for (size_t i = 0; st == PLUMB_OK && i < b->n_plots; i++)
        make_curve(study, &b->fall->items[b->plots[i].item], &b->plots[i], top);
    plumb_trajectory_free(traj);
    if (st == PLUMB_OK)
        st = make_zone(study, opt, b, diag);
    if (st != PLUMB_OK) {
        plumb_brief_free(b);
        return st;
    }
    *out = b;
    return PLUMB_OK;
}
