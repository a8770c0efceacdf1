/*
 * test_profile.c - the strict profile loader (src/profile.c, src/yamltree.c).
 *
 * Every error path of the loader is provoked in-process on profiles written
 * to a mkdtemp directory. Each bad text carries the marker "@@" exactly
 * where the diagnostic must point (line and column, 1-based, counted in
 * characters); the marker is removed before the file is written, so the
 * expected position is stated by the text itself. The keys are those of
 * README "Profile keys" (src/io/keys.c describes the numeric ones once,
 * tests/test_keys.c holds it to the loader); positive loads use a full
 * example (a payload under a parachute, with every map of a one-payload
 * profile but job:). Reference values: the navigation convention
 * east = s sin(h), north = s cos(h) (heading clockwise from north); the
 * meteorological wind convention w = -s (sin from, cos from)
 * (WMO No. 8, from memory); the canopy area S0 = pi D0^2 / 4 (Knacke,
 * NWC TP 6575, 1991); the foot, 0.3048 m exactly (1959 international yard
 * and pound agreement); degC to K, + 273.15 exactly (SI Brochure, 9th ed.).
 * The files in tests/bad/ are loaded too, each against the expectation in
 * its first line: "# expect: SUBSTRING @ LINE:COL key=KEY".
 */
#include <dirent.h>
#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <setjmp.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <cmocka.h>

#include "plumb/constants.h"
#include "plumb/profile.h"
#include "plumb_test.h"
#include "io/sha256.h"

enum { MAX_FILES = 512, PATH_LEN = 512, TEXT_LEN = 8192 };

static plumb_units *units;
static char tmpdir[PATH_LEN / 2]; /* $TMPDIR/plumb-test-profile-XXXXXX */
static char *files[MAX_FILES];
static size_t n_files;

static int group_setup(void **state)
{
    plumb_diag d;
    plumbt_setup_gsl(state);
    if (plumb_units_alloc(&units, &d) != PLUMB_OK) {
        fprintf(stderr, "units: %s\n", d.message);
        return -1;
    }
    return plumbt_mkdtemp("test-profile", tmpdir, sizeof tmpdir) ? 0 : -1;
}

static int group_teardown(void **state)
{
    (void)state;
    for (size_t i = 0; i < n_files; i++) {
        unlink(files[i]);
        free(files[i]);
    }
    rmdir(tmpdir);
    plumb_units_free(units);
    return 0;
}

/* Writes len bytes to a new file named after `stem` in the temp dir. */
static const char *write_bytes(const char *stem, const char *bytes, size_t len)
{
    char path[PATH_LEN];
    snprintf(path, sizeof path, "%s/%s-%zu.yaml", tmpdir, stem, n_files);
    FILE *f = fopen(path, "wb");
    assert_non_null(f);
    assert_int_equal(fwrite(bytes, 1, len, f), len);
    assert_int_equal(fclose(f), 0);
    assert_true(n_files < MAX_FILES);
    files[n_files] = strdup(path);
    assert_non_null(files[n_files]);
    return files[n_files++];
}

static const char *write_text(const char *stem, const char *text)
{
    return write_bytes(stem, text, strlen(text));
}

typedef struct mark {
    int found;
    int line, col;
} mark;

/* Copies src to dst without the first "@@" and records where it stood. */
static void strip_mark(const char *src, char *dst, size_t size, mark *m)
{
    int line = 1, col = 1;
    size_t o = 0;
    m->found = 0;
    for (const char *s = src; *s; s++) {
        if (!m->found && s[0] == '@' && s[1] == '@') {
            m->found = 1;
            m->line = line;
            m->col = col;
            s++;
            continue;
        }
        assert_true(o + 1 < size);
        dst[o++] = *s;
        if (*s == '\n') {
            line++;
            col = 1;
        } else if (((unsigned char)*s & 0xC0u) != 0x80u) {
            col++;
        }
    }
    dst[o] = '\0';
}

/* Line (1-based) of the first occurrence of needle in text. */
static int line_of(const char *text, const char *needle)
{
    const char *at = strstr(text, needle);
    assert_non_null(at);
    int line = 1;
    for (const char *s = text; s < at; s++)
        line += *s == '\n';
    return line;
}

static plumb_profile *load_ok(const char *text, const char *const *sets, size_t n_sets)
{
    plumb_profile *p = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    const char *path = write_text("good", text);
    plumb_status st = plumb_profile_load(path, units, sets, n_sets, &p, &d);
    if (st != PLUMB_OK) {
        char buf[1024];
        plumb_diag_format(&d, buf, sizeof buf);
        print_error("unexpected error: %s\n", buf);
    }
    assert_int_equal(st, PLUMB_OK);
    assert_non_null(p);
    return p;
}

/* ---- bad profiles, table driven ------------------------------------------ */

typedef struct bad_case {
    const char *name;   /* the test, as a sentence */
    const char *text;   /* the profile; "@@" marks where the error must point */
    const char *set;    /* an override ("@@" may be here instead), or NULL */
    int status;         /* expected plumb_status, or -1: any input error */
    const char *key;    /* expected dotted key */
    const char *msg;    /* expected part of the message, or NULL */
} bad_case;

#define PAYLOAD "payload:\n  mass: 2.385 kg\n  drag: {cd: 0.93, area: 0.0217 m^2}\n"
#define RELEASE "release:\n  height: 27.4 m\n"
#define GOOD PAYLOAD RELEASE
#define ITEM(n, m) "  - name: " n "\n    mass: " m "\n    drag: {cd_area: 0.0113 m^2}\n"

