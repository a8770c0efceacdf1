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
    "Usage: plumb limit PROFILE --find KEY (--energy-max E | --speed-max V | --drift-max D)\n"
    "The value of a numeric profile key (release.height, payload.mass, descent.area,\n"
    "wind.speed, ...) at which the impact energy, impact speed or drift just meets the\n"
    "limit; or why no value in the physical range does. Give --find and exactly one\n"
    "of the limits. PROFILE '-' is read from standard input.\n"
    "Re-running `plumb fall --set KEY=VALUE` at the value found meets the limit.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed; nothing is written\n"
    "on an error.\n";

typedef struct limit_job {
    plumb_report_options opt;
    plumb_limit_report rep;
} limit_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const limit_job *job = ctx;
    return plumb_report_limit(out, &job->opt, &job->rep, diag);
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

    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_units *units = NULL;
    plumb_profile *prof = NULL;
    plumb_criteria *crit = NULL;
    plumb_trajectory *traj = NULL;
    plumb_limit_result *res = NULL;
    char dir[CLI_PATH_MAX];
    plumb_metric metric = o[OPT_ENERGY].value ? PLUMB_METRIC_ENERGY
                          : o[OPT_SPEED].value ? PLUMB_METRIC_SPEED
                                               : PLUMB_METRIC_DRIFT;
    const char *opt_name = o[OPT_ENERGY].value ? "--energy-max"
                           : o[OPT_SPEED].value ? "--speed-max"
                                                : "--drift-max";
    const char *text = o[metric == PLUMB_METRIC_ENERGY ? OPT_ENERGY
                         : metric == PLUMB_METRIC_SPEED ? OPT_SPEED
                                                        : OPT_DRIFT].value;
    plumb_dim dim = metric == PLUMB_METRIC_ENERGY ? PLUMB_DIM_ENERGY
                    : metric == PLUMB_METRIC_SPEED ? PLUMB_DIM_SPEED
                                                   : PLUMB_DIM_LENGTH;
    double limit = 0.0;
    const char *criterion = NULL;
    const plumb_criterion *criterion_info = NULL;

    plumb_status st = plumb_units_alloc(&units, &diag);
    if (st == PLUMB_OK)
        st = plumb_criteria_load_dir(cli_criteria_dir(a, dir, sizeof dir), units, &crit, &diag);
    if (st == PLUMB_OK) {
        const plumb_criterion *c = metric == PLUMB_METRIC_ENERGY ? plumb_criteria_find(crit, text)
                                                                 : NULL;
        if (c) {
            limit = c->energy_limit_j;
            criterion = c->id;
            criterion_info = c;
        } else {
            st = plumb_units_parse(units, text, dim, &limit, &diag);
            if (st != PLUMB_OK) {
                static const char more[] = " (or a criterion's name)";
                size_t len = strlen(diag.message);
                if (metric == PLUMB_METRIC_ENERGY && len + sizeof more <= sizeof diag.message)
                    memcpy(diag.message + len, more, sizeof more);
                snprintf(diag.file, sizeof diag.file, "<command line>");
                snprintf(diag.key, sizeof diag.key, "%s", opt_name);
            } else if (!(limit > 0.0)) {
                st = diag.status = PLUMB_ERANGE;
                snprintf(diag.file, sizeof diag.file, "<command line>");
                snprintf(diag.key, sizeof diag.key, "%s", opt_name);
                snprintf(diag.message, sizeof diag.message, "the limit must be > 0, found '%s'",
                         text);
            }
        }
    }
    if (st == PLUMB_OK) {
        plumb_dim kd;
        st = plumb_profile_key_dim(o[OPT_FIND].value, &kd, &diag);
        if (st != PLUMB_OK && !diag.file[0])
            snprintf(diag.file, sizeof diag.file, "<command line>");
    }
    if (st == PLUMB_OK)
        st = cli_profile_load(a, a->args[0], units, &prof, &diag);
    if (st == PLUMB_OK)
        st = plumb_profile_criteria_check(prof, crit, &diag);
    if (st == PLUMB_OK)
        st = plumb_trajectory_alloc(NULL, &traj);
    size_t n = st == PLUMB_OK ? plumb_profile_item_count(prof) : 0;
    if (st == PLUMB_OK && !(res = calloc(n, sizeof *res)))
        st = diag.status = PLUMB_ENOMEM;
    for (size_t i = 0; st == PLUMB_OK && i < n; i++)
        st = plumb_limit_solve(prof, units, i, o[OPT_FIND].value, metric, limit, NULL, traj,
                               &res[i], &diag);
    int rc;
    if (st == PLUMB_OK) {
        limit_job job;
        memset(&job, 0, sizeof job);
        job.opt = cli_report_options(a);
        job.rep = (plumb_limit_report){prof, o[OPT_FIND].value, metric, limit, criterion, n, res,
                                       criterion_info};
        rc = cli_emit(a, write_report, &job);
    } else {
        if (diag.status == PLUMB_OK)
            diag.status = st;
        rc = cli_fail(&diag);
    }
    free(res);
    plumb_trajectory_free(traj);
    plumb_criteria_free(crit);
    plumb_profile_free(prof);
    plumb_units_free(units);
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
