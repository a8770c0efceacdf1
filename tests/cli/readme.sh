#!/bin/sh
# The README's example outputs are what plumb prints today: every block
# marked `<!-- example: plumb ... -->` is run again by
# scripts/readme-examples.sh and must be unchanged. Also shows the checker
# failing on a stale copy and --update mending it, so that this test can
# fail.
#
#   sh tests/cli/readme.sh PLUMB
#
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
. "$(dirname "$0")/lib/setup.sh"

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-readme-test.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

# 1. Every example of README.md, one check each.
sh scripts/readme-examples.sh "$bin" README.md >"$tmp/check.out" 2>&1
rc=$?
summary=$(tail -n 1 "$tmp/check.out")
[ $rc -eq 1 ] && summary=$(grep '^readme-examples:' "$tmp/check.out" | tail -n 1)
n=$(echo "$summary" | sed -n 's/^readme-examples: \([0-9]*\) examples, \([0-9]*\) differ$/\1/p')
d=$(echo "$summary" | sed -n 's/^readme-examples: \([0-9]*\) examples, \([0-9]*\) differ$/\2/p')
if [ -z "$n" ] || { [ $rc -ne 0 ] && [ $rc -ne 1 ]; }; then
  bad "scripts/readme-examples.sh failed (exit $rc)"
  cat "$tmp/check.out"
else
  pass=$((pass + n - d))
  if [ "$d" -gt 0 ]; then
    fail=$((fail + d))
    echo "FAIL: $d of $n README examples differ from what plumb prints:"
    cat "$tmp/check.out"
  fi
fi

# 2. Every command `plumb --help` lists has its example (a README without
# markers would pass 1).
cmds=$("$bin" --help | awk '/^Commands:/ { on = 1; next } on && /^  [a-z]/ { print $1 } on && /^$/ { exit }')
[ -n "$cmds" ] || bad "plumb --help lists no commands"
for c in $cmds; do
  if grep -q "^<!-- example: plumb $c " README.md; then ok
  else bad "README.md has no checked example of plumb $c"; fi
done

# 3. A stale copy is refused, naming its line, and --update mends it (on
# the limit example alone, to stay quick).
awk '/^<!-- example: plumb limit / { on = 1 } on { print } on && /^```$/ && ++f == 2 { exit }' \
  README.md >"$tmp/limit.md"
line=$(grep -n 'falls$' "$tmp/limit.md" | head -n 1 | cut -d: -f1)
sed "${line:-1}s/(\([0-9]\)/(1\1/" "$tmp/limit.md" >"$tmp/stale.md"
if [ -z "$line" ] || cmp -s "$tmp/limit.md" "$tmp/stale.md"; then
  bad "could not make a stale copy of the limit example (its line 'N falls')"
else
  sh scripts/readme-examples.sh "$bin" "$tmp/stale.md" >"$tmp/stale.out" 2>&1
  rc=$?
  if [ $rc -eq 1 ] && grep -q "stale.md:1: example differs: plumb limit" "$tmp/stale.out"; then ok
  else bad "a stale example is not refused (exit $rc): $(head -n 3 "$tmp/stale.out")"; fi
  sh scripts/readme-examples.sh --update "$bin" "$tmp/stale.md" >"$tmp/update.out" 2>&1
  rc=$?
  if [ $rc -eq 0 ] && cmp -s "$tmp/limit.md" "$tmp/stale.md"; then ok
  else bad "--update does not restore the example (exit $rc)"; fi
fi

# 4. A marker without its block is an error (exit 2), not a silent pass.
printf '<!-- example: plumb air -->\nno block\n' >"$tmp/nofence.md"
sh scripts/readme-examples.sh "$bin" "$tmp/nofence.md" >"$tmp/nofence.out" 2>&1
rc=$?
if [ $rc -eq 2 ] && grep -q 'nofence.md:2: an example marker must be followed' "$tmp/nofence.out"
then ok; else bad "a marker without a block: exit $rc, $(head -n 2 "$tmp/nofence.out")"; fi

echo "cli: $pass passed, $fail failed"
[ $fail -eq 0 ]
