/*
 * cmd_lint.c - `plumb lint PROFILE...`: checks profiles as `plumb fall`
 * reads them (cli_lint.c: YAML, keys, units and ranges by
 * plumb_profile_lint, the atmosphere, the named criteria) without
 * computing a fall, and reports them all in one report
 * (plumb_report_lint).
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb lint PROFILE... [OPTIONS]\n"
    "Checks each profile as `plumb fall` reads it - YAML, keys, units, ranges, the\n"
    "atmosphere and the named criteria - without computing a fall. Text prints\n"
    "\"PROFILE: ok\" for each good profile (not with --quiet); each bad one gets its\n"
    "located errors on standard error, every one found in file order (up to 16).\n"
    "JSON and CSV are one report of every profile, its errors in it (file, line,\n"
    "column, key, message apart) with the cautions; on standard error only a count\n"
    "of the bad ones (not with --quiet). The exit status is 2 when any profile is\n"
    "bad, yet the report is written all the same, to standard output or -o FILE\n"
    "(atomically): the errors found are what lint reports, not a failure to\n"
    "report. A usage error writes nothing; a failed check (out of memory) exits 3\n"
    "and writes nothing.\n"
    "--units us: a value outside its key's range gets the range again in US\n"
    "customary units after the message (\"[US: > 0 lb]\"), in text and CSV; nothing\n"
    "else changes (profiles are read in the units they are written in; JSON is SI).\n"
    "A PROFILE '-' is read from standard input (once).\n";

typedef struct lint_job {
    plumb_report_options opt;
    const plumb_lint_entry *e;
    size_t n;
} lint_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const lint_job *job = ctx;
    return plumb_report_lint(out, &job->opt, job->e, job->n, diag);
}

/* Lints every profile of a into one report; returns the exit status. */
static int lint_all(const cli_args *a, plumb_units *units)
{
    plumb_diag *errs = calloc(a->n_args * CLI_LINT_MAX, sizeof *errs);
    plumb_lint_entry *e = calloc(a->n_args, sizeof *e);
    plumb_criteria *crit = NULL;
    int rc = CLI_EXIT_OK;
    size_t bad = 0;
    if (!errs || !e) {
        fprintf(stderr, "plumb: out of memory\n");
        rc = CLI_EXIT_FAILED;
    }
    /* a failed load of the units' database ends the run (cli_lint_one)
     * with no report; in text form, the diagnostics of the profiles
     * linted before it have already gone to stderr */
    int no_db = 0;
    for (size_t i = 0; rc != CLI_EXIT_FAILED && !no_db && i < a->n_args; i++) {
        int one = cli_lint_one(a, units, a->args[i], &crit, errs + i * CLI_LINT_MAX, &e[i]);
        rc = one > rc ? one : rc;
        bad += e[i].n_errors > 0;
        no_db = plumb_units_load_error(units, NULL) != PLUMB_OK;
    }
    plumb_criteria_free(crit);
    if (rc != CLI_EXIT_FAILED && !no_db &&
        !(a->quiet && !a->output && a->format == PLUMB_FORMAT_TEXT)) {
        lint_job job = {cli_report_options(a), e, a->n_args};
        int wrc = cli_emit(a, write_report, &job);
        rc = wrc > rc ? wrc : rc;
    }
    if (rc == CLI_EXIT_INPUT && !no_db && a->format != PLUMB_FORMAT_TEXT && !a->quiet)
        fprintf(stderr, "plumb lint: errors in %zu of %zu profiles, listed in the report\n",
                bad, a->n_args);
    free(e);
    free(errs);
    return rc;
}

int cmd_lint(int argc, char **argv)
{
    cli_args a;
    int rc = cli_parse(argc, argv,
                       CLI_SET | CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET | CLI_CRITERIA,
                       NULL, 0, usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    size_t n_stdin = 0, same = a.n_args;
    for (size_t i = 0; i < a.n_args; i++) {
        n_stdin += strcmp(a.args[i], "-") == 0;
        if (a.output && same == a.n_args && cli_same_file(a.output, a.args[i]))
            same = i;
    }
    if (a.n_args == 0)
        rc = cli_usage_error(a.cmd, "needs at least one PROFILE");
    else if (n_stdin > 1)
        rc = cli_usage_error(a.cmd, "'-' (standard input) may be given once, found %zu times",
                             n_stdin);
    else if (same < a.n_args)
        rc = cli_usage_error(a.cmd, "-o %s would overwrite the profile", a.output);
    if (rc != CLI_GO_ON) {
        cli_args_free(&a);
        return rc;
    }
    plumb_diag diag;
    plumb_units *units = NULL;
    if (plumb_units_alloc_deferred(&units, &diag) != PLUMB_OK)
        rc = cli_fail(&diag);
    else
        rc = lint_all(&a, units);
    plumb_units_free(units);
    cli_args_free(&a);
    return rc;
}
