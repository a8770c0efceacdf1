/*
 * cli_files.c - the files a plumb subcommand reads and writes (cli.h):
 * output written atomically (a temporary file beside it, then a rename;
 * a device or FIFO in place), never onto the profile, and standard input
 * read once, with its size bounded.
 */
#include <errno.h>
#include <fcntl.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "cli.h"

int cli_same_file(const char *out, const char *in)
{
    struct stat so, si;
    if (!out || !in || strcmp(in, "-") == 0 || stat(out, &so) != 0 || stat(in, &si) != 0)
        return 0;
    return so.st_dev == si.st_dev && so.st_ino == si.st_ino;
}

/* A failed read of the user's input is PLUMB_EIO (exit 2); a failed write of
 * a report is PLUMB_EWRITE (exit 3), not the user's fault. */
static plumb_status cli_io_status(plumb_diag *diag, plumb_status st, const char *path,
                                  const char *what, int err)
{
    plumb_diag_clear(diag);
    diag->status = st;
    snprintf(diag->file, sizeof diag->file, "%s", path);
    snprintf(diag->message, sizeof diag->message, "%s: %s", what, strerror(err));
    return st;
}

static plumb_status cli_io_error(plumb_diag *diag, const char *path, const char *what, int err)
{
    return cli_io_status(diag, PLUMB_EWRITE, path, what, err);
}

plumb_status cli_outfile_open(cli_outfile *o, const char *path, const char *what,
                              plumb_diag *diag)
{
    memset(o, 0, sizeof *o);
    o->path = path;
    o->what = what;
    const char *slash = strrchr(path, '/');
    const char *base = slash ? slash + 1 : path;
    if (*base == '\0' || strcmp(base, ".") == 0 || strcmp(base, "..") == 0)
        return cli_io_error(diag, path, what, EISDIR);

    /* Anything that exists and is not a regular file (a character or block
     * device such as /dev/null, a FIFO, a terminal) is written in place:
     * renaming a file over it would replace the device node itself, and
     * as root that destroys /dev/null for the whole system. */
    struct stat st;
    if (stat(path, &st) == 0 && !S_ISREG(st.st_mode)) {
        if (S_ISDIR(st.st_mode))
            return cli_io_error(diag, path, what, EISDIR);
        int fd = open(path, O_WRONLY | O_NOCTTY);
        if (fd < 0)
            return cli_io_error(diag, path, what, errno);
        o->f = fdopen(fd, "w");
        if (!o->f) {
            int err = errno;
            close(fd);
            return cli_io_error(diag, path, what, err);
        }
        o->in_place = 1;
        return PLUMB_OK;
    }

    if (!slash)
        snprintf(o->dir, sizeof o->dir, ".");
    else if (slash == path)
        snprintf(o->dir, sizeof o->dir, "/");
    else if (snprintf(o->dir, sizeof o->dir, "%.*s", (int)(slash - path), path) >=
             (int)sizeof o->dir)
        return cli_io_error(diag, path, what, ENAMETOOLONG);
    if (snprintf(o->tmp, sizeof o->tmp, "%s/.%s.XXXXXX", o->dir, base) >= (int)sizeof o->tmp) {
        o->tmp[0] = '\0';
        return cli_io_error(diag, path, what, ENAMETOOLONG);
    }
    int fd = mkstemp(o->tmp);
    if (fd < 0) {
        int err = errno;
        o->tmp[0] = '\0';
        return cli_io_status(diag, PLUMB_EWRITE, path, "cannot create a temporary file beside it",
                             err);
    }
    o->f = fdopen(fd, "w");
    if (!o->f) {
        int err = errno;
        close(fd);
        unlink(o->tmp);
        o->tmp[0] = '\0';
        return cli_io_error(diag, path, what, err);
    }
    return PLUMB_OK;
}

