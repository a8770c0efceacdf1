/*
 * cli_zone.c - what `plumb zone` needs around the run (src/cli/cli_zone.h):
 * its option values, its progress and time estimate on standard error,
 * and the --samples-out file written beside its destination and renamed
 * into place. The run itself is the study's (plumb_study_zone).
 */
#include <errno.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

#include "cli.h"
#include "cli_zone.h"

/* Progress appears after this long, and is redrawn at most this often, s. */
#define PROGRESS_AFTER_S 1.0
/* Digits of the per-sample CSV: 17 read back any double exactly. */
#define SAMPLE_DIGITS 17
/* Percent per unit fraction. */
#define PERCENT 100.0
/* Most threads --threads accepts. */
#define MAX_THREADS 1024u
/* Largest seed: integers up to 2^53 - 1 read back exactly from JSON
 * (IEEE 754 double, the number type of most JSON readers). */
#define MAX_SEED 9007199254740991.0

plumb_status plumbp_cli_nomem(plumb_diag *diag)
{
    plumb_diag_clear(diag);
    diag->status = PLUMB_ENOMEM;
    snprintf(diag->message, sizeof diag->message, "out of memory");
    return PLUMB_ENOMEM;
}

/* ---- option values ---------------------------------------------------------- */

static plumb_status opt_error(plumb_diag *diag, const char *option, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 3, 4)))
#endif
    ;

static plumb_status opt_error(plumb_diag *diag, const char *option, const char *fmt, ...)
{
    plumb_diag_clear(diag);
    diag->status = PLUMB_EINVAL;
    snprintf(diag->file, sizeof diag->file, "<command line>");
    snprintf(diag->key, sizeof diag->key, "%s", option);
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(diag->message, sizeof diag->message, fmt, ap);
    va_end(ap);
    return PLUMB_EINVAL;
}

/* A whole number in [lo, hi]: digits, or a number in exponent form that is
 * a whole number ("1e5"). */
plumb_status cli_zone_parse_whole(const char *option, const char *text, double lo, double hi,
                                double *out, plumb_diag *diag)
{
    char *end = NULL;
    errno = 0;
    double v = text[0] == '\0' || text[0] == ' ' ? 0.0 : strtod(text, &end);
    if (text[0] == '\0' || text[0] == ' ' || !end || *end != '\0' || errno == ERANGE ||
        !(v == v) || v != (double)(long long)v || v < lo || v > hi)
        return opt_error(diag, option, "expected a whole number from %.0f to %.0f, found '%s'", lo,
                         hi, text);
    *out = v;
    return PLUMB_OK;
}

/* A fraction 0 < p < 1, or a percent "99.9%". */
plumb_status cli_zone_parse_confidence(const char *text, double *out, plumb_diag *diag)
{
    char *end = NULL;
    errno = 0;
    double v = text[0] ? strtod(text, &end) : 0.0;
    int percent = end && *end == '%' && end[1] == '\0';
    if (!text[0] || !end || (*end != '\0' && !percent) || errno == ERANGE)
        return opt_error(diag, "--confidence", "expected a fraction such as 0.99 or a percent "
                                               "such as 99%%, found '%s'", text);
    if (percent)
        v /= PERCENT;
    if (!(v > 0.0 && v < 1.0))
        return opt_error(diag, "--confidence", "expected 0 < confidence < 1 (0 %% to 100 %%), "
                                               "found '%s'", text);
    *out = v;
    return PLUMB_OK;
}

/* The unit part of "NUMBER UNIT", spaces trimmed, into buf. */
static void unit_part(const char *text, char *buf, size_t size)
{
    char *end = NULL;
    (void)strtod(text, &end);
    const char *u = end ? end : text;
    while (*u == ' ')
        u++;
    snprintf(buf, size, "%s", u);
    size_t n = strlen(buf);
    while (n > 0 && buf[n - 1] == ' ')
        buf[--n] = '\0';
}

