#!/bin/sh
# `plumb zone` end to end on invented test profiles (README.md "plumb
# zone"): the zone is the same for 1, 2 and 3 threads and for the same seed
# twice, byte for byte (the JSON names no thread count); the cautions are in every
# format; JSON has the documented keys, no NaN or infinity, the seed and the
# profile's SHA-256 (checked with sha256sum, FIPS 180-4); --samples-out
# lists every sample in order; bad options and bad uncertainty exit 2, a
# failed computation exits 3, and then nothing is written (no -o file, no
# samples file, no temporary file beside them, nothing on stdout).
#
#   sh tests/cli/zone.sh PLUMB
#
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
. "$(dirname "$0")/lib/setup.sh"
py=/usr/bin/python3

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-zone.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
check() { # check NAME COMMAND...: passes when the command succeeds
  name=$1
  shift
  if "$@"; then ok; else bad "$name"; fi
}

# The command must exist: a binary without it fails here, loudly, and every
# check below fails with it (nothing is skipped).
if "$bin" zone --help >"$tmp/help" 2>&1 && grep -q '^Usage: plumb zone' "$tmp/help"; then ok
else bad "plumb zone --help printed no usage: $(head -n 1 "$tmp/help")"; fi

# An invented scenario: a survey drone drops a 0.512 kg marker bag.
prof=$tmp/marker.yaml
cat >"$prof" <<'EOF'
# Invented test scenario (no real site): a survey drone drops a marker bag.
name: Marker bag drop, test field
payload:
  mass: 0.512 kg
  drag: {cd: 0.93, area: 0.0214 m^2}
release:
  height: 23.7 m
  velocity: {speed: 4.6 m/s, heading: 75 deg, climb: 0 m/s}
wind:
  profile: power
  speed: 4.3 m/s
  from: 352 deg
criteria: [us-part107-cat3, eu-c1-80j]
uncertainty:
  payload.drag.cd: {uniform: [0.78, 1.07]}
  payload.mass: {triangular: [0.49 kg, 0.512 kg, 0.55 kg]}
  wind.speed: {normal: [1.2 m/s, 1.7 m/s]}
  wind.from: {uniform: [331 deg, 359 deg]}
  release.velocity.speed: "4.6 m/s +- 0.4 m/s"
  release.position.north: {normal: [0 m, 1.1 m]}
zone: {samples: 1500, seed: 73, confidence: 0.99, scatter: 1.5 m}
EOF

# The whole JSON: nothing in it may depend on the thread count.
zone_json() { # zone_json OUT ARGS...
  o=$1
  shift
  "$bin" zone "$prof" --format json "$@" >"$tmp/raw.json" 2>"$tmp/stderr" || return 1
  cp "$tmp/raw.json" "$o"
}

# ---- determinism ----------------------------------------------------------
if zone_json "$tmp/t1.json" --threads 1 --target 12.5m,-4m &&
   zone_json "$tmp/t2.json" --threads 2 --target 12.5m,-4m &&
   zone_json "$tmp/t3.json" --threads 3 --target 12.5m,-4m &&
   zone_json "$tmp/t1b.json" --threads 1 --target 12.5m,-4m; then
  ok
  check "JSON identical for 1 and 2 threads" cmp -s "$tmp/t1.json" "$tmp/t2.json"
  check "JSON identical for 1 and 3 threads" cmp -s "$tmp/t1.json" "$tmp/t3.json"
  check "JSON identical for the same seed twice" cmp -s "$tmp/t1.json" "$tmp/t1b.json"
  check "JSON names no thread count" sh -c "! grep -q '\"threads\"' '$tmp/raw.json'"
else
  bad "zone --format json failed: $(head -n 2 "$tmp/stderr")"
fi
zone_json "$tmp/s74.json" --threads 2 --seed 74 --target 12.5m,-4m
check "another seed gives another zone" sh -c "! cmp -s '$tmp/t1.json' '$tmp/s74.json'"

# ---- JSON keys, SHA-256, no NaN --------------------------------------------
sha=$(sha256sum "$prof" | cut -d' ' -f1)
if $py - "$tmp/t1.json" "$sha" <<'EOF'
import json, math, sys
d = json.load(open(sys.argv[1]))
z = d["zone"]
need = ["samples", "seed", "confidence", "mean_point_m", "ellipse95", "radius_m", "radius_ci_m",
        "clearance_radius_m", "scatter_m", "energy_j", "exceedance", "rules_of_thumb",
        "truncated", "target"]
