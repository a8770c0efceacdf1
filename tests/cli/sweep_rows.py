#!/usr/bin/python3
"""A sweep row that cannot be computed is reported as that row's error.

The row's value and why are given in text, CSV and JSON; every other row is
still computed (and equals `plumb fall --set KEY=VALUE`); the exit status is
3 when any row failed. When no row can be computed the sweep fails as a
whole: nothing is written, exit 2 for input (every value out of range, a
key the profile cannot take, an object that floats) and 3 for a
computation.

Sources of the checked values:
  - Archimedes' principle: a body of mass m and volume V floats in air of
    density rho when rho V > m. The 47 g grip (tests/cli/profiles/light.yaml)
    released 25 m above sea level in the U.S. Standard Atmosphere 1976 (rho
    1.2250 kg/m^3 at 0 m, 1.2221 at 25 m; NOAA-S/T 76-1562 Table I,
    transcribed) floats for V > 0.047 / 1.2221 = 0.03846 m^3 and lands for
    V < 0.047 / 1.2250 = 0.03837 m^3; plumb refuses (as an input error) a
    volume that displaces the mass in the densest air of the path, at the
    strike level: V >= 0.03837 m^3.
  - release.height must be > 0 (README, profile keys).
Usage: sweep_rows.py PATH/TO/plumb   (prints `cli: N passed, N failed`)
"""
import csv
import io
import json
import os
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import HERE, check, finish, plumb  # noqa: E402

LIGHT = os.path.join(HERE, "profiles", "light.yaml")
THROWN = os.path.join(HERE, "profiles", "thrown.yaml")
INVENTORY = os.path.join(HERE, "profiles", "inventory.yaml")


VOL = "payload.volume=0.030m^3:0.048m^3:0.006m^3"   # 0.030, 0.036 land; 0.042, 0.048 float
FLOATS = [False, False, True, True]

# JSON: every row, the failed ones with an error and no figures
rc, out, err = plumb("sweep", LIGHT, "--vary", VOL, "--format", "json")
check(rc == 3, f"a sweep with floating rows exits 3 (got {rc})")
check("2 of 4 rows could not be computed" in err, f"stderr says how many rows failed: {err!r}")
d = json.loads(out) if out else {"rows": []}
rows = d["rows"]
check(len(rows) == 4 and d.get("failed_rows") == 2, f"4 rows, 2 failed: {d.get('failed_rows')}")
for row, floats in zip(rows, FLOATS):
    v = row["values_as_given"]["payload.volume"]
    if floats:
        e = row.get("error", {})
        check("impact" not in row and "it would float or rise, never land" in e.get("message", "")
              and e.get("computation_failed") is False and e.get("kind") == "value out of range",
              f"V = {v} m^3 floats (Archimedes): error {e}")
    else:
        check("error" not in row and row["impact"]["energy_j"] > 0, f"V = {v} m^3 lands")
        rc_f, out_f, _ = plumb("fall", LIGHT, "--set", f"payload.volume={v!r} m^3", "--format", "json")
        f = json.loads(out_f)
        check(rc_f == 0 and f["impact"] == row["impact"] and f["criteria"] == row["criteria"],
              f"the row at V = {v} m^3 equals plumb fall --set")

# CSV: one line per value, the failed ones with empty figures and the reason last
rc, out, err = plumb("sweep", LIGHT, "--vary", VOL, "--format", "csv")
lines = [l for l in out.splitlines() if not l.startswith("#")]
table = list(csv.reader(io.StringIO("\n".join(lines))))
head, body = table[0], table[1:]
check(rc == 3 and head[-1] == "error" and len(body) == 4, f"CSV: exit {rc}, header {head[-3:]}, {len(body)} rows")
for r, floats in zip(body, FLOATS):
    check(len(r) == len(head), f"CSV row has {len(r)} fields, the header {len(head)}")
    if floats:
        check(all(x == "" for x in r[1:-1]) and "float or rise" in r[-1], f"CSV failed row {r[0]}: {r[-1]!r}")
    else:
        check(r[-1] == "" and float(r[head.index("energy_j")]) > 0, f"CSV row {r[0]} has figures")
