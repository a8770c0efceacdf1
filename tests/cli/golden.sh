#!/bin/sh
# Golden-file tests of the plumb command line (the jq practice: run a
# command, compare its output byte for byte with an expected file, under
# LC_ALL=C). Also: every output carries the cautions (README.md "Cautions"),
# --help and --version, usage errors exit 2, -o writes atomically and the
# same bytes as standard output, and nothing is written on an error.
#
#   sh tests/cli/golden.sh PLUMB            run the checks
#   sh tests/cli/golden.sh PLUMB --update   rewrite tests/cli/golden/* first
#
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
usage_extra=" [--update]"
. "$(dirname "$0")/lib/setup.sh"
update=0
[ "${2:-}" = "--update" ] && update=1
gold=tests/cli/golden

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-golden.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

# The cautions, as phrases that survive word wrapping once line ends and
# runs of spaces are squeezed (README.md "Cautions", SAFETY.md section 1).
has_cautions() {
  flat=$(tr '\n' ' ' <"$1" | tr -s ' ')
  for phrase in "engineering estimate from a point-mass model" \
                "deflect, bounce, break and tumble" \
                "not guarantees of safety" \
                "sharp or dense objects injure below them" \
                "local codes and regulations" \
                "competent or licensed person" \
                "SAFETY.md"; do
    case $flat in
      *"$phrase"*) ;;
      *) echo "  missing caution: $phrase"; return 1 ;;
    esac
  done
  return 0
}

# golden NAME ARGS...: runs plumb ARGS, compares stdout with $gold/NAME.
golden() {
  name=$1
  shift
  out=$tmp/$name
  "$bin" "$@" >"$out" 2>"$tmp/stderr"
  rc=$?
  if [ $rc -ne 0 ]; then
    bad "$name: plumb $* exited $rc: $(head -c 300 "$tmp/stderr")"
    return
  fi
  if [ $update = 1 ]; then
    mkdir -p "$gold" && cp "$out" "$gold/$name" && ok || bad "$name: cannot update"
  elif [ ! -f "$gold/$name" ]; then
    bad "$name: no expected file $gold/$name (run with --update once the output is checked)"
  elif cmp -s "$out" "$gold/$name"; then
    ok
  else
    bad "$name: output differs from $gold/$name"
    diff -u "$gold/$name" "$out" | head -n 30
  fi
  if has_cautions "$out"; then ok; else bad "$name: no cautions"; fi
}

# expect_status WANT LABEL ARGS...: plumb ARGS must exit WANT.
expect_status() {
  want=$1
  label=$2
  shift 2
  "$bin" "$@" >"$tmp/out" 2>"$tmp/err"
  rc=$?
  if [ $rc -eq "$want" ]; then ok; else bad "$label: exit $rc, expected $want"; fi
}