missing = [k for k in need if k not in z]
assert not missing, missing
assert set(z["ellipse95"]) >= {"semi_major_m", "semi_minor_m", "bearing_deg"}
assert set(z["radius_m"]) == {"p50", "p90", "p99", "p999"} == set(z["radius_ci_m"])
assert set(z["energy_j"]) == {"p50", "p95", "p99", "max"}
assert set(z["rules_of_thumb"]) >= {"drop_height_m", "ballistic_throw_m"}
assert z["samples"] == 1500 and z["seed"] == 73 and d["seed"] == 73
assert abs(z["confidence"] - 0.99) < 1e-15 and abs(z["scatter_m"] - 1.5) < 1e-15
assert z["truncated"] == ["wind.speed"], z["truncated"]
assert [e["criterion"] for e in z["exceedance"]] == ["us-part107-cat3", "eu-c1-80j"]
for e in z["exceedance"]:
    assert e["ci"][0] <= e["probability"] <= e["ci"][1]
# the clearance radius is the upper bound of the 99 % radius plus the scatter
assert abs(z["clearance_radius_m"] - (z["radius_at_confidence"]["ci_m"][1] + 1.5)) < 1e-12
assert z["radius_ci_m"]["p50"][0] <= z["radius_m"]["p50"] <= z["radius_ci_m"]["p50"][1]
assert abs(z["rules_of_thumb"]["drop_height_m"] - 23.7) < 1e-12
t = z["target"]
assert t["target_m"] == [12.5, -4.0]
for k, c in zip((0, 1), ("east", "north")):
    lo, hi = t["median_impact_ci_m"][c]
    assert lo <= t["target_m"][k] <= hi
assert d["profile"]["sha256"] == sys.argv[2]
assert len(d["cautions"]) >= 4
def walk(x):
    if isinstance(x, float):
        assert math.isfinite(x)
    elif isinstance(x, dict):
        for v in x.values(): walk(v)
    elif isinstance(x, list):
        for v in x: walk(v)
walk(d)
EOF
then ok; else bad "JSON keys and values"; fi
check "JSON has no NaN or Infinity" sh -c "! grep -q -i -e nan -e infinity '$tmp/t1.json'"

# ---- cautions in every format ---------------------------------------------
"$bin" zone "$prof" --format text >"$tmp/z.txt" 2>"$tmp/stderr"
check "text exits 0" test $? -eq 0
"$bin" zone "$prof" --format csv >"$tmp/z.csv" 2>"$tmp/stderr"
check "csv exits 0" test $? -eq 0
"$bin" zone "$prof" --format text --units us >"$tmp/us.txt" 2>"$tmp/stderr"
check "text --units us exits 0" test $? -eq 0
for c in "engineering estimate from a point-mass model" "deflect, bounce, break and tumble" \
         "not guarantees of safety" "competent or"; do
  check "text carries caution '$c'" grep -q -F "$c" "$tmp/z.txt"
  check "csv carries caution '$c' as a comment" sh -c "grep -F '$c' '$tmp/z.csv' | grep -q '^# '"
  check "json carries caution '$c'" grep -q -F "$c" "$tmp/t1.json"
done
check "csv caution lines start with '# '" sh -c "grep -F 'engineering estimate' '$tmp/z.csv' | grep -q '^# '"
check "text states the seed and the SHA-256" sh -c "grep -q 'seed 73' '$tmp/z.txt' && grep -q '$sha' '$tmp/z.txt'"
check "text states the clearance radius and the scatter" sh -c "grep -q '^Clearance radius at 99 %' '$tmp/z.txt' && grep -q 'scatter allowance' '$tmp/z.txt'"
check "text --units us shows feet" grep -q ' ft' "$tmp/us.txt"
check "csv has its header row" grep -q '^item_number,item,quantity,value,ci_low,ci_high,unit$' "$tmp/z.csv"
check "no NaN in text or csv" sh -c "! grep -q -i -w -e nan -e inf '$tmp/z.txt' '$tmp/z.csv' '$tmp/us.txt'"
check "no progress on a non-terminal stderr" test ! -s "$tmp/stderr"
zone_json "$tmp/us.json" --units us --threads 1 --target 12.5m,-4m
check "JSON is SI whatever --units says" cmp -s "$tmp/t1.json" "$tmp/us.json"

# ---- -o and --samples-out --------------------------------------------------
mkdir "$tmp/out"
"$bin" zone "$prof" --format json --threads 2 --target 12.5m,-4m -o "$tmp/out/z.json" \
  --samples-out "$tmp/out/s.csv" >"$tmp/stdout" 2>"$tmp/stderr"
