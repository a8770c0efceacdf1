/*
 * cli.c - what every plumb subcommand shares (see cli.h): option parsing,
 * error printing, the criteria directory lookup; the files a command
 * reads and writes are cli_files.c's.
 */

#include <errno.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>
#include <unistd.h>

#include "cli.h"

/* The options every subcommand may accept (by its `accept` bits): how
 * they are spelt, whether they take a value, and their help. */
typedef struct cli_common {
    const char *name;        /* "--output" */
    const char *alias;       /* "-o", or NULL */
    unsigned bit;            /* CLI_* accept bit, 0 for --help and --version */
    int takes_value;
    const char *arg;         /* its value in the help */
    const char *help;        /* lines split by '\n' */
    const char *pdf_help;    /* its help where the command writes a PDF (no --format), or NULL */
    const char *geo_help;    /* its help where the command also writes GeoJSON, or NULL */
} cli_common;

static const cli_common common_options[] = {
    {"--set", NULL, CLI_SET, 1, "KEY=VALUE",
     "override a profile value, same keys and units as the YAML\n"
     "(e.g. --set release.height=\"30 ft\"); repeatable", NULL, NULL},
    {"--format", NULL, CLI_FORMAT, 1, "FORMAT", "text (default), json or csv", NULL,
     "text (default), json, csv or geojson (RFC 7946,\n"
     "needs site.latitude and site.longitude)"},
    {"--units", NULL, CLI_UNITS, 1, "SYSTEM",
     "si (default) or us: display units of text and CSV\n(JSON is always SI)",
     "si (default) or us: the units on the sheet (SI in\nbrackets beside US)", NULL},
    {"--output", "-o", CLI_OUTPUT, 1, "FILE",
     "write the report to FILE (atomically), not to standard\noutput; "
     "a .json, .csv or .txt name sets the format",
     "write the PDF to FILE (atomically); a name ending in\n.txt, .json, .csv or .geojson "
     "is refused",
     "write the report to FILE (atomically), not to standard\noutput; "
     "a .json, .csv, .txt or .geojson name sets the\nformat"},
    {"--quiet", NULL, CLI_QUIET, 0, NULL, "no notices on standard error", NULL, NULL},
    {"--criteria-dir", NULL, CLI_CRITERIA, 1, "DIR",
     "the criteria files (default: $PLUMB_CRITERIA_DIR, or the\n"
     "installed or built-in profiles/criteria)", NULL, NULL},
    {"--help", "-h", 0, 0, NULL, "this help", NULL, NULL},
    {"--version", NULL, 0, 0, NULL, "the program version", NULL, NULL},
};
enum { N_COMMON = sizeof common_options / sizeof common_options[0] };

/* Column the help of an option starts at. */
#define HELP_COL 23

/* One option of the help: "  -o, --output FILE    write ...", its help's
 * further lines indented to HELP_COL; a label too long for the column
 * gets a line of its own. */
static void cli_print_option(const char *alias, const char *name, const char *arg,
                             const char *help)
{
    char label[128];
    snprintf(label, sizeof label, "  %s%s%s%s%s", alias ? alias : "", alias ? ", " : "", name,
             arg ? " " : "", arg ? arg : "");
    size_t len = strlen(label);
    if (len + 1 > HELP_COL)
        printf("%s\n%*s", label, HELP_COL, "");
    else
        printf("%s%*s", label, (int)(HELP_COL - len), "");
    for (const char *p = help; *p;) {
        const char *nl = strchr(p, '\n');
        size_t n = nl ? (size_t)(nl - p) : strlen(p);
        printf("%.*s\n", (int)n, p);
        p += n;
        if (*p == '\n') {
            p++;
            printf("%*s", HELP_COL, "");
        }
    }
}

/* The "Options:" list of --help: the command's own, then the common ones
 * it accepts. */
