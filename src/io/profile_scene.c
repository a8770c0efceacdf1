/*
 * profile_scene.c - reading the scene of a profile: the release (height,
 * velocity: east = s sin h, north = s cos h, up = c), the site and points
 * given as latitude and longitude (geodesy.h), the atmosphere (the 1976
 * temperature, NOAA-S/T 76-1562, plus its offset kept above 0 K over the
 * fall), the wind and its turbulence.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "plumb/geodesy.h"
#include "io/profile_int.h"

/* Bases of the 1976 layers above 0 km, geopotential m (U.S. Standard
 * Atmosphere 1976, Table 4): the temperature's extremes lie at these. */
static const double std1976_bases_gp_m[] = {11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0};

/* A point of `m` given as latitude and longitude instead of east and
 * north: turned into east, north metres from the site (geodesy.h). */
plumb_status plumbp_profile_map_point(loader *L, const plumby_map *m, double en[2])
{
    const plumb_zone_spec *z = &L->p->zone;
    int has_lat = plumby_get(m, "latitude") != NULL, has_lon = plumby_get(m, "longitude") != NULL;
    if (!has_lat && !has_lon)
        return PLUMB_OK;
    plumb_status st;
    if ((st = plumby_forbid(m, "east", "together with latitude and longitude (give one or the "
                                       "other)")) != PLUMB_OK ||
        (st = plumby_forbid(m, "north", "together with latitude and longitude (give one or the "
                                        "other)")) != PLUMB_OK)
        return st;
    if (!has_lat || !has_lon)
        return plumby_missing(m, has_lat ? "longitude" : "latitude",
                              "a point on the map needs both latitude and longitude");
    double ll[2];
    if ((st = plumby_num(m, "latitude", 1, 0.0, &ll[0], NULL)) != PLUMB_OK ||
        (st = plumby_num(m, "longitude", 1, 0.0, &ll[1], NULL)) != PLUMB_OK)
        return st;
    if (!z->has_site)
        return plumby_raise_value(m, "latitude", PLUMB_EINVAL,
                                  "a point given by latitude and longitude needs the site's: "
                                  "site.latitude and site.longitude (WGS 84)");
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_geodesy_inverse(z->site_deg[0], z->site_deg[1], ll[0], ll[1], en, &d) != PLUMB_OK)
        return plumby_raise_value(m, "latitude", PLUMB_EINVAL, "%s", d.message);
    return PLUMB_OK;
}