check "-o and --samples-out exit 0" test $? -eq 0
check "-o leaves stdout empty" test ! -s "$tmp/stdout"
check "-o says what it wrote" grep -q "wrote $tmp/out/z.json" "$tmp/stderr"
cp "$tmp/out/z.json" "$tmp/o.json" 2>/dev/null
check "-o file holds the same JSON" cmp -s "$tmp/o.json" "$tmp/t1.json"
"$bin" zone "$prof" --threads 1 --target 12.5m,-4m --samples-out "$tmp/out/s1.csv" --quiet \
  >/dev/null 2>&1
check "samples file identical for 1 and 2 threads" cmp -s "$tmp/out/s.csv" "$tmp/out/s1.csv"
if $py - "$tmp/out/s.csv" "$tmp/t1.json" <<'EOF'
import csv, json, sys
lines = open(sys.argv[1]).read().splitlines()
assert lines[0].startswith("# ")
rows = [r for r in csv.reader(l for l in lines if not l.startswith("#"))]
assert rows[0] == ["item", "pass", "sample", "east_m", "north_m", "energy_j", "speed_m_s", "time_s"]
rows = rows[1:]
assert len(rows) == 3000, len(rows)  # 1500 planned + 1500 aimed at the target
for p in (0, 1):
    idx = [int(r[2]) for r in rows if r[1] == str(p)]
    assert idx == list(range(1, 1501)), p  # numbered from 1, as every list a person reads
z = json.load(open(sys.argv[2]))["zone"]
east = [float(r[3]) for r in rows if r[1] == "0"]
mean = sum(east) / len(east)
assert abs(mean - z["mean_point_m"][0]) <= 1e-9 * max(1.0, abs(mean)), (mean, z["mean_point_m"])
e = sorted(float(r[5]) for r in rows if r[1] == "0")
assert e[-1] == z["energy_j"]["max"]
EOF
then ok; else bad "samples file: rows, order, agreement with the report"; fi
check "no temporary files left beside the outputs" sh -c "test -z \"\$(ls -A '$tmp/out' | grep '^\\.')\""

# ---- inventory: every item is run ------------------------------------------
inv=$tmp/kit.yaml
cat >"$inv" <<'EOF'
# Invented test kit: two items carried up a test mast.
name: Test mast kit
items:
  - name: spanner
    mass: 0.67 kg
    drag: {cd: 1.1, area: 0.0061 m^2}
  - name: radio
    mass: 0.29 kg
    drag: {cd: 1.05, area: 0.0093 m^2}
release:
  height: 31.4 m
wind:
  speed: 3.1 m/s
  from: 205 deg
uncertainty:
  payload.drag.cd: {uniform: [0.8, 1.2]}
  wind.speed: "3.1 m/s +- 1.3 m/s"
  release.position.east: {normal: [0 m, 0.6 m]}
zone: {samples: 800, seed: 5, confidence: 0.95}
EOF
"$bin" zone "$inv" --format json --threads 2 >"$tmp/inv.json" 2>"$tmp/stderr"
check "inventory exits 0" test $? -eq 0
check "inventory gives a zone per item" $py -c "
import json, sys
d = json.load(open('$tmp/inv.json'))
assert [i['name'] for i in d['items']] == ['spanner', 'radio']
assert all('clearance_radius_m' in i['zone'] for i in d['items'])
assert d['worst'] in ('spanner', 'radio') and 'cautions' in d
"

# ---- --help ----------------------------------------------------------------
"$bin" zone --help >"$tmp/help" 2>"$tmp/stderr"
check "--help exits 0" test $? -eq 0
check "--help goes to stdout" grep -q -e '--samples-out' "$tmp/help"

# ---- refusals: exit 2 (or 3), a located message, nothing written ------------
# refused STATUS NAME WANT -- ARGS...: runs plumb ARGS with -o and
# --samples-out into an empty directory.
refused() {
  want_rc=$1
  name=$2
  want=$3
  shift 4
  out=$tmp/refused
  rm -rf "$out"
  mkdir "$out" || exit 2
  "$bin" "$@" -o "$out/result" --samples-out "$out/samples.csv" >"$tmp/stdout" 2>"$tmp/stderr"
  rc=$?
  why=""
  [ $rc -eq "$want_rc" ] || why="exit status $rc, expected $want_rc"
  if [ -z "$why" ] && ! grep -F -q -e "$want" "$tmp/stderr"; then
    why="stderr lacks '$want'"
  fi
  if [ -z "$why" ] && [ -n "$(ls -A "$out")" ]; then
    why="wrote $(ls -A "$out" | tr '\n' ' ')"
  fi
  if [ -z "$why" ] && [ -s "$tmp/stdout" ]; then
    why="printed to stdout"
  fi
  if [ -n "$why" ]; then
    bad "$name: $why"
    sed -n '1,3s/^/  stderr: /p' "$tmp/stderr"
  else
    ok
  fi
}

