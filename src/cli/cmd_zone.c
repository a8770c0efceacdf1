/*
 * cmd_zone.c - `plumb zone PROFILE`: the Monte Carlo clearance zone of the
 * profile's payload (or of each item of an inventory) over its
 * `uncertainty:` distributions (README.md "plumb zone"; the method is in
 * include/plumb/dispersion.h).
 *
 * Defaults come from the profile's `zone:` map; --samples, --seed,
 * --threads, --confidence and --target override them. Every option is
 * checked before anything runs; the report is made in memory and written
 * (atomically, with -o) only when the whole run succeeded, and the
 * --samples-out file is written to a temporary file beside its destination
 * and renamed into place at the same moment, as is the --regions-out file.
 * What happens around the run (option values, progress, the files) is in
 * cli_zone.c.
 * Progress goes to standard error only when it is a terminal, the run has
 * taken more than PROGRESS_AFTER_S, and --quiet is not given.
 * Once the run has taken CLI_ESTIMATE_AFTER_S, the time the whole run will take
 * is estimated from the samples done so far; when it is over CLI_NOTE_OVER_S a
 * note says so on standard error (terminal or not: a log shows it too), and
 * over CLI_WARN_OVER_S it is a warning that names a --samples that would fit.
 * The run goes on either way; --quiet silences both. For the tests only,
 * PLUMB_TEST_ESTIMATE_TIMES="AFTER,NOTE,WARN" (seconds) replaces the three.
 */
#include "cli.h"
#include "cli_zone.h"

static const char usage[] =
    "Usage: plumb zone PROFILE [--samples N] [--seed S] [--threads T]\n"
    "                  [--confidence P]\n"
    "                  [--target E,N] [--samples-out FILE] [--regions-out FILE]\n"
    "                  [OPTIONS]\n"
    "The clearance zone below a drop, by Monte Carlo over the profile's uncertainty:\n"
    "map: the impact-point cloud (mean, 95 % ellipse), the distance from the planned\n"
    "drop point at 50, 90, 99 and 99.9 % with 95 % intervals, the clearance radius at\n"
    "the confidence asked for (the upper bound of that percentile plus the profile's\n"
    "zone.scatter allowance), impact energy percentiles, the probability of exceeding\n"
    "each criterion, and beside them a radius equal to the drop height and the\n"
    "drag-free throw; and where the impacts land wherever that is: the smallest\n"
    "circle around the cloud and a polygon holding that share of impacts, each with\n"
    "the scatter allowance as a buffer. --format geojson writes them on the map (RFC\n"
    "7946; needs site.latitude and site.longitude). The figures are the same for any\n"
    "number of threads. A profile without an uncertainty: map is refused.\n"
    "An inventory profile (items:) runs every item with the same samples and seed.\n"
    "PROFILE '-' is read from standard input.\n"
    "A run that will take over 10 s says so on standard error after half a second,\n"
    "over 10 minutes as a warning; on a terminal it shows its progress.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed; nothing is written\n"
    "on an error.\n";

/* Parses, asks the study, writes (the work around the run is cli_zone.c's). */
static int run(const cli_args *a, const cli_zone_opts *zo)
{
    int rc = cli_zone_check_files(a, zo);
    if (rc != CLI_GO_ON)
        return rc;
    plumb_diag diag;
    cli_study cs;
    cli_zone_run zr;
    cli_zone_init(&zr, a, zo);
    const plumb_zone_report *rep = NULL;
    /* every option checked before any fall is run */
    plumb_status st = cli_study_open(a, a->args[0], &cs, &diag);
    if (st == PLUMB_OK)
        st = plumb_study_zone_check(cs.study, &diag);
    if (st == PLUMB_OK)
        st = cli_zone_start(&zr, &cs, &diag);
    if (st == PLUMB_OK)
        st = plumb_study_zone(cs.study, &zr.zone, &zr.opt, cli_zone_item, &zr, &rep, &diag);
    rc = cli_zone_finish(&zr, st, rep, &diag);
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
