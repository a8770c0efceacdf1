/*
 * cli.h - what every plumb subcommand shares (internal to the command line,
 * not part of libplumb): option parsing, error printing with the exit
 * statuses of README.md "Exit status", atomic output files and the lookup of
 * the criteria directory. The command line uses libplumb's public API only.
 *
 * Exit statuses: 0 done; 2 usage or input error (nothing written); 3 the
 * computation failed (nothing written).
 *
 * The definitions are in cli.c.
 *
 * Atomic output (POSIX): the report is written to a temporary file made by
 * mkstemp in the output's own directory, flushed to disk with fsync, given
 * the permissions a new file would get (0666 less the umask) and renamed
 * over the destination; rename(2) within one file system is atomic, so a
 * reader sees the old file or the whole new one, never a part. A
 * destination that exists and is not a regular file (a character or block
 * device such as /dev/null, a FIFO, a terminal) is written in place
 * instead: a rename would replace the device node itself.
 */
#ifndef PLUMB_CLI_H
#define PLUMB_CLI_H

#include <stddef.h>
#include <stdio.h>
#include <time.h>
#include "plumb/plumb.h"

enum { CLI_EXIT_OK = 0, CLI_EXIT_CHECK_FAILED = 1, CLI_EXIT_INPUT = 2, CLI_EXIT_FAILED = 3 };

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
    CLI_CRITERIA = 1u << 5,  /* --criteria-dir DIR */
    CLI_GEOJSON = 1u << 6    /* --format geojson too (with CLI_FORMAT) */
};

/* Most values a repeatable option keeps (cli_option.max). */
#define CLI_OPTION_VALUES 4

/* An option of one subcommand that takes a value ("--alt 0m:20km:1km" or
 * "--alt=0m:20km:1km"). Its name, argument and help are what --help
 * prints, so the help lists every option the command accepts. */
typedef struct cli_option {
    const char *name;        /* "--alt" */
    const char *arg;         /* its value in the help, "FROM:TO:STEP" */
    const char *help;        /* what it does; lines split by '\n' */
    size_t max;              /* 0: given once (a second is refused, exit 2); n (at
                                most CLI_OPTION_VALUES): at most n times, all kept */
    const char *value;       /* the (last) value given, NULL until given; points into argv */
    const char *values[CLI_OPTION_VALUES]; /* with max > 0, every value, in order */
    size_t n_values;         /* how many times it was given */
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
 * options with values. `usage` is the subcommand's help text; --help
 * prints it on standard output, then an "Options:" list made from `extra`
 * and the accepted common options, so no option goes unlisted. An option
 * that takes one value (every common one but --set; an extra one with max
 * 0) given twice is a usage error naming it, never last-wins; so is an -o
 * name ending in .yaml or .yml (cli_profile_name).
 * Returns CLI_GO_ON when the caller should carry on, else an exit status:
 * 0 after --help or --version, 2 after a usage error (already printed).
 * On CLI_GO_ON the caller owns *a and frees it with cli_args_free. */
int cli_parse(int argc, char **argv, unsigned accept, cli_option *extra, size_t n_extra,
              const char *usage, cli_args *a);

/* Frees the arrays of a parsed command line. Accepts a zeroed struct. */
void cli_args_free(cli_args *a);

/* The report options the command line asked for: --format, --units, and
 * this program's version. Can't fail. */
plumb_report_options cli_report_options(const cli_args *a);

/* Fills diag with an error in an option's value (plumb_diag_option): the
 * option as the file, 1 as the line (an option is given once), col the
 * column in the value where the part at fault starts; returns
 * PLUMB_EINVAL. */
plumb_status cli_option_error(plumb_diag *diag, const char *option, int col, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 4, 5)))
#endif
    ;
/* The same with status st (PLUMB_ERANGE, PLUMB_ENOMEM ...); returns st. */
plumb_status cli_option_status(plumb_diag *diag, plumb_status st, const char *option, int col,
                               const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 5, 6)))
#endif
    ;

/* Moves an error the library raised over a value an option gave (a
 * profile key's check of --samples, an answer about --find's key) to that
 * option, OPTION:1:COL: (the column kept when the error had no file),
 * with key (may be NULL) and the status and message kept. */
void cli_option_blame(plumb_diag *diag, const char *option, const char *key);

/* An option's value that must be a whole number in [lo, hi]: digits, or a
 * number in exponent form that is a whole number ("1e5"). PLUMB_OK with
 * *out, else PLUMB_EINVAL with diag saying which option and why. */
plumb_status cli_parse_whole(const char *option, const char *text, double lo, double hi,
                             double *out, plumb_diag *diag);

/* Prints "plumb CMD: message" and a hint to stderr; returns 2. */
int cli_usage_error(const char *cmd, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 2, 3)))
#endif
    ;

