#!/bin/sh
# Which error bad input gets, and what it suggests (a user review): the
# first error in file order, never one the loader happened to meet first;
# a --set that removed a required key or gave a bad value named as that
# --set; a suggested value the key accepts; a range's count checked on the
# values it makes; a range's bounds rounded inward. Each refusal exits 2
# (README.md "Exit status"), says `plumb: FILE:LINE:COL: KEY: message` on
# stderr, one line, and writes nothing.
#
#   sh tests/cli/input_errors.sh PLUMB
#
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
. "$(dirname "$0")/lib/setup.sh"
good=profiles/payloads/torque-wrench.yaml
inv=tests/cli/profiles/inventory.yaml

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-inerr.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

# refused NAME WANT... -- ARGS...: lib/refused.sh
. "$here/lib/refused.sh"

# ---- 1. the first error in file order --------------------------------------
# mass -5 kg (line 3), cd 11 (line 4, above the key's 10) and a wind of
# 400 m/s (line 8, above the sea-level speed of sound 340.294 m/s, U.S.
# Standard Atmosphere 1976, Table I): three errors; the loader reads the
# wind before the payload, but the one reported is line 3's.
printf 'name: three\npayload:\n  mass: -5 kg\n  drag: {cd: 11, area: 0.01 m^2}\nrelease:\n  height: 30 m\nwind:\n  speed: 400 m/s\n  from: 270 deg\n' \
  >"$tmp/three.yaml"
refused "fall of three errors" "plumb: $tmp/three.yaml:3:9: payload.mass: must be > 0 kg" \
  "!wind.speed" -- fall "$tmp/three.yaml"
# the same from standard input, and in every command that loads a profile
stdin=$tmp/three.yaml
refused "fall - of three errors" ":3:9: payload.mass: must be > 0 kg" -- fall -
stdin=
refused "sweep of three errors" "three.yaml:3:9: payload.mass: " \
  -- sweep "$tmp/three.yaml" --vary "release.height=10m:20m:5m"
refused "zone of three errors" "three.yaml:3:9: payload.mass: " -- zone "$tmp/three.yaml"
# fall's one error is lint's first
"$bin" lint "$tmp/three.yaml" >"$tmp/lint.out" 2>"$tmp/lint.err"
"$bin" fall "$tmp/three.yaml" >"$tmp/stdout" 2>"$tmp/stderr"
if [ "$(sed -n 1p "$tmp/lint.err")" = "$(cat "$tmp/stderr")" ] &&
   [ "$(grep -c '^plumb: ' "$tmp/lint.err")" -eq 3 ]; then
  pass=$((pass + 1))
else
  bad "fall's error is not lint's first of three: $(cat "$tmp/stderr") / $(cat "$tmp/lint.err")"
fi
# an inventory: the second item's cd (line 6) before the release height
# (line 9) and a misspelt wind key (line 11)
printf 'name: kit\nitems:\n  - name: a\n    mass: 1 kg\n    drag: {cd: 0.9, area: 0.01 m^2}\n  - {name: b, mass: 2 kg, drag: {cd: -1, area: 0.01 m^2}}\nrelease:\n  velocity: {east: 1 m/s}\n  height: -30 m\nwind:\n  sped: 5 m/s\n' \
  >"$tmp/kit.yaml"
refused "fall of an inventory's three errors" "kit.yaml:6:38: items[2].drag.cd: " \
  -- fall "$tmp/kit.yaml"

# a required key missing (payload.mass, the payload map at line 3) and a
# value refused against another key (a deploy height at line 8 not below
# the release height of line 10) are told before a roughness refused
# against its reference height (line 15): the loader meets the wind
# before the payload and the descent, but the error told is the first in
# file order, lint's first (a roughness length must be below the height
# of the log law's reference speed: the law is for heights above it; a
# deploy height must be below the release)
printf 'name: missing\npayload:\n  drag: {cd: 0.9, area: 0.0113 m^2}\nrelease:\n  height: 31.6 m\nwind:\n  profile: log\n  speed: 5 m/s\n  reference_height: 10 m\n  roughness: 20 m\n' \
  >"$tmp/missing.yaml"
