/*
 * error.c - status strings and the one function every error passes through.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "plumb/error.h"
#include "core/internal.h"

static const char *const status_text[PLUMB_STATUS_COUNT] = {
    [PLUMB_OK] = "success",
    [PLUMB_EINVAL] = "invalid input",
    [PLUMB_ENOMEM] = "out of memory",
    [PLUMB_EIO] = "input/output error",
    [PLUMB_EPARSE] = "malformed input",
    [PLUMB_EUNIT] = "bad or missing unit",
    [PLUMB_ERANGE] = "value out of range",
    [PLUMB_EKEY] = "unknown, duplicate or missing key",
    [PLUMB_ENOLAND] = "the object never reaches the strike level",
    [PLUMB_EBUDGET] = "integration budget exhausted",
    [PLUMB_ENUMERIC] = "numerical method failed",
    [PLUMB_ENOSOLUTION] = "no solution in the physical range",
    [PLUMB_EOUTSIDE] = "the path left the range of a model",
    [PLUMB_EWRITE] = "the output could not be written",
};

const char *plumb_strerror(plumb_status status)
{
    if ((unsigned)status >= PLUMB_STATUS_COUNT)
        return "unknown status";
    return status_text[status];
}

int plumb_status_is_input_error(plumb_status status)
{
    switch (status) {
    case PLUMB_EINVAL: case PLUMB_EIO: case PLUMB_EPARSE: case PLUMB_EUNIT:
    case PLUMB_ERANGE: case PLUMB_EKEY:
        return 1;
    default:
        return 0;
    }
}

void plumb_diag_clear(plumb_diag *diag)
{
    if (diag)
        memset(diag, 0, sizeof *diag);
}

int plumb_diag_format(const plumb_diag *diag, char *buf, size_t size)
{
    char where[PLUMB_DIAG_FILE + 32] = "";
    if (diag->file[0] && diag->line > 0)
        snprintf(where, sizeof where, "%s:%d:%d: ", diag->file, diag->line,
                 diag->col > 0 ? diag->col : 1);
    else if (diag->file[0])
        snprintf(where, sizeof where, "%s: ", diag->file);
    const char *msg = diag->message[0] ? diag->message : plumb_strerror(diag->status);
    if (diag->key[0])
        return snprintf(buf, size, "%s%s: %s", where, diag->key, msg);
    return snprintf(buf, size, "%s%s", where, msg);
}

/* The length of s[0..len) without a last UTF-8 character that a cut at
 * len left unfinished (RFC 3629 section 3: a lead byte 110xxxxx starts two
 * bytes, 1110xxxx three, 11110xxx four; 10xxxxxx continues), so that a
 * message or key cut to its buffer never ends in half a character. */
static size_t utf8_whole(const char *s, size_t len)
{
    size_t i = len;
    while (i > 0 && ((unsigned char)s[i - 1] & 0xC0) == 0x80 && len - i < 3)
        i--;
    if (i == 0)
        return len;
    unsigned char lead = (unsigned char)s[i - 1];
    size_t need = lead >= 0xF0 ? 4 : lead >= 0xE0 ? 3 : lead >= 0xC0 ? 2 : 1;
    return (i - 1) + need > len ? i - 1 : len;
}

plumb_status plumbp_vraise(plumb_diag *diag, plumb_status status, const char *file, int line,
                           int col, const char *key, const char *fmt, va_list ap)
{
    if (!diag)
        return status;
    diag->status = status;
    plumbp_strlcpy(diag->file, file ? file : "", sizeof diag->file);
    diag->line = line;
    diag->col = col;
    plumbp_strlcpy(diag->key, key ? key : "", sizeof diag->key);
    int len = vsnprintf(diag->message, sizeof diag->message, fmt, ap);
    if (len >= (int)sizeof diag->message) /* cut: at a character's end */
        diag->message[utf8_whole(diag->message, sizeof diag->message - 1)] = '\0';
    return status;
}

plumb_status plumbp_raise(plumb_diag *diag, plumb_status status, const char *file, int line,
                          int col, const char *key, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumbp_vraise(diag, status, file, line, col, key, fmt, ap);
    va_end(ap);
    return status;
}

plumb_status plumb_diag_voption(plumb_diag *diag, plumb_status status, const char *option,
                                int index, int col, const char *key, const char *fmt, va_list ap)
{
    return plumbp_vraise(diag, status, option, index > 0 ? index : 1, col > 0 ? col : 1, key,
                         fmt, ap);
}

plumb_status plumb_diag_option(plumb_diag *diag, plumb_status status, const char *option,
                               int index, int col, const char *key, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumb_diag_voption(diag, status, option, index, col, key, fmt, ap);
    va_end(ap);
    return status;
}

char *plumbp_strlcpy(char *dst, const char *src, size_t n)
{
    if (n == 0)
        return dst;
    size_t len = strlen(src);
    if (len >= n)
        len = utf8_whole(src, n - 1);
    memcpy(dst, src, len);
    dst[len] = '\0';
    return dst;
}

int plumbp_finite(double x)
{
    return isfinite(x);
}
