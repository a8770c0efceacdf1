/*
 * failalloc.c - the allocation-failure hook of the tests (failalloc.h).
 *
 * Each __wrap_X is what the library's call of X reaches when the program
 * is linked with -Wl,--wrap=X; __real_X is the C library's (or GSL's,
 * libyaml's, udunits2's) own. A failure returns what the real call returns
 * when memory runs out, with the same error state (errno ENOMEM, libyaml's
 * YAML_MEMORY_ERROR, udunits2's UT_OS, NULL from a GSL constructor).
 */
#include <errno.h>
#include <execinfo.h>
#include <pthread.h>
#include <stdatomic.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_interp.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_odeiv2.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_roots.h>
#include <jansson.h>
#include <udunits2.h>
#include <yaml.h>

#include "failalloc.h"

static atomic_ulong target;   /* the allocation that fails, 0: none */
static atomic_ulong seen;     /* allocations since armed */
static atomic_int fired;
static int from_env;          /* armed by PLUMB_FAILALLOC */
static atomic_int recording;
static atomic_int tracing;
static unsigned long *paths;  /* recorded call paths */
static atomic_ulong n_paths;
static pthread_mutex_t record_lock = PTHREAD_MUTEX_INITIALIZER;

void *__real_malloc(size_t n);
void *__real_realloc(void *p, size_t n);

void failalloc_record(int on)
{
    if (on) {
        void *frames[FAILALLOC_FRAMES];
        (void)backtrace(frames, FAILALLOC_FRAMES); /* loads the unwinder before it counts */
        if (!paths)
            paths = __real_malloc(FAILALLOC_MAX_RECORD * sizeof *paths);
        atomic_store(&n_paths, 0);
    }
    atomic_store(&recording, on && paths);
}

unsigned long failalloc_recorded(void)
{
    return atomic_load(&n_paths);
}

unsigned long failalloc_path(unsigned long i)
{
    return i < atomic_load(&n_paths) ? paths[i] : 0;
}

void failalloc_trace(int on)
{
    atomic_store(&tracing, on);
}

/* FNV-1a over the return addresses of the allocation's caller chain. */
static void record_path(void)
{
    void *frames[FAILALLOC_FRAMES + 2];
    int n = backtrace(frames, FAILALLOC_FRAMES + 2);
    unsigned long h = 14695981039346656037ul;
    for (int i = 2; i < n; i++) { /* 0: record_path, 1: fail_now */
        h ^= (unsigned long)(uintptr_t)frames[i];
        h *= 1099511628211ul;
    }
    pthread_mutex_lock(&record_lock);
    unsigned long k = atomic_load(&n_paths);
    if (k < FAILALLOC_MAX_RECORD) {
        paths[k] = h;
        atomic_store(&n_paths, k + 1);
    }
    pthread_mutex_unlock(&record_lock);
}

void failalloc_arm(unsigned long n)
{
    atomic_store(&seen, 0);
    atomic_store(&fired, 0);
    atomic_store(&target, n);
}

void failalloc_disarm(void)
{
    atomic_store(&target, 0);
}

unsigned long failalloc_count(void)
{
    return atomic_load(&seen);
}

int failalloc_fired(void)
{
    return atomic_load(&fired);
}

/* Counts one allocation; 1 when it is the one that must fail. */
static int fail_now(void)
{
    if (atomic_load(&recording))
        record_path();
    unsigned long t = atomic_load(&target);
    if (t == 0)
        return 0;
    unsigned long k = atomic_fetch_add(&seen, 1) + 1;
    if (k != t)
        return 0;
    atomic_store(&fired, 1);
    if (atomic_load(&tracing)) {
        void *frames[32];
        int n = backtrace(frames, 32);
        fprintf(stderr, "failalloc: allocation %lu fails here:\n", k);
        backtrace_symbols_fd(frames, n, 2);
    }
    return 1;
}

/* ---- the C library ---------------------------------------------------------- */

void *__real_calloc(size_t n, size_t size);
char *__real_strdup(const char *s);
char *__real_strndup(const char *s, size_t n);
FILE *__real_open_memstream(char **buf, size_t *len);
int __real_pthread_mutex_init(pthread_mutex_t *m, const pthread_mutexattr_t *a);
int __real_pthread_cond_init(pthread_cond_t *c, const pthread_condattr_t *a);

