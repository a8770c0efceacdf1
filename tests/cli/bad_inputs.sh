#!/bin/sh
# Bad input at the command line: every malformed profile in tests/bad/, bad
# --set overrides, bad `plumb air --alt` ranges, and files that are not
# profiles (a directory, a missing file, /proc/self/mem, an oversize file,
# an empty file). Each must exit with status 2 (README.md "Exit status"), say
# where on stderr as `plumb: FILE:LINE:COL: KEY: message`, and write
# nothing: no -o file, no temporary file beside it.
#
# Each tests/bad/*.yaml starts with the line
#   # expect: SUBSTRING @ LINE:COL key=KEY
# naming part of the message, its position and the dotted key.
#
#   sh tests/cli/bad_inputs.sh PLUMB
#
# Ends with one line `cli: N passed, N failed`; exit 0 only if none failed.
. "$(dirname "$0")/lib/setup.sh"
good=profiles/payloads/torque-wrench.yaml

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-bad.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

pass=0
fail=0
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }

# refused NAME WANT... -- ARGS...: lib/refused.sh
. "$here/lib/refused.sh"

# ---- every malformed profile ----------------------------------------------
n_bad=0
for f in tests/bad/*.yaml; do
  [ -f "$f" ] || continue
  n_bad=$((n_bad + 1))
  # the first line read by the shell (no sed: some 100 files, and a fork
  # for each cost more than lint's own plumb under the plain build)
  line1=""
  IFS= read -r line1 <"$f" || :
  case $line1 in
    "# expect: "*" @ "*" key="*) ;;
    *) bad "$f: first line is not '# expect: TEXT @ LINE:COL key=KEY'"; continue ;;
  esac
  rest=${line1#"# expect: "}
  sub=${rest% @ *}
  tail=${rest##* @ }
  pos=${tail%% key=*}
  key=${tail#* key=}
  if [ -n "$key" ]; then
    refused "$f" "plumb: $f:$pos: $key: " "$sub" -- fall "$f" --format json
  else
    refused "$f" "plumb: $f:$pos: " "$sub" -- fall "$f" --format json
  fi
  # one fault: lint lists it alone, nothing that follows from setting it
  # aside (a required key then missing, a list then too short)
  "$bin" lint "$f" >"$tmp/stdout" 2>"$tmp/stderr"
  rc=$?
  # its lines starting "plumb: " counted, and the one wanted looked for,
  # as grep -c '^plumb: ' and grep -F would (shell built-ins, see above)
  n_err=0 at=no
  while IFS= read -r l || [ -n "$l" ]; do
    case $l in "plumb: "*) n_err=$((n_err + 1)) ;; esac
    case $l in *"plumb: $f:$pos: ${key:+$key: }"*) at=yes ;; esac
  done <"$tmp/stderr"
  if [ $rc -eq 2 ] && [ "$n_err" -eq 1 ] && [ "$at" = yes ]; then
    pass=$((pass + 1))
  else
    bad "lint $f: exit $rc, expected its one fault at $pos${key:+ $key}: $(cat "$tmp/stderr")"
  fi
done
[ "$n_bad" -ge 30 ] && pass=$((pass + 1)) || bad "tests/bad holds $n_bad profiles, expected at least 30"

# ---- tabs that are white space, not indentation -----------------------------
printf 'payload:\n  mass: 2.385 kg\t# scale reading\n  drag: {cd_area: 0.0113 m^2}  # a\tcomment\nrelease:\n  height: 27.4 m\n' >"$tmp/tab-comment.yaml"
if "$bin" lint "$tmp/tab-comment.yaml" >"$tmp/stdout" 2>"$tmp/stderr"; then
  pass=$((pass + 1))
else
  bad "a tab before and inside a trailing comment: $(cat "$tmp/stderr")"
fi

# ---- lint lists every error of a file, in file order ------------------------
printf 'payload:\n  mass: 2 Kg\n  drag: {cd: 0.9, area: 0.004 m^2}\nrelease:\n  height: 30 m\nwind:\n  form: 270 deg\natmosphere:\n  humidity: 150 %%\n' >"$tmp/three.yaml"
"$bin" lint "$tmp/three.yaml" >"$tmp/stdout" 2>"$tmp/stderr"
rc=$?
got=$(sed -n 's/^plumb: [^:]*:\([0-9]*:[0-9]*\): \([^:]*\):.*/\1 \2/p' "$tmp/stderr" | tr '\n' ';')
if [ $rc -eq 2 ] && [ "$got" = "2:9 payload.mass;7:3 wind.form;9:13 atmosphere.humidity;" ] &&
   ! grep -q ': ok$' "$tmp/stdout"; then
  pass=$((pass + 1))
else
  bad "lint of three errors: exit $rc, got '$got': $(cat "$tmp/stderr")"
fi

