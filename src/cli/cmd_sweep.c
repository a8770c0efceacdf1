/*
 * cmd_sweep.c - `plumb sweep PROFILE --vary KEY=FROM:TO:STEP [--vary ...]`:
 * the falls of a profile over one or two ranges of an input, as a table;
 * each row is exactly what `plumb fall --set KEY=VALUE` gives. A sweep
 * that will take long says so on standard error, estimated from its first
 * rows, and on a terminal shows its progress (cli_rows_progress); --quiet
 * silences both.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb sweep PROFILE --vary KEY=FROM:TO:STEP [--vary KEY=FROM:TO:STEP]\n"
    "                   [OPTIONS]\n"
    "A table of falls over a range of one numeric profile key, or over two (a two-way\n"
    "table), each value with its unit:\n"
    "  --vary release.height=2m:60m:2m     --vary wind.speed=0kn:25kn:5kn\n"
    "Every row is exactly what `plumb fall --set KEY=VALUE` gives for that value.\n"
    "PROFILE '-' is read from standard input.\n"
    "A row that cannot be computed (a value out of range, an object that floats, a\n"
    "fall that fails) is reported with its value and why, and the other rows are\n"
    "still given.\n"
    "Exit status: 0 done; 2 input error (a bad range, or every row's input at\n"
    "fault), nothing written; 3 the report is written but some rows could not be\n"
    "computed, or no row could and a fall failed (then nothing is written).\n";

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
    if (a->output && cli_same_file(a->output, a->args[0]))
        return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);
    cli_study cs;
    plumb_diag diag;
    plumb_sweep *sweep = NULL;
    plumb_range axes[PLUMB_MAX_AXES];
    plumb_status st = cli_study_open(a, a->args[0], &cs, &diag);
    /* a bad range is the command line's error; ranges are read with the
     * study's units before any fall is run */
    for (size_t i = 0; st == PLUMB_OK && i < n_vary; i++)
        if ((st = plumb_range_parse_key(cs.units, vary[i], &axes[i], &diag)) != PLUMB_OK &&
            strcmp(diag.file, "--vary") == 0)
            diag.line = (int)i + 1; /* the i-th --vary (README.md "Exit status") */
    if (st == PLUMB_OK) {
        cli_rows_progress e;
        int timed = cli_rows_progress_start(&e, "sweep", "rows") && !a->quiet;
        st = plumb_study_sweep(cs.study, axes, n_vary, timed ? cli_rows_progress_step : NULL, &e,
                               &sweep, &diag);
        cli_progress_clear(&e.shown);
    }
    /* the text of a two-way sweep is its boundary: where each limit is reached */
    if (st == PLUMB_OK && n_vary == 2 && a->format == PLUMB_FORMAT_TEXT)
        st = plumb_study_sweep_boundaries(cs.study, sweep, &diag);
    int rc;
    if (st == PLUMB_OK) {
        sweep_job job = {cli_report_options(a), sweep};
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
    cli_study_close(&cs);
    return rc;
}

int cmd_sweep(int argc, char **argv)
{
    _Static_assert(PLUMB_MAX_AXES <= CLI_OPTION_VALUES, "--vary keeps every range");
    cli_option extra[] = {
        {.name = "--vary", .arg = "KEY=FROM:TO:STEP", .max = PLUMB_MAX_AXES,
         .help = "the key and its range, each value with its unit\n"
                 "(release.height=2m:60m:2m); a negative STEP runs down;\n"
                 "a direction's ends may be compass points, turning\n"
                 "through north as STEP does (wind.from=NW:NE:22.5deg);\n"
                 "given twice, a two-way table"},
    };
    cli_args a;
    int rc = cli_parse(argc, argv,
                       CLI_SET | CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET | CLI_CRITERIA,
                       extra, sizeof extra / sizeof extra[0], usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    rc = run(&a, extra[0].values, extra[0].n_values);
    cli_args_free(&a);
    return rc;
}
