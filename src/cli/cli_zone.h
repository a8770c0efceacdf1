/*
 * cli_zone.h - option values, progress and the per-sample file of `plumb
 * zone` (src/cli/cli_zone.c), so that cmd_zone.c only wires them to the
 * study and the writers.
 */
#ifndef PLUMB_CLI_ZONE_H
#define PLUMB_CLI_ZONE_H

#include <stdio.h>
#include <time.h>

#include "plumb/plumb.h"
#include "plumb/dispersion.h"

/* The options of `plumb zone` as given (NULL when absent). */
typedef struct cli_zone_opts {
    const char *samples, *seed, *threads, *confidence, *target, *samples_out, *regions_out;
} cli_zone_opts;

#include "cli.h"

/* The zone settings: the profile's `zone:` map with the options over it,
 * into *zone, and the threads into opt. PLUMB_EINVAL (located at the
 * option or the profile key) for a bad value, too few samples for the
 * confidence, or --format geojson without the site's latitude and
 * longitude. */
plumb_status cli_zone_spec(const cli_args *a, const cli_zone_opts *zo,
                           const plumb_profile *prof, const plumb_units *units, const char *path,
                           plumb_zone_spec *zone, plumb_zone_options *opt, plumb_diag *diag);

/* "out of memory" into diag; PLUMB_ENOMEM. */
plumb_status plumbp_cli_nomem(plumb_diag *diag);

/* A whole number in [lo, hi] for `option` ("1e5" too). PLUMB_EINVAL. */
plumb_status cli_zone_parse_whole(const char *option, const char *text, double lo, double hi,
                                  double *out, plumb_diag *diag);

/* A fraction 0 < p < 1, or a percent "99.9%". PLUMB_EINVAL. */
plumb_status cli_zone_parse_confidence(const char *text, double *out, plumb_diag *diag);

/* "E,N", each a length with its unit, both in the same unit. PLUMB_EINVAL. */
plumb_status cli_zone_parse_target(const plumb_units *units, const char *text, double out[2],
                                   plumb_diag *diag);

/* Progress and the time estimate of a run (the plumb_zone_progress_fn). */
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

void cli_zone_progress(void *user, int pass, size_t done, size_t total);

/* Sets up p for a run of `zone` over prof's items (prof NULL: nothing
 * runs) and hooks it into opt unless --quiet. */
void cli_zone_progress_init(progress_ctx *p, const cli_args *a, const cli_zone_opts *zo,
                            const plumb_zone_spec *zone, plumb_zone_options *opt,
                            const plumb_profile *prof);

/* Clears the progress line, if any. */
void cli_zone_progress_clear(progress_ctx *p);

/* The --samples-out file: a temporary file beside path until closed. */
typedef struct samples_file {
    const char *path;         /* destination */
    cli_outfile out;          /* written through cli.h: beside it, or in place */
    FILE *f;                  /* out.f while open */
    const char *item;         /* current item name */
    int failed;               /* errno of a failed row, or 0 */
} samples_file;

/* Opens the file (cli_outfile_open: beside it, or in place) and writes
 * the header. PLUMB_EINVAL,
 * PLUMB_EWRITE, PLUMB_ENOMEM. */
plumb_status cli_zone_samples_open(samples_file *s, plumb_diag *diag);

/* One sample's row (the plumb_zone_sample_fn): nonzero stops the run. */
int cli_zone_samples_row(void *user, int pass, size_t index, const plumb_zone_sample *smp);

/* Renames the file into place (commit = 1), or removes it. PLUMB_EWRITE. */
plumb_status cli_zone_samples_close(samples_file *s, int commit, plumb_diag *diag);

#endif /* PLUMB_CLI_ZONE_H */
