/*
 * io/vary.h - one numeric input set on copies of a resolved profile's
 * specs (internal to the library; not installed).
 *
 * `plumb sweep` and `plumb limit` run many falls that differ from a
 * profile in one or two inputs. Each could be made by the loader from the
 * text "KEY=<value> <unit>" (plumb_profile_derive): the YAML tree copied,
 * the override applied, every key read again through udunits2 and the air
 * rebuilt. This module gives the same specs without the text: the key's
 * double (io/keys.h) is set on copies of the specs and the air's spec,
 * what the loader derives from it is derived again (cd x area and the
 * drag's source text, a surface air's station altitude), and the checks
 * the loader makes of the value against other keys are made again by the
 * same predicates (io/profile_int.h). A value the loader would refuse is
 * refused here too, so that the caller can go through the loader for the
 * loader's own diagnostic; a profile built in code has no loader, and
 * plumbp_vary_refusal says why instead.
 *
 * What the loader decides from which keys are present (a key together
 * with one it excludes, a device's other keys, a turbulence map that the
 * override creates) does not depend on the value. So the specs varied are
 * those of a profile already derived with the key set to some value (the
 * template), or of a profile built in code, which has no text. The value
 * itself is the double the loader would read: a range's value in its unit
 * is converted by the same udunits2 converter as the text (sweep.h,
 * plumb_range_value_si), and an SI value is its own SI text.
 *
 * Keys that only the loader can vary: derived keys (release.velocity.speed
 * and heading, payload.drag.diameter, descent.diameter), rows of tables,
 * shape dimensions (the drag is looked up again), zone settings, keys
 * marked PLUMBP_KEY_LOADER (site.latitude places points given by latitude
 * and longitude), the mass of a payload whose glide comes from its shape
 * (PLUMBP_KEY_GLIDE: its I* is derived from the mass), and in an
 * inventory every key that is not the same for every item (items[N].X).
 */
#ifndef PLUMB_IO_VARY_H
#define PLUMB_IO_VARY_H

#include <stddef.h>
#include "plumb/atmosphere.h"
#include "plumb/profile.h"
#include "plumb/trajectory.h"
#include "io/keys.h"

/* 1 when `key` (as --set writes it) is a direction: an angle of any value,
 * which a compass point alone may give (wind.from, release.velocity.heading,
 * wind.table[N].from). Can't fail. */
int plumbp_key_is_direction(const char *key);

/* The bearing in degrees of a 16-point compass point written alone, any
 * case ("NW" is 315), or -1 for any other text. Can't fail. */
double plumbp_direction_bearing(const char *text);

typedef struct plumbp_vary {
    const plumbp_key *k;    /* the key's row */
    const char *key;        /* the key as given to plumbp_vary_init (borrowed) */
    size_t device;          /* the descent device it addresses */
    int keep_source;        /* 1: the drag's source text is the profile's own (given, or
                               built in code), not remade from the values */
} plumbp_vary;

/* 1 when `key` (as --set writes it) can be set on copies of p's resolved
 * specs by plumbp_vary_set with the loader's result; *v is then filled.
 * 0 when it goes through the loader (see the file comment). p is the
 * template: derived with the key set, or built in code. Can't fail. */
int plumbp_vary_init(plumbp_vary *v, const plumb_profile *p, const char *key);

/* 1 when p is a template as it is: a profile built in code, which has no
 * text to derive another from. Can't fail. */
int plumbp_vary_is_template(const plumb_profile *p);

/* 1 when setting the key rebuilds the air (PLUMBP_KEY_AIR). */
int plumbp_vary_air(const plumbp_vary *v);

/* Sets the key to x (SI) in specs[0 .. n) and *atm, copies of all the
 * template's items (the loader checks a value against every item) and of
 * its air, with what the loader derives from it, and checks the copies as
 * the loader would. Returns 1 when the loader takes
 * x; 0 when it would refuse it (out of the key's range, or against another
 * key), the copies then half changed. Can't fail otherwise. */
int plumbp_vary_set(const plumbp_vary *v, double x, plumb_fall_spec *specs, size_t n,
                    plumb_atm_spec *atm);

/* Why plumbp_vary_set refused x, after it returned 0 (specs and *atm as
 * it left them): raised as PLUMB_ERANGE naming the key, for a template
 * built in code, which has no loader to say it. Returns PLUMB_ERANGE. */
plumb_status plumbp_vary_refusal(const plumbp_vary *v, double x, const plumb_fall_spec *specs,
                                 size_t n, const plumb_atm_spec *atm, plumb_diag *diag);

/* A profile that is `tmpl` with items[0 .. n_items of tmpl) and *atm in
 * place of its own (the result of plumbp_vary_set on copies of them): what
 * plumb_profile_derive would have made with the value. It borrows
 * everything else from tmpl (name, path, tree, tables, criteria ...), so
 * tmpl must outlive it; plumb_profile_free frees only what is its own.
 * PLUMB_ENOMEM (*out NULL) is the only failure. */
plumb_status plumbp_profile_variant(const plumb_profile *tmpl, const plumb_fall_spec *items,
                                    const plumb_atm_spec *atm, plumb_profile **out,
                                    plumb_diag *diag);

/* profile_study.c: PLUMB_ERANGE at item i's volume key when the air it
 * displaces at the strike level (atm) weighs at least as much as the item:
 * it would float or rise, never land, a fault of the inputs (the study
 * refuses such a profile; a sweep row with such a value is that row's
 * error). PLUMB_OK otherwise. */
plumb_status plumbp_profile_item_sinks(const plumb_profile *p, size_t i,
                                       const plumb_atmosphere *atm, plumb_diag *diag);

#endif /* PLUMB_IO_VARY_H */
