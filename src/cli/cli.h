/*
 * cli.h - what every plumb subcommand shares (internal to the command line,
 * not part of libplumb): option parsing, error printing with the exit
 * statuses of design.md section 6, atomic output files and the lookup of
 * the criteria directory. The command line uses libplumb's public API only.
 *
 * Exit statuses: 0 done; 2 usage or input error (nothing written); 3 the
 * computation failed (nothing written).
 *
 * The definitions are compiled once, in main.c, which defines
 * CLI_IMPLEMENTATION before including this header; the cmd_*.c files see
 * the declarations only.
 *
 * Atomic output (POSIX): the report is written to a temporary file made by
 * mkstemp in the output's own directory, flushed to disk with fsync, given
 * the permissions a new file would get (0666 less the umask) and renamed
 * over the destination; rename(2) within one file system is atomic, so a
 * reader sees the old file or the whole new one, never a part.
 */
#ifndef PLUMB_CLI_H
#define PLUMB_CLI_H

#include <stddef.h>
#include "plumb/plumb.h"

enum { CLI_EXIT_OK = 0, CLI_EXIT_INPUT = 2, CLI_EXIT_FAILED = 3 };

/* cli_parse's "carry on" result: not an exit status. */
#define CLI_GO_ON (-1)

/* Longest path the command line builds, bytes (Linux PATH_MAX). */
#define CLI_PATH_MAX 4096

/* The common options a subcommand accepts (a bit set for cli_parse). */
enum {
    CLI_SET = 1u << 0,       /* --set KEY=VALUE, repeatable */
    CLI_FORMAT = 1u << 1,    /* --format text|json|csv */
    CLI_UNITS = 1u << 2,     /* --units si|us */
    CLI_OUTPUT = 1u << 3,    /* -o FILE, --output FILE */
    CLI_QUIET = 1u << 4,     /* --quiet */
    CLI_CRITERIA = 1u << 5   /* --criteria-dir DIR */
};

/* An option of one subcommand that takes a value ("--alt 0m:20km:1km" or
 * "--alt=0m:20km:1km"); the last one given wins. */
typedef struct cli_option {
    const char *name;        /* "--alt" */
    const char *value;       /* NULL until given; points into argv */
} cli_option;

/* A parsed command line. Strings point into argv; the arrays are owned. */
typedef struct cli_args {
    const char *cmd;             /* subcommand name, for messages */
    const char **sets;           /* --set values, in order */
    size_t n_sets;
    plumb_format format;         /* default text */
    plumb_unit_system units;     /* default si */
    const char *output;          /* -o FILE, or NULL for standard output */
    int quiet;                   /* --quiet given */
    const char *criteria_dir;    /* --criteria-dir, or NULL */
    const char **args;           /* positional arguments */
    size_t n_args;
} cli_args;

/* One subcommand: its name, its handler (argv[0] is the subcommand name)
 * and a one-line help for `plumb --help`. */
typedef struct cli_command {
    const char *name;
    int (*run)(int argc, char **argv);
    const char *help;
} cli_command;

/* Parses argv[1..argc) of a subcommand. Options may come before or after
 * the positional arguments; "--" ends the options. `accept` says which
 * common options the subcommand takes; `extra` lists its own n_extra
 * options with values. `usage` is the subcommand's help text, printed by
 * --help on standard output with the common options appended.
 * Returns CLI_GO_ON when the caller should carry on, else an exit status:
 * 0 after --help or --version, 2 after a usage error (already printed).
 * On CLI_GO_ON the caller owns *a and frees it with cli_args_free. */
int cli_parse(int argc, char **argv, unsigned accept, cli_option *extra, size_t n_extra,
              const char *usage, cli_args *a);

/* Frees the arrays of a parsed command line. Accepts a zeroed struct. */
void cli_args_free(cli_args *a);

