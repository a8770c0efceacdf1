/*
 * cmd_zone.c - `plumb zone PROFILE`: the Monte Carlo clearance zone of the
 * profile's payload (or of each item of an inventory) over its
 * `uncertainty:` distributions (design.md section 3; the method is in
 * include/plumb/dispersion.h).
 *
 * Defaults come from the profile's `zone:` map; --samples, --seed,
 * --threads, --confidence and --target override them. Every option is
 * checked before anything runs; the report is made in memory and written
 * (atomically, with -o) only when the whole run succeeded, and the
 * --samples-out file is written to a temporary file beside its destination
 * and renamed into place at the same moment.
 * Progress goes to standard error only when it is a terminal, the run has
 * taken more than PROGRESS_AFTER_S, and --quiet is not given.
 * Once the run has taken CLI_ESTIMATE_AFTER_S, the time the whole run will take
 * is estimated from the samples done so far; when it is over CLI_NOTE_OVER_S a
 * note says so on standard error (terminal or not: a log shows it too), and
 * over CLI_WARN_OVER_S it is a warning that names a --samples that would fit.
 * The run goes on either way; --quiet silences both. For the tests only,
 * PLUMB_TEST_ESTIMATE_TIMES="AFTER,NOTE,WARN" (seconds) replaces the three.
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
#include "plumb/dispersion.h"

/* Progress appears after this long, and is redrawn at most this often, s. */
#define PROGRESS_AFTER_S 1.0
#define PROGRESS_EVERY_S 0.25
/* Most threads --threads accepts. */
#define MAX_THREADS 1024u
/* Largest seed: integers up to 2^53 - 1 read back exactly from JSON
 * (IEEE 754 double, the number type of most JSON readers). */
#define MAX_SEED 9007199254740991.0
/* Digits of the per-sample CSV: 17 read back any double exactly. */
#define SAMPLE_DIGITS 17
/* Percent per unit fraction. */
#define PERCENT 100.0

