#!/bin/sh
# No tracked file cites a check value by pointing at a notes file outside
# the repository ("shared/references.md", "references-physics.md 3c" ...):
# a reader of the repository cannot open those. Each value names its
# publication, with its status, in the repository itself (DEVELOPERS.md,
# "Unit tests"). Scans every file `git ls-files` lists (every file under
# the source root when it is not a git checkout), text files only.
#
# Allowed: tests/test_criteria.c's line that refuses such paths in
# criteria files, and this script. Also shows the scan failing on planted
# pointers, so that this test can fail.
#
#   sh tests/cli/no_outside_refs.sh PLUMB
#
# Takes the plumb binary as $1 (unused) like the other CLI scripts.
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
. "$(dirname "$0")/lib/setup.sh"
pass=0; fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-refs.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

self=tests/cli/no_outside_refs.sh
pattern='shared/references|references[-_.a-z0-9]*\.md'
# The one line allowed: test_criteria.c's refusal of such paths.
allowed='^tests/test_criteria\.c:[0-9]*: *if \(strstr\(text, "references\.md"\) \|\| strstr\(text, "\.\./"\) \|\| strstr\(text, "shared/"\)\)$'

# scan DIR: prints FILE:LINE:TEXT for every pointer in the files listed
# (relative to DIR) on stdin, less the allowed ones.
scan() {
  (cd "$1" && grep -v -x -F "$self" | tr '\n' '\0' |
     xargs -0 -r grep -H -I -n -i -E "$pattern") | grep -v -E "$allowed"
  return 0
}

if git ls-files >"$tmp/files" 2>/dev/null && [ -s "$tmp/files" ]; then :
else
  find . -type f ! -path './.git/*' ! -path './build/*' | sed 's|^\./||' >"$tmp/files"
fi

# 1. The tree names no outside notes file.
scan . <"$tmp/files" >"$tmp/hits"
if [ -s "$tmp/hits" ]; then
  bad "$(wc -l <"$tmp/hits") place(s) point at notes outside the repository; cite the publication instead:"
  cat "$tmp/hits"
else ok; fi

# 2. The scan finds planted pointers of each form, and lets the allowed
#    refusal line through only in tests/test_criteria.c.
mkdir -p "$tmp/tree/tests" "$tmp/tree/src"
printf '/* rho = 1.2250 (shared/references.md) */\n' >"$tmp/tree/src/a.c"
printf '# L_u by height (references-physics.md 3c)\n' >"$tmp/tree/src/b.py"
printf 'See /work/shared/references-physics.md section 4.\n' >"$tmp/tree/c.md"
printf '/* Table I (References.md) */\n' >"$tmp/tree/src/d.h"
printf '%s\n' '        if (strstr(text, "references.md") || strstr(text, "../") || strstr(text, "shared/"))' \
  >"$tmp/tree/tests/test_criteria.c"
cp "$tmp/tree/tests/test_criteria.c" "$tmp/tree/src/e.c"
printf 'src/a.c\nsrc/b.py\nc.md\nsrc/d.h\ntests/test_criteria.c\nsrc/e.c\n' | scan "$tmp/tree" >"$tmp/hits"
for f in src/a.c src/b.py c.md src/d.h src/e.c; do
  if grep -q "^$f:" "$tmp/hits"; then ok; else bad "a pointer planted in $f was not found"; fi
done
if grep -q '^tests/test_criteria.c:' "$tmp/hits"; then bad "the allowed refusal line was flagged"; else ok; fi

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
