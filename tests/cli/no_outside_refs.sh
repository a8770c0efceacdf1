#!/bin/sh
# No tracked file points at a document outside the repository, which a
# reader of the repository cannot open (DEVELOPERS.md, the opening and
# "Unit tests"):
#  - a notes file of check values ("shared/references.md",
#    "references-physics.md 3c" ...): each value names its publication,
#    with its status, in the repository itself;
#  - the team's design notes, by file name in any case ("design.md section
#    6", "Design.MD"), in an identifier ("test_design_md_section_5_...",
#    "..._of_design_section_6") or as "design section 2": a fact of the
#    contract names the README.md, SAFETY.md or DEVELOPERS.md section that
#    states it, a method its publication;
#  - an issue of the team's tracker by its number ("(issue 9)", "Issue 8:",
#    "issues 4"): the tracker is outside the repository too, so a comment
#    says the reason itself (why the code or the test is like that), not
#    where it was asked for;
#  - anything in the team's shared folder ("../shared/...",
#    "/work/shared/...", such as its tools): none of it ships with plumb. A
#    document that must describe that tooling would need its line added to
#    the allowed list below, with the reason; there is none today.
# Scans every file `git ls-files` lists (every file under the source root
# when it is not a git checkout), text files only.
#
# Allowed: tests/test_criteria.c's line that refuses such paths in
# criteria files, and this script. Also shows the scan failing on planted
# pointers of each form, and passing lines that only look alike, so that
# this test can fail and does not cry wolf.
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
pattern='shared/references|references[-_.a-z0-9]*\.md|design[._]md|design[ _]section[ _]?[0-9]|(\.\./|/work/)shared/|(^|[^a-z0-9_])issues? #?[0-9]'
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

# 1. The tree points at nothing outside the repository.
scan . <"$tmp/files" >"$tmp/hits"
if [ -s "$tmp/hits" ]; then
  bad "$(wc -l <"$tmp/hits") place(s) point outside the repository; name the README.md, SAFETY.md or DEVELOPERS.md section, the publication, or the reason itself, instead:"
  cat "$tmp/hits"
else ok; fi

# 2. The scan finds planted pointers of each form, lets the allowed
#    refusal line through only in tests/test_criteria.c, and passes lines
#    that only look like pointers (a publication's title, in-repo
#    sections, a system path).
mkdir -p "$tmp/tree/tests" "$tmp/tree/src"
printf '/* rho = 1.2250 (shared/references.md) */\n' >"$tmp/tree/src/a.c"
printf '# L_u by height (references-physics.md 3c)\n' >"$tmp/tree/src/b.py"
printf 'See /work/shared/references-physics.md section 4.\n' >"$tmp/tree/c.md"
printf '/* Table I (References.md) */\n' >"$tmp/tree/src/d.h"
printf '%s\n' '        if (strstr(text, "references.md") || strstr(text, "../") || strstr(text, "shared/"))' \
  >"$tmp/tree/tests/test_criteria.c"
cp "$tmp/tree/tests/test_criteria.c" "$tmp/tree/src/e.c"
printf '/* The JSON keys (design.md section 6). */\n' >"$tmp/tree/src/f.c"
printf '# every report carries the cautions (Design.MD 7)\n' >"$tmp/tree/tests/g.py"
printf 'static void test_design_md_section_5_example_loads(void **state)\n' >"$tmp/tree/tests/h.c"
printf '/* Design section 2: w = 0 at and below z = 0. */\n' >"$tmp/tree/tests/i.c"
printf 'static void test_json_has_the_keys_of_design_section_6(void **state)\n' >"$tmp/tree/tests/m.c"
printf 'Run ../shared/tools/check-contract before a merge.\n' >"$tmp/tree/j.md"
printf '# the layers: /work/shared/style.md\n' >"$tmp/tree/src/k.sh"
printf '    /* an error in the key --find gave is that option'"'"'s (issue 9) */\n' >"$tmp/tree/src/n.c"
printf '"""Issue 10: the zone where things land."""\n' >"$tmp/tree/tests/o.py"
printf '# tracked as issue #12\n' >"$tmp/tree/tests/p.sh"
printf '%s\n' '/* Knacke, Parachute Recovery Systems Design Manual (NWC TP 6575). */' \
  '/* README.md "The model", SAFETY.md section 1, DEVELOPERS.md "Layers". */' \
  '/* criteria installed in /usr/local/share/plumb/criteria/ */' \
  '/* soft tissue 3 cm deep; the issue is 2 things at once; reissue 4 */' >"$tmp/tree/src/l.c"
printf 'src/a.c\nsrc/b.py\nc.md\nsrc/d.h\ntests/test_criteria.c\nsrc/e.c\nsrc/f.c\ntests/g.py\ntests/h.c\ntests/i.c\nj.md\nsrc/k.sh\nsrc/l.c\ntests/m.c\nsrc/n.c\ntests/o.py\ntests/p.sh\n' |
  scan "$tmp/tree" >"$tmp/hits"
for f in src/a.c src/b.py c.md src/d.h src/e.c src/f.c tests/g.py tests/h.c tests/i.c j.md src/k.sh tests/m.c src/n.c tests/o.py tests/p.sh; do
  if grep -q "^$f:" "$tmp/hits"; then ok; else bad "a pointer planted in $f was not found"; fi
done
if grep -q '^tests/test_criteria.c:' "$tmp/hits"; then bad "the allowed refusal line was flagged"; else ok; fi
if grep -q '^src/l.c:' "$tmp/hits"; then bad "a line that is no pointer was flagged: $(grep '^src/l.c:' "$tmp/hits")"; else ok; fi

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
