/*
 * warning.c - a warning sentence appended to a report's fixed list of
 * slots (plumb_item_report's and plumb_zone_result's), whole or visibly
 * marked: a sentence longer than its slot, or one more than the list
 * holds, is never dropped or cut in silence, and a cut never parts a
 * quantity's mark (PLUMBP_Q_*, core/internal.h).
 */
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include "core/internal.h"

void plumbp_warning_vadd(char *slots, size_t slot_size, size_t max, size_t *n, const char *fmt,
                         va_list ap)
{
    if (!slots || !n || slot_size == 0 || max == 0)
        return;
    if (*n >= max) {
        /* the last slot says that some were left out, once */
        char *last = slots + (max - 1) * slot_size;
        plumbp_strlcpy(last, PLUMBP_WARNINGS_LEFT_OUT, slot_size);
        return;
    }
    char *dst = slots + *n * slot_size;
    int len = vsnprintf(dst, slot_size, fmt, ap);
    (*n)++;
    if (len >= 0 && (size_t)len < slot_size)
        return;
    /* too long for its slot: end it with the mark, at a character boundary */
    size_t mark = strlen(PLUMBP_WARNING_CUT);
    if (mark + 1 > slot_size) {
        plumbp_strlcpy(dst, PLUMBP_WARNING_CUT, slot_size);
        return;
    }
    size_t keep = slot_size - 1 - mark;
    if (len < 0)
        keep = 0;
    while (keep > 0 && ((unsigned char)dst[keep] & 0xC0) == 0x80)
        keep--;
    /* a quantity's mark is kept whole or not at all */
    for (size_t i = keep; i-- > 0;) {
        if (dst[i] == PLUMBP_QTY_CLOSE)
            break;
        if (dst[i] == PLUMBP_QTY_OPEN) {
            keep = i;
            break;
        }
    }
    memcpy(dst + keep, PLUMBP_WARNING_CUT, mark + 1);
}

void plumbp_warning_add(char *slots, size_t slot_size, size_t max, size_t *n, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    plumbp_warning_vadd(slots, slot_size, max, n, fmt, ap);
    va_end(ap);
}