static void cli_print_options(unsigned accept, const cli_option *extra, size_t n_extra)
{
    printf("\nOptions:\n");
    for (size_t i = 0; i < n_extra; i++)
        cli_print_option(NULL, extra[i].name, extra[i].arg, extra[i].help ? extra[i].help : "");
    for (size_t i = 0; i < N_COMMON; i++) {
        const cli_common *c = &common_options[i];
        if (c->bit && !(accept & c->bit))
            continue;
        const char *help = c->pdf_help && !(accept & CLI_FORMAT) ? c->pdf_help
                           : c->geo_help && (accept & CLI_GEOJSON) ? c->geo_help
                                                                    : c->help;
        cli_print_option(c->alias, c->name, c->arg, help);
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

/* Every error in an option's value goes through plumb_diag_voption, so
 * that it reads OPTION:1:COL: as a --set's does (README.md "Exit status");
 * an option of a command is given once, so its index is 1. */
plumb_status cli_option_error(plumb_diag *diag, const char *option, int col, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumb_diag_clear(diag);
    plumb_status st = plumb_diag_voption(diag, PLUMB_EINVAL, option, 1, col, NULL, fmt, ap);
    va_end(ap);
    return st;
}

plumb_status cli_option_status(plumb_diag *diag, plumb_status st, const char *option, int col,
                               const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumb_diag_clear(diag);
    st = plumb_diag_voption(diag, st, option, 1, col, NULL, fmt, ap);
    va_end(ap);
    return st;
}

void cli_option_blame(plumb_diag *diag, const char *option, const char *key)
{
    char msg[PLUMB_DIAG_MSG], k[PLUMB_DIAG_KEY]; /* key may be diag->key */
    snprintf(msg, sizeof msg, "%s", diag->message);
    snprintf(k, sizeof k, "%s", key ? key : "");
    int col = diag->file[0] ? 1 : diag->col;
    plumb_diag_option(diag, diag->status, option, 1, col, key ? k : NULL, "%s", msg);
}

plumb_status cli_parse_whole(const char *option, const char *text, double lo, double hi,
                             double *out, plumb_diag *diag)
{
    char *end = NULL;
    errno = 0;
    double v = text[0] == '\0' || text[0] == ' ' ? 0.0 : strtod(text, &end);
    if (text[0] == '\0' || text[0] == ' ' || !end || *end != '\0' || errno == ERANGE ||
        !(v == v) || v != (double)(long long)v || v < lo || v > hi)
        return cli_option_error(diag, option, 1, "expected a whole number from %.0f to %.0f, found "
                                              "'%s'", lo, hi, text);
    *out = v;
    return PLUMB_OK;
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

/* Most options a command accepts, with their aliases (the suggestion's
 * candidates). */
#define CLI_MAX_OPTIONS 40

/* "unknown option '--frmat' (did you mean '--format'?)", the nearest of the
 * options the command accepts; returns 2. */
static int cli_unknown_option(const char *cmd, const char *arg, unsigned accept,
                              const cli_option *extra, size_t n_extra)
{
    const char *names[CLI_MAX_OPTIONS];
    size_t n = 0;
    for (size_t k = 0; k < N_COMMON && n + 2 <= CLI_MAX_OPTIONS; k++) {
        const cli_common *c = &common_options[k];
        if (c->bit && !(accept & c->bit))
            continue;
        names[n++] = c->name;
        if (c->alias)
            names[n++] = c->alias;
    }
    for (size_t k = 0; k < n_extra && n < CLI_MAX_OPTIONS; k++)
        names[n++] = extra[k].name;
    char typed[64]; /* the option without its "=value" */
    snprintf(typed, sizeof typed, "%.*s", (int)strcspn(arg, "="), arg);
    const char *near = plumb_suggest_closest(typed, names, n);
    if (near)
        return cli_usage_error(cmd, "unknown option '%s' (did you mean '%s'?)", arg, near);
    return cli_usage_error(cmd, "unknown option '%s'", arg);
}

/* "--samples may be given once, found '100' and '200'": an option that
 * takes one value, given again. Last-wins would drop the first value in
 * silence (a second -o, a report the user asked for); returns 2. */
static int cli_repeated(const char *cmd, const char *name, const char *first,
                        const char *second)
{
    return cli_usage_error(cmd, "%s may be given once, found '%s' and '%s'", name, first, second);
}

/* The report formats a file name's extension names (case ignored); the
 * sheet's PDF is NAME_PDF. */
#define NAME_PDF (-1)
static const struct {
    const char *ext;
    int format;
    const char *what;
} name_formats[] = {
    {"txt", PLUMB_FORMAT_TEXT, "a text file"},
    {"text", PLUMB_FORMAT_TEXT, "a text file"},
    {"json", PLUMB_FORMAT_JSON, "a JSON file"},
    {"csv", PLUMB_FORMAT_CSV, "a CSV file"},
    {"geojson", PLUMB_FORMAT_GEOJSON, "a GeoJSON file"},
    {"pdf", NAME_PDF, "a PDF file"},
};
enum { N_NAME_FORMATS = sizeof name_formats / sizeof name_formats[0] };

/* "a JSON file" for PLUMB_FORMAT_JSON. */
static const char *format_what(plumb_format f)
{
    for (int k = 0; k < N_NAME_FORMATS; k++)
        if (name_formats[k].format == (int)f)
            return name_formats[k].what;
    return "another format";
}

/* The entry of name_formats that -o's file name names, or -1 (no
 * extension, or one that names no report format). */
static int output_name_format(const char *path)
{
    const char *base = strrchr(path, '/');
    base = base ? base + 1 : path;
    const char *dot = strrchr(base, '.');
    if (!dot || dot == base)
        return -1;
    for (int k = 0; k < N_NAME_FORMATS; k++)
        if (strcasecmp(dot + 1, name_formats[k].ext) == 0)
            return k;
    return -1;
}

int cli_profile_name(const char *path)
{
    const char *base = strrchr(path, '/');
    base = base ? base + 1 : path;
    const char *dot = strrchr(base, '.');
    return dot && dot != base && (strcasecmp(dot + 1, "yaml") == 0 || strcasecmp(dot + 1, "yml") == 0);
}

/* -o's name and the format agree: a .json, .csv, .txt (or .geojson) name
 * chooses the format when --format is not given, and contradicts one that
 * is; a command that writes a PDF (no --format) refuses a report's
 * extension. A person naming a file zone.json expects JSON in it. */
static int check_output_name(cli_args *a, unsigned accept, int format_given)
{
    if (!a->output || strcmp(a->output, "-") == 0)
        return CLI_GO_ON;
    if (cli_profile_name(a->output))
        return cli_usage_error(a->cmd, "-o %s names a profile (.yaml, .yml): a report would "
                               "overwrite it; give %s", a->output,
                               !(accept & CLI_FORMAT) ? "a name ending in .pdf"
                               : accept & CLI_GEOJSON ? "a name ending in .txt, .json, .csv or "
                                                        ".geojson"
                                                      : "a name ending in .txt, .json or .csv");
    int k = output_name_format(a->output);
    if (k < 0)
        return CLI_GO_ON;
    int want = name_formats[k].format;
    if (!(accept & CLI_FORMAT)) {
        if (want == NAME_PDF)
            return CLI_GO_ON;
        return cli_usage_error(a->cmd, "-o %s names %s, but the sheet is a PDF: give a name "
                               "ending in .pdf", a->output, name_formats[k].what);
    }
    if (want == NAME_PDF || (want == PLUMB_FORMAT_GEOJSON && !(accept & CLI_GEOJSON)))
        return cli_usage_error(a->cmd, "-o %s names %s, which this command does not write "
                               "(--format text, json%s csv%s%s)", a->output, name_formats[k].what,
                               accept & CLI_GEOJSON ? "," : " or",
                               accept & CLI_GEOJSON ? " or geojson" : "",
                               want == NAME_PDF ? "; the PDF is plumb sheet's" : "");
    if (format_given && (int)a->format != want)
        return cli_usage_error(a->cmd, "-o %s names %s, but --format asks for %s: make them "
                               "agree", a->output, name_formats[k].what, format_what(a->format));
    a->format = (plumb_format)want;
    return CLI_GO_ON;
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
    int options_done = 0, format_given = 0;
    const char *given[N_COMMON] = {NULL}; /* each common option's value, once given */
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
            cli_print_options(accept, extra, n_extra);
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
        for (size_t k = 0; !found && k < N_COMMON; k++) {
            const cli_common *c = &common_options[k];
            if (!c->bit || !(accept & c->bit))
                continue;
            if (cli_is(arg, c->name))
                name = c->name;
            else if (c->alias && cli_is(arg, c->alias))
                name = c->alias;
            else
                continue;
            found = 1;
            if (!c->takes_value) {
                if (arg[strlen(name)] == '=') {
                    cli_args_free(a);
                    return cli_usage_error(a->cmd, "%s takes no value", name);
                }
            } else if (!(value = cli_value(argc, argv, &i, arg, strlen(name)))) {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "%s needs a value (%s)", name, c->arg);
            }
            name = c->name; /* -o is --output from here on */
            /* one value only: a second would silently replace the first */
            if (c->takes_value && c->bit != CLI_SET) {
                if (given[k]) {
                    cli_args_free(a);
                    return cli_repeated(a->cmd, c->alias ? c->alias : c->name, given[k], value);
                }
                given[k] = value;
            }
        }
        for (size_t k = 0; !found && k < n_extra; k++) {
            cli_option *o = &extra[k];
            if (!cli_is(arg, o->name))
                continue;
            found = 1;
            name = o->name;
            if (!(value = cli_value(argc, argv, &i, arg, strlen(name)))) {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "%s needs a value (%s)", name,
                                       o->arg ? o->arg : "see --help");
            }
            if (o->max == 0 && o->value) {
                cli_args_free(a);
                return cli_repeated(a->cmd, name, o->value, value);
            }
            if (o->max > 0 && o->n_values >= o->max) {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "%s may be given at most %zu time%s", name,
                                       o->max, o->max == 1 ? "" : "s");
            }
            if (o->max > 0 && o->n_values < CLI_OPTION_VALUES)
                o->values[o->n_values] = value;
            o->n_values++;
            o->value = value;
        }
        if (!found) {
            cli_args_free(a);
            return cli_unknown_option(a->cmd, arg, accept, extra, n_extra);
        }
        if (strcmp(name, "--set") == 0) {
            if (!strchr(value, '=') || value[0] == '=') {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "--set needs KEY=VALUE, found '%s'", value);
            }
            a->sets[a->n_sets++] = value;
        } else if (strcmp(name, "--format") == 0) {
            format_given = 1;
            if (strcmp(value, "text") == 0)
                a->format = PLUMB_FORMAT_TEXT;
            else if (strcmp(value, "json") == 0)
                a->format = PLUMB_FORMAT_JSON;
            else if (strcmp(value, "csv") == 0)
                a->format = PLUMB_FORMAT_CSV;
            else if (strcmp(value, "geojson") == 0 && (accept & CLI_GEOJSON))
                a->format = PLUMB_FORMAT_GEOJSON;
            else {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "--format must be text, json%s csv%s, found '%s'",
                                       accept & CLI_GEOJSON ? "," : " or",
                                       accept & CLI_GEOJSON ? " or geojson" : "", value);
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
        } else if (strcmp(name, "--output") == 0) {
            if (value[0] == '\0') {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "%s needs a file name", arg[1] == 'o' ? "-o" : name);
            }
            struct stat sb;
            if (stat(value, &sb) == 0 && S_ISDIR(sb.st_mode)) {
                cli_args_free(a);
                return cli_usage_error(a->cmd, "-o %s is a directory; give a file name", value);
            }
            a->output = value;
        } else if (strcmp(name, "--quiet") == 0) {
            a->quiet = 1;
        } else if (strcmp(name, "--criteria-dir") == 0) {
            a->criteria_dir = value;
        }
    }
    int rc = check_output_name(a, accept, format_given);
    if (rc != CLI_GO_ON)
        cli_args_free(a);
    return rc;
}

