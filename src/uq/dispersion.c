/*
 * dispersion.c - the Monte Carlo clearance zone (include/plumb/dispersion.h,
 * README.md "plumb zone").
 *
 * Methods and sources:
 *  - Random streams: sample i of seed s uses outputs 2i+1 and 2i+2 of the
 *    splitmix64 sequence started at mix(s) (Steele, Lea & Flood, OOPSLA
 *    2014), which fill the 88-bit state of a combined Tausworthe generator
 *    with the taus88 parameters (P. L'Ecuyer, "Maximally equidistributed
 *    combined Tausworthe generators", Math. Comp. 65, 203-213, 1996; the
 *    recurrence GSL's taus2 runs). It is given to GSL as a gsl_rng_type, so
 *    GSL's samplers draw from it. Why not gsl_rng_taus2 itself: its
 *    gsl_rng_set keeps 32 bits of the seed, and 1e7 samples seeded through
 *    32 bits would share about 1e4 streams (birthday bound n^2 / 2^33).
 *  - Normal draws: gsl_ran_gaussian_ziggurat (Marsaglia & Tsang, J. Stat.
 *    Softw. 5(8), 2000). Truncation to a key's range by rejection.
 *  - Triangular draws by the inverse distribution function (S. Kotz,
 *    J. R. van Dorp, Beyond Beta, World Scientific 2004, ch. 1):
 *    x = a + sqrt(u (b-a)(c-a)) for u < (c-a)/(b-a), else
 *    x = b - sqrt((1-u)(b-a)(b-c)).
 *  - Streaming mean and covariance: B. P. Welford, Technometrics 4, 419
 *    (1962), in sample order.
 *  - Percentiles from a log-linear histogram: bin 0 holds [0, f), then each
 *    octave [f 2^k, f 2^(k+1)) is cut into 2^12 equal bins (the layout of
 *    a floating-point number, as in G. Tene's HdrHistogram), so a bin is at
 *    most 2^-12 of its value wide. The scale f = 2^-20 x (pilot median) is
 *    set from the first samples, which are kept until then; values beyond
 *    2^44 f fall into one overflow bin whose top is the exact maximum.
 *    Counts are integers, so the order of insertion does not matter.
 *  - Binomial bounds (Clopper-Pearson 1934; order-statistic intervals,
 *    David & Nagaraja 2003, sec. 7.1) from the binomial distribution itself,
 *    summed over mode +- (12 sd + 50) with the ratio recurrence
 *    pmf(j+1) / pmf(j) = (n-j) / (j+1) x p / (1-p), self-normalised (the
 *    mass outside is below 1e-30). I_x(k, n-k+1) = P(Bin(n, x) >= k) makes
 *    this the beta-quantile form of the same bounds. GSL's
 *    gsl_cdf_beta_Pinv is not used: measured here (GSL 2.7) it returns NaN
 *    for a = 5000, b = 5001 and does not return for a = b = 5e6;
 *    gsl_cdf_beta_P returns NaN for a = b = 5e6.
 *  - The 95% ellipse: chi-square with 2 degrees of freedom is exponential
 *    with mean 2, so its q-quantile is -2 ln(1 - q) (5.991 at 0.95).
 *
 * Threads: blocks of samples are handed out in order; each worker owns a
 * trajectory workspace and a sampler (its random stream) and writes its
 * block's records into a ring of slots. Blocks are merged strictly in block
 * order, under the lock, by whichever worker completes the next one, so
 * every statistic sees the samples in sample order: the result is that of
 * a serial run, for any thread count. A worker may run at most `window`
 * blocks ahead of the merge, which bounds the memory.
 *
 * This file runs the passes; the random stream (dispersion_rng.c), the
 * sampler (dispersion_sampler.c), the binomial bounds
 * (dispersion_bounds.c), the histograms (dispersion_sketch.c) and the
 * zone's settings and their check (dispersion_settings.c) are files of
 * their own, and dispersion_int.h is what they share.
 */
#include <float.h>
#include <stdarg.h>
#include <stdio.h>
#include <math.h>
#include <stddef.h>
#include <pthread.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_randist.h>

#include "uq/dispersion_int.h"

/* ---- one pass ---------------------------------------------------------- */

/* What a worker keeps of one sample. */
typedef struct rec {
    double dx, dy;           /* impact - planned release point, m */
    double energy_j, speed_m_s, time_s;
    double release_speed_m_s;/* |v0| */
    double throw_m;          /* drag-free throw from the release */
    double height_m;         /* the release height drawn, m */
    int attitude;            /* index of the attitude drawn, or -1 */
    unsigned closed;         /* bit i: descent[i] did not open before impact */
    unsigned filling;        /* bit i: descent[i] was still filling at impact */
} rec;

/* What the pilot keeps: the four histogrammed values. */
enum { PV_R = 0, PV_E, PV_DX, PV_DY, PV_N };

typedef struct slot {
    int ready;               /* computed, waiting to be merged */
    size_t first, count;     /* samples first .. first + count */
    size_t n_ok;             /* samples computed (count unless one failed) */
    plumb_status st;         /* status of sample first + n_ok when it failed */
    plumb_diag diag;
    size_t redraws[PLUMB_ZONE_MAX_INPUTS];
    size_t steps, evals;
    rec *recs;
} slot;