/* "E,N", each a length with its unit, both in the same unit. */
plumb_status cli_zone_parse_target(const plumb_units *units, const char *text, double out[2],
                                 plumb_diag *diag)
{
    const char *comma = strchr(text, ',');
    if (!comma || strchr(comma + 1, ','))
        return opt_error(diag, "--target", "expected EAST,NORTH with units, e.g. 40m,-12m, "
                                           "found '%s'", text);
    char part[2][PLUMB_DIAG_MSG / 2];
    snprintf(part[0], sizeof part[0], "%.*s", (int)(comma - text), text);
    snprintf(part[1], sizeof part[1], "%s", comma + 1);
    char unit[2][64];
    for (int k = 0; k < 2; k++) {
        plumb_diag d;
        plumb_diag_clear(&d);
        if (plumb_units_parse(units, part[k], PLUMB_DIM_LENGTH, &out[k], &d) != PLUMB_OK)
            return opt_error(diag, "--target", "%s: %s", k == 0 ? "east" : "north",
                             d.message[0] ? d.message : "expected a length with its unit");
        unit_part(part[k], unit[k], sizeof unit[k]);
    }
    if (strcmp(unit[0], unit[1]) != 0)
        return opt_error(diag, "--target", "east and north in different units ('%s' and '%s'); "
                                           "give both in one unit", unit[0], unit[1]);
    return PLUMB_OK;
}

/* ---- progress ---------------------------------------------------------------- */


static double since(const struct timespec *a, const struct timespec *b)
{
    return (double)(b->tv_sec - a->tv_sec) + 1e-9 * (double)(b->tv_nsec - a->tv_nsec);
}


/* The samples done so far and in all, over every item and pass. */
static void work(const progress_ctx *p, int pass, size_t done, size_t total, double *so_far,
                 double *all)
{
    double per_run = (double)total; /* samples of one pass of one item */
    *all = per_run * (double)p->n_items * (double)p->passes;
    *so_far = per_run * ((double)p->item * (double)p->passes + (double)pass) + (double)done;
}

/* The estimate of the whole run from the samples done so far (of every
 * item and pass), said once when the run will be long. */
static void estimate(progress_ctx *p, int pass, size_t done, size_t total, double elapsed)
{
    double per_run = (double)total, so_far, all;
    work(p, pass, done, total, &so_far, &all);
    if (so_far <= 0.0 || so_far >= all)
        return;
    p->estimated = 1;
    p->total_s = elapsed * all / so_far;
    if (p->total_s <= p->note_s)
        return;
    char len[32];
    cli_duration(p->total_s, len, sizeof len);
    cli_zone_progress_clear(p);
    if (p->total_s <= p->warn_s) {
        fprintf(stderr, "plumb zone: this run will take about %s (timed on the first %.0f of "
                        "%.0f samples)\n", len, so_far, all);
    } else {
        /* the samples per run that would take about CLI_WARN_OVER_S, one digit */
        double fit = per_run * p->warn_s / p->total_s;
        double mag = 1.0;
        while (mag * 10.0 <= fit)
            mag *= 10.0;
        fit = mag * (double)(long)(fit / mag);
        char lim[32];
        cli_duration(p->warn_s, lim, sizeof lim);
        fprintf(stderr, "plumb zone: warning: this run will take about %s (timed on the first "
                        "%.0f of %.0f samples); it goes on, Ctrl-C stops it", len, so_far, all);
        if (fit >= (double)p->min_samples && fit >= 1.0)
            fprintf(stderr, "; %s %.0f would take about %s", p->samples_from, fit, lim);
        fputs("\n", stderr);
    }
    fflush(stderr);
}

