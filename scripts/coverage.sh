#!/bin/sh
# Counts the error-raising sites of the library that the tests reached, from
# the gcov data of a build made with --coverage and run (make coverage does
# both).
#
# A site is a call, in src/, of PLUMB_RAISE, PLUMB_RAISE_KEY, PLUMB_RAISE_AT,
# plumbp_raise, or of a function that raises through plumbp_vraise (such a
# wrapper, e.g. plumby_raise, is found in the sources; its own body is not
# a site, each of its callers is). Definitions, prototypes and comments are
# not sites. A site is reached when gcov counted an execution on any line of
# its statement in any translation unit (a static helper in a header counts
# once, reached when any file that includes it ran it). No site shares its
# line with the condition that guards it (checked: such a line would count
# as run whenever the condition was tested).
#
# tests/unreachable.txt lists sites no test can reach, each with its reason:
#   FILE "TEXT" reason      (TEXT: a part of the site's statement)
# They are counted apart; an entry that matches no site, or matches a site
# the tests did reach, is an error (exit 1).
#
# Prints the unreached sites, then
#   N of M error-raising sites reached (P %)
#   ... out of memory: A of B; listed unreachable: U; of the rest: N of M-U (Q %)
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
  # The list of unreachable sites.
  FILENAME == listfile {
    if ($0 ~ /^[ \t]*(#|$)/) next
    t = $0; q1 = index(t, "\""); rest = substr(t, q1 + 1); q2 = index(rest, "\"")
    if (q1 == 0 || q2 == 0) { bad_list[++nbl] = "  " listfile ":" FNR ": expected FILE \"TEXT\" reason"; next }
    nl++; lfile[nl] = $1; ltext[nl] = substr(rest, 1, q2 - 1); lreason[nl] = substr(rest, q2 + 1)
    gsub(/^[ \t]+/, "", lreason[nl])
    if (lreason[nl] == "") bad_list[++nbl] = "  " listfile ":" FNR ": no reason given"
    lline[nl] = FNR
    next
  }
  # First pass over the sources: the wrappers, functions whose body calls
  # plumbp_vraise (src/core/error.c defines it and plumbp_raise).
  pass == 1 {
    if ($0 ~ /^[A-Za-z_]/ && $0 ~ /\(/ && $0 !~ /;[ \t]*$/ && $0 !~ /^#/) {
      t = $0; sub(/\(.*/, "", t); sub(/.*[ *]/, "", t); fn = t
    }
    if ($0 ~ /^[ \t]+.*plumbp_vraise[ \t]*\(/ && FILENAME != "src/core/error.c") wrap[fn] = 1
    next
  }
  FNR == 1 && pass == 2 && open { finish(); open = 0 }
  {
    text = $0
    if (open) {
      best = best_of(FILENAME, FNR, best); stmt = stmt " " text
      if (text ~ /;[ \t]*$/ || FNR - start > 12) { finish(); open = 0 }
      next
    }
    if (!is_site(text)) next
    sites++; open = 1; start = FNR; file = FILENAME; first = text; stmt = text
    best = best_of(FILENAME, FNR, -1)
    if (text ~ /;[ \t]*$/) { finish(); open = 0 }
  }
  function is_site(t,   w, re) {
    if (t !~ /^[ \t]/) return 0                       # definitions, prototypes
    if (t ~ /^[ \t]*(#|\/\*|\*|\/\/)/) return 0       # comments, macros
    if (t ~ /(^|[^A-Za-z0-9_])(PLUMB_RAISE(_KEY|_AT)?|plumbp_raise)[ \t]*\(/) return 1
    for (w in wrap) {
      re = "(^|[^A-Za-z0-9_])" w "[ \t]*\\("
      if (t ~ re) return 1
    }
    return 0
  }
  function best_of(fn, ln, b,   k) {
    k = fn SUBSEP ln
    if ((k in cnt) && cnt[k] > b) return cnt[k]
    return b
  }
  function finish(   t, i, listed) {
    oom = (stmt ~ /PLUMB_ENOMEM|out of memory/)
    if (oom) oom_sites++
    listed = 0
    for (i = 1; i <= nl; i++)
      if (lfile[i] == file && index(stmt, ltext[i]) > 0) { lhits[i]++; listed = i }
    if (best > 0) {
      reached++; if (oom) oom_reached++
      if (listed) stale[++ns] = sprintf("  %s:%d: %s \"%s\" is listed unreachable but the tests reached it",
                                        listfile, lline[listed], lfile[listed], ltext[listed])
      return
    }
    if (listed) { unreachable++; return }
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
    for (i = 1; i <= nl; i++)
      if (!lhits[i]) bad_list[++nbl] = sprintf("  %s:%d: %s \"%s\" matches no site", listfile,
                                               lline[i], lfile[i], ltext[i])
    wn = 0; for (w in wrap) wn++
    printf "lines of src/ run by the tests: %d of %d (%.1f %%)\n", run, lines,
           lines ? 100 * run / lines : 0
    printf "sites: calls of PLUMB_RAISE*, plumbp_raise and %d wrappers:", wn
    for (w in wrap) printf " %s", w
    printf "\n"
    printf "%d of %d error-raising sites reached (%.1f %%)\n", reached, sites,
           sites ? 100 * reached / sites : 0
    rest = sites - unreachable
    printf "  out of memory: %d of %d; listed unreachable (%s): %d; of the rest: %d of %d (%.1f %%)\n",
           oom_reached, oom_sites, listfile, unreachable, reached, rest,
           (rest > 0) ? 100 * reached / rest : 0
    if (ns + nbl > 0) {
      print "tests/unreachable.txt is out of date:"
      for (i = 1; i <= ns; i++) print stale[i]
      for (i = 1; i <= nbl; i++) print bad_list[i]
      exit 1
    }
  }
' gcovfile="$tmp/gcov.txt" listfile=tests/unreachable.txt "$tmp/gcov.txt" tests/unreachable.txt \
  pass=1 $sources pass=2 $sources