refused "a missing mass before a refused roughness" \
  "plumb: $tmp/missing.yaml:3:3: payload.mass: required key 'mass' is missing" \
  "!wind.roughness" -- fall "$tmp/missing.yaml"
refused "the same with an unrelated --set" ":3:3: payload.mass: required key 'mass' is missing" \
  -- fall "$tmp/missing.yaml" --set "wind.speed=3.7 m/s"
stdin=$tmp/missing.yaml
refused "the same from standard input" "plumb: <stdin>:3:3: payload.mass: " -- fall -
stdin=
refused "sweep of the same" "missing.yaml:3:3: payload.mass: " \
  -- sweep "$tmp/missing.yaml" --vary "release.height=10m:20m:5m"
refused "limit of the same" "missing.yaml:3:3: payload.mass: " \
  -- limit "$tmp/missing.yaml" --find release.height --energy-max 40J
refused "zone of the same" "missing.yaml:3:3: payload.mass: " -- zone "$tmp/missing.yaml"
printf 'name: cross\npayload:\n  mass: 2.385 kg\n  drag: {cd: 0.9, area: 0.0113 m^2}\ndescent:\n  cd: 0.8\n  area: 1.2 m^2\n  deploy: {below: 60 m}\nrelease:\n  height: 31.6 m\nwind:\n  profile: log\n  speed: 5 m/s\n  reference_height: 10 m\n  roughness: 20 m\n' \
  >"$tmp/cross.yaml"
refused "a refused deploy height before a refused roughness" \
  "plumb: $tmp/cross.yaml:8:19: descent.deploy.below: must be below the release height" \
  "!wind.roughness" -- fall "$tmp/cross.yaml"
# a required key missing (line 3) before a number out of range (line 7,
# a wind of 400 m/s above the sea-level speed of sound, 340.294 m/s, U.S.
# Standard Atmosphere 1976, Table I), which the schema's check meets first
printf 'name: m2\npayload:\n  drag: {cd: 0.9, area: 0.0113 m^2}\nrelease:\n  height: 31.6 m\nwind:\n  speed: 400 m/s\n' \
  >"$tmp/m2.yaml"
refused "a missing mass before a wind out of range" "m2.yaml:3:3: payload.mass: " "!wind.speed" \
  -- fall "$tmp/m2.yaml"
# an unknown criterion id (line 2) before a required key missing (line 4):
# the loader checks no ids (the study does, once the profile loads), but
# the error told is still the first in file order, lint's first
printf 'name: crit\ncriteria: [en397-shok-49j]\npayload:\n  drag: {cd: 0.9, area: 0.0113 m^2}\nrelease:\n  height: 31.6 m\n' \
  >"$tmp/crit.yaml"
refused "an unknown id before a missing mass" "plumb: $tmp/crit.yaml:2:12: criteria[0]: unknown criterion" \
  "did you mean 'en397-shock-49j'" "!payload.mass" -- fall "$tmp/crit.yaml"
stdin=$tmp/crit.yaml
refused "the same from standard input" "plumb: <stdin>:2:12: criteria[0]: " -- fall -
stdin=
refused "zone of the same" "crit.yaml:2:12: criteria[0]: " -- zone "$tmp/crit.yaml"
for f in missing cross m2 crit; do
  "$bin" lint "$tmp/$f.yaml" >"$tmp/lint.out" 2>"$tmp/lint.err"
  "$bin" fall "$tmp/$f.yaml" >"$tmp/stdout" 2>"$tmp/stderr"
  if [ "$(sed -n 1p "$tmp/lint.err")" = "$(cat "$tmp/stderr")" ] &&
     [ "$(grep -c '^plumb: ' "$tmp/lint.err")" -eq 2 ]; then
    pass=$((pass + 1))
  else
    bad "$f: fall's error is not lint's first of two: $(cat "$tmp/stderr") / $(cat "$tmp/lint.err")"
  fi
