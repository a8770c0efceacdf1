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
 * and renamed into place at the same moment, as is the --regions-out file.
 * The option values, progress and the samples file are in cli_zone.c.
 * Progress goes to standard error only when it is a terminal, the run has
 * taken more than PROGRESS_AFTER_S, and --quiet is not given.
 * Once the run has taken CLI_ESTIMATE_AFTER_S, the time the whole run will take
 * is estimated from the samples done so far; when it is over CLI_NOTE_OVER_S a
 * note says so on standard error (terminal or not: a log shows it too), and
 * over CLI_WARN_OVER_S it is a warning that names a --samples that would fit.
 * The run goes on either way; --quiet silences both. For the tests only,
 * PLUMB_TEST_ESTIMATE_TIMES="AFTER,NOTE,WARN" (seconds) replaces the three.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "cli.h"
#include "cli_zone.h"
#include "plumb/dispersion.h"


static const char usage[] =
    "Usage: plumb zone PROFILE [--samples N] [--seed S] [--threads T] [--confidence P]\n"
    "                  [--target E,N] [--samples-out FILE] [--regions-out FILE]\n"
    "                  [OPTIONS]\n"
    "The clearance zone below a drop, by Monte Carlo over the profile's uncertainty:\n"
    "map: the impact-point cloud (mean, 95 % ellipse), the distance from the planned\n"
    "drop point at 50, 90, 99 and 99.9 % with 95 % intervals, the clearance radius at\n"
    "the confidence asked for (the upper bound of that percentile plus the profile's\n"
    "zone.scatter allowance), impact energy percentiles, the probability of exceeding\n"
    "each criterion, and beside them a radius equal to the drop height and the\n"
    "drag-free throw; and where the impacts land wherever that is: the smallest circle\n"
    "around the cloud and a polygon holding that share of impacts, each with the\n"
    "scatter allowance as a buffer. --format geojson writes them on the map (RFC 7946;\n"
    "needs site.latitude and site.longitude). The figures are the same for any number\n"
    "of threads. A profile without an uncertainty: map is refused.\n"
    "An inventory profile (items:) runs every item with the same samples and seed.\n"
    "PROFILE '-' is read from standard input.\n"
    "A run that will take over 10 s says so on standard error after half a second,\n"
    "over 10 minutes as a warning; on a terminal it shows its progress.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed; nothing is written\n"
    "on an error.\n";

/* ---- the run ------------------------------------------------------------------ */

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

/* A side file (--samples-out, --regions-out) must not be the profile or -o. */
static int check_side(const cli_args *a, const char *opt, const char *file, const char *path)
{
    if (!file)
        return CLI_GO_ON;
    if (file[0] == '\0' || strcmp(file, "-") == 0)
        return cli_usage_error(a->cmd, "%s needs a file name", opt);
    if (cli_same_file(file, path))
        return cli_usage_error(a->cmd, "%s %s would overwrite the profile", opt, file);
    if (a->output && (strcmp(a->output, file) == 0 || cli_same_file(a->output, file)))
        return cli_usage_error(a->cmd, "-o and %s name the same file", opt);
    return CLI_GO_ON;
}

/* Writes what rep says with `write` into a memory buffer. */
static plumb_status render(const plumb_report_options *ropt, const plumb_zone_report *rep,
                           int regions, char **buf, size_t *len, plumb_diag *diag)
{
    FILE *mem = open_memstream(buf, len);
    if (!mem)
        return plumbp_cli_nomem(diag);
    plumb_status st = regions ? plumb_report_zone_regions(mem, rep, diag)
                              : plumb_report_zone(mem, ropt, rep, diag);
    if (fclose(mem) != 0 && st == PLUMB_OK)
        st = plumbp_cli_nomem(diag);
    return st;
}

/* Removes a file this run wrote when a later one failed: a regular file
 * only, never a device or FIFO written in place. */
static void take_back(const char *path, const samples_file *sf)
{
    struct stat st;
    if (path && !(sf && sf->out.in_place) && lstat(path, &st) == 0 && S_ISREG(st.st_mode))
        unlink(path);
}