# an option's value is located as a --set is (README.md "Exit status"):
# OPTION:1:COL:, COL where the part at fault starts (north after the comma)
refused 2 "--target with a bare north" "plumb: --target:1:5: north: " -- zone "$prof" --target 40m,-12
refused 2 "--samples 0" "--samples:1:1: expected a whole number" -- zone "$prof" --samples 0
refused 2 "--samples abc" "--samples:1:1: " -- zone "$prof" --samples abc
refused 2 "--samples 1.5" "--samples:1:1: " -- zone "$prof" --samples 1.5
refused 2 "--samples too many" "--samples:1:1: " -- zone "$prof" --samples 200000000
refused 2 "--samples too few for the confidence" "--samples:1:1: 100 samples cannot bound" \
  -- zone "$prof" --samples 100
refused 2 "--confidence too high for the samples" "--confidence:1:1: " \
  -- zone "$prof" --confidence 0.999
# the same settings from the profile or a --set are refused where they were
# given (an error in a --set value names that --set, where it can be
# corrected)
refused 2 "zone.samples too few, by --set" \
  "plumb: --set:2:14: zone.samples: 100 samples cannot bound the 99 % radius" \
  -- zone "$prof" --set zone.seed=5 --set zone.samples=100
sed 's/samples: 1500,/samples: 100,/' "$prof" >"$tmp/few.yaml"
refused 2 "zone.samples too few, in the file" \
  "plumb: $tmp/few.yaml:21:17: zone.samples: 100 samples cannot bound" -- zone "$tmp/few.yaml"
refused 2 "zone.seed above 2^53, by --set" "plumb: --set:1:11: zone.seed: expected a seed from 0 to 2^53-1" \
  -- zone "$prof" --set zone.seed=9007199254740992
refused 2 "--seed -1" "--seed:1:1: " -- zone "$prof" --seed -1
refused 2 "--seed x" "--seed:1:1: " -- zone "$prof" --seed x
refused 2 "--seed above 2^53" "--seed:1:1: " -- zone "$prof" --seed 9007199254740992
refused 2 "--threads 0" "--threads:1:1: " -- zone "$prof" --threads 0
refused 2 "--threads many" "--threads:1:1: " -- zone "$prof" --threads 5000
refused 2 "--confidence 1" "--confidence:1:1: " -- zone "$prof" --confidence 1
refused 2 "--confidence 0" "--confidence:1:1: " -- zone "$prof" --confidence 0
refused 2 "--confidence 150%" "--confidence:1:1: " -- zone "$prof" --confidence 150%
refused 2 "--confidence abc" "--confidence:1:1: " -- zone "$prof" --confidence abc
refused 2 "--target without units" "--target:1:1: east:" -- zone "$prof" --target 40,-12
refused 2 "--target without a comma" "--target:1:1: " -- zone "$prof" --target 40m
# a target too far from the site for the map (10 km, PLUMB_GEODESY_RANGE_M):
# refused before the run, naming --target, or zone.target where --set gave it
refused 2 "--target off the geojson map" "--target:1:1: the target (20000m,0m)" \
  -- zone "$prof" --set "site={latitude: 52.1 deg, longitude: 4.3 deg}" --target 20000m,0m \
  --samples 300 --format geojson
refused 2 "zone.target off the geojson map" "plumb: --set:2:13: zone.target: the target" \
  -- zone "$prof" --set "site={latitude: 52.1 deg, longitude: 4.3 deg}" \
  --set "zone.target={east: 20 km, north: 0 m}" --samples 300 --format geojson
refused 2 "--target not a length" "--target:1:1: " -- zone "$prof" --target 4kg,2kg
refused 2 "--format xml" "--format" -- zone "$prof" --format xml
refused 2 "unknown option" "unknown option" -- zone "$prof" --sample 10
refused 2 "no profile" "needs a PROFILE" -- zone
refused 2 "missing profile" "nosuch.yaml" -- zone "$tmp/nosuch.yaml"

# a fall of the zone refused (a device deploying above the release): the
# key as the profile wrote it (`descent:` one map: descent.deploy.below, not
# descent[0]...) and where its value was given, in the file or a --set
# (invented parcel; 100 m release, deploy below 60 m; a 50-170 m draw must
# reach above 100 m within 400 samples: P(no) = (50/120)^400, nil)
parcel=$tmp/parcel.yaml
cat >"$parcel" <<'EOF'
# Invented test scenario: a parcel under a parachute.
name: Parcel
payload:
  mass: 2.17 kg
  drag: {cd: 1.04, area: 0.053 m^2}
