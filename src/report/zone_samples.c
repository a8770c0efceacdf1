/*
 * zone_samples.c - the per-sample file of a zone (plumb zone --samples-out;
 * plumb_report_zone_samples_head and plumb_report_zone_sample in
 * plumb/report.h): CSV (RFC 4180), the cautions as leading "# " lines,
 * then one row per sample as plumb_zone_run hands them over, in SI units
 * with 17 significant digits, the fewest that read back any IEEE 754
 * double exactly (IEEE 754-2008, clause 5.12.2: 17 significant decimal
 * digits for binary64).
 */
#include <math.h>
#include <stdio.h>

#include "plumb/report.h"
#include "report/textout.h"

/* Significant digits of every number. */
#define SAMPLE_DIGITS 17

plumb_status plumb_report_zone_samples_head(FILE *out, plumb_diag *diag)
{
    writer w = {.f = out};
    size_t nc;
    const char *const *c = plumb_cautions(&nc);
    for (size_t i = 0; i < nc; i++)
        csv_comment(&w, c[i]);
    put(&w, "# every sample of plumb zone, in sample order, numbered from 1, SI units; pass 0 is "
            "released at the planned point, pass 1 at the point aimed at the target\n"
            "item,pass,sample,east_m,north_m,energy_j,speed_m_s,time_s\n");
    if (ferror(out))
        return PLUMB_RAISE(diag, PLUMB_EWRITE, "cannot write the samples");
    return PLUMB_OK;
}

plumb_status plumb_report_zone_sample(FILE *out, const char *item, int pass, size_t index,
                                      const plumb_zone_sample *smp, plumb_diag *diag)
{
    const double v[5] = {smp->point_m[0], smp->point_m[1], smp->energy_j, smp->speed_m_s,
                         smp->time_s};
    for (size_t k = 0; k < 5; k++)
        if (!isfinite(v[k]))
            return PLUMB_RAISE(diag, PLUMB_ENUMERIC,
                               "sample %zu of pass %d is not a finite number; nothing is written",
                               index + 1, pass);
    writer w = {.f = out};
    csv_field(&w, item ? item : "");
    put(&w, ",%d,%zu", pass, index + 1);
    for (size_t k = 0; k < 5; k++)
        put(&w, ",%.*g", SAMPLE_DIGITS, v[k]);
    put(&w, "\n");
    if (ferror(out))
        return PLUMB_RAISE(diag, PLUMB_EWRITE, "cannot write the samples");
    return PLUMB_OK;
}
