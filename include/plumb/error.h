/*
 * plumb/error.h - status codes and caller-owned diagnostics.
 *
 * Every fallible libplumb call returns a plumb_status and, where the caller
 * passes one, fills a plumb_diag with where and why it failed:
 *
 *     file:line:col: key: what was expected, what was found
 *
 * The library never prints, exits or aborts; only the command line prints.
 * Ownership: a plumb_diag is plain caller storage; nothing in it points
 * anywhere else, so it may be copied freely.
 */
#ifndef PLUMB_ERROR_H
#define PLUMB_ERROR_H

#include <stddef.h>
#include <stdarg.h>

typedef enum plumb_status {
    PLUMB_OK = 0,        /* done */
    PLUMB_EINVAL,        /* an argument or input value is invalid */
    PLUMB_ENOMEM,        /* out of memory */
    PLUMB_EIO,           /* an input file could not be opened or read */
    PLUMB_EPARSE,        /* malformed YAML or a malformed command-line value */
    PLUMB_EUNIT,         /* a unit is missing, unknown or of the wrong dimension */
    PLUMB_ERANGE,        /* a value lies outside its valid range */
    PLUMB_EKEY,          /* an unknown, duplicate or missing key */
    PLUMB_ENOLAND,       /* the object never reaches the strike level */
    PLUMB_EBUDGET,       /* the integrator ran past its step or time budget */
    PLUMB_ENUMERIC,      /* a numerical method failed (ODE step, root finder) */
    PLUMB_ENOSOLUTION,   /* no solution in the physical range: an inverse problem, or the
                            terminal speed of a body without drag */
    PLUMB_EOUTSIDE,      /* the computed path left the range of a model (air above 86 km ...) */
    PLUMB_EWRITE,        /* an output (report, samples file) could not be written */
    PLUMB_STATUS_COUNT
} plumb_status;

/* Sizes of the text fields of a diagnostic, terminating NUL included. */
enum { PLUMB_DIAG_FILE = 256, PLUMB_DIAG_KEY = 128, PLUMB_DIAG_MSG = 512 };

/* The file of a diagnostic in a --set KEY=VALUE override: its line is
 * which --set (counted from 1), its column the column in that argument.
 * An error in the value of any other command-line option is located the
 * same way (plumb_diag_option): the option as its file ("--vary",
 * "--alt"), which of its values as its line, the column in that value. */
#define PLUMB_DIAG_SET_FILE "--set"

typedef struct plumb_diag {
    plumb_status status;            /* status of the failure, PLUMB_OK if none */
    char file[PLUMB_DIAG_FILE];     /* input file, PLUMB_DIAG_SET_FILE, an option ("--vary") or "" */
    int line;                       /* 1-based line in file, 0 if not known */
    int col;                        /* 1-based column in file, 0 if not known */
    char key[PLUMB_DIAG_KEY];       /* dotted profile key, e.g. "payload.mass", or "" */
    char message[PLUMB_DIAG_MSG];   /* what was expected, what was found */
} plumb_diag;

/* One-line meaning of a status. Never NULL; can't fail. */
const char *plumb_strerror(plumb_status status);

/* True when the status is an input or usage error (exit status 2), false
 * when it is a failed computation or a failure of the machine rather than
 * of the user's input: out of memory, an output that cannot be written
 * (exit status 3). PLUMB_OK gives false. */
int plumb_status_is_input_error(plumb_status status);

/* Resets a diagnostic to "no error". Accepts NULL. */
void plumb_diag_clear(plumb_diag *diag);

/* Fills diag with an error in the value of the command-line option
 * `option` ("--vary"), README.md "Exit status": the option as the file,
 * `index` (from 1; the second --vary is 2) as the line, `col` (1-based,
 * in that value: where the part at fault starts) as the column, `key`
 * (a profile key the value is for, or NULL) and the message. An index or
 * column below 1 is taken as 1. Returns status; accepts a NULL diag. */
plumb_status plumb_diag_option(plumb_diag *diag, plumb_status status, const char *option,
                               int index, int col, const char *key, const char *fmt, ...)
#if defined(__GNUC__)
    __attribute__((format(printf, 7, 8)))
#endif
    ;

/* The same with a va_list. */
plumb_status plumb_diag_voption(plumb_diag *diag, plumb_status status, const char *option,
                                int index, int col, const char *key, const char *fmt, va_list ap)
#if defined(__GNUC__)
    __attribute__((format(printf, 7, 0)))
#endif
    ;

/* Formats "file:line:col: key: message" into buf (always NUL-terminated
 * when size > 0), leaving out the parts that are not known. Returns the
 * length that the full text would have, like snprintf. */
int plumb_diag_format(const plumb_diag *diag, char *buf, size_t size);

#endif /* PLUMB_ERROR_H */