typedef struct pass pass;

typedef struct worker {
    pass *ps;
    plumb_sampler *sampler;
    plumb_trajectory *traj;
    pthread_t tid;
    int started;
} worker;

/* Accumulators, touched only by the merger (under the lock). */
typedef struct acc {
    size_t n;
    double me, mn, cee, cnn, cen; /* Welford: means and co-moments of (dx, dy) */
    double r_max, e_max;
    double speed_max, throw_at_max;
    double height_max;       /* the largest release height drawn */
    size_t att_n[PLUMB_MAX_ATTITUDES];
    double att_e[PLUMB_MAX_ATTITUDES], att_r[PLUMB_MAX_ATTITUDES];
    size_t exceed[PLUMB_ZONE_MAX_CRITERIA];
    size_t redraws[PLUMB_ZONE_MAX_INPUTS];
    size_t closed[PLUMB_MAX_DESCENT]; /* samples in which descent[i] did not open */
    size_t filling[PLUMB_MAX_DESCENT];/* ... in which it was still filling at impact */
    size_t steps, evals;
    sketch sk[PV_N];
    sketch skc;              /* distance from the landing centre, samples >= train */
    plumb_region *reg;       /* the landing region */
    int configured;
    size_t pilot_n;
    double *pilot;           /* PV_N x pilot_cap, column-major by quantity */
    double *scratch;         /* pilot_cap */
} acc;

struct pass {
    pthread_mutex_t mu;
    pthread_cond_t cv;
    /* configuration */
    const plumb_atmosphere *atm;
    const plumb_zone_options *opt;
    const plumb_criterion *const *crit;
    size_t n_crit;
    unsigned long seed;
    int pass_no;
    size_t n, block, nblocks, window, pilot_cap;
    size_t train;            /* samples that fix the landing centre and grid (<= pilot_cap) */
    double shift[2];         /* added to the sampled release point */
    double release[2];       /* planned release point of this pass */
    double centre[2];        /* radii from here */
    /* scheduling */
    size_t next, merged, stop;
    int abort;
    slot *slots;
    /* outcome */
    plumb_status st;
    plumb_diag diag;
    acc a;
};

/* Drag-free range from height H with components v_h, v_z (see header). */
static double ballistic_throw(const plumb_fall_spec *s)
{
    const double *v = s->velocity_m_s;
    double H = s->release_m[2];
    double g = plumb_gravity_at(&s->gravity, s->site_elevation_m + 0.5 * H);
    double vh = hypot(v[0], v[1]);
    return vh * (v[2] + sqrt(v[2] * v[2] + 2.0 * g * H)) / g;
}

/* Substream `salt` of sample `index`: n uniforms in [0, 1) from a stream
 * of its own, so that what a sample draws for its inputs is untouched by
 * the draws of the glide or the gusts (and identical for any thread count). */
#define SALT_GLIDE UINT64_C(0x676C696465) /* "glide" */
#define SALT_GUST UINT64_C(0x67757374)    /* "gust" */
static double taus_uniform(void *state)
{
    return plumbp_taus_get_double(state);
}
static void substream_uniforms(unsigned long seed, uint64_t salt, size_t index, double *u, size_t n)
{
    taus_state t;
    plumbp_taus_seed(&t, (unsigned long)((uint64_t)seed ^ plumbp_splitmix64_mix(salt)), index);
    for (size_t i = 0; i < n; i++)
        u[i] = plumbp_taus_get_double(&t);
}

