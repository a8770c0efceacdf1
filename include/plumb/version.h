/*
 * plumb/version.h - the library's version, at compile time and at run time.
 *
 * PLUMB_VERSION is the one place the version is written: the Makefile
 * reads it from here for the shared object's file name and SONAME
 * (libplumb.so.MAJOR) and for plumb.pc. A program compiled against one
 * release and run against another can compare PLUMB_VERSION (the headers
 * it was built with) with plumb_version() (the library it loaded).
 */
#ifndef PLUMB_VERSION_H
#define PLUMB_VERSION_H

/* MAJOR.MINOR.PATCH of these headers. */
#define PLUMB_VERSION "0.4.0"

/* The version of the library actually linked or loaded, "MAJOR.MINOR.PATCH",
 * a static string. Can't fail. */
const char *plumb_version(void);

#endif /* PLUMB_VERSION_H */