done

# ---- 2. a suggestion the key accepts -----------------------------------------
# atmosphere.temperature takes 150 K .. 400 K (README.md "Profile keys"): a
# bare 45 is not offered as 45 K; 45 degC = 318.15 K and 45 degF = 280.372 K
# are in range (NIST SP 811, 2008, B.9: T/K = t/degC + 273.15,
# t/degC = (t/degF - 32) / 1.8). 290 K is in range: offered as it was.
printf 'name: warm\npayload: {mass: 2.385 kg, drag: {cd: 0.9, area: 0.0113 m^2}}\nrelease: {height: 31.6 m}\natmosphere:\n  model: surface\n  pressure: 1002.5 hPa\n  temperature: 45\n' \
  >"$tmp/warm.yaml"
refused "a bare temperature of 45" "warm.yaml:7:16: atmosphere.temperature: " \
  'e.g. "45 degC" or "45 degF"' '!"45 K"' -- fall "$tmp/warm.yaml"
refused "a bare temperature of 290" 'e.g. "290 K"' \
  -- fall "$tmp/warm.yaml" --set atmosphere.temperature=290
# no unit brings -300 into 150 K .. 400 K (-300 degF is 88.7 K): no example
refused "a bare temperature of -300" "no unit of a temperature brings into range" '!e.g.' \
  -- fall "$tmp/warm.yaml" --set atmosphere.temperature=-300
# every value a message offers is taken by that key: run it (on the same
# profile with a temperature of 12.5 degC)
sed 's/temperature: 45$/temperature: 12.5 degC/' "$tmp/warm.yaml" >"$tmp/mild.yaml"
for case in "atmosphere.temperature=45" "atmosphere.temperature=290" \
            "atmosphere.temperature=45 C" "release.height=31.6" "payload.mass=2.385 KG" \
            "site.latitude=54.2 N" "site.latitude=6,5 deg"; do
  "$bin" fall "$tmp/mild.yaml" --set "$case" >"$tmp/stdout" 2>"$tmp/stderr"
  offered=$(sed -n 's/.*\(did you mean\|e\.g\.\|write\|decimal point:\) "\([^"]*\)".*/\2/p' "$tmp/stderr")
  if [ -z "$offered" ]; then
    bad "--set '$case' offers no value: $(cat "$tmp/stderr")"
    continue
  fi
  if "$bin" fall "$tmp/mild.yaml" --set "${case%%=*}=$offered" >"$tmp/stdout" 2>"$tmp/stderr2"; then
    pass=$((pass + 1))
  else
    bad "--set '$case' offers '$offered', which is refused: $(cat "$tmp/stderr2")"
  fi
done
# a value the key refuses is not offered: the unit meant is named, with the
# range (a mass > 0 kg; a latitude -90 deg .. 90 deg)
refused "a negative mass in KG" "the unit meant is probably kg" '"-5 kg" is out of range too: must be > 0 kg' \
  '!did you mean' -- fall "$good" --set "payload.mass=-5 KG"
refused "a temperature of 45 k" "the unit meant is probably K" \
  '"45 K" is out of range too: must be 150 K .. 400 K' '!did you mean' \
  -- fall "$tmp/mild.yaml" --set "atmosphere.temperature=45 k"
refused "a bare negative mass" "no unit of a mass brings into range: must be > 0 kg" '!e.g.' \
  -- fall "$good" --set "payload.mass=-5"
refused "a latitude of 95 N" 'write "95 deg" (out of range here too: must be -90 deg .. 90 deg)' \
  -- fall "$good" --set "site.latitude=95 N"
refused "a latitude of 95,5 deg" 'use a decimal point: "95.5 deg" (out of range here too: must be -90 deg .. 90 deg)' \
  -- fall "$good" --set "site.latitude=95,5 deg"
