/*
 * cmd_limit.c - `plumb limit PROFILE --find KEY (--energy-max E |
 * --speed-max V | --drift-max D)`: the value of one input at which the
 * limit is just met, by bracketing and GSL's Brent root finder
 * (libplumb's inverse module); or, in words, why no value does.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb limit PROFILE --find KEY\n"
    "                   (--energy-max E | --speed-max V | --drift-max D) [OPTIONS]\n"
    "The value of a numeric profile key (release.height, payload.mass, descent.area,\n"
    "wind.speed, ...) at which the impact energy, impact speed or drift just meets\n"
    "the limit; or why no value in the physical range does. Give --find and exactly\n"
    "one of the limits. PROFILE '-' is read from standard input.\n"
    "In an inventory, payload.X is answered for each item and items[N].X (or\n"
    "items[NAME].X) for that item only, each under the key --set takes: re-running\n"
    "`plumb fall --set KEY=VALUE` at the value found meets the limit.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed; nothing is written\n"
    "on an error.\n";

typedef struct limit_job {
    plumb_report_options opt;
    const plumb_limit_report *rep;
} limit_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const limit_job *job = ctx;
    return plumb_report_limit(out, &job->opt, job->rep, diag);
}

enum { OPT_FIND, OPT_ENERGY, OPT_SPEED, OPT_DRIFT, N_OPT };

static int run(const cli_args *a, const cli_option *o)
{
    if (a->n_args != 1)
        return cli_usage_error(a->cmd, "takes one PROFILE, found %zu arguments", a->n_args);
    if (!o[OPT_FIND].value)
        return cli_usage_error(a->cmd, "needs --find KEY");
    int n_limits = !!o[OPT_ENERGY].value + !!o[OPT_SPEED].value + !!o[OPT_DRIFT].value;
    if (n_limits != 1)
        return cli_usage_error(a->cmd, "needs exactly one of --energy-max, --speed-max, --drift-max");
    if (a->output && cli_same_file(a->output, a->args[0]))
        return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);

    plumb_metric metric = o[OPT_ENERGY].value ? PLUMB_METRIC_ENERGY
                          : o[OPT_SPEED].value ? PLUMB_METRIC_SPEED
                                               : PLUMB_METRIC_DRIFT;
    int which = metric == PLUMB_METRIC_ENERGY ? OPT_ENERGY
                : metric == PLUMB_METRIC_SPEED ? OPT_SPEED
                                               : OPT_DRIFT;
    cli_study cs;
    plumb_diag diag;
    double limit = 0.0;
    const plumb_criterion *criterion = NULL;
    limit_job job = {cli_report_options(a), NULL};
    plumb_status st = cli_study_open(a, a->args[0], &cs, &diag);
    if (st == PLUMB_OK)
        st = plumb_study_limit_value(cs.study, metric, o[which].value, o[which].name, &limit,
                                     &criterion, &diag);
    if (st == PLUMB_OK)
        st = plumb_study_limit(cs.study, o[OPT_FIND].value, metric, limit, criterion, NULL,
                               &job.rep, &diag);
    /* an error in the key --find gave, not located, is that option's */
    if (st != PLUMB_OK && strcmp(diag.key, o[OPT_FIND].value) == 0 && !diag.file[0])
        cli_option_blame(&diag, o[OPT_FIND].name, diag.key);
    int rc = st == PLUMB_OK ? cli_emit(a, write_report, &job) : cli_fail(&diag);
    cli_study_close(&cs);
    return rc;
}

int cmd_limit(int argc, char **argv)
{
    cli_option o[N_OPT] = {
        [OPT_FIND] = {.name = "--find", .arg = "KEY",
                      .help = "the numeric profile key to solve for (release.height,\n"
                              "payload.mass, descent.area, wind.speed, ...)"},
        [OPT_ENERGY] = {.name = "--energy-max", .arg = "E",
                        .help = "the impact energy limit with its unit (\"25 ft lbf\", 40J),\n"
                                "or a criterion's id (us-part107-cat3)"},
        [OPT_SPEED] = {.name = "--speed-max", .arg = "V",
                       .help = "the impact speed limit with its unit (8m/s)"},
        [OPT_DRIFT] = {.name = "--drift-max", .arg = "D",
                       .help = "the drift limit with its unit (30m)"},
    };
    cli_args a;
    int rc = cli_parse(argc, argv,
                       CLI_SET | CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET | CLI_CRITERIA, o,
                       N_OPT, usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    rc = run(&a, o);
    cli_args_free(&a);
    return rc;
}
