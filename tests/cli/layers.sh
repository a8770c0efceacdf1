#!/bin/sh
# The layers of the source tree (DEVELOPERS.md, "Layers"): the tree as it
# is passes scripts/check-layers.sh, and a copy of it with one include that
# breaks the order (physics reaching up to the report writers), and one
# with a library file that prints, are refused: so the check can fail.
# Takes the plumb binary as $1 (unused) like the other CLI scripts.
. "$(dirname "$0")/lib/setup.sh"
pass=0; fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-layers.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT

if sh scripts/check-layers.sh >"$tmp/out" 2>&1; then ok; else bad "the tree breaks its layers:"; cat "$tmp/out"; fi

mkdir -p "$tmp/up" && cp -R src include "$tmp/up/"
sed -i '1i #include "report/textout.h"' "$tmp/up/src/physics/gravity.c"
if sh scripts/check-layers.sh "$tmp/up" >"$tmp/out" 2>&1; then bad "an upward include was not refused"
elif grep -q 'src/physics/gravity.c (physics) includes report/textout.h (report), a higher layer' "$tmp/out"; then ok
else bad "an upward include was refused for the wrong reason:"; cat "$tmp/out"; fi

mkdir -p "$tmp/pr" && cp -R src include "$tmp/pr/"
printf 'void plumbp_noise(void);\nvoid plumbp_noise(void) { printf("hello\\n"); }\n' >>"$tmp/pr/src/physics/wind.c"
if sh scripts/check-layers.sh "$tmp/pr" >"$tmp/out" 2>&1; then bad "a printing physics file was not refused"
elif grep -q 'src/physics/wind.c prints or exits' "$tmp/out"; then ok
else bad "a printing file was refused for the wrong reason:"; cat "$tmp/out"; fi

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
