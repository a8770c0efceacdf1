/*
 * version.c - the library's version at run time (plumb/version.h).
 */
#include "plumb/version.h"

const char *plumb_version(void)
{
    return PLUMB_VERSION;
}
