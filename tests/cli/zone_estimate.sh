#!/bin/sh
# A long zone says so before it gets far: once it has run ESTIMATE_AFTER_S
# (0.5 s) it estimates the whole run from the samples done, and says so on
# standard error when that is over 10 s, as a warning over 10 min; the run
# goes on, the report on standard output is unchanged, --quiet silences it.
# The thresholds are src/cli/cmd_zone.c's; PLUMB_TEST_ESTIMATE_TIMES=
# "AFTER,NOTE,WARN" (seconds, for the tests only) lowers them so that a
# short run shows them. Common practice, no source: a person expects to
# be told before a wait of more than a few seconds.
#
#   sh tests/cli/zone_estimate.sh PLUMB
#
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
. "$(dirname "$0")/lib/setup.sh"
prof=tests/cli/profiles/canopy.yaml

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-zone-estimate.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

# A short run (300 samples) as the reference: nothing on standard error.
# 300, the fewest hundreds past the first block the estimate is timed on
# (256 samples: "timed on the first 256 of ..."); at 256 or fewer the run
# is over when it would estimate and the note and warning checks fail.
zone() { "$bin" zone "$prof" --samples 300 --seed 11 --threads 1 --confidence 0.9 "$@"; }
unset PLUMB_TEST_ESTIMATE_TIMES
zone >"$tmp/ref.out" 2>"$tmp/ref.err"
rc=$?
if [ $rc -eq 0 ] && [ -s "$tmp/ref.out" ] && [ ! -s "$tmp/ref.err" ]; then ok
else bad "short run: exit $rc, stderr '$(head -c 200 "$tmp/ref.err")'"; fi

# run NAME TIMES PATTERN [ARGS]: with PLUMB_TEST_ESTIMATE_TIMES=TIMES, exit 0,
# the same report as the reference, and PATTERN on standard error (or
# nothing there when PATTERN is empty).
run() {
  name=$1 times=$2 pattern=$3
  shift 3
  PLUMB_TEST_ESTIMATE_TIMES=$times zone "$@" >"$tmp/out" 2>"$tmp/err"
  rc=$?
  if [ $rc -ne 0 ]; then bad "$name: exit $rc: $(head -c 200 "$tmp/err")"
  elif ! cmp -s "$tmp/ref.out" "$tmp/out"; then bad "$name: the report changed"
  elif [ -z "$pattern" ] && [ -s "$tmp/err" ]; then bad "$name: stderr '$(head -c 200 "$tmp/err")'"
  elif [ -n "$pattern" ] && ! grep -q -e "$pattern" "$tmp/err"; then
    bad "$name: no '$pattern' on stderr: '$(head -c 300 "$tmp/err")'"
  elif grep -q 'plumb zone' "$tmp/out"; then bad "$name: the note is on standard output"
  else ok; fi
}
est='^plumb zone: this run will take about [0-9.]* \(s\|min\|h\|days\) (timed on the first [0-9]* of 300 samples)$'
warn='^plumb zone: warning: this run will take about .* (timed on the first [0-9]* of 300 samples); it goes on, Ctrl-C stops it'
run "note" 0,0,1e9 "$est"
mv "$tmp/ref.out" "$tmp/ref.text"
zone --format json >"$tmp/ref.out" 2>/dev/null
run "note, json" 0,0,1e9 "$est" --format json
mv "$tmp/ref.text" "$tmp/ref.out"
run "warning" 0,0,0 "$warn"
run "under the note threshold" 0,1e9,1e9 ""
run "--quiet" 0,0,0 "" --quiet
# A malformed value is ignored: the real thresholds, a short run says nothing.
run "malformed PLUMB_TEST_ESTIMATE_TIMES" 0,0 ""
# Two items (an inventory) or two passes (a target) count all their samples.
"$bin" zone "$prof" --samples 300 --seed 11 --threads 1 --confidence 0.9 --target 5m,5m \
  >"$tmp/ref.out" 2>/dev/null
run "with a target: both passes counted" 0,0,1e9 "of 600 samples" --target 5m,5m

# The real thresholds: 10^8 samples take more than 10 s on any machine (a
# fall is ~0.1 ms, so 10^4 s on one core); the estimate comes within the
# first seconds (we wait at most 10 s), the run is stopped there (by us:
# exit 143, SIGTERM), and nothing was written.
: >"$tmp/big.err"
"$bin" zone "$prof" --samples 100000000 -o "$tmp/report.txt" >"$tmp/big.out" 2>"$tmp/big.err" &
pid=$!
i=0
while [ $i -lt 50 ] && ! grep -q 'this run will take' "$tmp/big.err"; do
  sleep 0.2
  i=$((i + 1))
done
kill "$pid" 2>/dev/null
wait "$pid"
rc=$?
if [ $rc -eq 143 ] && grep -q '^plumb zone: \(warning: \)\?this run will take about .* of 100000000 samples' "$tmp/big.err" &&
  [ ! -s "$tmp/big.out" ] && [ ! -e "$tmp/report.txt" ]; then ok
else bad "10^8 samples: exit $rc (143: stopped by the test), stderr '$(head -c 300 "$tmp/big.err")'"; fi
# Over 10 min it is a warning naming the --samples that would fit.
if grep -q '^plumb zone: warning:' "$tmp/big.err"; then
  if grep -q -e '; --samples [1-9]0* would take about 10 min$' "$tmp/big.err"; then ok
  else bad "the warning names no --samples that would fit: '$(head -c 300 "$tmp/big.err")'"; fi
fi

echo "cli: $pass passed, $fail failed"
[ $fail -eq 0 ]