plumb_status plumbp_profile_read_release_site(loader *L, plumb_fall_spec *base)
{
    plumby_map rm, vm, pm, sm;
    plumb_status st;
    plumby_sub(&L->root, "release", &rm);
    plumby_sub(&rm, "velocity", &vm);
    plumby_sub(&rm, "position", &pm);
    plumby_sub(&L->root, "site", &sm);
    plumby_map dwm;
    plumby_sub(&rm, "downwash", &dwm);
    if (dwm.node &&
        ((st = plumby_num(&dwm, "aircraft_mass", 1, 0.0, &base->downwash.aircraft_mass_kg, NULL)) !=
             PLUMB_OK ||
         (st = plumby_num(&dwm, "disk_area", 1, 0.0, &base->downwash.disk_area_m2, NULL)) !=
             PLUMB_OK))
        return st;
    if ((st = plumby_num(&rm, "height", 1, 0.0, &L->height_m, NULL)) != PLUMB_OK ||
        (st = plumby_num(&pm, "east", 0, 0.0, &base->release_m[0], NULL)) != PLUMB_OK ||
        (st = plumby_num(&pm, "north", 0, 0.0, &base->release_m[1], NULL)) != PLUMB_OK)
        return st;
    base->release_m[2] = L->height_m;

    static const char *const cart[] = {"east", "north", "up"}, *const polar[] = {"speed", "heading",
                                                                                 "climb"};
    int has_cart = 0, n_cart = 0, n_polar = 0;
    for (size_t i = 0; i < 3; i++) {
        n_cart += plumby_get(&vm, cart[i]) != NULL;
        n_polar += plumby_get(&vm, polar[i]) != NULL;
    }
    has_cart = n_cart > 0;
    /* both forms: the key refused is one of the form given less fully
     * (speed and heading with a stray east: the east) */
    for (size_t i = 0; has_cart && n_polar > 0 && i < 3; i++)
        if ((st = n_polar > n_cart
                      ? plumby_forbid(&vm, cart[i], "together with speed/heading/climb (give "
                                                    "east, north, up or speed, heading, climb)")
                      : plumby_forbid(&vm, polar[i], "together with east/north/up (give east, "
                                                     "north, up or speed, heading, climb)")) !=
            PLUMB_OK)
            return st;
    if (has_cart || !vm.node || (!plumby_get(&vm, "speed") && !plumby_get(&vm, "heading") &&
                                 !plumby_get(&vm, "climb"))) {
        for (size_t i = 0; i < 3; i++)
            if ((st = plumby_num(&vm, cart[i], 0, 0.0, &base->velocity_m_s[i], NULL)) != PLUMB_OK)
                return st;
    } else {
        double speed, heading, climb;
        const plumby_node *climb_given = plumby_get(&vm, "climb");
        if (!plumby_get(&vm, "speed") && climb_given && !plumby_get(&vm, "heading") &&
            climb_given->kind == PLUMBY_SCALAR) {
            /* a climb alone is most often a throw straight up or down */
            char why[PLUMB_DIAG_MSG / 2];
            snprintf(why, sizeof why, "heading and climb come with a speed; a purely vertical "
                                      "throw is written with up, as in {up: %.60s}",
                     climb_given->text);
            return plumby_missing(&vm, "speed", why);
        }
        if (!plumby_get(&vm, "speed"))
            return plumby_missing(&vm, "speed", "heading and climb come with a speed");
        if ((st = plumby_num(&vm, "speed", 1, 0.0, &speed, NULL)) != PLUMB_OK)
            return st;
        if (!plumby_get(&vm, "heading"))
            return plumby_missing(&vm, "heading",
                                  "a speed needs the heading it moves toward, clockwise from north");
        if ((st = plumby_num(&vm, "heading", 1, 0.0, &heading, NULL)) != PLUMB_OK ||
            (st = plumby_num(&vm, "climb", 0, 0.0, &climb, NULL)) != PLUMB_OK)
            return st;
        double sh, ch;
        plumbp_sincos_deg(heading, &sh, &ch);
        base->velocity_m_s[0] = speed * sh;
        base->velocity_m_s[1] = speed * ch;
        base->velocity_m_s[2] = climb;
    }

    int has_lat;
    if ((st = plumby_num(&sm, "elevation", 0, 0.0, &L->elevation_m, NULL)) != PLUMB_OK ||
        (st = plumby_num(&sm, "latitude", 0, 0.0, &base->gravity.latitude_deg, &has_lat)) !=
            PLUMB_OK)
        return st;
    base->gravity.has_latitude = has_lat;
    base->site_elevation_m = L->elevation_m;
    int has_lon;
    double lon;
    if ((st = plumby_num(&sm, "longitude", 0, 0.0, &lon, &has_lon)) != PLUMB_OK)
        return st;
    if (has_lon && !has_lat)
        return plumby_missing(&sm, "latitude", "a site longitude needs the site latitude too");
    L->p->zone.has_site = has_lon;
    L->p->zone.site_deg[0] = base->gravity.latitude_deg;
    L->p->zone.site_deg[1] = has_lon ? lon : 0.0;
    if ((st = plumbp_profile_map_point(L, &pm, base->release_m)) != PLUMB_OK)
        return st;
    if (plumbp_release_too_high(L->elevation_m, L->height_m))
        return plumby_raise_value(&rm, "height", PLUMB_ERANGE,
                                  "the release point, %.6g m above the strike level at %.6g m "
                                  "above sea level, is above %.6g m, the top of the 1976 "
                                  "atmosphere",
                                  L->height_m, L->elevation_m, PLUMB_STD1976_TOP_M);
    return PLUMB_OK;
}

