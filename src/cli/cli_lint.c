/*
 * cli_lint.c - one profile of `plumb lint` (cmd_lint.c) checked as `plumb
 * fall` reads it: YAML, keys, units and ranges by plumb_profile_lint
 * (every error in file order), then the atmosphere by
 * plumb_atmosphere_alloc and the named criteria against the criteria
 * directory, without computing a fall.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

/* Loads the profile for the checks after it, or lists the errors of the
 * file (plumb_profile_lint) when it does not load; one load either way. */
static plumb_status lint_load(const cli_args *a, const char *path, const plumb_units *units,
                              plumb_profile **prof, plumb_diag *errs, size_t *n_errs)
{
    *prof = NULL;
    *n_errs = 0;
    if (strcmp(path, "-") != 0)
        return plumb_profile_lint(path, units, a->sets, a->n_sets, errs, CLI_LINT_MAX, n_errs,
                                  prof);
    char *buf;
    size_t len;
    plumb_status st = cli_read_stdin(PLUMB_PROFILE_MAX_BYTES, &buf, &len, &errs[0]);
    if (st != PLUMB_OK) {
        *n_errs = 1;
        return st;
    }
    st = plumb_profile_lint_buffer(CLI_STDIN_NAME, buf, len, units, a->sets, a->n_sets, errs,
                                   CLI_LINT_MAX, n_errs, prof);
    free(buf);
    return st;
}

/* Checks one profile into e (errs: CLI_LINT_MAX diagnostics of its own); in
 * text prints its errors (with --units us, a range's US limits). Returns
 * its exit status. The criteria set is loaded on first need into *crit. */
int cli_lint_one(const cli_args *a, const plumb_units *units, const char *path,
                 plumb_criteria **crit, plumb_diag *errs, plumb_lint_entry *e)
{
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
    *e = (plumb_lint_entry){strcmp(path, "-") == 0 ? CLI_STDIN_NAME : path, errs, 0, 1};
    if (st == PLUMB_OK)
        return CLI_EXIT_OK;
    e->n_errors = n ? n : 1;
    e->listed_all = e->n_errors < CLI_LINT_MAX;
    int rc = CLI_EXIT_OK;
    for (size_t i = 0; i < e->n_errors; i++) {
        if (errs[i].file[0] == '\0')
            snprintf(errs[i].file, sizeof errs[i].file, "%s", e->profile);
        int one = plumb_status_is_input_error(errs[i].status) ? CLI_EXIT_INPUT : CLI_EXIT_FAILED;
        if (a->format == PLUMB_FORMAT_TEXT || one == CLI_EXIT_FAILED) {
            plumb_diag d = errs[i];
            plumb_report_diag_message(&errs[i], a->units, d.message, sizeof d.message);
            cli_fail(&d);
        }
        rc = one > rc ? one : rc;
    }
    return rc;
}
