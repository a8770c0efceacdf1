/*
 * cmd_sweep.c - `plumb sweep PROFILE --vary KEY=FROM:TO:STEP [--vary ...]`:
 * the falls of a profile over one or two ranges of an input, as a table;
 * each row is exactly what `plumb fall --set KEY=VALUE` gives.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb sweep PROFILE --vary KEY=FROM:TO:STEP [--vary KEY=FROM:TO:STEP] [OPTIONS]\n"
    "A table of falls over a range of one numeric profile key, or over two (a two-way\n"
    "table), each value with its unit:\n"
    "  --vary release.height=2m:60m:2m     --vary wind.speed=0kn:25kn:5kn\n"
    "Every row is exactly what `plumb fall --set KEY=VALUE` gives for that value.\n"
    "A row that cannot be computed (a value out of range, a fall that never lands)\n"
    "is reported with its value and why, and the other rows are still given.\n"
    "Exit status: 0 done; 2 input error (a bad range, or no row can be computed for\n"
    "one), nothing written; 3 the report is written but some rows could not be\n"
    "computed, or no row could (then nothing is written).\n";

typedef struct sweep_job {
    plumb_report_options opt;
    const plumb_sweep *sweep;
} sweep_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const sweep_job *job = ctx;
    return plumb_report_sweep(out, &job->opt, job->sweep, diag);
}

static int run(const cli_args *a, const char *const *vary, size_t n_vary)
{
    if (a->n_args != 1)
        return cli_usage_error(a->cmd, "takes one PROFILE, found %zu arguments", a->n_args);
    if (n_vary == 0)
        return cli_usage_error(a->cmd, "needs --vary KEY=FROM:TO:STEP");
    if (n_vary > PLUMB_MAX_AXES)
        return cli_usage_error(a->cmd, "takes at most %d --vary ranges", PLUMB_MAX_AXES);
    if (a->output && cli_same_file(a->output, a->args[0]))
        return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_units *units = NULL;
    plumb_profile *prof = NULL;
    plumb_criteria *crit = NULL;
    plumb_trajectory *traj = NULL;
    plumb_sweep *sweep = NULL;
    plumb_range axes[PLUMB_MAX_AXES];
    char dir[CLI_PATH_MAX];

    plumb_status st = plumb_units_alloc(&units, &diag);
    for (size_t i = 0; st == PLUMB_OK && i < n_vary; i++)
        st = plumb_range_parse_key(units, vary[i], &axes[i], &diag);
    if (st == PLUMB_OK)
        st = cli_profile_load(a, a->args[0], units, &prof, &diag);
    if (st == PLUMB_OK)
        st = plumb_criteria_load_dir(cli_criteria_dir(a, dir, sizeof dir), units, &crit, &diag);
    if (st == PLUMB_OK)
        st = plumb_trajectory_alloc(NULL, &traj);
    if (st == PLUMB_OK)
        st = plumb_sweep_run(prof, units, crit, axes, n_vary, traj, &sweep, &diag);
    int rc;
    if (st == PLUMB_OK) {
        sweep_job job;
        memset(&job, 0, sizeof job);
        job.opt = cli_report_options(a);
        job.sweep = sweep;
        rc = cli_emit(a, write_report, &job);
        size_t failed = plumb_sweep_failed_count(sweep);
        if (rc == CLI_EXIT_OK && failed > 0) {
            /* the report is written, with these rows' errors in it */
            fprintf(stderr, "plumb sweep: %zu of %zu rows could not be computed; the report "
                            "gives each one's value and why\n",
                    failed, plumb_sweep_row_count(sweep));
            rc = CLI_EXIT_FAILED;
        }
    } else {
        if (diag.status == PLUMB_OK)
            diag.status = st;
        rc = cli_fail(&diag);
    }
    plumb_sweep_free(sweep);
    plumb_trajectory_free(traj);
    plumb_criteria_free(crit);
    plumb_profile_free(prof);
    plumb_units_free(units);
    return rc;
}

int cmd_sweep(int argc, char **argv)
{
    /* --vary repeats: collect every value, then let cli_parse see the rest */
    const char *vary[PLUMB_MAX_AXES + 1];
    size_t n_vary = 0;
    char **rest = malloc((size_t)(argc > 0 ? argc : 1) * sizeof *rest);
    int n_rest = 0;
    if (!rest) {
        fprintf(stderr, "plumb: out of memory\n");
        return CLI_EXIT_FAILED;
    }
    for (int i = 0; i < argc; i++) {
        const char *arg = argv[i];
        const char *value = NULL;
        if (strcmp(arg, "--vary") == 0) {
            if (i + 1 >= argc) {
                free(rest);
                return cli_usage_error(argv[0], "--vary needs KEY=FROM:TO:STEP");
            }
            value = argv[++i];
        } else if (strncmp(arg, "--vary=", 7) == 0) {
            value = arg + 7;
        }
        if (value) {
            if (n_vary > PLUMB_MAX_AXES) {
                free(rest);
                return cli_usage_error(argv[0], "takes at most %d --vary ranges", PLUMB_MAX_AXES);
            }
            vary[n_vary++] = value;
        } else {
            rest[n_rest++] = argv[i];
        }
    }
    cli_args a;
    int rc = cli_parse(n_rest, rest,
                       CLI_SET | CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET | CLI_CRITERIA,
                       NULL, 0, usage, &a);
    if (rc == CLI_GO_ON) {
        rc = run(&a, vary, n_vary);
        cli_args_free(&a);
    }
    free(rest);
    return rc;
}