/* The profile did not load, for *diag (status st): when that is an error
 * of the file, the error told is instead `plumb lint`'s first
 * (plumb_study_lint: the file's errors and the ids under criteria:, in
 * file order) if it comes before it, so that an unknown criterion id at
 * line 2 is not hidden by a key missing at line 4 (the loader checks
 * no ids; the study does, once the profile loads). buf: the bytes of
 * standard input, else NULL (the file at path is read). */
static plumb_status lint_first(const cli_args *a, const char *path, const char *buf, size_t len,
                               const plumb_units *units, plumb_status st, plumb_diag *diag)
{
    if (!plumb_status_is_input_error(st) || diag->line <= 0 ||
        strcmp(diag->file, PLUMB_DIAG_SET_FILE) == 0)
        return st;
    plumb_diag *errs = calloc(CLI_LINT_MAX, sizeof *errs);
    if (!errs)
        return st; /* the load's own error stands */
    plumb_criteria *crit = NULL;
    char dir[CLI_PATH_MAX];
    size_t n = 0;
    plumb_status sl = plumb_study_lint(buf ? CLI_STDIN_NAME : path, buf, len, units, a->sets,
                                       a->n_sets, cli_criteria_dir(a, dir, sizeof dir), &crit,
                                       errs, CLI_LINT_MAX, &n);
    if (plumb_status_is_input_error(sl) && n > 0 && strcmp(errs[0].file, diag->file) == 0 &&
        errs[0].line > 0 &&
        (errs[0].line < diag->line || (errs[0].line == diag->line && errs[0].col < diag->col))) {
        *diag = errs[0];
        st = sl;
    }
    plumb_criteria_free(crit);
    free(errs);
    return st;
}