static const bad_case bad_cases[] = {
    /* structure and keys */
    {"test_unknown_top_level_key_suggests_the_closest_key", GOOD "@@wnd:\n  speed: 3 m/s\n", NULL,
     PLUMB_EKEY, "wnd", "did you mean 'wind'"},
    {"test_unknown_nested_key_suggests_the_closest_key",
     "payload:\n  @@mas: 2.385 kg\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL, PLUMB_EKEY,
     "payload.mas", "did you mean 'mass'"},
    {"test_unknown_key_far_from_any_lists_the_keys_of_its_map",
     GOOD "site:\n  @@quux: 4 m\n", NULL, PLUMB_EKEY, "site.quux", "elevation, latitude"},
    {"test_duplicate_key_is_refused_at_its_second_occurrence",
     "payload:\n  mass: 2.385 kg\n  @@mass: 2.4 kg\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL,
     PLUMB_EKEY, "payload.mass", "duplicate key 'mass' (first given at line 2, column 3)"},
    {"test_scalar_where_a_map_belongs_is_refused", "payload: @@2.385 kg\n" RELEASE, NULL,
     PLUMB_EINVAL, "payload", "expected a map"},
    {"test_map_where_a_scalar_belongs_is_refused",
     "payload:\n  mass: @@{value: 2.385 kg}\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL,
     PLUMB_EINVAL, "payload.mass", "found a map"},
    {"test_list_where_a_scalar_belongs_is_refused", GOOD "site:\n  elevation: @@[1 m, 2 m]\n",
     NULL, PLUMB_EINVAL, "site.elevation", "found a list"},
    {"test_empty_value_is_refused", GOOD "site:\n  elevation:@@\n", NULL, PLUMB_EINVAL,
     "site.elevation", "found an empty value"},
    {"test_top_level_list_is_refused", "@@- 1\n- 2\n", NULL, PLUMB_EINVAL, "", "expected a map"},
    {"test_missing_mass_is_reported_at_the_payload_map",
     "payload:\n  @@drag: {cd: 0.93, area: 0.0217 m^2}\n" RELEASE, NULL, PLUMB_EKEY,
     "payload.mass", "required key 'mass'"},
    {"test_missing_release_is_reported_at_the_top_level", "@@" PAYLOAD, NULL, PLUMB_EKEY,
     "release.height", "required key 'height'"},
    {"test_missing_payload_and_items_is_reported_at_the_top_level", "@@" RELEASE, NULL,
     PLUMB_EKEY, "payload", "items:"},
    {"test_payload_and_items_together_are_refused", GOOD "@@items: []\n", NULL, PLUMB_EKEY,
     "items", "together with payload"},
    /* numbers and units */
    {"test_bare_number_for_a_mass_names_key_and_position",
     "payload:\n  mass: @@2.385\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL, PLUMB_EUNIT,
     "payload.mass", NULL},
    {"test_length_where_a_mass_belongs_is_refused",
     "payload:\n  mass: @@2.385 m\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL, PLUMB_EUNIT,
     "payload.mass", NULL},
    {"test_yaml_nan_is_refused", "payload:\n  mass: @@.nan\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE,
     NULL, -1, "payload.mass", NULL},
    {"test_yaml_infinity_is_refused",
     "payload:\n  mass: @@.inf kg\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL, -1,
     "payload.mass", NULL},
    {"test_nan_with_a_unit_is_refused",
     "payload:\n  mass: @@nan kg\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL, -1,
     "payload.mass", NULL},
    {"test_overflowing_number_is_refused",
     "payload:\n  mass: @@1e999 kg\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL, PLUMB_ERANGE,
     "payload.mass", NULL},
    {"test_zero_mass_is_refused", "payload:\n  mass: @@0 kg\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE,
     NULL, PLUMB_ERANGE, "payload.mass", "must be > 0 kg"},
    {"test_negative_area_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: {cd: 0.93, area: @@-0.0217 m^2}\n" RELEASE, NULL,
     PLUMB_ERANGE, "payload.drag.area", "> 0 m^2"},
    {"test_zero_release_height_is_refused", PAYLOAD "release:\n  height: @@0 m\n", NULL,
     PLUMB_ERANGE, "release.height", "> 0 m"},
    {"test_negative_cd_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: {cd: @@-0.1, area: 0.0217 m^2}\n" RELEASE, NULL,
     PLUMB_ERANGE, "payload.drag.cd", "0 .. 10"},
    {"test_cd_above_ten_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: {cd: @@10.5, area: 0.0217 m^2}\n" RELEASE, NULL,
     PLUMB_ERANGE, "payload.drag.cd", "0 .. 10"},
    {"test_negative_volume_is_refused",
     "payload:\n  mass: 2.385 kg\n  volume: @@-1 L\n  drag: {cd_area: 0.0113 m^2}\n" RELEASE, NULL,
     PLUMB_ERANGE, "payload.volume", ">= 0"},
    {"test_release_above_86_km_with_the_elevation_is_refused",
     PAYLOAD "release:\n  height: @@1.5 km\nsite:\n  elevation: 85 km\n", NULL, PLUMB_ERANGE,
     "release.height", "86000"},
    {"test_latitude_beyond_the_pole_is_refused", GOOD "site:\n  latitude: @@95 deg\n", NULL,
     PLUMB_ERANGE, "site.latitude", "-90 deg .. 90 deg"},
    {"test_elevation_below_the_1976_tables_is_refused", GOOD "site:\n  elevation: @@-6 km\n", NULL,
     PLUMB_ERANGE, "site.elevation", "-5000 m"},
    /* drag and shape */
    {"test_drag_and_shape_together_are_refused",
     PAYLOAD "  @@shape: {kind: sphere, diameter: 0.1 m}\n" RELEASE, NULL, PLUMB_EKEY, "payload.shape",
     "not both"},
    {"test_payload_without_drag_or_shape_is_refused", "payload:\n  @@mass: 2.385 kg\n" RELEASE,
     NULL, PLUMB_EKEY, "payload.drag", "shape"},
    {"test_cd_with_cd_area_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: {@@cd: 0.9, cd_area: 0.02 m^2}\n" RELEASE, NULL,
     PLUMB_EKEY, "payload.drag.cd", "cd_area"},
    {"test_cd_without_area_is_reported_at_the_drag_map",
     "payload:\n  mass: 2.385 kg\n  drag: @@{cd: 0.9}\n" RELEASE, NULL, PLUMB_EKEY,
     "payload.drag.area", "required key 'area'"},
    {"test_fixed_drag_with_a_diameter_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: {cd: 0.9, area: 0.02 m^2, @@diameter: 0.1 m}\n" RELEASE,
     NULL, PLUMB_EKEY, "payload.drag.diameter", "sphere"},
    {"test_sphere_model_with_a_cd_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: {model: sphere, diameter: 0.05 m, @@cd: 0.5}\n" RELEASE,
     NULL, PLUMB_EKEY, "payload.drag.cd", "Reynolds"},
    {"test_sphere_model_without_diameter_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: @@{model: sphere-cgw}\n" RELEASE, NULL, PLUMB_EKEY,
     "payload.drag.diameter", NULL},
    {"test_unknown_drag_model_suggests_the_closest",
     "payload:\n  mass: 2.385 kg\n  drag: {model: @@sphre, diameter: 0.05 m}\n" RELEASE, NULL,
     PLUMB_EINVAL, "payload.drag.model", "did you mean 'sphere'"},
    {"test_unknown_shape_kind_suggests_the_closest",
     "payload:\n  mass: 2.385 kg\n  shape: {kind: @@cilinder, length: 1 m, diameter: 0.1 m}\n" RELEASE,
     NULL, PLUMB_EINVAL, "payload.shape.kind", "did you mean 'cylinder'"},
    {"test_box_with_two_edges_is_refused",
     "payload:\n  mass: 2.385 kg\n  shape: {kind: box, edges: @@[0.2 m, 0.1 m]}\n" RELEASE, NULL,
     PLUMB_EINVAL, "payload.shape.edges", "expected 3 edges"},
    {"test_zero_box_edge_is_refused",
     "payload:\n  mass: 2.385 kg\n  shape: {kind: box, edges: [0.2 m, @@0 m, 0.1 m]}\n" RELEASE,
     NULL, PLUMB_ERANGE, "payload.shape.edges[1]", "> 0 m"},
    {"test_plate_without_thickness_is_refused",
     "payload:\n  mass: 2.385 kg\n  shape: @@{kind: plate, edges: [0.2 m, 0.1 m]}\n" RELEASE, NULL,
     PLUMB_EKEY, "payload.shape.thickness", NULL},
    {"test_cylinder_with_edges_is_refused",
     "payload:\n  mass: 2.385 kg\n  shape: {kind: cylinder, length: 1 m, diameter: 0.1 m, "
     "@@edges: [1 m]}\n" RELEASE,
     NULL, PLUMB_EKEY, "payload.shape.edges", "for a cylinder"},
    {"test_sphere_shape_with_an_attitude_is_refused",
     "payload:\n  mass: 2.385 kg\n  shape: {kind: sphere, diameter: 0.1 m, @@attitude: broadside}\n" RELEASE,
     NULL, PLUMB_EKEY, "payload.shape.attitude", NULL},
    {"test_shape_without_kind_is_refused",
     "payload:\n  mass: 2.385 kg\n  shape: @@{diameter: 0.1 m}\n" RELEASE, NULL, PLUMB_EKEY,
     "payload.shape.kind", NULL},
    /* descent devices */
    {"test_deploy_below_the_release_height_is_required",
     GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: {below: @@30 m}}\n", NULL, PLUMB_ERANGE,
     "descent.deploy.below", "below the release height"},
    {"test_three_descent_devices_are_refused",
     GOOD "descent:\n  - {cd: 0.8, area: 0.3 m^2, deploy: {after: 0 s}}\n"
          "  - {cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}}\n"
          "  - @@{cd: 0.8, area: 2.2 m^2, deploy: {after: 2 s}}\n",
     NULL, PLUMB_ERANGE, "descent[2]", "at most 2"},
    {"test_negative_area_of_the_second_device_names_descent_1_area",
     GOOD "descent:\n  - {kind: drogue, cd: 0.6, area: 0.3 m^2, deploy: {after: 0.5 s}}\n"
          "  - {cd: 0.8, area: @@-1.2 m^2, deploy: {below: 12 m}}\n",
     NULL, PLUMB_ERANGE, "descent[1].area", "> 0 m^2"},
    {"test_empty_descent_list_is_refused", GOOD "descent: @@[]\n", NULL, PLUMB_EINVAL, "descent",
     "empty list"},
    {"test_descent_without_deploy_is_refused", GOOD "descent: @@{cd: 0.8, area: 1.2 m^2}\n", NULL,
     PLUMB_EKEY, "descent.deploy", "after"},
    {"test_descent_without_cd_is_refused", GOOD "descent: @@{area: 1.2 m^2, deploy: {after: 1 s}}\n",
     NULL, PLUMB_EKEY, "descent.cd", NULL},
    {"test_descent_zero_cd_is_refused",
     GOOD "descent: {cd: @@0, area: 1.2 m^2, deploy: {after: 1 s}}\n", NULL, PLUMB_ERANGE,
     "descent.cd", "> 0"},
    {"test_descent_with_area_and_diameter_is_refused",
     GOOD "descent: {cd: 0.8, area: 1.2 m^2, @@diameter: 1.2 m, deploy: {after: 1 s}}\n", NULL,
     PLUMB_EKEY, "descent.diameter", "area or diameter"},
    {"test_descent_without_area_or_diameter_is_refused",
     GOOD "descent: @@{cd: 0.8, deploy: {after: 1 s}}\n", NULL, PLUMB_EKEY, "descent.area",
     "diameter"},
    {"test_deploy_after_and_below_together_are_refused",
     GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s, @@below: 10 m}}\n", NULL,
     PLUMB_EKEY, "descent.deploy.below", NULL},
    {"test_empty_deploy_map_is_refused", GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: @@{}}\n",
     NULL, PLUMB_EKEY, "descent.deploy.after", NULL},
    {"test_fill_constant_without_diameter_is_refused",
     GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}, fill_constant: @@8}\n", NULL,
     PLUMB_EINVAL, "descent.fill_constant", "diameter"},
    {"test_ringsail_without_an_inflation_exponent_is_refused",
     GOOD "descent: @@{cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}, canopy: ringsail}\n", NULL,
     PLUMB_EKEY, "descent.inflation_exponent", "no inflation exponent"},
    {"test_cross_canopy_without_a_fill_is_refused",
     GOOD "descent: @@{cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}, canopy: cross}\n", NULL,
     PLUMB_EKEY, "descent.fill_time", "no fill constant"},
    {"test_inflation_exponent_above_20_is_refused",
     GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}, inflation_exponent: @@25}\n",
     NULL, PLUMB_ERANGE, "descent.inflation_exponent", "between 0 and 20"},
    {"test_zero_opening_factor_is_refused",
     GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}, opening_factor: @@0}\n", NULL,
     PLUMB_ERANGE, "descent.opening_factor", "> 0"},
    {"test_unknown_canopy_type_is_refused",
     GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}, canopy: @@flat-round}\n", NULL,
     PLUMB_EINVAL, "descent.canopy", "flat-circular"},
    {"test_unknown_glide_word_is_refused",
     "payload:\n  mass: 2.385 kg\n  drag: {cd_area: 0.0113 m^2}\n  glide: @@sideways\n" RELEASE,
     NULL, PLUMB_EINVAL, "payload.glide", NULL},
    {"test_downwash_without_disk_area_is_refused",
     PAYLOAD "release:\n  height: 27.4 m\n  downwash: @@{aircraft_mass: 2 kg}\n", NULL,
     PLUMB_EKEY, "release.downwash.disk_area", NULL},
    {"test_negative_downwash_mass_is_refused",
     PAYLOAD "release:\n  height: 27.4 m\n  downwash: {aircraft_mass: @@-2 kg, disk_area: 0.2 m^2}\n",
     NULL, PLUMB_ERANGE, "release.downwash.aircraft_mass", "> 0"},
    {"test_turbulence_intensity_with_w20_is_refused",
     GOOD "wind:\n  turbulence: {intensity: light, @@w20: 15 kn}\n", NULL, PLUMB_EKEY,
     "wind.turbulence.w20", "intensity or w20"},
    {"test_unknown_turbulence_model_is_refused",
     GOOD "wind:\n  turbulence: {model: @@karman}\n", NULL, PLUMB_EINVAL,
     "wind.turbulence.model", "von-karman"},
    {"test_negative_turbulence_w20_is_refused",
     GOOD "wind:\n  turbulence: {w20: @@-3 m/s}\n", NULL, PLUMB_ERANGE,
     "wind.turbulence.w20", "must be 0 m/s .. 340.294 m/s"},
    {"test_fill_time_with_fill_constant_is_refused",
     GOOD "descent: {cd: 0.8, diameter: 1.2 m, deploy: {after: 1 s}, fill_time: 1 s, "
          "@@fill_constant: 8}\n",
     NULL, PLUMB_EKEY, "descent.fill_constant", NULL},
    {"test_devices_out_of_deployment_order_are_refused",
     GOOD "descent:\n  - {kind: drogue, cd: 0.6, area: 0.3 m^2, deploy: {after: 3 s}}\n"
          "  - {cd: 0.8, area: 1.2 m^2, deploy: {after: @@1 s}}\n",
     NULL, PLUMB_ERANGE, "descent[1].deploy.after", "deployment order"},
    {"test_unknown_descent_kind_is_refused",
     GOOD "descent: {kind: @@parashute, cd: 0.8, area: 1.2 m^2, deploy: {after: 1 s}}\n", NULL,
     PLUMB_EINVAL, "descent.kind", "did you mean 'parachute'"},
    /* release velocity */
    {"test_velocity_mixing_components_and_speed_is_refused",
     PAYLOAD "release:\n  height: 27.4 m\n  velocity: {east: 1 m/s, @@speed: 2 m/s}\n", NULL,
     PLUMB_EKEY, "release.velocity.speed", "east/north/up"},
    {"test_speed_without_heading_is_refused",
     PAYLOAD "release:\n  height: 27.4 m\n  velocity: @@{speed: 2 m/s}\n", NULL, PLUMB_EKEY,
     "release.velocity.heading", NULL},
    {"test_heading_without_speed_is_refused",
     PAYLOAD "release:\n  height: 27.4 m\n  velocity: @@{heading: 20 deg}\n", NULL, PLUMB_EKEY,
     "release.velocity.speed", NULL},
    {"test_negative_speed_is_refused",
     PAYLOAD "release:\n  height: 27.4 m\n  velocity: {speed: @@-2 m/s, heading: 20 deg}\n", NULL,
     PLUMB_ERANGE, "release.velocity.speed", "must be 0 m/s .. 340.294 m/s"},
    /* atmosphere */
    {"test_temperature_offset_below_absolute_zero_at_the_site_is_refused",
     GOOD "atmosphere: {temperature_offset: @@-300 K}\n", NULL, PLUMB_ERANGE,
     "atmosphere.temperature_offset", "must be -100 K .. 100 K"},
    {"test_temperature_offset_below_absolute_zero_at_the_release_height_only_is_refused",
     PAYLOAD "release:\n  height: 12 km\natmosphere: {temperature_offset: @@-250 K}\n", NULL,
     PLUMB_ERANGE, "atmosphere.temperature_offset", "must be -100 K .. 100 K"},
    {"test_surface_lapse_that_freezes_the_air_below_zero_kelvin_is_refused",
     PAYLOAD "release:\n  height: 10 km\natmosphere: {model: surface, pressure: 101 kPa, "
             "temperature: 250 K, lapse_rate: @@30 K/km}\n",
     NULL, PLUMB_ERANGE, "atmosphere.lapse_rate", "above 0 K"},
    {"test_pressure_with_the_1976_model_is_refused", GOOD "atmosphere: {@@pressure: 101 kPa}\n",
     NULL, PLUMB_EKEY, "atmosphere.pressure", "standard-1976"},
    {"test_surface_model_without_temperature_is_refused",
     GOOD "atmosphere: @@{model: surface, pressure: 95 kPa}\n", NULL, PLUMB_EKEY,
     "atmosphere.temperature", NULL},
    {"test_offset_with_the_surface_model_is_refused",
     GOOD "atmosphere: {model: surface, pressure: 95 kPa, temperature: 280 K, "
          "@@temperature_offset: 3 K}\n",
     NULL, PLUMB_EKEY, "atmosphere.temperature_offset", "surface"},
    {"test_humidity_above_one_is_refused", GOOD "atmosphere: {humidity: @@150 %}\n", NULL,
     PLUMB_ERANGE, "atmosphere.humidity", "0 .. 1"},
    {"test_table_model_without_table_is_refused", GOOD "atmosphere: @@{model: table}\n", NULL,
     PLUMB_EKEY, "atmosphere.table", NULL},
    {"test_table_with_one_row_is_refused",
     GOOD "atmosphere:\n  model: table\n  table: @@[{altitude: 0 m, density: 1.2 kg/m^3}]\n", NULL,
     PLUMB_EINVAL, "atmosphere.table", "at least 2 rows"},
    {"test_negative_table_density_names_table_0_density",
     GOOD "atmosphere:\n  model: table\n  table:\n    - {altitude: -10 m, density: @@-1.2 kg/m^3}\n"
          "    - {altitude: 100 m, density: 1.19 kg/m^3}\n",
     NULL, PLUMB_ERANGE, "atmosphere.table[0].density", "> 0 kg/m^3"},
    {"test_table_altitudes_must_increase",
     GOOD "atmosphere:\n  model: table\n  table:\n    - {altitude: 100 m, density: 1.2 kg/m^3}\n"
          "    - {altitude: @@0 m, density: 1.19 kg/m^3}\n",
     NULL, PLUMB_EINVAL, "atmosphere.table[1].altitude", "increase"},
    {"test_table_that_does_not_cover_the_fall_is_refused",
     GOOD "atmosphere:\n  model: table\n  table: @@[{altitude: 0 m, density: 1.2 kg/m^3}, "
          "{altitude: 10 m, density: 1.19 kg/m^3}]\n",
     NULL, PLUMB_ERANGE, "atmosphere.table", "spans 0 m .. 10 m"},
    {"test_table_temperature_in_some_rows_only_is_refused",
     GOOD "atmosphere:\n  model: table\n  table:\n"
          "    - {altitude: 0 m, density: 1.2 kg/m^3, temperature: 288 K}\n"
          "    - @@{altitude: 100 m, density: 1.19 kg/m^3}\n",
     NULL, PLUMB_EKEY, "atmosphere.table[1].temperature", "every row"},
    {"test_unknown_atmosphere_model_is_refused", GOOD "atmosphere: {model: @@standard-1967}\n",
     NULL, PLUMB_EINVAL, "atmosphere.model", "did you mean 'standard-1976'"},
    /* wind */
    {"test_exponent_with_the_uniform_profile_is_refused",
     GOOD "wind: {speed: 3 m/s, @@exponent: 0.2}\n", NULL, PLUMB_EKEY, "wind.exponent",
     "profile uniform"},
    {"test_roughness_above_the_reference_height_is_refused",
     GOOD "wind: {profile: log, speed: 5 m/s, reference_height: 10 m, roughness: @@12 m}\n", NULL,
     PLUMB_ERANGE, "wind.roughness", "below the reference"},
    {"test_exponent_above_one_is_refused",
     GOOD "wind: {profile: power, speed: 5 m/s, exponent: @@1.5}\n", NULL, PLUMB_ERANGE,
     "wind.exponent", "0 .. 1"},
    {"test_wind_table_heights_must_increase",
     GOOD "wind:\n  profile: table\n  table:\n    - {height: 10 m, speed: 3 m/s, from: 90 deg}\n"
          "    - {height: @@5 m, speed: 4 m/s, from: 90 deg}\n",
     NULL, PLUMB_EINVAL, "wind.table[1].height", "increase"},
    {"test_wind_table_row_without_from_is_refused",
     GOOD "wind:\n  profile: table\n  table: [@@{height: 10 m, speed: 3 m/s}]\n", NULL, PLUMB_EKEY,
     "wind.table[0].from", NULL},
    {"test_wind_speed_with_the_table_profile_is_refused",
     GOOD "wind:\n  profile: table\n  @@speed: 3 m/s\n  table: [{height: 10 m, speed: 3 m/s, "
          "from: 0 deg}]\n",
     NULL, PLUMB_EKEY, "wind.speed", "profile table"},
    {"test_unknown_wind_profile_suggests_the_closest", GOOD "wind: {profile: @@powr}\n", NULL,
     PLUMB_EINVAL, "wind.profile", "did you mean 'power'"},
    /* criteria */
    {"test_empty_criteria_list_is_refused", GOOD "criteria: @@[]\n", NULL, PLUMB_EINVAL,
     "criteria", "leave criteria out"},
    {"test_criterion_listed_twice_is_refused", GOOD "criteria: [eu-c1-80j, @@eu-c1-80j]\n", NULL,
     PLUMB_EKEY, "criteria[1]", "twice"},
    {"test_criteria_as_a_scalar_is_refused", GOOD "criteria: @@us-part107-cat3\n", NULL,
     PLUMB_EINVAL, "criteria", "expected a list"},
    /* uncertainty */
    {"test_uniform_low_above_high_is_refused",
     GOOD "uncertainty:\n  payload.drag.cd: {uniform: @@[1.1, 0.7]}\n", NULL, PLUMB_ERANGE,
     "uncertainty.payload.drag.cd.uniform", "above HI"},
    {"test_negative_standard_deviation_is_refused",
     GOOD "uncertainty:\n  payload.mass: {normal: [2.385 kg, @@-0.1 kg]}\n", NULL, PLUMB_ERANGE,
     "uncertainty.payload.mass.normal[1]", "standard deviation"},
    {"test_unknown_uncertainty_key_suggests_the_closest",
     GOOD "uncertainty:\n  @@payload.mas: {uniform: [2 kg, 3 kg]}\n", NULL, PLUMB_EKEY,
     "uncertainty.payload.mas", "did you mean 'payload.mass'"},
    {"test_non_numeric_uncertainty_key_is_refused",
     GOOD "uncertainty:\n  @@wind.profile: {uniform: [1, 2]}\n", NULL, PLUMB_EINVAL,
     "uncertainty.wind.profile", "not a numeric key"},
    {"test_unknown_distribution_suggests_the_closest",
     GOOD "uncertainty:\n  payload.mass: {@@normall: [2.385 kg, 0.1 kg]}\n", NULL, PLUMB_EKEY,
     "uncertainty.payload.mass.normall", "did you mean 'normal'"},
    {"test_two_distributions_for_one_key_are_refused",
     GOOD "uncertainty:\n  payload.mass: {normal: [2.385 kg, 0.1 kg], @@uniform: [2 kg, 3 kg]}\n",
     NULL, PLUMB_EKEY, "uncertainty.payload.mass", "one distribution"},
    {"test_uncertainty_on_a_shape_dimension_is_refused",
     "payload:\n  mass: 2.385 kg\n  shape: {kind: sphere, diameter: 0.1 m}\n" RELEASE
     "uncertainty:\n  @@payload.shape.diameter: \"0.1 m +- 0.01 m\"\n",
     NULL, PLUMB_EINVAL, "uncertainty.payload.shape.diameter", "payload.drag.cd"},
    {"test_uncertainty_on_an_unused_key_is_refused",
     GOOD "uncertainty:\n  @@payload.drag.cd_area: {uniform: [0.01 m^2, 0.02 m^2]}\n", NULL,
     PLUMB_EINVAL, "uncertainty.payload.drag.cd_area", "does not use it"},
    {"test_uncertainty_on_the_atmosphere_is_refused",
     GOOD "uncertainty:\n  @@atmosphere.temperature_offset: \"0 K +- 5 K\"\n", NULL,
     PLUMB_EINVAL, "uncertainty.atmosphere.temperature_offset", "shared by every fall"},
    {"test_uncertainty_bare_number_for_a_mass_is_refused",
     GOOD "uncertainty:\n  payload.mass: {normal: [@@2.4, 0.1 kg]}\n", NULL, PLUMB_EUNIT,
     "uncertainty.payload.mass.normal[0]", NULL},
    {"test_uncertainty_with_three_numbers_for_uniform_is_refused",
     GOOD "uncertainty:\n  payload.mass: {uniform: @@[2 kg, 2.4 kg, 3 kg]}\n", NULL, PLUMB_EINVAL,
     "uncertainty.payload.mass.uniform", "[LO, HI]"},
    {"test_malformed_tolerance_text_is_refused",
     GOOD "uncertainty:\n  payload.mass: @@2.4 kg plus 0.1 kg\n", NULL, PLUMB_EINVAL,
     "uncertainty.payload.mass", "VALUE +- TOL"},
    {"test_negative_tolerance_is_refused",
     GOOD "uncertainty:\n  payload.mass: @@\"2.4 kg +- -0.1 kg\"\n", NULL, PLUMB_ERANGE,
     "uncertainty.payload.mass", "tolerance"},
    {"test_triangular_mode_outside_its_bounds_is_refused",
     GOOD "uncertainty:\n  payload.mass: {triangular: @@[2 kg, 3.5 kg, 3 kg]}\n", NULL,
     PLUMB_ERANGE, "uncertainty.payload.mass.triangular", "LO <= MODE <= HI"},
    {"test_uncertainty_reaching_a_negative_mass_is_refused",
     GOOD "uncertainty:\n  payload.mass: {uniform: [@@-1 kg, 3 kg]}\n", NULL, PLUMB_ERANGE,
     "uncertainty.payload.mass.uniform[0]", "> 0 kg"},
    {"test_uncertainty_on_an_item_key_points_to_payload_keys",
     "items:\n" ITEM("a", "1.2 kg") RELEASE "uncertainty:\n  @@items[1].mass: \"1.2 kg +- 0.1 kg\"\n",
     NULL, PLUMB_EINVAL, "uncertainty.items[1].mass", "payload.KEY"},
    {"test_uncertainty_as_a_list_is_refused", GOOD "uncertainty: @@[1, 2]\n", NULL, PLUMB_EINVAL,
     "uncertainty", "expected a map"},
    /* zone */
    {"test_zone_confidence_of_one_is_refused", GOOD "zone: {confidence: @@1}\n", NULL,
     PLUMB_ERANGE, "zone.confidence", "< 1"},
    {"test_zone_of_zero_samples_is_refused", GOOD "zone: {samples: @@0}\n", NULL, PLUMB_ERANGE,
     "zone.samples", "1 .. 100000000"},
    {"test_zone_samples_in_exponent_notation_are_refused", GOOD "zone: {samples: @@1e5}\n", NULL,
     PLUMB_EINVAL, "zone.samples", "whole number"},
    {"test_zone_seed_that_is_negative_is_refused", GOOD "zone: {seed: @@-3}\n", NULL,
     PLUMB_EINVAL, "zone.seed", "whole number"},
    {"test_zone_target_without_north_is_refused", GOOD "zone: {target: @@{east: 3 m}}\n", NULL,
     PLUMB_EKEY, "zone.target.north", NULL},
    {"test_negative_scatter_is_refused", GOOD "zone: {scatter: @@-2 m}\n", NULL, PLUMB_ERANGE,
     "zone.scatter", ">= 0 m"},
    /* inventory */
    /* items are numbered from 1, as the reports number them */
    {"test_bad_mass_of_the_third_item_names_items_3_mass",
     "items:\n" ITEM("a", "1.2 kg") ITEM("b", "0.7 kg") ITEM("c", "@@-1 kg") RELEASE, NULL,
     PLUMB_ERANGE, "items[3].mass", "> 0 kg"},
    {"test_item_names_must_differ",
     "items:\n" ITEM("a", "1.2 kg") "  - name: @@a\n    mass: 1 kg\n    drag: {cd_area: 0.01 m^2}\n" RELEASE,
     NULL, PLUMB_EKEY, "items[2].name", "used twice (also items[1])"},
    {"test_item_without_name_is_refused",
     "items:\n  - @@mass: 1 kg\n    drag: {cd_area: 0.01 m^2}\n" RELEASE, NULL, PLUMB_EKEY,
     "items[1].name", NULL},
    {"test_empty_items_list_is_refused", "items: @@[]\n" RELEASE, NULL, PLUMB_EINVAL, "items",
     "empty list"},
    {"test_item_descent_error_names_the_item",
     "items:\n  - name: a\n    mass: 1 kg\n    drag: {cd_area: 0.01 m^2}\n"
     "    descent: {cd: @@11, area: 1 m^2, deploy: {after: 1 s}}\n" RELEASE,
     NULL, PLUMB_ERANGE, "items[1].descent.cd", NULL},
    {"test_items_as_a_map_is_refused", "items: @@{a: 1}\n" RELEASE, NULL, PLUMB_EINVAL, "items",
     "expected a list of maps"},
    /* text */
    {"test_name_with_a_control_character_is_refused", "name: @@\"a\\x01b\"\n" GOOD, NULL,
     PLUMB_EINVAL, "name", "control character"},
    {"test_empty_name_is_refused", "name: @@\"\"\n" GOOD, NULL, PLUMB_EINVAL, "name", NULL},
    {"test_name_longer_than_127_bytes_is_refused",
     "name: @@aaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaa"
     "aaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaaa\n" GOOD,
     NULL, PLUMB_ERANGE, "name", "at most 127"},
    /* YAML level */
    {"test_anchor_is_refused", "payload:\n  mass: @@&m 2.385 kg\n  drag: {cd_area: 0.01 m^2}\n" RELEASE,
     NULL, PLUMB_EPARSE, "payload.mass", "anchors"},
    {"test_anchor_on_a_map_is_refused", "payload: @@&p\n  mass: 2.385 kg\n  drag: {cd_area: 0.01 m^2}\n" RELEASE,
     NULL, PLUMB_EPARSE, "payload", "anchors"},
    {"test_alias_is_refused", "payload:\n  mass: @@*m\n  drag: {cd_area: 0.01 m^2}\n" RELEASE, NULL,
     PLUMB_EPARSE, "payload.mass", "aliases"},
    {"test_tag_is_refused", "payload:\n  mass: @@!!str 2.385 kg\n  drag: {cd_area: 0.01 m^2}\n" RELEASE,
     NULL, PLUMB_EPARSE, "payload.mass", "tags"},
    {"test_tab_is_refused_where_it_stands",
     "payload:\n  mass: 2.385 kg\n@@\tdrag: {cd_area: 0.01 m^2}\n" RELEASE, NULL, PLUMB_EPARSE,
     "", "tab character in the indentation"},
    {"test_tab_inside_a_value_is_refused_too", "name: caf@@\te\n" GOOD, NULL, PLUMB_EPARSE, "name",
     "a tab character inside a value"},
    {"test_tab_inside_a_quoted_value_is_refused_where_it_stands",
     "payload:\n  mass: \"2.3@@\t85 kg\"\n  drag: {cd_area: 0.01 m^2}\n" RELEASE, NULL, PLUMB_EPARSE,
     "payload.mass", "a tab character inside a value"},
    {"test_tab_after_a_list_dash_is_indentation",
     "items:\n  -@@\tname: pin\n    mass: 0.183 kg\n    drag: {cd_area: 0.0003 m^2}\n" RELEASE,
     NULL, PLUMB_EPARSE, "", "tab character in the indentation"},
    {"test_tab_inside_a_set_value_is_refused_where_it_stands", GOOD, "payload.mass=2.3@@\t85 kg",
     PLUMB_EPARSE, "payload.mass", "a tab character inside a value"},
    {"test_invalid_utf8_is_refused_with_its_position", "name: caf@@\xff\n" GOOD, NULL,
     PLUMB_EPARSE, "", "UTF-8"},
    {"test_truncated_utf8_sequence_is_refused", "name: ab\xc3\xa9@@\xe2\x82\n" GOOD, NULL,
     PLUMB_EPARSE, "", "UTF-8"},
    {"test_control_character_is_refused", "name: ab@@\x01\n" GOOD, NULL, PLUMB_EPARSE, "",
     "control characters"},
    {"test_mapping_value_inside_a_scalar_is_malformed", "name: a@@: b\n" GOOD, NULL, PLUMB_EPARSE,
     "", "malformed YAML"},
    {"test_second_document_is_refused", GOOD "@@---\nname: again\n", NULL, PLUMB_EPARSE, "",
     "second YAML document"},
    {"test_list_as_a_key_is_refused", GOOD "? @@[a, b]\n: 1\n", NULL, PLUMB_EPARSE, "",
     "plain word"},
    {"test_nul_inside_a_value_is_refused", "name: @@\"a\\0b\"\n" GOOD, NULL, PLUMB_EPARSE, "name",
     "NUL"},
    {"test_document_with_only_a_separator_is_empty", "---\n@@", NULL, PLUMB_EPARSE, "", "empty"},
    /* overrides */
    {"test_override_without_equals_sign_is_refused", GOOD, "@@release.height", PLUMB_EPARSE, "",
     "KEY=VALUE"},
    {"test_override_with_an_empty_key_is_refused", GOOD, "@@=3 m", PLUMB_EPARSE, "", "KEY=VALUE"},
    {"test_override_of_an_unknown_key_suggests_the_closest", GOOD, "release.@@hieght=30 ft",
     PLUMB_EKEY, "release.hieght", "did you mean 'release.height'"},
    {"test_override_of_an_unknown_top_level_key_is_refused", GOOD, "@@zzqqxx=1", PLUMB_EKEY,
     "zzqqxx", "not a key"},
    {"test_override_with_a_bare_number_is_located_in_the_argument", GOOD, "release.height=@@30",
     PLUMB_EUNIT, "release.height", NULL},
    {"test_override_with_malformed_yaml_is_located_at_its_end", GOOD, "release.height=[30 m@@",
     PLUMB_EPARSE, "release.height[1]", "malformed YAML"},
    {"test_override_with_an_empty_value_is_refused", GOOD, "release.height=@@", PLUMB_EPARSE,
     "release.height", "value after '='"},
    {"test_override_with_an_empty_segment_is_refused", GOOD, "release.@@.height=3 m",
     PLUMB_EPARSE, "release..height", "key name"},
    {"test_override_indexing_a_map_is_refused", GOOD, "release@@[0].height=3 m", PLUMB_EPARSE,
     "release[0].height", "not a list"},
    {"test_override_into_a_list_without_an_index_is_refused", GOOD,
     "atmosphere.table@@.density=1 kg/m^3", PLUMB_EPARSE, "atmosphere.table.density",
     "give an index"},
    /* the user's own index given as a dotted part is moved into brackets
     * ("items.2.mass" was once answered "e.g. items[1].2.mass"); the
     * key syntax of README.md, "Profile keys": a list's index in brackets,
     * items counted from 1 */
    {"test_an_index_given_as_a_dotted_part_is_suggested_in_brackets",
     "items:\n" ITEM("spanner", "0.43 kg") ITEM("glove", "0.071 kg") RELEASE,
     "items@@.2.mass=1 kg", PLUMB_EPARSE, "items.2.mass",
     "'items' is a list: give an index, e.g. items[2].mass"},
    {"test_an_item_zero_given_as_a_dotted_part_is_suggested_as_the_first",
     "items:\n" ITEM("spanner", "0.43 kg") ITEM("glove", "0.071 kg") RELEASE,
     "items@@.0.mass=1 kg", PLUMB_EPARSE, "items.0.mass",
     "'items' is a list: give an index, e.g. items[1].mass"},
    {"test_a_list_index_given_as_a_dotted_part_is_suggested_in_brackets", GOOD,
     "atmosphere.table@@.3.density=1 kg/m^3", PLUMB_EPARSE, "atmosphere.table.3.density",
     "'table' is a list: give an index, e.g. atmosphere.table[3].density"},
    {"test_a_list_without_an_index_is_suggested_with_its_whole_key", GOOD,
     "atmosphere.table@@.density=1 kg/m^3", PLUMB_EPARSE, "atmosphere.table.density",
     "'table' is a list: give an index, e.g. atmosphere.table[0].density"},
    /* items are numbered from 1 in --set and --vary, as in the reports */
    {"test_item_zero_is_refused_since_items_count_from_one",
     "items:\n" ITEM("spanner", "0.43 kg") ITEM("glove", "0.071 kg") RELEASE,
     "items[@@0].mass=0.4 kg", PLUMB_ERANGE, "items[0].mass",
     "items are numbered from 1, as in the reports: items[1] is the first item"},
    {"test_an_item_past_the_end_counts_from_one",
     "items:\n" ITEM("spanner", "0.43 kg") ITEM("glove", "0.071 kg") RELEASE,
     "@@items[4].mass=0.4 kg", PLUMB_ERANGE, "items[4].mass",
     "items[4] is past the end: counted as the profile is written, with any item a --set "
     "added, there are 2 items (the next is items[3])"},
    {"test_an_unknown_item_name_suggests_the_nearest",
     "items:\n" ITEM("spanner", "0.43 kg") ITEM("box of M12 bolts", "2.6 kg") RELEASE,
     "@@items[box of M12 bolt].mass=2.4 kg", PLUMB_EKEY, "items[box of M12 bolt].mass",
     "no item is named 'box of M12 bolt' (did you mean 'box of M12 bolts'?); the items are "
     "'spanner', 'box of M12 bolts'"},
    {"test_an_item_name_without_its_bracket_is_refused",
     "items:\n" ITEM("spanner", "0.43 kg") RELEASE, "items[@@spanner.mass=0.4 kg", PLUMB_EPARSE,
     "items[spanner.mass", "expected items[N], N from 1, or items[NAME]: no closing ']'"},
    {"test_an_item_of_a_single_payload_profile_is_refused_at_the_set", GOOD,
     "@@items[2].mass=0.4 kg", PLUMB_EKEY, "items[2].mass",
     "the profile has a single payload (payload: at line 1), not items: set its keys as "
     "payload.X, here payload.mass"},
    {"test_override_past_the_end_of_a_list_is_refused", GOOD, "@@descent[1].cd=0.8", PLUMB_ERANGE,
     "descent[1].cd", "no items yet"},
    {"test_override_below_a_single_value_is_refused", GOOD, "release.height.@@x=1", PLUMB_EKEY,
     "release.height.x", "single value"},
    {"test_override_with_a_value_of_the_wrong_kind_is_refused", GOOD, "payload=@@2.385 kg",
     PLUMB_EINVAL, "payload", "expected a map"},
    {"test_override_with_an_unknown_key_inside_its_map_is_refused", GOOD,
     "payload.drag={cd: 1, area: 1 m^2, @@cdd: 3}", PLUMB_EKEY, "payload.drag.cdd",
     "did you mean 'cd'"},
    {"test_override_with_a_tab_is_refused", GOOD, "release.height=3@@\tm", PLUMB_EPARSE,
     "release.height", "tab"},
    {"test_override_below_a_scalar_of_the_file_is_refused", PAYLOAD RELEASE "site: x\n",
     "site.@@elevation=3 m", PLUMB_EINVAL, "site.elevation", "not a map"},
    {"test_override_with_an_anchor_is_refused", GOOD, "release.height=@@&h 3 m", PLUMB_EPARSE,
     "release.height", "anchors"},
    /* told at the --set that removed it, not at the file (a user review) */
    {"test_override_that_removes_a_required_key_is_reported", GOOD, "release=@@~", PLUMB_EKEY,
     "release.height", "this --set removed release"},
    {"test_override_that_removes_the_required_key_itself_is_reported", GOOD,
     "release.height=@@~", PLUMB_EKEY, "release.height", "this --set removed it"},
};