plumb_status cli_outfile_close(cli_outfile *o, int commit, plumb_diag *diag)
{
    if (!o->f)
        return PLUMB_OK;
    int err = 0;
    errno = 0;
    if (commit) {
        if (fflush(o->f) != 0 || ferror(o->f))
            err = errno ? errno : EIO;
        /* fsync and the permissions of a new file only for the temporary
         * file: a device or a FIFO has its own (fsync fails on a pipe). */
        if (!err && !o->in_place) {
            mode_t mask = umask(0);
            umask(mask);
            if (fsync(fileno(o->f)) != 0 || fchmod(fileno(o->f), (mode_t)(0666 & ~mask)) != 0)
                err = errno;
        }
    }
    if (fclose(o->f) != 0 && !err)
        err = errno;
    o->f = NULL;
    if (o->in_place) {
        if (commit && err)
            return cli_io_error(diag, o->path, o->what, err);
        return PLUMB_OK;
    }
    if (commit && !err && rename(o->tmp, o->path) != 0)
        err = errno;
    if (!commit || err) {
        unlink(o->tmp);
        o->tmp[0] = '\0';
    }
    if (commit && err)
        return cli_io_error(diag, o->path, o->what, err);
    if (commit) {
        /* Make the rename itself durable; a failure here loses nothing written. */
        int dfd = open(o->dir, O_RDONLY);
        if (dfd >= 0) {
            (void)fsync(dfd);
            close(dfd);
        }
    }
    return PLUMB_OK;
}

plumb_status cli_write_output(const char *path, const char *buf, size_t len, plumb_diag *diag)
{
    if (!path || strcmp(path, "-") == 0) {
        if ((len > 0 && fwrite(buf, 1, len, stdout) != len) || fflush(stdout) != 0)
            return cli_io_error(diag, "<standard output>", "cannot write", errno);
        return PLUMB_OK;
    }
    cli_outfile o;
    plumb_status st = cli_outfile_open(&o, path, "cannot write the report", diag);
    if (st != PLUMB_OK)
        return st;
    errno = 0;
    if (len > 0 && fwrite(buf, 1, len, o.f) != len) {
        int err = errno ? errno : EIO;
        (void)cli_outfile_close(&o, 0, diag);
        return cli_io_error(diag, path, "cannot write the report", err);
    }
    return cli_outfile_close(&o, 1, diag);
}

/* Reads standard input to its end into a malloc'd buffer (*buf, *len);
 * more than `max` bytes is PLUMB_ERANGE, a read error PLUMB_EIO. */
plumb_status cli_read_stdin(size_t max, char **buf, size_t *len, plumb_diag *diag)
{
    *buf = NULL;
    *len = 0;
    size_t cap = 0, n = 0;
    char *b = NULL;
    for (;;) {
        if (n == cap) {
            if (cap > max) {
                free(b);
                plumb_diag_clear(diag);
                diag->status = PLUMB_ERANGE;
                snprintf(diag->file, sizeof diag->file, "%s", CLI_STDIN_NAME);
                snprintf(diag->message, sizeof diag->message,
                         "standard input holds more than %zu bytes, the most a profile may have",
                         max);
                return PLUMB_ERANGE;
            }
            size_t ncap = cap ? cap * 2 : 65536;
            char *nb = realloc(b, ncap);
            if (!nb) {
                free(b);
                plumb_diag_clear(diag);
                diag->status = PLUMB_ENOMEM;
                snprintf(diag->message, sizeof diag->message, "out of memory reading standard input");
                return PLUMB_ENOMEM;
            }
            b = nb;
            cap = ncap;
        }
        ssize_t got = read(STDIN_FILENO, b + n, cap - n);
        if (got < 0 && errno == EINTR)
            continue;
        if (got < 0) {
            int err = errno;
            free(b);
            return cli_io_status(diag, PLUMB_EIO, CLI_STDIN_NAME, "cannot read standard input", err);
        }
        if (got == 0)
            break;
        n += (size_t)got;
    }
    *buf = b;
    *len = n;
    return PLUMB_OK;
}