descent:
  kind: parachute
  cd: 0.8
  area: 1.2 m^2
  deploy: {below: 60 m}
  fill_time: 0.8 s
release:
  height: 100 m
wind: {speed: 5 m/s, from: 270 deg}
uncertainty:
  wind.speed: {normal: [5 m/s, 1 m/s]}
  descent.fill_time: {uniform: [0.7 s, 0.9 s]}
EOF
refused 2 "a sampled deploy height by --set: at that --set" \
  "plumb: --set:1:13: uncertainty.descent.deploy.below: sample " \
  -- zone "$parcel" --samples 400 --set "uncertainty.descent.deploy.below={uniform: [50 m, 170 m]}"
refused 2 "a fixed deploy height by --set under a sampled release: at that --set" \
  "plumb: --set:2:22: descent.deploy.below: sample " \
  -- zone "$parcel" --samples 400 --set "uncertainty.release.height={uniform: [40 m, 100 m]}" \
  --set "descent.deploy.below=65 m"
sed 's/^  descent.fill_time: .*/  descent.deploy.below: {uniform: [50 m, 170 m]}/' "$parcel" >"$tmp/parcel2.yaml"
refused 2 "a sampled deploy height in the file: at its line" \
  "plumb: $tmp/parcel2.yaml:17:3: uncertainty.descent.deploy.below: sample " \
  -- zone "$tmp/parcel2.yaml" --samples 400
if grep -q 'descent\[0\]' "$tmp/stderr"; then bad "descent[0] for a one-map descent: $(cat "$tmp/stderr")"
else ok; fi

# bad uncertainty in the profile: the loader's or the sampler's message with
# file:line:col: key
badp() { # badp NAME LINE -- writes $tmp/bad.yaml with the uncertainty line replaced
  sed "s|^  wind.speed: .*|$2|" "$prof" >"$tmp/bad.yaml"
}
badp sd "  wind.speed: {normal: [4.3 m/s, -1 m/s]}"
refused 2 "sd < 0" "bad.yaml:17:" -- zone "$tmp/bad.yaml"
badp lohi "  wind.speed: {uniform: [5 m/s, 3 m/s]}"
refused 2 "lo > hi for a non-angle key" "bad.yaml:17:" -- zone "$tmp/bad.yaml"
badp wrongunit "  wind.speed: {normal: [4.3 m/s, 3 kg]}"
refused 2 "a unit of another dimension" "bad.yaml:17:" -- zone "$tmp/bad.yaml"
badp atm "  atmosphere.temperature_offset: {normal: [10 K, 2 K]}"
refused 2 "an input that is not per fall" "atmosphere.temperature_offset" -- zone "$tmp/bad.yaml"
badp exp "  wind.exponent: {uniform: [0.1, 0.2]}"
sed -i 's/^  profile: power/  profile: uniform/' "$tmp/bad.yaml"
refused 2 "an input the payload does not use" "wind.exponent" -- zone "$tmp/bad.yaml"
badp cdwide "  payload.volume: {uniform: [0.1 m^3, 0.9 m^3]}"
sed -i 's/^  payload.drag.cd: .*/  wind.speed: {normal: [4.3 m\/s, 1.7 m\/s]}/' "$tmp/bad.yaml"
refused 3 "a buoyant sample never lands: exit 3" "never reaches the strike level" \
  -- zone "$tmp/bad.yaml"

total=$((pass + fail))
[ "$total" -gt 0 ] || fail=1
# --target takes east and north each in its own unit of length: 20 km and
# -300 ft are 20000 m and -91.44 m (1 ft = 0.3048 m exactly, 1959 agreement)
if "$bin" zone "$prof" --samples 400 --target 20km,-300ft --format json >"$tmp/mixed.json" \
  2>"$tmp/stderr" && $py - "$tmp/mixed.json" <<'PY'
import json, sys
t = json.load(open(sys.argv[1]))["zone"]["target"]["target_m"]
sys.exit(0 if abs(t[0] - 20000.0) < 1e-9 and abs(t[1] + 300 * 0.3048) < 1e-9 else 1)
PY
then ok; else bad "--target 20km,-300ft: $(head -n 1 "$tmp/stderr") $(grep -A2 target_m "$tmp/mixed.json")"; fi
rm -f "$tmp/mixed.json"

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