/* Prints "plumb: " + the formatted diagnostic to stderr; returns 2 for an
 * input error (plumb_status_is_input_error), else 3. */
int cli_fail(const plumb_diag *diag);
/* Standard input read whole into *buf (malloc'd), at most max bytes. */
plumb_status cli_read_stdin(size_t max, char **buf, size_t *len, plumb_diag *diag);

/* An output file being written (cli_outfile_open, cli_outfile_close). */
typedef struct cli_outfile {
    const char *path;          /* destination */
    const char *what;          /* "cannot write the report", for messages */
    char dir[CLI_PATH_MAX];    /* its directory */
    char tmp[CLI_PATH_MAX];    /* the temporary file beside it, "" when none */
    int in_place;              /* 1: the destination itself (not a regular file) */
    FILE *f;                   /* write here; NULL once closed */
} cli_outfile;

/* Opens the output file `path` as the top of this file says: a temporary
 * file beside it, or the destination itself when it exists and is not a
 * regular file. `what` starts the messages ("cannot write the samples").
 * On error (PLUMB_EWRITE, diag says why) nothing is left behind and o->f
 * is NULL. */
plumb_status cli_outfile_open(cli_outfile *o, const char *path, const char *what,
                              plumb_diag *diag);

/* commit = 1: flushes, syncs and renames the temporary file over the
 * destination (PLUMB_EWRITE and nothing left behind when any step fails);
 * commit = 0: removes the temporary file (what was written in place
 * stays written). Accepts a closed or never opened o. */
plumb_status cli_outfile_close(cli_outfile *o, int commit, plumb_diag *diag);

/* Writes len bytes of buf to `path` atomically (see the top of this file),
 * or to standard output when path is NULL or "-". On error nothing is left
 * behind (the temporary file is removed) and diag says why (PLUMB_EIO). */
plumb_status cli_write_output(const char *path, const char *buf, size_t len, plumb_diag *diag);

/* What diagnostics and reports call standard input read as a profile. */
#define CLI_STDIN_NAME "<stdin>"

/* Loads the profile PATH with the command line's --set overrides; "-" is
 * standard input, read to its end (at most PLUMB_PROFILE_MAX_BYTES), named
 * "<stdin>" in diagnostics and reports, its SHA-256 that of the bytes
 * read. Standard input can be read only once. Errors as
 * plumb_profile_load (PLUMB_EIO when standard input cannot be read), but
 * an error of the file is `plumb lint`'s first (plumb_study_lint), so that
 * an unknown criterion id before it is told first. */
plumb_status cli_profile_load(const cli_args *a, const char *path, const plumb_units *units,
                              plumb_profile **out, plumb_diag *diag);

/* What a command opens before it asks its question: units, the profile
 * (cli_profile_load), the criteria (cli_criteria_dir) and the study over
 * them (plumb_study_open). */
typedef struct cli_study {
    plumb_units *units;
    plumb_profile *profile;
    plumb_criteria *criteria;
    plumb_study *study;
} cli_study;

/* Opens all of a cli_study in that order; on error the diagnostic says
 * why and cs holds only what was made (cli_study_close frees it). The
 * units' database is loaded at the first quantity read
 * (plumb_units_alloc_deferred): a profile refused before any (YAML, a
 * key) costs no load. */
plumb_status cli_study_open(const cli_args *a, const char *path, cli_study *cs, plumb_diag *diag);

/* What to tell of a failure st (*diag) of a run over deferred units: the
 * failed load of their database (*diag replaced, its status returned),
 * told as plumb_units_alloc tells it, rather than the quantity it made
 * unreadable; else st, *diag untouched. */
plumb_status cli_units_error(const plumb_units *units, plumb_status st, plumb_diag *diag);

/* Frees everything a cli_study holds. */
void cli_study_close(cli_study *cs);

/* A long run's estimate (zone, sweep): made once the run has taken
 * CLI_ESTIMATE_AFTER_S; a note on standard error above CLI_NOTE_OVER_S, a
 * warning above CLI_WARN_OVER_S (what a person waits for without planning
 * it), seconds. */
#define CLI_ESTIMATE_AFTER_S 0.5
#define CLI_NOTE_OVER_S 10.0
#define CLI_WARN_OVER_S 600.0

/* The three thresholds, or for the tests only the values of
 * PLUMB_TEST_ESTIMATE_TIMES="AFTER,NOTE,WARN" (seconds) when it is set and
 * well formed. Can't fail. */
void cli_estimate_times(double *after_s, double *note_s, double *warn_s);

/* A duration for a person: "42 s", "7 min", "3.5 h", "2.1 days". */
void cli_duration(double s, char *buf, size_t size);