void *__wrap_malloc(size_t n);
void *__wrap_calloc(size_t n, size_t size);
void *__wrap_realloc(void *p, size_t n);
char *__wrap_strdup(const char *s);
char *__wrap_strndup(const char *s, size_t n);
FILE *__wrap_open_memstream(char **buf, size_t *len);
int __wrap_pthread_mutex_init(pthread_mutex_t *m, const pthread_mutexattr_t *a);
int __wrap_pthread_cond_init(pthread_cond_t *c, const pthread_condattr_t *a);

void *__wrap_malloc(size_t n)
{
    if (fail_now()) {
        errno = ENOMEM;
        return NULL;
    }
    return __real_malloc(n);
}

void *__wrap_calloc(size_t n, size_t size)
{
    if (fail_now()) {
        errno = ENOMEM;
        return NULL;
    }
    return __real_calloc(n, size);
}

void *__wrap_realloc(void *p, size_t n)
{
    if (fail_now()) {
        errno = ENOMEM;
        return NULL; /* p stays allocated, as realloc leaves it */
    }
    return __real_realloc(p, n);
}

char *__wrap_strdup(const char *s)
{
    if (fail_now()) {
        errno = ENOMEM;
        return NULL;
    }
    return __real_strdup(s);
}

char *__wrap_strndup(const char *s, size_t n)
{
    if (fail_now()) {
        errno = ENOMEM;
        return NULL;
    }
    return __real_strndup(s, n);
}

FILE *__wrap_open_memstream(char **buf, size_t *len)
{
    if (fail_now()) {
        errno = ENOMEM;
        return NULL;
    }
    return __real_open_memstream(buf, len);
}

int __wrap_pthread_mutex_init(pthread_mutex_t *m, const pthread_mutexattr_t *a)
{
    return fail_now() ? ENOMEM : __real_pthread_mutex_init(m, a);
}

int __wrap_pthread_cond_init(pthread_cond_t *c, const pthread_condattr_t *a)
{
    return fail_now() ? ENOMEM : __real_pthread_cond_init(c, a);
}

/* ---- GSL: a constructor returns NULL when its allocation fails -------------- */

#define GSL_WRAP(type, name, params, args)   \
    type __real_##name params;               \
    type __wrap_##name params;               \
    type __wrap_##name params                \
    {                                        \
        return fail_now() ? NULL : __real_##name args; \
    }

GSL_WRAP(gsl_root_fsolver *, gsl_root_fsolver_alloc, (const gsl_root_fsolver_type *t), (t))
GSL_WRAP(gsl_min_fminimizer *, gsl_min_fminimizer_alloc, (const gsl_min_fminimizer_type *t), (t))
GSL_WRAP(gsl_interp *, gsl_interp_alloc, (const gsl_interp_type *t, size_t n), (t, n))
GSL_WRAP(gsl_odeiv2_step *, gsl_odeiv2_step_alloc, (const gsl_odeiv2_step_type *t, size_t n),
         (t, n))
GSL_WRAP(gsl_odeiv2_evolve *, gsl_odeiv2_evolve_alloc, (size_t n), (n))
GSL_WRAP(gsl_odeiv2_control *, gsl_odeiv2_control_y_new, (double a, double r), (a, r))
GSL_WRAP(gsl_odeiv2_driver *, gsl_odeiv2_driver_alloc_y_new,
         (const gsl_odeiv2_system *s, const gsl_odeiv2_step_type *t, double h, double a, double r),
         (s, t, h, a, r))
GSL_WRAP(gsl_rng *, gsl_rng_alloc, (const gsl_rng_type *t), (t))

/* ---- libyaml: YAML_MEMORY_ERROR --------------------------------------------- */

int __real_yaml_parser_initialize(yaml_parser_t *p);
int __wrap_yaml_parser_initialize(yaml_parser_t *p);
int __real_yaml_parser_parse(yaml_parser_t *p, yaml_event_t *e);
int __wrap_yaml_parser_parse(yaml_parser_t *p, yaml_event_t *e);

