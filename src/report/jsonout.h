/*
 * jsonout.h - what the JSON report writers share (the files of src/report/):
 * building a jansson tree while remembering whether any figure was not
 * finite or any allocation failed, and writing it all or nothing.
 * Internal to libplumb; the inline helpers keep one definition for both
 * writers.
 */
#ifndef PLUMB_JSONOUT_H
#define PLUMB_JSONOUT_H

#include <limits.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <jansson.h>

#include "plumb/error.h"
#include "plumb/report.h"
#include "core/internal.h"

/* Significant digits of JSON numbers: enough to round-trip a double. */
#define PLUMBP_JSON_DIGITS 17

typedef struct jctx {
    int bad;        /* a non-finite number was met */
    int nomem;      /* a jansson allocation failed */
} jctx;

/* A number; NaN and infinity are refused (j->bad) and -0 written as 0. */
static inline json_t *jreal(jctx *j, double x)
{
    if (!plumbp_finite(x)) {
        j->bad = 1;
        return json_null();
    }
    return json_real(x == 0.0 ? 0.0 : x);
}

static inline json_t *jint(jctx *j, size_t n)
{
    if (n > (size_t)LLONG_MAX) {
        j->bad = 1;
        return json_null();
    }
    return json_integer((json_int_t)n);
}

static inline json_t *jstr(jctx *j, const char *s)
{
    json_t *v = json_string(s ? s : "");
    if (!v)
        j->nomem = 1; /* or invalid UTF-8: refused the same way */
    return v;
}

static inline void jset(jctx *j, json_t *obj, const char *key, json_t *value)
{
    if (!value || !obj || json_object_set_new(obj, key, value) != 0)
        j->nomem = 1;
}

static inline void jpush(jctx *j, json_t *arr, json_t *value)
{
    if (!value || !arr || json_array_append_new(arr, value) != 0)
        j->nomem = 1;
}

static inline json_t *jobj(jctx *j)
{
    json_t *o = json_object();
    if (!o)
        j->nomem = 1;
    return o;
}

static inline json_t *jarr(jctx *j)
{
    json_t *a = json_array();
    if (!a)
        j->nomem = 1;
    return a;
}

/* The cautions of every report (plumb_cautions), as a JSON array. */
static inline json_t *j_cautions(jctx *j)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    json_t *a = jarr(j);
    for (size_t i = 0; i < n; i++)
        jpush(j, a, jstr(j, c[i]));
    return a;
}

/* Writes len bytes to out; PLUMB_EWRITE on failure (an output, not the input). */
static inline plumb_status emit(FILE *out, const char *buf, size_t len, plumb_diag *diag)
{
    if (len > 0 && fwrite(buf, 1, len, out) != len)
        return PLUMB_RAISE(diag, PLUMB_EWRITE, "could not write the report");
    if (fflush(out) != 0 || ferror(out))
        return PLUMB_RAISE(diag, PLUMB_EWRITE, "could not write the report");
    return PLUMB_OK;
}

/* Writes the tree (and frees it) unless a figure was not finite
 * (PLUMB_ENUMERIC) or memory ran out (PLUMB_ENOMEM): then nothing. */
static inline plumb_status emit_json(FILE *out, jctx *j, json_t *root, plumb_diag *diag)
{
    plumb_status st = PLUMB_OK;
    if (j->bad)
        st = PLUMB_RAISE(diag, PLUMB_ENUMERIC, "a figure is not a finite number; no report "
                                               "written");
    else if (j->nomem || !root)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the JSON report");
    char *text = NULL;
    if (st == PLUMB_OK) {
        text = json_dumps(root, JSON_INDENT(2) | JSON_PRESERVE_ORDER |
                                    JSON_REAL_PRECISION(PLUMBP_JSON_DIGITS));
        if (!text)
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory writing the JSON report");
    }
    if (st == PLUMB_OK) {
        st = emit(out, text, strlen(text), diag);
        if (st == PLUMB_OK)
            st = emit(out, "\n", 1, diag);
    }
    free(text);
    json_decref(root);
    return st;
}

#endif /* PLUMB_JSONOUT_H */
