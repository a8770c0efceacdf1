/*
 * profile.c - strict YAML payload profiles into fall specs (README.md
 * "Profiles"; the numeric keys are described once, in the key table
 * src/io/keys.c, whose rows the schema in profile_schema.c names and
 * tests/test_keys.c holds to it; the README's "Profile keys" table
 * documents them for users).
 *
 * Method: the file is read whole (at most PLUMB_PROFILE_MAX_BYTES),
 * fingerprinted with SHA-256 (FIPS 180-4, sha256.c), parsed into a node
 * tree with positions (yamltree.c, on libyaml), overridden by `--set`
 * KEY=VALUE documents, checked against the schema of profile_schema.c
 * (unknown keys with a did-you-mean, kinds of value), then interpreted:
 * units through udunits2 (units.c), ranges, required keys, the keys each
 * model uses.
 * Conversions:
 *   release velocity (speed s, heading h clockwise from north, climb c):
 *       east = s sin h, north = s cos h, up = c
 *   wind table rows (speed, from) -> plumb_wind_components (wind.h)
 *   descent diameter D0 -> area S0 = pi D0^2 / 4 (Knacke, NWC TP 6575)
 *   sphere drag diameter d -> area pi d^2 / 4
 * The 1976 temperature (NOAA-S/T 76-1562) plus the offset must stay
 * above 0 K over the fall; it is piecewise linear in geopotential height,
 * so it is checked at both ends of the fall and at the layer bases between.
 *
 * Every diagnostic carries the file (or "--set"), line, column and the
 * dotted key. A loaded profile owns copies of everything; the parsed tree
 * is kept so that plumb_profile_derive can apply more overrides without
 * reading the file again.
 *
 * This file loads, builds and interprets a profile and reads it back;
 * profile_int.h names the files that hold the rest.
 */
#include <stdlib.h>
#include <string.h>

#include "io/profile_int.h"


void plumb_profile_free(plumb_profile *p)
{
    if (!p)
        return;
    if (p->borrowed) {
        free(p->items);
        free(p);
        return;
    }
    free(p->path);
    plumby_free(p->tree);
    free(p->items);
    free(p->shapes);
    free(p->att_drag);
    free(p->atm_alt_m);
    free(p->atm_rho_kg_m3);
    free(p->atm_t_k);
    free(p->wind_h_m);
    free(p->wind_e_m_s);
    free(p->wind_n_m_s);
    for (size_t i = 0; i < p->n_criteria; i++)
        free(p->criteria[i]);
    free(p->criteria);
    free(p->criteria_pos);
    free(p->unc);
    free(p->item_no);
    free(p->slot_removed_by);
    free(p);
}

/* Name of the file without directories and .yaml/.yml. */
static void file_stem(const char *path, char *dst, size_t size)
{
    const char *b = strrchr(path, '/');
    b = b ? b + 1 : path;
    size_t n = strlen(b);
    if (n > 5 && strcmp(b + n - 5, ".yaml") == 0)
        n -= 5;
    else if (n > 4 && strcmp(b + n - 4, ".yml") == 0)
        n -= 4;
    if (n >= size)
        n = size - 1;
    memcpy(dst, b, n);
    dst[n] = '\0';
}


