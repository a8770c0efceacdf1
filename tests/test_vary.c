/*
 * test_vary.c - an input set on copies of a resolved profile (src/io/vary.c)
 * against the profile loader (plumb_profile_derive with "KEY=VALUE UNIT").
 *
 * The reference is the contract of sweep.h: a sweep row (and
 * a limit's evaluation) is bit for bit what `plumb fall --set KEY=VALUE`
 * gives. So for every key the fast path takes, on profiles that exercise
 * what the loader derives from the key (cd x area and its source text, a
 * surface air's station altitude, a turbulence map that --set creates) and
 * what it checks against other keys (the release height against the top
 * of the 1976 atmosphere and a deploy height, an offset that would take
 * the air below 0 K, a surface air's temperature at the release height, a
 * table's span, a log wind's roughness, the devices' order, the inflation
 * exponent's top), the copy is compared with the loader's profile: the
 * same refusals, every field of every spec and of the air bit for bit,
 * and the same fall report in JSON byte for byte (which holds the inputs,
 * the drag's source text and the figures). Keys the fast path must leave
 * to the loader are checked to be refused by plumbp_vary_init.
 * The values are high-entropy ones (2.713 kg, 31.6 m ...), several given
 * in other units (kn, ft, degC, %) so that the conversion is the loader's.
 */
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "plumb/plumb.h"
#include "plumb_test.h"
#include "io/vary.h"

static plumb_units *units;
static plumb_criteria *crit;
static plumb_trajectory *traj;

static int group_setup(void **state)
{
    plumbt_setup_gsl(state);
    plumb_diag d;
    plumb_diag_clear(&d);
    if (plumb_units_alloc(&units, &d) != PLUMB_OK)
        return -1;
    char cdir[512];
    snprintf(cdir, sizeof cdir, "%s/profiles/criteria", plumbt_srcdir());
    if (plumb_criteria_load_dir(cdir, units, &crit, &d) != PLUMB_OK)
        return -1;
    return plumb_trajectory_alloc(NULL, &traj) == PLUMB_OK ? 0 : -1;
}

static int group_teardown(void **state)
{
    (void)state;
    plumb_trajectory_free(traj);
    plumb_criteria_free(crit);
    plumb_units_free(units);
    return 0;
}

/* ---- profiles ------------------------------------------------------------- */

/* A spanner thrown from a stack: cd and area, 1976 air with an offset,
 * power wind, no turbulence or downwash given. */
static const char spanner[] =
    "name: vary spanner\n"
    "payload: {mass: 2.385 kg, volume: 0.00031 m^3, drag: {cd: 0.93, area: 0.0187 m^2}}\n"
    "release:\n"
    "  height: 31.6 m\n"
    "  velocity: {east: 4.1 m/s, north: -2.7 m/s, up: 0.6 m/s}\n"
    "site: {elevation: 417 m, latitude: 52.7 deg}\n"
    "atmosphere: {model: standard-1976, temperature_offset: 7.3 K, humidity: 41 %}\n"
    "wind: {profile: power, speed: 6.1 m/s, from: 247 deg, exponent: 0.17}\n"
    "criteria: [us-part107-cat3]\n";

/* A package under a drogue then a main: cd_area with its own source text,
 * surface air, log wind with a turbulence intensity. */
static const char canopy[] =
    "name: vary canopy\n"
    "payload: {mass: 4.37 kg, drag: {cd_area: 0.0213 m^2, source: measured in a tunnel}}\n"
    "descent:\n"
    "  - {kind: drogue, cd: 0.71, area: 0.093 m^2, deploy: {after: 1.3 s}, fill_time: 0.37 s}\n"
    "  - {kind: parachute, cd: 0.83, diameter: 1.71 m, deploy: {below: 61.5 m},\n"
    "     canopy: flat-circular}\n"
    "release: {height: 143.7 m}\n"
    "site: {elevation: 611 m}\n"
    "atmosphere: {model: surface, pressure: 937.1 hPa, temperature: 17.3 degC, humidity: 62 %}\n"
    "wind: {profile: log, speed: 5.3 m/s, from: 212 deg, reference_height: 10 m, roughness: "
    "0.11 m,\n"
    "       turbulence: {intensity: light}}\n"
    "criteria: [us-part107-cat3]\n";

