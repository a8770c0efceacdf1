/*
 * main.c - the plumb command line: a table of subcommands over libplumb
 * (README.md "Command reference"). Each subcommand lives in cmd_<name>.c;
 * what they share (option parsing, atomic output, error printing) is in
 * cli.c.
 */
#include <stdio.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "cli.h"

static const cli_command commands[] = {
    {"fall", cmd_fall, "one fall: impact speed, energy, time, drift, verdicts"},
    {"sweep", cmd_sweep, "a table of falls over a range of an input (--vary KEY=FROM:TO:STEP)"},
    {"limit", cmd_limit, "the value of an input at which a limit is just met (--find KEY)"},
    {"zone", cmd_zone, "clearance zone by Monte Carlo over the profile's uncertainty"},
    {"sheet", cli_sheet_exec, "the printable safety sheet: one PDF of one or more profiles (-o FILE)"},
    {"air", cmd_air, "air properties by altitude (--alt 0m:20km:1km)"},
    {"verify", cmd_verify, "published reference checks of this build (exit 1 on a failure)"},
    {"lint", cmd_lint, "validate profiles"},
};
enum { N_COMMANDS = sizeof commands / sizeof commands[0] };

static void usage(FILE *f)
{
    fprintf(f, "Usage: plumb COMMAND [OPTIONS] [ARGS]\n"
               "A drop-and-descent safety calculator: how fast and how hard a falling object\n"
               "arrives, where it lands, and which published criteria that breaks.\n\n"
               "Commands:\n");
    for (size_t i = 0; i < N_COMMANDS; i++)
        fprintf(f, "  %-7s %s\n", commands[i].name, commands[i].help);
    fprintf(f, "\n'plumb COMMAND --help' describes a command and its options.\n"
               "Every report is an engineering estimate; see SAFETY.md.\n");
}

/* The command (or, for a word starting with '-', the option of plumb
 * itself) nearest to a mistyped one, or NULL (plumb_suggest_closest). */
static const char *nearest(const char *typed)
{
    static const char *const options[] = {"--help", "-h", "--version"};
    const char *names[N_COMMANDS + 1];
    for (size_t i = 0; i < N_COMMANDS; i++)
        names[i] = commands[i].name;
    names[N_COMMANDS] = "help";
    if (typed[0] == '-')
        return plumb_suggest_closest(typed, options, sizeof options / sizeof options[0]);
    return plumb_suggest_closest(typed, names, N_COMMANDS + 1);
}

int main(int argc, char **argv)
{
    /* GSL must report errors as status codes, never abort. */
    gsl_set_error_handler_off();

    if (argc < 2) {
        usage(stderr);
        return CLI_EXIT_INPUT;
    }
    const char *name = argv[1];
    if (strcmp(name, "--help") == 0 || strcmp(name, "-h") == 0 || strcmp(name, "help") == 0) {
        if (strcmp(name, "help") == 0 && argc > 2) {
            for (size_t i = 0; i < N_COMMANDS; i++)
                if (strcmp(argv[2], commands[i].name) == 0) {
                    static char help_flag[] = "--help";
                    char *help_argv[] = {argv[2], help_flag, NULL};
                    return commands[i].run(2, help_argv);
                }
            const char *near = nearest(argv[2]);
            return cli_usage_error(NULL, "unknown command '%s'%s%s%s", argv[2],
                                   near ? " (did you mean '" : "", near ? near : "",
                                   near ? "'?)" : "");
        }
        usage(stdout);
        return CLI_EXIT_OK;
    }
    if (strcmp(name, "--version") == 0) {
        printf("plumb %s\n", plumb_version());
        return CLI_EXIT_OK;
    }
    for (size_t i = 0; i < N_COMMANDS; i++)
        if (strcmp(name, commands[i].name) == 0)
            return commands[i].run(argc - 1, argv + 1);

    const char *near = nearest(name);
    fprintf(stderr, "plumb: unknown %s '%s'%s%s%s; the commands are:",
            name[0] == '-' ? "option" : "command", name, near ? " (did you mean '" : "",
            near ? near : "", near ? "'?)" : "");
    for (size_t i = 0; i < N_COMMANDS; i++)
        fprintf(stderr, " %s", commands[i].name);
    fprintf(stderr, "\nTry 'plumb --help'.\n");
    return CLI_EXIT_INPUT;
}
