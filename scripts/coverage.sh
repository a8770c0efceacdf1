#!/bin/sh
# Counts the error-raising sites of the library that the tests reached, from
# the gcov data of a build made with --coverage and run (make coverage does
# both). A site is a line of src/ that calls PLUMB_RAISE, PLUMB_RAISE_KEY or
# PLUMB_RAISE_AT (their definitions and comments are not sites); it is
# reached when gcov counted an execution on the call's lines in any
# translation unit (a static helper in a header counts once, reached when
# any file that includes it ran it). Prints the unreached sites, then
#   N of M error-raising sites reached (P %)
#
#   sh scripts/coverage.sh BUILD      (BUILD/obj holds the .gcno and .gcda files)
#
# Run from anywhere; gcov runs from the source root and writes no files.
set -u
[ $# -eq 1 ] || { echo "usage: sh scripts/coverage.sh BUILD" >&2; exit 2; }
b=$1
case $b in /*) ;; *) b=$(pwd)/$b ;; esac
root=$(cd "$(dirname "$0")/.." && pwd)
cd "$root" || exit 2
command -v gcov >/dev/null 2>&1 || { echo "coverage: gcov is not installed" >&2; exit 2; }

gcnos=$(find "$b/obj/src" -name '*.gcno' 2>/dev/null | sort)
if [ -z "$gcnos" ]; then
  echo "coverage: no .gcno files under $b/obj/src; build with make coverage" >&2
  exit 2
fi
if [ -z "$(find "$b/obj/src" -name '*.gcda' 2>/dev/null)" ]; then
  echo "coverage: no .gcda files under $b/obj/src; run the tests of $b first" >&2
  exit 2
fi

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-coverage.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

# gcov's annotated sources on stdout (-t), one section per source file.
for g in $gcnos; do
  gcov -t "$g" 2>>"$tmp/gcov.err"
done >"$tmp/gcov.txt"

sources=$(find src -name '*.c' -o -name '*.h' | sort)
# shellcheck disable=SC2086
awk '
  # gcov text: "COUNT:LINE:SOURCE", COUNT a number (maybe with *), ##### or
  # ===== (never run) or - (no code). Keep the largest count per line.
  FILENAME == gcovfile {
    if (match($0, /^ *-: *0:Source:/)) { src = substr($0, RLENGTH + 1); next }
    if (!match($0, /^ *[^:]+: *[0-9]+:/)) next
    head = substr($0, 1, RLENGTH)
    split(head, f, ":")
    c = f[1]; gsub(/[ *]/, "", c); ln = f[2] + 0
    n = (c == "-") ? -1 : (c ~ /^[#=]+$/) ? 0 : c + 0
    k = src SUBSEP ln
    if (!(k in cnt) || n > cnt[k]) cnt[k] = n
    if (n >= 0) { exe[k] = 1 }
    next
  }
  # Sources: the call sites, each with the lines up to the end of its statement.
  FNR == 1 && open { finish(); open = 0 }
  {
    text = $0
    if (open) {
      best = best_of(FILENAME, FNR, best)
      if (text ~ /;[ \t]*$/ || FNR - start > 12) { finish(); open = 0 }
      next
    }
    if (text !~ /PLUMB_RAISE(_KEY|_AT)?[ \t]*\(/) next
    if (text ~ /^[ \t]*(#|\/\*|\*|\/\/)/) next
    sites++; open = 1; start = FNR; file = FILENAME; first = text
    best = best_of(FILENAME, FNR, -1)
    if (text ~ /;[ \t]*$/) { finish(); open = 0 }
  }
  function best_of(fn, ln, b,   k) {
    k = fn SUBSEP ln
    if ((k in cnt) && cnt[k] > b) return cnt[k]
    return b
  }
  function finish(   t) {
    if (best > 0) { reached++; return }
    t = first; sub(/^[ \t]+/, "", t)
    if (length(t) > 90) t = substr(t, 1, 87) "..."
    unreached[++nu] = sprintf("  %s:%d%s  %s", file, start,
                              best < 0 ? " (no gcov data)" : "", t)
  }
  END {
    lines = 0; run = 0
    for (k in exe) { split(k, p, SUBSEP); if (p[1] ~ /^src\//) { lines++; if (cnt[k] > 0) run++ } }
    if (nu > 0) {
      print "unreached error-raising sites:"
      for (i = 1; i <= nu; i++) print unreached[i]
    }
    printf "lines of src/ run by the tests: %d of %d (%.1f %%)\n", run, lines,
           lines ? 100 * run / lines : 0
    printf "%d of %d error-raising sites reached (%.1f %%)\n", reached, sites,
           sites ? 100 * reached / sites : 0
  }
' gcovfile="$tmp/gcov.txt" "$tmp/gcov.txt" $sources