refused "a latitude that is a word" "must be -90 deg .. 90 deg" '!270 deg' \
  -- fall "$good" --set "site.latitude=north"

# ---- 3. a required key a --set removed -----------------------------------------
refused "--set release.height=~" "plumb: --set:1:16: release.height: " "this --set removed it" \
  "!$good" -- fall "$good" --set "release.height=~"
refused "the second --set removes the height" "plumb: --set:2:16: release.height: " \
  "this --set removed it" -- fall "$good" --set "wind.speed=3 m/s" --set "release.height=null"
refused "--set release=~" "plumb: --set:1:9: release.height: " "this --set removed release" \
  -- fall "$good" --set "release=~"
refused "--set items=~" "plumb: --set:1:7: payload: " "this --set removed items" "!$inv" \
  -- fall "$inv" --set "items=~"
refused "--set items[glove].mass=~" "plumb: --set:1:19: items[3].mass: " "this --set removed it" \
  -- fall "$inv" --set "items[glove].mass=~"
refused "--set payload.drag=~" "plumb: --set:1:14: payload.drag: " "this --set removed it" \
  -- fall "$good" --set "payload.drag=~"

# ---- 4. a --set's own value first ----------------------------------------------
printf 'name: rod (invented)\npayload:\n  mass: 0.5 kg\n  shape: {kind: cylinder, length: 0.3 m, diameter: 0.02 m}\nrelease: {height: 10 m}\n' \
  >"$tmp/shape.yaml"
refused "--set drag.area in KG over a shape" "plumb: --set:1:19: payload.drag.area: " \
  'unknown unit "KG"' "!required key 'cd'" -- fall "$tmp/shape.yaml" --set "payload.drag.area=5 KG"
refused "two bad --set values: the first" "plumb: --set:1:14: payload.mass: " \
  -- fall "$tmp/shape.yaml" --set "payload.mass=heavy" --set "payload.drag.area=5 KG"
refused "a bad --set value and a bad file" "plumb: --set:1:12: wind.speed: " \
  -- fall "$tmp/three.yaml" --set "wind.speed=9 KT"
# a --set of the wrong kind is its own value too: told before the file's
# errors, however early they stand (an unknown key at line 3, a drag of
# the wrong kind at line 4, a mass out of range at line 3), as a --set's
# unit or range is (README.md "Exit status": a --set's own value first)
printf 'name: typo\npayload:\n  mas: 2.385 kg\n  drag: {cd: 0.9, area: 0.0113 m^2}\nrelease:\n  height: 31.6 m\n' \
  >"$tmp/typo.yaml"
printf 'name: kind\npayload:\n  mass: 2.385 kg\n  drag: 7\nrelease:\n  height: 31.6 m\nwind: {speed: 3 m/s}\n' \
  >"$tmp/kind.yaml"
refused "--set release=5 over an unknown key" "plumb: --set:1:9: release: expected a map" \
  "!payload.mas" -- fall "$tmp/typo.yaml" --set "release=5"
refused "--set wind.speed={a: 1} over a drag of the wrong kind" \
  "plumb: --set:1:12: wind.speed: expected a speed" "!payload.drag" \
  -- fall "$tmp/kind.yaml" --set "wind.speed={a: 1}"
refused "--set wind=[1] over a drag of the wrong kind" "plumb: --set:1:6: wind: expected a map" \
  -- fall "$tmp/kind.yaml" --set "wind=[1]"
refused "--set payload.drag=5 over a mass out of range" "plumb: --set:1:14: payload.drag: expected a map" \
  "!payload.mass" -- fall "$tmp/three.yaml" --set "payload.drag=5"
refused "--set wind.profile=powr over an unknown key" "plumb: --set:1:14: wind.profile: " \
  "did you mean 'power'" -- fall "$tmp/typo.yaml" --set "wind.profile=powr"