# lint_lists NAME FILE WANT: plumb lint FILE exits 2, prints no ok line on
# stdout (only the cautions, README.md "Cautions") and lists exactly the errors WANT ("LINE:COL KEY;" each, in file
# order). The positions are those of the values (or keys) in the printf
# text, counted from 1 as libyaml counts them.
lint_lists() {
  "$bin" lint "$2" >"$tmp/stdout" 2>"$tmp/stderr"
  rc=$?
  got=$(sed -n 's/^plumb: [^:]*:\([0-9]*:[0-9]*\): \([^:]*\):.*/\1 \2/p' "$tmp/stderr" | tr '\n' ';')
  if [ $rc -eq 2 ] && [ "$got" = "$3" ] && ! grep -q ': ok$' "$tmp/stdout" &&
    [ "$(grep -c '^plumb: ' "$tmp/stderr")" -eq "$(printf '%s' "$3" | tr -cd ';' | wc -c)" ]; then
    pass=$((pass + 1))
  else
    bad "lint $1: exit $rc, got '$got', expected '$3': $(cat "$tmp/stderr")"
  fi
}
# a refused required value (release.height out of range, payload.mass in
# metres) does not end the check: the area's bare number and the wind's
# word are found too
printf 'name: four\npayload:\n  mass: 1 m\n  drag: {cd: 0.5, area: 0.01}\nrelease:\n  height: -3 m\nwind: {speed: 5 kn, from: westerly}\n' >"$tmp/four.yaml"
lint_lists "of four errors, two of required keys" "$tmp/four.yaml" \
  "3:9 payload.mass;4:25 payload.drag.area;6:11 release.height;7:27 wind.from;"
printf 'name: three\npayload:\n  mass: 1 m\n  drag: {cd: 0.5, area: 0.01}\nrelease:\n  height: 3 m\nwind: {speed: 5 kn, from: westerly}\n' >"$tmp/three-b.yaml"
lint_lists "of three errors, the height fixed" "$tmp/three-b.yaml" \
  "3:9 payload.mass;4:25 payload.drag.area;7:27 wind.from;"
# a misspelt key, a bare height, a misspelt word and a cd out of range: the
# mass then missing is the typo's consequence, not listed
printf 'name: typos\npayload:\n  mas: 1 kg\n  drag: {cd: -1, area: 0.01 m^2}\nrelease:\n  height: 120\nwind: {profile: powr, speed: 5 kn, from: 270 deg}\n' >"$tmp/typos.yaml"
lint_lists "of a typo, a bare height, a word and a cd" "$tmp/typos.yaml" \
  "3:3 payload.mas;4:14 payload.drag.cd;6:11 release.height;7:17 wind.profile;"
# release: given with its one key misspelt: the typo alone, never
# "release.height ... (release is not given)" at 1:1
printf 'name: heigth\npayload:\n  mass: 1 kg\n  drag: {cd: 0.5, area: 0.01 m^2}\nrelease:\n  heigth: 30 m\n' >"$tmp/heigth.yaml"
lint_lists "of a misspelt release.height" "$tmp/heigth.yaml" "6:3 release.heigth;"
if grep -F -q "is not given" "$tmp/stderr"; then
  bad "lint of a misspelt release.height says release is not given: $(cat "$tmp/stderr")"
else
  pass=$((pass + 1))
fi
# a deploy height checked against the release height's stand-in is not an
# error of its own: -3 m refused, 60 m not "at or above" what stood in
printf 'payload:\n  mass: 2 kg\n  drag: {cd: 0.9, area: 0.01 m^2}\ndescent:\n  kind: parachute\n  cd: 0.8\n  area: 1.2 m^2\n  deploy: {below: 60 m}\nrelease:\n  height: -3 m\nwind: {speed: 5 kn, from: 270 dg}\n' >"$tmp/deploy.yaml"
lint_lists "of a negative height under a deploy height" "$tmp/deploy.yaml" \
  "10:11 release.height;11:27 wind.from;"
# ... but a deploy height above a valid release height is
printf 'payload:\n  mass: 2\n  drag: {cd: 0.9, area: 0.01 m^2}\ndescent:\n  kind: parachute\n  cd: 0.8\n  area: 1.2 m^2\n  deploy: {below: 60 m}\nrelease:\n  height: 30 m\n' >"$tmp/deploy2.yaml"
lint_lists "of a deploy height above the release" "$tmp/deploy2.yaml" \
  "2:9 payload.mass;8:19 descent.deploy.below;"
# a word with no did-you-mean: the exponent of the profile meant is not
# refused as "not used with profile uniform"
printf 'payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.01 m^2}}\nrelease: {height: 30 m}\nwind: {profile: xyz, speed: 5 kn, from: 270 deg, exponent: 0.2}\n' >"$tmp/xyz.yaml"
lint_lists "of an unknown wind profile with an exponent" "$tmp/xyz.yaml" "3:17 wind.profile;"
# a misspelt wind profile among bare numbers of the wind: another stand-in
# of the profile ('table') stops before the bare speed, at errors of its own
# making (table missing, speed "not used"), which prove nothing
printf 'payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.01 m^2}}\nrelease: {height: 30 m}\nwind:\n  profile: powr\n  speed: 8\n  from: westerly\n  reference_height: 10\n  exponent: 0.143\n' >"$tmp/wind.yaml"
lint_lists "of a misspelt wind profile and three wind values" "$tmp/wind.yaml" \
  "4:12 wind.profile;5:10 wind.speed;6:9 wind.from;7:21 wind.reference_height;"
# a required key missing on its own is listed, and the check goes on
printf 'payload:\n  drag: {cd: 0.9, area: 0.01}\nrelease:\n  height: 30\nsite: {latitude: 95 deg}\n' >"$tmp/no-mass.yaml"
lint_lists "of a missing mass and three more" "$tmp/no-mass.yaml" \
  "2:3 payload.mass;2:25 payload.drag.area;4:11 release.height;5:18 site.latitude;"
