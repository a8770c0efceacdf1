/*
 * cli_sheet_exec.c - `plumb sheet` is run by a program of its own,
 * plumb-sheet (sheet_main.c).
 *
 * The printable sheet needs cairo and pango, and with them some thirty
 * shared libraries (glib, fontconfig, freetype, harfbuzz, X11, ...) that
 * the dynamic loader maps and relocates at every start of a program
 * linked with them, whether it draws or not. Measured on the 2-core CI
 * machine: an empty program linked with libplumb's libraries starts in
 * 4.9 ms, the same program also linked with pangocairo in 16.6 ms. So
 * only plumb-sheet links them, and plumb hands `sheet` over to it with
 * execv, its arguments and environment unchanged: every other command
 * starts three times sooner, and the sheet is exactly what it was.
 *
 * plumb-sheet is looked for beside the running program (the build tree),
 * then where `make install` puts it (PLUMB_LIBEXEC_DIR), then in
 * ../libexec/plumb from the running program (an installed tree that was
 * moved, or installed with another PREFIX than it was built with).
 */
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "cli.h"

#ifndef PLUMB_LIBEXEC_DIR
#define PLUMB_LIBEXEC_DIR "/usr/local/libexec/plumb"
#endif

#define SHEET_PROGRAM "plumb-sheet"

int cli_sheet_exec(int argc, char **argv)
{
    char here[CLI_PATH_MAX], moved[CLI_PATH_MAX];
    const char *where[3];
    size_t n_where = 0;
    if (cli_beside_self(SHEET_PROGRAM, here, sizeof here))
        where[n_where++] = here;
    where[n_where++] = PLUMB_LIBEXEC_DIR "/" SHEET_PROGRAM;
    if (cli_beside_self("../libexec/plumb/" SHEET_PROGRAM, moved, sizeof moved))
        where[n_where++] = moved;

    /* plumb-sheet's argv: its path, then "sheet" and the options as given */
    char **args = calloc((size_t)argc + 2, sizeof *args);
    if (!args) {
        fprintf(stderr, "plumb sheet: out of memory\n");
        return CLI_EXIT_FAILED;
    }
    for (int i = 0; i < argc; i++)
        args[i + 1] = argv[i];
    for (size_t i = 0; i < n_where; i++) {
        if (access(where[i], X_OK) != 0)
            continue;
        char path[CLI_PATH_MAX];
        snprintf(path, sizeof path, "%s", where[i]);
        args[0] = path;
        fflush(NULL);
        execv(path, args);
        int e = errno;
        fprintf(stderr, "plumb sheet: cannot run %s: %s\n", where[i], strerror(e));
        free(args);
        return CLI_EXIT_FAILED;
    }
    free(args);
    fprintf(stderr,
            "plumb sheet: the sheet is drawn by the program %s, which is not installed\n"
            "(looked beside this program, in ../libexec/plumb from it and in %s);\n"
            "build it with 'make', or "
            "install plumb again with 'make install'\n",
            SHEET_PROGRAM, PLUMB_LIBEXEC_DIR);
    return CLI_EXIT_FAILED;
}
