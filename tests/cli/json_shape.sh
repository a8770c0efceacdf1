#!/bin/sh
# One JSON shape for a single payload and a kit (a program reads
# either the same way): every fall
# report, and every row of a sweep, has "inventory", "items", "worst" and
# "largest_drift"; a single payload is a kit of one whose item is the same
# object as its top-level figures (kept where README.md "plumb fall" fixes
# them), in the zone JSON too; and no zone JSON depends on the thread
# count.
. "$(dirname "$0")/lib/setup.sh"
tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-json-shape.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
for p in profiles/demo/*.yaml; do
  "$bin" fall "$p" --format json >"$tmp/$(basename "$p" .yaml).fall.json" 2>/dev/null
done
"$bin" sweep profiles/demo/hand-tool.yaml --vary release.height=5m:25m:10m --format json \
  >"$tmp/hand.sweep.json" 2>/dev/null
"$bin" sweep profiles/demo/tower-kit.yaml --vary release.height=5m:25m:10m --format json \
  >"$tmp/kit.sweep.json" 2>/dev/null
for p in drone-canopy tower-kit; do
  "$bin" zone "profiles/demo/$p.yaml" --samples 500 --threads 1 --format json \
    >"$tmp/$p.zone.json" 2>/dev/null
done
/usr/bin/python3 - "$tmp" <<'PY'
import glob, json, os, sys
sys.path.insert(0, os.path.join(os.getcwd(), "tests", "cli", "lib"))
from plumbcli import check, finish
tmp = sys.argv[1]
def shape(o, what):
    check(all(k in o for k in ("inventory", "items", "worst", "largest_drift")),
          f"{what}: inventory, items, worst, largest_drift")
    if not o.get("inventory", True):
        it = o["items"][0]
        check(len(o["items"]) == 1, f"{what}: a single payload is a kit of one")
        check(all(o[k] == v for k, v in it.items()), f"{what}: its item is its top-level figures")
        check(o["worst"] == it["name"] == o["largest_drift"], f"{what}: worst is the payload")
    else:
        check("impact" not in o, f"{what}: a kit's figures are per item")
files = sorted(glob.glob(os.path.join(tmp, "*.fall.json")))
check(len(files) == 4, "four demo falls")
for f in files:
    shape(json.load(open(f)), os.path.basename(f))
for f in ("hand.sweep.json", "kit.sweep.json"):
    rows = json.load(open(os.path.join(tmp, f)))["rows"]
    check(len(rows) == 3, f + ": three rows")
    for i, r in enumerate(rows):
        shape(r, f"{f} row {i + 1}")
# zone: the same shape, a single payload a kit of one with its zone also
# at the top level
for f, kit in (("drone-canopy.zone.json", False), ("tower-kit.zone.json", True)):
    try:
        z = json.load(open(os.path.join(tmp, f)))
    except ValueError:
        z = {}
    check(all(k in z for k in ("inventory", "items", "worst", "kit")) and z["inventory"] == kit,
          f"{f}: inventory, items, worst, kit ({list(z)})")
    if z and not kit:
        check(len(z["items"]) == 1 and z["items"][0]["zone"] == z["zone"]
              and z["worst"] == z["items"][0]["name"] == z["kit"]["set_by"],
              f"{f}: a single payload's zone is a kit of one")
finish()
PY
