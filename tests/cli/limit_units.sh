#!/bin/sh
# `plumb limit` answers in the unit the profile gave the key in as well as
# in the report's units (the answer is read back into that profile). Conversions checked against their
# definitions: the international foot is 0.3048 m exactly (1959
# agreement), the knot 1852/3600 m/s (international nautical mile, 1929).
. "$(dirname "$0")/lib/setup.sh"
pass=0; fail=0
ok() { pass=$((pass + 1)); }
bad() { fail=$((fail + 1)); echo "FAIL: $*"; }
tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-limit-units.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
p=profiles/demo/hand-tool.yaml

"$bin" limit "$p" --find release.height --energy-max 40J --set 'release.height=100 ft' >"$tmp/t" 2>&1 || bad "limit in ft failed"
if grep -q "release.height = [0-9.]* m ([0-9.]* ft, the unit it was given in)" "$tmp/t"; then ok
else bad "no answer in the unit it was given in:"; sed -n 1,8p "$tmp/t"; fi
"$bin" limit "$p" --find release.height --energy-max 40J --set 'release.height=31.6 m' >"$tmp/m" 2>&1
if grep -q "the unit it was given in" "$tmp/m"; then bad "an answer in m repeated in m"; else ok; fi

# an inventory: each item in its own unit, here the second one in lb
"$bin" limit profiles/demo/tower-kit.yaml --find payload.mass --energy-max 40J \
  --set 'items[2].mass=9 lb' >"$tmp/kit" 2>&1 || bad "limit on a kit failed"
if [ "$(grep -c "lb, the unit it was given in)" "$tmp/kit")" -eq 1 ]; then ok
else bad "the kit's item given in lb is not answered in lb:"; grep "payload.mass" "$tmp/kit"; fi

# CSV: value and unit in the unit the key was given in (here ft, and oz
# in a US report)
check_csv() { # UNIT FACTOR ARGS...: value and unit of the CSV in UNIT
  unit=$1; factor=$2; shift 2
  "$bin" limit "$@" --format csv >"$tmp/c" 2>&1 || { bad "limit CSV $*: $(cat "$tmp/c")"; return; }
  if /usr/bin/python3 - "$tmp/c" "$factor" "$unit" <<'PY'
import csv, sys
rows = list(csv.DictReader(l for l in open(sys.argv[1]) if not l.startswith("#")))
r = rows[0]
sys.exit(0 if r["unit"] == sys.argv[3] and
         abs(float(r["value"]) * float(sys.argv[2]) / float(r["value_si"]) - 1) < 1e-9 else 1)
PY
  then ok; else bad "limit CSV not in $unit:"; cat "$tmp/c"; fi
}
check_csv ft 0.3048 "$p" --find release.height --energy-max 40J --set 'release.height=100 ft'
check_csv oz 0.028349523125 "$p" --find payload.mass --energy-max 40J --set 'payload.mass=18 oz' --units us

# a wind speed in a US report is in mph, as a crew reads it (1 mph =
# 0.44704 m/s exactly, NIST SP 811 (2008) B.8), whatever it was given in
"$bin" limit profiles/demo/drone-release.yaml --find wind.speed --drift-max 60m --units us \
  --set 'wind.speed=20 m/s' >"$tmp/w" 2>&1 || bad "limit on wind in US failed"
if grep -q "wind.speed = [0-9.]* mph ([0-9.]* m/s, the unit it was given in)" "$tmp/w"; then ok
else bad "wind speed not in mph:"; sed -n 1,12p "$tmp/w"; fi

check_json() { # ARGS... ; FACTOR
  factor=$1; shift
  "$bin" limit "$@" --format json >"$tmp/j" 2>"$tmp/e" || { bad "limit $*: $(cat "$tmp/e")"; return; }
  if /usr/bin/python3 - "$tmp/j" "$factor" <<'PY'
import json, sys
d = json.load(open(sys.argv[1])); f = float(sys.argv[2])
r = (d.get("items") or [d])[0] if "items" in d else d
res = r.get("result", r)
def find(o):
    if isinstance(o, dict):
        if "value_in_given_unit" in o:
            return o
        for v in o.values():
            x = find(v)
            if x: return x
    if isinstance(o, list):
        for v in o:
            x = find(v)
            if x: return x
o = find(d)
sys.exit(0 if o and abs(o["value_in_given_unit"] * f / o["value_si"] - 1) < 1e-12 else 1)
PY
  then ok; else bad "value_in_given_unit x $factor is not value_si for: $*"; fi
}
check_json 0.3048 "$p" --find release.height --energy-max 40J --set 'release.height=100 ft'
check_json 0.51444444444444444 profiles/demo/drone-release.yaml --find wind.speed --drift-max 60m --set 'wind.speed=9 kn'

# --energy-max in inch pound-force as well as foot pound-force: 300 in lbf =
# 25 ft lbf = 300 x 0.0254 m x 4.4482216152605 N = 33.8954 J (exact by the
# 1959 agreement; NIST SP 811 B.8). Both spellings the trade writes.
for e in "300 in lb" "25 ft lb"; do
  "$bin" limit "$p" --find release.height --energy-max "$e" --format json >"$tmp/e" 2>&1 ||
    { bad "--energy-max '$e' refused: $(head -n 1 "$tmp/e")"; continue; }
  if /usr/bin/python3 - "$tmp/e" <<'PY'
import json, sys
j = json.load(open(sys.argv[1]))["limit"]["energy_max_j"]
sys.exit(0 if abs(j / (300 * 0.0254 * 4.4482216152605) - 1) < 1e-12 and abs(j - 33.895) < 5e-4 else 1)
PY
  then ok; else bad "--energy-max '$e' is not 33.895 J:"; grep energy_max "$tmp/e"; fi
done

echo "cli: $pass passed, $fail failed"
[ "$fail" -eq 0 ]