# plumb fall reports one error, the first in file order (lint's first),
# not the first the loader meets (it reads the release before the payload)
"$bin" fall "$tmp/four.yaml" >"$tmp/stdout" 2>"$tmp/stderr"
rc=$?
if [ $rc -eq 2 ] && [ "$(grep -c '^plumb: ' "$tmp/stderr")" -eq 1 ] &&
  grep -F -q "four.yaml:3:9: payload.mass: expected a mass" "$tmp/stderr" && [ ! -s "$tmp/stdout" ]; then
  pass=$((pass + 1))
else
  bad "fall of four errors: exit $rc: $(cat "$tmp/stderr")"
fi

# ---- overrides --------------------------------------------------------------
refused "--set with an unknown key" "plumb: --set:1:9: release.hieght: " "did you mean 'release.height'" \
  -- fall "$good" --set release.hieght=30m --format json
refused "--set with a bare number" "plumb: --set:1:16: release.height: " \
  -- fall "$good" --set release.height=30 --format json
# a release speed above the sea-level speed of sound (340.294 m/s, US Std
# Atm 1976): outside the subsonic drag model, refused with its bound
refused "--set release.velocity.up=-400 m/s" "plumb: --set:1:21: release.velocity.up: " \
  "must be -340.294 m/s .. 340.294 m/s" -- fall "$good" --set 'release.velocity.up=-400 m/s' --format json
# plumb air's offset has the profile key's range (-100 K .. 100 K) and names
# the command line as every option error does
refused "air --temperature-offset -200 K" "plumb: --temperature-offset:1:1: " \
  "must be -100 K .. 100 K" -- air --temperature-offset "-200 K"
# a direction that is neither a number nor near a compass point says that
# the 16 points are taken too
refused "--set wind.from=westerly" "plumb: --set:1:11: wind.from: " \
  "may also be one of the 16 compass points" -- fall "$good" --set 'wind.from=westerly' --format json
# (the command line may refuse this one itself, as a usage error)
# a direction written as a word or a misspelt point: the 16-point rose's
# abbreviation suggested (N, NNE, ... NNW; common practice, no source)
refused "--set wind.from=West" "plumb: --set:1:11: wind.from: " "did you mean W?" \
  -- fall "$good" --set "wind.from=West"
refused "--set wind.from=SWW" "plumb: --set:1:11: wind.from: " "16 compass points: did you mean SSW?" \
  -- fall "$good" --set "wind.from=SWW"
refused "--set without =" "KEY=VALUE" \
  -- fall "$good" --set release.height --format json
refused "--set with malformed YAML" "plumb: --set:1:" "malformed YAML" \
  -- fall "$good" --set "payload.drag={cd: 1" --format json
refused "--set with a value out of range" "plumb: --set:1:17: payload.drag.cd: " \
  -- fall "$good" --set payload.drag.cd=-0.5 --format json
refused "--set naming an unknown criterion" "plumb: --set:1:11: criteria[0]: " \
  "did you mean 'eu-c1-80j'" -- fall tests/cli/profiles/thrown.yaml --set "criteria=[eu-c2]" --format json
# an error in a --set value names --set and the key, and suggests a unit
# of the key's own dimension
refused "--set with a unit in capitals" "plumb: --set:1:14: payload.mass: " \
  'did you mean "5 kg"?' "case-sensitive" -- fall "$good" --set "payload.mass=5 KG" --format json
refused "--set with a mega for a metre" "plumb: --set:1:16: release.height: " \
  'did you mean "60 m"?' "M is the prefix mega" -- fall "$good" --set "release.height=60 M" --format json
# a unit of another quantity in another case: kg is a mass, so an area is
# not offered it (BIPM SI Brochure, 9th ed., 2019, tables 2 and 7: unit
# symbols are case-sensitive; seen)
refused "--set an area in capital KG" "plumb: --set:1:19: payload.drag.area: " "expected an area" \
  "KG is not a unit; kg is a mass" "units of an area: m^2" \
  -- fall "$good" --set "payload.drag.area=5 KG" --format json
refused "--set wind speed in KT" "plumb: --set:1:12: wind.speed: " 'did you mean "10 kt"?' \
  "case-sensitive" -- fall "$good" --set "wind.speed=10 KT" --format json
refused "--set a mass in kilos" "plumb: --set:1:14: payload.mass: " '"kilos" reads as kiloseconds' \
  'did you mean "5 kg"?' -- fall "$good" --set "payload.mass=5 kilos" --format json
refused "--set a key one level up" "plumb: --set:1:9: payload.area: " \
  "did you mean 'payload.drag.area'?" -- fall "$good" --set "payload.area=5 KG" --format json
refused "--set with a decimal comma" "plumb: --set:1:16: release.height: " \
  'use a decimal point: "6.5 m"' -- fall "$good" --set "release.height=6,5 m" --format json
refused "--set with a compass letter" "plumb: --set:1:15: site.latitude: " \
  'write "54.2 deg"' -- fall "$good" --set "site.latitude=54.2 N" --format json
refused "--set with a word that is not a number" "plumb: --set:1:14: payload.mass: " \
  "does not start with a number" -- fall "$good" --set "payload.mass=heavy" --format json
# items are numbered from 1, as the reports number them
inv=tests/cli/profiles/inventory.yaml
refused "--set items[0]" "plumb: --set:1:7: items[0].mass: " "items are numbered from 1" \
  -- fall "$inv" --set "items[0].mass=0.4 kg" --format json
refused "--set an item by a name it does not have" "plumb: --set:1:1: items[glov].mass: " \
  "did you mean 'glove'?" -- fall "$inv" --set "items[glov].mass=0.4 kg" --format json
refused "--vary items[0]" "items[0].mass: " "items are numbered from 1" \
  -- sweep "$inv" --vary "items[0].mass=0.1kg:0.3kg:0.1kg" --format json