/* Prints "plumb CMD: message" and a hint to stderr; returns 2. */
int cli_usage_error(const char *cmd, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;

/* Prints "plumb: " + the formatted diagnostic to stderr; returns 2 for an
 * input error (plumb_status_is_input_error), else 3. */
int cli_fail(const plumb_diag *diag);

/* Writes len bytes of buf to `path` atomically (see the top of this file),
 * or to standard output when path is NULL or "-". On error nothing is left
 * behind (the temporary file is removed) and diag says why (PLUMB_EIO). */
plumb_status cli_write_output(const char *path, const char *buf, size_t len, plumb_diag *diag);

/* 1 when path `out` is an existing file that is the same file as `in`. */
int cli_same_file(const char *out, const char *in);

/* The criteria directory: --criteria-dir, else $PLUMB_CRITERIA_DIR, else
 * <directory of /proc/self/exe>/../profiles/criteria (build tree), else
 * <exe dir>/../share/plumb/criteria (installed), else ./profiles/criteria.
 * The result is a, the environment, a literal, or buf (size bytes). */
const char *cli_criteria_dir(const cli_args *a, char *buf, size_t size);

/* Runs `make` (a report writer) into a memory stream (POSIX
 * open_memstream) and, only when it succeeds, writes the whole text with
 * cli_write_output. Returns the exit status, the error printed. */
int cli_emit(const cli_args *a, plumb_status (*make)(FILE *out, const void *ctx, plumb_diag *diag),
             const void *ctx);

/* The subcommands (cmd_<name>.c). */
int cmd_fall(int argc, char **argv);
int cmd_air(int argc, char **argv);
int cmd_lint(int argc, char **argv);

/* ------------------------------------------------------------------------- */
#ifdef CLI_IMPLEMENTATION

#include <errno.h>
#include <fcntl.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

static const char cli_common_help[] =
    "Common options:\n"
    "  --set KEY=VALUE      override a profile value, same keys and units as the YAML\n"
    "                       (e.g. --set release.height=\"30 ft\"); repeatable\n"
    "  --format FORMAT      text (default), json or csv\n"
    "  --units SYSTEM       si (default) or us: display units of text and CSV\n"
    "                       (JSON is always SI)\n"
    "  -o, --output FILE    write the report to FILE (atomically), not to standard output\n"
    "  --quiet              no notices on standard error\n"
    "  --criteria-dir DIR   the criteria files (default: $PLUMB_CRITERIA_DIR, or the\n"
    "                       installed or built-in profiles/criteria)\n"
    "  --help               this help\n"
    "  --version            the program version\n";

/* The lines of cli_common_help each option has, by accept bit. */
static void cli_print_common(unsigned accept)
{
    static const struct { unsigned bit; const char *prefix; int lines; } rows[] = {
        {CLI_SET, "  --set ", 2},        {CLI_FORMAT, "  --format ", 1},
        {CLI_UNITS, "  --units ", 2},    {CLI_OUTPUT, "  -o, --output ", 1},
        {CLI_QUIET, "  --quiet ", 1},    {CLI_CRITERIA, "  --criteria-dir ", 2},
        {0, "  --help ", 1},             {0, "  --version ", 1},
    };
    printf("\nOptions:\n");
    for (size_t i = 0; i < sizeof rows / sizeof rows[0]; i++) {
        if (rows[i].bit && !(accept & rows[i].bit))
            continue;
        const char *p = strstr(cli_common_help, rows[i].prefix);
        for (int k = 0; p && k < rows[i].lines; k++) {
            const char *nl = strchr(p, '\n');
            printf("%.*s\n", (int)(nl - p), p);
            p = nl + 1;
        }
    }
}

int cli_usage_error(const char *cmd, const char *fmt, ...)
{
    va_list ap;
    fprintf(stderr, "plumb%s%s: ", cmd ? " " : "", cmd ? cmd : "");
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fprintf(stderr, "\nTry 'plumb%s%s --help'.\n", cmd ? " " : "", cmd ? cmd : "");
    return CLI_EXIT_INPUT;
}

int cli_fail(const plumb_diag *diag)
{
    char buf[PLUMB_DIAG_FILE + PLUMB_DIAG_KEY + PLUMB_DIAG_MSG + 64];
    plumb_diag_format(diag, buf, sizeof buf);
    fprintf(stderr, "plumb: %s\n", buf);
    return plumb_status_is_input_error(diag->status) ? CLI_EXIT_INPUT : CLI_EXIT_FAILED;
}

void cli_args_free(cli_args *a)
{
    free(a->sets);
    free(a->args);
    a->sets = NULL;
    a->args = NULL;
    a->n_sets = a->n_args = 0;
}

/* The value of an option: "--name=value" or the next argument. */
static const char *cli_value(int argc, char **argv, int *i, const char *arg, size_t name_len)
{
    if (arg[name_len] == '=')
        return arg + name_len + 1;
    if (*i + 1 < argc)
        return argv[++*i];
    return NULL;
}

/* 1 when arg is the option `name` alone or as "name=value". */
static int cli_is(const char *arg, const char *name)
{
    size_t n = strlen(name);
    return strncmp(arg, name, n) == 0 && (arg[n] == '\0' || arg[n] == '=');
}

int cli_parse(int argc, char **argv, unsigned accept, cli_option *extra, size_t n_extra,
              const char *usage, cli_args *a)
{
    memset(a, 0, sizeof *a);
    a->cmd = argv[0];
    a->format = PLUMB_FORMAT_TEXT;
    a->units = PLUMB_UNITS_SI;
    size_t cap = argc > 0 ? (size_t)argc : 1;
    a->sets = malloc(cap * sizeof *a->sets);
    a->args = malloc(cap * sizeof *a->args);
    if (!a->sets || !a->args) {
        cli_args_free(a);
        fprintf(stderr, "plumb: out of memory\n");
        return CLI_EXIT_FAILED;
    }
    int options_done = 0;
    for (int i = 1; i < argc; i++) {
        const char *arg = argv[i];
        if (options_done || arg[0] != '-' || strcmp(arg, "-") == 0) {
            a->args[a->n_args++] = arg;
            continue;
        }
        if (strcmp(arg, "--") == 0) {
            options_done = 1;
            continue;
        }
        if (strcmp(arg, "--help") == 0 || strcmp(arg, "-h") == 0) {
            fputs(usage, stdout);
            cli_print_common(accept);
            cli_args_free(a);
            return CLI_EXIT_OK;
        }
        if (strcmp(arg, "--version") == 0) {
            printf("plumb %s\n", PLUMB_VERSION);
            cli_args_free(a);
            return CLI_EXIT_OK;
        }
        const char *name = NULL, *value = NULL;
        int found = 0;
        static const struct { const char *name; unsigned bit; int takes_value; } common[] = {
            {"--set", CLI_SET, 1},       {"--format", CLI_FORMAT, 1},
            {"--units", CLI_UNITS, 1},   {"--output", CLI_OUTPUT, 1},
            {"-o", CLI_OUTPUT, 1},       {"--quiet", CLI_QUIET, 0},
            {"--criteria-dir", CLI_CRITERIA, 1},
        };
        for (size_t k = 0; !found && k < sizeof common / sizeof common[0]; k++) {
            if (!(accept & common[k].bit) || !cli_is(arg, common[k].name))
                continue;
            found = 1;
            name = common[k].name;
            if (!common[k].takes_value) {
                if (arg[strlen(name)] == '=') {
                    cli_args_free(a);
                    return cli_usage_error(a->cmd, "%s takes no value", name);
                }
            } else if (!(value = cli_value(argc, argv, &i, arg, strlen(name)))) {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "%s needs a value", name);
            }
        }
        for (size_t k = 0; !found && k < n_extra; k++) {
            if (!cli_is(arg, extra[k].name))
                continue;
            found = 1;
            name = extra[k].name;
            if (!(value = cli_value(argc, argv, &i, arg, strlen(name)))) {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "%s needs a value", name);
            }
            extra[k].value = value;
        }
        if (!found) {
            cli_args_free(a);
            return cli_usage_error(a->cmd, "unknown option '%s'", arg);
        }
        if (strcmp(name, "--set") == 0) {
            if (!strchr(value, '=') || value[0] == '=') {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "--set needs KEY=VALUE, found '%s'", value);
            }
            a->sets[a->n_sets++] = value;
        } else if (strcmp(name, "--format") == 0) {
            if (strcmp(value, "text") == 0)
                a->format = PLUMB_FORMAT_TEXT;
            else if (strcmp(value, "json") == 0)
                a->format = PLUMB_FORMAT_JSON;
            else if (strcmp(value, "csv") == 0)
                a->format = PLUMB_FORMAT_CSV;
            else {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "--format must be text, json or csv, found '%s'",
                                       value);
            }
        } else if (strcmp(name, "--units") == 0) {
            if (strcmp(value, "si") == 0)
                a->units = PLUMB_UNITS_SI;
            else if (strcmp(value, "us") == 0)
                a->units = PLUMB_UNITS_US;
            else {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "--units must be si or us, found '%s'", value);
            }
        } else if (strcmp(name, "--output") == 0 || strcmp(name, "-o") == 0) {
            if (value[0] == '\0') {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "%s needs a file name", name);
            }
            a->output = value;
        } else if (strcmp(name, "--quiet") == 0) {
            a->quiet = 1;
        } else if (strcmp(name, "--criteria-dir") == 0) {
            a->criteria_dir = value;
        }
    }
    return CLI_GO_ON;
}