# of two bad --set values, the first --set's, whatever the kind of either
refused "a wrong kind after a wrong unit" "plumb: --set:1:12: wind.speed: " \
  -- fall "$good" --set "wind.speed=9 KT" --set "payload.drag=5"
refused "a wrong unit after a wrong kind" "plumb: --set:1:14: payload.drag: " \
  -- fall "$good" --set "payload.drag=5" --set "wind.speed=9 KT"
# lint tells the same first
"$bin" lint "$tmp/typo.yaml" --set "release=5" >"$tmp/stdout" 2>"$tmp/stderr"
if grep -q "^plumb: --set:1:9: release: expected a map" "$tmp/stderr"; then
  pass=$((pass + 1))
else
  bad "lint of a --set of the wrong kind: $(cat "$tmp/stderr")"
fi

# ---- 5. a range's count --------------------------------------------------------
# 0 m to 1 m by 0.00001 m is 1/0.00001 + 1 = 100001 values: one more than
# the 100000 a range may make (README.md, plumb air); to 0.99999 m, 100000.
refused "air 0m:1m:0.00001m" "--alt:1:1: '0m:1m:0.00001m' makes 100001 values, more than 100000" \
  -- air --alt 0m:1m:0.00001m
refused "sweep by the same count" "makes 100001 values, more than 100000" \
  -- sweep "$good" --vary "release.height=1m:2m:0.00001m"
"$bin" air --alt 0m:0.99999m:0.00001m --format csv >"$tmp/air.csv" 2>"$tmp/stderr"
n=$(grep -c '^[0-9]' "$tmp/air.csv")
[ "$n" -eq 100000 ] && pass=$((pass + 1)) || bad "air 0m:0.99999m:0.00001m: $n rows, expected 100000"
# the text table labels each row with its own altitude
"$bin" air --alt 0m:0.99999m:0.00001m >"$tmp/air.txt" 2>"$tmp/stderr"
n=$(awk '$2 ~ /^[0-9.]+$/ && $1 ~ /^[0-9.]+$/ { print $1 }' "$tmp/air.txt" | sort -u | wc -l)
[ "$n" -eq 100000 ] && pass=$((pass + 1)) || bad "air text 0m:0.99999m:0.00001m: $n distinct altitudes, expected 100000"
if grep -q '^ *0.00001  ' "$tmp/air.txt" && grep -q '^ *0.99999  ' "$tmp/air.txt"; then
  pass=$((pass + 1))
else
  bad "air text lacks the altitudes 0.00001 and 0.99999: $(sed -n 5,7p "$tmp/air.txt")"
fi
# ... in US units too: 0.0001 m is 0.000328 ft (0.3048 m the foot)
"$bin" air --alt 0m:0.01m:0.0001m --units us >"$tmp/air.txt" 2>"$tmp/stderr"
n=$(awk '$2 ~ /^[0-9.]+$/ && $1 ~ /^[0-9.]+$/ { print $1 }' "$tmp/air.txt" | sort -u | wc -l)
[ "$n" -eq 101 ] && pass=$((pass + 1)) || bad "air --units us by 0.0001 m: $n distinct altitudes, expected 101"

# ---- 6. ranges in words ----------------------------------------------------------
# 150 K .. 400 K is -123.15 degC .. 126.85 degC (NIST SP 811, 2008, B.9):
# never rounded outward to 127 degC, which the key refuses
printf 'name: hot\npayload: {mass: 2.385 kg, drag: {cd: 0.9, area: 0.0113 m^2}}\nrelease: {height: 31.6 m}\natmosphere: {model: surface, pressure: 1002.5 hPa, temperature: 500 K}\n' \
  >"$tmp/hot.yaml"
refused "a temperature of 500 K" "hot.yaml:4:65: atmosphere.temperature: must be 150 K .. 400 K" \
  "-123.15 degC .. 126.85 degC" "!127 degC" -- fall "$tmp/hot.yaml"