refused "limit --find an item past the end" "plumb: --find:1:7: items[4].mass: " \
  "the profile has 3 items (items[1] to items[3])" \
  -- limit "$inv" --find "items[4].mass" --energy-max 40J --format json
refused "limit --find an item by a name it does not have" "plumb: --find:1:7: items[glov].mass: " \
  "no item is named 'glov'" -- limit "$inv" --find "items[glov].mass" --energy-max 40J --format json
refused "limit --find items[N] of a single payload" "plumb: --find:1:1: items[1].mass: " \
  "the profile has one payload, not items: find payload.mass" \
  -- limit "$good" --find "items[1].mass" --energy-max 40J --format json
refused "--set past the end of a list" "plumb: --set:1:1: descent[1].cd: " \
  -- fall "$good" --set "descent[1].cd=0.8" --format json
# a --set of drag stands instead of the file's shape and the other way round
# (README: a key given instead of another replaces it); an error in its own
# value is at --set, and payload.X on an inventory names the --set
printf 'name: rod (invented)\npayload:\n  mass: 0.5 kg\n  shape: {kind: cylinder, length: 0.3 m, diameter: 0.02 m}\nrelease: {height: 10 m}\n' \
  >"$tmp/shape.yaml"
refused "--set drag over a shape, with a bad unit in it" "plumb: --set:1:28: payload.drag.area: " \
  -- fall "$tmp/shape.yaml" --set "payload.drag={cd: 1, area: 5 KG}" --format json
refused "--set shape over a drag, with a bad unit in it" "plumb: --set:1:40: payload.shape.diameter: " \
  -- fall "$good" --set "payload.shape={kind: sphere, diameter: 5 KG}" --format json
refused "--set payload.mass on an inventory" "plumb: --set:1:1: payload.mass: " \
  "items[N].mass" "items[NAME].mass" -- fall "$inv" --set "payload.mass=1 kg" --format json
refused "--set payload on an inventory" "plumb: --set:1:1: payload: " \
  "not used together with items" "--set items=~" -- fall "$inv" --set "payload={mass: 1 kg}" --format json
refused "--set items[1].mass on a single payload" "plumb: --set:1:1: items[1].mass: " \
  "payload.mass" -- fall "$good" --set "items[1].mass=1 kg" --format json
for s in "payload.drag={cd: 1, area: 0.0105 m^2}" "payload.drag.cd_area=0.0105 m^2"; do
  if "$bin" fall "$tmp/shape.yaml" --set "$s" --format json >"$tmp/stdout" 2>"$tmp/stderr" &&
     grep -q '"cd_area_m2": 0.0105' "$tmp/stdout"; then
    pass=$((pass + 1))
  else
    bad "--set '$s' over a shape: $(cat "$tmp/stderr")"
  fi
done
if "$bin" fall "$good" --set "payload.shape.kind=sphere" --set "payload.shape.diameter=0.05 m" \
   >"$tmp/stdout" 2>"$tmp/stderr" && grep -q "sphere of diameter 0.05 m" "$tmp/stdout"; then
  pass=$((pass + 1))
else
  bad "--set payload.shape.kind over a drag: $(cat "$tmp/stderr")"
fi
# an error in what an option gave names that option, where it can be
# corrected: an unknown
# --vary or --find key, and a sheet's --samples too few for the zone's
# confidence, also with the profile on standard input
refused "--vary an unknown key" "plumb: --vary:1:1: release.heigth: " \
  "did you mean 'release.height'?" -- sweep "$good" --vary "release.heigth=1m:3m:1m" --format json
refused "limit --find an unknown key" "plumb: --find:1:1: release.heigth: " \
  "did you mean 'release.height'?" -- limit "$good" --find release.heigth --energy-max 40J --format json
# a misspelt first part: the did-you-mean is the whole key, the rest kept
# (and itself corrected), never the one part ('release')
refused "--vary a misspelt first part" "plumb: --vary:1:1: relase.height: " \
  "did you mean 'release.height'?" -- sweep "$good" --vary "relase.height=1m:2m:1m" --format json
refused "--find a misspelt first part" "plumb: --find:1:1: relase.height: " \
  "did you mean 'release.height'?" -- limit "$good" --find relase.height --energy-max 40J --format json
refused "--set a misspelt first part" "plumb: --set:1:1: relase.height: " \
  "did you mean 'release.height'?" -- fall "$good" --set "relase.height=1m" --format json
refused "--vary two misspelt parts" "did you mean 'release.height'?" \
  -- sweep "$good" --vary "relase.hieght=1m:2m:1m" --format json
refused "--vary a misspelt middle part" "did you mean 'payload.drag.cd'?" \
  -- sweep "$good" --vary "payload.dragg.cd=0.5:1:0.5" --format json
mkdir "$tmp/sheet-out"
[ -x "$(dirname "$bin")/plumb-sheet" ] &&  # built with cairo and pango
"$bin" sheet - --samples 300 -o "$tmp/sheet-out/x.pdf" <"$good" >"$tmp/stdout" 2>"$tmp/stderr"
rc=$?
[ -x "$(dirname "$bin")/plumb-sheet" ] || rc=skip
if [ "$rc" = skip ]; then :
elif [ $rc -eq 2 ] && [ -z "$(ls -A "$tmp/sheet-out")" ] &&
   grep -q '^plumb: --samples:1:1: 300 samples cannot bound' "$tmp/stderr"; then
  pass=$((pass + 1))
