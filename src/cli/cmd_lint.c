/*
 * cmd_lint.c - `plumb lint PROFILE...`: checks profiles as `plumb fall`
 * reads them (YAML, keys, units and ranges by plumb_profile_load, the
 * atmosphere by plumb_atmosphere_alloc, the named criteria by
 * plumb_item_judge) without computing a fall.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

static const char usage[] =
    "Usage: plumb lint PROFILE... [OPTIONS]\n"
    "Checks each profile as `plumb fall` reads it - YAML, keys, units, ranges, the\n"
    "atmosphere and the named criteria - without computing a fall. Prints\n"
    "\"PROFILE: ok\" for each good profile; each bad one gets its located errors on\n"
    "standard error, every one found in file order, and the exit status is 2. A\n"
    "PROFILE '-' is read from standard input (once).\n";

/* At most this many errors are listed per profile. */
enum { LINT_MAX = 16 };

/* Loads the profile for the checks after it, or lists the errors of the
 * file (plumb_profile_lint) when it does not load; one load either way. */
static plumb_status lint_load(const cli_args *a, const char *path, const plumb_units *units,
                              plumb_profile **prof, plumb_diag *errs, size_t *n_errs)
{
    *prof = NULL;
    *n_errs = 0;
    if (strcmp(path, "-") != 0)
        return plumb_profile_lint(path, units, a->sets, a->n_sets, errs, LINT_MAX, n_errs, prof);
    char *buf;
    size_t len;
    plumb_status st = cli_read_stdin(PLUMB_PROFILE_MAX_BYTES, &buf, &len, &errs[0]);
    if (st != PLUMB_OK) {
        *n_errs = 1;
        return st;
    }
    st = plumb_profile_lint_buffer(CLI_STDIN_NAME, buf, len, units, a->sets, a->n_sets, errs,
                                   LINT_MAX, n_errs, prof);
    free(buf);
    return st;
}

/* Checks one profile; prints every error the loader finds in it, in file
 * order, or its one error of the air or the criteria, and returns the exit
 * status. The criteria set is loaded on first need into *crit. */
static int lint_one(const cli_args *a, const plumb_units *units, const char *path,
                    plumb_criteria **crit)
{
    plumb_diag errs[LINT_MAX];
    size_t n = 0;
    plumb_diag_clear(&errs[0]);
    plumb_profile *prof = NULL;
    plumb_atmosphere *atm = NULL;
    plumb_status st = lint_load(a, path, units, &prof, errs, &n);
    if (st == PLUMB_OK)
        st = plumb_atmosphere_alloc(plumb_profile_atmosphere(prof), &atm, &errs[0]);
    if (st == PLUMB_OK && plumb_profile_criteria_count(prof) > 0) {
        char dir[CLI_PATH_MAX];
        if (!*crit)
            st = plumb_criteria_load_dir(cli_criteria_dir(a, dir, sizeof dir), units, crit,
                                         &errs[0]);
        if (st == PLUMB_OK)
            st = plumb_profile_criteria_check(prof, *crit, &errs[0]);
    }
    plumb_atmosphere_free(atm);
    plumb_profile_free(prof);
    const char *name = strcmp(path, "-") == 0 ? CLI_STDIN_NAME : path;
    if (st == PLUMB_OK) {
        if (!a->quiet)
            printf("%s: ok\n", name);
        return CLI_EXIT_OK;
    }
    int rc = CLI_EXIT_OK;
    for (size_t i = 0; i < (n ? n : 1); i++) {
        if (errs[i].file[0] == '\0')
            snprintf(errs[i].file, sizeof errs[i].file, "%s", name);
        int one = cli_fail(&errs[i]);
        rc = one > rc ? one : rc;
    }
    return rc;
}

int cmd_lint(int argc, char **argv)
{
    cli_args a;
    int rc = cli_parse(argc, argv, CLI_SET | CLI_QUIET | CLI_CRITERIA, NULL, 0, usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    if (a.n_args == 0) {
        rc = cli_usage_error(a.cmd, "needs at least one PROFILE");
        cli_args_free(&a);
        return rc;
    }
    size_t n_stdin = 0;
    for (size_t i = 0; i < a.n_args; i++)
        n_stdin += strcmp(a.args[i], "-") == 0;
    if (n_stdin > 1) {
        rc = cli_usage_error(a.cmd, "'-' (standard input) may be given once, found %zu times",
                             n_stdin);
        cli_args_free(&a);
        return rc;
    }
    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_units *units = NULL;
    plumb_criteria *crit = NULL;
    if (plumb_units_alloc(&units, &diag) != PLUMB_OK) {
        rc = cli_fail(&diag);
    } else {
        rc = CLI_EXIT_OK;
        for (size_t i = 0; i < a.n_args; i++) {
            int one = lint_one(&a, units, a.args[i], &crit);
            if (one > rc)
                rc = one;
        }
        if (fflush(stdout) != 0) {
            fprintf(stderr, "plumb: cannot write to standard output\n");
            rc = CLI_EXIT_FAILED; /* not the user's input */
        }
    }
    plumb_criteria_free(crit);
    plumb_units_free(units);
    cli_args_free(&a);
    return rc;
}
