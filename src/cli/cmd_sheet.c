/*
 * cmd_sheet.c - `plumb sheet PROFILE... -o FILE.pdf`: the printable safety
 * sheet of one or more profiles, one PDF (include/plumb/sheet.h).
 *
 * The work is the study's and the brief's (plumb/brief.h): this handler
 * parses the options, opens a study and a brief per profile, has the sheet
 * drawn into memory and written (atomically) only when whole. The time of
 * the calculation is now, or SOURCE_DATE_EPOCH when set (reproducible
 * builds: two runs with it set give the same bytes).
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "cli.h"
#include "cli_zone.h"
#include "plumb/brief.h"
#include "plumb/sheet.h"

static const char usage[] =
    "Usage: plumb sheet PROFILE... -o FILE.pdf [--paper a4|letter] [--samples N]\n"
    "                   [--seed S] [--units si|us] [OPTIONS]\n"
    "The printable safety sheet: one PDF for all the profiles given, each with its\n"
    "job, date and the SHA-256 of every input file, the answer (impact speed and\n"
    "energy, time, clearance, one line per criterion), a side view of the fall,\n"
    "impact energy against drop height with each criterion's limit, a plan view of\n"
    "the clearance zone (when the profile has uncertainty:), the items of an\n"
    "inventory worst first, the inputs as understood and the cautions; on every page\n"
    "the short caution, page n of m and the profile's SHA-256. --samples and --seed\n"
    "override the profiles' zone. SOURCE_DATE_EPOCH, when set, is taken as the time\n"
    "of the calculation.\n"
    "Exit status: 0 done, 2 input error, 3 the computation failed or the PDF could\n"
    "not be made or written; nothing is written on an error.\n";

enum { OPT_PAPER, OPT_SAMPLES, OPT_SEED, N_OPT };

/* More zone falls than this get a note on standard error first: seconds
 * (measured: about 15 s for 100 000 falls of the drone demo, one core). */
#define NOTE_FALLS 50000.0

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

/* The options over the defaults: paper, units, samples, seed, and the time
 * of the calculation (SOURCE_DATE_EPOCH, for reproducible files, or now). */
static plumb_status read_options(const cli_args *a, const cli_option *o, plumb_sheet_options *so,
                                 plumb_brief_options *bo, plumb_diag *diag)
{
    const char *sde = getenv("SOURCE_DATE_EPOCH");
    char *end = NULL;
    long long t = sde && *sde ? strtoll(sde, &end, 10) : -1;
    plumb_sheet_options_init(so, end && *end == '\0' && t >= 0 ? t : (long long)time(NULL));
    so->units = a->units;
    plumb_brief_options_init(bo);
    const char *paper = o[OPT_PAPER].value;
    if (paper && strcmp(paper, "a4") != 0 && strcmp(paper, "letter") != 0)
        return cli_option_error(diag, "--paper", 1, "expected a4 or letter, found '%s'", paper);
    so->paper = paper && strcmp(paper, "letter") == 0 ? PLUMB_PAPER_LETTER : PLUMB_PAPER_A4;
    double v = 0.0;
    plumb_status st = PLUMB_OK;
    if (o[OPT_SAMPLES].value &&
        (st = cli_parse_whole("--samples", o[OPT_SAMPLES].value, 1.0,
                              (double)PLUMB_ZONE_MAX_SAMPLES, &v, diag)) == PLUMB_OK)
        bo->samples = (size_t)v;
    if (st == PLUMB_OK && o[OPT_SEED].value &&
        (st = cli_parse_whole("--seed", o[OPT_SEED].value, 0.0, PLUMB_ZONE_MAX_SEED, &v, diag)) ==
            PLUMB_OK) {
        bo->has_seed = 1;
        bo->seed = (unsigned long)v;
    }
    return st;
}

static int run(const cli_args *a, const cli_option *o)
{
    if (a->n_args == 0)
        return cli_usage_error(a->cmd, "needs at least one PROFILE");
    if (!a->output || strcmp(a->output, "-") == 0)
        return cli_usage_error(a->cmd, "needs -o FILE.pdf");
    size_t n_stdin = 0;
    for (size_t i = 0; i < a->n_args; i++) {
        if (cli_same_file(a->output, a->args[i]))
            return cli_usage_error(a->cmd, "-o %s would overwrite the profile", a->output);
        n_stdin += strcmp(a->args[i], "-") == 0;
    }
    if (n_stdin > 1)
        return cli_usage_error(a->cmd, "'-' (standard input) may be given once, found %zu times",
                               n_stdin);
    sheet_job job = {.n = a->n_args};
    plumb_brief_options bo;
    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_status st = read_options(a, o, &job.so, &bo, &diag);
    if (st != PLUMB_OK)
        return cli_fail(&diag);
    cli_study *cs = calloc(a->n_args, sizeof *cs);
    plumb_brief **briefs = calloc(a->n_args, sizeof *briefs);
    if (!cs || !briefs)
        st = cli_nomem(&diag);
    for (size_t i = 0; st == PLUMB_OK && i < a->n_args; i++) {
        st = cli_study_open(a, a->args[i], &cs[i], &diag);
        double falls = st == PLUMB_OK ? plumb_brief_zone_falls(cs[i].study, &bo) : 0.0;
        if (!a->quiet && falls > NOTE_FALLS)
            fprintf(stderr, "plumb sheet: %s: the clearance zone runs %.0f falls (--samples sets "
                            "fewer)\n", a->args[i], falls);
        cli_zone_opts zo = {.samples = o[OPT_SAMPLES].value, .seed = o[OPT_SEED].value};
        if (st == PLUMB_OK && (st = plumb_brief_alloc(cs[i].study, &bo, &briefs[i], &diag)) !=
                                  PLUMB_OK)
            cli_zone_at_option(&zo, &diag);
    }
    job.briefs = (const plumb_brief *const *)briefs;
    int rc = st == PLUMB_OK ? cli_emit(a, write_sheet, &job) : cli_fail(&diag);
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