int plumbp_std_temperature_fails(double dt_k, double lo_m, double hi_m, double *at_m, double *t_k,
                                 plumb_status *st)
{
    double at[2 + ARRAY_LEN(std1976_bases_gp_m)];
    size_t n = 0;
    at[n++] = lo_m;
    at[n++] = hi_m;
    for (size_t i = 0; i < ARRAY_LEN(std1976_bases_gp_m); i++) {
        double h = std1976_bases_gp_m[i];
        double z = PLUMB_R0_M * h / (PLUMB_R0_M - h);
        if (z > lo_m && z < hi_m)
            at[n++] = z;
    }
    for (size_t i = 0; i < n; i++) {
        plumb_air air;
        *at_m = at[i];
        *st = plumb_std1976(at[i], 0.0, &air);
        if (*st != PLUMB_OK)
            return 1;
        *t_k = air.t_k;
        if (!(air.t_k + dt_k > 0.0)) {
            *st = PLUMB_ERANGE;
            return 1;
        }
    }
    return 0;
}

/* 1976 temperature + dt_k > 0 over lo_m..hi_m (see the file comment). */
static plumb_status check_std_temperature(const plumby_map *am, double dt_k, double lo_m,
                                          double hi_m)
{
    double at_m = 0.0, t_k = 0.0;
    plumb_status st = PLUMB_OK;
    if (!plumbp_std_temperature_fails(dt_k, lo_m, hi_m, &at_m, &t_k, &st))
        return PLUMB_OK;
    if (st != PLUMB_ERANGE)
        return plumby_raise_value(am, "temperature_offset", st,
                                  "the 1976 atmosphere has no temperature at %.6g m", at_m);
    return plumby_raise_value(am, "temperature_offset", PLUMB_ERANGE,
                              "the temperature at %.6g m above sea level would be %.6g K "
                              "(1976 standard %.6g K %+.6g K); it must stay above 0 K",
                              at_m, t_k + dt_k, t_k, dt_k);
}