static void compute_block(worker *w, slot *sl)
{
    pass *ps = w->ps;
    plumb_fall_spec spec;
    plumb_fall_result res;
    plumb_diag d;
    sl->n_ok = 0;
    sl->st = PLUMB_OK;
    sl->steps = sl->evals = 0;
    memset(sl->redraws, 0, sizeof sl->redraws);
    for (size_t k = 0; k < sl->count; k++) {
        size_t i = sl->first + k;
        plumb_diag_clear(&d);
        double vals[PLUMB_ZONE_MAX_INPUTS];
        plumb_status st = plumb_sampler_draw(w->sampler, ps->seed, i, &spec, vals, sl->redraws, &d);
                if (st == PLUMB_OK && spec.turbulence.model != PLUMB_TURB_NONE) {
            /* this sample's gusts, from a stream of its own (plumb/turbulence.h) */
            double w20 = plumb_fall_w20(&spec);
            if (w20 > 0.0) {
                taus_state ts;
                plumbp_taus_seed(
                    &ts, (unsigned long)((uint64_t)ps->seed ^ plumbp_splitmix64_mix(SALT_GUST)), i);
                plumb_turbulence_realise(&spec.turbulence, PLUMB_TURB_MODES, w20,
                                         spec.release_m[2], taus_uniform, &ts);
            }
        }
        if (st == PLUMB_OK) {
            spec.release_m[0] += ps->shift[0];
            spec.release_m[1] += ps->shift[1];
            st = plumb_trajectory_run(w->traj, &spec, ps->atm, &res, &d);
        }
        if (st != PLUMB_OK) {
            sl->st = st;
            plumbp_raise(&sl->diag, st, NULL, 0, 0, d.key[0] ? d.key : NULL,
                         "sample %zu of %zu (seed %lu): %s", i + 1, ps->n, ps->seed,
                         d.message[0] ? d.message : plumb_strerror(st));
            return;
        }
        rec *r = &sl->recs[k];
        r->dx = res.point_m[0] - ps->release[0];
        r->dy = res.point_m[1] - ps->release[1];
        if (spec.glide.mode != PLUMB_GLIDE_OFF && spec.n_descent == 0) {
            /* a plate glides sideways from its highest point (plumb/glide.h) */
            double u[2], g[2];
            substream_uniforms(ps->seed, SALT_GLIDE, i, u, 2);
            plumb_glide_offset(spec.glide.mode, res.apex_m, u[0], u[1], g);
            r->dx += g[0];
            r->dy += g[1];
        }
        r->energy_j = res.energy_j;
        r->speed_m_s = res.speed_m_s;
        r->time_s = res.time_s;
        const double *v = spec.velocity_m_s;
        r->release_speed_m_s = sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
        r->throw_m = ballistic_throw(&spec);
        r->height_m = spec.release_m[2];
        r->attitude = w->sampler->choice >= 0 ? (int)vals[w->sampler->choice] : -1;
        r->closed = r->filling = 0;
        for (size_t dv = 0; dv < spec.n_descent && dv < PLUMB_MAX_DESCENT; dv++)
            switch (plumb_fall_device_at_impact(&spec, &res, dv, NULL)) {
            case PLUMB_DEVICE_NOT_DEPLOYED: r->closed |= 1u << dv; break;
            case PLUMB_DEVICE_FILLING: r->filling |= 1u << dv; break;
            case PLUMB_DEVICE_OPEN:
            case PLUMB_DEVICE_REPLACED: break;
            }
        sl->steps += res.solver.steps;
        sl->evals += res.solver.rhs_evaluations;
        sl->n_ok = k + 1;
    }
}

static void sk_insert(acc *a, const double v[PV_N])
{
    for (int q = 0; q < PV_N; q++)
        plumbp_sk_add(&a->sk[q], v[q]);
}

/* Configures the histograms from the pilot and adds the pilot to them. */
static void configure(pass *ps)
{
    acc *a = &ps->a;
    size_t n = a->pilot_n;
    double *sorted = a->scratch + ps->pilot_cap; /* second half of scratch */
    for (int q = 0; q < PV_N; q++) {
        memcpy(sorted, a->pilot + (size_t)q * ps->pilot_cap, n * sizeof *sorted);
        plumbp_sk_configure(&a->sk[q], sorted, n, a->scratch);
    }
    for (size_t i = 0; i < n; i++) {
        double v[PV_N];
        for (int q = 0; q < PV_N; q++)
            v[q] = a->pilot[(size_t)q * ps->pilot_cap + i];
        sk_insert(a, v);
    }
    /* the landing circle: distances from the training samples' mean, the
     * scale from the training samples, the counts from the others */
    double c[2];
    plumb_region_centre(a->reg, c);
    for (size_t i = 0; i < n; i++)
        sorted[i] = hypot(ps->release[0] + a->pilot[(size_t)PV_DX * ps->pilot_cap + i] - c[0],
                          ps->release[1] + a->pilot[(size_t)PV_DY * ps->pilot_cap + i] - c[1]);
    /* sorts the first train values in place, leaves the rest */
    plumbp_sk_configure(&a->skc, sorted, ps->train < n ? ps->train : n, a->scratch);
    for (size_t i = ps->train; i < n; i++)
        plumbp_sk_add(&a->skc, sorted[i]);
    a->configured = 1;
}

