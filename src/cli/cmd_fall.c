/*
 * cmd_fall.c - `plumb fall PROFILE`: the fall of the profile's payload (or
 * of each item of an inventory) from its release point, judged against the
 * named criteria, as text, JSON or CSV (design.md sections 2, 4 and 6).
 *
 * One trajectory workspace (default options: rk8pd, Henon impact location)
 * is reused for every item, and one atmosphere is built per profile.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb fall PROFILE [OPTIONS]\n"
    "The fall of the profile's payload from its release point: impact speed, energy\n"
    "(J and ft-lbf), time, drift and bearing, momentum and angle, with a verdict for\n"
    "each criterion the profile names (all criteria when it names none). An inventory\n"
    "profile (items:) gives one row per item and names the worst. PROFILE '-' is read\n"
    "from standard input.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed; nothing is written\n"
    "on an error.\n";

typedef struct fall_job {
    plumb_report_options opt;
    plumb_fall_report rep;
} fall_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const fall_job *job = ctx;
    return plumb_report_fall(out, &job->opt, &job->rep, diag);
}

/* Points a failed fall's diagnostic at the profile and the item. */
static void locate(plumb_diag *diag, const plumb_profile *prof, size_t item)
{
    if (diag->file[0] == '\0')
        snprintf(diag->file, sizeof diag->file, "%s", plumb_profile_path(prof));
    if (diag->key[0] == '\0' && plumb_profile_is_inventory(prof))
        snprintf(diag->key, sizeof diag->key, "items[%zu]", item + 1); /* from 1 */
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

    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_units *units = NULL;
    plumb_profile *prof = NULL;
    plumb_criteria *crit = NULL;
    plumb_atmosphere *atm = NULL;
    plumb_trajectory *traj = NULL;
    plumb_item_report *items = NULL;
    char dir[CLI_PATH_MAX];

    plumb_status st = plumb_units_alloc(&units, &diag);
    if (st == PLUMB_OK)
        st = cli_profile_load(a, path, units, &prof, &diag);
    if (st == PLUMB_OK)
        st = plumb_criteria_load_dir(cli_criteria_dir(a, dir, sizeof dir), units, &crit, &diag);
    if (st == PLUMB_OK)
        st = plumb_atmosphere_alloc(plumb_profile_atmosphere(prof), &atm, &diag);
    if (st == PLUMB_OK && (st = plumb_trajectory_alloc(NULL, &traj)) != PLUMB_OK) {
        diag.status = st;
        snprintf(diag.message, sizeof diag.message, "cannot make the trajectory workspace: %s",
                 plumb_strerror(st));
    }
    size_t n = st == PLUMB_OK ? plumb_profile_item_count(prof) : 0;
    if (st == PLUMB_OK && (items = calloc(n ? n : 1, sizeof *items)) == NULL) {
        st = diag.status = PLUMB_ENOMEM;
        snprintf(diag.message, sizeof diag.message, "out of memory");
    }
    for (size_t i = 0; st == PLUMB_OK && i < n; i++) {
        items[i].spec = plumb_profile_item(prof, i);
        items[i].shape = plumb_profile_item_shape(prof, i);
        st = plumb_trajectory_run(traj, items[i].spec, atm, &items[i].result, &diag);
        if (st == PLUMB_OK)
            st = plumb_item_judge(&items[i], prof, crit, atm, &diag);
        if (st != PLUMB_OK)
            locate(&diag, prof, i);
    }

    int rc;
    if (st == PLUMB_OK) {
        fall_job job;
        memset(&job, 0, sizeof job);
        job.opt = cli_report_options(a);
        job.rep.profile = prof;
        job.rep.n_items = n;
        job.rep.items = items;
        rc = cli_emit(a, write_report, &job);
    } else {
        rc = cli_fail(&diag);
    }
    free(items);
    plumb_trajectory_free(traj);
    plumb_atmosphere_free(atm);
    plumb_criteria_free(crit);
    plumb_profile_free(prof);
    plumb_units_free(units);
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