void cli_zone_progress(void *user, int pass, size_t done, size_t total)
{
    progress_ctx *p = user;
    struct timespec now;
    if (clock_gettime(CLOCK_MONOTONIC, &now) != 0)
        return;
    double elapsed = since(&p->start, &now);
    if (!p->estimated && elapsed >= p->after_s)
        estimate(p, pass, done, total, elapsed);
    if (!p->tty || elapsed < PROGRESS_AFTER_S ||
        (p->shown && since(&p->last, &now) < CLI_PROGRESS_EVERY_S && done < total))
        return;
    p->last = now;
    p->shown = 1;
    char where[64] = "";
    if (p->n_items > 1)
        snprintf(where, sizeof where, "item %zu of %zu, ", p->item + 1, p->n_items);
    if (p->passes > 1)
        snprintf(where + strlen(where), sizeof where - strlen(where), "%s, ",
                 pass == 0 ? "planned release" : "released for the target");
    char left[48] = "";
    double so_far, all;
    work(p, pass, done, total, &so_far, &all);
    if (p->estimated && so_far > 0.0 && so_far < all) {
        char len[32];
        cli_duration(elapsed * (all - so_far) / so_far, len, sizeof len);
        snprintf(left, sizeof left, ", about %s left", len);
    }
    fprintf(stderr, "\rplumb zone: %s%3.0f %% (%zu of %zu samples%s)  ", where,
            PERCENT * (double)done / (double)total, done, total, left);
    fflush(stderr);
}

void cli_zone_progress_clear(progress_ctx *p)
{
    cli_progress_clear(&p->shown);
}

/* ---- the per-sample file -------------------------------------------------- */


plumb_status cli_zone_samples_open(samples_file *s, plumb_diag *diag)
{
    const char *slash = strrchr(s->path, '/');
    if (*(slash ? slash + 1 : s->path) == '\0')
        return opt_error(diag, "--samples-out", "cannot write '%s'", s->path);
    plumb_status st = cli_outfile_open(&s->out, s->path, "cannot write the samples", diag);
    if (st != PLUMB_OK)
        return st;
    s->f = s->out.f;
    size_t nc;
    const char *const *c = plumb_cautions(&nc);
    for (size_t i = 0; i < nc; i++)
        fprintf(s->f, "# %s\n", c[i]);
    fprintf(s->f, "# every sample of plumb zone, in sample order, numbered from 1, SI units; pass 0 is released at "
                  "the planned point, pass 1 at the point aimed at the target\n"
                  "item,pass,sample,east_m,north_m,energy_j,speed_m_s,time_s\n");
    return PLUMB_OK;
}

static void csv_text(FILE *f, const char *s)
{
    if (!strpbrk(s, ",\"\r\n")) {
        fputs(s, f);
        return;
    }
    fputc('"', f);
    for (const char *p = s; *p; p++) {
        if (*p == '"')
            fputc('"', f);
        fputc(*p, f);
    }
    fputc('"', f);
}

int cli_zone_samples_row(void *user, int pass, size_t index, const plumb_zone_sample *smp)
{
    samples_file *s = user;
    csv_text(s->f, s->item);
    if (fprintf(s->f, ",%d,%zu,%.*g,%.*g,%.*g,%.*g,%.*g\n", pass, index + 1, SAMPLE_DIGITS,
                smp->point_m[0], SAMPLE_DIGITS, smp->point_m[1], SAMPLE_DIGITS, smp->energy_j,
                SAMPLE_DIGITS, smp->speed_m_s, SAMPLE_DIGITS, smp->time_s) < 0) {
        s->failed = errno ? errno : EIO;
        return 1;
    }
    return 0;
}

/* Flushes, syncs and renames the file into place (commit = 1), or removes it. */
plumb_status cli_zone_samples_close(samples_file *s, int commit, plumb_diag *diag)
{
    if (!s->f)
        return PLUMB_OK;
    s->f = NULL;
    /* A row that failed (cli_zone_samples_row) has set the stream's error
     * flag, which cli_outfile_close reports. */
    return cli_outfile_close(&s->out, commit, diag);
}


/* ---- the zone settings ---------------------------------------------------- */

static plumb_status at_profile(plumb_diag *diag, const char *path, const char *key,
                               const char *message)
{
    plumb_diag_clear(diag);
    diag->status = PLUMB_EINVAL;
    snprintf(diag->file, sizeof diag->file, "%s", path);
    snprintf(diag->key, sizeof diag->key, "%s", key);
    snprintf(diag->message, sizeof diag->message, "%s", message);
    return PLUMB_EINVAL;
}