plumb_status cli_profile_load(const cli_args *a, const char *path, const plumb_units *units,
                              plumb_profile **out, plumb_diag *diag)
{
    if (strcmp(path, "-") != 0)
        return lint_first(a, path, NULL, 0, units,
                          plumb_profile_load(path, units, a->sets, a->n_sets, out, diag), diag);
    *out = NULL;
    char *buf;
    size_t len;
    plumb_status st = cli_read_stdin(PLUMB_PROFILE_MAX_BYTES, &buf, &len, diag);
    if (st != PLUMB_OK)
        return st;
    st = plumb_profile_load_buffer(CLI_STDIN_NAME, buf, len, units, a->sets, a->n_sets, out, diag);
    if (buf)
        st = lint_first(a, path, buf, len, units, st, diag);
    free(buf);
    return st;
}

plumb_status cli_study_open(const cli_args *a, const char *path, cli_study *cs, plumb_diag *diag)
{
    char dir[CLI_PATH_MAX];
    memset(cs, 0, sizeof *cs);
    plumb_diag_clear(diag);
    plumb_status st = plumb_units_alloc_deferred(&cs->units, diag);
    if (st == PLUMB_OK)
        st = cli_profile_load(a, path, cs->units, &cs->profile, diag);
    if (st == PLUMB_OK)
        st = plumb_criteria_load_dir(cli_criteria_dir(a, dir, sizeof dir), cs->units,
                                     &cs->criteria, diag);
    if (st == PLUMB_OK)
        st = plumb_study_open(cs->profile, cs->criteria, cs->units, NULL, &cs->study, diag);
    st = cli_units_error(cs->units, st, diag);
    if (st != PLUMB_OK && diag->status == PLUMB_OK)
        diag->status = st;
    return st;
}