refused "--temperature-offset 200K" \
  "plumb: --temperature-offset:1:1: 200 K is out of range: must be -100 K .. 100 K" \
  "!found" -- air --temperature-offset 200K
# 360 degF as a difference is 200 K (NIST SP 811 B.9: 1 degF = 1/1.8 K)
refused "--temperature-offset 360 degF" \
  "plumb: --temperature-offset:1:1: '360 degF': 200 K is out of range" \
  -- air --temperature-offset "360 degF"

# ---- 7. a mass beyond any lift ----------------------------------------------------
# payload.mass (an item's, the downwash's aircraft_mass) is at most 1e8 kg
# (README.md "Profile keys"): 1e308 lb (4.5e307 kg) passed the old "> 0"
# and failed only in the fall, exit 3. It is an input error at its line
# and column, naming the key and the range; in US units too: 1e8 kg is
# 220462262.2 lb (NIST SP 811, 2008, B.8: 1 lb = 0.45359237 kg exactly),
# shown rounded inward, 2.20462e+08 lb.
printf 'name: huge
payload:
  mass: 1e308 lb
  drag: {cd: 0.9, area: 0.0113 m^2}
release: {height: 31.6 m}
' \
  >"$tmp/huge.yaml"
refused "a mass of 1e308 lb" "plumb: $tmp/huge.yaml:3:9: payload.mass: must be > 0 kg and <= 1e+08 kg" \
  "found '1e308 lb'" -- fall "$tmp/huge.yaml"
refused "a mass just above 1e8 kg" "plumb: --set:1:14: payload.mass: must be > 0 kg and <= 1e+08 kg" \
  -- fall "$tmp/huge.yaml" --set "payload.mass=100000001 kg"
refused "an item's mass of 2e8 kg" "plumb: --set:1:15: items[2].mass: must be > 0 kg and <= 1e+08 kg" \
  -- fall "$inv" --set "items[2].mass=2e8 kg"
refused "an aircraft of 1e9 kg" "release.downwash.aircraft_mass: must be > 0 kg and <= 1e+08 kg" \
  -- fall "$good" --set "release.downwash={aircraft_mass: 1e9 kg, disk_area: 1.2 m^2}"
"$bin" lint --units us "$tmp/huge.yaml" >"$tmp/stdout" 2>"$tmp/stderr"
if grep -q -F "[US: > 0 lb and <= 2.20462e+08 lb]" "$tmp/stderr"; then
  pass=$((pass + 1))
else
  bad "lint --units us: the mass's range in pounds: $(cat "$tmp/stderr")"
fi
# the bound itself is a mass like any other: 1e8 kg falls
if "$bin" fall "$tmp/huge.yaml" --set "payload.mass=1e8 kg" >"$tmp/stdout" 2>"$tmp/stderr"; then
  pass=$((pass + 1))
else
  bad "a mass of 1e8 kg is refused: $(cat "$tmp/stderr")"
fi

# ---- 8. one key, one --set -------------------------------------------------------
# A repeated --format or -o is refused rather than the last silently winning
# (README.md "Common options"); so is a key two --set options give: the
# same key, an item by its name and by its number (glove is items[3] of
# the inventory), a map that would drop a key an earlier --set gave in it,
# a key an earlier --set gave in its map's value, and a key standing
# instead of one an earlier --set gave (descent.area / descent.diameter).
refused "release.height twice" "plumb: --set:2:1: release.height: " "--set 1" "--set 2" \
  -- fall "$good" --set "release.height=10m" --set "release.height=20m"
refused "glove's mass by name and by number" "plumb: --set:2:1: items[3].mass: " \
  "--set 1 (as 'items[glove].mass')" -- fall "$inv" --set "items[glove].mass=2kg" \
  --set "items[3].mass=3kg"
refused "glove's mass by number and by name" "plumb: --set:2:1: items[glove].mass: " "--set 1" \
  -- fall "$inv" --set "items[3].mass=2kg" --set "items[glove].mass=3kg"