static plumb_status interpret(loader *L)
{
    plumb_profile *p = L->p;
    plumb_status st;
    char stem[PLUMB_NAME];
    file_stem(p->path, stem, sizeof stem);
    if ((st = plumby_text(&L->root, "name", stem, p->name, sizeof p->name)) != PLUMB_OK)
        return st;
    if (!p->name[0])
        return plumby_raise_value(&L->root, "name", PLUMB_EINVAL, "expected a name, found ''");

    plumb_fall_spec base;
    memset(&base, 0, sizeof base);
    plumbp_strlcpy(base.name, p->name, sizeof base.name);
    if ((st = plumbp_profile_read_release_site(L, &base)) != PLUMB_OK ||
        (st = plumbp_profile_read_atmosphere(L)) != PLUMB_OK ||
        (st = plumbp_profile_read_wind(L, &base.wind)) != PLUMB_OK ||
        (st = plumbp_profile_read_turbulence(L, &base.turbulence)) != PLUMB_OK)
        return st;

    const plumby_node *items = plumby_get(&L->root, "items");
    const plumby_node *payload = plumby_get(&L->root, "payload");
    if (items && payload)
        return plumby_forbid(&L->root, "items",
                             "together with payload (a profile has payload: or items:)");
    const plumby_removal *gone = plumby_removed(&L->ctx, "items");
    if (!gone)
        gone = plumby_removed(&L->ctx, "payload");
    if (!items && !payload && gone)
        return plumby_raise(&L->ctx, PLUMBY_FROM_SET, gone->line, gone->col, "payload",
                            PLUMB_EKEY, "this --set removed %s, and a profile needs "
                            "payload: or items:; give payload: {mass: ..., drag: ...} with "
                            "another --set, or leave %s in", gone->key, gone->key);
    if (!items && !payload)
        return plumby_missing(&L->root, "payload",
                              "give payload: {mass: ..., drag: ...}, or items: for an inventory");
    p->inventory = items != NULL;
    p->n_items = items ? items->n : 1;
    if (items && items->n == 0)
        return plumby_raise_value(&L->root, "items", PLUMB_EINVAL,
                                  "an empty list: give at least one item");
    p->items = calloc(p->n_items, sizeof *p->items);
    p->shapes = calloc(p->n_items, sizeof *p->shapes);
    if (!p->items || !p->shapes)
        return nomem(L);
    if (!items) {
        plumby_map pm;
        plumby_sub(&L->root, "payload", &pm);
        if ((st = plumbp_profile_read_item(L, &pm, 0, &base, &p->items[0], &p->shapes[0])) !=
            PLUMB_OK)
            return st;
    } else {
        const plumby_schema *is = &plumby_schema_child(plumbp_profile_schema(), "items")->sub[0];
        for (size_t i = 0; i < items->n; i++) {
            plumby_map im;
            char key[PLUMB_DIAG_KEY];
            plumby_key_join(key, sizeof key, "items", NULL, p->item_no ? p->item_no[i] - 1 : i);
            plumby_map_init(&im, &L->ctx, items->items[i], is, key);
            if ((st = plumbp_profile_read_item(L, &im, 1, &base, &p->items[i],
                                               &p->shapes[i])) != PLUMB_OK)
                return st;
            for (size_t j = 0; j < i; j++)
                if (strcmp(p->items[j].name, p->items[i].name) == 0)
                    return plumby_raise_value(&im, "name", PLUMB_EKEY,
                                              "item name '%s' is used twice (also items[%zu])",
                                              p->items[i].name,
                                              plumb_profile_item_number(p, j));
        }
    }
    if ((st = plumbp_profile_read_criteria(L)) != PLUMB_OK ||
        (st = plumbp_profile_read_uncertainty(L)) != PLUMB_OK ||
        (st = plumbp_profile_read_zone(L)) != PLUMB_OK ||
        (st = plumbp_profile_read_job(L)) != PLUMB_OK)
        return st;
    return PLUMB_OK;
}

/* The checks before the profile is interpreted: a --set's own value
 * first (given_sets), then, of the keys and kinds the schema refuses
 * (plumby_check, in file order) and the numbers whose unit or range is
 * wrong (with all_values: a profile derived from a checked one has only
 * its new --set values to check), the first in file order. The loader
 * reads the release, air and wind before the payload: without this a
 * wind speed at line 8 would hide a mass at line 3. Required keys
 * missing and values refused against another key are found later, in the
 * loader's order: first_in_file puts them in file order. */
static plumb_status check_tree(const plumby_ctx *ctx, const plumby_node *tree, int all_values,
                               int given_sets)
{
    const plumby_schema *schema = plumbp_profile_schema();
    plumb_status st = given_sets ? plumby_check_values(ctx, tree, schema, 1) : PLUMB_OK;
    if (st != PLUMB_OK)
        return st;
    st = plumby_check(ctx, tree, schema, "");
    if (!all_values || tree->kind != PLUMBY_MAP)
        return st;
    plumb_diag dv;
    plumb_diag_clear(&dv);
    plumby_ctx c = *ctx;
    c.diag = &dv;
    plumb_status sv = plumby_check_values(&c, tree, schema, 0);
    if (sv == PLUMB_OK)
        return st;
    const plumb_diag *ds = ctx->diag;
    if (!plumb_status_is_input_error(sv)) {
        /* out of memory is the machine's failure, whichever error is first */
        if (ctx->diag)
            *ctx->diag = dv;
        return sv;
    }
    if (st != PLUMB_OK && ds &&
        (strcmp(ds->file, dv.file) != 0 || ds->line < dv.line ||
         (ds->line == dv.line && ds->col <= dv.col)))
        return st; /* the schema's error is first (or a --set's) */
    if (ctx->diag)
        *ctx->diag = dv;
    return sv;
}