static void run_bad_case(void **state)
{
    const bad_case *c = *state;
    char text[TEXT_LEN], set[TEXT_LEN];
    mark mt, ms = {0, 0, 0};
    strip_mark(c->text, text, sizeof text, &mt);
    const char *sets[1];
    size_t n_sets = 0;
    if (c->set) {
        strip_mark(c->set, set, sizeof set, &ms);
        sets[0] = set;
        n_sets = 1;
    }
    const char *path = write_text("bad", text);
    plumb_profile *p = (plumb_profile *)(uintptr_t)1;
    plumb_diag d;
    plumb_diag_clear(&d);
    plumb_status st = plumb_profile_load(path, units, sets, n_sets, &p, &d);
    char buf[1024];
    plumb_diag_format(&d, buf, sizeof buf);
    print_message("    %s\n", buf);
    if (st == PLUMB_OK)
        plumb_profile_free(p);
    assert_int_not_equal(st, PLUMB_OK);
    assert_null(p);
    if (c->status >= 0)
        assert_int_equal(st, c->status);
    else
        assert_true(st != PLUMB_OK && plumb_status_is_input_error(st));
    assert_int_equal(d.status, st);
    assert_string_equal(d.key, c->key);
    if (c->msg && !strstr(d.message, c->msg)) {
        print_error("message '%s' lacks '%s'\n", d.message, c->msg);
        fail();
    }
    assert_true(mt.found || ms.found);
    if (ms.found) {
        assert_string_equal(d.file, "--set");
        assert_int_equal(d.line, ms.line);
        assert_int_equal(d.col, ms.col);
    } else {
        assert_string_equal(d.file, path);
        assert_int_equal(d.line, mt.line);
        assert_int_equal(d.col, mt.col);
    }
}