plumb_status cli_zone_spec(const cli_args *a, const cli_zone_opts *zo, const plumb_profile *prof,
                           const plumb_units *units, const char *path, plumb_zone_spec *zone,
                           plumb_zone_options *opt, plumb_diag *diag)
{
    double samples = 0.0, seed = 0.0, threads = 0.0, confidence = 0.0, target[2] = {0.0, 0.0};
    plumb_status st = PLUMB_OK;
    if (zo->samples)
        st = cli_zone_parse_whole("--samples", zo->samples, 1.0, (double)PLUMB_ZONE_MAX_SAMPLES,
                                  &samples, diag);
    if (st == PLUMB_OK && zo->seed)
        st = cli_zone_parse_whole("--seed", zo->seed, 0.0, MAX_SEED, &seed, diag);
    if (st == PLUMB_OK && zo->threads)
        st = cli_zone_parse_whole("--threads", zo->threads, 1.0, (double)MAX_THREADS, &threads,
                                  diag);
    if (st == PLUMB_OK && zo->confidence)
        st = cli_zone_parse_confidence(zo->confidence, &confidence, diag);
    if (st == PLUMB_OK && zo->target)
        st = cli_zone_parse_target(units, zo->target, target, diag);
    if (st != PLUMB_OK)
        return st;
    *zone = *plumb_profile_zone(prof);
    if (zo->samples)
        zone->samples = (size_t)samples;
    if (zo->seed)
        zone->seed = (unsigned long)seed;
    if (zo->confidence)
        zone->confidence = confidence;
    if (zo->target) {
        zone->has_target = 1;
        zone->target_m[0] = target[0];
        zone->target_m[1] = target[1];
    }
    opt->threads = zo->threads ? (size_t)threads : plumb_zone_default_threads();
    if ((double)zone->seed > MAX_SEED)
        return at_profile(diag, path, "zone.seed", "expected a seed from 0 to 2^53-1");
    if (a->format == PLUMB_FORMAT_GEOJSON && !zone->has_site)
        return at_profile(diag, path, "site.longitude",
                          "--format geojson needs the site on the map: give site.latitude and "
                          "site.longitude (WGS 84 degrees)");
    size_t need = plumb_zone_min_samples(zone->confidence, opt->ci_level);
    if (need == 0 || zone->samples < need) {
        const char *by = zo->samples ? "--samples" : zo->confidence ? "--confidence" : NULL;
        char msg[PLUMB_DIAG_MSG];
        snprintf(msg, sizeof msg,
                 "%zu samples cannot bound the %g %% radius at %g %% confidence; at least %zu "
                 "are needed", zone->samples, PERCENT * zone->confidence, PERCENT * opt->ci_level,
                 need);
        return at_profile(diag, by ? "<command line>" : path, by ? by : "zone.samples", msg);
    }
    return PLUMB_OK;
}

void cli_zone_progress_init(progress_ctx *p, const cli_args *a, const cli_zone_opts *zo,
                            const plumb_zone_spec *zone, plumb_zone_options *opt,
                            const plumb_profile *prof)
{
    memset(p, 0, sizeof *p);
    p->n_items = prof ? plumb_profile_item_count(prof) : 0;
    p->passes = prof && zone->has_target ? 2 : 1;
    p->tty = isatty(STDERR_FILENO);
    p->samples_from = zo->samples ? "--samples" : "zone.samples";
    p->min_samples = prof ? plumb_zone_min_samples(zone->confidence, opt->ci_level) : 0;
    cli_estimate_times(&p->after_s, &p->note_s, &p->warn_s);
    if (!a->quiet && clock_gettime(CLOCK_MONOTONIC, &p->start) == 0) {
        opt->progress = cli_zone_progress;
        opt->progress_user = p;
    }
}