else
  bad "sheet - --samples 300: exit $rc, $(cat "$tmp/stderr")"
fi
# a zone.confidence from --set that the file's zone.samples cannot bound is
# told at that --set as zone.confidence, in sheet as in zone (sheet has no
# --confidence to name). 0.999 at 95 % needs ceil(ln(0.025)/ln(0.999)) = 3688
# samples (order statistics; the binomial bound, closed form).
{ cat "$good"; printf 'zone: {samples: 1000}\n'; } >"$tmp/thousand.yaml"
refused "zone --set zone.confidence over the file's samples" \
  "plumb: --set:1:17: zone.confidence: the 99.9 % radius needs at least 3688 samples" \
  -- zone "$tmp/thousand.yaml" --set zone.confidence=0.999 --threads 1
if [ -x "$(dirname "$bin")/plumb-sheet" ]; then
  refused "sheet --set zone.confidence over the file's samples" \
    "plumb: --set:1:17: zone.confidence: the 99.9 % radius needs at least 3688 samples" \
    -- sheet "$tmp/thousand.yaml" --set zone.confidence=0.999
  if grep -q -e '--confidence' "$tmp/stderr"; then bad "sheet names --confidence: $(cat "$tmp/stderr")"
  else pass=$((pass + 1)); fi
fi
# both by --set: the samples are named, at their own --set
refused "--set zone.samples below a --set confidence" \
  "plumb: --set:2:14: zone.samples: 1000 samples cannot bound the 99.9 % radius" \
  -- zone "$tmp/thousand.yaml" --set zone.confidence=0.999 --set zone.samples=1000 --threads 1
# with several --set, the error names which: the N-th --set is line N of
# the "--set" pseudo-file
refused "the second --set is wrong" "plumb: --set:2:14: payload.mass: " \
  "does not start with a number" -- fall "$good" --set release.height=30m --set "payload.mass=heavy" --format json
refused "the third --set names an unknown key" "plumb: --set:3:9: release.hieght: " \
  -- fall "$good" --set release.height=30m --set wind.speed=5m/s --set release.hieght=3m --format json
# a compass letter on a direction says what a direction takes
refused "--set a direction with a compass letter" "plumb: --set:1:11: wind.from: " \
  'a compass point alone ("NE")' -- fall "$good" --set "wind.from=54.2 N" --format json