/* ---- file-level errors --------------------------------------------------- */

static void expect_file_error(const char *path, plumb_status want)
{
    plumb_profile *p = (plumb_profile *)(uintptr_t)1;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, &p, &d), want);
    assert_null(p);
    assert_int_equal(d.status, want);
    assert_string_equal(d.file, path);
}

static void test_missing_file_is_an_input_output_error(void **state)
{
    (void)state;
    char path[PATH_LEN];
    snprintf(path, sizeof path, "%s/no-such-profile.yaml", tmpdir);
    expect_file_error(path, PLUMB_EIO);
}

static void test_directory_is_refused(void **state)
{
    (void)state;
    expect_file_error(tmpdir, PLUMB_EIO);
}

/* /proc/self/mem opens but reading offset 0 (unmapped) fails with EIO
 * (Linux proc(5)); a root user cannot be stopped by chmod, this can. */
static void test_file_that_opens_but_cannot_be_read_is_refused(void **state)
{
    (void)state;
    if (access("/proc/self/mem", R_OK) != 0)
        skip();
    expect_file_error("/proc/self/mem", PLUMB_EIO);
}

static void test_file_over_one_mebibyte_is_refused(void **state)
{
    (void)state;
    size_t n = PLUMB_PROFILE_MAX_BYTES + 1;
    char *big = malloc(n);
    assert_non_null(big);
    memset(big, '#', n);
    for (size_t i = 80; i < n; i += 81)
        big[i] = '\n';
    const char *path = write_bytes("big", big, n);
    free(big);
    expect_file_error(path, PLUMB_ERANGE);
}

static void test_file_of_exactly_one_mebibyte_is_read(void **state)
{
    (void)state;
    size_t n = PLUMB_PROFILE_MAX_BYTES;
    char *big = malloc(n);
    assert_non_null(big);
    const char *head = GOOD;
    size_t hl = strlen(head);
    memcpy(big, head, hl);
    memset(big + hl, ' ', n - hl);
    big[n - 1] = '\n';
    const char *path = write_bytes("max", big, n);
    free(big);
    plumb_profile *p;
    plumb_diag d;
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, &p, &d), PLUMB_OK);
    plumb_profile_free(p);
}

static void test_empty_file_is_refused_at_line_1(void **state)
{
    (void)state;
    const char *path = write_text("empty", "");
    expect_file_error(path, PLUMB_EPARSE);
}

static void test_comment_only_file_is_refused_at_line_1(void **state)
{
    (void)state;
    const char *path = write_text("comments", "# nothing here\n\n   \n# at all\n");
    plumb_profile *p;
    plumb_diag d;
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, &p, &d), PLUMB_EPARSE);
    assert_int_equal(d.line, 1);
    assert_int_equal(d.col, 1);
    assert_non_null(strstr(d.message, "no YAML document"));
}

static void test_nesting_deeper_than_32_levels_is_refused(void **state)
{
    (void)state;
    char text[256] = "a: ";
    size_t n = strlen(text);
    for (int i = 0; i < 40; i++)
        text[n++] = '[';
    text[n++] = '1';
    for (int i = 0; i < 40; i++)
        text[n++] = ']';
    text[n++] = '\n';
    text[n] = '\0';
    const char *path = write_text("deep", text);
    plumb_profile *p;
    plumb_diag d;
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, &p, &d), PLUMB_ERANGE);
    /* the root map is level 1, so the 32nd '[' opens level 33 */
    assert_int_equal(d.line, 1);
    assert_int_equal(d.col, 4 + 31);
}

static void test_drag_source_longer_than_the_spec_field_is_refused(void **state)
{
    (void)state;
    static const char head[] = "payload:\n  mass: 2.385 kg\n  drag:\n    cd_area: 0.01 m^2\n"
                               "    source: ";
    char text[TEXT_LEN];
    size_t n = strlen(head);
    memcpy(text, head, n);
    memset(text + n, 'x', PLUMB_DRAG_SOURCE);
    snprintf(text + n + PLUMB_DRAG_SOURCE, sizeof text - n - PLUMB_DRAG_SOURCE, "\n%s", RELEASE);
    const char *path = write_text("source", text);
    plumb_profile *p;
    plumb_diag d;
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, &p, &d), PLUMB_ERANGE);
    assert_string_equal(d.key, "payload.drag.source");
    assert_int_equal(d.line, 5);
    assert_int_equal(d.col, 13);
    /* one byte less fits */
    text[n + PLUMB_DRAG_SOURCE - 1] = '\n';
    memmove(text + n + PLUMB_DRAG_SOURCE, text + n + PLUMB_DRAG_SOURCE + 1,
            strlen(text + n + PLUMB_DRAG_SOURCE + 1) + 1);
    path = write_text("source", text);
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, &p, &d), PLUMB_OK);
    assert_int_equal(strlen(plumb_profile_item(p, 0)->drag.source), PLUMB_DRAG_SOURCE - 1);
    plumb_profile_free(p);
}

static void test_a_direction_sector_may_run_through_north(void **state)
{
    (void)state;
    /* uniform [LO, HI] with LO > HI on an angle is the sector from LO
     * clockwise to HI (a direction sector may wrap through north) */
    plumb_profile *p = load_ok("payload:\n  mass: 1.373 kg\n  drag: {cd: 0.91, area: 0.0113 m^2}\n"
                               "release: {height: 17.3 m}\nwind: {speed: 4.1 m/s, from: 355 deg}\n"
                               "uncertainty:\n  wind.from: {uniform: [340 deg, 15 deg]}\n",
                               NULL, 0);
    assert_int_equal(plumb_profile_uncertainty_count(p), 1);
    const plumb_uncertainty *u = plumb_profile_uncertainty(p, 0);
    assert_int_equal(u->kind, PLUMB_DIST_UNIFORM);
    assert_rel(u->param[0], 340.0, 1e-15);
    assert_rel(u->param[1], 15.0, 1e-15);
    plumb_profile_free(p);
}

static void test_utf8_byte_order_mark_is_skipped(void **state)
{
    (void)state;
    /* Some editors write EF BB BF first (Unicode Standard sec. 23.8); it is
     * not content. */
    plumb_profile *p = load_ok("\xEF\xBB\xBFpayload:\n  mass: 1.373 kg\n"
                               "  drag: {cd: 0.91, area: 0.0113 m^2}\nrelease: {height: 17.3 m}\n",
                               NULL, 0);
    assert_rel(plumb_profile_item(p, 0)->mass_kg, 1.373, 1e-15);
    plumb_profile_free(p);
}

/* YAML 1.2.2 (6.1, 6.6) forbids tabs only as indentation: a tab that
 * separates a value from its comment, or lies inside the comment, or
 * between a key and its value, is white space ("a tab inside a
 * trailing comment is not an indentation error"). */
static void test_tabs_around_and_in_a_trailing_comment_are_accepted(void **state)
{
    (void)state;
    plumb_profile *p = load_ok("name: tabbed\t# tab-aligned comment\n"
                               "payload:\n  mass: 1.373 kg\t# scale reading\n"
                               "  volume: 0.0004 m^3  # a\tcomment with a tab\n"
                               "  drag:\t{cd: 0.91, area: 0.0113 m^2}\n"
                               "  # a whole-line comment\twith a tab\n"
                               "release: {height: 17.3 m}\t\n",
                               NULL, 0);
    assert_string_equal(plumb_profile_name(p), "tabbed");
    assert_rel(plumb_profile_item(p, 0)->mass_kg, 1.373, 1e-15);
    assert_rel(plumb_profile_item(p, 0)->volume_m3, 0.0004, 1e-15);
    assert_rel(plumb_profile_item(p, 0)->drag.cd, 0.91, 1e-15);
    plumb_profile_free(p);
    const char *sets[] = {"release.height=21.6 m\t# from --set"};
    p = load_ok(GOOD, sets, 1);
    assert_rel(plumb_profile_item(p, 0)->release_m[2], 21.6, 1e-15);
    plumb_profile_free(p);
}

/* The text report numbers an inventory's rows 1, 2, 3, so
 * items[1] is the first row everywhere, and an item may be named. */
#define KIT "items:\n" ITEM("spanner", "0.43 kg") ITEM("box of M12 bolts", "2.6 kg") \
            ITEM("glove", "0.071 kg") RELEASE

static void test_items_are_numbered_from_one_and_by_name_in_overrides(void **state)
{
    (void)state;
    const char *first[] = {"items[1].mass=0.384 kg", "items[3].drag.cd_area=0.0217 m^2"};
    plumb_profile *p = load_ok(KIT, first, 2);
    assert_rel(plumb_profile_item(p, 0)->mass_kg, 0.384, 1e-15);
    assert_rel(plumb_profile_item(p, 1)->mass_kg, 2.6, 1e-15);
    assert_rel(plumb_profile_item(p, 2)->mass_kg, 0.071, 1e-15);
    assert_rel(plumb_profile_item(p, 2)->drag.cd_area_m2, 0.0217, 1e-15);
    plumb_profile_free(p);

    const char *named[] = {"items[box of M12 bolts].mass=2.35 kg"};
    p = load_ok(KIT, named, 1);
    assert_string_equal(plumb_profile_item(p, 1)->name, "box of M12 bolts");
    assert_rel(plumb_profile_item(p, 1)->mass_kg, 2.35, 1e-15);
    assert_rel(plumb_profile_item(p, 0)->mass_kg, 0.43, 1e-15);
    plumb_profile_free(p);

    /* the next number appends an item; ~ removes one, by number or name */
    const char *grow[] = {"items[4]={name: level, mass: 0.52 kg, drag: {cd_area: 0.004 m^2}}",
                          "items[glove]=~", "items[1]=~"};
    p = load_ok(KIT, grow, 3);
    assert_int_equal(plumb_profile_item_count(p), 2);
    assert_string_equal(plumb_profile_item(p, 0)->name, "box of M12 bolts");
    assert_string_equal(plumb_profile_item(p, 1)->name, "level");
    assert_rel(plumb_profile_item(p, 1)->mass_kg, 0.52, 1e-15);
    plumb_profile_free(p);
}

/* README.md "Profile keys", "Inventory": items are numbered one way
 * everywhere. After
 * --set 'items[2]=~' the items keep the numbers of the profile as written
 * (1 and 3), an added item takes the next (4), a profile derived from it
 * (a sweep's row, a limit's fall) counts items[N] the same way, and a
 * loader's message names the item by that number. */
