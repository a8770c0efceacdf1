#!/usr/bin/python3
"""A sweep whose every row has its canopy still filling at impact says
that once, as one numbered warning over the rows, not once per row: the
rows differ only in the figures of the sentence (how far along its fill
time the canopy was), so the text gives one "W1" line for "all N rows",
with each figure that differs as its least to its greatest, and the CSV
one "# warning 1:" line, every row's `warnings` column "1". The JSON rows
keep each row's own sentence, whole.

Profile: tests/cli/profiles/canopy-late.yaml (invented): a 1.93 kg marker
released at 30 m, its parachute (0.6 s fill) pulled `after` the time
swept. Sources of the checked figures:
  - line stretch comes at the `after` time itself (README.md, "descent":
    a device deploys `after` a time), so over the swept 2.2 s to 2.4 s the
    sentence's line stretch reads "2.2000 to 2.3200 s";
  - the fall from 30 m takes at least sqrt(2 H / g0) = 2.47 s (in vacuum;
    g0 = 9.80665 m/s^2, 3rd CGPM 1901), so a canopy pulled at 2.32 s or
    earlier is pulled before impact, and one pulled at 2.2 s or later
    cannot finish a 0.6 s fill before it unless the fall lasts 2.8 s: each
    row's JSON says it is still filling (checked below);
  - the least and greatest fill fraction over the rows, as each row's JSON
    gives it (README.md, "fill_fraction"), printed as the rows' sentences
    print it, to 1 decimal.
Usage: sweep_grouped_warnings.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import json
import os
import re
import sys

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

LATE = os.path.join(HERE, "profiles", "canopy-late.yaml")
VARY = "descent.deploy.after=2.2s:2.32s:0.02s"   # 7 rows
N_ROWS = 7
FILLING = "The parachute (descent[0]) was still filling at impact"

rc, out, err = plumb("sweep", LATE, "--vary", VARY, "--format", "json")
check(rc == 0, f"JSON sweep: exit {rc}: {err}")
rows = json.loads(out)["rows"] if rc == 0 else []
check(len(rows) == N_ROWS, f"{len(rows)} rows, want {N_ROWS}")
fractions = []
for r in rows:
    item = r["items"][0] if "items" in r else r
    dev = item["descent"]["devices"][0]["at_impact"]
    fractions.append(dev["fill_fraction"])
    own = [w for w in item.get("warnings", []) if w.startswith(FILLING)]
    # each row keeps its own sentence, with its own figures
    check(dev["state"] == "filling" and len(own) == 1 and " to " not in own[0],
          f"row {r.get('value', '?')}: filling, its own whole warning: {dev} {own}")

rc, out, err = plumb("sweep", LATE, "--vary", VARY)
flat = " ".join(out.split())
check(rc == 0, f"text sweep: exit {rc}: {err}")
check(re.search(r"\bW1\b", flat) and not re.search(r"\bW2\b", flat),
      f"text: one numbered warning, W1, no W2: {flat[:3000]}")
check(flat.count(FILLING) == 1, f"text: the sentence said once: {flat.count(FILLING)} times")
check("line stretch at 2.2000 to 2.3200 s" in flat,
      f"text: line stretch from the least to the greatest `after` swept: {flat[:3000]}")
if fractions:
    lo, hi = f"{100 * min(fractions):.1f}", f"{100 * max(fractions):.1f}"
    check(f"({lo} to {hi} %)" in flat,
          f"text: the fill time's share from {lo} to {hi} %: {flat[:3000]}")
check(f"(all {N_ROWS} rows; a figure that differs between them given as its least to its "
      "greatest)" in flat, f"text: all {N_ROWS} rows, and how the figures read: {flat[:3000]}")

rc, out, err = plumb("sweep", LATE, "--vary", VARY, "--format", "csv")
check(rc == 0, f"CSV sweep: exit {rc}: {err}")
lines = out.splitlines()
warn = [l for l in lines if l.startswith("# warning")]
check(len(warn) == 1 and warn[0].startswith("# warning 1: " + FILLING)
      and f"({N_ROWS} of {N_ROWS} rows; a figure that differs" in warn[0],
      f"CSV: one warning line over the {N_ROWS} rows: {warn}")
data = list(csv.DictReader(io.StringIO("\n".join(l for l in lines if not l.startswith("#")))))
check(len(data) == N_ROWS and all(d["warnings"] == "1" for d in data),
      f"CSV: every row's warnings column is 1: {[d.get('warnings') for d in data]}")

# two sentences that differ in a word, not a figure, stay two warnings:
# one row whose canopy fills before impact (2.0 s) and so has no warning,
# the others still filling: W1 only on those rows
rc, out, err = plumb("sweep", LATE, "--vary", "descent.deploy.after=2.0s:2.3s:0.1s")
flat = " ".join(out.split())
check(rc == 0 and flat.count(FILLING) == 1 and "(2 of 4 rows: 2.2 s, 2.3 s;" in flat,
      f"text: the filling rows alone carry the warning: {flat[:3000]}")

finish()
