#!/bin/sh
# Out of memory at the command line exits 3 (a failure of the machine, not
# of the input: README, "Exit status"), says "out of memory", and writes
# nothing: no -o file, no temporary file, nothing on standard output.
#
# BUILD/tests/plumb-nomem is plumb linked with the allocation-failure hook
# (tests/nomem/failalloc.h): PLUMB_FAILALLOC=N fails its Nth allocation and
# says at exit whether it did. For each command, a run with no failure
# counts the allocations (M); then N = 1, 1 + s, 1 + 2s ... up to M (some
# 8 runs, s = M / 8; 3 in the sanitizer build) must each fail as said, and N = M + 1 must succeed.
# Every allocation of the library calls is failed in turn by
# tests/nomem/test_nomem.c; this checks the command line's exit status.
#
#   sh tests/cli/nomem.sh PLUMB
#
# Ends with one line `cli: N passed, N failed, N skipped`.
. "$(dirname "$0")/lib/setup.sh"
nomem=$(dirname "$bin")/tests/plumb-nomem

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-nomem.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0; fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

if [ ! -x "$nomem" ]; then
  echo "FAIL: $nomem is missing (make tests builds it)"
  echo "cli: 0 passed, 1 failed, 0 skipped"
  exit 1
fi

# The sanitizer build runs each command some ten times slower: 3 runs per
# command there (LeakSanitizer still checks what each failed run leaves),
# 8 in the plain build.
runs_per_command=8
if grep -q __asan_init "$nomem" 2>/dev/null; then runs_per_command=3; fi

# each NAME ARGS...: plumb ARGS -o $tmp/out/r, with every 1/8th allocation failing.
each() {
  name=$1; shift
  rm -rf "$tmp/out"; mkdir "$tmp/out"
  PLUMB_FAILALLOC=999999999 "$nomem" "$@" -o "$tmp/out/r" --quiet >"$tmp/stdout" 2>"$tmp/stderr"
  rc=$?
  m=$(sed -n 's/^failalloc: \([0-9]*\) allocations, none failed$/\1/p' "$tmp/stderr")
  if [ $rc -ne 0 ] || [ -z "$m" ]; then
    bad "$name: the run with no failure: exit $rc, $(head -c 300 "$tmp/stderr")"; return
  fi
  step=$(( m / runs_per_command )); [ "$step" -lt 1 ] && step=1
  n=1; bads=0; runs=0
  while [ "$n" -le "$m" ]; do
    rm -rf "$tmp/out"; mkdir "$tmp/out"
    PLUMB_FAILALLOC=$n "$nomem" "$@" -o "$tmp/out/r" --quiet >"$tmp/stdout" 2>"$tmp/stderr"
    rc=$?
    runs=$((runs + 1))
    if ! grep -q "^failalloc: allocation $n failed$" "$tmp/stderr"; then
      : # a run on threads may need fewer allocations: nothing failed, nothing to check
    elif [ $rc -ne 3 ] || ! grep -q "^plumb: .*out of memory" "$tmp/stderr" ||
         [ -s "$tmp/stdout" ] || [ -n "$(ls -A "$tmp/out")" ]; then
      bads=$((bads + 1))
      [ "$bads" -le 3 ] && echo "  $name: allocation $n of $m failing: exit $rc," \
        "stderr: $(grep -v '^failalloc' "$tmp/stderr" | head -c 200), left: $(ls -A "$tmp/out")"
    fi
    n=$((n + step))
  done
  if [ "$bads" -eq 0 ]; then ok; else bad "$name: $bads of $runs runs did not exit 3 cleanly"; fi
  PLUMB_FAILALLOC=$((m + 1)) "$nomem" "$@" -o "$tmp/out/r2" --quiet >/dev/null 2>"$tmp/stderr"
  rc=$?
  if [ $rc -eq 0 ] && [ -s "$tmp/out/r2" ]; then ok
  else bad "$name: allocation $((m + 1)) of $m failing is no failure, yet exit $rc"; fi
}

prof=tests/cli/profiles/canopy.yaml
each "fall json" fall "$prof" --format json
each "sweep" sweep "$prof" --vary release.height=40m:90m:25m --format csv
each "limit" limit tests/cli/profiles/light.yaml --find payload.mass --energy-max 40J
each "zone" zone "$prof" --samples 200 --confidence 0.9 --seed 3 --threads 1 --format json
each "air" air --alt 0ft:3000ft:1000ft

echo "cli: $pass passed, $fail failed, 0 skipped"
[ "$fail" -eq 0 ]
