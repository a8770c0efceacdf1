/*
 * cmd_verify.c - `plumb verify`: the library's published reference checks
 * (include/plumb/verify.h) in text, JSON or CSV. Exit status 1 when a
 * check fails (README.md "Exit status"), 3 when one cannot be computed.
 */
#include <stdio.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb verify [OPTIONS]\n"
    "Published reference checks of this build: the U.S. Standard Atmosphere 1976,\n"
    "WGS 84 normal gravity, Morrison's sphere drag, Pflanz's opening-force factor\n"
    "and the closed forms of a fall in constant air, each computed by plumb and\n"
    "compared with its source.\n"
    "The checks are made and their values published in SI, and stay so: --units us\n"
    "adds each computed and published figure's US customary value beside it, in\n"
    "brackets in the text (7 significant figures), in the columns computed_us,\n"
    "published_us and unit_us in CSV; a figure without a unit or in seconds has\n"
    "none. JSON is always SI.\n"
    "Exit status: 0 every check passed, 1 a check failed, 2 usage error, 3 a check\n"
    "could not be computed.\n";

typedef struct verify_job {
    plumb_report_options opt;
    const plumb_check *checks;
    size_t n;
} verify_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const verify_job *job = ctx;
    return plumb_report_verify(out, &job->opt, job->checks, job->n, diag);
}

int cmd_verify(int argc, char **argv)
{
    cli_args a;
    int rc = cli_parse(argc, argv, CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET, NULL, 0, usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    if (a.n_args > 0) {
        rc = cli_usage_error(a.cmd, "takes no arguments, found '%s'", a.args[0]);
        cli_args_free(&a);
        return rc;
    }
    plumb_check checks[PLUMB_VERIFY_MAX];
    size_t n = 0;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    if (plumb_verify(checks, PLUMB_VERIFY_MAX, &n, &diag) != PLUMB_OK) {
        rc = cli_fail(&diag);
    } else {
        verify_job job = {cli_report_options(&a), checks, n};
        rc = cli_emit(&a, write_report, &job);
        size_t failed = 0;
        for (size_t i = 0; i < n; i++)
            failed += !checks[i].passed;
        if (rc == CLI_EXIT_OK && failed)
            rc = CLI_EXIT_CHECK_FAILED;
    }
    cli_args_free(&a);
    return rc;
}
