/*
 * profile_spec.c - a profile of a fall spec built in code
 * (plumb_profile_from_spec): copies of the spec, its air and criteria,
 * with the default zone, fingerprinted with SHA-256 (FIPS 180-4) over a
 * canonical text of its numbers.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "io/profile_int.h"

/* ---- a profile of a spec built in code ------------------------------------ */

/* Appends "name=value\n" with the value to 17 significant digits (enough
 * to read back any double exactly): the canonical text that a code-built
 * profile's SHA-256 is taken of. */
static void canon(plumbp_sha256 *h, const char *name, double x)
{
    char line[PLUMB_DIAG_KEY + 40];
    int n = snprintf(line, sizeof line, "%s=%.17g\n", name, x);
    if (n > 0)
        plumbp_sha256_update(h, line, (size_t)n < sizeof line ? (size_t)n : sizeof line - 1);
}

static double *dup_doubles(const double *x, size_t n)
{
    double *d = x && n ? malloc(n * sizeof *d) : NULL;
    if (d)
        memcpy(d, x, n * sizeof *d);
    return d;
}

plumb_status plumb_profile_from_spec(const plumb_fall_spec *spec, const plumb_atm_spec *atm,
                                     const char *const *criteria, size_t n_criteria,
                                     plumb_profile **out, plumb_diag *diag)
{
    *out = NULL;
    if (!spec || !atm)
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "a profile from a spec needs the spec and its air");
    if (spec->wind.profile == PLUMB_WIND_TABLE &&
        (!spec->wind.table_n || !spec->wind.table_h_m || !spec->wind.table_east_m_s ||
         !spec->wind.table_north_m_s))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "wind.table", "a table wind needs its rows");
    if (atm->model == PLUMB_ATM_TABLE && (atm->table_n < 2 || !atm->table_alt_m ||
                                          !atm->table_rho_kg_m3))
        return PLUMB_RAISE_KEY(diag, PLUMB_EINVAL, "atmosphere.table",
                               "a table atmosphere needs at least 2 rows");
    plumb_profile *p = calloc(1, sizeof *p);
    if (!p)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    int oom = !(p->path = strdup(PLUMB_PROFILE_FROM_CODE)) ||
              !(p->items = malloc(sizeof *p->items)) || !(p->shapes = calloc(1, sizeof *p->shapes));
    if (!oom) {
        p->n_items = 1;
        p->items[0] = *spec;
        p->atm = *atm;
        plumbp_strlcpy(p->name, spec->name[0] ? spec->name : "payload", sizeof p->name);
        plumbp_strlcpy(p->items[0].name, p->name, sizeof p->items[0].name);
        if (spec->wind.profile == PLUMB_WIND_TABLE) {
            size_t n = spec->wind.table_n;
            p->wind_h_m = dup_doubles(spec->wind.table_h_m, n);
            p->wind_e_m_s = dup_doubles(spec->wind.table_east_m_s, n);
            p->wind_n_m_s = dup_doubles(spec->wind.table_north_m_s, n);
            oom = !p->wind_h_m || !p->wind_e_m_s || !p->wind_n_m_s;
            p->items[0].wind.table_h_m = p->wind_h_m;
            p->items[0].wind.table_east_m_s = p->wind_e_m_s;
            p->items[0].wind.table_north_m_s = p->wind_n_m_s;
        }
        if (!oom && atm->model == PLUMB_ATM_TABLE) {
            size_t n = atm->table_n;
            p->atm_alt_m = dup_doubles(atm->table_alt_m, n);
            p->atm_rho_kg_m3 = dup_doubles(atm->table_rho_kg_m3, n);
            p->atm_t_k = atm->table_t_k ? dup_doubles(atm->table_t_k, n) : NULL;
            oom = !p->atm_alt_m || !p->atm_rho_kg_m3 || (atm->table_t_k && !p->atm_t_k);
            p->atm.table_alt_m = p->atm_alt_m;
            p->atm.table_rho_kg_m3 = p->atm_rho_kg_m3;
            p->atm.table_t_k = p->atm_t_k;
        }
    }
    if (!oom && n_criteria) {
        oom = !(p->criteria = calloc(n_criteria, sizeof *p->criteria)) ||
              !(p->criteria_pos = calloc(n_criteria, sizeof *p->criteria_pos));
        for (size_t i = 0; !oom && i < n_criteria; i++) {
            oom = !(p->criteria[i] = strdup(criteria[i] ? criteria[i] : ""));
            if (!oom)
                p->n_criteria++;
        }
    }
    if (oom) {
        plumb_profile_free(p);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory");
    }
    p->zone.samples = (size_t)ZONE_SAMPLES_DEFAULT;
    p->zone.seed = (unsigned long)ZONE_SEED_DEFAULT;
    p->zone.confidence = ZONE_CONFIDENCE_DEFAULT;

    /* SHA-256 of a canonical text of every input, so a report of a spec
     * built in code can still be traced to what was computed. */
    const plumb_fall_spec *s = &p->items[0];
    plumbp_sha256 h;
    plumbp_sha256_init(&h);
    plumbp_sha256_update(&h, p->name, strlen(p->name));
    canon(&h, "\nmass", s->mass_kg);
    canon(&h, "volume", s->volume_m3);
    canon(&h, "drag.model", (double)s->drag.model);
    canon(&h, "drag.cd", s->drag.cd);
    canon(&h, "drag.area", s->drag.area_m2);
    canon(&h, "drag.cd_area", s->drag.cd_area_m2);
    canon(&h, "drag.diameter", s->drag.diameter_m);
    for (size_t i = 0; i < s->n_descent && i < PLUMB_MAX_DESCENT; i++) {
        const plumb_descent_spec *d = &s->descent[i];
        canon(&h, "descent.kind", (double)d->kind);
        canon(&h, "descent.cd", d->cd);
        canon(&h, "descent.area", d->area_m2);
        canon(&h, "descent.diameter", d->diameter_m);
        canon(&h, "descent.trigger", (double)d->trigger);
        canon(&h, "descent.deploy", d->deploy_value);
        canon(&h, "descent.fill_time", d->fill_time_s);
        canon(&h, "descent.fill_constant", d->fill_constant);
        canon(&h, "descent.disreefs", (double)d->disreefs_previous);
        if (d->canopy != PLUMB_CANOPY_UNSPECIFIED || d->inflation_exponent > 0.0 ||
            d->opening_factor > 0.0) {
            canon(&h, "descent.canopy", (double)d->canopy);
            canon(&h, "descent.inflation_exponent", d->inflation_exponent);
            canon(&h, "descent.opening_factor", d->opening_factor);
        }
    }
    for (int i = 0; i < 3; i++) {
        canon(&h, "release", s->release_m[i]);
        canon(&h, "velocity", s->velocity_m_s[i]);
    }
    if (s->downwash.aircraft_mass_kg > 0.0 || s->downwash.disk_area_m2 > 0.0) {
        canon(&h, "downwash.aircraft_mass", s->downwash.aircraft_mass_kg);
        canon(&h, "downwash.disk_area", s->downwash.disk_area_m2);
    }
    if (s->glide.mode != PLUMB_GLIDE_OFF)
        canon(&h, "glide", (double)s->glide.mode);
    if (s->turbulence.model != PLUMB_TURB_NONE) {
        canon(&h, "turbulence.model", (double)s->turbulence.model);
        canon(&h, "turbulence.w20", s->turbulence.from_wind ? NAN : s->turbulence.w20_m_s);
    }
    canon(&h, "site.elevation", s->site_elevation_m);
    canon(&h, "gravity.latitude", s->gravity.has_latitude ? s->gravity.latitude_deg : NAN);
    canon(&h, "wind.profile", (double)s->wind.profile);
    canon(&h, "wind.speed", s->wind.speed_m_s);
    canon(&h, "wind.from", s->wind.from_deg);
    canon(&h, "wind.reference_height", s->wind.ref_height_m);
    canon(&h, "wind.exponent", s->wind.exponent);
    canon(&h, "wind.roughness", s->wind.roughness_m);
    for (size_t i = 0; s->wind.profile == PLUMB_WIND_TABLE && i < s->wind.table_n; i++) {
        canon(&h, "wind.table.height", s->wind.table_h_m[i]);
        canon(&h, "wind.table.east", s->wind.table_east_m_s[i]);
        canon(&h, "wind.table.north", s->wind.table_north_m_s[i]);
    }
    canon(&h, "atmosphere.model", (double)atm->model);
    canon(&h, "atmosphere.temperature_offset", atm->temperature_offset_k);
    canon(&h, "atmosphere.station_altitude", atm->station_alt_m);
    canon(&h, "atmosphere.pressure", atm->station_pressure_pa);
    canon(&h, "atmosphere.temperature", atm->station_temperature_k);
    canon(&h, "atmosphere.lapse_rate", atm->lapse_rate_k_m);
    canon(&h, "atmosphere.humidity", atm->relative_humidity);
    for (size_t i = 0; atm->model == PLUMB_ATM_TABLE && i < atm->table_n; i++) {
        canon(&h, "atmosphere.table.altitude", atm->table_alt_m[i]);
        canon(&h, "atmosphere.table.density", atm->table_rho_kg_m3[i]);
        canon(&h, "atmosphere.table.temperature", atm->table_t_k ? atm->table_t_k[i] : NAN);
    }
    for (size_t i = 0; i < p->n_criteria; i++) {
        plumbp_sha256_update(&h, "criterion=", 10);
        plumbp_sha256_update(&h, p->criteria[i], strlen(p->criteria[i]));
    }
    unsigned char dig[PLUMBP_SHA256_BYTES];
    plumbp_sha256_final(&h, dig);
    for (int i = 0; i < PLUMBP_SHA256_BYTES; i++)
        snprintf(p->sha256 + 2 * i, 3, "%02x", dig[i]);
    *out = p;
    return PLUMB_OK;
}