/* Merges one slot's samples, in order. Called with the lock held. */
static void merge_slot(pass *ps, slot *sl)
{
    acc *a = &ps->a;
    const plumb_zone_options *opt = ps->opt;
    double off_e = ps->release[0] - ps->centre[0], off_n = ps->release[1] - ps->centre[1];
    for (size_t k = 0; k < sl->n_ok; k++) {
        const rec *r = &sl->recs[k];
        size_t i = sl->first + k;
        if (opt->on_sample) {
            plumb_zone_sample smp = {{ps->release[0] + r->dx, ps->release[1] + r->dy},
                                     r->energy_j, r->speed_m_s, r->time_s};
            if (opt->on_sample(opt->sample_user, ps->pass_no, i, &smp) != 0) {
                ps->st = PLUMB_RAISE(&ps->diag, PLUMB_EWRITE,
                                     "the sample writer stopped the run at sample %zu", i + 1);
                ps->abort = 1;
                return;
            }
        }
        a->n++;
        double nn = (double)a->n;
        double de = r->dx - a->me, dn = r->dy - a->mn;
        a->me += de / nn;
        a->mn += dn / nn;
        a->cee += de * (r->dx - a->me);
        a->cnn += dn * (r->dy - a->mn);
        a->cen += de * (r->dy - a->mn);
        double rad = hypot(r->dx + off_e, r->dy + off_n);
        if (rad > a->r_max)
            a->r_max = rad;
        if (a->n == 1 || r->energy_j > a->e_max)
            a->e_max = r->energy_j;
        if (r->attitude >= 0 && r->attitude < PLUMB_MAX_ATTITUDES) {
            size_t ak = (size_t)r->attitude;
            if (a->att_n[ak]++ == 0 || r->energy_j > a->att_e[ak])
                a->att_e[ak] = r->energy_j;
            if (rad > a->att_r[ak])
                a->att_r[ak] = rad;
        }
        for (size_t d = 0; d < PLUMB_MAX_DESCENT; d++) {
            if (r->closed & (1u << d))
                a->closed[d]++;
            if (r->filling & (1u << d))
                a->filling[d]++;
        }
        for (size_t c = 0; c < ps->n_crit; c++) {
            plumb_verdict verdict;
            plumb_criterion_judge(ps->crit[c], r->energy_j, &verdict);
            if (verdict.exceeds)
                a->exceed[c]++;
        }
        if (a->n == 1 || r->height_m > a->height_max)
            a->height_max = r->height_m;
        if (a->n == 1 || r->release_speed_m_s > a->speed_max ||
            (r->release_speed_m_s == a->speed_max && r->throw_m > a->throw_at_max)) {
            a->speed_max = r->release_speed_m_s;
            a->throw_at_max = r->throw_m;
        }
        double v[PV_N] = {rad, r->energy_j, r->dx, r->dy};
        double pe = ps->release[0] + r->dx, pn = ps->release[1] + r->dy;
        plumb_region_add(a->reg, pe, pn);
        if (a->configured) {
            sk_insert(a, v);
            double c[2];
            plumb_region_centre(a->reg, c);
            plumbp_sk_add(&a->skc, hypot(pe - c[0], pn - c[1]));
        } else {
            for (int q = 0; q < PV_N; q++)
                a->pilot[(size_t)q * ps->pilot_cap + a->pilot_n] = v[q];
            if (++a->pilot_n == ps->pilot_cap)
                configure(ps);
        }
    }
    for (size_t i = 0; i < PLUMB_ZONE_MAX_INPUTS; i++)
        a->redraws[i] += sl->redraws[i];
    a->steps += sl->steps;
    a->evals += sl->evals;
    if (sl->st != PLUMB_OK) {
        ps->st = sl->st;
        ps->diag = sl->diag;
        ps->abort = 1;
    }
}

static void *worker_main(void *arg)
{
    worker *w = arg;
    pass *ps = w->ps;
    pthread_mutex_lock(&ps->mu);
    for (;;) {
        while (!ps->abort && ps->next < ps->nblocks && ps->next < ps->stop &&
               ps->next >= ps->merged + ps->window)
            pthread_cond_wait(&ps->cv, &ps->mu);
        if (ps->abort || ps->next >= ps->nblocks || ps->next >= ps->stop)
            break;
        size_t b = ps->next++;
        slot *sl = &ps->slots[b % ps->window];
        sl->first = b * ps->block;
        sl->count = ps->n - sl->first < ps->block ? ps->n - sl->first : ps->block;
        pthread_mutex_unlock(&ps->mu);

        compute_block(w, sl);

        pthread_mutex_lock(&ps->mu);
        sl->ready = 1;
        if (sl->st != PLUMB_OK && b + 1 < ps->stop)
            ps->stop = b + 1; /* blocks after a failure are not needed */
        while (!ps->abort && ps->merged < ps->nblocks && ps->slots[ps->merged % ps->window].ready) {
            slot *m = &ps->slots[ps->merged % ps->window];
            merge_slot(ps, m);
            m->ready = 0;
            ps->merged++;
            if (ps->opt->progress && !ps->abort)
                ps->opt->progress(ps->opt->progress_user, ps->pass_no,
                                  ps->merged * ps->block < ps->n ? ps->merged * ps->block : ps->n,
                                  ps->n);
        }
        pthread_cond_broadcast(&ps->cv);
    }
    pthread_cond_broadcast(&ps->cv);
    pthread_mutex_unlock(&ps->mu);
    return NULL;
}

/* Reads a quantile and its interval from a histogram. */
static void read_quantile(const sketch *s, size_t n, double p, double level, plumb_zone_quantile *q)
{
    memset(q, 0, sizeof *q);
    q->p = p;
    double x = p * (double)n;
    double kd = ceil(x - 4.0 * DBL_EPSILON * x);
    size_t k = kd < 1.0 ? 1 : kd > (double)n ? n : (size_t)kd;
    q->value = plumbp_sk_rank(s, k);
    size_t l = 0, u = n + 1;
    (void)plumb_quantile_ranks(n, p, level, &l, &u);
    q->lo_open = l == 0;
    q->hi_open = u > n;
    q->lo = q->lo_open ? s->min : plumbp_sk_rank(s, l);
    q->hi = q->hi_open ? s->max : plumbp_sk_rank(s, u);
}

static const double radius_p[PLUMB_ZONE_RADII] = {0.5, 0.9, 0.99, 0.999};
static const double energy_p[PLUMB_ZONE_ENERGIES] = {0.5, 0.95, 0.99};

