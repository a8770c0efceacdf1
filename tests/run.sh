#!/bin/sh
# Runs every cmocka test program and the CLI tests for each build directory
# given (default: build), then prints one summary line:
#   check: N passed, N failed
# Exit status 0 only when nothing failed.
set -u
export LC_ALL=C
[ $# -eq 0 ] && set -- build
passed=0; failed=0; log=$(mktemp); trap 'rm -f "$log"' EXIT
for b in "$@"; do
  for t in "$b"/tests/test_*; do
    [ -x "$t" ] || continue
    echo "== $t"
    "$t" >"$log" 2>&1; rc=$?
    cat "$log"
    p=$(sed -n 's/^\[  PASSED  \] \([0-9]*\) test.*/\1/p' "$log" | awk '{s+=$1} END {print s+0}')
    f=$(sed -n 's/^\[  FAILED  \] \([0-9]*\) test.*/\1/p' "$log" | awk '{s+=$1} END {print s+0}')
    if [ "$rc" -ne 0 ] && [ "$f" -eq 0 ]; then f=1; echo "!! $t exited $rc"; fi
    passed=$((passed + p)); failed=$((failed + f))
  done
  for t in tests/cli/*.sh tests/ref/*.sh; do
    [ -f "$t" ] || continue
    echo "== $t ($b)"
    sh "$t" "$b/plumb" >"$log" 2>&1; rc=$?
    cat "$log"
    p=$(sed -n 's/^cli: \([0-9]*\) passed, \([0-9]*\) failed$/\1/p' "$log" | tail -n 1)
    f=$(sed -n 's/^cli: \([0-9]*\) passed, \([0-9]*\) failed$/\2/p' "$log" | tail -n 1)
    p=${p:-0}; f=${f:-0}
    if [ "$rc" -ne 0 ] && [ "$f" -eq 0 ]; then f=1; echo "!! $t exited $rc"; fi
    passed=$((passed + p)); failed=$((failed + f))
  done
done
echo "check: $passed passed, $failed failed"
[ "$failed" -eq 0 ]