plumb_status plumbp_profile_read_atmosphere(loader *L)
{
    plumb_atm_spec *a = &L->p->atm;
    plumby_map am;
    plumb_status st;
    int model;
    plumby_sub(&L->root, "atmosphere", &am);
    plumb_atm_spec_init(a);
    if ((st = plumby_word(&am, "model", 0, &model)) != PLUMB_OK ||
        (st = plumby_num(&am, "humidity", 0, 0.0, &a->relative_humidity, NULL)) != PLUMB_OK)
        return st;
    double lo = L->elevation_m, hi = L->elevation_m + L->height_m;
    if (model == 0) {
        a->model = PLUMB_ATM_STD1976;
        static const char why[] = "with model standard-1976";
        if ((st = plumby_forbid(&am, "pressure", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "temperature", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "lapse_rate", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "table", why)) != PLUMB_OK ||
            (st = plumby_num(&am, "temperature_offset", 0, 0.0, &a->temperature_offset_k, NULL)) !=
                PLUMB_OK)
            return st;
        return check_std_temperature(&am, a->temperature_offset_k, lo, hi);
    }
    if (model == 1) {
        a->model = PLUMB_ATM_SURFACE;
        static const char why[] = "with model surface";
        double lapse = a->lapse_rate_k_m;
        int has_lapse;
        if ((st = plumby_forbid(&am, "temperature_offset", why)) != PLUMB_OK ||
            (st = plumby_forbid(&am, "table", why)) != PLUMB_OK ||
            (st = plumby_num(&am, "pressure", 1, 0.0, &a->station_pressure_pa, NULL)) != PLUMB_OK ||
            (st = plumby_num(&am, "temperature", 1, 0.0, &a->station_temperature_k, NULL)) !=
                PLUMB_OK ||
            (st = plumby_num(&am, "lapse_rate", 0, lapse, &a->lapse_rate_k_m, &has_lapse)) !=
                PLUMB_OK)
            return st;
        a->station_alt_m = L->elevation_m;
        double t_top = plumbp_surface_top_k(a, L->height_m);
        if (!(t_top > 0.0))
            return plumby_raise_value(&am, has_lapse ? "lapse_rate" : "temperature", PLUMB_ERANGE,
                                      "the temperature at the release height would be %.6g K "
                                      "(%.6g K - %.6g K/m x %.6g m); it must stay above 0 K",
                                      t_top, a->station_temperature_k, a->lapse_rate_k_m,
                                      L->height_m);
        return PLUMB_OK;
    }
    a->model = PLUMB_ATM_TABLE;
    static const char why[] = "with model table";
    if ((st = plumby_forbid(&am, "pressure", why)) != PLUMB_OK ||
        (st = plumby_forbid(&am, "temperature", why)) != PLUMB_OK ||
        (st = plumby_forbid(&am, "lapse_rate", why)) != PLUMB_OK)
        return st;
    const plumby_node *t = plumby_get(&am, "table");
    if (!t)
        return plumby_missing(&am, "table",
                              "model table needs rows {altitude: ..., density: ...}");
    char tkey[PLUMB_DIAG_KEY];
    plumby_key_join(tkey, sizeof tkey, am.key, "table", 0);
    if (t->n < 2)
        return plumby_raise(&L->ctx, t->origin, t->line, t->col, tkey, PLUMB_EINVAL,
                            "expected at least 2 rows, found %zu", t->n);
    size_t n = t->n;
    L->p->atm_alt_m = calloc(n, sizeof(double));
    L->p->atm_rho_kg_m3 = calloc(n, sizeof(double));
    if (!L->p->atm_alt_m || !L->p->atm_rho_kg_m3)
        return nomem(L);
    const plumby_schema *row_schema = &plumbp_profile_atm_row_item[0];
    int with_t = 0;
    for (size_t i = 0; i < n; i++) {
        plumby_map rowm;
        char rkey[PLUMB_DIAG_KEY];
        plumby_key_join(rkey, sizeof rkey, tkey, NULL, i);
        plumby_map_init(&rowm, &L->ctx, t->items[i], row_schema, rkey);
        int has_t = plumby_get(&rowm, "temperature") != NULL;
        if (i == 0 && has_t) {
            with_t = 1;
            if (!(L->p->atm_t_k = calloc(n, sizeof(double))))
                return nomem(L);
        }
        if (has_t != with_t) {
            if (has_t)
                return plumby_forbid(&rowm, "temperature",
                                     "in only some rows (give temperature in every row or none)");
            return plumby_missing(&rowm, "temperature",
                                  "the first row gives a temperature, so every row must");
        }
        if ((st = plumby_num(&rowm, "altitude", 1, 0.0, &L->p->atm_alt_m[i], NULL)) != PLUMB_OK ||
            (st = plumby_num(&rowm, "density", 1, 0.0, &L->p->atm_rho_kg_m3[i], NULL)) !=
                PLUMB_OK)
            return st;
        if (with_t &&
            (st = plumby_num(&rowm, "temperature", 1, 0.0, &L->p->atm_t_k[i], NULL)) != PLUMB_OK)
            return st;
        if (i > 0 && !(L->p->atm_alt_m[i] > L->p->atm_alt_m[i - 1]))
            return plumby_raise_value(&rowm, "altitude", PLUMB_EINVAL,
                                      "altitudes must increase row by row: %.6g m follows %.6g m",
                                      L->p->atm_alt_m[i], L->p->atm_alt_m[i - 1]);
    }
    if (with_t && (st = plumby_forbid(&am, "temperature_offset",
                                      "when the table gives temperatures")) != PLUMB_OK)
        return st;
    if ((st = plumby_num(&am, "temperature_offset", 0, 0.0, &a->temperature_offset_k, NULL)) !=
        PLUMB_OK)
        return st;
    a->table_n = n;
    a->table_alt_m = L->p->atm_alt_m;
    a->table_rho_kg_m3 = L->p->atm_rho_kg_m3;
    a->table_t_k = L->p->atm_t_k;
    if (plumbp_table_misses(a, lo, hi))
        return plumby_raise(&L->ctx, t->origin, t->line, t->col, tkey, PLUMB_ERANGE,
                            "the table spans %.6g m .. %.6g m above sea level, but the fall spans "
                            "%.6g m .. %.6g m",
                            L->p->atm_alt_m[0], L->p->atm_alt_m[n - 1], lo, hi);
    if (!with_t)
        return check_std_temperature(&am, a->temperature_offset_k, lo, hi);
    return PLUMB_OK;
}