static plumb_status finish_stats(pass *ps, const plumb_fall_spec *base, const plumb_zone_spec *zone,
                                 double level, plumb_zone_stats *z, plumb_diag *diag)
{
    acc *a = &ps->a;
    if (!a->configured)
        configure(ps);
    memset(z, 0, sizeof *z);
    size_t n = a->n;
    z->samples = n;
    for (int k = 0; k < 2; k++) {
        z->release_m[k] = ps->release[k];
        z->centre_m[k] = ps->centre[k];
    }
    z->mean_m[0] = ps->release[0] + a->me;
    z->mean_m[1] = ps->release[1] + a->mn;
    if (n >= 2) {
        z->cov_m2[0] = a->cee / (double)(n - 1);
        z->cov_m2[1] = a->cnn / (double)(n - 1);
        z->cov_m2[2] = a->cen / (double)(n - 1);
    }
    z->ellipse_chi2 = -2.0 * log1p(-ELLIPSE_LEVEL);
    double see = z->cov_m2[0], snn = z->cov_m2[1], sen = z->cov_m2[2];
    double half = 0.5 * (see + snn), disc = hypot(0.5 * (see - snn), sen);
    double l1 = half + disc, l2 = half - disc;
    z->semi_major_m = sqrt(z->ellipse_chi2 * (l1 > 0.0 ? l1 : 0.0));
    z->semi_minor_m = sqrt(z->ellipse_chi2 * (l2 > 0.0 ? l2 : 0.0));
    /* major axis at angle theta from east toward north; bearing from north */
    double theta = 0.5 * atan2(2.0 * sen, see - snn);
    double bearing = fmod(90.0 - theta * DEG_PER_RAD + 2.0 * FULL_TURN_DEG, 180.0);
    z->bearing_deg = bearing >= 180.0 ? 0.0 : bearing;
    for (int i = 0; i < PLUMB_ZONE_RADII; i++)
        read_quantile(&a->sk[PV_R], n, radius_p[i], level, &z->radius[i]);
    read_quantile(&a->sk[PV_R], n, zone->confidence, level, &z->radius_conf);
    z->radius_max_m = a->r_max;
    z->scatter_m = zone->scatter_m;
    z->clearance_radius_m = z->radius_conf.hi + zone->scatter_m;
    for (int i = 0; i < PLUMB_ZONE_ENERGIES; i++)
        read_quantile(&a->sk[PV_E], n, energy_p[i], level, &z->energy[i]);
    z->energy_max_j = a->e_max;
    z->n_exceedance = ps->n_crit;
    for (size_t c = 0; c < ps->n_crit; c++) {
        plumb_zone_exceedance *x = &z->exceedance[c];
        x->criterion = ps->crit[c];
        x->count = a->exceed[c];
        x->probability = (double)x->count / (double)n;
        if (plumb_clopper_pearson(x->count, n, level, &x->lo, &x->hi) != PLUMB_OK)
            return PLUMB_RAISE(diag, PLUMB_ENUMERIC, "Clopper-Pearson interval failed");
    }
    read_quantile(&a->sk[PV_DX], n, 0.5, level, &z->displacement[0]);
    read_quantile(&a->sk[PV_DY], n, 0.5, level, &z->displacement[1]);
    /* the rules' drop height: the largest drawn when the height is uncertain */
    z->drop_height_m = a->height_max > base->release_m[2] ? a->height_max : base->release_m[2];
    z->planned_height_m = base->release_m[2];
    z->glide_ratio_max =
        base->n_descent == 0 ? plumb_glide_ratio_max(base->glide.mode) : 0.0;
    z->max_release_speed_m_s = a->speed_max;
    z->ballistic_throw_m = a->throw_at_max;
    z->landing_training = ps->train;
    plumb_region_centre(a->reg, z->landing_centre_m);
    size_t ncal = n - ps->train;
    if (ncal >= 1) {
        read_quantile(&a->skc, ncal, zone->confidence, level, &z->landing_radius);
    } else {
        z->landing_radius.p = zone->confidence;
        z->landing_radius.lo_open = z->landing_radius.hi_open = 1;
    }
    z->landing_circle_m = z->landing_radius.hi_open ? 0.0 : z->landing_radius.hi + zone->scatter_m;
    plumb_status rst = plumb_region_finish(a->reg, zone->confidence, level, zone->scatter_m,
                                           &z->landing, diag);
    if (rst != PLUMB_OK)
        return rst;
    for (size_t k = 0; k < PLUMB_MAX_ATTITUDES; k++) {
        z->attitude[k].count = a->att_n[k];
        z->attitude[k].energy_max_j = a->att_e[k];
        z->attitude[k].radius_max_m = a->att_r[k];
        if (a->att_n[k] && (!a->att_n[z->attitude_energy] || a->att_e[k] > a->att_e[z->attitude_energy]))
            z->attitude_energy = k;
        if (a->att_n[k] && (!a->att_n[z->attitude_radius] || a->att_r[k] > a->att_r[z->attitude_radius]))
            z->attitude_radius = k;
    }
    z->impact_point_fixed = a->sk[PV_DX].max - a->sk[PV_DX].min <= PLUMB_ZONE_FIXED_M &&
                            a->sk[PV_DY].max - a->sk[PV_DY].min <= PLUMB_ZONE_FIXED_M;
    z->steps = a->steps;
    z->rhs_evaluations = a->evals;
    return PLUMB_OK;
}

