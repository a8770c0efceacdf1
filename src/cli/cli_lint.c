/*
 * cli_lint.c - one profile of `plumb lint` (cmd_lint.c) checked as `plumb
 * fall` reads it, without computing a fall: YAML, keys, units, ranges and
 * the named criteria, every error in file order, then the atmosphere
 * (plumb_study_lint).
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

/* Checks one profile into e (errs: CLI_LINT_MAX diagnostics of its own); in
 * text prints its errors (with --units us, a range's US limits). Returns
 * its exit status. The criteria set is loaded on first need into *crit. */
int cli_lint_one(const cli_args *a, const plumb_units *units, const char *path,
                 plumb_criteria **crit, plumb_diag *errs, plumb_lint_entry *e)
{
    size_t n = 0;
    char dir[CLI_PATH_MAX];
    const char *cdir = cli_criteria_dir(a, dir, sizeof dir);
    plumb_diag_clear(&errs[0]);
    plumb_status st;
    if (strcmp(path, "-") != 0) {
        st = plumb_study_lint(path, NULL, 0, units, a->sets, a->n_sets, cdir, crit, errs,
                              CLI_LINT_MAX, &n);
    } else {
        char *buf = NULL;
        size_t len;
        st = cli_read_stdin(PLUMB_PROFILE_MAX_BYTES, &buf, &len, &errs[0]);
        n = st != PLUMB_OK;
        if (st == PLUMB_OK)
            st = plumb_study_lint(CLI_STDIN_NAME, buf, len, units, a->sets, a->n_sets, cdir,
                                  crit, errs, CLI_LINT_MAX, &n);
        free(buf);
    }
    *e = (plumb_lint_entry){strcmp(path, "-") == 0 ? CLI_STDIN_NAME : path, errs, 0, 1};
    if (st == PLUMB_OK)
        return CLI_EXIT_OK;
    plumb_diag ld;
    if (plumb_units_load_error(units, &ld) != PLUMB_OK)
        return cli_fail(&ld); /* told alone, with no report (cmd_lint.c) */
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