/* wind.turbulence (plumb/turbulence.h): a model (default dryden) and its
 * intensity as a word or W20; neither: W20 from the mean wind at 20 ft. */
plumb_status plumbp_profile_read_turbulence(loader *L, plumb_turbulence_spec *t)
{
    plumby_map wm, tm;
    plumb_status st;
    memset(t, 0, sizeof *t);
    plumby_sub(&L->root, "wind", &wm);
    plumby_sub(&wm, "turbulence", &tm);
    if (!tm.node)
        return PLUMB_OK;
    int model = 0, word = 0;
    if ((st = plumby_word(&tm, "model", 0, &model)) != PLUMB_OK)
        return st;
    t->model = model == 0 ? PLUMB_TURB_DRYDEN : PLUMB_TURB_VON_KARMAN;
    int has_i = plumby_get(&tm, "intensity") != NULL, has_w = plumby_get(&tm, "w20") != NULL;
    if (has_i && has_w)
        return plumby_forbid(&tm, "w20", "together with intensity (give intensity or w20)");
    if (has_i) {
        static const double w20[] = {PLUMB_TURB_W20_LIGHT_M_S, PLUMB_TURB_W20_MODERATE_M_S,
                                     PLUMB_TURB_W20_SEVERE_M_S};
        if ((st = plumby_word(&tm, "intensity", 0, &word)) != PLUMB_OK)
            return st;
        t->w20_m_s = w20[word];
    } else if (has_w) {
        if ((st = plumby_num(&tm, "w20", 1, 0.0, &t->w20_m_s, NULL)) != PLUMB_OK)
            return st;
    } else {
        t->from_wind = 1;
    }
    return PLUMB_OK;
}

