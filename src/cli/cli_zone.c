/*
 * cli_zone.c - what `plumb zone` does around the study's run
 * (src/cli/cli_zone.h): the files checked first, its option values over
 * the profile's `zone:` map, its progress and time estimate on standard
 * error, the --samples-out file written beside its destination (rows by
 * the report layer, plumb_report_zone_sample), and the report,
 * --regions-out and --samples-out files written all or none. The run
 * itself is the study's (plumb_study_zone).
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

/* Progress appears after this long, s. */
#define PROGRESS_AFTER_S 1.0
/* Percent per unit fraction. */
#define PERCENT 100.0
/* Most threads --threads accepts. */
#define MAX_THREADS 1024u

/* ---- option values ---------------------------------------------------------- */

/* A fraction 0 < p < 1, or a percent "99.9%". */
static plumb_status parse_confidence(const char *text, double *out, plumb_diag *diag)
{
    char *end = NULL;
    errno = 0;
    double v = text[0] ? strtod(text, &end) : 0.0;
    int percent = end && *end == '%' && end[1] == '\0';
    if (!text[0] || !end || (*end != '\0' && !percent) || errno == ERANGE)
        return cli_option_error(diag, "--confidence", 1, "expected a fraction such as 0.99 or a percent "
                                               "such as 99%%, found '%s'", text);
    if (percent)
        v /= PERCENT;
    if (!(v > 0.0 && v < 1.0))
        return cli_option_error(diag, "--confidence", 1, "expected 0 < confidence < 1 (0 %% to 100 %%), "
                                               "found '%s'", text);
    *out = v;
    return PLUMB_OK;
}

/* "E,N", each a length with its unit, each in any unit of length
 * ("20km,0m": east and north are converted apart). */
static plumb_status parse_target(const plumb_units *units, const char *text, double out[2],
                                 plumb_diag *diag)
{
    const char *comma = strchr(text, ',');
    if (!comma || strchr(comma + 1, ','))
        return cli_option_error(diag, "--target", 1, "expected EAST,NORTH with units, e.g. 40m,-12m, "
                                           "found '%s'", text);
    char part[2][PLUMB_DIAG_MSG / 2];
    snprintf(part[0], sizeof part[0], "%.*s", (int)(comma - text), text);
    snprintf(part[1], sizeof part[1], "%s", comma + 1);
    for (int k = 0; k < 2; k++) {
        plumb_diag d;
        plumb_diag_clear(&d);
        if (plumb_units_parse(units, part[k], PLUMB_DIM_LENGTH, &out[k], &d) != PLUMB_OK)
            return cli_option_error(diag, "--target", k == 0 ? 1 : (int)(comma - text) + 2,
                                    "%s: %s", k == 0 ? "east" : "north",
                             d.message[0] ? d.message : "expected a length with its unit");
    }
    return PLUMB_OK;
}

/* With --format geojson the target is put on the map: one too far from the
 * site for the map conversion is refused before the run, naming where it
 * came from (--target, or the profile's zone.target), not after it with a
 * bare "a point ... from the site". */
static plumb_status target_on_map(const cli_zone_opts *zo, const cli_study *cs,
                                  const plumb_zone_spec *z, plumb_diag *diag)
{
    double ll[2];
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_geodesy_forward(z->site_deg[0], z->site_deg[1], z->target_m[0], z->target_m[1],
                              ll, &d) == PLUMB_OK)
        return PLUMB_OK;
    if (zo->target)
        return cli_option_error(diag, "--target", 1, "the target (%s) on the --format geojson map: "
                                "%s", zo->target, d.message);
    int line = 0, col = 0;
    const char *file = plumb_profile_key_origin(cs->profile, "zone.target", &line, &col);
    plumb_diag_clear(diag);
    diag->status = PLUMB_EINVAL;
    snprintf(diag->file, sizeof diag->file, "%s", file ? file : plumb_profile_path(cs->profile));
    diag->line = line;
    diag->col = col;
    snprintf(diag->key, sizeof diag->key, "zone.target");
    snprintf(diag->message, sizeof diag->message, "the target on the --format geojson map: %.*s",
             (int)sizeof diag->message - 48, d.message);
    return PLUMB_EINVAL;
}