plumb_status cli_units_error(const plumb_units *units, plumb_status st, plumb_diag *diag)
{
    plumb_diag ld;
    if (st == PLUMB_OK || plumb_units_load_error(units, &ld) == PLUMB_OK)
        return st;
    *diag = ld;
    return ld.status;
}

void cli_study_close(cli_study *cs)
{
    plumb_study_free(cs->study);
    plumb_criteria_free(cs->criteria);
    plumb_profile_free(cs->profile);
    plumb_units_free(cs->units);
    memset(cs, 0, sizeof *cs);
}

#define SECONDS_PER_MINUTE 60.0
#define SECONDS_PER_HOUR 3600.0
#define SECONDS_PER_DAY 86400.0

void cli_progress_clear(int *shown)
{
    if (*shown) {
        fprintf(stderr, "\r%79s\r", "");
        fflush(stderr);
    }
    *shown = 0;
}

void cli_duration(double s, char *buf, size_t size)
{
    if (s < 1.5 * SECONDS_PER_MINUTE)
        snprintf(buf, size, "%.0f s", s);
    else if (s < 1.5 * SECONDS_PER_HOUR)
        snprintf(buf, size, "%.0f min", s / SECONDS_PER_MINUTE);
    else if (s < 2.0 * SECONDS_PER_DAY)
        snprintf(buf, size, "%.1f h", s / SECONDS_PER_HOUR);
    else
        snprintf(buf, size, "%.1f days", s / SECONDS_PER_DAY);
}