int cli_same_file(const char *out, const char *in)
{
    struct stat so, si;
    if (!out || !in || stat(out, &so) != 0 || stat(in, &si) != 0)
        return 0;
    return so.st_dev == si.st_dev && so.st_ino == si.st_ino;
}

static plumb_status cli_io_error(plumb_diag *diag, const char *path, const char *what, int err)
{
    plumb_diag_clear(diag);
    diag->status = PLUMB_EIO;
    snprintf(diag->file, sizeof diag->file, "%s", path);
    snprintf(diag->message, sizeof diag->message, "%s: %s", what, strerror(err));
    return PLUMB_EIO;
}

static int cli_write_all(int fd, const char *buf, size_t len)
{
    while (len > 0) {
        ssize_t w = write(fd, buf, len);
        if (w < 0) {
            if (errno == EINTR)
                continue;
            return -1;
        }
        buf += w;
        len -= (size_t)w;
    }
    return 0;
}

plumb_status cli_write_output(const char *path, const char *buf, size_t len, plumb_diag *diag)
{
    if (!path || strcmp(path, "-") == 0) {
        if ((len > 0 && fwrite(buf, 1, len, stdout) != len) || fflush(stdout) != 0)
            return cli_io_error(diag, "<standard output>", "cannot write", errno);
        return PLUMB_OK;
    }
    const char *slash = strrchr(path, '/');
    const char *base = slash ? slash + 1 : path;
    if (*base == '\0' || strcmp(base, ".") == 0 || strcmp(base, "..") == 0)
        return cli_io_error(diag, path, "cannot write the report", EISDIR);
    char dir[CLI_PATH_MAX], tmp[CLI_PATH_MAX];
    if (!slash)
        snprintf(dir, sizeof dir, ".");
    else if (slash == path)
        snprintf(dir, sizeof dir, "/");
    else
        snprintf(dir, sizeof dir, "%.*s", (int)(slash - path), path);
    if (snprintf(tmp, sizeof tmp, "%s/.%s.XXXXXX", dir, base) >= (int)sizeof tmp)
        return cli_io_error(diag, path, "cannot write the report", ENAMETOOLONG);

    int fd = mkstemp(tmp);
    if (fd < 0)
        return cli_io_error(diag, path, "cannot create a temporary file beside it", errno);
    mode_t mask = umask(0);
    umask(mask);
    int err = 0;
    if (cli_write_all(fd, buf, len) != 0 || fsync(fd) != 0 ||
        fchmod(fd, (mode_t)(0666 & ~mask)) != 0)
        err = errno;
    if (close(fd) != 0 && !err)
        err = errno;
    if (!err && rename(tmp, path) != 0)
        err = errno;
    if (err) {
        unlink(tmp);
        return cli_io_error(diag, path, "cannot write the report", err);
    }
    /* Make the rename itself durable; a failure here loses nothing written. */
    int dfd = open(dir, O_RDONLY);
    if (dfd >= 0) {
        (void)fsync(dfd);
        close(dfd);
    }
    return PLUMB_OK;
}