static void test_items_keep_their_numbers_as_written_after_a_removal(void **state)
{
    (void)state;
    const char *sets[] = {"items[2]=~",
                          "items[4]={name: level, mass: 0.52 kg, drag: {cd_area: 0.004 m^2}}"};
    plumb_profile *p = load_ok(KIT, sets, 2);
    assert_int_equal(plumb_profile_item_count(p), 3);
    assert_string_equal(plumb_profile_item(p, 1)->name, "glove");
    assert_int_equal(plumb_profile_item_number(p, 0), 1);
    assert_int_equal(plumb_profile_item_number(p, 1), 3);
    assert_int_equal(plumb_profile_item_number(p, 2), 4);
    assert_int_equal(plumb_profile_item_number(p, 3), 0);
    assert_int_equal(plumb_profile_item_number(NULL, 0), 0);
    int line, col;
    assert_string_equal(plumb_profile_key_origin(p, "items[4].mass", &line, &col), "--set");
    assert_null(plumb_profile_key_origin(p, "items[2].mass", &line, &col));

    /* derived: items[3] is still the glove, items[2] still removed */
    const char *more[] = {"items[3].mass=0.093 kg"};
    plumb_profile *q = NULL;
    plumb_diag d;
    plumb_diag_clear(&d);
    assert_int_equal(plumb_profile_derive(p, units, more, 1, &q, &d), PLUMB_OK);
    assert_rel(plumb_profile_item(q, 1)->mass_kg, 0.093, 1e-15);
    assert_rel(plumb_profile_item(q, 2)->mass_kg, 0.52, 1e-15);
    assert_int_equal(plumb_profile_item_number(q, 1), 3);
    plumb_profile_free(q);
    const char *gone[] = {"items[2].mass=1 kg"};
    plumb_diag_clear(&d);
    assert_int_equal(plumb_profile_derive(p, units, gone, 1, &q, &d), PLUMB_EKEY);
    assert_non_null(strstr(d.message, "items[2] was removed"));
    /* a message of the loader names the item as written */
    const char *bad[] = {"items[3].mass=-1 kg"};
    plumb_diag_clear(&d);
    assert_int_equal(plumb_profile_derive(p, units, bad, 1, &q, &d), PLUMB_ERANGE);
    assert_string_equal(d.key, "items[3].mass");
    plumb_profile_free(p);

    /* without a removal the numbers are the places in the list */
    p = load_ok(KIT, NULL, 0);
    assert_int_equal(plumb_profile_item_number(p, 2), 3);
    plumb_profile_free(p);
}

static void test_null_arguments_are_invalid(void **state)
{
    (void)state;
    plumb_profile *p = (plumb_profile *)(uintptr_t)1;
    plumb_diag d;
    const char *path = write_text("good", GOOD);
    assert_int_equal(plumb_profile_load(NULL, units, NULL, 0, &p, &d), PLUMB_EINVAL);
    assert_null(p);
    assert_int_equal(plumb_profile_load(path, NULL, NULL, 0, &p, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_profile_load(path, units, NULL, 1, &p, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_profile_load(path, units, NULL, 0, NULL, &d), PLUMB_EINVAL);
    const char *null_set[1] = {NULL};
    assert_int_equal(plumb_profile_load(path, units, null_set, 1, &p, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_profile_derive(NULL, units, NULL, 0, &p, &d), PLUMB_EINVAL);
    /* and the diagnostic may be NULL */
    assert_int_equal(plumb_profile_load(NULL, units, NULL, 0, &p, NULL), PLUMB_EINVAL);
}

/* ---- positive loads ---------------------------------------------------- */

/* A full example of the format (README.md "Profiles"): a payload under a
 * parachute, with release, site, air, wind, criteria, uncertainty and
 * zone, and the alternatives in end-of-line comments as a user writes
 * them. */
static const char full_example[] =
    "name: Torque wrench, 3/4 in drive\n"
    "payload:\n"
    "  mass: 2.4 kg\n"
    "  drag: {cd: 0.9, area: 0.021 m^2}        # or drag: {cd_area: 0.019 m^2}\n"
    "  # or, instead of drag:\n"
    "  # shape: {kind: cylinder, length: 0.6 m, diameter: 0.035 m, attitude: tumbling}\n"
    "descent:                                   # optional\n"
    "  kind: parachute\n"
    "  cd: 0.8\n"
    "  area: 1.2 m^2\n"
    "  deploy: {after: 1.5 s}                   # or {below: 60 m}\n"
    "  fill_time: 0.8 s\n"
    "release:\n"
    "  height: 30 m                             # above the strike level\n"
    "  velocity: {east: 0 m/s, north: 0 m/s, up: 0 m/s}   # or {speed:, heading:, climb:}\n"
    "site:\n"
    "  elevation: 350 m\n"
    "  latitude: 52 deg                         # optional\n"
    "atmosphere:\n"
    "  model: standard-1976                     # | surface | table\n"
    "  temperature_offset: 10 K\n"
    "wind:\n"
    "  profile: power                           # uniform | power | log | table\n"
    "  speed: 8 m/s                             # at reference_height\n"
    "  from: 270 deg\n"
    "  reference_height: 10 m\n"
    "  exponent: 0.143                          # power law; log law takes roughness: 0.03 m\n"
    "criteria: [us-part107-cat3]\n"
    "uncertainty:\n"
    "  payload.drag.cd: {uniform: [0.7, 1.1]}\n"
    "  wind.speed: {normal: [8 m/s, 2 m/s]}\n"
    "zone: {samples: 100000, seed: 7, confidence: 0.999, scatter: 2 m}\n";

static void test_full_example_loads_with_every_value_in_si(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(full_example, NULL, 0);
    assert_string_equal(plumb_profile_name(p), "Torque wrench, 3/4 in drive");
    assert_int_equal(plumb_profile_is_inventory(p), 0);
    assert_int_equal(plumb_profile_item_count(p), 1);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_string_equal(s->name, "Torque wrench, 3/4 in drive");
    assert_rel(s->mass_kg, 2.4, 1e-15);
    assert_abs(s->volume_m3, 0.0, 0.0);
    assert_int_equal(s->drag.model, PLUMB_DRAG_FIXED);
    assert_rel(s->drag.cd, 0.9, 1e-15);
    assert_rel(s->drag.area_m2, 0.021, 1e-15);
    assert_non_null(strstr(s->drag.source, "as given in the profile"));
    assert_int_equal(plumb_profile_item_shape(p, 0)->kind, PLUMB_SHAPE_NONE);
    assert_int_equal(s->n_descent, 1);
    assert_int_equal(s->descent[0].kind, PLUMB_DESCENT_PARACHUTE);
    assert_rel(s->descent[0].cd, 0.8, 1e-15);
    assert_rel(s->descent[0].area_m2, 1.2, 1e-15);
    assert_int_equal(s->descent[0].trigger, PLUMB_DEPLOY_AFTER);
    assert_rel(s->descent[0].deploy_value, 1.5, 1e-15);
    assert_rel(s->descent[0].fill_time_s, 0.8, 1e-15);
    assert_abs(s->descent[0].fill_constant, 0.0, 0.0);
    assert_abs(s->release_m[0], 0.0, 0.0);
    assert_abs(s->release_m[1], 0.0, 0.0);
    assert_rel(s->release_m[2], 30.0, 1e-15);
    for (int i = 0; i < 3; i++)
        assert_abs(s->velocity_m_s[i], 0.0, 0.0);
    assert_rel(s->site_elevation_m, 350.0, 1e-15);
    assert_int_equal(s->gravity.has_latitude, 1);
    assert_rel(s->gravity.latitude_deg, 52.0, 1e-15);
    assert_int_equal(s->wind.profile, PLUMB_WIND_POWER);
    assert_rel(s->wind.speed_m_s, 8.0, 1e-15);
    assert_rel(s->wind.from_deg, 270.0, 1e-15);
    assert_rel(s->wind.ref_height_m, 10.0, 1e-15);
    assert_rel(s->wind.exponent, 0.143, 1e-15);
    const plumb_atm_spec *a = plumb_profile_atmosphere(p);
    assert_int_equal(a->model, PLUMB_ATM_STD1976);
    assert_rel(a->temperature_offset_k, 10.0, 1e-15);
    assert_abs(a->relative_humidity, 0.0, 0.0);
    assert_int_equal(plumb_profile_criteria_count(p), 1);
    assert_string_equal(plumb_profile_criterion(p, 0), "us-part107-cat3");
    assert_int_equal(plumb_profile_uncertainty_count(p), 2);
    const plumb_uncertainty *u0 = plumb_profile_uncertainty(p, 0);
    assert_string_equal(u0->key, "payload.drag.cd");
    assert_int_equal(u0->kind, PLUMB_DIST_UNIFORM);
    assert_rel(u0->param[0], 0.7, 1e-15);
    assert_rel(u0->param[1], 1.1, 1e-15);
    assert_int_equal(u0->line, line_of(full_example, "  payload.drag.cd:"));
    assert_int_equal(u0->col, 3);
    const plumb_uncertainty *u1 = plumb_profile_uncertainty(p, 1);
    assert_string_equal(u1->key, "wind.speed");
    assert_int_equal(u1->kind, PLUMB_DIST_NORMAL);
    assert_rel(u1->param[0], 8.0, 1e-15);
    assert_rel(u1->param[1], 2.0, 1e-15);
    const plumb_zone_spec *z = plumb_profile_zone(p);
    assert_int_equal(z->samples, 100000);
    assert_int_equal(z->seed, 7);
    assert_rel(z->confidence, 0.999, 1e-15);
    assert_rel(z->scatter_m, 2.0, 1e-15);
    assert_int_equal(z->has_target, 0);
    plumb_profile_free(p);
}

static void test_sha256_is_of_the_file_bytes(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(full_example, NULL, 0);
    char want[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(full_example, strlen(full_example), want);
    assert_string_equal(plumb_profile_sha256(p), want);
    assert_int_equal(strlen(plumb_profile_sha256(p)), 64);
    assert_int_equal(strspn(plumb_profile_sha256(p), "0123456789abcdef"), 64);
    plumb_profile_free(p);
}

static void test_name_defaults_to_the_file_stem(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD, NULL, 0);
    const char *path = plumb_profile_path(p);
    const char *base = strrchr(path, '/') + 1;
    size_t n = strlen(base) - strlen(".yaml");
    assert_int_equal(strlen(plumb_profile_name(p)), n);
    assert_memory_equal(plumb_profile_name(p), base, n);
    assert_string_equal(plumb_profile_item(p, 0)->name, plumb_profile_name(p));
    plumb_profile_free(p);
}

static void test_defaults_fill_site_air_wind_and_zone(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD, NULL, 0);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_abs(s->site_elevation_m, 0.0, 0.0);
    assert_int_equal(s->gravity.has_latitude, 0);
    assert_int_equal(s->n_descent, 0);
    assert_int_equal(s->wind.profile, PLUMB_WIND_UNIFORM);
    assert_abs(s->wind.speed_m_s, 0.0, 0.0);
    /* wind.h defaults: reference 10 m, exponent 1/7, z0 0.03 m */
    assert_rel(s->wind.ref_height_m, 10.0, 1e-15);
    assert_rel(s->wind.exponent, 1.0 / 7.0, 1e-15);
    assert_rel(s->wind.roughness_m, 0.03, 1e-15);
    const plumb_atm_spec *a = plumb_profile_atmosphere(p);
    assert_int_equal(a->model, PLUMB_ATM_STD1976);
    assert_abs(a->temperature_offset_k, 0.0, 0.0);
    assert_int_equal(plumb_profile_criteria_count(p), 0);
    assert_null(plumb_profile_criterion(p, 0));
    assert_int_equal(plumb_profile_uncertainty_count(p), 0);
    assert_null(plumb_profile_uncertainty(p, 0));
    const plumb_zone_spec *z = plumb_profile_zone(p);
    /* README "Profile keys": samples 100000, seed 1, confidence 0.99, scatter 0 m */
    assert_int_equal(z->samples, 100000);
    assert_int_equal(z->seed, 1);
    assert_rel(z->confidence, 0.99, 1e-15);
    assert_abs(z->scatter_m, 0.0, 0.0);
    plumb_profile_free(p);
}

static void test_speed_and_heading_become_east_and_north_components(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(PAYLOAD "release:\n  height: 27.4 m\n  velocity: {speed: 6.85 m/s, "
                                       "heading: 237.5 deg, climb: -0.45 m/s}\n",
                               NULL, 0);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    double h = 237.5 * PLUMB_PI / 180.0;
    assert_abs(s->velocity_m_s[0], 6.85 * sin(h), 1e-12);
    assert_abs(s->velocity_m_s[1], 6.85 * cos(h), 1e-12);
    assert_rel(s->velocity_m_s[2], -0.45, 1e-15);
    /* south-west-ish: both components negative */
    assert_true(s->velocity_m_s[0] < 0.0 && s->velocity_m_s[1] < 0.0);
    plumb_profile_free(p);
}

static void test_feet_and_degrees_celsius_are_converted_to_si(void **state)
{
    (void)state;
    plumb_profile *p =
        load_ok(PAYLOAD "release:\n  height: 98.4 ft\nsite:\n  elevation: 1234 m\n"
                        "atmosphere: {model: surface, pressure: 87.6 kPa, temperature: 12.5 degC}\n",
                NULL, 0);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_rel(s->release_m[2], 98.4 * 0.3048, 1e-14);
    const plumb_atm_spec *a = plumb_profile_atmosphere(p);
    assert_int_equal(a->model, PLUMB_ATM_SURFACE);
    assert_rel(a->station_alt_m, 1234.0, 1e-15);
    assert_rel(a->station_pressure_pa, 87600.0, 1e-14);
    assert_rel(a->station_temperature_k, 12.5 + 273.15, 1e-14);
    /* default lapse 6.5 K/km (README.md "Profile keys"), that of the 1976
     * troposphere (U.S. Standard Atmosphere 1976, Table 4, layer 0) */
    assert_rel(a->lapse_rate_k_m, 0.0065, 1e-12);
    plumb_profile_free(p);
}

static void test_wind_table_rows_become_east_and_north_components(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD "wind:\n  profile: table\n  table:\n"
                                    "    - {height: 0 m, speed: 4.1 m/s, from: 270 deg}\n"
                                    "    - {height: 25 m, speed: 7.3 m/s, from: 200 deg}\n",
                               NULL, 0);
    const plumb_wind_spec *w = &plumb_profile_item(p, 0)->wind;
    assert_int_equal(w->profile, PLUMB_WIND_TABLE);
    assert_int_equal(w->table_n, 2);
    assert_abs(w->table_h_m[0], 0.0, 0.0);
    assert_rel(w->table_h_m[1], 25.0, 1e-15);
    /* from 270 deg (west): blows toward the east */
    assert_rel(w->table_east_m_s[0], 4.1, 1e-12);
    assert_abs(w->table_north_m_s[0], 0.0, 1e-12);
    double f = 200.0 * PLUMB_PI / 180.0;
    assert_abs(w->table_east_m_s[1], -7.3 * sin(f), 1e-12);
    assert_abs(w->table_north_m_s[1], -7.3 * cos(f), 1e-12);
    plumb_profile_free(p);
}

/* A canopy type fills j, n and C_x from the table (Knacke 1991, from
 * memory: plumb/inflation.h) unless the profile gives them. */
static void test_canopy_type_supplies_exponent_fill_constant_and_opening_factor(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD "descent:\n  - {kind: drogue, cd: 0.55, area: 0.21 m^2, "
                                    "deploy: {after: 0.3 s}, canopy: ribbon}\n"
                                    "  - {cd: 0.78, diameter: 1.37 m, deploy: {below: 15.6 m}, "
                                    "canopy: extended-skirt, inflation_exponent: 2.5, "
                                    "opening_factor: 1.55, fill_time: 0.9 s}\n",
                               NULL, 0);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_int_equal(s->descent[0].canopy, PLUMB_CANOPY_RIBBON);
    assert_abs(s->descent[0].inflation_exponent, 1.0, 0.0);
    assert_abs(s->descent[0].fill_constant, 12.0, 0.0);
    assert_abs(s->descent[0].opening_factor, 1.05, 0.0);
    assert_int_equal(s->descent[1].canopy, PLUMB_CANOPY_EXTENDED_SKIRT);
    assert_abs(s->descent[1].inflation_exponent, 2.5, 0.0);
    assert_abs(s->descent[1].opening_factor, 1.55, 0.0);
    assert_abs(s->descent[1].fill_constant, 0.0, 0.0);
    assert_abs(s->descent[1].fill_time_s, 0.9, 0.0);
    plumb_profile_free(p);
}

