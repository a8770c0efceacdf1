#!/bin/sh
# A wind table is interpolated in east and north components, and the
# documents say so with its consequence: between rows from opposite
# directions the air is nearly calm (README.md "The model", SAFETY.md 3.3).
# Source of the checked value: linear interpolation of the components,
# east = -s sin(from): 8 m/s from 270 deg is +8 m/s east, from 090 deg
# -8 m/s east; halfway between, (8 + -8) / 2 = 0 m/s. $1: plumb.
. "$(dirname "$0")/lib/setup.sh"
pass=0 fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL $1"; }

out=$("$bin" fall tests/cli/profiles/opposite-winds.yaml 2>&1)
if printf '%s\n' "$out" | grep -q '0 m/s from 000° (N) at the release height'; then ok
else bad "the wind halfway between opposite rows is calm: $(printf '%s\n' "$out" | grep -A1 '  wind')"; fi

for doc in README.md SAFETY.md; do
  text=$(tr '\n' ' ' < "$doc" | tr -s ' ')
  case $text in
    *"east and north components"*) ok ;;
    *) bad "$doc says a wind table is interpolated in east and north components" ;;
  esac
  case $text in
    *"opposite directions"*calm*) ok ;;
    *) bad "$doc says rows from opposite directions give (nearly) calm air between them" ;;
  esac
done
echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