plumb_status plumbp_profile_read_wind(loader *L, plumb_wind_spec *w)
{
    plumby_map wm;
    plumb_status st;
    int prof;
    plumby_sub(&L->root, "wind", &wm);
    plumb_wind_spec_init(w);
    if ((st = plumby_word(&wm, "profile", 0, &prof)) != PLUMB_OK)
        return st;
    static const char *const names[] = {"uniform", "power", "log", "table"};
    static const plumb_wind_profile kinds[] = {PLUMB_WIND_UNIFORM, PLUMB_WIND_POWER, PLUMB_WIND_LOG,
                                               PLUMB_WIND_TABLE};
    w->profile = kinds[prof];
    /* what a key belongs to, so that the message says how to use it */
    static const struct {
        const char *key, *owner;
        unsigned used; /* bit k: used with names[k] */
    } owned[] = {{"exponent", "power", 1u << 1},
                 {"roughness", "log", 1u << 2},
                 {"reference_height", "power or log", 1u << 1 | 1u << 2},
                 {"table", "table", 1u << 3}};
    int given = plumby_get(&wm, "profile") != NULL;
    for (size_t i = 0; i < sizeof owned / sizeof owned[0]; i++) {
        if (owned[i].used & (1u << prof))
            continue;
        char why[128];
        snprintf(why, sizeof why, "with profile %s%s (it belongs to profile %s)", names[prof],
                 given ? "" : ", the default when wind.profile is not given", owned[i].owner);
        if ((st = plumby_forbid(&wm, owned[i].key, why)) != PLUMB_OK)
            return st;
    }
    if (prof != 3) {
        if ((st = plumby_num(&wm, "speed", 0, 0.0, &w->speed_m_s, NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "from", 0, 0.0, &w->from_deg, NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "reference_height", 0, w->ref_height_m, &w->ref_height_m,
                             NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "exponent", 0, w->exponent, &w->exponent, NULL)) != PLUMB_OK ||
            (st = plumby_num(&wm, "roughness", 0, w->roughness_m, &w->roughness_m, NULL)) !=
                PLUMB_OK)
            return st;
        if (plumbp_log_wind_too_rough(w))
            return plumby_raise_value(&wm, plumby_get(&wm, "roughness") ? "roughness"
                                                                          : "reference_height",
                                      PLUMB_ERANGE,
                                      "the roughness length (%.6g m) must be below the reference "
                                      "height (%.6g m)",
                                      w->roughness_m, w->ref_height_m);
        return PLUMB_OK;
    }
    const char *rows = "with profile table (the table's rows give the speed and direction)";
    if ((st = plumby_forbid(&wm, "speed", rows)) != PLUMB_OK ||
        (st = plumby_forbid(&wm, "from", rows)) != PLUMB_OK)
        return st;
    const plumby_node *t = plumby_get(&wm, "table");
    if (!t)
        return plumby_missing(&wm, "table",
                              "profile table needs rows {height: ..., speed: ..., from: ...}");
    char tkey[PLUMB_DIAG_KEY];
    plumby_key_join(tkey, sizeof tkey, wm.key, "table", 0);
    if (t->n < 1)
        return plumby_raise(&L->ctx, t->origin, t->line, t->col, tkey, PLUMB_EINVAL,
                            "expected at least 1 row, found none");
    size_t n = t->n;
    L->p->wind_h_m = calloc(n, sizeof(double));
    L->p->wind_e_m_s = calloc(n, sizeof(double));
    L->p->wind_n_m_s = calloc(n, sizeof(double));
    if (!L->p->wind_h_m || !L->p->wind_e_m_s || !L->p->wind_n_m_s)
        return nomem(L);
    for (size_t i = 0; i < n; i++) {
        plumby_map rowm;
        char rkey[PLUMB_DIAG_KEY];
        double speed, from;
        plumby_key_join(rkey, sizeof rkey, tkey, NULL, i);
        plumby_map_init(&rowm, &L->ctx, t->items[i], &plumbp_profile_wind_row_item[0], rkey);
        if ((st = plumby_num(&rowm, "height", 1, 0.0, &L->p->wind_h_m[i], NULL)) != PLUMB_OK ||
            (st = plumby_num(&rowm, "speed", 1, 0.0, &speed, NULL)) != PLUMB_OK ||
            (st = plumby_num(&rowm, "from", 1, 0.0, &from, NULL)) != PLUMB_OK)
            return st;
        if (i > 0 && !(L->p->wind_h_m[i] > L->p->wind_h_m[i - 1]))
            return plumby_raise_value(&rowm, "height", PLUMB_EINVAL,
                                      "heights must increase row by row: %.6g m follows %.6g m",
                                      L->p->wind_h_m[i], L->p->wind_h_m[i - 1]);
        plumb_wind_components(speed, from, &L->p->wind_e_m_s[i], &L->p->wind_n_m_s[i]);
    }
    w->table_n = n;
    w->table_h_m = L->p->wind_h_m;
    w->table_east_m_s = L->p->wind_e_m_s;
    w->table_north_m_s = L->p->wind_n_m_s;
    return PLUMB_OK;
}

