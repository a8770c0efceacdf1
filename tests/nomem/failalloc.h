/*
 * failalloc.h - an allocation-failure hook for the tests: the Nth
 * allocation after failalloc_arm(N) fails, as it would when memory runs
 * out, and every other one succeeds.
 *
 * The programs that use it are linked with the linker's --wrap for every
 * allocating call libplumb makes (the list is NOMEM_WRAP in the Makefile):
 * malloc, calloc, realloc, strdup, strndup, open_memstream; the GSL
 * workspace constructors; yaml_parser_initialize and yaml_parser_parse
 * (which then report YAML_MEMORY_ERROR, as libyaml does); ut_parse,
 * ut_multiply, ut_divide, ut_get_converter and ut_read_xml (which then set UT_OS, as
 * udunits2 does); pthread_mutex_init and pthread_cond_init (ENOMEM, as
 * POSIX allows). jansson's allocations come here too through
 * failalloc_json_funcs(). A wrapped call counts as one allocation, whatever
 * the library does inside it.
 *
 * The counter is atomic, so a run on several threads counts every
 * allocation once (which one fails then depends on the threads' order).
 *
 * In the command-line program built with it (BUILD/tests/plumb-nomem),
 * the environment variable PLUMB_FAILALLOC=N arms it before main, and at
 * exit it says on standard error whether the Nth allocation failed:
 *   failalloc: allocation N failed      or      failalloc: M allocations, none failed
 */
#ifndef PLUMB_FAILALLOC_H
#define PLUMB_FAILALLOC_H

/* The nth allocation from now fails (n >= 1); 0 disarms. Counts restart. */
void failalloc_arm(unsigned long n);

/* Stops failing; the counts stay readable. */
void failalloc_disarm(void);

/* Allocations counted since failalloc_arm. */
unsigned long failalloc_count(void);

/* 1 when the armed allocation has failed. */
int failalloc_fired(void);

/* Recording: while on, every allocation's call path (a hash of the
 * innermost FAILALLOC_FRAMES return addresses, glibc backtrace(3)) is kept
 * in order, up to FAILALLOC_MAX_RECORD. failalloc_record(1) starts afresh. */
#define FAILALLOC_FRAMES 4
#define FAILALLOC_MAX_RECORD 1000000ul
void failalloc_record(int on);

/* How many allocations were recorded, and the call path of the ith (0-based). */
unsigned long failalloc_recorded(void);
unsigned long failalloc_path(unsigned long i);

/* 1: the armed allocation prints its backtrace on standard error when it
 * fails (for finding a call that mishandles it; addr2line -e PROGRAM). */
void failalloc_trace(int on);

/* Routes jansson's allocations through the hook (json_set_alloc_funcs). */
void failalloc_json_funcs(void);

#endif /* PLUMB_FAILALLOC_H */