static int cli_is_dir(const char *path)
{
    struct stat st;
    return stat(path, &st) == 0 && S_ISDIR(st.st_mode);
}

const char *cli_criteria_dir(const cli_args *a, char *buf, size_t size)
{
    if (a && a->criteria_dir)
        return a->criteria_dir;
    const char *env = getenv("PLUMB_CRITERIA_DIR");
    if (env && *env)
        return env;
    char exe[CLI_PATH_MAX];
    ssize_t n = readlink("/proc/self/exe", exe, sizeof exe - 1);
    if (n > 0) {
        exe[n] = '\0';
        char *slash = strrchr(exe, '/');
        if (slash) {
            *slash = '\0';
            static const char *const rel[] = {"../profiles/criteria", "../share/plumb/criteria"};
            for (size_t i = 0; i < sizeof rel / sizeof rel[0]; i++) {
                int len = snprintf(buf, size, "%s/%s", exe, rel[i]);
                if (len > 0 && (size_t)len < size && cli_is_dir(buf))
                    return buf;
            }
        }
    }
    return "profiles/criteria";
}

int cli_emit(const cli_args *a, plumb_status (*make)(FILE *out, const void *ctx, plumb_diag *diag),
             const void *ctx)
{
    plumb_diag diag;
    plumb_diag_clear(&diag);
    char *buf = NULL;
    size_t len = 0;
    FILE *mem = open_memstream(&buf, &len);
    if (!mem) {
        fprintf(stderr, "plumb: out of memory\n");
        return CLI_EXIT_FAILED;
    }
    plumb_status st = make(mem, ctx, &diag);
    if (fclose(mem) != 0 && st == PLUMB_OK) {
        plumb_diag_clear(&diag);
        diag.status = st = PLUMB_ENOMEM;
    }
    if (st == PLUMB_OK)
        st = cli_write_output(a->output, buf, len, &diag);
    free(buf);
    if (st != PLUMB_OK)
        return cli_fail(&diag);
    if (a->output && strcmp(a->output, "-") != 0 && !a->quiet)
        fprintf(stderr, "plumb: wrote %s\n", a->output);
    return CLI_EXIT_OK;
}

#endif /* CLI_IMPLEMENTATION */
#endif /* PLUMB_CLI_H */