static int run(const cli_args *a, const cli_zone_opts *zo)
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

    /* The study, then the options: a bad one stops everything before any
     * fall is run. */
    plumb_diag diag;
    cli_study cs;
    samples_file sf;
    memset(&sf, 0, sizeof sf);
    plumb_zone_spec zone;
    plumb_zone_options zopt;
    plumb_zone_options_init(&zopt);
    plumb_status st = cli_study_open(a, path, &cs, &diag);
    if (st == PLUMB_OK)
        st = cli_zone_spec(a, zo, cs.profile, cs.units, path, &zone, &zopt, &diag);
    if (st == PLUMB_OK && zo->samples_out) {
        sf.path = zo->samples_out;
        st = cli_zone_samples_open(&sf, &diag);
    }
    progress_ctx pc;
    cli_zone_progress_init(&pc, a, zo, &zone, &zopt, st == PLUMB_OK ? cs.profile : NULL);
    if (sf.f) {
        zopt.on_sample = cli_zone_samples_row;
        zopt.sample_user = &sf;
    }
    item_ctx ic = {&pc, &sf};
    const plumb_zone_report *rep = NULL;
    if (st == PLUMB_OK)
        st = plumb_study_zone(cs.study, &zone, &zopt, on_item, &ic, &rep, &diag);
    cli_zone_progress_clear(&pc);
    if (st != PLUMB_OK && sf.failed) { /* the samples file stopped the run: say why */
        plumb_diag_clear(&diag);
        diag.status = st = PLUMB_EWRITE;
        snprintf(diag.file, sizeof diag.file, "%s", sf.path);
        snprintf(diag.message, sizeof diag.message, "cannot write the samples: %s",
                 strerror(sf.failed));
    }

    /* Everything in memory first; then the files, all or none. */
    char *buf = NULL, *rbuf = NULL;
    size_t len = 0, rlen = 0;
    plumb_report_options ropt = cli_report_options(a);
    if (st == PLUMB_OK)
        st = render(&ropt, rep, 0, &buf, &len, &diag);
    if (st == PLUMB_OK && zo->regions_out)
        st = render(&ropt, rep, 1, &rbuf, &rlen, &diag);
    if (st == PLUMB_OK)
        st = cli_zone_samples_close(&sf, 1, &diag);
    if (st == PLUMB_OK && zo->regions_out) {
        st = cli_write_output(zo->regions_out, rbuf, rlen, &diag);
        if (st != PLUMB_OK)
            take_back(sf.path, &sf);
    }
    if (st == PLUMB_OK) {
        st = cli_write_output(a->output, buf, len, &diag);
        if (st != PLUMB_OK) { /* the report failed: take the other files back too */
            take_back(sf.path, &sf);
            take_back(zo->regions_out, NULL);
        }
    }
    if (st == PLUMB_OK) {
        const char *wrote[3] = {a->output && strcmp(a->output, "-") != 0 ? a->output : NULL,
                                sf.path, zo->regions_out};
        for (int k = 0; k < 3 && !a->quiet; k++)
            if (wrote[k])
                fprintf(stderr, "plumb: wrote %s\n", wrote[k]);
        rc = CLI_EXIT_OK;
    } else {
        cli_zone_samples_close(&sf, 0, NULL);
        rc = cli_fail(&diag);
    }
    free(buf);
    free(rbuf);
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
        {.name = "--regions-out", .arg = "FILE",
         .help = "the circles and landing regions as polygons in local\n"
                 "metres east and north (CSV, one row per vertex)"},
    };
    cli_args a;
    int rc = cli_parse(argc, argv,
                       CLI_SET | CLI_FORMAT | CLI_GEOJSON | CLI_UNITS | CLI_OUTPUT | CLI_QUIET |
                           CLI_CRITERIA,
                       extra, sizeof extra / sizeof extra[0], usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    cli_zone_opts zo = {extra[0].value, extra[1].value, extra[2].value, extra[3].value,
                        extra[4].value, extra[5].value, extra[6].value};
    rc = run(&a, &zo);
    cli_args_free(&a);
    return rc;
}