void plumb_zone_add_warning(plumb_zone_result *res, const char *fmt, ...)
{
    if (!res)
        return;
    va_list ap;
    va_start(ap, fmt);
    plumbp_warning_vadd(&res->warnings[0][0], PLUMB_ZONE_WARNING, PLUMB_ZONE_MAX_WARNINGS,
                        &res->n_warnings, fmt, ap);
    va_end(ap);
}

/* "3.5 %": a share of n that never reads as 0 % or 100 % when it is
 * neither. */
static void share_of(size_t k, size_t n, char *buf, size_t size)
{
    double pct = 100.0 * (double)k / (double)n;
    if (pct < 0.1)
        snprintf(buf, size, "under 0.1 %%");
    else if (pct > 99.9)
        snprintf(buf, size, "over 99.9 %%");
    else
        snprintf(buf, size, "%.1f %%", pct);
}

/* Warns of each descent device that was not fully open at impact in some
 * samples of pass 0 (the second pass, released elsewhere on the same
 * heights and times, opens the same devices): those that never opened
 * and those still filling (plumb_fall_device_at_impact), counted apart
 * and together, since the figures then mix falls under the open canopy
 * with falls without it or under a part-filled one. The counts are
 * integer sums, so they are the same for any thread count. */
/* What to give so that a zone whose impact point did not move gets one,
 * said of what the profile holds: a drag-free payload is not moved by the
 * wind (nothing in the equation of motion couples them, README.md
 * "Physics"), and a calm wind has no direction or shape to vary. */
static const char *fixed_advice(const plumb_fall_spec *base, const plumb_uncertainty *u, size_t n_u)
{
    int wind = 0, wind_speed = 0, drag_varies = 0;
    for (size_t i = 0; i < n_u; i++) {
        wind |= strncmp(u[i].key, "wind.", 5) == 0;
        wind_speed |= strcmp(u[i].key, "wind.speed") == 0;
        drag_varies |= strncmp(u[i].key, "payload.drag.", 13) == 0 ||
                       u[i].kind == PLUMB_DIST_CHOICE;
    }
    const plumb_drag_spec *d = &base->drag;
    int has_drag = d->model != PLUMB_DRAG_FIXED || base->n_descent > 0 ||
                   plumb_drag_cd_area(d, 0.0) > 0.0 || drag_varies;
    if (!wind)
        return "Give the uncertainty of the wind, the release point or the release velocity "
               "to size one.";
    if (!has_drag)
        return "The payload has no drag, so the wind, uncertain as it is, does not move it: "
               "give the uncertainty of the release point or the release velocity to size one.";
    if (!wind_speed && base->wind.profile != PLUMB_WIND_TABLE && !(base->wind.speed_m_s > 0.0))
        return "The wind is calm (wind.speed 0) and its speed is not uncertain, so its other "
               "uncertain inputs move nothing: give the uncertainty of the wind speed, the "
               "release point or the release velocity to size one.";
    return "The wind is uncertain but moves it by less than that: give the uncertainty of "
           "the release point or the release velocity to size one.";
}

static void warn_closed(plumb_zone_result *res, const plumb_fall_spec *base, const acc *a)
{
    size_t n = a->n;
    for (size_t d = 0; d < base->n_descent && d < PLUMB_MAX_DESCENT; d++) {
        size_t k = a->closed[d], f = a->filling[d];
        const char *kind = plumb_descent_kind_name(base->descent[d].kind);
        if (k + f == 0)
            continue;
        if (k == n) {
            plumb_zone_add_warning(res, "The %s (descent[%zu]) did not open before impact in "
                                   "any of the %zu samples: every figure is that of a fall "
                                   "without it.", kind, d, n);
            continue;
        }
        char share[32], share_k[32], share_f[32];
        share_of(k, n, share_k, sizeof share_k);
        if (f == 0) {
            plumb_zone_add_warning(res, "The %s (descent[%zu]) did not open before impact in "
                                   "%zu of %zu samples (%s): those land at the speed of a fall "
                                   "without it.", kind, d, k, n, share_k);
            continue;
        }
        share_of(k + f, n, share, sizeof share);
        share_of(f, n, share_f, sizeof share_f);
        plumb_zone_add_warning(res, "The %s (descent[%zu]) was not fully open at impact in %zu "
                               "of %zu samples (%s): in %zu (%s) it did not open before impact, "
                               "in %zu (%s) it was still filling. Those land faster than under "
                               "the open %s: without it, or under a part-filled canopy.",
                               kind, d, k + f, n, share, k, share_k, f, share_f, kind);
    }
}

/* Names the attitudes of a pass's statistics from the choice entry. */
static void name_attitudes(const plumb_uncertainty *u, size_t n_u, plumb_zone_stats *z)
{
    for (size_t i = 0; i < n_u; i++)
        if (u[i].kind == PLUMB_DIST_CHOICE) {
            z->n_attitudes = u[i].n_choice;
            for (size_t k = 0; k < u[i].n_choice && k < PLUMB_MAX_ATTITUDES; k++)
                plumbp_strlcpy(z->attitude[k].name, u[i].choice[k], sizeof z->attitude[k].name);
        }
}

/* Shared storage of both passes. */
typedef struct run {
    size_t threads;
    worker *w;
    slot *slots;
    rec *recs;
    uint32_t *bins;
    double *pilot, *scratch;
    plumb_region *reg;
} run;