# a direction may be a compass point alone, as the latitude's message says
# on the 16-point compass rose each point is 360/16 = 22.5 deg
# clockwise from the one before, N = 0 (the rose's definition, common
# practice, no source), so NE is 45 deg and SSW 202.5 deg: the report is
# the same as for the degrees. A latitude is not a direction: refused.
for pair in "NE:45 deg" "ssw:202.5 deg"; do
  pt=${pair%%:*}
  deg=${pair#*:}
  "$bin" fall "$good" --set wind.speed=5m/s --set "wind.from=$pt" \
    --set "release.velocity={speed: 1 m/s, heading: $pt}" --format json >"$tmp/pt.json" 2>"$tmp/stderr"
  "$bin" fall "$good" --set wind.speed=5m/s --set "wind.from=$deg" \
    --set "release.velocity={speed: 1 m/s, heading: $deg}" --format json >"$tmp/deg.json" 2>>"$tmp/stderr"
  if [ -s "$tmp/pt.json" ] && cmp -s "$tmp/pt.json" "$tmp/deg.json"; then
    pass=$((pass + 1))
  else
    bad "wind.from=$pt is not wind.from=$deg: $(cat "$tmp/stderr")"
  fi
done
refused "--set a latitude to a compass point" "plumb: --set:1:15: site.latitude: " \
  "a compass point names a direction" -- fall "$good" --set "site.latitude=NE" --format json
# a criterion's id mistyped in --energy-max gets the nearest id
refused "limit --energy-max with a mistyped criterion" "plumb: --energy-max:1:1: " \
  "did you mean 'en397-shock-49j'?" -- limit "$good" --find release.height --energy-max en397-shock --format json
# the start of two ids names both (EN 397 has two criteria here)
refused "limit --energy-max with the start of two ids" "--energy-max" \
  "did you mean 'en397-penetration-29j' or 'en397-shock-49j'?" \
  -- limit "$good" --find release.height --energy-max en397 --format json

# ---- a misspelt option or command gets the nearest one ---------------------
# Every option each command's --help lists, misspelt by dropping its first
# letter ("--format" -> "--ormat", one edit): refused as unknown with the
# option meant suggested, exit 2, nothing written.
for c in fall sweep limit zone sheet air lint; do
  "$bin" "$c" --help >"$tmp/help" 2>&1
  opts=$(sed -n '/^Options:/,$s/^  \(-[a-z], \)\{0,1\}\(--[a-z][a-z-]*\).*/\2/p' "$tmp/help")
  n=0
  for o in $opts; do
    typo=--${o#???}  # cut -c4-, by the shell
    refused "$c $typo" "plumb $c: unknown option '$typo' (did you mean '$o'?)" \
      "Try 'plumb $c --help'." -- "$c" "$good" "$typo"
    n=$((n + 1))
  done
  [ "$n" -ge 5 ] && pass=$((pass + 1)) || bad "$c --help lists $n options, expected at least 5"
done
refused "fall --frmat=json" "plumb fall: unknown option '--frmat=json' (did you mean '--format'?)" \
  -- fall "$good" --frmat=json
refused "zone -0 for -o" "plumb zone: unknown option '-0' (did you mean '-o'?)" -- zone "$good" -0
# a word far from every option gets no guess
refused "fall --xyz" "plumb fall: unknown option '--xyz'" -- fall "$good" --xyz
grep -q "did you mean" "$tmp/stderr" && bad "fall --xyz: suggested $(cat "$tmp/stderr")" || pass=$((pass + 1))
# a misspelt command, and one asked about with help
refused "plumb fal" "plumb: unknown command 'fal' (did you mean 'fall'?); the commands are: fall sweep" \
  -- fal "$good"
refused "plumb swep" "plumb: unknown command 'swep' (did you mean 'sweep'?)" -- swep "$good"
refused "plumb help lmit" "plumb: unknown command 'lmit' (did you mean 'limit'?)" -- help lmit
refused "plumb --verison" "plumb: unknown option '--verison' (did you mean '--version'?)" -- --verison
refused "plumb xyz" "plumb: unknown command 'xyz'; the commands are:" -- xyz "$good"

# ---- plumb air --alt ranges ------------------------------------------------
for r in 0m:10km 10km:0m:1km 0:1000:100 0m:10km:0m 0m:10km:-1km 0m:x:1km; do
  refused "air --alt $r" "--alt" -- air --alt "$r" --format json
done

# ---- files that are not profiles ------------------------------------------
mkdir "$tmp/adir"
refused "a directory" "plumb: $tmp/adir: " "directory" -- fall "$tmp/adir" --format json
refused "a missing file" "plumb: $tmp/missing.yaml: " -- fall "$tmp/missing.yaml" --format json
if [ -r /proc/self/mem ]; then
  refused "/proc/self/mem (opens, cannot be read)" "plumb: /proc/self/mem: " \
    -- fall /proc/self/mem --format json
fi
# one byte over 1 MiB (PLUMB_PROFILE_MAX_BYTES) of comment lines
awk 'BEGIN { for (i = 0; i < 13200; i++) printf "# %077d\n", i }' | head -c 1048577 >"$tmp/big.yaml"
size=$(wc -c <"$tmp/big.yaml" | tr -d ' ')
if [ "$size" -eq 1048577 ]; then
  refused "a file of 1 MiB + 1 byte" "plumb: $tmp/big.yaml: " "1048576" \
    -- fall "$tmp/big.yaml" --format json
else
  bad "oversize file: generated $size bytes, expected 1048577"
fi
: >"$tmp/empty.yaml"
refused "an empty file" "plumb: $tmp/empty.yaml:1:1: " "no YAML document" \
  -- fall "$tmp/empty.yaml" --format json
printf '# only a comment\n\n' >"$tmp/comment.yaml"
refused "a comment-only file" "plumb: $tmp/comment.yaml:1:1: " -- fall "$tmp/comment.yaml" --format json

# A file that is not regular (a FIFO) and longer than the most accepted: its
# size is unknown before reading, so the reader stops at the limit.
if mkfifo "$tmp/long.fifo" 2>/dev/null; then
  (head -c 1100000 /dev/zero | tr '\0' a >"$tmp/long.fifo") &
  refused "a FIFO longer than 1 MiB" "plumb: $tmp/long.fifo: " "longer than 1048576 bytes" \
    -- fall "$tmp/long.fifo" --format json
  wait
  rm -f "$tmp/long.fifo"
else
  bad "mkfifo failed in $tmp"
fi

# Uncertainties the zone's sampler refuses (src/uq/dispersion.c), in the
# profile itself so that the position is the file's.
zbase='payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.003 m^2}}
release: {height: 60 m}
zone: {samples: 400, seed: 5}
uncertainty:'
printf '%s\n  payload.drag.cd: {uniform: [0.8, 1]}\n  payload.attitude: {choice: [tumbling, end-on]}\n' \
  "$zbase" | sed 's/drag: {cd: 0.9, area: 0.003 m^2}/shape: {kind: cylinder, length: 0.3 m, diameter: 0.05 m}/' \
  >"$tmp/attitude-and-cd.yaml"
refused "an uncertain attitude and an uncertain drag coefficient" \
  "plumb: $tmp/attitude-and-cd.yaml:5:3: " "the attitude sets the drag" \
  -- zone "$tmp/attitude-and-cd.yaml" --format json --threads 1

# The same refusals of an uncertainty given by --set name that --set (the
# N-th --set is line N of "--set"): a new entry at its key, a
# value given over one of the file at the value; one in the file still
# names the file when a --set is also given.
printf '%s\n  release.velocity.speed: "3 m/s +- 1 m/s"\n  wind.from: {uniform: [10 deg, 50 deg]}\n' \
  "$zbase" | sed 's/^release: {height: 60 m}/release: {height: 60 m, velocity: {speed: 3 m\/s, heading: 90 deg}}\nwind: {speed: 4 m\/s, from: 30 deg}/' \
  >"$tmp/velocity.yaml"
refused "an uncertainty added by the second --set" \
  "plumb: --set:2:13: release.velocity.east: " "either as east/north or as speed/heading" \
  -- zone "$tmp/velocity.yaml" --format json --threads 1 --set zone.seed=7 \
  --set "uncertainty.release.velocity.east={uniform: [0.5 m/s, 0.9 m/s]}"
refused "an uncertainty of the file given again by --set" \
  "plumb: --set:1:23: wind.from: " "wider than a full turn" \
  -- zone "$tmp/velocity.yaml" --format json --threads 1 \
  --set "uncertainty.wind.from={uniform: [0 deg, 400 deg]}"
sed 's/\[10 deg, 50 deg\]/[0 deg, 400 deg]/' "$tmp/velocity.yaml" >"$tmp/sector.yaml"
refused "an uncertainty of the file, with a --set beside it" \
  "plumb: $tmp/sector.yaml:7:3: wind.from: " "wider than a full turn" \
  -- zone "$tmp/sector.yaml" --format json --threads 1 --set zone.seed=7

# A profile naming a criterion when the criteria directory holds none.
mkdir "$tmp/no-criteria"
printf 'payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.003 m^2}}\nrelease: {height: 6 m}\ncriteria: [en397-shock-49j]\n' \
  >"$tmp/one-criterion.yaml"
refused "a criterion named with no criteria loaded" \
  "plumb: $tmp/one-criterion.yaml:3:12: criteria[0]: " "unknown criterion 'en397-shock-49j'; no criteria are loaded" \
  -- fall "$tmp/one-criterion.yaml" --criteria-dir "$tmp/no-criteria" --format json

# A criteria directory of 33 benchmarks (invented) and a profile naming none:
# all would be judged, one more than a report holds (PLUMB_MAX_VERDICTS).
mkdir "$tmp/many-criteria"
i=1
while [ $i -le 33 ]; do
  printf 'name: Invented benchmark %d\nkind: helmet-test\nenergy_limit: %d J\napplies_to: a test\nsource: invented for a test\nstatus: memory\n' \
    $i $((10 + i)) >"$tmp/many-criteria/t$i.yaml"
  i=$((i + 1))
done
printf 'payload: {mass: 2 kg, drag: {cd: 0.9, area: 0.003 m^2}}\nrelease: {height: 6 m}\n' >"$tmp/no-criterion.yaml"
refused "33 criteria to judge" "plumb: $tmp/no-criterion.yaml: criteria: " "33 criteria to judge; at most 32" \
  -- fall "$tmp/no-criterion.yaml" --criteria-dir "$tmp/many-criteria" --format json

# A one-way sweep of more rows than a sweep holds (PLUMB_SWEEP_MAX_ROWS,
# 10000), refused before any fall is run.
refused "a one-way sweep of 20000 rows" "plumb: --vary:1:1: " \
  "20000 values make more than 10000 rows" \
  -- sweep "$tmp/no-criterion.yaml" --vary "release.height=1 m:20000 m:1 m"

# ---- -o's file name and the format agree -----------------------------------
# A report's extension chooses the format; one that contradicts --format, or
# names what the command does not write, is refused (exit 2, nothing written).
abs_criteria=$PWD/profiles/criteria
named() {
  name=$1 file=$2 want=$3
  shift 3
  rm -rf "$tmp/named"
  mkdir "$tmp/named" || exit 2
  (cd "$tmp/named" && PLUMB_CRITERIA_DIR=$abs_criteria "$bin" "$@" -o "$file" \
    >"$tmp/stdout" 2>"$tmp/stderr")
  rc=$?
  left=$(ls -A "$tmp/named")
  if [ $rc -eq 2 ] && grep -F -q -e "$want" "$tmp/stderr" && [ -z "$left" ]; then
    pass=$((pass + 1))
  else
    bad "$name: exit $rc, left '$left': $(head -n 1 "$tmp/stderr")"
  fi
}
named "sheet -o x.txt" x.txt "-o x.txt names a text file, but the sheet is a PDF" sheet "$PWD/$good"
named "fall -o x.json --format csv" x.json "but --format asks for a CSV file" fall "$PWD/$good" --format csv
named "fall -o x.pdf" x.pdf "the PDF is plumb sheet's" fall "$PWD/$good"
named "air -o a.geojson" a.geojson "names a GeoJSON file, which this command does not write" air
rm -rf "$tmp/named"
mkdir "$tmp/named"
for pair in "r.json:{" "R.CSV:# " "r.txt:plumb "; do
  file=${pair%%:*} head=${pair#*:}
  if (cd "$tmp/named" && PLUMB_CRITERIA_DIR=$abs_criteria "$bin" fall "$OLDPWD/$good" \
    -o "$file" --quiet) &&
    [ "$(head -c ${#head} "$tmp/named/$file")" = "$head" ]; then
    pass=$((pass + 1))
  else
    bad "fall -o $file: the file does not start with '$head'"
  fi
done

# ---- -o given twice ----------------------------------------------------------
# Keeping only the last -o would leave the report the user named first
# unwritten in silence: a second -o is refused (exit 2, nothing written).
# (refused adds its own -o after these arguments.)
refused "fall -o given twice" "plumb fall: -o may be given once" \
  -- fall "$good" -o "$tmp/first.txt"
refused "fall --output then -o" "-o may be given once" \
  -- fall "$good" --output="$tmp/first.txt"
if [ -e "$tmp/first.txt" ]; then
  bad "a refused second -o wrote the first file"
else
  pass=$((pass + 1))
fi

# ---- an option that takes one value, given twice ----------------------------
# Last-wins would use the second value and drop the first in silence
# (--samples 100 --samples 200): every single-valued option of every command
# is refused when repeated (exit 2, naming it, nothing written); --set and
# --vary stay repeatable (README.md "Common options").
zp=profiles/demo/drone-release.yaml
twice() { # NAME OPTION CMD ARGS... : ARGS already hold OPTION twice
  n=$1 opt=$2
  shift 2
  refused "$n" "may be given once" "$opt" -- "$@"
}
twice "fall --format twice" --format fall "$good" --format json --format csv
twice "fall --units twice" --units fall "$good" --units us --units=si
twice "fall --criteria-dir twice" --criteria-dir fall "$good" --criteria-dir a --criteria-dir b
twice "sweep --format twice" --format sweep "$good" --vary release.height=2m:4m:1m \
  --format csv --format json
twice "sweep --units twice" --units sweep "$good" --vary release.height=2m:4m:1m --units us \
  --units us
twice "limit --find twice" --find limit "$good" --find release.height --find payload.mass \
  --energy-max 40J
twice "limit --energy-max twice" --energy-max limit "$good" --find release.height \
  --energy-max 40J --energy-max 60J
twice "limit --speed-max twice" --speed-max limit "$good" --find release.height \
  --speed-max 8m/s --speed-max 9m/s
twice "limit --drift-max twice" --drift-max limit "$good" --find release.height \
  --drift-max 8m --drift-max 9m
twice "zone --samples twice" --samples zone "$zp" --samples 100 --samples 200
twice "zone --seed twice" --seed zone "$zp" --seed 1 --seed=2
twice "zone --threads twice" --threads zone "$zp" --threads 1 --threads 2
twice "zone --confidence twice" --confidence zone "$zp" --confidence 0.9 --confidence 0.99
twice "zone --target twice" --target zone "$zp" --target 1m,2m --target 3m,4m
twice "zone --samples-out twice" --samples-out zone "$zp" --samples-out "$tmp/s1.csv" \
  --samples-out "$tmp/s2.csv"
twice "zone --regions-out twice" --regions-out zone "$zp" --regions-out "$tmp/r1.csv" \
  --regions-out "$tmp/r2.csv"
twice "air --alt twice" --alt air --alt 0m:1km:1km --alt 0m:2km:1km
twice "air --temperature-offset twice" --temperature-offset air --temperature-offset 5K \
  --temperature-offset 10K
twice "verify --format twice" --format verify --format json --format text
twice "lint --format twice" --format lint "$good" --format json --format csv
twice "sheet --paper twice" --paper sheet "$good" --paper a4 --paper letter
twice "sheet --samples twice" --samples sheet "$zp" --samples 100 --samples 200
twice "sheet --seed twice" --seed sheet "$zp" --seed 1 --seed 2
for f in s1 s2 r1 r2; do
  if [ -e "$tmp/$f.csv" ]; then bad "a refused zone wrote $f.csv"; else pass=$((pass + 1)); fi
done
# repeatable ones stay repeatable
if "$bin" fall "$good" --set release.height=3.1m --set payload.mass=1.37kg --format json \
  >"$tmp/stdout" 2>"$tmp/stderr"; then
  pass=$((pass + 1))
else
  bad "fall with --set twice was refused: $(head -n 1 "$tmp/stderr")"
fi

# ---- -o naming a profile ------------------------------------------------------
# A report written over another YAML file destroys a profile (only the one
# being read was protected): an -o name ending in .yaml or .yml is refused
# (exit 2, the file left as it was), as are zone's side files.
yamlout() { # NAME FILE WANT ARGS...
  name=$1 file=$2 want=$3
  shift 3
  rm -rf "$tmp/named"
  mkdir "$tmp/named" || exit 2
  printf 'name: kept\n' >"$tmp/named/$file"
  (cd "$tmp/named" && PLUMB_CRITERIA_DIR=$abs_criteria "$bin" "$@" \
    >"$tmp/stdout" 2>"$tmp/stderr")
  rc=$?
  left=$(ls -A "$tmp/named")
  if [ $rc -eq 2 ] && grep -F -q -e "$want" "$tmp/stderr" && [ "$left" = "$file" ] &&
    [ "$(cat "$tmp/named/$file")" = "name: kept" ] && [ ! -s "$tmp/stdout" ]; then
    pass=$((pass + 1))
  else
    bad "$name: exit $rc, left '$left': $(head -n 1 "$tmp/stderr")"
  fi
}
yamlout "fall -o B.yaml" B.yaml "-o B.yaml names a profile (.yaml, .yml)" \
  fall "$PWD/$good" -o B.yaml
yamlout "fall --output=B.yml --format json" B.yml "give a name ending in .txt, .json or .csv" \
  fall "$PWD/$good" --output=B.yml --format json
yamlout "zone -o B.YAML" B.YAML "give a name ending in .txt, .json, .csv or .geojson" \
  zone "$PWD/$zp" --samples 50 --threads 1 -o B.YAML
yamlout "zone --samples-out s.yaml" s.yaml "--samples-out s.yaml names a profile" \
  zone "$PWD/$zp" --samples 50 --threads 1 --samples-out s.yaml
yamlout "zone --regions-out r.yml" r.yml "--regions-out r.yml names a profile" \
  zone "$PWD/$zp" --samples 50 --threads 1 --regions-out r.yml
yamlout "sweep -o B.yaml" B.yaml "names a profile" \
  sweep "$PWD/$good" --vary release.height=2m:4m:1m -o B.yaml
yamlout "limit -o B.yaml" B.yaml "names a profile" \
  limit "$PWD/$good" --find release.height --energy-max 40J -o B.yaml
yamlout "air -o B.yaml" B.yaml "names a profile" air -o B.yaml
yamlout "verify -o B.yaml" B.yaml "names a profile" verify -o B.yaml
yamlout "lint -o B.yaml" B.yaml "names a profile" lint "$PWD/$good" -o B.yaml
yamlout "sheet -o B.yaml" B.yaml "give a name ending in .pdf" sheet "$PWD/$good" -o B.yaml
rm -rf "$tmp/named"

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