void cli_estimate_times(double *after_s, double *note_s, double *warn_s)
{
    *after_s = CLI_ESTIMATE_AFTER_S;
    *note_s = CLI_NOTE_OVER_S;
    *warn_s = CLI_WARN_OVER_S;
    const char *env = getenv("PLUMB_TEST_ESTIMATE_TIMES");
    if (!env || !*env)
        return;
    double v[3];
    char *end = NULL;
    const char *s = env;
    for (int k = 0; k < 3; k++) {
        errno = 0;
        v[k] = strtod(s, &end);
        if (end == s || errno != 0 || !(v[k] >= 0.0) || *end != (k < 2 ? ',' : '\0'))
            return;
        s = end + 1;
    }
    *after_s = v[0];
    *note_s = v[1];
    *warn_s = v[2];
}

static int cli_is_dir(const char *path)
{
    struct stat st;
    return stat(path, &st) == 0 && S_ISDIR(st.st_mode);
}

int cli_beside_self(const char *rel, char *buf, size_t size)
{
    char exe[CLI_PATH_MAX];
    ssize_t n = readlink("/proc/self/exe", exe, sizeof exe - 1);
    if (n <= 0)
        return 0;
    exe[n] = '\0';
    char *slash = strrchr(exe, '/');
    if (!slash)
        return 0;
    *slash = '\0';
    /* "../x" taken off the directory, so that reports name the file
     * without "build/.." (the sheet's file list) */
    while (strncmp(rel, "../", 3) == 0 && (slash = strrchr(exe, '/')) && slash != exe) {
        *slash = '\0';
        rel += 3;
    }
    int len = snprintf(buf, size, "%s/%s", exe, rel);
    return len > 0 && (size_t)len < size;
}

const char *cli_criteria_dir(const cli_args *a, char *buf, size_t size)
{
    if (a && a->criteria_dir)
        return a->criteria_dir;
    const char *env = getenv("PLUMB_CRITERIA_DIR");
    if (env && *env)
        return env;
    static const char *const rel[] = {"../profiles/criteria", "../share/plumb/criteria"};
    for (size_t i = 0; i < sizeof rel / sizeof rel[0]; i++)
        if (cli_beside_self(rel[i], buf, size) && cli_is_dir(buf))
            return buf;
    /* the installed data directory, the working directory's
     * profiles/criteria, then the source tree this program was built from */
    static const char *const fixed[] = {PLUMB_CRITERIA_INSTALLED, "profiles/criteria",
                                        PLUMB_CRITERIA_SOURCE};
    for (size_t i = 0; i < sizeof fixed / sizeof fixed[0]; i++)
        if (cli_is_dir(fixed[i]))
            return fixed[i];
    return "profiles/criteria";
}

plumb_status cli_nomem(plumb_diag *diag)
{
    plumb_diag_clear(diag);
    diag->status = PLUMB_ENOMEM;
    snprintf(diag->message, sizeof diag->message, "out of memory");
    return PLUMB_ENOMEM;
}

plumb_status cli_render(plumb_status (*make)(FILE *out, const void *ctx, plumb_diag *diag),
                        const void *ctx, char **buf, size_t *len, plumb_diag *diag)
{
    *buf = NULL;
    *len = 0;
    FILE *mem = open_memstream(buf, len);
    if (!mem)
        return cli_nomem(diag);
    plumb_status st = make(mem, ctx, diag);
    if (fclose(mem) != 0 && st == PLUMB_OK)
        st = cli_nomem(diag);
    return st;
}

int cli_emit(const cli_args *a, plumb_status (*make)(FILE *out, const void *ctx, plumb_diag *diag),
             const void *ctx)
{
    plumb_diag diag;
    plumb_diag_clear(&diag);
    char *buf = NULL;
    size_t len = 0;
    plumb_status st = cli_render(make, ctx, &buf, &len, &diag);
    if (st == PLUMB_OK)
        st = cli_write_output(a->output, buf, len, &diag);
    free(buf);
    if (st != PLUMB_OK)
        return cli_fail(&diag);
    if (a->output && strcmp(a->output, "-") != 0 && !a->quiet)
        fprintf(stderr, "plumb: wrote %s\n", a->output);
    return CLI_EXIT_OK;
}
