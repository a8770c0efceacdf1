/*
 * cli_zone.h - what `plumb zone` does around the study's run
 * (src/cli/cli_zone.c), so that cmd_zone.c only parses its options, asks
 * the study and hands the answer over: the files checked before anything
 * is opened, the option values over the profile's `zone:` map, progress
 * and the time estimate on standard error, the --samples-out file, and the
 * report, --regions-out and --samples-out files written all or none.
 */
#ifndef PLUMB_CLI_ZONE_H
#define PLUMB_CLI_ZONE_H

#include <stdio.h>
#include <time.h>

#include "plumb/plumb.h"
#include "cli.h"

/* The options of `plumb zone` as given (NULL when absent). */
typedef struct cli_zone_opts {
    const char *samples, *seed, *threads, *confidence, *target, *samples_out, *regions_out;
} cli_zone_opts;

/* Progress and the time estimate of a run (a plumb_zone_progress_fn's). */
typedef struct cli_zone_progress {
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
} cli_zone_progress;

/* The --samples-out file: a temporary file beside path until the end. */
typedef struct cli_zone_samples {
    const char *path;         /* destination, NULL without --samples-out */
    cli_outfile out;          /* written through cli.h: beside it, or in place */
    const char *item;         /* the current item's name */
    int failed;               /* a row could not be written: why is in `why` */
    plumb_diag why;
} cli_zone_samples;

/* One run of `plumb zone`. */
typedef struct cli_zone_run {
    const cli_args *a;
    const cli_zone_opts *zo;
    plumb_zone_spec zone;     /* the profile's `zone:` with the options over it */
    plumb_zone_options opt;   /* threads, progress and the samples file hooked in */
    cli_zone_progress progress;
    cli_zone_samples samples;
} cli_zone_run;

/* Before anything is opened: one PROFILE, and -o, --samples-out and
 * --regions-out neither the profile nor each other. CLI_GO_ON, or 2 with
 * the usage error printed. */
int cli_zone_check_files(const cli_args *a, const cli_zone_opts *zo);

/* A zone setting that an option gave is refused at that option: too few
 * samples for the confidence at --samples, or at --confidence when only
 * that was given; the others where the profile gave them. (plumb zone and
 * plumb sheet, whose --samples and --seed set the zone too.) */
void cli_zone_at_option(const cli_zone_opts *zo, plumb_diag *diag);

/* Sets r up empty (cli_zone_finish may follow at once). Can't fail. */
void cli_zone_init(cli_zone_run *r, const cli_args *a, const cli_zone_opts *zo);

/* Gets r ready to run on an open study: every option value read and put
 * over the profile's `zone:` map, the settings checked by the study
 * (plumb_study_zone_check_settings; an error in a value an option gave
 * names that option as OPTION:N:COL:, README "Exit status"), --format geojson refused without
 * the site, the --samples-out file opened and progress hooked into r->opt
 * (unless --quiet). PLUMB_EINVAL, PLUMB_EWRITE, PLUMB_ENOMEM. */
plumb_status cli_zone_start(cli_zone_run *r, const cli_study *cs, plumb_diag *diag);

/* The plumb_study_item_fn of the run (user: the cli_zone_run). */
void cli_zone_item(void *user, size_t item, const plumb_fall_spec *spec);

/* Ends a run whose status is st: clears the progress line; when st is
 * PLUMB_OK, makes the report (and --regions-out) in memory and writes
 * every file, all or none, saying what it wrote unless --quiet; otherwise
 * (or when a write fails) removes what this run wrote and prints why (a
 * failed samples file says so). Returns the exit status. */
int cli_zone_finish(cli_zone_run *r, plumb_status st, const plumb_zone_report *rep,
                    plumb_diag *diag);

#endif /* PLUMB_CLI_ZONE_H */
