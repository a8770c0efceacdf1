#!/bin/sh
# libplumb as others get it: the shared object built beside PLUMB and what
# `make install` puts under a DESTDIR.
# - libplumb.so -> libplumb.so.MAJOR -> libplumb.so.VERSION, SONAME
#   libplumb.so.MAJOR, VERSION from include/plumb/version.h;
# - it exports exactly the functions declared in include/plumb/*.h (nm -D
#   --defined-only), so no plumbp_*/plumby_* helper and nothing static;
# - `make install DESTDIR=...` installs the binary, the archive, the .so
#   with its links, the headers, the criteria and plumb.pc;
# - pkg-config finds the staged plumb.pc (PKG_CONFIG_PATH, with
#   PKG_CONFIG_SYSROOT_DIR for the stage) and its flags build a program
#   that links the shared object by its SONAME and gets plumb_version();
# - the installed plumb finds the installed criteria by itself.
#
#   sh tests/cli/library.sh PLUMB
#
# Ends with one line `cli: N passed, N failed, N skipped`.
. "$(dirname "$0")/lib/setup.sh"
b=$(dirname "$bin")

pass=0
fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
check() { # check NAME COMMAND...: passes when the command succeeds
  name=$1
  shift
  if "$@"; then ok; else bad "$name"; fi
}

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-library.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM
cc=${CC:-cc}