/* Air from a table without temperatures (the 1976 temperature plus an
 * offset), a drone's rotor wake, turbulence by W20. */
static const char table_air[] =
    "name: vary table\n"
    "payload: {mass: 0.731 kg, drag: {cd: 1.07, area: 0.0113 m^2}}\n"
    "release:\n"
    "  height: 47.3 m\n"
    "  downwash: {aircraft_mass: 6.3 kg, disk_area: 0.83 m^2}\n"
    "site: {elevation: 213 m}\n"
    "atmosphere:\n"
    "  model: table\n"
    "  temperature_offset: -3.1 K\n"
    "  table:\n"
    "    - {altitude: 0 m, density: 1.231 kg/m^3}\n"
    "    - {altitude: 400 m, density: 1.187 kg/m^3}\n"
    "wind: {profile: uniform, speed: 3.7 m/s, from: 71 deg, turbulence: {w20: 4.3 m/s}}\n";

/* An inventory: the keys shared by every item vary on copies. */
static const char kit[] =
    "name: vary kit\n"
    "items:\n"
    "  - {name: glove, mass: 0.113 kg, drag: {cd_area: 0.0091 m^2}}\n"
    "  - {name: radio, mass: 0.417 kg, drag: {cd: 1.13, area: 0.0071 m^2}}\n"
    "release: {height: 23.9 m}\n"
    "atmosphere: {model: standard-1976, humidity: 0.35}\n"
    "wind: {profile: power, speed: 4.9 m/s, from: 301 deg}\n"
    "criteria: [us-part107-cat3]\n";

/* A plate whose glide comes from its shape (I* from the mass). */
static const char plate[] =
    "name: vary plate\n"
    "payload: {mass: 0.217 kg, shape: {kind: plate, edges: [0.21 m, 0.297 m], thickness: "
    "0.003 m}}\n"
    "release: {height: 18.3 m}\n";

static plumb_profile *load(const char *yaml)
{
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_profile_load_buffer("vary.yaml", yaml, strlen(yaml), units, NULL, 0,
                                                &p, &d);
    if (st != PLUMB_OK)
        fprintf(stderr, "%d:%d: %s: %s\n", d.line, d.col, d.key, d.message);
    assert_int_equal(st, PLUMB_OK);
    return p;
}

static plumb_status derive(const plumb_profile *base, const char *key, const char *value,
                           plumb_profile **out)
{
    char set[256];
    snprintf(set, sizeof set, "%s=%s", key, value);
    const char *sets[1] = {set};
    plumb_diag d;
    plumb_diag_clear(&d);
    return plumb_profile_derive(base, units, sets, 1, out, &d);
}

/* ---- comparing specs and reports -------------------------------------------- */

static void put(char **buf, size_t *len, size_t *cap, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    char one[1024];
    int n = vsnprintf(one, sizeof one, fmt, ap);
    va_end(ap);
    assert_true(n >= 0 && (size_t)n < sizeof one);
    if (*len + (size_t)n + 1 > *cap) {
        *cap = 2 * (*cap + (size_t)n + 1);
        *buf = realloc(*buf, *cap);
        assert_non_null(*buf);
    }
    memcpy(*buf + *len, one, (size_t)n + 1);
    *len += (size_t)n;
}

#define PUTD(name, x) put(&b, &len, &cap, "%s=%a\n", name, (double)(x))
#define PUTI(name, x) put(&b, &len, &cap, "%s=%ld\n", name, (long)(x))

/* Every field of a spec and an air spec, doubles exactly (%a), the tables'
 * rows included. Returned text is the caller's to free. */
