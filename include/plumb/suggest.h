/*
 * plumb/suggest.h - the "did you mean" of every message that names a
 * word it does not know: an unknown profile key, a distribution, an
 * attitude, an item's name, a command-line option or command.
 *
 * Method: the Levenshtein distance d(a, b), the fewest single-character
 * insertions, deletions and substitutions that turn a into b (V. I.
 * Levenshtein, Soviet Physics Doklady 10 (8), 707-710, 1966), by the
 * dynamic programme of R. A. Wagner and M. J. Fischer (J. ACM 21 (1),
 * 168-173, 1974), one row at a time:
 *   D(i, 0) = i,  D(0, j) = j,
 *   D(i, j) = min(D(i-1, j) + 1, D(i, j-1) + 1, D(i-1, j-1) + [a_i != b_j]),
 *   d(a, b) = D(|a|, |b|).
 * A candidate is suggested when it is the nearest, at most
 * PLUMB_SUGGEST_MAX_EDITS edits away, and those edits are at most half the
 * length of the longer of the two words ("pow" is 2 edits from "power",
 * suggested; "ab" is 2 from "job", not), so that a word that merely shares
 * a letter or two with a candidate gets no suggestion (common practice,
 * no source). Case counts: "Fall" is one edit from "fall".
 *
 * Ownership: nothing is allocated; the result points into the caller's
 * candidates.
 */
#ifndef PLUMB_SUGGEST_H
#define PLUMB_SUGGEST_H

#include <stddef.h>

/* Most edits between a typed word and the candidate suggested for it. */
#define PLUMB_SUGGEST_MAX_EDITS 3

/* The candidate nearest to `word` (the first of equally near ones, in the
 * order given) when it is close enough to suggest, as the top of this file
 * says; NULL when none is, or for a NULL word or candidates. Words or
 * candidates of more than 63 characters are never suggested. Can't fail. */
const char *plumb_suggest_closest(const char *word, const char *const *candidates, size_t n);

#endif /* PLUMB_SUGGEST_H */
