/*
 * suggest.c - the "did you mean" of every message (plumb/suggest.h): the
 * Levenshtein distance by the Wagner-Fischer dynamic programme, one row
 * at a time, and the nearest candidate close enough to suggest.
 */
#include <string.h>

#include "plumb/suggest.h"
#include "core/internal.h"

/* Longest word or candidate compared, characters (one row on the stack). */
#define SUGGEST_MAX_LEN 63
/* The distance given for a longer one: never suggested. */
#define SUGGEST_FAR 99

int plumbp_edit_distance(const char *a, const char *b)
{
    size_t la = strlen(a), lb = strlen(b);
    if (la > SUGGEST_MAX_LEN || lb > SUGGEST_MAX_LEN)
        return SUGGEST_FAR;
    int row[SUGGEST_MAX_LEN + 1];
    for (size_t j = 0; j <= lb; j++)
        row[j] = (int)j;
    for (size_t i = 1; i <= la; i++) {
        int diag_prev = row[0];
        row[0] = (int)i;
        for (size_t j = 1; j <= lb; j++) {
            int up = row[j];
            int cost = a[i - 1] == b[j - 1] ? 0 : 1;
            int best = diag_prev + cost;
            if (up + 1 < best)
                best = up + 1;
            if (row[j - 1] + 1 < best)
                best = row[j - 1] + 1;
            row[j] = best;
            diag_prev = up;
        }
    }
    return row[lb] > SUGGEST_FAR ? SUGGEST_FAR : row[lb];
}

int plumbp_suggest_near(int d, size_t longer)
{
    return d >= 0 && d <= PLUMB_SUGGEST_MAX_EDITS && 2 * (size_t)d <= longer;
}

const char *plumb_suggest_closest(const char *word, const char *const *candidates, size_t n)
{
    if (!word || !candidates)
        return NULL;
    size_t len = strlen(word);
    const char *best = NULL;
    int best_d = PLUMB_SUGGEST_MAX_EDITS + 1;
    for (size_t i = 0; i < n; i++) {
        if (!candidates[i])
            continue;
        int d = plumbp_edit_distance(word, candidates[i]);
        size_t longer = strlen(candidates[i]) > len ? strlen(candidates[i]) : len;
        if (d < best_d && plumbp_suggest_near(d, longer)) {
            best_d = d;
            best = candidates[i];
        }
    }
    return best;
}