# ---- golden outputs ------------------------------------------------------
for p in profiles/demo/*.yaml; do
  [ -f "$p" ] || continue
  n=$(basename "$p" .yaml)
  golden "$n.text" fall "$p"
  golden "$n.json" fall "$p" --format json
  golden "$n.csv" fall "$p" --format csv
  golden "$n.us.text" fall "$p" --units us
done
golden air.text air
golden air.json air --alt 0m:20km:1km --format json
golden air.csv air --alt 0m:20km:1km --format csv
# US units where an input is not a plain conversion: a lapse rate in
# °F/1000 ft, a temperature offset in °F with its kelvin in brackets
golden surface-air.us.text fall tests/cli/profiles/surface-air.yaml --units us
golden air.us.text air --alt 0m:3km:1km --temperature-offset 10K --units us

# ---- help, version, usage errors ------------------------------------------
expect_status 0 "--help" --help
if grep -q '^Usage: plumb' "$tmp/out" && [ ! -s "$tmp/err" ]; then ok
else bad "--help: no usage on standard output"; fi
expect_status 0 "fall --help" fall --help
if grep -q '^Usage: plumb fall' "$tmp/out"; then ok; else bad "fall --help: no usage"; fi
expect_status 0 "--version" --version
ver=$(sed -n 's/^#define PLUMB_VERSION "\(.*\)"$/\1/p' include/plumb/version.h)
if [ "$(cat "$tmp/out")" = "plumb $ver" ]; then ok
else bad "--version printed '$(cat "$tmp/out")', expected 'plumb $ver'"; fi
expect_status 2 "unknown command" fal profiles/demo/hand-tool.yaml
if [ -s "$tmp/err" ] && [ ! -s "$tmp/out" ]; then ok
else bad "unknown command: message not on standard error only"; fi
expect_status 2 "no command"
expect_status 2 "unknown option" fall profiles/demo/hand-tool.yaml --frmat json
expect_status 2 "bad --format" fall profiles/demo/hand-tool.yaml --format xml
expect_status 2 "bad --units" fall profiles/demo/hand-tool.yaml --units imperial
expect_status 2 "fall without a profile" fall
expect_status 2 "missing profile" fall "$tmp/no-such.yaml"
expect_status 2 "--set without =" fall profiles/demo/hand-tool.yaml --set release.height

# ---- plumb air --alt -------------------------------------------------------
expect_status 2 "air: bare numbers" air --alt 0:20000:1000
expect_status 2 "air: wrong dimension" air --alt 0m:20s:1km
expect_status 2 "air: STEP <= 0" air --alt 0m:20km:0m
expect_status 2 "air: negative STEP" air --alt 0m:20km:-1km
expect_status 2 "air: FROM > TO" air --alt 20km:0m:1km
expect_status 2 "air: too many rows" air --alt 0m:20km:0.1m
expect_status 2 "air: two parts" air --alt 0m:20km
expect_status 2 "air: bad offset" air --temperature-offset 10
expect_status 0 "air: feet" air --alt "0 ft:1000 ft:500 ft"
if [ "$(grep -c '^ *[0-9]' "$tmp/out")" -eq 3 ]; then ok
else bad "air --alt '0 ft:1000 ft:500 ft': expected 3 rows"; fi

# ---- -o: atomic, same bytes as standard output, nothing on error ------------
p=profiles/demo/hand-tool.yaml
mkdir "$tmp/o"
expect_status 0 "-o json" fall "$p" --format json -o "$tmp/o/report.json"
if [ -f "$tmp/o/report.json" ] && [ ! -s "$tmp/out" ]; then ok
else bad "-o: file not written, or report also on standard output"; fi
"$bin" fall "$p" --format json >"$tmp/stdout.json" 2>/dev/null
if cmp -s "$tmp/o/report.json" "$tmp/stdout.json"; then ok
else bad "-o file differs from standard output"; fi
if [ "$(ls -A "$tmp/o")" = "report.json" ]; then ok
else bad "-o left other files behind: $(ls -A "$tmp/o" | tr '\n' ' ')"; fi
echo old >"$tmp/o/keep.txt"
expect_status 2 "-o on an input error" fall "$tmp/no-such.yaml" -o "$tmp/o/keep.txt"
if [ "$(cat "$tmp/o/keep.txt")" = "old" ] && [ "$(ls -A "$tmp/o" | wc -l)" -eq 2 ]; then ok
else bad "-o on an error touched the output or left a temporary file"; fi
cp "$p" "$tmp/o/same.yaml"
expect_status 2 "-o onto the profile" fall "$tmp/o/same.yaml" -o "$tmp/o/same.yaml"
if cmp -s "$p" "$tmp/o/same.yaml"; then ok; else bad "-o overwrote its input profile"; fi
# a report that cannot be written is a failure of the run, not of the input: 3
expect_status 3 "-o into a missing directory" fall "$p" -o "$tmp/missing/dir/report.txt"
expect_status 3 "--samples-out into a missing directory" zone "$p" --samples 400 --samples-out "$tmp/missing/dir/s.csv"

# ---- plumb lint ---------------------------------------------------------------
for p in profiles/demo/*.yaml; do
  [ -f "$p" ] || continue
  expect_status 0 "lint $p" lint "$p"
  # its ok line, then the cautions every report carries (README.md "Cautions")
  if [ "$(sed -n 1p "$tmp/out")" = "$p: ok" ] && [ "$(sed -n 3p "$tmp/out")" = "Cautions" ]; then ok
  else bad "lint $p: printed '$(cat "$tmp/out")'"; fi
done
printf 'payload:\n  mass: 1.14\nrelease:\n  height: 31.6 m\n' >"$tmp/bare.yaml"
expect_status 2 "lint bare number" lint "$tmp/bare.yaml"
if grep -q "bare.yaml:[0-9]*:[0-9]*: payload.mass" "$tmp/err"; then ok
else bad "lint bare number: no located error ($(cat "$tmp/err"))"; fi
printf 'payload: {mass: 1.14 kg, drag: {cd_area: 0.002 m^2}}\nrelease: {height: 31.6 m}\ncriteria: [us-part-107-cat3]\n' >"$tmp/crit.yaml"
expect_status 2 "lint unknown criterion" lint "$tmp/crit.yaml"
if grep -q "did you mean 'us-part107-cat3'" "$tmp/err"; then ok
else bad "lint unknown criterion: no did-you-mean ($(cat "$tmp/err"))"; fi

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
