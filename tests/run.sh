#!/bin/sh
# Runs every cmocka test program (BUILD/tests/test_*) and every CLI and
# reference script (tests/cli/*.sh, tests/ref/*.sh, given BUILD/plumb) for
# each build directory given (default: build), JOBS at a time, then prints
# one summary line:
#   check: N passed, N failed, N skipped
# Exit status 0 only when nothing failed.
#
#   sh tests/run.sh [-j JOBS] [-v] [BUILD...]
#
# One line per test program or script as it finishes; the full output of
# every one that failed (of all of them with -v) comes after. Each runs
# from the source root with its own empty TMPDIR; a test that leaves
# anything there fails.
#
# Skips. A cmocka test that calls skip() is one skip, named
# PROGRAM:TEST. A script reports its skips with lines `skip: ID: reason`
# and ends with `cli: N passed, N failed, N skipped` (the old form without
# skips still reads as 0 skipped); its skips are named SCRIPT:ID. Under CI
# (environment CI=true) a skip fails the run unless its name is listed in
# tests/optional.txt with the reason it may be skipped.
set -u
export LC_ALL=C
root=$(cd "$(dirname "$0")/.." && pwd)
optional=$root/tests/optional.txt
# Under the sanitizer build: fontconfig's process-long caches (the sheet's,
# through pango) are not leaks of ours; tests/lsan.supp says why.
LSAN_OPTIONS="suppressions=$root/tests/lsan.supp:print_suppressions=0${LSAN_OPTIONS:+:$LSAN_OPTIONS}"
export LSAN_OPTIONS
# ... and no symbolization: LeakSanitizer matches those suppressions by
# module name, but tries each frame's function name too, reading the debug
# information of every library on the stack, in every process that loads
# fontconfig (0.15 s of a 0.9 s `plumb sheet`). A report still names each
# frame as module+offset and UBSan's its file:line; for function names and
# lines, run again with ASAN_OPTIONS=symbolize=1 (a later flag wins).
ASAN_OPTIONS="symbolize=0${ASAN_OPTIONS:+:$ASAN_OPTIONS}"
export ASAN_OPTIONS

# ---- one test (run by xargs): --one WORKDIR INDEX ---------------------------
if [ "${1:-}" = "--one" ]; then
  work=$2; i=$3
  { read -r kind; read -r t; read -r b; } <"$work/job.$i"
  log=$work/$i.log
  tmp=$work/tmp.$i
  mkdir "$tmp" || exit 2
  start=$(date +%s)
  case $kind in
    prog) TMPDIR=$tmp "$b/tests/$t" >"$log" 2>&1 ;;
    script) TMPDIR=$tmp sh "$t" "$b/plumb" >"$log" 2>&1 ;;
  esac
  rc=$?
  secs=$(( $(date +%s) - start ))
  # CPU seconds (user + sys) of the test and all it started: the second
  # line of `times` (run in this shell, not a subshell, which would count 0).
  times >"$work/$i.times"
  cpu=$(sed -n '2{s/[ms]/ /g;p;}' "$work/$i.times" | awk '{printf "%.1f", $1 * 60 + $2 + $3 * 60 + $4}')
  p=0; f=0; s=0; why=""
  : >"$work/$i.skips"
  if [ "$kind" = prog ]; then
    p=$(sed -n 's/^\[  PASSED  \] \([0-9]*\) test.*/\1/p' "$log" | awk '{s+=$1} END {print s+0}')
    f=$(sed -n 's/^\[  FAILED  \] \([0-9]*\) test.*/\1/p' "$log" | awk '{s+=$1} END {print s+0}')
    s=$(sed -n 's/^\[  SKIPPED \] \([0-9]*\) test(s).*/\1/p' "$log" | awk '{s+=$1} END {print s+0}')
    sed -n '/^\[  SKIPPED \] [0-9]* test(s)/d; s/^\[  SKIPPED \] \(.*\)/\1/p' "$log" | sort -u |
      while read -r name; do echo "$t:$name cmocka skip()"; done >"$work/$i.skips"
    [ "$rc" -ne 0 ] && [ "$f" -eq 0 ] && { f=1; why="exited $rc"; }
    [ $((p + f + s)) -eq 0 ] && { f=1; why="ran no tests"; }
  else
    name=${t##*/}
    last=$(grep -E '^cli: [0-9]+ passed, [0-9]+ failed(, [0-9]+ skipped)?$' "$log" | tail -n 1)
    if [ -z "$last" ]; then
      f=1; why="printed no 'cli: N passed, N failed, N skipped' line (exit $rc)"
    else
      set -- $last
      p=$2; f=$4; s=${6:-0}
      [ "$rc" -ne 0 ] && [ "$f" -eq 0 ] && { f=1; why="exited $rc"; }
      [ $((p + f + s)) -eq 0 ] && { f=1; why="ran no checks"; }
    fi
    sed -n 's/^skip: \([^:]*\): *\(.*\)/\1 \2/p' "$log" |
      while read -r id reason; do echo "$name:$id $reason"; done >"$work/$i.skips"
    n=$(wc -l <"$work/$i.skips")
    while [ "$n" -lt "$s" ]; do echo "$name:? (skip without a 'skip: ID: reason' line)" >>"$work/$i.skips"; n=$((n + 1)); done
  fi
  left=$(cd "$tmp" && ls -A)
  if [ -n "$left" ]; then
    f=$((f + 1)); why="${why:+$why; }left files in TMPDIR: $(echo $left)"
  fi
  rm -rf "$tmp"
  echo "$p $f $s" >"$work/$i.res"
  [ -n "$why" ] && echo "!! $why" >>"$log"
  if [ "$f" -gt 0 ]; then word=FAIL; elif [ "$s" -gt 0 ]; then word=skip; else word=ok; fi
  printf '%-4s %s [%s]: %d passed, %d failed, %d skipped (%d s, %s s CPU)%s\n' \
    "$word" "$t" "$b" "$p" "$f" "$s" "$secs" "$cpu" "${why:+ - $why}"
  exit 0
fi

# ---- the whole run ----------------------------------------------------------
jobs=1; verbose=0
while [ $# -gt 0 ]; do
  case $1 in
    -j) jobs=$2; shift 2 ;;
    -j*) jobs=${1#-j}; shift ;;
    -v) verbose=1; shift ;;
    --) shift; break ;;
    -*) echo "usage: sh tests/run.sh [-j JOBS] [-v] [BUILD...]" >&2; exit 2 ;;
    *) break ;;
  esac