static void run_free(run *r)
{
    if (r->w)
        for (size_t i = 0; i < r->threads; i++) {
            plumb_sampler_free(r->w[i].sampler);
            plumb_trajectory_free(r->w[i].traj);
        }
    free(r->w);
    free(r->slots);
    free(r->recs);
    free(r->bins);
    free(r->pilot);
    free(r->scratch);
    plumb_region_free(r->reg);
}

static plumb_status do_pass(run *rn, pass *ps, plumb_diag *diag)
{
    ps->next = ps->merged = 0;
    ps->stop = ps->nblocks;
    ps->abort = 0;
    ps->st = PLUMB_OK;
    acc *a = &ps->a;
    a->n = 0;
    a->me = a->mn = a->cee = a->cnn = a->cen = 0.0;
    a->r_max = a->e_max = a->speed_max = a->throw_at_max = a->height_max = 0.0;
    memset(a->exceed, 0, sizeof a->exceed);
    memset(a->redraws, 0, sizeof a->redraws);
    memset(a->closed, 0, sizeof a->closed);
    memset(a->filling, 0, sizeof a->filling);
    memset(a->att_n, 0, sizeof a->att_n);
    memset(a->att_e, 0, sizeof a->att_e);
    memset(a->att_r, 0, sizeof a->att_r);
    a->steps = a->evals = 0;
    for (int q = 0; q < PV_N; q++)
        plumbp_sk_reset(&a->sk[q]);
    plumbp_sk_reset(&a->skc);
    a->configured = 0;
    plumb_status rst = plumb_region_reset(a->reg, ps->train, diag);
    if (rst != PLUMB_OK)
        return rst;
    a->pilot_n = 0;
    for (size_t i = 0; i < ps->window; i++)
        ps->slots[i].ready = 0;
    if (pthread_mutex_init(&ps->mu, NULL) != 0)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "cannot make a mutex");
    if (pthread_cond_init(&ps->cv, NULL) != 0) {
        pthread_mutex_destroy(&ps->mu);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "cannot make a condition variable");
    }
    size_t t = rn->threads < ps->nblocks ? rn->threads : ps->nblocks;
    for (size_t i = 0; i < t; i++) {
        rn->w[i].ps = ps;
        rn->w[i].started = 0;
    }
    /* Thread 0 is this one; a thread that cannot be started is left out
     * (fewer threads change the speed, not the result). */
    for (size_t i = 1; i < t; i++)
        rn->w[i].started = pthread_create(&rn->w[i].tid, NULL, worker_main, &rn->w[i]) == 0;
    worker_main(&rn->w[0]);
    for (size_t i = 1; i < t; i++)
        if (rn->w[i].started)
            pthread_join(rn->w[i].tid, NULL);
    pthread_cond_destroy(&ps->cv);
    pthread_mutex_destroy(&ps->mu);
    if (ps->st != PLUMB_OK) {
        if (diag)
            *diag = ps->diag;
        return ps->st;
    }
    if (a->n != ps->n)
        return PLUMB_RAISE(diag, PLUMB_ENUMERIC, "the zone merged %zu of %zu samples", a->n, ps->n);
    return PLUMB_OK;
}