refused "release after release.height" "plumb: --set:2:1: release: " "--set 1 sets 'release.height'" \
  -- fall "$good" --set "release.height=10m" --set "release={height: 20 m}"
refused "release.height after release" "plumb: --set:2:1: release.height: " "--set 1 ('release')" \
  -- fall "$good" --set "release={height: 20 m}" --set "release.height=10m"
refused "a removal after a key inside" "plumb: --set:2:1: release.velocity: " "--set 1" \
  -- fall "$good" --set "release.velocity.up=1m/s" --set "release.velocity=~"
refused "payload.shape after payload.drag" "plumb: --set:2:1: payload.shape: " \
  "stands instead of drag, which --set 1 sets" \
  -- fall "$good" --set "payload.drag={cd: 0.9, area: 0.01 m^2}" \
  --set "payload.shape={kind: sphere, diameter: 0.1 m}"
# the same for two --vary of one item's key, by its name and its number
refused "--vary glove's mass by name and by number" \
  "plumb: --vary:2:1: items[3].mass: the same key as --vary 1 ('items[glove].mass')" \
  -- sweep "$inv" --vary "items[glove].mass=1kg:2kg:1kg" --vary "items[3].mass=1kg:2kg:1kg"
# keys of two maps, a key a map given whole did not give, a list removed
# then given anew, a key removed then one standing instead of it: each
# --set is taken
for sets in "release.height=10m|wind.speed=3 m/s" \
            "release={height: 20 m}|release.velocity.up=1m/s" \
            "items=~|items[1]={name: a, mass: 1 kg, drag: {cd_area: 0.01 m^2}}" \
            "items[1].mass=1kg|items[2].mass=2kg" \
            "payload.drag=~|payload.shape={kind: sphere, diameter: 0.11 m}"; do
  p=$good
  case $sets in items*) p=$inv ;; esac
  if "$bin" fall "$p" --set "${sets%%|*}" --set "${sets#*|}" >"$tmp/stdout" 2>"$tmp/stderr"; then
    pass=$((pass + 1))
  else
    bad "--set '${sets%%|*}' --set '${sets#*|}' refused: $(cat "$tmp/stderr")"
  fi
done

# ---- 9. a value on the command line located as a --set is -------------------------
# README.md "Exit status": OPTION:N:COL:, the N-th of that option, COL where
# the part at fault starts in its value; then the key. The second --vary's
# STEP: "release.height=" is 15 characters, "10m:20m:" 8, so STEP is at 24.
refused "the second --vary's STEP" "plumb: --vary:2:24: release.height: STEP '-1m' goes the wrong way" \
  -- sweep "$good" --vary "wind.speed=1m/s:2m/s:1m/s" --vary "release.height=10m:20m:-1m"
refused "--alt's TO" "plumb: --alt:1:4: TO '10x': " -- air --alt "0m:10x:1m"
refused "--energy-max of a mass" "plumb: --energy-max:1:1: expected an energy" \
  -- limit "$good" --find release.height --energy-max 5kg
refused "--find an item by a wrong name" "plumb: --find:1:7: items[glov].mass: no item is named" \
  -- limit "$inv" --find "items[glov].mass" --energy-max 5J
refused "--samples not a number" "plumb: --samples:1:1: expected a whole number" \
  -- zone "$good" --samples x
# a sweep's row that cannot be computed says where its value came from the
# same way, in every format: the first --vary, at FROM (after
# "payload.mass=", column 14)
for fmt in text csv json; do
  "$bin" sweep "$good" --vary "payload.mass=-1kg:1kg:1kg" --format $fmt >"$tmp/rows.$fmt" 2>"$tmp/stderr"
  if grep -q -e "--vary:1:14: payload.mass: must be > 0 kg" "$tmp/rows.$fmt"; then
    pass=$((pass + 1))
  else
    bad "a failed row in $fmt is not at --vary:1:14: $(grep -e '--vary' "$tmp/rows.$fmt" | head -n 2)"
  fi
done

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
