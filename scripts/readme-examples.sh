#!/bin/sh
# The README's example outputs, made by the program itself.
#
#   sh scripts/readme-examples.sh [--update] PLUMB [README]
#
# Every example in README (default: README.md of the source tree) is a
# fenced block right after a marker line naming the exact command:
#
#   <!-- example: plumb fall profiles/demo/hand-tool.yaml -->
#   <!-- example: plumb air --alt 0m:3km:1km (lines 1-8) -->
#
# The command starts with `plumb` (run as PLUMB); it is run from the source
# root under LC_ALL=C with the source tree's criteria. The block is the
# command after `$ `, then what it writes to standard output, and when it
# exits non-zero, what it writes to standard error after that. A trailing
# `(lines A-B,C-D)` keeps only those lines of the output, with `  ...` for
# every part left out. Keep examples fast and deterministic: a zone names
# its --samples and --threads (the text report states the thread count).
#
# Without --update it checks: it prints `README:LINE: example differs: CMD`
# and the difference for each stale block, and exits 1 if any is. With
# --update it rewrites the stale blocks in place. Either way its last line
# is `readme-examples: N examples, N differ`. Exit 2 on a usage error or a
# malformed marker.
set -u
LC_ALL=C
export LC_ALL

update=0
if [ "${1:-}" = "--update" ]; then
  update=1
  shift
fi
if [ $# -lt 1 ] || [ $# -gt 2 ]; then
  echo "usage: sh $0 [--update] PLUMB [README]" >&2
  exit 2
fi
bin=$1
case $bin in /*) ;; *) bin=$(pwd)/$bin ;; esac
root=$(cd "$(dirname "$0")/.." && pwd)
readme=${2:-$root/README.md}
case $readme in /*) ;; *) readme=$(pwd)/$readme ;; esac
if [ ! -x "$bin" ] || [ ! -f "$readme" ]; then
  echo "readme-examples: cannot run '$bin' or read '$readme'" >&2
  exit 2
fi
cd "$root" || exit 2
PLUMB_CRITERIA_DIR=profiles/criteria
export PLUMB_CRITERIA_DIR

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-readme.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

# The markers: "LINE<TAB>COMMAND<TAB>LINES" per example, checked for a
# fenced block right after each and the end of that block.
awk -v f="$readme" '
  function fail(msg) { printf "%s:%d: %s\n", f, NR, msg > "/dev/stderr"; bad = 1; exit 2 }
  expect_fence { if ($0 != "```") fail("an example marker must be followed by a ``` line");
                 expect_fence = 0; inblock = 1; next }
  inblock { if ($0 == "```") inblock = 0; next }
  /^<!-- example:/ {
    if ($0 !~ /^<!-- example: plumb [^\t]* -->$/)
      fail("expected <!-- example: plumb ARGS [(lines A-B,...)] -->")
    cmd = $0; sub(/^<!-- example: /, "", cmd); sub(/ -->$/, "", cmd)
    lines = ""
    if (cmd ~ / \(lines [0-9,-]+\)$/) {
      lines = cmd; sub(/^.* \(lines /, "", lines); sub(/\)$/, "", lines)
      sub(/ \(lines [0-9,-]+\)$/, "", cmd)
    }
    printf "%d\t%s\t%s\n", NR, cmd, lines
    expect_fence = 1; next
  }
  END { if (bad) exit 2; if (expect_fence || inblock) fail("example block not closed") }
' "$readme" >"$tmp/markers" || exit 2

n=0
ndiff=0
while IFS='	' read -r line cmd lines; do
  n=$((n + 1))
  args=${cmd#plumb}
  # The command exactly as a reader would type it, quotes included.
  eval "\"\$bin\" $args" >"$tmp/out" 2>"$tmp/err" </dev/null
  rc=$?
  if [ $rc -ne 0 ]; then
    cat "$tmp/err" >>"$tmp/out"
  fi
  {
    printf '$ %s\n' "$cmd"
    if [ -z "$lines" ]; then
      cat "$tmp/out"
    else
      awk -v spec="$lines" '
        BEGIN { n = split(spec, r, ","); for (i = 1; i <= n; i++) {
                  split(r[i], ab, "-"); lo[i] = ab[1] + 0; hi[i] = (ab[2] == "" ? ab[1] : ab[2]) + 0 } }
        { out[NR] = $0 }
        END { last = 0
              for (i = 1; i <= n; i++) {
                if (lo[i] > last + 1) print "  ..."
                for (k = lo[i]; k <= hi[i] && k <= NR; k++) print out[k]
                last = hi[i] }
              if (NR > last) print "  ..." }' "$tmp/out"
    fi
  } >"$tmp/block.$n"
  # The block now in the README, for comparison.
  awk -v from="$line" 'NR > from + 1 { if ($0 == "```") exit; print }' "$readme" >"$tmp/old.$n"
  if ! cmp -s "$tmp/old.$n" "$tmp/block.$n"; then
    ndiff=$((ndiff + 1))
    if [ $update -eq 1 ]; then
      echo "$readme:$line: example updated: $cmd (exit $rc)"
    else
      echo "$readme:$line: example differs: $cmd"
      diff "$tmp/old.$n" "$tmp/block.$n" | head -n 20
    fi
  fi
done <"$tmp/markers"

if [ $update -eq 1 ] && [ $ndiff -gt 0 ]; then
  # Every block replaced by its new text; the rest copied as it is.
  awk -v dir="$tmp" '
    skip { if ($0 == "```") { skip = 0; print } ; next }
    /^<!-- example:/ { print; k++; getline; print
                       f = dir "/block." k
                       while ((getline l < f) > 0) print l
                       close(f); skip = 1; next }
    { print }' "$readme" >"$tmp/new" &&
    cat "$tmp/new" >"$readme" || exit 2
fi
echo "readme-examples: $n examples, $ndiff differ"
if [ $update -eq 0 ] && [ $ndiff -gt 0 ]; then
  echo "(to take the program's output: sh scripts/readme-examples.sh --update PLUMB, then read git diff README.md)"
  exit 1
fi
exit 0