static char *dump(const plumb_fall_spec *s, const plumb_atm_spec *a)
{
    char *b = NULL;
    size_t len = 0, cap = 0;
    put(&b, &len, &cap, "name=%s\n", s->name);
    PUTD("mass", s->mass_kg);
    PUTD("volume", s->volume_m3);
    PUTI("drag.model", s->drag.model);
    PUTD("drag.cd", s->drag.cd);
    PUTD("drag.area", s->drag.area_m2);
    PUTD("drag.cd_area", s->drag.cd_area_m2);
    PUTD("drag.diameter", s->drag.diameter_m);
    PUTI("drag.extrapolated", s->drag.extrapolated);
    put(&b, &len, &cap, "drag.source=%s\n", s->drag.source);
    PUTI("n_descent", s->n_descent);
    for (size_t i = 0; i < s->n_descent; i++) {
        const plumb_descent_spec *d = &s->descent[i];
        PUTI("kind", d->kind);
        PUTD("cd", d->cd);
        PUTD("area", d->area_m2);
        PUTD("diameter", d->diameter_m);
        PUTI("trigger", d->trigger);
        PUTD("deploy", d->deploy_value);
        PUTD("fill_time", d->fill_time_s);
        PUTD("fill_constant", d->fill_constant);
        PUTI("disreefs", d->disreefs_previous);
        PUTI("canopy", d->canopy);
        PUTD("j", d->inflation_exponent);
        PUTD("cx", d->opening_factor);
    }
    for (int i = 0; i < 3; i++) {
        PUTD("release", s->release_m[i]);
        PUTD("velocity", s->velocity_m_s[i]);
    }
    PUTD("elevation", s->site_elevation_m);
    PUTI("gravity.has_latitude", s->gravity.has_latitude);
    PUTD("gravity.latitude", s->gravity.latitude_deg);
    const plumb_wind_spec *w = &s->wind;
    PUTI("wind.profile", w->profile);
    PUTD("wind.speed", w->speed_m_s);
    PUTD("wind.from", w->from_deg);
    PUTD("wind.ref", w->ref_height_m);
    PUTD("wind.exponent", w->exponent);
    PUTD("wind.roughness", w->roughness_m);
    PUTI("wind.table_n", w->table_n);
    for (size_t i = 0; i < w->table_n; i++) {
        PUTD("wind.h", w->table_h_m[i]);
        PUTD("wind.e", w->table_east_m_s[i]);
        PUTD("wind.n", w->table_north_m_s[i]);
    }
    PUTI("glide.mode", s->glide.mode);
    PUTD("glide.istar", s->glide.istar);
    PUTI("glide.from_shape", s->glide.from_shape);
    PUTD("downwash.mass", s->downwash.aircraft_mass_kg);
    PUTD("downwash.area", s->downwash.disk_area_m2);
    const plumb_turbulence_spec *t = &s->turbulence;
    PUTI("turb.model", t->model);
    PUTD("turb.w20", t->w20_m_s);
    PUTI("turb.from_wind", t->from_wind);
    PUTI("turb.n_modes", t->n_modes);
    for (int i = 0; i < 3; i++)
        for (int k = 0; k < PLUMB_TURB_MODES; k++) {
            PUTD("turb.kappa", t->kappa[i][k]);
            PUTD("turb.omega", t->omega_s[i][k]);
            PUTD("turb.phase", t->phase[i][k]);
        }
    for (int k = 0; k < PLUMB_TURB_CHEB; k++)
        PUTD("turb.cheb", t->zeta_cheb[k]);
    PUTI("air.model", a->model);
    PUTD("air.offset", a->temperature_offset_k);
    PUTD("air.station_alt", a->station_alt_m);
    PUTD("air.pressure", a->station_pressure_pa);
    PUTD("air.temperature", a->station_temperature_k);
    PUTD("air.lapse", a->lapse_rate_k_m);
    PUTD("air.humidity", a->relative_humidity);
    PUTI("air.table_n", a->table_n);
    for (size_t i = 0; i < a->table_n; i++) {
        PUTD("air.alt", a->table_alt_m[i]);
        PUTD("air.rho", a->table_rho_kg_m3[i]);
        PUTD("air.t", a->table_t_k ? a->table_t_k[i] : -1.0);
    }
    return b;
}

/* The JSON fall report of a profile, every item run and judged; NULL
 * when its air cannot be made or a fall fails (with *st). */