/* Most errors the lint lists to find the first in file order (as many as
 * `plumb lint` lists). */
enum { FIRST_LINT_MAX = 16 };

/* The interpreter failed with *diag, an error in the file: the loader
 * meets a required key missing or a value refused against another key in
 * its own order (release, air and wind before the payload), so the error
 * told is instead the first in file order of those the lint lists
 * (plumbp_profile_lint_tree, which sorts them; `plumb lint`'s first),
 * found from tree as it was read (before sets) and the same sets. Its
 * status; out of memory is the machine's failure, told as such. */
static plumb_status first_in_file(const char *path, const char *sha, const plumby_node *tree,
                                  const plumb_units *units, const char *const *sets,
                                  size_t n_sets, const plumbp_id_check *check, plumb_status st,
                                  plumb_diag *diag)
{
    plumb_diag *errs = calloc(FIRST_LINT_MAX, sizeof *errs);
    if (!errs)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the profile");
    size_t n = 0;
    plumb_status sl = plumbp_profile_lint_tree(path, sha, tree, units, sets, n_sets, check, errs,
                                               FIRST_LINT_MAX, &n, NULL);
    if (!plumb_status_is_input_error(sl) && sl != PLUMB_OK) {
        if (diag)
            *diag = errs[0];
        st = sl;
    } else if (sl != PLUMB_OK && n > 0 && strcmp(errs[0].file, path) == 0 && errs[0].line > 0 &&
               (errs[0].line < diag->line ||
                (errs[0].line == diag->line && errs[0].col < diag->col))) {
        *diag = errs[0];
        st = sl;
    }
    free(errs);
    return st;
}

/* Applies sets to tree (owned), checks and interprets it into *out. */
static plumb_status build(const char *path, const char *sha, plumby_node *tree,
                          const plumb_profile *base, const plumb_units *units,
                          const char *const *sets, size_t n_sets, const plumbp_id_check *check,
                          plumb_profile **out, plumb_diag *diag)
{
    plumb_status st;
    plumbp_set_items numbering;
    memset(&numbering, 0, sizeof numbering);
    if (base && tree->kind == PLUMBY_MAP &&
        plumbp_set_items_seed(&numbering, tree, base) != PLUMB_OK) {
        plumbp_set_items_free(&numbering);
        plumby_free(tree);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the profile");
    }
    /* the keys a --set removed, so that a required key then missing is
     * told at that --set (plumby_missing) */
    plumby_removal *removed = n_sets ? calloc(n_sets, sizeof *removed) : NULL;
    size_t n_removed = 0;
    if (n_sets && !removed) {
        plumbp_set_items_free(&numbering);
        plumby_free(tree);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the profile");
    }
    for (size_t i = 0; i < n_sets; i++) {
        if (!sets[i]) {
            plumbp_set_items_free(&numbering);
            plumby_free(tree);
            free(removed);
            return PLUMB_RAISE(diag, PLUMB_EINVAL, "override %zu is NULL", i);
        }
        if (tree->kind != PLUMBY_MAP)
            break; /* reported by the check below */
        if ((st = plumbp_profile_apply_set(tree, sets[i], (int)i + 1, &numbering,
                                           &removed[n_removed], diag)) != PLUMB_OK) {
            plumbp_set_items_free(&numbering);
            plumby_free(tree);
            free(removed);
            return st;
        }
        if (removed[n_removed].key[0])
            n_removed++;
    }
    plumb_profile *p = calloc(1, sizeof *p);
    size_t plen = strlen(path);
    if (!p || !(p->path = malloc(plen + 1))) {
        plumbp_set_items_free(&numbering);
        free(p);
        free(removed);
        plumby_free(tree);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the profile");
    }
    memcpy(p->path, path, plen + 1);
    p->tree = tree;
    st = tree->kind == PLUMBY_MAP ? plumbp_set_items_numbers(&numbering, tree, p) : PLUMB_OK;
    plumbp_set_items_free(&numbering);
    if (st != PLUMB_OK) {
        plumb_profile_free(p);
        free(removed);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the profile");
    }
    plumbp_strlcpy(p->sha256, sha, sizeof p->sha256);

    loader L;
    memset(&L, 0, sizeof L);
    L.ctx.file = path;
    L.ctx.units = units;
    L.ctx.diag = diag;
    L.ctx.item_no = p->item_no;
    L.ctx.n_item_no = p->n_item_no;
    L.ctx.removed = removed;
    L.ctx.n_removed = n_removed;
    L.p = p;
    L.check = check;
    st = check_tree(&L.ctx, tree, base == NULL, n_sets > 0);
    if (st == PLUMB_OK) {
        plumby_map_init(&L.root, &L.ctx, tree, plumbp_profile_schema(), "");
        st = interpret(&L);
    }
    free(removed);
    if (st != PLUMB_OK) {
        plumb_profile_free(p);
        return st;
    }
    *out = p;
    return PLUMB_OK;
}