check("2 of 4 rows could not be computed" in out, "CSV says in a comment that rows failed")

# text: the failed rows keep their value, and the reasons are listed
rc, out, err = plumb("sweep", LIGHT, "--vary", VOL)
check(rc == 3 and "not computed, see (1) below" in out and "Rows not computed (2 of 4)" in out
      and "payload.volume = 0.042 m" in out and "it would float or rise" in out,
      f"text lists the failed rows:\n{out[:900]}")

# every ratio in the text table has its verdict word beside it (a
# ratio printed as 1.00 must not hide its side of the limit)
rc, out, err = plumb("sweep", THROWN, "--vary", "release.height=2m:20m:9m",
                     "--set", "criteria=[ddesb-fragment-58ftlbf, eu-c1-80j]")
# the ratios sit in the main table when it fits 80 columns, else in the
# "Against the criteria" block that follows it
blocks = out.split("\n\n") if rc == 0 else []
block = next((b for b in blocks if b.startswith("Against the criteria")), blocks[1] if blocks else "")
table = [l for l in block.splitlines() if l.strip()[:1].isdigit()]
check(len(table) == 3 and all(l.count("EXCEEDS") + l.count("within") == 2 for l in table),
      f"sweep text gives a verdict beside each of two ratios:\n" + "\n".join(table))

# an out-of-range value in one row: the rest still given; the row's error
# is located at the first --vary's FROM, column 16 after "release.height="
# (README.md "Exit status")
rc, out, err = plumb("sweep", THROWN, "--vary", "release.height=0m:8m:4m", "--format", "json")
d = json.loads(out) if out else {"rows": []}
e = d["rows"][0].get("error", {}) if d["rows"] else {}
check(rc == 3 and len(d["rows"]) == 3 and "--vary:1:16: release.height: " in e.get("message", "")
      and e.get("computation_failed") is False and "impact" in d["rows"][1],
      f"release.height = 0 m is that row's error: exit {rc}, {e}")

# an inventory row: one item's failure fails the row and names the item
rc, out, err = plumb("sweep", INVENTORY, "--vary", "items[1].mass=-0.1kg:0.2kg:0.3kg", "--format", "json")
d = json.loads(out) if out else {"rows": []}
check(rc == 3 and len(d["rows"]) == 2 and "error" in d["rows"][0] and "items" in d["rows"][1],
      f"inventory: exit {rc} ({err.strip()})")

# no row can be computed: nothing written; 2 for input (a floating object
# is one: its volume or mass is at fault), 3 for a computation
with tempfile.TemporaryDirectory(prefix="plumb-rows-") as tmp:
    o = os.path.join(tmp, "out")
    for args, want_rc, want in [
            (["--vary", "release.height=-8m:-2m:3m"], 2, "no row of the sweep could be computed"),
            (["--vary", "descent.cd=0.5:0.9:0.2"], 2, "descent"),
            (["--vary", "payload.volume=0.042m^3:0.048m^3:0.006m^3"], 2, "float or rise")]:
        prof = LIGHT if "volume" in args[1] or "descent" in args[1] else THROWN
        rc, out, err = plumb("sweep", prof, *args, "-o", o)
        check(rc == want_rc and want in err and not os.listdir(tmp) and out == "",
              f"{args[1]}: exit {rc} (want {want_rc}), {err.strip()!r}, wrote {os.listdir(tmp)}")

# a criterion typo is the profile's error, located at its entry, not a row's
rc, out, err = plumb("sweep", os.path.join(HERE, "profiles", "criterion-typo.yaml"),
                     "--vary", "release.height=2m:4m:2m")
check(rc == 2 and "criterion-typo.yaml:7:23: criteria[1]" in err and "no row" not in err and out == "",
      f"sweep: criterion typo: exit {rc}, {err.strip()!r}")

finish()