done
[ $# -eq 0 ] && set -- build
case $jobs in ''|*[!0-9]*|0) echo "run.sh: -j needs a positive number, found '$jobs'" >&2; exit 2 ;; esac

dirs=""
for b in "$@"; do
  case $b in /*) ;; *) b=$(pwd)/$b ;; esac
  if [ ! -x "$b/plumb" ]; then
    echo "run.sh: $b/plumb is missing; build first (make tests BUILD=...)" >&2
    exit 2
  fi
  dirs="$dirs $b"
done
cd "$root" || exit 2
PLUMB_SRCDIR=$root
export PLUMB_SRCDIR

work=$(mktemp -d "${TMPDIR:-/tmp}/plumb-run.XXXXXX") || exit 2
trap 'rm -rf "$work"' EXIT
trap 'exit 2' HUP INT PIPE TERM

# Scripts first, the last build directory (the sanitizer build) first: they
# are the slow ones, so the short test programs fill in at the end.
n=0
add() { n=$((n + 1)); printf '%s\n%s\n%s\n' "$1" "$2" "$3" >"$work/job.$n"; }
rev=""
for b in $dirs; do rev="$b $rev"; done
for b in $rev; do
  for t in tests/cli/*.sh tests/ref/*.sh; do [ -f "$t" ] && add script "$t" "$b"; done
done
for b in $rev; do
  for t in "$b"/tests/test_*; do [ -f "$t" ] && [ -x "$t" ] && add prog "${t##*/}" "$b"; done
done

i=1
while [ "$i" -le "$n" ]; do echo "$i"; i=$((i + 1)); done |
  xargs -P "$jobs" -n 1 sh "$root/tests/run.sh" --one "$work"

passed=0; failed=0; skipped=0
i=1
while [ "$i" -le "$n" ]; do
  if [ -f "$work/$i.res" ]; then
    read -r p f s <"$work/$i.res"
  else
    p=0; f=1; s=0; echo "!! job $i did not finish" >>"$work/$i.log"
  fi
  passed=$((passed + p)); failed=$((failed + f)); skipped=$((skipped + s))
  if [ "$f" -gt 0 ] || [ "$verbose" = 1 ]; then
    { read -r kind; read -r t; read -r b; } <"$work/job.$i"
    echo "==== $t [$b]"
    cat "$work/$i.log"
  fi
  i=$((i + 1))
done
if [ "$failed" -gt 0 ] && grep -q -l 'Sanitizer' "$work"/*.log 2>/dev/null; then
  echo "sanitizer frames above are module+offset: for names and lines run again with ASAN_OPTIONS=symbolize=1"
fi

# Skips: listed with their reasons; under CI only those in tests/optional.txt may skip.
cat "$work"/*.skips 2>/dev/null | sort | uniq -c | sed 's/^ *//' >"$work/skips"
if [ -s "$work/skips" ]; then
  echo "skipped:"
  while read -r count id reason; do
    allowed=$(awk -v id="$id" '!/^[ \t]*(#|$)/ && $1 == id && NF > 1 { $1 = ""; sub(/^ +/, ""); print; exit }' \
      "$optional" 2>/dev/null)
    if [ -n "$allowed" ]; then
      echo "  $id (x$count): $reason; optional: $allowed"
    elif [ "${CI:-}" = true ]; then
      echo "  $id (x$count): $reason; FAILS under CI: not listed in tests/optional.txt"
      failed=$((failed + count))
    else
      echo "  $id (x$count): $reason; not optional (fails under CI=true)"
    fi
  done <"$work/skips"
fi

echo "check: $passed passed, $failed failed, $skipped skipped"
[ "$failed" -eq 0 ]