/* payload.glide auto: a plate, or a thin box, glides in the regime its I*
 * gives (plumb/glide.h); a thick box does not; words force it. */
static void test_plates_and_thin_boxes_glide_by_default(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(
        "items:\n"
        "  - name: steel plate\n    mass: 3.2 kg\n"
        "    shape: {kind: plate, edges: [0.6 m, 0.4 m], thickness: 0.0017 m}\n"
        "  - name: ply sheet\n    mass: 0.9 kg\n    shape: {kind: box, edges: [0.3 m, 0.012 m, 0.5 m]}\n"
        "  - name: brick\n    mass: 2.1 kg\n    shape: {kind: box, edges: [0.2 m, 0.1 m, 0.065 m]}\n"
        "  - name: tile\n    mass: 2.1 kg\n    shape: {kind: box, edges: [0.2 m, 0.1 m, 0.065 m]}\n"
        "    glide: flutter\n"
        "  - name: card\n    mass: 0.01 kg\n"
        "    shape: {kind: plate, edges: [0.1 m, 0.1 m], thickness: 0.0003 m}\n    glide: off\n"
        RELEASE, NULL, 0);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_int_equal(s->glide.mode, PLUMB_GLIDE_TUMBLE);
    assert_rel(s->glide.istar, 3.2 / (0.6 * 0.4) / (1.225 * 0.4), 1e-12);
    assert_int_equal(s->glide.from_shape, 1);
    s = plumb_profile_item(p, 1);
    assert_int_equal(s->glide.mode, PLUMB_GLIDE_TUMBLE);
    assert_rel(s->glide.istar, 0.9 / (0.3 * 0.5) / (1.225 * 0.3), 1e-12);
    assert_int_equal(plumb_profile_item(p, 2)->glide.mode, PLUMB_GLIDE_OFF);
    assert_int_equal(plumb_profile_item(p, 3)->glide.mode, PLUMB_GLIDE_FLUTTER);
    assert_int_equal(plumb_profile_item(p, 4)->glide.mode, PLUMB_GLIDE_OFF);
    plumb_profile_free(p);
}

/* wind.turbulence: model word, intensity words as W20 15/30/45 kn
 * (MIL-F-8785C), or W20 from the mean wind at 20 ft. */
static void test_turbulence_reads_model_and_intensity(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD "wind:\n  speed: 6 m/s\n  turbulence: {model: von-karman, "
                                    "intensity: severe}\n", NULL, 0);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_int_equal(s->turbulence.model, PLUMB_TURB_VON_KARMAN);
    assert_rel(s->turbulence.w20_m_s, 45.0 * 1852.0 / 3600.0, 1e-15);
    assert_int_equal(s->turbulence.n_modes, 0);
    plumb_profile_free(p);
    p = load_ok(GOOD "wind:\n  profile: power\n  speed: 6 m/s\n  turbulence: {}\n", NULL, 0);
    s = plumb_profile_item(p, 0);
    assert_int_equal(s->turbulence.model, PLUMB_TURB_DRYDEN);
    assert_int_equal(s->turbulence.from_wind, 1);
    assert_rel(plumb_fall_w20(s), 6.0 * pow(6.096 / 10.0, 1.0 / 7.0), 1e-12);
    plumb_profile_free(p);
}

static void test_descent_diameter_gives_the_nominal_area(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD "descent:\n  - {kind: drogue, cd: 0.55, diameter: 0.42 m, "
                                    "deploy: {after: 0.3 s}, fill_constant: 6.5}\n"
                                    "  - {cd: 0.78, diameter: 1.37 m, deploy: {below: 15.6 m}}\n",
                               NULL, 0);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_int_equal(s->n_descent, 2);
    assert_int_equal(s->descent[0].kind, PLUMB_DESCENT_DROGUE);
    assert_rel(s->descent[0].diameter_m, 0.42, 1e-15);
    assert_rel(s->descent[0].area_m2, PLUMB_PI * 0.42 * 0.42 / 4.0, 1e-15);
    assert_rel(s->descent[0].fill_constant, 6.5, 1e-15);
    assert_int_equal(s->descent[0].disreefs_previous, 0);
    assert_rel(s->descent[1].area_m2, PLUMB_PI * 1.37 * 1.37 / 4.0, 1e-15);
    assert_int_equal(s->descent[1].trigger, PLUMB_DEPLOY_BELOW);
    assert_rel(s->descent[1].deploy_value, 15.6, 1e-15);
    /* a main after a drogue replaces it */
    assert_int_equal(s->descent[1].disreefs_previous, 1);
    plumb_profile_free(p);
}

static void test_sphere_model_takes_its_area_from_the_diameter(void **state)
{
    (void)state;
    plumb_profile *p = load_ok("payload:\n  mass: 0.046 kg\n  drag: {model: sphere-cgw, diameter: "
                               "42.7 mm}\n" RELEASE,
                               NULL, 0);
    const plumb_drag_spec *d = &plumb_profile_item(p, 0)->drag;
    assert_int_equal(d->model, PLUMB_DRAG_SPHERE_CGW);
    assert_rel(d->diameter_m, 0.0427, 1e-14);
    assert_rel(d->area_m2, PLUMB_PI * 0.0427 * 0.0427 / 4.0, 1e-14);
    plumb_profile_free(p);
}

static void test_cd_of_zero_is_allowed_as_drag_free(void **state)
{
    (void)state;
    plumb_profile *p =
        load_ok("payload:\n  mass: 2.385 kg\n  drag: {cd: 0, area: 0.0217 m^2}\n" RELEASE, NULL, 0);
    assert_abs(plumb_profile_item(p, 0)->drag.cd, 0.0, 0.0);
    plumb_profile_free(p);
}

static void test_cd_area_alone_is_kept_with_zero_reference_area(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(
        "payload:\n  mass: 2.385 kg\n  drag: {cd_area: 0.0193 m^2, source: wind-tunnel run 14}\n" RELEASE,
        NULL, 0);
    const plumb_drag_spec *d = &plumb_profile_item(p, 0)->drag;
    assert_rel(d->cd_area_m2, 0.0193, 1e-15);
    assert_abs(d->area_m2, 0.0, 0.0);
    assert_string_equal(d->source, "wind-tunnel run 14");
    plumb_profile_free(p);
}

static void test_shape_dimensions_reach_the_drag_module_in_order(void **state)
{
    (void)state;
    plumb_profile *p = load_ok("payload:\n  mass: 2.385 kg\n  shape: {kind: cylinder, length: 0.6 m, "
                               "diameter: 35 mm, attitude: broadside}\n" RELEASE,
                               NULL, 0);
    const plumb_shape_spec *sh = plumb_profile_item_shape(p, 0);
    assert_int_equal(sh->kind, PLUMB_SHAPE_CYLINDER);
    assert_rel(sh->dims_m[0], 0.6, 1e-15);
    assert_rel(sh->dims_m[1], 0.035, 1e-14);
    assert_int_equal(sh->attitude, PLUMB_ATTITUDE_BROADSIDE);
    plumb_drag_spec want;
    assert_int_equal(plumb_drag_from_shape(sh, &want), PLUMB_OK);
    const plumb_drag_spec *got = &plumb_profile_item(p, 0)->drag;
    assert_rel(got->cd, want.cd, 1e-15);
    assert_rel(got->area_m2, want.area_m2, 1e-15);
    assert_string_equal(got->source, want.source);
    plumb_profile_free(p);

    p = load_ok("payload:\n  mass: 2.385 kg\n  shape: {kind: plate, edges: [0.31 m, 0.22 m], "
                "thickness: 4 mm}\n" RELEASE,
                NULL, 0);
    sh = plumb_profile_item_shape(p, 0);
    assert_int_equal(sh->kind, PLUMB_SHAPE_PLATE);
    assert_rel(sh->dims_m[0], 0.31, 1e-15);
    assert_rel(sh->dims_m[1], 0.22, 1e-15);
    assert_rel(sh->dims_m[2], 0.004, 1e-14);
    assert_int_equal(sh->attitude, PLUMB_ATTITUDE_TUMBLING);
    plumb_profile_free(p);
}

static void test_inventory_items_share_release_and_keep_their_own_descent(void **state)
{
    (void)state;
    plumb_profile *p = load_ok("name: Tool belt\nitems:\n" ITEM("spanner", "0.43 kg")
                               "  - name: drone pack\n    mass: 1.96 kg\n    drag: {cd: 1.05, area: 0.03 m^2}\n"
                               "    descent: {cd: 0.8, area: 0.9 m^2, deploy: {after: 0.7 s}}\n"
                               ITEM("bolt box", "3.2 kg")
                               "descent: {kind: streamer, cd: 0.3, area: 0.05 m^2, deploy: {after: 0 s}}\n"
                               "release:\n  height: 41.3 m\n  position: {east: 2.5 m, north: -1.25 m}\n",
                               NULL, 0);
    assert_int_equal(plumb_profile_is_inventory(p), 1);
    assert_int_equal(plumb_profile_item_count(p), 3);
    assert_string_equal(plumb_profile_name(p), "Tool belt");
    static const char *const names[] = {"spanner", "drone pack", "bolt box"};
    static const double masses[] = {0.43, 1.96, 3.2};
    for (size_t i = 0; i < 3; i++) {
        const plumb_fall_spec *s = plumb_profile_item(p, i);
        assert_string_equal(s->name, names[i]);
        assert_rel(s->mass_kg, masses[i], 1e-15);
        assert_rel(s->release_m[0], 2.5, 1e-15);
        assert_rel(s->release_m[1], -1.25, 1e-15);
        assert_rel(s->release_m[2], 41.3, 1e-15);
        assert_int_equal(s->n_descent, 1);
        assert_int_equal(s->descent[0].kind,
                         i == 1 ? PLUMB_DESCENT_PARACHUTE : PLUMB_DESCENT_STREAMER);
    }
    assert_null(plumb_profile_item(p, 3));
    assert_null(plumb_profile_item_shape(p, 3));
    plumb_profile_free(p);
}

static void test_atmosphere_table_is_copied_into_the_profile(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD "site: {elevation: 120 m}\natmosphere:\n  model: table\n"
                                    "  humidity: 0.35\n  table:\n"
                                    "    - {altitude: 100 m, density: 1.213 kg/m^3}\n"
                                    "    - {altitude: 150 m, density: 1.207 kg/m^3}\n"
                                    "    - {altitude: 200 m, density: 1.201 kg/m^3}\n",
                               NULL, 0);
    const plumb_atm_spec *a = plumb_profile_atmosphere(p);
    assert_int_equal(a->model, PLUMB_ATM_TABLE);
    assert_int_equal(a->table_n, 3);
    assert_rel(a->table_alt_m[1], 150.0, 1e-15);
    assert_rel(a->table_rho_kg_m3[2], 1.201, 1e-15);
    assert_null(a->table_t_k);
    assert_rel(a->relative_humidity, 0.35, 1e-15);
    plumb_profile_free(p);
}

static void test_plus_minus_tolerances_become_uniform_bounds(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(GOOD "wind: {speed: 6 m/s, from: 250 deg}\nuncertainty:\n"
                                    "  wind.from: \"250 deg +- 25 deg\"\n"
                                    "  wind.speed: \"6 m/s \xc2\xb1 1.5 m/s\"\n"
                                    "  payload.mass: {triangular: [2.2 kg, 2.385 kg, 2.5 kg]}\n"
                                    "  release.velocity.heading: \"110 deg +- 30 deg\"\n",
                               NULL, 0);
    assert_int_equal(plumb_profile_uncertainty_count(p), 4);
    const plumb_uncertainty *u = plumb_profile_uncertainty(p, 0);
    assert_int_equal(u->kind, PLUMB_DIST_UNIFORM);
    assert_rel(u->param[0], 225.0, 1e-15);
    assert_rel(u->param[1], 275.0, 1e-15);
    u = plumb_profile_uncertainty(p, 1);
    assert_int_equal(u->kind, PLUMB_DIST_UNIFORM);
    assert_rel(u->param[0], 4.5, 1e-15);
    assert_rel(u->param[1], 7.5, 1e-15);
    u = plumb_profile_uncertainty(p, 2);
    assert_int_equal(u->kind, PLUMB_DIST_TRIANGULAR);
    assert_rel(u->param[1], 2.385, 1e-15);
    u = plumb_profile_uncertainty(p, 3);
    assert_string_equal(u->key, "release.velocity.heading");
    plumb_profile_free(p);
}

/* ---- overrides and derive ---------------------------------------------- */

static void test_override_replaces_a_value_in_its_own_units(void **state)
{
    (void)state;
    const char *sets[] = {"release.height=98.4 ft", "payload.drag.cd=1.17"};
    plumb_profile *p = load_ok(GOOD, sets, 2);
    assert_rel(plumb_profile_item(p, 0)->release_m[2], 98.4 * 0.3048, 1e-14);
    assert_rel(plumb_profile_item(p, 0)->drag.cd, 1.17, 1e-15);
    plumb_profile_free(p);
}

static void test_override_inserts_a_missing_map(void **state)
{
    (void)state;
    const char *sets[] = {"site.latitude=47.3 deg", "zone.target.east=-4 m",
                          "zone.target.north=2.5 m"};
    plumb_profile *p = load_ok(GOOD, sets, 3);
    assert_int_equal(plumb_profile_item(p, 0)->gravity.has_latitude, 1);
    assert_rel(plumb_profile_item(p, 0)->gravity.latitude_deg, 47.3, 1e-15);
    assert_int_equal(plumb_profile_zone(p)->has_target, 1);
    assert_rel(plumb_profile_zone(p)->target_m[0], -4.0, 1e-15);
    assert_rel(plumb_profile_zone(p)->target_m[1], 2.5, 1e-15);
    plumb_profile_free(p);
}

static void test_override_with_null_removes_a_key(void **state)
{
    (void)state;
    const char *sets[] = {"payload.drag=~",
                          "payload.shape={kind: sphere, diameter: 0.11 m}"};
    plumb_profile *p = load_ok(GOOD, sets, 2);
    assert_int_equal(plumb_profile_item_shape(p, 0)->kind, PLUMB_SHAPE_SPHERE);
    plumb_profile_free(p);
}

