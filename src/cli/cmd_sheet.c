/*
 * cmd_sheet.c - `plumb sheet PROFILE... -o FILE.pdf`: the printable safety
 * sheet of one or more profiles, one PDF (include/plumb/sheet.h).
 *
 * The work is the study's and the brief's (plumb/brief.h): this handler
 * parses the options, opens a study and gathers a brief per profile, and
 * has the sheet drawn into memory; the file is written (atomically) only
 * when the whole document is made. The date and time of the calculation
 * are now, or SOURCE_DATE_EPOCH when it is set (reproducible builds), so
 * two runs with it set give the same bytes.
 */
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "cli.h"
#include "plumb/brief.h"
#include "plumb/sheet.h"

static const char usage[] =
    "Usage: plumb sheet PROFILE... -o FILE.pdf [--paper a4|letter] [--samples N] [--seed S]\n"
    "                   [--units si|us] [OPTIONS]\n"
    "The printable safety sheet: one PDF for all the profiles given, each with its job,\n"
    "date and the SHA-256 of every input file, the answer (impact speed and energy,\n"
    "time, clearance, one line per criterion), a side view of the fall, impact energy\n"
    "against drop height with each criterion's limit, a plan view of the clearance zone\n"
    "(when the profile has uncertainty:), the items of an inventory worst first, the\n"
    "inputs as understood and the cautions; on every page the short caution, page n of\n"
    "m and the profile's SHA-256. --samples and --seed override the profiles' zone.\n"
    "SOURCE_DATE_EPOCH, when set, is taken as the time of the calculation.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed or the PDF could not\n"
    "be made or written; nothing is written on an error.\n";

enum { OPT_PAPER, OPT_SAMPLES, OPT_SEED, N_OPT };

/* Largest seed: integers up to 2^53 - 1 read back exactly from JSON. */
#define MAX_SEED 9007199254740991.0

/* A whole number in [lo, hi], or a usage error naming the option. */
static int whole(const cli_args *a, const cli_option *o, double lo, double hi, double *out)
{
    char *end = NULL;
    errno = 0;
    double v = o->value[0] && o->value[0] != ' ' ? strtod(o->value, &end) : -1.0;
    if (!end || *end != '\0' || errno == ERANGE || !(v >= lo && v <= hi) ||
        v != (double)(long long)v)
        return cli_usage_error(a->cmd, "%s expects a whole number from %.0f to %.0f, found '%s'",
                               o->name, lo, hi, o->value);
    *out = v;
    return CLI_GO_ON;
}

/* When the calculation is made: SOURCE_DATE_EPOCH or now; and the local
 * offset from UTC then, from the local and UTC calendars. */
static void calc_time(plumb_sheet_options *so)
{
    const char *sde = getenv("SOURCE_DATE_EPOCH");
    char *end = NULL;
    long long t = sde && *sde ? strtoll(sde, &end, 10) : -1;
    if (!end || *end != '\0' || t < 0)
        t = (long long)time(NULL);
    time_t tt = (time_t)t;
    struct tm u, l;
    gmtime_r(&tt, &u);
    localtime_r(&tt, &l);
    int days = l.tm_year != u.tm_year ? (l.tm_year > u.tm_year ? 1 : -1) : l.tm_yday - u.tm_yday;
    so->time_utc = t;
    so->utc_offset_s = days * 86400 + (l.tm_hour - u.tm_hour) * 3600 + (l.tm_min - u.tm_min) * 60 +
                       (l.tm_sec - u.tm_sec);
}

typedef struct sheet_job {
    plumb_sheet_options so;
    const plumb_brief *const *briefs;
    size_t n;
} sheet_job;

static plumb_status write_sheet(FILE *out, const void *ctx, plumb_diag *diag)
{
    const sheet_job *job = ctx;
    return plumb_sheet_write(out, &job->so, job->briefs, job->n, diag);
}

static int run(const cli_args *a, const cli_option *o)
{
    if (a->n_args == 0)
        return cli_usage_error(a->cmd, "needs at least one PROFILE");
    if (!a->output || strcmp(a->output, "-") == 0)
        return cli_usage_error(a->cmd, "needs -o FILE.pdf");
    for (size_t i = 0; i < a->n_args; i++)
        if (cli_same_file(a->output, a->args[i]))
            return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);
    sheet_job job;
    memset(&job, 0, sizeof job);
    job.so.units = a->units;
    job.so.version = PLUMB_VERSION;
    if (o[OPT_PAPER].value && strcmp(o[OPT_PAPER].value, "a4") != 0 &&
        strcmp(o[OPT_PAPER].value, "letter") != 0)
        return cli_usage_error(a->cmd, "--paper must be a4 or letter, found '%s'",
                               o[OPT_PAPER].value);
    job.so.paper = o[OPT_PAPER].value && strcmp(o[OPT_PAPER].value, "letter") == 0
                       ? PLUMB_PAPER_LETTER : PLUMB_PAPER_A4;
    plumb_brief_options bo;
    plumb_brief_options_init(&bo);
    double v = 0.0;
    if (o[OPT_SAMPLES].value) {
        int rc = whole(a, &o[OPT_SAMPLES], 1.0, (double)PLUMB_ZONE_MAX_SAMPLES, &v);
        if (rc != CLI_GO_ON)
            return rc;
        bo.samples = (size_t)v;
    }
    if (o[OPT_SEED].value) {
        int rc = whole(a, &o[OPT_SEED], 0.0, MAX_SEED, &v);
        if (rc != CLI_GO_ON)
            return rc;
        bo.has_seed = 1;
        bo.seed = (unsigned long)v;
    }
    calc_time(&job.so);

    cli_study *cs = calloc(a->n_args, sizeof *cs);
    plumb_brief **briefs = calloc(a->n_args, sizeof *briefs);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_status st = cs && briefs ? PLUMB_OK : PLUMB_ENOMEM;
    if (st != PLUMB_OK)
        snprintf(diag.message, sizeof diag.message, "out of memory");
    for (size_t i = 0; st == PLUMB_OK && i < a->n_args; i++) {
        st = cli_study_open(a, a->args[i], &cs[i], &diag);
        if (st == PLUMB_OK)
            st = plumb_brief_make(cs[i].study, &bo, &briefs[i], &diag);
    }
    int rc;
    if (st == PLUMB_OK) {
        job.briefs = (const plumb_brief *const *)briefs;
        job.n = a->n_args;
        rc = cli_emit(a, write_sheet, &job);
    } else {
        diag.status = st;
        rc = cli_fail(&diag);
    }
    for (size_t i = 0; briefs && i < a->n_args; i++)
        plumb_brief_free(briefs[i]);
    for (size_t i = 0; cs && i < a->n_args; i++)
        cli_study_close(&cs[i]);
    free(briefs);
    free(cs);
    return rc;
}

int cmd_sheet(int argc, char **argv)
{
    cli_option o[N_OPT] = {
        [OPT_PAPER] = {.name = "--paper", .arg = "SIZE",
                       .help = "a4 (default) or letter"},
        [OPT_SAMPLES] = {.name = "--samples", .arg = "N",
                         .help = "clearance-zone falls, 1 to 100000000\n(default: zone.samples)"},
        [OPT_SEED] = {.name = "--seed", .arg = "S",
                      .help = "random seed, 0 to 2^53-1 (default: zone.seed)"},
    };
    cli_args a;
    int rc = cli_parse(argc, argv, CLI_SET | CLI_UNITS | CLI_OUTPUT | CLI_QUIET | CLI_CRITERIA, o,
                       N_OPT, usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    rc = run(&a, o);
    cli_args_free(&a);
    return rc;
}