/* ---- progress ---------------------------------------------------------------- */


static double since(const struct timespec *a, const struct timespec *b)
{
    return (double)(b->tv_sec - a->tv_sec) + 1e-9 * (double)(b->tv_nsec - a->tv_nsec);
}


/* The samples done so far and in all, over every item and pass. */
static void work(const cli_zone_progress *p, int pass, size_t done, size_t total, double *so_far,
                 double *all)
{
    double per_run = (double)total; /* samples of one pass of one item */
    *all = per_run * (double)p->n_items * (double)p->passes;
    *so_far = per_run * ((double)p->item * (double)p->passes + (double)pass) + (double)done;
}

/* The estimate of the whole run from the samples done so far (of every
 * item and pass), said once when the run will be long. */
static void estimate(cli_zone_progress *p, int pass, size_t done, size_t total, double elapsed)
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
    cli_progress_clear(&p->shown);
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

static void progress(void *user, int pass, size_t done, size_t total)
{
    cli_zone_progress *p = user;
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

/* ---- the per-sample file -------------------------------------------------- */

static plumb_status samples_open(cli_zone_samples *s, plumb_diag *diag)
{
    const char *slash = strrchr(s->path, '/');
    if (*(slash ? slash + 1 : s->path) == '\0')
        return cli_option_error(diag, "--samples-out", 1, "cannot write '%s'", s->path);
    plumb_status st = cli_outfile_open(&s->out, s->path, "cannot write the samples", diag);
    if (st == PLUMB_OK)
        st = plumb_report_zone_samples_head(s->out.f, diag);
    return st;
}

/* One sample's row (the plumb_zone_sample_fn): nonzero, with s->why set,
 * stops the run. */
static int samples_row(void *user, int pass, size_t index, const plumb_zone_sample *smp)
{
    cli_zone_samples *s = user;
    errno = 0;
    plumb_status st = plumb_report_zone_sample(s->out.f, s->item, pass, index, smp, &s->why);
    if (st == PLUMB_OK)
        return 0;
    if (st == PLUMB_EWRITE) {
        int err = errno ? errno : EIO;
        plumb_diag_clear(&s->why);
        s->why.status = PLUMB_EWRITE;
        snprintf(s->why.file, sizeof s->why.file, "%s", s->path);
        snprintf(s->why.message, sizeof s->why.message, "cannot write the samples: %s",
                 strerror(err));
    }
    s->failed = 1;
    return 1;
}

/* ---- the run ---------------------------------------------------------------- */

/* A side file (--samples-out, --regions-out) must not be the profile, a
 * profile's name (.yaml) or -o. */
static int check_side(const cli_args *a, const char *opt, const char *file, const char *path)
{
    if (!file)
        return CLI_GO_ON;
    if (file[0] == '\0' || strcmp(file, "-") == 0)
        return cli_usage_error(a->cmd, "%s needs a file name", opt);
    if (cli_same_file(file, path))
        return cli_usage_error(a->cmd, "%s %s would overwrite the profile", opt, file);
    if (cli_profile_name(file))
        return cli_usage_error(a->cmd, "%s %s names a profile (.yaml, .yml): the CSV would "
                               "overwrite it; give a name ending in .csv", opt, file);
    if (a->output && (strcmp(a->output, file) == 0 || cli_same_file(a->output, file)))
        return cli_usage_error(a->cmd, "-o and %s name the same file", opt);
    return CLI_GO_ON;
}

int cli_zone_check_files(const cli_args *a, const cli_zone_opts *zo)
{
    if (a->n_args != 1)
        return a->n_args == 0 ? cli_usage_error(a->cmd, "needs a PROFILE")
                              : cli_usage_error(a->cmd, "takes one PROFILE, found %zu arguments",
                                                a->n_args);
    const char *path = a->args[0];
    if (a->output && cli_same_file(a->output, path))
        return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);
    int rc;
    if ((rc = check_side(a, "--samples-out", zo->samples_out, path)) != CLI_GO_ON ||
        (rc = check_side(a, "--regions-out", zo->regions_out, path)) != CLI_GO_ON)
        return rc;
    if (zo->samples_out && zo->regions_out && strcmp(zo->samples_out, zo->regions_out) == 0)
        return cli_usage_error(a->cmd, "--samples-out and --regions-out name the same file");
    return CLI_GO_ON;
}