/* build, for a profile read from a file (not the lint's own builds nor a
 * derived profile): an error in the file is told as the first in file
 * order (first_in_file), found from a copy of tree as it was read (build
 * changes and frees tree). */
static plumb_status build_in_order(const char *path, const char *sha, plumby_node *tree,
                                   const plumb_units *units, const char *const *sets,
                                   size_t n_sets, plumb_profile **out, plumb_diag *diag)
{
    plumby_node *as_read = plumby_copy(tree);
    if (!as_read) {
        plumby_free(tree);
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory loading the profile");
    }
    plumb_status st = build(path, sha, tree, NULL, units, sets, n_sets, NULL, out, diag);
    if (plumb_status_is_input_error(st) && diag && strcmp(diag->file, path) == 0 &&
        diag->line > 0)
        st = first_in_file(path, sha, as_read, units, sets, n_sets, NULL, st, diag);
    plumby_free(as_read);
    return st;
}

plumb_status plumbp_profile_build(const char *path, const char *sha, plumby_node *tree,
                                  const plumb_units *units, const char *const *sets,
                                  size_t n_sets, const plumbp_id_check *check,
                                  plumb_profile **out, plumb_diag *diag)
{
    return build(path, sha, tree, NULL, units, sets, n_sets, check, out, diag);
}

