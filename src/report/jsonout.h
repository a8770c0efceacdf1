/*
 * jsonout.h - what the JSON report writers share (the files of src/report/):
 * building a jansson tree while remembering whether any figure was not
 * finite or any allocation failed, and writing it all or nothing.
 * Internal to libplumb; the helpers here keep one definition for every
 * writer. They are not inlined (JSONOUT_FN): a writer calls them at some
 * 150 places, and inlined at each they made fall_json.c and zone_json.c
 * take 1.6 s each to compile at -O2 and 29 KB of code, against 0.35 s and
 * 10 KB (limit_answer.c, zone_map.c, verify_report.c and sweep_data.c
 * gain less; measured with GCC 12); a call is nothing beside the jansson
 * allocation of each value.
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
#include "report/format.h"

/* Each writer's own copy, called, never inlined; unused in a writer that
 * needs it not. */
#if defined(__GNUC__)
#define JSONOUT_FN static __attribute__((unused, noinline))
#else
#define JSONOUT_FN static inline
#endif

/* Significant digits of JSON numbers: enough to round-trip a double. */
#define PLUMBP_JSON_DIGITS 17

typedef struct jctx {
    int bad;        /* a non-finite number was met */
    int nomem;      /* a jansson allocation failed */
} jctx;

/* A number; NaN and infinity are refused (j->bad) and -0 written as 0. */
JSONOUT_FN json_t *jreal(jctx *j, double x)
{
    if (!plumbp_finite(x)) {
        j->bad = 1;
        return json_null();
    }
    return json_real(x == 0.0 ? 0.0 : x);
}

JSONOUT_FN json_t *jint(jctx *j, size_t n)
{
    if (n > (size_t)LLONG_MAX) {
        j->bad = 1;
        return json_null();
    }
    return json_integer((json_int_t)n);
}

JSONOUT_FN json_t *jstr(jctx *j, const char *s)
{
    json_t *v = json_string(s ? s : "");
    if (!v)
        j->nomem = 1; /* or invalid UTF-8: refused the same way */
    return v;
}

/* A warning sentence with its figures in SI (plumbp_warning_plain): JSON
 * is SI whatever --units says. A mark that cannot be read or a figure that
 * is not finite is refused (j->bad). */
JSONOUT_FN json_t *jwarning(jctx *j, const char *text)
{
    char s[PLUMB_WARNING * 2];
    if (!plumbp_warning_plain(text, 0, s, sizeof s))
        j->bad = 1;
    return jstr(j, s);
}

/* Sets obj[key] = value, taking the reference to value in every case: a
 * value whose object could not be made is freed here (json_object_set_new
 * frees it itself when it fails), or it would leak. */
JSONOUT_FN void jset(jctx *j, json_t *obj, const char *key, json_t *value)
{
    if (!value || !obj) {
        json_decref(value);
        j->nomem = 1;
    } else if (json_object_set_new(obj, key, value) != 0) {
        j->nomem = 1;
    }
}

/* Appends value to arr, taking the reference as jset does. */
JSONOUT_FN void jpush(jctx *j, json_t *arr, json_t *value)
{
    if (!value || !arr) {
        json_decref(value);
        j->nomem = 1;
    } else if (json_array_append_new(arr, value) != 0) {
        j->nomem = 1;
    }
}

JSONOUT_FN json_t *jobj(jctx *j)
{
    json_t *o = json_object();
    if (!o)
        j->nomem = 1;
    return o;
}

JSONOUT_FN json_t *jarr(jctx *j)
{
    json_t *a = json_array();
    if (!a)
        j->nomem = 1;
    return a;
}

/* The cautions of every report (plumb_cautions), as a JSON array. */
JSONOUT_FN json_t *j_cautions(jctx *j)
{
    size_t n;
    const char *const *c = plumb_cautions(&n);
    json_t *a = jarr(j);
    for (size_t i = 0; i < n; i++)
        jpush(j, a, jstr(j, c[i]));
    return a;
}

/* Writes len bytes to out; PLUMB_EWRITE on failure (an output, not the input). */
JSONOUT_FN plumb_status emit(FILE *out, const char *buf, size_t len, plumb_diag *diag)
{
    if (len > 0 && fwrite(buf, 1, len, out) != len)
        return PLUMB_RAISE(diag, PLUMB_EWRITE, "could not write the report");
    if (fflush(out) != 0 || ferror(out))
        return PLUMB_RAISE(diag, PLUMB_EWRITE, "could not write the report");
    return PLUMB_OK;
}

/* The text of a JSON report as jansson dumps it (json_dump_callback). */
typedef struct jtext {
    char *buf;
    size_t len, cap;
    int nomem;      /* an append failed */
} jtext;

JSONOUT_FN int jtext_add(const char *bytes, size_t n, void *data)
{
    jtext *t = data;
    if (t->nomem)
        return -1;
    if (n >= t->cap - t->len || !t->buf) {
        size_t cap = t->cap ? t->cap : 4096;
        while (cap - t->len <= n) {
            if (cap > (size_t)-1 / 2) {
                t->nomem = 1;
                return -1;
            }
            cap *= 2;
        }
        char *nb = realloc(t->buf, cap);
        if (!nb) {
            t->nomem = 1;
            return -1;
        }
        t->buf = nb;
        t->cap = cap;
    }
    memcpy(t->buf + t->len, bytes, n);
    t->len += n;
    t->buf[t->len] = '\0';
    return 0;
}

/* Writes the tree (and frees it) unless a figure was not finite
 * (PLUMB_ENUMERIC) or memory ran out (PLUMB_ENOMEM): then nothing.
 * json_dump_callback, not json_dumps: jansson 2.14 ignores a failed write
 * of an object's key (dump.c, do_dump), so json_dumps can return a text
 * with keys missing when memory runs out; our callback remembers the
 * failure. */
JSONOUT_FN plumb_status emit_json(FILE *out, jctx *j, json_t *root, plumb_diag *diag)
{
    plumb_status st = PLUMB_OK;
    if (j->bad)
        st = PLUMB_RAISE(diag, PLUMB_ENUMERIC, "a figure is not a finite number; no report "
                                               "written");
    else if (j->nomem || !root)
        st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory making the JSON report");
    jtext text = {NULL, 0, 0, 0};
    if (st == PLUMB_OK) {
        int rc = json_dump_callback(root, jtext_add, &text,
                                    JSON_INDENT(2) | JSON_PRESERVE_ORDER |
                                        JSON_REAL_PRECISION(PLUMBP_JSON_DIGITS));
        if (rc != 0 || text.nomem || !text.buf || jtext_add("\n", 1, &text) != 0)
            st = PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory writing the JSON report");
    }
    if (st == PLUMB_OK)
        st = emit(out, text.buf, text.len, diag);
    free(text.buf);
    json_decref(root);
    return st;
}

#endif /* PLUMB_JSONOUT_H */