void cli_zone_init(cli_zone_run *r, const cli_args *a, const cli_zone_opts *zo)
{
    memset(r, 0, sizeof *r);
    r->a = a;
    r->zo = zo;
    plumb_zone_options_init(&r->opt);
}

void cli_zone_at_option(const cli_zone_opts *zo, plumb_diag *diag)
{
    const char *by = NULL;
    if (strcmp(diag->key, "zone.samples") == 0)
        by = zo->samples ? "--samples" : zo->confidence ? "--confidence" : NULL;
    else if (strcmp(diag->key, "zone.confidence") == 0)
        by = zo->confidence ? "--confidence" : NULL;
    else if (strcmp(diag->key, "zone.seed") == 0)
        by = zo->seed ? "--seed" : NULL;
    else if (strcmp(diag->key, "zone.target") == 0)
        by = zo->target ? "--target" : NULL;
    if (!by)
        return;
    cli_option_blame(diag, by, NULL);
}

/* The option values over the profile's `zone:` map, checked. */
static plumb_status settings(cli_zone_run *r, const cli_study *cs, plumb_diag *diag)
{
    const cli_zone_opts *zo = r->zo;
    double samples = 0.0, seed = 0.0, threads = 0.0, confidence = 0.0, target[2] = {0.0, 0.0};
    plumb_status st = PLUMB_OK;
    if (zo->samples)
        st = cli_parse_whole("--samples", zo->samples, 1.0, (double)PLUMB_ZONE_MAX_SAMPLES, &samples,
                         diag);
    if (st == PLUMB_OK && zo->seed)
        st = cli_parse_whole("--seed", zo->seed, 0.0, PLUMB_ZONE_MAX_SEED, &seed, diag);
    if (st == PLUMB_OK && zo->threads)
        st = cli_parse_whole("--threads", zo->threads, 1.0, (double)MAX_THREADS, &threads, diag);
    if (st == PLUMB_OK && zo->confidence)
        st = parse_confidence(zo->confidence, &confidence, diag);
    if (st == PLUMB_OK && zo->target)
        st = parse_target(cs->units, zo->target, target, diag);
    if (st != PLUMB_OK)
        return st;
    plumb_zone_spec *z = &r->zone;
    *z = *plumb_profile_zone(cs->profile);
    if (zo->samples)
        z->samples = (size_t)samples;
    if (zo->seed)
        z->seed = (unsigned long)seed;
    if (zo->confidence)
        z->confidence = confidence;
    if (zo->target) {
        z->has_target = 1;
        z->target_m[0] = target[0];
        z->target_m[1] = target[1];
    }
    r->opt.threads = zo->threads ? (size_t)threads : plumb_zone_default_threads();
    if (r->a->format == PLUMB_FORMAT_GEOJSON && !z->has_site) {
        plumb_diag_clear(diag);
        diag->status = PLUMB_EINVAL;
        snprintf(diag->file, sizeof diag->file, "%s", plumb_profile_path(cs->profile));
        snprintf(diag->key, sizeof diag->key, "site.longitude");
        snprintf(diag->message, sizeof diag->message,
                 "--format geojson needs the site on the map: give site.latitude and "
                 "site.longitude (WGS 84 degrees)");
        return PLUMB_EINVAL;
    }
    if (r->a->format == PLUMB_FORMAT_GEOJSON && z->has_target &&
        (st = target_on_map(zo, cs, z, diag)) != PLUMB_OK)
        return st;
    st = plumb_study_zone_check_settings(cs->study, z, &r->opt, diag);
    if (st != PLUMB_OK)
        cli_zone_at_option(zo, diag);
    return st;
}