static void test_override_appends_a_second_descent_device(void **state)
{
    (void)state;
    const char *sets[] = {"descent[1]={cd: 0.82, area: 6.3 m^2, deploy: {below: 12 m}}",
                          "descent[0].cd=0.61"};
    plumb_profile *p = load_ok(
        GOOD "descent: {kind: drogue, cd: 0.55, area: 0.2 m^2, deploy: {after: 0.4 s}}\n", sets, 2);
    const plumb_fall_spec *s = plumb_profile_item(p, 0);
    assert_int_equal(s->n_descent, 2);
    assert_rel(s->descent[0].cd, 0.61, 1e-15);
    assert_rel(s->descent[1].area_m2, 6.3, 1e-15);
    assert_int_equal(s->descent[1].disreefs_previous, 1);
    plumb_profile_free(p);
}

static void test_override_adds_an_uncertainty_entry(void **state)
{
    (void)state;
    const char *sets[] = {"uncertainty.payload.mass={normal: [2.385 kg, 0.05 kg]}"};
    plumb_profile *p = load_ok(GOOD, sets, 1);
    assert_int_equal(plumb_profile_uncertainty_count(p), 1);
    assert_string_equal(plumb_profile_uncertainty(p, 0)->key, "payload.mass");
    assert_rel(plumb_profile_uncertainty(p, 0)->param[1], 0.05, 1e-15);
    plumb_profile_free(p);
}

/* Where an entry was given, for the sampler's messages (an error is
 * named where it can be corrected): the file's
 * at its key; one a --set adds at its key in that --set (line = which
 * --set, column in it); one whose value a --set gives again at that value. */
static void test_uncertainty_entries_know_where_they_were_given(void **state)
{
    (void)state;
    const char *text = GOOD "uncertainty:\n  payload.mass: {normal: [2.385 kg, 0.05 kg]}\n"
                            "  payload.drag.cd: {uniform: [0.8, 1.0]}\n";
    const char *sets[] = {"release.height=31.6 m", "uncertainty.payload.drag.cd={uniform: [0.85, 1.0]}",
                          "uncertainty.release.velocity.east={normal: [0 m/s, 0.4 m/s]}"};
    plumb_profile *p = load_ok(text, sets, 3);
    assert_int_equal(plumb_profile_uncertainty_count(p), 3);
    const plumb_uncertainty *mass = plumb_profile_uncertainty(p, 0);
    assert_string_equal(mass->key, "payload.mass");
    assert_int_equal(mass->from_set, 0);
    assert_int_equal(mass->line, line_of(text, "  payload.mass:"));
    assert_int_equal(mass->col, 3);
    const plumb_uncertainty *cd = plumb_profile_uncertainty(p, 1);
    assert_string_equal(cd->key, "payload.drag.cd");
    assert_rel(cd->param[0], 0.85, 1e-15);
    assert_int_equal(cd->from_set, 1);
    assert_int_equal(cd->line, 2);
    assert_int_equal(cd->col, (int)strlen("uncertainty.payload.drag.cd=") + 1);
    const plumb_uncertainty *east = plumb_profile_uncertainty(p, 2);
    assert_string_equal(east->key, "release.velocity.east");
    assert_int_equal(east->from_set, 1);
    assert_int_equal(east->line, 3);
    assert_int_equal(east->col, (int)strlen("uncertainty.") + 1);
    plumb_profile_free(p);
}

/* Where a key's value was given: the file or the --set, line and column;
 * nothing for a default or an unknown key. */
static void test_key_origin_names_the_file_or_the_set(void **state)
{
    (void)state;
    const char *text = GOOD "zone:\n  samples: 5000\n";
    const char *sets[] = {"zone.seed=17", "release.height=31.6 m"};
    plumb_profile *p = load_ok(text, sets, 2);
    int line, col;
    const char *file = plumb_profile_key_origin(p, "zone.samples", &line, &col);
    assert_non_null(file);
    assert_string_equal(file, plumb_profile_path(p));
    assert_int_equal(line, line_of(text, "  samples:"));
    assert_int_equal(col, 12);
    file = plumb_profile_key_origin(p, "zone.seed", &line, &col);
    assert_non_null(file);
    assert_string_equal(file, "--set");
    assert_int_equal(line, 1);
    assert_int_equal(col, (int)strlen("zone.seed=") + 1);
    file = plumb_profile_key_origin(p, "release.height", &line, &col);
    assert_non_null(file);
    assert_string_equal(file, "--set");
    assert_int_equal(line, 2);
    assert_int_equal(col, (int)strlen("release.height=") + 1);
    file = plumb_profile_key_origin(p, "payload.mass", &line, &col);
    assert_non_null(file);
    assert_string_equal(file, plumb_profile_path(p));
    assert_int_equal(line, line_of(text, "  mass:"));
    assert_int_equal(col, 9);
    /* a default, an unknown key, no profile */
    assert_null(plumb_profile_key_origin(p, "zone.confidence", &line, &col));
    assert_int_equal(line, 0);
    assert_int_equal(col, 0);
    assert_null(plumb_profile_key_origin(p, "zone.sampels", &line, &col));
    assert_null(plumb_profile_key_origin(NULL, "zone.samples", &line, &col));
    plumb_profile_free(p);
}

static void test_derive_applies_overrides_without_reading_the_file(void **state)
{
    (void)state;
    plumb_profile *base = load_ok(GOOD, NULL, 0);
    assert_int_equal(unlink(plumb_profile_path(base)), 0);
    const char *sets[] = {"release.height=15.2 m", "payload.mass=1.75 kg"};
    plumb_profile *d1;
    plumb_diag d;
    assert_int_equal(plumb_profile_derive(base, units, sets, 2, &d1, &d), PLUMB_OK);
    assert_rel(plumb_profile_item(d1, 0)->release_m[2], 15.2, 1e-15);
    assert_rel(plumb_profile_item(d1, 0)->mass_kg, 1.75, 1e-15);
    assert_rel(plumb_profile_item(base, 0)->release_m[2], 27.4, 1e-15);
    assert_string_equal(plumb_profile_sha256(d1), plumb_profile_sha256(base));
    assert_string_equal(plumb_profile_path(d1), plumb_profile_path(base));
    /* a derived profile can be derived again */
    const char *more[] = {"release.height=9.1 m"};
    plumb_profile *d2;
    assert_int_equal(plumb_profile_derive(d1, units, more, 1, &d2, &d), PLUMB_OK);
    assert_rel(plumb_profile_item(d2, 0)->release_m[2], 9.1, 1e-15);
    assert_rel(plumb_profile_item(d2, 0)->mass_kg, 1.75, 1e-15);
    /* and a bad override is located in --set */
    const char *bad[] = {"release.height=-3 m"};
    plumb_profile *d3 = (plumb_profile *)(uintptr_t)1;
    assert_int_equal(plumb_profile_derive(base, units, bad, 1, &d3, &d), PLUMB_ERANGE);
    assert_null(d3);
    assert_string_equal(d.file, "--set");
    assert_int_equal(d.col, 16);
    assert_string_equal(d.key, "release.height");
    plumb_profile_free(d2);
    plumb_profile_free(d1);
    plumb_profile_free(base);
}

/* ---- key dimensions and spec fields ------------------------------------ */

static void test_key_dim_gives_the_dimension_of_numeric_keys(void **state)
{
    (void)state;
    static const struct {
        const char *key;
        plumb_dim dim;
    } cases[] = {
        {"release.height", PLUMB_DIM_LENGTH},
        {"payload.mass", PLUMB_DIM_MASS},
        {"items[3].mass", PLUMB_DIM_MASS},
        {"items[box of M12 bolts].mass", PLUMB_DIM_MASS},
        {"payload.drag.cd", PLUMB_DIM_NONE},
        {"descent.deploy.after", PLUMB_DIM_TIME},
        {"descent[1].area", PLUMB_DIM_AREA},
        {"atmosphere.table[0].density", PLUMB_DIM_DENSITY},
        {"atmosphere.temperature_offset", PLUMB_DIM_TEMP_DIFF},
        {"atmosphere.lapse_rate", PLUMB_DIM_LAPSE},
        {"payload.shape.edges[2]", PLUMB_DIM_LENGTH},
        {"wind.from", PLUMB_DIM_ANGLE},
        {"release.velocity.speed", PLUMB_DIM_SPEED},
        {"zone.confidence", PLUMB_DIM_FRACTION},
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        plumb_dim dim = PLUMB_DIM_COUNT;
        plumb_diag d;
        assert_int_equal(plumb_profile_key_dim(cases[i].key, &dim, &d), PLUMB_OK);
        assert_int_equal(dim, cases[i].dim);
    }
}