/* A progress line on a terminal is redrawn at most this often, seconds. */
#define CLI_PROGRESS_EVERY_S 0.25

/* Clears the progress line on standard error when *shown, and clears
 * *shown. */
void cli_progress_clear(int *shown);

/* The estimate of a long run counted in rows (sweep), made once the rows
 * done have taken CLI_ESTIMATE_AFTER_S: a note on standard error when the
 * whole will take over CLI_NOTE_OVER_S, a warning over CLI_WARN_OVER_S
 * (cli_estimate_times); then, on a terminal, a progress line redrawn at
 * most every CLI_PROGRESS_EVERY_S, cleared by cli_progress_clear(&shown). */
typedef struct cli_rows_progress {
    const char *cmd, *what;  /* "sweep", "rows": for the messages */
    struct timespec start;
    double after_s, note_s, warn_s;
    int done;                /* the estimate is made */
    int tty;                 /* standard error is a terminal */
    int shown;               /* a progress line is on the terminal */
    double drawn_s;          /* when it was last drawn */
} cli_rows_progress;

/* Starts the clock; 0 when there is no clock (then no estimate). */
int cli_rows_progress_start(cli_rows_progress *e, const char *cmd, const char *what);

/* The progress callback (user: the cli_rows_progress): done of total rows. */
void cli_rows_progress_step(void *user, size_t done, size_t total);

/* 1 when path `out` is an existing file that is the same file as `in`
 * (0 when `in` is "-", standard input). */
int cli_same_file(const char *out, const char *in);

/* 1 when the name of path ends in .yaml or .yml (case ignored): a
 * profile's name, which no report may be written to. */
int cli_profile_name(const char *path);

/* Writes into buf (size bytes) the path `rel` taken from the running
 * program's directory (/proc/self/exe); 0 when there is no such path or
 * it does not fit. */
int cli_beside_self(const char *rel, char *buf, size_t size);

/* The criteria directory: --criteria-dir, else $PLUMB_CRITERIA_DIR, else
 * <directory of /proc/self/exe>/../profiles/criteria (build tree), else
 * <exe dir>/../share/plumb/criteria (installed), else the data directory
 * the program was built for, else ./profiles/criteria, else the source
 * tree's profiles/criteria (an out-of-tree build run from elsewhere).
 * The result is a, the environment, a literal, or buf (size bytes). */
const char *cli_criteria_dir(const cli_args *a, char *buf, size_t size);

/* "out of memory" into diag; PLUMB_ENOMEM. */
plumb_status cli_nomem(plumb_diag *diag);

/* Runs `make` (a report writer) into a memory stream (POSIX
 * open_memstream): *buf (malloc'd; the caller frees it, whatever the
 * status) holds the text and *len its length. make's status, or
 * PLUMB_ENOMEM. */
plumb_status cli_render(plumb_status (*make)(FILE *out, const void *ctx, plumb_diag *diag),
                        const void *ctx, char **buf, size_t *len, plumb_diag *diag);

/* Runs `make` into memory (cli_render) and, only when it succeeds, writes
 * the whole text with cli_write_output. Returns the exit status, the
 * error printed. */
int cli_emit(const cli_args *a, plumb_status (*make)(FILE *out, const void *ctx, plumb_diag *diag),
             const void *ctx);

/* `plumb lint` (cli_lint.c): at most this many errors are listed per
 * profile. */
enum { CLI_LINT_MAX = 16 };

/* Checks the profile `path` ("-": standard input) into *e, its errors in
 * errs (CLI_LINT_MAX of the caller's, which e points to); in text, or for
 * an error that is not the input's, prints them on standard error (with
 * --units us, a range's US limits after the message). The criteria set is
 * loaded on first need into *crit (the caller frees it). Returns the
 * profile's exit status: 0 good, 2 bad, 3 a check that failed. */
int cli_lint_one(const cli_args *a, const plumb_units *units, const char *path,
                 plumb_criteria **crit, plumb_diag *errs, plumb_lint_entry *e);

/* The subcommands (cmd_<name>.c). */
int cmd_fall(int argc, char **argv);
int cmd_air(int argc, char **argv);
int cmd_verify(int argc, char **argv);
int cmd_lint(int argc, char **argv);
int cmd_sweep(int argc, char **argv);
int cmd_limit(int argc, char **argv);
int cmd_zone(int argc, char **argv);
int cmd_sheet(int argc, char **argv);

/* `plumb sheet`: runs the program plumb-sheet (sheet_main.c), which alone
 * links cairo and pango, with the same arguments (cli_sheet_exec.c).
 * Returns only on failure: CLI_EXIT_FAILED, the error printed. */
int cli_sheet_exec(int argc, char **argv);

#endif /* PLUMB_CLI_H */