static char *report_json(const plumb_profile *p, plumb_status *st)
{
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_atmosphere *atm = NULL;
    *st = plumb_atmosphere_alloc(plumb_profile_atmosphere(p), &atm, &d);
    if (*st != PLUMB_OK)
        return NULL;
    size_t n = plumb_profile_item_count(p);
    plumb_item_report *items = calloc(n, sizeof *items);
    assert_non_null(items);
    for (size_t i = 0; *st == PLUMB_OK && i < n; i++) {
        items[i].spec = plumb_profile_item(p, i);
        items[i].shape = plumb_profile_item_shape(p, i);
        *st = plumb_trajectory_run(traj, items[i].spec, atm, &items[i].result, &d);
        if (*st == PLUMB_OK)
            *st = plumb_item_judge(&items[i], p, crit, atm, &d);
    }
    char *buf = NULL;
    if (*st == PLUMB_OK) {
        size_t len = 0;
        FILE *f = open_memstream(&buf, &len);
        assert_non_null(f);
        plumb_fall_report rep = {p, n, items};
        plumb_report_options opt = {PLUMB_FORMAT_JSON, PLUMB_UNITS_SI, NULL};
        *st = plumb_report_fall(f, &opt, &rep, &d);
        assert_int_equal(fclose(f), 0);
    }
    free(items);
    plumb_atmosphere_free(atm);
    return buf;
}

/* Key varied on copies of the profile derived at values[0], for every
 * value: the same refusals as the loader, the same specs, air and report.
 * Returns the number of values the loader refused. */
static int check_key(const char *yaml, const char *key, const char *const *values, size_t n)
{
    plumb_profile *base = load(yaml), *tmpl = NULL;
    assert_int_equal(derive(base, key, values[0], &tmpl), PLUMB_OK);
    plumbp_vary v;
    if (!plumbp_vary_init(&v, tmpl, key))
        fail_msg("%s: not varied on copies", key);
    plumb_dim dim;
    plumb_diag d;
    assert_int_equal(plumb_profile_key_dim(key, &dim, &d), PLUMB_OK);
    size_t ni = plumb_profile_item_count(tmpl);
    plumb_fall_spec *work = calloc(ni, sizeof *work);
    assert_non_null(work);
    int refused = 0;
    for (size_t i = 0; i < n; i++) {
        double x;
        assert_int_equal(plumb_units_parse(units, values[i], dim, &x, &d), PLUMB_OK);
        plumb_profile *slow = NULL;
        plumb_status st = derive(base, key, values[i], &slow);
        memcpy(work, plumb_profile_item(tmpl, 0), ni * sizeof *work);
        plumb_atm_spec as = *plumb_profile_atmosphere(tmpl);
        int ok = plumbp_vary_set(&v, x, work, ni, &as);
        if (ok != (st == PLUMB_OK))
            fail_msg("%s=%s: the loader %s it, the copy %s it", key, values[i],
                     st == PLUMB_OK ? "takes" : "refuses", ok ? "takes" : "refuses");
        refused += st != PLUMB_OK;
        if (st != PLUMB_OK)
            continue;
        for (size_t k = 0; k < ni; k++) {
            char *a = dump(plumb_profile_item(slow, k), plumb_profile_atmosphere(slow));
            char *b = dump(&work[k], &as);
            if (strcmp(a, b) != 0)
                fail_msg("%s=%s, item %zu:\nloader:\n%s\ncopy:\n%s", key, values[i], k, a, b);
            free(a);
            free(b);
        }
        plumb_profile *var = NULL;
        assert_int_equal(plumbp_profile_variant(tmpl, work, &as, &var, &d), PLUMB_OK);
        plumb_status sa, sb;
        char *ja = report_json(slow, &sa), *jb = report_json(var, &sb);
        assert_int_equal(sa, sb);
        if (ja || jb) {
            assert_non_null(ja);
            assert_non_null(jb);
            if (strcmp(ja, jb) != 0)
                fail_msg("%s=%s: the JSON reports differ", key, values[i]);
        }
        free(ja);
        free(jb);
        plumb_profile_free(var);
        plumb_profile_free(slow);
    }
    free(work);
    plumb_profile_free(tmpl);
    plumb_profile_free(base);
    return refused;
}