static void test_key_dim_refuses_unknown_and_non_numeric_keys(void **state)
{
    (void)state;
    plumb_dim dim;
    plumb_diag d;
    assert_int_equal(plumb_profile_key_dim("release.hieght", &dim, &d), PLUMB_EKEY);
    assert_non_null(strstr(d.message, "did you mean 'release.height'"));
    assert_string_equal(d.key, "release.hieght");
    assert_int_equal(plumb_profile_key_dim("wind.profile", &dim, &d), PLUMB_EINVAL);
    assert_string_equal(d.key, "wind.profile");
    assert_int_equal(plumb_profile_key_dim("payload", &dim, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_profile_key_dim("payload.shape.edges", &dim, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_profile_key_dim("uncertainty.wind.speed", &dim, &d), PLUMB_EINVAL);
    assert_int_equal(plumb_profile_key_dim("", &dim, &d), PLUMB_EPARSE);
    assert_int_equal(plumb_profile_key_dim("items.mass", &dim, &d), PLUMB_EPARSE);
    assert_non_null(strstr(d.message, "e.g. items[1].mass"));
    assert_int_equal(plumb_profile_key_dim("items[0].mass", &dim, &d), PLUMB_ERANGE);
    assert_non_null(strstr(d.message, "numbered from 1"));
    assert_int_equal(plumb_profile_key_dim("items[].mass", &dim, &d), PLUMB_EPARSE);
    char long_name[200] = "items[";
    memset(long_name + 6, 'x', 140); /* a 140-character name */
    strcpy(long_name + 146, "].mass");
    assert_int_equal(plumb_profile_key_dim(long_name, &dim, &d), PLUMB_ERANGE);
    assert_non_null(strstr(d.message, "at most 127 characters"));
    assert_int_equal(plumb_profile_key_dim(NULL, &dim, &d), PLUMB_EINVAL);
}

static void test_fall_spec_field_points_at_the_double_a_key_sets(void **state)
{
    (void)state;
    plumb_profile *p = load_ok(
        GOOD "descent: {cd: 0.8, area: 1.2 m^2, deploy: {after: 1.5 s}, fill_time: 0.6 s}\n"
             "wind: {profile: power, speed: 7 m/s, from: 10 deg}\n",
        NULL, 0);
    plumb_fall_spec s = *plumb_profile_item(p, 0);
    assert_ptr_equal(plumb_fall_spec_field(&s, "payload.mass"), &s.mass_kg);
    assert_ptr_equal(plumb_fall_spec_field(&s, "payload.volume"), &s.volume_m3);
    assert_ptr_equal(plumb_fall_spec_field(&s, "payload.drag.cd"), &s.drag.cd);
    assert_ptr_equal(plumb_fall_spec_field(&s, "payload.drag.area"), &s.drag.area_m2);
    assert_ptr_equal(plumb_fall_spec_field(&s, "release.height"), &s.release_m[2]);
    assert_ptr_equal(plumb_fall_spec_field(&s, "release.position.east"), &s.release_m[0]);
    assert_ptr_equal(plumb_fall_spec_field(&s, "release.position.north"), &s.release_m[1]);
    assert_ptr_equal(plumb_fall_spec_field(&s, "release.velocity.north"), &s.velocity_m_s[1]);
    assert_ptr_equal(plumb_fall_spec_field(&s, "release.velocity.up"), &s.velocity_m_s[2]);
    assert_ptr_equal(plumb_fall_spec_field(&s, "site.elevation"), &s.site_elevation_m);
    assert_ptr_equal(plumb_fall_spec_field(&s, "wind.speed"), &s.wind.speed_m_s);
    assert_ptr_equal(plumb_fall_spec_field(&s, "wind.from"), &s.wind.from_deg);
    assert_ptr_equal(plumb_fall_spec_field(&s, "wind.exponent"), &s.wind.exponent);
    assert_ptr_equal(plumb_fall_spec_field(&s, "descent.area"), &s.descent[0].area_m2);
    assert_ptr_equal(plumb_fall_spec_field(&s, "descent[0].cd"), &s.descent[0].cd);
    assert_ptr_equal(plumb_fall_spec_field(&s, "descent.deploy.after"), &s.descent[0].deploy_value);
    assert_ptr_equal(plumb_fall_spec_field(&s, "descent.fill_time"), &s.descent[0].fill_time_s);
    /* not single doubles of this spec, or not in effect */
    assert_null(plumb_fall_spec_field(&s, "release.velocity.speed"));
    assert_null(plumb_fall_spec_field(&s, "release.velocity.heading"));
    assert_null(plumb_fall_spec_field(&s, "payload.drag.cd_area"));
    assert_null(plumb_fall_spec_field(&s, "descent[1].cd"));
    assert_null(plumb_fall_spec_field(&s, "descent.deploy.below"));
    assert_null(plumb_fall_spec_field(&s, "descent.fill_constant"));
    assert_null(plumb_fall_spec_field(&s, "descent.diameter"));
    assert_null(plumb_fall_spec_field(&s, "site.latitude"));
    assert_null(plumb_fall_spec_field(&s, "wind.roughness"));
    assert_null(plumb_fall_spec_field(&s, "wind.profile"));
    assert_null(plumb_fall_spec_field(&s, "zone.samples"));
    assert_null(plumb_fall_spec_field(&s, "atmosphere.temperature_offset"));
    assert_null(plumb_fall_spec_field(&s, "payload.shape.length"));
    assert_null(plumb_fall_spec_field(&s, "no.such.key"));
    assert_null(plumb_fall_spec_field(NULL, "payload.mass"));
    assert_null(plumb_fall_spec_field(&s, NULL));
    /* writing through it changes the copy only */
    *plumb_fall_spec_field(&s, "payload.mass") = 3.125;
    assert_rel(s.mass_kg, 3.125, 0.0);
    assert_rel(plumb_profile_item(p, 0)->mass_kg, 2.385, 1e-15);
    plumb_profile_free(p);
}

static void test_accessors_accept_null(void **state)
{
    (void)state;
    plumb_profile_free(NULL);
    assert_null(plumb_profile_path(NULL));
    assert_null(plumb_profile_name(NULL));
    assert_null(plumb_profile_sha256(NULL));
    assert_int_equal(plumb_profile_is_inventory(NULL), 0);
    assert_int_equal(plumb_profile_item_count(NULL), 0);
    assert_null(plumb_profile_item(NULL, 0));
    assert_null(plumb_profile_item_shape(NULL, 0));
    assert_null(plumb_profile_atmosphere(NULL));
    assert_int_equal(plumb_profile_criteria_count(NULL), 0);
    assert_null(plumb_profile_criterion(NULL, 0));
    assert_int_equal(plumb_profile_uncertainty_count(NULL), 0);
    assert_null(plumb_profile_uncertainty(NULL, 0));
    assert_null(plumb_profile_zone(NULL));
}

/* ---- the project's profiles and tests/bad ------------------------------- */

static int has_suffix(const char *s, const char *suf)
{
    size_t n = strlen(s), m = strlen(suf);
    return n > m && strcmp(s + n - m, suf) == 0;
}

static void test_bundled_demo_and_payload_profiles_load(void **state)
{
    (void)state;
    static const char *const dirs[] = {"profiles/demo", "profiles/payloads"};
    size_t loaded = 0;
    for (size_t k = 0; k < 2; k++) {
        char dir[PATH_LEN];
        snprintf(dir, sizeof dir, "%s/%s", plumbt_srcdir(), dirs[k]);
        DIR *dp = opendir(dir);
        if (!dp)
            continue;
        const struct dirent *e;
        while ((e = readdir(dp)) != NULL) {
            if (!has_suffix(e->d_name, ".yaml"))
                continue;
            char path[PATH_LEN * 2];
            snprintf(path, sizeof path, "%s/%s", dir, e->d_name);
            plumb_profile *p;
            plumb_diag d;
            plumb_status st = plumb_profile_load(path, units, NULL, 0, &p, &d);
            if (st != PLUMB_OK) {
                char buf[1024];
                plumb_diag_format(&d, buf, sizeof buf);
                print_error("%s\n", buf);
            }
            assert_int_equal(st, PLUMB_OK);
            plumb_profile_free(p);
            loaded++;
        }
        closedir(dp);
    }
    if (loaded == 0)
        skip();
}

/* Parses "# expect: SUBSTRING @ LINE:COL key=KEY" from the first line. */
static int parse_expect(const char *text, char *sub, size_t size, int *line, int *col, char *key,
                        size_t ksize)
{
    const char *tag = "# expect: ";
    if (strncmp(text, tag, strlen(tag)) != 0)
        return 0;
    const char *s = text + strlen(tag);
    const char *eol = strchr(s, '\n');
    const char *at = NULL;
    if (!eol)
        return 0;
    for (const char *q = strstr(s, " @ "); q && q < eol; q = strstr(q + 1, " @ "))
        at = q;
    if (!at)
        return 0;
    size_t n = (size_t)(at - s);
    if (n >= size)
        return 0;
    memcpy(sub, s, n);
    sub[n] = '\0';
    const char *k = strstr(at, " key=");
    if (!k || k > eol || sscanf(at + 3, "%d:%d", line, col) != 2)
        return 0;
    k += 5;
    size_t kn = (size_t)(eol - k);
    if (kn >= ksize)
        return 0;
    memcpy(key, k, kn);
    key[kn] = '\0';
    return 1;
}

static void test_every_profile_in_tests_bad_fails_where_its_comment_says(void **state)
{
    (void)state;
    char dir[PATH_LEN];
    snprintf(dir, sizeof dir, "%s/tests/bad", plumbt_srcdir());
    DIR *dp = opendir(dir);
    if (!dp)
        skip();
    size_t checked = 0, failed = 0;
    const struct dirent *e;
    while ((e = readdir(dp)) != NULL) {
        if (!has_suffix(e->d_name, ".yaml"))
            continue;
        char path[PATH_LEN * 2];
        snprintf(path, sizeof path, "%s/%s", dir, e->d_name);
        FILE *f = fopen(path, "rb");
        assert_non_null(f);
        char head[1024];
        size_t n = fread(head, 1, sizeof head - 1, f);
        fclose(f);
        head[n] = '\0';
        char sub[512], key[PLUMB_DIAG_KEY];
        int line, col;
        if (!parse_expect(head, sub, sizeof sub, &line, &col, key, sizeof key)) {
            print_error("%s: first line is not '# expect: TEXT @ L:C key=KEY'\n", path);
            failed++;
            continue;
        }
        plumb_profile *p = (plumb_profile *)(uintptr_t)1;
        plumb_diag d;
        plumb_diag_clear(&d);
        plumb_status st = plumb_profile_load(path, units, NULL, 0, &p, &d);
        char buf[1024];
        plumb_diag_format(&d, buf, sizeof buf);
        if (st == PLUMB_OK || !plumb_status_is_input_error(st) || p || d.line != line ||
            d.col != col || strcmp(d.key, key) != 0 || !strstr(d.message, sub)) {
            print_error("%s: expected '%s' @ %d:%d key=%s\n  got: %s\n", e->d_name, sub, line, col,
                        key, buf);
            if (st == PLUMB_OK)
                plumb_profile_free(p);
            failed++;
        }
        checked++;
    }
    closedir(dp);
    assert_int_equal(failed, 0);
    print_message("    %zu malformed profiles checked\n", checked);
    assert_true(checked >= 30);
}

/* plumb lint's check (plumb_profile_lint_buffer): every error of a file,
 * in file order, each at its place; an error that only follows from one
 * set aside (a required key now missing) is not counted; a good profile
 * has none. (The invented profile's three mistakes: a unit in the wrong
 * case, a misspelt key, a humidity above 100 %.) */
static void test_lint_finds_every_error_in_file_order(void **state)
{
    (void)state;
    static const char text[] = "name: lint test\n"
                               "payload:\n"
                               "  mass: 2 Kg\n"
                               "  drag: {cd: 0.9, area: 0.004 m^2}\n"
                               "release:\n"
                               "  height: 30 m\n"
                               "wind:\n"
                               "  form: 270 deg\n"
                               "atmosphere:\n"
                               "  humidity: 150 %\n";
    plumb_diag errs[8];
    size_t n = 99;
    assert_int_not_equal(plumb_profile_lint_buffer("t.yaml", text, strlen(text), units, NULL, 0,
                                                   errs, 8, &n, NULL),
                         PLUMB_OK);
    assert_int_equal(n, 3);
    static const struct { const char *key; int line, col; } want[] = {
        {"payload.mass", 3, 9}, {"wind.form", 8, 3}, {"atmosphere.humidity", 10, 13}};
    for (size_t i = 0; i < 3; i++) {
        assert_string_equal(errs[i].key, want[i].key);
        assert_int_equal(errs[i].line, want[i].line);
        assert_int_equal(errs[i].col, want[i].col);
        assert_string_equal(errs[i].file, "t.yaml");
    }
    /* at most max */
    assert_int_not_equal(plumb_profile_lint_buffer("t.yaml", text, strlen(text), units, NULL, 0,
                                                   errs, 2, &n, NULL),
                         PLUMB_OK);
    assert_int_equal(n, 2);
    /* a good profile: none */
    static const char good[] = "payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.004 m^2}}\n"
                               "release: {height: 30 m}\n";
    plumb_profile *p = NULL;
    assert_int_equal(plumb_profile_lint_buffer("g.yaml", good, strlen(good), units, NULL, 0, errs,
                                               8, &n, &p),
                     PLUMB_OK);
    assert_int_equal(n, 0);
    assert_non_null(p); /* the profile that loaded, the caller's */
    assert_true(plumb_profile_item(p, 0)->mass_kg == 2.0);
    plumb_profile_free(p);
}

/* lint goes on past a refused required value (it gets a stand-in, not a
 * hole that the loader would report as a missing key), and does not list
 * what follows from an error already listed: the mass missing once its
 * misspelt key 'mas' is set aside, or a deploy height "not below" the
 * stand-in of a refused release height. Positions are those of the
 * values (keys for 'mas') in the text, counted from 1 as libyaml does. */
static void test_lint_goes_on_past_refused_required_values(void **state)
{
    (void)state;
    static const struct {
        const char *text;
        size_t n;
        struct { const char *key; int line, col; } want[4];
    } cases[] = {
        {"name: four\n"
         "payload:\n"
         "  mass: 1 m\n"
         "  drag: {cd: 0.5, area: 0.01}\n"
         "release:\n"
         "  height: -3 m\n"
         "wind: {speed: 5 kn, from: westerly}\n",
         4,
         {{"payload.mass", 3, 9}, {"payload.drag.area", 4, 25}, {"release.height", 6, 11},
          {"wind.from", 7, 27}}},
        {"name: typos\n"
         "payload:\n"
         "  mas: 1 kg\n"
         "  drag: {cd: -1, area: 0.01 m^2}\n"
         "release:\n"
         "  height: 120\n"
         "wind: {profile: powr, speed: 5 kn, from: 270 deg}\n",
         4,
         {{"payload.mas", 3, 3}, {"payload.drag.cd", 4, 14}, {"release.height", 6, 11},
          {"wind.profile", 7, 17}}},
        {"name: heigth\n"
         "payload: {mass: 1 kg, drag: {cd: 0.5, area: 0.01 m^2}}\n"
         "release:\n"
         "  heigth: 30 m\n",
         1,
         {{"release.heigth", 4, 3}}},
        {"payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.01 m^2}}\n"
         "descent: {kind: parachute, cd: 0.8, area: 1.2 m^2, deploy: {below: 60 m}}\n"
         "release: {height: -3 m}\n",
         1,
         {{"release.height", 3, 19}}},
    };
    for (size_t c = 0; c < sizeof cases / sizeof cases[0]; c++) {
        plumb_diag errs[16];
        size_t n = 99;
        plumb_profile *p = NULL;
        assert_int_not_equal(plumb_profile_lint_buffer("t.yaml", cases[c].text,
                                                       strlen(cases[c].text), units, NULL, 0,
                                                       errs, 16, &n, &p),
                             PLUMB_OK);
        assert_null(p);
        assert_int_equal(n, cases[c].n);
        for (size_t i = 0; i < n; i++) {
            assert_string_equal(errs[i].key, cases[c].want[i].key);
            assert_int_equal(errs[i].line, cases[c].want[i].line);
            assert_int_equal(errs[i].col, cases[c].want[i].col);
            assert_string_equal(errs[i].file, "t.yaml");
        }
        /* plumb fall's loader: the first in file order, alone: the
         * lint's first, though the loader may meet another first (README.md
         * "Exit status": the first error of the file is told) */
        plumb_diag d;
        plumb_diag_clear(&d);
        assert_int_not_equal(plumb_profile_load_buffer("t.yaml", cases[c].text,
                                                       strlen(cases[c].text), units, NULL, 0, &p,
                                                       &d),
                             PLUMB_OK);
        assert_null(p);
        assert_string_equal(d.key, errs[0].key);
        assert_int_equal(d.line, errs[0].line);
        assert_int_equal(d.col, errs[0].col);
        assert_string_equal(d.message, errs[0].message);
    }
}

int main(void)
{
    enum { N_BAD = sizeof bad_cases / sizeof bad_cases[0] };
    static const struct CMUnitTest fixed[] = {
        cmocka_unit_test(test_missing_file_is_an_input_output_error),
        cmocka_unit_test(test_directory_is_refused),
        cmocka_unit_test(test_file_that_opens_but_cannot_be_read_is_refused),
        cmocka_unit_test(test_file_over_one_mebibyte_is_refused),
        cmocka_unit_test(test_file_of_exactly_one_mebibyte_is_read),
        cmocka_unit_test(test_empty_file_is_refused_at_line_1),
        cmocka_unit_test(test_comment_only_file_is_refused_at_line_1),
        cmocka_unit_test(test_nesting_deeper_than_32_levels_is_refused),
        cmocka_unit_test(test_drag_source_longer_than_the_spec_field_is_refused),
        cmocka_unit_test(test_a_direction_sector_may_run_through_north),
        cmocka_unit_test(test_utf8_byte_order_mark_is_skipped),
        cmocka_unit_test(test_tabs_around_and_in_a_trailing_comment_are_accepted),
        cmocka_unit_test(test_items_are_numbered_from_one_and_by_name_in_overrides),
        cmocka_unit_test(test_items_keep_their_numbers_as_written_after_a_removal),
        cmocka_unit_test(test_null_arguments_are_invalid),
        cmocka_unit_test(test_full_example_loads_with_every_value_in_si),
        cmocka_unit_test(test_sha256_is_of_the_file_bytes),
        cmocka_unit_test(test_name_defaults_to_the_file_stem),
        cmocka_unit_test(test_defaults_fill_site_air_wind_and_zone),
        cmocka_unit_test(test_speed_and_heading_become_east_and_north_components),
        cmocka_unit_test(test_feet_and_degrees_celsius_are_converted_to_si),
        cmocka_unit_test(test_wind_table_rows_become_east_and_north_components),
        cmocka_unit_test(test_descent_diameter_gives_the_nominal_area),
        cmocka_unit_test(test_plates_and_thin_boxes_glide_by_default),
        cmocka_unit_test(test_turbulence_reads_model_and_intensity),
        cmocka_unit_test(test_canopy_type_supplies_exponent_fill_constant_and_opening_factor),
        cmocka_unit_test(test_sphere_model_takes_its_area_from_the_diameter),
        cmocka_unit_test(test_cd_of_zero_is_allowed_as_drag_free),
        cmocka_unit_test(test_cd_area_alone_is_kept_with_zero_reference_area),
        cmocka_unit_test(test_shape_dimensions_reach_the_drag_module_in_order),
        cmocka_unit_test(test_inventory_items_share_release_and_keep_their_own_descent),
        cmocka_unit_test(test_atmosphere_table_is_copied_into_the_profile),
        cmocka_unit_test(test_plus_minus_tolerances_become_uniform_bounds),
        cmocka_unit_test(test_override_replaces_a_value_in_its_own_units),
        cmocka_unit_test(test_override_inserts_a_missing_map),
        cmocka_unit_test(test_override_with_null_removes_a_key),
        cmocka_unit_test(test_override_appends_a_second_descent_device),
        cmocka_unit_test(test_override_adds_an_uncertainty_entry),
        cmocka_unit_test(test_uncertainty_entries_know_where_they_were_given),
        cmocka_unit_test(test_key_origin_names_the_file_or_the_set),
        cmocka_unit_test(test_derive_applies_overrides_without_reading_the_file),
        cmocka_unit_test(test_key_dim_gives_the_dimension_of_numeric_keys),
        cmocka_unit_test(test_key_dim_refuses_unknown_and_non_numeric_keys),
        cmocka_unit_test(test_fall_spec_field_points_at_the_double_a_key_sets),
        cmocka_unit_test(test_accessors_accept_null),
        cmocka_unit_test(test_bundled_demo_and_payload_profiles_load),
        cmocka_unit_test(test_every_profile_in_tests_bad_fails_where_its_comment_says),
        cmocka_unit_test(test_lint_finds_every_error_in_file_order),
        cmocka_unit_test(test_lint_goes_on_past_refused_required_values),
    };
    enum { N_FIXED = sizeof fixed / sizeof fixed[0] };
    static struct CMUnitTest tests[N_FIXED + N_BAD];
    for (size_t i = 0; i < N_FIXED; i++)
        tests[i] = fixed[i];
    for (size_t i = 0; i < N_BAD; i++) {
        tests[N_FIXED + i] = (struct CMUnitTest){bad_cases[i].name, run_bad_case, NULL, NULL,
                                                 (void *)(uintptr_t)&bad_cases[i]};
    }
    return _cmocka_run_group_tests("test_profile", tests, N_FIXED + N_BAD, group_setup,
                                   group_teardown);
}