plumb_status cli_zone_start(cli_zone_run *r, const cli_study *cs, plumb_diag *diag)
{
    plumb_status st = settings(r, cs, diag);
    if (st == PLUMB_OK && r->zo->samples_out) {
        r->samples.path = r->zo->samples_out;
        st = samples_open(&r->samples, diag);
        r->opt.on_sample = samples_row;
        r->opt.sample_user = &r->samples;
    }
    if (st != PLUMB_OK)
        return st;
    cli_zone_progress *p = &r->progress;
    p->n_items = plumb_profile_item_count(cs->profile);
    p->passes = r->zone.has_target ? 2 : 1;
    p->tty = isatty(STDERR_FILENO);
    p->samples_from = r->zo->samples ? "--samples" : "zone.samples";
    p->min_samples = plumb_zone_min_samples(r->zone.confidence, r->opt.ci_level);
    cli_estimate_times(&p->after_s, &p->note_s, &p->warn_s);
    if (!r->a->quiet && clock_gettime(CLOCK_MONOTONIC, &p->start) == 0) {
        r->opt.progress = progress;
        r->opt.progress_user = p;
    }
    return PLUMB_OK;
}

void cli_zone_item(void *user, size_t item, const plumb_fall_spec *spec)
{
    cli_zone_run *r = user;
    r->progress.item = item;
    r->samples.item = spec->name;
}

/* The writers cli_render runs: the report, the --regions-out file. */
typedef struct zone_out {
    plumb_report_options opt;
    const plumb_zone_report *rep;
} zone_out;

static plumb_status make_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const zone_out *z = ctx;
    return plumb_report_zone(out, &z->opt, z->rep, diag);
}

static plumb_status make_regions(FILE *out, const void *ctx, plumb_diag *diag)
{
    const zone_out *z = ctx;
    return plumb_report_zone_regions(out, z->rep, diag);
}

/* Removes a file this run wrote when a later one failed: a regular file
 * only, never a device or FIFO written in place. */
static void take_back(const char *path, int in_place)
{
    struct stat st;
    if (path && !in_place && lstat(path, &st) == 0 && S_ISREG(st.st_mode))
        unlink(path);
}

int cli_zone_finish(cli_zone_run *r, plumb_status st, const plumb_zone_report *rep,
                    plumb_diag *diag)
{
    cli_progress_clear(&r->progress.shown);
    cli_zone_samples *sf = &r->samples;
    if (st != PLUMB_OK && sf->failed) /* the samples file stopped the run: say why */
        *diag = sf->why;
    const cli_args *a = r->a;
    const char *regions = r->zo->regions_out;
    /* Everything in memory first; then the files, all or none. */
    char *buf = NULL, *rbuf = NULL;
    size_t len = 0, rlen = 0;
    zone_out z = {cli_report_options(a), rep};
    if (st == PLUMB_OK)
        st = cli_render(make_report, &z, &buf, &len, diag);
    if (st == PLUMB_OK && regions)
        st = cli_render(make_regions, &z, &rbuf, &rlen, diag);
    if (st == PLUMB_OK)
        st = cli_outfile_close(&sf->out, 1, diag);
    if (st == PLUMB_OK && regions && (st = cli_write_output(regions, rbuf, rlen, diag)) != PLUMB_OK)
        take_back(sf->path, sf->out.in_place);
    if (st == PLUMB_OK && (st = cli_write_output(a->output, buf, len, diag)) != PLUMB_OK) {
        /* the report failed: take the other files back too */
        take_back(sf->path, sf->out.in_place);
        take_back(regions, 0);
    }
    free(buf);
    free(rbuf);
    if (st != PLUMB_OK) {
        cli_outfile_close(&sf->out, 0, NULL);
        return cli_fail(diag);
    }
    const char *wrote[3] = {a->output && strcmp(a->output, "-") != 0 ? a->output : NULL,
                            sf->path, regions};
    for (int k = 0; k < 3 && !a->quiet; k++)
        if (wrote[k])
            fprintf(stderr, "plumb: wrote %s\n", wrote[k]);
    return CLI_EXIT_OK;
}
