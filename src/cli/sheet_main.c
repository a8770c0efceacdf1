/*
 * sheet_main.c - plumb-sheet: the `plumb sheet` command as a program of
 * its own, so that only it links cairo and pango (cli_sheet_exec.c says
 * why). plumb runs it as `plumb-sheet sheet OPTIONS...`; run by hand,
 * `plumb-sheet OPTIONS...` works the same.
 */
#include <string.h>

#include <gsl/gsl_errno.h>

#include "cli.h"

int main(int argc, char **argv)
{
    /* GSL must report errors as status codes, never abort. */
    gsl_set_error_handler_off();

    if (argc >= 2 && strcmp(argv[1], "sheet") == 0)
        return cmd_sheet(argc - 1, argv + 1);
    static char name[] = "sheet";
    argv[0] = name;
    return cmd_sheet(argc, argv);
}