#define CHECK_KEY(yaml, key, ...)                                                          \
    check_key((yaml), (key), (const char *const[]){__VA_ARGS__},                           \
              sizeof((const char *const[]){__VA_ARGS__}) / sizeof(const char *))

/* ---- tests ------------------------------------------------------------------ */

static void test_payload_keys_on_copies_are_the_loaders(void **state)
{
    (void)state;
    assert_int_equal(CHECK_KEY(spanner, "payload.mass", "2.713 kg", "6.1 lb", "0.0417 kg",
                               "0 kg", "-1 kg"), 2);
    assert_int_equal(CHECK_KEY(spanner, "payload.volume", "0.00047 m^3", "0 m^3", "1.3 L"), 0);
    /* cd x area and the source text that names them follow */
    assert_int_equal(CHECK_KEY(spanner, "payload.drag.cd", "1.17", "0", "0.4137", "10.5"), 1);
    assert_int_equal(CHECK_KEY(spanner, "payload.drag.area", "0.0231 m^2", "37 cm^2",
                               "0 m^2"), 1);
    /* a source text given in the profile is kept */
    assert_int_equal(CHECK_KEY(canopy, "payload.drag.cd_area", "0.0173 m^2", "0 m^2",
                               "-0.01 m^2"), 1);
}

static void test_release_and_site_keys_on_copies_are_the_loaders(void **state)
{
    (void)state;
    /* the release point above the top of the 1976 atmosphere is refused */
    assert_int_equal(CHECK_KEY(spanner, "release.height", "47.3 m", "117 ft", "85.5 km",
                               "85.7 km", "0 m"), 2);
    assert_int_equal(CHECK_KEY(kit, "release.height", "31.7 m", "0.3 m", "86 km", "86.1 km"), 1);
    assert_int_equal(CHECK_KEY(spanner, "release.velocity.east", "-7.9 m/s", "13 kn"), 0);
    assert_int_equal(CHECK_KEY(spanner, "release.velocity.up", "3.3 m/s", "-2.1 m/s"), 0);
    assert_int_equal(CHECK_KEY(spanner, "release.position.north", "-13.7 m", "41 ft"), 0);
    assert_int_equal(CHECK_KEY(table_air, "release.downwash.aircraft_mass", "11.3 kg",
                               "0 kg"), 1);
    assert_int_equal(CHECK_KEY(table_air, "release.downwash.disk_area", "1.27 m^2"), 0);
    /* the 1976 air with its offset is checked over the new span */
    assert_int_equal(CHECK_KEY(spanner, "site.elevation", "1871 m", "-311 m", "-5001 m",
                               "85.99 km"), 2);
    /* a surface air's station follows the site */
    assert_int_equal(CHECK_KEY(canopy, "site.elevation", "1317 m", "17 ft"), 0);
    /* a table must span the fall */
    assert_int_equal(CHECK_KEY(table_air, "site.elevation", "97 m", "371 m", "-3 m"), 2);
}

static void test_air_keys_on_copies_are_the_loaders(void **state)
{
    (void)state;
    /* an offset that takes the 1976 air below 0 K over the fall is refused */
    assert_int_equal(CHECK_KEY(spanner, "atmosphere.temperature_offset", "-13.7 K", "31 K",
                               "-300 K"), 1);
    assert_int_equal(CHECK_KEY(table_air, "atmosphere.temperature_offset", "11.3 K",
                               "-290 K"), 1);
    assert_int_equal(CHECK_KEY(spanner, "atmosphere.humidity", "73 %", "0.17", "1.3"), 1);
    assert_int_equal(CHECK_KEY(canopy, "atmosphere.pressure", "1013.7 hPa", "29.1 inHg",
                               "0 Pa"), 1);
    /* the surface model's temperature at the release height stays above 0 K */
    assert_int_equal(CHECK_KEY(canopy, "atmosphere.temperature", "-11.3 degC", "301 K",
                               "0.5 K"), 1);
    assert_int_equal(CHECK_KEY(canopy, "atmosphere.lapse_rate", "0.0098 K/m", "-0.003 K/m",
                               "3 K/m"), 1);
    assert_int_equal(CHECK_KEY(kit, "atmosphere.humidity", "0.91", "13 %"), 0);
}

