/*
 * cmd_air.c - `plumb air [--alt FROM:TO:STEP]`: air properties of the U.S.
 * Standard Atmosphere 1976 (NOAA-S/T 76-1562) by geometric altitude above
 * mean sea level, with an optional temperature offset: temperature,
 * pressure, density, Sutherland viscosity and speed of sound.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli.h"

/* The altitudes when --alt is not given. The range is read by libplumb's
 * plumb_range_parse, as sweep's are: at most PLUMB_RANGE_MAX_VALUES rows. */
#define AIR_DEFAULT_ALT "0m:20km:1km"

static const char usage[] =
    "Usage: plumb air [--alt FROM:TO:STEP] [--temperature-offset DT] [OPTIONS]\n"
    "Air of the U.S. Standard Atmosphere 1976 by geometric altitude above mean sea\n"
    "level: temperature, pressure, density, viscosity and speed of sound.\n";

typedef struct air_job {
    plumb_report_options opt;
    plumb_air_table table;
} air_job;

static plumb_status write_report(FILE *out, const void *ctx, plumb_diag *diag)
{
    const air_job *job = ctx;
    return plumb_report_air_table(out, &job->opt, &job->table, diag);
}

/* One quantity of an option, with its unit. */
static plumb_status quantity(const plumb_units *units, const char *option, const char *part,
                             const char *text, plumb_dim dim, double *out, plumb_diag *diag)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_units_parse(units, text, dim, out, &d);
    if (st != PLUMB_OK)
        return cli_option_status(diag, st, option, 1, "%s%s'%s': %s", part, part[0] ? " " : "", text,
                            d.message[0] ? d.message : plumb_strerror(st));
    return PLUMB_OK;
}

static int run(const cli_args *a, const char *alt_text, const char *dt_text)
{
    if (a->n_args > 0)
        return cli_usage_error(a->cmd, "takes no arguments, found '%s'", a->args[0]);
    plumb_diag diag;
    plumb_diag_clear(&diag);
    plumb_units *units = NULL;
    plumb_air *rows = NULL;
    plumb_range alt;
    double dt = 0.0;
    size_t n = 0;

    plumb_status st = plumb_units_alloc_deferred(&units, &diag);
    if (st == PLUMB_OK)
        st = plumb_range_parse(units, alt_text ? alt_text : AIR_DEFAULT_ALT, PLUMB_DIM_LENGTH,
                               "--alt", &alt, &diag);
    if (st == PLUMB_OK && dt_text)
        st = quantity(units, "--temperature-offset", "", dt_text, PLUMB_DIM_TEMP_DIFF, &dt,
                      &diag);
    if (st == PLUMB_OK && dt_text) {
        /* the profile's range for atmosphere.temperature_offset */
        plumb_diag d;
        plumb_diag_clear(&d);
        st = plumb_profile_key_check("atmosphere.temperature_offset", dt, &d);
        /* "200 K is out of range: must be ...", after what was written
         * when that is not the same number ('360 degF': 200 K is ...) */
        char *end = NULL;
        double written = strtod(dt_text, &end);
        if (st != PLUMB_OK && end != dt_text && written == dt)
            st = cli_option_status(&diag, st, "--temperature-offset", 1, "%s", d.message);
        else if (st != PLUMB_OK)
            st = cli_option_status(&diag, st, "--temperature-offset", 1, "'%s': %s", dt_text,
                                   d.message);
    }
    double *alt_m = NULL;
    if (st == PLUMB_OK) {
        n = alt.n;
        rows = calloc(n, sizeof *rows);
        alt_m = calloc(n, sizeof *alt_m);
        if (!rows || !alt_m)
            st = cli_option_status(&diag, PLUMB_ENOMEM, "--alt", 1, "out of memory for %zu rows", n);
    }
    if (st == PLUMB_OK)
        st = plumb_range_values_si(&alt, units, alt_m, &diag);
    for (size_t i = 0; st == PLUMB_OK && i < n; i++) {
        plumb_status s = plumb_std1976(alt_m[i], dt, &rows[i]);
        if (s != PLUMB_OK)
            st = cli_option_status(&diag, s,
                              alt_text ? "--alt" : dt_text ? "--temperature-offset" : "", 1,
                              "no air at %g m above sea level with a temperature offset of "
                              "%g K: %s (the model spans -5 km to 86 km and needs a positive "
                              "temperature)", alt_m[i], dt, plumb_strerror(s));
    }
    st = cli_units_error(units, st, &diag);
    int rc;
    if (st == PLUMB_OK) {
        air_job job;
        memset(&job, 0, sizeof job);
        job.opt = cli_report_options(a);
        job.table.rows = rows;
        job.table.n_rows = n;
        job.table.temperature_offset_k = dt;
        rc = cli_emit(a, write_report, &job);
    } else {
        rc = cli_fail(&diag);
    }
    free(rows);
    free(alt_m);
    plumb_units_free(units);
    return rc;
}

int cmd_air(int argc, char **argv)
{
    cli_option extra[] = {
        {.name = "--alt", .arg = "FROM:TO:STEP",
         .help = "altitudes, each with its unit (default " AIR_DEFAULT_ALT ");\n"
                 "STEP not zero and towards TO (negative to go down),\n"
                 "at most 100000 rows"},
        {.name = "--temperature-offset", .arg = "DT",
         .help = "added to the standard temperature, e.g. \"10 K\"\n(default 0 K)"},
    };
    cli_args a;
    int rc = cli_parse(argc, argv, CLI_FORMAT | CLI_UNITS | CLI_OUTPUT | CLI_QUIET, extra,
                       sizeof extra / sizeof extra[0], usage, &a);
    if (rc != CLI_GO_ON)
        return rc;
    rc = run(&a, extra[0].value, extra[1].value);
    cli_args_free(&a);
    return rc;
}
