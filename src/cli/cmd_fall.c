/*
 * cmd_fall.c - `plumb fall PROFILE`: the fall of the profile's payload (or
 * of each item of an inventory) from its release point, judged against the
 * named criteria, as text, JSON or CSV (README.md "plumb fall", "The
 * model" and "Criteria").
 *
 * The work is the study's (plumb/study.h): this handler parses the
 * options, opens the study, asks for the falls and writes the report.
 */
#include <stdio.h>
#include <string.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb fall PROFILE [OPTIONS]\n"
    "The fall of the profile's payload from its release point: impact speed, energy\n"
    "(J and ft·lbf), time, drift and bearing, momentum and angle, with a verdict for\n"
    "each criterion the profile names (all criteria when it names none). An inventory\n"
    "profile (items:) gives one row per item and names the worst. PROFILE '-' is read\n"
    "from standard input.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed; nothing is written\n"
    "on an error.\n";

typedef struct fall_job {
    plumb_report_options opt;
    const plumb_fall_report *rep;
} fall_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const fall_job *job = ctx;
    return plumb_report_fall(out, &job->opt, job->rep, diag);
}

static int run(const cli_args *a)
{
    if (a->n_args == 0)
        return cli_usage_error(a->cmd, "needs a PROFILE");
    if (a->n_args > 1)
        return cli_usage_error(a->cmd, "takes one PROFILE, found %zu arguments", a->n_args);
    const char *path = a->args[0];
    if (a->output && cli_same_file(a->output, path))
        return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);

    cli_study cs;
    plumb_diag diag;
    fall_job job = {cli_report_options(a), NULL};
    plumb_status st = cli_study_open(a, path, &cs, &diag);
    if (st == PLUMB_OK)
        st = plumb_study_fall(cs.study, &job.rep, &diag);
    int rc = st == PLUMB_OK ? cli_emit(a, write_report, &job) : cli_fail(&diag);
    cli_study_close(&cs);
    return rc;
}

int cmd_fall(int argc, char **argv)
{
    cli_args a;
    int rc = cli_parse(argc, argv,
                       CLI_SET | CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET | CLI_CRITERIA,
                       NULL, 0, usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    rc = run(&a);
    cli_args_free(&a);
    return rc;
}