static void test_wind_keys_on_copies_are_the_loaders(void **state)
{
    (void)state;
    assert_int_equal(CHECK_KEY(spanner, "wind.speed", "9.7 m/s", "13.1 kn", "0 m/s",
                               "-1 m/s"), 1);
    assert_int_equal(CHECK_KEY(spanner, "wind.from", "13.7 deg", "-91 deg", "400 deg"), 0);
    assert_int_equal(CHECK_KEY(spanner, "wind.exponent", "0.31", "1.2"), 1);
    /* created by --set where the profile gives no turbulence */
    assert_int_equal(CHECK_KEY(spanner, "wind.turbulence.w20", "7.3 m/s", "0 m/s"), 0);
    assert_int_equal(CHECK_KEY(table_air, "wind.turbulence.w20", "2.9 m/s"), 0);
    /* a log wind's roughness stays below its reference height */
    assert_int_equal(CHECK_KEY(canopy, "wind.roughness", "0.37 m", "10 m", "13 m"), 2);
    assert_int_equal(CHECK_KEY(canopy, "wind.reference_height", "7.3 m", "0.11 m",
                               "61 ft"), 1);
    assert_int_equal(CHECK_KEY(kit, "wind.speed", "2.3 m/s", "17 kn"), 0);
}

static void test_descent_keys_on_copies_are_the_loaders(void **state)
{
    (void)state;
    assert_int_equal(CHECK_KEY(canopy, "descent[1].cd", "0.97", "0", "10.1"), 2);
    assert_int_equal(CHECK_KEY(canopy, "descent[0].cd", "0.57", "1.3"), 0);
    assert_int_equal(CHECK_KEY(canopy, "descent[0].area", "0.131 m^2", "0 m^2"), 1);
    assert_int_equal(CHECK_KEY(canopy, "descent[0].fill_time", "0.53 s", "0 s"), 0);
    /* the devices keep their order; a main deploys below the release height */
    assert_int_equal(CHECK_KEY(canopy, "descent[0].deploy.after", "2.1 s", "0 s"), 0);
    assert_int_equal(CHECK_KEY(canopy, "descent[1].deploy.below", "41.3 m", "143.7 m",
                               "500 ft", "151 m"), 3);
    /* the table's values for a flat circular canopy replaced by given ones;
     * the exponent's top is PLUMB_INFLATION_J_MAX */
    assert_int_equal(CHECK_KEY(canopy, "descent[1].fill_constant", "7.3", "11.7"), 0);
    assert_int_equal(CHECK_KEY(canopy, "descent[1].inflation_exponent", "2.7", "19.9", "21"),
                     1);
    assert_int_equal(CHECK_KEY(canopy, "descent[1].opening_factor", "1.37", "1.9"), 0);
}

/* Keys the loader alone can vary (io/vary.h). */
static void test_keys_only_the_loader_varies_are_left_to_it(void **state)
{
    (void)state;
    static const struct {
        const char *yaml, *key, *value;
    } cases[] = {
        {spanner, "release.velocity.speed", "3 m/s"},     /* derived: east, north */
        {spanner, "site.latitude", "13.1 deg"},          /* places latitude/longitude points */
        {spanner, "zone.scatter", "3 m"},                /* not an input of a fall */
        {canopy, "descent[1].diameter", "1.93 m"},       /* derived: the area */
        {table_air, "atmosphere.table[1].density", "1.2 kg/m^3"}, /* a table's row */
        {plate, "payload.mass", "0.3 kg"},               /* the glide's I* */
        {plate, "payload.shape.thickness", "0.004 m"},   /* the drag is looked up again */
        {kit, "items[2].mass", "0.5 kg"},                /* one item of an inventory */
        {canopy, "wind.exponent", "0.2"},                /* not an input of a log wind */
    };
    for (size_t i = 0; i < sizeof cases / sizeof *cases; i++) {
        plumb_profile *base = load(cases[i].yaml), *tmpl = NULL;
        plumb_status st = derive(base, cases[i].key, cases[i].value, &tmpl);
        const plumb_profile *p = st == PLUMB_OK ? tmpl : base;
        plumbp_vary v;
        if (plumbp_vary_init(&v, p, cases[i].key))
            fail_msg("%s is varied on copies", cases[i].key);
        plumb_profile_free(tmpl);
        plumb_profile_free(base);
    }
}