static const char usage[] =
    "Usage: plumb zone PROFILE [--samples N] [--seed S] [--threads T] [--confidence P]\n"
    "                  [--target E,N] [--samples-out FILE] [OPTIONS]\n"
    "The clearance zone below a drop, by Monte Carlo over the profile's uncertainty:\n"
    "map: the impact-point cloud (mean, 95 % ellipse), the distance from the planned\n"
    "drop point at 50, 90, 99 and 99.9 % with 95 % intervals, the clearance radius at\n"
    "the confidence asked for (the upper bound of that percentile plus the profile's\n"
    "zone.scatter allowance), impact energy percentiles, the probability of exceeding\n"
    "each criterion, and beside them a radius equal to the drop height and the\n"
    "drag-free throw. The figures are the same for any number of threads.\n"
    "An inventory profile (items:) runs every item with the same samples and seed.\n"
    "PROFILE '-' is read from standard input.\n"
    "A run that will take over 10 s says so on standard error after half a second,\n"
    "over 10 minutes as a warning; on a terminal it shows its progress.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed; nothing is written\n"
    "on an error.\n";

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
static plumb_status parse_whole(const char *option, const char *text, double lo, double hi,
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
static plumb_status parse_confidence(const char *text, double *out, plumb_diag *diag)
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
static plumb_status parse_target(const plumb_units *units, const char *text, double out[2],
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

typedef struct progress_ctx {
    struct timespec start, last;
    int tty;                  /* standard error is a terminal: show progress */
    int shown;                /* something is on the line */
    size_t item, n_items;
    int passes;               /* 1, or 2 with a target */
    const char *samples_from; /* "--samples" or "zone.samples" */
    size_t min_samples;       /* fewest samples the confidence allows */
    double after_s, note_s, warn_s; /* CLI_ESTIMATE_AFTER_S, CLI_NOTE_OVER_S, CLI_WARN_OVER_S */
    int estimated;            /* the estimate is made */
    double total_s;           /* the estimated length of the whole run, s */
} progress_ctx;

static double since(const struct timespec *a, const struct timespec *b)
{
    return (double)(b->tv_sec - a->tv_sec) + 1e-9 * (double)(b->tv_nsec - a->tv_nsec);
}

static void progress_clear(progress_ctx *p);

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
    progress_clear(p);
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
    progress_ctx *p = user;
    struct timespec now;
    if (clock_gettime(CLOCK_MONOTONIC, &now) != 0)
        return;
    double elapsed = since(&p->start, &now);
    if (!p->estimated && elapsed >= p->after_s)
        estimate(p, pass, done, total, elapsed);
    if (!p->tty || elapsed < PROGRESS_AFTER_S ||
        (p->shown && since(&p->last, &now) < PROGRESS_EVERY_S && done < total))
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

static void progress_clear(progress_ctx *p)
{
    if (p->shown) {
        fprintf(stderr, "\r%79s\r", "");
        fflush(stderr);
    }
    p->shown = 0;
}

/* ---- the per-sample file -------------------------------------------------- */

typedef struct samples_file {
    const char *path;         /* destination */
    cli_outfile out;          /* written through cli.h: beside it, or in place */
    FILE *f;                  /* out.f while open */
    const char *item;         /* current item name */
    int failed;               /* errno of a failed row, or 0 */
} samples_file;

static plumb_status samples_open(samples_file *s, plumb_diag *diag)
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

static int samples_row(void *user, int pass, size_t index, const plumb_zone_sample *smp)
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
static plumb_status samples_close(samples_file *s, int commit, plumb_diag *diag)
{
    if (!s->f)
        return PLUMB_OK;
    s->f = NULL;
    /* A row that failed (samples_row) has set the stream's error flag,
     * which cli_outfile_close reports. */
    return cli_outfile_close(&s->out, commit, diag);
}

/* ---- the run ------------------------------------------------------------------ */

typedef struct zone_opts {
    const char *samples, *seed, *threads, *confidence, *target, *samples_out;
} zone_opts;

/* Points a failed run's diagnostic at the profile and the item. */
/* Before each item's run: progress and the sample file name the item. */
typedef struct item_ctx {
    progress_ctx *pc;
    samples_file *sf;
} item_ctx;

static void on_item(void *user, size_t item, const plumb_fall_spec *spec)
{
    item_ctx *ic = user;
    ic->pc->item = item;
    ic->sf->item = spec->name;
}

static int run(const cli_args *a, const zone_opts *zo)
{
    if (a->n_args == 0)
        return cli_usage_error(a->cmd, "needs a PROFILE");
    if (a->n_args > 1)
        return cli_usage_error(a->cmd, "takes one PROFILE, found %zu arguments", a->n_args);
    const char *path = a->args[0];
    if (a->output && cli_same_file(a->output, path))
        return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);
    if (zo->samples_out) {
        if (zo->samples_out[0] == '\0' || strcmp(zo->samples_out, "-") == 0)
            return cli_usage_error(a->cmd, "--samples-out needs a file name");
        if (cli_same_file(zo->samples_out, path))
            return cli_usage_error(a->cmd, "--samples-out %s would overwrite the profile",
                                   zo->samples_out);
        if (a->output && (strcmp(a->output, zo->samples_out) == 0 ||
                          cli_same_file(a->output, zo->samples_out)))
            return cli_usage_error(a->cmd, "-o and --samples-out name the same file");
    }

    plumb_diag diag;
    cli_study cs;
    samples_file sf;
    memset(&sf, 0, sizeof sf);

    /* The study (profile, criteria, air), then the options: a bad one
     * stops everything before any fall is run. */
    double samples = 0.0, seed = 0.0, threads = 0.0, confidence = 0.0, target[2] = {0.0, 0.0};
    plumb_status st = cli_study_open(a, path, &cs, &diag);
    const plumb_profile *prof = cs.profile;
    if (st == PLUMB_OK && zo->samples)
        st = parse_whole("--samples", zo->samples, 1.0, (double)PLUMB_ZONE_MAX_SAMPLES, &samples,
                         &diag);
    if (st == PLUMB_OK && zo->seed)
        st = parse_whole("--seed", zo->seed, 0.0, MAX_SEED, &seed, &diag);
    if (st == PLUMB_OK && zo->threads)
        st = parse_whole("--threads", zo->threads, 1.0, (double)MAX_THREADS, &threads, &diag);
    if (st == PLUMB_OK && zo->confidence)
        st = parse_confidence(zo->confidence, &confidence, &diag);
    if (st == PLUMB_OK && zo->target)
        st = parse_target(cs.units, zo->target, target, &diag);

    plumb_zone_spec zone;
    memset(&zone, 0, sizeof zone);
    if (st == PLUMB_OK) {
        zone = *plumb_profile_zone(prof);
        if (zo->samples)
            zone.samples = (size_t)samples;
        if (zo->seed)
            zone.seed = (unsigned long)seed;
        if (zo->confidence)
            zone.confidence = confidence;
        if (zo->target) {
            zone.has_target = 1;
            zone.target_m[0] = target[0];
            zone.target_m[1] = target[1];
        }
        if ((double)zone.seed > MAX_SEED) {
            diag.status = st = PLUMB_EINVAL;
            snprintf(diag.file, sizeof diag.file, "%s", path);
            snprintf(diag.key, sizeof diag.key, "zone.seed");
            snprintf(diag.message, sizeof diag.message, "expected a seed from 0 to 2^53-1");
        }
    }
    plumb_zone_options zopt;
    plumb_zone_options_init(&zopt);
    if (st == PLUMB_OK) {
        size_t need = plumb_zone_min_samples(zone.confidence, zopt.ci_level);
        if (need == 0 || zone.samples < need) {
            const char *by = zo->samples ? "--samples" : zo->confidence ? "--confidence" : NULL;
            plumb_diag_clear(&diag);
            diag.status = st = PLUMB_EINVAL;
            snprintf(diag.file, sizeof diag.file, "%s", by ? "<command line>" : path);
            snprintf(diag.key, sizeof diag.key, "%s", by ? by : "zone.samples");
            snprintf(diag.message, sizeof diag.message,
                     "%zu samples cannot bound the %g %% radius at %g %% confidence; at least "
                     "%zu are needed", zone.samples, PERCENT * zone.confidence,
                     PERCENT * zopt.ci_level, need);
        }
    }
    size_t n = st == PLUMB_OK ? plumb_profile_item_count(prof) : 0;

    if (st == PLUMB_OK && zo->samples_out) {
        sf.path = zo->samples_out;
        st = samples_open(&sf, &diag);
    }
    zopt.threads = zo->threads ? (size_t)threads : plumb_zone_default_threads();
    progress_ctx pc;
    memset(&pc, 0, sizeof pc);
    pc.n_items = n;
    pc.passes = zone.has_target ? 2 : 1;
    pc.tty = isatty(STDERR_FILENO);
    pc.samples_from = zo->samples ? "--samples" : "zone.samples";
    pc.min_samples = st == PLUMB_OK ? plumb_zone_min_samples(zone.confidence, zopt.ci_level) : 0;
    cli_estimate_times(&pc.after_s, &pc.note_s, &pc.warn_s);
    if (!a->quiet && clock_gettime(CLOCK_MONOTONIC, &pc.start) == 0) {
        zopt.progress = progress;
        zopt.progress_user = &pc;
    }
    if (sf.f) {
        zopt.on_sample = samples_row;
        zopt.sample_user = &sf;
    }
    item_ctx ic = {&pc, &sf};
    const plumb_zone_report *rep = NULL;
    if (st == PLUMB_OK)
        st = plumb_study_zone(cs.study, &zone, &zopt, on_item, &ic, &rep, &diag);
    progress_clear(&pc);
    if (st != PLUMB_OK && sf.failed) { /* the samples file stopped the run: say why */
        plumb_diag_clear(&diag);
        diag.status = st = PLUMB_EWRITE;
        snprintf(diag.file, sizeof diag.file, "%s", sf.path);
        snprintf(diag.message, sizeof diag.message, "cannot write the samples: %s",
                 strerror(sf.failed));
    }

    int rc;
    char *buf = NULL;
    size_t len = 0;
    if (st == PLUMB_OK) {
        plumb_report_options ropt = cli_report_options(a);
        FILE *mem = open_memstream(&buf, &len);
        if (!mem) {
            st = diag.status = PLUMB_ENOMEM;
            snprintf(diag.message, sizeof diag.message, "out of memory");
        } else {
            st = plumb_report_zone(mem, &ropt, rep, &diag);
            if (fclose(mem) != 0 && st == PLUMB_OK) {
                st = diag.status = PLUMB_ENOMEM;
                snprintf(diag.message, sizeof diag.message, "out of memory");
            }
        }
    }
    if (st == PLUMB_OK)
        st = samples_close(&sf, 1, &diag);
    if (st == PLUMB_OK) {
        st = cli_write_output(a->output, buf, len, &diag);
        if (st != PLUMB_OK && sf.path && !sf.out.in_place)
            unlink(sf.path); /* the report failed: take the samples back too */
    }
    if (st == PLUMB_OK) {
        if (!a->quiet && a->output && strcmp(a->output, "-") != 0)
            fprintf(stderr, "plumb: wrote %s\n", a->output);
        if (!a->quiet && sf.path)
            fprintf(stderr, "plumb: wrote %s\n", sf.path);
        rc = CLI_EXIT_OK;
    } else {
        samples_close(&sf, 0, NULL);
        rc = cli_fail(&diag);
    }
    free(buf);
    cli_study_close(&cs);
    return rc;
}

int cmd_zone(int argc, char **argv)
{
    cli_option extra[] = {
        {.name = "--samples", .arg = "N",
         .help = "falls to compute, 1 to 100000000 (default: zone.samples)"},
        {.name = "--seed", .arg = "S", .help = "random seed, 0 to 2^53-1 (default: zone.seed)"},
        {.name = "--threads", .arg = "T",
         .help = "worker threads, 1 to 1024 (default: the processors\nonline)"},
        {.name = "--confidence", .arg = "P",
         .help = "the clearance radius's percentile, 0 < P < 1, or a\n"
                 "percent such as 99.9% (default: zone.confidence)"},
        {.name = "--target", .arg = "E,N",
         .help = "the point the payload should land on, each with its\n"
                 "unit, e.g. --target 40m,-12m (default: zone.target):\n"
                 "also gives the release point that puts the median\n"
                 "impact there, and the zone of a run released there"},
        {.name = "--samples-out", .arg = "FILE",
         .help = "every sample's impact point, energy, speed and time as\n"
                 "CSV (SI units), in sample order"},
    };
    cli_args a;
    int rc = cli_parse(argc, argv,
                       CLI_SET | CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET | CLI_CRITERIA,
                       extra, sizeof extra / sizeof extra[0], usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    zone_opts zo = {extra[0].value, extra[1].value, extra[2].value,
                    extra[3].value, extra[4].value, extra[5].value};
    rc = run(&a, &zo);
    cli_args_free(&a);
    return rc;
}
