/*
 * dispersion_settings.c - the zone's run options and the check of its
 * settings before a run (include/plumb/dispersion.h): the sample count,
 * seed, confidence, scatter and target, and the least number of samples
 * that bounds the confidence radius (dispersion_bounds.c).
 */
#include <math.h>
#include <string.h>
#include <unistd.h>

#include "uq/dispersion_int.h"

void plumb_zone_options_init(plumb_zone_options *opt)
{
    memset(opt, 0, sizeof *opt);
    opt->threads = 0;
    plumb_trajectory_options_init(&opt->trajectory);
    opt->ci_level = ZONE_CI_LEVEL;
    opt->block_samples = ZONE_BLOCK;
    opt->pilot_samples = ZONE_PILOT;
}

size_t plumb_zone_default_threads(void)
{
    long n = sysconf(_SC_NPROCESSORS_ONLN);
    return n >= 1 ? (size_t)n : 1;
}

plumb_status plumb_zone_check(const plumb_zone_spec *z, const plumb_zone_options *opt,
                              plumb_diag *diag)
{
    plumb_zone_options dflt;
    const plumb_zone_options *o = opt;
    if (!o) {
        plumb_zone_options_init(&dflt);
        o = &dflt;
    }
    if (!z)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_zone_check: NULL argument");
    if (z->samples < 1 || z->samples > PLUMB_ZONE_MAX_SAMPLES)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.samples",
                               "expected 1 to %u samples, found %zu", PLUMB_ZONE_MAX_SAMPLES,
                               z->samples);
    if ((double)z->seed > PLUMB_ZONE_MAX_SEED)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.seed",
                               "expected a seed from 0 to 2^53-1");
    if (!(z->confidence > 0.0 && z->confidence < 1.0))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.confidence",
                               "expected 0 < confidence < 1, found %g", z->confidence);
    if (!(z->scatter_m >= 0.0) || !isfinite(z->scatter_m))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.scatter",
                               "expected a length >= 0 m, found %g m", z->scatter_m);
    if (z->has_target && (!isfinite(z->target_m[0]) || !isfinite(z->target_m[1])))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.target", "the target must be finite");
    if (!(o->ci_level > 0.0 && o->ci_level < 1.0))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "the interval level must lie in (0, 1), found %g",
                           o->ci_level);
    if (o->block_samples < 1 || o->pilot_samples < 1)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "block and pilot sizes must be >= 1");
    size_t need = plumb_zone_min_samples(z->confidence, o->ci_level);
    if (z->samples < need)
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "zone.samples",
                               "%zu sample%s cannot bound the %g %% radius at %g %% confidence; "
                               "at least %zu are needed", z->samples, plumbp_s(z->samples),
                               100.0 * z->confidence,
                               100.0 * o->ci_level, need);
    return PLUMB_OK;
}