/* A profile built in code has no text: its keys vary on its own specs,
 * checked as the loader checks them, and a refusal says why. */
static void test_a_code_built_profile_varies_on_its_specs(void **state)
{
    (void)state;
    plumb_fall_spec s;
    memset(&s, 0, sizeof s);
    s.mass_kg = 1.37;
    s.drag.cd = 0.83;
    s.drag.area_m2 = 0.0213;
    s.drag.cd_area_m2 = 0.83 * 0.0213;
    snprintf(s.drag.source, sizeof s.drag.source, "from a catalogue");
    s.release_m[2] = 27.1;
    plumb_wind_spec_init(&s.wind);
    plumb_atm_spec atm;
    plumb_atm_spec_init(&atm);
    plumb_profile *p = NULL;
    plumb_diag d;
    assert_int_equal(plumb_profile_from_spec(&s, &atm, NULL, 0, &p, &d), PLUMB_OK);
    plumbp_vary v;
    assert_true(plumbp_vary_init(&v, p, "release.height"));
    {
        plumb_fall_spec w = *plumb_profile_item(p, 0);
        plumb_atm_spec as = *plumb_profile_atmosphere(p);
        assert_true(plumbp_vary_set(&v, 61.0, &w, 1, &as));
        assert_true(w.release_m[2] == 61.0);
        /* the top of the 1976 atmosphere is 86 km (NOAA-S/T 76-1562) */
        assert_false(plumbp_vary_set(&v, 90e3, &w, 1, &as));
        plumb_diag_clear(&d);
        assert_int_equal(plumbp_vary_refusal(&v, 90e3, &w, 1, &as, &d), PLUMB_ERANGE);
        assert_string_equal(d.key, "release.height");
        assert_non_null(strstr(d.message, "above the top of the 1976 atmosphere"));
    }
    assert_false(plumbp_vary_init(&v, p, "release.velocity.speed")); /* derived by the loader */
    assert_true(plumbp_vary_init(&v, p, "payload.drag.cd"));
    plumb_fall_spec w = *plumb_profile_item(p, 0);
    plumb_atm_spec as = *plumb_profile_atmosphere(p);
    assert_true(plumbp_vary_set(&v, 1.19, &w, 1, &as));
    /* CdA = Cd x A (its definition), the catalogue's text kept */
    assert_true(w.drag.cd == 1.19 && w.drag.cd_area_m2 == 1.19 * 0.0213);
    assert_string_equal(w.drag.source, "from a catalogue");
    assert_false(plumbp_vary_set(&v, -0.2, &w, 1, &as)); /* Cd >= 0 (README, profile keys) */
    plumb_diag_clear(&d);
    assert_int_equal(plumbp_vary_refusal(&v, -0.2, &w, 1, &as, &d), PLUMB_ERANGE);
    assert_string_equal(d.key, "payload.drag.cd");
    assert_non_null(strstr(d.message, "must be"));
    plumb_profile_free(p);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_payload_keys_on_copies_are_the_loaders),
        cmocka_unit_test(test_release_and_site_keys_on_copies_are_the_loaders),
        cmocka_unit_test(test_air_keys_on_copies_are_the_loaders),
        cmocka_unit_test(test_wind_keys_on_copies_are_the_loaders),
        cmocka_unit_test(test_descent_keys_on_copies_are_the_loaders),
        cmocka_unit_test(test_keys_only_the_loader_varies_are_left_to_it),
        cmocka_unit_test(test_a_code_built_profile_varies_on_its_specs),
    };
    return cmocka_run_group_tests(tests, group_setup, group_teardown);
}