int __wrap_yaml_parser_initialize(yaml_parser_t *p)
{
    if (fail_now()) {
        memset(p, 0, sizeof *p);
        p->error = YAML_MEMORY_ERROR;
        return 0;
    }
    return __real_yaml_parser_initialize(p);
}

int __wrap_yaml_parser_parse(yaml_parser_t *p, yaml_event_t *e)
{
    if (fail_now()) {
        memset(e, 0, sizeof *e);
        p->error = YAML_MEMORY_ERROR;
        return 0;
    }
    return __real_yaml_parser_parse(p, e);
}

/* ---- udunits2: UT_OS -------------------------------------------------------- */

ut_system *__real_ut_read_xml(const char *path);
ut_system *__wrap_ut_read_xml(const char *path);
ut_unit *__real_ut_parse(const ut_system *s, const char *string, ut_encoding enc);
ut_unit *__wrap_ut_parse(const ut_system *s, const char *string, ut_encoding enc);
ut_unit *__real_ut_multiply(const ut_unit *a, const ut_unit *b);
ut_unit *__wrap_ut_multiply(const ut_unit *a, const ut_unit *b);
ut_unit *__real_ut_divide(const ut_unit *a, const ut_unit *b);
ut_unit *__wrap_ut_divide(const ut_unit *a, const ut_unit *b);
cv_converter *__real_ut_get_converter(ut_unit *from, ut_unit *to);
cv_converter *__wrap_ut_get_converter(ut_unit *from, ut_unit *to);

ut_system *__wrap_ut_read_xml(const char *path)
{
    if (fail_now()) {
        ut_set_status(UT_OS);
        errno = ENOMEM;
        return NULL;
    }
    return __real_ut_read_xml(path);
}

ut_unit *__wrap_ut_parse(const ut_system *s, const char *string, ut_encoding enc)
{
    if (fail_now()) {
        ut_set_status(UT_OS);
        errno = ENOMEM;
        return NULL;
    }
    return __real_ut_parse(s, string, enc);
}

ut_unit *__wrap_ut_multiply(const ut_unit *a, const ut_unit *b)
{
    if (fail_now()) {
        ut_set_status(UT_OS);
        errno = ENOMEM;
        return NULL;
    }
    return __real_ut_multiply(a, b);
}

ut_unit *__wrap_ut_divide(const ut_unit *a, const ut_unit *b)
{
    if (fail_now()) {
        ut_set_status(UT_OS);
        errno = ENOMEM;
        return NULL;
    }
    return __real_ut_divide(a, b);
}

cv_converter *__wrap_ut_get_converter(ut_unit *from, ut_unit *to)
{
    if (fail_now()) {
        ut_set_status(UT_OS);
        errno = ENOMEM;
        return NULL;
    }
    return __real_ut_get_converter(from, to);
}

/* ---- jansson ---------------------------------------------------------------- */

static void *json_malloc(size_t n)
{
    return fail_now() ? NULL : __real_malloc(n);
}

static void json_free(void *p)
{
    free(p);
}

void failalloc_json_funcs(void)
{
    json_set_alloc_funcs(json_malloc, json_free);
}

/* ---- the command line: PLUMB_FAILALLOC=N ------------------------------------ */

static void report_at_exit(void)
{
    if (!from_env)
        return;
    /* what runs after this (the gcov dump of a coverage build, linked with
     * the same --wrap) is not the program's and is not counted */
    unsigned long armed = atomic_load(&target);
    failalloc_disarm();
    if (atomic_load(&fired))
        fprintf(stderr, "failalloc: allocation %lu failed\n", armed);
    else
        fprintf(stderr, "failalloc: %lu allocations, none failed\n", atomic_load(&seen));
}

__attribute__((constructor)) static void arm_from_env(void)
{
    const char *v = getenv("PLUMB_FAILALLOC");
    if (!v || !*v)
        return;
    char *end;
    unsigned long n = strtoul(v, &end, 10);
    if (*end != '\0' || n == 0)
        return;
    failalloc_json_funcs();
    from_env = 1;
    atexit(report_at_exit);
    failalloc_arm(n);
}
