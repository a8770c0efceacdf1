/*
 * cli_progress.c - the estimate and progress line of a run counted in rows
 * (cli.h, cli_rows_progress): `plumb sweep`'s. The zone's, counted in
 * samples over items and passes, is cli_zone.c's.
 */
#include <stdio.h>
#include <string.h>
#include <time.h>
#include <unistd.h>

#include "cli.h"

int cli_rows_progress_start(cli_rows_progress *e, const char *cmd, const char *what)
{
    memset(e, 0, sizeof *e);
    e->cmd = cmd;
    e->what = what;
    e->tty = isatty(STDERR_FILENO);
    cli_estimate_times(&e->after_s, &e->note_s, &e->warn_s);
    return clock_gettime(CLOCK_MONOTONIC, &e->start) == 0;
}

static void progress(cli_rows_progress *e, size_t done, size_t total, double elapsed)
{
    if (!e->tty || (e->shown && elapsed - e->drawn_s < CLI_PROGRESS_EVERY_S))
        return;
    char left[32];
    cli_duration(elapsed * (double)(total - done) / (double)done, left, sizeof left);
    fprintf(stderr, "\rplumb %s: %3.0f %% (%zu of %zu %s, about %s left)  ", e->cmd,
            100.0 * (double)done / (double)total, done, total, e->what, left);
    fflush(stderr);
    e->shown = 1;
    e->drawn_s = elapsed;
}

void cli_rows_progress_step(void *user, size_t done, size_t total)
{
    cli_rows_progress *e = user;
    struct timespec now;
    if (done == 0 || done >= total || clock_gettime(CLOCK_MONOTONIC, &now) != 0)
        return;
    double elapsed = (double)(now.tv_sec - e->start.tv_sec) +
                     1e-9 * (double)(now.tv_nsec - e->start.tv_nsec);
    if (elapsed < e->after_s)
        return;
    if (e->done) {
        progress(e, done, total, elapsed);
        return;
    }
    e->done = 1;
    double all_s = elapsed * (double)total / (double)done;
    if (all_s <= e->note_s)
        return;
    char len[32];
    cli_duration(all_s, len, sizeof len);
    fprintf(stderr, "plumb %s: %sthis %s will take about %s (timed on the first %zu of %zu "
                    "%s)%s\n",
            e->cmd, all_s > e->warn_s ? "warning: " : "", e->cmd, len, done, total, e->what,
            all_s > e->warn_s ? "; it goes on, Ctrl-C stops it" : "");
    fflush(stderr);
}