ver=$(sed -n 's/^#define PLUMB_VERSION "\([0-9.]*\)"$/\1/p' include/plumb/version.h)
major=${ver%%.*}
# while the major is 0, the SONAME carries the minor too (Makefile, SOMAJOR)
if [ "$major" = 0 ]; then rest=${ver#*.}; major=0.${rest%%.*}; fi
soname=libplumb.so.$major

# ---- the shared object and its links ------------------------------------------
check "libplumb.so links to $soname" test "$(readlink "$b/libplumb.so")" = "$soname"
check "$soname links to libplumb.so.$ver" test "$(readlink "$b/$soname")" = "libplumb.so.$ver"
got=$(readelf -d "$b/libplumb.so.$ver" 2>/dev/null | sed -n 's/.*(SONAME).*\[\(.*\)\]/\1/p')
check "SONAME is $soname (found '$got')" test "$got" = "$soname"

# ---- exported symbols: exactly the public functions ------------------------------
# The declarations, comments and macros stripped by the preprocessor.
# plumb/sheet.h is libplumb-sheet.a's (cairo and pango), not the shared object's.
for h in include/plumb/*.h; do
  [ "$h" = include/plumb/sheet.h ] || echo "#include \"${h#include/}\""
done >"$tmp/all.h"
if $cc -std=c11 -E -P -Iinclude "$tmp/all.h" >"$tmp/all.i" 2>"$tmp/cc.err"; then
  grep -o 'plumb_[A-Za-z0-9_]*[[:space:]]*(' "$tmp/all.i" | tr -d ' \t(' | sort -u >"$tmp/declared"
  nm -D --defined-only "$b/libplumb.so.$ver" | awk '{print $NF}' | sort -u >"$tmp/exported"
  extra=$(comm -13 "$tmp/declared" "$tmp/exported" | tr '\n' ' ')
  missing=$(comm -23 "$tmp/declared" "$tmp/exported" | tr '\n' ' ')
  check "exported but not in include/plumb: $extra" test -z "$extra"
  check "declared in include/plumb but not exported: $missing" test -z "$missing"
  echo "libplumb.so.$ver exports $(wc -l <"$tmp/exported") functions"
else
  bad "cannot preprocess the public headers: $(head -n 3 "$tmp/cc.err")"
fi

# ---- make install into a stage ---------------------------------------------------
unset MAKEFLAGS MFLAGS MAKELEVEL
stage=$tmp/stage
prefix=/opt/plumb-test
if ! make -q BUILD="$b" all >/dev/null 2>&1; then
  bad "$b is not up to date; build it before testing (make BUILD=$b all)"
elif make --no-print-directory BUILD="$b" DESTDIR="$stage" PREFIX="$prefix" install \
     >"$tmp/install.log" 2>&1; then
  ok
  d=$stage$prefix
  for f in bin/plumb lib/libplumb.a "lib/libplumb.so.$ver" lib/pkgconfig/plumb.pc \
           include/plumb/plumb.h include/plumb/version.h share/plumb/criteria/eu-c1-80j.yaml \
           libexec/plumb/plumb-sheet; do
    check "installed $f" test -f "$d/$f"
  done
  for h in include/plumb/*.h; do
    cmp -s "$h" "$d/$h" || bad "installed $h differs or is missing"
  done
  check "installed lib/$soname -> libplumb.so.$ver" test "$(readlink "$d/lib/$soname")" = "libplumb.so.$ver"
  check "installed lib/libplumb.so -> $soname" test "$(readlink "$d/lib/libplumb.so")" = "$soname"

  # pkg-config against the stage
  export PKG_CONFIG_PATH="$d/lib/pkgconfig" PKG_CONFIG_SYSROOT_DIR="$stage"
  flags=$(pkg-config --cflags --libs plumb 2>"$tmp/pc.err")
  check "pkg-config --cflags --libs plumb ($(cat "$tmp/pc.err"))" test -n "$flags"
  check "pkg-config --modversion plumb is $ver" test "$(pkg-config --modversion plumb 2>&1)" = "$ver"
  case " $flags " in *" -I$d/include "*"-L$d/lib "*"-lplumb "*) ok ;;
    *) bad "pkg-config flags '$flags' lack -I$d/include -L$d/lib -lplumb" ;; esac

  # A program outside the tree, built with those flags only.
  cat >"$tmp/consumer.c" <<'C'
#include <stdio.h>
#include <string.h>
#include <plumb/plumb.h>
int main(void)
{
    plumb_units *units = NULL;
    plumb_diag diag;
    if (plumb_units_alloc(&units, &diag) != PLUMB_OK)
        return 1;
    plumb_units_free(units);
    printf("%s %s\n", plumb_version(), PLUMB_VERSION);
    return strcmp(plumb_version(), PLUMB_VERSION) != 0;
}
C
  san=""
  readelf -d "$d/lib/libplumb.so.$ver" | grep -q 'NEEDED.*libasan' && san="-fsanitize=address,undefined"
  # shellcheck disable=SC2086
  if $cc -std=c11 $san -o "$tmp/consumer" "$tmp/consumer.c" $flags 2>"$tmp/cc.err"; then
    ok
    check "the program needs $soname" sh -c "readelf -d '$tmp/consumer' | grep -q 'NEEDED.*\[$soname\]'"
    out=$(LD_LIBRARY_PATH="$d/lib" "$tmp/consumer" 2>&1)
    check "the program runs against the staged library ($out)" test "$out" = "$ver $ver"
    check "the program loads the staged $soname" sh -c \
      "LD_LIBRARY_PATH='$d/lib' ldd '$tmp/consumer' | grep -q '$soname => $d/lib/$soname'"
  else
    bad "cannot build a program with pkg-config's flags: $(head -n 5 "$tmp/cc.err")"
  fi

  # The installed plumb, with no criteria directory given and away from the
  # source tree, uses the installed ones.
  out=$(cd "$tmp" && env -u PLUMB_CRITERIA_DIR "$d/bin/plumb" fall \
        "$root/profiles/demo/hand-tool.yaml" --format json 2>&1 | grep -c '"id": "en397-shock-49j"')
  check "installed plumb finds share/plumb/criteria" test "$out" -ge 1
  check "installed plumb --version" test "$("$d/bin/plumb" --version)" = "plumb $ver"
  # `plumb sheet` runs the installed libexec/plumb/plumb-sheet (found from
  # the program's own place: the build's PREFIX is not this one).
  out=$(cd "$tmp" && "$d/bin/plumb" sheet --help 2>&1 | head -n 1)
  case $out in "Usage: plumb sheet"*) ok ;; *) bad "installed plumb sheet --help: '$out'" ;; esac
else
  bad "make install failed: $(tail -n 5 "$tmp/install.log")"
fi

echo "cli: $pass passed, $fail failed, 0 skipped"
[ "$fail" -eq 0 ]