plumb_status plumb_profile_load(const char *path, const plumb_units *units,
                                const char *const *sets, size_t n_sets, plumb_profile **out,
                                plumb_diag *diag)
{
    if (out)
        *out = NULL;
    if (!path || !units || !out || (n_sets > 0 && !sets))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_load: NULL argument");
    char *buf;
    size_t len;
    plumb_status st = plumby_read_file(path, PLUMB_PROFILE_MAX_BYTES, &buf, &len, diag);
    if (st != PLUMB_OK)
        return st;
    char sha[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(buf, len, sha);
    plumby_node *tree;
    st = plumby_parse(buf, len, path, PLUMBY_FROM_FILE, 0, NULL, &tree, diag);
    free(buf);
    if (st != PLUMB_OK)
        return st;
    return build_in_order(path, sha, tree, units, sets, n_sets, out, diag);
}

/* The lint of the len bytes at buf, named name (plumbp_profile_lint_checked). */
static plumb_status lint_bytes(const char *name, const char *buf, size_t len,
                               const plumb_units *units, const char *const *sets, size_t n_sets,
                               const plumbp_id_check *check, plumb_diag *errs, size_t max,
                               size_t *n, plumb_profile **out)
{
    if (len > PLUMB_PROFILE_MAX_BYTES) {
        *n = 1;
        return PLUMB_RAISE_AT(&errs[0], PLUMB_ERANGE, name, 0, 0, NULL,
                              "the profile has %zu bytes; at most %u bytes are accepted", len,
                              PLUMB_PROFILE_MAX_BYTES);
    }
    char sha[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(buf ? buf : "", len, sha);
    plumby_node *tree;
    plumb_diag_clear(&errs[0]);
    plumb_status st = plumby_parse(buf ? buf : "", len, name, PLUMBY_FROM_FILE, 0, NULL, &tree,
                                   &errs[0]);
    if (st != PLUMB_OK) {
        *n = 1;
        return st;
    }
    st = plumbp_profile_lint_tree(name, sha, tree, units, sets, n_sets, check, errs, max, n, out);
    plumby_free(tree);
    return st;
}

plumb_status plumbp_profile_lint_checked(const char *name, const char *buf, size_t len,
                                         const plumb_units *units, const char *const *sets,
                                         size_t n_sets, const plumbp_id_check *check,
                                         plumb_diag *errs, size_t max, size_t *n,
                                         plumb_profile **out)
{
    if (n)
        *n = 0;
    if (out)
        *out = NULL;
    if (!name || !units || !errs || max == 0 || !n || (n_sets > 0 && !sets))
        return PLUMB_RAISE(errs, PLUMB_EINVAL, "%s: NULL argument",
                           buf ? "plumb_profile_lint_buffer" : "plumb_profile_lint");
    if (buf)
        return lint_bytes(name, buf, len, units, sets, n_sets, check, errs, max, n, out);
    char *text;
    plumb_diag_clear(&errs[0]);
    plumb_status st = plumby_read_file(name, PLUMB_PROFILE_MAX_BYTES, &text, &len, &errs[0]);
    if (st != PLUMB_OK) {
        *n = 1;
        return st;
    }
    st = lint_bytes(name, text, len, units, sets, n_sets, check, errs, max, n, out);
    free(text);
    return st;
}

plumb_status plumb_profile_lint_buffer(const char *name, const char *buf, size_t len,
                                       const plumb_units *units, const char *const *sets,
                                       size_t n_sets, plumb_diag *errs, size_t max, size_t *n,
                                       plumb_profile **out)
{
    if (!buf && len == 0)
        buf = ""; /* an empty buffer, not a file to read */
    if (!buf) {
        if (n)
            *n = 0;
        if (out)
            *out = NULL;
        return PLUMB_RAISE(errs, PLUMB_EINVAL, "plumb_profile_lint_buffer: NULL argument");
    }
    return plumbp_profile_lint_checked(name, buf, len, units, sets, n_sets, NULL, errs, max, n,
                                       out);
}

plumb_status plumb_profile_lint(const char *path, const plumb_units *units,
                                const char *const *sets, size_t n_sets, plumb_diag *errs,
                                size_t max, size_t *n, plumb_profile **out)
{
    if (!path) {
        if (n)
            *n = 0;
        if (out)
            *out = NULL;
        return PLUMB_RAISE(errs, PLUMB_EINVAL, "plumb_profile_lint: NULL argument");
    }
    return plumbp_profile_lint_checked(path, NULL, 0, units, sets, n_sets, NULL, errs, max, n,
                                       out);
}

plumb_status plumb_profile_load_buffer(const char *name, const char *buf, size_t len,
                                       const plumb_units *units, const char *const *sets,
                                       size_t n_sets, plumb_profile **out, plumb_diag *diag)
{
    if (out)
        *out = NULL;
    if (!name || (!buf && len > 0) || !units || !out || (n_sets > 0 && !sets))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_load_buffer: NULL argument");
    if (len > PLUMB_PROFILE_MAX_BYTES)
        return PLUMB_RAISE_AT(diag, PLUMB_ERANGE, name, 0, 0, NULL,
                              "the profile has %zu bytes; at most %u bytes are accepted", len,
                              PLUMB_PROFILE_MAX_BYTES);
    char sha[PLUMBP_SHA256_HEX];
    plumbp_sha256_hex(buf ? buf : "", len, sha);
    plumby_node *tree;
    plumb_status st = plumby_parse(buf ? buf : "", len, name, PLUMBY_FROM_FILE, 0, NULL, &tree,
                                   diag);
    if (st != PLUMB_OK)
        return st;
    return build_in_order(name, sha, tree, units, sets, n_sets, out, diag);
}

plumb_status plumb_profile_derive(const plumb_profile *base, const plumb_units *units,
                                  const char *const *sets, size_t n_sets, plumb_profile **out,
                                  plumb_diag *diag)
{
    if (out)
        *out = NULL;
    if (!base || !units || !out || (n_sets > 0 && !sets))
        return PLUMB_RAISE(diag, PLUMB_EINVAL, "plumb_profile_derive: NULL argument");
    if (!base->tree)
        return PLUMB_RAISE(diag, PLUMB_EINVAL,
                           "a profile built in code (plumb_profile_from_spec) has no profile "
                           "text to derive another from: change its spec and make a new one");
    plumby_node *tree = plumby_copy(base->tree);
    if (!tree)
        return PLUMB_RAISE(diag, PLUMB_ENOMEM, "out of memory copying the profile");
    return build(base->path, base->sha256, tree, base, units, sets, n_sets, NULL, out, diag);
}

/* ---- accessors --------------------------------------------------------- */

const char *plumb_profile_path(const plumb_profile *p) { return p ? p->path : NULL; }
const char *plumb_profile_name(const plumb_profile *p) { return p ? p->name : NULL; }
const char *plumb_profile_sha256(const plumb_profile *p) { return p ? p->sha256 : NULL; }
int plumb_profile_is_inventory(const plumb_profile *p) { return p ? p->inventory : 0; }
size_t plumb_profile_item_count(const plumb_profile *p) { return p ? p->n_items : 0; }

const plumb_fall_spec *plumb_profile_item(const plumb_profile *p, size_t i)
{
    return p && i < p->n_items ? &p->items[i] : NULL;
}

size_t plumb_profile_item_number(const plumb_profile *p, size_t i)
{
    if (!p || i >= p->n_items)
        return 0;
    return p->item_no ? p->item_no[i] : i + 1;
}

const plumb_shape_spec *plumb_profile_item_shape(const plumb_profile *p, size_t i)
{
    return p && i < p->n_items ? &p->shapes[i] : NULL;
}

const plumb_atm_spec *plumb_profile_atmosphere(const plumb_profile *p)
{
    return p ? &p->atm : NULL;
}

size_t plumb_profile_criteria_count(const plumb_profile *p) { return p ? p->n_criteria : 0; }

void plumb_profile_criterion_position(const plumb_profile *p, size_t i, int *line, int *col)
{
    int ok = p && i < p->n_criteria && p->criteria_pos;
    *line = ok ? p->criteria_pos[i][0] : 0;
    *col = ok ? p->criteria_pos[i][1] : 0;
}

const char *plumb_profile_criterion_file(const plumb_profile *p, size_t i)
{
    if (!p)
        return NULL;
    if (i < p->n_criteria && p->criteria_pos && p->criteria_pos[i][2] == PLUMBY_FROM_SET)
        return PLUMBY_SET_FILE;
    return p->path;
}

const char *plumb_profile_criterion(const plumb_profile *p, size_t i)
{
    return p && i < p->n_criteria ? p->criteria[i] : NULL;
}

size_t plumb_profile_uncertainty_count(const plumb_profile *p) { return p ? p->n_unc : 0; }

const plumb_uncertainty *plumb_profile_uncertainty(const plumb_profile *p, size_t i)
{
    return p && i < p->n_unc ? &p->unc[i] : NULL;
}

const plumb_zone_spec *plumb_profile_zone(const plumb_profile *p) { return p ? &p->zone : NULL; }

const plumb_job *plumb_profile_job(const plumb_profile *p) { return p ? &p->job : NULL; }

int plumb_profile_attitude_drag(const plumb_profile *p, size_t item,
                                double out[PLUMB_MAX_ATTITUDES][2])
{
    if (!p || !p->att_drag || item >= p->n_items)
        return 0;
    memcpy(out, p->att_drag[item], sizeof p->att_drag[item]);
    return 1;
}

/* ---- fields of a fall spec --------------------------------------------- */

/*
 * The double a key sets, or NULL when the key is not a per-fall numeric
 * input of this spec: not a single double of the spec (the key table's
 * home, io/keys.c: release.velocity.speed and heading become east/north;
 * shapes become cd and area; a diameter becomes an area; the air is not
 * in a fall spec), or not in effect for the spec's form or model (the
 * table's `when`: payload.drag.cd when cd_area was given, descent[1] with
 * one device, deploy.below for a device deployed `after`, site.latitude
 * without a latitude, wind.exponent for a profile other than power ...).
 */
double *plumb_fall_spec_field(plumb_fall_spec *s, const char *key)
{
    if (!s || !key)
        return NULL;
    size_t dev;
    long item;
    const plumbp_key *k = plumbp_key_find(key, &dev, &item);
    if (!k || item != -1 || k->home == PLUMBP_HOME_AIR)
        return NULL;
    return plumbp_key_field(k, s, NULL, dev);
}