plumb_status plumb_zone_run(const plumb_fall_spec *base, const plumb_atmosphere *atm,
                            const plumb_uncertainty *u, size_t n_u,
                            const plumb_zone_spec *zone,
                            const plumb_criterion *const *criteria, size_t n_crit,
                            const plumb_zone_options *opt_in, plumb_zone_result *res,
                            plumb_diag *diag)
{
    if (!base || !atm || !zone || !res || (n_crit > 0 && !criteria))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_zone_run: NULL argument");
    plumb_zone_options opt;
    if (opt_in)
        opt = *opt_in;
    else
        plumb_zone_options_init(&opt);
    plumb_status st = plumb_zone_check(zone, &opt, diag);
    if (st != PLUMB_OK)
        return st;
    if (n_crit > PLUMB_ZONE_MAX_CRITERIA)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "criteria",
                               "%zu criteria; at most %d are judged", n_crit,
                               PLUMB_ZONE_MAX_CRITERIA);
    for (size_t c = 0; c < n_crit; c++)
        if (!criteria[c])
            return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "criteria", "criterion %zu is NULL", c);

    run rn;
    memset(&rn, 0, sizeof rn);
    rn.threads = opt.threads ? opt.threads : plumb_zone_default_threads();
    pass ps;
    memset(&ps, 0, sizeof ps);
    ps.n = zone->samples;
    ps.block = opt.block_samples;
    ps.nblocks = (ps.n + ps.block - 1) / ps.block;
    if (rn.threads > ps.nblocks)
        rn.threads = ps.nblocks;
    ps.window = ZONE_WINDOW_PER_THREAD * rn.threads;
    ps.pilot_cap = opt.pilot_samples < ps.n ? opt.pilot_samples : ps.n;
    ps.train = ps.n / 4 > 1 ? ps.n / 4 : 1;
    if (ps.train > ps.pilot_cap)
        ps.train = ps.pilot_cap;
    if (ps.train > PLUMB_REGION_MAX_TRAINING)
        ps.train = PLUMB_REGION_MAX_TRAINING;

    /* Workers: a sampler (checks the entries) and a workspace each. */
    rn.w = calloc(rn.threads, sizeof *rn.w);
    if (!rn.w)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    for (size_t i = 0; i < rn.threads && st == PLUMB_OK; i++) {
        st = plumb_sampler_alloc(base, u, n_u, opt.source, &rn.w[i].sampler, diag);
        if (st == PLUMB_OK && (st = plumb_trajectory_alloc(&opt.trajectory, &rn.w[i].traj)) != PLUMB_OK)
            PLUMB_RAISE(diag, st, "cannot make a trajectory workspace: %s", plumb_strerror(st));
    }
    if (st == PLUMB_OK) {
        rn.slots = calloc(ps.window, sizeof *rn.slots);
        rn.recs = calloc(ps.window * ps.block, sizeof *rn.recs);
        rn.bins = calloc(7 * SK_SIDE, sizeof *rn.bins);
        if (plumb_region_alloc(&rn.reg, diag) != PLUMB_OK)
            st = PLUMB_ENOMEM;
        rn.pilot = calloc(PV_N * ps.pilot_cap, sizeof *rn.pilot);
        rn.scratch = calloc(2 * ps.pilot_cap, sizeof *rn.scratch);
        if (st == PLUMB_OK && (!rn.slots || !rn.recs || !rn.bins || !rn.pilot || !rn.scratch))
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory for the zone's histograms");
    }
    if (st != PLUMB_OK) {
        run_free(&rn);
        return st;
    }
    for (size_t i = 0; i < ps.window; i++)
        rn.slots[i].recs = rn.recs + i * ps.block;
    ps.slots = rn.slots;
    ps.a.pilot = rn.pilot;
    ps.a.scratch = rn.scratch;
    uint32_t *bins = rn.bins;
    for (int q = 0; q < PV_N; q++) {
        sketch *s = &ps.a.sk[q];
        s->two_sided = q == PV_DX || q == PV_DY;
        s->pos = bins;
        bins += SK_SIDE;
        if (s->two_sided) {
            s->neg = bins;
            bins += SK_SIDE;
        }
    }
    ps.a.skc.pos = bins;
    ps.a.reg = rn.reg;
    ps.atm = atm;
    ps.opt = &opt;
    ps.crit = criteria;
    ps.n_crit = n_crit;
    ps.seed = zone->seed;

    memset(res, 0, sizeof *res);
    res->samples = zone->samples;
    res->seed = zone->seed;
    res->confidence = zone->confidence;
    res->ci_level = opt.ci_level;
    res->gust_model = (int)base->turbulence.model;
    res->gust_w20_m_s = plumb_fall_w20(base);

    /* Pass 0: released at the planned point, radii from it. */
    ps.pass_no = 0;
    ps.release[0] = ps.centre[0] = base->release_m[0];
    ps.release[1] = ps.centre[1] = base->release_m[1];
    st = do_pass(&rn, &ps, diag);
    if (st == PLUMB_OK)
        st = finish_stats(&ps, base, zone, opt.ci_level, &res->zone, diag);
    if (st == PLUMB_OK)
        name_attitudes(u, n_u, &res->zone);
    if (st == PLUMB_OK) {
        const plumb_sampler *s0 = rn.w[0].sampler;
        res->n_inputs = n_u;
        for (size_t i = 0; i < n_u; i++) {
            plumb_zone_input *in = &res->inputs[i];
            plumbp_strlcpy(in->key, u[i].key, sizeof in->key);
            in->kind = u[i].kind;
            memcpy(in->param, u[i].param, sizeof in->param);
            in->truncated = plumb_sampler_truncated(s0, i, &in->lower, &in->upper);
            in->redraws = ps.a.redraws[i];
            in->n_choice = u[i].n_choice;
            memcpy(in->choice, u[i].choice, sizeof in->choice);
            memcpy(in->weight, u[i].weight, sizeof in->weight);
            memcpy(in->choice_drag, u[i].choice_drag, sizeof in->choice_drag);
        }
        if (res->zone.impact_point_fixed)
            plumb_zone_add_warning(
                res, "impact_point_fixed: the uncertain inputs do not move the impact point "
                     "(every sample lands within " PLUMBP_Q_SMALL " of the same point), so the radii are "
                     "the drift of one fall, not a zone. %s",
                PLUMB_ZONE_FIXED_M, fixed_advice(base, u, n_u));
        warn_closed(res, base, &ps.a);
    }
    /* Pass 1: released where the median impact falls on the target. */
    if (st == PLUMB_OK && zone->has_target) {
        res->has_target = 1;
        for (int k = 0; k < 2; k++) {
            res->target_m[k] = zone->target_m[k];
            res->aim_release_m[k] = zone->target_m[k] - res->zone.displacement[k].value;
            ps.release[k] = res->aim_release_m[k];
            ps.centre[k] = zone->target_m[k];
            ps.shift[k] = res->aim_release_m[k] - base->release_m[k];
        }
        ps.pass_no = 1;
        st = do_pass(&rn, &ps, diag);
        if (st == PLUMB_OK)
            st = finish_stats(&ps, base, zone, opt.ci_level, &res->at_target, diag);
        if (st == PLUMB_OK)
            name_attitudes(u, n_u, &res->at_target);
    }
    run_free(&rn);
    return st;
}
