/*
 * cli.c - what every plumb subcommand shares (see cli.h): option parsing,
 * error printing, atomic output files, the criteria directory lookup.
 */

#include <errno.h>
#include <fcntl.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "cli.h"

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

plumb_report_options cli_report_options(const cli_args *a)
{
    plumb_report_options o;
    memset(&o, 0, sizeof o);
    o.format = a->format;
    o.units = a->units;
    o.version = plumb_version();
    return o;
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
            printf("plumb %s\n", plumb_version());
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

