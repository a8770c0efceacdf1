#!/bin/sh
# One spelling of a unit in every CSV plumb writes (a program reading
# several of them matches one spelling of square metres): the zone CSV's unit column spells an area "m²" (or
# "ft²" with --units us) as the text reports do, never "m2"/"ft2"; column
# names keep their ASCII suffixes (area_m2 in the --regions-out CSV, as
# mass_kg in the fall CSV), the sweep's varied key's too
# (payload.drag.area_m2: the key, '_', its unit's suffix, no space). The US figure is the SI
# one over 0.3048² (the international foot is 0.3048 m exactly: NIST SP
# 811 (2008) B.8).
#
#   sh tests/cli/csv_units.sh PLUMB
#
# Ends with one line `cli: N passed, N failed, N skipped`.
. "$(dirname "$0")/lib/setup.sh"
prof=profiles/demo/hand-tool.yaml

tmp=$(mktemp -d "${TMPDIR:-/tmp}/plumb-csvunits.XXXXXX") || exit 2
trap 'rm -rf "$tmp"' EXIT
trap 'exit 2' INT TERM

"$bin" zone "$prof" --samples 2000 --format csv >"$tmp/si.csv" 2>"$tmp/err" &&
  "$bin" zone "$prof" --samples 2000 --format csv --units us >"$tmp/us.csv" 2>>"$tmp/err" &&
  "$bin" sweep "$prof" --vary "payload.drag.area=0.001m2:0.002m2:0.001m2" --format csv \
    >"$tmp/sweep.csv" 2>>"$tmp/err" || { echo "FAIL: $(cat "$tmp/err")"; echo "cli: 0 passed, 1 failed, 0 skipped"; exit 1; }

/usr/bin/python3 - "$tmp" <<'PY'
import csv, os, re, sys
sys.path.insert(0, os.path.join(os.getcwd(), "tests", "cli", "lib"))
from plumbcli import check, finish
tmp = sys.argv[1]
def rows(name):
    with open(os.path.join(tmp, name), encoding="utf-8") as f:
        return list(csv.reader(l for l in f if not l.startswith("#")))
si, us = rows("si.csv"), rows("us.csv")
check(si[0] == ["item_number", "item", "quantity", "value", "ci_low", "ci_high", "unit"], f"zone CSV header {si[0]}")
area = {r[2]: r for r in si[1:] if r[2].startswith("landing_area")}
area_us = {r[2]: r for r in us[1:] if r[2].startswith("landing_area")}
check(set(area) == {"landing_area", "landing_area_buffered"}, f"zone CSV areas: {sorted(area)}")
for q in area:
    check(area[q][6] == "m²", f"{q}: unit {area[q][6]!r}, expected m²")
    check(area_us[q][6] == "ft²", f"{q} --units us: unit {area_us[q][6]!r}, expected ft²")
    ratio = float(area[q][3]) / float(area_us[q][3])
    check(abs(ratio - 0.3048 ** 2) <= 1e-9 * 0.3048 ** 2, f"{q}: SI / US = {ratio}, expected 0.3048²")
for name, table in (("si", si), ("us", us)):
    bad = sorted({r[6] for r in table[1:] if re.search(r"[a-z][23]\b", r[6])})
    check(not bad, f"zone CSV ({name}) spells a unit with a bare digit: {bad}")
sw = rows("sweep.csv")
check(sw[0][0] == "payload.drag.area_m2" and sw[0][1] == "item_number",
      f"sweep CSV axis column {sw[0][:2]!r}")
finish()
PY
